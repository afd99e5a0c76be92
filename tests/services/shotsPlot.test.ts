/**
 * The cost panel's plot of shots against active-space size: empty until the Hamiltonians of the
 * fragment's shot series arrive, then their (λ/ε)² bounds and grouped estimates, one point per
 * computed window, in an SVG the panel accepts. Water cc-pVDZ at Hoy & Bunker's structure; the
 * Hamiltonians themselves are checked against psi4 in tests/electronic and tests/jobs.
 */
import { describe, expect, it } from 'vitest';
import { checkSvg } from '../../client/src/views/protocol';
import { analyzeDocument, LateResults, prerequisites, requestKey, type ComputeRequest } from '../../server/src/analysis';
import { runRequest } from '../../server/src/jobs/run';
import { costPlots } from '../../server/src/services/views';
import { WATER_ROWS } from '../fixtures/water';

const WATER = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
const SPEC = `basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier quantum { method vqe; ansatz uccsd; mapping jordan-wigner; active 4e 4o } }\n`;
const context = { cancel: { cancelled: false }, onProgress: () => {}, storageLimitBytes: 64 * 2 ** 20 };

function run(request: ComputeRequest, late: LateResults): unknown {
  const there = late.get(request.kind, requestKey(request));
  if (there.state === 'ready') return there.value;
  const inputs = prerequisites(request).map((requirement) => run(requirement, late));
  const result = runRequest(request, inputs, context);
  late.ready(request.kind, requestKey(request), result);
  return result;
}

describe('shots against active-space size in the cost panel', () => {
  it('asks for canonical windows of 2, 4, …, 16 orbitals (4 is the fragment\'s own), all electrons once past half filling', () => {
    const analysis = analyzeDocument(SPEC, {}, new LateResults());
    const windows = analysis.shotSeriesRequests(0).map((request) => (request.space.kind === 'window' ? `${request.space.electrons}e${request.space.orbitals}o` : '?'));
    // Water outside the frozen core: 8 electrons in 23 orbitals.
    expect(windows).toEqual(['2e2o', '4e4o', '6e6o', '8e8o', '8e10o', '8e12o', '8e14o', '8e16o']);
  });

  it('empty before the Hamiltonians arrive, then one point per computed window in each series', () => {
    const late = new LateResults();
    const analysis = analyzeDocument(SPEC, {}, late);
    expect(costPlots(analysis, 0).svg.shots).toContain('No Hamiltonian of this fragment is computed yet');
    const requests = analysis.shotSeriesRequests(0).slice(0, 3);
    for (const request of requests) run(request, late);
    const svg = costPlots(analysis, 0).svg.shots;
    expect(checkSvg(svg)).toEqual({ ok: true, value: svg });
    expect(svg.match(/<circle /g)).toHaveLength(2 * requests.length);
    expect(svg).toContain('× not computed (8, 10, 12, 14, 16 orbitals)');
  });

  it('asks for no series under embedding dmet, where the problem is the impurity, and says why', () => {
    // Two waters (the second moved 3 Å along x), DMET: each fragment's problem is fragment + bath.
    const second = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label}b ${(x + 3).toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
    const dmet = `basis cc-pvdz\nembedding dmet\nstructure {\n${WATER}\n${second}\n}\nfragment w { atoms o h1 h2; tier quantum { method vqe; ansatz uccsd; mapping jordan-wigner; active 4e 4o } }\nfragment rest { atoms rest; tier mean-field { method rhf } }\n`;
    const analysis = analyzeDocument(dmet, {}, new LateResults());
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(analysis.shotSeriesRequests(0)).toEqual([]);
    expect(costPlots(analysis, 0).svg.shots).toContain('Under embedding dmet the Hamiltonian is the impurity’s (fragment + bath): not computed, so no shots.');
  });
});
