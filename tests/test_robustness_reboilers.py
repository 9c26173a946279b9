"""Property-based tests for the reboilers: every rating ends with a result.

Hypothesis perturbs the bundled thermosiphon and kettle samples (scenarios of our
own) over wide ranges: liquid level, line sizes, steam pressure, tube count and
length, feed rate and pressure. Each rating must return a Result with status
"ok", "warnings" or "failed" and a message, never raise or hang; when it is not
"failed" its energy balance closes to 1e-4.
"""
import dataclasses
import math
from pathlib import Path

from hypothesis import HealthCheck, Phase, given, settings, strategies as st

import rating
from rating.errors import InputError
from rating.properties import make_fluid

SAMPLES = Path(__file__).parent.parent / "samples"
STRIPPER = rating.load_project(SAMPLES / "stripper-reboiler.ebullio").cases[0]
KETTLE = rating.load_project(SAMPLES / "harrow-creek-kettles.ebullio").cases[0]
SETTINGS = dict(max_examples=15, deadline=None, derandomize=True,
                suppress_health_check=[HealthCheck.too_slow],
                phases=[Phase.explicit, Phase.generate])   # no shrinking: ratings are slow


def _check(case):
    r = rating.rate(case)
    assert r.status in ("ok", "warnings", "failed")
    assert isinstance(r.message, str) and r.message
    if r.status != "failed" and r.summary["duty_W"]:
        s = r.summary
        assert math.isfinite(s["duty_W"]) and s["duty_W"] > 0
        assert abs(s["duty_W"] - s["duty_heating_side_W"]) / s["duty_W"] < 1e-4


def _steam_pressure(draw, T_boil):
    T = T_boil + draw(st.floats(3.0, 60.0))
    return make_fluid("Water").P_sat(max(T, 380.0))


@settings(**SETTINGS)
@given(st.data())
def test_every_thermosiphon_rating_ends_with_a_result(data):
    draw = data.draw
    try:
        loop = dataclasses.replace(
            STRIPPER.thermosiphon, liquid_level=draw(st.floats(0.2, 4.0)),
            inlet_line_diameter=draw(st.floats(0.05, 0.4)),
            return_line_diameter=draw(st.floats(0.08, 0.6)))
        P = draw(st.floats(0.3e5, 8e5))
        T_boil = make_fluid("n-Hexane").saturation(P).T_sat
        case = dataclasses.replace(
            STRIPPER, thermosiphon=loop,
            boiling=dataclasses.replace(STRIPPER.boiling, inlet_pressure=P),
            heating=dataclasses.replace(STRIPPER.heating,
                                        pressure=_steam_pressure(draw, T_boil)),
            tubes=dataclasses.replace(STRIPPER.tubes, count=draw(st.integers(20, 800)),
                                      length=draw(st.floats(1.0, 6.0))),
            increments=20)
    except InputError:
        return  # a combination the validation refuses is not a rating
    _check(case)


@settings(**SETTINGS)
@given(st.data())
def test_every_kettle_rating_ends_with_a_result(data):
    draw = data.draw
    try:
        P = draw(st.floats(1.0e5, 15e5))
        T_boil = make_fluid("n-Pentane").saturation(P).T_sat
        case = dataclasses.replace(
            KETTLE,
            boiling=dataclasses.replace(KETTLE.boiling, inlet_pressure=P, inlet_temperature=None,
                                        mass_flow=draw(st.floats(0.5, 60.0))),
            heating=dataclasses.replace(KETTLE.heating, pressure=_steam_pressure(draw, T_boil)),
            tubes=dataclasses.replace(KETTLE.tubes, length=draw(st.floats(1.0, 8.0))),
            increments=12)
    except InputError:
        return
    _check(case)
