"""Vendor figures on a case and their comparison with Ebullio's rating.

The comparison's rules are the trade's: a vendor who states more duty, area or U
than an independent rating of the same geometry, or less pressure drop, flux or
steam, makes the unit look better than it is ("optimistic"); the reverse is
"conservative" (Serth & Lestina, Process Heat Transfer, 2nd ed. 2014, on reading
margins: over-design = U_service / U_required - 1). Ebullio's side of each row
here is a fixed, hand-written summary, so that the verdicts are checked against
numbers worked out by hand, not against the engine's output.
"""
import dataclasses
import json
import math

import pytest

import rating
from rating.errors import InputError, ProjectFileError
from rating.project import dumps, from_dict
from rating.results import Result
from rating.vendor import VendorFigures, VendorTolerances, compare, describe

from pathlib import Path

SAMPLES = Path(__file__).parent.parent / "samples"
PENTANE = rating.load_project(SAMPLES / "pentane-vaporiser.ebullio")
STRIPPER = rating.load_project(SAMPLES / "stripper-reboiler.ebullio")


def area_by_hand(case):
    """Outside area of the bundle, N pi D_o L (geometry, not the engine)."""
    t = case.tubes
    return t.count * math.pi * t.outer_diameter * t.length


def result_for(case, **summary):
    """A rated result of ``case`` whose summary holds the given values (SI)."""
    base = {"duty_W": 1.0e6, "area_m2": area_by_hand(case), "u_clean_W_m2K": 2000.0,
            "u_service_W_m2K": 1200.0, "over_design_pct": None, "exit_quality": 0.60,
            "pressure_drop_boiling_Pa": 4000.0, "pressure_drop_heating_Pa": None,
            "max_heat_flux_W_m2": 60e3, "steam_flow_kg_s": 0.45}
    base.update(summary)
    return Result(case.name, case.type, "ok", "rated", base)


def with_vendor(case, **figures):
    return dataclasses.replace(case, vendor=VendorFigures(source="Proposal P-1 rev. B", **figures))


DUTY_CHECK = PENTANE.cases[1]      # the area for a duty, on condensing steam
PERFORMANCE = PENTANE.cases[0]     # a performance rating on condensing steam
THERMOSIPHON = STRIPPER.cases[0]


def test_optimistic_service_u_and_area_are_flagged_and_the_overall_verdict_names_the_worse():
    area = area_by_hand(DUTY_CHECK)
    # U service 30 % above Ebullio's (band 15 %: 2.0x the band); area 12 % above the
    # tubes' own (band 5 %: 2.4x the band) -> area decides.
    case = with_vendor(DUTY_CHECK, duty=1.0e6, area=1.12 * area, u_service=1560.0,
                       over_design=40.0)
    cmp = compare(case, result_for(case, over_design_pct=35.0))
    assert cmp.row("u_service").verdict == "optimistic"
    assert cmp.row("u_service").deviation == pytest.approx(30.0)
    assert cmp.row("area").verdict == "optimistic"
    assert cmp.row("area").deviation == pytest.approx(12.0)
    assert cmp.row("duty").verdict == "consistent"
    assert cmp.row("over_design").verdict == "consistent"      # 5 points of 10
    assert cmp.verdict == "optimistic" and cmp.deciding == "area"
    sentence = describe(cmp, label=lambda f: {"area": "Heat-transfer area"}.get(f, f))
    assert sentence.startswith("Optimistic") and "Heat-transfer area" in sentence


def test_service_u_alone_decides_when_it_is_the_only_optimistic_row():
    case = with_vendor(DUTY_CHECK, area=area_by_hand(DUTY_CHECK), u_service=1500.0)
    cmp = compare(case, result_for(case))
    assert cmp.verdict == "optimistic" and cmp.deciding == "u_service"
    assert cmp.row("area").verdict == "consistent"


def test_a_consistent_vendor_is_not_flagged():
    # Each figure inside its default band, on both sides of Ebullio's value.
    case = with_vendor(DUTY_CHECK, duty=0.95e6, area=area_by_hand(DUTY_CHECK) * 1.02,
                       u_clean=2200.0, u_service=1100.0, over_design=38.0,
                       pressure_drop_boiling=4800.0, exit_quality=0.63,
                       max_heat_flux=55e3, heating_flow=0.47)
    cmp = compare(case, result_for(case, over_design_pct=35.0))
    assert {r.verdict for r in cmp.rows} == {"consistent"}
    assert cmp.verdict == "consistent"
    # The row closest to its limit is named: boiling-side pressure drop at 20 % of 30 %.
    assert cmp.deciding == "pressure_drop_boiling"
    assert describe(cmp).startswith("Consistent")


