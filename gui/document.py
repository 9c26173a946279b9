"""The open project as the window sees it: cases as drafts, an undo stack, a dirty flag.

A case is kept as a *draft* (the project file's plain case object, SI values) so
that an entry which is not valid yet is never lost; the engine's catalogue turns a
draft into a validated case when it is rated or saved. Every change goes through
the undo stack; consecutive edits of one field merge into one step, and the dirty
flag is the stack's clean state.
"""
from __future__ import annotations

import copy
import itertools
from pathlib import Path

from PySide6.QtCore import QObject, Signal
from PySide6.QtGui import QUndoCommand, QUndoStack

from rating import catalogue

from . import units

_ids = itertools.count(1)
_SET_VALUE = 1  # QUndoCommand.id() of a field edit, so that consecutive edits merge


class Entry:
    """One case of the project: a stable id (survives renames and moves) and its draft."""

    def __init__(self, draft: dict):
        self.id = next(_ids)
        self.draft = draft

    @property
    def name(self) -> str:
        return str(self.draft.get("name") or "")

    @property
    def type(self) -> str:
        return str(self.draft.get("type") or "")


def new_draft(case_type: str, name: str) -> dict:
    """An empty case of one exchanger type: the catalogue's defaults, required entries blank."""
    draft = {"name": name, "type": case_type}
    for f in catalogue.inputs_for(case_type):
        if f.path in ("name", "type"):
            continue
        draft = catalogue.set_value(draft, f.path, copy.deepcopy(f.default))
    return draft


class Document(QObject):
    """The project being edited. Widgets read from it and change it only through its methods."""

    caseChanged = Signal(int, str)        # entry id, path of the changed input ("" = several)
    casesChanged = Signal()               # added, removed, renamed or moved
    dirtyChanged = Signal(bool)
    pathChanged = Signal(str)

    def __init__(self, parent=None):
        super().__init__(parent)
        self.entries: list[Entry] = []
        self.title = ""
        self.notes = ""
        self.revision = 1
        self.path: Path | None = None
        self.undo = QUndoStack(self)
        self.undo.cleanChanged.connect(self._clean_changed)

    def _clean_changed(self, clean: bool):
        self.dirtyChanged.emit(not clean)

    # --- reading ------------------------------------------------------------------------
    @property
    def dirty(self) -> bool:
        return not self.undo.isClean()

    def entry(self, entry_id: int) -> Entry:
        for e in self.entries:
            if e.id == entry_id:
                return e
        raise KeyError(entry_id)

    def index_of(self, entry_id: int) -> int:
        return next(i for i, e in enumerate(self.entries) if e.id == entry_id)

    def unique_name(self, base: str) -> str:
        names = {e.name for e in self.entries}
        if base not in names:
            return base
        for n in itertools.count(2):
            if f"{base} ({n})" not in names:
                return f"{base} ({n})"

    # --- whole project ------------------------------------------------------------------
    def load(self, project, path=None, drafts=None):
        """Replace the content by a project (or by raw drafts from an autosave); not undoable."""
        self.undo.clear()
        if drafts is None:
            drafts = [catalogue.case_to_draft(c) for c in project.cases]
        self.entries = [Entry(d) for d in drafts]
        self.title = getattr(project, "title", "") if project is not None else ""
        self.notes = getattr(project, "notes", "") if project is not None else ""
        self.revision = getattr(project, "revision", 1) if project is not None else 1
        self.path = Path(path) if path else None
        self.undo.setClean()
        self.casesChanged.emit()
        self.pathChanged.emit(str(self.path or ""))
        self.dirtyChanged.emit(False)

    def to_project(self):
        """The validated project; raises InputError naming the case and the field."""
        from rating.case import Project
        from rating.errors import InputError

        cases = []
        for i, e in enumerate(self.entries):
            try:
                cases.append(catalogue.draft_to_case(e.draft))
            except InputError as exc:
                raise InputError(f"case {i + 1} ({e.name or 'unnamed'}): {exc}", field=exc.field) from None
        return Project(cases=tuple(cases), title=self.title, notes=self.notes, revision=self.revision)

    def saved_as(self, path):
        self.path = Path(path)
        self.undo.setClean()
        self.pathChanged.emit(str(self.path))

    # --- edits (each one an undoable step) ----------------------------------------------
    def set_value(self, entry_id: int, path: str, value):
        old = catalogue.get_value(self.entry(entry_id).draft, path)
        if old == value and type(old) is type(value):
            return
        self.undo.push(_SetValue(self, entry_id, path, old, value))

    def add_case(self, draft: dict, index: int | None = None) -> int:
        entry = Entry(copy.deepcopy(draft))
        self.undo.push(_Insert(self, entry, len(self.entries) if index is None else index,
                               f"add case {entry.name}"))
        return entry.id

    def duplicate(self, entry_id: int) -> int:
        src = self.entry(entry_id)
        draft = catalogue.set_value(src.draft, "name", self.unique_name(f"{src.name} copy"))
        return self.add_case(draft, self.index_of(entry_id) + 1)

    def remove_case(self, entry_id: int):
        self.undo.push(_Remove(self, self.entry(entry_id), self.index_of(entry_id)))

    def rename(self, entry_id: int, name: str):
        self.set_value(entry_id, "name", name)

    def move(self, entry_id: int, step: int):
        i = self.index_of(entry_id)
        j = i + step
        if 0 <= j < len(self.entries):
            self.undo.push(_Move(self, i, j))

    # --- used by the undo commands --------------------------------------------------------
    def _write(self, entry_id: int, path: str, value):
        e = self.entry(entry_id)
        e.draft = catalogue.set_value(e.draft, path, value)
        self.caseChanged.emit(entry_id, path)
        if path == "name":
            self.casesChanged.emit()


