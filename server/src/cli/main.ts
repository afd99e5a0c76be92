/**
 * The `tessera` command line. Exit codes: 0 no errors, 1 errors found in a spec or input (or a
 * mean field that could not be computed or did not converge), 2 bad usage or a file that cannot
 * be read or written, 3 Tessera itself failed (a bug) on some file, 130 an interrupt cancelled a
 * computation; in a batch every other file is still checked.
 */
import { escapeForTerminal } from '../language/printable';
import { parseArgs } from 'node:util';
import { joinNegativeValues } from './negativeValues';
import { runCheck } from './commands/check';
import { parseActiveOption, runEstimate, type EstimateFormat } from './commands/estimate';
import { COMPARE_FORMATS, runCompare, type CompareFormat } from './commands/compare';
import { EXPORT_TARGETS, runExport, type ExportTarget } from './commands/export';
import { HAMILTONIAN_TARGETS, runHamiltonianExport, type HamiltonianTarget } from './commands/exportHamiltonian';
import { REPORT_FORMATS, runReport, type ReportFormat } from './commands/report';
import { EXIT_BROKEN_PIPE, EXIT_INTERNAL, EXIT_OK, EXIT_USAGE, UsageError, type CliIo } from './io';
import { describeFailure } from './output';
import { VERSION } from './version';
import { MAPPINGS, type Mapping } from '../chemistry/qubits';
import type { SpecSettings } from './specFile';

