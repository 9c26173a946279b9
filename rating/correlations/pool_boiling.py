"""Pool boiling: nucleate coefficients, critical heat flux of a surface and of a
tube bundle, and natural convection on a horizontal cylinder (kettle reboilers).

Every function is a pure published correlation, SI in and out. The nucleate
boiling methods return a coefficient htc [W/m^2/K]; the CHF methods return the
maximum heat flux [W/m^2].
"""
from __future__ import annotations

import math

from ..errors import SupercriticalError
from .dimensionless import g, laplace_length, prandtl
from .registry import register

#: W/m^2 per Btu/(h ft^2) (CHECK-VALUES.md, unit conversions).
_BTU_PER_H_FT2 = 3.154591
#: Pa per psi (CHECK-VALUES.md, unit conversions).
_PSI = 6894.757


def _reduced_pressure(P, P_crit):
    """P / P_crit; at or above the critical point there is no boiling to correlate."""
    p_r = P / P_crit
    if not p_r < 1.0:
        raise SupercriticalError(
            f"P = {P:.6g} Pa is at or above P_crit = {P_crit:.6g} Pa: there is no boiling")
    return p_r


# --------------------------------------------------------------------------
# Nucleate pool boiling coefficient
# --------------------------------------------------------------------------

@register(
    "nucleate_boiling", "Cooper (1984)",
    validity={"p_r": (0.001, 0.9), "M": (2.0, 200.0)},
    references=(
        "Cooper, M.G. (1984) Saturation nucleate pool boiling - a simple correlation, "
        "IChemE Symp. Ser. 86, 785-793",
    ),
    notes="Heat-flux form. Validity range (reduced pressure 0.001-0.9, molar mass 2-200) "
          "[memory]. Roughness is Cooper's Rp (DIN 4762), not the arithmetic mean Ra "
          "that Gorenflo uses.",
)
def cooper_1984(q, P, P_crit, M, *, roughness=1e-6):
    """Cooper's reduced-pressure nucleate pool boiling coefficient.

    .. math:: htc = 55\\, p_r^{0.12 - 0.2\\log_{10} R_p} (-\\log_{10} p_r)^{-0.55} M^{-0.5} q^{0.67}

    with R_p in micrometres (1 um gives the exponent 0.12). Cooper recommends
    multiplying by 1.7 for horizontal copper cylinders; that factor is not applied.
    Valid for reduced pressures of about 0.001 to 0.9 [memory]. q <= 0 returns 0,
    the limit as q -> 0.

    Parameters
    ----------
    q : float
        Heat flux [W/m^2]
    P : float
        Saturation pressure [Pa]
    P_crit : float
        Critical pressure [Pa]
    M : float
        Molar mass [kg/kmol]
    roughness : float
        Surface roughness Rp, old DIN 4762 levelling depth; must be > 0 [m]

    Returns
    -------
    htc : float
        Nucleate boiling coefficient [W/m^2/K]

    References
    ----------
    Cooper, M.G. (1984) Saturation nucleate pool boiling - a simple correlation,
    IChemE Symp. Ser. 86, 785-793. Checked against ``ht.Cooper``.
    """
    p_r = _reduced_pressure(P, P_crit)
    if q <= 0.0:
        return 0.0
    rp_um = roughness * 1e6
    return (55.0 * p_r ** (0.12 - 0.2 * math.log10(rp_um)) * (-math.log10(p_r)) ** -0.55
            * M ** -0.5 * q ** 0.67)


#: Mostinski's constant for Pc in kPa, q in W/m^2, htc in W/m^2/K (ht, HEDH).
_MOSTINSKI_C_KPA = 0.00417


