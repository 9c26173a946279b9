"""Vertical thermosiphon reboiler: the circulation from the loop's pressure balance.

The loop (recirculating): column base -> inlet line -> bottom channel -> tubes
(heated on the shell side, boiling in up-flow) -> top channel -> return line ->
column. Nothing pumps the liquid: it circulates at the flow W [kg/s] at which the
head of the column liquid equals the pressure the loop uses.

For a trial circulation W the pressure is followed around the loop:

1. Driving head: the column liquid (column pressure P_col, column-base
   temperature) stands H above the bottom tube sheet: available = rho_l g H.
2. Inlet line and bottom channel: friction and fittings of the line, and the
   inlet nozzle's velocity head lost in the channel (``piping.liquid_line``).
3. Tube entrance: the static pressure falls by (1 + K_ent) rho v^2/2 (the
   acceleration into the tubes and the entrance loss).
4. Tubes: the march (``rating.boiling_march.Marcher``) from that pressure and the column
   liquid's enthalpy. The liquid arrives subcooled, because the static head has
   raised its saturation temperature; sensible heating, subcooled boiling,
   saturated boiling follow, with friction, acceleration and gravity from the
   chosen two-phase and void methods, T_sat following the local pressure.
5. Tube exit: the exit velocity head is recovered less the exit loss,
   (K_exit - 1) G^2/(2 rho_h); zero for the default sudden expansion.
6. Return line: two-phase friction, fittings and the static head of its rise
   (``piping.two_phase_line``), at the tube-exit quality.
7. Back pressure: the column pressure, plus the liquid standing above the return
   nozzle if the level is that high.

required(W) is the sum of 2-7, residual(W) = available - required(W).

The outer problem: the residual is scanned over a wide range of flows, spaced
evenly in log W (at most ``SCAN_POINTS`` over a factor ``SCAN_SPAN``), from the
flow at which liquid-only friction would use the whole driving head down to the
first flow at which the tubes boil dry; every change of sign is solved with a
bracketed root (Brent) at the full increment count, and each crossing is
classified by the slope test of Ledinegg (1938, Die Waerme 61, 891-898): it
is statically stable where the required pressure difference rises faster with
the flow than the available one, d(required - available)/dW > 0, i.e. where the
residual changes from + to - with rising flow. The stable crossing of highest
circulation is the operating point; the others are reported. The scan is kept in
the result as ``pressure_balance_curve`` for plotting (evaluated with the scan's
coarser increments; the operating points with the full ones).

The column side is ``case.boiling``: ``inlet_pressure`` is the column
vapour-space pressure, ``inlet_temperature`` the column-base liquid temperature
(None: saturated; colder: the column liquid's subcooling, e.g. from a cold
reflux or feed). ``boiling.mass_flow`` is not used (it may be None; if given, an
info says so): the circulation is the result. A case with ``required_duty`` is
rated for performance and the duty compared: ``over_design_pct`` = (duty /
required - 1) x 100, and a shortfall is an error.

Only a balance at which liquid leaves the tubes is an operating point: a
crossing with a dry tube exit (all the liquid evaporates) is reported as such.
With no stable wet balance the loop "will not circulate": the result fails with
the shortfall of driving head, the level that would supply it (a first
estimate) and the return line's share of the losses.

Not modelled: density-wave oscillations (only the static Ledinegg test is made),
flashing in the return line (its quality stays the tube-exit quality), the
static head inside the channels, mixtures, once-through (draw-pan) feeding.
"""
from __future__ import annotations

import dataclasses
import itertools
import math
from dataclasses import dataclass, field

from ..roots import brentq

from .. import checks
from ..correlations import registry
from ..correlations.dimensionless import g
from ..errors import PropertyError
from ..boiling_march import Marcher
from ..march import Cancelled, MarchOutcome, solve_counter_current
from ..properties import make_fluid
from ..results import SUMMARY_KEYS, RatingWarning, Result, cancelled, failed, profiles_from_stations
from ..rules import note, said, warn
from . import piping
from .tube_boiling import (DEFAULT_INCREMENTS, march_summary, boiling_tube, condensate_film,
                           heating_side, methods_used, with_substitutes)
from .heating import SteamHeating

