"""Ride speed and feet clearance against Newtonian mechanics and independent scipy solutions.

Each check names its source. ``g`` is the standard gravity 9.80665 m/s^2.
"""
from __future__ import annotations

import numpy as np
import pytest
from scipy.integrate import solve_ivp

from spanstay.models.analysis.clearance import feet_clearance
from spanstay.models.analysis.ride import ride_speed

G = 9.80665
RHO = 1.225


def incline(angle_deg: float, length: float, n: int = 51, z0: float = 0.0):
    """Straight profile of given path length at a constant angle (positive uphill)."""
    a = np.radians(angle_deg)
    s = np.linspace(0.0, length, n)
    return s * np.cos(a), z0 + s * np.sin(a), s, a


# ---------------------------------------------------------------- energy


@pytest.mark.parametrize("v0", [0.0, 2.5])
def test_no_losses_speed_is_energy_conservation(v0: float) -> None:
    # Conservation of mechanical energy (Newtonian mechanics):
    # v = sqrt(v0^2 + 2 g dh) at every point, dh the drop below the start.
    x = np.linspace(0.0, 90.0, 121)
    z = 15.0 - 0.3 * x + 0.0022 * x**2  # a sagging ride profile
    r = ride_speed(x, z, 85.0, start_speed=v0)
    expected = np.sqrt(v0**2 + 2.0 * G * (z[0] - z))
    assert r.reaches_end
    np.testing.assert_allclose(r.speed, expected, rtol=1e-9, atol=1e-9)
    assert r.arrival_speed == pytest.approx(expected[-1], rel=1e-9)
    k = int(np.argmin(z))
    assert r.top_speed == pytest.approx(expected[k], rel=1e-9)
    assert r.top_speed_distance == pytest.approx(x[k])


def test_no_losses_time_on_incline_is_uniform_acceleration() -> None:
    # Frictionless incline: acceleration g sin(a), v = v0 + g sin(a) t
    # (Newtonian mechanics).
    x, z, s, a = incline(-7.0, 80.0)
    r = ride_speed(x, z, 60.0, start_speed=1.0)
    acc = G * np.sin(-a)
    v_end = np.sqrt(1.0 + 2.0 * acc * 80.0)
    assert r.arrival_time == pytest.approx((v_end - 1.0) / acc, rel=1e-9)


# ---------------------------------------------------------------- drag only


@pytest.mark.parametrize(("mass", "v0"), [(45.0, 0.0), (120.0, 3.0), (45.0, 30.0)])
def test_drag_only_incline_matches_closed_form(mass: float, v0: float) -> None:
    # Quadratic drag on an incline (Newtonian mechanics, linear ODE in v^2):
    # v^2(s) = vt^2 + (v0^2 - vt^2) exp(-rho CdA s / m),
    # vt = sqrt(2 m g sin(a) / (rho CdA)). Tolerance 0.5 %.
    cda = 0.6
    x, z, s, a = incline(-9.0, 250.0)
    r = ride_speed(x, z, mass, drag_area=cda, start_speed=v0)
    vt2 = 2.0 * mass * G * np.sin(-a) / (RHO * cda)
    expected = np.sqrt(vt2 + (v0**2 - vt2) * np.exp(-RHO * cda * s / mass))
    np.testing.assert_allclose(r.speed, expected, rtol=5e-3)


def test_drag_only_long_incline_approaches_terminal_speed() -> None:
    # Terminal speed on an incline: vt = sqrt(2 m g sin(a) / (rho CdA))
    # (Newtonian mechanics: drag balances the downhill weight component).
    mass, cda = 70.0, 0.5
    x, z, s, a = incline(-5.0, 1500.0, n=301)
    vt = np.sqrt(2.0 * mass * G * np.sin(-a) / (RHO * cda))
    for v0 in (0.0, 2.0 * vt):
        r = ride_speed(x, z, mass, drag_area=cda, start_speed=v0)
        assert r.arrival_speed == pytest.approx(vt, rel=5e-3)


def test_drag_only_time_from_rest_matches_closed_form() -> None:
    # From rest with quadratic drag: v = vt tanh(g' t / vt),
    # s = (vt^2 / g') ln cosh(g' t / vt), g' = g sin(a)
    # (Newtonian mechanics) -> t = (vt / g') acosh(exp(s g' / vt^2)).
    mass, cda, length = 90.0, 0.55, 200.0
    x, z, s, a = incline(-6.0, length)
    r = ride_speed(x, z, mass, drag_area=cda)
    gp = G * np.sin(-a)
    vt = np.sqrt(2.0 * mass * gp / (RHO * cda))
    t_expected = vt / gp * np.arccosh(np.exp(s * gp / vt**2))
    np.testing.assert_allclose(r.time, t_expected, rtol=5e-3, atol=1e-12)


