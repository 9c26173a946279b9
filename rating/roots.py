"""Scalar root finders of the engine, in pure Python.

``brentq`` is Brent's (1973) bracketed method as scipy.optimize.brentq implements
it (the same steps, tolerances and errors), here so that a rating does not import
scipy.optimize, which costs about a second in a fresh process (issue 10). It is
checked against scipy's in tests/test_roots.py.

Reference: Brent, R.P. (1973) Algorithms for Minimization without Derivatives,
Prentice-Hall, ch. 4.
"""
from __future__ import annotations

import math

_EPS = 2.220446049250313e-16


def brentq(f, a, b, xtol=2e-12, rtol=4 * _EPS, maxiter=100):
    """A root of f in [a, b], where f(a) and f(b) differ in sign (Brent's method).

    Converged when the bracket is narrower than xtol + rtol |x| (as scipy's).

    Parameters
    ----------
    f : callable
        Continuous function of one float [-]
    a, b : float
        Ends of the bracket [-]
    xtol, rtol : float
        Absolute and relative tolerance on the root [-]
    maxiter : int
        Largest number of iterations [-]

    Returns
    -------
    x : float
        The root [-]

    Raises
    ------
    ValueError
        f(a) and f(b) have the same sign, or a tolerance is not positive.
    RuntimeError
        Not converged within maxiter iterations.
    """
    if xtol <= 0.0:
        raise ValueError(f"xtol too small ({xtol:g} <= 0)")
    if rtol < 4 * _EPS:
        raise ValueError(f"rtol too small ({rtol:g} < {4 * _EPS:g})")
    xpre, xcur = float(a), float(b)
    fpre, fcur = f(xpre), f(xcur)
    if fpre == 0.0:
        return xpre
    if fcur == 0.0:
        return xcur
    if math.copysign(1.0, fpre) == math.copysign(1.0, fcur):
        raise ValueError("f(a) and f(b) must have different signs")
    xblk = fblk = spre = scur = 0.0
    for _ in range(maxiter):
        if fpre != 0.0 and fcur != 0.0 and \
                math.copysign(1.0, fpre) != math.copysign(1.0, fcur):
            xblk, fblk = xpre, fpre
            spre = scur = xcur - xpre
        if abs(fblk) < abs(fcur):
            xpre, xcur, xblk = xcur, xblk, xcur
            fpre, fcur, fblk = fcur, fblk, fcur
        delta = 0.5 * (xtol + rtol * abs(xcur))
        sbis = 0.5 * (xblk - xcur)
        if fcur == 0.0 or abs(sbis) < delta:
            return xcur
        if abs(spre) > delta and abs(fcur) < abs(fpre):
            if xpre == xblk:  # interpolate
                stry = -fcur * (xcur - xpre) / (fcur - fpre)
            else:  # extrapolate (inverse quadratic)
                dpre = (fpre - fcur) / (xpre - xcur)
                dblk = (fblk - fcur) / (xblk - xcur)
                stry = -fcur * (fblk * dblk - fpre * dpre) / (dblk * dpre * (fblk - fpre))
            if 2.0 * abs(stry) < min(abs(spre), 3.0 * abs(sbis) - delta):
                spre, scur = scur, stry       # a good short step
            else:
                spre = scur = sbis            # bisect
        else:
            spre = scur = sbis                # bisect
        xpre, fpre = xcur, fcur
        xcur += scur if abs(scur) > delta else (delta if sbis > 0.0 else -delta)
        fcur = f(xcur)
    raise RuntimeError(f"brentq: no convergence after {maxiter} iterations, x = {xcur!r}")
