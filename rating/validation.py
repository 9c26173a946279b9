"""Input rules of a rating case: one set of checks for the engine, the CLI and the GUI.

Each ``check_*`` function is called by the ``__post_init__`` of the matching
dataclass in ``rating.case`` and raises ``InputError`` for the first problem found.
The message reads ``<field> = <value> <unit>: <rule>`` with the allowed range in the
rule, and ``InputError.field`` is the field name; the project loader puts the path
in front (``cases[0].tubes.outer_diameter = -0.02 m: must be > 0``).

A case is built from already-validated parts, so ``check_case`` checks its own
fields and the rules that join parts (shell needed by a liquid heating medium, the
bundle fitting its shell). Building a case needs no fluid properties: the rules that do
(pressures given as saturation temperatures, boiling point against heating temperature,
critical pressure, the methods a fluid allows) run once, in ``validate`` (called by
``rating.rate``, the project loader and the drafts), which reports every problem.
"""
from __future__ import annotations

import dataclasses
import math
import numbers

from .case import (
    BWG_THICKNESS, EXCHANGER_TYPES, FLOW_ARRANGEMENTS, HEATING_KINDS, ORIENTATIONS,
    QUESTIONS, TUBE_MATERIALS, BoilingStream, HeatingMedium, Limits, Methods, Shell, Tubes,
)
from .errors import InputError, PropertyError

MAX_PASSES = 16
LAYOUT_ANGLES = (30, 45, 60, 90)
BAFFLE_CUT = (0.15, 0.45)      # fraction of the shell inner diameter, common practice
MAX_FOULING = 0.01             # [m^2*K/W]; heavy-fouling TEMA values are below 0.002
#: The allowed number of increments along the heated length: the one rule for project
#: files, the command line and ``rating.rate`` (the catalogue's increments field reads it).
INCREMENTS = (10, 5000)
TABLE_KEYS = ("T", "cp", "rho", "mu", "k")  # user property table of a heating liquid
MAX_HEAT_LOSS_PERCENT = 50.0   # [%]; a unit that loses more is not rated as a heat exchanger
#: Hard ranges of a property table's columns: (unit, lo, hi), wide enough for any liquid
#: from liquid hydrogen to liquid metals and bitumen (common practice); values beyond them
#: are typing errors that would overflow the arithmetic.
TABLE_RANGES = {"T": ("K", 1.0, 2000.0), "cp": ("J/kg/K", 100.0, 1e5),
                "rho": ("kg/m^3", 10.0, 3e4), "mu": ("Pa*s", 1e-6, 1e3),
                "k": ("W/m/K", 0.01, 1000.0)}

FOULING_UNIT = "m^2*K/W"


# --- message helpers -------------------------------------------------------------

def _is_number(value) -> bool:
    return isinstance(value, numbers.Real) and not isinstance(value, bool)


def format_value(value, unit: str = "") -> str:
    """A value as the message shows it, with its unit when it is a number."""
    if _is_number(value):
        text = str(value) if isinstance(value, numbers.Integral) else f"{float(value):.6g}"
        return f"{text} {unit}" if unit else text
    text = repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


def _fail(name: str, value, unit: str, rule: str):
    raise InputError(f"{name} = {format_value(value, unit)}: {rule}", field=name)


def _number(name: str, value, unit: str) -> float:
    """A finite real number (not a bool, not text), else an error naming the unit."""
    if not _is_number(value):
        kind = "text" if isinstance(value, str) else type(value).__name__
        _fail(name, value, unit, f"must be a number{f' [{unit}]' if unit else ''}, not {kind}")
    if not math.isfinite(value):
        _fail(name, value, unit, "must be a finite number")
    return float(value)


def _positive(name: str, value, unit: str) -> float:
    v = _number(name, value, unit)
    if v <= 0.0:
        _fail(name, value, unit, "must be > 0")
    return v


def _non_negative(name: str, value, unit: str) -> float:
    v = _number(name, value, unit)
    if v < 0.0:
        _fail(name, value, unit, "must be >= 0")
    return v


def _between(name: str, value, unit: str, lo: float, hi: float, *,
             lo_closed: bool = True, hi_closed: bool = True, note: str = "") -> float:
    v = _number(name, value, unit)
    below = v < lo if lo_closed else v <= lo
    above = v > hi if hi_closed else v >= hi
    if below or above:
        rule = (f"must be {'>=' if lo_closed else '>'} {lo:g} and "
                f"{'<=' if hi_closed else '<'} {hi:g}{f' {unit}' if unit else ''}")
        _fail(name, value, unit, rule + (f" ({note})" if note else ""))
    return v


def _whole(name: str, value, lo: int, hi: int | None = None) -> int:
    """An integer (not a bool, not 3.0) in lo..hi."""
    if not isinstance(value, numbers.Integral) or isinstance(value, bool):
        _fail(name, value, "", "must be a whole number" + (f" from {lo} to {hi}" if hi else f" >= {lo}"))
    if value < lo or (hi is not None and value > hi):
        _fail(name, value, "", f"must be from {lo} to {hi}" if hi is not None else f"must be >= {lo}")
    return int(value)


def _text(name: str, value, what: str) -> str:
    if not isinstance(value, str):
        _fail(name, value, "", f"must be text ({what})")
    if not value.strip():
        _fail(name, value, "", f"must not be empty ({what})")
    return value


