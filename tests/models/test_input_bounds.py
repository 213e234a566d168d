"""Bad input reaches `spanstay validate` as one message naming its key, exit 2.

Each case edits an example scenario (examples/orchard-family-line.toml, an
invented setting) and runs the command the user runs. The expected key paths
and refusals follow the scenario contract (models/scenario/spec.py) and the
limits in models/scenario/limits.py; the physical reasons are stated per case.
"""
from __future__ import annotations

import re

from pathlib import Path

import pytest
from click.testing import CliRunner

from spanstay.models.cli import main
from spanstay.models.common.units import parse_quantity

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "orchard-family-line.toml"
BASE = EXAMPLE.read_text(encoding="utf-8")


def _validate(tmp_path: Path, text: str, encoding: str = "utf-8"):
    path = tmp_path / "scenario.toml"
    path.write_text(text, encoding=encoding)
    return CliRunner().invoke(main, ["validate", str(path)])


def _edit(old: str, new: str, count: int = 1) -> str:
    assert old in BASE, old
    return BASE.replace(old, new, count)


#: the example's own installed sag line (read, not assumed)
SAG_LINE = re.search(r'^sag = "[^"]+"', BASE, re.M).group(0)


def _refused(result, key: str) -> str:
    assert result.exit_code == 2, result.output
    assert not isinstance(result.exception, Exception) or isinstance(result.exception, SystemExit)
    assert key in result.output, result.output
    assert "Traceback" not in result.output
    return result.output


@pytest.mark.parametrize("value", ['"nan"', '"inf"', '"-inf"', '"1e400"', "nan", "inf"])
@pytest.mark.parametrize("old, key", [
    ("factor_of_safety = 5", "settings.factor_of_safety"),
    ("dynamic_factor = 1.5", "settings.dynamic_factor"),
    ("rolling_resistance = 0.03", "rider.rolling_resistance"),
    ("termination_efficiency = 0.8", 'line[1] "family".termination_efficiency'),
])
def test_plain_numbers_must_be_finite(tmp_path, old, key, value):
    # IEEE 754 nan/inf (and 1e400, which overflows a double) are no design values
    name = old.split(" = ")[0]
    out = _refused(_validate(tmp_path, _edit(old, f"{name} = {value}")), key)
    assert "finite" in out


@pytest.mark.parametrize("value", ["nan ft", "inf ft", "1e400 ft", "-inf ft"])
def test_quantities_must_be_finite(tmp_path, value):
    out = _refused(_validate(tmp_path, _edit(SAG_LINE, f'sag = "{value}"')),
                   'line[1] "family".sag')
    assert "finite" in out


def test_huge_post_height_names_the_range(tmp_path):
    # a post 1e30 ft tall once ended in a traceback from meshing it (4 elements per metre)
    out = _refused(_validate(tmp_path, _edit('height = "15 ft"', 'height = "1e30 ft"')),
                   'anchor[1] "orchard-pole".post.height')
    assert "at most 40 m" in out


LAMINATED = Path(__file__).resolve().parents[2] / "models" / "scenario" / "layouts"


def _laminated_text() -> str:
    for path in sorted(LAMINATED.glob("*.toml")) + sorted(EXAMPLE.parent.glob("*.toml")):
        text = path.read_text(encoding="utf-8")
        if 'kind = "laminated"' in text and "spacing = " in text:
            return text
    pytest.skip("no laminated post among the examples")


def test_tiny_fastener_spacing_is_refused(tmp_path):
    # 1e-6 in between nails would mean millions of fastener levels (memory exhausted)
    import re

    text = re.sub(r'spacing = "[^"]*"', 'spacing = "1e-6 in"', _laminated_text(), count=1)
    out = _refused(_validate(tmp_path, text), "fastener.spacing")
    assert "at least" in out


def test_fastener_levels_are_bounded(tmp_path):
    # 1/4 in spacing passes the smallest spacing but, staggered or not, a tall post
    # would need more levels than spanstay models
    import re

    text = re.sub(r'spacing = "[^"]*"', 'spacing = "0.3 in"', _laminated_text(), count=1)
    out = _refused(_validate(tmp_path, text), "fastener.spacing")
    assert "fastener levels" in out


def test_byte_order_mark_is_accepted(tmp_path):
    # RFC 3629 section 6: a UTF-8 BOM may start a UTF-8 text; Windows editors write one
    result = _validate(tmp_path, BASE, encoding="utf-8-sig")
    assert (tmp_path / "scenario.toml").read_bytes()[:3] == b"\xef\xbb\xbf"
    assert result.exit_code == 0, result.output
    assert "valid" in result.output


def test_numbers_side_by_side_are_refused(tmp_path):
    # pint reads "3 3 ft" as 3 x 3 ft = 9 ft; nobody means that
    out = _refused(_validate(tmp_path, _edit('height = "15 ft"', 'height = "3 3 ft"')),
                   'anchor[1] "orchard-pole".post.height')
    assert "more than one number" in out


def test_mixed_fractions_still_read():
    # 1 in = 0.0254 m exactly (NIST SP 811)
    assert parse_quantity("3-1/2 in", "length") == pytest.approx(3.5 * 0.0254, rel=1e-12)
    assert parse_quantity("3 1/2 in", "length") == pytest.approx(3.5 * 0.0254, rel=1e-12)
    assert parse_quantity("2.8 lbf / (100 ft)", "weight per length") == pytest.approx(
        0.028 * 4.4482216152605 / 0.3048, rel=1e-12)


def test_guy_ground_above_its_attachment_is_refused(tmp_path):
    # a guy pulls down toward its ground anchor; one 100 ft above grade would lift the post
    text = (EXAMPLE.parent / "guyed-post.toml").read_text(encoding="utf-8")
    import re

    text, n = re.subn(r"(\[\[anchor\.guy\]\]\n)", r'\1ground_elevation = "100 ft"\n', text,
                      count=1)
    assert n == 1
    out = _refused(_validate(tmp_path, text), ".guy[1].ground_elevation")
    assert "not below" in out


def test_cable_into_the_ground_is_refused(tmp_path):
    # 15 ft of sag on a 70 ft span with 10-13 ft attachments: by the parabola
    # (Irvine 1981, sag = w L^2 / 8H) the low point sits near mid-span, well below grade
    out = _refused(_validate(tmp_path, _edit(SAG_LINE, 'sag = "15 ft"')),
                   'line[1] "family".sag')
    assert "into the ground" in out


def test_cable_just_above_the_ground_is_accepted(tmp_path):
    # 6 ft of sag: the cable's lowest point stays above the ground profile
    result = _validate(tmp_path, _edit(SAG_LINE, 'sag = "6 ft"'))
    assert result.exit_code == 0, result.output


def test_tension_too_low_names_the_key(tmp_path):
    # 1 lbf cannot hold up 70 ft of 3/8 in rope (its weight alone is tens of lbf)
    out = _refused(_validate(tmp_path, _edit(SAG_LINE, 'tension = "1 lbf"')),
                   'line[1] "family".tension')
    assert "f(a)" not in out and "different signs" not in out


@pytest.mark.parametrize("old, new, key", [
    ('stop_offset = "5 ft"', 'stop_offset = "68 ft"', "rider.stop_offset"),
    ('start_offset = "3 ft"', 'start_offset = "80 ft"', "rider.start_offset"),
])
def test_offsets_must_leave_a_ride(tmp_path, old, new, key):
    out = _refused(_validate(tmp_path, _edit(old, new)), key)
    assert "no ride" in out
