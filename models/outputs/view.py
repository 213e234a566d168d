"""``spanstay view``: the deformed structure in 3D with the rider on the line.

pyvista draws posts and footings as solids of their true section, ropes as
tubes, the ground as a translucent strip, the rider as a trolley mark with
the hang distance to the feet, and the undeformed model as a faint outline.
Members are coloured by a field (see ``models.outputs.view_data.FIELDS``). With a
display there is an interactive window with a station slider; ``render_png``
and ``render_gif`` draw off-screen.
"""
from __future__ import annotations

import os
import sys
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np

from spanstay.models.common.errors import InputError
from spanstay.models.outputs.view_data import FIELDS, Results, cell_field, field_name
from spanstay.models.outputs.view_scene import (Prisms, auto_exaggeration, deformed, ground_strip, member_prisms,
                               model_size, rider_points, rope_prisms)
from spanstay.models.outputs.display_units import convert, number, scale

# Our own look: warm paper, slate-to-brick ramps, moss ground.
BACKGROUND = "#f4f1ea"
INK = "#2b2d33"
NO_VALUE = "#b8ad98"       # members without a value of the field
OUTLINE = "#8c8676"
GROUND = "#8fa06a"
RIDER = "#6b2f7a"
RAMP_UP = ["#2f6f73", "#9fc3a7", "#efe2b4", "#d98b4e", "#9c2f2a"]     # 0 .. high
RAMP_SIGNED = ["#25476a", "#8fb1cc", "#f3efe4", "#d9a07a", "#9c3a22"]  # -max .. +max
SIGNED = ("N", "My", "Mz")
CAUTION = "Preliminary design only: a qualified engineer must review. See report.html."


@dataclass
class ViewOptions:
    """What to draw."""

    color: str = "utilization"
    exaggerate: float | None = None   # None: automatic
    size: tuple[int, int] = (1200, 800)
    stations: list[int] = field(default_factory=list)


def has_display() -> bool:
    """True when an interactive window can open."""
    if sys.platform in ("win32", "darwin"):
        return True
    return bool(os.environ.get("DISPLAY") or os.environ.get("WAYLAND_DISPLAY"))


def _import_pyvista():
    """pyvista, set up for off-screen use without an X server when there is none."""
    if not has_display():
        # VTK tries X first and warns before falling back; with no display and an EGL
        # library present go straight to EGL (otherwise VTK picks what it has, e.g. OSMesa).
        import ctypes.util
        if ctypes.util.find_library("EGL"):
            os.environ.setdefault("VTK_DEFAULT_OPENGL_WINDOW", "vtkEGLRenderWindow")
    import pyvista as pv
    return pv


def _cmap(name: str):
    from matplotlib.colors import LinearSegmentedColormap
    ramp = RAMP_SIGNED if name in SIGNED else RAMP_UP
    return LinearSegmentedColormap.from_list(f"spanstay_{name}", ramp)


