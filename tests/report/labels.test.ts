/**
 * The labels that carry a figure's convention, wherever a figure is shown (Markdown and text
 * reports, the figure table, hover, inlay hints): measurement groups name their spin-orbital order
 * and their heuristic and are never called exact; CCSD amplitude counts say how they are counted;
 * circuit figures say they are for the untapered Jordan–Wigner register, with depth a serial upper
 * estimate; QPE qubit counts say what they cover; scan figures are per point.
 *
 * The conventions themselves: qubit-wise commuting grouping by greedy colouring is a heuristic
 * (finding the minimum is graph colouring, NP-hard; Verteletskyi, Yen & Izmaylov, J. Chem. Phys.
 * 152, 124114 (2020)), and the count depends on the order of the spin orbitals (the strings
 * differ); closed-shell CCSD is usually counted in spin-adapted amplitudes, open-shell in spin
 * orbitals (common practice); a serial depth adds every gate's layer, an upper bound on any
 * schedule (by construction).
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument, type DocumentAnalysis } from '../../server/src/analysis';
import { scanTable } from '../../server/src/report/format/figures';
import { renderEstimateMarkdown, renderEstimateText } from '../../server/src/report/format/render';
import { doHover, getInlayHints } from '../../server/src/services';
import { WATER_LINES } from '../fixtures/water';

/** Water (Hoy & Bunker's structure, tests/fixtures/water.ts) with one quantum fragment. */
function water(basis: string, tier: string, extra = ''): DocumentAnalysis {
  return analyzeDocument(`basis ${basis}\nstructure {\n${WATER_LINES}\n}\nfragment w {\n  atoms rest\n  tier quantum { ${tier} }\n}\n${extra}`);
}

/** The hover on the last character of `word`'s first occurrence (a fragment's name: its card). */
function hoverOf(analysis: DocumentAnalysis, word: string): string {
  const offset = analysis.text.indexOf(word) + word.length - 1;
  const hover = doHover(analysis, analysis.lines.positionAt(offset));
  const contents = hover?.contents as { value: string } | undefined;
  if (!contents) throw new Error(`no hover on '${word}'`);
  return contents.value;
}

function row(card: string, name: string): string {
  const found = card.split('\n').find((line) => line.startsWith(`| ${name} |`));
  if (!found) throw new Error(`no '${name}' row in:\n${card}`);
  return found;
}

/** Every place a figure is shown in words. */
function renderings(analysis: DocumentAnalysis): string[] {
  const report = analysis.report();
  return [renderEstimateMarkdown(report, { level: 1, full: true }), renderEstimateText(report), hoverOf(analysis, 'fragment w'), ...getInlayHints(analysis).map((hint) => (typeof hint.label === 'string' ? hint.label : hint.label.map((part) => part.value).join('')))];
}

/** Lines that speak of measurement groups. */
function groupLines(text: string): string[] {
  return text.split('\n').filter((line) => /group/i.test(line));
}

describe('measurement groups', () => {
  // STO-3G water, all 7 orbitals: 14 qubits, grouped explicitly; cc-pVDZ 8e 10o: 20 qubits, extrapolated.
  const explicit = water('sto-3g', 'method vqe; frozen-core off');
  const extrapolated = water('cc-pvdz', 'method vqe; active 8e 10o');

  it('name their spin-orbital order and their heuristic in the hover, the figures and the conventions', () => {
    for (const analysis of [explicit, extrapolated]) {
      const measurement = row(hoverOf(analysis, 'fragment w'), 'measurement');
      expect(measurement).toMatch(/block (spin-orbital )?order/);
      expect(measurement).toMatch(/greedy/);
      const figures = analysis.report().fragments[0]!.measurement!;
      expect(figures.method).toMatch(/block (spin-orbital )?order/);
      expect(figures.method).toMatch(/greedy/);
      const markdown = renderEstimateMarkdown(analysis.report(), { level: 1 });
      expect(markdown).toMatch(/QWC groups \(greedy, block order\)/);
      expect(markdown).toMatch(/^- measurement: .*greedy colouring \(a heuristic, not the minimum\).*block spin-orbital order/m);
    }
    expect(row(hoverOf(explicit, 'fragment w'), 'measurement')).toMatch(/a heuristic, not the minimum/);
  });

  it('beyond the explicit limit say they are extrapolated, from which limit and which fitted range', () => {
    const measurement = row(hoverOf(extrapolated, 'fragment w'), 'measurement');
    expect(measurement).toMatch(/≈/);
    expect(measurement).toMatch(/extrapolated beyond 14 qubits/);
    expect(measurement).toMatch(/8–20 qubits/);
  });

  it('are never called exact, in any rendering', () => {
    for (const analysis of [explicit, extrapolated]) {
      const lines = renderings(analysis).flatMap(groupLines);
      expect(lines.length).toBeGreaterThan(3);
      for (const line of lines) expect(line).not.toMatch(/\bexact/i);
    }
  });
});

