"""The ``ebullio-rate`` console command: the engine's command with Ebullio's report writer.

The engine imports no Qt or matplotlib, so the command's entry point lives here and
hands ``rating.cli.main`` the writer for ``--report``; Qt and matplotlib are
imported only when a report is asked for.
"""
from __future__ import annotations

import sys


def _writer(project, cases, results, path, units, source_path=None, spread=None,
            increments=None):
    from .writer import write_report

    try:
        write_report(project, cases, path, units, source_path, results=results, spread=spread,
                     increments=increments)
    except ValueError as exc:
        from rating.errors import InputError
        raise InputError(f"--report: {exc}") from None


class DisplayUnits:
    """The table of ``ebullio-rate`` in the units of ``--units``, the desktop's and the
    report's: figures and the values inside warnings alike (no Qt imported)."""

    def __init__(self, system: str):
        self.system = system

    def value(self, value, quantity: str) -> tuple[str, str]:
        from gui import units

        return (units.number_text(value, quantity, self.system),
                units.unit_text(quantity, self.system))

    def warning(self, warning) -> str:
        from gui.warning_text import warning_text

        return warning_text(warning, self.system)


def main(argv=None) -> int:
    from rating.cli import main as rate_main

    return rate_main(argv, report_writer=_writer, display=DisplayUnits)


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
