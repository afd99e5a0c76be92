/**
 * Active spaces against the fragment they are chosen from. The per-irrep counts need the
 * fragment's point group and are checked with the estimates (analysis/checks/activeIrreps.ts).
 */
import { checkActiveSpace } from '../../chemistry/counting';
import { valenceShell } from '../../chemistry/atomicShells';
import type { FragmentModel } from '../model';
import type { CheckContext } from './context';

export function checkActiveSpaces(context: CheckContext): void {
  const { model, sink } = context;
  for (const fragment of model.fragments) {
    checkActiveChoice(context, fragment);
    const active = fragment.tier?.active;
    const activeAst = fragment.ast.tier?.active;
    if (!active || !activeAst || fragment.tier?.level === 'mean-field') continue;
    const space = fragment.space;
    // Counts are not trustworthy while the spin is wrong; that error comes first. Without a basis
    // for every atom the orbital total is unknown, but capacity and spin can still be checked.
    if (!space.spin || fragment.atoms.length === 0) continue;
    for (const problem of checkActiveSpace(space, active, space.atomsWithoutBasis === 0)) {
      sink.report('active-space-invalid', activeAst.span, `The active space of '${fragment.name}' does not fit: ${problem.message.charAt(0).toLowerCase()}${problem.message.slice(1)}`, { data: { kind: problem.kind } });
    }
  }
}

const SHELL_LETTERS = 'spdfg';

/**
 * A suggestion's named shells against the fragment: each atom must belong to it and have that
 * shell in a minimal basis (chemistry/atomicShells.ts); natural occupations need a closed shell
 * (MP2 runs on RHF).
 */
function checkActiveChoice(context: CheckContext, fragment: FragmentModel): void {
  const choice = fragment.tier?.activeChoice;
  const activeAst = fragment.ast.tier?.active;
  if (!choice || !activeAst) return;
  const { model, sink } = context;
  if (choice.kind === 'natural') {
    if (fragment.multiplicity !== 1) {
      sink.report('active-space-invalid', activeAst.span, `Natural occupations come from MP2 on a closed-shell (RHF) mean field; '${fragment.name}' has multiplicity ${fragment.multiplicity}. Name atomic shells (\`active shells …\`) or give counts.`, { data: { kind: 'natural-open-shell' } });
    }
    return;
  }
  const members = new Set(fragment.atoms);
  const reportedOutside = new Set<number>();
  const reportedShell = new Set<string>();
  for (const shell of choice.shells) {
    const atom = model.atoms[shell.atom];
    if (!atom) continue;
    const name = atom.label ?? `#${shell.atom + 1}`;
    if (!members.has(shell.atom)) {
      if (!reportedOutside.has(shell.atom)) {
        reportedOutside.add(shell.atom);
        sink.report('active-space-invalid', shell.groupSpan, `Atom ${name} (${atom.element.symbol}) is not in fragment '${fragment.name}': an active space takes shells of its own fragment's atoms.`, { data: { kind: 'shell-atom-outside' } });
      }
      continue;
    }
    const top = valenceShell(atom.element.z, shell.l);
    const letter = SHELL_LETTERS[shell.l]!;
    const missing = top === undefined || (shell.n !== null && (shell.n > top || shell.n < shell.l + 1));
    const key = `${atom.element.symbol}:${shell.n}:${shell.l}`;
    if (missing && !reportedShell.has(key)) {
      reportedShell.add(key);
      const have = [0, 1, 2, 3].flatMap((l) => {
        const n = valenceShell(atom.element.z, l);
        return n === undefined ? [] : Array.from({ length: n - l }, (_, k) => `${l + 1 + k}${SHELL_LETTERS[l]}`);
      });
      sink.report('active-space-invalid', shell.span, `${atom.element.symbol} has no ${shell.n ?? ''}${letter} shell in a minimal basis; it has ${have.join(' ')}.`, { data: { kind: 'shell-missing' } });
    }
  }
}
