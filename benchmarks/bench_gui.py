"""Responsiveness of the desktop window (a measurement, not a test).

    python benchmarks/bench_gui.py [--edits 20] [--skip-startup]

1. Edit to updated plots: for one sample of each exchanger type, 20 edits of one
   field (typed into the datasheet's editor, then committed with Enter unless
   ``--typing``); the time from the edit to the moment the along-the-tube panel shows
   the new result (drawn off the GUI thread and painted), median and worst. A typed
   edit waits out the typing pause (``gui.runner.DEBOUNCE_MS``) before the rating
   starts, a committed one does not; with ``--typing`` the figures are given with and
   without the pause. Beside them, the same 20 ratings alone (``rating.rate`` in this
   process, no window), so that the window's own share is visible on a shared
   machine, and the GUI thread's time per keystroke (the form, the runner's request).
2. The longest event-loop block while this runs: a 5 ms timer in the GUI thread; the
   largest gap between its ticks, less 5 ms.
3. Start-up in a fresh process: from launch to the painted window, to the plot panels
   ready (built once matplotlib is imported in the background), and to the first
   sample rated and drawn (opened at the first paint; the property library is imported
   in the background meanwhile).

Run it on a quiet machine; the figures scale with the load of the machine.
"""
from __future__ import annotations

import argparse
import os
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

# one sample of each type, the field edited, and the two SI values it alternates between
CASES = (
    ("evaporator", "pentane-vaporiser.ebullio", "boiling.mass_flow", (4.5, 4.4)),
    ("thermosiphon", "stripper-reboiler.ebullio", "thermosiphon.liquid_level", (2.0, 1.95)),
    ("kettle", "harrow-creek-kettles.ebullio", "boiling.mass_flow", None),
)

STARTUP = r"""
import sys, time
t_launch = float(sys.argv[1])
from PySide6.QtCore import QEvent, QObject, QTimer
from PySide6.QtWidgets import QApplication
app = QApplication([])
app.setOrganizationName("EbullioBench"); app.setApplicationName("EbullioBench")
from gui.mainwindow import MainWindow
w = MainWindow(first_start_caution=False)
w.resize(1280, 800)

class FirstPaint(QObject):
    def eventFilter(self, obj, event):
        if event.type() == QEvent.Paint and not hasattr(self, "done"):
            self.done = True
            print("painted", time.time() - t_launch, flush=True)
            QTimer.singleShot(0, opened)
        return False
first = FirstPaint()
w.start.installEventFilter(first)
w.show()                    # starts the imports in the background, as gui.app.main does

def opened():
    # as `ebullio FILE` does: the file opens once the background imports are done
    w.runner.resultArrived.connect(lambda _id: shown())
    w.open_when_ready(sys.argv[2])

def shown():
    if w._along is None:    # the plots are made when matplotlib is in
        QTimer.singleShot(20, shown)
        return
    print("plots", plots_at, flush=True)
    w.along.drawn.connect(lambda: (print("rated", time.time() - t_launch, flush=True), app.quit()))

plots_at = None
def watch():
    global plots_at
    if w._along is not None and plots_at is None:
        plots_at = time.time() - t_launch
    else:
        QTimer.singleShot(10, watch)
QTimer.singleShot(0, watch)
app.exec()
"""


def startup(sample: Path) -> tuple[float, float, float]:
    env = dict(os.environ, PYTHONPATH=str(ROOT), QT_QPA_PLATFORM=os.environ.get("QT_QPA_PLATFORM", "offscreen"))
    env["XDG_DATA_HOME"] = env["XDG_CONFIG_HOME"] = str(Path(os.environ.get("TMPDIR", "/tmp")) / "ebullio-bench")
    t0 = time.time()
    out = subprocess.run([sys.executable, "-c", STARTUP, repr(t0), str(sample)], env=env,
                         capture_output=True, text=True, timeout=600).stdout
    got = dict(line.split() for line in out.splitlines()
               if line.split()[:1] in (["painted"], ["plots"], ["rated"]))
    return float(got["painted"]), float(got["plots"]), float(got["rated"])


def ratings_alone(draft, path, values, n):
    """The same ratings as the edits, in this thread with no window: the engine's share."""
    import rating
    from rating import catalogue

    times = []
    for i in range(n):
        case = catalogue.draft_to_case(catalogue.set_value(draft, path, values[(i + 1) % 2]))
        t0 = time.perf_counter()
        rating.rate(case)
        times.append(time.perf_counter() - t0)
    return times


