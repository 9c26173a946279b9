"""The report as one HTML source (no Qt here): the PDF and the HTML file both come from it.

Labels and units come from the engine's catalogue and ``gui.units``; a value the
rating did not compute reads "not computed", an input left empty "not given".
Images are referred to by name (``fig-<case>-<n>.png``); the writer supplies them
(embedded in the HTML file, as document resources for the PDF).
"""
from __future__ import annotations

import datetime as _dt
import hashlib
import html
import platform
import re
from dataclasses import dataclass, field
from pathlib import Path

from rating import __version__ as ebullio_version
from rating.catalogue import (GROUPS, INPUTS, SUMMARY, TYPE_TITLES, applies, case_to_draft,
                              get_value,
                              method_choices, vendor_label)
from rating.caution import CAUTION, SCOPE
from rating.vendor import TOLERANCE_BASIS, compare, describe, deviation_text, tolerance_text
from gui.units import SYSTEM_TITLES, format_number, number_text, unit_text
from gui.warning_text import warning_text

from .figures import case_figures, png, spread_figure, spread_reference

#: Summary keys that only a required duty gives a meaning to.
_DUTY_CHECK_KEYS = ("required_duty_W", "performance_duty_W", "required_area_m2",
                    "u_required_W_m2K", "over_design_pct", "over_surface_pct")



STYLE = """
body { font-size: 9pt; color: #000000; }
h1 { font-size: 15pt; margin-top: 0px; margin-bottom: 4px; }
h2 { font-size: 11.5pt; margin-top: 14px; margin-bottom: 4px; color: #0b3d66; }
h3 { font-size: 10pt; margin-top: 8px; margin-bottom: 2px; }
p { margin-top: 2px; margin-bottom: 4px; }
table { border-collapse: collapse; margin-bottom: 4px; }
th { background-color: #e8eef4; text-align: left; font-weight: bold; }
td.num { text-align: right; }
.caution { background-color: #fff4d6; border: 1px solid #c08a00; }
.small { font-size: 7.5pt; color: #333333; }
.verdict { font-size: 10.5pt; font-weight: bold; }
.optimistic { color: #a03800; font-weight: bold; }
.conservative { color: #005a8c; font-weight: bold; }
.error { color: #a03800; font-weight: bold; }
"""

TABLE_ATTRS = 'width="100%" border="1" cellspacing="0" cellpadding="3"'
BREAK = ' style="page-break-before: always"'
_KEEP = re.compile(r"\x00K(\d+)\x00")


def esc(text) -> str:
    return html.escape(str(text), quote=True)


@dataclass
class Table:
    """A table whose rows the PDF pager may move to the next page as a whole.

    ``head`` is the header row's cells (repeated on every page the table spans),
    ``rows`` the body rows' cells; both are HTML of ``<th>``/``<td>`` elements."""

    head: str
    rows: list
    attrs: str = TABLE_ATTRS

    def html(self, index: int, breaks, chunks: list) -> str:
        """The table, cut before each row in ``breaks`` into a new table on a new page."""
        cuts = [r for r in range(1, len(self.rows)) if ("row", index, r) in breaks]
        out = []
        for start, end in zip([0] + cuts, cuts + [len(self.rows)]):
            chunks.append((index, start))
            style = BREAK if start else ""
            out.append(f"<table {self.attrs}{style}>"
                       + (f"<thead><tr>{self.head}</tr></thead>" if self.head else "")
                       + "".join(f"<tr>{r}</tr>" for r in self.rows[start:end]) + "</table>")
        return "\n".join(out)


