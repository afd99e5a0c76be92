/**
 * Parse plus full check of generated specs with 100, 1,000 and 10,000 atoms, against JSON.parse
 * of the same coordinates in the same run. Targets: 10,000 atoms under 50 ms, within 10× of
 * JSON.parse, linear growth.
 */
import { analyze } from '../server/src/language/analyze';
import { waterBoxSpec } from './generate';
import { ms, time } from './timing';

export function benchAnalysis(): string[] {
  const lines = ['## Parse and check', '', '| atoms | analyze median | p95 | JSON.parse median | ratio | µs per atom |', '| ---: | ---: | ---: | ---: | ---: | ---: |'];
  for (const target of [100, 1_000, 10_000]) {
    const spec = waterBoxSpec(target);
    const runs = target >= 10_000 ? 40 : 100;
    const analysis = analyze(spec.text);
    const errors = analysis.diagnostics.filter((d) => d.severity === 'error');
    if (errors.length > 0) throw new Error(`generated spec has errors: ${errors[0]!.message}`);
    const ours = time(() => analyze(spec.text), runs);
    const json = time(() => JSON.parse(spec.json), runs);
    lines.push(
      `| ${spec.atoms} | ${ms(ours.median)} | ${ms(ours.p95)} | ${ms(json.median)} | ${(ours.median / json.median).toFixed(1)}× | ${((ours.median * 1000) / spec.atoms).toFixed(2)} |`,
    );
  }
  lines.push('', 'Targets: 10,000 atoms under 50 ms and within 10× of JSON.parse; µs per atom roughly constant (linear growth).');
  return lines;
}
