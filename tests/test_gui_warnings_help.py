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
