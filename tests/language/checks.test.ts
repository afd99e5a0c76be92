/**
 * Every diagnostic code: one spec that triggers it, on its exact range, and one closely related
 * spec that does not. Then the chemistry checks in detail, with the numbers their messages state.
 *
 * Geometries are invented test data unless a comment names a source.
 */
import { describe, expect, it } from 'vitest';
import { DIAGNOSTIC_CODES, type DiagnosticCode } from '../../server/src/language/diagnostics';
import { analyze, type AnalyzeOptions } from '../../server/src/language/analyze';
import type { FileHost } from '../../server/src/language/files';
import { WATER_ROWS } from '../fixtures/water';
import { analyzeMarked, expectDiagnostic, expectDiagnostics, expectNoDiagnostic, memoryFiles, parseMarkers, show } from './fixture';

/** Bohr radius in ångström, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)). */
const BOHR = 0.529177210903;

/**
 * Water at the experimental equilibrium structure, r(OH) = 0.9572 Å, HOH = 104.52° (Hoy & Bunker,
 * J. Mol. Spectrosc. 74, 1 (1979)), placed as in tests/fixtures/water.ts: O at the origin, H in the yz plane.
 */
const WATER_ANGSTROM = WATER_ROWS;

function atomLines(atoms: readonly (readonly [string, string, number, number, number])[], scale = 1): string {
  return atoms.map(([element, label, x, y, z]) => `  ${element} ${label} ${(x * scale).toFixed(6)} ${(y * scale).toFixed(6)} ${(z * scale).toFixed(6)}`).join('\n');
}

const WATER = atomLines(WATER_ANGSTROM);
/** The same water with its coordinates in bohr. */
const WATER_IN_BOHR = atomLines(WATER_ANGSTROM, 1 / BOHR);

const ONE_FRAGMENT = 'fragment w { atoms rest; tier mean-field { method rhf } }';

/** A water spec: header lines, the basis line, the atoms in a structure block (with its header), and the fragments. */
function water(fragments = ONE_FRAGMENT, header = '', basis = 'basis sto-3g', atoms = WATER, structure = 'structure'): string {
  return `${header}${header ? '\n' : ''}${basis}\n${structure} {\n${atoms}\n}\n${fragments}\n`;
}

/** Two waters 5 Å apart (no bonds between them), labelled o h1 h2 and p g1 g2. */
const TWO_WATERS = `${WATER}\n${atomLines(WATER_ANGSTROM.map(([e, l, x, y, z]) => [e, l.replace('o', 'p').replace('h', 'g'), x + 5, y, z] as const))}`;
const TWO_FRAGMENTS = `fragment a { atoms o h1 h2; tier mean-field { method rhf } }
fragment b { atoms p g1 g2; tier mean-field { method rhf } }`;

/** Water split o h1 | h2: the second fragment is a proton, the first a hydroxide. */
const SPLIT_WATER = `fragment a { atoms o h1; charge -1; tier mean-field { method rhf } }
fragment b { atoms h2; charge +1; tier mean-field { method rhf } }`;

/** Rubidium chloride, an element outside 6-31G's coverage (Rb, Z = 37; 6-31G stops at Kr in the library). */
const RBCL = '  Rb rb 0 0 0\n  Cl cl 0 0 2.79';

interface Case {
  /** Spec text with the expected range marked by ⟦ ⟧. */
  readonly trigger: string;
  /** A closely related spec that must not report the code. */
  readonly nearMiss: string;
  /** Codes the near miss may still report (it is otherwise free of diagnostics). */
  readonly nearMissAllows?: readonly DiagnosticCode[];
  /** Texts or patterns the trigger's message must contain. */
  readonly message?: readonly (string | RegExp)[];
  readonly options?: AnalyzeOptions;
  /** Options of the near miss when they differ from the trigger's. */
  readonly nearMissOptions?: AnalyzeOptions;
  /** The reported severity, when it differs from the registry's. */
  readonly severity?: string;
}

const SPEC_PATH = '/work/specs/site.tess';
const XYZ_WATER = '3\nwater, angstrom\nO 0 0 0\nH 0 0.756950 0.585882\nH 0 -0.756950 0.585882\n';
const FILES = memoryFiles({
  '/work/specs/data/water.xyz': XYZ_WATER,
  '/work/specs/data/broken.xyz': '3\nbroken\nO 0 0 0\nH 0 0.756950\nH 0 -0.756950 0.585882\n',
  '/work/water.xyz': XYZ_WATER,
});
const withFiles: AnalyzeOptions = { path: SPEC_PATH, files: FILES };
const fromFile = (file: string) => `basis sto-3g\nstructure from ${file}\n${ONE_FRAGMENT}\n`;

