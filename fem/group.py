"""The interface every element group implements."""
from __future__ import annotations

from dataclasses import dataclass
from typing import Callable

import numpy as np

DOF_NAMES = ("ux", "uy", "uz", "rx", "ry", "rz")


@dataclass
class Evaluation:
    """Element internal forces and tangents of one group.

    Attributes
    ----------
    force
        (ne, nde) internal force vectors (what the element pulls on its nodes,
        with a minus sign: residual = external - internal).
    tangent
        (ne, nde, nde) tangent matrices, or None when not requested.
    results
        Builds the group's named result arrays at this state (as
        :meth:`ElementGroup.results`) from what the force evaluation computed
        anyway; None: the group recomputes them in ``results``.
    """

    force: np.ndarray
    tangent: np.ndarray | None
    results: Callable[[], dict[str, np.ndarray]] | None = None


class ElementGroup:
    """Base class: a set of elements of one kind evaluated together.

    Subclasses set ``name``, ``conn`` (ne, nodes per element) and implement
    :meth:`global_dofs`, :meth:`stiffened`, :meth:`evaluate` and
    :meth:`results`.
    """

    name: str
    conn: np.ndarray
    kind: str = "element"
    #: per-element arrays (first axis = element) that fully describe the group for
    #: evaluation; groups of one class listing these are evaluated together
    merge_fields: tuple[str, ...] = ()

    @property
    def size(self) -> int:
        return int(self.conn.shape[0])

    def global_dofs(self) -> np.ndarray:
        """(ne, nde) full DOF indices (node * 6 + dof) of each element vector."""
        raise NotImplementedError

    def stiffened(self) -> np.ndarray:
        """(ne, nde) bool: which entries of the element vector give stiffness."""
        return np.ones(self.global_dofs().shape, dtype=bool)

    def evaluate(self, x: np.ndarray, rot: np.ndarray, disp: np.ndarray,
                 tangent: bool = True) -> Evaluation:
        """Internal forces (and tangents) at current positions ``x`` (n, 3),
        rotations ``rot`` (n, 3, 3) and displacements ``disp`` (n, 6)."""
        raise NotImplementedError

    def external(self, gravity: np.ndarray) -> np.ndarray | None:
        """(ne, nde) equivalent nodal loads the group carries itself (self-weight)."""
        return None

    def results(self, x: np.ndarray, rot: np.ndarray, disp: np.ndarray) -> dict[str, np.ndarray]:
        """Named result arrays of the group for the given state."""
        return {}

    def label(self, i: int) -> str:
        """Human name of element ``i`` for messages."""
        return f"{self.kind} '{self.name}'[{i}]"

    @classmethod
    def merged(cls, groups: list["ElementGroup"]) -> "ElementGroup":
        """One group of this class holding the elements of ``groups`` (for evaluation only)."""
        proxy = cls.__new__(cls)
        proxy.name = "+".join(g.name for g in groups)
        for f in cls.merge_fields:
            setattr(proxy, f, np.concatenate([getattr(g, f) for g in groups]))
        return proxy

    def snapshot(self) -> "ElementGroup":
        """A shallow copy whose per-element arrays are copies (results of a kept state
        stay those of the parameters it was solved with)."""
        twin = type(self).__new__(type(self))
        twin.__dict__.update(self.__dict__)
        for f in self.merge_fields:
            setattr(twin, f, np.array(getattr(self, f)))
        return twin


class MergedUnit:
    """Several groups of one class evaluated as one batch (fewer, larger numpy calls).

    The batch's arrays are gathered once; each member group's ``merge_fields``
    then become views into them, so in-place edits of a member (``g.L0[:] =
    ...``) reach the batch without copying. :meth:`refresh` (once per solve)
    regathers when a member's array was replaced by another object. Quacks like
    an ElementGroup for the assembler and the solver.
    """

    def __init__(self, groups: list[ElementGroup]) -> None:
        self.groups = groups
        self.cls = type(groups[0])
        self.sizes = [g.size for g in groups]
        self._bind()

    def _bind(self) -> None:
        self.proxy = self.cls.merged(self.groups)
        offsets = np.concatenate([[0], np.cumsum(self.sizes)])
        for g, a, b in zip(self.groups, offsets[:-1], offsets[1:]):
            for f in self.cls.merge_fields:
                setattr(g, f, getattr(self.proxy, f)[a:b])
        self._bound = [[getattr(g, f) for f in self.cls.merge_fields] for g in self.groups]

    def refresh(self) -> None:
        """Regather the batch if a member's array object was replaced since the last bind."""
        for g, arrays in zip(self.groups, self._bound):
            for f, arr in zip(self.cls.merge_fields, arrays):
                if getattr(g, f) is not arr:
                    self._bind()
                    return

    def global_dofs(self) -> np.ndarray:
        return np.concatenate([g.global_dofs() for g in self.groups])

    def stiffened(self) -> np.ndarray:
        return np.concatenate([g.stiffened() for g in self.groups])

    def evaluate(self, x, rot, disp, tangent=True) -> Evaluation:
        return self.proxy.evaluate(x, rot, disp, tangent)

    def split_results(self, results: dict[str, np.ndarray]) -> list[dict[str, np.ndarray]]:
        """The batch's result arrays cut into those of each member group."""
        offsets = np.cumsum(self.sizes)[:-1]
        cut = {key: np.split(val, offsets) for key, val in results.items()}
        return [{key: parts[i] for key, parts in cut.items()} for i in range(len(self.groups))]

    def external(self, gravity: np.ndarray) -> np.ndarray | None:
        parts = [g.external(gravity) for g in self.groups]
        if all(p is None for p in parts):
            return None
        nde = self.groups[0].global_dofs().shape[1]
        return np.concatenate([np.zeros((g.size, nde)) if p is None else p
                               for g, p in zip(self.groups, parts)])


