/**
 * Tokens of the Tessera spec language.
 *
 * The lexer knows shapes only (words, numbers, counts such as `6e`, `#index`, strings, braces);
 * which word is a keyword depends on where it stands, and that is decided by the vocabulary, so an
 * unknown keyword can be reported with a suggestion instead of derailing the parse.
 */
import { createToken, Lexer, type ILexingError, type IToken, type TokenType } from 'chevrotain';

export const WhiteSpace = createToken({ name: 'WhiteSpace', pattern: /[ \t\r\f\v\u00a0\ufeff]+/, group: Lexer.SKIPPED });
export const Newline = createToken({ name: 'Newline', pattern: /\n/, line_breaks: true });
/** A comment starts with `#` not followed by a digit (`#12` is an atom index) and runs to the line end. */
export const Comment = createToken({ name: 'Comment', pattern: /#(?![0-9])[^\n]*/, group: 'comments' });
export const IndexRef = createToken({ name: 'IndexRef', pattern: /#[0-9]+/ });
export const StringLiteral = createToken({ name: 'StringLiteral', pattern: /"(?:[^"\\\n]|\\.)*"/ });
/** Stops before a line break, `\r\n` included, so that its span ends on its own line. */
export const UnterminatedString = createToken({ name: 'UnterminatedString', pattern: /"(?:[^"\\\r\n]|\\.)*/ });
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
  pattern: /(?:[A-Za-z_]|[0-9]+(?=[A-Za-z_\-]))(?:[A-Za-z0-9_\-+*']|\([A-Za-z0-9_,+*' ]*\))*/,
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
