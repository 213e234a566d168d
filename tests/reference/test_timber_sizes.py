"""Dressed lumber sizes against the American Softwood Lumber Standard PS 20."""
import pytest

from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.lumber import INCH, parse_size

# PS 20 dry dressed dimension lumber and green dressed timbers (inches),
# as listed in shared/references.md.
PS20 = {
    "2x4": (1.5, 3.5), "2x6": (1.5, 5.5), "2x8": (1.5, 7.25), "2x10": (1.5, 9.25),
    "2x12": (1.5, 11.25), "4x4": (3.5, 3.5), "4x6": (3.5, 5.5), "6x6": (5.5, 5.5),
    "8x8": (7.5, 7.5),
}


@pytest.mark.parametrize("name,dressed", PS20.items())
def test_dressed_sizes_match_ps20(name, dressed):
    s = parse_size(name)
    assert s.thickness == pytest.approx(dressed[0] * INCH, rel=1e-12)  # PS 20
    assert s.width == pytest.approx(dressed[1] * INCH, rel=1e-12)      # PS 20


def test_section_properties_of_2x8():
    # 2x8 dressed 1.5 x 7.25 in (PS 20): A = 10.875 in^2, I = b h^3/12 = 47.635 in^4
    s = parse_size("2 x 8")
    assert s.area == pytest.approx(10.875 * INCH**2, rel=1e-9)
    assert s.I_strong == pytest.approx(1.5 * 7.25**3 / 12 * INCH**4, rel=1e-9)
    assert s.I_weak == pytest.approx(7.25 * 1.5**3 / 12 * INCH**4, rel=1e-9)


@pytest.mark.parametrize("bad", ["2x13", "2x7", "banana", "2x", "0x4"])
def test_bad_size_lists_known_sizes(bad):
    with pytest.raises(InputError) as e:
        parse_size(bad, where="anchor[0].post.ply")
    msg = str(e.value)
    assert repr(bad) in msg and "2x8" in msg and "6x6" in msg
    assert msg.startswith("anchor[0].post.ply")
