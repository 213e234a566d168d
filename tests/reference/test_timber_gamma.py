"""EN 1995-1-1 Annex B gamma method: limits and the two-member closed form."""
import math

import pytest

from spanstay.models.common.errors import InputError
from spanstay.models.parts.gamma_method import effective_stiffness, gamma_factor, joint_shear_flow

E = 11.0e9
b, t = 0.184, 0.038          # ply 184 x 38 mm, stacked through the 38 mm thickness
A, I = b * t, b * t**3 / 12
L = 3.0


@pytest.mark.parametrize("n", [2, 3])
def test_no_connection_gives_sum_of_ply_ei(n):
    # Annex B with gamma_1 = gamma_3 = 0 (K -> 0): (EI)_ef = sum E_i I_i
    r = effective_stiffness([E] * n, [A] * n, [I] * n, [t] * n, [0.0] * (n - 1), L)
    assert r.EI_ef == pytest.approx(n * E * I, rel=1e-12)
    r = effective_stiffness([E] * n, [A] * n, [I] * n, [t] * n, [1e-6] * (n - 1), L)
    assert r.EI_ef == pytest.approx(n * E * I, rel=1e-6)


@pytest.mark.parametrize("n", [2, 3])
def test_rigid_connection_gives_full_section(n):
    # gamma = 1 (K -> inf): one solid section b (n t)^3 / 12 (Annex B, B.1 with gamma_i = 1)
    full = E * b * (n * t) ** 3 / 12
    r = effective_stiffness([E] * n, [A] * n, [I] * n, [t] * n, [math.inf] * (n - 1), L)
    assert r.EI_ef == pytest.approx(full, rel=1e-12)
    r = effective_stiffness([E] * n, [A] * n, [I] * n, [t] * n, [1e15] * (n - 1), L)
    assert r.EI_ef == pytest.approx(full, rel=1e-6)
    assert r.composite_factor == pytest.approx(1.0, rel=1e-6)


def test_two_unequal_plies_match_series_spring_form():
    # Two members: (EI)_ef = E1I1 + E2I2 + r^2 / (1/(E1A1) + 1/(E2A2) + pi^2/(k l^2)),
    # the same Annex B expression rewritten with 1/(gamma_1 E1 A1) = 1/(E1 A1) + pi^2/(k l^2);
    # r = (h1 + h2)/2 distance between centroids. Independent algebra.
    E1, E2, h1, h2 = 12e9, 9e9, 0.038, 0.089
    A1, A2 = b * h1, b * h2
    I1, I2 = b * h1**3 / 12, b * h2**3 / 12
    k = 4.0e6   # N/m per m
    r = (h1 + h2) / 2
    expected = E1 * I1 + E2 * I2 + r**2 / (1 / (E1 * A1) + 1 / (E2 * A2) + math.pi**2 / (k * L**2))
    res = effective_stiffness([E1, E2], [A1, A2], [I1, I2], [h1, h2], [k], L)
    assert res.EI_ef == pytest.approx(expected, rel=1e-10)
    # and symmetric in the ply order
    res2 = effective_stiffness([E2, E1], [A2, A1], [I2, I1], [h2, h1], [k], L)
    assert res2.EI_ef == pytest.approx(expected, rel=1e-10)


def test_gamma_formula_and_shear_flow_limit():
    # gamma = [1 + pi^2 E A s / (K l^2)]^-1 (Annex B (B.5)); with K/s = k
    k = 2.5e6
    assert gamma_factor(E * A, k, L) == pytest.approx(1 / (1 + math.pi**2 * E * A / (k * L**2)))
    # rigid two-ply: shear flow = V Q / I of the full section, Q = A t/2 (Jourawski)
    r = effective_stiffness([E] * 2, [A] * 2, [I] * 2, [t] * 2, [math.inf], L)
    V = 1000.0
    q = joint_shear_flow(r, [E] * 2, [A] * 2, V)
    assert q[0] == pytest.approx(V * A * t / 2 / (b * (2 * t) ** 3 / 12), rel=1e-12)


def test_more_than_three_plies_is_an_input_error():
    with pytest.raises(InputError, match="2 or 3 plies"):
        effective_stiffness([E] * 4, [A] * 4, [I] * 4, [t] * 4, [1e6] * 3, L)
