"""Bad model input raises fem.ModelError with a message that names the culprit.

Issue 2, "Bad input": zero-length or coincident-node elements, non-positive section
or material values, NaN or infinite values, a beam orientation parallel to its axis,
references to missing nodes and a mechanism each raise a clear error naming the
element, node or DOF; no bare numpy or scipy traceback.
"""
from __future__ import annotations

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

import spanstay.fem as fem

SEC = fem.BeamSection.rectangle(10e9, 10e9 / 16, 0.1, 0.2)


def three_nodes() -> fem.Model:
    m = fem.Model()
    m.add_nodes([[0, 0, 0], [1, 0, 0], [2, 0, 0]])
    return m


def raises(match: str):
    return pytest.raises(fem.ModelError, match=match)


# -- geometry and connectivity ---------------------------------------------------------------

@pytest.mark.parametrize("adder", ["beams", "cables"])
def test_zero_length_element_names_element_and_nodes(adder):
    m = three_nodes()
    twin = m.add_node([1.0, 0, 0])  # node 3 coincides with node 1
    with raises(r"element 1: zero length \(nodes 1 and 3 coincide\)"):
        if adder == "beams":
            m.add_beams([0, 1], [1, twin], SEC, name="post")
        else:
            m.add_cables([0, 1], [1, twin], 1e6, 1.0, name="guy")


def test_link_with_both_ends_on_one_node():
    m = three_nodes()
    with raises(r"link group 'fasteners' element 1: both ends on node 2"):
        m.add_links([0, 2], [1, 2], [1e6] * 6, name="fasteners")


def test_link_between_coincident_nodes_is_allowed():
    m = three_nodes()
    twin = m.add_node([1.0, 0, 0])
    m.add_links([1], [twin], [1e6] * 6)   # a fastener between two plies at one point


@pytest.mark.parametrize("call", ["beams", "cables", "links", "springs", "fix", "load", "prescribe"])
def test_missing_node_is_named(call):
    m = three_nodes()
    with raises(r"missing node 7 \(the model has 3 nodes\)"):
        if call == "beams":
            m.add_beams([0], [7], SEC)
        elif call == "cables":
            m.add_cables([7], [0], 1e6, 1.0)
        elif call == "links":
            m.add_links([0], [7], [1.0] * 6)
        elif call == "springs":
            m.add_springs([1, 7], "uz", fem.LinearLaw(1.0))
        elif call == "fix":
            m.fix(7)
        elif call == "load":
            m.add_load(7, [1, 0, 0])
        else:
            m.prescribe(7, "ux", 0.01)


def test_node_ids_must_be_integers():
    m = three_nodes()
    with raises("integer node ids"):
        m.add_cables([0.0], [1.5], 1e6, 1.0)


@pytest.mark.parametrize("orientation, match", [((3.0, 0.0, 0.0), "parallel to the beam axis"),
                                                ((0.0, 0.0, 0.0), "orientation vector is zero")])
def test_orientation_parallel_or_zero(orientation, match):
    m = three_nodes()
    with raises(rf"beam group 'post' element 0: .*{match}"):
        m.add_beams([0, 1], [1, 2], SEC, orientation=orientation, name="post")


def test_orientation_parallel_for_one_element_of_many():
    m = three_nodes()
    top = m.add_node([2.0, 0.0, 1.0])
    with raises(r"element 2: orientation vector \[0.0, 0.0, 1.0\] is parallel"):
        m.add_beams([0, 1, 2], [1, 2, top], SEC, orientation=(0.0, 0.0, 1.0))


# -- values ------------------------------------------------------------------------------------

@pytest.mark.parametrize("field", ["E", "G", "A", "Iy", "Iz", "J", "Asy", "Asz"])
@pytest.mark.parametrize("value", [0.0, -5.0])
def test_non_positive_section_value_names_element(field, value):
    m = three_nodes()
    vals = dict(E=10e9, G=6e8, A=0.02, Iy=6e-5, Iz=1e-5, J=2e-5, Asy=0.017, Asz=0.017)
    vals[field] = np.array([vals[field], value])
    with raises(rf"beam group 'beams' element 1: {field} must be positive, got {value}"):
        m.add_beams([0, 1], [1, 2], fem.BeamSection(**vals))


