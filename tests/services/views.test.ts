/**
 * The data behind the structure view and the cost panel: what `tessera/structure`,
 * `tessera/costs` and `tessera/viewTarget` answer, and that it passes the checks the views run
 * on receipt (client/src/views/protocol.ts) for every sample.
 */
import { describe, expect, it } from 'vitest';
import { checkCosts, checkStructure } from '../../client/src/views/protocol';
import { analyzeDocument } from '../../server/src/analysis';
import { costPlots, growthFragments, structureOf, viewTargetAt } from '../../server/src/services';
import { positionOf, readSample, SAMPLE_NAMES } from './service';

const zinc = analyzeDocument(readSample('zn-site-h2s-scan.tess'));

describe('structure data for the view', () => {
  it('passes the view checks for every sample, as JSON', () => {
    for (const name of SAMPLE_NAMES) {
      const data = JSON.parse(JSON.stringify(structureOf(analyzeDocument(readSample(name)))));
      const checked = checkStructure(data);
      expect(checked.ok ? 'ok' : `${name}: ${checked.reason}`).toBe('ok');
    }
  });

  it('gives the demo its fragments, the cost labels of the report, the unassigned colour and the note', () => {
    const data = structureOf(zinc);
    expect(data.fragments.map((f) => [f.name, f.cost])).toEqual([
      // site: 18 qubits needed, tapered in C1 under DMET (see the hint test); guest and frame: their orbitals.
      ['site', '18 qubits'],
      ['guest', '28 orbitals'],
      ['frame', '94 orbitals'],
    ]);
    expect(data.unassignedColour).toMatch(/^#[0-9a-f]{6}$/i);
    expect(data.fragments.map((f) => f.colour)).not.toContain(data.unassignedColour);
    expect(data.note).toMatch(/planning estimates/i);
    expect(data.scan).toMatchObject({ coordinate: 'distance', first: 0, second: 17, values: [2.3, 2.5, 2.7, 2.9, 3.1, 3.3, 3.5] });
    expect(data.bonds.some((bond) => bond.cut)).toBe(true);
  });
});

describe('cost plots for the panel', () => {
  it('pass the panel checks for every sample', () => {
    for (const name of SAMPLE_NAMES) {
      const analysis = analyzeDocument(readSample(name));
      for (const fragment of [null, ...growthFragments(analysis).map((f) => f.index)]) {
        const checked = checkCosts(JSON.parse(JSON.stringify(costPlots(analysis, fragment))));
        expect(checked.ok ? 'ok' : `${name} (${fragment}): ${checked.reason}`).toBe('ok');
      }
    }
  });

  it('offer the fragments with a sized problem and show the largest quantum one first', () => {
    const plots = costPlots(zinc);
    // frame is mean-field: no solver problem to grow.
    expect(plots.fragments).toEqual([
      { index: 0, name: 'site' },
      { index: 1, name: 'guest' },
    ]);
    expect(plots.selected).toBe(0);
    expect(plots.svg.growth).toContain('Cost against active-space size: site (planning estimate)');
    expect(plots.svg.qubits).toContain('Qubits per fragment (planning estimate)');
    expect(plots.svg.scan).toContain('Cumulative cost along the scan (planning estimate)');
    expect(plots.note).toMatch(/planning estimates/i);
  });

  it('show the requested fragment, and the default for one that cannot be shown', () => {
    expect(costPlots(zinc, 1).selected).toBe(1);
    expect(costPlots(zinc, 1).svg.growth).toContain('active-space size: guest');
    expect(costPlots(zinc, 2).selected).toBe(0); // frame: mean-field
    expect(costPlots(zinc, 99).selected).toBe(0);
    expect(costPlots(zinc, -1).selected).toBe(0);
  });

  it('select nothing when no fragment has a sized problem', () => {
    const analysis = analyzeDocument('basis sto-3g\nstructure {\n  H 0 0 0\n  H 0 0 0.74\n}\nfragment h { atoms rest; tier mean-field { method rhf } }\n');
    expect(analysis.report().fragments).toHaveLength(1);
    const plots = costPlots(analysis);
    expect(plots.fragments).toEqual([]);
    expect(plots.selected).toBeNull();
    expect(plots.svg.growth).toContain('no sized quantum or correlated problem');
    expect(checkCosts(JSON.parse(JSON.stringify(plots))).ok).toBe(true);
  });
});

describe('the fragment and atom at the cursor', () => {
  it('is the fragment whose block holds the cursor, header line included', () => {
    expect(viewTargetAt(zinc, positionOf(zinc, 'fragment site', 3))).toEqual({ fragment: 0, atom: null });
    expect(viewTargetAt(zinc, positionOf(zinc, 'mapping jordan-wigner', 2))).toEqual({ fragment: 0, atom: null });
    expect(viewTargetAt(zinc, positionOf(zinc, 'atoms s #19..#20', 0))).toEqual({ fragment: 1, atom: null });
    expect(viewTargetAt(zinc, positionOf(zinc, 'method rhf', 0))).toEqual({ fragment: 2, atom: null });
  });

  it('is the atom of a geometry line, in no fragment block', () => {
    expect(viewTargetAt(zinc, positionOf(zinc, 'Zn  zn', 1))).toEqual({ fragment: null, atom: 0 });
    expect(viewTargetAt(zinc, positionOf(zinc, 'S   s', 0))).toEqual({ fragment: null, atom: 17 });
  });

  it('is nothing elsewhere, and past the end of the text', () => {
    expect(viewTargetAt(zinc, positionOf(zinc, 'embedding dmet', 2))).toEqual({ fragment: null, atom: null });
    expect(viewTargetAt(zinc, { line: 10_000, character: 0 })).toEqual({ fragment: null, atom: null });
  });
});
