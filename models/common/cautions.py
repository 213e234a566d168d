"""The cautions every summary and report shows. People ride these systems."""
from __future__ import annotations

CAUTIONS: tuple[str, ...] = (
    "Results are for preliminary design only.",
    "People ride this: a qualified (licensed) engineer must review the design before use.",
    "Follow local codes and the applicable standards for aerial adventure courses.",
    "Use the rope and hardware makers' ratings; catalog values marked 'from memory' must be "
    "checked against published tables.",
    "Inspect the installation and proof-load it before anyone rides, and keep inspecting it.",
)

#: Shown with every tree anchor's results.
TREE_CAUTIONS = (
    "A living tree is not a rated anchor: have a qualified arborist assess its species, "
    "health, decay, root plate and the load it will take before use, and re-assess it "
    "regularly.",
    "Hardware must not girdle the tree: no wire or rope wrapped tight around the trunk; use "
    "through-bolts or wide tree-protecting slings as an arborist directs, and allow for growth.",
    "Root-plate stiffness and capacity are user values, not computed: the results are only as "
    "good as those values.",
)

#: the cautions as one paragraph
CAUTION_TEXT = " ".join(CAUTIONS)


def cautions_for(scenario) -> tuple[str, ...]:
    """The general cautions, plus the tree cautions when an anchor is a living tree."""
    if any(a.kind == "tree" for a in scenario.anchors):
        return CAUTIONS + tuple(TREE_CAUTIONS)
    return CAUTIONS
