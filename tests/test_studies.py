"""Studies: sweeps, the spread between methods, the operating envelope, fit to plant data.

The sweeps run on the pentane vaporiser sample (a rating takes a few hundredths of a
second); the fits on the chiller sample, whose duty falls steadily with fouling (no
dryout anywhere in the range: the fitted quantity is a monotonic function of the
fouling resistance, so a unique answer exists).
"""
from __future__ import annotations

import dataclasses
import math
from pathlib import Path

import numpy as np
import pytest

import rating
from rating import catalogue
from rating.errors import InputError
from rating.studies.execution import PER_WORKER, window_of
from rating.studies.sweep import MAX_POINTS
from rating.studies import (CANCELLED, REFUSED, InlineExecutor, Measurement, Parameter,
                            Variation, applicable_methods, default_executor, envelope, fit,
                            method_spread, parse_variation, sweep)

SAMPLES = Path(__file__).parent.parent / "samples"


@pytest.fixture(scope="module")
def pentane():
    return rating.load_project(SAMPLES / "pentane-vaporiser.ebullio").case(
        "C5 vaporiser V-12 performance")


@pytest.fixture(scope="module")
def chiller():
    return rating.load_project(SAMPLES / "chiller-evaporator.ebullio").cases[0]


@pytest.fixture(scope="module")
def pool():
    with default_executor(2) as executor:
        yield executor


LENGTHS = parse_variation("tubes.length=1:4:20")


# --- sweeps and their execution ----------------------------------------------------------

def test_parse_variation_forms():
    v = parse_variation("tubes.length=2:5:13")
    assert v.path == "tubes.length" and len(v.values) == 13
    assert v.values[0] == 2.0 and v.values[-1] == 5.0 and v.values[1] == pytest.approx(2.25)
    assert parse_variation("heating.pressure=2e5,3e5").values == (2e5, 3e5)
    for bad in ("tubes.length", "tubes.length=a:b:3", "tubes.length=1:2:1", "=1,2"):
        with pytest.raises(InputError):
            parse_variation(bad)


def test_sweep_refuses_a_path_that_is_not_a_numeric_input(pentane):
    with pytest.raises(InputError, match="tubes.lenght: not a numeric input"):
        sweep(pentane, [Variation("tubes.lenght", (1.0, 2.0))], executor=InlineExecutor())
    # Steam heating has no inlet temperature; a vendor's stated duty does not change a rating.
    for path in ("heating.inlet_temperature", "vendor.duty", "limits.chf_ratio"):
        with pytest.raises(InputError, match="not a numeric input of this evaporator"):
            sweep(pentane, [Variation(path, (1.0, 2.0))], executor=InlineExecutor())


def test_parallel_sweep_equals_serial_and_single_ratings(pentane, pool):
    """20 points on two worker processes give the same numbers, in the same order, as in
    this process; and each equals a rating of the case built by hand (the sweep sets
    nothing but the varied length)."""
    serial = sweep(pentane, [LENGTHS], executor=InlineExecutor())
    parallel = sweep(pentane, [LENGTHS], executor=pool)
    assert len(parallel.points) == 20
    assert [p.inputs for p in parallel.points] == [{"tubes.length": x} for x in LENGTHS.values]
    assert [p.result.summary for p in parallel.points] == [p.result.summary for p in serial.points]
    for i in (0, 7, 19):
        tubes = dataclasses.replace(pentane.tubes, length=LENGTHS.values[i])
        direct = rating.rate(dataclasses.replace(pentane, tubes=tubes))
        assert parallel.points[i].result.summary == direct.summary
    # A longer tube transfers more heat (the same inlet states, more area).
    duties = parallel.values("duty_W")
    assert all(b > a for a, b in zip(duties, duties[1:]))


def test_default_executor_keeps_input_order(pentane):
    """With no executor given, a process pool on all cores is made and shut down."""
    short = Variation("tubes.length", (4.0, 1.0, 2.5))
    points = sweep(pentane, [short]).points
    assert [p.inputs["tubes.length"] for p in points] == [4.0, 1.0, 2.5]
    duties = [p.value("duty_W") for p in points]
    assert duties[1] < duties[2] < duties[0]


