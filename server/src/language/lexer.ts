/**
 * Tokens of the Tessera spec language.
 *
 * The lexer knows shapes only (words, numbers, counts such as `6e`, `#index`, strings, braces);
 * which word is a keyword depends on where it stands, and that is decided by the vocabulary, so an
 * unknown keyword can be reported with a suggestion instead of derailing the parse.
 *
 * Tokens of any length lex in linear time and constant stack: the shapes whose regular expression
 * would repeat an alternation per character (strings, words) are read by small scanners instead,
 * because a backtracking engine keeps one stack entry per repetition of such a group and a token of
 * a few megabytes overflows it. Every other pattern repeats only a character class.
 */
import { createToken, Lexer, type CustomPatternMatcherReturn, type ILexingError, type IToken, type TokenType } from 'chevrotain';

/** A scanner's match: the matched text, as chevrotain expects from a custom pattern. */
function matched(text: string, start: number, end: number): CustomPatternMatcherReturn {
  return [text.slice(start, end)] as CustomPatternMatcherReturn;
}

function isLineTerminator(code: number): boolean {
  return code === 10 || code === 13 || code === 0x2028 || code === 0x2029;
}

/**
 * `"` then characters other than `"`, `\` and line breaks, or `\` and any character but a line
 * break; `closed` wants the closing `"` (StringLiteral), otherwise the text stops before the line
 * break or the backslash that ends it (UnterminatedString). Same language as the regular
 * expressions `"(?:[^"\\\n]|\\.)*"` and `"(?:[^"\\\r\n]|\\.)*` that these tokens had before.
 */
function scanString(text: string, offset: number, closed: boolean): CustomPatternMatcherReturn | null {
  if (text.charCodeAt(offset) !== 34 /* " */) return null;
  let i = offset + 1;
  for (;;) {
    if (i >= text.length) return closed ? null : matched(text, offset, i);
    const code = text.charCodeAt(i);
    if (code === 34) return closed ? matched(text, offset, i + 1) : matched(text, offset, i);
    if (code === 92 /* \ */) {
      if (i + 1 < text.length && !isLineTerminator(text.charCodeAt(i + 1))) {
        i += 2;
        continue;
      }
      return closed ? null : matched(text, offset, i);
    }
    if (code === 10 || (!closed && code === 13)) return closed ? null : matched(text, offset, i);
    i++;
  }
}

const isLetter = (c: number) => (c >= 65 && c <= 90) || (c >= 97 && c <= 122) || c === 95; /* A-Z a-z _ */
const isDigit = (c: number) => c >= 48 && c <= 57;
const isAsciiLetter = (c: number) => (c >= 65 && c <= 90) || (c >= 97 && c <= 122);
/** Characters a word continues with: letters, digits and `_-+*'`. */
const isWordPart = (c: number) => isLetter(c) || isDigit(c) || c === 45 || c === 43 || c === 42 || c === 39;
/** Characters allowed between a word's parentheses: letters, digits, `_,+*'` and space. */
const isParenPart = (c: number) => isLetter(c) || isDigit(c) || c === 44 || c === 43 || c === 42 || c === 39 || c === 32;

/**
 * A word starts with a letter or `_`, or with digits directly followed by a letter, `_` or `-`
 * (6-31G), and goes on with letters, digits, `_-+*'`, a `/` followed by a letter (the energy units
 * kcal/mol and kJ/mol) and parenthesised groups of those, commas and spaces (6-31G(d,p), ccsd(t)).
 * Same language as the regular expression
 * `(?:[A-Za-z_]|[0-9]+(?=[A-Za-z_\-]))(?:[A-Za-z0-9_\-+*']|\/(?=[A-Za-z])|\([A-Za-z0-9_,+*' ]*\))*`.
 */
