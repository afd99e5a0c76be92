#!/usr/bin/python3
"""Generate the two independent checks for server/src/chemistry/data/elements.json:

* tests/fixtures/elements.qcelemental.json -- covalent radii (and nuclide
  masses) from Debian's python3-qcelemental (upstream QCElemental by the
  Molecular Sciences Software Institute, BSD-3-Clause). It shares no code or
  data files with python3-periodictable, which the table's radii come from.
* tests/fixtures/elements.periodictable-weights.json -- standard atomic
  weights from Debian's python3-periodictable (IUPAC 1999 with the 2001
  changes, via NIST; public domain). It shares no code or data files with
  bodr, which the table's weights come from. It also lists the elements whose
  weight in the committed table differs from periodictable's by more than the
  larger of the two stated uncertainties, each with its reason, so a test can
  allow exactly those.

Run it with Debian's interpreter, after generate_elements.py (the weights
fixture compares against the committed table):

    /usr/bin/python3 scripts/data/generate_elements_fixture.py          # rewrite both
    /usr/bin/python3 scripts/data/generate_elements_fixture.py --check  # fail if either is stale

What QCElemental can and cannot give (read from its source under
/usr/lib/python3/dist-packages/qcelemental):

* Standard atomic weight: NOT available. periodic_table.py loads
  data/nist_2011_atomic_weights.py, which keeps only element names, symbols
  and per-nuclide masses (keys Z, E, name, _EE, EA, A, mass); the standard
  atomic weights and abundances of the NIST source were not carried over.
  `periodictable.to_mass("C")` is the mass of the most abundant nuclide
  (12C = 12), or for elements with no stable nuclide the longest-lived one
  ("Pu" -> 244Pu), as its docstring says. So `weight` is null here, and that
  nuclide's mass number and mass are recorded under `nuclide` instead. For
  elements with a single natural nuclide the standard atomic weight equals
  that nuclide's mass, and for elements without a standard atomic weight the
  element table's "[A]" must equal its mass number: that is what a test can
  check.
* Covalent radius: covalent_radii.py, context "ALVAREZ2008", transcribed from
  Table 2 of Cordero, Gomez, Platero-Prats, Reves, Echeverria, Cremades,
  Barragan and Alvarez, "Covalent radii revisited", Dalton Trans. 2008,
  2832-2838 (QCElemental names the set after the last author). Stored in
  angstrom, but `covalentradii.get(atom)` returns BOHR unless `units` is
  given; this script reads the stored angstrom Decimal (Datum.data, units
  checked to be "angstrom"). For C the generic value is sp3; for Mn, Fe and
  Co QCElemental's generic value is the HIGH-spin one ("Larger (high-spin)
  chosen for generic atom"). All labelled variants are recorded too.

What periodictable gives (periodictable/mass.py, read from the installed
source):

* Standard atomic weight: last column of the `massdata` table, text such as
  "12.0107(8)" (value with the uncertainty of its last digits) or "[98]" (no
  standard atomic weight; mass number of the longest-lived isotope). The
  module docstring gives the source: IUPAC "Atomic Weights of the Elements
  1999" (Coplen) with the changes of the 2001 review (Chem. Int. 23, 179
  (2001)), via the NIST "Atomic Weights and Isotopic Compositions" database
  (Coursey, Schwab, Dragoset). The library's own parser keeps the number but
  drops the uncertainty and the brackets, so the raw text is read here and
  its number checked against Element.mass.

The comparison written into the weights fixture: for each element both
sides give as a weight (not a mass number), |table - periodictable| must be
at most the larger of the two stated uncertainties (the table's
"conventional" rows state none, so periodictable's counts). Elements beyond
that are listed in `revisedSince1999` with a reason; the reasons are kept in
REASONS below, written by hand, and the script stops if the computed list
and REASONS disagree, so a new difference needs a person to explain it.
Mass numbers must be equal, except those in MASS_NUMBER_REASONS.
"""

import argparse
import json
import os
import re
import subprocess
import sys
from decimal import Decimal

