"""Time every registered correlation per call, in microseconds.

Each method is called through the registry (the way the march calls it) with
the fixed water state W1 of tests/property_sets.py and the base flow-boiling case
(G = 500 kg/m^2/s, x = 0.1, D = 20 mm, q = 50 kW/m^2), plus the few extra inputs
some families need. Figures are medians of repeated loops (time.perf_counter).

    python benchmarks/bench_correlations.py [--repeat N]
"""
from __future__ import annotations

import argparse
import statistics
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path[:0] = [str(ROOT), str(ROOT / "tests")]

from property_sets import BASE, W1  # noqa: E402

from rating.correlations import REGISTRY  # noqa: E402
from rating.correlations.shell_side import ShellGeometry  # noqa: E402

SHELL = ShellGeometry(shell_inner_diameter=0.5, tube_outer_diameter=0.01905, tube_pitch=0.0254,
                      layout_angle_deg=30, tube_count=300, tube_passes=2, tube_length=4.0,
                      baffle_spacing=0.25, baffle_cut=0.25)

INPUTS = dict(W1, **BASE)
INPUTS.update(
    dT_sat=7.0, dp_sat=28000.0, dT=10.0, L=3.0, Re=5e4, Pr=3.0, tube_pitch=0.03175,
    tube_count=400, bundle_diameter=0.8, tube_length=4.0, area=120.0, shell=SHELL,
    m_dot=20.0, rho=958.4, mu=2.8e-4, k=0.677, cp=4216.0, beta=7.5e-4, boiling_range=10.0,
    h_nb_ref=25580.0, q_ref=150e3, h0=5600.0, T_bulk=360.0, htc_liquid=4000.0, htc_pool=6000.0,
    h_id=6000.0, dT_bp=5.0, Re_f=1000.0, htc_ideal=6000.0, T_sat_light=300.0,
    T_sat_heavy=340.0, liquid_fraction_light=0.5, vapour_fraction_light=0.8,
)


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--repeat", type=int, default=7)
    p.add_argument("--calls", type=int, default=2000)
    args = p.parse_args(argv)
    print(f"{'method':<40} {'family':<22} {'us/call':>9}")
    for name, method in REGISTRY.items():
        missing = [i for i in method.inputs if i not in INPUTS]
        if missing:
            print(f"{name:<40} {method.family:<22} {'needs ' + ', '.join(missing):>9}")
            continue
        times = []
        for _ in range(args.repeat):
            t0 = time.perf_counter()
            for _ in range(args.calls):
                method(INPUTS)
            times.append((time.perf_counter() - t0) / args.calls * 1e6)
        print(f"{name:<40} {method.family:<22} {statistics.median(times):>9.2f}")


if __name__ == "__main__":
    main()
