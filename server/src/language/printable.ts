/**
 * Text from a spec made safe to show: control characters written as visible escapes, and very
 * long runs of quoted text shortened. Every diagnostic message passes through `safeMessage`; the
 * renderers and the command line use `escapeControl` for whatever else reaches a terminal, a file
 * or an editor panel.
 *
 * Escaped: C0 controls (U+0000–U+001F; tab, line feed and carriage return too unless kept), DEL
 * (U+007F), C1 controls (U+0080–U+009F), and the characters that reorder or hide the text around
 * them: bidirectional marks, embeddings, overrides and isolates (U+061C, U+200E, U+200F,
 * U+202A–U+202E, U+2066–U+2069), the line and paragraph separators (U+2028, U+2029) and the byte
 * order mark (U+FEFF). ESC (U+001B) is written `\x1b`, U+202E `\u202e`.
 */

const CONTROL = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028-\u202e\u2066-\u2069\ufeff]/g;
const CONTROL_EXCEPT_LINES = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028-\u202e\u2066-\u2069\ufeff]/g;

function escapeOne(character: string): string {
  const code = character.charCodeAt(0);
  return code <= 0xff ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16).padStart(4, '0')}`;
}

/** The text with every control character escaped; `keepLineFeeds` leaves `\n` alone (multi-line output). */
export function escapeControl(text: string, keepLineFeeds = false): string {
  return text.replace(keepLineFeeds ? CONTROL_EXCEPT_LINES : CONTROL, escapeOne);
}

/** Whether the text holds a character escapeControl would escape. */
export function hasControl(text: string): boolean {
  CONTROL.lastIndex = 0;
  const found = CONTROL.test(text);
  CONTROL.lastIndex = 0;
  return found;
}

function isHighSurrogate(code: number): boolean {
  return code >= 0xd800 && code <= 0xdbff;
}

/** Runs of non-space characters longer than this are shortened in messages. */
export const MAX_QUOTED_RUN = 80;
/** No message is longer than this; the rest is cut with a note. */
export const MAX_MESSAGE_LENGTH = 2000;

/**
 * Shortens every run of non-space characters longer than MAX_QUOTED_RUN (a quoted token of a
 * hostile spec: a 10 MB word, number or string) to its head and tail around `…`, saying how long it
 * was, so that the message keeps its quotes and its words around the quote.
 */
export function shortenRuns(text: string, limit = MAX_QUOTED_RUN): string {
  let out = '';
  let from = 0;
  const length = text.length;
  let i = 0;
  while (i < length) {
    if (text.charCodeAt(i) === 32) {
      i++;
      continue;
    }
    let end = i;
    while (end < length && text.charCodeAt(end) !== 32) end++;
    if (end - i > limit) {
      let headEnd = i + Math.floor(limit * 0.6);
      let tailStart = end - Math.floor(limit * 0.2);
      // Never cut a surrogate pair in two.
      if (isHighSurrogate(text.charCodeAt(headEnd - 1))) headEnd--;
      if (isHighSurrogate(text.charCodeAt(tailStart - 1))) tailStart++;
      out += `${text.slice(from, headEnd)}…${text.slice(tailStart, end)} (${(end - i).toLocaleString('en-US')} characters)`;
      from = end;
    }
    i = end;
  }
  return from === 0 ? text : out + text.slice(from);
}

/** A diagnostic message made safe to show anywhere: controls escaped, long quotes shortened, length capped. */
export function safeMessage(message: string): string {
  let safe = escapeControl(message);
  if (safe.length > MAX_QUOTED_RUN) safe = shortenRuns(safe);
  if (safe.length > MAX_MESSAGE_LENGTH) safe = `${safe.slice(0, MAX_MESSAGE_LENGTH - 40)}… (message cut at ${MAX_MESSAGE_LENGTH} characters)`;
  return safe;
}

const TERMINAL_CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028-\u202e\u2066-\u2069\ufeff]/g;

/** For a terminal: every control character escaped except tab, line feed and a carriage return before a line feed. */
export function escapeForTerminal(text: string): string {
  return text.replace(/\r(?!\n)/g, '\\x0d').replace(TERMINAL_CONTROL, escapeOne);
}

const JSON_RAW = /[\u007f-\u009f\u061c\u200e\u200f\u2028-\u202e\u2066-\u2069\ufeff]/g;

/**
 * JSON.stringify, with the characters it leaves raw that a terminal or an editor acts on (DEL, C1,
 * bidirectional and separator characters) written as \uXXXX escapes: the same JSON value, safe to print.
 */
export function safeJsonStringify(value: unknown, space?: number): string {
  return JSON.stringify(value, null, space).replace(JSON_RAW, (character) => `\\u${character.charCodeAt(0).toString(16).padStart(4, '0')}`);
}
