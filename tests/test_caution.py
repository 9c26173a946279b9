"""One caution, in one wording, on every surface (rating.caution): the command line, the
window, the plots and the report take it from there and say nothing else in its place."""
from __future__ import annotations


def _words(text):
    return " ".join(text.split())


def test_every_surface_shows_the_one_caution(qapp):
    from gui import mainwindow, plots
    from gui.report import pdf
    from rating import caution, cli

    assert "qualified engineer" in caution.CAUTION and "qualified engineer" in caution.CAUTION_SHORT
    assert cli.CAUTION == caution.CAUTION                     # the command line's callers
    assert mainwindow.CAUTION == caution.CAUTION
    assert mainwindow.caution_text() == f"{caution.CAUTION}\n\n{caution.SCOPE}"
    assert _words(plots.CAUTION_SHORT) == caution.CAUTION_SHORT
    assert pdf.FOOTER_CAUTION == caution.CAUTION_SHORT


def test_the_report_says_the_scope_once(qapp):
    import rating
    from gui.report import content
    from gui_helpers import QUICK
    from rating import caution

    project = rating.load_project(QUICK)
    results = [rating.rate(project.cases[0])]
    html = content.build(project, project.cases[:1], results, "SI").html
    assert _words(html).count(caution.SCOPE) == 1
    assert caution.CAUTION in _words(html)
