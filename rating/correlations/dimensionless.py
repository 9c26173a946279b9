"""Dimensionless groups shared by the correlations. SI in, pure functions."""
from __future__ import annotations

import math

#: Standard acceleration of gravity [m/s^2] (the value ht and fluids use).
g = 9.80665


def reynolds(G, D, mu):
    """Reynolds number G D / mu from mass flux [kg/m^2/s], diameter [m], viscosity [Pa*s]."""
    return G * D / mu


def prandtl(cp, mu, k):
    """Prandtl number cp mu / k from [J/kg/K], [Pa*s], [W/m/K]."""
    return cp * mu / k


def boiling_number(q, G, h_lv):
    """Boiling number Bo = q / (G h_lv) from [W/m^2], [kg/m^2/s], [J/kg]."""
    return q / (G * h_lv)


def martinelli_xtt(x, rho_l, rho_v, mu_l, mu_v):
    """Turbulent-turbulent Martinelli parameter X_tt (Lockhart & Martinelli 1949)."""
    return ((1.0 - x) / x) ** 0.9 * (rho_v / rho_l) ** 0.5 * (mu_l / mu_v) ** 0.1


def convection_number(x, rho_l, rho_v):
    """Convection number Co = ((1-x)/x)^0.8 (rho_v/rho_l)^0.5 (Shah 1982)."""
    return ((1.0 - x) / x) ** 0.8 * (rho_v / rho_l) ** 0.5


def froude_liquid_only(G, rho_l, D):
    """Liquid-only Froude number G^2 / (rho_l^2 g D)."""
    return G * G / (rho_l * rho_l * g * D)


def laplace_length(sigma, rho_l, rho_v):
    """Capillary (Laplace) length sqrt(sigma / (g (rho_l - rho_v))) [m]."""
    return math.sqrt(sigma / (g * (rho_l - rho_v)))
