"""Runs one piece of Python inside Debian's psi4 (the `psi4 input output` binary) and returns the
JSON it writes. Shared by the fixture generators that need psi4; CI never runs them."""

import json
import os
import subprocess
import tempfile

PRELUDE = r'''
import builtins, json, base64
import numpy as np
psi4.set_memory("2 GB")
psi4.set_num_threads(1)
def _emit(payload):
    with builtins.open({result_path!r}, "w") as handle:
        json.dump(payload, handle)
'''


def run(body, name="job"):
    """`body` is Python run by psi4 after PRELUDE; it must call _emit(payload) once."""
    with tempfile.TemporaryDirectory() as workdir:
        stem = os.path.join(workdir, name)
        with open(stem + ".in", "w") as handle:
            handle.write(PRELUDE.format(result_path=stem + ".json") + body)
        env = dict(os.environ, PSI_SCRATCH=workdir, OMP_NUM_THREADS="1")
        subprocess.run(["psi4", stem + ".in", stem + ".out"], check=True, cwd=workdir, env=env, stdout=subprocess.DEVNULL)
        with open(stem + ".json") as handle:
            return json.load(handle)


def package_version(package):
    output = subprocess.run(["dpkg-query", "-W", "-f=${Version}", package], check=True, capture_output=True, text=True)
    return output.stdout.strip()


def psi4_origin(generated_by, note):
    version = subprocess.run(["psi4", "--version"], check=True, capture_output=True, text=True).stdout.strip()
    return {
        "program": "psi4 (Debian package psi4)",
        "programVersion": version,
        "packageVersion": package_version("psi4"),
        "basisPackageVersion": package_version("psi4-data"),
        "generatedBy": generated_by,
        "note": note,
    }


def molecule_block(atoms, charge, multiplicity):
    """psi4 geometry text in bohr, neither moved nor reoriented; atoms as (symbol, x, y, z)."""
    lines = ["%d %d" % (charge, multiplicity)]
    lines += ["%s %.12f %.12f %.12f" % atom for atom in atoms]
    lines += ["units bohr", "no_com", "no_reorient"]
    return "\n".join(lines)
