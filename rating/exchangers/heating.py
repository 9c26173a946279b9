"""Heating media as the march sees them from the tube wall.

On the shell side of a tube bundle (evaporator, thermosiphon):

Condensing steam: saturated at its pressure, film condensation on the tube
outside (Nusselt 1916, mean over the tube height for vertical tubes; Nusselt's
horizontal-tube form with Kern's row correction for horizontal bundles); the
coefficient depends on the local flux and is inverted in closed form.

Single-phase liquid or gas: its specific enthalpy is the state; the shell-side
coefficient comes from Bell-Delaware (Kern as an option) at the local bulk
temperature; co- or counter-current with the boiling fluid.

Inside the tubes, against a boiling pool (kettle: ``InTubeHeating``): steam
condensing (Shah 1979 or Chato 1962, whichever is larger), then its condensate, or a
liquid, pass after pass.
"""
from __future__ import annotations

import bisect
import math

from ..correlations import registry
from ..correlations.single_phase import htc_tube_single_phase
from ..errors import PropertyError
from ..correlations.shell_side import ShellGeometry
from ..march import PAST_EVENT, HeatingSide
from ..properties import SinglePhaseState


class SteamHeating(HeatingSide):
    """Saturated steam condensing on the outside of the tubes."""

    def __init__(self, water, pressure, *, vertical, tube_outer_diameter, tube_length,
                 tube_rows=1):
        self.sat = water.saturation(pressure)
        self.pressure = pressure
        self.T = self.sat.T_sat
        s = self.sat
        if vertical:
            method = registry.get("nusselt_vertical_1916")
            htc_1K = method.function(tube_length, 1.0, s.rho_l, s.rho_v, s.mu_l, s.k_l, s.h_lv)
        else:
            method = registry.get("nusselt_horizontal_tube")
            htc_1K = method.function(tube_outer_diameter, 1.0, s.rho_l, s.rho_v, s.mu_l, s.k_l,
                                     s.h_lv, rows=tube_rows)
        self.method = method
        self.length, self.rows = tube_length, tube_rows
        # Nusselt: htc ~ dT^(-1/4), so q = C dT^(3/4) and dT = (q/C)^(4/3).
        self.C = htc_1K
        self._profile = None
        self._profile_notes = []

    def use_condensate_profile(self, z, film_flow):
        """Use the local film coefficient for a known condensate film along the tube.

        ``film_flow[i]`` is the condensate flow per unit wetted perimeter at height
        ``z[i]`` [kg/m/s] (steam condenses downward from the top, so it grows toward
        z = 0). The coefficient then follows the local film Reynolds number with
        Nusselt's laminar, Kutateladze's wavy-laminar and Labuntsov's turbulent laws
        (``nusselt_kutateladze_labuntsov_local``) instead of Nusselt's mean value.
        """
        s = self.sat
        local = registry.get("nusselt_kutateladze_labuntsov_local")
        # Near the top edge the film is vanishingly thin; Re_f >= 1 keeps it finite.
        re_f = [max(4.0 * g / s.mu_l, 1.0) for g in film_flow]
        htc = [local.function(r, s.rho_l, s.rho_v, s.mu_l, s.k_l, s.cp_l) for r in re_f]
        self._profile = (list(z), htc)
        # where along the tube the film's Reynolds number leaves the method's range
        self._profile_notes = [(zi, m.split(" = ", 1)[0], m) for zi, r in zip(z, re_f)
                               for m in local.out_of_range({"Re_f": r})]

    def use_mean_coefficient(self):
        """Back to Nusselt's mean coefficient (no condensate profile known yet)."""
        self._profile = None

    def _local_htc(self, z):
        zs, htc = self._profile
        if z <= zs[0]:
            return htc[0]
        if z >= zs[-1]:
            return htc[-1]
        i = bisect.bisect_right(zs, z) - 1
        w = (z - zs[i]) / (zs[i + 1] - zs[i]) if zs[i + 1] > zs[i] else 0.0
        return htc[i] + w * (htc[i + 1] - htc[i])

    def temperature(self, state):
        return self.T

    def _dT(self, q_outer):
        return (max(q_outer, 0.0) / self.C) ** (4.0 / 3.0)

    def film(self, state, T_h, z):
        if self._profile is not None:
            htc = self._local_htc(z)
            return lambda q_outer: q_outer / htc
        return self._dT

    def film_htc(self, state, T_h, z, q_outer):
        if self._profile is not None:
            return self._local_htc(z)
        dT = self._dT(q_outer)
        return q_outer / dT if dT > 0.0 else self.C

    def advance(self, state, duty):
        return state

    def out_of_range(self, state, T_h, z, q_outer):
        s = self.sat
        if self._profile is not None:
            return [(bound, msg) for zi, bound, msg in self._profile_notes if zi <= z]
        dT = self._dT(q_outer)
        if dT <= 0.0:
            return []
        avail = dict(s.as_dict(), dT=dT, L=self.length, rows=self.rows)
        return [(m.split(" = ", 1)[0], m) for m in self.method.out_of_range(avail)]


