"""Scenario reading: starter layouts, conversions, every bad-input case, the CLI."""
import copy
import tomllib

import pytest
from click.testing import CliRunner

from spanstay.models.cli import main
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.read import load_scenario, read_scenario
from spanstay.models.scenario.starter import LAYOUTS, layout_text

FT = 0.3048  # m, exact (NIST SP 811)
INCH = 0.0254  # m, exact
LBF = 4.4482216152605  # N, exact


def layout(name="two-posts"):
    return tomllib.loads(layout_text(name))


def number(text, unit):
    """The number of a layout's quantity string such as "0.9 ft", read here
    independently of the scenario reader (its unit must be ``unit``)."""
    value, given = text.split()
    assert given == unit, text
    return float(value)


def fails(data, where, *words):
    """Reading ``data`` raises InputError at key path ``where`` naming ``words``."""
    with pytest.raises(InputError) as err:
        read_scenario(data)
    assert err.value.where == where, str(err.value)
    for word in words:
        assert word in str(err.value), str(err.value)
    return err.value


# ------------------------------------------------------------------ good files

@pytest.mark.parametrize("name", LAYOUTS)
def test_every_starter_layout_validates(name):
    scenario = read_scenario(layout(name))
    assert len(scenario.anchors) >= 2 and scenario.lines and scenario.rider


def test_two_posts_values_in_si():
    data = layout("two-posts")
    s = read_scenario(data)
    line = s.lines[0]
    assert line.sag == pytest.approx(number(data["line"][0]["sag"], "ft") * FT, rel=1e-12)
    assert line.tension is None and line.unstressed_length is None
    # FAA AC 43.13-1B Table 7-3: 3/8 in 7x19, 14,400 lb
    assert line.rope.breaking_strength == pytest.approx(14400 * LBF, rel=1e-9)
    launch = s.anchor("launch")
    # PS 20 dressed size of a 2x10: 1-1/2 x 9-1/4 in
    assert launch.post.ply.depth == pytest.approx(1.5 * INCH)
    assert launch.post.ply.width == pytest.approx(9.25 * INCH)
    assert launch.footing.pier_diameter == pytest.approx(18 * INCH)
    # PS 20: an 8x8 timber dresses to 7-1/2 x 7-1/2 in
    landing = s.anchor("landing")
    assert landing.post.section.width == pytest.approx(7.5 * INCH)
    assert landing.grade == pytest.approx(number(data["anchor"][1]["grade"], "ft") * FT)
    # T(K) = (T(degF) + 459.67) / 1.8 (NIST SP 811 B.8)
    degf = number(data["settings"]["install_temperature"], "degF")
    assert s.settings.install_temperature == pytest.approx((degf + 459.67) / 1.8)
    assert s.rider.heaviest == pytest.approx(number(data["rider"]["heaviest"], "lbf") * LBF, rel=1e-12)
    clay = s.ground.soil[1]
    assert clay.preset == "stiff_clay" and clay.kind == "clay"
    assert clay.undrained_shear_strength == pytest.approx(1500 * 47.880259, rel=1e-7)


def test_defaults_when_left_out():
    data = layout()
    del data["settings"], data["line"][0]["termination_efficiency"]
    s = read_scenario(data)
    assert s.settings.factor_of_safety == 5.0  # common practice
    assert s.lines[0].termination_efficiency == 0.8  # from memory, clipped ends
    # no range of use given: installation +/- 25 K, flagged for the output (our judgement)
    t = s.settings.install_temperature
    assert s.settings.use_temperatures == (t - 25.0, t + 25.0)
    assert s.settings.use_temperatures_default


def test_missing_profile_is_straight_between_anchor_grades():
    data = layout()
    del data["ground"]["profile"]
    s = read_scenario(data)
    (x0, z0), (x1, z1) = s.ground.profile
    landing = data["anchor"][1]
    span = number(landing["position"][0], "ft") * FT
    assert (x0, z0, x1, z1) == pytest.approx((0.0, 0.0, span, number(landing["grade"], "ft") * FT))


def test_guy_ground_point_from_direction_and_distance():
    s = read_scenario(layout("guyed"))
    guy = s.anchor("top-pole").guys[0]
    x, y, z = guy.ground_point
    # 5 m at 160 deg from +x
    assert x == pytest.approx(5 * -0.9396926207859084) and y == pytest.approx(5 * 0.3420201433256687)
    assert guy.anchor_stiffness == pytest.approx(2e6) and not guy.anchor_fixed


