"""Save As never replaces an existing project without asking."""
from __future__ import annotations

from gui_helpers import QUICK, open_rated, scratch, window  # noqa: F401


def test_the_save_as_dialog_adds_the_extension_before_its_replace_check(window):
    from PySide6.QtWidgets import QFileDialog

    dialog = window.save_dialog()
    assert dialog.defaultSuffix() == "ebullio"
    assert dialog.acceptMode() == QFileDialog.AcceptSave
    assert not dialog.testOption(QFileDialog.DontConfirmOverwrite)


def test_a_bare_name_returned_by_the_dialog_asks_before_replacing_the_project(
        window, qtbot, tmp_path):
    w = window
    open_rated(qtbot, w)
    existing = tmp_path / "plant.ebullio"
    existing.write_bytes(QUICK.read_bytes()[:100])       # another project's file
    before = existing.read_bytes()
    asked = []
    w.ask_save_path = lambda: str(tmp_path / "plant")
    w.confirm_replace = lambda path: asked.append(path) or False
    assert w.save_as() is False
    assert asked == [existing]
    assert existing.read_bytes() == before
    # answering yes replaces it
    w.confirm_replace = lambda path: True
    assert w.save_as() is True
    assert existing.read_bytes() != before and w.doc.path == existing
    # a new name is not asked about
    w.confirm_replace = lambda path: asked.append(path) or False
    w.ask_save_path = lambda: str(tmp_path / "other")
    assert w.save_as() is True and (tmp_path / "other.ebullio").exists()
    assert asked == [existing]
