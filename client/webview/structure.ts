/**
 * The structure view's script: draws the spec's atoms with 3Dmol.js, coloured by fragment, with
 * bonds cut by fragment boundaries dashed, their hydrogen caps as small spheres, and the scanned distance as an arrow; fills the key;
 * reports clicks on atoms and on fragments of the key to the extension. Everything it shows comes
 * from the extension's messages (the language server's `tessera/structure` answer).
 */
import { createViewer, Vector2, type AtomSpec, type GLViewer } from '3dmol';
import { checkStructureHostMessage, type StructureViewMessage, type ViewAtom, type ViewStructure } from '../src/views/protocol';
import { apply, IDENTITY, viewRotation, type Matrix, type Vector } from '../src/views/orientation';
import { element, post, receive } from './host';

const BACKGROUND = '#fbfaf6';
/** Cut bonds: dashed, near black, so they differ from every fragment colour. */
const CUT_BOND = '#1f1f1f';
/** The scanned distance: a violet arrow (not a fragment colour). */
const SCAN = '#6a3d9a';
const HIGHLIGHT_RING = '#3b7bd6';
const ATOM_SCALE = 0.27;
const HIGHLIGHTED_SCALE = 0.36;
const BOND_RADIUS = 0.11;

const send = (message: StructureViewMessage) => post(message);

const container = element<HTMLDivElement>('viewer');
const viewer: GLViewer = createViewer(container, { backgroundColor: BACKGROUND, antialias: true, hoverDuration: 120 });
viewer.enableFog(false);

const status = element<HTMLDivElement>('status');
const labelsToggle = element<HTMLInputElement>('labels');

let data: ViewStructure | null = null;
/** Whether the camera still frames the whole structure (no turn or zoom by hand since). */
let framed = true;
let highlightedFragment: number | null = null;
let highlightedAtom: number | null = null;

/** A colour mixed towards white: how atoms outside the highlighted fragment are drawn. */
function faded(hex: string, amount = 0.68): string {
  const channel = (offset: number) => {
    const value = parseInt(hex.slice(offset, offset + 2), 16);
    return Math.round(value + (255 - value) * amount)
      .toString(16)
      .padStart(2, '0');
  };
  return `#${channel(1)}${channel(3)}${channel(5)}`;
}

function colourOf(atom: ViewAtom): string {
  const base = atom.fragment >= 0 ? data!.fragments[atom.fragment]!.colour : data!.unassignedColour;
  return highlightedFragment !== null && atom.fragment !== highlightedFragment ? faded(base) : base;
}

function atomName(atom: ViewAtom): string {
  return `${atom.element}${atom.label ? ` ${atom.label}` : ''} #${atom.index + 1}`;
}

function describe(atom: ViewAtom): string {
  const fragment = atom.fragment >= 0 ? `fragment ${data!.fragments[atom.fragment]!.name}` : 'in no fragment';
  const line = atom.line >= 0 ? ` · line ${atom.line + 1}, click to go there` : ' · read from an XYZ file';
  return `${atomName(atom)} · ${fragment}${line}`;
}

/**
 * The rotation the view applies to the coordinates (orientation.ts): the scanned distance across
 * the screen when there is a scan, else the molecule's largest plane facing the viewer.
 */
function orientation(structure: ViewStructure): Matrix {
  return viewRotation(structure.atoms, structure.scan);
}

let rotation: Matrix = IDENTITY;

function point(atom: ViewAtom): Vector {
  return apply(rotation, atom);
}

function middle(a: ViewAtom, b: ViewAtom): Vector {
  const p = point(a);
  const q = point(b);
  return { x: (p.x + q.x) / 2, y: (p.y + q.y) / 2, z: (p.z + q.z) / 2 };
}

function drawBonds(structure: ViewStructure): void {
  for (const bond of structure.bonds) {
    const a = structure.atoms[bond.i]!;
    const b = structure.atoms[bond.j]!;
    if (bond.cut) {
      viewer.addCylinder({ start: point(a), end: point(b), radius: BOND_RADIUS * 0.8, color: CUT_BOND, dashed: true, dashLength: 0.22, gapLength: 0.16, fromCap: 1, toCap: 1 });
      continue;
    }
    const half = middle(a, b);
    viewer.addCylinder({ start: point(a), end: half, radius: BOND_RADIUS, color: colourOf(a), fromCap: 1 });
    viewer.addCylinder({ start: half, end: point(b), radius: BOND_RADIUS, color: colourOf(b), toCap: 1 });
  }
}