# ------------------------------------------------------------------ bad files

POST1 = 'anchor[1] "launch".post'
POST2 = 'anchor[2] "landing".post'
LINE1 = 'line[1] "main"'


def test_unknown_key_did_you_mean():
    data = layout()
    data["anchor"][0]["post"]["hieght"] = data["anchor"][0]["post"].pop("height")
    fails(data, POST1 + ".hieght", 'did you mean "height"')
    data = layout()
    data["riders"] = data.pop("rider")
    fails(data, "riders", 'did you mean "rider"')


def test_missing_required_key():
    data = layout()
    del data["anchor"][1]["post"]["height"]
    fails(data, POST2 + ".height", "missing required key", "a length")


def test_wrong_units_and_bare_numbers():
    data = layout()
    data["line"][0]["from_height"] = "11 psi"
    fails(data, LINE1 + ".from_height", "expected a length", "a pressure")
    data = layout()
    data["rider"]["heaviest"] = 250
    fails(data, "rider.heaviest", "no units")


def test_negative_size():
    data = layout()
    data["anchor"][1]["post"]["height"] = "-10 ft"
    fails(data, POST2 + ".height", "greater than zero", "-10 ft")


def test_friction_angle_range():
    data = layout()
    data["ground"]["soil"][0]["friction_angle"] = "50 deg"
    fails(data, "ground.soil[1].friction_angle", "at most 45 deg")
    data["ground"]["soil"][0]["friction_angle"] = "15 deg"
    fails(data, "ground.soil[1].friction_angle", "at least 20 deg")


def test_zero_plies():
    data = layout()
    data["anchor"][0]["post"]["plies"] = 0
    fails(data, POST1 + ".plies", "at least 2")


def test_line_names_a_missing_anchor():
    data = layout()
    data["line"][0]["to"] = "landng"
    fails(data, LINE1 + ".to", 'no anchor named "landng"', 'did you mean "landing"')


def test_two_anchors_at_the_same_point():
    data = layout()
    data["anchor"][1]["position"] = ["0 ft", "0 ft"]
    fails(data, 'anchor[2] "landing".position', "same point", 'anchor[1] "launch"')


def test_unstressed_length_shorter_than_chord():
    data = layout()
    line, landing = data["line"][0], data["anchor"][1]
    # the chord between the attachments, from the layout's own positions and heights
    span = number(landing["position"][0], "ft")
    drop = number(line["from_height"], "ft") - (number(landing["grade"], "ft")
                                               + number(line["to_height"], "ft"))
    chord = (span**2 + drop**2) ** 0.5
    del line["sag"]
    line["unstressed_length"] = f"{span} ft"  # the span: shorter than the chord
    fails(data, LINE1 + ".unstressed_length", "chord")
    line["unstressed_length"] = f"{chord + 1} ft"
    assert read_scenario(data).lines[0].unstressed_length == pytest.approx((chord + 1) * FT)


def test_exactly_one_of_sag_tension_unstressed_length():
    data = layout()
    data["line"][0]["tension"] = "800 lbf"
    fails(data, LINE1 + ".tension", "give only one of")
    del data["line"][0]["tension"], data["line"][0]["sag"]
    fails(data, LINE1, "give one of")


def test_soil_layers_out_of_order_overlapping_or_with_gaps():
    data = layout()
    data["ground"]["soil"].reverse()
    fails(data, "ground.soil[1].top", "must start at grade")
    data = layout()
    data["ground"]["soil"][1]["top"] = "3 ft"
    fails(data, "ground.soil[2].top", "overlaps")
    data["ground"]["soil"][1]["top"] = "5 ft"
    fails(data, "ground.soil[2].top", "gap")
    data = layout()
    data["ground"]["soil"][0]["bottom"] = "0 ft"
    fails(data, "ground.soil[1].bottom", "deeper than the layer top")


def test_soil_layer_needs_its_kind_values():
    data = layout()
    del data["ground"]["soil"][0]["k_initial"]
    fails(data, "ground.soil[1].k_initial", "missing required key")
    data = layout()
    data["ground"]["soil"][0]["eps50"] = 0.01
    fails(data, "ground.soil[1].eps50", "does not apply to a sand layer")
    data = layout()
    data["ground"]["soil"][1]["preset"] = "stif_clay"
    fails(data, "ground.soil[2].preset", 'did you mean "stiff_clay"')
    data = layout()
    data["ground"]["soil"][0]["ibc_class"] = "loam"
    fails(data, "ground.soil[1].ibc_class", "IBC soil class")


