"""Inputs that once gave a wrong answer in silence, each held to the answer it must give.

Each test names what the engine did before (the reason the test exists) and checks
the new behaviour against something outside the project where there is one: the
data range its authors give for a correlation, the pool-boiling critical flux of
Zuber (1959), a mass balance.
"""
import dataclasses
from pathlib import Path

import pytest

import rating
from rating.case import BoilingStream, Case, HeatingMedium, Tubes
from rating.correlations.pool_boiling import zuber_1959
from rating.properties import make_fluid

SAMPLES = Path(__file__).parent.parent / "samples"


def tube_case(orientation, fluid="Water", P=10e5, steam=40e5, m=21.0, quality=0.0,
              D=0.0254, bwg=14, count=40, L=6.0):
    return Case(name=f"{fluid} in {orientation} tubes",
                tubes=Tubes(count=count, length=L, outer_diameter=D, bwg=bwg,
                            orientation=orientation, pitch=1.25 * D),
                boiling=BoilingStream(fluid=fluid, mass_flow=m, inlet_pressure=P,
                                      inlet_quality=quality),
                heating=HeatingMedium(kind="steam", pressure=steam), increments=20)


def warnings_with(result, text):
    return [w for w in result.warnings if text in w.message]


# --- horizontal tubes: the Wojtan et al. (2005) dryout-onset quality only inside its data

def test_water_in_horizontal_tubes_is_not_dried_out_by_a_refrigerant_fit():
    # Before: water at 10 bar, G = 1000 kg/m^2/s, 21 mm bore, was declared dry at
    # z = 3.4 m by Wojtan's x_di (fitted to R22 and R410A in 8-13.84 mm tubes) and
    # rated 3.6 MW against 9.0 MW for the same tubes vertical.
    r = rating.rate(tube_case("horizontal"))
    assert r.status in ("ok", "warnings"), r.message
    assert r.summary["dryout_z_m"] is None
    for bound in ("fluid Water", "D = 0.02118 m"):
        found = [w for w in warnings_with(r, bound) if "dryout-onset quality" in w.message]
        assert len(found) == 1 and found[0].z_m is not None, bound
        assert "Groeneveld" in found[0].message          # the method that decides instead


def test_inside_its_data_the_dryout_onset_quality_decides():
    # R22 at 5.84 bar (about 5 degC), 13.4 mm bore, G = 213 kg/m^2/s: inside the data
    # Wojtan et al. give (R22, 8-13.84 mm, 70-700 kg/m^2/s, 2-57.5 kW/m^2) once the flux
    # falls below 57.5 kW/m^2.
    r = rating.rate(tube_case("horizontal", fluid="R22", P=5.84e5, steam=2000.0, m=0.6,
                              quality=0.2, D=0.01588, bwg=18, count=20))
    dry = [w for w in r.warnings if w.code == "dryout"]
    assert dry and "critical quality" in dry[0].message
    onset = [w.message for w in warnings_with(r, "dryout-onset quality is not used")]
    assert not [m for m in onset if "fluid R22" in m or "D = " in m or "G = " in m], onset


# --- range warnings: once per method and bound, with units and the first position

def test_range_warnings_are_once_per_bound_with_position_and_unit():
    r = rating.rate(tube_case("horizontal"))
    found = [w for w in r.warnings if w.code == "method-range"]
    assert found
    heads = [w.message.split(" = ")[0] for w in found]
    assert len(heads) == len(set(heads))
    assert all(w.z_m is not None and f"z = {w.z_m:.3f} m" in w.message for w in found)
    mass_flux = [w for w in found if "G = " in w.message or "D = " in w.message]
    assert all(" m" in w.message.split(" = ")[1][:20] or "kg/m^2/s" in w.message
               for w in mass_flux)


