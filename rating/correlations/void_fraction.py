"""Void fraction alpha (vapour share of the flow area) of a two-phase flow.

Every registered method returns alpha [-] in [0, 1]. Qualities outside the
two-phase range are single-phase: x <= 0 gives 0 and x >= 1 gives 1 (the
limits of every formula here), handled explicitly so that no formula is
evaluated at x = 0.
"""
from __future__ import annotations

import math

from .dimensionless import g
from .registry import register

_QUALITY = {"x": (0.0, 1.0)}


def _slip_void(x, rho_l, rho_v, S):
    """alpha = 1 / (1 + S (1-x)/x rho_v/rho_l) for a slip ratio S = u_v/u_l."""
    return 1.0 / (1.0 + S * (1.0 - x) / x * rho_v / rho_l)


@register(
    "void_fraction", "Homogeneous (no slip)",
    validity=_QUALITY,
    references=(
        "Collier, J.G. & Thome, J.R. (1994) Convective Boiling and Condensation, 3rd ed., "
        "Oxford University Press, ch. 2 (homogeneous model)",
    ),
)
def homogeneous(x, rho_l, rho_v):
    """Homogeneous void fraction, both phases at the same velocity.

    .. math:: \\alpha = \\left[1 + \\frac{1-x}{x}\\frac{\\rho_v}{\\rho_l}\\right]^{-1}

    Parameters
    ----------
    x : float
        Vapour mass quality [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]

    Returns
    -------
    alpha : float
        Void fraction [-]

    References
    ----------
    Collier, J.G. & Thome, J.R. (1994) Convective Boiling and Condensation,
    3rd ed., Oxford University Press.
    """
    if x <= 0.0:
        return 0.0
    if x >= 1.0:
        return 1.0
    return _slip_void(x, rho_l, rho_v, 1.0)


@register(
    "void_fraction", "Zivi (1964), minimum entropy production",
    validity=_QUALITY,
    references=(
        "Zivi, S.M. (1964) Estimation of steady-state steam void-fraction by means of the "
        "principle of minimum entropy production, J. Heat Transfer 86, 247-251, "
        "doi:10.1115/1.3687113",
    ),
)
def zivi_1964(x, rho_l, rho_v):
    """Zivi's void fraction, slip ratio S = (rho_l/rho_v)^(1/3).

    .. math:: \\alpha = \\left[1 + \\frac{1-x}{x}
              \\left(\\frac{\\rho_v}{\\rho_l}\\right)^{2/3}\\right]^{-1}

    Annular flow without entrainment; a lower bound of alpha in practice.

    Parameters
    ----------
    x : float
        Vapour mass quality [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]

    Returns
    -------
    alpha : float
        Void fraction [-]

    References
    ----------
    Zivi, S.M. (1964) Estimation of steady-state steam void-fraction by means
    of the principle of minimum entropy production, Journal of Heat Transfer
    86, 247-251, doi:10.1115/1.3687113.
    """
    if x <= 0.0:
        return 0.0
    if x >= 1.0:
        return 1.0
    return _slip_void(x, rho_l, rho_v, (rho_l / rho_v) ** (1.0 / 3.0))


@register(
    "void_fraction", "Chisholm (1972) slip ratio",
    validity=_QUALITY,
    references=(
        "Chisholm, D. (1972) An equation for velocity ratio in two-phase flow, "
        "NEL Report 535, National Engineering Laboratory, East Kilbride",
    ),
)
def chisholm_1972(x, rho_l, rho_v):
    """Chisholm's void fraction from his slip ratio.

    .. math:: S = \\left[1 - x\\left(1 - \\frac{\\rho_l}{\\rho_v}\\right)\\right]^{1/2},
              \\qquad \\alpha = \\left[1 + S\\frac{1-x}{x}\\frac{\\rho_v}{\\rho_l}\\right]^{-1}

    Parameters
    ----------
    x : float
        Vapour mass quality [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]

    Returns
    -------
    alpha : float
        Void fraction [-]

    References
    ----------
    Chisholm, D. (1972) An equation for velocity ratio in two-phase flow,
    NEL Report 535, National Engineering Laboratory, East Kilbride.
    """
    if x <= 0.0:
        return 0.0
    if x >= 1.0:
        return 1.0
    return _slip_void(x, rho_l, rho_v, math.sqrt(1.0 - x * (1.0 - rho_l / rho_v)))


def _drift_flux(x, rho_l, rho_v, sigma, G, C0):
    """Drift-flux void fraction with Rouhani-Axelsson's drift velocity."""
    v_gj = 1.18 * (1.0 - x) * (g * sigma * (rho_l - rho_v)) ** 0.25 / math.sqrt(rho_l)
    return x / rho_v / (C0 * (x / rho_v + (1.0 - x) / rho_l) + v_gj / G)


_RA_C0 = {"horizontal": 0.12, "I": 0.2, "II": 0.2}


