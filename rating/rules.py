"""Every warning Ebullio can give, as one table of rules, and the editable limits they read.

A rule is a code of our own, the severities it can have, the exchanger types that give
it, what it tests in words, the limits it reads (``Case.limits``, catalogue paths
``limits.<name>``, each with its source) or the basis of a fixed threshold, and its
message as a template. The checks that decide whether a rule fires live beside the
physics they look at (``rating.checks`` for every march, the exchanger modules for their
own); each fires through ``warn(code, ...)`` with its values in SI.

Templates name each value with its catalogue quantity and a number format,
``{q:heat_flux:.4g}``; a warning keeps the template and the SI values, so every surface
shows it in its own units (``render`` with a formatter), and ``message`` is the SI text
(JSON, the command line). ``python -m rating.rules DEVELOPERS.md`` rewrites the list of
rules in that file (a test fails when it is out of date).
"""
from __future__ import annotations

import dataclasses
import string
from dataclasses import dataclass

from .results import RatingWarning

ALL = ("evaporator", "thermosiphon", "kettle")
TS, KT = ("thermosiphon",), ("kettle",)
BUYS = "Buckley, Luyben & Shunta, Design of Distillation Column Control Systems (1985)"
SINNOTT = "Sinnott, Coulson & Richardson's Chemical Engineering Vol. 6"


# --------------------------------------------------------------------------- limits

@dataclass(frozen=True)
class Limit:
    """One editable threshold (``Case.limits.<name>``; its default is the dataclass's)."""

    name: str
    label: str
    quantity: str
    source: str
    hard: tuple | None = (0.0, None)
    hard_open: tuple = (True, False)

    @property
    def path(self) -> str:
        return f"limits.{self.name}"

    @property
    def types(self) -> tuple:
        return TS if self.name.startswith("thermosiphon_") else \
            KT if self.name.startswith("kettle_") else ALL


_FRACTION = dict(hard=(0.0, 1.0), hard_open=(True, False))
_LEVEL = dict(hard=(0.0, 2.0), hard_open=(False, False))