#: Flows in the scan, spaced evenly in log W.
SCAN_POINTS = 16
#: The scan runs from the top flow (liquid-only friction = driving head) down to top / SCAN_SPAN.
SCAN_SPAN = 300.0
#: Increments of the scan's marches; the crossings are then solved with the full count.
SCAN_INCREMENTS = 10
#: Largest step (relative) when bracketing a crossing at the full increments, and the
#: number of steps tried before the scan's own interval is used as the bracket.
BRACKET = 0.1
STEPS = 4
#: The root stops when the loop balances to this [Pa] (the issue asks for < 10 Pa) ...
BALANCE_TOLERANCE = 0.5
#: ... or when the bracket is this narrow (relative), whichever comes first.
ROOT_XTOL = 1e-7
#: The scan's own crossing is found to this share of the driving head.
COARSE_TOLERANCE = 2e-3
#: A root whose residual stays above this share of the driving head sits on a
#: discontinuity (a march that stops), not on a balance.
DISCONTINUITY = 0.01
#: Below this column pressure the vacuum level band applies [Pa] (standard atmosphere).
ATMOSPHERE = 101325.0
#: Kern (1950) ch. 15, natural-circulation flux limits: 12,000 Btu/h ft^2 for organics
#: and 30,000 for water (1 Btu/h ft^2 = 3.154591 W/m^2).
KERN_FLUX_ORGANIC = 12000.0 * 3.154591
KERN_FLUX_AQUEOUS = 30000.0 * 3.154591

#: The pressure-using parts of the loop, in flow order (keys of LoopPoint.parts).
PARTS = ("inlet_line", "tube_entrance", "tubes", "tube_exit", "return_line", "back_pressure")


@dataclass
class LoopPoint:
    """The loop at one trial circulation W [kg/s]: pressures [Pa] and the tube march."""

    W: float
    increments: int
    available: float
    parts: dict = field(default_factory=dict)
    outcome: MarchOutcome | None = None
    exhausted: bool = False          # the march ran out of pressure: required > available
    note: str = ""                   # why there is no value
    extra: dict = field(default_factory=dict)

    @property
    def known(self) -> bool:
        return bool(self.parts) or self.exhausted

    @property
    def required(self) -> float:
        return sum(self.parts.values()) if self.parts else math.inf

    @property
    def residual(self) -> float:
        """available - required; a large negative number when the pressure ran out."""
        if self.parts:
            return self.available - self.required
        return -10.0 * self.available if self.exhausted else math.nan


@dataclass
class Crossing:
    """A flow at which the loop balances."""

    point: LoopPoint
    stable: bool                     # Ledinegg: d(required - available)/dW > 0
    slope: float                     # d(required - available)/dW [Pa s/kg]
    selected: bool = False
    brackets: tuple = ()             # scan intervals around it, narrow to wide

    @property
    def dry(self) -> bool:
        """The tubes boil dry: no liquid returns, so this is no recirculating operating point."""
        return _dry(self.point)