def evaluation_units(groups: list[ElementGroup]) -> list:
    """The groups to evaluate: those of a class with ``merge_fields`` are batched together."""
    units, batches = [], {}
    for g in groups:
        if type(g).merge_fields:
            if type(g) not in batches:
                batches[type(g)] = []
                units.append(batches[type(g)])
            batches[type(g)].append(g)
        else:
            units.append(g)
    return [MergedUnit(u) if isinstance(u, list) and len(u) > 1 else (u[0] if isinstance(u, list) else u)
            for u in units]


def translation_dofs(conn: np.ndarray) -> np.ndarray:
    """(ne, 3 * nn) full DOF indices of the translations of each node."""
    base = conn[:, :, None] * 6 + np.arange(3)[None, None, :]
    return base.reshape(conn.shape[0], -1)


def all_dofs(conn: np.ndarray) -> np.ndarray:
    """(ne, 6 * nn) full DOF indices of all six DOFs of each node."""
    base = conn[:, :, None] * 6 + np.arange(6)[None, None, :]
    return base.reshape(conn.shape[0], -1)


#: one-sided difference step relative to the length (or in radians): about the square
#: root of machine precision, where truncation and round-off errors balance
FORWARD_STEP = 1.5e-8


def central_difference_tangent(force_fn, x1, x2, r1, r2, steps_t, steps_r,
                               translation_invariant: bool = False,
                               base: np.ndarray | None = None) -> np.ndarray:
    """Tangent of a two-node element force by central differences, vectorised.

    ``force_fn(x1, x2, r1, r2, reps)`` returns (reps * ne, 12) forces for
    ``reps`` stacked copies of the (ne,) elements: translations (reps * ne, 3)
    and rotation matrices (reps * ne, 3, 3). Translations are perturbed by
    ``steps_t`` (ne,) and rotations by left spins of ``steps_r`` (ne,); all
    perturbed states are evaluated in one batched call. When the force
    depends on the translations only through x2 - x1 (``translation_invariant``)
    the node-1 translation columns are the negated node-2 ones, and 18 states
    are evaluated instead of 24. Given the unperturbed forces ``base``
    (ne, 12), one-sided differences halve the work; their error (about the
    square root of machine precision, with steps of that size) only slows
    Newton's last iteration, never its answer, since the residual is exact.
    """
    from .rotation import expmap

    ne = x1.shape[0]
    eye = np.eye(3)
    first = 6 if translation_invariant else 0
    cols = list(range(first, 12)) if not translation_invariant else [6, 7, 8, 3, 4, 5, 9, 10, 11]
    signs = (1.0,) if base is not None else (1.0, -1.0)
    reps = len(signs) * len(cols)
    bx1 = np.repeat(x1[None], reps, axis=0)
    bx2 = np.repeat(x2[None], reps, axis=0)
    br1 = np.repeat(r1[None], reps, axis=0)
    br2 = np.repeat(r2[None], reps, axis=0)
    uniform_r = bool(np.all(steps_r == steps_r[0])) if ne else True
    for j, col in enumerate(cols):
        node, kind, axis = col // 6, (col % 6) // 3, col % 3
        for k_sign, sgn in enumerate(signs):
            row = len(signs) * j + k_sign
            if kind == 0:
                target = bx1 if node == 0 else bx2
                target[row, :, axis] += sgn * steps_t
            else:
                if uniform_r:
                    spin = expmap(sgn * steps_r[0] * eye[axis])
                else:
                    spin = expmap(sgn * steps_r[:, None] * eye[axis][None, :])
                target = br1 if node == 0 else br2
                target[row] = spin @ target[row]
    f = force_fn(bx1.reshape(-1, 3), bx2.reshape(-1, 3),
                 br1.reshape(-1, 3, 3), br2.reshape(-1, 3, 3), reps).reshape(reps, ne, 12)
    h = np.where(np.array([(c % 6) < 3 for c in cols])[:, None], steps_t[None, :], steps_r[None, :])
    if base is not None:
        kc = (f - base[None]) / h[:, :, None]  # (columns, ne, 12 rows)
    else:
        kc = (f[0::2] - f[1::2]) / (2.0 * h[:, :, None])
    k = np.empty((ne, 12, 12))
    k[:, :, cols] = np.transpose(kc, (1, 2, 0))
    if translation_invariant:
        k[:, :, 0:3] = -k[:, :, 6:9]
    return k
