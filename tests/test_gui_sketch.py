"""The drawing of the unit labels only the dimensions given, and resolves a kettle's
defaults once per draft, not on every paint."""
from __future__ import annotations

import pytest

import rating
from gui_helpers import QUICK, SAMPLES


def _sketch(qtbot):
    from gui.sketch import UnitSketch

    w = UnitSketch()
    qtbot.addWidget(w)
    w.resize(600, 170)
    return w


def test_a_shell_not_given_is_labelled_estimated_without_a_number(qtbot):
    from rating import catalogue
    from rating.project import to_dict

    w = _sketch(qtbot)
    draft = to_dict(rating.load_project(QUICK).cases[0])
    draft = catalogue.set_value(draft, "shell.inner_diameter", None)
    w.show_draft(draft, "SI")
    w.grab()
    shell = [t for t in w.texts if "shell" in t]
    assert shell and all("estimated" in t for t in shell)
    assert not any("shell" in t and any(ch.isdigit() for ch in t.split("shell")[1].split(",")[0])
                   for t in w.texts)
    # given, it is labelled with its value (0.5 m in the window's SI: metres)
    w.show_draft(catalogue.set_value(draft, "shell.inner_diameter", 0.5), "SI")
    w.grab()
    assert any("shell 0.5" in t for t in w.texts) and not any("estimated" in t for t in w.texts)


def test_a_kettles_defaults_are_resolved_once_per_draft(qtbot, monkeypatch):
    from gui import sketch
    from rating.project import to_dict

    kettles = [p for p in sorted(SAMPLES.glob("*.ebullio"))
               if rating.load_project(p).cases[0].type == "kettle"]
    if not kettles:
        pytest.fail("no kettle sample")
    draft = to_dict(rating.load_project(kettles[0]).cases[0])
    calls = []
    real = sketch.kettle_drawn
    monkeypatch.setattr(sketch, "kettle_drawn", lambda d: calls.append(d) or real(d))
    w = _sketch(qtbot)
    w.show_draft(draft, "SI")
    for _ in range(3):
        w.grab()
    assert len(calls) == 1
    assert any(t.startswith("kettle ") for t in w.texts)


def test_a_kettle_dimension_left_empty_is_labelled_default(qtbot):
    from rating import catalogue
    from rating.project import to_dict

    kettle = next(p for p in sorted(SAMPLES.glob("*.ebullio"))
                  if rating.load_project(p).cases[0].type == "kettle")
    draft = to_dict(rating.load_project(kettle).cases[0])
    draft = catalogue.set_value(draft, "kettle.port_diameter", None)
    w = _sketch(qtbot)
    w.show_draft(draft, "SI")
    w.grab()
    port = [t for t in w.texts if t.startswith("port ")]
    assert port and port[0].endswith("(default)")
    # the bundle is given in the sample (0.5 m): labelled with its value only
    assert "bundle 0.500 m" in w.texts
