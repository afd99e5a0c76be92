#!/usr/bin/python3
"""Generate tests/fixtures/basis-exponents.nwchem.json: exponents of a sample of
(basis, element) pairs and def2 effective core potentials, read from a second,
independent Debian package, nwchem-data (/usr/share/nwchem/libraries), to check
the exponent files Tessera generates from psi4-data
(server/src/chemistry/data/basis-sets/, scripts/data/generate_basis_library.py).

Per pair it stores, for each angular momentum, the sorted distinct exponents of
all shells (a general contraction and its segmented copies then compare equal),
and per ECP element the core electrons and every channel's (power, exponent,
coefficient) terms sorted. It reuses the nwchem block reader of
generate_basis_fixture.py and nothing from the psi4 side.

Usage (Debian python, standard library only):
  /usr/bin/python3 scripts/data/generate_exponents_fixture.py [--out FILE] [--check]
"""

import argparse
import json
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import generate_basis_fixture as nw  # noqa: E402  (the nwchem reader, independent of psi4-data)

GENERATED_BY = "scripts/data/generate_exponents_fixture.py"
DEFAULT_OUT = os.path.join(nw.REPO_ROOT, "tests", "fixtures", "basis-exponents.nwchem.json")

# (Tessera key, nwchem file, block name, elements); every element of the file when None.
SAMPLE = [
    ("sto-3g", "sto-3g", "STO-3G", None),
    ("6-31g*", "6-31gs", "6-31G*", None),
    ("cc-pvdz", "cc-pvdz", "cc-pVDZ", None),
    ("def2-svp", "def2-svp", "Def2-SVP", None),
    ("cc-pvqz", "cc-pvqz", "cc-pVQZ", ["H", "C", "N", "O", "F", "Cl"]),
    ("aug-cc-pvtz", "aug-cc-pvtz", "aug-cc-pVTZ", ["H", "C", "N", "O", "S"]),
    ("def2-tzvp", "def2-tzvp", "Def2-TZVP", ["H", "C", "O", "Cu", "Zn", "Br", "I", "Xe", "Au"]),
]
ECP_SAMPLE = ("def2-ecp", ["Rb", "Ag", "I", "Xe", "Cs", "Au", "Pb", "Rn"])


def number(tok):
    return float(tok.replace("D", "E").replace("d", "e"))


def exponents_of_block(block, fname):
    """Sorted distinct exponents per angular momentum of one basis block."""
    per_l = {}
    body = block["body"]
    i = 0
    while i < len(body):
        n, toks = body[i]
        am = toks[1].lower()
        i += 1
        rows = []
        while i < len(body) and nw.RE_NUM.match(body[i][1][0]):
            rows.append(body[i][1])
            i += 1
        ls = [0, 1] if am in ("sp", "l") else [nw.L_OF[am]]
        for l in ls:
            per_l.setdefault(l, set()).update(number(r[0]) for r in rows)
    return {str(l): sorted(v) for l, v in sorted(per_l.items())}


def read_exponents(libdir, fname, wanted, elements):
    blocks, _ = nw.read_blocks(os.path.join(libdir, fname))
    out = {}
    for b in blocks:
        if b["kind"] != "basis":
            continue
        sym, name = nw.label_parts(b["label"], fname)
        if name != wanted or (elements is not None and sym not in elements):
            continue
        out[sym] = exponents_of_block(b, fname)
    missing = [s for s in (elements or []) if s not in out]
    if missing:
        raise SystemExit("%s: no %s block for %s" % (fname, wanted, missing))
    return {s: out[s] for s in sorted(out, key=nw.Z.get)}


