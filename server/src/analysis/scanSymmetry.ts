/**
 * The point group at every scan point, and the figures that depend on it. Each point is a geometry
 * of its own: the system's group there (by the same size policy as the structure's,
 * SYMMETRY_ATOM_LIMIT), each fragment's counted group (its own, or its stabiliser in the system
 * under an embedding, as for the structure), and for quantum tiers the tapered qubits and the qubits
 * needed, counted in that point's group (Z2 symmetries of the abelian group: Bravyi, Gambetta,
 * Mezzacapo, Temme, arXiv:1701.08213 (2017); Setia et al., J. Chem. Theory Comput. 16, 6091 (2020)).
 * A symmetric stretch keeps the structure's group; moving one atom of a symmetric pair lowers it.
 */
import { eachScanFrame } from '../chemistry/scan';
import { defaultScanMoving, fragmentCapsAt, type SpecModel } from '../language/model';
import { Estimates, SYMMETRY_ATOM_LIMIT } from './estimates';

/**
 * Atoms × points looked at, at most: the search runs with the diagnostics of every edit, and one
 * point of a 20-atom site costs about 1 ms (the point group and the fragments' plans; measured on
 * the zn-site sample, 200 points in 0.23 s). Beyond it the points are not searched and the report
 * says so.
 */
export const SCAN_SYMMETRY_BUDGET = 5_000;

export interface ScanPointFragmentSymmetry {
  readonly fragment: string;
  /** The abelian group the fragment's figures are counted in at this point (own or in-system, by the embedding); null beyond the size policy. */
  readonly pointGroup: string | null;
  /** Quantum tiers only: qubits after tapering the point group's Z2 symmetries, and the qubits needed under the fragment's mapping. */
  readonly taperedQubits: number | null;
  readonly qubitsRequired: number | null;
}

export interface ScanPointSymmetry {
  /** The scanned value (Å or degrees). */
  readonly value: number;
  /** The system's full point group at this point, and the abelian subgroup the counts use; null beyond the size policy. */
  readonly fullPointGroup: string | null;
  readonly pointGroup: string | null;
  readonly fragments: readonly ScanPointFragmentSymmetry[];
}

/** A run of consecutive points with the same groups and figures. */
export interface ScanSymmetryRun {
  /** 0-based indices of the first and last point of the run. */
  readonly first: number;
  readonly last: number;
  readonly symmetry: ScanPointSymmetry;
}

export interface ScanSymmetry {
  /** Null when every point was looked at; else why not (size policy or budget). */
  readonly notLookedFor: string | null;
  readonly points: readonly ScanPointSymmetry[];
  /** Consecutive points that agree, in scan order. */
  readonly runs: readonly ScanSymmetryRun[];
  /** Whether the system's full group changes along the scan. */
  readonly groupChanges: boolean;
  /** Whether a symmetry-dependent figure (a fragment's group, tapered qubits, qubits needed) changes along the scan. */
  readonly figuresChange: boolean;
}

/** The key that says whether two points agree on everything shown. */
function signature(point: ScanPointSymmetry): string {
  return JSON.stringify([point.fullPointGroup, point.pointGroup, point.fragments]);
}

function figuresSignature(point: ScanPointSymmetry): string {
  return JSON.stringify(point.fragments);
}

/** The groups and figures of one geometry, from that geometry's own estimates. */
function pointSymmetry(model: SpecModel, coordinates: Float64Array, value: number): ScanPointSymmetry {
  const fragments = model.fragments.map((fragment, index) => (fragment.caps.length > 0 ? { ...fragment, caps: fragmentCapsAt(model, index, coordinates) } : fragment));
  const estimates = new Estimates({ ...model, coordinates, fragments }, { nearSymmetry: false });
  const system = estimates.systemSymmetry();
  return {
    value,
    fullPointGroup: system?.symmetry.fullGroup ?? null,
    pointGroup: system?.group ?? null,
    fragments: model.fragments.map((fragment, index) => {
      const counted = estimates.countedSymmetry(index);
      const quantum = fragment.tier?.level === 'quantum' ? estimates.plan(index)?.quantum : undefined;
      return { fragment: fragment.name, pointGroup: counted?.group ?? null, taperedQubits: quantum?.qubits.tapered ?? null, qubitsRequired: quantum?.qubits.required ?? null };
    }),
  };
}

/** Per-point symmetry of the model's scan; undefined without a scan or when its motion is undefined (the checks report that). */
export function scanSymmetry(model: SpecModel): ScanSymmetry | undefined {
  const scan = model.scan;
  if (!scan || scan.values.length === 0) return undefined;
  let moving = scan.moving;
  if (!moving) {
    const side = defaultScanMoving(model, scan);
    if (!('atoms' in side)) return undefined;
    moving = side.atoms;
  }
  const atoms = model.atoms.length;
  const notLookedFor = !Estimates.symmetryApplies(atoms)
    ? `point groups are looked for up to ${SYMMETRY_ATOM_LIMIT} atoms (the one size policy) and the system has ${atoms}`
    : atoms * scan.values.length > SCAN_SYMMETRY_BUDGET
      ? `${scan.values.length.toLocaleString('en-US')} points × ${atoms} atoms is beyond the ${SCAN_SYMMETRY_BUDGET.toLocaleString('en-US')} atom-points searched for symmetry`
      : null;
  if (notLookedFor) return { notLookedFor, points: [], runs: [], groupChanges: false, figuresChange: false };
  let frames: Iterable<{ value: number; coordinates: Float64Array }>;
  try {
    frames = eachScanFrame(model.coordinates, scan, moving, scan.values);
  } catch {
    return undefined;
  }
  const points: ScanPointSymmetry[] = [];
  for (const frame of frames) points.push(pointSymmetry(model, frame.coordinates, frame.value));
  const runs: ScanSymmetryRun[] = [];
  let previous = '';
  points.forEach((point, index) => {
    const key = signature(point);
    if (runs.length > 0 && key === previous) runs[runs.length - 1] = { ...runs[runs.length - 1]!, last: index };
    else runs.push({ first: index, last: index, symmetry: point });
    previous = key;
  });
  const groups = new Set(points.map((point) => point.fullPointGroup));
  const figures = new Set(points.map(figuresSignature));
  return { notLookedFor: null, points, runs, groupChanges: groups.size > 1, figuresChange: figures.size > 1 };
}

/** The same, computed once per Estimates instance (one document version): checks, report and hover share it. */
const CACHE = new WeakMap<Estimates, ScanSymmetry | undefined>();

export function scanSymmetryOf(estimates: Estimates): ScanSymmetry | undefined {
  if (!CACHE.has(estimates)) CACHE.set(estimates, scanSymmetry(estimates.model));
  return CACHE.get(estimates);
}
