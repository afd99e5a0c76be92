/**
 * Canonical-orbital active spaces against Debian's psi4 1.3.2 (tests/fixtures/scf-reference.psi4.json,
 * made by scripts/data/generate_scf_reference_fixture.py): the orbitals a window picks carry psi4's
 * orbital energies (to 1e-5 hartree) and psi4's irrep labels, for RHF and ROHF parts. The per-irrep
 * choice is checked against an enumeration of every split written here from its definition (the
 * chosen orbitals nearest the Fermi level, contiguous in each irrep), on psi4's energies and labels.
 */
import { describe, expect, it } from 'vitest';
import { activeIrrepCounts, ActiveSelectionError, canonicalWindow, irrepWindow } from '../../../server/src/electronic/activeSpace';
import { fixtureCase, psi4Label, selectionReference, type ReferenceCase } from './scfFixture';

/** psi4's orbitals (energy, irrep, electrons) in ascending energy, from the fixture's alpha and beta lists. */
function psi4Orbitals(entry: ReferenceCase): { energy: number; irrep: string; electrons: number }[] {
  const alphaCount = (entry.docc.reduce((a, b) => a + b, 0) + entry.socc.reduce((a, b) => a + b, 0));
  const betaCount = entry.docc.reduce((a, b) => a + b, 0);
  return entry.alpha.energies.map((energy, p) => ({ energy, irrep: psi4Label(entry.alpha.irreps[p]!), electrons: (p < alphaCount ? 1 : 0) + (p < betaCount ? 1 : 0) }));
}

describe('the canonical window Ne No against psi4 orbitals', () => {
  it('water cc-pVDZ RHF, 4e 4o: the two highest occupied and two lowest virtual orbitals, with psi4 1.3.2 energies and irreps (fixture)', () => {
    const entry = fixtureCase('water', 'cc-pvdz', 'rhf');
    const selection = canonicalWindow(selectionReference(entry), 4, 4);
    const psi4 = psi4Orbitals(entry);
    expect(selection.core).toEqual([0, 1, 2]);
    expect(selection.active).toEqual([3, 4, 5, 6]);
    expect(selection.electrons).toEqual({ alpha: 2, beta: 2 });
    selection.details.forEach((orbital, k) => {
      expect(Math.abs(orbital.energy! - psi4[3 + k]!.energy)).toBeLessThan(1e-5);
      expect(orbital.irrep).toBe(psi4[3 + k]!.irrep);
      expect(orbital.occupation).toBe(psi4[3 + k]!.electrons);
    });
  });

  it('water cc-pVDZ: the HOMO, 1b1, is the out-of-plane oxygen lone pair, mainly O p (from memory: a nonbonding orbital of the water textbook diagram)', () => {
    const entry = fixtureCase('water', 'cc-pvdz', 'rhf');
    const homo = canonicalWindow(selectionReference(entry), 2, 1).details[0]!;
    expect(homo.irrep).toBe('B1');
    expect(homo.character?.symbol).toBe('O');
    expect(homo.character?.l).toBe(1);
    expect(homo.character!.weight).toBeGreaterThan(0.9);
  });

  it('methylene triplet cc-pVDZ ROHF, 2e 2o: the two singly occupied orbitals (psi4 1.3.2 socc, fixture)', () => {
    const entry = fixtureCase('methylene triplet', 'cc-pvdz', 'rohf');
    const selection = canonicalWindow(selectionReference(entry), 2, 2);
    expect(selection.electrons).toEqual({ alpha: 2, beta: 0 });
    expect(selection.details.map((d) => d.occupation)).toEqual([1, 1]);
    const expected = entry.irrepLabels.flatMap((label, h) => Array<string>(entry.socc[h]!).fill(psi4Label(label))).sort();
    expect(selection.details.map((d) => d.irrep).sort()).toEqual(expected);
  });

  it('dioxygen triplet 6-31G* ROHF, 6e 4o keeps both singly occupied π* orbitals active (psi4 1.3.2 socc, fixture)', () => {
    const entry = fixtureCase('dioxygen triplet', '6-31g*', 'rohf');
    const selection = canonicalWindow(selectionReference(entry), 6, 4);
    expect(selection.electrons).toEqual({ alpha: 4, beta: 2 });
    expect(selection.details.filter((d) => d.occupation === 1)).toHaveLength(2);
    const socc = entry.irrepLabels.flatMap((label, h) => Array<string>(entry.socc[h]!).fill(psi4Label(label))).sort();
    expect(selection.details.filter((d) => d.occupation === 1).map((d) => d.irrep).sort()).toEqual(socc);
  });

  it('refuses windows that do not fit, saying why (by construction: water has 10 electrons, 5 occupied orbitals)', () => {
    const reference = selectionReference(fixtureCase('water', 'cc-pvdz', 'rhf'));
    expect(() => canonicalWindow(reference, 3, 4)).toThrow(/odd number/);
    expect(() => canonicalWindow(reference, 12, 8)).toThrow(/has 10/);
    expect(() => canonicalWindow(reference, 8, 3)).toThrow(/at least 4 orbitals/);
    expect(() => canonicalWindow(reference, 4, 40)).toThrow(ActiveSelectionError);
  });
});

