"""Saturated flow boiling inside tubes: the local two-phase coefficient.

Every function returns the local coefficient htc [W/m^2/K] of saturated flow
boiling, wall to fluid, referred to the saturation temperature, before dryout.
The methods come in two forms:

* heat-flux form (``q`` is an input): Gungor-Winterton 1986 and 1987,
  Kandlikar 1990, Liu-Winterton 1991, Steiner-Taborek 1992;
* wall-superheat form (``dT_sat`` and ``dp_sat`` are inputs): Chen 1966,
  whose nucleate term (Forster-Zuber) is written in the wall superheat.

The march never needs to know which form a method has: at each station it takes
``station_parts(name, available, dp_sat_of_dT)``, a function of the local flux q
that gives the coefficient and its two parts (``BoilingParts``), with everything
that does not depend on the flux worked out once. A heat-flux method is
evaluated at q; a wall-superheat method is solved for the superheat that carries
q with ``solve_wall_superheat`` (a bracketed ``rating.roots.brentq`` root, never
a fixed-point loop). ``flow_boiling_htc`` gives the coefficient alone.

The parts are the nucleate and convective terms as they enter each method's own
combination, after its suppression and enhancement factors, so that a profile
of the three is what the coefficient is made of: htc^n = nucleate^n +
convective^n with the method's ``parts_exponent`` n (1 for the superpositions
of Chen, Gungor-Winterton and Kandlikar's governing set, 2 for Liu-Winterton,
3 for Steiner-Taborek).

Common conventions
------------------
* Quality outside (0, 1) is clamped into [X_MIN, 1 - X_MIN] (X_MIN = 1e-9):
  x <= 0 gives the all-liquid limit, x >= 1 the (vanishing) film limit. The
  correlations are meaningless beyond dryout; the march switches to a
  post-dryout method before that, so the upper clamp only keeps the number
  finite. The validity ranges report such states.
* A negative heat flux (not a boiling state) is treated as zero: no nucleate
  contribution, never a complex power.
* The pool terms are those of pool_boiling.py: Cooper (1984) in its heat-flux
  form with Rp = 1 um (``cooper_1984``) and Forster-Zuber (``forster_zuber_1955``).
* The liquid coefficient is Dittus-Boelter (heating) with the liquid-fraction
  Reynolds number G(1-x)D/mu_l unless a method says otherwise
  (Liu-Winterton: all-liquid; Steiner-Taborek: Gnielinski, all-liquid).
* As x -> 0 with nucleation suppressed (q -> 0, dT_sat -> 0) every method
  tends to its single-phase liquid value (tests/test_flow_boiling.py).
"""
from __future__ import annotations

import math
from typing import Callable, Mapping, NamedTuple

from ..roots import brentq

from ..errors import ConvergenceError
from .dimensionless import (boiling_number, convection_number, froude_liquid_only,
                            martinelli_xtt, prandtl, reynolds)
from .pool_boiling import cooper_1984, forster_zuber_1955
from .registry import Method, get, register
from .single_phase import dittus_boelter_1930, gnielinski_1976

#: Smallest quality used inside the correlations; x is clamped into [X_MIN, 1 - X_MIN].
X_MIN = 1e-9

_COOPER = (
    "Cooper, M.G. (1984) Saturation nucleate pool boiling - a simple correlation, "
    "IChemE Symp. Ser. 86, 785-793"
)


class BoilingParts(NamedTuple):
    """A flow-boiling coefficient and the two parts it is made of [W/m^2/K].

    The parts are the terms as they enter the method's own combination, after its
    suppression and enhancement factors: htc^n = nucleate^n + convective^n, with n
    the method's ``parts_exponent`` (1 for a superposition, 2 or 3 for an asymptotic
    sum). A plot of the three shows what the coefficient is made of.
    """

    htc: float
    nucleate: float
    convective: float


# --- shared private terms ---------------------------------------------------

def _quality(x):
    return min(max(x, X_MIN), 1.0 - X_MIN)


def _htc_liquid(G, D, mu_l, k_l, cp_l, nusselt=dittus_boelter_1930):
    """Single-phase liquid coefficient for the mass flux G (pass G(1-x) for the liquid fraction)."""
    return nusselt(reynolds(G, D, mu_l), prandtl(cp_l, mu_l, k_l)) * k_l / D


def _gungor_winterton_froude(G, rho_l, D, horizontal):
    """Horizontal-tube factors (E2, S2) of Gungor & Winterton (1986); 1 unless Fr_lo < 0.05."""
    Fr = froude_liquid_only(G, rho_l, D)
    if not horizontal or Fr >= 0.05:
        return 1.0, 1.0
    return Fr ** (0.1 - 2.0 * Fr), math.sqrt(Fr)


# --- Chen (1966) -------------------------------------------------------------

def _chen_station(G, x, D, rho_l, rho_v, mu_l, mu_v, k_l, cp_l, h_lv, sigma):
    """Chen's parts as a function of (dT_sat, dp_sat): S htc_FZ and F htc_l."""
    x = _quality(x)
    G_l = G * (1.0 - x)
    htc_l = _htc_liquid(G_l, D, mu_l, k_l, cp_l)
    inv_xtt = 1.0 / martinelli_xtt(x, rho_l, rho_v, mu_l, mu_v)
    F = 1.0 if inv_xtt <= 0.1 else 2.35 * (inv_xtt + 0.213) ** 0.736
    Re_tp = reynolds(G_l, D, mu_l) * F**1.25
    S = 1.0 / (1.0 + 2.53e-6 * Re_tp**1.17)
    convective = F * htc_l

    def parts(dT_sat, dp_sat):
        nucleate = S * forster_zuber_1955(dT_sat, dp_sat, rho_l, rho_v, k_l, cp_l, mu_l, sigma,
                                          h_lv)
        return BoilingParts(convective + nucleate, nucleate, convective)
    return parts


