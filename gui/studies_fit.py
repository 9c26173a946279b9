"""The fit to plant data in the studies tab: what was measured on the running unit (with
its tolerance), which inputs to fit between which bounds, and the answer in words, in a
table and in two plots.

The engine fits (``rating.studies.fit``); this module only reads the typed values in
the window's units, converts them to SI, and shows what comes back.
"""
from __future__ import annotations

import math
import textwrap

import numpy as np
from matplotlib.ticker import MaxNLocator
from PySide6.QtWidgets import QComboBox, QHBoxLayout, QLabel, QLineEdit, QVBoxLayout, QWidget

from rating import catalogue, studies
from rating.studies.fit import MISSED

from . import units
from .plots import FONT, _display
from .style import INK, OKABE_ITO as C

#: Inputs a fit may set: a fouling resistance or a multiplier on a film coefficient.
PARAMETERS = ("boiling.fouling_resistance", "heating.fouling_resistance",
              "boiling.htc_factor", "heating.htc_factor")
#: Fitted first when nothing else is chosen: the usual question of a unit in service.
DEFAULT_PARAMETER = "boiling.fouling_resistance"

VERDICTS = {"fitted": "Fitted", "poor": "Poor fit", "unidentifiable": "Not identifiable",
            "failed": "The fit failed", "cancelled": "Stopped"}


def tolerance_quantity(quantity: str) -> str:
    """A tolerance of a temperature is a temperature difference (K, not °C)."""
    return "temperature_difference" if quantity == "temperature" else quantity


def measurable(case) -> list[str]:
    """Results of this case that can be measured on the running unit (steam flow only
    when the heating medium is steam)."""
    return [k for k in studies.MEASURABLE if case.type in catalogue.SUMMARY[k].types
            and (k != "steam_flow_kg_s" or case.heating.kind == "steam")]


_number = units.parse_number


class _FitRow(QWidget):
    """An input to fit, chosen from ``PARAMETERS``, with its bounds in display units."""

    def __init__(self, title, optional, parent=None):
        super().__init__(parent)
        lay = QHBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        self.path = QComboBox()
        self.low, self.high = QLineEdit(), QLineEdit()
        for w in (self.low, self.high):
            w.setMaximumWidth(80)
        self.unit = QLabel("")
        lay.addWidget(QLabel(title))
        lay.addWidget(self.path, 1)
        lay.addWidget(QLabel("from"))
        lay.addWidget(self.low)
        lay.addWidget(QLabel("to"))
        lay.addWidget(self.high)
        lay.addWidget(self.unit)
        self.optional, self.system = optional, "SI"
        self.path.currentIndexChanged.connect(self._default_range)

    def fill(self, paths, system):
        self.system = system
        self.path.blockSignals(True)
        self.path.clear()
        if self.optional:
            self.path.addItem("(nothing)", None)
        for p in paths:
            self.path.addItem(catalogue.input_field(p).label, p)
        self.path.setCurrentIndex(0 if self.optional else max(0, self.path.findData(
            DEFAULT_PARAMETER)))
        self.path.blockSignals(False)
        self._default_range()

    def _default_range(self):
        p = self.path.currentData()
        for w in (self.low, self.high):
            w.setEnabled(p is not None)
            w.setText("")
        self.unit.setText("")
        if p is None:
            return
        f = catalogue.input_field(p)
        for w, v in zip((self.low, self.high), f.usual if f.usual else f.hard):
            w.setText(units.entry_text(units.to_display(v, f.quantity, self.system)))
        self.unit.setText(units.unit_label(f.quantity, self.system))

    def parameter(self):
        """The ``Parameter`` in SI, or None for "(nothing)"; ValueError names the field."""
        p = self.path.currentData()
        if p is None:
            return None
        f = catalogue.input_field(p)
        try:
            lo, hi = (units.from_display(units.parse_number(w.text()), f.quantity,
                                         self.system) for w in (self.low, self.high))
        except (ValueError, TypeError) as exc:
            raise ValueError(f"{f.label}: the bounds must be numbers"
                             + (f" ({exc})" if isinstance(exc, ValueError) else "")) from None
        if not lo < hi:
            raise ValueError(f"{f.label}: the bound 'from' must be below 'to'")
        return studies.Parameter(p, lo, hi)


