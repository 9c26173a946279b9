"""Two-phase flow-pattern maps: which flow pattern a local state is in.

Every map returns one of the names in ``PATTERNS``, the trade's own words:

=======================  ===================================================
"bubbly"                 bubbles dispersed in a continuous liquid
"slug"                   Taylor bubbles / large plugs separated by liquid slugs
"churn"                  chaotic, oscillating slug break-up (vertical up-flow)
"intermittent"           plug and slug flow of horizontal tubes (Kattan et al.)
"annular"                liquid film on the whole wall, vapour core
"stratified"             liquid at the bottom, smooth interface (horizontal)
"stratified-wavy"        stratified with a wavy interface, top wall dry
"dryout"                 the annular film is drying out around the perimeter
"mist"                   wall dry, liquid carried as droplets
"single-phase liquid"    x <= 0
"single-phase vapour"    x >= 1
=======================  ===================================================

Horizontal tubes: ``wojtan_ursenbacher_thome_2005`` (Kattan-Thome-Favrat 1998
map as updated by Wojtan et al. 2005); its boundaries are available as numbers
from ``wojtan_transitions`` and its dryout onset/completion qualities from
``wojtan_dryout_qualities`` (the march uses x_di as the onset of dryout in
horizontal tubes). Vertical up-flow: ``taitel_bornea_dukler_1980``.
"""
from __future__ import annotations

import math
from typing import NamedTuple

from .dimensionless import g, laplace_length
from .registry import register
from .void_fraction import steiner_1993

#: Every name a flow-pattern map may return.
PATTERNS = (
    "bubbly", "slug", "churn", "intermittent", "annular", "stratified",
    "stratified-wavy", "dryout", "mist", "single-phase liquid", "single-phase vapour",
)

_PI2 = math.pi * math.pi
_PI3 = _PI2 * math.pi
_BIBERG_C = (1.5 * math.pi) ** (1.0 / 3.0)
#: Qualities are kept inside [_X_EDGE, 1 - _X_EDGE] in the boundary formulas,
#: which are 0/0 at x = 0 and x = 1; their limits there are finite or +inf.
_X_EDGE = 1e-9
#: exp() argument cap: beyond it a boundary is "infinitely" high (no overflow).
_LOG_CAP = 700.0


# --------------------------------------------------------------------------
# Horizontal tubes: Kattan-Thome-Favrat (1998) / Wojtan et al. (2005)
# --------------------------------------------------------------------------

def _biberg_half_wet_angle(eps):
    """Half the wetted angle of a flat stratified interface (Biberg 1999, explicit)."""
    l = 1.0 - eps
    return (math.pi * l
            + _BIBERG_C * (1.0 - 2.0 * l + l ** (1.0 / 3.0) - eps ** (1.0 / 3.0))
            - l * eps * (1.0 - 2.0 * l) * (1.0 + 4.0 * (l * l + eps * eps)) / 200.0)


def _geometry(G, x, rho_l, rho_v, sigma):
    """(eps, delta, A_Ld, A_Vd, h_Ld, P_id): void fraction, half wetted angle
    (2 pi - theta_strat)/2, liquid and vapour areas over D^2, liquid height over D,
    interface width over D. A plain tuple: this runs twice per call of the map."""
    eps = steiner_1993(x, rho_l, rho_v, sigma, G)
    delta = min(max(_biberg_half_wet_angle(eps), 0.0), math.pi)
    # h_Ld = (1 - cos delta)/2 and (1 - (2 h_Ld - 1)^2)^0.5 = sin delta = P_id,
    # written without the cancellation of the papers' forms near delta = 0
    return (eps, delta, 0.25 * math.pi * (1.0 - eps), 0.25 * math.pi * eps,
            math.sin(0.5 * delta) ** 2, math.sin(delta))


def _wavy_exponents(r, D, rho_l, sigma):
    """F1(q), F2(q) and (We/Fr)_L of G_wavy; r = q / q_crit."""
    return 646.0 * r * r + 64.8 * r, 18.8 * r + 1.023, g * D * D * rho_l / sigma