@register(
    "flow_boiling", "Chen (1966)",
    validity={"x": (0.01, 0.71)}, station=_chen_station, parts_exponent=1,
    references=(
        "Chen, J.C. (1966) Correlation for boiling heat transfer to saturated fluids in "
        "convective flow, Ind. Eng. Chem. Process Des. Dev. 5(3), 322-329, "
        "doi:10.1021/i260019a023",
        "Collier, J.G. & Thome, J.R. (1994) Convective Boiling and Condensation, 3rd ed., "
        "Oxford University Press (curve fits of Chen's F and S charts)",
        "Forster, H.K. & Zuber, N. (1955) Dynamics of vapor bubbles and boiling heat transfer, "
        "AIChE J. 1(4), 531-535, doi:10.1002/aic.690010425",
    ),
    notes="Wall-superheat form: flow_boiling_htc solves dT_sat for a given q. Validity: the "
          "quality range of Chen's database (0.01-0.71; water, methanol, cyclohexane, pentane, "
          "heptane, benzene, vertical up-flow), as recalled from Chen (1966)/Collier & Thome. "
          "The analytic Edelstein and Bennett-Chen fits give +4 % and +20 % at the W1 base case.",
)
def chen_1966(G, x, D, rho_l, rho_v, mu_l, mu_v, k_l, cp_l, h_lv, sigma, dT_sat, dp_sat):
    """Chen's superposition of enhanced convection and suppressed nucleate boiling.

    .. math:: htc = F\\,htc_l + S\\,htc_{FZ}(\\Delta T_{sat}, \\Delta p_{sat})

    htc_l is Dittus-Boelter with the liquid-fraction Reynolds number
    Re_l = G(1-x)D/mu_l. F and S are the usual curve fits of Chen's charts
    (Collier & Thome): F = 2.35 (1/X_tt + 0.213)^0.736, F = 1 for
    1/X_tt <= 0.1; S = 1/(1 + 2.53e-6 Re_tp^1.17) with Re_tp = Re_l F^1.25.
    htc_FZ is Forster-Zuber,
    0.00122 k^0.79 cp^0.45 rho_l^0.49 / (sigma^0.5 mu^0.29 h_lv^0.24 rho_v^0.24)
    dT_sat^0.24 dp_sat^0.75; it is zero for dT_sat <= 0 or dp_sat <= 0.
    Parts (``BoilingParts``): nucleate S htc_FZ, convective F htc_l; they add up.

    Validity: Chen's database, x 0.01 to 0.71, vertical tubes, water and
    organic liquids. Quality outside (0, 1) is clamped (module docstring).

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner tube diameter [m]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    mu_v : float
        Vapour viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    sigma : float
        Surface tension [N/m]
    dT_sat : float
        Wall superheat T_wall - T_sat [K]
    dp_sat : float
        p_sat(T_wall) - P, the saturation-pressure difference of the superheat [Pa]

    Returns
    -------
    htc : float
        Two-phase coefficient [W/m^2/K]

    References
    ----------
    Chen, J.C. (1966) Ind. Eng. Chem. Process Des. Dev. 5, 322-329,
    doi:10.1021/i260019a023. Collier, J.G. & Thome, J.R. (1994) Convective
    Boiling and Condensation, 3rd ed. Forster, H.K. & Zuber, N. (1955)
    AIChE J. 1, 531-535, doi:10.1002/aic.690010425.
    """
    return _chen_station(G, x, D, rho_l, rho_v, mu_l, mu_v, k_l, cp_l, h_lv, sigma)(
        dT_sat, dp_sat).htc


# --- Gungor & Winterton (1986, 1987) -----------------------------------------

_GW_DATABASE = {"D": (2.95e-3, 32e-3), "G": (12.4, 61518.0), "q": (350.0, 2.62e6)}


def _gungor_winterton_1986_station(G, x, D, rho_l, rho_v, mu_l, mu_v, k_l, cp_l, h_lv, P,
                                   P_crit, M, *, horizontal=False):
    """Gungor-Winterton's parts as a function of q: S S2 htc_Cooper and E E2 htc_l.
    Everything but Bo and Cooper's q^0.67 is worked out once."""
    x = _quality(x)
    G_l = G * (1.0 - x)
    htc_l = _htc_liquid(G_l, D, mu_l, k_l, cp_l)
    E_quality = 1.0 + 1.37 * martinelli_xtt(x, rho_l, rho_v, mu_l, mu_v) ** -0.86
    suppression = 1.15e-6 * reynolds(G_l, D, mu_l) ** 1.17
    E2, S2 = _gungor_winterton_froude(G, rho_l, D, horizontal)
    cooper_per_q067 = cooper_1984(1.0, P, P_crit, M)    # Cooper's htc at q = 1 W/m^2
    per_flux = 1.0 / (G * h_lv)                          # Bo = q / (G h_lv)

    def parts(q):
        q = max(q, 0.0)
        E = E_quality + 24000.0 * (q * per_flux) ** 1.16
        S = 1.0 / (1.0 + suppression * E * E)
        convective = E * E2 * htc_l
        nucleate = S * S2 * cooper_per_q067 * q ** 0.67
        return BoilingParts(convective + nucleate, nucleate, convective)
    return parts


