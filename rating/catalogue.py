"""One description of every input field of a case and of every result key.

The desktop's forms, the report's datasheet, the CLI's tables, the studies'
field paths and the plausibility checks all derive from the tables here; no
other module writes a label, a unit or a range of an input or result by hand.

* ``INPUTS``: every field of a case by its path (``tubes.length``), in the order
  a datasheet is copied, with a label an engineer reads, the physical quantity
  (for unit conversion), the SI unit, a hard range (refused), a usual range
  (outside it a rating warns), the default, the choices and a line of help.
* ``SUMMARY`` and ``PROFILES``: every result key a rating can return.
* Drafts: a case as plain data (the project file's case object), checked all at
  once by ``draft_problems`` and changed by path with ``set_value``;
  ``with_value`` returns a new validated case.

Usual ranges are screening bounds of common practice (TEMA tube sizes, steam
and process pressures met in refineries and chemical plants); a value outside
one is not refused, only flagged so that a unit typed wrong (mm for m, degC
for K) never rates quietly.
"""
from __future__ import annotations

import copy
import dataclasses
import math
import numbers
from dataclasses import dataclass

from .case import (BWG_THICKNESS, EXCHANGER_TYPES, FLOW_ARRANGEMENTS, HEATING_KINDS,
                   KETTLE_TUBE_FORMS, ORIENTATIONS, QUESTIONS, TUBE_MATERIALS, BoilingStream,
                   Case, HeatingMedium, KettleShell, Limits, Methods, Shell,
                   ThermosiphonLoop, Tubes)
from .errors import InputError
from .validation import INCREMENTS as _INCREMENTS
from .vendor import TOLERANCE_BASIS, VendorFigures, VendorTolerances

#: Physical quantities and their SI units (the unit every value is stored in).
QUANTITIES = {
    "length": "m", "diameter": "m", "area": "m^2", "pressure": "Pa", "pressure_difference": "Pa",
    "temperature": "K", "temperature_difference": "K", "mass_flow": "kg/s",
    "mass_flux": "kg/m^2/s", "power": "W", "heat_flux": "W/m^2", "htc": "W/m^2/K",
    "fouling_resistance": "m^2*K/W", "conductivity": "W/m/K", "velocity": "m/s",
    "density": "kg/m^3", "momentum_flux": "kg/m/s^2", "dimensionless": "-",
    "fraction": "-", "percent": "%", "count": "-", "angle": "deg", "text": "",
    "choice": "", "flag": "",
}

#: What each exchanger type is called wherever it is named (the window, the report).
TYPE_TITLES = {"evaporator": "in-tube evaporator", "thermosiphon": "vertical thermosiphon reboiler",
               "kettle": "kettle reboiler"}

#: Groups of the datasheet, in the order an engineer copies one.
GROUPS = (
    ("service", "Service and question"), ("boiling", "Boiling side"),
    ("heating", "Heating side"), ("tubes", "Tubes"), ("shell", "Shell (heating side)"),
    ("kettle", "Kettle shell"), ("thermosiphon", "Thermosiphon loop"),
    ("methods", "Methods"), ("limits", "Limits"), ("vendor", "Vendor's figures"),
)

_GROUP_TITLES = dict(GROUPS)

ALL = EXCHANGER_TYPES
IN_TUBE = ("evaporator", "thermosiphon")

#: The case's parts: path prefix -> dataclass.
PARTS = {"tubes": Tubes, "shell": Shell, "boiling": BoilingStream, "heating": HeatingMedium,
         "methods": Methods, "limits": Limits, "thermosiphon": ThermosiphonLoop,
         "kettle": KettleShell, "vendor": VendorFigures, "vendor.tolerances": VendorTolerances}

#: Smallest and largest number of increments along the heated length (decided once, in
#: ``rating.validation``).
INCREMENTS = _INCREMENTS


@dataclass(frozen=True)
class InputField:
    """One input of a case. Values are SI; ``default`` None means "not given"."""

    path: str
    label: str
    quantity: str
    kind: str
    group: str
    default: object = None
    optional: bool = False
    hard: tuple | None = None
    usual: tuple | None = None
    choices: tuple | None = None
    help: str = ""
    types: tuple = ALL
    hard_open: tuple = (False, False)  # an end of the hard range excluded

    @property
    def unit(self) -> str:
        return QUANTITIES[self.quantity]

    @property
    def part(self) -> str | None:
        return self.path.split(".")[0] if "." in self.path else None

    @property
    def name(self) -> str:
        return self.path.rsplit(".", 1)[-1]

    def range_text(self, bounds=None) -> str:
        """``>= 0.5 and <= 12 m`` (the hard range, or ``bounds``) for messages and tooltips."""
        lo, hi = bounds if bounds is not None else (self.hard or (None, None))
        lo_open, hi_open = self.hard_open if bounds is None else (False, False)
        unit = f" {self.unit}" if self.unit not in ("", "-") else ""
        lo_text = f"{'>' if lo_open else '>='} {lo:g}" if lo is not None else ""
        hi_text = f"{'<' if hi_open else '<='} {hi:g}" if hi is not None else ""
        text = " and ".join(t for t in (lo_text, hi_text) if t)
        return text + unit if text else "any value"


def _defaults(cls) -> dict:
    out = {}
    for f in dataclasses.fields(cls):
        if f.default is not dataclasses.MISSING:
            out[f.name] = f.default
        elif f.default_factory is not dataclasses.MISSING:
            out[f.name] = f.default_factory()
    return out


_DEFAULTS = {part: _defaults(cls) for part, cls in PARTS.items()}
_DEFAULTS[""] = _defaults(Case)


def _field(path, label, quantity, group, help="", *, kind=None, optional=None, hard=None,
           usual=None, choices=None, types=ALL, hard_open=(False, False)):
    part, _, name = path.rpartition(".")
    defaults = _DEFAULTS[part]
    default = defaults.get(name)
    if optional is None:
        optional = name in defaults and defaults[name] is None
    if kind is None:
        kind = {"count": "integer", "text": "text", "choice": "choice", "flag": "flag"}.get(
            quantity, "number")
    return InputField(path, label, quantity, kind, group, default, optional, hard, usual,
                      choices, help, types, hard_open)


_POS = (0.0, None)
_OPEN_LO = (True, False)


def _limit_fields():
    """The editable warning limits, with their sources (``rating.rules.LIMITS``)."""
    from .rules import LIMITS

    return [_field(lim.path, lim.label, lim.quantity, "limits", lim.source, types=lim.types,
                   hard=lim.hard, hard_open=lim.hard_open) for lim in LIMITS.values()]