LIMITS = {lim.name: lim for lim in (
    Limit("chf_ratio", "Largest local flux / critical flux", "fraction",
          "Keep the local heat flux below about 0.7 of the critical heat flux (common "
          f"practice; {SINNOTT} applies a 0.7 factor to the Palen-Small maximum flux)",
          **_FRACTION),
    Limit("critical_quality", "Critical vapour quality (user limit)", "fraction",
          "User limit on the vapour quality at which dryout is assumed; none by default "
          "(the critical heat flux decides)", hard=(0.0, 1.0), hard_open=(True, True)),
    Limit("min_nucleate_flux", "Smallest flux for nucleate boiling", "heat_flux",
          "Boiling stays nucleate when the flux is at least about 2000 Btu/h ft^2 (6.3 kW/m^2) "
          "everywhere: 'Reboilers General Guidelines', rules-of-thumb handbook",
          hard_open=(False, False)),
    Limit("min_temperature_approach", "Smallest temperature approach", "temperature_difference",
          "Smallest local difference between heating medium and boiling fluid before a pinch "
          "is reported (common practice)", hard_open=(False, False)),
    Limit("kern_flux_cap", "Kern's flux cap", "heat_flux",
          "Kern (1950), Process Heat Transfer ch. 15: 37.9 kW/m^2 natural circulation with "
          "organics, 63 kW/m^2 forced circulation with organics, 95 kW/m^2 aqueous; a "
          "screening cap, off by default"),
    Limit("thermosiphon_max_exit_quality", "Largest exit vapour quality", "fraction",
          "Vertical thermosiphons are commonly designed for 5-25 wt% vapour at the outlet (a "
          f"circulation ratio of 5-20): {BUYS}, as reproduced on the web", **_FRACTION),
    Limit("thermosiphon_max_exit_quality_aqueous", "Largest exit vapour quality, aqueous",
          "fraction", "Aqueous thermosiphons run at an exit vapour mass fraction of about "
          "0.02-0.10 (common practice, often attributed to Fair 1960)", **_FRACTION),
    Limit("thermosiphon_circulation_ratio_min", "Smallest circulation ratio", "dimensionless",
          "Circulation ratio (kg through the tubes per kg of vapour made, 1 / exit quality) "
          f"usually 5-20: {BUYS}"),
    Limit("thermosiphon_circulation_ratio_max", "Largest circulation ratio", "dimensionless",
          f"Circulation ratio usually 5-20: {BUYS}"),
    Limit("thermosiphon_max_flux", "Largest mean heat flux", "heat_flux",
          "Mean heat flux of a natural-circulation reboiler; None applies Kern's limits "
          "(Process Heat Transfer, 1950, ch. 15): 37.9 kW/m^2 (12,000 Btu/h ft^2) for "
          "organics, 94.6 kW/m^2 (30,000) for water; conservative screening values"),
    Limit("thermosiphon_level_min_fraction", "Lowest column level / tube length", "fraction",
          "Column-base level between mid-height and the top tube sheet (flux is highest near "
          f"1/3 of the tube length and falls fast below): {BUYS}", **_LEVEL),
    Limit("thermosiphon_level_max_fraction", "Highest column level / tube length", "fraction",
          "Level at most at the top tube sheet; there the flux is some 10-15 % below its "
          f"maximum: {BUYS}", **_LEVEL),
    Limit("thermosiphon_level_min_fraction_vacuum", "Lowest level / tube length, vacuum",
          "fraction", "Below atmospheric pressure, a level of about 50-70 % of the tube "
          "length ('Thermosyphon reboiler', Chemical Engineering World)", **_LEVEL),
    Limit("thermosiphon_level_max_fraction_vacuum", "Highest level / tube length, vacuum",
          "fraction", "Below atmospheric pressure, a level of about 50-70 % of the tube "
          "length ('Thermosyphon reboiler', Chemical Engineering World)", **_LEVEL),
    Limit("thermosiphon_min_pressure", "Lowest column pressure", "pressure",
          "Thermosiphons are not normally specified below about 0.3 bar: static head "
          f"suppresses boiling ({SINNOTT}; from memory)", hard_open=(False, False)),
    Limit("thermosiphon_nozzle_rho_v2", "Largest nozzle rho v²", "momentum_flux",
          "TEMA: tube-side nozzles rho v^2 <= 6,000 lb/ft s^2 (8,928 kg/m s^2)"),
    Limit("thermosiphon_max_subcooled_fraction", "Longest subcooled zone / tube length",
          "fraction", "Ebullio's default for a long sensible-heating zone: in a typical unit "
          f"pure liquid fills only a few inches above the bottom tube sheet ({BUYS}); static "
          "head lengthens the zone (Arneth & Stichlmair 2001)", **_FRACTION),
    Limit("kettle_bundle_flux_ratio", "Largest bundle flux / bundle limit", "dimensionless",
          "Average bundle heat flux at most the bundle maximum flux (Palen 1983, single-tube "
          "maximum x bundle geometry factor; the Wolverine Engineering Data Book kettle "
          f"example compares the two directly). {SINNOTT} designs to 0.7 of the Palen-Small "
          "maximum"),
    Limit("kettle_min_bundle_factor", "Smallest bundle geometry factor", "fraction",
          "Palen's bundle geometry factor Phi_b below 0.1 calls for vapour lanes or a wider "
          "pitch (Wolverine Engineering Data Book, kettle example, after Palen & Small 1964)",
          hard=(0.0, 1.0), hard_open=(False, False)),
    Limit("kettle_surface_velocity_constant", "Surface vapour velocity constant", "velocity",
          "Vapour velocity at the liquid surface at most 0.2 [(rho_l - rho_v)/rho_v]^0.5 m/s "
          f"against entrainment ({SINNOTT}, eq. 12.75)"),
    Limit("kettle_min_freeboard", "Smallest freeboard", "length",
          "Freeboard between the liquid level and the top of the kettle shell at least "
          f"0.25 m ({SINNOTT})", hard_open=(False, False)),
    Limit("kettle_min_level_over_bundle", "Smallest liquid level over the bundle", "length",
          "The overflow weir holds the level so that it just covers the top of the bundle "
          "(common practice); uncovered tubes are rated as if submerged in the froth",
          hard=(-10.0, 10.0), hard_open=(False, False)),
    Limit("kettle_vapour_nozzle_rho_v2", "Largest vapour nozzle rho v²", "momentum_flux",
          "TEMA RCB-4.62: rho v^2 at shell and bundle entrance and exit areas at most 4,000 "
          "lb/ft s^2 (5,953 kg/m s^2), applied at the vapour outlet"),
    Limit("kettle_inlet_nozzle_rho_v2", "Largest liquid inlet nozzle rho v²", "momentum_flux",
          "TEMA RCB-4.61: impingement protection at the shell inlet above 500 lb/ft s^2 "
          "(744 kg/m s^2) for liquids at their boiling point"),
)}