def _gungor_winterton_1987_station(G, x, D, rho_l, rho_v, mu_l, k_l, cp_l, h_lv, *,
                                   horizontal=False):
    """The simplified correlation's parts as a function of q: the boiling-number term of
    its one enhancement factor times E2 htc_l, and the rest (1 + the quality term)."""
    x = _quality(x)
    htc_l = _htc_liquid(G * (1.0 - x), D, mu_l, k_l, cp_l)
    E2, _ = _gungor_winterton_froude(G, rho_l, D, horizontal)
    convective = (1.0 + 1.12 * (x / (1.0 - x)) ** 0.75 * (rho_l / rho_v) ** 0.41) * E2 * htc_l

    def parts(q):
        nucleate = 3000.0 * boiling_number(max(q, 0.0), G, h_lv) ** 0.86 * E2 * htc_l
        return BoilingParts(convective + nucleate, nucleate, convective)
    return parts


@register(
    "flow_boiling", "Gungor-Winterton (1986)",
    validity=dict(_GW_DATABASE), station=_gungor_winterton_1986_station, parts_exponent=1,
    references=(
        "Gungor, K.E. & Winterton, R.H.S. (1986) A general correlation for flow boiling in "
        "tubes and annuli, Int. J. Heat Mass Transfer 29(3), 351-358, "
        "doi:10.1016/0017-9310(86)90205-X",
        _COOPER,
    ),
    notes="Validity: the paper's database (water, R11, R12, R22, R113, R114, ethylene glycol; "
          "D 2.95-32 mm, G 12.4-61 518 kg/m2s, q 0.35-2620 kW/m2), as recalled. Horizontal, "
          "Fr_lo < 0.05: E x E2, S x S2 with S formed from the uncorrected E.",
)
def gungor_winterton_1986(G, x, D, q, rho_l, rho_v, mu_l, mu_v, k_l, cp_l, h_lv, P, P_crit, M,
                          *, horizontal=False):
    """Gungor & Winterton's general correlation, Chen-type with Cooper's pool term.

    .. math:: htc = E\\,htc_l + S\\,htc_{Cooper}(q)

    E = 1 + 24000 Bo^1.16 + 1.37 X_tt^-0.86, S = 1/(1 + 1.15e-6 E^2 Re_l^1.17),
    htc_l Dittus-Boelter with Re_l = G(1-x)D/mu_l, htc_Cooper =
    55 p_r^0.12 (-log10 p_r)^-0.55 M^-0.5 q^0.67 (Rp = 1 um).

    Horizontal tubes with Fr_lo = G^2/(rho_l^2 g D) < 0.05: E is multiplied
    by E2 = Fr_lo^(0.1 - 2 Fr_lo) and S by S2 = Fr_lo^0.5. The paper leaves
    open whether S is formed from E before or after E2; S is formed from the
    *uncorrected* E and then multiplied by S2 (CHECK-VALUES section 4b; with
    the corrected E the section 4b case would give 837.7 instead of 822.3
    W/m^2/K, +1.9 %).
    Parts (``BoilingParts``): nucleate S S2 htc_Cooper, convective E E2 htc_l;
    they add up.

    Validity: the paper's database, D 2.95-32 mm, G 12.4-61 518 kg/m^2/s,
    q 0.35-2620 kW/m^2; water, refrigerants and ethylene glycol.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner tube diameter [m]
    q : float
        Wall heat flux [W/m^2]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    mu_v : float
        Vapour viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    P : float
        Saturation pressure [Pa]
    P_crit : float
        Critical pressure [Pa]
    M : float
        Molar mass [kg/kmol]
    horizontal : bool
        True for a horizontal tube (Froude corrections below Fr_lo = 0.05) [-]

    Returns
    -------
    htc : float
        Two-phase coefficient [W/m^2/K]

    References
    ----------
    Gungor, K.E. & Winterton, R.H.S. (1986) Int. J. Heat Mass Transfer 29,
    351-358, doi:10.1016/0017-9310(86)90205-X. Cooper, M.G. (1984) IChemE
    Symp. Ser. 86, 785-793.
    """
    return _gungor_winterton_1986_station(G, x, D, rho_l, rho_v, mu_l, mu_v, k_l, cp_l, h_lv,
                                          P, P_crit, M, horizontal=horizontal)(q).htc


