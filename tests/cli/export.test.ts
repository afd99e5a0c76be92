/**
 * `tessera export`: XYZ round trips through the XYZ reader, multi-frame scans, QCSchema molecules
 * validated against the published schema (tests/fixtures/qcschema-molecule.schema.json, written by
 * scripts/data/generate_qcschema_schema.py from python3-qcelemental), units, charges and
 * multiplicities, exit codes and usage errors.
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import Ajv from 'ajv-draft-04';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { parseXyz } from '../../server/src/language/xyz';
import { allSamples, cleanSamples, root, run, scratch } from './harness';

/** Bohr radius in ångström, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)). */
const BOHR_ANGSTROM_CODATA_2018 = 0.529177210903;

/**
 * Tolerance of the XYZ round trip, Å. The export writes 10 decimals, so rounding moves a coordinate
 * by at most 5e-11 Å; 1e-9 Å leaves room for the floating-point shift of scan frames and is far
 * below anything that matters chemically (coordinates are rarely known to 1e-4 Å).
 */
const XYZ_TOLERANCE = 1e-9;

const SCHEMA_PATH = path.join(root, 'tests', 'fixtures', 'qcschema-molecule.schema.json');
const schema = JSON.parse(readFileSync(SCHEMA_PATH, 'utf8')) as object;
const ajv = new Ajv({ allErrors: true, strict: true });
// Field metadata pydantic writes into the schema (not JSON Schema keywords): annotations only.
ajv.addKeyword({ keyword: 'shape' });
ajv.addKeyword({ keyword: 'units' });
const validateMolecule = ajv.compile(schema);

function expectValidMolecule(molecule: unknown, what: string): void {
  const valid = validateMolecule(molecule);
  expect(valid, `${what}: ${JSON.stringify(validateMolecule.errors)}`).toBe(true);
}

interface Molecule {
  schema_name: string;
  schema_version: number;
  name: string;
  symbols: string[];
  geometry: number[];
  atom_labels: string[];
  molecular_charge: number;
  molecular_multiplicity: number;
  fragments?: number[][];
  fragment_charges?: number[];
  fragment_multiplicities?: number[];
  provenance: { creator: string; version: string; routine: string };
  extras: {
    tessera: {
      spec: string;
      part: string;
      spec_atom_numbers: number[];
      basis: { name: string | null; overrides: { basis: string; on: string; atoms: number }[]; functions: string };
      atom_basis: (string | null)[];
      fragments?: { name: string; tier: { level: string; method: string; mapping: string | null } | null }[];
      tier?: { level: string; method: string; mapping: string | null } | null;
      fragment?: string;
      fragment_index?: number;
      cut_bonds?: [number, number][];
      scan_point?: { point: number; points: number; distance_angstrom: number };
    };
  };
}

interface QcExport {
  format: string;
  format_version: number;
  spec: string;
  system: Molecule;
  fragments: Molecule[];
  scan: { coordinate: string; atoms: number[]; first_atom: number; second_atom: number; moving_atoms: number[]; values: number[]; unit: string; distances_angstrom: number[]; molecules: Molecule[] } | null;
}

function specAnalysis(file: string) {
  const absolute = path.join(root, file);
  return analyzeDocument(readFileSync(absolute, 'utf8'), { path: absolute });
}

/** Splits multi-frame XYZ text into one text per frame. */
function splitFrames(text: string): string[] {
  const lines = text.split('\n');
  const frames: string[] = [];
  let i = 0;
  while (i < lines.length && lines[i]!.trim() !== '') {
    const count = Number(lines[i]);
    expect(Number.isInteger(count)).toBe(true);
    frames.push(`${lines.slice(i, i + count + 2).join('\n')}\n`);
    i += count + 2;
  }
  expect(lines.slice(i).every((line) => line === '')).toBe(true);
  return frames;
}

function distance(xyz: readonly number[], i: number, j: number): number {
  return Math.hypot(xyz[3 * i]! - xyz[3 * j]!, xyz[3 * i + 1]! - xyz[3 * j + 1]!, xyz[3 * i + 2]! - xyz[3 * j + 2]!);
}

async function exportQc(file: string): Promise<QcExport> {
  const result = await run(['export', file, '--to', 'qcschema']);
  expect(result.code, result.stderr).toBe(0);
  return JSON.parse(result.stdout) as QcExport;
}

