"""Dryout / critical heat flux in tubes: rating.correlations.dryout.

Check values from the project's CHECK-VALUES.md section 7 (cited per test).
Water states other than the fixed sets of property_sets.py are saturated
HEOS::Water values from CoolProp 8.0.0 (7 significant figures; they agree with
CHECK-VALUES.md section 1c at its rounding), typed in here so that a CoolProp
release cannot move them.
"""
import math
from itertools import pairwise
from pathlib import Path

import pytest
from scipy.optimize import brentq

from property_sets import P3, R10, W1
from rating.correlations import dryout, registry
from rating.correlations.dryout import (
    bowring_1972, groeneveld_2006, katto_ohno_1984, katto_ohno_local,
)

# Saturated water [computed: CoolProp 8.0.0 HEOS::Water, PropsSI(..., 'P', P, 'Q', 0/1)]
WATER_1MPA = dict(rho_l=887.1293, rho_v=5.145041, sigma=0.04206474, h_lv=2014594.0)
WATER_7MPA = dict(rho_l=739.724, rho_v=36.52509, sigma=0.01745984, h_lv=1504970.0)
WATER_18MPA = dict(rho_l=543.5379, rho_v=133.3029, sigma=0.002395969, h_lv=777744.4)


def _props(s):
    return {k: s[k] for k in ("rho_l", "rho_v", "sigma", "h_lv")}


def x_exit(q, G, D, L, h_lv):
    """Exit quality of a saturated-inlet tube heated uniformly at q (energy balance)."""
    return 4.0 * q * L / (G * D * h_lv)


# ---------------------------------------------------------------- look-up table

# CHECK-VALUES 7a: entries of the 2006 LUT, kW/m^2, 8 mm tube. Source:
# Groeneveld et al. (2007) Nucl. Eng. Des. 237, 1909-1922, via the public
# transcription named there. Columns x = 0, 0.1, 0.2, 0.3, 0.5, 0.7.
LUT_ROWS = [
    (0.1, 0, (1142, 415, 223, 165, 123, 110)),
    (0.1, 100, (2103, 1275, 885, 811, 715, 600)),
    (0.1, 500, (2685, 1808, 1347, 1303, 1193, 605)),
    (0.1, 1000, (3012, 2349, 2000, 1930, 1165, 322)),
    (0.3, 300, (3011, 2263, 1657, 1576, 1403, 722)),
    (1, 100, (3609, 2549, 2216, 1949, 1541, 1078)),
    (1, 500, (4124, 3995, 3953, 3790, 3445, 1067)),
    (1, 1000, (4736, 4351, 4099, 3896, 1199, 391)),
    (2, 500, (6084, 5280, 4584, 4197, 3695, 1898)),
    (5, 1000, (6568, 5726, 4796, 4194, 2974, 1683)),
    (7, 2000, (5327, 4020, 3174, 2566, 793, 267)),
    (10, 1000, (4439, 3793, 2886, 2280, 1183, 156)),
]
LUT_ENTRIES = [(P, G, x, v) for P, G, vals in LUT_ROWS
               for x, v in zip((0.0, 0.1, 0.2, 0.3, 0.5, 0.7), vals)]
LUT_ENTRIES.append((1, 500, 0.6, 1564))  # CHECK-VALUES 7a, "Also" line


@pytest.mark.parametrize("P_MPa, G, x, expected", LUT_ENTRIES)
def test_lut_entries_exact(P_MPa, G, x, expected):
    # CHECK-VALUES 7a table entries: exact at the nodes of an 8 mm tube (K = 1)
    assert groeneveld_2006(P_MPa * 1e6, G, x, 0.008) == expected * 1e3


@pytest.mark.parametrize("P_MPa, G, x, expected, rel", [
    (0.2, 400, 0.25, 1446.2, 1e-4),   # CHECK-VALUES 7a interpolation checks
    (0.5, 600, 0.15, 2549.2, 1e-4),
    (1.0, 500, 0.55, 2504.5, 1e-12),  # midpoint of 3445 and 1564: exact
    (7.0, 1750, 0.12, 4092.5, 1e-4),
])
def test_lut_trilinear_interpolation(P_MPa, G, x, expected, rel):
    assert groeneveld_2006(P_MPa * 1e6, G, x, 0.008) == pytest.approx(expected * 1e3, rel=rel)


def _raw_entry(iP, iG, ix):
    """Entry read from the package data file by the layout rule of rating/data/README.md."""
    path = Path(dryout.__file__).parent.parent / "data" / "chf_lookup_table_2006.txt"
    lines = path.read_text().splitlines()
    assert len(lines) == 504
    return float(lines[iP * 21 + iG].split()[ix])


