"""TEST FIXTURE ONLY: a small results folder in the layout `spanstay run` writes.

The structure, numbers and checks below are invented for the view and report
tests; they are not a design and not a result of the trade layer. The fem
model is real (solved with fem.solve) so the .vtu files carry genuine
displacements and section forces: a laminated post of three plies on an
embedded footing, a sawn post in a round pier with a guy, and a cable
between the post tops with a rider node moved along it by shifting the
unstressed length from one side of the rider to the other.
"""
from __future__ import annotations

import json
from pathlib import Path

import numpy as np

import spanstay.fem as fem

# -- invented fixture values (SI) -------------------------------------------
E_WOOD, G_WOOD = 11e9, 11e9 / 16
SPAN = 20.0
WEST_H, EAST_H = 4.0, 3.0
EAST_GRADE = -1.0
PLY_T, PLY_W = 0.038, 0.184
EAST_B = 0.14
PIER_D = 0.40
EA_ROPE, W_ROPE = 5.0e6, 3.0
RIDER = 1000.0
HANG = 1.5
SEGMENTS, RIDER_K = 10, 5
STRAIN_GUESS = 1.5e-3  # cable strain under the rider, for the predictor


def _model():
    m = fem.Model()
    parts, groups = [], []

    def beams(n1, n2, section, orient, name, kind, shape, **dims):
        m.add_beams(n1, n2, section, orientation=orient, name=name)
        groups.append(name)
        parts.append({"name": name, "kind": kind, "group": name, "group_index": len(m.groups) - 1,
                      "shape": shape, "width": dims.get("width"), "depth": dims.get("depth"),
                      "diameter": dims.get("diameter"), "local_y": list(map(float, orient))})

    # west: three plies side by side (stacked across the line, along y), each a beam line, on an embedded footing
    hs = np.linspace(0.0, WEST_H, 9)
    ply_nodes = []
    for i, y in enumerate((-PLY_T, 0.0, PLY_T)):
        ids = m.add_nodes(np.c_[np.zeros(hs.size), np.full(hs.size, y), hs])
        ply_nodes.append(ids)
        beams(ids[:-1], ids[1:], fem.BeamSection.rectangle(E_WOOD, G_WOOD, PLY_T, PLY_W),
              (0.0, 1.0, 0.0), f"west.ply{i}", "ply", "rectangle", width=PLY_T, depth=PLY_W)
    joints = np.c_[[1e9, 8e7, 8e7, 1e5, 1e5, 1e5]].T.repeat(hs.size, 0)
    m.add_links(np.r_[ply_nodes[0], ply_nodes[1]], np.r_[ply_nodes[1], ply_nodes[2]],
                np.r_[joints, joints], name="west.joints")
    ds = np.linspace(0.0, 1.5, 7)[1:]
    emb = np.r_[ply_nodes[1][0], m.add_nodes(np.c_[np.zeros(ds.size), np.zeros(ds.size), -ds])]
    beams(emb[:-1], emb[1:], fem.BeamSection.rectangle(E_WOOD, G_WOOD, 3 * PLY_T, PLY_W),
          (0.0, 1.0, 0.0), "west.embedded", "embedded", "rectangle", width=3 * PLY_T, depth=PLY_W)
    m.add_links([ply_nodes[0][0], ply_nodes[2][0]], [emb[0], emb[0]], [1e10] * 6, name="west.base")
    m.add_springs(emb[1:], "ux", fem.LinearLaw(3e7), name="west.soil_x")
    m.add_springs(emb[1:], "uy", fem.LinearLaw(3e7), name="west.soil_y")
    m.fix(emb[-1], ["uz", "rz"])

    # east: sawn post in a concrete pier, guyed back
    he = np.linspace(0.0, EAST_H, 7)
    east = m.add_nodes(np.c_[np.full(he.size, SPAN), np.zeros(he.size), EAST_GRADE + he])
    beams(east[:-1], east[1:], fem.BeamSection.rectangle(E_WOOD, G_WOOD, EAST_B, EAST_B),
          (0.0, 1.0, 0.0), "east.post", "post", "rectangle", width=EAST_B, depth=EAST_B)
    dp = np.linspace(0.0, 1.2, 5)[1:]
    pier = np.r_[east[0], m.add_nodes(np.c_[np.full(dp.size, SPAN), np.zeros(dp.size),
                                              EAST_GRADE - dp])]
    beams(pier[:-1], pier[1:], fem.BeamSection.circle(25e9, 10e9, PIER_D), (0.0, 1.0, 0.0),
          "east.pier", "pier", "round", diameter=PIER_D)
    m.add_springs(pier[1:], "ux", fem.LinearLaw(8e6), name="east.soil_x")
    m.add_springs(pier[1:], "uy", fem.LinearLaw(8e6), name="east.soil_y")
    m.fix(pier[-1], ["uz", "rz"])
    guy_ground = m.add_node([SPAN + 2.5, 0.0, EAST_GRADE])
    gl = float(np.hypot(2.5, EAST_H))
    m.add_cables([east[-1]], [guy_ground], 2e6, gl * 0.9995, name="east.guy")
    groups.append("east.guy")
    parts.append({"name": "east.guy", "kind": "guy", "group": "east.guy",
                  "group_index": len(m.groups) - 1, "shape": "line", "width": None,
                  "depth": None, "diameter": 0.008, "local_y": None})
    m.fix(guy_ground, "all")

    # the line, top to top, with the rider node at RIDER_K
    a, b = m.coords[ply_nodes[1][-1]], m.coords[east[-1]]
    inner = a + np.linspace(0, 1, SEGMENTS + 1)[1:-1, None] * (b - a)
    line = np.r_[ply_nodes[1][-1], m.add_nodes(inner), east[-1]]
    chord = float(np.linalg.norm(b - a))
    L0 = chord * (1.0 - 6e-4)
    m.add_cables(line[:-1], line[1:], EA_ROPE, L0 / SEGMENTS, weight=W_ROPE, name="line.main")
    parts.append({"name": "line.main", "kind": "cable", "group": "line.main",
                  "group_index": len(m.groups) - 1, "shape": "line", "width": None,
                  "depth": None, "diameter": 0.0095, "local_y": None})
    anchors = {
        "west": {"grade_xyz": [0.0, 0.0, 0.0], "top_node": int(ply_nodes[1][-1]),
                 "attach_nodes": [int(ply_nodes[1][-1])]},
        "east": {"grade_xyz": [SPAN, 0.0, EAST_GRADE], "top_node": int(east[-1]),
                 "attach_nodes": [int(east[-1])]},
    }
    return m, parts, anchors, line, L0