def test_footing_deeper_than_described_soil():
    data = layout()
    data["anchor"][0]["footing"]["depth"] = "25 ft"
    fails(data, 'anchor[1] "launch".footing.depth', "deeper than the soil")


def test_embedded_footing_needs_soil():
    data = layout()
    del data["ground"]["soil"]
    fails(data, 'anchor[1] "launch".footing', "needs soil")


def test_pier_narrower_than_post():
    data = layout()
    # 3 plies of 2x8: 4.5 x 7.25 in, diagonal 8.53 in (PS 20 sizes)
    data["anchor"][0]["footing"]["pier_diameter"] = "8 in"
    fails(data, 'anchor[1] "launch".footing.pier_diameter', "narrower than the post")


def test_guy_attached_above_post_top():
    data = layout("guyed")
    data["anchor"][0]["guy"][0]["attach_height"] = "7 m"
    fails(data, 'anchor[1] "top-pole".guy[1].attach_height', "above the top of the post")


def test_guy_anchored_at_the_posts_own_base():
    data = layout("guyed")
    data["anchor"][0]["guy"][1]["distance"] = "0.1 m"
    fails(data, 'anchor[1] "top-pole".guy[2]', "own base")


def test_guy_ground_anchor_must_be_fixed_or_a_spring():
    data = layout("guyed")
    data["anchor"][0]["guy"][0]["ground_anchor"] = "rigid"
    fails(data, 'anchor[1] "top-pole".guy[1].ground_anchor', '"fixed"')


def test_kicker_and_rail_above_post_top():
    data = layout("braced")
    data["anchor"][0]["brace"]["attach_height"] = "10 ft"
    fails(data, 'anchor[1] "launch".brace.attach_height', "above the top of the post")
    data = layout("h-brace")
    data["anchor"][0]["brace"]["second_post"]["height"] = "9 ft"  # rail at 10 ft
    fails(data, 'anchor[1] "launch".brace.rail_height', "shorter post")


def test_line_attached_above_post_top():
    data = layout()
    data["line"][0]["to_height"] = "12 ft"
    fails(data, LINE1 + ".to_height", "above the top of the post")


def test_catalog_names_checked():
    data = layout()
    data["line"][0]["rope"] = "7x19-galv-3/9"
    fails(data, LINE1 + ".rope", "did you mean")
    data = layout()
    data["anchor"][1]["post"]["species"] = "balsa"
    fails(data, POST2 + ".species", "not in the lumber catalog")
    data = layout()
    data["anchor"][1]["post"]["nominal"] = "6x7"
    fails(data, POST2 + ".nominal", "not a standard nominal size")
    data = layout("tree")
    data["anchor"][0]["tree"]["species"] = "baobab"
    fails(data, 'anchor[1] "oak".tree.species', "not in the catalog")


def test_kind_specific_keys():
    data = layout()
    data["anchor"][1]["post"]["diameter"] = "8 in"
    fails(data, POST2 + ".diameter", "does not apply to a sawn post")
    data = layout("tree")
    data["anchor"][0]["post"] = {"kind": "sawn"}
    fails(data, 'anchor[1] "oak".post', "does not apply to a tree anchor")


def test_fastener_too_big_for_ply():
    data = layout()
    data["anchor"][0]["post"]["fastener"]["diameter"] = "0.5 in"
    fails(data, POST1 + ".fastener", "too large")


def test_rider_cross_checks():
    data = layout()
    data["rider"]["heaviest"] = "50 lbf"
    fails(data, "rider.heaviest", "lighter than the lightest")
    data = layout()
    data["rider"]["stop_offset"] = "108 ft"
    fails(data, "rider.stop_offset", "leave no ride")
    data = layout()
    data["rider"]["line"] = "mian"
    fails(data, "rider.line", 'did you mean "main"')


def test_profile_must_cover_the_span():
    data = layout()
    data["ground"]["profile"] = [["0 ft", "0 ft"], ["80 ft", "-4 ft"]]
    fails(data, "ground.profile", "cover the whole span")
    data["ground"]["profile"] = [["0 ft", "0 ft"], ["0 ft", "-4 ft"]]
    fails(data, "ground.profile[2]", "must increase")


