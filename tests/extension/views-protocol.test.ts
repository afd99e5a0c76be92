/**
 * The checks on every message between the extension and its webviews (client/src/views/protocol.ts):
 * well-formed messages pass; wrong types, shapes, extra fields and out-of-range indices are refused
 * with a reason; charts with anything but drawing are refused; PNG data URLs are decoded only when
 * they are PNGs.
 */
import { describe, expect, it } from 'vitest';
import {
  checkCosts,
  checkCostsHostMessage,
  checkCostsViewMessage,
  checkStructure,
  checkStructureHostMessage,
  checkStructureViewMessage,
  checkSvg,
  decodePngDataUrl,
  MAX_PNG_DATA_URL_CHARS,
  type ViewCosts,
  type ViewStructure,
} from '../../client/src/views/protocol';

const SVG = '<svg xmlns="http://www.w3.org/2000/svg" width="20" height="10" viewBox="0 0 20 10" role="img" aria-label="a &amp; b"><rect x="0" y="0" width="20" height="10" fill="#ffffff"/><text x="1" y="8" font-size="8" transform="rotate(-90 1 8)">x &lt; 2 – ok<title>t</title></text><polyline points="0,0 1,1" stroke-dasharray="5 3"/></svg>';

function structure(): ViewStructure {
  return {
    spec: 'test',
    atoms: [
      { index: 0, element: 'O', label: 'o', x: 0, y: 0, z: 0, fragment: 0, line: 3 },
      { index: 1, element: 'H', label: null, x: 0, y: 0.75695, z: 0.585882, fragment: 0, line: 4 },
      { index: 2, element: 'Zn', label: null, x: 3, y: 0, z: 0, fragment: -1, line: -1 },
    ],
    fragments: [{ name: 'w', tier: 'quantum', colour: '#e69f00', cost: '12 qubits', atoms: 2, line: 7 }],
    bonds: [{ i: 0, j: 1, cut: false }],
    caps: [{ fragment: 0, host: 0, partner: 2, element: 'H', x: 0.9, y: 0, z: 0 }],
    scan: { coordinate: 'distance', atoms: [0, 2], first: 0, second: 2, values: [2, 2.5], moving: [2] },
    unassignedColour: '#bbbbbb',
    note: 'Planning estimates.',
  };
}

function costs(): ViewCosts {
  return { spec: 'test', svg: { qubits: SVG, growth: SVG, shots: SVG, scan: SVG }, fragments: [{ index: 0, name: 'w' }, { index: 2, name: 'v' }], selected: 2, note: 'Planning estimates.' };
}

/** The reason a check gave, or 'ok'. */
function verdict(checked: { ok: true } | { ok: false; reason: string }): string {
  return checked.ok ? 'ok' : checked.reason;
}

describe('structure data', () => {
  it('passes when well formed, null spec and no scan included', () => {
    expect(verdict(checkStructure(structure()))).toBe('ok');
    expect(verdict(checkStructure({ ...structure(), spec: null, scan: null }))).toBe('ok');
  });

  it.each([
    ['not an object', () => 'structure' as unknown],
    ['an extra field', () => ({ ...structure(), script: 'x' })],
    ['a colour that is not #rrggbb', () => ({ ...structure(), fragments: [{ ...structure().fragments[0]!, colour: 'red;background:url(x)' }] })],
    ['a cap of a missing fragment', () => ({ ...structure(), caps: [{ fragment: 3, host: 0, partner: 2, element: 'H', x: 0, y: 0, z: 0 }] })],
    ['a cap at a coordinate that is not finite', () => ({ ...structure(), caps: [{ fragment: 0, host: 0, partner: 2, element: 'H', x: Number.NaN, y: 0, z: 0 }] })],
    ['an unassigned colour that is not #rrggbb', () => ({ ...structure(), unassignedColour: 'inherit' })],
    ['an atom index out of order', () => ({ ...structure(), atoms: structure().atoms.map((a, k) => (k === 1 ? { ...a, index: 5 } : a)) })],
    ['an atom in a missing fragment', () => ({ ...structure(), atoms: structure().atoms.map((a, k) => (k === 1 ? { ...a, fragment: 1 } : a)) })],
    ['a coordinate that is not finite', () => ({ ...structure(), atoms: structure().atoms.map((a, k) => (k === 1 ? { ...a, x: Number.NaN } : a)) })],
    ['a coordinate given as text', () => ({ ...structure(), atoms: structure().atoms.map((a, k) => (k === 1 ? { ...a, y: '1' } : a)) })],
    ['an element that is not a symbol', () => ({ ...structure(), atoms: structure().atoms.map((a, k) => (k === 1 ? { ...a, element: '<b>' } : a)) })],
    ['a negative line other than −1', () => ({ ...structure(), atoms: structure().atoms.map((a, k) => (k === 1 ? { ...a, line: -2 } : a)) })],
    ['a bond to a missing atom', () => ({ ...structure(), bonds: [{ i: 0, j: 3, cut: false }] })],
    ['a bond whose cut flag is not boolean', () => ({ ...structure(), bonds: [{ i: 0, j: 1, cut: 1 }] })],
    ['a scan of a missing atom', () => ({ ...structure(), scan: { coordinate: 'distance', atoms: [0, 9], first: 0, second: 9, values: [2], moving: [] } })],
    ['an unknown scan coordinate', () => ({ ...structure(), scan: { coordinate: 'volume', atoms: [0, 2], first: 0, second: 2, values: [2], moving: [] } })],
    ['a scan distance that is not a number', () => ({ ...structure(), scan: { coordinate: 'distance', atoms: [0, 2], first: 0, second: 2, values: [2, null], moving: [] } })],
    ['a fragment name too long', () => ({ ...structure(), fragments: [{ ...structure().fragments[0]!, name: 'x'.repeat(201) }] })],
  ])('is refused with %s', (_, make) => {
    expect(verdict(checkStructure(make()))).not.toBe('ok');
  });
});

