/**
 * Hover cards: fragments (their resource figures), atoms, basis sets and basis lines (which atoms
 * take which basis), and every keyword and value word of the language, with the structure's length
 * unit where a distance is read in it.
 */
import { markdownText } from '../report/format/escape';
import { MarkupKind, type Hover } from 'vscode-languageserver-types';
import { findBasisSet, type BasisSet } from '../chemistry/basis/library';
import { ELEMENTS } from '../chemistry/elements';
import { nearestAtoms } from '../chemistry/geometry';
import { BOHR_IN_ANGSTROM } from '../chemistry/units';
import type { DocumentAnalysis } from '../analysis';
import { describeTarget } from '../language/ast';
import { claimsOf, type AtomModel } from '../language/model';
import type { Argument, Statement } from '../language/syntax';
import {
  ACTIVE_CHOICES,
  ANSATZE,
  BASIS_PRECEDENCE,
  BASIS_TARGET_WORDS,
  EMBEDDINGS,
  FUNCTION_TERMS,
  findKeyword,
  MAPPING_TERMS,
  METHODS,
  RETIRED_SPELLINGS,
  SCAN_KINDS,
  SELECTOR_WORDS,
  SWITCH_TERMS,
  TIER_LEVELS,
  UNIT_TERMS,
  type TermInfo,
} from '../language/vocabulary';
import { fragmentCard } from './cards';
import { scanCard } from './scanCard';
import { meanFieldSection, NO_COMPUTE_POLICY, type ComputePolicy } from './computed';
import { hamiltonianSection } from './hamiltonian';
import { bathSection } from './computedBath';
import { activeSpaceSection } from './computedActive';
import { includedFragmentNote, includedFragmentsCard, onlyIncluded } from './includedFragments';
import { locate, type CursorContext } from './locate';
import { toOffset, toRange } from './positions';
import type { Position } from 'vscode-languageserver-types';

function markdown(value: string, analysis: DocumentAnalysis, node: Argument): Hover {
  return { contents: { kind: MarkupKind.Markdown, value }, range: toRange(analysis, node.span) };
}

/** Neighbour search radius for atom cards, Å. */
const NEIGHBOUR_RADIUS = 4;

/** The atom's nearest neighbours: one scan of the coordinates, no grid of the whole geometry. */
function neighbours(analysis: DocumentAnalysis, atom: number, limit: number): { atom: number; distance: number }[] {
  return nearestAtoms(analysis.model.coordinates, atom, NEIGHBOUR_RADIUS, limit).map((pair) => ({ atom: pair.j, distance: pair.distance }));
}

function atomTitle(atom: AtomModel): string {
  return atom.label ? `${markdownText(atom.label)} (#${atom.index + 1})` : `#${atom.index + 1}`;
}

export function atomCard(analysis: DocumentAnalysis, index: number): string {
  const { model } = analysis;
  const atom = model.atoms[index]!;
  const c = model.coordinates;
  const xyz = [c[3 * index]!, c[3 * index + 1]!, c[3 * index + 2]!];
  const inBohr = xyz.map((value) => value / BOHR_IN_ANGSTROM);
  const fragments = claimsOf(model, index).map((fragment) => `\`${model.fragments[fragment]!.name}\``);
  const near = neighbours(analysis, index, 4);
  const lines = [
    `**${atom.element.name}** ${atomTitle(atom)} · ${atom.element.symbol}, Z = ${atom.element.z}`,
    '',
    `| | |`,
    `| --- | --- |`,
    `| position | ${xyz.map((v) => v.toFixed(4)).join('  ')} Å |`,
    `| | ${inBohr.map((v) => v.toFixed(4)).join('  ')} bohr |`,
    `| fragment | ${fragments.length > 0 ? fragments.join(', ') : 'none'} |`,
    `| covalent radius | ${atom.element.covalentRadius?.toFixed(2) ?? '–'} Å (Cordero et al. 2008) |`,
  ];
  const basis = model.basis.atomSets[index];
  const line = model.basis.decidedBy[index]!;
  if (basis) lines.push(`| basis | ${basis.displayName}${line >= 0 ? ` (\`on ${model.basis.overrides[line]!.ast.targets.map(describeTarget).join(' ')}\`)` : ' (main line)'} |`);
  if (atom.source) lines.push(`| read from | line ${atom.source.line + 1} of \`${atom.source.file.split('/').pop()}\` |`);
  lines.push(
    `| nearest | ${near.length > 0 ? near.map((n) => `${atomTitle(model.atoms[n.atom]!)} ${model.atoms[n.atom]!.element.symbol} ${n.distance.toFixed(3)} Å`).join(', ') : `none within ${NEIGHBOUR_RADIUS} Å`} |`,
  );
  return lines.join('\n');
}

