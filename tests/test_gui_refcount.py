"""The Qt binding keeps None's reference count over many Qt calls.

PySide6 6.12.0 on Python 3.11 takes a reference from None on every call of a Qt
method that returns nothing (observed here: one per call; None holds a few
thousand), which stops the interpreter with "none_dealloc" within minutes of use.
pyproject.toml keeps that version off Python 3.11 (see also test_gui_qt_binding);
this test finds the fault in whatever binding is installed, with fewer calls than
None holds references so that a faulty binding fails the assertion instead of
aborting the run. On Python 3.12 and later None is immortal (PEP 683).
"""
import sys


def test_many_qt_calls_leave_none_its_references(qapp):
    from PySide6.QtWidgets import QLabel

    label = QLabel()
    calls = 1000
    before = sys.getrefcount(None)
    for _ in range(calls):
        label.setVisible(False)            # returns nothing
        label.isVisible()                  # returns a bool
    lost = before - sys.getrefcount(None)
    assert lost < calls // 10, f"{lost} references to None lost in {calls} Qt calls"
