"""Boiling fluids the property library lacks: a user table along the saturation line,
and a narrow-boiling mixture rated as a pseudo-pure fluid.

:class:`SaturationTable` offers what the march asks of a boiling fluid (saturation
sets by pressure or temperature, (P, h) states, subcooled-liquid and superheated-
vapour states) from rows of saturated properties a datasheet or a handbook gives:

    {"name": "...", "critical_pressure": Pa, "molar_mass": kg/kmol,
     "T": [K], "P": [Pa], "h_lv": [J/kg], "rho_l": [...], "rho_v": [...],
     "mu_l": [...], "mu_v": [...], "k_l": [...], "k_v": [...],
     "cp_l": [...], "cp_v": [...], "sigma": [N/m]}

Rows rise in T (and so in P). Between rows the saturation pressure follows the
Clausius-Clapeyron form (ln P linear in 1/T); the other columns are linear in T,
viscosities linear in ln(mu). A subcooled liquid takes the saturated-liquid
properties at its own temperature (pressure effect on a liquid neglected), its
enthalpy the integral of cp_l along the table; a superheated vapour takes cp_v
and the ideal-gas density at its pressure. Outside the table: OutOfRangeError.

:func:`pseudo_pure` builds such a table from the property library's mixture
model ("Propane[0.95]&n-Butane[0.05]", mole fractions): the liquid at its bubble
point and the vapour at its dew point at the same pressure, the latent heat their
enthalpy difference (it includes the sensible heat across the boiling range), the
saturation temperature the bubble point. The library has no surface tension for
mixtures: the mole-fraction average of the components' at the same temperature is
used (Poling, Prausnitz & O'Connell 2001, The Properties of Gases and Liquids, 5th
ed., sec. 12-5, for near-ideal mixtures). ``boiling_range(P)`` is dew minus bubble
point, which the rating reports.
"""
from __future__ import annotations

import bisect
import math
import re

from .errors import InputError, OutOfRangeError, PropertyError


def _p():
    """``rating.properties`` (the property library), imported when a table is first used,
    so that checking a table as a case is built does not load it."""
    from . import properties

    return properties

#: Columns of a saturation table, with their units.
COLUMNS = {
    "T": "K", "P": "Pa", "h_lv": "J/kg", "rho_l": "kg/m^3", "rho_v": "kg/m^3",
    "mu_l": "Pa*s", "mu_v": "Pa*s", "k_l": "W/m/K", "k_v": "W/m/K",
    "cp_l": "J/kg/K", "cp_v": "J/kg/K", "sigma": "N/m",
}
#: Single values of a saturation table, with their units.
CONSTANTS = {"critical_pressure": "Pa", "molar_mass": "kg/kmol"}

#: Hard ranges of the columns and values, wide enough for any boiling fluid from
#: cryogens to liquid metals near their critical points (common practice): beyond them a
#: value is a slip of the unit or the exponent, and would overflow the arithmetic.
RANGES = {
    "T": (1.0, 2000.0), "P": (1.0, 1e8), "h_lv": (100.0, 1e7), "rho_l": (10.0, 3e4),
    "rho_v": (1e-5, 3e4), "mu_l": (1e-6, 1e3), "mu_v": (1e-7, 0.1), "k_l": (0.01, 1000.0),
    "k_v": (1e-4, 10.0), "cp_l": (100.0, 1e5), "cp_v": (100.0, 1e5), "sigma": (1e-6, 1.0),
    "critical_pressure": (1e3, 1e8), "molar_mass": (1.0, 1000.0),
}


def _in_range(key: str, v, unit: str, where: str) -> None:
    lo, hi = RANGES[key]
    if not lo <= v <= hi:
        raise InputError(f"{where} = {v:g}: must be from {lo:g} to {hi:g} [{unit}]",
                         field=f"fluid.{key}")


_LOG = ("P", "mu_l", "mu_v")  # interpolated in the logarithm


def is_saturation_table(spec) -> bool:
    """Whether a fluid specification is a boiling fluid's saturation table."""
    return isinstance(spec, dict) and "h_lv" in spec


