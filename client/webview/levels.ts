/**
 * The orbital-level view's script: shows the level picture the extension sends (checked SVG,
 * parsed as XML, never as HTML), the part selector, and the SVG export button, which asks the
 * extension to save the picture it holds.
 */
import { checkLevelsHostMessage, type LevelsViewMessage, type PartId, type ViewLevels } from '../src/views/protocol';
import { element, post, receive } from './host';

const send = (message: LevelsViewMessage) => post(message);
const select = element<HTMLSelectElement>('part');
const message = element<HTMLDivElement>('message');
const picture = element<HTMLDivElement>('picture');
const exportButton = element<HTMLButtonElement>('export');

function parseSvg(text: string): SVGSVGElement | null {
  const parsed = new DOMParser().parseFromString(text, 'image/svg+xml');
  const root = parsed.documentElement;
  if (parsed.getElementsByTagName('parsererror').length > 0 || root.namespaceURI !== 'http://www.w3.org/2000/svg' || root.localName !== 'svg') return null;
  return document.importNode(root, true) as unknown as SVGSVGElement;
}

function idText(id: PartId): string {
  return id === 'system' ? 'system' : String(id);
}

function show(data: ViewLevels): void {
  select.replaceChildren(
    ...data.parts.map((part) => {
      const option = document.createElement('option');
      option.value = idText(part.id);
      option.textContent = `${part.label} (${part.state})`;
      option.selected = part.id === data.selected;
      return option;
    }),
  );
  select.disabled = data.parts.length === 0;
  element('note').textContent = data.note;
  const svg = data.svg ? parseSvg(data.svg) : null;
  exportButton.disabled = svg === null;
  if (svg) {
    picture.replaceChildren(svg);
    picture.hidden = false;
    message.hidden = true;
  } else {
    picture.replaceChildren();
    picture.hidden = true;
    message.textContent = data.message ?? 'This picture could not be read.';
    message.hidden = false;
  }
}

receive(checkLevelsHostMessage, (incoming) => {
  if (incoming.type === 'unavailable') {
    message.textContent = incoming.message;
    message.hidden = false;
    picture.hidden = true;
    exportButton.disabled = true;
    return;
  }
  element('title').textContent = incoming.title;
  show(incoming.data);
});

select.addEventListener('change', () => {
  const value = select.value;
  const part: PartId | null = value === 'system' ? 'system' : /^\d+$/.test(value) ? Number(value) : null;
  if (part !== null) send({ type: 'selectPart', part });
});

exportButton.addEventListener('click', () => send({ type: 'exportSvg' }));

send({ type: 'ready' });
