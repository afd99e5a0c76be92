#!/usr/bin/python3
"""Generate the reference data for Tessera's active-space Hamiltonian checks from
Debian's psi4 (a quantum-chemistry program used here only as an independent
reference).

Writes three files:

* tests/fixtures/hamiltonian.psi4.json: for small molecules, psi4's converged
  SCF (RHF, or ROHF for the open-shell case) in the atomic-orbital basis
  (core Hamiltonian T + V, the electron-repulsion integrals (uv|ls) packed
  with their eightfold symmetry, the shells, the orbital coefficients and
  energies, nuclear repulsion, SCF energy), and for each listed active space
  psi4's CASCI energy (detci full CI inside the active space over the SCF
  orbitals; `restricted_docc` orbitals doubly occupied) together with the
  active-space integrals computed here with numpy from psi4's matrices (the
  frozen-core constant, the effective one-body term and (pq|rs)).
* tests/fixtures/hamiltonian-cas16.psi4.json: the active-space integrals of a
  CAS(16e,16o) of methanol in 6-31G (numpy from psi4's integrals), the input
  of the 32-qubit benchmark; no CI energy (out of reach for a check).
* tests/fixtures/water-631g.psi4.fcidump: psi4's own integral dump
  (psi4.driver.p4util.fcidump, Knowles & Handy format) of water in 6-31G with
  one frozen core and four frozen virtual orbitals, to compare Tessera's
  writer and integrals against.

Conventions: geometries in angstrom, given to psi4 with no_com, no_reorient
and symmetry c1 (so every orbital is in the one irrep); scf_type pk (exact
integrals); energies in hartree. Orbital coefficients are psi4's Ca, a
(functions x orbitals) matrix stored row-major; the atomic-orbital order is
psi4's. The geometries are idealised and invented (round bond lengths and
angles), except H2 at 0.7414 angstrom, the distance of Seeley, Richard & Love,
J. Chem. Phys. 137, 224109 (2012), and water at the structure of Hoy & Bunker,
J. Mol. Spectrosc. 74, 1 (1979), placed as in tests/fixtures/water.ts.

Usage (needs Debian's psi4 package; CI does not have it, the generated files
are committed):

    apt-get install psi4
    /usr/bin/python3 scripts/data/generate_hamiltonian_fixture.py
"""

import argparse
import json
import math
import os
import shutil
import subprocess
import sys
import tempfile

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
FIXTURES = os.path.join(REPO_ROOT, "tests", "fixtures")
GENERATED_BY = "scripts/data/generate_hamiltonian_fixture.py"
DEG = math.pi / 180


def water():
    # Hoy & Bunker, J. Mol. Spectrosc. 74, 1 (1979): r(OH) = 0.9572 angstrom, HOH = 104.52 degrees,
    # placed as in tests/fixtures/water.ts (O at the origin, yz plane, bisector along +z, six decimals).
    half = 104.52 / 2 * DEG
    y, z = round(0.9572 * math.sin(half), 6), round(0.9572 * math.cos(half), 6)
    return [("O", 0, 0, 0), ("H", 0, y, z), ("H", 0, -y, z)]


def methylene():
    # Triplet CH2: C-H 1.08 angstrom, H-C-H 134 degrees (invented, idealised).
    half = 67 * DEG
    return [("C", 0, 0, 0), ("H", 0, 1.08 * math.sin(half), -1.08 * math.cos(half)),
            ("H", 0, -1.08 * math.sin(half), -1.08 * math.cos(half))]


def methanol():
    # Staggered methanol with round bond lengths (C-O 1.43, C-H 1.09, O-H 0.96 angstrom) and
    # tetrahedral angles at C; the C-O-H angle 108.5 degrees. Invented, idealised; point group Cs.
    t = math.acos(-1 / 3)
    atoms = [("C", 0, 0, 0), ("O", 0, 0, 1.43)]
    for k, phi in enumerate((180, 60, 300)):
        r = 1.09
        atoms.append(("H", r * math.sin(t) * math.cos(phi * DEG), r * math.sin(t) * math.sin(phi * DEG), r * math.cos(t)))
    coh = 108.5 * DEG
    atoms.append(("H", 0.96 * math.sin(coh), 0, 1.43 - 0.96 * math.cos(coh)))
    return atoms


