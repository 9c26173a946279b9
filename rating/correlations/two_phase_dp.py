"""Two-phase pressure gradients inside tubes.

Registered methods (family ``two_phase_friction``) return the frictional
pressure gradient -dP/dz [Pa/m], positive. The acceleration and gravity terms
of the momentum balance are plain functions (``acceleration_pressure_drop``,
``gravity_gradient``) fed with a void fraction from ``void_fraction``.

The single-phase gradients inside the separated-flow methods use the Darcy
friction factor of ``colebrook_1939`` (64/Re below Re = 2300, Colebrook above,
wall roughness included), except Lockhart-Martinelli, which keeps its own.
At x <= 0 every method returns the liquid-only gradient, at x >= 1 the
vapour-only gradient (the limits of their formulas).
"""
from __future__ import annotations

import math

from .dimensionless import g, reynolds
from .registry import register
from .single_phase import colebrook_1939


def _gradient(G, D, rho, mu, roughness):
    """Single-phase frictional gradient f G^2 / (2 D rho) [Pa/m] at mass flux G."""
    if G <= 0.0:
        return 0.0
    f = colebrook_1939(reynolds(G, D, mu), relative_roughness=roughness / D)
    return f * G * G / (2.0 * D * rho)


_QUALITY = {"x": (0.0, 1.0)}


@register(
    "two_phase_friction", "Friedel (1979)",
    validity=_QUALITY,
    references=(
        "Friedel, L. (1979) Improved friction pressure drop correlations for horizontal and "
        "vertical two-phase pipe flow, European Two-Phase Flow Group Meeting, Ispra, paper E2; "
        "3R International 18, 485-491",
        "Ghiaasiaan, S.M. (2007) Two-Phase Flow, Boiling, and Condensation in Conventional "
        "and Miniature Systems, Cambridge University Press (worked example: 730 Pa/m)",
    ),
    notes="Exponent 0.045 on Fr (fluids uses 0.0454: +0.04 % x ln Fr at most). Horizontal "
          "flow and vertical upflow; poor for mu_l/mu_v > 1000.",
)
def friedel_1979(G, x, D, rho_l, rho_v, mu_l, mu_v, sigma, *, roughness=0.0):
    """Friedel's two-phase frictional pressure gradient.

    .. math::
        -\\left(\\frac{dP}{dz}\\right)_f = \\phi_{lo}^2 \\frac{f_{lo} G^2}{2 D \\rho_l},
        \\qquad \\phi_{lo}^2 = E + \\frac{3.24 F H}{Fr^{0.045} We^{0.035}}

    with E = (1-x)^2 + x^2 rho_l f_vo / (rho_v f_lo), F = x^0.78 (1-x)^0.224,
    H = (rho_l/rho_v)^0.91 (mu_v/mu_l)^0.19 (1 - mu_v/mu_l)^0.7,
    Fr = G^2/(g D rho_h^2), We = G^2 D/(sigma rho_h) and the homogeneous
    density 1/rho_h = x/rho_v + (1-x)/rho_l. f_lo and f_vo are the Darcy
    friction factors with the whole flow as liquid and as vapour.

    Form chosen: the exponent on Fr is 0.045, as most secondary sources
    quote the paper; fluids uses 0.0454, which raises phi_lo^2 by at most
    0.04 % x ln Fr. Ghiaasiaan's worked example (phi_lo^2 = 38.64) is
    reproduced by 0.045 (38.650; 0.0454 gives 38.569). The friction factors
    are the smooth-tube law Friedel used, f = 64/Re below Re = 1055 and
    [0.86859 ln(Re/(1.964 ln Re - 3.8215))]^-2 above (the paper's appendix,
    as quoted by the Modelica FluidDissipation library); Colebrook's equation
    (``colebrook_1939``) agrees with it within 0.1 % for Re = 1e4-1e7 and adds
    the wall roughness. The worked example used Blasius' 0.316 Re^-0.25
    (730 Pa/m), 1.4 % below this form there. Horizontal flow and vertical
    upflow; known to be poor for mu_l/mu_v > 1000.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner diameter [m]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    mu_v : float
        Vapour viscosity [Pa*s]
    sigma : float
        Surface tension [N/m]
    roughness : float
        Absolute wall roughness [m]

    Returns
    -------
    dPdz : float
        Frictional pressure gradient, positive [Pa/m]

    References
    ----------
    Friedel, L. (1979) Improved friction pressure drop correlations for
    horizontal and vertical two-phase pipe flow, European Two-Phase Flow Group
    Meeting, Ispra, paper E2 (also 3R International 18, 485-491). Ghiaasiaan,
    S.M. (2007) Two-Phase Flow, Boiling, and Condensation, Cambridge
    University Press.
    """
    if G <= 0.0:
        return 0.0
    x = min(max(x, 0.0), 1.0)
    Re_lo, Re_vo = reynolds(G, D, mu_l), reynolds(G, D, mu_v)
    f_lo = colebrook_1939(Re_lo, relative_roughness=roughness / D)
    f_vo = colebrook_1939(Re_vo, relative_roughness=roughness / D)
    return (friedel_multiplier(G, x, D, rho_l, rho_v, mu_l, mu_v, sigma, f_lo, f_vo)
            * f_lo * G * G / (2.0 * D * rho_l))


