"""What a rating took from its inputs besides the numbers typed: shown in every result.

* A pressure and its saturation temperature: whichever was given, both are shown
  (boiling inlet or column, and condensing steam).
* A kettle dimension left empty takes a published default; each one used is a warning
  naming its source.
* A mixture rated as a pseudo-pure fluid: a warning with its boiling range; a user
  saturation table: a note naming it and its range.
* A fixed film coefficient or a multiplier on a side's method: first in the method
  trail, and a warning, so that it is never forgotten in a file.
* A heat loss: the heating side gives up the process duty plus the loss. Condensing
  steam stays at its temperature, so only the steam condensed grows; a liquid medium
  cools by the larger duty along the march (``LiquidHeating.loss_share``). A fixed
  loss on a liquid is found as the share it is of the heating duty, by rating again
  until that share settles.
"""
from __future__ import annotations

import dataclasses

from .adjust import Adjustment, of_side
from .case import derived_fields
from .errors import PropertyError
from .results import MethodUsed, RatingWarning
from .rules import warn

#: Boiling range [K] from which a mixture's pseudo-pure rating is a warning rather than a
#: note: beyond a few kelvin the rise of the bubble point along the path and the
#: mass-transfer penalty on boiling matter (common practice).
NARROW_BOILING_RANGE = 2.0


def _adjustments(case):
    """(side, Adjustment) of each side whose coefficient the user set."""
    heating = of_side(case.heating)
    if case.kettle is not None and case.kettle.heating_htc is not None:
        heating = Adjustment(fixed=case.kettle.heating_htc)
    return [(side, a) for side, a in (("boiling", of_side(case.boiling)), ("heating", heating))
            if a.active]


def _saturation_temperature(spec, P):
    from .properties import make_fluid

    try:
        return make_fluid(spec).T_sat(P)
    except PropertyError:
        return None


def inputs_shown(case) -> tuple[dict, list[RatingWarning]]:
    """Summary entries and warnings that describe the inputs a rating used."""
    b, hm = case.boiling, case.heating
    summary = {"boiling_pressure_Pa": b.inlet_pressure,
               "boiling_saturation_temperature_K": b.inlet_saturation_temperature
               or _saturation_temperature(b.fluid, b.inlet_pressure)}
    if hm.kind == "steam":
        summary["heating_pressure_Pa"] = hm.pressure
        summary["heating_saturation_temperature_K"] = hm.saturation_temperature \
            or _saturation_temperature(hm.fluid, hm.pressure)
    warnings = []
    t = case.tubes
    if t.count % t.passes:
        warnings.append(warn("tubes-spread-over-passes", count=t.count, passes=t.passes,
                             per=t.tubes_per_pass, more=t.count // t.passes + 1,
                             fewer=t.count // t.passes))
    if case.kettle is not None:
        for name in ("kettle_diameter", "port_diameter", "weir_height"):
            summary[f"{name}_m"] = getattr(case.kettle, name)
        warnings += [warn("dimension-defaulted", name=name, how=how,
                          value=getattr(case.kettle, name))
                     for name, how in derived_fields(case.kettle).items()]
    warnings += [warn("coefficient-set-by-user", what=adjust.describe(
        f"the {side}-side", "the chosen method")) for side, adjust in _adjustments(case)]
    return summary, warnings + _fluid_notes(case, summary)


def _fluid_notes(case, summary) -> list[RatingWarning]:
    """A mixture rated as pseudo-pure (its boiling range into ``summary``), a user table."""
    from .properties import make_fluid

    b = case.boiling
    try:
        fluid = make_fluid(b.fluid)
    except PropertyError:
        return []
    boiling_range = getattr(fluid, "boiling_range", None)
    if boiling_range is not None:
        span = summary["boiling_range_K"] = boiling_range(b.inlet_pressure)
        kettle = ("; a kettle's mixture correction needs kettle.boiling_range"
                  if case.kettle is not None and not case.kettle.boiling_range else "")
        return [warn("mixture-as-pure-fluid", "warning" if span > NARROW_BOILING_RANGE
                     else "info", fluid=fluid.name, span=span, kettle=kettle)]
    if isinstance(b.fluid, dict):
        return [warn("user-property-table", name=repr(fluid.name), lo=fluid.T_min,
                     hi=fluid.T_max)]
    return []


#: Settling of the share of a fixed heat loss on a liquid medium, and the ratings allowed.
LOSS_SHARE_TOLERANCE = 1e-5
LOSS_RATINGS = 6


def rate_with_heat_loss(case, rate_case, **options):
    """Rate a case, its heating side giving up the heat loss on top of the process duty."""
    hm = case.heating
    if hm.kind == "steam" or not hm.heat_loss:
        return _heat_loss_shown(case, rate_case(case, **options))
    share = 0.0
    progress = options.pop("progress", None)
    for k in range(LOSS_RATINGS):
        trial = dataclasses.replace(case, heating=dataclasses.replace(
            hm, heat_loss=0.0, heat_loss_percent=100.0 * share))
        # the k-th rating reports within [1 - 2^-k, 1 - 2^-(k+1)]: never backwards
        part = None if progress is None else (
            lambda f, lo=1.0 - 0.5 ** k: progress(lo + 0.5 ** (k + 1) * min(max(f, 0.0), 1.0)))
        result = rate_case(trial, progress=part, **options)
        duty = result.summary.get("duty_W")
        if result.status == "failed" or duty is None:
            break
        settled = hm.heat_loss / (duty + hm.heat_loss)
        if abs(settled - share) < LOSS_SHARE_TOLERANCE:
            break
        share = settled
    if progress is not None:
        progress(1.0)
    return _heat_loss_shown(case, dataclasses.replace(result, name=case.name))


def _heat_loss_shown(case, result):
    hm = case.heating
    duty = result.summary.get("duty_W")
    if not (hm.heat_loss or hm.heat_loss_percent) or duty is None:
        return result
    loss = hm.heat_loss or duty * hm.heat_loss_percent / (100.0 - hm.heat_loss_percent)
    summary = dict(result.summary, heat_loss_W=loss)
    if hm.kind == "steam" and summary.get("duty_heating_side_W"):
        # the steam stays at its temperature: the loss only condenses more of it
        grow = (duty + loss) / duty
        summary["duty_heating_side_W"] *= grow
        if summary.get("steam_flow_kg_s") is not None:
            summary["steam_flow_kg_s"] *= grow
    return dataclasses.replace(result, summary=summary)


def with_inputs_shown(case, result):
    """The result with the inputs' derived values in its summary and their warnings."""
    summary, warnings = inputs_shown(case)
    trail = tuple(MethodUsed(f"{side}_coefficient", "user_fixed" if a.fixed is not None
                             else "user_multiplier", "user input (" + a.describe(
                                 side, "the chosen method") + ")", a.describe(side, "method"))
                  for side, a in _adjustments(case))
    result = dataclasses.replace(result, methods=trail + result.methods)
    status = result.status
    if status == "ok" and any(w.severity != "info" for w in warnings):
        status = "warnings"
    return dataclasses.replace(result, status=status, summary={**result.summary, **summary},
                               warnings=result.warnings + tuple(warnings))


def inlet_enthalpy(case, fluid) -> float:
    """The boiling stream's inlet specific enthalpy [J/kg], from its inlet temperature, or
    its quality at saturation (0 when neither is given)."""
    b = case.boiling
    if b.inlet_temperature is not None:
        return fluid.enthalpy(b.inlet_pressure, b.inlet_temperature)
    sat = fluid.saturation(b.inlet_pressure)
    return sat.h_l + (b.inlet_quality or 0.0) * sat.h_lv