@register(
    "nucleate_boiling", "Mostinski (1963)",
    references=(
        "Mostinski, I.L. (1963) Application of the rule of corresponding states for "
        "calculation of heat transfer and critical heat flux, Teploenergetika 4, 66; "
        "English abstract Br. Chem. Eng. 8, 580",
        "Palen, J.W. (1983) Shell and tube reboilers, Heat Exchanger Design Handbook "
        "sect. 3.6, Hemisphere (the 1.8 p_r^0.17 reboiler form)",
    ),
    notes="Constant 0.00417 with Pc in kPa (SI). Other published unit conventions are "
          "not exactly equivalent: 0.104 (bar) = 0.00434 (kPa); 0.00658 (psia, Btu) = "
          "0.00441 (kPa). No validity range is given in the sources used here.",
)
def mostinski_1963(q, P, P_crit, *, factor_form="full"):
    """Mostinski's reduced-pressure nucleate pool boiling coefficient.

    .. math:: htc = 0.00417\\, P_c^{0.69} q^{0.7} F(p_r), \\quad P_c \\text{ in kPa}

    factor_form "full": F = 1.8 p_r^0.17 + 4 p_r^1.2 + 10 p_r^10 (Mostinski);
    "palen": F = 1.8 p_r^0.17 only (Palen's reboiler form; at p_r = 0.39 it is
    1.54 against 2.84 for the full factor).

    Constant trap (CHECK-VALUES 2b, 10.1): the constant is published in several
    unit systems that are not exactly equivalent. 0.00417 with Pc in kPa (SI) is
    used here, as in ht and the HEDH. Sinnott's 0.104 with Pc in bar equals
    0.00434 in kPa, and 0.00658 with Pc in psia (Btu/h ft^2 F) equals 0.00441 in
    kPa. A worked example in US units (Wolverine Engineering Data Book, kettle
    example) is reproduced only with its own constant; 0.00417 gives about
    5.5 % less. The tests pin the constant. q <= 0 returns 0 (limit as q -> 0).

    Parameters
    ----------
    q : float
        Heat flux [W/m^2]
    P : float
        Saturation pressure [Pa]
    P_crit : float
        Critical pressure [Pa]
    factor_form : str
        "full" (Mostinski) or "palen" (1.8 p_r^0.17 only) pressure factor [-]

    Returns
    -------
    htc : float
        Nucleate boiling coefficient [W/m^2/K]

    References
    ----------
    Mostinski, I.L. (1963) Teploenergetika 4, 66; Palen, J.W. (1983) Heat
    Exchanger Design Handbook sect. 3.6. Checked against ``ht.Montinsky``.
    """
    p_r = _reduced_pressure(P, P_crit)
    if q <= 0.0:
        return 0.0
    if factor_form == "full":
        F = 1.8 * p_r ** 0.17 + 4.0 * p_r ** 1.2 + 10.0 * p_r ** 10
    elif factor_form == "palen":
        F = 1.8 * p_r ** 0.17
    else:
        raise ValueError(f"factor_form must be 'full' or 'palen', not {factor_form!r}")
    return _MOSTINSKI_C_KPA * (P_crit / 1000.0) ** 0.69 * q ** 0.7 * F


#: Gorenflo's reference coefficients h0 [W/m^2/K] at p_r = 0.1, q0 = 20 kW/m^2,
#: Ra0 = 0.4 um, keyed by CAS number. VDI Heat Atlas (1993) sect. Ha, as ht
#: carries them (``ht.boiling_nucleic.h0_Gorenflow_1993``); a subset.
GORENFLO_H0 = {
    "7732-18-5": 5600.0,   # water
    "7664-41-7": 7000.0,   # ammonia
    "124-38-9": 5100.0,    # carbon dioxide
    "74-82-8": 7000.0,     # methane
    "74-84-0": 4500.0,     # ethane
    "74-98-6": 4000.0,     # propane
    "106-97-8": 3600.0,    # n-butane
    "109-66-0": 3400.0,    # n-pentane
    "110-54-3": 3300.0,    # n-hexane
    "142-82-5": 3200.0,    # n-heptane
    "71-43-2": 2900.0,     # benzene
    "108-88-3": 2800.0,    # toluene
    "67-56-1": 5400.0,     # methanol
    "64-17-5": 4400.0,     # ethanol
    "67-63-0": 3000.0,     # isopropanol
    "67-64-1": 3300.0,     # acetone
    "75-71-8": 4000.0,     # R12
    "75-45-6": 3900.0,     # R22
    "811-97-2": 4500.0,    # R134a
    "7727-37-9": 10000.0,  # nitrogen
    "7782-44-7": 9500.0,   # oxygen
    "7440-37-1": 8200.0,   # argon
}


def gorenflo_reference_htc(cas):
    """Gorenflo's published reference coefficient h0 for a fluid, or None.

    Parameters
    ----------
    cas : str
        CAS registry number of the fluid, e.g. "7732-18-5" for water [-]

    Returns
    -------
    h0 : float or None
        Reference coefficient at p_r = 0.1, q0 = 20 kW/m^2, Ra = 0.4 um [W/m^2/K]

    References
    ----------
    VDI Heat Atlas (1993) sect. Ha (Gorenflo), table of h0, as carried by ht 1.2.0.
    """
    return GORENFLO_H0.get(cas)


def nucleate_fluid_constants(method, fluid) -> tuple[dict, dict]:
    """The fluid constants a nucleate method takes beyond the saturation set and flux:
    (inputs, options) for ``method(available | inputs, **options)``.

    Gorenflo's reference coefficient h0 (from its table; a missing one raises
    ``PropertyError`` naming the fluid) and its separate water form.
    """
    from ..errors import PropertyError

    inputs, options = {}, {}
    if "h0" in method.inputs:
        h0 = gorenflo_reference_htc(fluid.cas)
        if h0 is None:
            raise PropertyError(f"{method.title} needs a reference coefficient h0 for "
                                f"{fluid.name}, and none is tabulated; choose another nucleate "
                                "boiling method", fluid=fluid.name)
        inputs["h0"] = h0
    if "water" in method.options:
        options["water"] = fluid.coolprop_name.lower() == "water"
    return inputs, options


