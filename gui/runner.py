"""Live rating: each edit restarts a rating in a worker thread: at once for a committed
entry (Enter, Tab, a choice, undo), after a pause for keystrokes while typing.

Only the GUI thread touches widgets. A worker gets the case as plain data (a draft),
builds and rates it, and hands the result back by a queued signal. Each request has
a generation number; a result older than the inputs is dropped, never shown as
current. A new edit cancels the running rating through the engine's ``cancel``
callback; the last good result stays on screen, marked stale, until a new one
arrives.
"""
from __future__ import annotations

import threading
import traceback
from dataclasses import dataclass, field

from PySide6.QtCore import QObject, QRunnable, QThreadPool, QTimer, Signal

from rating import catalogue

from .document import draft_problems

DEBOUNCE_MS = 250

# Statuses a case shows in the case list (our words).
NOT_RATED, RATING, RATED, WARNINGS, FAILED, STALE, INVALID, CANCELLED = (
    "not rated", "rating", "rated", "warnings", "failed", "stale", "invalid input", "cancelled")


@dataclass
class CaseState:
    """What the window knows of one case's ratings."""

    status: str = NOT_RATED
    result: object = None          # the last good (not failed) result, possibly stale
    previous: object = None        # the good result before it: "what did this edit do?"
    stale: bool = False            # the inputs changed since ``result`` was made
    message: str = ""              # why the last attempt failed, in words
    failure: object = None         # the last failed result (its warnings and curves), if any
    generation: int = 0
    progress: float = 0.0
    cancel: threading.Event = field(default_factory=threading.Event)


class _Signals(QObject):
    progress = Signal(int, int, float)          # entry id, generation, fraction
    done = Signal(int, int, object, str)        # entry id, generation, result or None, error text


class _Job(QRunnable):
    def __init__(self, signals, entry_id, generation, draft, cancel):
        super().__init__()
        self.signals, self.entry_id, self.generation = signals, entry_id, generation
        self.draft, self.cancel = draft, cancel
        self._last = -1.0

    def _progress(self, fraction):
        if fraction - self._last >= 0.05 or fraction >= 1.0:   # no flood of queued signals
            self._last = fraction
            self.signals.progress.emit(self.entry_id, self.generation, float(fraction))

    def run(self):
        import rating
        from rating.errors import RatingError

        try:
            case = catalogue.draft_to_case(self.draft)
            result = rating.rate(case, progress=self._progress, cancel=self.cancel.is_set)
            self.signals.done.emit(self.entry_id, self.generation, result, "")
        except RatingError as exc:
            self.signals.done.emit(self.entry_id, self.generation, None, str(exc).splitlines()[0])
        except Exception as exc:  # a defect: say so in words, never a traceback in the window
            traceback.print_exc()
            self.signals.done.emit(self.entry_id, self.generation, None,
                                   f"the rating stopped on an internal error ({type(exc).__name__}: {exc})")