# --------------------------------------------------------------------------- rules

@dataclass(frozen=True)
class Rule:
    """One warning the product can give."""

    code: str
    severities: tuple           # the first is the usual one
    types: tuple                # exchanger types that can give it
    tests: str                  # what it tests, in words
    message: str                # template: {name:quantity:format}
    limits: tuple = ()          # names of the Case.limits it reads
    basis: str = ""             # source of a fixed threshold, or why there is none
    untriggered: str = ""       # why no test case can trigger it ("" = one does)


def _r(code, severities, types, tests, message, limits=(), basis="", untriggered=""):
    sev = (severities,) if isinstance(severities, str) else tuple(severities)
    return Rule(code, sev, types, tests, message, tuple(limits), basis, untriggered)


_MARCH = "the march's stations"
RULES = {r.code: r for r in (
    # --- every march (rating.checks)
    _r("dryout", ("warning", "error"), ALL,
       "the march reached the critical heat flux, the critical quality or quality 1 "
       "(an error when the liquid is still subcooled there)",
       "{what:text} z = {z:length:.3f}{why:text}; downstream {wall:text} rises to "
       "{t_wall:temperature:.1f}", limits=("critical_quality",),
       basis="the tube dryout method chosen (Methods.tube_dryout)"),
    _r("chf-margin", "warning", ALL,
       "the largest ratio of local heat flux to critical heat flux on the wet wall, when "
       "no dryout is found",
       "local heat flux {q:heat_flux:.4g} is {ratio:fraction:.2f} of the critical heat flux "
       "{q_chf:heat_flux:.4g} (limit {limit:fraction:.2f})", limits=("chf_ratio",)),
    _r("film-boiling-superheat", "warning", ALL,
       "the wall superheat against the superheat at which nucleate boiling reaches the pool "
       "critical flux (Lienhard & Dhir 1973; a kettle: Palen's single-tube maximum)",
       "wall superheat {dT:temperature_difference:.1f} exceeds "
       "{dT_crit:temperature_difference:.1f}{where:text}: transition or film boiling is "
       "possible; {remedy:text}",
       basis="Lienhard & Dhir (1973) pool critical flux with the chosen nucleate method; "
             "Palen (1983) single-tube maximum for a kettle"),
    _r("low-flux", ("info", "warning"), ALL,
       "the smallest heat flux where the liquid boils (information only in a forced-flow "
       "evaporator)",
       "heat flux falls to {q:heat_flux:.4g}, below {limit:heat_flux:.4g} for stable nucleate "
       "boiling", limits=("min_nucleate_flux",)),
    _r("temperature-cross", "error", ALL,
       "the heating medium colder than the boiling fluid anywhere on the path",
       "the heating medium is {dT:temperature_difference:.2f} colder than the boiling fluid: "
       "no heat transfer beyond this point",
       basis="thermodynamics: heat flows from hot to cold",
       untriggered="a guard: each increment ends where the heating medium reaches the "
                   "boiling temperature, so no case tried crosses"),
    _r("pinch", "warning", ALL,
       "the smallest local temperature difference between heating medium and boiling fluid",
       "temperature approach falls to {dT:temperature_difference:.2f} (limit "
       "{limit:temperature_difference:.2f})", limits=("min_temperature_approach",)),
    _r("kern-cap", "warning", ALL,
       "the largest outside heat flux against Kern's screening cap, when the user sets one",
       "heat flux {q:heat_flux:.4g} above the Kern limit {limit:heat_flux:.4g} (a screening "
       "cap, not a CHF prediction)", limits=("kern_flux_cap",)),
    _r("method-range", "warning", ALL,
       "every validity bound of every method evaluated, once per method and bound, at the "
       "first position it is crossed",
       "{note:text} (first at z = {z:length:.3f})",
       basis="the validity ranges of each method's registry record (rating.correlations)"),
    _r("method-substituted", "info", ALL,
       "a method used in place of the chosen one (outside the chosen one's reach)",
       "{note:text} (from z = {z:length:.3f})",
       basis="the method trail of the march",
       untriggered="needs the in-tube critical flux floored by the pool value at more than "
                   "half of it; no sample or variant tried reaches it"),
    # --- in-tube evaporator
    _r("duty-not-reached", "error", ALL,
       "the required duty (question area_for_duty or a duty given) against the duty found",
       "{note:text}", basis="the required duty of the case"),
    _r("multipass-approximation", "info", ("evaporator",),
       "several tube passes against a single-phase heating medium",
       "{passes:count:d} tube passes against a single-phase heating medium are treated as "
       "one pure counter- or co-current path (no F-factor)",
       basis="a modelling simplification of this version"),
    # --- thermosiphon
    _r("will-not-circulate", "error", TS,
       "no wet, statically stable balance of the loop's driving head and losses",
       "{note:text}", basis="the loop's pressure balance"),
    _r("dry-balance", "error", TS,
       "a balance of the loop at which all the liquid evaporates in the tubes",
       "the loop also balances at {W:mass_flow:.4g}, but there every drop of the liquid "
       "evaporates in the tubes (exit quality {x:fraction:.3f}): a dry, overheated tube, not a "
       "recirculating operating point", basis="the loop's pressure balance",
       untriggered="needs a loop whose balance curve crosses twice, once dry; "
                   "tests/test_thermosiphon.py builds the crossings directly"),
    _r("unstable-operating-point", "warning", TS,
       "a balance where the required pressure difference falls as the flow rises",
       "the loop also balances at {W:mass_flow:.4g}, where the required pressure difference "
       "falls as the flow rises ({slope:dimensionless:.3g} Pa s/kg): statically unstable "
       "(Ledinegg), not an operating point", basis="Ledinegg (1938) static instability",
       untriggered="needs a loop curve that turns twice; tests/test_thermosiphon.py builds "
                   "the crossing directly"),
    _r("multiple-operating-points", "warning", TS,
       "more than one stable, wet balance of the loop",
       "the loop has {n:count:d} stable balances ({flows:text} kg/s); rated at the highest "
       "circulation. The loop may settle at another one after an upset",
       basis="the loop's pressure balance",
       untriggered="needs a loop curve with two stable wet crossings; none found among the "
                   "samples and their variants"),
    _r("negative-slope", ("warning", "info"), TS,
       "a range of flows where the required pressure difference falls as the flow rises "
       "(a warning within a factor 2 of the operating flow)",
       "the required pressure difference falls as the flow rises between {lo:mass_flow:.3g} "
       "and {hi:mass_flow:.3g} (operating at {W:mass_flow:.4g}): a change of level or duty "
       "that takes the circulation there can start a flow excursion (Ledinegg); more "
       "inlet-line resistance steadies the loop", basis="Ledinegg (1938) static instability"),
    _r("exit-quality", "warning", TS,
       "the exit vapour mass fraction (the aqueous limit for water)",
       "exit vapour mass fraction {x:fraction:.3f} is above {limit:fraction:.3f}{service:text}: "
       "too little circulation for the duty; fouling and dryout become likely",
       limits=("thermosiphon_max_exit_quality", "thermosiphon_max_exit_quality_aqueous")),
    _r("circulation-ratio", ("warning", "info"), TS,
       "the circulation ratio below the usual band (warning) or above it, or no vapour (info)",
       "{what:text}: {effect:text}",
       limits=("thermosiphon_circulation_ratio_min", "thermosiphon_circulation_ratio_max")),
    _r("mist-flow", "warning", TS,
       "the flow pattern reaching mist flow in the tubes",
       "mist flow from z = {z:length:.3f} (quality {x:fraction:.3f}): the wall is dry there",
       basis="the flow-pattern map of the march"),
    _r("thermosiphon-max-flux", "warning", TS,
       "the mean heat flux against a natural-circulation limit (Kern's when none is set)",
       "mean heat flux {q:heat_flux:.4g} is above {limit:heat_flux:.4g}{source:text}",
       limits=("thermosiphon_max_flux",)),
    _r("nozzle-rho-v2", "warning", ("thermosiphon", "kettle"),
       "rho v^2 in the thermosiphon's inlet and outlet nozzles, or a kettle's vapour outlet",
       "{name:text} rho v^2 = {rv2:momentum_flux:.4g} is above {limit:momentum_flux:.4g}: "
       "{remedy:text}", limits=("thermosiphon_nozzle_rho_v2", "kettle_vapour_nozzle_rho_v2")),
    _r("long-subcooled-zone", "warning", TS,
       "the length over which the liquid heats without net boiling, as a share of the tube",
       "the liquid heats without net boiling over {z:length:.3f} ({share:fraction:.0%} of the "
       "tube): the static head raises its saturation temperature by "
       "{rise:temperature_difference:.2f} at the bottom tube sheet",
       limits=("thermosiphon_max_subcooled_fraction",)),
    _r("liquid-level", "warning", TS,
       "the column liquid level as a share of the tube length (a narrower band under vacuum)",
       "liquid level {level:length:.3g} is {share:fraction:.0%} of the tube length, outside the "
       "usual {lo:fraction:.0%}-{hi:fraction:.0%}{vacuum:text}",
       limits=("thermosiphon_level_min_fraction", "thermosiphon_level_max_fraction",
               "thermosiphon_level_min_fraction_vacuum", "thermosiphon_level_max_fraction_vacuum")),
    _r("return-submerged", "warning", TS,
       "the column liquid level above the return nozzle",
       "the liquid level is {height:length:.3g} above the return nozzle: the return "
       "discharges under liquid; a level at the return nozzle can stop the circulation and "
       "flood the column", basis="common practice: the return enters the vapour space"),
    _r("low-pressure", "warning", TS,
       "the column pressure",
       "column pressure {P:pressure:.4g} is below {limit:pressure:.4g}, where thermosiphons "
       "are not normally used: the static head suppresses boiling",
       limits=("thermosiphon_min_pressure",)),
    _r("mass-flow-ignored", "info", TS,
       "a boiling mass flow given for a thermosiphon",
       "boiling.mass_flow = {m:mass_flow:.4g} is not used: a thermosiphon's circulation "
       "follows from the pressure balance", basis="the loop finds its own flow"),
    # --- kettle
    _r("bundle-flux-limit", "warning", KT,
       "the bundle's average heat flux against its maximum (Palen 1983 x the ratio)",
       "average heat flux {q:heat_flux:.4g} exceeds {ratio:dimensionless:g} x the bundle "
       "maximum flux {q_max:heat_flux:.4g} (bundle geometry factor Phi_b = "
       "{phi:dimensionless:.3f}): vapour blankets the bundle; consider {remedy:text}",
       limits=("kettle_bundle_flux_ratio", "kettle_min_bundle_factor")),
    _r("bundle-flux-local", "info", KT,
       "a local heat flux above the bundle maximum while the average stays below it",
       "local heat flux {q:heat_flux:.4g} in the inlet region exceeds {ratio:dimensionless:g} "
       "x the bundle maximum flux {q_max:heat_flux:.4g}, an average-flux criterion; the average "
       "{q_mean:heat_flux:.4g} is below it", limits=("kettle_bundle_flux_ratio",)),
    _r("bundle-factor-small", "warning", KT,
       "Palen's bundle geometry factor Phi_b",
       "bundle geometry factor Phi_b = {phi:dimensionless:.3f} is below {limit:dimensionless:g}"
       ": the bundle is too dense for the vapour to leave; use vapour lanes or a wider pitch",
       limits=("kettle_min_bundle_factor",)),
    _r("bundle-uncovered", "warning", KT,
       "the liquid level (weir plus crest) over the top of the bundle",
       "the liquid level ({weir:length:.4g} weir plus {crest:length:.3f} crest) {state:text}; "
       "uncovered tubes are rated as if submerged: raise the weir",
       limits=("kettle_min_level_over_bundle",)),
    _r("freeboard", "warning", KT,
       "the height between the liquid level and the top of the kettle shell",
       "freeboard {h:length:.3f} above the liquid is below {limit:length:.4g}: entrainment; "
       "a larger kettle shell or a lower weir", limits=("kettle_min_freeboard",)),
    _r("entrainment", "warning", KT,
       "the vapour velocity at the liquid surface",
       "{what:text}: liquid carry-over; a kettle shell of at least {d_min:length:.3g} would "
       "meet {u_max:velocity:.3g}", limits=("kettle_surface_velocity_constant",)),
    _r("impingement", "warning", KT,
       "rho v^2 at the feed inlet nozzle",
       "rho v^2 at the liquid inlet {rv2:momentum_flux:.4g} exceeds {limit:momentum_flux:.4g}: "
       "an impingement plate is needed", limits=("kettle_inlet_nozzle_rho_v2",)),
    _r("kettle-dry", "error", KT,
       "the duty against the feed: all of it vaporised",
       "the duty would vaporise all the feed (outlet quality {x:dimensionless:.3f}): nothing "
       "overflows the weir, the level falls and tubes uncover; the duty is not reachable with "
       "this feed", basis="mass balance of the pool",
       untriggered="always replaced by feed-boiled-dry, which fails the rating"),
    _r("feed-boiled-dry", "error", KT,
       "a feed smaller than the vapour the duty makes: the rating fails",
       "{note:text}", basis="mass balance of the pool"),
    _r("tube-count", ("warning", "info"), KT,
       "the tube count against the count that fits the bundle (Phadke 1984)",
       "{note:text}", basis="Phadke (1984) tube count, with pass-lane allowance"),
    _r("steam-blow-through", "info", KT,
       "a given steam flow leaving the last pass not all condensed",
       "the steam leaves the last pass with quality {x:fraction:.3f}: it is not all "
       "condensed", basis="a steam trap holds it back (common practice)"),
    _r("condensate-flooding", "info", KT,
       "a given steam flow all condensed before the end of the tube path",
       "the steam is all condensed at z = {z:length:.3f}; the last {rest:length:.3f} of the "
       "path runs full of condensate", basis="the heating medium's energy balance"),
    _r("steam-pressure-drop", "warning", KT,
       "the tube-side pressure drop of condensing steam against 10 % of its pressure",
       "tube-side pressure drop {dp:pressure_difference:.4g} is more than {share:fraction:.0%} "
       "of the steam pressure; its fall in condensing temperature is not modelled",
       basis="the march keeps the condensing temperature: 10 % of the pressure (common "
             "practice)"),
    _r("fixed-heating-htc", "info", KT,
       "a tube-side film coefficient fixed by the input",
       "tube-side film coefficient fixed at {htc:htc:.4g} by the input",
       basis="the user's input"),
    # --- every rating: what it took from its inputs (rating.derived, rating.rate)
    _r("tubes-spread-over-passes", "info", ALL,
       "a tube count the passes do not divide",
       "{count:count:d} tubes in {passes:count:d} passes: marched as {per:dimensionless:.4g} "
       "tubes a pass (passes of {more:count:d} and {fewer:count:d} tubes taken at their mean "
       "flow area), so every tube counts", basis="a modelling choice"),
    _r("dimension-defaulted", "warning", KT,
       "a kettle dimension left empty and taken from published practice",
       "kettle.{name:text} was not given: {value:length:.4g} taken from {how:text}; give "
       "the datasheet value to rate the real shell", basis="rating.case.KETTLE_DEFAULTS"),
    _r("coefficient-set-by-user", "warning", ALL,
       "a film coefficient fixed, or a multiplier on a method, by the user",
       "{what:text}: the result rests on that value", basis="the user's input"),
    _r("mixture-as-pure-fluid", ("warning", "info"), ALL,
       "a mixture rated as a pseudo-pure fluid (a warning above a 2 K boiling range)",
       "{fluid:text} is rated as a pseudo-pure fluid: boiling at its bubble point, with a "
       "boiling range (dew minus bubble point) of {span:temperature_difference:.2f} at the "
       "inlet pressure; the bubble point's rise along the path and the mass-transfer penalty "
       "on boiling are not modelled{kettle:text}",
       basis="common practice: beyond a few kelvin of boiling range the pseudo-pure "
             "rating misses the bubble point's rise"),
    _r("user-property-table", "info", ALL,
       "boiling-side properties from a user's saturation table",
       "boiling-side properties from the user's saturation table {name:text} "
       "({lo:temperature:.5g} to {hi:temperature:.5g}); methods that need fluid-specific "
       "constants (look-up tables, reference coefficients) have none for it",
       basis="the user's input"),
    _r("input-outside-usual-range", "warning", ALL,
       "every numeric input against its usual range in the catalogue (a unit typed wrong)",
       "{note:text}", basis="rating.catalogue usual ranges (common practice)"),
    # --- a rating that ends without an answer
    _r("no-convergence", "error", ALL,
       "a rating that found no solution", "{note:text}", basis="the solver's outcome"),
    _r("cancelled", "info", ALL,
       "a rating stopped by its caller", "{note:text}", basis="the caller's cancel flag"),
)}


