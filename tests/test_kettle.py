"""The kettle reboiler, rated whole (rating/exchangers/kettle.py and bundle_pool.py, the
tube-side path rating/pool_march.py).

Checked against things outside the project: the Wolverine Engineering Data Book's
kettle design example (bundle factor, maximum flux, mixture factor, coefficient and
area, and the test unit's measured coefficient); Incropera's peak flux of water at
1 atm; Palen's geometry factor in its published form; Sinnott's tube count of a
published kettle; the static head from CoolProp's high-level interface and
geometry in closed form; Sinnott's entrainment velocity (CHECK-VALUES 9). And
trends, the energy balance between two independently computed sides, grid
convergence, and the input refusals.
"""
import dataclasses
import math
from pathlib import Path

import CoolProp.CoolProp as CP
import pytest

import rating
from rating.case import (BoilingStream, Case, HeatingMedium, KettleShell, Limits, Methods, Shell,
                         Tubes)
from rating.errors import InputError
from rating.exchangers.kettle import band_centroids, estimate_tube_count, single_tube_max_flux

SAMPLE = Path(__file__).parent.parent / "samples" / "harrow-creek-kettles.ebullio"

# Unit conversions of CHECK-VALUES.md.
BTU_FT2 = 3.154591      # W/m^2 per Btu/(h ft^2)
BTU_FT2_F = 5.678263    # W/m^2/K per Btu/(h ft^2 F)
BTU_H = 0.29307107      # W per Btu/h
PSI = 6894.757          # Pa per psi
FT = 0.3048             # m
INCH = 0.0254           # m
G = 9.80665


@pytest.fixture(scope="module")
def samples():
    cases = rating.load_project(SAMPLE).cases
    return {c.name: (c, rating.rate(c)) for c in cases}


def steam_kettle(**over):
    """The sample's pentane reboiler E-21 (steam behind a trap), with changes."""
    case = rating.load_project(SAMPLE).cases[0]
    return dataclasses.replace(case, **over)


def codes(result):
    return [w.code for w in result.warnings]


# --------------------------------------------------------------- published example

#: Wolverine Tube Engineering Data Book II, ch. 5.10.1, kettle reboiler design example:
#: 43.3e6 Btu/h to a hydrocarbon mixture at 170 psia (P_c 434 psia, boiling range
#: 60 F, 330 F) from steam at 395 F (dT = 65 F); 3/4 in tubes on a 1.125 in square
#: pitch, 180 U-tubes (360 ends) in a 2 ft bundle; steam film 2000 and wall 4800
#: Btu/h ft^2 F, clean. Book: F_m = 0.41, q1max = 160,488, Phi_b = 0.1956,
#: q_b,max = 31,392, h_b = 580.1, U = 411.2, q = 26,730 Btu/h ft^2, length 22.8 ft;
#: the test unit's measured coefficient was 440 Btu/h ft^2 F.
WOLVERINE_DUTY = 43.3e6 * BTU_H
WOLVERINE_AREA = 43.3e6 / 26730 * FT ** 2       # the book's area at its flux [m^2]


def wolverine_case():
    # A pure surrogate for the mixture: n-hexane, P_c 441.5 psia (book 434), at the
    # book's 170 psia; the book's boiling range enters as KettleShell.boiling_range.
    P = 170 * PSI
    T_sat = CP.PropsSI("T", "P", P, "Q", 0, "n-Hexane")
    P_steam = CP.PropsSI("P", "T", T_sat + 65 / 1.8, "Q", 1, "Water")
    d_o, wall = 0.75 * INCH, 2.108e-3          # BWG 14
    d_i = d_o - 2 * wall
    h_lv = CP.PropsSI("H", "P", P, "Q", 1, "n-Hexane") - CP.PropsSI("H", "P", P, "Q", 0, "n-Hexane")
    return Case(
        name="Wolverine kettle example", type="kettle",
        tubes=Tubes(count=360, length=22.8 * FT, outer_diameter=d_o, wall_thickness=wall, passes=2,
                    orientation="horizontal", pitch=1.125 * INCH, layout_angle=90,
                    # the book's wall coefficient 4800 Btu/h ft^2 F on the outer area
                    wall_conductivity=d_o * math.log(d_o / d_i) / 2 * 4800 * BTU_FT2_F),
        boiling=BoilingStream("n-Hexane", 1.25 * WOLVERINE_DUTY / h_lv, P),
        heating=HeatingMedium(kind="steam", pressure=P_steam),
        methods=Methods(nucleate_boiling="mostinski_1963"),
        kettle=KettleShell(kettle_diameter=1.1, port_diameter=2 * FT + 0.05, bundle_diameter=2 * FT,
                           weir_height=2 * FT + 0.1, boiling_range=60 / 1.8,
                           # the book's steam film 2000 Btu/h ft^2 F on the outer area
                           heating_htc=2000 * BTU_FT2_F * d_o / d_i),
        question="area_for_duty", required_duty=WOLVERINE_DUTY)