class Scene:
    """Meshes of one results folder, updated in place from station to station."""

    def __init__(self, pv, results: Results, options: ViewOptions) -> None:
        self.pv, self.results, self.opts = pv, results, options
        self.field = field_name(options.color)
        stations = [results.station(k) for k in options.stations]
        self.factor = (float(options.exaggerate) if options.exaggerate is not None
                       else auto_exaggeration(results, stations))
        label, kind, _ = FIELDS[self.field]
        self.kind = kind
        self.unit_factor, unit = scale(kind, results.units)
        short = self.field if self.field in SIGNED else label
        self.title = f"{short} ({unit})" if unit else short
        self.long_title = f"{label} ({unit})" if unit else label
        values = [cell_field(results, st, self.field) for st in stations]
        finite = np.concatenate([v[np.isfinite(v)] for v in values] + [np.zeros(0)])
        lo, hi = (float(finite.min()), float(finite.max())) if finite.size else (0.0, 1.0)
        if self.field in SIGNED:
            m = max(abs(lo), abs(hi), 1e-12)
            lo, hi = -m, m
        elif self.field == "utilization":
            lo, hi = 0.0, max(hi, 1.0)
        else:
            lo = min(lo, 0.0)
            hi = hi if hi > lo else lo + 1.0
        self.clim = (lo / self.unit_factor, hi / self.unit_factor)
        self.meshes: dict[str, object] = {}

    def _poly(self, prisms: Prisms, values: np.ndarray):
        mesh = self.pv.PolyData(prisms.points, prisms.faces)
        mesh.cell_data["value"] = values[prisms.face_cell] / self.unit_factor
        return mesh

    def build(self, k: int) -> dict[str, object]:
        """Meshes of station ``k`` (new objects)."""
        pv, res = self.pv, self.results
        st = res.station(k)
        pos = deformed(res, st, self.factor)
        vals = cell_field(res, st, self.field)
        out = {"members": self._poly(member_prisms(res, st, pos), vals),
               "ropes": self._poly(rope_prisms(res, st, pos), vals)}
        drawn = np.isin(st.group, list(res.part_of_group()))
        lines = np.c_[np.full(int(drawn.sum()), 2), st.conn[drawn]].ravel()
        out["outline"] = pv.PolyData(st.points, lines=lines)
        size = model_size(res, st)
        riders = rider_points(res, pos)
        glyphs = []
        for top, feet, _ in riders:
            glyphs.append(pv.Cone(center=top - [0, 0, 0.02 * size], direction=(0, 0, 1),
                                  height=0.04 * size, radius=0.015 * size, resolution=4))
            glyphs.append(pv.Line(top, feet))
            glyphs.append(pv.Disc(center=feet, inner=0.0, outer=0.012 * size, normal=(0, 0, 1),
                                  c_res=12))
        out["rider"] = pv.merge(glyphs) if glyphs else pv.PolyData()
        hang = float(res.summary["model"].get("hang_distance") or 0.0)
        unit = scale("length", res.units)[1]
        self.rider_label = ([f"feet {number(convert(hang, 'length', res.units))} {unit} below "
                             f"the line"], [riders[0][1]]) if riders else None
        return out

    def add_to(self, plotter, k: int) -> None:
        pv, res = self.pv, self.results
        self.meshes = self.build(k)
        strip = ground_strip(res, res.station(k))
        if strip is not None:
            grid = pv.StructuredGrid(*(strip[0][..., i] for i in range(3)))
            plotter.add_mesh(grid, color=GROUND, opacity=0.35, show_edges=False, name="ground")
        plotter.add_mesh(self.meshes["outline"], color=OUTLINE, opacity=0.45, line_width=1,
                         name="outline")
        sbar = dict(title=self.title, color=INK, vertical=True, position_x=0.9, position_y=0.2,
                    height=0.6, width=0.035, n_labels=5, title_font_size=self._font(16),
                    label_font_size=self._font(14),
                    fmt="%.0f" if max(abs(self.clim[0]), abs(self.clim[1])) >= 100 else "%.3g")
        common = dict(scalars="value", cmap=_cmap(self.field), clim=self.clim, nan_color=NO_VALUE,
                      smooth_shading=False, ambient=0.3, diffuse=0.75, specular=0.05)
        plotter.add_mesh(self.meshes["members"], show_scalar_bar=True, scalar_bar_args=sbar,
                         name="members", **common)
        plotter.add_mesh(self.meshes["ropes"], show_scalar_bar=False, name="ropes", **common)
        plotter.add_mesh(self.meshes["rider"], color=RIDER, line_width=3, name="rider")
        self._label(plotter)
        plotter.add_text(self._caption(k), position="upper_left", font_size=self._font(10), color=INK,
                         name="caption")
        plotter.add_text(CAUTION, position="lower_left", font_size=self._font(8), color=INK,
                         name="caution")
        self._ruler(plotter, k)

    def update(self, plotter, k: int) -> None:
        """Move the meshes to station ``k`` in place (same topology every station)."""
        new = self.build(k)
        for key in ("members", "ropes", "rider"):
            self.meshes[key].copy_from(new[key], deep=True)
        plotter.add_text(self._caption(k), position="upper_left", font_size=self._font(10), color=INK,
                         name="caption")
        self._label(plotter)

    def _font(self, points: int) -> int:
        """Font size for a 1200 px wide picture, scaled to the picture's width."""
        return max(6, int(round(points * (0.4 + 0.6 * self.opts.size[0] / 1200))))

    def _label(self, plotter) -> None:
        if self.rider_label is None:
            return
        text, where = self.rider_label
        plotter.add_point_labels(np.asarray(where), text, font_size=self._font(11), text_color=RIDER,
                                 shape_color=BACKGROUND, shape_opacity=0.7, show_points=False,
                                 always_visible=True, name="rider_label")

    def _caption(self, k: int) -> str:
        res = self.results
        s = res.summary
        name = (s.get("project") or {}).get("name") or "spanstay"
        along = res.along[k]
        unit = scale("length", res.units)[1]
        ex = "true scale" if self.factor == 1.0 else f"posts and footings x{number(self.factor)}"
        return (f"{name}\npass {res.pass_label}, station {k} of 0..{res.n_stations - 1}, "
                f"rider {number(convert(along, 'length', res.units))} {unit} along\n"
                f"deformation: {ex}; colour: {self.long_title}")

    def _ruler(self, plotter, k: int) -> None:
        res = self.results
        st = res.station(k)
        f, unit = scale("length", res.units)
        size = model_size(res, st)
        raw = 0.25 * size / f
        mag = 10 ** np.floor(np.log10(raw))
        nice = max(s * mag for s in (1, 2, 5) if s * mag <= raw) * f
        lo = st.points.min(axis=0)
        a = np.array([lo[0], lo[1] - 0.08 * size, lo[2]])
        try:
            plotter.add_ruler(a, a + [nice, 0, 0], title=unit, number_labels=3, font_size_factor=0.5,
                              label_color=INK, tick_color=INK, label_format="%.3g", scale=1 / f)
        except TypeError:  # older pyvista without some of these keywords
            pass


