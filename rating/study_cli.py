"""The headless studies: ``ebullio-study FILE [--case NAME] ...``.

    ebullio-study FILE --case NAME --vary tubes.length=2:5:13 [--vary PATH=V1,V2,...]
    ebullio-study FILE --case NAME --spread flow_boiling
    ebullio-study FILE --case NAME --envelope --vary X=... --vary Y=... [--required-duty W]
    ebullio-study FILE --case NAME --fit boiling.fouling_resistance=0:0.002
                  --measured duty_W=2.2e6+-3e4 [--measured KEY=VALUE+-TOL ...]

Values are SI (the project file's units). ``--json`` prints the study, ``--csv FILE``
writes its table (SI, one row per point). Points run on all cores (``--workers N``;
1 rates in this process) or on a Dask scheduler (``--scheduler ADDRESS``, the
``cluster`` extra). Exit status (``EXIT_CODES``): 0 every point rated; 1 a point
failed, was refused or has an error-severity finding, or the fit is poor or
unidentifiable; 2 bad input (one line on stderr, no traceback); 3 internal error.
The output helpers and exit statuses are ``rating.cli``'s.
"""
from __future__ import annotations

import argparse
import json
import math
import sys

from pathlib import Path

from .cli import (CAUTION, EXIT_BAD_INPUT, EXIT_FINDINGS, EXIT_INTERNAL, EXIT_RATED,
                  format_figure, guarded, label_unit, refuse, write_out)

PROG = "ebullio-study"

EXIT_CODES = f"""\
exit status:
  {EXIT_RATED}  every point rated without an error-severity finding (a fit: a clean fit)
  {EXIT_FINDINGS}  a point failed, was refused or has an error-severity finding; or the fit
     is poor or a parameter is not identifiable
  {EXIT_BAD_INPUT}  bad input: the project file or an option (one line on standard error)
  {EXIT_INTERNAL}  internal error: a fault in Ebullio (one line on standard error)"""


