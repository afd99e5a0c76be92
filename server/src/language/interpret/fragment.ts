/** `fragment <name> { atoms ...; charge; multiplicity; tier <level> { ... } }` */
import type { FragmentAst, Located } from '../ast';
import type { Statement } from '../syntax';
import { joinSpans } from '../text';
import { describeArgument, type StatementReader } from './reader';
import { readCaps } from './caps';
import { readSelectors } from './selectors';
import { readTier } from './tier';

export function readFragment(reader: StatementReader, statement: Statement): FragmentAst {
  const sink = reader.sink;
  const nameArg = statement.args[0];
  let name: Located<string> | undefined;
  if (!nameArg) {
    sink.report('missing-value', statement.keyword.span, 'Name the fragment: `fragment site { ... }`.');
  } else if (nameArg.kind !== 'word') {
    sink.report('invalid-value', nameArg.span, `A fragment name is a word, not ${describeArgument(nameArg)}.`);
  } else {
    name = { value: nameArg.text, span: nameArg.span };
  }
  if (statement.args.length > 1) {
    sink.report('extra-value', joinSpans(statement.args[1]!.span, statement.args[statement.args.length - 1]!.span), 'A fragment has a one-word name; put its settings inside the braces.');
  }
  const fragment: FragmentAst = name ? { statement, name } : { statement };
  if (!statement.block) {
    sink.report('missing-block', name?.span ?? statement.keyword.span, `${name ? `Fragment '${name.value}'` : 'A fragment'} needs a block with its atoms: \`fragment ${name?.value ?? 'name'} { atoms ... }\`.`);
    return fragment;
  }
  const scope = `fragment@${statement.span.start}`;
  for (const inner of statement.block.statements) {
    const keyword = reader.keyword(inner, 'fragment');
    if (!keyword) continue;
    if (keyword.name !== 'tier') reader.noBlock(inner);
    if (!reader.once(scope, inner)) continue;
    switch (keyword.name) {
      case 'atoms':
        fragment.atoms = { selectors: readSelectors(reader, inner), span: inner.span, keywordSpan: inner.keyword.span };
        break;
      case 'charge':
        fragment.charge = reader.charge(inner);
        break;
      case 'multiplicity':
        fragment.multiplicity = reader.multiplicity(inner);
        break;
      case 'caps': {
        const caps = readCaps(reader, inner);
        if (caps) fragment.caps = caps;
        break;
      }
      case 'tier':
        fragment.tier = readTier(reader, inner);
        break;
    }
  }
  return fragment;
}
