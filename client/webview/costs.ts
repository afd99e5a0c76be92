/**
 * The cost panel's script: shows the three charts the extension sends (checked SVG, parsed as
 * XML, never as HTML), the fragment selector of the growth chart, and the export buttons. SVG
 * export asks the extension to save the chart it holds; PNG export draws the chart onto a canvas
 * here and sends the image, which the extension checks and saves.
 */
import { checkCostsHostMessage, PLOTS, type CostsViewMessage, type PlotName, type ViewCosts } from '../src/views/protocol';
import { element, post, receive } from './host';

/** PNG pixels per SVG unit: sharp on high-density screens and in documents. */
const PNG_SCALE = 2;

const send = (message: CostsViewMessage) => post(message);
const select = element<HTMLSelectElement>('fragment');
const message = element<HTMLDivElement>('message');
const plots = element<HTMLElement>('plots');

let costs: ViewCosts | null = null;

/** An SVG document's root element, parsed as XML and adopted into this page. */
function parseSvg(text: string): SVGSVGElement | null {
  const parsed = new DOMParser().parseFromString(text, 'image/svg+xml');
  const root = parsed.documentElement;
  if (parsed.getElementsByTagName('parsererror').length > 0 || root.namespaceURI !== 'http://www.w3.org/2000/svg' || root.localName !== 'svg') return null;
  return document.importNode(root, true) as unknown as SVGSVGElement;
}

function show(data: ViewCosts): void {
  for (const plot of PLOTS) {
    const figure = element(`plot-${plot}`);
    const svg = parseSvg(data.svg[plot]);
    if (svg) figure.replaceChildren(svg);
    else figure.textContent = 'This chart could not be read.';
  }
  select.replaceChildren(
    ...data.fragments.map((fragment) => {
      const option = document.createElement('option');
      option.value = String(fragment.index);
      option.textContent = fragment.name;
      option.selected = fragment.index === data.selected;
      return option;
    }),
  );
  select.disabled = data.fragments.length === 0;
}

/** Draws an SVG chart on a canvas and returns it as a PNG data URL. */
function rasterise(svgText: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const root = new DOMParser().parseFromString(svgText, 'image/svg+xml').documentElement;
    const width = Number(root.getAttribute('width'));
    const height = Number(root.getAttribute('height'));
    if (!(width > 0 && height > 0)) {
      reject(new Error('the chart has no size'));
      return;
    }
    const url = URL.createObjectURL(new Blob([svgText], { type: 'image/svg+xml' }));
    const image = new Image();
    image.onload = () => {
      try {
        const canvas = document.createElement('canvas');
        canvas.width = Math.round(width * PNG_SCALE);
        canvas.height = Math.round(height * PNG_SCALE);
        const context = canvas.getContext('2d');
        if (!context) throw new Error('no 2D canvas');
        context.fillStyle = '#ffffff';
        context.fillRect(0, 0, canvas.width, canvas.height);
        context.drawImage(image, 0, 0, canvas.width, canvas.height);
        resolve(canvas.toDataURL('image/png'));
      } catch (error) {
        reject(error instanceof Error ? error : new Error(String(error)));
      } finally {
        URL.revokeObjectURL(url);
      }
    };
    image.onerror = () => {
      URL.revokeObjectURL(url);
      reject(new Error('the chart could not be drawn'));
    };
    image.src = url;
  });
}

receive(checkCostsHostMessage, (incoming) => {
  if (incoming.type === 'unavailable') {
    costs = null;
    message.textContent = incoming.message;
    message.hidden = false;
    plots.hidden = true;
    return;
  }
  costs = incoming.data;
  element('title').textContent = incoming.title;
  message.hidden = true;
  plots.hidden = false;
  show(costs);
});

select.addEventListener('change', () => {
  const fragment = Number(select.value);
  if (Number.isInteger(fragment)) send({ type: 'selectFragment', fragment });
});

for (const button of document.querySelectorAll<HTMLButtonElement>('button[data-export]')) {
  button.addEventListener('click', () => {
    const plot = button.closest<HTMLElement>('[data-plot]')?.dataset['plot'] as PlotName | undefined;
    if (!plot || !costs || !(PLOTS as readonly string[]).includes(plot)) return;
    if (button.dataset['export'] === 'svg') {
      send({ type: 'exportSvg', plot });
      return;
    }
    button.disabled = true;
    rasterise(costs.svg[plot])
      .then((dataUrl) => send({ type: 'exportPng', plot, dataUrl }))
      .catch((error: Error) => {
        message.textContent = `PNG export failed: ${error.message}`;
        message.hidden = false;
      })
      .finally(() => {
        button.disabled = false;
      });
  });
}

send({ type: 'ready' });
