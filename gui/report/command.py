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


def main(argv=None) -> int:
    from rating.cli import main as rate_main

    return rate_main(argv, report_writer=_writer)


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
