"""The thermosiphon's pressure-balance panel draws each crossing by the engine's own
stability flag, and never a circulation that was not solved as a pressure of 0."""
from __future__ import annotations

from types import SimpleNamespace

import numpy as np


def _result():
    points = [
        {"circulation_kg_s": 2.0, "available_Pa": 900.0, "stable": True, "selected": True},
        {"circulation_kg_s": 0.5, "available_Pa": 400.0, "stable": True, "selected": False},
        {"circulation_kg_s": 1.0, "available_Pa": 600.0, "stable": False, "selected": False},
    ]
    curve = {"circulation_kg_s": [0.2, 1.0, 2.0, 3.0], "available_Pa": [300.0, 600.0, 900.0, 1000.0],
             "required_Pa": [100.0, 600.0, 900.0, 1500.0],
             "parts_Pa": {k: [50.0, 300.0, 450.0, 750.0] for k in ("inlet_line", "tubes", "return_line")},
             "operating_points": points, "not_solved_kg_s": [3.5]}
    return SimpleNamespace(extra={"pressure_balance_curve": curve})


def test_crossings_follow_their_stable_flag_and_unsolved_points_are_not_at_zero(qapp):
    from matplotlib.figure import Figure

    from gui.plots import BalanceFigure

    panel = BalanceFigure(Figure())
    panel.show_result(_result(), "SI")          # SI: kg/s and kPa
    assert list(panel.chosen.get_xdata()) == [2.0]
    assert list(panel.stable.get_xdata()) == [0.5]            # stable, not chosen
    assert list(panel.crossings.get_xdata()) == [1.0]         # the only unstable one
    assert "unstable" in panel.crossings.get_label() and "unstable" not in panel.stable.get_label()
    # the unsolved circulation sits on the axis, not on the data's 0 kPa
    assert list(panel.unsolved.get_xdata()) == [3.5]
    assert panel.unsolved.get_transform() != panel.ax.transData
    # the y range is that of the computed pressures (lowest 0.05 kPa), no 0 taken in
    assert panel.ax.dataLim.y0 == 0.05
    bottom = panel.ax.get_ylim()[0]
    shown = panel.ax.transData.inverted().transform(
        panel.unsolved.get_transform().transform((3.5, 0.0)))
    assert np.isclose(shown[1], bottom)               # drawn on the axis line
