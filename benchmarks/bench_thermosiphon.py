"""Benchmark: one thermosiphon rating (circulation solved, default increments) per sample case.

Prints, per thermosiphon case of the samples, the median and the smallest wall
time of repeated ratings (every rating starts with cold saturation caches), the
number of loop evaluations (marches) the circulation took and the balance
residual. Target (issue 4, on this 2-core machine): under 200 ms median for the
steam-heated stripper sample.

    python benchmarks/bench_thermosiphon.py [--repeat N] [FILE ...]
"""
from __future__ import annotations

import argparse
import statistics
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

import rating
from rating.exchangers import thermosiphon
from timing import cold_rating_times  # noqa: E402

TARGET_MS = 200.0


def _evaluations(case) -> tuple[int, int]:
    """Loop evaluations of one rating: (scan, full increments)."""
    counts = {}
    original = thermosiphon._Loop._evaluate

    def counting(self, W, n):
        counts[n] = counts.get(n, 0) + 1
        return original(self, W, n)

    thermosiphon._Loop._evaluate = counting
    try:
        rating.rate(case)
    finally:
        thermosiphon._Loop._evaluate = original
    n_full = case.increments or thermosiphon.DEFAULT_INCREMENTS
    return sum(v for k, v in counts.items() if k != n_full), counts.get(n_full, 0)


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("files", nargs="*", type=Path)
    p.add_argument("--repeat", type=int, default=15)
    args = p.parse_args(argv)
    files = args.files or sorted((ROOT / "samples").glob("*.ebullio"))
    print(f"{'case':<52} {'heating':<12} {'median ms':>10} {'min ms':>8} {'scan+full':>10} "
          f"{'residual Pa':>12}")
    for path in files:
        for case in rating.load_project(path).cases:
            if case.type != "thermosiphon":
                continue
            result = rating.rate(case)
            times = cold_rating_times(case, args.repeat)
            scan, full = _evaluations(case)
            heating = case.heating.kind + ("" if case.heating.kind == "steam"
                                           else f", {case.heating.flow_arrangement}")
            residual = result.summary.get("pressure_balance_residual_Pa")
            print(f"{case.name:<52} {heating:<12} {1e3 * statistics.median(times):>10.1f} "
                  f"{1e3 * min(times):>8.1f} {f'{scan}+{full}':>10} "
                  f"{residual if residual is None else f'{residual:.3g}':>12}")
    print(f"target: median under {TARGET_MS:.0f} ms for one steam-heated rating")


if __name__ == "__main__":
    main()