@register(
    "nucleate_boiling", "Gorenflo (VDI Heat Atlas 1993)",
    validity={"p_r": (0.0005, 0.95)},
    references=(
        "Gorenflo, D. (1993) Pool boiling, VDI Heat Atlas, sect. Ha, VDI-Verlag, "
        "Duesseldorf",
    ),
    notes="Needs the fluid's reference coefficient h0 (gorenflo_reference_htc). "
          "Separate pressure function and exponent for water (water=True). Validity "
          "0.0005 <= p_r <= 0.95 [memory].",
)
def gorenflo_1993(q, P, P_crit, *, h0, q0=20e3, roughness=0.4e-6, water=False):
    """Gorenflo's reduced-pressure pool boiling coefficient (VDI Heat Atlas 1993).

    .. math:: htc = h_0 F(p_r) (q/q_0)^n (R_a/R_{a0})^{0.133}

    Fluids other than water: n = 0.9 - 0.3 p_r^0.3,
    F = 1.2 p_r^0.27 + (2.5 + 1/(1-p_r)) p_r.
    Water: n = 0.9 - 0.3 p_r^0.15, F = 1.73 p_r^0.27 + (6.1 + 0.68/(1-p_r)) p_r^2.
    Ra0 = 0.4 um; h0 is the fluid's coefficient at p_r = 0.1 and q0, so that
    F(0.1) is close to 1. Valid for 0.0005 <= p_r <= 0.95 [memory]. q <= 0
    returns 0 (limit as q -> 0).

    Parameters
    ----------
    q : float
        Heat flux [W/m^2]
    P : float
        Saturation pressure [Pa]
    P_crit : float
        Critical pressure [Pa]
    h0 : float
        Reference coefficient of the fluid at p_r = 0.1, q0 and Ra0 [W/m^2/K]
    q0 : float
        Reference heat flux of h0 [W/m^2]
    roughness : float
        Arithmetic mean roughness Ra of the surface [m]
    water : bool
        True to use Gorenflo's separate pressure function for water [-]

    Returns
    -------
    htc : float
        Nucleate boiling coefficient [W/m^2/K]

    References
    ----------
    Gorenflo, D. (1993) Pool boiling, VDI Heat Atlas sect. Ha, VDI-Verlag.
    Checked against ``ht.Gorenflo``.
    """
    p_r = _reduced_pressure(P, P_crit)
    if q <= 0.0:
        return 0.0
    if water:
        n = 0.9 - 0.3 * p_r ** 0.15
        F = 1.73 * p_r ** 0.27 + (6.1 + 0.68 / (1.0 - p_r)) * p_r ** 2
    else:
        n = 0.9 - 0.3 * p_r ** 0.3
        F = 1.2 * p_r ** 0.27 + (2.5 + 1.0 / (1.0 - p_r)) * p_r
    return h0 * F * (q / q0) ** n * (roughness / 0.4e-6) ** 0.133


#: Stephan & Abdelsalam contact angles [deg] by fluid class.
_SA_CONTACT_ANGLE = {"general": 35.0, "water": 45.0, "hydrocarbon": 35.0,
                     "refrigerant": 35.0, "cryogenic": 1.0}


