/** Defaults of the active-space suggestions, shared by the spec language and the engine. */

/** MP2 natural occupations inside [low, high] are active (common practice: 0.02 to 1.98). */
export const DEFAULT_OCCUPATION_WINDOW = { low: 0.02, high: 1.98 } as const;

/** Projection eigenvalues above this make an orbital active in the atomic-shell suggestion (common practice: 0.2). */
export const DEFAULT_PROJECTION_THRESHOLD = 0.2;
