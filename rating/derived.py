"""What a rating took from its inputs besides the numbers typed: shown in every result.

* A pressure and its saturation temperature: whichever was given, both are shown
  (boiling inlet or column, and condensing steam).
* A kettle dimension left empty takes a published default; each one used is a warning
  naming its source.
* A mixture rated as a pseudo-pure fluid: a warning with its boiling range; a user
  saturation table: a note naming it and its range.
"""
from __future__ import annotations

import dataclasses

from .case import derived_fields
from .errors import PropertyError
from .results import RatingWarning

#: Boiling range [K] from which a mixture's pseudo-pure rating is a warning rather than a
#: note: beyond a few kelvin the rise of the bubble point along the path and the
#: mass-transfer penalty on boiling matter (common practice).
NARROW_BOILING_RANGE = 2.0


def _saturation_temperature(spec, P):
    from .properties import make_fluid

    try:
        return make_fluid(spec).T_sat(P)
    except PropertyError:
        return None


def inputs_shown(case) -> tuple[dict, list[RatingWarning]]:
    """Summary entries and warnings that describe the inputs a rating used."""
    from .properties import make_fluid

    b, hm = case.boiling, case.heating
    summary = {"boiling_pressure_Pa": b.inlet_pressure,
               "boiling_saturation_temperature_K": b.inlet_saturation_temperature
               or _saturation_temperature(b.fluid, b.inlet_pressure)}
    if hm.kind == "steam":
        summary["heating_pressure_Pa"] = hm.pressure
        summary["heating_saturation_temperature_K"] = hm.saturation_temperature \
            or _saturation_temperature(hm.fluid, hm.pressure)
    warnings = []
    if case.kettle is not None:
        for name in ("kettle_diameter", "port_diameter", "weir_height"):
            summary[f"{name}_m"] = getattr(case.kettle, name)
        for name, how in derived_fields(case.kettle).items():
            warnings.append(RatingWarning(
                "dimension-defaulted", "warning",
                f"kettle.{name} was not given: {getattr(case.kettle, name):.4g} m taken from "
                f"{how}; give the datasheet value to rate the real shell"))
    try:
        fluid = make_fluid(b.fluid)
    except PropertyError:
        return summary, warnings
    boiling_range = getattr(fluid, "boiling_range", None)
    if boiling_range is not None:
        span = boiling_range(b.inlet_pressure)
        summary["boiling_range_K"] = span
        warnings.append(RatingWarning(
            "mixture-as-pure-fluid", "warning" if span > NARROW_BOILING_RANGE else "info",
            f"{fluid.name} is rated as a pseudo-pure fluid: boiling at its bubble point, with "
            f"a boiling range (dew minus bubble point) of {span:.2f} K at the inlet pressure; "
            "the bubble point's rise along the path and the mass-transfer penalty on boiling "
            "are not modelled"))
    elif isinstance(b.fluid, dict):
        warnings.append(RatingWarning(
            "user-property-table", "info",
            f"boiling-side properties from the user's saturation table {fluid.name!r} "
            f"({fluid.T_min:.5g} to {fluid.T_max:.5g} K); methods that need fluid-specific "
            "constants (look-up tables, reference coefficients) have none for it"))
    return summary, warnings


def with_inputs_shown(case, result):
    """The result with the inputs' derived values in its summary and their warnings."""
    summary, warnings = inputs_shown(case)
    status = result.status
    if status == "ok" and any(w.severity != "info" for w in warnings):
        status = "warnings"
    return dataclasses.replace(result, status=status, summary={**result.summary, **summary},
                               warnings=result.warnings + tuple(warnings))
