"""The report's HTML laid out as A4 pages by Qt's own text engine and written by QPdfWriter.

Every page carries a header (report title, project, the case on that page, the
date) and a footer (a short caution, page n of N). The document is laid out at 96
logical pixels per inch on the text area of the page and painted page by page,
scaled to the writer's resolution; each case starts on a new page, so the case
named in a page's header is the last case heading at or above that page.
"""
from __future__ import annotations

import os

from rating.caution import CAUTION_SHORT

MM_PER_INCH = 25.4
LOGICAL_DPI = 96.0
PAGE_MM = (210.0, 297.0)                     # A4
MARGINS_MM = (15.0, 21.0, 15.0, 17.0)        # left, top (header), right, bottom (footer)
FOOTER_CAUTION = CAUTION_SHORT


def _px(mm: float) -> float:
    return mm / MM_PER_INCH * LOGICAL_DPI


def ensure_app():
    """The application object for fonts and images; a report needs no screen (offscreen).

    A widgets QApplication, not a bare QGuiApplication: a process holds one application
    object for its life, and one that later shows a window or a dialog (a test session,
    a script that writes a report and then opens the desktop) aborts on its first widget
    if the first object made was a QGuiApplication."""
    from PySide6.QtWidgets import QApplication

    app = QApplication.instance()
    if app is None:
        os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
        app = QApplication(["ebullio-report"])
    return app


def report_font(points: float):
    """The report's face, without ligatures: "fi" stays two letters in the PDF's text,
    so that a search for "qualified" finds the caution."""
    from PySide6.QtGui import QFont

    font = QFont("DejaVu Sans")
    font.setPointSizeF(points)
    if hasattr(font, "setFeature"):          # Qt 6.7 and later
        font.setFeature(QFont.Tag("liga"), 0)
        font.setFeature(QFont.Tag("clig"), 0)
    return font


KEEP_WITH_NEXT = 48.0     # [px] room a heading needs below it: a table header and a row
MAX_ROUNDS = 120


def document(report):
    """The QTextDocument of a report laid out on A4 text areas, with page breaks added
    (before a table row, a heading or a figure) until no page end cuts a table row or
    a figure, and no heading ends a page."""
    from PySide6.QtGui import QImage

    ensure_app()
    images = {name: QImage.fromData(data, "PNG") for name, data in report.images.items()}
    breaks = set()
    for _ in range(MAX_ROUNDS):
        doc = _laid_out(report.render(breaks), images)
        cut = _first_cut(doc, report, breaks)
        if cut is None:
            break
        breaks.add(cut)
    return doc


def _laid_out(text: str, images: dict):
    from PySide6.QtCore import QSizeF, QUrl
    from PySide6.QtGui import QTextDocument

    doc = QTextDocument()
    doc.setDefaultFont(report_font(9))
    for name, image in images.items():
        doc.addResource(QTextDocument.ResourceType.ImageResource, QUrl(name), image)
    doc.setHtml(text)
    left, top, right, bottom = MARGINS_MM
    doc.setDocumentMargin(0.0)
    doc.setPageSize(QSizeF(_px(PAGE_MM[0] - left - right), _px(PAGE_MM[1] - top - bottom)))
    return doc


