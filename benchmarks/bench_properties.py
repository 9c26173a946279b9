"""Time the property layer (rating/properties.py) per call, in microseconds.

Each figure is the median over repeats of the mean time per call of a loop of
many calls (time.perf_counter). Targets: a new saturation set < 30 us, a cached
one < 2 us.

    python benchmarks/bench_properties.py [--quick] [--tabular]

--tabular also times a raw CoolProp BICUBIC&HEOS saturation set for water, for
comparison only (the property layer uses HEOS). Its tables are built in a
temporary directory, about 15 s and 16 MB; nothing is written to the home folder.
"""
from __future__ import annotations

import argparse
import statistics
import tempfile
import time

import CoolProp
import CoolProp.CoolProp as CP

from rating.properties import Fluid

CASES = [("Water", 101325.0), ("Water", 1e6), ("n-Pentane", 3e5), ("R134a", 414607.5)]
TARGET_NEW, TARGET_CACHED = 30.0, 2.0


def per_call_us(loop, n, repeats):
    """Median over repeats of the time per call [us]; loop(n) makes n calls."""
    times = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        loop(n)
        times.append((time.perf_counter() - t0) / n * 1e6)
    return statistics.median(times)


def bench_fluid(name, P0, n, repeats):
    fluid = Fluid(name)
    sat = fluid.saturation(P0)
    pressures = [P0 * (1.0 + 1e-9 * i) for i in range(n)]  # distinct: every call a new set

    def new_sets(n):
        fluid.clear_cache()
        for P in pressures[:n]:
            fluid.saturation(P)

    def cached(n):
        for _ in range(n):
            fluid.saturation(P0)

    def t_sat_new(n):
        fluid.clear_cache()
        for P in pressures[:n]:
            fluid.T_sat(P)

    T_liq = sat.T_sat - 10.0

    def single_phase(n):
        for i in range(n):
            fluid.single_phase(P0, T_liq + 1e-7 * i)

    def at_ph(x):
        h = sat.h_l + x * sat.h_lv

        def loop(n):
            for i in range(n):
                fluid.at_ph(P0, h + 1e-6 * i)
        return loop

    rows = {
        "saturation, new set": per_call_us(new_sets, n, repeats),
        "saturation, cached": per_call_us(cached, 20 * n, repeats),
        "T_sat, new": per_call_us(t_sat_new, n, repeats),
        "single_phase (liquid, T_sat - 10 K)": per_call_us(single_phase, n, repeats),
        "at_ph subcooled (x = -0.05)": per_call_us(at_ph(-0.05), n // 4 or 1, repeats),
        "at_ph two-phase (x = 0.3, cached set)": per_call_us(at_ph(0.3), 20 * n, repeats),
        "at_ph superheated (x = 1.05)": per_call_us(at_ph(1.05), n // 4 or 1, repeats),
    }
    return rows


def bench_raw_strategies(name, P0, n, repeats, backend="HEOS", sigma=True):
    """Raw AbstractState saturation set: a second update at Q = 1 vs keyed vapour outputs."""
    s = CoolProp.AbstractState(backend, name)
    iD, iH, iCp, iMu, iK = CP.iDmass, CP.iHmass, CP.iCpmass, CP.iviscosity, CP.iconductivity

    def liquid():
        out = [s.T(), s.rhomass(), s.hmass(), s.cpmass(), s.viscosity(), s.conductivity(),
               s.first_saturation_deriv(CP.iP, CP.iT)]
        if sigma:  # tabular backends have no surface tension
            out.append(s.surface_tension())
        return out

    def two_updates(n):
        for i in range(n):
            P = P0 * (1.0 + 1e-9 * i)
            s.update(CP.PQ_INPUTS, P, 0.0)
            liquid()
            s.update(CP.PQ_INPUTS, P, 1.0)
            s.rhomass(), s.hmass(), s.cpmass(), s.viscosity(), s.conductivity()

    def keyed(n):
        sv = s.saturated_vapor_keyed_output
        for i in range(n):
            s.update(CP.PQ_INPUTS, P0 * (1.0 + 1e-9 * i), 0.0)
            liquid()
            sv(iD), sv(iH), sv(iCp), sv(iMu), sv(iK)

    return per_call_us(two_updates, n, repeats), per_call_us(keyed, n, repeats)


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--quick", action="store_true", help="fewer calls and repeats")
    parser.add_argument("--tabular", action="store_true", help="also time BICUBIC&HEOS (water)")
    args = parser.parse_args()
    n, repeats = (100, 5) if args.quick else (400, 15)
    print(f"CoolProp {CoolProp.__version__}, HEOS backend; median of {repeats} repeats, us per call")
    for name, P0 in CASES:
        print(f"\n{name} at {P0:g} Pa")
        rows = bench_fluid(name, P0, n, repeats)
        for label, us in rows.items():
            note = ""
            if label == "saturation, new set":
                note = "ok" if us < TARGET_NEW else f"MISSES {TARGET_NEW:g} us by {us - TARGET_NEW:.1f} us"
            elif label == "saturation, cached":
                note = "ok" if us < TARGET_CACHED else f"MISSES {TARGET_CACHED:g} us"
            print(f"  {label:40s} {us:8.2f}  {note}")
        a, b = bench_raw_strategies(name, P0, n, repeats)
        print(f"  raw set, second update at Q = 1          {a:8.2f}")
        print(f"  raw set, one update + keyed vapour        {b:8.2f}  (used)")
    if args.tabular:
        with tempfile.TemporaryDirectory() as tables:
            CP.set_config_string(CP.ALTERNATIVE_TABLES_DIRECTORY, tables + "/")
            t0 = time.perf_counter()
            CoolProp.AbstractState("BICUBIC&HEOS", "Water").update(CP.PQ_INPUTS, 101325.0, 0.0)
            print(f"\nBICUBIC&HEOS water: table build {time.perf_counter() - t0:.1f} s")
            a, b = bench_raw_strategies("Water", 101325.0, n, repeats, "BICUBIC&HEOS", sigma=False)
            print(f"  raw set without sigma, two updates / keyed: {a:.2f} / {b:.2f} us")


if __name__ == "__main__":
    main()
