"""Film condensation of a pure vapour: the heating side of a steam-heated reboiler.

Every function is a published correlation, SI in and out, returning a film
coefficient htc [W/m^2/K]:

* ``nusselt_vertical_1916``: Nusselt's laminar film on a vertical surface,
  mean over a height.
* ``nusselt_kutateladze_labuntsov_mean`` / ``..._local``: the vertical film as
  a function of the film Reynolds number Re_f = 4 Gamma / mu_l (Gamma the
  condensate mass flow per unit wetted perimeter [kg/m/s]): laminar (Nusselt),
  wavy-laminar (Kutateladze 1963) and turbulent (Labuntsov 1957). The local
  form is the one a march along the tube uses; ``film_reynolds_vertical``
  turns a height and a wall temperature difference into Re_f.
* ``nusselt_horizontal_tube``: Nusselt's film on a horizontal tube, with
  Kern's (1958) row correction for a tube bundle.
* ``shah_1979``: condensation inside a tube.

``dT`` is always T_sat - T_wall [K] (positive when the vapour condenses).
"""
from __future__ import annotations

import math

from .dimensionless import g, prandtl, reynolds
from .registry import register
from .single_phase import dittus_boelter_1930

_NUSSELT_1916 = (
    "Nusselt, W. (1916) Die Oberflaechenkondensation des Wasserdampfes, "
    "Z. VDI 60, 541-546 and 569-575"
)
_ROHSENOW_1956 = (
    "Rohsenow, W.M. (1956) Heat transfer and temperature distribution in laminar film "
    "condensation, Trans. ASME 78, 1645-1648 (modified latent heat h_lv + 0.68 cp_l dT)"
)
_CENGEL = (
    "Cengel, Y.A. & Ghajar, A.J., Heat and Mass Transfer: Fundamentals and Applications, "
    "McGraw-Hill, chapter 'Boiling and condensation' (film condensation section: "
    "presentation of the vertical-plate regimes and of the horizontal-tube constant 0.729)"
)

#: Film Reynolds numbers at which the vertical-film regimes change. 30: onset of
#: waves (Kutateladze's mean form meets Nusselt's there). 1600: Labuntsov's
#: turbulent mean form is continuous with Kutateladze's here (8750 = 1.08
#: 1600^1.22 - 5.2 and 253 = 1600^0.75); some textbooks quote 1800.
RE_WAVY = 30.0
RE_TURBULENT = 1600.0


def _modified_latent_heat(h_lv, dT, cp_l):
    """Rohsenow's h_lv* = h_lv + 0.68 cp_l dT (condensate subcooling), or h_lv."""
    return h_lv if cp_l is None else h_lv + 0.68 * cp_l * dT


def _film_scale(rho_l, rho_v, mu_l, k_l):
    """k_l (g rho_l (rho_l - rho_v) / mu_l^2)^(1/3) [W/m^2/K]: the film coefficient scale."""
    return k_l * (g * rho_l * (rho_l - rho_v) / mu_l**2) ** (1.0 / 3.0)


# --------------------------------------------------------------------------
# Vertical surface
# --------------------------------------------------------------------------

