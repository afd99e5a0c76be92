/** `limits { qubits <n>; memory <size> <unit>; rate <n> <unit> }` */
import type { LimitsAst } from '../ast';
import type { Statement } from '../syntax';
import { parseMemorySize, parseRate } from '../values';
import type { StatementReader } from './reader';

export function readLimits(reader: StatementReader, statement: Statement): LimitsAst {
  const sink = reader.sink;
  const limits: LimitsAst = { statement };
  if (!statement.block) {
    sink.report('missing-block', statement.keyword.span, 'Give the limits in a block: `limits { qubits 24; memory 16 GiB }`.');
    return limits;
  }
  for (const inner of statement.block.statements) {
    const keyword = reader.keyword(inner, 'limits');
    if (!keyword) continue;
    reader.noBlock(inner);
    if (!reader.once('limits', inner)) continue;
    if (keyword.name === 'qubits') {
      const value = reader.args(inner, 1, 'qubits <n>');
      if (value) limits.qubits = reader.wholeNumber(value[0]!, 'The qubit limit', 1);
    } else if (keyword.name === 'memory') {
      const memory = parseMemorySize(inner.args);
      if (memory.ok) limits.memory = { value: memory.bytes, span: memory.span };
      else sink.report(inner.args.length === 0 ? 'missing-value' : 'invalid-value', memory.span ?? inner.keyword.span, memory.message);
    } else if (keyword.name === 'rate') {
      const rate = parseRate(inner.args);
      if (rate.ok) limits.rate = { value: rate.flopsPerSecond, span: rate.span };
      else sink.report(inner.args.length === 0 ? 'missing-value' : 'invalid-value', rate.span ?? inner.keyword.span, rate.message);
    }
  }
  return limits;
}
