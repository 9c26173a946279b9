"""The nucleate and convective parts of every flow-boiling method (issue 8).

Each method's parts (``flow_boiling.station_parts``) must be the terms its
coefficient is made of, after suppression and enhancement, so that a profile of the
three is honest. For each method the parts are checked against the published form
written out here from the paper (not through the module's helpers), with the pool and
liquid terms from an independent library (ht: ``Cooper``, ``Forster_Zuber``,
``turbulent_Dittus_Boelter``, ``turbulent_Gnielinski``), and they must recombine into
the coefficient by the method's own rule: a sum for Chen (1966), Gungor-Winterton
(1986, 1987) and Kandlikar (1990, the set that governs), the n = 2 asymptotic sum for
Liu-Winterton (1991) and n = 3 for Steiner-Taborek (1992). Property sets: CHECK-VALUES
section 0 (tests/property_sets.py).
"""
from __future__ import annotations

import math
from pathlib import Path

import ht
import pytest

from property_sets import BASE, SETS
from rating.correlations import flow_boiling as fb
from rating.correlations.registry import get, methods

F_FL = {"W1": 1.0, "P3": 1.0, "R10": 1.63}
ST_REF = {"W1": (25580.0, 150e3), "P3": (3400.0, 20e3), "R10": (3500.0, 20e3)}
# Chen's (dT_sat [K], dp_sat [Pa]) at the base case, CHECK-VALUES section 4a
CHEN_4A = {"W1": (1.85849, 6908.61), "P3": (11.1326, 99288.7), "R10": (11.7322, 188342.0)}
FLUIDS = ("W1", "P3", "R10")


def _state(fluid, **over):
    h_nb_ref, q_ref = ST_REF[fluid]
    a = {**SETS[fluid], **BASE, "fluid_surface_factor": F_FL[fluid], "h_nb_ref": h_nb_ref,
         "q_ref": q_ref}
    a.update(over)
    return a


def _parts(name, a):
    m = get(name)
    opts = {k: a[k] for k in m.options if k in a}
    if "q" in m.inputs:
        return fb.station_parts(name, a, **opts)(a["q"])
    return m.station(**{n: a[n] for n in m.inputs if n not in ("dT_sat", "dp_sat")},
                     **opts)(a["dT_sat"], a["dp_sat"])


def _xtt(a):
    # Lockhart-Martinelli turbulent-turbulent parameter
    x = a["x"]
    return ((1 - x) / x) ** 0.9 * (a["rho_v"] / a["rho_l"]) ** 0.5 * (a["mu_l"] / a["mu_v"]) ** 0.1


def _h_liquid(a, G):
    # Dittus-Boelter (heating) from ht, for the mass flux G
    Re = G * a["D"] / a["mu_l"]
    Pr = a["cp_l"] * a["mu_l"] / a["k_l"]
    return ht.turbulent_Dittus_Boelter(Re, Pr, heating=True) * a["k_l"] / a["D"]


def _cooper(a):
    # Cooper (1984) at the wall flux, Rp = 1 um, from ht
    return ht.Cooper(P=a["P"], Pc=a["P_crit"], MW=a["M"], q=a["q"], Rp=1e-6)


@pytest.mark.parametrize("fluid", FLUIDS)
def test_chen_parts_are_S_htc_fz_and_F_htc_l(fluid):
    # Chen (1966) with the Collier & Thome (1994) fits of F and S
    dT, dp = CHEN_4A[fluid]
    a = _state(fluid, dT_sat=dT, dp_sat=dp)
    Re_l = a["G"] * (1 - a["x"]) * a["D"] / a["mu_l"]
    inv = 1.0 / _xtt(a)
    F = 2.35 * (inv + 0.213) ** 0.736 if inv > 0.1 else 1.0
    S = 1.0 / (1.0 + 2.53e-6 * (Re_l * F**1.25) ** 1.17)
    h_fz = ht.Forster_Zuber(rhol=a["rho_l"], rhog=a["rho_v"], mul=a["mu_l"], kl=a["k_l"],
                            Cpl=a["cp_l"], Hvap=a["h_lv"], sigma=a["sigma"], dPsat=dp, Te=dT)
    p = _parts("chen_1966", a)
    assert p.nucleate == pytest.approx(S * h_fz, rel=1e-6)
    assert p.convective == pytest.approx(F * _h_liquid(a, a["G"] * (1 - a["x"])), rel=1e-6)
    assert p.htc == pytest.approx(p.nucleate + p.convective, rel=1e-12)
    assert p.htc == pytest.approx(fb.chen_1966(**{n: a[n] for n in get("chen_1966").inputs}),
                                  rel=1e-12)