/** `H–Kr, Rb–Rn` style ranges of atomic numbers. */
function elementRanges(symbols: readonly string[]): string {
  const numbers = symbols.map((symbol) => ELEMENTS.find((e) => e.symbol === symbol)?.z ?? 0).filter((z) => z > 0).sort((a, b) => a - b);
  const ranges: string[] = [];
  let start = numbers[0];
  for (let i = 1; i <= numbers.length; i++) {
    const previous = numbers[i - 1]!;
    if (numbers[i] !== previous + 1) {
      const first = ELEMENTS[start! - 1]!.symbol;
      const last = ELEMENTS[previous - 1]!.symbol;
      ranges.push(start === previous ? first : `${first}–${last}`);
      start = numbers[i];
    }
  }
  return ranges.join(', ');
}

export function basisCard(analysis: DocumentAnalysis, basis: BasisSet): string {
  const present = [...new Set(analysis.model.atoms.map((atom) => atom.element.symbol))];
  const rows = present.map((symbol) => {
    const spherical = basis.functionCount(symbol, 'spherical');
    const cartesian = basis.functionCount(symbol, 'cartesian');
    const ecp = basis.ecpCoreElectrons(symbol);
    return spherical === undefined
      ? `| ${symbol} | **not defined** | | |`
      : `| ${symbol} | ${spherical} | ${cartesian} | ${ecp > 0 ? `${ecp} e⁻ in ECP` : ''} |`;
  });
  return [
    `**${basis.displayName}** · ${basis.family.title}`,
    '',
    `Defines ${basis.elements.length} elements: ${elementRanges(basis.elements)}. Usual function type: ${basis.functions}.`,
    ...(rows.length > 0 ? ['', '| element | spherical | cartesian | |', '| --- | ---: | ---: | --- |', ...rows] : []),
    ...(basis.family.references.length > 0 ? ['', ...basis.family.references.map((reference) => `- ${reference}`)] : []),
  ].join('\n');
}

/** `ångström` or `bohr`: the unit the structure's distances are read in. */
function unitName(analysis: DocumentAnalysis): string {
  return analysis.model.units === 'bohr' ? 'bohr' : 'ångström';
}

function atomList(analysis: DocumentAnalysis, atoms: readonly number[]): string {
  const names = atoms.map((atom) => analysis.model.atoms[atom]!).map((atom) => atom.label ?? `#${atom.index + 1}`);
  return names.length <= 12 ? names.join(', ') : `${names.slice(0, 12).join(', ')} and ${names.length - 12} more`;
}

/**
 * What a basis line does: for the main line, how many atoms keep it and which override lines take
 * the others; for an override, the atoms it gives its basis to and those it selects that another
 * line decides.
 */
export function basisLineCard(analysis: DocumentAnalysis, statement: Statement): string | undefined {
  const { basis } = analysis.model;
  const lines: string[] = [];
  if (analysis.ast.basis?.statement === statement) {
    const kept = analysis.model.atoms.filter((atom) => basis.decidedBy[atom.index] === -1).length;
    lines.push(`Main basis: ${kept} of ${analysis.model.atoms.length} atoms take it.`);
    basis.overrides.forEach((line, index) => {
      const decided = analysis.model.atoms.filter((atom) => basis.decidedBy[atom.index] === index).map((atom) => atom.index);
      if (line.set && decided.length > 0) lines.push(`- ${line.set.displayName} on ${line.ast.targets.map(describeTarget).join(' ')}: ${decided.length} atom${decided.length === 1 ? '' : 's'}`);
    });
  } else {
    const index = basis.overrides.findIndex((line) => line.ast.statement === statement);
    const line = basis.overrides[index];
    if (!line) return undefined;
    const selected = [...line.atomRanks.keys()].sort((a, b) => a - b);
    const decided = selected.filter((atom) => basis.decidedBy[atom] === index);
    const elsewhere = selected.filter((atom) => basis.decidedBy[atom] !== index);
    lines.push(`Override: ${line.set?.displayName ?? `'${line.ast.name?.value ?? '?'}' (not in the library)`} for ${decided.length} atom${decided.length === 1 ? '' : 's'}${decided.length > 0 ? `: ${atomList(analysis, decided)}` : ''}.`);
    if (elsewhere.length > 0) lines.push('', `Selected but decided by another line: ${atomList(analysis, elsewhere)}.`);
  }
  lines.push('', ...basisPerElement(analysis), '', BASIS_PRECEDENCE);
  return lines.join('\n');
}

