#!/usr/bin/python3
"""Generate Tessera's basis-set library table from Debian's psi4-data package.

Reads the Gaussian-style .gbs files shipped by psi4-data in /usr/share/psi4/basis
and writes:

  server/src/chemistry/data/basis-library.json   shell structure per element (loaded
                                                 with the language layer: small)
  server/src/chemistry/data/basis-sets/<file>.json
                                                 exponents, contraction coefficients and
                                                 effective core potentials, one file per
                                                 basis and per JKFIT auxiliary set (read
                                                 only when an engine job needs them)
  server/src/chemistry/data/BASIS-ORIGIN.md      provenance, licence, regeneration

Usage (Debian python, standard library only):
  /usr/bin/python3 scripts/data/generate_basis_library.py [--basis-dir DIR] [--out-dir DIR]
  /usr/bin/python3 scripts/data/generate_basis_library.py --check   # exit 1 if the committed files are stale

CI does not have psi4-data installed: the generated files are committed and
this script is kept to regenerate them.
"""

import argparse
import fnmatch
import json
import os
import re
import subprocess
import sys

PACKAGE = "psi4-data"
DEFAULT_BASIS_DIR = "/usr/share/psi4/basis"
COPYRIGHT_FILE = "/usr/share/doc/psi4-data/copyright"
GENERATED_BY = "scripts/data/generate_basis_library.py"

REPO_ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
DEFAULT_OUT_DIR = os.path.join(REPO_ROOT, "server", "src", "chemistry", "data")

# (canonical key, display name, psi4 file stem, required)
BASES = [
    ("sto-3g", "STO-3G", "sto-3g", True),
    ("3-21g", "3-21G", "3-21g", True),
    ("6-31g", "6-31G", "6-31g", True),
    ("6-31g*", "6-31G*", "6-31gs", True),
    ("6-31g**", "6-31G**", "6-31gss", True),
    ("6-31+g*", "6-31+G*", "6-31pgs", True),
    ("6-31+g**", "6-31+G**", "6-31pgss", True),
    ("6-31++g**", "6-31++G**", "6-31ppgss", True),
    ("6-311g**", "6-311G**", "6-311gss", True),
    ("6-311+g*", "6-311+G*", "6-311pgs", True),
    ("6-311++g**", "6-311++G**", "6-311ppgss", True),
    ("cc-pvdz", "cc-pVDZ", "cc-pvdz", True),
    ("cc-pvtz", "cc-pVTZ", "cc-pvtz", True),
    ("cc-pvqz", "cc-pVQZ", "cc-pvqz", True),
    ("aug-cc-pvdz", "aug-cc-pVDZ", "aug-cc-pvdz", True),
    ("aug-cc-pvtz", "aug-cc-pVTZ", "aug-cc-pvtz", True),
    ("aug-cc-pvqz", "aug-cc-pVQZ", "aug-cc-pvqz", False),
    ("def2-svp", "def2-SVP", "def2-svp", True),
    ("def2-svpd", "def2-SVPD", "def2-svpd", True),
    ("def2-tzvp", "def2-TZVP", "def2-tzvp", True),
    ("def2-tzvpd", "def2-TZVPD", "def2-tzvpd", True),
    ("def2-tzvpp", "def2-TZVPP", "def2-tzvpp", True),
    ("def2-qzvp", "def2-QZVP", "def2-qzvp", True),
    ("def2-qzvpp", "def2-QZVPP", "def2-qzvpp", True),
]

# The JKFIT auxiliary set psi4 pairs with each orbital basis, as in psi4's
# driver/qcdb/basislistdunning.py and basislistother.py (psi4 1.3.2); checked
# against those files when the psi4 package is installed.
JKFIT_FOR = {
    "sto-3g": "def2-svp-jkfit",
    "3-21g": "def2-svp-jkfit",
    "6-31g": "cc-pvdz-jkfit",
    "6-31g*": "cc-pvdz-jkfit",
    "6-31g**": "cc-pvdz-jkfit",
    "6-31+g*": "heavy-aug-cc-pvdz-jkfit",
    "6-31+g**": "heavy-aug-cc-pvdz-jkfit",
    "6-31++g**": "aug-cc-pvdz-jkfit",
    "6-311g**": "cc-pvtz-jkfit",
    "6-311+g*": "heavy-aug-cc-pvtz-jkfit",
    "6-311++g**": "aug-cc-pvtz-jkfit",
    "cc-pvdz": "cc-pvdz-jkfit",
    "cc-pvtz": "cc-pvtz-jkfit",
    "cc-pvqz": "cc-pvqz-jkfit",
    "aug-cc-pvdz": "aug-cc-pvdz-jkfit",
    "aug-cc-pvtz": "aug-cc-pvtz-jkfit",
    "aug-cc-pvqz": "aug-cc-pvqz-jkfit",
    "def2-svp": "def2-svp-jkfit",
    "def2-svpd": "def2-svp-jkfit",
    "def2-tzvp": "def2-tzvp-jkfit",
    "def2-tzvpd": "def2-tzvp-jkfit",
    "def2-tzvpp": "def2-tzvpp-jkfit",
    "def2-qzvp": "def2-qzvp-jkfit",
    "def2-qzvpp": "def2-qzvpp-jkfit",
}
PSI4_BASIS_LISTS = "/usr/lib/x86_64-linux-gnu/psi4/driver/qcdb"
DATA_SUBDIR = "basis-sets"

