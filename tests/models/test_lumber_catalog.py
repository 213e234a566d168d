"""Catalog look-ups and their input errors."""
import pytest

from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.lumber import (PSI, custom_size, design_values, green_wood, known_species,
                           parse_size, pole_values)


def test_every_value_has_a_source():
    for sp in known_species():
        for g in ("No. 1", "No. 2"):
            for size in ("2x6", "6x6"):
                v = design_values(sp, g, size) if not (sp == "spruce-pine-fir" and size == "6x6") else None
                if v is not None:
                    assert v.source and v.density_source
                    assert v.E > v.Emin > 0 and v.rho_mean > 300
    assert "from memory" in pole_values("SP").source
    assert "from memory" in green_wood("white oak").source


def test_aliases_and_timbers():
    a = design_values("DF-L", "#1", "6x6")
    assert a.size_class == "timbers" and a.species == "douglas fir-larch" and a.grade == "No. 1"
    # NDS Supplement Table 4D DF-L No. 1 posts and timbers Fb = 1200 psi (from memory)
    assert a.Fb / PSI == pytest.approx(1200)
    # southern pine values per width: narrower lumber gets the narrow-width row
    assert design_values("SP", "No. 2", "2x4").Fb > design_values("SP", "No. 2", "2x12").Fb
    assert design_values("sp", "no2", custom_size(0.038, 0.286)).size_class == "dimension"


def test_unknown_species_and_grade_list_known_ones():
    with pytest.raises(InputError) as e:
        design_values("balsa", "No. 2", where="anchor[3].post.species")
    assert "southern pine" in str(e.value) and "hem-fir" in str(e.value)
    assert "anchor[3].post.species" in str(e.value)
    with pytest.raises(InputError) as e:
        design_values("hem-fir", "Select Structural")
    assert "No. 1" in str(e.value) and "No. 2" in str(e.value)
    with pytest.raises(InputError, match="douglas fir-larch"):
        design_values("spf", "No. 2", "6x6")   # no SPF timbers in the catalog
    with pytest.raises(InputError, match="white oak"):
        green_wood("baobab")


def test_overrides_are_marked():
    v = design_values("hem-fir", "No. 2", "2x8").with_overrides(E=9.0e9)
    assert v.E == 9.0e9 and "user-given: E" in v.source
    with pytest.raises(InputError):
        v.with_overrides(Fq=1.0)
    with pytest.raises(InputError):
        custom_size(0.0, 0.1)
    assert parse_size("8x2").name == "2x8"
