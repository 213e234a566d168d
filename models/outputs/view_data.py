"""A results folder as the view and the report read it: summary, stations, fields.

Reads ``summary.json`` and the .vtu series written by ``spanstay run`` (see
the results-folder contract); checks that what is needed is there and says
what is missing otherwise (``InputError``).
"""
from __future__ import annotations

import json
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np

from spanstay.models.common.errors import InputError

#: colour fields: name -> (label, display quantity, what it shows)
FIELDS: dict[str, tuple[str, str, str]] = {
    "utilization": ("utilization", "ratio", "governing demand / capacity of each part (checks)"),
    "N": ("axial force N", "force", "axial force, tension positive (beams; cable tension)"),
    "My": ("bending moment My", "moment", "bending moment about the member's local y"),
    "Mz": ("bending moment Mz", "moment", "bending moment about the member's local z"),
    "moment": ("bending moment", "moment", "resultant bending moment sqrt(My² + Mz²)"),
    "tension": ("tension", "force", "cable and guy tension"),
    "soil": ("soil reaction", "force per length",
             "lateral soil reaction per length of footing, from the shear in the embedded part"),
    "displacement": ("displacement", "length", "displacement magnitude"),
}
#: other spellings accepted on the command line
ALIASES = {"axial": "N", "bending": "moment", "soil_reaction": "soil", "soil-reaction": "soil",
           "util": "utilization", "utilisation": "utilization", "u": "displacement"}
#: part kinds drawn as solid members (the others are ropes)
MEMBER_KINDS = ("post", "ply", "pier", "embedded", "brace", "tree")
FOOTING_KINDS = ("pier", "embedded")


def field_name(name: str) -> str:
    """The canonical colour-field name, or InputError listing the known ones."""
    key = ALIASES.get(name, name)
    if key not in FIELDS:
        known = ", ".join(f"{k} ({v[0]})" for k, v in FIELDS.items())
        raise InputError(f"unknown colour field '{name}'; known fields: {known}", "--color")
    return key


@dataclass
class Station:
    """One solved state of a pass, read from its .vtu file (SI)."""

    index: int
    along: float
    points: np.ndarray          # (n, 3) undeformed node coordinates
    displacement: np.ndarray    # (n, 3)
    conn: np.ndarray            # (ne, 2) node ids of the line cells
    cells: dict[str, np.ndarray]  # cell fields, NaN where undefined
    group: np.ndarray           # (ne,) fem group index of each cell


@dataclass
class Results:
    """A results folder: its summary and the .vtu series of one pass."""

    folder: Path
    summary: dict
    pass_label: str
    files: list[Path]
    along: list[float]
    parts: list[dict] = field(default_factory=list)
    _cache: dict = field(default_factory=dict, repr=False)

    @property
    def units(self) -> str:
        return "us" if self.summary.get("units") == "us" else "si"

    @property
    def n_stations(self) -> int:
        return len(self.files)

    def station(self, k: int) -> Station:
        """Station ``k`` (0-based) of the pass; InputError when out of range."""
        n = self.n_stations
        if not isinstance(k, (int, np.integer)) or not 0 <= k < n:
            raise InputError(f"station {k} is out of range: this results folder has {n} stations "
                             f"of pass '{self.pass_label}', numbered 0 to {n - 1}", "--station")
        if k not in self._cache:
            self._cache[k] = _read_vtu(self.files[k], int(k), float(self.along[k]))
        return self._cache[k]

    def worst_station(self) -> int:
        """The station nearest the governing check (highest utilization) of the pass."""
        checks = [c for c in self.summary.get("checks", []) if _num(c.get("utilization")) is not None]
        if checks:
            top = max(checks, key=lambda c: _num(c["utilization"]))
            gov = top.get("governing") or {}
            if gov.get("pass") == self.pass_label and isinstance(gov.get("station"), int) \
                    and 0 <= gov["station"] < self.n_stations:
                return int(gov["station"])
            if _num(gov.get("along")) is not None and self.along:
                return int(np.argmin(np.abs(np.asarray(self.along) - float(gov["along"]))))
        tmax = (self.summary.get("passes", {}).get(self.pass_label, {}) or {}).get("tension_max")
        if tmax and len(tmax) == self.n_stations:
            return int(np.nanargmax(np.asarray(tmax, float)))
        return self.n_stations // 2

    def rider_line(self) -> str | None:
        """Name of the line the rider rides (the scenario's rider.line, else the first line)."""
        lines = list((self.summary.get("model", {}).get("lines") or {}))
        ridden = ((self.summary.get("inputs") or {}).get("rider") or {}).get("line")
        if ridden in lines:
            return ridden
        return lines[0] if lines else None

    def part_of_group(self) -> dict[int, dict]:
        """fem group index -> part record."""
        return {int(p["group_index"]): p for p in self.parts if p.get("group_index") is not None}