const CASES: { readonly [C in DiagnosticCode]: Case } = {
  // Reading the text
  'unexpected-character': {
    trigger: water(ONE_FRAGMENT, 'spec "w" ⟦@⟧'),
    nearMiss: water(ONE_FRAGMENT, 'spec "w" # @ in a comment is fine'),
    message: ["'@'"],
  },
  'unterminated-string': {
    trigger: water(ONE_FRAGMENT, 'spec ⟦"water⟧'),
    nearMiss: water(ONE_FRAGMENT, 'spec "water"'),
  },
  'unclosed-block': {
    trigger: water('fragment w ⟦{⟧\n  atoms rest\n  tier mean-field { method rhf }\n'),
    nearMiss: water('fragment w {\n  atoms rest\n  tier mean-field { method rhf }\n}'),
  },
  'unexpected-token': {
    trigger: water(`${ONE_FRAGMENT}\n⟦}⟧`),
    nearMiss: water(ONE_FRAGMENT),
  },
  // Statements and values
  'unknown-keyword': {
    trigger: water(ONE_FRAGMENT, '⟦embeding⟧ dmet'),
    nearMiss: water(ONE_FRAGMENT, 'embedding dmet'),
    message: ["Unknown keyword 'embeding' at the top level. Did you mean 'embedding'?"],
  },
  'misplaced-keyword': {
    trigger: water('fragment w { atoms rest; ⟦method⟧ rhf; tier mean-field { } }'),
    nearMiss: water('fragment w { atoms rest; tier mean-field { method rhf } }'),
    message: ["'method' does not belong in a fragment block; it is used in a tier block."],
  },
  'missing-value': {
    trigger: water(ONE_FRAGMENT, '⟦spec⟧'),
    nearMiss: water(ONE_FRAGMENT, 'spec "water"'),
    message: ['`spec "name"`'],
  },
  'invalid-value': {
    trigger: water(ONE_FRAGMENT, 'charge ⟦one⟧'),
    nearMiss: water(ONE_FRAGMENT, 'charge 0'),
    message: ["The charge must be a number, not 'one'."],
  },
  'extra-value': {
    trigger: water(ONE_FRAGMENT, 'spec "water" ⟦"again" "and again"⟧'),
    nearMiss: water(ONE_FRAGMENT, 'spec "water again and again"'),
  },
  'unexpected-block': {
    trigger: water(ONE_FRAGMENT, 'charge 0 ⟦{⟧ }'),
    nearMiss: water(ONE_FRAGMENT, 'charge 0'),
  },
  'missing-block': {
    trigger: water(`${ONE_FRAGMENT}\n⟦limits⟧`),
    nearMiss: water(`${ONE_FRAGMENT}\nlimits { qubits 8 }`),
  },
  'duplicate-statement': {
    trigger: water(ONE_FRAGMENT, 'charge 0\n⟦charge⟧ 0'),
    // The same keyword in another scope (top level and fragment) is no duplicate.
    nearMiss: water('fragment w { atoms rest; charge 0; tier mean-field { method rhf } }', 'charge 0'),
  },
  'unknown-value': {
    trigger: water(ONE_FRAGMENT, 'embedding ⟦dmett⟧'),
    nearMiss: water(ONE_FRAGMENT, 'embedding dmet'),
    message: ["Unknown embedding 'dmett'. Did you mean 'dmet'?"],
  },
  'unknown-method': {
    trigger: water('fragment w { atoms rest; tier quantum { method ⟦vqee⟧ } }'),
    nearMiss: water('fragment w { atoms rest; tier quantum { method vqe } }'),
    message: ["Unknown method 'vqee'. Did you mean 'vqe'?"],
  },
  'method-tier-mismatch': {
    trigger: water('fragment w { atoms rest; tier correlated { method ⟦vqe⟧ } }'),
    nearMiss: water('fragment w { atoms rest; tier quantum { method vqe } }'),
    message: ["'vqe' is a quantum-tier method, but this tier is correlated. Methods of the correlated tier: mp2, ccsd, ccsd(t), casci, casscf, fci."],
  },
  'unknown-ansatz': {
    trigger: water('fragment w { atoms rest; tier quantum { ansatz ⟦ucsd⟧ } }'),
    nearMiss: water('fragment w { atoms rest; tier quantum { ansatz uccsd } }'),
    message: ["Unknown ansatz 'ucsd'. Did you mean 'uccsd'?"],
  },
  'unknown-mapping': {
    trigger: water('fragment w { atoms rest; tier quantum { mapping ⟦jordan-wigne⟧ } }'),
    nearMiss: water('fragment w { atoms rest; tier quantum { mapping jordan-wigner } }'),
    message: ["Unknown mapping 'jordan-wigne'. Did you mean 'jordan-wigner'?"],
  },
  'unknown-basis': {
    trigger: water(ONE_FRAGMENT, '', 'basis ⟦cc-pvdzz⟧'),
    nearMiss: water(ONE_FRAGMENT, '', 'basis cc-pvdz'),
    message: ["'cc-pvdzz' is not in the basis-set library. Did you mean 'cc-pVDZ'?"],
  },
  'setting-ignored': {
    trigger: water('fragment w { atoms rest; tier correlated { method ccsd; taper ⟦on⟧ } }'),
    nearMiss: water('fragment w { atoms rest; tier quantum { method vqe; taper on } }'),
    message: ["'taper' applies to quantum-tier fragments only; this tier is correlated"],
  },
  'missing-tier': {
    trigger: water('fragment ⟦w⟧ { atoms rest }'),
    nearMiss: water('fragment w { atoms rest; tier mean-field { } }'),
  },
  // Geometry
  'missing-geometry': {
    trigger: `⟦basis⟧ sto-3g\n${ONE_FRAGMENT}\n`,
    message: ['The spec has no atoms: add `structure { <Element> [label] x y z ... }` or `structure from "file.xyz"`.'],
    nearMiss: water(ONE_FRAGMENT),
  },
  'unknown-element': {
    trigger: water(ONE_FRAGMENT, '', 'basis sto-3g', `${WATER}\n  ⟦Xq⟧ 5 5 5`),
    // Element symbols are read in any case: `he` is helium.
    nearMiss: water(ONE_FRAGMENT, '', 'basis sto-3g', `${WATER}\n  he 5 5 5`),
    message: ["'Xq' is not an element symbol."],
  },
  'invalid-atom': {
    trigger: water(ONE_FRAGMENT, '', 'basis sto-3g', `${WATER}\n  ⟦He 5 5⟧`),
    nearMiss: water(ONE_FRAGMENT, '', 'basis sto-3g', `${WATER}\n  He 5 5 5`),
    message: ['An atom needs three coordinates (x y z); this He has 2.'],
  },
  'duplicate-label': {
    trigger: water(ONE_FRAGMENT, '', 'basis sto-3g', WATER.replace(/h2/, '⟦h1⟧')),
    nearMiss: water(ONE_FRAGMENT),
    message: ["Label 'h1' is already used by atom #2"],
  },
  'include-outside-folder': {
    trigger: fromFile('⟦"../water.xyz"⟧'),
    nearMiss: fromFile('"data/water.xyz"'),
    options: withFiles,
    message: ["'../water.xyz' points outside the spec's folder (/work/specs)"],
  },
  'include-unreadable': {
    trigger: fromFile('⟦"data/waters.xyz"⟧'),
    nearMiss: fromFile('"data/water.xyz"'),
    options: withFiles,
    message: ['Cannot read "data/waters.xyz" (/work/specs/data/waters.xyz): no such file.'],
  },
  'include-invalid': {
    trigger: fromFile('⟦"data/broken.xyz"⟧'),
    nearMiss: fromFile('"data/water.xyz"'),
    options: withFiles,
    message: ['"data/broken.xyz" line 4: Expected \'element x y z\'; found \'H 0 0.756950\'.'],
  },
  'atoms-too-close': {
    // 0.49 Å is inside the 0.5 Å clash distance, 0.51 Å outside (the threshold is common practice, no source).
    trigger: `basis sto-3g\nstructure {\n  H a 0 0 0\n  ⟦H b 0 0 0.49⟧\n}\nfragment h2 { atoms a b; tier mean-field { } }\n`,
    nearMiss: `basis sto-3g\nstructure {\n  H a 0 0 0\n  H b 0 0 0.51\n}\nfragment h2 { atoms a b; tier mean-field { } }\n`,
    message: ['Atoms a (H) and b (H) are 0.490 Å apart, closer than 0.5 Å'],
  },
  'coordinate-out-of-range': {
    // 1e155 Å: squared, it overflows a double; 1e4 Å is far, but inside the ±1e5 Å range.
    trigger: `basis sto-3g\nstructure {\n  H a 0 0 0\n  H b 0 0 ⟦1e155⟧\n}\nfragment h2 { atoms a b; tier mean-field { } }\n`,
    nearMiss: `basis sto-3g\nstructure {\n  H a 0 0 0\n  H b 0 0 1e4\n}\nfragment h2 { atoms a b; tier mean-field { } }\n`,
    message: ['Atom b (H) has z = 1.00e+155 Å', 'within ±100,000 Å (10 µm)', 'the point group is taken as C1'],
  },
  'units-suspect': {
    trigger: water(ONE_FRAGMENT, '', 'basis sto-3g', WATER_IN_BOHR, 'structure in ⟦angstrom⟧'),
    nearMiss: water(ONE_FRAGMENT, '', 'basis sto-3g', WATER_IN_BOHR, 'structure in bohr'),
    message: ['these coordinates look like bohr', 'Write `structure in bohr { … }` if so.'],
  },
  'bond-cut': {
    trigger: water(SPLIT_WATER.replace('atoms h2', '⟦atoms h2⟧')),
    // Two waters 5 Å apart: a boundary between them cuts nothing.
    nearMiss: water(TWO_FRAGMENTS, '', 'basis sto-3g', TWO_WATERS),
    message: ["The boundary between 'a' and 'b' cuts 1 covalent bond: o–h2 0.96 Å"],
  },
  // Basis
  'missing-basis': {
    trigger: `⟦structure⟧ {\n${WATER}\n}\n${ONE_FRAGMENT}\n`,
    nearMiss: water(ONE_FRAGMENT),
    message: ['No main basis set is chosen: add a line such as `basis STO-3G`.'],
  },
  'basis-missing-element': {
    trigger: water(ONE_FRAGMENT, '', 'basis ⟦6-31G⟧', RBCL),
    nearMiss: water(ONE_FRAGMENT, '', 'basis 6-31G\nbasis def2-SVP on all Rb', RBCL),
    message: ['6-31G has no functions for Rb (1 atom: rb).', 'Bases that define Rb: STO-3G, 3-21G, def2-SVP', '`basis STO-3G on all Rb`'],
  },
  'basis-override-conflict': {
    // Two element lines for H: the later wins, the earlier is reported.
    trigger: water(ONE_FRAGMENT, '', 'basis sto-3g\nbasis 3-21G ⟦on all H⟧\nbasis 6-31G on all H'),
    // A line naming h1 is more specific than the element line: a precedence, not a conflict.
    nearMiss: water(ONE_FRAGMENT, '', 'basis sto-3g\nbasis 3-21G on h1\nbasis 6-31G on all H'),
    message: ['`basis 3-21G on all H` and the later `basis 6-31G on all H` are both an element line for h1, h2; the later one wins, so these atoms take 6-31G.'],
  },
  'basis-override-unused': {
    // The element line comes later but a line naming both hydrogens is more specific.
    trigger: water(ONE_FRAGMENT, '', 'basis sto-3g\nbasis 3-21G on h1 h2\nbasis 6-31G ⟦on all H⟧'),
    nearMiss: water(ONE_FRAGMENT, '', 'basis sto-3g\nbasis 3-21G on h1\nbasis 6-31G on all H'),
    message: ['`basis 6-31G on all H` changes no atom: every atom it selects takes its basis from a more specific or later line (`basis 3-21G on h1 h2`).'],
  },
  'retired-spelling': {
    trigger: water(ONE_FRAGMENT, '', 'basis sto-3g', WATER, '⟦geometry⟧'),
    nearMiss: water(ONE_FRAGMENT),
    message: ['`geometry` is an old spelling: write `structure { … }`.'],
  },
  // Charge and spin
  'charge-not-integer': {
    trigger: water(ONE_FRAGMENT, 'charge ⟦0.5⟧'),
    nearMiss: water(ONE_FRAGMENT, 'charge 0.0'),
  },
  'multiplicity-invalid': {
    trigger: water(ONE_FRAGMENT, 'multiplicity ⟦0⟧'),
    nearMiss: water(ONE_FRAGMENT, 'multiplicity 1'),
  },
  'multiplicity-parity': {
    trigger: water(ONE_FRAGMENT, 'multiplicity ⟦2⟧'),
    // A triplet water is allowed: 10 electrons, 2 unpaired, 8 paired.
    nearMiss: water('fragment w { atoms rest; multiplicity 3; tier mean-field { method rohf } }', 'multiplicity 3'),
    message: ['Multiplicity 2 needs an odd number of electrons, but the system has 10 electrons (nuclear charge 10, charge 0). The nearest valid multiplicities are 1 or 3.'],
  },
  'multiplicity-too-high': {
    trigger: water('fragment w { atoms rest; charge +8; multiplicity 3; tier mean-field { method rohf } }', 'charge +8\nmultiplicity ⟦5⟧'),
    nearMiss: water('fragment w { atoms rest; charge +8; multiplicity 3; tier mean-field { method rohf } }', 'charge +8\nmultiplicity 3'),
    message: ['Multiplicity 5 needs 4 unpaired electrons, but the system has only 2 electrons (nuclear charge 10, charge +8). The highest possible multiplicity is 3.'],
  },
  'negative-electrons': {
    trigger: water('fragment w { atoms rest; charge +10; tier mean-field { } }', 'charge ⟦+11⟧'),
    // +10 leaves no electrons at all, which is allowed.
    nearMiss: water('fragment w { atoms rest; charge +10; tier mean-field { } }', 'charge +10'),
    message: ['Charge +11 leaves the system with -1 electrons (nuclear charge 10, charge +11): fewer than zero.'],
  },
  // Angular-momentum addition: two singlets couple only to S = 0.
  'spin-coupling': {
    trigger: `multiplicity ⟦3⟧\nbasis sto-3g\nstructure {\n${TWO_WATERS}\n}\n${TWO_FRAGMENTS}\n`,
    nearMiss: `multiplicity 3\nbasis sto-3g\nstructure {\n${TWO_WATERS}\n}\n${TWO_FRAGMENTS.replace('atoms o h1 h2;', 'atoms o h1 h2; multiplicity 3;')}\n`,
    message: ["couple only to multiplicity 1, not to the system's 3", "'a' singlet, S = 0 (default)"],
  },
  'fragment-charge-sum': {
    trigger: water(SPLIT_WATER.replace('charge +1', 'charge 0'), 'charge ⟦0⟧'),
    nearMiss: water(SPLIT_WATER, 'charge 0'),
    nearMissAllows: ['bond-cut'],
    message: ['Fragment charges add up to -1 (a -1, b 0), but the total charge is 0.'],
  },
  // Fragments
  'duplicate-fragment': {
    trigger: water(TWO_FRAGMENTS.replace('fragment b', 'fragment ⟦a⟧'), '', 'basis sto-3g', TWO_WATERS),
    nearMiss: water(TWO_FRAGMENTS, '', 'basis sto-3g', TWO_WATERS),
    message: ["A fragment named 'a' already exists"],
  },
  'unknown-atom': {
    trigger: water('fragment w { atoms o h1 ⟦hx⟧; tier mean-field { } }'),
    nearMiss: water('fragment w { atoms o h1 h2; tier mean-field { } }'),
    message: ["No atom is labelled 'hx'. Did you mean 'h1'?"],
  },
  'invalid-selector': {
    trigger: water('fragment w { atoms ⟦h2..o⟧; tier mean-field { } }'),
    nearMiss: water('fragment w { atoms o..h2; tier mean-field { } }'),
    message: ['This range runs backwards: atom #3 comes after #1 in the structure'],
  },
  'fragment-empty': {
    trigger: water(`${ONE_FRAGMENT}\nfragment ⟦e⟧ { tier mean-field { } }`),
    nearMiss: water(TWO_FRAGMENTS, '', 'basis sto-3g', TWO_WATERS),
    message: ["Fragment 'e' has no atoms: add `atoms ...` inside its block."],
  },
  'fragment-overlap': {
    trigger: water('fragment a { atoms o h1 h2; tier mean-field { } }\nfragment b { ⟦atoms h2⟧; charge +1; tier mean-field { } }'),
    nearMiss: water(SPLIT_WATER),
    nearMissAllows: ['bond-cut'],
    message: ["Fragments 'a' and 'b' both claim 1 atom: h2. Each atom belongs to exactly one fragment."],
  },
  'atoms-unassigned': {
    trigger: water('fragment a { atoms o h1 h2; tier mean-field { } }', '', 'basis sto-3g', TWO_WATERS).replace('structure', '⟦structure⟧'),
    nearMiss: water('fragment a { atoms o h1 h2; tier mean-field { } }\nfragment b { atoms rest; tier mean-field { } }', '', 'basis sto-3g', TWO_WATERS),
    message: ['3 atoms are in no fragment: p, g1, g2. Add them to a fragment, or let one fragment take `atoms rest`.'],
  },
  'rest-twice': {
    trigger: water('fragment a { atoms o h1 h2 rest; tier mean-field { } }\nfragment b { atoms p ⟦rest⟧; tier mean-field { } }', '', 'basis sto-3g', TWO_WATERS),
    nearMiss: water('fragment a { atoms o h1 h2; tier mean-field { } }\nfragment b { atoms p rest; tier mean-field { } }', '', 'basis sto-3g', TWO_WATERS),
    message: ["Fragment 'a' already claims the rest; only one fragment can."],
  },
  // Active space and limits
  'near-symmetry': {
    // One H of water moved 0.02 Å along z: Cs at the 0.01 Å tolerance, C2v within about 0.01 Å
    // (the best C2v fit shares the shift between the two H atoms).
    trigger: water(ONE_FRAGMENT, '', 'basis sto-3g', 'O o 0 0 0\nH h1 0 0.756950 0.585882\nH h2 0 -0.756950 0.605882').replace('⟦', '').replace('structure {', '⟦structure⟧ {'),
    nearMiss: water(ONE_FRAGMENT),
    message: [/^The geometry is C2v within 0\.0\d\d Å, but Cs at the 0\.01 Å tolerance/],
  },
  'scan-symmetry-change': {
    // Water's O–h2 stretched alone: the two O–H differ (Cs) except where O–h2 equals O–h1, 0.9572 Å
    // (C2v); bending h2 keeps both O–H equal, an isosceles triangle, C2v throughout (by definition
    // of the groups).
    trigger: water(`${ONE_FRAGMENT}\n⟦scan⟧ distance o h2 from 0.9172 to 1.0572 step 0.02 moving h2`),
    nearMiss: water(`${ONE_FRAGMENT}\nscan angle h1 o h2 from 100 to 110 step 5`),
    message: [/^The point group changes along the scan: Cs from 0\.9172 Å to 0\.9372 Å \(2 points\); C2v at 0\.9572 Å; Cs from 0\.9772 Å to 1\.0572 Å \(5 points\)\./],
  },
  'active-space-invalid': {
    trigger: water('fragment w { atoms rest; tier quantum { ⟦active 6e 2o⟧ } }'),
    nearMiss: water('fragment w { atoms rest; tier quantum { active 4e 2o } }'),
    message: ["The active space of 'w' does not fit: 6 electrons do not fit in 2 orbitals (at most 4)."],
  },
  'duplicate-variant': {
    trigger: water(`${ONE_FRAGMENT}\nvariant a { embedding dmet }\nvariant ⟦a⟧ { embedding none }`),
    nearMiss: water(`${ONE_FRAGMENT}\nvariant a { embedding dmet }\nvariant b { embedding none }`),
    message: ["A variant named 'a' is already declared"],
  },
  'variant-problem': {
    // The variant asks for an active space the fragment cannot hold: water in STO-3G has 7 orbitals.
    trigger: water(`fragment w { atoms rest; tier quantum { active 4e 4o } }\nvariant ⟦big⟧ { fragment w { tier quantum { active 8e 9o } } }`),
    nearMiss: water(`fragment w { atoms rest; tier quantum { active 4e 4o } }\nvariant small { fragment w { tier quantum { active 2e 2o } } }`),
    message: ["Variant 'big' has 1 error as a spec of its own: line 7 of the variant's spec:"],
  },
  'qubit-limit-exceeded': {
    trigger: water('fragment w { atoms rest; tier quantum { mapping parity; ⟦active 8e 8o⟧ } }\nlimits { qubits 12 }', '', 'basis cc-pVDZ'),
    // Under the parity mapping with the two-qubit reduction, 7 orbitals need 2 × 7 − 2 = 12 qubits.
    nearMiss: water('fragment w { atoms rest; tier quantum { mapping parity; active 8e 7o } }\nlimits { qubits 12 }', '', 'basis cc-pVDZ'),
    message: ["Fragment 'w' needs 14 qubits (parity; active space 8e 8o), but the limit is 12. To fit: `taper on` brings it to 12 qubits; or the largest active space that fits is `active 8e 7o` (12 qubits)."],
  },
  'memory-limit-exceeded': {
    // A statevector of 2^n amplitudes of 16 bytes (complex double; common practice, no source):
    // 4 orbitals = 8 qubits = 4096 B, above a 4 KB (4000 B) limit and within 4 KiB (4096 B).
    trigger: water('fragment w { atoms rest; tier quantum { ⟦active 4e 4o⟧ } }\nlimits { memory 4 KB }'),
    nearMiss: water('fragment w { atoms rest; tier quantum { active 4e 4o } }\nlimits { memory 4 KiB }'),
    message: ['statevector of 8 qubits', 'needs 4.00 KiB', 'the memory limit is 3.91 KiB'],
  },
  // Scan
  // O–O bonded below 1.2 × (0.66 + 0.66) = 1.58 Å (Cordero et al. 2008 radii; the bond rule of the structure).
  'scan-bond-change': {
    trigger: `basis sto-3g\nstructure {\n${TWO_WATERS}\n}\n${TWO_FRAGMENTS}\n⟦scan⟧ distance o p from 5 to 1.5 step -0.5\n`,
    nearMiss: `basis sto-3g\nstructure {\n${TWO_WATERS}\n}\n${TWO_FRAGMENTS}\nscan distance o p from 5 to 2 step -0.5\n`,
    message: ["At 1.5 a bond p–o forms between fragments 'b' and 'a' (1.50 Å"],
  },
  'invalid-scan': {
    trigger: water(SPLIT_WATER, '', 'basis sto-3g').replace(/$/, 'scan distance o h2 from 1.5 to 0.9 step ⟦0.1⟧\n'),
    nearMiss: water(SPLIT_WATER, '', 'basis sto-3g').replace(/$/, 'scan distance o h2 from 1.5 to 0.9 step -0.1\n'),
    nearMissAllows: ['bond-cut'],
    message: ['The scan goes from 1.5 to 0.9, so the step must be negative; it is 0.1.'],
  },
  // 3.0 − 4 × 0.25 = 2.0; one more step gives 1.75, past 1.8 (arithmetic, by construction).
  'scan-end-missed': {
    trigger: water(SPLIT_WATER, '', 'basis sto-3g').replace(/$/, 'scan distance o h2 from 3.0 to ⟦1.8⟧ step -0.25\n'),
    nearMiss: water(SPLIT_WATER, '', 'basis sto-3g').replace(/$/, 'scan distance o h2 from 3.0 to 1.75 step -0.25\n'),
    nearMissAllows: ['bond-cut'],
    message: ['Going from 3 in steps of -0.25 stops at 2, not at 1.8: the next step would pass it (1.75).'],
  },
  'spec-too-large': {
    // One character beyond the supported 8 MiB, and a spec of exactly 8 MiB (water padded with a comment).
    trigger: `⟦⟧${padTo(water(ONE_FRAGMENT), 8 * 1024 * 1024 + 1)}`,
    nearMiss: padTo(water(ONE_FRAGMENT), 8 * 1024 * 1024),
    message: ['This spec has 8,388,609 characters', 'up to 8,388,608 characters (8 MiB), 100,000 atoms and 1,000,000 words outside plain structure blocks'],
  },
  'too-many-problems': {
    // 1,001 stray characters and the missing geometry: 1,002 problems, the first 1,000 listed.
    trigger: `${'@\n'.repeat(998)}@⟦⟧\n${'@\n'.repeat(2)}`,
    nearMiss: '@\n'.repeat(999),
    nearMissAllows: ['unexpected-character', 'missing-geometry'],
    message: ['Tessera lists at most 1,000 problems per file; 2 more were found after this point (2 of them errors)'],
    // An error, since errors are among the ones not listed (the registry's warning otherwise).
    severity: 'error',
  },
  'internal-error': {
    // A file host that throws stands for any bug below analyze(): the spec itself is fine.
    trigger: `⟦⟧${fromFile('"data/water.xyz"')}`,
    nearMiss: fromFile('"data/water.xyz"'),
    options: { path: SPEC_PATH, files: throwingFiles('the disk driver failed') },
    nearMissOptions: withFiles,
    message: ['Tessera failed while building the model', 'Error: the disk driver failed', 'This is a bug in Tessera'],
  },
};