def friedel_multiplier(G, x, D, rho_l, rho_v, mu_l, mu_v, sigma, f_lo, f_vo):
    """Friedel's liquid-only multiplier phi_lo^2 [-] for given friction factors f_lo, f_vo."""
    E = (1.0 - x) ** 2 + x * x * rho_l * f_vo / (rho_v * f_lo)
    F = x**0.78 * (1.0 - x) ** 0.224
    H = (rho_l / rho_v) ** 0.91 * (mu_v / mu_l) ** 0.19 * (1.0 - mu_v / mu_l) ** 0.7
    rho_h = 1.0 / (x / rho_v + (1.0 - x) / rho_l)
    Fr = G * G / (g * D * rho_h * rho_h)
    We = G * G * D / (sigma * rho_h)
    return E + 3.24 * F * H / (Fr**0.045 * We**0.035)


@register(
    "two_phase_friction", "Mueller-Steinhagen & Heck (1986)",
    validity=_QUALITY,
    references=(
        "Mueller-Steinhagen, H. & Heck, K. (1986) A simple friction pressure drop correlation "
        "for two-phase flow in pipes, Chem. Eng. Process. 20, 297-308, "
        "doi:10.1016/0255-2701(86)80008-3",
    ),
    notes="Single-phase gradients with Colebrook (the paper: Blasius, laminar below 1187).",
)
def muller_steinhagen_heck_1986(G, x, D, rho_l, rho_v, mu_l, mu_v, *, roughness=0.0):
    """Mueller-Steinhagen and Heck's two-phase frictional pressure gradient.

    .. math::
        -\\left(\\frac{dP}{dz}\\right)_f = [A + 2(B - A)x](1-x)^{1/3} + B x^3

    A and B are the gradients with the whole flow as liquid and as vapour. The
    paper computed them with 64/Re (Re < 1187) and Blasius' 0.3164 Re^-0.25;
    here they come from ``colebrook_1939`` (same as fluids), which holds
    beyond Re = 1e5 and takes the wall roughness. Any quality, 0 to 1.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner diameter [m]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    mu_v : float
        Vapour viscosity [Pa*s]
    roughness : float
        Absolute wall roughness [m]

    Returns
    -------
    dPdz : float
        Frictional pressure gradient, positive [Pa/m]

    References
    ----------
    Mueller-Steinhagen, H. & Heck, K. (1986) A simple friction pressure drop
    correlation for two-phase flow in pipes, Chemical Engineering and
    Processing 20, 297-308, doi:10.1016/0255-2701(86)80008-3.
    """
    x = min(max(x, 0.0), 1.0)
    A = _gradient(G, D, rho_l, mu_l, roughness)
    B = _gradient(G, D, rho_v, mu_v, roughness)
    return (A + 2.0 * (B - A) * x) * (1.0 - x) ** (1.0 / 3.0) + B * x**3


def _lm_phase(G_k, D, rho, mu, Re_c):
    """Lockhart-Martinelli single-phase gradient and whether the phase is turbulent."""
    Re = reynolds(G_k, D, mu)
    f = 64.0 / Re if Re < Re_c else 0.184 * Re**-0.2
    return f * G_k * G_k / (2.0 * D * rho), Re >= Re_c


#: Chisholm's C by (liquid turbulent, vapour turbulent).
_CHISHOLM_C = {(True, True): 20.0, (False, True): 12.0, (True, False): 10.0, (False, False): 5.0}