def check_table(spec: dict) -> None:
    """Raise ``InputError`` (field ``fluid.<column>``) for the first fault of a table."""
    allowed = set(COLUMNS) | set(CONSTANTS) | {"name"}
    unknown = sorted(set(spec) - allowed)
    if unknown:
        raise InputError(f"fluid.{unknown[0]}: unknown column of a saturation table; the "
                         "columns are " + ", ".join(COLUMNS) + " and the values "
                         + ", ".join(CONSTANTS), field=f"fluid.{unknown[0]}")
    for key, unit in {**CONSTANTS, **COLUMNS}.items():
        if key not in spec:
            raise InputError(f"fluid.{key}: missing; a saturation table needs the columns "
                             + ", ".join(COLUMNS) + " and the values " + ", ".join(CONSTANTS),
                             field=f"fluid.{key}")
    for key, unit in CONSTANTS.items():
        v = spec[key]
        if not _positive_number(v):
            raise InputError(f"fluid.{key} = {v!r}: must be a number > 0 [{unit}]",
                             field=f"fluid.{key}")
        _in_range(key, v, unit, f"fluid.{key}")
    n = None
    for key, unit in COLUMNS.items():
        column = spec[key]
        if not isinstance(column, (list, tuple)) or len(column) < 2:
            raise InputError(f"fluid.{key}: must be a list of at least 2 numbers [{unit}]",
                             field=f"fluid.{key}")
        if n is not None and len(column) != n:
            raise InputError(f"fluid.{key}: has {len(column)} values; every column needs as "
                             f"many as fluid.T ({n})", field=f"fluid.{key}")
        n = len(column)
        for i, v in enumerate(column):
            if not _positive_number(v):
                raise InputError(f"fluid.{key}[{i}] = {v!r}: must be a number > 0 [{unit}]",
                                 field=f"fluid.{key}")
            _in_range(key, v, unit, f"fluid.{key}[{i}]")
    for key in ("T", "P"):
        c = spec[key]
        if any(b <= a for a, b in zip(c, c[1:])):
            raise InputError(f"fluid.{key}: must rise strictly from row to row (saturation "
                             "temperature and pressure rise together)", field=f"fluid.{key}")
    if spec["P"][-1] >= spec["critical_pressure"]:
        raise InputError(f"fluid.P: the last row ({spec['P'][-1]:.6g} Pa) must be below the "
                         f"critical pressure ({spec['critical_pressure']:.6g} Pa)",
                         field="fluid.P")
    for i, (rl, rv) in enumerate(zip(spec["rho_l"], spec["rho_v"])):
        if rv >= rl:
            raise InputError(f"fluid.rho_v[{i}] = {rv:g} kg/m^3: must be below the liquid "
                             f"density {rl:g} kg/m^3 of the same row", field="fluid.rho_v")


def _positive_number(v) -> bool:
    return (isinstance(v, (int, float)) and not isinstance(v, bool) and math.isfinite(v)
            and v > 0.0)


