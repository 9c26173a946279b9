"""The one registry of published methods.

Every correlation is a pure function registered here with its family, title,
validity range and references. Dispatch (``call``), the method lists the GUI
offers (``methods``), the method trail of a result and the documentation all
derive from these records; there is no second list anywhere.

Validity ranges are keyed by an argument name of the function or by one of the
derived groups in ``DERIVED`` (reduced pressure, Reynolds, Prandtl and
Rayleigh numbers, reduced cylinder radius, bundle geometry factor) so that a
range can be checked from the same inputs the function receives.
"""
from __future__ import annotations

import inspect
import math
from dataclasses import dataclass, field
from functools import cached_property
from typing import Callable, Mapping

from .dimensionless import g

#: Families of methods. The name is what ``methods(family)`` takes.
FAMILIES = {
    "nucleate_boiling": "Nucleate pool boiling coefficient",
    "pool_chf": "Critical heat flux of a single surface in a pool",
    "bundle_chf": "Maximum heat flux of a tube bundle in a pool",
    "flow_boiling": "Flow boiling coefficient inside tubes",
    "tube_dryout": "Critical heat flux / dryout inside tubes",
    "two_phase_friction": "Two-phase frictional pressure gradient",
    "void_fraction": "Void fraction",
    "single_phase_tube": "Single-phase forced convection inside tubes",
    "friction_factor": "Single-phase Darcy friction factor",
    "condensation": "Condensing-vapour film coefficient",
    "shell_side": "Shell-side single-phase coefficient and pressure drop",
    "flow_pattern": "Two-phase flow pattern",
    "mixture": "Mixture correction of the nucleate boiling coefficient",
    "natural_convection": "Natural convection on a surface",
    "subcooled_boiling": "Subcooled flow boiling (wall temperature)",
    "post_dryout": "Post-dryout (dispersed-flow) coefficient",
}


def _reduced_pressure(a):
    return a["P"] / a["P_crit"]


def _re_lo(a):
    return a["G"] * a["D"] / a["mu_l"]


def _re_l(a):
    return a["G"] * (1.0 - a["x"]) * a["D"] / a["mu_l"]


def _pr_l(a):
    return a["cp_l"] * a["mu_l"] / a["k_l"]


def _ra_d(a):
    return (g * abs(a["beta"] * a["dT"]) * a["D"] ** 3 * a["rho"] ** 2 * a["cp"]
            / (a["mu"] * a["k"]))


def _phi_b(a):
    # Palen's bundle geometry factor before its cap at 1
    return 2.2 * math.pi * a["bundle_diameter"] * a["tube_length"] / a["area"]


def _re_shell(a):
    # Bell-Delaware crossflow Reynolds number (a shell_side.ShellGeometry)
    return a["shell"].reynolds_crossflow(a["m_dot"], a["mu"])


def _re_kern(a):
    # Kern's Reynolds number on the equivalent diameter
    return a["shell"].reynolds_kern(a["m_dot"], a["mu"])


#: Derived groups that a validity range may name: (needed arguments, function).
DERIVED: dict[str, tuple[tuple[str, ...], Callable[[Mapping], float]]] = {
    "p_r": (("P", "P_crit"), _reduced_pressure),
    "Re_lo": (("G", "D", "mu_l"), _re_lo),
    "Re_l": (("G", "x", "D", "mu_l"), _re_l),
    "Pr_l": (("cp_l", "mu_l", "k_l"), _pr_l),
    "Ra_D": (("D", "dT", "rho", "mu", "k", "cp", "beta"), _ra_d),
    "Phi_b": (("bundle_diameter", "tube_length", "area"), _phi_b),
    "Re_shell": (("m_dot", "mu", "shell"), _re_shell),
    "Re_kern": (("m_dot", "mu", "shell"), _re_kern),
    "baffle_cut": (("shell",), lambda a: a["shell"].baffle_cut),
    "L_D": (("L", "D"), lambda a: a["L"] / a["D"]),
}