@register(
    "nucleate_boiling", "Stephan & Abdelsalam (1980)",
    references=(
        "Stephan, K. & Abdelsalam, M. (1980) Heat-transfer correlations for natural "
        "convection boiling, Int. J. Heat Mass Transfer 23, 73-87, "
        "doi:10.1016/0017-9310(80)90140-4",
    ),
    notes="Water and cryogenic forms use the paper's X3 = cp Tsat d^2/a^2, so the water "
          "value differs from ht 1.2.0, which uses hfg d^2/a^2 there (CHECK-VALUES 2a). "
          "The paper's reduced-pressure ranges by class (water 1e-4-0.886, hydrocarbon "
          "5.7e-3-0.9, cryogenic 4e-3-0.97, refrigerant 3e-3-0.78 [memory]) cannot be "
          "checked here: P is not an input.",
)
def stephan_abdelsalam_1980(q, T_sat, rho_l, rho_v, k_l, cp_l, mu_l, sigma, h_lv, *,
                            fluid_class="general", contact_angle_deg=None,
                            k_wall=401.0, rho_wall=8960.0, cp_wall=385.0):
    """Stephan & Abdelsalam's regression correlations for nucleate pool boiling.

    Bubble departure diameter d = 0.0146 beta [2 sigma / (g (rho_l - rho_v))]^0.5
    with the contact angle beta in degrees (45 water, 1 cryogenic, 35 others);
    Nu = htc d / k_l. Groups: X1 = q d/(k_l Tsat), X2 = a^2 rho_l/(sigma d),
    X3 = cp_l Tsat d^2/a^2, X4 = h_lv d^2/a^2, X5 = rho_v/rho_l, X6 = Pr_l,
    X7 = (rho cp k)_wall/(rho cp k)_l, X8 = (rho_l - rho_v)/rho_l, a = k_l/(rho_l cp_l).

    - general:     Nu = 0.23 X1^0.674 X2^0.35 X4^0.371 X5^0.297 X8^-1.73
    - water:       Nu = 0.246e7 X1^0.673 X4^-1.58 X3^1.26 X8^5.22
    - hydrocarbon: Nu = 0.0546 (X5^0.5 X1)^0.67 X8^-4.33 X4^0.248
    - cryogenic:   Nu = 4.82 X1^0.624 X7^0.117 X3^0.374 X4^-0.329 X5^0.257
    - refrigerant: Nu = 207 X1^0.745 X5^0.581 X6^0.533

    The water and cryogenic forms are implemented with the paper's
    X3 = cp_l Tsat d^2/a^2, distinct from X4. ht 1.2.0 builds X3 with h_lv,
    which does not change the general, hydrocarbon and refrigerant forms but
    gives a higher water value (CHECK-VALUES 2a: 8758.9 against 5558.9 W/m^2/K
    at W1, 50 kW/m^2). The forms are written from the correlation as
    reproduced by Serth, Cao and ht; the water form is of medium confidence
    until checked against the paper. The general form is written with the
    latent-heat group (X4), as Serth prints it. Reduced-pressure ranges of the
    paper by class [memory]: water 1e-4 to 0.886, hydrocarbons 5.7e-3 to 0.9,
    cryogenic 4e-3 to 0.97, refrigerants 3e-3 to 0.78. q <= 0 returns 0 (limit
    as q -> 0).

    Parameters
    ----------
    q : float
        Heat flux [W/m^2]
    T_sat : float
        Saturation temperature [K]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    mu_l : float
        Liquid viscosity [Pa*s]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    fluid_class : str
        "general", "water", "hydrocarbon", "refrigerant" or "cryogenic" [-]
    contact_angle_deg : float
        Contact angle; None for the class value (45, 1 or 35) [deg]
    k_wall : float
        Wall thermal conductivity, cryogenic form only (copper default) [W/m/K]
    rho_wall : float
        Wall density, cryogenic form only (copper default) [kg/m^3]
    cp_wall : float
        Wall specific heat, cryogenic form only (copper default) [J/kg/K]

    Returns
    -------
    htc : float
        Nucleate boiling coefficient [W/m^2/K]

    References
    ----------
    Stephan, K. & Abdelsalam, M. (1980) Heat-transfer correlations for natural
    convection boiling, Int. J. Heat Mass Transfer 23, 73-87,
    doi:10.1016/0017-9310(80)90140-4; Serth, R.W. (2014) Process Heat Transfer, 2nd ed.
    """
    if fluid_class not in _SA_CONTACT_ANGLE:
        raise ValueError(f"fluid_class must be one of {sorted(_SA_CONTACT_ANGLE)}, "
                         f"not {fluid_class!r}")
    if q <= 0.0:
        return 0.0
    beta = _SA_CONTACT_ANGLE[fluid_class] if contact_angle_deg is None else contact_angle_deg
    d = 0.0146 * beta * math.sqrt(2.0) * laplace_length(sigma, rho_l, rho_v)
    a = k_l / (rho_l * cp_l)
    X1 = q * d / (k_l * T_sat)
    X3 = cp_l * T_sat * d * d / (a * a)
    X4 = h_lv * d * d / (a * a)
    X5 = rho_v / rho_l
    X8 = (rho_l - rho_v) / rho_l
    if fluid_class == "general":
        X2 = a * a * rho_l / (sigma * d)
        Nu = 0.23 * X1 ** 0.674 * X2 ** 0.35 * X4 ** 0.371 * X5 ** 0.297 * X8 ** -1.73
    elif fluid_class == "water":
        Nu = 0.246e7 * X1 ** 0.673 * X4 ** -1.58 * X3 ** 1.26 * X8 ** 5.22
    elif fluid_class == "hydrocarbon":
        Nu = 0.0546 * (X5 ** 0.5 * X1) ** 0.67 * X8 ** -4.33 * X4 ** 0.248
    elif fluid_class == "cryogenic":
        X7 = rho_wall * cp_wall * k_wall / (rho_l * cp_l * k_l)
        Nu = 4.82 * X1 ** 0.624 * X7 ** 0.117 * X3 ** 0.374 * X4 ** -0.329 * X5 ** 0.257
    else:  # refrigerant
        Nu = 207.0 * X1 ** 0.745 * X5 ** 0.581 * prandtl(cp_l, mu_l, k_l) ** 0.533
    return Nu * k_l / d