@register(
    "flow_boiling", "Gungor-Winterton (1987), simplified",
    validity=dict(_GW_DATABASE), station=_gungor_winterton_1987_station, parts_exponent=1,
    references=(
        "Gungor, K.E. & Winterton, R.H.S. (1987) Simplified general correlation for saturated "
        "flow boiling and comparisons of correlations with data, Chem. Eng. Res. Des. 65(2), "
        "148-156",
    ),
    notes="Same database as the 1986 correlation (ranges as recalled). Horizontal, "
          "Fr_lo < 0.05: the enhancement is multiplied by E2 = Fr^(0.1-2Fr).",
)
def gungor_winterton_1987(G, x, D, q, rho_l, rho_v, mu_l, k_l, cp_l, h_lv, *, horizontal=False):
    """Gungor & Winterton's simplified correlation, one enhancement factor.

    .. math:: htc = htc_l \\left[1 + 3000 Bo^{0.86}
              + 1.12 \\left(\\frac{x}{1-x}\\right)^{0.75}
              \\left(\\frac{\\rho_l}{\\rho_v}\\right)^{0.41}\\right] E_2

    htc_l Dittus-Boelter with Re_l = G(1-x)D/mu_l. E2 = Fr_lo^(0.1 - 2 Fr_lo)
    in horizontal tubes with Fr_lo < 0.05, else 1. Parts (``BoilingParts``): the
    one factor split, nucleate 3000 Bo^0.86 E2 htc_l, convective the rest
    (1 + the quality term) E2 htc_l; they add up.

    Validity: the Gungor-Winterton database, D 2.95-32 mm,
    G 12.4-61 518 kg/m^2/s, q 0.35-2620 kW/m^2.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner tube diameter [m]
    q : float
        Wall heat flux [W/m^2]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    horizontal : bool
        True for a horizontal tube (Froude correction below Fr_lo = 0.05) [-]

    Returns
    -------
    htc : float
        Two-phase coefficient [W/m^2/K]

    References
    ----------
    Gungor, K.E. & Winterton, R.H.S. (1987) Chem. Eng. Res. Des. 65, 148-156.
    """
    return _gungor_winterton_1987_station(G, x, D, rho_l, rho_v, mu_l, k_l, cp_l, h_lv,
                                          horizontal=horizontal)(q).htc


# --- Kandlikar (1990) --------------------------------------------------------

#: Kandlikar's fluid-surface parameter F_fl for copper tubes, keyed by a
#: normalised fluid name (lower case, no '-', '_' or spaces).
_KANDLIKAR_F_FL = {
    "water": 1.00, "r11": 1.30, "r12": 1.50, "r13b1": 1.31, "r22": 2.20, "r113": 1.30,
    "r114": 1.24, "r152a": 1.10, "nitrogen": 4.70, "neon": 3.50,
    "r134a": 1.63,  # Kandlikar (1991)
}


def kandlikar_fluid_factor(name):
    """Kandlikar's published fluid-surface parameter F_fl, or None when unknown.

    Values for copper tubes, Kandlikar (1990) Table: water 1.00, R-11 1.30,
    R-12 1.50, R-13B1 1.31, R-22 2.20, R-113 1.30, R-114 1.24, R-152a 1.10,
    nitrogen 4.70, neon 3.50; R-134a 1.63 from Kandlikar (1991). Kandlikar
    recommends F_fl = 1 for stainless-steel tubes whatever the fluid. The
    name is matched without case, hyphens, underscores, spaces or a CoolProp
    backend prefix ("HEOS::R134a", "R-134a" and "r134a" are the same).

    Parameters
    ----------
    name : str
        Fluid name, e.g. "Water", "R134a" [-]

    Returns
    -------
    F_fl : float or None
        Fluid-surface parameter [-]; None when the fluid is not in the table

    References
    ----------
    Kandlikar, S.G. (1990) J. Heat Transfer 112, 219-228, doi:10.1115/1.2910348.
    Kandlikar, S.G. (1991) Development of a flow boiling map for subcooled and
    saturated flow boiling of different fluids inside circular tubes,
    J. Heat Transfer 113, 190-200, doi:10.1115/1.2910524.
    """
    key = name.split("::")[-1].lower()
    for ch in "-_ ":
        key = key.replace(ch, "")
    return _KANDLIKAR_F_FL.get(key)


def _kandlikar_1990_station(G, x, D, rho_l, rho_v, mu_l, k_l, cp_l, h_lv, *,
                           fluid_surface_factor=1.0, horizontal=False):
    """Kandlikar's parts as a function of q: the two terms of the set that governs."""
    x = _quality(x)
    htc_l = _htc_liquid(G * (1.0 - x), D, mu_l, k_l, cp_l)
    Co = convection_number(x, rho_l, rho_v)
    Fr = froude_liquid_only(G, rho_l, D)
    froude = (25.0 * Fr) ** 0.3 if horizontal and Fr < 0.04 else 1.0
    convective_of_set = (1.1360 * Co**-0.9 * froude, 0.6683 * Co**-0.2 * froude)

    def parts(q):
        nucleate = boiling_number(max(q, 0.0), G, h_lv) ** 0.7 * fluid_surface_factor
        sets = [(c + n, c, n) for c, n in zip(convective_of_set,
                                              (667.2 * nucleate, 1058.0 * nucleate))]
        total, c, n = max(sets)
        if total < 1.0:    # the floor: the liquid coefficient
            total, c, n = 1.0, 1.0, 0.0
        return BoilingParts(htc_l * total, htc_l * n, htc_l * c)
    return parts