/** Caps: a small sphere in the fragment's colour on a thin stick from the atom that keeps it. */
const CAP_RADIUS = 0.2;
const CAP_STICK = 0.05;

function drawCaps(structure: ViewStructure): void {
  for (const cap of structure.caps) {
    const host = structure.atoms[cap.host]!;
    const colour = structure.fragments[cap.fragment]?.colour ?? structure.unassignedColour;
    const shown = highlightedFragment === null || highlightedFragment === cap.fragment ? colour : faded(colour);
    const centre = apply(rotation, cap);
    viewer.addCylinder({ start: point(host), end: centre, radius: CAP_STICK, color: shown, fromCap: 1, toCap: 1 });
    viewer.addSphere({ center: centre, radius: CAP_RADIUS, color: shown });
  }
}

function scanRange(scan: NonNullable<ViewStructure['scan']>): string {
  const values = scan.values;
  if (values.length === 0) return 'no points';
  const low = Math.min(...values);
  const high = Math.max(...values);
  const range = scan.coordinate === 'distance' ? `${low.toFixed(2)}–${high.toFixed(2)} Å` : `${scan.coordinate} ${low.toFixed(1)}–${high.toFixed(1)}°`;
  return `${range}, ${values.length} point${values.length === 1 ? '' : 's'}`;
}

function drawScan(structure: ViewStructure): void {
  const detail = element<HTMLParagraphElement>('scan-detail');
  element('mark-scan').hidden = !structure.scan;
  if (!structure.scan) {
    detail.hidden = true;
    return;
  }
  const first = structure.atoms[structure.scan.first]!;
  const second = structure.atoms[structure.scan.second]!;
  viewer.addArrow({ start: point(first), end: point(second), radius: 0.09, radiusRatio: 2.2, mid: 0.86, color: SCAN });
  detail.textContent = `Scan: ${atomName(first)} → ${atomName(second)}, ${scanRange(structure.scan)}; moves ${structure.scan.moving.length} atom${structure.scan.moving.length === 1 ? '' : 's'}.`;
  detail.hidden = false;
}

/** The scan's label and, when the toggle is on, every atom's; drawn at the next render. */
function drawLabels(structure: ViewStructure): void {
  viewer.removeAllLabels();
  if (structure.scan) {
    const first = structure.atoms[structure.scan.first]!;
    const second = structure.atoms[structure.scan.second]!;
    const style = { position: middle(first, second), fontSize: 12, fontColor: '#ffffff', backgroundColor: SCAN, backgroundOpacity: 0.88, borderThickness: 0, inFront: true, alignment: 'topCenter', screenOffset: new Vector2(0, -14) };
    viewer.addLabel(`scan ${scanRange(structure.scan)}`, style, undefined, true);
  }
  if (!labelsToggle.checked) return;
  for (const atom of structure.atoms) {
    const style = { position: point(atom), fontSize: 10, fontColor: '#111111', backgroundColor: '#ffffff', backgroundOpacity: 0.78, borderThickness: 0, inFront: true, alignment: 'center' };
    viewer.addLabel(atomName(atom), style, undefined, true);
  }
}

/** Redraws everything; keeps the camera unless `fit`. */
function draw(fit: boolean): void {
  const view = viewer.getView();
  viewer.clear();
  const structure = data;
  if (!structure || structure.atoms.length === 0) {
    status.textContent = structure ? 'This spec has no atoms yet.' : '';
    viewer.render();
    return;
  }
  const model = viewer.addModel();
  rotation = orientation(structure);
  model.addAtoms(structure.atoms.map((atom): AtomSpec => ({ elem: atom.element, ...point(atom), serial: atom.index, index: atom.index, color: colourOf(atom) })));
  model.setStyle({}, { sphere: { scale: ATOM_SCALE } });
  if (highlightedFragment !== null) {
    const inFragment = (atom: AtomSpec) => typeof atom.serial === 'number' && structure.atoms[atom.serial]?.fragment === highlightedFragment;
    model.setStyle({ predicate: inFragment }, { sphere: { scale: HIGHLIGHTED_SCALE } });
  }
  if (highlightedAtom !== null && highlightedAtom < structure.atoms.length) {
    viewer.addSphere({ center: point(structure.atoms[highlightedAtom]!), radius: 0.75, color: HIGHLIGHT_RING, opacity: 0.35 });
  }
  model.setClickable({}, true, (atom: AtomSpec) => {
    if (typeof atom.serial === 'number') send({ type: 'revealAtom', atom: atom.serial });
  });
  model.setHoverable(
    {},
    true,
    (atom: AtomSpec) => {
      const hovered = typeof atom.serial === 'number' ? structure.atoms[atom.serial] : undefined;
      if (hovered) status.textContent = describe(hovered);
    },
    () => {
      status.textContent = '';
    },
  );
  drawBonds(structure);
  drawCaps(structure);
  drawScan(structure);
  drawLabels(structure);
  if (fit) frame();
  else viewer.setView(view);
  viewer.render();
}

