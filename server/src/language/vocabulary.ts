/**
 * The words of the spec language: which keywords are valid in which block, what values they take,
 * and one line on each. Validation, completion and hover all read this one table.
 */

/** The blocks of the language: the atoms of `structure { … }`, fragments, their tiers, and limits. */
export type BlockKind = 'top' | 'structure' | 'fragment' | 'tier' | 'limits' | 'variant';

export interface KeywordInfo {
  readonly name: string;
  readonly blocks: readonly BlockKind[];
  /** How it is written, for messages and hover. */
  readonly syntax: string;
  readonly summary: string;
  /** The kind of block it opens, if any. */
  readonly opens?: BlockKind;
}

/** How override lines of `basis` combine; said in hover, messages and the contributor guide. */
export const BASIS_PRECEDENCE =
  'Each atom takes the basis of the most specific line that selects it: lines naming atoms (labels, #indices, ranges, closer-than) over `all <Element>` lines, over `fragment <name>` lines, over the main line; between lines of the same kind the later one wins.';

export const KEYWORDS: readonly KeywordInfo[] = [
  { name: 'spec', blocks: ['top'], syntax: 'spec "name"', summary: 'Names this calculation plan.' },
  { name: 'charge', blocks: ['top', 'fragment'], syntax: 'charge <integer>', summary: 'Total charge of the system, or the formal charge of a fragment (default 0).' },
  { name: 'multiplicity', blocks: ['top', 'fragment'], syntax: 'multiplicity <2S+1>', summary: 'Spin multiplicity 2S+1 (default: 1 for an even electron count, 2 for an odd one).' },
  {
    name: 'basis',
    blocks: ['top', 'variant'],
    syntax: 'basis <name>  or  basis <name> on <atoms>',
    summary:
      'The orbital basis set: one main line for every atom, and override lines for a selection (`on all Zn`, `on zn n1..n4`, `on #3`, `on closer-than 3.0 to zn`, `on fragment guest`). ' +
      BASIS_PRECEDENCE,
  },
  { name: 'functions', blocks: ['top', 'variant'], syntax: 'functions spherical|cartesian', summary: 'Spherical (2l+1) or cartesian ((l+1)(l+2)/2) functions per shell, for every basis of the spec; default: the main basis family\'s usual convention.' },
  {
    name: 'structure',
    blocks: ['top'],
    syntax: 'structure [in angstrom|bohr] { <Element> [label] x y z ... }  or  structure from "file.xyz"  or  structure from "base.tess" [with fragments]',
    summary:
      'The atoms: element, optional label and x y z, in the unit its header names (ångström unless `in bohr`); or a plain XYZ file, in ångström by the XYZ convention; or the atoms and labels of another spec (`structure from "base.tess"`), in ångström, and with `with fragments` its fragments too (a `fragment` of the same name here patches one). Every other distance in the spec (scan ranges, `closer-than`) is in this unit.',
    opens: 'structure',
  },
  { name: 'frozen-core', blocks: ['top', 'tier', 'variant'], syntax: 'frozen-core on|off', summary: 'Keep the noble-gas core orbitals of each element doubly occupied and out of the correlation treatment (default on).' },
  { name: 'fragment', blocks: ['top', 'variant'], syntax: 'fragment <name> { atoms ...; charge; multiplicity; tier <level> { ... } }', summary: 'A part of the system treated by one solver tier.', opens: 'fragment' },
  { name: 'atoms', blocks: ['fragment'], syntax: 'atoms <label> <a>..<b> #<n> #<n>..#<m> all <Element> closer-than <d> to <atom> rest', summary: 'Which atoms belong to the fragment.' },
  { name: 'tier', blocks: ['fragment'], syntax: 'tier quantum|correlated|mean-field { method ...; ... }', summary: 'The solver tier of this fragment and its settings.', opens: 'tier' },
  { name: 'method', blocks: ['tier'], syntax: 'method <name>', summary: 'The electronic-structure method of the tier.' },
  { name: 'ansatz', blocks: ['tier'], syntax: 'ansatz uccsd|k-upccgsd|hardware-efficient', summary: 'The trial state of a variational quantum algorithm.' },
  { name: 'mapping', blocks: ['tier'], syntax: 'mapping jordan-wigner|bravyi-kitaev|parity', summary: 'How fermionic spin orbitals are encoded on qubits.' },
  {
    name: 'active',
    blocks: ['tier'],
    syntax: 'active <n>e <m>o | active <n>e <Irrep>=<k>… [occupied <Irrep>=<k>… open <Irrep>=<k>…] | active shells <atoms> <shell>… | active natural [<low> to <high>]',
    summary:
      'Active space: electrons and spatial orbitals correlated by the method. Counts take the orbitals around the Fermi level outside the frozen core (per irrep: each irrep\'s nearest); `shells` takes the orbitals of the named atomic shells, `natural` those whose MP2 natural occupation lies in the window, both once the mean field is computed and fitted to the qubit limit.',
  },
  { name: 'taper', blocks: ['tier'], syntax: 'taper on|off', summary: 'Remove qubits fixed by Z2 symmetries of the qubit Hamiltonian (default off).' },
  { name: 'layers', blocks: ['tier'], syntax: 'layers <n>', summary: 'Repetitions of the ansatz: k of k-UpCCGSD, or the depth of a hardware-efficient ansatz (default 1).' },
  {
    name: 'caps',
    blocks: ['top', 'fragment', 'variant'],
    syntax: 'caps hydrogen fixed|scaled  or  caps none',
    summary:
      'Cap every covalent bond a fragment boundary cuts with a hydrogen link atom on the kept atom\'s side (Field, Bash & Karplus 1990): `fixed` puts it at the typical X–H length of the kept atom\'s element, `scaled` at the cut bond\'s length × (r_X + r_H)/(r_X + r_Y) with covalent radii. Caps count in the fragment\'s electrons, functions, orbitals, qubits and symmetry. At the top level for every fragment; in a fragment for that one (default none).',
  },
  {
    name: 'accuracy',
    blocks: ['top', 'tier'],
    syntax: 'accuracy <value> mHa|Ha|kcal/mol|kJ/mol|eV',
    summary:
      'Target accuracy of a quantum fragment\'s energy, one standard deviation of its estimate: it sets the shots per energy evaluation, (λ/ε)², and the cost of phase estimation. At the top for every fragment, in a tier for that one (default 1.6 mHa, chemical accuracy, common practice).',
  },
  { name: 'steps', blocks: ['tier'], syntax: 'steps <n>', summary: 'Optimisation steps of a variational run, for its shot count: each step evaluates the energy 2 × parameters + 1 times (parameter shift). Default 100 (an assumption).' },
  { name: 'embedding', blocks: ['top', 'variant'], syntax: 'embedding dmet|projection|subtractive|none', summary: 'How fragments are coupled to their environment (default none).' },
  {
    name: 'scan',
    blocks: ['top'],
    syntax: 'scan distance <atom> <atom> from <d> to <d> step <d>  or  scan angle <atom> <vertex> <atom> …  or  scan dihedral <atom> <atom> <atom> <atom> …  (… points <n> instead of step), then optionally moving <atom> …',
    summary:
      'Repeat the plan along a coordinate, every point checked as a geometry of its own. A distance: the second atom\'s fragment (or the atoms after `moving`) moves along the line joining the two atoms, in the structure\'s unit. An angle (degrees): the third atom\'s side of the molecule turns about the vertex, in the plane of the three atoms. A dihedral (degrees): the fourth atom\'s side turns about the bond between the middle two.',
  },
  { name: 'limits', blocks: ['top', 'variant'], syntax: 'limits { qubits <n>; memory <size> GiB; rate <n> Gflops; shot-rate <n> }', summary: 'Resources available: qubits and memory checked against every fragment, the rate used for the time of classical solvers, the shot rate for the time of a variational run.', opens: 'limits' },
  {
    name: 'variant',
    blocks: ['top'],
    syntax: 'variant <name> { fragment <name> { tier <level> { active 4e 4o } }; embedding …; caps …; basis … }',
    summary:
      'Another version of this plan, checked like a spec of its own and compared side by side (`tessera compare`). Its statements replace those of the spec: a fragment named in it keeps what it does not restate (a `tier` of the same level keeps the settings it does not restate; another level replaces the tier), a fragment the spec lacks is added; `caps`, `embedding`, `frozen-core`, `functions`, `limits` and the main `basis` line replace the spec\'s, `basis … on …` lines are added.',
    opens: 'variant',
  },
  { name: 'qubits', blocks: ['limits'], syntax: 'qubits <n>', summary: 'Largest number of qubits a quantum-tier fragment may need.' },
  { name: 'memory', blocks: ['limits'], syntax: 'memory <size> B|KiB|MiB|GiB|TiB', summary: 'Classical memory available, for example to a statevector simulator.' },
  { name: 'shot-rate', blocks: ['limits'], syntax: 'shot-rate <shots per second>', summary: 'Shots the quantum device runs per second: turns the shots of a variational run into time (device overheads not included).' },
  {
    name: 'rate',
    blocks: ['limits'],
    syntax: 'rate <n> flops|Gflops|Tflops|Pflops',
    summary: 'Floating-point operations per second of the classical machine: the time of each classical solver is its operation count at this rate (default 100 Gflops, an assumption).',
  },
];

