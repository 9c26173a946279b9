"""Warnings from a finished march, common to every exchanger type.

Each check decides whether a rule of ``rating.rules`` fires and with which values; the
rules hold the codes, severities, limits with their sources and the messages.
"""
from __future__ import annotations

from .correlations import registry
from .correlations.pool_boiling import lienhard_dhir_1973, nucleate_fluid_constants
from .march import WETTED_REGIMES
from .results import RatingWarning
from .rules import note, warn


def critical_superheat(sat, nucleate_method: str, fluid=None) -> float:
    """Wall superheat at which nucleate pool boiling reaches the pool critical heat flux [K].

    q_max from Lienhard & Dhir's large-surface form (the pool_chf family's
    ``lienhard_dhir_1973``); the superheat is q_max / htc_nb(q_max) with the chosen
    nucleate method. Beyond it the boiling curve turns towards transition and film boiling.
    """
    q_max = lienhard_dhir_1973(sat.rho_l, sat.rho_v, sat.sigma, sat.h_lv)
    method = registry.get(nucleate_method)
    inputs, options = nucleate_fluid_constants(method, fluid) if fluid is not None else ({}, {})
    avail = dict(sat.as_dict(), q=q_max, **inputs)
    htc = method(avail, **options)
    return q_max / htc


def evaluate(case, outcome, *, fluid, service: str = "evaporator") -> list[RatingWarning]:
    """Warnings for a finished march (``outcome`` from ``rating.march``)."""
    st = outcome.stations
    if not st:
        return []
    wet = [s for s in st if s.regime in WETTED_REGIMES]
    boiling = [s for s in wet if s.regime != "subcooled liquid" and s.q > 0.0]
    out = _dryout(outcome) + _chf_margin(case, outcome, wet)
    out += _film_boiling(case, fluid, boiling) + _low_flux(case, boiling, service)
    out += _approach(case, st) + _kern_cap(case, st)
    out += [note("method-range", msg, z=z) for msg, z in outcome.range_notes.items()]
    out += [note("method-substituted", msg, z=z)
            for msg, z in getattr(outcome, "method_notes", {}).items()]
    return out


def _dryout(outcome) -> list[RatingWarning]:
    """Dryout inside the tube, however the march reached it."""
    st = outcome.stations
    if outcome.dryout_z is None:
        return []
    s = next((s for s in st if s.regime in ("post-dryout", "superheated vapour")), st[-1])
    t_wall = max(t.T_wall_inner for t in st)
    if outcome.dryout_cause == "complete evaporation":
        words = dict(what="the tube is dry from", why=": the liquid is all evaporated there "
                     "(quality 1) with the wall still wet before it",
                     wall="the vapour is superheated and the wall temperature")
    else:
        words = dict(what="dryout starts at", why=f" (quality {max(s.x, 0.0):.3f}) where the "
                     f"{outcome.dryout_cause or 'critical heat flux'} is reached",
                     wall="the wall is vapour-cooled and its temperature")
    return [warn("dryout", "error" if s.x < 0.0 else "warning", outcome.dryout_z,
                 t_wall=t_wall, **words)]


def _chf_margin(case, outcome, wet) -> list[RatingWarning]:
    """The heat flux close to critical before any dryout."""
    if not wet or outcome.dryout_z is not None:
        return []
    worst = max(wet, key=lambda s: s.chf_ratio)
    if worst.chf_ratio <= case.limits.chf_ratio:
        return []
    return [warn("chf-margin", z=worst.z, q=worst.q, ratio=worst.chf_ratio, q_chf=worst.q_chf,
                 limit=case.limits.chf_ratio)]


def _film_boiling(case, fluid, boiling) -> list[RatingWarning]:
    """Wall superheat in the film-boiling range (before dryout: after it the jump is
    expected); the first station only."""
    for s in boiling:
        dT_crit = critical_superheat(fluid.saturation(s.P), case.methods.nucleate_boiling, fluid)
        if s.wall_superheat > dT_crit:
            return [warn("film-boiling-superheat", z=s.z, dT=s.wall_superheat, dT_crit=dT_crit,
                         where=", the critical superheat of nucleate boiling",
                         remedy="a cooler or co-current heating medium, or lower steam "
                                "pressure, would help")]
    return []


def _low_flux(case, boiling, service) -> list[RatingWarning]:
    """A heat flux below the minimum for stable nucleate boiling."""
    nucleate = [s for s in boiling if s.regime in ("subcooled boiling", "saturated boiling")]
    if not nucleate:
        return []
    low = min(nucleate, key=lambda s: s.q)
    if low.q >= case.limits.min_nucleate_flux:
        return []
    return [warn("low-flux", "info" if service == "evaporator" else "warning", low.z, q=low.q,
                 limit=case.limits.min_nucleate_flux)]


def _approach(case, st) -> list[RatingWarning]:
    """A temperature cross, or a pinch below the smallest approach."""
    d_min, s_min = min(((s.T_heating - s.T_process, s) for s in st), key=lambda a: a[0])
    if d_min <= 0.0:
        return [warn("temperature-cross", z=s_min.z, dT=-d_min)]
    if d_min < case.limits.min_temperature_approach:
        return [warn("pinch", z=s_min.z, dT=d_min, limit=case.limits.min_temperature_approach)]
    return []


def _kern_cap(case, st) -> list[RatingWarning]:
    """Kern's screening cap on the heat flux, if the user set one."""
    cap = case.limits.kern_flux_cap
    top = max(st, key=lambda s: s.q_outer)
    if cap is None or top.q_outer <= cap:
        return []
    return [warn("kern-cap", z=top.z, q=top.q_outer, limit=cap)]
