"""A plain reference march: the speed baseline for Ebullio's own (not used by the engine).

The first case of samples/pentane-vaporiser.ebullio (n-pentane entering at 335 K
and 3 bar, vertical up-flow in 3 m tubes, 2 bar(a) steam condensing on the shell)
marched the obvious way, with no caching and no tables:

* every property is a ``CoolProp.CoolProp.PropsSI`` call, one per property and state
  (the saturated liquid and vapour at the local pressure; T, rho, mu, k, cp at
  (P, h) outside the dome); the steam's saturation set is taken once;
* correlations come from the libraries where they have them: ``ht.Cooper``,
  ``ht.turbulent_Gnielinski`` (Petukhov's friction factor, as Ebullio),
  ``ht.Nusselt_laminar`` (steam film, Nusselt's mean), ``fluids.Friedel``,
  ``fluids.Rouhani_2`` (Rouhani-Axelsson, vertical form), ``fluids.friction_factor``
  (Colebrook). Ht and fluids have no Gungor-Winterton (1986), Katto-Ohno at local
  quality, Liu-Winterton subcooled or Dougall-Rohsenow form, so those are Ebullio's
  own pure functions, called directly (they make no property calls);
* the local heat flux, and with it the wall temperature, is ``scipy.optimize.brentq``
  on the series-resistance balance over the full bracket at every station;
* ``n`` equal increments by the midpoint rule (two local solves per increment, as
  Ebullio's march); the regime is taken at each station, events are not located.

It does less than Ebullio's march (one pass with Nusselt's mean film where Ebullio
marches a second time with the local condensate-film law; no event location, no
range notes, no flow pattern), so a speed ratio measured against it is on the safe
side. ``reference_rating(n)`` returns the duty, the exit quality, the dryout position
and the number of PropsSI calls.

    python benchmarks/reference_march.py [--increments N]
"""
from __future__ import annotations

import argparse
import math
import sys
import time
from pathlib import Path

import fluids
import ht
from CoolProp.CoolProp import PropsSI
from scipy.optimize import brentq

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from rating.correlations.dryout import katto_ohno_local  # noqa: E402
from rating.correlations.flow_boiling import gungor_winterton_1986  # noqa: E402
from rating.correlations.post_dryout import (dougall_rohsenow_1963,  # noqa: E402
                                             liu_winterton_1991_subcooled)

FLUID, STEAM = "n-Pentane", "Water"
G_ACC = 9.80665
CALLS = [0]


def props(out, *args):
    """One PropsSI call (counted)."""
    CALLS[0] += 1
    return PropsSI(out, *args)


def saturation(fluid, P):
    """Saturated liquid and vapour properties at P, one PropsSI call each."""
    s = {q: {k: props(k, "P", P, "Q", q, fluid) for k in ("T", "D", "H", "V", "L", "C")}
         for q in (0, 1)}
    return {"T_sat": s[0]["T"], "rho_l": s[0]["D"], "rho_v": s[1]["D"], "h_l": s[0]["H"],
            "h_v": s[1]["H"], "mu_l": s[0]["V"], "mu_v": s[1]["V"], "k_l": s[0]["L"],
            "k_v": s[1]["L"], "cp_l": s[0]["C"], "cp_v": s[1]["C"],
            "sigma": props("I", "P", P, "Q", 0, fluid)}


def single_phase(fluid, P, h):
    return {k: props(k, "P", P, "H", h, fluid) for k in ("T", "D", "V", "L", "C")}


def gnielinski(G, D, mu, k, cp):
    Re = G * D / mu
    f_D = (0.790 * math.log(Re) - 1.64) ** -2
    return ht.turbulent_Gnielinski(Re, cp * mu / k, f_D) * k / D


class Case:
    """The reference case's inputs, read from the sample file."""

    def __init__(self):
        import rating
        case = rating.load_project(ROOT / "samples" / "pentane-vaporiser.ebullio").cases[0]
        t, b, hm = case.tubes, case.boiling, case.heating
        self.D_i, self.D_o, self.L = t.inner_diameter, t.outer_diameter, t.length
        self.N = t.tubes_per_pass
        self.m = b.mass_flow / self.N
        self.G = self.m / (math.pi * self.D_i ** 2 / 4.0)
        self.roughness = t.roughness
        self.R_fixed = (b.fouling_resistance
                        + self.D_i * math.log(self.D_o / self.D_i) / (2.0 * t.conductivity)
                        + self.D_i / self.D_o * hm.fouling_resistance)
        self.P0 = b.inlet_pressure
        self.h0 = props("H", "P", b.inlet_pressure, "T", b.inlet_temperature, FLUID)
        self.P_crit = props("Pcrit", FLUID)
        self.M = props("M", FLUID) * 1e3
        self.steam = saturation(STEAM, hm.pressure)


