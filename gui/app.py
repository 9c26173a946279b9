"""``ebullio [FILE]``: open the desktop application, on a project file if one is given.

The window paints first; matplotlib and the property library are imported in a
background thread after that (``gui.mainwindow.MainWindow.showEvent``), the plots
are built when matplotlib is in, and the first rating finds the property library ready.
"""
from __future__ import annotations

import sys


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
    files = [a for a in argv if not a.startswith("-")]

    def after_paint():
        window.first_start()
        if files:
            window.open_when_ready(files[0])
        else:
            window.offer_recovery()
    QTimer.singleShot(0, after_paint)
    return app.exec()


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