@dataclass(frozen=True)
class Method:
    """One published method: what it computes, where it holds, where it is from."""

    name: str
    family: str
    function: Callable
    title: str
    validity: Mapping[str, tuple[float | None, float | None]] = field(default_factory=dict)
    references: tuple[str, ...] = ()
    notes: str = ""
    #: Orientations of the heated tubes the method was published for (None: any).
    orientations: tuple[str, ...] | None = None
    #: CAS numbers of the only fluids the method holds for (None: any fluid).
    fluids: tuple[str, ...] | None = None
    #: A flow-boiling method's parts at one station: called with the function's inputs
    #: but its local drive (q, or dT_sat and dp_sat), it does the work that does not
    #: depend on the drive once and returns drive -> (htc, nucleate part, convective
    #: part) (``flow_boiling.BoilingParts``). None for other families.
    station: Callable | None = None
    #: How the parts make the coefficient: htc^n = nucleate^n + convective^n.
    parts_exponent: int | None = None

    @cached_property
    def inputs(self) -> tuple[str, ...]:
        """Required (positional-or-keyword, no default) argument names."""
        sig = inspect.signature(self.function)
        return tuple(
            n for n, p in sig.parameters.items()
            if p.default is inspect.Parameter.empty
            and p.kind in (p.POSITIONAL_OR_KEYWORD, p.KEYWORD_ONLY)
        )

    @cached_property
    def options(self) -> tuple[str, ...]:
        """Optional (keyword) argument names."""
        sig = inspect.signature(self.function)
        return tuple(n for n, p in sig.parameters.items()
                     if p.default is not inspect.Parameter.empty)

    @property
    def reference(self) -> str:
        """The first reference, as a one-line citation."""
        return self.references[0] if self.references else ""

    def __call__(self, available: Mapping[str, float], **options):
        """Call the function with the inputs it needs taken from ``available``.

        Options are passed only explicitly: a name in ``available`` never turns
        into an option by accident (``roughness`` means different things to
        different methods).
        """
        try:
            args = {n: available[n] for n in self.inputs}
        except KeyError as exc:  # a programming error, not a user error
            raise KeyError(f"{self.name} needs {exc.args[0]!r}") from None
        return self.function(**args, **options)

    def out_of_range(self, available: Mapping[str, float]) -> list[str]:
        """Messages for every validity bound the given state violates."""
        messages = []
        for key, (lo, hi) in self.validity.items():
            value = quantity(key, available)
            if value is None or not math.isfinite(value):
                continue
            if (lo is not None and value < lo) or (hi is not None and value > hi):
                unit = f" {UNITS[key]}" if UNITS.get(key) else ""
                messages.append(RangeNote(
                    f"{self.title}: {key} = {value:.4g}{unit} outside its range "
                    f"{_fmt(lo)} to {_fmt(hi, '+inf')}{unit}", self.title, key, value, lo, hi))
        return messages


class RangeNote(str):
    """The message of a crossed validity bound, keeping its values for other unit systems:
    ``template`` names each value's catalogue quantity (``rating.rules``), ``values`` holds
    (name, SI value) pairs. Equal to, and used as, the plain SI message."""

    def __new__(cls, text, title, key, value, lo, hi):
        note = super().__new__(cls, text)
        kind = QUANTITIES.get(key)
        if kind is None:   # dimensionless groups, or a unit with no display quantity
            unit = f" {UNITS[key]}" if UNITS.get(key) else ""
            note.template = ("{title:text}: {key:text} = {value:dimensionless:.4g}" + unit
                             + " outside its range {lo:text} to {hi:text}" + unit)
            note.values = (("title", title), ("key", key), ("value", value),
                           ("lo", _fmt(lo)), ("hi", _fmt(hi, "+inf")))
            return note
        bound = "{%s:" + kind + ":.4g}"
        note.template = ("{title:text}: {key:text} = {value:" + kind + ":.4g} outside its range "
                         + (bound % "lo" if lo is not None else "-inf") + " to "
                         + (bound % "hi" if hi is not None else "+inf"))
        note.values = (("title", title), ("key", key), ("value", value)) + tuple(
            (name, b) for name, b in (("lo", lo), ("hi", hi)) if b is not None)
        return note

    def __reduce__(self):
        return (_range_note, (str(self), self.template, self.values))


