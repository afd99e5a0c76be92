#!/usr/bin/python3
"""Generate tests/fixtures/scf-reference.psi4.json: SCF and MP2 results of Debian's psi4 (used here
only as an independent reference) for molecule-basis-reference cases that Tessera's own integrals
and SCF must reproduce.

Per case psi4 reports (conventional integrals: scf_type pk, mp2_type conv; e_convergence and
d_convergence 1e-10; psi4's own abelian point group in the given axes):
* the total SCF energy and nuclear repulsion,
* every orbital energy with its irrep label (alpha and beta), ascending,
* doubly and singly occupied orbitals per irrep (doccpi, soccpi) with the irrep labels,
* for RHF the MP2 correlation energy with all electrons and with frozen core, for UHF with all
  electrons (psi4's occ module).

Geometries are idealised and invented (round bond lengths and angles), except water (Hoy & Bunker
1979, r = 0.9572 A, angle 104.52 degrees, the structure the rest of the repository uses), written
in angstrom here, converted to bohr with 0.529177210903 A (CODATA 2018, as in
server/src/chemistry/units.ts) and given to psi4 in bohr with no_com and no_reorient. They are
already in the orientation Tessera's symmetry module prescribes (server/src/chemistry/symmetry/
abelian.ts), so psi4's irrep labels refer to the same axes.

Usage (needs Debian's psi4; CI does not, the generated fixture is committed):

    /usr/bin/python3 scripts/data/generate_scf_reference_fixture.py [--out FILE] [--only NAME]
"""

import argparse
import json
import math
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import psi4_job  # noqa: E402

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
DEFAULT_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "scf-reference.psi4.json")
GENERATED_BY = "scripts/data/generate_scf_reference_fixture.py"
BOHR_IN_ANGSTROM = 0.529177210903
DEG = math.pi / 180

BODY = r'''
spec = json.loads({spec!r})
mol = psi4.geometry(spec["molecule"])
psi4.set_options({{"basis": spec["basis"], "puream": spec["puream"], "scf_type": "pk", "mp2_type": "conv",
                   "reference": spec["reference"], "e_convergence": 1e-10, "d_convergence": 1e-10,
                   "maxiter": 300, "freeze_core": False}})
if spec["reference"] == "uhf":
    psi4.set_options({{"qc_module": "occ"}})
energy, wfn = psi4.energy("scf", molecule=mol, return_wfn=True)
labels = list(mol.irrep_labels())
def orbitals(eps):
    out = []
    for h, values in enumerate(eps.nph):
        out.extend((float(v), labels[h]) for v in values)
    out.sort()
    return {{"energies": [e for e, _ in out], "irreps": [l for _, l in out]}}
result = {{"energy": energy, "nuclearRepulsion": mol.nuclear_repulsion_energy(), "pointGroup": mol.schoenflies_symbol(),
           "irrepLabels": labels, "docc": list(wfn.doccpi().to_tuple()), "socc": list(wfn.soccpi().to_tuple()),
           "nbf": wfn.basisset().nbf(), "puream": bool(wfn.basisset().has_puream()),
           "alpha": orbitals(wfn.epsilon_a()), "beta": orbitals(wfn.epsilon_b())}}
if spec["reference"] in ("rhf", "uhf"):
    psi4.energy("mp2", molecule=mol)
    result["mp2"] = psi4.variable("MP2 CORRELATION ENERGY")
if spec["reference"] == "rhf":
    psi4.set_options({{"freeze_core": True}})
    psi4.energy("mp2", molecule=mol)
    result["mp2FrozenCore"] = psi4.variable("MP2 CORRELATION ENERGY")
_emit(result)
'''


def linear(*atoms):
    """Atoms along z at the given positions (angstrom)."""
    return [(symbol, 0.0, 0.0, z) for symbol, z in atoms]


def bent_yz(center, ligand, bond, angle, center_z=0.0):
    """X–Y2 in the yz plane, C2 along z, the ligands below the centre (angstrom, degrees)."""
    half = angle / 2 * DEG
    return [(center, 0.0, 0.0, center_z), (ligand, 0.0, bond * math.sin(half), center_z - bond * math.cos(half)),
            (ligand, 0.0, -bond * math.sin(half), center_z - bond * math.cos(half))]