# (name, atoms, charge, multiplicity, basis, reference, [(core, active), ...])
CASES = [
    ("h2-sto3g", [("H", 0, 0, 0), ("H", 0, 0, 0.7414)], 0, 1, "sto-3g", "rhf", [(0, 2)]),
    ("h2-631g", [("H", 0, 0, 0), ("H", 0, 0, 0.7414)], 0, 1, "6-31g", "rhf", [(0, 4)]),
    ("lih-sto3g", [("Li", 0, 0, 0), ("H", 0, 0, 1.595)], 0, 1, "sto-3g", "rhf", [(1, 5), (0, 6)]),
    ("lih-631g", [("Li", 0, 0, 0), ("H", 0, 0, 1.595)], 0, 1, "6-31g", "rhf", [(1, 5)]),
    ("h2o-sto3g", water(), 0, 1, "sto-3g", "rhf", [(3, 4), (1, 6)]),
    ("h2o-631g", water(), 0, 1, "6-31g", "rhf", [(3, 4), (1, 6), (1, 8)]),
    ("ch2-triplet-sto3g", methylene(), 0, 3, "sto-3g", "rohf", [(1, 6)]),
    ("ch2-triplet-631g", methylene(), 0, 3, "6-31g", "rohf", [(1, 6)]),
]

# Active spaces whose CI is too large for a unit test: integrals only.
NO_CI = {("h2o-631g", 1, 8)}

BENCH = ("methanol-631g-cas16", methanol(), 0, 1, "6-31g", "rhf", (1, 16))

COMMON = r'''
import builtins, json
import numpy as np
molecule mol {{
{charge} {multiplicity}
{geometry}
units angstrom
symmetry c1
no_com
no_reorient
}}
set basis {basis}
set reference {reference}
set scf_type pk
set e_convergence 1e-12
set d_convergence 1e-10
set ints_tolerance 0.0
'''

REFERENCE_SCRIPT = COMMON + r'''
scf_energy, wfn = energy('scf', return_wfn=True)
mints = core.MintsHelper(wfn.basisset())
basis = wfn.basisset()
H = np.asarray(mints.ao_kinetic()) + np.asarray(mints.ao_potential())
G = np.asarray(mints.ao_eri())
C = np.asarray(wfn.Ca())
n = H.shape[0]

def packed(g):
    """(ij|kl) for i >= j, k >= l, ij >= kl, in that nested order."""
    m = g.shape[0]
    values = []
    for i in range(m):
        for j in range(i + 1):
            ij = i * (i + 1) // 2 + j
            for k in range(m):
                for l in range(k + 1):
                    if k * (k + 1) // 2 + l > ij:
                        continue
                    values.append(float(g[i, j, k, l]))
    return values

def active_integrals(ncore, nact):
    Cc = C[:, :ncore]
    Ca = C[:, ncore:ncore + nact]
    D = Cc @ Cc.T
    J = np.einsum('ijkl,kl->ij', G, D)
    K = np.einsum('ikjl,kl->ij', G, D)
    core_energy = float(np.sum(D * (2 * H + 2 * J - K)))
    h = Ca.T @ (H + 2 * J - K) @ Ca
    g = np.einsum('pi,qj,rk,sl,pqrs->ijkl', Ca, Ca, Ca, Ca, G, optimize=True)
    return {{
        "core": ncore,
        "active": nact,
        "constant": float(mol.nuclear_repulsion_energy()) + core_energy,
        "coreEnergy": core_energy,
        "h": [float(x) for x in h.reshape(-1)],
        "eri": packed(g),
    }}

spaces = []
for ncore, nact, with_ci in {spaces!r}:
    entry = active_integrals(ncore, nact)
    entry["electrons"] = {{"alpha": wfn.nalpha() - ncore, "beta": wfn.nbeta() - ncore}}
    if with_ci:
        core.clean()
        psi4.set_options({{"restricted_docc": [ncore], "active": [nact], "e_convergence": 1e-12, "r_convergence": 1e-9}})
        entry["casciEnergy"] = float(energy('fci', ref_wfn=wfn))
        core.revoke_global_option_changed("RESTRICTED_DOCC")
        core.revoke_global_option_changed("ACTIVE")
    spaces.append(entry)

result = {{
    "nuclearRepulsion": float(mol.nuclear_repulsion_energy()),
    "scfEnergy": float(scf_energy),
    "alpha": wfn.nalpha(),
    "beta": wfn.nbeta(),
    "spaces": spaces,
}}
if {with_ao!r}:
    result.update({{
        "functions": n,
        "orbitals": C.shape[1],
        "puream": bool(basis.has_puream()),
        "shells": [[basis.shell(s).am, basis.shell(s).function_index, basis.shell(s).nfunction, basis.shell(s).ncenter]
                   for s in range(basis.nshell())],
        "hCore": [float(x) for x in H.reshape(-1)],
        "eri": packed(G),
        "coefficients": [float(x) for x in C.reshape(-1)],
        "orbitalEnergies": [float(x) for x in np.asarray(wfn.epsilon_a())],
    }})
with builtins.open({result_path!r}, "w") as handle:
    json.dump(result, handle)
'''

