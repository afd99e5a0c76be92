/**
 * Reads the concrete tree statement by statement against the vocabulary, producing the typed tree
 * and a diagnostic for every statement that does not say what the language allows. A bad statement
 * is skipped; everything else is still read. One module per block: `basis.ts`, `geometry.ts`
 * (atom lines and includes), `fragment.ts` with `selectors.ts`, `tier.ts` (with the active space),
 * `scan.ts`, `limits.ts`; `reader.ts` holds what they share.
 */
import type { SpecAst } from '../ast';
import type { DiagnosticSink } from '../diagnostics';
import type { Statement, SyntaxTree } from '../syntax';
import { EMBEDDINGS, UNIT_TERMS, type KeywordInfo } from '../vocabulary';
import { readBasis } from './basis';
import { readFragment } from './fragment';
import { readGeometry } from './geometry';
import { readLimits } from './limits';
import { StatementReader } from './reader';
import { readScan } from './scan';

export function interpret(tree: SyntaxTree, sink: DiagnosticSink): SpecAst {
  const reader = new StatementReader(sink);
  const ast: SpecAst = { fragments: [], statements: tree.statements };
  for (const statement of tree.statements) {
    const keyword = reader.keyword(statement, 'top');
    if (keyword) readTopStatement(reader, ast, statement, keyword);
  }
  return ast;
}

function readTopStatement(reader: StatementReader, ast: SpecAst, statement: Statement, keyword: KeywordInfo): void {
  if (keyword.opens === undefined && keyword.name !== 'geometry') reader.noBlock(statement);
  // Fragments repeat; every other top-level statement is given once.
  if (keyword.name === 'fragment') {
    ast.fragments.push(readFragment(reader, statement));
    return;
  }
  if (!reader.once('top', statement)) return;
  switch (keyword.name) {
    case 'spec': {
      const args = reader.args(statement, 1, 'spec "name"');
      if (args) ast.name = { value: args[0]!.text, span: args[0]!.span };
      return;
    }
    case 'units': {
      const args = reader.args(statement, 1, 'units angstrom|bohr');
      if (args) {
        const unit = reader.term<'angstrom' | 'bohr'>(args[0]!, UNIT_TERMS, 'length unit');
        if (unit) ast.units = unit;
      }
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
    case 'basis':
      ast.basis = readBasis(reader, statement);
      return;
    case 'geometry':
      ast.geometry = readGeometry(reader, statement);
      return;
    case 'embedding': {
      const args = reader.args(statement, 1, 'embedding dmet|projection|subtractive|none');
      if (args) ast.embedding = reader.term(args[0]!, EMBEDDINGS, 'embedding');
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
