"""The operating envelope: a case's limits mapped against two operating variables.

Every grid point is rated and classified against each limit that applies to the
exchanger type:

* ``duty``: the unit gives the required duty (margin: duty / required - 1);
* ``critical_flux``: no dryout, and the largest local flux stays within the limit's
  fraction of the critical flux (margin: that fraction minus the largest ratio; for
  a kettle the bundle-flux ratio limit);
* ``circulation`` (thermosiphon): a wet, stable balance of the loop exists;
* ``stability`` (thermosiphon): no falling branch of the loop's pressure balance near
  the operating point (Ledinegg) and a single stable balance;
* ``entrainment`` (kettle): the vapour velocity at the liquid surface is within its
  limit and the freeboard suffices (margin: 1 - velocity / limit);
* ``feed`` (kettle): the feed exceeds what the bundle boils off at the full level, so
  liquid overflows the weir; below it the level falls and tubes uncover, a state the
  rating refuses to give a duty for (its "feed-boiled-dry" failure).

A limit that cannot be judged at a point (the rating failed for another reason)
is None there. The engine returns the grid, the margins and the classification;
drawing them is the desktop's and the report's job.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from .execution import Point
from .sweep import Variation, check_variations, jobs_for, rate_points

LIMITS = {
    "duty": "Meets the required duty",
    "critical_flux": "Clear of dryout and of the critical-flux margin",
    "circulation": "The thermosiphon circulates",
    "stability": "The thermosiphon circulation is stable",
    "entrainment": "No liquid entrainment from the kettle",
    "feed": "The kettle's feed keeps the pool at the weir",
}
#: The warning codes (rating.rules) the limits below read: a code renamed there must be
#: renamed here, or a limit would quietly read "within" (tests/test_studies.py checks).
CODES_READ = frozenset({
    "duty-not-reached", "dryout", "chf-margin", "bundle-flux-limit", "will-not-circulate",
    "negative-slope", "multiple-operating-points", "entrainment", "freeboard", "feed-boiled-dry",
})

_TYPE_LIMITS = {
    "evaporator": ("duty", "critical_flux"),
    "thermosiphon": ("duty", "critical_flux", "circulation", "stability"),
    "kettle": ("duty", "critical_flux", "entrainment", "feed"),
}


def _duty(point: Point, case, required):
    if required is None or point.result is None:
        return None, None
    duty = point.value("performance_duty_W") or point.value("duty_W")
    if duty is None:
        return None, None
    margin = duty / required - 1.0
    return margin >= 0.0 and "duty-not-reached" not in point.warning_codes(), margin


def _critical_flux(point: Point, case, required):
    ratio = point.value("max_chf_ratio")
    if ratio is None:
        return None, None
    limit = case.limits.kettle_bundle_flux_ratio if case.type == "kettle" \
        else case.limits.chf_ratio
    codes = point.warning_codes()
    dry = point.value("dryout_z_m") is not None or "dryout" in codes
    limited = codes & {"chf-margin", "bundle-flux-limit"}
    margin = limit - ratio
    return not (dry or limited or margin < 0.0), margin


def _circulation(point: Point, case, required):
    codes = point.warning_codes()
    if "will-not-circulate" in codes:
        return False, None
    return (True, None) if point.rated else (None, None)


def _stability(point: Point, case, required):
    if not point.rated:
        return None, None
    unsteady = any(w.code == "negative-slope" and w.severity != "info"
                   or w.code == "multiple-operating-points" for w in point.result.warnings)
    return not unsteady, None


def _entrainment(point: Point, case, required):
    u = point.value("surface_vapour_velocity_m_s")
    u_max = point.value("surface_vapour_velocity_limit_m_s")
    if u is None or u_max is None:
        return None, None
    margin = 1.0 - u / u_max if math.isfinite(u) else -1.0
    return not ({"entrainment", "freeboard"} & point.warning_codes()), margin


def _feed(point: Point, case, required):
    if "feed-boiled-dry" in point.warning_codes():
        return False, None
    return (True, None) if point.rated else (None, None)


_JUDGES = {"duty": _duty, "critical_flux": _critical_flux, "circulation": _circulation,
           "stability": _stability, "entrainment": _entrainment, "feed": _feed}


@dataclass(frozen=True)
class Envelope:
    """The rated grid: ``points[i * len(y) + j]`` is at ``x.values[i]``, ``y.values[j]``.

    ``within[limit]`` and ``margin[limit]`` are arrays of shape (len(x), len(y)):
    True/False/None, and the signed margin (positive inside; NaN where it has none).
    """

    case_name: str
    case_type: str
    x: Variation
    y: Variation
    operating_point: tuple        # the case's own (x, y) values
    required_duty: float | None
    limits: tuple[str, ...]
    points: tuple[Point, ...]
    within: dict
    margin: dict

    @property
    def inside(self) -> np.ndarray:
        """True where every judged limit holds, False where one fails, None if none judged."""
        out = np.full((len(self.x.values), len(self.y.values)), None, dtype=object)
        for idx in np.ndindex(out.shape):
            verdicts = [self.within[k][idx] for k in self.limits if self.within[k][idx] is not None]
            out[idx] = all(verdicts) if verdicts else None
        return out

    def boundary(self, limit: str) -> list:
        """For each x, the y where the limit first changes between adjacent y values.

        Found on the margin by linear interpolation where the limit has one, else
        halfway between the two points; None where it does not change along y.
        """
        rows = []
        ys = np.asarray(self.y.values, dtype=float)
        for i, xv in enumerate(self.x.values):
            flags, margins = self.within[limit][i], self.margin[limit][i]
            found = None
            for j in range(len(ys) - 1):
                a, b = flags[j], flags[j + 1]
                if a is None or b is None or a == b:
                    continue
                ma, mb = margins[j], margins[j + 1]
                if math.isfinite(ma) and math.isfinite(mb) and ma != mb and ma * mb <= 0.0:
                    found = ys[j] + (ys[j + 1] - ys[j]) * ma / (ma - mb)
                else:
                    found = 0.5 * (ys[j] + ys[j + 1])
                break
            rows.append((xv, found))
        return rows

    def to_dict(self, keys=None) -> dict:
        def plain(a):
            return [[None if (isinstance(v, float) and not math.isfinite(v)) else
                     (bool(v) if isinstance(v, (bool, np.bool_)) else
                      (float(v) if v is not None else None)) for v in row] for row in a]

        return {"study": "envelope", "case": self.case_name, "type": self.case_type,
                "x": {"path": self.x.path, "unit": self.x.field.unit,
                      "values": list(self.x.values)},
                "y": {"path": self.y.path, "unit": self.y.field.unit,
                      "values": list(self.y.values)},
                "operating_point": list(self.operating_point),
                "required_duty_W": self.required_duty,
                "limits": {k: {"title": LIMITS[k], "within": plain(self.within[k]),
                               "margin": plain(self.margin[k]),
                               "boundary": [{"x": x, "y": y} for x, y in self.boundary(k)]}
                           for k in self.limits},
                "points": [p.to_dict(keys) for p in self.points]}


def envelope(case, x: Variation, y: Variation, *, required_duty=None, executor=None,
             increments=None, progress=None, cancel=None) -> Envelope:
    """Rate the grid of ``x`` by ``y`` and classify each point against the type's limits.

    ``required_duty`` [W] defaults to the case's; without either the duty limit is
    left out.
    """
    from .. import catalogue

    check_variations(case, (x, y))
    required = required_duty if required_duty is not None else case.required_duty
    if required is not None and not (math.isfinite(required) and required > 0.0):
        raise InputError(f"required duty = {required} W: must be > 0", field="required_duty")
    limits = tuple(k for k in _TYPE_LIMITS[case.type] if k != "duty" or required is not None)
    points = rate_points(jobs_for(case, (x, y)), executor=executor, increments=increments,
                         progress=progress, cancel=cancel, profiles=False)
    shape = (len(x.values), len(y.values))
    within = {k: np.full(shape, None, dtype=object) for k in limits}
    margin = {k: np.full(shape, math.nan) for k in limits}
    for n, p in enumerate(points):
        idx = np.unravel_index(n, shape)
        for k in limits:
            ok, m = _JUDGES[k](p, case, required)
            within[k][idx] = ok
            if m is not None:
                margin[k][idx] = m
    here = (catalogue.get_value(case, x.path), catalogue.get_value(case, y.path))
    return Envelope(case.name, case.type, x, y, here, required, limits, tuple(points),
                    within, margin)
