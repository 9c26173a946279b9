"""Flow-pattern maps: Wojtan et al. (2005) horizontal, Taitel-Bornea-Dukler (1980) vertical.

No published numerical map point was available to copy, so the checks are
(a) independent re-derivations of a boundary (forward X_tt at x_IA, exact
stratified geometry against Biberg's approximation, the drift relation at the
bubbly-slug boundary), (b) published statements about where a boundary lies
(marked [memory] where recalled), (c) the CHECK-VALUES.md section 5c void
fractions, and (d) the direction in which patterns change with G, x and q.
"""
import itertools
import math

import pytest

from property_sets import P3, R10, W1
from rating.correlations import get, methods
from rating.correlations.flow_pattern import (
    PATTERNS, taitel_bornea_dukler_1980, wojtan_dryout_qualities, wojtan_transitions,
    wojtan_ursenbacher_thome_2005,
)

D_WOJTAN = 0.01384  # Wojtan et al. (2005) test tube, 13.84 mm

# Air-water at 25 degC, 1 atm, the fluids of Taitel, Bornea & Dukler (1980):
# handbook values (Incropera & DeWitt, Tables A.4 and A.6) [memory].
AIR_WATER = dict(rho_l=997.0, rho_v=1.184, mu_l=8.90e-4, sigma=0.0720)


def horizontal(G, x, q, D=D_WOJTAN, p=R10):
    return wojtan_ursenbacher_thome_2005(G, x, D, q, p["rho_l"], p["rho_v"], p["mu_l"],
                                         p["mu_v"], p["sigma"], p["h_lv"])


def transitions(G, x, q, D=D_WOJTAN, p=R10):
    return wojtan_transitions(G, x, D, q, p["rho_l"], p["rho_v"], p["mu_l"], p["mu_v"],
                              p["sigma"], p["h_lv"])


def dryout_qualities(G, q, D=D_WOJTAN, p=R10):
    return wojtan_dryout_qualities(G, q, D, p["rho_l"], p["rho_v"], p["sigma"], p["h_lv"])


def vertical(u_gs, u_ls, D, z=None, p=AIR_WATER):
    """Pattern from superficial velocities [m/s] (the axes of the TBD map)."""
    G = p["rho_l"] * u_ls + p["rho_v"] * u_gs
    return taitel_bornea_dukler_1980(G, p["rho_v"] * u_gs / G, D, p["rho_l"], p["rho_v"],
                                     p["mu_l"], p["sigma"], z=z)


def boundary(f, lo, hi, n=80):
    """Geometric bisection for the point where f changes value between lo and hi."""
    below = f(lo)
    assert f(hi) != below
    for _ in range(n):
        mid = math.sqrt(lo * hi)
        lo, hi = (mid, hi) if f(mid) == below else (lo, mid)
    return math.sqrt(lo * hi)


def first_appearances(seq):
    out = []
    for item in seq:
        if not out or out[-1] != item:
            out.append(item)
    return out


# ------------------------------------------------------------ horizontal map

@pytest.mark.parametrize("G", [100.0, 300.0])
def test_x_ia_is_where_kattan_xtt_equals_0_34(G):
    # Kattan et al. (1998): x_IA is the quality at which X_tt = 0.34, with their
    # X_tt exponents 0.875 / 0.5 / 0.125. Forward evaluation of X_tt at the
    # returned x_IA, R134a (R10 set), D = 13.84 mm.
    x_ia = transitions(G, 0.2, 10e3).x_IA
    xtt = ((1 - x_ia) / x_ia) ** 0.875 * (R10["rho_v"] / R10["rho_l"]) ** 0.5 \
        * (R10["mu_l"] / R10["mu_v"]) ** 0.125
    assert xtt == pytest.approx(0.34, rel=1e-9)
    # a property boundary: the same at both mass fluxes, either side of x_IA, any D
    assert transitions(300.0, 0.6, 30e3, D=0.008).x_IA == pytest.approx(x_ia, rel=1e-12)
    assert 0.30 < x_ia < 0.37   # [computed] 0.33346 for R134a at 10 degC


def test_pattern_changes_at_x_ia_at_G300():
    # At G = 300, above G_wavy near x_IA (212 kg/m^2/s [computed]), the map goes
    # intermittent -> annular exactly at x_IA (Kattan 1998, Wojtan 2005).
    x_ia = transitions(300.0, 0.3, 10e3).x_IA
    assert horizontal(300.0, x_ia * (1 - 1e-6), 10e3) == "intermittent"
    assert horizontal(300.0, x_ia * (1 + 1e-6), 10e3) == "annular"