/** Energy units of `accuracy`, for completion and hover. */
export const ENERGY_UNIT_TERMS: readonly TermInfo[] = [
  { name: 'mHa', summary: 'millihartree (1.6 mHa is chemical accuracy, common practice)' },
  { name: 'Ha', summary: 'hartree' },
  { name: 'kcal/mol', summary: 'kilocalorie per mole: 1.5936 mHa (CODATA 2018)' },
  { name: 'kJ/mol', summary: 'kilojoule per mole: 0.38088 mHa (CODATA 2018)' },
  { name: 'eV', summary: 'electronvolt: 36.749 mHa (CODATA 2018)' },
];

/** Optimisation steps of a variational run when the tier gives none (an assumption, said where shown). */
export const DEFAULT_VQE_STEPS = 100;

export function keywordsFor(block: BlockKind): KeywordInfo[] {
  return KEYWORDS.filter((keyword) => keyword.blocks.includes(block));
}

export function findKeyword(name: string, block: BlockKind): KeywordInfo | undefined {
  return KEYWORDS.find((keyword) => keyword.name === name && keyword.blocks.includes(block));
}

export interface TermInfo {
  readonly name: string;
  readonly summary: string;
  /** How its cost grows, for hover. */
  readonly scaling?: string;
  readonly reference?: string;
}

