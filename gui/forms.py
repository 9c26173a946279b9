"""The datasheet form of a case, generated from the engine's catalogue of inputs.

One row per input: label, editor, unit, and the message of the engine's draft
validation under it. Rows come in the catalogue's datasheet order and grouping;
rows that do not apply to the draft (type, steam or liquid, wall or gauge ...) are
hidden. Values are stored in SI in the document; the form converts to and from the
window's unit system. Nothing here knows a field by name except through the
catalogue.
"""
from __future__ import annotations

from PySide6.QtCore import QLocale, Qt, Signal
from PySide6.QtWidgets import (QCheckBox, QComboBox, QFrame, QGridLayout, QLabel, QLineEdit,
                               QScrollArea, QSizePolicy, QToolButton, QVBoxLayout, QWidget)

from rating import catalogue

from . import units
from .document import draft_problems

NUMERIC = ("number", "integer")
_NOTHING = object()


def choice_text(value) -> str:
    """A static choice as the form shows it: 'area_for_duty' reads 'area for duty'."""
    return str(value).replace("_", " ")


DIGITS = 4          # significant figures shown; the stored SI value keeps every digit
number_text = units.entry_text


def format_input(value, field, system) -> str:
    """The editor text of a stored value: display units, four significant figures. The text
    is only read back into the case when the user types into it (``Row._typed``)."""
    if value is None:
        return ""
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return str(value)                  # text kept as typed (an invalid entry)
    if field.kind == "integer" or field.quantity in ("count", "angle"):
        return QLocale().toString(int(value)) if float(value).is_integer() else str(value)
    return number_text(float(units.to_display(float(value), field.quantity, system)))


def exact_text(value, field, system) -> str:
    """The stored value in display units with every significant digit (for the tooltip)."""
    if isinstance(value, bool) or not isinstance(value, (int, float)) or field.kind != "number":
        return ""
    return QLocale().toString(float(units.to_display(float(value), field.quantity, system)), "g", 12)


def parse_input(text: str, field, system):
    """The SI value of an editor's text; None when empty; the text itself for a text field.
    ValueError (naming the field) when a numeric field's text is not a number in the
    user's locale (``units.parse_number``: "1,5" is never read as 15)."""
    text = text.strip()
    if field.kind not in NUMERIC:
        return text or None
    try:
        number = units.parse_number(text)
    except ValueError as exc:
        raise ValueError(f"{field.label}: {exc}") from None
    if number is None:
        return None
    if field.kind == "integer":
        return int(number) if float(number).is_integer() else number
    return units.from_display(number, field.quantity, system)


def _range_text(field, system) -> str:
    parts = []
    for name, rng in (("allowed", field.hard), ("usual", field.usual)):
        if not rng:
            continue
        lo, hi = rng
        unit = units.unit_label(field.quantity, system) if field.kind == "number" else ""

        def show(v):
            return format_input(v, field, system)
        if lo is not None and hi is not None:
            parts.append(f"{name}: {show(lo)} to {show(hi)} {unit}".rstrip())
        elif lo is not None:
            parts.append(f"{name}: from {show(lo)} {unit}".rstrip())
        elif hi is not None:
            parts.append(f"{name}: up to {show(hi)} {unit}".rstrip())
    return "; ".join(parts)


class Section(QWidget):
    """A titled group of rows that folds away behind its title."""

    def __init__(self, title: str, parent=None):
        super().__init__(parent)
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 6, 0, 2)
        lay.setSpacing(2)
        self.button = QToolButton(self)
        self.button.setText(title)
        self.button.setCheckable(True)
        self.button.setChecked(True)
        self.button.setToolButtonStyle(Qt.ToolButtonTextBesideIcon)
        self.button.setArrowType(Qt.DownArrow)
        self.button.setStyleSheet("QToolButton { border: none; font-weight: bold; }")
        self.button.setFocusPolicy(Qt.StrongFocus)
        self.button.setToolTip("Fold or unfold this group (Space when it has the focus)")
        self.button.toggled.connect(self.set_open)
        line = QFrame(self)
        line.setFrameShape(QFrame.HLine)
        line.setFrameShadow(QFrame.Sunken)
        self.body = QWidget(self)
        self.grid = QGridLayout(self.body)
        self.grid.setContentsMargins(14, 0, 2, 0)
        self.grid.setHorizontalSpacing(6)
        self.grid.setVerticalSpacing(2)
        self.grid.setColumnStretch(0, 1)      # labels widen with the form: fewer wrapped lines
        self.grid.setColumnStretch(1, 1)
        lay.addWidget(self.button)
        lay.addWidget(line)
        lay.addWidget(self.body)

    def set_open(self, open_: bool):
        self.button.setArrowType(Qt.DownArrow if open_ else Qt.RightArrow)
        self.body.setVisible(open_)