describe('CCSD amplitudes', () => {
  it('say how they are counted: spin-adapted for a closed shell, spin orbitals for an open shell', () => {
    const closed = water('sto-3g', 'method vqe; frozen-core off');
    // The water cation, a doublet (9 electrons): an open shell.
    const open = analyzeDocument(closed.text.replace('fragment w {', 'charge 1\nmultiplicity 2\nfragment w {\n  charge 1\n  multiplicity 2'));
    for (const [analysis, convention, short] of [
      [closed, 'spin-adapted, closed shell', 'spin-adapted'],
      [open, 'spin orbitals', 'spin orbitals'],
    ] as const) {
      expect(row(hoverOf(analysis, 'fragment w'), 'full CI')).toContain(`amplitudes (${convention})`);
      for (const text of [renderEstimateMarkdown(analysis.report(), { level: 1 }), renderEstimateText(analysis.report())]) {
        const lines = text.split('\n').filter((line) => /^\|? *w\b/.test(line) && /KiB|B\b/.test(line) && /\(spin/.test(line));
        expect(lines.length, text).toBeGreaterThan(0);
        for (const line of lines) expect(line).toContain(`(${short})`);
      }
    }
  });
});

describe('circuits', () => {
  it('are labelled as one Trotter step on the untapered Jordan–Wigner register, depth a serial upper estimate', () => {
    // Parity with tapering needs fewer qubits than the circuit's register: 2 × 7 = 14 qubits.
    const analysis = water('sto-3g', 'method vqe; frozen-core off; mapping parity; taper on');
    const fragment = analysis.report().fragments[0]!;
    expect(fragment.qubitsRequired).toBeLessThan(14);
    const circuit = row(hoverOf(analysis, 'fragment w'), 'circuit');
    expect(circuit).toContain('untapered Jordan–Wigner on 14 qubits');
    expect(circuit).toContain('(serial upper estimate)');
    for (const text of [renderEstimateMarkdown(analysis.report(), { level: 1 }), renderEstimateText(analysis.report())]) {
      expect(text).toMatch(/Ansatz and circuit \(one Trotter step on the untapered Jordan–Wigner register; depth a serial upper estimate\)/);
    }
  });
});

describe('QPE', () => {
  it('says the qubits needed are the system register only', () => {
    const analysis = water('sto-3g', 'method qpe; active 4e 4o');
    expect(row(hoverOf(analysis, 'fragment w'), 'qubits needed')).toContain('the system register only');
    const markdown = renderEstimateMarkdown(analysis.report(), { level: 1 });
    const line = markdown.split('\n').find((l) => l.startsWith('| w |') && l.includes('register'));
    expect(line, markdown).toContain('8 (system register only)');
  });
});

describe('scans', () => {
  const analysis = water('sto-3g', 'method vqe; active 4e 4o', 'scan distance o h1 from 0.9 to 1.3 step 0.1 moving h1\n');

  it('give the measurement circuits per point, not points × per point', () => {
    const report = analysis.report();
    const groups = report.fragments[0]!.measurement!.groups as number;
    expect(report.scan!.points).toBe(5); // 0.9, 1.0, …, 1.3 Å
    expect(report.scan!.totals.measurementCircuitsPerPoint).toBe(groups);
    const table = scanTable(report)!;
    const labels = table.rows.map((r) => r[0]!);
    expect(labels).toContain('measurement circuits per energy evaluation, at each point (the same at every point)');
    expect(table.rows.find((r) => r[1] === 'scan.totals.measurementCircuitsPerPoint')![2]).toBe(String(groups));
    for (const text of [renderEstimateMarkdown(report, { level: 1, full: true }), renderEstimateText(report)]) {
      expect(text).not.toMatch(/circuits (in all|over the scan)/);
      expect(text).toMatch(/at each point 1 fragment calculations? and \d+ measurement circuits per energy evaluation/);
    }
  });
});
