"""Bad input to laminated posts: each a clear InputError naming the value and where."""
from types import SimpleNamespace

import pytest

from spanstay.fem import Model
from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.fasteners import bolt, nail
from spanstay.models.parts.laminated import add_laminated_post, design_from_post, laminated_design
from spanstay.models.catalogs.lumber import INCH

W = 'anchor[2] "west post".post'


def _design(**kw):
    args = dict(ply="2x8", plies=3, species="SP", grade="No. 2", fastener=nail("16d"),
                spacing=0.15, height=3.0, rows=2, where=W)
    args.update(kw)
    return laminated_design(**args)


@pytest.mark.parametrize("kw,words", [
    (dict(plies=0), ["at least 2 plies", "0", W + ".plies"]),
    (dict(spacing=4.0), ["spacing 4 m", "longer than the post", W + ".fastener.spacing"]),
    (dict(fastener=nail("60d")), ["too large", "60d", W + ".fastener.diameter"]),
    (dict(fastener=bolt(1.0 * INCH, 6 * INCH)), ["too large", W + ".fastener.diameter"]),
    (dict(species="balsa"), ["'balsa'", "southern pine", "douglas fir-larch", W + ".species"]),
    (dict(grade="No. 7"), ["'No. 7'", "No. 1", "No. 2"]),
    (dict(ply="2x13"), ["'2x13'", "2x12", W + ".ply"]),
    (dict(fastener=nail("6d")), ["6 D", W + ".fastener.length"]),
])
def test_bad_input_names_value_and_place(kw, words):
    with pytest.raises(InputError) as e:
        _design(**kw)
    for w in words:
        assert w in str(e.value)


def test_post_spec_and_attachments():
    post = SimpleNamespace(
        kind="laminated", height=3.0, species="hem-fir", grade="#1",
        ply=SimpleNamespace(nominal="2x6", width=5.5 * INCH, depth=1.5 * INCH), plies=3,
        stack="across", stack_angle_deg=0.0,
        fastener=SimpleNamespace(kind="nail", diameter=0.162 * INCH, length=3.5 * INCH,
                                 spacing=0.2, rows=2, staggered=True, slip_modulus=None),
        overrides=SimpleNamespace(E=None, shear_modulus=None, Emin=None, Fb=None, Ft=None, Fv=None,
                                  Fc=None, Fc_perp=None, density=None))
    d = design_from_post(post, W)
    assert d.n == 3 and d.plies[0].values.grade == "No. 1" and d.staggered
    z, count, _ = d.fastener_levels(3.0)
    assert count.sum() == pytest.approx(2 * 3.0 / 0.2, abs=2)   # 2 rows at 0.2 m over 3 m
    m = Model()
    p = add_laminated_post(m, (5.0, 1.0, 0.0), d, 3.0, heights=[2.5, 0.0])
    assert p.node_at(0.0) == p.base_node
    assert m.coords[p.node_at(2.5)] == pytest.approx([5.0, 1.0, 2.5])
    with pytest.raises(InputError, match="outside the post"):
        add_laminated_post(Model(), (0, 0, 0), d, 3.0, heights=[3.5])
    with pytest.raises(InputError, match="slip"):
        d.slip_modulus("sometimes")
    bad = SimpleNamespace(**{**post.__dict__, "species": None})
    with pytest.raises(InputError, match="species"):
        design_from_post(bad, W)
