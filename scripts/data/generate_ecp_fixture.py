#!/usr/bin/python3
"""Generate tests/fixtures/ecp-integrals.psi4.json, tests/fixtures/ecp-energies.psi4.json and
tests/fixtures/ecp-integrals.independent.json: effective-core-potential integrals and energies in
def2 bases (Rb and heavier carry ECPs), computed by Debian's psi4 (used here only as an
independent reference), and independent reference blocks where psi4 1.3.2 is not accurate enough.

ecp-integrals.psi4.json, per case (molecule, basis, spherical or cartesian functions):
* the whole ECP matrix from MintsHelper.ao_ecp() and the nuclear attraction ao_potential() (which
  psi4 builds with the charges less the ECP cores), in Tessera's function order and normalisation
  (contracts.ts: spherical functions in order m = -l ... +l, where psi4 stores 0, +1, -1, +2, -2,
  ...; cartesian functions rescaled to unit norm, where psi4 normalises every component like x^l),
  n*n row-major little-endian float64 in base64.

ecp-energies.psi4.json, per case: psi4's SCF energy (scf_type pk, e_convergence and
d_convergence 1e-10, guess sad) for each reference asked for, and for RHF the MP2 correlation
energy (mp2_type conv) with all electrons and with frozen core, with the number of frozen
orbitals psi4 chose (freeze_core true: the noble-gas core less the orbitals the ECP replaces).

ecp-integrals.independent.json: blocks computed by scripts/data/ecp_reference.py (brute-force
projection quadrature, or exact projection with mpmath for s shells), for two situations found
when comparing Tessera with psi4 1.3.2 and confirmed by these independent values:
* psi4 1.3.2's ECP integrals for 6th-row elements (def2's 60-electron cores: Hf-Rn) are wrong by
  up to 1e-2 in blocks between functions of l >= 2 on the ECP atom and functions on other atoms
  (psi4 issue #2564, "Deep ECPs feel broken", reports the same of its ECP code before libecpint);
  the whole matrix of a gold compound is given instead;
* blocks between two functions on a neighbouring atom (tight s, or l >= 2) where psi4's radial
  quadrature is off by 1e-8 to 3e-8.

Geometries are in bohr, invented (idealised from typical bond lengths, from memory), turned to a
general orientation and moved off the origin where the case says so; psi4 gets them with no_com,
no_reorient and symmetry c1.

Usage (needs Debian's psi4; CI does not, the generated fixtures are committed):

    /usr/bin/python3 scripts/data/generate_ecp_fixture.py [--only integrals|energies|independent]
"""

import argparse
import json
import math
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import psi4_job  # noqa: E402

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
INTEGRALS_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "ecp-integrals.psi4.json")
ENERGIES_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "ecp-energies.psi4.json")
INDEPENDENT_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "ecp-integrals.independent.json")
GENERATED_BY = "scripts/data/generate_ecp_fixture.py"

INTEGRALS_BODY = r'''
spec = json.loads({spec!r})

def enc(array):
    return base64.b64encode(np.ascontiguousarray(array, dtype="<f8").tobytes()).decode("ascii")

def reordering(bs):
    """Our index -> psi4 index."""
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

mol = psi4.geometry(spec["molecule"])
psi4.set_options({{"basis": spec["basis"], "puream": spec["puream"]}})
bs = psi4.core.Wavefunction.build(mol, spec["basis"]).basisset()
mints = psi4.core.MintsHelper(bs)
perm = reordering(bs)
S = mints.ao_overlap().np[np.ix_(perm, perm)]
scale = np.outer(1.0 / np.sqrt(np.diag(S)), 1.0 / np.sqrt(np.diag(S)))
U = np.asarray(mints.ao_ecp())[np.ix_(perm, perm)] * scale
V = mints.ao_potential().np[np.ix_(perm, perm)] * scale
_emit({{"nbf": bs.nbf(), "puream": bool(bs.has_puream()), "ecpCoreElectrons": bs.n_ecp_core(),
        "maxL": bs.max_am(), "ecp": enc(U), "potential": enc(V)}})
'''

