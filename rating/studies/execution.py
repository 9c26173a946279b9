"""Rating many cases through any ``concurrent.futures.Executor``.

Every study (sweep, method spread, envelope, fit) hands its cases to ``rate_points``.
The caller may pass an executor: a ``ProcessPoolExecutor``, a thread pool, the
``InlineExecutor`` below (one after the other, in this process), or a Dask
distributed client's ``client.get_executor()``; with none, a process pool on all
cores is made for the run and shut down after it. Results come back in input
order whatever order the workers finish in; a point that cannot be built, fails
or raises keeps its place with its reason. Only a window of points (a few per worker)
is submitted at a time, so a cancel stops every point but those few.
"""
from __future__ import annotations

import concurrent.futures as cf
import contextlib
import dataclasses
import multiprocessing
import os
import threading
from dataclasses import dataclass

from ..errors import InputError
from ..results import Result, failed

#: Status of a point that was never rated: its inputs were refused, or the run
#: was cancelled before its turn.
REFUSED, CANCELLED = "refused", "cancelled"


@dataclass(frozen=True)
class Point:
    """One rated (or refused, or cancelled) point of a study.

    ``inputs`` maps what was set (a field path, or "method") to its value;
    ``status`` is the rating's ("ok", "warnings", "failed") or "refused" /
    "cancelled"; ``message`` says why when it is not rated. A sweep's and an envelope's
    points keep their results without profiles (10,000 points: their summaries only).
    """

    inputs: dict
    status: str
    message: str
    result: Result | None = None
    index: int = 0

    @property
    def rated(self) -> bool:
        return self.status in ("ok", "warnings")

    def value(self, key: str):
        """A summary value, or None when it was not computed."""
        if self.result is None:
            return None
        return self.result.summary.get(key)

    def warning_codes(self) -> set[str]:
        return set() if self.result is None else {w.code for w in self.result.warnings}

    def to_dict(self, keys=None) -> dict:
        # The summary as it is (a Result holds None for a figure not computed, never NaN);
        # the profiles are not serialised just to read it.
        summary = {} if self.result is None else self.result.summary
        summary = dict(summary) if keys is None else {k: summary.get(k) for k in keys}
        return {"inputs": dict(self.inputs), "status": self.status, "message": self.message,
                "summary": summary,
                "warnings": [] if self.result is None
                else [w.to_dict() for w in self.result.warnings]}


@dataclass(frozen=True)
class Job:
    """A point to rate: what was set, and the case built from it (or why it was refused)."""

    inputs: dict
    case: object = None
    refused: str = ""
    #: the point's status when there is no case: "refused" (the inputs broke a rule) or
    #: "failed" (building the case raised something else: a fault in Ebullio, not the user's)
    status: str = REFUSED

    @classmethod
    def build(cls, inputs: dict, make):
        """The job for ``make()``; an input error becomes the point's reason, any other
        exception a failed point that says it is a fault (never a refusal of the input)."""
        try:
            return cls(inputs, make())
        except InputError as exc:
            return cls(inputs, None, _first_line(exc))
        except Exception as exc:  # noqa: BLE001 - one point's fault must not end the study
            return cls(inputs, None, f"a fault in Ebullio, not in the input: "
                       f"{type(exc).__name__}: {_first_line(exc)}", "failed")


def _first_line(exc) -> str:
    text = str(exc.args[0]) if isinstance(exc, KeyError) and exc.args else str(exc)
    return text.splitlines()[0] if text else type(exc).__name__


def rate_one(case, increments=None, profiles: bool = True) -> Result:
    """Rate one case in a worker; whatever goes wrong becomes the result's reason.
    Without ``profiles`` the result is sent back without them (a study point's summary
    is what is kept)."""
    from .. import rate

    try:
        result = rate(case, increments=increments)
    except Exception as exc:  # noqa: BLE001 - one point's failure must not end the study
        result = failed(case, f"{type(exc).__name__}: {_first_line(exc)}")
    return result if profiles else dataclasses.replace(result, profiles={})


class InlineExecutor(cf.Executor):
    """Runs each call at submission, in the calling thread: serial runs and tests."""

    def submit(self, fn, /, *args, **kwargs):
        future = cf.Future()
        try:
            future.set_result(fn(*args, **kwargs))
        except BaseException as exc:  # noqa: BLE001 - handed to the future like any pool
            future.set_exception(exc)
        return future


def _preload() -> None:
    """Load the engine and the property library before forking, so that workers share it."""
    from .. import exchangers, properties  # noqa: F401
    from ..correlations import registry  # noqa: F401
    import CoolProp.CoolProp  # noqa: F401


def default_executor(workers: int | None = None) -> cf.Executor:
    """A process pool on ``workers`` cores (all by default).

    Workers fork from this process when it runs no other thread (the children
    inherit the loaded property library: no start-up cost); a process with threads
    (a GUI) gets a fork server instead, which loads the engine once itself.
    """
    workers = workers or os.cpu_count() or 1
    methods = multiprocessing.get_all_start_methods()
    if "fork" in methods and threading.active_count() == 1:
        _preload()
        context = multiprocessing.get_context("fork")
    elif "forkserver" in methods:
        context = multiprocessing.get_context("forkserver")
        context.set_forkserver_preload(["rating.studies.execution", "rating.exchangers",
                                        "rating.properties", "CoolProp.CoolProp"])
    else:
        context = multiprocessing.get_context("spawn")
    return cf.ProcessPoolExecutor(max_workers=workers, mp_context=context)


