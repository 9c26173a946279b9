"""In-tube boiling set up from a case: what the evaporator and the thermosiphon share.

The tube and its methods (``boiling_tube``), the heating medium on the shell side
(``heating_side``), the condensate film a first march gives vertical tubes on steam
(``condensate_film``), the method trail (``methods_used``, ``with_substitutes``) and
the summary of a march (``march_summary``, ``exit_state``). The march itself is
``rating.boiling_march.Marcher``; each exchanger module sets it up with these and solves its
own outer problem.
"""
from __future__ import annotations

import math

from ..adjust import of_side
from ..correlations import registry
from ..correlations.flow_boiling import kandlikar_fluid_factor, steiner_taborek_reference
from ..correlations.pool_boiling import gorenflo_reference_htc, nucleate_fluid_constants
from ..errors import PropertyError
from ..boiling_march import BoilingTube
from ..march import WETTED_REGIMES, integrate_along_z
from ..properties import make_fluid
from ..results import MethodUsed
from .heating import LiquidHeating, SteamHeating, shell_geometry, tube_rows

#: Default increment count along the heated path (midpoint rule): chosen so that
#: doubling it moves the duty by well under 0.5 % on the samples (see tests).
DEFAULT_INCREMENTS = 40


def dryout_method(case, fluid) -> str:
    """The tube dryout method: the look-up table for water, Katto-Ohno otherwise."""
    name = case.methods.tube_dryout
    if name != "auto":
        return name
    return "groeneveld_2006" if fluid.coolprop_name.lower() == "water" else "katto_ohno_local"


def flow_boiling_options(case, fluid) -> dict:
    """Fluid-specific constants the chosen flow-boiling method needs."""
    method = registry.get(case.methods.flow_boiling)
    wanted = set(method.inputs) | set(method.options)
    opts = {}
    if "fluid_surface_factor" in wanted:
        # Kandlikar recommends F_fl = 1 for stainless-steel tubes whatever the fluid.
        stainless = case.tubes.material.startswith("stainless")
        opts["fluid_surface_factor"] = 1.0 if stainless else (
            kandlikar_fluid_factor(fluid.coolprop_name) or 1.0)
    if "h_nb_ref" in wanted:
        ref = steiner_taborek_reference(fluid.cas)
        if ref is None:
            h0 = gorenflo_reference_htc(fluid.cas)
            if h0 is None:
                raise PropertyError(
                    f"Steiner-Taborek needs a reference nucleate coefficient for "
                    f"{fluid.name}, and none is tabulated; choose another flow-boiling method",
                    fluid=fluid.name)
            # Gorenflo's h0 rescaled from Ra = 0.4 um to Rp = 1 um (steiner_taborek_reference).
            ref = (h0 * (1.0 / 0.4) ** 0.133, 20e3)
        opts["h_nb_ref"], opts["q_ref"] = ref
    return opts


def boiling_tube(case, fluid) -> BoilingTube:
    t, b, m = case.tubes, case.boiling, case.methods
    vertical = t.orientation == "vertical"
    nb_inputs, nb_options = nucleate_fluid_constants(registry.get(m.nucleate_boiling), fluid)
    return BoilingTube(
        fluid=fluid, D_i=t.inner_diameter, D_o=t.outer_diameter,
        wall_conductivity=t.conductivity, roughness=t.roughness, vertical=vertical,
        mass_flow_per_tube=b.mass_flow / t.tubes_per_pass, tubes_in_parallel=t.tubes_per_pass,
        fouling_inner=b.fouling_resistance, fouling_outer=case.heating.fouling_resistance,
        flow_boiling=m.flow_boiling, nucleate_boiling=m.nucleate_boiling,
        two_phase_friction=m.two_phase_friction, void_fraction=m.void_fraction,
        tube_dryout=dryout_method(case, fluid), single_phase_tube=m.single_phase_tube,
        critical_quality=case.limits.critical_quality,
        flow_pattern_method="taitel_bornea_dukler_1980" if vertical
        else "wojtan_ursenbacher_thome_2005",
        flow_boiling_options=flow_boiling_options(case, fluid),
        nucleate_inputs=nb_inputs, nucleate_options=nb_options,
        boiling_adjust=of_side(b), heating_adjust=of_side(case.heating),
    )


