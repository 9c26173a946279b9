"""Benchmark: Ebullio against the plain reference march, every sample, the first rating.

One run prints:

1. the reference case (benchmarks/reference_march.py: n-pentane at 3 bar in 3 m
   vertical tubes on steam, 100 increments) rated by the plain reference march and
   by Ebullio in the same process, their medians and minima and the ratio, with
   the answers side by side;
2. the property calls per increment of both: PropsSI calls for the reference,
   CoolProp flashes (``AbstractState.update``) for Ebullio;
3. every case of every sample: the median and the smallest wall time of repeated
   ratings in a warm process (imports done, code paths run once; the property
   caches emptied before each rating) against the target of its type;
4. the first rating in a fresh process, imports included (median of a few fresh
   processes), beside the bare interpreter and the imports of CoolProp and
   scipy.optimize alone.

Targets (issue 10, on the 2-core development machine): the reference case at
least 8 times faster than the reference march; every thermosiphon sample under
100 ms, every evaporator sample under 60 ms, every kettle sample under 120 ms
(medians). The machine is shared: the load average is printed before and after,
and the minima are the figures least disturbed by other work.

    python benchmarks/bench_speed.py [--repeat N] [--fresh N] [--skip-fresh | --only-fresh]
"""
from __future__ import annotations

import argparse
import os
import resource
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path[:0] = [str(ROOT), str(Path(__file__).resolve().parent)]

import rating  # noqa: E402
from rating.properties import make_fluid  # noqa: E402
from reference_march import reference_rating  # noqa: E402
from timing import property_fluids  # noqa: E402

TARGET_MS = {"thermosiphon": 100.0, "evaporator": 60.0, "kettle": 120.0}
TARGET_RATIO = 8.0
REFERENCE_FILE = ROOT / "samples" / "pentane-vaporiser.ebullio"
REFERENCE_INCREMENTS = 100


class _CountingState:
    """Stands in for a CoolProp AbstractState and counts its flashes."""

    def __init__(self, state, counter):
        self._s, self._n = state, counter

    def update(self, *args):
        self._n[0] += 1
        return self._s.update(*args)

    def __getattr__(self, name):
        return getattr(self._s, name)


def flashes(case, increments) -> int:
    """CoolProp flashes in one rating of the case (property caches emptied first)."""
    rating.rate(case, increments=increments)
    fluids = property_fluids(case)
    counter = [0]
    originals = [f._state for f in fluids]
    for f in fluids:
        f.clear_cache()
        f._state = _CountingState(f._state, counter)
    try:
        rating.rate(case, increments=increments)
    finally:
        for f, s in zip(fluids, originals):
            f._state = s
    return counter[0]


def _ms(times):
    return 1e3 * statistics.median(times), 1e3 * min(times)