def read_ecps(libdir, fname, elements):
    blocks, _ = nw.read_blocks(os.path.join(libdir, fname))
    out = {}
    for b in blocks:
        if b["kind"] != "ecp":
            continue
        sym, _ = nw.label_parts(b["label"], fname)
        if sym not in elements:
            continue
        core = None
        channels = {}
        current = None
        for _, toks in b["body"]:
            if len(toks) == 3 and toks[1].lower() == "nelec":
                core = int(toks[2])
            elif len(toks) == 2 and not nw.RE_NUM.match(toks[0]):
                label = toks[1].lower()
                current = -1 if label == "ul" else nw.L_OF[label]
                channels[current] = []
            else:
                channels[current].append([int(toks[0]), number(toks[1]), number(toks[2])])
        out[sym] = {"core": core, "channels": {str(l): sorted(t) for l, t in sorted(channels.items())}}
    missing = [s for s in elements if s not in out]
    if missing:
        raise SystemExit("%s: no ECP for %s" % (fname, missing))
    return {s: out[s] for s in sorted(out, key=nw.Z.get)}


def render(doc):
    def dumps(value):
        return json.dumps(value, separators=(",", ":"))

    out = ["{", '  "origin": %s,' % dumps(doc["origin"]), '  "bases": {']
    keys = list(doc["bases"])
    for bi, key in enumerate(keys):
        out.append("    %s: {" % json.dumps(key))
        syms = list(doc["bases"][key])
        for si, s in enumerate(syms):
            out.append("      %s: %s%s" % (json.dumps(s), dumps(doc["bases"][key][s]), "," if si < len(syms) - 1 else ""))
        out.append("    }" + ("," if bi < len(keys) - 1 else ""))
    out.append("  },")
    out.append('  "ecps": {')
    syms = list(doc["ecps"])
    for si, s in enumerate(syms):
        out.append("    %s: %s%s" % (json.dumps(s), dumps(doc["ecps"][s]), "," if si < len(syms) - 1 else ""))
    out.append("  }")
    out.append("}")
    return "\n".join(out) + "\n"


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--library-dir", default=nw.DEFAULT_LIBRARY_DIR)
    ap.add_argument("--out", default=DEFAULT_OUT)
    ap.add_argument("--check", action="store_true",
                    help="do not write; exit 1 if the committed file differs from a fresh build")
    args = ap.parse_args()
    try:
        bases = {key: read_exponents(args.library_dir, fname, name, elements) for key, fname, name, elements in SAMPLE}
        ecps = read_ecps(args.library_dir, ECP_SAMPLE[0], ECP_SAMPLE[1])
    except nw.LibraryError as exc:
        raise SystemExit(str(exc))
    doc = {
        "origin": {
            "package": nw.PACKAGE,
            "version": nw.dpkg_version(nw.PACKAGE),
            "path": args.library_dir,
            "licence": nw.licence_name(nw.COPYRIGHT_FILE),
            "licenceSource": nw.COPYRIGHT_FILE,
            "generatedBy": GENERATED_BY,
            "command": "/usr/bin/python3 " + GENERATED_BY,
            "note": ("Sorted distinct exponents per angular momentum of a sample of (basis, element) pairs, and "
                     "the def2 effective core potentials (core electrons; per channel, ul = local as -1, the "
                     "(power, exponent, coefficient) terms sorted) of a sample of elements, from nwchem-data. "
                     "Independent of the psi4-data source of the exponent files."),
        },
        "bases": bases,
        "ecps": ecps,
    }
    text = render(doc)
    json.loads(text)
    if args.check:
        try:
            with open(args.out, encoding="utf-8") as fh:
                current = fh.read()
        except OSError:
            current = None
        if current != text:
            print("stale: %s" % os.path.relpath(args.out, nw.REPO_ROOT), file=sys.stderr)
            raise SystemExit(1)
        print("up to date: %s" % os.path.relpath(args.out, nw.REPO_ROOT))
        return
    with open(args.out, "w", encoding="utf-8") as fh:
        fh.write(text)
    pairs = sum(len(b) for b in bases.values())
    print("wrote %s (%d bytes, %d basis/element pairs, %d ECPs)"
          % (os.path.relpath(args.out, nw.REPO_ROOT), len(text.encode()), pairs, len(ecps)))


if __name__ == "__main__":
    main()
