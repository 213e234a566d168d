"""Bad footing input is an InputError naming the footing and the value."""
import pytest

from spanstay.fem import BeamSection
from spanstay.models.common.errors import InputError
from spanstay.models.parts.footing import Footing, concrete_pier_section, ibc_check
from spanstay.models.parts.footing_case import FootingCase, build_case_model
from spanstay.models.catalogs.soil import SoilLayer, SoilProfile, preset_layer

POST = BeamSection.rectangle(11e9, 11e9 / 16, 0.14, 0.14)
SAND = SoilProfile((preset_layer("medium_dense_sand", 0, 1.5),))


@pytest.mark.parametrize("kw, key, text", [
    (dict(depth=2.0), "depth", "deeper than the described soil"),
    (dict(kind="pier", width=0.1, post_width=0.14, section=concrete_pier_section(0.1)), "width",
     "narrower than its post"),
    (dict(width=0.0), "width", "0.0"),
    (dict(depth=-1.0), "depth", "-1.0"),
    (dict(kind="raft"), "kind", "raft"),
    (dict(shape="oval"), "shape", "oval"),
    (dict(py_model="springy"), "py_model", "springy"),
])
def test_bad_footing(kw, key, text):
    values = dict(depth=1.2, width=0.14, section=POST, where="anchor[2].footing")
    values.update(kw)
    with pytest.raises(InputError) as err:
        build_case_model(FootingCase(Footing(**values), SAND, 1000.0, 1.0))
    assert err.value.where == f"anchor[2].footing.{key}"
    assert text in str(err.value)


def test_pier_needs_post_section_above_grade():
    pier = Footing(1.2, 0.4, concrete_pier_section(0.4), kind="pier", where="anchor[0].footing")
    with pytest.raises(InputError, match="section of the post"):
        build_case_model(FootingCase(pier, SAND, 1000.0, 1.0))


def test_ibc_check_needs_a_class_for_every_layer_crossed():
    prof = SoilProfile((preset_layer("loose_sand", 0, 0.5),
                        SoilLayer(0.5, 2.0, "modulus", 18e3, modulus_constant=5e6)))
    with pytest.raises(InputError) as err:
        ibc_check(Footing(1.2, 0.3, POST), prof, 1000.0, 1.0)
    assert err.value.where == "soil.layer[1].ibc_class"
