"""Kettle reboiler (TEMA K shell): a horizontal bundle submerged in a boiling pool.

The heating medium (condensing steam or a hot liquid) flows inside the tubes and is
marched along the tube-side path pass by pass (``rating.pool_march.PoolMarcher``);
the boiling fluid is a pool outside the bundle, held by an overflow weir, whose
vapour leaves through the vapour space at the given pressure. Geometry and input
meanings: ``rating.case.KettleShell``.

Tube side: condensing steam takes the larger of Shah's (1979) annular-film
coefficient and Chato's (1962) stratified one (Nusselt's horizontal-cylinder film
with C = 0.555 on the inside diameter), then the chosen single-phase method for any
condensate; a liquid takes the single-phase method (``Methods.single_phase_tube``).
Steam behind a trap (no steam flow given) is iterated until it leaves as condensate.

Shell side (Palen 1983, Heat Exchanger Design Handbook 3.6; Wolverine Engineering
Data Book ch. 5 kettle example):

* the tube-side passes are stacked in horizontal bands of equal tube count, the
  inlet pass on top (steam enters at the top and its condensate drains from the
  bottom pass); each band boils at the saturation temperature of the vapour-space
  pressure plus the head of clear liquid between the weir crest height and the
  band's centroid (a conservative head: the froth in the bundle is lighter);
* bundle coefficient htc_b = F_b F_m htc_nb(q) + htc_nc: the chosen nucleate method
  at the local flux (Mostinski is used in Palen's reboiler form, pressure factor
  1.8 p_r^0.17, to which F_b belongs), Palen's bundle factor F_b, the mixture factor
  F_m (exactly 1 for a pure fluid, ``KettleShell.boiling_range`` = 0), and natural
  convection on a horizontal cylinder (Churchill & Chu 1975);
* bundle maximum flux: Palen's single-tube maximum times his geometry factor
  Phi_b = 2.2 pi D_b L / A (``palen_1983``, default) or Palen & Small (1964),
  evaluated at the vapour-space pressure. The subcooled part of a feed mixes into
  the saturated pool (Sinnott, Coulson & Richardson Vol. 6): its sensible heat is
  part of the duty, the boiling temperatures are the pool's.

Disengagement: the vapour leaves the liquid surface, a chord of the kettle shell at
the weir level plus the Francis (1883) crest of the overflow, over the straight tube
length; its velocity is held against Sinnott's entrainment limit
u = C [(rho_l - rho_v)/rho_v]^0.5 (C = 0.2 m/s by default), and the smallest kettle
diameter that meets it at the same level is reported.

Summary keys (the evaporator's, with a kettle meaning):

* ``duty_W``: heat taken up by the pool, the sum of the local flux over the outer
  area; ``duty_heating_side_W``: m (h_in - h_out) of the tube-side medium.
* ``area_m2``: outer area of the straight tube lengths (U-bends not counted).
* ``u_clean_W_m2K``, ``u_service_W_m2K``: local U on the outer area, averaged over the
  area; ``mean_temperature_difference_K`` = duty / (U_service A), the effective one.
* ``over_design_pct``, ``required_area_m2`` (area for duty): the tube length is scaled
  until the bundle takes the required duty (same tubes, bundle and passes);
  over-design = A / A_required - 1.
* ``exit_quality``: vapour mass fraction of the kettle outlet (vapour over feed);
  ``exit_temperature_K``: saturation at the vapour space (vapour and overflow liquid).
  A feed that would all boil off is a failed rating (the level would fall); a feed
  that leaves below saturation gives ``exit_subcooling_K`` instead of a quality.
* ``static_head_over_bundle_Pa``: the liquid head from the weir level to the bottom of
  the bundle, by which the boiling pressure there exceeds the vapour-space pressure;
  ``pressure_drop_boiling_Pa`` is None (a pool has no flow pressure drop).
* ``pressure_drop_heating_Pa``: tube-side friction (two-phase method for condensing
  steam) plus, for a liquid, Kern's four velocity heads per pass for the returns.
* ``heating_outlet_temperature_K``: tube-side outlet; ``steam_flow_kg_s``: the steam.
* ``max_heat_flux_W_m2``: the largest local flux on the outer (boiling) surface;
  ``max_chf_ratio``: the bundle's mean flux over the bundle maximum flux (Palen's
  limit is one on the mean flux, so mean by mean).
* ``dryout_z_m``: always None; a kettle's burnout limit is the bundle maximum flux.

and the kettle's own: ``bundle_max_heat_flux_W_m2``, ``bundle_factor`` (Palen's
geometry factor Phi_b, whichever maximum-flux method is chosen),
``vapour_flow_kg_s`` (vapour leaving the liquid surface, feed vapour included),
``surface_vapour_velocity_m_s``, ``surface_vapour_velocity_limit_m_s``,
``min_kettle_diameter_m``, plus the mean flux (``mean_heat_flux_W_m2``), single-tube maximum flux, mixture
factor, level over the bundle, freeboard, overflow and nozzle rho v^2.

Profiles are along the tube-side path with the evaporator's keys (meanings in
``rating.pool_march.PoolMarcher``: ``quality`` is the pool's mixed outlet quality
reached with the duty up to z, ``void_fraction`` is not computed), plus
``tube_pass`` (1 = the inlet pass) and, for steam, ``heating_quality``.

Not modelled: the froth level and void in the bundle and the circulation they drive
(beyond F_b), uncovered tubes (rated as if submerged, and warned about), the
entrainment ratio of Nakajima, Palen & Taborek, heavy-component build-up in the pool,
the U-bends' area, superheated steam (no desuperheating zone), the fall of the steam
temperature with its pressure drop (reported and warned about), flow-induced
vibration.
"""
from __future__ import annotations

