"""Broken project files and options run through load, validate, rate and the command.

The helpers of tests/test_fuzz.py and benchmarks/fuzz_full.py. Every case ends in one
of these outcomes, counted in ``TALLY``:

- ``refused``: the loader raised a RatingError and the command gave exit 2 with one
  line on stderr (no traceback);
- ``rated``: the command rated and gave exit 0 or 1;
- ``traceback``: any other exception, exit status or stderr (must stay 0);
- ``hang``: no answer within the time allowed (must stay 0);
- ``modified``: the input file changed or a file appeared beside it (must stay 0).
"""
from __future__ import annotations

import collections
import contextlib
import io
import json
import math
import os
import re
import signal
import time
from pathlib import Path

import rating
from rating import cli

SAMPLES = Path(__file__).parent.parent / "samples"
SAMPLE_FILES = tuple(sorted(SAMPLES.glob("*.ebullio")))

#: Counts of outcomes (and the seconds spent), for the report of the full run.
TALLY: collections.Counter = collections.Counter()

#: Values a careless or hostile edit puts into a numeric field.
EXTREMES = (float("nan"), float("inf"), -float("inf"), 1e308, -1e308, 1.7976931348623157e308,
            5e-324, -5e-324, 1e-300, 0, 0.0, -0.0, -1.0, 10 ** 18, -(10 ** 18), 10 ** 19,
            10 ** 400, "12", "", "NaN", True, False, None, [], {}, [1.0, 2.0], {"value": 1.0})


def leaves(data, path=()):
    """(path, value) of every number and null in a JSON tree: the fields to mutate."""
    if isinstance(data, dict):
        for key, value in data.items():
            yield from leaves(value, path + (key,))
    elif isinstance(data, list):
        for i, value in enumerate(data):
            yield from leaves(value, path + (i,))
    elif data is None or (isinstance(data, (int, float)) and not isinstance(data, bool)):
        yield path, data


def sample_data(path: Path) -> dict:
    return json.loads(path.read_text(encoding="utf-8"))


#: Every numeric or null field of every sample: (sample file, path into its data).
FIELDS = tuple((f, p) for f in SAMPLE_FILES for p, _ in leaves(sample_data(f)))


def mutated(sample: Path, path, value) -> dict:
    data = sample_data(sample)
    node = data
    for key in path[:-1]:
        node = node[key]
    node[path[-1]] = value
    return data


def encode(data) -> bytes:
    """JSON text as an editor might leave it (NaN and Infinity literals allowed)."""
    return (json.dumps(data, indent=2, allow_nan=True) + "\n").encode("utf-8")


class Hang(BaseException):
    """Raised by the alarm; a BaseException so that no handler of the code under test
    takes it for an error of its own."""


@contextlib.contextmanager
def time_limit(seconds: float):
    """Raise Hang in the main thread after ``seconds`` (where the system has alarms)."""
    if not hasattr(signal, "SIGALRM"):
        yield
        return

    def ring(signum, frame):
        raise Hang()

    old = signal.signal(signal.SIGALRM, ring)
    signal.setitimer(signal.ITIMER_REAL, seconds)
    try:
        yield
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, old)


def _snapshot(folder: Path, target: Path):
    names = sorted(os.listdir(folder))
    content = target.read_bytes() if target.is_file() and not target.is_symlink() else None
    return names, content


def _call_cli(argv):
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        try:
            code = cli.main([str(a) for a in argv])
        except SystemExit as exc:  # argparse's own exits (usage errors, --help)
            code = exc.code
    return code, out.getvalue(), err.getvalue()


def run_case(target: Path, options=(), *, limit: float = 120.0, load=True) -> dict:
    """One case: load and validate ``target`` through the API, then the command with
    ``options``. Returns the outcome and its details; adds it to ``TALLY``."""
    folder = target.parent
    before = _snapshot(folder, target)
    outcome = {"file": str(target), "options": [str(o) for o in options]}
    t0 = time.perf_counter()
    try:
        with time_limit(limit):
            if load:
                try:
                    rating.load_project(target)
                    outcome["loaded"] = True
                except rating.RatingError as exc:
                    outcome["loaded"] = False
                    outcome["load_message"] = str(exc)
            code, out, err = _call_cli([target, *options])
    except Hang:
        outcome["result"] = "hang"
    except BaseException as exc:  # noqa: BLE001 - exactly what the suite must never see
        outcome["result"] = "traceback"
        outcome["error"] = f"{type(exc).__name__}: {exc}"[:500]
    else:
        outcome.update(code=code, stderr=err[:1000])
        lines = err.strip().splitlines()
        if "Traceback" in err or code not in (0, 1, 2):
            outcome["result"] = "traceback"
        elif code == 2:
            one_line = len(lines) == 1 and out == ""
            agrees = not load or outcome["loaded"] is False or options
            outcome["result"] = "refused" if one_line and agrees else "traceback"
        else:
            outcome["result"] = "rated" if (out and not err) else "traceback"
    outcome["seconds"] = time.perf_counter() - t0
    if _snapshot(folder, target) != before:
        outcome["result"] = "modified"
    TALLY["cases"] += 1
    TALLY[outcome["result"]] += 1
    TALLY["seconds"] += outcome["seconds"]
    return outcome