#: A vendor's stated figures: (name, label, quantity, hard, usual, types, help).
_VENDOR = (
    ("duty", "Duty", "power", _POS, (1e3, 2e8), ALL, "The duty the proposal states"),
    ("area", "Area (outside)", "area", _POS, (0.1, 5000.0), ALL,
     "Outside heat-transfer area the proposal states"),
    ("u_clean", "U clean", "htc", _POS, (50.0, 10000.0), ALL,
     "Overall coefficient without fouling, on the outside area"),
    ("u_service", "U service", "htc", _POS, (50.0, 10000.0), ALL,
     "Overall coefficient with fouling, on the outside area"),
    ("over_design", "Over-design", "percent", (-100.0, 1000.0), (-20.0, 100.0), ALL,
     "The margin the proposal states over the required duty"),
    ("pressure_drop_boiling", "Pressure drop, boiling side", "pressure_difference",
     (0.0, None), (0.0, 2e5), ALL, ""),
    ("pressure_drop_heating", "Pressure drop, heating side", "pressure_difference",
     (0.0, None), (0.0, 2e5), ALL, ""),
    ("exit_quality", "Exit vapour quality", "fraction", (0.0, 1.0), (0.0, 1.0), ALL,
     "Vapour mass fraction leaving the heated length"),
    ("circulation_rate", "Circulation", "mass_flow", _POS, (0.01, 1000.0), ("thermosiphon",),
     "Flow through the tubes of the thermosiphon"),
    ("circulation_ratio", "Circulation ratio", "dimensionless", _POS, (1.5, 50.0),
     ("thermosiphon",), "Circulation over vapour generated"),
    ("max_heat_flux", "Largest local heat flux", "heat_flux", _POS, (1e3, 3e5), ALL,
     "The largest local flux the unit runs at"),
    ("heating_flow", "Heating medium flow", "mass_flow", _POS, (0.005, 1000.0), ALL,
     "Steam condensed, or the heating liquid's flow"),
)
_OPEN = {"duty", "area", "u_clean", "u_service", "over_design", "circulation_rate",
         "circulation_ratio", "max_heat_flux", "heating_flow"}


def _vendor_fields():
    """A vendor's figures (all optional) and the tolerance of each comparison row."""
    out = [_field("vendor.source", "Proposal (vendor, document, revision)", "text", "vendor",
                  "Names the proposal whose figures are compared")]
    out += [_field(f"vendor.{name}", label, quantity, "vendor", help, hard=hard, usual=usual,
                   types=types, hard_open=_OPEN_LO if name in _OPEN else (False, False))
            for name, label, quantity, hard, usual, types, help in _VENDOR]
    for name, label, quantity, _hard, _usual, types, _help in _VENDOR:
        unit_word = {"over_design": " (points)", "exit_quality": " (absolute)"}.get(name, "")
        out.append(_field(f"vendor.tolerances.{name}", f"{label}: tolerance{unit_word}",
                          "fraction" if name == "exit_quality" else "percent", "vendor",
                          ("In percent of Ebullio's value. " if name not in
                           ("over_design", "exit_quality") else "") + TOLERANCE_BASIS[name],
                          types=types, hard_open=_OPEN_LO,
                          hard=(0.0, 1.0) if name == "exit_quality" else (0.0, 100.0)))
    return out


def vendor_label(figure: str) -> str:
    """The label of a vendor figure (``rating.vendor`` row name), as every surface shows it."""
    return input_field(f"vendor.{figure}").label


_METHOD_LABELS = {
    "flow_boiling": ("Flow boiling coefficient", IN_TUBE),
    "nucleate_boiling": ("Nucleate boiling coefficient", ALL),
    "two_phase_friction": ("Two-phase friction", IN_TUBE),
    "void_fraction": ("Void fraction", IN_TUBE),
    "tube_dryout": ("Dryout / critical heat flux in tubes", IN_TUBE),
    "single_phase_tube": ("Single-phase coefficient in tubes", ALL),
    "shell_side": ("Shell-side coefficient (liquid heating)", IN_TUBE),
}


def _method_fields():
    return [_field(f"methods.{name}", label, "choice", "methods",
                   f"Registry family '{name}'; the choices list the methods the engine can "
                   "feed for this exchanger type", types=types)
            for name, (label, types) in _METHOD_LABELS.items()]


_HOT = (250.0, 750.0)  # usual temperatures of process and heating streams [K]

