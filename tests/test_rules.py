"""The table of warning rules (rating.rules): one list of every warning the product gives.

* every code any rating emits (every sample, and the cases below that push each rule
  over its limit) is a rule of the table;
* every rule is triggered by one of those cases, or says why none can;
* DEVELOPERS.md's generated list of rules is the table's;
* a warning keeps its values in SI with their quantities, so another unit system shows
  the same finding in its own units.
The limits the cases set are the editable ones of the catalogue; the thresholds and
their sources are the rules' own (listed in DEVELOPERS.md), not values of this test.
"""
from __future__ import annotations

import dataclasses
import glob
from pathlib import Path

import pytest

import rating
from rating import catalogue as cat
from rating import rules
from rating.case import Limits
from rating.results import RatingWarning

ROOT = Path(__file__).resolve().parents[1]


def sample(name: str, index: int = 0):
    return rating.load_project(ROOT / "samples" / name).cases[index]


def variant(name: str, index: int = 0, **paths):
    """A sample case with inputs changed by catalogue path (``tubes__length`` style keys)."""
    case = sample(name, index)
    for key, value in paths.items():
        case = cat.with_value(case, key.replace("__", "."), value)
    return case


#: Each case and a rule it must trigger (each pushes one limit or input past its rule).
TRIGGERS = [
    ("chf-margin", lambda: variant("chiller-evaporator.ebullio", limits__chf_ratio=0.001)),
    ("pinch", lambda: variant("chiller-evaporator.ebullio",
                              limits__min_temperature_approach=500.0)),
    ("kern-cap", lambda: variant("chiller-evaporator.ebullio", limits__kern_flux_cap=1.0)),
    ("duty-not-reached", lambda: variant("chiller-evaporator.ebullio", required_duty=1e9)),
    ("input-outside-usual-range", lambda: variant("chiller-evaporator.ebullio",
                                                  tubes__length=25.0)),
    ("will-not-circulate", lambda: variant("stripper-reboiler.ebullio",
                                           thermosiphon__liquid_level=0.3)),
    ("thermosiphon-max-flux", lambda: variant("stripper-reboiler.ebullio",
                                              limits__thermosiphon_max_flux=1.0)),
    ("nozzle-rho-v2", lambda: variant("stripper-reboiler.ebullio",
                                      limits__thermosiphon_nozzle_rho_v2=1.0)),
    ("low-pressure", lambda: variant("stripper-reboiler.ebullio",
                                     limits__thermosiphon_min_pressure=1e8)),
    ("return-submerged", lambda: variant("stripper-reboiler.ebullio",
                                         thermosiphon__liquid_level=3.5,
                                         thermosiphon__return_line_rise=0.5)),
    ("mass-flow-ignored", lambda: variant("stripper-reboiler.ebullio", boiling__mass_flow=5.0)),
    ("long-subcooled-zone", lambda: variant("stripper-reboiler.ebullio",
                                            limits__thermosiphon_max_subcooled_fraction=1e-6)),
    ("bundle-flux-limit", lambda: variant("harrow-creek-kettles.ebullio",
                                          limits__kettle_bundle_flux_ratio=0.01)),
    ("bundle-factor-small", lambda: variant("harrow-creek-kettles.ebullio",
                                            limits__kettle_min_bundle_factor=0.99)),
    ("bundle-uncovered", lambda: variant("harrow-creek-kettles.ebullio",
                                         limits__kettle_min_level_over_bundle=5.0)),
    ("entrainment", lambda: variant("harrow-creek-kettles.ebullio",
                                    limits__kettle_surface_velocity_constant=1e-4)),
    ("impingement", lambda: variant("harrow-creek-kettles.ebullio",
                                    limits__kettle_inlet_nozzle_rho_v2=1e-3)),
    ("nozzle-rho-v2", lambda: variant("harrow-creek-kettles.ebullio",
                                      limits__kettle_vapour_nozzle_rho_v2=1e-3)),
    ("fixed-heating-htc", lambda: variant("harrow-creek-kettles.ebullio",
                                          kettle__heating_htc=8000.0)),
    ("feed-boiled-dry", lambda: variant("harrow-creek-kettles.ebullio",
                                        boiling__mass_flow=0.01)),
    ("tube-count", lambda: variant("harrow-creek-kettles.ebullio",
                                   kettle__estimate_tube_count=True)),
    ("condensate-flooding", lambda: _steam_flow(0.7)),
    ("steam-blow-through", lambda: _steam_flow(1.5)),
    ("bundle-flux-local", lambda: _between_bundle_fluxes()),
    ("mist-flow", lambda: variant("stripper-reboiler.ebullio", thermosiphon__liquid_level=0.5)),
    ("no-convergence", lambda: variant("chiller-evaporator.ebullio", boiling__mass_flow=300.0)),
    ("negative-slope", lambda: _subcooled_loop()),
]


def _steam_flow(factor):
    """The steam kettle fed ``factor`` x the steam its trap would pass (a given flow)."""
    m = rating.rate(sample("harrow-creek-kettles.ebullio")).summary["steam_flow_kg_s"]
    return variant("harrow-creek-kettles.ebullio", heating__mass_flow=factor * m)


def _between_bundle_fluxes():
    """A bundle-flux ratio between the kettle's average and largest local flux over its
    bundle maximum: the local flux passes it, the average does not."""
    s = rating.rate(sample("harrow-creek-kettles.ebullio")).summary
    ratio = 0.5 * (s["mean_heat_flux_W_m2"] + s["max_heat_flux_W_m2"]) \
        / s["bundle_max_heat_flux_W_m2"]
    return variant("harrow-creek-kettles.ebullio", limits__kettle_bundle_flux_ratio=ratio)