@register(
    "nucleate_boiling", "Forster & Zuber (1955)",
    references=(
        "Forster, H.K. & Zuber, N. (1955) Dynamics of vapor bubbles and boiling heat "
        "transfer, AIChE J. 1, 531-535, doi:10.1002/aic.690010425",
    ),
    notes="Wall-superheat form: needs dT_sat and dp_sat = p_sat(T_wall) - P. "
          "No validity range is given in the sources used here.",
)
def forster_zuber_1955(dT_sat, dp_sat, rho_l, rho_v, k_l, cp_l, mu_l, sigma, h_lv):
    """Forster & Zuber's nucleate boiling coefficient from the wall superheat.

    .. math:: htc = 0.00122 \\frac{k_l^{0.79} c_{p,l}^{0.45} \\rho_l^{0.49}}
              {\\sigma^{0.5} \\mu_l^{0.29} h_{lv}^{0.24} \\rho_v^{0.24}}
              \\Delta T_{sat}^{0.24} \\Delta p_{sat}^{0.75}

    A superheat or pressure difference <= 0 (no nucleation) returns 0.

    Parameters
    ----------
    dT_sat : float
        Wall superheat T_wall - T_sat [K]
    dp_sat : float
        p_sat(T_wall) - P [Pa]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    cp_l : float
        Liquid specific heat [J/kg/K]
    mu_l : float
        Liquid viscosity [Pa*s]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]

    Returns
    -------
    htc : float
        Nucleate boiling coefficient [W/m^2/K]

    References
    ----------
    Forster, H.K. & Zuber, N. (1955) AIChE J. 1, 531-535,
    doi:10.1002/aic.690010425; Cao (2009) examples via ``ht.Forster_Zuber``.
    """
    if dT_sat <= 0.0 or dp_sat <= 0.0:
        return 0.0
    return (0.00122 * k_l ** 0.79 * cp_l ** 0.45 * rho_l ** 0.49
            / (sigma ** 0.5 * mu_l ** 0.29 * h_lv ** 0.24 * rho_v ** 0.24)
            * dT_sat ** 0.24 * dp_sat ** 0.75)


def _rohsenow_superheat(q, rho_l, rho_v, cp_l, mu_l, k_l, sigma, h_lv, C_sf, n):
    """Wall superheat [K] at heat flux q from Rohsenow's correlation."""
    bubble = laplace_length(sigma, rho_l, rho_v)
    return (C_sf * h_lv * prandtl(cp_l, mu_l, k_l) ** n / cp_l
            * (q / (mu_l * h_lv) * bubble) ** (1.0 / 3.0))


@register(
    "nucleate_boiling", "Rohsenow (1952)",
    references=(
        "Rohsenow, W.M. (1952) A method of correlating heat transfer data for surface "
        "boiling of liquids, Trans. ASME 74, 969-976",
        "Incropera, F.P. & DeWitt, D.P. Fundamentals of Heat and Mass Transfer, "
        "ch. 10 (C_sf table, Example 10.1)",
    ),
    notes="Heat-flux form htc = q / dT_sat. Needs the surface-fluid constant C_sf; "
          "n = 1 for water, 1.7 for other fluids.",
)
def rohsenow_1952(q, rho_l, rho_v, cp_l, mu_l, k_l, sigma, h_lv, *, C_sf=0.013, n=1.0):
    """Rohsenow's nucleate boiling coefficient at a given heat flux.

    .. math:: q = \\mu_l h_{lv} \\left[\\frac{g(\\rho_l-\\rho_v)}{\\sigma}\\right]^{1/2}
              \\left[\\frac{c_{p,l} \\Delta T_{sat}}{C_{sf} h_{lv} Pr_l^n}\\right]^3

    solved for the wall superheat; returns htc = q / dT_sat, which is
    proportional to q^(2/3). q <= 0 returns 0 (the limit of htc as q -> 0).
    ``rohsenow_1952_heat_flux`` gives q from the wall superheat.

    Parameters
    ----------
    q : float
        Heat flux [W/m^2]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    cp_l : float
        Liquid specific heat [J/kg/K]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    C_sf : float
        Surface-fluid constant (0.013 is a common default) [-]
    n : float
        Prandtl exponent: 1 for water, 1.7 for other fluids [-]

    Returns
    -------
    htc : float
        Nucleate boiling coefficient [W/m^2/K]

    References
    ----------
    Rohsenow, W.M. (1952) Trans. ASME 74, 969-976; Incropera & DeWitt,
    Fundamentals of Heat and Mass Transfer, Example 10.1.
    """
    if q <= 0.0:
        return 0.0
    return q / _rohsenow_superheat(q, rho_l, rho_v, cp_l, mu_l, k_l, sigma, h_lv, C_sf, n)