def _g_wavy(x, geo, D, rho_l, rho_v, F1, F2, we_fr):
    _, _, _, A_Vd, h_Ld, P_id = geo
    if A_Vd <= 0.0 or P_id <= 0.0:
        return 50.0                   # limit as the vapour area vanishes (x -> 0)
    if h_Ld <= 0.0:
        return math.inf               # limit as the liquid layer vanishes (x -> 1)
    # logarithms: (1-x)^-F1 overflows a float at high q and x -> 1
    log_term = (math.log(_PI2 / 25.0) - 2.0 * math.log(h_Ld)
                - F1 * math.log(1.0 - x) - F2 * math.log(we_fr))
    term = math.exp(min(log_term, _LOG_CAP))
    base = 16.0 * A_Vd ** 3 * g * D * rho_l * rho_v / (x * x * _PI2 * P_id)
    return math.sqrt(base * (term + 1.0)) + 50.0


def _g_strat(x, geo, rho_l, rho_v, mu_l):
    arg = (226.3 ** 2 * geo[2] * geo[3] ** 2 * rho_v * (rho_l - rho_v) * mu_l * g
           / (x * x * (1.0 - x) * _PI3))
    return arg ** (1.0 / 3.0) + 20.0 * x


def _g_bubbly(x, geo, D, rho_l, rho_v, mu_l):
    _, _, A_Ld, A_Vd, _, P_id = geo
    if A_Vd <= 0.0 or P_id <= 0.0:
        return 0.0                    # limit as the vapour area vanishes
    arg = (256.0 * A_Vd * A_Ld ** 2 * D ** 1.25 * rho_l * (rho_l - rho_v) * g
           / (0.3164 * (1.0 - x) ** 1.75 * _PI2 * P_id * mu_l ** 0.25))
    return arg ** (1.0 / 1.75)


def _q_crit(rho_l, rho_v, sigma, h_lv):
    """Kutateladze-Zuber pool-boiling maximum heat flux, the scale of q in the map [W/m^2]."""
    return 0.131 * math.sqrt(rho_v) * h_lv * (g * (rho_l - rho_v) * sigma) ** 0.25


def _x_ia(rho_l, rho_v, mu_l, mu_v):
    # X_tt = ((1-x)/x)^0.875 (rho_v/rho_l)^0.5 (mu_l/mu_v)^0.125 = 0.34 solved for x
    return 1.0 / (1.0 + 0.34 ** (1.0 / 0.875) * (rho_v / rho_l) ** (-1.0 / 1.75)
                  * (mu_l / mu_v) ** (-1.0 / 7.0))


def wojtan_dryout_qualities(G, q, D, rho_l, rho_v, sigma, h_lv):
    """Dryout onset and completion qualities (x_di, x_de) in a horizontal tube.

    Wojtan, Ursenbacher & Thome (2005) fit of Mori et al. (2000):

    .. math:: x_{di} = 0.58 \\exp[0.52 - 0.235 We_V^{0.17} Fr_{V,Mori}^{0.37}
              (\\rho_V/\\rho_L)^{0.25} (q/q_{crit})^{0.70}]

    .. math:: x_{de} = 0.61 \\exp[0.57 - 5.8\\times10^{-3} We_V^{0.38}
              Fr_{V,Mori}^{0.15} (\\rho_V/\\rho_L)^{-0.09} (q/q_{crit})^{0.27}]

    with We_V = G^2 D / (rho_v sigma), Fr_V,Mori = G^2 / (rho_v (rho_l - rho_v) g D)
    and q_crit = 0.131 rho_v^0.5 h_lv (g (rho_l - rho_v) sigma)^0.25 (Kutateladze).
    They are the map's G_dryout and G_mist boundaries solved for x: x > x_di(G)
    is the same statement as G > G_dryout(x).

    Limits, documented: q <= 0 (adiabatic) gives the G- and q-independent
    maxima x_di = 0.58 e^0.52 = 0.9756 and x_de = 0.61 e^0.57 = 1.078; x_de is
    capped at 1 (mist not reached before saturated vapour) and x_di at x_de
    (Wojtan's condition G_dryout <= G_mist). Data base: R22 and R410A,
    G = 70-700 kg/m^2/s, q = 2-57.5 kW/m^2, D = 8-13.84 mm [memory].

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    q : float
        Heat flux at the wall; values <= 0 are treated as adiabatic [W/m^2]
    D : float
        Inner tube diameter [m]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]

    Returns
    -------
    x_di, x_de : tuple of float
        Qualities at the onset and at the completion of dryout [-]

    References
    ----------
    Wojtan, L., Ursenbacher, T. & Thome, J.R. (2005) Investigation of flow
    boiling in horizontal tubes: Part II - Development of a new heat transfer
    model for stratified-wavy, dryout and mist flow regimes, Int. J. Heat Mass
    Transfer 48, 2970-2985. Mori, H., Yoshida, S., Ohishi, K. & Kakimoto, Y.
    (2000) Dryout quality and post-dryout heat transfer coefficient in
    horizontal evaporator tubes, Proc. 3rd European Thermal Sciences Conf., 839-844.
    """
    return _dryout_qualities(G, max(q, 0.0) / _q_crit(rho_l, rho_v, sigma, h_lv),
                             D, rho_l, rho_v, sigma)


