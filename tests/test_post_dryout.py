"""Post-dryout (Dougall-Rohsenow 1963) and subcooled boiling (Liu-Winterton 1991) values.

Each is checked against its published equations evaluated independently: the
Dittus-Boelter Nusselt number of the ht library (Chemical Engineering Design
Library), CoolProp's PropsSI properties and ht's Cooper (1984) pool coefficient.
"""
import math

import CoolProp.CoolProp as CP
import pytest
from ht.boiling_nucleic import Cooper
from ht.conv_internal import turbulent_Dittus_Boelter

from rating.correlations.post_dryout import dougall_rohsenow_1963, liu_winterton_1991_subcooled


def water_sat(P):
    def prop(name, Q):
        return CP.PropsSI(name, "P", P, "Q", Q, "Water")
    return dict(rho_l=prop("D", 0), rho_v=prop("D", 1), mu_v=prop("V", 1), k_v=prop("L", 1),
                cp_v=prop("C", 1), mu_l=prop("V", 0), k_l=prop("L", 0), cp_l=prop("C", 0),
                T_sat=prop("T", 0))


@pytest.mark.parametrize("P, G, x, D", [(7e6, 1000.0, 0.5, 0.0125), (1e6, 300.0, 0.9, 0.02),
                                        (15e6, 2000.0, 0.3, 0.010)])
def test_dougall_rohsenow_is_dittus_boelter_on_the_homogeneous_vapour_flow(P, G, x, D):
    # Dougall & Rohsenow (1963), as Collier & Thome (1994) sec. 9.4 give it: the vapour's
    # Dittus-Boelter (0.023 Re^0.8 Pr^0.4) at Re = G D / mu_v (x + rho_v/rho_l (1 - x)).
    s = water_sat(P)
    re = G * D / s["mu_v"] * (x + s["rho_v"] / s["rho_l"] * (1.0 - x))
    pr = s["cp_v"] * s["mu_v"] / s["k_v"]
    expected = turbulent_Dittus_Boelter(re, pr, heating=True) * s["k_v"] / D
    got = dougall_rohsenow_1963(G, x, D, s["rho_l"], s["rho_v"], s["mu_v"], s["k_v"], s["cp_v"])
    assert got == pytest.approx(expected, rel=1e-9)


def test_dougall_rohsenow_at_quality_one_is_the_vapour_alone():
    s = water_sat(7e6)
    G, D = 1000.0, 0.0125
    pr = s["cp_v"] * s["mu_v"] / s["k_v"]
    vapour = turbulent_Dittus_Boelter(G * D / s["mu_v"], pr, heating=True) * s["k_v"] / D
    args = (G, 1.0, D, s["rho_l"], s["rho_v"], s["mu_v"], s["k_v"], s["cp_v"])
    assert dougall_rohsenow_1963(*args) == pytest.approx(vapour, rel=1e-9)
    # the homogeneous Reynolds number falls with quality: the coefficient with it
    low = dougall_rohsenow_1963(G, 0.2, *args[2:])
    assert low < 0.5 * vapour


@pytest.mark.parametrize("q, subcooling", [(5e5, 20.0), (1e6, 40.0), (2e5, 5.0)])
def test_liu_winterton_subcooled_wall_temperature_solves_the_published_sum(q, subcooling):
    # Liu & Winterton (1991): q^2 = (F h_l (T_w - T_b))^2 + (S h_pool (T_w - T_sat))^2 with
    # F = 1 in subcooled flow and S = 1 / (1 + 0.055 F^0.1 Re_lo^0.16); h_pool Cooper (1984)
    # at q (ht's implementation), h_l Dittus-Boelter (ht), water at 7 MPa.
    P, G, D = 7e6, 1500.0, 0.0125
    s = water_sat(P)
    T_b = s["T_sat"] - subcooling
    mu = CP.PropsSI("V", "P", P, "T", T_b, "Water")
    k = CP.PropsSI("L", "P", P, "T", T_b, "Water")
    cp = CP.PropsSI("C", "P", P, "T", T_b, "Water")
    h_l = turbulent_Dittus_Boelter(G * D / mu, cp * mu / k, heating=True) * k / D
    h_pool = Cooper(Te=None, P=P, Pc=CP.PropsSI("pcrit", "Water"), MW=18.01528, Rp=1.0, q=q)
    T_w = liu_winterton_1991_subcooled(q, T_b, s["T_sat"], h_l, h_pool, G, D, mu)
    S = 1.0 / (1.0 + 0.055 * (G * D / mu) ** 0.16)
    if T_b + q / h_l <= s["T_sat"]:
        assert T_w == pytest.approx(T_b + q / h_l, rel=1e-12)   # no nucleate part yet
    else:
        assert s["T_sat"] < T_w < T_b + q / h_l
        lhs = math.hypot(h_l * (T_w - T_b), S * h_pool * (T_w - s["T_sat"]))
        assert lhs == pytest.approx(q, rel=1e-9)