export const USAGE = `tessera ${VERSION}: plan fragment-based hybrid quantum-classical calculations

Usage:
  tessera check <file.tess>... [--format text|json]
      Check specs; prints file:line:col: severity code message.
  tessera estimate <file.tess> [--format text|json|markdown] [--mean-field]
      Electrons, basis functions, orbitals and qubits for the system and each fragment.
  tessera estimate --xyz <file.xyz> --basis <name> [--charge N] [--multiplicity M]
                   [--functions spherical|cartesian] [--frozen-core] [--format text|json|markdown]
                   [--mean-field [--active <n>e<m>o]]
      The same for a plain XYZ file (ångström), without a spec.
      --mean-field also computes the Hartree–Fock mean field of the system and each fragment
      (and MP2 after RHF and UHF; all electrons unless frozen core is on: a spec's default, or
      --frozen-core with --xyz), in a worker thread, with a progress line on standard error
      for long jobs; JSON: meanField { reference, energy, nuclearRepulsion, converged,
      iterations, orbitalEnergies.alpha/beta, occupations, homo, lumo, gap, irreps, charges,
      mp2.correlationEnergy, mp2.naturalOccupations, ... } under system and each fragment.
        --reference rhf|uhf|rohf   default: a tier's method, else rhf for singlets, uhf otherwise
        --max-iterations N         SCF iterations (default 100)
        --memory-limit MiB         refuse parts whose estimated need exceeds it (default 2048)
        --active <n>e<m>o          with --xyz: the active-space Hamiltonian of n electrons in m
                                   canonical orbitals (the n/2 highest occupied and the lowest
                                   virtual RHF orbitals; ROHF for open shells, the singly occupied
                                   orbitals inside). A spec's quantum fragments use their own
                                   active space. JSON: hamiltonian { pauliTerms.jordanWigner/
                                   bravyiKitaev/parity, oneNorm, constant, threshold, groups,
                                   shots, faultTolerant, largest, activeSpace } (computed; the
                                   shots and Toffolis are estimates built on them).
        --bath-threshold X         under embedding dmet: singular values above X give bath
                                   orbitals (default 1e-6)
        --bath-orbitals lowdin|iao the fragment's orbitals for the bath: Löwdin-orthogonalised
                                   atomic orbitals (default) or intrinsic atomic orbitals
                                   (closed shells)
      Under embedding dmet each fragment also gets its DMET bath computed from the system's
      mean field (JSON: dmetBath { bath.computed, bath.counted, singularValues,
      impurity.electrons, coreElectrons, ... } under each fragment).
  tessera export <file.tess> --to xyz|qcschema|qcschema-input [--out <file>]
  tessera export <file.tess> --to xyz --fragment <name> | --fragments [--out <file>]
      The geometry for other programs; standard output unless --out. A spec with errors is not
      exported (exit 1, the diagnostics on standard error).
      xyz: ångström, element symbols only (no labels); one frame per scan point when the spec
        scans, the comment line naming the spec, the point and the scanned distance. With
        --fragment <name> (or --fragments: every fragment, one after the other) the fragment's
        atoms then its hydrogen caps, per scan point too; the comment line says which atoms are
        caps and which bond each caps.
      qcschema: one JSON object { format: "tessera-qcschema-export", format_version: 1, spec,
        system, fragments: [...], scan: null | { first_atom, second_atom, moving_atoms,
        distances_angstrom, molecules: [...] } } whose system, fragments[] and scan.molecules[]
        are QCSchema molecules (schema_version 2, geometry in bohr). Atoms are grouped by
        fragment, as QCSchema fragments need; extras.tessera.spec_atom_numbers gives each atom's
        #n in the spec, and extras.tessera holds the basis, tiers and embedding. A fragment
        that caps cut bonds lists its hydrogen caps after its atoms.
      qcschema-input: one JSON object { format: "tessera-qcschema-input-export",
        format_version: 1, spec, manifest: [...], skipped: [...], records: [...] } with a
        QCSchema input record (driver energy, model { method, basis }, keywords, molecule) per
        fragment with a tier, and per fragment and scan point when the spec scans; the molecule
        is the fragment with its caps; a per-atom basis is written as a QCSchema basis set.
  tessera export <file.tess> --to fcidump|pauli [--fragment <name>] [--out <file>]
      The active-space Hamiltonian of a quantum fragment (the only one, or --fragment), computed
      as estimate --mean-field computes it: its own RHF (ROHF for open shells) orbitals, the
      window of its active space. fcidump: the integral dump of Knowles & Handy (1989), core
      energy (nuclear repulsion + frozen core) last, every orbital in irrep 1. pauli: Tessera's
      qubit Hamiltonian JSON (docs/qubit-hamiltonian-json.md) under the fragment's mapping, up to
      16 active orbitals. Exit 1 when the spec has errors or the Hamiltonian cannot be computed.
  tessera report <file.tess> [--format markdown|html|csv] [--out <file>] [--mean-field]
      The resource report as a document (default markdown): every figure of the system and each
      fragment, the conventions, the problems with their lines and the scan totals. html is one
      standalone page with the plots inline as SVG; csv has one row per part, columns spec, then
      the figures' keys in the JSON estimate (part, name, tier, ..., qubits.jordanWigner, ...),
      then note. Written even when the spec has errors (exit 1). --mean-field (markdown, html)
      computes every part's mean field first, as estimate --mean-field does, and adds the
      computed results (mean field, active orbitals, DMET bath, Hamiltonian and shots, labelled
      computed); html plots shots against active-space size from computed Hamiltonians. Exit 1
      when a computation fails or does not converge.
  tessera compare <file.tess> [<file2.tess>] [--format markdown|html|csv] [--out <file>]
      Plans side by side: the spec and each of its variants (variant <name> { ... }), or two
      specs with theirs. Qubits needed, Pauli terms, measurement groups, ansatz parameters, CNOTs,
      classical memory and time (planning estimates); the inputs that differ marked, the best
      plan under the limits named. html adds a bar chart; csv has one row per plan. Written even
      when a plan has errors (exit 1).
  tessera lsp --stdio
      The language server, for editors other than VS Code.

Options:
  -h, --help       this text
  -v, --version    the version
  --mapping jordan-wigner|bravyi-kitaev|parity
                   check, estimate, export, report: the mapping of quantum tiers that name none,
                   as the editor's tessera.defaultMapping (default jordan-wigner)
  --qubit-limit N  check, estimate, export, report: the qubit limit of specs without
                   limits { qubits N }, as the editor's tessera.qubitLimit (default none)

Exit codes: 0 no errors; 1 errors found, or a mean field refused, failed or not converged;
2 bad usage, or a file that cannot be read or written; 3 Tessera itself failed on a file (a bug;
the other files of a batch are still checked); 130 interrupted (Ctrl+C) during --mean-field;
141 standard output closed early (for example piped into head): the command stops quietly.
All figures are planning estimates, not results of a calculation, except the mean-field results,
which are computed and say so.
`;

function formatOption<T extends string>(value: string | undefined, allowed: readonly T[], fallback: T): T {
  if (value === undefined) return fallback;
  if ((allowed as readonly string[]).includes(value)) return value as T;
  throw new UsageError(`--format must be one of ${allowed.join(', ')}; got '${value}'`);
}

