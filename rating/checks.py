"""Limits and warnings from a finished march.

Every threshold is a user-editable field of ``rating.case.Limits``; its default
and its source are listed in ``LIMIT_SOURCES`` so that the GUI and the report
can show where a number comes from. Warning codes are Ebullio's own.
"""
from __future__ import annotations

from .correlations import registry
from .correlations.pool_boiling import lienhard_dhir_1973, nucleate_fluid_constants
from .march import WETTED_REGIMES
from .results import RatingWarning

#: Default, unit and source of every editable threshold.
LIMIT_SOURCES = {
    "chf_ratio": (0.7, "-", "Keep the local heat flux below about 0.7 of the critical heat flux "
                  "(common practice; Sinnott, Coulson & Richardson Vol. 6, applies a 0.7 factor "
                  "to the Palen-Small maximum flux)"),
    "critical_quality": (None, "-", "User limit on the vapour quality at which dryout is "
                         "assumed; none by default (the critical heat flux decides)"),
    "min_nucleate_flux": (6300.0, "W/m^2", "Boiling stays nucleate when the flux is at least "
                          "about 2000 Btu/h ft^2 (6.3 kW/m^2) everywhere: 'Reboilers General "
                          "Guidelines', rules-of-thumb handbook"),
    "min_temperature_approach": (3.0, "K", "Smallest local difference between heating medium and "
                                 "boiling fluid before a pinch is reported (common practice)"),
    "kern_flux_cap": (None, "W/m^2", "Kern (1950), Process Heat Transfer ch. 15: 37.9 kW/m^2 "
                      "natural circulation with organics, 63 kW/m^2 forced circulation with "
                      "organics, 95 kW/m^2 aqueous; a screening cap, off by default"),
    # --- thermosiphon limits
    "thermosiphon_max_exit_quality": (0.25, "-", "Vertical thermosiphons are commonly designed "
                                      "for 5-25 wt% vapour at the outlet (a circulation ratio of "
                                      "5-20): Buckley, Luyben & Shunta, Design of Distillation "
                                      "Column Control Systems (1985), as reproduced on the web"),
    "thermosiphon_max_exit_quality_aqueous": (0.10, "-", "Aqueous thermosiphons run at an exit "
                                              "vapour mass fraction of about 0.02-0.10 (common "
                                              "practice, often attributed to Fair 1960)"),
    "thermosiphon_circulation_ratio_min": (5.0, "-", "Circulation ratio (kg through the tubes "
                                           "per kg of vapour made, 1 / exit quality) usually "
                                           "5-20: Buckley, Luyben & Shunta (1985)"),
    "thermosiphon_circulation_ratio_max": (20.0, "-", "Circulation ratio usually 5-20: Buckley, "
                                           "Luyben & Shunta (1985)"),
    "thermosiphon_max_flux": (None, "W/m^2", "Mean heat flux of a natural-circulation "
                              "reboiler; None applies Kern's limits (Process Heat Transfer, 1950, "
                              "ch. 15): 37.9 kW/m^2 (12,000 Btu/h ft^2) for organics, 94.6 kW/m^2 "
                              "(30,000) for water; conservative screening values"),
    "thermosiphon_level_min_fraction": (0.5, "-", "Column-base level between mid-height and the "
                                        "top tube sheet (flux is highest near 1/3 of the tube "
                                        "length and falls fast below): Buckley, Luyben & Shunta "
                                        "(1985)"),
    "thermosiphon_level_max_fraction": (1.0, "-", "Level at most at the top tube sheet; there the "
                                        "flux is some 10-15 % below its maximum: Buckley, Luyben "
                                        "& Shunta (1985)"),
    "thermosiphon_level_min_fraction_vacuum": (0.5, "-", "Below atmospheric pressure, a level of "
                                               "about 50-70 % of the tube length ('Thermosyphon "
                                               "reboiler', Chemical Engineering World)"),
    "thermosiphon_level_max_fraction_vacuum": (0.7, "-", "Below atmospheric pressure, a level of "
                                               "about 50-70 % of the tube length ('Thermosyphon "
                                               "reboiler', Chemical Engineering World)"),
    "thermosiphon_min_pressure": (30e3, "Pa", "Thermosiphons are not normally specified below "
                                  "about 0.3 bar: static head suppresses boiling (Sinnott, "
                                  "Coulson & Richardson Vol. 6; from memory)"),
    "thermosiphon_nozzle_rho_v2": (8928.0, "kg/m/s^2", "TEMA: tube-side nozzles rho v^2 <= "
                                   "6,000 lb/ft s^2 (8,928 kg/m s^2)"),
    "thermosiphon_max_subcooled_fraction": (0.25, "-", "Ebullio's default for a long sensible-"
                                            "heating zone: in a typical unit pure liquid fills "
                                            "only a few inches above the bottom tube sheet "
                                            "(Buckley, Luyben & Shunta 1985); static head "
                                            "lengthens the zone (Arneth & Stichlmair 2001)"),
    # --- kettle limits
    "kettle_bundle_flux_ratio": (1.0, "-", "Average bundle heat flux at most the bundle maximum "
                                 "flux (Palen 1983, single-tube maximum x bundle geometry factor; "
                                 "the Wolverine Engineering Data Book kettle example compares the "
                                 "two directly). Sinnott (Coulson & Richardson Vol. 6) designs to "
                                 "0.7 of the Palen-Small maximum"),
    "kettle_min_bundle_factor": (0.1, "-", "Palen's bundle geometry factor Phi_b below 0.1 calls "
                                 "for vapour lanes or a wider pitch (Wolverine Engineering Data "
                                 "Book, kettle example, after Palen & Small 1964)"),
    "kettle_surface_velocity_constant": (0.2, "m/s", "Vapour velocity at the liquid surface at "
                                         "most 0.2 [(rho_l - rho_v)/rho_v]^0.5 m/s against "
                                         "entrainment (Sinnott, Coulson & Richardson Vol. 6, "
                                         "eq. 12.75)"),
    "kettle_min_freeboard": (0.25, "m", "Freeboard between the liquid level and the top of the "
                             "kettle shell at least 0.25 m (Sinnott, Coulson & Richardson Vol. 6)"),
    "kettle_min_level_over_bundle": (0.0, "m", "The overflow weir holds the level so that it just "
                                     "covers the top of the bundle (common practice); uncovered "
                                     "tubes are rated as if submerged in the froth"),
    "kettle_vapour_nozzle_rho_v2": (5953.0, "kg/m/s^2", "TEMA RCB-4.62: rho v^2 at shell and "
                                    "bundle entrance and exit areas at most 4,000 lb/ft s^2 "
                                    "(5,953 kg/m s^2), applied at the vapour outlet"),
    "kettle_inlet_nozzle_rho_v2": (744.0, "kg/m/s^2", "TEMA RCB-4.61: impingement protection at "
                                   "the shell inlet above 500 lb/ft s^2 (744 kg/m s^2) for liquids "
                                   "at their boiling point"),
}


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
    lim = case.limits
    st = outcome.stations
    out: list[RatingWarning] = []
    if not st:
        return out

    # Dryout inside the tube.
    if outcome.dryout_z is not None:
        s = _first(st, lambda s: s.regime in ("post-dryout", "superheated vapour")) or st[-1]
        severity = "error" if s.x < 0.0 else "warning"
        t_wall = max(t.T_wall_inner for t in st)
        if outcome.dryout_cause == "complete evaporation":
            text = (f"the tube is dry from z = {outcome.dryout_z:.3f} m: the liquid is all "
                    "evaporated there (quality 1) with the wall still wet before it; downstream "
                    f"the vapour is superheated and the wall temperature rises to {t_wall:.1f} K")
        else:
            by = "the " + (outcome.dryout_cause or "critical heat flux")
            text = (f"dryout starts at z = {outcome.dryout_z:.3f} m (quality {max(s.x, 0.0):.3f}) "
                    f"where {by} is reached; downstream the wall is vapour-cooled and its "
                    f"temperature rises to {t_wall:.1f} K")
        out.append(RatingWarning("dryout", severity, text, outcome.dryout_z))

    # Heat flux close to critical before dryout.
    wet = [s for s in st if s.regime in WETTED_REGIMES]
    if wet:
        worst = max(wet, key=lambda s: s.chf_ratio)
        if worst.chf_ratio > lim.chf_ratio and outcome.dryout_z is None:
            out.append(RatingWarning(
                "chf-margin", "warning",
                f"local heat flux {worst.q:.4g} W/m^2 is {worst.chf_ratio:.2f} of the critical "
                f"heat flux {worst.q_chf:.4g} W/m^2 (limit {lim.chf_ratio:.2f})", worst.z))

    # Wall superheat in the film-boiling range (before dryout: after it the jump is expected).
    boiling = [s for s in wet if s.regime != "subcooled liquid" and s.q > 0.0]
    for s in boiling:
        dT_crit = critical_superheat(fluid.saturation(s.P), case.methods.nucleate_boiling, fluid)
        if s.wall_superheat > dT_crit:
            out.append(RatingWarning(
                "film-boiling-superheat", "warning",
                f"wall superheat {s.wall_superheat:.1f} K exceeds the critical superheat "
                f"{dT_crit:.1f} K of nucleate boiling: transition or film boiling is possible; "
                "a cooler or co-current heating medium, or lower steam pressure, would help", s.z))
            break

    # Heat flux below the minimum for stable nucleate boiling.
    nucleate = [s for s in boiling if s.regime in ("subcooled boiling", "saturated boiling")]
    if nucleate:
        low = min(nucleate, key=lambda s: s.q)
        if low.q < lim.min_nucleate_flux:
            severity = "info" if service == "evaporator" else "warning"
            out.append(RatingWarning(
                "low-flux", severity,
                f"heat flux falls to {low.q:.4g} W/m^2, below {lim.min_nucleate_flux:.4g} W/m^2 "
                "for stable nucleate boiling", low.z))

    # Temperature cross or pinch.
    approach = [(s.T_heating - s.T_process, s) for s in st]
    d_min, s_min = min(approach, key=lambda a: a[0])
    if d_min <= 0.0:
        out.append(RatingWarning(
            "temperature-cross", "error",
            f"the heating medium is {-d_min:.2f} K colder than the boiling fluid: no heat "
            "transfer beyond this point", s_min.z))
    elif d_min < lim.min_temperature_approach:
        out.append(RatingWarning(
            "pinch", "warning",
            f"temperature approach falls to {d_min:.2f} K (limit "
            f"{lim.min_temperature_approach:.2f} K)", s_min.z))

    # Kern's screening cap, if the user set one.
    if lim.kern_flux_cap is not None:
        top = max(st, key=lambda s: s.q_outer)
        if top.q_outer > lim.kern_flux_cap:
            out.append(RatingWarning(
                "kern-cap", "warning",
                f"heat flux {top.q_outer:.4g} W/m^2 above the Kern limit "
                f"{lim.kern_flux_cap:.4g} W/m^2 (a screening cap, not a CHF prediction)", top.z))

    # Correlations used outside their range, and methods used in place of the chosen one.
    for msg, z in outcome.range_notes.items():
        out.append(RatingWarning("method-range", "warning", msg + f" (first at z = {z:.3f} m)", z))
    for msg, z in getattr(outcome, "method_notes", {}).items():
        out.append(RatingWarning("method-substituted", "info", msg + f" (from z = {z:.3f} m)", z))
    return out


def _first(seq, pred):
    for s in seq:
        if pred(s):
            return s
    return None