export type TierLevel = 'quantum' | 'correlated' | 'mean-field';

export const TIER_LEVELS: readonly TermInfo[] = [
  { name: 'quantum', summary: 'Solved by a quantum algorithm (on a simulator or device): qubits, Hamiltonian terms and circuits are estimated.' },
  { name: 'correlated', summary: 'Solved by a correlated classical method.' },
  { name: 'mean-field', summary: 'Solved at the mean-field level.' },
];

// Scaling statements are the textbook formal scalings with system size N (Helgaker, Jørgensen,
// Olsen, Molecular Electronic-Structure Theory, Wiley 2000), written from memory.
export const METHODS: readonly (TermInfo & { readonly tier: TierLevel })[] = [
  { name: 'rhf', tier: 'mean-field', summary: 'Restricted Hartree–Fock: closed-shell mean field.', scaling: 'N^4 formally (two-electron integrals), N^3 with density fitting', reference: 'C. C. J. Roothaan, Rev. Mod. Phys. 23, 69 (1951)' },
  { name: 'rohf', tier: 'mean-field', summary: 'Restricted open-shell Hartree–Fock.', scaling: 'N^4 formally', reference: 'C. C. J. Roothaan, Rev. Mod. Phys. 32, 179 (1960)' },
  { name: 'uhf', tier: 'mean-field', summary: 'Unrestricted Hartree–Fock: separate alpha and beta orbitals.', scaling: 'N^4 formally', reference: 'J. A. Pople, R. K. Nesbet, J. Chem. Phys. 22, 571 (1954)' },
  { name: 'pbe', tier: 'mean-field', summary: 'Kohn–Sham DFT with the PBE generalized-gradient functional (no exact exchange; unrestricted for open shells).', scaling: 'N^4 formally for the Coulomb term (N^3 with density fitting), plus grid quadrature', reference: 'J. P. Perdew, K. Burke, M. Ernzerhof, Phys. Rev. Lett. 77, 3865 (1996)' },
  { name: 'pbe0', tier: 'mean-field', summary: 'Kohn–Sham DFT with the PBE0 hybrid functional (25 % exact exchange).', scaling: 'N^4 formally (exact exchange), plus grid quadrature', reference: 'C. Adamo, V. Barone, J. Chem. Phys. 110, 6158 (1999)' },
  { name: 'b3lyp', tier: 'mean-field', summary: 'Kohn–Sham DFT with the B3LYP hybrid functional (20 % exact exchange).', scaling: 'N^4 formally (exact exchange), plus grid quadrature', reference: 'A. D. Becke, J. Chem. Phys. 98, 5648 (1993); P. J. Stephens et al., J. Phys. Chem. 98, 11623 (1994)' },
  { name: 'tpss', tier: 'mean-field', summary: 'Kohn–Sham DFT with the TPSS meta-GGA functional (no exact exchange).', scaling: 'N^4 formally for the Coulomb term, plus grid quadrature', reference: 'J. Tao, J. P. Perdew, V. N. Staroverov, G. E. Scuseria, Phys. Rev. Lett. 91, 146401 (2003)' },
  { name: 'mp2', tier: 'correlated', summary: 'Second-order Møller–Plesset perturbation theory.', scaling: 'N^5 (o·N^4 for the integral transformation)', reference: 'C. Møller, M. S. Plesset, Phys. Rev. 46, 618 (1934)' },
  { name: 'ccsd', tier: 'correlated', summary: 'Coupled cluster with single and double excitations.', scaling: 'N^6: o^2 v^4 per iteration; amplitudes o^2 v^2', reference: 'G. D. Purvis, R. J. Bartlett, J. Chem. Phys. 76, 1910 (1982)' },
  { name: 'ccsd(t)', tier: 'correlated', summary: 'CCSD with perturbative triples.', scaling: 'N^7: o^3 v^4 once for the triples, after the CCSD iterations', reference: 'K. Raghavachari, G. W. Trucks, J. A. Pople, M. Head-Gordon, Chem. Phys. Lett. 157, 479 (1989)' },
  { name: 'casci', tier: 'correlated', summary: 'Complete active-space configuration interaction.', scaling: 'exponential in the active space (number of determinants)', reference: 'P. J. Knowles, N. C. Handy, Chem. Phys. Lett. 111, 315 (1984)' },
  { name: 'casscf', tier: 'correlated', summary: 'CASCI with optimized orbitals.', scaling: 'exponential in the active space, times orbital iterations', reference: 'B. O. Roos, P. R. Taylor, P. E. M. Siegbahn, Chem. Phys. 48, 157 (1980)' },
  { name: 'fci', tier: 'correlated', summary: 'Full configuration interaction in the active space.', scaling: 'exponential: binomial(n, alpha) × binomial(n, beta) determinants', reference: 'P. J. Knowles, N. C. Handy, Chem. Phys. Lett. 111, 315 (1984)' },
  { name: 'vqe', tier: 'quantum', summary: 'Variational quantum eigensolver.', scaling: 'circuit per ansatz; measurements grow with the number of Pauli terms', reference: 'A. Peruzzo et al., Nat. Commun. 5, 4213 (2014)' },
  { name: 'qpe', tier: 'quantum', summary: 'Quantum phase estimation.', scaling: 'deep circuits: Hamiltonian simulation to the target precision', reference: 'A. Aspuru-Guzik, A. D. Dutoit, P. J. Love, M. Head-Gordon, Science 309, 1704 (2005)' },
];

