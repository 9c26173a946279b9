"""Autosave and recovery after a crash, comparison of two ratings, the drawing, help.

Driven on real widgets with pytest-qt; checked against the engine's results, the
files on disk, and the property library's own version string.
"""
from __future__ import annotations

import numpy as np
import pytest

from gui_helpers import (QUICK, RATING_TIMEOUT_MS, make_window, open_rated, plotted, scratch,  # noqa: F401
                         set_text, window)
from rating import catalogue


def _edited_copy(qtbot, tmp_path, count):
    """A copy of the quick sample (made once per test) opened in a new window, its tube
    count set to ``count`` and autosaved: (window, the copy's path)."""
    import shutil

    project = tmp_path / "unit.ebullio"
    if not project.exists():
        shutil.copy(QUICK, project)
    w = make_window(qtbot)
    open_rated(qtbot, w, project)
    set_text(qtbot, w, "tubes.count", count)
    w.autosave_now()
    return w, project


def test_a_crash_leaves_an_autosave_that_the_next_start_offers(qtbot, scratch, tmp_path):
    from gui import files

    first, project = _edited_copy(qtbot, tmp_path, "133")
    assert files.pending_autosaves(project) == []       # its session runs
    # the session dies here: no close, no save; its autosave stays on disk
    first.runner.shutdown()
    first.doc.undo.setClean()
    first.autosave_file = None          # the dead session no longer owns it
    files.live_sessions.discard(first.session)
    assert len(files.pending_autosaves(project)) == 1

    second = make_window(qtbot)
    offered = []
    second.ask_recover = lambda what, when, n: offered.append((what, n)) or True
    assert second.offer_recovery()
    assert offered == [("unit.ebullio", 2)]
    entry = second.doc.entries[0]
    assert catalogue.get_value(entry.draft, "tubes.count") == 133
    assert second.doc.dirty and second.doc.path.name == "unit.ebullio"
    # once saved, nothing is offered any more
    assert second._save_to(project)
    assert files.pending_autosaves(project) == []
    second.runner.shutdown()


def test_an_autosave_older_than_its_file_is_not_offered(qtbot, scratch, tmp_path):
    import os
    import time

    from gui import files

    w, project = _edited_copy(qtbot, tmp_path, "134")
    later = time.time() + 60
    os.utime(project, (later, later))       # the file was saved after the autosave
    assert files.pending_autosaves(project) == []
    w.runner.shutdown()


def test_the_rating_before_the_last_edit_is_overlaid_and_its_differences_listed(window, qtbot):
    from gui import units

    w = window
    before = open_rated(qtbot, w).result
    with qtbot.waitSignal(w.runner.resultArrived, timeout=RATING_TIMEOUT_MS,
                          check_params_cb=lambda i: i == w.current_id):
        set_text(qtbot, w, "boiling.mass_flow", "4")
    after = w.runner.state(w.current_id).result
    assert w.runner.state(w.current_id).previous is before
    w.compare_to("previous")
    ghost = plotted(qtbot, w).ghosts["t_wall_inner_K"]
    assert ghost.get_visible()
    np.testing.assert_allclose(ghost.get_ydata(), [units.to_display(v, "temperature", "SI")
                                                   for v in before.profiles["t_wall_inner_K"]])
    label = catalogue.SUMMARY["duty_W"].label
    w.tabs.setCurrentWidget(w.side_tab)               # the table is filled when it is shown
    row = next(r for r in range(w.compare.rowCount()) if w.compare.item(r, 0).text() == label)
    shown = float(w.compare.item(row, 3).text().split()[0].replace(",", "").replace("−", "-"))
    expected = units.to_display(after.summary["duty_W"], "power", "SI") - \
        units.to_display(before.summary["duty_W"], "power", "SI")
    assert shown == pytest.approx(expected, rel=2e-3, abs=0.5)
    w.compare_to("")
    plotted(qtbot, w)
    assert not ghost.get_visible()


def test_rate_all_cases_gives_every_case_a_status(window, qtbot):
    w = window
    open_rated(qtbot, w)
    ids = [e.id for e in w.doc.entries]
    w.a_rate_all.trigger()
    qtbot.waitUntil(lambda: all(w.runner.state(i).status in ("rated", "warnings", "failed")
                                for i in ids), timeout=RATING_TIMEOUT_MS)
    for row, i in enumerate(ids):
        assert w.runner.state(i).status in w.case_list.item(row).text()


