/**
 * Text for large counts and byte sizes, as shown in hover cards and reports.
 *
 * - Counts below one million are printed whole ("441"); larger ones with three significant digits
 *   in powers of ten ("1.23 × 10^45").
 * - Bytes use the binary prefixes of IEC 80000-13 (KiB = 2^10 B … EiB = 2^60 B) with three
 *   significant digits ("16.0 GiB"); from 1024 EiB on they are written in powers of ten
 *   ("1.18 × 10^21 B").
 * - A value known only as an estimate is prefixed with "≈ ".
 */
import { type Magnitude } from './magnitude';

const WHOLE_LIMIT = 1_000_000n;
const BINARY_UNITS = ['B', 'KiB', 'MiB', 'GiB', 'TiB', 'PiB', 'EiB'] as const;
/** log2 of 1024 EiB: from here on bytes are written in powers of ten. */
const BINARY_LIMIT_LOG2 = 70;

export function formatCount(value: Magnitude): string {
  if (value.exact !== undefined) {
    if (value.exact < WHOLE_LIMIT) return value.exact.toString();
    return scientificFromDigits(value.exact.toString());
  }
  return `≈ ${scientificFromLog(value.log10)}`;
}

export function formatBytes(value: Magnitude): string {
  const prefix = value.exact === undefined ? '≈ ' : '';
  if (value.exact !== undefined && value.exact < 1024n) return `${value.exact} B`;
  const log2 = value.log10 / Math.log10(2);
  if (log2 >= BINARY_LIMIT_LOG2) {
    const text = value.exact !== undefined ? scientificFromDigits(value.exact.toString()) : scientificFromLog(value.log10);
    return `${prefix}${text} B`;
  }
  let unit = Math.min(BINARY_UNITS.length - 1, Math.floor(log2 / 10));
  let scaled = value.exact !== undefined ? Number(value.exact) / 2 ** (10 * unit) : 2 ** (log2 - 10 * unit);
  let text = threeDigits(scaled);
  if (text === '1024' && unit < BINARY_UNITS.length - 1) {
    unit += 1;
    scaled /= 1024;
    text = threeDigits(scaled);
  }
  return `${prefix}${text} ${BINARY_UNITS[unit]}`;
}

/** Three significant digits without exponent notation; values from 999.5 up print as whole numbers. */
function threeDigits(value: number): string {
  if (value >= 999.5) return Math.round(value).toString();
  return value.toPrecision(3);
}

/** "d.dd × 10^e" from the decimal digits of an exact value, rounding the fourth digit. */
function scientificFromDigits(digits: string): string {
  let exponent = digits.length - 1;
  let leading = Number(digits.slice(0, 3).padEnd(3, '0'));
  if (Number(digits[3] ?? '0') >= 5) leading += 1;
  if (leading >= 1000) {
    leading = 100;
    exponent += 1;
  }
  const text = leading.toString();
  return `${text[0]}.${text.slice(1)} × 10^${exponent}`;
}

function scientificFromLog(log10: number): string {
  let exponent = Math.floor(log10);
  let leading = Math.round(10 ** (log10 - exponent + 2));
  if (leading >= 1000) {
    leading = 100;
    exponent += 1;
  }
  const text = leading.toString();
  return `${text[0]}.${text.slice(1)} × 10^${exponent}`;
}

/** `1.0e11` → `100 Gflops`. */
export function formatRate(flopsPerSecond: number): string {
  const units: [number, string][] = [
    [1e15, 'Pflops'],
    [1e12, 'Tflops'],
    [1e9, 'Gflops'],
    [1e6, 'Mflops'],
  ];
  for (const [factor, unit] of units) if (flopsPerSecond >= factor) return `${Number((flopsPerSecond / factor).toPrecision(3))} ${unit}`;
  return `${Number(flopsPerSecond.toPrecision(3))} flops`;
}
