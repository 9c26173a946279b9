"""``ebullio [FILE]``: open the desktop application, on a project file if one is given.

The property library is imported in a background thread while the window is
built and painted, so the window shows at once and the first rating finds it ready.
"""
from __future__ import annotations

import sys
import threading


def warm_up():
    """Import the engine and its property library (the slow part of starting)."""
    import CoolProp.CoolProp  # noqa: F401
    import rating.exchangers  # noqa: F401
    import matplotlib.figure  # noqa: F401  (the plots are built just after the first paint)


def main(argv=None) -> int:
    argv = list(sys.argv[1:] if argv is None else argv)
    from PySide6.QtCore import QTimer
    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication([sys.argv[0]] + [a for a in argv if a.startswith("-")])
    app.setOrganizationName("Ebullio")
    app.setApplicationName("Ebullio")
    from .mainwindow import MainWindow

    window = MainWindow()
    window.show()
    # started once the window exists: imports in two threads share one interpreter lock
    threading.Thread(target=warm_up, name="ebullio-warm-up", daemon=True).start()
    files = [a for a in argv if not a.startswith("-")]

    def after_paint():
        window.first_start()
        if files:
            window.open_path(files[0])
        else:
            window.offer_recovery()
    QTimer.singleShot(0, after_paint)
    return app.exec()


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