class _Loop:
    """The circulation loop of one case: LoopPoint for any trial flow (cached)."""

    def __init__(self, case, fluid, tube, heating, hs_inlet, *, cancel=None, progress=None):
        self.case, self.fluid, self.heating, self.hs_inlet = case, fluid, heating, hs_inlet
        self.lp = lp = case.thermosiphon
        self.tube = tube
        self.cancel, self.progress = cancel, progress
        self.P_col = P = case.boiling.inlet_pressure
        sat = fluid.saturation(P)
        self.T_sat_col = sat.T_sat
        if case.boiling.inlet_temperature is None:
            self.T_in, self.h0, self.rho_in, self.mu_in = sat.T_sat, sat.h_l, sat.rho_l, sat.mu_l
        else:
            st = fluid.single_phase(P, case.boiling.inlet_temperature)
            self.T_in, self.h0, self.rho_in, self.mu_in = st.T, st.h, st.rho, st.mu
        self.L = case.tubes.length
        self.N = case.tubes.tubes_per_pass
        self.A_tubes = self.N * piping.flow_area(tube.D_i)
        self.available = self.rho_in * g * lp.liquid_level
        self.submergence = lp.liquid_level - (self.L + lp.return_line_rise)
        self.back = self.rho_in * g * max(0.0, self.submergence)
        self.friction = registry.get(case.methods.two_phase_friction)
        self.void = registry.get(case.methods.void_fraction)
        self.cache: dict[tuple[float, int], LoopPoint] = {}
        self.evaluations = 0

    # ---- the single-phase parts, cheap and without a march
    def _inlet(self, W):
        lp = self.lp
        line = piping.liquid_line(W, lp.inlet_line_diameter, lp.inlet_line_length,
                                  lp.inlet_line_k, self.rho_in, self.mu_in, lp.line_roughness)
        G_noz = W / piping.flow_area(lp.inlet_nozzle)
        channel = lp.bottom_channel_k * piping.velocity_head(G_noz, self.rho_in)
        entrance = (1.0 + lp.tube_entrance_k) * piping.velocity_head(W / self.A_tubes, self.rho_in)
        return line.total + channel, entrance

    def top_flow(self) -> float:
        """The flow at which liquid-only friction in the loop would use the whole driving head.

        Two-phase friction, acceleration and the mixture's static head only add to
        it, so at this flow the residual is negative: the scan's upper end.
        """
        lp = self.lp
        rho, mu = self.rho_in, self.mu_in

        def friction(W):
            inlet, entrance = self._inlet(W)
            tubes = piping.liquid_line(W / self.N, self.tube.D_i, self.L, 0.0, rho, mu,
                                       self.tube.roughness)
            ret = piping.liquid_line(W, lp.return_line_diameter, lp.return_line_length,
                                     lp.return_line_k, rho, mu, lp.line_roughness)
            return inlet + entrance + tubes.total + ret.total - self.available

        W = 1.0
        while friction(W) < 0.0:
            W *= 4.0
        while friction(W) > 0.0 and W > 1e-9:
            W /= 4.0
        return brentq(friction, W, 4.0 * W, rtol=1e-6)

    # ---- one trial flow
    def evaluate(self, W: float, n: int) -> LoopPoint:
        key = (W, n)
        point = self.cache.get(key)
        if point is None:
            if self.cancel is not None and self.cancel():
                raise Cancelled()
            point = self.cache[key] = self._evaluate(W, n)
            self.evaluations += 1
            if self.progress is not None:
                self.progress(self.evaluations)
        return point

    def _evaluate(self, W, n) -> LoopPoint:
        lp, fluid = self.lp, self.fluid
        point = LoopPoint(W, n, self.available)
        inlet, entrance = self._inlet(W)
        P_in = self.P_col + self.available - inlet - entrance
        if P_in <= max(fluid.P_triple, 0.02 * self.P_col):
            point.exhausted = True
            point.note = "the inlet line and the tube entrance use up the driving head"
            return point
        outcome = self._march(W, P_in, n)
        point.outcome = outcome
        if outcome.status != "ok":
            point.exhausted = outcome.pressure_exhausted
            point.note = outcome.message
            return point
        last = outcome.stations[-1]
        try:
            rho_exit, ret = self._return(W, last)
        except (PropertyError, ValueError, ZeroDivisionError, OverflowError) as exc:
            point.note = f"return line at {W:.4g} kg/s: {exc}"
            return point
        exit_term = (lp.tube_exit_k - 1.0) * piping.velocity_head(W / self.A_tubes, rho_exit)
        point.parts = {
            "inlet_line": inlet, "tube_entrance": entrance, "tubes": P_in - last.P,
            "tube_exit": exit_term, "return_line": ret.total, "back_pressure": self.back,
        }
        point.extra = {"P_in": P_in, "rho_exit": rho_exit, "return_line": ret}
        return point

    def _return(self, W, last):
        """The tube-exit mixture's homogeneous density and the return line's pressure change."""
        lp, fluid = self.lp, self.fluid
        sat = fluid.saturation(last.P)
        x = last.x
        single = None
        if 0.0 < x < 1.0:
            rho_exit = piping.homogeneous_density(x, sat.rho_l, sat.rho_v)
        else:
            state = fluid.at_ph(last.P, last.h)
            single = (state.rho, state.mu) if state.rho is not None else None
            rho_exit = single[0] if single else (sat.rho_l if x <= 0.0 else sat.rho_v)
        ret = piping.two_phase_line(W, lp.return_line_diameter, lp.return_line_length,
                                    lp.return_line_k, lp.return_line_rise, x, sat,
                                    friction=self.friction, void=self.void,
                                    roughness=lp.line_roughness, single=single)
        return rho_exit, ret

    def _march(self, W, P_in, n) -> MarchOutcome:
        tube = dataclasses.replace(self.tube, mass_flow_per_tube=W / self.N)
        heating, hs_inlet = self.heating, self.hs_inlet

        def run(hs_start):
            m = Marcher(tube, heating, self.L, n, cancel=self.cancel)
            return m.run(P_in, self.h0, hs_start)

        if hs_inlet is None or self.case.heating.flow_arrangement == "co":
            return run(hs_inlet)
        h_low = heating.fluid.enthalpy(self.case.heating.pressure, self.T_in)
        return solve_counter_current(run, h_low, hs_inlet)


# --------------------------------------------------------------------------- the outer problem

def _dry(point: LoopPoint) -> bool:
    """All the liquid evaporates in the tubes: nothing but vapour returns to the column."""
    return point.outcome is not None and bool(point.outcome.stations) \
        and point.outcome.stations[-1].x >= 1.0


def _scan(loop: _Loop, n_scan: int) -> list[LoopPoint]:
    """The loop over a wide range of flows, returned low to high.

    From the top flow (where the residual is negative) down, by a constant ratio,
    to the first flow at which the tubes boil dry (below it only the vapour's
    superheat changes), at most SCAN_POINTS flows over a factor SCAN_SPAN.
    """
    ratio = SCAN_SPAN ** (1.0 / (SCAN_POINTS - 1))
    W = loop.top_flow()
    points = [loop.evaluate(W, n_scan)]
    for _ in range(4):  # a residual still positive at the top: more flow (never expected)
        if not points[-1].known or points[-1].residual <= 0.0:
            break
        points.append(loop.evaluate(points[-1].W * ratio * ratio, n_scan))
    points.reverse()
    while len(points) < SCAN_POINTS + 4 and not _dry(points[0]):
        W = points[0].W / ratio
        if W < points[-1].W / SCAN_SPAN * (1.0 - 1e-9):
            break
        points.insert(0, loop.evaluate(W, n_scan))
    return points


