"""Settings, recent files and the autosave that lets a crashed session be recovered.

Settings (recent files, window geometry, unit system) live in QSettings with a
settings version for later migrations. The autosave is the project's drafts as
JSON in the user's data folder (platformdirs), one file per window's session (the
process id and the window), so two windows on one file never write, remove or offer
each other's; it is written while there are unsaved changes, removed on a clean save
or close, and offered back at a start when its session is gone and it is newer than
the file.
Drafts are kept as typed, so even entries that are not valid yet are recovered.
"""
from __future__ import annotations

import hashlib
import json
import os
import time
from pathlib import Path

from PySide6.QtCore import QSettings

SETTINGS_VERSION = 1
MAX_RECENT = 8
AUTOSAVE_FORMAT = "ebullio-autosave"


def settings() -> QSettings:
    s = QSettings()
    if int(s.value("settings_version", 0) or 0) < SETTINGS_VERSION:
        s.setValue("settings_version", SETTINGS_VERSION)   # nothing to migrate yet
    return s


def recent_files() -> list[str]:
    value = settings().value("recent_files", [])
    if isinstance(value, str):
        value = [value]
    return [v for v in (value or []) if isinstance(v, str)]


def remember(path) -> None:
    path = str(Path(path).resolve())
    files = [path] + [p for p in recent_files() if p != path]
    settings().setValue("recent_files", files[:MAX_RECENT])


def forget(path) -> None:
    settings().setValue("recent_files", [p for p in recent_files() if p != str(path)])


# --- autosave ----------------------------------------------------------------------------

def autosave_folder() -> Path:
    from platformdirs import user_data_dir

    folder = Path(user_data_dir("Ebullio", appauthor=False)) / "autosave"
    folder.mkdir(parents=True, exist_ok=True)
    return folder


# sessions of this process whose window is open (their autosaves are not offered)
live_sessions: set[str] = set()


def autosave_path(source, session: str) -> Path:
    """Where a session's autosave of a project goes: keyed by the session and the path."""
    key = f"{session}\n{Path(source).resolve() if source else 'untitled'}"
    return autosave_folder() / (hashlib.sha1(key.encode("utf-8")).hexdigest()[:16] + ".json")


def process_alive(pid) -> bool:
    """Whether a process of this id runs (a reused id counts as running: the autosave is
    offered once that process ends)."""
    if not isinstance(pid, int) or isinstance(pid, bool) or pid <= 0:
        return False
    if os.name == "nt":
        import ctypes

        kernel = ctypes.windll.kernel32
        handle = kernel.OpenProcess(0x1000, False, pid)      # query limited information
        if not handle:
            return False
        code = ctypes.c_ulong()
        ok = kernel.GetExitCodeProcess(handle, ctypes.byref(code))
        kernel.CloseHandle(handle)
        return bool(ok) and code.value == 259                # STILL_ACTIVE
    try:
        os.kill(pid, 0)                 # signal 0: only asks whether the process exists
    except ProcessLookupError:
        return False
    except PermissionError:
        return True                     # exists, another user's
    except OSError:
        return False
    return True


def session_alive(data: dict) -> bool:
    """Whether the session that wrote an autosave still runs: a window of this process
    that is open, or another process that runs."""
    pid = data.get("pid")
    if pid == os.getpid():
        return data.get("session") in live_sessions
    return process_alive(pid)


def write_autosave(target: Path, source, document, session: str = "") -> None:
    data = {
        "format": AUTOSAVE_FORMAT, "version": 1, "saved_at": time.time(),
        "session": session, "pid": os.getpid(),
        "source": str(Path(source).resolve()) if source else None,
        "title": document.title, "notes": document.notes, "revision": document.revision,
        "drafts": [e.draft for e in document.entries],
    }
    tmp = target.with_suffix(".tmp")
    tmp.write_text(json.dumps(data, indent=1, default=str), encoding="utf-8")
    os.replace(tmp, target)


def read_autosave(path: Path) -> dict | None:
    """An autosave's data, or None when it is not one of ours or cannot be read."""
    try:
        data = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None
    if not isinstance(data, dict) or data.get("format") != AUTOSAVE_FORMAT \
            or not isinstance(data.get("drafts"), list):
        return None
    return data


def pending_autosaves(source=None) -> list[tuple[Path, dict]]:
    """Autosaves worth offering, newest first: of ``source`` only, or of any project.

    An autosave is offered only when its session has ended (never another open window's,
    of this process or another), and an autosave of a file only when newer than the file.
    """
    found = []
    for path in autosave_folder().glob("*.json"):
        data = read_autosave(path)
        if data is None or session_alive(data):
            continue
        src = data.get("source")
        if source is not None and src != str(Path(source).resolve()):
            continue
        if src is not None:
            try:
                if os.path.getmtime(src) >= data.get("saved_at", 0):
                    continue            # the file was saved after this autosave
            except OSError:
                pass                    # the file is gone: the autosave is all there is
        found.append((path, data))
    return sorted(found, key=lambda pd: -float(pd[1].get("saved_at", 0)))


def discard(path: Path | None) -> None:
    if path is not None:
        try:
            path.unlink()
        except OSError:
            pass
