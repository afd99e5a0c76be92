#!/usr/bin/python3
"""Compare Tessera's basis-set library table with the independent nwchem-data fixture.

Reads only the two committed JSON files, so it runs anywhere (no Debian data
packages needed):

  server/src/chemistry/data/basis-library.json   (from psi4-data)
  tests/fixtures/basis-counts.nwchem.json        (from nwchem-data)

For every (basis, element) pair present in both it derives spherical and
cartesian function counts from the library's shell structure and compares
them, and the shell structure itself, with the fixture. It also lists
elements defined in only one source, differing effective-core-potential core
counts, and each source's stated spherical/cartesian convention.

Usage:
  /usr/bin/python3 scripts/data/compare_basis_sources.py [--all] [--strict]

  --all     also print every agreeing pair
  --strict  exit with status 1 when any count or ECP disagreement is found
"""

import argparse
import json
import os
import re
import sys

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
LIBRARY = os.path.join(REPO_ROOT, "server", "src", "chemistry", "data", "basis-library.json")
FIXTURE = os.path.join(REPO_ROOT, "tests", "fixtures", "basis-counts.nwchem.json")

AM = "spdfghi"


def parse_shells(text):
    counts = [0] * len(AM)
    pos = 0
    for m in re.finditer(r"(\d+)([a-z])", text):
        if m.start() != pos or m.group(2) not in AM:
            raise ValueError("bad shell string %r" % text)
        counts[AM.index(m.group(2))] += int(m.group(1))
        pos = m.end()
    if pos != len(text):
        raise ValueError("bad shell string %r" % text)
    return counts


def functions(counts):
    return (sum(c * (2 * l + 1) for l, c in enumerate(counts)),
            sum(c * (l + 1) * (l + 2) // 2 for l, c in enumerate(counts)))


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--library", default=LIBRARY)
    ap.add_argument("--fixture", default=FIXTURE)
    ap.add_argument("--all", action="store_true")
    ap.add_argument("--strict", action="store_true")
    args = ap.parse_args()

    with open(args.library, encoding="utf-8") as fh:
        lib = json.load(fh)
    with open(args.fixture, encoding="utf-8") as fh:
        fix = json.load(fh)

    print("library: %s %s  |  fixture: %s %s" % (
        lib["origin"]["package"], lib["origin"]["version"],
        fix["origin"]["package"], fix["origin"]["version"]))
    print()

    total = agree = 0
    count_disagreements = []
    shell_only = []
    ecp_disagreements = []
    only_lib, only_fix = {}, {}
    conventions = []

    for key in sorted(set(lib["bases"]) | set(fix["bases"]), key=lambda k: list(lib["bases"]).index(k)
                      if k in lib["bases"] else 1000):
        lb = lib["bases"].get(key)
        fb = fix["bases"].get(key)
        if lb is None or fb is None:
            print("basis %s only in %s" % (key, "library" if fb is None else "fixture"))
            continue
        conventions.append((key, lb["functions"], fb.get("headerOption", "?").lower()))
        lsyms = list(lb["shells"])
        fsyms = list(fb["elements"])
        a = [s for s in lsyms if s not in fb["elements"]]
        b = [s for s in fsyms if s not in lb["shells"]]
        if a:
            only_lib[key] = a
        if b:
            only_fix[key] = b
        for sym in lsyms:
            if sym not in fb["elements"]:
                continue
            total += 1
            lcounts = parse_shells(lb["shells"][sym])
            lsph, lcart = functions(lcounts)
            fe = fb["elements"][sym]
            ok_sph = lsph == fe["spherical"]
            ok_cart = lcart == fe["cartesian"]
            ok_shell = "shells" not in fe or parse_shells(fe["shells"]) == lcounts
            if ok_sph and ok_cart:
                if ok_shell:
                    agree += 1
                    if args.all:
                        print("  agree  %-11s %-2s sph %3d cart %3d  %s" % (key, sym, lsph, lcart, lb["shells"][sym]))
                else:
                    shell_only.append((key, sym, lb["shells"][sym], fe["shells"]))
            else:
                count_disagreements.append((key, sym, lsph, fe["spherical"], lcart, fe["cartesian"],
                                            lb["shells"][sym], fe.get("shells", "?")))
        le = lb.get("ecpCoreElectrons", {})
        fe_ = fb.get("ecpCoreElectrons", {})
        for sym in sorted(set(le) | set(fe_), key=lambda s: (lsyms + fsyms).index(s)):
            if sym not in lb["shells"] or sym not in fb["elements"]:
                continue
            if le.get(sym) != fe_.get(sym):
                ecp_disagreements.append((key, sym, le.get(sym), fe_.get(sym)))

    print("pairs in both: %d; counts and shells agree: %d; count disagreements: %d; "
          "same counts but different shells: %d; ECP disagreements: %d"
          % (total, agree, len(count_disagreements), len(shell_only), len(ecp_disagreements)))

    print()
    print("Spherical/cartesian counts that disagree (library=psi4-data, fixture=nwchem-data):")
    if not count_disagreements:
        print("  none")
    for key, sym, ls, fs, lc, fc, lsh, fsh in count_disagreements:
        print("  %-11s %-2s  spherical %3d vs %3d  cartesian %3d vs %3d  shells %s vs %s"
              % (key, sym, ls, fs, lc, fc, lsh, fsh))

    print()
    print("Same function counts, different shell structure:")
    if not shell_only:
        print("  none")
    for key, sym, lsh, fsh in shell_only:
        print("  %-11s %-2s  %s vs %s" % (key, sym, lsh, fsh))

    print()
    print("ECP core electrons that disagree:")
    if not ecp_disagreements:
        print("  none")
    for key, sym, lc, fc in ecp_disagreements:
        print("  %-11s %-2s  %s vs %s" % (key, sym, lc, fc))

    print()
    print("Elements defined in only one source:")
    if not only_lib and not only_fix:
        print("  none")
    for key in lib["bases"]:
        if key in only_lib:
            print("  %-11s only in library (psi4-data): %s" % (key, " ".join(only_lib[key])))
        if key in only_fix:
            print("  %-11s only in fixture (nwchem-data): %s" % (key, " ".join(only_fix[key])))

    print()
    print("Stated convention (library .gbs header / fixture block option):")
    for key, lconv, fconv in conventions:
        print("  %-11s %-9s / %-9s%s" % (key, lconv, fconv, "" if lconv == fconv else "   differs"))

    if args.strict and (count_disagreements or ecp_disagreements):
        sys.exit(1)


if __name__ == "__main__":
    main()
