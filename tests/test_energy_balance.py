"""Energy balances checked from outside the march.

The march moves both sides by the same duty in every increment, so comparing the two
sums it keeps proves nothing. Here each side's duty is rebuilt from its own inlet and
outlet states as the result reports them, through CoolProp's high-level PropsSI (a
call path independent of the engine's property layer), or, for a user property
table, by integrating its cp column.
"""
from pathlib import Path

import CoolProp.CoolProp as CP
import numpy as np
import pytest
from scipy.integrate import trapezoid

import rating

SAMPLES = Path(__file__).parent.parent / "samples"


def cases(kind):
    for path in sorted(SAMPLES.glob("*.ebullio")):
        for case in rating.load_project(path).cases:
            if case.heating.kind == kind:
                yield pytest.param(case, id=f"{path.stem}:{case.name}")


@pytest.mark.parametrize("case", list(cases("liquid")))
def test_heating_liquid_gives_up_the_duty_the_boiling_side_takes(case):
    r = rating.rate(case)
    assert r.status in ("ok", "warnings"), r.message
    hm, s = case.heating, r.summary
    T_in, T_out = hm.inlet_temperature, s["heating_outlet_temperature_K"]
    if isinstance(hm.fluid, str):
        dh = (CP.PropsSI("H", "P", hm.pressure, "T", T_in, hm.fluid)
              - CP.PropsSI("H", "P", hm.pressure, "T", T_out, hm.fluid))
    else:  # a user table: h = integral of cp dT, cp linear between the table's points
        T = np.linspace(T_out, T_in, 2001)
        dh = trapezoid(np.interp(T, hm.fluid["T"], hm.fluid["cp"]), T)
    given_up = hm.mass_flow * dh
    loss = s.get("heat_loss_W") or 0.0
    assert s["duty_W"] + loss == pytest.approx(given_up, rel=2e-3)


@pytest.mark.parametrize("case", [c for c in cases("steam")   # a pure fluid by name
                                  if c.values[0].type in ("evaporator", "kettle")
                                  and isinstance(c.values[0].boiling.fluid, str)
                                  and "&" not in c.values[0].boiling.fluid])
def test_boiling_stream_takes_the_duty_between_its_own_states(case):
    # In-tube evaporators and kettles on steam: the boiling fluid's enthalpy rise from its
    # inlet state to the exit pressure and quality (or temperature) the result reports
    # (a kettle's exit is its vapour space: vapour and overflow liquid at saturation).
    r = rating.rate(case)
    b, s, fl = case.boiling, r.summary, case.boiling.fluid
    if b.inlet_temperature is not None:
        h_in = CP.PropsSI("H", "P", b.inlet_pressure, "T", b.inlet_temperature, fl)
    else:
        h_in = CP.PropsSI("H", "P", b.inlet_pressure, "Q", b.inlet_quality or 0.0, fl)
    P_out = s["exit_pressure_Pa"]
    if s["exit_quality"] is not None:
        h_out = CP.PropsSI("H", "P", P_out, "Q", s["exit_quality"], fl)
    else:
        h_out = CP.PropsSI("H", "P", P_out, "T", s["exit_temperature_K"], fl)
    flow = b.mass_flow
    assert s["duty_W"] == pytest.approx(flow * (h_out - h_in), rel=1e-3)


@pytest.mark.parametrize("case", list(cases("steam")))
def test_steam_condensed_carries_the_heating_side_duty(case):
    # Saturated steam in, condensate out at saturation (or, in a kettle's tubes, steam of
    # the outlet quality): the steam flow the result reports times the latent heat from
    # PropsSI is the heating side's duty, and that is the process duty plus the heat loss.
    r = rating.rate(case)
    assert r.status in ("ok", "warnings"), r.message
    s, fl = r.summary, case.heating.fluid
    P = s["heating_pressure_Pa"]
    h_fg = CP.PropsSI("H", "P", P, "Q", 1, fl) - CP.PropsSI("H", "P", P, "Q", 0, fl)
    condensed = 1.0 - (s.get("heating_outlet_quality") or 0.0)
    assert s["steam_flow_kg_s"] * h_fg * condensed == pytest.approx(
        s["duty_heating_side_W"], rel=1e-3)
    assert s["duty_W"] + (s.get("heat_loss_W") or 0.0) == pytest.approx(
        s["duty_heating_side_W"], rel=1e-3)


def _table_cases():
    for path in sorted(SAMPLES.glob("*.ebullio")):
        for case in rating.load_project(path).cases:
            if isinstance(case.boiling.fluid, dict) and case.boiling.inlet_temperature:
                yield pytest.param(case, id=f"{path.stem}:{case.name}")


@pytest.mark.parametrize("case", list(_table_cases()))
def test_a_saturation_table_boiling_stream_takes_the_duty_between_its_own_states(case):
    # A boiling fluid given as the user's saturation table: the liquid's enthalpy is the
    # integral of the table's cp_l (linear between its rows) and the vapour's adds h_lv
    # (linear in T), worked out here from the table's columns with numpy, not through
    # the engine's table object.
    r = rating.rate(case)
    assert r.status in ("ok", "warnings"), r.message
    b, t, s = case.boiling, case.boiling.fluid, r.summary

    def h_liquid(T):
        grid = np.linspace(t["T"][0], T, 4001)
        return trapezoid(np.interp(grid, t["T"], t["cp_l"]), grid)

    T_out = s["exit_temperature_K"]
    h_out = h_liquid(T_out) + (s["exit_quality"] or 0.0) * np.interp(T_out, t["T"], t["h_lv"])
    h_in = h_liquid(b.inlet_temperature)          # a subcooled liquid feed
    assert s["duty_W"] == pytest.approx(b.mass_flow * (h_out - h_in), rel=1e-4)
