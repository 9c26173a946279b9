"""In-tube forced-flow evaporator: boiling inside vertical up-flow or horizontal tubes,
the heating medium on the shell side.

Two questions:
- performance: this geometry and these inlet states; what duty and outlet states?
- area for duty: this required duty; how much area does it take against the area
  there is (over-design in %)? Answered by marching on until the required duty is
  absorbed, past the real tube end if needed.

A counter-current liquid heating medium makes the performance question a
boundary-value problem: its outlet (at the boiling inlet, z = 0) is found by
shooting on its enthalpy with a bracketed root until the march returns the given
heating-medium inlet temperature at z = L.
"""
from __future__ import annotations

from .. import checks
from ..derived import inlet_enthalpy
from ..boiling_march import Marcher
from ..march import (DUTY_CHECK_LENGTH_FACTOR, Cancelled, MarchOutcome, ProgressShare,
                     solve_counter_current)
from ..errors import PropertyError
from ..properties import make_fluid
from ..results import Result, cancelled, failed, profiles_from_stations
from ..rules import note, warn
from .heating import SteamHeating
from .tube_boiling import (DEFAULT_INCREMENTS, boiling_tube, condensate_film, heating_side,
                           march_summary, methods_used, with_substitutes)

#: Increments of the first march on vertical steam-heated tubes, which only supplies the
#: condensate film along the tube (as the thermosiphon's scan does): the film law depends
#: on the film flow to the power -1/3 or less: against a first march at the full count the
#: duty moves by 1e-5 and the area-for-duty required area by 0.03 % on the samples (10
#: increments would move that area by 0.2 %).
FILM_PROFILE_INCREMENTS = 20

#: Increments of the counter-current shooting's first, coarse trials (as the
#: thermosiphon's scan); the full count then finishes from their answer.
SHOOTING_INCREMENTS = 10


def rate_evaporator(case, *, increments=None, progress=None, cancel=None) -> Result:
    """Rate an in-tube evaporator case; never raises for a physical reason."""
    n = increments or case.increments or DEFAULT_INCREMENTS
    fluid = make_fluid(case.boiling.fluid)
    tube = boiling_tube(case, fluid)
    heating, hs_inlet = heating_side(case)
    methods = methods_used(tube, case, heating)
    path = case.tubes.length * case.tubes.passes
    P0 = case.boiling.inlet_pressure
    h0 = inlet_enthalpy(case, fluid)
    prog = ProgressShare(progress)
    notes: list[str] = []

    local_condensation = isinstance(heating, SteamHeating) and tube.vertical \
        and case.tubes.passes == 1

    def march(hs_start, *, stop_duty=None, share=(0.0, 1.0), increments=None):
        max_len = path * DUTY_CHECK_LENGTH_FACTOR if stop_duty is not None else None
        if not local_condensation:
            m = Marcher(tube, heating, path, increments or n, progress=prog.part(*share),
                        cancel=cancel)
            return m.run(P0, h0, hs_start, stop_duty=stop_duty, max_length=max_len)
        # Vertical tubes on steam: a first march with Nusselt's mean coefficient gives
        # the condensate film along the tube; the second uses the local film law.
        half = (share[0], 0.5 * share[1])
        heating.use_mean_coefficient()
        first = Marcher(tube, heating, path, min(n, FILM_PROFILE_INCREMENTS),
                        progress=prog.part(*half), cancel=cancel).run(
            P0, h0, hs_start, stop_duty=stop_duty, max_length=max_len)
        if first.status != "ok":
            return first
        heating.use_condensate_profile(*condensate_film(first, tube, heating))
        second = (share[0] + half[1], half[1])
        return Marcher(tube, heating, path, n, progress=prog.part(*second), cancel=cancel).run(
            P0, h0, hs_start, stop_duty=stop_duty, max_length=max_len)

    try:
        if hs_inlet is None or case.heating.flow_arrangement == "co":
            outcome = march(hs_inlet, share=(0.0, 0.5 if case.required_duty else 1.0))
        else:
            outcome = _shoot_counter_current(case, fluid, heating, hs_inlet, march, P0)
        if outcome.status != "ok":
            return failed(case, outcome.message, methods=methods,
                          profiles=profiles_from_stations(outcome.stations))
        check = None
        if case.required_duty:
            check = _area_for_duty(case, heating, hs_inlet, march)
            if check.status != "ok":
                notes.append(check.message)
    except Cancelled:
        return cancelled(case, methods=methods)

    primary = check if (case.question == "area_for_duty" and check is not None
                        and check.status == "ok") else outcome
    summary = march_summary(case, tube, heating, hs_inlet, primary, outcome, check)
    warnings = checks.evaluate(case, primary, fluid=fluid, service="evaporator")
    if check is not None and check.status != "ok":
        warnings.append(note("duty-not-reached", check.message))
    if case.tubes.passes > 1 and hs_inlet is not None:
        warnings.append(warn("multipass-approximation", passes=case.tubes.passes))
    status = "warnings" if any(w.severity in ("warning", "error") for w in warnings) else "ok"
    message = "rated" if not notes else "; ".join(notes)
    return Result(case.name, case.type, status, message, summary,
                  profiles_from_stations(primary.stations), tuple(warnings),
                  with_substitutes(methods, primary), extra={"increments": n})


def _shoot_counter_current(case, fluid, heating, hs_inlet, march, P0):
    """Counter-current liquid: shoot on its outlet enthalpy at the boiling inlet."""
    T_cold = fluid.saturation(P0).T_sat if case.boiling.inlet_temperature is None \
        else case.boiling.inlet_temperature
    # The medium cannot leave colder than its own data reach (a table oil, a freezing brine).
    T_cold = max(T_cold, getattr(heating.fluid, "T_min", T_cold))
    h_low = heating.fluid.enthalpy(case.heating.pressure, T_cold)
    calls = [0]

    def one(h_start, increments=None):
        calls[0] += 1
        return march(h_start, share=(min(0.9, 0.08 * calls[0]), 0.08), increments=increments)

    # the shooting first with SHOOTING_INCREMENTS, then finished with the full count
    return solve_counter_current(one, h_low, hs_inlet,
                                 coarse=lambda h_start: one(h_start, SHOOTING_INCREMENTS))


def _area_for_duty(case, heating, hs_inlet, march):
    """March until the required duty is absorbed; the length it takes is the required area."""
    Q = case.required_duty
    if hs_inlet is None or case.heating.flow_arrangement == "co":
        return march(hs_inlet, stop_duty=Q, share=(0.5, 0.5))
    # Counter-current: the heating outlet (at z = 0) follows from the duty balance.
    h_out = heating.advance(hs_inlet, -Q)  # counter-current: the inlet back to the outlet
    try:
        heating.temperature(h_out)
    except PropertyError as exc:  # the duty would cool the medium out of its range
        return MarchOutcome([], "failed", f"the required duty {Q:.4g} W would cool the heating "
                            f"medium out of its range: {exc}")
    return march(h_out, stop_duty=Q, share=(0.5, 0.5))
