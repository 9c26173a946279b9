"""A drawing of the unit to scale, redrawn as the geometry is edited.

It reads the draft's geometry (SI) and draws it with one scale for both
directions: the tubes and shell of an evaporator, the column, reboiler and lines of
a thermosiphon with the column level, the end view of a kettle with its bundle,
liquid at the weir and freeboard. A dimension that is not given yet is left out,
or drawn dashed and labelled "estimated" without a number where the picture needs
it (the shell around an evaporator's bundle); the drawing never invents a number.
"""
from __future__ import annotations

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QFont, QPainter, QPen
from PySide6.QtWidgets import QSizePolicy, QWidget

from rating import catalogue

from . import units
from .style import INK, OKABE_ITO as C

LIQUID = QColor("#cfe3f3")
STEEL = QColor("#5b6770")


def _num(draft, path):
    try:
        v = catalogue.get_value(draft, path)
    except (KeyError, TypeError, AttributeError):
        return None
    return float(v) if isinstance(v, (int, float)) and not isinstance(v, bool) and v > 0 else None


def kettle_drawn(draft: dict) -> dict:
    """A kettle draft's shell with the dimensions left empty at the engine's published
    defaults (built once per draft, not per paint); the draft as it is while unfinished."""
    import dataclasses

    from rating.case import KettleShell
    from rating.errors import InputError
    from rating.project import from_dict

    try:
        return {"kettle": dataclasses.asdict(from_dict(draft.get("kettle"), KettleShell))}
    except InputError:                  # an unfinished kettle: draw what is given
        return draft


