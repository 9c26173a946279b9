"""The bundle's desktop files and entry points, without building the bundle.

Building and checking the bundle itself takes minutes: that is
``python packaging/build.py`` (packaging/README.md), not part of this suite.
"""
from __future__ import annotations

import ast
import configparser
import fnmatch
import importlib
import importlib.util
import struct
import xml.etree.ElementTree as ET
from pathlib import Path

from rating.project import EXTENSION

PACKAGING = Path(__file__).resolve().parent.parent / "packaging"
MIME_NS = "{http://www.freedesktop.org/standards/shared-mime-info}"


def desktop_entry() -> dict:
    parser = configparser.RawConfigParser(delimiters=("=",))
    parser.optionxform = str                      # keys are case-sensitive in the spec
    parser.read(PACKAGING / "desktop" / "ebullio.desktop", encoding="utf-8")
    return dict(parser["Desktop Entry"])


def mime_types() -> dict:
    root = ET.parse(PACKAGING / "desktop" / "ebullio-mime.xml").getroot()
    assert root.tag == f"{MIME_NS}mime-info"
    return {t.get("type"): t for t in root.findall(f"{MIME_NS}mime-type")}


def png_size(path: Path) -> tuple[int, int]:
    """Width and height from the PNG header (PNG specification, 11.2.2: IHDR)."""
    head = path.read_bytes()[:24]
    assert head[:8] == b"\x89PNG\r\n\x1a\n" and head[12:16] == b"IHDR", path.name
    return struct.unpack(">II", head[16:24])


def test_desktop_entry_has_the_keys_an_application_entry_needs():
    # Desktop Entry Specification 1.4 (freedesktop.org), "Recognized desktop entry keys":
    # Type and Name are required, Exec is required for Type=Application; %f takes one file.
    entry = desktop_entry()
    assert entry["Type"] == "Application"
    assert entry["Name"] == "Ebullio"
    assert entry["Exec"].split()[0] == "ebullio" and entry["Exec"].split()[1:] == ["%f"]
    assert entry["Terminal"] == "false"
    # Desktop Menu Specification, registered main categories: Science; Engineering is
    # an additional category that must come with a main one.
    categories = entry["Categories"].rstrip(";").split(";")
    assert "Science" in categories and "Engineering" in categories


def test_desktop_entry_opens_the_project_file_type_that_the_mime_file_declares():
    types = mime_types()
    listed = desktop_entry()["MimeType"].rstrip(";").split(";")
    assert listed == ["application/x-ebullio-project"]
    assert set(listed) == set(types)
    # shared-mime-info specification: glob patterns match the file name
    globs = [g.get("pattern") for g in types[listed[0]].findall(f"{MIME_NS}glob")]
    assert any(fnmatch.fnmatch("stripper-reboiler" + EXTENSION, g) for g in globs)
    samples = sorted((PACKAGING.parent / "samples").glob("*"))
    matched = [s for s in samples if any(fnmatch.fnmatch(s.name, g) for g in globs)]
    assert matched and matched == [s for s in samples if s.suffix == EXTENSION]
    parents = [s.get("type") for s in types[listed[0]].findall(f"{MIME_NS}sub-class-of")]
    assert parents == ["application/json"]                 # the files are JSON (README)


def test_icons_are_there_at_every_size_the_entry_and_type_name():
    entry_icon = desktop_entry()["Icon"]
    type_icon = mime_types()["application/x-ebullio-project"].find(f"{MIME_NS}icon").get("name")
    assert entry_icon == type_icon == "ebullio"
    svg = ET.parse(PACKAGING / "icons" / "ebullio.svg").getroot()
    assert svg.tag == "{http://www.w3.org/2000/svg}svg" and svg.get("viewBox") == "0 0 256 256"
    # Icon Theme Specification: hicolor's fixed-size folders are square, NxN
    for size in (16, 24, 32, 48, 64, 128, 256):
        assert png_size(PACKAGING / "icons" / f"ebullio-{size}.png") == (size, size)


def _launcher_targets() -> list[str]:
    tree = ast.parse((PACKAGING / "launchers" / "ebullio.py").read_text())
    return sorted(n.module for n in ast.walk(tree)
                  if isinstance(n, ast.ImportFrom) and [a.name for a in n.names] == ["main"])


def test_the_bundle_carries_every_command_the_package_installs():
    import tomllib
    project = tomllib.loads((PACKAGING.parent / "pyproject.toml").read_text())["project"]
    scripts = project["scripts"]
    started = set(_launcher_targets())
    for name, target in {**scripts, **project["gui-scripts"]}.items():
        module = target.removesuffix(":main")
        assert module in started, f"{name}: the bundle's program does not start {target}"
        assert callable(importlib.import_module(module).main), module
    spec = importlib.util.spec_from_file_location("bundle_build", PACKAGING / "build.py")
    build = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(build)
    assert sorted(build.COMMAND_LINKS) == sorted(scripts)


def test_the_bundle_check_leaves_out_only_the_time_a_case_was_rated():
    # Two runs of one sample differ in the time stamp alone; any other field that differs
    # (a number, the case's hash) must still fail the bundle's check.
    spec = importlib.util.spec_from_file_location("check_bundle", PACKAGING / "check_bundle.py")
    check = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(check)
    run = {"cases": [{"summary": {"duty_W": 1429302.5446318071},
                      "provenance": {"rated_at": "2026-12-02T11:22:12+00:00", "case_sha256": "ab"}}]}
    later = {"cases": [{"summary": {"duty_W": 1429302.5446318071},
                        "provenance": {"rated_at": "2026-12-02T11:22:16+00:00", "case_sha256": "ab"}}]}
    assert check.differences(run, later) == []
    later["cases"][0]["summary"]["duty_W"] = 1429302.5446318074
    later["cases"][0]["provenance"]["case_sha256"] = "ac"
    assert len(check.differences(run, later)) == 2
