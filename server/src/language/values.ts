/** Readers for compound values such as memory sizes (`16 GiB`, `512MiB`). */
import { MEMORY_UNITS, RATE_UNITS } from '../chemistry/units';
import type { Argument } from './syntax';
import { joinSpans, type Span } from './text';

export type MemoryReading = { ok: true; bytes: number; span: Span } | { ok: false; message: string; span?: Span };

const UNIT_LIST = Object.keys(MEMORY_UNITS).join(', ');

export function parseMemorySize(args: readonly Argument[]): MemoryReading {
  const first = args[0];
  if (!first) return { ok: false, message: `Give the memory with a unit: \`memory 16 GiB\` (units: ${UNIT_LIST}).` };
  let amountText: string;
  let unitText: string | undefined;
  let last: Argument = first;
  if (first.kind === 'number') {
    amountText = first.text;
    const unit = args[1];
    if (unit) {
      unitText = unit.text;
      last = unit;
    }
  } else {
    const match = /^([0-9]+(?:\.[0-9]*)?)([A-Za-z]+)$/.exec(first.text);
    if (!match) return { ok: false, message: `'${first.text}' is not a memory size; write \`memory 16 GiB\`.`, span: first.span };
    amountText = match[1]!;
    unitText = match[2]!;
  }
  const whole = joinSpans(first.span, last.span);
  if (args.length > (first.kind === 'number' ? 2 : 1)) {
    return { ok: false, message: 'A memory size is a number and a unit, nothing more.', span: joinSpans(first.span, args[args.length - 1]!.span) };
  }
  if (unitText === undefined) return { ok: false, message: `Add a unit to the memory size: ${amountText} GiB? (units: ${UNIT_LIST})`, span: whole };
  const factor = MEMORY_UNITS[unitText];
  if (factor === undefined) return { ok: false, message: `Unknown memory unit '${unitText}'; use one of ${UNIT_LIST}.`, span: last.span };
  const amount = Number(amountText);
  if (!Number.isFinite(amount) || amount <= 0) return { ok: false, message: 'The memory size must be a positive number.', span: first.span };
  if (!Number.isFinite(amount * factor)) return { ok: false, message: 'This memory size is too large to be a number.', span: first.span };
  if (amount * factor < 1) {
    // Shown as "0 B" it would mislead: say what was asked for.
    return { ok: false, message: `${amountText} ${unitText} is ${(amount * factor).toPrecision(3)} bytes, less than one byte: is the unit or the number mistyped?`, span: whole };
  }
  return { ok: true, bytes: amount * factor, span: whole };
}

export type RateReading = { ok: true; flopsPerSecond: number; span: Span } | { ok: false; message: string; span?: Span };

const RATE_LIST = 'flops, Gflops, Tflops, Pflops';

/** `rate 500 Gflops`: a number and a unit of floating-point operations per second. */
export function parseRate(args: readonly Argument[]): RateReading {
  const [amount, unit, ...extra] = args;
  if (!amount) return { ok: false, message: `Give the rate with a unit: \`rate 500 Gflops\` (units: ${RATE_LIST}).` };
  if (amount.kind !== 'number') return { ok: false, message: `'${amount.text}' is not a number; write \`rate 500 Gflops\`.`, span: amount.span };
  if (!unit) return { ok: false, message: `Add a unit to the rate: ${amount.text} Gflops? (units: ${RATE_LIST})`, span: amount.span };
  if (extra.length > 0) return { ok: false, message: 'A rate is a number and a unit, nothing more.', span: joinSpans(extra[0]!.span, extra[extra.length - 1]!.span) };
  const factor = RATE_UNITS[unit.text.toLowerCase()];
  if (factor === undefined) return { ok: false, message: `Unknown rate unit '${unit.text}'; use one of ${RATE_LIST} (floating-point operations per second).`, span: unit.span };
  const value = Number(amount.text) * factor;
  if (!(value > 0) || !Number.isFinite(value)) return { ok: false, message: 'The rate must be a positive number.', span: amount.span };
  return { ok: true, flopsPerSecond: value, span: joinSpans(amount.span, unit.span) };
}
