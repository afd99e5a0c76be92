/**
 * Qubit-wise commuting groups by sorted insertion: every group is qubit-wise commuting, every
 * non-identity string is in exactly one group, and the bit-set search gives exactly the groups of
 * a plain first-fit scan written here (same order, same heuristic), on psi4 Hamiltonians and a
 * hand-made case.
 */
import { describe, expect, it } from 'vitest';
import { qubitWiseCommutingGroups } from '../../../server/src/electronic/hamiltonian/grouping';
import { parsePauliLabel, type PauliSum } from '../../../server/src/electronic/hamiltonian/pauli';
import { qubitHamiltonians } from '../../../server/src/electronic/hamiltonian/qubitHamiltonian';
import { psi4Cases, referenceIntegrals } from '../psi4Fixture';

function letter(x: number, z: number, q: number): string {
  const xb = (x >>> q) & 1;
  const zb = (z >>> q) & 1;
  return xb ? (zb ? 'Y' : 'X') : zb ? 'Z' : 'I';
}

function qubitWiseCommute(sum: PauliSum, a: number, b: number): boolean {
  for (let q = 0; q < sum.qubits; q++) {
    const la = letter(sum.x[a]!, sum.z[a]!, q);
    const lb = letter(sum.x[b]!, sum.z[b]!, q);
    if (la !== 'I' && lb !== 'I' && la !== lb) return false;
  }
  return true;
}

/** The same heuristic, written plainly: scan the groups in order, test every member. */
function plainFirstFit(sum: PauliSum): number[] {
  const groups: number[][] = [];
  const assignment: number[] = [];
  for (let s = 0; s < sum.length; s++) {
    if (sum.x[s] === 0 && sum.z[s] === 0) {
      assignment.push(-1);
      continue;
    }
    let g = groups.findIndex((members) => members.every((m) => qubitWiseCommute(sum, s, m)));
    if (g < 0) {
      g = groups.length;
      groups.push([]);
    }
    groups[g]!.push(s);
    assignment.push(g);
  }
  return assignment;
}

function sumOf(terms: Array<[string, number]>): PauliSum {
  const parsed = terms.map(([label]) => parsePauliLabel(label));
  return {
    qubits: terms[0]![0].length,
    length: terms.length,
    x: Uint32Array.from(parsed.map((p) => p.x)),
    z: Uint32Array.from(parsed.map((p) => p.z)),
    coefficients: Float64Array.from(terms.map(([, c]) => c)),
  };
}

describe('qubit-wise commuting groups (sorted insertion)', () => {
  it('hand-made: ZZ and ZI share a group, XX and IX the next, YY its own; the identity is in none', () => {
    const groups = qubitWiseCommutingGroups(sumOf([['II', -1], ['ZZ', 0.5], ['XX', 0.4], ['ZI', 0.3], ['YY', 0.2], ['IX', 0.1]]));
    expect(Array.from(groups.assignment)).toEqual([-1, 0, 1, 0, 2, 1]);
    expect(groups.count).toBe(3);
    expect(Array.from(groups.sizes)).toEqual([2, 2, 1]);
  });

  const hamiltonians = psi4Cases().flatMap((c) => c.spaces.filter((space) => space.active <= 6).map((space) => ({ label: `${c.name} ${space.active}o`, h: qubitHamiltonians(referenceIntegrals(space, c.nuclearRepulsion)) })));
  it.each(hamiltonians)('$label: groups are qubit-wise commuting, cover every string once, and equal a plain first-fit scan', ({ h }) => {
    for (const sum of [h.jordanWigner, h.bravyiKitaev, h.parity]) {
      const groups = qubitWiseCommutingGroups(sum);
      expect(Array.from(groups.assignment)).toEqual(plainFirstFit(sum));
      const members = new Map<number, number[]>();
      groups.assignment.forEach((g, s) => {
        if (g >= 0) members.set(g, [...(members.get(g) ?? []), s]);
      });
      expect(members.size).toBe(groups.count);
      for (const list of members.values()) for (const a of list) for (const b of list) expect(qubitWiseCommute(sum, a, b)).toBe(true);
      expect(groups.sizes.reduce((t, v) => t + v, 0)).toBe(sum.length - 1);
    }
  });

  it('grows past its first bit-set width (more than 128 groups) without losing a group', () => {
    // 200 single-qubit-pair strings that pairwise conflict: X or Z patterns on 8 qubits.
    const terms: Array<[string, number]> = [];
    for (let k = 0; k < 200; k++) {
      let label = '';
      for (let q = 0; q < 8; q++) label += (k >> q) & 1 ? 'X' : 'Z';
      terms.push([label, 1 - k * 1e-3]);
    }
    const sum = sumOf(terms);
    const groups = qubitWiseCommutingGroups(sum);
    expect(groups.count).toBe(200);
    expect(Array.from(groups.assignment)).toEqual(plainFirstFit(sum));
  });
});
