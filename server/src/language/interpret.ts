/**
 * Reads the concrete tree statement by statement against the vocabulary, producing the typed tree
 * and a diagnostic for every statement that does not say what the language allows. A bad statement
 * is skipped; everything else is still read.
 */
import { elementBySymbol } from '../chemistry/elements';
import { parseMemorySize } from './values';
import {
  atomListOf,
  atomListOfTable,
  type ActiveIrrepAst,
  type ActiveSpaceAst,
  type AtomAst,
  type AtomRef,
  type BasisAst,
  type FragmentAst,
  type GeometryAst,
  type LimitsAst,
  type Located,
  type ScanAst,
  type SelectorAst,
  type SpecAst,
  type TierAst,
} from './ast';
import type { DiagnosticSink } from './diagnostics';
import { didYouMean, suggest } from './suggest';
import type { Argument, Statement, SyntaxTree } from './syntax';
import { joinSpans, type Span } from './text';
import {
  ANSATZE,
  EMBEDDINGS,
  FUNCTION_TERMS,
  KEYWORDS,
  keywordsFor,
  MAPPING_TERMS,
  METHODS,
  SCAN_KINDS,
  SWITCH_TERMS,
  TIER_LEVELS,
  UNIT_TERMS,
  type BlockKind,
  type KeywordInfo,
  type TermInfo,
  type TierLevel,
} from './vocabulary';

const BLOCK_NAMES: Record<BlockKind, string> = {
  top: 'at the top level',
  basis: 'in a basis block',
  geometry: 'in a geometry block',
  fragment: 'in a fragment block',
  tier: 'in a tier block',
  limits: 'in a limits block',
};