class Row:
    """The widgets of one input."""

    def __init__(self, field, section: Section, r: int, form: "CaseForm"):
        self.field, self.section, self.form = field, section, form
        self.label = QLabel(field.label)
        self.label.setWordWrap(True)
        self.label.setMinimumWidth(120)
        self.unit = QLabel("")
        self.unit.setMinimumWidth(52)
        self.message = QLabel("")
        self.message.setWordWrap(True)
        self.message.setVisible(False)
        self.message.setObjectName(f"message:{field.path}")
        kind = field.kind
        if kind == "choice" or field.choices:
            self.editor = QComboBox()
            self.editor.setSizeAdjustPolicy(QComboBox.AdjustToMinimumContentsLengthWithIcon)
            self.editor.setMinimumContentsLength(8)
            self.editor.activated.connect(self._chosen)
        elif kind == "flag":
            self.editor = QCheckBox()
            self.editor.clicked.connect(lambda checked: form.edited.emit(field.path, bool(checked)))
        else:
            self.editor = QLineEdit()
            if kind in NUMERIC:
                self.editor.setAlignment(Qt.AlignRight | Qt.AlignVCenter)
            if kind == "table":
                self.editor.setReadOnly(True)
            self.editor.textEdited.connect(self._typed)
        self.editor.setObjectName(f"input:{field.path}")
        self.editor.setSizePolicy(QSizePolicy.Expanding, QSizePolicy.Fixed)
        self.label.setBuddy(self.editor)
        g = section.grid
        g.addWidget(self.label, 2 * r, 0)
        self.spans = kind in ("text", "fluid") and not field.choices
        if self.spans:                  # names: the unit's column too
            g.addWidget(self.editor, 2 * r, 1, 1, 2)
            self.unit.setParent(section.body)   # never shown; a label without a parent
            self.unit.hide()                    # would open as a window of its own
        else:
            g.addWidget(self.editor, 2 * r, 1)
            g.addWidget(self.unit, 2 * r, 2)
        g.addWidget(self.message, 2 * r + 1, 0, 1, 3)
        self._choices: list[str] = []
        self._tip_key, self._tip = None, ""

    def widgets(self):
        return (self.label, self.editor) + (() if self.spans else (self.unit,))

    def set_visible(self, visible: bool):
        for w in self.widgets():
            w.setVisible(visible)
        if not visible:
            self.message.setVisible(False)

    def _typed(self, text):
        try:
            value = parse_input(text, self.field, self.form.system)
        except ValueError:                  # kept as typed: the draft stays invalid, and
            value = text.strip()            # its problem says why (document.draft_problems)
        self.form.echo[self.field.path] = value     # keep the text as typed while it is the value
        self.form.typing = True                     # a keystroke: the rating waits for a pause
        try:
            self.form.edited.emit(self.field.path, value)
        finally:
            self.form.typing = False

    def _chosen(self, index):
        if 0 <= index < len(self._choices):
            self.form.edited.emit(self.field.path, self._choices[index])

    def show_value(self, value, draft, system):
        f = self.field
        key = (system, QLocale().name())
        if self._tip_key != key:        # the same for every keystroke: made once per units
            self._tip_key = key
            self.unit.setText(units.unit_text(f.quantity, system))
            tip = [f.help] if f.help else []
            rng = _range_text(f, system)
            if rng:
                tip.append(rng)
            if f.default is not None and f.kind in NUMERIC:
                tip.append(f"default: {format_input(f.default, f, system)} {self.unit.text()}".rstrip())
            elif f.optional:
                tip.append("may be left empty")
            self._tip = "\n".join(tip)
            self.label.setToolTip(self._tip)
        tooltip = self._tip
        if isinstance(value, dict):
            tooltip = "A user property table (cp, rho, mu, k against T); edit it in the project file."
        if isinstance(self.editor, QComboBox):
            self._fill_choices(value, draft)
        elif f.kind == "flag":
            self.editor.setToolTip(tooltip)
            self.editor.setChecked(bool(value))
        else:
            self.editor.setToolTip(tooltip)
            if f.kind == "table" or isinstance(value, (dict, list)):
                text = _table_text(value)
            else:
                text = format_input(value, f, system)
            exact = exact_text(value, f, system)
            if exact and exact != text:
                self.editor.setToolTip(f"{tooltip}\nstored: {exact} {self.unit.text()}".strip())
            echo = self.form.echo.get(f.path, _NOTHING)
            if self.editor.text() != text and not (echo is not _NOTHING and echo == value):
                self.editor.setText(text)
                if not self.editor.hasFocus():
                    self.editor.setCursorPosition(0)      # a long name shows its beginning

    def _fill_choices(self, value, draft):
        f = self.field
        if f.choices:
            items = [(c, choice_text(c), "") for c in f.choices]
        else:
            items = catalogue.method_choices(f.path, draft)
        if f.optional:
            items = [(None, "(not given)", "")] + items
        values = [v for v, _, _ in items]
        if value not in values:
            items = items + [(value, f"{value} (not offered for this case)", "")]
            values.append(value)
        if values != self._choices:
            box = self.editor
            box.blockSignals(True)
            box.clear()
            for v, title, ref in items:
                box.addItem(title)
                if ref:
                    box.setItemData(box.count() - 1, ref, Qt.ToolTipRole)
            box.blockSignals(False)
            self._choices = values
        i = values.index(value) if value in values else -1
        if self.editor.currentIndex() != i:
            self.editor.blockSignals(True)
            self.editor.setCurrentIndex(i)
            self.editor.blockSignals(False)
        ref = items[i][2] if i >= 0 else ""
        self.editor.setToolTip(ref or f.help)

    def show_problem(self, problems):
        if not problems:
            self.message.setVisible(False)
            self.editor.setStyleSheet("")
            return
        worst = "error" if any(p.severity == "error" for p in problems) else "warning"
        colour = "#a12800" if worst == "error" else "#7a4d00"
        self.message.setText("\n".join(p.message for p in problems))
        self.message.setStyleSheet(f"color: {colour}; padding-left: 2px;")
        self.editor.setStyleSheet(f"border: 1px solid {colour};")
        self.message.setVisible(self.editor.isVisibleTo(self.section))


