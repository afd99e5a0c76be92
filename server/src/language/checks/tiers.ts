/** Tier settings: methods of the right tier, settings that only some tiers use, and a tier for every fragment. */
import { METHODS, methodsForTier } from '../vocabulary';
import type { CheckContext } from './context';

export function checkTiers(context: CheckContext): void {
  const { model, sink } = context;
  for (const fragment of model.fragments) {
    const tierAst = fragment.ast.tier;
    if (!tierAst) {
      if (fragment.ast.statement.block) {
        sink.report('missing-tier', fragment.ast.name?.span ?? fragment.ast.statement.keyword.span, `Fragment '${fragment.name}' has no tier, so no cost is estimated for it: add for example \`tier mean-field { method rhf }\`.`);
      }
      continue;
    }
    const tier = fragment.tier;
    if (!tier) continue;
    const method = tierAst.method;
    if (method) {
      const info = METHODS.find((m) => m.name === method.value);
      if (info && info.tier !== tier.level) {
        const allowed = methodsForTier(tier.level).map((m) => m.name);
        sink.report('method-tier-mismatch', method.span, `'${method.value}' is a ${info.tier}-tier method, but this tier is ${tier.level}. Methods of the ${tier.level} tier: ${allowed.join(', ')}.`, {
          data: { replacement: allowed[0] },
        });
      }
    }
    const quantumOnly = [
      ['ansatz', tierAst.ansatz?.span],
      ['mapping', tierAst.mapping?.span],
      ['taper', tierAst.taper?.span],
      ['layers', tierAst.layers?.span],
      ['accuracy', tierAst.accuracy?.span],
      ['steps', tierAst.steps?.span],
    ] as const;
    if (tier.level !== 'quantum') {
      for (const [word, span] of quantumOnly) {
        if (span) sink.report('setting-ignored', span, `'${word}' applies to quantum-tier fragments only; this tier is ${tier.level}, so it has no effect.`);
      }
    } else if (tier.method === 'qpe') {
      if (tierAst.ansatz) sink.report('setting-ignored', tierAst.ansatz.span, 'Phase estimation prepares no variational ansatz; the ansatz has no effect with method qpe.');
      if (tierAst.steps) sink.report('setting-ignored', tierAst.steps.span, 'Phase estimation has no optimisation steps; `steps` counts the steps of a variational run and has no effect with method qpe.');
    }
    if (tierAst.layers && tier.ansatz && !['k-upccgsd', 'hardware-efficient'].includes(tier.ansatz)) {
      sink.report('setting-ignored', tierAst.layers.span, `'layers' sets k of k-upccgsd or the depth of a hardware-efficient ansatz; it has no effect with ${tier.ansatz}.`);
    }
    if (tierAst.active && tier.level === 'mean-field') {
      sink.report('setting-ignored', tierAst.active.span, 'A mean-field tier treats all electrons in all orbitals; the active space has no effect here.');
    }
  }
}
