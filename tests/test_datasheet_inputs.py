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
from rating.validation import validate

SAMPLES = Path(__file__).parent.parent / "samples"


def sample(file, index=0):
    return rating.load_project(SAMPLES / file).cases[index]


def validated(**parts):
    """Validate the pentane vaporiser with ``parts`` put in: the parts are completed in place
    (a pressure given as its saturation temperature is derived at validation)."""
    return validate(dataclasses.replace(sample("pentane-vaporiser.ebullio"), **parts))


def codes(result):
    return [w.code for w in result.warnings]


# --------------------------------------------------------------- item 2: P or T_sat

def test_boiling_pressure_derived_from_its_saturation_temperature_is_coolprops():
    # n-Pentane boiling at 80 degC: CoolProp's PropsSI gives the pressure (bubble line).
    T = 353.15
    stream = BoilingStream("n-Pentane", 1.0, inlet_saturation_temperature=T)
    assert stream.inlet_pressure is None            # built without the property library
    validated(boiling=stream)
    assert stream.inlet_pressure == pytest.approx(CP.PropsSI("P", "T", T, "Q", 0, "n-Pentane"),
                                                  rel=1e-9)


def test_steam_given_as_saturation_temperature_gives_the_steam_table_pressure():
    # IAPWS-IF97 steam table: saturation at 143.61 degC is 0.4 MPa (to 4 figures).
    steam = HeatingMedium(kind="steam", saturation_temperature=273.15 + 143.61)
    validated(heating=steam)
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
    validated(boiling=stream)
    data = to_dict(stream)
    assert data["inlet_pressure"] is None and data["inlet_saturation_temperature"] == 373.124
    again = from_dict(json.loads(json.dumps(data)), BoilingStream)
    validated(boiling=again)
    assert again.inlet_pressure == stream.inlet_pressure
    # a copy carries both, equal: still one input
    copy = dataclasses.replace(stream, mass_flow=2.0)
    validated(boiling=copy)
    assert copy.inlet_pressure == stream.inlet_pressure


@pytest.mark.parametrize("kwargs, field, words", [
    (dict(inlet_pressure=2e5, inlet_saturation_temperature=373.15), "inlet_pressure",
     ["not both", "saturates at 373.15 K under 101418"]),
    (dict(), "inlet_pressure", ["give inlet_pressure [Pa] or inlet_saturation_temperature [K]"]),
    (dict(inlet_saturation_temperature=700.0), "inlet_saturation_temperature",
     ["critical temperature"]),
])
def test_pressure_and_temperature_refusals_name_the_field(kwargs, field, words):
    with pytest.raises(InputError) as info:   # when built, or when validated in a case
        validated(boiling=BoilingStream("Water", 1.0, **kwargs))
    assert info.value.field in (field, f"boiling.{field}")
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


# --------------------------------------------------------------- item 5: heat loss

def with_heating(case, **changes):
    draft = cat.case_to_draft(case)
    for key, value in changes.items():
        draft = cat.set_value(draft, f"heating.{key}", value)
    return cat.draft_to_case(draft)


def test_a_heat_loss_on_steam_condenses_more_steam_for_the_same_process_duty():
    base = sample("pentane-vaporiser.ebullio")
    plain, lossy = rating.rate(base), rating.rate(with_heating(base, heat_loss_percent=5.0))
    Q = plain.summary["duty_W"]
    assert lossy.summary["duty_W"] == pytest.approx(Q, rel=1e-9)
    assert lossy.summary["duty_heating_side_W"] == pytest.approx(Q / 0.95, rel=1e-9)
    assert lossy.summary["heat_loss_W"] == pytest.approx(Q * 5 / 95, rel=1e-9)
    # the steam condensed carries the heating duty at the latent heat of CoolProp's water
    P = base.heating.pressure
    h_lv = CP.PropsSI("H", "P", P, "Q", 1, "Water") - CP.PropsSI("H", "P", P, "Q", 0, "Water")
    assert lossy.summary["steam_flow_kg_s"] == pytest.approx(Q / 0.95 / h_lv, rel=1e-6)
    fixed = rating.rate(with_heating(base, heat_loss=20e3))
    assert fixed.summary["duty_heating_side_W"] == pytest.approx(Q + 20e3, rel=1e-9)