@pytest.mark.parametrize("field, value", [("EA", 0.0), ("EA", -1.0), ("L0", 0.0), ("L0", -2.0)])
def test_non_positive_cable_value_names_element(field, value):
    m = three_nodes()
    kw = dict(EA=[1e6, 1e6], L0=[1.0, 1.0])
    kw[field] = [kw[field][0], value]
    with raises(rf"cable group 'line' element 1: .*{field} must be positive, got {value}"):
        m.add_cables([0, 1], [1, 2], name="line", **kw)


def test_negative_weight_and_link_stiffness():
    m = three_nodes()
    with raises(r"cable group 'cables' element 0: weight must be non-negative"):
        m.add_cables([0], [1], 1e6, 1.0, weight=-1.0)
    with raises(r"link group 'links' element 0: stiffness must be non-negative"):
        m.add_links([0], [1], [1.0, 1.0, -1.0, 0, 0, 0])
    with raises("spring stiffness must be finite and non-negative"):
        fem.LinearLaw(-3.0)


@pytest.mark.parametrize("bad", [np.nan, np.inf, -np.inf])
def test_non_finite_values_are_named(bad):
    m = three_nodes()
    with raises(r"node 4: coordinate y is not finite"):
        m.add_nodes([[5.0, 0, 0], [6.0, bad, 0]])
    with raises(r"add_load: load on node 2 rz is not finite"):
        m.add_load(2, [0, 0, 0, 0, 0, bad])
    with raises(r"prescribe: node 1 uz: the value must be a finite number"):
        m.prescribe(1, "uz", bad)
    with raises(r"beam group 'beams' element 1: E is not finite"):
        m.add_beams([0, 1], [1, 2], fem.BeamSection([1e9, bad], 1e8, 1e-2, 1e-5, 1e-5, 1e-5))
    with raises(r"cable group 'cables' element 0: dT is not finite"):
        m.add_cables([0], [1], 1e6, 1.0, alpha=1e-5, dT=bad)
    with raises(r"link group 'links' element 0: offset2 component 2 is not finite"):
        m.add_links([0], [1], [1.0] * 6, offset2=[0.0, 0.0, bad])
    with raises(r"spring 1"):
        fem.LinearLaw([1.0, bad])
    with raises(r"model: gravity is not finite"):
        fem.Model(gravity=(0.0, 0.0, bad))
    with raises(r"load factor must be a finite number"):
        fem.solve(m, factor=bad)


def test_spring_law_giving_nan_is_named():
    class Broken:
        def force(self, u):
            return np.where(np.arange(u.size) == 1, np.nan, u)

        def stiffness(self, u):
            return np.ones_like(u)

    m = three_nodes()
    with raises(r"spring 'soil'\[1\] at node 2 ux: force at zero displacement must be finite"):
        m.add_springs([1, 2], "ux", Broken(), name="soil")


def test_spring_law_with_wrong_shape_or_methods():
    m = three_nodes()

    class NoTangent:
        def force(self, u):
            return u

    class Scalar:
        def force(self, u):
            return np.zeros(2)

        def stiffness(self, u):
            return np.ones(3)

    with raises("needs a stiffness"):
        m.add_springs([0, 1, 2], "ux", NoTangent())
    with raises(r"law.force returned shape \(2,\), expected \(3,\)"):
        m.add_springs([0, 1, 2], "ux", Scalar())


def test_bad_dof_names():
    m = three_nodes()
    with raises("unknown DOF set 'uq'"):
        m.fix(0, "uq")
    with raises(r"DOF index must be 0..5"):
        m.add_springs([0], 6, fem.LinearLaw(1.0))
    with raises(r"one DOF for all springs or one per node \(3 nodes, 2 DOFs\)"):
        m.add_springs([0, 1, 2], ["ux", "uy"], fem.LinearLaw(1.0))


def test_duplicate_group_and_unknown_group():
    m = three_nodes()
    m.add_cables([0], [1], 1e6, 1.0, name="guy")
    with raises("an element group named 'guy' already exists"):
        m.add_cables([1], [2], 1e6, 1.0, name="guy")
    with raises("no element group named 'post'"):
        m.group("post")


def test_load_or_prescribed_value_on_unconnected_dof():
    m = three_nodes()
    m.add_cables([0], [1], 1e6, 1.0)
    m.fix(0, "xyz")
    m.add_load(1, [0, 0, 0, 5.0, 0, 0])   # a moment on a node only a cable meets
    with raises(r"load on node 1 rx, which no element or spring resists"):
        fem.solve(m)
    m.clear_loads()
    m.prescribe(2, "uz", 0.1)              # node 2 is connected to nothing
    with raises(r"prescribed value on node 2 uz"):
        fem.solve(m)