# --------------------------------------------------------------------------- messages

class _Formatter(string.Formatter):
    """``{name:quantity:format}`` with the value and quantity handed to ``fmt``."""

    def __init__(self, fmt):
        super().__init__()
        self.fmt = fmt

    def format_field(self, value, format_spec):
        quantity, _, spec = format_spec.partition(":")
        return self.fmt(value, quantity or "text", spec)


def si_text(value, quantity: str, spec: str) -> str:
    """A value in SI with its unit: the text of ``RatingWarning.message``."""
    from .catalogue import QUANTITIES

    if quantity == "text" or isinstance(value, str):
        return str(value)
    text = format(value, spec or ".4g")
    unit = QUANTITIES[quantity]
    return f"{text} {unit}" if unit not in ("", "-") and not spec.endswith("%") else text


def render(template: str, values: dict, fmt=si_text) -> str:
    """A message from its template and SI values, each value formatted by ``fmt(value,
    quantity, format)`` (``si_text`` by default)."""
    return _Formatter(fmt).vformat(template, (), values)


def quantities(template: str) -> dict:
    """name -> catalogue quantity of each value a template names."""
    return {name: (spec.partition(":")[0] or "text")
            for _, name, spec, _ in string.Formatter().parse(template) if name}


class Said(str):
    """A solver's message that keeps its template and SI values (as ``RangeNote`` does for
    a crossed validity bound): equal to, and used as, its SI text; a warning made from it
    by ``note`` shows its numbers in the reader's units."""

    template: str
    values: tuple

    def __reduce__(self):   # outcomes cross process boundaries (studies)
        return (_said, (self.template, self.values))