def test_G100_is_stratified_wavy_either_side_of_x_ia():
    # At G = 100 the state lies below G_wavy(x_IA) ~ 200: Wojtan's slug/stratified-
    # wavy zone left of x_IA and stratified-wavy right of it (both reported
    # "stratified-wavy"); x_IA does not change the pattern there.
    x_ia = transitions(100.0, 0.3, 10e3).x_IA
    assert horizontal(100.0, x_ia * 0.9, 10e3) == "stratified-wavy"
    assert horizontal(100.0, x_ia * 1.1, 10e3) == "stratified-wavy"


@pytest.mark.parametrize("props, x, expected", [
    (R10, 0.1, 0.764425), (R10, 0.5, 0.924666), (W1, 0.1, 0.895891),
    (W1, 0.5, 0.942612), (P3, 0.1, 0.785066), (P3, 0.5, 0.927885),
])
def test_void_fraction_is_steiner_rouhani_axelsson(props, x, expected):
    # CHECK-VALUES.md section 5c, Rouhani-Axelsson in Steiner's horizontal form,
    # G = 500, D = 20 mm (= fluids.Steiner); table rounded to 6 decimals.
    assert transitions(500.0, x, 50e3, D=0.020, p=props).void_fraction == \
        pytest.approx(expected, abs=1.5e-6)


def _exact_half_wet_angle(eps):
    # stratified geometry: A_L / A = (delta - sin(delta) cos(delta)) / pi
    lo, hi = 0.0, math.pi
    for _ in range(100):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if (mid - math.sin(mid) * math.cos(mid)) / math.pi < 1 - eps else (lo, mid)
    return 0.5 * (lo + hi)


@pytest.mark.parametrize("G, x", list(itertools.product([20.0, 100.0, 500.0], [0.001, 0.05, 0.3, 0.7, 0.99])))
def test_stratified_angle_matches_exact_geometry(G, x):
    # Biberg (1999) states his explicit approximation is within about 0.002 rad
    # of the exact wetted angle [memory]; exact angle by bisection (independent).
    t = transitions(G, x, 10e3)
    delta_biberg = math.pi - 0.5 * t.theta_strat
    assert abs(delta_biberg - _exact_half_wet_angle(t.void_fraction)) < 0.002


@pytest.mark.parametrize("x, expected", [
    (0.2, ["stratified", "stratified-wavy", "slug", "intermittent"]),
    (0.5, ["stratified", "stratified-wavy", "annular"]),
])
def test_higher_mass_flux_leaves_stratified_flow(x, expected):
    # Kattan (1998) / Wojtan (2005) map structure: at fixed x, rising G crosses
    # G_strat, then G_wavy (and, left of x_IA, the slug zone) [memory].
    seq = [horizontal(G, x, 10e3) for G in (10.0 * 1.03 ** i for i in range(160)) if G <= 1000.0]
    assert first_appearances(seq) == expected


@pytest.mark.parametrize("G", [300.0, 500.0])
def test_higher_quality_goes_annular_then_dryout_then_mist(G):
    # Wojtan (2005) Part I: along an evaporating tube at G = 300-500, q = 7.5 kW/m^2
    # the flow is slug/intermittent, annular, dryout, then mist [memory].
    seq = [horizontal(G, i / 1000.0, 7.5e3) for i in range(1, 1000)]
    assert first_appearances(seq) == ["slug", "intermittent", "annular", "dryout", "mist"]


def test_dryout_onset_comes_earlier_at_higher_heat_flux_and_mass_flux():
    # Wojtan (2005) Part II / Mori (2000): x_di falls with q and with G [memory].
    x_di_q = [dryout_qualities(300.0, q)[0] for q in (2e3, 7.5e3, 20e3, 57.5e3)]
    assert all(a > b for a, b in zip(x_di_q, x_di_q[1:]))
    x_di_G = [dryout_qualities(G, 20e3)[0] for G in (70.0, 200.0, 400.0, 700.0)]
    assert all(a > b for a, b in zip(x_di_G, x_di_G[1:]))
    for G, q in itertools.product((70.0, 300.0, 700.0), (2e3, 57.5e3)):
        x_di, x_de = dryout_qualities(G, q)
        assert 0.0 < x_di <= x_de <= 1.0


