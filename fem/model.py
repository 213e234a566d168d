"""The model: nodes, supports, loads and element groups."""
from __future__ import annotations

import numpy as np

from .beam import BeamGroup, BeamSection
from .cable import CableGroup
from .checks import as_array, node_ids
from .errors import ModelError
from .group import DOF_NAMES, ElementGroup
from .link import LinkGroup
from .planar_spring import PlanarSpringGroup
from .spring import SpringGroup, SpringLaw, check_law

_DOF_WORDS = {"all": [0, 1, 2, 3, 4, 5], "xyz": [0, 1, 2], "rxyz": [3, 4, 5]}


def parse_dofs(dofs) -> list[int]:
    """DOF indices from 'all', 'xyz', 'rxyz', names like 'uz' or indices 0..5."""
    if isinstance(dofs, str):
        if dofs in _DOF_WORDS:
            return _DOF_WORDS[dofs]
        if dofs in DOF_NAMES:
            return [DOF_NAMES.index(dofs)]
        raise ModelError(f"unknown DOF set '{dofs}'; use all, xyz, rxyz or one of {', '.join(DOF_NAMES)}")
    out = []
    for d in np.atleast_1d(dofs):
        if isinstance(d, str):
            out += parse_dofs(d)
        elif int(d) in range(6):
            out.append(int(d))
        else:
            raise ModelError(f"DOF index must be 0..5 (ux, uy, uz, rx, ry, rz), got {d}")
    return out