def _num(x) -> float | None:
    try:
        v = float(x)
    except (TypeError, ValueError):
        return None
    return v if np.isfinite(v) else None


def load_summary(folder: Path) -> dict:
    """summary.json of a results folder (InputError if missing or unreadable)."""
    folder = Path(folder)
    if not folder.exists():
        raise InputError(f"results folder '{folder}' does not exist; give the --out folder of "
                         f"`spanstay run`")
    if not folder.is_dir():
        raise InputError(f"'{folder}' is not a folder; give the results folder written by "
                         f"`spanstay run` (it holds summary.json and vtk/)")
    path = folder / "summary.json"
    if not path.is_file():
        raise InputError(f"'{folder}' has no summary.json: it is not a complete results folder "
                         f"(run `spanstay run SCENARIO` again; its results go to SCENARIO_results beside "
                         f"the scenario unless --out names a new folder)")
    try:
        summary = json.loads(path.read_text())
    except (OSError, ValueError) as exc:
        raise InputError(f"'{path}' cannot be read as JSON ({exc}); run `spanstay run` again") from None
    if not isinstance(summary, dict):
        raise InputError(f"'{path}' does not hold a summary object; run `spanstay run` again")
    return summary


def load_results(folder: str | Path, pass_label: str | None = None) -> Results:
    """Open a results folder for viewing; InputError says what is missing."""
    folder = Path(folder)
    summary = load_summary(folder)
    missing = [k for k in ("model", "vtk") if not isinstance(summary.get(k), dict)]
    if missing:
        raise InputError(f"'{folder / 'summary.json'}' is incomplete: no {' or '.join(missing)} "
                         f"section (the run may have stopped early); run `spanstay run` again")
    parts = summary["model"].get("parts")
    if not isinstance(parts, list) or not parts:
        raise InputError(f"'{folder / 'summary.json'}' is incomplete: model.parts is empty")
    series = {k: v for k, v in summary["vtk"].items() if isinstance(v, dict) and v.get("files")}
    if not series:
        raise InputError(f"'{folder}' holds no VTK series (summary.json vtk has no files); the "
                         f"run may have failed before the first station")
    label = pass_label or ("ride_heavy" if "ride_heavy" in series else next(iter(series)))
    if label not in series:
        raise InputError(f"no VTK series for pass '{label}'; have: {', '.join(series)}")
    files = [folder / f for f in series[label]["files"]]
    absent = [str(f.relative_to(folder)) for f in files if not f.is_file()]
    if absent:
        raise InputError(f"'{folder}' is incomplete: {len(absent)} of {len(files)} .vtu files of "
                         f"pass '{label}' are missing (first: {absent[0]})")
    along = series[label].get("along") or list(range(len(files)))
    if len(along) != len(files):
        along = list(range(len(files)))
    return Results(folder, summary, label, files, [float(a) for a in along], parts)


def _read_vtu(path: Path, index: int, along: float) -> Station:
    import meshio

    try:
        mesh = meshio.read(path)
    except Exception as exc:  # meshio raises many kinds on a damaged file
        raise InputError(f"cannot read '{path}' ({exc}); run `spanstay run` again") from None
    conn = np.concatenate([c.data for c in mesh.cells if c.type == "line"]).astype(int)
    cells = {}
    for key, blocks in mesh.cell_data.items():
        blocks = [np.asarray(b, float) for b, c in zip(blocks, mesh.cells) if c.type == "line"]
        cells[key] = np.concatenate(blocks) if blocks else np.zeros(0)
    if "displacement" not in mesh.point_data or "group" not in cells:
        raise InputError(f"'{path}' lacks displacement or group data; it was not written by "
                         f"`spanstay run`")
    return Station(index, along, np.asarray(mesh.points, float),
                   np.asarray(mesh.point_data["displacement"], float)[:, :3], conn, cells,
                   cells["group"].astype(int))


# -------------------------------------------------------------- fields
def cell_frames(points: np.ndarray, conn: np.ndarray, local_y: np.ndarray):
    """Unit local axes (ex, ey, ez) of each cell from its chord and a local-y hint."""
    ex = points[conn[:, 1]] - points[conn[:, 0]]
    ex /= np.linalg.norm(ex, axis=1, keepdims=True)
    ey = local_y - np.sum(local_y * ex, axis=1, keepdims=True) * ex
    bad = np.linalg.norm(ey, axis=1) < 1e-9
    if np.any(bad):  # hint along the member: pick any perpendicular
        alt = np.where(np.abs(ex[bad, 2:3]) < 0.9, [[0.0, 0.0, 1.0]], [[1.0, 0.0, 0.0]])
        ey[bad] = np.cross(ex[bad], alt)
    ey /= np.linalg.norm(ey, axis=1, keepdims=True)
    return ex, ey, np.cross(ex, ey)


