"""``python -m gui.screenshots OUTDIR [--size 1280x800]``: pictures of the window to look at.

Renders the main window offscreen: the start page, then every sample (its first
case rated) in each unit system, the circulation tab of the thermosiphon samples
and the side-by-side view of a sample's two cases. Writes one PNG per view. With
``--studies`` the Studies tab too: a sweep, a method spread, an operating envelope
and a fit of each sample's first case (the fit to the case's own rated duty and
heating-medium outlet temperature).
"""
from __future__ import annotations

import argparse
import os
import sys
import tempfile
import time
from pathlib import Path


def _wait(app, condition, timeout=120.0):
    end = time.monotonic() + timeout
    while not condition() and time.monotonic() < end:
        app.processEvents()
        time.sleep(0.02)
    for _ in range(5):
        app.processEvents()


def main(argv=None) -> int:
    p = argparse.ArgumentParser(prog="python -m gui.screenshots", description=__doc__.splitlines()[0])
    p.add_argument("outdir")
    p.add_argument("--size", default="1280x800", help="window size, WIDTHxHEIGHT")
    p.add_argument("--only", help="only samples whose file name contains this")
    p.add_argument("--font-scale", type=float, default=1.0,
                   help="enlarge the system font (e.g. 1.5) to check that nothing is clipped")
    p.add_argument("--studies", action="store_true",
                   help="also run and picture a sweep, a spread, an envelope and a fit")
    args = p.parse_args(argv)
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    # settings and autosaves of these pictures go to a scratch folder, not the user's
    scratch = tempfile.mkdtemp(prefix="ebullio-shots-")
    os.environ["XDG_DATA_HOME"] = scratch
    os.environ["XDG_CONFIG_HOME"] = scratch
    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication([sys.argv[0]])
    app.setOrganizationName("EbullioScreenshots")
    app.setApplicationName("EbullioScreenshots")
    if args.font_scale != 1.0:
        font = app.font()
        font.setPointSizeF(font.pointSizeF() * args.font_scale)
        app.setFont(font)
    from . import units
    from .mainwindow import MainWindow, sample_files

    out = Path(args.outdir)
    out.mkdir(parents=True, exist_ok=True)
    w, h = (int(v) for v in args.size.lower().split("x"))
    suffix = ("" if (w, h) == (1280, 800) else f"-{w}x{h}") + \
        ("" if args.font_scale == 1.0 else f"-font{args.font_scale:g}")
    written = []

    def plots_drawn():
        views = (window._along, window._balance)
        return all(v.settled() for v in views if v is not None and v.isVisible())

    def shot(window, name):
        app.processEvents()
        _wait(app, plots_drawn)            # the plots are drawn off the GUI thread
        path = out / f"{name}{suffix}.png"
        window.grab().save(str(path))
        written.append(path)

    window = MainWindow(first_start_caution=False)
    window.resize(w, h)
    window.show()
    _wait(app, lambda: True)
    shot(window, "start-page")
    for sample in sample_files():
        if args.only and args.only not in sample.name:
            continue
        window.doc.undo.setClean()
        window.open_path(sample)
        first = window.current_id
        _wait(app, lambda: window.runner.state(first).status not in ("rating", "not rated", "stale"))
        for system in units.SYSTEMS:
            window.set_system(system)
            shot(window, f"{sample.stem}-{system}")
        if window.doc.entries[0].type == "thermosiphon":
            window.tabs.setCurrentIndex(1)
            shot(window, f"{sample.stem}-circulation")
            window.tabs.setCurrentIndex(0)
        if args.studies:
            _studies(app, window, first, lambda name: shot(window, f"{sample.stem}-{name}"))
        if len(window.doc.entries) > 1:
            second = window.doc.entries[1].id
            window.runner.rate(second)
            _wait(app, lambda: window.runner.state(second).status not in ("rating", "not rated"))
            window.compare_to(str(second))
            shot(window, f"{sample.stem}-compared")
            window.tabs.setCurrentIndex(2)
            shot(window, f"{sample.stem}-side-by-side")
            window.tabs.setCurrentIndex(0)
            window.compare_to("")
    window.doc.undo.setClean()
    window.close()
    window.deleteLater()            # release the canvases before the interpreter ends
    app.processEvents()
    del window
    for path in written:
        print(path)
    return 0


def _studies(app, window, entry_id, shot) -> None:
    """Run each kind of study on the case shown, with few points, and picture the tab."""
    from . import units

    panel = window.studies
    window.tabs.setCurrentWidget(panel)
    panel.refresh()
    summary = window.runner.state(entry_id).result.summary

    def fit(p):
        for key, tol, quantity in (("duty_W", 0.03 * summary["duty_W"], "power"),
                                   ("heating_outlet_temperature_K", 0.5,
                                    "temperature_difference")):
            value = summary.get(key)
            if value is not None:
                q = "temperature" if key.endswith("_K") else "power"
                measured, tolerance = p.fit_setup.measure(key)
                measured.setText(units.entry_text(units.to_display(value, q, p.system)))
                tolerance.setText(units.entry_text(units.to_display(tol, quantity, p.system)))

    def envelope(p):
        """Down to a quarter of the case's first input, with the rated duty required: the
        limits' edges show."""
        p.env_x.count.setText("5")
        p.env_y.count.setText("4")
        start = units.parse_number(p.env_x.start.text())
        p.env_x.start.setText(units.entry_text(start * 0.25 / 0.7))
        p.required.setText(units.entry_text(
            units.to_display(summary["duty_W"], "power", p.system)))

    setups = (("sweep", lambda p: p.vary.count.setText("8")),
              ("spread", lambda p: None),
              ("envelope", envelope),
              ("fit", fit))
    for kind, setup in setups:
        panel.kind_box.setCurrentIndex(panel.kind_box.findData(kind))
        setup(panel)
        panel.run()
        _wait(app, lambda: not panel.busy(), timeout=900.0)
        shot(f"study-{kind}")
    window.tabs.setCurrentIndex(0)


if __name__ == "__main__":
    sys.exit(main())
