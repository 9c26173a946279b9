"""Entry of the bundled desktop application ``ebullio [FILE]`` (frozen by PyInstaller).

``ebullio --screenshots OUTDIR [--only NAME]`` runs the desktop's own picture
maker (gui.screenshots) inside the bundle; the bundle check uses it to open and
rate a sample offscreen and keep a picture of the main window.
"""
import multiprocessing
import sys

if __name__ == "__main__":
    multiprocessing.freeze_support()      # a no-op unless a worker process starts here
    if sys.argv[1:2] == ["--screenshots"]:
        from gui.screenshots import main
        sys.exit(main(sys.argv[2:]))
    from gui.app import main
    sys.exit(main())
