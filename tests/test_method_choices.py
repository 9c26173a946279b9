"""Every method choice that validation accepts rates; every other one is refused.

Each registry record declares what it needs (its required arguments) and, where it
matters, the tube orientations and fluids it was published for;
``registry.applicable`` derives from them which choices a rating of each exchanger
type can feed. These tests hold the engine to that declaration: a declared choice
rates without an exception on a case of that type, a choice that is not declared
for it is refused when the case is built, naming the field and the usable choices.
The cases are the bundled samples (invented numbers) with 10 increments.
"""
import dataclasses
from pathlib import Path

import pytest

import rating
from rating.case import Case, Tubes
from rating.correlations import registry
from rating.errors import InputError
from rating.validation import validate
from rating.properties import make_fluid

SAMPLES = Path(__file__).parent.parent / "samples"

#: One case per exchanger type and tube orientation, from the samples.
CASES = {
    ("evaporator", "vertical"): ("pentane-vaporiser.ebullio", 0),
    ("evaporator", "horizontal"): ("chiller-evaporator.ebullio", 0),
    ("thermosiphon", "vertical"): ("stripper-reboiler.ebullio", 0),
    ("kettle", "horizontal"): ("harrow-creek-kettles.ebullio", 0),
}


def base_case(kind):
    name, index = CASES[kind]
    return dataclasses.replace(rating.load_project(SAMPLES / name).cases[index], increments=10)


def choices():
    for (case_type, orientation) in CASES:
        heating = base_case((case_type, orientation)).heating.kind
        for family in registry.families_evaluated(case_type, heating):
            for method in registry.methods(family):
                yield case_type, orientation, family, method.name


#: Where a family's choice is set when it is not ``methods.<family>``.
CHOICE_PATHS = {"bundle_chf": "kettle.bundle_max_flux"}


def with_method(case, family, name):
    part, _, attr = CHOICE_PATHS.get(family, f"methods.{family}").partition(".")
    return dataclasses.replace(case, **{part: dataclasses.replace(getattr(case, part),
                                                                  **{attr: name})})


@pytest.mark.parametrize("case_type, orientation, family, name", list(choices()))
def test_a_declared_choice_rates_and_any_other_is_refused(case_type, orientation, family, name):
    case = base_case((case_type, orientation))
    cas = make_fluid(case.boiling.fluid).cas
    usable = [m.name for m in registry.applicable(family, case_type, orientation, cas)]
    if name in usable:
        result = rating.rate(with_method(case, family, name))
        assert "could not be rated" not in result.message, result.message
        assert result.status in ("ok", "warnings"), (result.status, result.message)
        used = {(m.family, m.name) for m in result.methods}
        assert (family, name) in used
    else:
        with pytest.raises(InputError) as err:   # refused before any rating
            validate(with_method(case, family, name))
        assert err.value.field == CHOICE_PATHS.get(family, f"methods.{family}")
        message = str(err.value)
        assert name in message and all(u in message for u in usable), message


def test_every_type_offers_a_choice_in_each_family_it_evaluates():
    for (case_type, orientation) in CASES:
        cas = make_fluid(base_case((case_type, orientation)).boiling.fluid).cas
        for family in registry.families_evaluated(case_type):
            assert registry.applicable(family, case_type, orientation, cas), (case_type, family)


def test_declarations_that_decide():
    # Published scope (each method's own paper): Steiner-Taborek 1992 is for vertical
    # tubes, Steiner 1993 is the horizontal form of Rouhani-Axelsson, the 2006 look-up
    # table is for water; Forster-Zuber is a wall-superheat form (dT_sat, dp_sat),
    # which a tube march does not evaluate at a given flux.
    names = lambda *a: [m.name for m in registry.applicable(*a)]  # noqa: E731
    water, pentane = "7732-18-5", "109-66-0"
    assert "steiner_taborek_1992" not in names("flow_boiling", "evaporator", "horizontal")
    assert "steiner_taborek_1992" in names("flow_boiling", "evaporator", "vertical")
    assert "steiner_1993" not in names("void_fraction", "thermosiphon", "vertical")
    assert "groeneveld_2006" in names("tube_dryout", "evaporator", "vertical", water)
    assert "groeneveld_2006" not in names("tube_dryout", "evaporator", "vertical", pentane)
    assert "forster_zuber_1955" not in names("nucleate_boiling", "evaporator", "vertical")
    assert "forster_zuber_1955" in names("nucleate_boiling", "kettle", "horizontal")
    assert names("flow_boiling", "kettle", "horizontal") == []


def test_an_unexpected_exception_becomes_a_failed_result_naming_case_and_methods(monkeypatch):
    case = base_case(("evaporator", "vertical"))
    method = registry.get(case.methods.void_fraction)

    def broken(*args, **kwargs):
        raise IndexError("list index out of range")

    monkeypatch.setitem(registry.REGISTRY, method.name,
                        dataclasses.replace(method, function=broken))
    result = rating.rate(case)
    assert result.status == "failed"
    assert case.name in result.message and method.name in result.message
    assert "IndexError" in result.message


def test_a_vertical_evaporator_with_several_passes_is_refused():
    # Before: rated in silence, with the static head of every pass counted as a loss.
    case = base_case(("evaporator", "vertical"))
    with pytest.raises(InputError) as err:
        dataclasses.replace(case, tubes=dataclasses.replace(case.tubes, passes=2, count=240))
    assert err.value.field == "tubes.passes"
    assert "down-flow" in str(err.value) and "passes = 1" in str(err.value)
    # one pass, and several horizontal passes, are accepted
    dataclasses.replace(case, tubes=dataclasses.replace(case.tubes, passes=1))
    Tubes(count=240, length=3.0, outer_diameter=0.0254, bwg=14, passes=2,
          orientation="horizontal")
    assert isinstance(case, Case)
