"""Entry of the bundle's one program (frozen by PyInstaller).

The bundle holds the program once, as ``ebullio``; ``ebullio-rate`` and
``ebullio-study`` are links to it (build.py makes them), and the name it was
started under picks the command, as the installed package's scripts do:

    ebullio [FILE]                  the desktop application (gui.app)
    ebullio-rate FILE ...           the headless rating, with --report
    ebullio-study FILE ...          the headless studies
    ebullio --screenshots OUTDIR    the desktop's picture maker (gui.screenshots),
                                    which the bundle check uses
"""
import multiprocessing
import os
import sys


def command(name: str, args: list[str]):
    """The main function to run for a program name and its arguments."""
    if name.startswith("ebullio-rate"):
        from gui.report.command import main
    elif name.startswith("ebullio-study"):
        from rating.study_cli import main
    elif args[:1] == ["--screenshots"]:
        from gui.screenshots import main
        return lambda: main(args[1:])
    else:
        from gui.app import main
    return main


if __name__ == "__main__":
    multiprocessing.freeze_support()      # study workers start from this executable
    sys.exit(command(os.path.basename(sys.argv[0]), sys.argv[1:])())