/** Every split of each irrep's count into highest occupied and lowest virtual orbitals, keeping the smallest Σ|ε − ε_F|. */
function enumerate(entry: ReferenceCase, counts: Record<string, number>, electrons: number): { energy: number; irrep: string }[] {
  const orbitals = psi4Orbitals(entry);
  const homo = Math.max(...orbitals.filter((o) => o.electrons > 0).map((o) => o.energy));
  const lumo = Math.min(...orbitals.filter((o) => o.electrons === 0).map((o) => o.energy));
  const fermi = (homo + lumo) / 2;
  const labels = Object.keys(counts);
  let best: { cost: number; chosen: { energy: number; irrep: string }[] } | undefined;
  const walk = (h: number, chosen: { energy: number; irrep: string; electrons: number }[]) => {
    if (h === labels.length) {
      if (chosen.reduce((sum, o) => sum + o.electrons, 0) !== electrons) return;
      const cost = chosen.reduce((sum, o) => sum + Math.abs(o.energy - fermi), 0);
      if (!best || cost < best.cost - 1e-12) best = { cost, chosen };
      return;
    }
    const label = labels[h]!;
    const occupied = orbitals.filter((o) => o.irrep === label && o.electrons === 2).reverse();
    const virtual = orbitals.filter((o) => o.irrep === label && o.electrons === 0);
    const k = counts[label]!;
    for (let o = 0; o <= k; o++) {
      if (o > occupied.length || k - o > virtual.length) continue;
      walk(h + 1, [...chosen, ...occupied.slice(0, o), ...virtual.slice(0, k - o)]);
    }
  };
  walk(0, []);
  return best!.chosen.map(({ energy, irrep }) => ({ energy, irrep })).sort((a, b) => a.energy - b.energy);
}

/**
 * Ascending energy, degenerate orbitals (equal to 1e-6 hartree, as N2's πg pair B2g, B3g) by irrep
 * name: which of a degenerate pair comes first depends on rounding, in psi4 as here.
 */
function inDegenerateOrder<T extends { energy: number; irrep: string }>(orbitals: T[]): T[] {
  return [...orbitals].sort((a, b) => Math.round(a.energy * 1e6) - Math.round(b.energy * 1e6) || a.irrep.localeCompare(b.irrep));
}

describe('the per-irrep window against an enumeration on psi4 orbitals', () => {
  const cases: { name: string; basis: string; counts: Record<string, number>; electrons: number }[] = [
    // Fixture cases of tests/fixtures/scf-reference.psi4.json (psi4 1.3.2); counts chosen to exercise the split.
    { name: 'water', basis: 'cc-pvdz', counts: { A1: 3, B1: 1, B2: 2 }, electrons: 6 },
    { name: 'water', basis: 'cc-pvdz', counts: { A1: 2, B2: 2 }, electrons: 4 },
    { name: 'dinitrogen', basis: 'cc-pvdz', counts: { Ag: 1, B1u: 1, B2u: 1, B3u: 1, B2g: 1, B3g: 1 }, electrons: 6 },
    { name: 'dinitrogen', basis: 'cc-pvdz', counts: { Ag: 2, B1u: 2, B2u: 1, B3u: 1, B2g: 1, B3g: 1 }, electrons: 10 },
    { name: 'formaldehyde', basis: 'def2-svp', counts: { A1: 2, B1: 2, B2: 2 }, electrons: 6 },
  ];
  it.each(cases)('$name $basis, $electrons electrons in $counts (fixture)', ({ name, basis, counts, electrons }) => {
    const entry = fixtureCase(name, basis, 'rhf');
    const selection = irrepWindow(selectionReference(entry), Object.entries(counts).map(([label, count]) => ({ label, count })), electrons);
    const expected = inDegenerateOrder(enumerate(entry, counts, electrons));
    expect(selection.details).toHaveLength(expected.length);
    inDegenerateOrder(selection.details.map((orbital) => ({ energy: orbital.energy!, irrep: orbital.irrep! }))).forEach((orbital, k) => {
      expect(Math.abs(orbital.energy! - expected[k]!.energy)).toBeLessThan(1e-5);
      expect(orbital.irrep).toBe(expected[k]!.irrep);
    });
    expect(selection.electrons.alpha + selection.electrons.beta).toBe(electrons);
    const counted = Object.fromEntries(activeIrrepCounts(selection)!.map(({ label, count }) => [label, count]));
    expect(counted).toEqual(counts);
  });

  it('names the irreps a part has when a label is unknown (water is C2v: A1, A2, B1, B2 by definition)', () => {
    const reference = selectionReference(fixtureCase('water', 'cc-pvdz', 'rhf'));
    expect(() => irrepWindow(reference, [{ label: 'Eg', count: 2 }], 2)).toThrow(/no irrep 'Eg'.*C2v/);
    expect(() => irrepWindow(reference, [{ label: 'A2', count: 1 }], 2)).toThrow(/0 to 0 active electrons/);
  });

  it('accepts labels in another letter case (by definition of the spec labels)', () => {
    const reference = selectionReference(fixtureCase('water', 'cc-pvdz', 'rhf'));
    expect(irrepWindow(reference, [{ label: 'b1', count: 1 }], 2).details[0]!.irrep).toBe('B1');
  });
});
