"""The studies tab of the desktop: set up, run, stop, plot and export, on real widgets.

The panel runs its points here on the in-process executor (the process pool is the
engine's, tested in test_studies.py) from its worker thread, as in the window.
"""
from __future__ import annotations

import csv
from pathlib import Path

import pytest

import rating
from gui_helpers import scratch  # noqa: F401 - a fixture
from rating.studies import CANCELLED, InlineExecutor

SAMPLES = Path(__file__).parent.parent / "samples"
TIMEOUT_MS = 240000          # the test machine may be shared


@pytest.fixture(scope="module")
def pentane():
    return rating.load_project(SAMPLES / "pentane-vaporiser.ebullio").cases[0]


def make_panel(qtbot, case, system="metric"):
    from gui.studies_panel import StudiesPanel

    holder = {"case": case}
    panel = StudiesPanel(lambda: holder["case"], lambda: system, make_executor=InlineExecutor)
    qtbot.addWidget(panel)
    panel.resize(1000, 700)
    panel.show()
    panel.refresh()
    panel.holder = holder
    return panel


def run(qtbot, panel):
    panel.run()
    qtbot.waitUntil(lambda: not panel.busy(), timeout=TIMEOUT_MS)


def test_sweep_is_plotted_in_display_units_and_tabled(qtbot, pentane):
    panel = make_panel(qtbot, pentane)
    assert panel.vary.path.currentData() == "tubes.length"
    panel.vary.start.setText("2")
    panel.vary.stop.setText("3")
    panel.vary.count.setText("3")
    run(qtbot, panel)
    study = panel.study
    assert [p.inputs["tubes.length"] for p in study.points] == [2.0, 2.5, 3.0]
    (line,) = panel.ax.get_lines()
    # kW on the axis: 1 kW = 1000 W (SI prefix)
    assert list(line.get_ydata()) == pytest.approx([d / 1000.0 for d in study.values("duty_W")])
    assert list(line.get_xdata()) == pytest.approx([2.0, 2.5, 3.0])
    assert "[kW]" in panel.ax.get_ylabel() and "[m]" in panel.ax.get_xlabel()
    assert panel.table.rowCount() == 3
    assert "3 of 3 points rated" in panel.note.text()


def test_stop_cancels_the_queued_points(qtbot, pentane):
    panel = make_panel(qtbot, pentane)
    panel.vary.count.setText("40")
    panel.run()
    panel.stop()
    qtbot.waitUntil(lambda: not panel.busy(), timeout=TIMEOUT_MS)
    statuses = [p.status for p in panel.study.points]
    assert len(statuses) == 40 and CANCELLED in statuses
    first_cancelled = statuses.index(CANCELLED)
    assert all(s == CANCELLED for s in statuses[first_cancelled:])
    assert panel.table.rowCount() == 40


def test_export_writes_si_with_the_caution(qtbot, pentane, tmp_path):
    panel = make_panel(qtbot, pentane)
    panel.vary.count.setText("2")
    run(qtbot, panel)
    target = tmp_path / "sweep.csv"
    assert panel.export_csv(target)
    rows = list(csv.reader(target.open(encoding="utf-8")))
    assert "qualified engineer" in rows[0][0]
    assert rows[1][0] == "tubes.length" and "duty_W" in rows[1]
    duty = float(rows[2][rows[1].index("duty_W")])
    assert duty == pytest.approx(panel.study.points[0].value("duty_W"))  # W, not kW


def test_spread_marks_the_case_method(qtbot, pentane):
    panel = make_panel(qtbot, pentane)
    panel.kind_box.setCurrentIndex(1)
    run(qtbot, panel)
    labels = [t.get_text() for t in panel.ax.get_yticklabels()]
    assert len(labels) == len(panel.study.methods)
    assert sum("(the case's)" in t for t in labels) == 1
    dots = [ln for ln in panel.ax.get_lines() if ln.get_marker() == "o"]
    assert len(dots) == len(panel.study.methods)
    assert "spread" in panel.ax.get_title(loc="left")


def test_envelope_marks_the_operating_point(qtbot, pentane):
    panel = make_panel(qtbot, pentane, system="SI")
    panel.kind_box.setCurrentIndex(2)
    panel.env_x.count.setText("2")
    panel.env_y.count.setText("2")
    run(qtbot, panel)
    star = [ln for ln in panel.ax.get_lines() if ln.get_marker() == "*"]
    assert len(star) == 1
    # the sample's own feed, 4.5 kg/s, and steam at 2 bar(a), shown as 200 kPa(a)
    # in the SI system (1 bar = 100 kPa)
    assert star[0].get_xdata()[0] == pytest.approx(4.5)
    assert star[0].get_ydata()[0] == pytest.approx(200.0)
    assert "kPa(a)" in panel.ax.get_ylabel()
    assert panel.table.rowCount() == 4


def test_bad_range_is_refused_beside_the_study(qtbot, pentane):
    panel = make_panel(qtbot, pentane)
    panel.vary.start.setText("two")
    panel.run()
    assert not panel.busy() and panel.study is None
    assert "must be numbers" in panel.note.text()


