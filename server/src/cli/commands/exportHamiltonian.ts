/**
 * `tessera export <spec> --to fcidump|pauli [--fragment <name>] [--out <file>]`: the active-space
 * Hamiltonian of a quantum fragment for a solver, computed exactly as `estimate --mean-field`
 * computes it (the same requests, queue and worker): its own restricted mean field (RHF; ROHF for
 * open shells), the canonical window of its active space.
 *
 * fcidump: the integral dump of Knowles & Handy, Comput. Phys. Commun. 54, 75 (1989)
 *   (electronic/handoff/fcidump.ts), every orbital in irrep 1 (no symmetry);
 * pauli: Tessera's qubit Hamiltonian JSON (docs/qubit-hamiltonian-json.md) under the fragment's
 *   mapping, up to 16 active orbitals.
 * Both stream through the safe output writer (cli/outputFile.ts). A spec with errors exports
 * nothing (exit 1), like the geometry exports.
 */
import { fcidumpLines, qubitHamiltonianJson } from '../../electronic/handoff';
import { canBuildExplicitly, explicitLimitNote, qubitHamiltonian } from '../../electronic/hamiltonian/qubitHamiltonian';
import type { Mapping } from '../../chemistry/qubits';
import type { HamiltonianSpace } from '../../analysis';
import { exitCode, EXIT_ERRORS, EXIT_INTERRUPTED, EXIT_OK, EXIT_USAGE, UsageError, type CliIo } from '../io';
import { loadSpecToExport, writeOutput, type LoadedSpec } from '../specFile';
import { computeMeanFields } from './meanField';

export const HAMILTONIAN_TARGETS = ['fcidump', 'pauli'] as const;
export type HamiltonianTarget = (typeof HAMILTONIAN_TARGETS)[number];

/** Active orbitals beyond this are not dumped: (pq|rs) grows as n⁴/8 (64 orbitals: 2.1 million values, 160 MB of text). */
export const FCIDUMP_ORBITAL_LIMIT = 64;

export interface HamiltonianExportOptions {
  readonly spec: string;
  readonly to: HamiltonianTarget;
  readonly out?: string;
  /** The quantum fragment to export; needed when the spec has more than one. */
  readonly fragment?: string;
}

/** The quantum fragment the export is about, or a usage error that names the choices. */
function chosenFragment(spec: LoadedSpec, name: string | undefined): number {
  const quantum = spec.analysis.model.fragments.filter((fragment) => fragment.tier?.level === 'quantum');
  if (name !== undefined) {
    const fragment = spec.analysis.model.fragments.find((candidate) => candidate.name === name);
    if (!fragment) throw new UsageError(`--fragment ${name}: ${spec.file} has no fragment of that name${quantum.length ? ` (quantum fragments: ${quantum.map((f) => f.name).join(', ')})` : ''}`);
    if (fragment.tier?.level !== 'quantum') throw new UsageError(`--fragment ${name}: the fragment is not in the quantum tier; only quantum fragments have an active-space Hamiltonian to export`);
    return fragment.index;
  }
  if (quantum.length === 0) throw new UsageError(`${spec.file} has no quantum-tier fragment: nothing to export as a Hamiltonian`);
  if (quantum.length > 1) throw new UsageError(`${spec.file} has ${quantum.length} quantum fragments (${quantum.map((f) => f.name).join(', ')}); choose one with --fragment <name>`);
  return quantum[0]!.index;
}

export async function runHamiltonianExport(options: HamiltonianExportOptions, io: CliIo): Promise<number> {
  const spec = loadSpecToExport(options.spec, options.out, io);
  if (typeof spec === 'number') return spec;
  const index = chosenFragment(spec, options.fragment);
  const fragment = spec.analysis.model.fragments[index]!;
  const plan = spec.analysis.estimates.plan(index);
  if (!plan) {
    io.stderr(`tessera: fragment ${fragment.name}: no valid active space; nothing exported.\n`);
    return EXIT_ERRORS;
  }
  const { electrons, orbitals } = plan.active;
  if (options.to === 'pauli' && !canBuildExplicitly(orbitals)) {
    io.stderr(`tessera: fragment ${fragment.name}: ${explicitLimitNote(orbitals)}; no qubit Hamiltonian to export.\n`);
    return EXIT_ERRORS;
  }
  if (orbitals > FCIDUMP_ORBITAL_LIMIT) {
    io.stderr(`tessera: fragment ${fragment.name}: ${orbitals} active orbitals; Tessera dumps integrals of up to ${FCIDUMP_ORBITAL_LIMIT} active orbitals.\n`);
    return EXIT_ERRORS;
  }
  // The orbitals the fragment's active-space job chose (per irrep, shells, natural), else the canonical window.
  const choice = spec.analysis.activeSpaceChoice(index);
  const space: HamiltonianSpace = choice && 'kind' in choice && choice.kind === 'selection' ? choice : { kind: 'window', electrons, orbitals };
  const run = await computeMeanFields(
    spec.analysis,
    {
      activeSpaces: (computation) => (computation.part.kind === 'fragment' && computation.part.index === index ? space : null),
      onlyParts: (computation) => computation.part.kind === 'fragment' && computation.part.index === index,
    },
    io,
  );
  if (run.interrupted) {
    io.stderr('tessera: interrupted: nothing exported.\n');
    return EXIT_INTERRUPTED;
  }
  const result = run.hamiltonians.find((part) => part.result.state !== 'not-asked')?.result;
  if (!result || result.state !== 'computed') {
    const why = result?.state === 'failed' ? result.message : result?.state === 'bound' ? result.note : 'it was not computed';
    io.stderr(`tessera: fragment ${fragment.name}: Hamiltonian not computed: ${why}\nNothing exported.\n`);
    return exitCode({ internal: result?.state === 'failed' && (result.code === 'internal' || result.code === 'worker'), errors: true });
  }
  const outcome = result.outcome;
  const mapping: Mapping = fragment.tier?.mapping ?? 'jordan-wigner';
  const content: Iterable<string> =
    options.to === 'fcidump'
      ? chunked(fcidumpLines(outcome.integrals))
      : qubitHamiltonianJson(qubitHamiltonian(outcome.integrals, mapping), {
          source: `fragment ${fragment.name} of ${spec.file}: ${outcome.source}`,
          activeOrbitals: [...outcome.active],
        });
  return (await writeOutput(content, options.out, spec, io)) ? EXIT_OK : EXIT_USAGE;
}

/** Lines joined with newlines, a few thousand at a time, so a large dump is streamed, not built. */
function* chunked(lines: Iterable<string>, size = 4096): Generator<string, void, undefined> {
  let batch: string[] = [];
  for (const line of lines) {
    batch.push(line);
    if (batch.length === size) {
      yield `${batch.join('\n')}\n`;
      batch = [];
    }
  }
  if (batch.length > 0) yield `${batch.join('\n')}\n`;
}