describe('the sample list', () => {
  it('has the thirteen clean samples and the mistakes', () => {
    expect(cleanSamples()).toHaveLength(13);
    expect(allSamples()).toContain('samples/mistakes.tess');
  });
});

describe('tessera export --to xyz', () => {
  it.each(cleanSamples())('%s: read back with parseXyz, the same elements and coordinates', async (file) => {
    const result = await run(['export', file, '--to', 'xyz']);
    expect(result.code, result.stderr).toBe(0);
    const { model } = specAnalysis(file);
    const frames = splitFrames(result.stdout);
    expect(frames).toHaveLength(model.scan ? model.scan.values.length : 1);
    const first = parseXyz(frames[0]!);
    expect(first.problems).toEqual([]);
    expect(first.atoms.map((atom) => atom.symbol)).toEqual(model.atoms.map((atom) => atom.element.symbol));
    if (!model.scan) {
      first.atoms.forEach((atom, i) => {
        expect(Math.abs(atom.x - model.coordinates[3 * i]!)).toBeLessThanOrEqual(XYZ_TOLERANCE);
        expect(Math.abs(atom.y - model.coordinates[3 * i + 1]!)).toBeLessThanOrEqual(XYZ_TOLERANCE);
        expect(Math.abs(atom.z - model.coordinates[3 * i + 2]!)).toBeLessThanOrEqual(XYZ_TOLERANCE);
      });
      expect(first.comment).toContain(model.name!);
      expect(first.comment).toContain('angstrom');
    }
  });

  it('water: the coordinates as written in samples/molecules/water-cc-pvdz.tess, symbols only (no labels)', async () => {
    const result = await run(['export', 'samples/molecules/water-cc-pvdz.tess', '--to', 'xyz']);
    const lines = result.stdout.trimEnd().split('\n');
    expect(lines[0]).toBe('3');
    expect(lines.slice(2).map((line) => line.trim().split(/\s+/))).toEqual([
      ['O', '0.0000000000', '0.0000000000', '0.0000000000'],
      ['H', '0.0000000000', '0.7569500000', '0.5858820000'],
      ['H', '0.0000000000', '-0.7569500000', '0.5858820000'],
    ]);
    expect(result.stdout).not.toMatch(/\bh1\b|\bh2\b/);
  });

  it('a spec in bohr is written in ångström (× 0.529177210903, CODATA 2018)', async () => {
    const folder = scratch({
      'h2.tess': 'spec "h2-bohr"\nbasis sto-3g\nstructure in bohr {\n  H a 0 0 0\n  H b 0 0 1.4\n}\nfragment h2 { atoms rest; tier quantum { method vqe } }\n',
    });
    const result = await run(['export', 'h2.tess', '--to', 'xyz'], folder);
    expect(result.code, result.stderr).toBe(0);
    const atoms = parseXyz(result.stdout).atoms;
    expect(Math.abs(atoms[1]!.z - 1.4 * BOHR_ANGSTROM_CODATA_2018)).toBeLessThanOrEqual(XYZ_TOLERANCE);
    // And QCSchema, in bohr, gives back the numbers as written.
    const qc = JSON.parse((await run(['export', 'h2.tess', '--to', 'qcschema'], folder)).stdout) as QcExport;
    expect(Math.abs(qc.system.geometry[5]! - 1.4)).toBeLessThanOrEqual(1e-12);
  });

  it('a scan gives one frame per point, the moving fragment shifted, the distance right in each frame and its comment', async () => {
    // samples/zn-site-h2s-scan.tess: `scan distance zn s from 2.3 to 3.5 step 0.2`; zn (#1) at the
    // origin and s (#18) at z = 2.45 Å, so s and its fragment's hydrogens (#19, #20) move along z.
    const expected = [2.3, 2.5, 2.7, 2.9, 3.1, 3.3, 3.5];
    const written = 2.45;
    const moving = new Set([17, 18, 19]);
    const file = 'samples/zn-site-h2s-scan.tess';
    const result = await run(['export', file, '--to', 'xyz']);
    expect(result.code, result.stderr).toBe(0);
    expect(parseXyz(result.stdout).frames).toBe(expected.length);
    const frames = splitFrames(result.stdout);
    expect(frames).toHaveLength(expected.length);
    const { model } = specAnalysis(file);
    frames.forEach((text, k) => {
      const frame = parseXyz(text);
      expect(frame.problems).toEqual([]);
      const xyz = frame.atoms.flatMap((atom) => [atom.x, atom.y, atom.z]);
      expect(Math.abs(distance(xyz, 0, 17) - expected[k]!)).toBeLessThanOrEqual(XYZ_TOLERANCE);
      const comment = /^zn-site-h2s-approach; scan point (\d+) of (\d+); distance zn-s (\d+\.\d+) angstrom/.exec(frame.comment);
      expect(comment, frame.comment).not.toBeNull();
      expect(Number(comment![1])).toBe(k + 1);
      expect(Number(comment![2])).toBe(expected.length);
      expect(Math.abs(Number(comment![3]) - expected[k]!)).toBeLessThanOrEqual(5e-7);
      for (let atom = 0; atom < model.atoms.length; atom++) {
        const shift = moving.has(atom) ? expected[k]! - written : 0;
        expect(Math.abs(xyz[3 * atom]! - model.coordinates[3 * atom]!)).toBeLessThanOrEqual(XYZ_TOLERANCE);
        expect(Math.abs(xyz[3 * atom + 1]! - model.coordinates[3 * atom + 1]!)).toBeLessThanOrEqual(XYZ_TOLERANCE);
        expect(Math.abs(xyz[3 * atom + 2]! - (model.coordinates[3 * atom + 2]! + shift))).toBeLessThanOrEqual(XYZ_TOLERANCE);
      }
    });
  });
});

