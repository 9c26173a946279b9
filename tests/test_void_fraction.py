"""Void fraction: rating.correlations.void_fraction.

Check values from the project's CHECK-VALUES.md section 5c and the independent
implementations of fluids 1.3.1 (fluids.homogeneous, Zivi, Chisholm_voidage,
Steiner, Rouhani_1, Rouhani_2), with their published docstring examples.
"""
import math
from itertools import pairwise

import fluids
import pytest

from property_sets import SETS, W1
from rating.correlations import registry
from rating.correlations.void_fraction import (
    chisholm_1972, homogeneous, rouhani_axelsson_1970, steiner_1993, zivi_1964,
)

G_BASE, D_BASE = 500.0, 0.020
M_BASE = G_BASE * math.pi * D_BASE**2 / 4.0
STATES = [(name, x) for name in ("W1", "P3", "R10") for x in (0.1, 0.5)]
STATE_IDS = [f"{n}-x{x}" for n, x in STATES]


def _ra(variant):
    def f(x, rho_l, rho_v, sigma, G):
        return rouhani_axelsson_1970(x, rho_l, rho_v, sigma, G, D=D_BASE, variant=variant)
    f.__name__ = f"rouhani_axelsson_1970[{variant}]"
    return f


# (ours, fluids, needs sigma and G, CHECK-VALUES 5c row: W1 .1, W1 .5, P3 .1, P3 .5, R10 .1, R10 .5)
MODELS = [
    (homogeneous, fluids.homogeneous, False,
     (0.994419, 0.999377, 0.883988, 0.985628, 0.873851, 0.984213)),
    (zivi_1964, fluids.Zivi, False,
     (0.938356, 0.992754, 0.650542, 0.943675, 0.635964, 0.940201)),
    (chisholm_1972, fluids.Chisholm_voidage, False,
     (0.933470, 0.982643, 0.732314, 0.920804, 0.721714, 0.917204)),
    (_ra("horizontal"), fluids.Steiner, True,
     (0.895891, 0.942612, 0.785066, 0.927885, 0.764425, 0.924666)),
    (_ra("I"), fluids.Rouhani_1, True,
     (0.841318, 0.908342, 0.737884, 0.894212, 0.719132, 0.891176)),
    (_ra("II"), fluids.Rouhani_2, True,
     (0.851518, 0.914883, 0.771359, 0.918275, 0.713129, 0.886614)),
    (steiner_1993, fluids.Steiner, True,
     (0.895891, 0.942612, 0.785066, 0.927885, 0.764425, 0.924666)),
]
MODEL_IDS = [m[0].__name__ for m in MODELS]


def _ours(model, needs_flow, s, x, G=G_BASE):
    if needs_flow:
        return model(x, s["rho_l"], s["rho_v"], s["sigma"], G)
    return model(x, s["rho_l"], s["rho_v"])


@pytest.mark.parametrize("model, theirs, needs_flow, table", MODELS, ids=MODEL_IDS)
@pytest.mark.parametrize("i", range(6), ids=STATE_IDS)
def test_table_5c_and_fluids(model, theirs, needs_flow, table, i):
    name, x = STATES[i]
    s = SETS[name]
    alpha = _ours(model, needs_flow, s, x)
    # CHECK-VALUES 5c (printed to 6 decimals)
    assert alpha == pytest.approx(table[i], abs=6e-7)
    # independent implementation: fluids, 1e-6 (CHECK-VALUES 5c found them equal to 1e-12)
    if needs_flow:
        ref = theirs(x, s["rho_l"], s["rho_v"], s["sigma"], M_BASE, D_BASE)
    else:
        ref = theirs(x, s["rho_l"], s["rho_v"])
    assert alpha == pytest.approx(ref, rel=1e-6)


def test_fluids_docstring_examples():
    # CHECK-VALUES 5c [found: fluids docstrings]: Steiner(0.4, 800., 2.5, sigma=0.02, m=1,
    # D=0.3) = 0.895950; Rouhani_1 = 0.858842; Rouhani_2 = 0.448197 (same arguments)
    G = 1.0 / (math.pi * 0.3**2 / 4.0)
    args = (0.4, 800.0, 2.5, 0.02, G)
    assert steiner_1993(*args) == pytest.approx(0.895950181381335, rel=1e-6)
    assert rouhani_axelsson_1970(*args) == pytest.approx(0.895950181381335, rel=1e-6)
    assert rouhani_axelsson_1970(*args, variant="I") == pytest.approx(0.8588420244136714, rel=1e-6)
    assert rouhani_axelsson_1970(*args, D=0.3, variant="II") == pytest.approx(
        0.44819733138968, rel=1e-6)


@pytest.mark.parametrize("model, theirs, needs_flow, table", MODELS, ids=MODEL_IDS)
def test_limits_bounds_and_monotonic(model, theirs, needs_flow, table):
    xs = [i / 200.0 for i in range(201)]
    for s in SETS.values():
        for G in (50.0, 500.0, 3000.0):
            alphas = [_ours(model, needs_flow, s, x, G) for x in xs]
            assert alphas[0] == 0.0 and alphas[-1] == 1.0
            assert all(0.0 <= a <= 1.0 for a in alphas)
            assert all(b > a for a, b in pairwise(alphas)), (model.__name__, s["P"], G)
            # single-phase outside the dome
            assert _ours(model, needs_flow, s, -0.1, G) == 0.0
            assert _ours(model, needs_flow, s, 1.1, G) == 1.0
            if not needs_flow:
                break


def test_slip_models_below_homogeneous():
    # slip (u_v > u_l) can only lower alpha below the no-slip value
    for s in SETS.values():
        for x in (0.01, 0.1, 0.5, 0.9):
            a_h = homogeneous(x, s["rho_l"], s["rho_v"])
            for model in (zivi_1964, chisholm_1972):
                assert model(x, s["rho_l"], s["rho_v"]) < a_h
            assert steiner_1993(x, s["rho_l"], s["rho_v"], s["sigma"], G_BASE) < a_h


def test_rouhani_axelsson_arguments():
    s = W1
    with pytest.raises(ValueError):
        rouhani_axelsson_1970(0.1, s["rho_l"], s["rho_v"], s["sigma"], G_BASE, variant="III")
    with pytest.raises(ValueError):
        rouhani_axelsson_1970(0.1, s["rho_l"], s["rho_v"], s["sigma"], G_BASE, variant="II")
    # no flow: the drift term v_gj / G dominates, alpha -> 0
    assert rouhani_axelsson_1970(0.1, s["rho_l"], s["rho_v"], s["sigma"], 0.0) == 0.0
    assert rouhani_axelsson_1970(0.1, s["rho_l"], s["rho_v"], s["sigma"], 1e-4) < 1e-3


def test_registered_and_dispatch():
    names = {m.name for m in registry.methods("void_fraction")}
    assert {"homogeneous", "zivi_1964", "chisholm_1972", "rouhani_axelsson_1970",
            "steiner_1993"} <= names
    m = registry.get("rouhani_axelsson_1970")
    state = dict(W1, G=G_BASE, D=D_BASE, x=0.1)
    # without options the default variant is Steiner's horizontal C0; options (D and
    # variant) are passed explicitly, never taken from the state
    assert m(state) == steiner_1993(0.1, W1["rho_l"], W1["rho_v"], W1["sigma"], G_BASE)
    assert m(state, D=D_BASE, variant="II") == pytest.approx(0.851518, abs=6e-7)  # CHECK-VALUES 5c
    assert m.out_of_range(dict(state, x=1.5))
