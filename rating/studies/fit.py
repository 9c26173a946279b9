"""Fit to plant data: the input values (a fouling resistance, a factor) that reproduce
what the running unit is measured to do.

Bounded least squares (``scipy.optimize.least_squares``, trust-region reflective) on
the residuals (model - measured) / tolerance. Each tolerance is taken as the
measurement's standard uncertainty (one standard deviation), so the fitted values'
covariance is (J^T J)^-1 with J the Jacobian of those normalised residuals, and
their uncertainties are one standard deviation. The Jacobian is taken by forward
differences, its columns rated side by side through the executor. A model need not
be monotonic (a dryout moving along the tube can make the duty rise with fouling),
so the fit starts from the best of a coarse scan of the range (five values a
parameter, side by side), not only from the case's own value.

A parameter is reported unidentifiable when the measurements fix it (alone or in a
combination with others) to no better than half its allowed range; the fit is
reported poor when a measurement is missed by more than twice its tolerance or the
sum of squares is improbable (chi-square, 5 %).

The linearised uncertainty sees only the slope at the answer. Where the model is flat
there and steep further away (a dryout that holds the duty while the fouling changes,
then moves off the tube), a one-parameter fit also reports the span of its ratings
whose misfit is within two standard deviations of the best (chi-square within 4 of the
minimum), widened to the next rating on each side that is outside it: the values the
measurements leave open, however flat the model is at the answer.
"""
from __future__ import annotations

import itertools
import math
from dataclasses import dataclass, field

import numpy as np
from scipy import optimize, stats

from .. import catalogue
from ..errors import InputError
from .execution import CANCELLED, Job, executor_scope, rate_points
from .sweep import case_at, check_path

#: Results that can be measured on a running unit, in the catalogue's keys.
MEASURABLE = ("duty_W", "steam_flow_kg_s", "heating_outlet_temperature_K",
              "exit_temperature_K", "exit_quality", "circulation_kg_s")

SCAN = 5             # starting values tried per parameter (for up to two parameters)
STEP = 1e-3          # finite-difference step, as a fraction of each parameter's range
UNDETERMINED = 0.5   # a direction fixed to worse than this fraction of the range
MISSED = 2.0         # a measurement missed by more than this many tolerances


@dataclass(frozen=True)
class Measurement:
    """A measured result (catalogue summary key, SI) and its standard uncertainty."""

    key: str
    value: float
    tolerance: float


@dataclass(frozen=True)
class Parameter:
    """An input fitted between bounds (SI); ``start`` defaults to the case's value."""

    path: str
    lower: float
    upper: float
    start: float | None = None


@dataclass(frozen=True)
class Fit:
    status: str                     # "fitted", "poor", "unidentifiable", "failed", "cancelled"
    message: str
    values: dict                    # path -> fitted value (SI)
    uncertainty: dict               # path -> one standard deviation, None if not determined
    identifiable: dict              # path -> bool
    residuals: tuple = ()           # (key, measured, model, (model - measured) / tolerance)
    chi_square: float | None = None
    warnings: tuple[str, ...] = ()
    ratings: int = 0
    case: object = None             # the case with the fitted values
    result: object = None           # its rating
    correlation: list = field(default_factory=list)
    #: every rating the fit made: (values by path, sum of squared normalised misfits,
    #: None where a measured result was not computed), in the order of the values
    trials: tuple = ()
    #: one-parameter fits: (low, high) of the values the ratings found within two standard
    #: deviations of the best misfit (see the module's notes); None otherwise
    interval: tuple | None = None

    def to_dict(self) -> dict:
        return {"study": "fit", "status": self.status, "message": self.message,
                "parameters": [{"path": p, "value": v, "uncertainty": self.uncertainty[p],
                                "identifiable": self.identifiable[p],
                                "unit": catalogue.input_field(p).unit}
                               for p, v in self.values.items()],
                "measurements": [{"key": k, "measured": m, "model": f, "normalised": r}
                                 for k, m, f, r in self.residuals],
                "chi_square": self.chi_square, "warnings": list(self.warnings),
                "ratings": self.ratings, "correlation": self.correlation,
                "interval": None if self.interval is None else list(self.interval)}


def _check(case, measurements, parameters):
    if not measurements:
        raise InputError("give at least one measured value", field="measured")
    if not parameters:
        raise InputError("give at least one input to fit", field="fit")
    for p in parameters:
        check_path(case, p.path)
        if not (math.isfinite(p.lower) and math.isfinite(p.upper) and p.lower < p.upper):
            raise InputError(f"{p.path}: the bounds {p.lower:g} to {p.upper:g} must be finite "
                             "and rising", field=p.path)
    for m in measurements:
        if m.key not in catalogue.SUMMARY or case.type not in catalogue.SUMMARY[m.key].types:
            raise InputError(f"{m.key}: not a result of a {case.type}; measurable: "
                             + ", ".join(k for k in MEASURABLE
                                         if case.type in catalogue.SUMMARY[k].types),
                             field=m.key)
        if not (math.isfinite(m.value) and math.isfinite(m.tolerance) and m.tolerance > 0.0):
            raise InputError(f"{m.key}: the measured value must be finite and its tolerance "
                             "> 0", field=m.key)


