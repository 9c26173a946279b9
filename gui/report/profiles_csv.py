"""Profiles along the heated length as CSV, each column headed by its label and unit."""
from __future__ import annotations

import csv
import math
from pathlib import Path

from rating.catalogue import PROFILES
from rating.cli import CAUTION
from gui.units import to_display, unit_label


def header(key: str, units: str) -> str:
    """``Heat flux [kW/m²]``: the catalogue's label and the unit of the system."""
    f = PROFILES.get(key)
    if f is None:
        return key
    unit = unit_label(f.quantity, units)
    if unit in ("", "–"):
        unit = "-" if f.quantity in ("fraction", "dimensionless") else ""
    return f"{f.label} [{unit}]" if unit else f.label


def _cell(value, quantity: str, units: str):
    if value is None or (isinstance(value, float) and not math.isfinite(value)):
        return ""                       # not computed: an empty cell, never a zero
    if isinstance(value, str):
        return value
    return f"{to_display(value, quantity, units):.6g}"


def first_row() -> list[str]:
    """The table's first row: the caution (a report recognises its own tables by it)."""
    return [f"Caution: {CAUTION}"]   # one cell, as in ebullio-rate --csv


def write_profiles_csv(result, path, units: str = "SI") -> Path:
    """Write the profiles of one result at ``path`` in the unit system ``units``."""
    path = Path(path)
    keys = [k for k in result.profiles if result.profiles[k] is not None]
    quantities = [PROFILES[k].quantity if k in PROFILES else "text" for k in keys]
    with open(path, "w", newline="", encoding="utf-8") as fh:
        w = csv.writer(fh)
        w.writerow(first_row())
        w.writerow([header(k, units) for k in keys])
        for row in zip(*(result.profiles[k] for k in keys)):
            w.writerow([_cell(v, q, units) for v, q in zip(row, quantities)])
    return path
