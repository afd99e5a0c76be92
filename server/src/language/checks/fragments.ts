/** Every atom in exactly one fragment; no empty fragments; formal charges add up to the total. */
import type { RelatedInformation } from '../diagnostics';
import type { FragmentModel } from '../model';
import { documentStart, listSome, shortAtomName, signed, type CheckContext } from './context';

function nameSpan(fragment: FragmentModel) {
  return fragment.ast.name?.span ?? fragment.ast.statement.keyword.span;
}

/** Pairs of fragments sharing an atom examined at most; beyond, the overlaps are counted. */
const MAX_OVERLAP_PAIRS = 100_000;

export function checkFragments(context: CheckContext): void {
  const { model, sink, ast } = context;
  if (model.fragments.length === 0) return;

  const byName = new Map<string, FragmentModel>();
  for (const fragment of model.fragments) {
    if (!fragment.ast.name) continue;
    const first = byName.get(fragment.name);
    if (first) {
      sink.report('duplicate-fragment', nameSpan(fragment), `A fragment named '${fragment.name}' already exists; give each fragment its own name.`, {
        related: [{ span: nameSpan(first), message: `first '${fragment.name}' here` }],
      });
    } else {
      byName.set(fragment.name, fragment);
    }
  }

  const restClaimants = model.fragments.filter((fragment) => fragment.claimsRest);
  for (const extra of restClaimants.slice(1)) {
    const restSelector = extra.ast.atoms?.selectors.find((selector) => selector.kind === 'rest');
    sink.report('rest-twice', restSelector?.span ?? nameSpan(extra), `Fragment '${restClaimants[0]!.name}' already claims the rest; only one fragment can.`, {
      related: [{ span: nameSpan(restClaimants[0]!), message: `'${restClaimants[0]!.name}' claims rest` }],
    });
  }

  for (const fragment of model.fragments) {
    // A fragment without a block already has its own error (missing-block).
    if (fragment.atoms.length > 0 || !fragment.ast.statement.block) continue;
    if (!fragment.ast.atoms) {
      sink.report('fragment-empty', nameSpan(fragment), `Fragment '${fragment.name}' has no atoms: add \`atoms ...\` inside its block.`);
    } else if (model.atoms.length === 0) {
      // No atoms were read at all; the geometry's own diagnostic says why.
      continue;
    } else if (fragment.claimsRest && fragment.ast.atoms.selectors.length === 1) {
      sink.report('fragment-empty', fragment.ast.atoms.span, `Fragment '${fragment.name}' claims the rest, but every atom is already in another fragment.`);
    } else {
      sink.report('fragment-empty', fragment.ast.atoms.span, `Fragment '${fragment.name}' selects no atoms.`);
    }
  }

  // Overlaps: one report per pair of fragments, on the later fragment's atoms line. An atom that k
  // fragments claim makes k(k − 1)/2 pairs; past MAX_OVERLAP_PAIRS pairs examined the rest are
  // counted, not listed (10,000 fragments claiming one atom would otherwise make 5 × 10^7 reports).
  const overlaps = new Map<string, number[]>();
  let examined = 0;
  let unlisted = 0;
  model.sharedAtoms.forEach((owners, atom) => {
    const pairs = (owners.length * (owners.length - 1)) / 2;
    if (examined + pairs > MAX_OVERLAP_PAIRS) {
      unlisted += pairs;
      return;
    }
    examined += pairs;
    for (let a = 0; a < owners.length; a++) {
      for (let b = a + 1; b < owners.length; b++) {
        const key = `${owners[a]}:${owners[b]}`;
        const list = overlaps.get(key);
        if (list) list.push(atom);
        else overlaps.set(key, [atom]);
      }
    }
  });
  if (unlisted > 0) {
    const last = model.fragments[model.fragments.length - 1]!;
    sink.report(
      'fragment-overlap',
      last.ast.atoms?.span ?? nameSpan(last),
      `Fragments claim the same atoms ${unlisted.toLocaleString('en-US')} more times (counted by pairs of fragments and shared atom) than are listed here; each atom belongs to exactly one fragment.`,
      { data: { unlisted } },
    );
  }
  for (const [key, atoms] of overlaps) {
    const [first, second] = key.split(':').map(Number) as [number, number];
    const earlier = model.fragments[first]!;
    const later = model.fragments[second]!;
    const names = atoms.map((atom) => shortAtomName(model.atoms[atom]!));
    sink.report(
      'fragment-overlap',
      later.ast.atoms?.span ?? nameSpan(later),
      `Fragments '${earlier.name}' and '${later.name}' both claim ${atoms.length} atom${atoms.length === 1 ? '' : 's'}: ${listSome(names)}. Each atom belongs to exactly one fragment.`,
      { related: [{ span: earlier.ast.atoms?.span ?? nameSpan(earlier), message: `'${earlier.name}' claims them here` }], data: { atoms } },
    );
  }

  const unassigned: number[] = [];
  model.owner.forEach((owner, atom) => {
    if (owner < 0) unassigned.push(atom);
  });
  if (unassigned.length > 0 && restClaimants.length === 0) {
    const names = unassigned.map((atom) => shortAtomName(model.atoms[atom]!));
    const where = ast.geometry?.statement.keyword.span ?? documentStart(ast);
    const related: RelatedInformation[] = unassigned.slice(0, 20).map((atom) => ({ span: model.atoms[atom]!.span, message: `${shortAtomName(model.atoms[atom]!)} is in no fragment` }));
    sink.report(
      'atoms-unassigned',
      where,
      `${unassigned.length} atom${unassigned.length === 1 ? ' is' : 's are'} in no fragment: ${listSome(names)}. Add ${unassigned.length === 1 ? 'it' : 'them'} to a fragment, or let one fragment take \`atoms rest\`.`,
      { related, data: { atoms: unassigned } },
    );
  }

  // Formal charges: only meaningful once the fragments partition the atoms.
  const partitioned = unassigned.length === 0 || restClaimants.length > 0;
  const total = model.fragments.reduce((sum, fragment) => sum + fragment.charge, 0);
  if (partitioned && overlaps.size === 0 && total !== model.charge) {
    const parts = model.fragments.map((fragment) => `${fragment.name} ${signed(fragment.charge)}${fragment.chargeGiven ? '' : ' (default)'}`);
    sink.report(
      'fragment-charge-sum',
      ast.charge?.span ?? nameSpan(model.fragments[0]!),
      `Fragment charges add up to ${signed(total)} (${parts.join(', ')}), but the total charge is ${signed(model.charge)}.`,
      { related: model.fragments.filter((f) => f.ast.charge).map((f) => ({ span: f.ast.charge!.span, message: `'${f.name}' charge ${signed(f.charge)}` })) },
    );
  }
}
