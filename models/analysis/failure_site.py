"""Where a solve failed, in words: the parts around the largest imbalance."""
from __future__ import annotations

import re

#: part names of the anchors' element groups, as a person reads them
PART_WORDS = {"post": "post", "fasteners": "fasteners between the plies",
              "soil": "soil around the footing", "footing_member": "embedded footing",
              "guy": "guys", "brace": "brace", "root": "root plate"}


def gave_way(system, group_labels: tuple[str, ...]) -> str:
    """The parts of ``system`` named by element labels such as "beam 'east.post'[3]"."""
    names = [m.group(1) for lab in group_labels if (m := re.search(r"'([^']+)'", lab))]
    names = names or list(group_labels)
    words: list[str] = []
    for name in names:
        word = None
        for anchor_name, anchor in system.anchors.items():
            for part, groups in anchor.groups.items():
                if name in groups:
                    word = f"the {PART_WORDS.get(part, part)} of anchor '{anchor_name}'"
        for line_name, line in system.lines.items():
            if name == line.group:
                word = f"the cable of line '{line_name}'"
        word = word or f"element group '{name}'"
        if word not in words:
            words.append(word)
    return ", ".join(words) if words else "an unknown place (no imbalance reported)"


def failure_parts(system, exc) -> str:
    """The parts around the largest imbalance of an engine error, in words."""
    sites = getattr(exc, "sites", None) or []
    labels = tuple(dict.fromkeys(g for site in sites[:3] for g in site.elements))
    return gave_way(system, labels)
