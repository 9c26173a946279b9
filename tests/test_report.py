"""The rating report: PDF through Qt's own writer and its HTML twin, read back as a reader would.

The PDF's text is read back with pypdf (an independent PDF reader); the HTML's
text with the standard library's HTML parser. Unit conversions are checked with
factors from NIST Special Publication 811 (2008), Appendix B.9, not with
``gui.units``: 1 m^2 = 10.763 910 ft^2; 1 W = 3.412 142 Btu_IT/h; T[degF] =
1.8 T[degC] + 32.
"""
import dataclasses
import html.parser
import json
import re
import subprocess
import sys
from pathlib import Path

import pypdf
import pytest

import rating
from rating.cli import CAUTION
from rating.vendor import VendorFigures, compare, describe

ROOT = Path(__file__).parent.parent
SAMPLES = ROOT / "samples"
PENTANE = SAMPLES / "pentane-vaporiser.ebullio"

FT2_PER_M2 = 10.7639104        # NIST SP 811, B.9
BTU_H_PER_W = 3.41214163       # NIST SP 811, B.9 (International Table Btu)


def words(text: str) -> str:
    """Text with every run of white space made one space (PDF text comes line by line)."""
    return re.sub(r"\s+", " ", text).strip()


@pytest.fixture(scope="module")
def rated():
    """The pentane vaporiser's performance case (dryout: warnings with positions),
    with a vendor proposal, rated once at 30 increments."""
    project = rating.load_project(PENTANE)
    vendor = VendorFigures(source="Proposal P-7 rev. C (invented)", duty=1.6e6,
                           u_service=1300.0, area=28.8, over_design=25.0)
    case = dataclasses.replace(project.cases[0], vendor=vendor, increments=30)
    project = dataclasses.replace(project, cases=(case,))
    path = PENTANE.parent / "pentane-vaporiser.ebullio"
    return project, [case], [rating.rate(case)], path


def write(rated, folder, name, units):
    from gui.report import write_report

    project, cases, results, source = rated
    out = folder / name
    written = write_report(project, cases, out, units, source, results=results)
    return out, written


@pytest.fixture(scope="module")
def reports(rated, tmp_path_factory):
    """The case's report as PDF and HTML in SI, and as HTML in US units (written once)."""
    folder = tmp_path_factory.mktemp("reports")
    return {(name, units): write(rated, folder, name, units)
            for name, units in (("si.pdf", "SI"), ("si.html", "SI"), ("us.html", "US"))}


def pdf_pages(path) -> list[str]:
    return [words(p.extract_text()) for p in pypdf.PdfReader(path).pages]


class _Text(html.parser.HTMLParser):
    def __init__(self):
        super().__init__()
        self.parts, self.images = [], []

    def handle_data(self, data):
        self.parts.append(data)

    def handle_starttag(self, tag, attrs):
        if tag == "img":
            self.images.append(dict(attrs)["src"])


def html_text(path):
    parser = _Text()
    parser.feed(Path(path).read_text(encoding="utf-8"))
    return words(" ".join(parser.parts)), parser.images


def test_pdf_pages_header_footer_and_contents(rated, reports):
    project, (case,), (result,), _ = rated
    assert len(result.warnings) >= 2 and any(w.z_m is not None for w in result.warnings)
    out, written = reports["si.pdf", "SI"]
    pages = pdf_pages(out)
    n = len(pages)
    # Summary page, at least two for the case (figures, inputs), the provenance page.
    assert n >= 4
    for i, text in enumerate(pages, 1):
        assert f"Page {i} of {n}" in text
        assert project.title in text                       # header on every page
        assert "qualified engineer" in text                # the caution, short, on every page
    assert "Rating report" in pages[0] and words(CAUTION) in pages[0]
    assert all(case.name in text for text in pages[1:-1])  # the case in the header
    assert "Provenance" in pages[-1] and "Provenance" in pages[-1].split("Page")[0]
    whole = " ".join(pages)
    assert case.name in whole
    assert "Does not reach" not in whole and "Duty" in whole
    from gui.warning_text import warning_text   # each warning in the report's units
    for w in result.warnings:
        assert words(warning_text(w, "SI")) in whole, w.code
        assert w.code in whole
    comparison = compare(case, result)
    assert words(describe(comparison)) in whole
    assert "CoolProp" in whole and "SHA-256" in whole and "pentane-vaporiser.ebullio" in whole
    import hashlib
    assert hashlib.sha256(PENTANE.read_bytes()).hexdigest() in whole.replace(" ", "")