class _MeasuredRow(QWidget):
    """One measured result, chosen from what this case can be measured by, its value and
    its tolerance, in display units."""

    def __init__(self, parent=None):
        super().__init__(parent)
        lay = QHBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        self.key = QComboBox()
        self.value, self.tolerance = QLineEdit(), QLineEdit()
        self.value.setPlaceholderText("measured")
        self.tolerance.setPlaceholderText("tolerance")
        self.value.setToolTip("The value measured on the running unit")
        self.tolerance.setToolTip("Its tolerance, taken as one standard deviation of the "
                                  "measurement")
        for w in (self.value, self.tolerance):
            w.setFixedWidth(96)
        self.unit, self.tolerance_unit = QLabel(""), QLabel("")
        for w in (self.unit, self.tolerance_unit):
            w.setMinimumWidth(40)
        lay.addWidget(QLabel("Measured"))
        lay.addWidget(self.key, 1)
        lay.addWidget(self.value)
        lay.addWidget(self.unit)
        lay.addWidget(QLabel("±"))
        lay.addWidget(self.tolerance)
        lay.addWidget(self.tolerance_unit)
        self.system = "SI"
        self.key.currentIndexChanged.connect(self._units)

    def fill(self, keys, system, current):
        self.system = system
        self.key.blockSignals(True)
        self.key.clear()
        self.key.addItem("(nothing)", None)
        for k in keys:
            self.key.addItem(catalogue.SUMMARY[k].label, k)
        self.key.setCurrentIndex(max(0, self.key.findData(current)))
        self.key.blockSignals(False)
        self._units()

    def _units(self, *_):
        k = self.key.currentData()
        for w in (self.value, self.tolerance):
            w.setEnabled(k is not None)
        q = catalogue.SUMMARY[k].quantity if k else None
        self.unit.setText(units.unit_label(q, self.system) if q else "")
        self.tolerance_unit.setText(units.unit_label(tolerance_quantity(q), self.system)
                                    if q else "")

    def measurement(self):
        """The ``Measurement`` in SI, or None; ValueError names the field and what it needs."""
        k = self.key.currentData()
        if k is None:
            return None
        f = catalogue.SUMMARY[k]
        try:
            value, tol = _number(self.value.text()), _number(self.tolerance.text())
        except ValueError as exc:
            raise ValueError(f"{f.label}: the measured value and its tolerance must be "
                             f"numbers ({exc})") from None
        if value is None:
            if tol is not None:
                raise ValueError(f"{f.label}: a tolerance without a measured value")
            return None
        if tol is None or not tol > 0.0:
            raise ValueError(f"{f.label}: give its tolerance (one standard deviation), > 0 "
                             f"{units.unit_label(tolerance_quantity(f.quantity), self.system)}")
        return studies.Measurement(k, units.from_display(value, f.quantity, self.system),
                                   units.from_display(tol, tolerance_quantity(f.quantity),
                                                      self.system))


#: What the measured rows show first: the duty and the heating medium's outlet
#: temperature are what a plant measures most often (common practice).
FIRST_MEASURED = ("duty_W", "heating_outlet_temperature_K", None)


