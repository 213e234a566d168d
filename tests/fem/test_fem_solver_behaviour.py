"""Solver behaviour: typed convergence failure, DOF pruning, stepping and restarts."""
from __future__ import annotations

import numpy as np
import pytest

import spanstay.fem as fem
from spanstay.fem.assembly import Assembler


class SaturatingLaw:
    """p = p_u tanh(k u / p_u): can never carry more than p_u."""

    def __init__(self, k: float, p_u: float) -> None:
        self.k, self.p_u = k, p_u

    def force(self, u):
        return self.p_u * np.tanh(self.k * u / self.p_u)

    def stiffness(self, u):
        return self.k * (1.0 - np.tanh(self.k * u / self.p_u) ** 2)


def test_convergence_error_carries_step_history_and_sites():
    # A load 1.5 times the capacity of the only spring: no equilibrium exists beyond
    # factor 1/1.5, so the solve must fail there and say where.
    k, p_u = 1e6, 1e3
    m = fem.Model()
    post = m.add_node([0, 0, 0])
    m.add_springs([post], "uy", SaturatingLaw(k, p_u), name="soil")
    m.add_load(post, [0, 1.5 * p_u, 0])
    opts = fem.SolverOptions(max_iterations=12, min_increment=1e-3)
    with pytest.raises(fem.ConvergenceError) as info:
        fem.solve(m, steps=4, options=opts)
    err = info.value
    assert isinstance(err, fem.FemError) and isinstance(err, RuntimeError)
    assert err.step >= 3                        # steps at factor 0.25 and 0.5 succeeded
    assert err.factor * 1.5 * p_u > p_u          # it fails beyond the capacity ...
    assert err.factor * 1.5 * p_u < 1.01 * p_u   # ... and only just beyond it
    assert len(err.history) >= 2 and all(np.isfinite(err.history))
    assert err.sites and err.sites[0].node == post and err.sites[0].dof == "uy"
    assert "spring 'soil'[0] at node 0 uy" in err.sites[0].elements
    text = str(err)
    assert f"load step {err.step}" in text and "node 0 uy" in text and "Residual history" in text


def test_max_iterations_failure_names_the_reason():
    m = fem.Model()
    post = m.add_node([0, 0, 0])
    m.add_springs([post], "ux", SaturatingLaw(1e6, 1e3))
    m.add_load(post, [2e3, 0, 0])
    with pytest.raises(fem.ConvergenceError, match="not converged in 3 iterations"):
        fem.solve(m, options=fem.SolverOptions(max_iterations=3, min_increment=0.5))


def _guyed_point():
    """A node where only three cables meet, plus a beam elsewhere."""
    m = fem.Model()
    hub = m.add_node([0, 0, 0])
    anchors = m.add_nodes([[-3, 0, 0], [3, 0, 0], [0, 3, 0]])
    post = m.add_nodes([[0, -3, -2], [0, -3, 0]])
    m.add_cables(anchors, [hub] * 3, 1e6, np.full(3, 3.0 * 0.999))
    m.add_beams([post[0]], [post[1]], fem.BeamSection.circle(10e9, 6e8, 0.15), orientation=(1, 0, 0))
    m.add_cables([post[1]], [hub], 1e6, 3.0 * 0.999, name="to_post")
    m.fix(anchors, "xyz")
    m.fix(post[0])
    return m, hub, anchors, post


def test_node_only_cables_meet_carries_three_dofs():
    m, hub, anchors, post = _guyed_point()
    asm = Assembler(m)
    per_node = asm.active.reshape(-1, 6)
    assert per_node[hub].tolist() == [True] * 3 + [False] * 3      # hub: ux, uy, uz only
    assert per_node[post[1]].all()                                  # beam node: all six
    # equations: hub 3 + free beam end 6 (anchors and the beam base are fixed)
    assert asm.n_eq == 3 + 6
    m.add_load(hub, [0, 0, -500.0])
    s = fem.solve(m)                                                # no mechanism reported
    assert s.u[hub, 2] < 0
    assert np.all(s.u[hub, 3:] == 0.0)


def test_unconnected_node_is_dropped():
    m = fem.Model()
    a, b, lonely = m.add_nodes([[0, 0, 0], [1, 0, 0], [5, 5, 5]])
    m.add_cables([a], [b], 1e6, 1.0)
    m.fix(a, "xyz")
    m.add_springs([b], "ux", fem.LinearLaw(1e3))
    m.add_springs([b], "uy", fem.LinearLaw(1e3), name="y")
    m.add_springs([b], "uz", fem.LinearLaw(1e3), name="z")
    asm = Assembler(m)
    assert not asm.active.reshape(-1, 6)[lonely].any()
    assert asm.n_eq == 3
    m.add_load(b, [10.0, 0, 0])
    s = fem.solve(m)
    assert np.all(s.u[lonely] == 0.0)


