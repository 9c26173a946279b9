"""Entry of the bundled ``ebullio-rate`` command (frozen by PyInstaller)."""
import multiprocessing
import sys

if __name__ == "__main__":
    multiprocessing.freeze_support()      # a no-op unless a worker process starts here
    from rating.cli import main
    sys.exit(main())