@pytest.fixture(scope="module")
def wolverine():
    return rating.rate(wolverine_case())


def test_wolverine_kettle_example_required_area(wolverine):
    """The required area within 8 % of the book's 1,620 ft^2 (43.3e6 / 26,730).

    Bound: the method is the book's (Mostinski in Palen's form x F_m x F_b 1.5 plus
    natural convection, the same steam and wall resistances), with two documented
    departures of opposite sign: the SI Mostinski constant 0.00417 is 5.5 % below the
    book's 0.00658 (psia) (tests/test_pool_boiling.py), worth about 2 % of area, and
    natural convection is computed (Churchill & Chu, about 95 Btu/h ft^2 F here)
    where the book assumed 40 for want of data, about 6 % of area. The book also
    took h_nb at an assumed 28,600 instead of the flux it found (26,730). Either
    departure alone stays within 8 %.
    """
    s = wolverine.summary
    assert wolverine.status != "failed", wolverine.message
    deviation = s["required_area_m2"] / WOLVERINE_AREA - 1
    print(f"\nWolverine kettle example: required area {s['required_area_m2']:.2f} m^2 against "
          f"the book's {WOLVERINE_AREA:.2f} m^2, deviation {100 * deviation:+.2f} %; U "
          f"{s['u_service_W_m2K'] / BTU_FT2_F:.1f} Btu/h ft^2 F (book 411.2, test unit 440)")
    assert abs(deviation) < 0.08
    # the same tubes rated for performance: the book's length is within 1 % of enough
    assert s["over_design_pct"] == pytest.approx(0.0, abs=8.0)


def test_wolverine_kettle_example_coefficient_against_book_and_test_unit(wolverine):
    s = wolverine.summary
    U = s["u_service_W_m2K"] / BTU_FT2_F
    # the book's prediction 411.2 (same bound as the area) ...
    assert U == pytest.approx(411.2, rel=0.08)
    # ... and the measured 440 of the test unit, which the book's own prediction
    # missed by 7 %: ours within 10 %
    assert U == pytest.approx(440.0, rel=0.10)
    # uniform steam-side resistance: the flux is the average, q = U dT (book step 9)
    q = s["mean_heat_flux_W_m2"] / BTU_FT2
    assert q == pytest.approx(U * 65.0, rel=0.01)


def test_wolverine_bundle_coefficient_follows_the_book_equation(wolverine):
    """Step 9: h_b = h_nb F_m F_b + h_nc with h_nb = A* F(P) q^0.7 (book eq. 5.8),
    A* = 0.00658 P_c^0.69 [psia, Btu/h ft^2 F], F(P) = 1.8 p_r^0.17, F_m = 0.41, F_b 1.5.

    Evaluated here in the book's units at the local flux the rating found, with the
    SI constant 0.00417 that Ebullio pins (5.5 % below the book's, test_pool_boiling).
    """
    q = wolverine.profiles["heat_flux_W_m2"][0] / BTU_FT2
    P = wolverine.profiles["p_Pa"][0] / PSI     # 170 psia plus the liquid head over the pass
    Pc = CP.PropsSI("pcrit", "n-Hexane") / PSI
    c_book_si = 0.00658 * BTU_FT2_F / ((PSI / 1000) ** 0.69 * BTU_FT2 ** 0.7)
    h_nb = 0.00417 / c_book_si * 0.00658 * Pc ** 0.69 * 1.8 * (P / Pc) ** 0.17 * q ** 0.7
    expected = h_nb * math.exp(-0.015 * 60) * 1.5
    assert wolverine.profiles["htc_nucleate_W_m2K"][0] / BTU_FT2_F == pytest.approx(expected,
                                                                                    rel=1e-4)
    h_b = wolverine.profiles["htc_boiling_W_m2K"][0] / BTU_FT2_F
    h_nc = wolverine.profiles["htc_convective_W_m2K"][0] / BTU_FT2_F
    assert h_b == pytest.approx(expected + h_nc, rel=1e-9)
    print(f"\nWolverine step 9: h_b = {expected:.1f} + {h_nc:.1f} = {h_b:.1f} Btu/h ft^2 F "
          "(book 540.1 + 40 = 580.1)")


