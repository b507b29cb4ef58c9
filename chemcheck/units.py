"""The package's one pint unit registry, made on first use (creating it costs about 1 s)."""

from __future__ import annotations

from functools import lru_cache


@lru_cache(maxsize=1)
def ureg():
    import pint

    return pint.UnitRegistry()


def Q_(value, unit):
    return ureg().Quantity(value, unit)
