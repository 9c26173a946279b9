"""Numbers typed into the desktop are read in the user's locale and never guessed.

The locales' decimal points and group separators are the Unicode CLDR's (English: "."
and "," grouping by three; German: "," and "."), as Qt ships them.
"""
from __future__ import annotations

import pytest

from gui_helpers import open_rated, scratch, set_text, window  # noqa: F401
from rating import catalogue

BAR = 1e5          # Pa per bar (exact, by definition)


@pytest.fixture
def locale(qapp):
    """Set the default locale for one test and restore it after."""
    from PySide6.QtCore import QLocale

    before = QLocale()

    def use(name):
        QLocale.setDefault(QLocale(name))
    yield use
    QLocale.setDefault(before)


def test_a_decimal_comma_where_the_point_is_a_dot_is_refused_not_read_as_fifteen(locale):
    from gui.units import parse_number

    locale("en_US")
    for text in ("1,5", "2,5", "1,00", "12,34,567"):
        with pytest.raises(ValueError, match="decimal point is '.'"):
            parse_number(text)
    with pytest.raises(ValueError, match="not a number"):
        parse_number("2.5 bar")
    # thousands grouped as the locale groups them are read
    assert parse_number("1,000") == 1000.0
    assert parse_number("1,000.5") == 1000.5
    assert parse_number(" 2.5 ") == 2.5
    assert parse_number("") is None


def test_a_decimal_comma_is_read_where_it_is_the_locales_point(locale):
    from gui.units import entry_text, parse_number

    locale("de_DE")
    assert parse_number("2,5") == 2.5
    assert parse_number("1.000,5") == 1000.5
    with pytest.raises(ValueError, match="decimal point is ','"):
        parse_number("2.5")
    # what an entry shows is read back as the same number
    for value in (1234.5, 0.01234, 2.5, 100000.0):
        assert parse_number(entry_text(value)) == pytest.approx(value, rel=5e-4)


def test_heating_pressure_typed_with_a_decimal_comma_is_an_entry_problem_beside_its_field(
        window, qtbot, locale):
    w = window
    locale("en_US")
    open_rated(qtbot, w)
    w.set_system("metric")                        # bar(a)
    set_text(qtbot, w, "heating.pressure", "2,5")
    qtbot.waitUntil(lambda: w.runner.state(w.current_id).status == "invalid input",
                    timeout=60000)
    value = catalogue.get_value(w.doc.entry(w.current_id).draft, "heating.pressure")
    assert value != pytest.approx(25 * BAR)       # never guessed as 25 bar
    message = w.current_form().message("heating.pressure")
    assert "Heating pressure" in message and "decimal point is '.'" in message
    # the answer line and the warnings list say the same, not the engine's "must be a number"
    assert w.runner.state(w.current_id).message == message
    # the same value with the locale's point rates, and the message goes
    set_text(qtbot, w, "heating.pressure", "2.5")
    assert catalogue.get_value(w.doc.entry(w.current_id).draft,
                               "heating.pressure") == pytest.approx(2.5 * BAR)
    assert w.current_form().message("heating.pressure") == ""


def test_heating_pressure_with_the_locales_decimal_comma_is_read(window, qtbot, locale):
    w = window
    locale("de_DE")
    open_rated(qtbot, w)
    w.set_system("metric")
    set_text(qtbot, w, "heating.pressure", "2,5")
    assert catalogue.get_value(w.doc.entry(w.current_id).draft,
                               "heating.pressure") == pytest.approx(2.5 * BAR)


def test_study_bounds_with_a_decimal_comma_are_refused(qtbot, scratch, locale):  # noqa: F811
    import rating
    from gui.studies_panel import StudiesPanel
    from gui_helpers import QUICK
    from rating.studies import InlineExecutor

    locale("en_US")
    case = rating.load_project(QUICK).cases[0]
    panel = StudiesPanel(lambda: case, lambda: "metric", make_executor=InlineExecutor)
    qtbot.addWidget(panel)
    panel.refresh()
    panel.vary.start.setText("1,5")
    panel.vary.stop.setText("3")
    with pytest.raises(ValueError, match="decimal point"):
        panel.vary.variation()