REPO_ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
OUT_PATH = os.path.join(REPO_ROOT, "tests", "fixtures", "elements.qcelemental.json")
WEIGHTS_OUT_PATH = os.path.join(REPO_ROOT, "tests", "fixtures", "elements.periodictable-weights.json")
TABLE_PATH = os.path.join(REPO_ROOT, "server", "src", "chemistry", "data", "elements.json")
COPYRIGHT_PATH = "/usr/share/doc/python3-qcelemental/copyright"
DEB_PACKAGE = "python3-qcelemental"
PT_COPYRIGHT_PATH = "/usr/share/doc/python3-periodictable/copyright"
PT_PACKAGE = "python3-periodictable"
Z_MAX = 96

# Tolerance a test allows for the elements in revisedSince1999, in u. The
# largest such difference is Zn's, 0.029 u.
REVISED_TOLERANCE = 0.05
# Slack for comparing in binary floating point: some elements differ by exactly
# the larger uncertainty in decimal (atUncertaintyLimit in the fixture), and
# the float difference may land on either side of it.
FLOAT_SLACK = 1e-9

# Why the table's weight (bodr, IUPAC table of the year in its origin) differs
# from periodictable's (IUPAC 1999/2001) by more than the larger stated
# uncertainty. Neither package documents when each value changed: bodr's
# changelog says only that release 6 (2007) followed "a 2006 IUPAC
# publication", release 9 (2010) "the IUPAC table" and release 10 (2013) "the
# latest publication of the IUPAC"; its bibliography lists the 2001, 2005,
# 2007 and 2011 reports without tying them to elements; periodictable's
# changelog and docs say nothing of later tables. So no revision year is
# given. "short" means bodr gives the value with fewer digits and no
# uncertainty (weightKind "conventional" in the table); "value" means bodr
# gives a new value with its own uncertainty.
REASONS = {
    "N": "short",
    "O": "short",
    "Si": "short",
    "Cl": "short",
    "Zn": "value",
    "Tl": "short",
}

# Mass numbers (elements with no standard atomic weight) that differ.
MASS_NUMBER_REASONS = {
    "Tc": "Not an IUPAC revision: Tc has no standard atomic weight, and the two packages quote different "
          "long-lived isotopes. periodictable gives [98]; bodr gives 97, and bodr's own isotopes.xml lists "
          "a half-life for 97Tc (2600000 y) and none for 98Tc. python3-qcelemental's longest-lived Tc "
          "nuclide is also 98 (tests/fixtures/elements.qcelemental.json).",
}

try:
    import qcelemental
    from qcelemental import DataUnavailableError
    from qcelemental.data import alvarez_2008_covalent_radii, nist_2011_atomic_weights
except ImportError:  # pragma: no cover - environment guard
    sys.exit(
        "qcelemental not importable from %s.\n"
        "Install Debian's package (apt-get install -y python3-qcelemental) and run this\n"
        "script with /usr/bin/python3, not a pyenv/venv interpreter." % sys.executable
    )

try:
    import periodictable
    import periodictable.mass as pt_mass
except ImportError:  # pragma: no cover - environment guard
    sys.exit(
        "periodictable not importable from %s.\n"
        "Install Debian's package (apt-get install -y python3-periodictable) and run this\n"
        "script with /usr/bin/python3, not a pyenv/venv interpreter." % sys.executable
    )

VARIANT_NAMES = {"sp3": "sp3", "sp2": "sp2", "sp": "sp", "lowspin": "lowSpin", "highspin": "highSpin"}


def fail(message):
    sys.exit("generate_elements_fixture.py: " + message)


def dpkg_version(package):
    try:
        out = subprocess.run(["dpkg-query", "-W", "-f=${Version}", package],
                             check=True, capture_output=True, text=True)
    except (OSError, subprocess.CalledProcessError) as exc:
        fail("cannot ask dpkg for the version of %s: %s" % (package, exc))
    return out.stdout.strip()


def licence_from_copyright(path):
    with open(path, encoding="utf-8") as handle:
        text = handle.read()
    for stanza in re.split(r"\n\s*\n", text):
        if re.search(r"^Files:\s*\*\s*$", stanza, re.M):
            lic = re.search(r"^License:\s*(\S+)", stanza, re.M)
            holder = re.search(r"^Copyright:\s*(.+)$", stanza, re.M)
            if lic:
                return "%s; copyright line: %s; per the 'Files: *' stanza of %s" % (
                    lic.group(1), holder.group(1).strip() if holder else "?", path)
    fail("no 'Files: *' licence found in " + path)