def _crossings(loop: _Loop, scan: list[LoopPoint]) -> list[Crossing]:
    """Every change of sign of the scan, solved with the scan's own (coarser) marches.

    Each is classified by the direction of the change (Ledinegg) and keeps its
    scan interval and neighbours as brackets for ``_finish``.
    """
    known = [p for p in scan if p.known]
    found = []
    for i, (a, b) in enumerate(itertools.pairwise(known)):
        if (a.residual > 0.0) == (b.residual > 0.0):
            continue
        lower = known[i - 1] if i > 0 else a
        upper = known[i + 2] if i + 2 < len(known) else b
        seen = []

        def f(W, n=a.increments, seen=seen):
            r = loop.evaluate(W, n).residual
            seen.append((W, r))
            return r

        f(a.W), f(b.W)
        W = _root(f, a.W, b.W, COARSE_TOLERANCE * loop.available,
                  jump=DISCONTINUITY * loop.available)
        point = loop.evaluate(W, a.increments)
        if not point.parts or abs(point.residual) > DISCONTINUITY * loop.available:
            continue  # the residual jumps here (a march that stops), not a balance
        found.append(Crossing(point, stable=a.residual > 0.0 > b.residual,
                              slope=-(_slope(seen, W) or 0.0),
                              brackets=((a.W, b.W), (lower.W, upper.W))))
    return found


def _finish(loop, c: Crossing, n) -> bool:
    """Solve a crossing at the full increments, next to where the scan found it.

    ``c`` takes the new point and slope; False if the change of sign is not there
    at the full increments (a tangency) or the residual jumps.
    """
    W0 = c.point.W
    lower, upper = c.brackets[-1] if c.brackets else (0.5 * W0, 2.0 * W0)
    fallback = list(c.brackets) or [(W0 / 1.2, W0 * 1.2), (0.5 * W0, 2.0 * W0)]
    W, seen = _fine_root(loop, W0, -c.slope or None, n, lower, upper, fallback)
    if W is None:
        return False
    point = loop.evaluate(W, n)
    if not point.parts or abs(point.residual) > DISCONTINUITY * loop.available:
        return False
    c.point = point
    c.slope = -(_slope(seen, W) or -c.slope)
    return True


class _Converged(Exception):
    def __init__(self, W):
        super().__init__(W)
        self.W = W


#: A bracket this narrow (relative) whose ends both stay further than DISCONTINUITY
#: from a balance holds a jump of the residual (a march that stops), not a root.
JUMP_WIDTH = 1e-4


def _root(f, lo, hi, tol, jump=None):
    """Brent's bracketed root of f on [lo, hi], stopped as soon as |f| <= tol [Pa].

    With ``jump`` [Pa], it also stops once two flows of opposite residual lie within
    JUMP_WIDTH of each other with both residuals above ``jump``: a continuous
    residual cannot change that much over so small a step, so the bracket holds a
    discontinuity, which Brent's method would otherwise bisect to the last digit.
    """
    seen = []

    def g(W):
        r = f(W)
        if abs(r) <= tol:
            raise _Converged(W)
        if jump is not None and abs(r) > jump:
            for W2, r2 in seen:
                if (r2 > 0.0) != (r > 0.0) and abs(W2 - W) <= JUMP_WIDTH * W:
                    raise _Converged(W)
            seen.append((W, r))
        return r

    try:
        return brentq(g, lo, hi, xtol=ROOT_XTOL * lo, rtol=1e-12, maxiter=100)
    except _Converged as done:
        return done.W


def _slope(seen, W):
    """dr/dW from the two evaluated flows nearest W (None if there are fewer than two)."""
    near = sorted(seen, key=lambda p: abs(p[0] - W))[:2]
    if len(near) < 2 or near[0][0] == near[1][0]:
        return None
    (w1, r1), (w2, r2) = near
    return (r2 - r1) / (w2 - w1)


def _straddle(seen, W):
    """The pair of evaluated flows nearest W whose residuals have opposite signs, or None."""
    pos = [p for p in seen if p[1] > 0.0]
    neg = [p for p in seen if p[1] <= 0.0]
    if not pos or not neg:
        return None
    a = min(pos, key=lambda p: abs(p[0] - W))
    b = min(neg, key=lambda p: abs(p[0] - W))
    return (a, b) if a[0] < b[0] else (b, a)