class FitSetup(QWidget):
    """Up to three measured values with their tolerances, and one or two inputs to fit with
    their bounds, in display units."""

    def __init__(self, parent=None):
        super().__init__(parent)
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        lay.setSpacing(2)
        self.measured_rows = [_MeasuredRow() for _ in FIRST_MEASURED]
        self.fit_rows = [_FitRow("Fit", False), _FitRow("and", True)]
        for row in self.measured_rows + self.fit_rows:
            lay.addWidget(row)
        self._built_for = None
        self.system = "SI"

    def fill(self, case, system):
        """Choices for this case; typed values are kept while the exchanger type, the
        heating medium and the unit system stay."""
        key = (case.type, case.heating.kind, system)
        if key == self._built_for:
            return
        self._built_for, self.system = key, system
        keys = measurable(case)
        for row, first in zip(self.measured_rows, FIRST_MEASURED):
            row.fill(keys, system, first)
            row.value.clear()
            row.tolerance.clear()
        paths = [p for p in PARAMETERS if p in studies.study_paths(case)]
        for row in self.fit_rows:
            row.fill(paths, system)

    def measure(self, key):
        """The (value, tolerance) fields of the row that shows ``key``, choosing it in the
        first free row if none does."""
        rows = [r for r in self.measured_rows if r.key.currentData() == key] or \
            [r for r in self.measured_rows if r.key.currentData() is None]
        row = rows[0]
        row.key.setCurrentIndex(row.key.findData(key))
        return row.value, row.tolerance

    def measurements(self) -> list:
        """The typed measurements in SI; ValueError names the field and what it needs."""
        out = [m for m in (r.measurement() for r in self.measured_rows) if m is not None]
        if len({m.key for m in out}) < len(out):
            raise ValueError("Fit: the same result measured twice; keep one")
        if not out:
            raise ValueError("Fit: type at least one measured value and its tolerance")
        return out

    def parameters(self) -> list:
        """The inputs to fit with their bounds in SI; ValueError names the field."""
        out = [p for p in (row.parameter() for row in self.fit_rows) if p is not None]
        if len({p.path for p in out}) < len(out):
            raise ValueError("Fit: the same input twice; choose another, or (nothing)")
        return out


def _small(text):
    label = QLabel(text)
    label.setStyleSheet("color: #555555")
    return label


# --- the answer ---------------------------------------------------------------------------

def verdict(fit, parameters, system: str) -> str:
    """The answer in words: each fitted value with its uncertainty, then every finding
    (``parameters``: the ``Parameter``s the fit was given, for their bounds)."""
    if fit.status in ("failed", "cancelled"):
        return f"{VERDICTS[fit.status]}: {fit.message}"
    parts = []
    for p, v in fit.values.items():
        f = catalogue.input_field(p)
        unit = units.unit_label(f.quantity, system).replace("–", "")   # no dash for "no unit"
        u = fit.uncertainty[p]
        shown = units.to_display(v, f.quantity, system)
        if u is None:
            parts.append(f"{f.label} = {units.format_number(shown)} {unit}".rstrip()
                         + " (not determined by these measurements)")
        else:
            value, spread = value_and_uncertainty(shown, _difference(u, f.quantity, system))
            parts.append(f"{f.label} = {value} ± {spread} {unit}".rstrip())
    head = f"{VERDICTS[fit.status]}: " + "; ".join(parts)
    if fit.status == "fitted":
        head += " (± one standard deviation, from the tolerances)"
    return "\n".join([head] + [f"• {w}" for w in findings(fit, parameters, system)])


