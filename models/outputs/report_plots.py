"""PNG figures of the report drawn from a results folder: slack budget, soil
reaction, post moments, cable profiles, a 3D line drawing and, when the run
wrote none, the ride speed.

matplotlib's Agg canvas directly (no pyplot, no display). Values in the
summary and the .vtu files are SI; ``units`` only changes the axes.
"""
from __future__ import annotations

from pathlib import Path

import numpy as np

from spanstay.models.outputs.view_data import FOOTING_KINDS, MEMBER_KINDS, Results, Station, part_cells, soil_reaction
from spanstay.models.outputs.display_units import convert, scale

PAPER = "#fbfaf6"
INK = "#2b2d33"
GRID = "#ddd7c8"
CABLE = "#33506b"
FEET = "#b4573a"
GROUND_EDGE = "#7a6a4a"
GROUND_FILL = "#e2d6b6"
SERIES = ("#33506b", "#b4573a", "#4f7d4a", "#8a6d1f", "#6b2f7a", "#2f7a78", "#7a2f45")
PASS_COLOUR, FAIL_COLOUR, NONE_COLOUR = "#4f7d4a", "#a8322d", "#b8ad98"
#: light PNG compression: the report is written at the end of every run
FAST_PNG = {"compress_level": 3}


def _figure(size=(900, 480), dpi=100, axes=1, projection=None):
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    fig = Figure(figsize=(size[0] / dpi, size[1] / dpi), dpi=dpi, facecolor=PAPER)
    FigureCanvasAgg(fig)
    kw = {"projection": projection} if projection else {}
    axs = [fig.add_subplot(1, axes, i + 1, **kw) for i in range(axes)]
    for ax in axs:
        ax.set_facecolor(PAPER)
        if projection is None:
            ax.grid(True, color=GRID, linewidth=0.7)
            ax.set_axisbelow(True)
            for side in ("top", "right"):
                ax.spines[side].set_visible(False)
        ax.tick_params(colors=INK, labelsize=8)
    return fig, axs


def _save(fig, path: Path) -> Path:
    path.parent.mkdir(parents=True, exist_ok=True)
    fig.subplots_adjust(left=0.1, right=0.97, bottom=0.14, top=0.88, wspace=0.35)
    fig.savefig(path, dpi=fig.dpi, facecolor=PAPER, format="png", pil_kwargs=FAST_PNG)
    return path


def slack_budget(path: Path, budget: dict, units: str) -> Path | None:
    """Horizontal bars: how much of the loaded sag each part gives."""
    shares = {k: v for k, v in (budget.get("shares") or {}).items() if v is not None}
    if not shares:
        return None
    f, unit = scale("length", units)
    names = list(shares)
    vals = np.array([shares[n] for n in names]) / f
    fig, (ax,) = _figure((900, 90 + 42 * len(names)))
    y = np.arange(len(names))[::-1]
    ax.barh(y, vals, color=[SERIES[i % len(SERIES)] for i in range(len(names))], height=0.6)
    for yi, v in zip(y, vals):
        ax.text(v, yi, f"  {v:.3g} {unit}", va="center", ha="left" if v >= 0 else "right",
                color=INK, fontsize=8)
    ax.set_yticks(y, names, fontsize=8)
    loaded = budget.get("loaded_sag")
    title = "Slack budget: sag each part gives at the rider"
    if loaded is not None:
        title += f" (loaded sag {convert(loaded, 'length', units):.3g} {unit})"
    ax.set_title(title, color=INK, loc="left", fontsize=10)
    ax.set_xlabel(f"share of the loaded sag [{unit}]", color=INK)
    ax.axvline(0, color=INK, linewidth=0.8)
    lo, hi = min(0.0, vals.min()), max(vals.max(), 1e-9)
    ax.set_xlim(lo - 0.05 * (hi - lo), hi + 0.3 * (hi - lo))
    fig.subplots_adjust(left=0.38, bottom=48 / fig.bbox.height, top=1 - 32 / fig.bbox.height)
    fig.savefig(path, dpi=fig.dpi, facecolor=PAPER, format="png", pil_kwargs=FAST_PNG)
    return path


