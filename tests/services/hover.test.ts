/**
 * Hover: fragment cards with their resource figures, atom cards, basis cards, keyword and value
 * words, and nothing on blanks and comments. Each case is spec text with a `$0` cursor and, where
 * the hover's range matters, the hovered token marked `⟦ ⟧`.
 *
 * Geometries are invented test data unless a comment names a source. Atomic numbers and element
 * names are those of the IUPAC periodic table.
 */
import { describe, expect, it } from 'vitest';
import { doHover } from '../../server/src/services';
import { memoryFiles } from '../language/fixture';
import { markdownOf, marked } from './service';

/**
 * Water at the experimental equilibrium structure, r(OH) = 0.9572 Å, HOH = 104.52° (Hoy & Bunker,
 * J. Mol. Spectrosc. 74, 1 (1979)), placed as in tests/fixtures/water.ts and samples/molecules.
 */
const WATER_ATOMS = `  O  o    0.000000   0.000000   0.000000
  H  h1   0.000000   0.756950   0.585882
  H  h2   0.000000  -0.756950   0.585882`;

function waterSpec(fragment: string, header = 'basis cc-pVDZ'): string {
  return `${header}\nstructure {\n${WATER_ATOMS}\n}\n${fragment}\n`;
}

function hoverAt(text: string, options = {}): { markdown: string | null; range: unknown; expectedRange: unknown } {
  const m = marked(text, options);
  const hover = doHover(m.analysis, m.cursor);
  return { markdown: hover ? markdownOf(hover.contents) : null, range: hover?.range, expectedRange: m.ranges[0] };
}

/** The table row of a card whose first cell is `name`. */
function row(markdown: string, name: string): string {
  const found = markdown.split('\n').find((line) => line.startsWith(`| ${name} |`));
  if (!found) throw new Error(`no '${name}' row in:\n${markdown}`);
  return found;
}

describe('fragment card', () => {
  it('states the figures of water in cc-pVDZ with a 4e 4o active space', () => {
    const { markdown, range, expectedRange } = hoverAt(
      waterSpec('fragment ⟦wa$0ter⟧ {\n  atoms rest\n  tier quantum { method vqe; mapping parity; active 4e 4o }\n}', 'basis cc-pVDZ\nlimits { qubits 10 }'),
    );
    expect(range).toEqual(expectedRange);
    const card = markdown!;
    expect(card.split('\n')[0]).toBe('**fragment water** · quantum · vqe / uccsd / parity');
    expect(row(card, 'atoms')).toBe('| atoms | 3 · H2O |');
    // Z(O) = 8, Z(H) = 1: 10 electrons; a singlet puts 5 in alpha and 5 in beta.
    expect(row(card, 'electrons')).toBe('| electrons | 10 (α 5 / β 5) · charge 0, multiplicity 1 |');
    // cc-pVDZ: O [3s2p1d] = 3 + 3·2 + 5 = 14 spherical (3 + 6 + 6 = 15 cartesian), H [2s1p] = 5
    // (Dunning, J. Chem. Phys. 90, 1007 (1989); the counts of tests/fixtures/basis-counts.nwchem.json,
    // from nwchem-data 7.0.2): 14 + 2 × 5 = 24 spherical, 15 + 2 × 5 = 25 cartesian.
    expect(row(card, 'basis functions')).toBe('| basis functions | 24 spherical · 25 cartesian |');
    // Frozen core: the He-like 1s of O, one orbital (common practice); 10 electrons fill 5
    // orbitals; 24 − 5 = 19 virtual.
    expect(row(card, 'orbitals')).toBe('| orbitals | 24 (spherical): 1 frozen-core, 5 occupied, 19 virtual |');
    expect(row(card, 'active space')).toBe('| active space | 4e 4o (α 2 / β 2), as given |');
    // 2n qubits for n = 4 spatial orbitals under Jordan–Wigner and Bravyi–Kitaev; 2n − 2 under parity
    // with the two-qubit reduction (Bravyi, Gambetta, Mezzacapo, Temme, arXiv:1701.08213 (2017)).
    expect(row(card, 'qubits')).toBe('| qubits | Jordan–Wigner 8 · Bravyi–Kitaev 8 · parity 6 |');
    expect(row(card, 'qubits needed')).toBe('| qubits needed | **6** under parity (limit 10) |');
    expect(card).toContain('Planning estimates');
  });

  it('takes every orbital outside the frozen core when no active space is given', () => {
    const { markdown } = hoverAt(waterSpec('fragment w$0 {\n  atoms rest\n  tier quantum { method vqe }\n}'));
    // 10 − 2 core electrons = 8; 24 − 1 frozen-core orbital = 23; Jordan–Wigner 2 × 23 = 46.
    expect(row(markdown!, 'active space')).toBe('| active space | 8e 23o (α 4 / β 4), all orbitals outside the frozen core |');
    expect(row(markdown!, 'qubits needed')).toBe('| qubits needed | **46** under jordan-wigner |');
  });

  it('counts a charged open-shell fragment: OH radical and a bare proton', () => {
    const text = waterSpec(
      'fragment oh$0 {\n  atoms o h1\n  multiplicity 2\n  tier correlated { method ccsd }\n}\nfragment p {\n  atoms h2\n  charge +1\n  tier mean-field { method rhf }\n}',
      'basis sto-3g',
    );
    const card = hoverAt(text).markdown!;
    // O + H: 9 electrons; a doublet has alpha (9 + 1)/2 = 5 and beta 4.
    expect(row(card, 'electrons')).toBe('| electrons | 9 (α 5 / β 4) · charge 0, multiplicity 2 |');
    // STO-3G: O [2s1p] = 5, H [1s] = 1 (Hehre, Stewart, Pople, J. Chem. Phys. 51, 2657 (1969)).
    expect(row(card, 'basis functions')).toBe('| basis functions | 6 spherical · 6 cartesian |');
    expect(card.split('\n')[0]).toBe('**fragment oh** · correlated · ccsd');
    expect(card).not.toContain('qubits needed');
  });
});

