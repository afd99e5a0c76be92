/**
 * The exponent files (server/src/chemistry/data/basis-sets, generated from psi4-data by
 * scripts/data/generate_basis_library.py) against the shell table the language layer uses, and the
 * compressed copies the build puts next to the bundles.
 */
import * as path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import library from '../../server/src/chemistry/data/basis-library.json';
import { allBasisSets } from '../../server/src/chemistry/basis/library';
import { basisDataKeys, jkfitBasisFor, loadBasisSetData, setBasisDataFolder, UnknownBasisError, BasisDataUnavailableError } from '../../server/src/electronic/basis/data';

const root = path.resolve(__dirname, '..', '..');

afterEach(() => setBasisDataFolder(undefined));

describe('basis-set exponent files', () => {
  const pairs = allBasisSets().flatMap((basis) => basis.elements.map((symbol) => [basis.key, symbol] as const));

  it('cover every (basis, element) pair of the shell table', () => {
    expect(pairs.length).toBeGreaterThan(1000);
    for (const [key, symbol] of pairs) expect(loadBasisSetData(key).elements.has(symbol), `${key} ${symbol}`).toBe(true);
  });

  it.each(allBasisSets().map((b) => [b.key] as const))('%s: shells per momentum, ECP core electrons and exponents agree with the table', (key) => {
    const basis = allBasisSets().find((b) => b.key === key)!;
    const data = loadBasisSetData(key);
    expect(data.functions).toBe(basis.functions);
    expect([...data.elements.keys()]).toEqual(basis.elements);
    for (const symbol of basis.elements) {
      const element = data.elements.get(symbol)!;
      const counts: number[] = [];
      for (const shell of element.shells) {
        counts[shell.l] = (counts[shell.l] ?? 0) + 1;
        expect(shell.exponents.length).toBe(shell.coefficients.length);
        expect(shell.exponents.length).toBeGreaterThan(0);
        for (const exponent of shell.exponents) expect(exponent).toBeGreaterThan(0);
      }
      expect(Array.from(counts, (c) => c ?? 0)).toEqual([...basis.shellsFor(symbol)!]);
      expect(element.ecp?.coreElectrons ?? 0).toBe(basis.ecpCoreElectrons(symbol));
    }
  });

  it('carries the def2 effective core potentials: a local channel and projectors up to lmax − 1', () => {
    const iodine = loadBasisSetData('def2-svp').elements.get('I')!.ecp!;
    expect(iodine.coreElectrons).toBe(28);
    expect(iodine.channels[0]!.l).toBe(-1);
    expect(iodine.channels.slice(1).map((c) => c.l)).toEqual([0, 1, 2]);
    for (const channel of iodine.channels) {
      expect(channel.powers.length).toBe(channel.exponents.length);
      expect(channel.coefficients.length).toBe(channel.exponents.length);
    }
    expect(loadBasisSetData('def2-svp').elements.get('Kr')!.ecp).toBeUndefined();
  });

  it('keeps psi4-data values exactly: the cc-pVDZ hydrogen s exponents (Dunning 1989 as distributed)', () => {
    // /usr/share/psi4/basis/cc-pvdz.gbs, first H shell, read by hand from the file.
    const h = loadBasisSetData('cc-pVDZ').elements.get('H')!;
    expect(h.shells.map((s) => s.l)).toEqual([0, 0, 1]);
    expect(h.shells[0]!.exponents).toEqual([13.01, 1.962, 0.4446]);
    expect(h.shells[0]!.coefficients).toEqual([0.019685, 0.137977, 0.478148]);
    expect(h.shells[1]!.exponents).toEqual([0.122]);
  });

  it('has the JKFIT set psi4 pairs with each basis, for the same elements where the family covers them', () => {
    expect(jkfitBasisFor('cc-pVDZ')).toBe('cc-pvdz-jkfit');
    expect(jkfitBasisFor('def2-TZVPP')).toBe('def2-tzvpp-jkfit');
    expect(jkfitBasisFor('6-31G*')).toBe('cc-pvdz-jkfit');
    for (const basis of allBasisSets()) {
      const aux = loadBasisSetData(jkfitBasisFor(basis.key)!);
      expect(aux.key.endsWith('-jkfit')).toBe(true);
      for (const symbol of ['H', 'C', 'N', 'O']) if (basis.shellsFor(symbol)) expect(aux.elements.has(symbol), `${aux.key} ${symbol}`).toBe(true);
    }
    const auxiliary = (library as unknown as { auxiliary: Record<string, unknown> }).auxiliary;
    expect(basisDataKeys()).toEqual([...Object.keys(library.bases), ...Object.keys(auxiliary)]);
  });

  it('reads the Brotli-compressed copies the build puts next to the bundles, with the same content', () => {
    const fromSources = loadBasisSetData('def2-tzvp');
    setBasisDataFolder(path.join(root, 'dist', 'basis-sets'));
    const fromBundle = loadBasisSetData('def2-tzvp');
    expect(fromBundle).not.toBe(fromSources);
    expect(fromBundle).toEqual(fromSources);
  });

  it('says what is wrong for an unknown basis and for a missing data folder', () => {
    expect(() => loadBasisSetData('cc-pV7Z')).toThrow(UnknownBasisError);
    expect(() => loadBasisSetData('cc-pV7Z')).toThrow(/cc-pV7Z.*not in the basis library/);
    setBasisDataFolder(path.join(root, 'no-such-folder'));
    expect(() => loadBasisSetData('sto-3g')).toThrow(BasisDataUnavailableError);
    expect(() => loadBasisSetData('sto-3g')).toThrow(/sto-3g\.json was found in none of .*no-such-folder/);
  });
});