def said(template: str, **values) -> Said:
    """A message from ``template`` (``{name:quantity:format}``) and SI ``values``."""
    return _said(template, tuple(values.items()))


def _said(template: str, values: tuple) -> Said:
    text = Said(render(template, dict(values)))
    text.template, text.values = template, values
    return text


def warn(code: str, severity: str | None = None, z: float | None = None, **values) -> RatingWarning:
    """The warning of rule ``code`` with its values (SI) and position ``z`` [m]."""
    rule = RULES[code]
    if z is not None:
        values.setdefault("z", z)
    severity = severity or rule.severities[0]
    if severity not in rule.severities:
        raise ValueError(f"rule {code!r} has no severity {severity!r}")
    return RatingWarning(code, severity, render(rule.message, values), z, rule.message,
                         tuple(values.items()))


def note(code: str, text: str, severity: str | None = None, z: float | None = None):
    """A warning whose message is a text made elsewhere (a solver's, the catalogue's).

    A text that keeps its own template and values (a crossed validity bound,
    ``rating.correlations.registry.RangeNote``) lends them to the warning, so that its
    numbers too are shown in the reader's units; the SI message stays the text's.
    """
    made = warn(code, severity, z, note=text)
    inner = getattr(text, "template", None)
    if inner is None:
        return made
    values = {**dict(text.values), **({"z": z} if z is not None else {})}
    return dataclasses.replace(made, template=made.template.replace("{note:text}", inner),
                               values=tuple(values.items()))


