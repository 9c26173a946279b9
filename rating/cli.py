"""The headless command: ``ebullio-rate FILE [--case NAME] [--json] [--csv DIR] [--increments N]
[--report OUT.pdf|OUT.html [--units SI|metric|US]]``.

Reports are written by a writer passed in to ``main`` (the console script's entry
point, ``gui.report.command``, passes Ebullio's): the engine imports no Qt or plotting.

Exit status (also in ``--help``, the README and DEVELOPERS.md):

    0  rated; no error-severity finding
    1  rated, with an error-severity finding or a case that could not be rated
    2  bad input: the project file, an option or the output folder (one line on stderr)
    3  internal error: a fault in Ebullio (one line on stderr and a hint, no traceback)

Everything a run could refuse (file, options, output folder) is checked before the
first case is rated, so no rating is thrown away for an output problem. The small
functions below (``guarded``, ``refuse``, ``write_out``, ``exit_code``, ``csv_names``,
``prepare_folder``, ``label_unit``, ``format_figure``) are meant for other commands too.

Only the standard library is imported at module level: ``ebullio-rate --help`` does
not load the fluid-property library, whose import is most of a cold start.
"""
from __future__ import annotations

import argparse
import csv
import json
import os
import sys
from pathlib import Path

from .caution import CAUTION  # noqa: F401 - exported here too, for the callers of the CLI

EXIT_RATED = 0
EXIT_FINDINGS = 1
EXIT_BAD_INPUT = 2
EXIT_INTERNAL = 3

EXIT_CODES = f"""\
exit status:
  {EXIT_RATED}  rated; no error-severity finding
  {EXIT_FINDINGS}  rated, with an error-severity finding or a case that could not be rated
  {EXIT_BAD_INPUT}  bad input: the project file, an option or the output folder
     (one line on standard error, nothing rated, nothing written)
  {EXIT_INTERNAL}  internal error: a fault in Ebullio (one line on standard error)"""

COLD_START = ("Cold start: a first call takes about 2 s before the first rating on a quiet "
              "machine (more on a busy one), most of it loading the fluid-property library "
              "(CoolProp); each case then takes 0.01 to 0.1 s.")

#: Set to 1 to see the traceback of an internal error (for a bug report).
DEBUG_VARIABLE = "EBULLIO_DEBUG"

class _Parser(argparse.ArgumentParser):
    """A usage error is one line too, with exit status 2."""

    def error(self, message):
        refuse(f"{message} (see {self.prog} --help)", self.prog)
        raise SystemExit(EXIT_BAD_INPUT)