def _dryout_qualities(G, r, D, rho_l, rho_v, sigma):
    we_v = G * G * D / (rho_v * sigma)
    fr_v = G * G / (rho_v * (rho_l - rho_v) * g * D)
    ratio = rho_v / rho_l
    x_di = 0.58 * math.exp(0.52 - 0.235 * we_v ** 0.17 * fr_v ** 0.37 * ratio ** 0.25 * r ** 0.70)
    x_de = 0.61 * math.exp(0.57 - 5.8e-3 * we_v ** 0.38 * fr_v ** 0.15 * ratio ** -0.09 * r ** 0.27)
    x_de = min(x_de, 1.0)
    return min(x_di, x_de), x_de


def _g_dryout_mist(x, r, D, rho_l, rho_v, sigma):
    """The papers' closed forms of G_dryout(x) and G_mist(x) [kg/m^2/s]; r = q / q_crit."""
    if r <= 0.0:
        return math.inf, math.inf     # adiabatic: no dryout at any G
    a = D / (rho_v * sigma)
    b = 1.0 / (g * D * rho_v * (rho_l - rho_v))
    ratio = rho_v / rho_l
    k_d = math.log(0.58 / x) + 0.52
    k_m = math.log(0.61 / x) + 0.57
    # k <= 0: already past the boundary at G -> 0
    G_d = (k_d / 0.235 * a ** -0.17 * b ** -0.37 * ratio ** -0.25 * r ** -0.70) ** 0.926 if k_d > 0 else 0.0
    G_m = (k_m / 0.0058 * a ** -0.38 * b ** -0.15 * ratio ** 0.09 * r ** -0.27) ** 0.943 if k_m > 0 else 0.0
    return G_d, G_m


class WojtanTransitions(NamedTuple):
    """Boundaries of the Wojtan et al. (2005) map at one state (G in [kg/m^2/s])."""

    x_IA: float           #: intermittent/annular quality (X_tt = 0.34) [-]
    G_strat: float        #: stratified / stratified-wavy; G_strat(x_IA) below x_IA
    G_wavy: float         #: stratified-wavy (or slug) / intermittent-annular, at x
    G_slug: float         #: G_wavy(x_IA): slug-stratified-wavy / slug, for x < x_IA
    G_bubbly: float       #: intermittent / bubbly
    G_dryout: float       #: annular / dryout, closed form (raised to G_strat)
    G_mist: float         #: dryout / mist, closed form (raised to G_strat)
    x_di: float           #: dryout onset quality at this G [-]
    x_de: float           #: dryout completion quality at this G [-]
    void_fraction: float  #: Steiner/Rouhani-Axelsson void fraction at (G, x) [-]
    theta_strat: float    #: stratified (dry) angle, Biberg's approximation [rad]


