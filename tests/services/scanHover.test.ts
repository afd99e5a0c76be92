/**
 * The hover card of a scan: the coordinate with its atoms, the values in scan order with their unit
 * (Å or degrees) and the atoms that move. Values by construction of the ranges written.
 */
import { describe, expect, it } from 'vitest';
import { doHover } from '../../server/src/services';
import { markdownOf, marked } from './service';

const WATER = `basis sto-3g
structure {
  O  o    0.000000   0.000000   0.000000
  H  h1   0.000000   0.756950   0.585882
  H  h2   0.000000  -0.756950   0.585882
}
fragment w { atoms rest; tier mean-field { method rhf } }
`;

function hover(text: string): string {
  const m = marked(text);
  const found = doHover(m.analysis, m.cursor);
  if (!found) throw new Error('no hover');
  return markdownOf(found.contents);
}

describe('the scan card', () => {
  it('names an angle scan with its vertex and lists the points in degrees, in scan order', () => {
    const card = hover(`${WATER}sc$0an angle h1 o h2 from 120 to 100 step -5\n`);
    expect(card).toContain('**Scan of the angle h1–o–h2 (vertex o)** · 5 points, in scan order');
    expect(card).toContain('120°, 115°, 110°, 105°, 100°');
    expect(card).toContain('Moving (turned about the vertex, in the plane of the three atoms, by default): h2');
  });

  it('lists a distance scan in ångström and the atoms `moving` names', () => {
    const card = hover(`${WATER}sc$0an distance o h2 from 0.9 to 1.1 step 0.1 moving h2\n`);
    expect(card).toContain('0.9 Å, 1 Å, 1.1 Å');
    expect(card).toContain('as `moving` names them): h2');
  });

  it('shows the ends of a long scan', () => {
    const card = hover(`${WATER}sc$0an angle h1 o h2 from 60 to 180 step 5\n`);
    expect(card).toContain('60°, 65°, 70°, 75°, 80°, 85°, …, 155°, 160°, 165°, 170°, 175°, 180°');
  });
});
