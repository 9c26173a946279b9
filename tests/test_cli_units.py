"""ebullio-rate's table in the units of --units: figures and the values inside warnings
alike, so that a warning never reads in other units than the table it sits under.

Conversion factors are from NIST SP 811 (2008), appendix B: 1 W = 3.412 141 633 Btu_IT/h,
1 ft = 0.3048 m (exact), 1 psi = 6 894.757 Pa.
"""
import re
from pathlib import Path

import pytest

from gui.report.command import main as ebullio_rate
from rating import load_project, rate

PENTANE = Path(__file__).parent.parent / "samples" / "pentane-vaporiser.ebullio"
CASE = "C5 vaporiser V-12 performance"


def _number(text):
    return float(text.replace(",", ""))


def _row(out, label):
    m = re.search(rf"^  {re.escape(label)}\s+([-\d,.]+)  (\S.*)$", out, re.M)
    assert m, label
    return _number(m.group(1)), m.group(2)


@pytest.fixture(scope="module")
def result():
    case = next(c for c in load_project(PENTANE).cases if c.name == CASE)
    return rate(case)


def test_us_customary_table_and_its_warnings(result, capsys):
    assert ebullio_rate([str(PENTANE), "--case", CASE, "--units", "US"]) in (0, 1)
    out = capsys.readouterr().out
    duty, unit = _row(out, "Duty")
    assert unit == "Btu/h"
    assert duty == pytest.approx(result.summary["duty_W"] * 3.412141633, rel=1e-6)
    z, unit = _row(out, "Dryout starts at")
    assert unit == "ft" and z == pytest.approx(result.summary["dryout_z_m"] / 0.3048, rel=1e-3)
    p, unit = _row(out, "Exit pressure")
    assert unit == "psia"
    assert p == pytest.approx(result.summary["exit_pressure_Pa"] / 6894.757, rel=1e-3)
    warnings = [line for line in out.splitlines() if line.startswith("  [")]
    assert len(warnings) == len(result.warnings) > 0
    dryout = next(line for line in warnings if "] dryout " in line)
    assert dryout.count(f"z = {z:.4g} ft") == 2            # the place, and in the message
    assert not re.search(r"\d m\b|\d K\b", "\n".join(warnings))   # no SI left inside


def test_metric_pressures_are_absolute_bar(capsys):
    ebullio_rate([str(PENTANE), "--case", CASE, "--units", "metric"])
    out = capsys.readouterr().out
    assert _row(out, "Exit pressure")[1] == "bar(a)"
    assert _row(out, "Pressure drop, boiling side")[1] == "mbar"


def test_the_engine_alone_prints_si_base_units(result, capsys):
    from rating.cli import main

    main([str(PENTANE), "--case", CASE])
    out = capsys.readouterr().out
    duty, unit = _row(out, "Duty")
    assert unit == "W" and duty == pytest.approx(result.summary["duty_W"], rel=1e-3)
    assert f"z = {result.summary['dryout_z_m']:.4g} m" in out