def pyramid_x(center, ligand, bond, angle_to_axis):
    """X–Y3 with the three-fold axis along x, one Y in the xy plane (the Cs mirror)."""
    a = angle_to_axis * DEG
    return [(center, 0.0, 0.0, 0.0)] + [(ligand, -bond * math.cos(a), bond * math.sin(a) * math.cos(t * DEG), bond * math.sin(a) * math.sin(t * DEG)) for t in (0, 120, 240)]


def tetrahedron(center, ligand, bond):
    a = bond / math.sqrt(3)
    return [(center, 0, 0, 0), (ligand, a, a, a), (ligand, -a, -a, a), (ligand, -a, a, -a), (ligand, a, -a, -a)]


def trigonal_planar_yz(center, ligand, bond):
    """X–Y3 planar in the yz plane with one bond along z (C2v subgroup, z the C2 axis)."""
    return [(center, 0.0, 0.0, 0.0)] + [(ligand, 0.0, bond * math.sin(t * DEG), bond * math.cos(t * DEG)) for t in (0, 120, 240)]


def molecules():
    """name -> (atoms in angstrom, charge, multiplicity). Geometries invented and idealised, except water."""
    return {
        # Hoy & Bunker, J. Mol. Spectrosc. 74, 1 (1979): r = 0.9572 A, HOH 104.52 degrees (as in tests/fixtures/water.ts).
        "water": (bent_yz("O", "H", 0.9572, 104.52), 0, 1),
        "ammonia": (pyramid_x("N", "H", 1.012, 112.0), 0, 1),
        "methane": (tetrahedron("C", "H", 1.089), 0, 1),
        "dinitrogen": (linear(("N", 0.549), ("N", -0.549)), 0, 1),
        "hydrogen fluoride": (linear(("F", 0.0), ("H", 0.917)), 0, 1),
        "carbon monoxide": (linear(("C", -0.6445), ("O", 0.4835)), 0, 1),
        "ethylene": ([("C", 0, 0, 0.665), ("C", 0, 0, -0.665), ("H", 0, 0.92, 1.23), ("H", 0, -0.92, 1.23),
                      ("H", 0, 0.92, -1.23), ("H", 0, -0.92, -1.23)], 0, 1),
        "hydrogen cyanide": (linear(("H", -1.066), ("C", 0.0), ("N", 1.156)), 0, 1),
        "formaldehyde": ([("C", 0, 0, 0), ("O", 0, 0, 1.205), ("H", 0, 0.943, -0.587), ("H", 0, -0.943, -0.587)], 0, 1),
        "neon atom": ([("Ne", 0, 0, 0)], 0, 1),
        "argon atom": ([("Ar", 0, 0, 0)], 0, 1),
        "hydrogen chloride": (linear(("Cl", 0.0), ("H", 1.275)), 0, 1),
        "hydrogen sulfide": (bent_yz("S", "H", 1.336, 92.1), 0, 1),
        "ammonium cation": (tetrahedron("N", "H", 1.030), 1, 1),
        "hydronium cation": (pyramid_x("O", "H", 0.976, 111.0), 1, 1),
        "hydroxide anion": (linear(("O", 0.0), ("H", 0.964)), -1, 1),
        "fluoride anion": ([("F", 0, 0, 0)], -1, 1),
        "zinc(2+) ion": ([("Zn", 0, 0, 0)], 2, 1),
        "hydroxyl radical": (linear(("O", 0.0), ("H", 0.970)), 0, 2),
        "methyl radical": (trigonal_planar_yz("C", "H", 1.079), 0, 2),
        "dioxygen triplet": (linear(("O", 0.6037), ("O", -0.6037)), 0, 3),
        "amino radical": (bent_yz("N", "H", 1.024, 103.4), 0, 2),
        "methylene triplet": (bent_yz("C", "H", 1.078, 136.0), 0, 3),
        "nitrogen atom quartet": ([("N", 0, 0, 0)], 0, 4),
        "water cation": (bent_yz("O", "H", 0.999, 110.5), 1, 2),
        "cyano radical": (linear(("C", -0.6235), ("N", 0.5485)), 0, 2),
        "lithium atom": ([("Li", 0, 0, 0)], 0, 2),
    }