# ---------------------------------------------------------------- rolling only


@pytest.mark.parametrize("crr", [0.01, 0.04])
def test_rolling_only_incline_matches_newton(crr: float) -> None:
    # Rolling resistance Crr N with N = m g cos(a) on a straight incline:
    # v^2 = v0^2 + 2 g s (sin a - Crr cos a) (Newtonian mechanics),
    # constant acceleration so t = (v - v0) / acc.
    x, z, s, a = incline(-6.0, 120.0)
    v0 = 1.5
    r = ride_speed(x, z, 75.0, rolling_resistance=crr, start_speed=v0)
    acc = G * (np.sin(-a) - crr * np.cos(a))
    expected = np.sqrt(v0**2 + 2.0 * acc * s)
    np.testing.assert_allclose(r.speed, expected, rtol=1e-9)
    assert r.arrival_time == pytest.approx((expected[-1] - v0) / acc, rel=1e-9)


# ---------------------------------------------------------------- stopping


def _v_tail(v0: float, a1: float, length1: float, crr: float) -> float:
    """Speed squared at the foot of a straight downhill (Newtonian mechanics)."""
    return v0**2 + 2.0 * G * length1 * (np.sin(a1) - crr * np.cos(a1))


def _kinked_line(a1_deg: float, l1: float, a2_deg: float, l2: float, n1: int = 40, n2: int = 40):
    a1, a2 = np.radians(a1_deg), np.radians(a2_deg)
    s1 = np.linspace(0.0, l1, n1 + 1)
    s2 = np.linspace(0.0, l2, n2 + 1)[1:]
    x = np.concatenate((s1 * np.cos(a1), l1 * np.cos(a1) + s2 * np.cos(a2)))
    z = np.concatenate((-s1 * np.sin(a1), -l1 * np.sin(a1) + s2 * np.sin(a2)))
    return x, z, a1, a2


def test_rolling_only_stops_on_uphill_tail_where_closed_form_says() -> None:
    # Down a straight slope, then up a straight tail, Crr only, no centripetal
    # term: v1^2 = v0^2 + 2 g L1 (sin a1 - Crr cos a1); stop after
    # d = v1^2 / (2 g (sin a2 + Crr cos a2)) up the tail (Newtonian mechanics).
    crr, l1, l2 = 0.03, 60.0, 80.0
    x, z, a1, a2 = _kinked_line(8.0, l1, 10.0, l2)
    r = ride_speed(x, z, 80.0, rolling_resistance=crr, start_speed=0.5, centripetal=False)
    v1sq = _v_tail(0.5, a1, l1, crr)
    d = v1sq / (2.0 * G * (np.sin(a2) + crr * np.cos(a2)))
    assert not r.reaches_end and r.arrival_speed is None
    assert r.stop_path == pytest.approx(l1 + d, rel=1e-9)
    assert r.stop_distance == pytest.approx(l1 * np.cos(a1) + d * np.cos(a2), rel=1e-9)
    assert r.stop_elevation == pytest.approx(-l1 * np.sin(a1) + d * np.sin(a2), abs=1e-9)
    # Time: two legs of uniform acceleration (Newtonian mechanics).
    acc1 = G * (np.sin(a1) - crr * np.cos(a1))
    t = (np.sqrt(v1sq) - 0.5) / acc1 + np.sqrt(v1sq) / (G * (np.sin(a2) + crr * np.cos(a2)))
    assert r.stop_time == pytest.approx(t, rel=1e-9)
    beyond = r.path > r.stop_path
    assert np.all(np.isnan(r.speed[beyond])) and np.all(np.isfinite(r.speed[~beyond]))


def test_sharp_turn_costs_the_sliding_round_a_curve_factor() -> None:
    # At a sharp turn of angle dtheta the centripetal normal force dominates,
    # and a body sliding round a curve with friction coefficient mu keeps
    # v = v_in exp(-mu dtheta) (classic textbook result, Newtonian mechanics).
    # So v1^2 is multiplied by exp(-2 Crr (a1 + a2)) at the kink.
    crr, l1, l2 = 0.03, 60.0, 80.0
    x, z, a1, a2 = _kinked_line(8.0, l1, 10.0, l2)
    r = ride_speed(x, z, 80.0, rolling_resistance=crr, start_speed=0.5)
    v1sq = _v_tail(0.5, a1, l1, crr) * np.exp(-2.0 * crr * (a1 + a2))
    d = v1sq / (2.0 * G * (np.sin(a2) + crr * np.cos(a2)))
    assert r.stop_path == pytest.approx(l1 + d, rel=1e-9)


