"""A case is built from plain values: no property library until it is validated (issue 15).

Every sample case is built in a fresh interpreter in which importing CoolProp raises
(an import hook in front of sys.meta_path); validation, which needs the properties,
is what first imports it there.
"""
import json
import subprocess
import sys
from pathlib import Path

import rating

ROOT = Path(__file__).resolve().parents[1]

BLOCK = """
import glob, json, sys

class NoCoolProp:
    def find_spec(self, name, path=None, target=None):
        if name.split(".")[0] == "CoolProp":
            raise ImportError("CoolProp imported while cases are built")
        return None

sys.meta_path.insert(0, NoCoolProp())
from rating.project import from_dict

cases = []
for path in sorted(glob.glob("samples/*.ebullio")):
    with open(path, encoding="utf-8") as f:
        cases += from_dict(json.load(f), validate=False).cases
assert not [m for m in sys.modules if m.split(".")[0] == "CoolProp"]
print(json.dumps([c.name for c in cases]))
"""


def run(code):
    return subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True,
                          text=True, timeout=300)


def test_every_sample_case_builds_without_the_property_library():
    done = run(BLOCK)
    assert done.returncode == 0, done.stderr
    built = json.loads(done.stdout)
    loaded = [c.name for p in sorted((ROOT / "samples").glob("*.ebullio"))
              for c in rating.load_project(p).cases]
    assert built == loaded and len(built) >= 10


def test_validation_is_where_the_properties_come_in():
    # the same blocked interpreter refuses to validate: the hook does block the library
    done = run(BLOCK + "\nfrom rating.validation import validate\nvalidate(cases[0])\n")
    assert done.returncode != 0 and "CoolProp imported while cases are built" in done.stderr
