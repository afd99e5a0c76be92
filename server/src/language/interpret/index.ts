/**
 * Reads the concrete tree statement by statement against the vocabulary, producing the typed tree
 * and a diagnostic for every statement that does not say what the language allows. A bad statement
 * is skipped; everything else is still read. One module per block: `basis.ts` (main and override
 * lines), `geometry.ts` (the `structure` statement: atom lines and includes), `fragment.ts` with
 * `selectors.ts`, `tier.ts` (with the active space), `scan.ts`, `limits.ts`; `reader.ts` holds
 * what they share.
 *
 * Retired spellings (`geometry`, `units`, the braced basis block, `within … of`) are still read
 * with their old meaning, so that the rest of an old spec keeps being analysed; `migrate.ts`
 * reports each of them and says how to rewrite it.
 */
import type { SpecAst } from '../ast';
import type { DiagnosticSink } from '../diagnostics';
import type { Statement, SyntaxTree } from '../syntax';
import { choices, EMBEDDINGS, FUNCTION_TERMS, UNIT_TERMS, type KeywordInfo } from '../vocabulary';
import { readBasis, readRetiredBasisBlock } from './basis';
import { readCaps } from './caps';
import { readFragment } from './fragment';
import { readGeometry } from './geometry';
import { readLimits } from './limits';
import { StatementReader } from './reader';
import { readScan } from './scan';

export function interpret(tree: SyntaxTree, sink: DiagnosticSink): SpecAst {
  const reader = new StatementReader(sink);
  const ast: SpecAst = { fragments: [], basisOverrides: [], variants: [], statements: tree.statements };
  for (const statement of tree.statements) {
    if (readRetiredStatement(reader, ast, statement)) continue;
    const keyword = reader.keyword(statement, 'top');
    if (keyword) readTopStatement(reader, ast, statement, keyword);
  }
  return ast;
}

/** `units …`, `geometry …` and `basis <name> { … }`, read with their old meaning (reported by migrate.ts). */
function readRetiredStatement(reader: StatementReader, ast: SpecAst, statement: Statement): boolean {
  const head = statement.keyword;
  if (head.kind !== 'word') return false;
  if (head.text === 'units') {
    reader.noBlock(statement);
    if (!reader.once('top', statement)) return true;
    const args = reader.args(statement, 1, `structure in ${choices(UNIT_TERMS)} { … }`);
    const unit = args ? reader.term<'angstrom' | 'bohr'>(args[0]!, UNIT_TERMS, 'length unit') : undefined;
    if (unit) ast.legacyUnits = unit;
    return true;
  }
  if (head.text === 'geometry') {
    if (reader.onceAs('structure', statement)) ast.geometry = readGeometry(reader, statement);
    return true;
  }
  if (head.text === 'basis' && statement.block) {
    readRetiredBasisBlock(reader, ast, statement);
    return true;
  }
  return false;
}

function readTopStatement(reader: StatementReader, ast: SpecAst, statement: Statement, keyword: KeywordInfo): void {
  if (keyword.opens === undefined) reader.noBlock(statement);
  // Fragments repeat, and so do basis lines (one main line, any number of overrides); every
  // other top-level statement is given once.
  if (keyword.name === 'fragment') {
    ast.fragments.push(readFragment(reader, statement));
    return;
  }
  if (keyword.name === 'basis') {
    readBasis(reader, ast, statement);
    return;
  }
  if (keyword.name === 'variant') {
    readVariant(reader, ast, statement);
    return;
  }
  if (keyword.name === 'structure') {
    if (reader.onceAs('structure', statement)) ast.geometry = readGeometry(reader, statement);
    return;
  }
  if (!reader.once('top', statement)) return;
  switch (keyword.name) {
    case 'spec': {
      const args = reader.args(statement, 1, 'spec "name"');
      if (args) ast.name = { value: args[0]!.text, span: args[0]!.span };
      return;
    }
    case 'charge':
      ast.charge = reader.charge(statement);
      return;
    case 'multiplicity':
      ast.multiplicity = reader.multiplicity(statement);
      return;
    case 'frozen-core':
      ast.frozenCore = reader.switchValue(statement);
      return;
    case 'functions': {
      const value = reader.args(statement, 1, `functions ${choices(FUNCTION_TERMS)}`);
      if (value) {
        const functions = reader.term<'spherical' | 'cartesian'>(value[0]!, FUNCTION_TERMS, 'function type');
        if (functions) ast.functions = functions;
      }
      return;
    }
    case 'embedding': {
      const args = reader.args(statement, 1, `embedding ${choices(EMBEDDINGS)}`);
      if (args) ast.embedding = reader.term(args[0]!, EMBEDDINGS, 'embedding');
      return;
    }
    case 'caps': {
      const caps = readCaps(reader, statement);
      if (caps) ast.caps = caps;
      return;
    }
    case 'scan':
      ast.scan = readScan(reader, statement);
      return;
    case 'limits':
      ast.limits = readLimits(reader, statement);
      return;
  }
}

/** `variant <name> { … }`: the name, unique among variants; the block is read as its own spec later. */
function readVariant(reader: StatementReader, ast: SpecAst, statement: Statement): void {
  const args = reader.args(statement, 1, 'variant <name> { … }');
  const name = args ? { value: args[0]!.text, span: args[0]!.span } : undefined;
  if (!statement.block) reader.sink.report('missing-value', statement.span, `'variant' needs a block of the statements that differ: \`variant ${name?.value ?? '<name>'} { fragment <name> { tier quantum { active 4e 4o } } }\`.`);
  if (name && ast.variants.some((variant) => variant.name?.value === name.value)) {
    reader.sink.report('duplicate-variant', name.span, `A variant named '${name.value}' is already declared; give each variant its own name.`);
  }
  ast.variants.push({ statement, ...(name ? { name } : {}) });
}