/** `--mapping` and `--qubit-limit`, taken by every command that reads a spec. */
const SETTING_OPTIONS = { mapping: { type: 'string' }, 'qubit-limit': { type: 'string' } } as const;

/** The editor's settings from `--mapping` and `--qubit-limit` (tessera.defaultMapping, tessera.qubitLimit). */
function settingsOption(values: { mapping?: string | undefined; 'qubit-limit'?: string | undefined }): SpecSettings {
  const mapping = values.mapping;
  if (mapping !== undefined && !(MAPPINGS as readonly string[]).includes(mapping)) throw new UsageError(`--mapping must be one of ${MAPPINGS.join(', ')}; got '${mapping}'`);
  const limit = integerOption('qubit-limit', values['qubit-limit']);
  if (limit !== undefined && limit < 1) throw new UsageError('--qubit-limit must be at least 1');
  return { ...(mapping !== undefined ? { defaultMapping: mapping as Mapping } : {}), ...(limit !== undefined ? { defaultQubitLimit: limit } : {}) };
}

function integerOption(name: string, value: string | undefined): number | undefined {
  if (value === undefined) return undefined;
  const number = Number(value);
  if (!/^[+-]?\d+$/.test(value.trim()) || !Number.isSafeInteger(number)) throw new UsageError(`--${name} must be a whole number; got '${value}'`);
  return number;
}