import copy
import dataclasses
import math

from ..roots import brentq

from .. import checks
from ..adjust import of_side
from ..correlations import registry
from ..correlations.dimensionless import g
from ..correlations.pool_boiling import (bundle_geometry_factor,
                                         nucleate_fluid_constants)
from ..errors import PropertyError
from ..derived import inlet_enthalpy
from ..march import DUTY_CHECK_LENGTH_FACTOR, Cancelled, ProgressShare, integrate_along_z
from ..pool_march import PoolMarcher
from ..properties import make_fluid
from ..results import MethodUsed, RatingWarning, Result, cancelled, failed, profiles_from_stations
from ..rules import note, said, warn
from .bundle_pool import PoolBand
from .heating import InTubeHeating

#: Default increment count along the tube-side path, shared among the passes:
#: doubling it moves the duty by well under 0.5 % on the samples (see tests).
DEFAULT_INCREMENTS = 24

#: Francis (1883) sharp-crested weir without end contractions: Q = 1.84 L h^1.5 (SI)
#: [memory; the usual hydraulics-textbook form].
FRANCIS_WEIR = 1.84
#: Kern (1950) Process Heat Transfer eq. 7.46: four velocity heads lost per tube pass
#: for the returns [memory].
RETURN_VELOCITY_HEADS = 4.0
#: Steam trap: the steam flow is iterated until the steam leaves with the quality
#: TRAP_EXIT_QUALITY to within TRAP_TOLERANCE, in at most TRAP_MARCHES secant steps. The
#: target is on the wet side so that no sliver of condensate, with its low flux, ends
#: the path.
TRAP_EXIT_QUALITY = 2e-3
TRAP_TOLERANCE = 1e-3
TRAP_MARCHES = 8
#: A tube-side pressure drop above this share of the steam pressure gets a note: the
#: steam temperature is taken at the inlet pressure along the whole path.
STEAM_DP_SHARE = 0.1
#: A given tube count above the estimate for the bundle diameter by this factor is flagged.
COUNT_MARGIN = 1.05


# --------------------------------------------------------------------------- geometry

def default_pitch(tubes) -> float:
    """The tube pitch, 1.25 x the outer diameter when none is given [m]."""
    return tubes.pitch if tubes.pitch is not None else 1.25 * tubes.outer_diameter


def estimate_tube_count(bundle_diameter, tube_outer_diameter, pitch, layout_angle, passes) -> int:
    """Tube ends that fit a bundle of outer tube limit ``bundle_diameter``.

    Phadke's (1984) exact count of the tube centres of the layout within the
    centre-line circle D_b - d_o, less the tubes displaced by pass-partition lanes
    (ht.hx.Ntubes_Phadkeb, 1, 2, 4, 6 or 8 passes). For a U-tube bundle the count is
    of tube ends (two per U-tube), the pass lane standing for the U-bends' centre lane.
    Phadke, P.S. (1984) Determining tube counts for shell and tube exchangers, Chem.
    Eng. 91 (September), 65-68 (as cited by ht).

    Parameters
    ----------
    bundle_diameter : float
        Outer tube limit diameter D_b [m]
    tube_outer_diameter : float
        Tube outer diameter [m]
    pitch : float
        Tube pitch [m]
    layout_angle : int
        30, 45, 60 or 90 [deg]
    passes : int
        Tube passes [-]
    """
    from ht.hx import Ntubes_Phadkeb  # ht (and numpy) only when a count is estimated
    return Ntubes_Phadkeb(bundle_diameter, tube_outer_diameter, pitch, passes, layout_angle)


def band_centroids(bundle_diameter, passes) -> list[float]:
    """Heights of the centroids of ``passes`` horizontal strips of equal area, top first.

    Measured from the bundle centre [m]; the strips divide the bundle circle so that
    each pass has the same share of the tubes.
    """
    R = 0.5 * bundle_diameter

    def area_above(y):        # circular segment above the chord at height y
        c = max(-1.0, min(1.0, y / R))
        return R * R * (math.acos(c) - c * math.sqrt(1.0 - c * c))

    def moment_above(y):      # its first moment about the centre line
        return 2.0 / 3.0 * max(R * R - y * y, 0.0) ** 1.5

    bounds = [R]
    for k in range(1, passes):
        share = k * math.pi * R * R / passes
        bounds.append(brentq(lambda y: area_above(y) - share, -R, R, xtol=1e-12 * R))
    bounds.append(-R)
    return [(moment_above(lo) - moment_above(hi)) / (area_above(lo) - area_above(hi))
            for hi, lo in zip(bounds, bounds[1:])]


def chord(diameter, height) -> float:
    """Width of a horizontal liquid surface at ``height`` above the bottom of a circle [m]."""
    if not 0.0 < height < diameter:
        return 0.0
    return 2.0 * math.sqrt(height * (diameter - height))


def weir_crest(volume_flow, weir_length) -> float:
    """Height of the liquid over a sharp-crested weir, Francis (1883) [m]."""
    if volume_flow <= 0.0 or weir_length <= 0.0:
        return 0.0
    return (volume_flow / (FRANCIS_WEIR * weir_length)) ** (2.0 / 3.0)


