/**
 * Two-electron integrals, CPU time: set-up (shell pairs, Schwarz factors, storage plan), the first
 * Coulomb and exchange build (which also fills the storage) and a later one, for water/cc-pVDZ,
 * benzene/6-31G* (102 functions), benzene/cc-pVDZ (114) and tetracene/cc-pVDZ (312), with psi4's
 * conventional SCF (scf_type pk, one thread, its own CPU time) in the same run when psi4 is
 * installed.
 *
 * Geometries are idealised and invented (C–C 1.39 Å, C–H 1.09 Å, 120° everywhere; water 0.957 Å,
 * 104.5°). The density is the overlap matrix: it decays with distance like a real density, so that
 * density screening behaves realistically without an SCF.
 *
 * The SCF targets of the mean-field engine (water under 1 s; benzene within 2× psi4's conventional
 * SCF on one thread; 300 functions under 3 minutes) are timed whole in bench/scf.ts; this table
 * projects the integral part of 15 builds for comparison.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { buildMolecularBasis, type BasisAtom } from '../server/src/electronic/basis';
import type { MolecularBasis } from '../server/src/electronic/contracts';
import { createTwoElectronIntegrals, overlapMatrix } from '../server/src/electronic/integrals';
import { ms } from './timing';

const ANGSTROM = 1 / 0.529177210903;

interface Case {
  readonly name: string;
  readonly basis: string;
  readonly atoms: BasisAtom[];
  readonly runs: number;
}

/** Water in the yz plane, atoms in ångström converted to bohr. */
function water(): BasisAtom[] {
  const half = (104.5 / 2) * (Math.PI / 180);
  const r = 0.957;
  return [
    { symbol: 'O', x: 0, y: 0, z: 0 },
    { symbol: 'H', x: 0, y: r * Math.sin(half), z: r * Math.cos(half) },
    { symbol: 'H', x: 0, y: -r * Math.sin(half), z: r * Math.cos(half) },
  ].map(toBohr);
}

function toBohr(atom: BasisAtom): BasisAtom {
  return { symbol: atom.symbol, x: atom.x * ANGSTROM, y: atom.y * ANGSTROM, z: atom.z * ANGSTROM };
}

/**
 * n linearly fused benzene rings along x (benzene, naphthalene, anthracene, tetracene …), planar
 * in xy, with hydrogens on every carbon that has only two carbon neighbours.
 */
export function acene(rings: number): BasisAtom[] {
  const cc = 1.39;
  const ch = 1.09;
  const carbons: [number, number][] = [];
  const key = (x: number, y: number): string => `${x.toFixed(3)},${y.toFixed(3)}`;
  const seen = new Set<string>();
  for (let ring = 0; ring < rings; ring++) {
    const cx = ring * cc * Math.sqrt(3);
    for (let k = 0; k < 6; k++) {
      const angle = (Math.PI / 3) * k + Math.PI / 6;
      const x = cx + cc * Math.cos(angle);
      const y = cc * Math.sin(angle);
      if (!seen.has(key(x, y))) {
        seen.add(key(x, y));
        carbons.push([x, y]);
      }
    }
  }
  const atoms: BasisAtom[] = carbons.map(([x, y]) => ({ symbol: 'C', x, y, z: 0 }));
  for (const [x, y] of carbons) {
    const neighbours = carbons.filter(([u, v]) => Math.hypot(u - x, v - y) < cc * 1.1 && (u !== x || v !== y));
    if (neighbours.length !== 2) continue;
    // Away from the mean of the two neighbours.
    const mx = (neighbours[0]![0] + neighbours[1]![0]) / 2 - x;
    const my = (neighbours[0]![1] + neighbours[1]![1]) / 2 - y;
    const norm = Math.hypot(mx, my);
    atoms.push({ symbol: 'H', x: x - (ch * mx) / norm, y: y - (ch * my) / norm, z: 0 });
  }
  return atoms.map(toBohr);
}

const CASES: Case[] = [
  { name: 'water', basis: 'cc-pVDZ', atoms: water(), runs: 5 },
  { name: 'benzene', basis: '6-31G*', atoms: acene(1), runs: 3 },
  { name: 'benzene', basis: 'cc-pVDZ', atoms: acene(1), runs: 3 },
  { name: 'tetracene', basis: 'cc-pVDZ', atoms: acene(4), runs: 2 },
].filter((c) => !process.env.TESSERA_BENCH_SMALL || c.name !== 'tetracene');

function kindOf(name: string): 'spherical' | 'cartesian' {
  return name.startsWith('6-31') ? 'cartesian' : 'spherical';
}

/**
 * psi4's conventional SCF on one thread: the CPU seconds psi4 reports for the run ("Total time",
 * user + system, after its Python start-up), or null without psi4.
 */
