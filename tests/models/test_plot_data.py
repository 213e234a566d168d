"""What each figure draws, read back from the matplotlib artists (Line2D data, bars,
axis labels, legend texts) and compared with the numbers it is drawn from: the
curves are the results in the display units (unit factors exact by definition,
NIST SP 811), the limits are the allowed values, the marks sit where an independent
computation puts them (energy conservation for the speed of a frictionless ride, a
dense search for the least clearance of the feet)."""
from __future__ import annotations

import json
from pathlib import Path

import numpy as np
import pytest
from matplotlib.figure import Figure

from spanstay.models.analysis.clearance import feet_clearance
from spanstay.models.analysis.ride import ride_speed
from spanstay.models.outputs import report_plots
from spanstay.models.outputs.ride_plots import plot_ride_profile, plot_speed, plot_tension
from spanstay.models.outputs.view_data import load_results, part_cells
from view_results_fixture import make_results

FOOT, MPH, LBF = 0.3048, 0.44704, 4.4482216152605   # exact (1959 yard and pound)
G0 = 9.80665
X = np.linspace(0.0, 80.0, 81)
Z = 9.0 - 0.2 * X + 0.0016 * X**2
GD = np.linspace(-4.0, 84.0, 45)
GZ = 1.0 - 0.07 * GD + 0.6 * np.sin(GD / 7.0)


@pytest.fixture
def drawn(monkeypatch):
    """Every figure saved during the test, in order."""
    figures: list[Figure] = []
    original = Figure.savefig

    def keep(self, *args, **kwargs):
        figures.append(self)
        return original(self, *args, **kwargs)

    monkeypatch.setattr(Figure, "savefig", keep)
    return figures


def lines_by_label(ax):
    return {line.get_label(): line for line in ax.get_lines()}


def test_profile_draws_the_path_the_feet_and_the_least_clearance_in_feet(tmp_path, drawn):
    hang = 1.4
    c = feet_clearance(X, Z, hang, GD, GZ)
    plot_ride_profile(tmp_path / "p.png", X, Z, hang, GD, GZ, c, units="us")
    ax = drawn[-1].axes[0]
    assert ax.get_xlabel() == "distance along the line [ft]"
    assert ax.get_ylabel() == "elevation [ft]"
    lines = lines_by_label(ax)
    path = lines["ride path (loaded cable point)"]
    np.testing.assert_allclose(path.get_xdata(), X / FOOT, rtol=1e-12)
    np.testing.assert_allclose(path.get_ydata(), Z / FOOT, rtol=1e-12)
    feet = lines["rider's feet"]
    np.testing.assert_allclose(feet.get_ydata(), (Z - hang) / FOOT, rtol=1e-12)
    # the least clearance by a dense search over the ride (independent of feet_clearance)
    xs = np.linspace(X[0], X[-1], 80001)
    gap = np.interp(xs, X, Z) - hang - np.interp(xs, GD, GZ)
    k = int(np.argmin(gap))
    mark = next(line for label, line in lines.items() if label.startswith("least clearance"))
    assert mark.get_xdata()[0] == pytest.approx(xs[k] / FOOT, abs=0.05)
    assert mark.get_ydata()[0] == pytest.approx((np.interp(xs[k], X, Z) - hang) / FOOT, abs=1e-3)
    assert mark.get_label() == f"least clearance {gap[k] / FOOT:.2f} ft"
    # the ground is drawn over the ride's extent, on the ground profile
    ground = [line for label, line in lines.items() if label.startswith("_")][0]
    gx = np.asarray(ground.get_xdata())
    np.testing.assert_allclose(ground.get_ydata(), np.interp(gx * FOOT, GD, GZ) / FOOT,
                               atol=1e-9)
    assert gx.min() <= X[0] / FOOT and gx.max() >= X[-1] / FOOT