@register(
    "condensation", "Nusselt (1916), laminar film on a vertical surface",
    validity={"dT": (0.0, None), "L": (0.0, None)},
    references=(_NUSSELT_1916, _ROHSENOW_1956),
    notes="Wave-free laminar film: valid for film Reynolds numbers below about 30 "
          "(Kutateladze); waves raise the coefficient above this by up to ~20 %, and "
          "the film is turbulent above Re_f ~ 1600 - use "
          "nusselt_kutateladze_labuntsov_mean there. dT <= 0 returns inf (no film).",
)
def nusselt_vertical_1916(L, dT, rho_l, rho_v, mu_l, k_l, h_lv, *, cp_l=None):
    """Nusselt's mean laminar film coefficient on a vertical surface of height L.

    .. math:: htc = 0.943 \\left[\\frac{g \\rho_l (\\rho_l - \\rho_v) k_l^3 h_{lv}^*}
              {\\mu_l \\Delta T L}\\right]^{1/4}

    0.943 = 2 sqrt(2)/3. With ``cp_l`` the latent heat is Rohsenow's
    h_lv* = h_lv + 0.68 cp_l dT, which accounts for the subcooling of the
    condensate film; without it, the plain h_lv (Nusselt's original). Valid for
    a smooth, wave-free laminar film (Re_f < ~30). When dT <= 0 no condensate
    forms and the film resistance is zero, and over a zero height (L <= 0) the
    mean is the infinite top-edge value: ``inf`` is returned in both cases.

    Parameters
    ----------
    L : float
        Height of the surface (length along the flow of condensate) [m]
    dT : float
        T_sat - T_wall [K]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    cp_l : float
        Liquid specific heat; None for the plain latent heat [J/kg/K]

    Returns
    -------
    htc : float
        Mean film coefficient over the height L [W/m^2/K]

    References
    ----------
    Nusselt, W. (1916) Z. VDI 60, 541-546 and 569-575; Rohsenow, W.M. (1956)
    Trans. ASME 78, 1645-1648.
    """
    if dT <= 0.0 or L <= 0.0:
        return math.inf
    h_star = _modified_latent_heat(h_lv, dT, cp_l)
    return (2.0 * math.sqrt(2.0) / 3.0) * (
        g * rho_l * (rho_l - rho_v) * k_l**3 * h_star / (mu_l * dT * L)) ** 0.25


def _mean_denominator(Re_f, Pr_l):
    """F(Re_f) with mean htc = Re_f K / F(Re_f), K = ``_film_scale``; F(0) = 0.

    The mean coefficient over the height from the top of the surface to where
    the film reaches Re_f is Re_f K / F(Re_f); the local coefficient there is
    K / F'(Re_f). Each published mean form below is the integral of its local
    law from the previous transition (constants as published, so the branches
    meet to 0.4 % at Re_f = 30 and 0.05 % at 1600).
    """
    if Re_f < RE_WAVY:  # Nusselt: htc_mean = (4/3)^(4/3) Re^(-1/3) K
        return (0.75 * Re_f) ** (4.0 / 3.0)
    if Re_f < RE_TURBULENT:  # Kutateladze (1963), wavy laminar
        return 1.08 * Re_f**1.22 - 5.2
    # Labuntsov (1957), turbulent
    return 8750.0 + 58.0 * Pr_l**-0.5 * (Re_f**0.75 - 253.0)


def _mean_denominator_slope(Re_f, Pr_l):
    """dF/dRe_f, so that the local coefficient is K / F'(Re_f)."""
    if Re_f < RE_WAVY:
        return (0.75 * Re_f) ** (1.0 / 3.0)  # = (4/3)^(-1/3) Re^(1/3)
    if Re_f < RE_TURBULENT:
        return 1.08 * 1.22 * Re_f**0.22
    return 0.75 * 58.0 * Pr_l**-0.5 * Re_f**-0.25


_VERTICAL_REFERENCES = (
    _NUSSELT_1916,
    "Kutateladze, S.S. (1963) Fundamentals of Heat Transfer, Edward Arnold, London / "
    "Academic Press, New York (wavy-laminar film, 30 < Re_f < 1600)",
    "Labuntsov, D.A. (1957) Heat transfer in film condensation of pure steam on vertical "
    "surfaces and horizontal tubes, Teploenergetika 4(7), 72-80 (turbulent film)",
    _CENGEL,
)
_VERTICAL_NOTES = (
    "Regimes by film Reynolds number Re_f = 4 Gamma / mu_l: laminar (Nusselt) below 30, "
    "wavy laminar (Kutateladze) 30-1600, turbulent (Labuntsov) above 1600. The turbulent "
    "switch is put at 1600, where Labuntsov's published constants (8750, 253 = 1600^0.75) "
    "make the mean continuous with Kutateladze's (to 0.05 %); Cengel quotes 1800, where "
    "the mean would jump by a few per cent (3.4 % for water at 1 atm). The local "
    "coefficient jumps at 1600 (by +28 % for Pr_l = 1.75): that is in the published "
    "forms. g/nu^2 is taken as "
    "g rho_l (rho_l - rho_v)/mu_l^2. The sources state no upper limit of Re_f or Pr_l."
)


