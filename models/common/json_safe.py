"""Turn results into plain JSON values (no NaN, no numpy types)."""
from __future__ import annotations

import dataclasses
import math

import numpy as np


def json_safe(value):
    """JSON-ready copy: dataclasses and numpy to Python, tuples to lists,
    NaN and infinities to None."""
    if dataclasses.is_dataclass(value) and not isinstance(value, type):
        return json_safe(dataclasses.asdict(value))
    if isinstance(value, dict):
        return {str(k): json_safe(v) for k, v in value.items()}
    if isinstance(value, (list, tuple)):
        return [json_safe(v) for v in value]
    if isinstance(value, np.ndarray):
        return json_safe(value.tolist())
    if isinstance(value, (bool, np.bool_)):
        return bool(value)
    if isinstance(value, (int, np.integer)):
        return int(value)
    if isinstance(value, (float, np.floating)):
        f = float(value)
        return f if math.isfinite(f) else None
    return value
