"""The march against analytic solutions (layer 3 of the test plan).

Stand-ins for the property layer and the heating side give constant
coefficients, so the march must reproduce the textbook closed forms:
- single-phase liquid heated by a single-phase medium: the effectiveness-NTU
  relations for co- and counter-current flow (Incropera & DeWitt, Fundamentals
  of Heat and Mass Transfer, 6th ed., Table 11.3, eqs. 11.28a and 11.29a);
- a liquid heated by condensing steam at constant temperature: the log-mean
  temperature difference solution T_out = T_h - (T_h - T_in) exp(-UA/(m cp))
  (Incropera eq. 11.35, C_r = 0);
- steam against boiling at a constant coefficient and a constant saturation
  temperature: Q = U A (T_h - T_sat) exactly.
"""
import math
from dataclasses import dataclass

import pytest

from rating.correlations import registry
from rating.correlations.registry import Method
from rating.boiling_march import BoilingTube, Marcher
from rating.march import HeatingSide, solve_counter_current

CP = 4000.0      # J/kg/K, both stand-in liquids
H_LV = 2.0e6     # J/kg


@dataclass(frozen=True)
class _Sat:
    P: float
    T_sat: float
    h_l: float
    h_lv: float = H_LV
    rho_l: float = 950.0
    rho_v: float = 2.0
    h_v: float = 0.0
    mu_l: float = 3e-4
    mu_v: float = 1.2e-5
    k_l: float = 0.65
    k_v: float = 0.025
    cp_l: float = CP
    cp_v: float = 2000.0
    sigma: float = 0.05
    Pr_l: float = CP * 3e-4 / 0.65
    P_crit: float = 22e6
    M: float = 18.0
    dPdT_sat: float = 3000.0

    def as_dict(self):
        return {k: getattr(self, k) for k in self.__dataclass_fields__}

    def dp_sat(self, dT):
        return self.dPdT_sat * dT


@dataclass(frozen=True)
class _State:
    T: float
    rho: float = 950.0
    mu: float = 3e-4
    k: float = 0.65
    cp: float = CP


class ConstantFluid:
    """Boiling-side stand-in: h = cp T in the liquid, a fixed saturation temperature."""

    coolprop_name = "stand-in"

    def __init__(self, T_sat):
        self.T_sat_fixed = T_sat

    def saturation(self, P):
        return _Sat(P=P, T_sat=self.T_sat_fixed, h_l=CP * self.T_sat_fixed)

    def at_ph(self, P, h):
        return _State(T=h / CP)

    def temperature(self, P, h):
        return h / CP

    def enthalpy(self, P, T):
        return CP * T


class ConstantHeating(HeatingSide):
    """A heating medium with constant cp and film coefficient; state = enthalpy cp T.

    ``mass_flow = None`` makes it isothermal (condensing at ``T``)."""

    def __init__(self, htc, mass_flow=None, T=None, counter=False):
        self.htc, self.mass_flow, self.T, self.sign = htc, mass_flow, T, (-1.0 if counter else 1.0)

    def temperature(self, state):
        return self.T if self.mass_flow is None else state / CP

    def film(self, state, T_h, z):
        return lambda q_o: q_o / self.htc

    def film_htc(self, state, T_h, z, q_o):
        return self.htc

    def advance(self, state, duty):
        return state if self.mass_flow is None else state - self.sign * duty / self.mass_flow


D_O, D_I, K_W, L, N_TUBES = 0.025, 0.021, 50.0, 4.0, 10
M_TUBE = 0.05  # kg/s per tube


def _tube(fluid, **kw):
    base = dict(fluid=fluid, D_i=D_I, D_o=D_O, wall_conductivity=K_W, roughness=0.0,
                vertical=False, mass_flow_per_tube=M_TUBE, tubes_in_parallel=N_TUBES,
                fouling_inner=1e-4, fouling_outer=2e-4, flow_boiling="gungor_winterton_1986",
                nucleate_boiling="cooper_1984", two_phase_friction="friedel_1979",
                void_fraction="homogeneous", tube_dryout="groeneveld_2006",
                single_phase_tube="dittus_boelter_1930")
    base.update(kw)
    return BoilingTube(**base)