@dataclass
class Report:
    """The report's pieces (HTML text and tables) and the images it names.

    ``render(breaks)`` gives the HTML; the PDF pager adds breaks (before a table row,
    a heading or a figure) until no row, figure or heading is cut by a page end."""

    pieces: list = field(default_factory=list)
    images: dict = field(default_factory=dict)      # name -> PNG bytes
    case_names: list = field(default_factory=list)  # top-level headings, in order
    title: str = ""
    chunks: list = field(default_factory=list)      # (piece, first row) of each table rendered

    def add(self, piece) -> None:
        self.pieces.append(piece)

    def keep(self, tag: str, inner: str, attrs: str = "") -> None:
        """A heading or figure paragraph that must not end a page (or be cut by one)."""
        number = sum(p.count("\x00K") for p in self.pieces if isinstance(p, str))
        self.pieces.append(f"<{tag}{attrs}\x00K{number}\x00>{inner}</{tag}>")

    def render(self, breaks=frozenset()) -> str:
        self.chunks = []
        out = []
        for i, piece in enumerate(self.pieces):
            if isinstance(piece, Table):
                out.append(piece.html(i, breaks, self.chunks))
            else:
                out.append(_KEEP.sub(lambda m: BREAK if ("keep", int(m.group(1))) in breaks
                                     else "", piece))
        return "\n".join(out)

    @property
    def html(self) -> str:
        return self.render()


def sha256(path) -> str:
    digest = hashlib.sha256()
    with open(path, "rb") as fh:
        for block in iter(lambda: fh.read(1 << 16), b""):
            digest.update(block)
    return digest.hexdigest()


_num = number_text      # a value in display units, four significant figures
_unit = unit_text       # its unit, blank for a pure number


def rating_verdict(case, result, units: str) -> str:
    """The answer to the case's question: the window's one sentence, and where the
    findings are."""
    from ..verdict import verdict

    if result.status not in ("ok", "warnings"):
        return f"Not rated ({result.status}): {result.message}"
    errors = [w.code for w in result.warnings if w.severity == "error"]
    tail = (f" Error-severity findings: {', '.join(errors)}." if errors else "")
    tail += " The findings are listed below." if result.warnings else " No warnings."
    return verdict(result, units) + tail


def _key_figures(case, result, units: str) -> Table:
    s = result.summary
    rows = []
    keys = [k for k in SUMMARY if k in s] + [k for k in s if k not in SUMMARY]
    for key in keys:
        if key in _DUTY_CHECK_KEYS and case.required_duty is None and s.get(key) is None:
            continue
        f = SUMMARY.get(key)
        label = f.label if f else key.replace("_", " ")
        quantity = f.quantity if f else "dimensionless"
        value = s[key]
        if key == "dryout_z_m" and value is None and result.status in ("ok", "warnings"):
            text = "no dryout" if case.type != "kettle" else "not applicable"
        else:
            text = _num(value, quantity, units)
        numeric = isinstance(value, (int, float)) and not isinstance(value, bool)
        rows.append((label, text, _unit(quantity, units) if numeric else ""))
    half = (len(rows) + 1) // 2
    body = ["".join(f"<td>{esc(a)}</td><td class=\"num\">{esc(b)}</td><td>{esc(c)}</td>"
                    for a, b, c in (left, right))
            for left, right in zip(rows[:half], rows[half:] + [("", "", "")])]
    return Table('<th width="22%">Figure</th><th width="14%">Value</th><th width="14%">Unit</th>'
                 '<th width="22%">Figure</th><th width="14%">Value</th><th width="14%">Unit</th>',
                 body)


def _warnings(result, units: str):
    if not result.warnings:
        return "<p>No warnings.</p>"
    out = []
    for i, w in enumerate(result.warnings, 1):
        where = _num(w.z_m, "length", units) if w.z_m is not None else "whole unit"
        sev = f'<span class="error">{esc(w.severity)}</span>' if w.severity == "error" \
            else esc(w.severity)
        out.append(f"<td>W{i}</td><td>{sev}</td><td class=\"num\">{esc(where)}</td>"
                   f"<td>{esc(warning_text(w, units))} <span class=\"small\">({esc(w.code)})"
                   "</span></td>")
    return Table('<th width="6%">No.</th><th width="10%">Severity</th>'
                 f'<th width="14%">Position z [{esc(_unit("length", units))}]</th>'
                 "<th>Finding</th>", out)


_VENDOR_QUANTITY = {f.path.split(".", 1)[1]: f.quantity for f in INPUTS
                    if f.group == "vendor" and f.path.count(".") == 1}