class SaturationTable:
    """A boiling fluid given as saturated properties against temperature (see module)."""

    coolprop_name = ""   # no fluid-specific constants (look-up tables, reference coefficients)
    cas = ""

    def __init__(self, spec: dict):
        check_table(spec)
        self.name = str(spec.get("name") or "user saturation table")
        self.P_crit = float(spec["critical_pressure"])
        self.M = float(spec["molar_mass"])
        self._col = {k: tuple(float(v) for v in spec[k]) for k in COLUMNS}
        self._ln = {k: tuple(math.log(v) for v in self._col[k]) for k in _LOG}
        T, cp = self._col["T"], self._col["cp_l"]
        h = [0.0]  # saturated-liquid enthalpy: cp_l integrated along the table (trapezoids)
        for i in range(len(T) - 1):
            h.append(h[-1] + 0.5 * (cp[i] + cp[i + 1]) * (T[i + 1] - T[i]))
        self._h_l = tuple(h)
        self.T_min = self.T_triple = T[0]
        self.T_max = T[-1]
        self.P_triple, self.P_max = self._col["P"][0], self._col["P"][-1]
        self.T_crit = math.inf  # not given; the table's own range bounds every state
        self._sat: dict[float, SaturationSet] = {}

    def __repr__(self) -> str:
        return f"SaturationTable({self.name!r}, T={self.T_min:g}..{self.T_max:g} K)"

    # ----- saturation line
    def _range_error(self, what: str, value: float, unit: str, lo: float, hi: float):
        return OutOfRangeError(f"{self.name}: {what} = {value:.6g} {unit} is outside the "
                               f"table, {lo:.6g} to {hi:.6g} {unit}", fluid=self.name,
                               state={what: value})

    def _segment_T(self, T: float) -> tuple[int, float]:
        col = self._col["T"]
        if not (math.isfinite(T) and col[0] <= T <= col[-1]):
            raise self._range_error("T", T, "K", col[0], col[-1])
        i = min(bisect.bisect_right(col, T) - 1, len(col) - 2)
        return i, (T - col[i]) / (col[i + 1] - col[i])

    def T_sat(self, P: float) -> float:
        """Saturation temperature at P [K]: 1/T linear in ln P between rows."""
        col = self._col["P"]
        if not (math.isfinite(P) and col[0] <= P <= col[-1]):
            raise self._range_error("P", P, "Pa", col[0], col[-1])
        i = min(bisect.bisect_right(col, P) - 1, len(col) - 2)
        lnP = self._ln["P"]
        f = (math.log(P) - lnP[i]) / (lnP[i + 1] - lnP[i])
        T = self._col["T"]
        return 1.0 / (1.0 / T[i] + f * (1.0 / T[i + 1] - 1.0 / T[i]))

    def P_sat(self, T: float) -> float:
        """Saturation pressure at T [Pa]: ln P linear in 1/T between rows."""
        i, _ = self._segment_T(T)
        Tc, lnP = self._col["T"], self._ln["P"]
        f = (1.0 / T - 1.0 / Tc[i]) / (1.0 / Tc[i + 1] - 1.0 / Tc[i])
        return math.exp(lnP[i] + f * (lnP[i + 1] - lnP[i]))

    def _at(self, key: str, i: int, f: float) -> float:
        if key in self._ln:
            ln = self._ln[key]
            return math.exp(ln[i] + f * (ln[i + 1] - ln[i]))
        c = self._col[key]
        return c[i] + f * (c[i + 1] - c[i])

    def _h_liquid(self, i: int, T: float) -> float:
        Tc, cp = self._col["T"], self._col["cp_l"]
        dT = T - Tc[i]
        slope = (cp[i + 1] - cp[i]) / (Tc[i + 1] - Tc[i])
        return self._h_l[i] + dT * (cp[i] + 0.5 * slope * dT)

    def _set(self, P: float, T: float) -> SaturationSet:
        i, f = self._segment_T(T)
        v = {k: self._at(k, i, f) for k in COLUMNS if k not in ("T", "P")}
        h_l = self._h_liquid(i, T)
        dPdT = v["h_lv"] / (T * (1.0 / v["rho_v"] - 1.0 / v["rho_l"]))  # Clapeyron
        return _p().SaturationSet(
            P=P, T_sat=T, rho_l=v["rho_l"], rho_v=v["rho_v"], h_l=h_l, h_v=h_l + v["h_lv"],
            h_lv=v["h_lv"], mu_l=v["mu_l"], mu_v=v["mu_v"], k_l=v["k_l"], k_v=v["k_v"],
            cp_l=v["cp_l"], cp_v=v["cp_v"], sigma=v["sigma"],
            Pr_l=v["cp_l"] * v["mu_l"] / v["k_l"], P_crit=self.P_crit, M=self.M, dPdT_sat=dPdT)

    def saturation(self, P: float) -> SaturationSet:
        """Saturated liquid and vapour properties at P (cached per P)."""
        sat = self._sat.get(P)
        if sat is None:
            sat = self._sat[P] = self._set(P, self.T_sat(P))
        return sat

    def saturation_at(self, T: float) -> SaturationSet:
        """Saturated liquid and vapour properties at T."""
        return self._set(self.P_sat(T), T)

    # ----- single phase and (P, h)
    def _liquid(self, P: float, T: float) -> SinglePhaseState:
        i, f = self._segment_T(T)
        cp, mu, k = self._at("cp_l", i, f), self._at("mu_l", i, f), self._at("k_l", i, f)
        return _p().SinglePhaseState(P, T, self._at("rho_l", i, f), self._h_liquid(i, T), cp, mu, k,
                                cp * mu / k, "liquid")

    def _vapour(self, P: float, T: float) -> SinglePhaseState:
        sat = self.saturation(P)
        h = sat.h_v + sat.cp_v * (T - sat.T_sat)
        rho = sat.rho_v * sat.T_sat / T  # ideal gas at constant pressure
        return _p().SinglePhaseState(P, T, rho, h, sat.cp_v, sat.mu_v, sat.k_v,
                                sat.cp_v * sat.mu_v / sat.k_v, "gas")

    def single_phase(self, P: float, T: float) -> SinglePhaseState:
        """Liquid at or below the saturation temperature at P, vapour above it."""
        return self._liquid(P, T) if T <= self.T_sat(P) else self._vapour(P, T)

    def enthalpy(self, P: float, T: float) -> float:
        """Specific enthalpy [J/kg], zero for saturated liquid at the first row."""
        return self.single_phase(P, T).h

    def _liquid_T(self, h: float) -> float:
        """Temperature of the liquid whose enthalpy is h (exact inverse, a quadratic)."""
        hs = self._h_l
        if not hs[0] <= h <= hs[-1]:
            raise OutOfRangeError(f"{self.name}: a liquid enthalpy {h:.6g} J/kg lies below the "
                                  f"table's first row ({self.T_min:.6g} K)", fluid=self.name,
                                  state={"h": h})
        i = min(bisect.bisect_right(hs, h) - 1, len(hs) - 2)
        Tc, cp = self._col["T"], self._col["cp_l"]
        a = 0.5 * (cp[i + 1] - cp[i]) / (Tc[i + 1] - Tc[i])
        b, c = cp[i], h - hs[i]
        return min(Tc[i] + 2.0 * c / (b + math.sqrt(b * b + 4.0 * a * c)), Tc[i + 1])

    def at_ph(self, P: float, h: float) -> TwoPhaseState:
        """State at (P, h) with thermodynamic quality (see ``Fluid.at_ph``)."""
        sat = self.saturation(P)
        x = (h - sat.h_l) / sat.h_lv
        if 0.0 <= x <= 1.0:
            return _p().TwoPhaseState(P, h, sat.T_sat, x, "two-phase")
        if x < 0.0:
            s = self._liquid(P, self._liquid_T(h))
            return _p().TwoPhaseState(P, h, s.T, x, "subcooled", s.rho, s.cp, s.mu, s.k)
        s = self._vapour(P, sat.T_sat + (h - sat.h_v) / sat.cp_v)
        return _p().TwoPhaseState(P, h, s.T, x, "superheated", s.rho, s.cp, s.mu, s.k)

    def temperature(self, P: float, h: float) -> float:
        """Temperature at (P, h) [K]."""
        return self.at_ph(P, h).T


