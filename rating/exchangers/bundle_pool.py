"""The boiling pool around one band of a kettle's tube bundle (``PoolBand``).

The shell side of a kettle at a station of the tube-side path is the pool around
the band of tubes the pass occupies, saturated at the vapour-space pressure plus the
liquid head over the band. It has no state of its own to march: the feed mixes into
a pool held at saturation (Sinnott, Coulson & Richardson Vol. 6: a subcooled feed
mixes rapidly into the boiling pool). The march (``rating.pool_march.PoolMarcher``) asks
it for the wall superheat that carries a flux and the coefficient's parts.
"""
from __future__ import annotations

from ..adjust import Adjustment
from ..correlations import registry
from ..roots import brentq

#: Temperature step of the finite difference for the liquid's expansion coefficient [K].
_BETA_STEP = 1.0


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
                try:
                    dT = brentq(resid, lo, hi, xtol=1e-12 * hi, rtol=1e-12)
                except ValueError:   # the ends agree to rounding: either is the root
                    dT = hi
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


def _expand(resid, hi):
    """An upper bracket where the increasing ``resid`` is positive (doubling from hi)."""
    for _ in range(80):
        if resid(hi) > 0.0:
            return hi
        hi *= 2.0
    raise ValueError("no bracket for the wall superheat")
