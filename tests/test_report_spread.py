"""The report's optional section: the spread between the methods of one family.

Each row of the section is checked against a rating of the case made here with that
method set (``catalogue.with_value``), not against the study that wrote the section;
duties are shown in kW in the SI system (1 kW = 1000 W, SI prefix), to four
significant figures.
"""
import dataclasses
import html
import re
from pathlib import Path

import pytest

import rating
from rating import catalogue
from rating.correlations import registry

ROOT = Path(__file__).parent.parent
SAMPLES = ROOT / "samples"
INCREMENTS = 20


def section_rows(path) -> list[list[str]]:
    """The cells of each row of the spread section's table, as text."""
    text = Path(path).read_text(encoding="utf-8")
    part = text.split("Spread between methods", 1)[1].split("<h2", 1)[0]
    rows = []
    for row in re.findall(r"<tr>(.*?)</tr>", part, flags=re.S):
        cells = re.findall(r"<t[dh][^>]*>(.*?)</t[dh]>", row, flags=re.S)
        rows.append([html.unescape(re.sub(r"<[^>]+>", "", c)).strip() for c in cells])
    return rows


def number(text: str) -> float:
    return float(text.replace(",", ""))


@pytest.fixture(scope="module")
def pentane():
    project = rating.load_project(SAMPLES / "pentane-vaporiser.ebullio")
    return project, dataclasses.replace(project.cases[0], increments=INCREMENTS)


def test_spread_section_rows_are_the_ratings_with_each_method(pentane, tmp_path):
    from gui.report import write_report

    project, case = pentane
    out = tmp_path / "spread.html"
    write_report(project, [case], out, "SI", spread="flow_boiling", profiles_csv=False)
    rows = section_rows(out)
    head, body, last = rows[0], rows[1:-1], rows[-1]
    assert head[0] == "Method" and head[1] == "Duty [kW]"
    # every method the engine accepts for this case, once (the registry's declaration)
    cas = rating.properties.make_fluid(case.boiling.fluid).cas
    methods = registry.applicable("flow_boiling", case.type, case.tubes.orientation, cas)
    assert [r[0].replace(" (the case's)", "") for r in body] == [m.title for m in methods]
    assert sum("(the case's)" in r[0] for r in body) == 1
    duties = []
    for m, r in zip(methods, body):
        own = rating.rate(catalogue.with_value(case, "methods.flow_boiling", m.name))
        duties.append(own.summary["duty_W"] / 1000.0)
        assert number(r[1]) == pytest.approx(duties[-1], rel=5e-4), m.name
        assert r[-1].startswith(own.status)
    assert last[0] == "Spread (highest − lowest)"
    assert number(last[1]) == pytest.approx(max(duties) - min(duties), rel=2e-3, abs=0.5)
    assert max(duties) > min(duties)
    assert 'src="data:image/png;base64,' in out.read_text(encoding="utf-8")
    assert "Figure 1.S." in out.read_text(encoding="utf-8")


def test_a_family_the_type_does_not_choose_is_said_not_computed(tmp_path):
    from gui.report import write_report

    project = rating.load_project(SAMPLES / "harrow-creek-kettles.ebullio")
    case = dataclasses.replace(project.cases[0], increments=INCREMENTS)
    out = tmp_path / "kettle.html"
    write_report(project, [case], out, "SI", spread="flow_boiling", profiles_csv=False)
    text = html.unescape(out.read_text(encoding="utf-8"))
    assert "Not computed: method family 'flow_boiling' is not a choice of a kettle" in text
    with pytest.raises(ValueError, match="flow_boiling, nucleate_boiling"):
        write_report(project, [case], tmp_path / "x.html", "SI", spread="boiling")


def test_command_adds_the_kettle_bundle_spread_to_the_report(tmp_path, capsys):
    """ebullio-rate --spread dryout on a kettle: its bundle maximum-flux methods, Palen &
    Small (1964) and Palen (1983), one row each."""
    from gui.report.command import main

    out = tmp_path / "kettle.html"
    code = main([str(SAMPLES / "harrow-creek-kettles.ebullio"), "--case",
                 "Harrow Creek C5 reboiler E-21 on LP steam", "--increments", "12", "--report", str(out),
                 "--spread", "dryout"])
    capsys.readouterr()
    assert code in (0, 1)
    titles = [r[0].replace(" (the case's)", "") for r in section_rows(out)[1:-1]]
    assert titles == [registry.get("palen_small_1964").title, registry.get("palen_1983").title]


def test_command_refuses_a_spread_without_a_report_or_of_no_family(tmp_path, capsys):
    from gui.report.command import main

    pentane = str(SAMPLES / "pentane-vaporiser.ebullio")
    for argv, says in (([pentane, "--spread", "flow_boiling"], "give --report too"),
                       ([pentane, "--spread", "boiling", "--report", str(tmp_path / "r.html")],
                        "choose one of flow_boiling")):
        code = main(argv)
        err = capsys.readouterr().err
        assert code == 2 and len(err.strip().splitlines()) == 1 and says in err, err
        assert "Traceback" not in err
    assert not (tmp_path / "r.html").exists()
