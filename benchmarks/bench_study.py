"""A 100-point sweep of the thermosiphon sample, in series and on a process pool.

    python benchmarks/bench_study.py [--points 100] [--workers 2]

Sweeps the column liquid level of the stripper reboiler sample (the first case of
samples/stripper-reboiler.ebullio) over 1.3-2.4 m. The parallel run goes first, so
that its workers (forked from this process after one warm-up rating) start with the
same property caches as the serial run that follows. Reports the pool's start-up
apart from the sweep, the speed-up (serial / parallel, with and without start-up),
the cost per point, and the machine's load average, since other work on the machine
takes cores from both runs. Target: a speed-up of at least 1.7 on 2 cores.

On a shared machine the wall-clock speed-up says as much about the other work as about
the pool, so the CPU time is reported too: user plus system seconds per point in the
serial run and in the workers plus the dispatching process of the parallel run. Their
ratio is the parallel efficiency (1.0: the pool adds no work), and workers x that
efficiency is the speed-up the pool gives when each worker has a core of its own.
The share of a core each run obtained (CPU / wall-clock) shows how busy the machine was.
"""
from __future__ import annotations

import argparse
import os
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

import rating  # noqa: E402
from rating.studies import InlineExecutor, Variation, default_executor, sweep  # noqa: E402


def main(argv=None) -> int:
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--points", type=int, default=100)
    p.add_argument("--workers", type=int, default=2)
    args = p.parse_args(argv)

    case = rating.load_project(ROOT / "samples" / "stripper-reboiler.ebullio").cases[0]
    rating.rate(case)                                   # load and warm the code paths once
    levels = Variation.range("thermosiphon.liquid_level", 1.3, 2.4, args.points)
    load_before = os.getloadavg()

    before = os.times()
    children0 = before.children_user + before.children_system
    t0 = time.perf_counter()
    pool = default_executor(args.workers)
    [f.result() for f in [pool.submit(os.getpid) for _ in range(4 * args.workers)]]  # start them
    t_start = time.perf_counter() - t0
    t0, c0, u0 = time.perf_counter(), time.process_time(), os.times().user
    parallel = sweep(case, [levels], executor=pool)
    t_parallel, cpu_dispatch = time.perf_counter() - t0, time.process_time() - c0
    user_dispatch = os.times().user - u0
    pool.shutdown()                                     # the workers' CPU time is now counted
    after = os.times()
    cpu_parallel = after.children_user + after.children_system - children0
    user_parallel = after.children_user - before.children_user + user_dispatch

    t0, c0, u0 = time.perf_counter(), time.process_time(), os.times().user
    serial = sweep(case, [levels], executor=InlineExecutor())
    t_serial, cpu_serial = time.perf_counter() - t0, time.process_time() - c0
    user_serial = os.times().user - u0
    load_after = os.getloadavg()

    same = [a.result.summary for a in parallel.points] == [b.result.summary for b in serial.points]
    rated = sum(pt.rated for pt in serial.points)
    print(f"thermosiphon sweep: {args.points} points of {levels.path} "
          f"{levels.values[0]:g}-{levels.values[-1]:g} m; {rated} rated; "
          f"parallel equals serial: {same}")
    print(f"cores: {os.cpu_count()}; load average before {load_before[0]:.2f}, "
          f"after {load_after[0]:.2f} (1 min)")
    print(f"serial:   {t_serial:7.2f} s  ({1e3 * t_serial / args.points:6.1f} ms per point)")
    print(f"parallel: {t_parallel:7.2f} s  on {args.workers} workers "
          f"({1e3 * t_parallel / args.points:6.1f} ms per point), pool start-up {t_start:.2f} s")
    n, w = args.points, args.workers
    cpu_total = cpu_parallel + cpu_dispatch
    efficiency = cpu_serial / cpu_total
    print(f"CPU time: serial {cpu_serial:.2f} s ({1e3 * cpu_serial / n:.1f} ms per point); "
          f"parallel {cpu_total:.2f} s ({1e3 * cpu_total / n:.1f} ms per point: workers "
          f"{cpu_parallel:.2f} s incl. their start-up, dispatch {cpu_dispatch:.2f} s)")
    print(f"share of a core obtained: serial {cpu_serial / t_serial:.2f}, parallel "
          f"{cpu_parallel / (w * t_parallel):.2f} per worker (1.00: a core to itself)")
    print(f"parallel efficiency (CPU serial / CPU parallel): {efficiency:.2f}; speed-up "
          f"with a core per worker: {w * efficiency:.2f} (CPU-based, independent of load)")
    print(f"user CPU only: serial {user_serial:.2f} s, parallel {user_parallel:.2f} s; "
          f"efficiency {user_serial / user_parallel:.2f}, speed-up with a core per worker "
          f"{w * user_serial / user_parallel:.2f}")
    print(f"speed-up: {t_serial / t_parallel:.2f} (sweep, wall clock), "
          f"{t_serial / (t_parallel + t_start):.2f} (with the pool's start-up); target 1.7")
    return 0 if same else 1


if __name__ == "__main__":
    sys.exit(main())