def _plotter(pv, size, off_screen: bool):
    p = pv.Plotter(off_screen=off_screen, window_size=list(size))
    p.set_background(BACKGROUND)
    p.enable_anti_aliasing("ssaa") if not off_screen else None
    return p


def _camera(plotter, results: Results, k: int) -> None:
    st = results.station(k)
    lo, hi = st.points.min(axis=0), st.points.max(axis=0)
    size = model_size(results, st)
    c = 0.5 * (lo + hi) + np.array([0.04 * size, 0.0, 0.0])  # leave room for the colour bar
    plotter.camera.focal_point = c
    plotter.camera.position = c + np.array([0.25, -1.1, 0.35]) * size
    plotter.camera.up = (0, 0, 1)
    plotter.reset_camera()
    plotter.camera.zoom(1.3)


def render_png(results: Results, path: str | Path, station: int, options: ViewOptions) -> Path:
    """Draw ``station`` off-screen to a PNG of ``options.size`` pixels."""
    pv = _import_pyvista()
    options.stations = [station]
    scene = Scene(pv, results, options)
    p = _plotter(pv, options.size, True)
    try:
        scene.add_to(p, station)
        _camera(p, results, station)
        path = Path(path)
        p.screenshot(str(path), window_size=list(options.size))
    finally:
        p.close()
    return path


