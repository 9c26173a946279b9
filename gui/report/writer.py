"""Write a rating report (PDF or HTML) of one case or of every case of a project."""
from __future__ import annotations

import base64
import csv
import datetime as _dt
import errno
import re
from pathlib import Path

from gui.units import SYSTEMS

from . import content
from .profiles_csv import write_profiles_csv

SUFFIXES = (".pdf", ".html", ".htm")


def _safe(name: str) -> str:
    return "".join(c if c.isalnum() or c in "-_." else "_" for c in name).strip("_") or "case"


def profile_csv_paths(path, results) -> list[Path]:
    """The profile tables ``write_report`` writes beside the report at ``path``:
    ``<stem>.<n>-<case>.csv`` for each result with profiles."""
    path = Path(path)
    return [path.with_name(f"{path.stem}.{i}-{_safe(r.name)}.csv")
            for i, r in enumerate(results, 1) if r.profiles]


def _ours(path: Path) -> bool:
    """Whether ``path`` is a profile table a report wrote (its first row is the caution
    that ``write_profiles_csv`` puts there): rewriting a report rewrites its tables."""
    from .profiles_csv import first_row

    try:
        with open(path, newline="", encoding="utf-8") as fh:
            return next(csv.reader(fh), None) == first_row()
    except (OSError, UnicodeDecodeError, csv.Error):
        return False


def foreign_files(paths) -> list[Path]:
    """Those of ``paths`` that exist and are not a profile table a report wrote: files a
    report must not replace without the user's word."""
    return [p for p in map(Path, paths) if p.exists() and not _ours(p)]


def write_report(project, cases, path, units="SI", source_path=None, *, results=None,
                 profiles_csv=True, when=None, spread=None, increments=None,
                 executor=None, replace=()) -> list[Path]:
    """Write the report of ``cases`` (rated now unless ``results`` are given) at ``path``.

    ``path`` ends in .pdf or .html; ``units`` is one of ``gui.units.SYSTEMS``. With
    ``profiles_csv`` each case's profiles are written beside it as
    ``<stem>.<n>-<case>.csv`` in the same units. With ``spread`` (a method family of
    ``rating.studies.FAMILIES``) each case gets a section with the spread between that
    family's methods, rated on ``executor`` (default: one after the other, here) with
    ``increments``. Returns the files written.
    A profile table replaces a file of the same name only when that file is a profile
    table a report wrote, or is in ``replace`` (the user agreed); otherwise nothing is
    written and ``FileExistsError`` names the file (a user's file is never lost silently).
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
    results = list(results)
    if profiles_csv:
        agreed = {Path(p).resolve() for p in replace}
        kept = [p for p in foreign_files(profile_csv_paths(path, results))
                if p.resolve() not in agreed]
        if kept:
            raise FileExistsError(
                errno.EEXIST, f"{kept[0].name} (a profile table beside the report) would "
                "replace a file Ebullio did not write: move it or name the report differently",
                str(kept[0]))
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
        tables = [r for r in results if r.profiles]
        for result, csv_path in zip(tables, profile_csv_paths(path, results)):
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
