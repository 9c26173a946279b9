"""The studies tab: a sweep, the spread between methods, the operating envelope, or the fit
to plant data of the case on the datasheet, run beside the window with progress and a
stop, plotted, and exported as CSV.

The engine does the work (``rating.studies``) on a process pool made once for the
panel (the points of a study run side by side on every core); a worker thread waits
for it so the window stays live, and only the GUI thread draws. Inputs are typed and
shown in the window's unit system; the CSV is SI, like the project file.
"""
from __future__ import annotations

import math
import threading

import numpy as np
from PySide6.QtCore import QObject, Qt, Signal
from PySide6.QtWidgets import (QApplication, QComboBox, QFileDialog, QGridLayout,
                               QHBoxLayout, QLabel, QLineEdit, QProgressBar, QPushButton,
                               QSizePolicy, QSplitter, QStackedWidget, QTableWidget,
                               QTableWidgetItem, QVBoxLayout, QWidget)

from rating import catalogue, studies
from rating.cli import CAUTION
from rating.errors import InputError

from . import studies_fit, units
from matplotlib.ticker import FuncFormatter

from .plots import FONT, _Canvas, _display, _tick
from .style import INK, OKABE_ITO as C

KINDS = (("sweep", "Sweep"), ("spread", "Method spread"), ("envelope", "Operating envelope"),
         ("fit", "Fit to plant data"))
# Colour of each limit of the envelope (its boundary and the points that fail it first).
LIMIT_COLOURS = {"duty": C["blue"], "critical_flux": C["vermillion"],
                 "circulation": C["purple"], "stability": C["orange"],
                 "entrainment": C["sky"],
                 "feed": "#9a7d00"}    # Okabe-Ito yellow, darkened to read on white
SHORT = {"duty": "duty not met", "critical_flux": "dryout / critical flux",
         "circulation": "no circulation", "stability": "unstable", "entrainment": "entrainment",
         "feed": "feed boils dry"}


class _Signals(QObject):
    progress = Signal(int, int)
    finished = Signal(object, object)      # study, error text


class _Range(QWidget):
    """An input path with from, to and number of points, in display units."""

    def __init__(self, title, optional=False, parent=None):
        super().__init__(parent)
        lay = QHBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        self.path = QComboBox()
        self.path.setMinimumContentsLength(12)
        self.path.setSizeAdjustPolicy(QComboBox.AdjustToMinimumContentsLengthWithIcon)
        self.start, self.stop = QLineEdit(), QLineEdit()
        self.count = QLineEdit()
        for w, width in ((self.start, 72), (self.stop, 72), (self.count, 36)):
            w.setMaximumWidth(width)
        self.unit = QLabel("")
        lay.addWidget(QLabel(title))
        lay.addWidget(self.path, 1)
        lay.addWidget(QLabel("from"))
        lay.addWidget(self.start)
        lay.addWidget(QLabel("to"))
        lay.addWidget(self.stop)
        lay.addWidget(self.unit)
        lay.addWidget(QLabel("points"))
        lay.addWidget(self.count)
        self.optional = optional
        self.case, self.system = None, "SI"
        self._shown = None
        self.path.currentIndexChanged.connect(self._default_range)

    def fill(self, case, system, prefer=None):
        self.case, self.system = case, system
        keep = self.path.currentData()
        self.path.blockSignals(True)
        self.path.clear()
        if self.optional:
            self.path.addItem("(nothing)", None)
        for p in studies.study_paths(case):
            self.path.addItem(catalogue.input_field(p).label + f"  ({p})", p)
        for want in (keep, prefer):
            i = self.path.findData(want)
            if want is not None and i >= 0:
                self.path.setCurrentIndex(i)
                break
        self.path.blockSignals(False)
        if (case.name, self.path.currentData(), system) != self._shown:
            self._default_range()   # a new case, input or unit system: a fresh range

    def _default_range(self):
        p = self.path.currentData()
        self._shown = (self.case.name if self.case else None, p, self.system)
        for w in (self.start, self.stop, self.count):
            w.setEnabled(p is not None)
        if p is None or self.case is None:
            self.unit.setText("")
            return
        f = catalogue.input_field(p)
        value = catalogue.get_value(self.case, p)
        if not isinstance(value, (int, float)) or value == 0:
            lo, hi = (0.0, f.usual[1] if f.usual and f.usual[1] else 1.0)
        else:
            lo, hi = 0.7 * value, 1.3 * value
            if f.hard and f.hard[1] is not None:
                hi = min(hi, f.hard[1])
        self.unit.setText(units.unit_label(f.quantity, self.system))
        self.start.setText(units.entry_text(units.to_display(lo, f.quantity, self.system)))
        self.stop.setText(units.entry_text(units.to_display(hi, f.quantity, self.system)))
        self.count.setText("5" if self.optional else "11")

    def variation(self):
        """The ``Variation`` in SI, or None for "(nothing)"; ValueError names the problem."""
        p = self.path.currentData()
        if p is None:
            return None
        f = catalogue.input_field(p)
        try:
            lo, hi = (units.from_display(units.parse_number(w.text()), f.quantity, self.system)
                      for w in (self.start, self.stop))
            n = int(self.count.text())
        except (ValueError, TypeError) as exc:
            raise ValueError(f"{f.label}: from and to must be numbers and points a whole "
                             "number" + (f" ({exc})" if isinstance(exc, ValueError) else "")
                             ) from None
        return studies.Variation.range(p, lo, hi, n)