class UnitSketch(QWidget):
    def __init__(self, parent=None):
        super().__init__(parent)
        self.draft: dict = {}
        self._kettle_draft: dict = {}
        self.system = "SI"
        self.texts: list[str] = []      # the labels of the last paint (what a reader sees)
        self.setMinimumHeight(150)
        self.setSizePolicy(QSizePolicy.Expanding, QSizePolicy.Fixed)
        self.setFixedHeight(170)

    def show_draft(self, draft, system):
        if draft is not self.draft and isinstance(draft, dict) and draft.get("type") == "kettle":
            self._kettle_draft = kettle_drawn(draft)
        self.draft, self.system = draft, system
        self.update()

    def _text(self, p, where, text, *flags):
        self.texts.append(text)
        if flags:
            p.drawText(where, *flags, text)
        else:
            p.drawText(where, text)

    def _len(self, metres):
        return units.format_value(metres, "length", self.system, 3)

    def paintEvent(self, event):
        p = QPainter(self)
        p.setRenderHint(QPainter.Antialiasing)
        p.fillRect(self.rect(), QColor("white"))
        f = QFont(self.font())
        f.setPointSizeF(max(7.0, f.pointSizeF() * 0.85))
        p.setFont(f)
        self.texts = []
        kind = self.draft.get("type")
        box = QRectF(self.rect()).adjusted(8, 8, -8, -8)
        try:
            drawn = {"evaporator": self._tubes, "thermosiphon": self._thermosiphon,
                     "kettle": self._kettle}.get(kind, lambda *_: False)(p, box)
        except (ValueError, ZeroDivisionError, OverflowError):
            drawn = False
        if not drawn:
            p.setPen(QColor("#777777"))
            self._text(p, box, "the drawing follows once the geometry is given", Qt.AlignCenter)
        p.setPen(QColor("#777777"))
        self._text(p, box, "to scale", Qt.AlignRight | Qt.AlignBottom)
        p.end()

    # --- in-tube evaporator: a side view of the bundle in its shell
    def _tubes(self, p, box):
        d = self.draft
        L, do, n = _num(d, "tubes.length"), _num(d, "tubes.outer_diameter"), _num(d, "tubes.count")
        if not (L and do):
            return False
        pitch = _num(d, "tubes.pitch") or 1.25 * do
        given = _num(d, "shell.inner_diameter")
        # not given: a shell round the bundle, for the picture only (dashed, no number)
        shell = given or ((n or 1) ** 0.5 * pitch * 1.1 + do)
        shell_text = f"shell {self._len(given)}" if given else "shell estimated"
        vertical = catalogue.get_value(d, "tubes.orientation") != "horizontal"
        long_, wide = (box.height() - 18, box.width() - 120) if vertical else (box.width() - 90, box.height() - 30)
        s = min(long_ / L, wide / shell)
        lw, sw = L * s, shell * s
        if vertical:
            r = QRectF(box.center().x() - sw / 2, box.top() + 4, sw, lw)
        else:
            r = QRectF(box.left() + 40, box.center().y() - sw / 2, lw, sw)
        p.setPen(QPen(STEEL, 1.6, Qt.SolidLine if given else Qt.DashLine))
        p.setBrush(QColor("#f4f6f8"))
        p.drawRect(r)
        rows = max(1, min(9, int(shell / pitch)))
        p.setPen(QPen(QColor(C["blue"]), max(1.0, do * s)))
        for i in range(rows):
            t = (i + 0.5) / rows
            if vertical:
                x = r.left() + t * r.width()
                p.drawLine(QPointF(x, r.top()), QPointF(x, r.bottom()))
            else:
                y = r.top() + t * r.height()
                p.drawLine(QPointF(r.left(), y), QPointF(r.right(), y))
        p.setPen(INK)
        if vertical:
            self._text(p, QPointF(r.right() + 6, r.center().y()), f"L = {self._len(L)}")
            self._text(p, QPointF(r.right() + 6, r.center().y() + 14), shell_text)
            self._text(p, QPointF(box.left(), box.top() + 10), f"{int(n) if n else '?'} tubes, vertical")
        else:
            self._text(p, QPointF(r.left(), r.bottom() + 14), f"L = {self._len(L)}, {shell_text}, "
                                                              f"{int(n) if n else '?'} tubes, horizontal")
        return True

    # --- thermosiphon: column, reboiler, inlet and return lines, column level
    def _thermosiphon(self, p, box):
        d = self.draft
        L = _num(d, "tubes.length")
        level = _num(d, "thermosiphon.liquid_level")
        rise = _num(d, "thermosiphon.return_line_rise") or 0.0
        if not L:
            return False
        given = _num(d, "shell.inner_diameter")
        shell = given or L / 6          # not given: the reboiler's width is drawn dashed
        top = L + rise + max(0.5, 0.25 * L)
        height = max(top, level or 0) + 0.3
        s = (box.height() - 10) / height
        base_y = box.bottom() - 4 - 0.15 * s
        col_w = max(0.8, shell * 1.2) * s
        col = QRectF(box.left() + 30, base_y - height * s + 0.3 * s, col_w, height * s - 0.15 * s)
        reb = QRectF(col.right() + max(40.0, 1.5 * s), base_y - L * s, shell * s, L * s)

        def y(z):
            return base_y - z * s
        labels = []                     # (baseline, text), drawn last without overlapping
        # column and its liquid
        p.setPen(QPen(STEEL, 1.6))
        p.setBrush(QColor("#f4f6f8"))
        p.drawRect(col)
        if level:
            liq = QRectF(col.left(), y(level), col.width(), col.bottom() - y(level))
            p.fillRect(liq.intersected(col), LIQUID)
            p.setPen(QPen(QColor(C["blue"]), 1.4, Qt.DashLine))
            p.drawLine(QPointF(col.left() - 12, y(level)), QPointF(reb.right() + 12, y(level)))
            labels.append((y(level) + 4, f"level {self._len(level)}"))
        # reboiler
        p.setPen(QPen(STEEL, 1.6, Qt.SolidLine if given else Qt.DashLine))
        p.setBrush(QColor("#f4f6f8"))
        p.drawRect(reb)
        p.setPen(QPen(QColor(C["blue"]), 1.0))
        for i in range(5):
            x = reb.left() + (i + 0.5) / 5 * reb.width()
            p.drawLine(QPointF(x, reb.top()), QPointF(x, reb.bottom()))
        # lines: inlet from the column base to the bottom channel, return from the top
        p.setPen(QPen(QColor(C["orange"]), 2.0))
        p.drawPolyline([QPointF(col.center().x(), col.bottom()), QPointF(col.center().x(), col.bottom() + 3),
                        QPointF(reb.center().x(), col.bottom() + 3), QPointF(reb.center().x(), reb.bottom())])
        p.setPen(QPen(QColor(C["vermillion"]), 2.0))
        ret_y = y(L + rise)
        p.drawPolyline([QPointF(reb.center().x(), reb.top()), QPointF(reb.center().x(), ret_y),
                        QPointF(col.right(), ret_y)])
        p.setPen(INK)
        self._text(p, QPointF(col.left(), box.top() + 10), "column")
        labels.append((reb.center().y(), f"tubes {self._len(L)}"))
        labels.append((base_y + 4, "bottom tube sheet"))
        self.texts += _spread_labels(p, reb.right() + 16, labels, box.top() + 12, box.bottom())
        p.setPen(QColor("#777777"))
        p.drawLine(QPointF(col.left() - 12, base_y), QPointF(reb.right() + 12, base_y))
        return True

    # --- kettle: the end view of the shell, the bundle, the liquid up to the weir
    def _kettle(self, p, box):
        d = self._kettle_draft            # empty dimensions at the engine's defaults

        def said(name, text):             # a dimension the user left empty says so
            return text if _num(self.draft, f"kettle.{name}") else f"{text} (default)"
        D = _num(d, "kettle.kettle_diameter")
        port = _num(d, "kettle.port_diameter")
        bundle = _num(d, "kettle.bundle_diameter")
        weir = _num(d, "kettle.weir_height")
        if not D:
            return False
        s = (box.height() - 8) / D
        left = box.left() + 20
        bottom = box.bottom() - 2
        shell = QRectF(left, bottom - D * s, D * s, D * s)
        cx = shell.center().x()

        def y(z):
            return bottom - z * s
        labels = []                     # (baseline, text), drawn last without overlapping
        p.setPen(QPen(STEEL, 1.8))
        p.setBrush(QColor("#f4f6f8"))
        p.drawEllipse(shell)
        if weir:
            p.save()
            from PySide6.QtGui import QPainterPath
            clip = QPainterPath()
            clip.addEllipse(shell)
            p.setClipPath(clip)
            p.fillRect(QRectF(shell.left(), y(weir), shell.width(), bottom - y(weir)), LIQUID)
            p.restore()
            p.setPen(QPen(QColor(C["blue"]), 1.4, Qt.DashLine))
            p.drawLine(QPointF(shell.left() - 6, y(weir)), QPointF(shell.right() + 10, y(weir)))
            labels.append((y(weir) + 4, said("weir_height", f"weir {self._len(weir)}")))
        if port:
            p.setPen(QPen(STEEL, 1.0, Qt.DotLine))
            p.setBrush(Qt.NoBrush)
            p.drawEllipse(QRectF(cx - port * s / 2, bottom - port * s, port * s, port * s))
            if bundle:
                b0 = 0.5 * (port - bundle)
                p.setPen(QPen(QColor(C["vermillion"]), 1.4))
                p.setBrush(QColor(C["vermillion"]).lighter(190))
                p.drawEllipse(QRectF(cx - bundle * s / 2, y(b0 + bundle), bundle * s, bundle * s))
                labels.append((y(b0 + bundle) + 4, said("bundle_diameter", f"bundle {self._len(bundle)}")))
        p.setPen(INK)
        labels.append((shell.top() + 12, said("kettle_diameter", f"kettle {self._len(D)}")))
        if port:
            labels.append((bottom - 2, said("port_diameter", f"port {self._len(port)}")))
        self.texts += _spread_labels(p, shell.right() + 14, labels, box.top() + 12, bottom - 2)
        return True


def _spread_labels(p, x, labels, top, bottom):
    """Draw labels at their heights, moved apart where two would overlap (kept in order)."""
    step = p.fontMetrics().height()
    labels = sorted(labels)
    ys = []
    for target, _ in labels:
        ys.append(max(target, ys[-1] + step) if ys else max(target, top))
    if ys and ys[-1] > bottom:          # pushed past the bottom: move the crowd up
        ys[-1] = bottom
        for i in range(len(ys) - 2, -1, -1):
            ys[i] = min(ys[i], ys[i + 1] - step)
    for yy, (_, text) in zip(ys, labels):
        p.drawText(QPointF(x, yy), text)
    return [text for _, text in labels]