export const ANSATZE: readonly TermInfo[] = [
  { name: 'uccsd', summary: 'Unitary coupled cluster with singles and doubles.', scaling: 'parameters grow as o^2 v^2', reference: 'Peruzzo et al., Nat. Commun. 5, 4213 (2014); Romero et al., Quantum Sci. Technol. 4, 014008 (2019)' },
  { name: 'k-upccgsd', summary: 'k products of unitary pair coupled cluster with generalized singles and doubles.', scaling: 'parameters grow as k n^2', reference: 'Lee, Huggins, Head-Gordon, Whaley, J. Chem. Theory Comput. 15, 311 (2019)' },
  { name: 'hardware-efficient', summary: 'Layers of single-qubit rotations and entangling gates native to the device.', scaling: 'parameters grow as layers × qubits', reference: 'Kandala et al., Nature 549, 242 (2017)' },
];

export const MAPPING_TERMS: readonly TermInfo[] = [
  { name: 'jordan-wigner', summary: 'Jordan–Wigner: one qubit per spin orbital; occupation stored locally, parity in strings of Z.', scaling: '2n qubits; Pauli weight up to O(n)', reference: 'P. Jordan, E. Wigner, Z. Phys. 47, 631 (1928)' },
  { name: 'bravyi-kitaev', summary: 'Bravyi–Kitaev: one qubit per spin orbital; occupation and parity stored in a binary tree.', scaling: '2n qubits; Pauli weight O(log n)', reference: 'S. Bravyi, A. Kitaev, Ann. Phys. 298, 210 (2002); Seeley, Richard, Love, J. Chem. Phys. 137, 224109 (2012)' },
  { name: 'parity', summary: 'Parity mapping; with the two-qubit reduction the two qubits fixed by particle-number and spin parity are removed.', scaling: '2n − 2 qubits', reference: 'Bravyi, Gambetta, Mezzacapo, Temme, arXiv:1701.08213 (2017)' },
];