def single_tube_max_flux(P, P_crit) -> float:
    """Palen's single-tube maximum flux q1,max = 803 P_c p_r^0.35 (1 - p_r)^0.9 [W/m^2].

    ``palen_1983`` with its geometry factor at the cap of 1 (D_b = L = 1 m,
    A = 2.2 pi m^2), so that the bundle value is exactly this times Phi_b.
    """
    return registry.get("palen_1983").function(P, P_crit, 1.0, 1.0, 2.2 * math.pi)


# --------------------------------------------------------------------------- set-up

@dataclasses.dataclass
class _Kettle:
    """Everything a rating of one kettle case needs, built once."""

    case: object
    tubes: object
    fluid: object
    sat_v: object
    bands: list
    heating: InTubeHeating
    h_heating_in: float
    h_feed: float
    phi_b: float
    q_bundle_max: float
    q_single_max: float
    mixture_factor: float
    nucleate_title: str
    count_note: str | None


def _nucleate(case, fluid):
    """The nucleate method, the inputs it needs beyond the saturation set, its options."""
    method = registry.get(case.methods.nucleate_boiling)
    inputs, options = nucleate_fluid_constants(method, fluid)
    title = method.title
    if "factor_form" in method.options:  # Mostinski: Palen's reboiler form, with which F_b goes
        options["factor_form"] = "palen"
        title += ", Palen's reboiler form 1.8 p_r^0.17"
    return method, inputs, options, title


def _setup(case) -> _Kettle:
    k, t, b = case.kettle, case.tubes, case.boiling
    count_note = None
    pitch = default_pitch(t)
    estimate = estimate_tube_count(k.bundle_diameter, t.outer_diameter, pitch, t.layout_angle,
                                   t.passes) if t.passes in (1, 2, 4, 6, 8) else None
    if k.estimate_tube_count:
        if estimate < t.passes:
            raise ValueError(f"no tubes fit a bundle of {k.bundle_diameter:g} m at this pitch")
        count = estimate - estimate % 2 if k.tube_form == "u-tube" else estimate
        t = dataclasses.replace(t, count=count)
        count_note = (f"tube count {count} estimated from the bundle diameter "
                      f"{k.bundle_diameter:g} m (Phadke 1984)")
    elif estimate is not None and t.count > COUNT_MARGIN * estimate:
        count_note = (f"{t.count} tubes are more than fit a bundle of {k.bundle_diameter:g} m "
                      f"at this pitch and layout (about {estimate} by Phadke 1984): check the "
                      "bundle diameter or the count")
    fluid = make_fluid(b.fluid)
    P_v = b.inlet_pressure
    sat_v = fluid.saturation(P_v)
    area_per_pass_length = t.count * math.pi * t.outer_diameter * t.length
    phi_b = bundle_geometry_factor(k.bundle_diameter, t.length, area_per_pass_length)
    bundle_method = registry.get(k.bundle_max_flux)
    avail = sat_v.as_dict()
    avail.update(bundle_diameter=k.bundle_diameter, tube_length=t.length,
                 area=area_per_pass_length, tube_pitch=pitch, D=t.outer_diameter,
                 tube_count=t.count)
    opts = {}
    if "layout" in bundle_method.options:
        opts["layout"] = "triangular" if t.layout_angle in (30, 60) else "square"
    q_bmax = bundle_method(avail, **opts)
    q1 = single_tube_max_flux(P_v, fluid.P_crit)

    nucleate, nb_inputs, nb_options, nb_title = _nucleate(case, fluid)
    mixture = registry.get(k.mixture_method)
    notes: dict[str, float] = {}
    bands = []
    for y in band_centroids(k.bundle_diameter, t.passes):
        depth = k.weir_height - (0.5 * k.port_diameter + y)
        P = P_v + sat_v.rho_l * g * max(depth, 0.0)
        bands.append(PoolBand(fluid, P, D_o=t.outer_diameter, nucleate=nucleate,
                              nucleate_inputs=nb_inputs, nucleate_options=nb_options,
                              bundle_factor=k.bundle_boiling_factor, mixture=mixture,
                              boiling_range=k.boiling_range, bundle_max_flux=q_bmax,
                              range_notes=notes, adjust=of_side(b)))
    mixture_factor = 1.0
    if k.boiling_range > 0.0:
        mix_avail = {"boiling_range": k.boiling_range, "rho_l": sat_v.rho_l, "h_lv": sat_v.h_lv,
                     "q": q_bmax, "htc_ideal": 1.0}
        if "q" not in mixture.inputs:
            mixture_factor = mixture(mix_avail)
        else:
            mixture_factor = math.nan   # a flux-dependent factor: see the profiles

    hm = case.heating
    if hm.kind == "steam":
        medium = make_fluid(hm.fluid)
        condensing = True
        h_in = medium.saturation(hm.pressure).h_v
    else:
        spec = {"name": "user table", "table": hm.fluid} if isinstance(hm.fluid, dict) else hm.fluid
        medium = make_fluid(spec)
        condensing = False
        h_in = medium.enthalpy(hm.pressure, hm.inlet_temperature)
    T_hot = medium.temperature(hm.pressure, h_in)
    if T_hot <= min(band.T_sat for band in bands):
        raise ValueError(
            f"the heating medium at {T_hot:.2f} K is not hotter than the pool around the top "
            f"pass ({min(band.T_sat for band in bands):.2f} K with the liquid head over it): "
            "no heat transfer; a hotter medium or a lower weir")
    heating = InTubeHeating(medium, hm.pressure, hm.mass_flow, D_i=t.inner_diameter,
                            tubes_per_pass=t.tubes_per_pass, condensing=condensing,
                            single_phase_method=case.methods.single_phase_tube,
                            two_phase_friction=case.methods.two_phase_friction,
                            roughness=t.roughness, fixed_htc=k.heating_htc or hm.htc_fixed,
                            htc_factor=hm.htc_factor)
    return _Kettle(case, t, fluid, sat_v, bands, heating, h_in, inlet_enthalpy(case, fluid),
                   phi_b, q_bmax, q1, mixture_factor, nb_title, count_note)