def _u_outer(htc_in, htc_out):
    """Overall coefficient on the outer area of the stand-in tube [W/m^2/K]."""
    r = (1.0 / htc_out + 2e-4 + D_O * math.log(D_O / D_I) / (2 * K_W)
         + 1e-4 * D_O / D_I + D_O / (D_I * htc_in))
    return 1.0 / r


def _liquid_htc():
    from rating.correlations.single_phase import htc_tube_single_phase
    G = M_TUBE / (math.pi * D_I**2 / 4)
    return htc_tube_single_phase(G, D_I, 3e-4, 0.65, CP, method="dittus_boelter_1930")


def test_single_phase_co_current_matches_effectiveness_ntu():
    fluid = ConstantFluid(T_sat=600.0)          # never boils
    T_c, T_h, m_h, htc_h = 300.0, 380.0, 0.8, 2500.0
    heating = ConstantHeating(htc_h, mass_flow=m_h)
    out = Marcher(_tube(fluid), heating, L, 40).run(2e5, CP * T_c, CP * T_h)
    assert out.status == "ok"
    UA = _u_outer(_liquid_htc(), htc_h) * N_TUBES * math.pi * D_O * L
    C_c, C_h = N_TUBES * M_TUBE * CP, m_h * CP
    C_min, C_max = min(C_c, C_h), max(C_c, C_h)
    ntu, cr = UA / C_min, C_min / C_max
    eps = (1 - math.exp(-ntu * (1 + cr))) / (1 + cr)   # Incropera eq. 11.28a
    q_expected = eps * C_min * (T_h - T_c)
    q_march = out.stations[-1].duty
    assert q_march == pytest.approx(q_expected, rel=5e-3)


def test_single_phase_counter_current_matches_effectiveness_ntu():
    fluid = ConstantFluid(T_sat=600.0)
    T_c, T_h_in, m_h, htc_h = 300.0, 380.0, 0.8, 2500.0
    heating = ConstantHeating(htc_h, mass_flow=m_h, counter=True)
    tube = _tube(fluid)

    def march(h_start):
        return Marcher(tube, heating, L, 40).run(2e5, CP * T_c, h_start)

    out = solve_counter_current(march, CP * T_c, CP * T_h_in)
    assert out.status == "ok"
    assert out.end_heating_state == pytest.approx(CP * T_h_in, abs=1e-3 * CP)
    UA = _u_outer(_liquid_htc(), htc_h) * N_TUBES * math.pi * D_O * L
    C_c, C_h = N_TUBES * M_TUBE * CP, m_h * CP
    C_min, C_max = min(C_c, C_h), max(C_c, C_h)
    ntu, cr = UA / C_min, C_min / C_max
    eps = (1 - math.exp(-ntu * (1 - cr))) / (1 - cr * math.exp(-ntu * (1 - cr)))  # eq. 11.29a
    assert out.stations[-1].duty == pytest.approx(eps * C_min * (T_h_in - T_c), rel=5e-3)


def test_liquid_heated_by_condensing_steam_matches_lmtd_solution():
    fluid = ConstantFluid(T_sat=600.0)
    T_in, T_steam, htc_steam = 300.0, 400.0, 8000.0
    heating = ConstantHeating(htc_steam, T=T_steam)
    out = Marcher(_tube(fluid), heating, L, 40).run(2e5, CP * T_in, None)
    UA = _u_outer(_liquid_htc(), htc_steam) * N_TUBES * math.pi * D_O * L
    C = N_TUBES * M_TUBE * CP
    T_out = T_steam - (T_steam - T_in) * math.exp(-UA / C)        # Incropera eq. 11.35
    assert out.stations[-1].T_process == pytest.approx(T_out, abs=0.005 * (T_out - T_in))
    lmtd = ((T_steam - T_in) - (T_steam - T_out)) / math.log((T_steam - T_in) / (T_steam - T_out))
    assert out.stations[-1].duty == pytest.approx(UA * lmtd, rel=5e-3)


