/**
 * `tessera export --to qcschema-input`: a QCSchema input record per fragment and scan point,
 * every record validated against the input schema QCElemental publishes
 * (tests/fixtures/qcschema-input.schema.json, written by scripts/data/generate_qcschema_input_schema.py
 * from python3-qcelemental), the manifest, the capped molecules and the per-atom basis sets.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import Ajv from 'ajv-draft-04';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import type { QcInputExport } from '../../server/src/report/export/qcschemaInput';
import { cleanSamples, root, run, scratch } from './harness';

/** Bohr radius in ångström, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)). */
const BOHR_ANGSTROM_CODATA_2018 = 0.529177210903;

const SCHEMA_PATH = path.join(root, 'tests', 'fixtures', 'qcschema-input.schema.json');
const schema = JSON.parse(readFileSync(SCHEMA_PATH, 'utf8')) as object;
const ajv = new Ajv({ allErrors: true, strict: true });
// Field metadata pydantic writes into the schema (not JSON Schema keywords): annotations only.
ajv.addKeyword({ keyword: 'shape' });
ajv.addKeyword({ keyword: 'units' });
const validateInput = ajv.compile(schema);

async function exportInput(file: string): Promise<QcInputExport> {
  const result = await run(['export', file, '--to', 'qcschema-input']);
  expect(result.code, result.stderr).toBe(0);
  return JSON.parse(result.stdout) as QcInputExport;
}

function specAnalysis(file: string) {
  return analyzeDocument(readFileSync(path.join(root, file), 'utf8'), { path: path.join(root, file) });
}

describe('the QCSchema input schema fixture', () => {
  it('is the file its origin note describes (SHA-256), from python3-qcelemental', () => {
    const origin = readFileSync(path.join(root, 'tests', 'fixtures', 'qcschema-input.schema.origin.md'), 'utf8');
    const digest = createHash('sha256').update(readFileSync(SCHEMA_PATH)).digest('hex');
    expect(origin).toContain(`\`${digest}\``);
    expect(origin).toMatch(/python3-qcelemental \d/);
  });

  it('rejects what is not an input record (so that passing means something)', () => {
    const molecule = { schema_name: 'qcschema_molecule', schema_version: 2, symbols: ['He'], geometry: [0, 0, 0] };
    const good = { schema_name: 'qcschema_input', schema_version: 1, driver: 'energy', model: { method: 'hf', basis: 'cc-pVDZ' }, molecule };
    expect(validateInput(good)).toBe(true);
    expect(validateInput({ ...good, driver: 'energies' })).toBe(false);
    expect(validateInput({ ...good, model: { basis: 'cc-pVDZ' } })).toBe(false);
    expect(validateInput({ ...good, schema_name: 'qcschema_output' })).toBe(false);
    expect(validateInput({ ...good, tier: 'quantum' })).toBe(false);
    expect(validateInput({ ...good, model: { method: 'hf', basis: { schema_name: 'qcschema_basis', name: 'x', center_data: {}, atom_map: ['a'], extra: 1 } } })).toBe(false);
  });
});

