"""Critical heat flux (dryout) inside vertical tubes.

Every function returns a critical heat flux q_CHF [W/m^2]. Two kinds exist:

* local-conditions methods, q_CHF(P or properties, G, x, D): the 2006 look-up
  table (``groeneveld_2006``) and Katto-Ohno recast for local quality
  (``katto_ohno_local``); the march compares the local flux with these;
* whole-tube methods for a uniformly heated tube of heated length L
  (``bowring_1972``, ``katto_ohno_1984``), as published.

The critical-quality limit is handled by the march, not here.
"""
from __future__ import annotations

import bisect
import importlib.resources
import math

from ..roots import brentq

from .registry import register

# --------------------------------------------------------------------------
# Groeneveld et al. (2007): the 2006 CHF look-up table
# --------------------------------------------------------------------------

_LUT_FILE = "chf_lookup_table_2006.txt"
#: Table axes: pressure [Pa], mass flux [kg/m^2/s], quality [-] (see data/README.md).
LUT_P = tuple(p * 1e6 for p in (0.1, 0.3, 0.5) + tuple(float(i) for i in range(1, 22)))
LUT_G = (0.0, 50.0, 100.0, 300.0, 500.0, 750.0) + tuple(1000.0 + 500.0 * i for i in range(15))
LUT_X = (-0.50, -0.40, -0.30, -0.20, -0.15, -0.10, -0.05, 0.0, 0.05, 0.10, 0.15, 0.20,
         0.25, 0.30, 0.35, 0.40, 0.45, 0.50, 0.60, 0.70, 0.80, 0.90, 1.00)
_NG, _NX = len(LUT_G), len(LUT_X)
_lut: list[float] | None = None  # flat, row-major (P, G, x), W/m^2; read on first use


def _lut_text() -> str:
    return importlib.resources.files("rating").joinpath("data", _LUT_FILE).read_text()


def lut_table() -> list[float]:
    """The 2006 table as a flat list in W/m^2, index ((iP*21 + iG)*23 + ix)."""
    global _lut
    if _lut is None:
        rows = [line.split() for line in _lut_text().splitlines() if line.strip()]
        if len(rows) != len(LUT_P) * _NG or any(len(r) != _NX for r in rows):
            raise RuntimeError(f"{_LUT_FILE}: expected {len(LUT_P) * _NG} lines of {_NX} numbers")
        _lut = [1e3 * float(v) for r in rows for v in r]
    return _lut


def _cell(axis, v):
    """Lower index and linear weight of v on an axis, clamped to its ends."""
    if v <= axis[0]:
        return 0, 0.0
    if v >= axis[-1]:
        return len(axis) - 2, 1.0
    i = bisect.bisect_right(axis, v) - 1
    return i, (v - axis[i]) / (axis[i + 1] - axis[i])


def _lut_interpolate(P, G, x):
    t = _lut if _lut is not None else lut_table()
    i, a = _cell(LUT_P, P)
    j, b = _cell(LUT_G, G)
    k, c = _cell(LUT_X, x)
    n00 = (i * _NG + j) * _NX + k          # (P_i, G_j)
    n01 = n00 + _NX                        # (P_i, G_j+1)
    n10 = n00 + _NG * _NX                  # (P_i+1, G_j)
    n11 = n10 + _NX
    f00 = t[n00] + c * (t[n00 + 1] - t[n00])
    f01 = t[n01] + c * (t[n01 + 1] - t[n01])
    f10 = t[n10] + c * (t[n10 + 1] - t[n10])
    f11 = t[n11] + c * (t[n11 + 1] - t[n11])
    f0 = f00 + b * (f01 - f00)
    f1 = f10 + b * (f11 - f10)
    return f0 + a * (f1 - f0)


