#!/usr/bin/python3
"""Generate tests/fixtures/active-space.psi4.json: reference values for Tessera's active-space
suggestions, computed with numpy from Debian's psi4 1.3.2 matrices (psi4 only supplies the SCF
orbitals, Fock matrix, overlaps and MO integrals; the selections are written out here from their
publications, independently of Tessera's TypeScript).

* Atomic-valence projection (AVAS: Sayfutyarova, Sun, Chan & Knizia, J. Chem. Theory Comput. 13,
  4063 (2017)): the named shells of the minimal basis STO-3G span A; P = |A> S_AA^-1 <A|. The
  eigenvalues of <i|P|j> over the doubly occupied and of <a|P|b> over the virtual canonical
  orbitals (descending), how many exceed the threshold, and the Fock eigenvalues within the active
  occupied and the active virtual blocks (invariant to rotations inside each block). ROHF: the
  singly occupied orbitals are kept active and not projected; the Fock operator is (Fa + Fb)/2.
* MP2 natural occupation numbers on RHF (all electrons), from the closed-shell unrelaxed density
  D_ij = 2 delta_ij - 2 sum_kab t_ki^ab t~_kj^ab, D_ab = 2 sum_ijc t_ij^ac t~_ij^bc, t~ = 2t - t(ab),
  with the count inside the window 0.02..1.98 (common practice).

Geometries (bohr, Tessera's standard orientation) are read from tests/fixtures/scf-reference.psi4.json
so both fixtures describe the same molecules.

Usage (needs Debian's psi4; CI does not, the generated fixture is committed):

    /usr/bin/python3 scripts/data/generate_active_space_fixture.py [--out FILE]
"""

import argparse
import json
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import psi4_job  # noqa: E402

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
DEFAULT_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "active-space.psi4.json")
SCF_FIXTURE = os.path.join(REPO_ROOT, "tests", "fixtures", "scf-reference.psi4.json")
GENERATED_BY = "scripts/data/generate_active_space_fixture.py"
THRESHOLD = 0.2
WINDOW = (0.02, 1.98)

BODY = r'''
spec = json.loads({spec!r})
mol = psi4.geometry(spec["molecule"])
psi4.set_options({{"basis": spec["basis"], "puream": spec["puream"], "scf_type": "pk", "reference": spec["reference"],
                   "e_convergence": 1e-10, "d_convergence": 1e-10, "maxiter": 300}})
energy, wfn = psi4.energy("scf", molecule=mol, return_wfn=True)
mints = psi4.core.MintsHelper(wfn.basisset())
S = np.asarray(mints.ao_overlap())
# Orbitals in AO basis, all irreps together, ascending energy, with occupations.
Ca = np.asarray(wfn.Ca_subset("AO", "ALL"))
eps = np.asarray(wfn.epsilon_a_subset("AO", "ALL"))
order = np.argsort(eps, kind="stable")
Ca, eps = Ca[:, order], eps[order]
nalpha, nbeta = wfn.nalpha(), wfn.nbeta()
# psi4 orders occupied orbitals by energy overall for these closed/open shells (aufbau in the fixture cases).
docc, socc = list(range(nbeta)), list(range(nbeta, nalpha))
virt = list(range(nalpha, Ca.shape[1]))
Fa, Fb = np.asarray(wfn.Fa_subset("AO")), np.asarray(wfn.Fb_subset("AO"))
F = Fa if spec["reference"] == "rhf" else 0.5 * (Fa + Fb)
result = {{"energy": energy, "alpha": nalpha, "beta": nbeta}}

minimal = psi4.core.BasisSet.build(mol, "ORBITAL", "STO-3G", puream=int(spec["puream"]), quiet=True)
mixed = np.asarray(mints.ao_overlap(wfn.basisset(), minimal))
Smin = np.asarray(psi4.core.MintsHelper(minimal).ao_overlap())
def shell_names(bs):
    names, seen = [], {{}}
    for i in range(bs.nshell()):
        centre, l = bs.shell_to_center(i), bs.shell(i).am
        k = seen.get((centre, l), 0)
        seen[(centre, l)] = k + 1
        names.append((centre, l, l + 1 + k, bs.shell_to_basis_function(i), bs.shell(i).nfunction))
    return names
shells = shell_names(minimal)
projections = []
for target in spec["targets"]:
    funcs = []
    for centre, l, n in target["shells"]:
        match = [s for s in shells if s[0] == centre and s[1] == l and (n is None or s[2] == n)]
        if n is None:
            match = match[-1:]
        assert match, (centre, l, n)
        for _, _, _, first, size in match:
            funcs.extend(range(first, first + size))
    A = mixed[:, funcs]
    P = A @ np.linalg.inv(Smin[np.ix_(funcs, funcs)]) @ A.T
    def project(indices):
        C = Ca[:, indices]
        values, vectors = np.linalg.eigh(C.T @ P @ C)
        values, vectors = values[::-1], vectors[:, ::-1]
        return values, C @ vectors
    so, Xo = project(docc)
    sv, Xv = project(virt)
    ao, av = Xo[:, so > spec["threshold"]], Xv[:, sv > spec["threshold"]]
    result_target = {{"label": target["label"], "shells": target["shells"], "functions": len(funcs),
        "occupiedProjections": [float(x) for x in so[:len(funcs)]], "virtualProjections": [float(x) for x in sv[:len(funcs)]],
        "activeOccupied": int(ao.shape[1]), "activeVirtual": int(av.shape[1]), "singlyOccupied": len(socc),
        "activeOccupiedEnergies": [float(x) for x in np.linalg.eigvalsh(ao.T @ F @ ao)] if ao.shape[1] else [],
        "activeVirtualEnergies": [float(x) for x in np.linalg.eigvalsh(av.T @ F @ av)] if av.shape[1] else []}}
    projections.append(result_target)
result["projections"] = projections

if spec["reference"] == "rhf" and spec.get("naturalOccupations"):
    o = nbeta
    Co, Cv = Ca[:, :o], Ca[:, o:]
    eo, ev = eps[:o], eps[o:]
    v = Cv.shape[1]
    iajb = np.asarray(mints.mo_eri(psi4.core.Matrix.from_array(Co), psi4.core.Matrix.from_array(Cv), psi4.core.Matrix.from_array(Co), psi4.core.Matrix.from_array(Cv)))
    iajb = iajb.reshape(o, v, o, v)
    denom = eo[:, None, None, None] - ev[None, :, None, None] + eo[None, None, :, None] - ev[None, None, None, :]
    t = iajb / denom                       # t[i,a,j,b] = t_ij^ab
    tt = 2 * t - t.transpose(0, 3, 2, 1)   # 2 t_ij^ab - t_ij^ba
    e2 = float(np.einsum("iajb,iajb->", t, 2 * iajb - iajb.transpose(0, 3, 2, 1)))
    Doo = 2 * np.eye(o) - 2 * np.einsum("kaib,kajb->ij", t, tt)
    Dvv = 2 * np.einsum("icjb,icja->ab", t, tt)
    occ = np.concatenate([np.linalg.eigvalsh(Doo), np.linalg.eigvalsh(Dvv)])[::-1]
    occ = np.sort(occ)[::-1]
    low, high = spec["window"]
    result["mp2"] = {{"correlationEnergy": e2, "naturalOccupations": [float(x) for x in occ],
                      "window": [low, high], "inside": int(((occ >= low) & (occ <= high)).sum()),
                      "above": int((occ > high).sum())}}
_emit(result)
'''

