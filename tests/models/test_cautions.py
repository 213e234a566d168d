"""The cautions shown with every result: the general ones always, the tree ones with a tree."""
from pathlib import Path

from spanstay.models.common.cautions import CAUTIONS, cautions_for
from spanstay.models.scenario.read import load_scenario

ROOT = Path(__file__).resolve().parents[2]


def test_general_cautions_defer_to_engineers_codes_and_makers():
    text = " ".join(CAUTIONS).lower()
    for phrase in ("preliminary design", "licensed) engineer", "local codes",
                   "aerial adventure courses", "makers' ratings", "proof-load"):
        assert phrase in text


def test_tree_anchor_adds_the_arborist_cautions():
    tree = load_scenario(ROOT / "models" / "scenario" / "layouts" / "tree.toml")
    poles = load_scenario(ROOT / "examples" / "orchard-family-line.toml")
    assert cautions_for(poles) == CAUTIONS
    extra = " ".join(cautions_for(tree)[len(CAUTIONS):]).lower()
    assert "arborist" in extra and "girdle" in extra