def test_data_file_layout_spot_checks():
    # rating/data/README.md first-line check: P = 0.1 MPa, G = 0, x = 0 -> 1142
    assert _raw_entry(0, 0, 7) == 1142
    # two more entries located by the README's layout rule, values from CHECK-VALUES 7a:
    # P = 1 MPa (block 3), G = 500 (line 4), x = 0.6 (column 18) -> 1564
    assert _raw_entry(3, 4, 18) == 1564
    # P = 10 MPa (block 12), G = 1000 (line 6), x = 0.7 (column 19) -> 156
    assert _raw_entry(12, 6, 19) == 156
    # and the loaded table agrees with the file at the last entry (21 MPa, 8000, x = 1)
    assert dryout.lut_table()[-1] == 1e3 * _raw_entry(23, 20, 22)


def test_diameter_factor():
    q8 = groeneveld_2006(1e6, 500, 0.3, 0.008)
    # CHECK-VALUES 7a: K1 = 0.63246 at D = 20 mm
    assert groeneveld_2006(1e6, 500, 0.3, 0.020) / q8 == pytest.approx(0.63246, rel=1e-5)
    # Groeneveld et al. (2007): the 25 mm value above 25 mm (K = 0.566, "0.57" in 7a)
    assert groeneveld_2006(1e6, 500, 0.3, 0.050) / q8 == pytest.approx(0.5657, rel=1e-4)
    # below the paper's 3 mm bound D is held at 3 mm, and the range reports it
    assert groeneveld_2006(1e6, 500, 0.3, 0.002) / q8 == pytest.approx(math.sqrt(8 / 3), rel=1e-12)
    m = registry.get("groeneveld_2006")
    assert m.out_of_range(dict(P=1e6, G=500, x=0.3, D=0.002))
    assert not m.out_of_range(dict(P=1e6, G=500, x=0.3, D=0.003))


def test_lut_clamps_outside_table_and_reports():
    m = registry.get("groeneveld_2006")
    assert groeneveld_2006(25e6, 500, 0.3, 0.008) == groeneveld_2006(21e6, 500, 0.3, 0.008)
    assert groeneveld_2006(1e6, 9000, 0.3, 0.008) == groeneveld_2006(1e6, 8000, 0.3, 0.008)
    assert groeneveld_2006(1e6, 500, -0.8, 0.008) == groeneveld_2006(1e6, 500, -0.5, 0.008)
    assert groeneveld_2006(5e4, 500, 0.3, 0.008) == groeneveld_2006(1e5, 500, 0.3, 0.008)
    for state in (dict(P=25e6, G=500, x=0.3, D=0.01), dict(P=1e6, G=9000, x=0.3, D=0.01),
                  dict(P=1e6, G=500, x=-0.8, D=0.01), dict(P=5e4, G=500, x=0.3, D=0.01)):
        assert m.out_of_range(state), state
    assert not m.out_of_range(dict(P=1e6, G=500, x=0.3, D=0.01))


def lut_uniform_tube(P, G, D, L, h_lv):
    """Saturated-inlet uniformly heated tube: solve q = LUT(P, G, x_exit(q), D)."""
    q = brentq(lambda q: groeneveld_2006(P, G, x_exit(q, G, D, L, h_lv), D) - q,
               1e3, 2e7, xtol=1e-6, rtol=1e-13)
    return q, x_exit(q, G, D, L, h_lv)


@pytest.mark.parametrize("P, h_lv, q_exp, x_exp", [
    (1e6, WATER_1MPA["h_lv"], 1005.1e3, 0.5987),   # CHECK-VALUES 7a uniform tube
    (101325.0, W1["h_lv"], 787.0e3, 0.4185),       # same, P = 0.101325 MPa
])
def test_lut_uniformly_heated_tube(P, h_lv, q_exp, x_exp):
    q, x = lut_uniform_tube(P, 500.0, 0.020, 3.0, h_lv)
    assert q == pytest.approx(q_exp, rel=1e-3)
    assert x == pytest.approx(x_exp, rel=1e-3)


# ---------------------------------------------------------------- Bowring, Katto-Ohno