describe('charts', () => {
  it('pass when they hold only drawing elements and presentation attributes', () => {
    expect(verdict(checkSvg(SVG))).toBe('ok');
  });

  it.each([
    ['a script element', SVG.replace('</svg>', '<script>alert(1)</script></svg>')],
    ['an event handler', SVG.replace('<rect ', '<rect onclick="alert(1)" ')],
    ['a link', SVG.replace('</svg>', '<a href="https://example.invalid"><text x="0" y="0">x</text></a></svg>')],
    ['an href attribute', SVG.replace('<rect ', '<rect href="#x" ')],
    ['a style attribute', SVG.replace('<rect ', '<rect style="fill:red" ')],
    ['a style element', SVG.replace('</svg>', '<style>rect{}</style></svg>')],
    ['a foreign object', SVG.replace('</svg>', '<foreignObject><div/></foreignObject></svg>')],
    ['an external image', SVG.replace('</svg>', '<image x="0" y="0"/></svg>')],
    ['a url() reference', SVG.replace('fill="#ffffff"', 'fill="url(https://example.invalid/x)"')],
    ['a data: URL in an attribute', SVG.replace('aria-label="a &amp; b"', 'aria-label="data:text/html,x"')],
    ['a document type declaration', `<!DOCTYPE svg>${SVG}`],
    ['a processing instruction inside', SVG.replace('<rect', '<?xml-stylesheet href="x"?><rect')],
    ['a comment', SVG.replace('<rect', '<!-- x --><rect')],
    ['single-quoted attributes', SVG.replace('fill="#ffffff"', "fill='#ffffff'")],
    ['a bare ampersand', SVG.replace('x &lt; 2', 'x & 2')],
    ['an unknown entity', SVG.replace('&lt;', '&nbsp;')],
    ['a stray >', SVG.replace('x &lt; 2', 'x > 2')],
    ['content after the root element', `${SVG}<svg xmlns="http://www.w3.org/2000/svg"></svg>`],
    ['an unclosed element', SVG.replace('</text>', '')],
    ['text that is not an SVG', '<html><body>x</body></html>'],
    ['a non-string', 42],
    ['too much text', SVG.replace('</svg>', `<text x="0" y="0">${'x'.repeat(2_000_001)}</text></svg>`)],
  ])('are refused with %s', (_, svg) => {
    expect(verdict(checkSvg(svg))).not.toBe('ok');
  });

  it('refuse cost data whose selected fragment is not selectable, or with a bad chart', () => {
    expect(verdict(checkCosts(costs()))).toBe('ok');
    expect(verdict(checkCosts({ ...costs(), selected: null }))).toBe('ok');
    expect(verdict(checkCosts({ ...costs(), selected: 1 }))).toContain('selected');
    expect(verdict(checkCosts({ ...costs(), svg: { ...costs().svg, scan: SVG.replace('<rect ', '<rect onload="x" ') } }))).toContain('scan chart');
    expect(verdict(checkCosts({ ...costs(), svg: { qubits: SVG, growth: SVG } }))).not.toBe('ok');
    expect(verdict(checkCosts({ ...costs(), fragments: [{ index: -1, name: 'w' }] }))).not.toBe('ok');
  });
});

