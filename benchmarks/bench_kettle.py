"""Benchmark: one kettle rating (not a timed test).

Rates each case of the kettle sample (samples/harrow-creek-kettles.ebullio) repeatedly
with the default increments and prints the median and the fastest wall time, the
number of tube-side marches a rating took and the share of the time spent in property
calls (rating.properties, CoolProp; cProfile on one extra rating). Every timed rating
starts with cold property caches. Target (issue 5, on a 2-core machine): a kettle
performance rating under 100 ms median. The area-for-duty question scales the tube length with a
root search (a dozen marches) and is shown for information.

    python benchmarks/bench_kettle.py [--repeat N] [FILE ...]
"""
from __future__ import annotations

import argparse
import statistics
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

import rating  # noqa: E402
from rating import pool_march  # noqa: E402
from timing import cold_rating_times, property_share  # noqa: E402

TARGET_MS = 100.0


def marches(case) -> int:
    """Tube-side marches in one rating of the case."""
    count = [0]
    run = pool_march.PoolMarcher.run

    def counting(self, h0):
        count[0] += 1
        return run(self, h0)

    pool_march.PoolMarcher.run = counting
    try:
        rating.rate(case)
    finally:
        pool_march.PoolMarcher.run = run
    return count[0]


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("files", nargs="*", type=Path)
    p.add_argument("--repeat", type=int, default=21)
    args = p.parse_args(argv)
    files = args.files or [ROOT / "samples" / "harrow-creek-kettles.ebullio"]
    print(f"{'case':<62} {'question':<12} {'median ms':>10} {'min ms':>8} {'marches':>8} "
          f"{'property share':>15}")
    for path in files:
        for case in rating.load_project(path).cases:
            if case.type != "kettle":
                continue
            times = cold_rating_times(case, args.repeat)
            median = 1e3 * statistics.median(times)
            flag = "" if case.question != "performance" or median < TARGET_MS else "  (over target)"
            print(f"{case.name:<62} {case.question:<12} {median:>10.1f} {1e3 * min(times):>8.1f} "
                  f"{marches(case):>8} {100 * property_share(case):>14.0f}%{flag}")


if __name__ == "__main__":
    main()
