"""The package's own error types. Every error a user can cause is one of these."""

from __future__ import annotations

__all__ = ["ChemcheckError", "ParseError", "AmountError", "LimitError"]


class ChemcheckError(Exception):
    """Base of every error chemcheck raises on purpose."""


class ParseError(ValueError, ChemcheckError):
    """A reaction, SMILES or name that cannot be read.

    ``component`` is the 1-based number of the component in the reaction (``None`` when the
    reaction as a whole is wrong), ``text`` what was written there, ``position`` the 1-based
    character position inside that text when one can be named.
    """

    def __init__(
        self,
        reason: str,
        *,
        component: int | None = None,
        text: str | None = None,
        position: int | None = None,
    ) -> None:
        self.reason = reason
        self.component = component
        self.text = text
        self.position = position
        super().__init__(self._compose())

    def _compose(self) -> str:
        head = ""
        if self.component is not None:
            head = f"component {self.component} '{self.text}': "
        elif self.text is not None:
            head = f"'{self.text}': "
        tail = f" at position {self.position}" if self.position is not None else ""
        return f"{head}{self.reason}{tail}"


class AmountError(ValueError, ChemcheckError):
    """An amount string that cannot be read, or that does not fit its component."""

    def __init__(self, reason: str, *, key: str | None = None, text: str | None = None) -> None:
        self.reason = reason
        self.key = key
        self.text = text
        where = f"amount for '{key}'" if key is not None else "amount"
        shown = f" '{text}'" if text is not None else ""
        super().__init__(f"{where}{shown}: {reason}")


class LimitError(ValueError, ChemcheckError):
    """An input beyond the sizes chemcheck answers within its time bounds."""
