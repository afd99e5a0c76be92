/**
 * Plan variants: each `variant` block becomes a spec of its own, analysed like any spec, and the
 * plans are compared side by side (analysis/figures/compare.ts, `tessera compare`).
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeDocument, comparePlans, specPlans } from '../../server/src/analysis';
import { parseSpec } from '../../server/src/language/parser';
import { variantTexts } from '../../server/src/language/variants';
import { renderCompareCsv, renderCompareHtml, renderCompareMarkdown } from '../../server/src/report/format/compare';
import { root, run } from '../cli/harness';

const SAMPLE = 'samples/launch/ethane-plan-variants.tess';
const sampleText = () => readFileSync(path.join(root, SAMPLE), 'utf8');

/** Water at Hoy & Bunker's structure (1979), placed as in tests/fixtures/water.ts. */
const WATER = `structure {
  O  o    0.000000   0.000000   0.000000
  H  h1   0.000000   0.756950   0.585882
  H  h2   0.000000  -0.756950   0.585882
}`;

const BASE = `basis sto-3g\n${WATER}\nfragment w {\n  atoms rest\n  tier quantum { method vqe; mapping jordan-wigner; active 4e 4o }\n}\nembedding none\n`;

function textsOf(spec: string) {
  return variantTexts(spec, parseSpec(spec));
}

describe('the text of a variant', () => {
  it('patches a tier of the same level key by key and keeps the rest of the spec', () => {
    const [variant] = textsOf(`${BASE}variant bk {\n  fragment w { tier quantum { mapping bravyi-kitaev; taper on } }\n}\n`);
    expect(variant!.name).toBe('bk');
    expect(variant!.text).toContain('tier quantum { method vqe; mapping bravyi-kitaev; active 4e 4o \ntaper on\n}');
    expect(variant!.text).not.toContain('variant');
    expect(variant!.text).toContain('embedding none');
  });

  it('replaces a tier of another level, a top-level setting, and adds override lines and new fragments', () => {
    const spec = `${BASE}variant classical {\n  fragment w { tier correlated { method ccsd } }\n  embedding dmet\n  basis 6-31g on all H\n}\n`;
    const text = textsOf(spec)[0]!.text;
    expect(text).toContain('tier correlated { method ccsd }');
    expect(text).not.toContain('tier quantum');
    expect(text).toContain('embedding dmet');
    expect(text).not.toContain('embedding none');
    expect(text).toMatch(/basis 6-31g on all H\n$/);
  });

  it('analyses a variant exactly as the spec written out by hand', () => {
    const analysis = analyzeDocument(`${BASE}variant wide {\n  fragment w { tier quantum { active 6e 6o } }\n}\n`);
    const variant = analysis.variants()[0]!.analysis;
    const byHand = analyzeDocument(BASE.replace('active 4e 4o', 'active 6e 6o'));
    expect(variant.fragmentFigures(0)).toEqual(byHand.fragmentFigures(0));
    // Jordan–Wigner: one qubit per spin orbital, 2 × 6 (Seeley, Richard & Love, J. Chem. Phys. 137, 224109 (2012)).
    expect(variant.fragmentFigures(0).qubits!.jordanWigner).toBe(12);
    expect(analysis.fragmentFigures(0).qubits!.jordanWigner).toBe(8);
  });

  it('checks each variant like a spec of its own, reporting its errors at its name', () => {
    // Water in STO-3G has 7 orbitals (O [2s1p] 5 + 2 × H [1s]; Hehre, Stewart & Pople 1969): 9 do not fit.
    const analysis = analyzeDocument(`${BASE}variant too-wide {\n  fragment w { tier quantum { active 8e 9o } }\n}\n`);
    const problem = analysis.diagnostics.find((d) => d.code === 'variant-problem')!;
    expect(analysis.text.slice(problem.span.start, problem.span.end)).toBe('too-wide');
    expect(problem.message).toMatch(/7 orbitals|9 orbitals|9o/);
    expect(analysis.counts().errors).toBe(1);
  });

  it('takes another cut when a variant gives fragments other atoms', () => {
    const pair = `basis sto-3g\n${WATER.replace('\n}', '\n  O  p    5.000000   0.000000   0.000000\n  H  g1   5.000000   0.756950   0.585882\n  H  g2   5.000000  -0.756950   0.585882\n}')}
fragment a { atoms o h1 h2; tier mean-field { method rhf } }
fragment b { atoms p g1 g2; tier mean-field { method rhf } }
variant proton-moved {
  fragment a { atoms o h1; charge -1 }
  fragment b { atoms h2 p g1 g2; charge +1 }
}
`;
    const analysis = analyzeDocument(pair);
    const cut = analysis.variants()[0]!.analysis;
    // Hydroxide: 8 + 1 + 1 = 10 electrons; H3O+ across the gap: 1 + 8 + 1 + 1 − 1 = 10.
    expect([cut.fragmentFigures(0).electrons, cut.fragmentFigures(1).electrons]).toEqual([10, 10]);
    expect([cut.fragmentFigures(0).formula, cut.fragmentFigures(1).formula]).toEqual(['HO', 'H3O']);
    expect(comparePlans(specPlans(analysis, 'pair')).differingInputs).toEqual(['fragment a: atoms', 'fragment b: atoms']);
  });

  it('does not keep the previous version alive through the options its variants reuse', () => {
    const first = analyzeDocument(BASE);
    const second = analyzeDocument(`${BASE}variant a { embedding dmet }\n`, { previous: first });
    expect('previous' in second.options).toBe(false);
    expect(second.variants()[0]!.analysis.model.embedding).toBe('dmet');
  });

  it('keeps a variant block open across the top-level statements it holds', () => {
    const analysis = analyzeDocument(`${BASE}variant two {\n  fragment w {\n    tier quantum { taper on }\n  }\n  embedding dmet\n}\n`);
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(analysis.variants()[0]!.analysis.model.embedding).toBe('dmet');
  });
});

