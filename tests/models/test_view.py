"""spanstay view: off-screen pictures, the GIF, the drawn geometry and bad input.

The results folder is the invented test fixture of view_results_fixture.py
(a real fem solve of a small made-up structure), so these tests do not
depend on the trade layer's run.
"""
from __future__ import annotations

import json
import shutil
from pathlib import Path

import numpy as np
import pytest
from click.testing import CliRunner
from PIL import Image

from spanstay.models.cli import main
from spanstay.models.outputs.view_data import cell_field, load_results, part_cells, soil_reaction
from spanstay.models.outputs.view_scene import deformed, member_prisms
from view_results_fixture import make_results

STATIONS = 4


@pytest.fixture(scope="module")
def results_dir(tmp_path_factory) -> Path:
    return make_results(tmp_path_factory.mktemp("fixture") / "results", stations=STATIONS)


def _run(*args: str):
    return CliRunner().invoke(main, ["view", *map(str, args)])


def _grey(path: Path) -> np.ndarray:
    return np.asarray(Image.open(path).convert("L"), float) / 255.0


def test_png_has_requested_size_is_not_blank_and_differs_between_stations(results_dir, tmp_path):
    a, b = tmp_path / "a.png", tmp_path / "b.png"
    for station, path in ((0, a), (STATIONS - 1, b)):
        res = _run(results_dir, "--station", station, "--png", path, "--size", "480x320",
                   "--color", "N")
        assert res.exit_code == 0, res.output
    ga, gb = _grey(a), _grey(b)
    assert ga.shape == (320, 480) and gb.shape == (320, 480)  # rows x columns
    # not blank: a fair share of pixels differs from the background (the most common grey)
    for g in (ga, gb):
        background = np.median(g)
        assert np.mean(np.abs(g - background) > 0.05) > 0.02
    # the rider moved from a quarter to three quarters of the span: the pictures differ
    assert np.mean(np.abs(ga - gb) > 0.05) > 0.002


def test_gif_has_one_frame_per_requested_station(results_dir, tmp_path):
    path = tmp_path / "ride.gif"
    res = _run(results_dir, "--gif", path, "--frames", 3, "--size", "320x240")
    assert res.exit_code == 0, res.output
    with Image.open(path) as gif:
        assert gif.size == (320, 240)
        assert gif.n_frames == 3
        frames = []
        for i in range(gif.n_frames):
            gif.seek(i)
            frames.append(np.asarray(gif.convert("L"), float))
    assert np.mean(np.abs(frames[0] - frames[-1]) > 10) > 0.002  # the rider moves


def test_members_are_drawn_with_their_true_section(results_dir):
    """The prism of each post element spans the section: width along local y, depth across."""
    res = load_results(results_dir)
    st = res.station(0)
    pos = deformed(res, st, 1.0)
    prisms = member_prisms(res, st, pos)
    for name in ("east.post", "east.pier", "west.ply0"):
        part = next(p for p in res.parts if p["name"] == name)
        cell = part_cells(res, st)[name][0]
        # the faces of one element, then the points they use
        offsets = np.r_[0, np.cumsum(_face_sizes(prisms.faces) + 1)]
        faces = np.flatnonzero(prisms.face_cell == cell)
        ids = np.concatenate([prisms.faces[offsets[f] + 1:offsets[f + 1]] for f in faces])
        pts = prisms.points[np.unique(ids)]
        a, b = pos[st.conn[cell]]
        ex = (b - a) / np.linalg.norm(b - a)
        ey = np.asarray(part["local_y"], float)
        ey = ey - ey @ ex * ex
        ey /= np.linalg.norm(ey)
        ez = np.cross(ex, ey)
        span_y, span_z = np.ptp(pts @ ey), np.ptp(pts @ ez)
        if part["shape"] == "round":
            # a 14-sided polygon inscribed in the circle: across corners = diameter
            assert max(span_y, span_z) == pytest.approx(part["diameter"], rel=1e-9)
            assert min(span_y, span_z) >= part["diameter"] * np.cos(np.pi / 14) * (1 - 1e-9)
        elif part["kind"] == "ply":
            # plies are drawn 10 % thinner so the joints between them show
            assert span_y == pytest.approx(0.9 * part["width"], rel=1e-9)
            assert span_z == pytest.approx(part["depth"], rel=1e-9)
        else:
            assert (span_y, span_z) == pytest.approx((part["width"], part["depth"]), rel=1e-9)