@register(
    "flow_boiling", "Kandlikar (1990)",
    validity={"D": (4e-3, 32e-3), "G": (13.0, 8179.0), "x": (0.001, 0.987)},
    station=_kandlikar_1990_station, parts_exponent=1,
    references=(
        "Kandlikar, S.G. (1990) A general correlation for saturated two-phase flow boiling "
        "heat transfer inside horizontal and vertical tubes, J. Heat Transfer 112(1), 219-228, "
        "doi:10.1115/1.2910348",
    ),
    notes="Validity: the paper's database (5246 points, 24 studies, 10 fluids; D 4-32 mm, "
          "G 13-8179 kg/m2s, x 0.001-0.987), as recalled. F_fl from kandlikar_fluid_factor; "
          "1.0 when the fluid is not tabulated (an assumption). Floored at htc_l (not in the "
          "paper) so that the x -> 0 limit is the liquid coefficient.",
)
def kandlikar_1990(G, x, D, q, rho_l, rho_v, mu_l, k_l, cp_l, h_lv, *,
                   fluid_surface_factor=1.0, horizontal=False):
    """Kandlikar's correlation: the larger of the convective and nucleate sets.

    .. math:: htc / htc_l = C_1 Co^{C_2} (25 Fr_{lo})^{C_5} + C_3 Bo^{C_4} F_{fl}

    Convective set (C1..C4) = (1.1360, -0.9, 667.2, 0.7), nucleate set
    (0.6683, -0.2, 1058.0, 0.7); the larger result is taken. C5 = 0.3 in
    horizontal tubes with Fr_lo < 0.04, else 0. htc_l is Dittus-Boelter with
    Re_l = G(1-x)D/mu_l; Co = ((1-x)/x)^0.8 (rho_v/rho_l)^0.5, Bo = q/(G h_lv).
    Parts (``BoilingParts``): not a sum of two terms but the larger of two sets,
    each a sum: the parts are the two terms of the set that governs, nucleate
    C3 Bo^C4 F_fl htc_l, convective C1 Co^C2 (25 Fr_lo)^C5 htc_l; they add up
    (at the floor: convective htc_l, nucleate 0).

    Limit: as x -> 0 and q -> 0 both sets tend to zero (Co^-0.2 -> 0), below
    the liquid coefficient; the result is therefore floored at htc_l
    (Ebullio's guard, not in the paper). The floor is inactive in the paper's
    range except at the lowest qualities and fluxes.

    Validity: the paper's database, D 4-32 mm, G 13-8179 kg/m^2/s,
    x 0.001-0.987; water, refrigerants, nitrogen and neon.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner tube diameter [m]
    q : float
        Wall heat flux [W/m^2]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    fluid_surface_factor : float
        Kandlikar's F_fl, see ``kandlikar_fluid_factor`` [-]
    horizontal : bool
        True for a horizontal tube (Froude factor below Fr_lo = 0.04) [-]

    Returns
    -------
    htc : float
        Two-phase coefficient [W/m^2/K]

    References
    ----------
    Kandlikar, S.G. (1990) A general correlation for saturated two-phase flow
    boiling heat transfer inside horizontal and vertical tubes, J. Heat
    Transfer 112, 219-228, doi:10.1115/1.2910348.
    """
    return _kandlikar_1990_station(G, x, D, rho_l, rho_v, mu_l, k_l, cp_l, h_lv,
                                   fluid_surface_factor=fluid_surface_factor,
                                   horizontal=horizontal)(q).htc


# --- Liu & Winterton (1991) --------------------------------------------------

def _liu_winterton_1991_station(G, x, D, rho_l, rho_v, mu_l, k_l, cp_l, P, P_crit, M):
    """Liu-Winterton's parts as a function of q: S htc_Cooper and F htc_lo."""
    x = _quality(x)
    htc_lo = _htc_liquid(G, D, mu_l, k_l, cp_l)
    F = (1.0 + x * prandtl(cp_l, mu_l, k_l) * (rho_l / rho_v - 1.0)) ** 0.35
    S = 1.0 / (1.0 + 0.055 * F**0.1 * reynolds(G, D, mu_l) ** 0.16)
    convective = F * htc_lo
    nucleate_per_q067 = S * cooper_1984(1.0, P, P_crit, M)

    def parts(q):
        nucleate = nucleate_per_q067 * max(q, 0.0) ** 0.67
        return BoilingParts(math.hypot(convective, nucleate), nucleate, convective)
    return parts