@register(
    "tube_dryout", "Groeneveld et al. 2006 CHF look-up table (water)",
    validity={"P": (1e5, 2.1e7), "G": (0.0, 8000.0), "x": (-0.5, 1.0), "D": (0.003, None)},
    fluids=("7732-18-5",),
    references=(
        "Groeneveld, D.C., Shan, J.Q., Vasic, A.Z., Leung, L.K.H., Durmayaz, A., Yang, J., "
        "Cheng, S.C. & Tanase, A. (2007) The 2006 CHF look-up table, Nucl. Eng. Des. 237, "
        "1909-1922, doi:10.1016/j.nucengdes.2007.02.014",
        "Groeneveld, D.C. (2019) The 2006 CHF look-up table, NUREG/KM-0011, US NRC, Appendix C",
    ),
    notes="Water only. Linear interpolation in P, G and x; states outside the table are "
          "clamped to its edges. K = (0.008/D)^0.5 for 3-25 mm, D held at 25 mm above and "
          "at 3 mm below (the latter reported as out of range).",
)
def groeneveld_2006(P, G, x, D):
    """Local critical heat flux of water from the 2006 CHF look-up table.

    .. math:: q_{CHF} = K \\, q_{LUT}(P, G, x), \\qquad K = (0.008/D)^{1/2}

    q_LUT is the tabulated CHF of an 8 mm tube (24 pressures 0.1-21 MPa,
    21 mass fluxes 0-8000 kg/m^2/s, 23 qualities -0.5-1), interpolated
    linearly in P, G and x. States outside the table are clamped to its edges
    (the validity range reports them). The diameter factor holds for
    3 mm <= D <= 25 mm (Groeneveld et al. 2007); above 25 mm the value at
    25 mm is used (K = 0.566), below 3 mm D is held at 3 mm (K = 1.633).
    The 3 mm bound is the 2006 paper's; a 2 mm bound goes with the earlier
    tables' (0.008/D)^(1/3) factor, valid to 16 mm [memory].

    Parameters
    ----------
    P : float
        Pressure [Pa]
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Local thermodynamic equilibrium quality, negative when subcooled [-]
    D : float
        Inner diameter of the tube [m]

    Returns
    -------
    q_CHF : float
        Critical heat flux [W/m^2]

    References
    ----------
    Groeneveld, D.C. et al. (2007) The 2006 CHF look-up table, Nuclear
    Engineering and Design 237, 1909-1922, doi:10.1016/j.nucengdes.2007.02.014;
    Groeneveld, D.C. (2019) NUREG/KM-0011, Appendix C (the full table).
    """
    D_used = min(max(D, 0.003), 0.025)
    return math.sqrt(0.008 / D_used) * _lut_interpolate(P, G, x)


# --------------------------------------------------------------------------
# Bowring (1972)
# --------------------------------------------------------------------------

@register(
    "tube_dryout", "Bowring (1972), uniformly heated tube (water)",
    validity={"P": (0.7e6, 17e6), "G": (136.0, 18600.0), "D": (0.002, 0.045), "L": (0.15, 3.7)},
    fluids=("7732-18-5",),
    references=(
        "Bowring, R.W. (1972) A simple but accurate round tube, uniform heat flux, dryout "
        "correlation over the pressure range 0.7-17 MN/m2 (100-2500 psia), "
        "AEEW-R 789, UKAEA Winfrith",
        "Collier, J.G. & Thome, J.R. (1994) Convective Boiling and Condensation, 3rd ed., "
        "Oxford University Press, ch. 9",
    ),
    notes="Water only. Ranges of G, D and L as quoted by Collier & Thome [memory]; "
          "pressure range from the report's title.",
)
def bowring_1972(P, G, D, L, h_lv, *, dh_in=0.0):
    """Bowring's dryout heat flux of a uniformly heated round tube (water).

    .. math:: q_c = \\frac{A + B\\,\\Delta h_{in}}{C + L}

    with p_R = 0.145 P[MPa], n = 2 - 0.5 p_R and

    * A = 2.317 (h_lv D G / 4) F1 / (1 + 0.0143 F2 D^0.5 G)
    * B = D G / 4
    * C = 0.077 F3 D G / (1 + 0.347 F4 (G/1356)^n)

    For p_R < 1: F1 = [p_R^18.942 exp(20.89(1-p_R)) + 0.917]/1.917,
    F1/F2 = [p_R^1.316 exp(2.444(1-p_R)) + 0.309]/1.309,
    F3 = [p_R^17.023 exp(16.658(1-p_R)) + 0.667]/1.667;
    for p_R >= 1: F1 = p_R^-0.368 exp(0.648(1-p_R)),
    F1/F2 = p_R^-0.448 exp(0.245(1-p_R)), F3 = p_R^0.219; always
    F4/F3 = p_R^1.649. SI form as given by Collier & Thome.
    Valid for water, 0.7-17 MPa, G 136-18600 kg/m^2/s, D 2-45 mm,
    L 0.15-3.7 m.

    Parameters
    ----------
    P : float
        Pressure [Pa]
    G : float
        Mass flux [kg/m^2/s]
    D : float
        Inner diameter of the tube [m]
    L : float
        Heated length [m]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    dh_in : float
        Inlet subcooling, h_l,sat - h_in; 0 for a saturated inlet [J/kg]

    Returns
    -------
    q_c : float
        Critical heat flux, uniform along the tube [W/m^2]

    References
    ----------
    Bowring, R.W. (1972) A simple but accurate round tube, uniform heat flux,
    dryout correlation over the pressure range 0.7-17 MN/m2 (100-2500 psia),
    AEEW-R 789, UKAEA Winfrith. Collier, J.G. & Thome, J.R. (1994)
    Convective Boiling and Condensation, 3rd ed., Oxford University Press.
    """
    p_r = 0.145e-6 * P
    n = 2.0 - 0.5 * p_r
    if p_r < 1.0:
        F1 = (p_r**18.942 * math.exp(20.89 * (1.0 - p_r)) + 0.917) / 1.917
        F1_F2 = (p_r**1.316 * math.exp(2.444 * (1.0 - p_r)) + 0.309) / 1.309
        F3 = (p_r**17.023 * math.exp(16.658 * (1.0 - p_r)) + 0.667) / 1.667
    else:
        F1 = p_r**-0.368 * math.exp(0.648 * (1.0 - p_r))
        F1_F2 = p_r**-0.448 * math.exp(0.245 * (1.0 - p_r))
        F3 = p_r**0.219
    F2 = F1 / F1_F2
    F4 = F3 * p_r**1.649
    A = 2.317 * (h_lv * D * G / 4.0) * F1 / (1.0 + 0.0143 * F2 * math.sqrt(D) * G)
    B = D * G / 4.0
    C = 0.077 * F3 * D * G / (1.0 + 0.347 * F4 * (G / 1356.0) ** n)
    return (A + B * dh_in) / (C + L)


