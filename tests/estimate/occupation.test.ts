/**
 * The reference occupation of an active space: assumed (and said so) when only the irreps are
 * given, as written when the spec gives `occupied … open …`. Dinitrogen's valence space in D2h:
 * 2σg (Ag), 2σu* (B1u), 1πu (B2u, B3u), 3σg (Ag), 1πg* (B2g, B3g), 3σu* (B1u); the aufbau ground
 * state fills 2σg² 2σu² 1πu⁴ 3σg² (the textbook MO diagram of N2, e.g. Atkins, Physical Chemistry;
 * from memory).
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';

// r(N≡N) = 1.0977 Å (Huber & Herzberg 1979, from memory).
const spec = (occupation: string) => `basis cc-pvdz
structure {
  N a 0 0 0
  N b 0 0 1.0977
}
fragment n2 { atoms rest; tier quantum { method vqe; active 10e Ag=2 B1u=2 B2u=1 B3u=1 B2g=1 B3g=1 ${occupation} } }
`;

describe('the reference occupation of N2\'s valence space (Huber & Herzberg 1979; MO order from memory)', () => {
  it('is said to be assumed when only the irreps are given', () => {
    const fragment = analyzeDocument(spec('')).report().fragments[0]!;
    expect(fragment.activeIrreps).toMatchObject({ source: 'given', occupation: 'assumed' });
  });

  it('follows the aufbau occupation when given: 53 screened UCCSD parameters (spin-conserving, symmetry-allowed; Romero et al. 2019)', () => {
    const analysis = analyzeDocument(spec('occupied Ag=2 B1u=1 B2u=1 B3u=1'));
    const fragment = analysis.report().fragments[0]!;
    expect(analysis.diagnostics).toEqual([]);
    expect(fragment.activeIrreps).toMatchObject({ occupation: 'given' });
    // Singles: only 2σu* (B1u) → 3σu* (B1u) keeps the irrep, once per spin: 2 (by the selection rule).
    expect(fragment.ansatzCost).toMatchObject({ parameters: 53, singles: 2, doubles: 51 });
  });

  it('rejects an occupation that does not fit the active space, saying what and where (by construction)', () => {
    const analysis = analyzeDocument(spec('occupied Ag=2 B1u=1 B2u=1 B3u=2'));
    const messages = analysis.diagnostics.filter((d) => d.code === 'active-space-invalid').map((d) => d.message);
    expect(messages).toContain('The occupation holds 2 × 6 + 0 = 12 electrons, but the active space has 10.');
    expect(messages).toContain('2 occupied B3u orbitals, but the active space has 1 B3u orbitals.');
    const spin = analyzeDocument(spec('occupied Ag=2 B1u=1 B2u=1 open B3u=2')).diagnostics.map((d) => d.message);
    expect(spin.join(' ')).toContain('2 occupied B3u orbitals');
    // Two singly occupied orbitals in a singlet: nα − nβ = 0 (2S+1 = 1, Szabo & Ostlund 1989).
    const unpaired = analyzeDocument(spec('occupied Ag=2 B1u=1 B2u=1 open B3u=1 B2g=1')).diagnostics.map((d) => d.message);
    expect(unpaired).toContain('The occupation has 2 singly occupied orbitals, but the active space has 0 unpaired electrons (5α / 5β).');
  });

  it('needs the irreps of the active space first (by construction)', () => {
    const analysis = analyzeDocument(spec('').replace('Ag=2 B1u=2 B2u=1 B3u=1 B2g=1 B3g=1', '8o occupied Ag=2'));
    expect(analysis.diagnostics.map((d) => d.message).join(' ')).toContain('A reference occupation per irrep needs the active orbitals per irrep first');
  });
});
