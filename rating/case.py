"""The input model: a rating case and its parts, as frozen dataclasses in SI.

A case is plain, immutable and picklable so it can be sent to a worker thread or
another process and rated there. Values are SI throughout (m, Pa, K, kg/s, W).
Validation of each part (ranges, cross-field checks) lives in ``rating.validation``
and runs when a part is built, from plain values: building a case never calls the
property library. The rules that need fluid properties run once, in
``rating.validation.validate`` (``rating.rate``, the project file and the drafts call
it). The project file (``rating.project``) reads and writes these objects.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

from .vendor import VendorFigures, VendorTolerances  # noqa: F401  (a case's optional part)

# Birmingham Wire Gauge wall thickness [m] (TEMA RCB-2.21 / ASME B36 gauge table).
BWG_THICKNESS = {
    7: 4.572e-3, 8: 4.191e-3, 9: 3.759e-3, 10: 3.404e-3, 11: 3.048e-3, 12: 2.769e-3,
    13: 2.413e-3, 14: 2.108e-3, 15: 1.829e-3, 16: 1.651e-3, 17: 1.473e-3, 18: 1.245e-3,
    19: 1.067e-3, 20: 0.889e-3, 22: 0.711e-3, 24: 0.559e-3,
}

# Thermal conductivity of common tube materials near 100 degC [W/m/K]
# (Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, Table A.1;
# TEMA Table D-12 gives similar values).
TUBE_MATERIALS = {
    "carbon_steel": 51.0,
    "stainless_steel_304": 16.6,
    "stainless_steel_316": 15.2,
    "copper": 393.0,
    "admiralty_brass": 111.0,
    "aluminium_brass": 100.0,
    "copper_nickel_90_10": 52.0,
    "copper_nickel_70_30": 29.0,
    "titanium": 20.7,
    "nickel_alloy_625": 11.4,
}

EXCHANGER_TYPES = ("evaporator", "thermosiphon", "kettle")
ORIENTATIONS = ("vertical", "horizontal")
HEATING_KINDS = ("steam", "liquid")
FLOW_ARRANGEMENTS = ("counter", "co")
#: The questions a case asks: "performance" (duty and outlet states of this geometry) or
#: "area_for_duty" (the area a required duty takes, against the area there is: over-design).
QUESTIONS = ("performance", "area_for_duty")


def derived_fields(part) -> dict:
    """Fields of a part that were left empty and filled in when it was built.

    name -> how the value was found (a rule or a published source). The project file
    keeps such a field empty, so that the input it came from stays the one that decides.
    """
    return getattr(part, "_derived", {})


@dataclass(frozen=True)
class Tubes:
    """The tube bundle. ``length`` is the heated length of one tube pass."""

    count: int
    length: float
    outer_diameter: float
    wall_thickness: float | None = None
    bwg: int | None = None
    passes: int = 1
    material: str = "carbon_steel"
    wall_conductivity: float | None = None
    roughness: float = 4.5e-5
    orientation: str = "vertical"
    pitch: float | None = None
    layout_angle: int = 30

    def __post_init__(self):
        from .validation import check_tubes
        check_tubes(self)

    @property
    def thickness(self) -> float:
        """Wall thickness [m], given directly or from the BWG gauge."""
        if self.wall_thickness is not None:
            return self.wall_thickness
        return BWG_THICKNESS[self.bwg]

    @property
    def inner_diameter(self) -> float:
        return self.outer_diameter - 2.0 * self.thickness

    @property
    def conductivity(self) -> float:
        """Wall thermal conductivity [W/m/K]."""
        if self.wall_conductivity is not None:
            return self.wall_conductivity
        return TUBE_MATERIALS[self.material]

    @property
    def tubes_per_pass(self) -> float:
        """Tubes in one pass: a count the passes do not divide is spread evenly over them
        (66 tubes in 4 passes march as 16.5 a pass), so that every tube is rated."""
        return self.count / self.passes

    @property
    def flow_area(self) -> float:
        """Inside flow area of one pass [m^2]."""
        return self.tubes_per_pass * math.pi * self.inner_diameter**2 / 4.0

    @property
    def outer_area(self) -> float:
        """Outside heat-transfer area of the whole bundle [m^2]."""
        return self.count * math.pi * self.outer_diameter * self.length


@dataclass(frozen=True)
class Shell:
    """Shell of a baffled E-shell with a single-phase heating fluid outside the tubes."""

    inner_diameter: float
    baffle_spacing: float
    baffle_cut: float = 0.25
    sealing_strip_pairs: int = 0

    def __post_init__(self):
        from .validation import check_shell
        check_shell(self)


@dataclass(frozen=True)
class BoilingStream:
    """The boiling (process) fluid at the inlet of the heated length.

    Give either ``inlet_temperature`` (subcooled liquid) or ``inlet_quality``
    (saturated, 0 <= x < 1); with neither the inlet is saturated liquid.

    The pressure is given as ``inlet_pressure`` or as the saturation temperature at
    it, ``inlet_saturation_temperature`` (a column bottom's boiling temperature); the
    other is derived when the stream is built (see ``derived_fields``).

    ``fluid`` is a property-library name, a near-azeotropic mixture in the library's
    notation ("Propane[0.95]&n-Butane[0.05]", mole fractions) rated as a pseudo-pure
    fluid, or a user property table along the saturation line (``rating.fluid_table``).

    ``htc_fixed`` [W/m^2/K] replaces the boiling coefficient, or ``htc_factor``
    multiplies the chosen method's (``rating.adjust``); the same pair on
    ``HeatingMedium`` acts on the heating side. Each coefficient is on the surface its
    side wets.

    For a thermosiphon (``Case.type = "thermosiphon"``) the stream is the column's:
    ``inlet_pressure`` is the column vapour-space pressure, ``inlet_temperature``
    the column-base liquid temperature (None: saturated at that pressure), and
    ``mass_flow`` may be None; it is not used, since the circulation follows
    from the loop's pressure balance (see ``ThermosiphonLoop``).
    """

    fluid: object
    mass_flow: float | None
    inlet_pressure: float | None = None
    inlet_temperature: float | None = None
    inlet_quality: float | None = None
    fouling_resistance: float = 0.0
    inlet_saturation_temperature: float | None = None
    htc_fixed: float | None = None
    htc_factor: float = 1.0

    def __post_init__(self):
        from .validation import check_boiling
        check_boiling(self)


@dataclass(frozen=True)
class HeatingMedium:
    """The heating medium: condensing steam, or a single-phase liquid or gas.

    ``fluid`` is a property-library name, an incompressible solution such as
    ``"INCOMP::MEG-30%"`` or a user table {"T": [...], "cp": [...], "rho": [...],
    "mu": [...], "k": [...]} (SI, T rising) for heating oils.
    Steam: ``pressure`` is the steam pressure at the inlet (saturated), or give its
    ``saturation_temperature`` instead and the pressure is derived. Liquid:
    ``pressure`` is its working pressure, ``inlet_temperature`` and ``mass_flow`` are
    required, ``flow_arrangement`` is counter- or co-current with the boiling fluid.
    ``heat_loss_percent`` of the heating side's duty, or a fixed ``heat_loss`` [W],
    leaves the heating medium without reaching the process (losses to ambient).
    """

    kind: str = "steam"
    fluid: object = "Water"
    pressure: float | None = None
    inlet_temperature: float | None = None
    mass_flow: float | None = None
    flow_arrangement: str = "counter"
    fouling_resistance: float = 0.0
    saturation_temperature: float | None = None
    heat_loss_percent: float = 0.0
    heat_loss: float = 0.0
    htc_fixed: float | None = None
    htc_factor: float = 1.0

    def __post_init__(self):
        from .validation import check_heating
        check_heating(self)


@dataclass(frozen=True)
class Methods:
    """Correlation choices by registry name (see ``rating.correlations``).

    ``tube_dryout = "auto"`` uses the 2006 look-up table for water and the
    local-conditions Katto-Ohno method for other fluids.
    """

    flow_boiling: str = "gungor_winterton_1986"
    nucleate_boiling: str = "cooper_1984"
    two_phase_friction: str = "friedel_1979"
    void_fraction: str = "rouhani_axelsson_1970"
    tube_dryout: str = "auto"
    single_phase_tube: str = "gnielinski_1976"
    shell_side: str = "bell_delaware"

    def __post_init__(self):
        from .validation import check_methods
        check_methods(self)


@dataclass(frozen=True)
class Limits:
    """Warning thresholds, each a user-editable default.

    Labels, units, allowed ranges and sources: ``rating.rules.LIMITS``; the warnings
    that read them: ``rating.rules.RULES``.
    """

    chf_ratio: float = 0.7
    critical_quality: float | None = None
    min_nucleate_flux: float = 6300.0
    min_temperature_approach: float = 3.0
    kern_flux_cap: float | None = None
    # --- thermosiphon limits
    thermosiphon_max_exit_quality: float = 0.25
    thermosiphon_max_exit_quality_aqueous: float = 0.10
    thermosiphon_circulation_ratio_min: float = 5.0
    thermosiphon_circulation_ratio_max: float = 20.0
    thermosiphon_max_flux: float | None = None
    thermosiphon_level_min_fraction: float = 0.5
    thermosiphon_level_max_fraction: float = 1.0
    thermosiphon_level_min_fraction_vacuum: float = 0.5
    thermosiphon_level_max_fraction_vacuum: float = 0.7
    thermosiphon_min_pressure: float = 30e3
    thermosiphon_nozzle_rho_v2: float = 8928.0
    thermosiphon_max_subcooled_fraction: float = 0.25

    # --- kettle limits
    kettle_bundle_flux_ratio: float = 1.0
    kettle_min_bundle_factor: float = 0.1
    kettle_surface_velocity_constant: float = 0.2
    kettle_min_freeboard: float = 0.25
    kettle_min_level_over_bundle: float = 0.0
    kettle_vapour_nozzle_rho_v2: float = 5953.0
    kettle_inlet_nozzle_rho_v2: float = 744.0

    def __post_init__(self):
        from .validation import check_limits
        check_limits(self)


# --- thermosiphon loop -------------------------------------------------------------

@dataclass(frozen=True)
class ThermosiphonLoop:
    """The circulation loop of a recirculating vertical thermosiphon reboiler.

    Heights are measured from the bottom tube sheet; lengths are developed
    (straight-run) lengths; diameters are inner diameters. The column side comes
    from ``Case.boiling``: ``inlet_pressure`` is the column vapour-space
    pressure and ``inlet_temperature`` the column-base liquid temperature (None:
    saturated liquid; a colder value is the column liquid's subcooling).

    ``liquid_level``: the column liquid surface above the bottom tube sheet, the
    driving head. ``return_line_rise``: the return nozzle on the column above the
    top tube sheet. Loss coefficients K multiply a velocity head rho v^2/2
    (homogeneous for two-phase flow); between two plenums (column, bottom channel,
    top channel) the velocity heads themselves cancel, so each K here is the
    irreversible part only. Defaults:

    * ``inlet_line_k`` 0.5: sharp-edged entrance from the column base (Crane
      Technical Paper 410); add the line's fittings (elbows, valves) to it.
    * ``bottom_channel_k`` 1.0, on the inlet-nozzle velocity: sudden expansion into
      the channel, the whole velocity head lost (Borda-Carnot, area ratio -> 0).
    * ``tube_entrance_k`` 0.5: sharp-edged contraction from the channel into the
      tubes (Crane TP-410); the reversible acceleration is counted on top.
    * ``tube_exit_k`` 1.0: sudden expansion into the top channel (Borda-Carnot);
      it cancels the recovery of the exit velocity head, so the net is zero.
    * ``return_line_k`` 1.5: 0.5 entering the outlet nozzle from the top channel
      plus 1.0 discharging into the column; add the line's fittings.
    * ``line_roughness`` 4.6e-5 m: commercial steel pipe (Moody 1944).

    The nozzle diameters default to the line diameters; they set the nozzle
    velocities (the bottom-channel loss and the rho v^2 checks).
    """

    liquid_level: float
    inlet_line_diameter: float
    inlet_line_length: float
    return_line_diameter: float
    return_line_length: float
    return_line_rise: float
    inlet_line_k: float = 0.5
    bottom_channel_k: float = 1.0
    tube_entrance_k: float = 0.5
    tube_exit_k: float = 1.0
    return_line_k: float = 1.5
    inlet_nozzle_diameter: float | None = None
    outlet_nozzle_diameter: float | None = None
    line_roughness: float = 4.6e-5

    def __post_init__(self):
        from .validation import check_thermosiphon
        check_thermosiphon(self)

    @property
    def inlet_nozzle(self) -> float:
        """Inlet nozzle inner diameter [m] (the inlet line's unless given)."""
        return self.inlet_nozzle_diameter or self.inlet_line_diameter

    @property
    def outlet_nozzle(self) -> float:
        """Outlet nozzle inner diameter [m] (the return line's unless given)."""
        return self.outlet_nozzle_diameter or self.return_line_diameter


# --- kettle shell ------------------------------------------------------------------

KETTLE_TUBE_FORMS = ("u-tube", "straight")

#: Fraction of the kettle shell diameter a bundle usually fills (Wolverine Tube,
#: Engineering Data Book II, ch. 5, reboiler selection: "bundle about 60 % of the shell").
KETTLE_BUNDLE_SHARE = 0.6
#: Margin of the weir over the top of the bundle [m]: the level should just cover the
#: bundle (common practice; 50 mm, from memory).
KETTLE_WEIR_MARGIN = 0.05


def _port_clearance(bundle_diameter: float) -> float:
    """Diametral clearance between a U-tube or fixed bundle and its shell [m].

    Sinnott, Coulson & Richardson's Chemical Engineering Vol. 6, Fig. 12.10, the
    fixed and U-tube line, about 10 mm at a 0.2 m bundle to 20 mm at 1.2 m (read from
    memory); a line through those two points.
    """
    return 0.008 + 0.01 * bundle_diameter


#: Kettle dimensions a datasheet may leave out: field -> (rule from the other
#: dimensions, its source as the rating's warning states it). Applied in this order.
KETTLE_DEFAULTS = {
    "port_diameter": (
        lambda k: k.bundle_diameter + _port_clearance(k.bundle_diameter),
        "bundle diameter plus the shell-bundle clearance of a U-tube bundle (Sinnott, "
        "Coulson & Richardson Vol. 6, Fig. 12.10)"),
    "kettle_diameter": (
        lambda k: max(k.bundle_diameter / KETTLE_BUNDLE_SHARE, k.port_diameter),
        "bundle diameter / 0.6: a bundle fills about 60 % of the kettle shell (Wolverine "
        "Engineering Data Book II, ch. 5)"),
    "weir_height": (
        lambda k: 0.5 * (k.port_diameter + k.bundle_diameter) + KETTLE_WEIR_MARGIN,
        "top of the bundle + 50 mm: the level just covers the bundle (common practice)"),
}


@dataclass(frozen=True)
class KettleShell:
    """The shell side of a kettle reboiler (TEMA K shell): a submerged horizontal bundle.

    The boiling fluid is outside the tubes, in a pool held by an overflow weir; the
    heating medium (``Case.heating``: condensing steam or a hot liquid) flows inside
    the tubes, pass after pass. With it:

    * ``Case.boiling``: ``inlet_pressure`` is the vapour-space pressure, ``mass_flow``
      the feed, entering subcooled (``inlet_temperature``) or saturated
      (``inlet_quality``, or neither for saturated liquid).
    * ``Case.tubes``: horizontal; ``count`` is the number of tube ends in the
      tubesheet (two per U-tube), ``length`` the straight heated length of one
      leg or pass (U-bends not counted), ``passes`` the tube-side passes (even for
      U-tubes), ``pitch`` (default 1.25 x the outer diameter) and ``layout_angle``.
    * ``Case.heating``: ``fouling_resistance`` is the tube-side (inside) fouling,
      ``Case.boiling.fouling_resistance`` the shell-side (outside) one.
      ``flow_arrangement`` has no meaning for a kettle (the pool is well mixed) and
      is ignored. For steam, ``mass_flow`` None means a steam trap: the flow is
      what condenses, leaving as condensate (wet by 0.2 +- 0.1 % of the steam, so
      that no sliver of subcooled condensate ends the path); a given steam flow may
      leave wet or flood the last tubes with condensate.
    * ``Case.shell`` must be None: the kettle shell is described here.

    Heights are measured from the bottom of the kettle shell. The port and kettle
    shells are taken bottom-aligned (eccentric cone) with the bundle centred in the
    port shell, so the bundle spans ``(port - bundle)/2`` to ``(port + bundle)/2``.

    Parameters (SI): ``kettle_diameter`` inner diameter of the enlarged shell [m];
    ``port_diameter`` inner diameter of the port (bundle) shell [m];
    ``bundle_diameter`` outer tube limit of the bundle [m]; ``weir_height`` top of
    the overflow weir [m]; ``tube_form`` "u-tube" or "straight";
    ``estimate_tube_count`` True replaces ``tubes.count`` by the number of tubes that
    fit the bundle diameter (Phadke 1984, with pass-lane allowance);
    ``vapour_nozzle_diameter`` inner diameter of each of ``vapour_nozzles`` vapour
    outlets [m]; ``liquid_inlet_nozzle_diameter`` and ``liquid_outlet_nozzle_diameter``
    feed inlet and overflow outlet [m] (None: not checked);
    ``bundle_boiling_factor`` Palen's F_b on the nucleate coefficient for the
    vapour-driven circulation in a bundle [-] (1.5, the value of the Wolverine
    Engineering Data Book kettle example after Palen); ``boiling_range`` dew minus
    bubble point of the pool liquid [K] (0 for a pure fluid: no mixture correction;
    the property library holds pure fluids only, so a narrow-boiling mixture is
    rated on a pure surrogate and its boiling range given here);
    ``mixture_method`` the mixture correction (registry family "mixture");
    ``bundle_max_flux`` the bundle maximum-flux method (family "bundle_chf");
    ``heating_htc`` a fixed tube-side film coefficient on the inside surface
    [W/m^2/K] in place of the in-tube correlation (a book's or a vendor's value).

    A kettle, port or weir dimension left empty takes a default from published
    practice (``KETTLE_DEFAULTS``) and the rating warns that it did.
    """

    kettle_diameter: float | None = None
    port_diameter: float | None = None
    bundle_diameter: float | None = None  # required (a default only keeps the order)
    weir_height: float | None = None
    tube_form: str = "u-tube"
    estimate_tube_count: bool = False
    vapour_nozzle_diameter: float | None = None
    vapour_nozzles: int = 1
    liquid_inlet_nozzle_diameter: float | None = None
    liquid_outlet_nozzle_diameter: float | None = None
    bundle_boiling_factor: float = 1.5
    boiling_range: float = 0.0
    mixture_method: str = "palen_small_mixture_factor"
    bundle_max_flux: str = "palen_1983"
    heating_htc: float | None = None

    def __post_init__(self):
        from .validation import check_kettle
        check_kettle(self)

    @property
    def bundle_bottom(self) -> float:
        """Height of the bottom of the bundle above the kettle bottom [m]."""
        return 0.5 * (self.port_diameter - self.bundle_diameter)

    @property
    def bundle_top(self) -> float:
        """Height of the top of the bundle above the kettle bottom [m]."""
        return 0.5 * (self.port_diameter + self.bundle_diameter)


@dataclass(frozen=True)
class Case:
    """One rating case: an exchanger, its streams, the question asked, the methods."""

    name: str
    tubes: Tubes
    boiling: BoilingStream
    heating: HeatingMedium
    type: str = "evaporator"
    shell: Shell | None = None
    question: str = "performance"
    required_duty: float | None = None
    methods: Methods = field(default_factory=Methods)
    limits: Limits = field(default_factory=Limits)
    increments: int | None = None
    # --- thermosiphon fields
    thermosiphon: ThermosiphonLoop | None = None

    # --- kettle fields
    kettle: KettleShell | None = None
    # --- what a vendor's proposal states (rating.vendor); None = no proposal
    vendor: VendorFigures | None = None

    def __post_init__(self):
        from .validation import check_case
        check_case(self)


@dataclass(frozen=True)
class Project:
    """A project file's content: several named cases and revision notes."""

    cases: tuple[Case, ...] = ()
    title: str = ""
    notes: str = ""
    revision: int = 1

    def case(self, name: str) -> Case:
        for c in self.cases:
            if c.name == name:
                return c
        raise KeyError(f"no case named {name!r}; cases: {', '.join(c.name for c in self.cases)}")
