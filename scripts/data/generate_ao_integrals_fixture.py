#!/usr/bin/python3
"""Generate tests/fixtures/ao-integrals.psi4.json: atomic-orbital integrals and SCF/MP2 energies
computed by Debian's psi4 (used here only as an independent reference) for small molecules, so
that Tessera's SCF and MP2 can be checked without its own integral code.

For each case psi4 writes, in Tessera's function order and normalisation (contracts.ts: spherical
functions in order m = -l ... +l, where psi4 stores 0, +1, -1, +2, -2, ...; cartesian functions
rescaled to unit norm, where psi4 normalises every component like x^l):
* the basis shells (centre, l, exponents, contraction coefficients as in the library file),
* overlap S, kinetic T, nuclear attraction V (n*n, row-major, little-endian float64, base64),
* the electron-repulsion integrals (ij|kl), unique ones only (i >= j, k >= l, ij >= kl, with
  ij = i(i+1)/2 + j), little-endian float64, base64,
* the same for each element alone (`elements`: one atom at the origin, same basis), for the
  atomic-density guess,
* the nuclear repulsion energy, and psi4's SCF energy, orbital energies and Mulliken and Löwdin
  charges for each reference asked for, and for RHF the MP2 correlation energy with all electrons and with frozen core
  (conventional integrals: scf_type pk, mp2_type conv; e_convergence and d_convergence 1e-10).
Overlap-only cases (`overlapOnly`) hold just S for large bases (up to g functions), to check how
functions transform under rotations.

Geometries are in bohr, invented (labelled per case), given to psi4 with no_com and
no_reorient; `symmetry c1` so that psi4 keeps our axes and reports orbitals in one list.

Usage (needs Debian's psi4; CI does not, the generated fixture is committed):

    /usr/bin/python3 scripts/data/generate_ao_integrals_fixture.py [--out FILE]
"""

import argparse
import json
import math
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import psi4_job  # noqa: E402

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
DEFAULT_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "ao-integrals.psi4.json")
GENERATED_BY = "scripts/data/generate_ao_integrals_fixture.py"

