"""Display units against the conversion factors of NIST Special Publication 811
(2008 edition, Appendix B.8 and B.9), independent of pint which the module uses."""
from __future__ import annotations

import pytest

from gui import units
from rating import catalogue

# (quantity, system, SI value, displayed value) from NIST SP 811 factors.
NIST = [
    ("pressure", "US", 6894.757, 1.0),                     # 1 psi = 6.894 757 kPa
    ("pressure", "metric", 1e5, 1.0),                      # 1 bar = 1e5 Pa
    ("pressure", "SI", 101325.0, 101.325),
    ("temperature", "US", 373.15, 212.0),                  # water boils at 212 degF
    ("temperature", "SI", 273.15, 0.0),
    ("temperature_difference", "US", 1.0, 1.8),            # 1 K = 1.8 degF (difference)
    ("power", "US", 0.29307107, 1.0),                      # 1 Btu_IT/h = 0.293 071 07 W
    ("heat_flux", "US", 3.154591, 1.0),                    # 1 Btu_IT/(h ft2) = 3.154 591 W/m2
    ("htc", "US", 5.678263, 1.0),                          # 1 Btu_IT/(h ft2 degF) = 5.678 263
    ("fouling_resistance", "US", 0.1761102, 1.0),          # 1 h ft2 degF/Btu_IT = 0.176 110 2
    ("conductivity", "US", 1.730735, 1.0),                 # 1 Btu_IT/(h ft degF) = 1.730 735
    ("mass_flow", "US", 0.45359237 / 3600.0, 1.0),         # 1 lb/h
    ("mass_flow", "metric", 1.0 / 3600.0, 1.0),            # 1 kg/h
    ("length", "US", 0.3048, 1.0),                         # 1 ft
    ("diameter", "US", 0.0254, 1.0),                       # 1 in
    ("density", "US", 16.01846, 1.0),                      # 1 lb/ft3 = 16.018 46 kg/m3
]


@pytest.mark.parametrize("quantity, system, si, shown", NIST)
def test_conversion_matches_nist_sp811(quantity, system, si, shown):
    assert units.to_display(si, quantity, system) == pytest.approx(shown, rel=2e-6, abs=1e-9)
    assert units.from_display(shown, quantity, system) == pytest.approx(si, rel=2e-6, abs=1e-9)


def test_every_catalogue_quantity_has_a_unit_in_every_system():
    for quantity in catalogue.QUANTITIES:
        for system in units.SYSTEMS:
            units.unit_label(quantity, system)  # raises for a quantity it does not know


def test_pressures_say_absolute():
    assert [units.unit_label("pressure", s) for s in units.SYSTEMS] == ["kPa(a)", "bar(a)", "psia"]


def test_not_computed_is_never_zero():
    assert units.format_value(None, "pressure_difference", "SI") == "not computed"
    assert units.format_value(float("nan"), "power", "US") == "not computed"
    assert units.format_value(0.0, "power", "SI") == "0 kW"


def test_four_significant_figures_with_grouping():
    assert units.format_value(1234567.0, "power", "SI") == "1,235 kW"
    assert units.format_number(0.012345) == "0.01235"
    # large figures: the whole part, grouped, never an exponent a reader must decode
    assert units.format_number(21168472.0) == "21,168,472"
    assert units.format_number(1234.5) == "1,234"


def test_a_tables_number_and_unit_text():
    # one place for what every table shows: a pure number has no unit beside it, a value
    # not computed says so (never 0), and the number is in the table's units
    from gui.units import number_text, unit_text

    assert unit_text("fraction", "US") == "" and unit_text("pressure", "US") == "psia"
    assert number_text(None, "pressure", "US") == "not computed"
    assert number_text(101325.0, "pressure", "US") == "14.70"   # 1 atm = 14.696 psi (NIST SP 811)
