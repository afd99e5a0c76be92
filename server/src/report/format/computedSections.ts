/**
 * The computed results of a spec as report sections (`tessera report --mean-field`): the mean
 * fields, the chosen active orbitals, the DMET baths and the active-space Hamiltonians with their
 * measurement budgets, each table with the notes to read beside it. Results of Tessera's engine,
 * labelled computed; the shot budgets built on them are estimates and say so. Renders what the
 * command computed; computes nothing.
 */
import { activeSpaceTable, ACTIVE_SPACE_NOTE, type ActiveSpacePart } from './activeSpace';
import { BATH_NOTE, bathNotes, bathTable, type BathPart } from './dmetBath';
import { BUDGET_NOTE, HAMILTONIAN_NOTE, hamiltonianNotes, hamiltonianTable, type HamiltonianPart, type MeasurementSettings } from './hamiltonian';
import { COMPUTED_RESULTS_NOTE, meanFieldNotes, meanFieldTable, type MeanFieldPart } from './meanField';
import type { Table } from './table';

export interface ComputedResults {
  readonly parts: readonly MeanFieldPart[];
  readonly hamiltonians: readonly HamiltonianPart[];
  /** Measurement settings of each entry of `hamiltonians`. */
  readonly settings: readonly MeasurementSettings[];
}

export interface ComputedSection {
  readonly table: Table;
  readonly notes: readonly string[];
}

/** The sections in order: mean field, active orbitals, DMET bath, Hamiltonian; the empty ones left out. */
export function computedSections(results: ComputedResults): ComputedSection[] {
  const sections: ComputedSection[] = [{ table: meanFieldTable(results.parts), notes: [...meanFieldNotes(results.parts), COMPUTED_RESULTS_NOTE] }];
  const actives: ActiveSpacePart[] = results.parts.flatMap((part) => (part.activeSpace ? [{ label: part.label, activeSpace: part.activeSpace }] : []));
  if (actives.length > 0) sections.push({ table: activeSpaceTable(actives), notes: [ACTIVE_SPACE_NOTE] });
  const baths: BathPart[] = results.parts.flatMap((part) => (part.bath ? [{ label: part.label, bath: part.bath }] : []));
  if (baths.length > 0) sections.push({ table: bathTable(baths), notes: [...bathNotes(baths), BATH_NOTE] });
  const asked = results.hamiltonians.flatMap((part, k) => (part.result.state === 'not-asked' ? [] : [{ part, settings: results.settings[k]! }]));
  if (asked.length > 0) {
    const parts = asked.map((entry) => entry.part);
    sections.push({ table: hamiltonianTable(parts, asked.map((entry) => entry.settings)), notes: [...hamiltonianNotes(parts), HAMILTONIAN_NOTE, BUDGET_NOTE] });
  }
  return sections;
}
