"""The headless command: ``ebullio-rate FILE [--case NAME] [--json] [--csv DIR] [--increments N]
[--report OUT.pdf|OUT.html [--units SI|metric|US]]``.

Reports are written by a writer passed in to ``main`` (the console script's entry
point, ``gui.report.command``, passes Ebullio's): the engine imports no Qt or plotting.

Exit status: 0 rated; 1 rated with an error-severity warning, or not converged;
2 bad input (one line on stderr, no traceback).
"""
from __future__ import annotations

import argparse
import csv
import json
import sys
from pathlib import Path

CAUTION = ("Results are engineering estimates. They must be checked by a qualified engineer "
           "under local codes and licensed practice before use in the design or operation "
           "of pressure equipment, steam systems or plant handling flammable fluids.")

# Rows of the readable table: (summary key, label, scale, offset, unit).
_ROWS = (
    ("duty_W", "Duty", 1e-3, 0.0, "kW"),
    ("duty_heating_side_W", "Duty, heating side", 1e-3, 0.0, "kW"),
    ("area_m2", "Area (outside)", 1.0, 0.0, "m2"),
    ("u_service_W_m2K", "U service", 1.0, 0.0, "W/m2K"),
    ("u_clean_W_m2K", "U clean", 1.0, 0.0, "W/m2K"),
    ("mean_temperature_difference_K", "Mean temperature difference", 1.0, 0.0, "K"),
    ("over_design_pct", "Over-design", 1.0, 0.0, "%"),
    ("exit_quality", "Exit vapour quality", 1.0, 0.0, "-"),
    ("exit_temperature_K", "Exit temperature", 1.0, -273.15, "degC"),
    ("pressure_drop_boiling_Pa", "Pressure drop, boiling side", 1e-3, 0.0, "kPa"),
    ("pressure_drop_heating_Pa", "Pressure drop, heating side", 1e-3, 0.0, "kPa"),
    ("heating_outlet_temperature_K", "Heating medium outlet", 1.0, -273.15, "degC"),
    ("max_heat_flux_W_m2", "Largest local heat flux", 1e-3, 0.0, "kW/m2"),
    ("max_chf_ratio", "Largest flux / critical flux", 1.0, 0.0, "-"),
    ("dryout_z_m", "Dryout starts at", 1.0, 0.0, "m"),
)


def _parser():
    p = argparse.ArgumentParser(
        prog="ebullio-rate",
        description="Rate the cases of an Ebullio project file (.ebullio).",
        epilog=CAUTION)
    p.add_argument("file", help="project file")
    p.add_argument("--case", help="rate only the case of this name")
    p.add_argument("--json", action="store_true", help="print the results as JSON")
    p.add_argument("--csv", metavar="DIR", help="write the profiles of each case as CSV into DIR")
    p.add_argument("--increments", type=int, metavar="N",
                   help="increments along the heated length (default: the case's or the engine's)")
    p.add_argument("--report", metavar="OUT", help="write a rating report, OUT.pdf or OUT.html")
    p.add_argument("--units", choices=REPORT_UNITS, default="SI",
                   help="unit system of the report (default SI)")
    return p


REPORT_UNITS = ("SI", "metric", "US")
REPORT_SUFFIXES = (".pdf", ".html", ".htm")


# Display of further summary keys by their unit suffix: (suffix, scale, offset, unit).
_SUFFIXES = (
    ("_kg_m_s2", 1.0, 0.0, "kg/m s2"),
    ("_W_m2K", 1.0, 0.0, "W/m2K"), ("_W_m2", 1e-3, 0.0, "kW/m2"), ("_kg_s", 1.0, 0.0, "kg/s"),
    ("_m_s", 1.0, 0.0, "m/s"), ("_m2", 1.0, 0.0, "m2"), ("_Pa", 1e-3, 0.0, "kPa"),
    ("_K", 1.0, -273.15, "degC"), ("_W", 1e-3, 0.0, "kW"), ("_pct", 1.0, 0.0, "%"),
    ("_m", 1.0, 0.0, "m"),
)


def _row_for(key):
    if key.endswith("_residual_Pa"):  # a small remainder: in Pa, not kPa
        return key, key[:-3].replace("_", " ").capitalize(), 1.0, 0.0, "Pa"
    for suffix, scale, offset, unit in _SUFFIXES:
        if key.endswith(suffix):
            label = key[: -len(suffix)].replace("_", " ")
            if unit == "degC" and not label.startswith(("t ", "temperature")) \
                    and "temperature" not in label:
                scale, offset, unit = 1.0, 0.0, "K"       # a temperature difference
            return key, label[0].upper() + label[1:], scale, offset, unit
    return key, key.replace("_", " ").capitalize(), 1.0, 0.0, "-"


