"""Colebrook's friction factor (Clamond's explicit solution) against fluids (independent library)."""
from __future__ import annotations

import fluids
import pytest

from rating.correlations.single_phase import colebrook_1939


@pytest.mark.parametrize("Re", [2300.0, 4e3, 1e4, 1e5, 1e6, 1e8])
@pytest.mark.parametrize("eD", [0.0, 1e-6, 1e-4, 2e-3, 0.05])
def test_against_fluids(Re, eD):
    # fluids.friction_factor(Method="Clamond") and the implicit Colebrook equation
    # solved by fluids.Colebrook (Lambert W); Clamond's solution is exact to ~1e-9
    assert colebrook_1939(Re, relative_roughness=eD) == pytest.approx(
        fluids.friction_factor(Re=Re, eD=eD, Method="Clamond"), rel=1e-14)
    assert colebrook_1939(Re, relative_roughness=eD) == pytest.approx(
        fluids.Colebrook(Re, eD), rel=1e-9)


def test_laminar():
    # Hagen-Poiseuille: f = 64/Re
    assert colebrook_1939(1000.0) == pytest.approx(0.064, rel=1e-15)