def test_the_drawing_follows_the_geometry(window, qtbot):
    w = window
    open_rated(qtbot, w)
    picture = w.sketch.grab().toImage()
    set_text(qtbot, w, "tubes.length", "1.5")
    assert catalogue.get_value(w.sketch.draft, "tubes.length") == pytest.approx(1.5)
    assert w.sketch.grab().toImage() != picture


def test_help_lists_the_methods_of_the_rating_and_the_about_box_the_versions(window, qtbot, monkeypatch):
    import CoolProp

    import rating
    from gui import mainwindow

    w = window
    result = open_rated(qtbot, w).result
    shown = {}
    monkeypatch.setattr(w, "_text_dialog", lambda title, html: shown.update(title=title, html=html))
    w.show_methods()
    for m in result.methods:
        assert (m.title or m.name) in shown["html"]
    assert mainwindow.CAUTION in shown["html"]
    about = mainwindow.about_text()
    assert CoolProp.__version__ in about and rating.__version__ in about
    assert "qualified engineer" in about


def test_the_caution_shows_on_first_start_only(qtbot, scratch):
    w = make_window(qtbot)
    w.first_start_caution = True
    seen = []
    w.show_caution = lambda: seen.append(1)
    w.first_start()
    w.first_start()
    assert seen == [1]
    assert "qualified engineer" in w.caution.text()


def test_a_failed_rating_says_why_and_keeps_the_last_good_result_stale(window, qtbot):
    from gui_helpers import SAMPLES

    w = window
    good = open_rated(qtbot, w, SAMPLES / "stripper-reboiler.ebullio").result
    eid = w.current_id
    with qtbot.waitSignal(w.runner.resultArrived, timeout=RATING_TIMEOUT_MS,
                          check_params_cb=lambda i: i == w.current_id):
        set_text(qtbot, w, "thermosiphon.liquid_level", "0.2")
    st = w.runner.state(eid)
    assert st.status == "failed"
    # the engine's own words (a level of 0.2 m cannot drive the loop's losses), their
    # values in the window's units (gui.warning_text.in_units)
    from gui.warning_text import in_units

    assert in_units(st.failure.message, w.system) in w.verdict.text()
    assert "circulate" in w.verdict.text()
    assert st.result is good and st.stale and "stale" in w.verdict.text()
    assert w.figures.value("duty_W") not in ("", "not computed")


def test_two_windows_on_one_file_keep_their_own_autosaves(qtbot, scratch, tmp_path):
    from gui import files

    first, project = _edited_copy(qtbot, tmp_path, "131")
    second, _ = _edited_copy(qtbot, tmp_path, "137")
    assert first.autosave_file != second.autosave_file
    kept = {files.read_autosave(w.autosave_file)["drafts"][0]["tubes"]["count"]
            for w in (first, second)}
    assert kept == {131, 137}
    # both sessions are live: neither autosave is offered as left by a crash
    assert files.pending_autosaves(project) == []
    # the first window closes without saving: the second's autosave stays
    second_file = second.autosave_file
    first.close()
    assert second_file.exists()
    assert files.read_autosave(second_file)["drafts"][0]["tubes"]["count"] == 137
    second.runner.shutdown()


def test_an_autosave_of_a_running_process_is_offered_only_once_it_ends(qtbot, scratch, tmp_path):
    import json
    import subprocess
    import sys

    from gui import files

    w, project = _edited_copy(qtbot, tmp_path, "139")
    other = subprocess.Popen([sys.executable, "-c", "import time; time.sleep(60)"])
    try:
        data = json.loads(w.autosave_file.read_text(encoding="utf-8"))
        data["pid"], data["session"] = other.pid, f"{other.pid}-elsewhere"
        w.autosave_file.write_text(json.dumps(data), encoding="utf-8")
        assert files.pending_autosaves(project) == []      # that session still runs
    finally:
        other.kill()
        other.wait()
    assert [p for p, _ in files.pending_autosaves(project)] == [w.autosave_file]
    w.runner.shutdown()
