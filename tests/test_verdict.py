"""The one-line answer that the window shows and the report prints.

Numbers are matched loosely (800 or 800.0): the digits shown are the display's business.
"""
import re

from rating.results import RatingWarning, Result

from gui.verdict import verdict


def _result(**summary):
    return Result("E-1", "evaporator", "ok", "rated", summary=summary)


def test_a_shortfall_is_stated_in_duty_not_in_area():
    # Area basis: 0.5 of the area needed is installed (over-design -50 %), but the
    # installed area still gives 800 kW of the 1,000 kW asked: 20 % short of the duty.
    # Quoting "short by 50 %" would double the shortfall an engineer passes on.
    r = _result(required_duty_W=1.0e6, performance_duty_W=0.8e6, over_design_pct=-50.0,
                duty_W=1.0e6)
    text = verdict(r, "SI")
    assert text.startswith("Falls short of the required duty of 1,000 kW")
    assert re.search(r"gives 800(\.0*)? kW, 20 % less", text) and "50" not in text


def test_a_met_duty_names_the_basis_of_the_over_design():
    r = _result(required_duty_W=1.0e6, performance_duty_W=1.3e6, over_design_pct=31.6)
    assert "32 % over-design (area basis)" in verdict(r, "SI")


def test_without_a_required_duty_the_verdict_gives_the_duty_and_the_first_warning_place():
    w = RatingWarning("dryout", "warning", "dryout starts", z_m=1.7)
    r = Result("E-1", "evaporator", "warnings", "rated",
               summary={"duty_W": 1.429e6, "dryout_z_m": 1.7}, warnings=(w,))
    text = verdict(r, "SI")
    assert text.startswith("Delivers 1,429 kW")
    assert re.search(r"dries out at z = 1\.70* m; 1 warning, at z = 1\.70* m\.$", text)


def test_a_failed_rating_says_why():
    r = Result("E-1", "evaporator", "failed", "the loop does not circulate")
    assert verdict(r, "SI") == "Not rated: the loop does not circulate"


def test_why_a_rating_failed_reads_in_the_window_units():
    # The stripper reboiler's loop with its column level cut to 0.3 m does not circulate;
    # the engine's reason carries its numbers, so the US window reads psi and ft, not Pa, m.
    import dataclasses
    from pathlib import Path

    from rating import load_project, rate

    case = load_project(Path(__file__).parent.parent / "samples" / "stripper-reboiler.ebullio").cases[0]
    low = dataclasses.replace(case, thermosiphon=dataclasses.replace(case.thermosiphon,
                                                                        liquid_level=0.3))
    r = rate(low)
    assert r.status == "failed" and "will not circulate" in r.message
    assert " Pa " in r.message and " m " in r.message          # the engine's SI words
    us = verdict(r, "US")
    assert us.startswith("Not rated: will not circulate") and " psi " in us and " ft " in us
    assert not re.search(r"\d Pa\b|\d m\b|kg/s", us)


def test_a_kettles_margin_is_named_as_the_bundle_limit_it_is():
    # max_chf_ratio of a kettle is the bundle's mean flux over the bundle maximum flux
    # (Palen's limit is on the mean): the sentence must not call it a local critical flux.
    kettle = Result("E-21", "kettle", "ok", "rated", summary={"duty_W": 4.44e6,
                                                               "max_chf_ratio": 0.7527})
    tube = Result("E-1", "evaporator", "ok", "rated", summary={"duty_W": 4.44e6,
                                                                "max_chf_ratio": 0.7527})
    assert "mean bundle flux 75 % of the bundle maximum" in verdict(kettle, "SI")
    assert "heat flux at most 75 % of the critical flux" in verdict(tube, "SI")


def test_a_kettle_report_shades_its_pool_boiling_in_the_windows_tint():
    from pathlib import Path

    from gui.report import figures
    from gui.style import REGIME_FILL
    from rating import load_project, rate

    case = load_project(Path(__file__).parent.parent / "samples"
                        / "harrow-creek-kettles.ebullio").cases[0]
    handles = figures._regime_handles(rate(case))
    assert [h.get_label() for h in handles] == ["pool boiling"]
    from matplotlib.colors import to_hex
    assert to_hex(handles[0].get_facecolor()) == REGIME_FILL["pool boiling"]
