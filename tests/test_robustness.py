"""Property-based tests: every valid case ends with a result, never an exception or a hang.

Hypothesis draws random valid evaporator cases over wide but physical ranges
(tube geometry, three fluids, subcooled or saturated inlet, steam or a liquid
heating medium, co- or counter-current). Each rating must return a Result whose
status is "ok", "warnings" or "failed"; when it is not "failed" its energy
balance must close.
"""
import math

from hypothesis import HealthCheck, Phase, given, settings, strategies as st

import rating
from rating.case import BoilingStream, Case, HeatingMedium, Shell, Tubes
from rating.errors import InputError
from rating.properties import make_fluid

FLUIDS = {"Water": (1.0e5, 2.0e6), "n-Pentane": (1.0e5, 2.0e6), "R134a": (1.5e5, 2.0e6)}


@st.composite
def cases(draw):
    fluid = draw(st.sampled_from(sorted(FLUIDS)))
    lo, hi = FLUIDS[fluid]
    P = draw(st.floats(lo, hi))
    T_sat = make_fluid(fluid).saturation(P).T_sat
    od = draw(st.sampled_from([0.01905, 0.0254, 0.03175]))
    tubes = Tubes(count=draw(st.integers(5, 300)), length=draw(st.floats(0.5, 8.0)),
                  outer_diameter=od, bwg=draw(st.sampled_from([12, 14, 16, 18])),
                  orientation=draw(st.sampled_from(["vertical", "horizontal"])),
                  pitch=1.25 * od)
    subcooled = draw(st.booleans())
    boiling = BoilingStream(
        fluid=fluid, mass_flow=draw(st.floats(0.05, 30.0)), inlet_pressure=P,
        inlet_temperature=T_sat - draw(st.floats(1.0, 40.0)) if subcooled else None,
        inlet_quality=None if subcooled else draw(st.floats(0.0, 0.5)),
        fouling_resistance=draw(st.floats(0.0, 5e-4)))
    dT = draw(st.floats(3.0, 60.0))
    if draw(st.booleans()):
        T_steam = max(T_sat + dT, 380.0)   # steam below 1.3 bar(a) is not a heating medium
        P_steam = make_fluid("Water").P_sat(min(T_steam, 600.0))
        heating = HeatingMedium(kind="steam", pressure=P_steam)
        shell = None
    else:
        heating = HeatingMedium(kind="liquid", fluid="Water", pressure=4.0e6,  # pressurised hot water
                                inlet_temperature=max(min(T_sat + dT, 520.0), 280.0),
                                mass_flow=draw(st.floats(0.5, 50.0)),
                                flow_arrangement=draw(st.sampled_from(["co", "counter"])))
        shell = Shell(inner_diameter=max(0.2, 1.3 * od * math.sqrt(tubes.count) * 1.25),
                      baffle_spacing=draw(st.floats(0.15, 1.0)))
    return Case(name="random", tubes=tubes, boiling=boiling, heating=heating, shell=shell,
                increments=20)


# No shrinking: one rating takes up to a second, and the failing case is printed whole.
@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow],
          derandomize=True, phases=[Phase.explicit, Phase.generate])
@given(st.data())
def test_every_rating_ends_with_a_result(data):
    try:
        case = data.draw(cases())
    except InputError:
        return  # a drawn combination the validation refuses is not a rating
    r = rating.rate(case)
    assert r.status in ("ok", "warnings", "failed")
    assert isinstance(r.message, str) and r.message
    if r.status != "failed":
        s = r.summary
        assert s["duty_W"] >= 0.0 and math.isfinite(s["duty_W"])
        if s["duty_W"] > 0:
            assert abs(s["duty_W"] - s["duty_heating_side_W"]) / s["duty_W"] < 1e-4
        for key in ("t_wall_inner_K", "heat_flux_W_m2", "quality"):
            assert all(math.isfinite(v) for v in r.profiles[key]), key