def condensate_film(outcome, tube, heating):
    """Condensate flow per unit perimeter along the tube [kg/m/s], from a finished march.

    Steam condenses from the top (z = L) down, so the film at z carries the
    condensate formed above it: (Q(L) - Q(z)) / (h_lv N pi D_o).
    """
    st = outcome.stations
    total = st[-1].duty
    perimeter = tube.tubes_in_parallel * math.pi * tube.D_o
    z = [s.z for s in st]
    film = [(total - s.duty) / (heating.sat.h_lv * perimeter) for s in st]
    return z, film


def heating_side(case):
    """The heating medium model and its inlet state."""
    hm, t = case.heating, case.tubes
    if hm.kind == "steam":
        water = make_fluid(hm.fluid)
        side = SteamHeating(water, hm.pressure, vertical=t.orientation == "vertical",
                            tube_outer_diameter=t.outer_diameter, tube_length=t.length,
                            tube_rows=tube_rows(case))
        return side, None
    spec = {"name": "user table", "table": hm.fluid} if isinstance(hm.fluid, dict) else hm.fluid
    fluid = make_fluid(spec)
    # The medium stays between the coldest boiling temperature and its own inlet; the
    # shooting's trial starts also run it past its inlet, hence the margin above.
    boiling = make_fluid(case.boiling.fluid)
    T_cold = case.boiling.inlet_temperature or boiling.saturation(case.boiling.inlet_pressure).T_sat
    span = hm.inlet_temperature - T_cold
    T_range = (max(T_cold - 5.0, getattr(fluid, "T_min", T_cold - 5.0)),
               min(hm.inlet_temperature + max(1.0, span),
                   getattr(fluid, "T_max", math.inf)))
    side = LiquidHeating(fluid, hm.pressure, hm.mass_flow,
                         counter_current=hm.flow_arrangement == "counter",
                         shell_geometry=shell_geometry(case), method=case.methods.shell_side,
                         temperature_range=T_range)
    side.loss_share = hm.heat_loss_percent / 100.0
    return side, fluid.enthalpy(hm.pressure, hm.inlet_temperature)


def methods_used(tube: BoilingTube, case, heating) -> tuple[MethodUsed, ...]:
    names = [
        ("flow_boiling", tube.flow_boiling), ("nucleate_boiling", tube.nucleate_boiling),
        ("subcooled_boiling", "liu_winterton_1991_subcooled"),
        ("post_dryout", "dougall_rohsenow_1963"),
        ("two_phase_friction", tube.two_phase_friction), ("void_fraction", tube.void_fraction),
        ("tube_dryout", tube.tube_dryout), ("single_phase_tube", tube.single_phase_tube),
        ("friction_factor", "colebrook_1939"), ("flow_pattern", tube.flow_pattern_method),
    ]
    if isinstance(heating, SteamHeating):
        names.append(("condensation", heating.method.name))
        if tube.vertical and case.tubes.passes == 1:
            names.append(("condensation", "nusselt_kutateladze_labuntsov_local"))
    else:
        names.append(("shell_side", heating.method.name))
    out = []
    for family, name in names:
        m = registry.get(name)
        out.append(MethodUsed(family, m.name, m.reference, m.title))
    return tuple(out)


def with_substitutes(methods, outcome) -> tuple[MethodUsed, ...]:
    """The method trail with the methods the march took in place of a chosen one."""
    if not outcome.method_notes:
        return methods
    m = registry.get("zuber_1959")
    return methods + (MethodUsed(m.family, m.name, m.reference, m.title),)


