"""spanstay engine: a small, domain-free 3D nonlinear finite-element solver.

Knows nodes, supports, loads, beams, cables, springs and links; knows nothing
of rides, lumber or soil.
"""
from .beam import BeamSection
from .errors import ConvergenceError, FemError, ModelError
from .model import Model
from .solver import SolverOptions, solve
from .spring import LinearLaw
from .state import State

__all__ = ["BeamSection", "ConvergenceError", "FemError", "LinearLaw", "Model", "ModelError",
           "SolverOptions", "State", "solve"]
from .vtk import write_pvd, write_vtu  # noqa: E402

__all__ += ["write_pvd", "write_vtu"]