def test_speed_curve_of_a_frictionless_ride_is_energy_conservation_in_mph(tmp_path, drawn):
    # no rolling resistance, no drag, from rest: v = sqrt(2 g (z0 - z)) (Galileo)
    ride = ride_speed(X, Z, 80.0)
    plot_speed(tmp_path / "s.png", {"frictionless": ride}, units="us")
    ax = drawn[-1].axes[0]
    assert ax.get_ylabel() == "speed [mph]"
    curve = lines_by_label(ax)["frictionless"]
    hand = np.sqrt(2 * G0 * (Z[0] - Z)) / MPH
    np.testing.assert_allclose(curve.get_xdata(), X / FOOT, rtol=1e-12)
    np.testing.assert_allclose(curve.get_ydata(), hand, rtol=2e-3, atol=1e-6)
    marks = [line for line in ax.get_lines() if line.get_marker() in ("^", "o")]
    top = next(m for m in marks if m.get_marker() == "^")
    assert top.get_ydata()[0] == pytest.approx(hand.max(), rel=2e-3)       # at the low point
    assert top.get_xdata()[0] == pytest.approx(62.5 / FOOT, abs=1.5 / FOOT)
    arrive = next(m for m in marks if m.get_marker() == "o")
    assert arrive.get_ydata()[0] == pytest.approx(hand[-1], rel=2e-3)


def test_speed_plot_of_a_rider_who_stops_ends_at_zero_where_he_stops(tmp_path, drawn):
    uphill = 2.0 - 0.05 * X + 0.001 * X**2        # down, then up past the start's height
    ride = ride_speed(X, uphill, 80.0)
    assert not ride.reaches_end
    plot_speed(tmp_path / "s.png", {"stops": ride}, units="si")
    curve = lines_by_label(drawn[-1].axes[0])["stops"]
    # energy: he stops where the profile climbs back to the start's height, z = 2 m
    x_stop = 50.0                                 # 2 - 0.05 x + 0.001 x^2 = 2
    assert curve.get_xdata()[-1] == pytest.approx(x_stop, abs=0.5)
    assert curve.get_ydata()[-1] == 0.0


def test_tension_plot_draws_the_series_their_peaks_and_the_allowed_line_in_lbf(tmp_path, drawn):
    shape = np.sin(np.pi * X / 80.0)
    heavy, light = 3000 + 2500 * shape, 2000 + 700 * shape
    allowed = 14400 * LBF / 5     # 3/8 in 7x19 (FAA AC 43.13-1B Table 7-3) over 5
    plot_tension(tmp_path / "t.png", X, {"heaviest": heavy, "lightest": light},
                 allowable=allowed, units="us")
    ax = drawn[-1].axes[0]
    assert ax.get_ylabel() == "tension [lbf]"
    lines = lines_by_label(ax)
    for label, t in (("heaviest", heavy), ("lightest", light)):
        np.testing.assert_allclose(lines[label].get_ydata(), t / LBF, rtol=1e-12)
    peaks = [line for line in ax.get_lines() if line.get_marker() == "s"]
    assert sorted(p.get_ydata()[0] for p in peaks) == pytest.approx(
        sorted([heavy.max() / LBF, light.max() / LBF]), rel=1e-12)
    limit = lines["allowed 2,880 lbf"]
    assert np.allclose(limit.get_ydata(), 2880.0, rtol=1e-12)


# ------------------------------------------------------------------ report figures
@pytest.fixture(scope="module")
def folder(tmp_path_factory):
    return make_results(tmp_path_factory.mktemp("plots") / "results", stations=4)