describe('tessera export --to xyz with fragments and their caps', () => {
  // samples/launch/ethane-capped-methyls.tess: `caps hydrogen scaled`, `scan distance c1 c2 from 1.4
  // to 2.2 step 0.2`, c1 at z = −0.7675 Å, the right methyl moving along +z. A scaled cap sits at
  // g · d(C–C) from its carbon on the C–C line, g = (r_C + r_H)/(r_C + r_C) with Cordero's covalent
  // radii C(sp3) 0.76 Å, H 0.31 Å (Cordero et al., Dalton Trans. 2008, 2832; from memory), the
  // scaled link atom of Dapprich et al. (1999).
  const file = 'samples/launch/ethane-capped-methyls.tess';
  const g = (0.76 + 0.31) / (0.76 + 0.76);
  const distances = [1.4, 1.6, 1.8, 2.0, 2.2];
  const c1 = -0.7675;

  it('--fragment left: its four atoms then its cap, one frame per scan point, the cap on the stretched bond', async () => {
    const result = await run(['export', file, '--to', 'xyz', '--fragment', 'left']);
    expect(result.code, result.stderr).toBe(0);
    const frames = splitFrames(result.stdout);
    expect(frames).toHaveLength(distances.length);
    frames.forEach((text, k) => {
      const frame = parseXyz(text);
      expect(frame.problems).toEqual([]);
      expect(frame.atoms.map((atom) => atom.symbol)).toEqual(['C', 'H', 'H', 'H', 'H']);
      const cap = frame.atoms[4]!;
      expect(Math.hypot(cap.x, cap.y)).toBeLessThanOrEqual(XYZ_TOLERANCE);
      expect(Math.abs(cap.z - (c1 + g * distances[k]!))).toBeLessThanOrEqual(1e-6);
      expect(frame.comment).toMatch(new RegExp(`^ethane-capped-methyls; fragment left: 4 atoms then 1 hydrogen cap \\(link atoms, scaled placement\\): atom 5 H caps c1-c2; scan point ${k + 1} of 5; distance c1-c2 `));
    });
  });

  it('--fragments: every fragment in turn, the right cap on its own carbon toward c1', async () => {
    const result = await run(['export', file, '--to', 'xyz', '--fragments']);
    expect(result.code, result.stderr).toBe(0);
    const frames = splitFrames(result.stdout).map((text) => parseXyz(text));
    expect(frames).toHaveLength(2 * distances.length);
    frames.slice(distances.length).forEach((frame, k) => {
      expect(frame.comment).toMatch(/; fragment right: 4 atoms then 1 hydrogen cap .*: atom 5 H caps c2-c1;/);
      // c2 moved to c1 + d; its cap lies g · d back toward c1.
      expect(Math.abs(frame.atoms[4]!.z - (c1 + (1 - g) * distances[k]!))).toBeLessThanOrEqual(1e-6);
    });
  });

  it('a fragment without caps says so; a name the spec lacks, or --fragments with another format, is a usage error', async () => {
    const water = await run(['export', 'samples/molecules/water-cc-pvdz.tess', '--to', 'xyz', '--fragments']);
    expect(water.code, water.stderr).toBe(0);
    expect(parseXyz(water.stdout).comment).toMatch(/fragment \S+: 3 atoms, no caps/);
    const unknown = await run(['export', file, '--to', 'xyz', '--fragment', 'middle']);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/no fragment of that name \(its fragments: left, right\)/);
    expect((await run(['export', file, '--to', 'qcschema', '--fragments'])).code).toBe(2);
    expect((await run(['export', file, '--to', 'pauli', '--fragments'])).code).toBe(2);
  });
});