# Element symbols by atomic number (IUPAC); used to normalise case and order output.
ELEMENTS = (
    "H He Li Be B C N O F Ne Na Mg Al Si P S Cl Ar K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn "
    "Ga Ge As Se Br Kr Rb Sr Y Zr Nb Mo Tc Ru Rh Pd Ag Cd In Sn Sb Te I Xe Cs Ba La Ce "
    "Pr Nd Pm Sm Eu Gd Tb Dy Ho Er Tm Yb Lu Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Po At Rn "
    "Fr Ra Ac Th Pa U Np Pu Am Cm Bk Cf Es Fm Md No Lr Rf Db Sg Bh Hs Mt Ds Rg Cn Nh Fl "
    "Mc Lv Ts Og"
).split()
SYMBOL_BY_UPPER = {s.upper(): s for s in ELEMENTS}
ATOMIC_NUMBER = {s: i + 1 for i, s in enumerate(ELEMENTS)}

AM_LETTERS = "spdfghi"  # angular momentum 0..6, output order

RE_ELEMENT = re.compile(r"^([A-Za-z]{1,3})\s+0\s*$")
RE_SHELL = re.compile(r"^([A-Za-z]+)\s+(\d+)\s+([-+0-9.EeDd]+)\s*$")
RE_ECP = re.compile(r"^([A-Za-z]{1,3})-ECP\s+(\d+)\s+(\d+)\s*$", re.IGNORECASE)
RE_NUMBER = re.compile(r"^[-+]?(\d+\.?\d*|\.\d+)([EeDd][-+]?\d+)?$")


class GbsError(Exception):
    pass


def normal_symbol(raw, where):
    sym = SYMBOL_BY_UPPER.get(raw.upper())
    if sym is None:
        raise GbsError("%s: unknown element symbol %r" % (where, raw))
    return sym


def is_number(tok):
    return RE_NUMBER.match(tok) is not None


def to_float(tok):
    """Fortran-style numbers (1.0D+00) as Python floats; repr() then round-trips them exactly."""
    return float(tok.replace("D", "E").replace("d", "e"))


def shell_letters_to_am(letters, where):
    """Map a shell label to the list of angular momenta it contributes.

    'SP' and 'L' are the combined s+p shell (one s shell and one p shell).
    """
    up = letters.upper()
    if up in ("SP", "L"):
        return [0, 1]
    if len(up) == 1 and up.lower() in AM_LETTERS:
        return [AM_LETTERS.index(up.lower())]
    raise GbsError("%s: unsupported shell label %r" % (where, letters))


