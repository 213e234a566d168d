"""Input checks shared by the model and the element groups."""
from __future__ import annotations

import numpy as np

from .errors import ModelError


def as_array(name: str, value, shape: tuple[int, ...] | None = None, what: str = "",
             per_element: bool = False) -> np.ndarray:
    """Float array with finite values; broadcast to ``shape`` when given.

    With ``per_element`` the first axis counts the elements of a group and a
    bad value is reported as "<what> element i: <name> ..."; otherwise
    ``what`` is a prefix such as "add_load: ".
    """
    try:
        arr = np.asarray(value, dtype=float)
    except (TypeError, ValueError):
        raise ModelError(f"{what}{': ' if per_element else ''}{name} must be numbers, got {value!r}") from None
    if shape is not None:
        try:
            arr = np.broadcast_to(arr, shape).copy()
        except ValueError:
            sep = ": " if per_element else ""
            raise ModelError(f"{what}{sep}{name}: expected shape {shape} (or one value for all), "
                             f"got {arr.shape}") from None
    bad = ~np.isfinite(arr)
    if np.any(bad):
        idx = tuple(int(i) for i in np.argwhere(bad)[0])
        if per_element and arr.ndim:
            rest = f" component {idx[1:] if len(idx) > 2 else idx[1]}" if len(idx) > 1 else ""
            raise ModelError(f"{what} element {idx[0]}: {name}{rest} is not finite, got {arr[idx]}")
        raise ModelError(f"{what}{name} is not finite (NaN or infinite) at index {idx}")
    return arr


def positive(name: str, arr: np.ndarray, what: str, allow_zero: bool = False) -> None:
    """Raise naming the first element whose value is not positive."""
    bad = arr < 0 if allow_zero else arr <= 0
    if np.any(bad):
        i = int(np.argwhere(bad)[0][0])
        need = "non-negative" if allow_zero else "positive"
        val = np.ravel(arr)[i] if arr.ndim == 1 else arr[i]
        raise ModelError(f"{what} element {i}: {name} must be {need}, got {val}")


def node_ids(name: str, nodes, n_nodes: int, what: str) -> np.ndarray:
    """Integer node ids, each referring to an existing node."""
    arr = np.atleast_1d(np.asarray(nodes))
    if arr.size and not np.issubdtype(arr.dtype, np.integer):
        raise ModelError(f"{what}: {name} must be integer node ids")
    arr = arr.astype(np.int64)
    bad = (arr < 0) | (arr >= n_nodes)
    if np.any(bad):
        i = int(np.argwhere(bad.ravel())[0][0])
        raise ModelError(f"{what}: {name} refers to missing node {int(arr.ravel()[i])} "
                         f"(the model has {n_nodes} nodes)")
    return arr
