#!/usr/bin/python3
"""Generate tests/fixtures/dmet-bath.psi4.json: the DMET bath of each fragment of a few small
systems, from Debian's psi4 (the mean field) and numpy (the Schmidt decomposition), as an
independent reference for server/src/electronic/embedding/.

Per system psi4 runs the SCF (scf_type pk, e_convergence and d_convergence 1e-10) and the script
dumps the overlap S, the per-spin AO densities Da and Db, and the atom each basis function sits on
(basisset.function_to_center). numpy then builds, per fragment and spin:

* every function scaled to unit norm (S_ii = 1; psi4 leaves cartesian functions of l >= 2 with
  the norm of the x^l component, Tessera normalises each, and Löwdin orbitals depend on the scale);
  the overlap and densities in the fixture are the scaled ones;
* the density in Löwdin's symmetrically orthogonalised atomic orbitals, D = S^1/2 Da S^1/2
  (P.-O. Löwdin, J. Chem. Phys. 18, 365 (1950)); it is idempotent for a single determinant;
* the fragment's orbitals F = the orthogonalised functions on the fragment's atoms, the
  environment E = all the others;
* the singular values of the environment-fragment block D[E, F] (numpy.linalg.svd, LAPACK gesdd),
  descending: the Schmidt decomposition of the determinant between fragment and environment
  (G. Knizia, G. K.-L. Chan, Phys. Rev. Lett. 109, 186404 (2012); S. Wouters et al., J. Chem.
  Theory Comput. 12, 2706 (2016)); per spin they lie in [0, 1/2], sqrt(l(1 - l)) of the fragment's
  occupations l;
* the bath: the left singular vectors with a singular value above THRESHOLD;
* for closed shells the same in intrinsic atomic orbitals (G. Knizia, J. Chem. Theory Comput. 9,
  4834 (2013)) built from the minimal basis MINIMAL_BASIS, written here from the paper's formulas:
  the density A^T S1 P S1 A over the IAOs, fragment = the IAOs of the fragment's atoms;
* the impurity's electrons of that spin, the trace of D over the fragment's orbitals and the bath,
  and the environment's (core) electrons, the rest.

Geometries are invented (round distances), the waters in them Hoy & Bunker's (r 0.9572 A,
104.52 degrees, tests/fixtures/water.ts), written in angstrom here and given to psi4 in bohr
(0.529177210903 A, CODATA 2018) with no_com and no_reorient, so atoms keep their order and place.

Usage (needs Debian's psi4; CI does not, the generated fixture is committed):

    /usr/bin/python3 scripts/data/generate_dmet_bath_fixture.py [--out FILE] [--only NAME]
"""

import argparse
import json
import math
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import psi4_job  # noqa: E402

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
DEFAULT_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "dmet-bath.psi4.json")
GENERATED_BY = "scripts/data/generate_dmet_bath_fixture.py"
BOHR_IN_ANGSTROM = 0.529177210903
DEG = math.pi / 180
# The bath threshold on singular values of the per-spin density; Tessera's default (embedding/bath.ts).
THRESHOLD = 1e-6
# The minimal basis the intrinsic atomic orbitals are built from (Tessera's default, embedding/iao.ts).
MINIMAL_BASIS = "sto-3g"

