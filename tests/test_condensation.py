"""Film condensation: Nusselt vertical and horizontal, the vertical-film regimes
(Kutateladze, Labuntsov), Shah (1979) in-tube.

Sources are named beside each check: CHECK-VALUES.md section 6b (Cengel's worked
examples, ht docstrings, rows computed with CoolProp property values frozen here).
"""
import math

import ht
import pytest
from property_sets import P3, R10, SETS, W1
from scipy.integrate import quad

from rating.correlations import get
from rating.correlations.condensation import (
    RE_TURBULENT,
    RE_WAVY,
    film_reynolds_vertical,
    nusselt_horizontal_tube,
    nusselt_kutateladze_labuntsov_local,
    nusselt_kutateladze_labuntsov_mean,
    nusselt_vertical_1916,
    shah_1979,
)

# Cengel, condensation example (vertical plate): steam at 1 atm on a 2 m high,
# 3 m wide plate at 80 degC; film properties at 90 degC (CHECK-VALUES 6b,
# [memory, recomputed]).
CENGEL_PLATE = dict(rho_l=965.3, rho_v=0.6, mu_l=0.315e-3, k_l=0.675, cp_l=4206.0)
CENGEL_H_LV = 2257e3


def _film(props):
    return {n: props[n] for n in ("rho_l", "rho_v", "mu_l", "k_l", "cp_l")}


# --------------------------------------------------------------------------
# Vertical surface
# --------------------------------------------------------------------------

def test_nusselt_vertical_ht_docstring():
    # ht.Nusselt_laminar docstring (1482.206403453679), = Hewitt, Shires & Bott (1994)
    # p. 578 (CHECK-VALUES 6b: 1482.21)
    htc = nusselt_vertical_1916(L=0.1, dT=20.0, rho_l=585.0, rho_v=7.0, mu_l=158.9e-6,
                                k_l=0.091, h_lv=776900.0)
    assert htc == pytest.approx(1482.206403, rel=1e-6)


def test_cengel_vertical_plate_wavy():
    # Cengel vertical-plate example: Re = 1287, h = 5848 W/m^2K, Q = 702 kW,
    # m = 0.303 kg/s (CHECK-VALUES 6b, 0.5 %). Measured: Re -0.26 % (Cengel rounds
    # the exponent 1/1.22 to 0.820), h +0.002 %.
    L, dT, area = 2.0, 20.0, 2.0 * 3.0
    Re = film_reynolds_vertical(L, dT, h_lv=CENGEL_H_LV, **CENGEL_PLATE)
    htc = nusselt_kutateladze_labuntsov_mean(Re, **CENGEL_PLATE)
    assert RE_WAVY < Re < RE_TURBULENT
    assert Re == pytest.approx(1287.0, rel=5e-3)
    assert htc == pytest.approx(5848.0, rel=5e-3)
    Q = htc * area * dT
    assert Q == pytest.approx(702e3, rel=5e-3)
    assert Q / (CENGEL_H_LV + 0.68 * CENGEL_PLATE["cp_l"] * dT) == pytest.approx(0.303, rel=5e-3)


def test_cengel_plate_plain_nusselt_is_the_other_form():
    # Same plate with Nusselt's 0.943 form and h_lv*: 4493 W/m^2K (CHECK-VALUES 6b,
    # "which form?" check); it must not be confused with the wavy value 5848.
    htc = nusselt_vertical_1916(2.0, 20.0, h_lv=CENGEL_H_LV, **CENGEL_PLATE)
    assert htc == pytest.approx(4493.0, rel=5e-3)


@pytest.mark.parametrize("name", sorted(SETS))
def test_laminar_branch_reproduces_nusselt_0943(name):
    # Independent routes to the same theory: Nusselt's 0.943 closed form against
    # inverting the Re-based mean 1.4675 Re^-1/3 K (2 sqrt(2)/3 = (4/3)^(4/3)/4^(1/4)).
    p = SETS[name]
    L, dT = 0.01, 0.5
    Re = film_reynolds_vertical(L, dT, h_lv=p["h_lv"], **_film(p))
    assert 0.0 < Re < RE_WAVY
    htc = nusselt_kutateladze_labuntsov_mean(Re, **_film(p))
    expected = nusselt_vertical_1916(L, dT, p["rho_l"], p["rho_v"], p["mu_l"], p["k_l"],
                                     p["h_lv"], cp_l=p["cp_l"])
    assert htc == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize("Re_f", [5.0, 29.0, 31.0, 300.0, 1599.0, 1601.0, 3000.0, 2e4])
