#!/usr/bin/python3
"""Generate tests/fixtures/irreps.psi4.json: basis functions per irreducible
representation, as counted by Debian's psi4 (a quantum-chemistry program used
here only as an independent reference), for small molecules in Tessera's
standard orientation.

For each molecule the script writes a psi4 input whose geometry is already in
the orientation Tessera's conventions prescribe for the molecule's abelian
point group (server/src/chemistry/symmetry/abelian.ts: z the two-fold or
principal axis; a planar C2v molecule in the yz plane; planar D2h with x
perpendicular to the plane and z through the most atoms; Cs with the mirror
as the xy plane). The geometries are idealised and invented (round bond
lengths and angles), except water (the experimental structure of Hoy & Bunker
1979, as in tests/fixtures/water.ts), built below from their construction, with every
symmetry element through the origin. psi4 is told not to move the molecule
(no_com, no_reorient), so its irrep labels refer to these same axes. psi4
then reports, per molecule and basis:

* its full point group (Molecule.get_full_point_group),
* the abelian group it computes in (Molecule.schoenflies_symbol),
* the irrep labels and the number of symmetry-adapted basis functions per
  irrep (Wavefunction.nsopi), and whether the basis is spherical (puream).

No SCF is run: building the wavefunction object is enough to count functions.

Usage (needs Debian's psi4 package; CI does not have it, the generated
fixture is committed):

    apt-get install psi4
    /usr/bin/python3 scripts/data/generate_irreps_fixture.py [--out FILE]
"""

import argparse
import json
import math
import os
import subprocess
import sys
import tempfile

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
DEFAULT_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "irreps.psi4.json")
GENERATED_BY = "scripts/data/generate_irreps_fixture.py"

DEG = math.pi / 180


def ring(symbol, radius, angles, fixed, plane):
    """Atoms at `radius` from an axis, at the given angles; `plane` names the two axes of the circle."""
    atoms = []
    for angle in angles:
        c, s = radius * math.cos(angle * DEG), radius * math.sin(angle * DEG)
        position = {"xy": (c, s, fixed), "yz": (fixed, c, s), "zx": (s, fixed, c), "xz": (c, fixed, s)}[plane]
        atoms.append((symbol,) + position)
    return atoms


def molecules():
    """(name, atoms, bases); atoms as (symbol, x, y, z) in angstrom, invented idealised geometries
    except water (Hoy & Bunker, J. Mol. Spectrosc. 74, 1 (1979))."""
    wy, wz = 0.756950, 0.585882  # 0.9572 * sin(52.26 deg), 0.9572 * cos(52.26 deg), as written in the tests
    d = 0.93 / math.sqrt(2)
    a = 1.09 / math.sqrt(3)
    ho = (-0.7375 - 0.95 * math.cos(100 * DEG), 0.95 * math.sin(100 * DEG))
    hp = (ho[0], 0.95 * math.sin(100 * DEG) * math.cos(50 * DEG), 0.95 * math.sin(100 * DEG) * math.sin(50 * DEG))
    small = ["sto-3g", "cc-pvdz", "6-31g*", "cc-pvtz"]
    medium = ["sto-3g", "cc-pvdz", "6-31g*"]
    return [
        # C2v: the molecular plane is yz, C2 along z. Not invented: Hoy & Bunker's experimental
        # structure (r 0.9572 A, HOH 104.52 deg), placed as in tests/fixtures/water.ts.
        ("water", [("O", 0, 0, 0), ("H", 0, wy, wz), ("H", 0, -wy, wz)], small),
        # Cs: C3 axis along x, one H in the mirror plane xy, the other two mirrored through it.
        ("ammonia", [("N", 0, 0, 0)] + [("H", -0.38, 0.94 * math.cos(t * DEG), 0.94 * math.sin(t * DEG)) for t in (0, 120, 240)], small),
        # D2: H on alternate cube corners, the C2 (S4) axes along x, y, z.
        ("methane", [("C", 0, 0, 0), ("H", a, a, a), ("H", -a, -a, a), ("H", -a, a, -a), ("H", a, -a, -a)], small),
        # D2h, planar: yz plane, C=C along z.
        ("ethylene", [("C", 0, 0, 0.665), ("C", 0, 0, -0.665), ("H", 0, 0.92, 1.23), ("H", 0, -0.92, 1.23),
                      ("H", 0, 0.92, -1.23), ("H", 0, -0.92, -1.23)], small),
        # D2h from D6h: ring in the xy plane, C atoms on the x axis.
        ("benzene", ring("C", 1.39, range(0, 360, 60), 0, "xy") + ring("H", 2.48, range(0, 360, 60), 0, "xy"), medium),
        # D2 from D2d: C=C=C along z, CH2 planes x = y (top) and x = -y (bottom).
        ("allene", [("C", 0, 0, 0), ("C", 0, 0, 1.31), ("C", 0, 0, -1.31), ("H", d, d, 1.87), ("H", -d, -d, 1.87),
                    ("H", d, -d, -1.87), ("H", -d, d, -1.87)], small),
        # C2h from D3d: C-C along x, a C2 axis along z, the mirror xy holds two H.
        ("staggered ethane", [("C", 0.765, 0, 0), ("C", -0.765, 0, 0)]
         + [("H", 1.16, 1.01 * math.cos(t * DEG), 1.01 * math.sin(t * DEG)) for t in (0, 120, 240)]
         + [("H", -1.16, 1.01 * math.cos(t * DEG), 1.01 * math.sin(t * DEG)) for t in (60, 180, 300)], medium),
        # C2v from D3h: C-C along y, a C2 axis along z, the mirror yz holds both C and two H.
        ("eclipsed ethane", [("C", 0, 0.765, 0), ("C", 0, -0.765, 0)]
         + [("H", 1.01 * math.cos(t * DEG), 1.16, 1.01 * math.sin(t * DEG)) for t in (90, 210, 330)]
         + [("H", 1.01 * math.cos(t * DEG), -1.16, 1.01 * math.sin(t * DEG)) for t in (90, 210, 330)], medium),
        # C2v from D3h, planar: a B-F bond along z, the molecule in the yz plane.
        ("boron trifluoride", [("B", 0, 0, 0)] + [("F", 0, 1.31 * math.sin(t * DEG), 1.31 * math.cos(t * DEG)) for t in (0, 120, 240)], small),
        # D2h from Oh.
        ("sulfur hexafluoride", [("S", 0, 0, 0), ("F", 1.56, 0, 0), ("F", -1.56, 0, 0), ("F", 0, 1.56, 0),
                                 ("F", 0, -1.56, 0), ("F", 0, 0, 1.56), ("F", 0, 0, -1.56)], ["sto-3g", "6-31g*", "cc-pvdz"]),
        # C2: O-O along x, the C2 axis along z.
        ("hydrogen peroxide", [("O", -0.7375, 0, 0), ("O", 0.7375, 0, 0), ("H",) + hp, ("H", -hp[0], -hp[1], hp[2])], small),
        # C2h: planar trans, the plane is xy, C2 along z.
        ("trans-HOOH", [("O", -0.7375, 0, 0), ("O", 0.7375, 0, 0), ("H", ho[0], ho[1], 0), ("H", -ho[0], -ho[1], 0)], small),
        # C2v from C-infinity-v: along z.
        ("hydrogen cyanide", [("H", 0, 0, -1.066), ("C", 0, 0, 0), ("N", 0, 0, 1.156)], small),
        # D2h from D-infinity-h: along z.
        ("carbon dioxide", [("C", 0, 0, 0), ("O", 0, 0, 1.16), ("O", 0, 0, -1.16)], small),
        # Cs: planar, the plane is xy.
        ("hypochlorous acid", [("O", 0, 0, 0), ("H", 0.96, 0, 0), ("Cl", 1.69 * math.cos(103 * DEG), 1.69 * math.sin(103 * DEG), 0)], small),
    ]