def _choice(name: str, value, choices) -> str:
    if not isinstance(value, str) or value not in choices:
        _fail(name, value, "", "must be one of " + ", ".join(repr(c) for c in choices))
    return value


def check_increments(value, name: str = "increments") -> int:
    """The number of increments, a whole number within INCREMENTS, else an InputError."""
    return _whole(name, value, *INCREMENTS)


def _optional(checker, name, value, *args, **kwargs):
    return None if value is None else checker(name, value, *args, **kwargs)


def _fouling(name: str, value) -> float:
    return _between(name, value, FOULING_UNIT, 0.0, MAX_FOULING, hi_closed=False)


# --- parts -----------------------------------------------------------------------

def check_tubes(tubes) -> None:
    """Tube count, geometry, wall, passes, material and layout of a ``Tubes``."""
    count = _whole("count", tubes.count, 1)
    _positive("length", tubes.length, "m")
    d_o = _positive("outer_diameter", tubes.outer_diameter, "m")

    if (tubes.wall_thickness is None) == (tubes.bwg is None):
        name = "bwg" if tubes.bwg is not None else "wall_thickness"
        _fail(name, getattr(tubes, name), "m" if name == "wall_thickness" else "",
              "give exactly one of wall_thickness [m] or bwg (gauge)")
    if tubes.bwg is not None:
        if (not isinstance(tubes.bwg, numbers.Integral) or isinstance(tubes.bwg, bool)
                or tubes.bwg not in BWG_THICKNESS):
            _fail("bwg", tubes.bwg, "", "must be one of the BWG gauges "
                  + ", ".join(str(g) for g in BWG_THICKNESS))
        name, value, unit, t = "bwg", tubes.bwg, "", BWG_THICKNESS[tubes.bwg]
    else:
        name, value, unit = "wall_thickness", tubes.wall_thickness, "m"
        t = _positive(name, value, unit)
    if d_o - 2.0 * t <= 0.0:
        _fail(name, value, unit,
              f"leaves an inner diameter outer_diameter - 2*thickness = {d_o - 2.0 * t:.4g} m;"
              f" the inner diameter must be > 0 and below the outer diameter, so the wall"
              f" must be thinner than {d_o / 2.0:.4g} m")

    passes = _whole("passes", tubes.passes, 1, MAX_PASSES)
    if passes > count:
        _fail("passes", passes, "", f"must be <= count ({count}) so that every pass has a tube")

    if tubes.wall_conductivity is not None:
        _positive("wall_conductivity", tubes.wall_conductivity, "W/m/K")
        _text("material", tubes.material, "a tube material name")
    elif not isinstance(tubes.material, str) or tubes.material not in TUBE_MATERIALS:
        _fail("material", tubes.material, "", "must be one of " + ", ".join(TUBE_MATERIALS)
              + " (or give wall_conductivity [W/m/K])")

    _non_negative("roughness", tubes.roughness, "m")
    _choice("orientation", tubes.orientation, ORIENTATIONS)
    if tubes.pitch is not None:
        pitch = _number("pitch", tubes.pitch, "m")
        if pitch <= d_o:
            _fail("pitch", tubes.pitch, "m",
                  f"must be > outer_diameter ({d_o:.4g} m), pitch/outer_diameter > 1;"
                  " usual ratios are 1.25 to 1.5")
    if (not _is_number(tubes.layout_angle) or tubes.layout_angle not in LAYOUT_ANGLES):
        _fail("layout_angle", tubes.layout_angle, "deg",
              "must be one of " + ", ".join(str(a) for a in LAYOUT_ANGLES) + " (degrees)")


def check_shell(shell) -> None:
    """Shell diameter, baffle spacing and cut, sealing strips of a ``Shell``."""
    _positive("inner_diameter", shell.inner_diameter, "m")
    _positive("baffle_spacing", shell.baffle_spacing, "m")
    _between("baffle_cut", shell.baffle_cut, "", *BAFFLE_CUT,
             note="fraction of the shell inner diameter")
    _whole("sealing_strip_pairs", shell.sealing_strip_pairs, 0)


def _derive(part, name: str, value, how: str) -> None:
    """Fill a field left empty with a value found from the others (``derived_fields``)."""
    object.__setattr__(part, name, value)
    object.__setattr__(part, "_derived", {**getattr(part, "_derived", {}), name: how})


def _pressure_or_saturation(part, p_name: str, t_name: str, role: str) -> None:
    """One of a pressure and its saturation temperature given, each > 0.

    The pressure of a given temperature is found when the case is validated
    (``_derive_pressure``): building a part needs no fluid properties.
    """
    P, T = getattr(part, p_name), getattr(part, t_name)
    if T is None and P is None:
        _fail(p_name, None, "", f"give {p_name} [Pa] or {t_name} [K] ({role})")
    _optional(_positive, t_name, T, "K")
    _optional(_positive, p_name, P, "Pa")