def check_library_sources():
    """Stop if the installed library no longer stores what this script assumes."""
    pt = qcelemental.periodictable
    keys = set(nist_2011_atomic_weights)
    if keys & {"standard_atomic_weight", "atomic_weight", "weight", "abundance"}:
        fail("qcelemental now ships standard atomic weights or abundances (%s); "
             "use them instead of null" % sorted(keys))
    doc = " ".join((pt.to_mass.__doc__ or "").split())
    if "most abundant isotope" not in doc or "longest-lived isotope" not in doc:
        fail("to_mass docstring changed; re-read what it returns")
    if alvarez_2008_covalent_radii["units"] != "angstrom":
        fail("ALVAREZ2008 radii are no longer stored in angstrom")
    if alvarez_2008_covalent_radii["title"] != "Covalent radii revisited":
        fail("ALVAREZ2008 radii no longer cite 'Covalent radii revisited'")


def radius_entry(cr, symbol):
    try:
        datum = cr.get(symbol, return_tuple=True)
    except DataUnavailableError:
        return None, None
    if datum.units != "angstrom":
        fail("%s radius stored in %s, not angstrom" % (symbol, datum.units))
    value = float(datum.data)
    # cross-check the unit handling: get() with explicit units must agree,
    # and the default (bohr) must be larger by 1/0.529...
    if abs(cr.get(symbol, units="angstrom") - value) > 1e-12:
        fail("%s: angstrom value and get(units='angstrom') disagree" % symbol)
    if not 1.88 < cr.get(symbol) / value < 1.89:
        fail("%s: default get() is no longer bohr" % symbol)
    return value, (datum.comment or None)


def build_qcelemental():
    check_library_sources()
    pt = qcelemental.periodictable
    cr = qcelemental.covalentradii

    elements = []
    for z in range(1, Z_MAX + 1):
        symbol = pt.to_E(z)
        radius, comment = radius_entry(cr, symbol)
        mass = pt.to_mass(symbol, return_decimal=True)
        elements.append({
            "z": pt.to_Z(symbol),
            "symbol": symbol,
            "name": pt.to_element(symbol),
            "weight": None,
            "nuclide": {"massNumber": pt.to_A(symbol), "mass": float(Decimal(mass))},
            "covalentRadius": radius,
            "covalentRadiusComment": comment,
        })
        if elements[-1]["z"] != z:
            fail("atomic number mismatch for %s" % symbol)

    variants = {}
    for label in cr.cr:
        if "_" in label:
            symbol, kind = label.split("_", 1)
            variants.setdefault(symbol, {})[VARIANT_NAMES[kind]] = float(cr.cr[label].data)

    missing_radius = [e["symbol"] for e in elements if e["covalentRadius"] is None]
    weights_src = nist_2011_atomic_weights
    radii_src = alvarez_2008_covalent_radii
    return {
        "origin": {
            "package": DEB_PACKAGE,
            "version": dpkg_version(DEB_PACKAGE),
            "upstreamVersion": qcelemental.__version__,
            "licence": licence_from_copyright(COPYRIGHT_PATH),
            "names": "qcelemental.periodictable.to_element (data/nist_2011_atomic_weights.py, 'name'); "
                     "American spelling, e.g. 'Aluminum', 'Cesium'",
            "weights": "none: qcelemental %s ships no standard atomic weights (see notes); weight is null"
                       % qcelemental.__version__,
            "nuclides": "qcelemental.periodictable.to_A / to_mass: most abundant nuclide, or longest-lived "
                        "for elements with no stable nuclide; data/nist_2011_atomic_weights.py: '%s', %s, "
                        "doi %s" % (weights_src["title"], weights_src["date"], weights_src["doi"]),
            "covalentRadii": "qcelemental.covalentradii, context ALVAREZ2008 (data/alvarez_2008_covalent_radii.py): "
                             "Cordero et al., '%s', Dalton Trans. 2008, 2832-2838, %s; stored in %s and read "
                             "in angstrom (get() defaults to bohr)"
                             % (radii_src["title"], radii_src["doi"].replace("DOI: ", "doi:"), radii_src["units"]),
            "units": {"nuclide.mass": "u", "covalentRadius": "angstrom"},
            "generatedBy": "scripts/data/generate_elements_fixture.py",
            "notes": [
                "weight is null for every element: qcelemental's periodic table keeps only per-nuclide masses, "
                "and to_mass() of an element is the most-abundant (or longest-lived) nuclide's mass, not the "
                "standard atomic weight. Use nuclide.mass as a weight check only for elements with a single "
                "natural nuclide, and nuclide.massNumber for elements whose weight is a bracketed mass number.",
                "covalentRadius is QCElemental's generic value: sp3 for C (0.76) and the larger, high-spin "
                "value for Mn, Fe and Co (its comments: 'Largest (sp3) chosen for generic atom', "
                "'Larger (high-spin) chosen for generic atom'). covalentRadiusVariants has every labelled value.",
                "covalentRadiusComment is QCElemental's comment: Cordero's e.s.d. in units of 0.01 A and "
                "the number of structures n, or the reason a generic value was chosen.",
                ("No covalent radius for: %s." % ", ".join(missing_radius)) if missing_radius
                else "Every element Z = 1..%d has a covalent radius." % Z_MAX,
            ],
        },
        "covalentRadiusVariants": variants,
        "elements": elements,
    }