def _parser():
    p = argparse.ArgumentParser(
        prog=PROG, description="Sweeps, method spread, operating envelope and fit to plant "
        "data for a case of an Ebullio project file (.ebullio). Values are SI.",
        epilog=EXIT_CODES + "\n\n" + CAUTION,
        formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("file", help="project file")
    p.add_argument("--case", help="the case to study (needed when the file has several)")
    p.add_argument("--vary", action="append", default=[], metavar="PATH=SPEC",
                   help="an input to vary: PATH=START:STOP:COUNT or PATH=V1,V2,... "
                   "(one or two; with --envelope the x and y axes)")
    p.add_argument("--spread", metavar="FAMILY",
                   help="rate with every applicable method of FAMILY (flow_boiling, "
                   "nucleate_boiling, dryout, two_phase_friction, void_fraction)")
    p.add_argument("--envelope", action="store_true",
                   help="map the unit's limits over the two --vary inputs")
    p.add_argument("--required-duty", type=float, metavar="W",
                   help="the duty the envelope must meet (default: the case's)")
    p.add_argument("--fit", action="append", default=[], metavar="PATH=LO:HI",
                   help="an input to fit to the --measured values, within LO:HI")
    p.add_argument("--measured", action="append", default=[], metavar="KEY=VALUE+-TOL",
                   help="a measured result and its standard uncertainty, e.g. duty_W=2.2e6+-3e4")
    p.add_argument("--show", metavar="KEY,KEY",
                   help="summary results to list (default: duty, over-design, exit quality, "
                   "flux ratio and the type's own)")
    p.add_argument("--list-paths", action="store_true",
                   help="list the inputs this case's type can vary, and stop")
    p.add_argument("--json", action="store_true", help="print the study as JSON")
    p.add_argument("--csv", metavar="FILE", help="write the table of points as CSV")
    p.add_argument("--workers", type=int, metavar="N",
                   help="processes to rate on (default: every core; 1: in this process)")
    p.add_argument("--scheduler", metavar="ADDRESS",
                   help="rate on a Dask distributed scheduler (needs the cluster extra)")
    p.add_argument("--increments", type=int, metavar="N",
                   help="increments along the heated length (default: the case's or the engine's)")
    return p


def _refused(message):
    """Bad input met by the command itself (``guarded`` turns it into one line, exit 2)."""
    from .errors import InputError

    return InputError(message)


def _default_keys(case_type, required):
    from . import catalogue

    keys = ["duty_W"] + (["over_design_pct"] if required else []) + [
        "exit_quality", "max_chf_ratio"]
    keys += {"thermosiphon": ["circulation_kg_s", "circulation_ratio"],
             "kettle": ["surface_vapour_velocity_m_s"]}.get(case_type, [])
    return [k for k in keys if case_type in catalogue.SUMMARY[k].types]


def _keys(args, case):
    from . import catalogue

    if not args.show:
        return _default_keys(case.type, case.required_duty or args.required_duty)
    keys = [k.strip() for k in args.show.split(",") if k.strip()]
    for k in keys:
        if k not in catalogue.SUMMARY:
            raise _refused(f"--show {k}: not a result; results: {', '.join(catalogue.SUMMARY)}")
    return keys


def _pick_case(project, name, file):
    if name is not None:
        for c in project.cases:
            if c.name == name:
                return c
    elif len(project.cases) == 1:
        return project.cases[0]
    names = ", ".join(repr(c.name) for c in project.cases) or "none"
    what = f"--case {name!r}: no such case" if name is not None else \
        "--case is needed: the file has several cases"
    raise _refused(f"{what} in {file} (cases: {names})")


def _measurement(text):
    from .studies import Measurement

    key, sep, rest = text.partition("=")
    value, pm, tol = rest.partition("+-")
    try:
        if not sep or not pm:
            raise ValueError
        return Measurement(key.strip(), float(value), float(tol))
    except ValueError:
        raise _refused(f"--measured {text!r}: write KEY=VALUE+-TOL in SI, for example "
                       "duty_W=2.2e6+-3e4") from None


def _parameter(text):
    from .studies import Parameter

    path, sep, rest = text.partition("=")
    try:
        lo, hi = (float(v) for v in rest.split(":"))
        if not sep:
            raise ValueError
    except ValueError:
        raise _refused(f"--fit {text!r}: write PATH=LO:HI in SI, for example "
                       "boiling.fouling_resistance=0:0.002") from None
    return Parameter(path.strip(), lo, hi)


def _executor(args):
    """None (the default pool), an in-process executor, a sized pool, or a Dask client's."""
    from .studies import InlineExecutor, default_executor

    if args.scheduler:
        try:
            from distributed import Client
        except ImportError:
            raise _refused("--scheduler needs Dask distributed: install the cluster extra "
                           "(pip install \".[cluster]\")") from None
        try:
            client = Client(args.scheduler, timeout=10)
        except (OSError, TimeoutError) as exc:
            raise _refused(f"--scheduler {args.scheduler}: cannot connect ({exc})") from None
        return client.get_executor(), client
    if args.workers is not None:
        if not 1 <= args.workers <= 1024:
            raise _refused(f"--workers = {args.workers}: must be between 1 and 1024")
        return (InlineExecutor() if args.workers == 1 else default_executor(args.workers)), None
    return None, None


def _run(args):
    from . import load_project, studies

    modes = [bool(args.spread), bool(args.fit), args.envelope]
    if sum(modes) > 1:
        raise _refused("choose one study: --vary alone (a sweep), --spread, --envelope or --fit")
    if args.increments is not None:
        from .validation import check_increments

        check_increments(args.increments, "--increments")
    if args.csv:
        _check_csv(args.csv, args.file)
    project = load_project(args.file)
    case = _pick_case(project, args.case, args.file)
    if args.list_paths:
        return "paths", case, studies.study_paths(case)
    keys = _keys(args, case)
    executor, client = _executor(args)
    common = dict(executor=executor, increments=args.increments)
    try:
        if args.spread:
            if args.vary or args.measured:
                raise _refused("--spread takes no --vary or --measured")
            return "spread", case, studies.method_spread(case, args.spread, **common), keys
        if args.fit:
            if not args.measured:
                raise _refused("--fit needs at least one --measured KEY=VALUE+-TOL")
            fitted = studies.fit(case, [_measurement(m) for m in args.measured],
                                 [_parameter(f) for f in args.fit], **common)
            return "fit", case, fitted, keys
        variations = [studies.parse_variation(v) for v in args.vary]
        if args.envelope:
            if len(variations) != 2:
                raise _refused("--envelope needs two --vary inputs (the x and the y axis)")
            return "envelope", case, studies.envelope(
                case, *variations, required_duty=args.required_duty, **common), keys
        if not variations:
            raise _refused("nothing to study: give --vary, --spread, --envelope or --fit "
                           "(--list-paths lists the inputs)")
        return "sweep", case, studies.sweep(case, variations, **common), keys
    finally:
        if client is not None:
            client.close()
        elif executor is not None:
            executor.shutdown()


# --- readable tables ----------------------------------------------------------------

def _cell(key, value):
    return format_figure(value)


def _heading(key):
    label, unit = label_unit(key)
    return f"{label} [{unit}]" if unit else label


def _input_heading(path):
    from . import catalogue

    f = catalogue.input_field(path)
    return f"{path} [{f.unit}]" if f.unit else path


def _table(headings, rows) -> str:
    widths = [max(len(str(h)), *(len(str(r[i])) for r in rows)) if rows else len(str(h))
              for i, h in enumerate(headings)]
    def line(cells):  # numbers right-aligned; the last column (a reason) left as it is
        return "  ".join([str(c).rjust(w) for c, w in zip(cells[:-1], widths)] + [str(cells[-1])])

    return "\n".join([line(headings)] + [line(r) for r in rows])


def _reason(point):
    if point.rated:
        errors = [w.code for w in point.result.warnings if w.severity == "error"]
        return point.status + (f" ({', '.join(errors)})" if errors else "")
    return f"{point.status}: {point.message}"


def _points_text(paths, points, keys) -> str:
    headings = [_input_heading(p) for p in paths] + [_heading(k) for k in keys] + ["status"]
    rows = [[f"{p.inputs[path]:.6g}" for path in paths] + [_cell(k, p.value(k)) for k in keys]
            + [_reason(p)] for p in points]
    return _table(headings, rows)


def _text(kind, case, study, keys) -> str:
    from .studies import LIMITS

    head = f"Case: {case.name}  ({case.type})"
    if kind == "sweep":
        return f"{head}  sweep of {len(study.points)} points\n" + _points_text(
            [v.path for v in study.variations], study.points, keys)
    if kind == "spread":
        rows = [[name + (" (case's)" if name == study.chosen else "")]
                + [_cell(k, p.value(k)) for k in study.keys] + [_reason(p)]
                for (name, _, _), p in zip(study.methods, study.points)]
        rows.append(["spread (high - low)"] + [_cell(k, study.range(k)["spread"])
                                               for k in study.keys] + [""])
        out = [f"{head}  methods of {study.family} ({study.path}): {len(study.methods)}",
               _table(["method"] + [_heading(k) for k in study.keys] + ["status"], rows), ""]
        out += [f"  {name}: {title}; {ref}" for name, title, ref in study.methods]
        return "\n".join(out)
    if kind == "envelope":
        x, y = study.x, study.y
        out = [f"{head}  envelope over {x.path} x {y.path}, operating point "
               f"({study.operating_point[0]:.6g}, {study.operating_point[1]:.6g})"
               + (f", required duty {study.required_duty:.6g} W" if study.required_duty else "")]
        out.append("limits: " + "; ".join(f"{k} = {LIMITS[k]}" for k in study.limits))
        headings = [_input_heading(x.path), _input_heading(y.path)] + list(study.limits) + [
            "status"]
        rows = []
        for n, p in enumerate(study.points):
            i, j = divmod(n, len(y.values))
            rows.append([f"{x.values[i]:.6g}", f"{y.values[j]:.6g}"]
                        + [{True: "yes", False: "NO", None: "not judged"}[study.within[k][i, j]]
                           for k in study.limits] + [_reason(p)])
        out.append(_table(headings, rows))
        for k in study.limits:
            edge = ", ".join(f"{xv:.4g}: {'none' if yv is None else f'{yv:.4g}'}"
                             for xv, yv in study.boundary(k))
            out.append(f"boundary of {k} ({y.path} at each {x.path}): {edge}")
        return "\n".join(out)
    # fit
    out = [f"{head}  fit to plant data: {study.status}", f"  {study.message}"]
    for key, measured, model, r in study.residuals:
        out.append(f"  {key}: measured {measured:.6g}, model "
                   f"{'not computed' if model is None else f'{model:.6g}'} ({r:+.2f} tolerances)")
    out += [f"  [warning] {w}" for w in study.warnings]
    out.append(f"  ratings: {study.ratings}")
    return "\n".join(out)


def _bad(kind, study) -> bool:
    if kind == "fit":
        return study.status != "fitted"
    return any(not p.rated or p.result.has_errors for p in study.points)


def _clean(v):
    """JSON-safe data: a figure that is not finite is not computed (null), numpy scalars
    become plain numbers. ``json.dumps(default=...)`` never sees a float, so the cleaning
    is done on the data themselves."""
    import numpy as np     # loaded by then: the study has run

    if isinstance(v, dict):
        return {k: _clean(x) for k, x in v.items()}
    if isinstance(v, (list, tuple)):
        return [_clean(x) for x in v]
    if isinstance(v, (bool, np.bool_)):
        return bool(v)
    if isinstance(v, (int, np.integer)):
        return int(v)
    if isinstance(v, (float, np.floating)):
        return float(v) if math.isfinite(v) else None
    return v


def _check_csv(path, source):
    """Refuse an output the study could not write, or must not (the project itself, a file
    that is not a table), before any point is rated: a user's file is never overwritten
    by a mistyped option."""
    target = Path(path)
    if target.suffix.lower() != ".csv":
        raise _refused(f"--csv {path}: must end in .csv (a table is never written over "
                       "a file of another kind)")
    if target.is_dir() or not target.parent.is_dir():
        raise _refused(f"--csv {path}: not a file in an existing folder")
    if target.resolve() == Path(source).resolve():
        raise _refused(f"--csv {path}: is the project file being studied; name another file")


def _main(args) -> int:
    out = _run(args)
    if out[0] == "paths":
        write_out("\n".join(out[2]) + "\n")
        return EXIT_RATED
    kind, case, study, keys = out
    if args.json:
        data = study.to_dict(keys) if kind in ("sweep", "envelope") else study.to_dict()
        data["caution"] = CAUTION
        write_out(json.dumps(_clean(data), indent=1, allow_nan=False) + "\n")
    else:
        write_out(_text(kind, case, study, keys) + "\n\n" + CAUTION + "\n")
    if args.csv:
        try:
            from .studies.export import write_csv

            write_csv(study, args.csv, keys, CAUTION)
        except OSError as exc:
            return refuse(f"--csv {args.csv}: could not be written ({exc.strerror or exc}); "
                          "the results above are complete", PROG)
    return EXIT_FINDINGS if _bad(kind, study) else EXIT_RATED


def main(argv=None) -> int:
    args = _parser().parse_args(argv)
    return guarded(lambda: _main(args), PROG)


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
