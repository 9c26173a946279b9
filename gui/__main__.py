import sys

from .app import main

if __name__ == "__main__":  # the study pool's workers import this module again: no window there
    sys.exit(main())