def _place(m, state, line, L0, s):
    """Shift unstressed length across the rider node and predict a taut shape."""
    k, n = RIDER_K, SEGMENTS
    m.group("line.main").L0[:] = np.r_[np.full(k, s / k), np.full(n - k, (L0 - s) / (n - k))]
    pos = m.coords[line] + state.translation[line]
    a, b = pos[0], pos[-1]
    r1, r2 = s * (1 + STRAIN_GUESS), (L0 - s) * (1 + STRAIN_GUESS)
    d = float(np.linalg.norm(b - a))
    e = (b - a) / d
    down = np.array([0.0, 0.0, -1.0]) + e[2] * e
    down /= np.linalg.norm(down)
    x = (r1**2 - r2**2 + d**2) / (2 * d)
    p = a + x * e + np.sqrt(max(r1**2 - x**2, 0.0)) * down
    new = np.r_[a + np.linspace(0, 1, k + 1)[:, None] * (p - a),
                (p + np.linspace(0, 1, n - k + 1)[1:, None] * (b - p))]
    warm = state.copy()
    warm.translation[line[1:-1]] = new[1:-1] - m.coords[line[1:-1]]
    return warm


def make_results(out: Path, stations: int = 4, with_report: bool = False) -> Path:
    """Write an invented results folder (summary.json, vtk/, plots/) to ``out``."""
    out = Path(out)
    (out / "vtk").mkdir(parents=True, exist_ok=True)
    (out / "plots").mkdir(exist_ok=True)
    m, parts, anchors, line, L0 = _model()
    installed = fem.solve(m, steps=2)
    svals = np.linspace(0.25, 0.75, stations) * L0
    rider = int(line[RIDER_K])
    state, entries, files, along, xyz, tension, sag = installed, [], [], [], [], [], []
    first = True
    for i, s in enumerate(svals):
        warm = _place(m, state, line, L0, float(s))
        m.set_load(rider, [0.0, 0.0, -RIDER])
        state = fem.solve(m, state=warm, steps=4 if first else 2)
        first = False
        name = f"vtk/ride_heavy_{i:03d}.vtu"
        fem.write_vtu(out / name, m, state)
        entries.append((i, Path(name).name))
        files.append(name)
        p = m.coords[rider] + state.translation[rider]
        along.append(float(p[0]))
        xyz.append(p.tolist())
        t = state.group("line.main").tension
        tension.append([float(t[0]), float(t[-1]), float(t.max())])
        chord_z = 4.0 + (EAST_GRADE + EAST_H - 4.0) * p[0] / SPAN
        sag.append(float(chord_z - p[2]))
    fem.write_pvd(out / "vtk/ride_heavy.pvd", entries)
    summary = _summary(parts, anchors, line, rider, along, xyz, tension, sag, files, svals)
    (out / "summary.json").write_text(json.dumps(summary, indent=1))
    return out


