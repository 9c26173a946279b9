"""The project file: refusals in one line, atomic saves, byte-stable round trips, migration.

The format is ours (rating/project.py); the expected values of the schema-1 sample
are the numbers written in tests/data/projects/v1/two-cases.ebullio.
"""
import json
import math
import os
from pathlib import Path

import pytest
from hypothesis import given, settings, strategies as st

import rating.project as project_module
from rating.case import (
    BWG_THICKNESS, BoilingStream, Case, HeatingMedium, KettleShell, Project, Shell, Tubes,
)
from rating.correlations.registry import REGISTRY, Method
from rating.errors import InputError, ProjectFileError
from rating.project import (
    SCHEMA_VERSION, dumps, from_dict, load_project, migrate, migrates, save_project, to_dict,
)

V1_SAMPLE = Path(__file__).parent / "data" / "projects" / "v1" / "two-cases.ebullio"


@pytest.fixture(autouse=True)
def default_methods_registered(monkeypatch):
    """Stand in for default methods whose modules are not written yet (no-op once they are)."""
    for name, family in (("gungor_winterton_1986", "flow_boiling"), ("cooper_1984", "nucleate_boiling"),
                         ("friedel_1979", "two_phase_friction"),
                         ("rouhani_axelsson_1970", "void_fraction"), ("bell_delaware", "shell_side")):
        if name not in REGISTRY:
            monkeypatch.setitem(REGISTRY, name, Method(name, family, lambda: None, "placeholder"))


def make_project():
    water = Case(
        name="Water", tubes=Tubes(count=120, length=3, outer_diameter=0.025, bwg=14),
        boiling=BoilingStream("Water", 2, 101325, inlet_temperature=360.0),
        heating=HeatingMedium(pressure=3e5), increments=100)
    r134a = Case(
        name="R134a chiller", type="kettle",
        tubes=Tubes(count=40, length=2.0, outer_diameter=0.019, wall_thickness=1.2e-3,
                    orientation="horizontal", pitch=0.0238, layout_angle=45, passes=2),
        boiling=BoilingStream("R134a", 1.5, 414607.5, inlet_quality=0.2),
        heating=HeatingMedium(kind="liquid", fluid="Water", pressure=3e5, inlet_temperature=285.15 + 10,
                              mass_flow=8.0, flow_arrangement="co"),
        kettle=KettleShell(0.5, 0.3, 0.25, 0.3, boiling_range=2.0), question="area_for_duty",
        required_duty=2.5e5)
    return Project(cases=(water, r134a), title="Tést ünïcode", notes="line one\nline two", revision=2)


def good_data():
    return json.loads(V1_SAMPLE.read_text(encoding="utf-8"))


def write(tmp_path, content, name="p.ebullio"):
    path = tmp_path / name
    path.write_bytes(content if isinstance(content, bytes) else content.encode("utf-8"))
    return path


def refuse_load(path, error=ProjectFileError):
    """Load must fail; the file and its folder are left exactly as they were."""
    before = path.read_bytes()
    listing = sorted(os.listdir(path.parent))
    with pytest.raises(error) as info:
        load_project(path)
    assert path.read_bytes() == before
    assert sorted(os.listdir(path.parent)) == listing
    assert "\n" not in str(info.value)  # one line
    return info.value


# --- the schema-1 sample -------------------------------------------------------------------------

