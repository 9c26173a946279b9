"""Plot panels: matplotlib Figures (never pyplot), drawn off the GUI thread.

Every artist is made once when a figure is built and updated with ``set_data`` when
a result arrives. The live panels of the window are ``PlotView`` widgets: the GUI
thread only queues what to show; one render thread updates the artists and draws
the figure with the Agg backend into an image, which the widget then paints. A
draw of six panels takes a good part of a second, and that way it never holds up
typing (a hidden panel is drawn when it is shown). ``open_window`` shows the same
figure on an interactive canvas with matplotlib's toolbar, to zoom, pan and save.

The heated length z is the shared horizontal axis of every along-the-tube panel,
so one position lines up everywhere; a selected warning is a vertical marker on
all of them. Values are converted to the window's unit system on the way in; labels
of lines come from the engine's catalogue of profiles, units from ``gui.units``.
Legends sit in a band kept free of data at the top of each panel, so they never
cover a line.
"""
from __future__ import annotations

import math
import sys
import textwrap
import threading
import traceback

import numpy as np
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.collections import LineCollection, PolyCollection
from matplotlib.figure import Figure
from matplotlib.patches import Patch
from matplotlib.ticker import Formatter, MaxNLocator
from PySide6.QtCore import QObject, QRunnable, QThreadPool, Qt, Signal
from PySide6.QtGui import QImage, QPainter
from PySide6.QtWidgets import QDialog, QSizePolicy, QVBoxLayout, QWidget

from rating import catalogue, caution
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
DPI = 100            # figure units: one logical pixel is 1/DPI inch
BASE_POINTS = 10.0   # a system font larger than this enlarges the plots in proportion
# the short caution on two lines: room beside it
CAUTION_SHORT = textwrap.fill(caution.CAUTION_SHORT, 70)


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
    """One tick label without an offset or a power of ten hidden above the axis."""
    if v == 0:
        return "0"
    return f"{v:,.0f}" if abs(v) >= 1000 else f"{v:.4g}"


class Ticks(Formatter):
    """Tick labels with as many decimals as the spacing of the ticks needs, the same for all
    of them (3.012, 3.016, 3.020), thousands grouped, no offset hidden above the axis."""

    values = ()

    def set_locs(self, locs):
        self.values = [float(x) for x in locs if math.isfinite(x)]

    def __call__(self, v, pos=None):
        locs = self.values
        steps = [abs(b - a) for a, b in zip(locs, locs[1:]) if b != a]
        if not steps:
            return _tick(v)
        step = min(steps)
        decimals = next((d for d in range(10) if abs(step * 10 ** d - round(step * 10 ** d))
                         < 1e-6 * step * 10 ** d), 10)
        text = f"{v:,.{decimals}f}"
        return "0" if float(v) == 0 or text.strip("-0.,") == "" else text


def _runs(z, labels):
    """(start, end, label) of each stretch of equal labels along z."""
    runs, start = [], 0
    for i in range(1, len(labels) + 1):
        if i == len(labels) or labels[i] != labels[start]:
            runs.append((z[start], z[min(i, len(z) - 1)], labels[start]))
            start = i
    return runs


def style_axes(ax, title):
    # a title at a fixed height: matplotlib skips its costly search for a free place
    ax.set_title(title, fontsize=FONT + 1, loc="left", color=INK, y=1.0, pad=3)
    ax.tick_params(labelsize=FONT)
    ax.yaxis.set_major_locator(MaxNLocator(4))
    ax.yaxis.set_major_formatter(Ticks())
    ax.xaxis.set_major_locator(MaxNLocator(6))
    ax.xaxis.set_major_formatter(Ticks())
    ax.grid(True, color="#dddddd", linewidth=0.6)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)


def logical_size(figure) -> tuple[float, float]:
    """The figure's size in layout pixels (a high-density screen draws more dots, a larger
    system font makes each layout pixel larger)."""
    w, h = figure.get_size_inches()
    return w * DPI, h * DPI


