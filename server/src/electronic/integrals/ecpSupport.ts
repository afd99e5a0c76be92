/**
 * What the effective-core-potential integrals (ecp/) can and cannot do, checked before any number
 * is computed: a potential outside it is refused with UnsupportedEcpError, which names the element,
 * the basis and the reason, so that no energy is ever computed without its ECP.
 *
 * Supported: semi-local channels U_l − U_L with projector momentum l ≤ MAX_ECP_PROJECTOR_L and any
 * power n ≥ 0 of r^(n−2); a local channel of Gaussian terms (n = 2, every def2 potential); basis
 * shells with l + projector l ≤ BESSEL_MAX_ORDER.
 */
import type { MolecularBasis } from '../contracts';
import { BESSEL_MAX_ORDER } from './ecp/bessel';

/** Highest projector momentum of a semi-local channel (g); def2 potentials go up to d. */
export const MAX_ECP_PROJECTOR_L = 4;

export class UnsupportedEcpError extends Error {
  constructor(
    readonly symbols: readonly string[],
    readonly basisNames: readonly string[],
    readonly reason: string,
  ) {
    super(
      `${symbols.join(', ')} ${symbols.length > 1 ? 'carry' : 'carries'} an effective core potential in ${basisNames.join(', ')} ` +
        `that Tessera cannot integrate (${reason}): no energy is computed. Choose another basis for ` +
        `${symbols.length > 1 ? 'these elements' : 'this element'} or leave the part out.`,
    );
    this.name = 'UnsupportedEcpError';
  }
}

/** Why the potential of one centre cannot be integrated, or undefined when it can. */
function unsupportedReason(basis: MolecularBasis, ecp: MolecularBasis['ecps'][number]): string | undefined {
  let lmaxBasis = 0;
  for (const shell of basis.shells) lmaxBasis = Math.max(lmaxBasis, shell.l);
  for (const channel of ecp.channels) {
    if (channel.l > MAX_ECP_PROJECTOR_L) return `a semi-local channel of l = ${channel.l}; Tessera projects up to l = ${MAX_ECP_PROJECTOR_L}`;
    if (channel.l >= 0 && channel.l + lmaxBasis > BESSEL_MAX_ORDER) return `basis functions of l = ${lmaxBasis} with a channel of l = ${channel.l}`;
    for (let k = 0; k < channel.powers.length; k++) {
      const n = channel.powers[k]!;
      if (channel.l < 0 && n !== 2) return `a local term r^${n - 2} exp(−ζr²); Tessera integrates local Gaussian terms (n = 2) only`;
      if (n < 0) return `a term r^${n - 2} exp(−ζr²) with n < 0`;
      if (!(channel.exponents[k]! > 0)) return `a term with exponent ${channel.exponents[k]}`;
    }
  }
  return undefined;
}

/** Throws UnsupportedEcpError when a centre carries a potential that the integrals cannot handle. */
export function assertEcpSupported(basis: MolecularBasis): void {
  const symbols: string[] = [];
  const names: string[] = [];
  let firstReason: string | undefined;
  for (const ecp of basis.ecps) {
    const reason = unsupportedReason(basis, ecp);
    if (!reason) continue;
    firstReason ??= reason;
    const symbol = basis.centers[ecp.center]!.symbol;
    if (!symbols.includes(symbol)) symbols.push(symbol);
    const name = basis.basisNames[ecp.center]!;
    if (!names.includes(name)) names.push(name);
  }
  if (firstReason) throw new UnsupportedEcpError(symbols, names, firstReason);
}