def test_drag_and_rolling_stop_on_uphill_tail_matches_closed_form() -> None:
    # Uphill with rolling resistance and quadratic drag, E = v^2 / 2:
    # dE/ds = -c - k E, c = g (sin a2 + Crr cos a2), k = rho CdA / m
    # -> E = -c/k + (E1 + c/k) exp(-k s), stop at s = ln(1 + k E1 / c) / k
    # (Newtonian mechanics; linear first-order ODE).
    crr, cda, mass, l1 = 0.02, 0.5, 55.0, 70.0
    x, z, a1, a2 = _kinked_line(9.0, l1, 12.0, 80.0)
    r = ride_speed(x, z, mass, rolling_resistance=crr, drag_area=cda, centripetal=False)
    k = RHO * cda / mass
    c1 = G * (np.sin(a1) - crr * np.cos(a1))
    e1 = c1 / k * (1.0 - np.exp(-k * l1))  # from rest down the first leg
    c2 = G * (np.sin(a2) + crr * np.cos(a2))
    d = np.log1p(k * e1 / c2) / k
    assert r.stop_path == pytest.approx(l1 + d, rel=1e-9)


def test_start_from_rest_on_uphill_stops_at_start() -> None:
    # A body at rest with no downhill force stays at rest (Newton's first law).
    x, z, s, a = incline(3.0, 50.0)
    r = ride_speed(x, z, 70.0, rolling_resistance=0.01)
    assert not r.reaches_end
    assert r.stop_path == 0.0 and r.stop_time == 0.0
    assert r.speed[0] == 0.0 and np.all(np.isnan(r.speed[1:]))


# ---------------------------------------------------------------- curved path


def _solve_curved(dz, d2z, x_end, mass, crr, cda, v0):
    """Independent solution in x of the full equation with solve_ivp.

    dE/ds = -g sin(t) - Crr (g cos(t) + 2 E kappa) - (rho CdA / m) E with
    kappa = z'' / (1 + z'^2)^1.5 and ds/dx = sqrt(1 + z'^2). Returns the
    solution of E (dense, with a stop event) and the arrival time
    (integral of (ds/dx) / v dx) or None if the rider stops.
    """
    k = RHO * cda / mass

    def de_dx(x, e):
        p, q = dz(x), d2z(x)
        sec = np.sqrt(1.0 + p * p)
        return -G * p - crr * (G + 2.0 * e * q / (1.0 + p * p)) - k * e * sec

    def stopped(x, y):
        return y[0]

    stopped.terminal = True
    sol = solve_ivp(lambda x, y: [de_dx(x, y[0])], (0.0, x_end), [0.5 * v0 * v0],
                    events=stopped, rtol=1e-10, atol=1e-10, dense_output=True)
    if sol.t_events[0].size:
        return sol, None
    both = solve_ivp(
        lambda x, y: [de_dx(x, y[0]), np.sqrt(1.0 + dz(x) ** 2) / np.sqrt(2.0 * y[0])],
        (0.0, x_end), [0.5 * v0 * v0, 0.0], rtol=1e-10, atol=1e-10)
    return sol, float(both.y[1, -1])


@pytest.mark.parametrize(("mass", "v0"), [(40.0, 1.0), (130.0, 1.0), (70.0, 0.3)])
def test_curved_profile_matches_scipy_with_centripetal_term(mass: float, v0: float) -> None:
    # Independent check: scipy solve_ivp on the smooth parabola, full equation
    # including the centripetal term, against the piecewise solution on
    # 601 sampled points. Tolerance 0.2 % in speed and arrival time.
    z_of_x = lambda x: 12.0 - 0.25 * x + 0.0016 * x**2  # noqa: E731
    dz = lambda x: -0.25 + 0.0032 * x  # noqa: E731
    d2z = lambda x: 0.0032  # noqa: E731
    crr, cda = 0.02, 0.5
    x = np.linspace(0.0, 120.0, 601)
    r = ride_speed(x, z_of_x(x), mass, rolling_resistance=crr, drag_area=cda, start_speed=v0)
    sol, t_arrive = _solve_curved(dz, d2z, 120.0, mass, crr, cda, v0)
    if t_arrive is None:
        x_stop = sol.t_events[0][0]
        assert not r.reaches_end
        assert r.stop_distance == pytest.approx(x_stop, rel=2e-3)
        ok = x < x_stop - 1.0
    else:
        assert r.reaches_end
        assert r.arrival_time == pytest.approx(t_arrive, rel=2e-3)
        ok = np.ones_like(x, dtype=bool)
    v_ref = np.sqrt(2.0 * sol.sol(x[ok])[0])
    np.testing.assert_allclose(r.speed[ok], v_ref, rtol=2e-3, atol=1e-3)