@pytest.mark.parametrize("name", ["W1", "R10"])
def test_local_integrates_to_mean(name, Re_f):
    # A march with the local law must reproduce the mean: with
    # dz = mu_l h_lv / (4 dT htc_local) dRe, mean = Re_f / integral(dRe / htc_local).
    # Tolerance 0.5 %: the published constants (5.2, 8750, 253) join the branches
    # to 0.4 % at Re_f = 30 and 0.05 % at 1600.
    film = _film(SETS[name])
    points = [r for r in (RE_WAVY, RE_TURBULENT) if r < Re_f]
    integral, _ = quad(lambda r: 1.0 / nusselt_kutateladze_labuntsov_local(r, **film),
                       0.0, Re_f, points=points or None, limit=200)
    assert Re_f / integral == pytest.approx(
        nusselt_kutateladze_labuntsov_mean(Re_f, **film), rel=5e-3)


def test_mean_is_continuous_at_the_regime_switches():
    # Labuntsov's constants make the mean continuous at 1600 (8750 ~ 1.08 1600^1.22
    # - 5.2, 253 ~ 1600^0.75; measured jump 0.05 %); at 1800 (the switch some
    # textbooks quote) W1 would jump by 3.4 %.
    film = _film(W1)
    below = nusselt_kutateladze_labuntsov_mean(RE_TURBULENT * (1 - 1e-9), **film)
    above = nusselt_kutateladze_labuntsov_mean(RE_TURBULENT, **film)
    assert above == pytest.approx(below, rel=1e-3)
    below = nusselt_kutateladze_labuntsov_mean(RE_WAVY * (1 - 1e-9), **film)
    above = nusselt_kutateladze_labuntsov_mean(RE_WAVY, **film)
    assert above == pytest.approx(below, rel=5e-3)


@pytest.mark.parametrize("Re_f", [1700.0, 5000.0, 3e4])
def test_turbulent_mean_is_labuntsov(Re_f):
    # Labuntsov's mean as printed (CHECK-VALUES 6b brief; Cengel):
    # htc = Re k / (8750 + 58 Pr^-0.5 (Re^0.75 - 253)) (g/nu^2)^(1/3), nu = mu_l/rho_l.
    # At 1700 the wavy form would be 2.6 % higher: this pins the switch below 1800.
    p = W1
    scale = p["k_l"] * (9.80665 * p["rho_l"] ** 2 / p["mu_l"] ** 2) ** (1 / 3)
    expected = Re_f * scale / (8750.0 + 58.0 * p["Pr_l"] ** -0.5 * (Re_f**0.75 - 253.0))
    assert nusselt_kutateladze_labuntsov_mean(Re_f, **_film(p)) == pytest.approx(
        expected, rel=1e-3)  # rho_l^2 vs rho_l (rho_l - rho_v): 2e-4 for W1


def test_turbulent_local_is_labuntsov_nusselt_number():
    # Labuntsov's local law Nu = 0.023 Re^0.25 Pr^0.5 on the length (nu^2/g)^(1/3)
    # [Labuntsov 1957, as used by Cengel/HEDH; 1/43.5 = 0.02299].
    p = W1
    Re_f = 5000.0
    length = (p["mu_l"] ** 2 / (9.80665 * p["rho_l"] * (p["rho_l"] - p["rho_v"]))) ** (1 / 3)
    Nu = nusselt_kutateladze_labuntsov_local(Re_f, **_film(p)) * length / p["k_l"]
    assert Nu == pytest.approx(0.023 * Re_f**0.25 * p["Pr_l"] ** 0.5, rel=2e-3)


def test_vertical_limits():
    film = _film(W1)
    assert nusselt_kutateladze_labuntsov_local(0.0, **film) == math.inf
    assert nusselt_kutateladze_labuntsov_mean(0.0, **film) == math.inf
    assert film_reynolds_vertical(1.0, 0.0, h_lv=W1["h_lv"], **film) == 0.0
    assert nusselt_vertical_1916(1.0, 0.0, W1["rho_l"], W1["rho_v"], W1["mu_l"], W1["k_l"],
                                 W1["h_lv"]) == math.inf
    # the local coefficient falls along the laminar and wavy film
    values = [nusselt_kutateladze_labuntsov_local(r, **film) for r in (1.0, 10.0, 100.0, 1000.0)]
    assert values == sorted(values, reverse=True)


