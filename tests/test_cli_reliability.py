"""The command under bad files, bad options and bad outputs: one line, a documented exit
status, no traceback, nothing written before the inputs and outputs are known good.

One test (or a few) per class of problem found by trying the command as a new user
and a tester would: 1 bad numbers and deep or long JSON, 2 output errors, 3 files that
are not regular or hold no cases, 5 exit codes, 6 the caution on every output,
7 one rule for the number of increments, 8 the cold start of ``--help``. Class 4
(saving) is in tests/test_save_kill.py.
"""
import csv
import io
import json
import os
import subprocess
import sys
from pathlib import Path

try:
    import fcntl
except ImportError:  # Windows
    fcntl = None

import pytest

import rating
from rating import cli
from rating.validation import INCREMENTS

import fuzzing as fz

ROOT = Path(__file__).parent.parent
SAMPLES = ROOT / "samples"
CHILLER = SAMPLES / "chiller-evaporator.ebullio"
HOT_OIL = SAMPLES / "hot-oil-vaporiser.ebullio"


def run(argv, capsys):
    try:
        code = cli.main([str(a) for a in argv])
    except SystemExit as exc:
        code = exc.code
    out = capsys.readouterr()
    return code, out.out, out.err


def refused(code, out, err, *words):
    """Exit 2, nothing on stdout, one line on stderr holding every word, no traceback."""
    assert code == cli.EXIT_BAD_INPUT, (code, err)
    assert out == "" and "Traceback" not in err
    lines = err.strip().splitlines()
    assert len(lines) == 1, err
    for word in words:
        assert word in lines[0], (word, lines[0])
    return lines[0]


def _write(tmp_path, content: bytes, name="project.ebullio") -> Path:
    path = tmp_path / name
    path.write_bytes(content)
    return path


# --- 1: numbers and JSON the parser or the arithmetic cannot take ------------------------

@pytest.mark.parametrize("depth", [1000, 100_000])
def test_deeply_nested_json_is_refused(depth, tmp_path, capsys):
    path = _write(tmp_path, b"[" * depth + b"]" * depth)
    refused(*run([path], capsys), "nested")
    path = _write(tmp_path, fz._deep(depth))
    refused(*run([path], capsys), "nested", "notes")


def test_an_integer_of_thousands_of_digits_is_refused_naming_the_field(tmp_path, capsys):
    path = _write(tmp_path, fz._set_text(CHILLER, "count", "7" * 5000))
    refused(*run([path], capsys), "cases[0].tubes.count", "5000 digits")


def test_a_shell_diameter_of_1e308_is_refused_naming_the_field(tmp_path, capsys):
    path = _write(tmp_path, fz._set_text(CHILLER, "inner_diameter", "1e308"))
    refused(*run([path], capsys), "cases[0].shell.inner_diameter")


def test_a_table_conductivity_of_1e308_is_refused_naming_the_field(tmp_path, capsys):
    data = fz.mutated(HOT_OIL, ("cases", 0, "heating", "fluid", "k", 3), 1e308)
    path = _write(tmp_path, fz.encode(data))
    refused(*run([path], capsys), "cases[0].heating.fluid.k[3]", "W/m/K")


def test_a_saturation_table_cp_of_1e308_is_refused_naming_the_field(tmp_path, capsys):
    sample = SAMPLES / "solvent-table-evaporator.ebullio"
    data = fz.mutated(sample, ("cases", 0, "boiling", "fluid", "cp_l", 3), 1e308)
    path = _write(tmp_path, fz.encode(data))
    refused(*run([path], capsys), "cases[0].boiling.fluid.cp_l[3]", "J/kg/K")


def test_a_list_for_a_kettle_dimension_with_a_default_is_refused(tmp_path, capsys):
    sample = SAMPLES / "light-ends-kettle.ebullio"        # found by the fuzz suite
    data = fz.mutated(sample, ("cases", 0, "kettle", "port_diameter"), [])
    path = _write(tmp_path, fz.encode(data))
    refused(*run([path], capsys), "cases[0].kettle.port_diameter", "number")


def test_a_tube_length_at_the_floating_point_floor_is_refused(tmp_path, capsys):
    path = _write(tmp_path, fz._set_text(CHILLER, "length", "5e-324"))
    refused(*run([path], capsys), "cases[0].tubes.length", "too small")


