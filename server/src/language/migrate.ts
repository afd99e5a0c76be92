/**
 * Retired spellings and their rewrites. The language used to write `units angstrom|bohr`,
 * `geometry { … }` / `geometry from "…"`, a braced basis block with per-element lines and the
 * function type inside, and `within <d> of <atom>`. The interpreter still reads them with their old
 * meaning; this module finds each one, says how it is written now, and computes the text changes
 * that rewrite it without changing what the spec means:
 *
 * - `units bohr` moves into the structure header (`structure in bohr { … }`); `units angstrom` is
 *   the default and goes. With atoms from an XYZ file (ångström by the format's convention) the old
 *   `units bohr` still applied to scan ranges and distance selectors: those numbers are converted.
 * - `geometry` becomes `structure` (carrying the unit of a `units` line along).
 * - `basis X { Zn = Y; functions t }` becomes `basis X`, `basis Y on all Zn`, `functions t`.
 * - `within d of a` becomes `closer-than d to a`. The new selector is strict; where an atom lies
 *   exactly d away the distance is raised by the smallest power of ten that keeps the selection.
 *
 * Each rewrite is self-contained (fixing `geometry` also moves the unit of a `units` line), so the
 * quick fixes can be applied one at a time in any order. Rewriting a whole file is migrateAll.ts.
 */
import { elementBySymbol } from '../chemistry/elements';
import { BOHR_IN_ANGSTROM } from '../chemistry/units';
import type { SpecModel } from './model';
import { atomsCloserThan } from './model/selectors';
import type { Argument, CommentNode, Statement, SyntaxTree } from './syntax';
import type { Span } from './text';

export interface TextChange {
  readonly span: Span;
  readonly newText: string;
}

export type RetiredKind = 'units' | 'geometry' | 'basis-block' | 'within';

export interface RetiredSpelling {
  readonly kind: RetiredKind;
  /** Where the diagnostic is shown. */
  readonly span: Span;
  /** Says what the statement is written as now, with the rewritten text. */
  readonly message: string;
  /** The quick fix's title. */
  readonly title: string;
  /** Empty when the statement cannot be rewritten safely (then the message says what to do). */
  readonly changes: readonly TextChange[];
}

interface Context {
  readonly text: string;
  readonly tree: SyntaxTree;
  readonly model: SpecModel | undefined;
  readonly units: Statement[];
  /** The first `structure` or `geometry` statement. */
  readonly geometry: Statement | undefined;
}

const word = (arg: Argument | undefined, text: string): boolean => arg?.kind === 'word' && arg.text === text;

/** Every retired spelling in a parsed spec, in document order. */
export function retiredSpellings(text: string, tree: SyntaxTree, model?: SpecModel): RetiredSpelling[] {
  const top = tree.statements;
  const context: Context = {
    text,
    tree,
    model,
    units: top.filter((statement) => word(statement.keyword, 'units')),
    geometry: top.find((statement) => word(statement.keyword, 'structure') || word(statement.keyword, 'geometry')),
  };
  const found: RetiredSpelling[] = [];
  for (const statement of top) {
    if (word(statement.keyword, 'units')) found.push(unitsLine(context, statement));
    else if (word(statement.keyword, 'geometry')) found.push(geometryStatement(context, statement));
    else if (word(statement.keyword, 'basis') && statement.block) found.push(basisBlock(context, statement));
  }
  visitSelectorStatements(top, (statement) => {
    statement.args.forEach((arg, i) => {
      if (word(arg, 'within')) {
        const item = withinSelector(context, statement, i);
        if (item) found.push(item);
      }
    });
  });
  return found.sort((a, b) => a.span.start - b.span.start);
}

/** `atoms …` lines of fragments and `basis … on …` lines: where distance selectors stand. */
function visitSelectorStatements(statements: readonly Statement[], visit: (statement: Statement) => void): void {
  for (const statement of statements) {
    if (word(statement.keyword, 'basis') && !statement.block) visit(statement);
    if (word(statement.keyword, 'fragment')) for (const inner of statement.block?.statements ?? []) if (word(inner.keyword, 'atoms')) visit(inner);
  }
}

// ---------------------------------------------------------------------------------------------
// units and geometry

function lengthUnitOf(statement: Statement): 'angstrom' | 'bohr' | undefined {
  const value = statement.args[0]?.text.toLowerCase();
  return value === 'angstrom' || value === 'bohr' ? value : undefined;
}

function fromFile(geometry: Statement | undefined): boolean {
  return word(geometry?.args[0], 'from');
}