def _derive_pressure(part, p_name: str, t_name: str, fluid_spec) -> None:
    """The pressure of a given saturation temperature (``derived_fields``).

    A pressure given beside the temperature must be the temperature's own (a part
    copied with both); anything else is refused, since the two would disagree.
    """
    from .case import derived_fields
    from .properties import make_fluid

    P, T = getattr(part, p_name), getattr(part, t_name)
    if T is None:
        return
    try:
        fluid = make_fluid(fluid_spec)
        if not callable(getattr(fluid, "P_sat", None)):
            _fail(t_name, T, "K", f"{fluid_spec!r} has no saturation curve: give {p_name} [Pa]")
        P_T = float(fluid.P_sat(T))
    except PropertyError as exc:
        _fail(t_name, T, "K", str(exc))
    if P is not None and p_name not in derived_fields(part) and abs(P - P_T) > 1e-6 * P_T:
        _fail(p_name, P, "Pa", f"give {p_name} or {t_name}, not both: {fluid.name} "
              f"saturates at {T:.6g} K under {P_T:.6g} Pa")
    _derive(part, p_name, P_T, f"saturation pressure of {fluid.name} at {T:.6g} K")


#: Multipliers on a method's coefficient accepted: beyond them the method is not the
#: one rating the unit (a fixed coefficient says so plainly).
HTC_FACTOR = (0.05, 20.0)


def _coefficient_override(part) -> None:
    """A fixed film coefficient or a multiplier on the method, not both."""
    _optional(_positive, "htc_fixed", part.htc_fixed, "W/m^2/K")
    _between("htc_factor", part.htc_factor, "", *HTC_FACTOR,
             note="multiplier on the chosen method's coefficient; 1 leaves it as it is")
    if part.htc_fixed is not None and part.htc_factor != 1.0:
        _fail("htc_factor", part.htc_factor, "", "give a fixed coefficient (htc_fixed) or a "
              "multiplier on the method (htc_factor), not both")


def check_boiling(stream) -> None:
    """Fluid, flow, inlet state and fouling of a ``BoilingStream``."""
    from .fluid_table import check_table, is_saturation_table

    if is_saturation_table(stream.fluid):
        check_table(stream.fluid)
    else:
        _text("fluid", stream.fluid, "a fluid name")
    _optional(_positive, "mass_flow", stream.mass_flow, "kg/s")  # required by type: check_case
    _pressure_or_saturation(stream, "inlet_pressure", "inlet_saturation_temperature",
                            "the pressure at the inlet, or the column's")
    _coefficient_override(stream)
    _optional(_positive, "inlet_temperature", stream.inlet_temperature, "K")
    _optional(_between, "inlet_quality", stream.inlet_quality, "", 0.0, 1.0, hi_closed=False)
    if stream.inlet_temperature is not None and stream.inlet_quality is not None:
        _fail("inlet_quality", stream.inlet_quality, "",
              "give either inlet_temperature (subcooled) or inlet_quality (saturated), not both")
    _fouling("fouling_resistance", stream.fouling_resistance)


def _check_table(name: str, table) -> None:
    """A user property table {"T": [...], "cp": [...], ...} of a heating liquid."""
    if set(table) != set(TABLE_KEYS):
        _fail(name, table, "", "a property table needs exactly the keys " + ", ".join(TABLE_KEYS))
    n = None
    for key in TABLE_KEYS:
        column = table[key]
        if not isinstance(column, (list, tuple)) or len(column) < 2:
            _fail(f"{name}.{key}", column, "", "must be a list of at least 2 numbers")
        if n is not None and len(column) != n:
            _fail(f"{name}.{key}", column, "", f"must have as many values as {name}.T ({n})")
        n = len(column)
        unit, lo, hi = TABLE_RANGES[key]
        for i, v in enumerate(column):
            _between(f"{name}.{key}[{i}]", v, unit, lo, hi)
    if any(b <= a for a, b in zip(table["T"], table["T"][1:])):
        _fail(f"{name}.T", table["T"], "", "temperatures must rise strictly")


def check_heating(medium) -> None:
    """Kind, fluid, pressure, inlet state and arrangement of a ``HeatingMedium``."""
    kind = _choice("kind", medium.kind, HEATING_KINDS)
    if isinstance(medium.fluid, dict) and kind == "liquid":
        _check_table("fluid", medium.fluid)
    else:
        _text("fluid", medium.fluid, "a fluid name" + (" or a property table" if kind == "liquid" else ""))
    if kind == "steam":
        _pressure_or_saturation(medium, "pressure", "saturation_temperature",
                                "the condensing pressure")
    else:
        if medium.saturation_temperature is not None:
            _fail("saturation_temperature", medium.saturation_temperature, "K",
                  "only for a condensing heating medium; a liquid needs its pressure [Pa]")
        if medium.pressure is None:
            _fail("pressure", None, "", "a liquid heating medium needs its working pressure [Pa]")
        _positive("pressure", medium.pressure, "Pa")
    _between("heat_loss_percent", medium.heat_loss_percent, "%", 0.0, MAX_HEAT_LOSS_PERCENT,
             note="share of the heating side's duty lost to ambient")
    _non_negative("heat_loss", medium.heat_loss, "W")
    _coefficient_override(medium)
    if medium.heat_loss_percent and medium.heat_loss:
        _fail("heat_loss", medium.heat_loss, "W", "give heat_loss_percent or a fixed heat_loss, "
              "not both")
    _optional(_positive, "inlet_temperature", medium.inlet_temperature, "K")
    _optional(_positive, "mass_flow", medium.mass_flow, "kg/s")
    if kind == "liquid":
        if medium.inlet_temperature is None:
            _fail("inlet_temperature", None, "", "a liquid heating medium needs inlet_temperature [K]")
        if medium.mass_flow is None:
            _fail("mass_flow", None, "", "a liquid heating medium needs mass_flow [kg/s]")
    _choice("flow_arrangement", medium.flow_arrangement, FLOW_ARRANGEMENTS)
    _fouling("fouling_resistance", medium.fouling_resistance)


