#!/usr/bin/python3
"""Cross-check `tessera export --to qcschema-input` with QCElemental itself (not run in CI).

The tests validate every exported record against the JSON schema QCElemental publishes
(tests/fixtures/qcschema-input.schema.json). This script goes one step further by hand: it exports
every clean sample with the built CLI (dist/cli.js, `npm run build` first) and builds each record
with `qcelemental.models.AtomicInput(**record)`, which also runs QCElemental's own validators
(molecule consistency, fragment checks, basis-set atom maps). It prints one line per sample and
exits 1 when a record is refused.

    /usr/bin/python3 scripts/data/check_qcschema_input_export.py
"""

import json
import os
import subprocess
import sys

from qcelemental.models import AtomicInput

REPO_ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))


def samples():
    for folder, _, files in os.walk(os.path.join(REPO_ROOT, "samples")):
        for name in sorted(files):
            if name.endswith(".tess") and name != "mistakes.tess":
                yield os.path.relpath(os.path.join(folder, name), REPO_ROOT)


def main():
    failed = False
    for sample in sorted(samples()):
        out = subprocess.run(["node", "dist/cli.js", "export", sample, "--to", "qcschema-input"],
                             cwd=REPO_ROOT, capture_output=True, text=True)
        if out.returncode != 0:
            print("%s: export failed (%d): %s" % (sample, out.returncode, out.stderr.strip()))
            failed = True
            continue
        records = json.loads(out.stdout)["records"]
        for record in records:
            try:
                AtomicInput(**record)
            except Exception as exc:  # noqa: BLE001 - report any refusal
                print("%s: record %s refused: %s" % (sample, record.get("id"), exc))
                failed = True
        print("%s: %d records accepted by qcelemental.models.AtomicInput" % (sample, len(records)))
    sys.exit(1 if failed else 0)


if __name__ == "__main__":
    main()