@register(
    "flow_boiling", "Liu-Winterton (1991)",
    validity={"D": (2.95e-3, 32e-3), "G": (12.4, 8179.3), "q": (350.0, 2.62e6)},
    station=_liu_winterton_1991_station, parts_exponent=2,
    references=(
        "Liu, Z. & Winterton, R.H.S. (1991) A general correlation for saturated and subcooled "
        "flow boiling in tubes and annuli, based on a nucleate pool boiling equation, "
        "Int. J. Heat Mass Transfer 34(11), 2759-2766, doi:10.1016/0017-9310(91)90234-6",
        _COOPER,
    ),
    notes="Heat-flux form of the paper (Cooper at q). ht.Liu_Winterton evaluates Cooper's "
          "wall-superheat form instead and differs by up to 25 % (CHECK-VALUES 10.2). "
          "Validity: the saturated-boiling database (water, refrigerants, ethylene glycol; "
          "D 2.95-32 mm, G 12.4-8179 kg/m2s, q 0.35-2620 kW/m2), as recalled. The paper's "
          "horizontal-tube Froude factors are not implemented.",
)
def liu_winterton_1991(G, x, D, q, rho_l, rho_v, mu_l, k_l, cp_l, P, P_crit, M):
    """Liu & Winterton's asymptotic (n = 2) sum of convection and nucleate boiling.

    .. math:: htc = \\sqrt{(F\\,htc_{lo})^2 + (S\\,htc_{Cooper}(q))^2}

    F = [1 + x Pr_l (rho_l/rho_v - 1)]^0.35, S = [1 + 0.055 F^0.1 Re_lo^0.16]^-1,
    htc_lo Dittus-Boelter with the all-liquid Re_lo = G D/mu_l, htc_Cooper =
    55 p_r^0.12 (-log10 p_r)^-0.55 M^-0.5 q^0.67 (Rp = 1 um).

    Form implemented: the heat-flux form. Liu & Winterton write the pool
    term with Cooper's correlation at the wall heat flux q, so with q known
    the coefficient is explicit; this is the paper's method and what the
    march supplies. ``ht.Liu_Winterton`` instead evaluates Cooper's
    wall-superheat form at the wall superheat, i.e. a pool coefficient at a
    different flux; it is not self-consistent with the paper and differs by
    -1 %, +0.3 % and +25 % at the W1, P3 and R10 base cases (CHECK-VALUES
    section 10.2). Vertical tubes: the paper's horizontal Froude factors are
    not applied.

    Parts (``BoilingParts``): nucleate S htc_Cooper, convective F htc_lo; not a
    sum: htc^2 = nucleate^2 + convective^2.

    Validity: the paper's saturated database, D 2.95-32 mm,
    G 12.4-8179 kg/m^2/s, q 0.35-2620 kW/m^2.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner tube diameter [m]
    q : float
        Wall heat flux [W/m^2]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    P : float
        Saturation pressure [Pa]
    P_crit : float
        Critical pressure [Pa]
    M : float
        Molar mass [kg/kmol]

    Returns
    -------
    htc : float
        Two-phase coefficient [W/m^2/K]

    References
    ----------
    Liu, Z. & Winterton, R.H.S. (1991) Int. J. Heat Mass Transfer 34,
    2759-2766, doi:10.1016/0017-9310(91)90234-6. Cooper, M.G. (1984) IChemE
    Symp. Ser. 86, 785-793.
    """
    return _liu_winterton_1991_station(G, x, D, rho_l, rho_v, mu_l, k_l, cp_l, P, P_crit, M)(
        q).htc


# --- Steiner & Taborek (1992) ------------------------------------------------

#: Published reference nucleate coefficients of Steiner & Taborek (1992) at
#: p_r = 0.1, Rp = 1 um: CAS -> (h_nb_ref [W/m^2/K], q_ref [W/m^2]).
_STEINER_TABOREK_REFERENCE = {
    "7732-18-5": (25580.0, 150e3),  # water
}


def steiner_taborek_reference(cas):
    """Steiner-Taborek reference nucleate coefficient (h_nb_ref, q_ref), or None.

    Only values that are certain are tabulated: water (CAS 7732-18-5),
    h_nb,o = 25 580 W/m^2/K at q_o = 150 kW/m^2 (p_r = 0.1, Rp = 1 um).

    Fallback where no reference is known (to be wired by the caller): take
    Gorenflo's h0 (VDI Heat Atlas; p_r = 0.1, q0 = 20 kW/m^2, Ra0 = 0.4 um)
    and rescale its roughness to 1 um with the same exponent,
    h_nb_ref = h0 (1 um / 0.4 um)^0.133 = 1.130 h0, q_ref = 20 kW/m^2. For
    water this reproduces the published 25 580 W/m^2/K at 150 kW/m^2 to
    within 3 % (tests/test_flow_boiling.py).

    Parameters
    ----------
    cas : str
        CAS registry number of the fluid, e.g. "7732-18-5" [-]

    Returns
    -------
    reference : tuple of float, or None
        (h_nb_ref [W/m^2/K], q_ref [W/m^2]); None when the fluid is not tabulated

    References
    ----------
    Steiner, D. & Taborek, J. (1992) Heat Transfer Eng. 13(2), 43-69,
    doi:10.1080/01457639208939774.
    """
    return _STEINER_TABOREK_REFERENCE.get(cas.strip())


def _st_two_phase_factor(x, rho_l, rho_v):
    # Steiner-Taborek F_tp for vertical tubes below dryout
    return ((1.0 - x) ** 1.5
            + 1.9 * x**0.6 * (1.0 - x) ** 0.01 * (rho_l / rho_v) ** 0.35) ** 1.1


def _st_pressure_factor(p_r):
    return 2.816 * p_r**0.45 + (3.4 + 1.7 / (1.0 - p_r**7)) * p_r**3.7


def _st_flux_exponent(p_r):
    # non-cryogenic fluids
    return 0.8 - 0.1 * math.exp(1.75 * p_r)


def _st_molar_mass_factor(M):
    return 0.377 + 0.199 * math.log(M) + 2.8427e-5 * M**2


def _st_nucleate_factor(q, q_ref, D, roughness, p_r, M):
    return (_st_pressure_factor(p_r) * (q / q_ref) ** _st_flux_exponent(p_r)
            * (D / 0.01) ** -0.4 * (roughness / 1e-6) ** 0.133 * _st_molar_mass_factor(M))