def test_two_inputs_give_every_combination(pentane):
    s = sweep(pentane, [Variation("tubes.length", (1.5, 3.0)),
                        Variation("heating.pressure", (1.5e5, 2.0e5, 2.5e5))],
              executor=InlineExecutor())
    assert s.shape == (2, 3) and len(s.points) == 6
    assert s.points[4].inputs == {"tubes.length": 3.0, "heating.pressure": 2.0e5}
    grid = s.grid("duty_W")
    assert grid.shape == (2, 3) and np.all(np.isfinite(grid))
    # Hotter steam at the same length gives more duty at the short length, before dryout.
    assert grid[0, 0] < grid[0, 1]


def test_failing_points_keep_their_place_and_reason(pentane, pool):
    """A refused value (a negative length: the catalogue's own range message) and a point
    the engine cannot rate (steam colder than the boiling pentane) stay in the table."""
    values = (2.0, -1.0, 3.0)
    s = sweep(pentane, [Variation("tubes.length", values)], executor=pool)
    assert [p.inputs["tubes.length"] for p in s.points] == list(values)
    bad = s.points[1]
    assert bad.status == REFUSED and "length" in bad.message and bad.result is None
    assert bad.value("duty_W") is None           # not computed, never 0
    assert s.points[0].rated and s.points[2].rated
    # Saturated steam at 1.1 bar(a) condenses at 102 degC; n-pentane boils at 3 bar(a)
    # near 66 degC (CoolProp), so 0.3 bar(a) steam (69 degC) gives almost no duty
    # and 0.2 bar(a) (60 degC) is colder than the boiling side: refused or failed.
    cold = sweep(pentane, [Variation("heating.pressure", (2.0e5, 0.2e5, 2.5e5))],
                 executor=InlineExecutor())
    assert not cold.points[1].rated and cold.points[1].message
    assert cold.points[0].rated and cold.points[2].rated
    assert cold.failed == [cold.points[1]]


def test_cancel_stops_queued_points(pentane):
    """Cancelled after three points: those three are rated, the rest come back cancelled
    in their places."""
    done = []
    s = sweep(pentane, [LENGTHS], executor=InlineExecutor(),
              progress=lambda n, total: done.append((n, total)), cancel=lambda: len(done) > 3)
    statuses = [p.status for p in s.points]
    assert all(p.rated for p in s.points[:3])
    assert statuses[3:] == [CANCELLED] * 17
    assert done[-1][1] == 20


def test_cancel_on_a_process_pool(pentane, pool):
    """Cancelled once the first point is back: only the window of points the pool holds
    (PER_WORKER per worker) may still be rated, however slow this process is; the rest
    come back cancelled, all in their places."""
    done, seen = [], []

    def cancel():
        if done and done[-1] >= 1:
            seen.append(done[-1])         # points back when the cancel was first seen
            return True
        return False

    s = sweep(pentane, [LENGTHS], executor=pool, progress=lambda n, total: done.append(n),
              cancel=cancel)
    assert [p.inputs["tubes.length"] for p in s.points] == list(LENGTHS.values)
    rated = [p for p in s.points if p.rated]
    assert window_of(pool) == PER_WORKER * 2
    assert 1 <= len(rated) <= seen[0] + window_of(pool)
    assert sum(p.status == CANCELLED for p in s.points) == 20 - len(rated)
    serial = sweep(pentane, [Variation("tubes.length", (rated[0].inputs["tubes.length"],))],
                   executor=InlineExecutor())
    assert rated[0].result.summary == serial.points[0].result.summary


