"""The report's and the vendor figures' commands in the desktop's Report menu.

The main window calls ``add_to_window(window)`` when it builds its menus. The
commands use only what the window shows: its document (``doc``: the cases as
drafts, the project's path), the runner's last results (``runner.state(id)``), the
current case (``current_id``) and the unit system (``system``). A vendor's figures
are edited in the case's own form (the catalogue's "vendor" group, shown once the
case has them); the comparison opens in a window of its own.
"""
from __future__ import annotations

from pathlib import Path

from rating import catalogue
from rating.vendor import compare, describe, deviation_text, tolerance_text


#: Colours of the flagged verdicts (the report's: dark orange and dark blue).
VERDICT_COLOURS = {"optimistic": "#a03800", "conservative": "#005a8c"}


def add_to_window(window) -> None:
    menu = window.report_menu
    menu.addAction("Write a report of this &case…", lambda: write_from_window(window, False))
    menu.addAction("Write a report of &every case…", lambda: write_from_window(window, True))
    menu.addAction("Write a report of this case with a method &spread…",
                   lambda: write_with_spread(window))
    menu.addSeparator()
    menu.addAction("Add &vendor figures to this case", lambda: add_vendor_figures(window))
    menu.addAction("Vendor figures against the &rating…", lambda: show_comparison(window))


def _entry(window):
    entry_id = getattr(window, "current_id", None)
    return None if entry_id is None else window.doc.entry(entry_id)


def add_vendor_figures(window) -> None:
    """Give the current case an empty proposal, so that its form shows the vendor group."""
    entry = _entry(window)
    if entry is not None and not isinstance(entry.draft.get("vendor"), dict):
        window.doc.set_value(entry.id, "vendor", {"source": "Vendor proposal"})


def _case_and_result(window, entry):
    """The validated case and its current (not stale) result, rating it now if needed."""
    import rating

    case = catalogue.draft_to_case(entry.draft)
    state = window.runner.state(entry.id)
    result = state.result if state.result is not None and not state.stale else None
    return case, result or rating.rate(case)


def write_with_spread(window) -> Path | None:
    """The current case's report with the spread between the methods of a family chosen
    from those its type has."""
    from PySide6.QtWidgets import QInputDialog

    from rating.errors import InputError

    entry = _entry(window)
    if entry is None:
        return None
    try:
        case = catalogue.draft_to_case(entry.draft)
    except (InputError, KeyError, ValueError, TypeError):
        return write_from_window(window, False)       # says why the case cannot be rated
    from rating.studies.spread import families_of

    families = families_of(case.type)
    labels = [label for _, label in families]
    label, ok = QInputDialog.getItem(window, "Method spread",
                                     "Rate the case once with every method of:", labels, 0,
                                     False)
    if not ok or label not in labels:
        return None
    return write_from_window(window, False, spread=families[labels.index(label)][0])


def write_from_window(window, every: bool, spread=None) -> Path | None:
    from PySide6.QtCore import Qt
    from PySide6.QtWidgets import QApplication, QFileDialog, QMessageBox

    from rating.errors import InputError

    from .writer import foreign_files, profile_csv_paths, write_report

    entries = list(window.doc.entries) if every else [e for e in [_entry(window)] if e]
    if not entries:
        return None
    folder = window.doc.path.parent if window.doc.path else Path.home()
    stem = window.doc.path.stem if window.doc.path and every else entries[0].name
    path, _ = QFileDialog.getSaveFileName(window, "Write a rating report",
                                          str(folder / f"{stem}.pdf"),
                                          "PDF document (*.pdf);;HTML page (*.html)")
    if not path:
        return None
    QApplication.setOverrideCursor(Qt.CursorShape.WaitCursor)
    try:
        pairs = [_case_and_result(window, e) for e in entries]
        project = window.doc.to_project()
        # The file's hash names the inputs only when the window shows what is saved.
        source = window.doc.path if window.doc.path and not window.doc.dirty else None
        results = [r for _, r in pairs]
        # The file dialog asked about the report; the profile tables beside it that would
        # replace files a report did not write are named here, and nothing is written
        # unless the engineer agrees.
        others = foreign_files(profile_csv_paths(path, results))
        if others:
            QApplication.restoreOverrideCursor()
            try:
                if not _agree_to_replace(window, others):
                    return None
            finally:
                QApplication.setOverrideCursor(Qt.CursorShape.WaitCursor)
        write_report(project, [c for c, _ in pairs], path, window.system, source,
                     results=results, spread=spread, replace=others)
    except (InputError, OSError, ValueError) as exc:
        show = getattr(window, "show_error", None)   # the window's own way to say it
        if show is not None:
            show("Report not written", str(exc))
        else:
            QMessageBox.warning(window, "Report not written", str(exc))
        return None
    finally:
        QApplication.restoreOverrideCursor()
    return Path(path)


