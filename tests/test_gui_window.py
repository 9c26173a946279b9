"""The desktop window driven as a user drives it (pytest-qt on real widgets).

Each test opens a sample, types into the datasheet or uses a command, waits for the
runner's signal and checks what the window shows against the engine's own result or
an independent figure (unit definitions, the file on disk).
"""
from __future__ import annotations

import math

import numpy as np
import pytest
from PySide6.QtCore import Qt

from gui_helpers import (QUICK, RATING_TIMEOUT_MS, open_rated, plotted, scratch,  # noqa: F401
                         set_text, window)
from rating import catalogue

FOOT = 0.3048          # m, exact (international yard and pound agreement, 1959)
PSI = 6894.757293168   # Pa per lbf/in^2 (NIST SP 811, appendix B.8)


def test_edit_rerates_and_the_verdict_and_a_plotted_line_follow(window, qtbot):
    w = window
    before = open_rated(qtbot, w).result
    verdict_before = w.verdict.text()
    plotted(qtbot, w)
    x0, y0 = w.along.line_data("t_wall_inner_K")
    with qtbot.waitSignal(w.runner.resultArrived, timeout=RATING_TIMEOUT_MS,
                          check_params_cb=lambda i: i == w.current_id):
        set_text(qtbot, w, "boiling.mass_flow", "3")
    after = w.runner.state(w.current_id).result
    assert after is not before and not w.runner.state(w.current_id).stale
    # the draft took the typed value (the window shows SI: kg/s)
    assert catalogue.get_value(w.doc.entry(w.current_id).draft, "boiling.mass_flow") == pytest.approx(3.0)
    assert after.summary["duty_W"] != before.summary["duty_W"]
    assert w.verdict.text() != verdict_before
    # the plotted wall temperature is the new result's, in the window's units
    plotted(qtbot, w)
    x1, y1 = w.along.line_data("t_wall_inner_K")
    from gui import units
    expected = [units.to_display(v, "temperature", w.system) for v in after.profiles["t_wall_inner_K"]]
    np.testing.assert_allclose(y1, expected, rtol=1e-9)
    assert len(x1) != len(x0) or not np.allclose(y1, y0)


def test_invalid_entry_shows_its_message_beside_the_field_and_keeps_the_last_result_stale(window, qtbot):
    w = window
    good = open_rated(qtbot, w).result
    duty_text = w.figures.value("duty_W")
    plotted(qtbot, w)
    y_before = w.along.line_data("heat_flux_W_m2")[1].copy()
    set_text(qtbot, w, "tubes.length", "-2")
    qtbot.waitUntil(lambda: w.runner.state(w.current_id).status == "invalid input",
                    timeout=RATING_TIMEOUT_MS)
    message = w.current_form().message("tubes.length")
    assert message, "no message beside the field"
    # the message names the field and the rule (the engine's own words)
    problems = [p for p in catalogue.draft_problems(w.doc.entry(w.current_id).draft)
                if p.path == "tubes.length"]
    assert problems and problems[0].message in message
    st = w.runner.state(w.current_id)
    assert st.result is good and st.stale
    assert "stale" in w.verdict.text()
    assert w.figures.value("duty_W") == duty_text
    plotted(qtbot, w)
    np.testing.assert_array_equal(w.along.line_data("heat_flux_W_m2")[1], y_before)


def test_switching_units_converts_the_display_and_leaves_the_stored_values(window, qtbot):
    w = window
    open_rated(qtbot, w)
    draft_before = w.doc.entry(w.current_id).draft
    length = catalogue.get_value(draft_before, "tubes.length")
    pressure = catalogue.get_value(draft_before, "boiling.inlet_pressure")
    w.set_system("US")
    form = w.current_form()
    # the form shows four significant figures: within half a unit of the fourth
    shown = float(form.editor("tubes.length").text().replace(",", ""))
    assert shown == pytest.approx(length / FOOT, rel=5e-4)
    shown_p = float(form.editor("boiling.inlet_pressure").text().replace(",", ""))
    assert shown_p == pytest.approx(pressure / PSI, rel=5e-4)
    assert "ft" in form.rows["tubes.length"].unit.text()
    w.set_system("SI")
    assert float(form.editor("tubes.length").text()) == pytest.approx(length, rel=5e-4)
    assert float(form.editor("boiling.inlet_pressure").text().replace(",", "")) == \
        pytest.approx(pressure / 1000, rel=5e-4)            # kPa(a)
    assert w.doc.entry(w.current_id).draft == draft_before
    assert not w.doc.dirty
    # the plots follow: the z axis ends at the heated length in the shown unit
    w.set_system("US")
    figure = plotted(qtbot, w)
    x, _ = w.along.line_data("t_sat_K")
    assert x[-1] == pytest.approx(length / FOOT, rel=1e-6)
    assert "ft" in figure.axes[-1].get_xlabel()


