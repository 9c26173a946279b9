"""Time the rating report of every sample: figures, HTML, PDF (the rating itself apart).

    python benchmarks/bench_report.py [--repeat N] [--units SI|metric|US] [FILE ...]

For each sample project the cases are rated once (timed apart), then the report of
every case is written as PDF and as HTML ``--repeat`` times into a temporary folder;
the table gives the best wall and processor times of each, the pages and the size.
The first report of a process also pays for importing Qt, matplotlib and pint: it is
timed on its own. Run on an idle machine for figures to quote.
"""
from __future__ import annotations

import argparse
import os
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import rating  # noqa: E402


def timed(fn):
    wall, cpu = time.perf_counter(), time.process_time()
    out = fn()
    return out, time.perf_counter() - wall, time.process_time() - cpu


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=2)
    ap.add_argument("--units", default="SI")
    ap.add_argument("files", nargs="*", type=Path)
    args = ap.parse_args(argv)
    samples = args.files or sorted((ROOT / "samples").glob("*.ebullio"))
    _, wall, cpu = timed(lambda: __import__("gui.report", fromlist=["write_report"]))
    print(f"import of the report writer (Qt, matplotlib): {wall:.2f} s wall, {cpu:.2f} s cpu")
    from gui.report import write_report
    from gui.report.pdf import ensure_app

    ensure_app()
    print(f"{'sample':<30} {'bytes':>6} {'cases':>5} {'rating s':>9} "
          f"{'PDF wall s':>10} {'PDF cpu s':>9} {'pages':>5} {'HTML wall s':>11}")
    with tempfile.TemporaryDirectory() as tmp:
        # The first report of a process loads pint's registry and the fonts: timed apart.
        warm = rating.load_project(samples[0])
        warm_results = [rating.rate(c) for c in warm.cases]
        _, wall, _ = timed(lambda: write_report(warm, warm.cases, Path(tmp) / "warm.pdf",
                                                args.units, samples[0], results=warm_results))
        print(f"first report of the process ({samples[0].name}): {wall:.2f} s wall")
        for path in samples:
            project = rating.load_project(path)
            results, rate_wall, _ = timed(lambda: [rating.rate(c) for c in project.cases])
            best = {}
            for suffix in (".pdf", ".html"):
                out = Path(tmp) / f"{path.stem}{suffix}"
                for _ in range(max(1, args.repeat)):
                    _, wall, cpu = timed(lambda: write_report(
                        project, project.cases, out, args.units, path, results=results))
                    w, c = best.get(suffix, (float("inf"), float("inf")))
                    best[suffix] = (min(w, wall), min(c, cpu))
            import pypdf
            pages = len(pypdf.PdfReader(Path(tmp) / f"{path.stem}.pdf").pages)
            print(f"{path.name:<30} {path.stat().st_size:>6} {len(project.cases):>5} "
                  f"{rate_wall:>9.2f} {best['.pdf'][0]:>10.2f} {best['.pdf'][1]:>9.2f} "
                  f"{pages:>5} {best['.html'][0]:>11.2f}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
