/**
 * The formatter: messy input against the expected output, idempotence on the samples and on
 * random mutations of them, range formatting, unreadable lines, CRLF.
 *
 * Geometries are invented test data.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { format, formatLines, formatText } from '../../server/src/services';
import { tokenize } from '../../server/src/language/lexer';
import { applyEdits, readSample, SAMPLE_NAMES } from './service';

/** Formats through the edits an editor receives, applied the way it applies them. */
function formatted(text: string, options = {}): string {
  return applyEdits(text, format(text, undefined, options));
}

/** The spec's lines joined with `\n`. */
const lines = (...all: string[]) => all.join('\n');

describe('messy input', () => {
  const cases: { name: string; input: string; expected: string }[] = [
    {
      name: 'indentation by block depth, single spaces, braces spaced',
      input: lines('fragment   w{', 'atoms rest', '        tier  quantum{', 'method vqe', '   }', '}'),
      expected: lines('fragment w {', '  atoms rest', '  tier quantum {', '    method vqe', '  }', '}'),
    },
    {
      name: 'single spaces in basis lines, `;` bound to the word before it',
      input: lines('basis   sto-3g', '   basis  def2-svp   on all   Zn ;functions cartesian'),
      expected: lines('basis sto-3g', 'basis def2-svp on all Zn; functions cartesian'),
    },
    {
      name: '`=` spaced where it is written (active irreps), `;` bound to the word before it',
      input: 'fragment w { atoms rest; tier quantum { active 4e A1=2 B2 =2 ;taper on } }',
      expected: 'fragment w { atoms rest; tier quantum { active 4e A1 = 2 B2 = 2; taper on } }',
    },
    {
      name: '`..` bound to both its atoms',
      input: 'fragment w { atoms o .. h22   #1 ..#2 ; charge 0 }',
      expected: 'fragment w { atoms o..h22 #1..#2; charge 0 }',
    },
    {
      name: 'a block on one line keeps its line',
      input: 'limits{qubits 4;memory 16 GiB}',
      expected: 'limits { qubits 4; memory 16 GiB }',
    },
    {
      name: 'blank lines emptied, never removed',
      input: lines('spec "t"', '   ', '', 'functions cartesian   '),
      expected: lines('spec "t"', '', '', 'functions cartesian'),
    },
    {
      name: 'a full-line comment indented with its block',
      input: lines('fragment w {', '      # the solvent', 'atoms rest', '}'),
      expected: lines('fragment w {', '  # the solvent', '  atoms rest', '}'),
    },
    {
      name: 'a trailing comment stays at its column when the code ends before it',
      input: lines('spec   "t"     # name', 'fragment w {', '   atoms rest        # everything', '}'),
      expected: lines('spec "t"       # name', 'fragment w {', '  atoms rest         # everything', '}'),
    },
    {
      name: 'a trailing comment moves two spaces after code that grew past it',
      input: lines('fragment w {', 'atoms o..h1 #3 # all', '}'),
      expected: lines('fragment w {', '  atoms o..h1 #3  # all', '}'),
    },
    {
      name: 'a stray `}` does not indent below zero',
      input: lines('}', '  functions cartesian'),
      expected: lines('}', 'functions cartesian'),
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      expect(formatText(c.input)).toBe(c.expected);
      expect(formatted(c.input)).toBe(c.expected);
    });
  }

  it('a whole spec', () => {
    const input = `spec   "t"   # name
basis    sto-3g
basis def2-svp  on   all Zn;functions cartesian
structure   in  bohr{
O o 0 0 0      # oxygen
   H h1  1.5e0 .5 -0.25
H h22 0.000001 1E-3 2
}
fragment w {
atoms o..h22 #1 ..#2 ;charge 0
        tier quantum { method vqe ; mapping parity }
}
limits{qubits 4}
`;
    expect(formatText(input)).toBe(`spec "t"     # name
basis sto-3g
basis def2-svp on all Zn; functions cartesian
structure in bohr {
  O  o     0.000000   0.000000   0.000000  # oxygen
  H  h1    1.500000   0.500000  -0.250000
  H  h22   0.000001   0.001000   2.000000
}
fragment w {
  atoms o..h22 #1..#2; charge 0
  tier quantum { method vqe; mapping parity }
}
limits { qubits 4 }
`);
  });

  it('indents by the requested width', () => {
    expect(formatText(lines('fragment w {', 'tier quantum {', 'method vqe', '}', '}'), { indent: 4 })).toBe(lines('fragment w {', '    tier quantum {', '        method vqe', '    }', '}'));
  });
});

