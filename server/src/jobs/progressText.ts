/** Progress of a running job as one short line, the same in the editor's progress and on the command line. */
import type { JobProgress } from './protocol';

/** Hartree with six decimals and a real minus sign: `−76.026799 Ha`. */
export function hartree(value: number, decimals = 6): string {
  const text = value.toFixed(decimals);
  return `${text.startsWith('-') ? `−${text.slice(1)}` : text} Ha`;
}

/** An energy change in exponent notation: `−2.1e−7`. */
function change(value: number): string {
  const text = value.toExponential(1).replace('e-', 'e−');
  return text.startsWith('-') ? `−${text.slice(1)}` : `+${text}`;
}

export function progressText(progress: JobProgress): string {
  switch (progress.phase) {
    case 'integrals':
      return 'building the basis and integrals';
    case 'guess':
      return 'atomic-density guess';
    case 'scf': {
      const parts = [`SCF iteration ${progress.iteration ?? 0}`];
      if (progress.energy !== undefined) parts.push(`E = ${hartree(progress.energy)}`);
      if (progress.energyChange !== undefined && progress.energyChange !== null) parts.push(`ΔE = ${change(progress.energyChange)}`);
      return parts.join(' · ');
    }
    case 'active-space':
      return 'choosing the active orbitals';
    case 'mp2':
      return progress.total ? `MP2: ${progress.done ?? 0} of ${progress.total} occupied orbitals` : 'MP2';
    case 'embedding':
      return 'Schmidt decomposition of the system mean field';
  }
}