def test_empty_groups_and_wrong_section_type():
    m = three_nodes()
    with raises(r"beam group 'beams': no elements given"):
        m.add_beams([], [], SEC)
    with raises(r"cable group 'cables': no elements given"):
        m.add_cables([], [], 1e6, 1.0)
    with raises(r"spring group 'springs': no nodes given"):
        m.add_springs([], "ux", fem.LinearLaw(1.0))
    with raises(r"section must be a BeamSection, got dict"):
        m.add_beams([0], [1], {"E": 1e9})


def test_solve_arguments():
    m = three_nodes()
    with raises("steps must be at least 1"):
        fem.solve(m, steps=0)


# -- mechanisms ------------------------------------------------------------------------------------

def beam_line(q=np.eye(3), n=4):
    m = fem.Model()
    x = np.c_[np.linspace(0, 2, n + 1), np.zeros(n + 1), np.zeros(n + 1)]
    ids = m.add_nodes(x @ q.T)
    m.add_beams(ids[:-1], ids[1:], SEC, orientation=q @ np.array([0.0, 1.0, 0.0]), name="rail")
    return m, ids


ROTATED = Rotation.from_euler("zyx", [37.0, -23.0, 61.0], degrees=True).as_matrix()


@pytest.mark.parametrize("q", [np.eye(3), ROTATED], ids=["aligned", "rotated"])
@pytest.mark.parametrize("case", ["unsupported", "pinned", "torsion"])
def test_mechanism_names_a_dof(case, q):
    # unsupported: rigid-body motion; pinned: free to swing about the pin; torsion: both
    # ends pinned, free to spin about its own axis.
    m, ids = beam_line(q)
    if case == "pinned":
        m.fix(ids[0], "xyz")
    elif case == "torsion":
        m.fix([ids[0], ids[-1]], "xyz")
    m.add_load(ids[2], np.r_[q @ [0.0, 0.0, -100.0], 0, 0, 0])
    with raises(r"the model is a mechanism: nothing restrains node \d+ (ux|uy|uz|rx|ry|rz)") as info:
        fem.solve(m)
    assert "beam 'rail'" in str(info.value)


def test_node_without_any_stiffness_is_a_mechanism():
    # a spring on ux only: uy is loaded but nothing resists it
    m = fem.Model()
    n = m.add_node([0, 0, 0])
    m.add_springs([n], "ux", fem.LinearLaw(1e3), name="stop")
    m.add_springs([n], "uy", fem.LinearLaw(0.0), name="nothing")
    m.add_load(n, [0.0, 10.0, 0])
    with raises(r"mechanism: nothing restrains node 0 uy \(no stiffness at all\).*spring 'stop'\[0\]"):
        fem.solve(m)


def test_stiffness_lost_during_iterations_is_a_convergence_failure():
    # a one-sided spring resisting +ux only, pulled -ux: it bears at the start (closed
    # gap), opens after the first iteration and then nothing resists
    m = fem.Model()
    n = m.add_node([0, 0, 0])
    m.add_springs([n], "ux", fem.LinearLaw(1e3), one_sided=+1, name="stop")
    m.add_load(n, [-10.0, 0, 0])
    with pytest.raises(fem.ConvergenceError, match=r"tangent stiffness vanished at node 0 ux"):
        fem.solve(m, options=fem.SolverOptions(min_increment=0.1))


def test_bad_input_never_leaks_a_bare_numpy_error():
    # a few odd inputs, each must come back as ModelError (a ValueError subclass)
    m = three_nodes()
    for call in (lambda: m.add_nodes([[1.0, 2.0]]),
                 lambda: m.add_nodes("abc"),
                 lambda: m.add_load(0, [1.0, 2.0]),
                 lambda: m.add_load(0, ["a", 0, 0]),
                 lambda: m.add_cables([0, 1], [1], 1e6, 1.0),
                 lambda: m.add_cables([0], [1], [1e6, 2e6, 3e6], 1.0),
                 lambda: m.add_beams([0], [1], SEC, orientation=(1.0, 2.0)),
                 lambda: m.add_links([0], [1], [1.0, 2.0])):
        with pytest.raises(fem.ModelError):
            call()