def test_html_twin_holds_the_same(rated, reports):
    project, (case,), (result,), _ = rated
    out, _ = reports["si.html", "SI"]
    text, images = html_text(out)
    assert case.name in text and words(CAUTION) in text
    from gui.warning_text import warning_text
    for w in result.warnings:
        assert words(warning_text(w, "SI")) in text
    assert words(describe(compare(case, result))) in text
    # Self-contained: every figure embedded, nothing fetched from elsewhere.
    assert len(images) >= 2 and all(src.startswith("data:image/png;base64,") for src in images)
    # The rating verdict appears in the PDF too, word for word.
    pdf, _ = reports["si.pdf", "SI"]
    verdict = re.search(r"Duty [^.]*\.", text).group(0)
    assert verdict in " ".join(pdf_pages(pdf))


def test_the_unit_system_switches_the_numbers(rated, reports):
    _, _, (result,), _ = rated
    si, _ = reports["si.html", "SI"]
    us, _ = reports["us.html", "US"]
    si_text, _ = html_text(si)
    us_text, _ = html_text(us)
    area = result.summary["area_m2"]
    assert f"{area:.4g}" in si_text and f"{area * FT2_PER_M2:.4g}" in us_text
    assert f"{area * FT2_PER_M2:.4g}" not in si_text
    duty_kbtu = result.summary["duty_W"] * BTU_H_PER_W
    assert f"{duty_kbtu:,.0f}"[:5] in us_text            # 4,877,... Btu/h
    assert "Btu/h" in us_text and "°F" in us_text and "ft²" in us_text
    assert "Btu/h" not in si_text and "°C" in si_text
    t_exit_f = (result.summary["exit_temperature_K"] - 273.15) * 1.8 + 32.0
    assert f"{t_exit_f:.4g}" in us_text


def test_profiles_csv_beside_the_report_with_units_in_the_header(rated, reports):
    _, _, (result,), _ = rated
    _, written = reports["us.html", "US"]
    csv_files = [p for p in written if p.suffix == ".csv"]
    assert len(csv_files) == 1
    lines = csv_files[0].read_text(encoding="utf-8").splitlines()
    assert "qualified engineer" in lines[0]           # the caution, first
    head = lines[1].split(",")
    assert head[0] == "Position along the heated length [ft]"
    assert "Heat flux [Btu/(h·ft²)]" in head and "Pressure [psia]" in head
    assert len(lines) - 2 == len(result.profiles["z_m"])
    last_z_ft = float(lines[-1].split(",")[0])
    assert last_z_ft == pytest.approx(result.profiles["z_m"][-1] / 0.3048, rel=1e-5)


def test_a_table_row_is_never_cut_by_a_page_end(tmp_path):
    """A long table of three-line rows: each row's first and last words on one page."""
    from gui.report.content import Report, Table
    from gui.report.pdf import write_pdf

    filler = " ".join(["lorem"] * 40)
    rows = [f"<td>start{i:02d}</td><td>{filler} end{i:02d}</td>" for i in range(70)]
    rep = Report(title="Row test", case_names=["Summary", "Provenance"])
    rep.add("<html><body><h1>Rows</h1>")
    rep.add(Table("<th>No.</th><th>Text</th>", rows))
    rep.add("</body></html>")
    out = tmp_path / "rows.pdf"
    pages = write_pdf(rep, out, "2026-01-01")
    texts = pdf_pages(out)
    assert pages == len(texts) >= 3
    for i in range(70):
        where = [p for p, t in enumerate(texts) if f"start{i:02d}" in t]
        assert where and f"end{i:02d}" in texts[where[0]], f"row {i} is cut"
    assert all("No." in t for t in texts)          # the header row repeats on every page


