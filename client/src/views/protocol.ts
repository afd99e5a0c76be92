/**
 * The messages between the extension and its webviews (structure view, cost panel, orbital
 * levels), and the
 * checks each side runs on what it receives: type, shape and ranges. A message that fails a check
 * is dropped and logged, never acted on. Plain TypeScript with no editor or browser API, so the
 * extension, the webview scripts and the unit tests share it.
 *
 * The data shapes mirror what the language server answers to `tessera/structure` and
 * `tessera/costs`; the client defines them itself, as a protocol, and imports no server code.
 */

/** Result of a check: the message, or why it was refused (for the log). */
export type Checked<T> = { ok: true; value: T } | { ok: false; reason: string };

/**
 * What the views accept. The language server shortens text and refuses larger structures by the
 * same numbers (VIEW_LIMITS in server/src/services/views.ts; tests/extension/views-limits.test.ts
 * keeps the two equal), so data within them is never dropped here.
 */
export const VIEW_LIMITS = {
  atoms: 100_000,
  bonds: 400_000,
  fragments: 10_000,
  scanPoints: 100_000,
  text: 1_000,
  fragmentName: 200,
  label: 100,
  tier: 100,
  cost: 200,
} as const;
const MAX_ATOMS = VIEW_LIMITS.atoms;
const MAX_BONDS = VIEW_LIMITS.bonds;
const MAX_FRAGMENTS = VIEW_LIMITS.fragments;
const MAX_SCAN_POINTS = VIEW_LIMITS.scanPoints;
const MAX_TEXT = VIEW_LIMITS.text;
/** Largest SVG a plot may be (the charts are a few tens of kilobytes). */
export const MAX_SVG_CHARS = 2_000_000;
/** Largest PNG data URL the extension accepts from the cost panel. */
export const MAX_PNG_DATA_URL_CHARS = 32 * 1024 * 1024;

export const PLOTS = ['qubits', 'growth', 'shots', 'scan'] as const;
export type PlotName = (typeof PLOTS)[number];

// --- data ------------------------------------------------------------------------------------

export interface ViewAtom {
  index: number;
  element: string;
  label: string | null;
  x: number;
  y: number;
  z: number;
  /** Index into `fragments`, or −1 for an atom in no fragment. */
  fragment: number;
  /** Zero-based line in the spec, or −1 for an atom read from an XYZ file. */
  line: number;
}

export interface ViewFragment {
  name: string;
  tier: string | null;
  colour: string;
  cost: string;
  atoms: number;
  line: number;
}

export interface ViewCap {
  fragment: number;
  host: number;
  partner: number;
  element: string;
  x: number;
  y: number;
  z: number;
}

export interface ViewStructure {
  spec: string | null;
  atoms: ViewAtom[];
  fragments: ViewFragment[];
  bonds: { i: number; j: number; cut: boolean }[];
  /** Hydrogen caps on cut bonds: the fragment that has each, its host and partner atoms, its position (Å). */
  caps: ViewCap[];
  /** `values` in ångström for a distance, degrees for an angle or dihedral. */
  scan: { coordinate: 'distance' | 'angle' | 'dihedral'; atoms: number[]; first: number; second: number; values: number[]; moving: number[] } | null;
  unassignedColour: string;
  note: string;
}

export interface ViewCosts {
  spec: string | null;
  svg: Record<PlotName, string>;
  fragments: { index: number; name: string }[];
  selected: number | null;
  note: string;
}

// --- messages --------------------------------------------------------------------------------

/** Extension → structure view. */
export type StructureHostMessage =
  | { type: 'structure'; title: string; data: ViewStructure }
  | { type: 'highlight'; fragment: number | null; atom: number | null }
  | { type: 'unavailable'; message: string };

/** Structure view → extension. */
export type StructureViewMessage = { type: 'ready' } | { type: 'revealAtom'; atom: number } | { type: 'revealFragment'; fragment: number };

