"""A study as a table of rows in SI: the CSV that the command and the desktop write."""
from __future__ import annotations

import csv

from .envelope import Envelope
from .fit import Fit
from .spread import Spread


def rows(study, keys=()) -> list[list]:
    """A header row, then one row per point (per parameter for a fit); None stays None."""
    if isinstance(study, Fit):
        return [["path", "value", "uncertainty", "identifiable"]] + [
            [p, v, study.uncertainty[p], study.identifiable[p]] for p, v in study.values.items()]
    points = study.points
    if isinstance(study, Spread):
        names, keys = ["method"], list(study.keys)
    else:
        names = list(points[0].inputs) if points else []
        keys = list(keys)
    head = names + keys
    extra = []
    if isinstance(study, Envelope):
        extra = list(study.limits)
        head += [f"within {k}" for k in extra]
    out = [head + ["status", "reason"]]
    for n, p in enumerate(points):
        row = [p.inputs[name] for name in names] + [p.value(k) for k in keys]
        if extra:
            idx = divmod(n, len(study.y.values))
            row += [study.within[k][idx] for k in extra]
        out.append(row + [p.status, p.message])
    return out


def write_csv(study, path, keys=(), caution: str = "") -> None:
    """Write ``rows`` as CSV (UTF-8); the caution, when given, is the first line."""
    with open(path, "w", newline="", encoding="utf-8") as fh:
        w = csv.writer(fh)
        if caution:
            w.writerow([f"# {caution}"])
        w.writerows([["" if v is None else v for v in row] for row in rows(study, keys)])