@pytest.mark.parametrize("fluid", FLUIDS)
@pytest.mark.parametrize("horizontal", [False, True])
def test_gungor_winterton_1986_parts_are_S_htc_pool_and_E_htc_l(fluid, horizontal):
    # Gungor & Winterton (1986): E = 1 + 24000 Bo^1.16 + 1.37 Xtt^-0.86,
    # S = 1/(1 + 1.15e-6 E^2 Re_l^1.17); horizontal, Fr_lo < 0.05: E2 = Fr^(0.1-2Fr),
    # S2 = Fr^0.5 (S from the uncorrected E: CHECK-VALUES 4b). A low mass flux makes
    # Fr_lo < 0.05 in the horizontal case.
    a = _state(fluid, G=50.0, horizontal=horizontal)
    Re_l = a["G"] * (1 - a["x"]) * a["D"] / a["mu_l"]
    Bo = a["q"] / (a["G"] * a["h_lv"])
    E = 1 + 24000 * Bo**1.16 + 1.37 * _xtt(a) ** -0.86
    S = 1 / (1 + 1.15e-6 * E**2 * Re_l**1.17)
    Fr = a["G"] ** 2 / (a["rho_l"] ** 2 * 9.80665 * a["D"])
    E2, S2 = (Fr ** (0.1 - 2 * Fr), Fr**0.5) if horizontal and Fr < 0.05 else (1.0, 1.0)
    assert (E2 < 1.0) == horizontal
    p = _parts("gungor_winterton_1986", a)
    assert p.nucleate == pytest.approx(S * S2 * _cooper(a), rel=1e-6)
    assert p.convective == pytest.approx(E * E2 * _h_liquid(a, a["G"] * (1 - a["x"])), rel=1e-6)
    assert p.htc == pytest.approx(p.nucleate + p.convective, rel=1e-12)


@pytest.mark.parametrize("fluid", FLUIDS)
def test_gungor_winterton_1987_parts_split_its_one_factor(fluid):
    # Gungor & Winterton (1987): htc = htc_l [1 + 3000 Bo^0.86 + 1.12 (x/(1-x))^0.75
    # (rho_l/rho_v)^0.41]; the boiling-number term is the nucleate part
    a = _state(fluid)
    h_l = _h_liquid(a, a["G"] * (1 - a["x"]))
    Bo = a["q"] / (a["G"] * a["h_lv"])
    x = a["x"]
    p = _parts("gungor_winterton_1987", a)
    assert p.nucleate == pytest.approx(3000 * Bo**0.86 * h_l, rel=1e-6)
    assert p.convective == pytest.approx(
        (1 + 1.12 * (x / (1 - x)) ** 0.75 * (a["rho_l"] / a["rho_v"]) ** 0.41) * h_l, rel=1e-6)
    assert p.htc == pytest.approx(p.nucleate + p.convective, rel=1e-12)


@pytest.mark.parametrize("fluid", FLUIDS)
@pytest.mark.parametrize("q", [2e3, 50e3, 400e3])
def test_kandlikar_parts_are_the_terms_of_the_governing_set(fluid, q):
    # Kandlikar (1990): htc/htc_l = C1 Co^C2 (25 Fr)^C5 + C3 Bo^C4 F_fl, the larger of the
    # convective set (1.1360, -0.9, 667.2, 0.7) and the nucleate set (0.6683, -0.2, 1058.0,
    # 0.7); vertical tube, C5 = 0. The fluxes put either set in charge.
    a = _state(fluid, q=q)
    h_l = _h_liquid(a, a["G"] * (1 - a["x"]))
    x = a["x"]
    Co = ((1 - x) / x) ** 0.8 * (a["rho_v"] / a["rho_l"]) ** 0.5
    Bo = q / (a["G"] * a["h_lv"])
    sets = [(1.1360 * Co**-0.9, 667.2 * Bo**0.7 * a["fluid_surface_factor"]),
            (0.6683 * Co**-0.2, 1058.0 * Bo**0.7 * a["fluid_surface_factor"])]
    conv, nb = max(sets, key=sum)
    p = _parts("kandlikar_1990", a)
    assert p.nucleate == pytest.approx(nb * h_l, rel=1e-6)
    assert p.convective == pytest.approx(conv * h_l, rel=1e-6)
    assert p.htc == pytest.approx(p.nucleate + p.convective, rel=1e-12)