def _subcooled_loop():
    """The subcooled water loop of tests/test_thermosiphon.py whose required pressure
    difference falls with rising flow (Ledinegg 1938; Saha, Ishii & Zuber 1976)."""
    from rating.case import BoilingStream, Case, HeatingMedium, ThermosiphonLoop, Tubes

    return Case(
        name="subcooled", type="thermosiphon",
        tubes=Tubes(count=100, length=5.0, outer_diameter=0.01905, bwg=14),
        boiling=BoilingStream(fluid="Water", mass_flow=None, inlet_pressure=1.0e5,
                              inlet_temperature=303.15, fouling_resistance=1.76e-4),
        heating=HeatingMedium(kind="steam", pressure=10e5, fouling_resistance=8.8e-5),
        thermosiphon=ThermosiphonLoop(
            liquid_level=4.0, inlet_line_diameter=0.2545, inlet_line_length=8.0,
            inlet_line_k=1.4, return_line_diameter=0.5906, return_line_length=5.0,
            return_line_rise=0.8, return_line_k=2.1))


def _emitted():
    """code -> a case that gave it, over every sample and every trigger case."""
    seen = {}
    for path in sorted(glob.glob(str(ROOT / "samples" / "*.ebullio"))):
        for case in rating.load_project(path).cases:
            for w in rating.rate(case).warnings:
                seen.setdefault(w.code, case.name)
    for code, make in TRIGGERS:
        for w in rating.rate(make()).warnings:
            seen.setdefault(w.code, f"trigger for {code}")
    cancel = rating.rate(sample("chiller-evaporator.ebullio"), cancel=lambda: True)
    for w in cancel.warnings:
        seen.setdefault(w.code, "cancelled rating")
    return seen


@pytest.fixture(scope="module")
def emitted():
    return _emitted()


def test_every_code_a_rating_emits_is_in_the_list(emitted):
    assert set(emitted) - set(rules.RULES) == set()


@pytest.mark.parametrize("code, make", TRIGGERS, ids=[t[0] for t in TRIGGERS])
def test_each_trigger_case_gives_its_rule(code, make):
    assert code in {w.code for w in rating.rate(make()).warnings}


def test_every_rule_is_triggered_or_says_why_not(emitted):
    silent = [r.code for r in rules.RULES.values() if r.code not in emitted and not r.untriggered]
    assert silent == []
    # a rule marked as untriggered is really not seen (else the mark is stale)
    stale = [r.code for r in rules.RULES.values() if r.untriggered and r.code in emitted]
    assert stale == []


def test_every_limit_field_is_in_the_table_with_a_source_and_read_by_a_rule():
    names = {f.name for f in dataclasses.fields(Limits)}
    assert names == set(rules.LIMITS)
    read = {n for r in rules.RULES.values() for n in r.limits}
    assert read == names
    for lim in rules.LIMITS.values():
        assert len(lim.source) > 20, lim.name
        assert cat.input_field(lim.path).help == lim.source  # the catalogue shows the source


def test_rules_are_well_formed():
    for rule in rules.RULES.values():
        assert set(rule.severities) <= {"info", "warning", "error"}, rule.code
        assert rule.limits or rule.basis, rule.code   # a limit, or the basis of the rule
        for name, quantity in rules.quantities(rule.message).items():
            assert quantity in cat.QUANTITIES, (rule.code, name, quantity)


def test_the_developers_guide_lists_the_rules_as_generated():
    text = (ROOT / "DEVELOPERS.md").read_text(encoding="utf-8")
    assert rules.BEGIN in text and rules.END in text
    assert rules.with_block(text) == text, "run: python -m rating.rules DEVELOPERS.md"
    for code in rules.RULES:
        assert f"`{code}`" in text


def test_a_warning_carries_si_values_and_renders_in_other_units():
    w = rules.warn("pinch", z=1.702, dT=2.5, limit=3.0)
    assert isinstance(w, RatingWarning)
    assert w.message == "temperature approach falls to 2.50 K (limit 3.00 K)"
    assert dict(w.values) == {"z": 1.702, "dT": 2.5, "limit": 3.0}
    d = w.to_dict()
    assert d["values"]["dT"] == {"value": 2.5, "quantity": "temperature_difference"}

    def fahrenheit(value, quantity, spec):   # a temperature difference of 1 K is 1.8 degF
        if quantity == "temperature_difference":
            return f"{value * 1.8:{spec}} degF"
        return rules.si_text(value, quantity, spec)

    assert rules.render(w.template, dict(w.values), fahrenheit) == \
        "temperature approach falls to 4.50 degF (limit 5.40 degF)"


def test_a_position_in_the_message_is_a_value_with_its_quantity():
    w = rules.warn("mist-flow", z=1.702, x=0.61)
    assert "z = 1.702 m" in w.message and w.z_m == 1.702
    assert rules.quantities(w.template)["z"] == "length"


def test_a_severity_the_rule_does_not_have_is_refused():
    with pytest.raises(ValueError):
        rules.warn("pinch", "error", dT=1.0, limit=3.0)


def test_the_list_for_the_desktop_and_the_report_names_limits_and_sources():
    rows = {r["code"]: r for r in rules.rows()}
    assert set(rows) == set(rules.RULES)
    chf = rows["chf-margin"]["limits"][0]
    assert chf["path"] == "limits.chf_ratio" and chf["default"] == Limits().chf_ratio
    assert "Sinnott" in chf["source"]