BODY = r'''
spec = json.loads({spec!r})
mol = psi4.geometry(spec["molecule"])
psi4.set_options({{"basis": spec["basis"], "puream": spec["puream"], "scf_type": "pk", "reference": spec["reference"],
                   "e_convergence": 1e-10, "d_convergence": 1e-10, "maxiter": 300}})
energy, wfn = psi4.energy("scf", molecule=mol, return_wfn=True)
basis = wfn.basisset()
mints = psi4.core.MintsHelper(basis)
S = np.asarray(mints.ao_overlap())
Da = np.asarray(wfn.Da())
Db = np.asarray(wfn.Db())
centers = [basis.function_to_center(i) for i in range(basis.nbf())]
# The minimal basis of the intrinsic atomic orbitals and its overlaps with the main basis.
minimal = psi4.core.BasisSet.build(mol, "BASIS", spec["minimal"], puream=basis.has_puream())
S2 = np.asarray(mints.ao_overlap(minimal, minimal))
S12 = np.asarray(mints.ao_overlap(basis, minimal))
Ca = np.asarray(wfn.Ca())[:, :wfn.nalpha()]
# The molecule is run in c1 (see main), so wfn.Da() and wfn.Db() are in the AO basis.
_emit({{"energy": energy, "nbf": basis.nbf(), "puream": bool(basis.has_puream()), "centers": centers,
        "overlap": S.ravel().tolist(), "alpha": Da.ravel().tolist(), "beta": Db.ravel().tolist(),
        "nalpha": wfn.nalpha(), "nbeta": wfn.nbeta(),
        "minimalCenters": [minimal.function_to_center(i) for i in range(minimal.nbf())],
        "minimalOverlap": S2.ravel().tolist(), "mixedOverlap": S12.ravel().tolist(), "occupiedAlpha": Ca.ravel().tolist()}})
'''


def water(origin=(0.0, 0.0, 0.0)):
    """Hoy & Bunker's water in tests/fixtures/water.ts's placement: O at `origin`, the molecule in the yz plane, H towards +z."""
    half = 104.52 / 2 * DEG
    y, z = 0.9572 * math.sin(half), 0.9572 * math.cos(half)
    ox, oy, oz = origin
    return [("O", ox, oy, oz), ("H", ox, oy + y, oz + z), ("H", ox, oy - y, oz + z)]


def donor_water(o_z):
    """A water below the first whose O sits at (0, 0, o_z) and whose first H points along +z at the first water's O."""
    r = 0.9572
    angle = 104.52 * DEG
    return [("O", 0.0, 0.0, o_z), ("H", 0.0, 0.0, o_z + r), ("H", r * math.sin(angle), 0.0, o_z + r * math.cos(angle))]


def systems():
    """name -> (atoms in angstrom, charge, multiplicity, basis, reference, fragments {name: atom indices})."""
    return {
        # Invented: an O-H...O hydrogen bond with O-O 2.91 A along z.
        "water dimer": (water() + donor_water(-2.91), 0, 1, "cc-pvdz", "rhf", {"acceptor": [0, 1, 2], "donor": [3, 4, 5]}),
        # Ethylene as in scripts/data/generate_scf_reference_fixture.py (invented, idealised), cut at the C=C bond.
        "ethylene": ([("C", 0, 0, 0.665), ("C", 0, 0, -0.665), ("H", 0, 0.92, 1.23), ("H", 0, -0.92, 1.23),
                      ("H", 0, 0.92, -1.23), ("H", 0, -0.92, -1.23)], 0, 1, "6-31g*", "rhf", {"upper CH2": [0, 2, 3], "lower CH2": [1, 4, 5]}),
        # Invented: Li+ on the water's C2 axis, 1.85 A from O on the side away from the hydrogens.
        "lithium cation with water": ([("Li", 0.0, 0.0, -1.85)] + water(), 1, 1, "cc-pvdz", "rhf", {"lithium": [0], "water": [1, 2, 3]}),
        # Invented: a hydroxyl radical donating its H to a water's O (O-O 2.92 A), spin-unrestricted.
        "hydroxyl radical with water": (water() + [("O", 0.0, 0.0, -2.92), ("H", 0.0, 0.0, -2.92 + 0.970)], 0, 2, "6-31g*", "uhf",
                                        {"water": [0, 1, 2], "hydroxyl": [3, 4]}),
    }


def bath(np, density, centers, atoms, threshold):
    """The Schmidt decomposition of one spin's orthogonalised density for one fragment."""
    fragment = [i for i, c in enumerate(centers) if c in atoms]
    environment = [i for i, c in enumerate(centers) if c not in atoms]
    block = density[np.ix_(environment, fragment)]
    u, sigma, _ = np.linalg.svd(block, full_matrices=False)
    kept = int(np.sum(sigma > threshold))
    baths = u[:, :kept]
    impurity = float(np.trace(density[np.ix_(fragment, fragment)]) + np.trace(baths.T @ density[np.ix_(environment, environment)] @ baths))
    occupations = np.linalg.eigvalsh(density[np.ix_(fragment, fragment)])
    return {"fragmentOrbitals": len(fragment), "singularValues": sigma.tolist(), "bathOrbitals": kept, "impurityElectrons": impurity,
            "fragmentOccupations": sorted(occupations.tolist(), reverse=True)}