def fit(case, measurements, parameters, *, executor=None, increments=None, cancel=None,
        progress=None) -> Fit:
    """Fit ``parameters`` of ``case`` to ``measurements`` (see the module's notes).

    ``progress(done, None)``: ratings made so far, of a number not known beforehand.
    ``cancel()`` stops the fit with status "cancelled"."""
    measurements, parameters = tuple(measurements), tuple(parameters)
    _check(case, measurements, parameters)
    lo = np.array([p.lower for p in parameters])
    span = np.array([p.upper for p in parameters]) - lo
    target = np.array([m.value for m in measurements])
    tol = np.array([m.tolerance for m in measurements])
    paths = [p.path for p in parameters]
    rated = {}          # scaled parameters (tuple) -> point
    count = [0]

    def values_at(u) -> dict:
        return {p: float(v) for p, v in zip(paths, lo + span * np.clip(u, 0.0, 1.0))}

    def rate_many(us, pool, skip_failed=False):
        """The normalised residuals at each of ``us``; a point whose measured results were
        not computed stops the fit (``_Stop``), or is None with ``skip_failed``. A cancel
        stops it whatever else failed beside it."""
        new = [tuple(u) for u in us if tuple(u) not in rated]
        jobs = [Job.build(values_at(u), lambda u=u: case_at(case, values_at(u))) for u in new]
        for u, point in zip(new, rate_points(jobs, executor=pool, increments=increments,
                                             cancel=cancel)):
            rated[u] = point
        count[0] += len(new)
        if progress is not None:
            progress(count[0], None)       # the number of ratings is not known beforehand
        for u in new:
            if rated[u].status == CANCELLED:
                raise _Stop(rated[u], values_at(u))
        out = []
        for u in us:
            point = rated[tuple(u)]
            model = [point.value(m.key) for m in measurements]
            if any(v is None for v in model):
                if skip_failed:
                    out.append(None)
                    continue
                raise _Stop(point, values_at(u))
            out.append((np.array(model, dtype=float) - target) / tol)
        return out

    start = np.array([((p.start if p.start is not None else catalogue.get_value(case, p.path))
                       - p.lower) / (p.upper - p.lower) for p in parameters], dtype=float)
    start = np.clip(np.nan_to_num(start, nan=0.5), 0.0, 1.0)

    with executor_scope(executor) as pool:
        def residuals(u):
            return rate_many([u], pool)[0]

        def jacobian(u):
            steps = []
            for i in range(len(u)):
                h = STEP if u[i] + STEP <= 1.0 else -STEP
                v = np.array(u, dtype=float)
                v[i] += h
                steps.append((v, h))
            base, *moved = rate_many([np.asarray(u, dtype=float)] + [v for v, _ in steps], pool)
            return np.column_stack([(r - base) / h for r, (_, h) in zip(moved, steps)])

        try:
            start = _best_start(start, rate_many, pool)
            solution = optimize.least_squares(residuals, start, jac=jacobian, bounds=(0.0, 1.0),
                                              x_scale=1.0, xtol=1e-10, ftol=1e-10, gtol=1e-10,
                                              max_nfev=60)
            jac = jacobian(solution.x)
        except _Stop as stop:
            if stop.point.status == CANCELLED:
                return Fit("cancelled", "the fit was stopped before it finished", stop.values,
                           {p: None for p in paths}, {p: False for p in paths},
                           ratings=count[0])
            where = ", ".join(f"{p} = {v:.4g}" for p, v in stop.values.items())
            reason = stop.point.message or "a measured result was not computed"
            return Fit("failed", f"the rating failed at {where}: {reason}",
                       stop.values, {p: None for p in paths}, {p: False for p in paths},
                       ratings=count[0])
    return _report(case, measurements, parameters, solution, jac, rated, count[0], values_at,
                   span)


def _best_start(start, rate_many, pool):
    """The start, or the point of a coarse scan of the range with the smallest misfit."""
    if len(start) > 2:
        return start
    grid = [np.array(u, dtype=float)
            for u in itertools.product(np.linspace(0.0, 1.0, SCAN), repeat=len(start))]
    tries = [start] + grid
    # A scan point that fails (or is refused) is no start; the others still are.
    misfits = [math.inf if r is None else float(r @ r)
               for r in rate_many(tries, pool, skip_failed=True)]
    if not any(math.isfinite(m) for m in misfits):
        return start
    return tries[int(np.argmin(misfits))]


class _Stop(Exception):
    def __init__(self, point, values):
        super().__init__(point.message)
        self.point, self.values = point, values


