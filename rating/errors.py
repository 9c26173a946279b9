"""Typed errors of the engine.

Every error carries a plain one-line message that a user can act on; the CLI
prints it without a traceback and the GUI shows it beside the field.
"""
from __future__ import annotations


class RatingError(Exception):
    """Base class of every error the engine raises on purpose."""


class InputError(RatingError, ValueError):
    """An input is missing, of the wrong kind or outside its allowed range.

    ``field`` is the path of the offending input (``cases[0].tubes.outer_diameter``)
    when one is known.
    """

    def __init__(self, message: str, field: str | None = None):
        super().__init__(message)
        self.field = field

    def prefixed(self, path: str) -> "InputError":
        """The same error with ``path`` put in front of its field and its message.

        ``InputError("outer_diameter = -0.02 m: must be > 0", "outer_diameter")
        .prefixed("cases[0].tubes")`` reads ``cases[0].tubes.outer_diameter = -0.02 m:
        must be > 0``. An empty path returns the error unchanged.
        """
        if not path:
            return self
        message = str(self)
        if self.field:
            field = _join(path, self.field)
            if message.startswith(self.field):
                message = field + message[len(self.field):]
            else:
                message = f"{field}: {message}"
        else:
            field = path
            message = f"{path}: {message}"
        new = type(self).__new__(type(self))
        new.__dict__.update(self.__dict__)
        InputError.__init__(new, message, field)
        new.__cause__ = self.__cause__
        return new


def _join(path: str, field: str) -> str:
    return path + field if field.startswith("[") else f"{path}.{field}"


class ProjectFileError(InputError):
    """A project file cannot be read (corrupt, truncated, foreign, too new) or written."""


class PropertyError(RatingError, ValueError):
    """A fluid property could not be evaluated (unknown fluid, state outside range)."""

    def __init__(self, message: str, fluid: str | None = None, state: dict | None = None):
        super().__init__(message)
        self.fluid = fluid
        self.state = dict(state or {})


class UnknownFluidError(PropertyError):
    """The fluid name is not known to the property library."""


class SupercriticalError(PropertyError):
    """The pressure is at or above the critical pressure: there is no boiling."""


class OutOfRangeError(PropertyError):
    """A temperature or pressure lies outside the fluid's valid range."""


class ConvergenceError(RatingError, RuntimeError):
    """A numerical solution could not be found (no bracket, no convergence).

    A ``RuntimeError`` too, so that the marchers' guard around each increment (which
    catches ``RuntimeError``) turns it into a failed result naming the position.
    """
