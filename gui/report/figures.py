"""The report's plots: matplotlib Figures (no pyplot) rendered to PNG bytes.

Every along-the-tube panel has the heated length on its horizontal axis, shares it
with the other panels, shades the regimes as light bands and marks each warning's
position with a numbered vertical line (the numbers of the report's warning table).
Colours are the Okabe-Ito palette (Okabe & Ito 2008, "Color Universal Design"), with
line styles as well for the lines that matter most. Axes are labelled in the
report's unit system.
"""
from __future__ import annotations

import io
import math
import textwrap

from matplotlib.figure import Figure
from matplotlib.patches import Circle, Patch

from rating.catalogue import PROFILES, SUMMARY
from gui.style import OKABE_ITO, REGIME_FILL as REGIME_COLOURS
from gui.units import to_display, unit_label

# The window's colours (gui.style), so that a report's plot reads like the window's:
# the Okabe-Ito palette, and the same tint for each regime (a kettle's pool boiling too).
BLACK, ORANGE, SKY, GREEN, YELLOW, BLUE, VERMILLION, PURPLE = (
    OKABE_ITO[c] for c in ("black", "orange", "sky", "green", "yellow", "blue", "vermillion",
                           "purple"))

WIDTH_IN = 7.0          # the text width of an A4 page with 15 mm margins, about 180 mm
DPI = 150               # about 150 dpi at the printed width: sharp, and quick to draw
FONT_PT = 9.5


def _figure(height_in: float, **margins) -> Figure:
    """A figure with fixed margins (inches): quicker to draw than an automatic layout."""
    fig = Figure(figsize=(WIDTH_IN, height_in), dpi=DPI)
    m = {"left": 0.75, "right": 0.15, "top": 0.15, "bottom": 0.55, "wspace": 0.3, "hspace": 0.15}
    m.update(margins)
    fig.subplots_adjust(left=m["left"] / WIDTH_IN, right=1 - m["right"] / WIDTH_IN,
                        top=1 - m["top"] / height_in, bottom=m["bottom"] / height_in,
                        wspace=m["wspace"], hspace=m["hspace"])
    return fig


def png(fig: Figure) -> bytes:
    """The figure as PNG bytes."""
    buf = io.BytesIO()
    fig.savefig(buf, format="png", dpi=DPI, facecolor="white")
    return buf.getvalue()


def _series(result, key: str, units: str) -> list[float]:
    """A profile in display units; not computed is NaN (a gap, never a zero)."""
    quantity = PROFILES[key].quantity
    out = []
    for v in result.profiles.get(key, ()):
        d = to_display(v, quantity, units) if v is not None else None
        out.append(float("nan") if d is None or not math.isfinite(d) else d)
    return out


def _axis_label(key: str, units: str, label: str | None = None) -> str:
    field = PROFILES.get(key) or SUMMARY[key]
    unit = unit_label(field.quantity, units)
    text = label or field.label
    return f"{text} [{unit}]" if unit and unit != "–" else f"{text} [–]"


def _style(ax):
    ax.grid(True, color="#d0d0d0", linewidth=0.5)
    ax.tick_params(labelsize=FONT_PT - 1)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)


def _bands_and_markers(ax, z, result, warnings_z, show_labels: bool):
    """Regime bands (light) and the numbered warning positions on one panel."""
    regimes = result.profiles.get("regime") or ()
    if regimes and len(regimes) == len(z):
        start = 0
        for i in range(1, len(z) + 1):
            if i == len(z) or regimes[i] != regimes[start]:
                colour = REGIME_COLOURS.get(regimes[start])
                if colour and z[min(i, len(z) - 1)] > z[start]:
                    ax.axvspan(z[start], z[min(i, len(z) - 1)], color=colour, zorder=0,
                               linewidth=0)
                start = i
    for number, zw in warnings_z:
        ax.axvline(zw, color=VERMILLION, linestyle=(0, (1, 1.5)), linewidth=1.0, zorder=3)
        if show_labels:
            ax.annotate(f"W{number}", xy=(zw, 1.0), xycoords=("data", "axes fraction"),
                        xytext=(2, -2), textcoords="offset points", va="top",
                        fontsize=FONT_PT - 1.5, color=VERMILLION)


def _regime_handles(result) -> list:
    seen = []
    for r in result.profiles.get("regime") or ():
        if r in REGIME_COLOURS and r not in seen:
            seen.append(r)
    return [Patch(facecolor=REGIME_COLOURS[r], edgecolor="#999999", linewidth=0.4, label=r)
            for r in seen]


def warning_positions(result, units: str) -> list[tuple[int, float]]:
    """(number in the report's warning table, position in display units) of placed warnings."""
    return [(i, to_display(w.z_m, "length", units)) for i, w in enumerate(result.warnings, 1)
            if w.z_m is not None]


