/**
 * An active space that cuts a set of degenerate orbitals is named as such: the Hartree–Fock energy
 * is invariant under rotations within a degenerate set, so which members a window takes is arbitrary
 * and the Hamiltonian's figures depend on it.
 *
 * Outside facts: the three 2p orbitals of an atom are degenerate (spherical symmetry; any text on
 * atomic structure), and so are the p functions of each higher shell of a closed-shell atom's
 * virtual space; the π orbitals of a linear molecule come in degenerate pairs (D∞h). Ne/cc-pVDZ's
 * RHF energy: psi4 1.3.2 (Debian), scf_type pk, symmetry c1, e_convergence 1e-10, gives
 * −128.4887755517 Ha (run on 2026-12-03 for this check).
 */
import { describe, expect, it } from 'vitest';
import { degenerateSplitNote, degenerateSplits } from '../../server/src/electronic/activeSpace';
import { run, scratch } from '../cli/harness';

describe('degenerate sets cut by an active space', () => {
  // An atom-like spectrum: 1s, 2s, three 2p (occupied), then three 3p and a 3s (virtual), in Ha.
  const energies = [-32.77, -1.93, -0.832, -0.832, -0.832, 1.6946, 1.6946, 1.6946, 5.2];
  const occupations = [2, 2, 2, 2, 2, 0, 0, 0, 0];

  it('finds the sets a window takes in part, and none when it takes them whole', () => {
    expect(degenerateSplits(energies, occupations, [3, 4, 5, 6])).toEqual([
      { energy: -0.832, taken: 2, size: 3 },
      { energy: 1.6946, taken: 2, size: 3 },
    ]);
    expect(degenerateSplits(energies, occupations, [1, 2, 3, 4, 5, 6, 7])).toEqual([]);
    expect(degenerateSplitNote([])).toBeNull();
  });

  it('tells orbitals of equal energy but different occupation apart (an open shell is not split by its virtuals)', () => {
    expect(degenerateSplits([-0.5, -0.5], [1, 0], [0])).toEqual([]);
  });

  it('says so beside the Hamiltonian of Ne in cc-pVDZ with 4e 4o, and not with 8e 7o', async () => {
    const folder = scratch({ 'ne.xyz': '1\nneon atom\nNe 0 0 0\n' });
    const cut = await run(['estimate', '--xyz', 'ne.xyz', '--basis', 'cc-pVDZ', '--mean-field', '--active', '4e4o', '--format', 'json'], folder);
    const system = JSON.parse(cut.stdout).system;
    expect(Math.abs(system.meanField.energy - -128.4887755517)).toBeLessThan(1e-6);
    // 3 frozen orbitals (1s, 2s and one 2p): the window holds 2 of the 2p and 2 of the 3p.
    expect(system.hamiltonian.activeSpace.source).toContain('takes 2 of the 3 degenerate orbitals at −0.8321 Ha and 2 of the 3 degenerate orbitals at');
    const whole = await run(['estimate', '--xyz', 'ne.xyz', '--basis', 'cc-pVDZ', '--mean-field', '--active', '8e7o', '--format', 'json'], folder);
    expect(JSON.parse(whole.stdout).system.hamiltonian.activeSpace.source).not.toContain('degenerate');
  });
});
