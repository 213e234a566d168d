"""One footing on its own: a post stub above grade on the footing, loaded laterally at a
height (for pushover, capacity and reference checks)."""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from spanstay.fem import BeamSection, Model
from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.soil import SoilProfile
from spanstay.models.parts.footing import Footing, PlacedFooting, add_footing


@dataclass(frozen=True)
class FootingCase:
    """A footing with its post above grade, loaded laterally in +x at a height.

    Parameters
    ----------
    footing, profile
        The footing and its soil.
    load
        Service lateral load H, N.
    load_height
        Height e of the load above grade, m (0 = at grade).
    post_section
        Section of the post above grade; defaults to the embedded section for
        a direct-embedded post; required for a pier with e > 0.
    post_elements
        Beam elements above grade.
    one_sided
        Passed to ``add_footing`` (front-face soil only, for hand-method checks).
    """

    footing: Footing
    profile: SoilProfile
    load: float
    load_height: float = 0.0
    post_section: BeamSection | None = None
    post_elements: int = 4
    one_sided: int = 0


def build_case_model(case: FootingCase) -> tuple[Model, PlacedFooting, int]:
    """Model of the case: returns (model, placed footing, load node). The load is not added."""
    if case.load_height < 0:
        raise InputError(f"load height {case.load_height} m must be >= 0",
                         where=f"{case.footing.where}.load_height")
    m = Model()
    grade = m.add_node([0.0, 0.0, 0.0])
    placed = add_footing(m, grade, case.footing, case.profile, one_sided=case.one_sided)
    node = grade
    if case.load_height > 0:
        section = case.post_section
        if section is None:
            if case.footing.kind == "pier":
                raise InputError("a pier needs the section of the post above it",
                                 where=f"{case.footing.where}.post")
            section = case.footing.section
        z = np.linspace(0.0, case.load_height, case.post_elements + 1)[1:]
        above = m.add_nodes(np.column_stack([np.zeros_like(z), np.zeros_like(z), z]))
        chain = np.concatenate([[grade], above])
        m.add_beams(chain[:-1], chain[1:], section, orientation=case.footing.orientation,
                    name="post")
        node = int(above[-1])
    return m, placed, node