def temperature_figure(result, units: str) -> Figure | None:
    """Heating medium, walls, process fluid and saturation along the heated length."""
    if not result.profiles.get("z_m"):
        return None
    z = _series(result, "z_m", units)
    fig = _figure(3.9, bottom=1.15)
    ax = fig.add_subplot()
    lines = (("t_heating_K", VERMILLION, "-", 1.8), ("t_wall_outer_K", ORANGE, "--", 1.4),
             ("t_wall_inner_K", PURPLE, "-.", 1.4), ("t_process_K", BLUE, "-", 1.8),
             ("t_sat_K", BLACK, ":", 1.4))
    for key, colour, style, width in lines:
        if key in result.profiles:
            ax.plot(z, _series(result, key, units), color=colour, linestyle=style,
                    linewidth=width, label=PROFILES[key].label)
    _bands_and_markers(ax, z, result, warning_positions(result, units), True)
    ax.set_xlabel(_axis_label("z_m", units), fontsize=FONT_PT)
    ax.set_ylabel(f"Temperature [{unit_label('temperature', units)}]", fontsize=FONT_PT)
    _style(ax)
    handles, _ = ax.get_legend_handles_labels()
    fig.legend(handles=handles + _regime_handles(result), loc="lower center",
               ncols=3, fontsize=FONT_PT - 1.5, frameon=False)
    return fig


def profile_figure(result, units: str) -> Figure | None:
    """Four panels sharing the heated length: flux, quality, coefficients, pressure."""
    if not result.profiles.get("z_m"):
        return None
    z = _series(result, "z_m", units)
    fig = _figure(6.4, left=0.8, bottom=0.5, wspace=0.32, hspace=0.08)
    axes = fig.subplots(2, 2, sharex=True)
    panels = (
        (axes[0, 0], "Heat flux", "heat_flux",
         (("heat_flux_W_m2", BLUE, "-"), ("critical_heat_flux_W_m2", VERMILLION, "--"))),
        (axes[0, 1], "Vapour quality, void fraction", "fraction",
         (("quality", BLUE, "-"), ("void_fraction", GREEN, "--"))),
        (axes[1, 0], "Coefficient", "htc",
         (("htc_boiling_W_m2K", BLUE, "-"), ("htc_heating_W_m2K", VERMILLION, "--"),
          ("u_service_W_m2K", BLACK, ":"))),
        (axes[1, 1], "Pressure", "pressure", (("p_Pa", BLUE, "-"),)),
    )
    marks = warning_positions(result, units)
    # A critical flux far above the local flux (subcooled liquid) flattens the flux line:
    # a logarithmic axis keeps both readable.
    q = [v for v in _series(result, "heat_flux_W_m2", units) if math.isfinite(v) and v > 0]
    q_chf = [v for v in _series(result, "critical_heat_flux_W_m2", units) if math.isfinite(v)]
    if q and q_chf and max(q_chf) > 5.0 * max(q):
        axes[0, 0].set_yscale("log")
    for ax, title, quantity, keys in panels:
        for key, colour, style in keys:
            if key in result.profiles:
                ys = _series(result, key, units)
                if any(math.isfinite(y) for y in ys):
                    ax.plot(z, ys, color=colour, linestyle=style, linewidth=1.5,
                            label=PROFILES[key].label)
        _bands_and_markers(ax, z, result, marks, ax is axes[0, 0])
        unit = unit_label(quantity, units)
        ax.set_ylabel(f"{title} [{unit}]" if unit != "–" else f"{title} [–]", fontsize=FONT_PT)
        _style(ax)
        if ax.get_legend_handles_labels()[0]:
            ax.legend(fontsize=FONT_PT - 2, frameon=False, loc="best")
    for ax in axes[1]:
        ax.set_xlabel(_axis_label("z_m", units), fontsize=FONT_PT)
    return fig