/**
 * Frames the whole structure with a margin. The viewer fits the height; in a view narrower than
 * it is tall, zoom out by the aspect ratio so that the width fits too.
 */
function frame(): void {
  viewer.zoomTo();
  const aspect = container.clientHeight > 0 ? container.clientWidth / container.clientHeight : 1;
  viewer.zoom(0.95 * Math.min(1, aspect));
  framed = true;
}

function fillKey(structure: ViewStructure): void {
  const list = element<HTMLUListElement>('fragments');
  list.replaceChildren();
  structure.fragments.forEach((fragment, index) => {
    const item = document.createElement('li');
    item.dataset['fragment'] = String(index);
    item.tabIndex = 0;
    item.title = `Go to fragment ${fragment.name}`;
    item.setAttribute('aria-current', String(index === highlightedFragment));
    const chip = document.createElement('span');
    chip.className = 'chip';
    chip.style.backgroundColor = fragment.colour;
    const name = document.createElement('span');
    name.className = 'name';
    name.textContent = fragment.name;
    const cost = document.createElement('span');
    cost.className = 'cost';
    cost.textContent = fragment.cost;
    const tier = document.createElement('span');
    tier.className = 'tier';
    tier.textContent = `${fragment.tier ?? 'no tier'} · ${fragment.atoms} atom${fragment.atoms === 1 ? '' : 's'}`;
    item.append(chip, name, cost, tier);
    const reveal = () => send({ type: 'revealFragment', fragment: index });
    item.addEventListener('click', reveal);
    item.addEventListener('keydown', (event) => {
      if (event.key === 'Enter' || event.key === ' ') {
        event.preventDefault();
        reveal();
      }
    });
    list.append(item);
  });
  if (structure.fragments.length === 0) {
    const item = document.createElement('li');
    item.textContent = 'No fragments yet.';
    list.append(item);
  }
  element('unassigned-dot').style.backgroundColor = structure.unassignedColour;
  element('mark-unassigned').hidden = !structure.atoms.some((atom) => atom.fragment < 0);
  element('mark-cut').hidden = !structure.bonds.some((bond) => bond.cut);
  element('mark-cap').hidden = structure.caps.length === 0;
}

function markKey(): void {
  for (const item of element('fragments').querySelectorAll<HTMLLIElement>('li[data-fragment]')) {
    item.setAttribute('aria-current', String(Number(item.dataset['fragment']) === highlightedFragment));
  }
}

receive(checkStructureHostMessage, (message) => {
  switch (message.type) {
    case 'structure': {
      const previous = data;
      data = message.data;
      if (highlightedFragment !== null && highlightedFragment >= data.fragments.length) highlightedFragment = null;
      if (highlightedAtom !== null && highlightedAtom >= data.atoms.length) highlightedAtom = null;
      element('title').textContent = message.title;
      fillKey(data);
      status.textContent = '';
      // A different structure (other spec, atoms added or removed) is framed anew.
      draw(!previous || previous.atoms.length !== data.atoms.length || previous.spec !== data.spec);
      break;
    }
    case 'highlight': {
      const fragment = data && message.fragment !== null && message.fragment < data.fragments.length ? message.fragment : null;
      const atom = data && message.atom !== null && message.atom < data.atoms.length ? message.atom : null;
      if (fragment === highlightedFragment && atom === highlightedAtom) break;
      highlightedFragment = fragment;
      highlightedAtom = atom;
      markKey();
      draw(false);
      break;
    }
    case 'unavailable':
      data = null;
      element('fragments').replaceChildren();
      draw(false);
      status.textContent = message.message;
      break;
  }
});

labelsToggle.addEventListener('change', () => {
  if (!data) return;
  drawLabels(data);
  viewer.render();
});
element('fit').addEventListener('click', () => {
  frame();
  viewer.render();
});
// Turning or zooming by hand: later resizes keep the camera.
for (const event of ['pointerdown', 'wheel']) container.addEventListener(event, () => (framed = false), { capture: true, passive: true });
new ResizeObserver(() => {
  viewer.resize();
  if (framed && data) frame();
  viewer.render();
}).observe(container);

send({ type: 'ready' });