def test_figures_the_case_does_not_compute_are_not_comparable():
    case = with_vendor(PERFORMANCE, duty=1.0e6, over_design=20.0, circulation_rate=30.0,
                       circulation_ratio=8.0, pressure_drop_heating=2000.0)
    cmp = compare(case, result_for(case))
    for figure in ("over_design", "circulation_rate", "circulation_ratio",
                   "pressure_drop_heating"):
        row = cmp.row(figure)
        assert row.verdict == "not comparable" and row.ebullio is None and row.deviation is None
        assert row.note       # says why
    assert "area-for-duty" in cmp.row("over_design").note
    assert "thermosiphon" in cmp.row("circulation_rate").note
    assert cmp.verdict == "consistent" and cmp.deciding == "duty"


def test_nothing_comparable_and_a_failed_rating():
    case = with_vendor(PERFORMANCE, over_design=20.0)
    cmp = compare(case, result_for(case))
    assert cmp.verdict == "not comparable" and cmp.deciding is None
    assert describe(cmp).startswith("Not comparable")
    case = with_vendor(PERFORMANCE, duty=1.0e6, u_service=1000.0)
    failed = Result(case.name, case.type, "failed", "did not converge", {"duty_W": None})
    cmp = compare(case, failed)
    assert {r.verdict for r in cmp.rows} == {"not comparable"}
    assert "did not converge" in cmp.row("duty").note


def test_pressure_drop_and_flux_understated_are_optimistic_overstated_conservative():
    case = with_vendor(DUTY_CHECK, pressure_drop_boiling=2000.0, max_heat_flux=90e3,
                       heating_flow=0.30)
    cmp = compare(case, result_for(case))
    assert cmp.row("pressure_drop_boiling").verdict == "optimistic"       # -50 %
    assert cmp.row("max_heat_flux").verdict == "conservative"              # +50 %
    assert cmp.row("heating_flow").verdict == "optimistic"                 # -33 % steam
    assert cmp.deciding == "heating_flow"                                  # 3.3x its band


def test_conservative_only():
    case = with_vendor(DUTY_CHECK, duty=0.8e6, u_service=1000.0)
    cmp = compare(case, result_for(case))
    assert cmp.verdict == "conservative" and cmp.deciding == "duty"       # -20 % of 10 %


def test_thermosiphon_circulation_and_exit_quality_directions():
    # More circulation claimed, or a lower exit quality (the same claim), flatters the unit.
    case = with_vendor(THERMOSIPHON, circulation_rate=48.0, circulation_ratio=5.4,
                       exit_quality=0.10)
    cmp = compare(case, result_for(case, circulation_kg_s=38.0, circulation_ratio=5.3,
                                   exit_quality=0.19))
    assert cmp.row("circulation_rate").verdict == "optimistic"     # +26 % of 20 %
    assert cmp.row("circulation_ratio").verdict == "consistent"
    assert cmp.row("exit_quality").verdict == "optimistic"         # -0.09 of 0.05
    assert cmp.row("exit_quality").deviation == pytest.approx(-0.09)


def test_a_figure_on_the_edge_of_its_band_is_consistent_and_bands_are_editable():
    case = with_vendor(DUTY_CHECK, duty=1.1e6)
    assert compare(case, result_for(case)).row("duty").verdict == "consistent"
    tight = dataclasses.replace(case, vendor=dataclasses.replace(
        case.vendor, tolerances=VendorTolerances(duty=5.0)))
    assert compare(tight, result_for(tight)).row("duty").verdict == "optimistic"


def test_no_vendor_no_comparison():
    assert compare(PERFORMANCE, result_for(PERFORMANCE)) is None


@pytest.mark.parametrize("kwargs, field, words", [
    ({"duty": -1.0}, "duty", "> 0"),
    ({"exit_quality": 1.5}, "exit_quality", "<= 1"),
    ({"over_design": -120.0}, "over_design", "> -100"),
    ({"pressure_drop_boiling": -5.0}, "pressure_drop_boiling", ">= 0"),
    ({"u_service": "high"}, "u_service", "must be a number"),
])
def test_bad_vendor_figures_are_refused_naming_the_field(kwargs, field, words):
    with pytest.raises(InputError) as err:
        VendorFigures(source="P-1", **kwargs)
    assert err.value.field == field and words in str(err.value)


def test_a_proposal_must_be_named():
    with pytest.raises(InputError) as err:
        VendorFigures(source=" ", duty=1e6)
    assert err.value.field == "source"


def test_bad_tolerance_is_refused():
    with pytest.raises(InputError, match="u_service = 0 %: must be > 0"):
        VendorTolerances(u_service=0.0)
    with pytest.raises(InputError, match="exit_quality"):
        VendorTolerances(exit_quality=2.0)


