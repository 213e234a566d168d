"""Bad brace input is a clear InputError naming the anchor, raised at build time."""
from dataclasses import replace

import numpy as np
import pytest

from spanstay.fem import Model
from spanstay.models.parts.anchor import add_anchor
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.spec import BraceSpec
from tests.reference.test_brace_statics import FOUR, GROUND, anchor, h_brace

PULL = np.array([1.0, 0.0, 0.0])


def build(brace, height=3.0):
    spec = replace(anchor(height, brace), name="gate")
    return add_anchor(Model(), spec, GROUND, [height], PULL)


def kicker(**kw):
    base = dict(kind="kicker", direction_deg=None, attach_height=2.0, foot_distance=1.5,
                member=FOUR, species="southern pine", grade="No. 2")
    base.update(kw)
    return BraceSpec(**base)


def test_strut_that_does_not_reach_the_ground_clear_of_the_post():
    with pytest.raises(InputError) as err:
        build(kicker(foot_distance=0.05))
    assert "gate" in str(err.value) and "does not reach the ground" in str(err.value)
    assert err.value.where == "anchor 'gate'.brace.foot_distance"


def test_kicker_above_the_post_top():
    with pytest.raises(InputError) as err:
        build(kicker(attach_height=3.4))
    assert "gate" in str(err.value) and "above the top" in str(err.value)


def test_h_brace_posts_that_overlap():
    with pytest.raises(InputError) as err:
        build(replace(h_brace(1.5, 2.4), distance=0.15), height=1.8)
    assert "gate" in str(err.value) and "overlaps" in str(err.value)
