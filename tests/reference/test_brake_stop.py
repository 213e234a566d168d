"""The stop at the end of the ride: energy balance on the brake's force-stroke law
(spanstay.models.analysis.brake) against closed forms and scipy solving the same
balance independently."""
from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.integrate import quad
from scipy.optimize import root_scalar

from spanstay.models.analysis.brake import law_energy, stop
from spanstay.models.scenario.spec import BrakeSpec

G = 9.80665
LBF = 4.4482216152605


@pytest.mark.parametrize("mass, speed, k", [(102.5, 5.07, 8000.0), (23.6, 4.1, 8000.0),
                                            (80.0, 7.0, 1500.0)])
def test_linear_spring_matches_the_closed_form(mass, speed, k):
    # Mass on a linear spring (work-energy theorem, any dynamics text, e.g. Meriam &
    # Kraige, Engineering Mechanics: Dynamics): m v^2 / 2 = k x^2 / 2, so
    # x = v sqrt(m / k), peak force k x = v sqrt(k m), peak deceleration v sqrt(k / m).
    s = stop(BrakeSpec("spring", stroke=10.0, stiffness=k), mass, speed)
    assert s.stroke_used == pytest.approx(speed * math.sqrt(mass / k), rel=1e-9)
    assert s.peak_force == pytest.approx(speed * math.sqrt(k * mass), rel=1e-9)
    assert s.deceleration == pytest.approx(speed * math.sqrt(k / mass), rel=1e-9)
    assert not s.bottoms_out


def test_the_issue_hand_check_of_a_stop_block_and_a_bumper():
    # Hand check (linear spring whose whole stroke x takes the energy: F = 2 E / x):
    # a 220 lbf rider at 5.07 m/s, 0.5 m stroke about 1,150 lbf and 5 g; 0.1 m
    # rubber bumper about 5,800 lbf.
    mass = 220 * LBF / G
    energy = 0.5 * mass * 5.07 ** 2
    for stroke, lbf, g in ((0.5, 1150, 5.1), (0.25, 2300, 10.3), (0.1, 5800, 25.7)):
        k = 2.0 * energy / stroke ** 2
        s = stop(BrakeSpec("spring", stroke=stroke, stiffness=k), mass, 5.07)
        assert s.stroke_used == pytest.approx(stroke, rel=1e-6)
        assert s.peak_force / LBF == pytest.approx(lbf, rel=0.03)
        assert s.deceleration / G == pytest.approx(g, rel=0.03)


CURVE = ((0.0, 0.0), (0.5, 150.0), (1.5, 400.0), (3.0, 1400.0), (4.0, 2600.0))


def _curve_force(x):
    pts = np.array(CURVE)
    return float(np.interp(x, pts[:, 0], pts[:, 1]))


@pytest.mark.parametrize("mass, speed", [(100.0, 4.0), (30.0, 6.0), (120.0, 6.5)])
def test_a_stiffening_curve_matches_scipy_quad_and_a_root_finder(mass, speed):
    # The same energy balance solved independently: the work of the law by numerical
    # quadrature (scipy quad, breaks at the curve's points), the stroke by a bracketing
    # root finder on it.
    brake = BrakeSpec("bungee", stroke=4.0, curve=CURVE)
    energy = 0.5 * mass * speed ** 2

    def work(x):
        return quad(_curve_force, 0.0, x, points=[p[0] for p in CURVE if 0 < p[0] < x],
                    limit=200)[0]

    x = root_scalar(lambda y: work(y) - energy, bracket=(1e-9, 4.0), xtol=1e-12).root
    s = stop(brake, mass, speed)
    assert s.stroke_used == pytest.approx(x, rel=1e-7)
    assert s.peak_force == pytest.approx(_curve_force(x), rel=1e-7)
    for y in (0.2, 0.5, 1.1, 2.9, 4.0):
        assert law_energy(brake, y) == pytest.approx(work(y), rel=1e-9)


def test_a_stroke_too_short_bottoms_out_and_says_what_was_needed():
    # Closed form (linear law carried on): the stroke needed is v sqrt(m / k) whatever
    # the stroke available; it bottoms out when that exceeds the stroke.
    s = stop(BrakeSpec("spring", stroke=0.3, stiffness=2000.0), 100.0, 5.0)
    assert s.bottoms_out
    assert s.stroke_used == pytest.approx(5.0 * math.sqrt(100.0 / 2000.0), rel=1e-9)
    assert s.stroke_used > s.stroke_available


def test_a_rated_brake_at_its_peak_force_uses_at_least_e_over_f():
    # Constant force F over the stroke: m v^2 / 2 = F x (work-energy theorem).
    s = stop(BrakeSpec("rated", stroke=2.0, rated_speed=8.0, rated_energy=5000.0,
                       peak_force=1200.0), 90.0, 6.0)
    assert s.stroke_used == pytest.approx(0.5 * 90.0 * 36.0 / 1200.0, rel=1e-12)
    assert s.deceleration == pytest.approx(1200.0 / 90.0, rel=1e-12)


def test_no_brake_and_a_gravity_end_give_no_stop_force():
    assert stop(BrakeSpec("none"), 90.0, 5.0) is None
    assert stop(BrakeSpec("gravity"), 90.0, 5.0) is None