describe('geometry columns', () => {
  const geometry = (...rows: string[]) => lines('structure {', ...rows, '}');

  it('aligns element, label and coordinates, at least four decimals', () => {
    expect(formatText(geometry('O o 0 0 0', 'H h2 0 -0.756950 0.585882', 'Cl 0 0 2'))).toBe(
      // One width for every coordinate column: that of the widest number, -0.756950.
      geometry('  O   o    0.000000   0.000000   0.000000', '  H   h2   0.000000  -0.756950   0.585882', '  Cl       0.000000   0.000000   2.000000'),
    );
  });

  it('leaves out the label column when no atom has a label', () => {
    expect(formatText(geometry('H 0 0 0', 'H 0 0 0.74'))).toBe(geometry('  H  0.0000  0.0000  0.0000', '  H  0.0000  0.0000  0.7400'));
  });

  it('chooses the decimals per block: enough for the most precise number', () => {
    expect(formatText(geometry('H a 0 0 0.123456', 'H b 1.5 0 0'))).toBe(geometry('  H  a  0.000000  0.000000  0.123456', '  H  b  1.500000  0.000000  0.000000'));
  });

  it('takes the smallest number of decimals from the options', () => {
    expect(formatText(geometry('H 0 0 0', 'H 0 0 1'), { minimumDecimals: 2 })).toBe(geometry('  H  0.00  0.00  0.00', '  H  0.00  0.00  1.00'));
  });

  it('rewrites scientific notation in fixed point without changing the value', () => {
    const input = geometry('C c 1.5e3 -2.5E-5 +7e0', 'H h 0 1E1 .25');
    const output = formatText(input);
    // 2.5E-5 = 0.000025 needs six decimals, so every coordinate of the block gets six.
    expect(output).toBe(geometry('  C  c  1500.000000    -0.000025     7.000000', '  H  h     0.000000    10.000000     0.250000'));
    expect(coordinates(output)).toEqual(coordinates(input));
  });

  it('keeps numbers as typed when fixed point would need more than ten decimals, aligned all the same', () => {
    const output = formatText(geometry('H 1e-12 0 0', 'H 0 0 1'));
    expect(output).toBe(geometry('  H  1e-12      0      0', '  H      0      0      1'));
  });

  it('keeps numbers as typed when one is too large for exact fixed point', () => {
    expect(formatText(geometry('H 123456.5 0 0', 'H 0 0 1'))).toBe(geometry('  H  123456.5         0         0', '  H         0         0         1'));
  });

  it('aligns each run of atom lines on its own, around a line that is not an atom', () => {
    const output = formatText(geometry('H a 0 0 0', 'Xq 1 1 1', 'H long 10 0 0'));
    expect(output).toBe(geometry('  H  a  0.0000  0.0000  0.0000', '  Xq 1 1 1', '  H  long  10.0000   0.0000   0.0000'));
  });

  it('keeps the trailing comment of an atom line at its column when it fits', () => {
    const output = formatText(geometry('H a 0 0 0                                  # first', 'H b 0 0 0.74'));
    expect(output.split('\n')[1]).toBe('  H  a  0.0000  0.0000  0.0000             # first');
  });

  it('never changes a coordinate\'s value, over random numbers', () => {
    const literal = fc.oneof(
      fc.double({ min: -1e4, max: 1e4, noNaN: true }).map((value) => String(value)),
      fc.tuple(fc.integer({ min: -999, max: 999 }), fc.integer({ min: -8, max: 3 })).map(([mantissa, exponent]) => `${mantissa}e${exponent}`),
    );
    fc.assert(
      fc.property(fc.array(fc.tuple(literal, literal, literal), { minLength: 1, maxLength: 5 }), (rows) => {
        const input = geometry(...rows.map(([x, y, z]) => `H ${x} ${y} ${z}`));
        const output = formatText(input);
        expect(coordinates(output)).toEqual(coordinates(input));
        expect(formatText(output)).toBe(output);
      }),
      { numRuns: 200 },
    );
  });
});

