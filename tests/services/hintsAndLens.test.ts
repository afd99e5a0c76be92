/**
 * Inlay hints after fragment names and the code lens with the totals of the spec. Electron counts
 * add up atomic numbers (IUPAC periodic table); frozen cores are the noble-gas cores (common practice).
 */
import { describe, expect, it } from 'vitest';
import { InlayHintKind } from 'vscode-languageserver-types';
import { analyzeDocument } from '../../server/src/analysis';
import { getCodeLenses, getInlayHints, largestQubitCount } from '../../server/src/services';
import { positionOf, readSample } from './service';

const zinc = analyzeDocument(readSample('zn-site-h2s-scan.tess'));

describe('inlay hints', () => {
  it('after each fragment name: qubits for a quantum tier, the solver\'s time and memory for a classical one, the DMET impurity', () => {
    const hints = getInlayHints(zinc);
    expect(hints.map((hint) => [hint.position, hint.label])).toEqual([
      // site: active 10e 10o under Jordan–Wigner, 2 × 10 = 20 qubits. Under DMET the site keeps only
      // the operations of the C1 system that map it onto itself, C1 (group theory: a subgroup of C1),
      // so tapering removes only N_α and N_β parity (Bravyi et al. 2017): 18. Its impurity: 65
      // orbitals outside the frozen core and as many bath orbitals (Knizia & Chan 2012).
      [positionOf(zinc, 'fragment site', 13), '20 qubits · 18 tapered · impurity 70e 130o'],
      // guest, CCSD(T) on its DMET impurity of 46e 46o: o = v = 23. Per CCSD iteration
      // 2(o²v⁴ + 2o³v³ + o⁴v²) = 8 × 23⁶ ≈ 1.18 × 10⁹ flops, 20 iterations, plus 2·o³v⁴ = 2 × 23⁷
      // for (T) (Raghavachari et al. 1989): 3.05 × 10¹⁰ flops, 0.3 s at the assumed 100 Gflops.
      // Memory v⁴/2 + o·v³ + 3·o²v² + v³ doubles = 1,271,452 × 8 B = 9.70 MiB.
      [positionOf(zinc, 'fragment guest', 14), 'ccsd(t) under a second · 9.70 MiB · impurity 46e 46o'],
      // frame, two formates HCOO in def2-SVP: (2 × 14 for O + 14 for C + 5 for H) × 2 = 94 basis
      // functions (tests/fixtures/basis-counts.nwchem.json). Direct RHF memory 20 N² doubles =
      // 20 × 94² × 8 B = 1,413,760 B = 1.35 MiB (common practice: a few N² matrices per density).
      [positionOf(zinc, 'fragment frame', 14), 'rhf under a second · 1.35 MiB'],
    ]);
    for (const hint of hints) {
      expect(hint.kind).toBe(InlayHintKind.Type);
      expect(hint.paddingLeft).toBe(true);
    }
  });

  it('explain the hint in its tooltip', () => {
    const [site, guest] = getInlayHints(zinc);
    expect(site!.tooltip).toBe('quantum: 10e 10o active, jordan-wigner. Planning estimate.');
    // The correlated guest under `embedding dmet`: its 28 − 5 = 23 orbitals outside the frozen
    // S 1s2s2p core get 23 bath orbitals, and the impurity holds 2 × 23 = 46 orbitals and 46
    // electrons, all active (DMET with a single-determinant bath: Knizia & Chan 2012; Wouters et al. 2016).
    // Operations as above: 20 × 8 × 23⁶ + 2 × 23⁷ = 30,495,393,134 (Raghavachari et al. 1989).
    expect(guest!.tooltip).toBe('correlated: 46e 46o active; 3.05 × 10^10 operations, 9.70 MiB, under a second at 100 Gflops. Planning estimate.');
    expect(zinc.report().fragments[1]!.solverCost!.operations.exact).toBe(String(20 * 8 * 23 ** 6 + 2 * 23 ** 7));
  });

  it('only in the requested range', () => {
    const line = positionOf(zinc, 'fragment guest').line;
    const hints = getInlayHints(zinc, { start: { line, character: 0 }, end: { line: line + 1, character: 0 } });
    expect(hints.map((hint) => hint.label)).toEqual(['ccsd(t) under a second · 9.70 MiB · impurity 46e 46o']);
  });

  it('under the parity mapping, two qubits fewer: 2 × 4 − 2 = 6 for water in cc-pVDZ, 4e 4o', () => {
    // Parity with the two-qubit reduction (Bravyi, Gambetta, Mezzacapo, Temme, arXiv:1701.08213 (2017)).
    // Tapering: 4 active orbitals spread over C2v irreps in proportion to the 10 A1, 2 A2, 4 B1 and
    // 7 B2 orbitals outside the core (2 A1, 1 B1, 1 B2); both generators act on them, so with the
    // two number parities 4 qubits go (Bravyi et al. 2017): 8 − 4 = 4.
    expect(getInlayHints(analyzeDocument(readSample('molecules/water-cc-pvdz.tess'))).map((hint) => hint.label)).toEqual(['6 qubits · 4 tapered']);
  });

  it('none for a fragment without a name', () => {
    const analysis = analyzeDocument('basis sto-3g\nstructure {\n  H a 0 0 0\n  H b 0 0 0.74\n}\nfragment { atoms rest; tier mean-field { method rhf } }\n');
    expect(getInlayHints(analysis)).toEqual([]);
  });
});