_PROBLEMS: list = []        # (draft, its problems) of the latest drafts, newest first


def draft_problems(draft) -> list:
    """``catalogue.draft_problems`` of a draft, computed once per draft object: the form
    and the runner ask about the same draft on every keystroke. A draft is never changed
    in place (every edit makes a new one, ``catalogue.set_value``), so its identity is
    its content; the drafts are held here, so an identity is never reused meanwhile."""
    for known, problems in _PROBLEMS:
        if known is draft:
            return problems
    problems = [_entry_problem(draft, p) for p in catalogue.draft_problems(draft)]
    _PROBLEMS.insert(0, (draft, problems))
    del _PROBLEMS[8:]
    return problems


def _entry_problem(draft, problem):
    """A number's field holding the text typed (not a number in the user's locale): its
    problem says why, in the locale's terms ("the decimal point is '.'"), naming the
    field, in place of the engine's "must be a number"."""
    try:
        f = catalogue.input_field(problem.path)
    except KeyError:
        return problem
    text = catalogue.get_value(draft, problem.path)
    if f.kind not in ("number", "integer") or not isinstance(text, str):
        return problem
    try:
        units.parse_number(text)
    except ValueError as exc:
        return catalogue.Problem(problem.path, f"{f.label}: {exc}", problem.severity)
    return problem


class _SetValue(QUndoCommand):
    def __init__(self, doc: Document, entry_id: int, path: str, old, new):
        f = _label(path)
        super().__init__(f"edit {f}")
        self.doc, self.entry_id, self.path, self.old, self.new = doc, entry_id, path, old, new

    def id(self):
        return _SET_VALUE

    def mergeWith(self, other) -> bool:
        # typing into one field is one step: keep the first old value, take the last new one
        if other.entry_id != self.entry_id or other.path != self.path:
            return False
        self.new = other.new
        return True

    def redo(self):
        self.doc._write(self.entry_id, self.path, self.new)

    def undo(self):
        self.doc._write(self.entry_id, self.path, self.old)


class _Insert(QUndoCommand):
    def __init__(self, doc, entry, index, text):
        super().__init__(text)
        self.doc, self.entry, self.index = doc, entry, index

    def redo(self):
        self.doc.entries.insert(self.index, self.entry)
        self.doc.casesChanged.emit()

    def undo(self):
        self.doc.entries.remove(self.entry)
        self.doc.casesChanged.emit()


class _Remove(_Insert):
    def __init__(self, doc, entry, index):
        super().__init__(doc, entry, index, f"delete case {entry.name}")

    redo, undo = _Insert.undo, _Insert.redo


class _Move(QUndoCommand):
    def __init__(self, doc, i, j):
        super().__init__("move case")
        self.doc, self.i, self.j = doc, i, j

    def _swap(self):
        e = self.doc.entries
        e[self.i], e[self.j] = e[self.j], e[self.i]
        self.doc.casesChanged.emit()

    redo = undo = _swap


def _label(path: str) -> str:
    try:
        return catalogue.input_field(path).label
    except KeyError:
        return path