@register(
    "two_phase_friction", "Lockhart-Martinelli (1949) with Chisholm's C",
    validity=_QUALITY,
    references=(
        "Lockhart, R.W. & Martinelli, R.C. (1949) Proposed correlation of data for isothermal "
        "two-phase, two-component flow in pipes, Chem. Eng. Prog. 45, 39-48",
        "Chisholm, D. (1967) A theoretical basis for the Lockhart-Martinelli correlation for "
        "two-phase flow, Int. J. Heat Mass Transfer 10, 1767-1778, "
        "doi:10.1016/0017-9310(67)90047-6",
    ),
    notes="Own friction factors (64/Re below Re = 2000, 0.184 Re^-0.2 above), smooth tube. "
          "C by regime (tt 20, vt 12, tv 10, vv 5) or fixed.",
)
def lockhart_martinelli_1949(G, x, D, rho_l, rho_v, mu_l, mu_v, *, C=None):
    """Lockhart-Martinelli frictional pressure gradient in Chisholm's form.

    .. math::
        -\\left(\\frac{dP}{dz}\\right)_f = \\phi_l^2 \\left(\\frac{dP}{dz}\\right)_l,
        \\qquad \\phi_l^2 = 1 + \\frac{C}{X} + \\frac{1}{X^2},
        \\qquad X^2 = \\frac{(dP/dz)_l}{(dP/dz)_v}

    (dP/dz)_l and (dP/dz)_v are the gradients of each phase flowing alone
    (mass fluxes G(1-x) and Gx), with the friction factors of the original
    work: 64/Re below Re = 2000, 0.184 Re^-0.2 above (with these, X equals
    the Martinelli parameter X_tt when both phases are turbulent). Chisholm's
    C by regime of (liquid, vapour): turbulent-turbulent 20, laminar-turbulent
    12, turbulent-laminar 10, laminar-laminar 5; or a fixed C. Smooth tubes
    only (the method has no roughness). Developed for horizontal adiabatic flow.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner diameter [m]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    mu_v : float
        Vapour viscosity [Pa*s]
    C : float
        Chisholm's constant; None to choose it by flow regime [-]

    Returns
    -------
    dPdz : float
        Frictional pressure gradient, positive [Pa/m]

    References
    ----------
    Lockhart, R.W. & Martinelli, R.C. (1949) Chemical Engineering Progress 45,
    39-48. Chisholm, D. (1967) A theoretical basis for the Lockhart-Martinelli
    correlation for two-phase flow, International Journal of Heat and Mass
    Transfer 10, 1767-1778, doi:10.1016/0017-9310(67)90047-6.
    """
    Re_c = 2000.0
    if G <= 0.0:
        return 0.0
    if x <= 0.0:
        return _lm_phase(G, D, rho_l, mu_l, Re_c)[0]
    if x >= 1.0:
        return _lm_phase(G, D, rho_v, mu_v, Re_c)[0]
    dp_l, turb_l = _lm_phase(G * (1.0 - x), D, rho_l, mu_l, Re_c)
    dp_v, turb_v = _lm_phase(G * x, D, rho_v, mu_v, Re_c)
    if C is None:
        C = _CHISHOLM_C[(turb_l, turb_v)]
    X = math.sqrt(dp_l / dp_v)
    return dp_l * (1.0 + C / X + 1.0 / (X * X))


@register(
    "two_phase_friction", "Homogeneous flow, McAdams mixture viscosity",
    validity=_QUALITY,
    references=(
        "McAdams, W.H., Woods, W.K. & Heroman, L.C. (1942) Vaporization inside horizontal "
        "tubes II: benzene-oil mixtures, Trans. ASME 64, 193-200",
        "Colebrook, C.F. (1939) Turbulent flow in pipes, J. Inst. Civil Eng. 11, 133-156",
    ),
    notes="f(Re_h) from Colebrook with roughness; 1/mu_h = x/mu_v + (1-x)/mu_l.",
)
def homogeneous_mcadams_1942(G, x, D, rho_l, rho_v, mu_l, mu_v, *, roughness=0.0):
    """Homogeneous-flow frictional pressure gradient.

    .. math::
        -\\left(\\frac{dP}{dz}\\right)_f = \\frac{f(Re_h) G^2}{2 D \\rho_h},
        \\qquad \\frac{1}{\\rho_h} = \\frac{x}{\\rho_v} + \\frac{1-x}{\\rho_l},
        \\qquad \\frac{1}{\\mu_h} = \\frac{x}{\\mu_v} + \\frac{1-x}{\\mu_l}

    Re_h = G D / mu_h with McAdams' mixture viscosity; f is the Darcy
    friction factor of ``colebrook_1939`` (64/Re laminar). Best at high
    reduced pressure and high mass flux, where the phases move together.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Vapour mass quality [-]
    D : float
        Inner diameter [m]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    mu_l : float
        Liquid viscosity [Pa*s]
    mu_v : float
        Vapour viscosity [Pa*s]
    roughness : float
        Absolute wall roughness [m]

    Returns
    -------
    dPdz : float
        Frictional pressure gradient, positive [Pa/m]

    References
    ----------
    McAdams, W.H., Woods, W.K. & Heroman, L.C. (1942) Vaporization inside
    horizontal tubes II: benzene-oil mixtures, Transactions of the ASME 64,
    193-200. Colebrook, C.F. (1939) Journal of the Institution of Civil
    Engineers 11, 133-156.
    """
    x = min(max(x, 0.0), 1.0)
    rho_h = 1.0 / (x / rho_v + (1.0 - x) / rho_l)
    mu_h = 1.0 / (x / mu_v + (1.0 - x) / mu_l)
    return _gradient(G, D, rho_h, mu_h, roughness)