# --------------------------------------------------------------------------
# Horizontal tube
# --------------------------------------------------------------------------

def test_cengel_horizontal_tube():
    # Cengel horizontal-tube example: steam at 7.38 kPa on a 3 cm tube at 30 degC,
    # film properties at 35 degC: h = 9292 W/m^2K (CHECK-VALUES 6b, 0.5 %).
    htc = nusselt_horizontal_tube(D=0.03, dT=10.0, rho_l=994.0, rho_v=0.05, mu_l=0.720e-3,
                                  k_l=0.623, h_lv=2407e3, cp_l=4178.0)
    assert htc == pytest.approx(9292.0, rel=5e-3)


# Steam on a 25.4 mm horizontal tube, dT = 10 K (CHECK-VALUES 6b, [computed]).
# Property values from CoolProp 8.0.0 HEOS::Water, called once when this test was
# written and rounded to 7 s.f.: liquid at (T_sat - 5 K, P), vapour density and
# h_lv saturated at P. Columns: P, rho_l, mu_l, k_l, cp_l, rho_v, h_lv, expected
# htc with C = 0.725 and C = 0.729.
STEAM_TUBE_ROWS = [
    (2e5, 946.9314, 2.423714e-4, 0.6815035, 4235.833, 1.129074, 2201527.0, 12915.5, 12986.8),
    (3e5, 936.1047, 2.155823e-4, 0.6829445, 4258.540, 1.650820, 2163456.0, 13185.5, 13258.3),
    (5e5, 919.9816, 1.868557e-4, 0.6816515, 4298.727, 2.668048, 2108024.0, 13438.3, 13512.4),
]


@pytest.mark.parametrize("row", STEAM_TUBE_ROWS, ids=lambda r: f"{r[0] / 1e5:g}bar")
def test_horizontal_tube_steam_rows(row):
    _, rho_l, mu_l, k_l, cp_l, rho_v, h_lv, htc_725, htc_729 = row
    args = dict(D=0.0254, dT=10.0, rho_l=rho_l, rho_v=rho_v, mu_l=mu_l, k_l=k_l, h_lv=h_lv,
                cp_l=cp_l)
    assert nusselt_horizontal_tube(**args, C=0.725) == pytest.approx(htc_725, rel=1e-4)
    assert nusselt_horizontal_tube(**args) == pytest.approx(htc_729, rel=1e-4)


def test_kern_row_correction_is_one_sixth_power():
    # Kern (1958): mean of a column of N tubes = single tube x N^(-1/6), not
    # Nusselt's N^(-1/4) (which would give 0.595 for N = 8).
    args = (0.0254, 10.0, W1["rho_l"], W1["rho_v"], W1["mu_l"], W1["k_l"], W1["h_lv"])
    ratio = nusselt_horizontal_tube(*args, rows=8) / nusselt_horizontal_tube(*args)
    assert ratio == pytest.approx(0.7071068, rel=1e-6)
    assert nusselt_horizontal_tube(*args, rows=0) == nusselt_horizontal_tube(*args)
    assert get("nusselt_horizontal_tube").out_of_range({"rows": 0, "dT": 10.0})


# --------------------------------------------------------------------------
# Shah (1979), in-tube
# --------------------------------------------------------------------------

# Steam 2 bar, D = 20 mm, saturated-liquid props as printed in CHECK-VALUES 6b
# (expected values computed there with ht.Shah, own = ht, 1e-4).
STEAM_2BAR = dict(mu_l=231.60e-6, k_l=0.6823, cp_l=4243.9, P=2e5, P_crit=22.064e6)
RHO_L_2BAR = 942.937


@pytest.mark.parametrize("G, x, expected", [
    (50.0, 0.5, 10004.0), (100.0, 0.5, 17417.9), (100.0, 0.9, 24655.2), (300.0, 0.5, 41946.3),
])
def test_shah_steam_rows(G, x, expected):
    htc = shah_1979(G, x, 0.02, **STEAM_2BAR)
    assert htc == pytest.approx(expected, rel=1e-4)
    # independent implementation: ht.Shah takes the mass flow and the density
    m = G * math.pi * 0.02**2 / 4.0
    assert htc == pytest.approx(ht.Shah(m=m, x=x, D=0.02, rhol=RHO_L_2BAR, mul=231.60e-6,
                                        kl=0.6823, Cpl=4243.9, P=2e5, Pc=22.064e6), rel=1e-9)