def _soil_curves(results: Results, st: Station) -> dict[str, tuple[np.ndarray, np.ndarray]]:
    """Footing name -> (depth, soil reaction per length): from summary['soil_profiles'] when the
    run wrote them, else from the shear in the footing members of the .vtu."""
    given = results.summary.get("soil_profiles")
    curves = {}
    if isinstance(given, dict) and given:
        for name, rec in given.items():
            if isinstance(rec, dict) and rec.get("depth") and rec.get("p"):
                curves[name] = (np.asarray(rec["depth"], float),
                                np.asarray([np.nan if v is None else v for v in rec["p"]], float))
        if curves:
            return curves
    return soil_reaction(results, st)[1]


def _anchor_of(name: str) -> str:
    return name.split(".")[0]


def posts_and_footings(path: Path, results: Results, st: Station, units: str) -> Path | None:
    """Two panels: bending moment along every member against height above its anchor's
    grade, and the lateral soil reaction along each footing against depth."""
    cells = part_cells(results, st)
    members = [p for p in results.parts if p.get("kind") in MEMBER_KINDS and p["name"] in cells]
    curves = _soil_curves(results, st)
    if not members and not curves:
        return None
    fl, ul = scale("length", units)
    fm, um = scale("moment", units)
    fp, up = scale("force per length", units)
    fig, (ax, bx) = _figure((1000, 520), axes=2)
    anchors = sorted({_anchor_of(p["name"]) for p in members})
    grades = results.summary.get("model", {}).get("anchors", {}) or {}
    styles = ("-", (0, (5, 2)), (0, (1, 1.5)), (0, (6, 2, 1, 2)))
    for i, anchor in enumerate(anchors):
        grade = ((grades.get(anchor) or {}).get("grade_xyz") or [0, 0, 0])[2]
        colour = SERIES[i % len(SERIES)]
        for j, part in enumerate(p for p in members if _anchor_of(p["name"]) == anchor):
            idx = cells[part["name"]]
            z = np.sort(st.points[st.conn[idx]][:, :, 2] - grade, axis=1)[:, ::-1]
            m = np.hypot(st.cells["My"][idx], st.cells["Mz"][idx])
            order = np.argsort(-z.mean(axis=1))
            label = f"{anchor}: {part['name'][len(anchor) + 1:] or part['name']}"
            ax.plot(np.repeat(m[order], 2) / fm, np.c_[z[order, 0], z[order, 1]].ravel() / fl,
                    color=colour, linestyle=styles[j % len(styles)], linewidth=1.6, label=label)
    ax.axhline(0.0, color=GROUND_EDGE, linewidth=1.2)
    ax.set_xlabel(f"bending moment [{um}]", color=INK)
    ax.set_ylabel(f"height above grade [{ul}]", color=INK)
    ax.set_title("Bending moment, larger end of each element", color=INK, loc="left",
                 fontsize=10)
    ax.legend(frameon=False, fontsize=7, loc="upper right")
    for i, (name, (depth, p)) in enumerate(curves.items()):
        bx.plot(p / fp, depth / fl, color=SERIES[i % len(SERIES)], marker="o", markersize=3,
                linewidth=1.6, label=name)
    bx.invert_yaxis()
    bx.set_xlabel(f"lateral soil reaction [{up}]", color=INK)
    bx.set_ylabel(f"depth below grade [{ul}]", color=INK)
    bx.set_title("Soil reaction along each footing", color=INK, loc="left", fontsize=10)
    if curves:
        bx.legend(frameon=False, fontsize=7, loc="upper right")
    fig.suptitle(f"Station {st.index}, rider {convert(st.along, 'length', units):.3g} {ul} along",
                 color=INK, x=0.02, ha="left", fontsize=10)
    fig.subplots_adjust(left=0.08, right=0.98, bottom=0.12, top=0.86, wspace=0.28)
    fig.savefig(path, dpi=fig.dpi, facecolor=PAPER, format="png", pil_kwargs=FAST_PNG)
    return path


