"""Shared fixtures of the GUI tests: a main window with its settings and autosaves in a
scratch folder, and a sample opened and rated."""
from __future__ import annotations

import os
from pathlib import Path

import pytest

SAMPLES = Path(__file__).resolve().parent.parent / "samples"
# the quickest sample to rate (about a third of a second on a quiet machine), with a
# dryout warning placed along the tube
QUICK = SAMPLES / "pentane-vaporiser.ebullio"
RATING_TIMEOUT_MS = 60000          # generous: the test machine may be shared


@pytest.fixture
def scratch(tmp_path, monkeypatch, qapp):
    """Settings and autosaves of this test in its own folder."""
    from PySide6.QtCore import QSettings

    monkeypatch.setenv("XDG_DATA_HOME", str(tmp_path / "data"))
    QSettings.setPath(QSettings.NativeFormat, QSettings.UserScope, str(tmp_path / "config"))
    QSettings.setPath(QSettings.IniFormat, QSettings.UserScope, str(tmp_path / "config"))
    qapp.setOrganizationName("EbullioTest")
    qapp.setApplicationName("EbullioTest")
    return tmp_path


def make_window(qtbot, monkeypatch=None):
    from PySide6.QtWidgets import QMessageBox

    from gui.mainwindow import MainWindow

    w = MainWindow(first_start_caution=False)
    w.show_error = lambda title, message: w.errors.append((title, message))
    w.errors = []
    w.ask_unsaved = lambda: QMessageBox.Discard        # tests that care replace it
    qtbot.addWidget(w)
    w.set_system("SI")
    w.resize(1280, 800)
    w.show()
    return w


@pytest.fixture
def window(qtbot, scratch):
    w = make_window(qtbot)
    yield w
    w.runner.shutdown()


def open_rated(qtbot, w, path=QUICK):
    """Open a project and wait until its first case is rated (the other cases are rated
    on open too: only the result of the case on screen counts)."""
    with qtbot.waitSignal(w.runner.resultArrived, timeout=RATING_TIMEOUT_MS,
                          check_params_cb=lambda i: i == w.current_id):
        assert w.open_path(path)
    st = w.runner.state(w.current_id)
    assert st.result is not None, st.message
    return st


def plotted(qtbot, w):
    """Wait until the plots show the last thing asked of them (they are drawn off the GUI
    thread) and return the along-the-tube figure, whose artists may then be read."""
    w.tabs.setCurrentWidget(w.along)          # a hidden panel is drawn when it is shown
    qtbot.waitUntil(lambda: w.along.settled(), timeout=RATING_TIMEOUT_MS)
    return w.along.plot


def set_text(qtbot, w, path, text):
    """Replace a field's text as a user would: select all, type."""
    from PySide6.QtCore import Qt

    editor = w.current_form().editor(path)
    editor.setFocus()
    editor.selectAll()
    qtbot.keyClick(editor, Qt.Key_Delete)
    qtbot.keyClicks(editor, text)
    return editor


__all__ = ["SAMPLES", "QUICK", "RATING_TIMEOUT_MS", "scratch", "window", "make_window",
           "open_rated", "plotted", "set_text", "os"]
