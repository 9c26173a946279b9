"""Run the full fuzz and kill sets and print their counts and times.

    python benchmarks/fuzz_full.py            # the full set (tens of minutes)
    python benchmarks/fuzz_full.py --fast     # the default run's subset

The counts come from tests/fuzzing.py: cases, clean refusals, ratings, tracebacks,
hangs and files modified (the last three must be 0); the kill test prints its own
line (kills, how many left the old or the new file, temporary files left).
"""
from __future__ import annotations

import json
import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent


def main(argv=None) -> int:
    fast = "--fast" in (argv if argv is not None else sys.argv[1:])
    with tempfile.TemporaryDirectory() as tmp:
        tally = Path(tmp) / "tally.json"
        env = dict(os.environ, EBULLIO_FUZZ_TALLY=str(tally))
        command = [sys.executable, "-m", "pytest", "-q", "-s", "-p", "no:cacheprovider",
                   "tests/test_fuzz.py", "tests/test_save_kill.py"]
        if not fast:
            command += ["-m", "fuzz_full"]
        t0 = time.perf_counter()
        proc = subprocess.run(command, cwd=ROOT, env=env, capture_output=True, text=True)
        wall = time.perf_counter() - t0
        for line in proc.stdout.splitlines():
            if "kill test:" in line:
                print(line[line.index("kill test:"):])
            elif " passed" in line or " failed" in line:
                print(line.strip(". "))
        counts = json.loads(tally.read_text()) if tally.exists() else {}
    print(f"fuzz ({'fast subset' if fast else 'full set'}): "
          f"{counts.get('cases', 0)} cases, {counts.get('refused', 0)} clean refusals, "
          f"{counts.get('rated', 0)} ratings, {counts.get('traceback', 0)} tracebacks, "
          f"{counts.get('hang', 0)} hangs, {counts.get('modified', 0)} files modified; "
          f"{counts.get('seconds', 0.0):.0f} s in the cases, {wall:.0f} s in all")
    if proc.returncode:
        print(proc.stdout[-4000:], proc.stderr[-2000:], sep="\n")
    return proc.returncode


if __name__ == "__main__":
    sys.exit(main())