# --- pseudo-pure mixtures -----------------------------------------------------------------

_COMPONENT = re.compile(r"^\s*(?P<name>[^\[\]]+?)\s*\[\s*(?P<x>[0-9]*\.?[0-9]+(?:[eE]-?\d+)?)\s*\]\s*$")

#: Points of the saturation line computed for a pseudo-pure mixture.
MIXTURE_POINTS = 40


def is_mixture(spec) -> bool:
    """Whether a fluid name is a mixture in the library's notation ("A[0.9]&B[0.1]")."""
    return isinstance(spec, str) and "&" in spec


def parse_mixture(spec: str) -> tuple[tuple[str, ...], tuple[float, ...]]:
    """(component names, mole fractions) of "A[0.9]&B[0.1]"; InputError if malformed."""
    names, fractions = [], []
    for part in spec.removeprefix("HEOS::").split("&"):
        m = _COMPONENT.match(part)
        if m is None:
            raise InputError(f"fluid = {spec!r}: a mixture is written Name[mole fraction]&"
                             "Name[mole fraction], e.g. Propane[0.95]&n-Butane[0.05]",
                             field="fluid")
        names.append(m["name"])
        fractions.append(float(m["x"]))
    if abs(sum(fractions) - 1.0) > 1e-6:
        raise InputError(f"fluid = {spec!r}: the mole fractions add up to {sum(fractions):.6g}; "
                         "they must add up to 1", field="fluid")
    return tuple(names), tuple(fractions)


