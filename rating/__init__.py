"""Ebullio's rating engine: evaporators and reboilers rated by marching along the
heated length with local boiling coefficients.

    >>> import rating
    >>> project = rating.load_project("samples/chiller-evaporator.ebullio")  # doctest: +SKIP
    >>> result = rating.rate(project.cases[0])                               # doctest: +SKIP
    >>> result.status, result.summary["duty_W"]                              # doctest: +SKIP

Results are engineering estimates to be checked by a qualified engineer under
local codes and licensed practice.
"""
from __future__ import annotations

__version__ = "0.1.0"

from .case import (BoilingStream, Case, HeatingMedium, KettleShell, Limits, Methods,  # noqa: F401
                   Project, Shell, ThermosiphonLoop, Tubes)
from .errors import InputError, ProjectFileError, PropertyError, RatingError  # noqa: F401
from .results import Result  # noqa: F401
from .vendor import VendorFigures, VendorTolerances  # noqa: F401


def load_project(path):
    """Read and validate a project file; refuses a corrupt or foreign file with one line."""
    from .project import load_project as _load
    return _load(path)


def save_project(project, path):
    """Write a project file atomically (temporary file, fsync, rename)."""
    from .project import save_project as _save
    return _save(project, path)


def rate(case, *, increments=None, progress=None, cancel=None) -> Result:
    """Rate one case and return a result that carries its status.

    ``progress(fraction)`` is called as the rating advances, with fractions that never
    go backwards and end at 1.0 when the rating ends; ``cancel()`` is polled between
    increments and, when it returns True, the rating stops with the status
    "cancelled". Every result carries its provenance (``Result.provenance``: Ebullio
    and CoolProp versions, the methods, the case's SHA-256, the UTC time rated).
    Input errors raise ``InputError`` before any rating starts (found when the case is
    built, or by ``rating.validation.validate``, which this calls: the rules that need
    fluid properties), and so does an ``increments`` outside
    ``rating.validation.INCREMENTS``; nothing else raises.
    """
    import dataclasses

    from .validation import check_increments, validate

    if increments is not None:
        check_increments(increments)
    validate(case)
    from .exchangers import MonotonicProgress, provenance, rate_case
    from .derived import rate_with_heat_loss, with_inputs_shown
    report = MonotonicProgress(progress)
    result = rate_with_heat_loss(case, rate_case, increments=increments, progress=report,
                                 cancel=cancel)
    result = _with_plausibility(case, with_inputs_shown(case, result))
    if result.status != "cancelled":
        report(1.0)
    return dataclasses.replace(result, provenance=provenance(case, result))


def _with_plausibility(case, result: Result) -> Result:
    """Add a warning for every input outside its usual range (a unit typed wrong)."""
    import dataclasses

    from .catalogue import usual_range_warnings
    from .rules import note

    found = tuple(note("input-outside-usual-range", p.message) for p in usual_range_warnings(case))
    if not found:
        return result
    status = "warnings" if result.status == "ok" else result.status
    return dataclasses.replace(result, status=status, warnings=found + result.warnings)