INPUTS: tuple[InputField, ...] = tuple([
    # --- service and question
    _field("name", "Case name", "text", "service", "A name that is unique in the project"),
    _field("type", "Exchanger type", "choice", "service",
           "In-tube evaporator (forced flow), vertical thermosiphon reboiler or kettle reboiler",
           choices=EXCHANGER_TYPES),
    _field("question", "Question", "choice", "service",
           "performance: the duty this unit gives; the other question: the area needed for the "
           "required duty, and the over-design", choices=QUESTIONS),
    _field("required_duty", "Required duty", "power", "service",
           "The duty the unit must transfer to the process; with it a performance rating "
           "also gives the over-design", hard=(0.0, 1e10), usual=(1e3, 2e8),
           hard_open=_OPEN_LO),
    _field("increments", "Increments along the length", "count", "service",
           "Number of march increments per pass; empty: the engine's own choice",
           hard=INCREMENTS, usual=(20, 1000)),
    # --- boiling side
    _field("boiling.fluid", "Boiling fluid", "text", "boiling",
           "A pure fluid of the property library (e.g. n-Pentane, Water, R134a), a "
           "narrow-boiling mixture (Propane[0.95]&n-Butane[0.05], mole fractions) or a user "
           "saturation table (T, P, h_lv, densities, viscosities, conductivities, heat "
           "capacities, surface tension; critical pressure and molar mass)", kind="fluid"),
    _field("boiling.mass_flow", "Feed flow", "mass_flow", "boiling",
           "Process flow entering the heated length (not for a thermosiphon, whose flow is "
           "found from the loop's pressure balance)", hard=(0.0, 1e5), usual=(0.005, 500.0),
           hard_open=_OPEN_LO, types=("evaporator", "kettle")),
    _field("boiling.inlet_pressure", "Inlet / column pressure", "pressure", "boiling",
           "Absolute pressure at the tube inlet (thermosiphon: column vapour space; kettle: "
           "vapour space); or give the saturation temperature instead",
           hard=(0.0, 1e8), usual=(2e3, 6e6), hard_open=_OPEN_LO),
    _field("boiling.inlet_saturation_temperature", "Inlet / column boiling temperature",
           "temperature", "boiling",
           "Saturation temperature at the inlet or column pressure, in place of the pressure "
           "(which is then derived)", hard=(0.0, 2000.0), usual=_HOT, hard_open=_OPEN_LO),
    _field("boiling.inlet_temperature", "Inlet temperature (subcooled)", "temperature", "boiling",
           "Subcooled feed temperature; empty for saturated liquid or when a quality is given",
           hard=(0.0, 2000.0), usual=_HOT, hard_open=_OPEN_LO),
    _field("boiling.inlet_quality", "Inlet vapour quality", "fraction", "boiling",
           "Vapour mass fraction at the inlet (saturated feed); empty for liquid",
           hard=(0.0, 1.0), usual=(0.0, 0.5), hard_open=(False, True),
           types=("evaporator", "kettle")),
    _field("boiling.fouling_resistance", "Fouling resistance, boiling side", "fouling_resistance",
           "boiling", "TEMA-style fouling resistance on the boiling surface",
           hard=(0.0, 0.01), usual=(0.0, 0.002), hard_open=(False, True)),
    _field("boiling.htc_fixed", "Fixed boiling coefficient", "htc", "boiling",
           "A known boiling-side film coefficient in place of the methods, in every regime; "
           "empty: computed. The rating warns that it is set", hard=(0.0, 1e6),
           usual=(200.0, 50000.0), hard_open=_OPEN_LO),
    _field("boiling.htc_factor", "Multiplier on the boiling coefficient", "dimensionless",
           "boiling", "Scales the chosen methods' boiling-side coefficient (to match plant "
           "data); 1: as computed. The rating warns when it is not 1", hard=(0.05, 20.0),
           usual=(0.5, 2.0)),
    # --- heating side
    _field("heating.kind", "Heating medium", "choice", "heating",
           "Condensing steam (or another condensing vapour), or a single-phase liquid or gas",
           choices=HEATING_KINDS),
    _field("heating.fluid", "Heating fluid", "text", "heating",
           "Property-library name, an incompressible solution (INCOMP::MEG-30%) or a user "
           "property table (liquid only)", kind="fluid"),
    _field("heating.pressure", "Heating pressure", "pressure", "heating",
           "Steam: saturation pressure at the inlet (or give its saturation temperature "
           "instead). Liquid: working pressure",
           hard=(0.0, 1e8), usual=(1e4, 6e6), hard_open=_OPEN_LO),
    _field("heating.saturation_temperature", "Steam saturation temperature", "temperature",
           "heating", "Condensing temperature at the inlet, in place of the pressure (which is "
           "then derived)", hard=(0.0, 2000.0), usual=_HOT, hard_open=_OPEN_LO),
    _field("heating.inlet_temperature", "Heating inlet temperature", "temperature", "heating",
           "Inlet temperature of a liquid heating medium", hard=(0.0, 2000.0), usual=_HOT,
           hard_open=_OPEN_LO),
    _field("heating.mass_flow", "Heating flow", "mass_flow", "heating",
           "Liquid: required. Kettle on steam: empty means a steam trap (what condenses)",
           hard=(0.0, 1e5), usual=(0.005, 1000.0), hard_open=_OPEN_LO),
    _field("heating.flow_arrangement", "Flow arrangement", "choice", "heating",
           "Counter- or co-current with the boiling fluid", choices=FLOW_ARRANGEMENTS,
           types=IN_TUBE),
    _field("heating.fouling_resistance", "Fouling resistance, heating side", "fouling_resistance",
           "heating", "TEMA-style fouling resistance on the heating surface",
           hard=(0.0, 0.01), usual=(0.0, 0.002), hard_open=(False, True)),
    _field("heating.htc_fixed", "Fixed heating coefficient", "htc", "heating",
           "A known heating-side film coefficient (a vendor's or a test's) in place of the "
           "method; empty: computed. The rating warns that it is set", hard=(0.0, 1e6),
           usual=(300.0, 50000.0), hard_open=_OPEN_LO),
    _field("heating.htc_factor", "Multiplier on the heating coefficient", "dimensionless",
           "heating", "Scales the heating-side method's coefficient; 1: as computed. The "
           "rating warns when it is not 1", hard=(0.05, 20.0), usual=(0.5, 2.0)),
    _field("heating.heat_loss_percent", "Heat loss, share of the heating duty", "percent",
           "heating", "Part of the duty the heating side gives up that is lost to ambient "
           "instead of reaching the process; or give a fixed loss", hard=(0.0, 50.0),
           usual=(0.0, 10.0)),
    _field("heating.heat_loss", "Heat loss, fixed", "power", "heating",
           "Heat the heating side gives up that is lost to ambient; or give a share",
           hard=(0.0, 1e9), usual=(0.0, 1e6)),
    # --- tubes
    _field("tubes.count", "Number of tubes", "count", "tubes",
           "Tubes in the bundle (kettle U-tubes: tube ends in the tubesheet, two per U-tube)",
           hard=(1, 100000), usual=(1, 10000)),
    _field("tubes.length", "Heated length per pass", "length", "tubes",
           "Heated length of one tube pass", hard=(0.0, 30.0), usual=(0.5, 12.0),
           hard_open=_OPEN_LO),
    _field("tubes.outer_diameter", "Tube outside diameter", "diameter", "tubes",
           "Outside diameter of a tube", hard=(0.0, 0.2), usual=(0.006, 0.0635),
           hard_open=_OPEN_LO),
    _field("tubes.wall_thickness", "Wall thickness", "diameter", "tubes",
           "Tube wall thickness; give this or the BWG gauge", hard=(0.0, 0.03),
           usual=(0.0005, 0.006), hard_open=_OPEN_LO),
    _field("tubes.bwg", "Wall gauge (BWG)", "count", "tubes",
           "Birmingham Wire Gauge of the wall; give this or the wall thickness",
           choices=tuple(BWG_THICKNESS)),
    _field("tubes.passes", "Tube passes", "count", "tubes",
           "Tube-side passes; a tube count they do not divide is spread evenly over them",
           hard=(1, 16), usual=(1, 8)),
    _field("tubes.material", "Tube material", "choice", "tubes",
           "Sets the wall conductivity (Incropera & DeWitt Table A.1)",
           choices=tuple(TUBE_MATERIALS)),
    _field("tubes.wall_conductivity", "Wall conductivity (overrides material)", "conductivity",
           "tubes", "Thermal conductivity of the tube wall", hard=(0.0, 1000.0),
           usual=(5.0, 420.0), hard_open=_OPEN_LO),
    _field("tubes.roughness", "Inside roughness", "diameter", "tubes",
           "Absolute roughness of the inside surface (drawn tube 1.5e-6 m, commercial steel "
           "4.5e-5 m: Moody 1944)", hard=(0.0, 0.005), usual=(0.0, 5e-4)),
    _field("tubes.orientation", "Orientation", "choice", "tubes",
           "Vertical up-flow or horizontal tubes", choices=ORIENTATIONS, types=("evaporator",)),
    _field("tubes.pitch", "Tube pitch", "diameter", "tubes",
           "Centre-to-centre distance; empty: 1.25 x the outside diameter (common practice)",
           hard=(0.0, 0.5), usual=(0.008, 0.1), hard_open=_OPEN_LO),
    _field("tubes.layout_angle", "Layout angle", "angle", "tubes",
           "30 or 60 triangular, 45 rotated square, 90 square", kind="choice",
           choices=(30, 45, 60, 90)),
    # --- shell (liquid heating of an in-tube unit)
    _field("shell.inner_diameter", "Shell inside diameter", "length", "shell",
           "Inside diameter of the E-shell", hard=(0.0, 5.0), usual=(0.15, 2.5),
           hard_open=_OPEN_LO, types=IN_TUBE),
    _field("shell.baffle_spacing", "Baffle spacing", "length", "shell",
           "Central baffle spacing", hard=(0.0, 10.0), usual=(0.05, 2.0), hard_open=_OPEN_LO,
           types=IN_TUBE),
    _field("shell.baffle_cut", "Baffle cut", "fraction", "shell",
           "Segmental baffle cut as a fraction of the shell diameter", hard=(0.15, 0.45),
           usual=(0.2, 0.35), types=IN_TUBE),
    _field("shell.sealing_strip_pairs", "Sealing strip pairs", "count", "shell",
           "Pairs of sealing strips (Bell-Delaware bypass correction)", hard=(0, 50),
           usual=(0, 10), types=IN_TUBE),
    # --- kettle shell
    _field("kettle.bundle_diameter", "Bundle diameter (outer tube limit)", "length", "kettle",
           "Outer tube limit of the bundle", hard=(0.0, 10.0), usual=(0.1, 3.0),
           hard_open=_OPEN_LO, types=("kettle",), optional=False),
    _field("kettle.kettle_diameter", "Kettle shell inside diameter", "length", "kettle",
           "Inside diameter of the enlarged shell; empty: bundle diameter / 0.6 (Wolverine "
           "Engineering Data Book II), with a warning", hard=(0.0, 10.0), usual=(0.3, 4.0),
           hard_open=_OPEN_LO, types=("kettle",)),
    _field("kettle.port_diameter", "Port shell inside diameter", "length", "kettle",
           "Inside diameter of the port (bundle) shell; empty: bundle diameter plus a U-tube "
           "bundle's clearance (Sinnott Fig. 12.10), with a warning", hard=(0.0, 10.0),
           usual=(0.15, 3.0), hard_open=_OPEN_LO, types=("kettle",)),
    _field("kettle.weir_height", "Weir height", "length", "kettle",
           "Top of the overflow weir above the kettle bottom; empty: 50 mm over the bundle "
           "(common practice), with a warning", hard=(0.0, 10.0),
           usual=(0.1, 3.5), hard_open=_OPEN_LO, types=("kettle",)),
    _field("kettle.tube_form", "Tube form", "choice", "kettle", "U-tubes or straight tubes",
           choices=KETTLE_TUBE_FORMS, types=("kettle",)),
    _field("kettle.estimate_tube_count", "Estimate the tube count", "flag", "kettle",
           "Replace the tube count by the number that fits the bundle (Phadke 1984)",
           types=("kettle",)),
    _field("kettle.vapour_nozzle_diameter", "Vapour nozzle inside diameter", "diameter", "kettle",
           "Each vapour outlet; empty: not checked", hard=(0.0, 3.0), usual=(0.05, 1.0),
           hard_open=_OPEN_LO, types=("kettle",)),
    _field("kettle.vapour_nozzles", "Vapour nozzles", "count", "kettle",
           "Number of vapour outlets", hard=(1, 20), usual=(1, 4), types=("kettle",)),
    _field("kettle.liquid_inlet_nozzle_diameter", "Liquid inlet nozzle inside diameter",
           "diameter", "kettle", "Feed inlet; empty: not checked", hard=(0.0, 3.0),
           usual=(0.02, 0.6), hard_open=_OPEN_LO, types=("kettle",)),
    _field("kettle.liquid_outlet_nozzle_diameter", "Liquid outlet nozzle inside diameter",
           "diameter", "kettle", "Overflow outlet; empty: not checked", hard=(0.0, 3.0),
           usual=(0.02, 0.6), hard_open=_OPEN_LO, types=("kettle",)),
    _field("kettle.bundle_boiling_factor", "Bundle boiling factor F_b", "dimensionless",
           "kettle", "Palen's factor on the nucleate coefficient for a bundle (1.5 usual)",
           hard=(1.0, 3.0), usual=(1.0, 2.0), types=("kettle",)),
    _field("kettle.boiling_range", "Boiling range", "temperature_difference", "kettle",
           "Dew minus bubble point of the pool liquid; 0 for a pure fluid",
           hard=(0.0, 200.0), usual=(0.0, 30.0), types=("kettle",)),
    _field("kettle.mixture_method", "Mixture correction", "choice", "kettle",
           "Correction of the nucleate coefficient for a boiling range", types=("kettle",)),
    _field("kettle.bundle_max_flux", "Bundle maximum flux", "choice", "kettle",
           "Method for the bundle's maximum heat flux", types=("kettle",)),
    _field("kettle.heating_htc", "Fixed tube-side coefficient", "htc", "kettle",
           "A known inside film coefficient in place of the in-tube correlation; empty: computed",
           hard=(0.0, 1e6), usual=(300.0, 50000.0), hard_open=_OPEN_LO, types=("kettle",)),
    # --- thermosiphon loop
    _field("thermosiphon.liquid_level", "Column liquid level", "length", "thermosiphon",
           "Column liquid surface above the bottom tube sheet (the driving head)",
           hard=(0.0, 60.0), usual=(0.3, 10.0), hard_open=_OPEN_LO, types=("thermosiphon",)),
    _field("thermosiphon.inlet_line_diameter", "Inlet line inside diameter", "diameter",
           "thermosiphon", "Inside diameter of the line from the column to the reboiler",
           hard=(0.0, 3.0), usual=(0.025, 1.0), hard_open=_OPEN_LO, types=("thermosiphon",)),
    _field("thermosiphon.inlet_line_length", "Inlet line length", "length", "thermosiphon",
           "Developed length of the inlet line", hard=(0.0, 500.0), usual=(0.0, 50.0),
           types=("thermosiphon",)),
    _field("thermosiphon.inlet_line_k", "Inlet line loss coefficient K", "dimensionless",
           "thermosiphon", "Entrance plus fittings, on the line's velocity head",
           hard=(0.0, 1000.0), usual=(0.0, 20.0), types=("thermosiphon",)),
    _field("thermosiphon.inlet_nozzle_diameter", "Inlet nozzle inside diameter", "diameter",
           "thermosiphon", "Empty: the inlet line's", hard=(0.0, 3.0), usual=(0.025, 1.0),
           hard_open=_OPEN_LO, types=("thermosiphon",)),
    _field("thermosiphon.bottom_channel_k", "Bottom channel loss K", "dimensionless",
           "thermosiphon", "Expansion into the channel, on the nozzle velocity head",
           hard=(0.0, 1000.0), usual=(0.0, 5.0), types=("thermosiphon",)),
    _field("thermosiphon.tube_entrance_k", "Tube entrance loss K", "dimensionless",
           "thermosiphon", "Contraction into the tubes", hard=(0.0, 1000.0), usual=(0.0, 5.0),
           types=("thermosiphon",)),
    _field("thermosiphon.tube_exit_k", "Tube exit loss K", "dimensionless", "thermosiphon",
           "Expansion into the top channel", hard=(0.0, 1000.0), usual=(0.0, 5.0),
           types=("thermosiphon",)),
    _field("thermosiphon.outlet_nozzle_diameter", "Outlet nozzle inside diameter", "diameter",
           "thermosiphon", "Empty: the return line's", hard=(0.0, 3.0), usual=(0.025, 1.5),
           hard_open=_OPEN_LO, types=("thermosiphon",)),
    _field("thermosiphon.return_line_diameter", "Return line inside diameter", "diameter",
           "thermosiphon", "Inside diameter of the two-phase return line", hard=(0.0, 3.0),
           usual=(0.025, 1.5), hard_open=_OPEN_LO, types=("thermosiphon",)),
    _field("thermosiphon.return_line_length", "Return line length", "length", "thermosiphon",
           "Developed length of the return line", hard=(0.0, 500.0), usual=(0.0, 50.0),
           types=("thermosiphon",)),
    _field("thermosiphon.return_line_rise", "Return line rise", "length", "thermosiphon",
           "Return nozzle on the column above the top tube sheet", hard=(0.0, 100.0),
           usual=(0.0, 10.0), types=("thermosiphon",)),
    _field("thermosiphon.return_line_k", "Return line loss coefficient K", "dimensionless",
           "thermosiphon", "Nozzle entry, discharge and fittings", hard=(0.0, 1000.0),
           usual=(0.0, 20.0), types=("thermosiphon",)),
    _field("thermosiphon.line_roughness", "Line roughness", "diameter", "thermosiphon",
           "Absolute roughness of the lines (commercial steel 4.6e-5 m, Moody 1944)",
           hard=(0.0, 0.01), usual=(0.0, 5e-4), types=("thermosiphon",)),
    *_method_fields(),
    *_limit_fields(),
    *_vendor_fields(),
])