describe('the QCSchema schema fixture', () => {
  it('is the file its origin note describes (SHA-256), from python3-qcelemental', () => {
    const origin = readFileSync(path.join(root, 'tests', 'fixtures', 'qcschema-molecule.schema.origin.md'), 'utf8');
    const digest = createHash('sha256').update(readFileSync(SCHEMA_PATH)).digest('hex');
    expect(origin).toContain(`\`${digest}\``);
    expect(origin).toMatch(/python3-qcelemental \d/);
    expect((schema as { $schema: string }).$schema).toBe('http://json-schema.org/draft-04/schema#');
  });

  it('rejects what is not a QCSchema molecule (so that passing means something)', () => {
    const good = { schema_name: 'qcschema_molecule', schema_version: 2, symbols: ['He'], geometry: [0, 0, 0] };
    expect(validateMolecule(good)).toBe(true);
    expect(validateMolecule({ ...good, schema_name: 'molecule' })).toBe(false);
    expect(validateMolecule({ ...good, geometry: ['0', 0, 0] })).toBe(false);
    expect(validateMolecule({ ...good, basis: 'sto-3g' })).toBe(false);
    expect(validateMolecule({ ...good, molecular_multiplicity: 1.5 })).toBe(false);
    expect(validateMolecule({ schema_name: 'qcschema_molecule', geometry: [0, 0, 0] })).toBe(false);
  });
});

