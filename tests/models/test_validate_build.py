"""`spanstay validate` also builds the structure, so assembly errors show before a run."""
from pathlib import Path

from click.testing import CliRunner

from spanstay.models.cli import main

LAYOUTS = Path(__file__).resolve().parents[2] / "models" / "scenario" / "layouts"


def test_kicker_foot_inside_the_post_is_reported_by_validate(tmp_path):
    text = (LAYOUTS / "braced.toml").read_text()
    start = text.index("foot_distance")
    line_end = text.index("\n", start)
    bad = tmp_path / "bad.toml"
    bad.write_text(text[:start] + 'foot_distance = "1 in"' + text[line_end:])
    result = CliRunner().invoke(main, ["validate", str(bad)])
    assert result.exit_code == 2
    assert "Traceback" not in result.output
    assert "anchor" in result.output and "ground" in result.output.lower()


def test_every_starter_layout_validates_with_its_structure_built():
    for path in sorted(LAYOUTS.glob("*.toml")):
        result = CliRunner().invoke(main, ["validate", str(path)])
        assert result.exit_code == 0, (path.name, result.output)