function headerUnit(geometry: Statement): 'angstrom' | 'bohr' | undefined {
  if (!word(geometry.keyword, 'structure') || !word(geometry.args[0], 'in')) return undefined;
  const value = geometry.args[1]?.text.toLowerCase();
  return value === 'angstrom' || value === 'bohr' ? value : undefined;
}

/**
 * What the first `units` line means and how to keep it: the unit it sets, the words to add to the
 * structure header, and the distance numbers to convert (atoms from a file with `units bohr`).
 */
function unitMigration(context: Context): { unit: 'angstrom' | 'bohr' | undefined; header: string; changes: TextChange[] } {
  const first = context.units[0];
  const changes: TextChange[] = context.units.map((statement) => deleteStatement(context.text, statement));
  const unit = first ? lengthUnitOf(first) : undefined;
  const geometry = context.geometry;
  if (!first || unit !== 'bohr' || (geometry && headerUnit(geometry))) return { unit, header: '', changes };
  if (geometry && !fromFile(geometry)) return { unit, header: ' in bohr', changes };
  // Atoms from a file are in ångström; the old unit applied to the spec's distances only.
  for (const number of distanceNumbers(context.tree.statements)) {
    changes.push({ span: number.span, newText: formatLength(Number(number.text) * BOHR_IN_ANGSTROM) });
  }
  return { unit, header: '', changes };
}

/** The geometry statement's keyword rewritten, with the unit the old `units` line gave it. */
function geometryKeywordChange(context: Context, header: string): TextChange[] {
  const geometry = context.geometry;
  if (!geometry) return [];
  if (word(geometry.keyword, 'geometry')) return [{ span: geometry.keyword.span, newText: `structure${header}` }];
  if (header) return [{ span: { start: geometry.keyword.span.end, end: geometry.keyword.span.end }, newText: header }];
  return [];
}

function unitsLine(context: Context, statement: Statement): RetiredSpelling {
  const unit = lengthUnitOf(statement);
  const isFirst = context.units[0] === statement;
  const span = { start: statement.keyword.span.start, end: (statement.args[statement.args.length - 1] ?? statement.keyword).span.end };
  const shown = context.text.slice(span.start, span.end);
  if (!isFirst) {
    return { kind: 'units', span, message: `\`${shown}\` is an old spelling, and a repeated one: the length unit is part of the structure header now (\`structure in bohr { … }\`). Delete this line.`, title: 'Delete the old units line', changes: [deleteStatement(context.text, statement)] };
  }
  const migration = unitMigration(context);
  // The structure's keyword changes only when the unit moves into its header.
  const changes = [...migration.changes, ...(migration.header ? geometryKeywordChange(context, migration.header) : [])];
  const geometry = context.geometry;
  let message: string;
  if (unit !== 'bohr') {
    message = `\`${shown}\` is an old spelling: the length unit is part of the structure header now, and ångström needs no word (\`structure { … }\`; \`structure in bohr { … }\` for bohr). Delete this line.`;
  } else if (geometry && headerUnit(geometry)) {
    message = `\`${shown}\` is an old spelling: the length unit is part of the structure header now, and this structure names its own (\`structure in ${headerUnit(geometry)}\`). Delete this line.`;
  } else if (geometry && fromFile(geometry)) {
    message = `\`${shown}\` is an old spelling: the length unit is part of the structure header now, and \`structure from\` reads an XYZ file in ångström by the format's convention. The rewrite deletes this line and converts the scan ranges and \`closer-than\` distances of this spec from bohr to ångström.`;
  } else {
    message = `\`${shown}\` is an old spelling: the length unit is part of the structure header now, \`structure in bohr { … }\`. The rewrite moves it there and deletes this line.`;
  }
  return { kind: 'units', span, message, title: unit === 'bohr' ? 'Move the unit into the structure header' : 'Delete the old units line', changes };
}

function geometryStatement(context: Context, statement: Statement): RetiredSpelling {
  const isFirst = context.geometry === statement;
  const migration = isFirst ? unitMigration(context) : { header: '', changes: [] as TextChange[] };
  const now = `structure${migration.header}`;
  const shape = fromFile(statement) ? `${now} from "${statement.args[1]?.text ?? 'file.xyz'}"` : `${now} { … }`;
  const changes: TextChange[] = isFirst ? [...migration.changes, ...geometryKeywordChange(context, migration.header)] : [{ span: statement.keyword.span, newText: 'structure' }];
  const converts = isFirst && migration.changes.length > context.units.length;
  const unitNote = migration.header
    ? ' (the unit of the old `units` line moves into the header, and that line goes)'
    : converts
      ? ' (the old `units` line goes, and the scan ranges and `closer-than` distances are converted from bohr to ångström, the unit of XYZ files)'
      : context.units.length > 0 && isFirst
        ? ' (the old `units` line goes)'
        : '';
  return {
    kind: 'geometry',
    span: statement.keyword.span,
    message: `\`geometry\` is an old spelling: write \`${shape}\`${unitNote}.`,
    title: `Rewrite as \`${now}\``,
    changes,
  };
}

