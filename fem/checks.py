"""Input checks shared by the model and the element groups."""
from __future__ import annotations

import numpy as np

from .errors import ModelError


def as_array(name: str, value, shape: tuple[int, ...] | None = None, what: str = "") -> np.ndarray:
    """Float array with finite values; broadcast to ``shape`` when given."""
    arr = np.asarray(value, dtype=float)
    if shape is not None:
        try:
            arr = np.broadcast_to(arr, shape).copy()
        except ValueError:
            raise ModelError(f"{what}{name}: expected shape {shape}, got {arr.shape}") from None
    bad = ~np.isfinite(arr)
    if np.any(bad):
        idx = np.argwhere(bad)[0]
        raise ModelError(f"{what}{name} is not finite (NaN or infinite) at index {tuple(int(i) for i in idx)}")
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