def test_save_and_reopen_give_the_same_project(window, qtbot, tmp_path):
    import rating

    w = window
    open_rated(qtbot, w)
    set_text(qtbot, w, "boiling.mass_flow", "4.2")
    assert w.doc.dirty
    target = tmp_path / "copy.ebullio"
    assert w._save_to(target)
    assert not w.doc.dirty
    drafts = [e.draft for e in w.doc.entries]
    # the file holds what was on screen, read by the engine's own loader
    loaded = rating.load_project(target)
    assert [catalogue.case_to_draft(c) for c in loaded.cases] == drafts
    assert w.open_path(target)
    assert [e.draft for e in w.doc.entries] == drafts
    text = target.read_text(encoding="utf-8")
    assert w._save_to(target)
    assert target.read_text(encoding="utf-8") == text


def test_undo_and_redo_restore_values_and_typing_in_one_field_is_one_step(window, qtbot):
    w = window
    open_rated(qtbot, w)
    eid = w.current_id
    original = catalogue.get_value(w.doc.entry(eid).draft, "tubes.count")
    editor = set_text(qtbot, w, "tubes.count", "150")
    assert catalogue.get_value(w.doc.entry(eid).draft, "tubes.count") == 150
    assert w.doc.undo.count() == 1            # delete + two keystrokes merged
    w.a_undo.trigger()
    assert catalogue.get_value(w.doc.entry(eid).draft, "tubes.count") == original
    assert editor.text() == str(original)
    assert not w.doc.dirty
    w.a_redo.trigger()
    assert catalogue.get_value(w.doc.entry(eid).draft, "tubes.count") == 150
    assert editor.text() == "150"
    assert w.doc.dirty


def test_choosing_a_warning_marks_its_position_on_every_plot(window, qtbot):
    w = window
    st = open_rated(qtbot, w)
    placed = [wr for wr in st.result.warnings if wr.z_m is not None]
    assert placed, "the quick sample should carry a placed warning (dryout)"
    from gui.warning_text import warning_text  # the list shows it in the window's units
    shown = warning_text(placed[0], w.system)
    row = next(i for i in range(w.warnings.count()) if shown in w.warnings.item(i).text())
    w.warnings.setCurrentRow(row)
    for mark in plotted(qtbot, w).marks:
        assert mark.get_visible()
        assert mark.get_xdata()[0] == pytest.approx(placed[0].z_m)      # SI/metric: m
    w.warnings.setCurrentRow(-1)
    assert not any(m.get_visible() for m in plotted(qtbot, w).marks)


def test_cancel_stops_a_running_rating(window, qtbot, monkeypatch):
    import threading

    import gui.runner

    w = window
    open_rated(qtbot, w)
    # hold the worker at its first progress report until Stop has been pressed, so
    # that the rating is surely running when it is stopped (a shared machine may be slow)
    started, pressed = threading.Event(), threading.Event()
    real = gui.runner._Job._progress

    def held(job, fraction):
        started.set()
        pressed.wait(30)
        real(job, fraction)
    monkeypatch.setattr(gui.runner._Job, "_progress", held)
    finished = []
    w.runner._signals.done.connect(lambda eid, gen, result, err: finished.append(result))
    eid = w.current_id
    w.runner.rate(eid)
    assert started.wait(60)
    assert w.runner.state(eid).status == "rating"
    # a rating still running after a moment shows its progress and Stop
    qtbot.waitUntil(lambda: w.stop_button.isVisibleTo(w) and w.progress.isVisibleTo(w),
                    timeout=5000)
    w.a_stop.trigger()
    pressed.set()
    assert w.runner.state(eid).status == "cancelled"
    qtbot.waitUntil(lambda: bool(finished), timeout=RATING_TIMEOUT_MS)
    stopped = finished[-1]
    # the engine honoured its cancel callback: the run ended without a rated result
    assert stopped is None or stopped.status in ("cancelled", "failed")
    if stopped is not None:
        assert "cancel" in stopped.message.lower()
    st = w.runner.state(eid)
    assert st.status == "cancelled" and st.stale and st.result is not None
    assert "stale" in w.verdict.text()


