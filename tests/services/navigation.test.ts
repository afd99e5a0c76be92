/**
 * Navigation: go to definition, references, document highlights and rename, for atom labels
 * (defined in the geometry, used by selectors and scans) and fragment names. In each case `$0` is
 * the cursor and `⟦ ⟧` marks every expected range, in document order.
 *
 * Geometries are invented test data.
 */
import { describe, expect, it } from 'vitest';
import { DocumentHighlightKind } from 'vscode-languageserver-types';
import { findDefinition, findDocumentHighlights, findReferences, prepareRename, rename } from '../../server/src/services';
import { analyze } from '../../server/src/language/analyze';
import { applyEdits, editsFor, marked, URI } from './service';

/** Water with labels o and h1 and an unlabelled third atom; each part can carry the markers of a case. */
function site(parts: { o?: string; h1?: string; uses?: string; scan?: string; index?: string } = {}): string {
  return `basis sto-3g
structure {
  O ${parts.o ?? 'o'} 0 0 0
  H ${parts.h1 ?? 'h1'} 0 0.756950 0.585882
  H 0 -0.756950 0.585882
}
fragment water {
  atoms ${parts.uses ?? 'o h1'} ${parts.index ?? '#3'}
  tier mean-field { method rhf }
}
scan distance ${parts.scan ?? 'o h1'} from 1 to 2 step 0.5
`;
}

describe('go to definition', () => {
  const cases: { name: string; text: string }[] = [
    { name: 'from a label in `atoms`', text: site({ h1: '⟦h1⟧', uses: 'o h$01' }) },
    { name: 'from a label in a scan', text: site({ o: '⟦o⟧', scan: '$0o h1' }) },
    { name: 'from the label\'s own definition', text: site({ h1: '⟦h$01⟧' }) },
    { name: 'from #n to the atom line of an unlabelled atom', text: site({ index: '#$03' }).replace('  H 0 -0.756950 0.585882', '  ⟦H 0 -0.756950 0.585882⟧') },
    { name: 'from #n to the label of a labelled atom', text: site({ o: '⟦o⟧', uses: 'h1', index: '$0#1' }) },
    { name: 'from the first character of #n right after `..`', text: site({ h1: '⟦h1⟧', uses: 'o..$0#2', index: '' }) },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const m = marked(c.text);
      expect(findDefinition(m.analysis, URI, m.cursor)).toEqual({ uri: URI, range: m.ranges[0] });
    });
  }

  it('from a fragment name to itself', () => {
    const m = marked(site().replace('fragment water', 'fragment ⟦wa$0ter⟧'));
    expect(findDefinition(m.analysis, URI, m.cursor)).toEqual({ uri: URI, range: m.ranges[0] });
  });

  it('nowhere from a keyword, a number or a label that does not exist', () => {
    for (const text of [site().replace('atoms', 'at$0oms'), site().replace('step 0.5', 'step 0.$05'), site({ uses: 'o h$09' })]) {
      const m = marked(text);
      expect(findDefinition(m.analysis, URI, m.cursor)).toBeNull();
    }
  });
});

describe('references', () => {
  it('of a label: its uses by label and by #index, with or without the declaration', () => {
    const text = site({ o: '⟦o⟧', uses: '⟦o⟧ h1', index: '⟦#1⟧', scan: '⟦$0o⟧ h1' });
    const m = marked(text);
    const withDeclaration = findReferences(m.analysis, URI, m.cursor, true).map((location) => location.range);
    // Labels first, then #index references: compare as sets of ranges.
    expect(sortRanges(withDeclaration)).toEqual(m.ranges);
    const withoutDeclaration = findReferences(m.analysis, URI, m.cursor, false).map((location) => location.range);
    expect(sortRanges(withoutDeclaration)).toEqual(m.ranges.slice(1));
    expect(findReferences(m.analysis, URI, m.cursor, true).every((location) => location.uri === URI)).toBe(true);
  });

  it('of an unlabelled atom from its #index: the atom line and every #index', () => {
    const text = site({ index: '⟦#3⟧ ⟦#$03⟧' }).replace('  H 0 -0.756950 0.585882', '  ⟦H 0 -0.756950 0.585882⟧');
    const m = marked(text);
    expect(sortRanges(findReferences(m.analysis, URI, m.cursor, true).map((location) => location.range))).toEqual(m.ranges);
  });

  it('of a range\'s ends inside `a..b`', () => {
    const m = marked(site({ h1: '⟦h1⟧', uses: 'o..⟦h$01⟧', index: '', scan: 'o ⟦h1⟧' }));
    expect(sortRanges(findReferences(m.analysis, URI, m.cursor, true).map((location) => location.range))).toEqual(m.ranges);
  });

  it('none on whitespace', () => {
    const m = marked(site({ uses: 'o $0 h1' }));
    expect(findReferences(m.analysis, URI, m.cursor, true)).toEqual([]);
  });
});

describe('document highlights', () => {
  it('write on the definition, read on each use', () => {
    const m = marked(site({ h1: '⟦h1⟧', uses: 'o ⟦h$01⟧', scan: 'o ⟦h1⟧' }));
    const highlights = findDocumentHighlights(m.analysis, m.cursor);
    expect(highlights).toEqual([
      { range: m.ranges[0], kind: DocumentHighlightKind.Write },
      { range: m.ranges[1], kind: DocumentHighlightKind.Read },
      { range: m.ranges[2], kind: DocumentHighlightKind.Read },
    ]);
  });

  it('nothing on a comment', () => {
    const m = marked(`# a comment about h1$0\n${site()}`);
    expect(findDocumentHighlights(m.analysis, m.cursor)).toEqual([]);
  });
});