/** Extension → cost panel. */
export type CostsHostMessage = { type: 'costs'; title: string; data: ViewCosts } | { type: 'unavailable'; message: string };

/** A part of a spec in the orbital-level view: `system` or a fragment's index. */
export type PartId = 'system' | number;

export interface ViewLevels {
  spec: string | null;
  /** The parts with a computed mean field (or one being computed), with their state. */
  parts: { id: PartId; label: string; state: string }[];
  selected: PartId | null;
  /** The level picture (standalone SVG), or null with `message` saying why. */
  svg: string | null;
  message: string | null;
  note: string;
}

/** Extension → orbital-level view. */
export type LevelsHostMessage = { type: 'levels'; title: string; data: ViewLevels } | { type: 'unavailable'; message: string };

/** Orbital-level view → extension. */
export type LevelsViewMessage = { type: 'ready' } | { type: 'selectPart'; part: PartId } | { type: 'exportSvg' };

/** Cost panel → extension. */
export type CostsViewMessage =
  | { type: 'ready' }
  | { type: 'selectFragment'; fragment: number }
  | { type: 'exportSvg'; plot: PlotName }
  | { type: 'exportPng'; plot: PlotName; dataUrl: string };

// --- small checks ----------------------------------------------------------------------------

type Json = Record<string, unknown>;

function isRecord(value: unknown): value is Json {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function isIndex(value: unknown, below: number): value is number {
  return Number.isInteger(value) && (value as number) >= 0 && (value as number) < below;
}

function isText(value: unknown, max: number = MAX_TEXT): value is string {
  return typeof value === 'string' && value.length <= max;
}

/** Why a value is not text of at most `max` characters, with the numbers. */
function textProblem(what: string, value: unknown, max: number): string {
  return typeof value === 'string' ? `${what} has ${value.length} characters, more than the ${max} the view accepts` : `${what} is not text`;
}

/**
 * The reason a request for view data gives instead of the data (the spec is beyond what the view
 * shows: `{ unavailable: "..." }`), or undefined when the answer is not one.
 */
export function unavailableReason(raw: unknown): string | undefined {
  if (!isRecord(raw) || !hasKeys(raw, ['unavailable']) || !isText(raw['unavailable'])) return undefined;
  return raw['unavailable'];
}

function isFiniteNumber(value: unknown): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}

const COLOUR = /^#[0-9a-fA-F]{6}$/;
const ELEMENT = /^[A-Z][a-z]{0,2}$/;

/** Exactly these keys, no others: a message with extra fields is not one we sent. */
function hasKeys(value: Json, keys: readonly string[]): boolean {
  const own = Object.keys(value);
  return own.length === keys.length && keys.every((key) => Object.prototype.hasOwnProperty.call(value, key));
}

function fail<T>(reason: string): Checked<T> {
  return { ok: false, reason };
}

function typeOf(raw: unknown): string | undefined {
  return isRecord(raw) && typeof raw['type'] === 'string' ? raw['type'] : undefined;
}

// --- structure data --------------------------------------------------------------------------

