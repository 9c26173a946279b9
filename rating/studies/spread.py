"""The spread between methods: one case rated with every applicable method of one family.

It shows how much of an answer rests on the choice of correlation: the duty,
over-design, exit quality, circulation and critical-flux ratio of each method,
and their range.
"""
from __future__ import annotations

from dataclasses import dataclass

from .. import catalogue
from ..errors import InputError
from .execution import Job, Point, rate_points

#: Families a spread may compare, and the input each sets (in-tube; the kettle's own
#: bundle limit stands in for tube dryout).
FAMILIES = {
    "flow_boiling": "methods.flow_boiling",
    "nucleate_boiling": "methods.nucleate_boiling",
    "dryout": "methods.tube_dryout",
    "two_phase_friction": "methods.two_phase_friction",
    "void_fraction": "methods.void_fraction",
}
_KETTLE_PATHS = {"dryout": "kettle.bundle_max_flux"}

#: Results compared, in this order; a key a type does not report is left out.
KEYS = ("duty_W", "over_design_pct", "exit_quality", "circulation_kg_s", "max_chf_ratio")

#: A dispatcher that picks one of the family's methods by fluid: it would list a
#: method twice.
_DISPATCHERS = ("auto",)


def family_path(family: str, case_type: str) -> str:
    """The input a family's choice is set at, for this exchanger type."""
    if family not in FAMILIES:
        raise InputError(f"method family {family!r}: choose one of {', '.join(FAMILIES)}",
                         field="family")
    path = _KETTLE_PATHS.get(family, FAMILIES[family]) if case_type == "kettle" \
        else FAMILIES[family]
    if case_type not in catalogue.input_field(path).types:
        raise InputError(f"method family {family!r} is not a choice of a {case_type}",
                         field="family")
    return path


def families_of(case_type: str) -> list[tuple[str, str]]:
    """(family, the catalogue's label of the input it sets) of each family this exchanger
    type chooses a method for."""
    out = []
    for family in FAMILIES:
        try:
            out.append((family, catalogue.input_field(family_path(family, case_type)).label))
        except InputError:
            continue
    return out


def applicable_methods(case, family: str) -> list[tuple[str, str, str]]:
    """(name, title, reference) of each method of the family the engine accepts for this case."""
    path = family_path(family, case.type)
    choices = catalogue.method_choices(path, catalogue.case_to_draft(case))
    seen, out = set(), []
    for name, title, reference in choices:
        if name not in _DISPATCHERS and name not in seen:
            seen.add(name)
            out.append((name, title, reference))
    return out


@dataclass(frozen=True)
class Spread:
    """Each applicable method's rating and the range of each compared result."""

    case_name: str
    family: str
    path: str
    chosen: str                   # the case's own method
    methods: tuple[tuple[str, str, str], ...]  # (name, title, reference), point order
    points: tuple[Point, ...]
    keys: tuple[str, ...]

    def values(self, key: str) -> list:
        return [p.value(key) for p in self.points]

    def range(self, key: str) -> dict:
        """Lowest and highest value over the rated methods, which methods give them, and
        the spread (highest minus lowest); None where fewer than one method rated."""
        rated = [(v, name) for v, (name, _, _) in zip(self.values(key), self.methods)
                 if v is not None]
        if not rated:
            return {"low": None, "high": None, "spread": None, "low_method": None,
                    "high_method": None}
        low, high = min(rated), max(rated)
        return {"low": low[0], "high": high[0], "spread": high[0] - low[0],
                "low_method": low[1], "high_method": high[1]}

    def to_dict(self) -> dict:
        return {"study": "spread", "case": self.case_name, "family": self.family,
                "input": self.path, "chosen": self.chosen,
                "methods": [{"name": n, "title": t, "reference": r, "chosen": n == self.chosen,
                             **self.points[i].to_dict(self.keys)}
                            for i, (n, t, r) in enumerate(self.methods)],
                "ranges": {k: self.range(k) for k in self.keys}}


def method_spread(case, family: str, *, executor=None, increments=None, progress=None,
                  cancel=None) -> Spread:
    """Rate ``case`` once with each applicable method of ``family`` (its own included)."""
    path = family_path(family, case.type)
    methods = applicable_methods(case, family)
    if len(methods) < 2:
        only = f": only {methods[0][0]} applies" if methods else ""
        raise InputError(f"method family {family!r}: fewer than two methods apply to this "
                         f"{case.type}{only}, so there is no spread to show", field="family")
    jobs = [Job.build({"method": name},
                      lambda name=name: catalogue.with_value(case, path, name))
            for name, _, _ in methods]
    points = rate_points(jobs, executor=executor, increments=increments, progress=progress,
                         cancel=cancel)
    keys = tuple(k for k in KEYS if case.type in catalogue.SUMMARY[k].types)
    return Spread(case.name, family, path, catalogue.get_value(case, path), tuple(methods),
                  tuple(points), keys)
