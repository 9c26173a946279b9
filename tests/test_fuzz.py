"""Fuzzing: broken project files through load, validate, rate and the command line.

Hypothesis sets numeric fields of the samples (one to three at a time) to extreme,
non-finite, huge, tiny, negative, textual or slightly scaled values; hand-made classes
of broken files cover the rest (deep nesting, long integers, truncation, encodings,
duplicate keys, lone surrogates, no cases). Each case must end in a clean refusal
(exit 2, one line naming the problem) or a rating (exit 0 or 1), with the file and its
folder untouched, within the time allowed (see tests/fuzzing.py).

The default run keeps a fast subset; ``python -m pytest -m fuzz_full tests/test_fuzz.py``
or ``python benchmarks/fuzz_full.py`` (which prints the counts) runs the full set.
"""
import json
import os

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import fuzzing as fz

FAST_EXAMPLES = 150
FULL_EXAMPLES = 1000

_SETTINGS = dict(deadline=None, database=None,
                 suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])


def _scaled(original):
    """A value near the original (most of these rate): exercises the engine, not the checks."""
    if isinstance(original, (int, float)) and not isinstance(original, bool) and original:
        return st.floats(0.3, 3.0).map(lambda f: type(original)(original * f)
                                       if isinstance(original, float) else max(1, round(original * f)))
    return st.sampled_from(fz.EXTREMES)


@st.composite
def broken_files(draw):
    """(description, bytes) of a sample with one to three fields changed."""
    sample = draw(st.sampled_from(fz.SAMPLE_FILES))
    fields = [p for f, p in fz.FIELDS if f == sample]
    data = fz.sample_data(sample)
    changes = []
    for path in draw(st.lists(st.sampled_from(fields), min_size=1, max_size=3, unique=True)):
        node = data
        for key in path[:-1]:
            node = node[key]
        original = node[path[-1]]
        value = draw(st.one_of(
            st.sampled_from(fz.EXTREMES),
            st.floats(allow_nan=True, allow_infinity=True),
            st.integers(-10 ** 25, 10 ** 25),
            st.text(max_size=6),
            _scaled(original), _scaled(original)))
        node[path[-1]] = value
        changes.append(f"{'.'.join(map(str, path))}={value!r}")
    return f"{sample.name}: " + ", ".join(changes), fz.encode(data)


OPTIONS = st.sampled_from([[], ["--json"], ["--csv", "@out"], ["--json", "--csv", "@out"]])


def _run(tmp_path_factory, content: bytes, options, increments, limit):
    folder = tmp_path_factory.mktemp("in")
    target = folder / "project.ebullio"
    target.write_bytes(content)
    out = tmp_path_factory.mktemp("out")
    argv = [str(out) if o == "@out" else o for o in options]
    if increments is not None:
        argv += ["--increments", str(increments)]
    outcome = fz.run_case(target, argv, limit=limit)
    fz.assert_clean(outcome)
    return outcome


@settings(max_examples=FAST_EXAMPLES, derandomize=True, **_SETTINGS)
@given(case=broken_files(), options=OPTIONS)
def test_fuzz_numeric_fields_fast(tmp_path_factory, case, options):
    _run(tmp_path_factory, case[1], options, increments=10, limit=60)


@pytest.mark.parametrize("name", sorted(fz.handmade()))
def test_handmade_broken_files(name, tmp_path_factory):
    outcome = _run(tmp_path_factory, fz.handmade()[name], [], increments=10, limit=60)
    if name.startswith(("deep-", "long-integer", "truncated", "literal", "duplicate")) \
            or name in ("empty", "no-cases", "binary", "utf-16", "latin-1"):
        assert outcome["result"] == "refused", outcome


# --- the full set ----------------------------------------------------------------------

@pytest.mark.fuzz_full
@settings(max_examples=FULL_EXAMPLES, **_SETTINGS)
@given(case=broken_files(), options=OPTIONS,
       increments=st.one_of(st.none(), st.integers(10, 60)))
def test_fuzz_numeric_fields_full(tmp_path_factory, case, options, increments):
    _run(tmp_path_factory, case[1], options, increments=increments, limit=300)


#: Every numeric or null field of every sample set to each of these, one at a time.
SWEEP_VALUES = (1e308, -1e308, 5e-324, float("nan"), 10 ** 19)


@pytest.mark.fuzz_full
@pytest.mark.parametrize("value", SWEEP_VALUES, ids=repr)
def test_every_field_at_the_extremes(value, tmp_path_factory):
    for sample, path in fz.FIELDS:
        content = fz.encode(fz.mutated(sample, path, value))
        _run(tmp_path_factory, content, [], increments=10, limit=300)


@pytest.fixture(scope="module", autouse=True)
def _report_tally():
    """Write the counts where benchmarks/fuzz_full.py asks for them."""
    yield
    where = os.environ.get("EBULLIO_FUZZ_TALLY")
    if where:
        with open(where, "w", encoding="utf-8") as fh:
            json.dump(dict(fz.TALLY), fh)