_BY_PATH = {f.path: f for f in INPUTS}


def input_field(path: str) -> InputField:
    """The description of the input at ``path`` (KeyError naming the known paths)."""
    try:
        return _BY_PATH[path]
    except KeyError:
        raise KeyError(f"no input field {path!r}") from None


def inputs_for(case_type: str) -> tuple[InputField, ...]:
    return tuple(f for f in INPUTS if case_type in f.types)


# --- drafts: a case as plain data --------------------------------------------------------

def case_to_draft(case) -> dict:
    """The plain data of a case: the project file's case object (SI)."""
    from .project import to_dict

    return to_dict(case)


def draft_to_case(draft: dict):
    """A validated ``Case`` from a draft; raises ``InputError`` with the field path."""
    from .project import from_dict
    from .validation import validate

    return validate(from_dict(draft, Case))


def get_value(draft_or_case, path: str):
    """The value at ``path`` of a draft (dict) or a case; None where a part is absent."""
    obj = draft_or_case
    for key in path.split("."):
        if obj is None:
            return None
        obj = obj.get(key) if isinstance(obj, dict) else getattr(obj, key, None)
    return obj


def set_value(draft: dict, path: str, value) -> dict:
    """A new draft with ``path`` set to ``value``; a missing part is created."""
    new = copy.deepcopy(draft)
    keys = path.split(".")
    obj = new
    for key in keys[:-1]:
        if not isinstance(obj.get(key), dict):
            obj[key] = {}
        obj = obj[key]
    obj[keys[-1]] = value
    return new