@pytest.fixture(scope="module")
def oil():
    """The hot-oil vaporiser (a user table oil, counter-current), as given and with losses."""
    base = sample("hot-oil-vaporiser.ebullio")
    plain = rating.rate(base)
    share = rating.rate(with_heating(base, heat_loss_percent=8.0))
    return base, plain, share


def test_a_heat_loss_on_a_liquid_cools_the_medium_by_the_larger_duty(oil):
    base, plain, lossy = oil
    s = lossy.summary
    assert lossy.status != "failed", lossy.message
    # the energy balance of the two sides: the medium gives up duty / (1 - 0.08)
    assert s["duty_heating_side_W"] == pytest.approx(s["duty_W"] / 0.92, rel=2e-3)
    assert s["heating_outlet_temperature_K"] < plain.summary["heating_outlet_temperature_K"]
    assert s["duty_W"] < plain.summary["duty_W"]


def test_a_fixed_loss_on_a_liquid_equals_the_share_it_amounts_to(oil):
    base, _plain, lossy = oil
    loss = lossy.summary["duty_W"] * 8.0 / 92.0
    fixed = rating.rate(with_heating(base, heat_loss=loss))
    assert fixed.summary["duty_W"] == pytest.approx(lossy.summary["duty_W"], rel=1e-4)
    assert fixed.summary["heat_loss_W"] == loss


def test_heat_loss_refusals_name_the_field():
    with pytest.raises(InputError) as info:
        HeatingMedium(kind="steam", pressure=3e5, heat_loss_percent=60.0)
    assert info.value.field == "heat_loss_percent" and "<= 50" in str(info.value)
    with pytest.raises(InputError) as info:
        HeatingMedium(kind="steam", pressure=3e5, heat_loss_percent=5.0, heat_loss=1e3)
    assert info.value.field == "heat_loss" and "not both" in str(info.value)


# --------------------------------------------------------------- item 7: property tables

#: Saturated water, Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, Table A.6
#: (rows 360 to 420 K, typed from memory; the vapour's transport columns of that table
#: sit 1-6 % from IAPWS): T [K], P [bar], v_f [1e-3 m^3/kg], v_g [m^3/kg], h_fg [kJ/kg],
#: cp_f, cp_g [kJ/kg/K], mu_f, mu_g [1e-6 Pa s], k_f, k_g [1e-3 W/m/K], sigma [1e-3 N/m].
INCROPERA_A6 = [
    (360.0, 0.6209, 1.033, 2.645, 2293, 4.203, 1.925, 324, 11.09, 674, 23.3, 60.0),
    (373.15, 1.0133, 1.044, 1.679, 2257, 4.217, 2.029, 279, 12.02, 680, 24.8, 58.9),
    (380.0, 1.2869, 1.049, 1.330, 2239, 4.226, 2.057, 260, 12.09, 683, 24.9, 57.6),
    (390.0, 1.794, 1.058, 0.980, 2212, 4.239, 2.104, 237, 12.42, 686, 25.8, 55.6),
    (400.0, 2.455, 1.067, 0.731, 2183, 4.256, 2.158, 217, 12.69, 688, 26.8, 53.6),
    (410.0, 3.302, 1.077, 0.553, 2153, 4.278, 2.221, 200, 12.99, 688, 27.2, 51.5),
    (420.0, 4.370, 1.088, 0.425, 2123, 4.302, 2.291, 185, 13.05, 688, 28.2, 49.4),
]


