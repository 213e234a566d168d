"""VTK output: .vtu files readable by meshio with the expected fields; .pvd collections."""
from __future__ import annotations

import xml.etree.ElementTree as ET

import meshio
import numpy as np
import pytest

import spanstay.fem as fem


def guyed_post():
    """A cantilever post with a guy cable, a ground spring and a link (all group kinds)."""
    m = fem.Model()
    post = m.add_nodes(np.c_[np.zeros(5), np.zeros(5), np.linspace(0, 3, 5)])
    m.add_beams(post[:-1], post[1:], fem.BeamSection.rectangle(10e9, 6e8, 0.15, 0.15),
                orientation=(1, 0, 0), name="post")
    anchor = m.add_node([-4.0, 0, 0])
    m.add_cables([anchor], [post[-1]], 2e6, 5.0 * 0.999, name="guy")
    m.add_springs([post[0]], "ry", fem.LinearLaw(1e6), name="soil")
    bracket = m.add_node([0.1, 0, 3.0])
    m.add_links([post[-1]], [bracket], [1e9] * 6, offset1=[0.1, 0, 0], name="bracket")
    m.fix(post[0], ["ux", "uy", "uz", "rx", "rz"])
    m.fix(anchor, "xyz")
    m.add_load(bracket, [800.0, 0, -300.0])
    return m, post


def test_vtu_readable_with_displacements_and_forces(tmp_path):
    m, post = guyed_post()
    s = fem.solve(m)
    path = fem.write_vtu(tmp_path / "state_000.vtu", m, s,
                         extra_point_data={"marker": np.arange(m.n_nodes, dtype=float)})
    assert path.exists()
    mesh = meshio.read(path)
    assert np.allclose(mesh.points, m.coords)
    assert np.allclose(mesh.point_data["displacement"], s.u[:, :3])
    assert np.allclose(mesh.point_data["rotation"], s.u[:, 3:])
    assert np.allclose(mesh.point_data["marker"], np.arange(m.n_nodes))
    # line cells of the two-node groups in order: 4 beams, 1 cable, 1 link (springs: none)
    conn = np.concatenate([c.data for c in mesh.cells])
    assert all(c.type == "line" for c in mesh.cells)
    assert np.array_equal(conn, np.concatenate([m.group(g).conn for g in ("post", "guy", "bracket")]))
    cell = {k: np.concatenate(v) for k, v in mesh.cell_data.items()}
    for key in ("N", "Vy", "Vz", "T", "My", "Mz", "tension", "group"):
        assert cell[key].shape == (6,)
    ends = s.group("post").end_forces
    bigger = np.where(np.abs(ends[:, 0, :]) >= np.abs(ends[:, 1, :]), ends[:, 0, :], ends[:, 1, :])
    for j, key in enumerate(("N", "Vy", "Vz", "T", "My", "Mz")):
        assert np.allclose(cell[key][:4], bigger[:, j])
        assert np.all(np.isnan(cell[key][4:]))                  # not defined for cable and link
    assert np.allclose(cell["tension"][4], s.group("guy").tension[0])
    assert s.group("guy").tension[0] > 0
    assert np.all(np.isnan(cell["tension"][[0, 1, 2, 3, 5]]))
    assert cell["group"].tolist() == [0.0] * 4 + [1.0, 3.0]
    # base moment of the post (bending about global y = local z here) equals the spring reaction
    assert abs(cell["Mz"][0]) == pytest.approx(abs(s.reactions[post[0], 4]), rel=1e-6)


def test_pvd_lists_the_files_in_order(tmp_path):
    m, _ = guyed_post()
    entries = []
    state = None
    for i, f in enumerate((0.5, 1.0)):
        state = fem.solve(m, state=state, factor=f)
        name = f"station_{i:03d}.vtu"
        fem.write_vtu(tmp_path / name, m, state)
        entries.append((f, name))
    pvd = fem.write_pvd(tmp_path / "series.pvd", entries)
    root = ET.parse(pvd).getroot()
    assert root.tag == "VTKFile" and root.get("type") == "Collection"
    sets = root.find("Collection").findall("DataSet")
    assert [d.get("file") for d in sets] == ["station_000.vtu", "station_001.vtu"]
    assert [float(d.get("timestep")) for d in sets] == [0.5, 1.0]
    for d in sets:
        assert (tmp_path / d.get("file")).exists()
        meshio.read(tmp_path / d.get("file"))


def test_pvd_escapes_file_names(tmp_path):
    pvd = fem.write_pvd(tmp_path / "odd.pvd", [(0.0, 'a "quoted" & <odd>.vtu')])
    sets = ET.parse(pvd).getroot().find("Collection").findall("DataSet")
    assert sets[0].get("file") == 'a "quoted" & <odd>.vtu'