def _fmt(v, scale, offset):
    if v is None:
        return "-"
    if isinstance(v, str):
        return v
    return f"{v * scale + offset:,.4g}" if abs(v * scale + offset) < 1e6 else f"{v * scale + offset:.4e}"


def table(result) -> str:
    """A readable summary of one result."""
    lines = [f"Case: {result.name}  ({result.type})  status: {result.status}"]
    if result.message and result.message != "rated":
        lines.append(f"  {result.message}")
    known = {row[0] for row in _ROWS}
    rows = [r for r in _ROWS if r[0] in result.summary]
    rows += [_row_for(k) for k, v in result.summary.items() if k not in known and v is not None]
    for key, label, scale, offset, unit in rows:
        lines.append(f"  {label:<34} {_fmt(result.summary[key], scale, offset):>14}  {unit}")
    for w in result.warnings:
        where = f" at z = {w.z_m:.3f} m" if w.z_m is not None else ""
        lines.append(f"  [{w.severity}] {w.code}{where}: {w.message}")
    return "\n".join(lines)


def vendor_table(comparison) -> str:
    """The vendor comparison of one case, beside the summary table."""
    from .catalogue import vendor_label
    from .vendor import describe, deviation_text

    lines = [f"  Vendor figures{f' ({comparison.source})' if comparison.source else ''}:"
             f" {describe(comparison)}"]
    for r in comparison.rows:
        _, _, scale, offset, unit = _row_for(r.key or r.figure)
        note = f"  ({r.note})" if r.note else ""
        lines.append(f"    {vendor_label(r.figure):<28} vendor {_fmt(r.vendor, scale, offset):>10}"
                     f"  Ebullio {_fmt(r.ebullio, scale, offset):>10} {unit:<7}"
                     f" {deviation_text(r) if r.deviation is not None else '':>14}  {r.verdict}{note}")
    return "\n".join(lines)


def write_csv(result, directory: Path) -> Path:
    directory.mkdir(parents=True, exist_ok=True)
    safe = "".join(c if c.isalnum() or c in "-_." else "_" for c in result.name)
    path = directory / f"{safe}.csv"
    keys = list(result.profiles)
    with open(path, "w", newline="", encoding="utf-8") as fh:
        w = csv.writer(fh)
        w.writerow(keys)
        for row in zip(*(result.profiles[k] for k in keys)):
            w.writerow(row)
    return path


def main(argv=None, report_writer=None) -> int:
    """Run the command. ``report_writer(project, cases, results, path, units, source_path)``
    writes ``--report``; without one, ``--report`` is refused."""
    from . import load_project, rate
    from .errors import InputError, RatingError
    from .vendor import compare

    args = _parser().parse_args(argv)
    try:
        if args.increments is not None and not 4 <= args.increments <= 5000:
            raise InputError(f"--increments = {args.increments}: must be between 4 and 5000")
        if args.report is not None:
            if report_writer is None:
                raise InputError("--report: reports are written by the ebullio-rate command "
                                 "installed with Ebullio's 'gui' extra")
            if Path(args.report).suffix.lower() not in REPORT_SUFFIXES:
                raise InputError(f"--report {args.report}: must end in .pdf or .html")
        project = load_project(args.file)
        cases = project.cases
        if args.case is not None:
            cases = [c for c in cases if c.name == args.case]
            if not cases:
                names = ", ".join(c.name for c in project.cases) or "none"
                raise InputError(f"--case {args.case!r}: no such case in {args.file} (cases: {names})")
        results = [rate(c, increments=args.increments) for c in cases]
        comparisons = [compare(c, r) for c, r in zip(cases, results)]
        if args.report is not None:
            report_writer(project, cases, results, args.report, args.units,
                          source_path=args.file)
    except (RatingError, OSError) as exc:
        msg = str(exc).splitlines()[0] if str(exc) else type(exc).__name__
        print(f"ebullio-rate: {msg}", file=sys.stderr)
        return 2
    if args.json:
        json.dump({"cases": [dict(r.to_dict(), vendor_comparison=v.to_dict() if v else None)
                             for r, v in zip(results, comparisons)]}, sys.stdout, indent=1)
        sys.stdout.write("\n")
    else:
        for r, v in zip(results, comparisons):
            print(table(r))
            if v is not None:
                print(vendor_table(v))
            print()
        print(CAUTION)
    if args.csv:
        for r in results:
            write_csv(r, Path(args.csv))
    bad = any(r.status == "failed" or r.has_errors for r in results)
    return 1 if bad else 0


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
