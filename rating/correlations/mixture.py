"""Mixture corrections of the nucleate boiling coefficient.

Each function returns a factor F = htc_mixture / htc_ideal [-] (at most 1) by
which a nucleate boiling coefficient computed as if the mixture were a pure
fluid is multiplied, to allow for the diffusion resistance that lowers boiling
of a mixture with a boiling range.
"""
from __future__ import annotations

import math

from .registry import register


@register(
    "mixture", "Palen & Small mixture factor exp(-0.027 BR)",
    validity={"boiling_range": (0.0, None)},
    references=(
        "Palen, J.W. & Small, W.M. (1964) A new way to design kettle and internal "
        "reboilers, Hydrocarbon Processing 43(11), 199-208",
        "Wolverine Tube Engineering Data Book II, ch. 5, kettle reboiler design example "
        "(F_m = exp(-0.015 x 60 F) = 0.41)",
    ),
    notes="F_m = exp(-0.015 BR[F]) = exp(-0.027 BR[K]); BR = dew minus bubble point of "
          "the liquid at the bundle. A negative boiling range is taken as 0.",
)
def palen_small_mixture_factor(boiling_range):
    """Palen & Small's empirical mixture factor on the nucleate coefficient.

    .. math:: F_m = \\exp(-0.027\\, BR), \\quad BR \\text{ in K}

    the published exp(-0.015 BR) with BR in degF, converted exactly
    (0.015 x 1.8 = 0.027). A negative boiling range (not physical) is treated
    as 0 and gives F_m = 1; the registry reports it.

    Parameters
    ----------
    boiling_range : float
        Boiling range, dew point minus bubble point of the mixture [K]

    Returns
    -------
    F_m : float
        Mixture factor htc_mixture / htc_ideal [-]

    References
    ----------
    Palen, J.W. & Small, W.M. (1964) Hydrocarbon Processing 43(11), 199-208;
    Wolverine Tube Engineering Data Book II ch. 5 (kettle design example).
    """
    return math.exp(-0.027 * max(boiling_range, 0.0))


def _mass_transfer_factor(q, htc_ideal, dT_driving, rho_l, h_lv, beta_L, B0):
    """htc/htc_ideal = 1 / (1 + (htc_ideal/q) dT (1 - exp(-B0 q/(rho_l h_lv beta_L))))."""
    a = B0 / (rho_l * h_lv * beta_L)  # [m^2/W]
    # (1 - exp(-a q))/q written with expm1; its limit as q -> 0 is a
    penetration = -math.expm1(-a * q) / q if q > 0.0 else a
    return 1.0 / (1.0 + htc_ideal * max(dT_driving, 0.0) * penetration)


@register(
    "mixture", "Thome & Shakir (1987)",
    validity={"boiling_range": (0.0, None)},
    references=(
        "Thome, J.R. & Shakir, S. (1987) A new correlation for nucleate pool boiling of "
        "aqueous mixtures, AIChE Symp. Ser. 83(257), 46-51",
    ),
    notes="[memory] form: htc_id/htc = 1 + (htc_id/q) BR (1 - exp(-B0 q/(rho_l h_lv "
          "beta_L))), B0 = 1, beta_L = 0.0003 m/s.",
)
def thome_shakir_1987(q, htc_ideal, boiling_range, rho_l, h_lv, *, beta_L=3e-4, B0=1.0):
    """Thome & Shakir's mass-transfer reduction of the mixture boiling coefficient.

    .. math:: \\frac{htc_{id}}{htc} = 1 + \\frac{htc_{id}}{q} \\Delta T_{bp}
              \\left[1 - \\exp\\left(\\frac{-B_0 q}{\\rho_l h_{lv} \\beta_L}\\right)\\right]

    with the boiling range Delta T_bp (dew minus bubble point at the liquid
    composition), B0 = 1 and beta_L = 0.0003 m/s. Returns htc / htc_id. As
    q -> 0 the bracket over q tends to B0/(rho_l h_lv beta_L), which is used
    for q <= 0. Written from memory of the published form [memory].

    Parameters
    ----------
    q : float
        Heat flux [W/m^2]
    htc_ideal : float
        Ideal (no mass-transfer resistance) nucleate coefficient [W/m^2/K]
    boiling_range : float
        Dew point minus bubble point at the liquid composition [K]
    rho_l : float
        Liquid density [kg/m^3]
    h_lv : float
        Latent heat of vaporisation of the mixture [J/kg]
    beta_L : float
        Liquid-phase mass transfer coefficient [m/s]
    B0 : float
        Empirical scaling factor, 1 in the published fit [-]

    Returns
    -------
    F : float
        htc_mixture / htc_ideal [-]

    References
    ----------
    Thome, J.R. & Shakir, S. (1987) AIChE Symp. Ser. 83(257), 46-51.
    """
    return _mass_transfer_factor(q, htc_ideal, boiling_range, rho_l, h_lv, beta_L, B0)