def test_adiabatic_dryout_limits():
    # q = 0: no q/q_crit term, x_di = 0.58 e^0.52 (by hand 0.975576) for any G;
    # x_de = 0.61 e^0.57 > 1 is capped at 1 (documented).
    for G in (0.0, 300.0, 5000.0):
        x_di, x_de = dryout_qualities(G, 0.0)
        assert x_di == pytest.approx(0.975576, abs=1e-6)
        assert x_de == 1.0
    assert dryout_qualities(300.0, -1e4) == dryout_qualities(300.0, 0.0)


@pytest.mark.parametrize("G, q", list(itertools.product([100.0, 300.0, 700.0], [20e3, 50e3])))
def test_closed_form_boundaries_invert_dryout_qualities(G, q):
    # The papers give both x_di(G) and G_dryout(x) = [...]^0.926 (0.926 ~ 1/1.08);
    # the two published forms must agree to their rounding (< 0.5 %).
    x_di, x_de = dryout_qualities(G, q)
    assert transitions(G, x_di, q).G_dryout == pytest.approx(G, rel=5e-3)
    if x_de < 1.0:
        assert transitions(G, x_de, q).G_mist == pytest.approx(G, rel=5e-3)


def test_heat_flux_raises_stratified_wavy_boundary_at_high_quality():
    # Kattan (1998): the F1(q), F2(q) terms raise G_wavy at high x with heat flux
    # (earlier dry-out of the top of the tube) [memory].
    g_wavy = [transitions(300.0, 0.8, q).G_wavy for q in (0.0, 5e3, 20e3, 50e3)]
    assert all(a < b for a, b in zip(g_wavy, g_wavy[1:]))


def test_horizontal_limits_and_never_nan():
    assert horizontal(300.0, 0.0, 10e3) == "single-phase liquid"
    assert horizontal(300.0, -0.1, 10e3) == "single-phase liquid"
    assert horizontal(300.0, 1.0, 10e3) == "single-phase vapour"
    assert horizontal(0.0, 0.5, 10e3) == "stratified"
    assert horizontal(1e-6, 0.5, 10e3) == "stratified"
    grid = itertools.product(
        (R10, W1, P3), (0.0, 1e-300, 1e-3, 50.0, 300.0, 700.0, 1e5),
        (0.0, 1e-300, 1e-12, 1e-4, 0.3, 0.9, 1 - 1e-12, 1.0),
        (-1e4, 0.0, 1e3, 57.5e3, 1e7), (0.002, 0.01384, 0.05))
    for p, G, x, q, D in grid:
        assert horizontal(G, x, q, D, p) in PATTERNS
        t = transitions(G, x, q, D, p)
        assert not any(math.isnan(v) for v in t), (G, x, q, D, t)


def test_horizontal_registry_and_range():
    m = get("wojtan_ursenbacher_thome_2005")
    assert m in methods("flow_pattern")
    state = dict(R10, G=300.0, x=0.5, D=D_WOJTAN, q=10e3)
    assert m(state) == "annular"
    assert m.out_of_range(state) == []
    assert any("G" in msg for msg in m.out_of_range(dict(state, G=40.0)))
    assert any("D" in msg for msg in m.out_of_range(dict(state, D=0.025)))


# -------------------------------------------------------------- vertical map

@pytest.mark.parametrize("D, u_ls", [(0.051, 0.01), (0.051, 0.3), (0.025, 0.01), (0.025, 1.0)])
def test_annular_transition_air_water(D, u_ls):
    # Taitel, Bornea & Dukler (1980): for air-water at 1 atm the churn/slug ->
    # annular transition lies at U_GS ~ 10-15 m/s and, by their criterion,
    # depends on neither D nor the liquid rate [memory].
    u_gs = boundary(lambda u: vertical(u, u_ls, D) == "annular", 1.0, 100.0)
    assert 10.0 <= u_gs <= 15.0
    u_ref = boundary(lambda u: vertical(u, 0.1, 0.051) == "annular", 1.0, 100.0)
    assert u_gs == pytest.approx(u_ref, rel=1e-9)


def test_bubbly_flow_needs_a_large_tube():
    # Taitel et al. (1980): at low flow rates bubbly flow exists only in tubes
    # larger than about 5 cm for air-water; smaller tubes go straight to slug [memory].
    d_crit = boundary(lambda d: vertical(0.02, 0.1, d), 0.01, 0.2)
    assert 0.045 < d_crit < 0.06
    assert vertical(0.02, 0.1, 0.04) == "slug"
    assert vertical(0.02, 0.1, 0.10) == "bubbly"