/**
 * Which basis each element of the structure takes, atom by atom, and the spec's own basis (the
 * main line's): an element split between bases lists each with its atom count, and a basis given
 * by an override line names that line.
 */
export function basisPerElement(analysis: DocumentAnalysis): string[] {
  const { basis, atoms } = analysis.model;
  const main = basis.main?.displayName ?? (analysis.ast.basis?.name ? `'${analysis.ast.basis.name.value}' (not in the library)` : 'none');
  const perElement = new Map<string, Map<number, number>>();
  for (const atom of atoms) {
    const byLine = perElement.get(atom.element.symbol) ?? new Map<number, number>();
    const line = basis.decidedBy[atom.index]!;
    byLine.set(line, (byLine.get(line) ?? 0) + 1);
    perElement.set(atom.element.symbol, byLine);
  }
  const name = (line: number): string => {
    if (line < 0) return `${main} (spec’s basis)`;
    const override = basis.overrides[line]!;
    return `${override.set?.displayName ?? override.ast.name?.value ?? '?'} (\`on ${override.ast.targets.map(describeTarget).join(' ')}\`)`;
  };
  const rows = [...perElement].map(([symbol, byLine]) => {
    const total = [...byLine.values()].reduce((sum, count) => sum + count, 0);
    const bases = byLine.size === 1 ? name([...byLine.keys()][0]!) : [...byLine].map(([line, count]) => `${name(line)} × ${count}`).join('; ');
    return `| ${symbol} | ${total} | ${bases} |`;
  });
  if (rows.length === 0) return [`Spec’s basis: ${main}.`];
  return [`Spec’s basis: ${main}. Per element:`, '', '| element | atoms | basis |', '| --- | ---: | --- |', ...rows];
}

function termCard(term: TermInfo, kind: string): string {
  return [
    `**${term.name}** · ${kind}`,
    '',
    term.summary,
    ...(term.scaling ? ['', `Cost: ${term.scaling}.`] : []),
    ...(term.reference ? ['', `_${term.reference}_`] : []),
  ].join('\n');
}

/** The value words of each statement, for hover on the word after a keyword. */
const VALUE_TERMS: Readonly<Record<string, { terms: readonly TermInfo[]; kind: string }>> = {
  structure: { terms: UNIT_TERMS, kind: 'length unit' },
  basis: { terms: [...BASIS_TARGET_WORDS, ...SELECTOR_WORDS], kind: 'basis selection' },
  functions: { terms: FUNCTION_TERMS, kind: 'function type' },
  tier: { terms: TIER_LEVELS, kind: 'solver tier' },
  method: { terms: METHODS, kind: 'method' },
  ansatz: { terms: ANSATZE, kind: 'ansatz' },
  mapping: { terms: MAPPING_TERMS, kind: 'fermion-to-qubit mapping' },
  embedding: { terms: EMBEDDINGS, kind: 'embedding' },
  'frozen-core': { terms: SWITCH_TERMS, kind: 'switch' },
  taper: { terms: SWITCH_TERMS, kind: 'switch' },
  scan: { terms: SCAN_KINDS, kind: 'scan coordinate' },
  atoms: { terms: SELECTOR_WORDS, kind: 'selector' },
  active: { terms: ACTIVE_CHOICES, kind: 'active-space suggestion' },
};

/** Binary search of the inline atom whose line holds the offset. */
function atomAtLine(analysis: DocumentAnalysis, offset: number): number | undefined {
  const atoms = analysis.model.atoms;
  let low = 0;
  let high = atoms.length - 1;
  while (low <= high) {
    const mid = (low + high) >> 1;
    const span = atoms[mid]!.span;
    if (atoms[mid]!.source) return undefined;
    if (offset < span.start) high = mid - 1;
    else if (offset > span.end) low = mid + 1;
    else return mid;
  }
  return undefined;
}

/** The computed (or counted) active space under the `active` keyword of a fragment's tier. */
function activeLineCard(analysis: DocumentAnalysis, statement: { readonly span: { readonly start: number } }): string | undefined {
  const fragment = analysis.model.fragments.find((f) => f.ast.tier?.active && f.ast.tier.active.span.start === statement.span.start);
  return fragment ? (activeSpaceSection(analysis, fragment.index) ?? undefined) : undefined;
}

