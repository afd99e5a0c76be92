/**
 * Reading the psi4 reference data (tests/fixtures/hamiltonian.psi4.json, made by
 * scripts/data/generate_hamiltonian_fixture.py with Debian's psi4 1.3.2) and a shell-quartet
 * source over its packed atomic-orbital integrals, so that the shell-batched transformation is
 * tested on psi4's own shell layout.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import type { MolecularBasis, Shell, TwoElectronIntegrals } from '../../server/src/electronic/contracts';
import type { ActiveSpaceIntegrals } from '../../server/src/electronic/hamiltonian/activeSpace';
import { quartetIndex } from '../../server/src/electronic/hamiltonian/pairs';

export const FIXTURES = path.join(__dirname, '..', 'fixtures');

export interface Psi4Space {
  readonly core: number;
  readonly active: number;
  readonly constant: number;
  readonly coreEnergy: number;
  readonly h: number[];
  readonly eri: number[];
  readonly electrons: { alpha: number; beta: number };
  readonly casciEnergy?: number;
}

export interface Psi4Case {
  readonly name: string;
  readonly multiplicity: number;
  readonly reference: string;
  readonly nuclearRepulsion: number;
  readonly scfEnergy: number;
  readonly alpha: number;
  readonly beta: number;
  readonly functions: number;
  readonly orbitals: number;
  readonly shells: Array<[number, number, number, number]>;
  readonly hCore: number[];
  readonly eri: number[];
  readonly coefficients: number[];
  readonly orbitalEnergies: number[];
  readonly spaces: Psi4Space[];
}

let cached: Psi4Case[] | undefined;

export function psi4Cases(): Psi4Case[] {
  cached ??= (JSON.parse(readFileSync(path.join(FIXTURES, 'hamiltonian.psi4.json'), 'utf8')) as { cases: Psi4Case[] }).cases;
  return cached;
}

export function psi4Case(name: string): Psi4Case {
  const found = psi4Cases().find((c) => c.name === name);
  if (!found) throw new Error(`no psi4 case ${name}`);
  return found;
}

export function psi4Space(name: string, core: number, active: number): { case: Psi4Case; space: Psi4Space } {
  const c = psi4Case(name);
  const space = c.spaces.find((s) => s.core === core && s.active === active);
  if (!space) throw new Error(`no space (${core}, ${active}) in ${name}`);
  return { case: c, space };
}

/** The numpy active-space integrals of the fixture in Tessera's shape. */
export function referenceIntegrals(space: Psi4Space, nuclearRepulsion: number): ActiveSpaceIntegrals {
  return {
    orbitals: space.active,
    electrons: space.electrons,
    constant: space.constant,
    nuclearRepulsion,
    coreEnergy: space.coreEnergy,
    oneBody: Float64Array.from(space.h),
    twoBody: Float64Array.from(space.eri),
  };
}

/**
 * A TwoElectronIntegrals over the fixture's packed integrals with psi4's shells (shell data other
 * than the layout is not needed by the transformation and left empty).
 */
export function fixtureTwoElectronIntegrals(c: Psi4Case): TwoElectronIntegrals {
  const values = Float64Array.from(c.eri);
  const N = c.functions;
  const shells: Shell[] = c.shells.map(([l, offset, size, center]) => ({
    l,
    center,
    x: 0,
    y: 0,
    z: 0,
    exponents: new Float64Array(0),
    coefficients: new Float64Array(0),
    offset,
    size,
    kind: 'cartesian',
  }));
  const basis: MolecularBasis = {
    basisNames: [],
    kind: 'cartesian',
    centers: [],
    shells,
    functionCount: N,
    functionCenter: new Int32Array(N),
    functionL: new Int32Array(N),
    ecps: [],
  };
  const value = (i: number, j: number, k: number, l: number) => values[quartetIndex(i, j, k, l)]!;
  return {
    basis,
    buildJK(densities, J, K) {
      densities.forEach((D, d) => {
        for (let i = 0; i < N; i++) {
          for (let j = 0; j < N; j++) {
            let coulomb = 0;
            let exchange = 0;
            for (let k = 0; k < N; k++) {
              for (let l = 0; l < N; l++) {
                coulomb += value(i, j, k, l) * D[k * N + l]!;
                exchange += value(i, k, j, l) * D[k * N + l]!;
              }
            }
            if (J) J[d]![i * N + j] = coulomb;
            if (K) K[d]![i * N + j] = exchange;
          }
        }
      });
    },
    shellQuartet(p, q, r, s, out) {
      const [P, Q, R, S] = [shells[p]!, shells[q]!, shells[r]!, shells[s]!];
      let index = 0;
      for (let i = P.offset; i < P.offset + P.size; i++) {
        for (let j = Q.offset; j < Q.offset + Q.size; j++) {
          for (let k = R.offset; k < R.offset + R.size; k++) {
            for (let l = S.offset; l < S.offset + S.size; l++) out[index++] = value(i, j, k, l);
          }
        }
      }
    },
    schwarz(p, q) {
      const [P, Q] = [shells[p]!, shells[q]!];
      let max = 0;
      for (let i = P.offset; i < P.offset + P.size; i++) for (let j = Q.offset; j < Q.offset + Q.size; j++) max = Math.max(max, Math.abs(value(i, j, i, j)));
      return Math.sqrt(max);
    },
  };
}
