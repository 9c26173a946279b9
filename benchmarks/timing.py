"""What the rating benchmarks share: timing cold ratings and the property share.

Imported by the bench_*.py scripts beside it (which put the project root on the
path first).
"""
from __future__ import annotations

import cProfile
import pstats
import time

import rating
from rating.properties import Fluid, make_fluid


def property_fluids(case) -> list:
    """The CoolProp-backed fluids of a case, whose caches a cold rating clears."""
    out = []
    for spec in (case.boiling.fluid, case.heating.fluid):
        if isinstance(spec, str):
            fluid = make_fluid(spec)
            if isinstance(fluid, Fluid):
                out.append(fluid)
    return out


def cold_rating_times(case, repeat: int) -> list[float]:
    """Wall times [s] of ``repeat`` ratings, each starting with empty property caches."""
    rating.rate(case)                       # import and warm the code paths once
    fluids = property_fluids(case)
    times = []
    for _ in range(repeat):
        for fluid in fluids:
            fluid.clear_cache()
        t0 = time.perf_counter()
        rating.rate(case)
        times.append(time.perf_counter() - t0)
    for fluid in fluids:
        fluid.clear_cache()
    return times


def property_share(case) -> float:
    """Share of one rating's time spent in property calls (rating.properties, CoolProp)."""
    prof = cProfile.Profile()
    prof.enable()
    rating.rate(case)
    prof.disable()
    stats = pstats.Stats(prof).stats
    total = sum(v[2] for v in stats.values())            # own time of every function
    props = sum(v[2] for k, v in stats.items()
                if "properties.py" in k[0] or "CoolProp" in k[0]
                or (k[0] == "~" and "AbstractState" in k[2]))
    return props / total if total else 0.0
