"""Write a rating report (PDF or HTML) of one case or of every case of a project."""
from __future__ import annotations

import base64
import datetime as _dt
import re
from pathlib import Path

from gui.units import SYSTEMS

from . import content
from .profiles_csv import write_profiles_csv

SUFFIXES = (".pdf", ".html", ".htm")


def _safe(name: str) -> str:
    return "".join(c if c.isalnum() or c in "-_." else "_" for c in name).strip("_") or "case"


def write_report(project, cases, path, units="SI", source_path=None, *, results=None,
                 profiles_csv=True, when=None, spread=None, increments=None,
                 executor=None) -> list[Path]:
    """Write the report of ``cases`` (rated now unless ``results`` are given) at ``path``.

    ``path`` ends in .pdf or .html; ``units`` is one of ``gui.units.SYSTEMS``. With
    ``profiles_csv`` each case's profiles are written beside it as
    ``<stem>.<n>-<case>.csv`` in the same units. With ``spread`` (a method family of
    ``rating.studies.FAMILIES``) each case gets a section with the spread between that
    family's methods, rated on ``executor`` (default: one after the other, here) with
    ``increments``. Returns the files written.
    Raises ``ValueError`` for a bad suffix or unit system, ``OSError`` when a file
    cannot be written.
    """
    path = Path(path)
    suffix = path.suffix.lower()
    if suffix not in SUFFIXES:
        raise ValueError(f"{path.name}: a report ends in .pdf or .html")
    if units not in SYSTEMS:
        raise ValueError(f"units = {units!r}: must be one of {', '.join(SYSTEMS)}")
    if spread is not None:
        from rating.studies import FAMILIES
        if spread not in FAMILIES:
            raise ValueError(f"spread = {spread!r}: must be one of {', '.join(FAMILIES)}")
    if not path.parent.is_dir():
        raise OSError(f"{path}: the folder {path.parent} does not exist")
    cases = list(cases)
    if results is None:
        import rating
        results = [rating.rate(c) for c in cases]
    when = when or _dt.datetime.now(_dt.timezone.utc)
    spreads = None if spread is None else [_spread(c, spread, increments, executor)
                                           for c in cases]
    report = content.build(project, cases, list(results), units, source_path, when, spreads)
    if suffix == ".pdf":
        from .pdf import write_pdf
        write_pdf(report, path, when.strftime("%Y-%m-%d"))
    else:
        path.write_text(html_file(report), encoding="utf-8")
    written = [path]
    if profiles_csv:
        for i, result in enumerate(results, 1):
            if result.profiles:
                csv_path = path.with_name(f"{path.stem}.{i}-{_safe(result.name)}.csv")
                written.append(write_profiles_csv(result, csv_path, units))
    return written


def _spread(case, family, increments, executor):
    """The case's spread over ``family``, or why there is none (a family the type does not
    choose, fewer than two applicable methods)."""
    from rating.errors import InputError
    from rating.studies import InlineExecutor, method_spread

    try:
        return method_spread(case, family, executor=executor or InlineExecutor(),
                             increments=increments)
    except InputError as exc:
        return str(exc)


def html_file(report) -> str:
    """The report's HTML with its images embedded: one file to send."""
    def embed(match):
        data = report.images[match.group(1)]
        return f'src="data:image/png;base64,{base64.b64encode(data).decode("ascii")}"'
    return re.sub(r'src="(fig-[^"]+\.png)"', embed, report.html)