def test_the_window_has_a_studies_tab_on_its_current_case(qtbot, scratch):
    from gui_helpers import make_window, open_rated

    w = make_window(qtbot)
    try:
        open_rated(qtbot, w)
        panel = w.studies
        w.tabs.setCurrentWidget(panel)
        assert w.tabs.tabText(w.tabs.currentIndex()) == "Studies"
        assert panel.vary.path.findData("tubes.length") >= 0
        assert panel.vary.unit.text() == "m"
        panel._make_executor = InlineExecutor
        panel.vary.count.setText("2")
        run(qtbot, panel)
        case = w.doc.entry(w.current_id).draft["name"]
        assert panel.study.case_name == case and len(panel.study.points) == 2
    finally:
        w.runner.shutdown()


# --- fit to plant data -------------------------------------------------------------------

TRUE_FOULING = 4e-4     # m^2*K/W, as in test_studies.py (a TEMA-range value, common practice)


@pytest.fixture(scope="module")
def chiller():
    return rating.load_project(SAMPLES / "chiller-evaporator.ebullio").cases[0]


@pytest.fixture(scope="module")
def plant(chiller):
    """The 'plant': the chiller rated with a known boiling-side fouling resistance."""
    from rating import catalogue
    return rating.rate(catalogue.with_value(chiller, "boiling.fouling_resistance", TRUE_FOULING))


def fit_panel(qtbot, chiller):
    panel = make_panel(qtbot, chiller, system="SI")
    panel.kind_box.setCurrentIndex(panel.kind_box.findData("fit"))
    assert panel.setup.currentWidget() is panel.fit_setup
    return panel


def type_into(qtbot, field, text):
    field.clear()
    qtbot.keyClicks(field, text)


def run_by_button(qtbot, panel):
    from PySide6.QtCore import Qt
    qtbot.mouseClick(panel.run_button, Qt.LeftButton)
    qtbot.waitUntil(lambda: not panel.busy(), timeout=TIMEOUT_MS)


def test_fit_in_the_tab_recovers_a_known_fouling(qtbot, chiller, plant, tmp_path):
    """The chilled-water outlet temperature of a rating made with R_f = 4e-4 m^2K/W is typed
    in °C (T[°C] = T[K] - 273.15, by definition) with a 0.1 K tolerance; the boiling-side
    fouling is ticked by default with the bounds 0 to 0.002 m^2K/W. test_studies.py
    justifies 1e-6 m^2K/W for the engine's answer (60 times below the uncertainty this
    tolerance gives); the tab shows it to the decimal place of its uncertainty."""
    panel = fit_panel(qtbot, chiller)
    setup = panel.fit_setup
    first, second = setup.fit_rows
    assert first.path.currentData() == "boiling.fouling_resistance"
    assert [first.low.text(), first.high.text()] == ["0", "0.002"]
    assert second.path.currentData() is None
    measured = plant.summary["heating_outlet_temperature_K"] - 273.15
    value, tolerance = setup.measure("heating_outlet_temperature_K")
    type_into(qtbot, value, repr(measured))
    type_into(qtbot, tolerance, "0.1")
    seen = []
    panel.signals.progress.connect(lambda done, total: seen.append((done, total)))
    run_by_button(qtbot, panel)
    assert panel.study.status == "fitted"
    assert panel.study.values["boiling.fouling_resistance"] == pytest.approx(TRUE_FOULING,
                                                                             abs=1e-6)
    # the engine's progress(done, None) reaches the bar as "total not known" (0)
    assert seen and {t for _, t in seen} == {0} and seen[-1][0] == panel.study.ratings
    # what the engineer reads: the table's fitted row and the verdict above the plot
    row = [panel.table.item(0, c).text() for c in range(panel.table.columnCount())]
    assert row[0].startswith("Fouling resistance, boiling side")
    shown, spread = row[1], row[2]
    last_place = 10.0 ** -len(shown.split(".")[1])
    assert float(shown) == pytest.approx(TRUE_FOULING, abs=1e-6 + last_place / 2)
    assert 0.0 < float(spread) < TRUE_FOULING
    assert row[-1] == "fitted" and row[5] == "m²·K/W"
    assert panel.fit_verdict.isVisible()
    assert panel.fit_verdict.text().startswith(f"Fitted: Fouling resistance, boiling side = "
                                               f"{shown} ± {spread} m²·K/W")
    # the plots: the misfit's minimum is at the fitted value, the measurement within 1 tolerance
    left, right = panel.plot.figure.axes
    fitted_line = [ln for ln in left.get_lines() if ln.get_label() == "fitted"]
    assert fitted_line and fitted_line[0].get_xdata()[0] == pytest.approx(TRUE_FOULING, abs=1e-6)
    (dot,) = [ln for ln in right.get_lines() if ln.get_marker() == "o"]
    assert abs(dot.get_xdata()[0]) < 1.0
    # the export: SI, the fitted value at full precision
    target = tmp_path / "fit.csv"
    assert panel.export_csv(target)
    rows = list(csv.reader(target.open(encoding="utf-8")))
    assert "qualified engineer" in rows[0][0] and rows[1][:2] == ["path", "value"]
    assert rows[2][0] == "boiling.fouling_resistance"
    assert float(rows[2][1]) == pytest.approx(panel.study.values["boiling.fouling_resistance"])


