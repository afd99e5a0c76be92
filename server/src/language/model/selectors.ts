/** Turns selectors into atom indices, reporting names and indices that do not exist. */
import { elementBySymbol } from '../../chemistry/elements';
import { toAngstrom, type LengthUnit } from '../../chemistry/units';
import type { AtomRef, SelectorAst } from '../ast';
import type { DiagnosticSink } from '../diagnostics';
import { SuggestionIndex } from '../suggest';
import type { AtomModel, AtomReference } from './types';

export interface Selection {
  atoms: number[];
  claimsRest: boolean;
}

/**
 * Atoms strictly closer than `radius` (Å) to atom `centre`, the centre itself included when the
 * radius is positive; with `inclusive` (the retired `within`), those at most `radius` away.
 */
export function atomsCloserThan(coordinates: Float64Array, centre: number, radius: number, inclusive = false): number[] {
  const found: number[] = [];
  const r2 = radius * radius;
  const count = coordinates.length / 3;
  for (let atom = 0; atom < count; atom++) {
    const dx = coordinates[3 * atom]! - coordinates[3 * centre]!;
    const dy = coordinates[3 * atom + 1]! - coordinates[3 * centre + 1]!;
    const dz = coordinates[3 * atom + 2]! - coordinates[3 * centre + 2]!;
    const d2 = dx * dx + dy * dy + dz * dz;
    if (inclusive ? d2 <= r2 + 1e-12 : d2 < r2) found.push(atom);
  }
  return found;
}

export class SelectorResolver {
  readonly references: AtomReference[] = [];
  private labelIndex: SuggestionIndex | undefined;

  constructor(
    private readonly atoms: readonly AtomModel[],
    private readonly labels: ReadonlyMap<string, number>,
    private readonly coordinates: Float64Array,
    private readonly units: LengthUnit,
    private readonly sink: DiagnosticSink,
  ) {}

  ref(ref: AtomRef): number | undefined {
    const atom = this.lookup(ref);
    if (atom !== undefined) this.references.push({ atom, span: ref.span, kind: ref.kind });
    return atom;
  }

  private lookup(ref: AtomRef): number | undefined {
    if (ref.kind === 'index') {
      if (ref.index >= 1 && ref.index <= this.atoms.length) return ref.index - 1;
      const count = this.atoms.length;
      this.sink.report('unknown-atom', ref.span, `There is no atom #${ref.index}: the structure has ${count} atom${count === 1 ? '' : 's'} (#1 to #${count}).`);
      return undefined;
    }
    const found = this.labels.get(ref.name);
    if (found !== undefined) return found;
    // One index over the labels for every unknown name of this analysis, built on the first.
    this.labelIndex ??= new SuggestionIndex(this.labels.keys());
    const suggestion = this.labelIndex.suggest(ref.name);
    const element = elementBySymbol(ref.name);
    const hint = suggestion ? ` Did you mean '${suggestion}'?` : element ? ` To select every ${element.symbol} atom, write 'all ${element.symbol}'.` : '';
    this.sink.report('unknown-atom', ref.span, `No atom is labelled '${ref.name}'.${hint}`, suggestion ? { data: { replacement: suggestion } } : {});
    return undefined;
  }

  resolve(selectors: readonly SelectorAst[]): Selection {
    const chosen = new Set<number>();
    let claimsRest = false;
    for (const selector of selectors) {
      switch (selector.kind) {
        case 'rest':
          claimsRest = true;
          break;
        case 'label':
        case 'index': {
          const atom = this.ref(selector);
          if (atom !== undefined) chosen.add(atom);
          break;
        }
        case 'range': {
          const from = this.ref(selector.from);
          const to = this.ref(selector.to);
          if (from === undefined || to === undefined) break;
          if (from > to) {
            this.sink.report('invalid-selector', selector.span, `This range runs backwards: atom #${from + 1} comes after #${to + 1} in the structure; write the earlier atom first.`);
            break;
          }
          for (let atom = from; atom <= to; atom++) chosen.add(atom);
          break;
        }
        case 'element': {
          let found = 0;
          for (const atom of this.atoms) {
            if (atom.element.symbol === selector.element) {
              chosen.add(atom.index);
              found++;
            }
          }
          if (found === 0) {
            this.sink.report('invalid-selector', selector.span, `The structure has no ${selector.element} atoms, so 'all ${selector.element}' selects nothing.`, { severity: 'warning' });
          }
          break;
        }
        case 'closer-than': {
          const centre = this.ref(selector.to);
          if (centre === undefined) break;
          for (const atom of atomsCloserThan(this.coordinates, centre, toAngstrom(selector.distance, this.units), selector.inclusive)) chosen.add(atom);
          break;
        }
      }
    }
    return { atoms: [...chosen].sort((a, b) => a - b), claimsRest };
  }
}
