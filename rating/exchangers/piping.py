"""Pressure changes in the lines and singularities of a natural-circulation loop.

A line is a straight run of developed length L and inner diameter D with a sum of
loss coefficients K for its fittings, entrance and exit, and a vertical rise. Its
pressure change is friction + fittings + static head (positive = the pressure
falls along the flow). Velocity heads between two plenums cancel, so only the
irreversible parts appear here; the reversible acceleration into the tubes and
the recovery at their exit are the caller's (``rating.exchangers.thermosiphon``).

Single-phase friction is Darcy's with the Colebrook (1939) friction factor.
Two-phase lines are adiabatic at the quality they receive (no flashing along the
line): friction from the chosen two-phase method, the static head from the
chosen void fraction (vertical form), and the fittings on the homogeneous
velocity head K G^2 / (2 rho_h), the usual simple form for singularities
(Collier & Thome, Convective Boiling and Condensation, 3rd ed. 1994, ch. 2).
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from ..correlations.dimensionless import g, reynolds
from ..correlations.single_phase import colebrook_1939


@dataclass(frozen=True, slots=True)
class LineDrop:
    """Pressure change along a line [Pa], positive where the pressure falls."""

    friction: float = 0.0
    fittings: float = 0.0
    static: float = 0.0

    @property
    def total(self) -> float:
        return self.friction + self.fittings + self.static


def flow_area(D: float) -> float:
    """Flow area of a round line of inner diameter D [m^2]."""
    return math.pi * D * D / 4.0


def homogeneous_density(x: float, rho_l: float, rho_v: float) -> float:
    """Homogeneous (no-slip) density 1/rho_h = x/rho_v + (1-x)/rho_l [kg/m^3], x clipped to [0, 1]."""
    x = min(max(x, 0.0), 1.0)
    return 1.0 / (x / rho_v + (1.0 - x) / rho_l)


def velocity_head(G: float, rho: float) -> float:
    """Velocity head G^2 / (2 rho) [Pa] of mass flux G [kg/m^2/s]."""
    return G * G / (2.0 * rho)


def rho_v2(m_dot: float, D: float, rho: float) -> float:
    """Momentum flux rho v^2 = G^2 / rho [kg/m/s^2] of a flow m_dot [kg/s] in a nozzle D [m]."""
    G = m_dot / flow_area(D)
    return G * G / rho


def liquid_line(m_dot, D, L, K, rho, mu, roughness, *, rise=0.0) -> LineDrop:
    """A single-phase line: Darcy friction, fittings K on rho v^2/2, static rho g rise."""
    G = m_dot / flow_area(D)
    if G <= 0.0:
        return LineDrop(static=rho * g * rise)
    f = colebrook_1939(reynolds(G, D, mu), relative_roughness=roughness / D)
    head = velocity_head(G, rho)
    return LineDrop(friction=f * L / D * head, fittings=K * head, static=rho * g * rise)


def two_phase_line(m_dot, D, L, K, rise, x, sat, *, friction, void, roughness,
                   single=None) -> LineDrop:
    """A line carrying the tube-exit mixture at quality x (adiabatic, x held constant).

    ``sat`` is the saturation set at the line's pressure; ``friction`` and ``void``
    are registry methods; ``single`` the (rho, mu) of a subcooled or superheated
    flow (x outside [0, 1]), else the saturated phase is used.
    """
    G = m_dot / flow_area(D)
    if not 0.0 < x < 1.0:
        if single is not None:
            rho, mu = single
        else:
            rho, mu = (sat.rho_l, sat.mu_l) if x <= 0.0 else (sat.rho_v, sat.mu_v)
        return liquid_line(m_dot, D, L, K, rho, mu, roughness, rise=rise)
    if G <= 0.0:
        return LineDrop()
    avail = sat.as_dict()
    avail.update(G=G, x=x, D=D)
    opts = {"roughness": roughness} if "roughness" in friction.options else {}
    dpdz = friction(avail, **opts)
    void_opts = {}
    if "variant" in void.options:
        # Rouhani-Axelsson's vertical form "II" has C0 grow with (g D rho_l^2/G^2)^(1/4),
        # fitted in tubes; at the low mass flux of a large line it runs away. Form "I".
        void_opts["variant"] = "I"
    if "D" in void.options:
        void_opts["D"] = D
    alpha = min(max(void(avail, **void_opts), 0.0), 1.0)
    rho_m = alpha * sat.rho_v + (1.0 - alpha) * sat.rho_l
    head = velocity_head(G, homogeneous_density(x, sat.rho_l, sat.rho_v))
    return LineDrop(friction=dpdz * L, fittings=K * head, static=rho_m * g * rise)