async function dispatch(argv: string[], io: CliIo): Promise<number> {
  const [command, ...rest] = argv;
  if (command === undefined || command === '-h' || command === '--help' || command === 'help') {
    io.stdout(USAGE);
    return command === undefined ? EXIT_USAGE : EXIT_OK;
  }
  if (command === '-v' || command === '--version') {
    io.stdout(`${VERSION}\n`);
    return EXIT_OK;
  }
  switch (command) {
    case 'check': {
      const { values, positionals } = parseArgs({ args: rest, allowPositionals: true, strict: true, options: { format: { type: 'string' }, ...SETTING_OPTIONS, help: { type: 'boolean', short: 'h' } } });
      if (values.help) {
        io.stdout(USAGE);
        return EXIT_OK;
      }
      return runCheck({ files: positionals, format: formatOption(values.format, ['text', 'json'] as const, 'text'), settings: settingsOption(values) }, io);
    }
    case 'estimate': {
      const options = {
        format: { type: 'string' },
        xyz: { type: 'string' },
        basis: { type: 'string' },
        charge: { type: 'string' },
        multiplicity: { type: 'string' },
        functions: { type: 'string' },
        'frozen-core': { type: 'boolean' },
        'mean-field': { type: 'boolean' },
        reference: { type: 'string' },
        'max-iterations': { type: 'string' },
        'memory-limit': { type: 'string' },
        active: { type: 'string' },
        ...SETTING_OPTIONS,
        'bath-threshold': { type: 'string' },
        'bath-orbitals': { type: 'string' },
        help: { type: 'boolean', short: 'h' },
      } as const;
      const { values, positionals } = parseArgs({ args: joinNegativeValues(rest, options), allowPositionals: true, strict: true, options });
      if (values.help) {
        io.stdout(USAGE);
        return EXIT_OK;
      }
      if (positionals.length > 1) throw new UsageError('estimate takes one spec file');
      const functions = values.functions;
      if (functions !== undefined && functions !== 'spherical' && functions !== 'cartesian') {
        throw new UsageError(`--functions must be spherical or cartesian; got '${functions}'`);
      }
      const multiplicity = integerOption('multiplicity', values.multiplicity);
      if (multiplicity !== undefined && multiplicity < 1) throw new UsageError('--multiplicity is 2S+1, at least 1');
      const charge = integerOption('charge', values.charge);
      const reference = values.reference;
      if (reference !== undefined && reference !== 'rhf' && reference !== 'uhf' && reference !== 'rohf') throw new UsageError(`--reference must be rhf, uhf or rohf; got '${reference}'`);
      const maxIterations = integerOption('max-iterations', values['max-iterations']);
      if (maxIterations !== undefined && maxIterations < 1) throw new UsageError('--max-iterations must be at least 1');
      const memoryLimit = integerOption('memory-limit', values['memory-limit']);
      if (memoryLimit !== undefined && memoryLimit < 1) throw new UsageError('--memory-limit is in MiB, at least 1');
      const bathThreshold = values['bath-threshold'] === undefined ? undefined : Number(values['bath-threshold']);
      if (bathThreshold !== undefined && !(bathThreshold > 0 && bathThreshold < 0.5)) {
        throw new UsageError(`--bath-threshold must be a number between 0 and 0.5 (singular values of a spin density do not exceed 0.5); got '${values['bath-threshold']}'`);
      }
      const bathOrbitals = values['bath-orbitals'];
      if (bathOrbitals !== undefined && bathOrbitals !== 'lowdin' && bathOrbitals !== 'iao') throw new UsageError(`--bath-orbitals must be lowdin or iao; got '${bathOrbitals}'`);
      return runEstimate(
        {
          ...(positionals[0] ? { spec: positionals[0] } : {}),
          ...(values.xyz ? { xyz: values.xyz } : {}),
          ...(values.basis ? { basis: values.basis } : {}),
          ...(charge !== undefined ? { charge } : {}),
          ...(multiplicity !== undefined ? { multiplicity } : {}),
          ...(functions ? { functions } : {}),
          frozenCore: values['frozen-core'] ?? false,
          ...(values['mean-field'] ? { meanField: true } : {}),
          ...(reference ? { reference } : {}),
          ...(maxIterations !== undefined ? { maxIterations } : {}),
          ...(memoryLimit !== undefined ? { memoryLimitMiB: memoryLimit } : {}),
          ...(values.active !== undefined ? { active: parseActiveOption(values.active) } : {}),
          ...(bathThreshold !== undefined ? { bathThreshold } : {}),
          ...(bathOrbitals ? { bathOrbitals } : {}),
          format: formatOption<EstimateFormat>(values.format, ['text', 'json', 'markdown'], 'text'),
          settings: settingsOption(values),
        },
        io,
      );
    }
    case 'export': {
      const { values, positionals } = parseArgs({
        args: rest,
        allowPositionals: true,
        strict: true,
        options: { to: { type: 'string' }, out: { type: 'string' }, fragment: { type: 'string' }, fragments: { type: 'boolean' }, ...SETTING_OPTIONS, help: { type: 'boolean', short: 'h' } },
      });
      if (values.help) {
        io.stdout(USAGE);
        return EXIT_OK;
      }
      if (positionals.length > 1) throw new UsageError('export takes one spec file');
      const to = values.to;
      if (to !== undefined && (HAMILTONIAN_TARGETS as readonly string[]).includes(to)) {
        if (positionals[0] === undefined) throw new UsageError(`export needs a spec file: tessera export <file.tess> --to ${to} [--fragment <name>] [--out <file>]`);
        if (values.out === '') throw new UsageError('--out needs a file name');
        if (values.fragments) throw new UsageError(`--fragments goes with --to xyz; --to ${to} exports one fragment (--fragment <name>)`);
        return runHamiltonianExport(
          { spec: positionals[0], to: to as HamiltonianTarget, ...(values.out !== undefined ? { out: values.out } : {}), ...(values.fragment !== undefined ? { fragment: values.fragment } : {}) },
          io,
        );
      }
      if ((values.fragment !== undefined || values.fragments) && to !== 'xyz') throw new UsageError(`--fragment goes with --to xyz, ${HAMILTONIAN_TARGETS.map((target) => `--to ${target}`).join(' or ')}; --fragments with --to xyz`);
      if (values.fragment !== undefined && values.fragments) throw new UsageError('give --fragment <name> or --fragments, not both');
      if (to !== undefined && !(EXPORT_TARGETS as readonly string[]).includes(to)) throw new UsageError(`--to must be one of ${[...EXPORT_TARGETS, ...HAMILTONIAN_TARGETS].join(', ')}; got '${to}'`);
      return runExport(
        {
          ...(positionals[0] !== undefined ? { spec: positionals[0] } : {}),
          ...(to !== undefined ? { to: to as ExportTarget } : {}),
          ...(values.out !== undefined ? { out: values.out } : {}),
          ...(values.fragment !== undefined ? { fragments: [values.fragment] } : values.fragments ? { fragments: 'all' as const } : {}),
          settings: settingsOption(values),
        },
        io,
      );
    }
    case 'compare': {
      const { values, positionals } = parseArgs({
        args: rest,
        allowPositionals: true,
        strict: true,
        options: { format: { type: 'string' }, out: { type: 'string' }, help: { type: 'boolean', short: 'h' } },
      });
      if (values.help) {
        io.stdout(USAGE);
        return EXIT_OK;
      }
      return runCompare(
        {
          specs: positionals,
          format: formatOption<CompareFormat>(values.format, COMPARE_FORMATS, 'markdown'),
          ...(values.out !== undefined ? { out: values.out } : {}),
        },
        io,
      );
    }
    case 'report': {
      const { values, positionals } = parseArgs({
        args: rest,
        allowPositionals: true,
        strict: true,
        options: { format: { type: 'string' }, out: { type: 'string' }, 'mean-field': { type: 'boolean' }, ...SETTING_OPTIONS, help: { type: 'boolean', short: 'h' } },
      });
      if (values.help) {
        io.stdout(USAGE);
        return EXIT_OK;
      }
      if (positionals.length > 1) throw new UsageError('report takes one spec file');
      return runReport(
        {
          ...(positionals[0] !== undefined ? { spec: positionals[0] } : {}),
          format: formatOption<ReportFormat>(values.format, REPORT_FORMATS, 'markdown'),
          ...(values.out !== undefined ? { out: values.out } : {}),
          ...(values['mean-field'] ? { meanField: true } : {}),
          settings: settingsOption(values),
        },
        io,
      );
    }
    case 'lsp': {
      if (!rest.includes('--stdio') && !rest.some((arg) => arg.startsWith('--node-ipc') || arg.startsWith('--socket') || arg.startsWith('--pipe'))) {
        throw new UsageError('lsp needs a transport: tessera lsp --stdio');
      }
      const { startLanguageServer } = await import('../lsp/start');
      startLanguageServer();
      // The server runs until the editor closes the connection.
      return new Promise<number>(() => undefined);
    }
    default:
      throw new UsageError(`unknown command '${command}'; the commands are check, estimate, export, report, compare and lsp`);
  }
}

