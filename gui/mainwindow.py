"""The main window: the cases, the datasheet of the chosen case, and its answer.

Layout, from left to right, in the order the engineer works: the project's cases
(with the status of each), the datasheet of the chosen case under a drawing of the
unit to scale, and the answer — a one-line verdict, the key figures, the warnings
and the plots along the tube. The window only wires the parts together: the
document holds the project, the runner rates, the forms and panels show.
"""
from __future__ import annotations

import os
import sys
import threading
from pathlib import Path

from PySide6.QtCore import QByteArray, QObject, QSize, Qt, QTimer, Signal
from PySide6.QtGui import QAction, QActionGroup, QGuiApplication, QKeySequence
from PySide6.QtWidgets import (QApplication, QComboBox, QDockWidget, QFileDialog, QFrame,
                               QHBoxLayout, QInputDialog, QLabel, QListWidget, QListWidgetItem,
                               QMainWindow, QMenu, QMessageBox, QProgressBar, QPushButton,
                               QSplitter, QStackedWidget, QTabWidget, QTextBrowser, QToolButton,
                               QVBoxLayout, QWidget)

from rating import catalogue

from . import files, units
from .document import Document, new_draft
from .forms import CaseForm
from .results import CompareTable, FiguresTable, WarningsList
from .runner import RATING, Runner
from .sketch import UnitSketch
from .style import STATUS_COLOURS
from .verdict import verdict
from .warning_text import rules_html

from rating.caution import CAUTION, CAUTION_SHORT, SCOPE
from rating.catalogue import TYPE_TITLES
FILE_FILTER = "Ebullio projects (*.ebullio);;All files (*)"
AUTOSAVE_MS = 15000
PROGRESS_DELAY_MS = 250     # a rating still running after this shows its progress and Stop
_AT_EXIT: list = []


def samples_folder() -> Path | None:
    """The bundled samples, when Ebullio runs from its source folder."""
    folder = Path(__file__).resolve().parent.parent / "samples"
    return folder if folder.is_dir() else None


def sample_files() -> list[Path]:
    folder = samples_folder()
    return sorted(folder.glob("*.ebullio")) if folder else []


class StartPage(QWidget):
    """What an empty window offers: a new case of each type, a sample, a recent file."""

    def __init__(self, window: "MainWindow"):
        super().__init__(window)
        self.setObjectName("start-page")
        outer = QVBoxLayout(self)
        outer.setContentsMargins(40, 30, 40, 30)
        title = QLabel("<h1>Ebullio</h1><p style='font-size:12pt'>Does this evaporator or reboiler "
                       "do the duty, with what margin, and where does it fail first?</p>")
        title.setWordWrap(True)
        outer.addWidget(title)
        cols = QHBoxLayout()
        cols.setSpacing(30)
        outer.addLayout(cols, 1)

        def column(heading):
            box = QVBoxLayout()
            lab = QLabel(f"<h3>{heading}</h3>")
            box.addWidget(lab)
            cols.addLayout(box, 1)
            return box

        new = column("Start a case")
        for t in ("evaporator", "thermosiphon", "kettle"):
            b = QPushButton(f"New {TYPE_TITLES[t]} case")
            b.setObjectName(f"start-new-{t}")
            b.clicked.connect(lambda _=False, t=t: window.new_case(t))
            new.addWidget(b)
        b = QPushButton("Open a project…")
        b.clicked.connect(window.open_dialog)
        new.addWidget(b)
        new.addStretch(1)

        self.samples = QListWidget()
        self.samples.setObjectName("start-samples")
        for path in sample_files():
            it = QListWidgetItem(path.stem.replace("-", " "))
            it.setData(Qt.UserRole, str(path))
            it.setToolTip(str(path))
            self.samples.addItem(it)
        self.samples.itemActivated.connect(lambda it: window.open_path(it.data(Qt.UserRole)))
        box = column("Open a sample")
        box.addWidget(self.samples)

        self.recent = QListWidget()
        self.recent.setObjectName("start-recent")
        self.recent.itemActivated.connect(lambda it: window.open_path(it.data(Qt.UserRole)))
        box = column("Recent projects")
        box.addWidget(self.recent)

        caution = QLabel(f"<i>{CAUTION}</i>")
        caution.setWordWrap(True)
        outer.addWidget(caution)

    def refresh(self):
        self.recent.clear()
        for p in files.recent_files():
            it = QListWidgetItem(Path(p).name)
            it.setData(Qt.UserRole, p)
            it.setToolTip(p)
            self.recent.addItem(it)
        if not self.recent.count():
            it = QListWidgetItem("none yet")
            it.setFlags(Qt.NoItemFlags)
            self.recent.addItem(it)