# --------------------------------------------------------------------------- the list

def rows() -> list[dict]:
    """Every rule with its limits' paths, defaults, units and sources: what the desktop's
    and the report's list of warnings show."""
    from .case import Limits
    from .catalogue import QUANTITIES

    defaults = Limits()
    out = []
    for rule in RULES.values():
        limits = [{"path": LIMITS[n].path, "label": LIMITS[n].label,
                   "default": getattr(defaults, n), "unit": QUANTITIES[LIMITS[n].quantity],
                   "quantity": LIMITS[n].quantity, "source": LIMITS[n].source}
                  for n in rule.limits]
        out.append({"code": rule.code, "severities": rule.severities, "types": rule.types,
                    "tests": rule.tests, "limits": limits, "basis": rule.basis,
                    "message": render(rule.message, _placeholders(rule.message))})
    return out


def _placeholders(template: str) -> dict:
    return {name: f"<{name}>" for name in quantities(template)}


def markdown() -> str:
    """The list of rules as a Markdown table (DEVELOPERS.md's generated block)."""
    lines = ["| code | severity | types | what it tests | limit (default) | source |",
             "|---|---|---|---|---|---|"]
    for row in rows():
        limits = "; ".join(f"`{x['path']}` ({_default(x)})" for x in row["limits"]) or "fixed"
        source = "; ".join(x["source"] for x in row["limits"])
        if row["basis"]:
            source = f"{source}; {row['basis']}" if source else row["basis"]
        types = "all" if tuple(row["types"]) == ALL else ", ".join(row["types"])
        cells = (f"`{row['code']}`", " or ".join(row["severities"]), types, row["tests"],
                 limits, source)
        lines.append("| " + " | ".join(c.replace("|", "/") for c in cells) + " |")
    return "\n".join(lines) + "\n"


def _default(limit: dict) -> str:
    value = limit["default"]
    if value is None:
        return "off"
    unit = "" if limit["unit"] in ("", "-") else " " + limit["unit"]
    return f"{value:g}{unit}"


BEGIN = "<!-- begin: warning rules (generated by python -m rating.rules DEVELOPERS.md) -->"
END = "<!-- end: warning rules -->"


def with_block(text: str) -> str:
    """``text`` (DEVELOPERS.md) with its generated block of rules made anew."""
    head, _, rest = text.partition(BEGIN)
    _, _, tail = rest.partition(END)
    return f"{head}{BEGIN}\n{markdown()}{END}{tail}"


if __name__ == "__main__":  # pragma: no cover - a maintainer's command
    import sys
    from pathlib import Path

    path = Path(sys.argv[1] if len(sys.argv) > 1 else "DEVELOPERS.md")
    path.write_text(with_block(path.read_text(encoding="utf-8")), encoding="utf-8")