def _report(case, measurements, parameters, solution, jac, rated, ratings, values_at, span):
    paths = [p.path for p in parameters]
    u = solution.x
    values = values_at(u)
    point = rated[tuple(u)] if tuple(u) in rated else None
    r = solution.fun
    chi2 = float(r @ r)
    warnings = []

    # Directions of parameter space the data fix to worse than half the range.
    eigval, eigvec = np.linalg.eigh(jac.T @ jac)
    loose = [k for k, lam in enumerate(eigval)
             if lam <= 0.0 or 1.0 / math.sqrt(lam) > UNDETERMINED]
    unidentified = {paths[i] for k in loose for i in range(len(paths))
                    if abs(eigvec[i, k]) > 0.3}
    fixed = [k for k in range(len(eigval)) if k not in loose]
    cov = sum((np.outer(eigvec[:, k], eigvec[:, k]) / eigval[k] for k in fixed),
              np.zeros((len(paths), len(paths))))
    uncertainty, identifiable = {}, {}
    for i, p in enumerate(paths):
        identifiable[p] = p not in unidentified
        uncertainty[p] = float(math.sqrt(cov[i, i]) * span[i]) if identifiable[p] else None
    sd = np.sqrt(np.diag(cov))
    correlation = [[float(cov[i, j] / (sd[i] * sd[j])) if sd[i] > 0 and sd[j] > 0 else None
                    for j in range(len(paths))] for i in range(len(paths))]

    trials = _trials(rated, measurements, values_at)
    interval = _interval(trials, paths[0]) if len(paths) == 1 else None
    for k in loose:
        names = [paths[i] for i in range(len(paths)) if abs(eigvec[i, k]) > 0.3]
        if len(names) > 1:
            warnings.append(f"{' and '.join(names)} cannot be told apart by these measurements: "
                            "only a combination of them is fixed; measure another result "
                            "or fit one of them")
        elif interval is not None and interval[1] - interval[0] < \
                parameters[0].upper - parameters[0].lower:
            warnings.append(f"{names[0]} is not identifiable near {values[names[0]]:.4g}: the "
                            "measured results hardly change with it there; the measurements "
                            f"leave it anywhere from {interval[0]:.4g} to {interval[1]:.4g} "
                            f"{catalogue.input_field(names[0]).unit}")
        else:
            warnings.append(f"{names[0]} is not identifiable: over its whole range "
                            f"{parameters[paths.index(names[0])].lower:g} to "
                            f"{parameters[paths.index(names[0])].upper:g} "
                            f"{catalogue.input_field(names[0]).unit} the measured results "
                            "change by less than about twice their tolerances")
    for i, p in enumerate(parameters):
        if identifiable[p.path] and (u[i] <= 1e-6 or u[i] >= 1.0 - 1e-6):
            bound = "lower" if u[i] <= 1e-6 else "upper"
            warnings.append(f"{p.path} ended at its {bound} bound ({values[p.path]:.4g} "
                            f"{catalogue.input_field(p.path).unit}): the data ask for a value "
                            "beyond the range given; its uncertainty is one-sided")

    residuals = []
    for m, ri in zip(measurements, r):
        model = point.value(m.key) if point is not None else m.value + ri * m.tolerance
        residuals.append((m.key, m.value, model, float(ri)))
    poor = False
    for key, measured, model, ri in residuals:
        if abs(ri) > MISSED:
            poor = True
            warnings.append(f"poor fit: {key} is {model:.5g} against the measured {measured:.5g} "
                            f"({ri:+.1f} tolerances)")
    dof = len(measurements) - len(parameters)
    if dof > 0 and stats.chi2.sf(chi2, dof) < 0.05:
        poor = True
        warnings.append(f"poor fit: the misfit (chi-square {chi2:.3g} on {dof} degrees of "
                        "freedom) is larger than the tolerances explain")

    status = "unidentifiable" if unidentified else ("poor" if poor else "fitted")
    message = ", ".join(
        f"{p} = {v:.4g} {catalogue.input_field(p).unit}"
        + (f" +- {uncertainty[p]:.2g}" if uncertainty[p] is not None else " (not determined)")
        for p, v in values.items())
    fitted_case = case_at(case, values)
    return Fit(status, message, values, uncertainty, identifiable, tuple(residuals), chi2,
               tuple(warnings), ratings, fitted_case, point.result if point else None,
               correlation, trials, interval)


def _interval(trials, path):
    """(low, high) of the values within chi-square 4 of the best rating, each widened to the
    next rating outside; None without ratings that computed every measured result."""
    rated = sorted((values[path], misfit) for values, misfit in trials if misfit is not None)
    if not rated:
        return None
    best = min(m for _, m in rated)
    inside = [i for i, (_, m) in enumerate(rated) if m <= best + 4.0]
    lo, hi = max(inside[0] - 1, 0), min(inside[-1] + 1, len(rated) - 1)
    return rated[lo][0], rated[hi][0]


def _trials(rated, measurements, values_at) -> tuple:
    out = []
    for u in sorted(rated):
        model = [rated[u].value(m.key) for m in measurements]
        misfit = None if any(v is None for v in model) else float(sum(
            ((v - m.value) / m.tolerance) ** 2 for v, m in zip(model, measurements)))
        out.append((values_at(np.array(u)), misfit))
    return tuple(out)
