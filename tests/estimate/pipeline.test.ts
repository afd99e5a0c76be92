/**
 * The estimation engine through the whole pipeline (spec text → analysis → report), with check
 * values from outside the project named beside each.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';

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
    expect(water.system.qubits.tapered).toBe(10);
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
    expect(two.fragments[0]!.qubits.jordanWigner).toBe(20);
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
    expect(given.fragments[0]!.activeIrreps).toEqual({ perIrrep: { A1: 2, B1: 1, B2: 1 }, source: 'given' });
    expect(given.fragments[0]!.active.orbitals).toBe(4);
  });

  it('tapers less when every active orbital is totally symmetric: only the two number parities go', () => {
    const allA1 = report(spec('4e A1=4'));
    expect(allA1.fragments[0]!.qubits.tapered).toBe(6);
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
    expect(scanned.scan!.totals).toEqual({ fragmentCalculations: 10, measurementCircuits: 5 * (groups as number), peakQubits: 8 });
  });
});