@register(
    "void_fraction", "Rouhani-Axelsson (1970) drift flux",
    validity=_QUALITY,
    references=(
        "Rouhani, S.Z. & Axelsson, E. (1970) Calculation of void volume fraction in the "
        "subcooled and quality boiling regions, Int. J. Heat Mass Transfer 13, 383-393, "
        "doi:10.1016/0017-9310(70)90114-6",
        "Steiner, D. (1993) Stroemungssieden gesaettigter Fluessigkeiten, VDI-Waermeatlas, "
        "section Hbb, VDI-Verlag (the horizontal-tube C0)",
    ),
    notes='variant "horizontal": C0 = 1 + 0.12(1-x) (Steiner, the same as steiner_1993); '
          '"I": C0 = 1 + 0.2(1-x); "II" (vertical, needs D): '
          'C0 = 1 + 0.2(1-x)(g D rho_l^2/G^2)^0.25.',
)
def rouhani_axelsson_1970(x, rho_l, rho_v, sigma, G, *, D=None, variant="horizontal"):
    """Rouhani-Axelsson drift-flux void fraction.

    .. math::
        \\alpha = \\frac{x}{\\rho_v}\\left[C_0\\left(\\frac{x}{\\rho_v}
        + \\frac{1-x}{\\rho_l}\\right) + \\frac{v_{gj}}{G}\\right]^{-1},
        \\qquad v_{gj} = \\frac{1.18 (1-x) [g \\sigma (\\rho_l - \\rho_v)]^{1/4}}{\\rho_l^{1/2}}

    Distribution parameter C0 by ``variant``:

    * "horizontal": C0 = 1 + 0.12 (1-x), Steiner's form for horizontal tubes
      (VDI Heat Atlas); identical to ``steiner_1993``;
    * "I": C0 = 1 + 0.2 (1-x);
    * "II": C0 = 1 + 0.2 (1-x) (g D rho_l^2 / G^2)^(1/4), for vertical tubes
      (needs D).

    x <= 0 and G <= 0 (the limit as G -> 0) give 0, x >= 1 gives 1.
    The forms are those quoted by Steiner (1993) and by Xu & Fang (2014) and
    Woldesemayat & Ghajar (2007), as implemented in fluids (``Steiner``,
    ``Rouhani_1``, ``Rouhani_2``).

    Parameters
    ----------
    x : float
        Vapour mass quality [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    sigma : float
        Surface tension [N/m]
    G : float
        Mass flux [kg/m^2/s]
    D : float
        Inner diameter, needed by variant "II" only [m]
    variant : str
        "horizontal", "I" or "II" [-]

    Returns
    -------
    alpha : float
        Void fraction [-]

    References
    ----------
    Rouhani, S.Z. & Axelsson, E. (1970) Calculation of void volume fraction in
    the subcooled and quality boiling regions, International Journal of Heat
    and Mass Transfer 13, 383-393, doi:10.1016/0017-9310(70)90114-6.
    Steiner, D. (1993) VDI-Waermeatlas, section Hbb, VDI-Verlag.
    """
    if variant not in _RA_C0:
        raise ValueError(f"variant must be one of {sorted(_RA_C0)}, not {variant!r}")
    if variant == "II" and D is None:
        raise ValueError('variant "II" needs the diameter D')
    if x <= 0.0 or G <= 0.0:  # no vapour, or no flow: v_gj / G -> inf
        return 0.0
    if x >= 1.0:
        return 1.0
    C0 = 1.0 + _RA_C0[variant] * (1.0 - x) * (
        (g * D * rho_l * rho_l / (G * G)) ** 0.25 if variant == "II" else 1.0)
    return _drift_flux(x, rho_l, rho_v, sigma, G, C0)


@register(
    "void_fraction", "Steiner (1993), Rouhani-Axelsson for horizontal tubes",
    validity=_QUALITY, orientations=("horizontal",),
    references=(
        "Steiner, D. (1993) Stroemungssieden gesaettigter Fluessigkeiten, VDI-Waermeatlas, "
        "section Hbb, VDI-Verlag; VDI Heat Atlas, 2nd ed. (2010), Springer",
    ),
    notes='The same as rouhani_axelsson_1970 with variant "horizontal".',
)
def steiner_1993(x, rho_l, rho_v, sigma, G):
    """Steiner's drift-flux void fraction for horizontal tubes.

    .. math::
        \\alpha = \\frac{x}{\\rho_v}\\left[(1 + 0.12(1-x))\\left(\\frac{x}{\\rho_v}
        + \\frac{1-x}{\\rho_l}\\right) + \\frac{1.18 (1-x)
        [g \\sigma (\\rho_l - \\rho_v)]^{1/4}}{G \\rho_l^{1/2}}\\right]^{-1}

    Rouhani-Axelsson's drift flux with Steiner's distribution parameter;
    ``rouhani_axelsson_1970`` with variant "horizontal" is the same formula.
    Same as ``fluids.Steiner``.

    Parameters
    ----------
    x : float
        Vapour mass quality [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    sigma : float
        Surface tension [N/m]
    G : float
        Mass flux [kg/m^2/s]

    Returns
    -------
    alpha : float
        Void fraction [-]

    References
    ----------
    Steiner, D. (1993) Stroemungssieden gesaettigter Fluessigkeiten,
    VDI-Waermeatlas, section Hbb, VDI-Verlag; VDI Heat Atlas, 2nd ed.
    (2010), Springer.
    """
    return rouhani_axelsson_1970(x, rho_l, rho_v, sigma, G, variant="horizontal")
