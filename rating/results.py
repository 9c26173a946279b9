"""Results of a rating: summary, profiles along the length, warnings, methods used.

A result carries its status ("ok", "warnings", "failed" or "cancelled") and a message instead
of raising, so that a GUI, a report or a batch run can always show something.
Keys are SI with the unit in the name; ``to_dict`` gives the JSON the CLI prints.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

SEVERITIES = ("info", "warning", "error")

#: Summary keys every exchanger type reports, in this order.
SUMMARY_KEYS = (
    "duty_W", "duty_heating_side_W", "area_m2", "u_clean_W_m2K", "u_service_W_m2K",
    "mean_temperature_difference_K", "over_design_pct", "exit_quality", "exit_superheat_K",
    "exit_subcooling_K", "exit_temperature_K",
    "pressure_drop_boiling_Pa", "pressure_drop_heating_Pa", "heating_outlet_temperature_K",
    "max_heat_flux_W_m2", "max_chf_ratio", "dryout_z_m",
)

#: Profile keys (arrays of equal length along the heated path) and the Station
#: attribute each is taken from.
PROFILE_FIELDS = {
    "z_m": "z", "p_Pa": "P", "t_sat_K": "T_sat", "t_process_K": "T_process",
    "t_heating_K": "T_heating", "t_wall_inner_K": "T_wall_inner",
    "t_wall_outer_K": "T_wall_outer", "quality": "x", "void_fraction": "void_fraction",
    "heat_flux_W_m2": "q", "htc_boiling_W_m2K": "htc_boiling",
    "htc_nucleate_W_m2K": "htc_nucleate", "htc_convective_W_m2K": "htc_convective",
    "htc_heating_W_m2K": "htc_heating", "chf_ratio": "chf_ratio",
    "flow_pattern": "flow_pattern", "regime": "regime",
    "critical_heat_flux_W_m2": "q_chf", "wall_superheat_K": "wall_superheat",
    "u_service_W_m2K": "u_service", "cumulative_duty_W": "duty",
}


@dataclass(frozen=True)
class RatingWarning:
    """One finding of the checks: a code of our own (``rating.rules``), a severity, where,
    and why.

    ``message`` is the SI text; ``template`` and ``values`` ((name, SI value) pairs, each
    value's quantity named in the template) let a surface show the same finding in its
    own units (``rating.rules.render``).
    """

    code: str
    severity: str
    message: str
    z_m: float | None = None
    template: str = ""
    values: tuple = ()

    def __post_init__(self):
        if self.severity not in SEVERITIES:
            raise ValueError(f"severity {self.severity!r} is not one of {SEVERITIES}")

    def to_dict(self) -> dict:
        out = {"code": self.code, "severity": self.severity, "message": self.message,
               "z_m": _clean(self.z_m)}
        if self.template:
            from .rules import quantities

            kinds = quantities(self.template)
            out["template"] = self.template
            out["values"] = {k: {"value": _clean(v), "quantity": kinds.get(k, "text")}
                             for k, v in self.values}
        return out


@dataclass(frozen=True)
class MethodUsed:
    family: str
    name: str
    reference: str
    title: str = ""

    def to_dict(self) -> dict:
        return {"family": self.family, "name": self.name, "title": self.title,
                "reference": self.reference}


@dataclass(frozen=True)
class Result:
    """The outcome of rating one case."""

    name: str
    type: str
    status: str
    message: str
    summary: dict = field(default_factory=dict)
    profiles: dict = field(default_factory=dict)
    warnings: tuple[RatingWarning, ...] = ()
    methods: tuple[MethodUsed, ...] = ()
    extra: dict = field(default_factory=dict)
    #: Ebullio and CoolProp versions, method names, the case's SHA-256, the UTC time rated.
    provenance: dict = field(default_factory=dict)

    def __post_init__(self):
        # One contract for every surface: a figure that was not computed is None, never
        # NaN or infinity (which a table would print as "nan" or a plot as a spike).
        object.__setattr__(self, "summary", {k: _clean(v) for k, v in self.summary.items()})

    @property
    def has_errors(self) -> bool:
        return any(w.severity == "error" for w in self.warnings)

    def to_dict(self) -> dict:
        out = {
            "name": self.name, "type": self.type, "status": self.status,
            "message": self.message,
            "summary": dict(self.summary),
            "warnings": [w.to_dict() for w in self.warnings],
            "methods": [m.to_dict() for m in self.methods],
            "profiles": {k: [_clean(v) for v in vals] for k, vals in self.profiles.items()},
        }
        for k, v in self.extra.items():
            out[k] = _clean_tree(v)
        out["provenance"] = _clean_tree(self.provenance)
        return out


def _clean(v):
    """JSON-safe scalar: numpy to float, non-finite to None."""
    if v is None or isinstance(v, (str, bool)):
        return v
    if isinstance(v, int):
        return v
    try:
        f = float(v)
    except (TypeError, ValueError):
        return str(v)
    return f if math.isfinite(f) else None


def _clean_tree(v):
    if isinstance(v, dict):
        return {k: _clean_tree(x) for k, x in v.items()}
    if isinstance(v, (list, tuple)):
        return [_clean_tree(x) for x in v]
    return _clean(v)


def profiles_from_stations(stations) -> dict:
    """Profile arrays (tuples) from the march's stations."""
    return {key: tuple(getattr(s, attr) for s in stations) for key, attr in PROFILE_FIELDS.items()}


def failed(case, message: str, *, warnings=(), methods=(), profiles=None,
           code: str = "no-convergence", status: str = "failed") -> Result:
    """A result for a case that could not be rated ("failed"), or whose rating was
    stopped by the caller ("cancelled"), with the reason."""
    from .rules import note

    summary = {k: None for k in SUMMARY_KEYS}
    return Result(case.name, case.type, status, message, summary, profiles or {},
                  tuple(warnings) + (note(code, message),), tuple(methods))


def cancelled(case, *, methods=()) -> Result:
    """The result of a rating stopped by its caller's cancel flag."""
    return failed(case, "cancelled before the rating finished", methods=methods,
                  code="cancelled", status="cancelled")
