"""Warnings in the reader's units: one finding's message, and the list of every rule.

A warning keeps its message template and its values in SI, each value with its catalogue
quantity (``rating.rules``); here they are put in the window's or the report's unit
system, so a warning reads in the units of the table it sits under. A warning without a
template (an older result) shows its SI message.
"""
from __future__ import annotations

import html

from rating import rules

from . import units


def _display(system: str):
    def fmt(value, quantity, spec):
        if getattr(value, "template", None):      # a solver's text inside the message
            return rules.render(value.template, dict(value.values), fmt)
        if quantity in ("text", "dimensionless", "fraction", "count", "percent") \
                or isinstance(value, str) or value is None:
            return rules.si_text(value, quantity, spec) if value is not None else "not computed"
        label = units.unit_label(quantity, system)
        shown = units.to_display(value, quantity, system)
        spec = spec or ".4g"
        text = format(shown, spec)
        if "e" in text and spec.endswith("g"):   # 31,942 lb/h, not 3.19e+04 lb/h
            text = units.format_number(shown, int(spec[1:-1] or 4))
        return f"{text} {label}"
    return fmt


def in_units(text, system: str) -> str:
    """A solver's message (``rating.rules.Said``, e.g. why a rating failed) in the units
    of ``system``; a plain text as it is."""
    if getattr(text, "template", None):
        return rules.render(text.template, dict(text.values), _display(system))
    return str(text)


def warning_text(warning, system: str) -> str:
    """The message of ``warning`` with every value in the units of ``system``."""
    if not getattr(warning, "template", ""):
        return warning.message
    return rules.render(warning.template, dict(warning.values), _display(system))


def rules_html(system: str) -> str:
    """Every warning Ebullio can give, with its limits (defaults in ``system``'s units)
    and their sources: the Help menu's list."""
    out = ["<h3>Warnings Ebullio can give</h3>",
           "<p>Each limit is an input of the case (group Limits) and can be changed there.</p>",
           "<table cellspacing=4 cellpadding=2>",
           "<tr><th align=left>Code</th><th align=left>Severity</th>"
           "<th align=left>What it tests</th><th align=left>Limit (default)</th></tr>"]
    for row in rules.rows():
        limits = "<br>".join(
            f"{html.escape(x['label'])} ({_default(x, system)})<br>"
            f"<small>{html.escape(x['source'])}</small>" for x in row["limits"])
        if row["basis"]:
            limits += ("<br>" if limits else "") + f"<small>{html.escape(row['basis'])}</small>"
        types = "" if tuple(row["types"]) == rules.ALL else \
            f"<br><small>{html.escape(', '.join(row['types']))}</small>"
        out.append(f"<tr><td valign=top><b>{html.escape(row['code'])}</b>{types}</td>"
                   f"<td valign=top>{' or '.join(row['severities'])}</td>"
                   f"<td valign=top>{html.escape(row['tests'])}</td>"
                   f"<td valign=top>{limits}</td></tr>")
    out.append("</table>")
    return "".join(out)


def _default(limit: dict, system: str) -> str:
    value, quantity = limit["default"], limit["quantity"]
    if value is None:
        return "off"
    if not units.unit_text(quantity, system):
        return f"{value:g}"
    return html.escape(units.format_value(value, quantity, system))