describe('atom card', () => {
  for (const fastGeometry of [true, false]) {
    it(`shows element, Z, position in Å and bohr, fragment and neighbours (${fastGeometry ? 'fast' : 'general'} geometry reader)`, () => {
      const text = `basis sto-3g\nstructure {\n  O  o    0.000000   0.000000   0.000000\n  H  ⟦h$01⟧   0.000000   0.756950   0.585882\n  H  h2   0.000000  -0.756950   0.585882\n}\nfragment water { atoms rest; tier mean-field { method rhf } }\n`;
      const { markdown, range, expectedRange } = hoverAt(text, { fastGeometry });
      expect(range).toEqual(expectedRange);
      const card = markdown!;
      expect(card.split('\n')[0]).toBe('**Hydrogen** h1 (#2) · H, Z = 1');
      expect(row(card, 'position')).toBe('| position | 0.0000  0.7570  0.5859 Å |');
      // 1 bohr = 0.529177210903 Å (CODATA 2018, Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)):
      // 0.756950 / 0.529177210903 = 1.43043; 0.585882 / 0.529177210903 = 1.10716.
      expect(card).toContain('| | 0.0000  1.4304  1.1072 bohr |');
      expect(row(card, 'fragment')).toBe('| fragment | `water` |');
      // |h1 − o| = √(0.756950² + 0.585882²) = 0.95720 Å (Hoy & Bunker's r); |h1 − h2| = 2 × 0.756950 = 1.51390 Å.
      expect(row(card, 'nearest')).toBe('| nearest | o (#1) O 0.957 Å, h2 (#3) H 1.514 Å |');
    });
  }

  it('converts coordinates written in bohr, and shows them back in bohr', () => {
    const text = `basis sto-3g\nstructure in bohr {\n  O o 0 0 0\n  H h$01 0 1.430429 1.107157\n  H h2 0 -1.430429 1.107157\n}\nfragment water { atoms rest; tier mean-field { method rhf } }\n`;
    const card = hoverAt(text).markdown!;
    // 1 bohr = 0.529177210903 Å (CODATA 2018, Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)):
    // 1.430429 × 0.529177210903 = 0.75695 Å; 1.107157 × 0.529177210903 = 0.58588 Å.
    expect(row(card, 'position')).toBe('| position | 0.0000  0.7570  0.5859 Å |');
    expect(card).toContain('| | 0.0000  1.4304  1.1072 bohr |');
  });

  it('answers on a label used in `atoms`, with the range of that use', () => {
    const { markdown, range, expectedRange } = hoverAt(waterSpec('fragment w { atoms o ⟦h$02⟧; tier mean-field { method rhf } }\nfragment x { atoms h1; tier mean-field { method rhf } }', 'basis sto-3g'));
    expect(range).toEqual(expectedRange);
    expect(markdown!.split('\n')[0]).toBe('**Hydrogen** h2 (#3) · H, Z = 1');
    expect(row(markdown!, 'fragment')).toBe('| fragment | `w` |');
  });

  it('answers on #3, an unlabelled atom, naming it by index', () => {
    const text = `basis sto-3g\nstructure {\n  O o 0 0 0\n  H 0 0.756950 0.585882\n  H 0 -0.756950 0.585882\n}\nfragment w { atoms o #2 ⟦#$03⟧; tier mean-field { method rhf } }\n`;
    const { markdown, range, expectedRange } = hoverAt(text);
    expect(range).toEqual(expectedRange);
    expect(markdown!.split('\n')[0]).toBe('**Hydrogen** #3 · H, Z = 1');
    expect(row(markdown!, 'nearest')).toBe('| nearest | o (#1) O 0.957 Å, #2 H 1.514 Å |');
  });

  it('answers on the first character of #3 where it touches `..`', () => {
    const text = `basis sto-3g\nstructure {\n  O o 0 0 0\n  H h1 0 0.756950 0.585882\n  H 0 -0.756950 0.585882\n}\nfragment w { atoms o..⟦$0#3⟧; tier mean-field { method rhf } }\n`;
    const { markdown, range, expectedRange } = hoverAt(text);
    expect(range).toEqual(expectedRange);
    expect(markdown!.split('\n')[0]).toBe('**Hydrogen** #3 · H, Z = 1');
  });

  it('answers on the atoms of a scan', () => {
    const text = `basis sto-3g\nstructure {\n  O o 0 0 0\n  H h1 0 0.756950 0.585882\n  H h2 0 -0.756950 0.585882\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\nscan distance o ⟦h$02⟧ from 1 to 2 step 0.5\n`;
    const { markdown, range, expectedRange } = hoverAt(text);
    expect(range).toEqual(expectedRange);
    expect(markdown!.split('\n')[0]).toBe('**Hydrogen** h2 (#3) · H, Z = 1');
  });

  it('lists every fragment that claims a shared atom, and says none for an unclaimed one', () => {
    const text = waterSpec('fragment a { atoms o h1; tier mean-field { method rhf } }\nfragment b { atoms o; tier mean-field { method rhf } }', 'basis sto-3g');
    const shared = hoverAt(text.replace('O  o ', 'O  o$0 ')).markdown!;
    expect(row(shared, 'fragment')).toBe('| fragment | `a`, `b` |');
    const unclaimed = hoverAt(text.replace('H  h2', 'H  h2$0')).markdown!;
    expect(row(unclaimed, 'fragment')).toBe('| fragment | none |');
  });

  it('says when no atom is within the 4 Å neighbour radius', () => {
    const text = `basis sto-3g\nstructure {\n  He a$0 0 0 0\n  He b 0 0 5\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`;
    const card = hoverAt(text).markdown!;
    expect(card.split('\n')[0]).toBe('**Helium** a (#1) · He, Z = 2');
    expect(row(card, 'nearest')).toBe('| nearest | none within 4 Å |');
  });

  it('names the file and line of an atom read from an XYZ file', () => {
    const files = memoryFiles({ '/work/specs/data/water.xyz': '3\nwater, angstrom\nO 0 0 0\nH 0 0.756950 0.585882\nH 0 -0.756950 0.585882\n' });
    const text = 'basis sto-3g\nstructure from "data/water.xyz"\nfragment w { atoms #1 ⟦#$03⟧; tier mean-field { method rhf } }\n';
    const { markdown } = hoverAt(text, { path: '/work/specs/site.tess', files });
    // The third atom is on the fifth line of the file: count, comment, O, H, H.
    expect(row(markdown!, 'read from')).toBe('| read from | line 5 of `water.xyz` |');
    expect(row(markdown!, 'position')).toBe('| position | 0.0000  -0.7570  0.5859 Å |');
  });
});