def _steiner_taborek_1992_station(G, x, D, rho_l, rho_v, mu_l, k_l, cp_l, h_lv, sigma, T_sat, P,
                                  P_crit, M, *, h_nb_ref, q_ref=20e3, roughness=1e-6):
    """Steiner-Taborek's parts as a function of q: F_nb h_nb,o (0 below the onset of
    nucleate boiling) and F_tp htc_lo."""
    x = _quality(x)
    htc_lo = _htc_liquid(G, D, mu_l, k_l, cp_l, nusselt=gnielinski_1976)
    convective = _st_two_phase_factor(x, rho_l, rho_v) * htc_lo
    q_onb = 2.0 * sigma * T_sat * htc_lo / (0.3e-6 * rho_v * h_lv)
    p_r = P / P_crit
    nf = _st_flux_exponent(p_r)
    at_q_ref = _st_nucleate_factor(q_ref, q_ref, D, roughness, p_r, M) * h_nb_ref

    def parts(q):
        if q < q_onb:
            return BoilingParts(convective, 0.0, convective)
        nucleate = at_q_ref * (q / q_ref) ** nf
        return BoilingParts((convective**3 + nucleate**3) ** (1.0 / 3.0), nucleate, convective)
    return parts


@register(
    "flow_boiling", "Steiner-Taborek (1992)", station=_steiner_taborek_1992_station,
    parts_exponent=3,
    validity={"p_r": (None, 0.95), "M": (10.0, 187.0)}, orientations=("vertical",),
    references=(
        "Steiner, D. & Taborek, J. (1992) Flow boiling heat transfer in vertical tubes "
        "correlated by an asymptotic model, Heat Transfer Eng. 13(2), 43-69, "
        "doi:10.1080/01457639208939774",
    ),
    notes="Vertical tubes only, below dryout, non-cryogenic flux exponent. Needs the "
          "reference h_nb_ref at q_ref (steiner_taborek_reference; water is the only value "
          "tabulated). M: the fit range of F(M). The p_r bound 0.95 is Ebullio's guard "
          "(F_pf diverges at p_r = 1), not the paper's database range.",
)
def steiner_taborek_1992(G, x, D, q, rho_l, rho_v, mu_l, k_l, cp_l, h_lv, sigma, T_sat, P,
                         P_crit, M, *, h_nb_ref, q_ref=20e3, roughness=1e-6):
    """Steiner & Taborek's asymptotic model (n = 3) for vertical tubes.

    .. math:: htc = [(F_{tp}\\,htc_{lo})^3 + (F_{nb}\\,h_{nb,o})^3]^{1/3}

    htc_lo Gnielinski with the all-liquid Re_lo = G D/mu_l;
    F_tp = [(1-x)^1.5 + 1.9 x^0.6 (1-x)^0.01 (rho_l/rho_v)^0.35]^1.1;
    F_nb = F_pf (q/q_ref)^nf (D/0.01 m)^-0.4 (Rp/1 um)^0.133 F(M) with
    F_pf = 2.816 p_r^0.45 + [3.4 + 1.7/(1 - p_r^7)] p_r^3.7,
    nf = 0.8 - 0.1 exp(1.75 p_r), F(M) = 0.377 + 0.199 ln M + 2.8427e-5 M^2.
    Below the onset of nucleate boiling, q < q_ONB = 2 sigma T_sat htc_lo /
    (r0 rho_v h_lv) with r0 = 0.3 um, the nucleate term is switched off and
    htc = F_tp htc_lo (so the coefficient jumps at q_ONB, as in the paper).
    Parts (``BoilingParts``): nucleate F_nb h_nb,o, convective F_tp htc_lo; not a
    sum: htc^3 = nucleate^3 + convective^3.

    Validity: vertical tubes below dryout; F(M) is fitted for 10 < M < 187;
    non-cryogenic fluids (the cryogen exponent nf is not implemented).

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner tube diameter [m]
    q : float
        Wall heat flux [W/m^2]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    sigma : float
        Surface tension [N/m]
    T_sat : float
        Saturation temperature [K]
    P : float
        Saturation pressure [Pa]
    P_crit : float
        Critical pressure [Pa]
    M : float
        Molar mass [kg/kmol]
    h_nb_ref : float
        Reference nucleate coefficient h_nb,o at p_r = 0.1, q_ref, Rp = 1 um,
        see ``steiner_taborek_reference`` [W/m^2/K]
    q_ref : float
        Heat flux of the reference coefficient; the default 20e3 is the table's
        flux for fluids other than water (150e3 for water) [W/m^2]
    roughness : float
        Wall roughness Rp [m]

    Returns
    -------
    htc : float
        Two-phase coefficient [W/m^2/K]

    References
    ----------
    Steiner, D. & Taborek, J. (1992) Flow boiling heat transfer in vertical
    tubes correlated by an asymptotic model, Heat Transfer Eng. 13(2), 43-69,
    doi:10.1080/01457639208939774.
    """
    return _steiner_taborek_1992_station(G, x, D, rho_l, rho_v, mu_l, k_l, cp_l, h_lv, sigma,
                                         T_sat, P, P_crit, M, h_nb_ref=h_nb_ref, q_ref=q_ref,
                                         roughness=roughness)(q).htc


# --- dispatch used by the march ----------------------------------------------

def _method(method):
    return get(method) if isinstance(method, str) else method