export const EMBEDDINGS: readonly TermInfo[] = [
  { name: 'dmet', summary: 'Density-matrix embedding: each fragment gets bath orbitals from a mean-field of the whole system; its impurity problem is up to twice the fragment size.', reference: 'Knizia, Chan, Phys. Rev. Lett. 109, 186404 (2012)' },
  { name: 'projection', summary: 'Projection-based embedding: the fragment is solved in its own orbitals in the field of a frozen environment.', reference: 'Manby, Stella, Goodpaster, Miller, J. Chem. Theory Comput. 8, 2564 (2012)' },
  { name: 'subtractive', summary: 'Subtractive (ONIOM-like) combination: high-level fragment energies corrected by low-level ones.', reference: 'Svensson et al., J. Phys. Chem. 100, 19357 (1996)' },
  { name: 'none', summary: 'Fragments are planned independently.' },
];

/** Length units of `structure in <unit>`. */
export const UNIT_TERMS: readonly TermInfo[] = [
  { name: 'angstrom', summary: 'Ångström, 1e-10 m.' },
  { name: 'bohr', summary: 'Bohr radius, 0.529177210903 Å (CODATA 2018).' },
];

export const FUNCTION_TERMS: readonly TermInfo[] = [
  { name: 'spherical', summary: 'Pure (spherical-harmonic) functions: 2l+1 per shell (5 d, 7 f).' },
  { name: 'cartesian', summary: 'Cartesian functions: (l+1)(l+2)/2 per shell (6 d, 10 f).' },
];

/** The words after `active` that ask for a suggestion instead of counts. */
export const ACTIVE_CHOICES: readonly TermInfo[] = [
  {
    name: 'shells',
    summary:
      'The orbitals of named atomic shells: `active shells Fe1 3d all O 2p` (atoms — labels, #indices, ranges, `all <Element>` — then shells of their minimal basis; `d` alone is the valence d shell). Occupied and virtual orbitals are projected onto those shells of STO-3G and those above 0.2 (common practice) are active. Until the mean field is computed the counts are estimated from the free atoms\' shells.',
    reference: 'Sayfutyarova, Sun, Chan & Knizia, J. Chem. Theory Comput. 13, 4063 (2017)',
  },
  {
    name: 'natural',
    summary:
      'What MP2 natural occupations suggest: the natural orbitals with occupation inside the window (default 0.02 to 1.98, common practice) are active. Needs a closed-shell part. Until MP2 is computed the counts are estimated as the minimal-basis valence space.',
  },
];

export const SWITCH_TERMS: readonly TermInfo[] = [
  { name: 'on', summary: 'Enabled.' },
  { name: 'off', summary: 'Disabled.' },
];

/** What `caps` takes: the cap atom, or none. */
export const CAP_KINDS: readonly TermInfo[] = [
  { name: 'hydrogen', summary: 'A hydrogen link atom on each cut bond.', reference: 'M. J. Field, P. A. Bash, M. Karplus, J. Comput. Chem. 11, 700 (1990)' },
  { name: 'none', summary: 'Cut bonds are left open (the default).' },
];