describe('basis card', () => {
  it('gives the coverage, the functions of each element present and the reference publication', () => {
    const { markdown, range, expectedRange } = hoverAt(waterSpec('fragment w { atoms rest; tier mean-field { method rhf } }', 'basis ⟦cc-p$0VDZ⟧'));
    expect(range).toEqual(expectedRange);
    const card = markdown!;
    expect(card.split('\n')[0]).toBe('**cc-pVDZ** · Dunning correlation-consistent cc-pVXZ');
    // cc-pVDZ is defined for H–Ar and Ca–Kr, not K, in nwchem-data and psi4-data alike
    // (tests/fixtures/basis-counts.nwchem.json): 18 + 17 = 35 elements.
    expect(card).toContain('Defines 35 elements: H–Ar, Ca–Kr. Usual function type: spherical.');
    expect(row(card, 'O')).toBe('| O | 14 | 15 |  |');
    expect(row(card, 'H')).toBe('| H | 5 | 5 |  |');
    expect(card).toContain('- T. H. Dunning Jr., J. Chem. Phys. 90, 1007 (1989)');
  });

  it('marks an element the basis does not define', () => {
    const text = `basis 6-31$0G\nstructure {\n  Rb rb 0 0 0\n  Cl cl 0 0 2.79\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`;
    const card = hoverAt(text).markdown!;
    // 6-31G stops at Kr in nwchem-data (tests/fixtures/basis-counts.nwchem.json): no Rb (Z = 37).
    expect(row(card, 'Rb')).toBe('| Rb | **not defined** | | |');
    // Cl 6-31G [4s3p] = 4 + 9 = 13 (same fixture).
    expect(row(card, 'Cl')).toBe('| Cl | 13 | 13 |  |');
  });

  it('states the core electrons an effective core potential replaces', () => {
    const text = `basis def2-S$0VP\nstructure {\n  I a 0 0 0\n  I b 0 0 2.67\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`;
    // def2 bases put the 28 core electrons of Rb–Xe in an effective core potential (Weigend &
    // Ahlrichs, Phys. Chem. Chem. Phys. 7, 3297 (2005); from memory); I [4s4p2d] = 4 + 12 + 10 = 26
    // spherical, 28 cartesian (tests/fixtures/basis-counts.nwchem.json).
    expect(row(hoverAt(text).markdown!, 'I')).toBe('| I | 26 | 28 | 28 e⁻ in ECP |');
  });

  it('answers on the basis of an override line, and says which atoms the line gives it to', () => {
    const text = `basis def2-svp\nbasis ⟦def2-$0tzvp⟧ on all Zn\nstructure {\n  Zn zn 0 0 0\n  S s 0 0 2.3\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`;
    const { markdown, range, expectedRange } = hoverAt(text);
    expect(range).toEqual(expectedRange);
    expect(markdown!.split('\n')[0]).toBe('**def2-TZVP** · Karlsruhe def2 split-, triple- and quadruple-zeta valence');
    // def2-TZVP: Zn 48 spherical / 55 cartesian, S 37 / 42 (tests/fixtures/basis-counts.nwchem.json).
    expect(row(markdown!, 'Zn')).toBe('| Zn | 48 | 55 |  |');
    expect(row(markdown!, 'S')).toBe('| S | 37 | 42 |  |');
    expect(markdown).toContain('Override: def2-TZVP for 1 atom: zn.');
    expect(markdown).toContain('Each atom takes the basis of the most specific line that selects it');
  });

  it('tells on the main basis line how many atoms keep it and which lines take the others', () => {
    const text = `basis ⟦def2-$0svp⟧\nbasis def2-tzvp on all Zn\nbasis sto-3g on s\nbasis 3-21G on all S\nstructure {\n  Zn zn 0 0 0\n  S s 0 0 2.3\n  S t 0 0 4.6\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`;
    const { markdown } = hoverAt(text);
    expect(markdown).toContain('Main basis: 0 of 3 atoms take it.');
    // s is named by a line of its own, which beats the later element line for S.
    expect(markdown).toContain('- def2-TZVP on all Zn: 1 atom');
    expect(markdown).toContain('- STO-3G on s: 1 atom');
    expect(markdown).toContain('- 3-21G on all S: 1 atom');
  });

  it('lists which basis each element takes and the spec’s own basis, on the main line and on an override', () => {
    // Zn takes def2-TZVP through its element line; one S is named by a line of its own, the other
    // takes the element line for S; H keeps the main line.
    const text = `basis ⟦def2-$0svp⟧\nbasis def2-tzvp on all Zn\nbasis sto-3g on s\nbasis 3-21G on all S\nstructure {\n  Zn zn 0 0 0\n  S s 0 0 2.3\n  S t 0 0 4.6\n  H h 0 0 5.94\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`;
    for (const cursor of [text, text.replace('⟦def2-$0svp⟧', 'def2-svp').replace('basis def2-tzvp on', 'basis def2-$0tzvp on')]) {
      const { markdown } = hoverAt(cursor);
      expect(markdown).toContain('Spec’s basis: def2-SVP. Per element:');
      const table = markdown!.slice(markdown!.indexOf('| element | atoms | basis |'));
      expect(row(table, 'Zn')).toBe('| Zn | 1 | def2-TZVP (`on all Zn`) |');
      expect(row(table, 'S')).toBe('| S | 2 | STO-3G (`on s`) × 1; 3-21G (`on all S`) × 1 |');
      expect(row(table, 'H')).toBe('| H | 1 | def2-SVP (spec’s basis) |');
    }
  });

  it('lists the atoms an override selects that another line decides', () => {
    const text = `basis def2-svp\nbasis sto-3g on s\nbasis 3-21G ⟦o$0n⟧ all S\nstructure {\n  S s 0 0 0\n  S t 0 0 2.3\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`;
    const { markdown, range, expectedRange } = hoverAt(text);
    expect(range).toEqual(expectedRange);
    expect(markdown).toContain('Override: 3-21G for 1 atom: t.');
    expect(markdown).toContain('Selected but decided by another line: s.');
  });

  it('shows each atom\'s basis and the line that gave it', () => {
    const text = `basis def2-svp\nbasis def2-tzvp on all Zn\nstructure {\n  Zn ⟦z$0n⟧ 0 0 0\n  S s 0 0 2.3\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`;
    expect(row(hoverAt(text).markdown!, 'basis')).toBe('| basis | def2-TZVP (`on all Zn`) |');
    expect(row(hoverAt(text.replace('⟦z$0n⟧', 'zn').replace('S s', 'S ⟦s$0⟧')).markdown!, 'basis')).toBe('| basis | def2-SVP (main line) |');
  });
});

