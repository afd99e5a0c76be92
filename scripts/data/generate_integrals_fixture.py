#!/usr/bin/python3
"""Generate tests/fixtures/integrals.psi4.json: one- and two-electron integral
blocks over contracted Gaussian shells, computed by Debian's psi4 (used here
only as an independent reference) through its MintsHelper (ao_overlap,
ao_kinetic, ao_potential, ao_eri_shell).

For each case (molecule, basis, spherical or cartesian functions) the fixture
holds:

* the geometry (bohr) and psi4's shell list (centre, l, exponents, psi4's
  normalised contraction coefficients), so that the tests can check that
  Tessera builds the same shells in the same order;
* overlap, kinetic and nuclear-attraction blocks for a selection of shell
  pairs covering every (la, lb) combination, on one centre and on two;
* electron-repulsion blocks (ab|cd) for a selection of shell quartets, up to
  (gg|gg) for spherical g shells.

Blocks are stored in psi4's own function order and normalisation: spherical
functions in psi4's order (m = 0, +1, -1, +2, -2, ...), cartesian functions
in the order xx, xy, xz, yy, yz, zz, ... all normalised like the x^l
component. The tests map them onto Tessera's conventions (see
tests/electronic/integrals.psi4.test.ts).

The geometries are invented (slightly distorted so that no integral vanishes
by symmetry). psi4 is told not to move the molecules (no_com, no_reorient,
symmetry c1).

Usage (needs Debian's psi4 package; CI does not have it, the generated
fixture is committed):

    apt-get install psi4
    /usr/bin/python3 scripts/data/generate_integrals_fixture.py [--out FILE] [--check]
"""

import argparse
import json
import os
import subprocess
import sys
import tempfile

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
DEFAULT_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "integrals.psi4.json")
GENERATED_BY = "scripts/data/generate_integrals_fixture.py"

# (name, atoms as (symbol, x, y, z) in bohr, charge, basis, puream, ERI patterns)
# ERI patterns are angular momenta (la, lb, lc, ld); the script picks shells of
# those momenta on changing centres.
LOW = [(0, 0, 0, 0), (1, 0, 0, 0), (1, 0, 1, 0), (1, 1, 0, 0), (1, 1, 1, 1), (2, 0, 0, 0),
       (2, 1, 0, 0), (2, 1, 1, 0), (2, 2, 0, 0), (2, 0, 2, 0), (2, 1, 2, 1), (2, 2, 2, 2), (0, 2, 1, 2)]
HIGH = [(3, 0, 0, 0), (3, 3, 0, 0), (3, 1, 2, 0), (3, 3, 3, 3), (4, 0, 0, 0), (4, 4, 0, 0),
        (4, 0, 4, 0), (4, 2, 1, 3), (0, 4, 3, 1), (4, 4, 4, 4), (4, 3, 2, 1), (2, 4, 4, 2)]
HIGH_CART = [(3, 0, 0, 0), (3, 3, 0, 0), (3, 1, 2, 0), (3, 2, 3, 1), (4, 0, 0, 0), (4, 4, 0, 0),
             (4, 0, 4, 0), (4, 2, 1, 3), (0, 4, 3, 1), (4, 3, 2, 1), (4, 4, 1, 1)]

WATER = [("O", 0.0, 0.1, -0.12), ("H", 0.05, 1.43, 0.98), ("H", -0.02, -1.45, 1.01)]
HF = [("F", 0.0, 0.0, 0.0), ("H", 0.11, -0.07, 1.733)]
CUH = [("Cu", 0.0, 0.0, 0.0), ("H", 0.08, 0.13, 2.77)]
FORMALDEHYDE = [("C", 0.0, 0.0, 0.0), ("O", 0.02, -0.03, 2.28), ("H", 0.0, 1.77, -1.1), ("H", 0.12, -1.76, -1.12)]
HBR = [("Br", 0.0, 0.0, 0.0), ("H", -0.1, 0.05, 2.67)]
H2 = [("H", 0.0, 0.0, 0.0), ("H", 0.0, 0.0, 1.4)]
HEH = [("He", 0.0, 0.0, 0.0), ("H", 0.0, 0.0, 1.4632)]