def with_value(case, path: str, value):
    """A new validated case with the input at ``path`` set to ``value`` (SI)."""
    input_field(path)
    return draft_to_case(set_value(case_to_draft(case), path, value))


def numeric_paths(case_type: str) -> list[str]:
    """Input paths a study may vary for this exchanger type (not the limits, not a
    vendor's stated figures: neither changes the rating)."""
    return [f.path for f in inputs_for(case_type) if f.kind in ("number", "integer")
            and f.group not in ("limits", "vendor")]


# --- which fields apply ------------------------------------------------------------------

def applies(field: InputField | str, draft: dict) -> bool:
    """Whether a field has a meaning for this draft (its type and its other choices)."""
    f = input_field(field) if isinstance(field, str) else field
    kind = get_value(draft, "type") or "evaporator"
    if kind not in f.types:
        return False
    heating = get_value(draft, "heating.kind") or "steam"
    p = f.path
    if f.group == "vendor":
        return isinstance(get_value(draft, "vendor"), dict)
    if f.group == "shell":
        return heating == "liquid"
    if p in ("heating.inlet_temperature",):
        return heating == "liquid"
    if p == "heating.saturation_temperature":
        return heating == "steam"
    if p == "heating.htc_fixed":  # a kettle's is kettle.heating_htc
        return kind != "kettle"
    if p == "heating.mass_flow":
        return heating == "liquid" or kind == "kettle"
    if p == "heating.flow_arrangement":
        return heating == "liquid"
    if p in ("tubes.pitch", "tubes.layout_angle"):
        return kind == "kettle" or heating == "liquid"
    if p == "methods.shell_side":
        return heating == "liquid"
    if p == "boiling.inlet_quality":
        return get_value(draft, "boiling.inlet_temperature") is None
    return True


def _fluid_cas(draft: dict) -> str | None:
    """The boiling fluid's CAS number (methods fitted to some fluids only), if it has one."""
    from .errors import RatingError
    from .properties import make_fluid

    spec = get_value(draft, "boiling.fluid")
    if not spec or not isinstance(spec, (str, dict)):
        return None
    try:  # the same object validation asks (a user's table has an empty CAS number)
        return getattr(make_fluid(spec), "cas", None)
    except (RatingError, ValueError, TypeError, KeyError):
        return None


def method_choices(path: str, draft: dict) -> list[tuple[str, str, str]]:
    """(name, title, reference) of the methods the engine accepts at ``path`` for this draft."""
    from .correlations import registry

    part, _, family = path.partition(".")
    kind = get_value(draft, "type") or "evaporator"
    orientation = get_value(draft, "tubes.orientation") or "vertical"
    if path == "kettle.mixture_method":  # any mixture correction the kettle can feed
        from .validation import KETTLE_MIXTURE_INPUTS

        methods = [m for m in registry.methods("mixture")
                   if set(m.inputs) <= KETTLE_MIXTURE_INPUTS]
    else:
        if path == "kettle.bundle_max_flux":
            family = "bundle_chf"
        methods = registry.applicable(family, kind, orientation, _fluid_cas(draft))
    out = [(m.name, m.title, m.reference) for m in methods]
    if family == "tube_dryout":
        out.insert(0, ("auto", "Automatic: 2006 look-up table for water, Katto-Ohno otherwise",
                       "Groeneveld et al. (2007), Nucl. Eng. Des. 237; Katto & Ohno (1984), "
                       "Int. J. Heat Mass Transfer 27"))
    return out


