"""Display units: SI, metric and US customary, for the desktop and the report.

The engine stores and computes in SI only; this module turns an SI value of a
catalogue quantity (``rating.catalogue.QUANTITIES``) into the number and unit a
reader of the chosen system expects, and back. The factors come from pint, so no
conversion constant is written by hand. Pressures are always absolute and say so
in their label; temperature differences convert without the offset.
"""
from __future__ import annotations

import math
from functools import cache

from rating.catalogue import QUANTITIES

SYSTEMS = ("SI", "metric", "US")
SYSTEM_TITLES = {"SI": "SI", "metric": "Metric", "US": "US customary"}

# quantity -> {system: (pint unit, label)}; pint units are converted from the SI unit.
_UNITS = {
    "length": {"SI": ("m", "m"), "metric": ("m", "m"), "US": ("ft", "ft")},
    "diameter": {"SI": ("mm", "mm"), "metric": ("mm", "mm"), "US": ("inch", "in")},
    "area": {"SI": ("m**2", "m²"), "metric": ("m**2", "m²"), "US": ("ft**2", "ft²")},
    "pressure": {"SI": ("kPa", "kPa(a)"), "metric": ("bar", "bar(a)"), "US": ("psi", "psia")},
    "pressure_difference": {"SI": ("kPa", "kPa"), "metric": ("mbar", "mbar"),
                            "US": ("psi", "psi")},
    "temperature": {"SI": ("degC", "°C"), "metric": ("degC", "°C"), "US": ("degF", "°F")},
    "temperature_difference": {"SI": ("K", "K"), "metric": ("K", "K"),
                               "US": ("delta_degF", "°F")},
    "mass_flow": {"SI": ("kg/s", "kg/s"), "metric": ("kg/h", "kg/h"), "US": ("lb/h", "lb/h")},
    "mass_flux": {"SI": ("kg/m**2/s", "kg/(m²·s)"), "metric": ("kg/m**2/s", "kg/(m²·s)"),
                  "US": ("lb/ft**2/h", "lb/(ft²·h)")},
    "power": {"SI": ("kW", "kW"), "metric": ("kW", "kW"), "US": ("Btu/h", "Btu/h")},
    "heat_flux": {"SI": ("kW/m**2", "kW/m²"), "metric": ("kW/m**2", "kW/m²"),
                  "US": ("Btu/h/ft**2", "Btu/(h·ft²)")},
    "htc": {"SI": ("W/m**2/K", "W/(m²·K)"), "metric": ("W/m**2/K", "W/(m²·K)"),
            "US": ("Btu/h/ft**2/delta_degF", "Btu/(h·ft²·°F)")},
    "fouling_resistance": {"SI": ("m**2*K/W", "m²·K/W"), "metric": ("m**2*K/W", "m²·K/W"),
                           "US": ("h*ft**2*delta_degF/Btu", "h·ft²·°F/Btu")},
    "conductivity": {"SI": ("W/m/K", "W/(m·K)"), "metric": ("W/m/K", "W/(m·K)"),
                     "US": ("Btu/h/ft/delta_degF", "Btu/(h·ft·°F)")},
    "velocity": {"SI": ("m/s", "m/s"), "metric": ("m/s", "m/s"), "US": ("ft/s", "ft/s")},
    "density": {"SI": ("kg/m**3", "kg/m³"), "metric": ("kg/m**3", "kg/m³"),
                "US": ("lb/ft**3", "lb/ft³")},
    "momentum_flux": {"SI": ("kg/m/s**2", "kg/(m·s²)"), "metric": ("kg/m/s**2", "kg/(m·s²)"),
                      "US": ("lb/ft/s**2", "lb/(ft·s²)")},
}
# Quantities shown as they are stored, whatever the system.
_PLAIN = {"dimensionless": "–", "fraction": "–", "percent": "%", "count": "", "angle": "°",
          "text": "", "choice": "", "flag": ""}
# The SI unit of each converted quantity, as the catalogue gives it, in pint's spelling.
_SI = {q: QUANTITIES[q].replace("^", "**") for q in _UNITS}


@cache
def _registry():
    import pint

    return pint.UnitRegistry()


@cache
def _linear(quantity: str, system: str) -> tuple[float, float]:
    """(scale, offset) with display = scale * SI + offset, from pint."""
    ureg = _registry()
    target = _UNITS[quantity][system][0]
    q = ureg.Quantity
    zero = q(0.0, _SI[quantity]).to(target).magnitude
    one = q(1.0, _SI[quantity]).to(target).magnitude
    return one - zero, zero