describe('rename', () => {
  it('a label: the definition and every use by label, #index untouched', () => {
    const m = marked(site({ o: '⟦o⟧', uses: '⟦$0o⟧ h1', index: '#1', scan: '⟦o⟧ h1' }));
    const check = prepareRename(m.analysis, m.cursor);
    expect(check).toEqual({ ok: true, range: m.ranges[1], placeholder: 'o' });
    const result = rename(m.analysis, URI, m.cursor, 'oxygen');
    const edits = editsFor('changes' in result ? result : undefined);
    expect(sortRanges(edits.map((edit) => edit.range))).toEqual(m.ranges);
    expect(edits.every((edit) => edit.newText === 'oxygen')).toBe(true);
    const renamed = applyEdits(m.analysis.text, edits);
    expect(renamed).toContain('  O oxygen 0 0 0');
    expect(renamed).toContain('atoms oxygen h1 #1');
    expect(renamed).toContain('scan distance oxygen h1 from');
    // The renamed spec reports what the original did and resolves every reference to the same atoms.
    const after = analyze(renamed);
    expect(after.diagnostics.map((d) => d.code)).toEqual(m.analysis.diagnostics.map((d) => d.code));
    expect(after.model.atomReferences.map((ref) => ref.atom)).toEqual(m.analysis.model.atomReferences.map((ref) => ref.atom));
  });

  it('a label from its definition in the geometry', () => {
    const m = marked(site({ h1: '⟦h$01⟧', uses: 'o ⟦h1⟧', scan: 'o ⟦h1⟧' }));
    const result = rename(m.analysis, URI, m.cursor, 'h_top');
    expect(sortRanges(editsFor('changes' in result ? result : undefined).map((edit) => edit.range))).toEqual(m.ranges);
  });

  it('a fragment: its name', () => {
    const m = marked(site().replace('fragment water', 'fragment ⟦wat$0er⟧'));
    expect(prepareRename(m.analysis, m.cursor)).toEqual({ ok: true, range: m.ranges[0], placeholder: 'water' });
    const result = rename(m.analysis, URI, m.cursor, 'solvent');
    expect(editsFor('changes' in result ? result : undefined)).toEqual([{ range: m.ranges[0], newText: 'solvent' }]);
  });

  const refused: { name: string; text: string; newName?: string; message: RegExp }[] = [
    { name: 'an unlabelled atom', text: site({ index: '#$03' }), message: /no label to rename/ },
    { name: 'a labelled atom through its #index', text: site({ uses: 'h1', index: '#$01' }), message: /#index names the atom by position/ },
    { name: 'a labelled atom from its element symbol', text: site().replace('  O o', '  $0O o'), message: /Put the cursor on the label 'o'/ },
    { name: 'a keyword', text: site().replace('tier', 't$0ier'), message: /Only atom labels and fragment names/ },
    { name: 'a label to a name another atom has', text: site({ uses: '$0o h1' }), newName: 'h1', message: /'h1' is already the name of another atom/ },
    { name: 'a fragment to a name another fragment has', text: `${site()}fragment other$0 { atoms o; tier mean-field { method rhf } }\n`, newName: 'water', message: /'water' is already the name of another fragment/ },
    { name: 'a label to a name starting with a digit', text: site({ uses: '$0o h1' }), newName: '1o', message: /not a valid name/ },
    { name: 'a label to a name with a space', text: site({ uses: '$0o h1' }), newName: 'o x', message: /not a valid name/ },
    { name: 'a fragment to an empty name', text: site().replace('fragment water', 'fragment wa$0ter'), newName: '', message: /not a valid name/ },
    { name: 'a label to `rest`, which `atoms` reads as a selector', text: site({ uses: '$0o h1' }), newName: 'rest', message: /`atoms rest` is a selector/ },
    { name: 'a label to `all`', text: site({ uses: '$0o h1' }), newName: 'all', message: /is a selector/ },
  ];
  for (const c of refused) {
    it(`refused for ${c.name}`, () => {
      const m = marked(c.text);
      const result = rename(m.analysis, URI, m.cursor, c.newName ?? 'fresh');
      expect('error' in result ? result.error : 'no error').toMatch(c.message);
      if (c.newName === undefined) {
        const check = prepareRename(m.analysis, m.cursor);
        expect(check.ok ? 'ok' : check.message).toMatch(c.message);
      }
    });
  }

  it('allows renaming a label to its own name', () => {
    const m = marked(site({ uses: '$0o h1' }));
    const result = rename(m.analysis, URI, m.cursor, 'o');
    expect(applyEdits(m.analysis.text, editsFor('changes' in result ? result : undefined))).toBe(m.analysis.text);
  });

  it('allows renaming a fragment to a selector word (fragment names are never read as selectors)', () => {
    const m = marked(site().replace('fragment water', 'fragment wa$0ter'));
    const result = rename(m.analysis, URI, m.cursor, 'rest');
    expect('changes' in result).toBe(true);
  });
});

function sortRanges<T extends { start: { line: number; character: number } }>(ranges: T[]): T[] {
  return [...ranges].sort((a, b) => a.start.line - b.start.line || a.start.character - b.start.character);
}