class Runner(QObject):
    """Ratings of a document's cases: debounced, cancellable, never blocking the window."""

    stateChanged = Signal(int)          # entry id: status or result changed
    progressChanged = Signal(int, float)  # entry id, fraction of the running rating
    resultArrived = Signal(int)         # entry id: a new current result (rated or failed)

    def __init__(self, document, parent=None):
        super().__init__(parent)
        self.doc = document
        self.states: dict[int, CaseState] = {}
        self._timers: dict[int, QTimer] = {}
        self.pool = QThreadPool(self)
        self.pool.setMaxThreadCount(max(2, QThreadPool.globalInstance().maxThreadCount()))
        self._signals = _Signals(self)
        self._signals.progress.connect(self._on_progress)
        self._signals.done.connect(self._on_done)
        self.live = True
        self.typing = False             # set while a keystroke's edit goes through
        document.caseChanged.connect(self._on_edit)
        document.casesChanged.connect(self._on_cases)

    def state(self, entry_id: int) -> CaseState:
        return self.states.setdefault(entry_id, CaseState())

    # --- requests -------------------------------------------------------------------------
    def _on_edit(self, entry_id: int, path: str):
        if path == "name":
            return
        st = self.state(entry_id)
        if path == "vendor" or path.startswith("vendor."):
            # a vendor's stated figures do not enter the rating: the result stands, and
            # the comparison is made afresh from it and the figures as they are now
            self.stateChanged.emit(entry_id)
            return
        self._stop(entry_id)
        st.stale = st.result is not None
        st.status = STALE if st.result is not None else NOT_RATED
        self.stateChanged.emit(entry_id)
        if self.live and not self.typing:
            self.rate(entry_id)         # a committed edit: no pause to wait for
        elif self.live:
            timer = self._timers.get(entry_id)
            if timer is None:
                timer = self._timers[entry_id] = QTimer(self)
                timer.setSingleShot(True)
                timer.timeout.connect(lambda e=entry_id: self.rate(e))
            timer.start(DEBOUNCE_MS)

    def commit(self, entry_id: int):
        """An entry was committed (Enter, Tab, focus left): rate now if the typing pause
        is still running."""
        timer = self._timers.get(entry_id)
        if timer is not None and timer.isActive():
            timer.stop()
            self.rate(entry_id)

    def _on_cases(self):
        ids = {e.id for e in self.doc.entries}
        for gone in set(self.states) - ids:
            self._stop(gone)
            del self.states[gone]

    def rate(self, entry_id: int):
        """Rate one case now (cancelling its running rating), unless its inputs have errors."""
        try:
            entry = self.doc.entry(entry_id)
        except KeyError:
            return
        st = self.state(entry_id)
        self._stop(entry_id)
        st.generation += 1
        errors = [p for p in draft_problems(entry.draft) if p.severity == "error"]
        if errors:
            st.status = INVALID
            st.stale = st.result is not None
            st.message = errors[0].message
            self.stateChanged.emit(entry_id)
            return
        st.cancel = threading.Event()
        st.status, st.progress, st.message = RATING, 0.0, ""
        self.pool.start(_Job(self._signals, entry_id, st.generation, entry.draft, st.cancel))
        self.stateChanged.emit(entry_id)

    def rate_all(self):
        for e in list(self.doc.entries):
            self.rate(e.id)

    def cancel(self, entry_id: int):
        """Stop a running rating; the last good result stays, marked stale."""
        st = self.state(entry_id)
        if st.status == RATING:
            self._stop(entry_id)
            st.generation += 1
            st.status = CANCELLED
            st.stale = st.result is not None
            self.stateChanged.emit(entry_id)

    def cancel_all(self):
        for entry_id in list(self.states):
            self.cancel(entry_id)

    def busy(self) -> bool:
        return any(s.status == RATING for s in self.states.values())

    def _stop(self, entry_id: int):
        self.state(entry_id).cancel.set()
        timer = self._timers.get(entry_id)
        if timer is not None:
            timer.stop()

    # --- answers --------------------------------------------------------------------------
    def _on_progress(self, entry_id, generation, fraction):
        st = self.states.get(entry_id)
        if st is not None and st.generation == generation and st.status == RATING:
            st.progress = fraction
            self.progressChanged.emit(entry_id, fraction)

    def _on_done(self, entry_id, generation, result, error):
        st = self.states.get(entry_id)
        if st is None or st.generation != generation:
            return                                    # superseded by a newer edit
        failed = result is None or result.status in ("failed", "cancelled")
        if result is not None and getattr(result, "status", "") == "cancelled":
            st.status, st.stale = CANCELLED, st.result is not None
        elif failed:
            st.failure = result
            st.status = FAILED
            st.stale = st.result is not None
            st.message = error or result.message
        else:
            if st.result is not None:
                st.previous = st.result
            st.result, st.stale, st.message, st.failure = result, False, "", None
            st.status = WARNINGS if result.warnings and any(
                w.severity != "info" for w in result.warnings) else RATED
        self.stateChanged.emit(entry_id)
        self.resultArrived.emit(entry_id)

    def shutdown(self, wait_ms: int = 3000):
        self.cancel_all()
        for t in self._timers.values():
            t.stop()
        self.pool.waitForDone(wait_ms)
