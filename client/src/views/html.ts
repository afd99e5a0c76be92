/**
 * The HTML page of each webview: a strict content-security policy with a fresh nonce, the page's
 * skeleton and styles, and (for the structure and cost views) one script from the extension's own
 * folder; the report panel's page is here too. The extension and the
 * headless-browser test use this same function; the script fills the page from messages.
 */
import { randomBytes } from 'node:crypto';

export type ViewKind = 'structure' | 'costs' | 'levels';

export interface ViewPageOptions {
  kind: ViewKind;
  /** The webview's `cspSource`: the origin its local resources are served from. */
  cspSource: string;
  /** URL of the view's script, under the extension's dist/webview folder. */
  scriptUri: string;
  nonce: string;
  title: string;
}

/** A nonce for one page: 24 random bytes, base64 (never reused across pages). */
export function makeNonce(): string {
  return randomBytes(24).toString('base64');
}

/**
 * Nothing by default; scripts only with the page's nonce or from the extension's folder (no
 * inline handlers, no eval); styles from the page's nonce'd block or the extension's folder;
 * images from the extension's folder, data: and blob: URLs (the PNG export draws the chart
 * through one).
 */
export function contentSecurityPolicy(cspSource: string, nonce: string): string {
  return [
    "default-src 'none'",
    `script-src 'nonce-${nonce}' ${cspSource}`,
    `style-src ${cspSource} 'nonce-${nonce}'`,
    `img-src ${cspSource} data: blob:`,
  ].join('; ');
}

/**
 * Rendered Markdown without inline `style` attributes, which the report page's policy refuses
 * (each one is a CSP error and its effect is lost): the renderer's column alignment
 * (`style="text-align:right"` on table cells, from a `---:` rule) becomes a class of the page's
 * stylesheet (`ts-right`, `ts-center`, `ts-left`), and any other inline style is dropped.
 */
export function withoutInlineStyles(html: string): string {
  return html
    .replace(/<(td|th)\b([^>]*?)\sstyle="\s*text-align:\s*(left|center|right)\s*;?\s*"([^>]*)>/gi, (_, tag: string, before: string, side: string, after: string) => `<${tag}${before} class="ts-${side.toLowerCase()}"${after}>`)
    .replace(/(<[a-z][^>]*?)\sstyle="[^"]*"/gi, '$1');
}

/**
 * The report panel: Markdown already rendered to HTML by the extension, no script at all; styles
 * only from its nonce'd block, images from the extension's folder and data: URLs. Inline styles
 * in the body become classes or go (`withoutInlineStyles`).
 */
