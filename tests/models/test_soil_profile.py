"""Soil layers and profiles: validation, lookup, overburden, presets."""
from types import SimpleNamespace

import numpy as np
import pytest

from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.soil import PRESETS, SoilLayer, SoilProfile, preset_layer, profile_from_specs


def sand(top, bottom, **kw):
    values = dict(kind="sand", unit_weight=18e3, friction_angle_deg=32.0, k_initial=20e6)
    values.update(kw)
    return SoilLayer(top=top, bottom=bottom, **values)


def clay(top, bottom, **kw):
    values = dict(kind="clay", unit_weight=17e3, undrained_shear_strength=25e3, eps50=0.01)
    values.update(kw)
    return SoilLayer(top=top, bottom=bottom, **values)


def test_layer_lookup_vectorised():
    p = SoilProfile((sand(0, 1.5), clay(1.5, 4.0)))
    np.testing.assert_array_equal(p.layer_at([0.0, 1.0, 1.5, 2.0, 4.0]), [0, 0, 1, 1, 1])
    assert list(p.kinds_at([0.2, 3.0])) == ["sand", "clay"]
    np.testing.assert_allclose(p.layer_values("friction_angle_deg", [0.2]), [32.0])
    assert np.isnan(p.layer_values("friction_angle_deg", [3.0])[0])


def test_vertical_effective_stress_with_water_table():
    # Hand: 18.5 kN/m^3 sand to 1.5 m, 16.5 kN/m^3 clay to 4 m, water at 2 m, gamma_w 9.81:
    # 1.5 m: 27.75 kPa; 2.0 m: 27.75 + 0.5 x 16.5 = 36.0 kPa;
    # 4.0 m: 36.0 + 2 x (16.5 - 9.81) = 49.38 kPa.
    p = SoilProfile((sand(0, 1.5, unit_weight=18.5e3), clay(1.5, 4.0, unit_weight=16.5e3)),
                    water_table=2.0)
    np.testing.assert_allclose(p.vertical_effective_stress([0, 0.75, 1.5, 2.0, 3.0, 4.0]),
                               [0, 13_875, 27_750, 36_000, 42_690, 49_380], rtol=1e-12)


@pytest.mark.parametrize("layers, water, where_part, value_text", [
    ((sand(0, 1), sand(0.5, 2)), None, "layer[1].top", "overlaps"),
    ((sand(1, 2), sand(0, 1)), None, "layer[0].top", "1"),
    ((sand(0, 1), sand(1.2, 2)), None, "layer[1].top", "gap"),
    ((sand(0, 1, friction_angle_deg=50.0),), None, "friction_angle_deg", "50"),
    ((sand(0, 1, friction_angle_deg=15.0),), None, "friction_angle_deg", "15"),
    ((sand(0, 1, unit_weight=0.0),), None, "unit_weight", "0.0"),
    ((clay(0, 1, undrained_shear_strength=-5.0),), None, "undrained_shear_strength", "-5.0"),
    ((sand(0, 1, k_initial=0.0),), None, "k_initial", "0.0"),
    ((clay(0, 1, eps50=None),), None, "eps50", "eps50"),
    ((sand(0, 1, kind="peat"),), None, "kind", "peat"),
    ((sand(0, 1, ibc_class="mud"),), None, "ibc_class", "mud"),
    ((sand(0, 2, unit_weight=9e3),), 1.0, "unit_weight", "9000"),
    ((sand(0, 1),), -1.0, "water_table", "-1"),
])
def test_bad_input_is_named(layers, water, where_part, value_text):
    with pytest.raises(InputError) as err:
        SoilProfile(layers, water_table=water, where="ground")
    assert where_part in err.value.where and err.value.where.startswith("ground")
    assert value_text in str(err.value)


def test_out_of_order_layers_say_so():
    with pytest.raises(InputError, match="out of order"):
        SoilProfile((sand(0, 1), sand(2, 3), sand(1, 2)))


def test_depth_below_soil_is_an_input_error():
    p = SoilProfile((sand(0, 1.0),))
    with pytest.raises(InputError, match="1.500 m is outside"):
        p.layer_at([0.5, 1.5], where="anchor[0].footing.depth")


def test_modulus_layer_needs_a_modulus():
    with pytest.raises(InputError, match="modulus"):
        SoilProfile((SoilLayer(0, 1, "modulus", 18e3),))
    SoilProfile((SoilLayer(0, 1, "modulus", 18e3, modulus_gradient=5e6),))


def test_from_spec_object_and_mapping():
    spec = SimpleNamespace(top=0.0, bottom=2.0, kind="clay", unit_weight=17e3,
                           undrained_shear_strength=30e3, eps50=0.01, ibc_class="CL")
    layer = SoilLayer.from_spec(spec)
    assert layer.undrained_shear_strength == 30e3 and layer.friction_angle_deg is None
    p = profile_from_specs([spec, dict(top=2.0, bottom=5.0, kind="sand", unit_weight=19e3,
                                       friction_angle_deg=34.0, k_initial=30e6)],
                           water_table=3.0)
    assert p.bottom == 5.0 and p.layers[1].kind == "sand"


def test_presets_are_valid_and_sourced():
    top = 0.0
    layers = []
    for name in PRESETS:
        assert PRESETS[name]["source"] and PRESETS[name]["ibc_class"]
        layers.append(preset_layer(name, top, top + 1.0))
        top += 1.0
    SoilProfile(tuple(layers))
    assert preset_layer("soft_clay", 0, 1, eps50=0.01).eps50 == 0.01
    with pytest.raises(InputError):
        preset_layer("quicksand", 0, 1)
