"""Fluid properties: the engine's only boundary with CoolProp.

Three kinds of fluid share one small interface (``single_phase``, ``enthalpy``,
``temperature``, ``T_min``, ``T_max``):

* :class:`Fluid` -- a pure or pseudo-pure CoolProp fluid (HEOS backend) that can
  boil; it adds saturation sets and (P, h) states with thermodynamic quality.
* :class:`IncompressibleLiquid` -- a CoolProp ``INCOMP::`` liquid: a solution at a
  mass fraction ("MEG-30%") or a pure heat-transfer liquid ("TVP1").
* :class:`TableLiquid` -- a user table of cp, rho, mu, k against T (heating oils).

:func:`make_fluid` builds one from a name or a ``{"table": {...}}`` dict and keeps
one object per name *per thread*: a CoolProp ``AbstractState`` must not be updated
from two threads at once, so each worker thread gets its own.

Design notes
------------
* Only the low-level ``AbstractState`` is used (no ``PropsSI``): one flash serves
  several outputs and no strings are parsed in hot paths.
* A saturation set takes one ``update(PQ_INPUTS, P, 0)``; vapour values come from
  ``saturated_vapor_keyed_output``, measured 10-15 % faster than a second update
  at Q = 1 (CoolProp 8.0.0; see benchmarks/bench_properties.py).
* Every CoolProp ``ValueError`` becomes a :class:`~rating.errors.PropertyError`
  naming the fluid and the state; range violations are checked before CoolProp is
  called and raise :class:`~rating.errors.OutOfRangeError` naming the range.
* Surface tension is CoolProp's. For water it is not the IAPWS (1994/2014)
  formula: it is +0.08 % at 0.01 degC, +0.02 % at 100 degC and -1.0 % at 300 degC
  from it (reference notes CHECK-VALUES section 1d).
* Enthalpies use CoolProp's default reference state of each fluid (IAPWS for
  water, IIR h = 200 kJ/kg at 0 degC for the refrigerants); only enthalpy
  differences have meaning across fluids.
"""
from __future__ import annotations

import bisect
import difflib
import functools
import json
import math
import operator
import re
import threading
from dataclasses import dataclass, fields

import CoolProp
import CoolProp.CoolProp as CP

from .errors import InputError, OutOfRangeError, PropertyError, SupercriticalError, UnknownFluidError

__all__ = [
    "Fluid", "IncompressibleLiquid", "TableLiquid", "SaturationSet", "SinglePhaseState",
    "TwoPhaseState", "make_fluid", "fluid_names",
]

#: Entries kept per cache (saturation by P, by T, T_sat, P_sat); oldest evicted first.
CACHE_SIZE = 4096

_PQ, _QT, _PT, _HP = CP.PQ_INPUTS, CP.QT_INPUTS, CP.PT_INPUTS, CP.HmassP_INPUTS
_iD, _iH, _iCp = CP.iDmass, CP.iHmass, CP.iCpmass
_iMu, _iK, _iP, _iT = CP.iviscosity, CP.iconductivity, CP.iP, CP.iT

# CoolProp phase index -> our label. P > P_crit with T < T_crit is compressed
# liquid and T > T_crit with P < P_crit is gas for heat-transfer purposes.
_PHASE = {
    int(CP.iphase_liquid): "liquid", int(CP.iphase_supercritical_liquid): "liquid",
    int(CP.iphase_gas): "gas", int(CP.iphase_supercritical_gas): "gas",
    int(CP.iphase_supercritical): "supercritical", int(CP.iphase_critical_point): "supercritical",
}

# Pure incompressibles by the name in their CoolProp JSON "description" field.
_INCOMP_ALIASES = {"therminolvp1": "TVP1", "therminol66": "T66", "therminol72": "T72"}

_TWO_PHASE = int(CP.iphase_twophase)
#: Nearer the dome than this in quality, a (P, h) state is found by a (P, h) flash.
_NEWTON_MIN_X = 1e-6

_UNITS = {"P": "Pa", "T": "K", "h": "J/kg", "Q": "-"}


# --------------------------------------------------------------------------- states

@dataclass(frozen=True, slots=True)
class SaturationSet:
    """Saturated liquid and vapour properties at one pressure.

    Attributes: P [Pa], T_sat [K], rho_l, rho_v [kg/m^3], h_l, h_v, h_lv [J/kg],
    mu_l, mu_v [Pa*s], k_l, k_v [W/m/K], cp_l, cp_v [J/kg/K], sigma [N/m],
    Pr_l [-], P_crit [Pa], M [kg/kmol], dPdT_sat [Pa/K] (slope of the saturation line from Clapeyron's equation,
    h_lv / (T_sat (1/rho_v - 1/rho_l)), equal to CoolProp's ``first_saturation_deriv``).
    """

    P: float
    T_sat: float
    rho_l: float
    rho_v: float
    h_l: float
    h_v: float
    h_lv: float
    mu_l: float
    mu_v: float
    k_l: float
    k_v: float
    cp_l: float
    cp_v: float
    sigma: float
    Pr_l: float
    P_crit: float
    M: float
    dPdT_sat: float

    def as_dict(self) -> dict:
        """Return the properties as a dict keyed by the attribute names (registry dispatch)."""
        return dict(zip(_SAT_FIELDS, _sat_values(self)))

    def dp_sat(self, dT: float) -> float:
        """Estimate p_sat(T_sat + dT) - P without a property call.

        Integrated Clausius-Clapeyron equation with a constant coefficient B,
        chosen so that the slope at dT = 0 equals the exact ``dPdT_sat``:

        .. math:: \\Delta p = P \\left[\\exp\\left(B \\left(\\frac{1}{T_{sat}}
                  - \\frac{1}{T_{sat} + \\Delta T}\\right)\\right) - 1\\right],
                  \\quad B = \\frac{dP/dT|_{sat}\\, T_{sat}^2}{P}

        B = h_lv M / R for an ideal-gas vapour and a negligible liquid volume; the
        estimate inherits only the assumption that B is constant over dT. Water at
        1 atm, against CoolProp p_sat: +0.04 % at dT = 1 K, +0.21 % at 5 K, +0.45 %
        at 10 K, +1.03 % at 20 K (tests/test_properties.py).

        Parameters
        ----------
        dT : float
            Wall superheat T_wall - T_sat, may be negative (T_sat + dT > 0) [K]

        Returns
        -------
        dp_sat : float
            Estimated p_sat(T_sat + dT) - P [Pa]
        """
        T = self.T_sat
        B = self.dPdT_sat * T * T / self.P
        return self.P * math.expm1(B * dT / (T * (T + dT)))