def thermosiphon_figure(result, units: str) -> Figure | None:
    """The loop's pressure balance: available head and required pressure drop against
    the circulation, with every balance found (filled: stable, open: unstable)."""
    curve = result.extra.get("pressure_balance_curve") if result.extra else None
    if not curve or not curve.get("circulation_kg_s"):
        return None
    w = [to_display(v, "mass_flow", units) for v in curve["circulation_kg_s"]]
    dp = lambda values: [float("nan") if v is None else to_display(v, "pressure_difference",
                                                                      units) for v in values]
    fig = _figure(3.8)
    ax = fig.add_subplot()
    ax.plot(w, dp(curve["available_Pa"]), color=BLUE, linewidth=1.8,
            label="Available head (column liquid)")
    ax.plot(w, dp(curve["required_Pa"]), color=VERMILLION, linestyle="--", linewidth=1.8,
            label="Required: lines, tubes and fittings")
    for point in curve.get("operating_points", ()):
        x = to_display(point["circulation_kg_s"], "mass_flow", units)
        y = to_display(point["available_Pa"], "pressure_difference", units)
        stable = point.get("stable")
        ax.plot([x], [y], marker="o", markersize=7, color=BLACK,
                markerfacecolor=BLACK if stable else "white", linestyle="none",
                label="Balance, stable" if stable else "Balance, unstable")
        if point.get("selected"):
            ax.annotate("operating point", xy=(x, y), xytext=(8, 8), textcoords="offset points",
                        fontsize=FONT_PT - 1)
    ax.set_xlabel(f"Circulation [{unit_label('mass_flow', units)}]", fontsize=FONT_PT)
    ax.set_ylabel(f"Pressure difference [{unit_label('pressure_difference', units)}]",
                  fontsize=FONT_PT)
    _style(ax)
    handles, labels = ax.get_legend_handles_labels()
    unique = dict(zip(labels, handles))
    ax.legend(unique.values(), unique.keys(), fontsize=FONT_PT - 1.5, frameon=False)
    return fig


def kettle_figure(case, result, units: str) -> Figure | None:
    """The kettle's cross-section (shells, bundle, weir, liquid level, the smallest
    kettle for the surface-velocity limit) and the local flux against the bundle limit."""
    k = case.kettle
    s = result.summary
    if k is None:
        return None
    fig = _figure(4.0, bottom=1.0, wspace=0.3)
    left, right = fig.subplots(1, 2, width_ratios=(1, 1.5))
    length = lambda v: to_display(v, "length", units)
    r_kettle = length(k.kettle_diameter) / 2
    r_port = length(k.port_diameter) / 2
    r_bundle = length(k.bundle_diameter) / 2
    # Shells bottom-aligned at height 0 (eccentric cone), bundle centred in the port shell.
    left.add_patch(Circle((0, r_kettle), r_kettle, fill=False, color=BLACK, linewidth=1.5,
                          label="Kettle shell"))
    left.add_patch(Circle((0, r_port), r_port, fill=False, color=BLACK, linestyle="--",
                          linewidth=1.0, label="Port shell"))
    left.add_patch(Circle((0, r_port), r_bundle, color=ORANGE, alpha=0.45, linewidth=0,
                          label="Bundle"))
    weir = length(k.weir_height)
    half = lambda h: math.sqrt(max(r_kettle ** 2 - (h - r_kettle) ** 2, 0.0))
    left.plot([-half(weir), half(weir)], [weir, weir], color=BLUE, linewidth=1.2,
              linestyle=":", label="Weir crest")
    if s.get("liquid_level_over_bundle_m") is not None:
        level = length(k.bundle_top + s["liquid_level_over_bundle_m"])
        left.plot([-half(level), half(level)], [level, level], color=BLUE, linewidth=1.8,
                  label="Liquid level")
    if s.get("min_kettle_diameter_m"):
        r_min = length(s["min_kettle_diameter_m"]) / 2
        left.add_patch(Circle((0, r_min), r_min, fill=False, color=VERMILLION, linestyle="-.",
                              linewidth=1.0, label="Smallest kettle for the vapour limit"))
    extent = max(r_kettle, r_min if s.get("min_kettle_diameter_m") else 0.0) * 1.08
    left.set_xlim(-extent, extent)
    left.set_ylim(-0.04 * extent, 2 * extent)
    left.set_aspect("equal")
    left.set_xlabel(f"Width [{unit_label('length', units)}]", fontsize=FONT_PT)
    left.set_ylabel(f"Height [{unit_label('length', units)}]", fontsize=FONT_PT)
    _style(left)
    left.legend(fontsize=FONT_PT - 1.5, frameon=False, loc="upper left",
                bbox_to_anchor=(-0.25, -0.2), ncols=2)
    z = _series(result, "z_m", units)
    right.plot(z, _series(result, "heat_flux_W_m2", units), color=BLUE, linewidth=1.6,
               label="Local heat flux (outside)")
    if s.get("bundle_max_heat_flux_W_m2"):
        q_max = to_display(s["bundle_max_heat_flux_W_m2"], "heat_flux", units)
        right.axhline(q_max, color=VERMILLION, linestyle="--", linewidth=1.4,
                      label=SUMMARY["bundle_max_heat_flux_W_m2"].label)
        if case.limits.kettle_bundle_flux_ratio != 1.0:
            right.axhline(q_max * case.limits.kettle_bundle_flux_ratio, color=VERMILLION,
                          linestyle=":", linewidth=1.0, label="Limit in use")
    passes = result.profiles.get("tube_pass") or ()
    for i in range(1, len(passes)):
        if passes[i] != passes[i - 1]:
            right.axvline(z[i], color="#999999", linewidth=0.6)
    _bands_and_markers(right, z, result, warning_positions(result, units), True)
    right.set_xlabel(f"Tube-side path [{unit_label('length', units)}]", fontsize=FONT_PT)
    right.set_ylabel(f"Heat flux [{unit_label('heat_flux', units)}]", fontsize=FONT_PT)
    right.set_ylim(bottom=0)
    _style(right)
    right.legend(fontsize=FONT_PT - 2, frameon=False, loc="lower right")
    return fig


