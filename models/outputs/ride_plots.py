"""PNG plots of the ride: profile and clearance, speed, tension along the line.

Drawn with matplotlib's Agg canvas directly (no pyplot, no global backend
switch), so the plots work without a display and leave no open figures.
Values come in SI; ``units="us"`` only changes what the axes show.
"""
from __future__ import annotations

from collections.abc import Mapping
from pathlib import Path
from typing import Literal

import numpy as np
from numpy.typing import ArrayLike

from spanstay.models.analysis.clearance import Clearance
from spanstay.models.analysis.ride import RideResult

Units = Literal["si", "us"]

# Exact by definition (international yard and pound agreement, 1959).
_FOOT = 0.3048  # m
_MPH = 0.44704  # m/s
_LBF = 4.4482216152605  # N

# Display scale and label per quantity: value_shown = value_si / scale.
_DISPLAY: dict[str, dict[str, tuple[float, str]]] = {
    "si": {"length": (1.0, "m"), "speed": (1.0, "m/s"), "force": (1000.0, "kN")},
    "us": {"length": (_FOOT, "ft"), "speed": (_MPH, "mph"), "force": (_LBF, "lbf")},
}

# Our own palette: slate cable, clay feet, sandy ground, on warm paper.
_PAPER = "#f7f4ec"
_INK = "#2b2d33"
_GRID = "#d9d3c3"
_CABLE = "#33506b"
_FEET = "#b4573a"
_GROUND_EDGE = "#7a6a4a"
_GROUND_FILL = "#d8c9a3"
_MARK = "#6b2f7a"
_SERIES = ("#33506b", "#b4573a", "#4f7d4a", "#8a6d1f", "#6b2f7a", "#2f7a78")


def _display(units: Units, quantity: str) -> tuple[float, str]:
    try:
        return _DISPLAY[units][quantity]
    except KeyError:
        raise ValueError(f"units must be 'si' or 'us', got {units!r}") from None


def _number(value: float) -> str:
    """Short display form: 3 significant figures, thousands separated."""
    return f"{value:,.0f}" if abs(value) >= 100.0 else f"{value:.3g}"


def _new_figure(size_px: tuple[int, int], dpi: int):
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    width, height = (int(v) for v in size_px)
    if width < 100 or height < 100 or dpi <= 0:
        raise ValueError(f"plot size must be at least 100 x 100 px, got {size_px}")
    fig = Figure(figsize=(width / dpi, height / dpi), dpi=dpi, facecolor=_PAPER)
    FigureCanvasAgg(fig)
    # Fixed margins in pixels (cheaper than an automatic layout engine).
    scale = dpi / 100.0
    fig.subplots_adjust(left=75 * scale / width, right=1.0 - 20 * scale / width,
                        bottom=55 * scale / height, top=1.0 - 38 * scale / height)
    ax = fig.add_subplot()
    ax.set_facecolor(_PAPER)
    ax.grid(True, color=_GRID, linewidth=0.8)
    ax.set_axisbelow(True)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)
    for side in ("left", "bottom"):
        ax.spines[side].set_color(_INK)
    ax.tick_params(colors=_INK)
    return fig, ax


def _save(fig, path: str | Path, dpi: int) -> Path:
    out = Path(path)
    out.parent.mkdir(parents=True, exist_ok=True)
    fig.savefig(out, dpi=dpi, facecolor=_PAPER, format="png", pil_kwargs={"compress_level": 3})
    return out


