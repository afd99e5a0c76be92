/**
 * A fresh server's first edits would run on code the JavaScript engine has not compiled yet, and
 * take several times longer than later ones. Right after start the server therefore runs every path
 * an edit takes (analysis, diagnostics, tokens, hints, lens, symbols, hover, completion, a line
 * being typed) a few times on a small generated spec of its own, so that the first edit of a real
 * document finds them compiled. It runs before the server reads its first message (it delays the
 * answer to `initialize` by a fraction of a second, once).
 */
import { analyzeDocument } from '../analysis';
import * as service from '../services';

/** A small spec in the shape of real ones (invented data): water molecules on a grid and two fragments. */
function warmUpSpec(molecules: number, variant: number): string {
  const lines: string[] = [];
  for (let m = 0; m < molecules; m++) {
    const x = (m % 6) * 3.1 + 0.01 * (m % 7);
    const y = (Math.floor(m / 6) % 6) * 3.1;
    const z = Math.floor(m / 36) * 3.1 + (m === 0 ? variant * 1e-4 : 0);
    const label = m === 0 ? ' o1' : '';
    lines.push(`  O${label} ${x.toFixed(4)} ${y.toFixed(4)} ${z.toFixed(4)}`, `  H ${x.toFixed(4)} ${(y + 0.75695).toFixed(4)} ${(z + 0.585882).toFixed(4)}`, `  H ${x.toFixed(4)} ${(y - 0.75695).toFixed(4)} ${(z + 0.585882).toFixed(4)}`);
  }
  // Every other round a line is being typed, as in an editor.
  if (variant % 2 === 1) lines.splice(4, 0, '  C 1.5 2.');
  return ['# warm-up', 'spec "warm-up"', 'basis sto-3g', 'structure {', ...lines, '}', 'fragment probe {', '  atoms #1..#3', '  tier quantum { method vqe; ansatz uccsd; active 4e 4o }', '}', 'fragment bulk {', '  atoms rest', '  tier mean-field { method rhf }', '}', 'limits { qubits 24 }', ''].join('\n');
}

/** Runs `rounds` rounds of what an edit costs; returns the milliseconds it took. */
export function warmUp(rounds = 10): number {
  const start = performance.now();
  const files = { readFile: () => ({ ok: false as const, reason: 'no files while warming up' }), realPath: (file: string) => file };
  let previous: ReturnType<typeof analyzeDocument> | undefined;
  for (let round = 0; round < rounds; round++) {
    // Over the symmetry size limit, like the large documents the warm-up is for; each round an
    // edit of the last, so that the paths that reuse the previous version are taken too.
    const analysis = analyzeDocument(warmUpSpec(180, round), { files, ...(previous ? { previous } : {}) });
    previous = analysis;
    service.doValidation(analysis, 'file:///warm-up.tess');
    service.semanticTokensEdits(service.encodeSemanticTokens(analysis), service.encodeSemanticTokens(analysis));
    service.getInlayHints(analysis, { start: { line: 0, character: 0 }, end: { line: 400, character: 0 } });
    service.getCodeLenses(analysis);
    // The computed-result lenses read each part's checks and input key, as the first edit's lens request does.
    service.computeLenses(analysis, 'file:///warm-up.tess', service.NO_COMPUTE_POLICY);
    service.findDocumentSymbols(analysis);
    service.doHover(analysis, analysis.lines.positionAt(analysis.text.indexOf('fragment probe') + 10));
    service.doComplete(analysis, analysis.lines.positionAt(analysis.text.indexOf('method vqe') + 7));
  }
  return performance.now() - start;
}
