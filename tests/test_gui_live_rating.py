"""Live rating: a committed entry (Enter, a choice from a list, undo) is rated at once;
keystrokes while typing wait for the pause; one validation of a draft per keystroke on
the GUI thread."""
from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QComboBox

from gui_helpers import open_rated, scratch, set_text, window  # noqa: F401


def _rated_at_once(w, before):
    st = w.runner.state(w.current_id)
    return st.generation > before and st.status in ("rating", "invalid input")


def test_keystrokes_wait_for_the_pause_and_enter_rates_at_once(window, qtbot):
    w = window
    open_rated(qtbot, w)
    gen = w.runner.state(w.current_id).generation
    editor = set_text(qtbot, w, "boiling.mass_flow", "3")
    st = w.runner.state(w.current_id)
    assert st.generation == gen and st.status == "stale"      # typing: the pause runs
    qtbot.keyClick(editor, Qt.Key_Return)
    assert _rated_at_once(w, gen)


def test_a_choice_and_an_undo_are_rated_at_once(window, qtbot):
    w = window
    open_rated(qtbot, w)
    form = w.current_form()
    row = next(r for r in form.rows.values() if isinstance(r.editor, QComboBox)
               and r.editor.isVisibleTo(form) and r.editor.count() > 1)
    box = row.editor
    gen = w.runner.state(w.current_id).generation
    box.activated.emit((box.currentIndex() + 1) % box.count())
    assert _rated_at_once(w, gen)
    gen = w.runner.state(w.current_id).generation
    w.doc.undo.undo()
    assert _rated_at_once(w, gen)


def test_a_keystroke_validates_its_draft_once_on_the_gui_thread(window, qtbot, monkeypatch):
    from rating import catalogue

    w = window
    open_rated(qtbot, w)
    calls = []
    real = catalogue.draft_problems
    monkeypatch.setattr(catalogue, "draft_problems", lambda d: calls.append(d) or real(d))
    editor = set_text(qtbot, w, "boiling.mass_flow", "3")
    calls.clear()
    qtbot.keyClicks(editor, "1")             # one keystroke: the form shows its problems
    qtbot.keyClick(editor, Qt.Key_Return)    # committed: the runner checks it before rating
    assert w.runner.state(w.current_id).status == "rating"
    assert len(calls) == 1
