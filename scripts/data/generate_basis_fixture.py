#!/usr/bin/python3
"""Generate an independent test fixture of basis-function counts from nwchem-data.

Tessera's basis-set library table (server/src/chemistry/data/basis-library.json)
is generated from psi4-data. This script reads the same bases from a second,
independent Debian package, nwchem-data (/usr/share/nwchem/libraries), and
writes tests/fixtures/basis-counts.nwchem.json: for every (basis, element) pair
found there, the number of spherical and cartesian basis functions, the shell
structure, and for the def2 family the core electrons replaced by the
effective core potential that the library file associates with it.

It shares no code with the library generator on purpose, so that the two can
check each other.

Usage (Debian python, standard library only):
  /usr/bin/python3 scripts/data/generate_basis_fixture.py [--library-dir DIR] [--out FILE]

CI does not have nwchem-data installed: the generated fixture is committed and
this script is kept to regenerate it.
"""

import argparse
import json
import os
import re
import subprocess
import sys

PACKAGE = "nwchem-data"
DEFAULT_LIBRARY_DIR = "/usr/share/nwchem/libraries"
COPYRIGHT_FILE = "/usr/share/doc/nwchem-data/copyright"
GENERATED_BY = "scripts/data/generate_basis_fixture.py"

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
DEFAULT_OUT = os.path.join(REPO_ROOT, "tests", "fixtures", "basis-counts.nwchem.json")

# (Tessera key, library file name, basis name carried in the file's block labels).
# The block name matters: the def2-svp file holds def2-SV(P) as well as def2-SVP.
BASES = [
    ("sto-3g", "sto-3g", "STO-3G"),
    ("3-21g", "3-21g", "3-21G"),
    ("6-31g", "6-31g", "6-31G"),
    ("6-31g*", "6-31gs", "6-31G*"),
    ("6-31g**", "6-31gss", "6-31G**"),
    ("6-31+g*", "6-31+gs", "6-31+G*"),
    ("6-31+g**", "6-31+gss", "6-31+G**"),
    ("6-31++g**", "6-31++gss", "6-31++G**"),
    ("6-311g**", "6-311gss", "6-311G**"),
    ("6-311+g*", "6-311+gs", "6-311+G*"),
    ("6-311++g**", "6-311++gss", "6-311++G**"),
    ("cc-pvdz", "cc-pvdz", "cc-pVDZ"),
    ("cc-pvtz", "cc-pvtz", "cc-pVTZ"),
    ("cc-pvqz", "cc-pvqz", "cc-pVQZ"),
    ("aug-cc-pvdz", "aug-cc-pvdz", "aug-cc-pVDZ"),
    ("aug-cc-pvtz", "aug-cc-pvtz", "aug-cc-pVTZ"),
    ("aug-cc-pvqz", "aug-cc-pvqz", "aug-cc-pVQZ"),
    ("def2-svp", "def2-svp", "Def2-SVP"),
    ("def2-svpd", "def2-svpd", "Def2-SVPD"),
    ("def2-tzvp", "def2-tzvp", "Def2-TZVP"),
    ("def2-tzvpd", "def2-tzvpd", "Def2-TZVPD"),
    ("def2-tzvpp", "def2-tzvpp", "Def2-TZVPP"),
    ("def2-qzvp", "def2-qzvp", "Def2-QZVP"),
    ("def2-qzvpp", "def2-qzvpp", "Def2-QZVPP"),
]

ELEMENTS = (
    "H He Li Be B C N O F Ne Na Mg Al Si P S Cl Ar K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn "
    "Ga Ge As Se Br Kr Rb Sr Y Zr Nb Mo Tc Ru Rh Pd Ag Cd In Sn Sb Te I Xe Cs Ba La Ce "
    "Pr Nd Pm Sm Eu Gd Tb Dy Ho Er Tm Yb Lu Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Po At Rn "
    "Fr Ra Ac Th Pa U Np Pu Am Cm Bk Cf Es Fm Md No Lr Rf Db Sg Bh Hs Mt Ds Rg Cn Nh Fl "
    "Mc Lv Ts Og"
).split()
CANON = {s.lower(): s for s in ELEMENTS}
Z = {s: i + 1 for i, s in enumerate(ELEMENTS)}

L_OF = {c: l for l, c in enumerate("spdfghi")}

