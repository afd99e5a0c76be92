/**
 * Atom selectors, unresolved: `zn n1..n4 #3 #3..#9 all H closer-than 3.0 to zn rest`. Fragments use
 * them after `atoms`; basis override lines after `on`, where `fragment <name>` also selects and
 * `rest` does not (it means the atoms no fragment claims, which only fragments can ask for).
 */
import { elementBySymbol } from '../../chemistry/elements';
import type { BasisTargetAst, SelectorAst } from '../ast';
import type { Argument, Statement } from '../syntax';
import { joinSpans } from '../text';
import type { StatementReader } from './reader';

const EXAMPLES = 'labels, #indices, ranges like n1..n4, `all H`, `closer-than 3.0 to zn`';

/** `atoms …` of a fragment. */
export function readSelectors(reader: StatementReader, statement: Statement): SelectorAst[] {
  if (statement.args.length === 0) {
    reader.sink.report('missing-value', statement.keyword.span, `List the atoms: ${EXAMPLES} or \`rest\`.`);
  }
  return readSelectorList(reader, statement.args, 'fragment') as SelectorAst[];
}

/** The targets after `on` in `basis <name> on …`. */
export function readBasisTargets(reader: StatementReader, args: readonly Argument[]): BasisTargetAst[] {
  return readSelectorList(reader, args, 'basis');
}

/** Atoms named inside another statement (`active shells Fe1 3d`): the fragment selectors but `rest`. */
export function readAtomSelectors(reader: StatementReader, args: readonly Argument[]): SelectorAst[] {
  return (readSelectorList(reader, args, 'fragment') as SelectorAst[]).filter((selector) => {
    if (selector.kind !== 'rest') return true;
    reader.sink.report('invalid-selector', selector.span, '`rest` selects the atoms no fragment claims; name atoms here: labels, #indices, ranges or `all <Element>`.');
    return false;
  });
}

function readSelectorList(reader: StatementReader, args: readonly Argument[], context: 'fragment' | 'basis'): BasisTargetAst[] {
  const sink = reader.sink;
  const selectors: BasisTargetAst[] = [];
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg.kind === 'word' && arg.text === 'rest') {
      if (context === 'basis') {
        sink.report('invalid-selector', arg.span, '`rest` selects the atoms no fragment claims and belongs to fragments; a basis line names atoms, `all <Element>` or `fragment <name>`.');
        continue;
      }
      selectors.push({ kind: 'rest', span: arg.span });
    } else if (arg.kind === 'word' && arg.text === 'fragment' && context === 'basis') {
      const next = args[i + 1];
      if (!next || next.kind !== 'word') {
        sink.report('invalid-selector', next ? joinSpans(arg.span, next.span) : arg.span, '`fragment` is followed by a fragment name: `on fragment guest`.');
        if (next) i++;
        continue;
      }
      i++;
      selectors.push({ kind: 'fragment', name: { value: next.text, span: next.span }, span: joinSpans(arg.span, next.span) });
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
    } else if (arg.kind === 'word' && (arg.text === 'closer-than' || arg.text === 'within')) {
      // `within <d> of <atom>` is the retired spelling of `closer-than <d> to <atom>` (at most d
      // instead of strictly less); it is still read, and reported by migrate.ts.
      const retired = arg.text === 'within';
      const link = retired ? 'of' : 'to';
      const distanceArg = args[i + 1];
      const linkArg = args[i + 2];
      const targetArg = args[i + 3];
      const distance = distanceArg?.kind === 'number' ? Number(distanceArg.text) : NaN;
      if (!Number.isFinite(distance) || distance < 0 || linkArg?.kind !== 'word' || linkArg.text !== link || !targetArg) {
        const end = args[Math.min(i + 3, args.length - 1)]!.span;
        sink.report('invalid-selector', joinSpans(arg.span, end), 'Write `closer-than <distance> to <atom>`, for example `closer-than 3.0 to zn` (strictly closer; the distance in the structure\'s unit).');
        i += 3;
        continue;
      }
      const to = reader.atomRef(targetArg, targetArg.span);
      i += 3;
      if (to) selectors.push({ kind: 'closer-than', distance, to, inclusive: retired, span: joinSpans(arg.span, targetArg.span) });
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
