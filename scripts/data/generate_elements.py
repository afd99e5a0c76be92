#!/usr/bin/python3
"""Generate server/src/chemistry/data/elements.json, Tessera's element table.

Two Debian packages are read; run the script with Debian's interpreter, which
is the one that sees them:

    apt-get install -y bodr python3-periodictable
    /usr/bin/python3 scripts/data/generate_elements.py          # rewrite the JSON
    /usr/bin/python3 scripts/data/generate_elements.py --check  # fail if it is stale

Where each field comes from:

* weight, weightUncertainty, weightKind -- Debian `bodr` (Blue Obelisk Data
             Repository), file elements.xml, the `bo:mass` scalar of each
             <atom>. Its dictionary defines bo:mass as "IUPAC Official
             Masses". Which IUPAC table: bodr's upstream changelog says release
             10 "Fixed all atomic masses accordingly to the latest publication
             of the IUPAC" and "Added latest atomic table publication"; the
             newest atomic-weights report in its bibliography
             (biblio/elements_biblio.html) is "Atomic weights of the elements
             2011 (IUPAC Technical Report)", Pure Appl. Chem. 85, 1047-1078
             (2013). The script reads both files and stops if they say
             otherwise. The `errorValue` attribute is the uncertainty in units
             of the last digit given (He: 4.002602, errorValue 2 -> 0.000002);
             read literally it would be 2 u. Three kinds of entry:
               - decimal with errorValue: weightKind "standard";
               - decimal without errorValue (H, Li, B, C, N, O, Mg, Si, S, Cl,
                 Br, Tl): weightKind "conventional", weightUncertainty null;
                 bodr gives a short value and does not say why;
               - integer without errorValue: weightKind "massNumber", the mass
                 number of a long-lived isotope of an element with no standard
                 atomic weight. The script checks these are exactly the elements
                 with no naturally abundant isotope in bodr's isotopes.xml.
* z, symbol, name -- python3-periodictable, core.py, table `element_base`.
             American spelling ("Aluminum", "Cesium"; bodr spells them
             "Aluminium", "Caesium"). Symbols are checked against bodr's.
* covalentRadius -- python3-periodictable, covalent_radius.py, table
             `Cordero`: Cordero et al., "Covalent radii revisited", Dalton
             Trans. 2008, 2832-2838, doi:10.1039/b801115j. Angstrom.

The script checks those claims against the installed packages (docstrings,
units, changelog, bibliography) and stops if a future version says otherwise.
The periodictable package's own atomic weights (IUPAC 1999/2001) are not used
here: they are the independent check, see generate_elements_fixture.py.
"""

import argparse
import gzip
import json
import os
import re
import subprocess
import sys
import xml.etree.ElementTree as ET
from decimal import Decimal

REPO_ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
OUT_PATH = os.path.join(REPO_ROOT, "server", "src", "chemistry", "data", "elements.json")
Z_MAX = 96  # Cordero et al. 2008 covers Z = 1..96

PT_PACKAGE = "python3-periodictable"
PT_COPYRIGHT = "/usr/share/doc/python3-periodictable/copyright"
BODR_PACKAGE = "bodr"
BODR_COPYRIGHT = "/usr/share/doc/bodr/copyright"
BODR_CHANGELOG = "/usr/share/doc/bodr/changelog.gz"
BODR_BIBLIO = "/usr/share/doc/bodr/biblio/elements_biblio.html"
BODR_README = "/usr/share/doc/bodr/README"
CML = {"c": "http://www.xml-cml.org/schema"}

try:
    import periodictable
    import periodictable.covalent_radius as pt_covalent
except ImportError:  # pragma: no cover - environment guard
    sys.exit(
        "periodictable not importable from %s.\n"
        "Install Debian's package (apt-get install -y python3-periodictable) and run this\n"
        "script with /usr/bin/python3, not a pyenv/venv interpreter." % sys.executable
    )


def fail(message):
    sys.exit("generate_elements.py: " + message)


def read_text(path):
    try:
        if path.endswith(".gz"):
            with gzip.open(path, "rt", encoding="utf-8") as handle:
                return handle.read()
        with open(path, encoding="utf-8") as handle:
            return handle.read()
    except OSError as exc:
        fail("cannot read %s: %s (apt-get install -y %s)" % (path, exc, BODR_PACKAGE))


