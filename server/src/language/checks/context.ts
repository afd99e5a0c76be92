/** What every check receives: the typed tree, the model, and where to put diagnostics. */
import type { SpecAst } from '../ast';
import type { DiagnosticSink } from '../diagnostics';
import type { AtomModel, SpecModel } from '../model';
import type { Span } from '../text';

export interface CheckContext {
  readonly ast: SpecAst;
  readonly model: SpecModel;
  readonly sink: DiagnosticSink;
}

export type Check = (context: CheckContext) => void;

/** `#3 zn` or `#3 (Zn)`: how atoms are named in messages. */
export function atomName(atom: AtomModel): string {
  return atom.label ? `${atom.label} (#${atom.index + 1} ${atom.element.symbol})` : `#${atom.index + 1} ${atom.element.symbol}`;
}

export function shortAtomName(atom: AtomModel): string {
  return atom.label ?? `#${atom.index + 1}`;
}

/** Lists at most `limit` items and says how many more there are. */
export function listSome(items: readonly string[], limit = 8): string {
  if (items.length <= limit) return items.join(', ');
  return `${items.slice(0, limit).join(', ')} and ${items.length - limit} more`;
}

/** Where a whole-document problem is shown when no better place exists: the first statement. */
export function documentStart(ast: SpecAst): Span {
  const first = ast.statements[0];
  return first ? first.keyword.span : { start: 0, end: 0 };
}

export function signed(value: number): string {
  return value > 0 ? `+${value}` : `${value}`;
}