# CHECK-VALUES 7b [computed: implementation values]: uniformly heated vertical
# tube, saturated inlet. (case, G, L, D, water state, P, Bowring kW/m^2,
# Katto-Ohno kW/m^2, Katto-Ohno x_exit, LUT kW/m^2, rel. tolerance).
# The 7 MPa values are printed to 4 figures: tolerance 2.5e-4 for their rounding.
CASES_7B = [
    ("1MPa_G500", 500.0, 3.0, 0.020, WATER_1MPA, 1e6, 1010.77, 1274.87, 0.759, 1005.1, 1e-4),
    ("1MPa_G1000", 1000.0, 2.0, 0.010, WATER_1MPA, 1e6, 1242.75, 1662.76, 0.660, 1242.0, 1e-4),
    ("7MPa_G2000", 2000.0, 1.0, 0.008, WATER_7MPA, 7e6, 2208.0, 2149.0, 0.357, 2207.7, 2.5e-4),
]


@pytest.mark.parametrize("case", CASES_7B, ids=[c[0] for c in CASES_7B])
def test_bowring_7b(case):
    _, G, L, D, w, P, q_bow, *_rest, rel = case
    assert bowring_1972(P, G, D, L, w["h_lv"]) == pytest.approx(q_bow * 1e3, rel=rel)


def test_bowring_subcooled_inlet_from_7b_intermediates():
    # CHECK-VALUES 7b, 1 MPa case: A = 3.34345e6, B = 2.5, C = 0.307834;
    # q = (A + B dh_in)/(C + L) with 200 kJ/kg of inlet subcooling
    w = WATER_1MPA
    expected = (3.34345e6 + 2.5 * 200e3) / (0.307834 + 3.0)
    q = bowring_1972(1e6, 500.0, 0.020, 3.0, w["h_lv"], dh_in=200e3)
    assert q == pytest.approx(expected, rel=1e-5)


@pytest.mark.parametrize("case", CASES_7B, ids=[c[0] for c in CASES_7B])
def test_katto_ohno_7b(case):
    _, G, L, D, w, _P, _qb, q_ko, x_ko, *_rest, rel = case
    q = katto_ohno_1984(G, D, L, **w)
    assert q == pytest.approx(q_ko * 1e3, rel=rel)
    assert x_exit(q, G, D, L, w["h_lv"]) == pytest.approx(x_ko, abs=6e-4)


def test_katto_ohno_r134a_7b():
    # CHECK-VALUES 7b: R134a 10 degC (R10), G = 500, L = 2 m, D = 10 mm
    # -> 99.78 kW/m^2, x_exit 0.837
    q = katto_ohno_1984(500.0, 0.010, 2.0, **_props(R10))
    assert q == pytest.approx(99.78e3, rel=1e-4)
    assert x_exit(q, 500.0, 0.010, 2.0, R10["h_lv"]) == pytest.approx(0.837, abs=6e-4)


def test_katto_ohno_subcooling_factor_7b():
    # CHECK-VALUES 7b, 1 MPa case: K = 1.17431; q = q_co (1 + K dh_in / h_lv)
    w = WATER_1MPA
    q0 = katto_ohno_1984(500.0, 0.020, 3.0, **w)
    q1 = katto_ohno_1984(500.0, 0.020, 3.0, **w, dh_in=0.1 * w["h_lv"])
    assert (q1 / q0 - 1.0) / 0.1 == pytest.approx(1.17431, rel=1e-4)


@pytest.mark.parametrize("case", CASES_7B, ids=[c[0] for c in CASES_7B])
def test_bowring_agrees_with_lut(case):
    # CHECK-VALUES 7b: Bowring within 1 % of the LUT uniform-tube result at 1 and 7 MPa
    _, G, L, D, w, P, *_ = case
    q_lut, _ = lut_uniform_tube(P, G, D, L, w["h_lv"])
    assert bowring_1972(P, G, D, L, w["h_lv"]) == pytest.approx(q_lut, rel=0.01)


def test_katto_ohno_high_above_lut_at_low_pressure():
    # CHECK-VALUES 7b and 10.7: Katto-Ohno 25-60 % above the LUT at <= 1 MPa,
    # within about 10 % at 7 MPa (the docstring's warning)
    for _, G, L, D, w, P, *_ in CASES_7B:
        ratio = katto_ohno_1984(G, D, L, **w) / lut_uniform_tube(P, G, D, L, w["h_lv"])[0]
        if P <= 1e6:
            assert 1.25 < ratio < 1.60
        else:
            assert abs(ratio - 1.0) < 0.10


# ---------------------------------------------------------------- Katto-Ohno at local quality