/** Number literals that are lengths: scan ranges (`from`, `to`, `step`) and distance selectors. */
function distanceNumbers(statements: readonly Statement[]): Argument[] {
  const numbers: Argument[] = [];
  for (const statement of statements) {
    if (word(statement.keyword, 'scan')) {
      statement.args.forEach((arg, i) => {
        const previous = statement.args[i - 1];
        if (arg.kind === 'number' && (word(previous, 'from') || word(previous, 'to') || word(previous, 'step'))) numbers.push(arg);
      });
    }
  }
  visitSelectorStatements(statements, (statement) => {
    statement.args.forEach((arg, i) => {
      if ((word(arg, 'within') || word(arg, 'closer-than')) && statement.args[i + 1]?.kind === 'number') numbers.push(statement.args[i + 1]!);
    });
  });
  return numbers;
}

/** A length written back: ten significant digits, trailing zeros dropped. */
function formatLength(value: number): string {
  return String(Number(value.toPrecision(10)));
}

// ---------------------------------------------------------------------------------------------
// basis block

function commentsIn(tree: SyntaxTree, span: Span): CommentNode[] {
  return tree.comments.filter((comment) => comment.span.start >= span.start && comment.span.start < span.end);
}

function lineOf(text: string, offset: number): number {
  let line = 0;
  for (let i = text.indexOf('\n'); i >= 0 && i < offset; i = text.indexOf('\n', i + 1)) line++;
  return line;
}

function basisBlock(context: Context, statement: Statement): RetiredSpelling {
  const { text } = context;
  const block = statement.block!;
  const name = statement.args[0]?.text ?? '<name>';
  const span = { start: statement.keyword.span.start, end: block.open.end };
  const lines: { line: number; text: string }[] = [];
  const at = (offset: number) => lineOf(text, offset);
  lines.push({ line: at(statement.keyword.span.start), text: `basis ${name}` });
  let functions: string | undefined;
  for (const inner of block.statements) {
    const head = inner.keyword;
    let rewritten: string;
    if (word(head, 'functions') && inner.args[0]) {
      rewritten = `functions ${inner.args[0].text}`;
      functions = rewritten;
    } else if (inner.args[0]?.kind === 'equals' && inner.args[1] && inner.args.length === 2 && elementBySymbol(head.text)) {
      rewritten = `basis ${inner.args[1].text} on all ${elementBySymbol(head.text)!.symbol}`;
    } else {
      // Not a line the old block allowed: kept as a comment, so nothing is lost.
      rewritten = `# ${text.slice(inner.span.start, inner.span.end)}`;
    }
    lines.push({ line: at(inner.span.start), text: rewritten });
  }
  const shown = lines.map((entry) => `\`${entry.text}\``).join(', ');
  const message = `The braced basis block is an old spelling: write one line per basis${functions ? ' and the function type on its own line' : ''}, ${shown}.`;
  if (!block.close) return { kind: 'basis-block', span, message: `${message} Close the block first, then apply the rewrite.`, title: 'Rewrite as one-line basis statements', changes: [] };
  // Comments inside the block follow the line they stood on, or keep their own line.
  const comments = commentsIn(context.tree, { start: statement.span.start, end: block.close.end });
  const out: string[] = [];
  const used = new Set<CommentNode>();
  for (const entry of lines) {
    const trailing = comments.filter((comment) => !used.has(comment) && at(comment.span.start) === entry.line);
    const standalone = comments.filter((comment) => !used.has(comment) && at(comment.span.start) < entry.line);
    for (const comment of standalone) {
      out.push(comment.text.trim());
      used.add(comment);
    }
    trailing.forEach((comment) => used.add(comment));
    out.push(trailing.length > 0 ? `${entry.text}  ${trailing.map((comment) => comment.text.trim()).join(' ')}` : entry.text);
  }
  for (const comment of comments) if (!used.has(comment)) out.push(comment.text.trim());
  const indent = text.slice(text.lastIndexOf('\n', statement.span.start - 1) + 1, statement.span.start);
  const whole = { start: statement.span.start, end: block.close.end };
  // A comment after the `}` on the same line stays where it is; comments inside moved with their lines.
  const replaced = extendOverComments(text, whole, comments);
  return {
    kind: 'basis-block',
    span,
    message,
    title: 'Rewrite as one-line basis statements',
    changes: [{ span: replaced, newText: out.join(`\n${/^\s*$/.test(indent) ? indent : ''}`) }],
  };
}

