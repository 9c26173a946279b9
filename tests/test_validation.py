"""Input rules of rating.validation: each refusal names its field and the allowed range.

The rules themselves are ours (the brief of the input model; ranges marked "common
practice" where they come from trade usage). Saturation values quoted in messages
are checked against tests/property_sets.py (CHECK-VALUES.md section 0, CoolProp
8.0.0) and the IAPWS critical pressure of water, 22.064 MPa.
"""
import pickle

import pytest

from rating.case import (
    BoilingStream, Case, HeatingMedium, Limits, Methods, Shell, Tubes,
)
from rating.correlations.registry import REGISTRY, Method
from rating.errors import InputError, ProjectFileError
from rating.validation import validate


@pytest.fixture(autouse=True)
def default_methods_registered(monkeypatch):
    """Stand in for default methods whose modules are not written yet (no-op once they are)."""
    for name, family in (("gungor_winterton_1986", "flow_boiling"), ("cooper_1984", "nucleate_boiling"),
                         ("friedel_1979", "two_phase_friction"),
                         ("rouhani_axelsson_1970", "void_fraction"),
                         ("gnielinski_1976", "single_phase_tube"), ("bell_delaware", "shell_side")):
        if name not in REGISTRY:
            monkeypatch.setitem(REGISTRY, name, Method(name, family, lambda: None, "placeholder"))


TUBES = dict(count=100, length=3.0, outer_diameter=0.025, wall_thickness=0.002)
SHELL = dict(inner_diameter=0.6, baffle_spacing=0.3)
BOILING = dict(fluid="Water", mass_flow=2.0, inlet_pressure=101325.0)
HEATING = dict(kind="steam", fluid="Water", pressure=3e5)
LIQUID = dict(kind="liquid", fluid="Water", pressure=5e5, inlet_temperature=400.0, mass_flow=10.0)


def refused(cls, base, **changes):
    """The InputError raised by building ``cls`` from ``base`` with ``changes``; a case is
    validated too (the rules that need fluid properties run there, before any rating)."""
    with pytest.raises(InputError) as info:
        built = cls(**{**base, **changes})
        if isinstance(built, Case):
            validate(built)
    return info.value


def assert_refused(error, field, *fragments):
    """Field set, message of the form '<field> = <value>...: <rule>', fragments in the rule."""
    assert error.field == field
    assert str(error).startswith(f"{field} = "), str(error)
    for text in fragments:
        assert text in str(error), (text, str(error))


# --- InputError.prefixed ------------------------------------------------------------

def test_prefixed_puts_the_path_in_front_of_field_and_message():
    error = InputError("outer_diameter = -0.02 m: must be > 0", field="outer_diameter")
    full = error.prefixed("cases[0].tubes")
    assert str(full) == "cases[0].tubes.outer_diameter = -0.02 m: must be > 0"
    assert full.field == "cases[0].tubes.outer_diameter"
    assert type(full) is InputError
    assert str(error) == "outer_diameter = -0.02 m: must be > 0"  # the original is untouched


def test_prefixed_keeps_the_class_and_joins_index_paths():
    error = ProjectFileError("[1].name: missing", field="[1].name").prefixed("cases")
    assert type(error) is ProjectFileError
    assert error.field == "cases[1].name" and str(error) == "cases[1].name: missing"
    assert InputError("no field").prefixed("cases[0]").field == "cases[0]"
    same = InputError("x = 1: bad", field="x")
    assert same.prefixed("") is same


def test_input_error_keeps_its_field_through_pickle():  # errors cross to worker processes
    error = pickle.loads(pickle.dumps(InputError("count = 0: must be >= 1", field="count")))
    assert error.field == "count" and str(error) == "count = 0: must be >= 1"


# --- Tubes --------------------------------------------------------------------------------

def test_the_example_message():
    error = refused(Tubes, TUBES, outer_diameter=-0.02)
    assert str(error) == "outer_diameter = -0.02 m: must be > 0"
    assert error.field == "outer_diameter"


