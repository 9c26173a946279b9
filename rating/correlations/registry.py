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


def _r_prime(a):
    # cylinder radius over the capillary length (Lienhard & Dhir 1973)
    return 0.5 * a["D"] * math.sqrt(g * (a["rho_l"] - a["rho_v"]) / a["sigma"])


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
    "R_prime": (("D", "rho_l", "rho_v", "sigma"), _r_prime),
    "Ra_D": (("D", "dT", "rho", "mu", "k", "cp", "beta"), _ra_d),
    "Phi_b": (("bundle_diameter", "tube_length", "area"), _phi_b),
    "Re_shell": (("m_dot", "mu", "shell"), _re_shell),
    "Re_kern": (("m_dot", "mu", "shell"), _re_kern),
    "baffle_cut": (("shell",), lambda a: a["shell"].baffle_cut),
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
                messages.append(
                    f"{self.title}: {key} = {value:.4g} outside its range "
                    f"[{_fmt(lo)}, {_fmt(hi)}]"
                )
        return messages


def _fmt(v):
    return "-inf" if v is None else f"{v:.4g}"


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


def register(family: str, title: str, *, validity=None, references=(), notes=""):
    """Decorator: record a correlation function in the registry under its own name."""
    if family not in FAMILIES:
        raise ValueError(f"unknown family {family!r}")

    def wrap(fn):
        if fn.__name__ in REGISTRY:
            raise ValueError(f"method {fn.__name__!r} registered twice")
        REGISTRY[fn.__name__] = Method(
            name=fn.__name__, family=family, function=fn, title=title,
            validity=dict(validity or {}), references=tuple(references), notes=notes,
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