def test_hump_normal_force_and_lift_off_match_circular_motion() -> None:
    # Over a circular hump of radius R at angle phi from the crest the normal
    # force per weight is cos(phi) - v^2 / (g R) (uniform circular motion);
    # without losses v^2 = v0^2 + 2 g (z0 - z) (energy). The trolley lifts off
    # where that turns negative. Tolerance 1e-3 on the smallest ratio.
    radius = 20.0
    phi = np.linspace(-0.3, 0.3, 301)
    x, z = radius * np.sin(phi), radius * np.cos(phi)
    for v0, lifts in ((5.0, False), (16.0, True)):
        r = ride_speed(x, z, 80.0, start_speed=v0)
        v2 = v0**2 + 2.0 * G * (z[0] - z)
        ratio = np.cos(phi) - v2 / (G * radius)
        assert r.lifts_off is lifts
        assert r.min_normal_ratio == pytest.approx(ratio.min(), abs=1e-3)


# ---------------------------------------------------------------- clearance


def test_clearance_straight_line_over_flat_ground_is_geometric() -> None:
    # Straight cable from (0, 9) down to (60, 4.2), feet 1.8 m below it, flat
    # ground at 0.5 m: smallest clearance 4.2 - 1.8 - 0.5 = 1.9 m at the low
    # end (plane geometry).
    x = np.linspace(0.0, 60.0, 31)
    z = 9.0 - 0.08 * x
    c = feet_clearance(x, z, 1.8, [-5.0, 70.0], [0.5, 0.5])
    assert c.minimum == pytest.approx(1.9, abs=1e-12)
    assert c.minimum_distance == pytest.approx(60.0)
    np.testing.assert_allclose(c.clearance, z - 1.8 - 0.5, atol=1e-12)


def test_clearance_finds_a_mound_between_profile_points() -> None:
    # Straight line z = 6 - 0.05 x, feet 1.5 below; ground flat at 0 with a
    # triangular mound peaking 3.2 m at x = 31 (between profile points 30, 40):
    # clearance there 6 - 1.55 - 1.5 - 3.2 = -0.25 m (plane geometry).
    x = np.linspace(0.0, 80.0, 9)
    z = 6.0 - 0.05 * x
    gd = [0.0, 28.0, 31.0, 34.0, 80.0]
    gz = [0.0, 0.0, 3.2, 0.0, 0.0]
    c = feet_clearance(x, z, 1.5, gd, gz)
    assert c.minimum == pytest.approx(6.0 - 0.05 * 31.0 - 1.5 - 3.2, abs=1e-12)
    assert c.minimum_distance == pytest.approx(31.0)
    assert c.ground_elevation == pytest.approx(3.2)


def test_clearance_sagging_parabola_over_slope_matches_calculus() -> None:
    # Feet path z = 10 - 0.3 x + 0.002 x^2 - 1.6 over ground z = 5 - 0.1 x:
    # clearance 3.4 - 0.2 x + 0.002 x^2, minimum at x = 50 of 3.4 - 5 = -1.6
    # (calculus: derivative zero). Piecewise sampling at 1 m hits x = 50.
    x = np.linspace(0.0, 100.0, 101)
    c = feet_clearance(x, 10.0 - 0.3 * x + 0.002 * x**2, 1.6, [0.0, 100.0], [5.0, -5.0])
    assert c.minimum == pytest.approx(-1.6, abs=1e-9)
    assert c.minimum_distance == pytest.approx(50.0)


def test_level_line_without_losses_keeps_its_speed_and_drag_decays_it() -> None:
    # Newton's first law: on a level, frictionless line the speed stays v0.
    # With drag only, dE/ds = -k E, so v = v0 exp(-k s / 2), k = rho CdA / m
    # (Newtonian mechanics).
    x = np.linspace(0.0, 40.0, 21)
    z = np.zeros_like(x)
    r = ride_speed(x, z, 70.0, start_speed=3.0)
    np.testing.assert_allclose(r.speed, 3.0, rtol=1e-12)
    assert r.arrival_time == pytest.approx(40.0 / 3.0, rel=1e-12)
    r = ride_speed(x, z, 70.0, start_speed=3.0, drag_area=0.5)
    k = RHO * 0.5 / 70.0
    np.testing.assert_allclose(r.speed, 3.0 * np.exp(-k * x / 2.0), rtol=1e-9)
    # Time: integral of exp(k s / 2) / v0 ds = 2 (exp(k L / 2) - 1) / (k v0).
    assert r.arrival_time == pytest.approx(2.0 * np.expm1(k * 20.0) / (k * 3.0), rel=1e-9)
