"""The rating report: one HTML source, PDF through Qt's own writer, plots from matplotlib.

``write_report(project, cases, path, units, source_path=None)`` writes a PDF or an
HTML file of the given cases; the desktop's report command and ``ebullio-rate
--report`` both call it. ``add_to_window(window)`` puts the report and vendor-figure
commands into the desktop's Report menu.

The writer is imported on first use: ``ebullio-rate``'s entry point lives in this
package, and ``ebullio-rate --help`` must not load matplotlib, Qt or numpy.
"""


def __getattr__(name):
    if name == "write_report":
        from .writer import write_report
        return write_report
    if name == "add_to_window":
        from .desktop import add_to_window
        return add_to_window
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")