def case_figures(case, result, units: str) -> list[tuple[str, bytes]]:
    """(caption, PNG) of every figure of one rated case, in report order."""
    out = []
    made = (
        ("Temperatures along the heated length; shaded: regimes; W<i>n</i>: warning n.",
         temperature_figure(result, units)),
        ("Profiles along the heated length.", profile_figure(result, units)),
    )
    if case.type == "thermosiphon":
        made += (("Pressure balance of the circulation loop.",
                  thermosiphon_figure(result, units)),)
    if case.type == "kettle":
        made += (("Kettle cross-section (left) and the local heat flux along the tube-side "
                  "path against the bundle's maximum heat flux (right; grey lines: passes).",
                  kettle_figure(case, result, units)),)
    for caption, fig in made:
        if fig is not None:
            out.append((caption, png(fig)))
    return out


#: Results the spread figure compares as a share of the reference method's value (the
#: over-design is itself a percentage: its difference, in points, is in the table).
SPREAD_PLOTTED = (("duty_W", BLUE, "o"), ("exit_quality", GREEN, "s"),
                  ("circulation_kg_s", PURPLE, "^"), ("max_chf_ratio", VERMILLION, "D"))


def spread_reference(spread) -> tuple[int | None, str]:
    """The row the spread figure measures from: the case's own method when it rated, else
    none (each result then against the mean of the methods that rated)."""
    names = [m[0] for m in spread.methods]
    if spread.chosen in names and spread.points[names.index(spread.chosen)].rated:
        return names.index(spread.chosen), "the case's own method"
    return None, "the mean of the methods that rated"


def spread_figure(spread) -> Figure | None:
    """Each method's results as a difference from the reference method's, in per cent of
    it: one row per method, one marker per result. None when fewer than two rated."""
    if sum(p.rated for p in spread.points) < 2:
        return None
    ref, _ = spread_reference(spread)
    titles = [t for _, t, _ in spread.methods]
    rows = len(titles)
    height = 1.2 + 0.32 * rows
    fig = _figure(height, left=2.5, right=0.15, top=0.12, bottom=1.05)
    ax = fig.subplots()
    _style(ax)
    ax.grid(True, axis="y", color="#eeeeee")
    ypos = list(range(rows))[::-1]
    shown = []
    for key, colour, marker in SPREAD_PLOTTED:
        if key not in spread.keys:
            continue
        values = spread.values(key)
        rated = [v for v in values if v is not None]
        base = values[ref] if ref is not None else (sum(rated) / len(rated) if rated else None)
        if not base:
            continue
        xs = [100.0 * (v - base) / abs(base) if v is not None else math.nan for v in values]
        # each result a little above or below the row's line, so equal values stay visible
        dodge = 0.12 * (len(shown) - 1.5)
        ax.plot(xs, [y - dodge for y in ypos], ls="none", marker=marker, ms=6, color=colour, alpha=0.9,
                label=SUMMARY[key].label)
        shown.append(key)
    if not shown:
        return None
    ax.axvline(0.0, color=BLACK, lw=0.8)
    ax.set_yticks(ypos)
    # long titles on two lines: the left margin holds about 34 characters
    ax.set_yticklabels([textwrap.fill(t + (" (the case's)" if m[0] == spread.chosen else ""),
                                      34) for t, m in zip(titles, spread.methods)],
                       fontsize=FONT_PT - 1, linespacing=0.95)
    ax.set_ylim(-0.6, rows - 0.4)
    lo, hi = ax.get_xlim()
    span = max(abs(lo), abs(hi), 1.0)
    ax.set_xlim(-1.1 * span, 1.1 * span)
    ax.set_xlabel("Difference from the reference method [% of its value]", fontsize=FONT_PT)
    # under the axis label, two to a row (the labels are long), in the figure's frame
    fig.legend(*ax.get_legend_handles_labels(), fontsize=FONT_PT - 1, frameon=False, ncol=2,
               loc="lower center", bbox_to_anchor=(0.5, 0.0), handletextpad=0.3,
               columnspacing=2.0)
    return fig