def symmetric_orthonormal(np, c, s):
    """C (C^T S C)^(-1/2): Löwdin's symmetric orthonormalisation of the columns of C in the metric S."""
    w, v = np.linalg.eigh(c.T @ s @ c)
    return c @ (v / np.sqrt(w)) @ v.T


def intrinsic_atomic_orbitals(np, s1, s2, s12, occupied):
    """Knizia, J. Chem. Theory Comput. 9, 4834 (2013), eqs. 1-2 and the appendix: the IAOs (n1 x n2)
    A = orth[(O Ot + (1 - O)(1 - Ot)) P12], O = C C^T S1, Ot = Ct Ct^T S1, Ct = orth(P12 P21 C)."""
    p12 = np.linalg.solve(s1, s12)
    p21 = np.linalg.solve(s2, s12.T)
    depolarised = symmetric_orthonormal(np, p12 @ p21 @ occupied, s1)
    n = s1.shape[0]
    o = occupied @ occupied.T @ s1
    ot = depolarised @ depolarised.T @ s1
    a = (o @ ot + (np.eye(n) - o) @ (np.eye(n) - ot)) @ p12
    return symmetric_orthonormal(np, a, s1)


def analyse_iao(result, fragments, threshold):
    """The bath in intrinsic atomic orbitals (closed shells): D = A^T S1 P S1 A over the minimal basis's functions."""
    import numpy as np
    n = result["nbf"]
    s1 = np.array(result["overlap"]).reshape(n, n)
    m = len(result["minimalCenters"])
    s2 = np.array(result["minimalOverlap"]).reshape(m, m)
    s12 = np.array(result["mixedOverlap"]).reshape(n, m)
    occupied = np.array(result["occupiedAlpha"]).reshape(n, -1)
    a = intrinsic_atomic_orbitals(np, s1, s2, s12, occupied)
    density = a.T @ s1 @ np.array(result["alpha"]).reshape(n, n) @ s1 @ a
    out = []
    for name, atoms in fragments.items():
        entry = bath(np, density, result["minimalCenters"], set(atoms), threshold)
        entry["idempotencyError"] = float(np.max(np.abs(density @ density - density)))
        out.append({"name": name, **entry})
    return out


