/**
 * The computed Hamiltonian in the editor: a quantum fragment's analysis describes a Hamiltonian
 * request (canonical window of its active space on its own restricted mean field), and once its
 * result is in the late store the fragment hover shows the computed figures in place of the
 * counted ones, each said to be computed, counted or an estimate. The job is run here directly
 * (jobs/run.ts), as the worker runs it. Check value: H2 in STO-3G at 0.7414 Å has 15 Pauli strings
 * including the identity (Seeley, Richard & Love, J. Chem. Phys. 137, 224109 (2012)).
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument, HAMILTONIAN_KIND, LateResults, MEAN_FIELD_KIND, requestKey } from '../../server/src/analysis';
import { runHamiltonian, runMeanField, type RunContext } from '../../server/src/jobs/run';
import { doHover } from '../../server/src/services/hover';

const CONTEXT: RunContext = { cancel: { cancelled: false }, onProgress: () => undefined, storageLimitBytes: 0 };

function spec(tier: string, top = ''): string {
  return ['spec "h2"', 'basis STO-3G', top, 'structure {', '  H a 0 0 0', '  H b 0 0 0.7414', '}', 'fragment site {', '  atoms a b', `  tier ${tier}`, '}'].join('\n');
}

function hoverOnName(text: string, late: LateResults): string {
  const analysis = analyzeDocument(text, {}, late);
  const offset = text.indexOf('site');
  const line = text.slice(0, offset).split('\n').length - 1;
  const character = offset - text.lastIndexOf('\n', offset - 1) - 1;
  const result = doHover(analysis, { line, character });
  return typeof result?.contents === 'object' && 'value' in result.contents ? result.contents.value : '';
}

describe('a quantum fragment in the editor', () => {
  it('describes a Hamiltonian request on RHF orbitals in the window of its active space; other tiers none', () => {
    const analysis = analyzeDocument(spec('quantum { method vqe; active 2e 2o }'));
    const computation = analysis.computation({ kind: 'fragment', index: 0 });
    expect(computation.hamiltonian?.space).toEqual({ kind: 'window', electrons: 2, orbitals: 2 }); // by construction: active 2e 2o
    expect(computation.hamiltonian?.meanField.reference).toBe('rhf'); // a singlet (by definition of the default)
    expect(analyzeDocument(spec('correlated { method ccsd }')).computation({ kind: 'fragment', index: 0 }).hamiltonian).toBeNull();
  });

  it('shows the computed strings (15, Seeley, Richard & Love 2012), λ and the budget at the spec accuracy once the result is in', () => {
    const text = spec('quantum { method vqe; active 2e 2o; steps 20 }', 'accuracy 1 kcal/mol');
    const late = new LateResults();
    const computation = analyzeDocument(text, {}, late).computation({ kind: 'fragment', index: 0 });
    const before = hoverOnName(text, late);
    expect(before).toContain('counted (identity included)');
    expect(before).not.toContain('Hamiltonian (computed)');

    const meanField = runMeanField(computation.meanField!, CONTEXT);
    late.ready(MEAN_FIELD_KIND, computation.meanFieldKey!, meanField);
    const outcome = runHamiltonian(computation.hamiltonian!, meanField, CONTEXT);
    late.ready(HAMILTONIAN_KIND, requestKey(computation.hamiltonian!), outcome);

    const after = hoverOnName(text, late);
    expect(after).toContain('**15** computed (counted bound'); // Seeley, Richard & Love 2012
    expect(after).toContain('Hamiltonian (computed)');
    expect(after).toContain('**15** JW'); // Seeley, Richard & Love 2012
    // 1 kcal/mol = 1.59 mHa (CODATA 2018), the shots said to be estimates.
    expect(after).toMatch(/at ε = 1\.59 mHa \(estimates\)/);
    expect(after).toContain('× 20 steps');
    expect(after).toContain('a `shot-rate` in `limits` gives the time');
    expect(after).toContain('an estimate');
    expect(after).toContain('Phys. Rev. X 8, 041015 (2018)');
  });

  it('a fragment under DMET keeps its counted figures and says why', () => {
    const analysis = analyzeDocument(`${spec('quantum { method vqe; active 2e 2o }')}\nembedding dmet`);
    const computation = analysis.computation({ kind: 'fragment', index: 0 });
    expect(computation.hamiltonian).toBeNull();
    expect(computation.hamiltonianNote).toContain('impurity');
  });
});
