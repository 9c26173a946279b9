"""Saving a project: killed at random moments, the target is always the old or the new
file, and the next save leaves no temporary file behind; what a save refuses and keeps.

The kill test saves a large project (about 5 MB: a hundred cases and long notes)
in a child process and sends SIGKILL at a random moment of the save; a handful of kills
in the default run, 120 in the full set (``-m fuzz_full``).
"""
import dataclasses
import json
import os
import pickle
import random
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

import rating
from rating import project as pf
from rating.errors import ProjectFileError

ROOT = Path(__file__).parent.parent
SAMPLE = ROOT / "samples" / "hot-oil-vaporiser.ebullio"

CHILD = """
import pickle, sys
sys.path.insert(0, sys.argv[1])
from rating.project import save_project
project = pickle.loads(open(sys.argv[2], "rb").read())
print("ready", flush=True)
save_project(project, sys.argv[3])
print("saved", flush=True)
sys.stdin.read()          # wait to be killed
"""


@pytest.fixture(scope="module")
def versions(tmp_path_factory):
    """Two versions of a large project (pickled for a quick start of the child), the
    bytes each saves to, and how long a save takes here."""
    folder = tmp_path_factory.mktemp("versions")
    data = json.loads(SAMPLE.read_text())
    data["cases"] = [dict(data["cases"][i % 2], name=f"case {i}") for i in range(100)]
    old = pf.from_dict(data)
    old = dataclasses.replace(old, notes="Site survey log. " * 250_000)   # 4.25 MB of text
    new = dataclasses.replace(old, title="Revised", revision=2, cases=old.cases[::-1])
    out = {}
    for name, p in (("old", old), ("new", new)):
        out[name] = folder / f"{name}.pickle"
        out[name].write_bytes(pickle.dumps(p))
        out[name + "_bytes"] = pf.dumps(p).encode()
    t0 = time.perf_counter()
    pf.save_project(new, folder / "timing.ebullio")
    out["seconds"] = time.perf_counter() - t0
    return out


def _leftovers(folder: Path, target: Path) -> list[str]:
    return sorted(n for n in os.listdir(folder) if n != target.name)


def _kill_during_saves(versions, folder: Path, kills: int, seed: int) -> dict:
    target = folder / "plant.ebullio"
    target.write_bytes(versions["old_bytes"])
    # A temporary file of the former naming scheme: removed by the first save.
    legacy = folder / f".{target.name}.k3x9_a1b.tmp"
    legacy.write_bytes(b"{")
    saving = os.path.basename(pf.saving_name(target))
    allowed = {legacy.name, saving}
    rnd = random.Random(seed)
    current = "old"
    counts = {"kills": 0, "old": 0, "new": 0, "temporary_left": 0, "completed": 0}
    for i in range(kills):
        nxt = "new" if current == "old" else "old"
        child = subprocess.Popen([sys.executable, "-c", CHILD, str(ROOT), str(versions[nxt]),
                                  str(target)], stdin=subprocess.PIPE, stdout=subprocess.PIPE)
        assert child.stdout.readline().strip() == b"ready"
        time.sleep(rnd.uniform(0.0, 1.3 * versions["seconds"]))
        child.send_signal(signal.SIGKILL)
        child.wait()
        counts["kills"] += 1
        body = target.read_bytes()
        assert body in (versions["old_bytes"], versions["new_bytes"]), f"kill {i}: torn file"
        state = "old" if body == versions["old_bytes"] else "new"
        assert state in (current, nxt)
        counts[state] += 1
        counts["completed"] += state == nxt
        left = _leftovers(folder, target)
        assert set(left) <= allowed, left            # never a second temporary name
        counts["temporary_left"] += saving in left
        current = state
    back = rating.load_project(target)          # the survivor loads as a whole project
    assert pf.dumps(back).encode() in (versions["old_bytes"], versions["new_bytes"])
    pf.save_project(pickle.loads(versions["old"].read_bytes()), target)
    assert _leftovers(folder, target) == []     # the next save removed what was left
    return counts


def test_kills_during_saves_leave_old_or_new(versions, tmp_path):
    counts = _kill_during_saves(versions, tmp_path, kills=4, seed=11)
    assert counts["kills"] == 4


@pytest.mark.fuzz_full
def test_kills_during_saves_full(versions, tmp_path):
    counts = _kill_during_saves(versions, tmp_path, kills=120, seed=2026)
    print("kill test:", counts)
    # Both outcomes and left temporaries occurred, so the moments did fall inside saves.
    assert counts["old"] and counts["new"] and counts["temporary_left"]


# --- what a save refuses and keeps -------------------------------------------------------

def test_a_stale_temporary_file_is_removed_by_the_next_save(tmp_path):
    project = rating.load_project(SAMPLE)
    target = tmp_path / "p.ebullio"
    stale = tmp_path / ".p.ebullio.ebullio-saving"
    stale.write_bytes(b"half a file")
    older = tmp_path / ".p.ebullio.a1b2c3d4.tmp"       # left by versions before 0.2
    older.write_bytes(b"half")
    unrelated = tmp_path / ".q.ebullio.a1b2c3d4.tmp"   # another file's: left alone
    unrelated.write_bytes(b"other")
    rating.save_project(project, target)
    assert sorted(os.listdir(tmp_path)) == [unrelated.name, target.name]
    assert rating.load_project(target) == project


def test_a_lone_surrogate_in_the_text_is_saved_and_read_back(tmp_path):
    # "\ud800" is valid JSON text but cannot be encoded as UTF-8 directly.
    data = json.loads(SAMPLE.read_text())
    data["notes"] = "pump \\ud800 tag"
    data["cases"][0]["name"] = "E-40 \\udfff"
    source = tmp_path / "in.ebullio"
    source.write_text(json.dumps(data).replace("\\\\u", "\\u"), encoding="utf-8")
    project = rating.load_project(source)
    assert project.notes == "pump \ud800 tag"
    target = tmp_path / "out.ebullio"
    rating.save_project(project, target)
    assert rating.load_project(target) == project


def test_save_refuses_what_is_not_a_project_and_keeps_the_file(tmp_path):
    target = tmp_path / "p.ebullio"
    target.write_bytes(SAMPLE.read_bytes())
    for wrong in ("a string", None, {"cases": []}, rating.load_project(SAMPLE).cases[0]):
        with pytest.raises(TypeError, match="Project"):
            rating.save_project(wrong, target)
    assert target.read_bytes() == SAMPLE.read_bytes()
    assert os.listdir(tmp_path) == [target.name]


def test_a_failed_save_leaves_nothing_behind(tmp_path):
    project = rating.load_project(SAMPLE)
    with pytest.raises(ProjectFileError, match="could not be saved"):
        rating.save_project(project, tmp_path / "no-such-folder" / "p.ebullio")
    assert os.listdir(tmp_path) == []