def _line_chain(results: Results, name: str) -> list[int] | None:
    rec = (results.summary.get("model", {}).get("lines", {}) or {}).get(name) or {}
    nodes = rec.get("nodes")
    return [int(n) for n in nodes] if nodes else None


def cable_profiles(path: Path, results: Results, stations: list[Station], units: str) -> Path | None:
    """The cable as hung (first .vtu points) and loaded at a few stations, with the ground."""
    model = results.summary.get("model", {})
    lines = model.get("lines") or {}
    if not lines or not stations:
        return None
    name = results.rider_line()
    chain = _line_chain(results, name)
    if not chain:
        return None
    a = np.asarray(model.get("line_start_xyz") or stations[0].points[chain[0]], float)
    b = np.asarray(model.get("line_end_xyz") or stations[0].points[chain[-1]], float)
    d = (b - a)[:2] / max(np.linalg.norm((b - a)[:2]), 1e-12)
    fl, ul = scale("length", units)

    def along(xyz):
        return ((xyz[:, :2] - a[:2]) @ d) / fl

    fig, (ax,) = _figure((900, 480))
    prof = np.asarray(model.get("ground_profile") or [], float)
    if prof.size:
        floor = prof[:, 1].min() - 0.15 * max(np.ptp(prof[:, 1]), 1.0)
        ax.fill_between(prof[:, 0] / fl, prof[:, 1] / fl, floor / fl, color=GROUND_FILL,
                        linewidth=0, label="ground")
        ax.plot(prof[:, 0] / fl, prof[:, 1] / fl, color=GROUND_EDGE, linewidth=1.2)
    x0 = stations[0].points[chain]
    ax.plot(along(x0), x0[:, 2] / fl, color=INK, linewidth=1.4, linestyle=(0, (6, 3)),
            label="as hung (elastic catenary, anchors unmoved)")
    hang = float(model.get("hang_distance") or 0.0)
    rider = (lines[name] or {}).get("rider_node")
    for i, st in enumerate(stations):
        x = st.points[chain] + st.displacement[chain]
        colour = SERIES[(i + 1) % len(SERIES)]
        ax.plot(along(x), x[:, 2] / fl, color=colour, linewidth=1.6,
                label=f"loaded, station {st.index}")
        if rider is not None:
            r = st.points[rider] + st.displacement[rider]
            ax.plot([along(r[None])[0]] * 2, [r[2] / fl, (r[2] - hang) / fl], color=FEET,
                    linewidth=1.2)
            ax.plot([along(r[None])[0]], [r[2] / fl], marker="v", color=colour, markersize=6)
    ax.set_xlabel(f"distance along the line [{ul}]", color=INK)
    ax.set_ylabel(f"elevation [{ul}]", color=INK)
    ax.set_title(f"Cable '{name}' as hung and under the heaviest rider (feet shown below the "
                 f"trolley)", color=INK, loc="left", fontsize=10)
    ax.legend(frameon=False, fontsize=7, loc="lower left", ncol=2)
    return _save(fig, path)


