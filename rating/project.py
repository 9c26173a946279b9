"""The Ebullio project file: read, write (atomically) and migrate between schema versions.

A project file is JSON text in UTF-8 with the extension ``.ebullio``::

    {
      "app_version": "0.1.0",
      "cases": [{"boiling": {...}, "heating": {...}, "name": "...", "tubes": {...}, ...}],
      "format": "ebullio-project",
      "notes": "",
      "revision": 1,
      "schema_version": 2,
      "title": ""
    }

Every value is SI: lengths in m, pressures in Pa (absolute), temperatures in K,
mass flows in kg/s, duties in W, heat fluxes in W/m^2, fouling resistances in
m^2*K/W, the layout angle in degrees. Keys are the field names of the dataclasses
in ``rating.case``; ``None`` is written as ``null``. Keys are sorted and indented by
two spaces, with a trailing newline, so that two revisions of a file diff well.

Reading refuses, with one line naming the path of the offending value, anything
that is not a complete Ebullio project: a foreign or truncated file, a newer
schema, an unknown key (a typo is never dropped silently), a missing required key,
a value outside its range. Reading never writes. Older schemas are brought up to
date in memory by the chain of ``@migrates(from_version)`` functions, applied to a
copy of the data.
"""
from __future__ import annotations

import copy
import dataclasses
import difflib
import json
import math
import numbers
import os
import re
import stat
import types
import typing
from functools import cache
from pathlib import Path
from typing import Callable

from .case import Project
from .errors import InputError, ProjectFileError
from .validation import format_value

FORMAT = "ebullio-project"
EXTENSION = ".ebullio"
SCHEMA_VERSION = 2

#: Keys of the file's top level that are not fields of ``Project``.
HEADER = ("format", "schema_version", "app_version")

#: Migrators keyed by the schema version they read; each returns version + 1 data.
MIGRATIONS: dict[int, Callable[[dict], dict]] = {}


def migrates(from_version: int, *, chain: dict | None = None):
    """Decorator: register a function that turns schema ``from_version`` data into the next.

    The function receives a deep copy of the whole file's data (a dict) and returns
    the converted dict; ``schema_version`` is set by the caller.
    """
    target = MIGRATIONS if chain is None else chain

    def wrap(fn):
        if from_version in target:
            raise ValueError(f"a migration from schema {from_version} is already registered")
        target[from_version] = fn
        return fn

    return wrap


def migrate(data: dict, *, source: str = "the project", chain: dict | None = None,
            target: int | None = None) -> dict:
    """A copy of ``data`` brought up to schema ``target`` (default: the current one)."""
    chain = MIGRATIONS if chain is None else chain
    target = SCHEMA_VERSION if target is None else target
    data = copy.deepcopy(data)
    version = data["schema_version"]
    while version < target:
        if version not in chain:
            raise ProjectFileError(f"{source} uses schema {version}, which this version "
                                   f"cannot convert (no migration from schema {version})")
        try:
            data = chain[version](data)
        except Exception as exc:  # a migrator meeting data it does not expect
            raise ProjectFileError(f"{source} could not be converted from schema {version} to "
                                   f"{version + 1}: {type(exc).__name__}: {exc}") from exc
        version += 1
        data["schema_version"] = version
    return data


@migrates(1)
def question_renamed(data: dict) -> dict:
    """Schema 2 names the question "area for a required duty" ``area_for_duty``
    (schema 1: ``duty_check``)."""
    for case in data.get("cases", []):
        if isinstance(case, dict) and case.get("question") == "duty_check":
            case["question"] = "area_for_duty"
    return data


def app_version() -> str:
    """The version of Ebullio that writes the file (informative; readers use schema_version)."""
    import rating

    return getattr(rating, "__version__", "unknown")


# --- dataclasses <-> plain data ------------------------------------------------------

def _join(path: str, name: str) -> str:
    return f"{path}.{name}" if path else name


@cache
def _hints(cls) -> dict:
    return typing.get_type_hints(cls)


