"""The rating report: one HTML source, PDF through Qt's own writer, plots from matplotlib.

``write_report(project, cases, path, units, source_path=None)`` writes a PDF or an
HTML file of the given cases; the desktop's report command and ``ebullio-rate
--report`` both call it.
"""
from .writer import write_report  # noqa: F401