def _superheat_for(at, q, dp_sat_of_dT, title) -> float:
    """Wall superheat at which the parts function ``at(dT_sat, dp_sat)`` carries q."""
    if q <= 0.0:
        return 0.0

    def residual(dT):
        return at(dT, dp_sat_of_dT(dT)).htc * dT - q

    htc0 = at(0.0, dp_sat_of_dT(0.0)).htc  # convective part alone
    hi = q / htc0 if htc0 > 0.0 else 1.0
    for _ in range(60):
        r = residual(hi)
        if r == 0.0:
            return hi
        if r > 0.0:
            return brentq(residual, 0.0, hi, xtol=1e-12, rtol=1e-12)
        hi *= 2.0
    raise ConvergenceError(f"{title}: no wall superheat carries q = {q:.4g} W/m2")


def _drive(m: Method) -> tuple[str, ...]:
    return ("q",) if "q" in m.inputs else ("dT_sat", "dp_sat")


def solve_wall_superheat(method, available: Mapping[str, float], q: float,
                         dp_sat_of_dT: Callable[[float], float], **options) -> float:
    """Wall superheat dT_sat [K] at which a wall-superheat method carries q.

    Solves htc(dT_sat, dp_sat(dT_sat)) * dT_sat = q with ``rating.roots.brentq`` (Brent)
    on the bracket [0, q/htc(0)]: the residual is -q at zero superheat, and
    since the nucleate term only adds to the convective one, the residual is
    >= 0 at q/htc(0). Should a method break that assumption the upper end is
    doubled until the sign changes. q <= 0 returns 0.

    Parameters
    ----------
    method : Method or str
        A registered wall-superheat method (inputs dT_sat and dp_sat), or its name
    available : mapping
        The other inputs of the method, by argument name (SI)
    q : float
        Wall heat flux [W/m^2]
    dp_sat_of_dT : callable
        dp_sat(dT) = p_sat(T_sat + dT) - P [Pa] for a superheat dT [K]

    Returns
    -------
    dT_sat : float
        Wall superheat [K]

    Raises
    ------
    ConvergenceError
        When no bracket is found (a method whose htc falls with superheat).
    """
    m = _method(method)
    return _superheat_for(_station_of(m, available, options), q, dp_sat_of_dT, m.title)


def _station_of(m: Method, available, options):
    """The method's parts as a function of its drive (q, or dT_sat and dp_sat)."""
    drive = _drive(m)
    fixed = {n: available[n] for n in m.inputs if n not in drive}
    if m.station is not None:
        return m.station(**fixed, **options)

    def at(*values):   # a method without parts: its coefficient alone, parts not computed
        return BoilingParts(m.function(**fixed, **dict(zip(drive, values)), **options),
                            None, None)
    return at


def station_parts(method, available: Mapping[str, float],
                  dp_sat_of_dT: Callable[[float], float] | None = None,
                  **options) -> Callable[[float], BoilingParts]:
    """A flow-boiling method at one station: q -> ``BoilingParts`` (htc, nucleate,
    convective) [W/m^2/K] at the heat flux q [W/m^2].

    What does not depend on the flux is worked out once here (the method's
    ``station``), so that a root on q evaluates only the flux terms. A
    wall-superheat method (Chen) is solved for the superheat that carries q
    (``solve_wall_superheat``) and its parts taken there, so htc * dT_sat = q.

    Parameters
    ----------
    method : Method or str
        A registered flow-boiling method, or its name
    available : mapping
        Its inputs but q (or dT_sat and dp_sat), by argument name (SI)
    dp_sat_of_dT : callable
        dp_sat(dT) = p_sat(T_sat + dT) - P [Pa]; needed by wall-superheat methods

    Returns
    -------
    parts : callable
        q [W/m^2] -> BoilingParts [W/m^2/K]
    """
    m = _method(method)
    if m.family != "flow_boiling":
        raise ValueError(f"{m.name!r} is a {m.family} method, not flow_boiling")
    at = _station_of(m, available, options)
    if "q" in m.inputs:
        return at
    if dp_sat_of_dT is None:
        raise ValueError(f"{m.name} is a wall-superheat form: give dp_sat_of_dT")

    def parts(q):
        dT = _superheat_for(at, q, dp_sat_of_dT, m.title)
        return at(dT, dp_sat_of_dT(dT))
    return parts


def flow_boiling_htc(name: str, available: Mapping[str, float], q: float,
                     dp_sat_of_dT: Callable[[float], float] | None = None,
                     **options) -> float:
    """Local flow-boiling coefficient [W/m^2/K] with any registered method, at heat flux q.

    Heat-flux methods are called with q; wall-superheat methods (Chen) are
    solved for dT_sat with ``solve_wall_superheat`` and evaluated there, so
    htc * dT_sat = q (``station_parts``, which the march uses, gives the parts
    too). Options (``horizontal``, ``fluid_surface_factor``, ``h_nb_ref`` ...)
    are given by keyword through ``options``.

    Parameters
    ----------
    name : str
        Registered method name, e.g. "gungor_winterton_1986"
    available : mapping
        Inputs by argument name (SI)
    q : float
        Wall heat flux [W/m^2]
    dp_sat_of_dT : callable
        dp_sat(dT) = p_sat(T_sat + dT) - P [Pa]; needed by wall-superheat methods

    Returns
    -------
    htc : float
        Two-phase coefficient [W/m^2/K]
    """
    return station_parts(name, available, dp_sat_of_dT, **options)(q).htc
