"""The one-line answer to "does this unit do the duty, with what margin, where does it
fail first?", in words an engineer can paste into an e-mail.

It only reads the result: summary figures (labels and quantities from the engine's
catalogue), warnings and status. No physics here.
"""
from __future__ import annotations

from rating import catalogue

from . import units
from .warning_text import in_units


def amount(value, quantity, system, digits=4) -> str:
    """'1,234 kW': a value in the unit system with its unit (none for pure numbers)."""
    if not units.unit_text(quantity, system):
        return units.number_text(value, quantity, system, digits)
    return units.format_value(value, quantity, system, digits)


def figure(result, key, system, digits=4):
    """'1,234 kW' of a summary key in the unit system; None when the key was not computed."""
    value = result.summary.get(key) if result is not None else None
    if value is None or key not in catalogue.SUMMARY:
        return None
    return amount(value, catalogue.SUMMARY[key].quantity, system, digits)


def verdict(result, system: str, *, message: str = "") -> str:
    """One sentence; ``message`` is the reason a rating failed, when it did. The window's
    answer line and the report's verdict are this same sentence."""
    if result is None or result.status in ("failed", "cancelled"):
        why = message or (result.message if result is not None else "")
        return f"Not rated: {in_units(why, system)}" if why else "Not rated yet."
    s = result.summary
    parts = [_duty_answer(result, system)]
    exit_x = s.get("exit_quality")
    if exit_x is not None:
        parts[-1] += f" (exit vapour quality {exit_x:.3g})"
    dry = s.get("dryout_z_m")
    if dry is not None:
        parts.append(f"dries out at z = {figure(result, 'dryout_z_m', system, 3)}")
    circ = s.get("circulation_ratio")
    if circ is not None:
        parts.append(f"circulation ratio {circ:.3g}")
    chf = s.get("max_chf_ratio")
    if chf is not None and dry is None:
        # a kettle's limit is on the bundle's mean flux (Palen), a tube's on the local flux
        parts.append(f"mean bundle flux {chf * 100:.0f} % of the bundle maximum"
                     if result.type == "kettle" else
                     f"heat flux at most {chf * 100:.0f} % of the critical flux")
    serious = [w for w in result.warnings if w.severity in ("warning", "error")]
    if serious:
        placed = [w.z_m for w in serious if w.z_m is not None]
        n = len(serious)
        first = "the first at" if n > 1 else "at"
        where = f", {first} z = {amount(min(placed), 'length', system, 3)}" if placed else ""
        parts.append(f"{n} warning{'s' if n > 1 else ''}{where}")
    return "; ".join(parts) + "."


def _duty_answer(result, system) -> str:
    """Meets the required duty (over-design on the area basis), or the duty the installed
    area gives and by how much of the duty it falls short — never an area shortfall
    presented as a duty shortfall."""
    s = result.summary
    required = s.get("required_duty_W")
    if required is None:
        duty = figure(result, "duty_W", system)
        return f"Delivers {duty}" if duty else "Rated"
    target = f"the required duty of {figure(result, 'required_duty_W', system)}"
    over = s.get("over_design_pct")
    reached = s.get("performance_duty_W")
    if over is not None and over >= 0.0:
        return f"Meets {target} with {over:.0f} % over-design (area basis)"
    if reached is not None and required > 0.0:
        short = (1.0 - reached / required) * 100.0
        return (f"Falls short of {target}: the installed area gives "
                f"{figure(result, 'performance_duty_W', system)}, {short:.0f} % less")
    return f"Does not reach {target}"