_SAT_FIELDS = tuple(f.name for f in fields(SaturationSet))
_sat_values = operator.attrgetter(*_SAT_FIELDS)   # every field at once (as_dict)


@dataclass(frozen=True, slots=True)
class SinglePhaseState:
    """A single-phase state: P [Pa], T [K], rho [kg/m^3], h [J/kg], cp [J/kg/K],
    mu [Pa*s], k [W/m/K], Pr [-] and phase ("liquid", "gas" or "supercritical")."""

    P: float
    T: float
    rho: float
    h: float
    cp: float
    mu: float
    k: float
    Pr: float
    phase: str


@dataclass(frozen=True, slots=True)
class TwoPhaseState:
    """A (P, h) state of a boiling fluid.

    x is the thermodynamic mass quality (h - h_l)/h_lv at P, never clipped: x < 0
    is subcooled liquid, x > 1 superheated vapour. rho [kg/m^3], cp [J/kg/K],
    mu [Pa*s] and k [W/m/K] are the single-phase properties outside the dome and
    None inside it (0 <= x <= 1), where T = T_sat. phase is "subcooled",
    "two-phase" or "superheated". P [Pa], h [J/kg], T [K].
    """

    P: float
    h: float
    T: float
    x: float
    phase: str
    rho: float | None = None
    cp: float | None = None
    mu: float | None = None
    k: float | None = None


# --------------------------------------------------------------------------- names

@functools.cache
def _pure_lookup() -> dict[str, str]:
    """Lower-case name or alias -> CoolProp fluid name (names win over aliases)."""
    names = CP.get_global_param_string("FluidsList").split(",")
    table = {n.lower(): n for n in names}
    for n in names:
        for alias in CP.get_fluid_param_string(n, "aliases").split(","):
            if alias.strip():
                table.setdefault(alias.strip().lower(), n)
    return table


@functools.cache
def _incomp_lookup() -> tuple[dict[str, str], frozenset[str]]:
    """(lower-case code or alias -> CoolProp code, set of solution codes)."""
    pure = CP.get_global_param_string("incompressible_list_pure").split(",")
    solutions = CP.get_global_param_string("incompressible_list_solution").split(",")
    table = {c.lower(): c for c in pure + solutions if c}
    table.update(_INCOMP_ALIASES)
    return table, frozenset(solutions)


def fluid_names() -> list[str]:
    """CoolProp's pure and pseudo-pure fluid names followed by their aliases.

    Returns
    -------
    names : list of str
        Fluid names (CoolProp spelling), then the aliases not already listed [-]
    """
    return list(_fluid_names())


@functools.cache
def _fluid_names() -> tuple[str, ...]:
    canonical = CP.get_global_param_string("FluidsList").split(",")
    seen = {n.lower() for n in canonical}
    aliases = []
    for n in canonical:
        for alias in CP.get_fluid_param_string(n, "aliases").split(","):
            alias = alias.strip()
            if alias and alias.lower() not in seen:
                seen.add(alias.lower())
                aliases.append(alias)
    return tuple(sorted(canonical, key=str.lower) + sorted(aliases, key=str.lower))


def _unknown(name: str) -> UnknownFluidError:
    """UnknownFluidError with up to three close names (case-insensitive difflib)."""
    pure = _pure_lookup()
    incomp, _ = _incomp_lookup()
    candidates = {**{k: f"INCOMP::{v}" for k, v in incomp.items()}, **pure}
    queries = [name.strip().lower()]
    spec = _INCOMP_SPEC.match(_strip_prefix(name.strip(), "INCOMP::").replace(" ", ""))
    if spec is not None and spec["code"].lower() != queries[0]:
        queries.append(spec["code"].lower())  # "MEGG-30%": compare the code alone too
    suggestions = []
    for query in queries:
        for match in difflib.get_close_matches(query, candidates, n=8, cutoff=0.6):
            if candidates[match] not in suggestions:
                suggestions.append(candidates[match])
    suggestions = suggestions[:3]
    message = f"unknown fluid {name!r}"
    if suggestions:
        tail = suggestions[0] if len(suggestions) == 1 else (
            ", ".join(suggestions[:-1]) + " or " + suggestions[-1])
        message += f"; did you mean {tail}?"
    else:
        message += "; no similar name in CoolProp's fluid list"
    return UnknownFluidError(message, fluid=name)


def _strip_prefix(name: str, prefix: str) -> str:
    return name[len(prefix):] if name.upper().startswith(prefix.upper()) else name


# --------------------------------------------------------------------------- shared

