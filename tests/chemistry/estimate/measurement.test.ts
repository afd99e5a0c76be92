/**
 * Qubit-wise commuting groups (server/src/chemistry/estimate/measurement.ts): largest-degree-first
 * greedy grouping (Verteletskyi, Yen, Izmaylov, J. Chem. Phys. 152, 124114 (2020)) and the
 * estimate from the term count beyond 20 qubits.
 */
import { describe, expect, it } from 'vitest';
import { irrepMasks, noSymmetryPattern, symmetryPattern } from '../../../server/src/chemistry/estimate/integralPattern';
import {
  EXPLICIT_GROUPING_QUBITS,
  QWC_GROUPS_PER_TERM,
  estimateQubitWiseGroups,
  groupQubitWise,
  jordanWignerStrings,
  measurementGroups,
  type PauliStrings,
} from '../../../server/src/chemistry/estimate/measurement';
import { countPauliTerms } from '../../../server/src/chemistry/estimate/pauliTerms';

function qubitWiseCommute(strings: PauliStrings, a: number, b: number): boolean {
  const support = (strings.x[a]! | strings.z[a]!) & (strings.x[b]! | strings.z[b]!);
  return (support & ((strings.x[a]! ^ strings.x[b]!) | (strings.z[a]! ^ strings.z[b]!))) === 0;
}

/** Orbitals spread round-robin over the irreps of a group with `generators` generators. */
function roundRobin(n: number, generators: number): number[] {
  return Array.from({ length: n }, (_, i) => i % 2 ** generators);
}

describe('qubit-wise commuting groups', () => {
  it('H2 in STO-3G under Jordan–Wigner: 14 non-identity strings in 5 groups (counted by hand, no source)', () => {
    // The 10 diagonal strings share one group; XXYY, YYXX, XYYX, YXXY conflict pairwise.
    const strings = jordanWignerStrings(symmetryPattern(irrepMasks('D2h', ['Ag', 'B1u'])));
    expect(strings.length).toBe(15); // Seeley, Richard & Love 2012: 15 strings
    expect(groupQubitWise(strings).groups).toBe(5);
  });

  it('every group is qubit-wise commuting and every non-identity string is in one group (by definition of a grouping)', () => {
    for (const irreps of [[0, 0, 0, 0], [0, 1, 2, 3, 0], [0, 3, 5, 6, 1, 2]]) {
      for (const ordering of ['block', 'interleaved'] as const) {
        const strings = jordanWignerStrings(symmetryPattern(irreps), ordering);
        const grouping = groupQubitWise(strings);
        const members: number[][] = Array.from({ length: grouping.groups }, () => []);
        for (let s = 0; s < strings.length; s++) {
          const g = grouping.assignment[s]!;
          if (strings.x[s] === 0 && strings.z[s] === 0) {
            expect(g).toBe(0xffffffff);
            continue;
          }
          expect(g).toBeLessThan(grouping.groups);
          members[g]!.push(s);
        }
        members.forEach((group, g) => {
          expect(group.length).toBe(grouping.sizes[g]);
          for (let i = 0; i < group.length; i++) for (let j = i + 1; j < group.length; j++) expect(qubitWiseCommute(strings, group[i]!, group[j]!)).toBe(true);
        });
        expect(grouping.sizes.reduce((a, b) => a + b, 0)).toBe(strings.length - 1);
      }
    }
  });

  it('no two groups could be merged blindly: each group has a string conflicting with some string of every earlier group', () => {
    const strings = jordanWignerStrings(noSymmetryPattern(4));
    const grouping = groupQubitWise(strings);
    const byGroup: number[][] = Array.from({ length: grouping.groups }, () => []);
    for (let s = 0; s < strings.length; s++) if (grouping.assignment[s] !== 0xffffffff) byGroup[grouping.assignment[s]!]!.push(s);
    // First fit: the first string placed in group g conflicted with every earlier group.
    for (let g = 1; g < grouping.groups; g++) {
      for (let earlier = 0; earlier < g; earlier++) {
        const conflicts = byGroup[g]!.some((a) => byGroup[earlier]!.some((b) => !qubitWiseCommute(strings, a, b)));
        expect(conflicts).toBe(true);
      }
    }
  });

  it('the estimate ratio is the fit to explicit groups for 8–20 qubits (C1, C2v, D2h round-robin; this project, no outside source)', () => {
    let groups = 0;
    let terms = 0;
    for (let n = 4; n <= 10; n++) {
      for (const generators of [0, 2, 3]) {
        const strings = jordanWignerStrings(symmetryPattern(roundRobin(n, generators)));
        groups += groupQubitWise(strings).groups;
        terms += strings.length - 1;
      }
    }
    // By construction: the sums the ratio in measurement.ts was fitted to (this project's enumeration,
    // no outside source); a change in the grouping shows here first.
    expect(groups).toBe(10410);
    expect(terms).toBe(49553);
    expect(Math.abs(QWC_GROUPS_PER_TERM - groups / terms)).toBeLessThan(0.005);
  });

  it('the estimate extrapolates within 10% to D2h at 24 and 28 qubits (explicit grouping, this project)', () => {
    for (const n of [12, 14]) {
      const pattern = symmetryPattern(roundRobin(n, 3));
      const explicit = groupQubitWise(jordanWignerStrings(pattern)).groups;
      const estimate = estimateQubitWiseGroups(countPauliTerms(pattern).jordanWigner);
      expect(Math.abs(estimate - explicit) / explicit).toBeLessThan(0.1);
    }
  });

  // By construction: 7 orbitals are 14 qubits (2n, Jordan–Wigner), 153 groups as enumerated for the
  // fit above; beyond 14 qubits the estimate is the fitted ratio by definition.
  it('measurementGroups is explicit up to 14 qubits and an estimate beyond', () => {
    expect(EXPLICIT_GROUPING_QUBITS).toBe(14);
    const small = measurementGroups(symmetryPattern(roundRobin(7, 3)));
    expect(small).toMatchObject({ qubits: 14, exact: true });
    expect(small.groups).toBe(153); // table in measurement.ts
    expect(measurementGroups(symmetryPattern(roundRobin(8, 3))).exact).toBe(false);
    const large = measurementGroups(symmetryPattern(roundRobin(50, 3)));
    expect(large.exact).toBe(false);
    expect(large.qubits).toBeGreaterThan(EXPLICIT_GROUPING_QUBITS);
    expect(large.groups).toBe(Math.round(QWC_GROUPS_PER_TERM * (large.terms - 1)));
    expect(estimateQubitWiseGroups(1)).toBe(0);
  });

  it('refuses registers beyond 32-bit masks', () => {
    expect(() => jordanWignerStrings(noSymmetryPattern(17))).toThrow(RangeError);
  });
});