def check_methods(methods) -> None:
    """Each choice names a registered method of its own family."""
    from .correlations import registry

    for f in dataclasses.fields(methods):
        family, value = f.name, getattr(methods, f.name)
        if family == "tube_dryout" and value == "auto":
            continue
        method = registry.REGISTRY.get(value) if isinstance(value, str) else None
        if method is not None and method.family == family:
            continue
        choices = [m.name for m in registry.methods(family)]
        if family == "tube_dryout":
            choices.insert(0, "auto")
        rule = (f"must be one of the {family} methods: " + ", ".join(choices) if choices
                else f"no {family} method is registered")
        if method is not None:
            rule = f"is a {method.family} method; {rule}"
        _fail(family, value, "", rule)


def check_limits(limits) -> None:
    """Warning thresholds of a ``Limits``: each within its range (``rating.rules.LIMITS``,
    the one description of the limits), each band's lower end below its upper."""
    from .catalogue import QUANTITIES
    from .rules import LIMITS

    for lim in LIMITS.values():
        value = getattr(limits, lim.name)
        if value is None and getattr(type(limits), lim.name) is None:
            continue  # a limit that is off unless the user sets it
        unit = QUANTITIES[lim.quantity].replace("-", "")
        lo, hi = lim.hard
        if hi is None:
            (_positive if lim.hard_open[0] else _non_negative)(lim.name, value, unit)
        else:
            _between(lim.name, value, unit, lo, hi, lo_closed=not lim.hard_open[0],
                     hi_closed=not lim.hard_open[1], note=lim.label)
    for lo_name, hi_name in (
            ("thermosiphon_circulation_ratio_min", "thermosiphon_circulation_ratio_max"),
            ("thermosiphon_level_min_fraction", "thermosiphon_level_max_fraction"),
            ("thermosiphon_level_min_fraction_vacuum", "thermosiphon_level_max_fraction_vacuum")):
        lo, hi = getattr(limits, lo_name), getattr(limits, hi_name)
        if hi <= lo:
            _fail(hi_name, hi, "", f"must be > {lo_name} ({lo:g})")


# --- thermosiphon loop ---------------------------------------------------------------

#: Largest loss coefficient sum accepted for one line or singularity (a fully
#: throttled valve is of the order of 100-1000; beyond that the input is a mistake).
MAX_LOSS_K = 1000.0


def check_thermosiphon(loop) -> None:
    """Heights, line geometry, loss coefficients and nozzles of a ``ThermosiphonLoop``."""
    _positive("liquid_level", loop.liquid_level, "m")
    _positive("inlet_line_diameter", loop.inlet_line_diameter, "m")
    _non_negative("inlet_line_length", loop.inlet_line_length, "m")
    _positive("return_line_diameter", loop.return_line_diameter, "m")
    _non_negative("return_line_length", loop.return_line_length, "m")
    rise = _non_negative("return_line_rise", loop.return_line_rise, "m")
    if rise > loop.return_line_length:
        _fail("return_line_rise", rise, "m",
              f"must be <= return_line_length ({loop.return_line_length:g} m): the rise is part "
              "of the line's developed length")
    for name in ("inlet_line_k", "bottom_channel_k", "tube_entrance_k", "tube_exit_k",
                 "return_line_k"):
        _between(name, getattr(loop, name), "", 0.0, MAX_LOSS_K,
                 note="sum of loss coefficients on a velocity head")
    _optional(_positive, "inlet_nozzle_diameter", loop.inlet_nozzle_diameter, "m")
    _optional(_positive, "outlet_nozzle_diameter", loop.outlet_nozzle_diameter, "m")
    _between("line_roughness", loop.line_roughness, "m", 0.0, 0.01)


def _check_thermosiphon_case(case) -> None:
    """The rules that join a thermosiphon loop to its tubes and streams.

    A thermosiphon needs its loop data, as a kettle needs its shell data.
    """
    from .case import ThermosiphonLoop

    loop = case.thermosiphon
    if loop is None:
        _fail("thermosiphon", None, "", "a thermosiphon case needs its loop data (liquid level, "
              "inlet and return lines)")
    if not isinstance(loop, ThermosiphonLoop):
        _fail("thermosiphon", loop, "", "must be a ThermosiphonLoop")
    if case.tubes.orientation != "vertical":
        _fail("tubes.orientation", case.tubes.orientation, "",
              "a vertical thermosiphon needs vertical tubes")
    if case.tubes.passes != 1:
        _fail("tubes.passes", case.tubes.passes, "",
              "a vertical thermosiphon has one tube pass (boiling up-flow)")
    if case.boiling.inlet_quality:
        _fail("boiling.inlet_quality", case.boiling.inlet_quality, "",
              "a thermosiphon is fed with column-base liquid: give boiling.inlet_temperature "
              "for a subcooled column liquid, or neither for saturated liquid")
    L = case.tubes.length
    if loop.liquid_level > 2.0 * L:
        _fail("thermosiphon.liquid_level", loop.liquid_level, "m",
              f"must be <= 2 x the tube length ({2.0 * L:g} m) above the bottom tube sheet; "
              "usual levels are between mid-height and the top tube sheet (check the datum)")