def _march(kt: _Kettle, n, *, progress=None, cancel=None) -> PoolMarcher:
    t = kt.tubes
    case = kt.case
    R_wall = (t.outer_diameter * math.log(t.outer_diameter / t.inner_diameter)
              / (2.0 * t.conductivity))
    return PoolMarcher(kt.heating, kt.bands, D_o=t.outer_diameter, D_i=t.inner_diameter,
                       R_wall=R_wall, fouling_inner=case.heating.fouling_resistance,
                       fouling_outer=case.boiling.fouling_resistance,
                       tubes_per_pass=t.tubes_per_pass, pass_length=t.length, increments=n,
                       feed=(case.boiling.mass_flow, kt.h_feed, kt.sat_v),
                       progress=progress, cancel=cancel)


def _steam_drop(kt: _Kettle) -> float:
    """Enthalpy the steam gives up to leave as saturated condensate [J/kg]."""
    return kt.h_heating_in - kt.heating.sat.h_l


#: Gauss-Legendre points and weights on (0, 1) for the trap estimate.
_GAUSS = ((0.0694318442, 0.1739274226), (0.3300094782, 0.3260725774),
          (0.6699905218, 0.3260725774), (0.9305681558, 0.1739274226))


def _trap_estimate(kt: _Kettle, march: PoolMarcher, dh) -> float:
    """A first steam flow for the trap, from local solves only.

    Where steam condenses completely over the path, dx/dz = -q(x) P / (m dh) gives
    m dh = A / int_0^1 dx / q(x): the flux's harmonic mean over the quality. The
    flux is taken against each band in turn (its mean over the bands) and the mass
    flux in the condensation coefficient follows m (a few fixed-point steps).
    """
    sat = kt.heating.sat
    bands = kt.bands
    m = max(march.local(kt.h_heating_in, band, 0.0, no_inside_film=True)[0]
            for band in bands) * kt.tubes.outer_area / dh   # an upper bound
    for _ in range(20):
        kt.heating.mass_flow = m
        fluxes = [[march.local(sat.h_l + x * sat.h_lv, band, 0.0)[0] for x, _ in _GAUSS]
                  for band in bands]
        fluxes = [f for f in fluxes if min(f) > 0.0]     # bands colder than the steam
        inverse = sum(w / q for f in fluxes for (_, w), q in zip(_GAUSS, f)) / len(fluxes)
        m_next = kt.tubes.outer_area / (inverse * dh)
        if abs(m_next / m - 1.0) < 1e-3:
            return m_next
        m = m_next
    return m


def _trap_march(kt: _Kettle, n, prog, cancel, span=1.0):
    """Steam behind a trap: iterate the steam flow until it all leaves as condensate.

    The root of r(m) = duty(m) / (h_steam - h_condensate) - m (1 - x_exit), negative
    while the steam leaves wetter than x_exit (``TRAP_EXIT_QUALITY``) and positive once
    condensate floods the last tubes, by secant steps (bisection once a bracket is
    known) from ``_trap_estimate``.
    """
    march = _march(kt, n, cancel=cancel)
    dh = _steam_drop(kt)
    calls = []

    def resid(m):
        kt.heating.mass_flow = m
        march.progress = prog.part(span * min(0.9, 0.15 * len(calls)), 0.15 * span)
        out = march.run(kt.h_heating_in)
        calls.append((m, out))
        if out.status != "ok":
            raise _Failed((kt, out, march))
        return out.stations[-1].duty / dh - m * (1.0 - TRAP_EXIT_QUALITY)

    m0 = _trap_estimate(kt, march, dh)
    try:
        r0 = resid(m0)
        m1 = m0 + r0
        r1 = resid(m1)
        lo = hi = None                       # flows with r > 0 and r < 0
        for m, r in ((m0, r0), (m1, r1)):
            if r > 0.0:
                lo = m
            else:
                hi = m
        for _ in range(TRAP_MARCHES):
            if abs(r1) < TRAP_TOLERANCE * m1:
                break
            m2 = m1 - r1 * (m1 - m0) / (r1 - r0) if r1 != r0 else m1 + r1
            if lo is not None and hi is not None and not min(lo, hi) < m2 < max(lo, hi):
                m2 = 0.5 * (lo + hi)
            elif m2 <= 0.0:
                m2 = 0.5 * m1
            m0, r0 = m1, r1
            m1, r1 = m2, resid(m2)
            if r1 > 0.0:
                lo = m1
            else:
                hi = m1
    except _Failed as exc:
        return exc.result[1], march
    if calls[-1][0] != m1:   # the last march is the answer's
        resid(m1)
    return calls[-1][1], march