# --- checks of a draft -------------------------------------------------------------------

@dataclass(frozen=True)
class Problem:
    """One problem of a draft: the field's path, a message, and "error" or "warning"."""

    path: str
    message: str
    severity: str = "error"


def _is_number(v) -> bool:
    return isinstance(v, numbers.Real) and not isinstance(v, bool)


def _show(v, unit) -> str:
    from .validation import format_value

    return format_value(v, "" if unit == "-" else unit)


#: A positive value of a field whose hard range is open at zero must be at least this
#: share of the range's top: anything smaller is a slip of the unit or the exponent, and
#: values near the floating-point floor (5e-324) overflow the arithmetic.
SMALLEST_SHARE = 1e-9


def smallest(f: InputField) -> float | None:
    """The least positive value a field open at zero accepts, or None."""
    if f.hard is None or not f.hard_open[0] or f.hard[0] != 0 or f.hard[1] is None:
        return None
    return f.hard[1] * SMALLEST_SHARE


def field_problem(f: InputField, value) -> Problem | None:
    """The hard-range problem of one value, or None (kind, finiteness, range)."""
    if value is None:
        if f.optional:
            return None
        return Problem(f.path, f"{f.label} ({f.path}): required", "error")
    if f.kind in ("number", "integer"):
        try:
            ok = _is_number(value) and math.isfinite(value)
        except OverflowError:  # an integer too large for a float
            ok = False
        if not ok:
            return Problem(f.path, f"{f.path} = {_show(value, f.unit)}: must be a finite number"
                           + (f" [{f.unit}]" if f.unit not in ("", "-") else ""), "error")
        if f.kind == "integer" and not isinstance(value, numbers.Integral):
            return Problem(f.path, f"{f.path} = {_show(value, f.unit)}: must be a whole number",
                           "error")
        if f.hard is not None:
            lo, hi = f.hard
            lo_open, hi_open = f.hard_open
            if ((lo is not None and (value < lo or (lo_open and value == lo)))
                    or (hi is not None and (value > hi or (hi_open and value == hi)))):
                return Problem(f.path, f"{f.path} = {_show(value, f.unit)}: must be "
                               f"{f.range_text()}", "error")
        least = smallest(f)
        if least is not None and 0 < value < least:
            return Problem(f.path, f"{f.path} = {_show(value, f.unit)}: too small to be meant; "
                           f"must be >= {least:g}{'' if f.unit in ('', '-') else ' ' + f.unit} "
                           "(check the unit and the exponent)", "error")
        if f.choices is not None and value not in f.choices:
            return Problem(f.path, f"{f.path} = {_show(value, f.unit)}: must be one of "
                           + ", ".join(map(str, f.choices)), "error")
    elif f.kind == "choice" and f.choices is not None and value not in f.choices:
        return Problem(f.path, f"{f.path} = {_show(value, '')}: must be one of "
                       + ", ".join(map(repr, f.choices)), "error")
    elif f.kind == "text" and (not isinstance(value, str) or not value.strip()):
        return Problem(f.path, f"{f.path}: must be non-empty text", "error")
    return None


def usual_problem(f: InputField, value) -> Problem | None:
    """A warning when a number lies outside the field's usual range, else None."""
    if f.usual is None or not _is_number(value):
        return None
    lo, hi = f.usual
    if lo <= value <= hi:
        return None
    return Problem(f.path, f"{f.label} = {_show(value, f.unit)} is outside the usual range "
                   f"{f.range_text(f.usual)}: check the value and its unit", "warning")


def hard_range_errors(case) -> list[Problem]:
    """Hard-range problems of the fields of a built case that apply to it."""
    draft = case_to_draft(case)
    return [p for f in INPUTS if applies(f, draft)
            if (p := field_problem(f, get_value(draft, f.path))) is not None
            and p.path.count(".") <= 1 and f.kind in ("number", "integer")]


def check_hard_ranges(case) -> None:
    """Raise ``InputError`` for the first numeric field outside its hard range."""
    problems = hard_range_errors(case)
    if problems:
        raise InputError(problems[0].message, field=problems[0].path)


def usual_range_warnings(case) -> list[Problem]:
    """Fields of a case outside their usual range (plausibility), as warnings."""
    draft = case_to_draft(case)
    return [p for f in INPUTS if applies(f, draft)
            if (p := usual_problem(f, get_value(draft, f.path))) is not None]


def _draft_value(draft: dict, f: InputField):
    """The value a draft gives a field: a key left out takes the field's default."""
    obj = draft
    for key in f.path.split("."):
        if not isinstance(obj, dict) or key not in obj:
            return f.default
        obj = obj[key]
    return obj


def draft_problems(draft: dict) -> list[Problem]:
    """Every problem of a possibly incomplete case, at once, by field path.

    Field by field first (kind, required, hard range; usual range as warnings),
    then each part whose fields are sound is built to run its cross-field rules,
    and the whole case, with every rule that needs fluid properties, only when every
    part is sound.
    """
    if not isinstance(draft, dict):
        return [Problem("", "a case must be an object of fields", "error")]
    problems: list[Problem] = []
    for part in ("shell", "kettle", "thermosiphon"):
        needed = [f for f in INPUTS if f.part == part and applies(f, draft)]
        if needed and not isinstance(draft.get(part), dict):
            problems.append(Problem(part, f"{_GROUP_TITLES[part]}: required for this case "
                                    f"({needed[0].label}, ...)", "error"))
    absent = {p.path for p in problems}
    for f in INPUTS:
        if f.part in absent or not applies(f, draft):
            continue
        value = _draft_value(draft, f)
        p = field_problem(f, value) or usual_problem(f, value)
        if p is not None:
            problems.append(p)
    bad_parts = {p.path.split(".")[0] for p in problems if p.severity == "error"}
    from .project import from_dict

    for part, cls in PARTS.items():
        data = draft.get(part)
        if part in bad_parts or not isinstance(data, dict):
            continue
        try:
            from_dict(data, cls)
        except InputError as exc:
            path = f"{part}.{exc.field}" if exc.field else part
            problems.append(Problem(path, f"{part}.{exc}" if exc.field else str(exc), "error"))
            bad_parts.add(part)
    if not any(p.severity == "error" for p in problems):
        from .validation import property_problems

        try:
            case = from_dict(draft, Case)
        except InputError as exc:
            problems.append(Problem(exc.field or "", str(exc), "error"))
        else:
            problems += [Problem(e.field or "", str(e), "error") for e in property_problems(case)]
    return problems


