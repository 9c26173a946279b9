"""Sweeps: vary one or two inputs of a case by field path and rate every point.

One input gives a line per result; two give every combination (a family of lines,
or a map). Values are SI, like every input of the catalogue.
"""
from __future__ import annotations

import itertools
import math
from dataclasses import dataclass

import numpy as np

from .. import catalogue
from ..errors import InputError
from .execution import Job, Point, rate_points


#: The most points one sweep or envelope rates. A 100 x 100 map is finer than any plot or
#: table of it is read, and it is already long: at 0.02 to 0.1 s a rating (the samples) it
#: takes minutes of CPU and keeps 10,000 summaries; two 1,000-value variations would be
#: a million ratings (hours) held in memory, a mistyped count rather than a study.
MAX_POINTS = 10_000


@dataclass(frozen=True)
class Variation:
    """One varied input: a catalogue field path and its values (SI)."""

    path: str
    values: tuple

    @classmethod
    def range(cls, path: str, start: float, stop: float, count: int) -> Variation:
        """``count`` evenly spaced values from ``start`` to ``stop``, both included."""
        if not 2 <= count <= 1000:
            raise InputError(f"{path}: the number of values ({count}) must be between 2 and 1000",
                             field=path)
        return cls(path, tuple(float(v) for v in np.linspace(start, stop, count)))

    @property
    def field(self):
        return catalogue.input_field(self.path)


def parse_variation(text: str) -> Variation:
    """``PATH=START:STOP:COUNT`` or ``PATH=V1,V2,...`` (SI values) as a ``Variation``."""
    path, sep, spec = text.partition("=")
    path, spec = path.strip(), spec.strip()
    if not sep or not path or not spec:
        raise InputError(f"{text!r}: write PATH=START:STOP:COUNT or PATH=V1,V2,... "
                         "(for example tubes.length=2:5:13)")
    try:
        if ":" in spec:
            start, stop, count = spec.split(":")
            return Variation.range(path, float(start), float(stop), int(count))
        values = tuple(float(v) for v in spec.split(","))
    except ValueError:
        raise InputError(f"{text!r}: the values must be numbers (SI units): "
                         "START:STOP:COUNT with a whole COUNT, or V1,V2,...", field=path) from None
    return Variation(path, values)


def study_paths(case) -> list[str]:
    """The numeric inputs a study may set on this case: of its type, and with a meaning
    for it (a steam-heated case has no heating-medium inlet temperature)."""
    draft = catalogue.case_to_draft(case)
    return [p for p in catalogue.numeric_paths(case.type) if catalogue.applies(p, draft)]


def check_path(case, path: str) -> None:
    """Refuse a path a study cannot set on this case, naming the choices."""
    allowed = study_paths(case)
    if path not in allowed:
        raise InputError(f"{path}: not a numeric input of this {case.type}; choose one of "
                         + ", ".join(allowed), field=path)


def check_variations(case, variations) -> None:
    """Refuse a path that is not a numeric input of this case, or an empty variation."""
    if not 1 <= len(variations) <= 2:
        raise InputError(f"a sweep varies one or two inputs, not {len(variations)}")
    for v in variations:
        check_path(case, v.path)
        if not v.values or not all(math.isfinite(x) for x in v.values):
            raise InputError(f"{v.path}: give at least one finite value", field=v.path)
    if len({v.path for v in variations}) != len(variations):
        raise InputError(f"{variations[0].path}: the same input is varied twice")
    total = math.prod(len(v.values) for v in variations)
    if total > MAX_POINTS:
        raise InputError(f"{' x '.join(str(len(v.values)) for v in variations)} = {total:,} "
                         f"points: a study rates at most {MAX_POINTS:,}; give fewer values",
                         field=variations[-1].path)


def _typed(path: str, value: float):
    """An integer field gets a whole number (a sweep of tube counts)."""
    return int(round(value)) if catalogue.input_field(path).kind == "integer" else value


def case_at(case, inputs: dict):
    """The case with every input of ``inputs`` (path -> SI value) set on one draft and
    validated once (two inputs that only make sense together, such as both tube
    diameters, are judged together)."""
    draft = catalogue.case_to_draft(case)
    for path, value in inputs.items():
        catalogue.input_field(path)
        draft = catalogue.set_value(draft, path, _typed(path, value))
    return catalogue.draft_to_case(draft)


def jobs_for(case, variations) -> list[Job]:
    """One job per combination, the last input varying fastest."""
    out = []
    for combo in itertools.product(*(v.values for v in variations)):
        inputs = {v.path: _typed(v.path, x) for v, x in zip(variations, combo)}
        out.append(Job.build(inputs, lambda inputs=inputs: case_at(case, inputs)))
    return out


@dataclass(frozen=True)
class Sweep:
    """The points of a sweep in the order of ``itertools.product`` over the variations."""

    case_name: str
    case_type: str
    variations: tuple[Variation, ...]
    points: tuple[Point, ...]

    @property
    def shape(self) -> tuple[int, ...]:
        return tuple(len(v.values) for v in self.variations)

    def values(self, key: str) -> list:
        """A summary result at every point (None where not computed), in point order."""
        return [p.value(key) for p in self.points]

    def grid(self, key: str) -> np.ndarray:
        """The result as an array of ``shape`` (NaN where not computed), for lines and maps."""
        flat = [math.nan if v is None else float(v) for v in self.values(key)]
        return np.array(flat, dtype=float).reshape(self.shape)

    @property
    def failed(self) -> list[Point]:
        return [p for p in self.points if not p.rated]

    def to_dict(self, keys=None) -> dict:
        return {"study": "sweep", "case": self.case_name, "type": self.case_type,
                "vary": [{"path": v.path, "unit": v.field.unit, "values": list(v.values)}
                         for v in self.variations],
                "points": [p.to_dict(keys) for p in self.points]}


def sweep(case, variations, *, executor=None, increments=None, progress=None,
          cancel=None) -> Sweep:
    """Rate ``case`` at every combination of the variations' values.

    Each point's case is built through the catalogue (``with_value``), so a value
    outside a field's allowed range is refused at that point with the field's own
    message, and the sweep goes on.
    """
    variations = tuple(variations)
    check_variations(case, variations)
    points = rate_points(jobs_for(case, variations), executor=executor, increments=increments,
                         progress=progress, cancel=cancel, profiles=False)
    return Sweep(case.name, case.type, variations, tuple(points))
