/**
 * Orbital counts per irrep by character reduction, timed alone (detection excluded) on the
 * 2,000-atom Oh cluster of bench/symmetry.ts (invented data) in STO-3G and 6-31G: several thousand
 * basis functions, more than the 1,000 of the target. Target: under 200 ms.
 */
import { findBasisSet } from '../server/src/chemistry/basis/library';
import { elementByNumber } from '../server/src/chemistry/elements';
import { detectSymmetry, orbitalIrreps } from '../server/src/chemistry/symmetry';
import { octahedralCluster } from './symmetry';
import { ms, time } from './timing';

export function benchIrreps(): string[] {
  const cluster = octahedralCluster();
  const symmetry = detectSymmetry(cluster.numbers, cluster.coordinates, { nearTolerance: 0 });
  const lines = ['## Orbitals per irrep', '', '| system | basis functions | group | median | p95 |', '| --- | ---: | --- | ---: | ---: |'];
  for (const name of ['sto-3g', '6-31g']) {
    const basis = findBasisSet(name)!;
    const shells = cluster.numbers.map((z) => basis.shellsFor(elementByNumber(z)!.symbol));
    const counts = orbitalIrreps(symmetry, shells, 'cartesian');
    const timing = time(() => orbitalIrreps(symmetry, shells, 'cartesian'), 30);
    lines.push(`| ${cluster.numbers.length}-atom Oh cluster, ${basis.displayName} | ${counts.total} | ${symmetry.abelianGroup} (${symmetry.fullGroup}) | ${ms(timing.median)} | ${ms(timing.p95)} |`);
  }
  lines.push('', 'Target: a system of about 1,000 basis functions under 200 ms.');
  return lines;
}