def rohsenow_1952_heat_flux(dT_sat, rho_l, rho_v, cp_l, mu_l, k_l, sigma, h_lv, *,
                            C_sf=0.013, n=1.0):
    """Rohsenow's heat flux from the wall superheat (the correlation as published).

    Parameters
    ----------
    dT_sat : float
        Wall superheat T_wall - T_sat; <= 0 gives 0 [K]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    cp_l : float
        Liquid specific heat [J/kg/K]
    mu_l : float
        Liquid viscosity [Pa*s]
    k_l : float
        Liquid thermal conductivity [W/m/K]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    C_sf : float
        Surface-fluid constant [-]
    n : float
        Prandtl exponent: 1 for water, 1.7 for other fluids [-]

    Returns
    -------
    q : float
        Heat flux [W/m^2]

    References
    ----------
    Rohsenow, W.M. (1952) Trans. ASME 74, 969-976.
    """
    if dT_sat <= 0.0:
        return 0.0
    group = cp_l * dT_sat / (C_sf * h_lv * prandtl(cp_l, mu_l, k_l) ** n)
    return mu_l * h_lv / laplace_length(sigma, rho_l, rho_v) * group ** 3


# --------------------------------------------------------------------------
# Critical heat flux of a single surface in a pool
# --------------------------------------------------------------------------

def _zuber_flux(rho_l, rho_v, sigma, h_lv):
    """Zuber's flux group h_lv rho_v^0.5 [sigma g (rho_l - rho_v)]^0.25 [W/m^2]."""
    return h_lv * math.sqrt(rho_v) * (sigma * g * (rho_l - rho_v)) ** 0.25


@register(
    "pool_chf", "Zuber (1959)",
    references=(
        "Zuber, N. (1959) Hydrodynamic aspects of boiling heat transfer, PhD thesis, "
        "UCLA, report AECU-4439",
        "Zuber, N. (1958) On the stability of boiling heat transfer, Trans. ASME 80, "
        "711-720",
    ),
    notes="K = pi/24 (Zuber); 0.149 is Lienhard & Dhir's large flat plate value, 0.16 "
          "Kutateladze's, 0.18 the value Cao and the Wolverine data book list.",
)
def zuber_1959(rho_l, rho_v, sigma, h_lv, *, K=math.pi / 24.0):
    """Zuber's hydrodynamic critical heat flux of a large surface.

    .. math:: q_{max} = K h_{lv} \\rho_v^{1/2} [\\sigma g (\\rho_l - \\rho_v)]^{1/4}

    Written without Zuber's factor ((rho_l + rho_v)/rho_l)^0.5, as the
    textbooks and ht write it (it differs from 1 by rho_v/(2 rho_l)).

    Parameters
    ----------
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    K : float
        Constant, pi/24 after Zuber [-]

    Returns
    -------
    q_max : float
        Critical heat flux [W/m^2]

    References
    ----------
    Zuber, N. (1959) AECU-4439; Zuber, N. (1958) Trans. ASME 80, 711-720.
    """
    return K * _zuber_flux(rho_l, rho_v, sigma, h_lv)


@register(
    "pool_chf", "Lienhard & Dhir (1973), large flat plate",
    references=(
        "Lienhard, J.H. & Dhir, V.K. (1973) Extended hydrodynamic theory of the peak "
        "and minimum pool boiling heat fluxes, NASA CR-2270",
        "Lienhard, J.H. & Dhir, V.K. (1973) Hydrodynamic prediction of peak pool-boiling "
        "heat fluxes from finite bodies, J. Heat Transfer 95, 152-158, "
        "doi:10.1115/1.3450013",
    ),
    notes="K = 0.149 for a large horizontal flat heater (width over 27 capillary lengths).",
)
def lienhard_dhir_1973(rho_l, rho_v, sigma, h_lv):
    """Lienhard & Dhir's critical heat flux of a large horizontal flat plate.

    .. math:: q_{max} = 0.149 h_{lv} \\rho_v^{1/2} [\\sigma g (\\rho_l - \\rho_v)]^{1/4}

    Parameters
    ----------
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]

    Returns
    -------
    q_max : float
        Critical heat flux [W/m^2]

    References
    ----------
    Lienhard, J.H. & Dhir, V.K. (1973) NASA CR-2270; J. Heat Transfer 95, 152-158.
    """
    return 0.149 * _zuber_flux(rho_l, rho_v, sigma, h_lv)