def analyse(result, fragments, threshold):
    import numpy as np
    n = result["nbf"]
    s = np.array(result["overlap"]).reshape(n, n)
    # Unit-norm functions first: psi4 leaves cartesian functions of l >= 2 with the x^l component's
    # norm (xy has S_ii = 1/3), Tessera normalises each; Löwdin orbitals depend on the functions' scale.
    scale = 1 / np.sqrt(np.diag(s))
    s = s * np.outer(scale, scale)
    for spin in ("alpha", "beta"):
        result[spin] = (np.array(result[spin]).reshape(n, n) / np.outer(scale, scale)).ravel().tolist()
    result["overlap"] = s.ravel().tolist()
    m = len(result["minimalCenters"])
    result["mixedOverlap"] = (np.array(result["mixedOverlap"]).reshape(n, m) * scale[:, None]).ravel().tolist()
    result["occupiedAlpha"] = (np.array(result["occupiedAlpha"]).reshape(n, -1) / scale[:, None]).ravel().tolist()
    w, v = np.linalg.eigh(s)
    root = (v * np.sqrt(np.maximum(w, 0))) @ v.T
    out = []
    for name, atoms in fragments.items():
        entry = {"name": name, "atoms": atoms}
        for spin in ("alpha", "beta"):
            density = root @ np.array(result[spin]).reshape(n, n) @ root
            idempotency = float(np.max(np.abs(density @ density - density)))
            entry[spin] = {**bath(np, density, result["centers"], set(atoms), threshold), "idempotencyError": idempotency}
        entry["impurityElectrons"] = entry["alpha"]["impurityElectrons"] + entry["beta"]["impurityElectrons"]
        entry["coreElectrons"] = result["nalpha"] + result["nbeta"] - entry["impurityElectrons"]
        out.append(entry)
    return out


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", default=DEFAULT_OUT)
    parser.add_argument("--only", default=None)
    args = parser.parse_args()
    import numpy as np
    cases = []
    for name, (atoms, charge, multiplicity, basis, reference, fragments) in systems().items():
        if args.only and args.only != name:
            continue
        bohr = [(s, x / BOHR_IN_ANGSTROM, y / BOHR_IN_ANGSTROM, z / BOHR_IN_ANGSTROM) for s, x, y, z in atoms]
        molecule = psi4_job.molecule_block(bohr, charge, multiplicity) + "\nsymmetry c1"
        spec = {"molecule": molecule, "basis": basis, "reference": reference, "puream": "6-31" not in basis, "minimal": MINIMAL_BASIS}
        result = psi4_job.run(BODY.format(spec=json.dumps(spec)), "case")
        analysed = analyse(result, fragments, THRESHOLD)  # scales result's overlap and densities to unit-norm functions
        iao = analyse_iao(result, fragments, THRESHOLD) if reference == "rhf" else None
        entry = {
            "name": name, "basis": basis, "reference": reference, "charge": charge, "multiplicity": multiplicity,
            "kind": "spherical" if result["puream"] else "cartesian",
            "geometry": [{"symbol": s, "x": x, "y": y, "z": z} for s, x, y, z in bohr],
            "energy": result["energy"], "functions": result["nbf"], "electrons": {"alpha": result["nalpha"], "beta": result["nbeta"]},
            "functionCenter": result["centers"], "threshold": THRESHOLD,
            "fragments": analysed,
            "minimalBasis": MINIMAL_BASIS, "minimalFunctionCenter": result["minimalCenters"], "iao": iao,
            "minimalOverlap": result["minimalOverlap"] if iao else None, "mixedOverlap": result["mixedOverlap"] if iao else None,
            "occupiedAlpha": result["occupiedAlpha"] if iao else None,
            "overlap": result["overlap"], "densityAlpha": result["alpha"],
            "densityBeta": result["beta"] if reference != "rhf" else None,
        }
        cases.append(entry)
        summary = "; ".join("%s: bath %d/%d, impurity %.6f e" % (f["name"], f["alpha"]["bathOrbitals"], f["beta"]["bathOrbitals"], f["impurityElectrons"])
                            for f in entry["fragments"])
        print("%-28s %-8s %-4s n=%-3d E=%.10f %s" % (name, basis, reference, result["nbf"], result["energy"], summary), file=sys.stderr)
    fixture = {
        "origin": {
            **psi4_job.psi4_origin(GENERATED_BY, (
                "SCF (scf_type pk, convergence 1e-10, symmetry c1) of invented geometries given in bohr (no_com, no_reorient); "
                "overlap from MintsHelper.ao_overlap(), per-spin AO densities wfn.Da() and wfn.Db(), basis function centres "
                "from basisset.function_to_center(), all in psi4's AO order (row-major). The bath per fragment and spin is "
                "computed by this script with numpy: functions scaled to unit norm (the fixture's overlap and densities are scaled), Löwdin-orthogonalised density S^1/2 D S^1/2, SVD of its environment-fragment "
                "block, bath = singular values above the threshold, impurity electrons = trace over fragment and bath; "
                "for RHF also in intrinsic atomic orbitals from the minimal basis (minimalOverlap, mixedOverlap = "
                "MintsHelper.ao_overlap(main, minimal) with rows scaled, occupiedAlpha = the occupied columns of wfn.Ca(), scaled).")),
            "numpyVersion": np.__version__,
        },
        "cases": cases,
    }
    with open(args.out, "w") as handle:
        json.dump(fixture, handle, indent=1)
        handle.write("\n")
    print("wrote %s (%d cases)" % (os.path.relpath(args.out, REPO_ROOT), len(cases)), file=sys.stderr)


if __name__ == "__main__":
    main()