/** The spec followed by a comment line that brings it to `length` characters. */
function padTo(spec: string, length: number): string {
  return `${spec}# ${'x'.repeat(length - spec.length - 3)}\n`;
}

/** A file host with a bug: reading throws instead of answering. */
function throwingFiles(message: string): FileHost {
  return {
    readFile() {
      throw new Error(message);
    },
    realPath: (absolutePath) => absolutePath,
  };
}

describe('every diagnostic code', () => {
  it('has a case here, and every case names a registered code', () => {
    expect(Object.keys(CASES).sort()).toEqual(Object.keys(DIAGNOSTIC_CODES).sort());
  });

  for (const code of Object.keys(DIAGNOSTIC_CODES) as DiagnosticCode[]) {
    const test = CASES[code];
    describe(code, () => {
      it('is reported once, on the marked range, with its severity and message', () => {
        const { diagnostic } = expectDiagnostic(test.trigger, code, test.options);
        expect(diagnostic.severity).toBe(test.severity ?? DIAGNOSTIC_CODES[code].severity);
        for (const expected of test.message ?? []) {
          if (typeof expected === 'string') expect(diagnostic.message).toContain(expected);
          else expect(diagnostic.message).toMatch(expected);
        }
      });

      it('is not reported by the closely related case', () => {
        const analysis = expectNoDiagnostic(test.nearMiss, code, test.nearMissOptions ?? test.options);
        const others = analysis.diagnostics.filter((d) => !(test.nearMissAllows ?? []).includes(d.code));
        expect(others.map((d) => show(analysis, d))).toEqual([]);
      });
    });
  }
});

