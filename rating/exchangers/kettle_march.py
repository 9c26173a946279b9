"""The tube-side march of a kettle reboiler: heating medium inside, pool boiling outside.

The kettle's physics is the evaporator's inverted: the heating medium flows inside
the tubes, pass after pass, and the boiling fluid is a pool on the outside of the
bundle. The state along the tube-side path is the heating medium's specific
enthalpy h. The shell side at a station is the pool around the band of tubes the
pass occupies, saturated at the vapour-space pressure plus the liquid head over
the band (``PoolBand``). It has no state of its own to march: the feed mixes into
a pool held at saturation (Sinnott, Coulson & Richardson Vol. 6: a subcooled feed
mixes rapidly into the boiling pool).

Over an increment the local flux is a bracketed root of the series resistances
(inside film, inside fouling, wall, outside fouling, bundle boiling film), the
boiling film taken from the local flux; the medium gives up exactly the heat the
pool takes (explicit midpoint rule, as in ``rating.march``), so the energy balance
closes to the precision of the property inversions. Increments end exactly at the
pass boundaries (where the band, hence the boiling temperature, changes: the
profile has two stations at the same z there) and, for steam, where the last
vapour condenses. A liquid medium's increments carry at most 0.4 transfer units
(``rating.march.Marcher._NTU_PER_STEP``), condensing steam's change its quality by
at most 0.25.

Stations are ``rating.march.Station`` with kettle meanings: ``P``, ``T_sat`` and
``T_process`` the pool's local pressure and boiling temperature at the band; ``h``
the heating medium's enthalpy; ``q`` = ``q_outer`` the flux on the outer (boiling)
surface; ``T_wall_inner`` / ``T_wall_outer`` the tube metal's inside / outside
surface; ``x`` the pool's mixed outlet quality reached with the duty up to z (the
vapour fraction of the kettle outlet if the bundle ended there); ``void_fraction``
NaN (the bundle void is not modelled); ``htc_boiling`` the bundle coefficient,
``htc_nucleate`` its nucleate part F_b F_m htc_nb, ``htc_convective`` its natural-
convection part; ``htc_heating`` the inside film on the inside area; ``q_chf`` the
bundle maximum flux and ``chf_ratio`` q over it; ``regime`` "pool boiling";
``dpdz_friction`` the tube side's.
"""
from __future__ import annotations

import math

from ..roots import brentq

from ..adjust import Adjustment
from ..correlations import registry
from ..correlations.single_phase import htc_tube_single_phase
from ..errors import PropertyError
from ..march import Cancelled, MarchOutcome, Marcher, Station, flux_root
from ..properties import SinglePhaseState
from .heating import EnthalpyTable

#: Temperature step of the finite difference for the liquid's expansion coefficient [K].
_BETA_STEP = 1.0
#: Largest quality the in-tube condensation coefficient is evaluated at: Shah's form
#: falls to 0 at x = 1 (no condensate film), the limit of a film of zero thickness.
_X_MAX_CONDENSING = 0.9999
#: Chato's (1962) constant for stratified condensation inside a horizontal tube [memory].
CHATO_C = 0.555
#: Condensate within this of its saturation temperature takes the saturated liquid's
#: properties [K].
_NEAR_SATURATION = 0.5
#: Largest change of the steam quality in one increment: an explicit step that
#: condenses more would take its midpoint into the condensate (as in rating.march).
_QUALITY_PER_STEP = 0.25
#: Land just past complete condensation (in quality), so the next station is subcooled.
_CONDENSED_TARGET = 1e-9