def plot_ride_profile(
    path: str | Path,
    distance: ArrayLike,
    elevation: ArrayLike,
    hang: float,
    ground_distance: ArrayLike,
    ground_elevation: ArrayLike,
    clearance: Clearance | None = None,
    *,
    title: str = "Ride profile",
    units: Units = "si",
    size_px: tuple[int, int] = (1200, 650),
    dpi: int = 100,
) -> Path:
    """Draw the ride profile, the rider's feet, the ground and the smallest clearance.

    Parameters
    ----------
    path
        PNG file to write.
    distance, elevation
        Ride profile (horizontal distance, elevation of the attachment point), m.
    hang
        Vertical distance from the cable to the feet, m.
    ground_distance, ground_elevation
        Ground profile, m.
    clearance
        Result of :func:`models.analysis.ride.feet_clearance` to mark the smallest
        clearance; omitted if None.
    title, units, size_px, dpi
        Figure title, display units, size in pixels and resolution.

    Returns
    -------
    Path
        The file written.
    """
    k, unit = _display(units, "length")
    d = np.asarray(distance, float) / k
    z = np.asarray(elevation, float) / k
    gd = np.asarray(ground_distance, float) / k
    gz = np.asarray(ground_elevation, float) / k
    feet = z - float(hang) / k

    fig, ax = _new_figure(size_px, dpi)
    # the ground over the ride's extent (plus a margin), cut at the window's edges
    # by interpolation so a profile point beyond the edge still shapes the ground
    lo, hi = d.min() - 0.05 * np.ptp(d), d.max() + 0.05 * np.ptp(d)
    lo, hi = max(lo, gd.min()), min(hi, gd.max())
    inside = (gd > lo) & (gd < hi)
    gd_shown = np.concatenate([[lo], gd[inside], [hi]])
    gz_shown = np.interp(gd_shown, gd, gz)
    floor = min(gz_shown.min(), feet.min()) - 0.1 * max(np.ptp(z), 1.0)
    ax.fill_between(gd_shown, gz_shown, floor, color=_GROUND_FILL, linewidth=0,
                    label="ground")
    ax.plot(gd_shown, gz_shown, color=_GROUND_EDGE, linewidth=1.4)
    ax.plot(d, z, color=_CABLE, linewidth=2.4, label="ride path (loaded cable point)")
    ax.plot(d, feet, color=_FEET, linewidth=1.6, linestyle=(0, (6, 3)),
            label="rider's feet")
    if clearance is not None:
        cx = clearance.minimum_distance / k
        top, bottom = clearance.feet_elevation / k, clearance.ground_elevation / k
        ax.annotate("", xy=(cx, bottom), xytext=(cx, top),
                    arrowprops={"arrowstyle": "<->", "color": _MARK, "linewidth": 1.5})
        ax.plot([cx], [top], marker="D", color=_MARK, markersize=6, linestyle="none",
                label=f"least clearance {clearance.minimum / k:.2f} {unit}")
        ax.text(cx, 0.5 * (top + bottom), f"  {clearance.minimum / k:.2f} {unit}",
                color=_MARK, va="center", ha="left")
    ax.set_ylim(bottom=floor)
    ax.set_xlabel(f"distance along the line [{unit}]", color=_INK)
    ax.set_ylabel(f"elevation [{unit}]", color=_INK)
    ax.set_title(title, color=_INK, loc="left")
    ax.legend(loc="best", frameon=False)
    return _save(fig, path, dpi)