def _options(hint) -> tuple:
    """The alternatives of a ``X | None`` hint, or the hint itself."""
    if isinstance(hint, types.UnionType) or typing.get_origin(hint) is typing.Union:
        return typing.get_args(hint)
    return (hint,)


def _encode(value, hint, path: str):
    """JSON-ready data of a field value; floats where the field is a float."""
    if dataclasses.is_dataclass(value) and not isinstance(value, type):
        hints = _hints(type(value))
        derived = getattr(value, "_derived", {})  # filled in when built: the file keeps it empty
        return {f.name: None if f.name in derived else
                _encode(getattr(value, f.name), hints[f.name], _join(path, f.name))
                for f in dataclasses.fields(value)}
    if value is None or isinstance(value, (str, bool)):
        return value
    if isinstance(value, numbers.Integral) and float not in _options(hint):
        return int(value)
    if isinstance(value, numbers.Real):
        if not math.isfinite(value):
            _unwritable(path, value)
        return float(value)
    if isinstance(value, (list, tuple)):
        item = typing.get_args(hint)[0] if typing.get_args(hint) else object
        return [_encode(v, item, f"{path}[{i}]") for i, v in enumerate(value)]
    if isinstance(value, dict) and all(isinstance(k, str) for k in value):
        return {k: _encode(v, object, _join(path, k)) for k, v in value.items()}
    _unwritable(path, value)


def _unwritable(path, value):
    raise ProjectFileError(f"{path} = {format_value(value)}: cannot be written to a project file "
                           f"(a {type(value).__name__})", field=path)


def _json_type(value) -> str:
    for kind, name in ((dict, "an object"), (list, "a list"), (str, "text"), (bool, "true/false"),
                       (numbers.Number, "a number"), (type(None), "null")):
        if isinstance(value, kind):
            return name
    return type(value).__name__


def _decode(value, hint, path: str):
    """A field value from JSON data: dataclasses built, lists made tuples, ints made floats."""
    options = _options(hint)
    if value is None and type(None) in options:
        return None
    classes = [o for o in options if dataclasses.is_dataclass(o)]
    if classes:
        if not isinstance(value, dict):
            raise ProjectFileError(f"{path}: must be an object of {classes[0].__name__} fields, "
                                   f"not {_json_type(value)}", field=path)
        return _decode_dataclass(classes[0], value, path)
    if typing.get_origin(hint) is tuple:
        if not isinstance(value, list):
            raise ProjectFileError(f"{path}: must be a list, not {_json_type(value)}", field=path)
        item = typing.get_args(hint)[0]
        return tuple(_decode(v, item, f"{path}[{i}]") for i, v in enumerate(value))
    if float in options and isinstance(value, int) and not isinstance(value, bool):
        return float(value)
    return value  # scalars are checked by the dataclass's own validation


def _decode_dataclass(cls, data: dict, path: str):
    fields = {f.name: f for f in dataclasses.fields(cls)}
    for key in data:
        if key not in fields:
            near = difflib.get_close_matches(key, fields, n=1)
            hint = f"did you mean {near[0]}?" if near else "known: " + ", ".join(fields)
            raise ProjectFileError(f"{_join(path, key)}: unknown key ({hint})", field=_join(path, key))
    for name, f in fields.items():
        required = f.default is dataclasses.MISSING and f.default_factory is dataclasses.MISSING
        if required and name not in data:
            raise ProjectFileError(f"{_join(path, name)}: missing; a {cls.__name__} needs "
                                   + ", ".join(n for n, g in fields.items()
                                               if g.default is dataclasses.MISSING
                                               and g.default_factory is dataclasses.MISSING),
                                   field=_join(path, name))
    hints = _hints(cls)
    kwargs = {k: _decode(v, hints[k], _join(path, k)) for k, v in data.items()}
    try:
        return cls(**kwargs)
    except InputError as exc:
        raise exc.prefixed(path) from None