def assert_clean(outcome: dict) -> None:
    assert outcome["result"] in ("refused", "rated"), outcome


# --- hand-made classes of broken files ---------------------------------------------------

def _deep(depth: int) -> bytes:
    """The first sample with its notes nested ``depth`` objects deep."""
    text = json.dumps({**sample_data(SAMPLE_FILES[0]), "notes": "@@"})
    return text.replace('"@@"', '{"a": ' * depth + "1" + "}" * depth).encode()


def _set_text(sample: Path, key: str, text: str) -> bytes:
    """The sample with the first value of ``key`` replaced by the raw JSON ``text``."""
    old = sample.read_text(encoding="utf-8")
    new, n = re.subn(rf'"{key}": [^,\n}}]+', lambda m: f'"{key}": {text}', old, count=1)
    assert n == 1, key
    return new.encode("utf-8")


def _with_text(sample: Path, old: str, new: str) -> bytes:
    text = sample.read_text(encoding="utf-8")
    assert old in text, old
    return text.replace(old, new, 1).encode("utf-8")


def handmade() -> dict[str, bytes]:
    """Broken files by class: name -> bytes."""
    base = SAMPLE_FILES[0]
    raw = base.read_bytes()
    data = sample_data(base)
    out = {}
    for depth in (5, 31, 33, 100, 900, 1000, 5000, 100_000):
        out[f"deep-lists-{depth}"] = b"[" * depth + b"]" * depth
        out[f"deep-in-notes-{depth}"] = _deep(depth)
        out[f"deep-in-case-{depth}"] = _set_text(base, "fouling_resistance",
                                                 "[" * depth + "]" * depth)
    for digits in (19, 400, 4300, 4301, 5000, 100_000):
        number = "9" * digits
        out[f"long-integer-schema-{digits}"] = _set_text(base, "schema_version", number)
        out[f"long-integer-count-{digits}"] = _set_text(base, "count", number)
        out[f"long-integer-length-{digits}"] = _set_text(base, "length", "-" + number)
        out[f"long-float-{digits}"] = _set_text(base, "length", "0." + number)
    for exponent in ("1e308", "-1e308", "1e309", "1e-400", "1e99999"):
        out[f"exponent-{exponent}"] = _set_text(base, "length", exponent)
    for literal in ("NaN", "Infinity", "-Infinity"):
        out[f"literal-{literal}"] = _set_text(base, "length", literal)
    for fraction in (0.0, 0.1, 0.25, 0.5, 0.75, 0.9, 0.99):
        out[f"truncated-{fraction}"] = raw[: int(len(raw) * fraction)]
    out["empty"] = b""
    out["blank"] = b" \n\t\n"
    out["null"] = b"null"
    out["list"] = b"[]"
    out["object"] = b"{}"
    out["number"] = b"1e308"
    out["binary"] = bytes(range(256)) * 8
    out["utf-16"] = raw.decode().encode("utf-16")
    out["bom"] = b"\xef\xbb\xbf" + raw
    out["latin-1"] = _with_text(base, '"name": "', '"name": "Kühler ').decode().encode("latin-1")
    out["duplicate-key"] = _with_text(base, '"cases": [', '"cases": [], "cases": [')
    out["no-cases"] = encode({**data, "cases": []})
    out["newer-schema"] = encode({**data, "schema_version": 99})
    out["cases-not-list"] = encode({**data, "cases": {"a": 1}})
    out["case-not-object"] = encode({**data, "cases": [1, "two", None]})
    out["unknown-key"] = encode({**data, "colour": "blue"})
    out["lone-surrogate-name"] = _with_text(base, '"name": "', '"name": "\\ud800 ')
    out["lone-surrogate-key"] = _with_text(base, '"name": ', '"\\udfff": 1, "name": ')
    out["control-characters"] = _with_text(base, '"name": "', '"name": "\\u0000\\u001b[2J')
    out["long-name"] = _with_text(base, '"name": "', '"name": "' + "N" * 5000)
    out["path-name"] = _with_text(base, '"name": "', '"name": "../../etc/passwd ')
    return out


def two_cases_alike(names) -> bytes:
    """A project whose cases carry ``names`` (which may sanitise to one file name)."""
    data = sample_data(SAMPLES / "pentane-vaporiser.ebullio")
    case = data["cases"][0]
    data["cases"] = [dict(case, name=n) for n in names]
    return encode(data)
