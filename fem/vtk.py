"""VTK output through meshio: one .vtu per state, a .pvd collection per series."""
from __future__ import annotations

import os
from pathlib import Path
from xml.sax.saxutils import quoteattr

import numpy as np

FORCE_NAMES = ("N", "Vy", "Vz", "T", "My", "Mz")


def _cell_fields(model, state) -> tuple[list[np.ndarray], dict[str, list[np.ndarray]]]:
    """Line cells of every two-node group, with force fields (NaN where not defined)."""
    blocks, data = [], {k: [] for k in FORCE_NAMES + ("tension", "group")}
    for gi, g in enumerate(model.groups):
        if g.conn.shape[1] != 2:
            continue
        ne = g.size
        res = state.group(g.name).__dict__
        blocks.append(g.conn.astype(np.int64))
        ends = res.get("end_forces")
        for j, key in enumerate(FORCE_NAMES):
            if ends is not None:
                # report the end with the larger magnitude, keeping its sign
                a, b = ends[:, 0, j], ends[:, 1, j]
                data[key].append(np.where(np.abs(a) >= np.abs(b), a, b))
            else:
                data[key].append(np.full(ne, np.nan))
        ten = res.get("tension")
        data["tension"].append(ten if ten is not None else np.full(ne, np.nan))
        data["group"].append(np.full(ne, float(gi)))
    return blocks, data


def write_vtu(path: str | os.PathLike, model, state, extra_point_data: dict | None = None,
              extra_cell_data: dict | None = None) -> Path:
    """Write the model and a solved state to a .vtu file.

    Points are the undeformed nodes with ``displacement`` and ``rotation``
    point data (apply a warp filter to see the deformed shape); cells are the
    two-node elements with N, Vy, Vz, T, My, Mz (beams; the end of larger
    magnitude), ``tension`` (cables) and ``group`` (group index) cell data.
    """
    import meshio

    blocks, data = _cell_fields(model, state)
    u = state.u
    point_data = {"displacement": u[:, :3], "rotation": u[:, 3:]}
    point_data.update(extra_point_data or {})
    cells = [("line", b) for b in blocks]
    cell_data = {k: v for k, v in data.items()}
    for k, v in (extra_cell_data or {}).items():
        cell_data[k] = v
    mesh = meshio.Mesh(model.coords, cells, point_data=point_data, cell_data=cell_data)
    path = Path(path)
    # raw binary: zlib compression took 40% of the writing time for files of tens of kB
    mesh.write(path, file_format="vtu", binary=True, compression=None)
    return path


def write_pvd(path: str | os.PathLike, entries: list[tuple[float, str]]) -> Path:
    """Write a VTK collection file (.pvd) of (time, relative .vtu path) entries."""
    lines = ['<?xml version="1.0"?>',
             '<VTKFile type="Collection" version="0.1" byte_order="LittleEndian">',
             "  <Collection>"]
    for t, f in entries:
        lines.append(f'    <DataSet timestep="{float(t):.10g}" group="" part="0" file={quoteattr(str(f))}/>')
    lines += ["  </Collection>", "</VTKFile>", ""]
    path = Path(path)
    path.write_text("\n".join(lines))
    return path