describe('tessera export --to qcschema-input', () => {
  it.each(cleanSamples())('%s: every record validates; one per fragment with a tier and scan point; the manifest names each', async (file) => {
    const exported = await exportInput(file);
    expect(exported.format).toBe('tessera-qcschema-input-export');
    const { model } = specAnalysis(file);
    const tiered = model.fragments.filter((fragment) => fragment.tier);
    const points = Math.max(1, model.scan?.values.length ?? 0);
    expect(exported.records).toHaveLength(tiered.length * points);
    expect(exported.skipped.map((entry) => entry.fragment)).toEqual(model.fragments.filter((fragment) => !fragment.tier).map((fragment) => fragment.name));
    exported.records.forEach((record, k) => {
      expect(validateInput(record), `${record.id}: ${JSON.stringify(validateInput.errors)}`).toBe(true);
      const entry = exported.manifest[k]!;
      expect(entry.record).toBe(k);
      expect(entry.id).toBe(record.id);
      expect(entry.fragment).toBe(record.extras.tessera.fragment);
      expect(entry.method).toBe(record.model.method);
      expect(record.molecule.symbols).toHaveLength(record.extras.tessera.atom_basis.length);
      const fragment = model.fragments[entry.fragment_index]!;
      expect(record.molecule.molecular_charge).toBe(fragment.charge);
      expect(record.molecule.molecular_multiplicity).toBe(fragment.multiplicity);
    });
    expect(new Set(exported.records.map((record) => record.id)).size).toBe(exported.records.length);
  });

  it('writes the capped methyls of ethane at every scan point, the scaled cap following the C–C bond', async () => {
    const exported = await exportInput('samples/launch/ethane-capped-methyls.tess');
    // 2 fragments × 5 points (1.4 to 2.2 Å step 0.2).
    expect(exported.records).toHaveLength(10);
    for (const record of exported.records) {
      expect(record.molecule.symbols).toEqual(['C', 'H', 'H', 'H', 'H']);
      expect(record.molecule.atom_labels[4]).toBe('cap');
      expect(record.model.basis).toBe('cc-pVDZ');
      const point = record.extras.tessera.scan_point!;
      const geometry = record.molecule.geometry.map((value) => value * BOHR_ANGSTROM_CODATA_2018);
      const capDistance = Math.hypot(geometry[12]! - geometry[0]!, geometry[13]! - geometry[1]!, geometry[14]! - geometry[2]!);
      // Scaled link atom: g · d(C–C), g = (r_C + r_H)/(r_C + r_C) with Cordero radii 0.76 and 0.31 Å
      // (Cordero et al., Dalton Trans. 2008, 2832).
      expect(capDistance).toBeCloseTo((1.07 / 1.52) * point.distance_angstrom!, 9);
    }
    const left = exported.records[0]!;
    // The quantum tier runs on the mean field of a closed-shell CH4-like fragment.
    expect(left.model.method).toBe('hf');
    expect(left.keywords).toEqual({ reference: 'rhf', frozen_core: true });
    expect(left.extras.tessera.tier).toMatchObject({ level: 'quantum', method: 'vqe', mapping: 'jordan-wigner', active: { electrons: 2, orbitals: 2 } });
    expect(exported.records[1]!.model.method).toBe('ccsd');
  });

  it('writes a per-atom basis as a QCSchema basis set whose functions add up to the fragment\'s count', async () => {
    const file = 'samples/molecules/water-pair-overrides.tess';
    const exported = await exportInput(file);
    const analysis = specAnalysis(file);
    const donor = exported.records.find((record) => record.extras.tessera.fragment === 'donor')!;
    const basis = donor.model.basis;
    if (typeof basis === 'string') throw new Error('expected a basis object for the donor');
    expect(basis.atom_map).toHaveLength(donor.molecule.symbols.length);
    // cc-pVTZ on the oxygen, aug-cc-pVDZ on its hydrogens (the spec's override lines).
    expect(donor.extras.tessera.atom_basis).toEqual(['cc-pVTZ', 'aug-cc-pVDZ', 'aug-cc-pVDZ']);
    const spherical = basis.atom_map.reduce((sum, centre) => sum + basis.center_data[centre]!.electron_shells.reduce((n, shell) => n + 2 * shell.angular_momentum[0]! + 1, 0), 0);
    // O cc-pVTZ [4s3p2d1f] 30 functions, H aug-cc-pVDZ [3s2p] 9 (Dunning 1989; Kendall, Dunning &
    // Harrison 1992): 30 + 2 × 9 = 48, and the figures of the fragment agree.
    expect(spherical).toBe(48);
    expect(spherical).toBe(analysis.fragmentFigures(analysis.model.fragments.findIndex((f) => f.name === 'donor')).basisFunctions.spherical);
    const acceptor = exported.records.find((record) => record.extras.tessera.fragment === 'acceptor')!;
    expect(acceptor.model).toEqual({ method: 'hf', basis: 'cc-pVDZ' });
    expect(acceptor.keywords).toMatchObject({ reference: 'rhf' });
  });

  it('writes an effective core potential with the basis that carries it', async () => {
    // Hydrogen iodide at r 1.609 Å (Huber & Herzberg 1979, from memory).
    const folder = scratch({
      'iodide.tess': 'basis def2-svp\nbasis cc-pvdz on all H\nstructure {\n  I i 0 0 0\n  H h 0 0 1.609\n}\nfragment hi {\n  atoms rest\n  tier correlated { method mp2 }\n}\n',
    });
    const result = await run(['export', 'iodide.tess', '--to', 'qcschema-input'], folder);
    expect(result.code, result.stderr).toBe(0);
    const record = (JSON.parse(result.stdout) as QcInputExport).records[0]!;
    expect(validateInput(record), JSON.stringify(validateInput.errors)).toBe(true);
    const basis = record.model.basis;
    if (typeof basis === 'string') throw new Error('expected a basis object');
    const iodine = basis.center_data[basis.atom_map[0]!]!;
    // def2 bases replace the 28 core electrons of iodine by an ECP (Peterson et al. 2003, as
    // distributed with the def2 sets of Weigend & Ahlrichs 2005).
    expect(iodine.ecp_electrons).toBe(28);
    expect(iodine.ecp_potentials!.length).toBeGreaterThan(0);
  });
});
