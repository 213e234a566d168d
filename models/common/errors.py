"""Errors the trade layer raises for the user to read (never a traceback)."""
from __future__ import annotations

import difflib
from collections.abc import Iterable


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


def did_you_mean(word: str, choices: Iterable[str]) -> str:
    """A ``; did you mean "x"?`` suffix, or a list of the choices if none is close."""
    choices = sorted(set(choices))
    close = difflib.get_close_matches(word, choices, n=1, cutoff=0.6)
    if not close:  # case slips: "ea" for "EA"
        lower = {c.lower(): c for c in choices}
        close = [lower[word.lower()]] if word.lower() in lower else []
    if close:
        return f'; did you mean "{close[0]}"?'
    return "; expected one of: " + ", ".join(f'"{c}"' for c in choices)
