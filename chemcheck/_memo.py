"""Bounded memory for results that depend only on their key: a text as typed, or a molecule's
canonical SMILES. One kind of cache for parsing, perception, basicity, balance and amounts.

Results keyed by canonical SMILES but expressed in a molecule's own atom indices are stored
with that atom order (``put_for``/``get_for``): a molecule drawn the same way again gets the
stored result, one drawn with another atom order gets nothing and recomputes.
"""

from __future__ import annotations

from collections import OrderedDict
from collections.abc import Hashable

__all__ = ["Memo"]


class Memo:
    """Least-recently-used mapping of at most ``size`` entries; values are never None."""

    __slots__ = ("_data", "size")

    def __init__(self, size: int = 4096) -> None:
        self._data: OrderedDict = OrderedDict()
        self.size = size

    def get(self, key: Hashable):
        hit = self._data.get(key)
        if hit is not None:
            self._data.move_to_end(key)
        return hit

    def put(self, key: Hashable, value):
        self._data[key] = value
        if len(self._data) > self.size:
            self._data.popitem(last=False)
        return value

    def get_for(self, key: Hashable, order: list[int]):
        """The value stored by ``put_for`` under ``key`` for the same atom order, else None."""
        hit = self.get(key)
        return hit[1] if hit is not None and hit[0] == order else None

    def put_for(self, key: Hashable, order: list[int], value):
        self.put(key, (order, value))
        return value

    def __len__(self) -> int:
        return len(self._data)

    def clear(self) -> None:
        self._data.clear()