def test_wolverine_bundle_factor_maximum_flux_and_mixture_factor(wolverine):
    s = wolverine.summary
    # step 6: Phi_b = 2.2 D_b L / (N d_o L) = 2.2 x 24 / (360 x 0.75) = 0.1956
    assert s["bundle_factor"] == pytest.approx(0.1956, rel=1e-3)
    # steps 4 and 6 in the published units (Btu/h ft^2, psia) with the surrogate's P_c:
    # q_b = 803 P_c p_r^0.35 (1 - p_r)^0.9 Phi_b
    Pc = CP.PropsSI("pcrit", "n-Hexane") / PSI
    p_r = 170 / Pc
    q_b = 803 * Pc * p_r ** 0.35 * (1 - p_r) ** 0.9 * (2.2 * 24 / (360 * 0.75))
    assert s["bundle_max_heat_flux_W_m2"] / BTU_FT2 == pytest.approx(q_b, rel=1e-6)
    # with the book's P_c of 434 psia this form gives the book's 31,392 (step 6)
    book = 803 * 434 * (170 / 434) ** 0.35 * (1 - 170 / 434) ** 0.9 * 0.1956
    assert book == pytest.approx(31392, rel=1e-3)
    # step 2: F_m = exp(-0.015 x 60) = 0.41
    assert s["mixture_factor"] == pytest.approx(0.41, rel=0.01)
    # step 10: the flux is below the bundle maximum and Phi_b > 0.1: no warning
    assert s["mean_heat_flux_W_m2"] < s["bundle_max_heat_flux_W_m2"]
    assert not {"bundle-flux-limit", "bundle-factor-small"} & set(codes(wolverine))
    # the book's 360 ends in 2 ft come from the approximate count pi D_b^2 / (4 p_t^2);
    # the exact layout holds fewer, which is reported
    assert "tube-count" in codes(wolverine)


# ------------------------------------------------------------ maximum flux, single tube

def test_single_tube_maximum_flux_water_at_1_atm():
    """Palen's q1,max against the published peak flux of water at 1 atm.

    Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, Example 10.1:
    1.26 MW/m^2 (CHECK-VALUES 3a). Palen's reduced-pressure form (after Mostinski)
    gives 1.227 MW/m^2; bound 5 %.
    """
    P_crit = CP.PropsSI("pcrit", "Water")
    q1 = single_tube_max_flux(101325.0, P_crit)
    print(f"\nsingle-tube maximum flux, water 1 atm: {q1:.4g} W/m^2, "
          f"{100 * (q1 / 1.26e6 - 1):+.2f} % from Incropera's 1.26e6")
    assert q1 == pytest.approx(1.26e6, rel=0.05)
    # a sparse water kettle (Phi_b capped at 1) reports the same as its bundle maximum
    r = rating.rate(Case(
        name="water pot", type="kettle",
        tubes=Tubes(count=4, length=1.0, outer_diameter=0.0254, bwg=14, passes=2,
                    orientation="horizontal", pitch=0.1),
        boiling=BoilingStream("Water", 1.0, 101325.0),
        heating=HeatingMedium(kind="steam", pressure=1.5e5),
        kettle=KettleShell(kettle_diameter=0.8, port_diameter=0.5, bundle_diameter=0.45,
                           weir_height=0.6)))
    assert r.summary["bundle_factor"] == 1.0
    assert r.summary["bundle_max_heat_flux_W_m2"] == pytest.approx(q1, rel=1e-12)


