"""Single-phase forced convection and friction inside tubes.

Functions return the Nusselt number Nu = htc D / k or the Darcy friction factor;
``htc_tube_single_phase`` turns a state into a coefficient with the chosen method.
"""
from __future__ import annotations

import math

from .registry import register, get


@register(
    "friction_factor", "Colebrook (1939), solved explicitly by Clamond (2009)",
    validity={"Re": (2300.0, 1e8)},
    references=(
        "Colebrook, C.F. (1939) Turbulent flow in pipes, J. Inst. Civil Eng. 11, 133-156",
        "Clamond, D. (2009) Efficient resolution of the Colebrook equation, "
        "Ind. Eng. Chem. Res. 48, 3665-3671, doi:10.1021/ie801626g",
    ),
    notes="Laminar flow (Re < 2300) returns 64/Re. Clamond's explicit solution, as fluids.Clamond "
          "evaluates it (fast=False).",
)
def colebrook_1939(Re, *, relative_roughness=0.0):
    """Darcy friction factor: 64/Re in laminar flow, Colebrook's equation above.

    .. math:: 1/\\sqrt{f} = -2 \\log_{10}(\\varepsilon/(3.7 D) + 2.51/(Re \\sqrt{f}))

    Parameters
    ----------
    Re : float
        Reynolds number [-]
    relative_roughness : float
        Wall roughness over diameter, epsilon/D [-]

    Returns
    -------
    f_D : float
        Darcy friction factor [-]

    References
    ----------
    Colebrook (1939); Clamond (2009), the same arithmetic as ``fluids.Clamond``
    (checked against it in tests/test_friction_factor.py); not imported from fluids,
    which would bring numpy into every rating's start-up.
    """
    if Re < 2300.0:
        return 64.0 / Re
    # Clamond (2009): two steps of a third-order iteration on 1/sqrt(f), exact to
    # machine precision for Re > 10. Constants ln(10)/18.574, ln(ln(10)/5.02), (ln(10)/2)^2.
    X1 = relative_roughness * Re * 0.1239681863354175460160858261654858382699
    X2 = math.log(Re) - 0.7793974884556819406441139701653776731705
    F = X2 - 0.2
    X1F = X1 + F
    X1F1 = 1.0 + X1F
    E = (math.log(X1F) - 0.2) / X1F1
    F = F - (X1F1 + 0.5 * E) * E * X1F / (X1F1 + E * (1.0 + E / 3.0))
    X1F = X1 + F
    X1F1 = 1.0 + X1F
    E = (math.log(X1F) + F - X2) / X1F1
    b = X1F1 + E * (1.0 + E / 3.0)
    F = b / (b * F - (X1F1 + 0.5 * E) * E * X1F)
    return 1.325474527619599502640416597148504422899 * F * F


@register(
    "single_phase_tube", "Dittus-Boelter (1930)",
    validity={"Re": (1e4, 1.2e5), "Pr": (0.7, 120.0)},
    references=(
        "Dittus, F.W. & Boelter, L.M.K. (1930) Univ. Calif. Publ. Eng. 2, 443; "
        "reprinted Int. Comm. Heat Mass Transfer 12 (1985) 3-22, "
        "doi:10.1016/0735-1933(85)90003-X",
    ),
)
def dittus_boelter_1930(Re, Pr, *, heating=True):
    """Dittus-Boelter turbulent Nusselt number, Nu = 0.023 Re^0.8 Pr^n.

    n = 0.4 when the fluid is heated, 0.3 when it is cooled (McAdams' form).

    Parameters
    ----------
    Re : float
        Reynolds number [-]
    Pr : float
        Prandtl number [-]
    heating : bool
        True when the fluid is being heated [-]

    Returns
    -------
    Nu : float
        Nusselt number [-]

    References
    ----------
    Dittus & Boelter (1930).
    """
    return 0.023 * Re**0.8 * Pr ** (0.4 if heating else 0.3)


def _gnielinski_turbulent(Re, Pr, f_D):
    return (f_D / 8.0) * (Re - 1000.0) * Pr / (1.0 + 12.7 * math.sqrt(f_D / 8.0) * (Pr ** (2.0 / 3.0) - 1.0))


@register(
    "single_phase_tube", "Gnielinski (1976) with a laminar branch",
    validity={"Re": (None, 5e6), "Pr": (0.5, 2000.0)},
    references=(
        "Gnielinski, V. (1976) New equations for heat and mass transfer in turbulent pipe "
        "and channel flow, Int. Chem. Eng. 16, 359-368",
        "Petukhov, B.S. (1970) Heat transfer and friction in turbulent pipe flow with "
        "variable physical properties, Adv. Heat Transfer 6, 503-564",
        "Shah, R.K. & London, A.L. (1978) Laminar Flow Forced Convection in Ducts: "
        "Nu = 3.66 fully developed, constant wall temperature",
    ),
    notes="Re < 2300: Nu = 3.66; 2300-1e4: linear blend between Nu(2300) laminar and "
          "Gnielinski at 1e4 (Gnielinski 1995 transition); f from Petukhov (0.790 ln Re - 1.64)^-2 "
          "for a smooth tube unless f_D is given.",
)
def gnielinski_1976(Re, Pr, *, f_D=None):
    """Gnielinski's turbulent Nusselt number, laminar and transition branches included.

    .. math:: Nu = \\frac{(f/8)(Re-1000)Pr}{1 + 12.7 (f/8)^{1/2}(Pr^{2/3}-1)}

    with f = (0.790 ln Re - 1.64)^-2 (Petukhov) unless ``f_D`` is given.
    Below Re = 2300 the fully developed laminar value 3.66 (constant wall
    temperature) is returned; between 2300 and 1e4 the Nusselt number is
    interpolated linearly in Re between 3.66 and the turbulent value at 1e4,
    after Gnielinski (1995).

    Parameters
    ----------
    Re : float
        Reynolds number [-]
    Pr : float
        Prandtl number [-]
    f_D : float
        Darcy friction factor; None for Petukhov's smooth-tube value [-]

    Returns
    -------
    Nu : float
        Nusselt number [-]

    References
    ----------
    Gnielinski (1976); Petukhov (1970); Gnielinski, V. (1995) Ein neues
    Berechnungsverfahren fuer die Waermeuebertragung im Uebergangsbereich
    zwischen laminarer und turbulenter Rohrstroemung, Forsch. Ingenieurwes. 61, 240-248.
    """
    if Re < 2300.0:
        return 3.66
    if Re < 1e4:
        w = (Re - 2300.0) / (1e4 - 2300.0)
        f10k = (0.790 * math.log(1e4) - 1.64) ** -2
        return (1.0 - w) * 3.66 + w * _gnielinski_turbulent(1e4, Pr, f10k)
    if f_D is None:
        f_D = (0.790 * math.log(Re) - 1.64) ** -2
    return _gnielinski_turbulent(Re, Pr, f_D)


def htc_tube_single_phase(G, D, mu, k, cp, *, method="gnielinski_1976", heating=True):
    """Single-phase coefficient inside a tube [W/m^2/K] with a registered method.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    D : float
        Inner diameter [m]
    mu : float
        Dynamic viscosity [Pa*s]
    k : float
        Thermal conductivity [W/m/K]
    cp : float
        Specific heat [J/kg/K]
    """
    Re = G * D / mu
    Pr = cp * mu / k
    m = get(method)
    opts = {"heating": heating} if "heating" in m.options else {}
    return m({"Re": Re, "Pr": Pr}, **opts) * k / D
