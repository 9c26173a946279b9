"""The march along a tube-side path: one increment loop (``Stepper``) and its paths.

Every tube-side path is marched by the same loop, ``Stepper.increments``: stable
increments, the explicit midpoint step, events located so that an increment ends
just past them (secant steps on its length), the local heat flux by ``flux_root``.
Two paths plug into it:

* ``rating.boiling_march.Marcher``: boiling inside the tubes, the heating medium
  outside (evaporator, thermosiphon);
* ``rating.pool_march.PoolMarcher``: the heating medium inside the tubes, condensing
  or sensible, pass after pass, against a boiling pool outside (kettle).

The exchanger modules set a path up and solve their own outer problem (shooting,
loop balance, steam trap, area for duty).

Nothing here raises for a physical reason: a step that cannot be solved ends the
march with a status and a message (``MarchOutcome``).
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Callable

from .roots import brentq

REGIMES = ("subcooled liquid", "subcooled boiling", "saturated boiling",
           "post-dryout", "superheated vapour")

#: Regimes with a wetted wall, where a flux-to-critical-flux ratio means something.
WETTED_REGIMES = REGIMES[:3]

class Cancelled(Exception):
    """Raised inside the march when the caller's cancel flag is set."""


@dataclass(frozen=True, slots=True)
class Station:
    """Local values at one station along the heated length (SI)."""

    z: float
    P: float
    h: float
    T_sat: float
    T_process: float
    T_heating: float
    T_wall_inner: float
    T_wall_outer: float
    x: float
    void_fraction: float
    q: float               # heat flux at the inner (boiling) surface [W/m^2]
    q_outer: float         # heat flux at the outer surface [W/m^2]
    htc_boiling: float
    htc_nucleate: float
    htc_convective: float
    htc_heating: float
    u_service: float       # local U on the outer area, fouled [W/m^2/K]
    u_clean: float         # local U on the outer area, no fouling [W/m^2/K]
    q_chf: float
    chf_ratio: float
    regime: str
    flow_pattern: str
    wall_superheat: float
    duty: float            # cumulative duty from z = 0 [W]
    dpdz_friction: float


@dataclass
class MarchOutcome:
    stations: list[Station]
    status: str = "ok"            # "ok" or "failed"
    message: str = ""
    dryout_z: float | None = None
    range_notes: dict = field(default_factory=dict)   # message -> first z
    method_notes: dict = field(default_factory=dict)  # a method used in place of another -> z
    start_heating_state: object = None
    end_heating_state: object = None
    dryout_cause: str | None = None        # "critical heat flux", "critical quality" or
    #                                        "complete evaporation" (quality reaching 1)
    dryout_trigger_ratio: float = 0.0      # q/q_chf of the wetted wall where dryout began
    pressure_exhausted: bool = False       # failed because friction and acceleration used up P


class HeatingSide:
    """Interface of a heating medium seen from the tube wall.

    ``state`` is the heating medium's own variable (specific enthalpy for a
    liquid, None for condensing steam).
    """

    def temperature(self, state) -> float:
        raise NotImplementedError

    def film(self, state, T_h: float, z: float) -> Callable[[float], float]:
        """Return a function q_outer -> temperature drop across the heating film [K]."""
        raise NotImplementedError

    def film_htc(self, state, T_h: float, z: float, q_outer: float) -> float:
        raise NotImplementedError

    def advance(self, state, duty: float):
        """Heating-medium state after giving ``duty`` [W] to the boiling side over +dz."""
        raise NotImplementedError

    def capacity_rate(self, state) -> float:
        """Heat capacity rate m cp [W/K] of the medium; infinite when it condenses."""
        return math.inf

    def out_of_range(self, state, T_h: float, z: float, q_outer: float) -> list[tuple[str, str]]:
        """(bound, message) for each validity bound the heating-side method passes here."""
        return []


#: The local flux is converged when the secant's next step is below this share of it.
FLUX_RTOL = 1e-7