def wojtan_transitions(G, x, D, q, rho_l, rho_v, mu_l, mu_v, sigma, h_lv):
    """All boundaries of the Wojtan et al. (2005) map at one state, for plotting and for
    flow-pattern heat-transfer models (dry angle, G_wavy, G_strat). See
    ``wojtan_ursenbacher_thome_2005`` for the formulas, arguments and units;
    G_dryout/G_mist are the papers' closed forms (their exponents 0.926 and
    0.943 are rounded inverses of the x_di/x_de fits, which the classification
    uses; the two differ by < 0.5 %).
    """
    xc = min(max(x, _X_EDGE), 1.0 - _X_EDGE)
    r = max(q, 0.0) / _q_crit(rho_l, rho_v, sigma, h_lv)
    F1, F2, we_fr = _wavy_exponents(r, D, rho_l, sigma)
    x_ia = _x_ia(rho_l, rho_v, mu_l, mu_v)
    geo = _geometry(G, xc, rho_l, rho_v, sigma)
    G_wavy = _g_wavy(xc, geo, D, rho_l, rho_v, F1, F2, we_fr)
    if xc < x_ia:   # Wojtan: horizontal S and slug boundaries left of x_IA
        geo_ia = _geometry(G, x_ia, rho_l, rho_v, sigma)
        G_strat = _g_strat(x_ia, geo_ia, rho_l, rho_v, mu_l)
        G_slug = _g_wavy(x_ia, geo_ia, D, rho_l, rho_v, F1, F2, we_fr)
    else:
        G_strat = _g_strat(xc, geo, rho_l, rho_v, mu_l)
        G_slug = G_wavy
    G_dryout, G_mist = _g_dryout_mist(xc, r, D, rho_l, rho_v, sigma)
    x_di, x_de = _dryout_qualities(G, r, D, rho_l, rho_v, sigma)
    return WojtanTransitions(
        x_ia, G_strat, G_wavy, G_slug, _g_bubbly(xc, geo, D, rho_l, rho_v, mu_l),
        max(min(G_dryout, G_mist), G_strat), max(G_mist, G_strat),
        x_di, x_de, geo[0], 2.0 * (math.pi - geo[1]),
    )


