/**
 * Under DMET the impurity's α and β counts, its active space and its determinant counts follow one
 * rule: the impurity's electrons come from the system's determinant (Knizia & Chan, Phys. Rev.
 * Lett. 109, 186404 (2012); Wouters et al., J. Chem. Theory Comput. 12, 2706 (2016)), so its spin is
 * the impurity's nα − nβ, not the fragment's own multiplicity.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';

// Stretched H2 (3 Å, invented) in STO-3G cut into its two atoms, the classic DMET test of Knizia &
// Chan 2012: M = 2 orbitals, Nα = Nβ = 1, each atom L = 1. bath_σ = min(L, M − L, Nσ, M − Nσ) = 1,
// electrons_σ = bath + max(0, L + Nσ − M) = 1: an impurity of 2 orbitals holding 1α and 1β.
const H2 = (tier: string) => `basis sto-3g
embedding dmet
structure {
  H a 0 0 0
  H b 0 0 3.0
}
fragment left { atoms a; ${tier} }
fragment right { atoms b; tier mean-field { method rohf } }
`;

describe('a hydrogen atom of stretched H2 under DMET (Knizia & Chan 2012)', () => {
  const analysis = analyzeDocument(H2('tier quantum { method vqe }'));
  const fragment = analysis.report().fragments[0]!;

  it('solves the impurity with the impurity\'s spin: 1α / 1β in 2 orbitals, although the atom alone is a doublet', () => {
    expect(fragment.multiplicity).toBe(2); // one electron: a doublet by definition
    expect(fragment.problem).toMatchObject({ embedding: 'dmet', orbitals: 2, electrons: 2, alpha: 1, beta: 1 });
    expect(fragment.active).toMatchObject({ electrons: 2, orbitals: 2, alpha: 1, beta: 1 });
  });

  it('counts determinants and qubits of that impurity: C(2,1)² = 4 determinants, 2 × 2 = 4 qubits (Jordan & Wigner 1928)', () => {
    expect(fragment.classical!.determinants.exact).toBe('4');
    expect(fragment.qubits!.jordanWigner).toBe(4);
    expect(fragment.notes.join(' ')).toContain("the impurity's spin comes from the system's mean field (1α / 1β, 0 unpaired), not from the fragment's multiplicity 2");
  });

  it('rejects an active space that cannot carry the impurity\'s spin, and says why (odd electrons with 0 unpaired, by construction)', () => {
    const bad = analyzeDocument(H2('tier quantum { method vqe; active 1e 1o }'));
    const found = bad.diagnostics.filter((d) => d.code === 'active-space-invalid');
    expect(found).toHaveLength(1); // by construction: the fragment alone accepts 1e 1o
    expect(found[0]!.message).toContain('does not fit its DMET impurity (2e 2o, 1α / 1β');
    expect(found[0]!.message).toContain('with 0 unpaired electrons the active electrons must be even');
  });
});