def test_kandlikar_governing_set_changes_with_the_flux():
    # the test above covers both sets: at a low flux the convective set governs, at a
    # high one the nucleate set (its nucleate term is 1058/667.2 times larger)
    a = _state("R10")
    ratios = [_parts("kandlikar_1990", dict(a, q=q)) for q in (2e3, 400e3)]
    h_l = _h_liquid(a, a["G"] * (1 - a["x"]))
    Co = ((1 - a["x"]) / a["x"]) ** 0.8 * (a["rho_v"] / a["rho_l"]) ** 0.5
    assert ratios[0].convective == pytest.approx(1.1360 * Co**-0.9 * h_l, rel=1e-6)
    assert ratios[1].convective == pytest.approx(0.6683 * Co**-0.2 * h_l, rel=1e-6)


@pytest.mark.parametrize("fluid", FLUIDS)
def test_liu_winterton_parts_and_their_asymptotic_sum(fluid):
    # Liu & Winterton (1991): htc^2 = (F htc_lo)^2 + (S htc_Cooper)^2,
    # F = [1 + x Pr_l (rho_l/rho_v - 1)]^0.35, S = [1 + 0.055 F^0.1 Re_lo^0.16]^-1
    a = _state(fluid)
    Pr = a["cp_l"] * a["mu_l"] / a["k_l"]
    Re_lo = a["G"] * a["D"] / a["mu_l"]
    F = (1 + a["x"] * Pr * (a["rho_l"] / a["rho_v"] - 1)) ** 0.35
    S = 1 / (1 + 0.055 * F**0.1 * Re_lo**0.16)
    p = _parts("liu_winterton_1991", a)
    assert p.nucleate == pytest.approx(S * _cooper(a), rel=1e-6)
    assert p.convective == pytest.approx(F * _h_liquid(a, a["G"]), rel=1e-6)
    assert p.htc == pytest.approx(math.sqrt(p.nucleate**2 + p.convective**2), rel=1e-12)
    assert p.htc < p.nucleate + p.convective      # not a sum
    # ht.Liu_Winterton with no nucleate term (Te -> 0) is F htc_lo alone
    theirs = ht.Liu_Winterton(m=a["G"] * math.pi * a["D"] ** 2 / 4, x=a["x"], D=a["D"],
                              rhol=a["rho_l"], rhog=a["rho_v"], mul=a["mu_l"], kl=a["k_l"],
                              Cpl=a["cp_l"], MW=a["M"], P=a["P"], Pc=a["P_crit"], Te=1e-12)
    assert p.convective == pytest.approx(theirs, rel=1e-4)


@pytest.mark.parametrize("fluid", FLUIDS)
def test_steiner_taborek_parts_and_their_cubic_sum(fluid):
    # Steiner & Taborek (1992): htc^3 = (F_tp htc_lo)^3 + (F_nb h_nb,o)^3, htc_lo Gnielinski
    # all-liquid; F_tp = [(1-x)^1.5 + 1.9 x^0.6 (1-x)^0.01 (rho_l/rho_v)^0.35]^1.1;
    # F_nb = F_pf (q/q_ref)^nf (D/0.01)^-0.4 (Rp/1 um)^0.133 F(M)
    # above the onset of nucleate boiling, q_ONB = 2 sigma T_sat htc_lo / (r0 rho_v h_lv),
    # r0 = 0.3 um (about 0.9 MW/m^2 for water at 1 atm); below it the nucleate part is 0
    a = _state(fluid, q=2e6 if fluid == "W1" else 200e3)
    x, p_r, M = a["x"], a["P"] / a["P_crit"], a["M"]
    Re_lo = a["G"] * a["D"] / a["mu_l"]
    Pr = a["cp_l"] * a["mu_l"] / a["k_l"]
    fd = (0.790 * math.log(Re_lo) - 1.64) ** -2       # Petukhov's smooth-tube friction
    h_lo = ht.turbulent_Gnielinski(Re_lo, Pr, fd) * a["k_l"] / a["D"]
    F_tp = ((1 - x) ** 1.5 + 1.9 * x**0.6 * (1 - x) ** 0.01
            * (a["rho_l"] / a["rho_v"]) ** 0.35) ** 1.1
    F_pf = 2.816 * p_r**0.45 + (3.4 + 1.7 / (1 - p_r**7)) * p_r**3.7
    nf = 0.8 - 0.1 * math.exp(1.75 * p_r)
    F_M = 0.377 + 0.199 * math.log(M) + 2.8427e-5 * M**2
    F_nb = F_pf * (a["q"] / a["q_ref"]) ** nf * (a["D"] / 0.01) ** -0.4 * F_M
    p = _parts("steiner_taborek_1992", a)
    assert p.convective == pytest.approx(F_tp * h_lo, rel=1e-4)
    assert p.nucleate == pytest.approx(F_nb * a["h_nb_ref"], rel=1e-9)
    assert p.htc == pytest.approx((p.nucleate**3 + p.convective**3) ** (1 / 3), rel=1e-12)
    q_onb = 2 * a["sigma"] * a["T_sat"] * h_lo / (0.3e-6 * a["rho_v"] * a["h_lv"])
    below = _parts("steiner_taborek_1992", dict(a, q=0.9 * q_onb))
    assert below.nucleate == 0.0 and below.htc == below.convective