class _CoolPropBacked:
    """What the CoolProp-backed fluids share: range checks, error wrapping, PT and Ph flashes."""

    name: str
    T_min: float
    T_max: float
    _state: CoolProp.AbstractState

    def _fail(self, exc: Exception, pair: str, **state) -> PropertyError:
        """Wrap a CoolProp ValueError into a one-line PropertyError naming fluid and state."""
        reason = (str(exc).strip().splitlines() or [type(exc).__name__])[0][:200]
        where = ", ".join(f"{k} = {v:.9g} {_UNITS[k]}" for k, v in state.items())
        return PropertyError(f"{self.name}: property evaluation failed at {where}: {reason}",
                             fluid=self.name, state={"input_pair": pair, **state})

    def _check_T(self, T: float) -> None:
        if not self.T_min <= T <= self.T_max:
            raise OutOfRangeError(
                f"{self.name}: T = {T:.6g} K is outside the valid range "
                f"{self.T_min:.6g} K to {self.T_max:.6g} K",
                fluid=self.name, state={"T": T})

    def _check_P(self, P: float) -> None:
        P_max = getattr(self, "P_max", math.inf)
        if not 0.0 < P <= P_max:
            raise OutOfRangeError(
                f"{self.name}: P = {P:.6g} Pa is outside the valid range 0 to {P_max:.6g} Pa",
                fluid=self.name, state={"P": P})

    def _check_result_T(self, T: float, P: float, h: float) -> None:
        if not self.T_min <= T <= self.T_max:
            raise OutOfRangeError(
                f"{self.name}: h = {h:.9g} J/kg at P = {P:.6g} Pa gives T = {T:.6g} K, outside "
                f"the valid range {self.T_min:.6g} K to {self.T_max:.6g} K",
                fluid=self.name, state={"P": P, "h": h})

    def single_phase(self, P: float, T: float) -> SinglePhaseState:
        """Single-phase properties at (P, T).

        Parameters
        ----------
        P : float
            Pressure [Pa]
        T : float
            Temperature, within [T_min, T_max] [K]

        Returns
        -------
        state : SinglePhaseState
            rho [kg/m^3], h [J/kg], cp [J/kg/K], mu [Pa*s], k [W/m/K], Pr [-], phase
        """
        self._check_T(T)
        self._check_P(P)
        s = self._state
        try:
            s.update(_PT, P, T)
            cp, mu, k = s.cpmass(), s.viscosity(), s.conductivity()
            return SinglePhaseState(P, T, s.rhomass(), s.hmass(), cp, mu, k, cp * mu / k,
                                    self._phase_label())
        except ValueError as exc:
            raise self._fail(exc, "PT", P=P, T=T) from None

    def enthalpy(self, P: float, T: float) -> float:
        """Specific enthalpy at (P, T) [J/kg] (single phase).

        Parameters
        ----------
        P : float
            Pressure [Pa]
        T : float
            Temperature, within [T_min, T_max] [K]

        Returns
        -------
        h : float
            Specific enthalpy [J/kg]
        """
        self._check_T(T)
        self._check_P(P)
        try:
            self._state.update(_PT, P, T)
            return self._state.hmass()
        except ValueError as exc:
            raise self._fail(exc, "PT", P=P, T=T) from None

    def _flash_ph(self, P: float, h: float) -> float:
        """Run a (h, P) flash on the state and return T; range-checked."""
        self._check_P(P)
        try:
            self._state.update(_HP, h, P)
            T = self._state.T()
        except ValueError as exc:
            raise self._fail(exc, "HmassP", P=P, h=h) from None
        self._check_result_T(T, P, h)
        return T

    def _phase_label(self) -> str:
        return "liquid"

    def __reduce__(self):  # AbstractState cannot be pickled: rebuild from the name
        return (type(self), (self.name,))

    def __repr__(self) -> str:
        return f"{type(self).__name__}({self.name!r})"


# --------------------------------------------------------------------------- Fluid