describe('messages to the views', () => {
  it('pass when well formed', () => {
    expect(verdict(checkStructureHostMessage({ type: 'structure', title: 'Structure: a.tess', data: structure() }))).toBe('ok');
    expect(verdict(checkStructureHostMessage({ type: 'highlight', fragment: 0, atom: null }))).toBe('ok');
    expect(verdict(checkStructureHostMessage({ type: 'highlight', fragment: null, atom: 2 }))).toBe('ok');
    expect(verdict(checkStructureHostMessage({ type: 'unavailable', message: 'closed' }))).toBe('ok');
    expect(verdict(checkCostsHostMessage({ type: 'costs', title: 'Costs: a.tess', data: costs() }))).toBe('ok');
    expect(verdict(checkCostsHostMessage({ type: 'unavailable', message: 'closed' }))).toBe('ok');
  });

  it.each([
    ['an unknown type', { type: 'eval', code: 'x' }],
    ['no type', { data: structure() }],
    ['a non-object', 'structure'],
    ['null', null],
    ['an extra field', { type: 'highlight', fragment: 0, atom: null, more: 1 }],
    ['a negative fragment', { type: 'highlight', fragment: -1, atom: null }],
    ['a fractional atom', { type: 'highlight', fragment: null, atom: 1.5 }],
    ['a missing title', { type: 'structure', data: structure() }],
    ['bad data', { type: 'structure', title: 't', data: { ...structure(), bonds: 'all' } }],
  ])('to the structure view are refused with %s', (_, message) => {
    expect(verdict(checkStructureHostMessage(message))).not.toBe('ok');
  });

  it('to the cost panel are refused when unknown or malformed', () => {
    expect(verdict(checkCostsHostMessage({ type: 'structure', title: 't', data: structure() }))).toContain('unknown');
    expect(verdict(checkCostsHostMessage({ type: 'costs', title: 7, data: costs() }))).not.toBe('ok');
    expect(verdict(checkCostsHostMessage({ type: 'unavailable', message: 'x'.repeat(1001) }))).not.toBe('ok');
  });
});

describe('messages from the views', () => {
  const context = { atoms: 3, fragments: 1 };

  it('from the structure view pass with indices in range', () => {
    expect(checkStructureViewMessage({ type: 'ready' }, context)).toEqual({ ok: true, value: { type: 'ready' } });
    expect(checkStructureViewMessage({ type: 'revealAtom', atom: 2 }, context)).toEqual({ ok: true, value: { type: 'revealAtom', atom: 2 } });
    expect(checkStructureViewMessage({ type: 'revealFragment', fragment: 0 }, context)).toEqual({ ok: true, value: { type: 'revealFragment', fragment: 0 } });
  });

  it.each([
    ['an atom past the last', { type: 'revealAtom', atom: 3 }],
    ['a negative atom', { type: 'revealAtom', atom: -1 }],
    ['an atom given as text', { type: 'revealAtom', atom: '1' }],
    ['a fragment past the last', { type: 'revealFragment', fragment: 1 }],
    ['a line instead of an atom', { type: 'revealLine', line: 4 }],
    ['an extra field', { type: 'revealAtom', atom: 1, line: 900 }],
    ['a ready with data', { type: 'ready', data: 1 }],
    ['an array', [{ type: 'ready' }]],
  ])('from the structure view are refused with %s', (_, message) => {
    expect(verdict(checkStructureViewMessage(message, context))).not.toBe('ok');
  });

  it('from the structure view are refused while it shows no structure', () => {
    expect(verdict(checkStructureViewMessage({ type: 'revealAtom', atom: 0 }, { atoms: 0, fragments: 0 }))).toContain('out of range');
  });

  const png = (bytes: number[]) => `data:image/png;base64,${Buffer.from(bytes).toString('base64')}`;
  const PNG_BYTES = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, ...Array.from({ length: 40 }, (_, k) => k)];

  it('from the cost panel pass when well formed, selectable and of a known chart', () => {
    const selectable = { fragments: [0, 2] };
    expect(verdict(checkCostsViewMessage({ type: 'ready' }, selectable))).toBe('ok');
    expect(verdict(checkCostsViewMessage({ type: 'selectFragment', fragment: 2 }, selectable))).toBe('ok');
    expect(verdict(checkCostsViewMessage({ type: 'exportSvg', plot: 'scan' }, selectable))).toBe('ok');
    expect(verdict(checkCostsViewMessage({ type: 'exportPng', plot: 'growth', dataUrl: png(PNG_BYTES) }, selectable))).toBe('ok');
  });

  it.each([
    ['a fragment that cannot be selected', { type: 'selectFragment', fragment: 1 }],
    ['an unknown chart', { type: 'exportSvg', plot: '../../etc/passwd' }],
    ['SVG text sent by the view', { type: 'exportSvg', plot: 'qubits', svg: '<svg/>' }],
    ['a JPEG for a PNG', { type: 'exportPng', plot: 'qubits', dataUrl: 'data:image/jpeg;base64,/9j/4AAQ' }],
    ['bytes that are not a PNG', { type: 'exportPng', plot: 'qubits', dataUrl: png([1, 2, 3, 4, 5, 6, 7, 8, ...Array.from({ length: 40 }, () => 0)]) }],
    ['text that is not base64', { type: 'exportPng', plot: 'qubits', dataUrl: 'data:image/png;base64,iVBORw0KGgo*' }],
    ['no data URL', { type: 'exportPng', plot: 'qubits' }],
  ])('from the cost panel are refused with %s', (_, message) => {
    expect(verdict(checkCostsViewMessage(message, { fragments: [0, 2] }))).not.toBe('ok');
  });

  it('decodes a PNG data URL to its bytes, and refuses one too large to save', () => {
    const decoded = decodePngDataUrl(png(PNG_BYTES));
    expect(decoded.ok && [...decoded.value]).toEqual(PNG_BYTES);
    const huge = `data:image/png;base64,${'A'.repeat(MAX_PNG_DATA_URL_CHARS)}`;
    expect(verdict(decodePngDataUrl(huge))).toBe('image too large');
  });
});