RE_BLOCK = re.compile(r'^(basis|ecp)\s+"([^"]+)"\s*(\S+)?\s*$', re.IGNORECASE)
RE_ASSOC = re.compile(r'^associated_ecp\s+"([^"]+)"\s*$', re.IGNORECASE)
RE_NUM = re.compile(r"^[-+]?(\d+\.?\d*|\.\d+)([EeDd][-+]?\d+)?$")


class LibraryError(Exception):
    pass


def element(tok, where):
    sym = CANON.get(tok.lower())
    if not sym:
        raise LibraryError("%s: not an element symbol: %r" % (where, tok))
    return sym


def read_blocks(path):
    """Split a library file into its blocks.

    Returns (blocks, associated_ecps); each block is a dict with kind
    ('basis'/'ecp'), label, option (e.g. SPHERICAL) and body lines
    [(line number, tokens)] without comments or blank lines.
    """
    blocks, assoc = [], []
    cur = None
    with open(path, encoding="latin-1") as fh:
        for n, raw in enumerate(fh, 1):
            text = raw.split("#", 1)[0].strip()
            if not text:
                continue
            where = "%s:%d" % (os.path.basename(path), n)
            if cur is None:
                m = RE_BLOCK.match(text)
                if m:
                    cur = {"kind": m.group(1).lower(), "label": m.group(2),
                           "option": (m.group(3) or "").upper(), "body": [], "line": n}
                    continue
                m = RE_ASSOC.match(text)
                if m:
                    assoc.append(m.group(1))
                    continue
                raise LibraryError("%s: text outside any block: %r" % (where, text))
            if text.lower() == "end":
                blocks.append(cur)
                cur = None
                continue
            cur["body"].append((n, text.split()))
    if cur is not None:
        raise LibraryError("%s: block %r not closed" % (path, cur["label"]))
    return blocks, assoc


def parse_basis_block(block, fname):
    """Count contracted shells per angular momentum in one basis block.

    A shell header is '<Sym> <AM>' followed by rows of one exponent and k
    coefficient columns. k columns describe k contracted functions sharing the
    exponents (a general contraction), i.e. k shells of that angular momentum.
    For an SP shell the two columns are the s and the p coefficient.
    """
    counts = [0] * 7
    body = block["body"]
    sym = None
    i = 0
    while i < len(body):
        n, toks = body[i]
        where = "%s:%d" % (fname, n)
        if len(toks) != 2 or RE_NUM.match(toks[0]):
            raise LibraryError("%s: expected a shell header, found %r" % (where, " ".join(toks)))
        s = element(toks[0], where)
        if sym is None:
            sym = s
        elif s != sym:
            raise LibraryError("%s: element %s inside block of %s" % (where, s, sym))
        am = toks[1].lower()
        i += 1
        rows = []
        while i < len(body) and RE_NUM.match(body[i][1][0]):
            rows.append(body[i])
            i += 1
        if not rows:
            raise LibraryError("%s: shell without primitives" % where)
        widths = {len(t) for _, t in rows}
        if len(widths) != 1:
            raise LibraryError("%s: rows of one shell differ in column count %s" % (where, sorted(widths)))
        for rn, t in rows:
            if not all(RE_NUM.match(x) for x in t):
                raise LibraryError("%s:%d: non-numeric row" % (fname, rn))
        ncoef = widths.pop() - 1
        if ncoef < 1:
            raise LibraryError("%s: shell rows carry no coefficient" % where)
        if am in ("sp", "l"):
            if ncoef != 2:
                raise LibraryError("%s: SP shell with %d coefficient columns" % (where, ncoef))
            counts[0] += 1
            counts[1] += 1
        elif am in L_OF:
            counts[L_OF[am]] += ncoef
        else:
            raise LibraryError("%s: unknown angular momentum %r" % (where, toks[1]))
    if sym is None:
        raise LibraryError("%s: empty basis block %r" % (fname, block["label"]))
    return sym, counts


def parse_ecp_block(block, fname):
    sym, core = None, None
    for n, toks in block["body"]:
        if len(toks) == 3 and toks[1].lower() == "nelec":
            sym = element(toks[0], "%s:%d" % (fname, n))
            core = int(toks[2])
    if sym is None:
        raise LibraryError("%s: ECP block %r without nelec" % (fname, block["label"]))
    return sym, core


