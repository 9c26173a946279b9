"""One module per exchanger type; ``rate_case`` dispatches on the case type."""
from __future__ import annotations

from ..errors import PropertyError
from ..results import failed


def rate_case(case, *, increments=None, progress=None, cancel=None):
    from .evaporator import rate_evaporator
    raters = {"evaporator": rate_evaporator}
    rater = raters.get(case.type)
    if rater is None:
        return failed(case, f"exchanger type {case.type!r} is not rated by this version")
    try:
        return rater(case, increments=increments, progress=progress, cancel=cancel)
    except PropertyError as exc:
        return failed(case, str(exc))