def _fine_root(loop, W, slope, n, lower, upper, fallback):
    """A balance at the full increments from a first guess W and a slope dr/dW.

    Steps of one and a half times the secant (Newton) step, kept within [lower,
    upper], until two evaluations straddle the root, then Brent's method inside
    that bracket; if the steps do not straddle it, the ``fallback`` brackets are
    tried in turn. Returns (W, the evaluated (W, residual) pairs), W None if no
    bracket holds a change of sign.
    """
    seen = []

    def f(W):
        r = loop.evaluate(W, n).residual
        if math.isfinite(r):
            seen.append((W, r))
        return r

    bracket = None
    r = f(W)
    for _ in range(STEPS):
        if abs(r) <= BALANCE_TOLERANCE:
            bracket = (W, W)
            break
        if not slope or not math.isfinite(r):
            break
        step = -1.5 * r / slope
        step = math.copysign(min(abs(step), BRACKET * W), step)
        W = min(max(W + step, lower), upper)
        r = f(W)
        pair = _straddle(seen, W)
        if pair is not None:
            bracket = (pair[0][0], pair[1][0])
            break
        slope = _slope(seen, W) or slope
    for lo, hi in ([bracket] if bracket else []) + list(fallback):
        f_lo, f_hi = f(lo), f(hi)
        if lo == hi or (math.isfinite(f_lo) and math.isfinite(f_hi)
                        and (f_lo > 0.0) != (f_hi > 0.0)):
            return (lo if lo == hi else _root(f, lo, hi, BALANCE_TOLERANCE,
                                              jump=DISCONTINUITY * loop.available)), seen
    return None, seen


def _use_local_condensation(loop, chosen: Crossing) -> None:
    """Vertical tubes on steam, as in the evaporator: the local condensate-film law.

    The march at the balance found with Nusselt's mean coefficient gives the
    condensate film along the tubes (``tube_boiling.condensate_film``); the heating
    side then uses the local film law on it (``SteamHeating.use_condensate_profile``)
    for the full-increment solution of the operating point.
    """
    point = chosen.point
    tube = dataclasses.replace(loop.tube, mass_flow_per_tube=point.W / loop.N)
    loop.heating.use_condensate_profile(*condensate_film(point.outcome, tube, loop.heating))
    loop.cache.clear()            # every evaluation so far used the mean coefficient


# --------------------------------------------------------------------------- rating

def rate_thermosiphon(case, *, increments=None, progress=None, cancel=None) -> Result:
    """Rate a vertical thermosiphon reboiler; never raises for a physical reason."""
    n = increments or case.increments or DEFAULT_INCREMENTS
    n_scan = min(SCAN_INCREMENTS, n)
    fluid = make_fluid(case.boiling.fluid)
    # The tube description, heating side and methods as the evaporator builds them; the
    # flow per tube is set for each trial circulation.
    probe = dataclasses.replace(case, boiling=dataclasses.replace(case.boiling, mass_flow=1.0))
    tube = boiling_tube(probe, fluid)
    heating, hs_inlet = heating_side(probe)
    methods = methods_used(tube, case, heating)
    expected = SCAN_POINTS + 6

    def report(evaluations):
        if progress is not None:
            progress(min(0.95, evaluations / expected))

    local = isinstance(heating, SteamHeating) and tube.vertical and case.tubes.passes == 1
    message = "rated"
    try:
        loop = _Loop(case, fluid, tube, heating, hs_inlet, cancel=cancel, progress=report)
        scan = _scan(loop, n_scan)
        crossings = _crossings(loop, scan)
        chosen = select(crossings)
        # The full increments: first the crossings that are only reported, then the
        # operating point (with the local condensate-film law on vertical steam-heated
        # tubes, which changes every evaluation).
        crossings = [c for c in crossings if c is chosen or _finish(loop, c, n)]
        while chosen is not None:
            if local:
                _use_local_condensation(loop, chosen)
            if _finish(loop, chosen, n):
                break
            crossings.remove(chosen)  # the change of sign is not there at the full increments
            chosen = select(crossings)
    except Cancelled:
        return cancelled(case, methods=methods)
    except (ValueError, ZeroDivisionError, OverflowError, RuntimeError) as exc:
        return failed(case, f"no solution of the circulation loop: {exc}", methods=methods)
    if chosen is None or _dry(chosen.point):
        return _will_not_circulate(case, loop, scan, crossings, _curve(scan, crossings, n_scan),
                                   methods, n)
    if progress is not None:
        progress(0.97)
    curve = _curve(scan, crossings, n_scan)
    point = chosen.point
    outcome = point.outcome
    W = point.W
    sized = dataclasses.replace(case, boiling=dataclasses.replace(case.boiling, mass_flow=W),
                                required_duty=None, question="performance")
    tube_w = dataclasses.replace(tube, mass_flow_per_tube=W / loop.N)
    summary = march_summary(sized, tube_w, heating, hs_inlet, outcome, outcome, None)
    summary.update(_loop_summary(case, loop, point))
    summary["balances_found"] = len(crossings)     # stable or not, wet or dry
    if case.required_duty:
        summary["required_duty_W"] = case.required_duty
        # Area basis, as for every type: the area the required duty takes at the rated
        # mean flux (the circulation, and with it the coefficient, changes with the length,
        # so the tube is not marched on past its end as the other types do).
        a_req = summary["area_m2"] * case.required_duty / summary["duty_W"]
        summary["required_area_m2"] = a_req
        summary["over_design_pct"] = (summary["area_m2"] / a_req - 1.0) * 100.0
        if summary["mean_temperature_difference_K"]:  # as the other types give them
            u_req = case.required_duty / (summary["area_m2"]
                                          * summary["mean_temperature_difference_K"])
            summary["u_required_W_m2K"] = u_req
            summary["over_surface_pct"] = (summary["u_clean_W_m2K"] / u_req - 1.0) * 100.0
    warnings = checks.evaluate(case, outcome, fluid=fluid, service="thermosiphon")
    warnings += _loop_warnings(case, fluid, loop, chosen, crossings, scan, summary)
    if progress is not None:
        progress(1.0)
    status = "warnings" if any(w.severity in ("warning", "error") for w in warnings) else "ok"
    return Result(case.name, case.type, status, message, summary,
                  profiles_from_stations(outcome.stations), tuple(warnings),
                  with_substitutes(methods, outcome),
                  extra={"increments": n, "pressure_balance_curve": curve})