def test_restart_from_a_state_and_iteration_record():
    # Solving in two calls (0 -> 0.5 -> 1) ends where one call does; iterations and the
    # residual history are recorded per accepted increment.
    sec = fem.BeamSection.rectangle(10e9, 6e8, 0.1, 0.2)
    m = fem.Model()
    ids = m.add_nodes(np.c_[np.linspace(0, 2, 9), np.zeros(9), np.zeros(9)])
    m.add_beams(ids[:-1], ids[1:], sec, orientation=(0, 1, 0))
    m.fix(ids[0])
    m.add_load(ids[-1], [0, 0, 0, 0, -3e5, 0])
    one = fem.solve(m, steps=2)
    half = fem.solve(m, factor=0.5)
    two = fem.solve(m, state=half, factor=1.0)
    assert np.abs(two.translation - one.translation).max() < 1e-9
    assert len(one.iterations) == len(one.history) == 2
    assert all(len(h) == n + 1 for h, n in zip(one.history, one.iterations))
    assert one.history[0][-1] <= fem.SolverOptions().force_tol


def test_prescribed_displacement_is_scaled_and_gives_reaction():
    # A cable pulled by a prescribed end displacement d: T = EA d / L0 (Hooke), and the
    # reaction at the prescribed DOF is that tension.
    EA, L0, d = 2e6, 4.0, 0.01
    m = fem.Model()
    a, b = m.add_nodes([[0, 0, 0], [L0, 0, 0]])
    m.add_cables([a], [b], EA, L0)
    m.fix(a, "xyz")
    m.fix(b, ["uy", "uz"])
    m.prescribe(b, "ux", d)
    s = fem.solve(m, factor=0.5)
    assert s.u[b, 0] == pytest.approx(0.5 * d, rel=1e-12)
    assert s.group("cables").tension[0] == pytest.approx(EA * 0.5 * d / L0, rel=1e-9)
    assert s.reactions[b, 0] == pytest.approx(EA * 0.5 * d / L0, rel=1e-9)


def test_unknown_result_group():
    m = fem.Model()
    a, b = m.add_nodes([[0, 0, 0], [1, 0, 0]])
    m.add_cables([a], [b], 1e6, 1.0)
    m.fix(a, "xyz")
    m.fix(b, "xyz")
    s = fem.solve(m)
    with pytest.raises(KeyError, match="no results for group 'beams'"):
        s.group("beams")


def _split_model(split: int) -> fem.Model:
    sec = fem.BeamSection.rectangle(10e9, 6e8, 0.1, 0.2)
    m = fem.Model()
    post = m.add_nodes(np.c_[np.zeros(7), np.zeros(7), np.linspace(0, 3, 7)])
    for i, part in enumerate(np.array_split(np.arange(6), split)):
        m.add_beams(post[part], post[part + 1], sec, orientation=(1, 0, 0), name=f"post{i}")
    line = m.add_nodes(np.c_[np.linspace(0.5, 6, 12), np.zeros(12), np.full(12, 3.0)])
    chain = np.r_[post[-1], line]
    for i, part in enumerate(np.array_split(np.arange(12), split)):
        m.add_cables(chain[part], chain[part + 1], 1e6, 0.499, weight=5.0, name=f"line{i}")
    for i in range(split):   # dangling link nodes: carry nothing, change nothing
        extra = m.add_node(m.coords[post[2 + i]])
        m.add_links([post[2 + i]], [extra], [1e5] * 6, name=f"tie{i}")
    m.fix(post[0])
    m.fix(line[-1], "xyz")
    m.add_load(line[5], [0, 0, -200.0])
    return m


def test_groups_of_one_kind_evaluated_together_give_the_same_answer():
    # The solver evaluates all beam (cable, link) groups as one batch; splitting a model
    # into several groups must not change anything, and editing a member group's cable
    # lengths between solves must still take effect.
    out = []
    for split in (1, 3):
        m = _split_model(split)
        s1 = fem.solve(m)
        m.group("line0").L0[:4] *= 1.001
        s2 = fem.solve(m)
        assert np.abs(s2.translation - s1.translation).max() > 1e-4   # the edit took effect
        out.append((s1, s2))
    (a1, a2), (b1, b2) = out
    n = a1.translation.shape[0]   # the split model has two more (unloaded) link nodes
    assert np.abs(b1.translation[:n] - a1.translation).max() < 1e-12
    assert np.abs(b2.translation[:n] - a2.translation).max() < 1e-12