def part_cells(results: Results, st: Station) -> dict[str, np.ndarray]:
    """Part name -> indices of its cells in the station."""
    by_group = results.part_of_group()
    out: dict[str, np.ndarray] = {}
    for gi, part in by_group.items():
        idx = np.flatnonzero(st.group == gi)
        if idx.size:
            out[part["name"]] = idx
    return out


def soil_reaction(results: Results, st: Station) -> tuple[np.ndarray, dict[str, tuple]]:
    """Lateral soil reaction per length (N/m) on each footing cell, and profiles.

    The soil springs sit at the footing nodes, so the horizontal shear in the
    embedded part changes at each node by the spring force there; the
    reaction per length is that jump over the node's tributary length.
    Returns per-cell values (NaN off footings) and, per footing part,
    (depth below its top node, p) at its nodes.
    """
    values = np.full(st.conn.shape[0], np.nan)
    profiles: dict[str, tuple] = {}
    parts = {p["name"]: p for p in results.parts}
    for name, idx in part_cells(results, st).items():
        part = parts[name]
        if part.get("kind") not in FOOTING_KINDS:
            continue
        order = idx[np.argsort(-st.points[st.conn[idx, 0], 2])]  # top to bottom
        c = st.conn[order]
        ly = np.tile(np.asarray(part.get("local_y") or [0.0, 1.0, 0.0], float), (len(order), 1))
        _, ey, ez = cell_frames(st.points, c, ly)
        shear = st.cells["Vy"][order, None] * ey + st.cells["Vz"][order, None] * ez
        shear[:, 2] = 0.0
        length = np.linalg.norm(st.points[c[:, 1]] - st.points[c[:, 0]], axis=1)
        # node forces: jump between consecutive elements; the toe takes the last shear
        jumps = np.vstack([np.diff(shear, axis=0), -shear[-1:]])
        trib = 0.5 * (length + np.r_[length[1:], 0.0])
        p_nodes = np.r_[0.0, np.linalg.norm(jumps, axis=1) / trib]
        p_nodes = np.nan_to_num(p_nodes)
        values[order] = 0.5 * (p_nodes[:-1] + p_nodes[1:])
        depth = np.r_[0.0, np.cumsum(length)]
        profiles[name] = (depth, p_nodes)
    return values, profiles


#: words in check ids that name the same part as another word in group names
_PART_WORDS = {"soil": "footing", "pier": "footing", "embedded": "footing"}


def _check_key(check: dict) -> tuple[str, ...]:
    """(anchor or 'line', part word) named by a check id such as 'anchor.west.post.ply1.stress'."""
    tokens = str(check.get("id", "")).split(".")
    if tokens and tokens[0] == "anchor":
        tokens = tokens[1:]
    tokens = [_PART_WORDS.get(t, t) for t in tokens[:2]]
    return tuple(tokens)


def utilization_by_part(results: Results) -> dict[str, float]:
    """Part name -> highest utilization of the checks that concern it.

    A check names a part exactly (its "part" field is a part name) or by the
    first two words of its id: the anchor and the part word ("west.post" covers
    every ply of the west post, "line.main" the line, "west.soil" the footing).
    """
    names = [p["name"] for p in results.parts]
    keys = {n: tuple(_PART_WORDS.get(t, t) for t in n.split(".")[:2]) for n in names}
    out: dict[str, float] = {}
    for c in results.summary.get("checks", []):
        u = _num(c.get("utilization"))
        if u is None:
            continue
        part = str(c.get("part", ""))
        hits = [n for n in names if part in (n, results_group(results, n))]
        if not hits:
            key = _check_key(c)
            hits = [n for n in names if len(key) == 2 and keys[n] == key]
        for n in hits:
            out[n] = max(out.get(n, 0.0), u)
    return out


def results_group(results: Results, part_name: str) -> str | None:
    for p in results.parts:
        if p["name"] == part_name:
            return p.get("group")
    return None


def cell_field(results: Results, st: Station, name: str) -> np.ndarray:
    """Per-cell values (SI) of a colour field at a station; NaN where undefined."""
    key = field_name(name)
    ne = st.conn.shape[0]
    cells = st.cells
    nan = np.full(ne, np.nan)
    if key == "utilization":
        util = utilization_by_part(results)
        out = nan.copy()
        for pname, idx in part_cells(results, st).items():
            if pname in util:
                out[idx] = util[pname]
        return out
    if key == "N":
        n = cells.get("N", nan)
        return np.where(np.isfinite(n), n, cells.get("tension", nan))
    if key in ("My", "Mz", "tension"):
        return np.asarray(cells.get(key, nan), float)
    if key == "moment":
        return np.hypot(cells.get("My", nan), cells.get("Mz", nan))
    if key == "soil":
        return soil_reaction(results, st)[0]
    u = np.linalg.norm(st.displacement, axis=1)
    return 0.5 * (u[st.conn[:, 0]] + u[st.conn[:, 1]])