describe('tessera export --to qcschema', () => {
  it.each(cleanSamples())('%s: the system, every fragment and every scan point validate against the schema', async (file) => {
    const qc = await exportQc(file);
    expect(qc.format).toBe('tessera-qcschema-export');
    expect(qc.format_version).toBe(1);
    expectValidMolecule(qc.system, 'system');
    qc.fragments.forEach((fragment) => expectValidMolecule(fragment, fragment.name));
    for (const molecule of qc.scan?.molecules ?? []) expectValidMolecule(molecule, molecule.name);
    const { model } = specAnalysis(file);
    expect(qc.fragments).toHaveLength(model.fragments.length);
    expect(qc.scan?.molecules.length ?? 0).toBe(model.scan?.values.length ?? 0);
  });

  it.each(cleanSamples())('%s: atoms grouped by fragment, each mapped back to the spec with its element and position', async (file) => {
    const qc = await exportQc(file);
    const { model } = specAnalysis(file);
    const system = qc.system;
    const n = model.atoms.length;
    expect(system.symbols).toHaveLength(n);
    expect(system.geometry).toHaveLength(3 * n);
    // QCSchema fragments are contiguous and in order: together 0, 1, …, n − 1.
    expect(system.fragments!.flat()).toEqual(Array.from({ length: n }, (_, k) => k));
    const numbers = system.extras.tessera.spec_atom_numbers;
    expect([...numbers].sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, k) => k + 1));
    numbers.forEach((number, k) => {
      const atom = number - 1;
      expect(system.symbols[k]).toBe(model.atoms[atom]!.element.symbol);
      expect(system.atom_labels[k]).toBe(model.atoms[atom]!.label ?? '');
      for (let c = 0; c < 3; c++) expect(Math.abs(system.geometry[3 * k + c]! * BOHR_ANGSTROM_CODATA_2018 - model.coordinates[3 * atom + c]!)).toBeLessThanOrEqual(1e-9);
    });
    qc.fragments.forEach((fragment, f) => {
      const rows = system.fragments![f]!;
      // A capped fragment lists its hydrogen caps after its own atoms.
      const caps = model.fragments[f]!.caps.length;
      expect(fragment.symbols).toEqual([...rows.map((k) => system.symbols[k]), ...Array<string>(caps).fill('H')]);
      expect(fragment.geometry.slice(0, 3 * rows.length)).toEqual(rows.flatMap((k) => system.geometry.slice(3 * k, 3 * k + 3)));
      expect(fragment.geometry).toHaveLength(3 * (rows.length + caps));
      expect(fragment.extras.tessera.spec_atom_numbers).toEqual(rows.map((k) => numbers[k]));
      expect(fragment.extras.tessera.fragment).toBe(model.fragments[f]!.name);
    });
  });

  it('charges and multiplicities as the specs give them', async () => {
    // Values as written in the sample files (defaults: charge 0, lowest multiplicity).
    const expected: Record<string, { system: [number, number]; fragments: Record<string, [number, number]> }> = {
      'samples/zn-site-h2s-scan.tess': { system: [0, 1], fragments: { site: [2, 1], guest: [0, 1], frame: [-2, 1] } },
      'samples/open-shell/copper-aqua-doublet.tess': { system: [2, 2], fragments: { metal: [2, 2], waters: [0, 1] } },
      'samples/open-shell/dioxygen-triplet.tess': { system: [0, 3], fragments: { o2: [0, 3] } },
      'samples/molecules/water-cc-pvdz.tess': { system: [0, 1], fragments: { water: [0, 1] } },
      'samples/molecules/water-sto-3g.tess': { system: [0, 1], fragments: { water: [0, 1] } },
      'samples/molecules/dinitrogen-bases.tess': { system: [0, 1], fragments: { n2: [0, 1] } },
      'samples/molecules/benzene-6-31gs.tess': { system: [0, 1], fragments: { ring: [0, 1] } },
      'samples/molecules/water-pair-overrides.tess': { system: [0, 1], fragments: { donor: [0, 1], acceptor: [0, 1] } },
      // Two capped methyl groups: CH3 + H, 10 electrons each, singlets.
      'samples/launch/ethane-capped-methyls.tess': { system: [0, 1], fragments: { left: [0, 1], right: [0, 1] } },
      'samples/launch/ethane-plan-variants.tess': { system: [0, 1], fragments: { left: [0, 1], right: [0, 1] } },
      'samples/launch/ethane-shared-structure.tess': { system: [0, 1], fragments: { left: [0, 1], right: [0, 1] } },
      // Ethanol cut at C–C: capped methyl (10 electrons) and capped CH2OH (18), singlets; the reuse takes the same cut.
      'samples/launch/ethanol-two-cuts.tess': { system: [0, 1], fragments: { tail: [0, 1], head: [0, 1] } },
      'samples/launch/ethanol-cut-reuse.tess': { system: [0, 1], fragments: { tail: [0, 1], head: [0, 1] } },
    };
    expect(Object.keys(expected).sort()).toEqual(cleanSamples());
    for (const [file, want] of Object.entries(expected)) {
      const qc = await exportQc(file);
      expect([qc.system.molecular_charge, qc.system.molecular_multiplicity], file).toEqual(want.system);
      const names = qc.system.extras.tessera.fragments!.map((fragment) => fragment.name);
      expect(names).toEqual(Object.keys(want.fragments));
      expect(qc.system.fragment_charges).toEqual(names.map((name) => want.fragments[name]![0]));
      expect(qc.system.fragment_multiplicities).toEqual(names.map((name) => want.fragments[name]![1]));
      for (const fragment of qc.fragments) {
        expect([fragment.molecular_charge, fragment.molecular_multiplicity], fragment.name).toEqual(want.fragments[fragment.extras.tessera.fragment!]);
      }
    }
  });

  it('geometry in bohr: water h1 y = 0.756950 Å and z = 0.585882 Å over 0.529177210903 (CODATA 2018)', async () => {
    const qc = await exportQc('samples/molecules/water-cc-pvdz.tess');
    expect(qc.system.symbols.slice(0, 2)).toEqual(['O', 'H']);
    expect(Math.abs(qc.system.geometry[4]! - 0.75695 / BOHR_ANGSTROM_CODATA_2018)).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(qc.system.geometry[5]! - 0.585882 / BOHR_ANGSTROM_CODATA_2018)).toBeLessThanOrEqual(1e-12);
  });

  it('the basis, tiers and embedding under extras.tessera; provenance names Tessera', async () => {
    const qc = await exportQc('samples/zn-site-h2s-scan.tess');
    const extras = qc.system.extras.tessera;
    expect(extras.basis).toEqual({ name: 'def2-SVP', overrides: [{ basis: 'def2-TZVP', on: 'all Zn', atoms: 1 }], functions: 'spherical' });
    // Each atom's basis in the molecule's atom order: the zinc takes the override, the others the main basis.
    expect(extras.atom_basis.map((name, k) => [qc.system.symbols[k], name]).filter(([, name]) => name !== 'def2-SVP')).toEqual([['Zn', 'def2-TZVP']]);
    expect(qc.fragments[0]!.extras.tessera.atom_basis[0]).toBe('def2-TZVP');
    expect(extras.fragments!.map((fragment) => [fragment.name, fragment.tier?.level, fragment.tier?.method])).toEqual([
      ['site', 'quantum', 'vqe'],
      ['guest', 'correlated', 'ccsd(t)'],
      ['frame', 'mean-field', 'rhf'],
    ]);
    expect(qc.fragments[0]!.extras.tessera.tier).toMatchObject({ level: 'quantum', mapping: 'jordan-wigner', active: { electrons: 10, orbitals: 10 }, taper: true });
    expect(qc.system.provenance.creator).toBe('Tessera');
    expect(qc.system.provenance.routine).toBe('tessera export --to qcschema');
    // The sample's bond-cut warnings name zn–s, zn–o1 and zn–o2: three cut bonds, all at zn.
    const zn = qc.system.symbols.indexOf('Zn');
    const cut = extras.cut_bonds!;
    expect(cut).toHaveLength(3);
    expect(cut.every((pair) => pair.includes(zn))).toBe(true);
    expect(cut.map((pair) => qc.system.atom_labels[pair[0] === zn ? pair[1] : pair[0]]).sort()).toEqual(['o1', 'o2', 's']);
  });

  it('a scan: one system molecule per point with the scanned distance', async () => {
    const qc = await exportQc('samples/zn-site-h2s-scan.tess');
    const scan = qc.scan!;
    // `from 2.3 to 3.5 step 0.2` in samples/zn-site-h2s-scan.tess.
    expect(scan.distances_angstrom.map((d) => Number(d.toFixed(9)))).toEqual([2.3, 2.5, 2.7, 2.9, 3.1, 3.3, 3.5]);
    expect(qc.system.symbols[scan.first_atom]).toBe('Zn');
    expect(qc.system.atom_labels[scan.second_atom]).toBe('s');
    expect(scan.moving_atoms.map((k) => qc.system.extras.tessera.spec_atom_numbers[k])).toEqual([18, 19, 20]);
    scan.molecules.forEach((molecule, k) => {
      const d = distance(molecule.geometry, scan.first_atom, scan.second_atom) * BOHR_ANGSTROM_CODATA_2018;
      expect(Math.abs(d - scan.distances_angstrom[k]!)).toBeLessThanOrEqual(1e-9);
      expect(molecule.extras.tessera.scan_point).toEqual({ point: k + 1, points: 7, coordinate: 'distance', value: scan.distances_angstrom[k], unit: 'angstrom', distance_angstrom: scan.distances_angstrom[k] });
      expect(molecule.fragments).toEqual(qc.system.fragments);
    });
  });

  it('a spec without fragments: the system alone, without QCSchema fragments', async () => {
    const folder = scratch({ 'he.tess': 'spec "helium"\nbasis cc-pVDZ\nstructure {\n  He 0 0 0\n}\n' });
    const result = await run(['export', 'he.tess', '--to', 'qcschema'], folder);
    expect(result.code, result.stderr).toBe(0);
    const qc = JSON.parse(result.stdout) as QcExport;
    expectValidMolecule(qc.system, 'helium');
    expect(qc.system.fragments).toBeUndefined();
    expect(qc.fragments).toEqual([]);
    expect(qc.scan).toBeNull();
  });
});

