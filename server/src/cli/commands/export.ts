/**
 * `tessera export <spec> --to xyz|qcschema [--out <file>]`: the geometry of a spec for other
 * programs. XYZ: ångström, element symbols only, one frame per scan point when the spec scans;
 * with `--fragment <name>` or `--fragments`, fragments with their hydrogen caps instead.
 * QCSchema: the system, each fragment and each scan point as `qcschema_molecule` objects, geometry
 * in bohr (layout in report/export/qcschema.ts). A spec with errors is not exported: the
 * diagnostics go to standard error and the exit code is 1, so that no half-checked geometry leaves.
 */
import { safeJsonStringify } from '../../language/printable';
import { qcSchemaExportParts, qcSchemaJsonChunks } from '../../report/export/qcschema';
import { buildQcInputExport, InputExportError } from '../../report/export/qcschemaInput';
import { fragmentXyzChunks, xyzChunks } from '../../report/export/xyz';
import { structureData } from '../../report/structure';
import { EXIT_ERRORS, EXIT_OK, EXIT_USAGE, UsageError, type CliIo } from '../io';
import { loadSpecToExport, specTitle, writeOutput, type SpecSettings } from '../specFile';
import { VERSION } from '../version';

export const EXPORT_TARGETS = ['xyz', 'qcschema', 'qcschema-input'] as const;
export type ExportTarget = (typeof EXPORT_TARGETS)[number];

export interface ExportOptions {
  spec?: string;
  to?: ExportTarget;
  out?: string;
  /** With --to xyz: the fragments to write, each with its caps, instead of the system ('all': every one). */
  fragments?: readonly string[] | 'all';
  /** The editor's settings: default mapping and qubit limit. */
  settings?: SpecSettings;
}

/** The fragment indices --fragment or --fragments names, or a usage error that lists the names. */
function chosenFragments(spec: { file: string; analysis: { model: { fragments: readonly { name: string; index: number }[] } } }, wanted: readonly string[] | 'all'): number[] {
  const fragments = spec.analysis.model.fragments;
  if (fragments.length === 0) throw new UsageError(`${spec.file} has no fragments to export`);
  if (wanted === 'all') return fragments.map((fragment) => fragment.index);
  return wanted.map((name) => {
    const fragment = fragments.find((candidate) => candidate.name === name);
    if (!fragment) throw new UsageError(`--fragment ${name}: ${spec.file} has no fragment of that name (its fragments: ${fragments.map((f) => f.name).join(', ')})`);
    return fragment.index;
  });
}

export async function runExport(options: ExportOptions, io: CliIo): Promise<number> {
  if (!options.spec) throw new UsageError('export needs a spec file: tessera export <file.tess> --to xyz|qcschema|qcschema-input [--out <file>]');
  if (!options.to) throw new UsageError('export needs --to xyz, --to qcschema or --to qcschema-input');
  if (options.out === '') throw new UsageError('--out needs a file name');
  const spec = loadSpecToExport(options.spec, options.out, io, options.settings);
  if (typeof spec === 'number') return spec;
  const data = structureData(spec.analysis);
  const title = specTitle(spec);
  // Streamed: one scan point at a time, so that any scan the language accepts is written in bounded memory.
  let chunks: Iterable<string>;
  try {
    chunks =
      options.to === 'xyz'
        ? options.fragments
          ? fragmentXyzChunks(spec.analysis, data, chosenFragments(spec, options.fragments), { title, version: VERSION })
          : xyzChunks(data, { title, version: VERSION })
        : options.to === 'qcschema'
          ? qcSchemaJsonChunks(qcSchemaExportParts(spec.analysis, data, { title, version: VERSION }))
          : [`${safeJsonStringify(buildQcInputExport(spec.analysis, data, { title, version: VERSION }), 2)}\n`];
  } catch (error) {
    if (!(error instanceof RangeError) && !(error instanceof InputExportError)) throw error;
    io.stderr(`tessera: ${spec.file}: ${error.message} Nothing exported.\n`);
    return EXIT_ERRORS;
  }
  return (await writeOutput(chunks, options.out, spec, io)) ? EXIT_OK : EXIT_USAGE;
}
