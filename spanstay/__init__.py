"""spanstay: nonlinear finite-element checks of cable rides and cable-anchored posts.

The installed package ``spanstay`` holds the engine as ``spanstay.fem`` (the
repository's fem/ folder) and the trade layer as ``spanstay.models`` (models/),
so a user's own ``models.py`` or ``fem.py`` never shadows them. The public
Python API is :mod:`spanstay.models.api`, re-exported here.
"""
from __future__ import annotations

from spanstay.models.api import (FemError, InputError, LoadCase, RunResult, Scenario, analyse,
                                 load, load_cases, results, write_results)

__all__ = ["FemError", "InputError", "LoadCase", "RunResult", "Scenario", "analyse", "load",
           "load_cases", "results", "write_results"]