def check_periodictable_sources():
    """Stop if periodictable no longer describes its weights as stated above."""
    mass_doc = " ".join((pt_mass.__doc__ or "").split())
    for needle in ("Atomic Weights of the Elements 1999", "2001 review", "Chem. Int., 23, 179 (2001)",
                   "Coursey"):
        if needle not in mass_doc:
            fail("periodictable/mass.py docstring no longer mentions %r" % needle)
    if periodictable.elements[1].mass_units != "u":
        fail("periodictable mass units are not u")


def periodictable_weights():
    """Map Z -> dict(weight, uncertainty (Decimal or None), kind, text) from mass.py's massdata."""
    raw = {}
    for line in pt_mass.massdata.split("\n"):
        isotope, _mass, _abundance, avg = line.split(",")
        z = int(isotope.split("-")[0])
        if raw.setdefault(z, avg) != avg:
            fail("element %d has two different atomic weights in mass.py" % z)
    out = {}
    for z in range(1, Z_MAX + 1):
        text = raw.get(z, "")
        m = re.fullmatch(r"(\d+\.(\d+))\((\d+)\)", text)
        if m:
            # "12.0107(8)": uncertainty 8 in the last digit -> 0.0008
            value, unc = Decimal(m.group(1)), Decimal(m.group(3)).scaleb(-len(m.group(2)))
            out[z] = {"weight": value, "uncertainty": unc, "kind": "standard", "text": text}
        elif re.fullmatch(r"\[(\d+)\]", text):
            out[z] = {"weight": Decimal(text[1:-1]), "uncertainty": None, "kind": "massNumber", "text": text}
        else:
            fail("cannot read periodictable atomic weight %r of element %d" % (text, z))
        if abs(float(out[z]["weight"]) - float(periodictable.elements[z].mass)) > 1e-12:
            fail("mass.py text and Element.mass disagree for Z=%d" % z)
    return out


def concise(value, unc):
    """65.38 and 0.02 -> '65.38(2)'; no uncertainty -> '65.38'."""
    if value is None:
        return "none"
    value = Decimal(repr(value)) if isinstance(value, float) else Decimal(value)
    if unc is None:
        return str(value)
    unc = Decimal(repr(unc)) if isinstance(unc, float) else Decimal(unc)
    places = max(-value.as_tuple().exponent, -unc.normalize().as_tuple().exponent)
    digits = int(unc.scaleb(places))
    return "%s(%d)" % (format(value, "f") if -value.as_tuple().exponent == places
                       else format(value.quantize(Decimal(1).scaleb(-places)), "f"), digits)


def load_table():
    try:
        with open(TABLE_PATH, encoding="utf-8") as handle:
            table = json.load(handle)
    except (OSError, ValueError) as exc:
        fail("cannot read %s (run generate_elements.py first): %s" % (TABLE_PATH, exc))
    sources = table.get("origin", {}).get("sources", [])
    bodr = next((src for src in sources if src.get("package") == "bodr"), None)
    year = table.get("origin", {}).get("iupacWeightsTable")
    if bodr is None or not isinstance(year, int):
        fail("%s does not record bodr and its IUPAC table year in origin; this comparison assumes it does"
             % TABLE_PATH)
    return table, bodr, year