def flux_root(resid, q_hi, drive, guess, slope=None):
    """The local flux: root of a series-resistance balance on [0, q_hi].

    resid(0) > 0 and resid falls with q; ``drive`` is the whole temperature
    difference, resid(q) = drive - (the drops across the resistances at q). From
    ``guess`` (the flux of the last local solution: neighbouring states differ by a
    few per cent), a first step holds the total resistance at its value there, then
    secant steps follow (the residual is smooth in q: about three evaluations where a
    bracketed root took eight). With ``slope``, the last solution's dresid/dq, the
    first step is Newton's with it instead (neighbouring stations' slopes differ
    little). Every evaluation narrows a bracket [lo, hi] that holds the root; a step
    that would leave it bisects, so the root is never lost. Returns the flux (q_hi
    when resid(q_hi) > 0: the film resistances are negligible) and the slope of the
    last secant (None if there was none).
    """
    lo, hi, hi_known = 0.0, q_hi, False
    q = guess
    if not 0.0 < q < q_hi:
        q = 0.5 * q_hi
    r = resid(q)
    drop = drive - r
    q_new = q * drive / drop if drop > 0.0 else 0.5 * q_hi
    if slope is not None and slope < 0.0:
        newton = q - r / slope
        if 0.5 * q < newton < 2.0 * q:
            q_new = newton
    secant = None
    for _ in range(200):
        if r > 0.0:
            lo = q
            if q >= q_hi:
                return q_hi, secant
        elif r < 0.0:
            hi, hi_known = q, True
        else:
            return q, secant
        if q_new >= hi:
            q_new = 0.5 * (lo + hi) if hi_known else hi
        elif q_new <= lo:
            q_new = 0.5 * (lo + hi)
        q_old, r_old = q, r
        q, r = q_new, resid(q_new)
        if r == r_old:
            return q, secant
        secant = (r - r_old) / (q - q_old)
        q_new = q - r / secant
        tol = FLUX_RTOL * q
        if abs(q_new - q) <= tol or (hi_known and hi - lo <= tol):
            return q, secant
    raise RuntimeError(f"the local heat flux did not converge (last {q:.6g} W/m^2)")


#: Largest number of transfer units an increment may carry on either side, and the
#: smallest increment, as a share of the nominal one. An explicit step that carries
#: more than about one transfer unit overshoots (the fluid would pass the heating
#: temperature); short increments keep single-phase zones with a large NTU stable.
NTU_PER_STEP = 0.4
SMALLEST_STEP = 1.0 / 128.0
#: Largest change of a two-phase quality (boiling, or condensing steam) in one
#: increment: an explicit step that goes further takes its midpoint too far.
QUALITY_PER_STEP = 0.25
#: An increment that ends on an event ends within this share of it past the event.
EVENT_XTOL = 2e-7
#: An event on a quality (saturation, dry vapour, complete condensation) is landed this
#: far past it, so that the next station is on its far side.
PAST_EVENT = 1e-9