def water_table():
    rows = list(zip(*INCROPERA_A6))
    return {
        "name": "water, Incropera Table A.6", "critical_pressure": 22.064e6,  # IAPWS
        "molar_mass": 18.015,
        "T": list(rows[0]), "P": [p * 1e5 for p in rows[1]],
        "rho_l": [1e3 / v for v in rows[2]], "rho_v": [1.0 / v for v in rows[3]],
        "h_lv": [h * 1e3 for h in rows[4]], "cp_l": [c * 1e3 for c in rows[5]],
        "cp_v": [c * 1e3 for c in rows[6]], "mu_l": [m * 1e-6 for m in rows[7]],
        "mu_v": [m * 1e-6 for m in rows[8]], "k_l": [k * 1e-3 for k in rows[9]],
        "k_v": [k * 1e-3 for k in rows[10]], "sigma": [s * 1e-3 for s in rows[11]],
    }


def test_a_saturation_table_interpolates_to_iapws_water_between_its_rows():
    from rating.properties import make_fluid

    fluid = make_fluid(water_table())
    P = 2.0e5  # between the 390 and 400 K rows
    sat = fluid.saturation(P)

    def ref(key, q):
        return CP.PropsSI(key, "P", P, "Q", q, "Water")

    assert sat.T_sat == pytest.approx(ref("T", 0), abs=0.1)
    assert sat.h_lv == pytest.approx(ref("H", 1) - ref("H", 0), rel=0.005)
    assert sat.rho_l == pytest.approx(ref("D", 0), rel=0.003)
    assert sat.rho_v == pytest.approx(ref("D", 1), rel=0.01)
    assert sat.mu_l == pytest.approx(ref("V", 0), rel=0.02)
    assert sat.k_l == pytest.approx(ref("L", 0), rel=0.015)
    assert sat.sigma == pytest.approx(ref("I", 0), rel=0.01)
    # Clapeyron's slope from the table's own columns against CoolProp's
    assert sat.dPdT_sat == pytest.approx(CP.PropsSI("d(P)/d(T)|sigma", "P", P, "Q", 0, "Water"),
                                         rel=0.01)
    # a subcooled liquid 10 K below saturation: the table's liquid at its temperature
    T = sat.T_sat - 10.0
    assert fluid.at_ph(P, fluid.enthalpy(P, T)).T == pytest.approx(T, abs=1e-9)


def water_evaporator(fluid):
    from rating.case import Case, Methods, Tubes

    # One dryout method for both: the 2006 look-up table is for water by name only.
    return Case(
        name="water evaporator", tubes=Tubes(count=20, length=3.0, outer_diameter=0.0254, bwg=14),
        boiling=BoilingStream(fluid, 0.25, 2.0e5, inlet_temperature=385.0),
        heating=HeatingMedium(kind="steam", pressure=4.5e5),
        methods=Methods(tube_dryout="katto_ohno_local"))


def test_a_case_on_the_table_rates_like_the_same_case_on_iapws_water():
    table, library = rating.rate(water_evaporator(water_table())), \
        rating.rate(water_evaporator("Water"))
    assert table.status != "failed", table.message
    print(f"\nwater from Incropera A.6 against IAPWS: duty {table.summary['duty_W']:.6g} W "
          f"against {library.summary['duty_W']:.6g} W, exit quality "
          f"{table.summary['exit_quality']:.4f} against {library.summary['exit_quality']:.4f}")
    assert table.summary["duty_W"] == pytest.approx(library.summary["duty_W"], rel=0.01)
    assert table.summary["exit_quality"] == pytest.approx(library.summary["exit_quality"],
                                                          rel=0.01)
    assert "user-property-table" in codes(table)


def test_a_saturation_table_survives_the_project_file():
    case = water_evaporator(water_table())
    again = from_dict(json.loads(json.dumps(to_dict(case))), type(case))
    assert again.boiling.fluid == case.boiling.fluid