describe('charge and multiplicity', () => {
  it('checks the multiplicity of each fragment against its own electron count', () => {
    const { diagnostic } = expectDiagnostic(water('fragment w { atoms rest; multiplicity ⟦2⟧; tier mean-field { method rohf } }'), 'multiplicity-parity');
    expect(diagnostic.message).toBe(
      "Multiplicity 2 needs an odd number of electrons, but fragment 'w' has 10 electrons (nuclear charge 10, charge 0). The nearest valid multiplicities are 1 or 3.",
    );
    expect(diagnostic.data).toEqual({ multiplicity: 1, multiplicities: [1, 3] });
  });

  it('reports a fragment multiplicity above its electron count, with the highest possible one', () => {
    // The proton of a split water has no electrons: only a singlet is possible.
    const { diagnostic } = expectDiagnostic(
      water(`fragment a { atoms o h1; charge -1; tier mean-field { } }
fragment b { atoms h2; charge +1; multiplicity ⟦3⟧; tier mean-field { } }`),
      'multiplicity-too-high',
    );
    expect(diagnostic.message).toBe(
      "Multiplicity 3 needs 2 unpaired electrons, but fragment 'b' has only 0 electrons (nuclear charge 1, charge +1). The highest possible multiplicity is 1.",
    );
  });

  it('counts electrons replaced by effective core potentials and says so', () => {
    // def2 bases replace the 28 core electrons of Rb by an effective core potential (Leininger et
    // al., Chem. Phys. Lett. 255, 274 (1996); from memory): RbCl keeps 37 + 17 − 28 = 26 electrons.
    const { diagnostic, analysis } = expectDiagnostic(water(ONE_FRAGMENT, 'multiplicity ⟦2⟧', 'basis def2-SVP', RBCL), 'multiplicity-parity');
    expect(diagnostic.message).toContain('the system has 26 electrons (nuclear charge 54, charge 0, 28 core electrons in effective core potentials)');
    expect(analysis.model.system.electrons).toBe(26);
  });

  it('picks the lowest multiplicity when none is given, so an odd count is a doublet', () => {
    const analysis = analyzeMarked(water('fragment w { atoms rest; charge +1; tier mean-field { } }', 'charge +1'));
    expect(analysis.diagnostics).toEqual([]);
    expect(analysis.model.multiplicity).toBe(2);
    expect(analysis.model.fragments[0]!.multiplicity).toBe(2);
    expect(analysis.model.fragments[0]!.tier?.method).toBe('rohf');
  });

  it('reports negative electrons of a fragment on its charge, and then no spin error for it', () => {
    const analysis = expectDiagnostics(
      water(`fragment a { atoms o; charge ⟦+9⟧; multiplicity 2; tier mean-field { } }
fragment b { ⟦atoms h1 h2⟧; charge -9; tier mean-field { } }`),
      ['negative-electrons', 'bond-cut'],
    );
    expect(analysis.diagnostics[0]!.message).toBe("Charge +9 leaves fragment 'a' with -1 electrons (nuclear charge 8, charge +9): fewer than zero.");
  });
});

describe('fragment partition', () => {
  it('lists the parts of a wrong charge sum, marks defaults, and points at each given charge', () => {
    const { diagnostic, analysis } = expectDiagnostic(
      water(`fragment a { atoms o h1; charge -1; tier mean-field { } }
fragment b { atoms h2; tier mean-field { } }`, 'charge ⟦+1⟧'),
      'fragment-charge-sum',
    );
    expect(diagnostic.message).toBe('Fragment charges add up to -1 (a -1, b 0 (default)), but the total charge is +1.');
    expect(diagnostic.related?.map((r) => analysis.text.slice(r.span.start, r.span.end))).toEqual(['-1']);
  });

  it('places the charge-sum error on the first fragment when the total charge is the default', () => {
    expectDiagnostic(water(`fragment ⟦a⟧ { atoms o h1; charge -1; tier mean-field { } }\nfragment b { atoms h2; tier mean-field { } }`), 'fragment-charge-sum');
  });

  it('does not add up charges while atoms are unassigned or claimed twice', () => {
    const unassigned = water('fragment a { atoms o h1; charge -1; tier mean-field { } }');
    expectNoDiagnostic(unassigned, 'fragment-charge-sum');
    expectDiagnostic(unassigned.replace('structure', '⟦structure⟧'), 'atoms-unassigned');
    const overlapping = water(`fragment a { atoms o h1 h2; charge -1; tier mean-field { } }\nfragment b { atoms h2; tier mean-field { } }`);
    expectNoDiagnostic(overlapping, 'fragment-charge-sum');
  });

  it('reports each pair of overlapping fragments once, on the later one, with the shared atoms', () => {
    const { text, ranges } = parseMarkers(
      water(`fragment a { ⟦atoms o h1⟧; tier mean-field { } }
fragment b { ⟦atoms h1 h2⟧; tier mean-field { } }
fragment c { ⟦atoms all H⟧; tier mean-field { } }`),
    );
    const analysis = analyze(text);
    const overlaps = analysis.diagnostics.filter((d) => d.code === 'fragment-overlap');
    expect(overlaps.map((d) => [d.span, d.message, d.data, d.related?.[0]?.span])).toEqual([
      [ranges[1], "Fragments 'a' and 'b' both claim 1 atom: h1. Each atom belongs to exactly one fragment.", { atoms: [1] }, ranges[0]],
      [ranges[2], "Fragments 'a' and 'c' both claim 1 atom: h1. Each atom belongs to exactly one fragment.", { atoms: [1] }, ranges[0]],
      [ranges[2], "Fragments 'b' and 'c' both claim 2 atoms: h1, h2. Each atom belongs to exactly one fragment.", { atoms: [1, 2] }, ranges[1]],
    ]);
    expect(analysis.diagnostics.filter((d) => d.severity === 'error').length).toBe(3);
  });

  it('lets `rest` take every atom no other fragment claims', () => {
    const analysis = analyze(water('fragment a { atoms o h1 h2; tier mean-field { } }\nfragment b { atoms rest; tier mean-field { } }', '', 'basis sto-3g', TWO_WATERS));
    expect(analysis.diagnostics).toEqual([]);
    expect(analysis.model.fragments[1]!.atoms).toEqual([3, 4, 5]);
  });

  it('names every unassigned atom and points at each one', () => {
    const { diagnostic, analysis } = expectDiagnostic(
      water('fragment a { atoms o h1; tier mean-field { } }', '', 'basis sto-3g', TWO_WATERS.replace(/ g2 /, ' ')).replace('structure', '⟦structure⟧'),
      'atoms-unassigned',
    );
    expect(diagnostic.message).toBe('4 atoms are in no fragment: h2, p, g1, #6. Add them to a fragment, or let one fragment take `atoms rest`.');
    expect(diagnostic.data).toEqual({ atoms: [2, 3, 4, 5] });
    expect(diagnostic.related?.map((r) => analysis.text.slice(r.span.start, r.span.end).split(/\s+/)[0])).toEqual(['H', 'O', 'H', 'H']);
    expect(diagnostic.related?.map((r) => r.message)).toEqual(['h2 is in no fragment', 'p is in no fragment', 'g1 is in no fragment', '#6 is in no fragment']);
  });

  it('tells apart the three ways a fragment can be empty', () => {
    expectDiagnostic(water(`${ONE_FRAGMENT}\nfragment ⟦e⟧ { tier mean-field { } }`), 'fragment-empty');
    const nothingLeft = expectDiagnostic(water(`fragment a { atoms o h1 h2; tier mean-field { } }\nfragment b { ⟦atoms rest⟧; tier mean-field { } }`), 'fragment-empty');
    expect(nothingLeft.diagnostic.message).toBe("Fragment 'b' claims the rest, but every atom is already in another fragment.");
    // Selecting an element the geometry lacks: the fragment error, plus a warning on the selector.
    const noMatch = expectDiagnostic(water(`${ONE_FRAGMENT}\nfragment f { ⟦atoms all Cl⟧; tier mean-field { } }`), 'fragment-empty');
    expect(noMatch.diagnostic.message).toBe("Fragment 'f' selects no atoms.");
    const selector = noMatch.analysis.diagnostics.find((d) => d.code === 'invalid-selector');
    const at = noMatch.analysis.text.indexOf('all Cl');
    expect(selector).toMatchObject({ severity: 'warning', span: { start: at, end: at + 'all Cl'.length } });
    expect(selector?.message).toBe("The structure has no Cl atoms, so 'all Cl' selects nothing.");
  });
});

describe('basis coverage', () => {
  it('names the basis, the element, its atoms and the bases that define it', () => {
    const { diagnostic } = expectDiagnostic(water(ONE_FRAGMENT, '', 'basis ⟦6-31G⟧', RBCL), 'basis-missing-element');
    expect(diagnostic.message).toBe(
      '6-31G has no functions for Rb (1 atom: rb). Bases that define Rb: STO-3G, 3-21G, def2-SVP, def2-SVPD, def2-TZVP, def2-TZVPD and 3 more; or add the line `basis STO-3G on all Rb`.',
    );
    expect(diagnostic.data).toEqual({
      element: 'Rb',
      candidates: ['STO-3G', '3-21G', 'def2-SVP', 'def2-SVPD', 'def2-TZVP', 'def2-TZVPD', 'def2-TZVPP', 'def2-QZVP', 'def2-QZVPP'],
      line: -1,
      atoms: [0],
    });
  });

  it('is satisfied by an element override', () => {
    const analysis = analyzeMarked(water(ONE_FRAGMENT, '', 'basis 6-31G\nbasis def2-SVP on all Rb', RBCL));
    expect(analysis.diagnostics).toEqual([]);
    expect(analysis.model.basis.atomSets.map((set) => set?.displayName)).toEqual(['def2-SVP', '6-31G']);
  });

  it('reports an override that misses its element on the override', () => {
    // 6-31+G* stops at Ca in the library, so it has no bromine.
    const { diagnostic } = expectDiagnostic(
      water(ONE_FRAGMENT, '', 'basis sto-3g\nbasis ⟦6-31+G*⟧ on all Br', '  Br br 0 0 0\n  Cl cl 0 0 2.14'),
      'basis-missing-element',
    );
    expect(diagnostic.message).toMatch(/^6-31\+G\* has no functions for Br \(1 atom: br\)\. Bases that define Br: STO-3G, /);
  });

  it('reports an unknown override basis, and an element override for an element the structure lacks', () => {
    const analysis = analyzeMarked(water(ONE_FRAGMENT, '', 'basis sto-3g\nbasis ⟦nobasis⟧ on all H\nbasis def2-SVP on ⟦all Na⟧'));
    expect(analysis.diagnostics.map((d) => [d.code, d.severity, d.span])).toEqual([
      ['unknown-basis', 'error', analysis.marks.ranges[0]],
      ['invalid-selector', 'warning', analysis.marks.ranges[1]],
    ]);
    // The line with an unknown name decides nothing: the hydrogens keep the main basis.
    expect(analysis.model.basis.atomSets.map((set) => set?.displayName)).toEqual(['STO-3G', 'STO-3G', 'STO-3G']);
  });

  it('offers bases covering every element when none is chosen', () => {
    const { diagnostic } = expectDiagnostic(`⟦structure⟧ {\n${RBCL}\n}\n${ONE_FRAGMENT}\n`, 'missing-basis');
    expect(diagnostic.message).toBe(
      'No main basis set is chosen: add a line such as `basis STO-3G`. Bases that cover every element here: STO-3G, 3-21G, def2-SVP, def2-SVPD, def2-TZVP, def2-TZVPD and 3 more.',
    );
  });

  it('suggests the closest basis name', () => {
    const { diagnostic } = expectDiagnostic(water(ONE_FRAGMENT, '', 'basis ⟦def2-TZVPQ⟧'), 'unknown-basis');
    expect(diagnostic.data).toEqual({ replacement: 'def2-TZVP' });
  });
});

