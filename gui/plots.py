"""Plot panels: matplotlib Figures on Qt canvases (never pyplot).

Every artist is made once when the panel is built and updated with ``set_data``
when a result arrives; only the GUI thread draws. The heated length z is the
shared horizontal axis of every along-the-tube panel, so one position lines up
everywhere; a selected warning is a vertical marker on all of them. Values are
converted to the window's unit system on the way in; labels of lines come from the
engine's catalogue of profiles, units from ``gui.units``.
"""
from __future__ import annotations

import math

import numpy as np
from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg, NavigationToolbar2QT
from matplotlib.collections import LineCollection, PolyCollection
from matplotlib.figure import Figure
from matplotlib.ticker import FuncFormatter, MaxNLocator
from PySide6.QtWidgets import QVBoxLayout, QWidget

from rating import catalogue
from rating.march import REGIMES

from . import units
from .style import INK, OKABE_ITO as C, REGIME_FILL

# Each panel: (title, quantity of its y axis, lines as (profile key, colour, style, width)).
# The key names a profile of the catalogue; its label there is the legend entry.
ALONG_TUBE = (
    ("Temperatures", "temperature", (
        ("t_wall_inner_K", C["vermillion"], "-", 2.0),
        ("t_process_K", C["blue"], "-", 1.6),
        ("t_heating_K", C["orange"], "-.", 1.6),
        ("t_sat_K", INK, "--", 1.2))),
    ("Heat flux and its limit", "heat_flux", (
        ("heat_flux_W_m2", C["blue"], "-", 1.8),
        ("critical_heat_flux_W_m2", C["vermillion"], "--", 1.6))),
    ("Boiling coefficient", "htc", (
        ("htc_boiling_W_m2K", INK, "-", 1.8),
        ("htc_nucleate_W_m2K", C["green"], "--", 1.4),
        ("htc_convective_W_m2K", C["sky"], ":", 1.8))),
    ("Vapour quality and void fraction", "fraction", (
        ("quality", C["blue"], "-", 1.8),
        ("void_fraction", C["purple"], "--", 1.6))),
    ("Pressure", "pressure", (
        ("p_Pa", C["blue"], "-", 1.8),)),
    ("Wall superheat", "temperature_difference", (
        ("wall_superheat_K", C["vermillion"], "-", 1.6),)),
)

FONT = 8
CAUTION_SHORT = ("Ebullio: engineering estimates, to be checked by a qualified engineer "
                 "under local codes and licensed practice")


def _quantity(key: str) -> str:
    return catalogue.result_field(key).quantity


def _label(key: str) -> str:
    return catalogue.result_field(key).label


def _display(values, quantity, system):
    """An array in display units; None and non-numbers become NaN (a gap, never 0)."""
    out = np.full(len(values), np.nan)
    for i, v in enumerate(values):
        if isinstance(v, (int, float)) and not isinstance(v, bool) and math.isfinite(v):
            out[i] = units.to_display(float(v), quantity, system)
    return out


def _tick(v, _pos=None):
    """Tick labels without an offset or a power of ten hidden above the axis."""
    if v == 0:
        return "0"
    return f"{v:,.0f}" if abs(v) >= 1000 else f"{v:.4g}"


def _runs(z, labels):
    """(start, end, label) of each stretch of equal labels along z."""
    runs, start = [], 0
    for i in range(1, len(labels) + 1):
        if i == len(labels) or labels[i] != labels[start]:
            runs.append((z[start], z[min(i, len(z) - 1)], labels[start]))
            start = i
    return runs