class InTubeHeating:
    """The heating medium inside the tubes; its state is its specific enthalpy h [J/kg].

    Condensing steam (``condensing``): saturated at its inlet pressure (the tube-side
    pressure drop is reported, not fed back into the temperature), the larger of Shah
    (1979) and Chato (1962) while two-phase (``film``), then single-phase condensate.
    A liquid: single phase throughout. The film coefficient is on the inside surface;
    ``fixed_htc`` replaces the correlations.
    """

    def __init__(self, fluid, pressure, mass_flow, *, D_i, tubes_per_pass, condensing,
                 single_phase_method, two_phase_friction, roughness, fixed_htc=None,
                 htc_factor=1.0):
        self.fluid = fluid
        self.pressure = pressure
        self.mass_flow = mass_flow
        self.D_i = D_i
        self.tubes_per_pass = tubes_per_pass
        self.condensing = condensing
        self.sat = fluid.saturation(pressure) if condensing else None
        self.single_phase_method = single_phase_method
        self.condensation = registry.get("shah_1979")
        self.friction = registry.get(two_phase_friction)
        self.colebrook = registry.get("colebrook_1939")
        self.roughness = roughness
        self.fixed_htc = fixed_htc
        self.htc_factor = htc_factor  # a user's multiplier on the correlations
        self.chato_C1 = None
        if condensing:
            # Chato (1962): Nusselt's horizontal-cylinder film with C = 0.555 on the inside
            # diameter; its coefficient at a 1 K wall subcooling.
            s = self.sat
            self.chato_C1 = registry.get("nusselt_horizontal_tube").function(
                D_i, 1.0, s.rho_l, s.rho_v, s.mu_l, s.k_l, s.h_lv, C=CHATO_C)
        self.range_notes: dict[str, float] = {}
        self._T: dict[float, float] = {}
        self._props: dict[float, object] = {}
        self._table = None
        self._table_for = None

    def tabulate(self, T_lo, h_hi):
        """Take the liquid's (or the condensate's) temperature from a T(h) table from
        T_lo up to the enthalpy h_hi (the inlet's, or the condensate's saturation),
        instead of a (P, h) flash per state (``heating.EnthalpyTable``)."""
        if self.condensing:
            h_hi = self.sat.h_l
        if self._table_for == (T_lo, h_hi):
            return
        self._table_for = (T_lo, h_hi)
        T_lo = max(T_lo, getattr(self.fluid, "T_min", T_lo))
        # the condensate's table ends just below saturation, where a (P, T) state is liquid
        T_hi = self.sat.T_sat - 1e-3 if self.condensing else self.temperature(h_hi)
        self._table = EnthalpyTable.build(self.fluid, self.pressure, T_lo, T_hi) \
            if T_hi > T_lo else None

    @property
    def G(self) -> float:
        """Mass flux in one tube [kg/m^2/s]."""
        return self.mass_flow / (self.tubes_per_pass * math.pi * self.D_i ** 2 / 4.0)

    def quality(self, h):
        """Steam quality at h (negative: subcooled condensate); None for a liquid."""
        if not self.condensing:
            return None
        return (h - self.sat.h_l) / self.sat.h_lv

    def temperature(self, h) -> float:
        if self.condensing and h >= self.sat.h_l:
            return self.sat.T_sat
        if self._table is not None:
            T = self._table.temperature(h)
            if T is not None:
                return T
        T = self._T.get(h)
        if T is None:
            if len(self._T) > 4096:
                self._T.clear()
            T = self._T[h] = self.fluid.temperature(self.pressure, h)
        return T

    def _single(self, T):
        # Properties change slowly with T; a 0.1 K grid keeps the property calls down.
        key = round(T, 1)
        s = self._props.get(key)
        if s is None:
            sat = self.sat
            if sat is not None and key > sat.T_sat - _NEAR_SATURATION:
                # condensate just below saturation: the saturated liquid's (a flash at a
                # grid point on or above T_sat would fall on the saturation line)
                s = SinglePhaseState(sat.P, sat.T_sat, sat.rho_l, sat.h_l, sat.cp_l, sat.mu_l,
                                     sat.k_l, sat.Pr_l, "liquid")
            else:
                s = self.fluid.single_phase(self.pressure, key)
            self._props[key] = s
        return s

    def film(self, h):
        """The inside film at the state h: (constant htc, Chato's C1 or None) [W/m^2/K].

        Condensing, the film coefficient is the larger of Shah's (1979, shear-controlled
        annular film, independent of the flux) and Chato's (1962, gravity-controlled
        stratified film, htc = C1 dT^-1/4, so htc = C1^(4/3) q^(-1/3)): Shah's falls with
        the mass flux as G^0.8 and alone would starve a steam kettle at low flux (the
        steam flow follows the duty behind a trap), where condensate drains by gravity.
        """
        if self.fixed_htc is not None:
            return self.fixed_htc, None
        f = self.htc_factor
        x = self.quality(h)
        if x is not None and x >= 0.0:  # Chato's htc = C1^(4/3) q^(-1/3): C1 scales as f^(3/4)
            return f * self._shah(x), self.chato_C1 * f ** 0.75
        s = self._single(self.temperature(h))
        return f * htc_tube_single_phase(self.G, self.D_i, s.mu, s.k, s.cp,
                                         method=self.single_phase_method, heating=False), None

    def _shah(self, x):
        avail = self.sat.as_dict()
        avail.update(G=self.G, x=min(x, _X_MAX_CONDENSING), D=self.D_i)
        return self.condensation(avail)

    @staticmethod
    def film_drop(film, q_i) -> float:
        """Temperature drop across the inside film at the inside flux q_i [K]."""
        htc, C1 = film
        if q_i <= 0.0:
            return 0.0
        drop = q_i / htc
        return drop if C1 is None else min(drop, (q_i / C1) ** (4.0 / 3.0))

    def film_htc(self, film, q_i, h, z) -> float:
        """The inside coefficient at the flux q_i [W/m^2/K]; notes the governing method's range."""
        htc, C1 = film
        stratified = C1 is not None and q_i > 0.0 and C1 ** (4.0 / 3.0) * q_i ** (-1.0 / 3.0) > htc
        if stratified:
            htc = C1 ** (4.0 / 3.0) * q_i ** (-1.0 / 3.0)
        if self.fixed_htc is not None:
            return htc
        x = self.quality(h)
        if x is not None and x >= 0.0:
            if not stratified:
                avail = self.sat.as_dict()
                avail.update(G=self.G, x=min(x, _X_MAX_CONDENSING), D=self.D_i)
                for msg in self.condensation.out_of_range(avail):
                    self.range_notes.setdefault(msg, z)
            return htc
        s = self._single(self.temperature(h))
        method = registry.get(self.single_phase_method)
        for msg in method.out_of_range({"Re": self.G * self.D_i / s.mu, "Pr": s.Pr}):
            self.range_notes.setdefault(msg, z)
        return htc

    def dpdz(self, h) -> float:
        """Frictional pressure gradient inside a tube at the state h [Pa/m]."""
        x = self.quality(h)
        G = self.G
        if x is not None and x > 0.0:
            avail = self.sat.as_dict()
            avail.update(G=G, x=min(x, _X_MAX_CONDENSING), D=self.D_i)
            opts = {"roughness": self.roughness} if "roughness" in self.friction.options else {}
            return self.friction(avail, **opts)
        if x is not None and x == 0.0:
            rho, mu = self.sat.rho_l, self.sat.mu_l
        else:
            s = self._single(self.temperature(h))
            rho, mu = s.rho, s.mu
        f = self.colebrook.function(G * self.D_i / mu, relative_roughness=self.roughness / self.D_i)
        return f * G * G / (2.0 * self.D_i * rho)

    def density(self, h) -> float:
        """Liquid density at h (for the return losses of a liquid) [kg/m^3]."""
        return self._single(self.temperature(h)).rho

    def capacity_rate(self, h) -> float:
        """m cp of the medium [W/K]; infinite while it condenses (the condensate's at
        complete condensation, so that the step from there is the condensate's)."""
        x = self.quality(h)
        if x is not None and x > _CONDENSED_TARGET:
            return math.inf
        return self.mass_flow * self._single(self.temperature(h)).cp