@register(
    "flow_pattern",
    "Wojtan-Ursenbacher-Thome (2005) horizontal-tube map (Kattan-Thome-Favrat 1998 updated)",
    validity={"G": (70.0, 700.0), "D": (0.008, 0.014), "q": (0.0, 57.5e3)},
    orientations=("horizontal",),
    references=(
        "Wojtan, L., Ursenbacher, T. & Thome, J.R. (2005) Investigation of flow boiling in "
        "horizontal tubes: Part I - A new diabatic two-phase flow pattern map, "
        "Int. J. Heat Mass Transfer 48, 2955-2969",
        "Wojtan, L., Ursenbacher, T. & Thome, J.R. (2005) Investigation of flow boiling in "
        "horizontal tubes: Part II - Development of a new heat transfer model for "
        "stratified-wavy, dryout and mist flow regimes, Int. J. Heat Mass Transfer 48, 2970-2985",
        "Kattan, N., Thome, J.R. & Favrat, D. (1998) Flow boiling in horizontal tubes: Part 1 - "
        "Development of a diabatic two-phase flow pattern map, J. Heat Transfer 120, 140-147, "
        "doi:10.1115/1.2830037",
        "Biberg, D. (1999) An explicit approximation for the wetted angle in two-phase "
        "stratified pipe flow, Can. J. Chem. Eng. 77, 1221-1224",
        "Steiner, D. (1993) VDI-Waermeatlas, chapter Hbb, VDI-Verlag, Duesseldorf",
    ),
    notes="Validity: the Wojtan (R22, R410A, D 8 and 13.84 mm, G 70-700, q 2-57.5 kW/m^2) "
          "and Kattan (R134a, R123, R402A, R404A, R502, D 10.92 and 12 mm, G 100-500) data "
          "bases [memory]. Wojtan's slug/stratified-wavy zone is reported as "
          "'stratified-wavy' (partly dry top wall). Dryout and mist override the "
          "stratified-wavy and intermittent zones above G_strat.",
)
def wojtan_ursenbacher_thome_2005(G, x, D, q, rho_l, rho_v, mu_l, mu_v, sigma, h_lv):
    """Flow pattern in a horizontal tube from the Wojtan et al. (2005) map.

    The Kattan-Thome-Favrat (1998) map with Wojtan's updates. Geometry of the
    stratified flow from the void fraction (Steiner 1993, Rouhani-Axelsson;
    ``void_fraction.steiner_1993``):

    .. math:: \\varepsilon = \\frac{x}{\\rho_V}\\left[(1+0.12(1-x))
              \\left(\\frac{x}{\\rho_V}+\\frac{1-x}{\\rho_L}\\right)
              + \\frac{1.18(1-x)[g\\sigma(\\rho_L-\\rho_V)]^{0.25}}{G\\rho_L^{0.5}}\\right]^{-1}

    and the stratified angle from Biberg's (1999) explicit approximation

    .. math:: \\theta_{strat} = 2\\pi - 2\\{\\pi(1-\\varepsilon) + (3\\pi/2)^{1/3}
              [1 - 2(1-\\varepsilon) + (1-\\varepsilon)^{1/3} - \\varepsilon^{1/3}]
              - \\tfrac{1}{200}(1-\\varepsilon)\\varepsilon[1-2(1-\\varepsilon)]
              [1 + 4((1-\\varepsilon)^2+\\varepsilon^2)]\\}

    giving A_Ld = (pi/4)(1 - eps), A_Vd = (pi/4) eps, h_Ld = (1 - cos((2 pi -
    theta_strat)/2))/2 and P_id = sin((2 pi - theta_strat)/2). Boundaries
    (G in kg/m^2/s):

    * stratified-wavy: G_wavy = {16 A_Vd^3 g D rho_L rho_V / (x^2 pi^2
      (1-(2h_Ld-1)^2)^0.5) [pi^2/(25 h_Ld^2) (1-x)^-F1 (We/Fr)_L^-F2 + 1]}^0.5 + 50,
      F1 = 646 (q/q_crit)^2 + 64.8 q/q_crit, F2 = 18.8 q/q_crit + 1.023,
      (We/Fr)_L = g D^2 rho_L / sigma, q_crit = 0.131 rho_V^0.5 h_lv
      (g (rho_L-rho_V) sigma)^0.25; Wojtan dropped Kattan's -75 exp(...) term.
    * stratified: G_strat = {226.3^2 A_Ld A_Vd^2 rho_V (rho_L-rho_V) mu_L g
      / (x^2 (1-x) pi^3)}^(1/3) + 20 x, and G_strat(x_IA) for x < x_IA
      (Kattan's + 20 x term kept [memory, medium confidence that Wojtan kept it];
      it moves the boundary by at most 20 kg/m^2/s).
    * intermittent/annular: x_IA from X_tt = 0.34 with Kattan's exponents
      (0.875, 0.5, 0.125): x_IA = {0.34^(1/0.875) (rho_V/rho_L)^(-1/1.75)
      (mu_L/mu_V)^(-1/7) + 1}^-1.
    * bubbly: G_bubbly = {256 A_Vd A_Ld^2 D^1.25 rho_L (rho_L-rho_V) g /
      (0.3164 (1-x)^1.75 pi^2 P_id mu_L^0.25)}^(1/1.75), for x < x_IA.
    * dryout and mist: x >= x_di(G), x >= x_de(G) from
      ``wojtan_dryout_qualities`` (equivalent to G >= G_dryout(x), G_mist(x)).

    Zones, in order of precedence: G < G_strat stratified; x >= x_de mist;
    x >= x_di dryout; for x < x_IA: G < G_wavy(x_IA) Wojtan's slug/stratified-
    wavy zone (reported "stratified-wavy"), G < G_wavy(x) "slug", G > G_bubbly
    "bubbly", else "intermittent"; for x >= x_IA: G < G_wavy "stratified-wavy",
    else "annular". The dryout/mist zones overriding stratified-wavy follows
    Wojtan's conditions G_dryout = max(G_dryout, G_strat), G_dryout <= G_mist
    [memory of the paper]; without it, G_wavy's heat-flux rise at high x would
    send mist flow back to stratified-wavy.

    Limits, documented: x <= 0 "single-phase liquid", x >= 1 "single-phase
    vapour"; G <= 0 (no flow) "stratified", the limit of the map as G -> 0;
    q <= 0 adiabatic (F1 = 0, no dryout before x = 0.9756); the boundary
    formulas are evaluated with x kept within [1e-9, 1 - 1e-9] (their limits
    at x -> 0 and x -> 1 are finite or +inf) and exponentials are capped, so
    no state gives NaN or an overflow.

    Validity: Wojtan's data, R22 and R410A at 5 degC, D = 8.00 and 13.84 mm,
    G = 70-700 kg/m^2/s, q = 2-57.5 kW/m^2; Kattan's, five refrigerants,
    D = 10.92 and 12.00 mm, G = 100-500 kg/m^2/s [memory].

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner tube diameter [m]
    q : float
        Heat flux at the wall; values <= 0 are treated as adiabatic [W/m^2]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    mu_v : float
        Vapour viscosity [Pa*s]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]

    Returns
    -------
    pattern : str
        One of ``PATTERNS`` [-]

    References
    ----------
    Wojtan, Ursenbacher & Thome (2005) Parts I and II, Int. J. Heat Mass
    Transfer 48, 2955-2969 and 2970-2985; Kattan, Thome & Favrat (1998)
    J. Heat Transfer 120, 140-147, doi:10.1115/1.2830037; Biberg (1999)
    Can. J. Chem. Eng. 77, 1221-1224; Steiner (1993) VDI-Waermeatlas, Hbb.
    """
    if x <= 0.0:
        return "single-phase liquid"
    if x >= 1.0:
        return "single-phase vapour"
    if G <= 0.0:
        return "stratified"
    # the zones of wojtan_transitions, evaluated lazily in order of precedence
    xc = min(max(x, _X_EDGE), 1.0 - _X_EDGE)
    x_ia = _x_ia(rho_l, rho_v, mu_l, mu_v)
    geo = _geometry(G, xc, rho_l, rho_v, sigma)
    geo_ia = _geometry(G, x_ia, rho_l, rho_v, sigma) if xc < x_ia else geo
    if G < _g_strat(max(xc, x_ia), geo_ia, rho_l, rho_v, mu_l):
        return "stratified"
    r = max(q, 0.0) / _q_crit(rho_l, rho_v, sigma, h_lv)
    x_di, x_de = _dryout_qualities(G, r, D, rho_l, rho_v, sigma)
    if x >= x_de:
        return "mist"
    if x >= x_di:
        return "dryout"
    F1, F2, we_fr = _wavy_exponents(r, D, rho_l, sigma)
    if xc < x_ia:
        if G < _g_wavy(x_ia, geo_ia, D, rho_l, rho_v, F1, F2, we_fr):
            return "stratified-wavy"      # Wojtan's slug + stratified-wavy zone
        if G < _g_wavy(xc, geo, D, rho_l, rho_v, F1, F2, we_fr):
            return "slug"
        return "bubbly" if G > _g_bubbly(xc, geo, D, rho_l, rho_v, mu_l) else "intermittent"
    if G < _g_wavy(xc, geo, D, rho_l, rho_v, F1, F2, we_fr):
        return "stratified-wavy"
    return "annular"


