"""Tree anchors: a missing root-plate stiffness is an InputError naming the anchor; the
stem tapers as given; the root plate turns as a rotational spring (statics)."""
import numpy as np
import pytest

from spanstay.fem import Model, solve
from spanstay.models.checks.anchors import check_anchor
from spanstay.models.parts.anchor import add_anchor
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.spec import AnchorSpec, GroundSpec, TreeSpec

GROUND = GroundSpec(profile=(), soil=())


def tree(k_root, capacity=None):
    t = TreeSpec(diameter_at_grade=0.6, diameter_at_attachment=0.45, attachment_height=4.0,
                 E_green=8e9, root_plate_stiffness=k_root, root_plate_capacity=capacity,
                 species="white oak")
    return AnchorSpec(name="old-oak", kind="tree", x=0.0, y=0.0, grade=0.0, post=None,
                      footing=None, guys=(), brace=None, tree=t)


@pytest.mark.parametrize("k_root", [0.0, None])
def test_tree_without_root_stiffness(k_root):
    with pytest.raises(InputError) as err:
        add_anchor(Model(), tree(k_root), GROUND, [4.0], np.array([1.0, 0, 0]))
    assert "old-oak" in str(err.value) and "root-plate" in str(err.value)


def test_root_plate_rotation_and_checks():
    # Statics: the root plate takes the whole moment P h; its rotation is P h / k.
    # The top of the stem moves by that rotation times h plus the stem's own bending
    # (tapered, so only bounded here by the uniform stems at the two end diameters:
    # Roark Table 8.1 case 1a, P h^3 / (3 E I)).
    k, P, h = 5e7, 4000.0, 4.0
    m = Model()
    built = add_anchor(m, tree(k, capacity=1e5), GROUND, [h], np.array([1.0, 0, 0]))
    m.add_load(built.node_at(h), [P, 0, 0])
    st = solve(m)
    assert st.reactions[built.grade_node, 4] == pytest.approx(-P * h, rel=1e-3)
    u = st.translation[built.node_at(h), 0]
    bend = [P * h**3 / (3 * 8e9 * np.pi * d**4 / 64) for d in (0.6, 0.45)]
    assert P * h / k * h + bend[0] < u < P * h / k * h + bend[1]
    rep = check_anchor(m, built, st)
    root = [c for c in rep.checks if c.part == "root plate"][0]
    assert root.demand == pytest.approx(P * h, rel=1e-3) and root.capacity == 1e5
    assert any("arborist" in c for c in rep.cautions)
    assert any("girdle" in c for c in rep.cautions)


def test_stem_compression_against_green_fc_with_a_factor():
    # Statics: at grade M = P h and N = W (a downward load); the compression face carries
    # M / (pi d^3 / 32) + N / (pi d^2 / 4). White oak, green compression parallel to grain
    # 3,560 psi (Wood Handbook, quoted) over the tree factor of safety 3 (our judgement).
    from types import SimpleNamespace

    P, W, h, d = 20e3, 5e3, 4.0, 0.6
    m = Model()
    built = add_anchor(m, tree(5e7), GROUND, [h], np.array([1.0, 0, 0]))
    m.add_load(built.node_at(h), [P, 0, -W])
    st = solve(m)
    settings = SimpleNamespace(tree_factor_of_safety=3.0)
    rep = check_anchor(m, built, st, settings=settings)
    (stem,) = [c for c in rep.checks if c.part == "stem at grade"]
    expected = P * h / (np.pi * d**3 / 32) + W / (np.pi * d**2 / 4)
    assert stem.demand == pytest.approx(expected, rel=2e-3)
    assert stem.capacity == pytest.approx(3560 * 6894.757 / 3.0, rel=2e-3)
    # a pull three times larger fails: the check can fail
    m.add_load(built.node_at(h), [2 * P, 0, 0])
    rep = check_anchor(m, built, solve(m), settings=settings)
    (stem,) = [c for c in rep.checks if c.part == "stem at grade"]
    assert stem.demand > 2.5 * expected
    assert not stem.passes
