"""rating.rate as the desktop, reports and studies use it: status, progress, provenance."""
import dataclasses
import itertools
from pathlib import Path

import CoolProp

import rating

SAMPLES = Path(__file__).parent.parent / "samples"


def chiller():
    # counter-current chilled water: the rating shoots, marching the tube many times
    return dataclasses.replace(
        rating.load_project(SAMPLES / "chiller-evaporator.ebullio").cases[0], increments=20)


def test_progress_never_goes_backwards_and_ends_at_one():
    seen = []
    r = rating.rate(chiller(), progress=seen.append)
    assert r.status in ("ok", "warnings")
    assert seen and seen[-1] == 1.0
    assert all(b >= a for a, b in itertools.pairwise(seen))


def test_a_cancelled_rating_says_so_in_its_status():
    calls, seen = [], []
    r = rating.rate(chiller(), progress=seen.append,
                    cancel=lambda: calls.append(1) or len(calls) > 3)
    assert r.status == "cancelled" and r.summary["duty_W"] is None
    assert not r.has_errors                      # stopped by the caller, not a failure
    assert not seen or seen[-1] < 1.0


def test_every_result_carries_its_provenance():
    case = chiller()
    r = rating.rate(case)
    p = r.to_dict()["provenance"]
    assert p["ebullio_version"] == rating.__version__
    assert p["coolprop_version"] == CoolProp.__version__
    assert p["methods"] == [m.name for m in r.methods] and p["methods"]
    assert len(p["case_sha256"]) == 64 and p["rated_at"].endswith("+00:00")
    # the hash follows the case's data: same data, same hash; one field changed, another
    again = rating.rate(dataclasses.replace(case)).provenance["case_sha256"]
    other = rating.rate(dataclasses.replace(case, increments=21)).provenance["case_sha256"]
    assert again == p["case_sha256"] != other


def test_a_figure_not_computed_is_none_in_the_summary_never_nan_or_infinity():
    # The summary's contract (DEVELOPERS.md): not computed is None. An exchanger that
    # marks a flux-dependent factor with NaN or a velocity over a zero width with
    # infinity must not reach a table as "nan"/"inf" (the window and the report format
    # summary values directly).
    import math

    import numpy as np

    from rating.results import Result

    r = Result("c", "kettle", "ok", "rated",
               summary={"mixture_factor": math.nan, "surface_vapour_velocity_m_s": math.inf,
                        "duty_W": np.float64(2.5e6), "circulation_ratio": None, "tubes": 120})
    assert r.summary["mixture_factor"] is None
    assert r.summary["surface_vapour_velocity_m_s"] is None
    assert r.summary["duty_W"] == 2.5e6 and type(r.summary["duty_W"]) is float
    assert r.summary["circulation_ratio"] is None and r.summary["tubes"] == 120