def parse_gbs(path):
    """Parse a psi4 .gbs file.

    Returns (convention, elements, skipped, defects) where elements maps a
    normal-case symbol to {"shells": [count per l], "ecpCore": int or None},
    skipped lists (line number, text) of stray non-comment lines between
    blocks and defects lists tolerated irregularities in the file.
    """
    with open(path, encoding="latin-1") as fh:
        raw_lines = fh.read().splitlines()

    # Keep line numbers for messages; drop comments and blank lines.
    lines = []
    for n, text in enumerate(raw_lines, 1):
        s = text.strip()
        if not s or s.startswith("!"):
            continue
        lines.append((n, s))

    if not lines:
        raise GbsError("%s: empty file" % path)
    convention = lines[0][1].lower()
    if convention not in ("spherical", "cartesian"):
        raise GbsError("%s:%d: expected 'spherical' or 'cartesian' header, found %r"
                       % (path, lines[0][0], lines[0][1]))

    elements = {}
    skipped = []
    defects = []
    current = None  # symbol of the element block being read
    i = 1
    while i < len(lines):
        n, s = lines[i]
        where = "%s:%d" % (path, n)
        if s.startswith("****"):
            current = None
            i += 1
            continue
        m = RE_ELEMENT.match(s)
        if m:
            current = normal_symbol(m.group(1), where)
            rec = elements.setdefault(current, {"shells": None, "ecpCore": None, "_shellBlocks": 0,
                                                "data": [], "ecp": None})
            i += 1
            # An element header opens either a basis block or an ECP block.
            if i < len(lines) and RE_ECP.match(lines[i][1]):
                continue
            rec["_shellBlocks"] += 1
            if rec["_shellBlocks"] > 1:
                raise GbsError("%s: element %s has a second basis block" % (where, current))
            rec["shells"] = [0] * len(AM_LETTERS)
            continue
        m = RE_ECP.match(s)
        if m:
            sym = normal_symbol(m.group(1), where)
            if sym != current:
                raise GbsError("%s: ECP for %s inside block of %s" % (where, sym, current))
            rec = elements[sym]
            if rec["ecpCore"] is not None:
                raise GbsError("%s: second ECP for %s" % (where, sym))
            lmax = int(m.group(2))
            rec["ecpCore"] = int(m.group(3))
            channels = []
            i += 1
            # lmax+1 components: a label line, a term count, then that many rows. The first is
            # the local channel (label of l = lmax), then the projected channels l = 0 .. lmax-1.
            for component in range(lmax + 1):
                if i + 1 >= len(lines):
                    raise GbsError("%s: truncated ECP for %s" % (where, sym))
                label = lines[i][1]
                if "potential" not in label.lower():
                    raise GbsError("%s:%d: expected ECP component label, found %r"
                                   % (path, lines[i][0], label))
                count_tok = lines[i + 1][1]
                if not count_tok.isdigit():
                    raise GbsError("%s:%d: expected ECP term count, found %r"
                                   % (path, lines[i + 1][0], count_tok))
                letter = label.split()[0].split("-")[0].lower()
                want = AM_LETTERS[lmax] if component == 0 else AM_LETTERS[component - 1]
                if letter != want:
                    raise GbsError("%s:%d: expected the %s channel, found %r"
                                   % (path, lines[i][0], want, label))
                nterms = int(count_tok)
                i += 2
                powers, zetas, coefs = [], [], []
                for _ in range(nterms):
                    toks = lines[i][1].split()
                    if len(toks) != 3 or not all(is_number(t) for t in toks):
                        raise GbsError("%s:%d: bad ECP term %r" % (path, lines[i][0], lines[i][1]))
                    if not toks[0].isdigit():
                        raise GbsError("%s:%d: ECP power %r is not a whole number"
                                       % (path, lines[i][0], toks[0]))
                    powers.append(int(toks[0]))
                    zetas.append(to_float(toks[1]))
                    coefs.append(to_float(toks[2]))
                    i += 1
                channels.append([-1 if component == 0 else component - 1, powers, zetas, coefs])
            rec["ecp"] = {"core": rec["ecpCore"], "channels": channels}
            continue
        m = RE_SHELL.match(s)
        if m and current is not None:
            rec = elements[current]
            if rec["shells"] is None:
                raise GbsError("%s: shell line inside ECP block of %s" % (where, current))
            ams = shell_letters_to_am(m.group(1), where)
            nprim = int(m.group(2))
            ncols = 1 + len(ams)  # exponent plus one coefficient per angular momentum
            if nprim < 1:
                raise GbsError("%s: shell with no primitives" % where)
            if to_float(m.group(3)) != 1.0:
                raise GbsError("%s: scale factor %s (only 1.00 is supported)" % (where, m.group(3)))
            exps = []
            coefs = [[] for _ in ams]
            for k in range(nprim):
                if i + 1 + k >= len(lines):
                    raise GbsError("%s: truncated shell" % where)
                pn, ps = lines[i + 1 + k]
                toks = ps.split()
                if not all(is_number(t) for t in toks):
                    raise GbsError("%s:%d: non-numeric primitive row %r" % (path, pn, ps))
                if len(toks) == 1 and nprim == 1 and ncols == 2:
                    # Seen in some psi4-data def2 files: a one-primitive shell whose
                    # row gives the exponent but omits the (normalised-away) coefficient.
                    # The shell still exists; count it and say so.
                    defects.append("%s:%d: %s %s shell row has an exponent but no coefficient"
                                   % (os.path.basename(path), pn, current, m.group(1)))
                    toks = toks + ["1.0"]
                elif len(toks) != ncols:
                    raise GbsError("%s:%d: expected %d numbers in primitive row, found %r"
                                   % (path, pn, ncols, ps))
                exps.append(to_float(toks[0]))
                for j in range(len(ams)):
                    coefs[j].append(to_float(toks[1 + j]))
            for j, am in enumerate(ams):
                rec["shells"][am] += 1
                rec["data"].append([am, exps, coefs[j]])
            i += 1 + nprim
            continue
        if current is None:
            # Free text between blocks (one psi4 file carries a title line there).
            skipped.append((n, s))
            i += 1
            continue
        raise GbsError("%s: unexpected line %r in block of %s" % (where, s, current))

    for sym, rec in elements.items():
        del rec["_shellBlocks"]
        for _, exps, _ in rec["data"]:
            if any(e <= 0 for e in exps):
                raise GbsError("%s: element %s has a non-positive exponent" % (path, sym))
        if rec["shells"] is None:
            raise GbsError("%s: element %s has an ECP but no basis functions" % (path, sym))
        if sum(rec["shells"]) == 0:
            raise GbsError("%s: element %s has no shells" % (path, sym))
    return convention, elements, skipped, defects