@pytest.mark.parametrize("change, field, words", [
    (lambda t: t.pop("sigma"), "fluid.sigma", ["missing"]),
    (lambda t: t["P"].reverse(), "fluid.P", ["rise strictly"]),
    (lambda t: t["rho_v"].__setitem__(0, 2000.0), "fluid.rho_v", ["below the liquid density"]),
    (lambda t: t["h_lv"].append(1.0), "fluid.h_lv", ["as many as fluid.T"]),
])
def test_a_faulty_table_is_refused_naming_the_column(change, field, words):
    table = water_table()
    change(table)
    with pytest.raises(InputError) as info:
        BoilingStream(table, 1.0, 2e5)
    assert info.value.field == field
    for w in words:
        assert w in str(info.value), str(info.value)


def test_a_pressure_outside_the_table_is_refused_naming_the_range():
    with pytest.raises(InputError) as info:
        validate(dataclasses.replace(water_evaporator(water_table()),
                                     boiling=BoilingStream(water_table(), 0.25, 8e5)))
    assert info.value.field == "boiling.inlet_pressure"
    assert "outside the table" in str(info.value)


MIXTURE = "Propane[0.95]&n-Butane[0.05]"


def test_a_narrow_boiling_mixture_boils_at_coolprops_bubble_point():
    from rating.properties import make_fluid

    fluid, P = make_fluid(MIXTURE), 12e5
    ref = "HEOS::" + MIXTURE
    bubble = CP.PropsSI("T", "P", P, "Q", 0, ref)
    dew = CP.PropsSI("T", "P", P, "Q", 1, ref)
    assert fluid.T_sat(P) == pytest.approx(bubble, abs=0.05)
    assert fluid.boiling_range(P) == pytest.approx(dew - bubble, abs=0.05)
    sat = fluid.saturation(P)
    assert sat.h_lv == pytest.approx(CP.PropsSI("H", "P", P, "Q", 1, ref)
                                     - CP.PropsSI("H", "P", P, "Q", 0, ref), rel=0.01)


def test_a_mixture_rating_warns_about_its_boiling_range():
    base = sample("pentane-vaporiser.ebullio")
    draft = cat.set_value(cat.case_to_draft(base), "boiling.fluid", MIXTURE)
    draft = cat.set_value(draft, "boiling.inlet_temperature", None)
    r = rating.rate(cat.draft_to_case(draft))
    assert r.status != "failed", r.message
    warned = [w for w in r.warnings if w.code == "mixture-as-pure-fluid"]
    assert warned and "boiling range" in warned[0].message
    assert r.summary["boiling_range_K"] > 0.5


# --------------------------------------------------------------- item 3: fixed or scaled

def with_fields(case, **changes):
    draft = cat.case_to_draft(case)
    for path, value in changes.items():
        draft = cat.set_value(draft, path.replace("__", "."), value)
    return cat.draft_to_case(draft)


def test_fixed_coefficients_on_both_sides_give_the_series_resistance_flux():
    # Both films fixed: the local flux is (T_h - T_b) / (1/H_b + R_wall + (D_i/D_o)/H_h) on
    # the inside surface (plane-wall and cylinder resistances in series, Incropera &
    # DeWitt ch. 3), at every station.
    import math

    H_b, H_h = 3000.0, 8000.0
    case = with_fields(sample("pentane-vaporiser.ebullio"), boiling__htc_fixed=H_b,
                       heating__htc_fixed=H_h, boiling__fouling_resistance=0.0,
                       heating__fouling_resistance=0.0)
    r = rating.rate(case)
    assert r.status != "failed", r.message
    t = case.tubes
    d_i, d_o = t.inner_diameter, t.outer_diameter
    R = 1 / H_b + d_i * math.log(d_o / d_i) / (2 * t.conductivity) + (d_i / d_o) / H_h
    p = r.profiles
    for i in range(0, len(p["z_m"]), 5):
        q = (p["t_heating_K"][i] - p["t_process_K"][i]) / R
        assert p["heat_flux_W_m2"][i] == pytest.approx(q, rel=1e-5)
        assert p["htc_boiling_W_m2K"][i] == H_b and p["htc_heating_W_m2K"][i] == H_h
        assert p["htc_nucleate_W_m2K"][i] is None  # the parts of a fixed value: not computed
    assert codes(r).count("coefficient-set-by-user") == 2
    trail = {m.family: m for m in r.methods}
    assert trail["boiling_coefficient"].name == "user_fixed"
    assert "3000 W/m^2/K" in trail["heating_coefficient"].reference + \
        trail["boiling_coefficient"].reference