@pytest.mark.parametrize("changes, field, fragments", [
    (dict(count=0), "count", [">= 1"]),
    (dict(count=2.0), "count", ["whole number >= 1"]),
    (dict(count=True), "count", ["whole number >= 1"]),
    (dict(length=0.0), "length", ["0 m", "must be > 0"]),
    (dict(length=float("nan")), "length", ["finite"]),
    (dict(length=float("inf")), "length", ["finite"]),
    (dict(length=True), "length", ["must be a number [m]"]),
    (dict(outer_diameter="0.025"), "outer_diameter", ["'0.025'", "must be a number [m], not text"]),
    (dict(wall_thickness=None), "wall_thickness", ["exactly one of wall_thickness [m] or bwg"]),
    (dict(bwg=14), "bwg", ["exactly one of wall_thickness [m] or bwg"]),
    (dict(wall_thickness=-0.001), "wall_thickness", ["must be > 0"]),
    (dict(wall_thickness=0.0125), "wall_thickness",
     ["inner diameter", "must be > 0 and below the outer diameter", "thinner than 0.0125 m"]),
    (dict(passes=0), "passes", ["from 1 to 16"]),
    (dict(passes=17), "passes", ["from 1 to 16"]),
    (dict(count=3, passes=4), "passes", ["<= count (3)"]),
    (dict(material="brass"), "material", ["'brass'", "carbon_steel", "titanium", "wall_conductivity"]),
    (dict(wall_conductivity=0.0), "wall_conductivity", ["W/m/K", "> 0"]),
    (dict(wall_conductivity=50.0, material=7), "material", ["must be text"]),
    (dict(roughness=-1e-6), "roughness", [">= 0"]),
    (dict(orientation="inclined"), "orientation", ["'vertical', 'horizontal'"]),
    (dict(pitch=0.025), "pitch", ["> outer_diameter (0.025 m)", "1.25 to 1.5"]),
    (dict(pitch=0.02), "pitch", ["> outer_diameter (0.025 m)"]),
    (dict(layout_angle=40), "layout_angle", ["30, 45, 60, 90"]),
])
def test_tubes_refusals(changes, field, fragments):
    assert_refused(refused(Tubes, TUBES, **changes), field, *fragments)


def test_bwg_must_be_a_listed_gauge():
    base = {**TUBES, "wall_thickness": None}
    for bad in (5, 21, 14.0, "14"):
        # every gauge of case.BWG_THICKNESS is listed, first to last
        assert_refused(refused(Tubes, base, bwg=bad), "bwg", "7, 8, 9", "20, 22, 24")


def test_bwg_thicker_than_half_the_tube_is_refused():
    # BWG 7 = 4.572 mm (TEMA gauge table in case.py) on a 9 mm tube leaves no bore
    error = refused(Tubes, {**TUBES, "wall_thickness": None}, bwg=7, outer_diameter=0.009)
    assert_refused(error, "bwg", "inner diameter", "thinner than 0.0045 m")


def test_valid_tubes_and_their_derived_geometry():
    t = Tubes(**{**TUBES, "wall_thickness": None}, bwg=14, passes=2, pitch=0.03125)
    assert t.inner_diameter == pytest.approx(0.025 - 2 * 2.108e-3)  # BWG 14 = 0.083 in
    assert t.tubes_per_pass == 50
    # any material name goes when the conductivity is given
    assert Tubes(**TUBES, material="duplex 2205", wall_conductivity=17.0).conductivity == 17.0
    Tubes(**{**TUBES, "count": 16}, passes=16, layout_angle=90, pitch=0.0251)  # edges allowed


# --- Shell --------------------------------------------------------------------------------

@pytest.mark.parametrize("changes, field, fragments", [
    (dict(inner_diameter=0.0), "inner_diameter", ["0 m", "> 0"]),
    (dict(baffle_spacing=-0.3), "baffle_spacing", ["-0.3 m", "> 0"]),
    (dict(baffle_cut=0.1), "baffle_cut", [">= 0.15 and <= 0.45"]),
    (dict(baffle_cut=0.5), "baffle_cut", [">= 0.15 and <= 0.45"]),
    (dict(baffle_cut="25%"), "baffle_cut", ["must be a number"]),
    (dict(sealing_strip_pairs=-1), "sealing_strip_pairs", [">= 0"]),
    (dict(sealing_strip_pairs=1.5), "sealing_strip_pairs", ["whole number"]),
])
def test_shell_refusals(changes, field, fragments):
    assert_refused(refused(Shell, SHELL, **changes), field, *fragments)


