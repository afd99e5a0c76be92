/**
 * The inputs that determine a computed result for one part of a spec (the system, or one
 * fragment), and the key a job is queued under and its result kept by: elements and coordinates of
 * the part's atoms, the basis of each, the function type, charge and multiplicity. Two document
 * versions that agree on these share the result; anything else that changes (a comment, another
 * fragment, a label, the part's name) does not invalidate it. Plain data: the same description
 * goes to a worker thread, to the command line and into the key.
 */
import type { SpecModel } from '../language/model';

/** Coordinates rounded to 1e-6 Å: edits below that do not change a mean field meaningfully. */
const DECIMALS = 6;

/** The whole system or one fragment (by its index in the spec). */
export type PartRef = { readonly kind: 'system' } | { readonly kind: 'fragment'; readonly index: number };

export interface PartAtom {
  readonly symbol: string;
  /** Position in ångström, as the spec's model holds it. */
  readonly x: number;
  readonly y: number;
  readonly z: number;
}

/** What a computation of one part reads from the spec. */
export interface PartInputs {
  readonly atoms: readonly PartAtom[];
  /** The basis of every atom: the library's display name, or null when the atom has none. */
  readonly basis: readonly (string | null)[];
  readonly functions: 'spherical' | 'cartesian';
  readonly charge: number;
  readonly multiplicity: number;
}

/** The part's name as users see it: `system`, or `fragment <name>`. */
export function partLabel(model: SpecModel, part: PartRef): string {
  return part.kind === 'system' ? 'system' : `fragment ${model.fragments[part.index]?.name ?? `#${part.index + 1}`}`;
}

/** The atom indices of a part. */
export function partAtoms(model: SpecModel, part: PartRef): readonly number[] {
  if (part.kind === 'fragment') return model.fragments[part.index]!.atoms;
  return model.atoms.map((atom) => atom.index);
}

/** The basis the spec gives one atom (model/basis.ts decides which line wins). */
function atomBasis(model: SpecModel, atom: number): string | null {
  return model.basis.atomSets[atom]?.displayName ?? null;
}

export function partInputs(model: SpecModel, part: PartRef): PartInputs {
  const atoms = partAtoms(model, part);
  const c = model.coordinates;
  const fragment = part.kind === 'fragment' ? model.fragments[part.index]! : undefined;
  return {
    atoms: atoms.map((atom) => ({ symbol: model.atoms[atom]!.element.symbol, x: c[3 * atom]!, y: c[3 * atom + 1]!, z: c[3 * atom + 2]! })),
    basis: atoms.map((atom) => atomBasis(model, atom)),
    functions: model.basis.functions,
    charge: fragment ? fragment.charge : model.charge,
    multiplicity: fragment ? fragment.multiplicity : model.multiplicity,
  };
}

/** Parts up to this many atoms are keyed by their atoms spelled out; larger ones by a digest of them. */
const SPELLED_OUT_ATOMS = 64;

/**
 * The key of a part's inputs (see the file comment for what it holds and what it ignores). Small
 * parts spell their atoms out; larger ones hash the same rounded values (two independent 32-bit
 * FNV-1a hashes over the element, basis and coordinates of every atom, with the atom count), which
 * costs one pass over the numbers instead of a string per coordinate.
 */
export function inputKey(inputs: PartInputs): string {
  const header = [inputs.functions, `q${inputs.charge}`, `m${inputs.multiplicity}`, `n${inputs.atoms.length}`];
  if (inputs.atoms.length <= SPELLED_OUT_ATOMS) {
    inputs.atoms.forEach((atom, k) => {
      header.push(`${atom.symbol}/${inputs.basis[k] ?? '-'}/${atom.x.toFixed(DECIMALS)},${atom.y.toFixed(DECIMALS)},${atom.z.toFixed(DECIMALS)}`);
    });
    return header.join(';');
  }
  // The two hash states live in a typed array: as closure variables above 2^31 each update would
  // allocate a heap number (garbage that a 50,000-atom part turned into most of the cost).
  const state = new Uint32Array([0x811c9dc5, (0x01000193 ^ 0x5bd1e995) >>> 0]);
  const scale = 10 ** DECIMALS;
  const atoms = inputs.atoms;
  for (let k = 0; k < atoms.length; k++) {
    const atom = atoms[k]!;
    mixText(state, atom.symbol);
    mixText(state, inputs.basis[k] ?? '-');
    mixCoordinate(state, atom.x, scale);
    mixCoordinate(state, atom.y, scale);
    mixCoordinate(state, atom.z, scale);
  }
  const a = state[0]!;
  const b = state[1]!;
  return `${header.join(';')};h${a.toString(16).padStart(8, '0')}${b.toString(16).padStart(8, '0')}`;
}

/** One 32-bit value into both FNV-1a states, 16 bits at a time. */
function mix(state: Uint32Array, value: number): void {
  state[0] = Math.imul(state[0]! ^ (value & 0xffff), 0x01000193);
  state[0] = Math.imul(state[0]! ^ (value >>> 16), 0x01000193);
  state[1] = Math.imul(state[1]! ^ (value & 0xffff), 0x01000193 ^ 0x2c1b3c6d);
  state[1] = Math.imul(state[1]! ^ (value >>> 16), 0x01000193 ^ 0x2c1b3c6d);
}

function mixText(state: Uint32Array, value: string): void {
  for (let i = 0; i < value.length; i++) mix(state, value.charCodeAt(i));
  mix(state, 0xffff);
}

/** A coordinate rounded to 10^-DECIMALS, as its low and high 32 bits. */
function mixCoordinate(state: Uint32Array, value: number, scale: number): void {
  const rounded = Math.round(value * scale);
  mix(state, rounded | 0);
  mix(state, Math.floor(rounded / 2 ** 32) | 0);
}

/** A fragment's inputs with its frozen-core setting (what correlated results also depend on). */
export function fragmentInputKey(model: SpecModel, fragmentIndex: number): string {
  const fragment = model.fragments[fragmentIndex]!;
  return `fc${(fragment.tier?.frozenCore ?? model.frozenCore) ? 1 : 0};${inputKey(partInputs(model, { kind: 'fragment', index: fragmentIndex }))}`;
}