class _Canvas(QWidget):
    """A figure, its canvas and the navigation toolbar (zoom, pan, save as PNG or SVG)."""

    # margins in pixels (left, right, top, bottom, between rows, between columns); a fixed
    # layout, recomputed on resize, is several times cheaper to draw than an automatic one
    MARGINS = (72, 14, 30, 44, 44, 70)

    def __init__(self, parent=None, toolbar=True):
        super().__init__(parent)
        self.figure = Figure()
        self.canvas = FigureCanvasQTAgg(self.figure)
        self.canvas.mpl_connect("resize_event", lambda _e: self._relayout())
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        lay.setSpacing(0)
        if toolbar:
            self.toolbar = NavigationToolbar2QT(self.canvas, self)
            self.toolbar.setIconSize(self.toolbar.iconSize() * 0.8)
            lay.addWidget(self.toolbar)
        lay.addWidget(self.canvas, 1)
        # the caution travels with every saved picture
        self.figure.text(0.995, 0.997, CAUTION_SHORT, ha="right", va="top", fontsize=FONT - 2,
                         color="#777777")

    def save(self, path):
        self.figure.savefig(path, dpi=150)

    def redraw(self):
        """Draw when shown: a panel on a hidden tab waits until its tab is chosen."""
        if self.canvas.isVisible():
            self._stale_picture = False
            self.canvas.draw_idle()
        else:
            self._stale_picture = True

    def showEvent(self, event):
        super().showEvent(event)
        if getattr(self, "_stale_picture", False):
            self._stale_picture = False
            self.canvas.draw_idle()

    def _relayout(self):
        w, h = self.figure.get_size_inches() * self.figure.dpi
        if w < 50 or h < 50:
            return
        left, right, top, bottom, hgap, wgap = self.MARGINS
        rows, cols = getattr(self, "grid", (1, 1))
        cell_h = max(1.0, (h - top - bottom - hgap * (rows - 1)) / rows)
        cell_w = max(1.0, (w - left - right - wgap * (cols - 1)) / cols)
        self.figure.subplots_adjust(left=left / w, right=1 - right / w, top=1 - top / h,
                                    bottom=bottom / h, hspace=hgap / cell_h, wspace=wgap / cell_w)

    def _style(self, ax, title):
        # a title at a fixed height: matplotlib skips its costly search for a free place
        ax.set_title(title, fontsize=FONT + 1, loc="left", color=INK, y=1.0, pad=3)
        ax.tick_params(labelsize=FONT)
        ax.yaxis.set_major_locator(MaxNLocator(4))
        ax.yaxis.set_major_formatter(FuncFormatter(_tick))
        ax.xaxis.set_major_locator(MaxNLocator(6))
        ax.grid(True, color="#dddddd", linewidth=0.6)
        for side in ("top", "right"):
            ax.spines[side].set_visible(False)