BODY = r'''
spec = json.loads({spec!r})

def enc(array):
    return base64.b64encode(np.ascontiguousarray(array, dtype="<f8").tobytes()).decode("ascii")

def reordering(bs):
    """Our index -> psi4 index; scale turns psi4's functions into unit-norm ones (cartesian)."""
    perm = []
    for s in range(bs.nshell()):
        sh = bs.shell(s)
        l, first = sh.am, sh.function_index
        if sh.is_pure() and l == 1:
            perm.extend([first + 1, first + 2, first])  # psi4's pure p: z, x, y (m = 0, +1, -1)
        elif sh.is_pure() and l > 1:
            for m in range(-l, l + 1):
                perm.append(first + (0 if m == 0 else (2 * m - 1 if m > 0 else -2 * m)))
        else:
            perm.extend(range(first, first + sh.nfunction))
    return np.array(perm)

def integrals(bs, overlap_only=False):
    mints = psi4.core.MintsHelper(bs)
    perm = reordering(bs)
    S = mints.ao_overlap().np[np.ix_(perm, perm)]
    scale = 1.0 / np.sqrt(np.diag(S))
    S = S * np.outer(scale, scale)
    out = {{"S": enc(S)}}
    if overlap_only:
        return out
    T = mints.ao_kinetic().np[np.ix_(perm, perm)] * np.outer(scale, scale)
    V = mints.ao_potential().np[np.ix_(perm, perm)] * np.outer(scale, scale)
    I = mints.ao_eri().np[np.ix_(perm, perm, perm, perm)]
    I = np.einsum("ijkl,i,j,k,l->ijkl", I, scale, scale, scale, scale)
    n = S.shape[0]
    rows, cols = np.tril_indices(n)
    pairs = I[rows, cols][:, rows, cols]
    a, b = np.tril_indices(len(rows))
    out.update({{"T": enc(T), "V": enc(V), "eri": enc(pairs[a, b])}})
    return out

def shells(bs):
    return [{{"center": bs.shell(s).ncenter, "l": bs.shell(s).am,
              "exponents": [bs.shell(s).exp(k) for k in range(bs.shell(s).nprimitive)],
              "coefficients": [bs.shell(s).original_coef(k) for k in range(bs.shell(s).nprimitive)]}}
            for s in range(bs.nshell())]

mol = psi4.geometry(spec["molecule"])
psi4.set_options({{"basis": spec["basis"], "puream": spec["puream"], "scf_type": "pk", "mp2_type": "conv",
                   "e_convergence": 1e-10, "d_convergence": 1e-10, "maxiter": 200}})
wfn = psi4.core.Wavefunction.build(mol, spec["basis"])
bs = wfn.basisset()
result = {{"nbf": bs.nbf(), "puream": bool(bs.has_puream()), "shells": shells(bs),
           "nuclearRepulsion": mol.nuclear_repulsion_energy()}}
result.update(integrals(bs, spec["overlapOnly"]))
if not spec["overlapOnly"]:
    atoms = {{}}
    for symbol, block in spec["atomBlocks"].items():
        atom = psi4.geometry(block)
        atom_bs = psi4.core.Wavefunction.build(atom, spec["basis"]).basisset()
        atoms[symbol] = dict(integrals(atom_bs), nbf=atom_bs.nbf(), shells=shells(atom_bs))
    result["elements"] = atoms
    psi4.core.set_active_molecule(mol)
    references = {{}}
    for reference in spec["references"]:
        psi4.set_options({{"reference": reference, "freeze_core": False}})
        energy, scf = psi4.energy("scf", molecule=mol, return_wfn=True)
        entry = {{"energy": energy,
                  "alpha": sorted(scf.epsilon_a().np.tolist()), "beta": sorted(scf.epsilon_b().np.tolist())}}
        for kind, label in (("MULLIKEN_CHARGES", "mulliken"), ("LOWDIN_CHARGES", "lowdin")):
            psi4.oeprop(scf, kind)
            entry[label] = scf.atomic_point_charges().np.tolist()
        if reference == "rhf":
            psi4.energy("mp2", molecule=mol)
            entry["mp2"] = psi4.variable("MP2 CORRELATION ENERGY")
            psi4.set_options({{"freeze_core": True}})
            psi4.energy("mp2", molecule=mol)
            entry["mp2FrozenCore"] = psi4.variable("MP2 CORRELATION ENERGY")
            psi4.set_options({{"freeze_core": False}})
        references[reference] = entry
    result["references"] = references
_emit(result)
'''


def rotation(angles):
    """Rotation matrix from z-y-z Euler angles (radians)."""
    a, b, c = angles
    def rz(t):
        return [[math.cos(t), -math.sin(t), 0], [math.sin(t), math.cos(t), 0], [0, 0, 1]]
    def ry(t):
        return [[math.cos(t), 0, math.sin(t)], [0, 1, 0], [-math.sin(t), 0, math.cos(t)]]
    def mul(p, q):
        return [[sum(p[i][k] * q[k][j] for k in range(3)) for j in range(3)] for i in range(3)]
    return mul(rz(a), mul(ry(b), rz(c)))


def tilted(atoms, shift=(0.3, -0.2, 0.5)):
    """The same molecule turned to a general orientation and moved off the origin (invented)."""
    r = rotation((0.4, 1.1, -0.7))
    out = []
    for symbol, x, y, z in atoms:
        p = [sum(r[i][k] * v for k, v in enumerate((x, y, z))) + shift[i] for i in range(3)]
        out.append((symbol, p[0], p[1], p[2]))
    return out


# Invented geometries (bohr), idealised from typical bond lengths and angles.
WATER = [("O", 0.0, 0.0, 0.2217), ("H", 0.0, 1.4309, -0.8867), ("H", 0.0, -1.4309, -0.8867)]
HYDROXYL = [("O", 0.0, 0.0, 0.0), ("H", 0.0, 0.0, 1.8344)]
METHYLENE = [("C", 0.0, 0.0, 0.1970), ("H", 0.0, 1.8700, -0.5909), ("H", 0.0, -1.8700, -0.5909)]
DIOXYGEN = [("O", 0.0, 0.0, 1.1405), ("O", 0.0, 0.0, -1.1405)]
DINITROGEN = [("N", 0.0, 0.0, 1.0371), ("N", 0.0, 0.0, -1.0371)]