def _rate_length(kt: _Kettle, length, n, *, mass_flow=None, cancel=None):
    """One march with another tube length (area for duty): (kettle, outcome, march).

    Nothing else depends on the length: the bands, the maximum flux (Phi_b is
    2.2 D_b / (N d_o)) and the property caches are shared; the heating medium is a
    copy, as its flow may differ.
    """
    heating = copy.copy(kt.heating)
    if mass_flow is not None:
        heating.mass_flow = mass_flow
    kt = dataclasses.replace(kt, tubes=dataclasses.replace(kt.tubes, length=length),
                             heating=heating)
    march = _march(kt, n, cancel=cancel)
    return kt, march.run(kt.h_heating_in), march


# --------------------------------------------------------------------------- rating

def methods_used(kt: _Kettle) -> tuple[MethodUsed, ...]:
    case, k = kt.case, kt.case.kettle
    names = [("nucleate_boiling", case.methods.nucleate_boiling, kt.nucleate_title),
             ("natural_convection", "churchill_chu_1975_cylinder", None),
             ("bundle_chf", k.bundle_max_flux, None)]
    if k.boiling_range > 0.0:
        names.append(("mixture", k.mixture_method, None))
    if k.heating_htc is None:
        if case.heating.kind == "steam":
            names.append(("condensation", "shah_1979", None))
            names.append(("condensation", "nusselt_horizontal_tube",
                          "Chato (1962) stratified condensation in a horizontal tube: Nusselt's "
                          "cylinder film with C = 0.555 on the inside diameter, where it exceeds "
                          "Shah's"))
        names.append(("single_phase_tube", case.methods.single_phase_tube, None))
    if case.heating.kind == "steam":
        names.append(("two_phase_friction", case.methods.two_phase_friction, None))
    names.append(("friction_factor", "colebrook_1939", None))
    out = []
    for family, name, title in names:
        m = registry.get(name)
        out.append(MethodUsed(family, m.name, m.reference, title or m.title))
    return tuple(out)


def rate_kettle(case, *, increments=None, progress=None, cancel=None) -> Result:
    """Rate a kettle reboiler case; never raises for a physical reason."""
    n = increments or case.increments or DEFAULT_INCREMENTS
    prog = ProgressShare(progress)
    try:
        kt = _setup(case)
    except (ValueError, PropertyError) as exc:
        return failed(case, str(exc))
    methods = methods_used(kt)
    steam_trap = case.heating.kind == "steam" and case.heating.mass_flow is None
    span = 0.5 if case.required_duty else 1.0      # of the progress, for the performance
    notes: list[str] = []
    check = None
    try:
        if steam_trap:
            outcome, march = _trap_march(kt, n, prog, cancel, span)
        else:
            march = _march(kt, n, progress=prog.part(0.0, span), cancel=cancel)
            outcome = march.run(kt.h_heating_in)
        if outcome.status != "ok":
            return failed(case, outcome.message, methods=methods,
                          profiles=_profiles(kt, outcome, march))
        if case.required_duty:
            check = _area_for_duty(case, kt, n, cancel, prog)
            if check[1].status != "ok":
                notes.append(check[1].message)
    except Cancelled:
        return cancelled(case, methods=methods)
    if progress is not None:
        progress(1.0)

    primary = (kt, outcome, march)
    if case.question == "area_for_duty" and check is not None and check[1].status == "ok":
        primary = check
    summary = kettle_summary(case, primary, (kt, outcome), check)
    warnings = _warnings(case, primary, summary)
    if (summary["exit_quality"] or 0.0) >= 1.0:
        return _feed_boiled_dry(case, summary, warnings, methods, primary)
    if check is not None and check[1].status != "ok":
        warnings.append(note("duty-not-reached", check[1].message))
    status = "warnings" if any(w.severity in ("warning", "error") for w in warnings) else "ok"
    message = "rated" if not notes else "; ".join(notes)
    return Result(case.name, case.type, status, message, summary,
                  _profiles(primary[0], primary[1], primary[2]), tuple(warnings), methods,
                  extra={"increments": n})


def _feed_boiled_dry(case, summary, warnings, methods, primary) -> Result:
    """A failed result: the heating would boil off more than the feed brings in.

    The pool cannot be held at the weir: the level falls and tubes uncover until the
    duty matches the feed, a state this rating does not model, so no duty is given.
    """
    feed = case.boiling.mass_flow
    boil_off = feed * summary["exit_quality"]     # vapour the full-level duty would make
    message = (f"the feed {feed:.4g} kg/s is less than the bundle would boil off "
               f"({boil_off:.4g} kg/s at the full-level duty): nothing overflows the weir, the level falls and tubes uncover, so the "
               "duty and outlet states are not those of this geometry; raise the feed, or "
               "lower the heating-medium temperature or flow")
    kept = tuple(w for w in warnings if w.code != "kettle-dry")
    return failed(case, message, warnings=kept, methods=methods, code="feed-boiled-dry",
                  profiles=_profiles(primary[0], primary[1], primary[2]))