def test_a_thermosiphon_is_not_dried_out_in_its_first_centimetres():
    # Before: n-hexane at 2.2 bar on 25 bar steam (134 K), 1.2 m column level, was
    # declared dry at z = 0.061 m: Katto-Ohno at local quality evaluated at a boiling
    # length of about 2 diameters (its data begin at 5) reads far below the pool-boiling
    # critical flux. Published practice: the critical flux of forced flow is not below
    # the pool's (Zuber 1959), which flow and subcooling raise.
    c = rating.load_project(SAMPLES / "stripper-reboiler.ebullio").cases[0]
    T_sat = make_fluid("n-Hexane").saturation(c.boiling.inlet_pressure).T_sat
    c = dataclasses.replace(
        c, increments=20,
        boiling=dataclasses.replace(c.boiling, inlet_temperature=T_sat - 2.0),
        heating=dataclasses.replace(c.heating, pressure=2.5e6),
        thermosiphon=dataclasses.replace(c.thermosiphon, liquid_level=1.2))
    r = rating.rate(c)
    assert r.status in ("ok", "warnings"), r.message
    D_i = c.tubes.inner_diameter
    assert r.summary["dryout_z_m"] > 5.0 * D_i
    hexane, p = make_fluid("n-Hexane"), r.profiles
    near_inlet = [(q, P) for z, q, P in zip(p["z_m"], p["critical_heat_flux_W_m2"], p["p_Pa"])
                  if z <= 5.0 * D_i]
    assert near_inlet
    for q_chf, P in near_inlet:
        s = hexane.saturation(P)
        assert q_chf >= 0.999 * zuber_1959(s.rho_l, s.rho_v, s.sigma, s.h_lv)
    assert ("post_dryout", "dougall_rohsenow_1963") in {(m.family, m.name) for m in r.methods}


# --- complete dryout: quality straight to 1 is dryout, with its position and a warning

def test_quality_reaching_one_is_reported_as_dryout(monkeypatch):
    # Before: a tube whose wall stayed wet up to complete evaporation went from saturated
    # boiling to superheated vapour with no dryout position and no dryout warning. A
    # critical flux that never decides (infinite) isolates that path from the others.
    from rating.correlations import registry
    method = registry.get("katto_ohno_local")
    monkeypatch.setitem(registry.REGISTRY, method.name, dataclasses.replace(
        method, function=lambda G, x, D, rho_l, rho_v, sigma, h_lv: float("inf")))
    r = rating.rate(tube_case("vertical", fluid="n-Pentane", P=3e5, steam=1.05e5, m=0.1,
                              count=20, L=3.0))
    p = r.profiles
    assert p["quality"][-1] > 1.0
    z_dry = r.summary["dryout_z_m"]
    assert z_dry is not None
    # the position is where the quality reaches 1, by the profile's own mass balance
    first_dry = next(z for z, x in zip(p["z_m"], p["quality"]) if x >= 1.0)
    assert z_dry == pytest.approx(first_dry, abs=1e-6)
    dry = [w for w in r.warnings if w.code == "dryout"]
    assert dry and dry[0].z_m == pytest.approx(z_dry) and "quality 1" in dry[0].message


# --- a rating that cannot reach its state fails; an impossible input is refused

def test_a_kettle_fed_less_than_it_boils_off_fails():
    # Before: status "warnings", a duty that broke the energy balance and an exit
    # quality of 27 (the sample kettle fed 0.5 kg/s instead of 16 kg/s).
    k = rating.load_project(SAMPLES / "harrow-creek-kettles.ebullio").cases[0]
    r = rating.rate(dataclasses.replace(k, increments=20,
                                        boiling=dataclasses.replace(k.boiling, mass_flow=0.5)))
    assert r.status == "failed"
    assert "feed 0.5 kg/s" in r.message and "boil off" in r.message
    assert r.summary["duty_W"] is None and r.summary["exit_quality"] is None
    # the same kettle with its own feed still rates
    assert rating.rate(dataclasses.replace(k, increments=20)).status in ("ok", "warnings")


def test_a_shell_too_small_for_its_tubes_is_refused_by_field():
    # Before: 64 tubes of 19 mm in a 0.1 m shell rated "warnings" with a Bell-Delaware
    # coefficient. Phadke (1984) as ht.hx.Ntubes_Phadkeb: a 0.3 m shell (outer tube
    # limit 0.2865 m) holds the sample's 64 tubes on 23.8 mm pitch in 4 passes.
    from rating.errors import InputError
    c = rating.load_project(SAMPLES / "chiller-evaporator.ebullio").cases[0]
    with pytest.raises(InputError) as err:
        dataclasses.replace(c, shell=dataclasses.replace(c.shell, inner_diameter=0.1))
    assert err.value.field == "shell.inner_diameter" and "tubes.count = 64" in str(err.value)
    k = rating.load_project(SAMPLES / "harrow-creek-kettles.ebullio").cases[0]
    with pytest.raises(InputError) as err:
        dataclasses.replace(k, kettle=dataclasses.replace(k.kettle, bundle_diameter=0.2))
    assert err.value.field == "kettle.bundle_diameter"
