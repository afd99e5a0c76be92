/**
 * The character tables of D2h and its subgroups (transcribed from F. A. Cotton, Chemical
 * Applications of Group Theory, 3rd ed., Wiley 1990, Appendix IIA) against the properties every
 * character table has (the orthogonality theorem, Cotton §4.3), and the generator bit masks
 * against character products.
 */
import { describe, expect, it } from 'vitest';
import { ABELIAN_GROUPS, CHARACTER_TABLES, irrepByMask, irrepProduct, OPERATION_SIGNS } from '../../../server/src/chemistry/symmetry';

describe('character tables of D2h and its subgroups (properties from Cotton 1990, §4.3)', () => {
  it.each(ABELIAN_GROUPS)('%s: as many irreps as operations, rows orthogonal with norm h', (group) => {
    const table = CHARACTER_TABLES[group];
    const h = table.operations.length;
    expect(table.irreps).toHaveLength(h);
    for (const a of table.irreps) {
      for (const b of table.irreps) {
        const sum = a.characters.reduce((total, chi, k) => total + chi * b.characters[k]!, 0);
        expect(sum).toBe(a === b ? h : 0);
      }
    }
  });

  it.each(ABELIAN_GROUPS)('%s: the operations form a group (closed under products of their sign patterns)', (group) => {
    const table = CHARACTER_TABLES[group];
    const key = (signs: readonly number[]) => signs.join(',');
    const present = new Set(table.operations.map((name) => key(OPERATION_SIGNS[name])));
    for (const a of table.operations) {
      for (const b of table.operations) {
        const product = OPERATION_SIGNS[a].map((s, k) => s * OPERATION_SIGNS[b][k]!);
        expect(present.has(key(product))).toBe(true);
      }
    }
  });

  it.each(ABELIAN_GROUPS)('%s: masks are distinct and the XOR of masks is the product of characters', (group) => {
    const table = CHARACTER_TABLES[group];
    expect(new Set(table.irreps.map((irrep) => irrep.mask)).size).toBe(table.irreps.length);
    for (const a of table.irreps) {
      for (const b of table.irreps) {
        const product = a.characters.map((chi, k) => chi * b.characters[k]!);
        const byMask = irrepByMask(group, a.mask ^ b.mask)!;
        expect(byMask.characters).toEqual(product);
        expect(irrepProduct(group, a.label, b.label)).toBe(byMask.label);
      }
    }
  });

  it('the first irrep is totally symmetric with mask 0 (Cotton 1990 lists it first; mask 0 by definition of the masks)', () => {
    for (const group of ABELIAN_GROUPS) {
      const first = CHARACTER_TABLES[group].irreps[0]!;
      expect(first.mask).toBe(0);
      expect(first.characters.every((chi) => chi === 1)).toBe(true);
    }
  });

  it('textbook products (Cotton, App. IIA; from memory): B1 × B2 = A2 in C2v, B1u × B2u = B3g in D2h, Au × Bu = Bg in C2h', () => {
    expect(irrepProduct('C2v', 'B1', 'B2')).toBe('A2');
    expect(irrepProduct('D2h', 'B1u', 'B2u')).toBe('B3g');
    expect(irrepProduct('C2h', 'Au', 'Bu')).toBe('Bg');
    expect(irrepProduct('Cs', 'A"', 'A"')).toBe("A'");
  });

  it('x, y, z transform as B1, B2, A1 in C2v and B3u, B2u, B1u in D2h (Cotton, App. IIA; from memory)', () => {
    // A coordinate's character under an operation is the operation's sign on that axis.
    const irrepOf = (group: 'C2v' | 'D2h', axis: number) => {
      const table = CHARACTER_TABLES[group];
      const characters = table.operations.map((name) => OPERATION_SIGNS[name][axis]!);
      return table.irreps.find((irrep) => irrep.characters.every((chi, k) => chi === characters[k]))!.label;
    };
    expect([0, 1, 2].map((axis) => irrepOf('C2v', axis))).toEqual(['B1', 'B2', 'A1']);
    expect([0, 1, 2].map((axis) => irrepOf('D2h', axis))).toEqual(['B3u', 'B2u', 'B1u']);
  });
});
