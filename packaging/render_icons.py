"""Render packaging/icons/ebullio.svg into the PNG sizes a desktop asks for.

Run from the repository root when the SVG changes:
``python packaging/render_icons.py``; the PNGs are committed beside the SVG.
Qt's own SVG renderer does the work, so no extra tool is needed.
"""
from __future__ import annotations

import os
import sys
from pathlib import Path

ICONS = Path(__file__).resolve().parent / "icons"
SIZES = (16, 24, 32, 48, 64, 128, 256)   # the fixed sizes of the freedesktop hicolor theme we ship


def main() -> int:
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    from PySide6.QtCore import Qt
    from PySide6.QtGui import QGuiApplication, QImage, QPainter
    from PySide6.QtSvg import QSvgRenderer

    app = QGuiApplication.instance() or QGuiApplication(sys.argv[:1])  # noqa: F841 (keeps Qt up)
    renderer = QSvgRenderer(str(ICONS / "ebullio.svg"))
    if not renderer.isValid():
        print("render_icons: ebullio.svg is not a valid SVG", file=sys.stderr)
        return 1
    for size in SIZES:
        image = QImage(size, size, QImage.Format.Format_ARGB32)
        image.fill(Qt.GlobalColor.transparent)
        painter = QPainter(image)
        painter.setRenderHint(QPainter.RenderHint.Antialiasing)
        renderer.render(painter)
        painter.end()
        out = ICONS / f"ebullio-{size}.png"
        image.save(str(out))
        print(out.name)
    return 0


if __name__ == "__main__":
    sys.exit(main())
