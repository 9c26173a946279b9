"""The Report menu of the desktop: vendor figures edited in the case's form, the comparison
window, and a report written from the window (read back with pypdf)."""
from __future__ import annotations

import pypdf
import pytest

from gui_helpers import RATING_TIMEOUT_MS, open_rated, scratch, set_text, window  # noqa: F401


def _action(w, words):
    for a in w.report_menu.actions():
        if words in a.text().replace("&", ""):
            return a
    raise AssertionError(f"no Report menu command with {words!r}: "
                         f"{[a.text() for a in w.report_menu.actions()]}")


def test_vendor_figures_are_edited_in_the_form_and_compared(window, qtbot):
    w = window
    st = open_rated(qtbot, w)
    u_service = st.result.summary["u_service_W_m2K"]
    form = w.current_form()
    _action(w, "Add vendor figures").trigger()
    assert isinstance(w.doc.entry(w.current_id).draft.get("vendor"), dict)
    form = w.current_form()
    rated = st.result
    set_text(qtbot, w, "vendor.u_service", f"{1.5 * u_service:.0f}")
    form.editor("vendor.u_service").editingFinished.emit()
    # a vendor figure does not enter the rating: no new rating, the result is not stale
    st = w.runner.state(w.current_id)
    assert st.status != "rating" and not st.stale and st.result is rated
    assert w.doc.entry(w.current_id).draft["vendor"]["u_service"] == pytest.approx(
        1.5 * u_service, abs=1.0)
    from gui.report.desktop import show_comparison

    dialog = show_comparison(w)
    qtbot.addWidget(dialog)
    from PySide6.QtWidgets import QLabel, QTableWidget

    table = dialog.findChild(QTableWidget)
    words = dialog.findChild(QLabel).text()
    assert words.startswith("Optimistic") and "U service" in words
    assert table.rowCount() == 1 and table.item(0, 0).text() == "U service"
    assert table.item(0, 5).text() == "optimistic" and table.item(0, 3).text() == "+50.0 %"


def test_a_report_is_written_from_the_window(window, qtbot, tmp_path, monkeypatch):
    from PySide6.QtWidgets import QFileDialog

    w = window
    open_rated(qtbot, w)
    target = tmp_path / "from-the-window.pdf"
    monkeypatch.setattr(QFileDialog, "getSaveFileName",
                        staticmethod(lambda *a, **k: (str(target), "PDF document (*.pdf)")))
    _action(w, "report of this case").trigger()
    assert target.exists() and not w.errors
    text = " ".join(" ".join(p.extract_text().split()) for p in pypdf.PdfReader(target).pages)
    name = w.doc.entry(w.current_id).name
    assert name in text and "qualified engineer" in text
    assert f"Page 1 of {len(pypdf.PdfReader(target).pages)}" in text


def test_a_report_with_a_method_spread_is_written_from_the_window(window, qtbot, tmp_path,
                                                                 monkeypatch):
    """The family is picked from those the case's type chooses (the catalogue's labels);
    the report then has the spread section with the case's own method marked once."""
    from PySide6.QtWidgets import QFileDialog, QInputDialog

    w = window
    open_rated(qtbot, w)
    target = tmp_path / "with-spread.html"
    offered = {}

    def pick(parent, title, label, items, current=0, editable=False):
        offered["items"] = list(items)
        return "Void fraction", True

    monkeypatch.setattr(QInputDialog, "getItem", staticmethod(pick))
    monkeypatch.setattr(QFileDialog, "getSaveFileName",
                        staticmethod(lambda *a, **k: (str(target), "HTML page (*.html)")))
    _action(w, "with a method spread").trigger()
    assert target.exists() and not w.errors
    assert "Flow boiling coefficient" in offered["items"] and "Void fraction" in offered["items"]
    text = target.read_text(encoding="utf-8")
    assert "Spread between methods: void fraction" in text
    assert text.count("(the case's)") == 1


def test_the_window_asks_before_a_profile_table_replaces_a_file(window, qtbot, tmp_path,
                                                                 monkeypatch):
    """A file beside the report named like its profile table, not written by a report:
    the window names it and asks; "No" writes nothing and keeps the file, "Yes" writes
    the report and its table."""
    from PySide6.QtWidgets import QFileDialog, QMessageBox

    w = window
    st = open_rated(qtbot, w)
    target = tmp_path / "asked.pdf"
    from gui.report.writer import profile_csv_paths

    (table,) = profile_csv_paths(target, [st.result])
    table.write_text("field log\n", encoding="utf-8")
    monkeypatch.setattr(QFileDialog, "getSaveFileName",
                        staticmethod(lambda *a, **k: (str(target), "PDF document (*.pdf)")))
    asked = []

    def answer(reply):
        def question(parent, title, text, *a, **k):
            asked.append(text)
            return reply
        return staticmethod(question)

    monkeypatch.setattr(QMessageBox, "question", answer(QMessageBox.StandardButton.No))
    _action(w, "report of this case").trigger()
    assert len(asked) == 1 and table.name in asked[0]
    assert not target.exists() and table.read_text(encoding="utf-8") == "field log\n"
    assert not w.errors
    monkeypatch.setattr(QMessageBox, "question", answer(QMessageBox.StandardButton.Yes))
    _action(w, "report of this case").trigger()
    assert len(asked) == 2 and target.exists() and not w.errors
    assert "qualified engineer" in table.read_text(encoding="utf-8")