def test_every_flow_boiling_method_has_parts_and_a_rule():
    # a new method must declare its parts and how they combine
    for m in methods("flow_boiling"):
        assert m.station is not None and m.parts_exponent in (1, 2, 3), m.name


@pytest.mark.parametrize("name", [m.name for m in methods("flow_boiling")])
@pytest.mark.parametrize("fluid", FLUIDS)
def test_parts_recombine_by_the_declared_rule_over_a_grid(name, fluid):
    # the registry's rule holds wherever the march may evaluate the method
    m = get(name)
    n = m.parts_exponent
    dp_sat = _clausius_clapeyron(SETS[fluid])
    for x in (0.01, 0.1, 0.5, 0.9):
        for q in (1e3, 30e3, 300e3):
            a = _state(fluid, x=x)
            opts = {k: a[k] for k in m.options if k in a}
            p = fb.station_parts(name, a, dp_sat, **opts)(q)
            assert p.nucleate >= 0.0 and p.convective > 0.0
            assert p.htc == pytest.approx((p.nucleate**n + p.convective**n) ** (1 / n), rel=1e-9)
            assert p.htc == pytest.approx(fb.flow_boiling_htc(name, a, q, dp_sat, **opts),
                                          rel=1e-12)


def _clausius_clapeyron(p):
    """dp_sat(dT) from the integrated Clausius-Clapeyron relation (ideal vapour)."""
    a = p["h_lv"] * p["M"] / 8314.462618

    def dp_sat(dT):
        return p["P"] * math.expm1(a * (1.0 / p["T_sat"] - 1.0 / (p["T_sat"] + dT)))
    return dp_sat


SAMPLES = Path(__file__).resolve().parent.parent / "samples"


@pytest.mark.parametrize("sample", ["pentane-vaporiser.ebullio", "chiller-evaporator.ebullio",
                                    "stripper-reboiler.ebullio"])
def test_profiles_of_the_parts_recombine_into_the_boiling_coefficient(sample):
    # the rated profiles: in saturated boiling the parts recombine by the method's rule;
    # in subcooled boiling (Liu-Winterton's subcooled form, n = 2) likewise; single phase
    # and post-dryout have no nucleate part
    import rating

    project = rating.load_project(SAMPLES / sample)
    for case in project.cases:
        if case.type == "kettle":
            continue
        result = rating.rate(case)
        prof = result.profiles
        n = get(case.methods.flow_boiling).parts_exponent
        seen = set()
        for htc, nb, cv, regime in zip(prof["htc_boiling_W_m2K"], prof["htc_nucleate_W_m2K"],
                                       prof["htc_convective_W_m2K"], prof["regime"]):
            if nb is None or htc == 0.0:
                continue
            seen.add(regime)
            k = {"saturated boiling": n, "subcooled boiling": 2}.get(regime)
            if k is None:
                assert nb == 0.0 and cv == pytest.approx(htc, rel=1e-12)
            else:
                assert htc == pytest.approx((nb**k + cv**k) ** (1 / k), rel=1e-9), regime
        assert "saturated boiling" in seen