function describeArgument(arg: Argument): string {
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

class Interpreter {
  private readonly firstSeen = new Map<string, Statement>();

  constructor(private readonly sink: DiagnosticSink) {}

  run(tree: SyntaxTree): SpecAst {
    const ast: SpecAst = { fragments: [], statements: tree.statements };
    for (const statement of tree.statements) {
      const keyword = this.keyword(statement, 'top');
      if (!keyword) continue;
      this.top(ast, statement, keyword);
    }
    return ast;
  }

  /** Resolves the statement's keyword in a block, reporting unknown and misplaced ones. */
  private keyword(statement: Statement, block: BlockKind): KeywordInfo | undefined {
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

  private once(scope: string, statement: Statement): boolean {
    const key = `${scope}:${statement.keyword.text}`;
    const first = this.firstSeen.get(key);
    if (first) {
      this.sink.report('duplicate-statement', statement.keyword.span, `'${statement.keyword.text}' is already given on an earlier line; give it once.`, {
        related: [{ span: first.keyword.span, message: `first '${statement.keyword.text}' here` }],
      });
      return false;
    }
    this.firstSeen.set(key, statement);
    return true;
  }

  private noBlock(statement: Statement): void {
    if (statement.block) {
      this.sink.report('unexpected-block', statement.block.open, `'${statement.keyword.text}' takes no block; remove the braces and what is inside them.`);
    }
  }

  /** Exactly `count` arguments: reports missing and extra ones; returns undefined when missing. */
  private args(statement: Statement, count: number, syntax: string): Argument[] | undefined {
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

  private number(arg: Argument, what: string): Located<number> | undefined {
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

  private wholeNumber(arg: Argument, what: string, minimum: number): Located<number> | undefined {
    const located = this.number(arg, what);
    if (!located) return undefined;
    if (!Number.isInteger(located.value) || located.value < minimum || located.value > Number.MAX_SAFE_INTEGER) {
      this.sink.report('invalid-value', arg.span, `${what} must be a whole number of at least ${minimum}; '${arg.text}' is not.`);
      return undefined;
    }
    return located;
  }

  private term<T extends string>(
    arg: Argument,
    terms: readonly TermInfo[],
    what: string,
    code: 'unknown-value' | 'unknown-method' | 'unknown-ansatz' | 'unknown-mapping' = 'unknown-value',
  ): Located<T> | undefined {
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

  private switchValue(statement: Statement): Located<boolean> | undefined {
    const args = this.args(statement, 1, `${statement.keyword.text} on|off`);
    if (!args) return undefined;
    const value = this.term<'on' | 'off'>(args[0]!, SWITCH_TERMS, `'${statement.keyword.text}' setting`);
    return value ? { value: value.value === 'on', span: value.span } : undefined;
  }

  private top(ast: SpecAst, statement: Statement, keyword: KeywordInfo): void {
    if (keyword.opens === undefined && keyword.name !== 'geometry') this.noBlock(statement);
    switch (keyword.name) {
      case 'spec': {
        if (!this.once('top', statement)) return;
        const args = this.args(statement, 1, 'spec "name"');
        if (args) ast.name = { value: args[0]!.text, span: args[0]!.span };
        return;
      }
      case 'units': {
        if (!this.once('top', statement)) return;
        const args = this.args(statement, 1, 'units angstrom|bohr');
        if (args) {
          const unit = this.term<'angstrom' | 'bohr'>(args[0]!, UNIT_TERMS, 'length unit');
          if (unit) ast.units = unit;
        }
        return;
      }
      case 'charge': {
        if (!this.once('top', statement)) return;
        ast.charge = this.charge(statement);
        return;
      }
      case 'multiplicity': {
        if (!this.once('top', statement)) return;
        ast.multiplicity = this.multiplicity(statement);
        return;
      }
      case 'frozen-core': {
        if (!this.once('top', statement)) return;
        ast.frozenCore = this.switchValue(statement);
        return;
      }
      case 'basis':
        if (!this.once('top', statement)) return;
        ast.basis = this.basis(statement);
        return;
      case 'geometry':
        if (!this.once('top', statement)) return;
        ast.geometry = this.geometry(statement);
        return;
      case 'fragment':
        ast.fragments.push(this.fragment(statement));
        return;
      case 'embedding': {
        if (!this.once('top', statement)) return;
        const args = this.args(statement, 1, 'embedding dmet|projection|subtractive|none');
        if (args) ast.embedding = this.term(args[0]!, EMBEDDINGS, 'embedding');
        return;
      }
      case 'scan':
        if (!this.once('top', statement)) return;
        ast.scan = this.scan(statement);
        return;
      case 'limits':
        if (!this.once('top', statement)) return;
        ast.limits = this.limits(statement);
        return;
    }
  }

  /** Charges are read as numbers here; whether they are whole is a chemistry check. */
  private charge(statement: Statement): Located<number> | undefined {
    const args = this.args(statement, 1, 'charge <integer>');
    if (!args) return undefined;
    const located = this.number(args[0]!, 'The charge');
    if (located && !Number.isInteger(located.value)) {
      this.sink.report('charge-not-integer', located.span, `A charge counts whole electrons; ${args[0]!.text} is not a whole number.`);
      return undefined;
    }
    return located;
  }

  private multiplicity(statement: Statement): Located<number> | undefined {
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

  private basis(statement: Statement): BasisAst {
    const result: BasisAst = { statement, overrides: [] };
    const args = this.args(statement, 1, 'basis <name>');
    const name = args?.[0];
    const basis: BasisAst = name ? { ...result, name: { value: name.text, span: name.span } } : result;
    if (name && name.kind !== 'word') {
      this.sink.report('invalid-value', name.span, `A basis-set name is a word such as cc-pVDZ or def2-SVP, not ${describeArgument(name)}.`);
    }
    const seenElements = new Map<string, Span>();
    for (const inner of statement.block?.statements ?? []) {
      const head = inner.keyword;
      if (head.kind === 'word' && inner.args[0]?.kind === 'equals') {
        this.basisOverride(basis, inner, seenElements);
        continue;
      }
      const keyword = this.keyword(inner, 'basis');
      if (!keyword) continue;
      this.noBlock(inner);
      if (keyword.name === 'functions' && this.once('basis', inner)) {
        const value = this.args(inner, 1, 'functions spherical|cartesian');
        if (value) basis.functions = this.term(value[0]!, FUNCTION_TERMS, 'function type');
      }
    }
    return basis;
  }

  private basisOverride(basis: BasisAst, statement: Statement, seen: Map<string, Span>): void {
    this.noBlock(statement);
    const head = statement.keyword;
    const element = elementBySymbol(head.text);
    if (!element) {
      this.sink.report('unknown-element', head.span, `'${head.text}' is not an element symbol; a per-element basis is written \`Zn = def2-TZVP\`.`);
      return;
    }
    const value = statement.args[1];
    if (!value) {
      this.sink.report('missing-value', joinSpans(head.span, statement.args[0]!.span), `Name the basis for ${element.symbol} after '=': \`${element.symbol} = def2-TZVP\`.`);
      return;
    }
    if (statement.args.length > 2) {
      this.sink.report('extra-value', joinSpans(statement.args[2]!.span, statement.args[statement.args.length - 1]!.span), 'A per-element basis takes one name.');
    }
    const previous = seen.get(element.symbol);
    if (previous) {
      this.sink.report('duplicate-statement', head.span, `${element.symbol} already has a basis override.`, {
        related: [{ span: previous, message: 'first override here' }],
      });
      return;
    }
    seen.set(element.symbol, head.span);
    basis.overrides.push({ element: { value: element.symbol, span: head.span }, basis: { value: value.text, span: value.span }, span: statement.span });
  }

  private geometry(statement: Statement): GeometryAst {
    if (statement.args.length === 0 && statement.block?.atomTable) {
      return { statement, atoms: atomListOfTable(statement.block.atomTable) };
    }
    const atoms: AtomAst[] = [];
    let include: Located<string> | undefined;
    if (statement.args.length > 0) {
      const [from, path, ...rest] = statement.args;
      if (from!.kind !== 'word' || from!.text !== 'from') {
        this.sink.report('invalid-value', from!.span, `Write \`geometry { ... }\` with the atoms inside, or \`geometry from "file.xyz"\`; found ${describeArgument(from!)}.`);
      } else if (!path) {
        this.sink.report('missing-value', from!.span, 'Name the XYZ file to read: `geometry from "file.xyz"`.');
      } else if (path.kind !== 'string' && path.kind !== 'word') {
        this.sink.report('invalid-value', path.span, `The file to read is a path in quotes, not ${describeArgument(path)}.`);
      } else {
        include = { value: path.text, span: path.span };
      }
      if (rest.length > 0) this.sink.report('extra-value', joinSpans(rest[0]!.span, rest[rest.length - 1]!.span), '`geometry from` takes one file name.');
      if (statement.block) {
        this.sink.report('unexpected-block', statement.block.open, 'Give the atoms either inline or from a file, not both; the block is ignored.');
      }
    } else if (!statement.block) {
      this.sink.report('missing-block', statement.keyword.span, 'Give the atoms in a block, `geometry { O 0 0 0 ... }`, or from a file, `geometry from "file.xyz"`.');
    } else {
      for (const line of statement.block.statements) {
        const atom = this.atom(line);
        if (atom) atoms.push(atom);
      }
    }
    return include ? { statement, atoms: atomListOf(atoms), include } : { statement, atoms: atomListOf(atoms) };
  }

  private atom(statement: Statement): AtomAst | undefined {
    this.noBlock(statement);
    const head = statement.keyword;
    if (head.kind !== 'word') {
      this.sink.report('invalid-atom', head.span, `Each atom line starts with an element symbol, then an optional label and x y z; found ${describeArgument(head)}.`);
      return undefined;
    }
    const element = elementBySymbol(head.text);
    if (!element) {
      const keyword = KEYWORDS.find((k) => k.name === head.text);
      const hint = keyword
        ? ` '${head.text}' is a keyword: is a '}' missing before it?`
        : didYouMean(head.text, ['H', 'He', 'Li', 'Be', 'B', 'C', 'N', 'O', 'F', 'Ne', 'Na', 'Mg', 'Al', 'Si', 'P', 'S', 'Cl', 'Ar', 'K', 'Ca', 'Fe', 'Co', 'Ni', 'Cu', 'Zn', 'Br', 'I']);
      this.sink.report('unknown-element', head.span, `'${head.text}' is not an element symbol.${hint}`);
      return undefined;
    }
    let args = statement.args;
    let label: Located<string> | undefined;
    if (args[0]?.kind === 'word') {
      label = { value: args[0].text, span: args[0].span };
      args = args.slice(1);
    }
    const coordinates: Located<number>[] = [];
    for (const arg of args) {
      const value = this.number(arg, 'A coordinate');
      if (!value) return undefined;
      coordinates.push(value);
    }
    if (coordinates.length !== 3) {
      const where = args.length > 0 ? joinSpans(head.span, args[args.length - 1]!.span) : statement.span;
      this.sink.report('invalid-atom', where, `An atom needs three coordinates (x y z); this ${element.symbol} has ${coordinates.length}.`);
      return undefined;
    }
    const symbol = { value: element.symbol, span: head.span };
    return label ? { element: symbol, label, coordinates, span: statement.span } : { element: symbol, coordinates, span: statement.span };
  }

  private fragment(statement: Statement): FragmentAst {
    const nameArg = statement.args[0];
    let name: Located<string> | undefined;
    if (!nameArg) {
      this.sink.report('missing-value', statement.keyword.span, 'Name the fragment: `fragment site { ... }`.');
    } else if (nameArg.kind !== 'word') {
      this.sink.report('invalid-value', nameArg.span, `A fragment name is a word, not ${describeArgument(nameArg)}.`);
    } else {
      name = { value: nameArg.text, span: nameArg.span };
    }
    if (statement.args.length > 1) {
      this.sink.report('extra-value', joinSpans(statement.args[1]!.span, statement.args[statement.args.length - 1]!.span), 'A fragment has a one-word name; put its settings inside the braces.');
    }
    const fragment: FragmentAst = name ? { statement, name } : { statement };
    if (!statement.block) {
      this.sink.report('missing-block', name?.span ?? statement.keyword.span, `${name ? `Fragment '${name.value}'` : 'A fragment'} needs a block with its atoms: \`fragment ${name?.value ?? 'name'} { atoms ... }\`.`);
      return fragment;
    }
    const scope = `fragment@${statement.span.start}`;
    for (const inner of statement.block.statements) {
      const keyword = this.keyword(inner, 'fragment');
      if (!keyword) continue;
      if (keyword.name !== 'tier') this.noBlock(inner);
      if (!this.once(scope, inner)) continue;
      switch (keyword.name) {
        case 'atoms': {
          const selectors = this.selectors(inner);
          fragment.atoms = { selectors, span: inner.span, keywordSpan: inner.keyword.span };
          break;
        }
        case 'charge':
          fragment.charge = this.charge(inner);
          break;
        case 'multiplicity':
          fragment.multiplicity = this.multiplicity(inner);
          break;
        case 'tier':
          fragment.tier = this.tier(inner);
          break;
      }
    }
    return fragment;
  }

  private atomRef(arg: Argument | undefined, context: Span): AtomRef | undefined {
    if (!arg) {
      this.sink.report('invalid-selector', context, 'An atom is named by its label or by #index (1-based).');
      return undefined;
    }
    if (arg.kind === 'index') return { kind: 'index', index: Number(arg.text.slice(1)), span: arg.span };
    if (arg.kind === 'word') return { kind: 'label', name: arg.text, span: arg.span };
    this.sink.report('invalid-selector', arg.span, `An atom is named by its label or by #index (1-based), not ${describeArgument(arg)}.`);
    return undefined;
  }

  /** atoms zn n1..n4 #3 #3..#9 all H within 3.0 of zn rest */
  private selectors(statement: Statement): SelectorAst[] {
    const args = statement.args;
    const selectors: SelectorAst[] = [];
    if (args.length === 0) {
      this.sink.report('missing-value', statement.keyword.span, 'List the atoms: labels, #indices, ranges like n1..n4, `all H`, `within 3.0 of zn` or `rest`.');
    }
    for (let i = 0; i < args.length; i++) {
      const arg = args[i]!;
      if (arg.kind === 'word' && arg.text === 'rest') {
        selectors.push({ kind: 'rest', span: arg.span });
      } else if (arg.kind === 'word' && arg.text === 'all') {
        const next = args[i + 1];
        const element = next && next.kind === 'word' ? elementBySymbol(next.text) : undefined;
        if (!element) {
          this.sink.report('invalid-selector', next ? joinSpans(arg.span, next.span) : arg.span, '`all` is followed by an element symbol: `all H`.');
          if (next && next.kind === 'word') i++;
          continue;
        }
        i++;
        selectors.push({ kind: 'element', element: element.symbol, span: joinSpans(arg.span, next!.span) });
      } else if (arg.kind === 'word' && arg.text === 'within') {
        const distanceArg = args[i + 1];
        const ofArg = args[i + 2];
        const targetArg = args[i + 3];
        const distance = distanceArg?.kind === 'number' ? Number(distanceArg.text) : NaN;
        if (!Number.isFinite(distance) || distance < 0 || ofArg?.kind !== 'word' || ofArg.text !== 'of' || !targetArg) {
          const end = args[Math.min(i + 3, args.length - 1)]!.span;
          this.sink.report('invalid-selector', joinSpans(arg.span, end), 'Write `within <distance> of <atom>`, for example `within 3.0 of zn` (distance in the file\'s unit).');
          i += 3;
          continue;
        }
        const of = this.atomRef(targetArg, targetArg.span);
        i += 3;
        if (of) selectors.push({ kind: 'within', distance, of, span: joinSpans(arg.span, targetArg.span) });
      } else if (arg.kind === 'range') {
        this.sink.report('invalid-selector', arg.span, "A range needs an atom on each side of '..': `n1..n4` or `#3..#9`.");
      } else {
        const from = this.atomRef(arg, arg.span);
        if (!from) continue;
        if (args[i + 1]?.kind === 'range') {
          const to = this.atomRef(args[i + 2], args[i + 1]!.span);
          i += to ? 2 : 1;
          if (to) selectors.push({ kind: 'range', from, to, span: joinSpans(from.span, to.span) });
        } else {
          selectors.push(from);
        }
      }
    }
    return selectors;
  }

  private tier(statement: Statement): TierAst {
    const args = this.args(statement, 1, 'tier quantum|correlated|mean-field { ... }');
    const level = args ? this.term<TierLevel>(args[0]!, TIER_LEVELS, 'tier') : undefined;
    const tier: TierAst = level ? { statement, level } : { statement };
    const scope = `tier@${statement.span.start}`;
    for (const inner of statement.block?.statements ?? []) {
      const keyword = this.keyword(inner, 'tier');
      if (!keyword) continue;
      this.noBlock(inner);
      if (!this.once(scope, inner)) continue;
      switch (keyword.name) {
        case 'method': {
          const value = this.args(inner, 1, 'method <name>');
          if (value) tier.method = this.term(value[0]!, METHODS, 'method', 'unknown-method');
          break;
        }
        case 'ansatz': {
          const value = this.args(inner, 1, 'ansatz uccsd|k-upccgsd|hardware-efficient');
          if (value) tier.ansatz = this.term(value[0]!, ANSATZE, 'ansatz', 'unknown-ansatz');
          break;
        }
        case 'mapping': {
          const value = this.args(inner, 1, 'mapping jordan-wigner|bravyi-kitaev|parity');
          if (value) tier.mapping = this.term(value[0]!, MAPPING_TERMS, 'mapping', 'unknown-mapping');
          break;
        }
        case 'active':
          tier.active = this.activeSpace(inner);
          break;
        case 'frozen-core':
          tier.frozenCore = this.switchValue(inner);
          break;
        case 'taper':
          tier.taper = this.switchValue(inner);
          break;
        case 'layers': {
          const value = this.args(inner, 1, 'layers <n>');
          if (value) tier.layers = this.wholeNumber(value[0]!, 'The number of layers', 1);
          break;
        }
      }
    }
    return tier;
  }

  /** active 6e 6o, or per irrep of the fragment's point group: active 6e A1=3 B1=1 B2=2 */
  private activeSpace(statement: Statement): ActiveSpaceAst {
    let electrons: Located<number> | undefined;
    let orbitals: Located<number> | undefined;
    const irreps: ActiveIrrepAst[] = [];
    const syntax = 'active <n>e <m>o, for example `active 6e 6o`, or per irrep `active 6e A1=3 B1=1 B2=2`';
    const args = statement.args;
    for (let i = 0; i < args.length; i++) {
      const arg = args[i]!;
      if (arg.kind === 'electrons' && !electrons) electrons = { value: Number(arg.text.slice(0, -1)), span: arg.span };
      else if (arg.kind === 'orbitals' && !orbitals) orbitals = { value: Number(arg.text.slice(0, -1)), span: arg.span };
      else if (arg.kind === 'word' && args[i + 1]?.kind === 'equals') {
        const count = args[i + 2];
        i += 2;
        const value = count ? this.wholeNumber(count, `The orbital count of ${arg.text}`, 0) : undefined;
        if (!count) this.sink.report('missing-value', joinSpans(arg.span, args[i - 1]!.span), `Give the number of ${arg.text} orbitals after '=': \`${arg.text}=2\`.`);
        if (value) irreps.push({ label: { value: arg.text, span: arg.span }, count: value, span: joinSpans(arg.span, value.span) });
      } else if (arg.kind === 'number') {
        this.sink.report('invalid-value', arg.span, `Mark what the number counts: '${arg.text}e' for electrons or '${arg.text}o' for orbitals (${syntax}).`);
      } else {
        this.sink.report('invalid-value', arg.span, `An active space does not take ${describeArgument(arg)}; write ${syntax}.`);
      }
    }
    if (!orbitals && irreps.length > 0) {
      const total = irreps.reduce((sum, irrep) => sum + irrep.count.value, 0);
      orbitals = { value: total, span: joinSpans(irreps[0]!.span, irreps[irreps.length - 1]!.span) };
    }
    if (!electrons || !orbitals) {
      const missing = !electrons && !orbitals ? 'electrons and orbitals' : !electrons ? 'the electron count' : 'the orbital count';
      this.sink.report('missing-value', statement.span, `The active space needs ${missing}: ${syntax}.`);
    }
    const located: ActiveSpaceAst = { span: statement.span, irreps };
    return { ...located, ...(electrons ? { electrons } : {}), ...(orbitals ? { orbitals } : {}) };
  }

  /** scan distance <atom> <atom> from <d> to <d> step <d>   (or `points <n>` instead of step) */
  private scan(statement: Statement): ScanAst | undefined {
    const args = statement.args;
    const syntax = 'scan distance <atom> <atom> from <d> to <d> step <d>';
    const kindArg = args[0];
    if (!kindArg) {
      this.sink.report('missing-value', statement.keyword.span, `Say what to scan: \`${syntax}\`.`);
      return undefined;
    }
    const kind = this.term<'distance'>(kindArg, SCAN_KINDS, 'scan coordinate');
    if (!kind) return undefined;
    const first = this.atomRef(args[1], kindArg.span);
    const second = first ? this.atomRef(args[2], args[1]!.span) : undefined;
    const scan: { -readonly [K in keyof ScanAst]: ScanAst[K] } = { statement, kind };
    if (first) scan.first = first;
    if (second) scan.second = second;
    const keys = new Set(['from', 'to', 'step', 'points']);
    for (let i = 3; i < args.length; i++) {
      const key = args[i]!;
      if (key.kind !== 'word' || !keys.has(key.text)) {
        this.sink.report('invalid-value', key.span, `A scan does not take ${describeArgument(key)} here; write \`${syntax}\`.`);
        continue;
      }
      const value = args[i + 1];
      if (!value) {
        this.sink.report('missing-value', key.span, `'${key.text}' needs a number after it.`);
        break;
      }
      i++;
      const located = key.text === 'points' ? this.wholeNumber(value, 'The number of points', 1) : this.number(value, `The '${key.text}' value`);
      if (!located) continue;
      if (key.text === 'from') scan.from = located;
      else if (key.text === 'to') scan.to = located;
      else if (key.text === 'step') scan.step = located;
      else scan.points = located;
    }
    if (!scan.from || !scan.to || (!scan.step && !scan.points)) {
      const missing = [!scan.from && 'from', !scan.to && 'to', !scan.step && !scan.points && 'step'].filter(Boolean).join(', ');
      this.sink.report('missing-value', statement.keyword.span, `The scan needs ${missing}: \`${syntax}\` (or \`points <n>\` instead of step).`);
    }
    return scan;
  }

  private limits(statement: Statement): LimitsAst {
    const limits: LimitsAst = { statement };
    if (!statement.block) {
      this.sink.report('missing-block', statement.keyword.span, 'Give the limits in a block: `limits { qubits 24; memory 16 GiB }`.');
      return limits;
    }
    for (const inner of statement.block.statements) {
      const keyword = this.keyword(inner, 'limits');
      if (!keyword) continue;
      this.noBlock(inner);
      if (!this.once('limits', inner)) continue;
      if (keyword.name === 'qubits') {
        const value = this.args(inner, 1, 'qubits <n>');
        if (value) limits.qubits = this.wholeNumber(value[0]!, 'The qubit limit', 1);
      } else if (keyword.name === 'memory') {
        const memory = parseMemorySize(inner.args);
        if (memory.ok) limits.memory = { value: memory.bytes, span: memory.span };
        else this.sink.report(inner.args.length === 0 ? 'missing-value' : 'invalid-value', memory.span ?? inner.keyword.span, memory.message);
      }
    }
    return limits;
  }
}

export function interpret(tree: SyntaxTree, sink: DiagnosticSink): SpecAst {
  return new Interpreter(sink).run(tree);
}
