"""Inputs as a datasheet gives them (issue 16).

Checked against things outside the project: CoolProp's high-level PropsSI for a
saturation pressure or temperature derived from the other; the IAPWS-IF97 steam
table's saturation temperature at 3 bar; the published kettle proportions
(Wolverine Engineering Data Book II, ch. 5; Sinnott, Coulson & Richardson Vol. 6,
Fig. 12.10); Incropera & DeWitt's Table A.6 of saturated water for a user
saturation table; CoolProp's mixture model for a pseudo-pure mixture.
"""
import dataclasses
import json
from pathlib import Path

import CoolProp.CoolProp as CP
import pytest

import rating
from rating import catalogue as cat
from rating.case import BoilingStream, HeatingMedium, KettleShell
from rating.errors import InputError
from rating.project import from_dict, to_dict

SAMPLES = Path(__file__).parent.parent / "samples"


def sample(file, index=0):
    return rating.load_project(SAMPLES / file).cases[index]


def codes(result):
    return [w.code for w in result.warnings]


# --------------------------------------------------------------- item 2: P or T_sat

def test_boiling_pressure_derived_from_its_saturation_temperature_is_coolprops():
    # n-Pentane boiling at 80 degC: CoolProp's PropsSI gives the pressure (bubble line).
    T = 353.15
    stream = BoilingStream("n-Pentane", 1.0, inlet_saturation_temperature=T)
    assert stream.inlet_pressure == pytest.approx(CP.PropsSI("P", "T", T, "Q", 0, "n-Pentane"),
                                                  rel=1e-9)


def test_steam_given_as_saturation_temperature_gives_the_steam_table_pressure():
    # IAPWS-IF97 steam table: saturation at 143.61 degC is 0.4 MPa (to 4 figures).
    steam = HeatingMedium(kind="steam", saturation_temperature=273.15 + 143.61)
    assert steam.pressure == pytest.approx(4.0e5, rel=5e-4)
    assert steam.pressure == pytest.approx(CP.PropsSI("P", "T", 416.76, "Q", 1, "Water"),
                                           rel=1e-9)


def test_a_case_given_by_temperatures_rates_as_the_same_case_given_by_pressures():
    base = sample("pentane-vaporiser.ebullio")
    T_b = CP.PropsSI("T", "P", base.boiling.inlet_pressure, "Q", 0, base.boiling.fluid)
    T_s = CP.PropsSI("T", "P", base.heating.pressure, "Q", 1, "Water")
    draft = cat.case_to_draft(base)
    for path, value in (("boiling.inlet_pressure", None),
                        ("boiling.inlet_saturation_temperature", T_b),
                        ("heating.pressure", None), ("heating.saturation_temperature", T_s)):
        draft = cat.set_value(draft, path, value)
    by_t = cat.draft_to_case(draft)
    a, b = rating.rate(base), rating.rate(by_t)
    assert b.summary["duty_W"] == pytest.approx(a.summary["duty_W"], rel=1e-6)
    # both the given and the derived value are shown in the result
    s = b.summary
    assert s["boiling_pressure_Pa"] == pytest.approx(base.boiling.inlet_pressure, rel=1e-8)
    assert s["boiling_saturation_temperature_K"] == T_b
    assert s["heating_pressure_Pa"] == pytest.approx(base.heating.pressure, rel=1e-8)
    assert a.summary["heating_saturation_temperature_K"] == pytest.approx(T_s, abs=1e-6)


def test_the_steam_table_saturation_temperature_is_shown_for_a_steam_pressure():
    r = rating.rate(sample("pentane-vaporiser.ebullio"))
    P = r.summary["heating_pressure_Pa"]
    assert r.summary["heating_saturation_temperature_K"] == pytest.approx(
        CP.PropsSI("T", "P", P, "Q", 1, "Water"), abs=1e-6)