def test_a_thread_pool_works_and_a_closed_pool_fails_each_point_in_place(pentane):
    import concurrent.futures as cf

    with cf.ThreadPoolExecutor(2) as threads:
        s = sweep(pentane, [Variation("tubes.length", (3.0, 2.0))], executor=threads)
    assert [p.inputs["tubes.length"] for p in s.points] == [3.0, 2.0] and s.points[1].rated
    closed = cf.ThreadPoolExecutor(1)
    closed.shutdown()
    s = sweep(pentane, [Variation("tubes.length", (2.0, -1.0))], executor=closed)
    assert [p.status for p in s.points] == ["failed", REFUSED]
    assert "not sent to a worker" in s.points[0].message


# --- method spread -----------------------------------------------------------------------

def test_spread_lists_every_applicable_method_once_with_a_positive_duty_spread(pentane, pool):
    spread = method_spread(pentane, "flow_boiling", executor=pool)
    names = [m[0] for m in spread.methods]
    expected = [n for n, _, _ in catalogue.method_choices(
        "methods.flow_boiling", catalogue.case_to_draft(pentane))]
    assert sorted(names) == sorted(set(expected)) and len(names) == len(set(names))
    assert spread.chosen == pentane.methods.flow_boiling and spread.chosen in names
    for (name, _, _), point in zip(spread.methods, spread.points):
        assert point.rated, point.message
        # The rating really used that method: its own method trail says so.
        used = {m.name for m in point.result.methods if m.family == "flow_boiling"}
        assert used == {name}
    duty = spread.range("duty_W")
    assert duty["spread"] > 0.0 and duty["high"] > duty["low"]
    assert {duty["low_method"], duty["high_method"]} <= set(names)
    assert set(spread.keys) == {"duty_W", "over_design_pct", "exit_quality", "max_chf_ratio"}


def test_spread_of_dryout_methods_skips_the_automatic_choice(pentane):
    names = [n for n, _, _ in applicable_methods(pentane, "dryout")]
    assert "auto" not in names and len(names) == len(set(names)) and names


def test_spread_refuses_an_unknown_family(pentane):
    with pytest.raises(InputError, match="choose one of"):
        method_spread(pentane, "boiling", executor=InlineExecutor())


# --- operating envelope ------------------------------------------------------------------

def _envelope(case, fouling, executor):
    fouled = catalogue.with_value(case, "boiling.fouling_resistance", fouling)
    return envelope(fouled, Variation("boiling.mass_flow", (6.0, 8.0)),
                    Variation("heating.pressure", tuple(np.linspace(1.2e5, 3.0e5, 7))),
                    required_duty=1.3e6, executor=executor)


def test_envelope_boundaries_move_up_the_steam_pressure_when_fouling_rises(pentane, pool):
    """A fouling resistance in series lowers the heat flux at a given steam temperature
    (Fourier: q = dT / sum of resistances). So, fouled, the unit needs hotter steam to
    meet its duty, and it reaches the critical-flux margin only at hotter steam: both
    boundaries move to higher steam pressure."""
    clean, fouled = _envelope(pentane, 2.5e-4, pool), _envelope(pentane, 3.5e-4, pool)
    assert clean.limits == ("duty", "critical_flux")
    assert clean.operating_point == (4.5, 2.0e5)
    for limit in clean.limits:
        for (x, y_clean), (_, y_fouled) in zip(clean.boundary(limit), fouled.boundary(limit)):
            assert y_clean is not None and y_fouled is not None, (limit, x)
            assert y_fouled > y_clean, (limit, x)
    # The classification agrees with the margins it was drawn from.
    within, margin = fouled.within["duty"], fouled.margin["duty"]
    for idx in np.ndindex(within.shape):
        assert within[idx] == (margin[idx] >= 0.0)
    # Low steam pressure misses the duty; high steam pressure dries the tubes out.
    inside = fouled.inside
    assert inside[0, 0] is False and inside[0, -1] is False and any(inside[0])