def dpkg_version(package):
    try:
        out = subprocess.run(
            ["dpkg-query", "-W", "-f=${Version}", package],
            check=True, capture_output=True, text=True,
        )
    except (OSError, subprocess.CalledProcessError) as exc:
        fail("cannot ask dpkg for the version of %s: %s (apt-get install -y %s)" % (package, exc, package))
    return out.stdout.strip()


def dpkg_file(package, basename):
    """The one file named `basename` that dpkg says the package installed."""
    try:
        out = subprocess.run(["dpkg", "-L", package], check=True, capture_output=True, text=True)
    except (OSError, subprocess.CalledProcessError) as exc:
        fail("cannot list the files of %s: %s (apt-get install -y %s)" % (package, exc, package))
    hits = [line for line in out.stdout.splitlines() if os.path.basename(line) == basename]
    if len(hits) != 1:
        fail("expected one %s in package %s, found %s" % (basename, package, hits))
    return hits[0]


def licence_from_copyright(path):
    """Return the licence of the 'Files: *' stanza of a Debian copyright file."""
    text = read_text(path)
    for stanza in re.split(r"\n\s*\n", text):
        if re.search(r"^Files:\s*\*\s*$", stanza, re.M):
            lic = re.search(r"^License:\s*(\S+)\s*\n((?: .*\n?)*)", stanza, re.M)
            holder = re.search(r"^Copyright:\s*(.+)$", stanza, re.M)
            if not lic:
                break
            body = " ".join(line.strip() for line in lic.group(2).splitlines()).strip()
            parts = [lic.group(1)]
            # quote a one-line licence text ("This program is public domain."), not a full licence
            if body and len(body) < 200:
                parts.append('("%s")' % body)
            if holder:
                parts.append("; copyright line: " + holder.group(1).strip())
            parts.append("; per the 'Files: *' stanza of " + path)
            return " ".join(parts).replace(" ;", ";")
    fail("no 'Files: *' licence found in " + path)


def check_periodictable_sources():
    """Stop if the installed library no longer describes its radii as we state it."""
    cov_doc = " ".join((pt_covalent.__doc__ or "").split())
    for needle in ("Cordero", "Covalent radii revisited", "2008", "2832-2838",
                   "sp3 for carbon and low spin for manganese"):
        if needle not in cov_doc:
            fail("periodictable/covalent_radius.py docstring no longer mentions %r" % needle)
    if periodictable.elements[1].covalent_radius_units != "angstrom":
        fail("covalent radius units are not angstrom")


def bodr_iupac_table():
    """Year of the IUPAC atomic-weights table bodr follows, from its own changelog and bibliography.

    The newest "Atomic weights of the elements YYYY" report in the bibliography of
    elements.xml, provided the newest changelog entry says the masses were brought
    in line with the latest IUPAC publication and that this publication was added.
    """
    changelog = read_text(BODR_CHANGELOG)
    newest = re.split(r"\n(?=Release version )", changelog.strip())[0]
    head = re.match(r"Release version (\S+) (\d{4}-\d\d-\d\d)", newest)
    flat = " ".join(newest.split())
    for needle in ("Fixed all atomic masses accordingly to the latest publication of the IUPAC",
                   "Added latest atomic table publication"):
        if needle not in flat:
            fail("newest entry of %s no longer says %r; re-establish the IUPAC table year" % (BODR_CHANGELOG, needle))
    biblio = re.sub(r"<[^>]+>", " ", read_text(BODR_BIBLIO))
    reports = {}
    for m in re.finditer(r"(\d{4}), 'Atomic weights of the elements (\d{4}) \(IUPAC Technical Report\)' in\s+"
                         r"Pure Appl\. Chem\.\s*, vol\.(\d+)[^']*?pp\.(\d+-\d+)", biblio):
        reports[int(m.group(2))] = "Atomic weights of the elements %s (IUPAC Technical Report), Pure Appl. " \
                                   "Chem. %s, %s (%s)" % (m.group(2), m.group(3), m.group(4).replace("-", "\u2013"),
                                                          m.group(1))
    if not reports:
        fail("no IUPAC atomic-weights report found in " + BODR_BIBLIO)
    year = max(reports)
    return {
        "year": year,
        "report": reports[year],
        "release": head.group(1) if head else None,
        "releaseDate": head.group(2) if head else None,
        "reportsInBibliography": sorted(reports),
    }