def _check_project(project: Project) -> None:
    """The project's own fields (``Project`` has no validation of its own)."""
    from .case import Case

    if not isinstance(project.title, str):
        raise InputError(f"title = {format_value(project.title)}: must be text", field="title")
    if not isinstance(project.notes, str):
        raise InputError(f"notes = {format_value(project.notes)}: must be text", field="notes")
    if (not isinstance(project.revision, int) or isinstance(project.revision, bool)
            or project.revision < 1):
        raise InputError(f"revision = {format_value(project.revision)}: must be a whole number >= 1",
                         field="revision")
    seen = {}
    for i, case in enumerate(project.cases):
        if not isinstance(case, Case):
            raise InputError(f"cases[{i}] = {format_value(case)}: must be a Case", field=f"cases[{i}]")
        if case.name in seen:
            raise InputError(f"cases[{i}].name = {case.name!r}: cases[{seen[case.name]}] "
                             "already has this name; case names must differ",
                             field=f"cases[{i}].name")
        seen[case.name] = i


def to_dict(obj) -> dict:
    """Plain JSON-ready data of a ``Project`` (the whole file) or of any case dataclass."""
    if not isinstance(obj, Project):
        return _encode(obj, type(obj), "")
    _check_project(obj)
    data = _encode(obj, Project, "")
    data.update(format=FORMAT, schema_version=SCHEMA_VERSION, app_version=app_version())
    return data


def from_dict(data, cls=Project, *, source: str = "the data", validate: bool = True):
    """A ``Project`` from a file's data (checked, migrated), or a part from its fields.

    ``source`` names the data in messages about the whole file (usually its path).
    A project's cases are validated (``rating.validation.validate``: the rules that need
    fluid properties) unless ``validate`` is False: built from plain values only.
    """
    if cls is not Project:
        if not isinstance(data, dict):
            raise ProjectFileError(f"{source}: must be an object of {cls.__name__} fields, "
                                   f"not {_json_type(data)}")
        return _decode_dataclass(cls, data, "")
    if not isinstance(data, dict):
        raise ProjectFileError(f"{source} is not an Ebullio project file "
                               f"(its top level is {_json_type(data)}, not an object)")
    tag = data.get("format")
    if tag != FORMAT:
        what = "no format tag" if tag is None else f"format {format_value(tag)}"
        raise ProjectFileError(f"{source} is not an Ebullio project file ({what}, "
                               f"expected \"format\": \"{FORMAT}\")")
    version = data.get("schema_version")
    if not isinstance(version, int) or isinstance(version, bool) or version < 1:
        raise ProjectFileError(f"{source} has no valid schema_version ({format_value(version)}); "
                               "it must be a whole number >= 1", field="schema_version")
    if version > SCHEMA_VERSION:
        raise ProjectFileError(f"{source} was written by a newer Ebullio (schema {version}); "
                               f"this version reads up to {SCHEMA_VERSION}", field="schema_version")
    if not isinstance(data.get("app_version", ""), str):
        raise ProjectFileError(f"app_version = {format_value(data['app_version'])}: must be text",
                               field="app_version")
    data = migrate(data, source=source)
    project = _decode_dataclass(Project, {k: v for k, v in data.items() if k not in HEADER}, "")
    _check_project(project)
    if validate:
        from .validation import validate as check

        for i, case in enumerate(project.cases):
            try:
                check(case)
            except InputError as exc:
                raise exc.prefixed(f"cases[{i}]") from None
    return project


# --- files --------------------------------------------------------------------------------

def dumps(project: Project) -> str:
    """The text ``save_project`` writes: sorted keys, 2-space indent, a trailing newline."""
    return json.dumps(to_dict(project), sort_keys=True, indent=2, ensure_ascii=False,
                      allow_nan=False) + "\n"


def _no_duplicates(pairs):
    obj = {}
    for key, value in pairs:
        if key in obj:
            raise ProjectFileError(f"the key {key!r} appears twice in one object")
        obj[key] = value
    return obj


#: Deepest nesting of objects and lists a project file may have (a real one has 4);
#: far deeper text would exhaust the parser's recursion.
MAX_DEPTH = 32
#: Most digits of a whole number in a project file (a real one has at most 6).
MAX_DIGITS = 18