def side_by_side(repeat):
    case = rating.load_project(REFERENCE_FILE).cases[0]
    ref_times, ref_cpu, out = [], [], None
    for _ in range(max(3, repeat // 3)):
        t0, c0 = time.perf_counter(), time.process_time()
        out = reference_rating(REFERENCE_INCREMENTS)
        ref_cpu.append(time.process_time() - c0)
        ref_times.append(time.perf_counter() - t0)
    ours_times, ours_cpu = _times(case, repeat, REFERENCE_INCREMENTS)
    result = rating.rate(case, increments=REFERENCE_INCREMENTS)
    ref_med, ref_min = _ms(ref_times)
    our_med, our_min = _ms(ours_times)
    print(f"1. Reference case, {REFERENCE_INCREMENTS} increments "
          f"(n-pentane, 3 bar, 3 m vertical tubes, 2 bar(a) steam)")
    print(f"   {'':28s} {'median ms':>10} {'min ms':>8} {'duty kW':>9} {'exit x':>8} "
          f"{'dryout z m':>10}")
    s = result.summary
    print(f"   {'reference march (PropsSI)':28s} {ref_med:>10.1f} {ref_min:>8.1f} "
          f"{out['duty_W'] / 1e3:>9.1f} {out['exit_quality']:>8.4f} {out['dryout_z_m']:>10.3f}")
    print(f"   {'Ebullio':28s} {our_med:>10.1f} {our_min:>8.1f} {s['duty_W'] / 1e3:>9.1f} "
          f"{s['exit_quality']:>8.4f} {s['dryout_z_m']:>10.3f}")
    ratio = ref_med / our_med
    print(f"   ratio (reference / Ebullio): median {ratio:.1f}x, minima "
          f"{ref_min / our_min:.1f}x, CPU medians {_ms(ref_cpu)[0] / _ms(ours_cpu)[0]:.1f}x  "
          f"(target >= {TARGET_RATIO:g}x: {'met' if ratio >= TARGET_RATIO else 'NOT met'})")
    n_flash = flashes(case, REFERENCE_INCREMENTS)
    print("2. Property calls per increment (reference: PropsSI calls; Ebullio: CoolProp flashes)")
    print(f"   reference march {out['property_calls_per_increment']:.1f}   "
          f"Ebullio {n_flash / REFERENCE_INCREMENTS:.2f} ({n_flash} in the rating, "
          "both marches of the condensate-film law included)")


def _times(case, repeat, increments=None):
    """(wall, CPU) times [s] of ``repeat`` ratings, property caches emptied before each.

    The CPU time of this process (time.process_time) is what a rating costs when
    the machine is not shared: on a loaded machine the wall time also counts the
    time the process waits for a core.
    """
    rating.rate(case, increments=increments)
    fluids = property_fluids(case)
    wall, cpu = [], []
    for _ in range(repeat):
        for f in fluids:
            f.clear_cache()
        t0, c0 = time.perf_counter(), time.process_time()
        rating.rate(case, increments=increments)
        cpu.append(time.process_time() - c0)
        wall.append(time.perf_counter() - t0)
    return wall, cpu


def samples(repeat):
    print(f"3. Every sample case, warm process, {repeat} ratings each, property caches emptied;"
          " wall time and this process's CPU time")
    print(f"   {'case':<54} {'type':<12} {'median ms':>9} {'min ms':>7} {'CPU med':>8} "
          f"{'CPU min':>8} {'target':>6} {'flashes':>7}")
    missed = 0
    for path in sorted((ROOT / "samples").glob("*.ebullio")):
        for case in rating.load_project(path).cases:
            wall, cpu = _times(case, repeat)
            med, low = _ms(wall)
            cmed, clow = _ms(cpu)
            target = TARGET_MS.get(case.type)
            ok = target is None or med < target
            missed += not ok
            print(f"   {case.name[:54]:<54} {case.type:<12} {med:>9.1f} {low:>7.1f} {cmed:>8.1f} "
                  f"{clow:>8.1f} {target:>6.0f} {flashes(case, None):>7}{'' if ok else '  over'}")
    print(f"   {'all within target (wall medians)' if not missed else f'{missed} case(s) over target (wall medians)'}")


def _fresh(code, runs):
    """Wall and CPU times [ms] of fresh interpreters running ``code`` (from the project
    root): (median wall, smallest wall, median CPU of the child, user + system)."""
    times, cpu = [], []
    for _ in range(runs):
        before = resource.getrusage(resource.RUSAGE_CHILDREN)
        t0 = time.perf_counter()
        subprocess.run([sys.executable, "-c", code], cwd=ROOT, check=True,
                       stdout=subprocess.DEVNULL)
        times.append(time.perf_counter() - t0)
        after = resource.getrusage(resource.RUSAGE_CHILDREN)
        cpu.append(after.ru_utime - before.ru_utime + after.ru_stime - before.ru_stime)
    return 1e3 * statistics.median(times), 1e3 * min(times), 1e3 * statistics.median(cpu)


def fresh(runs):
    rate_code = ("import rating; p = rating.load_project('samples/pentane-vaporiser.ebullio'); "
                 "rating.rate(p.cases[0])")
    rows = [
        ("bare interpreter", "pass"),
        ("import CoolProp.CoolProp", "import CoolProp.CoolProp"),
        ("import scipy.optimize", "import scipy.optimize"),
        ("import rating", "import rating"),
        ("import rating + first rating (pentane)", rate_code),
        ("ebullio-rate pentane sample (CLI)", "import sys; from rating.cli import main; "
         "sys.argv = ['ebullio-rate', 'samples/pentane-vaporiser.ebullio']; main()"),
    ]
    print(f"4. Fresh process, the whole interpreter: wall time, median of {runs} (min in "
          "brackets), and the child's CPU time (median)")
    for label, code in rows:
        med, low, cpu = _fresh(code, runs)
        print(f"   {label:<42} {med:>8.0f} ms ({low:.0f})   CPU {cpu:>6.0f} ms")


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--repeat", type=int, default=15)
    p.add_argument("--fresh", type=int, default=5)
    p.add_argument("--skip-fresh", action="store_true")
    p.add_argument("--only-fresh", action="store_true")
    args = p.parse_args(argv)
    import CoolProp
    print(f"load average before: {' '.join(f'{v:.2f}' for v in os.getloadavg())}  "
          f"({os.cpu_count()} cores); CoolProp {CoolProp.__version__}, Python "
          f"{sys.version.split()[0]}")
    make_fluid("Water")
    if not args.only_fresh:
        side_by_side(args.repeat)
        samples(args.repeat)
    if not args.skip_fresh:
        fresh(args.fresh)
    print(f"load average after: {' '.join(f'{v:.2f}' for v in os.getloadavg())}")


if __name__ == "__main__":
    main()