@contextlib.contextmanager
def executor_scope(executor: cf.Executor | None):
    """The caller's executor, or a default pool made here and shut down after."""
    if executor is not None:
        yield executor
        return
    own = default_executor()
    try:
        yield own
    finally:
        own.shutdown(wait=True, cancel_futures=True)


#: Points kept submitted but unfinished per worker: one running and one waiting, so a
#: worker never idles between points, and a cancel leaves at most this many per worker
#: to finish (a process pool cannot take back a point it has already handed on).
PER_WORKER = 2
#: The window when the executor does not say how many workers it has.
UNKNOWN_WORKERS_WINDOW = 32


def window_of(executor) -> int:
    """How many points ``rate_points`` keeps submitted but unfinished on ``executor``.

    ``PER_WORKER`` per worker: a ``concurrent.futures`` pool's ``max_workers``; a Dask
    client's executor (``client.get_executor()``) counts the cluster's threads when the
    points start; an executor that says neither gets ``UNKNOWN_WORKERS_WINDOW``.
    """
    workers = getattr(executor, "_max_workers", None)
    client = getattr(executor, "_client", None)
    if workers is None and client is not None:
        try:
            workers = sum(client.nthreads().values())
        except Exception:  # noqa: BLE001 - a client that cannot say: the default window
            workers = None
    if not workers:
        return UNKNOWN_WORKERS_WINDOW
    return PER_WORKER * int(workers)


def rate_points(jobs, *, executor: cf.Executor | None = None, increments=None,
                progress=None, cancel=None, profiles: bool = True,
                window: int | None = None) -> list[Point]:
    """Rate every job's case; one ``Point`` per job, in the jobs' order.

    ``progress(done, total)`` is called in this thread as points finish;
    ``cancel()`` is polled while waiting. At most ``window`` points (``window_of`` the
    executor by default) are submitted and unfinished at a time, so when ``cancel()``
    returns True no more are submitted, those not yet started are cancelled, and at
    most ``window`` more are rated (points already running are waited for: a worker
    process cannot be interrupted safely); the rest come back "cancelled". Without
    ``profiles`` the results keep no profiles (a sweep's points need only their
    summaries: memory).
    """
    jobs = list(jobs)
    total = len(jobs)
    points: list[Point | None] = [None] * total
    done = 0

    def report():
        if progress is not None:
            progress(done, total)

    for i, job in enumerate(jobs):
        if job.case is None:
            points[i] = Point(job.inputs, job.status, job.refused, None, i)
            done += 1
    report()
    todo = iter([i for i, p in enumerate(points) if p is None])
    if any(p is None for p in points):
        with executor_scope(executor) as pool:
            size = max(1, window or window_of(pool))
            pending: dict[cf.Future, int] = {}
            stopped = False

            def collect(finished):
                nonlocal done
                for f in finished:
                    i = pending.pop(f)
                    points[i] = _point(jobs[i], f, i)
                    done += 1
                if finished:
                    report()

            def fill():
                """Submit points until the window is full; False once cancelled."""
                nonlocal done
                while len(pending) < size:
                    if cancel is not None and cancel():
                        return False
                    i = next(todo, None)
                    if i is None:
                        return True
                    try:
                        future = pool.submit(rate_one, jobs[i].case, increments, profiles)
                    except Exception as exc:  # noqa: BLE001 - a broken pool or a lost cluster
                        points[i] = Point(jobs[i].inputs, "failed",
                                          f"not sent to a worker: {type(exc).__name__}: "
                                          f"{_first_line(exc)}", None, i)
                        done += 1
                        continue
                    pending[future] = i
                    if future.done():          # an executor that runs at submission
                        collect([future])
                return True

            stopped = not fill()
            while pending:
                if not stopped and cancel is not None and cancel():
                    stopped = True
                if stopped:
                    for f in pending:
                        f.cancel()
                finished, _ = cf.wait(list(pending), timeout=0.2,
                                      return_when=cf.FIRST_COMPLETED)
                collect(finished)
                if not stopped:
                    stopped = not fill()
    for i, p in enumerate(points):
        if p is None:
            points[i] = Point(jobs[i].inputs, CANCELLED, "cancelled before it was rated",
                              None, i)
    return points


def _point(job: Job, future: cf.Future, index: int) -> Point:
    if future.cancelled():
        return Point(job.inputs, CANCELLED, "cancelled before it was rated", None, index)
    exc = future.exception()
    if exc is not None:  # the worker itself broke (a lost process, a lost cluster worker)
        return Point(job.inputs, "failed", f"{type(exc).__name__}: {_first_line(exc)}",
                     None, index)
    result = future.result()
    message = "" if result.status != "failed" else result.message
    return Point(job.inputs, result.status, message, result, index)


__all__ = ["CANCELLED", "PER_WORKER", "REFUSED", "InlineExecutor", "Job", "Point",
           "default_executor", "executor_scope", "rate_one", "rate_points", "window_of"]
