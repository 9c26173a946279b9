"""The input model: a rating case and its parts, as frozen dataclasses in SI.

A case is plain, immutable and picklable so it can be sent to a worker thread or
another process and rated there. Values are SI throughout (m, Pa, K, kg/s, W).
Validation of each part (ranges, cross-field checks) lives in ``rating.validation``
and runs when a part is built; the project file (``rating.project``) reads and
writes these objects.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

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
QUESTIONS = ("performance", "duty_check")


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
    def tubes_per_pass(self) -> int:
        return max(1, self.count // self.passes)

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
    """

    fluid: str
    mass_flow: float
    inlet_pressure: float
    inlet_temperature: float | None = None
    inlet_quality: float | None = None
    fouling_resistance: float = 0.0

    def __post_init__(self):
        from .validation import check_boiling
        check_boiling(self)


@dataclass(frozen=True)
class HeatingMedium:
    """The heating medium: condensing steam, or a single-phase liquid or gas.

    ``fluid`` is a property-library name, an incompressible solution such as
    ``"INCOMP::MEG-30%"`` or a user table {"T": [...], "cp": [...], "rho": [...],
    "mu": [...], "k": [...]} (SI, T rising) for heating oils.
    Steam: ``pressure`` is the steam pressure at the inlet (saturated). Liquid:
    ``pressure`` is its working pressure, ``inlet_temperature`` and ``mass_flow`` are
    required, ``flow_arrangement`` is counter- or co-current with the boiling fluid.
    """

    kind: str = "steam"
    fluid: object = "Water"
    pressure: float = 3e5
    inlet_temperature: float | None = None
    mass_flow: float | None = None
    flow_arrangement: str = "counter"
    fouling_resistance: float = 0.0

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
    """Warning thresholds, each a user-editable default with its source.

    Sources are given in ``rating.checks.LIMIT_SOURCES``.
    """

    chf_ratio: float = 0.7
    critical_quality: float | None = None
    min_nucleate_flux: float = 6300.0
    min_temperature_approach: float = 3.0
    kern_flux_cap: float | None = None
    # --- thermosiphon limits

    # --- kettle limits

    def __post_init__(self):
        from .validation import check_limits
        check_limits(self)


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

    # --- kettle fields

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