/** Runs the command line and returns the exit code; never throws. */
export async function runCli(argv: string[], raw: CliIo): Promise<number> {
  // Everything printed may quote a spec or a file name: no control character reaches the terminal.
  const io: CliIo = { ...raw, stdout: (text) => raw.stdout(escapeForTerminal(text)), stderr: (text) => raw.stderr(escapeForTerminal(text)) };
  try {
    return await dispatch(argv, io);
  } catch (error) {
    if (error instanceof UsageError || (error as { code?: string }).code?.startsWith('ERR_PARSE_ARGS')) {
      io.stderr(`tessera: ${(error as Error).message}\nRun 'tessera --help' for usage.\n`);
      return EXIT_USAGE;
    }
    io.stderr(`tessera: internal error: ${describeFailure(error)}\n`);
    return EXIT_INTERNAL;
  }
}

/** Entry of the `tessera` executable. */
export function main(): void {
  process.stdout.on('error', (error: NodeJS.ErrnoException) => {
    // `tessera estimate … | head`: the reader has what it wanted; stop without a stack trace.
    if (error.code === 'EPIPE') process.exit(EXIT_BROKEN_PIPE);
    process.stderr.write(`tessera: cannot write to standard output: ${error.message}\n`);
    process.exit(EXIT_USAGE);
  });
  const io: CliIo = {
    stdout: (text) => process.stdout.write(text),
    // After each chunk of a streamed output: wait for a full pipe to drain, and let I/O events (such
    // as the EPIPE above) through; a closed standard output never resumes the stream.
    drained: () =>
      new Promise<void>((resolve) => {
        if (process.stdout.destroyed) return;
        if (process.stdout.writableNeedDrain) process.stdout.once('drain', () => resolve());
        else setImmediate(resolve);
      }),
    stderr: (text) => process.stderr.write(text),
    cwd: process.cwd(),
    onInterrupt: (handler) => {
      // The first Ctrl+C cancels the computation (and prints what it was doing); a second one ends the process.
      const once = () => {
        process.removeListener('SIGINT', once);
        handler();
      };
      process.on('SIGINT', once);
      return () => process.removeListener('SIGINT', once);
    },
  };
  void runCli(process.argv.slice(2), io).then((code) => {
    process.exitCode = code;
  });
}