def test_vendor_figures_travel_in_the_project_file():
    case = with_vendor(DUTY_CHECK, duty=1.0e6, u_service=1500.0,
                       )
    project = dataclasses.replace(PENTANE, cases=(case, PERFORMANCE))
    data = json.loads(dumps(project))
    assert data["cases"][0]["vendor"]["u_service"] == 1500.0
    assert data["cases"][1]["vendor"] is None
    assert data["schema_version"] == rating.project.SCHEMA_VERSION
    assert from_dict(data) == project
    data["cases"][0]["vendor"]["u_servise"] = 1.0
    with pytest.raises(ProjectFileError, match=r"cases\[0\]\.vendor\.u_servise.*u_service"):
        from_dict(data)
    del data["cases"][0]["vendor"]["u_servise"]
    data["cases"][0]["vendor"]["duty"] = -3.0
    with pytest.raises(InputError, match=r"cases\[0\]\.vendor\.duty = -3 W"):
        from_dict(data)


def test_a_case_without_the_vendor_key_loads():
    data = json.loads(dumps(PENTANE))
    for c in data["cases"]:
        del c["vendor"]
    assert from_dict(data) == PENTANE


def test_duty_check_duty_is_the_required_duty_when_reached_else_what_is_reached():
    # A vendor sells the required duty (1 MW here); the margin is the over-design row.
    case = with_vendor(DUTY_CHECK, duty=1.0e6)
    reached = compare(case, result_for(case, duty_W=1.4e6, over_design_pct=40.0))
    assert reached.row("duty").verdict == "consistent"
    short = compare(case, result_for(case, duty_W=0.8e6, over_design_pct=None))
    assert short.row("duty").verdict == "optimistic"       # +25 % over what is reached


# --- the command ------------------------------------------------------------------

VENDOR_SAMPLE = SAMPLES / "vendor-proposals.ebullio"


def test_sample_vendor_proposals_json_and_text(capsys):
    from rating import cli

    code = cli.main([str(VENDOR_SAMPLE), "--json", "--increments", "20"])
    data = json.loads(capsys.readouterr().out)
    assert code == 0
    first, second = (c["vendor_comparison"] for c in data["cases"])
    assert first["verdict"] == "optimistic" and first["deciding"] == "u_service"
    rows = {r["figure"]: r for r in first["rows"]}
    assert rows["pressure_drop_heating"]["verdict"] == "not comparable"
    assert rows["pressure_drop_heating"]["ebullio"] is None
    # The area row against the tubes' own area, worked by hand.
    case = rating.load_project(VENDOR_SAMPLE).cases[0]
    assert rows["area"]["ebullio"] == pytest.approx(area_by_hand(case))
    assert second["verdict"] == "consistent"
    code = cli.main([str(PENTANE_FILE), "--json", "--increments", "20"])
    data = json.loads(capsys.readouterr().out)
    assert all("vendor_comparison" in c and c["vendor_comparison"] is None for c in data["cases"])
    code = cli.main([str(VENDOR_SAMPLE), "--increments", "20"])
    out = capsys.readouterr().out
    assert "Optimistic, decided by U service" in out and "not comparable" in out
    assert "qualified engineer" in out


PENTANE_FILE = SAMPLES / "pentane-vaporiser.ebullio"


def test_report_without_a_writer_is_refused_in_one_line(capsys):
    from rating import cli

    code = cli.main([str(PENTANE_FILE), "--report", "out.pdf"])
    err = capsys.readouterr().err
    assert code == 2 and len(err.strip().splitlines()) == 1 and "gui" in err


def test_catalogue_describes_vendor_figures_and_checks_them_in_a_draft():
    from rating import catalogue as cat

    assert cat.vendor_label("u_service") == "U service"
    assert cat.input_field("vendor.tolerances.u_service").default == 15.0
    draft = cat.case_to_draft(PERFORMANCE)
    assert not any(p.path.startswith("vendor") for p in cat.draft_problems(draft))
    assert not cat.applies("vendor.duty", draft)           # no proposal: the group is hidden
    draft = cat.set_value(draft, "vendor", {"source": "P-1", "duty": -5.0})
    assert cat.applies("vendor.duty", draft)
    problems = [p for p in cat.draft_problems(draft) if p.severity == "error"]
    assert [p.path for p in problems] == ["vendor.duty"] and "> 0" in problems[0].message
    draft = cat.set_value(draft, "vendor.duty", 1e6)
    draft = cat.set_value(draft, "vendor.tolerances.duty", 0.0)
    assert [p.path for p in cat.draft_problems(draft)
            if p.severity == "error"] == ["vendor.tolerances.duty"]