def test_duplicate_names_and_self_lines():
    data = layout()
    data["anchor"][1]["name"] = "launch"
    fails(data, 'anchor[2] "launch".name', "also called")
    data = layout()
    data["line"][0]["to"] = "launch"
    fails(data, LINE1 + ".to", "same anchor")


def test_temperatures():
    data = layout()
    data["settings"]["install_temperature"] = "60 delta_degF"
    fails(data, "settings.install_temperature", "temperature difference")
    data = layout()
    data["settings"]["use_temperatures"] = ["20 degF", "400 degF"]
    fails(data, "settings.use_temperatures[2]", "outside the range")


def test_file_problems(tmp_path):
    with pytest.raises(InputError, match="no such scenario file"):
        load_scenario(tmp_path / "missing.toml")
    bad = tmp_path / "bad.toml"
    bad.write_text('[project]\nname = "x\n')
    with pytest.raises(InputError, match="not valid TOML"):
        load_scenario(bad)


def test_every_error_is_an_input_error_on_mangled_values():
    """Replace each leaf value of every layout with junk: always InputError, never a crash."""
    junk = ["", 7, True, [], {}, "banana", "-3 ft"]

    def leaves(node, path=()):
        if isinstance(node, dict):
            for key, value in node.items():
                yield from leaves(value, path + (key,))
        elif isinstance(node, list) and node and isinstance(node[0], dict):
            for i, value in enumerate(node):
                yield from leaves(value, path + (i,))
        else:
            yield path

    for name in ("two-posts", "h-brace"):
        base = layout(name)
        for path in leaves(base):
            for value in junk:
                data = copy.deepcopy(base)
                node = data
                for key in path[:-1]:
                    node = node[key]
                if node[path[-1]] == value:
                    continue
                node[path[-1]] = value
                try:
                    read_scenario(data)
                except InputError as exc:
                    assert exc.where, (path, value, str(exc))


# ------------------------------------------------------------------ CLI

def test_cli_init_and_validate_every_layout(tmp_path):
    runner = CliRunner()
    for name in LAYOUTS:
        target = tmp_path / f"{name}.toml"
        result = runner.invoke(main, ["init", str(target), "--layout", name])
        assert result.exit_code == 0, result.output
        result = runner.invoke(main, ["validate", str(target)])
        assert result.exit_code == 0, result.output
        assert result.output.rstrip().endswith("valid")
        assert "qualified" in result.output  # the cautions


def test_cli_validate_units_switch(tmp_path):
    target = tmp_path / "line.toml"
    target.write_text(layout_text("two-posts"))
    runner = CliRunner()
    span = number(layout("two-posts")["anchor"][1]["position"][0], "ft")
    assert f"span {span:.3g} ft" in runner.invoke(main, ["validate", str(target)]).output
    # 1 ft = 0.3048 m exactly (NIST SP 811)
    assert f"span {span * FT:.3g} m" in runner.invoke(main, ["validate", str(target), "--units", "si"]).output


def test_cli_init_refuses_to_overwrite(tmp_path):
    target = tmp_path / "line.toml"
    target.write_text("keep me")
    runner = CliRunner()
    result = runner.invoke(main, ["init", str(target)])
    assert result.exit_code == 2
    assert "already exists" in result.stderr and "--force" in result.stderr
    assert target.read_text() == "keep me"
    result = runner.invoke(main, ["init", str(target), "--force"])
    assert result.exit_code == 0 and target.read_text() == layout_text("two-posts")
    result = runner.invoke(main, ["init", str(tmp_path / "x.toml"), "--layout", "gyed"])
    assert result.exit_code == 2 and 'did you mean "guyed"' in result.stderr


def test_cli_bad_input_exit_2_without_traceback(tmp_path):
    target = tmp_path / "bad.toml"
    target.write_text(layout_text("two-posts").replace('height = "14 ft"', 'height = 14'))
    result = CliRunner().invoke(main, ["validate", str(target)])
    assert result.exit_code == 2
    assert result.stderr.startswith('spanstay: error: anchor[1] "launch".post.height:')
    assert "no units" in result.stderr
    assert "Traceback" not in result.output and result.exception is not None
    assert isinstance(result.exception, SystemExit)
    result = CliRunner().invoke(main, ["validate", str(tmp_path / "none.toml")])
    assert result.exit_code == 2 and "no such scenario file" in result.stderr


def test_cli_init_help_lists_every_layout():
    result = CliRunner().invoke(main, ["init", "--help"])
    for name in LAYOUTS:
        assert name in result.output