def _vendor(comparison, units: str) -> list:
    if comparison is None:
        return ["<p>No vendor figures on this case.</p>"]
    out = []
    for r in comparison.rows:
        quantity = _VENDOR_QUANTITY[r.figure]
        verdict = esc(r.verdict)
        if r.verdict in ("optimistic", "conservative"):
            verdict = f'<span class="{r.verdict}">{verdict}</span>'
        note = f'<br/><span class="small">{esc(r.note)}</span>' if r.note else ""
        out.append(f"<td>{esc(vendor_label(r.figure))}</td><td>{esc(_unit(quantity, units))}</td>"
                   f"<td class=\"num\">{esc(_num(r.vendor, quantity, units))}</td>"
                   f"<td class=\"num\">{esc(_num(r.ebullio, quantity, units))}</td>"
                   f"<td class=\"num\">{esc(deviation_text(r))}</td>"
                   f"<td class=\"num\">{esc(tolerance_text(r))}</td>"
                   f"<td>{verdict}{note}</td>")
    stated = [r.figure for r in comparison.rows]
    basis = "<br/>".join(f"<b>{esc(vendor_label(f))}</b>: {esc(TOLERANCE_BASIS[f])}"
                         for f in stated)
    table = Table('<th width="22%">Figure</th><th width="10%">Unit</th>'
                  '<th width="10%">Vendor</th><th width="12%">Ebullio</th>'
                  '<th width="13%">Deviation</th><th width="11%">Tolerance</th>'
                  '<th width="22%">Verdict</th>', out)
    return [f"<p>{esc(comparison.source)}.</p>",
            f'<p class="verdict">{esc(describe(comparison))}</p>', table,
            f'<p class="small">Optimistic: the vendor\'s figure makes the unit look better '
               f"than Ebullio's rating of the same geometry by more than the tolerance; "
               f"conservative: worse by more than the tolerance. Basis of the tolerances "
               f"(editable per case):<br/>{basis}</p>"]


def _input_text(f, value, draft, units: str) -> tuple[str, str]:
    """(value, unit) of one input as the datasheet shows it."""
    if value is None:
        return "not given", ""
    if f.kind == "flag":
        return ("yes" if value else "no"), ""
    if f.kind == "fluid" and isinstance(value, dict):
        return f"user property table ({len(value.get('T', ()))} points)", ""
    if f.kind == "choice" and f.choices is None and isinstance(value, str):
        # a method: its title (a fixed list such as the tube form is shown as it is below)
        titles = {name: title for name, title, _ in method_choices(f.path, draft)}
        return titles.get(value, value), ""
    if f.kind in ("number", "integer") and not isinstance(value, bool):
        if f.quantity in ("count", "angle"):
            return format_number(value), _unit(f.quantity, units)
        return _num(value, f.quantity, units), _unit(f.quantity, units)
    return str(value).replace("_", " "), ""


def _datasheet(case, units: str, report: Report) -> None:
    draft = case_to_draft(case)
    for group, title in GROUPS:
        if group == "vendor":
            continue          # shown, with Ebullio's values beside them, in the comparison
        rows = [f for f in INPUTS if f.group == group and applies(f, draft)]
        if not rows:
            continue
        report.keep("h3", esc(title))
        body = []
        for f in rows:
            value, unit = _input_text(f, get_value(draft, f.path), draft, units)
            cls = ' class="num"' if f.kind in ("number", "integer") else ""
            body.append(f"<td>{esc(f.label)}</td><td{cls}>{esc(value)}</td><td>{esc(unit)}</td>")
        report.add(Table('<th width="50%">Input</th><th width="32%">Value</th>'
                         '<th width="18%">Unit</th>', body))


def _methods(result):
    if not result.methods:
        return "<p>No methods recorded (the case was not rated).</p>"
    return Table('<th width="18%">Use</th><th width="27%">Method</th><th>Reference</th>',
                 [f"<td>{esc(m.family.replace('_', ' '))}</td><td>{esc(m.title or m.name)}</td>"
                  f"<td>{esc(m.reference)}</td>" for m in result.methods])


def _coolprop_version() -> str:
    try:
        import CoolProp
        return CoolProp.__version__
    except Exception:  # the report still says which Ebullio made it
        return "unknown"