def test_bundle_correction_has_its_published_form(samples):
    # Palen: Phi_b = 2.2 pi D_b L / A, A the outer area over the length L.
    for case, r in samples.values():
        t, k = case.tubes, case.kettle
        phi = 2.2 * math.pi * k.bundle_diameter * t.length / (t.count * math.pi * t.outer_diameter
                                                               * t.length)
        assert r.summary["bundle_factor"] == pytest.approx(phi, rel=1e-12)
        assert r.summary["bundle_max_heat_flux_W_m2"] == pytest.approx(
            phi * r.summary["single_tube_max_heat_flux_W_m2"], rel=1e-12)


def test_more_tubes_in_the_same_bundle_lower_the_bundle_maximum_flux():
    base = steam_kettle()
    for method in ("palen_1983", "palen_small_1964"):
        fluxes = []
        for count in (80, 120, 160):
            case = dataclasses.replace(
                base, tubes=dataclasses.replace(base.tubes, count=count),
                kettle=dataclasses.replace(base.kettle, bundle_max_flux=method))
            fluxes.append(rating.rate(case).summary["bundle_max_heat_flux_W_m2"])
        assert fluxes[0] > fluxes[1] > fluxes[2], method
    # Palen's is inversely proportional to the count, Palen & Small's to its root
    # (independent: the formulas' exponents)
    assert fluxes[0] / fluxes[2] == pytest.approx(math.sqrt(2), rel=1e-9)


def test_small_bundle_factor_asks_for_vapour_lanes():
    # 1/2 in tubes on a 16 mm pitch filling a 1 m bundle: Phi_b = 2.2 D_b / (N d_o) < 0.1
    base = steam_kettle()
    dense = dataclasses.replace(
        base, tubes=dataclasses.replace(base.tubes, count=2920, outer_diameter=0.0127,
                                        pitch=0.016, bwg=18),
        boiling=dataclasses.replace(base.boiling, mass_flow=150.0),
        kettle=dataclasses.replace(base.kettle, bundle_diameter=1.0, port_diameter=1.06,
                                   kettle_diameter=1.8, weir_height=1.1))
    r = rating.rate(dense)
    assert r.summary["bundle_factor"] == pytest.approx(2.2 * 1.0 / (2920 * 0.0127), rel=1e-12)
    assert r.summary["bundle_factor"] < 0.1
    w = next(w for w in r.warnings if w.code == "bundle-factor-small")
    assert "vapour lanes or a wider pitch" in w.message


# ----------------------------------------------------------------------------- trends

def test_hotter_heating_medium_raises_duty_until_the_flux_limit_warning():
    base = steam_kettle(boiling=dataclasses.replace(steam_kettle().boiling, mass_flow=40.0))
    duties, warned = [], []
    for P in (1.4e5, 2e5, 3e5, 4.5e5, 7e5):
        r = rating.rate(dataclasses.replace(base, heating=dataclasses.replace(base.heating,
                                                                              pressure=P)))
        duties.append(r.summary["duty_W"])
        warned.append("bundle-flux-limit" in codes(r))
    assert all(b > a * 1.05 for a, b in zip(duties, duties[1:]))
    assert warned[0] is False and warned[-1] is True
    first = warned.index(True)
    assert all(warned[first:])          # once past the limit it stays past


def test_a_lower_weir_that_uncovers_tubes_is_warned_about():
    base = steam_kettle()
    k = base.kettle
    low = rating.rate(dataclasses.replace(base, kettle=dataclasses.replace(
        k, weir_height=k.bundle_top - 0.2)))
    w = next(w for w in low.warnings if w.code == "bundle-uncovered")
    assert "uncovered" in w.message and low.summary["liquid_level_over_bundle_m"] < 0.0
    high = rating.rate(base)
    assert "bundle-uncovered" not in codes(high)
    assert high.summary["liquid_level_over_bundle_m"] > 0.0
    # less head over the bundle: the bottom pass boils cooler, the duty is higher
    assert low.summary["duty_W"] > high.summary["duty_W"]