# --- 2: output errors are found before the rating, or reported in one line --------------

def test_csv_onto_an_existing_file_is_refused_before_rating(tmp_path, capsys, monkeypatch):
    rated = []
    monkeypatch.setattr(rating, "rate", lambda *a, **k: rated.append(1))
    not_a_folder = _write(tmp_path, b"x", "out.txt")
    refused(*run([CHILLER, "--csv", not_a_folder], capsys), "--csv", "not a folder")
    refused(*run([CHILLER, "--csv", not_a_folder / "sub"], capsys), "--csv", "cannot be created")
    assert rated == [] and not_a_folder.read_bytes() == b"x"


def test_cases_whose_names_sanitise_alike_get_their_own_csv(tmp_path, capsys):
    names = ["Pump A/B", "Pump A_B", "pump a_b", "CON", ""]
    assert len(set(cli.csv_names(names))) == len(names)
    path = _write(tmp_path, fz.two_cases_alike(["E-1 A/B", "E-1 A_B"]))
    out = tmp_path / "csv"
    code, _, err = run([path, "--csv", out, "--increments", "10"], capsys)
    assert code in (0, 1) and err == ""
    assert sorted(p.name for p in out.iterdir()) == ["E-1_A_B-2.csv", "E-1_A_B.csv"]


def test_a_closed_pipe_ends_the_output_quietly(capsys, monkeypatch):
    class ClosedPipe(io.StringIO):
        def write(self, text):
            raise BrokenPipeError(32, "Broken pipe")

    monkeypatch.setattr(sys, "stdout", ClosedPipe())
    code = cli.main([str(CHILLER), "--json", "--increments", "10"])
    assert code == cli.EXIT_RATED
    assert capsys.readouterr().err == ""


def test_a_full_disk_behind_stdout_is_one_line(capsys, monkeypatch):
    import errno

    class FullDisk(io.StringIO):
        def write(self, text):
            raise OSError(errno.ENOSPC, "No space left on device")

    monkeypatch.setattr(sys, "stdout", FullDisk())
    code = cli.main([str(CHILLER), "--increments", "10"])
    err = capsys.readouterr().err
    assert code == cli.EXIT_BAD_INPUT and "Traceback" not in err
    assert err.strip().splitlines() == ["ebullio-rate: standard output cannot be written "
                                        "(No space left on device)"]


@pytest.mark.skipif(not hasattr(fcntl, "F_SETPIPE_SZ"), reason="pipe size is set on Linux")
def test_a_closed_pipe_as_a_process(tmp_path):
    # ebullio-rate FILE --json | head -c 100: the reader goes after 100 bytes. The pipe
    # is made smaller than the output (the child needs seconds to start), so that the
    # writer meets the closed pipe instead of leaving everything in the buffer.
    proc = subprocess.Popen([sys.executable, "-m", "rating.cli", str(CHILLER), "--json"],
                            cwd=ROOT, stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    fcntl.fcntl(proc.stdout.fileno(), fcntl.F_SETPIPE_SZ, 4096)
    head = proc.stdout.read(100)
    proc.stdout.close()
    err = proc.stderr.read().decode()
    proc.wait(timeout=300)
    assert head.startswith(b"{") and err == "" and proc.returncode == 0


# --- 3: files that are not regular files, projects with nothing to rate -----------------

@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="named pipes are a POSIX feature")
def test_a_named_pipe_is_refused_without_waiting(tmp_path, capsys):
    pipe = tmp_path / "pipe.ebullio"
    os.mkfifo(pipe)
    with fz.time_limit(20):
        refused(*run([pipe], capsys), "named pipe")


def test_a_folder_or_a_device_is_refused(tmp_path, capsys):
    refused(*run([tmp_path], capsys), "folder")
    if os.path.exists(os.devnull) and os.name == "posix":
        with fz.time_limit(20):
            refused(*run([os.devnull], capsys), "device")


def test_a_project_with_no_cases_is_refused(tmp_path, capsys):
    data = fz.sample_data(CHILLER)
    data["cases"] = []
    path = _write(tmp_path, fz.encode(data))
    refused(*run([path], capsys), "no cases")


# --- 5: exit codes ------------------------------------------------------------------------

