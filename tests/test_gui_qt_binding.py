"""The Qt binding keeps Python's reference counts: a bool sent through a signal.

PySide6-Essentials 6.12.0 miscounts the references to the bool a signal carries to
a Python slot. On Python 3.11 True and False are ordinary objects, so after enough
edits (every QUndoStack.cleanChanged, every check box) the interpreter aborts with
"Fatal Python error: bool_dealloc", typically when the window closes after a few
projects were opened. pyproject.toml excludes that version on Python 3.11; this
test runs the fault's smallest form in a separate interpreter and asserts that it
exits normally with whatever binding is installed.
"""
from __future__ import annotations

import os
import subprocess
import sys

PROGRAM = """
import os
os.environ["QT_QPA_PLATFORM"] = "offscreen"
from PySide6.QtCore import QCoreApplication, QObject, Signal
app = QCoreApplication([])
class Sender(QObject):
    flag = Signal(bool)
sender = Sender()
sender.flag.connect(lambda value: None)
for i in range(2000):
    sender.flag.emit(i % 2 == 0)
print("emitted")
"""


def test_bools_through_signals_leave_the_interpreter_whole():
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen")
    run = subprocess.run([sys.executable, "-c", PROGRAM], capture_output=True, text=True,
                         timeout=120, env=env)
    assert run.returncode == 0 and "emitted" in run.stdout, (
        f"exit {run.returncode}: {run.stderr.strip()[:300]} (PySide6 6.12.0's signal fault "
        "aborts the app on Python 3.11; see pyproject.toml)")