def test_a_multiplier_scales_the_methods_own_value_at_each_station():
    # Gungor-Winterton (1986) evaluated afresh at a station's state and flux, times 1.3;
    # the shell side's Bell-Delaware coefficient at the station's temperature, times 0.8.
    from rating.correlations.flow_boiling import flow_boiling_htc
    from rating.exchangers.tube_boiling import heating_side
    from rating.properties import make_fluid

    case = with_fields(sample("chiller-evaporator.ebullio"), boiling__htc_factor=1.3,
                       heating__htc_factor=0.8)
    r = rating.rate(case)
    assert r.status != "failed", r.message
    p, t = r.profiles, case.tubes
    fluid = make_fluid(case.boiling.fluid)
    G = case.boiling.mass_flow / t.tubes_per_pass / (3.141592653589793 * t.inner_diameter ** 2 / 4)
    side, _ = heating_side(case)
    i = len(p["z_m"]) // 2
    assert p["regime"][i] == "saturated boiling"
    sat = fluid.saturation(p["p_Pa"][i])
    avail = dict(sat.as_dict(), G=G, x=p["quality"][i], D=t.inner_diameter)
    method = flow_boiling_htc(case.methods.flow_boiling, avail, p["heat_flux_W_m2"][i],
                              sat.dp_sat)
    assert p["htc_boiling_W_m2K"][i] == pytest.approx(1.3 * method, rel=1e-6)
    shell = side.shell_result(p["t_heating_K"][i]).htc
    assert p["htc_heating_W_m2K"][i] == pytest.approx(0.8 * shell, rel=2e-3)
    assert r.summary["duty_W"] < rating.rate(sample("chiller-evaporator.ebullio")).summary["duty_W"]


def test_a_kettle_takes_a_fixed_boiling_coefficient_and_a_heating_multiplier():
    base = sample("harrow-creek-kettles.ebullio")
    case = with_fields(base, boiling__htc_fixed=2500.0)
    r = rating.rate(case)
    assert r.status != "failed", r.message
    assert set(r.profiles["htc_boiling_W_m2K"]) == {2500.0}
    scaled = rating.rate(with_fields(base, heating__htc_factor=0.5))
    assert scaled.summary["duty_W"] < rating.rate(base).summary["duty_W"]
    assert "coefficient-set-by-user" in codes(scaled)
    # a kettle's fixed tube-side coefficient is its own field, flagged the same way
    assert not cat.applies("heating.htc_fixed", cat.case_to_draft(base))
    fixed = rating.rate(with_fields(base, kettle__heating_htc=6000.0))
    assert "coefficient-set-by-user" in codes(fixed)
    assert {m.family: m.name for m in fixed.methods}["heating_coefficient"] == "user_fixed"


def test_coefficient_overrides_are_stored_and_refused_when_both_are_given():
    case = with_fields(sample("pentane-vaporiser.ebullio"), heating__htc_fixed=9000.0)
    again = from_dict(json.loads(json.dumps(to_dict(case))), type(case))
    assert again.heating.htc_fixed == 9000.0
    with pytest.raises(InputError) as info:
        BoilingStream("Water", 1.0, 2e5, htc_fixed=3000.0, htc_factor=1.2)
    assert info.value.field == "htc_factor" and "not both" in str(info.value)
    with pytest.raises(InputError) as info:
        BoilingStream("Water", 1.0, 2e5, htc_factor=0.0)
    assert info.value.field == "htc_factor" and ">= 0.05" in str(info.value)


# --------------------------------------------------------------- item 1: every tube marched

