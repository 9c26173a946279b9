"""A heating medium inside the tubes against a boiling pool outside (``PoolMarcher``).

The kettle's tube-side path, marched by ``rating.march``: the medium condensing
(steam) or sensible (a liquid), pass after pass; the pool around each pass is a band
of the bundle (``rating.exchangers.bundle_pool.PoolBand``).
"""
from __future__ import annotations

import math

from .errors import PropertyError
from .rules import said
from .march import (NTU_PER_STEP, PAST_EVENT, QUALITY_PER_STEP, SMALLEST_STEP, MarchOutcome,
                    Station, Stepper, flux_root)


class PoolMarcher(Stepper):
    """In-tube heating medium against a boiling pool (a kettle), pass after pass.

    The kettle's physics is the in-tube boiling path's inverted: the heating medium
    (``heating``, an ``exchangers.heating.InTubeHeating``) flows inside the tubes and
    the boiling fluid is a pool on the outside of the bundle; ``bands[k]`` is the
    pool around pass k (an ``exchangers.bundle_pool.PoolBand``). The state along the
    path is (the medium's specific enthalpy h, duty from z = 0). The local flux is
    the root of the series resistances (inside film, inside fouling, wall, outside
    fouling, bundle boiling film) by ``flux_root``, the boiling film taken from the
    local flux; the medium gives up exactly the heat the pool takes. Increments end
    exactly at the pass boundaries (where the band, hence the boiling temperature,
    changes: the profile has two stations at the same z there) and, for steam, just
    past where the last vapour condenses. A liquid medium's increments carry at most
    ``NTU_PER_STEP`` transfer units, condensing steam's change its quality by at most
    ``QUALITY_PER_STEP``.

    ``feed`` = (mass flow, inlet enthalpy, saturation set at the vapour space) gives
    the pool quality at each station. Resistances: ``R_wall`` on the outer area,
    ``fouling_inner`` on the inner, ``fouling_outer`` on the outer area [m^2K/W].

    Stations are ``Station`` with kettle meanings: ``P``, ``T_sat`` and ``T_process``
    the pool's local pressure and boiling temperature at the band; ``h`` the heating
    medium's enthalpy; ``q`` = ``q_outer`` the flux on the outer (boiling) surface;
    ``T_wall_inner`` / ``T_wall_outer`` the tube metal's inside / outside surface;
    ``x`` the pool's mixed outlet quality reached with the duty up to z (the vapour
    fraction of the kettle outlet if the bundle ended there); ``void_fraction`` NaN
    (the bundle void is not modelled); ``htc_boiling`` the bundle coefficient,
    ``htc_nucleate`` its nucleate part F_b F_m htc_nb, ``htc_convective`` its
    natural-convection part (they add up); ``htc_heating`` the inside film on the
    inside area; ``q_chf`` the bundle maximum flux and ``chf_ratio`` q over it;
    ``regime`` "pool boiling"; ``dpdz_friction`` the tube side's.
    """

    def __init__(self, heating, bands, *, D_o, D_i, R_wall, fouling_inner,
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

    def local(self, h, band, z, *, no_inside_film=False):
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
        z, state = 0.0, (h0, 0.0)
        self.z, self._h = z, h0
        total = self.passes * self.L
        try:
            # the medium cools from h0 towards the coldest pool, not below it
            self.heating.tabulate(min(b.T_sat for b in self.bands), h0)
            for k, band in enumerate(self.bands):
                self._band, self._k = band, k
                loc = self.local(state[0], band, z)
                self._add(stations, z, state[0], loc, state[1])
                z, state, _, _ = self.increments(z, (k + 1) * self.L, self.L / self.n_per_pass,
                                                 state, loc, stations, total)
        except PropertyError as exc:  # the pool's properties are all taken before the march
            return self._outcome(stations, h0, self._h, "failed", said(
                "the heating medium leaves its property range at z = {z:length:.4g}, cooled "
                "towards the pool at {T:temperature:.5g} (a medium that would freeze there "
                "cannot heat this pool): {why:text}", z=self.z,
                T=min(b.T_sat for b in self.bands), why=str(exc)))
        except (ValueError, ZeroDivisionError, OverflowError, RuntimeError) as exc:
            return self._outcome(stations, h0, self._h, "failed", said(
                "no solution at z = {z:length:.4g}: {why:text}", z=self.z, why=str(exc)))
        return self._outcome(stations, h0, state[0])

    def _add(self, stations, z, h, loc, duty):
        band = self._band
        stations.append(self._station(z, h, band, loc, duty))
        self.pass_of_station.append(self._k)
        band.note_ranges(loc[0], loc[3][0], z)

    def _outcome(self, stations, h0, h, status="ok", message=""):
        notes = dict(self.heating.range_notes)
        for band in self.bands:
            for msg, z in band.range_notes.items():
                notes.setdefault(msg, z)
        return MarchOutcome(stations, status, message, None, notes,
                            start_heating_state=h0, end_heating_state=h)

    # ---- the stepper's hooks (Stepper); state (h, duty), local the ``local`` tuple
    def stable_step(self, z, state, local, dz):
        """Increments of a liquid medium carry at most ``NTU_PER_STEP`` units;
        condensing steam changes its quality by at most ``QUALITY_PER_STEP``."""
        h = state[0]
        q, T_h = local[0], local[1]
        if q <= 0.0:
            return dz
        heating = self.heating
        ua_per_length = q * self.per_length / (T_h - self._band.T_sat)
        c = heating.capacity_rate(h)
        if math.isfinite(c):
            step = NTU_PER_STEP * c / ua_per_length
        else:
            # Length per unit of quality; near complete condensation the step ends at
            # most a condensate step past it, so that its midpoint is not deep in the
            # condensate (where the flux of the rest of the step would be lost).
            per_x = heating.mass_flow * heating.sat.h_lv / (q * self.per_length)
            condensate = NTU_PER_STEP * heating.mass_flow * heating.sat.cp_l / ua_per_length
            step = min(QUALITY_PER_STEP * per_x, heating.quality(h) * per_x + condensate)
        return min(dz, max(step, SMALLEST_STEP * dz))

    def step(self, z, dz, state, local):
        """One midpoint increment: the end enthalpy and the duty it carries [W]."""
        m = self.heating.mass_flow
        h = state[0]
        dQh = local[0] * self.per_length * 0.5 * dz
        locm = self.local(h - dQh / m, self._band, z + 0.5 * dz)
        dQ = locm[0] * self.per_length * dz
        return h - dQ / m, dQ

    def _condensed(self, h) -> float:
        """The event of complete condensation: >= 0 once the steam's quality is just
        below 0 (PAST_EVENT), so that the next station is condensate."""
        sat = self.heating.sat
        return -(h - sat.h_l) / sat.h_lv - PAST_EVENT

    def event(self, z, step, state, local, end):
        sat = self.heating.sat
        if sat is not None and state[0] >= sat.h_l:
            f = self._condensed(end[0])
            if f > 0.0:
                return "condensed", None, f
        return None, None, None

    def event_at_start(self, event, state, local):
        return self._condensed(state[0])

    def event_trial(self, event, z, length, state, trial):
        return self._condensed(trial[0]), None

    def arrive(self, z, state, end, end_local, event, stations):
        h, duty = end[0], state[1] + end[1]
        self._h = h
        loc = self.local(h, self._band, z)
        self._add(stations, z, h, loc, duty)
        return (h, duty), loc, False