# --- kettle shell --------------------------------------------------------------------

#: Passes for which the tube count can be estimated from the bundle diameter
#: (Phadke 1984, as implemented by ht.hx.Ntubes_Phadkeb).
KETTLE_COUNT_PASSES = (1, 2, 4, 6, 8)
#: Palen's bundle boiling factor F_b: 1 is a single tube; published values are about 1.5.
KETTLE_BUNDLE_FACTOR = (1.0, 3.0)
#: Boiling range accepted for the mixture correction [K]: beyond ~100 K a kettle is the
#: wrong exchanger (Perry's Handbook, sec. 11, thermal design of reboilers) and the empirical
#: factors are far outside their data.
KETTLE_MAX_BOILING_RANGE = 200.0
#: Inputs a mixture method may take in a kettle rating (the pool's state and flux).
KETTLE_MIXTURE_INPUTS = frozenset({"q", "htc_ideal", "boiling_range", "rho_l", "h_lv"})


def _registered(name: str, value, family: str, allowed_inputs=None) -> str:
    """The name of a registered method of ``family`` (whose inputs a kettle can supply)."""
    from .correlations import registry

    method = registry.REGISTRY.get(value) if isinstance(value, str) else None
    usable = [m.name for m in registry.methods(family)
              if allowed_inputs is None or set(m.inputs) <= allowed_inputs]
    if method is None or method.name not in usable:
        _fail(name, value, "", f"must be one of the {family} methods a kettle can use: "
              + ", ".join(usable))
    return value


def check_kettle(kettle) -> None:
    """Diameters, weir, nozzles and bundle-boiling options of a ``KettleShell``."""
    from .case import KETTLE_TUBE_FORMS

    from .case import KETTLE_DEFAULTS

    if kettle.bundle_diameter is None:
        _fail("bundle_diameter", None, "", "required: the outer tube limit of the bundle [m]")
    d_b = _positive("bundle_diameter", kettle.bundle_diameter, "m")
    for name in KETTLE_DEFAULTS:  # the given ones are numbers before defaults use them
        _optional(_positive, name, getattr(kettle, name), "m")
    for name, (rule, source) in KETTLE_DEFAULTS.items():
        if getattr(kettle, name) is None:
            _derive(kettle, name, rule(kettle), source)
    d_k = _positive("kettle_diameter", kettle.kettle_diameter, "m")
    d_p = _positive("port_diameter", kettle.port_diameter, "m")
    if d_p > d_k:
        _fail("port_diameter", d_p, "m", f"must be <= kettle_diameter ({d_k:g} m): the port "
              "shell opens into the larger kettle shell")
    if d_b >= d_p:
        _fail("bundle_diameter", d_b, "m", f"must be < port_diameter ({d_p:g} m): the bundle "
              "must fit the port shell")
    weir = _positive("weir_height", kettle.weir_height, "m")
    if weir >= d_k:
        _fail("weir_height", weir, "m", f"must be < kettle_diameter ({d_k:g} m), leaving a "
              "vapour space above the liquid")
    if weir <= kettle.bundle_bottom:
        _fail("weir_height", weir, "m", f"must be above the bottom of the bundle "
              f"({kettle.bundle_bottom:.4g} m = (port_diameter - bundle_diameter)/2): at this "
              "level no tube is submerged")
    _choice("tube_form", kettle.tube_form, KETTLE_TUBE_FORMS)
    if not isinstance(kettle.estimate_tube_count, bool):
        _fail("estimate_tube_count", kettle.estimate_tube_count, "", "must be true or false")
    for name in ("vapour_nozzle_diameter", "liquid_inlet_nozzle_diameter",
                 "liquid_outlet_nozzle_diameter"):
        d = _optional(_positive, name, getattr(kettle, name), "m")
        if d is not None and d >= d_k:
            _fail(name, d, "m", f"must be < kettle_diameter ({d_k:g} m)")
    _whole("vapour_nozzles", kettle.vapour_nozzles, 1, 20)
    _between("bundle_boiling_factor", kettle.bundle_boiling_factor, "", *KETTLE_BUNDLE_FACTOR,
             note="Palen's factor on the nucleate coefficient; 1.5 is the usual value")
    _between("boiling_range", kettle.boiling_range, "K", 0.0, KETTLE_MAX_BOILING_RANGE,
             note="dew minus bubble point of the pool liquid; 0 for a pure fluid")
    _registered("mixture_method", kettle.mixture_method, "mixture", KETTLE_MIXTURE_INPUTS)
    _registered("bundle_max_flux", kettle.bundle_max_flux, "bundle_chf")
    _optional(_positive, "heating_htc", kettle.heating_htc, "W/m^2/K")