def shell_string(counts):
    return "".join("%d%s" % (c, AM_LETTERS[l]) for l, c in enumerate(counts) if c)


def function_counts(counts):
    sph = sum(c * (2 * l + 1) for l, c in enumerate(counts))
    cart = sum(c * (l + 1) * (l + 2) // 2 for l, c in enumerate(counts))
    return sph, cart


def dpkg_version(package):
    try:
        out = subprocess.run(["dpkg-query", "-W", "-f=${Version}", package],
                             check=True, capture_output=True, text=True)
    except (OSError, subprocess.CalledProcessError) as exc:
        raise SystemExit("cannot read the version of %s with dpkg-query: %s" % (package, exc))
    version = out.stdout.strip()
    if not version:
        raise SystemExit("%s is not installed" % package)
    return version


def dep5_licence(copyright_path, source_paths):
    """Return (licence name, copyright holders, stanza pattern) from a
    machine-readable debian/copyright for the given source-tree paths.
    The last matching Files stanza wins, as the format specifies."""
    with open(copyright_path, encoding="utf-8") as fh:
        text = fh.read()
    stanzas = []
    for para in re.split(r"\n\s*\n", text):
        fields = {}
        key = None
        for line in para.splitlines():
            if line[:1] in (" ", "\t"):
                if key:
                    fields[key] += "\n" + line.strip()
                continue
            if ":" in line:
                key, _, value = line.partition(":")
                key = key.strip()
                fields[key] = value.strip()
        if "Files" in fields:
            stanzas.append(fields)
    best = None
    for st in stanzas:
        patterns = st["Files"].split()
        if any(fnmatch.fnmatchcase(p, pat) for p in source_paths for pat in patterns):
            best = st
    if best is None:
        raise SystemExit("%s: no Files stanza covers %s" % (copyright_path, source_paths))
    licence = best.get("License", "").splitlines()[0].strip()
    holders = " ".join(best.get("Copyright", "").split())
    return licence, holders, best["Files"]


def read_title_lines(path):
    """Return the 'Basis Set Exchange' title comment lines of a .gbs file."""
    titles = []
    with open(path, encoding="latin-1") as fh:
        for line in fh:
            s = line.strip()
            if s.startswith("!") and "Basis Set Exchange" in s:
                t = " ".join(s.lstrip("!").split())
                if t not in titles:
                    titles.append(t)
    return titles


def compact_json(doc):
    """Serialise with one line per element map, to keep the file small and diffable."""
    out = ["{"]
    out.append('  "origin": ' + json.dumps(doc["origin"], ensure_ascii=False) + ",")
    out.append('  "bases": {')
    keys = list(doc["bases"])
    for bi, key in enumerate(keys):
        b = doc["bases"][key]
        out.append("    %s: {" % json.dumps(key))
        fields = list(b)
        for fi, f in enumerate(fields):
            sep = "," if fi < len(fields) - 1 else ""
            out.append("      %s: %s%s" % (json.dumps(f), json.dumps(b[f], separators=(",", ":")), sep))
        out.append("    }" + ("," if bi < len(keys) - 1 else ""))
    out.append("  },")
    out.append('  "auxiliary": {')
    akeys = list(doc["auxiliary"])
    for ai, key in enumerate(akeys):
        sep = "," if ai < len(akeys) - 1 else ""
        out.append("    %s: %s%s" % (json.dumps(key), json.dumps(doc["auxiliary"][key], separators=(",", ":")), sep))
    out.append("  }")
    out.append("}")
    return "\n".join(out) + "\n"


def self_check(bases):
    """Textbook function counts that any correct parse must reproduce."""
    def counts(key, sym):
        shells = bases[key]["shells"][sym]
        n = [0] * len(AM_LETTERS)
        for num, letter in re.findall(r"(\d+)([a-z])", shells):
            n[AM_LETTERS.index(letter)] = int(num)
        return function_counts(n)

    failures = []

    def expect(label, got, want):
        if got != want:
            failures.append("%s: got %s, expected %s" % (label, got, want))

    expect("cc-pVDZ O spherical", counts("cc-pvdz", "O")[0], 14)
    expect("cc-pVDZ H spherical", counts("cc-pvdz", "H")[0], 5)
    expect("cc-pVDZ water spherical",
           counts("cc-pvdz", "O")[0] + 2 * counts("cc-pvdz", "H")[0], 24)
    expect("6-31G* C (spherical, cartesian)", counts("6-31g*", "C"), (14, 15))
    expect("6-31G* H (spherical, cartesian)", counts("6-31g*", "H"), (2, 2))
    expect("cc-pVTZ O spherical", counts("cc-pvtz", "O")[0], 30)
    expect("cc-pVTZ H spherical", counts("cc-pvtz", "H")[0], 14)
    for key in bases:
        if key.startswith("def2-"):
            expect("%s I ECP core" % key, bases[key].get("ecpCoreElectrons", {}).get("I"), 28)
    if failures:
        raise SystemExit("self-check failed:\n  " + "\n  ".join(failures))


def write_origin_md(origin, bases, titles, licence_stanza, holders, file_defects, aux, data_sizes):
    lines = []
    lines.append("# Basis-set library: origin")
    lines.append("")
    lines.append("`basis-library.json` and the files in `%s/` (this folder) are generated; do not edit"
                 % DATA_SUBDIR)
    lines.append("them by hand. This file is generated with them by `%s`." % GENERATED_BY)
    lines.append("")
    lines.append("## Source")
    lines.append("")
    lines.append("- Debian package: `%s`, version `%s`" % (origin["package"], origin["version"]))
    lines.append("- Files read: `%s/<file>.gbs` (Gaussian-style basis files as shipped by psi4-data)"
                 % origin["path"])
    lines.append("- The files' own comment headers name the EMSL Basis Set Exchange as their source;")
    lines.append("  the title lines found in each file are listed below.")
    lines.append("- Which JKFIT set goes with which orbital basis: psi4's own pairing")
    lines.append("  (`driver/qcdb/basislistdunning.py`, `basislistother.py` of the psi4 package,")
    lines.append("  same version), checked against those files when psi4 is installed.")
    lines.append("")
    lines.append("## Licence")
    lines.append("")
    lines.append("`/usr/share/doc/psi4-data/copyright` (machine-readable debian/copyright) has no")
    lines.append("stanza of its own for the basis files; they fall under its `Files: %s` stanza:"
                 % licence_stanza)
    lines.append("")
    lines.append("- Licence: **%s**" % origin["licence"])
    lines.append("- Copyright: %s" % holders)
    lines.append("")
    lines.append("`basis-library.json` holds derived facts only (shell counts, conventions, ECP core")
    lines.append("electrons). The files in `%s/` copy the exponents, contraction coefficients and" % DATA_SUBDIR)
    lines.append("effective-core-potential parameters of the listed files, converted to JSON numbers")
    lines.append("that round-trip the file's decimal values exactly; they are redistributed under the")
    lines.append("licence above, which is why this note ships beside them.")
    lines.append("")
    lines.append("## What is stored")
    lines.append("")
    lines.append("`basis-library.json` (read with the language layer):")
    lines.append("")
    lines.append("- `functions`: the first non-comment line of the .gbs file (`spherical` or")
    lines.append("  `cartesian`), i.e. the convention the distribution uses for that family.")
    lines.append("- `shells`: contracted shells per angular momentum in the order s p d f g h i;")
    lines.append("  a combined SP shell counts as one s and one p shell.")
    lines.append("- `ecpCoreElectrons`: present only for bases whose file carries effective core")
    lines.append("  potentials; the number is the core electrons the potential replaces.")
    lines.append("- `jkfit`: the key of the JKFIT auxiliary set psi4 pairs with the basis;")
    lines.append("  `auxiliary` lists those sets (`data`: the file in `%s/` that holds it, shared" % DATA_SUBDIR)
    lines.append("  when two psi4 files are identical).")
    lines.append("")
    lines.append("`%s/<file stem>.json` (read at run time, only when a computation needs it):" % DATA_SUBDIR)
    lines.append("")
    lines.append("- `elements.<symbol>.shells`: `[l, exponents, coefficients]` per contracted shell in")
    lines.append("  the order of the .gbs file; an SP shell becomes an s shell followed by a p shell")
    lines.append("  with the same exponents. Coefficients are as printed (for unnormalised")
    lines.append("  primitives' normalised counterparts, the usual .gbs convention); the engine")
    lines.append("  normalises. A one-primitive row without a coefficient gets 1.")
    lines.append("- `elements.<symbol>.ecp`: `core` electrons replaced and `channels`, each")
    lines.append("  `[l, powers, exponents, coefficients]` for Σ d r^(n-2) exp(-ζ r²); `l = -1` is the")
    lines.append("  local channel (the file's first, labelled with l = lmax), then the projected")
    lines.append("  channels l = 0 … lmax-1.")
    lines.append("")
    lines.append("## Regenerate")
    lines.append("")
    lines.append("Needs Debian's `psi4-data` package (not present in CI) and the system Python")
    lines.append("(standard library only):")
    lines.append("")
    lines.append("```sh")
    lines.append("apt-get install psi4-data")
    lines.append("/usr/bin/python3 %s          # write" % GENERATED_BY)
    lines.append("/usr/bin/python3 %s --check  # exit 1 if the committed files are stale" % GENERATED_BY)
    lines.append("```")
    lines.append("")
    lines.append("An independent cross-check against a second distribution (nwchem-data) is")
    lines.append("produced by `scripts/data/generate_basis_fixture.py` into")
    lines.append("`tests/fixtures/basis-counts.nwchem.json` and reported by")
    lines.append("`scripts/data/compare_basis_sources.py`.")
    lines.append("")
    lines.append("## Bases")
    lines.append("")
    lines.append("| key | display name | file | header convention | elements | ECP elements | JKFIT | data bytes | title lines in file |")
    lines.append("| --- | --- | --- | --- | --- | --- | --- | --- | --- |")
    for key, b in bases.items():
        syms = list(b["shells"])
        span = "%d (%s–%s)" % (len(syms), syms[0], syms[-1])
        ecp = b.get("ecpCoreElectrons")
        ecp_text = "%d (%s–%s)" % (len(ecp), list(ecp)[0], list(ecp)[-1]) if ecp else "—"
        t = "; ".join(titles[key]).replace("|", "\\|") or "—"
        lines.append("| `%s` | %s | `%s` | %s | %s | %s | `%s` | %d | %s |"
                     % (key, b["displayName"], b["file"], b["functions"], span, ecp_text, b["jkfit"],
                        data_sizes[b["data"]], t))
    lines.append("")
    lines.append("## JKFIT auxiliary sets")
    lines.append("")
    lines.append("| key | display name | file | header convention | elements | stored in | data bytes | title lines in file |")
    lines.append("| --- | --- | --- | --- | --- | --- | --- | --- |")
    for key, a in aux.items():
        t = "; ".join(titles[key]).replace("|", "\\|") or "—"
        same = "`%s.json`" % a["data"]
        lines.append("| `%s` | %s | `%s` | %s | %d (%s–%s) | %s | %d | %s |"
                     % (key, a["displayName"], a["file"], a["functions"], len(a["elements"]),
                        a["elements"][0], a["elements"][-1], same, data_sizes[a["data"]], t))
    lines.append("")
    lines.append("## Irregularities tolerated in the source files")
    lines.append("")
    found = [d for key in list(bases) + list(aux) for d in file_defects.get(key, [])]
    if found:
        lines.append("The generator reads these as described and reports them each time it runs.")
        lines.append("A one-primitive shell row without a coefficient is still counted as a shell")
        lines.append("(a lone primitive's coefficient is fixed by normalisation) and stored with 1.")
        lines.append("")
        for d in found:
            lines.append("- " + d)
    else:
        lines.append("None.")
    lines.append("")
    return "\n".join(lines)


def display_name_of_jkfit(key):
    """cc-pvdz-jkfit -> cc-pVDZ-JKFIT, def2-tzvp-jkfit -> def2-TZVP-JKFIT (psi4's spelling)."""
    stem = key[: -len("-jkfit")]
    m = re.match(r"^(.*cc-)pv(\w)z$", stem)
    if m:
        return "%spV%sZ-JKFIT" % (m.group(1), m.group(2).upper())
    if stem.startswith("def2-"):
        return "def2-%s-JKFIT" % stem[5:].upper()
    return key.upper()


def check_jkfit_pairing():
    """Compare JKFIT_FOR with psi4's own basis lists, when the psi4 package is installed."""
    files = [os.path.join(PSI4_BASIS_LISTS, f) for f in ("basislistdunning.py", "basislistother.py")]
    if not all(os.path.exists(f) for f in files):
        print("note: psi4's basis lists not found; the JKFIT pairing was not re-checked", file=sys.stderr)
        return
    text = "".join(open(f, encoding="utf-8").read() for f in files)
    found = {}
    for var, aux in re.findall(r"basis_(\w+)\.add_jkfit\('([^']+)'\)", text):
        found[var] = aux.lower()
    failures = []
    for key, aux in JKFIT_FOR.items():
        var = key.replace("-", "").replace("*", "s").replace("+", "p")
        if found.get(var) != aux:
            failures.append("%s: psi4 pairs %r, the table says %r" % (key, found.get(var), aux))
    if failures:
        raise SystemExit("JKFIT pairing differs from psi4:\n  " + "\n  ".join(failures))


def render_data_file(key, display, fname, convention, origin, elements):
    """One basis as JSON, one line per element so that diffs stay readable."""
    order = sorted(elements, key=lambda s: ATOMIC_NUMBER[s])
    out = ["{"]
    out.append('  "key": %s,' % json.dumps(key))
    out.append('  "displayName": %s,' % json.dumps(display))
    out.append('  "file": %s,' % json.dumps(fname))
    out.append('  "functions": %s,' % json.dumps(convention))
    out.append('  "origin": %s,' % json.dumps({"package": origin["package"], "version": origin["version"],
                                              "licence": origin["licence"], "generatedBy": GENERATED_BY}))
    out.append('  "elements": {')
    for n, sym in enumerate(order):
        rec = {"shells": elements[sym]["data"]}
        if elements[sym]["ecp"] is not None:
            rec["ecp"] = elements[sym]["ecp"]
        sep = "," if n < len(order) - 1 else ""
        out.append("    %s: %s%s" % (json.dumps(sym), json.dumps(rec, separators=(",", ":")), sep))
    out.append("  }")
    out.append("}")
    return "\n".join(out) + "\n"


def read_basis_file(basis_dir, fname, key, file_defects):
    path = os.path.join(basis_dir, fname)
    try:
        convention, elements, skipped, defects = parse_gbs(path)
    except GbsError as exc:
        raise SystemExit(str(exc))
    for n, s in skipped:
        print("note: %s:%d: ignored text between blocks: %s" % (fname, n, s[:70]), file=sys.stderr)
    for d in defects:
        print("note: " + d, file=sys.stderr)
    file_defects[key] = ["%s:%d: free text between blocks ignored: `%s…`" % (fname, n, s[:40])
                         for n, s in skipped] + defects
    return convention, elements


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--basis-dir", default=DEFAULT_BASIS_DIR)
    ap.add_argument("--out-dir", default=DEFAULT_OUT_DIR)
    ap.add_argument("--check", action="store_true",
                    help="do not write; exit 1 if the committed files differ from a fresh build")
    args = ap.parse_args()

    version = dpkg_version(PACKAGE)
    licence, holders, stanza = dep5_licence(
        COPYRIGHT_FILE,
        # Where the basis files live in the upstream source tree (1.x and older layouts).
        ["psi4/share/psi4/basis/cc-pvdz.gbs", "share/psi4/basis/cc-pvdz.gbs", "lib/basis/cc-pvdz.gbs"])
    origin = {
        "package": PACKAGE,
        "version": version,
        "path": args.basis_dir,
        "licence": licence,
        "generatedBy": GENERATED_BY,
        "note": "Shell structure and counts; exponents and coefficients are in basis-sets/, read on demand.",
    }
    check_jkfit_pairing()

    outputs = {}  # path relative to out-dir -> text
    data_sizes = {}
    bases = {}
    titles = {}
    file_defects = {}
    for key, display, stem, required in BASES:
        fname = stem + ".gbs"
        if not os.path.exists(os.path.join(args.basis_dir, fname)):
            if required:
                raise SystemExit("missing %s" % os.path.join(args.basis_dir, fname))
            print("note: %s not present, %s skipped" % (fname, key), file=sys.stderr)
            continue
        convention, elements = read_basis_file(args.basis_dir, fname, key, file_defects)
        order = sorted(elements, key=lambda s: ATOMIC_NUMBER[s])
        entry = {
            "displayName": display,
            "file": fname,
            "functions": convention,
            "shells": {s: shell_string(elements[s]["shells"]) for s in order},
        }
        ecp = {s: elements[s]["ecpCore"] for s in order if elements[s]["ecpCore"] is not None}
        if ecp:
            entry["ecpCoreElectrons"] = ecp
        entry["jkfit"] = JKFIT_FOR[key]
        entry["data"] = stem
        bases[key] = entry
        titles[key] = read_title_lines(os.path.join(args.basis_dir, fname))
        text = render_data_file(key, display, fname, convention, origin, elements)
        outputs[os.path.join(DATA_SUBDIR, stem + ".json")] = text
        data_sizes[stem] = len(text.encode())

    aux = {}
    by_content = {}
    for aux_key in sorted(set(b["jkfit"] for b in bases.values())):
        fname = aux_key + ".gbs"
        if not os.path.exists(os.path.join(args.basis_dir, fname)):
            raise SystemExit("missing %s" % os.path.join(args.basis_dir, fname))
        convention, elements = read_basis_file(args.basis_dir, fname, aux_key, file_defects)
        for sym, rec in elements.items():
            if rec["ecp"] is not None:
                raise SystemExit("%s: auxiliary set with an ECP on %s" % (fname, sym))
        order = sorted(elements, key=lambda s: ATOMIC_NUMBER[s])
        content = json.dumps([convention, [[s, elements[s]["data"]] for s in order]])
        stem = by_content.get(content)
        display = display_name_of_jkfit(aux_key)
        if stem is None:
            stem = aux_key
            by_content[content] = stem
            text = render_data_file(aux_key, display, fname, convention, origin, elements)
            outputs[os.path.join(DATA_SUBDIR, stem + ".json")] = text
            data_sizes[stem] = len(text.encode())
        aux[aux_key] = {"displayName": display, "file": fname, "functions": convention,
                        "elements": order, "data": stem}
        titles[aux_key] = read_title_lines(os.path.join(args.basis_dir, fname))

    self_check(bases)

    doc = {"origin": origin, "bases": bases, "auxiliary": aux}
    text = compact_json(doc)
    json.loads(text)  # the hand-laid layout must still be valid JSON
    outputs["basis-library.json"] = text
    outputs["BASIS-ORIGIN.md"] = write_origin_md(origin, bases, titles, stanza, holders, file_defects,
                                                 aux, data_sizes)

    data_dir = os.path.join(args.out_dir, DATA_SUBDIR)
    if args.check:
        stale = []
        for rel, text in outputs.items():
            try:
                with open(os.path.join(args.out_dir, rel), encoding="utf-8") as fh:
                    if fh.read() != text:
                        stale.append(rel)
            except OSError:
                stale.append(rel + " (missing)")
        extra = sorted(f for f in (os.listdir(data_dir) if os.path.isdir(data_dir) else [])
                       if os.path.join(DATA_SUBDIR, f) not in outputs)
        stale += [os.path.join(DATA_SUBDIR, f) + " (not generated)" for f in extra]
        if stale:
            print("stale: " + ", ".join(stale), file=sys.stderr)
            raise SystemExit(1)
        print("up to date: %d files" % len(outputs))
        return

    os.makedirs(data_dir, exist_ok=True)
    for f in os.listdir(data_dir):
        if os.path.join(DATA_SUBDIR, f) not in outputs:
            os.remove(os.path.join(data_dir, f))
    for rel, text in outputs.items():
        with open(os.path.join(args.out_dir, rel), "w", encoding="utf-8") as fh:
            fh.write(text)

    npairs = sum(len(b["shells"]) for b in bases.values())
    total = sum(data_sizes.values())
    print("wrote %s (%d bytes, %d bases, %d basis/element pairs)"
          % (os.path.relpath(os.path.join(args.out_dir, "basis-library.json"), REPO_ROOT),
             len(text.encode()), len(bases), npairs))
    print("wrote %d data files in %s (%d bytes)" % (len(data_sizes), os.path.relpath(data_dir, REPO_ROOT), total))
    for key, b in bases.items():
        print("  %-11s %-16s %-9s %3d elements%s" % (
            key, b["file"], b["functions"], len(b["shells"]),
            ", ECP on %d" % len(b["ecpCoreElectrons"]) if "ecpCoreElectrons" in b else ""))


if __name__ == "__main__":
    main()
