"""spanstay: nonlinear finite-element checks of cable rides and cable-anchored posts.

The installed package ``spanstay`` holds the engine as ``spanstay.fem`` (the
repository's fem/ folder) and the trade layer as ``spanstay.models`` (models/),
so a user's own ``models.py`` or ``fem.py`` never shadows them. The public
Python API is :mod:`spanstay.models.api`, re-exported here.
"""
from __future__ import annotations

import os as _os

# In a source checkout (not installed, or another checkout beside an editable
# install) the engine and the trade layer sit beside this folder: find them there.
_checkout = _os.path.dirname(_os.path.dirname(_os.path.abspath(__file__)))
if all(_os.path.isfile(_os.path.join(_checkout, d, "__init__.py")) for d in ("fem", "models")):
    __path__.append(_checkout)  # type: ignore[name-defined]  # noqa: F821

__all__ = ["FemError", "InputError", "LoadCase", "RunResult", "Scenario", "analyse", "load",
           "load_cases", "results", "write_results"]


def __getattr__(name: str):
    """The API on first use, so that ``spanstay --help`` starts without numpy and scipy."""
    if name in __all__:
        from spanstay.models import api

        return getattr(api, name)
    raise AttributeError(f"module 'spanstay' has no attribute {name!r}")