def edits(n: int, commit: bool = True):
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    from PySide6.QtCore import QElapsedTimer, QTimer
    from PySide6.QtWidgets import QApplication

    app = QApplication.instance() or QApplication([])
    app.setOrganizationName("EbullioBench")
    app.setApplicationName("EbullioBench")
    from gui import forms, runner
    from gui.mainwindow import MainWindow
    from rating import catalogue

    w = MainWindow(first_start_caution=False)
    w.set_system("SI")
    w.resize(1280, 800)
    w.show()
    clock = QElapsedTimer()
    clock.start()
    gaps = {"worst": 0.0, "last": 0, "ticks": 0, "over": 0}

    def tick():
        now = clock.elapsed()
        gap = now - gaps["last"] - 5
        gaps["worst"] = max(gaps["worst"], gap)
        gaps["ticks"] += 1
        gaps["over"] += gap > 50
        gaps["last"] = now
    beat = QTimer()
    beat.setInterval(5)
    beat.timeout.connect(tick)
    drawn = {"t": None}
    spent = {"rate": 0.0}               # the runner's request on the GUI thread
    real_rate = w.runner.rate

    def timed_rate(entry_id):
        t = time.perf_counter()
        real_rate(entry_id)
        spent["rate"] += time.perf_counter() - t
    w.runner.rate = timed_rate
    for t in w.runner._timers.values():
        t.timeout.disconnect()
    w.runner._timers.clear()            # made anew, calling the timed request
    w.along.drawn.connect(lambda: drawn.__setitem__("t", time.perf_counter()))

    def wait(cond, timeout=120):
        end = time.perf_counter() + timeout
        while not cond() and time.perf_counter() < end:
            app.processEvents()
            time.sleep(0.001)
        return cond()

    # the machine's own share: the longest gap with the window idle, for as long as the edits take
    w.open_path(ROOT / "samples" / CASES[0][1])
    wait(lambda: not w.runner.busy() and w.along.settled())
    gaps["worst"], gaps["last"] = 0.0, clock.elapsed()
    beat.start()
    wait(lambda: False, timeout=8.0)
    beat.stop()
    idle = gaps["worst"]
    rows = []
    for kind, name, path, values in CASES:
        w.doc.undo.setClean()
        w.open_path(ROOT / "samples" / name)
        eid = w.current_id
        wait(lambda: w.runner.state(eid).result is not None and not w.runner.busy())
        form = w.current_form()
        editor = form.editor(path)
        field = catalogue.input_field(path)
        if values is None:
            v0 = catalogue.get_value(w.doc.entry(eid).draft, path)
            values = (v0, v0 * 0.98)
        times, keystroke = [], []
        gaps.update(worst=0.0, last=clock.elapsed(), ticks=0, over=0)
        beat.start()
        for i in range(n):
            value = values[(i + 1) % 2]
            text = forms.format_input(value, field, "SI")
            drawn["t"] = None
            spent["rate"] = 0.0
            t0 = time.perf_counter()
            editor.setText(text)
            editor.textEdited.emit(text)
            typed = time.perf_counter() - t0
            if commit:
                editor.editingFinished.emit()
            ok = wait(lambda: drawn["t"] is not None and w.runner.state(eid).status != "rating"
                      and not w.runner.state(eid).stale and w.along.settled())
            if not ok:
                print(f"  {kind}: edit {i} gave no new plot ({w.runner.state(eid).status})")
                continue
            times.append(drawn["t"] - t0)
            keystroke.append(typed + spent["rate"])
        beat.stop()
        debounce = runner.DEBOUNCE_MS / 1000
        alone = ratings_alone(w.doc.entry(eid).draft, path, values, n)
        rows.append((kind, name, statistics.median(times), max(times), debounce, gaps["worst"], len(times),
                     statistics.median(alone), max(alone), gaps["over"], gaps["ticks"],
                     statistics.median(keystroke)))
    w.doc.undo.setClean()
    w.close()
    return rows, idle


def main(argv=None) -> int:
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--edits", type=int, default=20)
    p.add_argument("--skip-startup", action="store_true")
    p.add_argument("--startup-only", action="store_true")
    p.add_argument("--typing", action="store_true",
                   help="keystrokes only, no Enter: the rating waits for the typing pause")
    args = p.parse_args(argv)
    load = os.getloadavg()[0] if hasattr(os, "getloadavg") else float("nan")
    t = time.perf_counter()
    sum(i * i for i in range(3_000_000))
    print(f"machine load (1 min): {load:.1f} on {os.cpu_count()} cores; reference loop "
          f"{time.perf_counter() - t:.2f} s (about 0.15 s on one quiet core of a current PC, "
          "from memory: divide the figures below by the ratio for a quiet machine)")
    if not args.skip_startup:
        painted, plots, rated = startup(ROOT / "samples" / "pentane-vaporiser.ebullio")
        print(f"start-up, fresh process: painted window {painted:.2f} s; plots ready {plots:.2f} s; "
              f"first sample rated and drawn {rated:.2f} s")
    if args.startup_only:
        return 0
    print(f"{'typed' if args.typing else 'committed (Enter)'} edit -> updated plots, "
          f"{args.edits} edits each" + (" (typing pause included / excluded)" if args.typing else "")
          + ", longest event-loop block, GUI-thread time per keystroke")
    rows, idle = edits(args.edits, commit=not args.typing)
    print(f"  longest event-loop gap with the window idle for 8 s (the machine's share): {idle:.0f} ms")
    for kind, name, med, worst, debounce, block, n, r_med, r_worst, over, ticks, key in rows:
        if args.typing:
            shown = (f"median {med * 1000:6.0f} ms / {(med - debounce) * 1000:6.0f} ms; "
                     f"worst {worst * 1000:6.0f} ms / {(worst - debounce) * 1000:6.0f} ms; ")
        else:
            shown = f"median {med * 1000:6.0f} ms; worst {worst * 1000:6.0f} ms; "
        print(f"  {kind:<12} {name:<30} {shown}"
              f"GUI thread per keystroke {key * 1000:5.1f} ms; "
              f"longest block {block:5.0f} ms, {over} of {ticks} ticks late by over 50 ms ({n} edits); "
              f"the rating alone: median {r_med * 1000:4.0f} ms, worst {r_worst * 1000:4.0f} ms")
    return 0


if __name__ == "__main__":
    sys.exit(main())