def _broken(segments: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """x, y, z of (n, 2, 3) segments as one polyline broken by NaN (one artist per part)."""
    gap = np.full((segments.shape[0], 1, 3), np.nan)
    xyz = np.concatenate([segments, gap], axis=1).reshape(-1, 3)
    return xyz[:, 0], xyz[:, 1], xyz[:, 2]


def structure_3d(path: Path, results: Results, st: Station, util: dict[str, float],
                 units: str) -> Path:
    """A 3D line drawing of the deformed structure, members coloured pass/fail."""
    from spanstay.models.outputs.view_scene import deformed

    fl, ul = scale("length", units)
    fig, (ax,) = _figure((1000, 440), projection="3d")
    pos = deformed(results, st, 1.0) / fl
    cells = part_cells(results, st)
    x0 = st.points / fl
    drawn = np.isin(st.group, list(results.part_of_group()))
    ax.plot(*_broken(x0[st.conn[drawn]]), color=GRID, linewidth=0.8)
    for part in results.parts:
        idx = cells.get(part["name"])
        if idx is None:
            continue
        u = util.get(part["name"])
        colour = NONE_COLOUR if u is None else (FAIL_COLOUR if u > 1.0 else PASS_COLOUR)
        kind = part.get("kind")
        width = 5.0 if kind in FOOTING_KINDS else 3.0 if kind in MEMBER_KINDS else 1.4
        ax.plot(*_broken(pos[st.conn[idx]]), color=colour, linewidth=width,
                solid_capstyle="butt")
    from spanstay.models.outputs.view_scene import rider_points

    for top, feet, _ in rider_points(results, pos * fl):
        top, feet = top / fl, feet / fl
        ax.plot([top[0], feet[0]], [top[1], feet[1]], [top[2], feet[2]], color="#6b2f7a", linewidth=2)
        ax.scatter([top[0]], [top[1]], [top[2]], color="#6b2f7a", marker="v", s=40)
    prof = np.asarray(results.summary.get("model", {}).get("ground_profile") or [], float)
    a = results.summary.get("model", {}).get("line_start_xyz")
    b = results.summary.get("model", {}).get("line_end_xyz")
    if prof.size and a and b:
        a, b = np.asarray(a, float), np.asarray(b, float)
        d = (b - a)[:2] / max(np.linalg.norm((b - a)[:2]), 1e-12)
        gx = (a[0] + prof[:, 0] * d[0]) / fl
        gy = (a[1] + prof[:, 0] * d[1]) / fl
        ax.plot(gx, gy, prof[:, 1] / fl, color=GROUND_EDGE, linewidth=1.2, linestyle=(0, (5, 3)))
    lo, hi = pos.min(axis=0), pos.max(axis=0)
    span = float(max(hi[0] - lo[0], hi[1] - lo[1], 1e-9))
    half = 0.5 * np.maximum(hi - lo, [0.0, 0.25 * span, 0.0]) + 0.03 * span  # equal scales
    mid = 0.5 * (lo + hi)
    ax.set_xlim(mid[0] - half[0], mid[0] + half[0])
    ax.set_ylim(mid[1] - half[1], mid[1] + half[1])
    ax.set_zlim(mid[2] - half[2], mid[2] + half[2])
    ax.set_box_aspect(2 * half + 1e-9)  # no zoom: the box must stay inside the axes
    ax.view_init(elev=16, azim=-68)
    ax.set_xlabel(f"x [{ul}]", fontsize=8, color=INK)
    ax.set_ylabel(f"y [{ul}]", fontsize=8, color=INK)
    ax.set_zlabel(f"z [{ul}]", fontsize=8, color=INK)
    ax.set_position([-0.12, -0.32, 1.24, 1.55])  # mplot3d leaves wide margins; use them
    ax.set_title("")
    fig.text(0.01, 0.97, f"Deformed structure at station {st.index} (true scale): green members "
             f"pass their checks, red fail, grey unchecked", color=INK, fontsize=9, va="top")
    fig.savefig(path, dpi=fig.dpi, facecolor=PAPER, format="png", pil_kwargs=FAST_PNG)
    return path


def ride_speed(path: Path, ride: dict, units: str) -> Path | None:
    """Speed along the line of each rider in summary['ride'] (used when no speed.png exists)."""
    fl, ul = scale("length", units)
    fv, uv = scale("speed", units)
    fig, (ax,) = _figure((900, 420))
    drawn = False
    for i, (label, r) in enumerate((k, v) for k, v in ride.items() if k != "clearance"):
        if not isinstance(r, dict) or not r.get("along") or not r.get("speed"):
            continue
        x = np.asarray([np.nan if v is None else v for v in r["along"]], float)
        v = np.asarray([np.nan if s is None else s for s in r["speed"]], float)
        ax.plot(x / fl, v / fv, color=SERIES[i % len(SERIES)], linewidth=1.8, label=f"{label} rider")
        drawn = True
    if not drawn:
        return None
    ax.set_xlabel(f"distance along the line [{ul}]", color=INK)
    ax.set_ylabel(f"speed [{uv}]", color=INK)
    ax.set_title("Rider speed along the line", color=INK, loc="left", fontsize=10)
    ax.legend(frameon=False, fontsize=8, loc="upper left")
    return _save(fig, path)