class PseudoPureMixture(SaturationTable):
    """A narrow-boiling mixture as a pseudo-pure fluid (see :func:`pseudo_pure`)."""

    def __init__(self, spec: dict, name: str, dew: tuple):
        super().__init__(spec)
        self.name = name
        self._dew = dew  # dew-point temperature on each row

    def boiling_range(self, P: float) -> float:
        """Dew minus bubble point at P [K]."""
        T_b = self.T_sat(P)
        i, f = self._segment_T(T_b)
        return (self._dew[i] + f * (self._dew[i + 1] - self._dew[i])) - T_b


def pseudo_pure(spec: str) -> PseudoPureMixture:
    """A mixture of the property library as a pseudo-pure saturation table."""
    import CoolProp
    import CoolProp.CoolProp as CP

    from .properties import make_fluid

    names, x = parse_mixture(spec)
    components = [make_fluid(n) for n in names]  # UnknownFluidError names a bad component
    if not all(hasattr(c, "P_crit") for c in components):
        raise InputError(f"fluid = {spec!r}: every component of a mixture must be a pure fluid "
                         "of the property library", field="fluid")
    try:
        state = CoolProp.AbstractState("HEOS", "&".join(c.coolprop_name for c in components))
        state.set_mole_fractions(list(x))
        points = [p.p for p in state.all_critical_points() if p.stable and p.p > 0.0]
    except ValueError as exc:
        raise PropertyError(f"{spec}: the property library has no mixture model for these "
                            f"components ({exc})", fluid=spec) from None
    # the stable critical point; else Kay's rule, the mole-fraction mean of the components'
    P_crit = min(points) if points else sum(xi * c.P_crit for xi, c in zip(x, components))
    try:
        state.update(CP.PQ_INPUTS, 0.5 * P_crit, 0.0)  # the model reaches the saturation line
    except ValueError as exc:
        raise PropertyError(f"{spec}: the property library has no mixture model for these "
                            f"components ({exc})", fluid=spec) from None
    P_lo = max(max(c.P_triple for c in components) * 10.0, 1e3)
    P_hi = 0.85 * P_crit
    rows = {k: [] for k in COLUMNS}
    dew = []
    for j in range(MIXTURE_POINTS):
        P = P_lo * (P_hi / P_lo) ** (j / (MIXTURE_POINTS - 1))
        try:
            state.update(CP.PQ_INPUTS, P, 0.0)
            T = state.T()
            liquid = (state.rhomass(), state.hmass(), state.cpmass(), state.viscosity(),
                      state.conductivity())
            state.update(CP.PQ_INPUTS, P, 1.0)
            vapour = (state.rhomass(), state.hmass(), state.cpmass(), state.viscosity(),
                      state.conductivity(), state.T())
            sigma = sum(xi * c.saturation_at(T).sigma for xi, c in zip(x, components))
        except (ValueError, PropertyError):
            continue  # a point the mixture model cannot reach: the table skips it
        if not all(_positive_number(v) for v in (*liquid[:1], *liquid[2:], *vapour, sigma,
                                                   vapour[1] - liquid[1])):
            continue  # a property the model leaves undefined here
        if rows["T"] and (T <= rows["T"][-1] or P <= rows["P"][-1]):
            continue
        for key, v in zip(("T", "P", "rho_l", "cp_l", "mu_l", "k_l", "rho_v", "cp_v", "mu_v",
                           "k_v", "sigma", "h_lv"),
                          (T, P, liquid[0], liquid[2], liquid[3], liquid[4], vapour[0],
                           vapour[2], vapour[3], vapour[4], sigma, vapour[1] - liquid[1])):
            rows[key].append(v)
        dew.append(vapour[5])
    if len(rows["T"]) < 2:
        raise PropertyError(f"{spec}: the property library's mixture model gives no saturation "
                            "line for this mixture", fluid=spec)
    table = dict(rows, name=spec, critical_pressure=P_crit,
                 molar_mass=sum(xi * c.M for xi, c in zip(x, components)))
    return PseudoPureMixture(table, spec, tuple(dew))
