/**
 * Snippets: whole blocks offered by completion where a statement starts on its own line (never
 * after other text on the line, never in a value position). Their choices are the vocabulary
 * table's words, so they cannot fall out of step with the language.
 */
import { ANSATZE, MAPPING_TERMS, TIER_LEVELS, UNIT_TERMS, type BlockKind, type TermInfo } from '../language/vocabulary';

export interface Snippet {
  /** What completion shows and filters on. */
  readonly label: string;
  readonly description: string;
  /** The blocks where it may start a statement. */
  readonly blocks: readonly BlockKind[];
  /** Only in a spec that has no statement yet (the whole-spec skeleton). */
  readonly emptySpecOnly?: boolean;
  /** LSP snippet syntax, lines joined by newlines. */
  readonly body: string;
}

/** `${n|a,b,c|}`: a choice among the table's words, the first the default. */
function choice(index: number, terms: readonly TermInfo[]): string {
  return `\${${index}|${terms.map((term) => term.name).join(',')}|}`;
}

export const SNIPPETS: readonly Snippet[] = [
  {
    label: 'new spec',
    description: 'A new spec: header, basis, structure, one fragment and limits.',
    blocks: ['top'],
    emptySpecOnly: true,
    body: [
      '# ${1:What this plan is for}',
      'spec "${2:name}"',
      '',
      'charge ${3:0}',
      'multiplicity ${4:1}',
      '',
      'basis ${5:def2-SVP}',
      '',
      `structure in ${choice(6, UNIT_TERMS)} {`,
      '  ${7:O  o1   0.0000   0.0000   0.0000}',
      '}',
      '',
      'fragment ${8:core} {',
      '  atoms ${9:rest}',
      `  tier ${choice(10, TIER_LEVELS)} {`,
      '    method ${11:vqe}',
      '  }',
      '}',
      '',
      'limits {',
      '  qubits ${12:24}',
      '}',
      '$0',
    ].join('\n'),
  },
  {
    label: 'new fragment',
    description: 'A fragment with a quantum tier: atoms, method, ansatz, mapping, active space, tapering.',
    blocks: ['top', 'variant'],
    body: [
      'fragment ${1:name} {',
      '  atoms ${2:rest}',
      '  tier quantum {',
      '    method vqe',
      `    ansatz ${choice(3, ANSATZE)}`,
      `    mapping ${choice(4, MAPPING_TERMS)}`,
      '    active ${5:4}e ${6:4}o',
      '    taper on',
      '  }',
      '}',
      '$0',
    ].join('\n'),
  },
];
