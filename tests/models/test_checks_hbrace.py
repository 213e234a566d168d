"""An H-brace's second post gets its own post, soil and code checks."""
from pathlib import Path

import numpy as np

from spanstay.models.checks.structural import structural_checks
from spanstay.models.analysis.installed import install
from spanstay.models.scenario.read import load_scenario
from spanstay.models.analysis.stations import run_pass

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "h-brace.toml"


def test_second_post_of_the_h_brace_is_checked():
    sc = load_scenario(EXAMPLE)
    system, state, lengths = install(sc)
    line = system.lines[sc.rider.line]
    s = np.array([0.45, 0.55]) * line.L0
    design = run_pass(system, state, line, s, sc.rider.heaviest * sc.rider.dynamic_factor, "design",
                      sc.settings.install_temperature, keep_states=True)
    ids = [c.id for c in structural_checks(system, design)]
    second = [i for i in ids if ".brace-post." in i]
    assert any(i.endswith(".post.stress") for i in second), second
    assert any("footing" in i or "soil" in i for i in second), second