def test_v1_sample_loads_with_its_values():
    p = load_project(V1_SAMPLE)
    assert p.title == "Schema 1 sample" and p.revision == 3 and p.notes.startswith("Loader test")
    water, pentane = p.cases
    assert water.name == "Water evaporator" and water.type == "evaporator"
    assert water.tubes.count == 200 and water.tubes.bwg == 14 and water.tubes.wall_thickness is None
    assert water.tubes.outer_diameter == 0.0254 and water.tubes.pitch == 0.03175
    assert water.tubes.material == "stainless_steel_316"
    assert water.boiling.inlet_temperature == 363.15 and water.boiling.inlet_quality is None
    assert water.boiling.fouling_resistance == 0.0002
    assert water.heating.kind == "steam" and water.heating.pressure == 300000.0
    assert water.shell is None and water.increments is None and water.required_duty is None
    assert water.methods.flow_boiling == "gungor_winterton_1986" and water.methods.tube_dryout == "auto"
    assert water.limits.chf_ratio == 0.7 and water.limits.critical_quality is None

    assert pentane.type == "thermosiphon" and pentane.question == "area_for_duty"  # schema 1 "duty_check"
    assert pentane.required_duty == 1.5e6 and pentane.increments == 200
    assert pentane.boiling.fluid == "n-Pentane" and pentane.boiling.inlet_quality == 0.0
    assert pentane.heating.kind == "liquid" and pentane.heating.inlet_temperature == 393.15
    assert pentane.heating.mass_flow == 20.0
    assert pentane.shell == Shell(inner_diameter=0.6, baffle_spacing=0.3, baffle_cut=0.25,
                                  sealing_strip_pairs=1)
    assert pentane.tubes.wall_thickness == 0.002 and pentane.tubes.bwg is None
    assert pentane.methods.flow_boiling == "chen_1966"
    assert pentane.methods.single_phase_tube == "dittus_boelter_1930"
    assert pentane.limits.chf_ratio == 0.6 and pentane.limits.critical_quality == 0.3
    assert p.case("Pentane thermosiphon") is pentane


# --- writing ---------------------------------------------------------------------------------------

def test_save_load_save_is_byte_identical(tmp_path):
    first, second = tmp_path / "a.ebullio", tmp_path / "b.ebullio"
    original = make_project()
    save_project(original, first)
    loaded = load_project(first)
    assert loaded == original  # ints given for floats come back as equal floats
    save_project(loaded, second)
    assert first.read_bytes() == second.read_bytes()


def test_file_layout(tmp_path):
    path = tmp_path / "p.ebullio"
    save_project(make_project(), path)
    text = path.read_bytes().decode("utf-8")
    assert text.endswith("}\n") and not text.endswith("\n\n")
    assert "Tést ünïcode" in text  # UTF-8, not \u escapes
    data = json.loads(text)
    assert data["format"] == "ebullio-project" and data["schema_version"] == SCHEMA_VERSION == 2
    assert isinstance(data["app_version"], str)
    assert list(data) == sorted(data) and list(data["cases"][0]["tubes"]) == sorted(data["cases"][0]["tubes"])
    assert '\n  "cases": [\n    {\n      "boiling": {' in text  # two-space indent
    tubes = data["cases"][0]["tubes"]
    assert tubes["wall_thickness"] is None and '"wall_thickness": null' in text
    assert tubes["length"] == 3.0 and isinstance(tubes["length"], float)  # written as 3.0, a float field
    assert tubes["count"] == 120 and isinstance(tubes["count"], int)
    assert data["cases"][0]["shell"] is None


def test_save_replaces_and_keeps_no_temporary_file(tmp_path):
    path = tmp_path / "p.ebullio"
    path.write_text("old")
    os.chmod(path, 0o600)
    save_project(make_project(), path)
    assert load_project(path) == make_project()
    assert os.listdir(tmp_path) == ["p.ebullio"]
    assert os.stat(path).st_mode & 0o777 == 0o600  # the user's permissions are kept


def test_save_through_a_link_writes_the_target(tmp_path):
    target, link = tmp_path / "real.ebullio", tmp_path / "link.ebullio"
    target.write_text("old")
    link.symlink_to(target)
    save_project(make_project(), link)
    assert link.is_symlink() and load_project(target) == make_project()


def test_failed_replace_leaves_the_old_file_untouched(tmp_path, monkeypatch):
    path = write(tmp_path, "the old content")

    def refuse(src, dst):
        raise PermissionError(13, "Permission denied")

    monkeypatch.setattr(os, "replace", refuse)
    with pytest.raises(ProjectFileError, match="could not be saved: Permission denied"):
        save_project(make_project(), path)
    assert path.read_bytes() == b"the old content"
    assert os.listdir(tmp_path) == ["p.ebullio"]  # the temporary file is gone


def test_failed_write_leaves_the_old_file_untouched(tmp_path, monkeypatch):
    path = write(tmp_path, "the old content")

    def no_space(fd):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "fsync", no_space)
    with pytest.raises(ProjectFileError, match="No space left"):
        save_project(make_project(), path)
    assert path.read_bytes() == b"the old content" and os.listdir(tmp_path) == ["p.ebullio"]