def _reduced_pressure_chf(P, P_crit, C):
    """C P_crit p_r^0.35 (1 - p_r)^0.9 with C in W/m^2 per Pa of P_crit."""
    p_r = _reduced_pressure(P, P_crit)
    return C * P_crit * p_r ** 0.35 * (1.0 - p_r) ** 0.9


# --------------------------------------------------------------------------
# Maximum heat flux of a tube bundle in a pool
# --------------------------------------------------------------------------

#: Palen & Small bundle constants K_b by tube layout.
_PALEN_SMALL_KB = {"square": 0.44, "triangular": 0.41}


@register(
    "bundle_chf", "Palen & Small (1964) bundle CHF",
    references=(
        "Palen, J.W. & Small, W.M. (1964) A new way to design kettle and internal "
        "reboilers, Hydrocarbon Processing 43(11), 199-208",
        "Sinnott, R.K. Coulson & Richardson's Chemical Engineering Vol. 6, sect. 12.11",
    ),
    notes="K_b = 0.44 square, 0.41 triangular pitch [memory]. Sinnott applies a design "
          "factor 0.7 to the result; it is not applied here. No validity range given.",
)
def palen_small_1964(tube_pitch, D, tube_count, rho_l, rho_v, sigma, h_lv, *,
                     layout="square"):
    """Palen & Small's maximum heat flux of a kettle tube bundle.

    .. math:: q_{max} = K_b \\frac{p_t}{D} \\frac{h_{lv}}{\\sqrt{N_t}}
              [\\sigma g (\\rho_l - \\rho_v) \\rho_v^2]^{1/4}

    K_b = 0.44 for square and 0.41 for triangular pitch [memory]. N_t is the
    number of tubes (ends, for U-tubes, as Sinnott counts them). Sinnott
    recommends designing to 0.7 of this value; no factor is applied here.

    Parameters
    ----------
    tube_pitch : float
        Tube pitch p_t [m]
    D : float
        Tube outer diameter [m]
    tube_count : float
        Number of tubes in the bundle [-]
    rho_l : float
        Liquid density [kg/m^3]
    rho_v : float
        Vapour density [kg/m^3]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    layout : str
        "square" or "triangular" tube pitch [-]

    Returns
    -------
    q_max : float
        Bundle maximum heat flux [W/m^2]

    References
    ----------
    Palen, J.W. & Small, W.M. (1964) Hydrocarbon Processing 43(11), 199-208;
    Sinnott, R.K. Coulson & Richardson's Chemical Engineering Vol. 6, sect. 12.11.
    """
    try:
        K_b = _PALEN_SMALL_KB[layout]
    except KeyError:
        raise ValueError(f"layout must be 'square' or 'triangular', not {layout!r}") from None
    return (K_b * tube_pitch / D * h_lv / math.sqrt(tube_count)
            * (sigma * g * (rho_l - rho_v) * rho_v * rho_v) ** 0.25)


def bundle_geometry_factor(bundle_diameter, tube_length, area):
    """Palen's bundle geometry factor Phi_b = 2.2 pi D_b L / A, capped at 1.

    pi D_b L / A is the bundle's outer cylindrical surface over its heat-transfer
    area. Palen advises vapour lanes or a wider pitch when Phi_b < 0.1.

    Parameters
    ----------
    bundle_diameter : float
        Outer diameter of the tube bundle D_b [m]
    tube_length : float
        Bundle length L (the same length as the area is counted over) [m]
    area : float
        Outside heat-transfer area of the bundle over that length [m^2]

    Returns
    -------
    Phi_b : float
        Bundle geometry factor, at most 1 [-]

    References
    ----------
    Palen, J.W. & Small, W.M. (1964) Hydrocarbon Processing 43(11), 199-208;
    Wolverine Tube Engineering Data Book II, ch. 5, kettle design example.
    """
    return min(2.2 * math.pi * bundle_diameter * tube_length / area, 1.0)


#: 803 Btu/(h ft^2) per psia of P_crit, in W/m^2 per Pa (= 367.40 per kPa).
_PALEN_Q1_C = 803.0 * _BTU_PER_H_FT2 / _PSI