def select(crossings: list[Crossing]) -> Crossing | None:
    """The operating point: the stable (Ledinegg) wet crossing of highest circulation.

    Marked ``selected``; None when there is no stable crossing that returns liquid.
    """
    stable = [c for c in crossings if c.stable and not c.dry]
    if not stable:
        return None
    chosen = max(stable, key=lambda c: c.point.W)
    chosen.selected = True
    return chosen


def _subcooled_length(stations) -> float:
    """Length from the bottom tube sheet to the point where the bulk reaches saturation."""
    for s in stations:
        if s.x >= 0.0:
            return s.z
    return stations[-1].z


def _loop_summary(case, loop: _Loop, point: LoopPoint) -> dict:
    st = point.outcome.stations
    last = st[-1]
    W = point.W
    x = last.x
    lp = case.thermosiphon
    vapour = W * min(max(x, 0.0), 1.0)
    area = case.tubes.outer_area
    duty = W * (last.h - st[0].h)
    return {
        "circulation_kg_s": W,
        "circulation_ratio": W / vapour if vapour > 0.0 else None,
        "vapour_flow_kg_s": vapour,
        "pressure_balance_residual_Pa": point.residual,
        "subcooled_length_m": _subcooled_length(st),
        "available_head_Pa": loop.available,
        "inlet_line_pressure_drop_Pa": point.parts["inlet_line"],
        "tube_inlet_pressure_Pa": point.extra["P_in"],
        "return_line_pressure_drop_Pa": point.parts["return_line"],
        "inlet_saturation_rise_K": st[0].T_sat - loop.T_sat_col,
        "mean_heat_flux_W_m2": duty / area,
        "inlet_nozzle_rho_v2_kg_m_s2": piping.rho_v2(W, lp.inlet_nozzle, loop.rho_in),
        "outlet_nozzle_rho_v2_kg_m_s2": piping.rho_v2(W, lp.outlet_nozzle, point.extra["rho_exit"]),
        "balances_found": None,
    }


def _curve(scan, crossings, n_scan) -> dict:
    """The scan and the crossings, JSON-ready, for plotting the pressure balance."""
    known = [p for p in scan if p.parts]
    return {
        "increments": n_scan,
        "circulation_kg_s": [p.W for p in known],
        "available_Pa": [p.available for p in known],
        "required_Pa": [p.required for p in known],
        "parts_Pa": {k: [p.parts[k] for p in known] for k in PARTS},
        "exit_quality": [p.outcome.stations[-1].x for p in known],
        "not_solved_kg_s": [p.W for p in scan if not p.parts],
        "operating_points": [{
            "circulation_kg_s": c.point.W, "available_Pa": c.point.available,
            "required_Pa": c.point.required, "residual_Pa": c.point.residual,
            "slope_Pa_s_kg": c.slope, "stable": c.stable, "dry": c.dry, "selected": c.selected,
            "exit_quality": c.point.outcome.stations[-1].x,
        } for c in crossings],
    }