describe('geometry checks', () => {
  it('reports a clash on the later atom and points at the earlier one', () => {
    const { diagnostic, analysis } = expectDiagnostic(
      water(`fragment w { atoms rest; multiplicity 2; tier mean-field { } }`, '', 'basis sto-3g', `${WATER}\n  ⟦H h3 0 -0.756950 0.985882⟧`),
      'atoms-too-close',
    );
    expect(diagnostic.message).toBe('Atoms h2 (H) and h3 (H) are 0.400 Å apart, closer than 0.5 Å: a duplicated or mistyped line?');
    expect(analysis.text.slice(diagnostic.related![0]!.span.start, diagnostic.related![0]!.span.end)).toBe('H h2 0.000000 -0.756950 0.585882');
  });

  it('gives the XYZ line of clashing atoms read from a file', () => {
    const files = memoryFiles({ '/work/specs/twice.xyz': '2\n\nH 0 0 0\nH 0 0 0.3\n' });
    const { diagnostic } = expectDiagnostic('basis sto-3g\nstructure from ⟦"twice.xyz"⟧\nfragment h { atoms rest; tier mean-field { } }\n', 'atoms-too-close', { path: SPEC_PATH, files });
    expect(diagnostic.message).toBe(
      'Atoms #1 (H) (line 3 of the XYZ file) and #2 (H) (line 4 of the XYZ file) are 0.300 Å apart, closer than 0.5 Å: a duplicated or mistyped line?',
    );
    expect(diagnostic.related).toEqual([{ span: { start: 0, end: 0 }, file: '/work/specs/twice.xyz', line: 2, message: '#1 is here' }]);
  });

  it('suspects bohr typed as ångström, and ångström typed as bohr', () => {
    const bohrAsAngstrom = expectDiagnostic(water(ONE_FRAGMENT, '', 'basis sto-3g', WATER_IN_BOHR, 'structure in ⟦angstrom⟧'), 'units-suspect');
    expect(bohrAsAngstrom.diagnostic.data).toEqual({ units: 'bohr' });
    // Ratios of 1/0.529 ≈ 1.89 and 0.53 are the unit conversion factor (CODATA 2018 bohr).
    expect(bohrAsAngstrom.diagnostic.message).toMatch(/^Nearest-neighbour distances are 1\.\d\d times the sum of covalent radii \(median over 3 atoms\), close to 1\.89: /);
    const angstromAsBohr = expectDiagnostic(water(ONE_FRAGMENT, '', 'basis sto-3g', WATER, 'structure in ⟦bohr⟧'), 'units-suspect');
    expect(angstromAsBohr.diagnostic.data).toEqual({ units: 'angstrom' });
    expect(angstromAsBohr.diagnostic.message).toContain('close to 0.53: these coordinates look like ångström, but the structure reads them as bohr. Write `structure in angstrom { … }` if so.');
  });

  it('puts the units warning on the structure keyword when no unit is written', () => {
    expectDiagnostic(water(ONE_FRAGMENT, '', 'basis sto-3g', WATER_IN_BOHR).replace('structure', '⟦structure⟧'), 'units-suspect');
  });

  it('says that XYZ files are read in ångström', () => {
    const inBohr = `3\nwater in bohr\n${WATER_ANGSTROM.map(([e, , x, y, z]) => `${e} ${x / BOHR} ${y / BOHR} ${z / BOHR}`).join('\n')}\n`;
    const files = memoryFiles({ '/work/specs/bohr.xyz': inBohr });
    const { diagnostic } = expectDiagnostic(fromFile('"bohr.xyz"').replace('structure', '⟦structure⟧'), 'units-suspect', { path: SPEC_PATH, files });
    expect(diagnostic.message).toMatch(/these coordinates look like bohr, but XYZ files are in ångström by their convention\.$/);
  });

  it('lists every bond a fragment boundary cuts, with the bonded pairs as data', () => {
    const { diagnostic, analysis } = expectDiagnostic(
      water(`fragment a { atoms o; charge -2; tier mean-field { } }\nfragment b { ⟦atoms h1 h2⟧; charge +2; tier mean-field { } }`),
      'bond-cut',
    );
    expect(diagnostic.message).toBe(
      "The boundary between 'a' and 'b' cuts 2 covalent bonds: o–h1 0.96 Å, o–h2 0.96 Å (bonded: closer than 1.2 × the sum of covalent radii). Cut bonds need capping or link atoms in the embedding: `caps hydrogen fixed` (or `scaled`) adds hydrogen link atoms.",
    );
    expect(diagnostic.data).toEqual({ bonds: [[0, 1], [0, 2]] });
    expect(diagnostic.related?.map((r) => [analysis.text.slice(r.span.start, r.span.end), r.message])).toEqual([
      ['atoms o', "fragment 'a'"],
      ['H h1 0.000000 0.756950 0.585882', 'bond o–h1, 0.96 Å'],
      ['H h2 0.000000 -0.756950 0.585882', 'bond o–h2, 0.96 Å'],
    ]);
  });

  it('does not call atoms bonded beyond 1.2 × the sum of covalent radii', () => {
    // O 0.66 Å + H 0.31 Å (Cordero et al., Dalton Trans. 2008, 2832, as stored in the element table):
    // 1.2 × 0.97 = 1.164 Å; a proton 1.15 Å away is bonded, one 1.18 Å away is not.
    const geometry = (d: number) => `  O o 0 0 0\n  H h 0 0 ${d}`;
    const fragments = 'fragment a { atoms o; charge -2; tier mean-field { } }\nfragment b { atoms h; charge +1; tier mean-field { } }';
    const header = 'charge -1';
    expect(analyzeMarked(water(fragments, header, 'basis sto-3g', geometry(1.15))).diagnostics.map((d) => d.code)).toEqual(['bond-cut']);
    expect(analyzeMarked(water(fragments, header, 'basis sto-3g', geometry(1.18))).diagnostics).toEqual([]);
  });
});

describe('active spaces', () => {
  // Water in STO-3G: 7 orbitals and 10 electrons; the frozen O 1s core leaves 6 orbitals and
  // 8 electrons (minimal basis and noble-gas core rule: common practice, no source).
  const active = (space: string, extra = '', header = '') => water(`fragment w { atoms rest;${extra} tier quantum { ⟦active ${space}⟧ } }`, header);

  const problems: [string, string, string, string?][] = [
    ['6e 2o', 'electrons-exceed-capacity', '6 electrons do not fit in 2 orbitals (at most 4).'],
    ['4e 7o', 'orbitals-exceed-available', '7 active orbitals requested but only 6 are available (7 orbitals − 1 frozen-core).'],
    ['10e 6o', 'electrons-exceed-available', '10 active electrons requested but only 8 are available (10 − 2 frozen-core).'],
    ['3e 4o', 'parity', '3 active electrons cannot have multiplicity 1: 0 unpaired electrons need an even electron count.'],
    ['0e 0o', 'orbitals-not-positive', 'An active space needs at least one orbital; 0 given.'],
  ];
  for (const [space, kind, message] of problems) {
    it(`reports ${kind}: active ${space}`, () => {
      const { diagnostic } = expectDiagnostic(active(space), 'active-space-invalid');
      expect(diagnostic.message).toBe(`The active space of 'w' does not fit: ${message.charAt(0).toLowerCase()}${message.slice(1)}`);
      expect(diagnostic.data).toEqual({ kind });
    });
  }

  it('reports a spin the active space cannot hold', () => {
    // A quintet needs 4 unpaired electrons: 2 electrons cannot be them, and 4 electrons in 2 orbitals pair up.
    for (const space of ['2e 2o', '4e 2o']) {
      const { diagnostic } = expectDiagnostic(active(space, ' multiplicity 5;', 'multiplicity 5'), 'active-space-invalid');
      expect(diagnostic.data).toEqual({ kind: 'spin-does-not-fit' });
      expect(diagnostic.message).toContain('multiplicity 5 needs 4 unpaired electrons');
    }
  });

  it('accepts spaces that fit: closed shell, triplet, all outside the core', () => {
    expect(analyzeMarked(active('4e 4o')).diagnostics).toEqual([]);
    expect(analyzeMarked(active('2e 2o', ' multiplicity 3;', 'multiplicity 3')).diagnostics).toEqual([]);
    expect(analyzeMarked(active('8e 6o')).diagnostics).toEqual([]);
  });

  it('counts the frozen core only while frozen-core is on', () => {
    expect(analyzeMarked(water('fragment w { atoms rest; tier quantum { frozen-core off; active 10e 7o } }')).diagnostics).toEqual([]);
    const frozen = analyzeMarked(water('fragment w { atoms rest; tier quantum { active 10e 7o } }'));
    expect(frozen.diagnostics.map((d) => d.data?.['kind'])).toEqual(['orbitals-exceed-available', 'electrons-exceed-available']);
  });

  it('ignores the active space of a mean-field tier instead of checking it', () => {
    expectDiagnostics(water('fragment w { atoms rest; tier mean-field { ⟦active 20e 2o⟧ } }'), ['setting-ignored']);
  });

  it('waits for a valid spin before checking the active space', () => {
    expectDiagnostics(water('fragment w { atoms rest; multiplicity ⟦2⟧; tier quantum { active 3e 2o } }'), ['multiplicity-parity']);
  });
});

