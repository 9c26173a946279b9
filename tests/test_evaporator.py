"""The in-tube evaporator, rated whole (layer 4 of the test plan).

The samples are scenarios of our own (invented numbers). What is checked against
something outside the project: the saturation temperature along the tube is the one
CoolProp's high-level interface (an independent call path) gives at the local
pressure; grid convergence; the area for the rated duty gives zero over-design.
"""
import dataclasses
import json
import math
from pathlib import Path

import CoolProp.CoolProp as CP
import pytest

import rating
from rating.case import BoilingStream, Case, HeatingMedium, Limits, Shell, Tubes
from rating.results import PROFILE_FIELDS, SUMMARY_KEYS

SAMPLES = Path(__file__).parent.parent / "samples"


def sample_cases():
    cases = []
    for path in sorted(SAMPLES.glob("*.ebullio")):
        cases.extend(rating.load_project(path).cases)
    return cases


@pytest.fixture(scope="module")
def rated():
    return {c.name: (c, rating.rate(c)) for c in sample_cases()}


def steam_case(**over):
    base = dict(
        name="steam-heated pentane",
        tubes=Tubes(count=120, length=3.0, outer_diameter=0.0254, bwg=14, pitch=0.03175),
        boiling=BoilingStream(fluid="n-Pentane", mass_flow=4.5, inlet_pressure=3.0e5,
                              inlet_temperature=335.0, fouling_resistance=1.76e-4),
        heating=HeatingMedium(kind="steam", fluid="Water", pressure=2.0e5,
                              fouling_resistance=8.8e-5))
    base.update(over)
    return Case(**base)


def test_there_are_samples_of_both_heating_kinds():
    kinds = {c.heating.kind for c in sample_cases()}
    assert kinds == {"steam", "liquid"}


def test_grid_convergence_on_every_sample(rated):
    for name, (case, r) in rated.items():
        n = r.extra["increments"]
        fine = rating.rate(case, increments=2 * n)
        assert abs(fine.summary["duty_W"] / r.summary["duty_W"] - 1) < 5e-3, name
        assert abs(fine.summary["exit_quality"] - r.summary["exit_quality"]) < 5e-3, name


def test_saturation_temperature_follows_the_local_pressure(rated):
    # Independent evaluation: CoolProp's high-level PropsSI at each station's pressure.
    case, r = rated["C5 vaporiser V-12 performance"]
    p, t_sat = r.profiles["p_Pa"], r.profiles["t_sat_K"]
    for P, T in list(zip(p, t_sat))[::5]:
        assert T == pytest.approx(CP.PropsSI("T", "P", P, "Q", 0, "n-Pentane"), abs=1e-6)
    assert p[-1] < p[0] and t_sat[-1] < t_sat[0]      # pressure falls, so does T_sat


def test_result_json_has_the_documented_keys(rated):
    case, r = rated["Chiller E-3 at design load"]
    d = json.loads(json.dumps(r.to_dict()))
    assert set(SUMMARY_KEYS) <= set(d["summary"])
    assert set(PROFILE_FIELDS) <= set(d["profiles"])
    lengths = {len(v) for v in d["profiles"].values()}
    assert len(lengths) == 1 and lengths.pop() >= 20
    assert {m["family"] for m in d["methods"]} >= {"flow_boiling", "tube_dryout", "void_fraction"}
    assert all(m["reference"] for m in d["methods"])
    for w in d["warnings"]:
        assert {"code", "severity", "message", "z_m"} <= set(w)
        assert set(w) <= {"code", "severity", "message", "z_m", "template", "values"}
        for v in w.get("values", {}).values():  # each value with its catalogue quantity
            assert set(v) == {"value", "quantity"}
    assert d["status"] in ("ok", "warnings", "failed")


def test_results_and_cases_pickle(rated):
    import pickle
    case, r = rated["Chiller E-3 at design load"]
    assert pickle.loads(pickle.dumps(case)) == case
    assert pickle.loads(pickle.dumps(r)).summary == r.summary


def test_dryout_is_found_warned_and_the_wall_temperature_jumps():
    r = rating.rate(steam_case(boiling=BoilingStream(
        fluid="n-Pentane", mass_flow=3.0, inlet_pressure=3.0e5, inlet_temperature=335.0)))
    z_d = r.summary["dryout_z_m"]
    assert z_d is not None and 0.0 < z_d < 3.0
    dry = [w for w in r.warnings if w.code == "dryout"]
    assert dry and dry[0].z_m == pytest.approx(z_d)
    z, tw, reg = r.profiles["z_m"], r.profiles["t_wall_inner_K"], r.profiles["regime"]
    before = max(t for zz, t, g in zip(z, tw, reg) if zz < z_d and g == "saturated boiling")
    after = min(t for zz, t, g in zip(z, tw, reg) if zz > z_d)
    assert after - before > 10.0            # the film is gone: the wall runs hot
    assert r.summary["max_chf_ratio"] >= 1.0       # dryout here is by the critical heat flux
    assert all(g in ("post-dryout", "superheated vapour") for zz, g in zip(z, reg) if zz > z_d)


