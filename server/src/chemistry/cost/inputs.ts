/** Argument checks shared by the cost functions: they throw a RangeError that names the argument. */

export function requireWhole(what: string, value: number): void {
  if (!Number.isSafeInteger(value) || value < 0) throw new RangeError(`${what} must be a whole number ≥ 0 (got ${value}).`);
}

export function requireFit(orbitals: number, alpha: number, beta: number): void {
  requireWhole('orbitals', orbitals);
  requireWhole('alpha electrons', alpha);
  requireWhole('beta electrons', beta);
  if (alpha > orbitals || beta > orbitals) {
    throw new RangeError(`${alpha} alpha and ${beta} beta electrons do not fit in ${orbitals} orbitals.`);
  }
}
