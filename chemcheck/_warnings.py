"""Warnings of the package's own. The test suite turns them into errors."""


class ChemcheckWarning(UserWarning):
    """Something chemcheck did that a user should know of, outside any finding."""