def test_the_file_keeps_the_given_temperature_and_leaves_the_pressure_empty():
    stream = BoilingStream("Water", 1.0, inlet_saturation_temperature=373.124)
    data = to_dict(stream)
    assert data["inlet_pressure"] is None and data["inlet_saturation_temperature"] == 373.124
    again = from_dict(json.loads(json.dumps(data)), BoilingStream)
    assert again.inlet_pressure == stream.inlet_pressure
    # a copy carries both, equal: still one input
    assert dataclasses.replace(stream, mass_flow=2.0).inlet_pressure == stream.inlet_pressure


@pytest.mark.parametrize("kwargs, field, words", [
    (dict(inlet_pressure=2e5, inlet_saturation_temperature=373.15), "inlet_pressure",
     ["not both", "saturates at 373.15 K under 101418"]),
    (dict(), "inlet_pressure", ["give inlet_pressure [Pa] or inlet_saturation_temperature [K]"]),
    (dict(inlet_saturation_temperature=700.0), "inlet_saturation_temperature",
     ["critical temperature"]),
])
def test_pressure_and_temperature_refusals_name_the_field(kwargs, field, words):
    with pytest.raises(InputError) as info:
        BoilingStream("Water", 1.0, **kwargs)
    assert info.value.field == field
    for w in words:
        assert w in str(info.value), str(info.value)


def test_a_liquid_heating_medium_has_no_saturation_temperature():
    with pytest.raises(InputError) as info:
        HeatingMedium(kind="liquid", fluid="Water", pressure=5e5, inlet_temperature=400.0,
                      mass_flow=1.0, saturation_temperature=420.0)
    assert info.value.field == "saturation_temperature"


def test_new_pressure_fields_are_in_the_catalogue_and_apply_to_their_side():
    draft = cat.case_to_draft(sample("pentane-vaporiser.ebullio"))
    assert cat.applies("heating.saturation_temperature", draft)
    assert cat.applies("boiling.inlet_saturation_temperature", draft)
    liquid = cat.set_value(draft, "heating.kind", "liquid")
    assert not cat.applies("heating.saturation_temperature", liquid)
    assert cat.input_field("boiling.inlet_saturation_temperature").unit == "K"


# --------------------------------------------------------------- item 6: kettle defaults

def test_kettle_dimensions_left_out_take_published_defaults_with_warnings():
    base = sample("harrow-creek-kettles.ebullio")
    case = base
    for name in ("kettle_diameter", "port_diameter", "weir_height"):
        case = cat.with_value(case, f"kettle.{name}", None)
    k, D_b = case.kettle, base.kettle.bundle_diameter
    # Wolverine Engineering Data Book II ch. 5: a bundle fills about 60 % of the shell.
    assert k.kettle_diameter == pytest.approx(D_b / 0.6, rel=1e-12)
    # Sinnott Fig. 12.10 (fixed and U-tube bundles): about 10 mm at 0.2 m, 20 mm at 1.2 m.
    for d, clearance in ((0.2, 0.010), (1.2, 0.020)):
        port = KettleShell(bundle_diameter=d).port_diameter
        assert port - d == pytest.approx(clearance, abs=1e-3)
    # the weir just covers the bundle: 50 mm over its top (common practice)
    assert k.weir_height == pytest.approx(k.bundle_top + 0.05, rel=1e-12)
    r = rating.rate(case)
    assert r.status != "failed", r.message
    defaulted = [w for w in r.warnings if w.code == "dimension-defaulted"]
    assert len(defaulted) == 3 and all(w.severity == "warning" for w in defaulted)
    assert any("Wolverine" in w.message for w in defaulted)
    assert r.summary["kettle_diameter_m"] == pytest.approx(D_b / 0.6)
    # a given dimension is kept and not warned about
    assert "dimension-defaulted" not in codes(rating.rate(base))


def test_kettle_without_bundle_diameter_is_refused():
    with pytest.raises(InputError) as info:
        KettleShell(kettle_diameter=1.0)
    assert info.value.field == "bundle_diameter"