def findings(fit, parameters, system: str) -> list[str]:
    """The engine's findings on a fit in the catalogue's words and the window's units
    (its own messages name paths and SI values, for the command line)."""
    def shown(value, quantity):
        return f"{units.format_number(units.to_display(value, quantity, system))} " \
               f"{units.unit_label(quantity, system)}".rstrip(" –")

    out = []
    loose = [p for p in fit.values if not fit.identifiable[p]]
    label = {p: catalogue.input_field(p).label for p in fit.values}
    if len(loose) > 1:
        out.append(f"{' and '.join(label[p] for p in loose)}: these measurements do not fix "
                   "them (at most a combination of them); measure another result or fit one "
                   "of them")
    for p in loose if len(loose) == 1 else ():
        q = catalogue.input_field(p).quantity
        bounds = next(b for b in parameters if b.path == p)
        if _narrower(fit, bounds):
            lo, hi = fit.interval
            out.append(f"{label[p]} is not identifiable near its fitted value: the measured "
                       "results hardly change with it there; the measurements leave it "
                       f"anywhere from {shown(lo, q)} to {shown(hi, q)}")
            continue
        out.append(f"{label[p]} is not identifiable: over its whole range, "
                   f"{shown(bounds.lower, q)} to {shown(bounds.upper, q)}, the measured results "
                   "change by less than about twice their tolerances")
    for b in parameters:
        v = fit.values.get(b.path)
        if v is None or b.path in loose:
            continue
        near = 1e-6 * (b.upper - b.lower)
        if v - b.lower <= near or b.upper - v <= near:
            side = "lower" if v - b.lower <= near else "upper"
            out.append(f"{label[b.path]} ended at its {side} bound "
                       f"({shown(v, catalogue.input_field(b.path).quantity)}): the data ask "
                       "for a value beyond the range given; its uncertainty is one-sided")
    missed = [(k, m, f, r) for k, m, f, r in fit.residuals if abs(r) > MISSED]
    for key, measured, model, r in missed:
        q = catalogue.SUMMARY[key].quantity
        out.append(f"poor fit: {catalogue.SUMMARY[key].label.lower()} is {shown(model, q)} "
                   f"in the rating against the measured {shown(measured, q)} "
                   f"({r:+.1f} tolerances)")
    dof = len(fit.residuals) - len(fit.values)
    if fit.status == "poor" and not missed and fit.chi_square is not None:
        out.append(f"poor fit: the misfit (chi-square {fit.chi_square:.3g} on {dof} degrees "
                   "of freedom) is larger than the tolerances explain")
    return out


def _narrower(fit, bounds) -> bool:
    """The ratings leave a one-parameter fit a span narrower than its whole range."""
    interval = getattr(fit, "interval", None)
    return interval is not None and interval[1] - interval[0] < bounds.upper - bounds.lower


def value_and_uncertainty(value: float, u: float) -> tuple[str, str]:
    """A value and its uncertainty written to the same decimal place, the uncertainty
    with two significant figures (0.000400 ± 0.000042)."""
    if not (u > 0.0 and math.isfinite(u) and math.isfinite(value)):
        return units.format_number(value), units.format_number(u)
    places = 1 - math.floor(math.log10(u))
    if places > 8 or places < -6:          # far from 1: powers of ten read better
        return f"{value:.{max(2, places + math.floor(math.log10(abs(value) or 1)))}e}", \
            f"{u:.1e}"
    places = max(places, 0)
    return f"{value:.{places}f}", f"{u:.{places}f}"


def _difference(value, quantity, system):
    """An uncertainty in display units: a difference, so no offset (°C, °F)."""
    return units.to_display(value, tolerance_quantity(quantity), system)


def table_rows(fit, tolerances: dict, system: str) -> tuple[list[str], list[list[str]]]:
    """Header and rows of the fit's table: the fitted inputs, then the measurements
    (``tolerances``: the tolerance of each measured key, SI)."""
    head = ["Quantity", "Value", "± (1 s.d.)", "Model", "Model − measured [tolerances]",
            "Unit", "Verdict"]
    rows = []
    for p, v in fit.values.items():
        f = catalogue.input_field(p)
        u = fit.uncertainty[p]
        word = ("not identifiable" if not fit.identifiable[p] else "fitted") \
            if fit.status not in ("failed", "cancelled") else fit.status
        shown = units.to_display(v, f.quantity, system)
        value, spread = (units.format_number(shown), "not determined") if u is None else \
            value_and_uncertainty(shown, _difference(u, f.quantity, system))
        rows.append([f"{f.label} (fitted)", value, spread, "", "",
                     units.unit_label(f.quantity, system), word])
    for key, measured, model, r in fit.residuals:
        f = catalogue.SUMMARY[key]
        tol = tolerances.get(key)
        rows.append([f"{f.label} (measured)",
                     units.format_number(units.to_display(measured, f.quantity, system)),
                     "" if tol is None else units.format_number(
                         _difference(tol, f.quantity, system)),
                     "not computed" if model is None else
                     units.format_number(units.to_display(model, f.quantity, system)),
                     f"{0.0 if abs(r) < 0.005 else r:+.2f}",    # no "-0.00"
                     units.unit_label(f.quantity, system),
                     "within its tolerance" if abs(r) <= 1.0 else
                     f"within {MISSED:g} tolerances" if abs(r) <= MISSED else "missed"])
    return head, rows