@register(
    "condensation", "Nusselt / Kutateladze / Labuntsov vertical film, mean over the height",
    validity={"Re_f": (0.0, None)},
    references=_VERTICAL_REFERENCES,
    notes=_VERTICAL_NOTES,
)
def nusselt_kutateladze_labuntsov_mean(Re_f, rho_l, rho_v, mu_l, k_l, cp_l):
    """Mean film coefficient on a vertical surface with total condensate Re_f.

    The mean is over the height from the top of the surface (no condensate) to
    where the film Reynolds number is Re_f = 4 Gamma / mu_l (Gamma the total
    condensate flow per unit wetted perimeter), with K = k_l (g/nu_l^2)^(1/3):

    * Re_f < 30, laminar (Nusselt 1916): htc = 1.4675 Re_f^(-1/3) K
    * 30 <= Re_f < 1600, wavy laminar (Kutateladze 1963):
      htc = Re_f K / (1.08 Re_f^1.22 - 5.2)
    * Re_f >= 1600, turbulent (Labuntsov 1957):
      htc = Re_f K / (8750 + 58 Pr_l^-0.5 (Re_f^0.75 - 253))

    At Re_f <= 0 (no condensate) the limit ``inf`` is returned.

    Parameters
    ----------
    Re_f : float
        Film Reynolds number at the bottom of the height, 4 Gamma / mu_l [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat (Prandtl number of the turbulent branch) [J/kg/K]

    Returns
    -------
    htc : float
        Mean film coefficient [W/m^2/K]

    References
    ----------
    Nusselt (1916); Kutateladze, S.S. (1963) Fundamentals of Heat Transfer;
    Labuntsov, D.A. (1957) Teploenergetika 4(7), 72-80; as presented by
    Cengel & Ghajar, Heat and Mass Transfer, film condensation section.
    """
    if Re_f <= 0.0:
        return math.inf
    Pr_l = prandtl(cp_l, mu_l, k_l)
    return Re_f * _film_scale(rho_l, rho_v, mu_l, k_l) / _mean_denominator(Re_f, Pr_l)


@register(
    "condensation", "Nusselt / Kutateladze / Labuntsov vertical film, local",
    validity={"Re_f": (0.0, None)},
    references=_VERTICAL_REFERENCES,
    notes=_VERTICAL_NOTES,
)
def nusselt_kutateladze_labuntsov_local(Re_f, rho_l, rho_v, mu_l, k_l, cp_l):
    """Local film coefficient on a vertical surface where the film has Re_f.

    The local law of which ``nusselt_kutateladze_labuntsov_mean`` is the
    integral: with mean htc = Re_f K / F(Re_f), the local coefficient is
    K / F'(Re_f), K = k_l (g/nu_l^2)^(1/3):

    * Re_f < 30: htc = (4/3)^(1/3) Re_f^(-1/3) K = k_l / film thickness (Nusselt)
    * 30 <= Re_f < 1600: htc = K / (1.3176 Re_f^0.22) (Kutateladze)
    * Re_f >= 1600: htc = K Re_f^0.25 Pr_l^0.5 / 43.5 (Labuntsov's local law,
      Nu = 0.023 Re_f^0.25 Pr_l^0.5)

    so that a march along the surface, dRe_f/dz = 4 htc dT / (mu_l h_lv*),
    reproduces the mean form. At Re_f <= 0 (top edge, zero film thickness)
    the limit ``inf`` is returned.

    Parameters
    ----------
    Re_f : float
        Local film Reynolds number, 4 Gamma / mu_l [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat (Prandtl number of the turbulent branch) [J/kg/K]

    Returns
    -------
    htc : float
        Local film coefficient [W/m^2/K]

    References
    ----------
    Nusselt (1916); Kutateladze (1963); Labuntsov (1957), see
    ``nusselt_kutateladze_labuntsov_mean``.
    """
    if Re_f <= 0.0:
        return math.inf
    Pr_l = prandtl(cp_l, mu_l, k_l)
    return _film_scale(rho_l, rho_v, mu_l, k_l) / _mean_denominator_slope(Re_f, Pr_l)


