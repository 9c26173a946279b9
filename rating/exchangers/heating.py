"""Heating media on the shell side of a tube bundle, as the march sees them.

Condensing steam: saturated at its pressure, film condensation on the tube
outside (Nusselt 1916, mean over the tube height for vertical tubes; Nusselt's
horizontal-tube form with Kern's row correction for horizontal bundles); the
coefficient depends on the local flux and is inverted in closed form.

Single-phase liquid or gas: its specific enthalpy is the state; the shell-side
coefficient comes from Bell-Delaware (Kern as an option) at the local bulk
temperature; co- or counter-current with the boiling fluid.
"""
from __future__ import annotations

import bisect
import math

from ..correlations import registry
from ..errors import PropertyError
from ..correlations.shell_side import ShellGeometry
from ..march import HeatingSide


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

    def _htc(self, T):
        # Properties change slowly with T; a 0.1 K grid keeps the cost down.
        key = round(T, 1)
        htc = self._htc_cache.get(key)
        if htc is None:
            htc = self.shell_result(key).htc
            self._htc_cache[key] = htc
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
