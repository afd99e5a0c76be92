/**
 * Effective-core-potential matrices next to the rest of the one-electron integrals (overlap,
 * kinetic, nuclear attraction) of the same molecule, CPU time in the same run, and psi4's
 * MintsHelper.ao_ecp() and ao_potential() timed inside one psi4 run when psi4 is installed.
 *
 * Geometries are idealised and invented (bond lengths from memory): I2 2.67 Å; HgI2 linear,
 * Hg–I 2.55 Å; Ag4I4 a cube of edge 2.8 Å with Ag and I on alternate corners.
 *
 * Target (planning, ours): the ECP matrix within 60× the CPU time of S + T + V of the same basis
 * (both are computed once per SCF).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { buildMolecularBasis, type BasisAtom } from '../server/src/electronic/basis';
import { EcpIntegrals, kineticMatrix, nuclearAttractionMatrix, overlapMatrix } from '../server/src/electronic/integrals';

const ANGSTROM = 1 / 0.529177210903;
const TARGET_RATIO = 60;

interface Case {
  readonly name: string;
  readonly basis: string;
  readonly atoms: BasisAtom[];
}

function bohr(symbol: string, x: number, y: number, z: number): BasisAtom {
  return { symbol, x: x * ANGSTROM, y: y * ANGSTROM, z: z * ANGSTROM };
}

function cube(): BasisAtom[] {
  const atoms: BasisAtom[] = [];
  for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) for (let k = 0; k < 2; k++) atoms.push(bohr((i + j + k) % 2 === 0 ? 'Ag' : 'I', 2.8 * i, 2.8 * j, 2.8 * k));
  return atoms;
}

const CASES: Case[] = [
  { name: 'I2', basis: 'def2-TZVP', atoms: [bohr('I', 0, 0, 0), bohr('I', 0, 0, 2.67)] },
  { name: 'HgI2', basis: 'def2-TZVP', atoms: [bohr('I', 0, 0, -2.55), bohr('Hg', 0, 0, 0), bohr('I', 0, 0, 2.55)] },
  { name: 'Ag4I4', basis: 'def2-SVP', atoms: cube() },
];

/** CPU milliseconds (user + system) of the fastest of `runs` runs. */
function cpu(work: () => void, runs: number): number {
  let best = Infinity;
  for (let run = 0; run < runs; run++) {
    const start = process.cpuUsage();
    work();
    const used = process.cpuUsage(start);
    best = Math.min(best, (used.user + used.system) / 1000);
  }
  return best;
}

/** psi4's ao_ecp and ao_potential in seconds (CPU of the psi4 process around each call), or null without psi4. */
function psi4Seconds(c: Case): { ecp: number; potential: number } | null {
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
      'import time',
      'molecule m {',
      '0 1',
      geometry,
      'units bohr',
      'symmetry c1',
      'no_com',
      'no_reorient',
      '}',
      `set basis ${c.basis}`,
      'set puream true',
      `bs = psi4.core.Wavefunction.build(m, '${c.basis}').basisset()`,
      'mints = psi4.core.MintsHelper(bs)',
      'start = time.process_time(); mints.ao_ecp(); ecp = time.process_time() - start',
      'start = time.process_time(); mints.ao_potential(); potential = time.process_time() - start',
      `open('${path.join(folder, 'times.txt')}', 'w').write('%.6f %.6f' % (ecp, potential))`,
      '',
    ].join('\n');
    writeFileSync(path.join(folder, 'input.dat'), input);
    execFileSync('psi4', ['-n', '1', 'input.dat', 'output.dat'], { cwd: folder, stdio: 'ignore', env: { ...process.env, PSI_SCRATCH: folder, OMP_NUM_THREADS: '1' } });
    const [ecp, potential] = readFileSync(path.join(folder, 'times.txt'), 'utf8').split(' ').map(Number);
    return { ecp: ecp!, potential: potential! };
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

export function benchEcp(): string[] {
  const lines = [
    '## Effective core potentials (one-electron integrals, CPU time)',
    '',
    '| system | functions | S + T + V | ECP matrix | ratio | target | shell pairs computed / screened | psi4 ao_ecp, ao_potential (CPU) |',
    '| --- | ---: | ---: | ---: | ---: | ---: | ---: | --- |',
  ];
  let psi4Missing = false;
  for (const c of CASES) {
    const basis = buildMolecularBasis(c.atoms, c.basis, 'spherical');
    const oneElectron = cpu(() => {
      overlapMatrix(basis);
      kineticMatrix(basis);
      nuclearAttractionMatrix(basis);
    }, 3);
    let engine: EcpIntegrals | undefined;
    // A new engine per run: the per-shell projections are part of the cost.
    const ecp = cpu(() => {
      engine = new EcpIntegrals(basis);
      engine.matrix();
    }, 3);
    const statistics = engine!.lastStatistics;
    const ratio = ecp / oneElectron;
    const psi4 = psi4Seconds(c);
    if (!psi4 && !process.env.TESSERA_BENCH_NO_PSI4) psi4Missing = true;
    process.stderr.write(`ecp: ${c.name}/${c.basis} S+T+V ${oneElectron.toFixed(1)} ms, ECP ${ecp.toFixed(1)} ms\n`);
    lines.push(
      `| ${c.name}/${c.basis} | ${basis.functionCount} | ${oneElectron.toFixed(1)} ms | ${ecp.toFixed(1)} ms | ${ratio.toFixed(1)}× | ≤ ${TARGET_RATIO}× ${ratio <= TARGET_RATIO ? '(met)' : '(missed)'} | ${statistics.pairsComputed} / ${statistics.pairsScreened} | ${psi4 ? `${(1000 * psi4.ecp).toFixed(0)} ms, ${(1000 * psi4.potential).toFixed(0)} ms` : process.env.TESSERA_BENCH_NO_PSI4 ? 'not timed' : 'psi4 not installed'} |`,
    );
  }
  lines.push('', 'Best of three runs each; the ECP column includes building the engine (per-shell angular factors and screening bounds).');
  if (psi4Missing) lines.push('', 'psi4 is not installed here: no psi4 times were measured in this run.');
  return lines;
}