def test_closing_with_unsaved_changes_asks_first(window, qtbot):
    from PySide6.QtWidgets import QMessageBox

    w = window
    open_rated(qtbot, w)
    set_text(qtbot, w, "tubes.count", "130")
    asked = []
    w.ask_unsaved = lambda: asked.append(1) or QMessageBox.Cancel
    assert not w.close()
    assert asked and w.isVisible()
    w.ask_unsaved = lambda: asked.append(2) or QMessageBox.Discard
    assert w.close()
    assert asked == [1, 2]


def test_a_file_that_fails_to_load_says_why_and_changes_nothing(window, qtbot, tmp_path):
    w = window
    open_rated(qtbot, w)
    drafts = [e.draft for e in w.doc.entries]
    bad = tmp_path / "broken.ebullio"
    bad.write_text('{"format": "ebullio-project", "schema_version": 1, "cases": [', encoding="utf-8")
    assert not w.open_path(bad)
    assert w.errors and "broken.ebullio" in w.errors[-1][1]
    newer = tmp_path / "newer.ebullio"
    newer.write_text('{"format": "ebullio-project", "schema_version": 999, "cases": []}', encoding="utf-8")
    assert not w.open_path(newer)
    assert "newer" in w.errors[-1][1]
    assert [e.draft for e in w.doc.entries] == drafts


def test_cases_add_duplicate_rename_reorder_delete(window, qtbot, monkeypatch):
    from PySide6.QtWidgets import QInputDialog

    w = window
    open_rated(qtbot, w)
    n = len(w.doc.entries)
    first = w.doc.entries[0]
    w.a_dup.trigger()
    assert len(w.doc.entries) == n + 1
    copy = w.doc.entries[1]
    assert copy.draft["tubes"] == first.draft["tubes"] and copy.name != first.name
    assert w.current_id == copy.id
    monkeypatch.setattr(QInputDialog, "getText", staticmethod(lambda *a, **k: ("Longer tubes", True)))
    w.a_rename.trigger()
    assert w.doc.entry(copy.id).name == "Longer tubes"
    assert w.case_list.item(1).text().startswith("Longer tubes")
    w.a_up.trigger()
    assert w.doc.entries[0].id == copy.id
    w.a_new_case["kettle"].trigger()
    kettle = w.doc.entries[-1]
    assert kettle.type == "kettle" and w.current_id == kettle.id
    assert w.form_stack.currentWidget() is w.forms["kettle"]
    # a new case has the catalogue's inputs for its type and states what is missing
    assert "not rated" in w.case_list.item(len(w.doc.entries) - 1).text() or \
        "invalid" in w.case_list.item(len(w.doc.entries) - 1).text()
    w.a_delete.trigger()
    assert kettle.id not in [e.id for e in w.doc.entries]
    w.a_undo.trigger()
    assert kettle.id in [e.id for e in w.doc.entries]


def test_the_status_of_each_case_shows_in_the_list(window, qtbot):
    w = window
    open_rated(qtbot, w)
    text = w.case_list.item(0).text()
    st = w.runner.state(w.doc.entries[0].id)
    assert st.status in ("rated", "warnings") and st.status in text
    set_text(qtbot, w, "tubes.count", "121")
    assert "stale" in w.case_list.item(0).text()


def test_start_page_offers_new_cases_samples_and_recent_files(window, qtbot):
    w = window
    assert w.pages.currentWidget() is w.start
    assert w.start.samples.count() >= 6
    from PySide6.QtWidgets import QPushButton

    qtbot.mouseClick(w.start.findChild(QPushButton, "start-new-thermosiphon"), Qt.LeftButton)
    assert w.pages.currentIndex() == 1 and w.doc.entries[0].type == "thermosiphon"