def plot_speed(
    path: str | Path,
    rides: Mapping[str, RideResult],
    *,
    title: str = "Speed along the line",
    units: Units = "si",
    size_px: tuple[int, int] = (1200, 650),
    dpi: int = 100,
) -> Path:
    """Draw rider speed along the line for each rider (e.g. lightest and heaviest).

    Parameters
    ----------
    path
        PNG file to write.
    rides
        Label -> ride result, e.g. ``{"lightest 30 kg": r1, "heaviest 120 kg": r2}``.
    title, units, size_px, dpi
        Figure title, display units, size in pixels and resolution.

    Returns
    -------
    Path
        The file written.
    """
    if not rides:
        raise ValueError("plot_speed needs at least one ride")
    kl, ul = _display(units, "length")
    kv, uv = _display(units, "speed")
    fig, ax = _new_figure(size_px, dpi)
    for i, (label, r) in enumerate(rides.items()):
        colour = _SERIES[i % len(_SERIES)]
        dist, speed = r.distance, r.speed
        if r.stop_distance is not None:  # draw the line down to the stop point
            reached = np.isfinite(speed)
            dist = np.append(dist[reached], r.stop_distance)
            speed = np.append(speed[reached], 0.0)
        ax.plot(dist / kl, speed / kv, color=colour, linewidth=2.0, label=label)
        ax.plot([r.top_speed_distance / kl], [r.top_speed / kv], marker="^",
                color=colour, linestyle="none", markersize=8)
        ax.annotate(f"top {r.top_speed / kv:.1f} {uv}", (r.top_speed_distance / kl,
                    r.top_speed / kv), textcoords="offset points", xytext=(4, 6),
                    color=colour)
        if r.reaches_end and r.arrival_speed is not None:
            ax.plot([r.distance[-1] / kl], [r.arrival_speed / kv], marker="o",
                    color=colour, linestyle="none", markersize=7)
            ax.annotate(f"arrives {r.arrival_speed / kv:.1f} {uv}",
                        (r.distance[-1] / kl, r.arrival_speed / kv),
                        textcoords="offset points", xytext=(-10, -4), ha="right",
                        va="top", color=colour)
        elif r.stop_distance is not None:
            ax.plot([r.stop_distance / kl], [0.0], marker="X", color=colour,
                    linestyle="none", markersize=10, clip_on=False)
            ax.annotate(f"stops at {r.stop_distance / kl:.1f} {ul}",
                        (r.stop_distance / kl, 0.0), textcoords="offset points",
                        xytext=(-6, 10), ha="right", color=colour)
    ax.set_ylim(bottom=0.0)
    ax.set_xlabel(f"distance along the line [{ul}]", color=_INK)
    ax.set_ylabel(f"speed [{uv}]", color=_INK)
    ax.set_title(title, color=_INK, loc="left")
    ax.legend(loc="best", frameon=False)
    return _save(fig, path, dpi)


def plot_tension(
    path: str | Path,
    station_distance: ArrayLike,
    tensions: Mapping[str, ArrayLike],
    *,
    allowable: float | None = None,
    title: str = "Cable tension with the rider along the line",
    units: Units = "si",
    size_px: tuple[int, int] = (1200, 650),
    dpi: int = 100,
) -> Path:
    """Draw cable tension against the rider's position along the line.

    Parameters
    ----------
    path
        PNG file to write.
    station_distance
        Rider position at each station, horizontal distance along the line, m.
    tensions
        Label -> tension at each station, N (e.g. per rider and per cable end).
    allowable
        Allowed tension (breaking strength / factor of safety), N; drawn as a
        horizontal line if given.
    title, units, size_px, dpi
        Figure title, display units, size in pixels and resolution.

    Returns
    -------
    Path
        The file written.
    """
    if not tensions:
        raise ValueError("plot_tension needs at least one tension series")
    kl, ul = _display(units, "length")
    kf, uf = _display(units, "force")
    x = np.asarray(station_distance, float) / kl
    fig, ax = _new_figure(size_px, dpi)
    styles = ("-", (0, (5, 2)), (0, (1, 1.5)), (0, (8, 2, 2, 2)))
    for i, (label, t) in enumerate(tensions.items()):
        t = np.asarray(t, float)
        if t.shape != x.shape:
            raise ValueError(f"tension series {label!r} has {t.size} values, "
                             f"expected {x.size} (one per station)")
        ax.plot(x, t / kf, color=_SERIES[i % len(_SERIES)], linewidth=2.0,
                linestyle=styles[(i // len(_SERIES)) % len(styles)], label=label)
        k = int(np.argmax(t))
        ax.plot([x[k]], [t[k] / kf], marker="s", markersize=6, linestyle="none",
                color=_SERIES[i % len(_SERIES)])
    if allowable is not None:
        ax.axhline(allowable / kf, color=_MARK, linewidth=1.5, linestyle=(0, (3, 3)),
                   label=f"allowed {_number(allowable / kf)} {uf}")
    ax.set_ylim(bottom=0.0)
    ax.set_xlabel(f"rider position along the line [{ul}]", color=_INK)
    ax.set_ylabel(f"tension [{uf}]", color=_INK)
    ax.set_title(title, color=_INK, loc="left")
    ax.legend(loc="best", frameon=False)
    return _save(fig, path, dpi)