class StudiesPanel(QWidget):
    """Set up, run, stop, plot and export a study of the current case.

    ``current_case()`` gives the validated case on the datasheet (or None);
    ``unit_system()`` the window's unit system; ``make_executor()`` the executor for
    the points (default: a process pool on all cores, made at the first run).
    """

    def __init__(self, current_case, unit_system, make_executor=None, parent=None):
        super().__init__(parent)
        self.setObjectName("studies-panel")
        self.current_case, self.unit_system = current_case, unit_system
        self._make_executor = make_executor or studies.default_executor
        self._executor = None
        self._cancel = threading.Event()
        self._thread = None
        self.study, self.kind, self.system = None, None, "SI"
        self._tolerances = {}          # the fit's tolerance of each measured key (SI)
        self._parameters = []          # and the inputs it fitted, with their bounds
        self._filled_for = None
        self.signals = _Signals()
        self.signals.progress.connect(self._on_progress)
        self.signals.finished.connect(self._on_finished)
        self._build()
        app = QApplication.instance()
        if app is not None:
            app.aboutToQuit.connect(self.shutdown)

    @classmethod
    def for_window(cls, window):
        """The panel for the main window: its current case and its unit system."""
        def current_case():
            if window.current_id is None:
                return None
            try:
                return catalogue.draft_to_case(window.doc.entry(window.current_id).draft)
            except (InputError, KeyError, ValueError, TypeError):
                return None          # the datasheet shows what is wrong
        panel = cls(current_case, lambda: window.system)
        panel.setObjectName("studies-tab")
        return panel

    def showEvent(self, event):  # noqa: N802 - Qt's name
        """The datasheet may have changed while the tab was hidden."""
        super().showEvent(event)
        if not self.busy():
            self.refresh()

    # --- building ------------------------------------------------------------------------
    def _build(self):
        lay = QVBoxLayout(self)
        lay.setContentsMargins(4, 4, 4, 4)
        top = QHBoxLayout()
        self.kind_box = QComboBox()
        for key, title in KINDS:
            self.kind_box.addItem(title, key)
        top.addWidget(QLabel("Study:"))
        top.addWidget(self.kind_box)
        self.show_box = QComboBox()
        self.show_box.setMinimumContentsLength(12)
        self.show_box.setSizeAdjustPolicy(QComboBox.AdjustToMinimumContentsLengthWithIcon)
        top.addWidget(QLabel("Plot:"))
        top.addWidget(self.show_box, 1)
        self.run_button = QPushButton("Run study")
        self.stop_button = QPushButton("Stop")
        self.export_button = QPushButton("Export CSV…")
        self.stop_button.setEnabled(False)
        self.export_button.setEnabled(False)
        for b in (self.run_button, self.stop_button, self.export_button):
            top.addWidget(b)
        lay.addLayout(top)

        self.setup = QStackedWidget()
        sweep = QWidget()
        sl = QGridLayout(sweep)
        sl.setContentsMargins(0, 0, 0, 0)
        self.vary = _Range("Vary")
        self.vary2 = _Range("and", optional=True)
        sl.addWidget(self.vary, 0, 0)
        sl.addWidget(self.vary2, 1, 0)
        spread = QWidget()
        pl = QHBoxLayout(spread)
        pl.setContentsMargins(0, 0, 0, 0)
        self.family_box = QComboBox()     # filled for the case's type (refresh)
        pl.addWidget(QLabel("Every applicable method of"))
        pl.addWidget(self.family_box)
        pl.addStretch(1)
        env = QWidget()
        el = QGridLayout(env)
        el.setContentsMargins(0, 0, 0, 0)
        self.env_x = _Range("Across")
        self.env_y = _Range("Up")
        self.required = QLineEdit()
        self.required.setMaximumWidth(90)
        self.required.setPlaceholderText("the case's")
        self.required_unit = QLabel("")
        el.addWidget(self.env_x, 0, 0, 1, 4)
        el.addWidget(self.env_y, 1, 0, 1, 4)
        el.addWidget(QLabel("Required duty"), 2, 0)
        el.addWidget(self.required, 2, 1)
        el.addWidget(self.required_unit, 2, 2)
        el.setColumnStretch(3, 1)
        self.fit_setup = studies_fit.FitSetup()
        for w in (sweep, spread, env, self.fit_setup):
            self.setup.addWidget(w)
        self.setup.setSizePolicy(QSizePolicy.Preferred, QSizePolicy.Maximum)
        lay.addWidget(self.setup)

        bar = QHBoxLayout()
        self.progress = QProgressBar()
        self.progress.setMaximumHeight(18)
        self.progress.setFormat("%v of %m points")
        self.progress.setValue(0)
        self.note = QLabel("")
        self.note.setWordWrap(True)
        self.note.setMaximumHeight(2 * self.note.fontMetrics().lineSpacing() + 4)
        bar.addWidget(self.progress, 1)
        bar.addWidget(self.note, 2)
        lay.addLayout(bar)
        # the fit's answer in words: the fitted values, then why to distrust them if so
        self.fit_verdict = QLabel("")
        self.fit_verdict.setObjectName("fit-verdict")
        self.fit_verdict.setWordWrap(True)
        self.fit_verdict.setTextInteractionFlags(Qt.TextSelectableByMouse)
        self.fit_verdict.setVisible(False)
        lay.addWidget(self.fit_verdict)

        self.split = split = QSplitter(Qt.Vertical)
        split.setChildrenCollapsible(False)
        self.plot = _Canvas()
        self.ax = self.plot.figure.subplots()
        self.table = QTableWidget(0, 0)
        self.table.setEditTriggers(QTableWidget.NoEditTriggers)
        self.table.verticalHeader().setVisible(False)
        split.addWidget(self.plot)
        split.addWidget(self.table)
        self.plot.setMinimumHeight(160)
        # the header and two rows stay in sight however small the window
        self.table.setMinimumHeight(self.table.horizontalHeader().sizeHint().height()
                                    + 2 * self.table.verticalHeader().defaultSectionSize()
                                    + self.table.horizontalScrollBar().sizeHint().height() + 4)
        split.setSizes([520, 110])
        lay.addWidget(split, 1)

        self.kind_box.currentIndexChanged.connect(self._kind_changed)
        self.show_box.currentIndexChanged.connect(lambda _i: self._draw())
        self.run_button.clicked.connect(self.run)
        self.stop_button.clicked.connect(self.stop)
        self.export_button.clicked.connect(self._export)

    # --- the case and its choices ------------------------------------------------------------
    def refresh(self):
        """Fill the choices for the current case (call when the case or the units change)."""
        case = self.current_case()
        self.system = self.unit_system()
        self._filled_for = None if case is None else (case.name, case.type, self.system)
        self.run_button.setEnabled(case is not None and self._thread is None)
        if case is None:
            self.note.setText("The datasheet has no valid case to study.")
            return
        self.vary.fill(case, self.system, "tubes.length")
        self.vary2.fill(case, self.system)
        level = "thermosiphon.liquid_level" if case.type == "thermosiphon" else "boiling.mass_flow"
        self.env_x.fill(case, self.system, level)
        self.env_y.fill(case, self.system, "heating.pressure")
        self.required_unit.setText(units.unit_label("power", self.system))
        self.fit_setup.fill(case, self.system)
        self._fill_families(case)
        self._fill_show(case)
        self._kind_changed()

    def _fill_families(self, case):
        """The method families whose choice this exchanger type has, by the catalogue's
        label of the input each sets."""
        keep = self.family_box.currentData()
        self.family_box.blockSignals(True)
        self.family_box.clear()
        for key, label in studies.spread.families_of(case.type):
            self.family_box.addItem(label, key)
        self.family_box.setCurrentIndex(max(self.family_box.findData(keep), 0))
        self.family_box.blockSignals(False)

    def _fill_show(self, case):
        keep = self.show_box.currentData()
        self.show_box.blockSignals(True)
        self.show_box.clear()
        for key, f in catalogue.SUMMARY.items():
            if case.type in f.types and f.quantity not in ("count", "text"):
                self.show_box.addItem(f.label, key)
        i = self.show_box.findData(keep or "duty_W")
        self.show_box.setCurrentIndex(max(i, 0))
        self.show_box.blockSignals(False)

    def _kind_changed(self, *_):
        kind = self.kind_box.currentData()
        index = [k for k, _ in KINDS].index(kind)
        # the set-up takes the height of its own page, not of the tallest one
        for i in range(self.setup.count()):
            self.setup.widget(i).setSizePolicy(
                QSizePolicy.Preferred, QSizePolicy.Maximum if i == index else QSizePolicy.Ignored)
        self.setup.setCurrentIndex(index)
        self.setup.adjustSize()
        self.show_box.setEnabled(kind in ("sweep", "spread"))

    # --- running -------------------------------------------------------------------------------
    def executor(self):
        if self._executor is None:
            self._executor = self._make_executor()
        return self._executor

    def run(self):
        case = self.current_case()
        if case is None or self._thread is not None:
            return
        if (case.name, case.type, self.unit_system()) != self._filled_for:
            self.refresh()
            self.note.setText("The case or the units changed: the set-up now offers this "
                              "case's inputs; check it and run again.")
            return
        kind = self.kind_box.currentData()
        try:
            job = self._job(kind, case)
        except (ValueError, InputError) as exc:
            self.note.setText(_short(exc))
            return
        self._cancel.clear()
        self.run_button.setEnabled(False)
        self.stop_button.setEnabled(True)
        self.note.setText("rating… the first study also starts the worker processes")
        self.progress.setFormat("%v of %m points")
        self.progress.setMaximum(100)
        self.progress.setValue(0)
        executor = self.executor()
        signals, cancel = self.signals, self._cancel

        def work():
            try:
                study = job(executor=executor, cancel=cancel.is_set,
                            progress=lambda done, total: signals.progress.emit(done,
                                                                               total or 0))
                signals.finished.emit((kind, study), None)
            except InputError as exc:
                signals.finished.emit(None, _short(exc))
            except Exception as exc:  # noqa: BLE001 - shown beside the study, never a traceback
                signals.finished.emit(None, f"{type(exc).__name__}: {_short(exc)}")

        self._thread = threading.Thread(target=work, name="ebullio-study", daemon=True)
        self._thread.start()

    def _job(self, kind, case):
        if kind == "sweep":
            variations = [v for v in (self.vary.variation(), self.vary2.variation()) if v]
            return lambda **kw: studies.sweep(case, variations, **kw)
        if kind == "spread":
            family = self.family_box.currentData()
            return lambda **kw: studies.method_spread(case, family, **kw)
        if kind == "fit":
            measured, fitted = self.fit_setup.measurements(), self.fit_setup.parameters()
            self._tolerances = {m.key: m.tolerance for m in measured}
            self._parameters = fitted

            def job(executor, cancel, progress):
                return studies.fit(case, measured, fitted, executor=executor, cancel=cancel,
                                   progress=progress)   # total None: not known
            return job
        x, y = self.env_x.variation(), self.env_y.variation()
        try:
            number = units.parse_number(self.required.text())
        except ValueError as exc:
            raise ValueError(f"Required duty: a number, or empty for the case's own ({exc})"
                             ) from None
        required = None if number is None else units.from_display(number, "power", self.system)
        return lambda **kw: studies.envelope(case, x, y, required_duty=required, **kw)

    def stop(self):
        """Cancel the points not yet started; the running ones finish."""
        self._cancel.set()
        self.note.setText("stopping: the points already running finish first")

    def busy(self) -> bool:
        return self._thread is not None

    def _on_progress(self, done, total):
        if total == 0:     # a fit (total None): the number of ratings is not known beforehand
            self.progress.setMaximum(0)
            self.note.setText(f"fitting… {done} ratings so far")
            return
        self.progress.setMaximum(total)
        self.progress.setValue(done)

    def _on_finished(self, outcome, error):
        self._thread = None
        self.run_button.setEnabled(True)
        self.stop_button.setEnabled(False)
        if error is not None:
            self.note.setText(f"The study stopped: {error}")
            return
        self.kind, self.study = outcome
        self.fit_verdict.setVisible(self.kind == "fit")
        if self.kind == "fit":
            self.progress.setFormat("%v ratings")
            self.progress.setMaximum(max(1, self.study.ratings))
            self.progress.setValue(self.study.ratings)
            self.note.setText({"fitted": "the fit meets the measurements",
                               "poor": "the fit misses the measurements",
                               "unidentifiable": "the measurements do not fix every input",
                               }.get(self.study.status, ""))
            self.split.setSizes([400, 180])
            self.fit_verdict.setText(studies_fit.verdict(self.study, self._parameters,
                                                         self.system))
            colour = {"fitted": "#1d6b3a"}.get(self.study.status, "#a03800")
            self.fit_verdict.setStyleSheet(f"color: {colour}; font-weight: bold")
            self.export_button.setEnabled(self.study.status not in ("failed", "cancelled"))
            self._draw()
            self._fill_table()
            return
        points = self.study.points
        bad = [p for p in points if not p.rated]
        self.note.setText(f"{len(points) - len(bad)} of {len(points)} points rated"
                          + (f"; {len(bad)} not (see the table)" if bad else ""))
        self.export_button.setEnabled(True)
        self._draw()
        self._fill_table()

    def shutdown(self):
        self._cancel.set()
        if self._thread is not None:
            self._thread.join(timeout=30)
        if self._executor is not None:
            self._executor.shutdown(wait=False, cancel_futures=True)
            self._executor = None

    # --- drawing ---------------------------------------------------------------------------
    def _draw(self):
        if self.study is None:
            return
        axes = self._axes(2 if self.kind == "fit" else 1)
        ax = self.ax
        for a in axes:
            a.clear()
            self.plot._style(a, "")
        # room on the left for the methods' names, on the right for a legend; between the
        # fit's two plots for the measurements' names
        self.plot.MARGINS = {"spread": (230, 30, 40, 46, 40, 60),
                             "fit": (74, 24, 26, 46, 40, 250)}.get(self.kind,
                                                                  (74, 190, 26, 46, 40, 60))
        if self.kind == "fit":
            title = studies_fit.draw(axes, self.study, self.system)
        else:
            title = {"sweep": self._draw_sweep, "spread": self._draw_spread,
                     "envelope": self._draw_envelope}[self.kind]()
        ax.set_title(title, fontsize=FONT + 1, loc="left", color=INK)
        self._fit_margins()
        self.plot.canvas.draw_idle()

    def _fit_margins(self):
        """Margins from what was drawn, so that no tick label, axis label or legend is cut:
        a value of 9,000,000 Btu/h needs more room than one of 2.6 MW."""
        fig, canvas = self.plot.figure, self.plot.canvas
        self.plot._relayout()
        if fig.get_size_inches()[0] * fig.dpi < 50:
            return
        canvas.draw()
        renderer = canvas.get_renderer()
        left, right, top, bottom, hgap, wgap = self.plot.MARGINS
        axes = fig.axes
        boxes = [a.yaxis.get_tightbbox(renderer) for a in axes]     # None: nothing drawn
        need = [(b.width if b is not None else 0.0) + 12 for b in boxes]
        left = max(60, need[0])
        if len(axes) > 1:
            wgap = max(40, need[1] + 24)
        legend, right = axes[-1].get_legend(), 24
        if legend is not None:
            box = legend.get_window_extent(renderer)
            if box.x0 > axes[-1].get_window_extent(renderer).x1:     # outside, on the right
                right = box.width + 24
        # a title that would reach under the caution every saved picture carries (top
        # right) starts below it
        titles = [a._left_title.get_window_extent(renderer) for a in axes
                  if a.get_title(loc="left")]
        cautions = [t.get_window_extent(renderer) for t in fig.texts if t.get_text()]
        under = any(c.x0 < b.x1 + 6 for b in titles for c in cautions)
        top = max((b.height for b in titles), default=0.0) + 10 + (
            max(c.height for c in cautions) if under else 0.0)
        self.plot.MARGINS = (left, right, top, bottom, hgap, wgap)
        self.plot._relayout()

    def _axes(self, count):
        """One plot, or the fit's two side by side; made again only when the count changes."""
        figure = self.plot.figure
        if len(figure.axes) != count:
            for a in list(figure.axes):
                figure.delaxes(a)
            made = figure.subplots(1, count)
            self.plot.grid = (1, count)
            self.ax = made if count == 1 else made[0]
        return list(figure.axes)

    def _result_axis(self):
        key = self.show_box.currentData() or "duty_W"
        f = catalogue.SUMMARY[key]
        return key, f, f"{f.label} [{units.unit_label(f.quantity, self.system)}]"

    def _input_label(self, path):
        f = catalogue.input_field(path)
        return f"{f.label} [{units.unit_label(f.quantity, self.system)}]"

    def _draw_sweep(self):
        ax, s = self.ax, self.study
        key, f, ylabel = self._result_axis()
        first = s.variations[0]
        q1 = catalogue.input_field(first.path).quantity
        x = _display(first.values, q1, self.system)
        grid = s.grid(key)
        colours = [C["blue"], C["vermillion"], C["green"], C["orange"], C["purple"], C["sky"],
                   INK]
        if len(s.variations) == 1:
            ax.plot(x, _display(list(grid), f.quantity, self.system), "o-", color=C["blue"],
                    lw=1.8, ms=4)
        else:
            second = s.variations[1]
            q2 = catalogue.input_field(second.path).quantity
            for j, v in enumerate(second.values):
                ax.plot(x, _display(list(grid[:, j]), f.quantity, self.system), "o-", ms=3.5,
                        lw=1.5, color=colours[j % len(colours)],
                        label=units.format_value(v, q2, self.system))
            ax.legend(title=catalogue.input_field(second.path).label, fontsize=FONT - 1,
                      title_fontsize=FONT - 1, frameon=False, loc="upper left",
                      bbox_to_anchor=(1.01, 1.0))
        failed = [i for i, p in enumerate(s.points) if not p.rated]
        for n in failed:
            i = np.unravel_index(n, s.shape)[0]
            ax.axvline(x[i], color="#aaaaaa", ls=":", lw=1.0)
        if failed:
            ax.text(0.01, 0.02, "dotted: points not rated (reason in the table)",
                    transform=ax.transAxes, fontsize=FONT - 1, color="#555555")
        ax.set_xlabel(self._input_label(first.path), fontsize=FONT)
        ax.set_ylabel(ylabel, fontsize=FONT)
        return f"{f.label} against {catalogue.input_field(first.path).label.lower()}"

    def _draw_spread(self):
        """One dot per method on a common scale (not bars cut off at an offset, which would
        make a small spread look large), the case's own method marked, the range shaded."""
        ax, s = self.ax, self.study
        key, f, label = self._result_axis()
        names = [m[0] for m in s.methods]
        values = _display(s.values(key), f.quantity, self.system)
        ypos = np.arange(len(names))[::-1]
        finite = values[np.isfinite(values)]
        title = f"{f.label}: not computed by any method"
        if finite.size:
            lo, hi = finite.min(), finite.max()
            ax.axvspan(lo, hi, color=C["sky"], alpha=0.18, lw=0)
            unit = units.unit_label(f.quantity, self.system)
            share = f" ({100 * (hi - lo) / abs(lo):.1f} % of the lowest)" if lo else ""
            title = (f"{f.label}: {units.format_number(lo)} to {units.format_number(hi)} {unit}"
                     f"\nspread {units.format_number(hi - lo)} {unit}{share}")
            pad = 0.25 * (hi - lo) if hi > lo else 0.02 * abs(hi) or 1.0
            ax.set_xlim(lo - pad, hi + pad)
        for y, v, name in zip(ypos, values, names):
            own = name == s.chosen
            if math.isfinite(v):
                ax.plot(v, y, "o", ms=9 if own else 7, ls="none",
                        color=C["vermillion"] if own else C["blue"])
            else:
                ax.text(0.02, y, "not rated (see the table)", va="center", fontsize=FONT,
                        color="#555555", transform=ax.get_yaxis_transform())
        ax.set_yticks(ypos)
        ax.set_yticklabels([t + ("  (the case's)" if n == s.chosen else "")
                            for n, t, _ in s.methods], fontsize=FONT)
        ax.set_ylim(-0.7, len(names) - 0.3)
        ax.xaxis.set_major_formatter(FuncFormatter(_tick))     # no power of ten aside
        ax.set_xlabel(label, fontsize=FONT)
        return title

    def _draw_envelope(self):
        ax, e = self.ax, self.study
        qx = catalogue.input_field(e.x.path).quantity
        qy = catalogue.input_field(e.y.path).quantity
        xs = _display(e.x.values, qx, self.system)
        ys = _display(e.y.values, qy, self.system)
        inside = e.inside
        shown = set()
        for i, j in np.ndindex(inside.shape):
            failed = [k for k in e.limits if e.within[k][i, j] is False]
            if inside[i, j] is True:
                style = dict(marker="o", color=C["green"], label="within every limit")
            elif failed:
                k = failed[0]
                style = dict(marker="x", color=LIMIT_COLOURS[k], label=SHORT[k])
            else:
                style = dict(marker=".", color="#999999", label="not rated")
            label = style.pop("label")
            ax.plot(xs[i], ys[j], ls="none", ms=6, mew=1.6, **style,
                    label=None if label in shown else label)
            shown.add(label)
        for k in e.limits:
            edge = [(x, y) for x, y in e.boundary(k) if y is not None]
            if edge:
                bx = _display([x for x, _ in edge], qx, self.system)
                by = _display([y for _, y in edge], qy, self.system)
                ax.plot(bx, by, "-", marker="D", ms=4, color=LIMIT_COLOURS[k], lw=1.8,
                        label=f"edge: {SHORT[k]}")
        ox, oy = e.operating_point
        if isinstance(ox, (int, float)) and isinstance(oy, (int, float)):
            ax.plot(units.to_display(ox, qx, self.system), units.to_display(oy, qy, self.system),
                    marker="*", ms=14, color=INK, ls="none", label="operating point")
        ax.legend(fontsize=FONT - 1, frameon=False, loc="upper left", bbox_to_anchor=(1.01, 1.0))
        ax.margins(0.06)              # no point drawn on the frame
        ax.set_xlabel(self._input_label(e.x.path), fontsize=FONT)
        ax.set_ylabel(self._input_label(e.y.path), fontsize=FONT)
        duty = (f", duty {units.format_value(e.required_duty, 'power', self.system)}"
                if e.required_duty else "")
        return f"Operating envelope{duty} (colour: the first limit a point fails)"

    # --- the table and the export ------------------------------------------------------------
    def _fill_table(self):
        s, system = self.study, self.system
        if self.kind == "fit":
            heads, rows = studies_fit.table_rows(s, self._tolerances, system)
            self._set_table(heads, rows)
            return
        if self.kind == "spread":
            names, keys = ["method"], list(s.keys)
        else:
            names = list(s.points[0].inputs) if s.points else []
            keys = [k for k in ("duty_W", "over_design_pct", "exit_quality", "max_chf_ratio",
                                "circulation_kg_s", "surface_vapour_velocity_m_s")
                    if s.case_type in catalogue.SUMMARY[k].types] if hasattr(s, "case_type") \
                else []
        keys = [k for k in keys if any(p.value(k) is not None for p in s.points)]
        heads = [("Method" if n == "method" else self._input_label(n)) for n in names]
        heads += [f"{catalogue.SUMMARY[k].label} "
                  f"[{units.unit_label(catalogue.SUMMARY[k].quantity, system)}]" for k in keys]
        heads.append("Status")
        self.table.setColumnCount(len(heads))
        self.table.setHorizontalHeaderLabels(heads)
        self.table.setRowCount(len(s.points))
        for r, p in enumerate(s.points):
            cells = []
            for n in names:
                v = p.inputs[n]
                cells.append(dict((m[0], m[1]) for m in s.methods)[v] if n == "method"
                             else units.format_number(
                    units.to_display(v, catalogue.input_field(n).quantity, system)))
            for k in keys:
                v = p.value(k)
                cells.append("not computed" if v is None else units.format_number(
                    units.to_display(v, catalogue.SUMMARY[k].quantity, system)))
            cells.append(p.status + (f": {p.message}" if p.message else ""))
            for c, text in enumerate(cells):
                item = QTableWidgetItem(str(text))
                item.setToolTip(str(text))
                if c < len(cells) - 1:
                    item.setTextAlignment(Qt.AlignRight | Qt.AlignVCenter)
                self.table.setItem(r, c, item)
        self.table.resizeColumnsToContents()

    def _set_table(self, heads, rows):
        """Plain rows of text; numbers (every column but the first and the last) right."""
        self.table.setColumnCount(len(heads))
        self.table.setHorizontalHeaderLabels(heads)
        self.table.setRowCount(len(rows))
        for r, cells in enumerate(rows):
            for c, text in enumerate(cells):
                item = QTableWidgetItem(str(text))
                item.setToolTip(str(text))
                if 0 < c < len(cells) - 1:
                    item.setTextAlignment(Qt.AlignRight | Qt.AlignVCenter)
                self.table.setItem(r, c, item)
        self.table.resizeColumnsToContents()

    def save(self, path):
        """The window's "Save plots" while this tab is shown: the study's plot."""
        self.plot.save(path)

    def _export(self):
        if self.study is None:
            return
        path, _ = QFileDialog.getSaveFileName(self, "Export the study as CSV", "study.csv",
                                              "CSV (*.csv)")
        if path:
            self.export_csv(path)

    def export_csv(self, path):
        """Write the study's table (SI, with the caution on the first line)."""
        from rating.studies.export import write_csv

        keys = [] if self.kind in ("spread", "fit") else [
            k for k, f in catalogue.SUMMARY.items() if self.study.case_type in f.types]
        try:
            write_csv(self.study, path, keys, CAUTION)
        except OSError as exc:
            self.note.setText(f"Could not write {path}: {exc.strerror or exc}")
            return False
        self.note.setText(f"Written: {path}")
        return True


def _short(exc) -> str:
    """The first clause of a message: the set-up's own lists show the choices."""
    return str(exc).splitlines()[0].split("; choose one of")[0] if str(exc) else \
        type(exc).__name__