def test_unserialisable_project_is_refused_before_the_disk(tmp_path):
    path = write(tmp_path, "the old content")
    good = make_project()
    for bad, fragment in ((Project(cases=good.cases, title=object()), "title = <object"),
                          (Project(cases=good.cases, revision=0), "revision = 0: must be a whole number >= 1"),
                          (Project(cases=(good.cases[0], good.cases[0])), "cases[1].name = 'Water'"),
                          (Project(cases=({"name": "x"},)), "cases[0] = {'name': 'x'}: must be a Case")):
        with pytest.raises(InputError) as info:
            save_project(bad, path)
        assert fragment in str(info.value)
    # a value that slipped past validation (set by force) cannot be written either
    tubes = Tubes(count=1, length=1.0, outer_diameter=0.02, wall_thickness=0.001)
    object.__setattr__(tubes, "roughness", 1e-5j)
    with pytest.raises(ProjectFileError, match=r"^roughness = 1e-05j: cannot be written"):
        to_dict(tubes)
    assert path.read_bytes() == b"the old content" and os.listdir(tmp_path) == ["p.ebullio"]


def test_save_into_a_missing_folder(tmp_path):
    with pytest.raises(ProjectFileError, match="could not be saved"):
        save_project(make_project(), tmp_path / "nowhere" / "p.ebullio")


# --- refusals on load --------------------------------------------------------------------------

