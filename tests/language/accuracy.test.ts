/**
 * The measurement settings of the language: `accuracy <value> <unit>` at the top and in a tier,
 * `steps <n>` in a tier, `shot-rate <n>` in `limits`. Unit factors: CODATA 2018 (Tiesinga et al.,
 * Rev. Mod. Phys. 93, 025010 (2021)): 1 Eh = 627.5094740631 kcal/mol = 2625.4996394799 kJ/mol =
 * 27.211386245988 eV. The default 1.6 mHa is chemical accuracy (common practice).
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/language/analyze';

function spec(top: string, tier: string, limits = ''): string {
  return [
    'basis STO-3G',
    top,
    'structure {',
    '  H a 0 0 0',
    '  H b 0 0 0.7414',
    '}',
    limits,
    'fragment f {',
    '  atoms a b',
    `  tier ${tier}`,
    '}',
  ].join('\n');
}

describe('accuracy', () => {
  it.each([
    ['1.6 mHa', 1.6e-3], // by definition of the unit
    ['0.002 Ha', 2e-3], // by definition of the unit
    ['1 kcal/mol', 1 / 627.5094740631], // CODATA 2018
    ['4.184 kJ/mol', 4.184 / 2625.4996394799], // CODATA 2018
    ['0.05 eV', 0.05 / 27.211386245988], // CODATA 2018
  ])('accuracy %s is %f Ha (CODATA 2018)', (text, hartree) => {
    const { model, diagnostics } = analyze(spec(`accuracy ${text}`, 'quantum { active 2e 2o }'));
    expect(diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(model.accuracy).toBeCloseTo(hartree, 15);
    expect(model.accuracyGiven).toBe(true);
  });

  it('defaults to chemical accuracy, 1.6 mHa (common practice); a tier may set its own', () => {
    const { model } = analyze(spec('', 'quantum { active 2e 2o; accuracy 0.5 mHa; steps 40 }', 'limits { shot-rate 2500 }'));
    expect(model.accuracy).toBe(1.6e-3); // common practice
    expect(model.accuracyGiven).toBe(false);
    expect(model.fragments[0]!.tier!.accuracy).toBeCloseTo(5e-4, 15); // by construction: 0.5 mHa
    expect(model.fragments[0]!.tier!.steps).toBe(40); // by construction
    expect(model.limits.shotRate).toBe(2500); // by construction
  });

  it('a variational run takes 100 steps unless the tier says otherwise (an assumption, by definition of the default)', () => {
    const { model } = analyze(spec('', 'quantum { active 2e 2o }'));
    expect(model.fragments[0]!.tier!.steps).toBe(100); // by definition of DEFAULT_VQE_STEPS
    expect(model.fragments[0]!.tier!.stepsGiven).toBe(false);
  });

  it.each([
    ['accuracy', 'missing-value', 'Give an energy and its unit'],
    ['accuracy 1.6', 'invalid-value', 'Add a unit'],
    ['accuracy 1 kcal', 'invalid-value', "Unknown energy unit 'kcal'"],
    ['accuracy -1 mHa', 'invalid-value', 'must be a positive number'],
    ['accuracy fine mHa', 'invalid-value', "'fine' is not a number"],
    ['accuracy 1 mHa extra', 'invalid-value', 'a number and a unit, nothing more'],
  ])('%s: %s, saying what is wrong', (text, code, message) => {
    const { diagnostics } = analyze(spec(text, 'quantum { active 2e 2o }'));
    const found = diagnostics.find((d) => d.code === code);
    expect(found?.message).toContain(message);
  });

  it('a shot rate must be a positive number; steps a whole number of at least 1', () => {
    const bad = analyze(spec('', 'quantum { active 2e 2o; steps 0 }', 'limits { shot-rate 0 }'));
    expect(bad.diagnostics.map((d) => d.code)).toEqual(['invalid-value', 'invalid-value']);
  });

  it('accuracy and steps outside the quantum tier, and steps with qpe, are reported as having no effect', () => {
    const correlated = analyze(spec('', 'correlated { method ccsd; accuracy 1 mHa; steps 10 }'));
    expect(correlated.diagnostics.filter((d) => d.code === 'setting-ignored').map((d) => d.message.split("'")[1])).toEqual(['accuracy', 'steps']);
    const qpe = analyze(spec('', 'quantum { method qpe; active 2e 2o; steps 10 }'));
    expect(qpe.diagnostics.find((d) => d.code === 'setting-ignored')?.message).toContain('no optimisation steps');
  });
});