def test_boiling_range_lowers_the_duty_and_pure_fluid_has_no_correction(samples):
    case, pure = samples["Harrow Creek C5 reboiler E-21 on LP steam"]
    assert pure.summary["mixture_factor"] == 1.0
    assert "mixture" not in {m.family for m in pure.methods}
    mixed = rating.rate(dataclasses.replace(case, kettle=dataclasses.replace(case.kettle,
                                                                             boiling_range=10.0)))
    # Palen & Small exp(-0.015 BR[F]) = exp(-0.027 BR[K])
    assert mixed.summary["mixture_factor"] == pytest.approx(math.exp(-0.015 * 18.0), rel=1e-12)
    assert mixed.summary["duty_W"] < pure.summary["duty_W"]
    assert "mixture" in {m.family for m in mixed.methods}


# ------------------------------------------------------ balances, convergence, samples

def test_energy_balance_closes_on_every_sample(samples):
    for name, (case, r) in samples.items():
        s = r.summary
        assert r.status == "ok", (name, r.message, r.warnings)
        assert abs(s["duty_W"] - s["duty_heating_side_W"]) / s["duty_W"] < 1e-4, name


def test_grid_convergence_on_every_sample(samples):
    for name, (case, r) in samples.items():
        n = r.extra["increments"]
        fine = rating.rate(case, increments=2 * n)
        key = "performance_duty_W" if case.question == "area_for_duty" else "duty_W"
        assert abs(fine.summary[key] / r.summary[key] - 1) < 5e-3, name
        if case.question == "area_for_duty":
            assert abs(fine.summary["required_area_m2"] / r.summary["required_area_m2"] - 1) < 5e-3


def test_steam_trap_condenses_all_the_steam(samples):
    # Independent: the latent heat of steam at its pressure from CoolProp's PropsSI.
    case, r = samples["Harrow Creek C5 reboiler E-21 on LP steam"]
    P = case.heating.pressure
    h_lv = CP.PropsSI("H", "P", P, "Q", 1, "Water") - CP.PropsSI("H", "P", P, "Q", 0, "Water")
    # the trap's steam leaves with a quality of 0.2 +- 0.1 % (kettle.TRAP_EXIT_QUALITY)
    x_out = r.summary["heating_outlet_quality"]
    assert 0.0 < x_out < 3e-3
    assert r.summary["steam_flow_kg_s"] * h_lv * (1 - x_out) == pytest.approx(
        r.summary["duty_W"], rel=1e-9)
    assert r.summary["steam_flow_kg_s"] * h_lv == pytest.approx(r.summary["duty_W"], rel=3e-3)
    x = r.profiles["heating_quality"]
    assert x[0] == pytest.approx(1.0) and all(b <= a for a, b in zip(x, x[1:]))


def test_hot_water_balance_from_coolprop(samples):
    # Independent: m (h_in - h_out) of the water from PropsSI at the two temperatures.
    case, r = samples["Harrow Creek propane vaporiser E-14 on hot water, area for duty"]
    hm = case.heating
    h_in = CP.PropsSI("H", "P", hm.pressure, "T", hm.inlet_temperature, "Water")
    T_out = r.summary["heating_outlet_temperature_K"]
    h_out = CP.PropsSI("H", "P", hm.pressure, "T", T_out, "Water")
    assert hm.mass_flow * (h_in - h_out) == pytest.approx(r.summary["duty_W"], rel=1e-5)
    assert r.summary["duty_W"] == pytest.approx(case.required_duty, rel=1e-6)
    # the performance rating of the same unit does more, so the over-design is positive
    assert r.summary["performance_duty_W"] > case.required_duty
    assert r.summary["over_design_pct"] == pytest.approx(
        100 * (r.summary["area_m2"] / r.summary["required_area_m2"] - 1), rel=1e-12)