describe('plans compared', () => {
  const analysis = analyzeDocument(sampleText(), { path: path.join(root, SAMPLE) });
  const comparison = comparePlans(specPlans(analysis, 'ethane'));

  it('sizes every variant of the sample, with the inputs that differ', () => {
    expect(comparison.plans.map((plan) => plan.variant)).toEqual([null, 'wide-active', 'bravyi-kitaev', 'no-tapering']);
    const [base, wide, bk, untapered] = comparison.plans;
    // Untapered Jordan–Wigner needs 2n qubits for n = 4 active orbitals (Seeley et al. 2012).
    expect(untapered!.qubits).toBe(8);
    // Tapering removes at least the two number-parity symmetries (Bravyi et al. 2017): ≤ 2n − 2.
    expect(base!.qubits).toBeLessThanOrEqual(6);
    expect(wide!.qubits).toBeLessThanOrEqual(10);
    // Bravyi–Kitaev and Jordan–Wigner encode on the same 2n qubits with the same number of
    // distinct Pauli strings (Seeley et al. 2012, Clifford-related encodings).
    expect(bk!.qubits).toBe(base!.qubits);
    expect(bk!.pauliTerms).toBe(base!.pauliTerms);
    expect(comparison.differingInputs).toEqual(['fragment left: active', 'fragment left: mapping', 'fragment left: taper']);
    expect(comparison.plans.every((plan) => plan.errors === 0 && plan.shots === null)).toBe(true);
  });

  it('marks the plan with the fewest CNOTs under the limits as the best', () => {
    const cnots = comparison.plans.map((plan) => plan.cnots!);
    expect(comparison.best).toBe(cnots.indexOf(Math.min(...cnots)));
    expect(comparison.plans.filter((plan) => plan.best)).toHaveLength(1);
    // A qubit limit below a plan's need takes it out of the running.
    const limited = comparePlans(comparison.plans.map((plan) => ({ ...plan, withinLimits: plan.variant === 'wide-active' })));
    expect(limited.plans[limited.best!]!.variant).toBe('wide-active');
  });

  it('renders Markdown with the differing inputs in bold, CSV with a row per plan, HTML with a chart', () => {
    const markdown = renderCompareMarkdown(comparison);
    expect(markdown).toContain('| **fragment left: mapping** | **jordan-wigner** | **jordan-wigner** | **bravyi-kitaev** | **jordan-wigner** |');
    expect(markdown).toContain('| ethane (best) |');
    const csv = renderCompareCsv(comparison).split('\r\n').filter(Boolean);
    expect(csv).toHaveLength(5);
    expect(csv[0]).toBe('plan,spec,variant,best,errors,qubits,pauliTerms,measurementGroups,shots,parameters,cnots,memory,classicalSeconds,withinLimits,differing inputs,note');
    const html = renderCompareHtml(comparison);
    expect(html).toContain('<svg');
    expect(html).toContain('class="differs"');
    expect(html).toContain('limit 12 qubits');
  });

  it('escapes names from the spec in every format', () => {
    const odd = comparePlans([{ ...comparison.plans[0]!, label: '<b>x</b> | *y*', spec: '<b>x</b>', variant: 'a,"b"' }]);
    expect(renderCompareHtml(odd)).not.toContain('<b>x</b>');
    expect(renderCompareMarkdown(odd)).toContain('\\|');
    expect(renderCompareCsv(odd)).toContain('"a,""b"""');
  });
});

describe('tessera compare', () => {
  it('compares a spec with its variants, and two specs side by side', async () => {
    const one = await run(['compare', SAMPLE]);
    expect(one.code, one.stderr).toBe(0);
    expect(one.stdout).toContain('ethane-plan-variants / no-tapering');
    const two = await run(['compare', 'samples/launch/ethane-capped-methyls.tess', SAMPLE, '--format', 'csv']);
    expect(two.code, two.stderr).toBe(0);
    expect(two.stdout.split('\r\n').filter(Boolean)).toHaveLength(1 + 1 + 4);
  });

  it('refuses three specs and an unknown format with the usage exit code', async () => {
    expect((await run(['compare', SAMPLE, SAMPLE, SAMPLE])).code).toBe(2);
    expect((await run(['compare', SAMPLE, '--format', 'pdf'])).code).toBe(2);
    expect((await run(['compare'])).code).toBe(2);
  });
});