class Model:
    """A 3D structural model with six DOFs per node.

    Loads added with :meth:`add_load` and element self-weights are scaled by
    the load factor of a solve; :meth:`prescribe` displacements likewise.
    """

    def __init__(self, gravity=(0.0, 0.0, -1.0)) -> None:
        self._coords: list[np.ndarray] = []
        self._n = 0
        self.gravity = as_array("gravity", gravity, (3,), "model: ")
        self.groups: list[ElementGroup] = []
        self._fixed: dict[int, float] = {}  # full dof index -> prescribed value
        self._loads: dict[int, float] = {}
        self._cache: np.ndarray | None = None

    # -- nodes ----------------------------------------------------------
    def __getstate__(self) -> dict:
        """Copies and pickles leave the solver's cached context behind (it holds
        factorisations that cannot be pickled and belongs to this object); a copy
        builds its own on its first solve."""
        state = dict(self.__dict__)
        state.pop("_solver_context", None)
        return state

    def add_nodes(self, xyz) -> np.ndarray:
        """Add nodes at (n, 3) coordinates in metres; return their ids."""
        try:
            arr = np.atleast_2d(np.asarray(xyz, dtype=float))
        except (TypeError, ValueError):
            raise ModelError(f"node coordinates must be numbers, got {xyz!r}") from None
        if arr.ndim != 2 or arr.shape[1] != 3:
            raise ModelError(f"node coordinates must have shape (n, 3), got {arr.shape}")
        bad = ~np.isfinite(arr)
        if np.any(bad):
            row, col = (int(i) for i in np.argwhere(bad)[0])
            raise ModelError(f"node {self._n + row}: coordinate {'xyz'[col]} is not finite, got {arr[row, col]}")
        ids = np.arange(self._n, self._n + arr.shape[0])
        self._coords.append(arr)
        self._n += arr.shape[0]
        self._cache = None
        return ids

    def add_node(self, xyz) -> int:
        """Add one node; return its id."""
        return int(self.add_nodes(np.asarray(xyz, dtype=float).reshape(1, 3))[0])

    @property
    def n_nodes(self) -> int:
        return self._n

    @property
    def coords(self) -> np.ndarray:
        """(n, 3) initial coordinates."""
        if self._cache is None or self._cache.shape[0] != self._n:
            self._cache = np.concatenate(self._coords) if self._coords else np.zeros((0, 3))
        return self._cache

    def _nodes(self, nodes, what: str) -> np.ndarray:
        return node_ids("node", nodes, self._n, what)

    # -- supports and loads --------------------------------------------------
    def fix(self, nodes, dofs="all") -> None:
        """Fix the given DOFs of the given nodes (zero displacement)."""
        for n in self._nodes(nodes, "fix").ravel():
            for d in parse_dofs(dofs):
                self._fixed[int(n) * 6 + d] = 0.0

    def prescribe(self, node: int, dof, value: float) -> None:
        """Prescribe a displacement (scaled by the load factor) at one DOF."""
        n = int(self._nodes(node, "prescribe")[0])
        dofs = parse_dofs(dof)
        try:
            val = float(value)
        except (TypeError, ValueError):
            val = np.nan
        if not np.isfinite(val):
            raise ModelError(f"prescribe: node {n} {'/'.join(DOF_NAMES[d] for d in dofs)}: the value "
                             f"must be a finite number, got {value!r}")
        for d in dofs:
            self._fixed[n * 6 + d] = val

    def release(self, node: int, dofs="all") -> None:
        """Remove supports or prescribed values from DOFs of a node."""
        n = int(self._nodes(node, "release")[0])
        for d in parse_dofs(dofs):
            self._fixed.pop(n * 6 + d, None)

    def add_load(self, node, load) -> None:
        """Add a reference nodal load [Fx, Fy, Fz, Mx, My, Mz] (N, N m)."""
        nodes = self._nodes(node, "add_load").ravel()
        try:
            vec = np.asarray(load, dtype=float)
        except (TypeError, ValueError):
            raise ModelError(f"add_load: the load on node {nodes[0]} must be numbers, got {load!r}") from None
        if vec.shape not in ((3,), (6,)):
            raise ModelError(f"add_load: a nodal load has 3 or 6 components, got shape {vec.shape}")
        bad = ~np.isfinite(vec)
        if np.any(bad):
            d = int(np.argmax(bad))
            raise ModelError(f"add_load: load on node {nodes[0]} {DOF_NAMES[d]} is not finite, got {vec[d]}")
        for n in nodes:
            for d, v in enumerate(vec):
                if v != 0.0:
                    key = int(n) * 6 + d
                    self._loads[key] = self._loads.get(key, 0.0) + float(v)

    def set_load(self, node: int, load) -> None:
        """Replace the reference load of a node (used to move a load between solves)."""
        n = int(self._nodes(node, "set_load")[0])
        for d in range(6):
            self._loads.pop(n * 6 + d, None)
        self.add_load(n, load)

    def clear_loads(self) -> None:
        """Remove every nodal load (element self-weights stay)."""
        self._loads.clear()

    @property
    def fixed(self) -> dict[int, float]:
        return dict(self._fixed)

    @property
    def loads(self) -> dict[int, float]:
        return dict(self._loads)

    # -- element groups -------------------------------------------------------
    def _add(self, group: ElementGroup) -> ElementGroup:
        if any(g.name == group.name for g in self.groups):
            raise ModelError(f"an element group named '{group.name}' already exists")
        self.groups.append(group)
        return group

    def _conn(self, n1, n2, what: str) -> np.ndarray:
        a = self._nodes(n1, what).ravel()
        b = self._nodes(n2, what).ravel()
        if a.shape != b.shape:
            raise ModelError(f"{what}: {a.size} start nodes but {b.size} end nodes")
        if a.size == 0:
            raise ModelError(f"{what}: no elements given")
        return np.stack([a, b], axis=1)

    def add_beams(self, n1, n2, section: BeamSection, orientation=(0.0, 0.0, 1.0),
                  name: str = "beams") -> BeamGroup:
        """Add corotational Timoshenko beams from nodes ``n1`` to ``n2``.

        ``orientation`` (3,) or (ne, 3) is a vector in the local x-y plane,
        not parallel to the beam; it sets local y.
        """
        conn = self._conn(n1, n2, f"beam group '{name}'")
        if not isinstance(section, BeamSection):
            raise ModelError(f"beam group '{name}': section must be a BeamSection, got {type(section).__name__}")
        return self._add(BeamGroup(name, conn, self.coords, section, orientation))

    def add_cables(self, n1, n2, EA, L0, weight=0.0, alpha=0.0, dT=0.0,
                   name: str = "cables") -> CableGroup:
        """Add tension-only cable segments (EA N, unstressed length L0 m, weight N/m)."""
        conn = self._conn(n1, n2, f"cable group '{name}'")
        return self._add(CableGroup(name, conn, self.coords, EA, L0, weight, alpha, dT))

    def add_springs(self, nodes, dof, law: SpringLaw, one_sided=0, name: str = "springs") -> SpringGroup:
        """Add node-to-ground springs on DOF ``dof`` (index or name) of ``nodes``."""
        ids = self._nodes(nodes, f"spring group '{name}'").ravel()
        if ids.size == 0:
            raise ModelError(f"spring group '{name}': no nodes given")
        d = parse_dofs(dof)
        if len(d) != 1 and len(d) != ids.size:
            raise ModelError(f"spring group '{name}': give one DOF for all springs or one per node "
                             f"({ids.size} nodes, {len(d)} DOFs)")
        dof_arr = np.asarray(d * ids.size if len(d) == 1 else d)
        group = SpringGroup(name, ids, dof_arr, law, one_sided)
        check_law(group, law)
        return self._add(group)

    def add_planar_springs(self, nodes, law: SpringLaw, name: str = "planar springs"
                           ) -> PlanarSpringGroup:
        """Add springs on the horizontal displacement vector (ux, uy) of ``nodes``: one law on
        its magnitude, the force along it (see :class:`fem.planar_spring.PlanarSpringGroup`)."""
        ids = self._nodes(nodes, f"planar spring group '{name}'").ravel()
        if ids.size == 0:
            raise ModelError(f"planar spring group '{name}': no nodes given")
        group = PlanarSpringGroup(name, ids, law)
        check_law(group, law)
        return self._add(group)

    def add_links(self, n1, n2, stiffness, offset1=0.0, offset2=0.0, axes=np.eye(3),
                  name: str = "links") -> LinkGroup:
        """Add two-node links with rigid offsets (see :class:`fem.link.LinkGroup`)."""
        conn = self._conn(n1, n2, f"link group '{name}'")
        return self._add(LinkGroup(name, conn, self.coords, stiffness, offset1, offset2, axes))

    def group(self, name: str) -> ElementGroup:
        """The element group called ``name``."""
        for g in self.groups:
            if g.name == name:
                return g
        raise ModelError(f"no element group named '{name}' (have: {', '.join(g.name for g in self.groups)})")