def test_an_internal_fault_gives_exit_3_one_line_and_a_hint(capsys, monkeypatch):
    def broken(*args, **kwargs):
        return 1 / 0

    monkeypatch.delenv(cli.DEBUG_VARIABLE, raising=False)
    monkeypatch.setattr(rating, "rate", broken)
    code, out, err = run([CHILLER], capsys)
    assert code == cli.EXIT_INTERNAL == 3
    assert out == "" and "Traceback" not in err and len(err.strip().splitlines()) == 1
    assert "ZeroDivisionError" in err and "report" in err and cli.DEBUG_VARIABLE in err


def test_exit_codes_are_distinct_and_documented(capsys):
    codes = (cli.EXIT_RATED, cli.EXIT_FINDINGS, cli.EXIT_BAD_INPUT, cli.EXIT_INTERNAL)
    assert codes == (0, 1, 2, 3)
    code, out, _ = run(["--help"], capsys)
    assert code == 0
    for n in codes:
        assert f"\n  {n}  " in out
    for doc in ("README.md", "DEVELOPERS.md"):
        text = (ROOT / doc).read_text(encoding="utf-8")
        assert all(f"| {n} |" in text for n in codes), doc


def test_a_usage_error_is_one_line_with_exit_2(capsys):
    refused(*run([CHILLER, "--increments", "many"], capsys), "--increments")
    refused(*run([], capsys), "file")


# --- 6: the caution on every output ------------------------------------------------------

def test_the_caution_is_in_the_json_and_in_every_csv(tmp_path, capsys):
    code, out, _ = run([SAMPLES / "pentane-vaporiser.ebullio", "--json", "--csv", tmp_path,
                        "--increments", "10"], capsys)
    data = json.loads(out)
    assert "qualified engineer" in data["caution"]
    files = sorted(tmp_path.glob("*.csv"))
    assert len(files) == len(data["cases"]) == 2
    for f in files:
        rows = list(csv.reader(f.open(encoding="utf-8")))
        assert len(rows[0]) == 1 and "qualified engineer" in rows[0][0]   # one cell
        assert rows[1][0] == "z_m"


# --- 7: one rule for the number of increments --------------------------------------------

def test_one_rule_for_the_increments_everywhere(tmp_path, capsys):
    from rating import catalogue

    lo, hi = INCREMENTS
    assert catalogue.input_field("increments").hard == INCREMENTS
    case = rating.load_project(CHILLER).cases[0]
    for n in (lo - 1, hi + 1):
        line = refused(*run([CHILLER, "--increments", n], capsys), "--increments")
        assert f"from {lo} to {hi}" in line
        with pytest.raises(rating.InputError, match=f"from {lo} to {hi}"):
            rating.rate(case, increments=n)
        data = fz.sample_data(CHILLER)
        data["cases"][0]["increments"] = n
        path = _write(tmp_path, fz.encode(data))
        line = refused(*run([path], capsys), "cases[0].increments")
        assert f"{lo}" in line and f"{hi}" in line


# --- 8: the cold start --------------------------------------------------------------------

def _console_script() -> tuple[str, str]:
    """Module and function of the installed ``ebullio-rate``, as pyproject.toml names them."""
    import tomllib

    with open(ROOT / "pyproject.toml", "rb") as fh:
        target = tomllib.load(fh)["project"]["scripts"]["ebullio-rate"]
    module, _, function = target.partition(":")
    return module, function


def test_help_does_not_load_the_property_library_and_states_the_cold_start():
    module, function = _console_script()
    probe = ("import sys, contextlib, io\n"
             f"from {module} import {function} as main\n"
             "with contextlib.redirect_stdout(io.StringIO()) as out:\n"
             "    try: main(['--help'])\n"
             "    except SystemExit: pass\n"
             "heavy = [m for m in ('CoolProp', 'numpy', 'scipy', 'matplotlib', 'PySide6', "
             "'pint', 'rating.properties') "
             "if m in sys.modules]\n"
             "print(heavy, 'cold start' in out.getvalue().lower())\n")
    proc = subprocess.run([sys.executable, "-c", probe], cwd=ROOT, capture_output=True,
                          text=True, timeout=120)
    assert proc.stdout.strip() == "[] True", proc.stdout + proc.stderr
