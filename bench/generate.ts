/**
 * Generated benchmark specs (invented data): water molecules on a jittered cubic lattice at about
 * liquid density (0.1 atoms/Å³), the first molecule a quantum-tier fragment, the rest one
 * mean-field fragment.
 */

export interface GeneratedSpec {
  readonly text: string;
  /** The same coordinates as JSON: [["O", x, y, z], ...]. */
  readonly json: string;
  readonly atoms: number;
}

function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state * 1664525 + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

export function waterBoxSpec(atomTarget: number, seed = 7): GeneratedSpec {
  const molecules = Math.max(1, Math.round(atomTarget / 3));
  const side = Math.ceil(Math.cbrt(molecules));
  const spacing = 3.1; // Å between molecule centres: about 0.1 atoms per Å³
  const next = random(seed);
  const lines: string[] = [];
  const json: [string, number, number, number][] = [];
  let count = 0;
  for (let m = 0; m < molecules; m++) {
    const cx = (m % side) * spacing + (next() - 0.5) * 0.3;
    const cy = (Math.floor(m / side) % side) * spacing + (next() - 0.5) * 0.3;
    const cz = Math.floor(m / (side * side)) * spacing + (next() - 0.5) * 0.3;
    const atoms: [string, number, number, number][] = [
      // The water of the samples (Hoy & Bunker 1979 in tests/fixtures/water.ts), O at the centre.
      ['O', cx, cy, cz],
      ['H', cx, cy + 0.75695, cz + 0.585882],
      ['H', cx, cy - 0.75695, cz + 0.585882],
    ];
    for (const [symbol, x, y, z] of atoms) {
      const label = m === 0 ? ` ${symbol.toLowerCase()}${count + 1}` : '';
      lines.push(`  ${symbol}${label} ${x.toFixed(4)} ${y.toFixed(4)} ${z.toFixed(4)}`);
      json.push([symbol, Number(x.toFixed(4)), Number(y.toFixed(4)), Number(z.toFixed(4))]);
      count++;
    }
  }
  const text = [
    '# Generated benchmark spec (invented data): a box of water molecules.',
    'spec "water-box"',
    'basis sto-3g',
    'geometry {',
    ...lines,
    '}',
    'fragment probe {',
    '  atoms #1..#3',
    '  tier quantum { method vqe; ansatz uccsd; mapping jordan-wigner; active 4e 4o }',
    '}',
    'fragment bulk {',
    '  atoms rest',
    '  tier mean-field { method rhf }',
    '}',
    'limits { qubits 24 }',
    '',
  ].join('\n');
  return { text, json: JSON.stringify(json), atoms: count };
}
