"""The catalogue of inputs and results: complete, consistent with validation, and usable
for drafts, changes by path and plausibility warnings."""
from __future__ import annotations

import dataclasses
import glob
import math
from pathlib import Path

import pytest

import rating
from rating import catalogue as cat
from rating.case import Case
from rating.errors import InputError

SAMPLES = sorted(glob.glob(str(Path(__file__).parents[1] / "samples" / "*.ebullio")))


def _sample_cases():
    return [c for path in SAMPLES for c in rating.load_project(path).cases]


def _paths(cls, prefix=""):
    """Every leaf field path of a case dataclass."""
    out = []
    for f in dataclasses.fields(cls):
        part = cat.PARTS.get(prefix + f.name)
        if part is not None:
            out += _paths(part, prefix + f.name + ".")
        else:
            out.append(prefix + f.name)
    return out


def test_every_case_field_is_described_once():
    described = [f.path for f in cat.INPUTS]
    assert len(described) == len(set(described)), "a path described twice"
    missing = set(_paths(Case)) - set(described) - set(cat.PARTS)
    assert not missing, f"case fields without a catalogue entry: {sorted(missing)}"
    unknown = set(described) - set(_paths(Case))
    assert not unknown, f"catalogue entries that are no case field: {sorted(unknown)}"


def test_every_field_has_a_label_unit_group_and_known_quantity():
    groups = {g for g, _ in cat.GROUPS}
    for f in cat.INPUTS:
        assert f.label and f.group in groups and f.quantity in cat.QUANTITIES, f.path
        assert set(f.types) <= set(rating.case.EXCHANGER_TYPES), f.path
        if f.kind in ("number", "integer") and f.usual is not None and f.hard is not None:
            lo, hi = f.hard
            assert (lo is None or f.usual[0] >= lo) and (hi is None or f.usual[1] <= hi), f.path


@pytest.fixture(scope="module")
def sample_results():
    return [(c, rating.rate(c)) for c in _sample_cases()]


def test_every_result_key_of_every_sample_is_described(sample_results):
    for case, result in sample_results:
        missing = set(result.summary) - set(cat.SUMMARY)
        assert not missing, f"{case.name}: summary keys not in the catalogue: {sorted(missing)}"
        missing = set(result.profiles) - set(cat.PROFILES)
        assert not missing, f"{case.name}: profile keys not in the catalogue: {sorted(missing)}"
        for key in result.summary:
            assert case.type in cat.SUMMARY[key].types, (case.type, key)


def test_samples_are_free_of_draft_problems():
    for case in _sample_cases():
        problems = cat.draft_problems(cat.case_to_draft(case))
        assert [p for p in problems if p.severity == "error"] == [], case.name


def _bounded_paths():
    """Numeric fields with a hard lower bound that some sample case uses."""
    drafts = [cat.case_to_draft(c) for c in _sample_cases()]
    return [f.path for f in cat.INPUTS
            if f.kind in ("number", "integer") and f.hard and f.hard[0] is not None
            and "." in f.path and f.group != "limits"
            and any(cat.applies(f, d) and cat.get_value(d, f.part) is not None for d in drafts)]


@pytest.mark.parametrize("path", _bounded_paths())
def test_hard_lower_bound_agrees_with_the_constructors(path):
    """A value just below a field's hard range is refused both by the draft check and by
    building the case (the dataclass rules), naming the same field."""
    f = cat.input_field(path)
    case = next(c for c in _sample_cases() if getattr(c, f.part) is not None
                and cat.applies(f, cat.case_to_draft(c)))
    lo = f.hard[0]
    bad = lo - 1 if f.kind == "integer" else (lo - max(abs(lo) * 0.01, 1e-6))
    draft = cat.set_value(cat.case_to_draft(case), path, bad)
    assert any(p.path == path and p.severity == "error" for p in cat.draft_problems(draft)), path
    with pytest.raises(InputError):
        cat.draft_to_case(draft)


