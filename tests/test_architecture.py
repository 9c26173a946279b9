"""The engine never imports Qt, the GUI or matplotlib (DESIGN: data flows one way)."""
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).parent.parent


def test_import_linter_contract_holds():
    # import-linter reads the contract from pyproject.toml.
    lint = Path(sys.executable).with_name("lint-imports")
    proc = subprocess.run([str(lint), "--no-cache"], cwd=ROOT, capture_output=True, text=True)
    assert proc.returncode == 0, proc.stdout + proc.stderr
    assert "1 kept, 0 broken" in proc.stdout


def test_engine_imports_and_rates_without_qt_or_matplotlib():
    code = (
        "import sys\n"
        "for m in ('PySide6', 'matplotlib', 'gui'):\n"
        "    sys.modules[m] = None\n"
        "import rating, rating.cli\n"
        "p = rating.load_project('samples/chiller-evaporator.ebullio')\n"
        "r = rating.rate(p.cases[0], increments=10)\n"
        "assert r.status != 'failed', r.message\n"
        "print('ok')\n")
    proc = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True)
    assert proc.returncode == 0 and proc.stdout.strip() == "ok", proc.stderr