class Stepper:
    """The one increment loop of every tube-side path (``increments``).

    A path (a subclass) says what its state is and supplies the physics of one
    increment; the loop is the same for all: the nominal increment shortened to the
    stable one (``stable_step``), an explicit midpoint step (``step``), the first
    event inside it (``event``) located so that the increment ends just past it
    (``_locate``), then the path moves to the end (``arrive``, which adds the
    station or stations). ``state`` is the path's state at a station, ``local`` its
    solved local values there, ``end`` what ``step`` returns. Event functions are
    < 0 before the event and >= 0 where it has happened.
    """

    progress = None
    cancel = None

    def stable_step(self, z, state, local, dz) -> float:
        raise NotImplementedError

    def step(self, z, dz, state, local):
        raise NotImplementedError

    def event(self, z, step, state, local, end):
        """(event or None, the end's local values or None, the event function at the end)."""
        raise NotImplementedError

    def event_at_start(self, event, state, local) -> float:
        raise NotImplementedError

    def event_trial(self, event, z, length, state, trial):
        """(event function, local values or None) at the end of a trial increment."""
        raise NotImplementedError

    def arrive(self, z, state, end, end_local, event, stations):
        """Move to the end of an increment, add its station(s): (state, local, stop)."""
        raise NotImplementedError

    def increments(self, z, z_end, dz, state, local, stations, total):
        """March from z to z_end in increments of at most dz; ``total`` is the whole
        path's length (progress). Returns (z, state, local, stopped by an event);
        ``self.z`` is the last station's z (for the messages of a failure)."""
        self.z = z
        while z < z_end - 1e-12 * total:
            if self.cancel is not None and self.cancel():
                raise Cancelled()
            step = min(dz, z_end - z, self.stable_step(z, state, local, dz))
            end = self.step(z, step, state, local)
            event, end_local, f_end = self.event(z, step, state, local, end)
            if event is not None:
                step, end, end_local = self._locate(event, z, step, state, local, end,
                                                    end_local, f_end)
            z = z_end if z_end - (z + step) < 1e-12 * total else z + step
            self.z = z
            state, local, stop = self.arrive(z, state, end, end_local, event, stations)
            if stop:
                return z, state, local, True
            if self.progress is not None:
                self.progress(min(z / total, 1.0))
        return z, state, local, False

    def _locate(self, event, z, step, state, local, end, end_local, f_end):
        """Shorten the increment so that it ends on the event, just past it.

        Secant steps on the increment's length, from the event function's values at
        both ends of the increment already computed (nothing is evaluated twice); each
        trial length is one midpoint step. The bracket [lo, hi] keeps the event's side
        at hi, a trial outside it bisects, and the increment ends at hi once the
        bracket is narrower than ``EVENT_XTOL`` of the increment.
        """
        if f_end <= 0.0:   # the event sits at the very end of the increment
            return step, end, end_local
        tol = 0.5 * EVENT_XTOL * step
        lo, f_lo = 0.0, self.event_at_start(event, state, local)
        hi, f_hi, hi_end, hi_local = step, f_end, end, end_local
        if f_lo >= 0.0:    # already there at the start (within the root tolerances)
            lo, f_lo = 0.0, -abs(f_end) * 1e-12
        # secant through the last two trials (the bracket's ends at first), kept inside
        # the bracket and at least tol from its ends, so that a trial on the root's
        # near side is followed by one just past it
        a, f_a, b, f_b = lo, f_lo, hi, f_hi
        for _ in range(100):
            if hi - lo <= 2.0 * tol:
                break
            length = b - f_b * (b - a) / (f_b - f_a) if f_b != f_a else 0.5 * (lo + hi)
            if not lo < length < hi:   # outside the bracket, or infinite: bisect
                length = 0.5 * (lo + hi)
            length = min(max(length, lo + tol), hi - tol)
            trial = self.step(z, length, state, local)
            f, trial_local = self.event_trial(event, z, length, state, trial)
            if f >= 0.0:
                hi, f_hi, hi_end, hi_local = length, f, trial, trial_local
            else:
                lo, f_lo = length, f
            a, f_a, b, f_b = b, f_b, length, f
        return hi, hi_end, hi_local


#: How far past the real tube an area-for-duty march may go, in tube lengths.
DUTY_CHECK_LENGTH_FACTOR = 10.0


class ProgressShare:
    """Maps the progress of one march onto a share of the whole rating."""

    def __init__(self, callback):
        self.callback = callback
        self.base, self.span = 0.0, 1.0

    def part(self, base, span):
        self.base, self.span = base, span
        return self

    def __call__(self, fraction):
        if self.callback is not None:
            self.callback(min(1.0, self.base + self.span * fraction))


def integrate_along_z(stations, attr):
    """Trapezoidal integral of a station attribute over z."""
    total = 0.0
    for a, b in zip(stations, stations[1:]):
        total += 0.5 * (getattr(a, attr) + getattr(b, attr)) * (b.z - a.z)
    return total


class _MarchFailed(Exception):
    def __init__(self, outcome):
        super().__init__(outcome.message)
        self.outcome = outcome