def film_reynolds_vertical(L, dT, rho_l, rho_v, mu_l, k_l, cp_l, h_lv):
    """Film Reynolds number at the bottom of a vertical surface of height L [-].

    Solves Re_f = 4 htc_mean(Re_f) L dT / (mu_l h_lv*) with the mean forms of
    ``nusselt_kutateladze_labuntsov_mean``, h_lv* = h_lv + 0.68 cp_l dT. Each
    branch inverts in closed form: with A = 4 L dT K / (mu_l h_lv*), F(Re_f) = A.
    In the wavy range this is Cengel's
    Re_f = [4.81 + 3.70 L k_l dT / (mu_l h_lv*) (g/nu_l^2)^(1/3)]^0.820.
    dT <= 0 gives 0 (no condensate).

    Parameters
    ----------
    L : float
        Height of the surface [m]
    dT : float
        T_sat - T_wall [K]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    h_lv : float
        Latent heat of vaporisation [J/kg]

    Returns
    -------
    Re_f : float
        Film Reynolds number 4 Gamma / mu_l at the bottom of the surface [-]
    """
    if dT <= 0.0:
        return 0.0
    Pr_l = prandtl(cp_l, mu_l, k_l)
    A = (4.0 * L * dT * _film_scale(rho_l, rho_v, mu_l, k_l)
         / (mu_l * _modified_latent_heat(h_lv, dT, cp_l)))
    if A <= (0.75 * RE_WAVY) ** (4.0 / 3.0):  # F at the end of the laminar branch
        return A**0.75 / 0.75
    if A <= 1.08 * RE_TURBULENT**1.22 - 5.2:  # F at the end of the wavy branch
        return ((A + 5.2) / 1.08) ** (1.0 / 1.22)
    return ((A - 8750.0) * Pr_l**0.5 / 58.0 + 253.0) ** (4.0 / 3.0)


# --------------------------------------------------------------------------
# Horizontal tube (shell-side steam on a bundle)
# --------------------------------------------------------------------------

@register(
    "condensation", "Nusselt (1916), horizontal tube, Kern (1958) row correction",
    validity={"dT": (0.0, None), "rows": (1.0, None)},
    references=(
        _NUSSELT_1916,
        _ROHSENOW_1956,
        "Kern, D.Q. (1958) Mathematical development of tube loading in horizontal "
        "condensers, AIChE J. 4(2), 157-160, doi:10.1002/aic.690040208",
        _CENGEL,
    ),
    notes="C = 0.729 is the exact solution of Nusselt's equations for a cylinder; "
          "Nusselt's own 1916 value is 0.725. Bundle: mean over a vertical column of "
          "`rows` tubes, htc_N = htc_1 rows^(-1/6) (Kern 1958), which allows for the "
          "splashing of the falling condensate; Nusselt's own N^(-1/4) is more "
          "pessimistic. Laminar film, no vapour shear. dT <= 0 returns inf.",
)
def nusselt_horizontal_tube(D, dT, rho_l, rho_v, mu_l, k_l, h_lv, *, cp_l=None, C=0.729,
                            rows=1):
    """Nusselt's film coefficient on a horizontal tube, Kern's bundle correction.

    .. math:: htc = C \\left[\\frac{g \\rho_l (\\rho_l - \\rho_v) k_l^3 h_{lv}^*}
              {\\mu_l \\Delta T D}\\right]^{1/4} N^{-1/6}

    C = 0.729 (exact numerical value of Nusselt's analysis; 0.725 in
    Nusselt 1916). N = ``rows`` is the number of tubes in a vertical column;
    the mean coefficient of the column is the single-tube value times
    N^(-1/6) (Kern 1958), the usual bundle correction. With ``cp_l`` the
    latent heat is Rohsenow's h_lv* = h_lv + 0.68 cp_l dT. Laminar film,
    quiescent vapour. dT <= 0 (no condensate) returns ``inf``; rows < 1 is
    taken as 1 (and reported by the validity range).

    Parameters
    ----------
    D : float
        Tube outer diameter [m]
    dT : float
        T_sat - T_wall [K]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    cp_l : float
        Liquid specific heat; None for the plain latent heat [J/kg/K]
    C : float
        Leading constant, 0.729 or Nusselt's 0.725 [-]
    rows : int
        Number of tubes in a vertical column of the bundle [-]

    Returns
    -------
    htc : float
        Mean film coefficient of the column [W/m^2/K]

    References
    ----------
    Nusselt (1916); Rohsenow (1956); Kern, D.Q. (1958) AIChE J. 4(2),
    157-160, doi:10.1002/aic.690040208.
    """
    if dT <= 0.0:
        return math.inf
    h_star = _modified_latent_heat(h_lv, dT, cp_l)
    single = C * (g * rho_l * (rho_l - rho_v) * k_l**3 * h_star / (mu_l * dT * D)) ** 0.25
    return single * max(rows, 1) ** (-1.0 / 6.0)