def test_bubbly_slug_boundary_is_at_void_fraction_0_25():
    # Taitel et al. (1980): bubbly -> slug when the void fraction reaches 0.25,
    # bubbles rising at the Harmathy velocity, about 0.25 m/s for air in water
    # (common practice). Void at the found boundary from U_GS/a - U_LS/(1-a) = 0.25.
    u_ls = 0.5
    u_gs = boundary(lambda u: vertical(u, u_ls, 0.10), 1e-3, 5.0)
    lo, hi = 1e-6, 0.999
    for _ in range(100):
        a = 0.5 * (lo + hi)
        lo, hi = (a, hi) if u_gs / a - u_ls / (1 - a) > 0.25 else (lo, a)
    assert 0.5 * (lo + hi) == pytest.approx(0.25, abs=0.005)


def test_dispersed_bubbles_at_high_liquid_rate():
    # Taitel et al. (1980) map for air-water in a 5.1 cm tube: turbulent break-up
    # gives dispersed bubbles above U_LS ~ 2-5 m/s at low gas rates [memory];
    # it holds only while the no-slip void stays below 0.52 (their eq. 10).
    u_ls = boundary(lambda u: vertical(0.1, u, 0.051), 0.1, 20.0)
    assert 2.0 < u_ls < 5.0
    assert vertical(0.1, 4.0, 0.025) == "bubbly"      # also below the 5 cm limit
    assert vertical(0.1, 0.5, 0.025) == "slug"
    assert vertical(3.0, 5.0, 0.051) == "bubbly"      # no-slip void 0.375
    assert vertical(7.0, 5.0, 0.051) == "slug"        # no-slip void 0.58 > 0.52


def test_churn_is_an_entrance_phenomenon():
    # Taitel et al. (1980): churn is the entry region of slug flow; its length
    # grows with the mixture velocity (l_E ~ 40 D (U_M / (g D)^0.5 + 0.22)) [memory].
    assert vertical(1.0, 0.5, 0.05, z=1.0) == "churn"
    assert vertical(1.0, 0.5, 0.05, z=10.0) == "slug"
    assert vertical(1.0, 0.5, 0.05) == "slug"          # z=None: developed flow
    assert vertical(0.3, 0.1, 0.05, z=3.0) == "slug"
    assert vertical(3.0, 1.0, 0.05, z=3.0) == "churn"  # same z, higher U_M


def test_low_quality_vertical_flow_is_bubbly_or_slug():
    # Steam-water 1 atm (W1): low quality is bubbly or slug; in a 20 mm tube,
    # below the bubbly-flow diameter (4.8 cm for W1 [computed]), slug at moderate G.
    for G, x, D in itertools.product((200.0, 500.0, 1000.0), (1e-5, 1e-4, 1e-3), (0.02, 0.05)):
        pattern = taitel_bornea_dukler_1980(G, x, D, W1["rho_l"], W1["rho_v"], W1["mu_l"], W1["sigma"])
        assert pattern in ("bubbly", "slug"), (G, x, D, pattern)
    assert taitel_bornea_dukler_1980(500.0, 1e-4, 0.02, W1["rho_l"], W1["rho_v"], W1["mu_l"],
                                     W1["sigma"]) == "slug"
    assert taitel_bornea_dukler_1980(200.0, 1e-5, 0.05, W1["rho_l"], W1["rho_v"], W1["mu_l"],
                                     W1["sigma"]) == "bubbly"


def test_vertical_limits_and_never_nan():
    p = W1
    args = (p["rho_l"], p["rho_v"], p["mu_l"], p["sigma"])
    assert taitel_bornea_dukler_1980(500.0, 0.0, 0.02, *args) == "single-phase liquid"
    assert taitel_bornea_dukler_1980(500.0, 1.0, 0.02, *args) == "single-phase vapour"
    for G, x, D, z in itertools.product((-10.0, 0.0, 1e-300, 50.0, 500.0, 1e5),
                                        (1e-300, 1e-6, 0.01, 0.5, 1 - 1e-12),
                                        (0.005, 0.02, 0.1), (None, 0.0, 2.0)):
        assert taitel_bornea_dukler_1980(G, x, D, *args, z=z) in PATTERNS


def test_vertical_registry_passes_position():
    m = get("taitel_bornea_dukler_1980")
    assert m in methods("flow_pattern")
    G = AIR_WATER["rho_l"] * 0.5 + AIR_WATER["rho_v"] * 1.0
    state = dict(AIR_WATER, G=G, x=AIR_WATER["rho_v"] * 1.0 / G, D=0.05)
    assert m(state) == "slug"
    assert m(state, z=1.0) == "churn"   # options are passed explicitly
    assert m.out_of_range(state) == []
    assert m.out_of_range(dict(state, D=0.015))