def place_axes(figure, grid, margins):
    """Margins in pixels (left, right, top, bottom, between rows, between columns): a
    fixed layout, recomputed on resize, is several times cheaper to draw than an automatic one."""
    w, h = logical_size(figure)
    if w < 50 or h < 50:
        return
    left, right, top, bottom, hgap, wgap = margins
    rows, cols = grid
    cell_h = max(1.0, (h - top - bottom - hgap * (rows - 1)) / rows)
    cell_w = max(1.0, (w - left - right - wgap * (cols - 1)) / cols)
    figure.subplots_adjust(left=left / w, right=1 - right / w, top=1 - top / h,
                           bottom=bottom / h, hspace=hgap / cell_h, wspace=wgap / cell_w)


class _Legend:
    """A legend in a band kept free of data at the top of its axes.

    The axes' upper limit is raised so that the band holds no data; tick labels in the
    band are left out, so a fraction never seems to reach 1.2.
    """

    SIZE = FONT - 1.5
    ROW_PX = 1.45 * SIZE * DPI / 72    # one row of text with its spacing, in pixels

    def __init__(self, ax, handles):
        self.ax, self.handles, self.legend = ax, handles, None
        self.top = None            # the upper limit of the data, before the band
        legend = self

        class InBand(Ticks):                # no tick labels in the band
            def __call__(self, v, pos=None):
                top = legend.top
                return "" if top is not None and v > top + 1e-9 * abs(top or 1) else super().__call__(v, pos)
        ax.yaxis.set_major_formatter(InBand())

    def place(self):
        """After the data limits are set: a legend of the visible lines, and room for it."""
        ax = self.ax
        shown = [h for h in self.handles if h.get_visible()
                 and np.isfinite(np.asarray(h.get_ydata(), float)).any()]
        if self.legend is not None:
            self.legend.remove()
            self.legend = None
        lo, hi = ax.get_ylim()
        self.top = hi
        if len(shown) < 2:          # one line: the panel's title names it
            return
        width = ax.get_position().width * logical_size(ax.figure)[0]
        height = ax.get_position().height * logical_size(ax.figure)[1]
        longest = max(len(h.get_label()) for h in shown)
        entry = (longest * 0.55 + 2.6) * self.SIZE * DPI / 72     # text, line sample, gaps
        cols = max(1, min(len(shown), int((width - 4) // entry)))
        rows = math.ceil(len(shown) / cols)
        band = min(0.55, (rows * self.ROW_PX + 5) / max(height, 1.0))
        if hi > lo:
            ax.set_ylim(lo, hi + (hi - lo) * band / (1 - band))
        self.legend = ax.legend(handles=shown, loc="upper left", ncols=cols, fontsize=self.SIZE,
                                frameon=True, framealpha=0.85, edgecolor="none",
                                facecolor="white", handlelength=1.6, handletextpad=0.4,
                                columnspacing=0.8, borderaxespad=0.2, borderpad=0.1,
                                labelspacing=0.3)


class AlongTubeFigure:
    """The profiles along the heated length, six panels on one shared z axis."""

    grid = (3, 2)
    MARGINS = (72, 14, 40, 62, 34, 80)     # top: the caution, two lines

    def __init__(self, figure):
        self.figure = figure
        figure.text(0.995, 0.997, CAUTION_SHORT, ha="right", va="top", fontsize=FONT - 2,
                    color="#777777")
        axes = figure.subplots(3, 2, sharex=True)
        self.axes = [ax for row in axes for ax in row]
        self.lines, self.ghosts, self.marks, self.bands, self.legends = {}, {}, [], [], []
        for ax, (title, quantity, lines) in zip(self.axes, ALONG_TUBE):
            style_axes(ax, title)
            ax.quantity = quantity
            mine = []
            for key, colour, style, width in lines:
                label = _label(key)
                if title == "Temperatures":       # the title says it: "Wall, inside", "Process"
                    label = label.replace(" temperature", "")
                (line,) = ax.plot([], [], style, color=colour, lw=width, label=label)
                (ghost,) = ax.plot([], [], style, color=colour, lw=1.0, alpha=0.45, visible=False)
                self.lines[key], self.ghosts[key] = line, ghost
                mine.append(line)
            self.legends.append(_Legend(ax, mine))
            bands = {}
            for regime in REGIMES + ("pool boiling",):
                coll = PolyCollection([], transform=ax.get_xaxis_transform(), zorder=0,
                                      facecolor=REGIME_FILL.get(regime, "#f2f2f2"), edgecolor="none")
                ax.add_collection(coll, autolim=False)
                bands[regime] = coll
            self.bands.append(bands)
            mark = ax.axvline(0.0, color=C["vermillion"], lw=1.4, ls=(0, (4, 2)), visible=False, zorder=5)
            self.marks.append(mark)
        # one legend of the shaded regions for the whole figure
        self._regime_handles = {r: Patch(facecolor=REGIME_FILL[r], label=r) for r in REGIME_FILL}
        self.regime_legend = None
        self.compare_text = figure.text(0.005, 0.997, "", ha="left", va="top",
                                        fontsize=FONT - 1, color="#555555")
        self.message = self.axes[0].text(0.5, 0.5, "", transform=self.axes[0].transAxes,
                                         ha="center", va="center", fontsize=FONT + 1, color="#555555")
        # the critical flux far above the flux: said in words, not drawn off the axis
        self.chf_note = self.axes[1].text(0.99, 0.5, "", transform=self.axes[1].transAxes,
                                          ha="right", va="center", fontsize=FONT - 1, color=C["vermillion"])
        self.system = "SI"
        self.mark_z = None
        self._pass_lines = []
        for ax in self.axes:
            coll = LineCollection([], transform=ax.get_xaxis_transform(), colors="#777777",
                                  linewidths=0.9, linestyles="dotted", zorder=1)
            ax.add_collection(coll, autolim=False)
            self._pass_lines.append(coll)
        self._limits = None
        self.set_axes_units("SI")

    def relayout(self):
        place_axes(self.figure, self.grid, self.MARGINS)
        self._fit()

    def set_axes_units(self, system: str, kettle: bool = False):
        self.system = system
        zlabel = "Position along the tube-side path" if kettle else "Heated length z"
        for i, ax in enumerate(self.axes):
            ax.set_ylabel(units.unit_label(ax.quantity, system) or "–", fontsize=FONT)
            if i >= 4:
                ax.set_xlabel(f"{zlabel} [{units.unit_label('length', system)}]", fontsize=FONT)

    def show_result(self, result, other=None, other_name="", kettle=False, system="SI"):
        """Update every line from a result (None clears), the ghosts from ``other``."""
        self.set_axes_units(system, kettle)
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
        name = other_name if len(other_name) <= 60 else other_name[:58] + "…"
        self.compare_text.set_text(f"faint lines: {name}" if other is not None else "")
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
            ax.set_autoscaley_on(True)        # set_ylim (the legend band) had turned it off
            ax.relim(visible_only=True)
            ax.autoscale_view()
        self._limit_flux_axis()
        if len(z):
            lo, hi = float(np.nanmin(z)), float(np.nanmax(z))
            if hi > lo:
                self.axes[0].set_xlim(lo, hi)
        self._limits = [ax.get_ylim() for ax in self.axes]
        self.mark(self.mark_z)
        self._fit()

    def _fit(self):
        """The legend bands for the current size (they are a number of pixels high)."""
        if self._limits is None:
            return
        for ax, legend, limits in zip(self.axes, self.legends, self._limits):
            ax.set_ylim(*limits)
            legend.place()

    def _limit_flux_axis(self):
        """The flux panel scales to the heat flux, showing the critical flux where it is near."""
        q = np.asarray(self.lines["heat_flux_W_m2"].get_ydata(), float)
        chf = np.asarray(self.lines["critical_heat_flux_W_m2"].get_ydata(), float)
        self.chf_note.set_text("")
        if q.size and np.isfinite(q).any():
            top = np.nanmax(q)
            if chf.size and np.isfinite(chf).any():
                lowest = np.nanmin(chf)
                top = max(top, min(lowest, 8.0 * top))
                if lowest > 1.1 * top:
                    unit = units.unit_label("heat_flux", self.system)
                    self.chf_note.set_text(f"critical heat flux above the axis:\n"
                                           f"at least {units.format_number(lowest)} {unit}")
            if top > 0:
                self.axes[1].set_ylim(0, 1.1 * top)

    def mark(self, z_m):
        """A vertical marker at z (SI) on every panel; None removes it."""
        self.mark_z = z_m
        for m in self.marks:
            m.set_visible(z_m is not None)
            if z_m is not None:
                x = units.to_display(z_m, "length", self.system)
                m.set_xdata([x, x])


class BalanceFigure:
    """Thermosiphon: the available head and the loop's losses against circulation."""

    grid = (1, 1)
    MARGINS = (72, 200, 46, 44, 0, 0)        # the legend stands right of the plot

    def __init__(self, figure):
        self.figure = figure
        figure.text(0.995, 0.997, CAUTION_SHORT, ha="right", va="top", fontsize=FONT - 2,
                    color="#777777")
        self.ax = ax = figure.subplots()
        style_axes(ax, "Pressure balance of the loop")
        ax.set_title("Pressure balance of the loop", loc="left", fontsize=FONT + 1, pad=16, color=INK)
        (self.available,) = ax.plot([], [], "-", color=C["blue"], lw=2.0, label="available head")
        (self.required,) = ax.plot([], [], "-", color=C["vermillion"], lw=2.0, label="losses, total")
        self.parts = {}
        for name, colour, style in (("inlet_line", C["orange"], "--"), ("tubes", C["green"], "-."),
                                    ("return_line", C["purple"], ":")):
            (self.parts[name],) = ax.plot([], [], style, color=colour, lw=1.2,
                                          label=f"losses, {name.replace('_', ' ')}")
        # each crossing by the engine's own flag (Ledinegg), as the report draws them
        (self.stable,) = ax.plot([], [], "o", mfc="#9a9a9a", mec=INK, ms=7, label="balance (stable)")
        (self.crossings,) = ax.plot([], [], "o", mfc="white", mec=INK, ms=7, label="balance (unstable)")
        (self.chosen,) = ax.plot([], [], "o", color=INK, ms=8, label="operating point")
        # a circulation the loop was not solved at has no pressure difference: it is marked
        # on the circulation axis (x in data, y on the axes' bottom edge), never at 0 Pa
        (self.unsolved,) = ax.plot([], [], "x", color="#666666", ms=7, mew=1.5, clip_on=False,
                                   transform=ax.get_xaxis_transform(),
                                   label="not solved (on the axis)")
        # the note sits between the title and the plot, never on the curves
        self.note = ax.text(0.0, 1.01, "", transform=ax.transAxes, va="bottom", fontsize=FONT,
                            color="#333333")
        self.legend = None
        self.system = "SI"

    def relayout(self):
        place_axes(self.figure, self.grid, self.MARGINS)

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
        for line, group in ((self.chosen, chosen),
                            (self.stable, [p for p in pts if not p.get("selected") and p.get("stable")]),
                            (self.crossings, [p for p in pts if not p.get("selected")
                                              and not p.get("stable")])):
            line.set_data(_display([p["circulation_kg_s"] for p in group], "mass_flow", system),
                          _display([p["available_Pa"] for p in group], dp, system))
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
        self.legend = self.ax.legend(handles=shown, loc="upper left", bbox_to_anchor=(1.02, 1.0),
                                     fontsize=FONT - 1, frameon=False) if shown else None
        self.ax.relim(visible_only=True)
        self.ax.autoscale_view()


# --- drawing off the GUI thread ----------------------------------------------------------------
_POOL: QThreadPool | None = None


def render_pool() -> QThreadPool:
    """One render thread for every panel: figures are drawn one at a time, in order."""
    global _POOL
    if _POOL is None:
        # a busy thread hands the interpreter lock over every millisecond (Python's default
        # is 5 ms): the GUI thread's turn comes quickly while a figure or a rating runs
        sys.setswitchinterval(0.001)
        _POOL = QThreadPool()
        _POOL.setMaxThreadCount(1)
    return _POOL


def wait_for_drawing(ms: int = 5000) -> bool:
    """Let a running draw finish (before the window closes)."""
    return render_pool().waitForDone(ms)


class _Signals(QObject):
    done = Signal(object)          # the drawn QImage, or None when the draw failed


class _Draw(QRunnable):
    """Apply the queued updates to the figure and draw it into an image (render thread)."""

    def __init__(self, view_state, steps, size):
        super().__init__()
        self.state, self.steps, self.size = view_state, steps, size

    def run(self):
        s, image = self.state, None
        try:
            with s.lock:
                if self.size is not None:
                    # a larger system font enlarges the plots' text, lines and margins too
                    w, h, ratio, scale = self.size
                    s.figure.set_dpi(DPI * ratio * scale)
                    s.figure.set_size_inches(w / (DPI * scale), h / (DPI * scale))
                    s.plot.relayout()
                for name, args, kwargs in self.steps:
                    getattr(s.plot, name)(*args, **kwargs)
                s.agg.draw()
                buf = s.agg.buffer_rgba()
                h_px, w_px = buf.shape[:2]
                image = QImage(bytes(buf), w_px, h_px, 4 * w_px, QImage.Format_RGBA8888).copy()
                if self.size is not None:
                    image.setDevicePixelRatio(self.size[2])
        except Exception:  # a defect in a panel: the window keeps its last picture
            traceback.print_exc()
        try:
            s.signals.done.emit(image)
        except RuntimeError:       # the window closed meanwhile
            pass


class _ViewState:
    """What the render thread shares with the widget: the figure, under one lock."""

    def __init__(self, plot_class, signals):
        self.figure = Figure(dpi=DPI)
        self.agg = FigureCanvasAgg(self.figure)
        self.plot = plot_class(self.figure)
        self.lock = threading.Lock()
        self.signals = signals


class _Picture(QWidget):
    """Paints the last drawn image of the figure."""

    def __init__(self, view):
        super().__init__(view)
        self.view = view
        self.image: QImage | None = None
        self.setSizePolicy(QSizePolicy.Expanding, QSizePolicy.Expanding)
        self.setMinimumSize(320, 240)
        self.setAttribute(Qt.WA_OpaquePaintEvent)

    def paintEvent(self, _event):
        p = QPainter(self)
        p.fillRect(self.rect(), Qt.white)
        if self.image is not None:
            # while a new size is being drawn the old picture is stretched to fit
            p.setRenderHint(QPainter.SmoothPixmapTransform)
            p.drawImage(self.rect(), self.image)
        p.end()

    def resizeEvent(self, event):
        super().resizeEvent(event)
        self.view._schedule()

    def showEvent(self, event):
        super().showEvent(event)
        self.view._schedule()


class PlotView(QWidget):
    """A figure drawn off the GUI thread: calls are queued and the latest of each kind wins."""

    drawn = Signal()

    def __init__(self, plot_class, parent=None, *, title=""):
        super().__init__(parent)
        self.plot_class = plot_class
        self.title = title
        self._signals = _Signals(self)
        self._signals.done.connect(self._on_done)
        self._state = _ViewState(plot_class, self._signals)
        self._pending: dict = {}        # kind -> (method, args, kwargs), in the order given
        self._applied: dict = {}        # what the figure shows (replayed by open_window)
        self._busy = False
        self._size = None
        self.system = "SI"
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        self.picture = _Picture(self)
        lay.addWidget(self.picture, 1)

    # --- what to show (queued) ---------------------------------------------------------------
    def _queue(self, kind, method, *args, **kwargs):
        self._pending.pop(kind, None)
        self._pending[kind] = (method, args, kwargs)
        self._schedule()

    def show_result(self, *args, **kwargs):
        if self.plot_class is AlongTubeFigure:
            kwargs.setdefault("system", self.system)
        self._queue("result", "show_result", *args, **kwargs)

    def mark(self, z_m):
        step = ("mark", (z_m,), {})
        if self._pending.get("mark", self._applied.get("mark", ("mark", (None,), {}))) != step:
            self._queue("mark", "mark", z_m)          # a draw only when the marker moves

    # --- drawing ----------------------------------------------------------------------------------
    def _schedule(self):
        pic = self.picture
        if self._busy or not pic.isVisible():
            return                      # a hidden panel is drawn when it is shown
        ratio = pic.devicePixelRatioF()
        # a larger font enlarges the plots where they have the room for it (the layout is
        # made for about 700 x 420 pixels)
        scale = min(max(1.0, pic.font().pointSizeF() / BASE_POINTS),
                    max(1.0, min(pic.width() / 700, pic.height() / 420)))
        size = (max(pic.width(), 50), max(pic.height(), 50), ratio, scale)
        new_size = size if size != self._size else None
        if not self._pending and new_size is None:
            return
        steps = list(self._pending.values())
        for kind, step in self._pending.items():
            self._applied.pop(kind, None)
            self._applied[kind] = step
        self._pending.clear()
        self._size = size
        self._busy = True
        render_pool().start(_Draw(self._state, steps, new_size))

    def _on_done(self, image):
        self._busy = False
        if image is not None:
            self.picture.image = image
            self.picture.update()
        self._schedule()
        if not self._busy:
            self.drawn.emit()

    def settled(self) -> bool:
        """Nothing queued and nothing being drawn: the picture shows the last call."""
        return not self._busy and not self._pending

    # --- reading and saving (the figure is locked while the render thread uses it) -------------
    @property
    def plot(self):
        return self._state.plot

    @property
    def figure(self):
        return self._state.figure

    def line_data(self, key):
        """The plotted (x, y) of a profile line, in display units (for tests and checks)."""
        with self._state.lock:
            x, y = self.plot.lines[key].get_data()
            return np.asarray(x, float), np.asarray(y, float)

    def save(self, path):
        with self._state.lock:
            self.figure.savefig(path, dpi=150)

    def open_window(self):
        """The same plots on matplotlib's interactive canvas, to zoom, pan and save."""
        d = QDialog(self.window())
        d.setWindowTitle(self.title or "Plots")
        d.setAttribute(Qt.WA_DeleteOnClose)
        lay = QVBoxLayout(d)
        lay.setContentsMargins(0, 0, 0, 0)
        canvas = _Canvas(d, caution=False)       # the figure has its own
        plot = self.plot_class(canvas.figure)
        canvas.plot = plot
        with self._state.lock:
            steps = list(self._applied.values()) + list(self._pending.values())
        for name, args, kwargs in steps:
            getattr(plot, name)(*args, **kwargs)
        lay.addWidget(canvas)
        d.resize(max(self.width(), 900), max(self.height(), 620))
        d.show()
        return d


class _Canvas(QWidget):
    """A figure on matplotlib's interactive Qt canvas, with the navigation toolbar (zoom, pan,
    save as PNG or SVG). Drawn on the GUI thread: for the studies and for ``open_window``."""

    MARGINS = (72, 14, 30, 44, 44, 70)

    def __init__(self, parent=None, toolbar=True, caution=True):
        from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg, NavigationToolbar2QT

        super().__init__(parent)
        self.figure = Figure()
        self.canvas = FigureCanvasQTAgg(self.figure)
        self.plot = None
        self.canvas.mpl_connect("resize_event", lambda _e: self._relayout())
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        lay.setSpacing(0)
        if toolbar:
            self.toolbar = NavigationToolbar2QT(self.canvas, self)
            self.toolbar.setIconSize(self.toolbar.iconSize() * 0.8)
            lay.addWidget(self.toolbar)
        lay.addWidget(self.canvas, 1)
        if caution:             # the caution travels with every saved picture
            self.figure.text(0.995, 0.997, CAUTION_SHORT, ha="right", va="top", fontsize=FONT - 2,
                             color="#777777")

    def save(self, path):
        self.figure.savefig(path, dpi=150)

    def redraw(self):
        self.canvas.draw_idle()

    def _relayout(self):
        if self.plot is not None:
            self.plot.relayout()
            return
        place_axes(self.figure, getattr(self, "grid", (1, 1)), self.MARGINS)

    def _style(self, ax, title):
        style_axes(ax, title)