class Fluid(_CoolPropBacked):
    """A pure or pseudo-pure CoolProp fluid (HEOS backend) that can boil.

    Holds one ``AbstractState``; an instance must not be shared between threads
    (use :func:`make_fluid`, which keeps one instance per thread). Saturation
    sets, T_sat and P_sat are cached per input value (``CACHE_SIZE`` entries each,
    oldest evicted first), so the same input returns the identical object.

    Parameters
    ----------
    name : str
        CoolProp fluid name or alias, case-insensitive, optional "HEOS::" prefix [-]

    Attributes
    ----------
    name : str
        The name as given.
    coolprop_name : str
        CoolProp's spelling.
    P_crit, T_crit : float
        Critical pressure [Pa] and temperature [K].
    M : float
        Molar mass [kg/kmol].
    cas : str
        CAS registry number.
    T_min, T_max, P_max : float
        Validity range of the equation of state [K], [K], [Pa]; T_min is the
        triple point for most fluids.
    T_triple, P_triple : float
        Triple point [K], [Pa]; no saturation below P_triple.
    """

    def __init__(self, name: str):
        key = _strip_prefix(name.strip(), "HEOS::").lower()
        coolprop_name = _pure_lookup().get(key)
        if coolprop_name is None:
            raise _unknown(name)
        self.name = name
        self.coolprop_name = coolprop_name
        s = self._state = CoolProp.AbstractState("HEOS", coolprop_name)
        self.P_crit = s.p_critical()
        self.T_crit = s.T_critical()
        self.M = s.molar_mass() * 1000.0
        self.cas = CP.get_fluid_param_string(coolprop_name, "CAS")
        self.T_min, self.T_max, self.P_max = s.Tmin(), s.Tmax(), s.pmax()
        # keyed, not p_triple(): AbstractState.p_triple is new in CoolProp 8
        self.T_triple, self.P_triple = s.Ttriple(), s.trivial_keyed_output(CP.iP_triple)
        self._sat: dict[float, SaturationSet] = {}
        self._sat_T: dict[float, SaturationSet] = {}
        self._T_sat: dict[float, float] = {}
        self._P_sat: dict[float, float] = {}
        self._table = SaturationInterpolation(self)

    def clear_cache(self) -> None:
        """Empty the saturation caches (benchmarks, or after changing global CoolProp settings)."""
        for cache in (self._sat, self._sat_T, self._T_sat, self._P_sat):
            cache.clear()
        self._table = SaturationInterpolation(self)

    # ----- saturation
    def _check_sat_P(self, P: float) -> None:
        if not math.isfinite(P):
            raise OutOfRangeError(f"{self.name}: P = {P} is not a finite pressure",
                                  fluid=self.name, state={"P": P})
        if P < self.P_triple:
            raise OutOfRangeError(
                f"{self.name}: P = {P:.6g} Pa is below the triple-point pressure "
                f"{self.P_triple:.6g} Pa; saturation exists from {self.P_triple:.6g} Pa "
                f"to {self.P_crit:.6g} Pa", fluid=self.name, state={"P": P})
        if P >= self.P_crit:
            raise SupercriticalError(
                f"{self.name}: P = {P:.6g} Pa is at or above the critical pressure "
                f"{self.P_crit:.6g} Pa; no boiling above the critical pressure",
                fluid=self.name, state={"P": P})

    def _check_sat_T(self, T: float) -> None:
        if not math.isfinite(T):
            raise OutOfRangeError(f"{self.name}: T = {T} is not a finite temperature",
                                  fluid=self.name, state={"T": T})
        if T < self.T_triple:
            raise OutOfRangeError(
                f"{self.name}: T = {T:.6g} K is below the triple-point temperature; saturation "
                f"exists from {self.T_triple:.6g} K to {self.T_crit:.6g} K",
                fluid=self.name, state={"T": T})
        if T >= self.T_crit:
            raise SupercriticalError(
                f"{self.name}: T = {T:.6g} K is at or above the critical temperature "
                f"{self.T_crit:.6g} K; no boiling above the critical temperature",
                fluid=self.name, state={"T": T})

    def _read_saturation(self) -> SaturationSet:
        """Build the set from a state just updated to saturated liquid (Q = 0)."""
        s = self._state
        sv = s.saturated_vapor_keyed_output
        P, T = s.p(), s.T()
        rho_l, h_l, cp_l = s.rhomass(), s.hmass(), s.cpmass()
        mu_l, k_l = s.viscosity(), s.conductivity()
        h_v, rho_v = sv(_iH), sv(_iD)
        # Clapeyron's equation is exact on the saturation line and costs nothing, where
        # CoolProp's first_saturation_deriv is a further evaluation (same value to 1e-15).
        dPdT = (h_v - h_l) / (T * (1.0 / rho_v - 1.0 / rho_l))
        return SaturationSet(
            P=P, T_sat=T, rho_l=rho_l, rho_v=rho_v, h_l=h_l, h_v=h_v, h_lv=h_v - h_l,
            mu_l=mu_l, mu_v=sv(_iMu), k_l=k_l, k_v=sv(_iK), cp_l=cp_l, cp_v=sv(_iCp),
            sigma=s.surface_tension(), Pr_l=cp_l * mu_l / k_l, P_crit=self.P_crit, M=self.M,
            dPdT_sat=dPdT)

    def saturation(self, P: float) -> SaturationSet:
        """Saturation properties at pressure P (cached per P).

        Parameters
        ----------
        P : float
            Pressure, P_triple <= P < P_crit [Pa]

        Returns
        -------
        sat : SaturationSet
            Saturated liquid and vapour properties (SI units, see SaturationSet)

        Raises
        ------
        SupercriticalError
            P >= P_crit: no boiling above the critical pressure.
        OutOfRangeError
            P below the triple-point pressure.
        """
        sat = self._sat.get(P)
        if sat is not None:
            return sat
        self._check_sat_P(P)
        try:
            self._state.update(_PQ, P, 0.0)
            sat = self._read_saturation()
        except ValueError as exc:
            raise self._fail(exc, "PQ", P=P, Q=0.0) from None
        return _remember(self._sat, P, sat)

    def saturation_interpolated(self, P: float) -> SaturationSet:
        """Saturation properties at P from a table of CoolProp sets (``SaturationInterpolation``).

        For the march, which asks for a new pressure at every trial state: the
        table's nodes are computed once (per fluid and thread, until ``clear_cache``)
        where the march goes, and the interpolation error, measured on every
        interval before it is used, is within ``SaturationInterpolation.TOLERANCE``; where it
        would not be (near the critical point) the set is CoolProp's own.

        Parameters
        ----------
        P : float
            Pressure, P_triple <= P < P_crit [Pa]

        Returns
        -------
        sat : SaturationSet
            Saturated liquid and vapour properties (SI units, see SaturationSet)
        """
        # never the exact cache: the answer must not depend on what was asked before
        return self._table.at(P)

    def saturation_at(self, T: float) -> SaturationSet:
        """Saturation properties at temperature T (cached per T).

        Parameters
        ----------
        T : float
            Saturation temperature, T_triple <= T < T_crit [K]

        Returns
        -------
        sat : SaturationSet
            Saturated liquid and vapour properties (SI units, see SaturationSet)
        """
        sat = self._sat_T.get(T)
        if sat is not None:
            return sat
        self._check_sat_T(T)
        try:
            self._state.update(_QT, 0.0, T)
            sat = self._read_saturation()
        except ValueError as exc:
            raise self._fail(exc, "QT", Q=0.0, T=T) from None
        return _remember(self._sat_T, T, sat)

    def T_sat(self, P: float) -> float:
        """Saturation temperature at P [K] (one flash, cached; reuses a cached set).

        Parameters
        ----------
        P : float
            Pressure, P_triple <= P < P_crit [Pa]

        Returns
        -------
        T_sat : float
            Saturation temperature [K]
        """
        sat = self._sat.get(P)
        if sat is not None:
            return sat.T_sat
        T = self._T_sat.get(P)
        if T is not None:
            return T
        self._check_sat_P(P)
        try:
            self._state.update(_PQ, P, 0.0)
            T = self._state.T()
        except ValueError as exc:
            raise self._fail(exc, "PQ", P=P, Q=0.0) from None
        return _remember(self._T_sat, P, T)

    def P_sat(self, T: float) -> float:
        """Saturation pressure at T [Pa] (one flash, cached; reuses a cached set).

        Parameters
        ----------
        T : float
            Temperature, T_triple <= T < T_crit [K]

        Returns
        -------
        P_sat : float
            Saturation pressure [Pa]
        """
        sat = self._sat_T.get(T)
        if sat is not None:
            return sat.P
        P = self._P_sat.get(T)
        if P is not None:
            return P
        self._check_sat_T(T)
        try:
            self._state.update(_QT, 0.0, T)
            P = self._state.p()
        except ValueError as exc:
            raise self._fail(exc, "QT", Q=0.0, T=T) from None
        return _remember(self._P_sat, T, P)

    # ----- single phase and (P, h)
    def _phase_label(self) -> str:
        return _PHASE.get(int(self._state.phase()), "liquid")

    def at_ph(self, P: float, h: float, sat: SaturationSet | None = None) -> TwoPhaseState:
        """State at pressure P and specific enthalpy h, with thermodynamic quality.

        x = (h - h_l)/h_lv from the saturation set at P, not clipped. Inside the
        dome (0 <= x <= 1) T = T_sat and no further flash is made; outside it a
        (h, P) flash gives T, rho, cp, mu and k. Within CoolProp's own saturation
        tolerance (about 1e-9 in x) a slightly subcooled or superheated state is
        returned at T = T_sat with the saturated-phase properties.

        Parameters
        ----------
        P : float
            Pressure, P_triple <= P < P_crit [Pa]
        h : float
            Specific enthalpy [J/kg]
        sat : SaturationSet
            The saturation set at P to take the quality from; None for CoolProp's own
            (``saturation``). With an interpolated set, a state CoolProp finds just
            inside the dome takes the saturated phase's properties [-]

        Returns
        -------
        state : TwoPhaseState
            T [K], x [-], phase, and rho, cp, mu, k outside the dome (else None)

        Raises
        ------
        SupercriticalError
            P >= P_crit, where quality is not defined.
        """
        if sat is None:
            sat = self.saturation(P)
        x = (h - sat.h_l) / sat.h_lv
        if 0.0 <= x <= 1.0:
            return TwoPhaseState(P, h, sat.T_sat, x, "two-phase")
        phase = "subcooled" if x < 0.0 else "superheated"
        T = self._newton_pt(P, h, sat, x) if abs(x) > _NEWTON_MIN_X else None
        if T is None:
            T = self._flash_ph(P, h)
        s = self._state
        if int(s.phase()) == _TWO_PHASE:
            # An interpolated set puts the state just outside the dome that CoolProp
            # finds just inside it (within the table's tolerance): the saturated phase.
            if x < 0.0:
                return TwoPhaseState(P, h, sat.T_sat, x, phase, sat.rho_l, sat.cp_l,
                                     sat.mu_l, sat.k_l)
            return TwoPhaseState(P, h, sat.T_sat, x, phase, sat.rho_v, sat.cp_v, sat.mu_v,
                                 sat.k_v)
        try:
            return TwoPhaseState(P, h, T, x, phase,
                                 s.rhomass(), s.cpmass(), s.viscosity(), s.conductivity())
        except ValueError as exc:
            raise self._fail(exc, "HmassP", P=P, h=h) from None

    def _newton_pt(self, P, h, sat, x):
        """T at (P, h) outside the dome by Newton steps on (P, T) flashes, or None.

        A (P, T) flash costs a third to a quarter of a (P, h) one; from the saturated
        phase's cp, two to four reach h within 1e-12 h_lv (about 1e-10 K). The state
        is left at the last flash, that close to the answer. None (use the (P, h) flash) if a step would cross the
        saturation temperature or leave the fluid's range, or the flash finds the
        other phase.
        """
        s = self._state
        liquid = x < 0.0
        T_sat = sat.T_sat
        T = T_sat + ((h - sat.h_l) / sat.cp_l if liquid else (h - sat.h_v) / sat.cp_v)
        tol = 1e-12 * sat.h_lv
        try:
            for _ in range(8):
                if ((T >= T_sat) if liquid else (T <= T_sat)) or not self.T_min <= T <= self.T_max:
                    return None
                s.update(_PT, P, T)
                if _PHASE.get(int(s.phase())) != ("liquid" if liquid else "gas"):
                    return None
                dh = h - s.hmass()
                step = dh / s.cpmass()
                if abs(dh) <= tol:
                    return T + step   # the state, at T, is within 1e-12 h_lv of h
                T += step
        except ValueError:
            return None
        return None

    def temperature(self, P: float, h: float) -> float:
        """Temperature at (P, h) [K]: T_sat inside the dome, a (h, P) flash outside.

        Parameters
        ----------
        P : float
            Pressure (any, also supercritical) [Pa]
        h : float
            Specific enthalpy [J/kg]

        Returns
        -------
        T : float
            Temperature [K]
        """
        if self.P_triple <= P < self.P_crit:
            sat = self.saturation(P)
            if sat.h_l <= h <= sat.h_v:
                return sat.T_sat
            x = (h - sat.h_l) / sat.h_lv
            T = self._newton_pt(P, h, sat, x) if abs(x) > _NEWTON_MIN_X else None
            if T is not None:   # as at_ph finds it
                self._check_result_T(T, P, h)
                return T
        return self._flash_ph(P, h)