def test_envelope_of_a_thermosiphon_judges_circulation(pool):
    case = rating.load_project(SAMPLES / "stripper-reboiler.ebullio").cases[0]
    env = envelope(case, Variation("heating.pressure", (1.8e5,)),
                   Variation("thermosiphon.liquid_level", (0.3, 2.0)), executor=pool)
    assert env.limits == ("critical_flux", "circulation", "stability")
    assert env.within["circulation"][0, 1] is True
    # A level barely above the tube sheet gives too little head for this loop: the
    # engine says it will not circulate (or refuses), and the envelope marks it.
    assert env.within["circulation"][0, 0] in (False, None)


# --- fit to plant data -------------------------------------------------------------------

TRUE_FOULING = 4e-4     # m^2*K/W, a TEMA-range value for a refrigerant (common practice)


@pytest.fixture(scope="module")
def plant(chiller):
    """The 'plant': the chiller rated with a known boiling-side fouling."""
    return rating.rate(catalogue.with_value(chiller, "boiling.fouling_resistance", TRUE_FOULING))


def test_fit_recovers_a_known_fouling_and_its_uncertainty(chiller, plant):
    """The chilled-water outlet temperature of a rating made with R_f = 4e-4 m^2K/W is
    fitted from R_f = 1.76e-4 (the sample's). The data carry no noise, so the minimum is
    the true value up to the solver's tolerance (1e-10 of the range) and the rating's
    numerical noise; 1e-6 m^2K/W (0.25 %) is 60 times below the uncertainty that a 0.1 K
    tolerance gives, so a larger miss is a fault of the fit, not of the data.
    The reported uncertainty is checked against the sensitivity measured here by central
    differences of two ratings: sigma = tolerance / |dT/dR_f| (linear error propagation)."""
    measured = plant.summary["heating_outlet_temperature_K"]
    result = fit(chiller, [Measurement("heating_outlet_temperature_K", measured, 0.1)],
                 [Parameter("boiling.fouling_resistance", 0.0, 2e-3)], executor=InlineExecutor())
    assert result.status == "fitted" and not result.warnings
    assert result.values["boiling.fouling_resistance"] == pytest.approx(TRUE_FOULING, abs=1e-6)
    d = 5e-5
    up, down = (rating.rate(catalogue.with_value(chiller, "boiling.fouling_resistance",
                                                 TRUE_FOULING + s)).summary[
        "heating_outlet_temperature_K"] for s in (d, -d))
    sigma = 0.1 / abs((up - down) / (2 * d))
    assert result.uncertainty["boiling.fouling_resistance"] == pytest.approx(sigma, rel=0.05)
    assert result.identifiable == {"boiling.fouling_resistance": True}
    assert abs(result.residuals[0][3]) < 1e-3


def test_fit_reports_an_unidentifiable_parameter(chiller, plant):
    """The boiling R134a leaves at its saturation temperature: its outlet temperature
    moves by thousandths of a kelvin over the whole fouling range (only through the
    pressure drop), so with a 0.5 K tolerance it cannot fix the fouling."""
    measured = plant.summary["exit_temperature_K"]
    result = fit(chiller, [Measurement("exit_temperature_K", measured, 0.5)],
                 [Parameter("boiling.fouling_resistance", 0.0, 2e-3)], executor=InlineExecutor())
    assert result.status == "unidentifiable"
    assert result.identifiable == {"boiling.fouling_resistance": False}
    assert result.uncertainty["boiling.fouling_resistance"] is None
    assert any("not identifiable" in w for w in result.warnings)


def test_fit_warns_when_the_data_cannot_be_met(chiller, plant):
    """Chilled water measured 3 K warmer than any fouling in the range can give: the fit
    ends at the bound and says the fit is poor."""
    measured = plant.summary["heating_outlet_temperature_K"] + 3.0
    result = fit(chiller, [Measurement("heating_outlet_temperature_K", measured, 0.1)],
                 [Parameter("boiling.fouling_resistance", 0.0, 2e-3)], executor=InlineExecutor())
    assert result.status == "poor"
    assert result.values["boiling.fouling_resistance"] == pytest.approx(2e-3)
    assert any("upper bound" in w for w in result.warnings)
    assert any(w.startswith("poor fit") for w in result.warnings)