# --------------------------------------------------------------------------
# Katto & Ohno (1984)
# --------------------------------------------------------------------------

#: Heated length over diameter of Katto and Ohno's data [memory]; at local quality the
#: boiling length x G D h_lv / (4 q) is the one to hold against it (rating.march).
KATTO_OHNO_L_D = (5.0, 880.0)


def _katto_ohno_saturated(D, R, W_L):
    """The saturated-inlet y(L) = q_co / (G h_lv) as a function of the length L [m], for
    a tube of diameter D with R = rho_v/rho_l and W_L = sigma rho_l / G^2 (W = W_L / L);
    the powers of R are taken once (``katto_ohno_local`` asks for many lengths)."""
    R133 = R**0.133
    c2, c3 = 0.10 * R133, 0.098 * R133
    c5, c4 = 0.234 * R**0.513, 0.0384 * R**0.6
    low = R < 0.15

    def y(L):
        W = W_L / L
        LD = L / D
        C = 0.25 if LD < 50.0 else (0.34 if LD > 150.0 else 0.25 + 0.0009 * (LD - 50.0))
        q1 = C * W**0.043 / LD
        div = 1.0 + 0.0031 * LD
        if low:
            q2 = c2 * W ** (1.0 / 3.0) / div
            if q1 < q2:
                return q1
            q3 = c3 * W**0.433 * LD**0.27 / div
            return q2 if q2 < q3 else q3
        q5 = c5 * W**0.433 * LD**0.27 / div
        if q1 < q5:
            return q1
        q4 = c4 * W**0.173 / (1.0 + 0.28 * W**0.233 * LD)
        return q5 if q5 > q4 else q4
    return y


def _katto_ohno(G, D, L, rho_l, rho_v, sigma, h_lv):
    """Saturated-inlet q_co [W/m^2] and the inlet-subcooling factor K."""
    R = rho_v / rho_l
    W_L = sigma * rho_l / (G * G)
    W = W_L / L                              # sigma rho_l / (G^2 L)
    LD = L / D
    C = 0.25 if LD < 50.0 else (0.34 if LD > 150.0 else 0.25 + 0.0009 * (LD - 50.0))
    R133 = R**0.133
    K1 = 1.043 / (4.0 * C * W**0.043)
    K2 = (5.0 / 6.0) * (0.0124 + 1.0 / LD) / (R133 * W ** (1.0 / 3.0))
    if R < 0.15:
        K = max(K1, K2)
    elif K1 > K2:
        K = K1
    else:
        K3 = 1.12 * (1.52 * W**0.233 + 1.0 / LD) / (R**0.6 * W**0.173)
        K = min(K2, K3)
    return _katto_ohno_saturated(D, R, W_L)(L) * G * h_lv, K


