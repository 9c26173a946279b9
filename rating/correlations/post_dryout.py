"""Beyond dryout and before it: the wall-temperature forms the march needs.

After dryout the liquid film is gone and the wall is cooled by vapour carrying
droplets; a flow-boiling correlation must never be extrapolated there. Before
saturation, in subcooled flow boiling, the wall temperature follows from an
asymptotic sum of forced convection and nucleate boiling.
"""
from __future__ import annotations

import math

from .registry import register


@register(
    "post_dryout", "Dougall-Rohsenow (1963)",
    validity={"x": (0.0, 1.0)},
    references=(
        "Dougall, R.S. & Rohsenow, W.M. (1963) Film boiling on the inside of vertical tubes "
        "with upward flow of the fluid at low vapor qualities, MIT Report 9079-26",
        "Collier, J.G. & Thome, J.R. (1994) Convective Boiling and Condensation, 3rd ed., "
        "Oxford, section 9.4",
    ),
    notes="Homogeneous-flow vapour convection, thermal equilibrium assumed; it tends to "
          "over-predict the coefficient (under-predict the wall temperature) at low quality.",
)
def dougall_rohsenow_1963(G, x, D, rho_l, rho_v, mu_v, k_v, cp_v):
    """Post-dryout coefficient from Dittus-Boelter on a homogeneous vapour flow.

    .. math:: htc = 0.023 \\frac{k_v}{D}
              \\left[\\frac{G D}{\\mu_v}\\left(x + \\frac{\\rho_v}{\\rho_l}(1-x)\\right)\\right]^{0.8}
              Pr_v^{0.4}

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality, clipped to [0, 1] [-]
    D : float
        Inner tube diameter [m]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    mu_v : float
        Vapour viscosity [Pa*s]
    k_v : float
        Vapour thermal conductivity [W/m/K]
    cp_v : float
        Vapour specific heat [J/kg/K]

    Returns
    -------
    htc : float
        Wall-to-fluid coefficient [W/m^2/K]

    References
    ----------
    Dougall & Rohsenow (1963); Collier & Thome (1994) section 9.4.
    """
    x = min(max(x, 0.0), 1.0)
    Re = G * D / mu_v * (x + rho_v / rho_l * (1.0 - x))
    Pr = cp_v * mu_v / k_v
    return 0.023 * k_v / D * Re**0.8 * Pr**0.4


@register(
    "subcooled_boiling", "Liu-Winterton (1991), subcooled form",
    validity={"Re_lo": (None, None)},
    references=(
        "Liu, Z. & Winterton, R.H.S. (1991) A general correlation for saturated and subcooled "
        "flow boiling in tubes and annuli, based on a nucleate pool boiling equation, "
        "Int. J. Heat Mass Transfer 34(11), 2759-2766, doi:10.1016/0017-9310(91)90234-6",
    ),
    notes="q^2 = (htc_l (T_w - T_b))^2 + (S htc_pool (T_w - T_sat))^2 with F = 1; "
          "the nucleate term starts when the wall reaches T_sat, which keeps the wall "
          "temperature continuous at the onset of boiling.",
)
def liu_winterton_1991_subcooled(q, T_bulk, T_sat, htc_liquid, htc_pool, G, D, mu_l):
    """Wall temperature in subcooled flow boiling, Liu & Winterton's asymptotic sum.

    .. math:: q^2 = [htc_l (T_w - T_b)]^2 + [S\\,htc_{pool} (T_w - T_{sat})]^2,
              \\quad S = (1 + 0.055\\,Re_{lo}^{0.16})^{-1}

    solved in closed form for T_w (the larger root). When the single-phase wall
    temperature T_b + q/htc_l does not exceed T_sat there is no nucleate term and
    that single-phase value is returned.

    Parameters
    ----------
    q : float
        Heat flux at the wall [W/m^2]
    T_bulk : float
        Bulk liquid temperature [K]
    T_sat : float
        Local saturation temperature [K]
    htc_liquid : float
        Single-phase liquid coefficient, all flow as liquid [W/m^2/K]
    htc_pool : float
        Nucleate pool boiling coefficient at the heat flux q [W/m^2/K]
    G : float
        Mass flux [kg/m^2/s]
    D : float
        Inner tube diameter [m]
    mu_l : float
        Liquid viscosity [Pa*s]

    Returns
    -------
    T_wall : float
        Wall temperature [K]

    References
    ----------
    Liu & Winterton (1991), IJHMT 34, 2759.
    """
    T_single = T_bulk + q / htc_liquid
    if T_single <= T_sat:
        return T_single
    S = 1.0 / (1.0 + 0.055 * (G * D / mu_l) ** 0.16)
    a2 = htc_liquid**2
    b2 = (S * htc_pool) ** 2
    mean = (a2 * T_bulk + b2 * T_sat) / (a2 + b2)
    disc = (a2 + b2) * q * q - a2 * b2 * (T_bulk - T_sat) ** 2
    return mean + math.sqrt(max(disc, 0.0)) / (a2 + b2)
