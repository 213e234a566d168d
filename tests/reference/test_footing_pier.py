"""Concrete pier section and the pier footing.

Sources: ACI 318-19 §19.2.2.1, E_c = 4700 sqrt(f'c) MPa for normalweight concrete
(from memory); solid circle I = pi D^4 / 64 (Roark, Table A.1).
"""
import numpy as np
import pytest

from spanstay.models.parts.footing import concrete_pier_section


def test_pier_section_modulus_and_inertia():
    # f'c = 20.7 MPa (3000 psi): E_c = 4700 x 4.550 = 21,384 MPa; D = 0.4 m:
    # I = pi 0.4^4 / 64 = 1.2566e-3 m^4.
    s = concrete_pier_section(0.4, 20.7e6)
    assert s.E == pytest.approx(21_384e6, rel=1e-3)
    assert s.Iy == pytest.approx(np.pi * 0.4**4 / 64, rel=1e-9)


def test_pushover_in_a_larger_model_along_y_matches_the_case_along_x():
    # Isotropic soil in plan: pushing the pier's post top along y in a model with a second
    # footing elsewhere gives the same curve as the footing on its own along x.
    from spanstay.fem import BeamSection, Model
    from spanstay.models.parts.footing import Footing, add_footing
    from spanstay.models.parts.footing_case import FootingCase
    from spanstay.models.analysis.capacity import pushover, pushover_model
    from spanstay.models.catalogs.soil import SoilProfile, preset_layer

    post = BeamSection.rectangle(11e9, 11e9 / 16, 0.14, 0.14)
    sand = SoilProfile((preset_layer("loose_sand", 0, 2.0),))
    pier = Footing(1.0, 0.3, concrete_pier_section(0.3), kind="pier", post_width=0.14)
    alone = pushover(FootingCase(pier, sand, 1000.0, 1.5, post_section=post, post_elements=1),
                     points=16)
    m = Model()
    base = m.add_nodes([[0, 0, 0], [6, 0, 0]])
    tops = m.add_nodes([[0, 0, 1.5], [6, 0, 1.5]])
    m.add_beams(base, tops, post, orientation=(0, 1, 0), name="posts")
    placed = [add_footing(m, int(base[i]), pier, sand, name=f"a{i}") for i in range(2)]
    push = pushover_model(m, int(tops[0]), placed[0], 0.1 * 2.5, "uy", points=16,
                          service_load=1000.0)
    assert push.ultimate == pytest.approx(alone.ultimate, rel=0.01)
    assert push.limit == alone.limit
    np.testing.assert_allclose(push.load, alone.load, rtol=0.01, atol=1e-3 * alone.ultimate)