describe('keyword and value-word hovers', () => {
  const FRAGMENT = (tier: string) => waterSpec(`fragment w {\n  atoms rest\n  tier ${tier}\n}`, 'basis sto-3g');
  const cases: { name: string; text: string; heading: string; contains?: string }[] = [
    { name: 'keyword at top level, with the spec\'s unit', text: FRAGMENT('mean-field').replace('structure {', '⟦str$0ucture⟧ in bohr {'), heading: '**structure**', contains: 'Length unit of this spec: bohr.' },
    { name: 'unit bohr', text: FRAGMENT('mean-field').replace('structure {', 'structure in ⟦bo$0hr⟧ {'), heading: '**bohr** · length unit', contains: '0.529177210903 Å (CODATA 2018)' },
    { name: 'unit angstrom', text: FRAGMENT('mean-field').replace('structure {', 'structure in ⟦angstrom$0⟧ {'), heading: '**angstrom** · length unit' },
    { name: 'an old spelling', text: `⟦un$0its⟧ bohr\n${FRAGMENT('mean-field')}`, heading: '**units** · old spelling', contains: 'Write `structure in bohr`; the quick fix rewrites it.' },
    { name: 'keyword in a tier', text: FRAGMENT('quantum { ⟦met$0hod⟧ vqe }'), heading: '**method**', contains: '`method <name>`' },
    { name: 'method', text: FRAGMENT('quantum { method ⟦v$0qe⟧ }'), heading: '**vqe** · method', contains: 'Peruzzo et al., Nat. Commun. 5, 4213 (2014)' },
    { name: 'correlated method', text: FRAGMENT('correlated { method ⟦ccsd$0(t)⟧ }'), heading: '**ccsd(t)** · method', contains: 'Cost: N^7: o^3 v^4 once for the triples' },
    { name: 'ansatz', text: FRAGMENT('quantum { method vqe; ansatz ⟦k-up$0ccgsd⟧ }'), heading: '**k-upccgsd** · ansatz', contains: 'J. Chem. Theory Comput. 15, 311 (2019)' },
    { name: 'mapping', text: FRAGMENT('quantum { mapping ⟦bravyi-$0kitaev⟧ }'), heading: '**bravyi-kitaev** · fermion-to-qubit mapping', contains: 'Ann. Phys. 298, 210 (2002)' },
    { name: 'tier level', text: FRAGMENT('⟦corr$0elated⟧ { method mp2 }'), heading: '**correlated** · solver tier' },
    { name: 'embedding', text: `embedding ⟦proj$0ection⟧\n${FRAGMENT('mean-field')}`, heading: '**projection** · embedding', contains: 'J. Chem. Theory Comput. 8, 2564 (2012)' },
    { name: 'switch', text: `frozen-core ⟦o$0ff⟧\n${FRAGMENT('mean-field')}`, heading: '**off** · switch' },
    { name: 'function type', text: FRAGMENT('mean-field').replace('basis sto-3g', 'basis sto-3g\nfunctions ⟦cart$0esian⟧'), heading: '**cartesian** · function type' },
    { name: 'selector word, with the unit its distance is in', text: FRAGMENT('mean-field').replace('atoms rest', 'atoms ⟦closer$0-than⟧ 2 to o'), heading: '**closer-than** · selector', contains: 'Here d is in ångström, the structure\'s unit.' },
    { name: 'basis selection word', text: FRAGMENT('mean-field').replace('basis sto-3g', 'basis sto-3g\nbasis 3-21G on ⟦fra$0gment⟧ w'), heading: '**fragment** · basis selection' },
    { name: 'scan coordinate', text: `${FRAGMENT('mean-field')}scan ⟦dist$0ance⟧ o h1 from 1 to 2 step 0.5`, heading: '**distance** · scan coordinate' },
  ];
  for (const c of cases) {
    it(`${c.name}`, () => {
      const { markdown, range, expectedRange } = hoverAt(c.text);
      expect(markdown, 'a hover').not.toBeNull();
      expect(markdown!.split('\n')[0]).toBe(c.heading);
      if (c.contains) expect(markdown).toContain(c.contains);
      expect(range).toEqual(expectedRange);
    });
  }

  it('answers on a value word written in another case', () => {
    expect(hoverAt(FRAGMENT('mean-field').replace('structure {', 'structure in BO$0HR {')).markdown?.split('\n')[0]).toBe('**bohr** · length unit');
  });
});

