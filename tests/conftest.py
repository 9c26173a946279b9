import os
import sys
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
sys.path.insert(0, str(Path(__file__).parent))


def pytest_collection_modifyitems(config, items):
    """The full fuzz and kill sets run only when asked for (-m fuzz_full)."""
    if "fuzz_full" in (config.getoption("markexpr") or ""):
        return
    full = [item for item in items if item.get_closest_marker("fuzz_full")]
    if full:
        config.hook.pytest_deselected(items=full)
        items[:] = [item for item in items if not item.get_closest_marker("fuzz_full")]