def build_weights():
    check_periodictable_sources()
    pt = periodictable_weights()
    table, bodr, year = load_table()
    ours = {e["z"]: e for e in table["elements"]}
    if sorted(ours) != list(range(1, Z_MAX + 1)):
        fail("table does not cover Z = 1..%d" % Z_MAX)

    revised, at_limit, mass_numbers = {}, {}, {}
    for z in range(1, Z_MAX + 1):
        a, b = ours[z], pt[z]
        symbol = a["symbol"]
        if symbol != periodictable.elements[z].symbol:
            fail("Z=%d: table symbol %s, periodictable %s" % (z, symbol, periodictable.elements[z].symbol))
        if (a["weightKind"] == "massNumber") != (b["kind"] == "massNumber"):
            fail("%s: the table gives a %s and periodictable a %s; no rule for that"
                 % (symbol, a["weightKind"], b["kind"]))
        if b["kind"] == "massNumber":
            if Decimal(a["weight"]) != b["weight"]:
                mass_numbers[symbol] = (a["weight"], int(b["weight"]))
            continue
        ta = Decimal(repr(a["weight"]))
        ua = Decimal(repr(a["weightUncertainty"])) if a["weightUncertainty"] is not None else Decimal(0)
        tol = max(ua, b["uncertainty"])
        diff = abs(ta - b["weight"])
        if diff > tol:
            revised[symbol] = (a, b, diff)
        elif diff == tol:
            at_limit[symbol] = (a, b, diff)

    if set(revised) != set(REASONS):
        fail("elements beyond the stated uncertainties are %s, REASONS explains %s; find the reason for "
             "each new one and update REASONS" % (sorted(revised), sorted(REASONS)))
    # the Tc reason quotes bodr's isotopes.xml, which the table generator reads into its notes
    if "Tc" in mass_numbers and "97Tc: 2600000 y, 98Tc: none listed" not in " ".join(table["origin"]["notes"]):
        fail("the table's notes no longer give bodr's Tc half-lives as MASS_NUMBER_REASONS quotes them")
    if set(mass_numbers) != set(MASS_NUMBER_REASONS):
        fail("mass numbers differ for %s, MASS_NUMBER_REASONS explains %s"
             % (sorted(mass_numbers), sorted(MASS_NUMBER_REASONS)))

    def reason(symbol):
        a, b, diff = revised[symbol]
        if diff > Decimal(repr(REVISED_TOLERANCE)):
            fail("%s differs by %s u, more than the %s u a revision is allowed here" % (symbol, diff, REVISED_TOLERANCE))
        kind = REASONS[symbol]
        if kind == "short" and a["weightKind"] != "conventional":
            fail("REASONS says %s is a short value, but the table has weightKind %s" % (symbol, a["weightKind"]))
        if kind == "value" and a["weightKind"] != "standard":
            fail("REASONS says %s is a new value, but the table has weightKind %s" % (symbol, a["weightKind"]))
        if kind == "short":
            what = ("bodr (IUPAC %d table) gives the short value %s with no uncertainty (weightKind "
                    "'conventional' in the table), and neither package says why" % (year, concise(a["weight"], None)))
        else:
            what = "bodr (IUPAC %d table) gives %s" % (year, concise(a["weight"], a["weightUncertainty"]))
        return ("IUPAC revision between 1999 and %d, year not established: periodictable (IUPAC 1999/2001) "
                "gives %s; %s. Table minus periodictable: %s u." % (
                    year, b["text"], what, format(Decimal(repr(a["weight"])) - b["weight"], "+f")))

    def limit_note(symbol):
        a, b, diff = at_limit[symbol]
        return ("Table (bodr, IUPAC %d) %s vs periodictable %s: difference %s u equals the larger stated "
                "uncertainty, so it is within it; in binary floating point it may land on either side, hence floatSlack." % (
                    year, concise(a["weight"], a["weightUncertainty"]), b["text"], format(diff, "f")))

    order = {e["symbol"]: e["z"] for e in table["elements"]}
    elements = []
    for z in range(1, Z_MAX + 1):
        b = pt[z]
        elements.append({
            "z": z,
            "symbol": periodictable.elements[z].symbol,
            "weight": int(b["weight"]) if b["kind"] == "massNumber" else float(b["weight"]),
            "weightUncertainty": float(b["uncertainty"]) if b["uncertainty"] is not None else None,
            "weightKind": b["kind"],
            "text": b["text"],
        })

    return {
        "origin": {
            "package": PT_PACKAGE,
            "version": dpkg_version(PT_PACKAGE),
            "upstreamVersion": periodictable.__version__,
            "licence": licence_from_copyright(PT_COPYRIGHT_PATH),
            "weights": "periodictable/mass.py, last column of the massdata table: IUPAC 'Atomic Weights of the "
                       "Elements 1999' (Coplen) with the changes of the 2001 review (Chem. Int. 23, 179 (2001)), "
                       "via NIST Atomic Weights and Isotopic Compositions (Coursey, Schwab, Dragoset)",
            "units": {"weight": "u", "weightUncertainty": "u"},
            "generatedBy": "scripts/data/generate_elements_fixture.py",
            "notes": [
                "Independent of the table's weights: python3-periodictable shares no code or data files with "
                "bodr, which server/src/chemistry/data/elements.json takes its weights from.",
                "text is the library's own string. weightUncertainty is the bracketed uncertainty of the last "
                "digits in u ('12.0107(8)' -> 0.0008). weightKind 'massNumber': '[A]', the mass number of the "
                "longest-lived isotope of an element with no standard atomic weight; weightUncertainty null.",
                "These are older values than the table's (IUPAC 1999/2001 against bodr's IUPAC %d table). "
                "Agreement within the stated uncertainties does not mean a value was not revised: many were, "
                "by less than the uncertainty." % year,
            ],
        },
        "comparison": {
            "table": "server/src/chemistry/data/elements.json",
            "tableWeights": "bodr %s, IUPAC %d table" % (bodr.get("version"), year),
            "rule": "For every element whose weightKind is not 'massNumber' on either side: |table weight - "
                    "fixture weight| <= max(table weightUncertainty ?? 0, fixture weightUncertainty) + floatSlack, "
                    "except the elements in revisedSince1999, for which |difference| <= revisedTolerance. "
                    "For 'massNumber' elements (on both sides): the weights are equal, except the elements in "
                    "massNumberDifferences.",
            "revisedTolerance": REVISED_TOLERANCE,
            "floatSlack": FLOAT_SLACK,
        },
        "revisedSince1999": {s: reason(s) for s in sorted(revised, key=order.get)},
        "atUncertaintyLimit": {s: limit_note(s) for s in sorted(at_limit, key=order.get)},
        "massNumberDifferences": {
            s: "table (bodr) %d, periodictable [%d]. %s" % (mass_numbers[s][0], mass_numbers[s][1],
                                                           MASS_NUMBER_REASONS[s])
            for s in sorted(mass_numbers, key=order.get)},
        "elements": elements,
    }