def test_tab_order_follows_the_datasheet_and_walking_it_changes_nothing(window, qtbot):
    """Tab from the first field of the datasheet: the focus visits each group's title and
    its fields in the catalogue's datasheet order; the values shown are rounded to four
    significant figures (UI-NOTES, common practice), and walking through them with the
    keyboard leaves every stored value exactly as it was."""
    from PySide6.QtWidgets import QApplication

    w = window
    open_rated(qtbot, w)
    w.set_system("US")                 # conversions give long decimals to round
    w.raise_()
    w.activateWindow()
    qtbot.waitUntil(w.isActiveWindow, timeout=5000)
    form = w.current_form()
    before = w.doc.entry(w.current_id).draft
    order = [f.path for f in catalogue.inputs_for("evaporator")]
    visible = sorted((r for r in form.rows.values() if r.editor.isVisibleTo(form)),
                     key=lambda r: order.index(r.field.path))
    expected = []
    for key, _title in catalogue.GROUPS:
        rows = [r for r in visible if r.field.group == key]
        if rows:
            expected += [form.sections[key].button] + [r.editor for r in rows]
    w.focus_datasheet()                 # F6: the first field
    assert QApplication.focusWidget() is expected[1]
    walked = [expected[0], QApplication.focusWidget()]
    for _ in range(len(expected) - 2):
        qtbot.keyClick(QApplication.focusWidget(), Qt.Key_Tab)
        walked.append(QApplication.focusWidget())
    names = {id(x): x.objectName() or x.text() for x in expected}
    assert [names.get(id(x), repr(x)) for x in walked[1:]] == [names[id(x)] for x in expected[1:]]
    # four significant figures, all of the whole part from 1000 up
    for r in visible:
        text = r.editor.text() if hasattr(r.editor, "text") else ""
        if r.field.kind == "number" and text and "e" not in text.lower():
            digits = text.replace(",", "").replace(".", "").replace("-", "").lstrip("0")
            whole = len(text.replace(",", "").split(".")[0].lstrip("-"))
            assert len(digits) <= max(4, whole), (r.field.path, text)
    assert w.doc.entry(w.current_id).draft == before
    assert not w.doc.dirty and w.doc.undo.count() == 0


def test_every_menu_command_has_a_key_or_a_mnemonic(window):
    for top in [a.menu() for a in window.menuBar().actions() if a.menu()]:
        assert "&" in top.title(), top.title()            # Alt + letter opens it
        for a in top.actions():
            if a.isSeparator() or not a.text() or not a.isEnabled():
                continue
            assert not a.shortcut().isEmpty() or "&" in a.text(), a.text()


def test_no_widget_opens_as_a_window_of_its_own(window, qtbot):
    """Every widget of the datasheet and the answer lives inside the main window: a label
    left out of every layout would open as a small window at the screen's corner (seen under
    Xvfb: three unit labels of text fields covered the File menu)."""
    from PySide6.QtWidgets import QApplication

    w = window
    open_rated(qtbot, w)
    for system in ("US", "SI"):
        w.set_system(system)
    plotted(qtbot, w)
    stray = [t for t in QApplication.topLevelWidgets() if t.isVisible() and t is not w]
    assert stray == [], [(type(t).__name__, t.objectName(), t.geometry()) for t in stray]


def test_the_plots_are_drawn_off_the_gui_thread_and_a_hidden_panel_waits(window, qtbot):
    """A draw of the six panels takes a good part of a second: it happens on the render
    thread, never on the thread that runs the window; a panel on a hidden tab is drawn
    only when its tab is shown."""
    import threading

    w = window
    open_rated(qtbot, w)
    figure = plotted(qtbot, w)
    drawn_on = []
    figure.figure.canvas.mpl_connect("draw_event", lambda _e: drawn_on.append(threading.get_ident()))
    with qtbot.waitSignal(w.along.drawn, timeout=RATING_TIMEOUT_MS):
        w.set_system("US")
    assert drawn_on and threading.main_thread().ident not in drawn_on
    w.tabs.setCurrentWidget(w.side_tab)          # the plots hidden: an edit queues, no draw
    drawn_on.clear()
    with qtbot.waitSignal(w.runner.resultArrived, timeout=RATING_TIMEOUT_MS,
                          check_params_cb=lambda i: i == w.current_id):
        set_text(qtbot, w, "boiling.mass_flow", "14000")
    qtbot.wait(300)
    assert drawn_on == [] and not w.along.settled()
    plotted(qtbot, w)                            # shown again: drawn with the new result
    assert drawn_on and threading.main_thread().ident not in drawn_on


def test_zoom_and_pan_opens_the_same_plots_on_an_interactive_canvas(window, qtbot):
    """F9 (View > Zoom and pan the plots…) shows the plots on matplotlib's own Qt canvas with
    its navigation toolbar; the lines are those of the window's panels."""
    from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg, NavigationToolbar2QT

    w = window
    open_rated(qtbot, w)
    plotted(qtbot, w)
    action = next(a for a in w.findChildren(type(w.a_undo)) if a.shortcut().toString() == "F9")
    action.trigger()
    dialog = w.zoom_dialog
    assert dialog.isVisible()
    assert dialog.findChild(FigureCanvasQTAgg) is not None
    assert dialog.findChild(NavigationToolbar2QT) is not None
    x, y = w.along.line_data("t_wall_inner_K")
    zx, zy = dialog.findChild(FigureCanvasQTAgg).figure.axes[0].get_lines()[0].get_data()
    np.testing.assert_array_equal(np.asarray(zx, float), x)
    np.testing.assert_array_equal(np.asarray(zy, float), y)
    dialog.close()