def test_shell_edges_allowed():
    Shell(**SHELL, baffle_cut=0.15)
    Shell(**SHELL, baffle_cut=0.45, sealing_strip_pairs=2)


# --- BoilingStream ------------------------------------------------------------------------

@pytest.mark.parametrize("changes, field, fragments", [
    (dict(fluid=42), "fluid", ["fluid = 42: must be text (a fluid name)"]),
    (dict(fluid="  "), "fluid", ["must not be empty"]),
    (dict(mass_flow=0.0), "mass_flow", ["0 kg/s", "> 0"]),
    (dict(inlet_pressure=-1.0), "inlet_pressure", ["-1 Pa", "> 0"]),
    (dict(inlet_pressure="1 bar"), "inlet_pressure", ["must be a number [Pa], not text"]),
    (dict(inlet_temperature=0.0), "inlet_temperature", ["0 K", "> 0"]),
    (dict(inlet_quality=1.0), "inlet_quality", [">= 0 and < 1"]),
    (dict(inlet_quality=-0.1), "inlet_quality", [">= 0 and < 1"]),
    (dict(inlet_temperature=350.0, inlet_quality=0.0), "inlet_quality", ["not both"]),
    (dict(fouling_resistance=0.01), "fouling_resistance", ["m^2*K/W", ">= 0 and < 0.01"]),
    (dict(fouling_resistance=-1e-4), "fouling_resistance", [">= 0 and < 0.01"]),
])
def test_boiling_refusals(changes, field, fragments):
    assert_refused(refused(BoilingStream, BOILING, **changes), field, *fragments)


# --- HeatingMedium ------------------------------------------------------------------------

TABLE = {"T": [300.0, 400.0, 500.0], "cp": [1800.0, 2100.0, 2400.0], "rho": [900.0, 840.0, 780.0],
         "mu": [0.03, 0.004, 0.0012], "k": [0.13, 0.125, 0.12]}


@pytest.mark.parametrize("base, changes, field, fragments", [
    (HEATING, dict(kind="oil"), "kind", ["'steam', 'liquid'"]),
    (HEATING, dict(fluid=3), "fluid", ["must be text (a fluid name)"]),
    (HEATING, dict(fluid=TABLE), "fluid", ["must be text"]),  # a table cannot condense
    (HEATING, dict(pressure=0.0), "pressure", ["0 Pa", "> 0"]),
    (HEATING, dict(fouling_resistance=0.02), "fouling_resistance", [">= 0 and < 0.01"]),
    (HEATING, dict(flow_arrangement="cross"), "flow_arrangement", ["'counter', 'co'"]),
    (LIQUID, dict(inlet_temperature=None), "inlet_temperature", ["needs inlet_temperature [K]"]),
    (LIQUID, dict(mass_flow=None), "mass_flow", ["needs mass_flow [kg/s]"]),
    (LIQUID, dict(mass_flow=-1.0), "mass_flow", ["> 0"]),
    (LIQUID, dict(fluid={"T": [300.0, 400.0]}), "fluid", ["T, cp, rho, mu, k"]),
    (LIQUID, dict(fluid={**TABLE, "k": [0.13, 0.12]}), "fluid.k", ["as many values as fluid.T (3)"]),
    (LIQUID, dict(fluid={**TABLE, "mu": [0.03, -0.004, 0.001]}), "fluid.mu[1]", [">= 1e-06", "Pa*s"]),
    (LIQUID, dict(fluid={**TABLE, "T": [300.0, 300.0, 500.0]}), "fluid.T", ["rise strictly"]),
])
def test_heating_refusals(base, changes, field, fragments):
    assert_refused(refused(HeatingMedium, base, **changes), field, *fragments)


def test_liquid_with_a_property_table_is_accepted():
    assert HeatingMedium(**{**LIQUID, "fluid": TABLE}).fluid == TABLE


# --- Methods and Limits -------------------------------------------------------------------

def test_methods_must_exist_in_their_family():
    error = refused(Methods, {}, flow_boiling="gungor_winterton_1968")
    assert_refused(error, "flow_boiling", "must be one of the flow_boiling methods", "gungor_winterton_1986")
    error = refused(Methods, {}, flow_boiling="gnielinski_1976")  # registered, other family
    assert_refused(error, "flow_boiling", "is a single_phase_tube method")
    error = refused(Methods, {}, tube_dryout="nope")
    assert_refused(error, "tube_dryout", "methods: auto, ")
    assert_refused(refused(Methods, {}, void_fraction=None), "void_fraction", "void_fraction methods")


