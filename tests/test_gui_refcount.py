"""The window survives many Qt calls (guard against a binding's reference-count defect).

PySide6 6.12.0 on Python 3.11 takes a reference from None on every call of a Qt
method that returns nothing (observed here: one per call; None has a few thousand),
which stops the interpreter with "none_dealloc" within minutes of use. gui's
refcount guard gives None, True and False a large reserve; on Python 3.12 and later
they are immortal (PEP 683) and the guard does nothing.
"""
import sys


def test_many_qt_calls_do_not_use_up_none(qapp):
    import gui  # noqa: F401  (installs the guard)
    from PySide6.QtWidgets import QLabel

    label = QLabel()
    from gui.refcount_guard import RESERVE

    # three times the references None holds apart from the reserve (a few thousand here)
    calls = min(3 * (sys.getrefcount(None) % RESERVE), 300_000)
    for _ in range(calls):
        label.setVisible(False)            # returns nothing
        label.isVisible()                  # returns a bool
    assert sys.getrefcount(None) > 1000
