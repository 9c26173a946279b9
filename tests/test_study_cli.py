"""``ebullio-study``: output, exit status and refusal of bad input (one line, exit 2)."""
from __future__ import annotations

import csv
import json
import math
from pathlib import Path

import numpy as np
import pytest

from rating import study_cli

SAMPLES = Path(__file__).parent.parent / "samples"
PENTANE = SAMPLES / "pentane-vaporiser.ebullio"
CHILLER = SAMPLES / "chiller-evaporator.ebullio"
CASE = "C5 vaporiser V-12 performance"


def run(argv, capsys):
    code = study_cli.main([str(a) for a in argv])
    out = capsys.readouterr()
    return code, out.out, out.err


def test_sweep_as_json_in_input_order(capsys):
    code, out, err = run([PENTANE, "--case", CASE, "--vary", "tubes.length=2:4:3", "--json",
                          "--workers", "1"], capsys)
    assert code == 0 and err == ""
    data = json.loads(out)
    assert data["study"] == "sweep" and "qualified engineer" in data["caution"]
    assert [p["inputs"]["tubes.length"] for p in data["points"]] == [2.0, 3.0, 4.0]
    duties = [p["summary"]["duty_W"] for p in data["points"]]
    assert duties[0] < duties[1] < duties[2]


def test_sweep_table_csv_and_a_refused_point(tmp_path, capsys):
    """A refused point is listed with its reason and gives exit status 1."""
    target = tmp_path / "sweep.csv"
    code, out, err = run([PENTANE, "--case", CASE, "--vary", "tubes.length=2,-1",
                          "--workers", "1", "--csv", target], capsys)
    assert code == 1 and err == ""
    assert "refused" in out and "qualified engineer" in out and "Duty" in out
    rows = list(csv.reader(target.open(encoding="utf-8")))
    assert "qualified engineer" in rows[0][0]
    assert rows[1][:2] == ["tubes.length", "duty_W"]
    assert rows[3][0] == "-1.0" and rows[3][1] == "" and rows[3][-2] == "refused"


def test_spread_table_names_every_method(capsys):
    code, out, _ = run([PENTANE, "--case", CASE, "--spread", "flow_boiling", "--workers", "1"],
                       capsys)
    assert "gungor_winterton_1986 (case's)" in out and "spread (high - low)" in out
    assert "Chen" in out or "chen_1966" in out


def test_fit_from_the_command_line(capsys):
    code, out, _ = run([CHILLER, "--fit", "boiling.fouling_resistance=0:0.002",
                        "--measured", "heating_outlet_temperature_K=282.0936+-0.1",
                        "--workers", "1", "--json"], capsys)
    data = json.loads(out)
    assert data["study"] == "fit" and data["status"] == "fitted" and code == 0
    (p,) = data["parameters"]
    assert p["path"] == "boiling.fouling_resistance" and 3e-4 < p["value"] < 5e-4
    assert p["uncertainty"] > 0.0


def test_list_paths(capsys):
    code, out, _ = run([PENTANE, "--case", CASE, "--list-paths"], capsys)
    assert code == 0 and "tubes.length" in out.split() and "heating.pressure" in out.split()


@pytest.mark.parametrize("argv, words", [
    (["--vary", "tubes.lenght=1:2:3"], "tubes.lenght"),
    (["--vary", "tubes.length=1:2"], "START:STOP:COUNT"),
    (["--spread", "flow_boiling", "--fit", "boiling.fouling_resistance=0:1e-3"], "choose one"),
    (["--envelope", "--vary", "tubes.length=1:2:3"], "two --vary"),
    (["--fit", "boiling.fouling_resistance=0:1e-3"], "--measured"),
    (["--fit", "boiling.fouling_resistance=0:1e-3", "--measured", "duty_W=5"], "KEY=VALUE+-TOL"),
    (["--spread", "boiling"], "choose one of"),
    (["--vary", "tubes.length=1:2:3", "--workers", "0"], "--workers"),
    (["--vary", "tubes.length=1:2:3", "--show", "duty"], "--show duty"),
    (["--vary", "tubes.length=1:2:3", "--increments", "2"], "--increments"),
    (["--vary", "tubes.length=1:2:3", "--csv", "/nonexistent-folder/x.csv"], "--csv"),
    ([], "nothing to study"),
])
def test_bad_input_gives_one_line_and_exit_2(argv, words, capsys):
    code, out, err = run([PENTANE, "--case", CASE] + argv, capsys)
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and words in err and "Traceback" not in err


def test_several_cases_need_a_name(capsys):
    code, _, err = run([PENTANE, "--vary", "tubes.length=1:2:3"], capsys)
    assert code == 2 and "--case is needed" in err and CASE in err


def test_csv_never_overwrites_the_project_or_a_file_of_another_kind(tmp_path, capsys,
                                                                     monkeypatch):
    """--csv naming the project (directly, by another spelling, through a link ending in
    .csv) or a file that is not a .csv is refused with one line; both files keep their
    bytes."""
    project = tmp_path / "p.ebullio"
    project.write_bytes(PENTANE.read_bytes())
    notes = tmp_path / "notes.txt"
    notes.write_text("my notes\n", encoding="utf-8")
    link = tmp_path / "p.csv"
    link.symlink_to(project)
    monkeypatch.chdir(tmp_path)
    before = project.read_bytes()
    for target in (project, "./p.ebullio", link, notes):
        code, out, err = run([project, "--case", CASE, "--vary", "tubes.length=2,3",
                              "--workers", "1", "--csv", target], capsys)
        assert code == 2 and out == "", target
        assert err.count("\n") == 1 and "--csv" in err and "Traceback" not in err
    assert project.read_bytes() == before
    assert notes.read_text(encoding="utf-8") == "my notes\n"


def test_json_is_strict_whatever_the_study_holds(capsys, monkeypatch):
    """A figure that is not finite anywhere in the study's data prints as null: the output
    is JSON that a strict parser reads (no NaN or Infinity tokens)."""
    from rating.studies.sweep import Sweep

    plain = Sweep.to_dict

    def with_non_finite(self, keys=None):
        data = plain(self, keys)
        data["points"][0]["summary"]["duty_W"] = float("nan")
        data["points"][0]["extra"] = [np.float64("inf"), {"x": -math.inf}]
        return data

    monkeypatch.setattr(Sweep, "to_dict", with_non_finite)
    code, out, err = run([PENTANE, "--case", CASE, "--vary", "tubes.length=2,3", "--json",
                          "--workers", "1"], capsys)

    def refuse(token):
        raise ValueError(f"not JSON: {token}")

    data = json.loads(out, parse_constant=refuse)
    assert data["points"][0]["summary"]["duty_W"] is None
    assert data["points"][0]["extra"] == [None, {"x": None}]
    assert data["points"][1]["summary"]["duty_W"] > 0.0
