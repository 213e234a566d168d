"""Global equilibrium of engine results, and the helpers the other engine tests use.

Every engine reference test checks statics of the whole structure (Newton's
laws; any statics text): the reactions from the ground (supports plus
springs, ``State.reactions``) and the applied loads sum to zero, forces and
moments, the moments taken about the origin at the deformed positions. The
applied loads are rebuilt here from what the test put on the model, not read
back from the engine.
"""
from __future__ import annotations

import numpy as np
import pytest

import spanstay.fem as fem

BALANCE_RTOL = 1e-8  # issue 2: reactions balance applied loads to 1e-8 relative


def nodal_loads(n_nodes: int, loads: list[tuple[int, list[float]]], factor: float = 1.0) -> np.ndarray:
    """(n, 6) applied nodal forces and moments from (node, 3- or 6-vector) pairs."""
    out = np.zeros((n_nodes, 6))
    for node, vec in loads:
        vec = np.asarray(vec, dtype=float)
        out[node, : vec.size] += factor * vec
    return out


def lumped_weight(n_nodes: int, conn: np.ndarray, weight, L0, gravity=(0.0, 0.0, -1.0)) -> np.ndarray:
    """(n, 6) self-weight w L0 of two-node segments, half to each end node."""
    conn = np.asarray(conn)
    half = 0.5 * np.broadcast_to(np.asarray(weight, float), conn.shape[:1]) * np.broadcast_to(
        np.asarray(L0, float), conn.shape[:1])
    out = np.zeros((n_nodes, 6))
    g = np.asarray(gravity, dtype=float)
    for end in (0, 1):
        np.add.at(out[:, :3], conn[:, end], half[:, None] * g[None, :])
    return out


def assert_balance(model: fem.Model, state: fem.State, applied: np.ndarray,
                   rtol: float = BALANCE_RTOL) -> None:
    """Reactions + applied loads sum to zero (forces and moments about the origin)."""
    x = state.positions(model.coords)
    total = applied + state.reactions
    force = total[:, :3].sum(axis=0)
    moment = (np.cross(x, total[:, :3]) + total[:, 3:]).sum(axis=0)
    size = max(float(np.max(np.abs(x))), 1.0)
    f_scale = np.abs(applied[:, :3]).sum() + np.abs(applied[:, 3:]).sum() / size
    m_scale = f_scale * size
    assert np.linalg.norm(force) <= rtol * f_scale, f"force imbalance {force} vs loads {f_scale:.4g}"
    assert np.linalg.norm(moment) <= rtol * m_scale, f"moment imbalance {moment} vs {m_scale:.4g}"


def tight() -> fem.SolverOptions:
    """Solver options converged well below the equilibrium tolerance of the checks."""
    return fem.SolverOptions(force_tol=1e-11, disp_tol=1e-10)


# -- the helpers themselves, on a statically determinate frame ------------------------------

def test_simply_supported_beam_reactions_by_statics():
    # Simply supported beam, span L, point load P at distance a from the left support:
    # R_left = P (L - a) / L, R_right = P a / L (statics; Roark Table 8.1 case 1e).
    E, G, L, a, P = 200e9, 80e9, 6.0, 2.0, 12e3
    m = fem.Model()
    ids = m.add_nodes(np.c_[np.linspace(0, L, 13), np.zeros(13), np.zeros(13)])
    m.add_beams(ids[:-1], ids[1:], fem.BeamSection.rectangle(E, G, 0.1, 0.3), orientation=(0, 1, 0))
    m.fix(ids[0], ["ux", "uy", "uz", "rx"])
    m.fix(ids[-1], ["uy", "uz"])
    load_node = int(round(a / L * 12))
    m.add_load(load_node, [0, 0, -P])
    s = fem.solve(m, options=tight())
    assert s.reactions[0, 2] == pytest.approx(P * (L - a) / L, rel=1e-6)
    assert s.reactions[-1, 2] == pytest.approx(P * a / L, rel=1e-6)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(load_node, [0, 0, -P])]))


def test_balance_check_can_fail():
    # The check must reject a state whose reactions do not balance the loads.
    m = fem.Model()
    a, b = m.add_node([0, 0, 0]), m.add_node([2, 0, 0])
    m.add_cables([a], [b], EA=1e6, L0=2.0)
    m.fix(a, "xyz")
    m.add_load(b, [100.0, 0, 0])
    m.add_springs([b], "uy", fem.LinearLaw(1e3))
    m.add_springs([b], "uz", fem.LinearLaw(1e3), name="vertical")
    s = fem.solve(m, options=tight())
    applied = nodal_loads(m.n_nodes, [(b, [100.0, 0, 0])])
    assert_balance(m, s, applied)
    with pytest.raises(AssertionError):
        assert_balance(m, s, 1.001 * applied)