def exit_state(x, T, T_sat) -> dict:
    """The exit's vapour quality where it means one (0 to 1); beyond, the superheat of
    the vapour or the subcooling of the liquid [K] instead of a quality above 1 or below 0."""
    return {"exit_quality": x if 0.0 <= x <= 1.0 else None,
            "exit_superheat_K": T - T_sat if x > 1.0 else None,
            "exit_subcooling_K": T_sat - T if x < 0.0 else None}


def march_summary(case, tube, heating, hs_inlet, primary, performance, check) -> dict:
    """Summary of the march that answers the case's question.

    For a performance rating that is the full-length march. For the area-for-duty question it is
    the march that stops where the required duty is absorbed: its U and mean
    temperature difference are averages over the required area, and the
    full-length duty is kept as ``performance_duty_W``.
    """
    st = primary.stations
    first, last = st[0], st[-1]
    duty = case.boiling.mass_flow * (last.h - first.h)
    per_len_o = tube.tubes_in_parallel * math.pi * tube.D_o
    area = case.tubes.outer_area
    area_marched = per_len_o * last.z
    ua = per_len_o * integrate_along_z(st, "u_service")
    ua_clean = per_len_o * integrate_along_z(st, "u_clean")
    if hs_inlet is None:
        duty_heating = last.duty  # condensate x latent heat = the heat the steam gave up
        heating_out = heating.T
        dp_heating = None   # shell-side condensing steam: not computed (README), never 0
        steam_flow = duty_heating / heating.sat.h_lv
    else:
        co = case.heating.flow_arrangement == "co"
        h_out = primary.end_heating_state if co else primary.start_heating_state
        h_in = hs_inlet if co else primary.end_heating_state
        # The given inlet state against the outlet the march found.
        duty_heating = case.heating.mass_flow * (hs_inlet - h_out)
        heating_out = heating.temperature(h_out)
        T_mean = 0.5 * (heating_out + heating.temperature(h_in))
        dp_heating = heating.shell_result(T_mean).dP_total
        steam_flow = None
    mtd = duty / ua if ua > 0 else None
    summary = {
        "duty_W": duty,
        "duty_heating_side_W": duty_heating,
        "area_m2": area,
        "u_clean_W_m2K": ua_clean / area_marched,
        "u_service_W_m2K": ua / area_marched,
        "mean_temperature_difference_K": mtd,
        "over_design_pct": None,
        **exit_state(last.x, last.T_process, last.T_sat),
        "exit_temperature_K": last.T_process,
        "pressure_drop_boiling_Pa": first.P - last.P,
        "pressure_drop_heating_Pa": dp_heating,
        "heating_outlet_temperature_K": heating_out,
        "max_heat_flux_W_m2": max(s.q for s in st),
        # The wetted wall's ratio where dryout began counts: after it the flux collapses.
        "max_chf_ratio": max([s.chf_ratio for s in st if s.regime in WETTED_REGIMES]
                             + [primary.dryout_trigger_ratio]),
        "dryout_z_m": primary.dryout_z,
        "exit_pressure_Pa": last.P,
        "steam_flow_kg_s": steam_flow,
        "performance_duty_W": None if primary is performance else case.boiling.mass_flow * (
            performance.stations[-1].h - performance.stations[0].h),
        "required_duty_W": case.required_duty,
        "required_area_m2": None,
        "u_required_W_m2K": None,
        "over_surface_pct": None,
    }
    if check is not None and check.status == "ok" and check.stations:
        a_req = per_len_o * check.stations[-1].z
        summary["required_area_m2"] = a_req
        summary["over_design_pct"] = (area / a_req - 1.0) * 100.0
        if check is primary and mtd:
            u_req = case.required_duty / (area * mtd)
            summary["u_required_W_m2K"] = u_req
            summary["over_surface_pct"] = (summary["u_clean_W_m2K"] / u_req - 1.0) * 100.0
    return summary