def _first_cut(doc, report, done=frozenset()):
    """The first place (in reading order) a page end cuts: ("row", piece, row) or
    ("keep", n), or None. Places in ``done`` already start a page: nothing more to do."""
    from PySide6.QtGui import QTextCursor, QTextTable

    layout = doc.documentLayout()
    height = doc.pageSize().height()
    page = lambda y: int(y // height)
    cuts = []
    tables = [f for f in doc.rootFrame().childFrames() if isinstance(f, QTextTable)]
    for table, (piece, first) in zip(tables, report.chunks):
        frame = layout.frameBoundingRect(table)
        if page(frame.top()) == page(frame.bottom() - 0.5):
            continue                        # on one page: no row can be cut
        header = 1 if report.pieces[piece].head else 0
        for r in range(header, table.rows()):
            rects = []
            for c in range(table.columns()):
                cell = table.cellAt(r, c)
                rects.append(layout.blockBoundingRect(cell.firstCursorPosition().block()))
                rects.append(layout.blockBoundingRect(cell.lastCursorPosition().block()))
            top = min(rect.top() for rect in rects)
            bottom = max(rect.bottom() for rect in rects)
            row = first + r - header
            if page(top) != page(bottom - 0.5) and row > first \
                    and ("row", piece, row) not in done:
                cuts.append((top, ("row", piece, row)))
                break
    keep = 0
    block = doc.begin()
    while block.isValid():
        level = block.blockFormat().headingLevel()
        is_figure = "\ufffc" in block.text()
        if (level in (2, 3) or is_figure) and QTextCursor(block).currentTable() is None:
            rect = layout.blockBoundingRect(block)
            end = rect.bottom() + (KEEP_WITH_NEXT if level else -0.5)
            after = block.next()
            if level and after.isValid() and "\ufffc" in after.text():
                end = layout.blockBoundingRect(after).bottom()    # a heading goes with its figure
            if page(rect.top()) != page(end) and ("keep", keep) not in done:
                cuts.append((rect.top(), ("keep", keep)))
            keep += 1
        block = block.next()
    return min(cuts)[1] if cuts else None


def section_pages(doc, names) -> list[tuple[int, str]]:
    """(first page, name) of each top-level heading, in order (``names`` by heading)."""
    layout = doc.documentLayout()
    height = doc.pageSize().height()
    out = []
    block = doc.begin()
    while block.isValid() and len(out) < len(names):
        if block.blockFormat().headingLevel() == 1:
            top = layout.blockBoundingRect(block).top()
            out.append((int((top + 1.0) // height), names[len(out)]))
        block = block.next()
    return out


def _furniture(painter, scale, width, title, date, page_text):
    """Header (title and case, date, a rule) and footer (short caution, page) of a page.

    Drawn in the writer's own pixels, so that the font's point size is a true size."""
    from PySide6.QtCore import QRectF, Qt
    from PySide6.QtGui import QColor, QPen

    left, top, right, bottom = MARGINS_MM
    rect = lambda x, y, w, h: QRectF(x * scale, y * scale, w * scale, h * scale)
    painter.setFont(report_font(7.5))
    painter.setPen(QColor("#333333"))
    head = rect(_px(left), _px(8.0), width, _px(top - 11.0))
    metrics = painter.fontMetrics()
    room = int(head.width() - metrics.horizontalAdvance(date) - 4 * metrics.averageCharWidth())
    painter.drawText(head, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignBottom,
                     metrics.elidedText(title, Qt.TextElideMode.ElideRight, room))
    painter.drawText(head, Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignBottom, date)
    painter.setPen(QPen(QColor("#0b3d66"), 0.3 * scale))
    y = _px(top - 2.5) * scale
    painter.drawLine(int(_px(left) * scale), int(y), int((_px(left) + width) * scale), int(y))
    painter.setPen(QColor("#333333"))
    foot = rect(_px(left), _px(PAGE_MM[1] - bottom + 4.0), width, _px(6.0))
    painter.drawText(foot, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop, FOOTER_CAUTION)
    painter.drawText(foot, Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignTop, page_text)


def write_pdf(report, path, header_date: str) -> int:
    """Write the report as a PDF at ``path``; returns the number of pages."""
    from PySide6.QtCore import QMarginsF, QRectF
    from PySide6.QtGui import (QAbstractTextDocumentLayout, QPageLayout, QPageSize, QPainter,
                               QPdfWriter)

    import rating

    doc = document(report)
    pages = doc.pageCount()
    sections = section_pages(doc, report.case_names)   # its last name is "Provenance"
    writer = QPdfWriter(str(path))
    writer.setResolution(300)
    writer.setPageLayout(QPageLayout(QPageSize(QPageSize.PageSizeId.A4),
                                     QPageLayout.Orientation.Portrait, QMarginsF(0, 0, 0, 0)))
    writer.setTitle(f"{report.title}: rating report")
    writer.setCreator(f"Ebullio {rating.__version__}")
    painter = QPainter()
    if not painter.begin(writer):
        raise OSError(f"{path}: cannot be written")
    try:
        scale = writer.resolution() / LOGICAL_DPI
        left, top, right, bottom = MARGINS_MM
        width = _px(PAGE_MM[0] - left - right)
        body = doc.pageSize().height()
        for page in range(pages):
            if page:
                writer.newPage()
            case = [name for first, name in sections if first <= page][-1] if sections else ""
            _furniture(painter, scale, width, f"{report.title}  |  {case}", header_date,
                       f"Page {page + 1} of {pages}")
            painter.save()
            painter.scale(scale, scale)
            painter.translate(_px(left), _px(top) - page * body)
            clip = QRectF(0, page * body, width, body)
            painter.setClipRect(clip)
            context = QAbstractTextDocumentLayout.PaintContext()
            context.clip = clip
            doc.documentLayout().draw(painter, context)
            painter.restore()
    finally:
        painter.end()
    return pages