# (scf-reference case name, basis, reference, targets, natural occupations?)
# Targets: label, list of (atom index, l, n or None for the valence shell of that l).
CASES = [
    ("formaldehyde", "def2-svp", "rhf", [("C 2p, O 2p", [(0, 1, 2), (1, 1, 2)]), ("O 2s 2p", [(1, 0, 2), (1, 1, 2)])], True),
    ("water", "cc-pvdz", "rhf", [("O p", [(0, 1, None)]), ("O 2s 2p, H 1s", [(0, 0, 2), (0, 1, 2), (1, 0, 1), (2, 0, 1)])], True),
    ("dinitrogen", "cc-pvdz", "rhf", [("N 2p both", [(0, 1, 2), (1, 1, 2)])], True),
    ("zinc(2+) ion", "def2-svp", "rhf", [("Zn 3d", [(0, 2, 3)]), ("Zn 4s 3d", [(0, 0, 4), (0, 2, 3)])], False),
    ("methylene triplet", "cc-pvdz", "rohf", [("C 2p", [(0, 1, 2)])], False),
]


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", default=DEFAULT_OUT)
    args = parser.parse_args()
    with open(SCF_FIXTURE) as handle:
        scf_cases = json.load(handle)["cases"]
    entries = []
    for name, basis, reference, targets, natural in CASES:
        case = next(c for c in scf_cases if c["name"] == name and c["basis"] == basis and c["reference"] == reference)
        atoms = [(a["symbol"], a["x"], a["y"], a["z"]) for a in case["geometry"]]
        spec = {"molecule": psi4_job.molecule_block(atoms, case["charge"], case["multiplicity"]), "basis": basis,
                "reference": reference, "puream": case["kind"] == "spherical", "threshold": THRESHOLD, "window": list(WINDOW),
                "naturalOccupations": natural,
                "targets": [{"label": label, "shells": [list(s) for s in shells]} for label, shells in targets]}
        result = psi4_job.run(BODY.format(spec=json.dumps(spec)), "case")
        entries.append({"name": name, "basis": basis, "reference": reference, "threshold": THRESHOLD, **result})
        for p in result["projections"]:
            print("%-20s %-9s %-18s occ %d vir %d  %s | %s" % (name, basis, p["label"], p["activeOccupied"], p["activeVirtual"],
                  " ".join("%.3f" % x for x in p["occupiedProjections"]), " ".join("%.3f" % x for x in p["virtualProjections"])), file=sys.stderr)
        if "mp2" in result:
            print("%-20s mp2 %.8f inside %d above %d" % (name, result["mp2"]["correlationEnergy"], result["mp2"]["inside"], result["mp2"]["above"]), file=sys.stderr)
    fixture = {
        "origin": psi4_job.psi4_origin(GENERATED_BY, (
            "numpy on psi4 matrices (scf_type pk, convergence 1e-10; STO-3G minimal reference basis built by psi4; MP2 "
            "amplitudes from psi4 MO integrals): AVAS projection eigenvalues, active counts at threshold 0.2 and block "
            "Fock eigenvalues; RHF MP2 natural occupations (all electrons). Geometries from scf-reference.psi4.json.")),
        "cases": entries,
    }
    with open(args.out, "w") as handle:
        json.dump(fixture, handle, indent=1)
        handle.write("\n")


if __name__ == "__main__":
    main()