def _range_note(text, template, values):
    note = str.__new__(RangeNote, text)
    note.template, note.values = template, values
    return note


#: Units of the quantities a validity range may name (SI); the others are dimensionless.
UNITS = {
    "P": "Pa", "G": "kg/m^2/s", "D": "m", "L": "m", "q": "W/m^2", "dT": "K", "M": "kg/kmol",
    "boiling_range": "K",
}


#: The catalogue quantity (``rating.catalogue.QUANTITIES``) of a bounded input, for
#: showing a crossed bound in other units.
QUANTITIES = {
    "P": "pressure", "G": "mass_flux", "D": "diameter", "L": "length", "q": "heat_flux",
    "dT": "temperature_difference", "boiling_range": "temperature_difference",
}


def _fmt(v, none="-inf"):
    return none if v is None else f"{v:.4g}"


def quantity(key: str, available: Mapping[str, float]) -> float | None:
    """Value of an argument or derived group from the available inputs."""
    if key in available:
        return float(available[key])
    if key in DERIVED:
        needed, fn = DERIVED[key]
        if all(n in available for n in needed):
            return float(fn(available))
    return None


REGISTRY: dict[str, Method] = {}


def register(family: str, title: str, *, validity=None, references=(), notes="",
             orientations=None, fluids=None, station=None, parts_exponent=None):
    """Decorator: record a correlation function in the registry under its own name.

    ``orientations`` names the tube orientations the method was published for
    ("vertical", "horizontal"); None means it holds for either. ``fluids`` lists the
    CAS numbers of the only fluids it holds for (a water-only table); None means any.
    ``station`` and ``parts_exponent``: a flow-boiling method's parts (``Method.station``).
    """
    if family not in FAMILIES:
        raise ValueError(f"unknown family {family!r}")

    def wrap(fn):
        if fn.__name__ in REGISTRY:
            raise ValueError(f"method {fn.__name__!r} registered twice")
        REGISTRY[fn.__name__] = Method(
            name=fn.__name__, family=family, function=fn, title=title,
            validity=dict(validity or {}), references=tuple(references), notes=notes,
            orientations=tuple(orientations) if orientations else None,
            fluids=tuple(fluids) if fluids else None,
            station=station, parts_exponent=parts_exponent,
        )
        return fn

    return wrap


def get(name: str) -> Method:
    """The method registered under ``name``; a clear message lists the choices."""
    try:
        return REGISTRY[name]
    except KeyError:
        raise KeyError(f"no method named {name!r}; known: {', '.join(sorted(REGISTRY))}") from None


def methods(family: str) -> list[Method]:
    """All methods of one family, in registration order."""
    return [m for m in REGISTRY.values() if m.family == family]


# --------------------------------------------------------------------------- applicability

#: The saturation set the engine hands to every method (``properties.SaturationSet.as_dict``).
_SAT = frozenset({"P", "T_sat", "rho_l", "rho_v", "h_l", "h_v", "h_lv", "mu_l", "mu_v", "k_l",
                  "k_v", "cp_l", "cp_v", "sigma", "Pr_l", "P_crit", "M", "dPdT_sat"})
_LOCAL = frozenset({"G", "x", "D"})
WATER_CAS = "7732-18-5"