def local(c, P, h, dried_out):
    """(q, regime, x, q_chf, sat) at (P, h): brentq on the series-resistance balance."""
    sat = saturation(FLUID, P)
    x = (h - sat["h_l"]) / (sat["h_v"] - sat["h_l"])
    st = c.steam
    T_h = st["T_sat"]

    def film_drop(q_outer):  # Nusselt's mean film, solved for its own temperature drop
        if q_outer <= 0.0:
            return 0.0
        return brentq(lambda dT: ht.Nusselt_laminar(T_h, T_h - dT, st["rho_v"], st["rho_l"],
                                                    st["k_l"], st["mu_l"], st["h_v"] - st["h_l"],
                                                    c.L) * dT - q_outer, 1e-9, 200.0)

    if 0.0 <= x < 1.0 and not dried_out:
        regime = "saturated boiling"
        kw = dict(G=c.G, x=min(max(x, 1e-4), 0.9999), D=c.D_i, rho_l=sat["rho_l"],
                  rho_v=sat["rho_v"], mu_l=sat["mu_l"], mu_v=sat["mu_v"], k_l=sat["k_l"],
                  cp_l=sat["cp_l"], h_lv=sat["h_v"] - sat["h_l"], P=P, P_crit=c.P_crit, M=c.M)

        def T_s(q):
            return sat["T_sat"] + q / gungor_winterton_1986(q=q, **kw)
        T_b = sat["T_sat"]
    elif x < 0.0:
        regime = "subcooled"
        sp = single_phase(FLUID, P, h)
        T_b = sp["T"]
        htc_l = gnielinski(c.G, c.D_i, sp["V"], sp["L"], sp["C"])

        def T_s(q):
            if q <= 0.0:
                return T_b
            pool = ht.Cooper(P, c.P_crit, c.M, q=q)
            return liu_winterton_1991_subcooled(q, T_b, sat["T_sat"], htc_l, pool, c.G, c.D_i,
                                                sp["V"])
    elif x < 1.0:
        regime = "post-dryout"
        T_b = sat["T_sat"]
        htc = dougall_rohsenow_1963(c.G, x, c.D_i, sat["rho_l"], sat["rho_v"], sat["mu_v"],
                                    sat["k_v"], sat["cp_v"])

        def T_s(q):
            return T_b + q / htc
    else:
        regime = "superheated vapour"
        sp = single_phase(FLUID, P, h)
        T_b = sp["T"]
        htc = gnielinski(c.G, c.D_i, sp["V"], sp["L"], sp["C"])

        def T_s(q):
            return T_b + q / htc

    def resid(q):
        return T_h - T_s(q) - q * c.R_fixed - film_drop(q * c.D_i / c.D_o)

    q = brentq(resid, 0.0, (T_h - T_b) / c.R_fixed, xtol=1e-3, rtol=1e-9) if T_h > T_b else 0.0
    q_chf = katto_ohno_local(c.G, min(max(x, 1e-4), 0.9999), c.D_i, sat["rho_l"], sat["rho_v"],
                             sat["sigma"], sat["h_v"] - sat["h_l"])
    return q, regime, x, q_chf, sat


def gradient(c, P, h, x, sat):
    """Friction and gravity [Pa/m], and the momentum flux [Pa]."""
    G, D = c.G, c.D_i
    if 0.0 < x < 1.0:
        dpf = fluids.Friedel(m=c.m, x=x, rhol=sat["rho_l"], rhog=sat["rho_v"], mul=sat["mu_l"],
                             mug=sat["mu_v"], sigma=sat["sigma"], D=D, roughness=c.roughness,
                             L=1.0)
        alpha = fluids.Rouhani_2(x=x, rhol=sat["rho_l"], rhog=sat["rho_v"], sigma=sat["sigma"],
                                 m=c.m, D=D)
        rho_m = alpha * sat["rho_v"] + (1.0 - alpha) * sat["rho_l"]
        mom = G * G * (x * x / (sat["rho_v"] * alpha) + (1 - x) ** 2 / (sat["rho_l"] * (1 - alpha)))
        return dpf, rho_m * G_ACC, mom
    sp = single_phase(FLUID, P, h)
    f = fluids.friction_factor(Re=G * D / sp["V"], eD=c.roughness / D)
    return f * G * G / (2.0 * D * sp["D"]), sp["D"] * G_ACC, G * G / sp["D"]


def reference_rating(n=100):
    """March the reference case in n increments; returns a dict of answers and counts."""
    CALLS[0] = 0
    c = Case()
    per_len = math.pi * c.D_i
    dz = c.L / n
    P, h, z, duty = c.P0, c.h0, 0.0, 0.0
    dried_out, dryout_z = False, None
    q, regime, x, q_chf, sat = local(c, P, h, dried_out)
    calls_setup = CALLS[0]
    for _ in range(n):
        dpf, dpg, mom0 = gradient(c, P, h, x, sat)
        hm = h + q * per_len * 0.5 * dz / c.m
        Pm = P - (dpf + dpg) * 0.5 * dz
        qm, _, xm, _, satm = local(c, Pm, hm, dried_out)
        dpfm, dpgm, _ = gradient(c, Pm, hm, xm, satm)
        dQ = qm * per_len * dz
        h1 = h + dQ / c.m
        P1 = P - (dpfm + dpgm) * dz
        sat1 = saturation(FLUID, P1)
        x1 = (h1 - sat1["h_l"]) / (sat1["h_v"] - sat1["h_l"])
        P1 -= gradient(c, P1, h1, x1, sat1)[2] - mom0
        P, h, z, duty = P1, h1, z + dz, duty + dQ * c.N
        q, regime, x, q_chf, sat = local(c, P, h, dried_out)
        if not dried_out and 0.0 <= x < 1.0 and q >= q_chf:
            dried_out, dryout_z = True, z
            q, regime, x, q_chf, sat = local(c, P, h, dried_out)
    return {"duty_W": duty, "exit_quality": x, "dryout_z_m": dryout_z,
            "property_calls": CALLS[0], "property_calls_per_increment": (CALLS[0] - calls_setup) / n}


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--increments", type=int, default=100)
    args = p.parse_args(argv)
    t0 = time.perf_counter()
    out = reference_rating(args.increments)
    dt = time.perf_counter() - t0
    print(f"reference march, {args.increments} increments: {1e3 * dt:.0f} ms")
    for k, v in out.items():
        print(f"  {k:32s} {v}")


if __name__ == "__main__":
    main()