def test_tubes_left_over_by_the_passes_are_marched():
    # 66 tubes in 4 passes: 16.5 a pass on average; both films fixed, so the duty is
    # U A dT with the whole bundle's area (Q = U A dT with series resistances, Incropera &
    # DeWitt ch. 3 and 11), the boiling fluid staying saturated (a small pressure drop).
    import math

    from rating.case import Case, Tubes

    H_b, H_h, d_o, bwg, L = 1500.0, 4000.0, 0.01905, 16, 2.0
    case = Case(
        name="66 tubes in 4 passes", type="evaporator",
        tubes=Tubes(count=66, length=L, outer_diameter=d_o, bwg=bwg, passes=4,
                    orientation="horizontal", material="stainless_steel_316"),
        boiling=BoilingStream("n-Pentane", 1.0, 5.0e5, inlet_quality=0.05,
                              htc_fixed=H_b),
        heating=HeatingMedium(kind="steam", pressure=1.5e5, htc_fixed=H_h))
    r = rating.rate(case)
    assert r.status != "failed", r.message
    t = case.tubes
    d_i = t.inner_diameter
    U_o = 1 / (1 / H_h + d_o * math.log(d_o / d_i) / (2 * t.conductivity) + d_o / (d_i * H_b))
    p = r.profiles
    dT = [p["t_heating_K"][i] - p["t_process_K"][i] for i in range(len(p["z_m"]))]
    z = p["z_m"]
    mean_dT = sum(0.5 * (a + b) * (z1 - z0) for a, b, z0, z1 in zip(dT, dT[1:], z, z[1:])) / z[-1]
    area = 66 * math.pi * d_o * L
    assert r.summary["exit_quality"] < 0.9  # saturated throughout
    assert r.summary["duty_W"] == pytest.approx(U_o * area * mean_dT, rel=2e-3)
    assert r.summary["area_m2"] == pytest.approx(area, rel=1e-12)
    assert "tubes-spread-over-passes" in codes(r)


# --------------------------------------------------------------- item 4: thermosiphon duty

def test_a_thermosiphon_answers_the_required_duty_question():
    # The question the other types answer; over-design on the area basis, which is Serth &
    # Lestina's U_service / U_required - 1 with U_required = Q_required / (A MTD).
    from rating.case import QUESTIONS

    duty_question = next(q for q in QUESTIONS if q != "performance")
    base = sample("stripper-reboiler.ebullio")
    draft = cat.set_value(cat.case_to_draft(base), "question", duty_question)
    assert cat.applies("required_duty", draft) and cat.applies("question", draft)
    Q_req = 2.0e6
    case = cat.draft_to_case(cat.set_value(draft, "required_duty", Q_req))
    r = rating.rate(case)
    assert r.status != "failed", r.message
    s = r.summary
    u_required = Q_req / (s["area_m2"] * s["mean_temperature_difference_K"])
    assert s["u_required_W_m2K"] == pytest.approx(u_required, rel=1e-9)
    assert s["over_design_pct"] == pytest.approx(
        (s["u_service_W_m2K"] / u_required - 1) * 100, rel=1e-6)
    assert s["required_area_m2"] == pytest.approx(s["area_m2"] * Q_req / s["duty_W"], rel=1e-9)
    assert s["over_surface_pct"] == pytest.approx(
        (s["u_clean_W_m2K"] / u_required - 1) * 100, rel=1e-6)
    # more than the unit gives: negative over-design and an error naming the shortfall
    short = rating.rate(cat.with_value(case, "required_duty", 3.0e6))
    assert short.summary["over_design_pct"] < 0
    assert "duty-not-reached" in codes(short)


def test_a_fixed_loss_on_a_liquid_reports_progress_that_never_goes_back(oil):
    base, _plain, lossy = oil
    seen = []
    rating.rate(with_heating(base, heat_loss=lossy.summary["heat_loss_W"]), progress=seen.append)
    assert seen and all(b >= a for a, b in zip(seen, seen[1:])) and seen[-1] == 1.0