class PoolBand:
    """The saturated pool around one band of tubes: the bundle's boiling coefficient.

    .. math:: htc_b = F_b F_m htc_{nb}(q) + htc_{nc}(\\Delta T)

    (Palen 1983, Heat Exchanger Design Handbook 3.6, as worked in the Wolverine
    Engineering Data Book kettle example): the nucleate coefficient of the chosen
    method at the local flux, times the bundle factor F_b for the circulation the
    vapour drives through the bundle and the mixture factor F_m (1 for a pure
    fluid), plus natural convection on a horizontal cylinder (Churchill & Chu 1975)
    with the saturated liquid's properties and the wall superheat. ``superheat(q)``
    returns the wall superheat at the flux q and the coefficients.
    """

    def __init__(self, fluid, P, *, D_o, nucleate, nucleate_inputs, nucleate_options,
                 bundle_factor, mixture, boiling_range, bundle_max_flux, range_notes,
                 adjust=Adjustment()):
        self.P = P
        self.adjust = adjust  # a user's fixed coefficient or multiplier (rating.adjust)
        self.sat = sat = fluid.saturation(P)
        self.T_sat = sat.T_sat
        self.D_o = D_o
        self.nb = nucleate
        self.flux_form = "q" in nucleate.inputs
        self.nb_avail = {**sat.as_dict(), **nucleate_inputs}
        self.nb_options = nucleate_options
        self.F_b = bundle_factor
        self.mixture = mixture if boiling_range > 0.0 else None
        self.mix_avail = {"boiling_range": boiling_range, "rho_l": sat.rho_l, "h_lv": sat.h_lv}
        self.q_max = bundle_max_flux
        self.range_notes = range_notes
        # Expansion coefficient of the saturated liquid, by a finite difference below T_sat.
        T = sat.T_sat
        rho_1 = fluid.single_phase(P, T - _BETA_STEP).rho
        rho_2 = fluid.single_phase(P, T - 2.0 * _BETA_STEP).rho
        self.beta = max((rho_2 - rho_1) / (_BETA_STEP * 0.5 * (rho_1 + rho_2)), 0.0)
        self.nc = registry.get("churchill_chu_1975_cylinder")
        self._last = None

    def natural_convection(self, dT) -> float:
        s = self.sat
        return self.nc.function(self.D_o, dT, s.rho_l, s.mu_l, s.k_l, s.cp_l, self.beta)

    def _nucleate(self, q, dT=None):
        """F_b F_m htc_nb at the flux q (and the superheat dT for a superheat form)."""
        avail = self.nb_avail
        if self.flux_form:
            avail["q"] = q
        else:
            avail["dT_sat"] = dT
            avail["dp_sat"] = self.sat.dp_sat(dT)
        htc = self.nb(avail, **self.nb_options)
        F_m = 1.0
        if self.mixture is not None:
            self.mix_avail.update(q=q, htc_ideal=htc)
            F_m = self.mixture(self.mix_avail)
        return self.F_b * F_m * htc

    def superheat(self, q):
        """(wall superheat [K], htc_b, nucleate part, natural-convection part) at flux q."""
        last = self._last
        if last is not None and last[0] == q:  # the local solve asks again for its root
            found = last[1]
        else:
            found = self._superheat(q)
            self._last = (q, found)
        adjust = self.adjust
        if not adjust.active:
            return found
        dT, htc, nb, nc = found
        if adjust.fixed is not None:
            return q / adjust.fixed, adjust.fixed, None, None  # parts: not computed
        return dT / adjust.factor, htc * adjust.factor, nb * adjust.factor, nc * adjust.factor

    def _superheat(self, q):
        if q <= 0.0:
            h_nc = self.natural_convection(0.0)
            return 0.0, h_nc, 0.0, h_nc
        if self.flux_form:
            a = self._nucleate(q)

            def resid(dT):
                return (a + self.natural_convection(dT)) * dT - q

            if a > 0.0:
                # q/a (no natural convection) is above the root and one fixed-point step
                # q/(a + htc_nc(q/a)) below it, as htc_nc rises with the superheat.
                hi = q / a
                lo = q / (a + self.natural_convection(hi))
                dT = _illinois(resid, lo, hi)
            else:
                dT = brentq(resid, 0.0, _expand(resid, 1.0), xtol=1e-12, rtol=1e-12)
        else:
            def resid(dT):
                return (self._nucleate(q, dT) + self.natural_convection(dT)) * dT - q

            dT = brentq(resid, 0.0, _expand(resid, 1.0), xtol=1e-12, rtol=1e-12)
        h_nc = self.natural_convection(dT)
        return dT, q / dT, q / dT - h_nc, h_nc

    def note_ranges(self, q, dT, z):
        avail = dict(self.nb_avail, q=q, dT_sat=dT)
        for method, av in ((self.nb, avail), (self.nc, {
                "D": self.D_o, "dT": dT, "rho": self.sat.rho_l, "mu": self.sat.mu_l,
                "k": self.sat.k_l, "cp": self.sat.cp_l, "beta": self.beta})):
            for msg in method.out_of_range(av):
                self.range_notes.setdefault(msg, z)