def _area_for_duty(case, kt, n, cancel, prog):
    """The tube length at which the bundle takes the required duty: (kettle, outcome, march)."""
    from ..march import MarchOutcome

    Q = case.required_duty
    mass_flow = None
    if case.heating.kind == "steam" and case.heating.mass_flow is None:
        mass_flow = Q / _steam_drop(kt)        # behind a trap all the steam condenses
    L = kt.tubes.length
    seen = {}

    def resid(length):
        prog.part(0.5, 0.5)(min(0.95, len(seen) / 12.0))
        res = _rate_length(kt, length, n, mass_flow=mass_flow, cancel=cancel)
        seen[length] = res
        if res[1].status != "ok":
            raise _Failed(res)
        return res[1].stations[-1].duty - Q

    L_hi = DUTY_CHECK_LENGTH_FACTOR * L
    try:
        # Very long tubes may cool the medium out of its range (condensate below its
        # freezing point): the longest length that rates is the upper bracket then.
        for _ in range(6):
            try:
                resid(L_hi)
                break
            except _Failed:
                if L_hi <= L:
                    raise
                L_hi = max(L, 0.5 * L_hi)
        if seen[L_hi][1].stations[-1].duty < Q:
            reached = seen[L_hi][1].stations[-1].duty
            return (kt, MarchOutcome([], "failed", said(
                "the required duty {Q:power:.4g} is not reached with tubes {times:dimensionless:.3g} "
                "times as long (reached {reached:power:.4g})", Q=Q, times=L_hi / L,
                reached=reached)), None)
        L_req = brentq(resid, 1e-4 * L, L_hi, xtol=1e-7 * L, rtol=1e-10, maxiter=100)
    except _Failed as exc:
        return exc.result
    return seen.get(L_req) or _rate_length(kt, L_req, n, mass_flow=mass_flow, cancel=cancel)


class _Failed(Exception):
    def __init__(self, result):
        super().__init__(result[1].message)
        self.result = result


# --------------------------------------------------------------------------- results

def _profiles(kt, outcome, march) -> dict:
    profiles = profiles_from_stations(outcome.stations)
    if march is not None and len(march.pass_of_station) == len(outcome.stations):
        profiles["tube_pass"] = tuple(k + 1 for k in march.pass_of_station)
    if kt.heating.condensing:
        profiles["heating_quality"] = tuple(kt.heating.quality(s.h) for s in outcome.stations)
    return profiles


def _surface(case, kt, m_vapour, m_liquid):
    """Level, freeboard, surface velocity and its limit, smallest kettle diameter."""
    k, lim, sat = case.kettle, case.limits, kt.sat_v

    def level_in(diameter):  # the weir spans the shell: its length is the chord there
        return k.weir_height + weir_crest(m_liquid / sat.rho_l, chord(diameter, k.weir_height))

    level = level_in(k.kettle_diameter)
    width = chord(k.kettle_diameter, level)
    L = kt.tubes.length
    u = m_vapour / (sat.rho_v * width * L) if width > 0.0 else math.inf
    u_max = lim.kettle_surface_velocity_constant * math.sqrt((sat.rho_l - sat.rho_v) / sat.rho_v)
    # The chord 2 [h (D - h)]^0.5 at the level h carries the vapour at u_max when
    # D = h + w^2 / (4 h); the level itself moves a little with D (the weir crest).
    w_req = m_vapour / (sat.rho_v * u_max * L)
    d_min = k.kettle_diameter
    for _ in range(50):
        h = level_in(d_min)
        d_next = max(h + w_req ** 2 / (4.0 * h), h + lim.kettle_min_freeboard, k.port_diameter)
        if abs(d_next - d_min) <= 1e-9 * d_next:
            break
        d_min = d_next
    return dict(level=level, freeboard=k.kettle_diameter - level, u=u, u_max=u_max,
                d_min=d_next)


def _nozzles(case, kt, m_vapour, m_liquid):
    k, sat, b = case.kettle, kt.sat_v, case.boiling
    out = {"vapour_outlet_rho_v2_kg_m_s2": None, "liquid_inlet_rho_v2_kg_m_s2": None,
           "liquid_outlet_velocity_m_s": None}
    if k.vapour_nozzle_diameter is not None:
        G = m_vapour / (k.vapour_nozzles * math.pi * k.vapour_nozzle_diameter ** 2 / 4.0)
        out["vapour_outlet_rho_v2_kg_m_s2"] = G * G / sat.rho_v
    if k.liquid_inlet_nozzle_diameter is not None:
        if b.inlet_temperature is not None:
            rho = kt.fluid.single_phase(b.inlet_pressure, b.inlet_temperature).rho
        else:
            x = b.inlet_quality or 0.0
            rho = 1.0 / (x / sat.rho_v + (1.0 - x) / sat.rho_l)
        G = b.mass_flow / (math.pi * k.liquid_inlet_nozzle_diameter ** 2 / 4.0)
        out["liquid_inlet_rho_v2_kg_m_s2"] = G * G / rho
    if k.liquid_outlet_nozzle_diameter is not None:
        out["liquid_outlet_velocity_m_s"] = m_liquid / (
            sat.rho_l * math.pi * k.liquid_outlet_nozzle_diameter ** 2 / 4.0)
    return out


def _heating_dp(kt, outcome) -> float:
    st = outcome.stations
    dp = integrate_along_z(st, "dpdz_friction")
    h = kt.heating
    if not h.condensing:
        rho = h.density(st[0].h)
        dp += RETURN_VELOCITY_HEADS * kt.tubes.passes * h.G ** 2 / (2.0 * rho)
    return dp