def cases():
    """(name, atoms, charge, multiplicity, basis, puream, references, overlapOnly)."""
    return [
        # Szabo & Ostlund's H2 at R = 1.4 bohr (Modern Quantum Chemistry, ch. 3).
        ("H2 R=1.4 bohr", [("H", 0, 0, 0), ("H", 0, 0, 1.4)], 0, 1, "sto-3g", True, ["rhf"], False),
        ("water (invented geometry)", WATER, 0, 1, "sto-3g", True, ["rhf"], False),
        ("water, tilted (invented geometry)", tilted(WATER), 0, 1, "6-31g*", False, ["rhf"], False),
        ("water, tilted (invented geometry)", tilted(WATER), 0, 1, "6-31g*", True, ["rhf"], False),
        ("hydroxyl radical (invented geometry)", HYDROXYL, 0, 2, "6-31g", False, ["uhf", "rohf"], False),
        ("methylene triplet (invented geometry)", METHYLENE, 0, 3, "6-31g", False, ["uhf", "rohf"], False),
        ("dioxygen triplet (invented geometry)", DIOXYGEN, 0, 3, "sto-3g", True, ["uhf", "rohf"], False),
        ("fluoride anion", [("F", 0, 0, 0)], -1, 1, "6-31g", False, ["rhf"], False),
        ("lithium atom", [("Li", 0, 0, 0)], 0, 2, "6-31g", False, ["uhf", "rohf"], False),
        ("neon atom", [("Ne", 0, 0, 0)], 0, 1, "cc-pvdz", True, ["rhf"], False),
        ("dinitrogen, tilted (invented geometry)", tilted(DINITROGEN), 0, 1, "cc-pvqz", True, [], True),
        ("dinitrogen, tilted (invented geometry)", tilted(DINITROGEN), 0, 1, "cc-pvqz", False, [], True),
    ]


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", default=DEFAULT_OUT)
    args = parser.parse_args()
    entries = []
    for name, atoms, charge, multiplicity, basis, puream, references, overlap_only in cases():
        symbols = sorted({atom[0] for atom in atoms})
        spec = {
            "molecule": psi4_job.molecule_block(atoms, charge, multiplicity) + "\nsymmetry c1",
            "basis": basis, "puream": puream, "references": references, "overlapOnly": overlap_only,
            "atomBlocks": {s: psi4_job.molecule_block([(s, 0, 0, 0)], 0, 1 + (ATOM_ELECTRONS[s] % 2)) + "\nsymmetry c1" for s in symbols},
        }
        result = psi4_job.run(BODY.format(spec=json.dumps(spec)), "case")
        entries.append({"name": name, "basis": basis, "kind": "spherical" if result["puream"] else "cartesian",
                        "charge": charge, "multiplicity": multiplicity,
                        "geometry": [{"symbol": a[0], "x": a[1], "y": a[2], "z": a[3]} for a in atoms], **result})
        energies = ", ".join("%s %.10f" % (k, v["energy"]) for k, v in result.get("references", {}).items())
        print("%-40s %-8s %-10s n=%d %s" % (name, basis, "spherical" if result["puream"] else "cartesian", result["nbf"], energies), file=sys.stderr)
    fixture = {
        "origin": psi4_job.psi4_origin(GENERATED_BY, (
            "AO integrals in Tessera's function order and normalisation, and psi4's SCF (scf_type pk) and "
            "MP2 (mp2_type conv) energies, for invented geometries in bohr (no_com, no_reorient, symmetry c1).")),
        "cases": entries,
    }
    with open(args.out, "w") as handle:
        json.dump(fixture, handle, indent=1)
        handle.write("\n")
    print("wrote %s (%d bytes)" % (os.path.relpath(args.out, REPO_ROOT), os.path.getsize(args.out)), file=sys.stderr)


ATOM_ELECTRONS = {"H": 1, "He": 2, "Li": 3, "C": 6, "N": 7, "O": 8, "F": 9, "Ne": 10}

if __name__ == "__main__":
    main()
