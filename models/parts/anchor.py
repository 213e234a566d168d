"""One anchor of a scenario as finite-element parts: a post on its footing, or a
tree, with its guys and brace.

``add_anchor`` returns a handle with the node ids the line attaches to and the
groups that belong to each part (used by checks and by the slack budget, which
re-solves with a part made rigid).
"""
from __future__ import annotations

import numpy as np

from spanstay.fem import Model
from spanstay.models.parts.braces import add_brace
from spanstay.models.parts.guys import add_guys
from spanstay.models.parts.post import BuiltAnchor, add_post
from spanstay.models.parts.tree import add_tree
from spanstay.models.scenario.spec import AnchorSpec, GroundSpec


def add_anchor(model: Model, spec: AnchorSpec, ground: GroundSpec, attach_heights: list[float],
               pull: np.ndarray, rigid: frozenset[str] = frozenset(),
               slip: str = "service") -> BuiltAnchor:
    """Add an anchor (post and footing or tree, then guys and brace) to ``model``.

    Parameters are those of :func:`spanstay.models.parts.post.add_post`; a tree
    takes ``attach_heights`` and ``rigid`` the same way.
    """
    if spec.kind == "tree":
        base = np.array([spec.x, spec.y, spec.grade])
        heights = sorted(set(list(attach_heights) + [g.attach_height for g in spec.guys]))
        built = add_tree(model, spec, base, heights, pull, rigid)
    else:
        built = add_post(model, spec, ground, attach_heights, pull, rigid, slip)
    add_guys(model, built, spec, rigid)
    if spec.brace is not None:
        add_brace(model, built, spec, ground, pull, rigid)
    return built