describe('code lens', () => {
  it('states the totals of the spec above its first statement', () => {
    const [lens, ...others] = getCodeLenses(zinc);
    expect(others).toEqual([]);
    // 20 atoms. Electrons: Zn 30 + 2 NH3 (10 each) + 2 HCOO (23 each) + H2S 18 = 114.
    // Spherical functions: Zn 48 in def2-TZVP; in def2-SVP N 14 (× 2), O 14 (× 4), C 14 (× 2),
    // S 18, H 5 (× 10) (tests/fixtures/basis-counts.nwchem.json): 48 + 28 + 56 + 28 + 18 + 50 = 228.
    // Scan from 2.3 to 3.5 Å in steps of 0.2 Å: 7 points.
    expect(lens!.command).toEqual({
      title: '20 atoms · 114 e⁻ · 228 spherical functions · 3 fragments · largest quantum fragment 18 qubits (site) · × 7 scan points',
      command: 'tessera.showReport',
      arguments: [],
    });
    expect(lens!.range).toEqual({ start: positionOf(zinc, 'spec "zn'), end: positionOf(zinc, 'spec "zn', 4) });
  });

  it('counts cartesian functions when the basis asks for them, and leaves out what is absent', () => {
    // Dinitrogen in cc-pVTZ, cartesian: N [4s3p2d1f] = 4 + 9 + 12 + 10 = 35 (tests/fixtures/basis-counts.nwchem.json), × 2.
    const [lens] = getCodeLenses(analyzeDocument(readSample('molecules/dinitrogen-bases.tess')));
    expect(lens!.command!.title).toBe('2 atoms · 14 e⁻ · 70 cartesian functions · 1 fragment · largest quantum fragment 16 qubits (n2)');
  });

  it('names no quantum fragment when there is none', () => {
    const analysis = analyzeDocument('basis sto-3g\nstructure {\n  H a 0 0 0\n  H b 0 0 0.74\n}\nfragment h2 { atoms rest; tier mean-field { method rhf } }\n');
    // STO-3G: one function per H (Hehre, Stewart, Pople, J. Chem. Phys. 51, 2657 (1969)).
    expect(getCodeLenses(analysis)[0]!.command!.title).toBe('2 atoms · 2 e⁻ · 2 spherical functions · 1 fragment');
    expect(largestQubitCount(analysis)).toBeUndefined();
  });

  it('none for an empty spec', () => {
    expect(getCodeLenses(analyzeDocument('# only a comment\n'))).toEqual([]);
  });
});
