/**
 * Effective core potentials are not integrated yet. A basis that puts one on an atom (def2 on Rb
 * and heavier) would give wrong nuclear-attraction and total energies without its semi-local
 * integrals, so every entry point of the integral layer refuses such a basis, naming the elements.
 * The potentials themselves stay in MolecularBasis.ecps for the code that will integrate them.
 */
import type { MolecularBasis } from '../contracts';

export class UnsupportedEcpError extends Error {
  constructor(
    readonly symbols: readonly string[],
    readonly basisNames: readonly string[],
  ) {
    super(
      `${symbols.join(', ')} ${symbols.length > 1 ? 'carry' : 'carries'} an effective core potential in ${basisNames.join(', ')}, ` +
        'and Tessera does not integrate effective core potentials yet: no energy is computed. Choose an all-electron ' +
        `basis for ${symbols.length > 1 ? 'these elements' : 'this element'} or leave the part out.`,
    );
    this.name = 'UnsupportedEcpError';
  }
}

/** Throws UnsupportedEcpError when any centre of the basis carries an effective core potential. */
export function assertNoEcp(basis: MolecularBasis): void {
  if (basis.ecps.length === 0) return;
  const symbols: string[] = [];
  const names: string[] = [];
  for (const ecp of basis.ecps) {
    const symbol = basis.centers[ecp.center]!.symbol;
    if (!symbols.includes(symbol)) symbols.push(symbol);
    const name = basis.basisNames[ecp.center]!;
    if (!names.includes(name)) names.push(name);
  }
  throw new UnsupportedEcpError(symbols, names);
}
