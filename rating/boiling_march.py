"""In-tube boiling along a heated path (``Marcher``), marched by ``rating.march``.

The state at a station z is the boiling-side pressure P and specific enthalpy h
(quality or subcooling follow from them) and the heating-medium state. Over an
increment the local heat flux is found from the series resistances (heating
film, fouling, wall, fouling, boiling film) by a bracketed scalar root on the
heat flux, the energy balance moves h and the heating medium by the same duty,
and the momentum balance (friction, acceleration, gravity) moves P so that the
saturation temperature follows the local pressure.

Integration is by the explicit midpoint rule (second order): the flux of an
increment is evaluated at its middle. The boiling side and the heating side
exchange exactly the same duty in every increment, so the energy balance closes
to the precision of the property inversions, whatever the increment count.

Regimes along the tube, decided from the bulk state (never from a trial flux):
subcooled liquid (single phase, then subcooled boiling once the wall passes the
saturation temperature: Liu-Winterton 1991), saturated flow boiling (the chosen
method), post-dryout (Dougall-Rohsenow 1963: a flow-boiling correlation is
never extrapolated past dryout) and superheated vapour. Dryout starts where the
local flux reaches the local critical heat flux, or the quality reaches the
critical quality (a user limit, or the Wojtan et al. 2005 dryout onset in
horizontal tubes), whichever comes first; there is no rewetting downstream.

Nothing here raises for a physical reason: a step that cannot be solved ends
the march with a status and a message (``MarchOutcome``).
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

from .adjust import Adjustment
from .correlations import registry
from .correlations.dimensionless import g
from .correlations.dryout import KATTO_OHNO_L_D
from .correlations.flow_boiling import station_parts
from .correlations.flow_pattern import wojtan_dryout_qualities
from .correlations.single_phase import htc_tube_single_phase
from .errors import OutOfRangeError, PropertyError
from .rules import said
from .march import (NTU_PER_STEP, PAST_EVENT, QUALITY_PER_STEP, SMALLEST_STEP, WETTED_REGIMES,
                    HeatingSide, MarchOutcome, Station, Stepper, flux_root)

#: The data behind the Wojtan et al. (2005) dryout-onset quality x_di (their refit of
#: Mori et al. 2000 to R22 and R410A in 8 and 13.84 mm tubes) [memory]: the boiling
#: fluids (CoolProp names), inner diameter [m], mass flux [kg/m^2/s], heat flux [W/m^2].
#: Outside it x_di is not used and dryout is found by the general dryout method alone.
WOJTAN_DRYOUT_DATA = {
    "fluid": ("R22", "R410A"),
    "D": (0.008, 0.01384, "m"),
    "G": (70.0, 700.0, "kg/m^2/s"),
    "q": (2.0e3, 57.5e3, "W/m^2"),
}


class _PressureExhausted(Exception):
    """The boiling-side pressure drop of an increment would take the pressure to zero."""

    def __init__(self, z):
        super().__init__(z)
        self.z = z


@dataclass
class BoilingTube:
    """Everything the march needs about the tube and the boiling fluid."""

    fluid: object                 # rating.properties.Fluid
    D_i: float
    D_o: float
    wall_conductivity: float
    roughness: float
    vertical: bool
    mass_flow_per_tube: float
    tubes_in_parallel: int        # tubes that share one path position
    fouling_inner: float
    fouling_outer: float
    flow_boiling: str
    nucleate_boiling: str
    two_phase_friction: str
    void_fraction: str
    tube_dryout: str
    single_phase_tube: str
    critical_quality: float | None = None
    flow_pattern_method: str | None = None
    flow_boiling_options: dict = field(default_factory=dict)  # fluid-specific constants
    nucleate_inputs: dict = field(default_factory=dict)       # fluid constants (Gorenflo's h0)
    nucleate_options: dict = field(default_factory=dict)
    boiling_adjust: Adjustment = field(default_factory=Adjustment)  # fixed or scaled (adjust.py)
    heating_adjust: Adjustment = field(default_factory=Adjustment)

    @property
    def G(self) -> float:
        return self.mass_flow_per_tube / (math.pi * self.D_i**2 / 4.0)

    @property
    def wall_resistance_inner(self) -> float:
        """Wall conduction resistance referred to the inner area [m^2K/W]."""
        return self.D_i * math.log(self.D_o / self.D_i) / (2.0 * self.wall_conductivity)


# --------------------------------------------------------------------------- local solve

@dataclass(slots=True)
class _Local:
    regime: str
    q: float
    T_s: float        # boiling-side surface temperature (outside any inner fouling layer)
    htc: float
    htc_nb: float
    htc_conv: float
    dT_film_h: float
    x: float
    T_b: float
    T_sat: float
    sat: object
    z: float = 0.0


class _PressureZero(Exception):
    """The pressure at the end of an increment is zero or not finite."""

    def __init__(self, z):
        super().__init__(z)
        self.z = z


class Marcher(Stepper):
    """In-tube boiling along one heated path; ``run`` drives it to the end.

    Parameters are the tube description, the heating side, the path length and the
    increment count. ``progress(fraction)`` is called after each increment and
    ``cancel()`` is checked between increments. The state at a station is
    (P, h, heating state, duty from z = 0), the local values (bulk, ``_Local``).
    """

    def __init__(self, tube: BoilingTube, heating: HeatingSide, length: float, increments: int,
                 *, progress=None, cancel=None):
        self.tube = tube
        self.heating = heating
        self.length = length
        self.n = increments
        self.progress = progress
        self.cancel = cancel
        self.fb = registry.get(tube.flow_boiling)
        self.nb = registry.get(tube.nucleate_boiling)
        self.fric = registry.get(tube.two_phase_friction)
        self.void = registry.get(tube.void_fraction)
        self.chf = registry.get(tube.tube_dryout)
        self.pattern = registry.get(tube.flow_pattern_method) if tube.flow_pattern_method else None
        self.single = registry.get(tube.single_phase_tube)
        self.post = registry.get("dougall_rohsenow_1963")
        self.sub = registry.get("liu_winterton_1991_subcooled")
        # Fluid-specific constants: required ones travel with the inputs, the rest as options.
        extra = dict(tube.flow_boiling_options)
        if "horizontal" in self.fb.options:
            extra["horizontal"] = not tube.vertical
        self.fb_inputs = {k: v for k, v in extra.items() if k in self.fb.inputs}
        self.fb_options = {k: v for k, v in extra.items() if k not in self.fb.inputs}
        # Drift-flux void models have a vertical and a horizontal form.
        self.void_options = {}
        if "variant" in self.void.options:
            self.void_options["variant"] = "II" if tube.vertical else "horizontal"
        if "D" in self.void.options:
            self.void_options["D"] = tube.D_i
        # CoolProp fluids interpolate the saturation sets of the march's pressures
        # (properties.SaturationInterpolation); a user's table is its own interpolation.
        fluid = tube.fluid
        if hasattr(fluid, "saturation_interpolated"):
            self._saturation = fluid.saturation_interpolated
            self._at_ph = fluid.at_ph
        else:
            self._saturation = fluid.saturation
            self._at_ph = lambda P, h, sat: fluid.at_ph(P, h)
        self.range_notes: dict[str, float] = {}
        self._range_bounds: set[str] = set()
        self._sat_dicts: dict[float, dict] = {}
        self._chf_memo = None
        self._void_memo = (None, None, None)
        self._chf_x_min = self.chf.validity.get("x", (None, None))[0]
        # Katto-Ohno at local quality: its implied boiling length against its data
        self._short_length_floor = self.chf.name == "katto_ohno_local"
        self._L_D_min = KATTO_OHNO_L_D[0]
        self._pool_chf = registry.get("zuber_1959")
        self._floored = False   # the last critical flux was the pool-boiling floor
        self.method_notes: dict[str, float] = {}   # a method taken in place of another -> z
        self._q_guess = 0.0
        self._q_slope = None
        self.dried_out = False
        self.dryout_z: float | None = None
        self.dryout_cause: str | None = None
        self.dryout_trigger_ratio = 0.0
        self.x_dryout_onset = tube.critical_quality
        self._wojtan_fixed = [] if tube.vertical else self._wojtan_bounds_crossed(
            fluid=getattr(tube.fluid, "coolprop_name", ""), D=tube.D_i, G=tube.G)

    # ---- properties of the boiling fluid at (P, h)
    def _bulk(self, P, h):
        """Saturation set, quality, bulk temperature and (outside the dome) the
        single-phase (rho, mu, k, cp) at (P, h)."""
        sat = self._saturation(P)   # a new pressure at every trial state
        x = (h - sat.h_l) / sat.h_lv
        if 0.0 <= x <= 1.0:
            return sat, x, sat.T_sat, None
        state = self._at_ph(P, h, sat)
        return sat, x, state.T, (state.rho, state.mu, state.k, state.cp)

    def _note_range(self, method, available, z):
        """Record the first place along the path where a bound of a method is passed.

        One note per method and bound (the message of its first occurrence), so a
        bound passed along the whole tube is reported once, where it starts.
        """
        for msg in method.out_of_range(available):
            self._note(msg.split(" = ", 1)[0], msg, z)

    def _sat_inputs(self, sat) -> dict:
        """The saturation set as a dict for registry dispatch (kept per set)."""
        d = self._sat_dicts.get(sat.P)
        if d is None or d["T_sat"] != sat.T_sat:
            if len(self._sat_dicts) > 4096:
                self._sat_dicts.clear()
            d = self._sat_dicts[sat.P] = sat.as_dict()
        return d

    def _surface_law(self, sat, x, T_b, regime, single_props):
        """For a fixed regime and bulk state: T_surface(q), and the film coefficients at q.

        Everything that does not depend on the flux is computed once here, outside
        the root on q.
        """
        t = self.tube
        G = t.G
        if regime in ("subcooled liquid", "subcooled boiling"):
            rho, mu, k, cp = single_props
            htc_l = htc_tube_single_phase(G, t.D_i, mu, k, cp, method=t.single_phase_tube)
            avail = dict(self._sat_inputs(sat), **t.nucleate_inputs)
            # the nucleate method's inputs but q bound once, outside the root on q
            nb = self.nb.function
            nb_args = {n: avail[n] for n in self.nb.inputs if n != "q"}
            nb_args.update(t.nucleate_options)
            sub = self.sub.function

            def T_s(q):
                if q <= 0.0:
                    return T_b
                return sub(q, T_b, sat.T_sat, htc_l, nb(q=q, **nb_args), G, t.D_i, mu)

            def films(q):
                # Liu-Winterton's subcooled form is asymptotic (n = 2) in the fluxes: with
                # htc = q/(T_s - T_b) its parts are htc_l and, by the same sum, the
                # suppressed nucleate part S htc_nb (T_s - T_sat)/(T_s - T_b)
                if q <= 0.0:
                    return htc_l, 0.0, htc_l
                htc = q / max(T_s(q) - T_b, 1e-9)
                return htc, math.sqrt(max(htc * htc - htc_l * htc_l, 0.0)), htc_l
            return T_s, films
        if regime == "saturated boiling":
            avail = dict(self._sat_inputs(sat), G=G, x=min(max(x, 1e-4), 0.9999), D=t.D_i,
                         **self.fb_inputs)
            # the method's flux-independent terms once; the root on q evaluates the rest
            parts_of = station_parts(self.fb, avail, sat.dp_sat, **self.fb_options)
            last = [None, None]

            def parts_at(q):
                # the root's last flux is asked again for the surface and the films
                if q != last[0]:
                    last[0], last[1] = q, parts_of(q)
                return last[1]

            def T_s(q):
                return sat.T_sat if q <= 0.0 else sat.T_sat + q / parts_at(q).htc

            return T_s, parts_at
        if regime == "post-dryout":
            avail = dict(self._sat_inputs(sat), G=G, x=min(max(x, 0.0), 1.0), D=t.D_i)
            htc = self.post(avail)
        else:  # superheated vapour
            rho, mu, k, cp = single_props
            htc = htc_tube_single_phase(G, t.D_i, mu, k, cp, method=t.single_phase_tube)
        return (lambda q: T_b + max(q, 0.0) / htc), (lambda q: (htc, 0.0, htc))

    def _regime(self, x):
        if self.dried_out:
            return "post-dryout" if x < 1.0 else "superheated vapour"
        if x < 0.0:
            return "subcooled liquid"
        if x < 1.0:
            return "saturated boiling"
        return "superheated vapour"

    def solve_local(self, z, P, h, hstate, bulk=None) -> _Local:
        """Local heat flux and temperatures at (P, h) with the heating state given."""
        t = self.tube
        sat, x, T_b, single = bulk or self._bulk(P, h)
        regime = self._regime(x)
        T_h = self.heating.temperature(hstate)
        film = t.heating_adjust.film(self.heating.film(hstate, T_h, z))
        ratio = t.D_i / t.D_o
        R_fixed = t.fouling_inner + t.wall_resistance_inner + ratio * t.fouling_outer

        T_s_of, films = t.boiling_adjust.surface_law(
            *self._surface_law(sat, x, T_b, regime, single), T_b)

        def resid(q):
            return T_h - T_s_of(q) - q * R_fixed - film(q * ratio)

        if T_h <= T_b + 1e-9:
            q = 0.0
        else:
            q = self._root_flux(resid, (T_h - T_b) / R_fixed, T_h - T_b)
        T_s = T_s_of(q)
        htc, htc_nb, htc_conv = films(q) if q > 0.0 else (0.0, 0.0, 0.0)
        if regime == "subcooled liquid" and T_s > sat.T_sat:
            regime = "subcooled boiling"
        self._q_guess = q
        return _Local(regime, q, T_s, htc, htc_nb, htc_conv, film(q * ratio), x, T_b,
                      sat.T_sat, sat, z)

    def _root_flux(self, resid, q_hi, drive):
        """The local flux from the last one and its slope as the first guess (``flux_root``)."""
        q, slope = flux_root(resid, q_hi, drive, self._q_guess, self._q_slope)
        if slope is not None:
            self._q_slope = slope
        return q

    # ---- local checks and derived values
    def _critical_flux(self, P, x, sat, z):
        """Local critical heat flux [W/m^2] and the inputs it was evaluated with.

        Below the quality range of the dryout method (a saturated-boiling method in
        subcooled flow) it is taken just inside the edge of that range: critical heat
        flux rises with subcooling, so this errs on the safe side. The last result is
        kept, since the dryout check and the station ask for the same state.

        Katto-Ohno at local quality implies a boiling length x G D h_lv / (4 q_CHF);
        just past the saturation point (and in subcooled flow, evaluated there) it is
        far below the correlation's data (L/D >= 5), where its value falls steeply and
        would declare a tube dry in its first centimetres. There the critical flux is
        not taken below the pool-boiling critical flux (Zuber 1959), which forced flow
        and subcooling only raise (Collier & Thome 1994, ch. 9 [memory]).
        """
        memo = self._chf_memo
        if memo is not None and memo[0] == P and memo[1] == x:
            self._floored = memo[4]
            return memo[2], memo[3]
        t = self.tube
        self._floored = False
        lo = self._chf_x_min
        x_eval = lo + 1e-4 if lo is not None and x <= lo else x
        avail = dict(self._sat_inputs(sat), P=P, G=t.G, x=x_eval, D=t.D_i)
        q_chf = self.chf(avail)
        if self._short_length_floor and q_chf > 0.0:
            avail["L"] = x_eval * t.G * t.D_i * sat.h_lv / (4.0 * q_chf)  # implied boiling length
            if avail["L"] < self._L_D_min * t.D_i:
                q_pool = self._pool_chf(avail)
                if q_pool > q_chf:
                    q_chf = q_pool
                    self._floored = True
        self._chf_memo = (P, x, q_chf, avail, self._floored)
        return q_chf, avail

    def _station(self, z, P, h, hstate, local: _Local, duty, dpdz_f) -> Station:
        t = self.tube
        sat = local.sat
        x = local.x
        alpha = self._void(x, sat)
        q = local.q
        q_o = q * t.D_i / t.D_o
        T_h = self.heating.temperature(hstate)
        T_wi = local.T_s + q * t.fouling_inner
        T_wo = T_wi + q * t.wall_resistance_inner
        htc_h = t.heating_adjust.htc(self.heating.film_htc(hstate, T_h, z, q_o))
        for bound, msg in self.heating.out_of_range(hstate, T_h, z, q_o):
            self._note(bound, msg, z)
        q_chf, avail = self._critical_flux(P, x, sat, z)
        wet = local.regime in WETTED_REGIMES
        if wet and self._floored and q > 0.5 * q_chf and not self.method_notes:
            self.method_notes[
                f"{self.chf.title} is evaluated at a boiling length below its data "
                f"(L/D = {avail['L'] / t.D_i:.2g} < {self._L_D_min:g}) and reads below the "
                f"pool-boiling critical flux; the critical flux is taken as "
                f"{self._pool_chf.title} ({q_chf:.4g} W/m^2), which flow and subcooling only "
                "raise"] = z
        elif wet and q > 0.5 * q_chf:  # where the critical flux cannot decide, a bound is moot
            self._note_range(self.chf, avail, z)
            if self._short_length_floor and avail.get("L", math.inf) < self._L_D_min * t.D_i:
                self._note("boiling length", (
                    f"{self.chf.title}: boiling length L/D = {avail['L'] / t.D_i:.3g} outside "
                    f"its data {KATTO_OHNO_L_D[0]:g} to {KATTO_OHNO_L_D[1]:g}"), z)
        pattern = self._flow_pattern(z, x, q, sat, alpha)
        r_boil = 1.0 / local.htc if local.htc > 0 else 0.0
        r_heat = 1.0 / htc_h if htc_h > 0 else 0.0
        ratio = t.D_o / t.D_i
        r_clean = r_heat + t.wall_resistance_inner * ratio + r_boil * ratio
        r_serv = r_clean + t.fouling_outer + t.fouling_inner * ratio
        return Station(
            z=z, P=P, h=h, T_sat=sat.T_sat, T_process=local.T_b, T_heating=T_h,
            T_wall_inner=T_wi, T_wall_outer=T_wo, x=x, void_fraction=alpha, q=q,
            q_outer=q_o, htc_boiling=local.htc, htc_nucleate=local.htc_nb,
            htc_convective=local.htc_conv, htc_heating=htc_h,
            u_service=1.0 / r_serv if r_serv > 0 else 0.0,
            u_clean=1.0 / r_clean if r_clean > 0 else 0.0,
            q_chf=q_chf, chf_ratio=q / q_chf if q_chf > 0 else math.inf,
            regime=local.regime, flow_pattern=pattern,
            wall_superheat=local.T_s - sat.T_sat, duty=duty, dpdz_friction=dpdz_f,
        )

    def _void(self, x, sat):
        if x <= 0.0:
            return 0.0
        if x >= 1.0:
            return 1.0
        memo = self._void_memo   # the gradients, the momentum flux and the station ask
        if memo[0] == x and memo[1] is sat:
            return memo[2]
        avail = dict(self._sat_inputs(sat))
        avail.update(x=x, G=self.tube.G, D=self.tube.D_i)
        alpha = min(max(self.void(avail, **self.void_options), 0.0), 1.0)
        self._void_memo = (x, sat, alpha)
        return alpha

    def _flow_pattern(self, z, x, q, sat, alpha):
        if x <= 0.0:
            return "single-phase liquid"
        if x >= 1.0:
            return "single-phase vapour"
        if self.pattern is None:
            return "mist" if self.dried_out else ("annular" if alpha > 0.8 else "intermittent")
        avail = dict(self._sat_inputs(sat))
        avail.update(G=self.tube.G, x=x, D=self.tube.D_i, q=max(q, 1.0))
        opts = {"z": max(z, 1e-3)} if "z" in self.pattern.options else {}
        pattern = self.pattern(avail, **opts)
        self._note_range(self.pattern, avail, z)
        if self.dried_out and pattern not in ("dryout", "mist"):
            return "mist"  # a map without a dryout zone (vertical): the film is gone
        return pattern

    def _gradients(self, bulk):
        """Frictional and gravitational pressure gradients [Pa/m] (positive = pressure falls)."""
        sat, x, _, single = bulk
        t = self.tube
        G = t.G
        sin_theta = 1.0 if t.vertical else 0.0
        if 0.0 < x < 1.0:
            avail = dict(self._sat_inputs(sat))
            avail.update(G=G, x=x, D=t.D_i)
            opts = {"roughness": t.roughness} if "roughness" in self.fric.options else {}
            dpf = self.fric(avail, **opts)
            alpha = self._void(x, sat)
            rho_m = alpha * sat.rho_v + (1.0 - alpha) * sat.rho_l
        else:
            if single is None:  # exactly saturated liquid or vapour
                rho, mu = (sat.rho_l, sat.mu_l) if x <= 0.0 else (sat.rho_v, sat.mu_v)
            else:
                rho, mu = single[0], single[1]
            Re = G * t.D_i / mu
            f = registry.get("colebrook_1939").function(Re, relative_roughness=t.roughness / t.D_i)
            dpf = f * G * G / (2.0 * t.D_i * rho)
            rho_m = rho
        return dpf, rho_m * g * sin_theta

    def _momentum_flux(self, bulk):
        sat, x, _, single = bulk
        G = self.tube.G
        if 0.0 < x < 1.0:
            alpha = min(max(self._void(x, sat), 1e-9), 1.0 - 1e-9)
            return G * G * (x * x / (sat.rho_v * alpha) + (1.0 - x) ** 2 / (sat.rho_l * (1.0 - alpha)))
        rho = single[0] if single is not None else (sat.rho_l if x <= 0.0 else sat.rho_v)
        return G * G / rho

    def _wojtan_bounds_crossed(self, **values) -> list[str]:
        """Bounds of WOJTAN_DRYOUT_DATA that the given values cross, as phrases."""
        out = []
        for key, value in values.items():
            if key == "fluid":
                if value not in WOJTAN_DRYOUT_DATA["fluid"]:
                    out.append(f"fluid {value or 'this fluid'} is not one of its data's "
                               f"({', '.join(WOJTAN_DRYOUT_DATA['fluid'])})")
                continue
            lo, hi, unit = WOJTAN_DRYOUT_DATA[key]
            if not lo <= value <= hi:
                out.append(f"{key} = {value:.4g} {unit} is outside its data {lo:.4g} to "
                           f"{hi:.4g} {unit}")
        return out

    def _dryout_margin(self, local: _Local):
        """How far the wetted wall is past dryout: >= 0 means dry.

        The larger of q/q_chf - 1 (critical heat flux) and x - x_crit (critical
        quality: the user's limit, and in horizontal tubes the Wojtan et al. 2005
        dryout-onset quality x_di, where the top of the tube dries first).
        Returns (margin, cause, q/q_chf).
        """
        x = local.x
        if x >= 1.0:
            return -math.inf, None, 0.0
        q_chf, _ = self._critical_flux(local.sat.P, x, local.sat, local.z)
        if local.q <= 0.0:
            ratio = 0.0
        else:  # a zero critical flux means no wetted wall is possible here
            ratio = local.q / q_chf if q_chf > 0.0 else math.inf
        x_crit = self.x_dryout_onset
        if (not self.tube.vertical and local.q > 0.0 and x > 0.0
                and not self._wojtan_fixed and not self._wojtan_bounds_crossed(q=local.q)):
            s = local.sat
            x_di = wojtan_dryout_qualities(self.tube.G, local.q, self.tube.D_i, s.rho_l,
                                           s.rho_v, s.sigma, s.h_lv)[0]
            x_crit = x_di if x_crit is None else min(x_crit, x_di)
        by_flux = ratio - 1.0
        by_quality = x - x_crit if x_crit is not None else -math.inf
        if by_flux >= by_quality:
            return by_flux, "critical heat flux", ratio
        return by_quality, "critical quality", ratio

    def _local(self, z, P, h, hs, bulk=None):
        bulk = bulk or self._bulk(P, h)
        local = self.solve_local(z, P, h, hs, bulk)
        self._note_ranges_at(z, local, bulk)
        return bulk, local

    def _dry_out_here(self, z, local):
        margin, cause, ratio = self._dryout_margin(local)
        self.dried_out = True
        self.dryout_z = z
        self.dryout_cause = cause
        self.dryout_trigger_ratio = ratio

    # ---- the march
    def run(self, P0, h0, hstate0, *, stop_duty=None, max_length=None) -> MarchOutcome:
        """March from z = 0 with the given inlet state.

        Increments end exactly on the events along the path (the saturation point,
        the onset of dryout and, with ``stop_duty`` (the area-for-duty question), the point where
        the cumulative duty reaches it) so that the outcome depends continuously on
        the inlet states, as the shooting and circulation roots need. With
        ``stop_duty`` the path may continue past ``length`` up to ``max_length``.
        """
        dz = self.length / self.n
        z_end = self.length if stop_duty is None else (max_length or self.length)
        z, duty = 0.0, 0.0
        stations: list[Station] = []
        self._hs0, self._hs = hstate0, hstate0
        self._stop_duty = stop_duty
        self.z = z
        try:
            bulk, local = self._local(z, P0, h0, hstate0)
            if self._dryout_margin(local)[0] >= 0.0:
                self._dry_out_here(z, local)
                bulk, local = self._local(z, P0, h0, hstate0, bulk)
            stations.append(self._station(z, P0, h0, hstate0, local, duty,
                                          self._gradients(bulk)[0]))
            z, state, _, stopped = self.increments(z, z_end, dz, (P0, h0, hstate0, duty),
                                                   (bulk, local), stations, z_end)
            if stopped:
                return self._outcome(stations)
            duty = state[3]
        except _PressureZero as exc:
            return self._outcome(stations, "failed", said(
                "the pressure falls to zero at z = {z:length:.4g}: the boiling-side pressure "
                "drop exceeds the inlet pressure", z=exc.z), exhausted=True)
        except _PressureExhausted as exc:
            return self._outcome(stations, "failed", said(
                "the boiling-side pressure is used up by friction and acceleration at "
                "z = {z:length:.4g}: the flow is too large for these tubes (choking is not "
                "modelled); use more tubes or passes with fewer tubes in series", z=exc.z),
                exhausted=True)
        except PropertyError as exc:
            # A pressure below the triple point is the same exhaustion, seen by the properties.
            low = (isinstance(exc, OutOfRangeError) and set(exc.state) == {"P"}
                   and not exc.state["P"] >= P0)
            return self._outcome(stations, "failed", said("at z = {z:length:.4g}: {why:text}",
                                                          z=self.z, why=str(exc)),
                                 exhausted=low)
        except (ValueError, ZeroDivisionError, OverflowError, RuntimeError) as exc:
            return self._outcome(stations, "failed", said(
                "no solution at z = {z:length:.4g}: {why:text}", z=self.z, why=str(exc)))
        if stop_duty is not None:
            return self._outcome(stations, "failed", said(
                "the required duty is not reached within {z_end:length:.3g} of tube "
                "(reached {duty:power:.4g})", z_end=z_end, duty=duty))
        return self._outcome(stations)

    def _stable_step(self, local: _Local, bulk, hs, dz):
        dT = self.heating.temperature(hs) - local.T_b
        if local.q <= 0.0 or dT <= 0.0:
            return dz
        t = self.tube
        ua_per_length = local.q * math.pi * t.D_i / dT          # per tube [W/m/K]
        single = bulk[3]
        c_boil = t.mass_flow_per_tube * single[3] if single is not None else math.inf
        c_heat = self.heating.capacity_rate(hs) / t.tubes_in_parallel
        c_min = min(c_boil, c_heat)
        step = dz
        if math.isfinite(c_min):
            step = NTU_PER_STEP * c_min / ua_per_length
        if single is None:  # two-phase: a bounded quality change per increment
            step = min(step, QUALITY_PER_STEP * t.mass_flow_per_tube * bulk[0].h_lv
                       / (local.q * math.pi * t.D_i))
        return min(dz, max(step, SMALLEST_STEP * dz))

    def _outcome(self, stations, status="ok", message="", *, exhausted=False):
        return MarchOutcome(stations, status, message, self.dryout_z, dict(self.range_notes),
                            method_notes=dict(self.method_notes),
                            start_heating_state=self._hs0, end_heating_state=self._hs,
                            dryout_cause=self.dryout_cause,
                            dryout_trigger_ratio=self.dryout_trigger_ratio,
                            pressure_exhausted=exhausted)

    # Events inside an increment, as functions of the end state; each is < 0 at the
    # start of the increment and >= 0 where the event has happened.
    _SATURATION_TARGET = PAST_EVENT   # land just past x = 0: the next station is saturated

    def _event_value(self, event, end, duty, stop_duty, sat1, local1):
        """The event's function at the end state of an increment (see above). The
        saturation events need only the saturation set at the end, dryout the end's
        local solution."""
        if event == "duty":
            return (duty + end[3] - stop_duty) / stop_duty
        if event == "dryout":
            return self._dryout_margin(local1)[0]
        x1 = (end[1] - sat1.h_l) / sat1.h_lv
        return x1 - self._SATURATION_TARGET - (1.0 if event == "dry vapour" else 0.0)

    def _event(self, z, step, end, local, duty, stop_duty):
        """The first event inside the increment just computed.

        Returns (event or None, the end's (bulk, local) or None, the event function at
        the end); without an event the end's local solution is the next station's.
        """
        if stop_duty is not None and duty + end[3] >= stop_duty:
            return "duty", None, self._event_value("duty", end, duty, stop_duty, None, None)
        P1, h1, hs1 = end[0], end[1], end[2]
        bulk1 = self._bulk(P1, h1)
        x1 = bulk1[1] - self._SATURATION_TARGET
        if local.x < 0.0 <= x1:
            return "saturation", None, x1
        if local.x < 1.0 <= x1:
            return "dry vapour", None, x1 - 1.0
        local1 = self.solve_local(z + step, P1, h1, hs1, bulk1)
        if not self.dried_out and bulk1[1] < 1.0:
            margin = self._dryout_margin(local1)[0]
            if margin >= 0.0:
                return "dryout", (bulk1, local1), margin
        return None, (bulk1, local1), None

    def _event_at_start(self, event, local, duty, stop_duty):
        """The event function at the start of the increment (< 0: not yet happened)."""
        if event == "duty":
            return (duty - stop_duty) / stop_duty
        if event == "dryout":
            return self._dryout_margin(local)[0]
        return local.x - self._SATURATION_TARGET - (1.0 if event == "dry vapour" else 0.0)

    # ---- the stepper's hooks (Stepper); state (P, h, hs, duty), local (bulk, _Local)
    def stable_step(self, z, state, local, dz):
        return self._stable_step(local[1], local[0], state[2], dz)

    def step(self, z, dz, state, local):
        P, h, hs, _ = state
        return self._step(z, dz, P, h, hs, self.tube.tubes_in_parallel, local[1], local[0])

    def event(self, z, step, state, local, end):
        return self._event(z, step, end, local[1], state[3], self._stop_duty)

    def event_at_start(self, event, state, local):
        return self._event_at_start(event, local[1], state[3], self._stop_duty)

    def event_trial(self, event, z, length, state, trial):
        trial_local = sat1 = None
        if event == "dryout":
            bulk1 = self._bulk(trial[0], trial[1])
            trial_local = (bulk1, self.solve_local(z + length, trial[0], trial[1], trial[2],
                                                   bulk1))
        elif event != "duty":
            sat1 = self._saturation(trial[0])
        f = self._event_value(event, trial, state[3], self._stop_duty, sat1,
                              trial_local[1] if trial_local else None)
        return f, trial_local

    def arrive(self, z, state, end, end_local, event, stations):
        P, h, hs, dQ, dpf = end
        duty = state[3] + dQ
        self._hs = hs
        if P <= 0.0 or not math.isfinite(P):
            raise _PressureZero(z)
        if end_local is not None:
            bulk, local = end_local
            self._note_ranges_at(z, local, bulk)
        else:
            bulk, local = self._local(z, P, h, hs)
        if event == "dryout":
            # The wetted wall's station, then the dry one at the same z: the jump.
            stations.append(self._station(z, P, h, hs, local, duty, dpf))
            self._dry_out_here(z, local)
            bulk, local = self._local(z, P, h, hs, bulk)
        elif event == "dry vapour" and not self.dried_out:
            # The wall stayed wet up to complete evaporation: the tube is dry from here.
            self.dried_out, self.dryout_z = True, z
            self.dryout_cause = "complete evaporation"
        stations.append(self._station(z, P, h, hs, local, duty, dpf))
        return (P, h, hs, duty), (bulk, local), event == "duty"

    def _note_ranges_at(self, z, local: _Local, bulk):
        """Validity bounds of every method evaluated at this station (once per bound)."""
        t = self.tube
        regime, base = local.regime, self._sat_inputs(local.sat)
        single = bulk[3]
        if single is not None and regime in ("subcooled liquid", "subcooled boiling",
                                             "superheated vapour"):
            rho, mu, k, cp = single
            self._note_range(self.single, {"Re": t.G * t.D_i / mu, "Pr": cp * mu / k}, z)
        if regime in ("subcooled boiling", "saturated boiling") and local.q > 0.0:
            self._note_range(self.nb, dict(base, q=local.q, **t.nucleate_inputs), z)
        if regime == "subcooled boiling":
            self._note_range(self.sub, dict(base, G=t.G, D=t.D_i), z)
        if regime == "saturated boiling":
            avail = dict(base, G=t.G, x=min(max(local.x, 1e-4), 0.9999), D=t.D_i,
                         q=max(local.q, 1.0), **self.fb_inputs)
            for method in (self.fb, self.fric, self.void):
                self._note_range(method, avail, z)
            if not t.vertical and local.q > 0.0:
                for phrase in self._wojtan_fixed + self._wojtan_bounds_crossed(q=local.q):
                    self._note(f"Wojtan x_di {phrase.split()[0]}", (
                        f"the Wojtan et al. (2005) dryout-onset quality is not used where {phrase}; "
                        f"dryout is found by {self.chf.title} alone"), z)
        if regime == "post-dryout":
            self._note_range(self.post, dict(base, G=t.G, x=min(max(local.x, 0.0), 1.0),
                                             D=t.D_i), z)

    def _note(self, bound, message, z):
        """Record a message once per bound, at the first position where it holds."""
        if bound not in self._range_bounds:
            self._range_bounds.add(bound)
            self.range_notes[message] = z

    def _step(self, z, dz, P, h, hs, n_par, loc0, bulk0):
        """One midpoint increment from a solved station; returns the end state, the
        duty of the increment over all parallel tubes and the friction gradient."""
        t = self.tube
        m = t.mass_flow_per_tube
        per_len = math.pi * t.D_i
        dpf0, dpg0 = self._gradients(bulk0)
        # half step with the flux at the start, then the full step with the mid flux
        dQh = loc0.q * per_len * 0.5 * dz
        hm = h + dQh / m
        Pm = P - (dpf0 + dpg0) * 0.5 * dz
        if Pm <= 0.02 * P:
            raise _PressureExhausted(z)
        hsm = self.heating.advance(hs, dQh * n_par)
        bulkm = self._bulk(Pm, hm)
        locm = self.solve_local(z + 0.5 * dz, Pm, hm, hsm, bulkm)
        dpfm, dpgm = self._gradients(bulkm)
        dQ = locm.q * per_len * dz
        h1 = h + dQ / m
        P_pred = P - (dpfm + dpgm) * dz
        if P_pred <= 0.02 * P:
            raise _PressureExhausted(z)
        acc = self._momentum_flux(self._bulk(P_pred, h1)) - self._momentum_flux(bulk0)
        P1 = P_pred - acc
        hs1 = self.heating.advance(hs, dQ * n_par)
        return P1, h1, hs1, dQ * n_par, dpfm