export function checkStructure(raw: unknown): Checked<ViewStructure> {
  if (!isRecord(raw)) return fail('structure data is not an object');
  if (!hasKeys(raw, ['spec', 'atoms', 'fragments', 'bonds', 'caps', 'scan', 'unassignedColour', 'note'])) return fail('structure data has unexpected fields');
  const { spec, atoms, fragments, bonds, caps, scan, unassignedColour, note } = raw;
  if (spec !== null && !isText(spec)) return fail(textProblem('the spec name', spec, MAX_TEXT));
  if (!isText(note) || !isText(unassignedColour) || !COLOUR.test(unassignedColour)) return fail('note or unassigned colour malformed');
  if (!Array.isArray(fragments)) return fail('fragments is not a list');
  if (fragments.length > MAX_FRAGMENTS) return fail(`${fragments.length} fragments, more than the ${MAX_FRAGMENTS} the view shows`);
  for (const fragment of fragments) {
    if (!isRecord(fragment) || !hasKeys(fragment, ['name', 'tier', 'colour', 'cost', 'atoms', 'line'])) return fail('a fragment has the wrong fields');
    if (!isText(fragment['name'], VIEW_LIMITS.fragmentName)) return fail(textProblem('a fragment name', fragment['name'], VIEW_LIMITS.fragmentName));
    if (fragment['tier'] !== null && !isText(fragment['tier'], VIEW_LIMITS.tier)) return fail(textProblem('a fragment tier', fragment['tier'], VIEW_LIMITS.tier));
    if (!isText(fragment['colour']) || !COLOUR.test(fragment['colour'])) return fail(`fragment colour '${String(fragment['colour']).slice(0, 20)}' is not #rrggbb`);
    if (!isText(fragment['cost'], VIEW_LIMITS.cost) || !isIndex(fragment['atoms'], MAX_ATOMS + 1) || !isIndex(fragment['line'], Number.MAX_SAFE_INTEGER)) return fail('a fragment cost, atom count or line is malformed');
  }
  if (!Array.isArray(atoms)) return fail('atoms is not a list');
  if (atoms.length > MAX_ATOMS) return fail(`${atoms.length} atoms, more than the ${MAX_ATOMS} the view shows`);
  for (let k = 0; k < atoms.length; k++) {
    const atom: unknown = atoms[k];
    if (!isRecord(atom) || !hasKeys(atom, ['index', 'element', 'label', 'x', 'y', 'z', 'fragment', 'line'])) return fail(`atom ${k} has the wrong fields`);
    if (atom['index'] !== k) return fail(`atom ${k} carries index ${String(atom['index'])}`);
    if (!isText(atom['element'], 3) || !ELEMENT.test(atom['element'])) return fail(`atom ${k} has no element symbol`);
    if (atom['label'] !== null && !isText(atom['label'], VIEW_LIMITS.label)) return fail(textProblem(`the label of atom #${k + 1}`, atom['label'], VIEW_LIMITS.label));
    if (!isFiniteNumber(atom['x']) || !isFiniteNumber(atom['y']) || !isFiniteNumber(atom['z'])) return fail(`atom ${k} coordinates are not finite numbers`);
    if (atom['fragment'] !== -1 && !isIndex(atom['fragment'], fragments.length)) return fail(`atom ${k} fragment index out of range`);
    if (atom['line'] !== -1 && !isIndex(atom['line'], Number.MAX_SAFE_INTEGER)) return fail(`atom ${k} line out of range`);
  }
  if (!Array.isArray(bonds)) return fail('bonds is not a list');
  if (bonds.length > MAX_BONDS) return fail(`${bonds.length} bonds, more than the ${MAX_BONDS} the view shows`);
  for (const bond of bonds) {
    if (!isRecord(bond) || !hasKeys(bond, ['i', 'j', 'cut']) || !isIndex(bond['i'], atoms.length) || !isIndex(bond['j'], atoms.length) || typeof bond['cut'] !== 'boolean') return fail('a bond is malformed or names a missing atom');
  }
  if (!Array.isArray(caps)) return fail('caps is not a list');
  if (caps.length > MAX_BONDS) return fail(`${caps.length} caps, more than the ${MAX_BONDS} the view shows`);
  for (const cap of caps) {
    if (!isRecord(cap) || !hasKeys(cap, ['fragment', 'host', 'partner', 'element', 'x', 'y', 'z'])) return fail('a cap has the wrong fields');
    if (!isIndex(cap['fragment'], fragments.length) || !isIndex(cap['host'], atoms.length) || !isIndex(cap['partner'], atoms.length)) return fail('a cap names a missing fragment or atom');
    if (!isText(cap['element'], 3) || !ELEMENT.test(cap['element'])) return fail('a cap has no element symbol');
    if (!isFiniteNumber(cap['x']) || !isFiniteNumber(cap['y']) || !isFiniteNumber(cap['z'])) return fail('cap coordinates are not finite numbers');
  }
  if (scan !== null) {
    if (!isRecord(scan) || !hasKeys(scan, ['coordinate', 'atoms', 'first', 'second', 'values', 'moving'])) return fail('scan has the wrong fields');
    if (!['distance', 'angle', 'dihedral'].includes(scan['coordinate'] as string)) return fail('scan coordinate unknown');
    if (!isIndex(scan['first'], atoms.length) || !isIndex(scan['second'], atoms.length)) return fail('scan atoms out of range');
    const named = scan['atoms'];
    if (!Array.isArray(named) || named.length < 2 || named.length > 4 || !named.every((atom) => isIndex(atom, atoms.length))) return fail('scan atoms out of range');
    const { values, moving } = scan;
    if (Array.isArray(values) && values.length > MAX_SCAN_POINTS) return fail(`${values.length} scan points, more than the ${MAX_SCAN_POINTS} the view shows`);
    if (!Array.isArray(values) || !values.every(isFiniteNumber)) return fail('scan values malformed');
    if (!Array.isArray(moving) || moving.length > atoms.length || !moving.every((m) => isIndex(m, atoms.length))) return fail('scan moving atoms malformed');
  }
  return { ok: true, value: raw as unknown as ViewStructure };
}