def _check_kettle_case(case) -> None:
    """The rules that join a kettle shell to its tubes and streams."""
    from .case import KettleShell

    kettle, tubes = case.kettle, case.tubes
    if kettle is None:
        _fail("kettle", None, "", "required when type = 'kettle' (a KettleShell: kettle, port "
              "and bundle diameters and the weir height)")
    if not isinstance(kettle, KettleShell):
        _fail("kettle", kettle, "", "must be a KettleShell")
    if case.shell is not None:
        _fail("shell", case.shell, "", "must be None for a kettle: the heating medium is inside "
              "the tubes and the kettle shell is given by kettle")
    if tubes.orientation != "horizontal":
        _fail("tubes.orientation", tubes.orientation, "", "a kettle has a horizontal bundle")
    pitch = tubes.pitch if tubes.pitch is not None else 1.25 * tubes.outer_diameter
    if kettle.bundle_diameter < tubes.outer_diameter + pitch:
        _fail("kettle.bundle_diameter", kettle.bundle_diameter, "m",
              f"must be at least one tube and one pitch ({tubes.outer_diameter + pitch:.4g} m)")
    if kettle.tube_form == "u-tube":
        if tubes.passes % 2:
            _fail("tubes.passes", tubes.passes, "", "must be even for U-tubes (each U-tube "
                  "makes two passes)")
        if tubes.count % 2 and not kettle.estimate_tube_count:
            _fail("tubes.count", tubes.count, "", "must be even for U-tubes: count is the "
                  "number of tube ends in the tubesheet, two per U-tube")
    if kettle.estimate_tube_count and tubes.passes not in KETTLE_COUNT_PASSES:
        _fail("tubes.passes", tubes.passes, "", "the tube count can be estimated for "
              + ", ".join(map(str, KETTLE_COUNT_PASSES)) + " passes only; give the count")


# --- vendor figures -----------------------------------------------------------------

#: Unit and rule of each vendor figure (rating.vendor.VendorFigures).
_VENDOR_RULES = {
    "duty": ("W", "positive"), "area": ("m^2", "positive"),
    "u_clean": ("W/m^2/K", "positive"), "u_service": ("W/m^2/K", "positive"),
    "over_design": ("%", "over_design"),
    "pressure_drop_boiling": ("Pa", "non_negative"), "pressure_drop_heating": ("Pa", "non_negative"),
    "exit_quality": ("", "fraction"), "circulation_rate": ("kg/s", "positive"),
    "circulation_ratio": ("", "positive"), "max_heat_flux": ("W/m^2", "positive"),
    "heating_flow": ("kg/s", "positive"),
}
MAX_OVER_DESIGN = 1000.0       # [%]; a stated over-design beyond this is a typing error


def check_vendor(figures) -> None:
    """The figures of a ``VendorFigures`` (any subset; None = not stated)."""
    from .vendor import VendorTolerances

    _text("source", figures.source, "name the proposal: vendor, document, revision")
    for name, (unit, rule) in _VENDOR_RULES.items():
        value = getattr(figures, name)
        if value is None:
            continue
        if rule == "positive":
            _positive(name, value, unit)
        elif rule == "non_negative":
            _non_negative(name, value, unit)
        elif rule == "fraction":
            _between(name, value, unit, 0.0, 1.0, note="vapour mass fraction")
        else:
            _between(name, value, unit, -100.0, MAX_OVER_DESIGN, lo_closed=False)
    if not isinstance(figures.tolerances, VendorTolerances):
        _fail("tolerances", figures.tolerances, "", "must be a VendorTolerances")


def check_vendor_tolerances(tolerances) -> None:
    """Comparison bands: percent of Ebullio's value, points of over-design, absolute quality."""
    for f in dataclasses.fields(tolerances):
        unit, hi = {"over_design": ("points", 100.0), "exit_quality": ("", 1.0)}.get(
            f.name, ("%", 100.0))
        _between(f.name, getattr(tolerances, f.name), unit, 0.0, hi, lo_closed=False)


# --- the case ----------------------------------------------------------------------

def check_case(case) -> None:
    """Own fields of a ``Case`` and the rules that join its (validated) parts."""
    _text("name", case.name, "the case name")
    for name, cls in (("tubes", Tubes), ("boiling", BoilingStream), ("heating", HeatingMedium),
                      ("methods", Methods), ("limits", Limits)):
        if not isinstance(getattr(case, name), cls):
            _fail(name, getattr(case, name), "", f"must be a {cls.__name__}")
    if case.shell is not None and not isinstance(case.shell, Shell):
        _fail("shell", case.shell, "", "must be a Shell or None")
    from .vendor import VendorFigures
    if case.vendor is not None and not isinstance(case.vendor, VendorFigures):
        _fail("vendor", case.vendor, "", "must be a VendorFigures or None")
    _choice("type", case.type, EXCHANGER_TYPES)
    question = _choice("question", case.question, QUESTIONS)
    if question == "area_for_duty" and case.required_duty is None:
        _fail("required_duty", None, "", "the question 'area_for_duty' needs required_duty > 0 W")
    _optional(_positive, "required_duty", case.required_duty, "W")
    if case.increments is not None:
        check_increments(case.increments)
    if case.type != "thermosiphon" and case.boiling.mass_flow is None:
        _fail("boiling.mass_flow", None, "", f"required for type {case.type!r} [kg/s] "
              "(only a thermosiphon finds its own flow)")
    if case.type == "thermosiphon":
        _check_thermosiphon_case(case)
    if case.type == "kettle":
        _check_kettle_case(case)
        if case.kettle.heating_htc is not None and (case.heating.htc_fixed is not None
                                                    or case.heating.htc_factor != 1.0):
            _fail("heating.htc_fixed" if case.heating.htc_fixed is not None else
                  "heating.htc_factor", case.heating.htc_fixed or case.heating.htc_factor, "",
                  "kettle.heating_htc already fixes the tube-side coefficient: give one of them")
        if case.heating.kind == "liquid" and (case.heating.heat_loss
                                              or case.heating.heat_loss_percent):
            _fail("heating.heat_loss_percent" if case.heating.heat_loss_percent else
                  "heating.heat_loss", case.heating.heat_loss_percent or case.heating.heat_loss,
                  "", "a heat loss of a liquid in a kettle's tubes is not modelled (its tubes "
                  "lose heat only to the pool): leave it at 0")
    elif case.kettle is not None:
        _fail("kettle", case.kettle, "", "only for type = 'kettle'")
    if case.heating.kind == "liquid" and case.shell is None and case.type != "kettle":
        _fail("shell", None, "", "required when heating.kind = 'liquid' "
              "(the shell-side coefficient needs the shell and its baffles)")
    if case.type == "evaporator" and case.tubes.orientation == "vertical" and case.tubes.passes > 1:
        _fail("tubes.passes", case.tubes.passes, "", VERTICAL_PASSES_RULE)
    from .catalogue import check_hard_ranges  # every number within its catalogue range
    check_hard_ranges(case)
    _check_bundle_fits(case)