ENERGIES_BODY = r'''
spec = json.loads({spec!r})
mol = psi4.geometry(spec["molecule"])
psi4.set_options({{"basis": spec["basis"], "puream": spec["puream"], "scf_type": "pk", "mp2_type": "conv",
                   "e_convergence": 1e-10, "d_convergence": 1e-10, "maxiter": 300, "guess": "sad"}})
result = {{"references": {{}}}}
for reference in spec["references"]:
    psi4.set_options({{"reference": reference, "freeze_core": False}})
    energy, scf = psi4.energy("scf", molecule=mol, return_wfn=True)
    entry = {{"energy": energy, "nbf": scf.nso(), "nalpha": scf.nalpha(), "nbeta": scf.nbeta()}}
    if reference == "rhf" and spec["mp2"]:
        psi4.energy("mp2", molecule=mol)
        entry["mp2"] = psi4.variable("MP2 CORRELATION ENERGY")
        psi4.set_options({{"freeze_core": True}})
        _, frozen = psi4.energy("mp2", molecule=mol, return_wfn=True)
        entry["mp2FrozenCore"] = psi4.variable("MP2 CORRELATION ENERGY")
        entry["frozenOrbitals"] = sum(frozen.frzcpi().to_tuple())
        psi4.set_options({{"freeze_core": False}})
    result["references"][reference] = entry
result["nuclearRepulsion"] = mol.nuclear_repulsion_energy()
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


def tilted(atoms, shift=(0.0, 0.0, 0.0), angles=(0.4, 1.1, -0.7)):
    """The molecule turned to a general orientation, then moved by `shift` (bohr)."""
    r = rotation(angles)
    out = []
    for symbol, x, y, z in atoms:
        p = [sum(r[i][k] * v for k, v in enumerate((x, y, z))) + shift[i] for i in range(3)]
        out.append((symbol, round(p[0], 10), round(p[1], 10), round(p[2], 10)))
    return out


OFF = (0.3, -0.2, 0.5)

# Invented geometries (bohr), bond lengths from memory: HI 1.61 Å, ICl 2.32 Å, I2 2.67 Å, IF 1.91 Å,
# RbH 2.37 Å, AgH 1.62 Å, AgCl 2.28 Å, XeF2 1.98 Å (linear), AuH 1.52 Å, HgH 1.74 Å, Hg-Cl 2.25 Å.
HI = [("I", 0.0, 0.0, 0.0), ("H", 0.0, 0.0, 3.04)]
ICL = [("I", 0.0, 0.0, 0.0), ("Cl", 0.0, 0.0, 4.38)]
I2 = [("I", 0.0, 0.0, -2.525), ("I", 0.0, 0.0, 2.525)]
IF = [("I", 0.0, 0.0, 0.0), ("F", 0.0, 0.0, 3.61)]
RBH = [("Rb", 0.0, 0.0, 0.0), ("H", 0.0, 0.0, 4.48)]
AGH = [("Ag", 0.0, 0.0, 0.0), ("H", 0.0, 0.0, 3.06)]
AGCL = [("Ag", 0.0, 0.0, 0.0), ("Cl", 0.0, 0.0, 4.31)]
XEF2 = [("Xe", 0.0, 0.0, 0.0), ("F", 0.0, 0.0, 3.74), ("F", 0.0, 0.0, -3.74)]
AUH = [("Au", 0.0, 0.0, 0.0), ("H", 0.0, 0.0, 2.88)]
HGH = [("Hg", 0.0, 0.0, 0.0), ("H", 0.0, 0.0, 3.29)]
HGCL2 = [("Hg", 0.0, 0.0, 0.0), ("Cl", 0.0, 0.0, 4.25), ("Cl", 0.0, 0.0, -4.25)]


def integral_cases():
    """(name, atoms, charge, multiplicity, basis, puream)."""
    return [
        ("hydrogen iodide, I at the origin", tilted(HI), 0, 1, "def2-svp", True),
        ("hydrogen iodide, I at the origin", tilted(HI), 0, 1, "def2-svp", False),
        ("hydrogen iodide, off the origin", tilted(HI, OFF), 0, 1, "def2-tzvp", True),
        ("hydrogen iodide, off the origin", tilted(HI, OFF), 0, 1, "def2-tzvp", False),
        ("iodine monofluoride, off the origin", tilted(IF, OFF), 0, 1, "def2-qzvp", True),
        ("iodine monofluoride, off the origin", tilted(IF, OFF), 0, 1, "def2-qzvp", False),
        ("diiodine, off the origin", tilted(I2, OFF), 0, 1, "def2-svp", True),
        ("rubidium hydride, Rb at the origin", tilted(RBH), 0, 1, "def2-svp", True),
        ("rubidium hydride, off the origin", tilted(RBH, OFF), 0, 1, "def2-tzvp", False),
        ("silver chloride, off the origin", tilted(AGCL, OFF), 0, 1, "def2-tzvp", True),
        ("silver chloride, off the origin", tilted(AGCL, OFF), 0, 1, "def2-tzvp", False),
        ("xenon difluoride, Xe at the origin", tilted(XEF2), 0, 1, "def2-svp", True),
        ("xenon difluoride, off the origin", tilted(XEF2, OFF), 0, 1, "def2-svp", False),
    ]


# Semi-local channels beyond def2 (projectors f and g, powers r^-2, r^-1, r^0), invented, added to
# iodine's potential to check what def2 data never exercises.
EXTRA_CHANNELS = [[3, [2, 1], [2.5, 1.2], [4.0, -1.5]], [4, [0, 2], [3.0, 1.7], [2.0, 0.8]]]


def independent_cases():
    """(name, atoms, basis, ECP atom, [(method, p, q)] or "all", extra channels): cartesian blocks."""
    return [
        ("iodine monofluoride, off the origin", tilted(IF, OFF), "def2-qzvp", 0,
         [("projection", 37, 37), ("projection", 37, 34), ("projection", 38, 31), ("projection", 38, 35)], []),
        ("xenon difluoride, off the origin", tilted(XEF2, OFF), "def2-svp", 0, [("s-shell", 16, 16), ("s-shell", 22, 22)], []),
        ("gold hydride, off the origin", tilted(AUH, OFF), "def2-svp", 0, "all", []),
        ("hydrogen iodide with f and g channels added, off the origin", tilted(HI, OFF), "def2-svp", 0,
         [("projection", p, q) for p, q in [(0, 0), (4, 0), (8, 8), (8, 4), (10, 0), (10, 8), (12, 8), (12, 12), (11, 9), (12, 4)]],
         EXTRA_CHANNELS),
    ]


def energy_cases():
    """(name, atoms, charge, multiplicity, basis, puream, references, mp2)."""
    return [
        ("hydrogen iodide", tilted(HI, OFF), 0, 1, "def2-svp", True, ["rhf"], True),
        ("hydrogen iodide", tilted(HI, OFF), 0, 1, "def2-tzvp", True, ["rhf"], True),
        ("hydrogen iodide", tilted(HI, OFF), 0, 1, "def2-svp", False, ["rhf"], False),
        ("iodine monochloride", tilted(ICL, OFF), 0, 1, "def2-svp", True, ["rhf"], True),
        ("diiodine", tilted(I2, OFF), 0, 1, "def2-svp", True, ["rhf"], False),
        ("xenon difluoride", tilted(XEF2, OFF), 0, 1, "def2-svp", True, ["rhf"], True),
        ("silver hydride", tilted(AGH, OFF), 0, 1, "def2-svp", True, ["rhf"], True),
        ("rubidium hydride", tilted(RBH, OFF), 0, 1, "def2-svp", True, ["rhf"], False),
        ("silver atom (doublet)", [("Ag", 0.0, 0.0, 0.0)], 0, 2, "def2-svp", True, ["uhf"], False),
        ("silver hydride cation", tilted(AGH, OFF), 1, 2, "def2-svp", True, ["uhf"], False),
        ("hydrogen iodide cation", tilted(HI, OFF), 1, 2, "def2-svp", True, ["uhf"], False),
    ]


def geometry(atoms):
    return [{"symbol": a[0], "x": a[1], "y": a[2], "z": a[3]} for a in atoms]


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--integrals", default=INTEGRALS_OUT)
    parser.add_argument("--energies", default=ENERGIES_OUT)
    parser.add_argument("--independent", default=INDEPENDENT_OUT)
    parser.add_argument("--only", choices=["integrals", "energies", "independent"])
    args = parser.parse_args()
    if args.only in (None, "independent"):
        write_independent(args.independent)
    if args.only in (None, "integrals"):
        entries = []
        for name, atoms, charge, multiplicity, basis, puream in integral_cases():
            spec = {"molecule": psi4_job.molecule_block(atoms, charge, multiplicity) + "\nsymmetry c1", "basis": basis, "puream": puream}
            result = psi4_job.run(INTEGRALS_BODY.format(spec=json.dumps(spec)), "ecp")
            entries.append({"name": name, "basis": basis, "kind": "spherical" if puream else "cartesian",
                            "charge": charge, "multiplicity": multiplicity, "geometry": geometry(atoms), **result})
            print("%-42s %-9s %-9s n=%d" % (name, basis, entries[-1]["kind"], result["nbf"]), file=sys.stderr)
        write(args.integrals, entries, (
            "ECP matrices (MintsHelper.ao_ecp) and nuclear attraction (ao_potential) in Tessera's function order "
            "and normalisation, for invented geometries in bohr (no_com, no_reorient, symmetry c1)."))
    if args.only in (None, "energies"):
        entries = []
        for name, atoms, charge, multiplicity, basis, puream, references, mp2 in energy_cases():
            spec = {"molecule": psi4_job.molecule_block(atoms, charge, multiplicity) + "\nsymmetry c1", "basis": basis,
                    "puream": puream, "references": references, "mp2": mp2}
            result = psi4_job.run(ENERGIES_BODY.format(spec=json.dumps(spec)), "ecp-energy")
            entries.append({"name": name, "basis": basis, "kind": "spherical" if puream else "cartesian",
                            "charge": charge, "multiplicity": multiplicity, "geometry": geometry(atoms), **result})
            summary = ", ".join("%s %.10f" % (k, v["energy"]) for k, v in result["references"].items())
            print("%-42s %-9s %-9s %s" % (name, basis, entries[-1]["kind"], summary), file=sys.stderr)
        write(args.energies, entries, (
            "SCF energies (scf_type pk, e/d_convergence 1e-10, guess sad) and MP2 correlation energies (mp2_type conv, "
            "all electrons and freeze_core true) in def2 bases with ECPs, for invented geometries in bohr "
            "(no_com, no_reorient, symmetry c1)."))


def write_independent(path):
    """Computes the independent blocks; blocks already in `path` for the same case are kept (the
    brute-force quadrature takes minutes per case), and the file is rewritten after each case."""
    import ecp_reference
    import mpmath
    import numpy
    import scipy
    previous = {}
    if os.path.exists(path):
        with open(path) as handle:
            for case in json.load(handle)["cases"]:
                for block in case["blocks"]:
                    previous[(case["name"], case["basis"], json.dumps(case["geometry"]), tuple(block["shells"]), block["method"])] = block["values"]
    entries = []
    for name, atoms, basis, ecp_atom, blocks, extra in independent_cases():
        if blocks == "all":
            count = len(ecp_reference.molecule_shells(basis, atoms))
            blocks = [("projection", p, q) for p in range(count) for q in range(p + 1)]
        values = []
        for method, p, q in blocks:
            key = (name, basis, json.dumps(geometry(atoms)), (p, q), method)
            if key in previous:
                block = previous[key]
            elif method == "projection":
                block = ecp_reference.projection_block(basis, atoms, ecp_atom, p, q, extra_channels=extra, **PROJECTION_GRID)
            else:
                assert p == q
                block = ecp_reference.s_shell_diagonal(basis, atoms, ecp_atom, p)
            values.append({"shells": [p, q], "method": method, "values": block})
        entry = {"name": name, "basis": basis, "kind": "cartesian", "ecpAtom": ecp_atom, "geometry": geometry(atoms), "blocks": values}
        if extra:
            entry["extraChannels"] = extra
        entries.append(entry)
        print("%-42s %-9s %d blocks" % (name, basis, len(values)), file=sys.stderr)
        fixture = {
            "origin": {
                "program": "scripts/data/ecp_reference.py (numpy %s, scipy %s, mpmath %s from Debian)" % (numpy.__version__, scipy.__version__, mpmath.__version__),
                "generatedBy": GENERATED_BY,
                "note": ("Cartesian ECP blocks (each component with unit norm) by brute-force projection quadrature "
                         "(polar %(polar)d x azimuthal %(azimuthal)d x radial %(radial_points)d points) or, for s shells, exact "
                         "projection and mpmath quadrature; basis data from server/src/chemistry/data/basis-sets. Invented "
                         "geometries in bohr." % PROJECTION_GRID),
            },
            "cases": entries,
        }
        with open(path, "w") as handle:
            json.dump(fixture, handle, indent=1)
            handle.write("\n")
    print("wrote %s (%d bytes)" % (os.path.relpath(path, REPO_ROOT), os.path.getsize(path)), file=sys.stderr)


PROJECTION_GRID = {"polar": 96, "azimuthal": 192, "radial_points": 1000}


def write(path, entries, note):
    fixture = {"origin": psi4_job.psi4_origin(GENERATED_BY, note), "cases": entries}
    with open(path, "w") as handle:
        json.dump(fixture, handle, indent=1)
        handle.write("\n")
    print("wrote %s (%d bytes)" % (os.path.relpath(path, REPO_ROOT), os.path.getsize(path)), file=sys.stderr)


if __name__ == "__main__":
    main()
