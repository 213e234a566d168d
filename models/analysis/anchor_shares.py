"""How the line's pull on a guyed or braced anchor divides between its guys, its brace and
its footing (the ground reactions under each)."""
from __future__ import annotations

import numpy as np

from spanstay.fem import Model, State
from spanstay.models.parts.braces import BuiltHBrace, BuiltKicker


def _nodes_of(model: Model, names) -> set[int]:
    out: set[int] = set()
    for name in names:
        out |= set(np.unique(model.group(name).conn).tolist())
    return out


def reaction_shares(model: Model, built, state: State) -> dict[str, np.ndarray]:
    """Ground reactions (N) on the anchor's guys, brace and post footing.

    The guy share is the reaction at the guys' ground anchors, the brace share
    that at the kicker block or under the H-brace's second post, the footing
    share the rest (the post's own footing or base).
    """
    every = set()
    for names in built.groups.values():
        every |= _nodes_of(model, names)
    every.add(built.grade_node)
    guys = set()
    for g in built.guys:
        guys |= {g.ground_node} | ({g.support_node} if g.support_node is not None else set())
    brace: set[int] = set()
    b = built.brace
    if isinstance(b, BuiltKicker):
        brace = {b.block_node}
    elif isinstance(b, BuiltHBrace):
        second = b.second
        for names in second.groups.values():
            brace |= _nodes_of(model, names)
        brace.add(second.grade_node)
        every |= brace
    footing = every - guys - brace
    r = state.reactions[:, :3]

    def total(nodes):
        return r[sorted(nodes)].sum(axis=0) if nodes else np.zeros(3)

    return {"guys": total(guys), "brace": total(brace), "footing": total(footing)}


def anchor_shares(result) -> dict[str, dict]:
    """Shares of the pull on each guyed or braced anchor (horizontal ground reactions)
    at the design pass's station of largest cable tension."""
    design = result.passes["design"]
    if not design.states:
        return {}
    k = int(np.argmax([st.tension_max for st in design.stations]))
    out = {}
    for name, anchor in result.system.anchors.items():
        if not anchor.spec.guys and anchor.spec.brace is None:
            continue
        shares = reaction_shares(result.design_system.model, result.design_system.anchors[name],
                                 design.states[k])
        horizontal = {part: float(np.hypot(*v[:2])) for part, v in shares.items()}
        total = sum(horizontal.values()) or 1.0
        out[name] = {"station": k, "along": design.stations[k].along,
                     "horizontal": horizontal,
                     "fraction": {part: v / total for part, v in horizontal.items()}}
    return out