def kettle_summary(case, primary, performance, check) -> dict:
    kt, outcome, _ = primary
    st = outcome.stations
    last = st[-1]
    t = kt.tubes
    duty = last.duty
    per_len = t.tubes_per_pass * math.pi * t.outer_diameter
    area_marched = per_len * last.z
    ua = per_len * integrate_along_z(st, "u_service")
    ua_clean = per_len * integrate_along_z(st, "u_clean")
    h = kt.heating
    m_h = h.mass_flow
    duty_heating = m_h * (outcome.start_heating_state - outcome.end_heating_state)
    b, sat = case.boiling, kt.sat_v
    x_out = (kt.h_feed + duty / b.mass_flow - sat.h_l) / sat.h_lv
    m_vapour = b.mass_flow * min(max(x_out, 0.0), 1.0)
    m_liquid = b.mass_flow - m_vapour
    surface = _surface(case, kt, m_vapour, m_liquid)
    k = case.kettle
    area = performance[0].tubes.outer_area       # the real length (and estimated count)
    summary = {
        "duty_W": duty,
        "duty_heating_side_W": duty_heating,
        "area_m2": area,
        "u_clean_W_m2K": ua_clean / area_marched,
        "u_service_W_m2K": ua / area_marched,
        "mean_temperature_difference_K": duty / ua if ua > 0.0 else None,
        "over_design_pct": None,
        "exit_quality": x_out if x_out >= 0.0 else None,
        "exit_superheat_K": None,
        # a feed that leaves subcooled: the overflow at the saturation temperature is
        # mixed with feed that never reached it
        "exit_subcooling_K": -x_out * sat.h_lv / sat.cp_l if x_out < 0.0 else None,
        "exit_temperature_K": sat.T_sat,
        # the pool is not a flow path: no boiling-side pressure drop, but the liquid head
        # over the bottom of the bundle raises its boiling point there
        "pressure_drop_boiling_Pa": None,
        "static_head_over_bundle_Pa": sat.rho_l * g * (k.weir_height - k.bundle_bottom),
        "pressure_drop_heating_Pa": _heating_dp(kt, outcome),
        "heating_outlet_temperature_K": last.T_heating,
        "max_heat_flux_W_m2": max(s.q for s in st),
        # Palen's bundle maximum is a limit on the bundle's mean flux: mean by mean
        "max_chf_ratio": duty / area_marched / kt.q_bundle_max,
        "dryout_z_m": None,
        "exit_pressure_Pa": b.inlet_pressure,
        "steam_flow_kg_s": m_h if h.condensing else None,
        "performance_duty_W": None if primary[1] is performance[1]
        else performance[1].stations[-1].duty,
        "required_duty_W": case.required_duty,
        "required_area_m2": None,
        "u_required_W_m2K": None,
        "over_surface_pct": None,
        "bundle_max_heat_flux_W_m2": kt.q_bundle_max,
        "bundle_factor": kt.phi_b,
        "vapour_flow_kg_s": m_vapour,
        "surface_vapour_velocity_m_s": surface["u"],
        "surface_vapour_velocity_limit_m_s": surface["u_max"],
        "min_kettle_diameter_m": surface["d_min"],
        "mean_heat_flux_W_m2": duty / area_marched,
        "single_tube_max_heat_flux_W_m2": kt.q_single_max,
        "bundle_boiling_factor": k.bundle_boiling_factor,
        "mixture_factor": kt.mixture_factor,
        "tube_count": t.count,
        "liquid_level_over_bundle_m": surface["level"] - k.bundle_top,
        "freeboard_m": surface["freeboard"],
        "liquid_overflow_kg_s": m_liquid,
        "heating_outlet_quality": h.quality(outcome.end_heating_state),
    }
    summary.update(_nozzles(case, kt, m_vapour, m_liquid))
    if check is not None and check[1].status == "ok":
        a_req = per_len * check[1].stations[-1].z
        summary["required_area_m2"] = a_req
        summary["over_design_pct"] = (area / a_req - 1.0) * 100.0
        mtd = summary["mean_temperature_difference_K"]
        if check is primary and mtd:
            u_req = case.required_duty / (area * mtd)
            summary["u_required_W_m2K"] = u_req
            summary["over_surface_pct"] = (summary["u_clean_W_m2K"] / u_req - 1.0) * 100.0
    return summary


# --------------------------------------------------------------------------- checks

def _warnings(case, primary, s) -> list[RatingWarning]:
    """The generic checks that apply (temperature cross or pinch, Kern's cap, method
    ranges: the stations' regime "pool boiling" keeps the in-tube ones out) and the
    kettle's own (``rating.rules``)."""
    kt, outcome, march = primary
    out = checks.evaluate(case, outcome, fluid=kt.fluid, service="kettle")
    out += _bundle(case, kt, outcome.stations, s) + _film_boiling(kt, outcome.stations, march)
    out += _pool(case, s) + _nozzle_checks(case, s) + _tube_side(case, kt, outcome.stations, s)
    if (s["exit_quality"] or 0.0) >= 1.0:
        out.append(warn("kettle-dry", x=s["exit_quality"]))
    if kt.count_note is not None:
        out.append(note("tube-count", kt.count_note,
                        "info" if case.kettle.estimate_tube_count else "warning"))
    return out