# --- results -----------------------------------------------------------------------------

@dataclass(frozen=True)
class ResultField:
    """One result key: a summary figure or a profile along the heated length."""

    key: str
    label: str
    quantity: str
    types: tuple = ALL
    help: str = ""

    @property
    def unit(self) -> str:
        return QUANTITIES[self.quantity]


def _results(rows) -> dict:
    return {r[0]: ResultField(*r) for r in rows}


_TS = ("thermosiphon",)
_KT = ("kettle",)

SUMMARY: dict[str, ResultField] = _results([
    ("duty_W", "Duty", "power", ALL, "Heat received by the process"),
    ("duty_heating_side_W", "Duty, heating side", "power", ALL,
     "Heat given up by the heating medium"),
    ("required_duty_W", "Required duty", "power", ALL, "The duty asked of the unit"),
    ("performance_duty_W", "Duty of the installed area", "power", ALL,
     "Duty the whole installed area gives at these conditions"),
    ("area_m2", "Area (outside)", "area", ALL, "Installed outside heat-transfer area"),
    ("required_area_m2", "Area needed for the required duty", "area", ALL,
     "Outside area that would just give the required duty at these conditions (tube length "
     "scaled, same tubes and passes)"),
    ("u_clean_W_m2K", "U clean", "htc", ALL, "Overall coefficient without fouling, outside area"),
    ("u_service_W_m2K", "U service", "htc", ALL, "Overall coefficient with fouling, outside area"),
    ("u_required_W_m2K", "U required", "htc", ALL, "U that would just give the required duty"),
    ("mean_temperature_difference_K", "Mean temperature difference", "temperature_difference",
     ALL, "Duty / (U service x area)"),
    ("over_design_pct", "Over-design", "percent", ALL,
     "Installed area over the area needed for the required duty, minus 1 (area basis, "
     "every type)"),
    ("over_surface_pct", "Over-surface", "percent", ALL,
     "U clean / U required - 1: the margin the unit has while it is clean"),
    ("exit_quality", "Exit vapour quality", "fraction", ALL,
     "Vapour mass fraction at the exit; not computed where the exit is superheated vapour "
     "or subcooled liquid (see the superheat and subcooling)"),
    ("exit_superheat_K", "Exit superheat", "temperature_difference", ALL,
     "Exit vapour temperature above saturation, where all the liquid has evaporated"),
    ("exit_subcooling_K", "Exit subcooling", "temperature_difference", ALL,
     "Saturation temperature above the exit liquid's, where the liquid has not reached it"),
    ("exit_temperature_K", "Exit temperature", "temperature", ALL,
     "Process temperature at the exit (saturation at the exit pressure while two-phase)"),
    ("exit_pressure_Pa", "Exit pressure", "pressure", ALL,
     "Boiling-side pressure at the end of the heated length"),
    ("pressure_drop_boiling_Pa", "Pressure drop, boiling side", "pressure_difference", ALL,
     "Inlet minus exit pressure of the boiling flow; not computed for a kettle's pool"),
    ("static_head_over_bundle_Pa", "Static head over the bundle bottom", "pressure_difference",
     _KT, "Liquid head from the weir level to the bottom of the bundle (raises the boiling "
     "point there)"),
    ("pressure_drop_heating_Pa", "Pressure drop, heating side", "pressure_difference", ALL,
     "Not computed for condensing steam on the shell side"),
    ("heating_outlet_temperature_K", "Heating medium outlet temperature", "temperature", ALL,
     "Condensate or heating liquid leaving the unit"),
    ("heating_outlet_quality", "Heating medium outlet quality", "fraction", _KT,
     "Vapour mass fraction of steam leaving the tubes (0 when fully condensed)"),
    ("steam_flow_kg_s", "Steam condensed", "mass_flow", ALL,
     "Steam flow the duty condenses (saturated steam in, condensate out)"),
    ("max_heat_flux_W_m2", "Largest local heat flux", "heat_flux", ALL,
     "Largest flux at any station, on the boiling surface"),
    ("mean_heat_flux_W_m2", "Mean heat flux", "heat_flux", _TS + _KT,
     "Duty / heated area: for a thermosiphon the quantity Kern's flux limit is stated in; "
     "for a kettle over the bundle's outside area, compared with the bundle maximum flux"),
    ("max_chf_ratio", "Largest flux / critical flux", "dimensionless", ALL,
     "Largest ratio of a flux to its limit of the same kind: local flux over local critical "
     "flux in tubes; the bundle's mean flux over the bundle maximum flux in a kettle"),
    ("dryout_z_m", "Dryout starts at", "length", ALL, "Position along the heated length"),
    # thermosiphon
    # the inputs as rated: the given value and the one derived from it
    ("boiling_pressure_Pa", "Inlet / column pressure", "pressure", ALL, "Given or derived"),
    ("boiling_saturation_temperature_K", "Inlet / column boiling temperature", "temperature",
     ALL, "Saturation temperature at the inlet or column pressure, given or derived"),
    ("heating_pressure_Pa", "Steam pressure", "pressure", ALL, "Given or derived"),
    ("heating_saturation_temperature_K", "Steam saturation temperature", "temperature", ALL,
     "Given or derived"),
    ("heat_loss_W", "Heat loss", "power", ALL,
     "Heat the heating side gives up that the process does not receive"),
    ("boiling_range_K", "Boiling range of the mixture", "temperature_difference", ALL,
     "Dew minus bubble point at the inlet pressure (pseudo-pure mixture)"),
    ("kettle_diameter_m", "Kettle shell inside diameter", "length", _KT, "Given or defaulted"),
    ("port_diameter_m", "Port shell inside diameter", "length", _KT, "Given or defaulted"),
    ("weir_height_m", "Weir height", "length", _KT, "Given or defaulted"),
    ("circulation_kg_s", "Circulation", "mass_flow", _TS, "Flow through the tubes"),
    ("circulation_ratio", "Circulation ratio", "dimensionless", _TS,
     "Total mass flow through the tubes per unit of vapour generated (1 / exit quality)"),
    ("vapour_flow_kg_s", "Vapour generated", "mass_flow", _TS + _KT,
     "Vapour leaving the tubes (thermosiphon: circulation x exit quality) or the liquid "
     "surface (kettle, feed vapour included)"),
    ("pressure_balance_residual_Pa", "Pressure balance residual", "pressure_difference", _TS,
     "Available head minus the loop's losses at the circulation found; near 0 when the "
     "balance is solved"),
    ("subcooled_length_m", "Subcooled length", "length", _TS,
     "Length from the tube inlet to where the liquid reaches its boiling point"),
    ("available_head_Pa", "Available head", "pressure_difference", _TS,
     "Static head of the column liquid that drives the circulation"),
    ("inlet_line_pressure_drop_Pa", "Inlet line pressure drop", "pressure_difference", _TS,
     "Friction and fittings from the column to the tube inlet"),
    ("tube_inlet_pressure_Pa", "Tube inlet pressure", "pressure", _TS,
     "Column pressure plus the liquid head, minus the inlet line's and the tube entrance's "
     "losses"),
    ("return_line_pressure_drop_Pa", "Return line pressure drop", "pressure_difference", _TS,
     "Two-phase friction, fittings and static head from the tube outlet to the column"),
    ("inlet_saturation_rise_K", "Boiling point rise at the tube inlet",
     "temperature_difference", _TS,
     "Saturation temperature at the tube inlet minus that in the column: the subcooling the "
     "liquid head gives"),
    ("inlet_nozzle_rho_v2_kg_m_s2", "Inlet nozzle rho v²", "momentum_flux", _TS,
     "Momentum flux rho v² at the bottom-channel inlet nozzle (liquid)"),
    ("outlet_nozzle_rho_v2_kg_m_s2", "Outlet nozzle rho v²", "momentum_flux", _TS,
     "Two-phase momentum flux rho v² at the outlet nozzle"),
    ("balances_found", "Pressure balances found", "count", _TS,
     "Circulations at which the available head equals the losses; more than one means the "
     "loop can settle at another point"),
    # kettle
    ("bundle_max_heat_flux_W_m2", "Bundle maximum heat flux", "heat_flux", _KT,
     "Largest mean flux the bundle takes before vapour blankets it (the chosen method)"),
    ("single_tube_max_heat_flux_W_m2", "Single-tube maximum heat flux", "heat_flux", _KT,
     "Critical heat flux of one tube in a large pool, before the bundle factor"),
    ("bundle_factor", "Bundle geometry factor", "dimensionless", _KT,
     "Palen's Phi_b: bundle maximum flux over single-tube critical flux"),
    ("bundle_boiling_factor", "Bundle boiling factor", "dimensionless", _KT,
     "Multiplier on the single-tube nucleate coefficient for the bundle's convection (F_b)"),
    ("mixture_factor", "Mixture factor", "dimensionless", _KT,
     "Mixture over pure-fluid nucleate coefficient (at most 1); not computed when the "
     "method depends on the local flux"),
    ("surface_vapour_velocity_m_s", "Vapour velocity at the liquid surface", "velocity", _KT,
     "Vapour flow over the liquid surface's area (chord at the level x tube length)"),
    ("surface_vapour_velocity_limit_m_s", "Limit of the surface vapour velocity", "velocity",
     _KT, "Velocity above which droplets are carried over (Souders-Brown form)"),
    ("min_kettle_diameter_m", "Smallest kettle diameter for that limit", "length", _KT,
     "Kettle diameter whose liquid surface would carry the vapour at the velocity limit"),
    ("tube_count", "Tubes", "count", _KT, "Tube holes in the bundle (given or counted)"),
    ("liquid_level_over_bundle_m", "Liquid level over the bundle", "length", _KT,
     "Weir height plus the crest over it, minus the bundle top; negative when tubes are "
     "uncovered"),
    ("freeboard_m", "Freeboard", "length", _KT,
     "Height from the liquid level to the top of the kettle shell"),
    ("liquid_overflow_kg_s", "Liquid overflow", "mass_flow", _KT,
     "Liquid leaving over the weir (feed minus vapour)"),
    ("vapour_outlet_rho_v2_kg_m_s2", "Vapour nozzle rho v²", "momentum_flux", _KT,
     "Momentum flux rho v² in the vapour outlet nozzle"),
    ("liquid_inlet_rho_v2_kg_m_s2", "Liquid inlet nozzle rho v²", "momentum_flux", _KT,
     "Momentum flux rho v² in the feed nozzle (TEMA RCB-4.61: impingement protection)"),
    ("liquid_outlet_velocity_m_s", "Liquid outlet velocity", "velocity", _KT,
     "Overflow liquid velocity in the outlet nozzle"),
])