def _remember(cache: dict, key: float, value):
    """Store value under key, evicting the oldest entry when the cache is full."""
    if len(cache) >= CACHE_SIZE:
        del cache[next(iter(cache))]
    cache[key] = value
    return value


# --------------------------------------------------------------------------- saturation table

#: Saturation fields interpolated by the table; the rest follow from them.
_TABLE_FIELDS = ("T_sat", "rho_l", "rho_v", "h_l", "h_v", "mu_l", "mu_v", "k_l", "k_v", "cp_l",
                 "cp_v", "sigma")
_LOG_FIELDS = frozenset({"rho_v", "sigma"})     # interpolated in ln: close to powers of P
assert [i for i, n in enumerate(_TABLE_FIELDS) if n in _LOG_FIELDS] == [2, 11]  # _evaluate


class SaturationInterpolation:
    """Saturation sets interpolated in ln P between CoolProp sets at fixed nodes.

    Nodes sit at ln P = k ``STEP`` (every 2 % in pressure) and are computed when an
    interval first needs them, so the table covers the march's own pressure range
    and nothing else. On [P_k, P_k+1] each field is the cubic through the nodes
    k-1 to k+2 (rho_v and sigma in ln). Before an interval is first used, the cubic
    is compared with CoolProp's set at its midpoint, where a cubic's error is
    largest: if any field is off by more than ``TOLERANCE`` (relative; the
    enthalpies relative to h_lv) the interval is not interpolated and every set in
    it is CoolProp's own. h_lv, Pr_l and dPdT_sat (Clapeyron) follow from the
    interpolated fields, consistently. Measured at reduced pressures 0.01 to 0.5
    (tests/test_property_tables.py): within 4e-7 for water, propane, R134a and the
    alkanes; near the critical point the check hands the intervals back to CoolProp.
    """

    STEP = 0.02
    TOLERANCE = 1e-6
    #: Above this reduced pressure every set is CoolProp's own.
    MAX_REDUCED_PRESSURE = 0.9

    def __init__(self, fluid: "Fluid"):
        self.fluid = fluid
        self._nodes: dict[int, SaturationSet] = {}
        self._intervals: dict[int, tuple | None] = {}   # k -> coefficients, None: exact
        self._sets: dict[float, SaturationSet] = {}
        self.P_max = self.MAX_REDUCED_PRESSURE * fluid.P_crit
        self.exact_intervals = 0          # how many intervals failed the check

    def _node(self, k: int) -> SaturationSet:
        sat = self._nodes.get(k)
        if sat is None:
            sat = self._nodes[k] = self.fluid.saturation(math.exp(k * self.STEP))
        return sat

    def _interval(self, k: int):
        """Cubic coefficients of every field on [P_k, P_k+1], or None (not interpolated)."""
        if k in self._intervals:
            return self._intervals[k]
        coeffs = None
        fluid = self.fluid
        if math.exp((k - 1) * self.STEP) > fluid.P_triple and math.exp((k + 2) * self.STEP) < self.P_max:
            nodes = [self._node(k + j) for j in (-1, 0, 1, 2)]
            coeffs = []
            for name in _TABLE_FIELDS:
                v = [getattr(n, name) for n in nodes]
                if name in _LOG_FIELDS:
                    v = [math.log(a) for a in v]
                # Lagrange cubic through t = -1, 0, 1, 2 as c0 + c1 t + c2 t^2 + c3 t^3
                c0 = v[1]
                c1 = -v[0] / 3.0 - 0.5 * v[1] + v[2] - v[3] / 6.0
                c2 = 0.5 * (v[0] + v[2]) - v[1]
                c3 = (v[3] - v[0]) / 6.0 + 0.5 * (v[1] - v[2])
                coeffs.append((c0, c1, c2, c3))
            mid = fluid.saturation(math.exp((k + 0.5) * self.STEP))
            if _table_error(self._evaluate(coeffs, 0.5, mid.P), mid) > self.TOLERANCE:
                coeffs = None
                self.exact_intervals += 1
        self._intervals[k] = coeffs
        return coeffs

    def _evaluate(self, coeffs, t, P) -> SaturationSet:
        (T, rho_l, ln_rho_v, h_l, h_v, mu_l, mu_v, k_l, k_v, cp_l, cp_v,
         ln_sigma) = [c0 + t * (c1 + t * (c2 + t * c3)) for c0, c1, c2, c3 in coeffs]
        rho_v = math.exp(ln_rho_v)
        fluid = self.fluid
        return SaturationSet(
            P=P, T_sat=T, rho_l=rho_l, rho_v=rho_v, h_l=h_l, h_v=h_v, h_lv=h_v - h_l,
            mu_l=mu_l, mu_v=mu_v, k_l=k_l, k_v=k_v, cp_l=cp_l, cp_v=cp_v,
            sigma=math.exp(ln_sigma), Pr_l=cp_l * mu_l / k_l, P_crit=fluid.P_crit, M=fluid.M,
            dPdT_sat=(h_v - h_l) / (T * (1.0 / rho_v - 1.0 / rho_l)))

    def at(self, P: float) -> SaturationSet:
        """The saturation set at P: interpolated where the check allows, else CoolProp's."""
        sat = self._sets.get(P)
        if sat is not None:
            return sat
        fluid = self.fluid
        fluid._check_sat_P(P)
        u = math.log(P) / self.STEP
        k = math.floor(u)
        coeffs = self._interval(k) if P < self.P_max else None
        sat = fluid.saturation(P) if coeffs is None else self._evaluate(coeffs, u - k, P)
        if len(self._sets) >= CACHE_SIZE:
            self._sets.clear()   # cheap to remake; evicting one at a time is not (dict scans)
        self._sets[P] = sat
        return sat


