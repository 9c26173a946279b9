"""One module per exchanger type; ``rate_case`` dispatches on the case type.

Each module ``rating.exchangers.<type>`` provides ``rate_<type>(case, *, increments,
progress, cancel) -> Result``.
"""
from __future__ import annotations

import dataclasses
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
    except Exception as exc:  # noqa: BLE001 - a result, never a traceback, whatever went wrong
        methods = ", ".join(f"{f.name} = {getattr(case.methods, f.name)}"
                            for f in dataclasses.fields(case.methods))
        return failed(case, f"case {case.name!r} ({case.type}) could not be rated: "
                      f"{type(exc).__name__}: {exc} (methods: {methods}); please report it "
                      "with the project file")
