"""The answer of a case: key figures, warnings, and two ratings side by side.

Which figures exist and what they are called comes from the engine's catalogue
(``SUMMARY``), in its display order; a figure that was not computed reads "not
computed", never 0.
"""
from __future__ import annotations

from PySide6.QtCore import Qt, Signal
from PySide6.QtGui import QBrush, QColor
from PySide6.QtWidgets import (QAbstractItemView, QHeaderView, QListWidget, QListWidgetItem,
                               QTableWidget, QTableWidgetItem)

from rating import catalogue, rules

from . import units
from .verdict import amount
from .warning_text import warning_text

NOT_COMPUTED = "not computed"
GREY = QColor("#888888")
SEVERITY_MARK = {"error": "●", "warning": "▲", "info": "○"}
SEVERITY_COLOUR = {"error": "#a12800", "warning": "#7a4d00", "info": "#08466f"}


def summary_keys(result) -> list[str]:
    """The catalogue's summary keys this result carries, in display order."""
    if result is None:
        return []
    keys = [k for k, f in catalogue.SUMMARY.items()
            if k in result.summary and (not f.types or result.type in f.types)]
    # figures that were computed first; those that were not, after them, in grey
    return sorted(keys, key=lambda k: result.summary.get(k) is None)


def value_text(result, key, system) -> str:
    v = result.summary.get(key) if result is not None else None
    return units.number_text(v, catalogue.SUMMARY[key].quantity, system)


def unit_text(key, system) -> str:
    return units.unit_text(catalogue.SUMMARY[key].quantity, system)


def _item(text, right=False, grey=False, tip=""):
    it = QTableWidgetItem(text)
    it.setFlags(Qt.ItemIsSelectable | Qt.ItemIsEnabled)
    if right:
        it.setTextAlignment(Qt.AlignRight | Qt.AlignVCenter)
    if grey:
        it.setForeground(QBrush(GREY))
    if tip:
        it.setToolTip(tip)
    return it


class _Table(QTableWidget):
    """A read-only table whose cells are updated in place: a new result changes texts and
    colours, never builds the rows again (that took tens of milliseconds per edit)."""

    def __init__(self, headers, parent=None):
        super().__init__(0, len(headers), parent)
        self._shown = None
        self.setHorizontalHeaderLabels(headers)
        self.verticalHeader().setVisible(False)
        self.setEditTriggers(QAbstractItemView.NoEditTriggers)
        self.setSelectionBehavior(QAbstractItemView.SelectRows)
        self.setAlternatingRowColors(True)
        self.setWordWrap(False)
        h = self.horizontalHeader()
        h.setSectionResizeMode(0, QHeaderView.Stretch)
        for c in range(1, len(headers)):
            h.setSectionResizeMode(c, QHeaderView.ResizeToContents)
        self.verticalHeader().setDefaultSectionSize(self.fontMetrics().height() + 6)

    def _cell(self, r, c, text, right=False, grey=False, tip=""):
        it = self.item(r, c)
        if it is None:
            self.setItem(r, c, _item(text, right, grey, tip))
            return
        if it.text() != text:
            it.setText(text)
        if it.toolTip() != tip:
            it.setToolTip(tip)
        colour = GREY if grey else self.palette().text().color()
        if it.foreground().color() != colour:
            it.setForeground(QBrush(colour))


class FiguresTable(_Table):
    """Key figures of the selected case with their units."""

    def __init__(self, parent=None):
        super().__init__(["Key figure", "Value", "Unit"], parent)
        self.setObjectName("key-figures")

    def show_result(self, result, system, stale=False):
        if self._shown == (id(result), system, stale):
            return
        self._shown = (id(result), system, stale)
        keys = summary_keys(result)
        self.setUpdatesEnabled(False)
        self.setRowCount(len(keys))
        for r, k in enumerate(keys):
            f = catalogue.SUMMARY[k]
            text = value_text(result, k, system)
            self._cell(r, 0, f.label, tip=f.help)
            self._cell(r, 1, text, right=True, grey=stale or text == NOT_COMPUTED)
            self._cell(r, 2, unit_text(k, system), grey=stale)
        self.setUpdatesEnabled(True)

    def value(self, key) -> str:
        """The shown text of a figure (for tests and the clipboard)."""
        label = catalogue.SUMMARY[key].label
        for r in range(self.rowCount()):
            if self.item(r, 0).text() == label:
                return self.item(r, 1).text()
        raise KeyError(key)