def bodr_isotopes(isotopes_path):
    """From bodr's isotopes.xml: Z numbers with no isotope of positive bo:relativeAbundance,
    and {(Z, A): half-life text with units or None} for every isotope listed."""
    root = ET.parse(isotopes_path).getroot()
    natural = set()
    half_lives = {}
    for iso in root.iter("{%s}isotope" % CML["c"]):
        z = int(iso.find("c:scalar[@dictRef='bo:atomicNumber']", CML).text)
        ab = iso.find("c:scalar[@dictRef='bo:relativeAbundance']", CML)
        if ab is not None and float(ab.text) > 0:
            natural.add(z)
        hl = iso.find("c:scalar[@dictRef='bo:halfLife']", CML)
        half_lives[(z, int(iso.get("number")))] = (
            "%s %s" % (hl.text.strip(), hl.get("units", "").replace("units:", "")) if hl is not None else None)
    return {z for z in range(1, Z_MAX + 1) if z not in natural}, half_lives


def bodr_weights(elements_path):
    """Map Z -> (symbol, weight, uncertainty, kind) from bodr's elements.xml."""
    root = ET.parse(elements_path).getroot()
    dictionary = read_text(dpkg_file(BODR_PACKAGE, "blueobelisk-dictionary.xml"))
    if not re.search(r'<entry id="mass"[^>]*>.*?IUPAC Official Masses', dictionary, re.S):
        fail("bodr dictionary no longer defines bo:mass as 'IUPAC Official Masses'")
    out = {}
    for atom in root.findall("c:atom", CML):
        z = int(atom.find("c:scalar[@dictRef='bo:atomicNumber']", CML).text)
        if not 1 <= z <= Z_MAX:
            continue
        symbol = atom.find("c:label[@dictRef='bo:symbol']", CML).get("value")
        mass = atom.find("c:scalar[@dictRef='bo:mass']", CML)
        if mass is None:
            out[z] = (symbol, None, None, None)
            continue
        if mass.get("units") != "units:atmass":
            fail("bodr mass of %s is in %s, not units:atmass" % (symbol, mass.get("units")))
        text, err = mass.text.strip(), mass.get("errorValue")
        m = re.fullmatch(r"\d+\.(\d+)", text)
        if m and err is not None:
            if not re.fullmatch(r"[1-9]\d?", err):
                fail("bodr errorValue %r of %s is not a last-digit uncertainty" % (err, symbol))
            # "4.002602" errorValue "2" -> 0.000002; Decimal keeps the digits exact
            unc = Decimal(err).scaleb(-len(m.group(1)))
            out[z] = (symbol, float(Decimal(text)), float(unc), "standard")
        elif m:
            out[z] = (symbol, float(Decimal(text)), None, "conventional")
        elif re.fullmatch(r"\d+", text) and err is None:
            out[z] = (symbol, int(text), None, "massNumber")
        else:
            fail("cannot read bodr mass %r (errorValue %r) of %s" % (text, err, symbol))
    return out


def parse_radius_variants():
    """Return {symbol: [(label, radius), ...]} for elements Cordero lists more than once."""
    variants = {}
    current = None
    for line in pt_covalent.Cordero.split("\n"):
        fields = line.split()
        if not fields:
            continue
        label, radius = fields[1], float(fields[2])
        if fields[0] != "-":
            current = int(fields[0])
        symbol = periodictable.elements[current].symbol
        variants.setdefault(symbol, []).append((label[len(symbol):] or None, radius))
    return {s: v for s, v in variants.items() if len(v) > 1}


VARIANT_NAMES = {"sp3": "sp3", "sp2": "sp2", "sp": "sp", "l.s.": "lowSpin", "h.s.": "highSpin"}


