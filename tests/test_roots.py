"""The engine's own Brent root finder against scipy.optimize.brentq (independent implementation).

rating.roots.brentq follows scipy's algorithm step by step, so that the engine need
not import scipy.optimize; here both are run on the same functions, brackets and
tolerances and must visit the same points and return the same root.
"""
from __future__ import annotations

import math
import random

import pytest
from scipy.optimize import brentq as scipy_brentq

from rating.roots import brentq

FUNCTIONS = [
    lambda x: x**3 - 2.0 * x - 5.0,          # Newton's classic, root 2.0945514815
    lambda x: math.exp(x) - 3.0,
    lambda x: math.cos(x) - x,
    lambda x: (x - 0.3) ** 5,                  # a flat, multiple root
    lambda x: 1e5 * math.atan(x - 1.7),
]


@pytest.mark.parametrize("index", range(len(FUNCTIONS)))
def test_same_steps_and_root_as_scipy(index):
    f = FUNCTIONS[index]
    rng = random.Random(index)
    compared = 0
    for _ in range(60):
        a, b = rng.uniform(-3.0, 0.2), rng.uniform(1.0, 6.0)
        if (f(a) > 0.0) == (f(b) > 0.0):
            continue
        xtol, rtol = 10 ** rng.uniform(-14, -2), 10 ** rng.uniform(-15, -4)
        theirs, ours = [], []
        try:
            expected = scipy_brentq(lambda x: (theirs.append(x), f(x))[1], a, b, xtol=xtol,
                                    rtol=max(rtol, 1e-15))
        except RuntimeError:
            continue
        got = brentq(lambda x: (ours.append(x), f(x))[1], a, b, xtol=xtol, rtol=max(rtol, 1e-15))
        assert got == expected
        assert ours == theirs
        compared += 1
    assert compared > 10


def test_known_root():
    # x^3 - 2x - 5 = 0 has the real root 2.0945514815423265 (Newton's example)
    assert brentq(FUNCTIONS[0], 2.0, 3.0, xtol=1e-14) == pytest.approx(2.0945514815423265,
                                                                        abs=1e-13)


def test_errors_as_scipy():
    with pytest.raises(ValueError):
        brentq(lambda x: x * x + 1.0, -1.0, 1.0)       # no change of sign
    with pytest.raises(RuntimeError):
        brentq(lambda x: math.exp(x) - 3.0, 0.0, 5.0, xtol=1e-300, rtol=1e-15, maxiter=3)
