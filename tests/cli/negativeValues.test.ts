/** Negative numbers as option values (`--charge -1`), joined before node:util's parseArgs reads them. */
import { describe, expect, it } from 'vitest';
import { joinNegativeValues } from '../../server/src/cli/negativeValues';

const OPTIONS = { charge: { type: 'string' }, 'frozen-core': { type: 'boolean' } } as const;

describe('negative option values', () => {
  it('joins a string option with the negative number after it', () => {
    expect(joinNegativeValues(['--charge', '-1', 'a.tess'], OPTIONS)).toEqual(['--charge=-1', 'a.tess']);
    expect(joinNegativeValues(['--charge', '-0.5e1'], OPTIONS)).toEqual(['--charge=-0.5e1']);
  });
  it('leaves options, words and boolean switches alone', () => {
    expect(joinNegativeValues(['--charge', '-h'], OPTIONS)).toEqual(['--charge', '-h']);
    expect(joinNegativeValues(['--frozen-core', '-1'], OPTIONS)).toEqual(['--frozen-core', '-1']);
    expect(joinNegativeValues(['--charge=-2'], OPTIONS)).toEqual(['--charge=-2']);
  });
});