# (molecule, basis, puream, reference); puream None: the basis family's own convention.
CASES = [
    ("water", "sto-3g", None, "rhf"),
    ("water", "cc-pvdz", None, "rhf"),
    ("water", "6-31g*", None, "rhf"),
    ("ammonia", "cc-pvdz", None, "rhf"),
    ("methane", "6-31g*", None, "rhf"),
    ("dinitrogen", "cc-pvdz", None, "rhf"),
    ("hydrogen fluoride", "def2-svp", None, "rhf"),
    ("carbon monoxide", "6-31g*", None, "rhf"),
    ("ethylene", "cc-pvdz", None, "rhf"),
    ("hydrogen cyanide", "6-31g*", None, "rhf"),
    ("formaldehyde", "def2-svp", None, "rhf"),
    ("neon atom", "cc-pvdz", None, "rhf"),
    ("argon atom", "6-31g*", None, "rhf"),
    ("hydrogen chloride", "cc-pvdz", None, "rhf"),
    ("hydrogen sulfide", "6-31g*", None, "rhf"),
    ("ammonium cation", "6-31g*", None, "rhf"),
    ("hydronium cation", "cc-pvdz", None, "rhf"),
    ("hydroxide anion", "6-31g*", None, "rhf"),
    ("fluoride anion", "def2-svp", None, "rhf"),
    ("zinc(2+) ion", "def2-svp", None, "rhf"),
    ("hydroxyl radical", "6-31g*", None, "uhf"),
    ("hydroxyl radical", "cc-pvdz", None, "rohf"),
    ("methyl radical", "cc-pvdz", None, "uhf"),
    ("methyl radical", "6-31g*", None, "rohf"),
    ("dioxygen triplet", "cc-pvdz", None, "uhf"),
    ("dioxygen triplet", "6-31g*", None, "rohf"),
    ("amino radical", "def2-svp", None, "uhf"),
    ("methylene triplet", "cc-pvdz", None, "rohf"),
    ("nitrogen atom quartet", "cc-pvdz", None, "uhf"),
    ("nitrogen atom quartet", "6-31g*", None, "rohf"),
    ("water cation", "6-31g*", None, "uhf"),
    ("cyano radical", "cc-pvdz", None, "uhf"),
    ("lithium atom", "cc-pvdz", None, "uhf"),
]


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", default=DEFAULT_OUT)
    parser.add_argument("--only", default=None)
    args = parser.parse_args()
    table = molecules()
    entries = []
    for name, basis, puream, reference in CASES:
        if args.only and args.only != name:
            continue
        atoms, charge, multiplicity = table[name]
        bohr = [(s, x / BOHR_IN_ANGSTROM, y / BOHR_IN_ANGSTROM, z / BOHR_IN_ANGSTROM) for s, x, y, z in atoms]
        spec = {"molecule": psi4_job.molecule_block(bohr, charge, multiplicity), "basis": basis, "reference": reference,
                "puream": puream if puream is not None else ("6-31" not in basis)}
        result = psi4_job.run(BODY.format(spec=json.dumps(spec)), "case")
        entries.append({"name": name, "basis": basis, "reference": reference, "charge": charge, "multiplicity": multiplicity,
                        "kind": "spherical" if result["puream"] else "cartesian",
                        "geometry": [{"symbol": s, "x": x, "y": y, "z": z} for s, x, y, z in bohr], **result})
        print("%-24s %-9s %-4s %-4s n=%-3d E=%.10f docc=%s socc=%s mp2=%s" % (name, basis, reference, result["pointGroup"], result["nbf"],
              result["energy"], result["docc"], result["socc"], result.get("mp2")), file=sys.stderr)
    fixture = {
        "origin": psi4_job.psi4_origin(GENERATED_BY, (
            "SCF (scf_type pk) and MP2 (mp2_type conv; UHF by the occ module) results for invented, idealised "
            "geometries given in bohr in Tessera's standard orientation (no_com, no_reorient); psi4's own "
            "abelian point group in those axes; convergence 1e-10.")),
        "cases": entries,
    }
    with open(args.out, "w") as handle:
        json.dump(fixture, handle, indent=1)
        handle.write("\n")
    print("wrote %s (%d cases)" % (os.path.relpath(args.out, REPO_ROOT), len(entries)), file=sys.stderr)


if __name__ == "__main__":
    main()
