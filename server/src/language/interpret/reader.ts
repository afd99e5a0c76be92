/**
 * What every statement reader shares: resolving a statement's keyword in its block, reporting
 * duplicates, and reading arguments (counts, numbers, words from a vocabulary, switches, atom
 * references) with a diagnostic for every one that does not say what the language allows.
 */
import type { AtomRef, Located } from '../ast';
import type { DiagnosticSink } from '../diagnostics';
import { suggest } from '../suggest';
import type { Argument, Statement } from '../syntax';
import { joinSpans, type Span } from '../text';
import { KEYWORDS, keywordsFor, SWITCH_TERMS, type BlockKind, type KeywordInfo, type TermInfo } from '../vocabulary';

export const BLOCK_NAMES: Record<BlockKind, string> = {
  top: 'at the top level',
  structure: 'in a structure block',
  fragment: 'in a fragment block',
  tier: 'in a tier block',
  limits: 'in a limits block',
  variant: 'in a variant block',
};

export function describeArgument(arg: Argument): string {
  switch (arg.kind) {
    case 'number':
      return `the number '${arg.text}'`;
    case 'string':
      return `the string "${arg.text}"`;
    case 'index':
      return `the atom index '${arg.text}'`;
    case 'electrons':
    case 'orbitals':
      return `the count '${arg.text}'`;
    case 'range':
      return "'..'";
    case 'equals':
      return "'='";
    case 'word':
      return `'${arg.text}'`;
  }
}

export type TermCode = 'unknown-value' | 'unknown-method' | 'unknown-ansatz' | 'unknown-mapping';

export class StatementReader {
  private readonly firstSeen = new Map<string, Statement>();

  constructor(readonly sink: DiagnosticSink) {}

  /** Resolves the statement's keyword in a block, reporting unknown and misplaced ones. */
  keyword(statement: Statement, block: BlockKind): KeywordInfo | undefined {
    const head = statement.keyword;
    if (head.kind !== 'word') {
      this.sink.report('invalid-value', head.span, `A statement ${BLOCK_NAMES[block]} starts with a keyword, not ${describeArgument(head)}.`);
      return undefined;
    }
    const found = keywordsFor(block).find((keyword) => keyword.name === head.text);
    if (found) return found;
    const lower = head.text.toLowerCase();
    const caseMatch = keywordsFor(block).find((keyword) => keyword.name === lower);
    if (caseMatch) {
      this.sink.report('unknown-keyword', head.span, `Keywords are lower case: write '${caseMatch.name}', not '${head.text}'.`, {
        data: { replacement: caseMatch.name },
      });
      return undefined;
    }
    const elsewhere = KEYWORDS.find((keyword) => keyword.name === head.text);
    if (elsewhere) {
      const places = elsewhere.blocks.map((b) => BLOCK_NAMES[b]).join(' or ');
      this.sink.report('misplaced-keyword', head.span, `'${head.text}' does not belong ${BLOCK_NAMES[block]}; it is used ${places}.`);
      return undefined;
    }
    const names = keywordsFor(block).map((keyword) => keyword.name);
    const suggestion = suggest(head.text, names);
    this.sink.report(
      'unknown-keyword',
      head.span,
      `Unknown keyword '${head.text}' ${BLOCK_NAMES[block]}.${suggestion ? ` Did you mean '${suggestion}'?` : ` Expected one of: ${names.join(', ')}.`}`,
      suggestion ? { data: { replacement: suggestion } } : {},
    );
    return undefined;
  }

  /** True the first time a keyword appears in a scope; reports every repetition. */
  once(scope: string, statement: Statement): boolean {
    return this.onceAs(`${scope}:${statement.keyword.text}`, statement, statement.keyword.text);
  }

  /**
   * True the first time a setting (`key`) is given, however it is spelt (a retired `geometry` and a
   * `structure` are one setting); reports every repetition as `what`.
   */
  onceAs(key: string, statement: Statement, what = key): boolean {
    const first = this.firstSeen.get(key);
    if (first) {
      this.sink.report('duplicate-statement', statement.keyword.span, `'${what}' is already given on an earlier line; give it once.`, {
        related: [{ span: first.keyword.span, message: `first '${first.keyword.text}' here` }],
      });
      return false;
    }
    this.firstSeen.set(key, statement);
    return true;
  }

  noBlock(statement: Statement): void {
    if (statement.block) {
      this.sink.report('unexpected-block', statement.block.open, `'${statement.keyword.text}' takes no block; remove the braces and what is inside them.`);
    }
  }