def test_critical_quality_limit_moves_dryout_upstream():
    free = rating.rate(steam_case())
    limited = rating.rate(steam_case(limits=Limits(critical_quality=0.3)))
    assert free.summary["dryout_z_m"] is None or free.summary["dryout_z_m"] > 1.0
    z = limited.summary["dryout_z_m"]
    assert z is not None
    x_at = limited.profiles["quality"]
    i = next(k for k, zz in enumerate(limited.profiles["z_m"]) if zz >= z)
    assert x_at[i] >= 0.3 and (i == 0 or x_at[i - 1] < 0.3 + 0.05)
    assert "critical quality" in next(w.message for w in limited.warnings if w.code == "dryout")


def _pentane_on_steam(pressure, fouling=0.0):
    feed = BoilingStream(fluid="n-Pentane", mass_flow=14.0, inlet_pressure=3.0e5,
                         inlet_temperature=335.0, fouling_resistance=fouling)
    return rating.rate(steam_case(boiling=feed, heating=HeatingMedium(
        kind="steam", pressure=pressure, fouling_resistance=8.8e-5)))


def test_hotter_steam_gives_more_duty_while_the_wall_stays_wet():
    cold, hot = _pentane_on_steam(1.2e5, 1.76e-4), _pentane_on_steam(1.4e5, 1.76e-4)
    assert cold.summary["dryout_z_m"] is None and hot.summary["dryout_z_m"] is None
    assert hot.summary["duty_W"] > cold.summary["duty_W"] * 1.05
    assert hot.summary["exit_quality"] > cold.summary["exit_quality"]


def test_past_the_critical_heat_flux_hotter_steam_gives_less_duty():
    # The trade's warning (Sloley, Chemical Processing 2022; Hagan & Kruglov, CEP 2010):
    # raising the driving temperature past the critical heat flux moves dryout upstream
    # and the duty falls. Here (clean tubes) dryout moves from 2.6 m to 1.1 m.
    mild, hot = _pentane_on_steam(1.6e5), _pentane_on_steam(3.0e5)
    assert mild.summary["dryout_z_m"] is not None and hot.summary["dryout_z_m"] is not None
    assert hot.summary["dryout_z_m"] < mild.summary["dryout_z_m"] - 0.5
    assert hot.summary["duty_W"] < mild.summary["duty_W"]


def test_area_for_duty_at_the_rated_duty_has_no_over_design():
    perf = rating.rate(steam_case())
    check = rating.rate(steam_case(question="area_for_duty", required_duty=perf.summary["duty_W"]))
    assert check.summary["over_design_pct"] == pytest.approx(0.0, abs=1.0)
    half = rating.rate(steam_case(question="area_for_duty",
                                  required_duty=0.5 * perf.summary["duty_W"]))
    assert half.summary["over_design_pct"] > 50.0
    assert half.summary["duty_W"] == pytest.approx(0.5 * perf.summary["duty_W"], rel=1e-6)


def test_duty_beyond_reach_is_an_error_not_an_exception():
    r = rating.rate(steam_case(question="area_for_duty", required_duty=5e7))
    assert any(w.code == "duty-not-reached" and w.severity == "error" for w in r.warnings)
    assert r.summary["over_design_pct"] is None


def test_vertical_tube_carries_the_static_head():
    # Subcooled single-phase water: the vertical tube's pressure drop exceeds the
    # horizontal one's by rho g L (liquid head, 958 kg/m3 near 100 degC).
    def case(orientation):
        return Case(name=orientation,
                    tubes=Tubes(count=50, length=4.0, outer_diameter=0.0254, bwg=14,
                                orientation=orientation),
                    boiling=BoilingStream(fluid="Water", mass_flow=10.0, inlet_pressure=5e5,
                                          inlet_temperature=300.0),
                    heating=HeatingMedium(kind="steam", pressure=6e5))
    v, h = rating.rate(case("vertical")), rating.rate(case("horizontal"))
    assert set(v.profiles["regime"]) == {"subcooled liquid"}
    head = v.summary["pressure_drop_boiling_Pa"] - h.summary["pressure_drop_boiling_Pa"]
    # Independent: the liquid density from CoolProp's PropsSI along the heated tube.
    z, T, P = v.profiles["z_m"], v.profiles["t_process_K"], v.profiles["p_Pa"]
    rho = [CP.PropsSI("D", "P", p, "T", t, "Water") for p, t in zip(P, T)]
    expected = sum(0.5 * (a + b) * (z2 - z1) for a, b, z1, z2 in zip(rho, rho[1:], z, z[1:]))
    assert head == pytest.approx(expected * 9.80665, rel=0.01)


