"""Warnings in the reader's units (gui/warning_text.py): one unit system per message.

Conversions checked against exact definitions: 1 ft = 0.3048 m, a temperature
difference of 1 K = 1.8 degF, T[degF] = T[K] x 1.8 - 459.67 (NIST SP 811, appendix B).
"""
from __future__ import annotations

import re
from pathlib import Path

import pytest

import rating
from gui.warning_text import rules_html, warning_text
from rating import rules

ROOT = Path(__file__).resolve().parents[1]


@pytest.fixture(scope="module")
def dry():
    """The pentane vaporiser's rating: a dryout warning with a position and a wall
    temperature (the sample's own)."""
    case = rating.load_project(ROOT / "samples" / "pentane-vaporiser.ebullio").cases[0]
    result = rating.rate(case)
    return next(w for w in result.warnings if w.code == "dryout")


def test_a_dryout_warning_reads_in_us_units(dry):
    text = warning_text(dry, "US")
    z_ft = float(re.search(r"z = ([0-9.]+) ft", text).group(1))
    assert z_ft == pytest.approx(dry.z_m / 0.3048, abs=1e-3)
    t_wall = dict(dry.values)["t_wall"]
    t_f = float(re.search(r"rises to ([0-9.]+) °F", text).group(1))
    assert t_f == pytest.approx(t_wall * 1.8 - 459.67, abs=0.06)
    assert " m " not in text and " K" not in text      # no SI left beside the US values


def test_si_text_stays_the_message_and_metric_uses_celsius(dry):
    assert "m" in dry.message and " K" in dry.message
    metric = warning_text(dry, "metric")
    t_c = float(re.search(r"rises to ([0-9.]+) °C", metric).group(1))
    assert t_c == pytest.approx(dict(dry.values)["t_wall"] - 273.15, abs=0.06)


def test_a_temperature_difference_converts_without_the_offset():
    w = rules.warn("pinch", z=1.0, dT=2.0, limit=3.0)
    assert warning_text(w, "US") == "temperature approach falls to 3.60 °F (limit 5.40 °F)"


def test_a_warning_without_a_template_shows_its_message():
    w = rating.results.RatingWarning("duty-not-reached", "error", "short of the duty")
    assert warning_text(w, "US") == "short of the duty"


def test_the_list_of_rules_names_every_code_and_shows_limits_in_display_units():
    page = rules_html("US")
    for code in rules.RULES:
        assert f"<b>{code}</b>" in page
    # the kettle's freeboard limit, 0.25 m, is 0.8202 ft
    assert "Smallest freeboard (0.8202 ft)" in page
    assert "Sinnott" in page


def test_the_report_shows_warnings_in_its_units(dry):
    from gui.report.content import _warnings

    result = rating.results.Result("a", "evaporator", "warnings", "rated", warnings=(dry,))
    table = str(_warnings(result, "US"))
    assert "°F" in table and " K" not in table


def test_a_range_warning_shows_its_bound_in_the_readers_units():
    # a tube of 50.8 mm = 2 in (1 in = 25.4 mm exactly) beyond Gungor-Winterton's largest
    # diameter; the bound and the position are converted, the SI message stays as it was
    from rating.correlations import registry

    (msg,) = registry.get("gungor_winterton_1986").out_of_range(
        {"D": 0.0508, "G": 100.0, "q": 1e4})
    w = rules.note("method-range", msg, z=0.3048)
    assert w.message == f"{msg} (first at z = 0.305 m)"   # the SI text is the method's own
    us = warning_text(w, "US")
    assert "D = 2 in outside its range" in us and "(first at z = 1.000 ft)" in us
    hi_in = 0.032 / 0.0254           # the method's upper diameter bound, 32 mm
    assert f"to {hi_in:.4g} in" in us