class AlongTubePanel(_Canvas):
    """The profiles along the heated length, six panels on one shared z axis."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.grid = (3, 2)
        self.MARGINS = (72, 14, 30, 62, 34, 80)
        axes = self.figure.subplots(3, 2, sharex=True)
        self.axes = [ax for row in axes for ax in row]
        self.lines, self.ghosts, self.marks, self.bands, self.pass_marks = {}, {}, [], [], []
        for ax, (title, quantity, lines) in zip(self.axes, ALONG_TUBE):
            self._style(ax, title)
            ax.quantity = quantity
            for key, colour, style, width in lines:
                (line,) = ax.plot([], [], style, color=colour, lw=width, label=_label(key))
                (ghost,) = ax.plot([], [], style, color=colour, lw=1.0, alpha=0.45, visible=False)
                self.lines[key], self.ghosts[key] = line, ghost
            bands = {}
            for regime in REGIMES + ("pool boiling",):
                coll = PolyCollection([], transform=ax.get_xaxis_transform(), zorder=0,
                                      facecolor=REGIME_FILL.get(regime, "#f2f2f2"), edgecolor="none")
                ax.add_collection(coll, autolim=False)
                bands[regime] = coll
            self.bands.append(bands)
            mark = ax.axvline(0.0, color=C["vermillion"], lw=1.4, ls=(0, (4, 2)), visible=False, zorder=5)
            self.marks.append(mark)
            ax.legend(loc="best", fontsize=FONT - 1, frameon=True, framealpha=0.8, edgecolor="none",
                      handlelength=2.2)
        # one legend of the shaded regions for the whole figure
        from matplotlib.patches import Patch
        self._regime_handles = {r: Patch(facecolor=REGIME_FILL[r], label=r) for r in REGIME_FILL}
        self.regime_legend = None
        self.compare_text = self.figure.text(0.005, 0.997, "", ha="left", va="top",
                                             fontsize=FONT - 1, color="#555555")
        self.message = self.axes[0].text(0.5, 0.5, "", transform=self.axes[0].transAxes,
                                         ha="center", va="center", fontsize=FONT + 1, color="#555555")
        self.system = "SI"
        self._pass_lines = []
        for ax in self.axes:
            coll = LineCollection([], transform=ax.get_xaxis_transform(), colors="#777777",
                                  linewidths=0.9, linestyles="dotted", zorder=1)
            ax.add_collection(coll, autolim=False)
            self._pass_lines.append(coll)

    def set_axes_units(self, system: str, kettle: bool = False):
        self.system = system
        zlabel = "Position along the tube-side path" if kettle else "Heated length z"
        for i, ax in enumerate(self.axes):
            ax.set_ylabel(units.unit_label(ax.quantity, system) or "–", fontsize=FONT)
            if i >= 4:
                ax.set_xlabel(f"{zlabel} [{units.unit_label('length', system)}]", fontsize=FONT)

    def show_result(self, result, other=None, other_name="", kettle=False):
        """Update every line from a result (None clears), the ghosts from ``other``."""
        self.set_axes_units(self.system, kettle)
        profiles = result.profiles if result is not None else {}
        z = _display(profiles.get("z_m", ()), "length", self.system)
        for key, line in self.lines.items():
            vals = profiles.get(key)
            if vals is None or len(z) == 0:
                line.set_data([], [])
            else:
                line.set_data(z, _display(vals, _quantity(key), self.system))
        oprof = other.profiles if other is not None else {}
        oz = _display(oprof.get("z_m", ()), "length", self.system)
        for key, ghost in self.ghosts.items():
            vals = oprof.get(key)
            ghost.set_visible(vals is not None and len(oz) > 0)
            if ghost.get_visible():
                ghost.set_data(oz, _display(vals, _quantity(key), self.system))
            else:
                ghost.set_data([], [])
        self.compare_text.set_text(f"faint lines: {other_name}" if other is not None else "")
        # shaded regimes
        regimes = profiles.get("regime", ())
        runs = _runs(list(z), list(regimes)) if len(z) else []
        present = []
        for bands in self.bands:
            for regime, coll in bands.items():
                verts = [[(a, 0), (b, 0), (b, 1), (a, 1)] for a, b, r in runs if r == regime]
                coll.set_verts(verts)
        for _, _, r in runs:
            if r not in present:
                present.append(r)
        if self.regime_legend is not None:
            self.regime_legend.remove()
        handles = [self._regime_handles[r] for r in present if r in self._regime_handles]
        self.regime_legend = self.figure.legend(handles=handles, loc="lower left", ncols=5,
                                                fontsize=FONT - 1, frameon=False) if handles else None
        # tube passes (kettle): a thin line where each pass begins
        passes = profiles.get("tube_pass")
        starts = [z[i] for i in range(1, len(z)) if passes and passes[i] != passes[i - 1]]
        for coll in self._pass_lines:
            coll.set_segments([[(x, 0), (x, 1)] for x in starts])
        self.message.set_text("" if result is not None else "no rating yet")
        for ax in self.axes:
            ax.relim(visible_only=True)
            ax.autoscale_view()
        self._limit_flux_axis()
        if len(z):
            lo, hi = float(np.nanmin(z)), float(np.nanmax(z))
            if hi > lo:
                self.axes[0].set_xlim(lo, hi)
        self.redraw()

    def _limit_flux_axis(self):
        """The flux panel scales to the heat flux, showing the critical flux where it is near."""
        q = self.lines["heat_flux_W_m2"].get_ydata()
        chf = self.lines["critical_heat_flux_W_m2"].get_ydata()
        q = np.asarray(q, float)
        chf = np.asarray(chf, float)
        if q.size and np.isfinite(q).any():
            top = np.nanmax(q)
            if chf.size and np.isfinite(chf).any():
                top = max(top, min(np.nanmin(chf), 8.0 * top))
            if top > 0:
                self.axes[1].set_ylim(0, 1.1 * top)

    def mark(self, z_m):
        """A vertical marker at z (SI) on every panel; None removes it."""
        for m in self.marks:
            m.set_visible(z_m is not None)
            if z_m is not None:
                x = units.to_display(z_m, "length", self.system)
                m.set_xdata([x, x])
        self.redraw()

    def line_data(self, key):
        """The plotted (x, y) of a profile line, in display units (for tests and checks)."""
        x, y = self.lines[key].get_data()
        return np.asarray(x, float), np.asarray(y, float)


class BalancePanel(_Canvas):
    """Thermosiphon: the available head and the loop's losses against circulation."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.ax = self.figure.subplots()
        self._style(self.ax, "Pressure balance of the loop")
        ax = self.ax
        (self.available,) = ax.plot([], [], "-", color=C["blue"], lw=2.0, label="available head")
        (self.required,) = ax.plot([], [], "-", color=C["vermillion"], lw=2.0, label="losses, total")
        self.parts = {}
        for name, colour, style in (("inlet_line", C["orange"], "--"), ("tubes", C["green"], "-."),
                                    ("return_line", C["purple"], ":")):
            (self.parts[name],) = ax.plot([], [], style, color=colour, lw=1.2,
                                          label=f"losses, {name.replace('_', ' ')}")
        (self.crossings,) = ax.plot([], [], "o", mfc="white", mec=INK, ms=7, label="balance (unstable)")
        (self.chosen,) = ax.plot([], [], "o", color=INK, ms=8, label="operating point")
        (self.unsolved,) = ax.plot([], [], "x", color="#888888", ms=6, label="not solved")
        self.note = ax.text(0.02, 0.97, "", transform=ax.transAxes, va="top", fontsize=FONT)
        ax.xaxis.set_major_formatter(FuncFormatter(_tick))
        self.legend = None
        self.system = "SI"

    def show_result(self, result, system):
        self.system = system
        curve = (result.extra.get("pressure_balance_curve") if result is not None else None) or {}
        m = _display(curve.get("circulation_kg_s", ()), "mass_flow", system)
        dp = "pressure_difference"
        self.available.set_data(m, _display(curve.get("available_Pa", ()), dp, system))
        self.required.set_data(m, _display(curve.get("required_Pa", ()), dp, system))
        parts = curve.get("parts_Pa", {})
        for name, line in self.parts.items():
            line.set_data(m, _display(parts.get(name, ()), dp, system) if name in parts else [])
        pts = curve.get("operating_points", ())
        chosen = [p for p in pts if p.get("selected")]
        others = [p for p in pts if not p.get("selected")]
        self.chosen.set_data(_display([p["circulation_kg_s"] for p in chosen], "mass_flow", system),
                             _display([p["available_Pa"] for p in chosen], dp, system))
        self.crossings.set_data(_display([p["circulation_kg_s"] for p in others], "mass_flow", system),
                                _display([p["available_Pa"] for p in others], dp, system))
        bad = curve.get("not_solved_kg_s", ())
        self.unsolved.set_data(_display(bad, "mass_flow", system), np.zeros(len(bad)))
        if chosen:
            c = chosen[0]
            self.note.set_text(f"operating point: {units.format_value(c['circulation_kg_s'], 'mass_flow', system)}; "
                               f"{len(pts)} crossing{'s' if len(pts) > 1 else ''} of the two curves")
        else:
            self.note.set_text("no balance: the head does not carry the losses at any circulation"
                               if curve else "no pressure-balance curve")
        self.ax.set_xlabel(f"Circulation [{units.unit_label('mass_flow', system)}]", fontsize=FONT)
        self.ax.set_ylabel(f"Pressure difference [{units.unit_label(dp, system)}]", fontsize=FONT)
        if self.legend is not None:
            self.legend.remove()
        shown = [a for a in self.ax.get_lines() if len(a.get_xdata())]
        self.legend = self.ax.legend(handles=shown, loc="upper left", bbox_to_anchor=(0.0, 0.92),
                                     fontsize=FONT - 1, frameon=True, framealpha=0.85,
                                     edgecolor="none") if shown else None
        self.ax.relim(visible_only=True)
        self.ax.autoscale_view()
        self.redraw()