def test_draft_reports_every_problem_at_once():
    case = _sample_cases()[0]
    draft = cat.case_to_draft(case)
    draft = cat.set_value(draft, "tubes.length", -2.0)
    draft = cat.set_value(draft, "boiling.inlet_pressure", "three bar")
    draft = cat.set_value(draft, "heating.fouling_resistance", math.inf)
    paths = {p.path for p in cat.draft_problems(draft) if p.severity == "error"}
    assert {"tubes.length", "boiling.inlet_pressure", "heating.fouling_resistance"} <= paths


def test_with_value_changes_one_field_and_validates():
    case = _sample_cases()[0]
    longer = cat.with_value(case, "tubes.length", case.tubes.length + 1.0)
    assert longer.tubes.length == pytest.approx(case.tubes.length + 1.0)
    assert longer.tubes.outer_diameter == case.tubes.outer_diameter
    assert case.tubes.length != longer.tubes.length  # the original is untouched
    with pytest.raises(InputError) as err:
        cat.with_value(case, "tubes.length", -1.0)
    assert "tubes.length" in str(err.value)
    with pytest.raises(KeyError):
        cat.with_value(case, "tubes.lenght", 3.0)


@pytest.mark.parametrize("path, value", [
    ("thermosiphon.inlet_line_diameter", 254.0),   # 254 mm typed as metres
    ("tubes.length", 4000.0),                       # mm typed as metres
])
def test_absurd_values_are_refused_when_the_case_is_built(path, value):
    case = next(c for c in _sample_cases() if cat.applies(path, cat.case_to_draft(c)))
    with pytest.raises(InputError) as err:
        cat.with_value(case, path, value)
    assert path in str(err.value)


def test_kettle_diameter_of_1e308_is_refused_naming_the_field():
    case = next(c for c in _sample_cases() if c.type == "kettle")
    with pytest.raises(InputError) as err:
        cat.with_value(case, "kettle.kettle_diameter", 1e308)
    assert "kettle.kettle_diameter" in str(err.value)


def test_unusual_value_rates_with_a_warning_naming_field_and_range():
    """A hydrocarbon feed at 62 K (degC typed as K) or a 0.2 m pass never rates quietly."""
    case = next(c for c in _sample_cases() if c.type == "evaporator")
    short = cat.with_value(case, "tubes.length", 0.2)
    result = rating.rate(short)
    found = [w for w in result.warnings if w.code == "input-outside-usual-range"]
    assert found and "Heated length per pass" in found[0].message and "0.5" in found[0].message
    assert result.status != "ok"
    draft = cat.set_value(cat.case_to_draft(case), "boiling.inlet_temperature", 62.0)
    problems = [p for p in cat.draft_problems(draft) if p.path == "boiling.inlet_temperature"]
    assert problems, "62 K passed without a word"


def test_method_choices_are_registered_methods_of_the_family():
    from rating.correlations import registry

    case = _sample_cases()[0]
    draft = cat.case_to_draft(case)
    for f in cat.INPUTS:
        if f.group != "methods":
            continue
        family = f.name
        names = [n for n, _t, _r in cat.method_choices(f.path, draft)]
        registered = {m.name for m in registry.methods(family)} | {"auto"}
        assert names and set(names) <= registered, f.path
        assert getattr(case.methods, family) in names, f.path


def test_numeric_paths_are_numbers_of_the_type():
    for kind in rating.case.EXCHANGER_TYPES:
        for path in cat.numeric_paths(kind):
            f = cat.input_field(path)
            assert f.kind in ("number", "integer") and kind in f.types
    assert "thermosiphon.liquid_level" in cat.numeric_paths("thermosiphon")
    assert "thermosiphon.liquid_level" not in cat.numeric_paths("evaporator")


def test_every_offered_method_choice_is_accepted_for_every_sample():
    """The desktop offers only what the engine accepts: each choice builds a valid case."""
    for case in _sample_cases():
        draft = cat.case_to_draft(case)
        for f in cat.INPUTS:
            if f.kind != "choice" or f.choices is not None or not cat.applies(f, draft):
                continue
            for name, _title, _reference in cat.method_choices(f.path, draft):
                cat.with_value(case, f.path, name)  # raises InputError if refused
