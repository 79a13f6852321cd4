"""The project's one exception hierarchy.

Every error is a :class:`FeaError`; each subclass also inherits a builtin so that
``except ValueError`` keeps working.  Messages are one plain line.
"""

from __future__ import annotations

__all__ = ["FeaError", "ModelError", "CaseError", "UnitError", "SolverError"]


class FeaError(Exception):
    """Base class of every error raised by Stanchion."""


class ModelError(FeaError, ValueError):
    """The column model is impossible or cannot be analysed.

    Parameters
    ----------
    field : str
        The input the problem is about (``"segment[2].length"``, ``"restraints"``).
    message : str
        What is wrong and what was expected.
    """

    def __init__(self, field: str, message: str) -> None:
        self.field = field
        self.message = message
        super().__init__(field, message)

    def __str__(self) -> str:
        return f"{self.field}: {self.message}" if self.field else self.message


class CaseError(ModelError):
    """A case file is malformed (syntax, unknown key, wrong type)."""


class UnitError(ModelError):
    """A quantity has no unit or the wrong dimension."""


class SolverError(FeaError, RuntimeError):
    """A solver could not produce a trustworthy answer."""