  /** Exactly `count` arguments: reports missing and extra ones; returns undefined when missing. */
  args(statement: Statement, count: number, syntax: string): Argument[] | undefined {
    const args = statement.args;
    if (args.length < count) {
      const at = args.length > 0 ? joinSpans(statement.keyword.span, args[args.length - 1]!.span) : statement.keyword.span;
      this.sink.report('missing-value', at, `'${statement.keyword.text}' needs a value: write \`${syntax}\`.`);
      return undefined;
    }
    if (args.length > count) {
      const extra = joinSpans(args[count]!.span, args[args.length - 1]!.span);
      this.sink.report('extra-value', extra, `'${statement.keyword.text}' takes ${count === 1 ? 'one value' : `${count} values`}; remove the rest (\`${syntax}\`).`);
    }
    return args.slice(0, count);
  }

  number(arg: Argument, what: string): Located<number> | undefined {
    if (arg.kind !== 'number') {
      this.sink.report('invalid-value', arg.span, `${what} must be a number, not ${describeArgument(arg)}.`);
      return undefined;
    }
    const value = Number(arg.text);
    if (!Number.isFinite(value)) {
      this.sink.report('invalid-value', arg.span, `${what} '${arg.text}' is too large to be a number.`);
      return undefined;
    }
    return { value, span: arg.span };
  }

  wholeNumber(arg: Argument, what: string, minimum: number): Located<number> | undefined {
    const located = this.number(arg, what);
    if (!located) return undefined;
    if (!Number.isInteger(located.value) || located.value < minimum || located.value > Number.MAX_SAFE_INTEGER) {
      this.sink.report('invalid-value', arg.span, `${what} must be a whole number of at least ${minimum}; '${arg.text}' is not.`);
      return undefined;
    }
    return located;
  }

  /** One word of a vocabulary list, case-insensitive, with a "did you mean" for near misses. */
  term<T extends string>(arg: Argument, terms: readonly TermInfo[], what: string, code: TermCode = 'unknown-value'): Located<T> | undefined {
    if (arg.kind !== 'word') {
      this.sink.report('invalid-value', arg.span, `${what} must be one of ${terms.map((t) => t.name).join(', ')}; found ${describeArgument(arg)}.`);
      return undefined;
    }
    const text = arg.text.toLowerCase();
    if (terms.some((t) => t.name === text)) return { value: text as T, span: arg.span };
    const names = terms.map((t) => t.name);
    const suggestion = suggest(arg.text, names);
    this.sink.report(
      code,
      arg.span,
      `Unknown ${what} '${arg.text}'.${suggestion ? ` Did you mean '${suggestion}'?` : ''} Expected one of: ${names.join(', ')}.`,
      suggestion ? { data: { replacement: suggestion } } : {},
    );
    return undefined;
  }

  switchValue(statement: Statement): Located<boolean> | undefined {
    const args = this.args(statement, 1, `${statement.keyword.text} on|off`);
    if (!args) return undefined;
    const value = this.term<'on' | 'off'>(args[0]!, SWITCH_TERMS, `'${statement.keyword.text}' setting`);
    return value ? { value: value.value === 'on', span: value.span } : undefined;
  }

  atomRef(arg: Argument | undefined, context: Span): AtomRef | undefined {
    if (!arg) {
      this.sink.report('invalid-selector', context, 'An atom is named by its label or by #index (1-based).');
      return undefined;
    }
    if (arg.kind === 'index') return { kind: 'index', index: Number(arg.text.slice(1)), span: arg.span };
    if (arg.kind === 'word') return { kind: 'label', name: arg.text, span: arg.span };
    this.sink.report('invalid-selector', arg.span, `An atom is named by its label or by #index (1-based), not ${describeArgument(arg)}.`);
    return undefined;
  }

  /** Charges are read as numbers here; whether they are whole is a chemistry check. */
  charge(statement: Statement): Located<number> | undefined {
    const args = this.args(statement, 1, 'charge <integer>');
    if (!args) return undefined;
    const located = this.number(args[0]!, 'The charge');
    if (located && !Number.isInteger(located.value)) {
      this.sink.report('charge-not-integer', located.span, `A charge counts whole electrons; ${args[0]!.text} is not a whole number.`);
      return undefined;
    }
    return located;
  }

  multiplicity(statement: Statement): Located<number> | undefined {
    const args = this.args(statement, 1, 'multiplicity <2S+1>');
    if (!args) return undefined;
    const located = this.number(args[0]!, 'The multiplicity');
    if (located && (!Number.isInteger(located.value) || located.value < 1)) {
      this.sink.report(
        'multiplicity-invalid',
        located.span,
        `The multiplicity 2S+1 is a whole number of at least 1 (1 singlet, 2 doublet, 3 triplet, ...); ${args[0]!.text} is not.`,
      );
      return undefined;
    }
    return located;
  }
}