class MainWindow(QMainWindow):
    def __init__(self, *, first_start_caution=True):
        super().__init__()
        self.setObjectName("ebullio-main")
        self.doc = Document(self)
        self.runner = Runner(self.doc, self)
        self.session = f"{os.getpid()}-{id(self):x}-{os.urandom(4).hex()}"
        files.live_sessions.add(self.session)
        self.autosave_file: Path | None = None
        self.current_id: int | None = None
        self.compare_with = ""          # "" nothing, "previous", or an entry id as text
        self.system = str(files.settings().value("unit_system", "metric"))
        if self.system not in units.SYSTEMS:
            self.system = "metric"
        self.forms: dict[str, CaseForm] = {}
        self._shown = None
        self._typing = False
        self._warming = None
        self._imported = _Imported(self)
        self._imported.plotting.connect(self.ensure_plots)
        self._imported.ready.connect(self._imports_done)
        self._ready, self._to_open = False, None
        self._build()
        self._actions()
        self._wire()
        self.resize(1280, 800)
        geometry = files.settings().value("geometry")
        if isinstance(geometry, QByteArray):
            self.restoreGeometry(geometry)
        self._autosave_timer = QTimer(self)
        self._autosave_timer.setInterval(AUTOSAVE_MS)
        self._autosave_timer.timeout.connect(self.autosave_now)
        self._autosave_timer.start()
        self._update_title()
        self._show_cases()
        self.first_start_caution = first_start_caution

    # --- building ------------------------------------------------------------------------
    def _build(self):
        self.pages = QStackedWidget(self)
        self.start = StartPage(self)
        self.pages.addWidget(self.start)
        work = QSplitter(Qt.Horizontal)
        work.setObjectName("work-area")
        work.setChildrenCollapsible(False)
        self.pages.addWidget(work)
        self.setCentralWidget(self.pages)

        work.addWidget(self._datasheet_column())
        work.addWidget(self._answer_column())
        work.insertWidget(0, self._case_column())
        for i, stretch in enumerate((0, 1, 2)):   # a wide screen widens the datasheet too
            work.setStretchFactor(i, stretch)
        self.work = work

        self.units_label = QLabel("")
        self.statusBar().addPermanentWidget(self.units_label)

    def _datasheet_column(self) -> QWidget:
        """Title, the drawing of the unit, and the datasheet of the chosen case."""
        sheet = QWidget()
        sl = QVBoxLayout(sheet)
        sl.setContentsMargins(4, 4, 0, 0)
        sl.setSpacing(4)
        self.sheet_title = QLabel("")
        self.sheet_title.setObjectName("datasheet-title")
        self.sheet_title.setWordWrap(True)
        sl.addWidget(self.sheet_title)
        self.sketch = UnitSketch()
        self.sketch.setObjectName("unit-drawing")
        sl.addWidget(self.sketch)
        self.form_stack = QStackedWidget()
        sl.addWidget(self.form_stack, 1)
        sheet.setMinimumWidth(360)
        return sheet


    def _answer_column(self) -> QWidget:
        """The verdict, progress and comparison choice, key figures and warnings, the
        result tabs, and the caution."""
        answer = QWidget()
        al = QVBoxLayout(answer)
        al.setContentsMargins(0, 4, 4, 0)
        al.setSpacing(4)
        self.verdict = QLabel("")
        self.verdict.setObjectName("verdict")
        self.verdict.setWordWrap(True)
        self.verdict.setTextInteractionFlags(Qt.TextSelectableByMouse | Qt.TextSelectableByKeyboard)
        self.verdict.setMinimumHeight(44)
        f = self.verdict.font()
        f.setPointSizeF(f.pointSizeF() * 1.1)
        self.verdict.setFont(f)
        al.addWidget(self.verdict)
        al.addLayout(self._answer_bar())
        al.addWidget(self._results_area(), 1)
        self.caution = QLabel(CAUTION_SHORT)
        self.caution.setObjectName("caution")
        self.caution.setStyleSheet("color: #555555;")
        self.caution.setWordWrap(True)
        al.addWidget(self.caution)
        return answer

    def _answer_bar(self) -> QHBoxLayout:
        """Progress and Stop (shown for a rating that takes a while), and 'Compare with'."""
        bar = QHBoxLayout()
        self.progress = QProgressBar()
        self.progress.setRange(0, 100)
        self.progress.setTextVisible(True)
        self.progress.setFormat("rating… %p %")
        self.progress.setMaximumHeight(18)
        self.stop_button = QPushButton("Stop")
        self.stop_button.setToolTip("Stop the running rating (Ctrl+.)")
        self.stop_button.clicked.connect(self.stop_rating)
        bar.addWidget(self.progress, 1)
        bar.addWidget(self.stop_button)
        # Shown only for a rating still running after a moment: most take tens of ms,
        # and showing and hiding the bar for each re-lays the row out and repaints the
        # window in the GUI thread (the longest event-loop block of an edit).
        self._progress_shown = QTimer(self)
        self._progress_shown.setSingleShot(True)
        self._progress_shown.setInterval(PROGRESS_DELAY_MS)
        self._progress_shown.timeout.connect(self._show_progress)
        self.progress.setVisible(False)
        self.stop_button.setVisible(False)
        bar.addSpacing(12)
        bar.addWidget(QLabel("Compare with:"))
        self.compare_box = QComboBox()
        self.compare_box.setObjectName("compare-with")
        self.compare_box.setMinimumContentsLength(18)
        self.compare_box.setSizeAdjustPolicy(QComboBox.AdjustToMinimumContentsLengthWithIcon)
        bar.addWidget(self.compare_box)
        return bar


    def _results_area(self) -> QSplitter:
        """Key figures and warnings above the tabs of plots, comparison and studies."""
        split = QSplitter(Qt.Vertical)
        split.setChildrenCollapsible(False)
        top = QSplitter(Qt.Horizontal)
        top.setChildrenCollapsible(False)
        self.figures = FiguresTable()
        self.warnings = WarningsList()
        top.addWidget(self.figures)
        top.addWidget(self.warnings)
        top.setSizes([470, 330])
        self.tabs = QTabWidget()
        self.tabs.setObjectName("result-tabs")
        zoom = QToolButton()
        zoom.setText("Zoom and pan…")
        zoom.setToolTip("Open the plots shown in a window of their own, with zoom, pan and save (F9)")
        zoom.setAutoRaise(True)
        zoom.setFocusPolicy(Qt.NoFocus)        # the View menu has it (F9)
        zoom.clicked.connect(self.zoom_plots)
        self.tabs.setCornerWidget(zoom, Qt.TopRightCorner)
        # the plot panels are made just after the window first paints: importing and
        # building matplotlib is the slowest part of starting (see ensure_plots)
        self._along = self._balance = None
        self.along_slot, self.balance_slot = QLabel("preparing the plots…"), QLabel("")
        self.along_slot.setAlignment(Qt.AlignCenter)
        self.compare = CompareTable()
        side = QWidget()
        sl2 = QVBoxLayout(side)
        sl2.setContentsMargins(4, 4, 4, 4)
        self.compare_names = QLabel("")
        self.compare_names.setWordWrap(True)
        sl2.addWidget(self.compare_names)
        sl2.addWidget(self.compare, 1)
        self.tabs.addTab(self.along_slot, "Along the tube")
        self.tabs.addTab(self.balance_slot, "Circulation")
        self.tabs.addTab(side, "Side by side")
        self.side_tab = side
        self._pair = None                  # filled when its tab is shown (see _show_pair)
        self.tabs.currentChanged.connect(self._tab_chosen)
        self._studies = None              # made with the plots (it imports matplotlib and scipy)
        self.studies_slot = QLabel("preparing the studies…")
        self.studies_slot.setAlignment(Qt.AlignCenter)
        self.tabs.addTab(self.studies_slot, "Studies")
        split.addWidget(top)
        split.addWidget(self.tabs)
        split.setStretchFactor(0, 0)
        split.setStretchFactor(1, 1)
        split.setSizes([190, 560])
        return split

    def _case_column(self) -> QWidget:
        """The project's cases, with the buttons that add, copy, move and delete them."""
        cases = QWidget()
        cases.setObjectName("cases-panel")
        bl = QVBoxLayout(cases)
        bl.setContentsMargins(4, 4, 0, 4)
        bl.setSpacing(4)
        bl.addWidget(QLabel("<b>Cases</b>"))
        self.case_list = QListWidget()
        self.case_list.setObjectName("case-list")
        self.case_list.setMinimumWidth(170)
        self.case_list.setWordWrap(True)
        self.case_list.setHorizontalScrollBarPolicy(Qt.ScrollBarAlwaysOff)
        self.case_list.setTextElideMode(Qt.ElideMiddle)
        bl.addWidget(self.case_list, 1)
        self.case_buttons = QHBoxLayout()
        self.case_buttons.setSpacing(2)
        bl.addLayout(self.case_buttons)
        self.case_buttons2 = QHBoxLayout()
        self.case_buttons2.setSpacing(2)
        bl.addLayout(self.case_buttons2)
        return cases

    def _act(self, menu, text, slot, shortcut=None, tip=""):
        a = QAction(text, self)
        if shortcut:
            a.setShortcut(QKeySequence(shortcut))
        if tip:
            a.setStatusTip(tip)
        a.triggered.connect(slot)
        menu.addAction(a)
        self.addAction(a)          # shortcuts work wherever the focus is
        return a

    def _actions(self):
        mb = self.menuBar()
        self._file_menu(mb)
        self._edit_menu(mb)
        self._case_menu(mb)
        self._case_buttons()
        self._rating_menu(mb)
        self._view_menu(mb)
        self.report_menu = mb.addMenu("Re&port")
        self._install_report()
        self._help_menu(mb)

    def _file_menu(self, mb):
        """File: projects, samples, recent files, saving, the plots as pictures."""
        m = mb.addMenu("&File")
        self.a_new = self._act(m, "&New project", self.new_project, QKeySequence.New)
        self.a_open = self._act(m, "&Open…", self.open_dialog, QKeySequence.Open)
        self.samples_menu = m.addMenu("Open &sample")
        for path in sample_files():
            self._act(self.samples_menu, path.stem.replace("-", " "),
                      lambda _=False, p=path: self.open_path(p))
        self.recent_menu = m.addMenu("Open &recent")
        self.recent_menu.aboutToShow.connect(self._fill_recent)
        m.addSeparator()
        self.a_save = self._act(m, "&Save", self.save, QKeySequence.Save)
        self.a_save_as = self._act(m, "Save &as…", self.save_as, "Ctrl+Shift+S")
        self.a_save_plots = self._act(m, "Save &plots as…", self.save_plots, "Ctrl+Shift+P",
                                      "Save the plots shown as PNG or SVG")
        m.addSeparator()
        self._act(m, "&Quit", self.close, QKeySequence.Quit)

    def _edit_menu(self, mb):
        """Edit: undo and redo, the verdict to the clipboard, moving between areas."""
        m = mb.addMenu("&Edit")
        self.a_undo = self.doc.undo.createUndoAction(self, "&Undo")
        self.a_undo.setShortcut(QKeySequence.Undo)
        self.a_redo = self.doc.undo.createRedoAction(self, "&Redo")
        self.a_redo.setShortcuts([QKeySequence.Redo, QKeySequence("Ctrl+Y")])
        m.addAction(self.a_undo)
        m.addAction(self.a_redo)
        self.addAction(self.a_undo)
        self.addAction(self.a_redo)
        m.addSeparator()
        self._act(m, "Copy &verdict", self.copy_verdict, "Ctrl+Shift+C",
                  "Copy the one-line answer to the clipboard")
        self._act(m, "Go to &datasheet", self.focus_datasheet, "F6")
        self._act(m, "Go to &cases", lambda: self.case_list.setFocus(), "F7")
        self._act(m, "Go to &warnings", lambda: self.warnings.setFocus(), "F8")

    def _case_menu(self, mb):
        """Case: new, duplicate, rename, move, delete, next and previous."""
        m = mb.addMenu("&Case")
        self.a_new_case = {}
        for t, key in (("evaporator", "Ctrl+Shift+E"), ("thermosiphon", "Ctrl+Shift+T"),
                       ("kettle", "Ctrl+Shift+K")):
            self.a_new_case[t] = self._act(m, f"New {TYPE_TITLES[t]} case",
                                           lambda _=False, t=t: self.new_case(t), key)
        m.addSeparator()
        self.a_dup = self._act(m, "&Duplicate", self.duplicate_case, "Ctrl+D")
        self.a_rename = self._act(m, "Re&name…", self.rename_case, "F2")
        self.a_up = self._act(m, "Move &up", lambda: self.move_case(-1), "Ctrl+Alt+Up")
        self.a_down = self._act(m, "Move do&wn", lambda: self.move_case(1), "Ctrl+Alt+Down")
        self.a_delete = self._act(m, "De&lete", self.delete_case, "Ctrl+Del")
        m.addSeparator()
        self._act(m, "&Next case", lambda: self._step_case(1), "Ctrl+PgDown")
        self._act(m, "&Previous case", lambda: self._step_case(-1), "Ctrl+PgUp")

    def _case_buttons(self):
        """The buttons under the case list: the Case menu's commands, two short rows."""
        add_menu = QMenu(self)
        for a in self.a_new_case.values():
            add_menu.addAction(a)
        # two short rows: the case list may be narrow and the plots get the width
        second = self.case_buttons2
        for a, text in ((None, "New ▾"), (self.a_dup, "Duplicate"),
                        (self.a_up, "▲"), (self.a_down, "▼"), (self.a_delete, "Delete")):
            row = self.case_buttons if text in ("New ▾", "Duplicate") else second
            b = QToolButton()
            b.setText(text)
            if a is None:
                b.setMenu(add_menu)
                b.setPopupMode(QToolButton.InstantPopup)
                b.setToolTip("New case of a chosen exchanger type")
            else:
                b.clicked.connect(a.trigger)
                b.setToolTip(f"{a.text().replace('&', '')} ({a.shortcut().toString(QKeySequence.NativeText)})")
                a.enabledChanged.connect(b.setEnabled)
            b.setFocusPolicy(Qt.NoFocus)          # the same commands are in the Case menu
            row.addWidget(b)
        self.case_buttons.addStretch(1)
        second.addStretch(1)

    def _rating_menu(self, mb):
        """Rating: rate now or all, stop, re-rate while typing."""
        m = mb.addMenu("&Rating")
        self.a_rate = self._act(m, "&Rate now", self.rate_current, "F5")
        self.a_rate_all = self._act(m, "Rate &all cases", self.runner.rate_all, "Shift+F5",
                                    "Rate every case of the project, in parallel")
        self.a_stop = self._act(m, "&Stop rating", self.stop_rating, "Ctrl+.")
        self.a_live = self._act(m, "Re-rate &while typing", self._set_live)
        self.a_live.setCheckable(True)
        self.a_live.setChecked(True)

    def _view_menu(self, mb):
        """View: the unit system, the result tabs, the comparison, zoom and pan."""
        m = mb.addMenu("&View")
        group = QActionGroup(self)
        self.a_units = {}
        for i, s in enumerate(units.SYSTEMS):
            a = self._act(m, f"{units.SYSTEM_TITLES.get(s, s)} units", lambda _=False, s=s: self.set_system(s),
                          f"Ctrl+{i + 1}")
            a.setCheckable(True)
            a.setChecked(s == self.system)
            group.addAction(a)
            self.a_units[s] = a
        m.addSeparator()
        for i in range(4):
            self._act(m, f"Show “{self.tabs.tabText(i)}”",
                      lambda _=False, i=i: self.tabs.setCurrentIndex(i), f"Alt+{i + 1}")
        self._act(m, "Compare &with…", lambda: (self.compare_box.setFocus(), self.compare_box.showPopup()),
                  "Ctrl+Shift+W")
        self._act(m, "&Zoom and pan the plots…", self.zoom_plots, "F9",
                  "Open the plots shown in a window of their own, with zoom, pan and save")

    def _help_menu(self, mb):
        """Help: the methods of this rating, every warning, the caution, about."""
        m = mb.addMenu("&Help")
        self._act(m, "&Methods of this rating", self.show_methods, QKeySequence.HelpContents)
        self._act(m, "&Warnings Ebullio can give", lambda: self._text_dialog(
            "Warnings Ebullio can give", rules_html(self.system)))
        self._act(m, "&Caution", self.show_caution)
        self._act(m, "&About Ebullio", self.show_about)

    def _install_report(self):
        """The Report menu's commands (gui.report; a broken install says so, loudly)."""
        from .report import add_to_window

        add_to_window(self)

    def _wire(self):
        self.doc.casesChanged.connect(self._show_cases)
        self.doc.caseChanged.connect(self._case_edited)
        self.doc.dirtyChanged.connect(lambda _d: self._update_title())
        self.doc.pathChanged.connect(lambda _p: self._update_title())
        self.runner.stateChanged.connect(self._state_changed)
        self.runner.progressChanged.connect(self._progress)
        self.case_list.currentRowChanged.connect(self._row_chosen)
        self.case_list.itemDoubleClicked.connect(lambda _it: self.rename_case())
        self.compare_box.activated.connect(self._compare_chosen)

    # --- plots, made after the first paint ---
    def ensure_plots(self):
        if self._along is not None:
            return
        from .plots import AlongTubeFigure, BalanceFigure, PlotView

        self._along = PlotView(AlongTubeFigure, title="Along the tube")
        self._balance = PlotView(BalanceFigure, title="Circulation")
        self._put_tab(0, self._along, self.along_slot)
        self._put_tab(1, self._balance, self.balance_slot)
        self.warnings.positionChosen.connect(self._along.mark)
        self._shown = None
        self._show_answer()

    def _put_tab(self, i, panel, slot):
        """A panel made late takes the place of its placeholder tab."""
        current, visible = self.tabs.currentIndex(), self.tabs.isTabVisible(i)
        title = self.tabs.tabText(i)
        self.tabs.blockSignals(True)
        self.tabs.removeTab(i)
        self.tabs.insertTab(i, panel, title)
        self.tabs.setTabVisible(i, visible)
        self.tabs.setCurrentIndex(current)
        self.tabs.blockSignals(False)
        slot.deleteLater()

    def ensure_studies(self):
        """The Studies tab is made when first chosen: it brings scipy with it."""
        if self._studies is None:
            from .studies_panel import StudiesPanel

            self.ensure_plots()
            self._studies = StudiesPanel.for_window(self)
            self._put_tab(3, self._studies, self.studies_slot)

    @property
    def along(self):
        self.ensure_plots()
        return self._along

    @property
    def balance(self):
        self.ensure_plots()
        return self._balance

    @property
    def studies(self):
        self.ensure_studies()
        return self._studies

    def showEvent(self, event):
        super().showEvent(event)
        if self._warming is None:       # after the first paint, not before it
            self._warming = threading.Thread(target=warm_up, args=(self._imported,),
                                             name="ebullio-warm-up", daemon=True)
            QTimer.singleShot(0, self._warming.start)

    # --- the case list ---------------------------------------------------------------------
    def _show_cases(self):
        has_cases = bool(self.doc.entries)
        self.pages.setCurrentIndex(1 if has_cases else 0)
        if has_cases and not getattr(self, "_sized", False):
            self._sized = True                # the columns' widths, once the area is laid out
            QTimer.singleShot(0, self._size_columns)
        if not has_cases:
            self.start.refresh()
            self.current_id = None
        self.case_list.blockSignals(True)
        self.case_list.clear()
        for e in self.doc.entries:
            it = QListWidgetItem()
            it.setData(Qt.UserRole, e.id)
            self.case_list.addItem(it)
            self._paint_item(it, e)
        self.case_list.blockSignals(False)
        ids = [e.id for e in self.doc.entries]
        if has_cases:
            cid = self.current_id if self.current_id in ids else ids[0]
            self.case_list.setCurrentRow(ids.index(cid))
            if cid != self.current_id:
                self.select_case(cid)
            else:
                self._show_header()
        self._fill_compare()
        for a in (self.a_dup, self.a_rename, self.a_up, self.a_down, self.a_delete, self.a_rate):
            a.setEnabled(has_cases)

    def _size_columns(self):
        w = self.work.width()
        self.work.setSizes([int(w * 0.14), int(w * 0.30), w - int(w * 0.14) - int(w * 0.30)])

    def _paint_item(self, item, entry):
        st = self.runner.state(entry.id)
        status = st.status
        if status == RATING:
            status = f"rating {st.progress * 100:.0f} %"
        item.setText(f"{entry.name or '(no name)'}\n   {TYPE_TITLES.get(entry.type, entry.type)} · {status}")
        fg, bg = STATUS_COLOURS.get(st.status, STATUS_COLOURS["not rated"])
        from PySide6.QtGui import QBrush, QColor
        item.setForeground(QBrush(QColor(fg)))
        item.setBackground(QBrush(QColor(bg)))
        item.setToolTip(st.message or status)

    def _row_chosen(self, row):
        if 0 <= row < len(self.doc.entries):
            self.select_case(self.doc.entries[row].id)

    def select_case(self, entry_id: int):
        self.current_id = entry_id
        i = self.doc.index_of(entry_id)
        if self.case_list.currentRow() != i:
            self.case_list.setCurrentRow(i)
        entry = self.doc.entry(entry_id)
        form = self._form(entry.type)
        form.echo.clear()
        self.form_stack.setCurrentWidget(form)
        form.show_draft(entry.draft, self.system)
        self.sketch.show_draft(entry.draft, self.system)
        self._show_header()
        self._fill_compare()
        st = self.runner.state(entry_id)
        if st.result is None and st.status == "not rated" and self.runner.live:
            self.runner.rate(entry_id)
        self._show_answer()

    def _show_header(self):
        if self.current_id is None:
            return
        e = self.doc.entry(self.current_id)
        self.sheet_title.setText(f"<b>{e.name or '(no name)'}</b> — {TYPE_TITLES.get(e.type, e.type)}")

    def _form(self, case_type) -> CaseForm:
        form = self.forms.get(case_type)
        if form is None:
            form = self.forms[case_type] = CaseForm(case_type)
            form.setObjectName(f"datasheet-{case_type}")
            form.edited.connect(self._field_edited)
            form.committed.connect(lambda _path: self.current_id is not None
                                   and self.runner.commit(self.current_id))
            self.form_stack.addWidget(form)
        return form

    def current_form(self) -> CaseForm | None:
        w = self.form_stack.currentWidget()
        return w if isinstance(w, CaseForm) else None

    def _step_case(self, step):
        row = self.case_list.currentRow() + step
        if 0 <= row < self.case_list.count():
            self.case_list.setCurrentRow(row)

    # --- edits ------------------------------------------------------------------------------
    def _field_edited(self, path, value):
        if self.current_id is not None:
            form = self.current_form()
            self._typing = True
            self.runner.typing = form is not None and form.typing     # a keystroke waits
            try:
                self.doc.set_value(self.current_id, path, value)
            finally:
                self._typing = False
                self.runner.typing = False

    def _case_edited(self, entry_id, path):
        if entry_id == self.current_id:
            draft = self.doc.entry(entry_id).draft
            form = self.current_form()
            if form is not None:
                if not self._typing:          # undo, redo: every field shows the stored value
                    form.echo.clear()
                form.show_draft(draft, self.system)
            self.sketch.show_draft(draft, self.system)
            if path == "name":
                self._show_header()
            elif path == "type":               # another exchanger type: its own datasheet
                self.select_case(entry_id)

    def new_case(self, case_type: str):
        name = self.doc.unique_name(f"New {TYPE_TITLES[case_type]}")
        self.current_id = self.doc.add_case(new_draft(case_type, name))
        self._show_cases()
        self.focus_datasheet()

    def duplicate_case(self):
        if self.current_id is not None:
            self.current_id = self.doc.duplicate(self.current_id)
            self._show_cases()

    def rename_case(self):
        if self.current_id is None:
            return
        e = self.doc.entry(self.current_id)
        name, ok = QInputDialog.getText(self, "Rename case", "Case name:", text=e.name)
        if ok and name.strip() and name.strip() != e.name:
            if name.strip() in {x.name for x in self.doc.entries}:
                QMessageBox.information(self, "Rename case", f"A case named “{name.strip()}” exists already; "
                                                             "case names must differ.")
                return
            self.doc.rename(self.current_id, name.strip())

    def move_case(self, step):
        if self.current_id is not None:
            self.doc.move(self.current_id, step)

    def delete_case(self):
        if self.current_id is not None:
            i = self.doc.index_of(self.current_id)
            self.doc.remove_case(self.current_id)
            if self.doc.entries:
                self.current_id = self.doc.entries[min(i, len(self.doc.entries) - 1)].id
                self._show_cases()

    # --- rating -------------------------------------------------------------------------------
    def rate_current(self):
        if self.current_id is not None:
            self.runner.rate(self.current_id)

    def stop_rating(self):
        if self.current_id is not None and self.runner.state(self.current_id).status == RATING:
            self.runner.cancel(self.current_id)
        else:
            self.runner.cancel_all()

    def _set_live(self, on):
        self.runner.live = bool(on)

    def _progress(self, entry_id, fraction):
        item = self._item(entry_id)
        if item is not None:
            self._paint_item(item, self.doc.entry(entry_id))
        if entry_id == self.current_id and self.progress.isVisible():
            self.progress.setValue(int(fraction * 100))

    def _show_progress(self):
        """The progress bar and Stop, for the chosen case's rating still running."""
        if self.current_id is not None and self.runner.state(self.current_id).status == RATING:
            self.progress.setValue(int(self.runner.state(self.current_id).progress * 100))
            self.progress.setVisible(True)
            self.stop_button.setVisible(True)

    def _item(self, entry_id):
        for row in range(self.case_list.count()):
            it = self.case_list.item(row)
            if it.data(Qt.UserRole) == entry_id:
                return it
        return None

    def _state_changed(self, entry_id):
        item = self._item(entry_id)
        if item is not None:
            self._paint_item(item, self.doc.entry(entry_id))
        busy = sum(1 for s in self.runner.states.values() if s.status == RATING)
        self.statusBar().showMessage(f"rating {busy} case{'s' if busy > 1 else ''}…" if busy else "")
        if entry_id == self.current_id:
            self._show_answer()
        elif self.compare_with == str(entry_id):
            self._show_answer()

    def _show_answer(self):
        """Verdict, figures, warnings and plots of the chosen case (stale when its inputs moved)."""
        if self.current_id is None:
            return
        st = self.runner.state(self.current_id)
        entry = self.doc.entry(self.current_id)
        result = st.result
        running = st.status == RATING
        if not running:
            self._progress_shown.stop()
            if self.progress.isVisible():
                self.progress.setVisible(False)
                self.stop_button.setVisible(False)
        elif not self.progress.isVisible() and not self._progress_shown.isActive():
            self._progress_shown.start()
        text = verdict(st.failure if st.failure is not None else result, self.system,
                       message=st.message if st.failure is not None or result is None else "")
        if st.status == "invalid input":
            text = f"Inputs to correct: {st.message}"
        elif st.status == "not rated" and result is None:
            text = "Not rated yet: fill in the datasheet."
        if result is not None and st.stale:
            text += "  [the figures below are stale: from the inputs before the last edit]"
        self.verdict.setText(text)
        fg, bg = STATUS_COLOURS.get(st.status, STATUS_COLOURS["not rated"])
        self.verdict.setStyleSheet(f"QLabel {{ color: {fg}; background: {bg}; padding: 6px; "
                                   f"border-radius: 3px; }}")
        self.figures.show_result(result, self.system, stale=st.stale)
        self.warnings.show_result(result, self.system,
                                  failure_message=st.message if st.status in ("failed", "invalid input") else "")
        other, other_name = self._compared()
        is_ts = entry.type == "thermosiphon"
        curve_from = st.failure if st.failure is not None else result
        # the plots redraw only for a new result, not when the inputs go stale (a full
        # draw would block the typing); the verdict strip and the grey figures say stale
        shown = (id(result), id(other), id(curve_from), self.system, entry.type, other_name)
        if shown != self._shown:          # a redraw only when what the plots show changed
            self._shown = shown
            self.along.show_result(result, other, other_name, kettle=entry.type == "kettle",
                                   system=self.system)
            self.tabs.setTabVisible(1, is_ts)
            if is_ts:
                self.balance.show_result(curve_from, self.system)
            self._pair = (result, other, self.system)
            self._show_pair()
            self.compare_names.setText(
                f"<b>This case:</b> {entry.name}<br><b>Compared:</b> {other_name}" if other_name else
                "Choose what to compare with above (another case, or the rating before the last "
                "edit): both sets of key figures and their differences show here, and its "
                "profiles show as faint lines on the plots.")

    def _tab_chosen(self, index):
        if self.tabs.widget(index) is self.studies_slot:
            QTimer.singleShot(0, lambda: (self.ensure_studies(), self.tabs.setCurrentWidget(self._studies)))
        self._show_pair()

    def _show_pair(self):
        """The side-by-side table, filled only while its tab is shown (it costs an edit time)."""
        if self._pair is not None and self.tabs.currentWidget() is self.side_tab:
            self.compare.show_pair(*self._pair)
            self._pair = None

    # --- comparison ---------------------------------------------------------------------------
    def _fill_compare(self):
        box = self.compare_box
        box.blockSignals(True)
        box.clear()
        box.addItem("nothing", "")
        box.addItem("the rating before the last edit", "previous")
        for e in self.doc.entries:
            if e.id != self.current_id:
                box.addItem(e.name, str(e.id))
        i = box.findData(self.compare_with)
        if i < 0:
            self.compare_with, i = "", 0
        box.setCurrentIndex(i)
        box.blockSignals(False)

    def _compare_chosen(self, index):
        self.compare_with = self.compare_box.itemData(index) or ""
        if self.compare_with.isdigit():
            other = int(self.compare_with)
            if self.runner.state(other).result is None:
                self.runner.rate(other)
        self._show_answer()

    def compare_to(self, what: str):
        """Compare with "previous", "" (nothing) or an entry id (as text)."""
        i = self.compare_box.findData(what)
        if i >= 0:
            self.compare_box.setCurrentIndex(i)
            self._compare_chosen(i)

    def _compared(self):
        if not self.compare_with or self.current_id is None:
            return None, ""
        if self.compare_with == "previous":
            return self.runner.state(self.current_id).previous, "before the last edit"
        try:
            entry = self.doc.entry(int(self.compare_with))
        except (KeyError, ValueError):
            return None, ""
        return self.runner.state(entry.id).result, entry.name

    # --- units -----------------------------------------------------------------------------------
    def set_system(self, system: str):
        if system not in units.SYSTEMS:
            return
        self.system = system
        self.a_units[system].setChecked(True)
        files.settings().setValue("unit_system", system)
        self.units_label.setText(f"Units: {units.SYSTEM_TITLES.get(system, system)}")
        if self.current_id is not None:
            self.select_case(self.current_id)

    # --- files ------------------------------------------------------------------------------------
    def _update_title(self):
        name = self.doc.path.name if self.doc.path else "untitled project"
        self.setWindowTitle(f"{name}[*] — Ebullio")
        self.setWindowModified(self.doc.dirty)
        self.units_label.setText(f"Units: {units.SYSTEM_TITLES.get(self.system, self.system)}")

    def maybe_keep_changes(self) -> bool:
        """True when it is fine to drop the open project (saved, discarded or nothing to lose)."""
        if not self.doc.dirty:
            return True
        answer = self.ask_unsaved()
        if answer == QMessageBox.Save:
            return self.save()
        return answer == QMessageBox.Discard

    def ask_unsaved(self):
        name = self.doc.path.name if self.doc.path else "the untitled project"
        return QMessageBox.question(self, "Unsaved changes",
                                    f"Save the changes to {name} before they are lost?",
                                    QMessageBox.Save | QMessageBox.Discard | QMessageBox.Cancel,
                                    QMessageBox.Save)

    def new_project(self):
        if self.maybe_keep_changes():
            self._replace(None, None)

    def open_dialog(self):
        start = str(self.doc.path.parent) if self.doc.path else str(samples_folder() or Path.home())
        path, _ = QFileDialog.getOpenFileName(self, "Open project", start, FILE_FILTER)
        if path:
            self.open_path(path)

    def _imports_done(self):
        self._ready = True
        # the libraries' and the plots' objects live as long as the window: a full garbage
        # collection scanned them all (about 140,000, 0.11 s with every thread held); frozen,
        # they are no longer scanned (until the interpreter ends, which finalises them)
        import atexit
        import gc

        gc.freeze()
        if gc.unfreeze not in _AT_EXIT:
            _AT_EXIT.append(gc.unfreeze)
            atexit.register(gc.unfreeze)
        if self._to_open is not None:
            path, self._to_open = self._to_open, None
            self.statusBar().clearMessage()
            self.open_path(path)

    def open_when_ready(self, path):
        """Open a project once the background imports are done (the file given at start):
        the window stays live meanwhile instead of waiting for them."""
        if self._ready:
            self.open_path(path)
        else:
            self._to_open = path
            self.statusBar().showMessage(f"opening {Path(path).name}…")

    def open_path(self, path) -> bool:
        """Open a project file; a file that fails says why and changes nothing."""
        from rating.errors import RatingError

        if not self.maybe_keep_changes():
            return False
        try:
            project = files_load(path)
        except (RatingError, OSError) as exc:
            self.show_error("The project was not opened", str(exc).splitlines()[0])
            return False
        self._replace(project, path)
        files.remember(path)
        if not self.offer_recovery(path) and self.runner.live:
            self.runner.rate_all()      # every case shows its status in the list at once
        return True

    def _replace(self, project, path, drafts=None):
        self.runner.cancel_all()
        self._drop_autosave()
        self.current_id = None
        self.compare_with = ""
        self.runner.states.clear()
        self.doc.load(project, path, drafts)

    def save(self) -> bool:
        if self.doc.path is None:
            return self.save_as()
        return self._save_to(self.doc.path)

    def save_dialog(self) -> QFileDialog:
        """The Save As dialog: it adds ".ebullio" itself, before it asks about replacing a
        file, so "plant" asks about plant.ebullio."""
        start = str(self.doc.path or (Path.home() / "project.ebullio"))
        dialog = QFileDialog(self, "Save project as", start, FILE_FILTER)
        dialog.setAcceptMode(QFileDialog.AcceptSave)
        dialog.setFileMode(QFileDialog.AnyFile)
        dialog.setDefaultSuffix("ebullio")
        return dialog

    def ask_save_path(self) -> str:
        dialog = self.save_dialog()
        return dialog.selectedFiles()[0] if dialog.exec() and dialog.selectedFiles() else ""

    def confirm_replace(self, path: Path) -> bool:
        return QMessageBox.question(
            self, "Replace a file", f"{path.name} exists already in {path.parent}. Replace it?",
            QMessageBox.Yes | QMessageBox.Cancel, QMessageBox.Cancel) == QMessageBox.Yes

    def save_as(self) -> bool:
        path = self.ask_save_path()
        if not path:
            return False
        path = Path(path)
        if path.suffix != ".ebullio":       # a dialog that returned the bare name: its
            path = path.with_name(path.name + ".ebullio")   # check was not on this file
            if path.exists() and not self.confirm_replace(path):
                return False
        return self._save_to(path)

    def _save_to(self, path) -> bool:
        import rating
        from rating.errors import RatingError

        try:
            project = self.doc.to_project()
            rating.save_project(project, path)
        except (RatingError, OSError) as exc:
            self.show_error("The project was not saved", str(exc).splitlines()[0]
                            + "\nNothing was lost: the project stays open as it is.")
            return False
        old_autosave = self.autosave_file
        self.doc.saved_as(path)
        files.discard(old_autosave)
        self.autosave_file = None
        files.remember(path)
        return True

    def _fill_recent(self):
        self.recent_menu.clear()
        for p in files.recent_files():
            self._act(self.recent_menu, Path(p).name, lambda _=False, p=p: self.open_path(p)).setToolTip(p)
        if not self.recent_menu.actions():
            self.recent_menu.addAction("none yet").setEnabled(False)

    def zoom_plots(self):
        panel = self.tabs.currentWidget()
        panel = panel if hasattr(panel, "open_window") else self.along
        self.zoom_dialog = panel.open_window()
        return self.zoom_dialog

    def save_plots(self):
        path, _ = QFileDialog.getSaveFileName(self, "Save plots", str(Path.home() / "profiles.png"),
                                              "PNG image (*.png);;SVG drawing (*.svg)")
        if path:
            panel = self.tabs.currentWidget()
            panel = panel if hasattr(panel, "save") else self.along
            try:
                panel.save(path)
            except (OSError, ValueError) as exc:
                self.show_error("The plots were not saved", str(exc))

    # --- autosave and recovery ---------------------------------------------------------------------
    def autosave_now(self):
        if not self.doc.dirty:
            return
        if self.autosave_file is None:
            self.autosave_file = files.autosave_path(self.doc.path, self.session)
        try:
            files.write_autosave(self.autosave_file, self.doc.path, self.doc, self.session)
        except OSError as exc:
            self.statusBar().showMessage(f"autosave failed: {exc}", 5000)

    def _drop_autosave(self):
        files.discard(self.autosave_file)
        self.autosave_file = None

    def offer_recovery(self, source=None):
        """Offer the newest autosave left by a session that did not close (of ``source`` if given)."""
        pending = files.pending_autosaves(source)
        if not pending:
            return False
        path, data = pending[0]
        when = _ago(data.get("saved_at"))
        what = Path(data["source"]).name if data.get("source") else "an untitled project"
        if not self.ask_recover(what, when, len(data["drafts"])):
            files.discard(path)
            return False
        src = data.get("source")
        project = type("Saved", (), {"title": data.get("title", ""), "notes": data.get("notes", ""),
                                     "revision": data.get("revision", 1)})()
        self._replace(project, src, drafts=data["drafts"])
        # the recovered content differs from the file: mark it unsaved and keep the autosave,
        # now this session's (written at once, so no other start offers it while we run)
        self.autosave_file = path
        self.doc.undo.resetClean()
        self._update_title()
        self.autosave_now()
        return True

    def ask_recover(self, what, when, n_cases) -> bool:
        answer = QMessageBox.question(
            self, "Recover unsaved work",
            f"Ebullio did not close normally. Unsaved work on {what} ({n_cases} case"
            f"{'s' if n_cases != 1 else ''}, autosaved {when}) was kept.\n\nRecover it?",
            QMessageBox.Yes | QMessageBox.No, QMessageBox.Yes)
        return answer == QMessageBox.Yes

    # --- help ----------------------------------------------------------------------------------------
    def show_error(self, title, message):
        QMessageBox.warning(self, title, message)

    def copy_verdict(self):
        if self.current_id is not None:
            e = self.doc.entry(self.current_id)
            QGuiApplication.clipboard().setText(f"{e.name}: {self.verdict.text()}")

    def focus_datasheet(self):
        form = self.current_form()
        if form is not None:
            for row in form.rows.values():
                if row.editor.isVisibleTo(form) and row.editor.isEnabled():
                    row.editor.setFocus()
                    return

    def show_methods(self):
        st = self.runner.state(self.current_id) if self.current_id is not None else None
        result = st.result if st is not None else None
        html = ["<h3>Methods of this rating</h3>"]
        if result is None:
            html.append("<p>No rating yet: rate the case first (F5).</p>")
        else:
            html.append(f"<p>Case <b>{result.name}</b>.</p><table cellspacing=6>")
            for m in result.methods:
                html.append(f"<tr><td valign=top><b>{m.family.replace('_', ' ')}</b></td>"
                            f"<td valign=top>{m.title or m.name}<br><small>{m.reference}</small></td></tr>")
            html.append("</table>")
        html.append(f"<p><i>{CAUTION}</i></p>")
        self._text_dialog("Methods of this rating", "".join(html))

    def _text_dialog(self, title, html):
        from PySide6.QtWidgets import QDialog, QDialogButtonBox

        d = QDialog(self)
        d.setWindowTitle(title)
        lay = QVBoxLayout(d)
        view = QTextBrowser()
        view.setOpenExternalLinks(True)
        view.setHtml(html)
        lay.addWidget(view)
        buttons = QDialogButtonBox(QDialogButtonBox.Close)
        buttons.rejected.connect(d.reject)
        lay.addWidget(buttons)
        d.resize(720, 520)
        d.exec()

    def show_caution(self):
        QMessageBox.information(self, "Caution", caution_text())

    def show_about(self):
        QMessageBox.about(self, "About Ebullio", about_text())

    def first_start(self):
        s = files.settings()
        if self.first_start_caution and not s.value("caution_seen", False, type=bool):
            self.show_caution()
            s.setValue("caution_seen", True)

    # --- closing -------------------------------------------------------------------------------------
    def closeEvent(self, event):
        if not self.maybe_keep_changes():
            event.ignore()
            return
        self.runner.shutdown()
        if self._along is not None:
            from .plots import wait_for_drawing
            wait_for_drawing()
        self._autosave_timer.stop()
        self._drop_autosave()
        files.live_sessions.discard(self.session)
        files.settings().setValue("geometry", self.saveGeometry())
        event.accept()


