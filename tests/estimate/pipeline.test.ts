/**
 * The estimation engine through the whole pipeline (spec text → analysis → report), with check
 * values from outside the project named beside each.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument, countValue } from '../../server/src/analysis';

function report(text: string) {
  return analyzeDocument(text).report();
}

// H2 at its experimental bond length 0.7414 Å (as commonly quoted; from memory).
const H2 = (tier = 'tier quantum { method vqe; ansatz uccsd; mapping jordan-wigner; taper on }') => `basis sto-3g
frozen-core off
structure {
  H a 0 0 0
  H b 0 0 0.7414
}
fragment h2 {
  atoms rest
  ${tier}
}
`;

// Water, experimental geometry (Hoy & Bunker 1979: r 0.9572 Å, angle 104.52°), placed as in tests/fixtures/water.ts.
const WATER = `structure {
  O o 0.000000 0.000000 0.000000
  H h1 0.000000 0.756950 0.585882
  H h2 0.000000 -0.756950 0.585882
}`;

describe('H2 in STO-3G', () => {
  const h2 = report(H2());
  it('uses D2h for counting (full group D∞h) with one Ag and one B1u orbital (σg and σu of the minimal basis, Szabo & Ostlund 1989; D∞h → D2h from Cotton 1990, from memory)', () => {
    expect(h2.system.pointGroup).toBe('D2h');
    expect(h2.system.fullPointGroup).toBe('D∞h');
    expect(h2.system.orbitalsPerIrrep).toMatchObject({ Ag: 1, B1u: 1 });
  });

  it('needs 4 qubits under Jordan–Wigner and 1 after tapering (Bravyi, Gambetta, Mezzacapo, Temme, arXiv:1701.08213 (2017))', () => {
    expect(h2.system.qubits).toEqual({ jordanWigner: 4, bravyiKitaev: 4, parity: 2, tapered: 1 });
    expect(h2.fragments[0]!.qubitsRequired).toBe(1);
  });

  it('has 15 Pauli terms under Jordan–Wigner, identity included (Seeley, Richard & Love, J. Chem. Phys. 137, 224109 (2012))', () => {
    expect(h2.system.pauliTerms).toMatchObject({ jordanWigner: 15, bravyiKitaev: 15, identityIncluded: true });
    // The reduced parity Hamiltonian on 2 qubits has 5 terms: I, Z0, Z1, Z0Z1, X0X1 (O'Malley et al.,
    // Phys. Rev. X 6, 031007 (2016); from memory).
    expect(h2.system.pauliTerms!.parity).toBe(5);
    // D∞h is not abelian: the count is flagged as an upper bound (here it is reached).
    expect(h2.system.pauliTerms!.upperBound).toBe(true);
  });

  it('has 2 singles and 1 double in the spin-orbital UCCSD, 1 parameter after point-group screening (O\'Malley et al. 2016)', () => {
    expect(h2.fragments[0]!.ansatzCost).toMatchObject({ kind: 'uccsd', unscreened: 3, parameters: 1, singles: 0, doubles: 1 });
  });

  it('gives every mapping its count: parity 2n − 2, Bravyi–Kitaev 2n (Seeley, Richard & Love 2012; Bravyi et al. 2017)', () => {
    expect(report(H2('tier quantum { method vqe; mapping parity }')).fragments[0]!.qubitsRequired).toBe(2);
    expect(report(H2('tier quantum { method vqe; mapping bravyi-kitaev }')).fragments[0]!.qubitsRequired).toBe(4);
  });
});

describe('water in STO-3G', () => {
  const water = report(`basis sto-3g\nfrozen-core off\n${WATER}\nfragment w {\n  atoms rest\n  tier correlated { method fci }\n}\n`);
  it('has 441 full-CI determinants (C(7,5)² = 21², Sherrill & Schaefer 1999)', () => {
    expect(water.fragments[0]!.classical!.determinants).toMatchObject({ exact: '441', text: '441' });
  });

  it('has 4 A1, 0 A2, 1 B1 and 2 B2 orbitals in C2v (psi4 1.3.2, tests/fixtures/irreps.psi4.json)', () => {
    expect(water.system.orbitalsPerIrrep).toEqual({ A1: 4, A2: 0, B1: 1, B2: 2 });
  });

  it('has 1086 Pauli terms under Jordan–Wigner in C2v (Verteletskyi, Yen, Izmaylov 2020; from memory) and tapers 14 → 10 qubits', () => {
    expect(water.system.pauliTerms!.jordanWigner).toBe(1086);
    expect(water.system.qubits!.tapered).toBe(10);
  });
});

describe('open shells', () => {
  // O2 at r_e = 1.2075 Å (Huber & Herzberg 1979, from memory); α = (N + 2S)/2 (Szabo & Ostlund 1989);
  // the spin-orbital UCCSD count of Romero et al. 2019, by hand below.
  it('triplet O2 in cc-pVDZ: 9 α and 7 β electrons, UCCSD counted in spin orbitals (no spin-adapted form)', () => {
    const o2 = report(`basis cc-pVDZ\nmultiplicity 3\nstructure {\n  O a 0 0 0.60375\n  O b 0 0 -0.60375\n}\nfragment o2 {\n  atoms rest\n  multiplicity 3\n  tier quantum { method vqe; ansatz uccsd; active 8e 6o }\n}\n`);
    const fragment = o2.fragments[0]!;
    expect(fragment.active).toMatchObject({ electrons: 8, orbitals: 6, alpha: 5, beta: 3 });
    // Spin-orbital UCCSD, unscreened: singles 5·1 + 3·3 = 14; doubles C(5,2)C(1,2) + C(3,2)C(3,2) + 5·3·1·3 = 0 + 9 + 45 = 54.
    expect(fragment.ansatzCost!.unscreened).toBe(68);
    expect(fragment.ansatzCost!.spinAdapted).toBeNull();
  });
});

describe('DMET impurity sizes (Knizia & Chan 2012; Wouters et al. 2016)', () => {
  // Two waters 6 Å apart in STO-3G: per water 7 orbitals, 1 frozen; the system has M = 12 orbitals
  // and N = 4 + 4 = 8 occupied per spin outside the core. A one-water fragment of L = 6 orbitals gets
  // bath = min(L, M − L, N, M − N) = min(6, 6, 8, 4) = 4 (Knizia & Chan 2012; Wouters et al. 2016),
  // an impurity of 10 orbitals with 2 × (4 + max(0, 6 + 8 − 12)) = 12 electrons.
  const two = report(`basis sto-3g\nstructure {\n  O o 0 0 0\n  H h1 0 0.756950 0.585882\n  H h2 0 -0.756950 0.585882\n  O p 6 0 0\n  H g1 6 0.756950 0.585882\n  H g2 6 -0.756950 0.585882\n}\nembedding dmet\nfragment a {\n  atoms o h1 h2\n  tier quantum { method vqe }\n}\nfragment b {\n  atoms p g1 g2\n  tier mean-field { method rhf }\n}\n`);
  it('gives a fragment up to L bath orbitals, fewer when the environment has fewer virtuals', () => {
    expect(two.fragments[0]!.problem).toMatchObject({ embedding: 'dmet', orbitals: 10, electrons: 12, bath: { alpha: 4, beta: 4 } });
    expect(two.fragments[0]!.qubits!.jordanWigner).toBe(20);
  });

  it('uses the fragment\'s own orbitals without DMET: 7 STO-3G orbitals less the frozen O 1s (common practice), 8 electrons', () => {
    const own = report(`basis sto-3g\n${WATER}\nfragment w {\n  atoms rest\n  tier quantum { method vqe }\n}\n`);
    expect(own.fragments[0]!.problem).toMatchObject({ embedding: 'none', orbitals: 6, electrons: 8 });
  });
});

// Water in cc-pVDZ has 11 A1, 2 A2, 4 B1, 7 B2 orbitals (psi4 1.3.2, tests/fixtures/irreps.psi4.json);
// irreps given in the spec are used as given, by definition; tapering as in Bravyi et al. 2017.
describe('active spaces per irrep', () => {
  const spec = (active: string) => `basis cc-pVDZ\n${WATER}\nfragment w {\n  atoms rest\n  tier quantum { method vqe; mapping jordan-wigner; taper on; active ${active} }\n}\n`;
  it('uses the irreps as given', () => {
    const given = report(spec('4e A1=2 B1=1 B2=1'));
    expect(given.fragments[0]!.activeIrreps).toEqual({ perIrrep: { A1: 2, B1: 1, B2: 1 }, source: 'given', occupation: 'assumed' });
    expect(given.fragments[0]!.active!.orbitals).toBe(4);
  });

  it('tapers less when every active orbital is totally symmetric: only the two number parities go', () => {
    const allA1 = report(spec('4e A1=4'));
    expect(allA1.fragments[0]!.qubits!.tapered).toBe(6);
    expect(allA1.fragments[0]!.taperingSymmetries).toEqual(['N_α parity', 'N_β parity']);
  });

  it('reports an irrep the fragment\'s group does not have, and counts beyond what an irrep holds', () => {
    const wrong = analyzeDocument(spec('4e A1=2 Bg=2'));
    expect(wrong.diagnostics.find((d) => d.code === 'active-space-invalid')!.message).toContain("'Bg' is not an irrep of C2v");
    const tooMany = analyzeDocument(spec('4e A1=2 A2=3'));
    expect(tooMany.diagnostics.find((d) => d.code === 'active-space-invalid')!.message).toContain('has 2 A2 orbitals outside the frozen core; 3 cannot be active');
    const sum = analyzeDocument(spec('4e 5o A1=2 B1=2'));
    expect(sum.diagnostics.find((d) => d.code === 'active-space-invalid')!.message).toContain('add up to 4, not 5');
  });
});

// 4 active orbitals: 8 qubits under Jordan–Wigner, 6 under the reduced parity mapping (Seeley, Richard
// & Love 2012; Bravyi et al. 2017), 4 after tapering the number parities and two C2v generators.
describe('limits with tapering and other mappings', () => {
  it('suggests tapering and the parity mapping when they would fit', () => {
    const analysis = analyzeDocument(`basis cc-pVDZ\n${WATER}\nfragment w {\n  atoms rest\n  tier quantum { method vqe; mapping jordan-wigner; active 4e 4o }\n}\nlimits { qubits 6 }\n`);
    const message = analysis.diagnostics.find((d) => d.code === 'qubit-limit-exceeded')!.message;
    expect(message).toContain('needs 8 qubits');
    expect(message).toContain('`taper on` brings it to 4 qubits');
    expect(message).toContain('`mapping parity` needs 6');
  });

  it('compares the statevector memory with the limit: 30 qubits need 16 GiB (2^30 × 16 bytes, common practice)', () => {
    const analysis = analyzeDocument(`basis cc-pVDZ\n${WATER}\nfragment w {\n  atoms rest\n  tier quantum { method vqe; active 8e 15o }\n}\nlimits { memory 8 GiB }\n`);
    expect(analysis.diagnostics.find((d) => d.code === 'memory-limit-exceeded')!.message).toContain('needs 16.0 GiB');
  });
});

describe('scans', () => {
  it('multiplies per-point costs by the number of points (by definition: 2.5 to 3.5 step 0.25 is 5 points, 2 fragments each)', () => {
    const scanned = report(`basis sto-3g\n${WATER.replace('}', '  He he 0 0 3.0\n}')}\nfragment w { atoms o h1 h2; tier quantum { method vqe; active 4e 4o } }\nfragment x { atoms he; tier mean-field { method rhf } }\nscan distance o he from 2.5 to 3.5 step 0.25\n`);
    expect(scanned.scan!.points).toBe(5);
    const groups = scanned.fragments[0]!.measurement!.groups;
    expect(scanned.scan!.totals).toEqual({ fragmentCalculations: 10, measurementCircuits: 5 * (groups as number), measurementCircuitsPerPoint: groups, peakQubits: 8 });
  });
});

// A fragment that sees its environment keeps only the operations of the system's group that map it
// onto itself: the stabiliser of its atoms (group theory of a group acting on sets; site symmetry,
// Cotton 1990, from memory). One H of water keeps the molecular plane only (Cs); alone it is an
// atom (Kh, counted in D2h).
describe('symmetry that survives embedding', () => {
  const waterSplit = (embedding: string) =>
    analyzeDocument(`basis cc-pVDZ\nfrozen-core off\n${WATER}\nembedding ${embedding}\nfragment oh {\n  atoms o h1\n  tier mean-field { method rhf }\n}\nfragment h {\n  atoms h2\n  tier quantum { method vqe; taper on }\n}\n`);

  it.each(['dmet', 'projection'])('under %s the H fragment is counted in Cs, its stabiliser in C2v water, and both groups are given', (embedding) => {
    const figures = waterSplit(embedding).fragmentFigures(1);
    expect(figures.pointGroup).toBe('Cs');
    expect(figures.symmetry).toMatchObject({ countedIn: 'in-system', inSystem: { pointGroup: 'Cs', fullPointGroup: 'Cs' }, own: { pointGroup: 'D2h', fullPointGroup: 'Kh' } });
    // H in cc-pVDZ: 2s1p = 5 functions (tests/fixtures/basis-counts.nwchem.json); in Cs with the
    // plane as σ: the s and the two in-plane p are A′, the out-of-plane p is A″ (by hand).
    expect(figures.orbitalsPerIrrep).toEqual({ "A'": 4, 'A"': 1 });
  });

  it.each(['subtractive', 'none'])('under %s the H fragment stands alone and is counted in its own group', (embedding) => {
    const figures = waterSplit(embedding).fragmentFigures(1);
    expect(figures.pointGroup).toBe('D2h');
    expect(figures.symmetry).toMatchObject({ countedIn: 'own', inSystem: null, own: { pointGroup: 'D2h' } });
  });

  // The zinc sample: a C1 system. Under DMET the site keeps C1 (a subgroup of C1, by definition),
  // so its figures are the unscreened ones of 10 orbitals: 2 × 10 − 2 = 18 tapered qubits (only the
  // number parities; Bravyi et al. 2017), and UCCSD 5·5·2 singles + 2·C(5,2)² + 5⁴ doubles = 875
  // (spin-orbital count, Romero et al. 2019, by hand). Alone the site is C2 (17 tapered qubits).
  it('counts the zinc sample\'s site in C1 under DMET, not in its own C2', async () => {
    const { readFileSync } = await import('node:fs');
    const text = readFileSync(new URL('../../samples/zn-site-h2s-scan.tess', import.meta.url), 'utf8');
    const dmet = analyzeDocument(text).fragmentFigures(0);
    expect(dmet.symmetry).toMatchObject({ countedIn: 'in-system', inSystem: { pointGroup: 'C1' }, own: { pointGroup: 'C2' } });
    expect(dmet.qubitsRequired).toBe(18);
    expect(dmet.ansatzCost).toMatchObject({ parameters: 875, unscreened: 875 });
    const alone = analyzeDocument(text.replace('embedding dmet', 'embedding none')).fragmentFigures(0);
    expect(alone.pointGroup).toBe('C2');
    expect(alone.qubitsRequired).toBe(17);
    // Pauli terms never fewer in the subgroup than in the group (fewer selection rules; by definition).
    expect(countValue(dmet.pauliTerms!.jordanWigner)).toBeGreaterThan(countValue(alone.pauliTerms!.jordanWigner));
  });

  it('an embedded linear guest is no longer an upper-bound count: CO2 beside an ion keeps C∞v → its abelian C2v, not D∞h', () => {
    // CO2 (C=O 1.16 Å, from memory) on the z axis with a Na+ 3 Å beyond one O (invented placement).
    const spec = (embedding: string) => `basis def2-SVP\ncharge 1\nstructure {\n  C c 0 0 0\n  O o1 0 0 1.16\n  O o2 0 0 -1.16\n  Na na 0 0 4.16\n}\nembedding ${embedding}\nfragment guest {\n  atoms c o1 o2\n  tier quantum { method vqe; active 4e 4o }\n}\nfragment ion {\n  atoms na\n  charge 1\n  tier mean-field { method rhf }\n}\n`;
    const embedded = analyzeDocument(spec('dmet')).fragmentFigures(0);
    expect(embedded.symmetry).toMatchObject({ inSystem: { fullPointGroup: 'C∞v', pointGroup: 'C2v' }, own: { fullPointGroup: 'D∞h', pointGroup: 'D2h' } });
    // Both C∞v and D∞h are non-abelian, so both counts are upper bounds, but the embedded one counts
    // in the subgroup C2v of D2h and so allows at least as many strings (by definition).
    const alone = analyzeDocument(spec('none')).fragmentFigures(0);
    expect(countValue(embedded.pauliTerms!.jordanWigner)).toBeGreaterThanOrEqual(countValue(alone.pauliTerms!.jordanWigner));
  });
});