FCIDUMP_SCRIPT = COMMON + r'''
set frozen_docc [{frozen_docc}]
set frozen_uocc [{frozen_uocc}]
scf_energy, wfn = energy('scf', return_wfn=True)
psi4.driver.p4util.fcidump.fcidump(wfn, {dump_path!r})
'''


def geometry_text(atoms):
    return "\n".join("%s %.10f %.10f %.10f" % atom for atom in atoms)


def run_psi4(script, stem, workdir):
    with open(stem + ".in", "w") as handle:
        handle.write(script)
    env = dict(os.environ, PSI_SCRATCH=workdir)
    subprocess.run(["psi4", stem + ".in", stem + ".out"], check=True, cwd=workdir, stdout=subprocess.DEVNULL, env=env)


def reference(name, atoms, charge, multiplicity, basis, ref, spaces, workdir, with_ao):
    stem = os.path.join(workdir, name)
    script = REFERENCE_SCRIPT.format(charge=charge, multiplicity=multiplicity, geometry=geometry_text(atoms), basis=basis,
                                     reference=ref, spaces=spaces, with_ao=with_ao, result_path=stem + ".json")
    run_psi4(script, stem, workdir)
    with open(stem + ".json") as handle:
        return json.load(handle)


def package_version(package):
    output = subprocess.run(["dpkg-query", "-W", "-f=${Version}", package], check=True, capture_output=True, text=True)
    return output.stdout.strip()


def origin(version, note):
    return {
        "program": "psi4 (Debian package psi4)",
        "programVersion": version,
        "packageVersion": package_version("psi4"),
        "basisPackageVersion": package_version("psi4-data"),
        "generatedBy": GENERATED_BY,
        "note": note,
    }