# --------------------------------------------------------------------------
# Inside a tube
# --------------------------------------------------------------------------

@register(
    "condensation", "Shah (1979), in-tube condensation",
    validity={"p_r": (0.002, 0.44), "G": (10.8, 210.6), "D": (0.007, 0.040),
              "Pr_l": (1.0, 13.0), "x": (0.0, 1.0)},
    references=(
        "Shah, M.M. (1979) A general correlation for heat transfer during film "
        "condensation inside pipes, Int. J. Heat Mass Transfer 22(4), 547-556, "
        "doi:10.1016/0017-9310(79)90058-9",
    ),
    notes="Database ranges (reduced pressure 0.002-0.44, G 10.8-210.6 kg/m^2/s, D 7-40 mm, "
          "Pr_l 1-13) [memory]. Same form as ht.Shah. The liquid density is not an input: "
          "the liquid-only Reynolds number is G D / mu_l. x outside [0, 1] is clipped; "
          "x = 1 gives 0 (no condensate film: the desuperheating zone needs a "
          "single-phase vapour method).",
)
def shah_1979(G, x, D, mu_l, k_l, cp_l, P, P_crit):
    """Shah's in-tube film condensation coefficient.

    .. math:: htc = htc_{lo} \\left[(1-x)^{0.8} + \\frac{3.8 x^{0.76} (1-x)^{0.04}}
              {p_r^{0.38}}\\right]

    htc_lo = 0.023 Re_lo^0.8 Pr_l^0.4 k_l / D (Dittus-Boelter with the whole
    flow as liquid, Re_lo = G D / mu_l), p_r = P / P_crit. x is clipped to
    [0, 1]: x = 0 gives the all-liquid value htc_lo, x = 1 gives 0.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner diameter [m]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    P : float
        Pressure [Pa]
    P_crit : float
        Critical pressure [Pa]

    Returns
    -------
    htc : float
        Condensation coefficient [W/m^2/K]

    References
    ----------
    Shah, M.M. (1979) Int. J. Heat Mass Transfer 22(4), 547-556,
    doi:10.1016/0017-9310(79)90058-9.
    """
    x = min(max(x, 0.0), 1.0)
    htc_lo = dittus_boelter_1930(reynolds(G, D, mu_l), prandtl(cp_l, mu_l, k_l)) * k_l / D
    p_r = P / P_crit
    return htc_lo * ((1.0 - x) ** 0.8 + 3.8 * x**0.76 * (1.0 - x) ** 0.04 / p_r**0.38)
