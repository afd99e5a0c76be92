/**
 * A qubit Hamiltonian as Tessera's own JSON document, so that a solver starts from exactly the
 * strings Tessera sized. The format is documented in docs/qubit-hamiltonian-json.md and described
 * by the JSON Schema docs/qubit-hamiltonian.schema.json (the tests validate against it).
 *
 * The writer yields the document in pieces (header, then the terms in chunks, then the closing
 * bracket) so that a caller can stream a large Hamiltonian to a file.
 */
import { encodingMatrix } from '../hamiltonian/encodings';
import { pauliLabel } from '../hamiltonian/pauli';
import type { QubitHamiltonian } from '../hamiltonian/qubitHamiltonian';
import { identityCoefficient, oneNorm } from '../hamiltonian/summary';

export const QUBIT_HAMILTONIAN_FORMAT = 'tessera-qubit-hamiltonian';
export const QUBIT_HAMILTONIAN_VERSION = 1;

export interface QubitHamiltonianJsonOptions {
  /** Index, in the part's orbitals, of each active orbital (written as `activeOrbitals`). */
  readonly activeOrbitals?: readonly number[];
  /** A free-text note on where the Hamiltonian comes from (part, basis, reference). */
  readonly source?: string;
  /** Terms per yielded chunk; default 1000. */
  readonly chunk?: number;
}

interface Mode {
  readonly mode: number;
  readonly orbital: number;
  readonly spin: 'alpha' | 'beta';
}

/** The register description: modes in block order, each qubit's encoding row, the tapered qubits. */
export function registerDescription(hamiltonian: QubitHamiltonian): { modes: Mode[]; encoding: number[][]; tapered: Array<{ qubit: number; holds: 'alpha-parity' | 'total-parity'; eigenvalue: 1 | -1 }> } {
  const n = hamiltonian.orbitals;
  const modes: Mode[] = [];
  for (let m = 0; m < 2 * n; m++) modes.push({ mode: m, orbital: m % n, spin: m < n ? 'alpha' : 'beta' });
  const rows = encodingMatrix(hamiltonian.mapping, 2 * n);
  const removed = new Set(hamiltonian.removedQubits);
  const encoding: number[][] = [];
  rows.forEach((row, q) => {
    if (removed.has(q)) return;
    const listed: number[] = [];
    for (let m = 0; m < 2 * n; m++) if ((row >>> m) & 1) listed.push(m);
    encoding.push(listed);
  });
  const { alpha, beta } = hamiltonian.electrons;
  const tapered =
    hamiltonian.mapping === 'parity'
      ? [
          { qubit: n - 1, holds: 'alpha-parity' as const, eigenvalue: (alpha % 2 === 0 ? 1 : -1) as 1 | -1 },
          { qubit: 2 * n - 1, holds: 'total-parity' as const, eigenvalue: ((alpha + beta) % 2 === 0 ? 1 : -1) as 1 | -1 },
        ]
      : [];
  return { modes, encoding, tapered };
}

export function* qubitHamiltonianJson(hamiltonian: QubitHamiltonian, options: QubitHamiltonianJsonOptions = {}): Generator<string, void, undefined> {
  const chunk = Math.max(1, options.chunk ?? 1000);
  if (options.activeOrbitals && options.activeOrbitals.length !== hamiltonian.orbitals) {
    throw new RangeError(`qubit Hamiltonian JSON: ${options.activeOrbitals.length} active orbital indices for ${hamiltonian.orbitals} orbitals`);
  }
  const { modes, encoding, tapered } = registerDescription(hamiltonian);
  const header = {
    format: QUBIT_HAMILTONIAN_FORMAT,
    version: QUBIT_HAMILTONIAN_VERSION,
    ...(options.source !== undefined ? { source: options.source } : {}),
    units: 'hartree',
    mapping: hamiltonian.mapping,
    qubits: hamiltonian.qubits,
    orbitals: hamiltonian.orbitals,
    electrons: hamiltonian.electrons,
    ...(options.activeOrbitals !== undefined ? { activeOrbitals: [...options.activeOrbitals] } : {}),
    spinOrbitalOrder: 'block',
    modes,
    encoding,
    tapered,
    labels: 'qubit 0 first',
    threshold: hamiltonian.threshold,
    identity: identityCoefficient(hamiltonian),
    oneNorm: oneNorm(hamiltonian),
    termCount: hamiltonian.length,
  };
  const text = JSON.stringify(header, null, 1);
  yield `${text.slice(0, -2)},\n "terms": [`;
  for (let start = 0; start < hamiltonian.length; start += chunk) {
    const end = Math.min(hamiltonian.length, start + chunk);
    const lines: string[] = [];
    for (let k = start; k < end; k++) {
      lines.push(`${k === 0 ? '' : ','}\n  [${JSON.stringify(pauliLabel(hamiltonian.x[k]!, hamiltonian.z[k]!, hamiltonian.qubits))}, ${JSON.stringify(hamiltonian.coefficients[k]!)}]`);
    }
    yield lines.join('');
  }
  yield '\n ]\n}\n';
}
