"""Help > Warnings Ebullio can give: the list of every rule, in the window's units."""
from __future__ import annotations

from gui_helpers import make_window, scratch, window  # noqa: F401  (fixtures)
from rating import rules


def test_help_lists_every_warning_with_its_limits_in_the_window_units(window, monkeypatch):
    w = window
    shown = {}
    monkeypatch.setattr(w, "_text_dialog", lambda title, html: shown.update(title=title, html=html))
    help_menu = next(a.menu() for a in w.menuBar().actions() if a.text() == "&Help")
    action = next(a for a in help_menu.actions() if "Warnings Ebullio can give" in a.text())
    w.system = "US"
    action.trigger()
    assert shown["title"] == "Warnings Ebullio can give"
    for code in rules.RULES:
        assert f"<b>{code}</b>" in shown["html"]
    # the kettle's smallest freeboard, 0.25 m, in feet (1 ft = 0.3048 m exactly)
    assert f"Smallest freeboard ({0.25 / 0.3048:.4f} ft)" in shown["html"]


def test_a_warning_that_names_its_position_shows_it_once(qtbot):
    """A method-range warning's text gives 'first at z = ...'; the list adds no second
    '[z = ...]'. A warning whose text has no position gets it appended."""
    from types import SimpleNamespace

    from gui.results import WarningsList
    placed = rules.warn("method-range", z=1.136, note="Chen: reduced pressure above 0.7")
    from rating.results import RatingWarning
    bare = RatingWarning("dryout", "warning", "plain text", 0.5)    # a text without template
    box = WarningsList()
    qtbot.addWidget(box)
    box.show_result(SimpleNamespace(warnings=[placed, bare]), "US")
    texts = [box.item(i).text() for i in range(box.count())]
    # 1.136 m / 0.3048 m/ft = 3.727 ft (the international foot, 1959)
    assert sum(t.count("z =") for t in texts if "Chen" in t) == 1
    assert "3.727 ft" in texts[0]
    assert any("plain text [z = " in t for t in texts)


def test_a_broken_report_package_is_not_hidden_as_no_report_writer(qtbot, scratch,  # noqa: F811
                                                                   monkeypatch):
    """An import error inside gui.report is a broken install: it surfaces, it does not
    read "No report writer in this version"."""
    import pytest

    import sys

    monkeypatch.setitem(sys.modules, "gui.report.desktop", None)   # as if missing
    with pytest.raises(ImportError):
        make_window(qtbot)
