"""The headless command: output, exit status and refusal of bad input.

Every bad input must give exit status 2, exactly one line on stderr naming the
problem, no traceback, and leave the file on disk byte-for-byte unchanged.
"""
import json
import subprocess
import sys
from pathlib import Path

import pytest

from rating import cli

SAMPLES = Path(__file__).parent.parent / "samples"
PENTANE = SAMPLES / "pentane-vaporiser.ebullio"
CHILLER = SAMPLES / "chiller-evaporator.ebullio"


def run(argv, capsys):
    code = cli.main([str(a) for a in argv])
    out = capsys.readouterr()
    return code, out.out, out.err


def test_summary_table_and_caution(capsys):
    code, out, err = run([CHILLER], capsys)
    assert code == 0 and err == ""
    assert "Chiller E-3 at design load" in out and "Duty" in out and " W\n" in out
    assert "qualified engineer" in out


def test_json_output_has_every_case(capsys):
    code, out, _ = run([PENTANE, "--json"], capsys)
    data = json.loads(out)
    names = [c["name"] for c in data["cases"]]
    assert names == ["C5 vaporiser V-12 performance", "C5 vaporiser V-12 area for duty"]
    for c in data["cases"]:
        assert {"name", "type", "status", "message", "summary", "warnings", "methods",
                "profiles"} <= set(c)
        assert c["type"] == "evaporator"
    assert code == 0


def test_case_selection_and_csv(tmp_path, capsys):
    code, out, _ = run([PENTANE, "--case", "C5 vaporiser V-12 area for duty", "--json",
                        "--csv", tmp_path, "--increments", "20"], capsys)
    data = json.loads(out)
    assert [c["name"] for c in data["cases"]] == ["C5 vaporiser V-12 area for duty"]
    files = list(tmp_path.glob("*.csv"))
    assert len(files) == 1
    lines = files[0].read_text().splitlines()
    assert "qualified engineer" in lines[0]          # the caution, one cell
    assert lines[1].startswith("z_m,p_Pa,")
    assert len(lines) - 2 == len(data["cases"][0]["profiles"]["z_m"])


def test_the_table_takes_labels_and_units_from_the_catalogue(capsys):
    from rating.catalogue import SUMMARY
    code, out, _ = run([PENTANE, "--case", "C5 vaporiser V-12 performance"], capsys)
    assert code == 0
    # Over-design needs a required duty: a performance rating does not compute it.
    assert "not computed" in out and " 0  %" not in out
    label, unit = SUMMARY["performance_duty_W"].label, SUMMARY["performance_duty_W"].unit
    assert label == "Duty of the installed area" and label in out and unit == "W"
    # The warnings are written in SI; so is the table (no degC beside a K in a warning).
    assert "degC" not in out and "kPa" not in out
    row = next(line for line in out.splitlines() if line.strip().startswith("Exit temperature"))
    assert row.rstrip().endswith(" K")


def test_error_severity_gives_exit_1(tmp_path, capsys):
    import dataclasses
    import rating
    project = rating.load_project(PENTANE)
    case = dataclasses.replace(project.cases[1], required_duty=5e7)   # far out of reach
    path = tmp_path / "out-of-reach.ebullio"
    rating.save_project(dataclasses.replace(project, cases=(case,)), path)
    code, out, _ = run([path], capsys)
    assert code == 1 and "duty-not-reached" in out


def _edit(tmp_path, mutate):
    data = json.loads(CHILLER.read_text())
    mutate(data["cases"][0])
    path = tmp_path / "edited.ebullio"
    path.write_text(json.dumps(data, indent=2, sort_keys=True) + "\n")
    return path


BAD = {
    "zero_length": (lambda c: c["tubes"].update(length=0.0), "cases[0].tubes.length"),
    "negative_diameter": (lambda c: c["tubes"].update(outer_diameter=-0.02),
                          "cases[0].tubes.outer_diameter"),
    "inner_not_below_outer": (lambda c: c["tubes"].update(bwg=None, wall_thickness=0.0096),
                              "cases[0].tubes"),
    "unknown_fluid": (lambda c: c["boiling"].update(fluid="R134z"), "cases[0].boiling.fluid"),
    "supercritical": (lambda c: c["boiling"].update(inlet_pressure=5.0e6),
                      "cases[0].boiling.inlet_pressure"),
    "heating_too_cold": (lambda c: c["heating"].update(inlet_temperature=270.0),
                         "cases[0].heating"),
    "number_for_text": (lambda c: c["boiling"].update(fluid=42), "cases[0].boiling.fluid"),
}


@pytest.mark.parametrize("name", sorted(BAD))
def test_bad_input_exit_2_one_line_file_unchanged(name, tmp_path, capsys):
    mutate, field = BAD[name]
    path = _edit(tmp_path, mutate)
    before = path.read_bytes()
    code, out, err = run([path], capsys)
    assert code == 2, (name, err)
    assert out == ""
    lines = err.strip().splitlines()
    assert len(lines) == 1 and "Traceback" not in err
    assert field in lines[0], lines[0]
    assert path.read_bytes() == before


def test_unknown_fluid_message_suggests_a_name(tmp_path, capsys):
    path = _edit(tmp_path, lambda c: c["boiling"].update(fluid="R134z"))
    _, _, err = run([path], capsys)
    assert "R134a" in err


@pytest.mark.parametrize("content, words", [
    (lambda raw: raw[: len(raw) // 2], "not a complete"),               # truncated
    (lambda raw: json.dumps({"format": "spreadsheet", "rows": []}).encode(), "not an Ebullio"),
    (lambda raw: b"\x00\x01binary\xff\xfe", "Ebullio"),                  # binary junk
])
def test_corrupt_or_foreign_file_is_refused(content, words, tmp_path, capsys):
    path = tmp_path / "broken.ebullio"
    path.write_bytes(content(CHILLER.read_bytes()))
    before = path.read_bytes()
    code, out, err = run([path], capsys)
    assert code == 2 and out == ""
    assert len(err.strip().splitlines()) == 1 and words in err
    assert path.read_bytes() == before


def test_missing_file_and_bad_increments(tmp_path, capsys):
    code, _, err = run([tmp_path / "nothing.ebullio"], capsys)
    assert code == 2 and len(err.strip().splitlines()) == 1
    code, _, err = run([CHILLER, "--increments", "1"], capsys)
    assert code == 2 and "--increments" in err
    code, _, err = run([CHILLER, "--case", "no such case"], capsys)
    assert code == 2 and "Chiller E-3 at design load" in err


def test_console_script_runs_as_a_process():
    # The installed entry point, as a user types it (python -m for the same module).
    proc = subprocess.run([sys.executable, "-m", "rating.cli", str(CHILLER), "--json"],
                          capture_output=True, text=True, timeout=300)
    assert proc.returncode == 0, proc.stderr
    assert json.loads(proc.stdout)["cases"][0]["status"] in ("ok", "warnings")
