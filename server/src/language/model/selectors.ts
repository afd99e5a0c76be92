/** Turns selectors into atom indices, reporting names and indices that do not exist. */
import { elementBySymbol } from '../../chemistry/elements';
import { toAngstrom, type LengthUnit } from '../../chemistry/units';
import type { AtomRef, SelectorAst } from '../ast';
import type { DiagnosticSink } from '../diagnostics';
import { suggest } from '../suggest';
import type { AtomModel, AtomReference } from './types';

export interface Selection {
  atoms: number[];
  claimsRest: boolean;
}

export class SelectorResolver {
  readonly references: AtomReference[] = [];

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
      this.sink.report('unknown-atom', ref.span, `There is no atom #${ref.index}: the geometry has ${count} atom${count === 1 ? '' : 's'} (#1 to #${count}).`);
      return undefined;
    }
    const found = this.labels.get(ref.name);
    if (found !== undefined) return found;
    const suggestion = suggest(ref.name, this.labels.keys());
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
            this.sink.report('invalid-selector', selector.span, `This range runs backwards: atom #${from + 1} comes after #${to + 1} in the geometry; write the earlier atom first.`);
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
            this.sink.report('invalid-selector', selector.span, `The geometry has no ${selector.element} atoms, so 'all ${selector.element}' selects nothing.`, { severity: 'warning' });
          }
          break;
        }
        case 'within': {
          const centre = this.ref(selector.of);
          if (centre === undefined) break;
          const radius = toAngstrom(selector.distance, this.units);
          const c = this.coordinates;
          for (let atom = 0; atom < this.atoms.length; atom++) {
            const dx = c[3 * atom]! - c[3 * centre]!;
            const dy = c[3 * atom + 1]! - c[3 * centre + 1]!;
            const dz = c[3 * atom + 2]! - c[3 * centre + 2]!;
            if (dx * dx + dy * dy + dz * dz <= radius * radius + 1e-12) chosen.add(atom);
          }
          break;
        }
      }
    }
    return { atoms: [...chosen].sort((a, b) => a - b), claimsRest };
  }
}