def solve_counter_current(march, h_low, h_inlet, coarse=None, rtol=1e-6) -> MarchOutcome:
    """Shoot on the counter-current heating medium's outlet state at z = 0.

    ``march(h_start)`` marches the whole path from a heating-medium enthalpy at
    z = 0 and returns a ``MarchOutcome``; the answer is the start for which the
    medium arrives at z = L with its given inlet enthalpy ``h_inlet``. The root is
    bracketed between ``h_low`` (the medium cooled to the boiling inlet
    temperature) and ``h_inlet`` (no heat given up), where the residual changes sign.
    It is converged on the residual itself, to ``rtol`` (a millionth) of the duty per
    unit heating flow: with a small heating flow against a large area the residual
    changes steeply with the start, and a tolerance on the start would not do.

    With ``coarse`` (the same march with fewer increments) the shooting is first
    solved with it; the full march then starts from that answer, with the coarse
    residual's slope for its first step, and secant steps follow to the same
    tolerance: two or three full marches where the bracketed shooting takes six. If
    that does not converge within a few marches, the full shooting follows.
    """
    if coarse is not None:
        out = _shoot_from_coarse(march, coarse, h_low, h_inlet)
        if out is not None:
            return out
    span = abs(h_inlet - h_low)
    seen: dict[float, MarchOutcome] = {}
    scale = {"r": span}

    class _Converged(Exception):
        pass

    def resid(h_start):
        out = seen.get(h_start)
        if out is None:  # the root finder asks again for the ends of its bracket
            out = seen[h_start] = march(h_start)
        if out.status != "ok":
            # The medium only gains enthalpy along +z: a trial that failed (left the
            # medium's data, say) after passing its inlet state has a positive residual.
            end = out.end_heating_state
            if end is not None and end > h_inlet:
                return end - h_inlet
            raise _MarchFailed(out)
        r = out.end_heating_state - h_inlet
        if abs(r) <= rtol * scale["r"]:
            raise _Converged(h_start)
        return r

    try:
        r_in = resid(h_inlet)
        if r_in <= 0.0:  # nothing transferred: the inlet state is the answer
            return seen[h_inlet]
        scale["r"] = r_in      # about the duty per unit heating flow
        # With the medium leaving at its inlet state the duty is too large; leaving
        # colder by that duty, it is too small (the medium is colder everywhere): a
        # narrow bracket from two marches, and the full one only if that fails.
        lo = max(h_low, h_inlet - r_in)
        if resid(lo) > 0.0:
            if lo == h_low or resid(h_low) > 0.0:
                out = seen[h_low]
                out.status = "failed"
                out.message = ("no counter-current solution: the heating medium cannot be "
                               "cooled to the boiling inlet temperature")
                return out
            lo = h_low
        h_start = brentq(resid, lo, h_inlet, xtol=1e-12 * span, rtol=1e-15, maxiter=200)
    except _Converged as done:
        h_start = done.args[0]
    except _MarchFailed as exc:
        return exc.outcome
    out = seen.get(h_start) or march(h_start)
    if out.status != "ok":  # the root sits where the medium leaves its data
        out.message = "no counter-current solution within the heating medium's data: " + out.message
    return out


#: Tolerance of the coarse shooting (its own answer is 1e-4 to 1e-3 from the full one's).
_COARSE_RTOL = 1e-4
#: Full marches tried from the coarse shooting's answer before the full shooting.
_FROM_COARSE_MARCHES = 4


def _shoot_from_coarse(march, coarse, h_low, h_inlet):
    """``solve_counter_current`` with the coarse march, then secant steps of the full one.

    Returns None where the full march does not converge within _FROM_COARSE_MARCHES.
    """
    trials = []

    def recorded(h_start):
        out = coarse(h_start)
        if out.end_heating_state is not None:   # a failed trial's end counts as there
            trials.append((h_start, out.end_heating_state - h_inlet))
        return out

    # the coarse answer only starts the full march: a looser tolerance will do
    first = solve_counter_current(recorded, h_low, h_inlet, rtol=_COARSE_RTOL)
    if first.status != "ok" or len(trials) < 2 or trials[0][0] != h_inlet:
        return None
    tol = 1e-6 * trials[0][1]       # the tolerance of the full shooting, on its scale
    h = first.start_heating_state
    near = sorted(trials, key=lambda t: abs(t[0] - h))[:2]
    if near[0][0] == near[1][0]:
        return None
    slope = (near[0][1] - near[1][1]) / (near[0][0] - near[1][0])
    previous = None
    for _ in range(_FROM_COARSE_MARCHES):
        out = march(h)
        if out.status != "ok":
            return None
        r = out.end_heating_state - h_inlet
        if abs(r) <= tol:
            return out
        if previous is not None and previous[1] != r:
            slope = (previous[1] - r) / (previous[0] - h)
        if not slope > 0.0:
            return None
        previous = (h, r)
        h = min(max(h - r / slope, h_low), h_inlet)
    return None