describe('no hover', () => {
  const text = `# leading comment$A
spec "t"   # trailing $B comment
$C
basis sto-3g
structure in bohr {
  O o 0 0 0
  H h1 0 0.756950 0.585882
  H h2 0 -0.756950 0.585882
}
fragment w $E{
$F  atoms  $G rest
  tier mean-field { method rhf }
}
method$H vqe
embedding foo$I
charge 0$J
`;
  const cases: Record<string, string> = {
    'in a full-line comment': '$A',
    'in a trailing comment': '$B',
    'on an empty line': '$C',
    'in the indentation of a line': '$F',
    'between two arguments': '$G',
    'on a `{`': '$E',
    'on a keyword outside its block': '$H',
    'on a value word that is not one of the allowed words': '$I',
    'on a number': '$J',
  };
  for (const [name, marker] of Object.entries(cases)) {
    it(name, () => {
      const withCursor = text.replace(marker, '$0').replace(/\$[A-Z]/g, '');
      expect(hoverAt(withCursor).markdown).toBeNull();
    });
  }

  it('past the end of the document', () => {
    const m = marked(`structure in bohr { }\n`);
    expect(doHover(m.analysis, { line: 5, character: 3 })).toBeNull();
  });

  it('(while the same spec does answer on its keywords and words)', () => {
    const clean = (t: string) => t.replace(/\$[A-Z]/g, '');
    expect(hoverAt(clean(text.replace('structure in bohr', 'struc$0ture in bohr'))).markdown).not.toBeNull();
    expect(hoverAt(clean(text.replace('atoms  $G rest', 'atoms re$0st'))).markdown).not.toBeNull();
  });
});
