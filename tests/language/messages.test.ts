/**
 * Messages that used to mislead now state the numbers: a memory limit below one byte (once shown as
 * "0 B"), a scan step that gives more points than can be counted (once "Infinity points"), and
 * ranges of atoms written backwards, which select nothing and say so.
 */
import { describe, expect, it } from 'vitest';
import { WATER_LINES } from '../fixtures/water';
import { expectDiagnostic, expectNoDiagnostic } from './fixture';

const water = (extra: string) => `basis sto-3g\nstructure {\n${WATER_LINES}\n}\nfragment w { atoms rest; tier mean-field { } }\n${extra}\n`;

describe('memory limits', () => {
  it('1e-30 GiB is refused with what it is in bytes, not shown as 0 B', () => {
    const { diagnostic } = expectDiagnostic(water('limits { memory ⟦1e-30 GiB⟧ }'), 'invalid-value');
    expect(diagnostic.message).toBe('1e-30 GiB is 1.07e-21 bytes, less than one byte: is the unit or the number mistyped?');
  });

  it('half a byte is refused; one byte is a limit', () => {
    expectDiagnostic(water('limits { memory ⟦0.5 B⟧ }'), 'invalid-value');
    expectNoDiagnostic(water('limits { memory 1 B }'), 'invalid-value');
  });
});

describe('backwards ranges of atoms', () => {
  const three = `basis sto-3g\nstructure {\n${WATER_LINES}\n}\n`;

  it('#3..#2 is an error that names both atoms, and the fragment is reported empty', () => {
    const { diagnostic, analysis } = expectDiagnostic(`${three}fragment a { atoms ⟦#3..#2⟧; tier mean-field { } }\nfragment b { atoms rest; tier mean-field { } }\n`, 'invalid-selector');
    expect(diagnostic.message).toBe('This range runs backwards: atom #3 comes after #2 in the structure; write the earlier atom first.');
    expect(analysis.diagnostics.map((d) => d.code)).toContain('fragment-empty');
  });

  it('h2..h1 by label likewise', () => {
    const { diagnostic } = expectDiagnostic(`${three}fragment a { atoms o ⟦h2..h1⟧; tier mean-field { } }\n`, 'invalid-selector');
    expect(diagnostic.message).toBe('This range runs backwards: atom #3 comes after #2 in the structure; write the earlier atom first.');
  });
});

describe('the per-file cap names what it leaves out', () => {
  it('1,001 warnings: the note is a warning; errors among the unlisted make it an error', async () => {
    const { analyze } = await import('../../server/src/language/analyze');
    const atoms = Array.from({ length: 1001 }, (_, i) => `  H ${2 * i} 0 0`).join('\n');
    const fragments = Array.from({ length: 1001 }, (_, i) => `fragment f${i} { atoms #${i + 1} }`).join('\n');
    const warnings = analyze(`basis sto-3g\nstructure {\n${atoms}\n}\n${fragments}\n`).diagnostics;
    const note = warnings.at(-1)!;
    expect([note.code, note.severity, note.message.split(';')[1]]).toEqual(['too-many-problems', 'warning', ' 1 more were found after this point and are not shown. Fix the ones above and check again (or is this not a spec file?).']);
    const errors = analyze(`basis sto-3g\nstructure {\n${atoms}\n}\n${fragments}\nbogus\n`).diagnostics;
    expect(errors.at(-1)!.severity).toBe('error');
    expect(errors.at(-1)!.message).toContain('2 more were found after this point (1 of them errors)');
  });
});