def _face_sizes(faces: np.ndarray) -> np.ndarray:
    sizes, i = [], 0
    while i < faces.size:
        sizes.append(faces[i])
        i += faces[i] + 1
    return np.asarray(sizes)


def test_soil_reaction_equals_the_springs_hooke_law(results_dir):
    """Shear jumps in the embedded part give the spring forces k u (fixture k = 3e7 N/m)."""
    res = load_results(results_dir)
    st = res.station(2)
    depth, p = soil_reaction(res, st)[1]["west.embedded"]
    idx = part_cells(res, st)["west.embedded"]
    nodes = np.r_[st.conn[idx, 0], st.conn[idx[-1], 1]]
    u = np.hypot(st.displacement[nodes, 0], st.displacement[nodes, 1])
    h = np.diff(depth)
    trib = 0.5 * (h + np.r_[h[1:], 0.0])
    # Hooke's law of the fixture's linear springs (k per node, invented test value)
    assert p[1:] * trib == pytest.approx(3e7 * u[1:], rel=0.01)


def test_ropes_keep_their_true_shape_under_exaggeration(results_dir):
    """The rider's drop below the straight line between the drawn rope ends, over that line's
    length, is independent of the exaggeration (only posts and footings are scaled)."""
    res = load_results(results_dir)
    st = res.station(1)
    line = res.summary["model"]["lines"]["main"]
    ends, rider = (line["nodes"][0], line["nodes"][-1]), line["rider_node"]

    def drop(factor):
        pos = deformed(res, st, factor)
        a, b, r = pos[ends[0]], pos[ends[1]], pos[rider]
        t = np.dot(r - a, b - a) / np.dot(b - a, b - a)
        return np.linalg.norm(a + t * (b - a) - r) / np.linalg.norm(b - a)

    # a similarity maps the true rope onto the drawn ends: drop / chord is kept exactly
    assert drop(20.0) == pytest.approx(drop(1.0), rel=1e-9)
    # and the posts do move more: the west top goes 20 times as far
    top = res.summary["model"]["anchors"]["west"]["top_node"]
    moved = deformed(res, st, 20.0)[top] - st.points[top]
    assert moved == pytest.approx(20.0 * st.displacement[top], rel=1e-9)


def test_fields_have_values_where_they_apply(results_dir):
    res = load_results(results_dir)
    st = res.station(0)
    cells = part_cells(res, st)
    tension = cell_field(res, st, "tension")
    assert np.all(tension[cells["line.main"]] > 0) and np.all(np.isnan(tension[cells["east.post"]]))
    util = cell_field(res, st, "utilization")
    # fixture check "east.soil" (utilization 0.41) names the east footing by its id
    assert np.all(util[cells["east.pier"]] == pytest.approx(0.41))


def test_bad_input_exits_2_with_a_message(results_dir, tmp_path):
    res = _run(tmp_path / "missing", "--png", tmp_path / "x.png")
    assert res.exit_code == 2 and "does not exist" in res.output
    empty = tmp_path / "empty"
    empty.mkdir()
    res = _run(empty, "--png", tmp_path / "x.png")
    assert res.exit_code == 2 and "summary.json" in res.output
    res = _run(results_dir, "--station", STATIONS, "--png", tmp_path / "x.png")
    assert res.exit_code == 2 and f"0 to {STATIONS - 1}" in res.output
    res = _run(results_dir, "--station", 1, "--worst", "--png", tmp_path / "x.png")
    assert res.exit_code == 2 and "not both" in res.output
    res = _run(results_dir, "--exaggerate", -2, "--png", tmp_path / "x.png")
    assert res.exit_code == 2 and "positive" in res.output
    res = _run(results_dir, "--color", "sparkle", "--png", tmp_path / "x.png")
    assert res.exit_code == 2
    for known in ("utilization", "N", "My", "Mz", "tension", "soil"):
        assert known in res.output
    partial = tmp_path / "partial"
    shutil.copytree(results_dir, partial)
    (partial / "vtk" / "ride_heavy_002.vtu").unlink()
    res = _run(partial, "--png", tmp_path / "x.png")
    assert res.exit_code == 2 and "missing" in res.output
    summary = json.loads((partial / "summary.json").read_text())
    del summary["vtk"]
    (partial / "summary.json").write_text(json.dumps(summary))
    res = _run(partial, "--png", tmp_path / "x.png")
    assert res.exit_code == 2 and "incomplete" in res.output
    assert not (tmp_path / "x.png").exists()