def provenance(project, source_path, units: str, when: _dt.datetime) -> list[tuple[str, str]]:
    rows = [("Ebullio", ebullio_version), ("CoolProp (properties)", _coolprop_version()),
            ("Python", platform.python_version()),
            ("Written", when.strftime("%Y-%m-%d %H:%M UTC")),
            ("Unit system", SYSTEM_TITLES[units])]
    if source_path is not None:
        rows += [("Input file", Path(source_path).name),
                 ("Input file SHA-256", sha256(source_path))]
    else:
        rows.append(("Input file", "not saved (rated from the desktop's open project)"))
    rows += [("Project revision", str(project.revision))]
    return rows


#: The engine's provenance of a result: the words the report gives each item; the
#: versions are the report's own rows and the methods have their own table.
_PROVENANCE = {"case_sha256": "inputs SHA-256 (the case as rated)", "rated_at": "rated at"}
_SHOWN_ELSEWHERE = {"ebullio_version", "coolprop_version", "methods"}


def _spread_section(rep: Report, i: int, spread, units: str) -> None:
    """The optional section: the case rated with every applicable method of one family.

    ``spread`` is a ``rating.studies.Spread``, or the reason (text) it was not computed."""
    if isinstance(spread, str):
        rep.keep("h2", "Spread between methods")
        rep.add(f"<p>Not computed: {esc(spread)}.</p>")
        return
    family = INPUT_LABELS.get(spread.path, spread.path)
    rep.keep("h2", f"Spread between methods: {esc(family.lower())}")
    rep.add(f"<p>The case rated once with each method of this family that applies to it "
            f"({len(spread.methods)}), everything else unchanged: how much of the answer "
            "rests on the choice of correlation.</p>")
    # a result no method computed (the over-design without a required duty) is left out
    keys = [k for k in spread.keys if any(v is not None for v in spread.values(k))]
    head = '<th width="30%">Method</th>' + "".join(
        f"<th>{esc(SUMMARY[k].label)}" + (f" [{esc(_unit(SUMMARY[k].quantity, units))}]"
                                          if _unit(SUMMARY[k].quantity, units) else "")
        + "</th>" for k in keys) + "<th>Status</th>"
    body = []
    for (name, title, _), point in zip(spread.methods, spread.points):
        own = " <b>(the case's)</b>" if name == spread.chosen else ""
        cells = "".join(f'<td class="num">{esc(_num(point.value(k), SUMMARY[k].quantity, units))}'
                        "</td>" for k in keys)
        status = point.status + (f": {point.message}" if point.message else "")
        body.append(f"<td>{esc(title)}{own}</td>{cells}<td>{esc(status)}</td>")
    spans = []
    for k in keys:
        r = spread.range(k)
        # a spread is a difference: no offset (a temperature difference in °C is in K)
        quantity = {"temperature": "temperature_difference"}.get(SUMMARY[k].quantity,
                                                                  SUMMARY[k].quantity)
        spans.append(f'<td class="num"><b>{esc(_num(r["spread"], quantity, units))}</b></td>')
    body.append("<td><b>Spread (highest − lowest)</b></td>" + "".join(spans) + "<td></td>")
    rep.add(Table(head, body))
    fig = spread_figure(spread)
    if fig is not None:
        name = f"fig-{i}-spread.png"
        rep.images[name] = png(fig)
        _, reference = spread_reference(spread)
        rep.keep("p", f'<img src="{name}" width="660"/><br/><span class="small">'
                      f"Figure {i}.S. Each method's results as a difference from {reference}, "
                      "in per cent of its value (the over-design, itself a percentage, is in "
                      "the table).</span>", ' align="center"')
    references = "; ".join(f"{title}: {ref}" for _, title, ref in spread.methods if ref)
    if references:
        rep.add(f'<p class="small">{esc(references)}</p>')


INPUT_LABELS = {f.path: f.label for f in INPUTS}