@pytest.mark.parametrize("case", CASES_7B, ids=[c[0] for c in CASES_7B])
def test_katto_ohno_local_7b(case):
    # CHECK-VALUES 7b: at the exit quality of the printed tube CHF the local form
    # returns that CHF. x is taken from the printed q by the energy balance (the
    # printed x has 3 decimals only); q moves up to 2.5 times the relative change
    # of x here, hence 4 times the rounding tolerance of the printed q.
    _, G, L, D, w, _P, _qb, q_ko, *_rest, rel = case
    x = x_exit(q_ko * 1e3, G, D, L, w["h_lv"])
    assert katto_ohno_local(G, x, D, **w) == pytest.approx(q_ko * 1e3, rel=4 * rel)


STATES = [W1, P3, R10, WATER_1MPA, WATER_18MPA]
STATE_IDS = ["W1", "P3", "R10", "water_1MPa", "water_18MPa"]


@pytest.mark.parametrize("state", STATES, ids=STATE_IDS)
@pytest.mark.parametrize("G", [300.0, 1000.0, 3000.0])
@pytest.mark.parametrize("L", [0.05, 0.2])
def test_katto_ohno_local_inverts_the_tube_form(state, G, L):
    # Feeding the local recast the exit quality of katto_ohno_1984 gives back that
    # tube's CHF (short tubes, where the exit quality rises with L; rho_v/rho_l
    # from 0.0006 to 0.25, both sets of branches)
    D, p = 0.010, _props(state)
    q = katto_ohno_1984(G, D, L, **p)
    assert katto_ohno_local(G, x_exit(q, G, D, L, p["h_lv"]), D, **p) == pytest.approx(q, rel=1e-8)


@pytest.mark.parametrize("state", STATES, ids=STATE_IDS)
@pytest.mark.parametrize("G", [100.0, 300.0, 1000.0, 3000.0])
@pytest.mark.parametrize("L", [0.5, 1.0, 2.0, 4.0])
def test_katto_ohno_local_returns_the_largest_root(state, G, L):
    # Longer tubes: Katto-Ohno's exit quality is not monotonic in L (branch
    # changes, fall in long tubes), so the same x can have several roots. The
    # result must be a root, q = KO(x G D h_lv / (4 q)), and not below the CHF of
    # the tube that produced x (or 0 where x lies above every reachable exit quality).
    D, p = 0.010, _props(state)
    q = katto_ohno_1984(G, D, L, **p)
    x = x_exit(q, G, D, L, p["h_lv"])
    q_loc = katto_ohno_local(G, x, D, **p)
    if x >= 1.0:  # Katto-Ohno overshoots x = 1 at low G; the local form returns 0 there
        assert q_loc == 0.0
        return
    if q_loc == 0.0:
        pytest.fail(f"no root found at x = {x:.4f}, which a tube of L = {L} m reaches")
    L_loc = x * G * D * p["h_lv"] / (4.0 * q_loc)
    assert katto_ohno_1984(G, D, L_loc, **p) == pytest.approx(q_loc, rel=1e-6)
    assert q_loc >= q * (1.0 - 1e-8)


def test_katto_ohno_local_limits():
    p = _props(W1)
    assert katto_ohno_local(500.0, 0.0, 0.02, **p) == math.inf     # no boiling length
    assert katto_ohno_local(500.0, -0.1, 0.02, **p) == math.inf
    assert katto_ohno_local(500.0, 1.0, 0.02, **p) == 0.0
    assert katto_ohno_local(0.0, 0.3, 0.02, **p) == 0.0
    # above the largest exit quality Katto-Ohno reaches (about 0.83 here) -> 0
    assert katto_ohno_local(500.0, 0.9, 0.02, **p) == 0.0
    assert katto_ohno_local(500.0, 0.8, 0.02, **p) > 0.0


@pytest.mark.parametrize("state", [W1, P3, R10], ids=["W1", "P3", "R10"])
def test_katto_ohno_local_falls_with_quality(state):
    p = _props(state)
    qs = [katto_ohno_local(500.0, x, 0.02, **p) for x in (0.01, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5)]
    assert all(math.isfinite(q) and q > 0 for q in qs)
    assert all(a > b for a, b in pairwise(qs))


def test_registered_in_tube_dryout_family():
    names = {m.name for m in registry.methods("tube_dryout")}
    assert {"groeneveld_2006", "bowring_1972", "katto_ohno_1984", "katto_ohno_local"} <= names
    m = registry.get("katto_ohno_local")
    # the march calls it with local conditions only
    assert set(m.inputs) == {"G", "x", "D", "rho_l", "rho_v", "sigma", "h_lv"}
    state = dict(W1, G=500.0, x=0.3, D=0.02)
    assert m(state) == katto_ohno_local(500.0, 0.3, 0.02, **_props(W1))
    assert registry.get("bowring_1972").out_of_range(dict(P=101325.0, G=500.0, D=0.02, L=3.0))