describe('tokens that must not be pulled apart or together', () => {
  it('keeps a space between a number and `..`, which would not read as a number any more', () => {
    const output = formatText('fragment f { atoms 1   ..  2 }');
    expect(output).toBe('fragment f { atoms 1 ..2 }');
    expect(tokenize(output).errors).toEqual([]);
  });

  it('keeps touching tokens together when apart they would read differently', () => {
    // `1e-32` before `.0000` reads as a word (a number cannot be followed by `.`); alone it is a number.
    const input = lines('structure {', '  N 1e-32.0000   0.0000 1', '}');
    const output = formatText(input);
    expect(output.split('\n')[1]).toBe('  N 1e-32.0000 0.0000 1');
    expect(formatText(output)).toBe(output);
  });
});

describe('idempotence', () => {
  for (const name of SAMPLE_NAMES) {
    it(`on ${name}`, () => {
      const text = readSample(name);
      const once = formatted(text);
      expect(format(once)).toEqual([]);
      expect(formatText(once)).toBe(once);
    });
  }

  it('the samples other than mistakes.tess are already formatted', () => {
    for (const name of SAMPLE_NAMES.filter((sample) => sample !== 'mistakes.tess')) expect(format(readSample(name)), name).toEqual([]);
  });

  it('on random mutations of the samples', () => {
    const texts = SAMPLE_NAMES.map(readSample);
    const pieces = [' ', '  ', '\t', '\n', '\r\n', '{', '}', '{{', '}}', ';', '..', '.', ',', '#', '# c', '#3', '=', '"', '@', '(', ')', "'", '*', '+', '-', 'e', 'x', 'H', 'O', '1', '0.5', '.5', '+3', '-2.25', '1e', '1e-3', '2E+1', '1e-12', '123456.5', '6e', '4o', 'geometry', 'atoms', 'rest', 'all'];
    const mutation = fc.oneof(
      fc.record({ kind: fc.constant('insert' as const), at: fc.nat(), piece: fc.constantFrom(...pieces) }),
      fc.record({ kind: fc.constant('delete' as const), at: fc.nat(), length: fc.integer({ min: 1, max: 4 }) }),
      fc.record({ kind: fc.constant('duplicate-line' as const), at: fc.nat() }),
    );
    fc.assert(
      fc.property(fc.nat({ max: texts.length - 1 }), fc.array(mutation, { minLength: 1, maxLength: 10 }), (sample, mutations) => {
        const text = mutate(texts[sample]!, mutations);
        const once = formatted(text);
        expect(formatted(once)).toBe(once);
        expect(once.split('\n').length).toBe(text.split('\n').length);
        if (tokenize(text).errors.length === 0) expect(tokenize(once).errors).toEqual([]);
      }),
      { numRuns: 1000 },
    );
  });
});

