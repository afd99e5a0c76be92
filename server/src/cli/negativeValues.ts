/**
 * `--charge -1`: node:util's parseArgs reads a value that starts with a dash as another option and
 * asks for `--charge=-1`. A chemist writes negative charges and shifts as plain values, so a
 * string option followed by a negative number is joined into `--name=-1` before parsing.
 */
const NEGATIVE_NUMBER = /^-(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export function joinNegativeValues(args: readonly string[], options: Readonly<Record<string, { readonly type: 'string' | 'boolean' }>>): string[] {
  const joined: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    const next = args[i + 1];
    const name = arg.startsWith('--') && !arg.includes('=') ? arg.slice(2) : undefined;
    if (name !== undefined && options[name]?.type === 'string' && next !== undefined && NEGATIVE_NUMBER.test(next)) {
      joined.push(`${arg}=${next}`);
      i++;
    } else joined.push(arg);
  }
  return joined;
}