def render(data):
    head = {k: v for k, v in data.items() if k != "elements"}
    text = json.dumps(head, indent=2, ensure_ascii=False)
    rows = ",\n".join("    " + json.dumps(e, ensure_ascii=False) for e in data["elements"])
    return text[:-2] + ',\n  "elements": [\n' + rows + "\n  ]\n}\n"


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--check", action="store_true",
                        help="do not write; exit 1 if a committed file differs from a fresh build")
    parser.add_argument("--out", default=OUT_PATH, help="QCElemental fixture (default: %(default)s)")
    parser.add_argument("--weights-out", default=WEIGHTS_OUT_PATH,
                        help="periodictable weights fixture (default: %(default)s)")
    args = parser.parse_args()

    stale = []
    for path, build in ((args.out, build_qcelemental), (args.weights_out, build_weights)):
        text = render(build())
        json.loads(text)
        if args.check:
            try:
                with open(path, encoding="utf-8") as handle:
                    current = handle.read()
            except OSError:
                current = None
            if current != text:
                stale.append(path)
            else:
                print("%s is up to date" % path)
            continue
        os.makedirs(os.path.dirname(path), exist_ok=True)
        with open(path, "w", encoding="utf-8") as handle:
            handle.write(text)
        print("wrote %s" % path)
    if stale:
        sys.exit("stale: %s; rerun scripts/data/generate_elements_fixture.py" % ", ".join(stale))

if __name__ == "__main__":
    main()