# --- the rules that need fluid properties: once, when the case is validated ------------------

def property_problems(case) -> list[InputError]:
    """Every problem of a built case that needs fluid properties, each naming its field.

    The pressures given as saturation temperatures are derived here (the case's parts are
    completed in place, ``derived_fields``); then the boiling and heating states, then
    the method choices the boiling fluid allows. A check that needs an earlier one's
    result runs only when that one passed.
    """
    problems: list[InputError] = []

    def run(check, *args, prefix=""):
        try:
            return check(*args) or True
        except InputError as exc:
            problems.append(exc.prefixed(prefix))
            return None

    sound = run(_derive_pressure, case.boiling, "inlet_pressure", "inlet_saturation_temperature",
                case.boiling.fluid, prefix="boiling")
    if case.heating.kind == "steam":
        sound = run(_derive_pressure, case.heating, "pressure", "saturation_temperature",
                    case.heating.fluid, prefix="heating") and sound
    if not sound:
        return problems
    boiling = run(_boiling_state, case)
    if boiling is not None:
        run(_heating_state, case, *boiling[1:])
        run(_check_method_choices, case, boiling[0])
    return problems


def validate(case):
    """The case, checked once for every rule that needs fluid properties (``rating.rate``,
    project files and drafts call it); raises ``InputError`` naming the first problem's
    field, with every problem in the message."""
    if getattr(case, "_validated", False):
        return case
    problems = property_problems(case)
    if problems:
        message = "; ".join(str(p) for p in problems)
        raise InputError(message, field=problems[0].field)
    object.__setattr__(case, "_validated", True)
    return case


#: Why a vertical evaporator has one tube pass: in a second pass the two-phase mixture flows
#: down, and neither its static head (recovered, not lost) nor the void-fraction, flow-pattern
#: and flow-boiling methods of down-flow are modelled; every method here was fitted to
#: up-flow or horizontal data.
VERTICAL_PASSES_RULE = (
    "a vertical evaporator is rated with one tube pass (boiling up-flow): in the even passes "
    "the two-phase mixture would flow down, and down-flow (its static head recovered, its void "
    "fraction and boiling coefficient) is not modelled by any method here; give passes = 1 "
    "(tubes.length is the length of one pass), or horizontal tubes")


#: A tube count above this multiple of the tubes that fit (Phadke 1984) is refused: the
#: approximate count pi D^2/(4 p^2) that books use overstates an exact layout by some
#: 10-20 % (the Wolverine kettle example: 360 tube ends where 320 fit), a wrong diameter
#: or unit by far more.
MAX_COUNT_OVER_LAYOUT = 1.5


def tubes_that_fit(limit_diameter: float, tubes) -> int:
    """Tube ends of this size, pitch and layout that fit an outer tube limit [m]
    (Phadke 1984, with pass-lane allowance; counted as one pass for odd pass counts)."""
    from ht.hx import Ntubes_Phadkeb

    if limit_diameter <= tubes.outer_diameter:
        return 0
    pitch = tubes.pitch if tubes.pitch is not None else 1.25 * tubes.outer_diameter
    passes = tubes.passes if tubes.passes in (1, 2, 4, 6, 8) else 1
    return int(Ntubes_Phadkeb(limit_diameter, tubes.outer_diameter, pitch, passes,
                              tubes.layout_angle))


