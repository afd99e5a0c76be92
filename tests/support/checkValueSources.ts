/**
 * A lint for test files: every numeric check value names its source nearby.
 *
 * A check value is the expected argument of an equality matcher (`toBe`, `toEqual`,
 * `toStrictEqual`, `toMatchObject`, `toHaveLength`, `toContain`, and the first argument of
 * `toBeCloseTo`) that contains a number. Its source is "nearby" when one of these names it:
 *   - a comment on the matcher's lines or between the enclosing test's first line and the matcher,
 *   - the enclosing test's title (`it(…)` / `test(…)`),
 *   - the enclosing `describe(…)` title, or a comment directly above that `describe`.
 * Naming a source means the text holds one of SOURCE_MARKERS: a year (a publication,
 * "Szabo & Ostlund 1989"), "et al.", "common practice", "from memory", a fixture or its generator
 * ("tests/fixtures/…", "scripts/data/…", "fixture", "psi4"), or "by construction" / "by
 * definition" for a value that follows from how the test builds its input or from the rule under
 * test stated in the same title or comment. Tables of cases are not matchers: give them a source
 * comment by hand. The rule is written down in DEVELOPERS.md.
 */

export const SOURCE_MARKERS: readonly RegExp[] = [
  /\b(1[89]|20)\d\d\b/,
  /\bet al\./i,
  /common practice/i,
  /from memory/i,
  /\bfixtures?\b/i,
  /scripts\/data\//,
  /\bpsi4\b/i,
  /by construction/i,
  /by definition/i,
];

const MATCHERS = /\.(toBe|toEqual|toStrictEqual|toMatchObject|toHaveLength|toContain|toBeCloseTo)\(/g;
/** A number standing on its own (not part of a name such as `c60` or `x2`). */
const NUMBER = /(?<![\w$.])-?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?(?![\w$])/;

export interface UnsourcedValue {
  /** 1-based line of the matcher. */
  readonly line: number;
  readonly text: string;
}

/** The index just past the bracket that closes the one before `start`, skipping strings and comments. */
function closingParen(text: string, start: number): number {
  let depth = 1;
  for (let i = start; i < text.length; i++) {
    const c = text[i]!;
    if (c === '"' || c === "'" || c === '`') {
      for (i++; i < text.length && text[i] !== c; i++) if (text[i] === '\\') i++;
    } else if (c === '/' && text[i + 1] === '/') {
      while (i < text.length && text[i] !== '\n') i++;
    } else if (c === '/' && text[i + 1] === '*') {
      i = text.indexOf('*/', i + 2);
      if (i < 0) return text.length;
      i++;
    } else if (c === '(' || c === '[' || c === '{') depth++;
    else if (c === ')' || c === ']' || c === '}') {
      depth--;
      if (depth === 0) return i;
    }
  }
  return text.length;
}

/** The first top-level argument of an argument list. */
function firstArgument(args: string): string {
  let depth = 0;
  for (let i = 0; i < args.length; i++) {
    const c = args[i]!;
    if (c === '"' || c === "'" || c === '`') {
      for (i++; i < args.length && args[i] !== c; i++) if (args[i] === '\\') i++;
    } else if (c === '(' || c === '[' || c === '{') depth++;
    else if (c === ')' || c === ']' || c === '}') depth--;
    else if (c === ',' && depth === 0) return args.slice(0, i);
  }
  return args;
}

function comments(text: string): string {
  return [...text.matchAll(/\/\/[^\n]*|\/\*[\s\S]*?\*\//g)].map((m) => m[0]).join('\n');
}

function named(text: string): boolean {
  return SOURCE_MARKERS.some((marker) => marker.test(text));
}

/** The title and start of the innermost call of `kind` (`it`/`test` or `describe`) opened before `at` and not yet closed. */
function enclosing(text: string, at: number, kind: 'test' | 'describe'): { start: number; title: string } | undefined {
  const pattern = kind === 'test' ? /\b(it|test)(\.each\([\s\S]*?\))?\(\s*(['"`])/g : /\bdescribe(\.each\([\s\S]*?\))?\(\s*(['"`])/g;
  let found: { start: number; title: string } | undefined;
  for (const match of text.matchAll(pattern)) {
    const start = match.index!;
    if (start >= at) break;
    const open = start + match[0].length - 1;
    const end = closingParen(text, text.lastIndexOf('(', open) + 1);
    if (end < at) continue;
    const quote = text[open]!;
    let close = open + 1;
    while (close < text.length && text[close] !== quote) close += text[close] === '\\' ? 2 : 1;
    found = { start, title: text.slice(open + 1, close) };
  }
  return found;
}

/** The comment lines directly above `start` (no blank or code line between). */
function commentAbove(text: string, start: number): string {
  const lines = text.slice(0, start).split('\n');
  lines.pop();
  const above: string[] = [];
  for (let i = lines.length - 1; i >= 0; i--) {
    const line = lines[i]!.trim();
    if (line.startsWith('//') || line.startsWith('*') || line.startsWith('/*') || line.endsWith('*/')) above.unshift(line);
    else break;
  }
  return above.join('\n');
}

/** Check values in `text` (a test file) whose source is not named nearby. */
export function unsourcedCheckValues(text: string): UnsourcedValue[] {
  const out: UnsourcedValue[] = [];
  for (const match of text.matchAll(MATCHERS)) {
    const argsStart = match.index! + match[0].length;
    const argsEnd = closingParen(text, argsStart);
    const args = text.slice(argsStart, argsEnd);
    const value = match[1] === 'toBeCloseTo' ? firstArgument(args) : args;
    if (!NUMBER.test(value.replace(/\/\/[^\n]*|\/\*[\s\S]*?\*\//g, ''))) continue;
    const test = enclosing(text, match.index!, 'test');
    const describe = enclosing(text, match.index!, 'describe');
    const lineStart = text.lastIndexOf('\n', match.index!) + 1;
    const lineEnd = text.indexOf('\n', argsEnd) < 0 ? text.length : text.indexOf('\n', argsEnd);
    const near = [
      comments(text.slice(test?.start ?? lineStart, lineEnd)),
      test?.title ?? '',
      describe?.title ?? '',
      describe ? commentAbove(text, describe.start) : '',
      test ? commentAbove(text, test.start) : '',
    ].join('\n');
    if (!named(near)) {
      const line = text.slice(0, match.index!).split('\n').length;
      out.push({ line, text: text.slice(lineStart, lineEnd).trim().slice(0, 160) });
    }
  }
  return out;
}
