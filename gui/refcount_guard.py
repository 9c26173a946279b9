"""A guard against a reference-counting defect of the Qt bindings on Python 3.11.

With PySide6 6.12.0 on Python 3.11, every call of a Qt method that returns nothing
takes one reference from ``None`` without giving it back (and bool results do the
same to ``True``/``False``); after a few thousand calls the interpreter stops with
"Fatal Python error: none_dealloc". Python 3.12 made these objects immortal (PEP
683), so the defect is harmless there. On older Pythons we give the three
singletons a reserve of references so large that no session can use it up: the
same effect as 3.12's immortality, for objects that are never freed anyway.
"""
from __future__ import annotations

import ctypes
import sys

RESERVE = 1 << 40


def guard() -> None:
    if sys.version_info >= (3, 12) or getattr(sys, "_ebullio_refcount_guard", False):
        return
    for obj in (None, True, False):
        # ob_refcnt is the first field of every CPython object
        ctypes.c_ssize_t.from_address(id(obj)).value += RESERVE
    sys._ebullio_refcount_guard = True