/** The atom a token refers to: a label or #index in a selector or scan, or an atom line. */
export function atomAt(analysis: DocumentAnalysis, context: CursorContext): number | undefined {
  const token = context.token;
  if (!token) return undefined;
  const reference = analysis.model.atomReferences.find((ref) => ref.span.start === token.node.span.start && ref.span.end === token.node.span.end);
  if (reference) return reference.atom;
  if (context.block === 'structure' && (token.index === -1 || (token.index === 0 && token.node.kind === 'word'))) return atomAtLine(analysis, token.node.span.start);
  return undefined;
}

/** `policy`: which parts the server computes by itself (for the fragment card's computed section). */
export function doHover(analysis: DocumentAnalysis, position: Position, policy: ComputePolicy = NO_COMPUTE_POLICY): Hover | null {
  const offset = toOffset(analysis, position);
  const context = locate(analysis.text, analysis.tree.statements, offset);
  const token = context.token;
  const statement = context.statement;
  if (!token || !statement) return null;
  const keywordText = statement.keyword.text;

  const atom = atomAt(analysis, context);
  if (atom !== undefined) return markdown(atomCard(analysis, atom), analysis, token.node);

  if (token.index === -1) {
    const keyword = findKeyword(keywordText, context.block);
    if (keyword) {
      const unit = keyword.name === 'structure' || keyword.name === 'scan' ? `\n\nLength unit of this spec: ${unitName(analysis)}.` : '';
      const line = keyword.name === 'basis' ? basisLineCard(analysis, statement) : keyword.name === 'active' ? activeLineCard(analysis, statement) : keyword.name === 'scan' ? scanCard(analysis) : undefined;
      return markdown(`**${keyword.name}**\n\n${keyword.summary}\n\n\`${keyword.syntax}\`${unit}${line ? `\n\n${line}` : ''}`, analysis, token.node);
    }
    const retired = context.block === 'top' ? RETIRED_SPELLINGS.find((entry) => entry.name === keywordText || (entry.name === 'basis block' && keywordText === 'basis')) : undefined;
    return retired ? markdown(`**${keywordText}** · old spelling\n\n${retired.summary}\n\nWrite \`${retired.now}\`; the quick fix rewrites it.`, analysis, token.node) : null;
  }

  // A fragment's name where it is declared, or after `on fragment` in a basis line.
  const declared = context.block === 'top' && keywordText === 'fragment' && token.index === 0;
  const referenced = context.block === 'top' && keywordText === 'basis' && token.index > 0 && statement.args[token.index - 1]?.text === 'fragment';
  if (declared || referenced) {
    const fragment = declared ? analysis.model.fragments.find((f) => !onlyIncluded(f) && f.ast.name?.span.start === token.node.span.start) : analysis.model.fragments.find((f) => f.name === token.node.text);
    if (fragment) {
      const part = { kind: 'fragment', index: fragment.index } as const;
      const bath = bathSection(analysis, fragment.index);
      const hamiltonian = hamiltonianSection(analysis, part);
      const origin = includedFragmentNote(analysis, fragment);
      const sections = [fragmentCard(analysis, fragment.index), ...(origin ? [origin] : []), meanFieldSection(analysis, part, policy), ...(bath ? [bath] : []), ...(hamiltonian ? [hamiltonian] : [])];
      return markdown(sections.join('\n\n---\n\n'), analysis, token.node);
    }
  }
  const taken = analysis.ast.geometry?.withFragments;
  if (context.block === 'top' && keywordText === 'structure' && taken && token.node.span.start >= taken.start && token.node.span.end <= taken.end) {
    const card = includedFragmentsCard(analysis);
    if (card) return markdown(card, analysis, token.node);
  }
  if (context.block === 'top' && keywordText === 'basis' && token.index === 0) {
    const basis = findBasisSet(token.node.text);
    const line = basisLineCard(analysis, statement);
    if (basis) return markdown(`${basisCard(analysis, basis)}${line ? `\n\n---\n\n${line}` : ''}`, analysis, token.node);
  }
  if (context.block === 'top' && keywordText === 'basis' && token.index === 1 && token.node.text === 'on') {
    const line = basisLineCard(analysis, statement);
    if (line) return markdown(line, analysis, token.node);
  }
  const values = VALUE_TERMS[keywordText];
  if (values && token.node.kind === 'word') {
    const term = values.terms.find((t) => t.name === token.node.text.toLowerCase());
    if (term) {
      const unit = term.name === 'closer-than' ? `\n\nHere d is in ${unitName(analysis)}, the structure's unit.` : '';
      return markdown(`${termCard(term, values.kind)}${unit}`, analysis, token.node);
    }
  }
  return null;
}