def test_static_head_over_the_passes(samples):
    """Each pass boils at the saturation pressure plus the liquid head over its band.

    Independent: the two passes of a U-tube bundle are half discs with centroids
    +-4R/(3 pi) from the centre; the saturated liquid density from PropsSI.
    """
    case, r = samples["Harrow Creek C5 reboiler E-21 on LP steam"]
    k, P_v = case.kettle, case.boiling.inlet_pressure
    rho_l = CP.PropsSI("D", "P", P_v, "Q", 0, "n-Pentane")
    R = k.bundle_diameter / 2
    for pass_no, y in ((1, 4 * R / (3 * math.pi)), (2, -4 * R / (3 * math.pi))):
        depth = k.weir_height - (k.port_diameter / 2 + y)
        P = [p for p, n in zip(r.profiles["p_Pa"], r.profiles["tube_pass"]) if n == pass_no]
        T = [t for t, n in zip(r.profiles["t_sat_K"], r.profiles["tube_pass"]) if n == pass_no]
        assert P[0] == pytest.approx(P_v + rho_l * G * depth, rel=1e-6)
        assert T[0] == pytest.approx(CP.PropsSI("T", "P", P[0], "Q", 0, "n-Pentane"), abs=1e-6)
    assert r.summary["static_head_over_bundle_Pa"] == pytest.approx(
        rho_l * G * (k.weir_height - k.bundle_bottom), rel=1e-6)
    assert r.summary["pressure_drop_boiling_Pa"] is None     # a pool has no flow loss
    assert band_centroids(1.0, 3)[1] == pytest.approx(0.0, abs=1e-12)   # symmetric middle band


def test_profiles_and_summary_keys(samples):
    from rating.results import PROFILE_FIELDS, SUMMARY_KEYS
    case, r = samples["Harrow Creek C5 reboiler E-21 on LP steam"]
    d = r.to_dict()
    assert set(SUMMARY_KEYS) <= set(d["summary"])
    for key in ("bundle_max_heat_flux_W_m2", "bundle_factor", "vapour_flow_kg_s",
                "surface_vapour_velocity_m_s", "surface_vapour_velocity_limit_m_s",
                "min_kettle_diameter_m"):
        assert isinstance(d["summary"][key], float), key
    assert set(PROFILE_FIELDS) | {"tube_pass", "heating_quality"} <= set(d["profiles"])
    lengths = {len(v) for v in r.profiles.values()}
    assert len(lengths) == 1
    # the pool quality runs from the feed's (subcooled: negative) to the exit quality
    x = r.profiles["quality"]
    assert x[0] < 0.0 and x[-1] == pytest.approx(r.summary["exit_quality"], rel=1e-12)
    # the path is passes x length, with two stations where the passes meet
    z = r.profiles["z_m"]
    assert z[-1] == pytest.approx(case.tubes.passes * case.tubes.length)
    assert sum(1 for a, b in zip(z, z[1:]) if b == a) == case.tubes.passes - 1
    assert d["summary"]["dryout_z_m"] is None


def test_entrainment_velocity_and_the_smallest_kettle(samples):
    case, r = samples["Harrow Creek C5 reboiler E-21 on LP steam"]
    # CHECK-VALUES 9 (Sinnott, [memory]; values computed): n-pentane at 3 bar, 1.64 m/s
    assert r.summary["surface_vapour_velocity_limit_m_s"] == pytest.approx(1.64, rel=0.01)
    # a shell too small for the vapour: warned, with a diameter that would do
    tight = dataclasses.replace(
        case, limits=Limits(kettle_min_freeboard=0.0),
        boiling=dataclasses.replace(case.boiling, mass_flow=40.0),
        heating=dataclasses.replace(case.heating, pressure=4.5e5),
        kettle=dataclasses.replace(case.kettle, kettle_diameter=0.72))
    small = rating.rate(tight)
    assert "entrainment" in codes(small)
    d_min = small.summary["min_kettle_diameter_m"]
    assert d_min > tight.kettle.kettle_diameter
    # rated again at that diameter, the surface velocity is at the limit: u = m_v /
    # (rho_v w L) with the chord w of the level (weir plus crest) in the new shell
    fit = rating.rate(dataclasses.replace(tight, kettle=dataclasses.replace(
        tight.kettle, kettle_diameter=d_min)))
    assert fit.summary["surface_vapour_velocity_m_s"] == pytest.approx(
        fit.summary["surface_vapour_velocity_limit_m_s"], rel=1e-6)


