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

import math

from ..correlations import registry
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
        # Nusselt: htc ~ dT^(-1/4), so q = C dT^(3/4) and dT = (q/C)^(4/3).
        self.C = htc_1K

    def temperature(self, state):
        return self.T

    def _dT(self, q_outer):
        return (max(q_outer, 0.0) / self.C) ** (4.0 / 3.0)

    def film(self, state, T_h, z):
        return self._dT

    def film_htc(self, state, T_h, z, q_outer):
        dT = self._dT(q_outer)
        return q_outer / dT if dT > 0.0 else self.C

    def advance(self, state, duty):
        return state


class LiquidHeating(HeatingSide):
    """A single-phase liquid or gas on the shell side, co- or counter-current."""

    def __init__(self, fluid, pressure, mass_flow, *, counter_current, shell_geometry,
                 method="bell_delaware"):
        self.fluid = fluid
        self.pressure = pressure
        self.mass_flow = mass_flow
        # Marching +z: co-current medium loses heat along +z, counter-current gains it.
        self.sign = -1.0 if counter_current else 1.0
        self.geometry = shell_geometry
        self.method = registry.get(method)
        self._T_cache: dict[float, float] = {}
        self._htc_cache: dict[float, float] = {}

    def temperature(self, h):
        T = self._T_cache.get(h)
        if T is None:
            T = self.fluid.temperature(self.pressure, h)
            if len(self._T_cache) > 4096:
                self._T_cache.clear()
            self._T_cache[h] = T
        return T

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
        return h - self.sign * duty / self.mass_flow

    def capacity_rate(self, h):
        return self.mass_flow * self.fluid.single_phase(self.pressure, self.temperature(h)).cp


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