def test_fit_refuses_bad_input(chiller):
    ex = InlineExecutor()
    with pytest.raises(InputError, match="not a result"):
        fit(chiller, [Measurement("duty", 1.0, 0.1)],
            [Parameter("boiling.fouling_resistance", 0.0, 1e-3)], executor=ex)
    with pytest.raises(InputError, match="rising"):
        fit(chiller, [Measurement("duty_W", 4e4, 1e3)],
            [Parameter("boiling.fouling_resistance", 1e-3, 0.0)], executor=ex)
    with pytest.raises(InputError, match="tolerance"):
        fit(chiller, [Measurement("duty_W", 4e4, 0.0)],
            [Parameter("boiling.fouling_resistance", 0.0, 1e-3)], executor=ex)


def test_points_and_studies_are_plain_data(pentane):
    s = sweep(pentane, [Variation("tubes.length", (2.0, -1.0))], executor=InlineExecutor())
    data = s.to_dict(["duty_W"])
    assert data["points"][1]["summary"] == {"duty_W": None}
    assert data["points"][0]["summary"]["duty_W"] > 0.0
    assert math.isfinite(data["points"][0]["summary"]["duty_W"])


def test_fit_recovers_a_multiplier_on_the_boiling_coefficient(chiller):
    """The engine scales the boiling method's coefficient by boiling.htc_factor; a
    rating made with 0.6 is fitted back from its chilled-water outlet temperature and
    duty. Noise-free data, as for the fouling above: 0.5 % is far inside the
    uncertainty the tolerances give, and far outside the solver's own tolerance."""
    plant = rating.rate(catalogue.with_value(chiller, "boiling.htc_factor", 0.6))
    measured = [Measurement("heating_outlet_temperature_K",
                            plant.summary["heating_outlet_temperature_K"], 0.1),
                Measurement("duty_W", plant.summary["duty_W"], 0.02 * plant.summary["duty_W"])]
    result = fit(chiller, measured, [Parameter("boiling.htc_factor", 0.2, 2.0)],
                 executor=InlineExecutor())
    assert result.status == "fitted", result.warnings
    assert result.values["boiling.htc_factor"] == pytest.approx(0.6, rel=5e-3)
    assert 0.0 < result.uncertainty["boiling.htc_factor"] < 0.6


# --- the kettle's bundle limit ---------------------------------------------------------------

@pytest.fixture(scope="module")
def kettle():
    return rating.load_project(SAMPLES / "harrow-creek-kettles.ebullio").cases[0]


def test_kettle_dryout_spread_compares_the_bundle_limits(kettle):
    """A kettle's "dryout" is its bundle's maximum flux (kettle.bundle_max_flux), declared
    in the registry's feeds like every other choice: both published bundle methods apply
    (Palen & Small 1964; Palen 1983, HEDH 3.6), each once. The bundle maximum is a limit
    the rating checks, not one it imposes, so the duty is the same with either and only
    the critical-flux ratio moves."""
    s = method_spread(kettle, "dryout", executor=InlineExecutor())
    assert s.path == "kettle.bundle_max_flux"
    assert [m[0] for m in s.methods] == ["palen_small_1964", "palen_1983"]
    for (name, _, _), point in zip(s.methods, s.points):
        assert point.rated, point.message
        assert ("bundle_chf", name) in {(m.family, m.name) for m in point.result.methods}
    duty = s.range("duty_W")
    assert duty["spread"] == pytest.approx(0.0, abs=1e-9 * duty["high"])
    assert s.range("max_chf_ratio")["spread"] > 0.0