def _bundle(case, kt, st, s) -> list[RatingWarning]:
    """Bundle flux against Palen's maximum, the geometry factor, the smallest flux."""
    lim, out = case.limits, []
    q_b, ratio, q_mean = kt.q_bundle_max, lim.kettle_bundle_flux_ratio, s["mean_heat_flux_W_m2"]
    if q_mean > ratio * q_b:
        remedy = ("vapour lanes or a wider pitch" if kt.phi_b < 2.0 * lim.kettle_min_bundle_factor
                  else "a larger bundle diameter, a cooler heating medium or less duty")
        out.append(warn("bundle-flux-limit", q=q_mean, ratio=ratio, q_max=q_b, phi=kt.phi_b,
                        remedy=remedy))
    elif s["max_heat_flux_W_m2"] > ratio * q_b:
        top = max(st, key=lambda x: x.q)
        out.append(warn("bundle-flux-local", z=top.z, q=top.q, ratio=ratio, q_max=q_b,
                        q_mean=q_mean))
    if kt.phi_b < lim.kettle_min_bundle_factor:
        out.append(warn("bundle-factor-small", phi=kt.phi_b, limit=lim.kettle_min_bundle_factor))
    low = min(st, key=lambda x: x.q)
    if low.q < lim.min_nucleate_flux:
        out.append(warn("low-flux", "warning", low.z, q=low.q, limit=lim.min_nucleate_flux))
    return out


def _film_boiling(kt, st, march) -> list[RatingWarning]:
    """Wall superheat beyond the point where the bundle's boiling curve reaches the
    single-tube maximum flux; the first station only."""
    critical = {}           # band -> wall superheat where its boiling curve reaches q1,max
    for station, band_index in zip(st, march.pass_of_station):
        if band_index not in critical:
            critical[band_index] = kt.bands[band_index].superheat(kt.q_single_max)[0]
        if station.q > 0.0 and station.wall_superheat > critical[band_index]:
            return [warn("film-boiling-superheat", z=station.z, dT=station.wall_superheat,
                         dT_crit=critical[band_index],
                         where=said(", where the bundle's boiling curve reaches the single-tube "
                                    "maximum flux {q:heat_flux:.4g}", q=kt.q_single_max),
                         remedy="lower steam pressure or a cooler heating medium would help")]
    return []


def _pool(case, s) -> list[RatingWarning]:
    """Level over the bundle, freeboard, vapour velocity at the surface."""
    lim, k, out = case.limits, case.kettle, []
    over = s["liquid_level_over_bundle_m"]
    if over < lim.kettle_min_level_over_bundle:
        state = (said("leaves the top {h:length:.3g} of the bundle uncovered", h=-over)
                 if over < 0.0 else
                 said("is only {h:length:.3g} over the bundle (limit {limit:length:.3g})",
                      h=over, limit=lim.kettle_min_level_over_bundle))
        out.append(warn("bundle-uncovered", weir=k.weir_height,
                        crest=over + k.bundle_top - k.weir_height, state=state))
    if s["freeboard_m"] < lim.kettle_min_freeboard:
        out.append(warn("freeboard", h=s["freeboard_m"], limit=lim.kettle_min_freeboard))
    u, u_max = s["surface_vapour_velocity_m_s"], s["surface_vapour_velocity_limit_m_s"]
    if u > u_max:
        what = (said("vapour velocity at the liquid surface {u:velocity:.3g} exceeds "
                     "{u_max:velocity:.3g}", u=u, u_max=u_max)
                if u is not None and math.isfinite(u) else "the liquid fills the kettle shell")
        out.append(warn("entrainment", what=what, d_min=s["min_kettle_diameter_m"], u_max=u_max))
    return out


def _nozzle_checks(case, s) -> list[RatingWarning]:
    """rho v^2 at the vapour outlet and the feed inlet (TEMA)."""
    lim, out = case.limits, []
    rv2 = s["vapour_outlet_rho_v2_kg_m_s2"]
    if rv2 is not None and rv2 > lim.kettle_vapour_nozzle_rho_v2:
        out.append(warn("nozzle-rho-v2", name="vapour outlet", rv2=rv2,
                        limit=lim.kettle_vapour_nozzle_rho_v2,
                        remedy="a larger or a second vapour nozzle"))
    rv2 = s["liquid_inlet_rho_v2_kg_m_s2"]
    if rv2 is not None and rv2 > lim.kettle_inlet_nozzle_rho_v2:
        out.append(warn("impingement", rv2=rv2, limit=lim.kettle_inlet_nozzle_rho_v2))
    return out


def _tube_side(case, kt, st, s) -> list[RatingWarning]:
    """Steam not all condensed, condensate flooding, steam pressure drop, a fixed film."""
    h, out = kt.heating, []
    if h.condensing and case.heating.mass_flow is not None:
        if s["heating_outlet_quality"] > TRAP_TOLERANCE:
            out.append(warn("steam-blow-through", x=s["heating_outlet_quality"]))
        flooded = [x for x in st if h.quality(x.h) < 0.0]
        if flooded:
            out.append(warn("condensate-flooding", z=flooded[0].z, rest=st[-1].z - flooded[0].z))
    if h.condensing and s["pressure_drop_heating_Pa"] > STEAM_DP_SHARE * case.heating.pressure:
        out.append(warn("steam-pressure-drop", dp=s["pressure_drop_heating_Pa"],
                        share=STEAM_DP_SHARE))
    if case.kettle.heating_htc is not None:
        out.append(warn("fixed-heating-htc", htc=case.kettle.heating_htc))
    return out
