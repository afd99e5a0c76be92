/**
 * `structure [in angstrom|bohr] { <Element> [label] x y z ... }` and `structure from "file.xyz"`
 * (and the retired `geometry` with the same shapes and no unit). Blocks the fast reader took whole
 * arrive as an AtomTable; other blocks are read line by line here.
 */
import { elementBySymbol } from '../../chemistry/elements';
import { atomListOf, atomListOfMixed, type AtomAst, type GeometryAst, type Located } from '../ast';
import { didYouMean } from '../suggest';
import type { Statement } from '../syntax';
import { joinSpans, type Span } from '../text';
import type { LengthUnit } from '../../chemistry/units';
import { KEYWORDS, UNIT_TERMS } from '../vocabulary';
import { describeArgument, type StatementReader } from './reader';

/** Common element symbols offered when an atom line starts with a word that is none. */
const COMMON_ELEMENTS = ['H', 'He', 'Li', 'Be', 'B', 'C', 'N', 'O', 'F', 'Ne', 'Na', 'Mg', 'Al', 'Si', 'P', 'S', 'Cl', 'Ar', 'K', 'Ca', 'Fe', 'Co', 'Ni', 'Cu', 'Zn', 'Br', 'I'];

/** `in angstrom|bohr` at args[at]; undefined (after a report) when malformed. */
function readUnit(reader: StatementReader, statement: Statement, at: number): Located<LengthUnit> | undefined {
  const word = statement.args[at]!;
  const value = statement.args[at + 1];
  if (!value) {
    reader.sink.report('missing-value', word.span, 'Name the length unit after `in`: `structure in bohr { … }` (ångström is the default).');
    return undefined;
  }
  return reader.term<LengthUnit>(value, UNIT_TERMS, 'length unit');
}

export function readGeometry(reader: StatementReader, statement: Statement): GeometryAst {
  const sink = reader.sink;
  const keyword = statement.keyword.text;
  const args = statement.args;
  let unit: Located<LengthUnit> | undefined;
  let include: Located<string> | undefined;
  let withFragments: Span | undefined;
  const first = args[0];
  const header = first?.kind === 'word' && first.text === 'in' && keyword === 'structure';
  if (header) {
    unit = readUnit(reader, statement, 0);
    if (args.length > 2) sink.report('extra-value', joinSpans(args[2]!.span, args[args.length - 1]!.span), 'The structure header takes the unit only: `structure in bohr { … }`.');
    if (!statement.block) sink.report('missing-block', statement.keyword.span, 'Give the atoms in a block after the header: `structure in bohr { O 0 0 0 ... }`.');
  } else if (first) {
    const [from, path, ...after] = args;
    let rest = after;
    // `with fragments`: the included spec's fragments come too (a .tess file only; model/includedFragments.ts says so otherwise).
    if (rest[0]?.kind === 'word' && rest[0].text === 'with') {
      const what = rest[1];
      if (what?.kind === 'word' && what.text === 'fragments') withFragments = joinSpans(rest[0].span, what.span);
      else sink.report(what ? 'invalid-value' : 'missing-value', what?.span ?? rest[0].span, `\`with\` after the file name takes \`fragments\`: \`structure from "base.tess" with fragments\`${what ? `; found ${describeArgument(what)}` : ''}.`);
      rest = rest.slice(what ? 2 : 1);
    }
    if (from!.kind !== 'word' || from!.text !== 'from') {
      sink.report('invalid-value', from!.span, `Write \`structure { ... }\` with the atoms inside, \`structure in bohr { ... }\`, or \`structure from "file.xyz"\`; found ${describeArgument(from!)}.`);
    } else if (!path) {
      sink.report('missing-value', from!.span, 'Name the XYZ file to read: `structure from "file.xyz"`.');
    } else if (path.kind !== 'string' && path.kind !== 'word') {
      sink.report('invalid-value', path.span, `The file to read is a path in quotes, not ${describeArgument(path)}.`);
    } else {
      include = { value: path.text, span: path.span };
    }
    if (rest[0]?.kind === 'word' && rest[0].text === 'in') {
      sink.report('extra-value', joinSpans(rest[0].span, rest[rest.length - 1]!.span), 'An XYZ file is in ångström by the format\'s convention, so `structure from` takes no unit.');
    } else if (rest.length > 0) {
      sink.report('extra-value', joinSpans(rest[0]!.span, rest[rest.length - 1]!.span), '`structure from` takes one file name, and `with fragments` after a spec\'s name.');
    }
    if (statement.block) {
      sink.report('unexpected-block', statement.block.open, 'Give the atoms either inline or from a file, not both; the block is ignored.');
    }
  } else if (!statement.block) {
    sink.report('missing-block', statement.keyword.span, 'Give the atoms in a block, `structure { O 0 0 0 ... }`, or from a file, `structure from "file.xyz"`.');
  }
  const withUnit = (ast: GeometryAst): GeometryAst => (unit ? { ...ast, unit } : ast);
  if (include) return withFragments ? { statement, atoms: atomListOf([]), include, withFragments } : { statement, atoms: atomListOf([]), include };
  // A block after a malformed `… from` is reported above and not read.
  if (!statement.block || (first && !header)) return withUnit({ statement, atoms: atomListOf([]) });
  if (statement.block.atomTable) {
    // The fast reader's rows, and the lines it left to the general parser.
    const others: AtomAst[] = [];
    for (const line of statement.block.otherStatements ?? []) {
      const atom = readAtomLine(reader, line);
      if (atom) others.push(atom);
    }
    return withUnit({ statement, atoms: atomListOfMixed(statement.block.atomTable, others) });
  }
  const atoms: AtomAst[] = [];
  for (const line of statement.block.statements) {
    const atom = readAtomLine(reader, line);
    if (atom) atoms.push(atom);
  }
  return withUnit({ statement, atoms: atomListOf(atoms) });
}

/** One atom line: element symbol, optional label, three coordinates. */
export function readAtomLine(reader: StatementReader, statement: Statement): AtomAst | undefined {
  const sink = reader.sink;
  reader.noBlock(statement);
  const head = statement.keyword;
  if (head.kind !== 'word') {
    sink.report('invalid-atom', head.span, `Each atom line starts with an element symbol, then an optional label and x y z; found ${describeArgument(head)}.`);
    return undefined;
  }
  const element = elementBySymbol(head.text);
  if (!element) {
    const keyword = KEYWORDS.find((k) => k.name === head.text);
    const hint = keyword ? ` '${head.text}' is a keyword: is a '}' missing before it?` : didYouMean(head.text, COMMON_ELEMENTS);
    sink.report('unknown-element', head.span, `'${head.text}' is not an element symbol.${hint}`);
    return undefined;
  }
  let args = statement.args;
  let label: Located<string> | undefined;
  if (args[0]?.kind === 'word') {
    label = { value: args[0].text, span: args[0].span };
    args = args.slice(1);
  }
  const coordinates: Located<number>[] = [];
  for (const arg of args) {
    const value = reader.number(arg, 'A coordinate');
    if (!value) return undefined;
    coordinates.push(value);
  }
  if (coordinates.length !== 3) {
    const where = args.length > 0 ? joinSpans(head.span, args[args.length - 1]!.span) : statement.span;
    sink.report('invalid-atom', where, `An atom needs three coordinates (x y z); this ${element.symbol} has ${coordinates.length}.`);
    return undefined;
  }
  const symbol = { value: element.symbol, span: head.span };
  return label ? { element: symbol, label, coordinates, span: statement.span } : { element: symbol, coordinates, span: statement.span };
}