@register(
    "tube_dryout", "Katto-Ohno (1984), uniformly heated tube",
    validity={"D": (0.001, 0.038), "L_D": KATTO_OHNO_L_D},
    references=(
        "Katto, Y. & Ohno, H. (1984) An improved version of the generalized correlation of "
        "critical heat flux for the forced convective boiling in uniformly heated vertical "
        "tubes, Int. J. Heat Mass Transfer 27, 1641-1648, doi:10.1016/0017-9310(84)90076-0",
    ),
    notes="Any fluid. Data range (memory): rho_v/rho_l 0.0003-0.41, L/D 5-880. For water at "
          "<= 1 MPa it reads 25-60 % above the 2006 look-up table.",
)
def katto_ohno_1984(G, D, L, rho_l, rho_v, sigma, h_lv, *, dh_in=0.0):
    """Katto-Ohno critical heat flux of a uniformly heated vertical tube.

    .. math:: q_c = q_{co} (1 + K \\Delta h_{in} / h_{lv})

    With R = rho_v/rho_l, W = sigma rho_l/(G^2 L) and q_co_i = G h_lv y_i:

    * y1 = C W^0.043 / (L/D), C = 0.25 (L/D < 50),
      0.25 + 0.0009 (L/D - 50) (50-150), 0.34 (L/D > 150)
    * y2 = 0.10 R^0.133 W^(1/3) / (1 + 0.0031 L/D)
    * y3 = 0.098 R^0.133 W^0.433 (L/D)^0.27 / (1 + 0.0031 L/D)
    * y4 = 0.0384 R^0.6 W^0.173 / (1 + 0.28 W^0.233 L/D)
    * y5 = 0.234 R^0.513 W^0.433 (L/D)^0.27 / (1 + 0.0031 L/D)
    * K1 = 1.043/(4 C W^0.043), K2 = (5/6)(0.0124 + D/L)/(R^0.133 W^(1/3)),
      K3 = 1.12 (1.52 W^0.233 + D/L)/(R^0.6 W^0.173)

    R < 0.15: q_co = q_co1 if q_co1 < q_co2, else the smaller of q_co2 and
    q_co3; K = max(K1, K2). R >= 0.15: q_co = q_co1 if q_co1 < q_co5, else
    the larger of q_co5 and q_co4; K = K1 if K1 > K2, else min(K2, K3).

    For water at 1 MPa and below this form reads 25-60 % above the 2006
    look-up table and Bowring in the cases tried (uniform tubes, G = 500-1000
    kg/m^2/s); it agrees within about 10 % at 3-10 MPa. Data range
    (Katto & Ohno 1984, [memory]): rho_v/rho_l 0.0003-0.41, L/D 5-880,
    D 1-38 mm.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    D : float
        Inner diameter of the tube [m]
    L : float
        Heated length [m]
    rho_l : float
        Saturated liquid density [kg/m^3]
    rho_v : float
        Saturated vapour density [kg/m^3]
    sigma : float
        Surface tension [N/m]
    h_lv : float
        Latent heat of vaporisation [J/kg]
    dh_in : float
        Inlet subcooling, h_l,sat - h_in; 0 for a saturated inlet [J/kg]

    Returns
    -------
    q_c : float
        Critical heat flux, uniform along the tube [W/m^2]

    References
    ----------
    Katto, Y. & Ohno, H. (1984) An improved version of the generalized
    correlation of critical heat flux for the forced convective boiling in
    uniformly heated vertical tubes, International Journal of Heat and Mass
    Transfer 27, 1641-1648, doi:10.1016/0017-9310(84)90076-0.
    """
    q_co, K = _katto_ohno(G, D, L, rho_l, rho_v, sigma, h_lv)
    return q_co * (1.0 + K * dh_in / h_lv)


#: Longest boiling length searched by ``katto_ohno_local``, in diameters. The
#: correlation's data reach L/D = 880 [memory]; far beyond, its branches have
#: spurious maxima of the exit quality.
_LD_MAX = 1000.0