def test_fit_in_the_tab_says_when_the_fit_is_poor(qtbot, chiller, plant):
    """Chilled water measured 3 K warmer than any fouling up to 0.002 m^2K/W gives (as in
    test_studies.py): the fit ends at the bound and the tab says the fit is poor."""
    panel = fit_panel(qtbot, chiller)
    value, tolerance = panel.fit_setup.measure("heating_outlet_temperature_K")
    type_into(qtbot, value, repr(plant.summary["heating_outlet_temperature_K"] - 273.15 + 3.0))
    type_into(qtbot, tolerance, "0.1")
    run_by_button(qtbot, panel)
    assert panel.study.status == "poor"
    text = panel.fit_verdict.text()
    assert text.startswith("Poor fit: ") and "upper bound (0.002000 m²·K/W)" in text
    # the catalogue's words and the window's units, not the engine's paths and kelvins
    assert "• poor fit: heating medium outlet temperature is " in text and " °C " in text
    assert "boiling.fouling_resistance" not in text and "_K" not in text
    last = panel.table.columnCount() - 1
    assert panel.table.item(1, last).text() == "missed"


def test_fit_in_the_tab_says_when_the_fouling_is_not_identifiable(qtbot, chiller, plant):
    """The boiling R134a leaves at saturation: its exit temperature barely moves with the
    fouling (test_studies.py), so a 0.5 K tolerance cannot fix it; the tab says so."""
    panel = fit_panel(qtbot, chiller)
    setup = panel.fit_setup
    value, tolerance = setup.measure("exit_temperature_K")
    type_into(qtbot, value, repr(plant.summary["exit_temperature_K"] - 273.15))
    type_into(qtbot, tolerance, "0.5")
    run_by_button(qtbot, panel)
    assert panel.study.status == "unidentifiable"
    assert panel.fit_verdict.text().startswith("Not identifiable: Fouling resistance, boiling "
                                               "side = ")
    assert "not determined" in panel.fit_verdict.text()
    assert "• Fouling resistance, boiling side is not identifiable: over its whole range, " \
           "0 m²·K/W to 0.002000 m²·K/W," in panel.fit_verdict.text()
    assert panel.table.item(0, 2).text() == "not determined"
    assert panel.table.item(0, panel.table.columnCount() - 1).text() == "not identifiable"


def test_fit_set_up_refuses_a_measurement_without_its_tolerance(qtbot, chiller):
    panel = fit_panel(qtbot, chiller)
    value, tolerance = panel.fit_setup.measure("duty_W")
    type_into(qtbot, value, "40")
    run_by_button(qtbot, panel)
    assert panel.study is None
    assert "Duty: give its tolerance" in panel.note.text()
    type_into(qtbot, tolerance, "1")
    second = panel.fit_setup.fit_rows[1]
    second.path.setCurrentIndex(second.path.findData("boiling.fouling_resistance"))
    run_by_button(qtbot, panel)
    assert panel.study is None and "the same input twice" in panel.note.text()


def test_stop_ends_a_fit_as_stopped(qtbot, chiller, plant):
    panel = fit_panel(qtbot, chiller)
    setup = panel.fit_setup
    value, tolerance = setup.measure("heating_outlet_temperature_K")
    type_into(qtbot, value, repr(plant.summary["heating_outlet_temperature_K"] - 273.15))
    type_into(qtbot, tolerance, "0.1")
    panel.run()
    panel.stop()
    qtbot.waitUntil(lambda: not panel.busy(), timeout=TIMEOUT_MS)
    assert panel.study.status == "cancelled"
    assert panel.fit_verdict.text().startswith("Stopped")


def test_a_kettle_offers_its_own_families_and_spreads_its_bundle_limits(qtbot):
    """A kettle chooses a nucleate boiling method and a bundle maximum-flux method, nothing
    in-tube (the catalogue's types); its dryout spread compares the two Palen methods."""
    kettle = rating.load_project(SAMPLES / "harrow-creek-kettles.ebullio").cases[0]
    panel = make_panel(qtbot, kettle)
    offered = [panel.family_box.itemText(i) for i in range(panel.family_box.count())]
    assert offered == ["Nucleate boiling coefficient", "Bundle maximum flux"]
    panel.kind_box.setCurrentIndex(panel.kind_box.findData("spread"))
    panel.family_box.setCurrentIndex(panel.family_box.findData("dryout"))
    panel.show_box.setCurrentIndex(panel.show_box.findData("max_chf_ratio"))
    run(qtbot, panel)
    assert [m[0] for m in panel.study.methods] == ["palen_small_1964", "palen_1983"]
    assert panel.table.rowCount() == 2
    dots = [ln for ln in panel.ax.get_lines() if ln.get_marker() == "o"]
    assert len(dots) == 2 and dots[0].get_xdata()[0] != dots[1].get_xdata()[0]