@register(
    "bundle_chf", "Palen bundle-geometry factor (single tube x Phi_b)",
    validity={"Phi_b": (0.1, None)},
    references=(
        "Palen, J.W. (1983) Shell and tube reboilers, Heat Exchanger Design Handbook "
        "sect. 3.6, Hemisphere",
        "Palen, J.W. & Small, W.M. (1964) A new way to design kettle and internal "
        "reboilers, Hydrocarbon Processing 43(11), 199-208",
        "Wolverine Tube Engineering Data Book II, ch. 5, kettle reboiler design example",
    ),
    notes="q1max = 803 Pc[psia] p_r^0.35 (1-p_r)^0.9 [Btu/h ft^2] converted exactly to SI "
          "(367.40 Pc[kPa]); Phi_b = 2.2 pi D_b L / A capped at 1; Phi_b < 0.1 calls for "
          "vapour lanes or a wider pitch.",
)
def palen_1983(P, P_crit, bundle_diameter, tube_length, area):
    """Bundle maximum heat flux: single-tube CHF times Palen's geometry factor.

    .. math:: q_{b,max} = q_{1,max} \\Phi_b, \\quad
              q_{1,max} = 803 P_c p_r^{0.35} (1-p_r)^{0.9}, \\quad
              \\Phi_b = \\min(2.2 \\pi D_b L / A, 1)

    with q in Btu/h ft^2 and P_c in psia in the published form, converted here
    to SI (367.40 W/m^2 per kPa of P_c). See ``bundle_geometry_factor``.
    Wolverine example: q1max = 160,488 and Phi_b = 0.1956 give 31,392 Btu/h ft^2.

    Parameters
    ----------
    P : float
        Saturation pressure [Pa]
    P_crit : float
        Critical pressure [Pa]
    bundle_diameter : float
        Outer diameter of the tube bundle D_b [m]
    tube_length : float
        Bundle length L [m]
    area : float
        Outside heat-transfer area of the bundle over the length L [m^2]

    Returns
    -------
    q_max : float
        Bundle maximum heat flux [W/m^2]

    References
    ----------
    Palen, J.W. (1983) Heat Exchanger Design Handbook sect. 3.6; Palen, J.W. &
    Small, W.M. (1964) Hydrocarbon Processing 43(11), 199-208; Wolverine Tube
    Engineering Data Book II ch. 5, kettle reboiler design example.
    """
    q1_max = _reduced_pressure_chf(P, P_crit, _PALEN_Q1_C)
    return q1_max * bundle_geometry_factor(bundle_diameter, tube_length, area)


# --------------------------------------------------------------------------
# Natural convection on a horizontal cylinder
# --------------------------------------------------------------------------

@register(
    "natural_convection", "Churchill & Chu (1975), horizontal cylinder",
    validity={"Ra_D": (1e-5, 1e12)},
    references=(
        "Churchill, S.W. & Chu, H.H.S. (1975) Correlating equations for laminar and "
        "turbulent free convection from a horizontal cylinder, Int. J. Heat Mass "
        "Transfer 18, 1049-1053, doi:10.1016/0017-9310(75)90222-7",
    ),
    notes="Isothermal cylinder, properties at the film temperature. Ra_D 1e-5 to 1e12 "
          "(Churchill & Chu's lower limit, Incropera's upper limit).",
)
def churchill_chu_1975_cylinder(D, dT, rho, mu, k, cp, beta):
    """Churchill & Chu's natural convection coefficient of a horizontal cylinder.

    .. math:: Nu_D = \\left[0.60 + \\frac{0.387 Ra_D^{1/6}}
              {[1 + (0.559/Pr)^{9/16}]^{8/27}}\\right]^2, \\quad
              Ra_D = \\frac{g |\\beta \\Delta T| D^3 \\rho^2 c_p}{\\mu k}

    htc = Nu_D k / D. The magnitude of beta dT is used, so heating and cooling
    are treated alike; dT = 0 gives the conduction limit Nu = 0.36.
    Valid for 1e-5 <= Ra_D <= 1e12.

    Parameters
    ----------
    D : float
        Cylinder outer diameter [m]
    dT : float
        Surface minus bulk fluid temperature [K]
    rho : float
        Fluid density [kg/m^3]
    mu : float
        Fluid viscosity [Pa*s]
    k : float
        Fluid thermal conductivity [W/m/K]
    cp : float
        Fluid specific heat [J/kg/K]
    beta : float
        Volumetric thermal expansion coefficient of the fluid [1/K]

    Returns
    -------
    htc : float
        Natural convection coefficient [W/m^2/K]

    References
    ----------
    Churchill, S.W. & Chu, H.H.S. (1975) Int. J. Heat Mass Transfer 18,
    1049-1053, doi:10.1016/0017-9310(75)90222-7. Checked against
    ``ht.conv_free_immersed.Nu_horizontal_cylinder_Churchill_Chu``.
    """
    Pr = prandtl(cp, mu, k)
    Ra = g * abs(beta * dT) * D ** 3 * rho * rho * cp / (mu * k)
    prandtl_function = (1.0 + (0.559 / Pr) ** (9.0 / 16.0)) ** (8.0 / 27.0)
    Nu = (0.60 + 0.387 * Ra ** (1.0 / 6.0) / prandtl_function) ** 2
    return Nu * k / D