def _table_error(sat: SaturationSet, exact: SaturationSet) -> float:
    """Largest relative difference of the table's fields (enthalpies relative to h_lv)."""
    worst = 0.0
    for name in _TABLE_FIELDS:
        a, b = getattr(sat, name), getattr(exact, name)
        scale = exact.h_lv if name in ("h_l", "h_v") else abs(b)
        worst = max(worst, abs(a - b) / scale)
    return worst


# --------------------------------------------------------------------------- INCOMP

_INCOMP_SPEC = re.compile(
    r"^(?P<code>[A-Za-z0-9]+)\s*(?:-\s*(?P<pct>[0-9]*\.?[0-9]+)\s*%|\[\s*(?P<frac>[0-9]*\.?[0-9]+)\s*\])?$")


def _parse_incomp(name: str) -> tuple[str, float | None] | None:
    """("MEG", 0.3) for "MEG-30%", "MEG[0.3]" or "INCOMP::MEG-30%"; None if not incompressible."""
    m = _INCOMP_SPEC.match(_strip_prefix(name.strip(), "INCOMP::").replace(" ", ""))
    if m is None:
        return None
    table, _ = _incomp_lookup()
    code = table.get(m["code"].lower())
    if code is None:
        return None
    if m["pct"] is not None:
        return code, float(m["pct"]) / 100.0
    return code, (float(m["frac"]) if m["frac"] is not None else None)


