"""A vendor's stated figures for a case, set beside Ebullio's rating of the same case.

A buyer holding a proposal asks whether its numbers are believable for this
geometry. ``VendorFigures`` (``Case.vendor``) holds any subset of what a datasheet
states; ``compare(case, result)`` puts each stated figure beside Ebullio's value,
gives the deviation and a verdict in plain words, and one overall verdict with the
row that decides it:

* **optimistic**: the vendor's figure makes the exchanger look better than Ebullio's
  rating by more than the row's tolerance (more duty, area or U; less pressure drop;
  ...);
* **conservative**: it makes the exchanger look worse by more than the tolerance;
* **consistent**: within the tolerance either way;
* **not comparable**: the case does not compute that figure (over-design outside a
  area-for-duty question, circulation outside a thermosiphon, the steam-side pressure drop of
  shell-side steam, a rating that failed).

The overall verdict is optimistic if any row is (a buyer's first concern), else
conservative if any row is, else consistent; the deciding row is the one farthest
beyond (or, when all are consistent, closest to) its tolerance.

Tolerances are editable per case (``VendorTolerances``); the defaults and their
basis are in ``TOLERANCE_BASIS``. Values are SI, like the rest of the case.
"""
from __future__ import annotations

from dataclasses import dataclass, field, fields

VERDICTS = ("consistent", "optimistic", "conservative", "not comparable")


@dataclass(frozen=True)
class VendorTolerances:
    """How far a vendor's figure may stray from Ebullio's and still be called consistent.

    Percent of Ebullio's value, except ``over_design`` (percentage points) and
    ``exit_quality`` (absolute vapour quality). Basis of each default:
    ``TOLERANCE_BASIS``.
    """

    duty: float = 10.0
    area: float = 5.0
    u_clean: float = 25.0
    u_service: float = 15.0
    over_design: float = 10.0
    pressure_drop_boiling: float = 30.0
    pressure_drop_heating: float = 30.0
    exit_quality: float = 0.05
    circulation_rate: float = 20.0
    circulation_ratio: float = 20.0
    max_heat_flux: float = 20.0
    heating_flow: float = 10.0

    def __post_init__(self):
        from .validation import check_vendor_tolerances
        check_vendor_tolerances(self)


@dataclass(frozen=True)
class VendorFigures:
    """What a vendor's proposal states for this case (SI); None = not stated.

    ``source`` names the proposal (vendor, document, revision). ``duty`` [W];
    ``area`` outside heat-transfer area [m^2]; ``u_clean`` and ``u_service`` overall
    coefficients on the outside area [W/m^2/K]; ``over_design`` [%];
    ``pressure_drop_boiling`` and ``pressure_drop_heating`` [Pa];
    ``exit_quality`` vapour mass fraction leaving the heated length [-];
    ``circulation_rate`` [kg/s] and ``circulation_ratio`` [-] of a thermosiphon;
    ``max_heat_flux`` the largest local heat flux the unit runs at [W/m^2];
    ``heating_flow`` steam or heating-medium flow [kg/s].
    """

    source: str
    duty: float | None = None
    area: float | None = None
    u_clean: float | None = None
    u_service: float | None = None
    over_design: float | None = None
    pressure_drop_boiling: float | None = None
    pressure_drop_heating: float | None = None
    exit_quality: float | None = None
    circulation_rate: float | None = None
    circulation_ratio: float | None = None
    max_heat_flux: float | None = None
    heating_flow: float | None = None
    tolerances: VendorTolerances = field(default_factory=VendorTolerances)

    def __post_init__(self):
        from .validation import check_vendor
        check_vendor(self)

    def stated(self) -> tuple[str, ...]:
        """Names of the figures the vendor states, in datasheet order."""
        return tuple(f for f in FIGURES if getattr(self, f) is not None)


#: The figures in datasheet order (fields of VendorFigures that hold a number).
FIGURES = tuple(f.name for f in fields(VendorFigures) if f.name not in ("source", "tolerances"))