def test_shah_ht_docstring():
    # ht.Shah(m=1, x=0.4, D=0.3, rhol=800, mul=1e-5, kl=0.6, Cpl=2300, P=1e6, Pc=2e7)
    # = 2561.26 (CHECK-VALUES 6b)
    G = 1.0 / (math.pi * 0.3**2 / 4.0)
    htc = shah_1979(G, 0.4, 0.3, mu_l=1e-5, k_l=0.6, cp_l=2300.0, P=1e6, P_crit=2e7)
    assert htc == pytest.approx(2561.26, rel=1e-6)


@pytest.mark.parametrize("name", sorted(SETS))
def test_shah_limits(name):
    p = SETS[name]
    args = dict(G=200.0, D=0.02, mu_l=p["mu_l"], k_l=p["k_l"], cp_l=p["cp_l"], P=p["P"],
                P_crit=p["P_crit"])
    # single-phase limit x -> 0: the all-liquid coefficient
    # (independent implementation: ht.turbulent_Dittus_Boelter)
    Re = 200.0 * 0.02 / p["mu_l"]
    htc_lo = ht.turbulent_Dittus_Boelter(Re, p["Pr_l"]) * p["k_l"] / 0.02
    assert shah_1979(x=0.0, **args) == pytest.approx(htc_lo, rel=1e-5)
    assert shah_1979(x=1e-6, **args) == pytest.approx(htc_lo, rel=1e-3)
    assert shah_1979(x=-0.2, **args) == shah_1979(x=0.0, **args)
    assert shah_1979(x=1.0, **args) == 0.0
    assert shah_1979(x=1.3, **args) == 0.0
    assert shah_1979(x=0.5, **args) > htc_lo


def test_shah_out_of_range_reported():
    state = dict(G=500.0, x=0.1, D=0.02, P=P3["P"], P_crit=P3["P_crit"], mu_l=P3["mu_l"],
                 k_l=P3["k_l"], cp_l=P3["cp_l"])
    messages = get("shah_1979").out_of_range(state)
    assert any("G = 500" in m for m in messages)
    state["G"] = 100.0
    assert get("shah_1979").out_of_range(state) == []


# --------------------------------------------------------------------------
# Every method positive and finite over the property sets
# --------------------------------------------------------------------------

@pytest.mark.parametrize("name", sorted(SETS))
def test_positive_and_finite_over_states(name):
    p = SETS[name]
    film = _film(p)
    for dT in (0.5, 5.0, 30.0):
        for L in (0.05, 1.0, 6.0):
            Re = film_reynolds_vertical(L, dT, h_lv=p["h_lv"], **film)
            for value in (nusselt_vertical_1916(L, dT, p["rho_l"], p["rho_v"], p["mu_l"],
                                                p["k_l"], p["h_lv"], cp_l=p["cp_l"]),
                          nusselt_kutateladze_labuntsov_mean(Re, **film),
                          nusselt_kutateladze_labuntsov_local(Re, **film),
                          nusselt_horizontal_tube(0.025, dT, p["rho_l"], p["rho_v"],
                                                  p["mu_l"], p["k_l"], p["h_lv"], rows=10)):
                assert math.isfinite(value) and value > 0.0
    for G in (20.0, 200.0, 1000.0):
        for x in (0.01, 0.3, 0.7, 0.99):
            value = shah_1979(G, x, 0.02, p["mu_l"], p["k_l"], p["cp_l"], p["P"], p["P_crit"])
            assert math.isfinite(value) and value > 0.0


def test_registered_in_condensation_family():
    from rating.correlations import methods
    names = {m.name for m in methods("condensation")}
    assert {"nusselt_vertical_1916", "nusselt_kutateladze_labuntsov_mean",
            "nusselt_kutateladze_labuntsov_local", "nusselt_horizontal_tube",
            "shah_1979"} <= names
    # dispatch from a state mapping (R10 props, a local film Reynolds number)
    state = dict(R10, Re_f=500.0)
    assert get("nusselt_kutateladze_labuntsov_local")(state) == pytest.approx(
        nusselt_kutateladze_labuntsov_local(500.0, **_film(R10)))