def test_a_spread_of_fewer_than_two_methods_is_refused(kettle, monkeypatch):
    """Without the tube pitch among the kettle's feeds, Palen & Small (1964) cannot be fed
    and only Palen (1983) is left: no spread to show, said in words."""
    from rating.correlations import registry

    feeds = dict(registry.FEEDS["kettle"])
    feeds["bundle_chf"] = feeds["bundle_chf"] - {"tube_pitch"}
    monkeypatch.setitem(registry.FEEDS, "kettle", feeds)
    with pytest.raises(InputError, match="only palen_1983 applies") as err:
        method_spread(kettle, "dryout", executor=InlineExecutor())
    assert err.value.field == "family" and "no spread" in str(err.value)


def test_a_cancelled_fit_says_so(chiller):
    result = fit(chiller, [Measurement("duty_W", 4e4, 1e3)],
                 [Parameter("boiling.fouling_resistance", 0.0, 2e-3)], executor=InlineExecutor(),
                 cancel=lambda: True)
    assert result.status == "cancelled"
    assert result.uncertainty == {"boiling.fouling_resistance": None}


def kettle_exit_quality(case):
    return rating.rate(case).summary["exit_quality"]


def test_kettle_envelope_marks_a_feed_that_the_bundle_boils_dry(kettle):
    """A kettle's feed must exceed what the bundle boils off, or nothing overflows the weir
    (the engine refuses such a rating: "feed-boiled-dry"). A hotter heating medium boils
    off more, so the least feed that keeps the pool rises with the steam pressure: a feed
    that is enough at the lower pressure falls short at the higher one, never the other
    way, and the smallest feeds fall short at every pressure."""
    feed, p = kettle.boiling.mass_flow, kettle.heating.pressure
    env = envelope(kettle, Variation("boiling.mass_flow", (0.25 * feed, 0.8 * feed, 1.3 * feed)),
                   Variation("heating.pressure", (0.7 * p, 1.3 * p)), executor=InlineExecutor())
    assert "feed" in env.limits
    within = env.within["feed"]
    # The sample boils off more than a quarter of its own feed (its exit quality): a quarter
    # of the feed is less than the same bundle boils off at that duty.
    assert kettle_exit_quality(kettle) > 0.25
    assert list(within[0]) == [False, False]
    for row in within:                              # never enough only at the hotter steam
        assert not (row[0] is False and row[1] is True)
    assert any(list(row) == [True, False] for row in within)    # the edge lies in the grid
    failed = env.points[0]
    assert failed.status == "failed" and "boil off" in failed.message


def test_a_flat_model_near_the_answer_reports_what_the_data_leave_open(pentane):
    """The pentane vaporiser dries out inside its tubes: while the dryout point moves along
    the tube the duty hardly changes with the boiling-side fouling, then falls once the
    fouling pushes the dryout off the tube. A duty measured to 3 % at the sample's own
    fouling cannot fix the fouling near it (the local slope is flat), but it does rule out
    the values whose rating misses the duty by more than two tolerances. The fit says
    both: not identifiable, and the span it leaves open, whose upper end is checked here
    by a rating made at it."""
    duty = rating.rate(pentane).summary["duty_W"]
    tolerance = 0.03 * duty
    result = fit(pentane, [Measurement("duty_W", duty, tolerance)],
                 [Parameter("boiling.fouling_resistance", 0.0, 2e-3)], executor=InlineExecutor())
    assert result.status == "unidentifiable"
    low, high = result.interval
    assert low <= pentane.boiling.fouling_resistance <= high
    assert high - low < 0.5 * 2e-3                    # the data exclude most of the range
    at_high = rating.rate(catalogue.with_value(pentane, "boiling.fouling_resistance", high))
    assert abs(at_high.summary["duty_W"] - duty) > 2.0 * tolerance
    assert any("leave it anywhere from" in w for w in result.warnings)


# --- what a point's status says ----------------------------------------------------------

