"""Passes run side by side in worker processes give the serial run's answers exactly
(each case is a value run on its own copy of the structure), and the progress callback
sees every station of every pass."""
from __future__ import annotations

from collections import Counter
from pathlib import Path

import numpy as np

import spanstay

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "guyed-post.toml"


def test_parallel_passes_equal_the_serial_run_bit_for_bit():
    scenario = spanstay.load(EXAMPLE)
    serial = spanstay.analyse(scenario, stations=3, slack_budget=False, workers=1)
    seen: Counter = Counter()
    side = spanstay.analyse(scenario, stations=3, slack_budget=False, workers=2,
                            progress=lambda name, n: seen.update({name: n}))
    assert list(side.passes) == list(serial.passes)
    one = {c.name for c in serial.cases if c.at_end}  # the stop and the arrest: one station
    for name, p in serial.passes.items():
        q = side.passes[name]
        assert len(q.stations) == len(p.stations) == (1 if name in one else 3)
        for a, b in zip(p.stations, q.stations):
            assert (a.tension_max, a.sag) == (b.tension_max, b.sag)
            np.testing.assert_array_equal(a.rider, b.rider)
        for sa, sb in zip(p.states, q.states):
            np.testing.assert_array_equal(sa.translation, sb.translation)
    assert [c.to_dict() for c in side.checks] == [c.to_dict() for c in serial.checks]
    assert dict(seen) == {name: 1 if name in one else 3 for name in serial.passes}