// --- SVG charts ------------------------------------------------------------------------------

const SVG_ELEMENTS = new Set(['svg', 'g', 'rect', 'line', 'polyline', 'circle', 'path', 'text', 'tspan', 'title']);
const SVG_ATTRIBUTES = new Set([
  'xmlns', 'width', 'height', 'viewBox', 'role', 'aria-label',
  'x', 'y', 'x1', 'y1', 'x2', 'y2', 'cx', 'cy', 'r', 'd', 'points', 'transform',
  'fill', 'fill-opacity', 'opacity', 'stroke', 'stroke-width', 'stroke-dasharray', 'stroke-opacity', 'stroke-linejoin', 'paint-order',
  'font-family', 'font-size', 'font-weight', 'text-anchor', 'dominant-baseline',
]);
/** data-* attributes carry what a drawing shows (an orbital's index, its irrep) for tests and tools. */
const DATA_ATTRIBUTE = /^data-[a-z]+(?:-[a-z]+)*$/;
const TAG = /<(\/?)([A-Za-z][A-Za-z0-9]*)((?:\s+[A-Za-z][A-Za-z0-9:-]*="[^"<>]*")*)\s*(\/?)>/y;
const ATTRIBUTE = /\s+([A-Za-z][A-Za-z0-9:-]*)="([^"<>]*)"/g;
const ENTITY = /&(?:amp|lt|gt|quot|apos|#\d{1,7}|#x[0-9a-fA-F]{1,6});/y;

/**
 * Whether an SVG chart holds only drawing: known elements and presentation attributes, no
 * scripts, event handlers, links, styles, external references or markup declarations.
 */
export function checkSvg(svg: unknown): Checked<string> {
  if (typeof svg !== 'string') return fail('chart is not text');
  if (svg.length > MAX_SVG_CHARS) return fail('chart too large');
  if (!svg.startsWith('<svg ') || !svg.endsWith('</svg>')) return fail('chart is not one <svg> element');
  let depth = 0;
  for (let at = 0; at < svg.length; ) {
    const char = svg[at];
    if (char === '<') {
      TAG.lastIndex = at;
      const tag = TAG.exec(svg);
      if (!tag) return fail(`markup at ${at} is not a plain element tag`);
      const [whole, closing, name, attributes, selfClosing] = tag;
      if (!SVG_ELEMENTS.has(name!)) return fail(`element <${name}> not allowed in a chart`);
      for (const [, attribute, value] of attributes!.matchAll(ATTRIBUTE)) {
        if (!SVG_ATTRIBUTES.has(attribute!) && !DATA_ATTRIBUTE.test(attribute!)) return fail(`attribute '${attribute}' not allowed in a chart`);
        if (/url\s*\(|javascript:|data:/i.test(value!)) return fail(`attribute '${attribute}' refers to a resource`);
      }
      if (closing && (attributes || selfClosing)) return fail('malformed closing tag');
      if (closing) depth--;
      else if (!selfClosing) depth++;
      if (depth < 0 || (depth === 0 && at + whole.length !== svg.length)) return fail('chart has content outside its <svg> element');
      at += whole.length;
    } else if (char === '&') {
      ENTITY.lastIndex = at;
      const entity = ENTITY.exec(svg);
      if (!entity) return fail(`bare '&' at ${at}`);
      at += entity[0].length;
    } else if (char === '>') {
      return fail(`stray '>' at ${at}`);
    } else {
      at++;
    }
  }
  if (depth !== 0) return fail('unbalanced chart markup');
  return { ok: true, value: svg };
}

export function checkCosts(raw: unknown): Checked<ViewCosts> {
  if (!isRecord(raw) || !hasKeys(raw, ['spec', 'svg', 'fragments', 'selected', 'note'])) return fail('cost data has the wrong fields');
  const { spec, svg, fragments, selected, note } = raw;
  if (spec !== null && !isText(spec)) return fail(textProblem('the spec name', spec, MAX_TEXT));
  if (!isText(note)) return fail('the note is not text');
  if (!isRecord(svg) || !hasKeys(svg, PLOTS)) return fail('charts missing');
  for (const plot of PLOTS) {
    const chart = checkSvg(svg[plot]);
    if (!chart.ok) return fail(`${plot} chart: ${chart.reason}`);
  }
  if (!Array.isArray(fragments)) return fail('fragment list malformed');
  if (fragments.length > MAX_FRAGMENTS) return fail(`${fragments.length} fragments, more than the ${MAX_FRAGMENTS} the panel shows`);
  for (const fragment of fragments) {
    if (!isRecord(fragment) || !hasKeys(fragment, ['index', 'name']) || !isIndex(fragment['index'], MAX_FRAGMENTS)) return fail('a selectable fragment is malformed');
    if (!isText(fragment['name'], VIEW_LIMITS.fragmentName)) return fail(textProblem('a fragment name', fragment['name'], VIEW_LIMITS.fragmentName));
  }
  if (selected !== null && !fragments.some((f) => (f as Json)['index'] === selected)) return fail('selected fragment is not among the selectable ones');
  return { ok: true, value: raw as unknown as ViewCosts };
}

function isPartId(value: unknown): value is PartId {
  return value === 'system' || isIndex(value, MAX_FRAGMENTS);
}

export function checkLevels(raw: unknown): Checked<ViewLevels> {
  if (!isRecord(raw) || !hasKeys(raw, ['spec', 'parts', 'selected', 'svg', 'message', 'note'])) return fail('level data has the wrong fields');
  const { spec, parts, selected, svg, message, note } = raw;
  if ((spec !== null && !isText(spec)) || !isText(note) || (message !== null && !isText(message, 4_000))) return fail('spec name, message or note is not text');
  if (!Array.isArray(parts) || parts.length > MAX_FRAGMENTS + 1) return fail('part list malformed');
  for (const part of parts) {
    if (!isRecord(part) || !hasKeys(part, ['id', 'label', 'state']) || !isPartId(part['id']) || !isText(part['label'], 300) || !isText(part['state'], 40)) return fail('a part is malformed');
  }
  if (selected !== null && !isPartId(selected)) return fail('selected part malformed');
  if (svg !== null) {
    const chart = checkSvg(svg);
    if (!chart.ok) return fail(`level picture: ${chart.reason}`);
  }
  if ((svg === null) === (message === null)) return fail('level data needs either a picture or a message');
  return { ok: true, value: raw as unknown as ViewLevels };
}

// --- messages to the views (checked in the webview) -----------------------------------------

export function checkStructureHostMessage(raw: unknown): Checked<StructureHostMessage> {
  const type = typeOf(raw);
  const message = raw as Json;
  switch (type) {
    case 'structure': {
      if (!hasKeys(message, ['type', 'title', 'data']) || !isText(message['title'])) return fail('structure message malformed');
      const data = checkStructure(message['data']);
      return data.ok ? { ok: true, value: { type, title: message['title'], data: data.value } } : data;
    }
    case 'highlight': {
      const { fragment, atom } = message;
      if (!hasKeys(message, ['type', 'fragment', 'atom'])) return fail('highlight message malformed');
      if ((fragment !== null && !isIndex(fragment, MAX_FRAGMENTS)) || (atom !== null && !isIndex(atom, MAX_ATOMS))) return fail('highlight target out of range');
      return { ok: true, value: { type, fragment: fragment as number | null, atom: atom as number | null } };
    }
    case 'unavailable':
      return hasKeys(message, ['type', 'message']) && isText(message['message']) ? { ok: true, value: { type, message: message['message'] } } : fail('unavailable message malformed');
    default:
      return fail(`unknown message type '${String(type).slice(0, 40)}'`);
  }
}

export function checkCostsHostMessage(raw: unknown): Checked<CostsHostMessage> {
  const type = typeOf(raw);
  const message = raw as Json;
  switch (type) {
    case 'costs': {
      if (!hasKeys(message, ['type', 'title', 'data']) || !isText(message['title'])) return fail('costs message malformed');
      const data = checkCosts(message['data']);
      return data.ok ? { ok: true, value: { type, title: message['title'], data: data.value } } : data;
    }
    case 'unavailable':
      return hasKeys(message, ['type', 'message']) && isText(message['message']) ? { ok: true, value: { type, message: message['message'] } } : fail('unavailable message malformed');
    default:
      return fail(`unknown message type '${String(type).slice(0, 40)}'`);
  }
}

export function checkLevelsHostMessage(raw: unknown): Checked<LevelsHostMessage> {
  const type = typeOf(raw);
  const message = raw as Json;
  switch (type) {
    case 'levels': {
      if (!hasKeys(message, ['type', 'title', 'data']) || !isText(message['title'])) return fail('levels message malformed');
      const data = checkLevels(message['data']);
      return data.ok ? { ok: true, value: { type, title: message['title'], data: data.value } } : data;
    }
    case 'unavailable':
      return hasKeys(message, ['type', 'message']) && isText(message['message']) ? { ok: true, value: { type, message: message['message'] } } : fail('unavailable message malformed');
    default:
      return fail(`unknown message type '${String(type).slice(0, 40)}'`);
  }
}

// --- messages from the views (checked in the extension) -------------------------------------

export function checkLevelsViewMessage(raw: unknown, context: { parts: readonly PartId[] }): Checked<LevelsViewMessage> {
  const type = typeOf(raw);
  const message = raw as Json;
  switch (type) {
    case 'ready':
      return hasKeys(message, ['type']) ? { ok: true, value: { type } } : fail('ready message malformed');
    case 'exportSvg':
      return hasKeys(message, ['type']) ? { ok: true, value: { type } } : fail('exportSvg message malformed');
    case 'selectPart':
      if (!hasKeys(message, ['type', 'part'])) return fail('selectPart message malformed');
      return isPartId(message['part']) && context.parts.includes(message['part'])
        ? { ok: true, value: { type, part: message['part'] } }
        : fail(`part ${String(message['part']).slice(0, 20)} cannot be selected`);
    default:
      return fail(`unknown message type '${String(type).slice(0, 40)}'`);
  }
}


/** What the extension knows of the structure the view shows, to check indices against. */
export interface StructureContext {
  atoms: number;
  fragments: number;
}

export function checkStructureViewMessage(raw: unknown, context: StructureContext): Checked<StructureViewMessage> {
  const type = typeOf(raw);
  const message = raw as Json;
  switch (type) {
    case 'ready':
      return hasKeys(message, ['type']) ? { ok: true, value: { type } } : fail('ready message malformed');
    case 'revealAtom':
      if (!hasKeys(message, ['type', 'atom'])) return fail('revealAtom message malformed');
      return isIndex(message['atom'], context.atoms) ? { ok: true, value: { type, atom: message['atom'] } } : fail(`atom ${String(message['atom']).slice(0, 20)} out of range (${context.atoms} atoms)`);
    case 'revealFragment':
      if (!hasKeys(message, ['type', 'fragment'])) return fail('revealFragment message malformed');
      return isIndex(message['fragment'], context.fragments) ? { ok: true, value: { type, fragment: message['fragment'] } } : fail(`fragment ${String(message['fragment']).slice(0, 20)} out of range (${context.fragments} fragments)`);
    default:
      return fail(`unknown message type '${String(type).slice(0, 40)}'`);
  }
}

const PNG_PREFIX = 'data:image/png;base64,';
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/** The bytes of a PNG data URL, or why it is not one. */
export function decodePngDataUrl(dataUrl: string): Checked<Uint8Array> {
  if (dataUrl.length > MAX_PNG_DATA_URL_CHARS) return fail('image too large');
  if (!dataUrl.startsWith(PNG_PREFIX)) return fail('not a PNG data URL');
  const base64 = dataUrl.slice(PNG_PREFIX.length);
  if (base64.length === 0 || base64.length % 4 !== 0 || !/^[A-Za-z0-9+/]+={0,2}$/.test(base64)) return fail('not base64');
  const binary = atob(base64);
  const bytes = new Uint8Array(binary.length);
  for (let k = 0; k < binary.length; k++) bytes[k] = binary.charCodeAt(k);
  if (bytes.length < 33 || PNG_SIGNATURE.some((byte, k) => bytes[k] !== byte)) return fail('no PNG signature');
  return { ok: true, value: bytes };
}

export function checkCostsViewMessage(raw: unknown, context: { fragments: readonly number[] }): Checked<CostsViewMessage> {
  const type = typeOf(raw);
  const message = raw as Json;
  const plot = message?.['plot'];
  const isPlot = (value: unknown): value is PlotName => typeof value === 'string' && (PLOTS as readonly string[]).includes(value);
  switch (type) {
    case 'ready':
      return hasKeys(message, ['type']) ? { ok: true, value: { type } } : fail('ready message malformed');
    case 'selectFragment':
      if (!hasKeys(message, ['type', 'fragment'])) return fail('selectFragment message malformed');
      return Number.isInteger(message['fragment']) && context.fragments.includes(message['fragment'] as number)
        ? { ok: true, value: { type, fragment: message['fragment'] as number } }
        : fail(`fragment ${String(message['fragment']).slice(0, 20)} cannot be selected`);
    case 'exportSvg':
      return hasKeys(message, ['type', 'plot']) && isPlot(plot) ? { ok: true, value: { type, plot } } : fail('exportSvg message malformed');
    case 'exportPng': {
      if (!hasKeys(message, ['type', 'plot', 'dataUrl']) || !isPlot(plot) || typeof message['dataUrl'] !== 'string') return fail('exportPng message malformed');
      const image = decodePngDataUrl(message['dataUrl']);
      return image.ok ? { ok: true, value: { type, plot, dataUrl: message['dataUrl'] } } : fail(`exportPng: ${image.reason}`);
    }
    default:
      return fail(`unknown message type '${String(type).slice(0, 40)}'`);
  }
}
