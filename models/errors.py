"""Errors the trade layer raises for the user to read (never a traceback)."""
from __future__ import annotations


class InputError(ValueError):
    """Bad user input: says what is wrong, where in the file, what was expected.

    Parameters
    ----------
    message
        The whole sentence shown to the user.
    where
        Key path in the scenario file, e.g. ``anchor[1].post.height``.
    """

    def __init__(self, message: str, where: str | None = None) -> None:
        self.where = where
        super().__init__(f"{where}: {message}" if where else message)