PSITHON = r'''
import builtins, json
molecule mol {{
0 {multiplicity}
{geometry}
units angstrom
no_com
no_reorient
}}
results = []
for basis in {bases!r}:
    wfn = core.Wavefunction.build(mol, basis)
    results.append({{
        "basis": basis,
        "nsopi": list(wfn.nsopi().to_tuple()),
        "nso": wfn.nso(),
        "puream": bool(wfn.basisset().has_puream()),
    }})
with builtins.open({result_path!r}, "w") as handle:
    json.dump({{
        "fullPointGroup": mol.get_full_point_group(),
        "pointGroup": mol.schoenflies_symbol(),
        "irrepLabels": list(mol.irrep_labels()),
        "results": results,
    }}, handle)
'''

ELECTRONS = {"H": 1, "B": 5, "C": 6, "N": 7, "O": 8, "F": 9, "S": 16, "Cl": 17}


def run_psi4(name, atoms, bases, workdir):
    electrons = sum(ELECTRONS[atom[0]] for atom in atoms)
    geometry = "\n".join("%s %.10f %.10f %.10f" % atom for atom in atoms)
    stem = os.path.join(workdir, name.replace(" ", "_"))
    with open(stem + ".in", "w") as handle:
        handle.write(PSITHON.format(multiplicity=1 if electrons % 2 == 0 else 2, geometry=geometry, bases=bases, result_path=stem + ".json"))
    subprocess.run(["psi4", stem + ".in", stem + ".out"], check=True, cwd=workdir, stdout=subprocess.DEVNULL)
    with open(stem + ".json") as handle:
        return json.load(handle)


def package_version(package):
    output = subprocess.run(["dpkg-query", "-W", "-f=${Version}", package], check=True, capture_output=True, text=True)
    return output.stdout.strip()


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", default=DEFAULT_OUT)
    args = parser.parse_args()
    version = subprocess.run(["psi4", "--version"], check=True, capture_output=True, text=True).stdout.strip()
    entries = []
    with tempfile.TemporaryDirectory() as workdir:
        for name, atoms, bases in molecules():
            result = run_psi4(name, atoms, bases, workdir)
            entries.append({
                "name": name,
                "symbols": [atom[0] for atom in atoms],
                "coordinates": [round(c, 10) for atom in atoms for c in atom[1:]],
                **result,
            })
            print("%-20s %-4s %-4s %s" % (name, result["fullPointGroup"], result["pointGroup"],
                                          ", ".join("%s %s" % (r["basis"], r["nsopi"]) for r in result["results"])), file=sys.stderr)
    fixture = {
        "origin": {
            "program": "psi4 (Debian package psi4)",
            "programVersion": version,
            "packageVersion": package_version("psi4"),
            "basisPackageVersion": package_version("psi4-data"),
            "generatedBy": GENERATED_BY,
            "note": ("Basis functions per irrep (psi4's symmetry-adapted orbitals, nsopi) of idealised, invented "
                     "geometries (water: Hoy & Bunker 1979, as in tests/fixtures/water.ts) given to psi4 in Tessera's standard orientation with no_com and no_reorient. "
                     "Labels and order as psi4 prints them (irrepLabels). No SCF was run."),
        },
        "molecules": entries,
    }
    with open(args.out, "w") as handle:
        json.dump(fixture, handle, indent=1)
        handle.write("\n")
    print("wrote %s" % os.path.relpath(args.out, REPO_ROOT), file=sys.stderr)


if __name__ == "__main__":
    main()