# --------------------------------------------------------------------------
# Vertical up-flow: Taitel, Bornea (Barnea) & Dukler (1980)
# --------------------------------------------------------------------------

@register(
    "flow_pattern", "Taitel-Bornea-Dukler (1980) vertical up-flow map",
    validity={"D": (0.025, 0.051)}, orientations=("vertical",),
    references=(
        "Taitel, Y., Bornea, D. & Dukler, A.E. (1980) Modelling flow pattern transitions for "
        "steady upward gas-liquid flow in vertical tubes, AIChE J. 26(3), 345-354, "
        "doi:10.1002/aic.690260304",
    ),
    notes="Mechanistic model checked against air-water data in 2.5 and 5.1 cm tubes. "
          "Churn is the entrance-length form and is predicted only when the distance z "
          "from the inlet is given; without z the flow is taken as developed (slug).",
)
def taitel_bornea_dukler_1980(G, x, D, rho_l, rho_v, mu_l, sigma, *, z=None):
    """Flow pattern in vertical upward flow from the Taitel-Bornea-Dukler (1980) model.

    Superficial velocities U_GS = G x / rho_v, U_LS = G (1-x) / rho_l,
    U_M = U_GS + U_LS. Transitions implemented (the paper's equation numbers):

    * churn/slug -> annular (eq. 13): annular when the Kutateladze number
      U_GS rho_v^0.5 / (g sigma (rho_l - rho_v))^0.25 >= 3.1; independent of
      D and of the liquid rate.
    * dispersed bubble (eq. 9), reported "bubbly": U_M >= 4.0 [D^0.429
      (sigma/rho_l)^0.089 nu_l^-0.072 (g (rho_l - rho_v)/rho_l)^0.446] and no-slip
      void U_GS/U_M <= 0.52 (eq. 10, the packing limit beyond which bubbles
      coalesce).
    * bubbly -> slug (eq. 4): bubbly while U_LS >= 3.0 U_GS - 1.15 (g (rho_l -
      rho_v) sigma / rho_l^2)^0.25, i.e. void fraction below 0.25 with the
      Harmathy rise velocity 1.53 (g (rho_l - rho_v) sigma / rho_l^2)^0.25;
      only in tubes with D >= 19.01 ((rho_l - rho_v) sigma / (rho_l^2 g))^0.5
      (eq. 6), where Taylor bubbles rise faster than small bubbles (about 5 cm
      for air-water); in smaller tubes low flow rates give slug directly.
    * slug <-> churn, entrance-length form (eq. 11): churn while the distance
      from the inlet z < l_E = 40.6 D (U_M / (g D)^0.5 + 0.22). Simplification:
      with z=None the flow is taken as developed (z -> infinity), so no churn
      is predicted and slug goes straight to annular.

    Limits, documented: x <= 0 "single-phase liquid", x >= 1 "single-phase
    vapour"; G <= 0 is taken as no flow (U_GS = U_LS = 0: bubbly in a large
    tube, slug in a small one). Validity: the model is mechanistic; the paper
    compared it with air-water at 25 degC, 0.1 MPa, in 2.5 and 5.1 cm tubes.

    Parameters
    ----------
    G : float
        Mass flux, upward [kg/m^2/s]
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
    sigma : float
        Surface tension [N/m]
    z : float
        Distance from the tube inlet (or from the onset of boiling); None for
        developed flow [m]

    Returns
    -------
    pattern : str
        One of "bubbly", "slug", "churn", "annular" or the single-phase names [-]

    References
    ----------
    Taitel, Y., Bornea, D. & Dukler, A.E. (1980) AIChE J. 26(3), 345-354,
    doi:10.1002/aic.690260304 (the second author is Dvora Barnea; the paper
    printed "Bornea").
    """
    if x <= 0.0:
        return "single-phase liquid"
    if x >= 1.0:
        return "single-phase vapour"
    G = max(G, 0.0)
    d_rho = rho_l - rho_v
    u_gs = G * x / rho_v
    u_ls = G * (1.0 - x) / rho_l
    u_m = u_gs + u_ls
    if u_gs * math.sqrt(rho_v) >= 3.1 * (g * sigma * d_rho) ** 0.25:
        return "annular"
    u_dispersed = 4.0 * (D ** 0.429 * (sigma / rho_l) ** 0.089 * (mu_l / rho_l) ** -0.072
                         * (g * d_rho / rho_l) ** 0.446)
    if u_m >= u_dispersed and u_gs <= 0.52 * u_m:
        return "bubbly"
    # sqrt(d_rho sigma / (rho_l^2 g)) is the capillary length times d_rho / rho_l
    d_min = 19.01 * laplace_length(sigma, rho_l, rho_v) * d_rho / rho_l
    if D >= d_min and u_ls >= 3.0 * u_gs - 1.15 * (g * d_rho * sigma / rho_l ** 2) ** 0.25:
        return "bubbly"
    if z is not None and z < 40.6 * D * (u_m / math.sqrt(g * D) + 0.22):
        return "churn"
    return "slug"
