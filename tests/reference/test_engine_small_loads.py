"""Tiny loads on stiff beams converge, to the linear closed form.

Source: Roark's Formulas for Stress and Strain, Table 8.1 case 1a (cantilever, tip load,
d = P L^3 / (3 E I)) with Timoshenko's shear term P L / (G A_s) and the axial term
P L / (E A), resolved along the local axes of a skew cantilever (a load this small
keeps the response linear to about 1e-9). Before the round-off floor of the force test
these solves stopped converging below about 0.03 N (and 3 N for a part 100 times
stiffer) and ended in "no equilibrium at factor 7.6e-06". (Far smaller loads, ~1e-6 N
here, converge too, but their answer is then only as good as the floor: about 1e-6.)
"""
from __future__ import annotations

import numpy as np
import pytest

import spanstay.fem as fem

LENGTH = 2.2
E, G, WIDTH_Y, DEPTH_Z = 10e9, 6e8, 0.1, 0.2
AXIS = np.array([1.0, 0.6, 0.3]) / np.linalg.norm([1.0, 0.6, 0.3])


def skew_cantilever(load: float, stiffness_factor: float):
    m = fem.Model()
    ids = m.add_nodes(np.outer(np.linspace(0.0, LENGTH, 23), AXIS))
    sec = fem.BeamSection.rectangle(stiffness_factor * E, stiffness_factor * G, WIDTH_Y, DEPTH_Z)
    m.add_beams(ids[:-1], ids[1:], sec, orientation=(0.0, 0.0, 1.0))
    m.fix(ids[0])
    force = np.array([0.0, 0.0, -load])
    m.add_load(ids[-1], np.r_[force, 0.0, 0.0, 0.0])
    return m, sec, force


def linear_tip(sec: fem.BeamSection, force: np.ndarray) -> np.ndarray:
    e1 = AXIS
    e3 = np.cross(e1, [0.0, 0.0, 1.0])
    e3 /= np.linalg.norm(e3)
    e2 = np.cross(e3, e1)
    compliance = (LENGTH / (sec.E * sec.A),                                         # axial
                  LENGTH**3 / (3 * sec.E * sec.Iz) + LENGTH / (sec.G * sec.Asy),   # along local y
                  LENGTH**3 / (3 * sec.E * sec.Iy) + LENGTH / (sec.G * sec.Asz))   # along local z
    return sum(c * (e @ force) * e for c, e in zip(compliance, (e1, e2, e3)))


@pytest.mark.parametrize("load, stiffness_factor", [(0.01, 1.0), (1e-4, 1.0), (1.0, 100.0),
                                                    (0.01, 100.0)])
def test_tiny_tip_load_converges_to_the_linear_closed_form(load, stiffness_factor):
    m, sec, force = skew_cantilever(load, stiffness_factor)
    s = fem.solve(m)
    expected = linear_tip(sec, force)
    assert np.linalg.norm(s.translation[-1] - expected) <= 1e-6 * np.linalg.norm(expected)
    assert s.failed_iterations == 0


def test_ordinary_load_unchanged_by_the_floor():
    # 1 kN: the floor (about 1e-6 N here) is far below force_tol times the load, so the
    # force test is the usual relative one; the closed form holds to the geometric
    # nonlinearity of a deflection of 1 % of the length (rel 1e-2; 0.6 % measured).
    m, sec, force = skew_cantilever(1e3, 1.0)
    s = fem.solve(m)
    assert s.history[-1][-1] <= fem.SolverOptions().force_tol
    expected = linear_tip(sec, force)
    assert np.linalg.norm(s.translation[-1] - expected) <= 1e-2 * np.linalg.norm(expected)