def test_vapour_nozzle_rho_v2(samples):
    case, r = samples["Harrow Creek C5 reboiler E-21 on LP steam"]
    P = case.boiling.inlet_pressure
    rho_v = CP.PropsSI("D", "P", P, "Q", 1, "n-Pentane")
    d = case.kettle.vapour_nozzle_diameter
    v = r.summary["vapour_flow_kg_s"] / (rho_v * math.pi * d ** 2 / 4)
    assert r.summary["vapour_outlet_rho_v2_kg_m_s2"] == pytest.approx(rho_v * v ** 2, rel=1e-6)
    narrow = rating.rate(dataclasses.replace(case, kettle=dataclasses.replace(
        case.kettle, vapour_nozzle_diameter=0.15)))
    assert "nozzle-rho-v2" in codes(narrow)


def test_too_little_feed_boils_dry():
    # the duty would boil off more than the feed: a failed rating, no usable numbers
    base = steam_kettle()
    r = rating.rate(dataclasses.replace(base, boiling=dataclasses.replace(base.boiling,
                                                                          mass_flow=5.0)))
    assert r.status == "failed" and r.summary["exit_quality"] is None
    w = next(w for w in r.warnings if w.code == "feed-boiled-dry")
    assert w.severity == "error" and "feed 5 kg/s" in w.message


def test_given_steam_flow_may_flood_or_blow_through():
    base = steam_kettle()
    trap = rating.rate(base)
    m = trap.summary["steam_flow_kg_s"]
    for factor, code in ((0.7, "condensate-flooding"), (1.5, "steam-blow-through")):
        r = rating.rate(dataclasses.replace(base, heating=dataclasses.replace(
            base.heating, mass_flow=factor * m)))
        assert code in codes(r), factor
        s = r.summary
        assert abs(s["duty_W"] - s["duty_heating_side_W"]) < 1e-4 * s["duty_W"]
    # flooded: the condensate leaves below the steam temperature
    flooded = rating.rate(dataclasses.replace(base, heating=dataclasses.replace(
        base.heating, mass_flow=0.7 * m)))
    T_trap = trap.summary["heating_outlet_temperature_K"]
    assert flooded.summary["heating_outlet_temperature_K"] < T_trap - 1.0


def test_tube_count_estimate_against_a_published_kettle():
    # Sinnott's kettle vaporiser, Coulson & Richardson Vol. 6 (n-butane at 5.84 bar), as
    # specified in msubbu.in "Ex-2 Kettle Type Reboiler": 26 U-tubes (52 tube holes),
    # 30 mm tubes on a 45 mm square pitch, bundle diameter 420 mm.
    assert estimate_tube_count(0.420, 0.030, 0.045, 90, 2) == 52
    # used in a rating: the count is replaced and said so
    base = steam_kettle(kettle=dataclasses.replace(steam_kettle().kettle, estimate_tube_count=True))
    r = rating.rate(base)
    n = estimate_tube_count(base.kettle.bundle_diameter, base.tubes.outer_diameter,
                            base.tubes.pitch, 90, 2)
    assert r.summary["tube_count"] == n - n % 2
    assert r.summary["area_m2"] == pytest.approx((n - n % 2) * math.pi * 0.0254 * 3.5, rel=1e-12)
    assert any(w.code == "tube-count" and w.severity == "info" for w in r.warnings)


def test_nucleate_methods_all_rate():
    from rating.correlations import registry
    base = steam_kettle()
    for m in registry.methods("nucleate_boiling"):
        case = dataclasses.replace(base, methods=dataclasses.replace(base.methods,
                                                                     nucleate_boiling=m.name))
        r = rating.rate(case)
        assert r.status != "failed", (m.name, r.message)
        assert r.summary["duty_W"] > 0 and abs(
            r.summary["duty_W"] - r.summary["duty_heating_side_W"]) < 1e-4 * r.summary["duty_W"]


def test_progress_and_cancel():
    seen = []
    r = rating.rate(steam_kettle(), progress=seen.append)
    assert r.status != "failed" and seen and seen[-1] == pytest.approx(1.0)
    assert all(0.0 <= f <= 1.0 for f in seen)
    calls = []
    r = rating.rate(steam_kettle(), cancel=lambda: calls.append(1) or len(calls) > 5)
    assert r.status == "cancelled" and "cancel" in r.message