def _illinois(f, lo, hi, rtol=1e-12):
    """Root of an increasing f bracketed by lo < hi (regula falsi, Illinois variant)."""
    f_lo, f_hi = f(lo), f(hi)
    if f_lo >= 0.0:
        return lo
    if f_hi <= 0.0:
        return hi
    side = 0
    for _ in range(100):
        x = (lo * f_hi - hi * f_lo) / (f_hi - f_lo)
        fx = f(x)
        if fx > 0.0:
            hi, f_hi = x, fx
            if side == 1:
                f_lo *= 0.5
            side = 1
        else:
            lo, f_lo = x, fx
            if side == -1:
                f_hi *= 0.5
            side = -1
        if fx == 0.0 or hi - lo <= rtol * hi:
            return x
    return x


def _expand(resid, hi):
    """An upper bracket where the increasing ``resid`` is positive (doubling from hi)."""
    for _ in range(80):
        if resid(hi) > 0.0:
            return hi
        hi *= 2.0
    raise ValueError("no bracket for the wall superheat")


class KettleMarch:
    """The march along the tube-side path, pass after pass (``run``).

    ``bands[k]`` is the pool around pass k (k = 0 first). ``feed`` = (mass flow,
    inlet enthalpy, saturation set at the vapour space) gives the pool quality at
    each station. Resistances: ``R_wall`` on the outer area, ``fouling_inner`` on the
    inner, ``fouling_outer`` on the outer area [m^2K/W].
    """

    def __init__(self, heating: InTubeHeating, bands, *, D_o, D_i, R_wall, fouling_inner,
                 fouling_outer, tubes_per_pass, pass_length, increments, feed,
                 progress=None, cancel=None):
        self.heating = heating
        self.bands = bands
        self.D_o, self.D_i = D_o, D_i
        self.R_wall = R_wall
        self.Rf_i, self.Rf_o = fouling_inner, fouling_outer
        self.n_tpp = tubes_per_pass
        self.L = pass_length
        self.passes = len(bands)
        self.n_per_pass = max(1, math.ceil(increments / self.passes))
        self.m_feed, self.h_feed, self.sat_v = feed
        self.progress = progress
        self.cancel = cancel
        self.per_length = math.pi * D_o * tubes_per_pass     # outer area per metre of path
        self._q_guess = 0.0                                   # the last local flux
        self._q_slope = None                                  # and the residual's slope there
        self.pass_of_station: list[int] = []

    # ---- local solve
    def _r_fixed(self):
        """Inside fouling, wall and outside fouling, on the outer area [m^2K/W]."""
        return self.Rf_i * self.D_o / self.D_i + self.R_wall + self.Rf_o

    def local(self, h, band: PoolBand, z, *, no_inside_film=False):
        """(q, T_h, inside film, superheat tuple) at the heating state h against the band.

        ``no_inside_film`` drops the inside film resistance: an upper bound of the flux.
        """
        heating = self.heating
        T_h = heating.temperature(h)
        film = (math.inf, None) if no_inside_film else heating.film(h)
        R = self._r_fixed()
        ratio = self.D_o / self.D_i
        dT = T_h - band.T_sat
        if dT <= 0.0:
            return 0.0, T_h, film, band.superheat(0.0)

        def resid(q):
            return dT - q * R - heating.film_drop(film, q * ratio) - band.superheat(q)[0]

        q, slope = flux_root(resid, dT / R, dT, self._q_guess, self._q_slope)
        self._q_guess = q
        if slope is not None:
            self._q_slope = slope
        return q, T_h, film, band.superheat(q)

    def _station(self, z, h, band, loc, duty):
        q, T_h, film, (dT_b, htc_b, htc_nb, htc_nc) = loc
        q_i = q * self.D_o / self.D_i
        htc_i = self.heating.film_htc(film, q_i, h, z)
        T_wi = T_h - q_i * (1.0 / htc_i + self.Rf_i)
        T_wo = T_wi - q * self.R_wall
        r_clean = self.D_o / (self.D_i * htc_i) + self.R_wall + 1.0 / htc_b
        r_serv = r_clean + self.Rf_i * self.D_o / self.D_i + self.Rf_o
        sat = self.sat_v
        x = (self.h_feed + duty / self.m_feed - sat.h_l) / sat.h_lv
        return Station(
            z=z, P=band.P, h=h, T_sat=band.T_sat, T_process=band.T_sat, T_heating=T_h,
            T_wall_inner=T_wi, T_wall_outer=T_wo, x=x, void_fraction=math.nan, q=q,
            q_outer=q, htc_boiling=htc_b, htc_nucleate=htc_nb, htc_convective=htc_nc,
            htc_heating=htc_i, u_service=1.0 / r_serv, u_clean=1.0 / r_clean,
            q_chf=band.q_max, chf_ratio=q / band.q_max, regime="pool boiling",
            flow_pattern="bundle pool boiling", wall_superheat=dT_b, duty=duty,
            dpdz_friction=self.heating.dpdz(h))

    # ---- the march
    def run(self, h0) -> MarchOutcome:
        """March the whole tube-side path from the heating inlet state h0."""
        stations: list[Station] = []
        self.pass_of_station = []
        self.heating.range_notes = {}       # this march's own, not an earlier one's
        for band in self.bands:
            band.range_notes.clear()
        z, h, duty = 0.0, h0, 0.0
        total = self.passes * self.L
        try:
            # the medium cools from h0 towards the coldest pool, not below it
            self.heating.tabulate(min(b.T_sat for b in self.bands), h0)
            for k, band in enumerate(self.bands):
                z_end = (k + 1) * self.L
                dz = self.L / self.n_per_pass
                loc = self.local(h, band, z)
                self._add(stations, z, h, band, loc, duty, k)
                while z < z_end - 1e-12 * total:
                    if self.cancel is not None and self.cancel():
                        raise Cancelled()
                    step = min(dz, z_end - z, self._stable_step(h, loc, band, dz))
                    h1, dQ = self._step(z, step, h, loc, band)
                    if self._condenses(h, h1):
                        step, h1, dQ = self._locate_condensation(z, step, h, loc, band)
                    z = z_end if z_end - (z + step) < 1e-12 * total else z + step
                    h, duty = h1, duty + dQ
                    loc = self.local(h, band, z)
                    self._add(stations, z, h, band, loc, duty, k)
                    if self.progress is not None:
                        self.progress(min(z / total, 1.0))
        except PropertyError as exc:  # the pool's properties are all taken before the march
            return self._outcome(stations, h0, h, "failed", (
                f"the heating medium leaves its property range at z = {z:.3f} m, cooled "
                f"towards the pool at {min(b.T_sat for b in self.bands):.2f} K (a medium that "
                f"would freeze there cannot heat this pool): {exc}"))
        except (ValueError, ZeroDivisionError, OverflowError, RuntimeError) as exc:
            return self._outcome(stations, h0, h, "failed", f"no solution at z = {z:.3f} m: {exc}")
        return self._outcome(stations, h0, h)

    def _add(self, stations, z, h, band, loc, duty, k):
        stations.append(self._station(z, h, band, loc, duty))
        self.pass_of_station.append(k)
        band.note_ranges(loc[0], loc[3][0], z)

    def _outcome(self, stations, h0, h, status="ok", message=""):
        notes = dict(self.heating.range_notes)
        for band in self.bands:
            for msg, z in band.range_notes.items():
                notes.setdefault(msg, z)
        return MarchOutcome(stations, status, message, None, notes,
                            start_heating_state=h0, end_heating_state=h)

    def _stable_step(self, h, loc, band, dz):
        """Increments of a liquid medium carry at most ``Marcher._NTU_PER_STEP`` units;
        condensing steam changes its quality by at most ``_QUALITY_PER_STEP``."""
        q, T_h = loc[0], loc[1]
        if q <= 0.0:
            return dz
        heating = self.heating
        ua_per_length = q * self.per_length / (T_h - band.T_sat)
        c = heating.capacity_rate(h)
        if math.isfinite(c):
            step = Marcher._NTU_PER_STEP * c / ua_per_length
        else:
            # Length per unit of quality; near complete condensation the step ends at
            # most a condensate step past it, so that its midpoint is not deep in the
            # condensate (where the flux of the rest of the step would be lost).
            per_x = heating.mass_flow * heating.sat.h_lv / (q * self.per_length)
            condensate = (Marcher._NTU_PER_STEP * heating.mass_flow * heating.sat.cp_l
                          / ua_per_length)
            step = min(_QUALITY_PER_STEP * per_x, heating.quality(h) * per_x + condensate)
        return min(dz, max(step, Marcher._SMALLEST_STEP * dz))

    def _step(self, z, dz, h, loc0, band):
        """One midpoint increment: the end state and the duty it carries [W]."""
        m = self.heating.mass_flow
        dQh = loc0[0] * self.per_length * 0.5 * dz
        locm = self.local(h - dQh / m, band, z + 0.5 * dz)
        dQ = locm[0] * self.per_length * dz
        return h - dQ / m, dQ

    def _condenses(self, h, h1):
        sat = self.heating.sat
        return sat is not None and h >= sat.h_l and (h1 - sat.h_l) / sat.h_lv < -_CONDENSED_TARGET

    def _locate_condensation(self, z, step, h, loc0, band):
        """Shorten the increment so that it ends just past complete condensation."""
        sat = self.heating.sat

        def f(length):
            return (self._step(z, length, h, loc0, band)[0] - sat.h_l) / sat.h_lv \
                + _CONDENSED_TARGET

        length = brentq(f, 0.0, step, xtol=1e-10 * step, rtol=1e-12, maxiter=100)
        while f(length) > 0.0 and length < step:   # end on the condensed side of the root
            length = min(step, length + 1e-9 * step)
        h1, dQ = self._step(z, length, h, loc0, band)
        return length, h1, dQ
