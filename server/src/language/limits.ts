/**
 * The supported size of a spec. Within it, analysis stays fast and small enough for an editor
 * (measured in DEVELOPERS.md, "Supported size"); beyond it a spec is refused with one
 * `spec-too-large` diagnostic that states these numbers, and an included file beyond the byte
 * limit is not read.
 */
import { formatBytes } from '../chemistry/cost/format';
import { magnitudeOfNumber } from '../chemistry/cost/magnitude';

/** Characters of spec text (8 MiB of ASCII), and bytes of any file Tessera reads (spec or XYZ). */
export const MAX_SPEC_CHARACTERS = 8 * 1024 * 1024;
export const MAX_FILE_BYTES = MAX_SPEC_CHARACTERS;
/** Atoms, inline or from an XYZ file. */
export const MAX_ATOMS = 100_000;
/**
 * Words (tokens) outside plain structure blocks, which the fast reader stores column-wise; every
 * other token costs a parser object. A 100,000-atom geometry the fast reader cannot take (labels
 * with a hyphen, say) is about 500,000 words.
 */
export const MAX_WORDS = 1_000_000;

/** The supported size in one phrase, for messages. */
export const SUPPORTED_SIZE = `${MAX_SPEC_CHARACTERS.toLocaleString('en-US')} characters (8 MiB), ${MAX_ATOMS.toLocaleString('en-US')} atoms and ${MAX_WORDS.toLocaleString('en-US')} words outside plain structure blocks`;

/** A size in bytes as people read it: "1.00 GiB". */
export function byteSize(bytes: number): string {
  return formatBytes(magnitudeOfNumber(Math.round(bytes)));
}

/**
 * An upper estimate of the tokens of a text: runs of characters between blanks, with `{`, `}`,
 * `;` and `=` each counted on their own. Linear, and far cheaper than lexing.
 */
export function countWords(text: string, from = 0, to = text.length): number {
  let words = 0;
  let inWord = false;
  for (let i = from; i < to; i++) {
    const code = text.charCodeAt(i);
    if (code === 123 || code === 125 || code === 59 || code === 61) {
      words++;
      inWord = false;
    } else if (code === 32 || code === 9 || code === 10 || code === 13 || code === 12 || code === 11) {
      inWord = false;
    } else if (!inWord) {
      words++;
      inWord = true;
    }
  }
  return words;
}
