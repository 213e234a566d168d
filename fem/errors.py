"""Typed errors raised by the engine."""
from __future__ import annotations

from dataclasses import dataclass, field


class FemError(Exception):
    """Base class of every error the engine raises on purpose."""


class ModelError(FemError, ValueError):
    """The model definition is invalid (names the element, node or DOF)."""


@dataclass
class ImbalanceSite:
    """Where an unbalanced force sits: node, DOF name and residual value."""

    node: int
    dof: str
    residual: float
    elements: list[str] = field(default_factory=list)

    def __str__(self) -> str:
        near = f" (elements {', '.join(self.elements)})" if self.elements else ""
        return f"node {self.node} {self.dof}: {self.residual:.3e}{near}"


class ConvergenceError(FemError, RuntimeError):
    """Newton-Raphson failed to find equilibrium.

    Attributes
    ----------
    step
        Load step number (1-based) that failed.
    factor
        Load factor (0..1 of the increment being applied) that failed.
    history
        Relative residual norm of each iteration of the last attempt.
    sites
        The DOFs carrying the largest unbalanced forces.
    """

    def __init__(self, reason: str, step: int, factor: float,
                 history: list[float], sites: list[ImbalanceSite]) -> None:
        self.reason = reason
        self.step = step
        self.factor = factor
        self.history = list(history)
        self.sites = list(sites)
        hist = ", ".join(f"{h:.2e}" for h in history[-8:])
        where = "; ".join(str(s) for s in sites[:3])
        super().__init__(
            f"no equilibrium at load step {step} (factor {factor:.4g}): {reason}. "
            f"Residual history [{hist}]. Largest imbalance at {where}"
        )