describe('limits', () => {
  it('suggests the largest active space within the qubit limit when none is given', () => {
    // cc-pVDZ water: 24 functions (O 14, H 5 each; Dunning, J. Chem. Phys. 90, 1007 (1989), from memory),
    // 23 outside the frozen core, so 46 qubits under Jordan–Wigner.
    const { diagnostic } = expectDiagnostic(water('fragment w { atoms rest; ⟦tier⟧ quantum { } }\nlimits { qubits 12 }', '', 'basis cc-pVDZ'), 'qubit-limit-exceeded');
    expect(diagnostic.message).toBe(
      "Fragment 'w' needs 46 qubits (jordan-wigner; no active space given, so all 23 orbitals of its own space outside the frozen core are active), but the limit is 12. To fit: the largest active space that fits is `active 8e 6o` (12 qubits).",
    );
    expect(diagnostic.data).toEqual({ active: { electrons: 8, orbitals: 6 }, needed: 46, limit: 12 });
  });

  it('counts 2n qubits under Bravyi–Kitaev and 2n − 2 under parity', () => {
    const spec = (mapping: string, qubits: number) =>
      water(`fragment w { atoms rest; tier quantum { mapping ${mapping}; active 4e 4o } }\nlimits { qubits ${qubits} }`);
    expect(analyzeMarked(spec('bravyi-kitaev', 8)).diagnostics).toEqual([]);
    expectDiagnostic(spec('bravyi-kitaev', 7).replace('active 4e 4o', '⟦active 4e 4o⟧'), 'qubit-limit-exceeded');
    expect(analyzeMarked(spec('parity', 6)).diagnostics).toEqual([]);
    expectDiagnostic(spec('parity', 5).replace('active 4e 4o', '⟦active 4e 4o⟧'), 'qubit-limit-exceeded');
  });

  it('leaves classical tiers out of the qubit count', () => {
    expect(analyzeMarked(water('fragment w { atoms rest; tier correlated { method fci } }\nlimits { qubits 2 }')).diagnostics).toEqual([]);
  });

  it('gives the statevector memory a quantum fragment needs against the memory limit', () => {
    // 2^n amplitudes × 16 bytes (complex double; common practice, no source): 46 qubits = 1 PiB.
    const { diagnostic, analysis } = expectDiagnostic(
      water('fragment w { atoms rest; ⟦tier⟧ quantum { } }\nlimits { memory 64 GiB }', '', 'basis cc-pVDZ'),
      'memory-limit-exceeded',
    );
    expect(diagnostic.message).toBe(
      "Simulating fragment 'w' as a statevector of 46 qubits (jordan-wigner; no active space given, so all 23 orbitals of its own space outside the frozen core are active) needs 1.00 PiB (2^46 amplitudes × 16 bytes), but the memory limit is 64.0 GiB.",
    );
    expect(diagnostic.data).toEqual({ qubits: 46, limit: 64 * 1024 ** 3 });
    expect(diagnostic.related?.map((r) => analysis.text.slice(r.span.start, r.span.end))).toEqual(['64 GiB']);
  });
});

describe('scans', () => {
  const scan = (line: string, fragments = SPLIT_WATER) => `${water(fragments)}${line}\n`;
  const invalid: [string, string][] = [
    ['scan distance o h2 from ⟦-1⟧ to 1.5 step 0.1', 'Scanned distances must be positive.'],
    ['scan distance o h2 from 0.9 to ⟦0⟧ step 0.1', 'Scanned distances must be positive.'],
    ['scan distance o h2 from 0.9 to 1.5 step ⟦0⟧', 'A step of 0 never reaches the end of the scan.'],
    ['scan distance o h2 from 0.9 to 1.5 step ⟦-0.1⟧', 'The scan goes from 0.9 to 1.5, so the step must be positive; it is -0.1.'],
    ['scan distance o h2 from 0.9 to 1.5 step ⟦0.00001⟧', 'Going from 0.9 to 1.5 in steps of 0.00001 gives 60,001 points; at most 10,000 are accepted. Is the step mistyped?'],
    ['scan distance o h2 from 1 to 1e308 step ⟦1e-300⟧', 'Going from 1 to 1e+308 in steps of 1e-300 gives more points than can be counted ((1e+308 − 1) / 1e-300 overflows); at most 10,000 are accepted. Is the step mistyped?'],
    ['scan distance o h2 from 0.9 to 1.5 points ⟦10001⟧', '10,001 scan points asked for; at most 10,000 are accepted.'],
    ['scan distance h2 ⟦#3⟧ from 0.9 to 1.5 points 4', 'The scan needs two different atoms.'],
    ['⟦scan⟧ distance o h1 from 0.9 to 1.5 points 4', "Both scanned atoms are in fragment 'a'; the second atom's fragment moves as a whole, so the two atoms must be in different fragments, or name the atoms that move: `moving h1 …`."],
    ['scan distance o h2 from ⟦0.3⟧ to 1.5 step 0.3', 'The scan reaches 0.300 Å, closer than 0.5 Å.'],
  ];
  for (const [line, message] of invalid) {
    it(line.replace(/[⟦⟧]/g, ''), () => {
      const { diagnostic } = expectDiagnostic(scan(line), 'invalid-scan');
      expect(diagnostic.message).toBe(message);
    });
  }

  it('plans a stretch inside one fragment when the moving atoms are named (an O–H stretch of water; common practice)', () => {
    const analysis = analyzeMarked(water(SPLIT_WATER, '', 'basis sto-3g') + 'scan distance o h1 from 0.9 to 1.5 step 0.2 moving h1\n');
    expect(analysis.diagnostics.filter((d) => d.code === 'invalid-scan')).toEqual([]);
    expect(analysis.model.scan?.moving).toEqual([1]); // h1 is atom #2 (by construction)
  });

  it('asks the moving atoms to hold the last scanned atom and not the first (by construction)', () => {
    const base = water(SPLIT_WATER, '', 'basis sto-3g');
    expect(expectDiagnostic(base + 'scan distance o h1 from 0.9 to 1.5 step 0.2 ⟦moving h2⟧\n', 'invalid-scan').diagnostic.message).toContain('must include the last scanned atom');
    expect(expectDiagnostic(base + 'scan distance o h1 from 0.9 to 1.5 step 0.2 ⟦moving h1 o⟧\n', 'invalid-scan').diagnostic.message).toContain('must not include the first scanned atom');
  });

  it('converts a scan in bohr to ångström and checks the clash distance there', () => {
    // 0.8 bohr = 0.423 Å: too close; 1.0 bohr = 0.529 Å is not.
    const { diagnostic } = expectDiagnostic(
      water(SPLIT_WATER, '', 'basis sto-3g', WATER_IN_BOHR, 'structure in bohr') + 'scan distance o h2 from ⟦0.8⟧ to 2.0 step 0.2\n',
      'invalid-scan',
    );
    expect(diagnostic.message).toBe('The scan reaches 0.423 Å (0.8 bohr, the structure\'s unit), closer than 0.5 Å.');
    const fine = analyzeMarked(water(SPLIT_WATER, '', 'basis sto-3g', WATER_IN_BOHR, 'structure in bohr') + 'scan distance o h2 from 1.0 to 2.0 step 0.5\n');
    expect(fine.diagnostics.filter((d) => d.code !== 'bond-cut')).toEqual([]);
    expect(fine.model.scan?.values.map((d) => Number((d / BOHR).toFixed(9)))).toEqual([1, 1.5, 2]);
  });

  it('reports what a scan statement is missing', () => {
    const { diagnostic } = expectDiagnostic(scan('⟦scan⟧ distance o h2 from 0.9'), 'missing-value');
    expect(diagnostic.message).toBe('The scan needs to, step: `scan distance <atom> <atom> from <d> to <d> step <d>` (or `points <n>` instead of step).');
    const analysis = analyzeMarked(scan('⟦scan⟧ distance o h2 from 0.9 ⟦until⟧ ⟦1.5⟧ step 0.1'));
    const { ranges } = analysis.marks;
    expect(analysis.diagnostics.filter((d) => d.code !== 'bond-cut').map((d) => [d.code, d.span])).toEqual([
      ['missing-value', ranges[0]],
      ['invalid-value', ranges[1]],
      ['invalid-value', ranges[2]],
    ]);
    expect(analysis.model.scan).toBeUndefined();
  });
});

