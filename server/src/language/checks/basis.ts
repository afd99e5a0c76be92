/**
 * The basis: chosen, known, defining every element of the atoms it is given to; and override
 * lines that change something (the precedence rule is in model/basis.ts).
 */
import { allBasisSets, basisSetsCovering, type BasisSet } from '../../chemistry/basis/library';
import { describeTarget, type BasisOverrideAst } from '../ast';
import type { RelatedInformation } from '../diagnostics';
import { BASIS_RANK_NAMES, type BasisOverrideModel } from '../model';
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

/** `basis def2-TZVP on all Zn`, as a message quotes a line. */
export function overrideText(line: BasisOverrideAst): string {
  return `basis ${line.name?.value ?? '?'} on ${line.targets.map(describeTarget).join(' ')}`;
}

export function checkBasis(context: CheckContext): void {
  const { ast, model, sink } = context;
  if (model.atoms.length === 0) return;
  const elements = [...new Set(model.atoms.map((atom) => atom.element.symbol))];
  if (!ast.basis) {
    const covering = basisSetsCovering(elements).map((basis) => basis.displayName);
    sink.report(
      'missing-basis',
      ast.basisOverrides[0]?.statement.keyword.span ?? ast.geometry?.statement.keyword.span ?? { start: 0, end: 0 },
      `No main basis set is chosen: add a line such as \`basis ${covering[0] ?? 'def2-SVP'}\`.${covering.length > 0 ? ` Bases that cover every element here: ${listSome(covering, 6)}.` : ''}`,
    );
    return;
  }
  if (ast.basis.name && !model.basis.main) reportUnknown(context, ast.basis.name.value, ast.basis.name.span);
  for (const line of model.basis.overrides) if (line.ast.name && !line.set) reportUnknown(context, line.ast.name.value, line.ast.name.span);
  checkCoverage(context);
  checkOverrides(context);
}

/** Every atom's basis defines its element: one report per basis line and element. */
function checkCoverage(context: CheckContext): void {
  const { ast, model, sink } = context;
  const missing = new Map<string, { set: BasisSet; symbol: string; line: number; atoms: number[] }>();
  for (const atom of model.atoms) {
    const set = model.basis.atomSets[atom.index];
    if (!set || set.shellsFor(atom.element.symbol)) continue;
    const line = model.basis.decidedBy[atom.index]!;
    const key = `${line}:${atom.element.symbol}`;
    const entry = missing.get(key);
    if (entry) entry.atoms.push(atom.index);
    else missing.set(key, { set, symbol: atom.element.symbol, line, atoms: [atom.index] });
  }
  for (const { set, symbol, line, atoms } of missing.values()) {
    const covering = basisSetsCovering([symbol]).map((basis) => basis.displayName);
    const decider = line >= 0 ? model.basis.overrides[line]!.ast : ast.basis!;
    const span = decider.name?.span ?? decider.statement.keyword.span;
    const names = atoms.map((atom) => shortAtomName(model.atoms[atom]!));
    sink.report(
      'basis-missing-element',
      span,
      `${set.displayName} has no functions for ${symbol} (${atoms.length} atom${atoms.length === 1 ? '' : 's'}: ${listSome(names, 5)}). ` +
        (covering.length > 0
          ? `Bases that define ${symbol}: ${listSome(covering, 6)}; or add the line \`basis ${covering[0]} on all ${symbol}\`.`
          : `No basis in the library defines ${symbol}.`),
      { data: { element: symbol, candidates: covering, line, atoms } },
    );
  }
}

/**
 * Override lines that change nothing: every atom they select takes its basis from another line
 * (a more specific one, or a later one of the same kind), or they give those atoms the basis they
 * would have anyway. Two lines of the same kind that give an atom different bases are a conflict;
 * the later one wins, and the earlier one is reported.
 */
function checkOverrides(context: CheckContext): void {
  const { model, sink } = context;
  const lines = model.basis.overrides;
  const reported = new Set<number>();
  // Conflicts: for each atom, the deciding line against the earlier lines of the same rank.
  const conflicts = new Map<number, { winner: number; atoms: number[] }>();
  for (let atom = 0; atom < model.atoms.length; atom++) {
    const winner = model.basis.decidedBy[atom]!;
    if (winner < 0) continue;
    const rank = lines[winner]!.atomRanks.get(atom)!;
    for (let earlier = 0; earlier < winner; earlier++) {
      const line = lines[earlier]!;
      if (!line.set || line.atomRanks.get(atom) !== rank || line.set.key === lines[winner]!.set!.key) continue;
      const entry = conflicts.get(earlier);
      if (entry && entry.winner === winner) entry.atoms.push(atom);
      else if (!entry) conflicts.set(earlier, { winner, atoms: [atom] });
    }
  }
  for (const [earlier, { winner, atoms }] of conflicts) {
    const line = lines[earlier]!;
    const later = lines[winner]!;
    reported.add(earlier);
    sink.report(
      'basis-override-conflict',
      line.ast.onSpan,
      `\`${overrideText(line.ast)}\` and the later \`${overrideText(later.ast)}\` are both ${BASIS_RANK_NAMES[later.atomRanks.get(atoms[0]!)!]} for ${listSome(atoms.map((atom) => shortAtomName(model.atoms[atom]!)), 5)}; the later one wins, so ${atoms.length === 1 ? 'this atom takes' : 'these atoms take'} ${later.set!.displayName}. Remove one of the two, or name the atoms once.`,
      { related: [{ span: later.ast.onSpan, message: 'the line that wins' }] },
    );
  }
  lines.forEach((line, index) => {
    if (!line.set || line.atomRanks.size === 0 || reported.has(index)) return;
    const decided = [...line.atomRanks.keys()].filter((atom) => model.basis.decidedBy[atom] === index);
    if (decided.length === 0) {
      const deciders = [...new Set([...line.atomRanks.keys()].map((atom) => model.basis.decidedBy[atom]!))].filter((other) => other >= 0);
      const related: RelatedInformation[] = deciders.slice(0, 4).map((other) => ({ span: lines[other]!.ast.onSpan, message: 'a line that takes precedence' }));
      sink.report(
        'basis-override-unused',
        line.ast.onSpan,
        `\`${overrideText(line.ast)}\` changes no atom: every atom it selects takes its basis from a more specific or later line (${deciders.map((other) => `\`${overrideText(lines[other]!.ast)}\``).join(', ')}). Lines naming atoms beat \`all <Element>\` lines, which beat \`fragment\` lines; among equals the later wins.`,
        { related },
      );
      return;
    }
    const without = decided.map((atom) => basisWithout(model.basis.overrides, model.basis.main, atom, index));
    if (without.every((set) => set?.key === line.set!.key)) {
      sink.report(
        'basis-override-unused',
        line.ast.onSpan,
        `\`${overrideText(line.ast)}\` changes no atom: ${decided.length === 1 ? 'the atom it gives' : `the ${decided.length} atoms it gives`} ${line.set.displayName} would have ${line.set.displayName} without it. Remove the line, or name another basis.`,
      );
    }
  });
}

/** The basis an atom would have if override `skip` were not there. */
export function basisWithout(lines: readonly BasisOverrideModel[], main: BasisSet | undefined, atom: number, skip: number): BasisSet | undefined {
  let best = -1;
  let bestRank = 0;
  lines.forEach((line, index) => {
    const rank = line.atomRanks.get(atom);
    if (index === skip || !line.set || rank === undefined) return;
    if (rank >= bestRank) {
      bestRank = rank;
      best = index;
    }
  });
  return best >= 0 ? lines[best]!.set : main;
}