function psi4Seconds(c: Case): number | null {
  if (process.env.TESSERA_BENCH_NO_PSI4) return null;
  try {
    execFileSync('psi4', ['--version'], { stdio: 'ignore' });
  } catch {
    return null;
  }
  const folder = mkdtempSync(path.join(tmpdir(), 'tessera-bench-psi4-'));
  try {
    const geometry = c.atoms.map((a) => `${a.symbol} ${a.x.toFixed(10)} ${a.y.toFixed(10)} ${a.z.toFixed(10)}`).join('\n');
    const input = [
      'molecule m {',
      '0 1',
      geometry,
      'units bohr',
      'symmetry c1',
      'no_com',
      'no_reorient',
      '}',
      `set basis ${c.basis}`,
      `set puream ${kindOf(c.basis) === 'spherical' ? 'true' : 'false'}`,
      'set scf_type pk',
      'set guess sad',
      'set e_convergence 1e-8',
      'set d_convergence 1e-8',
      "energy('scf')",
      '',
    ].join('\n');
    writeFileSync(path.join(folder, 'input.dat'), input);
    execFileSync('psi4', ['-n', '1', 'input.dat', 'output.dat'], { cwd: folder, stdio: 'ignore', env: { ...process.env, PSI_SCRATCH: folder, OMP_NUM_THREADS: '1', MKL_NUM_THREADS: '1' } });
    const output = readFileSync(path.join(folder, 'output.dat'), 'utf8');
    const total = output.slice(output.lastIndexOf('Total time:'));
    const user = /user time\s*=\s*([0-9.]+) seconds/.exec(total);
    const system = /system time\s*=\s*([0-9.]+) seconds/.exec(total);
    if (!user || !system) throw new Error('psi4 printed no total time');
    return Number(user[1]) + Number(system[1]);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

interface CaseResult {
  readonly basis: MolecularBasis;
  readonly setup: number;
  readonly first: number;
  readonly later: number;
  readonly computed: number;
  readonly stored: number;
  readonly rss: number;
}

/** CPU milliseconds of `work` (user + system): steadier than wall time on a shared machine. */
function cpu(work: () => void): number {
  const start = process.cpuUsage();
  work();
  const used = process.cpuUsage(start);
  return (used.user + used.system) / 1000;
}

function oneCase(c: Case): CaseResult {
  const basis = buildMolecularBasis(c.atoms, c.basis, kindOf(c.basis));
  let eri: ReturnType<typeof createTwoElectronIntegrals> | undefined;
  const setup = cpu(() => {
    eri = createTwoElectronIntegrals(basis);
  });
  const integrals = eri!;
  const n = basis.functionCount;
  const density = overlapMatrix(basis);
  const J = [new Float64Array(n * n)];
  const K = [new Float64Array(n * n)];
  const first = cpu(() => integrals.buildJK([density], J, K));
  const computed = integrals.lastStatistics.quartetsComputed;
  const later: number[] = [];
  for (let run = 1; run < c.runs; run++) later.push(cpu(() => integrals.buildJK([density], J, K)));
  later.sort((a, b) => a - b);
  return { basis, setup, first, later: later.length ? later[Math.floor(later.length / 2)]! : first, computed, stored: integrals.storedFraction, rss: process.memoryUsage().rss };
}

export function benchIntegrals(): string[] {
  const lines = [
    '## Two-electron integrals (J/K builds, CPU time)',
    '',
    '| system | functions | set-up | first J+K build | later build | integrals | 15 builds (projected) | psi4 conventional SCF, 1 thread (CPU, as psi4 reports it) | ratio | memory (RSS) |',
    '| --- | ---: | ---: | ---: | ---: | --- | ---: | ---: | ---: | ---: |',
  ];
  let psi4Missing = false;
  for (const c of CASES) {
    const r = oneCase(c);
    process.stderr.write(`integrals: ${c.name}/${c.basis} set-up ${ms(r.setup)}, first ${ms(r.first)}, later ${ms(r.later)}\n`);
    const projected = r.setup + r.first + 14 * r.later;
    // psi4's conventional SCF stores N⁴/8 integrals: only timed where the target compares with it.
    const psi4 = r.basis.functionCount <= 120 ? psi4Seconds(c) : undefined;
    if (psi4 === null) psi4Missing = true;
    const psi4Text = psi4 === undefined ? 'not timed (target is absolute)' : psi4 === null ? 'psi4 not installed' : `${psi4.toFixed(2)} s`;
    const ratio = typeof psi4 === 'number' ? (projected / 1000 / psi4).toFixed(2) : '—';
    lines.push(
      `| ${c.name}/${c.basis} | ${r.basis.functionCount} | ${ms(r.setup)} | ${ms(r.first)} (${r.computed} quartets) | ${ms(r.later)} | ${r.stored === 1 ? 'stored' : r.stored === 0 ? 'direct' : `${(100 * r.stored).toFixed(0)}% of values stored`} | ${(projected / 1000).toFixed(2)} s | ${psi4Text} | ${ratio} | ${(r.rss / 2 ** 20).toFixed(0)} MiB |`,
    );
  }
  lines.push(
    '',
    'Density: the overlap matrix; threshold 1e-12; integrals kept in memory up to 512 MiB (all when they fit, else the dearest to compute per value; the rest recomputed).',
    '"15 builds (projected)": set-up + first build + 14 later builds, an estimate of the integral part of an SCF of 15 iterations',
    '(without the SCF\'s own linear algebra and without incremental builds). Ratio: that projection over psi4\'s SCF CPU time.',
    'Targets (issue 9 §6, for the whole SCF): water/cc-pVDZ under 1 s; benzene within 2× psi4; 300 functions under 3 minutes and 1.5 GB.',
  );
  if (psi4Missing) lines.push('', 'psi4 is not installed here: no psi4 times were measured in this run.');
  return lines;
}