def test_co_and_counter_current_liquid_heating_both_close():
    def case(arrangement):
        return Case(name=arrangement,
                    tubes=Tubes(count=60, length=3.0, outer_diameter=0.01905, bwg=16,
                                pitch=0.0254),
                    shell=Shell(inner_diameter=0.30, baffle_spacing=0.25),
                    boiling=BoilingStream(fluid="R134a", mass_flow=0.8, inlet_pressure=4.0e5,
                                          inlet_quality=0.1),
                    heating=HeatingMedium(kind="liquid", fluid="INCOMP::MEG-30%",
                                          pressure=3e5, inlet_temperature=300.0, mass_flow=4.0,
                                          flow_arrangement=arrangement))
    co, counter = rating.rate(case("co")), rating.rate(case("counter"))
    for r in (co, counter):
        assert r.status != "failed", r.message
        s = r.summary
        assert abs(s["duty_W"] - s["duty_heating_side_W"]) / s["duty_W"] < 1e-4
    # The heating medium leaves at z = 0 in counter-current flow: its profile falls toward z = 0.
    t_h = counter.profiles["t_heating_K"]
    assert t_h[-1] == pytest.approx(300.0, abs=0.01) and t_h[0] < t_h[-1]
    assert co.profiles["t_heating_K"][0] == pytest.approx(300.0, abs=1e-3)


def test_progress_and_cancel():
    seen = []
    r = rating.rate(steam_case(), progress=seen.append)
    assert r.status != "failed" and seen and seen[-1] == pytest.approx(1.0)
    calls = []
    r = rating.rate(steam_case(), cancel=lambda: calls.append(1) or len(calls) > 5)
    assert r.status == "cancelled" and "cancel" in r.message


def test_steam_film_follows_the_local_condensate_film():
    # Vertical tubes on steam: the film is thinnest at the top (z = L), so the local
    # coefficient is largest there; integrated over the tube it must agree with the
    # mean form of the same laws at the bottom film Reynolds number (Kutateladze
    # 1963 / Labuntsov 1957 as nusselt_kutateladze_labuntsov_mean), an independent
    # closed form. Bound 5 %: the mean form assumes a uniform film temperature drop.
    from rating.correlations import registry
    from rating.properties import make_fluid
    r = rating.rate(steam_case(heating=HeatingMedium(kind="steam", pressure=2.0e5)))
    p = r.profiles
    assert p["htc_heating_W_m2K"][-1] > 1.5 * p["htc_heating_W_m2K"][0]
    sat = make_fluid("Water").saturation(2.0e5)
    case = steam_case()
    perimeter = case.tubes.count * math.pi * case.tubes.outer_diameter
    Re_bottom = 4.0 * r.summary["duty_W"] / (sat.h_lv * perimeter * sat.mu_l)
    mean = registry.get("nusselt_kutateladze_labuntsov_mean").function(
        Re_bottom, sat.rho_l, sat.rho_v, sat.mu_l, sat.k_l, sat.cp_l)
    z, dT = p["z_m"], [th - tw for th, tw in zip(p["t_heating_K"], p["t_wall_outer_K"])]
    dT_mean = sum(0.5 * (a + b) * (z2 - z1) for a, b, z1, z2 in zip(dT, dT[1:], z, z[1:])) / z[-1]
    effective = r.summary["duty_W"] / (case.tubes.outer_area * dT_mean)
    assert effective == pytest.approx(mean, rel=0.05)


def test_rating_in_worker_threads_gives_the_same_results(rated):
    # Cases are immutable and each thread gets its own property objects, so ratings in
    # an executor (the GUI's worker, a batch run) equal the ones made here.
    from concurrent.futures import ThreadPoolExecutor
    cases = [c for c, _ in rated.values()]
    with ThreadPoolExecutor(max_workers=2) as pool:
        results = list(pool.map(rating.rate, cases))
    for case, r in zip(cases, results):
        assert r.summary == rated[case.name][1].summary, case.name


def test_shell_side_coefficient_between_its_nodes_is_within_1e_4_of_bell_delaware():
    # The liquid heating medium's shell-side coefficient is interpolated between nodes
    # HTC_GRID apart (speed, issue 10); against Bell-Delaware evaluated at the temperature
    # itself (the same method on the property library's properties) over 40 K below the
    # inlet of every liquid-heated sample.
    from rating.exchangers.tube_boiling import heating_side

    project_files = sorted((Path(__file__).resolve().parent.parent / "samples").glob("*.ebullio"))
    checked = 0
    for path in project_files:
        for case in rating.load_project(path).cases:
            if case.type == "kettle" or case.heating.kind == "steam":
                continue
            side, _ = heating_side(case)
            T_in = case.heating.inlet_temperature
            for i in range(81):
                T = T_in - 40.0 + 0.5 * i + 0.137     # between nodes
                try:
                    exact = side.shell_result(T).htc
                except rating.PropertyError:          # below the medium's data
                    continue
                assert side._htc(T) == pytest.approx(exact, rel=1e-4), (case.name, T)
                checked += 1
    assert checked > 200