/** The span grown to cover comments that start inside it but end after it (a comment on the `}` line). */
function extendOverComments(text: string, span: Span, comments: readonly CommentNode[]): Span {
  let end = span.end;
  for (const comment of comments) end = Math.max(end, comment.span.start + comment.text.replace(/\r$/, '').length);
  return { start: span.start, end: Math.min(end, text.length) };
}

// ---------------------------------------------------------------------------------------------
// within

function withinSelector(context: Context, statement: Statement, i: number): RetiredSpelling | undefined {
  const args = statement.args;
  const distanceArg = args[i + 1];
  const ofArg = args[i + 2];
  const target = args[i + 3];
  const span = { start: args[i]!.span.start, end: (target ?? ofArg ?? distanceArg ?? args[i]!).span.end };
  const shown = context.text.slice(span.start, span.end);
  if (distanceArg?.kind !== 'number' || !word(ofArg, 'of') || !target) {
    return { kind: 'within', span, message: `\`within … of\` is an old spelling: write \`closer-than <distance> to <atom>\`, for example \`closer-than 3.0 to zn\` (strictly closer, in the structure's unit).`, title: 'Rewrite as `closer-than`', changes: [] };
  }
  const distance = strictDistance(context.model, Number(distanceArg.text), target) ?? distanceArg.text;
  const now = `closer-than ${distance} to ${target.text}`;
  const unit = context.model?.units === 'bohr' ? 'bohr' : 'Å';
  const raised = distance !== distanceArg.text ? ` (${distance} rather than ${distanceArg.text}, because \`closer-than\` is strict and an atom lies exactly ${distanceArg.text} ${unit} away)` : '';
  return {
    kind: 'within',
    span,
    message: `\`${shown}\` is an old spelling: write \`${now}\`, every atom strictly closer than ${distance} ${unit} (the structure's unit) to ${target.text}${raised}.`,
    title: `Rewrite as \`${now}\``,
    changes: [{ span, newText: now }],
  };
}

/**
 * The distance for `closer-than` that selects what `within d` selected: d itself unless an atom lies
 * at d (to rounding); then d plus the largest power of ten from 1e-4 down to 1e-10 that selects the
 * same atoms. Undefined when d can stay (or there is no model to measure with).
 */
function strictDistance(model: SpecModel | undefined, distance: number, target: Argument): string | undefined {
  if (!model) return undefined;
  const centre = target.kind === 'index' ? Number(target.text.slice(1)) - 1 : model.labels.get(target.text);
  if (centre === undefined || centre < 0 || centre >= model.atoms.length) return undefined;
  const scale = model.units === 'bohr' ? BOHR_IN_ANGSTROM : 1;
  const old = atomsCloserThan(model.coordinates, centre, distance * scale, true).join(',');
  if (atomsCloserThan(model.coordinates, centre, distance * scale).join(',') === old) return undefined;
  for (let k = 4; k <= 10; k++) {
    const raised = Number((distance + 10 ** -k).toFixed(k));
    if (atomsCloserThan(model.coordinates, centre, raised * scale).join(',') === old) return String(raised);
  }
  return undefined;
}

// ---------------------------------------------------------------------------------------------
// shared

/** Deletes a statement: its whole line when nothing else stands on it, else the statement and its `;`. */
function deleteStatement(text: string, statement: Statement): TextChange {
  const lineStart = text.lastIndexOf('\n', statement.span.start - 1) + 1;
  let lineEnd = text.indexOf('\n', statement.span.end);
  if (lineEnd < 0) lineEnd = text.length;
  const before = text.slice(lineStart, statement.span.start);
  const after = text.slice(statement.span.end, lineEnd);
  if (before.trim() === '' && (after.trim() === '' || after.trim().startsWith('#'))) {
    return { span: { start: lineStart, end: Math.min(lineEnd + 1, text.length) }, newText: '' };
  }
  const semicolon = /^\s*;\s*/.exec(after);
  return { span: { start: statement.span.start, end: statement.span.end + (semicolon ? semicolon[0].length : 0) }, newText: '' };
}