PROFILES: dict[str, ResultField] = _results([
    ("z_m", "Position along the heated length", "length"),
    ("p_Pa", "Pressure", "pressure"),
    ("t_sat_K", "Saturation temperature", "temperature"),
    ("t_process_K", "Process temperature", "temperature"),
    ("t_heating_K", "Heating medium temperature", "temperature"),
    ("t_wall_inner_K", "Wall temperature, inside", "temperature"),
    ("t_wall_outer_K", "Wall temperature, outside", "temperature"),
    ("quality", "Vapour quality", "fraction"),
    ("void_fraction", "Void fraction", "fraction"),
    ("heat_flux_W_m2", "Heat flux", "heat_flux"),
    ("htc_boiling_W_m2K", "Boiling coefficient", "htc"),
    ("htc_nucleate_W_m2K", "Nucleate part", "htc", ALL,
     "The nucleate term as it enters the boiling coefficient, after suppression (Chen: "
     "S htc_nb; Gungor-Winterton: S htc_pool; Kandlikar: the boiling-number term of the set "
     "that governs; kettle: F_b F_m htc_nb). The parts add up to the coefficient, except "
     "Liu-Winterton and subcooled boiling (htc^2 = nucleate^2 + convective^2) and "
     "Steiner-Taborek (htc^3 = nucleate^3 + convective^3); 0 without boiling"),
    ("htc_convective_W_m2K", "Convective part", "htc", ALL,
     "The convective term as it enters the boiling coefficient, after enhancement (Chen: "
     "F htc_l; Gungor-Winterton: E htc_l; kettle: natural convection); the whole "
     "coefficient in single phase and after dryout"),
    ("htc_heating_W_m2K", "Heating-side coefficient", "htc"),
    ("chf_ratio", "Heat flux / critical heat flux", "dimensionless"),
    ("flow_pattern", "Flow pattern", "text"),
    ("regime", "Regime", "text"),
    ("critical_heat_flux_W_m2", "Critical heat flux", "heat_flux"),
    ("wall_superheat_K", "Wall superheat", "temperature_difference"),
    ("u_service_W_m2K", "U service (local)", "htc"),
    ("cumulative_duty_W", "Duty from the inlet", "power"),
    ("heating_quality", "Heating medium quality (in the tubes)", "fraction", _KT),
    ("tube_pass", "Tube pass", "count", _KT),
])


def result_field(key: str) -> ResultField:
    """The description of a summary or profile key."""
    if key in SUMMARY:
        return SUMMARY[key]
    if key in PROFILES:
        return PROFILES[key]
    raise KeyError(f"no result key {key!r}")