export function reportPageHtml(cspSource: string, nonce: string, body: string): string {
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src ${cspSource} 'nonce-${nonce}'; img-src ${cspSource} data:;">
<meta name="viewport" content="width=device-width, initial-scale=1">
<style nonce="${nonce}">
body { font-family: var(--vscode-font-family); font-size: var(--vscode-font-size); color: var(--vscode-foreground); padding: 0 1.5em; }
table { border-collapse: collapse; margin: 0.5em 0 1.2em; }
th, td { border: 1px solid var(--vscode-panel-border, #8884); padding: 0.2em 0.6em; }
td { font-variant-numeric: tabular-nums; }
.ts-right { text-align: right; }
.ts-center { text-align: center; }
.ts-left { text-align: left; }
blockquote { border-left: 3px solid var(--vscode-textLink-foreground); margin: 0.5em 0; padding-left: 0.8em; }
code { font-family: var(--vscode-editor-font-family); }
.ts-chart { margin: 0.5em 0 1.2em; } .ts-chart svg { max-width: 100%; height: auto; }
</style></head><body>${withoutInlineStyles(body)}</body></html>`;
}

function escapeHtml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

const NOTE = 'Planning estimates from counting rules, not results of a calculation.';

/** Shared look: the editor's theme colours where VS Code provides them, sober fallbacks elsewhere. */
const BASE_STYLE = `
:root { color-scheme: light dark; --ts-border: var(--vscode-panel-border, #8885); --ts-muted: var(--vscode-descriptionForeground, #777); --ts-accent: var(--vscode-focusBorder, #3b7bd6); }
* { box-sizing: border-box; }
body { margin: 0; font-family: var(--vscode-font-family, system-ui, sans-serif); font-size: var(--vscode-font-size, 13px); color: var(--vscode-foreground, #222); background: var(--vscode-editor-background, #fff); }
.ts-head { display: flex; align-items: center; gap: 0.8em; padding: 0.5em 0.9em; border-bottom: 1px solid var(--ts-border); flex-wrap: wrap; }
.ts-head h1 { font-size: 1.05em; font-weight: 600; margin: 0; margin-right: auto; letter-spacing: 0.01em; }
.ts-note { color: var(--ts-muted); font-size: 0.9em; margin: 0; }
.ts-status { color: var(--ts-muted); font-size: 0.9em; min-height: 1.3em; padding: 0.3em 0.9em; }
.ts-message { padding: 2em 1em; color: var(--ts-muted); }
button, select { font: inherit; color: var(--vscode-button-secondaryForeground, inherit); background: var(--vscode-button-secondaryBackground, #e8e8e8); border: 1px solid var(--ts-border); border-radius: 3px; padding: 0.15em 0.6em; cursor: pointer; }
select { color: var(--vscode-dropdown-foreground, inherit); background: var(--vscode-dropdown-background, #fff); }
button:focus-visible, select:focus-visible, input:focus-visible, li:focus-visible { outline: 1px solid var(--ts-accent); outline-offset: 1px; }
[hidden] { display: none !important; }
`;

const STRUCTURE_STYLE = `
body { height: 100vh; display: flex; flex-direction: column; overflow: hidden; }
.ts-stage { flex: 1; display: flex; min-height: 0; }
#viewer { flex: 1; position: relative; min-width: 0; background: #fbfaf6; }
#key { width: 15.5em; flex: none; overflow-y: auto; padding: 0.6em 0.8em; border-left: 1px solid var(--ts-border); }
#key h2 { font-size: 0.8em; text-transform: uppercase; letter-spacing: 0.06em; color: var(--ts-muted); margin: 0.6em 0 0.4em; font-weight: 600; }
#fragments { list-style: none; margin: 0; padding: 0; }
#fragments li { display: grid; grid-template-columns: 0.95em 1fr; column-gap: 0.55em; padding: 0.35em 0.4em; border-radius: 4px; cursor: pointer; border: 1px solid transparent; }
#fragments li[aria-current="true"] { border-color: var(--ts-accent); background: var(--vscode-list-inactiveSelectionBackground, #0001); }
#fragments .chip { width: 0.95em; height: 0.95em; border-radius: 50%; margin-top: 0.15em; border: 1px solid #0003; }
#fragments .name { font-weight: 600; overflow-wrap: anywhere; }
#fragments .cost { grid-column: 2; font-variant-numeric: tabular-nums; }
#fragments .tier { grid-column: 2; color: var(--ts-muted); font-size: 0.9em; }
#marks { list-style: none; margin: 0; padding: 0; }
#marks li { display: flex; align-items: center; gap: 0.55em; padding: 0.2em 0.4em; }
#marks .swatch { width: 1.6em; flex: none; }
#marks .dot { width: 0.95em; height: 0.95em; border-radius: 50%; border: 1px solid #0003; }
#marks .cap { width: 0.55em; height: 0.55em; margin-left: 0.2em; background: #9a9a9a; }
#marks .dash { height: 0; border-top: 3px dashed #1f1f1f; }
#marks .arrow { height: 0; border-top: 3px solid #6a3d9a; }
#scan-detail { margin: 0.3em 0.4em; font-variant-numeric: tabular-nums; }
label.ts-toggle { display: inline-flex; align-items: center; gap: 0.3em; cursor: pointer; }
@media (max-width: 720px) {
  .ts-stage { flex-direction: column; }
  #key { width: auto; max-height: 38%; border-left: 0; border-top: 1px solid var(--ts-border); }
  #fragments { display: grid; grid-template-columns: repeat(auto-fill, minmax(10em, 1fr)); gap: 0 0.4em; }
  #marks { display: flex; flex-wrap: wrap; }
}
`;

const COSTS_STYLE = `
main { padding: 0.4em 0.9em 1.5em; display: grid; gap: 1em; grid-template-columns: repeat(auto-fit, minmax(min(100%, 34em), 1fr)); }
.ts-plot { border: 1px solid var(--ts-border); border-radius: 6px; overflow: hidden; }
.ts-plot header { display: flex; align-items: center; gap: 0.5em; padding: 0.35em 0.6em; border-bottom: 1px solid var(--ts-border); flex-wrap: wrap; }
.ts-plot h2 { font-size: 0.95em; font-weight: 600; margin: 0; margin-right: auto; }
.ts-figure { background: #fff; line-height: 0; }
.ts-figure svg { width: 100%; height: auto; display: block; }
`;

const LEVELS_STYLE = `
main { padding: 0.6em 0.9em 1.5em; }
#picture { max-width: 60em; border: 1px solid var(--ts-border); border-radius: 6px; overflow: hidden; background: #fff; line-height: 0; }
#picture svg { width: 100%; height: auto; display: block; }
`;

const LEVELS_NOTE = 'Computed Hartree–Fock orbital energies of one part, not planning estimates.';

function levelsBody(): string {
  return `<header class="ts-head">
  <h1 id="title">Orbital levels</h1>
  <label for="part">Part</label> <select id="part"></select>
  <button type="button" id="export" title="Save the picture as SVG">SVG</button>
</header>
<div class="ts-message" id="message" hidden></div>
<main><div id="picture" role="img" aria-label="Orbital energy levels"></div></main>
<p class="ts-note ts-status" id="note">${escapeHtml(LEVELS_NOTE)}</p>`;
}

function structureBody(): string {
  return `<header class="ts-head">
  <h1 id="title">Structure</h1>
  <label class="ts-toggle"><input type="checkbox" id="labels"> Atom labels</label>
  <button type="button" id="fit" title="Fit the whole structure in view">Fit</button>
</header>
<div class="ts-stage">
  <div id="viewer" role="img" aria-label="3D structure coloured by fragment"></div>
  <aside id="key" aria-label="Key">
    <h2>Fragments</h2>
    <ul id="fragments"></ul>
    <h2>Marks</h2>
    <ul id="marks">
      <li id="mark-unassigned"><span class="swatch"><span class="dot" id="unassigned-dot"></span></span><span>in no fragment</span></li>
      <li id="mark-cut"><span class="swatch dash"></span><span>bond cut by a fragment boundary</span></li>
      <li id="mark-cap"><span class="swatch"><span class="dot cap"></span></span><span>hydrogen cap on a cut bond, in its fragment's colour</span></li>
      <li id="mark-scan"><span class="swatch arrow"></span><span>scanned coordinate (first to last atom)</span></li>
    </ul>
    <p id="scan-detail" hidden></p>
  </aside>
</div>
<div class="ts-status" id="status" aria-live="polite"></div>
<p class="ts-note ts-status" id="note">${escapeHtml(NOTE)} Click an atom to go to its line; a fragment in the key to go to its block.</p>`;
}

function costsBody(): string {
  const plot = (name: string, title: string, extra = '') => `<section class="ts-plot" data-plot="${name}" aria-label="${escapeHtml(title)}">
    <header><h2>${escapeHtml(title)}</h2>${extra}<button type="button" data-export="svg" title="Save this chart as SVG">SVG</button><button type="button" data-export="png" title="Save this chart as PNG">PNG</button></header>
    <div class="ts-figure" id="plot-${name}"></div>
  </section>`;
  return `<header class="ts-head">
  <h1 id="title">Cost plots</h1>
  <p class="ts-note" id="note">${escapeHtml(NOTE)}</p>
</header>
<div class="ts-message" id="message" hidden></div>
<main id="plots">
  ${plot('qubits', 'Qubits per fragment')}
  ${plot('growth', 'Growth with the active space', '<label for="fragment">Fragment</label> <select id="fragment"></select>')}
  ${plot('shots', 'Shots against active-space size (the fragment above)')}
  ${plot('scan', 'Along the scan')}
</main>`;
}

/** The whole page of a view. */
export function viewPage(options: ViewPageOptions): string {
  const { kind, cspSource, scriptUri, nonce, title } = options;
  const style = BASE_STYLE + (kind === 'structure' ? STRUCTURE_STYLE : kind === 'costs' ? COSTS_STYLE : LEVELS_STYLE);
  const body = kind === 'structure' ? structureBody() : kind === 'costs' ? costsBody() : levelsBody();
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${escapeHtml(contentSecurityPolicy(cspSource, nonce))}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style nonce="${escapeHtml(nonce)}">${style}</style>
</head><body data-view="${kind}">
${body}
<script nonce="${escapeHtml(nonce)}" src="${escapeHtml(scriptUri)}"></script>
</body></html>`;
}
