"""The package's own error types. Every error a user can cause is one of these."""

from __future__ import annotations

import re

__all__ = ["ChemcheckError", "ParseError", "AmountError", "LimitError", "printable"]

# C0 and C1 control characters, DEL, and the Unicode format characters that reorder or hide
# text (bidirectional overrides and isolates, zero-width marks, the BOM). Echoed back raw they
# could move the terminal's cursor, recolour it, or make a message read differently from what it
# says.
_UNSAFE = re.compile("[\x00-\x1f\x7f-\x9f\u200b-\u200f\u2028-\u202e\u2060-\u2069\ufeff]")


def printable(text: object) -> str:
    """``text`` with every control or format character written as a visible escape (``\\x1b``,
    ``\\u202e``), so that user input echoed in a message or on a terminal is shown, not obeyed."""
    s = str(text)
    if not _UNSAFE.search(s):
        return s

    def esc(m: re.Match) -> str:
        c = ord(m.group(0))
        return f"\\x{c:02x}" if c < 0x100 else f"\\u{c:04x}"

    return _UNSAFE.sub(esc, s)


class ChemcheckError(Exception):
    """Base of every error chemcheck raises on purpose.

    Its text never carries control characters: whatever the input held is shown escaped."""

    def __str__(self) -> str:
        return printable(super().__str__())


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