class IncompressibleLiquid(_CoolPropBacked):
    """A CoolProp incompressible liquid (INCOMP backend): heating or cooling media.

    Solutions take a mass fraction: "MEG-30%", "MEG[0.3]" or "INCOMP::MEG-30%"
    (30 % ethylene glycol by mass in water). Pure liquids take none: "TVP1"
    (Therminol VP-1; also accepted as "TherminolVP1"), "T66", "DowQ", ...
    Pressure enters only through h = u + P/rho.

    Parameters
    ----------
    name : str
        Incompressible code with optional "INCOMP::" prefix and mass fraction [-]

    Attributes
    ----------
    name : str
        The name as given.
    code : str
        CoolProp code ("MEG").
    mass_fraction : float or None
        Solute mass fraction of a solution, None for a pure liquid [-].
    T_min, T_max : float
        Valid temperature range; for solutions T_min is the freezing point at the
        mass fraction when that is higher than the table's lower end [K].
    """

    def __init__(self, name: str):
        parsed = _parse_incomp(name)
        if parsed is None:
            raise _unknown(name)
        code, fraction = parsed
        _, solutions = _incomp_lookup()
        if code in solutions and fraction is None:
            raise UnknownFluidError(
                f"incompressible solution {name!r} needs a mass fraction, e.g. '{code}-30%'",
                fluid=name)
        if code not in solutions and fraction is not None:
            raise UnknownFluidError(
                f"{name!r}: {code} is a pure incompressible liquid and takes no mass fraction",
                fluid=name)
        self.name, self.code, self.mass_fraction = name, code, fraction
        s = self._state = CoolProp.AbstractState("INCOMP", code)
        T_min = s.Tmin()
        if fraction is not None:
            s.set_mass_fractions([fraction])
            x_min, x_max = s.keyed_output(CP.ifraction_min), s.keyed_output(CP.ifraction_max)
            if not x_min <= fraction <= x_max:
                raise OutOfRangeError(
                    f"{name}: mass fraction {fraction:.4g} is outside the valid range "
                    f"{x_min:.4g} to {x_max:.4g}", fluid=name, state={})
            try:
                T_min = max(T_min, s.keyed_output(CP.iT_freeze))
            except ValueError:  # no freezing curve in the data: keep the table limit
                pass
        self.T_min, self.T_max = T_min, s.Tmax()

    def temperature(self, P: float, h: float) -> float:
        """Temperature at (P, h) by CoolProp's (h, P) inversion [K].

        Parameters
        ----------
        P : float
            Pressure [Pa]
        h : float
            Specific enthalpy [J/kg]

        Returns
        -------
        T : float
            Temperature [K]
        """
        return self._flash_ph(P, h)


# --------------------------------------------------------------------------- table

class TableLiquid:
    """A liquid given as a table of properties against temperature (heating oils).

    Linear interpolation in T for cp, rho and k; viscosity is interpolated
    linearly in ln(mu), i.e. exponentially between nodes, which follows the
    Arrhenius-like fall of oil viscosity. Enthalpy is the integral of cp from the
    first table temperature, exact for the piecewise-linear cp:

    .. math:: h(T) = h_i + c_{p,i}(T - T_i) + \\frac{c_{p,i+1} - c_{p,i}}{2(T_{i+1} - T_i)}(T - T_i)^2

    and temperature(P, h) inverts it exactly (a quadratic per segment). Pressure
    is ignored. Outside the table: OutOfRangeError (no extrapolation).

    Parameters
    ----------
    name : str
        Label used in messages [-]
    T : sequence of float
        Temperatures, strictly increasing, at least two [K]
    cp : sequence of float
        Specific heat at T [J/kg/K]
    rho : sequence of float
        Density at T [kg/m^3]
    mu : sequence of float
        Dynamic viscosity at T [Pa*s]
    k : sequence of float
        Thermal conductivity at T [W/m/K]
    """

    def __init__(self, name, T, cp, rho, mu, k):
        self.name = str(name)
        columns = {"T": T, "cp": cp, "rho": rho, "mu": mu, "k": k}
        data = {}
        for key, values in columns.items():
            try:
                data[key] = tuple(float(v) for v in values)
            except (TypeError, ValueError):
                raise InputError(f"{self.name}: table column {key!r} must be a list of numbers",
                                 field=f"table.{key}") from None
            if not all(math.isfinite(v) and (key == "T" or v > 0.0) for v in data[key]):
                raise InputError(f"{self.name}: table column {key!r} must hold finite"
                                 + ("" if key == "T" else " positive") + " numbers",
                                 field=f"table.{key}")
        n = len(data["T"])
        if n < 2 or any(len(v) != n for v in data.values()):
            raise InputError(f"{self.name}: the table needs at least two rows and columns of "
                             "equal length", field="table")
        if any(b <= a for a, b in zip(data["T"], data["T"][1:])):
            raise InputError(f"{self.name}: table temperatures must be strictly increasing",
                             field="table.T")
        self._T, self._cp, self._rho, self._k = data["T"], data["cp"], data["rho"], data["k"]
        self._ln_mu = tuple(math.log(v) for v in data["mu"])
        self.T_min, self.T_max = self._T[0], self._T[-1]
        h = [0.0]  # trapezoid rule is exact for piecewise-linear cp
        for i in range(n - 1):
            h.append(h[-1] + 0.5 * (self._cp[i] + self._cp[i + 1]) * (self._T[i + 1] - self._T[i]))
        self._h = tuple(h)

    def __repr__(self) -> str:
        return f"TableLiquid({self.name!r}, T={self.T_min:g}..{self.T_max:g} K)"

    def _segment(self, T: float) -> tuple[int, float]:
        """Index i of the segment holding T and the fraction (T - T_i)/(T_i+1 - T_i)."""
        if not self.T_min <= T <= self.T_max:
            raise OutOfRangeError(
                f"{self.name}: T = {T:.6g} K is outside the table range "
                f"{self.T_min:.6g} K to {self.T_max:.6g} K", fluid=self.name, state={"T": T})
        i = min(bisect.bisect_right(self._T, T) - 1, len(self._T) - 2)
        return i, (T - self._T[i]) / (self._T[i + 1] - self._T[i])

    @staticmethod
    def _lerp(column, i, f):
        return column[i] + f * (column[i + 1] - column[i])

    def single_phase(self, P: float, T: float) -> SinglePhaseState:
        """Interpolated properties at T (P is ignored).

        Parameters
        ----------
        P : float
            Pressure, not used [Pa]
        T : float
            Temperature within the table [K]

        Returns
        -------
        state : SinglePhaseState
            rho [kg/m^3], h [J/kg], cp [J/kg/K], mu [Pa*s], k [W/m/K], Pr [-], "liquid"
        """
        i, f = self._segment(T)
        cp, k = self._lerp(self._cp, i, f), self._lerp(self._k, i, f)
        mu = math.exp(self._lerp(self._ln_mu, i, f))
        return SinglePhaseState(P, T, self._lerp(self._rho, i, f), self._enthalpy(i, T), cp, mu, k,
                                cp * mu / k, "liquid")

    def _enthalpy(self, i: int, T: float) -> float:
        dT = T - self._T[i]
        slope = (self._cp[i + 1] - self._cp[i]) / (self._T[i + 1] - self._T[i])
        return self._h[i] + dT * (self._cp[i] + 0.5 * slope * dT)

    def enthalpy(self, P: float, T: float) -> float:
        """Specific enthalpy relative to the first table temperature [J/kg].

        Parameters
        ----------
        P : float
            Pressure, not used [Pa]
        T : float
            Temperature within the table [K]

        Returns
        -------
        h : float
            Integral of cp dT from the first table temperature [J/kg]
        """
        i, _ = self._segment(T)
        return self._enthalpy(i, T)

    def temperature(self, P: float, h: float) -> float:
        """Temperature whose enthalpy is h (exact inverse of :meth:`enthalpy`).

        Parameters
        ----------
        P : float
            Pressure, not used [Pa]
        h : float
            Specific enthalpy relative to the first table temperature [J/kg]

        Returns
        -------
        T : float
            Temperature [K]
        """
        if not self._h[0] <= h <= self._h[-1]:
            raise OutOfRangeError(
                f"{self.name}: h = {h:.9g} J/kg is outside the table range {self._h[0]:.6g} to "
                f"{self._h[-1]:.6g} J/kg ({self.T_min:.6g} K to {self.T_max:.6g} K)",
                fluid=self.name, state={"h": h})
        i = min(bisect.bisect_right(self._h, h) - 1, len(self._h) - 2)
        a = 0.5 * (self._cp[i + 1] - self._cp[i]) / (self._T[i + 1] - self._T[i])
        b, c = self._cp[i], h - self._h[i]
        # root of a dT^2 + b dT - c = 0 in the form that stays exact as a -> 0
        dT = 2.0 * c / (b + math.sqrt(b * b + 4.0 * a * c))
        return min(self._T[i] + dT, self._T[i + 1])