CASES = [
    ("water cc-pVDZ spherical", WATER, 0, "cc-pvdz", True, LOW),
    ("water cc-pVDZ cartesian", WATER, 0, "cc-pvdz", False, LOW),
    ("formaldehyde 6-31G* cartesian", FORMALDEHYDE, 0, "6-31g*", False, LOW),
    ("hydrogen fluoride cc-pVQZ spherical", HF, 0, "cc-pvqz", True, LOW + HIGH),
    ("hydrogen fluoride cc-pVQZ cartesian", HF, 0, "cc-pvqz", False, HIGH_CART),
    ("copper hydride def2-TZVP spherical", CUH, 0, "def2-tzvp", True, LOW + HIGH[:4]),
    ("hydrogen bromide cc-pVTZ spherical", HBR, 0, "cc-pvtz", True, LOW[:6] + HIGH[:3]),
    ("hydrogen STO-3G spherical", H2, 0, "sto-3g", True, "all"),
    ("helium hydride cation STO-3G spherical", HEH, 1, "sto-3g", True, "all"),
]

PSITHON = r'''
import builtins, json
import numpy as np
molecule mol {{
{charge} 1
{geometry}
units bohr
symmetry c1
no_com
no_reorient
}}
set puream {puream}
wfn = core.Wavefunction.build(mol, {basis!r})
bs = wfn.basisset()
mints = core.MintsHelper(bs)
shells = []
for i in range(bs.nshell()):
    sh = bs.shell(i)
    shells.append({{
        "center": sh.ncenter, "l": sh.am, "offset": sh.function_index, "size": sh.nfunction,
        "exponents": [sh.exp(k) for k in range(sh.nprimitive)],
        "coefficients": [sh.coef(k) for k in range(sh.nprimitive)],
        "originalCoefficients": [sh.original_coef(k) for k in range(sh.nprimitive)],
    }})
S = np.array(mints.ao_overlap())
T = np.array(mints.ao_kinetic())
V = np.array(mints.ao_potential())
pairs = json.loads({pairs!r})
quartets = json.loads({quartets!r})
def block(M, p, q):
    a, b = shells[p], shells[q]
    return M[a["offset"]:a["offset"] + a["size"], b["offset"]:b["offset"] + b["size"]].ravel().tolist()
one = [{{"shells": [p, q], "overlap": block(S, p, q), "kinetic": block(T, p, q), "potential": block(V, p, q)}} for p, q in pairs]
two = [{{"shells": list(s), "values": np.array(mints.ao_eri_shell(*s)).ravel().tolist()}} for s in quartets]
with builtins.open({result_path!r}, "w") as handle:
    json.dump({{"puream": bool(bs.has_puream()), "nbf": bs.nbf(), "shells": shells,
               "nuclearRepulsion": mol.nuclear_repulsion_energy(), "oneElectron": one, "twoElectron": two}}, handle)
'''

PROBE = r'''
import builtins, json
molecule mol {{
{charge} 1
{geometry}
units bohr
symmetry c1
no_com
no_reorient
}}
set puream {puream}
wfn = core.Wavefunction.build(mol, {basis!r})
bs = wfn.basisset()
with builtins.open({result_path!r}, "w") as handle:
    json.dump([[bs.shell(i).ncenter, bs.shell(i).am] for i in range(bs.nshell())], handle)
'''

ELECTRONS = {"H": 1, "He": 2, "C": 6, "O": 8, "F": 9, "Cu": 29, "Br": 35}


def run(template, workdir, stem, **fields):
    path = os.path.join(workdir, stem)
    with open(path + ".in", "w") as handle:
        handle.write(template.format(result_path=path + ".json", **fields))
    env = dict(os.environ, PSI_SCRATCH=workdir)
    subprocess.run(["psi4", path + ".in", path + ".out"], check=True, cwd=workdir, env=env,
                   stdout=subprocess.DEVNULL)
    with open(path + ".json") as handle:
        return json.load(handle)


def pick_pairs(shells):
    """For each (la, lb) with la >= lb: one pair on one centre and one on two centres, if present."""
    pairs = []
    lmax = max(l for _, l in shells)
    for la in range(lmax + 1):
        for lb in range(la + 1):
            same = [(p, q) for p, (cp, lp) in enumerate(shells) for q, (cq, lq) in enumerate(shells)
                    if lp == la and lq == lb and cp == cq]
            distinct = [pq for pq in same if pq[0] != pq[1]]
            if distinct or same:
                pairs.append((distinct or same)[0])
            across = [(p, q) for p, (cp, lp) in enumerate(shells) for q, (cq, lq) in enumerate(shells)
                      if lp == la and lq == lb and cp != cq]
            if across:
                pairs.append(across[0])
    return pairs