def write_json(path, data):
    with open(path, "w") as handle:
        json.dump(data, handle, indent=1)
        handle.write("\n")
    print("wrote %s" % os.path.relpath(path, REPO_ROOT), file=sys.stderr)


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", default=FIXTURES)
    args = parser.parse_args()
    version = subprocess.run(["psi4", "--version"], check=True, capture_output=True, text=True).stdout.strip()
    with tempfile.TemporaryDirectory() as workdir:
        cases = []
        for name, atoms, charge, multiplicity, basis, ref, spaces in CASES:
            listed = [(core, act, (name, core, act) not in NO_CI) for core, act in spaces]
            result = reference(name, atoms, charge, multiplicity, basis, ref, listed, workdir, True)
            cases.append({
                "name": name,
                "symbols": [atom[0] for atom in atoms],
                "coordinates": [round(c, 10) for atom in atoms for c in atom[1:]],
                "charge": charge,
                "multiplicity": multiplicity,
                "basis": basis,
                "reference": ref,
                **result,
            })
            print("%-20s E(SCF) %.10f  %s" % (name, result["scfEnergy"], ", ".join(
                "(%d,%d) %s" % (s["core"], s["active"], "%.10f" % s["casciEnergy"] if "casciEnergy" in s else "-")
                for s in result["spaces"])), file=sys.stderr)
        write_json(os.path.join(args.out, "hamiltonian.psi4.json"), {
            "origin": origin(version, (
                "psi4 SCF in the atomic-orbital basis (hCore = T + V, row-major; eri = (ij|kl) for i >= j, k >= l, "
                "ij >= kl with pair index i(i+1)/2 + j, nested in that order; coefficients = Ca, functions x orbitals, "
                "row-major; shells = [l, first function, functions, atom]) and, per active space (core orbitals "
                "doubly occupied below `active` orbitals, in psi4's energy order), the CASCI energy of psi4 detci "
                "(energy('fci') with restricted_docc and active) and the active-space integrals computed by this script "
                "with numpy from psi4's matrices: constant = nuclear repulsion + frozen-core energy, h = effective "
                "one-body term (active x active, row-major), eri = active (pq|rs) packed as above. Symmetry c1, "
                "scf_type pk, geometries invented except H2 at 0.7414 angstrom and water at Hoy & Bunker's structure.")),
            "cases": cases,
        })

        name, atoms, charge, multiplicity, basis, ref, (core_count, active_count) = BENCH
        result = reference(name, atoms, charge, multiplicity, basis, ref, [(core_count, active_count, False)], workdir, False)
        space = result["spaces"][0]
        write_json(os.path.join(args.out, "hamiltonian-cas16.psi4.json"), {
            "origin": origin(version, (
                "Active-space integrals of a CAS(16e,16o) of methanol in 6-31G over psi4's canonical RHF orbitals "
                "(orbitals 2-17; the oxygen 1s orbital frozen), computed by this script with numpy from psi4's "
                "matrices. Layout as in hamiltonian.psi4.json. Invented, idealised staggered geometry (Cs).")),
            "name": name,
            "symbols": [atom[0] for atom in atoms],
            "coordinates": [round(c, 10) for atom in atoms for c in atom[1:]],
            "basis": basis,
            "scfEnergy": result["scfEnergy"],
            "nuclearRepulsion": result["nuclearRepulsion"],
            **space,
        })

        stem = os.path.join(workdir, "water-fcidump")
        dump = stem + ".fcidump"
        run_psi4(FCIDUMP_SCRIPT.format(charge=0, multiplicity=1, geometry=geometry_text(water()), basis="6-31g",
                                       reference="rhf", frozen_docc=1, frozen_uocc=4, dump_path=dump), stem, workdir)
        target = os.path.join(args.out, "water-631g.psi4.fcidump")
        shutil.copyfile(dump, target)
        with open(os.path.join(args.out, "water-631g.psi4.fcidump.origin.json"), "w") as handle:
            json.dump(origin(version, (
                "psi4.driver.p4util.fcidump of water in 6-31G (geometry as the h2o-631g case of hamiltonian.psi4.json), "
                "RHF, scf_type pk, symmetry c1, frozen_docc [1], frozen_uocc [4]: 8 active orbitals, 8 electrons.")),
                handle, indent=1)
            handle.write("\n")
        print("wrote %s" % os.path.relpath(target, REPO_ROOT), file=sys.stderr)


if __name__ == "__main__":
    main()
