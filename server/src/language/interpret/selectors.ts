/** `atoms zn n1..n4 #3 #3..#9 all H within 3.0 of zn rest`: the selectors of a fragment, unresolved. */
import { elementBySymbol } from '../../chemistry/elements';
import type { SelectorAst } from '../ast';
import type { Statement } from '../syntax';
import { joinSpans } from '../text';
import type { StatementReader } from './reader';

export function readSelectors(reader: StatementReader, statement: Statement): SelectorAst[] {
  const sink = reader.sink;
  const args = statement.args;
  const selectors: SelectorAst[] = [];
  if (args.length === 0) {
    sink.report('missing-value', statement.keyword.span, 'List the atoms: labels, #indices, ranges like n1..n4, `all H`, `within 3.0 of zn` or `rest`.');
  }
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg.kind === 'word' && arg.text === 'rest') {
      selectors.push({ kind: 'rest', span: arg.span });
    } else if (arg.kind === 'word' && arg.text === 'all') {
      const next = args[i + 1];
      const element = next && next.kind === 'word' ? elementBySymbol(next.text) : undefined;
      if (!element) {
        sink.report('invalid-selector', next ? joinSpans(arg.span, next.span) : arg.span, '`all` is followed by an element symbol: `all H`.');
        if (next && next.kind === 'word') i++;
        continue;
      }
      i++;
      selectors.push({ kind: 'element', element: element.symbol, span: joinSpans(arg.span, next!.span) });
    } else if (arg.kind === 'word' && arg.text === 'within') {
      const distanceArg = args[i + 1];
      const ofArg = args[i + 2];
      const targetArg = args[i + 3];
      const distance = distanceArg?.kind === 'number' ? Number(distanceArg.text) : NaN;
      if (!Number.isFinite(distance) || distance < 0 || ofArg?.kind !== 'word' || ofArg.text !== 'of' || !targetArg) {
        const end = args[Math.min(i + 3, args.length - 1)]!.span;
        sink.report('invalid-selector', joinSpans(arg.span, end), 'Write `within <distance> of <atom>`, for example `within 3.0 of zn` (distance in the file\'s unit).');
        i += 3;
        continue;
      }
      const of = reader.atomRef(targetArg, targetArg.span);
      i += 3;
      if (of) selectors.push({ kind: 'within', distance, of, span: joinSpans(arg.span, targetArg.span) });
    } else if (arg.kind === 'range') {
      sink.report('invalid-selector', arg.span, "A range needs an atom on each side of '..': `n1..n4` or `#3..#9`.");
    } else {
      const from = reader.atomRef(arg, arg.span);
      if (!from) continue;
      if (args[i + 1]?.kind === 'range') {
        const to = reader.atomRef(args[i + 2], args[i + 1]!.span);
        i += to ? 2 : 1;
        if (to) selectors.push({ kind: 'range', from, to, span: joinSpans(from.span, to.span) });
      } else {
        selectors.push(from);
      }
    }
  }
  return selectors;
}