def _will_not_circulate(case, loop, scan, crossings, curve, methods, n) -> Result:
    """No stable wet balance: say by how much the head falls short and what would help."""
    summary = {k: None for k in SUMMARY_KEYS}
    summary.update(circulation_kg_s=None, pressure_balance_residual_Pa=None,
                   available_head_Pa=loop.available)
    wet = [p for p in scan if p.parts and not _dry(p)]
    lp = case.thermosiphon
    if not any(p.known for p in scan):
        notes = "; ".join(sorted({p.note for p in scan if p.note}))
        message = f"no trial circulation of the loop could be rated: {notes}"
        return Result(case.name, case.type, "failed", message, summary, {},
                      (note("no-convergence", message),), methods,
                      extra={"increments": n, "pressure_balance_curve": curve})
    if not wet:
        message = ("will not circulate: at every flow that leaves liquid in the tubes the loop "
                   "uses up its pressure (two-phase friction and acceleration in the tubes); "
                   "wider or more tubes, a lower duty or a higher liquid level are needed")
    elif max(p.residual for p in wet) >= 0.0:
        # The head would do somewhere, yet no balance there is both wet and stable.
        surplus = max(wet, key=lambda p: p.residual)
        notes = sorted({p.note for p in scan if not p.parts and p.note})
        message = said("will not circulate steadily: at {W:mass_flow:.3g} the liquid head "
                       "exceeds the loop's losses by {surplus:pressure_difference:.4g}, but no "
                       "wet, statically stable balance was found{more:text}",
                       W=surplus.W, surplus=surplus.residual,
                       more=("; the balances found are listed in the other warnings"
                             if crossings else "")
                       + (f"; trial flows that could not be rated: {'; '.join(notes)}"
                          if notes else ""))
    else:
        best = max(wet, key=lambda p: p.residual)
        deficit = -best.residual
        rise = deficit / (loop.rho_in * g)
        level = lp.liquid_level + rise
        share = best.parts["return_line"] / best.required
        helps = []
        if level <= loop.L + lp.return_line_rise:
            helps.append(said("raise the liquid level by about {rise:length:.2f} (to about "
                              "{level:length:.2f} above the bottom tube sheet; a first estimate: "
                              "the static head also raises the inlet subcooling)",
                              rise=rise, level=level))
        else:
            helps.append("no level below the return nozzle gives enough head")
        helps.append(said("reduce the loop's losses: there the return line takes "
                          "{ret:pressure_difference:.4g} ({share:percent:.0%}) and the inlet line "
                          "{inlet:pressure_difference:.4g}{more:text}",
                          ret=best.parts["return_line"], share=share,
                          inlet=best.parts["inlet_line"],
                          more="; a larger return line helps most" if share > 0.3 else ""))
        message = said("will not circulate: the loop needs at least {need:pressure_difference:.4g} "
                       "(at {W:mass_flow:.3g}) and the liquid level gives "
                       "{head:pressure_difference:.4g}; {helps:text}{alt:text}",
                       need=best.required, W=best.W, head=loop.available, helps=helps[0],
                       alt=said("; or {h:text}", h=helps[1]) if len(helps) > 1 else "")
        summary.update(driving_head_deficit_Pa=deficit, liquid_level_needed_m=level)
    warnings = [note("will-not-circulate", message)]
    warnings += [_crossing_warning(c) for c in crossings]
    return Result(case.name, case.type, "failed", message, summary, {}, tuple(warnings), methods,
                  extra={"increments": n, "pressure_balance_curve": curve})


def _crossing_warning(c: Crossing) -> RatingWarning:
    """Why a balance is not the operating point: boiled dry, or statically unstable."""
    if c.dry:
        return warn("dry-balance", W=c.point.W, x=c.point.outcome.stations[-1].x)
    return warn("unstable-operating-point", W=c.point.W, slope=c.slope)


# --------------------------------------------------------------------------- loop checks

def _merge(intervals):
    """Adjacent (lo, hi) intervals joined."""
    out = []
    for lo, hi in intervals:
        if out and out[-1][1] >= lo:
            out[-1] = (out[-1][0], hi)
        else:
            out.append((lo, hi))
    return out


def _aqueous(fluid) -> bool:
    return getattr(fluid, "coolprop_name", "").lower() == "water"


def _loop_warnings(case, fluid, loop, chosen, crossings, scan, summary) -> list[RatingWarning]:
    """The thermosiphon's own checks (``rating.rules``), after the common ones."""
    W = chosen.point.W
    out = [_crossing_warning(c) for c in crossings if c.dry or not c.stable]
    out += _balances(crossings) + _slopes(scan, W)
    out += _circulation(case, fluid, chosen.point.outcome.stations, loop.L, summary)
    out += _flux_and_nozzles(case, fluid, loop, summary) + _level(case, loop)
    if case.required_duty and summary["duty_W"] < case.required_duty:
        out.append(note("duty-not-reached", said(
            "the duty {duty:power:.4g} falls short of the required {required:power:.4g}",
            duty=summary["duty_W"], required=case.required_duty)))
    if case.boiling.mass_flow is not None:
        out.append(warn("mass-flow-ignored", m=case.boiling.mass_flow))
    return out


def _balances(crossings) -> list[RatingWarning]:
    """More than one stable wet balance: the loop may settle at another one."""
    stable = sorted((c for c in crossings if c.stable and not c.dry), key=lambda c: c.point.W)
    if len(stable) < 2:
        return []
    return [warn("multiple-operating-points", n=len(stable),
                 flows=", ".join(f"{c.point.W:.4g}" for c in stable))]