describe('included geometry files', () => {
  it('refuses paths outside the spec folder: parent, absolute, and through a symbolic link', () => {
    const outside = expectDiagnostic(fromFile('⟦"../water.xyz"⟧'), 'include-outside-folder', withFiles);
    expect(outside.diagnostic.message).toBe('Cannot read "../water.xyz": \'../water.xyz\' points outside the spec\'s folder (/work/specs).');
    const absolute = expectDiagnostic(fromFile('⟦"/work/water.xyz"⟧'), 'include-outside-folder', withFiles);
    expect(absolute.diagnostic.message).toContain('give the path relative to the spec\'s folder, not an absolute path');
    const linked = memoryFiles({ '/work/specs/link.xyz': XYZ_WATER }, { '/work/specs/link.xyz': '/work/water.xyz' });
    const link = expectDiagnostic(fromFile('⟦"link.xyz"⟧'), 'include-outside-folder', { path: SPEC_PATH, files: linked });
    expect(link.diagnostic.message).toContain("'link.xyz' leads outside the spec's folder through a symbolic link");
    // No atoms were read, so the fragment is not reported empty as well.
    for (const { analysis } of [outside, absolute, link]) expect(analysis.diagnostics.map((d) => d.code)).toEqual(['include-outside-folder']);
  });

  it('cannot resolve a relative path for a spec that has no path yet', () => {
    const { diagnostic } = expectDiagnostic(fromFile('⟦"data/water.xyz"⟧'), 'include-outside-folder', { files: FILES });
    expect(diagnostic.message).toContain('this spec has not been saved to a folder yet');
  });

  it('reports every malformed line and still reads the good ones', () => {
    const files = memoryFiles({ '/work/specs/mixed.xyz': '4\nmixed\nO 0 0 0\nH 0 0.756950\nQq 0 0 0\nH 0 -0.756950 0.585882\n' });
    const analysis = analyzeMarked(fromFile('"mixed.xyz"'), { path: SPEC_PATH, files });
    const invalid = analysis.diagnostics.filter((d) => d.code === 'include-invalid');
    expect(invalid.map((d) => [d.message, d.related?.[0]?.file, d.related?.[0]?.line])).toEqual([
      ['"mixed.xyz" line 4: Expected \'element x y z\'; found \'H 0 0.756950\'.', '/work/specs/mixed.xyz', 3],
      ['"mixed.xyz" line 5: \'Qq\' is not an element symbol or atomic number.', '/work/specs/mixed.xyz', 4],
    ]);
    expect(analysis.model.atoms.map((a) => [a.element.symbol, a.source?.line])).toEqual([
      ['O', 2],
      ['H', 5],
    ]);
  });

  it('reads the first frame of a trajectory and says so', () => {
    const files = memoryFiles({ '/work/specs/traj.xyz': '2\nframe 1\nH 0 0 0\nH 0 0 0.74\n2\nframe 2\nH 0 0 0\nH 0 0 0.80\n' });
    const { diagnostic, analysis } = expectDiagnostic(fromFile('⟦"traj.xyz"⟧'), 'include-invalid', { path: SPEC_PATH, files });
    expect(diagnostic.severity).toBe('information');
    expect(diagnostic.message).toBe('"traj.xyz" holds 2 frames; the first one is the structure.');
    expect(Array.from(analysis.model.coordinates)).toEqual([0, 0, 0, 0, 0, 0.74]);
  });

  it('reads files from disk next to a saved spec, and refuses a link out of its folder', async () => {
    const { mkdtempSync, mkdirSync, writeFileSync, symlinkSync, rmSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const { join } = await import('node:path');
    const root = mkdtempSync(join(tmpdir(), 'tessera-include-'));
    try {
      mkdirSync(join(root, 'specs', 'data'), { recursive: true });
      writeFileSync(join(root, 'specs', 'data', 'water.xyz'), XYZ_WATER);
      writeFileSync(join(root, 'outside.xyz'), XYZ_WATER);
      symlinkSync(join(root, 'outside.xyz'), join(root, 'specs', 'escape.xyz'));
      const path = join(root, 'specs', 'water.tess');
      const good = analyzeMarked(fromFile('"data/water.xyz"'), { path });
      expect(good.diagnostics).toEqual([]);
      expect(good.model.atoms).toHaveLength(3);
      expectDiagnostic(fromFile('⟦"escape.xyz"⟧'), 'include-outside-folder', { path });
      expectDiagnostic(fromFile('⟦"data"⟧'), 'include-unreadable', { path });
    } finally {
      rmSync(root, { recursive: true, force: true });
    }
  });
});

describe('tiers', () => {
  it('names the tier a method belongs to and the methods of this tier', () => {
    const cases: [string, string, string][] = [
      ['quantum', 'ccsd', "'ccsd' is a correlated-tier method, but this tier is quantum. Methods of the quantum tier: vqe, qpe."],
      ['mean-field', 'fci', "'fci' is a correlated-tier method, but this tier is mean-field. Methods of the mean-field tier: rhf, rohf, uhf, pbe, pbe0, b3lyp, tpss."],
      ['correlated', 'rhf', "'rhf' is a mean-field-tier method, but this tier is correlated. Methods of the correlated tier: mp2, ccsd, ccsd(t), casci, casscf, fci."],
    ];
    for (const [level, method, message] of cases) {
      const { diagnostic } = expectDiagnostic(water(`fragment w { atoms rest; tier ${level} { method ⟦${method}⟧ } }`), 'method-tier-mismatch');
      expect(diagnostic.message).toBe(message);
    }
  });

  it('warns about every quantum-only setting in a classical tier', () => {
    expectDiagnostics(
      water('fragment w { atoms rest; tier correlated { method ccsd; ansatz ⟦uccsd⟧; mapping ⟦parity⟧; taper ⟦on⟧; layers ⟦2⟧ } }'),
      ['setting-ignored', 'setting-ignored', 'setting-ignored', 'setting-ignored'],
    );
  });

  it('warns about an ansatz with phase estimation and layers with uccsd, not with layered ansatzes', () => {
    const qpe = expectDiagnostics(water('fragment w { atoms rest; tier quantum { method qpe; ansatz ⟦uccsd⟧ } }'), ['setting-ignored']);
    expect(qpe.diagnostics[0]!.message).toBe('Phase estimation prepares no variational ansatz; the ansatz has no effect with method qpe.');
    const layers = expectDiagnostics(water('fragment w { atoms rest; tier quantum { method vqe; layers ⟦3⟧ } }'), ['setting-ignored']);
    expect(layers.diagnostics[0]!.message).toBe("'layers' sets k of k-upccgsd or the depth of a hardware-efficient ansatz; it has no effect with uccsd.");
    for (const ansatz of ['k-upccgsd', 'hardware-efficient']) {
      expect(analyzeMarked(water(`fragment w { atoms rest; tier quantum { ansatz ${ansatz}; layers 3 } }`)).diagnostics).toEqual([]);
    }
  });

  it('asks for a tier only in fragments that have a block', () => {
    const { diagnostic } = expectDiagnostic(water('fragment ⟦w⟧ { atoms rest }'), 'missing-tier');
    expect(diagnostic.message).toBe("Fragment 'w' has no tier, so no cost is estimated for it: add for example `tier mean-field { method rhf }`.");
    expectDiagnostics(water(`${ONE_FRAGMENT}\nfragment ⟦v⟧`), ['missing-block']);
  });
});

describe('duplicates', () => {
  it('points a duplicate label at its first use', () => {
    const { diagnostic, analysis } = expectDiagnostic(water(ONE_FRAGMENT, '', 'basis sto-3g', WATER.replace(/h2/, '⟦h1⟧')), 'duplicate-label');
    expect(diagnostic.message).toBe("Label 'h1' is already used by atom #2; labels name one atom each.");
    const first = diagnostic.related![0]!;
    expect(analysis.text.slice(first.span.start, first.span.end)).toBe('h1');
    expect(first.span.start).toBeLessThan(diagnostic.span.start);
  });

  it('points a duplicate fragment name at the first fragment', () => {
    const { diagnostic, analysis } = expectDiagnostic(water(TWO_FRAGMENTS.replace('fragment b', 'fragment ⟦a⟧'), '', 'basis sto-3g', TWO_WATERS), 'duplicate-fragment');
    expect(diagnostic.related?.map((r) => [r.span.start, r.message])).toEqual([[analysis.text.indexOf('fragment a') + 'fragment '.length, "first 'a' here"]]);
  });

  it('reports a setting given twice in the same block, not in different blocks', () => {
    const repeated = [
      ['top level', water(ONE_FRAGMENT, 'embedding dmet\n⟦embedding⟧ none')],
      ['fragment', water('fragment w { atoms rest; charge 0; ⟦charge⟧ 0; tier mean-field { } }')],
      ['tier', water('fragment w { atoms rest; tier quantum { taper on; ⟦taper⟧ off } }')],
      ['functions', water(ONE_FRAGMENT, 'functions cartesian\n⟦functions⟧ spherical')],
      ['main basis', water(ONE_FRAGMENT, '', 'basis sto-3g\n⟦basis⟧ 3-21G')],
      ['structure', water(`${ONE_FRAGMENT}\n⟦structure⟧ { He 9 9 9 }`)],
      ['limits', water(`${ONE_FRAGMENT}\nlimits { qubits 8; ⟦qubits⟧ 10 }`)],
    ] as const;
    for (const [where, text] of repeated) {
      const { diagnostic } = expectDiagnostic(text, 'duplicate-statement');
      expect(diagnostic.related, where).toHaveLength(1);
    }
    // Two fragments each with their own charge and tier settings are fine.
    const separate = water(
      `fragment a { atoms o h1 h2; charge 0; tier quantum { taper on; active 4e 4o } }
fragment b { atoms p g1 g2; charge 0; tier quantum { taper on; active 4e 4o } }`,
      '',
      'basis sto-3g',
      TWO_WATERS,
    );
    expect(analyzeMarked(separate).diagnostics).toEqual([]);
  });

  it('keeps the first of a duplicated setting', () => {
    const analysis = analyzeMarked(water(ONE_FRAGMENT, 'embedding dmet\nembedding none'));
    expect(analysis.model.embedding).toBe('dmet');
  });
});

describe('vocabulary', () => {
  it('suggests the closest keyword of the block, and offers it as a replacement', () => {
    const cases: [string, string, string][] = [
      [water(ONE_FRAGMENT, '⟦fragmnt⟧ x { atoms o }'), 'fragment', "Unknown keyword 'fragmnt' at the top level. Did you mean 'fragment'?"],
      [water('fragment w { ⟦atom⟧ rest; tier mean-field { } }'), 'atoms', "Unknown keyword 'atom' in a fragment block. Did you mean 'atoms'?"],
      [water('fragment w { atoms rest; ⟦multiplicty⟧ 1; tier mean-field { } }'), 'multiplicity', "Unknown keyword 'multiplicty' in a fragment block. Did you mean 'multiplicity'?"],
      [water('fragment w { atoms rest; tier quantum { ⟦mehtod⟧ vqe } }'), 'method', "Unknown keyword 'mehtod' in a tier block. Did you mean 'method'?"],
      [water(`${ONE_FRAGMENT}\nlimits { ⟦qbits⟧ 8 }`), 'qubits', "Unknown keyword 'qbits' in a limits block. Did you mean 'qubits'?"],
    ];
    for (const [text, replacement, message] of cases) {
      const { diagnostic } = expectDiagnostic(text, 'unknown-keyword');
      expect(diagnostic.message).toBe(message);
      expect(diagnostic.data).toEqual({ replacement });
    }
  });

  it('asks for lower case instead of guessing', () => {
    const { diagnostic } = expectDiagnostic(water(ONE_FRAGMENT, '⟦Charge⟧ 0'), 'unknown-keyword');
    expect(diagnostic.message).toBe("Keywords are lower case: write 'charge', not 'Charge'.");
  });

  it('lists the keywords of the block when nothing is close', () => {
    const { diagnostic } = expectDiagnostic(water(`${ONE_FRAGMENT}\nlimits { ⟦wallclock⟧ 8 }`), 'unknown-keyword');
    expect(diagnostic.message).toBe("Unknown keyword 'wallclock' in a limits block. Expected one of: qubits, memory, shot-rate, rate.");
    expect(diagnostic.data).toBeUndefined();
  });

  it('says where a misplaced keyword belongs', () => {
    const cases: [string, string][] = [
      [water(ONE_FRAGMENT, '⟦atoms⟧ rest'), "'atoms' does not belong at the top level; it is used in a fragment block."],
      [water('fragment w { atoms rest; tier quantum { ⟦atoms⟧ o } }'), "'atoms' does not belong in a tier block; it is used in a fragment block."],
      [water(`${ONE_FRAGMENT}\n⟦qubits⟧ 8`), "'qubits' does not belong at the top level; it is used in a limits block."],
      [water('fragment w { atoms rest; ⟦taper⟧ on; tier quantum { } }'), "'taper' does not belong in a fragment block; it is used in a tier block."],
      [water('fragment w { atoms rest; tier quantum { ⟦charge⟧ 0 } }'), "'charge' does not belong in a tier block; it is used at the top level or in a fragment block."],
    ];
    for (const [text, message] of cases) {
      expect(expectDiagnostic(text, 'misplaced-keyword').diagnostic.message).toBe(message);
    }
  });

  it('suggests values of every closed list', () => {
    const cases: [string, DiagnosticCode, string][] = [
      [water(ONE_FRAGMENT, '', 'basis sto-3g', WATER, 'structure in ⟦bhor⟧'), 'unknown-value', "Unknown length unit 'bhor'. Did you mean 'bohr'? Expected one of: angstrom, bohr."],
      [water('fragment w { atoms rest; tier ⟦quantom⟧ { } }'), 'unknown-value', "Unknown tier 'quantom'. Did you mean 'quantum'? Expected one of: quantum, correlated, mean-field."],
      [water('fragment w { atoms rest; tier quantum { taper ⟦yes⟧ } }'), 'unknown-value', 'Unknown \'taper\' setting \'yes\'. Expected one of: on, off.'],
      [water(ONE_FRAGMENT, 'functions ⟦cartesain⟧'), 'unknown-value', "Unknown function type 'cartesain'. Did you mean 'cartesian'? Expected one of: spherical, cartesian."],
      [water('fragment w { atoms rest; tier quantum { ansatz ⟦hardware-eficient⟧ } }'), 'unknown-ansatz', "Unknown ansatz 'hardware-eficient'. Did you mean 'hardware-efficient'? Expected one of: uccsd, k-upccgsd, hardware-efficient."],
      [water('fragment w { atoms rest; tier quantum { mapping ⟦jw⟧ } }'), 'unknown-mapping', "Unknown mapping 'jw'. Expected one of: jordan-wigner, bravyi-kitaev, parity."],
      [water('fragment w { atoms rest; tier quantum { method ⟦VQE2⟧ } }'), 'unknown-method', "Unknown method 'VQE2'. Did you mean 'vqe'? Expected one of: rhf, rohf, uhf, pbe, pbe0, b3lyp, tpss, mp2, ccsd, ccsd(t), casci, casscf, fci, vqe, qpe."],
    ];
    for (const [text, code, message] of cases) {
      expect(expectDiagnostic(text, code).diagnostic.message).toBe(message);
    }
  });

  it('reads tier values in any case', () => {
    const analysis = analyzeMarked(water('fragment w { atoms rest; tier Quantum { method VQE; mapping Parity } }'));
    expect(analysis.diagnostics).toEqual([]);
    expect(analysis.model.fragments[0]!.tier).toMatchObject({ level: 'quantum', method: 'vqe', mapping: 'parity' });
  });

  it('suggests labels for unknown atoms, and `all X` for element symbols', () => {
    const index = expectDiagnostic(water('fragment w { atoms o h1 h2 ⟦#4⟧; tier mean-field { } }'), 'unknown-atom');
    expect(index.diagnostic.message).toBe('There is no atom #4: the structure has 3 atoms (#1 to #3).');
    const element = expectDiagnostic(water('fragment w { atoms ⟦Cl⟧ rest; tier mean-field { } }'), 'unknown-atom');
    expect(element.diagnostic.message).toBe("No atom is labelled 'Cl'. To select every Cl atom, write 'all Cl'.");
  });
});

describe('values', () => {
  it('reports missing values on the statement', () => {
    const cases: [string, string][] = [
      [water(ONE_FRAGMENT, '', 'basis sto-3g', WATER, 'structure ⟦in⟧'), 'Name the length unit after `in`: `structure in bohr { … }` (ångström is the default).'],
      [water(ONE_FRAGMENT, '⟦multiplicity⟧'), "'multiplicity' needs a value: write `multiplicity <2S+1>`."],
      [water(ONE_FRAGMENT, '', '⟦basis⟧'), 'Name the basis set: `basis cc-pVDZ`, or `basis def2-TZVP on all Zn` for some atoms.'],
      [water(ONE_FRAGMENT, '', 'basis sto-3g\nbasis 3-21G ⟦on⟧'), 'Say which atoms take 3-21G: `on all Zn`, `on zn n1..n4`, `on #3` or `on fragment guest`.'],
      [water('fragment w { ⟦atoms⟧; tier mean-field { } }'), 'List the atoms: labels, #indices, ranges like n1..n4, `all H`, `closer-than 3.0 to zn` or `rest`.'],
      [water('fragment w { atoms rest; tier quantum { ⟦active 4e⟧ } }'), 'The active space needs the orbital count: active <n>e <m>o, for example `active 6e 6o`, or per irrep `active 6e A1=3 B1=1 B2=2` (with the reference occupation: `occupied A1=2 B2=1 open B1=1`).'],
      [water('fragment w { atoms rest; tier quantum { ⟦method⟧ } }'), "'method' needs a value: write `method <name>`."],
      [water(`${ONE_FRAGMENT}\nlimits { ⟦memory⟧ }`), 'Give the memory with a unit: `memory 16 GiB` (units: B, KiB, MiB, GiB, TiB, PiB, kB, KB, MB, GB, TB, PB).'],
      [`basis sto-3g\nstructure ⟦from⟧\n${ONE_FRAGMENT}\n`, 'Name the XYZ file to read: `structure from "file.xyz"`.'],
    ];
    for (const [text, message] of cases) {
      expect(expectDiagnostic(text, 'missing-value').diagnostic.message).toBe(message);
    }
  });

  it('reports extra values from the first extra one to the last', () => {
    const cases: string[] = [
      water(ONE_FRAGMENT, 'charge 0 ⟦1 2⟧'),
      water('fragment w ⟦x y⟧ { atoms rest; tier mean-field { } }'),
      water('fragment w { atoms rest; tier quantum { mapping parity ⟦bravyi-kitaev⟧ } }'),
      water(ONE_FRAGMENT, '', 'basis sto-3g ⟦3-21G⟧'),
      water(ONE_FRAGMENT, '', 'basis sto-3g', WATER, 'structure in bohr ⟦bohr⟧'),
      fromFile('"data/water.xyz" ⟦"more.xyz"⟧'),
      fromFile('"data/water.xyz" ⟦in bohr⟧'),
    ];
    for (const text of cases) expectDiagnostic(text, 'extra-value', withFiles);
  });

  it('reports values of the wrong kind on the value', () => {
    const cases: [string, string][] = [
      [water(ONE_FRAGMENT, 'multiplicity ⟦triplet⟧'), "The multiplicity must be a number, not 'triplet'."],
      [water('fragment w { atoms rest; tier quantum { layers ⟦0⟧ } }'), "The number of layers must be a whole number of at least 1; '0' is not."],
      [water('fragment w { atoms rest; tier quantum { active ⟦4⟧ 4o; active 4e 4o } }'), "Mark what the number counts: '4e' for electrons or '4o' for orbitals (active <n>e <m>o, for example `active 6e 6o`, or per irrep `active 6e A1=3 B1=1 B2=2` (with the reference occupation: `occupied A1=2 B2=1 open B1=1`))."],
      [water(`${ONE_FRAGMENT}\nlimits { qubits ⟦2.5⟧ }`), "The qubit limit must be a whole number of at least 1; '2.5' is not."],
      [water(`${ONE_FRAGMENT}\nlimits { memory 16 ⟦XB⟧ }`), "Unknown memory unit 'XB'; use one of B, KiB, MiB, GiB, TiB, PiB, kB, KB, MB, GB, TB, PB."],
      [water(`${ONE_FRAGMENT}\nlimits { memory ⟦16⟧ }`), 'Add a unit to the memory size: 16 GiB? (units: B, KiB, MiB, GiB, TiB, PiB, kB, KB, MB, GB, TB, PB)'],
      [water('fragment ⟦"w"⟧ { atoms rest; tier mean-field { } }'), 'A fragment name is a word, not the string "w".'],
      [water(ONE_FRAGMENT, '', 'basis sto-3g', `${WATER}\n  He he 5 ⟦x⟧ 5`), "A coordinate must be a number, not 'x'."],
      [`basis sto-3g\nstructure ⟦inline⟧ { H 0 0 0 }\n${ONE_FRAGMENT}\n`, "Write `structure { ... }` with the atoms inside, `structure in bohr { ... }`, or `structure from \"file.xyz\"`; found 'inline'."],
      [water('fragment w { ⟦3⟧ atoms rest; tier mean-field { } }'), "A statement in a fragment block starts with a keyword, not the number '3'."],
    ];
    for (const [text, message] of cases) {
      expect(expectDiagnostic(text, 'invalid-value').diagnostic.message).toBe(message);
    }
  });

  it('keeps charge and multiplicity whole', () => {
    expect(expectDiagnostic(water(ONE_FRAGMENT, 'charge ⟦-0.5⟧'), 'charge-not-integer').diagnostic.message).toBe('A charge counts whole electrons; -0.5 is not a whole number.');
    expect(expectDiagnostic(water('fragment w { atoms rest; multiplicity ⟦1.5⟧; tier mean-field { } }'), 'multiplicity-invalid').diagnostic.message).toBe(
      'The multiplicity 2S+1 is a whole number of at least 1 (1 singlet, 2 doublet, 3 triplet, ...); 1.5 is not.',
    );
  });

  it('reports malformed selectors on the selector', () => {
    const cases: [string, string][] = [
      ['⟦closer-than 3 zn o⟧', "Write `closer-than <distance> to <atom>`, for example `closer-than 3.0 to zn` (strictly closer; the distance in the structure's unit)."],
      ['⟦all⟧', '`all` is followed by an element symbol: `all H`.'],
      ['⟦all Xq⟧', '`all` is followed by an element symbol: `all H`.'],
      ['⟦..⟧ o', "A range needs an atom on each side of '..': `n1..n4` or `#3..#9`."],
      // A range without its end gets the general message, on the dots.
      ['o ⟦..⟧', 'An atom is named by its label or by #index (1-based).'],
      ['⟦"o"⟧', 'An atom is named by its label or by #index (1-based), not the string "o".'],
    ];
    for (const [selector, message] of cases) {
      const text = water(`fragment w { atoms rest ${selector}; tier mean-field { } }`);
      expect(expectDiagnostic(text, 'invalid-selector').diagnostic.message, selector).toBe(message);
    }
  });
});

describe('blocks', () => {
  it('reports a block after a statement that takes none, on its brace', () => {
    const cases: string[] = [
      water(ONE_FRAGMENT, 'charge 0 ⟦{⟧ }'),
      water('fragment w { atoms rest ⟦{⟧ o }; tier mean-field { } }'),
      water('fragment w { atoms rest; tier quantum { method vqe ⟦{⟧ } } }'),
      water(ONE_FRAGMENT, '', 'basis sto-3g', `${WATER}\n  He 5 5 5 ⟦{⟧ }`),
      `basis sto-3g\nstructure from "data/water.xyz" ⟦{⟧ O 0 0 0 }\n${ONE_FRAGMENT}\n`,
    ];
    for (const text of cases) expectDiagnostic(text, 'unexpected-block', withFiles);
  });

  it('asks for the block of structure, fragment and limits', () => {
    expect(expectDiagnostic(`basis sto-3g\n⟦structure⟧\n${ONE_FRAGMENT}\n`, 'missing-block').diagnostic.message).toBe(
      'Give the atoms in a block, `structure { O 0 0 0 ... }`, or from a file, `structure from "file.xyz"`.',
    );
    expect(expectDiagnostic(water(`${ONE_FRAGMENT}\nfragment ⟦extra⟧`), 'missing-block').diagnostic.message).toBe(
      "Fragment 'extra' needs a block with its atoms: `fragment extra { atoms ... }`.",
    );
    expect(expectDiagnostic(water(`${ONE_FRAGMENT}\n⟦fragment⟧`), 'missing-block').diagnostic.message).toBe(
      'A fragment needs a block with its atoms: `fragment name { atoms ... }`.',
    );
  });

  it('reports an empty geometry', () => {
    expectDiagnostics(`basis sto-3g\n⟦structure⟧ { }\n`, ['missing-geometry']);
  });
});