def render_gif(results: Results, path: str | Path, stations: list[int], options: ViewOptions,
               frame_ms: int = 250) -> Path:
    """One GIF frame per station (in order), drawn off-screen."""
    from PIL import Image

    pv = _import_pyvista()
    if not stations:
        raise InputError("no stations to animate", "--gif")
    options.stations = list(stations)
    scene = Scene(pv, results, options)
    p = _plotter(pv, options.size, True)
    frames = []
    try:
        scene.add_to(p, stations[0])
        _camera(p, results, stations[0])
        for k in stations:
            scene.update(p, k)
            img = p.screenshot(None, return_img=True, window_size=list(options.size))
            frames.append(Image.fromarray(np.asarray(img)[..., :3]).quantize(
                colors=255, method=Image.Quantize.MEDIANCUT))
    finally:
        p.close()
    path = Path(path)
    frames[0].save(path, save_all=True, append_images=frames[1:], duration=frame_ms, loop=0,
                   optimize=False, disposal=1)
    return path


def show_window(results: Results, station: int, options: ViewOptions) -> None:
    """Interactive window with a station slider."""
    pv = _import_pyvista()
    options.stations = list(range(results.n_stations))
    scene = Scene(pv, results, options)
    p = _plotter(pv, options.size, False)
    scene.add_to(p, station)
    _camera(p, results, station)
    if results.n_stations > 1:
        p.add_slider_widget(lambda v: scene.update(p, int(round(v))), [0, results.n_stations - 1],
                            value=station, title="station", pointa=(0.25, 0.06), pointb=(0.75, 0.06),
                            color=INK, fmt="%.0f")
    p.show(title="spanstay view")


def parse_size(text: str) -> tuple[int, int]:
    """'1200x800' -> (1200, 800); InputError otherwise."""
    try:
        w, h = (int(v) for v in text.lower().split("x"))
    except ValueError:
        raise InputError(f"image size must look like 1200x800, got '{text}'", "--size") from None
    if not (64 <= w <= 8000 and 64 <= h <= 8000):
        raise InputError(f"image size must be 64 to 8000 pixels each way, got {w}x{h}", "--size")
    return w, h


def frame_stations(n: int, frames: int | None) -> list[int]:
    """Station indices for an animation: all, or ``frames`` spread evenly."""
    if frames is None or frames >= n:
        return list(range(n))
    if frames < 1:
        raise InputError(f"--frames must be at least 1, got {frames}", "--frames")
    return sorted(set(int(round(v)) for v in np.linspace(0, n - 1, frames)))


def run_view(folder: str | Path, station: int | None = None, worst: bool = False,
             exaggerate: float | None = None, color: str = "utilization", png: str | None = None,
             gif: str | None = None, frames: int | None = None,
             size: str = "1200x800") -> list[str]:
    """What ``spanstay view`` does; returns the lines to print. Bad input: InputError."""
    from spanstay.models.outputs.view_data import load_results

    if station is not None and worst:
        raise InputError("give either --station K or --worst, not both", "--station")
    if exaggerate is not None and not (np.isfinite(exaggerate) and exaggerate > 0):
        raise InputError(f"--exaggerate must be a positive number, got {exaggerate}", "--exaggerate")
    field_name(color)
    pixels = parse_size(size)
    results = load_results(folder)
    if worst:
        k = results.worst_station()
    elif station is not None:
        k = station
        results.station(k)  # range check before any drawing
    else:
        k = results.worst_station()
    opts = ViewOptions(color=color, exaggerate=exaggerate, size=pixels)
    said = []
    if png:
        said.append(f"wrote {render_png(results, png, k, opts)} (station {k}, "
                    f"{pixels[0]}x{pixels[1]} px)")
    if gif:
        ks = frame_stations(results.n_stations, frames)
        opts = ViewOptions(color=color, exaggerate=exaggerate, size=pixels)
        said.append(f"wrote {render_gif(results, gif, ks, opts)} ({len(ks)} frames)")
    if not png and not gif:
        if not has_display():
            raise InputError("no display here for an interactive window; write a picture with "
                             "--png FILE or an animation with --gif FILE")
        show_window(results, k, opts)
    return said