def test_methods_accepts_registered_choices():
    assert Methods(single_phase_tube="dittus_boelter_1930", tube_dryout="auto").tube_dryout == "auto"


@pytest.mark.parametrize("changes, field, fragments", [
    (dict(chf_ratio=0.0), "chf_ratio", ["> 0 and <= 1"]),
    (dict(chf_ratio=1.2), "chf_ratio", ["> 0 and <= 1"]),
    (dict(critical_quality=1.0), "critical_quality", ["> 0 and < 1"]),
    (dict(critical_quality=0.0), "critical_quality", ["> 0 and < 1"]),
    (dict(min_nucleate_flux=-1.0), "min_nucleate_flux", ["W/m^2", ">= 0"]),
    (dict(min_temperature_approach=-1.0), "min_temperature_approach", ["K", ">= 0"]),
    (dict(kern_flux_cap=0.0), "kern_flux_cap", ["W/m^2", "> 0"]),
])
def test_limits_refusals(changes, field, fragments):
    assert_refused(refused(Limits, {}, **changes), field, *fragments)


def test_limits_edges_allowed():
    Limits(chf_ratio=1.0, critical_quality=0.5, min_nucleate_flux=0.0, kern_flux_cap=1e5)


# --- Case: own fields -------------------------------------------------------------------------

def case_kwargs(**changes):
    parts = dict(name="A", tubes=Tubes(**TUBES), boiling=BoilingStream(**BOILING),
                 heating=HeatingMedium(**HEATING))
    return {**parts, **changes}


@pytest.mark.parametrize("changes, field, fragments", [
    (dict(name=""), "name", ["must not be empty"]),
    (dict(name=None), "name", ["must be text (the case name)"]),
    (dict(type="falling_film"), "type", ["'evaporator', 'thermosiphon', 'kettle'"]),
    (dict(question="design"), "question", ["'performance', 'area_for_duty'"]),
    (dict(question="area_for_duty"), "required_duty", ["required_duty > 0 W"]),
    (dict(question="area_for_duty", required_duty=-5.0), "required_duty", ["-5 W", "> 0"]),
    (dict(increments=5), "increments", ["from 10 to 5000"]),
    (dict(increments=6000), "increments", ["from 10 to 5000"]),
    (dict(increments=10.5), "increments", ["whole number from 10 to 5000"]),
    (dict(tubes=TUBES), "tubes", ["must be a Tubes"]),
    (dict(shell=SHELL), "shell", ["must be a Shell or None"]),
    (dict(heating=HeatingMedium(**LIQUID)), "shell", ["heating.kind = 'liquid'"]),
])
def test_case_refusals(changes, field, fragments):
    assert_refused(refused(Case, case_kwargs(**changes)), field, *fragments)


# --- Case: rules that need properties ---------------------------------------------------------

def test_valid_cases_for_three_fluids():
    validate(Case(**case_kwargs(question="area_for_duty", required_duty=1e6, increments=10)))
    validate(Case(**case_kwargs(boiling=BoilingStream("R134a", 1.0, 414607.5, inlet_quality=0.2))))
    validate(Case(**case_kwargs(boiling=BoilingStream("n-Pentane", 1.0, 3e5, inlet_temperature=330.0),
                                heating=HeatingMedium(**LIQUID), shell=Shell(**SHELL),
                                increments=5000)))


def test_unknown_boiling_fluid_names_the_field_and_a_suggestion():
    error = refused(Case, case_kwargs(boiling=BoilingStream(**{**BOILING, "fluid": "Watr"})))
    assert_refused(error, "boiling.fluid", "'Watr'", "Water")


def test_unknown_steam_fluid():
    error = refused(Case, case_kwargs(heating=HeatingMedium(**{**HEATING, "fluid": "Stean"})))
    assert_refused(error, "heating.fluid", "'Stean'")