class _LongInteger:
    """Stands in, while parsing, for a whole number too long to be an input."""

    def __init__(self, text: str):
        self.digits = len(text.lstrip("-"))


def _parse_int(text: str):
    return int(text) if len(text.lstrip("-")) <= MAX_DIGITS else _LongInteger(text)


def _check_shape(data, source: str) -> None:
    """Refuse nesting deeper than MAX_DEPTH and over-long integers, naming where."""
    stack = [(data, "", 0)]
    while stack:
        value, path, depth = stack.pop()
        if isinstance(value, _LongInteger):
            raise ProjectFileError(f"{path or source} = a whole number of {value.digits} digits: "
                                   f"too large for any input (at most {MAX_DIGITS} digits)",
                                   field=path or None)
        if isinstance(value, (dict, list)):
            if depth >= MAX_DEPTH:
                raise ProjectFileError(f"{source} is not an Ebullio project file (objects and "
                                       f"lists nested more than {MAX_DEPTH} deep at "
                                       f"{path or 'the top level'})", field=path or None)
            items = value.items() if isinstance(value, dict) else enumerate(value)
            for key, item in items:
                child = f"{path}[{key}]" if isinstance(key, int) else _join(path, key)
                stack.append((item, child, depth + 1))


_TOKEN = re.compile(r'"(?:[^"\\]|\\.)*"(\s*:)?|[\[\]{},]')


def _shorten(path: str) -> str:
    return path if len(path) <= 80 else path[:40] + " ... " + path[-30:]


def _too_deep(text: str) -> str:
    """The path at which JSON text too deep for the parser passes MAX_DEPTH."""
    stack = []  # [key or index] per open object or list
    for m in _TOKEN.finditer(text):
        token = m.group()
        if token in "[{":
            if len(stack) >= MAX_DEPTH:
                break
            stack.append(0 if token == "[" else "")
        elif token in "]}":
            if stack:
                stack.pop()
        elif token == ",":
            if stack and isinstance(stack[-1], int):
                stack[-1] += 1
        elif m.group(1) and stack:  # a key (a string that is a value is passed over)
            try:
                stack[-1] = json.loads(token[:-len(m.group(1))])
            except ValueError:
                stack[-1] = "?"
    path = ""
    for part in stack:
        path = f"{path}[{part}]" if isinstance(part, int) else _join(path, part)
    return path


def _read_regular(path: Path) -> bytes:
    """The bytes of a regular file; a folder, named pipe or device is refused at once.

    The file is opened without blocking (a named pipe with no writer would wait
    forever) and its kind checked on the open descriptor, not on the name.
    """
    flags = os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_BINARY", 0)
    try:
        fd = os.open(path, flags)
    except FileNotFoundError:
        raise ProjectFileError(f"{path}: no such file") from None
    except IsADirectoryError:
        raise ProjectFileError(f"{path} is a folder, not a project file") from None
    except OSError as exc:
        raise ProjectFileError(f"{path} cannot be read: {exc.strerror or exc}") from None
    try:
        mode = os.fstat(fd).st_mode
        if not stat.S_ISREG(mode):
            kind = ("a folder" if stat.S_ISDIR(mode) else "a named pipe" if stat.S_ISFIFO(mode)
                    else "a device" if stat.S_ISCHR(mode) or stat.S_ISBLK(mode)
                    else "a socket" if stat.S_ISSOCK(mode) else "not a regular file")
            raise ProjectFileError(f"{path} is {kind}, not a project file")
        with os.fdopen(fd, "rb", closefd=False) as fh:
            return fh.read()
    except OSError as exc:
        raise ProjectFileError(f"{path} cannot be read: {exc.strerror or exc}") from None
    finally:
        os.close(fd)