@register(
    "tube_dryout", "Katto-Ohno (1984) at local quality (saturated-inlet tube)",
    validity={"D": (0.001, 0.038), "x": (0.0, 1.0)},
    references=(
        "Katto, Y. & Ohno, H. (1984) An improved version of the generalized correlation of "
        "critical heat flux for the forced convective boiling in uniformly heated vertical "
        "tubes, Int. J. Heat Mass Transfer 27, 1641-1648, doi:10.1016/0017-9310(84)90076-0",
    ),
    notes="The heat flux at which a saturated-inlet tube heated uniformly reaches dryout "
          "exactly at quality x. x <= 0 gives inf (no boiling length); G <= 0, x >= 1 and "
          "a quality above the largest exit quality Katto-Ohno reaches give 0.",
)
def katto_ohno_local(G, x, D, rho_l, rho_v, sigma, h_lv):
    """Katto-Ohno critical heat flux recast for the local quality.

    The flux q for which a saturated-inlet tube heated uniformly at q reaches
    dryout where the quality is x:

    .. math:: q = q_{KO}(L), \\qquad L = \\frac{x G D h_{lv}}{4 q}

    solved with a bracketed root (Brent) in q. q_KO(L)/q = x_exit(L)/x, so a
    root is a heat flux whose boiling length gives Katto-Ohno's exit quality
    x. The exit quality is not monotonic in L (it peaks at about 0.2-1 and
    falls again in very long tubes; the branch changes make bumps at low G),
    so there can be several roots: the largest q (shortest boiling length) is
    taken, searched from above in steps of 1.25 down to boiling lengths of
    1000 D. Where the published branch selection jumps, the root is the jump.

    Limits, handled explicitly: x <= 0 returns inf (no boiling length, no
    dryout); x >= 1 and G <= 0 return 0 (every branch tends to 0 with G);
    a quality above the largest exit quality Katto-Ohno reaches at any L up
    to 1000 D returns 0 (for water at 1 atm, D = 20 mm: about 0.83 at
    G = 500, 0.18 at G = 5000 kg/m^2/s, where the look-up table is far from 0).

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Local thermodynamic equilibrium quality [-]
    D : float
        Inner diameter of the tube [m]
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
    q_CHF : float
        Critical heat flux at quality x [W/m^2]

    References
    ----------
    Katto, Y. & Ohno, H. (1984) International Journal of Heat and Mass
    Transfer 27, 1641-1648, doi:10.1016/0017-9310(84)90076-0.
    """
    if x <= 0.0:
        return math.inf
    if G <= 0.0 or x >= 1.0:
        return 0.0
    scale = G * h_lv
    LxD = x * D / 4.0  # L = LxD / u with u = q / (G h_lv)
    y = _katto_ohno_saturated(D, rho_v / rho_l, sigma * rho_l / (G * G))

    def excess(u):  # x_exit(L(u)) / x - 1
        return y(LxD / u) / u - 1.0

    # Upper bracket. For R < 0.15 every branch is at most q_co2 without its
    # (1 + 0.0031 L/D) divisor, whose own root u0 therefore bounds the root
    # from above; for R >= 0.15 start from u = 1 (an extremely short tube).
    R = rho_v / rho_l
    if R < 0.15:
        u_hi = (0.1 * R**0.133) ** 1.5 * math.sqrt(4.0 * sigma * rho_l / (G * G * x * D))
    else:
        u_hi = 1.0
    f_hi = excess(u_hi)
    while f_hi >= 0.0:
        u_hi *= 4.0
        if u_hi > 1e12:  # cannot happen: q_KO/q -> 0 as q -> inf
            raise ArithmeticError("katto_ohno_local: no upper bracket")
        f_hi = excess(u_hi)
    # Step down to the largest root, in steps small enough not to jump over
    # the narrow window near Katto-Ohno's largest exit quality, and no
    # further than boiling lengths of _LD_MAX diameters (L/D = x / (4 u)).
    u_min = x / (4.0 * _LD_MAX)
    u_lo = u_hi / 1.25
    f_lo = excess(u_lo)
    while f_lo < 0.0:
        if u_lo < u_min:         # x above the largest exit quality Katto-Ohno allows
            return 0.0
        u_hi, f_hi = u_lo, f_lo
        u_lo /= 1.25
        f_lo = excess(u_lo)
    ends = {u_lo: f_lo, u_hi: f_hi}   # Brent starts from the bracket's ends: known here

    def known_or_excess(u):
        f = ends.pop(u, None)
        return excess(u) if f is None else f
    return scale * brentq(known_or_excess, u_lo, u_hi, xtol=1e-15, rtol=1e-10)