/** Where a hydrogen cap sits on the cut bond X–Y (X kept, Y outside the fragment). */
export const CAP_RULES: readonly TermInfo[] = [
  { name: 'fixed', summary: 'At the typical X–H bond length of the kept atom\'s element (C–H 1.09, N–H 1.01, O–H 0.96, S–H 1.34 Å; common practice), else r_X + r_H from covalent radii.' },
  {
    name: 'scaled',
    summary: 'At g × d(X–Y), g = (r_X + r_H)/(r_X + r_Y) with Cordero covalent radii: a stretched bond stretches its cap in proportion.',
    reference: 'S. Dapprich, I. Komáromi, K. S. Byun, K. Morokuma, M. J. Frisch, J. Mol. Struct. THEOCHEM 461–462, 1 (1999)',
  },
];

export const SCAN_KINDS: readonly TermInfo[] = [
  { name: 'distance', summary: 'A distance between two atoms, in the structure\'s length unit.' },
  { name: 'angle', summary: 'A bond angle A–B–C at the vertex B (the middle atom), in degrees between 0 and 180; the third atom\'s side turns in the plane of the three atoms.' },
  {
    name: 'dihedral',
    summary: 'A dihedral (torsion) angle A–B–C–D, in degrees: the fourth atom\'s side turns about the B–C bond. Positive when, seen along B→C, A–B turns clockwise to eclipse C–D.',
    reference: 'IUPAC Compendium of Chemical Terminology (Gold Book), "torsion angle"',
  },
];

/** The clauses of a `scan` line after its two atoms. */
export const SCAN_CLAUSES: readonly TermInfo[] = [
  { name: 'from', summary: '`from <d>`: the first value of the scanned coordinate: a distance in the structure\'s unit, an angle or dihedral in degrees.' },
  { name: 'to', summary: '`to <d>`: the last value; the step must land on it.' },
  { name: 'step', summary: '`step <d>`: the change from one point to the next (negative to shorten a distance or close an angle).' },
  { name: 'points', summary: '`points <n>`: n evenly spaced points from the first value to the last, instead of a step.' },
  { name: 'moving', summary: '`moving <atom> …`: the atoms that move with the last scanned atom, instead of its whole fragment (a distance) or its side of the molecule (an angle or dihedral).' },
];

export const SELECTOR_WORDS: readonly TermInfo[] = [
  { name: 'rest', summary: 'Every atom that no other fragment claims.' },
  { name: 'all', summary: '`all <Element>`: every atom of that element (an element is always named after `all`; a bare word is a label).' },
  { name: 'closer-than', summary: '`closer-than <d> to <atom>`: every atom strictly closer than d to that atom, itself included; d is in the structure\'s unit.' },
  { name: 'to', summary: '`closer-than <d> to <atom>`: the atom the distance is measured from.' },
];

/** The words of a basis override line, `basis <name> on <atoms>`. */
export const BASIS_TARGET_WORDS: readonly TermInfo[] = [
  { name: 'on', summary: '`basis <name> on <atoms>`: this basis for the selected atoms instead of the main one.' },
  { name: 'fragment', summary: '`on fragment <name>`: every atom of that fragment.' },
];

/**
 * Spellings the language used to have. Each is reported with the code `retired-spelling`, a
 * message that shows the new spelling, and a quick fix that rewrites it (`language/migrate.ts`).
 */
export const RETIRED_SPELLINGS: readonly { readonly name: string; readonly now: string; readonly summary: string }[] = [
  { name: 'geometry', now: 'structure', summary: 'The atoms are given in a `structure { … }` block, or `structure from "file.xyz"`.' },
  { name: 'units', now: 'structure in bohr', summary: 'The length unit is part of the structure header: `structure in bohr { … }`; ångström needs no word.' },
  { name: 'basis block', now: 'basis <name> on all <Element>', summary: 'A braced basis block becomes one line per basis: `basis def2-SVP`, `basis def2-TZVP on all Zn`, and `functions cartesian` on its own line.' },
  { name: 'within', now: 'closer-than', summary: '`within <d> of <atom>` becomes `closer-than <d> to <atom>`, which is strict.' },
];

export function methodsForTier(tier: TierLevel): (TermInfo & { readonly tier: TierLevel })[] {
  return METHODS.filter((method) => method.tier === tier);
}

export function findTerm(terms: readonly TermInfo[], name: string): TermInfo | undefined {
  return terms.find((term) => term.name === name);
}

/** The words of a term list as usage strings write them: `a|b|c`. */
export function choices(terms: readonly TermInfo[]): string {
  return terms.map((term) => term.name).join('|');
}
