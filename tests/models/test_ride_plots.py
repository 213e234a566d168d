"""Ride plots: each PNG is written at the requested pixel size and is not blank."""
from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest
from matplotlib.image import imread

from spanstay.models.analysis.clearance import feet_clearance
from spanstay.models.analysis.ride import ride_speed
from spanstay.models.outputs.ride_plots import plot_ride_profile, plot_speed, plot_tension

X = np.linspace(0.0, 80.0, 81)
Z = 9.0 - 0.2 * X + 0.0016 * X**2
GD = np.linspace(-4.0, 84.0, 45)
GZ = 1.0 - 0.07 * GD + 0.6 * np.sin(GD / 7.0)


def _check_png(path: Path, size: tuple[int, int]) -> None:
    assert path.is_file()
    image = imread(path)
    # PNG decoded as (rows, columns, channels): height x width.
    assert image.shape[:2] == (size[1], size[0])
    # Not blank: pixels vary (a single-colour canvas has zero variance).
    grey = image[..., :3].mean(axis=2)
    assert grey.var() > 1e-3
    # Something other than the background is drawn over a fair share of pixels.
    background = np.median(grey)
    assert np.mean(np.abs(grey - background) > 0.05) > 0.01


@pytest.mark.parametrize("units", ["si", "us"])
def test_profile_plot(tmp_path: Path, units: str) -> None:
    c = feet_clearance(X, Z, 1.4, GD, GZ)
    out = plot_ride_profile(tmp_path / "profile.png", X, Z, 1.4, GD, GZ, c,
                            units=units, size_px=(900, 500))
    _check_png(out, (900, 500))


def test_speed_plot_lightest_and_heaviest(tmp_path: Path) -> None:
    light = ride_speed(X, Z, 30.0, rolling_resistance=0.04, drag_area=0.35)
    heavy = ride_speed(X, Z, 125.0, rolling_resistance=0.04, drag_area=0.6)
    out = plot_speed(tmp_path / "sub" / "speed.png",
                     {"lightest 30 kg": light, "heaviest 125 kg": heavy},
                     size_px=(1000, 640))
    _check_png(out, (1000, 640))


def test_tension_plot(tmp_path: Path) -> None:
    shape = np.sin(np.pi * X / 80.0)
    out = plot_tension(tmp_path / "tension.png", X,
                       {"heaviest, upper end": 3000 + 2500 * shape,
                        "lightest, upper end": 2000 + 700 * shape},
                       allowable=5500.0, units="us", size_px=(800, 450))
    _check_png(out, (800, 450))


def test_tension_plot_rejects_mismatched_series(tmp_path: Path) -> None:
    with pytest.raises(ValueError, match="one per station"):
        plot_tension(tmp_path / "t.png", X, {"bad": [1.0, 2.0]})