def _check(quantity: str, system: str) -> None:
    if system not in SYSTEMS:
        raise ValueError(f"unit system {system!r}: must be one of {', '.join(SYSTEMS)}")
    if quantity not in _UNITS and quantity not in _PLAIN:
        raise ValueError(f"no display unit for the quantity {quantity!r}")


def unit_label(quantity: str, system: str) -> str:
    """The unit a reader of ``system`` sees beside a value of ``quantity``."""
    _check(quantity, system)
    if quantity in _PLAIN:
        return _PLAIN[quantity]
    return _UNITS[quantity][system][1]


def to_display(value_si, quantity: str, system: str):
    """An SI value in the display unit of ``system``; None stays None."""
    _check(quantity, system)
    if value_si is None or quantity in _PLAIN or isinstance(value_si, (str, bool)):
        return value_si
    scale, offset = _linear(quantity, system)
    return float(value_si) * scale + offset


def from_display(value, quantity: str, system: str):
    """A value typed in the display unit of ``system`` back in SI; None stays None."""
    _check(quantity, system)
    if value is None or quantity in _PLAIN or isinstance(value, (str, bool)):
        return value
    scale, offset = _linear(quantity, system)
    return (float(value) - offset) / scale


def unit_text(quantity: str, system: str) -> str:
    """The unit beside a number in a table or a field: blank for a pure number."""
    label = unit_label(quantity, system)
    return "" if label in ("-", "–") else label


def number_text(value_si, quantity: str, system: str, digits: int = 4) -> str:
    """A value in display units without its unit ("not computed" for None)."""
    if value_si is None:
        return "not computed"
    if isinstance(value_si, str):
        return value_si
    return format_number(to_display(value_si, quantity, system), digits)


def format_value(value_si, quantity: str, system: str, digits: int = 4) -> str:
    """``"1,234 kW"``-style text with ``digits`` significant figures; None is "not computed"."""
    if value_si is None or (isinstance(value_si, float) and not math.isfinite(value_si)):
        return "not computed"
    if isinstance(value_si, str):
        return value_si
    value = to_display(value_si, quantity, system)
    label = unit_label(quantity, system)
    return f"{format_number(value, digits)} {label}".rstrip()


def format_number(value, digits: int = 4) -> str:
    """A number to ``digits`` significant figures (every digit of its whole part), thousands
    grouped, no exponent from 1e-4 to 1e15 (a duty of 21,168,472 Btu/h reads as such)."""
    if value is None:
        return "not computed"
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return str(value)
    if isinstance(value, int):
        return f"{value:,}"
    if value == 0 or not math.isfinite(value):
        return f"{value:g}"
    magnitude = math.floor(math.log10(abs(value)))
    if magnitude >= 15 or magnitude < -4:
        return f"{value:.{digits - 1}e}"
    decimals = max(0, digits - 1 - magnitude)
    return f"{value:,.{decimals}f}"


def parse_number(text: str):
    """The number typed into an entry, read in the user's locale (QLocale): None when the
    entry is empty. Never a guess: a text that is not a number in that locale (a decimal
    comma where the point is ".", thousands grouped wrongly, letters) raises ValueError
    saying why, for the entry to show beside its field. Every numeric entry of the
    desktop reads its text here."""
    from PySide6.QtCore import QLocale

    text = text.strip()
    if not text:
        return None
    loc = QLocale()
    number, ok = loc.toDouble(text)
    if ok and math.isfinite(number):
        return number
    point, group = loc.decimalPoint(), loc.groupSeparator()
    other = "," if point == "." else "." if point == "," else ""
    if other and other in text and other != group:
        raise ValueError(f"'{text}' is not a number: the decimal point is '{point}'")
    if other and other in text:
        raise ValueError(f"'{text}' is not a number: the decimal point is '{point}', and "
                         f"'{group}' only separates groups of thousands")
    raise ValueError(f"'{text}' is not a number")


def entry_text(value: float, digits: int = 4) -> str:
    """A number as an entry shows it, in the user's locale, so that ``parse_number``
    reads it back: ``digits`` significant figures (every digit of the whole part from
    1000 up), no trailing zeros, an exponent below 1e-4."""
    from PySide6.QtCore import QLocale

    loc = QLocale()
    if value == 0 or not math.isfinite(value):
        return loc.toString(float(value), "g", digits)
    magnitude = math.floor(math.log10(abs(value)))
    if magnitude < -4 or magnitude >= 15:
        return loc.toString(float(value), "e", digits - 1)
    text = loc.toString(float(value), "f", max(0, digits - 1 - magnitude))
    point = loc.decimalPoint()
    if point in text:
        text = text.rstrip("0").rstrip(point)
    return text
