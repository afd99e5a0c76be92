/**
 * Checking a spec never reads the exponent files: only building a molecular basis does. Kept in a
 * file of its own so that no other test has loaded a basis in the same module graph.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/language/analyze';
import { buildMolecularBasis, loadedBasisSets } from '../../server/src/electronic/basis';

describe('lazy loading', () => {
  it('checking a spec reads no exponent file', () => {
    const root = path.resolve(__dirname, '..', '..');
    const file = path.join(root, 'samples', 'molecules', 'benzene-6-31gs.tess');
    const analysis = analyze(readFileSync(file, 'utf8'), { path: file });
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(analysis.model.atoms.length ?? 0).toBeGreaterThan(0);
    expect(loadedBasisSets()).toEqual([]);
    buildMolecularBasis([{ symbol: 'H', x: 0, y: 0, z: 0 }], '6-31G*', 'cartesian');
    expect(loadedBasisSets()).toEqual(['6-31g*']);
  });
});