def test_cable_profile_figure_draws_the_stations_of_the_results(folder, drawn, tmp_path):
    results = load_results(folder)
    summary = json.loads((folder / "summary.json").read_text())
    stations = [results.station(i) for i in (0, 3)]
    report_plots.cable_profiles(tmp_path / "c.png", results, stations, "us")
    ax = drawn[-1].axes[0]
    assert ax.get_xlabel() == "distance along the line [ft]"
    chain = [int(n) for n in summary["model"]["lines"][results.rider_line()]["nodes"]]
    rider = summary["model"]["lines"][results.rider_line()]["rider_node"]
    a = np.asarray(summary["model"]["line_start_xyz"], float)
    for st in stations:
        loaded = lines_by_label(ax)[f"loaded, station {st.index}"]
        xyz = st.points[chain] + st.displacement[chain]
        np.testing.assert_allclose(loaded.get_ydata(), xyz[:, 2] / FOOT, rtol=1e-12)
        # the trolley mark sits at the rider point of the pass's own station record
        p = np.asarray(summary["passes"]["ride_heavy"]["rider_xyz"][st.index], float)
        mark = [line for line in ax.get_lines() if line.get_marker() == "v"
                and line.get_color() == loaded.get_color()][0]
        assert mark.get_ydata()[0] == pytest.approx(p[2] / FOOT, abs=1e-6)
        assert mark.get_xdata()[0] == pytest.approx((p[0] - a[0]) / FOOT, abs=1e-6)
        r = st.points[rider] + st.displacement[rider]
        assert r == pytest.approx(p, abs=1e-6)


def test_post_moment_figure_draws_the_larger_end_moment_of_each_element(folder, drawn, tmp_path):
    results = load_results(folder)
    st = results.station(2)
    report_plots.posts_and_footings(tmp_path / "m.png", results, st, "si")
    ax, bx = drawn[-1].axes[:2]
    assert ax.get_xlabel() == "bending moment [kN·m]"
    assert bx.get_ylabel() == "depth below grade [m]"
    cells = part_cells(results, st)
    for line in ax.get_lines():
        label = line.get_label()
        if label.startswith("_"):
            continue
        anchor, part = label.split(": ")
        idx = cells[f"{anchor}.{part}"]
        m = np.hypot(st.cells["My"][idx], st.cells["Mz"][idx]) / 1e3
        assert np.max(line.get_xdata()) == pytest.approx(m.max(), rel=1e-12)
        assert sorted(set(np.round(line.get_xdata(), 12))) == sorted(set(np.round(m, 12)))


def test_slack_budget_bars_are_the_shares_in_feet(drawn, tmp_path):
    budget = {"shares": {"cable stretch": 0.21, "post a leans": 0.06, "footing b": -0.01},
              "loaded_sag": 1.30}
    report_plots.slack_budget(tmp_path / "b.png", budget, "us")
    ax = drawn[-1].axes[0]
    widths = sorted(p.get_width() for p in ax.patches)
    assert widths == pytest.approx(sorted(v / FOOT for v in budget["shares"].values()), rel=1e-12)
    assert ax.get_xlabel() == "share of the loaded sag [ft]"
    assert f"(loaded sag {1.30 / FOOT:.3g} ft)" in ax.get_title(loc="left")


def test_report_speed_figure_draws_the_summary_ride(drawn, tmp_path):
    ride = {"lightest": {"along": [0.0, 10.0, 20.0], "speed": [0.0, 4.0, None]},
            "heaviest": {"along": [0.0, 10.0, 20.0], "speed": [0.0, 5.0, 6.0]},
            "clearance": {"minimum": 0.5}}
    report_plots.ride_speed(tmp_path / "v.png", ride, "us")
    ax = drawn[-1].axes[0]
    lines = lines_by_label(ax)
    assert set(lines) == {"lightest rider", "heaviest rider"}
    np.testing.assert_allclose(lines["heaviest rider"].get_ydata(), np.array([0, 5, 6]) / MPH)
    np.testing.assert_allclose(lines["lightest rider"].get_xdata(), np.array([0, 10, 20]) / FOOT)
    assert np.isnan(lines["lightest rider"].get_ydata()[-1])
    assert ax.get_ylabel() == "speed [mph]"
