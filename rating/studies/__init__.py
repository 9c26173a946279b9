"""Studies: sweeps, the spread between methods, the operating envelope, fit to plant data.

Each rates many cases. All of them go through ``execution.rate_points``, which takes
any ``concurrent.futures.Executor`` (a process pool on all cores by default; a Dask
distributed client's ``client.get_executor()`` drops in), keeps the input order,
keeps a failed point in its place with its reason, and stops queued points on a
cancel. Results are engineering estimates to be checked by a qualified engineer
under local codes and licensed practice.
"""
from __future__ import annotations

from .envelope import LIMITS, Envelope, envelope  # noqa: F401
from .execution import (CANCELLED, REFUSED, InlineExecutor, Job, Point,  # noqa: F401
                        default_executor, rate_points)
from .fit import MEASURABLE, Fit, Measurement, Parameter, fit  # noqa: F401
from .spread import FAMILIES, Spread, applicable_methods, method_spread  # noqa: F401
from .sweep import Sweep, Variation, parse_variation, study_paths, sweep  # noqa: F401