def test_command_writes_the_report(tmp_path):
    out = tmp_path / "vendor.pdf"
    proc = subprocess.run([sys.executable, "-m", "gui.report.command",
                           str(SAMPLES / "vendor-proposals.ebullio"), "--report", str(out),
                           "--units", "metric", "--increments", "20", "--json"],
                          cwd=ROOT, capture_output=True, text=True)
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    assert [c["vendor_comparison"]["verdict"] for c in data["cases"]] == \
        ["optimistic", "consistent"]
    pages = pdf_pages(out)
    whole = " ".join(pages)
    assert "bar(a)" in whole and "Metric" in whole
    assert "Optimistic, decided by U service" in whole
    assert "thermosiphon" in pages[0].lower() and "kettle" in pages[0].lower()


def test_command_refuses_a_bad_report_name_in_one_line(tmp_path, capsys):
    from gui.report.command import main

    (tmp_path / "a-file").write_text("not a folder")
    for target, words_ in ((tmp_path / "r.docx", ".pdf or .html"),
                           (tmp_path / "a-file" / "r.pdf", "not a folder")):
        code = main([str(PENTANE), "--report", str(target)])
        err = capsys.readouterr().err
        assert code == 2 and len(err.strip().splitlines()) == 1, err
        assert words_ in err and "Traceback" not in err
        assert not target.exists()


def test_write_report_rates_when_given_no_results(tmp_path):
    from gui.report import write_report

    project = rating.load_project(SAMPLES / "chiller-evaporator.ebullio")
    case = dataclasses.replace(project.cases[0], increments=12)
    out = tmp_path / "chiller.html"
    written = write_report(project, [case], out, "SI")
    assert written[0] == out and out.exists()
    text, _ = html_text(out)
    assert case.name in text and "No vendor figures on this case" in text
    with pytest.raises(ValueError, match="SI, metric, US"):
        write_report(project, [case], tmp_path / "x.pdf", "imperial")


def test_a_report_never_replaces_a_file_it_did_not_write(rated, tmp_path, capsys):
    """A file named like a profile table (<stem>.1-<case>.csv) that a report did not write
    stops the report before anything is written, naming it; the file keeps its bytes. A
    table a report wrote is rewritten with the report; a file the caller agreed to
    replace (the desktop asks) is replaced."""
    from gui.report import write_report
    from gui.report.command import main
    from gui.report.writer import profile_csv_paths

    project, cases, results, source = rated
    out = tmp_path / "r.html"
    (table,) = profile_csv_paths(out, results)
    table.write_text("my own readings\n1,2,3\n", encoding="utf-8")
    with pytest.raises(FileExistsError, match=re.escape(table.name)):
        write_report(project, cases, out, "SI", source, results=results)
    assert not out.exists() and table.read_text(encoding="utf-8") == "my own readings\n1,2,3\n"

    code = main([str(PENTANE), "--report", str(out), "--increments", "12"])
    err = capsys.readouterr().err
    assert code == 2 and len(err.strip().splitlines()) == 1 and table.name in err
    assert "did not write" in err and "Traceback" not in err
    assert table.read_text(encoding="utf-8") == "my own readings\n1,2,3\n"

    written = write_report(project, cases, out, "SI", source, results=results,
                           replace=[table])
    assert table in written and "qualified engineer" in table.read_text(encoding="utf-8")
    # written again over its own table, without asking
    assert table in write_report(project, cases, out, "US", source, results=results)
    assert "[ft]" in table.read_text(encoding="utf-8")


def test_a_window_can_follow_a_report_in_one_process():
    # The application object a report makes is the process's for good: a bare
    # QGuiApplication made Qt abort at the first widget that followed (seen when the
    # report tests ran before the desktop's in one pytest process).
    code = ("import os; os.environ['QT_QPA_PLATFORM'] = 'offscreen'\n"
            "from gui.report.pdf import ensure_app\n"
            "ensure_app()\n"
            "from PySide6.QtWidgets import QLabel\n"
            "QLabel('after a report').show()\n"
            "print('shown')\n")
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          timeout=120, cwd=Path(__file__).parent.parent)
    assert proc.returncode == 0 and proc.stdout.strip() == "shown", proc.stderr[-500:]