def _parser():
    p = _Parser(
        prog="ebullio-rate",
        description="Rate the cases of an Ebullio project file (.ebullio).",
        epilog=f"{EXIT_CODES}\n\n{COLD_START}\n\n{CAUTION}",
        formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("file", help="project file")
    p.add_argument("--case", help="rate only the case of this name")
    p.add_argument("--json", action="store_true",
                   help="print the results as JSON (the caution is its \"caution\" key)")
    p.add_argument("--csv", metavar="DIR",
                   help="write the profiles of each case as CSV into DIR (created if needed); "
                        "the first line of each file is the caution, the second the column names")
    p.add_argument("--increments", type=int, metavar="N",
                   help="increments along the heated length (default: the case's or the engine's)")
    p.add_argument("--report", metavar="OUT", help="write a rating report, OUT.pdf or OUT.html")
    p.add_argument("--units", choices=REPORT_UNITS, default="SI",
                   help="unit system of the table, its warnings and the report: SI (kW, kPa, "
                        "degC, mm), metric (kW, bar, degC, kg/h) or US (Btu/h, psia, degF, "
                        "lb/h); pressures absolute (default SI). --json and --csv stay in SI "
                        "base units")
    p.add_argument("--spread", metavar="FAMILY",
                   help="with --report: add a section with each case rated by every "
                        "applicable method of FAMILY (the families of ebullio-study --spread)")
    return p


REPORT_UNITS = ("SI", "metric", "US")
REPORT_SUFFIXES = (".pdf", ".html", ".htm")


# --- output and exit status, shared by the headless commands ---------------------------

def refuse(message: str, prog: str = "ebullio-rate") -> int:
    """Print one line on stderr and give the exit status of bad input."""
    line = str(message).strip().splitlines()[0] if str(message).strip() else "bad input"
    print(f"{prog}: {line}", file=sys.stderr)
    return EXIT_BAD_INPUT


def _quiet_stdout() -> None:
    """After the reader closed the pipe: send what remains to the null device, so that
    the interpreter's final flush does not complain."""
    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
    except (OSError, ValueError, AttributeError):
        pass


def write_out(text: str) -> bool:
    """Write to standard output; False (quietly) when the reader has gone (``| head``)."""
    try:
        sys.stdout.write(text)
        sys.stdout.flush()
    except BrokenPipeError:
        _quiet_stdout()
        return False
    except OSError as exc:  # a full disk behind a redirection, a device that refuses
        from .errors import InputError

        _quiet_stdout()
        raise InputError(f"standard output cannot be written ({exc.strerror or exc})") from None
    return True


def guarded(body, prog: str = "ebullio-rate") -> int:
    """Run ``body()`` (which returns an exit status) so that no exception reaches the user
    as a traceback: bad input gives 2 and one line; anything unexpected gives 3, one line
    and a hint."""
    from .errors import RatingError

    try:
        return body()
    except RatingError as exc:  # input, project file, properties: the user can act on it
        return refuse(str(exc) or type(exc).__name__, prog)
    except BrokenPipeError:
        _quiet_stdout()
        return EXIT_RATED
    except KeyboardInterrupt:
        print(f"{prog}: interrupted", file=sys.stderr)
        return 130
    except Exception as exc:  # noqa: BLE001 - the last line of defence, by design
        if os.environ.get(DEBUG_VARIABLE):
            raise
        detail = str(exc).strip().splitlines()[0][:200] if str(exc).strip() else ""
        print(f"{prog}: internal error ({type(exc).__name__}{': ' + detail if detail else ''}); "
              f"this is a fault in Ebullio: please report it with the project file "
              f"({DEBUG_VARIABLE}=1 shows the details)", file=sys.stderr)
        return EXIT_INTERNAL


def exit_code(results) -> int:
    """0 when every case rated without an error-severity finding, else 1."""
    bad = any(r.status == "failed" or r.has_errors for r in results)
    return EXIT_FINDINGS if bad else EXIT_RATED


def prepare_folder(folder, option: str = "--csv") -> Path:
    """An output folder that exists and can be written to (created if needed), checked
    before any rating; an InputError names the option otherwise."""
    from .errors import InputError

    path = Path(folder)
    if path.exists() and not path.is_dir():
        raise InputError(f"{option} {folder}: is a file, not a folder", field=option)
    try:
        path.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise InputError(f"{option} {folder}: the folder cannot be created "
                         f"({exc.strerror or exc})", field=option) from None
    if not os.access(path, os.W_OK | os.X_OK):
        raise InputError(f"{option} {folder}: the folder cannot be written to", field=option)
    return path


#: Names Windows reserves for devices, in any case and with any extension.
_RESERVED = {"CON", "PRN", "AUX", "NUL", *(f"COM{i}" for i in range(1, 10)),
             *(f"LPT{i}" for i in range(1, 10))}
_MAX_STEM = 100


def csv_names(names) -> list[str]:
    """One distinct, portable file name per case name (``Pump A/B`` -> ``Pump_A_B.csv``).

    Names that sanitise alike, or differ only in letter case, get ``-2``, ``-3``...
    """
    out, taken = [], set()
    for i, name in enumerate(names):
        stem = "".join(c if c.isalnum() or c in "-_." else "_" for c in str(name))
        stem = stem.strip("._")[:_MAX_STEM] or f"case-{i + 1}"
        if stem.split(".")[0].upper() in _RESERVED:
            stem = "_" + stem
        candidate, n = stem, 1
        while candidate.casefold() in taken:
            n += 1
            candidate = f"{stem}-{n}"
        taken.add(candidate.casefold())
        out.append(candidate + ".csv")
    return out


def vendor_table(comparison, display=None) -> str:
    """The vendor comparison of one case, beside the summary table (same units)."""
    from .catalogue import input_field, vendor_label
    from .vendor import describe, deviation_text, tolerance_text

    show = display or BaseUnits()
    lines = [f"  Vendor figures{f' ({comparison.source})' if comparison.source else ''}:"
             f" {describe(comparison)}"]
    for r in comparison.rows:
        quantity = input_field(f"vendor.{r.figure}").quantity
        vendor, unit = show.value(r.vendor, quantity)
        ebullio = show.value(r.ebullio, quantity)[0]
        note = f"  ({r.note})" if r.note else ""
        lines.append(f"    {vendor_label(r.figure):<28} vendor {vendor:>10}"
                     f"  Ebullio {ebullio:>10} {unit:<7}"
                     f" {deviation_text(r) if r.deviation is not None else '':>14}"
                     f" {'(' + tolerance_text(r) + ')' if r.deviation is not None else '':>14}"
                     f"  {r.verdict}{note}")
    return "\n".join(lines)


def write_csv(result, path: Path) -> Path:
    """The profiles of one result as CSV: the caution, then column names, then rows.

    The caution is one quoted cell, so a spreadsheet shows it whole in the first cell;
    other readers skip one line (pandas: ``skiprows=1``). Values not computed are empty.
    """
    profiles = result.to_dict()["profiles"]
    keys = list(profiles)
    with open(path, "w", newline="", encoding="utf-8") as fh:
        w = csv.writer(fh)
        w.writerow([f"Caution: {CAUTION}"])
        w.writerow(keys)
        for row in zip(*(profiles[k] for k in keys)):
            w.writerow(row)
    return path


# --- the readable table ----------------------------------------------------------------

class BaseUnits:
    """How the table shows a value and a warning when no display units are given (the
    engine alone, ``python -m rating.cli``): SI base units (W, Pa, K) and each warning's
    SI message. The console command passes the desktop's display units instead
    (``gui.report.command``): any object with these two methods will do."""

    def value(self, value, quantity: str) -> tuple[str, str]:
        """The number's text and its unit label."""
        from .catalogue import QUANTITIES

        unit = QUANTITIES.get(quantity, "")
        return format_figure(value), "" if unit in ("-", "") else unit

    def warning(self, warning) -> str:
        return warning.message


def label_unit(key: str) -> tuple[str, str]:
    """Label and SI unit of a summary key, from the catalogue (the key itself if unknown)."""
    from .catalogue import SUMMARY

    field = SUMMARY.get(key)
    if field is None:
        return key, ""
    return field.label, "" if field.unit in ("-", "") else field.unit


def format_figure(v) -> str:
    """A value for the table: 4 significant digits, no exponent for everyday sizes."""
    if v is None:
        return "not computed"
    if isinstance(v, str) or isinstance(v, bool):
        return str(v)
    if v != v or v in (float("inf"), float("-inf")):
        return "not computed"
    text = f"{v:.4g}"
    if "e" in text and 1e-3 <= abs(v) < 1e12:
        text = f"{float(text):,.0f}"
    elif "e" not in text and abs(v) >= 1e3:
        text = f"{float(text):,.0f}" if float(text).is_integer() else f"{float(text):,}"
    return text


def table(result, display=None) -> str:
    """A readable summary of one result: every summary figure with the catalogue's label,
    then the warnings, figures and warnings in the same units (``display``, else
    ``BaseUnits``)."""
    from .catalogue import SUMMARY

    show = display or BaseUnits()
    lines = [f"Case: {result.name}  ({result.type})  status: {result.status}"]
    if result.message and result.message != "rated":
        lines.append(f"  {result.message}")
    for key, value in result.summary.items():
        field = SUMMARY.get(key)
        label = field.label if field is not None else key
        text, unit = show.value(value, field.quantity if field is not None else "dimensionless")
        lines.append(f"  {label:<40} {text:>14}  {unit}".rstrip())
    for w in result.warnings:
        where = f" at z = {' '.join(show.value(w.z_m, 'length'))}" if w.z_m is not None else ""
        lines.append(f"  [{w.severity}] {w.code}{where}: {show.warning(w)}")
    return "\n".join(lines)


# --- the command -----------------------------------------------------------------------

def _cases(project, args):
    """The cases to rate: all, or the one named by --case; refused when there are none."""
    from .errors import InputError

    if not project.cases:
        raise InputError(f"{args.file} holds no cases: nothing to rate")
    if args.case is None:
        return list(project.cases)
    cases = [c for c in project.cases if c.name == args.case]
    if not cases:
        names = ", ".join(c.name for c in project.cases)
        raise InputError(f"--case {args.case!r}: no such case in {args.file} (cases: {names})")
    return cases


def _check_report(args, report_writer) -> None:
    """--report: a writer to write it and a path it can be written to, before any rating."""
    from .errors import InputError

    if args.spread is not None:
        from .studies.spread import FAMILIES  # only now: the studies bring scipy in

        if args.report is None:
            raise InputError("--spread: adds a section to the report; give --report too")
        if args.spread not in FAMILIES:
            raise InputError(f"--spread {args.spread}: choose one of {', '.join(FAMILIES)}")
    if args.report is None:
        return
    if report_writer is None:
        raise InputError("--report: reports are written by the ebullio-rate command "
                         "installed with Ebullio's 'gui' extra")
    path = Path(args.report)
    if path.suffix.lower() not in REPORT_SUFFIXES:
        raise InputError(f"--report {args.report}: must end in .pdf or .html")
    if path.is_dir():
        raise InputError(f"--report {args.report}: is a folder, not a file")
    prepare_folder(path.parent if str(path.parent) else ".", "--report")


def _run(args, report_writer=None, display=None) -> int:
    from . import load_project, rate
    from .validation import check_increments
    from .vendor import compare

    if args.increments is not None:
        check_increments(args.increments, "--increments")
    _check_report(args, report_writer)
    project = load_project(args.file)
    cases = _cases(project, args)
    folder = prepare_folder(args.csv) if args.csv else None
    results = [rate(c, increments=args.increments) for c in cases]
    comparisons = [compare(c, r) for c, r in zip(cases, results)]
    code = exit_code(results)
    if args.json:
        text = json.dumps({"caution": CAUTION,
                           "cases": [dict(r.to_dict(), vendor_comparison=v.to_dict() if v else None)
                                     for r, v in zip(results, comparisons)]},
                          indent=1, allow_nan=False) + "\n"
    else:
        show = display(args.units) if display is not None else None
        text = "".join(table(r, show) + ("\n" + vendor_table(v, show) if v is not None else "")
                       + "\n\n" for r, v in zip(results, comparisons)) + CAUTION + "\n"
    write_out(text)
    if folder is not None:
        for r, name in zip(results, csv_names(r.name for r in results)):
            try:
                write_csv(r, folder / name)
            except OSError as exc:
                return refuse(f"--csv {args.csv}: {name} could not be written "
                              f"({exc.strerror or exc}); the results above are complete")
    if args.report is not None:
        try:
            extra = {} if args.spread is None else {"spread": args.spread,
                                                     "increments": args.increments}
            report_writer(project, cases, results, args.report, args.units,
                          source_path=args.file, **extra)
        except OSError as exc:
            return refuse(f"--report {args.report}: could not be written ({exc.strerror or exc}); "
                          "the results above are complete")
    return code


def main(argv=None, report_writer=None, display=None) -> int:
    """Run the command. ``report_writer(project, cases, results, path, units, source_path)``
    writes ``--report`` (with ``spread`` and ``increments`` when ``--spread`` is given);
    without one, ``--report`` is refused. ``display(units)`` gives the table's units (an
    object like ``BaseUnits``); without it the table is in SI base units."""
    args = _parser().parse_args(argv)
    return guarded(lambda: _run(args, report_writer, display))


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