@pytest.mark.parametrize("fluid, P, P_crit", [
    ("Water", 2.3e7, "2.2064e+07"),   # IAPWS-95 critical point, 22.064 MPa
    ("R134a", 4.1e6, "4.05928e+06"),  # 4059276 Pa, tests/property_sets.py R10
])
def test_no_boiling_above_the_critical_pressure(fluid, P, P_crit):
    error = refused(Case, case_kwargs(boiling=BoilingStream(fluid, 1.0, P)))
    assert_refused(error, "boiling.inlet_pressure",
                   f"no boiling above the critical pressure (P_crit = {P_crit} Pa)")


def test_subcooled_inlet_at_or_above_saturation_is_refused():
    # n-pentane at 3 bar boils at 345.2551 K (tests/property_sets.py P3)
    error = refused(Case, case_kwargs(boiling=BoilingStream("n-Pentane", 1.0, 3e5, inlet_temperature=346.0),
                                      heating=HeatingMedium(**LIQUID), shell=Shell(**SHELL)))
    assert_refused(error, "boiling.inlet_temperature", "346 K",
                   "below the saturation temperature 345.26 K at 300000 Pa", "inlet_quality")


def test_steam_must_be_hotter_than_the_boiling_point():
    # water boils at 373.1243 K at 1 atm (property_sets W1); steam at 1.0 bar condenses
    # at 372.76 K (IAPWS-IF97 steam tables: 99.61 degC at 0.1 MPa)
    error = refused(Case, case_kwargs(heating=HeatingMedium(**{**HEATING, "pressure": 1.0e5})))
    assert_refused(error, "heating.pressure", "100000 Pa",
                   "must be hotter than the boiling point 373.12 K at 101325 Pa", "372.76 K")


def test_steam_above_its_critical_pressure_is_refused():
    error = refused(Case, case_kwargs(heating=HeatingMedium(**{**HEATING, "pressure": 2.5e7})))
    assert_refused(error, "heating.pressure", "below the critical pressure (P_crit = 2.2064e+07 Pa)")


def test_heating_liquid_must_be_hotter_than_the_boiling_point():
    # R134a at 414607.5 Pa boils at 283.15 K (property_sets R10)
    error = refused(Case, case_kwargs(boiling=BoilingStream("R134a", 1.0, 414607.5),
                                      heating=HeatingMedium(**{**LIQUID, "inlet_temperature": 283.0}),
                                      shell=Shell(**SHELL)))
    assert_refused(error, "heating.inlet_temperature", "283 K",
                   "must be hotter than the boiling point 283.15 K at 414608 Pa")


def test_fluids_without_a_saturation_curve_cannot_boil_or_condense():
    error = refused(Case, case_kwargs(boiling=BoilingStream(**{**BOILING, "fluid": "INCOMP::MEG-30%"})))
    assert_refused(error, "boiling.fluid", "needs a pure fluid with a saturation curve")
    error = refused(Case, case_kwargs(heating=HeatingMedium(**{**HEATING, "fluid": "INCOMP::MEG-30%"})))
    assert_refused(error, "heating.fluid", "kind 'steam'", "saturation curve")


def test_property_failures_are_reported_on_the_field():
    # CoolProp's MEG solutions cover 0..60 % by mass; 300 % is a typo
    error = refused(Case, case_kwargs(heating=HeatingMedium(**{**LIQUID, "fluid": "INCOMP::MEG-300%"}),
                                      shell=Shell(**SHELL)))
    assert_refused(error, "heating.fluid", "'INCOMP::MEG-300%'")
    # water's triple point is 611.655 Pa (IAPWS-95): no saturation below it
    error = refused(Case, case_kwargs(boiling=BoilingStream(**{**BOILING, "inlet_pressure": 100.0})))
    assert_refused(error, "boiling.inlet_pressure", "100 Pa", "611.655")


def test_a_boiling_fluid_without_transport_properties_is_refused():
    # CoolProp 8 has no thermal conductivity model for cyclohexane (common knowledge of
    # its fluid library, checked here by the refusal's own message): the rating needs it.
    with pytest.raises(InputError) as err:
        validate(Case(name="no transport", tubes=Tubes(count=10, length=2.0, outer_diameter=0.0254, bwg=14),
             boiling=BoilingStream(fluid="Cyclohexane", mass_flow=1.0, inlet_pressure=4e5),
             heating=HeatingMedium(kind="steam", pressure=10e5)))
    assert err.value.field == "boiling.fluid"
    assert "conductivity" in str(err.value) and "choose a fluid" in str(err.value)