def _check_bundle_fits(case) -> None:
    """The shell (or the kettle's bundle diameter) holds the tubes it is given."""
    tubes = case.tubes
    if case.type == "kettle" and case.kettle is not None:
        name, diameter = "kettle.bundle_diameter", case.kettle.bundle_diameter
        limit, what = diameter, "a bundle of outer tube limit"
        if case.kettle.estimate_tube_count:
            if tubes_that_fit(limit, tubes) < tubes.passes:
                _fail(name, diameter, "m", f"no tubes of {tubes.outer_diameter:g} m at this "
                      "pitch fit it: the bundle diameter is too small")
            return
    elif case.shell is not None:
        from .correlations.shell_side import fixed_tubesheet_bundle_clearance

        name, diameter = "shell.inner_diameter", case.shell.inner_diameter
        limit = diameter - fixed_tubesheet_bundle_clearance(diameter)
        what = "a shell of inner diameter"
    else:
        return
    fit = tubes_that_fit(limit, tubes)
    if tubes.count > MAX_COUNT_OVER_LAYOUT * fit:
        _fail(name, diameter, "m", f"{what} {diameter:g} m holds about {fit} tubes of "
              f"{tubes.outer_diameter:g} m at this pitch and layout (Phadke 1984), far fewer "
              f"than tubes.count = {tubes.count}: check the diameter, its unit and the count")


def _check_method_choices(case, fluid) -> None:
    """Every method choice the case's type evaluates can be fed and used there."""
    from .correlations import registry

    orientation = case.tubes.orientation
    for family in registry.families_evaluated(case.type, case.heating.kind):
        # the kettle's bundle limit is chosen on its shell, every other family in methods
        field = "kettle.bundle_max_flux" if family == "bundle_chf" else f"methods.{family}"
        part, _, attr = field.partition(".")
        name = getattr(getattr(case, part), attr)
        if family == "tube_dryout" and name == "auto":
            continue
        reason = registry.why_not(registry.get(name), case.type, orientation, fluid.cas)
        if reason is None:
            continue
        usable = [m.name for m in registry.applicable(family, case.type, orientation, fluid.cas)]
        if family == "tube_dryout":
            usable.insert(0, "auto")
        _fail(field, name, "",
              f"cannot be used for {'an' if case.type[0] in 'aeiou' else 'a'} {case.type} "
              f"with {orientation} tubes and {fluid.name}: "
              f"{reason}; choose one of " + ", ".join(usable))


def _fluid(name: str, value):
    from .properties import make_fluid

    try:
        return make_fluid(value)
    except PropertyError as exc:  # unknown name (with suggestions) or a bad concentration
        _fail(name, value, "", str(exc))


def _saturating(name: str, value, role: str):
    """A fluid that has a saturation curve (not an incompressible solution or a table)."""
    fluid = _fluid(name, value)
    if not hasattr(fluid, "P_crit"):
        _fail(name, value, "", f"{role} needs a pure fluid with a saturation curve, "
              "not an incompressible liquid")
    return fluid


def _t_sat(fluid, P: float, name: str) -> float:
    """Saturation temperature, any property failure reported on the pressure field."""
    try:
        if callable(getattr(fluid, "T_sat", None)):
            return float(fluid.T_sat(P))
        return float(fluid.saturation(P).T_sat)
    except PropertyError as exc:
        _fail(name, P, "Pa", str(exc))


def _boiling_state(case):
    """The boiling fluid, its saturation temperature at the inlet and the words for it."""
    boiling = case.boiling
    fluid = _saturating("boiling.fluid", boiling.fluid, "the boiling side")
    P = boiling.inlet_pressure
    if P >= fluid.P_crit:
        _fail("boiling.inlet_pressure", P, "Pa",
              f"no boiling above the critical pressure (P_crit = {fluid.P_crit:.6g} Pa)")
    T_sat = _t_sat(fluid, P, "boiling.inlet_pressure")
    try:  # the march needs the saturated transport properties, which some fluids lack
        fluid.saturation(P)
    except PropertyError as exc:
        _fail("boiling.fluid", boiling.fluid, "", f"{exc}; a rating needs the liquid and "
              "vapour viscosity, conductivity and surface tension: choose a fluid that has them")
    at = f"{T_sat:.5g} K at {P:.6g} Pa"
    if boiling.inlet_temperature is not None and boiling.inlet_temperature >= T_sat:
        _fail("boiling.inlet_temperature", boiling.inlet_temperature, "K",
              f"a subcooled inlet must be below the saturation temperature {at};"
              " for a saturated inlet give inlet_quality instead")
    return fluid, T_sat, at


def _heating_state(case, T_sat: float, at: str) -> None:
    """The heating medium hotter than the boiling point, within its fluid's range."""
    heating = case.heating
    if heating.kind == "steam":
        steam = _saturating("heating.fluid", heating.fluid, "a condensing heating medium (kind 'steam')")
        if heating.pressure >= steam.P_crit:
            _fail("heating.pressure", heating.pressure, "Pa",
                  f"condensing steam must be below the critical pressure (P_crit = {steam.P_crit:.6g} Pa)")
        T_hot = _t_sat(steam, heating.pressure, "heating.pressure")
        if T_hot <= T_sat:
            _fail("heating.pressure", heating.pressure, "Pa",
                  f"must be hotter than the boiling point {at}; steam at this pressure"
                  f" condenses at {T_hot:.5g} K")
        return
    medium = _fluid("heating.fluid", heating.fluid if isinstance(heating.fluid, str) else
                    {"name": "user table", "table": heating.fluid})
    try:
        medium.single_phase(heating.pressure, heating.inlet_temperature)
    except PropertyError as exc:
        _fail("heating.inlet_temperature", heating.inlet_temperature, "K", str(exc))
    if heating.inlet_temperature <= T_sat:
        _fail("heating.inlet_temperature", heating.inlet_temperature, "K",
              f"must be hotter than the boiling point {at}")