def load_project(path) -> Project:
    """Read a project file. Refuses, in one line, anything but a complete valid project."""
    path = Path(path)
    raw = _read_regular(path)
    if not raw.strip():
        raise ProjectFileError(f"{path} is empty, not an Ebullio project file")
    try:
        if b"\x00" in raw:
            raise UnicodeError
        text = raw.decode("utf-8-sig")  # a byte-order mark from an editor is harmless
    except UnicodeError:
        raise ProjectFileError(f"{path} is not an Ebullio project file "
                               "(binary data, not UTF-8 text)") from None
    try:
        data = json.loads(text, object_pairs_hook=_no_duplicates, parse_int=_parse_int)
    except json.JSONDecodeError as exc:
        raise ProjectFileError(f"{path} is not a complete Ebullio project file (JSON error at "
                               f"line {exc.lineno} column {exc.colno}: {exc.msg})") from None
    except ProjectFileError as exc:
        raise ProjectFileError(f"{path} is not a valid Ebullio project file: {exc}") from None
    except RecursionError:
        where = _too_deep(text)
        raise ProjectFileError(f"{path} is not an Ebullio project file (objects and lists "
                               f"nested more than {MAX_DEPTH} deep at "
                               f"{_shorten(where) or 'the top level'})",
                               field=where or None) from None
    _check_shape(data, str(path))
    return from_dict(data, source=str(path))


#: Suffix of the one temporary file a save writes beside its target: ``.NAME.ebullio-saving``.
SAVING_SUFFIX = ".ebullio-saving"


def saving_name(target) -> str:
    """The temporary file a save of ``target`` writes first (a hidden name beside it)."""
    head, tail = os.path.split(os.fspath(target))
    return os.path.join(head, "." + tail + SAVING_SUFFIX)


def _remove_stale(target: str) -> None:
    """Remove what an interrupted save of ``target`` left: our temporary file, and the
    randomly named ``.NAME.XXXXXXXX.tmp`` files of versions before 0.2."""
    folder, name = os.path.split(target)
    old = re.compile(re.escape("." + name + ".") + r"[A-Za-z0-9_]{8}\.tmp")
    try:
        stale = [e.name for e in os.scandir(folder) if old.fullmatch(e.name)]
    except OSError:
        stale = []
    for entry in [os.path.basename(saving_name(target))] + stale:
        try:
            os.unlink(os.path.join(folder, entry))
        except OSError:
            pass


def _escape_surrogates(text: str) -> str:
    """Lone surrogates (valid in JSON text, not in UTF-8) written as JSON escapes."""
    return _SURROGATE.sub(lambda m: f"\\u{ord(m.group()):04x}", text)


_SURROGATE = re.compile("[\ud800-\udfff]")


def save_project(project: Project, path) -> None:
    """Write a project file atomically: the old file stays whole if anything fails.

    The text goes to ``.NAME.ebullio-saving`` in the same folder, is flushed and
    fsynced, then replaces the target in one ``os.replace``; the folder is fsynced
    where the system allows it. A temporary file left by an interrupted save is
    removed by the next save of the same target.
    """
    if not isinstance(project, Project):
        raise TypeError(f"save_project needs a Project, not {type(project).__name__}")
    payload = _escape_surrogates(dumps(project)).encode("utf-8")  # fails before the disk is touched
    target = os.path.realpath(path)  # save through a symbolic link, not over it
    folder = os.path.dirname(target)
    try:
        mode = os.stat(target).st_mode & 0o7777
    except OSError:
        mode = 0o644
    _remove_stale(target)
    tmp = saving_name(target)
    written = False
    try:
        fd = os.open(tmp, os.O_WRONLY | os.O_CREAT | os.O_EXCL | getattr(os, "O_BINARY", 0), 0o600)
        written = True
        with os.fdopen(fd, "wb") as f:
            f.write(payload)
            f.flush()
            os.fsync(f.fileno())
        os.chmod(tmp, mode)
        os.replace(tmp, target)
        written = False
    except OSError as exc:
        raise ProjectFileError(f"{path} could not be saved: {exc.strerror or exc}") from exc
    finally:
        if written:
            try:
                os.unlink(tmp)
            except OSError:
                pass
    _fsync_folder(folder)


def _fsync_folder(folder: str) -> None:
    """Make the rename durable; not possible on every system (Windows)."""
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)