def _constant_boiling(G, x, D, q):
    """Constant flow-boiling coefficient for the analytic test.

    Parameters
    ----------
    G : float
        Mass flux [kg/m^2/s]
    x : float
        Quality [-]
    D : float
        Diameter [m]
    q : float
        Heat flux [W/m^2]

    References
    ----------
    Test stand-in, no reference.
    """
    return 12000.0


def test_steam_against_constant_boiling_coefficient_matches_u_a_dt(monkeypatch):
    monkeypatch.setitem(registry.REGISTRY, "constant_boiling_test", Method(
        "constant_boiling_test", "flow_boiling", _constant_boiling, "constant", {}, ("stand-in",)))
    fluid = ConstantFluid(T_sat=370.0)
    T_steam, htc_steam = 400.0, 9000.0
    heating = ConstantHeating(htc_steam, T=T_steam)
    tube = _tube(fluid, flow_boiling="constant_boiling_test")
    h0 = CP * 370.0 + 0.05 * H_LV           # saturated, x = 0.05
    out = Marcher(tube, heating, L, 20).run(2e5, h0, None)
    assert out.status == "ok"
    A = N_TUBES * math.pi * D_O * L
    U = _u_outer(12000.0, htc_steam)
    assert out.stations[-1].duty == pytest.approx(U * A * (T_steam - 370.0), rel=1e-6)
    assert all(s.regime == "saturated boiling" for s in out.stations)
    assert out.stations[-1].x == pytest.approx(0.05 + U * A * 30.0 / (N_TUBES * M_TUBE * H_LV),
                                               rel=1e-6)


def test_cancel_stops_the_march():
    fluid = ConstantFluid(T_sat=600.0)
    heating = ConstantHeating(2500.0, T=380.0)
    calls = []

    def cancel():
        calls.append(1)
        return len(calls) > 3

    from rating.march import Cancelled
    with pytest.raises(Cancelled):
        Marcher(_tube(fluid), heating, L, 40, cancel=cancel).run(2e5, CP * 300.0, None)
    assert len(calls) == 4


def test_progress_reaches_one():
    fluid = ConstantFluid(T_sat=600.0)
    seen = []
    Marcher(_tube(fluid), ConstantHeating(2500.0, T=380.0), L, 10,
            progress=seen.append).run(2e5, CP * 300.0, None)
    assert len(seen) == 10 and seen[-1] == pytest.approx(1.0)
    assert all(b > a for a, b in zip(seen, seen[1:]))


def test_friction_and_gravity_of_a_liquid_column_match_darcy_weisbach():
    # Unheated liquid rising in a vertical tube (the heating medium at the liquid's own
    # temperature): the pressure falls by Darcy-Weisbach friction plus the static head,
    # dp = (f L / D) G^2 / (2 rho) + rho g L, with f the root of Colebrook's (1939)
    # equation solved here on its own (scipy brentq), g = 9.80665 m/s^2.
    from scipy.optimize import brentq

    roughness, T = 4.5e-5, 300.0
    fluid = ConstantFluid(T_sat=400.0)
    tube = _tube(fluid, vertical=True, roughness=roughness)
    out = Marcher(tube, ConstantHeating(1000.0, T=T), L, 40).run(5e5, CP * T, None)
    assert out.status == "ok" and out.stations[-1].q == 0.0
    G = M_TUBE / (math.pi * D_I**2 / 4)
    Re, rho = G * D_I / 3e-4, 950.0

    def colebrook(f):
        return 1 / math.sqrt(f) + 2 * math.log10(roughness / D_I / 3.7 + 2.51 / (Re * math.sqrt(f)))

    f = brentq(colebrook, 1e-4, 0.2, xtol=1e-14)
    expected = f * L / D_I * G * G / (2 * rho) + rho * 9.80665 * L
    drop = out.stations[0].P - out.stations[-1].P
    assert drop == pytest.approx(expected, rel=1e-6)
    # horizontal: the friction alone
    flat = Marcher(_tube(fluid, roughness=roughness), ConstantHeating(1000.0, T=T), L, 40).run(
        5e5, CP * T, None)
    assert flat.stations[0].P - flat.stations[-1].P == pytest.approx(
        f * L / D_I * G * G / (2 * rho), rel=1e-6)