#: What each exchanger type feeds the methods of each family the user may choose: the
#: argument names available where the family is evaluated. A method applies to a type
#: when the type evaluates its family, its required inputs are all fed, and its
#: orientations (if declared) include the tubes'. "h0" and "h_nb_ref" are fluid constants
#: fed where they are tabulated for the fluid (``fluid_constants_missing``).
_TUBE_MARCH = {
    # heat-flux forms; wall-superheat forms (Chen) are solved for the flux by the march
    "flow_boiling": _SAT | _LOCAL | {"q", "dT_sat", "dp_sat", "fluid_surface_factor", "h_nb_ref"},
    # evaluated at a given flux (subcooled boiling, the nucleate part of the profile)
    "nucleate_boiling": _SAT | {"q", "h0"},
    "two_phase_friction": _SAT | _LOCAL,
    "void_fraction": _SAT | _LOCAL,
    # local conditions only: whole-tube forms need a heated length and inlet subcooling
    "tube_dryout": _SAT | _LOCAL,
    "single_phase_tube": frozenset({"Re", "Pr"}),
    "shell_side": frozenset({"m_dot", "rho", "mu", "cp", "k", "shell"}),
}
FEEDS: dict[str, dict[str, frozenset]] = {
    "evaporator": _TUBE_MARCH,
    "thermosiphon": _TUBE_MARCH,
    "kettle": {
        # pool boiling on the bundle: the wall superheat is solved, so both forms are fed
        "nucleate_boiling": _SAT | {"q", "h0", "dT_sat", "dp_sat"},
        "single_phase_tube": frozenset({"Re", "Pr"}),      # heating liquid inside the tubes
        "two_phase_friction": _SAT | _LOCAL,               # steam condensing inside the tubes
        # the bundle's maximum flux (kettle.bundle_max_flux), from the pool's saturation set
        # and the bundle's geometry
        "bundle_chf": _SAT | {"bundle_diameter", "tube_length", "area", "tube_pitch", "D",
                              "tube_count"},
    },
}


def families_evaluated(case_type: str, heating_kind: str | None = None) -> tuple[str, ...]:
    """Method families whose choice matters for an exchanger type (the others are ignored);
    with condensing steam on the shell side (``heating_kind`` "steam") no shell-side
    single-phase method is evaluated."""
    return tuple(f for f in FEEDS.get(case_type, {})
                 if not (f == "shell_side" and heating_kind == "steam"))


def fluid_constants_missing(method: Method, fluid_cas: str | None) -> list[str]:
    """Fluid constants the method needs that are not tabulated for this fluid (CAS number)."""
    if fluid_cas is None:
        return []
    from .flow_boiling import steiner_taborek_reference
    from .pool_boiling import gorenflo_reference_htc

    missing = []
    if "h0" in method.inputs and gorenflo_reference_htc(fluid_cas) is None:
        missing.append("h0")
    if "h_nb_ref" in method.inputs and steiner_taborek_reference(fluid_cas) is None \
            and gorenflo_reference_htc(fluid_cas) is None:
        missing.append("h_nb_ref")
    return missing


def why_not(method: Method, case_type: str, orientation: str | None = None,
            fluid_cas: str | None = None) -> str | None:
    """Why the method cannot be used for this type and orientation, or None if it can."""
    feeds = FEEDS.get(case_type, {}).get(method.family)
    if feeds is None:
        return f"this exchanger type ({case_type}) does not evaluate {FAMILIES[method.family].lower()}"
    unfed = [n for n in method.inputs if n not in feeds]
    if unfed:
        return (f"it needs {', '.join(unfed)}, which a rating of this type ({case_type}) "
                "does not supply where the method is evaluated")
    if orientation is not None and method.orientations and orientation not in method.orientations:
        return f"it was published for {' or '.join(method.orientations)} tubes only"
    if fluid_cas is not None and method.fluids and fluid_cas not in method.fluids:
        return "it holds for " + ("water" if method.fluids == (WATER_CAS,) else
                                  "the fluids " + ", ".join(method.fluids)) + " only"
    missing = fluid_constants_missing(method, fluid_cas)
    if missing:
        return f"its fluid constant {', '.join(missing)} is not tabulated for this fluid"
    return None


def applicable(family: str, case_type: str, orientation: str | None = None,
               fluid_cas: str | None = None) -> list[Method]:
    """Methods of a family that a rating of this exchanger type and tube orientation can
    feed and use (all of them rate); empty when the type does not evaluate the family.

    ``fluid_cas`` (the boiling fluid's CAS number) also drops the methods whose fluid
    constant is not tabulated for it.
    """
    return [m for m in methods(family)
            if why_not(m, case_type, orientation, fluid_cas) is None]
