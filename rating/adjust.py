"""A known film coefficient, or a multiplier on the chosen method, for one side.

Engineers set a coefficient they trust (a vendor's or a test's steam-side value, a
boiling coefficient capped by company practice) or scale a method to match plant
data. Either replaces or scales the side's film coefficient in every regime, on the
surface that side wets; the method trail names it and the rating warns about it, so
that it is never forgotten in a file.
"""
from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Adjustment:
    """``fixed`` [W/m^2/K] replaces the side's coefficient; else ``factor`` scales it."""

    factor: float = 1.0
    fixed: float | None = None

    @property
    def active(self) -> bool:
        return self.fixed is not None or self.factor != 1.0

    def htc(self, htc: float) -> float:
        """The coefficient used in place of the method's ``htc``."""
        return self.fixed if self.fixed is not None else self.factor * htc

    def drop(self, drop: float, q: float) -> float:
        """Temperature drop across the film at flux ``q`` from the method's ``drop``."""
        return q / self.fixed if self.fixed is not None else drop / self.factor

    def film(self, film):
        """A film law q -> temperature drop, adjusted (the law itself when inactive)."""
        if not self.active:
            return film
        return lambda q: self.drop(film(q), q)

    def surface_law(self, T_s_of, films, T_b: float):
        """Adjust the march's surface law T_s(q) and its coefficients (total, nucleate,
        convective) at q; a fixed coefficient has no parts ("not computed")."""
        if not self.active:
            return T_s_of, films

        def T_s(q):
            return T_b + self.drop(T_s_of(q) - T_b, max(q, 0.0))

        def parts(q):
            htc, nucleate, convective = films(q)
            if self.fixed is not None:
                return self.fixed, None, None
            return self.factor * htc, self.factor * nucleate, self.factor * convective
        return T_s, parts

    def describe(self, side: str, method: str) -> str:
        """One line for the method trail and the warning."""
        if self.fixed is not None:
            return f"{side} coefficient fixed at {self.fixed:.6g} W/m^2/K in place of {method}"
        return f"{side} coefficient of {method} multiplied by {self.factor:g}"


def of_side(part) -> Adjustment:
    """The adjustment a ``BoilingStream`` or ``HeatingMedium`` asks for."""
    return Adjustment(part.htc_factor, part.htc_fixed)
