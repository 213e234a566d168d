"""Bad guy input is a clear InputError naming the anchor, raised when the anchor is built."""
from dataclasses import replace

import numpy as np
import pytest

from spanstay.fem import Model
from spanstay.models.parts.anchor import add_anchor
from spanstay.models.common.errors import InputError
from tests.reference.test_brace_statics import GROUND, anchor
from tests.reference.test_guy_statics import guy_spec

PULL = np.array([1.0, 0.0, 0.0])


def build(guy, height=3.0):
    spec = replace(anchor(height, None), name="north-pole", guys=(guy,))
    return add_anchor(Model(), spec, GROUND, [height], PULL)


def test_guy_anchored_at_the_posts_own_base():
    with pytest.raises(InputError) as err:
        build(guy_spec((0.03, 0.0, 0.0), 2.5))
    assert "north-pole" in str(err.value) and "own base" in str(err.value)
    assert err.value.where.startswith("anchor 'north-pole'.guy[1]")


def test_guy_attached_above_the_post_top():
    with pytest.raises(InputError) as err:
        build(guy_spec((-2.0, 0.0, 0.0), 3.5), height=3.0)
    assert "north-pole" in str(err.value) and "above" in str(err.value)


def test_good_guy_builds_with_its_groups_recorded():
    built = build(guy_spec((-2.0, 0.0, 0.0), 2.5, stiffness=2e6, capacity=20e3))
    assert built.groups["guy"] == ["north-pole.guy1", "north-pole.guy1.ground"]
    assert built.groups["guy_eye"] == ["north-pole.guy1.eye"]
    assert len(built.guys) == 1 and built.guy_ground_nodes == [built.guys[0].ground_node]