def build():
    check_periodictable_sources()
    elements_xml = dpkg_file(BODR_PACKAGE, "elements.xml")
    isotopes_xml = dpkg_file(BODR_PACKAGE, "isotopes.xml")
    table = bodr_iupac_table()
    weights = bodr_weights(elements_xml)
    no_natural, half_lives = bodr_isotopes(isotopes_xml)
    variants = parse_radius_variants()

    elements = []
    missing = []
    for z in range(1, Z_MAX + 1):
        el = periodictable.elements[z]
        symbol, weight, unc, kind = weights.get(z, (el.symbol, None, None, None))
        if symbol != el.symbol:
            fail("Z=%d: bodr symbol %s, periodictable symbol %s" % (z, symbol, el.symbol))
        if (kind == "massNumber") != (z in no_natural):
            fail("%s: bodr gives %r (%s) but its isotopes.xml %s a naturally abundant isotope" % (
                symbol, weight, kind, "lists no" if z in no_natural else "lists"))
        if kind == "massNumber" and (z, weight) not in half_lives:
            fail("%s: bodr mass number %d is not an isotope in its isotopes.xml" % (symbol, weight))
        radius = el.covalent_radius
        if weight is None:
            missing.append("%s weight" % el.symbol)
        if radius is None:
            missing.append("%s covalentRadius" % el.symbol)
        elements.append({
            "z": z,
            "symbol": el.symbol,
            "name": el.name[:1].upper() + el.name[1:],
            "weight": weight,
            "weightUncertainty": unc,
            "weightKind": kind,
            "covalentRadius": radius,
        })

    radius_variants = {}
    for symbol, rows in variants.items():
        radius_variants[symbol] = {VARIANT_NAMES[label]: r for label, r in rows}
    for symbol, expected_first in (("C", "sp3"), ("Mn", "l.s."), ("Fe", "l.s."), ("Co", "l.s.")):
        rows = variants.get(symbol)
        if not rows or rows[0][0] != expected_first:
            fail("Cordero table in covalent_radius.py no longer lists %s %s first" % (symbol, expected_first))
        used = next(e["covalentRadius"] for e in elements if e["symbol"] == symbol)
        if used != rows[0][1]:
            fail("%s radius %s is not the first Cordero row" % (symbol, used))

    def describe(symbol):
        v = radius_variants[symbol]
        return ", ".join("%s %.2f" % (k, r) for k, r in v.items())

    def kinds(kind):
        return [e["symbol"] for e in elements if e["weightKind"] == kind]

    bodr_readme = " ".join(read_text(BODR_README).split())
    cc0 = "Creative Commons Zero waiver" in bodr_readme
    elements_xml_text = read_text(elements_xml)
    xml_licence = re.search(r'<metadata name="dc:license" content="([^"]+)"', elements_xml_text)
    notes = [
        "Weights are bodr's bo:mass values (elements.xml), which follow the IUPAC table of %d: %s. "
        "Established from bodr's own files: the newest upstream changelog entry (release %s, %s) says the "
        "masses were fixed to the latest IUPAC publication and that publication was added to the "
        "bibliography, and the newest atomic-weights report in that bibliography is the %d one "
        "(reports listed: %s)." % (
            table["year"], table["report"], table["release"], table["releaseDate"], table["year"],
            ", ".join(str(y) for y in table["reportsInBibliography"])),
        "weightKind 'standard': a value with bodr's errorValue, read as the uncertainty of the last digit "
        "given (He 4.002602 with errorValue 2 is 4.002602(2)); weightUncertainty is that number in u.",
        "weightKind 'conventional' (%s): bodr gives a short value with no errorValue and does not say why. "
        "They look like the single 'conventional' values IUPAC publishes for elements whose standard atomic "
        "weight it gives as an interval; that is not stated in bodr's files and is not checked here. "
        "weightUncertainty is null." % ", ".join(kinds("conventional")),
        "weightKind 'massNumber' (%s): bodr gives an integer with no errorValue, the mass number of a "
        "long-lived isotope of an element with no standard atomic weight; weight is that integer and "
        "weightUncertainty is null. The generator checks these are exactly the elements Z <= %d with no "
        "naturally abundant isotope in bodr's isotopes.xml, and that each mass number is an isotope listed "
        "there. For Tc bodr gives %d where python3-periodictable and python3-qcelemental give 98; bodr's "
        "isotopes.xml gives half-lives 97Tc: %s, 98Tc: %s." % (
            ", ".join(kinds("massNumber")), Z_MAX, weights[43][1],
            half_lives.get((43, 97)) or "none listed", half_lives.get((43, 98)) or "none listed"),
        "Names are python3-periodictable's (periodictable/core.py, element_base) with American spelling: "
        "'Aluminum' and 'Cesium', where IUPAC recommends, and bodr spells, 'Aluminium' and 'Caesium'. "
        "Not respelled here. Symbols are checked to be the same in both packages.",
        "Covalent radii: periodictable/covalent_radius.py, table 'Cordero', transcribed from Cordero et al., "
        "Dalton Trans. 2008, 2832-2838 (doi:10.1039/b801115j), angstrom. The module docstring names this "
        "paper as the source. bodr's own bo:radiusCovalent values are not used.",
        "Cordero gives several radii for C (%s) and for Mn (%s), Fe (%s) and Co (%s). covalentRadius "
        "uses C sp3 and low-spin Mn, Fe and Co. Why: the library keeps the first row Cordero lists for "
        "each element and skips the alternates (covalent_radius.py docstring note 2, and its loader drops "
        "rows starting with '-'); sp3 is also the largest C value, so it does not miss single C-X bonds. "
        "All variants are kept in covalentRadiusVariants for callers that know the hybridisation or spin "
        "state; the low-spin radii are %s A shorter than the high-spin ones, so bond perception in "
        "high-spin complexes should use the highSpin value. Other libraries choose differently: "
        "QCElemental takes the larger, high-spin value for Mn, Fe and Co." % (
            describe("C"), describe("Mn"), describe("Fe"), describe("Co"),
            ", ".join("%.2f (%s)" % (radius_variants[s]["highSpin"] - radius_variants[s]["lowSpin"], s)
                      for s in ("Mn", "Fe", "Co"))),
        "Cordero's He, Ne, Pm, At, Rn and Fr radii are interpolated or based on at most one structure "
        "(paper and covalent_radius.py docstring note 3); treat them as estimates.",
    ]
    if missing:
        notes.append("No value for: %s; left null." % ", ".join(missing))
    else:
        notes.append("Every element Z = 1..%d has a weight (bodr) and a covalent radius (periodictable); "
                     "no value is null." % Z_MAX)

    bodr_licence = licence_from_copyright(BODR_COPYRIGHT)
    if xml_licence:
        bodr_licence += "; elements.xml's own metadata: dc:license '%s'" % xml_licence.group(1)
    if cc0:
        bodr_licence += ("; upstream README (and the release-10 changelog entry) say the data are now under "
                         "the Creative Commons Zero waiver")

    return {
        "origin": {
            "sources": [
                {
                    "use": "weight, weightUncertainty, weightKind",
                    "package": BODR_PACKAGE,
                    "version": dpkg_version(BODR_PACKAGE),
                    "upstream": "Blue Obelisk Data Repository, release %s (%s)" % (
                        table["release"], table["releaseDate"]),
                    "file": elements_xml,
                    "licence": bodr_licence,
                },
                {
                    "use": "z, symbol, name, covalentRadius, covalentRadiusVariants",
                    "package": PT_PACKAGE,
                    "version": dpkg_version(PT_PACKAGE),
                    "upstream": "periodictable %s (Paul Kienzle, NIST)" % periodictable.__version__,
                    "file": os.path.dirname(pt_covalent.__file__),
                    "licence": licence_from_copyright(PT_COPYRIGHT),
                },
            ],
            "weights": "IUPAC standard atomic weights, table of %d (%s), via bodr elements.xml bo:mass"
                       % (table["year"], table["report"]),
            "iupacWeightsTable": table["year"],
            "covalentRadii": "Cordero et al., Dalton Trans. 2008, 2832, via periodictable/covalent_radius.py",
            "units": {"weight": "u (g/mol)", "covalentRadius": "angstrom"},
            "generatedBy": "scripts/data/generate_elements.py",
            "notes": notes,
        },
        "covalentRadiusVariants": radius_variants,
        "elements": elements,
    }


def render(data):
    """Indented JSON with one element per line, so diffs stay readable."""
    head = {k: v for k, v in data.items() if k != "elements"}
    text = json.dumps(head, indent=2, ensure_ascii=False)
    rows = ",\n".join("    " + json.dumps(e, ensure_ascii=False) for e in data["elements"])
    return text[:-2] + ',\n  "elements": [\n' + rows + "\n  ]\n}\n"


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--check", action="store_true",
                        help="do not write; exit 1 if the committed file differs from a fresh build")
    parser.add_argument("--out", default=OUT_PATH, help="output path (default: %(default)s)")
    args = parser.parse_args()

    text = render(build())
    json.loads(text)  # sanity: the hand-joined output must still be valid JSON
    if args.check:
        try:
            with open(args.out, encoding="utf-8") as handle:
                current = handle.read()
        except OSError:
            current = None
        if current != text:
            sys.exit("%s is stale; rerun scripts/data/generate_elements.py" % args.out)
        print("%s is up to date" % args.out)
        return
    os.makedirs(os.path.dirname(args.out), exist_ok=True)
    with open(args.out, "w", encoding="utf-8") as handle:
        handle.write(text)
    print("wrote %s" % args.out)


if __name__ == "__main__":
    main()
