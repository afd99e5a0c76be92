/**
 * Text from a spec (its name, fragment names, labels, basis names, diagnostic messages) made safe
 * for each output format. Control and reordering characters become visible escapes first
 * (language/printable.ts), then:
 *
 * - Markdown: a backslash before every character that opens or closes inline markup (backslash,
 *   code, emphasis, links, HTML, tables, strikethrough), so a spec named `<img src=x>` or
 *   `*bold*` shows as written, in the CLI report and in the editor's report panel alike.
 * - HTML and SVG: the five characters that can break out of text or an attribute.
 * - CSV: a field that a spreadsheet would read as a formula (starting with `=`, `+`, `-`, `@`, a tab
 *   or a carriage return, and not a plain number) gets a leading `'`, as the OWASP advice on CSV
 *   injection suggests; then RFC 4180 quoting.
 */
import { escapeControl } from '../../language/printable';

const MARKDOWN_SPECIAL = /[\\`*_[\]<>&|~]/g;

/** Text for Markdown: shows as written, never as markup. */
export function markdownText(text: string): string {
  return escapeControl(text).replace(MARKDOWN_SPECIAL, (character) => `\\${character}`);
}

/** Text for HTML or SVG, in an element or a quoted attribute. */
export function escapeHtml(text: string): string {
  return escapeControl(text).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

const PLAIN_NUMBER = /^[+-]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?$/;
const FORMULA_START = /^[=+\-@\t\r]/;

/** One CSV field: formulas defused, quoted when RFC 4180 requires it. */
export function csvField(raw: string): string {
  let text = escapeControl(raw);
  if (FORMULA_START.test(text) && !PLAIN_NUMBER.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** Text for a plain one-line field (an XYZ comment line, a text table). */
export function plainText(text: string): string {
  return escapeControl(text);
}