def _slopes(scan, W) -> list[RatingWarning]:
    """Flows where the required pressure difference falls as the flow rises: a change of
    level or duty that takes the loop there could start a flow excursion."""
    known = [p for p in scan if p.parts and not _dry(p)]
    falling = [(a.W, b.W) for a, b in itertools.pairwise(known) if b.required < a.required]
    return [warn("negative-slope", "warning" if hi >= 0.5 * W and lo <= 2.0 * W else "info",
                 lo=lo, hi=hi, W=W) for lo, hi in _merge(falling)]


def _circulation(case, fluid, stations, L, summary) -> list[RatingWarning]:
    """Exit vapour fraction, circulation ratio, mist flow, a long subcooled zone."""
    lim, out = case.limits, []
    x, aqueous = stations[-1].x, _aqueous(fluid)
    x_max = lim.thermosiphon_max_exit_quality_aqueous if aqueous \
        else lim.thermosiphon_max_exit_quality
    if x > x_max:
        out.append(warn("exit-quality", z=L, x=x, limit=x_max,
                        service=" (aqueous service)" if aqueous else ""))
    cr, lo, hi = (summary["circulation_ratio"], lim.thermosiphon_circulation_ratio_min,
                  lim.thermosiphon_circulation_ratio_max)
    if cr is not None and cr < lo:
        out.append(warn("circulation-ratio", what=f"circulation ratio {cr:.2f} (kg through "
                        "the tubes per kg of vapour made, 1 / exit quality) is below the usual "
                        f"{lo:g}-{hi:g}", effect="too little circulation for the duty"))
    elif cr is None or cr > hi:
        out.append(warn("circulation-ratio", "info", what="no vapour leaves the tubes"
                        if cr is None else f"circulation ratio {cr:.1f} is above the usual "
                        f"{lo:g}-{hi:g}", effect="most of the tube heats liquid; the duty is "
                        "sensitive to the level"))
    mist = next((s for s in stations if s.flow_pattern == "mist"), None)
    if mist is not None:
        out.append(warn("mist-flow", z=mist.z, x=mist.x))
    z_sub = summary["subcooled_length_m"]
    if z_sub > lim.thermosiphon_max_subcooled_fraction * L:
        out.append(warn("long-subcooled-zone", z=z_sub, share=z_sub / L,
                        rise=summary["inlet_saturation_rise_K"]))
    return out


def _flux_and_nozzles(case, fluid, loop, summary) -> list[RatingWarning]:
    """Mean heat flux against a natural-circulation limit; nozzle rho v^2 (TEMA)."""
    lim, out = case.limits, []
    aqueous = _aqueous(fluid)
    q_max = lim.thermosiphon_max_flux or (KERN_FLUX_AQUEOUS if aqueous else KERN_FLUX_ORGANIC)
    if summary["mean_heat_flux_W_m2"] > q_max:
        source = "" if lim.thermosiphon_max_flux else (
            " (Kern 1950, natural circulation, " + ("aqueous" if aqueous else "organics")
            + "; a conservative screening limit)")
        out.append(warn("thermosiphon-max-flux", q=summary["mean_heat_flux_W_m2"], limit=q_max,
                        source=source))
    for key, name in (("inlet_nozzle_rho_v2_kg_m_s2", "inlet nozzle"),
                      ("outlet_nozzle_rho_v2_kg_m_s2", "outlet nozzle")):
        if summary[key] > lim.thermosiphon_nozzle_rho_v2:
            out.append(warn("nozzle-rho-v2", name=name, rv2=summary[key],
                            limit=lim.thermosiphon_nozzle_rho_v2,
                            remedy="a larger nozzle is needed"))
    return out


def _level(case, loop) -> list[RatingWarning]:
    """Liquid level band, a submerged return nozzle, a column pressure too low."""
    lim, lp, out = case.limits, case.thermosiphon, []
    vacuum = loop.P_col < ATMOSPHERE
    lo = lim.thermosiphon_level_min_fraction_vacuum if vacuum else lim.thermosiphon_level_min_fraction
    hi = lim.thermosiphon_level_max_fraction_vacuum if vacuum else lim.thermosiphon_level_max_fraction
    share = lp.liquid_level / loop.L
    if not lo <= share <= hi:
        out.append(warn("liquid-level", level=lp.liquid_level, share=share, lo=lo, hi=hi,
                        vacuum=" under vacuum" if vacuum else ""))
    if loop.submergence > 0.0:
        out.append(warn("return-submerged", height=loop.submergence))
    if loop.P_col < lim.thermosiphon_min_pressure:
        out.append(warn("low-pressure", P=loop.P_col, limit=lim.thermosiphon_min_pressure))
    return out