def test_an_engine_fault_while_building_a_point_is_a_failed_point_not_a_refusal():
    """Only the engine's InputError is the user's input refused; a KeyError or ValueError
    while building a case is a fault in Ebullio and is said to be one."""
    from rating.studies import Job, rate_points

    def broken():
        raise KeyError("heating.kind")

    def bad_input():
        raise InputError("tubes.length = -1 m: must be > 0", field="tubes.length")

    jobs = [Job.build({"a": 1}, broken), Job.build({"a": 2}, bad_input),
            Job.build({"a": 3}, lambda: (_ for _ in ()).throw(ValueError("math domain")))]
    points = rate_points(jobs, executor=InlineExecutor())
    assert [p.status for p in points] == ["failed", REFUSED, "failed"]
    assert "fault in Ebullio" in points[0].message and "heating.kind" in points[0].message
    assert "fault" not in points[1].message and "tubes.length" in points[1].message
    assert "fault in Ebullio" in points[2].message and "math domain" in points[2].message


def test_a_point_as_data_reads_the_summary_without_serialising_the_profiles(pentane,
                                                                            monkeypatch):
    s = sweep(pentane, [Variation("tubes.length", (3.0,))], executor=InlineExecutor())
    point = s.points[0]

    def forbidden(self):
        raise AssertionError("Result.to_dict serialises every profile")

    monkeypatch.setattr(rating.results.Result, "to_dict", forbidden)
    data = point.to_dict(["duty_W", "exit_quality"])
    assert data["summary"] == {"duty_W": point.result.summary["duty_W"],
                               "exit_quality": point.result.summary["exit_quality"]}
    assert set(point.to_dict()["summary"]) == set(point.result.summary)


# --- bounds on a study -------------------------------------------------------------------

def test_a_cancel_stops_every_point_but_the_window():
    """However the threads are scheduled, no point is submitted after the cancel is seen,
    and before it no more than the window are unfinished: all 20 were submitted at once
    before (a pool's queued points could not be taken back)."""
    import concurrent.futures as cf

    from rating.studies import Job, rate_points

    submitted = []

    class Counting(cf.ThreadPoolExecutor):
        def submit(self, fn, /, *args, **kwargs):
            submitted.append(args)
            return super().submit(fn, *args, **kwargs)

    case = rating.load_project(SAMPLES / "pentane-vaporiser.ebullio").case(
        "C5 vaporiser V-12 performance")
    jobs = [Job({"n": n}, case) for n in range(20)]
    done, seen = [], []

    def cancel():
        if done and done[-1] >= 1:
            seen.append(len(submitted))
            return True
        return False

    with Counting(2) as threads:
        points = rate_points(jobs, executor=threads, cancel=cancel,
                             progress=lambda n, total: done.append(n))
        assert window_of(threads) == 2 * PER_WORKER
    assert len(submitted) == seen[0] <= done[-1] + 2 * PER_WORKER
    rated = [p for p in points if p.rated]
    assert 1 <= len(rated) <= len(submitted) < 20
    assert [p.status for p in points].count(CANCELLED) == 20 - len(rated)


def test_the_window_of_an_executor():
    class Unknown:
        pass

    class Client:
        def nthreads(self):
            return {"tcp://a:1": 4, "tcp://b:1": 8}

    class DaskLike:                  # distributed's ClientExecutor keeps its client here
        _client = Client()

    assert window_of(Unknown()) == 32
    assert window_of(DaskLike()) == PER_WORKER * 12


def test_a_sweep_larger_than_the_limit_is_refused_before_any_point_is_built(pentane,
                                                                            monkeypatch):
    built = []
    monkeypatch.setattr(catalogue, "draft_to_case", lambda d: built.append(d))
    big = [parse_variation("tubes.length=1:4:101"), parse_variation("heating.pressure=2e5:4e5:100")]
    with pytest.raises(InputError, match=f"101 x 100 = 10,100 points: a study rates at most "
                       f"{MAX_POINTS:,}"):
        sweep(pentane, big, executor=InlineExecutor(), cancel=lambda: True)
    with pytest.raises(InputError, match="at most 10,000"):
        envelope(pentane, *big, executor=InlineExecutor(), cancel=lambda: True)
    assert built == []