function scanWord(text: string, offset: number): CustomPatternMatcherReturn | null {
  let i = offset;
  const first = text.charCodeAt(i);
  if (isLetter(first)) i++;
  else if (isDigit(first)) {
    while (isDigit(text.charCodeAt(i))) i++;
    const next = text.charCodeAt(i);
    if (!(isLetter(next) || next === 45)) return null;
  } else return null;
  for (;;) {
    const code = text.charCodeAt(i);
    if (isWordPart(code)) {
      i++;
      continue;
    }
    if (code === 47 /* / */ && isAsciiLetter(text.charCodeAt(i + 1))) {
      i += 2;
      continue;
    }
    if (code === 40 /* ( */) {
      let j = i + 1;
      while (isParenPart(text.charCodeAt(j))) j++;
      if (text.charCodeAt(j) === 41 /* ) */) {
        i = j + 1;
        continue;
      }
    }
    return matched(text, offset, i);
  }
}

export const WhiteSpace = createToken({ name: 'WhiteSpace', pattern: /[ \t\r\f\v\u00a0\ufeff]+/, group: Lexer.SKIPPED });
export const Newline = createToken({ name: 'Newline', pattern: /\n/, line_breaks: true });
/** A comment starts with `#` not followed by a digit (`#12` is an atom index) and runs to the line end. */
export const Comment = createToken({ name: 'Comment', pattern: /#(?![0-9])[^\n]*/, group: 'comments' });
export const IndexRef = createToken({ name: 'IndexRef', pattern: /#[0-9]+/ });
export const StringLiteral = createToken({
  name: 'StringLiteral',
  pattern: { exec: (text: string, offset: number) => scanString(text, offset, true) },
  start_chars_hint: ['"'],
  line_breaks: false,
});
/** Stops before a line break, `\r\n` included, so that its span ends on its own line. */
export const UnterminatedString = createToken({
  name: 'UnterminatedString',
  pattern: { exec: (text: string, offset: number) => scanString(text, offset, false) },
  start_chars_hint: ['"'],
  line_breaks: false,
});
export const LBrace = createToken({ name: 'LBrace', pattern: /\{/ });
export const RBrace = createToken({ name: 'RBrace', pattern: /\}/ });
export const Semicolon = createToken({ name: 'Semicolon', pattern: /;/ });
export const Equals = createToken({ name: 'Equals', pattern: /=/ });
export const RangeDots = createToken({ name: 'RangeDots', pattern: /\.\./ });
/** `6e` and `6o`: electron and orbital counts of an active space. */
export const ElectronCount = createToken({ name: 'ElectronCount', pattern: /[0-9]+e(?![A-Za-z0-9_\-+*'(.])/ });
export const OrbitalCount = createToken({ name: 'OrbitalCount', pattern: /[0-9]+o(?![A-Za-z0-9_\-+*'(.])/ });
export const NumberLiteral = createToken({
  name: 'NumberLiteral',
  pattern: /[+-]?(?:[0-9]+(?:\.(?!\.)[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?(?![A-Za-z_\-+*'(0-9.])/,
});
/**
 * Keywords, names, labels, element symbols and basis names. Basis names may start with digits
 * and carry `-+*()'` (6-31+G*, 6-31G(d,p), def2-SVP), method names parentheses (ccsd(t)).
 */
export const Word = createToken({
  name: 'Word',
  pattern: { exec: (text: string, offset: number) => scanWord(text, offset) },
  start_chars_hint: [...'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz_0123456789'],
  line_breaks: false,
});

export const allTokens: TokenType[] = [
  WhiteSpace,
  Newline,
  Comment,
  IndexRef,
  StringLiteral,
  UnterminatedString,
  LBrace,
  RBrace,
  Semicolon,
  Equals,
  RangeDots,
  ElectronCount,
  OrbitalCount,
  NumberLiteral,
  Word,
];

export const specLexer = new Lexer(allTokens, {
  positionTracking: 'onlyOffset',
  ensureOptimizations: true,
});

export interface LexResult {
  tokens: IToken[];
  comments: IToken[];
  errors: ILexingError[];
}

export function tokenize(text: string): LexResult {
  const result = specLexer.tokenize(text);
  return {
    tokens: result.tokens,
    comments: (result.groups['comments'] as IToken[] | undefined) ?? [],
    errors: result.errors,
  };
}