def _table_text(value) -> str:
    if isinstance(value, dict):
        n = max((len(v) for v in value.values() if isinstance(v, (list, tuple))), default=0)
        return f"table of {n} points"
    if value is None:
        return ""
    return str(value)


class CaseForm(QScrollArea):
    """The datasheet of one exchanger type; bound to one case at a time."""

    edited = Signal(str, object)       # path, SI value (or the text typed when not a number)
    committed = Signal(str)            # path: an entry finished (Enter, Tab, focus left)

    def __init__(self, case_type: str, parent=None):
        super().__init__(parent)
        self.case_type = case_type
        self.system = "SI"
        self.echo: dict = {}               # path -> value just typed (its text stays as typed)
        self.typing = False                # True while a keystroke's edit is emitted
        self.setWidgetResizable(True)
        self.setFrameShape(QFrame.NoFrame)
        self.setHorizontalScrollBarPolicy(Qt.ScrollBarAlwaysOff)
        inner = QWidget(self)
        lay = QVBoxLayout(inner)
        lay.setContentsMargins(6, 4, 10, 8)
        lay.setSpacing(0)
        self.general = QLabel("")           # problems that belong to no single field
        self.general.setWordWrap(True)
        self.general.setStyleSheet("color: #a12800;")
        self.general.setVisible(False)
        lay.addWidget(self.general)
        self.rows: dict[str, Row] = {}
        self.sections: dict[str, Section] = {}
        fields = catalogue.inputs_for(case_type)
        chain = []
        for key, title in catalogue.GROUPS:
            members = [f for f in fields if f.group == key]
            if not members:
                continue
            sec = Section(title, inner)
            self.sections[key] = sec
            lay.addWidget(sec)
            chain.append(sec.button)                # Tab reaches a folded section's title too
            for r, f in enumerate(members):
                row = Row(f, sec, r, self)
                self.rows[f.path] = row
                chain.append(row.editor)
                if isinstance(row.editor, QLineEdit):
                    row.editor.editingFinished.connect(lambda p=f.path: self._finished(p))
        for a, b in zip(chain, chain[1:]):        # tab order follows the datasheet
            QWidget.setTabOrder(a, b)
        self.chain = chain
        lay.addStretch(1)
        self.setWidget(inner)
        for key in ("methods", "limits"):          # rarely changed: folded at first
            if key in self.sections:
                self.sections[key].button.setChecked(False)

    def _finished(self, path):
        self.echo.pop(path, None)
        self.committed.emit(path)

    def show_draft(self, draft: dict, system: str):
        """Show a draft's values, the rows that apply, and every problem beside its field."""
        if system != self.system:
            self.echo.clear()
        self.system = system
        for path, row in self.rows.items():
            row.set_visible(catalogue.applies(row.field, draft))
        for sec in self.sections.values():
            sec.setVisible(any(r.editor.isVisibleTo(sec) for r in self.rows.values() if r.section is sec))
        for path, row in self.rows.items():
            if row.editor.isVisibleTo(row.section):
                row.show_value(catalogue.get_value(draft, path), draft, system)
        self.show_problems(draft_problems(draft))

    def show_problems(self, problems):
        by_path, general = {}, []
        for p in problems:
            row = self.rows.get(p.path)
            if row is not None and row.editor.isVisibleTo(row.section):
                by_path.setdefault(p.path, []).append(p)
            else:
                general.append(p)
        for path, row in self.rows.items():
            row.show_problem(by_path.get(path))
        self.general.setText("\n".join(p.message for p in general))
        self.general.setVisible(bool(general))

    def editor(self, path: str):
        return self.rows[path].editor

    def message(self, path: str) -> str:
        row = self.rows[path]
        return row.message.text() if row.message.isVisibleTo(self) else ""