def _agree_to_replace(window, paths) -> bool:
    """Ask before the report's profile tables replace files it did not write."""
    from html import escape

    from PySide6.QtWidgets import QMessageBox

    names = "<br>".join(escape(p.name) for p in paths)   # one a line, never broken
    answer = QMessageBox.question(
        window, "Replace files?",
        "<p>The report writes its profile tables beside it. These files were not written "
        f"by a report and would be replaced:</p><p style='white-space:pre'>{names}</p>"
        f"<p>in {escape(str(paths[0].parent))}</p><p>Replace them?</p>",
        QMessageBox.StandardButton.Yes | QMessageBox.StandardButton.No,
        QMessageBox.StandardButton.No)
    return answer == QMessageBox.StandardButton.Yes


def comparison_rows(comparison, system: str) -> list[tuple[str, ...]]:
    """(figure, vendor, Ebullio, deviation, tolerance, verdict, note) in the window's units."""
    from gui.units import format_value

    rows = []
    for r in comparison.rows:
        quantity = catalogue.input_field(f"vendor.{r.figure}").quantity
        shown = [format_value(v, quantity, system).removesuffix(" –") for v in (r.vendor, r.ebullio)]
        rows.append((catalogue.vendor_label(r.figure), *shown, deviation_text(r),
                     tolerance_text(r), r.verdict, r.note))
    return rows


def show_comparison(window):
    """A window with the current case's vendor figures beside the rating."""
    from PySide6.QtCore import Qt
    from PySide6.QtGui import QColor
    from PySide6.QtWidgets import (QDialog, QDialogButtonBox, QLabel, QTableWidget,
                                   QTableWidgetItem, QVBoxLayout)

    entry = _entry(window)
    if entry is None:
        return None
    dialog = QDialog(window)
    dialog.setWindowTitle(f"Vendor figures against the rating: {entry.name}")
    lay = QVBoxLayout(dialog)
    try:
        case, result = _case_and_result(window, entry)
        comparison = compare(case, result)
    except Exception as exc:  # noqa: BLE001 - an invalid draft: say so in the window
        comparison, message = None, f"The case cannot be rated as it stands: {exc}"
    else:
        message = (describe(comparison) if comparison is not None else
                   "This case has no vendor figures (Report > Add vendor figures to this case).")
    verdict = QLabel(message)
    verdict.setWordWrap(True)
    lay.addWidget(verdict)
    if comparison is not None:
        heads = ("Figure", "Vendor", "Ebullio", "Deviation", "Tolerance", "Verdict")
        rows = comparison_rows(comparison, window.system)
        table = QTableWidget(len(rows), len(heads), dialog)
        table.setHorizontalHeaderLabels(heads)
        table.verticalHeader().setVisible(False)
        for i, (*cells, note) in enumerate(rows):
            for j, text in enumerate(cells):
                item = QTableWidgetItem(text)
                if j in (1, 2, 3, 4):
                    item.setTextAlignment(Qt.AlignmentFlag.AlignRight
                                          | Qt.AlignmentFlag.AlignVCenter)
                if note:
                    item.setToolTip(note)     # why Ebullio's value is what it is
                if j == 5 and text in VERDICT_COLOURS:
                    item.setForeground(QColor(VERDICT_COLOURS[text]))
                table.setItem(i, j, item)
        table.resizeColumnsToContents()
        table.horizontalHeader().setStretchLastSection(True)
        lay.addWidget(table)
        notes = [f"{label}: {note}" for label, *_, note in rows if note]
        if notes:
            why = QLabel("\n".join(notes))
            why.setWordWrap(True)
            lay.addWidget(why)
    buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Close, dialog)
    buttons.rejected.connect(dialog.reject)
    lay.addWidget(buttons)
    dialog.resize(860, 520)
    dialog.show()
    return dialog