#: Basis of each default tolerance, shown beside it.
TOLERANCE_BASIS = {
    "duty": "Two competent ratings of one geometry usually agree on duty within about "
            "10 %: the duty moves less than the film coefficients behind it (common practice)",
    "area": "Same tubes: differences come from what is counted (U-bends, tubesheet "
            "thickness, gross or effective length) (common practice)",
    "u_clean": "Published flow- and pool-boiling correlations scatter by about 20-30 % "
               "against their databanks (Gungor & Winterton 1986 report a mean deviation of "
               "about 21 % for saturated boiling, from memory)",
    "u_service": "Fouling resistances, stated alike on both sides of the comparison, damp the "
                 "film-coefficient scatter in the service U (common practice)",
    "over_design": "Percentage points; follows from the U and area bands above "
                   "(common practice)",
    "pressure_drop_boiling": "Two-phase pressure-drop methods scatter by some 30-40 % against "
                             "data (Friedel 1979; Mueller-Steinhagen & Heck 1986; spreads "
                             "from memory)",
    "pressure_drop_heating": "Single-phase shell-side and in-tube pressure-drop methods "
                             "agree within about 30 % for a well-described bundle "
                             "(common practice)",
    "exit_quality": "Absolute vapour quality; about the change a 10 % duty difference makes "
                    "at an exit quality near 0.5 (common practice)",
    "circulation_rate": "Thermosiphon circulation follows from the two-phase pressure drop "
                        "and void fraction of tubes and return line; their method spread is "
                        "about 20 % (common practice)",
    "circulation_ratio": "As the circulation rate (common practice)",
    "max_heat_flux": "The local flux follows the boiling-coefficient method; 20 % is about "
                     "the spread between published methods (common practice)",
    "heating_flow": "Steam flow follows from duty and latent heat, so it carries the duty's "
                    "band; a liquid's flow is the case's own input (common practice)",
}


@dataclass(frozen=True)
class _Row:
    figure: str
    key: str | None         # the result's summary key, None when taken from the case
    better: str             # "higher" or "lower": the direction that flatters the exchanger
    band: str               # "percent", "points" or "absolute"


_ROWS = {r.figure: r for r in (
    _Row("duty", "duty_W", "higher", "percent"),
    _Row("area", "area_m2", "higher", "percent"),
    _Row("u_clean", "u_clean_W_m2K", "higher", "percent"),
    _Row("u_service", "u_service_W_m2K", "higher", "percent"),
    _Row("over_design", "over_design_pct", "higher", "points"),
    _Row("pressure_drop_boiling", "pressure_drop_boiling_Pa", "lower", "percent"),
    _Row("pressure_drop_heating", "pressure_drop_heating_Pa", "lower", "percent"),
    _Row("exit_quality", "exit_quality", "higher", "absolute"),
    _Row("circulation_rate", "circulation_kg_s", "higher", "percent"),
    _Row("circulation_ratio", "circulation_ratio", "higher", "percent"),
    _Row("max_heat_flux", "max_heat_flux_W_m2", "lower", "percent"),
    _Row("heating_flow", "steam_flow_kg_s", "lower", "percent"),
)}
assert tuple(_ROWS) == FIGURES

#: Unit of each band kind, as the comparison states the deviation.
BAND_UNITS = {"percent": "%", "points": "points", "absolute": "-"}


@dataclass(frozen=True)
class ComparedFigure:
    """One row of the comparison (SI values; ``deviation`` in ``deviation_unit``)."""

    figure: str
    key: str | None
    vendor: float
    ebullio: float | None
    deviation: float | None
    deviation_unit: str
    tolerance: float
    verdict: str
    note: str = ""

    @property
    def excess(self) -> float | None:
        """|deviation| / tolerance: above 1 the row is flagged."""
        if self.deviation is None:
            return None
        return abs(self.deviation) / self.tolerance

    def to_dict(self) -> dict:
        return {"figure": self.figure, "key": self.key, "vendor": self.vendor,
                "ebullio": self.ebullio, "deviation": self.deviation,
                "deviation_unit": self.deviation_unit, "tolerance": self.tolerance,
                "verdict": self.verdict, "note": self.note}


@dataclass(frozen=True)
class VendorComparison:
    """Every stated figure beside Ebullio's, and the overall verdict with its deciding row."""

    source: str
    rows: tuple[ComparedFigure, ...]
    verdict: str
    deciding: str | None      # the figure that decides the overall verdict

    def row(self, figure: str) -> ComparedFigure:
        for r in self.rows:
            if r.figure == figure:
                return r
        raise KeyError(f"the vendor states no {figure}")

    def to_dict(self) -> dict:
        return {"source": self.source, "verdict": self.verdict, "deciding": self.deciding,
                "rows": [r.to_dict() for r in self.rows]}


