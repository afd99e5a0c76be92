/** The basis: chosen, known, and defining every element it is asked to cover. */
import { allBasisSets, basisSetsCovering, type BasisSet } from '../../chemistry/basis/library';
import { suggest } from '../suggest';
import type { Span } from '../text';
import { listSome, shortAtomName, type CheckContext } from './context';

function reportUnknown(context: CheckContext, name: string, span: Span): void {
  const names = allBasisSets().map((basis) => basis.displayName);
  const suggestion = suggest(name, names);
  context.sink.report(
    'unknown-basis',
    span,
    `'${name}' is not in the basis-set library.${suggestion ? ` Did you mean '${suggestion}'?` : ''} Known: ${names.join(', ')}.`,
    suggestion ? { data: { replacement: suggestion } } : {},
  );
}

export function checkBasis(context: CheckContext): void {
  const { ast, model, sink } = context;
  if (model.atoms.length === 0) return;
  const elements = [...new Set(model.atoms.map((atom) => atom.element.symbol))];
  if (!ast.basis) {
    const covering = basisSetsCovering(elements).map((basis) => basis.displayName);
    sink.report(
      'missing-basis',
      ast.geometry?.statement.keyword.span ?? { start: 0, end: 0 },
      `No basis set is chosen: add a line such as \`basis ${covering[0] ?? 'def2-SVP'}\`.${covering.length > 0 ? ` Bases that cover every element here: ${listSome(covering, 6)}.` : ''}`,
    );
    return;
  }
  const basisAst = ast.basis;
  if (basisAst.name && !model.basis.main) reportUnknown(context, basisAst.name.value, basisAst.name.span);
  for (const override of basisAst.overrides) {
    if (!model.basis.overrides.has(override.element.value)) reportUnknown(context, override.basis.value, override.basis.span);
    else if (!elements.includes(override.element.value)) {
      sink.report('setting-ignored', override.element.span, `There are no ${override.element.value} atoms in the geometry; this override has no effect.`);
    }
  }
  for (const symbol of elements) {
    const override = basisAst.overrides.find((o) => o.element.value === symbol);
    const set: BasisSet | undefined = model.basis.overrides.get(symbol) ?? (override ? undefined : model.basis.main);
    if (!set || set.shellsFor(symbol)) continue;
    const atoms = model.atoms.filter((atom) => atom.element.symbol === symbol);
    const covering = basisSetsCovering([symbol]).map((basis) => basis.displayName);
    const span = override?.basis.span ?? basisAst.name?.span ?? basisAst.statement.keyword.span;
    sink.report(
      'basis-missing-element',
      span,
      `${set.displayName} has no functions for ${symbol} (${atoms.length} atom${atoms.length === 1 ? '' : 's'}: ${listSome(atoms.map(shortAtomName), 5)}). ` +
        (covering.length > 0
          ? `Bases that define ${symbol}: ${listSome(covering, 6)}; or add \`${symbol} = ${covering[0]}\` to the basis block.`
          : `No basis in the library defines ${symbol}.`),
      { data: { element: symbol, candidates: covering } },
    );
  }
}
