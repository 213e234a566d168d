"""``[settings]`` factors of safety of the ground and anchor checks (defaults in spec.py,
each sourced or marked as our judgement there)."""
from __future__ import annotations

from spanstay.models.scenario.reader import Table
from spanstay.models.scenario.spec import (DEFAULT_CONCRETE_LOAD_FACTOR,
                                           DEFAULT_SLIDING_FACTOR_OF_SAFETY,
                                           DEFAULT_SOIL_FACTOR_OF_SAFETY,
                                           DEFAULT_TREE_FACTOR_OF_SAFETY,
                                           DEFAULT_UPLIFT_FACTOR_OF_SAFETY)

#: key -> default
GROUND_SAFETY = {
    "soil_factor_of_safety": DEFAULT_SOIL_FACTOR_OF_SAFETY,
    "uplift_factor_of_safety": DEFAULT_UPLIFT_FACTOR_OF_SAFETY,
    "sliding_factor_of_safety": DEFAULT_SLIDING_FACTOR_OF_SAFETY,
    "tree_factor_of_safety": DEFAULT_TREE_FACTOR_OF_SAFETY,
    "concrete_load_factor": DEFAULT_CONCRETE_LOAD_FACTOR,
}
GROUND_SAFETY_KEYS = tuple(GROUND_SAFETY)


def ground_safety(table: Table) -> dict[str, float]:
    """The factors of ``[settings]``, each a number from 1 to 10."""
    return {key: table.number(key, default, minimum=1.0, maximum=10.0)
            for key, default in GROUND_SAFETY.items()}