class EnthalpyTable:
    """T(h) of a single-phase medium at one pressure, from nodes every ``STEP`` kelvin.

    A (P, h) flash is several times dearer than a (P, T) one, and a march asks for
    the medium's temperature at every trial state; cubic Hermite interpolation of
    T(h) with the slope 1/cp at each node is within 2e-8 K of CoolProp's inversion
    for water, 3e-5 K for MEG-30 % and 2e-4 K for TVP1 (incompressible liquids,
    whose h also carries P/rho, so that 1/cp is not quite dT/dh) at this node
    spacing (tests/test_property_tables.py); the energy balance itself is kept in
    enthalpy, exactly. ``build`` returns None where the range leaves the
    fluid's data; ``temperature`` and ``cp`` return None outside the table.
    """

    #: Node spacing [K].
    STEP = 2.0

    def __init__(self, hs, Ts, cps):
        self.hs, self.Ts, self.cps = hs, Ts, cps
        self.h_min, self.h_max = hs[0], hs[-1]

    @classmethod
    def build(cls, fluid, pressure, T_lo, T_hi):
        n = max(2, int(math.ceil((T_hi - T_lo) / cls.STEP)) + 1)
        Ts = [T_lo + (T_hi - T_lo) * i / (n - 1) for i in range(n)]
        try:
            states = [fluid.single_phase(pressure, T) for T in Ts]
        except PropertyError:
            return None  # the range leaves the fluid's data: use the flash throughout
        hs = [st.h for st in states]
        if any(b <= a for a, b in zip(hs, hs[1:])):
            return None
        return cls(hs, Ts, [st.cp for st in states])

    def temperature(self, h):
        hs = self.hs
        if not self.h_min <= h <= self.h_max:
            return None
        Ts, cps = self.Ts, self.cps
        i = min(bisect.bisect_right(hs, h), len(hs) - 1) - 1
        dh = hs[i + 1] - hs[i]
        u = (h - hs[i]) / dh
        h00 = (1 + 2 * u) * (1 - u) ** 2
        h10 = u * (1 - u) ** 2
        h01 = u * u * (3 - 2 * u)
        h11 = u * u * (u - 1)
        return h00 * Ts[i] + h10 * dh / cps[i] + h01 * Ts[i + 1] + h11 * dh / cps[i + 1]

    def cp(self, h):
        """The specific heat at the node at or below h (a step function) [J/kg/K]."""
        hs = self.hs
        if not self.h_min <= h <= self.h_max:
            return None
        return self.cps[min(bisect.bisect_right(hs, h), len(hs) - 1) - 1]


