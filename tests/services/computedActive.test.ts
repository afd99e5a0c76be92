/**
 * The computed active space in the editor: the hover section on `active` and the quick fix that
 * writes it per irrep, from the result of the active-space job (run here as the worker would).
 * Water cc-pVDZ at Hoy & Bunker's structure (tests/fixtures/water.ts); the orbitals themselves are
 * checked against psi4 in tests/electronic/activeSpace and tests/jobs/activeSpace.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument, LateResults, prerequisites, requestKey, type ActiveSpaceOutcome, type ComputeRequest } from '../../server/src/analysis';
import { runRequest } from '../../server/src/jobs/run';
import { activeSpaceActions, activeSpaceSection, perIrrepText } from '../../server/src/services/computedActive';
import { doHover } from '../../server/src/services/hover';
import { WATER_ROWS } from '../fixtures/water';

const WATER = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
const spec = (tier: string) => `basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier quantum { ${tier} } }\n`;
const context = { cancel: { cancelled: false }, onProgress: () => {}, storageLimitBytes: 64 * 2 ** 20 };

function run(request: ComputeRequest, late: LateResults): unknown {
  const inputs = prerequisites(request).map((requirement) => run(requirement, late));
  const result = runRequest(request, inputs, context);
  late.ready(request.kind, requestKey(request), result);
  return result;
}

function computed(tier: string) {
  const late = new LateResults();
  const text = spec(tier);
  const analysis = analyzeDocument(text, {}, late);
  const request = analysis.computation({ kind: 'fragment', index: 0 }).activeSpace!;
  const outcome = run(request, late) as ActiveSpaceOutcome;
  return { analysis, text, outcome };
}

describe('the computed active space in the editor', () => {
  it('before the result: the counted estimate and that the orbitals are not computed (by construction)', () => {
    const analysis = analyzeDocument(spec('active shells o 2p'), {}, new LateResults());
    const section = activeSpaceSection(analysis, 0)!;
    expect(section).toContain('Counted until computed (planning estimate): 4e 3o');
    expect(section).toContain('not computed yet');
  });

  it('lists the chosen orbitals: the water HOMO 1b1 is an O p lone pair (from memory: the nonbonding orbital of the textbook diagram)', () => {
    const { analysis, outcome } = computed('active 4e 4o');
    const section = activeSpaceSection(analysis, 0)!;
    expect(section).toContain('**Active orbitals** (computed): 4e 4o, 3 frozen below');
    const homo = outcome.details.find((d) => d.occupation === 2 && d.irrep === 'B1')!;
    expect(section).toContain(`| ${homo.index + 1} | −${Math.abs(homo.energy!).toFixed(4)} | 2 | B1 | o (#1) p`);
  });

  it('writes the suggestion per irrep; the per-irrep counts add up to the orbitals chosen (by construction)', () => {
    const { analysis, text, outcome } = computed('active shells o p');
    const written = perIrrepText(outcome);
    expect(written).toMatch(/^active \d+e( [AB][12]=\d+)+$/);
    const total = [...written.matchAll(/=(\d+)/g)].reduce((sum, m) => sum + Number(m[1]), 0);
    expect(total).toBe(outcome.active.length);
    const at = text.indexOf('active shells');
    const position = analysis.lines.positionAt(at + 2);
    const actions = activeSpaceActions(analysis, 'file:///w.tess', { start: position, end: position });
    expect(actions).toHaveLength(1);
    const change = actions[0]!.edit!.changes!['file:///w.tess']![0]!;
    expect(change.newText).toBe(written);
    expect(analysis.lines.offsetAt(change.range.start)).toBe(at);
  });

  it('shows the section in the hover on `active`', () => {
    const { analysis, text } = computed('active 4e 4o');
    const hover = doHover(analysis, analysis.lines.positionAt(text.indexOf('active 4e') + 1));
    const value = (hover?.contents as { value: string }).value;
    expect(value).toContain('**Active orbitals** (computed)');
  });
});