class WarningsList(QListWidget):
    """The warnings of the rating; choosing one marks its position on every plot."""

    positionChosen = Signal(object)          # z in m (SI), or None

    def __init__(self, parent=None):
        super().__init__(parent)
        self.setObjectName("warnings")
        self.setWordWrap(True)
        self.setAlternatingRowColors(True)
        self.currentRowChanged.connect(self._chosen)
        self._z: list = []

    def show_result(self, result, system, failure_message=""):
        self.blockSignals(True)
        self.clear()
        self._z = []
        if failure_message:
            it = QListWidgetItem(f"{SEVERITY_MARK['error']}  {failure_message}")
            it.setForeground(QBrush(QColor(SEVERITY_COLOUR["error"])))
            self.addItem(it)
            self._z.append(None)
        warnings = result.warnings if result is not None else ()
        for w in sorted(warnings, key=lambda w: ("error", "warning", "info").index(w.severity)):
            where = ""                  # the position once: after a text that does not give it
            if w.z_m is not None and "z" not in rules.quantities(getattr(w, "template", "")):
                where = f" [z = {amount(w.z_m, 'length', system, 3)}]"
            it = QListWidgetItem(f"{SEVERITY_MARK.get(w.severity, '')}  "
                                 f"{warning_text(w, system)}{where}")
            it.setForeground(QBrush(QColor(SEVERITY_COLOUR.get(w.severity, "#222222"))))
            it.setToolTip(f"{w.severity}: {w.code}")
            self.addItem(it)
            self._z.append(w.z_m)
        if not self._z:
            it = QListWidgetItem("no warnings" if result is not None else "")
            it.setForeground(QBrush(GREY))
            it.setFlags(Qt.NoItemFlags)
            self.addItem(it)
        self.blockSignals(False)
        self.positionChosen.emit(None)

    def _chosen(self, row):
        self.positionChosen.emit(self._z[row] if 0 <= row < len(self._z) else None)


class CompareTable(_Table):
    """Both sets of key figures and their differences: "what did this change do?"."""

    def __init__(self, parent=None):
        super().__init__(["Key figure", "This case", "Compared", "Difference", "Unit"], parent)
        self.setObjectName("compare")

    def show_pair(self, this, other, system):
        keys = summary_keys(this) or summary_keys(other)
        keys += [k for k in summary_keys(other) if k not in keys]
        self.setUpdatesEnabled(False)
        self.setRowCount(len(keys))
        for r, k in enumerate(keys):
            f = catalogue.SUMMARY[k]
            a = this.summary.get(k) if this is not None else None
            b = other.summary.get(k) if other is not None else None
            self._cell(r, 0, f.label, tip=f.help)
            self._cell(r, 1, value_text(this, k, system), right=True, grey=a is None)
            self._cell(r, 2, value_text(other, k, system), right=True, grey=b is None)
            self._cell(r, 3, difference(a, b, f.quantity, system), right=True)
            self._cell(r, 4, unit_text(k, system))
        self.setUpdatesEnabled(True)


def difference(a, b, quantity, system) -> str:
    """This minus compared, in display units (offsets of temperature scales cancel)."""
    if not all(isinstance(v, (int, float)) and not isinstance(v, bool) for v in (a, b)):
        return ""
    d = units.to_display(a, quantity, system) - units.to_display(b, quantity, system)
    if d == 0:
        return "0"
    rel = f" ({(a - b) / abs(b) * 100:+.1f} %)" if b and quantity not in ("temperature",) else ""
    sign = "+" if d > 0 else "−"
    return f"{sign}{units.format_number(abs(d))}{rel}"