def _ebullio_value(row: _Row, case, result) -> tuple[float | None, str]:
    """Ebullio's value of a row for this case and result, or None with the reason."""
    if result.status not in ("ok", "warnings"):
        return None, f"the case was not rated ({result.status}: {result.message})"
    if row.figure == "duty" and case.required_duty is not None \
            and (result.summary.get("over_design_pct") or -1.0) >= 0.0:
        # A vendor sells the required duty; the margin beyond it is the over-design row.
        return case.required_duty, "the required duty, which this geometry delivers"
    if row.figure in ("circulation_rate", "circulation_ratio") and case.type != "thermosiphon":
        return None, "only a thermosiphon finds its own circulation"
    if row.figure == "heating_flow" and case.heating.kind != "steam":
        return case.heating.mass_flow, "Ebullio's value is the case's own input"
    value = result.summary.get(row.key)
    if value is None:
        if row.figure == "over_design":
            return None, "over-design needs a required duty (the area-for-duty question)"
        if row.figure == "pressure_drop_heating" and case.heating.kind == "steam":
            return None, "the pressure drop of condensing steam on the shell side is not computed"
        return None, "not computed for this case"
    return float(value), ""


def _better(row: _Row, case) -> str:
    # A thermosiphon that claims a lower exit quality claims more circulation: flattering.
    if row.figure == "exit_quality" and case.type == "thermosiphon":
        return "lower"
    return row.better


def compare(case, result) -> VendorComparison | None:
    """The vendor comparison of one rated case, or None when the case has no vendor figures."""
    figures = getattr(case, "vendor", None)
    if figures is None:
        return None
    rows = []
    for name in figures.stated():
        row = _ROWS[name]
        vendor = float(getattr(figures, name))
        tolerance = float(getattr(figures.tolerances, name))
        ebullio, note = _ebullio_value(row, case, result)
        if ebullio is None:
            deviation, verdict = None, "not comparable"
        else:
            if row.band == "percent":
                deviation = (vendor / ebullio - 1.0) * 100.0 if ebullio != 0.0 else None
            else:
                deviation = vendor - ebullio
            if deviation is None:
                verdict, note = "not comparable", "Ebullio's value is zero"
            elif abs(deviation) <= tolerance * (1.0 + 1e-9):   # on the band's edge: within
                verdict = "consistent"
            else:
                flatters = (deviation > 0) == (_better(row, case) == "higher")
                verdict = "optimistic" if flatters else "conservative"
        rows.append(ComparedFigure(name, row.key, vendor, ebullio, deviation,
                                   BAND_UNITS[row.band], tolerance, verdict, note))
    verdict, deciding = _overall(rows)
    return VendorComparison(figures.source, tuple(rows), verdict, deciding)


def _overall(rows) -> tuple[str, str | None]:
    for verdict in ("optimistic", "conservative", "consistent"):
        flagged = [r for r in rows if r.verdict == verdict]
        if flagged:
            return verdict, max(flagged, key=lambda r: r.excess).figure
    return "not comparable", None


def describe(comparison: VendorComparison, label=None) -> str:
    """The overall verdict in one sentence, naming the deciding row.

    ``label`` turns a figure name into the words a surface shows (default: the
    catalogue's label).
    """
    if label is None:
        from .catalogue import vendor_label as label
    if comparison.deciding is None:
        return "Not comparable: this case computes none of the figures the vendor states."
    r = comparison.row(comparison.deciding)
    dev = _deviation_text(r)
    if comparison.verdict == "consistent":
        return (f"Consistent: every comparable figure is within its tolerance; the closest to "
                f"its limit is {label(r.figure)} ({dev}).")
    return f"{comparison.verdict.capitalize()}, decided by {label(r.figure)} ({dev})."


def _deviation_text(r: ComparedFigure) -> str:
    if r.deviation_unit == "%":
        return f"{r.deviation:+.1f} % against Ebullio, tolerance {r.tolerance:g} %"
    if r.deviation_unit == "points":
        return f"{r.deviation:+.1f} points against Ebullio, tolerance {r.tolerance:g} points"
    return f"{r.deviation:+.3f} against Ebullio, tolerance {r.tolerance:g}"


_BAND_WORDS = {"%": " %", "points": " points", "-": ""}


def tolerance_text(r: ComparedFigure) -> str:
    """The tolerance of one row as the comparison tables show it ("±10 %", "±0.05")."""
    return f"±{r.tolerance:g}{_BAND_WORDS[r.deviation_unit]}"


def deviation_text(r: ComparedFigure) -> str:
    """The deviation of one row as the comparison tables show it ("not comparable" if none)."""
    if r.deviation is None:
        return "not comparable"
    unit = _BAND_WORDS[r.deviation_unit]
    places = 3 if r.deviation_unit == "-" else 1
    shown = round(r.deviation, places) + 0.0          # no "-0.000" for a deviation that rounds to 0
    return f"{shown:+.{places}f}{unit}"
