"""One module per exchanger type; ``rate_case`` dispatches on the case type.

Each module ``rating.exchangers.<type>`` provides ``rate_<type>(case, *, increments,
progress, cancel) -> Result``.
"""
from __future__ import annotations

import importlib

from ..errors import PropertyError
from ..results import failed

TYPES = ("evaporator", "thermosiphon", "kettle")


def rate_case(case, *, increments=None, progress=None, cancel=None):
    if case.type not in TYPES:
        return failed(case, f"exchanger type {case.type!r} is not rated by this version")
    try:
        module = importlib.import_module(f".{case.type}", __package__)
    except ModuleNotFoundError:
        return failed(case, f"exchanger type {case.type!r} is not rated by this version")
    rater = getattr(module, f"rate_{case.type}")
    try:
        return rater(case, increments=increments, progress=progress, cancel=cancel)
    except PropertyError as exc:
        return failed(case, str(exc))
