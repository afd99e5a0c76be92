/**
 * Fitting a suggested active space to a qubit limit. A suggestion ranks its orbitals by how much
 * they matter (the distance of a natural occupation from 0 or 2, or a projection eigenvalue); when
 * the limit allows fewer orbitals, the least important go first, an occupied one into the frozen
 * core and an empty one out of the space, so the electron count stays consistent.
 */
export interface RankedOrbital {
  readonly index: number;
  /** Larger is more important. */
  readonly importance: number;
  /** True when the orbital is (mostly) occupied: dropped into the core. */
  readonly occupied: boolean;
  /** Orbitals that must stay (singly occupied ones). */
  readonly required?: boolean;
}

export interface FitOutcome {
  readonly kept: number[];
  readonly toCore: number[];
  readonly toVirtual: number[];
}

export function fitToOrbitalLimit(ranked: readonly RankedOrbital[], maxOrbitals: number | undefined): FitOutcome {
  if (maxOrbitals === undefined || ranked.length <= maxOrbitals) return { kept: ranked.map((o) => o.index), toCore: [], toVirtual: [] };
  const order = ranked.map((o, k) => ({ ...o, k })).sort((a, b) => (a.required === b.required ? b.importance - a.importance || a.k - b.k : a.required ? -1 : 1));
  const keep = new Set(order.slice(0, Math.max(0, maxOrbitals)).map((o) => o.index));
  const dropped = order.slice(Math.max(0, maxOrbitals));
  return {
    kept: ranked.filter((o) => keep.has(o.index)).map((o) => o.index),
    toCore: dropped.filter((o) => o.occupied).map((o) => o.index),
    toVirtual: dropped.filter((o) => !o.occupied).map((o) => o.index),
  };
}