def test_a_two_input_point_is_built_and_validated_once(pentane, monkeypatch):
    """Both values are set on one draft and the case validated once: two validations a
    point before. Sweep points keep their summaries, not their profiles."""
    calls = []
    real = catalogue.draft_to_case
    monkeypatch.setattr(catalogue, "draft_to_case", lambda d: calls.append(1) or real(d))
    s = sweep(pentane, [Variation("tubes.length", (2.0, 3.0)),
                        Variation("heating.pressure", (2.5e5, 3e5, 3.5e5))],
              executor=InlineExecutor())
    assert len(calls) == 6 and all(p.rated for p in s.points)
    assert all(p.result.profiles == {} for p in s.points)
    alone = rating.rate(catalogue.with_value(catalogue.with_value(pentane, "tubes.length", 3.0),
                                             "heating.pressure", 3.5e5))
    assert s.points[-1].result.summary == alone.summary and alone.profiles


# --- the fit's scan, progress and cancel -------------------------------------------------

def test_fit_progress_is_done_and_an_unknown_total(chiller, plant):
    """DEVELOPERS.md's contract for every study: progress(done, total); a fit does not
    know its total (None) and its count only rises."""
    calls = []
    result = fit(chiller, [Measurement("heating_outlet_temperature_K",
                                       plant.summary["heating_outlet_temperature_K"], 0.1)],
                 [Parameter("boiling.fouling_resistance", 0.0, 2e-3)], executor=InlineExecutor(),
                 progress=lambda done, total: calls.append((done, total)))
    assert result.status == "fitted"
    assert calls and all(total is None for _, total in calls)
    assert [d for d, _ in calls] == sorted(d for d, _ in calls)
    assert calls[-1][0] == result.ratings


def test_a_refused_scan_point_does_not_discard_the_scan(chiller, plant):
    """The range reaches below zero, where a fouling resistance is refused, and the fit
    starts there: the scan's four points inside the range still give the start (before,
    one refused scan point threw the scan away and the fit failed at its refused start)."""
    result = fit(chiller, [Measurement("heating_outlet_temperature_K",
                                       plant.summary["heating_outlet_temperature_K"], 0.1)],
                 [Parameter("boiling.fouling_resistance", -5e-4, 2e-3, start=-5e-4)],
                 executor=InlineExecutor())
    assert result.status == "fitted", result.message
    assert result.values["boiling.fouling_resistance"] == pytest.approx(TRUE_FOULING, abs=1e-6)


def test_a_cancel_is_reported_as_cancelled_even_beside_a_failed_point(chiller, monkeypatch):
    """The pool hands back a failed point before the cancelled ones: the fit was stopped
    by the user, and says so, not that a rating failed."""
    from rating.studies import Point
    import importlib

    fit_module = importlib.import_module("rating.studies.fit")   # the package's fit is the function

    def stopped(jobs, **kw):
        return [Point(j.inputs, "failed", "dryout at the inlet", None, 0) if n == 0 else
                Point(j.inputs, CANCELLED, "cancelled before it was rated", None, n)
                for n, j in enumerate(jobs)]

    monkeypatch.setattr(fit_module, "rate_points", stopped)
    result = fit(chiller, [Measurement("duty_W", 4e4, 1e3)],
                 [Parameter("boiling.fouling_resistance", 0.0, 2e-3)], executor=InlineExecutor(),
                 cancel=lambda: True)
    assert result.status == "cancelled", result.message


def test_every_warning_code_the_envelope_reads_is_a_rule():
    # The envelope classifies points by warning codes; a code missing from the rule table
    # (renamed there) would make its limit read "within" everywhere, silently.
    import importlib
    import inspect
    import re

    from rating import rules

    envelope = importlib.import_module("rating.studies.envelope")  # the module, not the function

    assert envelope.CODES_READ <= set(rules.RULES)
    source = inspect.getsource(envelope)
    quoted = set(re.findall(r'"([a-z]+(?:-[a-z0-9]+)+)"', source))
    assert quoted <= envelope.CODES_READ | set(envelope.LIMITS), quoted - envelope.CODES_READ