def test_truncated_file(tmp_path):
    text = V1_SAMPLE.read_text(encoding="utf-8")
    error = refuse_load(write(tmp_path, text[: len(text) // 2]))
    assert "is not a complete Ebullio project file (JSON error at line" in str(error)
    assert "p.ebullio" in str(error)


def test_not_json(tmp_path):
    error = refuse_load(write(tmp_path, "title = 'a project'\n"))
    assert "is not a complete Ebullio project file (JSON error at line 1 column 1" in str(error)


@pytest.mark.parametrize("content", [b"", b"  \n\t\n"])
def test_empty_file(tmp_path, content):
    assert "is empty, not an Ebullio project file" in str(refuse_load(write(tmp_path, content)))


@pytest.mark.parametrize("content", [bytes(range(256)), b"\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR",
                                     b'{"format": "ebullio-project"\x00}'])
def test_binary_junk(tmp_path, content):
    error = refuse_load(write(tmp_path, content))
    assert "is not an Ebullio project file (binary data, not UTF-8 text)" in str(error)


@pytest.mark.parametrize("data, fragment", [
    ({"name": "a spreadsheet"}, "is not an Ebullio project file (no format tag"),
    ({"format": "other-project", "schema_version": 1}, "is not an Ebullio project file (format 'other-project'"),
    ([1, 2, 3], "is not an Ebullio project file (its top level is a list, not an object)"),
    ("ebullio-project", "(its top level is text, not an object)"),
])
def test_foreign_file(tmp_path, data, fragment):
    error = refuse_load(write(tmp_path, json.dumps(data)))
    assert fragment in str(error) and "p.ebullio" in str(error)


def test_newer_schema(tmp_path):
    data = {**good_data(), "schema_version": 3, "a_future_key": {}}
    error = refuse_load(write(tmp_path, json.dumps(data)))
    assert "written by a newer Ebullio (schema 3); this version reads up to 2" in str(error)


@pytest.mark.parametrize("version", [None, 0, "1", 1.0, True])
def test_invalid_schema_version(tmp_path, version):
    data = good_data()
    data["schema_version"] = version
    error = refuse_load(write(tmp_path, json.dumps(data)))
    assert "has no valid schema_version" in str(error) and error.field == "schema_version"


def test_duplicate_key(tmp_path):
    text = V1_SAMPLE.read_text(encoding="utf-8").replace('"revision": 3', '"revision": 3, "revision": 4')
    assert "appears twice" in str(refuse_load(write(tmp_path, text)))


def test_missing_file(tmp_path):
    with pytest.raises(ProjectFileError, match="no such file"):
        load_project(tmp_path / "none.ebullio")
    assert os.listdir(tmp_path) == []


def edited(change):
    data = good_data()
    change(data)
    return json.dumps(data)


@pytest.mark.parametrize("change, error_class, field, message", [
    (lambda d: d["cases"][0]["tubes"].update(outer_diameter=-0.02), InputError,
     "cases[0].tubes.outer_diameter", "cases[0].tubes.outer_diameter = -0.02 m: must be > 0"),
    (lambda d: d["cases"][1]["boiling"].update(fluid=42), InputError,
     "cases[1].boiling.fluid", "cases[1].boiling.fluid = 42: must be text (a fluid name)"),
    (lambda d: d["cases"][0]["tubes"].update(length="3"), InputError,
     "cases[0].tubes.length", "cases[0].tubes.length = '3': must be a number [m], not text"),
    (lambda d: d["cases"][0]["tubes"].update(outer_diamter=0.02), ProjectFileError,
     "cases[0].tubes.outer_diamter", "cases[0].tubes.outer_diamter: unknown key (did you mean outer_diameter?)"),
    (lambda d: d["cases"][1]["tubes"].pop("length"), ProjectFileError,
     "cases[1].tubes.length", "cases[1].tubes.length: missing; a Tubes needs count, length, outer_diameter"),
    (lambda d: d["cases"][0].update(tubes=5), ProjectFileError,
     "cases[0].tubes", "cases[0].tubes: must be an object of Tubes fields, not a number"),
    (lambda d: d.update(cases={"a": 1}), ProjectFileError, "cases", "cases: must be a list, not an object"),
    (lambda d: d.update(titel="x"), ProjectFileError, "titel", "titel: unknown key (did you mean title?)"),
    (lambda d: d.update(revision=1.5), InputError, "revision", "revision = 1.5: must be a whole number >= 1"),
    (lambda d: d["cases"][1].update(shell=None), InputError,
     "cases[1].shell", "cases[1].shell = None: required when heating.kind = 'liquid'"),
    (lambda d: d["cases"][1].update(name="Water evaporator"), InputError,
     "cases[1].name", "cases[1].name = 'Water evaporator': cases[0] already has this name"),
    (lambda d: d["cases"][0]["boiling"].update(fluid="Watr"), InputError,
     "cases[0].boiling.fluid", "cases[0].boiling.fluid = 'Watr': "),
    (lambda d: d["cases"][0]["heating"].update(pressure=1e5), InputError,
     "cases[0].heating.pressure", "cases[0].heating.pressure = 100000 Pa: must be hotter than the boiling point"),
])
def test_content_refusals_carry_the_full_path(tmp_path, change, error_class, field, message):
    error = refuse_load(write(tmp_path, edited(change)), InputError)
    assert type(error) is error_class
    assert error.field == field
    assert str(error).startswith(message), str(error)


def test_a_byte_order_mark_is_accepted(tmp_path):
    path = write(tmp_path, b"\xef\xbb\xbf" + V1_SAMPLE.read_bytes())
    assert load_project(path) == load_project(V1_SAMPLE)


# --- migration ----------------------------------------------------------------------------------

@pytest.fixture
def schema_3(monkeypatch):
    """Pretend the current schema is 3 with a test-local chain (the product's 1 -> 2 step
    kept); the product chain is untouched."""
    chain = dict(project_module.MIGRATIONS)
    monkeypatch.setattr(project_module, "MIGRATIONS", chain)
    monkeypatch.setattr(project_module, "SCHEMA_VERSION", 3)
    return chain


def test_migration_runs_on_a_copy(schema_3):
    @migrates(2, chain=schema_3)
    def title_was_called_name(data):  # an imagined schema-2 spelling
        data["title"] = data.pop("name")
        return data

    old = {**good_data(), "name": "from schema 2"}
    del old["title"]
    kept = json.dumps(old, sort_keys=True)
    assert from_dict(old).title == "from schema 2"
    assert json.dumps(old, sort_keys=True) == kept  # the caller's data is not changed
    migrated = migrate(old)
    assert migrated["schema_version"] == 3 and migrated["title"] == "from schema 2"


def test_failing_migration_is_reported(schema_3, tmp_path):
    @migrates(2, chain=schema_3)
    def needs_a_key(data):
        data["title"] = data.pop("name")
        return data

    error = refuse_load(write(tmp_path, V1_SAMPLE.read_text(encoding="utf-8")))  # has no "name"
    assert "could not be converted from schema 2 to 3: KeyError: 'name'" in str(error)


def test_a_gap_in_the_chain_is_reported(schema_3, monkeypatch):
    monkeypatch.setattr(project_module, "SCHEMA_VERSION", 4)
    migrates(2, chain=schema_3)(lambda data: data)
    with pytest.raises(ProjectFileError, match="no migration from schema 3"):
        from_dict(good_data())


def test_a_version_registers_once(schema_3):
    migrates(2, chain=schema_3)(lambda data: data)
    with pytest.raises(ValueError, match="already registered"):
        migrates(2, chain=schema_3)(lambda data: data)


# --- round trips of random valid parts -------------------------------------------------------

finite = dict(allow_nan=False, allow_infinity=False)


@st.composite
def tubes(draw):
    count = draw(st.integers(1, 5000))
    d_o = draw(st.floats(0.005, 0.1, **finite))
    wall = {}
    gauges = [g for g, t in BWG_THICKNESS.items() if 2 * t < d_o]
    if gauges and draw(st.booleans()):
        wall["bwg"] = draw(st.sampled_from(gauges))
    else:
        wall["wall_thickness"] = d_o * draw(st.floats(0.01, 0.45, **finite))
    return Tubes(
        count=count, length=draw(st.floats(0.1, 20.0, **finite)), outer_diameter=d_o, **wall,
        passes=draw(st.integers(1, min(16, count))),
        material=draw(st.sampled_from(["carbon_steel", "titanium", "copper"])),
        wall_conductivity=draw(st.none() | st.floats(1.0, 400.0, **finite)),
        roughness=draw(st.floats(0.0, 1e-4, **finite)),
        orientation=draw(st.sampled_from(["vertical", "horizontal"])),
        pitch=draw(st.none() | st.floats(1.01, 2.0, **finite).map(lambda r: r * d_o)),
        layout_angle=draw(st.sampled_from([30, 45, 60, 90])),
    )


@st.composite
def boiling_streams(draw):
    inlet = draw(st.sampled_from(["temperature", "quality", "neither"]))
    return BoilingStream(
        fluid=draw(st.sampled_from(["Water", "R134a", "n-Pentane"])),
        mass_flow=draw(st.floats(1e-3, 500.0, **finite)),
        inlet_pressure=draw(st.floats(1e3, 2e7, **finite)),
        inlet_temperature=draw(st.floats(150.0, 700.0, **finite)) if inlet == "temperature" else None,
        inlet_quality=draw(st.floats(0.0, 0.999, **finite)) if inlet == "quality" else None,
        fouling_resistance=draw(st.floats(0.0, 0.0099, **finite)),
    )


def through_text(data):
    return json.loads(json.dumps(data, sort_keys=True, indent=2, allow_nan=False))


@settings(max_examples=150, deadline=None)
@given(tubes())
def test_tubes_round_trip(t):
    assert from_dict(through_text(to_dict(t)), Tubes) == t


@settings(max_examples=150, deadline=None)
@given(boiling_streams())
def test_boiling_stream_round_trip(b):
    back = from_dict(through_text(to_dict(b)), BoilingStream)
    assert back == b and all(isinstance(getattr(back, k), float) for k in ("mass_flow", "inlet_pressure"))


def test_dumps_refuses_non_finite_numbers():
    # validation refuses NaN; a forced one must not reach the file as a bare NaN token
    tubes = Tubes(count=1, length=1.0, outer_diameter=0.02, wall_thickness=0.001)
    object.__setattr__(tubes, "length", math.nan)
    with pytest.raises(ProjectFileError, match="^length = nan"):
        to_dict(tubes)


def test_dumps_matches_what_save_writes(tmp_path):
    path = tmp_path / "p.ebullio"
    save_project(make_project(), path)
    assert path.read_text(encoding="utf-8") == dumps(make_project())


# --- schema 2: the question renamed ------------------------------------------------------------

V2_SAMPLE = Path(__file__).parent / "data" / "projects" / "v2" / "two-cases.ebullio"


def test_schema_1_question_duty_check_reads_as_area_for_duty():
    data = json.loads(V1_SAMPLE.read_text(encoding="utf-8"))
    assert data["schema_version"] == 1 and data["cases"][1]["question"] == "duty_check"
    migrated = migrate(data)
    assert migrated["schema_version"] == 2
    assert [c["question"] for c in migrated["cases"]] == ["performance", "area_for_duty"]


def test_the_v2_sample_is_the_v1_sample_brought_up_to_date():
    data = json.loads(V2_SAMPLE.read_text(encoding="utf-8"))
    assert data["schema_version"] == 2 and data["cases"][1]["question"] == "area_for_duty"
    assert load_project(V2_SAMPLE) == load_project(V1_SAMPLE)
