/**
 * The server and the views agree on what the views accept: the same numbers on both sides, long
 * names shortened by the server so that the view's checks pass, and a spec beyond a count answered
 * with a reason the view shows, with the numbers, instead of data it would drop.
 */
import { describe, expect, it } from 'vitest';
import { checkCosts, checkStructure, unavailableReason, VIEW_LIMITS as CLIENT_LIMITS } from '../../client/src/views/protocol';
import { analyzeDocument } from '../../server/src/analysis';
import { MAX_STORED_BONDS } from '../../server/src/chemistry/geometry';
import { MAX_ATOMS } from '../../server/src/language/limits';
import { MAX_SCAN_POINTS } from '../../server/src/language/model';
import { costsAnswer, structureAnswer, VIEW_LIMITS as SERVER_LIMITS } from '../../server/src/services';
import { WATER_H_Y, WATER_H_Z } from '../fixtures/water';

describe('one set of limits', () => {
  it('the server and the client state the same numbers', () => {
    expect(SERVER_LIMITS).toEqual(CLIENT_LIMITS);
  });

  it('the analysis never sends more atoms, bonds or scan points than the views take', () => {
    expect(MAX_ATOMS).toBeLessThanOrEqual(SERVER_LIMITS.atoms);
    expect(MAX_STORED_BONDS).toBeLessThanOrEqual(SERVER_LIMITS.bonds);
    expect(MAX_SCAN_POINTS).toBeLessThanOrEqual(SERVER_LIMITS.scanPoints);
  });
});

describe('long names are shortened, not dropped', () => {
  const label = `h${'x'.repeat(149)}`;
  const name = `f${'y'.repeat(299)}`;
  const spec = `spec "${'s'.repeat(1500)}"\nbasis sto-3g\nstructure {\n  O o 0 0 0\n  H ${label} 0 ${WATER_H_Y} ${WATER_H_Z}\n  H h2 0 -${WATER_H_Y} ${WATER_H_Z}\n}\nfragment ${name} { atoms rest; tier quantum { active 4e 4o } }\n`;
  const analysis = analyzeDocument(spec);

  it('the structure passes the view checks, with the label, the name and the spec name cut at the limits', () => {
    const answer = JSON.parse(JSON.stringify(structureAnswer(analysis)));
    const checked = checkStructure(answer);
    expect(checked.ok ? 'ok' : checked.reason).toBe('ok');
    expect(answer.atoms[1].label).toHaveLength(SERVER_LIMITS.label);
    expect(answer.atoms[1].label.endsWith('…')).toBe(true);
    expect(answer.fragments[0].name).toHaveLength(SERVER_LIMITS.fragmentName);
    expect(answer.spec).toHaveLength(SERVER_LIMITS.text);
  });

  it('the cost plots pass the panel checks', () => {
    const checked = checkCosts(JSON.parse(JSON.stringify(costsAnswer(analysis))));
    expect(checked.ok ? 'ok' : checked.reason).toBe('ok');
  });

  it('a label the server did not shorten is refused with the numbers', () => {
    const answer = JSON.parse(JSON.stringify(structureAnswer(analysis)));
    answer.atoms[1].label = label;
    const checked = checkStructure(answer);
    expect(checked.ok ? 'ok' : checked.reason).toBe('the label of atom #2 has 150 characters, more than the 100 the view accepts');
  });
});

describe('beyond a count', () => {
  it('10,001 fragments: both views answer why, and the view reads the reason', () => {
    const fragments = Array.from({ length: 10_001 }, (_, i) => `fragment f${i} { atoms #1 }`).join('\n');
    const analysis = analyzeDocument(`basis sto-3g\nstructure {\n  H 0 0 0\n}\n${fragments}\n`);
    const structure = structureAnswer(analysis);
    expect(unavailableReason(JSON.parse(JSON.stringify(structure)))).toBe('This spec is too large for the structure view: 10,001 fragments, more than the 10,000 the view shows.');
    expect(unavailableReason(JSON.parse(JSON.stringify(costsAnswer(analysis))))).toBe('This spec is too large for the cost plots: 10,001 fragments, more than the 10,000 the view shows.');
    expect(unavailableReason({ atoms: [] })).toBeUndefined();
  });
});
