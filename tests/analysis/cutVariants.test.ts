/**
 * samples/launch/ethanol-two-cuts.tess: one ethanol cut at the C–C bond (the spec) and at the C–O
 * bond (variant `cut-at-co`), both capped, compared side by side; and
 * samples/launch/ethanol-cut-reuse.tess, which takes that structure and cut with `with fragments`.
 * Electron counts from the atomic numbers (C 6, O 8, H 1) with one hydrogen cap per cut bond.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeDocument, comparePlans, specPlans } from '../../server/src/analysis';
import { root, run } from '../cli/harness';

const TWO_CUTS = 'samples/launch/ethanol-two-cuts.tess';
const REUSE = 'samples/launch/ethanol-cut-reuse.tess';

function analyseSample(file: string) {
  const absolute = path.join(root, file);
  return analyzeDocument(readFileSync(absolute, 'utf8'), { path: absolute });
}

describe('ethanol cut in two places', () => {
  const analysis = analyseSample(TWO_CUTS);
  const variant = analysis.variants().find((v) => v.name === 'cut-at-co')!.analysis;

  it('cuts at C–C: a capped methyl (CH4, 10 electrons) and a capped CH2OH head (CH3OH, 18 electrons)', () => {
    const [tail, head] = [analysis.fragmentFigures(0), analysis.fragmentFigures(1)];
    expect([tail.formula, tail.electrons, tail.caps?.count]).toEqual(['CH4', 10, 1]);
    expect([head.formula, head.electrons, head.caps?.count]).toEqual(['CH4O', 18, 1]);
  });

  it('cuts at C–O in the variant: a capped ethyl (C2H6, 18 electrons) and a capped hydroxyl (H2O, 10 electrons)', () => {
    expect(variant.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const [tail, head] = [variant.fragmentFigures(0), variant.fragmentFigures(1)];
    expect([tail.formula, tail.electrons, tail.caps?.count]).toEqual(['C2H6', 18, 1]);
    expect([head.formula, head.electrons, head.caps?.count]).toEqual(['H2O', 10, 1]);
    // The same 4e 4o active space: 8 qubits under Jordan–Wigner (one per spin orbital) in both cuts.
    expect(head.qubits?.jordanWigner).toBe(8);
    expect(analysis.fragmentFigures(1).qubits?.jordanWigner).toBe(8);
  });

  it('compares the two cuts: only the atoms of the fragments differ', () => {
    const comparison = comparePlans(specPlans(analysis, analysis.model.name!));
    expect(comparison.plans.map((plan) => plan.label)).toEqual(['ethanol-two-cuts', 'ethanol-two-cuts / cut-at-co']);
    expect(comparison.differingInputs).toEqual(['fragment tail: atoms', 'fragment head: atoms']);
    expect(comparison.best).not.toBeNull();
  });

  it('passes tessera check, as do the plan that reuses its cut', async () => {
    const result = await run(['check', TWO_CUTS, REUSE]);
    expect(result.code, result.stdout + result.stderr).toBe(0);
  });
});

describe('a plan that takes the structure and the cut from ethanol-two-cuts.tess', () => {
  const analysis = analyseSample(REUSE);

  it('has the included fragments with the head patched to 6e 6o, in its own basis', () => {
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(analysis.model.fragments.map((f) => [f.name, f.atoms.length, f.ast.included?.patched])).toEqual([
      ['tail', 4, false],
      ['head', 5, true],
    ]);
    const head = analysis.model.fragments[1]!;
    expect(head.tier?.method).toBe('vqe');
    expect(head.tier?.active).toEqual({ electrons: 6, orbitals: 6 });
    // 6 spatial orbitals under Jordan–Wigner: 12 qubits (Jordan & Wigner 1928).
    expect(analysis.fragmentFigures(1).qubits?.jordanWigner).toBe(12);
    // The caps come with the cut (the base's top-level `caps hydrogen fixed`): capped methanol, 18 electrons.
    expect(analysis.fragmentFigures(1).electrons).toBe(18);
    expect(analysis.model.basis.main?.displayName).toBe('cc-pVDZ');
  });
});