# --------------------------------------------------------------------------- factory

_local = threading.local()


def make_fluid(spec) -> Fluid | IncompressibleLiquid | TableLiquid:
    """Build the property object for a fluid specification.

    A name string resolves, in this order: "INCOMP::..." -> IncompressibleLiquid;
    a CoolProp pure/pseudo-pure name or alias (case-insensitive, optional
    "HEOS::") -> Fluid; an incompressible code ("MEG-30%", "TVP1") ->
    IncompressibleLiquid. A dict ``{"table": {"T": [...], "cp": [...], "rho":
    [...], "mu": [...], "k": [...]}, "name": "..."}`` -> TableLiquid. A boiling
    fluid's saturation table (a dict with "h_lv", see ``rating.fluid_table``) ->
    SaturationTable; a mixture "A[0.95]&B[0.05]" -> a pseudo-pure SaturationTable.

    CoolProp-backed objects are cached per name in a thread-local dict: repeated
    calls in one thread return the same object, another thread gets its own
    (an AbstractState must not be shared between threads).

    Parameters
    ----------
    spec : str or dict
        Fluid name, or a dict with a "table" entry (and optional "name") [-]

    Returns
    -------
    fluid : Fluid, IncompressibleLiquid or TableLiquid
        The property object [-]

    Raises
    ------
    UnknownFluidError
        The name is not known; the message suggests close names.
    """
    from . import fluid_table  # boiling fluids given as a saturation table or a mixture

    if fluid_table.is_saturation_table(spec):
        key = json.dumps(spec, sort_keys=True, default=str)
        return _shared_table(key, lambda: fluid_table.SaturationTable(spec))
    if isinstance(spec, dict):
        if "table" not in spec:
            raise InputError("a fluid given as a dict needs a 'table' entry", field="fluid")
        table = spec["table"]
        missing = [key for key in ("T", "cp", "rho", "mu", "k") if key not in table]
        if missing:
            raise InputError(f"fluid table lacks column(s) {', '.join(missing)}", field="fluid.table")
        return TableLiquid(spec.get("name", "table liquid"), table["T"], table["cp"],
                           table["rho"], table["mu"], table["k"])
    if not isinstance(spec, str):
        raise InputError(f"a fluid is a name or a table, not {type(spec).__name__}", field="fluid")
    cache = getattr(_local, "fluids", None)
    if cache is None:
        cache = _local.fluids = {}
    fluid = cache.get(spec)
    if fluid is None:
        fluid = cache[spec] = (_shared_table(spec, lambda: fluid_table.pseudo_pure(spec))
                               if fluid_table.is_mixture(spec) else _build(spec))
    return fluid


# Saturation tables (a user's, or a mixture's pseudo-pure one: 0.5 to 0.7 s of flashes to
# build) hold no AbstractState once built, only numbers and a per-pressure cache that is
# filled idempotently: one per process serves every thread (validation on the desktop's
# thread, the rating workers), where a per-thread copy was rebuilt on each.
_tables: dict = {}
_tables_lock = threading.Lock()
_TABLES_KEPT = 64   # a user editing a table makes a new one per edit: keep the newest


def _shared_table(key: str, build):
    with _tables_lock:
        table = _tables.get(key)
    if table is None:
        table = build()            # outside the lock: a slow build does not hold others up
        with _tables_lock:
            if len(_tables) >= _TABLES_KEPT:
                _tables.pop(next(iter(_tables)))
            table = _tables.setdefault(key, table)
    return table


def _build(name: str) -> Fluid | IncompressibleLiquid:
    stripped = name.strip()
    if stripped.upper().startswith("INCOMP::"):
        return IncompressibleLiquid(name)
    if _strip_prefix(stripped, "HEOS::").lower() in _pure_lookup():
        return Fluid(name)
    if _parse_incomp(stripped) is not None:
        return IncompressibleLiquid(name)
    raise _unknown(name)