def test_cli_prints_the_kettle_keys(capsys):
    from rating import cli
    code = cli.main([str(SAMPLE)])
    out = capsys.readouterr().out
    assert code == 0
    from rating.catalogue import SUMMARY
    for key in ("bundle_max_heat_flux_W_m2", "bundle_factor", "vapour_flow_kg_s",
                "surface_vapour_velocity_limit_m_s", "min_kettle_diameter_m"):
        assert SUMMARY[key].label in out, key


def test_project_round_trip(tmp_path):
    project = rating.load_project(SAMPLE)
    path = tmp_path / "k.ebullio"
    rating.save_project(project, path)
    assert rating.load_project(path) == project


# ------------------------------------------------------------------------ refusals

def _kettle_kwargs(**changes):
    base = steam_kettle()
    kw = {f.name: getattr(base, f.name) for f in dataclasses.fields(base)}
    kw.update(changes)
    return kw


@pytest.mark.parametrize("changes, field, fragment", [
    (dict(kettle=None), "kettle", "kettle = None: required when type = 'kettle'"),
    (dict(shell=Shell(0.5, 0.3)), "shell", "must be None for a kettle"),
    (dict(type="evaporator", tubes=Tubes(count=160, length=3.5, outer_diameter=0.0254, bwg=14)),
     "kettle", "only for type = 'kettle'"),
    (dict(tubes=Tubes(count=160, length=3.5, outer_diameter=0.0254, bwg=14, passes=2)),
     "tubes.orientation", "a kettle has a horizontal bundle"),
    (dict(tubes=Tubes(count=160, length=3.5, outer_diameter=0.0254, bwg=14, passes=3,
                      orientation="horizontal")), "tubes.passes", "must be even for U-tubes"),
    (dict(tubes=Tubes(count=161, length=3.5, outer_diameter=0.0254, bwg=14, passes=2,
                      orientation="horizontal")), "tubes.count", "two per U-tube"),
])
def test_case_refusals(changes, field, fragment):
    with pytest.raises(InputError) as info:
        Case(**_kettle_kwargs(**changes))
    assert info.value.field == field
    assert fragment in str(info.value)
    assert str(info.value).startswith(f"{field} = ")


@pytest.mark.parametrize("changes, field, fragment", [
    (dict(bundle_diameter=0.6), "bundle_diameter", "0.6 m: must be < port_diameter (0.56 m)"),
    (dict(port_diameter=1.2), "port_diameter", "must be <= kettle_diameter (1 m)"),
    (dict(weir_height=1.0), "weir_height", "1 m: must be < kettle_diameter"),
    (dict(weir_height=0.02), "weir_height", "no tube is submerged"),
    (dict(kettle_diameter=-1.0), "kettle_diameter", "-1 m: must be > 0"),
    (dict(tube_form="coil"), "tube_form", "'u-tube', 'straight'"),
    (dict(vapour_nozzle_diameter=1.5), "vapour_nozzle_diameter", "must be < kettle_diameter"),
    (dict(bundle_boiling_factor=0.5), "bundle_boiling_factor", "must be >= 1 and <= 3"),
    (dict(boiling_range=-3.0), "boiling_range", "-3 K"),
    (dict(mixture_method="schlunder_1982"), "mixture_method", "palen_small_mixture_factor"),
    (dict(bundle_max_flux="zuber_1959"), "bundle_max_flux", "palen_1983"),
    (dict(heating_htc=0.0), "heating_htc", "must be > 0"),
    (dict(estimate_tube_count="yes"), "estimate_tube_count", "true or false"),
])
def test_kettle_shell_refusals(changes, field, fragment):
    kw = dict(kettle_diameter=1.0, port_diameter=0.56, bundle_diameter=0.5, weir_height=0.59)
    kw.update(changes)
    with pytest.raises(InputError) as info:
        KettleShell(**kw)
    assert info.value.field == field
    assert fragment in str(info.value)


def test_kettle_limits_refused_and_sourced():
    from rating.rules import LIMITS
    with pytest.raises(InputError, match=r"kettle_min_bundle_factor = 1.5: must be >= 0"):
        Limits(kettle_min_bundle_factor=1.5)
    for f in dataclasses.fields(Limits):
        if f.name.startswith("kettle_"):
            assert len(LIMITS[f.name].source) > 20, f.name
