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


class MonotonicProgress:
    """The caller's progress callback, fed only values that never go backwards (a
    rating may march several times: shooting, circulation trials, heat-loss passes)."""

    def __init__(self, callback):
        self.callback, self.last = callback, 0.0

    def __call__(self, fraction):
        fraction = min(max(float(fraction), self.last), 1.0)
        if self.callback is not None and (fraction > self.last or fraction == 1.0 != self.last):
            self.callback(fraction)
        self.last = fraction


def provenance(case, result) -> dict:
    """Where a result comes from: program and property-library versions, the methods,
    a hash of the case's data (the project file's case object) and when it was rated."""
    import datetime
    import hashlib
    import json

    import CoolProp

    from .. import __version__
    from ..project import to_dict

    data = json.dumps(to_dict(case), sort_keys=True, separators=(",", ":"), default=str)
    return {
        "ebullio_version": __version__,
        "coolprop_version": CoolProp.__version__,
        "methods": [m.name for m in result.methods],
        "case_sha256": hashlib.sha256(data.encode("utf-8")).hexdigest(),
        "rated_at": datetime.datetime.now(datetime.timezone.utc).isoformat(timespec="seconds"),
    }


def rate_case(case, *, increments=None, progress=None, cancel=None):
    """Rate a case of the type it names: a result always, never an exception."""
    if case.type not in TYPES:
        return failed(case, f"exchanger type {case.type!r} is not rated by this version")
    try:
        # inside the guard: a fault in an exchanger module's own imports is a fault of
        # Ebullio, reported as such, not as a type this version does not rate
        rater = getattr(importlib.import_module(f".{case.type}", __package__),
                        f"rate_{case.type}")
        return rater(case, increments=increments, progress=progress, cancel=cancel)
    except PropertyError as exc:
        return failed(case, str(exc))
    except Exception as exc:  # noqa: BLE001 - a result, never a traceback, whatever went wrong
        methods = ", ".join(f"{f.name} = {getattr(case.methods, f.name)}"
                            for f in dataclasses.fields(case.methods))
        return failed(case, f"case {case.name!r} ({case.type}) could not be rated: "
                      f"{type(exc).__name__}: {exc} (methods: {methods}); please report it "
                      "with the project file")