class LiquidHeating(HeatingSide):
    """A single-phase liquid or gas on the shell side, co- or counter-current."""

    #: Share of the duty the medium gives up that is lost to ambient (heat loss).
    loss_share = 0.0

    def __init__(self, fluid, pressure, mass_flow, *, counter_current, shell_geometry,
                 method="bell_delaware", temperature_range=None):
        self.fluid = fluid
        self.pressure = pressure
        self.mass_flow = mass_flow
        # Marching +z: co-current medium loses heat along +z, counter-current gains it.
        self.sign = -1.0 if counter_current else 1.0
        self.geometry = shell_geometry
        self.method = registry.get(method)
        self._htc_cache: dict[float, float] = {}
        self._range_checked: set[float] = set()
        self._table = (EnthalpyTable.build(fluid, pressure, *temperature_range)
                       if temperature_range else None)

    def temperature(self, h):
        T = self._table.temperature(h) if self._table is not None else None
        return self.fluid.temperature(self.pressure, h) if T is None else T

    def shell_result(self, T):
        s = self.fluid.single_phase(self.pressure, T)
        return self.method.function(self.mass_flow, s.rho, s.mu, s.cp, s.k, self.geometry)

    #: Nodes of the shell-side coefficient [K], interpolated linearly between them: the
    #: properties change slowly with T (the interpolation's error is within 1e-4 of the
    #: coefficient on the samples, tests/test_heating.py).
    HTC_GRID = 1.0

    def _htc(self, T):
        u = T / self.HTC_GRID
        k = math.floor(u)
        try:
            a, b = self._htc_node(k), self._htc_node(k + 1)
        except PropertyError:   # a node outside the medium's data: the coefficient at T
            return self.shell_result(T).htc
        return a + (b - a) * (u - k)

    def _htc_node(self, k):
        htc = self._htc_cache.get(k)
        if htc is None:
            htc = self._htc_cache[k] = self.shell_result(k * self.HTC_GRID).htc
        return htc

    def film(self, state, T_h, z):
        htc = self._htc(T_h)
        return lambda q_outer: q_outer / htc

    def film_htc(self, state, T_h, z, q_outer):
        return self._htc(T_h)

    def advance(self, h, duty):
        # the process receives ``duty``; the medium gives up duty / (1 - loss share)
        return h - self.sign * duty / (self.mass_flow * (1.0 - self.loss_share))

    def out_of_range(self, state, T_h, z, q_outer):
        key = round(T_h, 0)   # the Reynolds number changes with T slowly; check per kelvin
        if key in self._range_checked:
            return []
        self._range_checked.add(key)
        p = self.fluid.single_phase(self.pressure, T_h)
        avail = {"m_dot": self.mass_flow, "mu": p.mu, "shell": self.geometry}
        return [(m.split(" = ", 1)[0], m) for m in self.method.out_of_range(avail)]

    def capacity_rate(self, h):
        cp = self._table.cp(h) if self._table is not None else None
        if cp is None:
            cp = self.fluid.single_phase(self.pressure, self.temperature(h)).cp
        return self.mass_flow * cp


def shell_geometry(case) -> ShellGeometry:
    """The shell-side geometry of a case for the Bell-Delaware or Kern method."""
    t, s = case.tubes, case.shell
    pitch = t.pitch if t.pitch is not None else 1.25 * t.outer_diameter
    return ShellGeometry(
        shell_inner_diameter=s.inner_diameter, tube_outer_diameter=t.outer_diameter,
        tube_pitch=pitch, layout_angle_deg=t.layout_angle, tube_count=t.count,
        tube_passes=t.passes, tube_length=t.length, baffle_spacing=s.baffle_spacing,
        baffle_cut=s.baffle_cut, sealing_strip_pairs=s.sealing_strip_pairs,
    )


def tube_rows(case) -> int:
    """Tube rows in a vertical plane of a horizontal bundle (for Kern's row correction)."""
    return max(1, int(round(math.sqrt(case.tubes.count))))


#: Largest quality the in-tube condensation coefficient is evaluated at: Shah's form
#: falls to 0 at x = 1 (no condensate film), the limit of a film of zero thickness.
_X_MAX_CONDENSING = 0.9999
#: Chato's (1962) constant for stratified condensation inside a horizontal tube [memory].
CHATO_C = 0.555
#: Condensate within this of its saturation temperature takes the saturated liquid's
#: properties [K].
_NEAR_SATURATION = 0.5


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
        if x is not None and x > PAST_EVENT:
            return math.inf
        return self.mass_flow * self._single(self.temperature(h)).cp