class _Imported(QObject):
    plotting = Signal()            # matplotlib is imported: the plots can be built
    ready = Signal()               # everything is imported: a project opens without a wait


def warm_up(imported=None):
    """Import what opening a project, its ratings and its plots need, in a background
    thread (the slow part of starting): the display units (pint), the property library,
    the engine, matplotlib. A busy thread hands the interpreter lock over every
    millisecond, so the window keeps answering meanwhile."""
    def say(signal):
        if imported is not None:
            try:
                getattr(imported, signal).emit()
            except RuntimeError:    # the window closed meanwhile
                pass
    sys.setswitchinterval(0.001)
    units.to_display(1.0, "length", "US")
    import CoolProp.CoolProp  # noqa: F401
    import rating.exchangers  # noqa: F401
    import rating.properties  # noqa: F401
    import matplotlib.backends.backend_agg  # noqa: F401
    import matplotlib.figure  # noqa: F401
    say("plotting")
    say("ready")


def files_load(path):
    import rating

    return rating.load_project(path)


def caution_text() -> str:
    return f"{CAUTION}\n\n{SCOPE}"


def about_text() -> str:
    import rating

    try:
        import CoolProp
        cp = CoolProp.__version__
    except ImportError:
        cp = "not installed"
    from PySide6 import __version__ as qt_version

    return (f"<h3>Ebullio {rating.__version__}</h3>"
            "<p>Rating of evaporators and reboilers by marching along the heated length with local "
            "boiling coefficients.</p>"
            f"<p>Property library: CoolProp {cp}<br>Qt for Python (PySide6) {qt_version}</p>"
            f"<p><i>{CAUTION}</i></p>")


def _ago(timestamp) -> str:
    import time

    try:
        minutes = (time.time() - float(timestamp)) / 60
    except (TypeError, ValueError):
        return "at an unknown time"
    if minutes < 1:
        return "less than a minute ago"
    if minutes < 120:
        return f"{minutes:.0f} minutes ago"
    return f"{minutes / 60:.0f} hours ago"