def _summary(parts, anchors, line, rider, along, xyz, tension, sag, files, svals) -> dict:
    tmax = max(t[2] for t in tension)
    gov = int(np.argmax([t[2] for t in tension]))
    governing = {"pass": "ride_heavy", "rider_weight": RIDER, "station": gov, "along": along[gov]}
    n = len(along)
    checks = [
        {"id": "line.main.tension", "part": "line.main", "where": "line 'main'",
         "description": "cable tension / (breaking strength x efficiency / factor of safety)",
         "demand": tmax, "capacity": 12000.0, "kind": "force", "utilization": tmax / 12000.0,
         "passed": tmax < 12000.0, "governing": governing, "source": "fixture (invented)",
         "note": ""},
        {"id": "west.ply.bending", "part": "west.ply1", "where": "anchor 'west' post",
         "description": "ply bending stress", "demand": 9.1e6, "capacity": 8.0e6, "kind": "stress",
         "utilization": 9.1e6 / 8.0e6, "passed": False, "governing": governing,
         "source": "fixture (invented)", "note": "invented value: fails on purpose"},
        {"id": "east.soil", "part": "east.pier", "where": "anchor 'east' footing",
         "description": "soil p/p_u", "demand": 0.41, "capacity": 1.0, "kind": "ratio",
         "utilization": 0.41, "passed": True, "governing": governing,
         "source": "fixture (invented)", "note": ""},
        {"id": "ride.clearance", "part": "line.main", "where": "line 'main'",
         "description": "feet above ground", "demand": 0.2, "capacity": 0.6, "kind": "length",
         "utilization": None, "passed": True, "governing": governing,
         "source": "common practice", "note": "null utilization on purpose"},
    ]
    ground = [[-2.0, 0.3], [10.0, -0.3], [22.0, EAST_GRADE]]
    cautions = ["TEST FIXTURE: invented data.", "Results are for preliminary design only.",
                "A qualified (licensed) engineer must review the design."]
    speed = np.sqrt(np.clip(np.linspace(0, 1, 11) * (1 - np.linspace(0, 1, 11)) * 40, 0, None))
    return {
        "spanstay": {"version": "fixture"},
        "cautions": cautions,
        "project": {"name": "Fixture line (test data)", "notes": "invented for tests"},
        "scenario_file": "fixture.toml", "units": "si",
        "inputs": {"project": {"name": "Fixture line", "notes": ""},
                   "rider": {"heaviest": RIDER, "lightest": 300.0, "hang_distance": HANG,
                             "drag_area": 0.5},
                   "lines": [{"name": "main", "sag": 0.3, "rope": {"diameter": 0.0095,
                                                                  "breaking_strength": 60000.0}}]},
        "installed": {"lines": {"main": {"unstressed_length": float(svals[-1] / 0.75),
                                         "sag": 0.3, "tension_start": 3000.0,
                                         "tension_end": 3000.0}}},
        "passes": {"ride_heavy": {
            "weight": RIDER, "temperature": 288.15, "stations": n, "failed_at": None,
            "failure": "", "s": svals.tolist(), "along": along, "rider_xyz": xyz, "sag": sag,
            "tension_start": [t[0] for t in tension], "tension_end": [t[1] for t in tension],
            "tension_max": [t[2] for t in tension],
            "soil_ratio": {"west": [0.2] * n, "east": [0.41] * n},
            "ground_rotation": {"west": [0.004] * n, "east": [0.002] * n},
            "anchor_disp": {"west": [[0.02, 0, 0]] * n, "east": [[-0.01, 0, 0]] * n},
            "guy_tension": {"east.guy": [1500.0] * n}}},
        "ride": {"heaviest": {"arrival_speed": 2.0, "top_speed": 6.5, "top_speed_at": 9.0,
                              "stopped_at": None, "time": 5.0,
                              "along": np.linspace(0, SPAN, 11).tolist(), "speed": speed.tolist()},
                 "clearance": {"min": 0.2, "at": 11.0}},
        "slack_budget": {"pass": "ride_heavy", "station": gov, "along": along[gov],
                         "loaded_sag": sag[gov],
                         "shares": {"cable stretch": 0.5 * sag[gov], "west post": 0.2 * sag[gov],
                                    "east guy": 0.1 * sag[gov], "geometry": 0.2 * sag[gov]}},
        "checks": checks,
        "model": {"parts": parts, "anchors": anchors,
                  "lines": {"main": {"nodes": [int(i) for i in line], "rider_node": rider}},
                  "hang_distance": HANG, "ground_profile": ground,
                  "line_start_xyz": [0.0, 0.0, WEST_H], "line_end_xyz": [SPAN, 0.0,
                                                                        EAST_GRADE + EAST_H]},
        "vtk": {"ride_heavy": {"pvd": "vtk/ride_heavy.pvd", "files": files, "along": along}},
        "plots": {},
    }
