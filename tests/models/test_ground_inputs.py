"""Scenario keys of the ground checks: pier concrete and bars, block sliding, soil loading,
ground factors of safety; bad values name their key."""
import tomllib
from pathlib import Path

import pytest

import spanstay
from spanstay.models.common.errors import InputError

ROOT = Path(__file__).resolve().parents[2]


def _ridge() -> dict:
    return tomllib.loads((ROOT / "examples" / "ridge-guyed-line.toml").read_text("utf-8"))


def _pier(data):
    return next(a for a in data["anchor"] if a["footing"]["kind"] == "pier")


def test_pier_reinforcement_is_read_in_si():
    data = _ridge()
    _pier(data)["footing"]["reinforcement"] = {"bars": 8, "bar": "#6", "cover": "3 in"}
    _pier(data)["footing"]["concrete_strength"] = "4000 psi"
    sc = spanstay.load(data)
    fs = next(a.footing for a in sc.anchors if a.footing and a.footing.kind == "pier")
    # ASTM A615 #6: 0.75 in, 0.44 in^2 (from memory); 4000 psi = 27.58 MPa
    assert fs.reinforcement.bars == 8
    assert fs.reinforcement.bar_diameter == pytest.approx(0.75 * 0.0254)
    assert fs.reinforcement.bar_area == pytest.approx(0.44 * 0.0254**2)
    assert fs.concrete_strength == pytest.approx(4000 * 6894.757, rel=1e-6)


@pytest.mark.parametrize("change,where", [
    (lambda f: f.update(reinforcement={"bars": 8, "bar": "#15"}), "reinforcement.bar"),
    (lambda f: f.update(reinforcement={"bars": 2, "bar": "#5"}), "reinforcement.bars"),
    (lambda f: f.update(concrete_strength="1000 psi"), "concrete_strength"),
])
def test_bad_pier_values_name_their_key(change, where):
    data = _ridge()
    change(_pier(data)["footing"])
    with pytest.raises(InputError) as err:
        spanstay.load(data)
    assert where in err.value.where


def test_soil_loading_and_safety_settings():
    data = _ridge()
    data["ground"]["soil"][0]["loading"] = "static"
    data["settings"]["soil_factor_of_safety"] = 3
    sc = spanstay.load(data)
    assert sc.ground.soil[0].loading == "static"
    assert sc.settings.soil_factor_of_safety == 3.0
    data["ground"]["soil"][0]["loading"] = "repeated"
    with pytest.raises(InputError) as err:
        spanstay.load(data)
    assert "loading" in err.value.where
    data = _ridge()
    data["settings"]["uplift_factor_of_safety"] = 0.5
    with pytest.raises(InputError) as err:
        spanstay.load(data)
    assert "uplift_factor_of_safety" in err.value.where
