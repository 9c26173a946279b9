"""Benchmark: one rating of each sample case with the default increments.

Prints the median wall time of repeated ratings per case and the share of that
time spent in property calls (rating.properties, CoolProp), measured with
cProfile on one extra rating. Targets (issue 3, on a 2-core machine): under
50 ms for the steam-heated sample, under 150 ms for the counter-current
liquid-heated one.

    python benchmarks/bench_rating.py [--repeat N] [FILE ...]
"""
from __future__ import annotations

import argparse
import statistics
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

import rating  # noqa: E402
from timing import cold_rating_times, property_share  # noqa: E402


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("files", nargs="*", type=Path)
    p.add_argument("--repeat", type=int, default=15)
    args = p.parse_args(argv)
    files = args.files or sorted((ROOT / "samples").glob("*.ebullio"))
    print(f"{'case':<42} {'type':<12} {'heating':<16} {'median ms':>10} {'min ms':>8} "
          f"{'property share':>15}")
    for path in files:
        for case in rating.load_project(path).cases:
            times = cold_rating_times(case, args.repeat)
            share = property_share(case)
            heating = case.heating.kind + ("" if case.heating.kind == "steam"
                                           else f", {case.heating.flow_arrangement}")
            print(f"{case.name:<42} {case.type:<12} {heating:<16} "
                  f"{1e3 * statistics.median(times):>10.1f} {1e3 * min(times):>8.1f} "
                  f"{100 * share:>14.0f}%")


if __name__ == "__main__":
    main()