def label_parts(label, where):
    sym, sep, name = label.partition("_")
    if not sep:
        raise LibraryError("%s: block label %r is not <element>_<basis>" % (where, label))
    return element(sym, where), name


def spherical_cartesian(counts):
    sph = sum(c * (2 * l + 1) for l, c in enumerate(counts))
    cart = sum(c * (l + 1) * (l + 2) // 2 for l, c in enumerate(counts))
    return sph, cart


def shells_text(counts):
    return "".join("%d%s" % (c, "spdfghi"[l]) for l, c in enumerate(counts) if c)


def read_library_file(libdir, fname, wanted_name):
    path = os.path.join(libdir, fname)
    blocks, assoc = read_blocks(path)
    result, options, other_names = {}, set(), set()
    for b in blocks:
        if b["kind"] != "basis":
            raise LibraryError("%s:%d: unexpected %s block" % (fname, b["line"], b["kind"]))
        lsym, name = label_parts(b["label"], "%s:%d" % (fname, b["line"]))
        if name != wanted_name:
            other_names.add(name)
            continue
        sym, counts = parse_basis_block(b, fname)
        if sym != lsym:
            raise LibraryError("%s:%d: label says %s, shells say %s" % (fname, b["line"], lsym, sym))
        if sym in result:
            raise LibraryError("%s:%d: second %s block for %s" % (fname, b["line"], wanted_name, sym))
        result[sym] = counts
        options.add(b["option"] or "(none)")
    if not result:
        raise LibraryError("%s: no blocks named %r (found %s)" % (fname, wanted_name, sorted(other_names)))
    return result, sorted(options), assoc, sorted(other_names)


def read_ecp_file(libdir, fname):
    blocks, _ = read_blocks(os.path.join(libdir, fname))
    cores = {}
    for b in blocks:
        if b["kind"] != "ecp":
            continue
        lsym, _ = label_parts(b["label"], "%s:%d" % (fname, b["line"]))
        sym, core = parse_ecp_block(b, fname)
        if sym != lsym:
            raise LibraryError("%s:%d: ECP label/element mismatch" % (fname, b["line"]))
        cores[sym] = core
    return cores


def dpkg_version(package):
    try:
        out = subprocess.run(["dpkg-query", "-W", "-f=${Version}", package],
                             check=True, capture_output=True, text=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError) as exc:
        raise SystemExit("cannot read the version of %s with dpkg-query: %s" % (package, exc))
    if not out:
        raise SystemExit("%s is not installed" % package)
    return out


def licence_name(path):
    """The package's copyright file (free-form, not machine-readable) names the
    licence in the first non-empty lines after a 'License:' heading."""
    with open(path, encoding="utf-8") as fh:
        lines = fh.read().splitlines()
    for i, line in enumerate(lines):
        if line.strip().lower().rstrip(":") in ("license", "licence"):
            # e.g. "Educational Community License" then "Version 2.0, April 2007"
            words = [s.strip() for s in lines[i + 1:i + 8] if s.strip()][:3]
            words = [w for w in words if not w.startswith("http")][:2]
            if words:
                return ", ".join(words)
    raise SystemExit("%s: no License: heading found" % path)


def self_check(bases):
    def c(key, sym):
        e = bases[key]["elements"][sym]
        return e["spherical"], e["cartesian"]
    fails = []

    def expect(label, got, want):
        if got != want:
            fails.append("%s: got %s, expected %s" % (label, got, want))

    expect("cc-pVDZ water spherical", c("cc-pvdz", "O")[0] + 2 * c("cc-pvdz", "H")[0], 24)
    expect("cc-pVDZ O spherical", c("cc-pvdz", "O")[0], 14)
    expect("cc-pVDZ H spherical", c("cc-pvdz", "H")[0], 5)
    expect("6-31G* C", c("6-31g*", "C"), (14, 15))
    expect("6-31G* H", c("6-31g*", "H"), (2, 2))
    expect("cc-pVTZ O spherical", c("cc-pvtz", "O")[0], 30)
    expect("cc-pVTZ H spherical", c("cc-pvtz", "H")[0], 14)
    for key, b in bases.items():
        if key.startswith("def2-"):
            expect("%s I ECP core" % key, b.get("ecpCoreElectrons", {}).get("I"), 28)
    if fails:
        raise SystemExit("self-check failed:\n  " + "\n  ".join(fails))


def dump(doc):
    out = ["{", '  "origin": ' + json.dumps(doc["origin"], ensure_ascii=False) + ",", '  "bases": {']
    keys = list(doc["bases"])
    for bi, key in enumerate(keys):
        b = doc["bases"][key]
        out.append("    %s: {" % json.dumps(key))
        fields = [f for f in b if f != "elements"]
        for f in fields:
            out.append("      %s: %s," % (json.dumps(f), json.dumps(b[f], separators=(",", ":"))))
        out.append('      "elements": {')
        syms = list(b["elements"])
        for si, s in enumerate(syms):
            out.append("        %s: %s%s" % (json.dumps(s), json.dumps(b["elements"][s], separators=(",", ":")),
                                           "," if si < len(syms) - 1 else ""))
        out.append("      }")
        out.append("    }" + ("," if bi < len(keys) - 1 else ""))
    out += ["  }", "}"]
    return "\n".join(out) + "\n"


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--library-dir", default=DEFAULT_LIBRARY_DIR)
    ap.add_argument("--out", default=DEFAULT_OUT)
    args = ap.parse_args()

    ecp_cache = {}
    bases = {}
    try:
        for key, fname, name in BASES:
            if not os.path.exists(os.path.join(args.library_dir, fname)):
                raise SystemExit("missing %s/%s" % (args.library_dir, fname))
            shells, options, assoc, others = read_library_file(args.library_dir, fname, name)
            order = sorted(shells, key=Z.get)
            entry = {"file": fname, "blockName": name, "headerOption": "/".join(options)}
            if others:
                entry["otherBasesInFile"] = others
            ecp = {}
            for ecp_file in assoc:
                if ecp_file not in ecp_cache:
                    ecp_cache[ecp_file] = read_ecp_file(args.library_dir, ecp_file)
                for sym, core in ecp_cache[ecp_file].items():
                    if sym in shells:
                        ecp[sym] = core
            if assoc:
                entry["ecpFile"] = assoc[0] if len(assoc) == 1 else assoc
            entry["elements"] = {}
            for sym in order:
                sph, cart = spherical_cartesian(shells[sym])
                entry["elements"][sym] = {"spherical": sph, "cartesian": cart, "shells": shells_text(shells[sym])}
            if ecp:
                entry["ecpCoreElectrons"] = {s: ecp[s] for s in sorted(ecp, key=Z.get)}
                # keep the element map last for readability
                entry["elements"] = entry.pop("elements")
            bases[key] = entry
    except LibraryError as exc:
        raise SystemExit(str(exc))

    self_check(bases)

    doc = {
        "origin": {
            "package": PACKAGE,
            "version": dpkg_version(PACKAGE),
            "path": args.library_dir,
            "licence": licence_name(COPYRIGHT_FILE),
            "licenceSource": COPYRIGHT_FILE,
            "generatedBy": GENERATED_BY,
            "note": ("Function counts derived from nwchem-data's basis library (shell structure only; "
                     "no exponents or coefficients). Spherical = sum of 2l+1, cartesian = sum of "
                     "(l+1)(l+2)/2 over contracted shells; a k-column general contraction is k shells; "
                     "SP = one s + one p. Independent of the psi4-data source of basis-library.json."),
        },
        "bases": bases,
    }
    text = dump(doc)
    json.loads(text)
    os.makedirs(os.path.dirname(args.out), exist_ok=True)
    with open(args.out, "w", encoding="utf-8") as fh:
        fh.write(text)
    pairs = sum(len(b["elements"]) for b in bases.values())
    print("wrote %s (%d bytes, %d bases, %d basis/element pairs)"
          % (os.path.relpath(args.out, REPO_ROOT), len(text.encode()), len(bases), pairs))
    for key, b in bases.items():
        print("  %-11s %-11s header %-9s %3d elements%s%s" % (
            key, b["file"], b["headerOption"].lower(), len(b["elements"]),
            ", ECP on %d" % len(b["ecpCoreElectrons"]) if "ecpCoreElectrons" in b else "",
            ", file also holds %s" % b["otherBasesInFile"] if "otherBasesInFile" in b else ""))


if __name__ == "__main__":
    main()