def pick_quartets(shells, patterns):
    """Shells of the wanted momenta, taken on centres that change along the quartet."""
    if patterns == "all":
        n = len(shells)
        return [(p, q, r, s) for p in range(n) for q in range(n) for r in range(n) for s in range(n)]
    ncenter = max(c for c, _ in shells) + 1
    quartets = []
    for k, pattern in enumerate(patterns):
        chosen = []
        for position, l in enumerate(pattern):
            want = (k + position) % ncenter
            candidates = [i for i, (c, li) in enumerate(shells) if li == l]
            if not candidates:
                chosen = None
                break
            on_centre = [i for i in candidates if shells[i][0] == want]
            # The last shell of the momentum on that centre (diffuse), else the first anywhere.
            chosen.append(on_centre[-1 if position % 2 else 0] if on_centre else candidates[0])
        if chosen is not None:
            quartets.append(tuple(chosen))
    return quartets


def package_version(package):
    return subprocess.run(["dpkg-query", "-W", "-f=${Version}", package], check=True,
                          capture_output=True, text=True).stdout.strip()


def build():
    cases = []
    with tempfile.TemporaryDirectory(prefix="tessera-integrals-") as workdir:
        for n, (name, atoms, charge, basis, puream, patterns) in enumerate(CASES):
            geometry = "\n".join("%s %.10f %.10f %.10f" % atom for atom in atoms)
            fields = dict(charge=charge, geometry=geometry, basis=basis, puream="true" if puream else "false")
            shells = run(PROBE, workdir, "probe%d" % n, **fields)
            pairs = pick_pairs(shells)
            quartets = pick_quartets(shells, patterns)
            result = run(PSITHON, workdir, "case%d" % n, pairs=json.dumps(pairs), quartets=json.dumps(quartets), **fields)
            if result["puream"] != puream:
                raise SystemExit("%s: psi4 did not honour puream %s" % (name, puream))
            cases.append({
                "name": name,
                "basis": basis,
                "functions": "spherical" if puream else "cartesian",
                "charge": charge,
                "atoms": [{"symbol": a[0], "x": a[1], "y": a[2], "z": a[3]} for a in atoms],
                **result,
            })
            print("  %-42s %3d shells %4d functions, %2d pairs, %4d quartets"
                  % (name, len(shells), result["nbf"], len(pairs), len(quartets)), file=sys.stderr)
    version = subprocess.run(["psi4", "--version"], check=True, capture_output=True, text=True).stdout.strip()
    return {
        "origin": {
            "program": "psi4 (Debian package psi4)",
            "version": version,
            "packageVersion": package_version("psi4"),
            "basisPackageVersion": package_version("psi4-data"),
            "generatedBy": GENERATED_BY,
            "command": "/usr/bin/python3 " + GENERATED_BY,
            "note": ("psi4's MintsHelper ao_overlap, ao_kinetic, ao_potential (point nuclei) and ao_eri_shell "
                     "over invented geometries in bohr (no_com, no_reorient, symmetry c1). Blocks in psi4's "
                     "function order and normalisation; shells as psi4 builds them."),
        },
        "cases": cases,
    }


def render(doc):
    """One line per block, numbers with 17 significant digits."""
    def dumps(value):
        return json.dumps(value, separators=(",", ":"))

    out = ["{", '  "origin": %s,' % dumps(doc["origin"]), '  "cases": [']
    for ci, case in enumerate(doc["cases"]):
        out.append("    {")
        head = {k: v for k, v in case.items() if k not in ("shells", "oneElectron", "twoElectron")}
        for k, v in head.items():
            out.append('      %s: %s,' % (json.dumps(k), dumps(v)))
        for key in ("shells", "oneElectron", "twoElectron"):
            out.append('      %s: [' % json.dumps(key))
            items = case[key]
            for i, item in enumerate(items):
                out.append("        %s%s" % (dumps(item), "," if i < len(items) - 1 else ""))
            out.append("      ]%s" % ("," if key != "twoElectron" else ""))
        out.append("    }%s" % ("," if ci < len(doc["cases"]) - 1 else ""))
    out.append("  ]")
    out.append("}")
    return "\n".join(out) + "\n"


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--out", default=DEFAULT_OUT)
    parser.add_argument("--check", action="store_true",
                        help="do not write; exit 1 if the committed file differs from a fresh run")
    args = parser.parse_args()
    text = render(build())
    json.loads(text)
    if args.check:
        try:
            with open(args.out, encoding="utf-8") as handle:
                current = handle.read()
        except OSError:
            current = None
        if current != text:
            print("stale: %s" % os.path.relpath(args.out, REPO_ROOT), file=sys.stderr)
            raise SystemExit(1)
        print("up to date: %s" % os.path.relpath(args.out, REPO_ROOT))
        return
    with open(args.out, "w", encoding="utf-8") as handle:
        handle.write(text)
    print("wrote %s (%d bytes)" % (os.path.relpath(args.out, REPO_ROOT), len(text.encode())))


if __name__ == "__main__":
    main()