describe('range formatting', () => {
  const input = lines('spec   "t"', 'units    bohr', 'fragment w {', 'atoms rest', '   tier mean-field { method   rhf }', '}', 'limits{qubits 4}');

  it('edits only the lines the range touches, as the whole-document format would', () => {
    const whole = format(input);
    const range = { start: { line: 3, character: 2 }, end: { line: 4, character: 0 } };
    const partial = format(input, range);
    expect(partial.map((edit) => edit.range.start.line)).toEqual([3, 4]);
    expect(partial).toEqual(whole.filter((edit) => edit.range.start.line >= 3 && edit.range.start.line <= 4));
    expect(applyEdits(input, partial)).toBe(lines('spec   "t"', 'units    bohr', 'fragment w {', '  atoms rest', '  tier mean-field { method rhf }', '}', 'limits{qubits 4}'));
  });

  it('aligns atom lines in range with the whole block', () => {
    const geometry = lines('structure {', 'H a 0 0 0', 'H bbb 0 0 0.74', 'H c 10 0 0', '}');
    const partial = format(geometry, { start: { line: 2, character: 0 }, end: { line: 2, character: 3 } });
    expect(partial).toEqual([{ range: { start: { line: 2, character: 0 }, end: { line: 2, character: 14 } }, newText: '  H  bbb   0.0000   0.0000   0.7400' }]);
    // The column width is that of 10.0000, on a line outside the range.
  });

  it('returns no edits for a range over lines already formatted', () => {
    expect(format(input, { start: { line: 2, character: 0 }, end: { line: 2, character: 5 } })).toEqual([]);
  });
});

describe('lines the formatter cannot read', () => {
  it('are left exactly as they are, and the rest is formatted', () => {
    const input = lines('spec   "t"   @ here', 'functions    cartesian', 'fragment w {', '    atoms rest   ; charge 0 ; name "open', '}');
    expect(formatText(input)).toBe(lines('spec   "t"   @ here', 'functions cartesian', 'fragment w {', '    atoms rest   ; charge 0 ; name "open', '}'));
  });

  it('an unreadable line inside a geometry block is not aligned with its neighbours', () => {
    const input = lines('structure {', 'H a 0 0 0 @', 'H b 0 0 0.74', '}');
    expect(formatText(input)).toBe(lines('structure {', 'H a 0 0 0 @', '  H  b  0.0000  0.0000  0.7400', '}'));
  });
});

describe('CRLF input', () => {
  const lf = lines('spec   "t"   # name', 'fragment w {', 'atoms rest', '}', 'structure {', 'H a 0 0 0', 'H b 0 0 0.74', '}', '');
  const crlf = lf.replace(/\n/g, '\r\n');

  it('edits stop before the carriage return, so line ends are kept', () => {
    const edits = format(crlf);
    const crlfLines = crlf.split('\n');
    for (const edit of edits) {
      expect(edit.range.start.character).toBe(0);
      expect(edit.range.end.character).toBe(crlfLines[edit.range.end.line]!.replace(/\r$/, '').length);
    }
    expect(applyEdits(crlf, edits)).toBe(formatted(lf).replace(/\n/g, '\r\n'));
  });

  it('formats to the same lines as LF input', () => {
    expect(formatLines(crlf)).toEqual(formatLines(lf));
  });

  it('is idempotent', () => {
    const once = formatted(crlf);
    expect(format(once)).toEqual([]);
  });
});

/** The coordinates of every atom line, as numbers. */
function coordinates(text: string): number[] {
  const values: number[] = [];
  for (const line of text.split('\n')) {
    const parts = line.trim().split(/\s+/);
    if (parts.length >= 4 && /^[A-Z][a-z]?$/.test(parts[0]!)) values.push(...parts.slice(-3).map(Number));
  }
  return values;
}

type Mutation = { kind: 'insert'; at: number; piece: string } | { kind: 'delete'; at: number; length: number } | { kind: 'duplicate-line'; at: number };

/**
 * Applies edits to a sample. A lone carriage return is removed at the end: editors and the LSP
 * treat it as a line break, which this language (like the formatter) does not.
 */
function mutate(text: string, mutations: readonly Mutation[]): string {
  let out = text;
  for (const m of mutations) {
    const at = m.at % (out.length + 1);
    if (m.kind === 'insert') out = out.slice(0, at) + m.piece + out.slice(at);
    else if (m.kind === 'delete') out = out.slice(0, at) + out.slice(at + m.length);
    else {
      const all = out.split('\n');
      const line = m.at % all.length;
      all.splice(line, 0, all[line]!);
      out = all.join('\n');
    }
  }
  return out.replace(/\r(?!\n)/g, '');
}
