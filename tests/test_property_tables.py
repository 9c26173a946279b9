"""Interpolated properties against the property library itself (CoolProp's PropsSI).

The march takes its saturation sets from ``rating.properties.SaturationInterpolation``
(cubic in ln P between CoolProp sets every 2 % in pressure, each interval checked
at its midpoint before use) and the heating medium's temperature from
``rating.exchangers.heating.EnthalpyTable`` (cubic Hermite T(h) every 2 K). Both
are checked here against CoolProp's high-level PropsSI, called independently of
the engine's AbstractState, over the range each is used on.
"""
from __future__ import annotations

import math
import random

import pytest
from CoolProp.CoolProp import PropsSI

from rating.exchangers.heating import EnthalpyTable
from rating.properties import Fluid, IncompressibleLiquid, SaturationInterpolation, make_fluid

# field of SaturationSet -> (PropsSI output, quality)
PROPS = {
    "T_sat": ("T", 0), "rho_l": ("D", 0), "rho_v": ("D", 1), "h_l": ("H", 0), "h_v": ("H", 1),
    "mu_l": ("V", 0), "mu_v": ("V", 1), "k_l": ("L", 0), "k_v": ("L", 1), "cp_l": ("C", 0),
    "cp_v": ("C", 1), "sigma": ("I", 0),
}
FLUIDS = ["Water", "n-Pentane", "n-Hexane", "Toluene", "Propane", "R134a"]


def _relative_errors(sat, name, P):
    h_lv = PropsSI("H", "P", P, "Q", 1, name) - PropsSI("H", "P", P, "Q", 0, name)
    out = {}
    for field, (key, q) in PROPS.items():
        ref = PropsSI(key, "P", P, "Q", q, name)
        scale = h_lv if field in ("h_l", "h_v") else abs(ref)
        out[field] = abs(getattr(sat, field) - ref) / scale
    return out


@pytest.mark.parametrize("name", FLUIDS)
def test_interpolated_sets_within_the_tolerance(name):
    # reduced pressures 0.005 to 0.85, 40 random pressures each: every field within
    # the table's tolerance of CoolProp (PropsSI), interpolated or handed back
    fluid = Fluid(name)
    rng = random.Random(name)
    worst = 0.0
    for _ in range(40):
        P = fluid.P_crit * math.exp(rng.uniform(math.log(0.005), math.log(0.85)))
        errors = _relative_errors(fluid.saturation_interpolated(P), fluid.coolprop_name, P)
        worst = max(worst, max(errors.values()))
    assert worst <= SaturationInterpolation.TOLERANCE


def test_derived_fields_follow_the_interpolated_ones():
    # h_lv, Pr_l and the Clapeyron slope against CoolProp's (PropsSI) at 3 bar n-pentane
    fluid = Fluid("n-Pentane")
    P = 2.9e5
    sat = fluid.saturation_interpolated(P)
    h_lv = PropsSI("H", "P", P, "Q", 1, "n-Pentane") - PropsSI("H", "P", P, "Q", 0, "n-Pentane")
    assert sat.h_lv == pytest.approx(h_lv, rel=2e-6)
    assert sat.Pr_l == pytest.approx(PropsSI("PRANDTL", "P", P, "Q", 0, "n-Pentane"), rel=3e-6)
    T = sat.T_sat
    slope = (PropsSI("P", "T", T + 1e-3, "Q", 0, "n-Pentane")
             - PropsSI("P", "T", T - 1e-3, "Q", 0, "n-Pentane")) / 2e-3
    assert sat.dPdT_sat == pytest.approx(slope, rel=1e-5)


def test_few_coolprop_sets_over_a_march_range():
    # a 10 % pressure range, 500 pressures: about five nodes and one midpoint
    # check per 2 % interval, never one set per pressure
    fluid = Fluid("n-Hexane")
    calls = []
    exact = fluid.saturation
    fluid.saturation = lambda P: calls.append(P) or exact(P)
    for i in range(500):
        fluid.saturation_interpolated(2.0e5 * (1.0 + 0.1 * i / 499))
    assert len(calls) <= 20
    assert fluid._table.exact_intervals == 0


def test_near_the_critical_point_the_sets_are_coolprops():
    # above 0.9 P_crit, and where the check fails, the set is CoolProp's own
    fluid = Fluid("Propane")
    P = 0.95 * fluid.P_crit
    assert fluid.saturation_interpolated(P) == fluid.saturation(P)
    strict = Fluid("Propane")
    strict._table.TOLERANCE = 1e-15
    P = 0.3 * strict.P_crit
    assert strict.saturation_interpolated(P) == strict.saturation(P)
    assert strict._table.exact_intervals == 1


def test_state_just_below_an_interpolated_saturated_liquid():
    # a state between the interpolated h_l and CoolProp's: quality from the table's
    # set, properties of the saturated liquid, never a failure
    fluid = Fluid("n-Pentane")
    P = 2.95e5
    sat = fluid.saturation_interpolated(P)
    for dh in (-1e-3, -1e-6, 1e-6):
        state = fluid.at_ph(P, sat.h_l + dh, sat)
        assert state.T == pytest.approx(PropsSI("T", "P", P, "Q", 0, "n-Pentane"), abs=1e-5)
        if state.rho is not None:
            assert state.rho == pytest.approx(PropsSI("D", "P", P, "Q", 0, "n-Pentane"),
                                              rel=1e-5)


@pytest.mark.parametrize("name, P, T_lo, T_hi", [
    ("Water", 5e5, 300.0, 420.0),          # a kettle's hot water
    ("MEG-30%", 3e5, 270.0, 350.0),        # a chiller's brine (CoolProp INCOMP)
    ("TVP1", 4e5, 400.0, 600.0),           # a heat-transfer oil (CoolProp INCOMP)
])
def test_temperature_table_against_coolprop(name, P, T_lo, T_hi):
    # T(h) every 2 K, cubic Hermite with the nodes' 1/cp: within 5e-4 K of PropsSI's
    # (P, h) inversion anywhere in the range (measured: 2e-8 K water, 3e-5 K MEG-30 %,
    # 2e-4 K TVP1), against the 0.1 K to which the issue holds exit temperatures
    fluid = make_fluid(name)
    table = EnthalpyTable.build(fluid, P, T_lo, T_hi)
    ref_name = name if isinstance(fluid, Fluid) else "INCOMP::" + (
        f"{fluid.code}[{fluid.mass_fraction}]" if fluid.mass_fraction else fluid.code)
    rng = random.Random(name)
    for _ in range(60):
        T = rng.uniform(T_lo, T_hi)
        h = PropsSI("H", "P", P, "T", T, ref_name)
        assert table.temperature(h) == pytest.approx(T, abs=5e-4)
    assert table.temperature(table.h_max + 1.0) is None
    assert isinstance(fluid, (Fluid, IncompressibleLiquid))