def draw(axes, fit, system: str) -> str:
    """The misfit against the fitted input (left) and each measurement's miss in
    tolerances (right); returns the title."""
    left, right = axes
    paths = list(fit.values)
    first = paths[0]
    fq = catalogue.input_field(first).quantity
    n = max(1, len(fit.residuals))
    trials = [(vals, m) for vals, m in fit.trials if m is not None]
    if len(paths) == 1 and trials:
        trials.sort(key=lambda t: t[0][first])
        x = _display([t[0][first] for t in trials], fq, system)
        rms = np.array([math.sqrt(m / n) for _, m in trials])
        left.plot(x, rms, "o-", color=C["blue"], ms=3.5, lw=1.2)
        left.set_ylabel("Misfit, RMS\n[tolerances]", fontsize=FONT)   # short axes: two lines
        left.axhline(1.0, color="#777777", ls="--", lw=0.9)
        left.text(0.99, 1.0, "one tolerance", transform=left.get_yaxis_transform(),
                  ha="right", va="bottom", fontsize=FONT - 1, color="#555555")
        left.set_ylim(bottom=0.0)
    elif len(paths) >= 2 and trials:
        second = paths[1]
        sq = catalogue.input_field(second).quantity
        x = _display([t[0][first] for t in trials], fq, system)
        y = _display([t[0][second] for t in trials], sq, system)
        left.plot(x, y, ".", color="#999999", ms=4)
        f2 = catalogue.input_field(second)
        left.set_ylabel(textwrap.fill(f"{f2.label} [{units.unit_label(sq, system)}]", 24),
                        fontsize=FONT)
    v = units.to_display(fit.values[first], fq, system)
    u = fit.uncertainty.get(first)
    if u is None and getattr(fit, "interval", None) is not None and len(paths) == 1:
        lo, hi = (units.to_display(b, fq, system) for b in fit.interval)
        left.axvspan(lo, hi, color="#999999", alpha=0.15, lw=0)   # what the data leave open
    if fit.status not in ("failed", "cancelled"):
        if u is not None:
            du = _difference(u, fq, system)
            left.axvspan(v - du, v + du, color=C["green"], alpha=0.2, lw=0)
        left.axvline(v, color=C["green"] if u is not None else C["vermillion"], lw=1.8,
                     label="fitted")
    left.xaxis.set_major_locator(MaxNLocator(4))        # long values: fewer ticks
    f1 = catalogue.input_field(first)
    left.set_xlabel(f"{f1.label} [{units.unit_label(fq, system)}]", fontsize=FONT)

    r = [res[3] for res in fit.residuals]
    ypos = np.arange(len(r))[::-1]
    right.axvspan(-1.0, 1.0, color=C["green"], alpha=0.18, lw=0)
    right.axvspan(-MISSED, -1.0, color=C["yellow"], alpha=0.2, lw=0)
    right.axvspan(1.0, MISSED, color=C["yellow"], alpha=0.2, lw=0)
    right.axvline(0.0, color=INK, lw=0.8)
    for y, ri in zip(ypos, r):
        missed = abs(ri) > MISSED
        right.plot(ri, y, "o", ms=8, color=C["vermillion"] if missed else C["blue"])
    limit = max([3.0] + [abs(ri) * 1.15 for ri in r])
    right.set_xlim(-limit, limit)
    right.set_yticks(ypos)
    right.set_yticklabels([catalogue.SUMMARY[res[0]].label for res in fit.residuals],
                          fontsize=FONT)
    right.set_ylim(-0.7, len(r) - 0.3)
    right.set_xlabel("Model − measured [tolerances]", fontsize=FONT)
    # the line is the fitted value, the band its ± 1 s.d.: the verdict above says both
    return "Misfit of each rating" if fit.trials else VERDICTS[fit.status]
