"""Wire-rope catalog against published strengths and the physics of stranded rope."""
import math
from fractions import Fraction

import pytest

from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.rope import catalog, find_rope, rope_names
from spanstay.models.scenario.rope_entry import read_rope

LBF = 4.4482216152605  # N, exact (NIST SP 811)
INCH = 0.0254  # m, exact


# FAA AC 43.13-1B, Table 7-3: MIL-W-83420 7x19 galvanized, minimum breaking strength, lb
@pytest.mark.parametrize("name, pounds", [
    ("7x19-galv-3/16", 4200), ("7x19-galv-1/4", 7000),
    ("7x19-galv-5/16", 9800), ("7x19-galv-3/8", 14400),
])
def test_7x19_breaking_strength_faa_table(name, pounds):
    rope = find_rope(name)
    assert rope.breaking_strength == pytest.approx(pounds * LBF, rel=1e-9)
    assert "FAA AC 43.13-1B" in rope.source


@pytest.mark.parametrize("name", rope_names())
def test_diameter_matches_name(name):
    fraction = Fraction(name.rsplit("-", 1)[1])
    assert find_rope(name).diameter == pytest.approx(float(fraction) * INCH, rel=1e-12)


@pytest.mark.parametrize("name", rope_names())
def test_catalog_values_are_physically_sensible(name):
    rope = find_rope(name)
    circle = math.pi * rope.diameter**2 / 4
    # Solid steel: E = 29e6 psi = 200 GPa, unit weight 490 lbf/ft^3 = 77.0 kN/m^3
    # (steel handbook values). Stranded rope is "well below" solid steel in
    # axial stiffness (references.md); its metallic area fills roughly half to
    # three quarters of the circle (from memory), so the weight sits there too.
    assert 0.1 < rope.EA / (200e9 * circle) < 0.5
    assert 0.45 < rope.weight_per_length / (490 * 157.08746 * circle) < 0.8
    # Strength of the metallic area below the ultimate of rope wire, about
    # 300 ksi at most (from memory): catches a unit slip in the table.
    metallic = rope.weight_per_length / (490 * 157.08746)
    assert rope.breaking_strength / metallic < 300e3 * 6894.757
    # steel rope alpha 6.5e-6 per degF = 11.7e-6 per K (references.md, from memory)
    assert rope.alpha == pytest.approx(11.7e-6, rel=1e-9)
    assert "from memory" in rope.source


def test_stronger_rope_of_the_same_construction_is_larger():
    for prefix in ("7x7-", "7x19-", "6x19-"):
        ropes = sorted((r for n, r in catalog().items() if n.startswith(prefix)),
                       key=lambda r: r.diameter)
        strengths = [r.breaking_strength for r in ropes]
        assert strengths == sorted(strengths) and len(set(strengths)) == len(strengths)


def test_override_one_field():
    base = find_rope("7x19-galv-1/4")
    rope = read_rope({"catalog": "7x19-galv-1/4", "EA": "300000 lbf"}, "line[1].rope")
    assert rope.EA == pytest.approx(300000 * LBF, rel=1e-12)
    assert rope.breaking_strength == base.breaking_strength
    assert "overridden in scenario: EA" in rope.source


def test_inline_rope():
    rope = read_rope({"diameter": "1/4 in", "breaking_strength": "7000 lbf",
                      "weight_per_length": "0.11 lbf/ft", "EA": "356000 lbf"}, "x")
    assert rope.name == "inline"
    assert rope.weight_per_length == pytest.approx(0.11 * 14.593903, rel=1e-7)
    assert rope.alpha == pytest.approx(11.7e-6, rel=1e-9)


def test_bad_rope_entries():
    with pytest.raises(InputError, match='did you mean "7x19-galv-1/4"') as err:
        read_rope("7x19-galv-1/3", 'line[1] "main".rope')
    assert err.value.where == 'line[1] "main".rope'
    with pytest.raises(InputError, match="missing required key") as err:
        read_rope({"diameter": "1/4 in", "breaking_strength": "7000 lbf",
                   "weight_per_length": "0.11 lbf/ft"}, "line[1].rope")
    assert err.value.where == "line[1].rope.EA"
    with pytest.raises(InputError, match="no units"):
        read_rope({"catalog": "7x19-galv-1/4", "EA": 300000}, "line[1].rope")
    with pytest.raises(InputError, match='did you mean "EA"'):
        read_rope({"catalog": "7x19-galv-1/4", "ea": "3e5 lbf"}, "line[1].rope")
    with pytest.raises(InputError, match="greater than zero"):
        read_rope({"catalog": "7x19-galv-1/4", "breaking_strength": "-1 lbf"}, "r")
    with pytest.raises(InputError, match="catalog rope name"):
        read_rope(42, "r")