def _momentum_volume(x, alpha, rho_l, rho_v):
    """Separated-flow momentum specific volume x^2/(rho_v alpha) + (1-x)^2/(rho_l (1-alpha))."""
    if (x > 0.0 and alpha <= 0.0) or (x < 1.0 and alpha >= 1.0):
        raise ValueError(f"void fraction {alpha} is inconsistent with quality {x}")
    vap = x * x / (rho_v * alpha) if x > 0.0 else 0.0
    liq = (1.0 - x) ** 2 / (rho_l * (1.0 - alpha)) if x < 1.0 else 0.0
    return vap + liq


def acceleration_pressure_drop(G, x_in, x_out, alpha_in, alpha_out, rho_l, rho_v):
    """Pressure drop from the acceleration of a two-phase flow [Pa], positive when it falls.

    .. math::
        \\Delta P_{acc} = G^2 \\left[\\frac{1}{\\rho_m}\\right]_{in}^{out},
        \\qquad \\frac{1}{\\rho_m} = \\frac{x^2}{\\rho_v \\alpha}
        + \\frac{(1-x)^2}{\\rho_l (1-\\alpha)}

    Separated-flow momentum density; with the homogeneous void fraction it
    reduces to 1/rho_m = x/rho_v + (1-x)/rho_l. Qualities are clamped to
    [0, 1]; x = 0 with alpha = 0 (and x = 1 with alpha = 1) are single-phase.
    A void fraction that cannot go with its quality (vapour flowing with
    alpha = 0) raises ValueError.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x_in : float
        Quality at the inlet of the segment [-]
    x_out : float
        Quality at the outlet of the segment [-]
    alpha_in : float
        Void fraction at the inlet [-]
    alpha_out : float
        Void fraction at the outlet [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]

    Returns
    -------
    dP_acc : float
        Acceleration pressure drop over the segment [Pa]

    References
    ----------
    Collier, J.G. & Thome, J.R. (1994) Convective Boiling and Condensation,
    3rd ed., Oxford University Press, ch. 2 (separated-flow momentum balance).
    """
    v_out = _momentum_volume(min(max(x_out, 0.0), 1.0), alpha_out, rho_l, rho_v)
    v_in = _momentum_volume(min(max(x_in, 0.0), 1.0), alpha_in, rho_l, rho_v)
    return G * G * (v_out - v_in)


def gravity_gradient(alpha, rho_l, rho_v, angle_from_horizontal_rad):
    """Static-head pressure gradient of a two-phase mixture [Pa/m], positive in up-flow.

    .. math:: -\\left(\\frac{dP}{dz}\\right)_g = g \\sin\\theta
              \\,[\\alpha \\rho_v + (1-\\alpha) \\rho_l]

    Parameters
    ----------
    alpha : float
        Void fraction [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    angle_from_horizontal_rad : float
        Flow direction above the horizontal, pi/2 for vertical up-flow [rad]

    Returns
    -------
    dPdz : float
        Gravitational pressure gradient [Pa/m]

    References
    ----------
    Collier, J.G. & Thome, J.R. (1994) Convective Boiling and Condensation,
    3rd ed., Oxford University Press, ch. 2.
    """
    return g * math.sin(angle_from_horizontal_rad) * (alpha * rho_v + (1.0 - alpha) * rho_l)