describe('tessera export: errors, files and usage', () => {
  it('refuses a spec with errors: exit 1, the diagnostics on stderr, nothing on stdout', async () => {
    for (const to of ['xyz', 'qcschema']) {
      const result = await run(['export', 'samples/mistakes.tess', '--to', to]);
      expect(result.code).toBe(1);
      expect(result.stdout).toBe('');
      expect(result.stderr).toMatch(/^samples\/mistakes\.tess:8:7: error unknown-basis /m);
      expect(result.stderr).toContain('nothing exported');
    }
  });

  it('does not write --out for a spec with errors', async () => {
    const folder = scratch({ 'bad.tess': 'spec "bad"\nbasis sto-3g\nmultiplicity 2\nstructure {\n  He 0 0 0\n}\n' });
    const result = await run(['export', 'bad.tess', '--to', 'xyz', '--out', 'bad.xyz'], folder);
    expect(result.code).toBe(1);
    expect(result.stderr).toContain('multiplicity-parity');
    expect(existsSync(path.join(folder, 'bad.xyz'))).toBe(false);
  });

  it('warnings go to stderr and the export is written (exit 0)', async () => {
    const result = await run(['export', 'samples/zn-site-h2s-scan.tess', '--to', 'xyz']);
    expect(result.code).toBe(0);
    expect(result.stderr).toContain('warning bond-cut');
  });

  it('--out writes the file and nothing to stdout', async () => {
    const folder = scratch({});
    const spec = path.join(root, 'samples', 'molecules', 'water-sto-3g.tess');
    const result = await run(['export', spec, '--to', 'qcschema', '--out', 'water.json'], folder);
    expect(result.code, result.stderr).toBe(0);
    expect(result.stdout).toBe('');
    const written = JSON.parse(readFileSync(path.join(folder, 'water.json'), 'utf8')) as QcExport;
    expectValidMolecule(written.system, 'written');
  });

  it('exit 2: unreadable spec, unwritable --out, bad usage', async () => {
    expect((await run(['export', 'samples/none.tess', '--to', 'xyz'])).code).toBe(2);
    const unwritable = await run(['export', 'samples/molecules/water-sto-3g.tess', '--to', 'xyz', '--out', path.join(scratch({}), 'no', 'such', 'dir.xyz')]);
    expect(unwritable.code).toBe(2);
    expect(unwritable.stderr).toContain('cannot write');
    const usage = [
      ['export'],
      ['export', 'samples/molecules/water-sto-3g.tess'],
      ['export', 'samples/molecules/water-sto-3g.tess', '--to', 'pdb'],
      ['export', 'samples/molecules/water-sto-3g.tess', 'samples/molecules/water-cc-pvdz.tess', '--to', 'xyz'],
      ['export', 'samples/molecules/water-sto-3g.tess', '--to', 'xyz', '--format', 'json'],
      ['export', 'samples/molecules/water-sto-3g.tess', '--to', 'xyz', '--out', 'samples/molecules/water-sto-3g.tess'],
    ];
    for (const args of usage) {
      const result = await run(args);
      expect(result.code, args.join(' ')).toBe(2);
      expect(result.stderr).toContain("Run 'tessera --help'");
    }
    expect((await run(['export', '--help'])).code).toBe(0);
  });

  it('the help names export, report and their options', async () => {
    const help = (await run(['--help'])).stdout;
    expect(help).toContain('tessera export <file.tess> --to xyz|qcschema|qcschema-input [--out <file>]');
    expect(help).toContain('tessera report <file.tess> [--format markdown|html|csv] [--out <file>]');
    expect(help).toContain('tessera-qcschema-export');
    expect(help).toContain('tessera-qcschema-input-export');
    expect(help).toContain('tessera compare <file.tess> [<file2.tess>] [--format markdown|html|csv] [--out <file>]');
  });

  it('the built executable exports (npm run build first)', () => {
    const bin = path.join(root, 'node_modules', '.bin', 'tessera');
    const ok = spawnSync(bin, ['export', 'samples/molecules/water-sto-3g.tess', '--to', 'xyz'], { cwd: root, encoding: 'utf8' });
    expect(ok.status, ok.stderr).toBe(0);
    expect(parseXyz(ok.stdout).atoms.map((atom) => atom.symbol)).toEqual(['O', 'H', 'H']);
    const bad = spawnSync(bin, ['export', 'samples/mistakes.tess', '--to', 'qcschema'], { cwd: root, encoding: 'utf8' });
    expect(bad.status).toBe(1);
  });
});