def build(project, cases, results, units: str, source_path=None, when=None,
          spreads=None) -> Report:
    """The report of ``cases`` (rated as ``results``) in the unit system ``units``.

    ``spreads``, when given, has one item per case: a ``rating.studies.Spread`` (a
    section with its table and figure), the reason it was not computed, or None."""
    when = when or _dt.datetime.now(_dt.timezone.utc)
    title = project.title or (Path(source_path).stem if source_path else "Ebullio project")
    comparisons = [compare(c, r) for c, r in zip(cases, results)]
    rep = Report(title=title, case_names=["Summary"] + [c.name for c in cases] + ["Provenance"])
    rep.add(f"<html><head><meta charset=\"utf-8\"/><title>{esc(title)}: rating report</title>"
            f"<style>{STYLE}</style></head><body>")
    # --- first page: what this is, the caution, the cases at a glance
    rep.add("<h1>Rating report</h1>")
    rep.add(f"<p><b>{esc(title)}</b><br/>Written {when.strftime('%Y-%m-%d %H:%M UTC')} by "
            f"Ebullio {esc(ebullio_version)}; units: {esc(SYSTEM_TITLES[units])}"
            + (f"; from {esc(Path(source_path).name)}" if source_path else "") + "</p>")
    rep.add(Table("", [f'<td class="caution"><b>Caution.</b> {esc(CAUTION)} '
                       f"{esc(SCOPE)}</td>"],
                  'width="100%" border="1" cellspacing="0" cellpadding="6" class="caution"'))
    if project.notes:
        rep.add(f"<p>{esc(project.notes)}</p>")
    rep.keep("h2", "Cases")
    glance = []
    for case, result, cmp in zip(cases, results, comparisons):
        vend = f"{cmp.verdict} ({vendor_label(cmp.deciding)})" if cmp and cmp.deciding else \
            (cmp.verdict if cmp else "none")
        glance.append(f"<td>{esc(case.name)}</td><td>{esc(TYPE_TITLES.get(case.type, case.type).capitalize())}"
                      f"</td><td>{esc(rating_verdict(case, result, units))}</td><td>{esc(vend)}</td>")
    rep.add(Table('<th width="26%">Case</th><th width="17%">Type</th><th width="39%">Verdict</th>'
                  '<th width="18%">Vendor\'s figures</th>', glance))
    # --- one section per case
    for i, (case, result, cmp) in enumerate(zip(cases, results, comparisons), 1):
        rep.add(f"<h1{BREAK}>{esc(case.name)}</h1>")
        question = "area for duty" if case.question == "area_for_duty" else "performance"
        rep.add(f"<p>{esc(TYPE_TITLES.get(case.type, case.type).capitalize())}; question: {question}; "
                f"status: {esc(result.status)}</p>")
        rep.keep("h2", "Verdict")
        rep.add(f'<p class="verdict">{esc(rating_verdict(case, result, units))}</p>')
        if cmp is not None:
            rep.add(f"<p>Vendor's figures: {esc(describe(cmp))}</p>")
        rep.keep("h2", "Key figures")
        rep.add(_key_figures(case, result, units))
        rep.keep("h2", "Warnings")
        rep.add(_warnings(result, units))
        rep.keep("h2", "Vendor's figures against the rating")
        for piece in _vendor(cmp, units):
            rep.add(piece)
        figures = case_figures(case, result, units)
        if figures:
            rep.keep("h2", "Figures")
        for n, (caption, data) in enumerate(figures, 1):
            name = f"fig-{i}-{n}.png"
            rep.images[name] = data
            rep.keep("p", f'<img src="{name}" width="660"/><br/><span class="small">'
                          f"Figure {i}.{n}. {caption}</span>", ' align="center"')
        if spreads is not None and spreads[i - 1] is not None:
            _spread_section(rep, i, spreads[i - 1], units)
        rep.keep("h2", "Inputs")
        _datasheet(case, units, rep)
        rep.keep("h2", "Methods and references")
        rep.add(_methods(result))
    # --- provenance
    rep.add(f"<h1{BREAK}>Provenance</h1>")
    items = provenance(project, source_path, units, when)
    for case, result in zip(cases, results):      # what the engine records of each rating
        extra = getattr(result, "provenance", None)
        if isinstance(extra, dict):
            items += [(f"{case.name}: {_PROVENANCE.get(key, key.replace('_', ' '))}",
                       ", ".join(map(str, value)) if isinstance(value, (list, tuple)) else str(value))
                      for key, value in extra.items() if key not in _SHOWN_ELSEWHERE]
    rep.add(Table('<th width="30%">Item</th><th>Value</th>',
                  [f"<td>{esc(item)}</td><td>{esc(value)}</td>" for item, value in items]))
    rep.add(f'<p class="small"><b>Caution.</b> {esc(CAUTION)}</p>')
    rep.add("</body></html>")
    return rep
