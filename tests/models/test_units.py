"""Quantity parsing and display against published conversion factors."""
import math

import pytest

from spanstay.models.common.errors import InputError
from spanstay.models.common.units import format_number, parse_quantity, parse_ratio, show, to_display

# Conversion factors: NIST SP 811 (2008), Appendix B.8/B.9. ft, in, lb, lbf and
# mph are exact by definition; the others are NIST's rounded values, so the
# tolerance is set by the digits NIST prints.
NIST = [
    ("1 ft", "length", 0.3048, 1e-12),
    ("1 in", "length", 0.0254, 1e-12),
    ("1 lbf", "force", 4.4482216152605, 1e-12),
    ("1 kip", "force", 4448.2216152605, 1e-12),
    ("1 psf", "pressure", 47.880259, 1e-8),
    ("1 lbf/ft**2", "pressure", 47.880259, 1e-8),
    ("1 psi", "pressure", 6894.757, 1e-7),
    ("1 ksi", "pressure", 6.894757e6, 1e-7),
    ("1 pcf", "unit weight", 157.08746, 1e-7),
    ("1 lbf/ft**3", "unit weight", 157.08746, 1e-7),
    ("1 plf", "force per length", 14.593903, 1e-8),
    ("1 klf", "force per length", 14593.903, 1e-8),
    ("1 mph", "speed", 0.44704, 1e-12),
    ("1 lbf*ft", "moment", 1.355818, 1e-7),
    ("1 ft**2", "area", 0.09290304, 1e-12),
]


@pytest.mark.parametrize("text, dimension, si, rel", NIST)
def test_nist_factors(text, dimension, si, rel):
    assert parse_quantity(text, dimension) == pytest.approx(si, rel=rel)


def test_pci_from_exact_definitions():
    # lbf and inch are exact (NIST SP 811): 1 lbf/in^3 = 4.4482216152605 / 0.0254^3 N/m^3
    assert parse_quantity("40 pci", "force per volume") == pytest.approx(
        40 * 4.4482216152605 / 0.0254**3, rel=1e-12)


def test_weights_given_as_mass_use_standard_gravity():
    # 1 lb = 0.45359237 kg exactly; g_n = 9.80665 m/s^2 exactly (NIST SP 811)
    assert parse_quantity("250 lb", "weight") == pytest.approx(250 * 0.45359237 * 9.80665,
                                                              rel=1e-12)
    assert parse_quantity("120 lb/ft**3", "unit weight") == pytest.approx(
        120 * 157.08746, rel=1e-7)


def test_trade_fractions_and_mixed_numbers():
    assert parse_quantity("3/8 in", "length") == pytest.approx(0.009525, rel=1e-12)
    assert parse_quantity("5-1/2 in", "length") == pytest.approx(5.5 * 0.0254, rel=1e-12)
    assert parse_quantity("1 1/2 in", "length") == pytest.approx(1.5 * 0.0254, rel=1e-12)


def test_absolute_temperatures():
    # T[K] = (T[degF] + 459.67) / 1.8 ; T[K] = T[degC] + 273.15 (NIST SP 811 B.8)
    assert parse_quantity("60 degF", "temperature") == pytest.approx((60 + 459.67) / 1.8)
    assert parse_quantity("-10 degC", "temperature") == pytest.approx(263.15)
    assert parse_quantity("300 K", "temperature") == pytest.approx(300.0)


def test_temperature_differences_and_coefficients():
    # a difference of 1 degF is 1/1.8 K (NIST SP 811 B.8)
    assert parse_quantity("40 delta_degF", "temperature difference") == pytest.approx(40 / 1.8)
    assert parse_quantity("40 degF", "temperature difference") == pytest.approx(40 / 1.8)
    assert parse_quantity("10 degC", "temperature difference") == pytest.approx(10.0)
    # steel rope 6.5e-6 per degF = 11.7e-6 per K (references.md, from memory)
    assert parse_quantity("6.5e-6 / degF", "per temperature") == pytest.approx(11.7e-6)


def test_angles_need_units():
    assert parse_quantity("30 deg", "angle") == pytest.approx(math.pi / 6)
    with pytest.raises(InputError, match="no units"):
        parse_quantity("30", "angle", "ground.soil[1].friction_angle")


@pytest.mark.parametrize("value", [12, 12.5, "12", " 12 "])
def test_bare_number_is_an_error(value):
    with pytest.raises(InputError, match="units") as err:
        parse_quantity(value, "length", "anchor[1].post.height")
    assert err.value.where == "anchor[1].post.height"
    assert "a length" in str(err.value)


@pytest.mark.parametrize("text, dimension, expected_words, got_words", [
    ("12 psi", "length", "a length", "a pressure"),
    ("250 lb", "force", "a force", "a mass"),
    ("3 ft", "force per length", "a force per length", "a length"),
    ("5 kN", "unit weight", "a unit weight", "a force"),
    ("2 s", "speed", "a speed", "a time"),
])
def test_wrong_dimension_names_both(text, dimension, expected_words, got_words):
    with pytest.raises(InputError) as err:
        parse_quantity(text, dimension, "x.y")
    message = str(err.value)
    assert f"expected {expected_words}" in message and got_words in message
    assert message.startswith("x.y: ")


def test_unknown_unit_and_garbage():
    with pytest.raises(InputError, match="unknown unit 'fet'"):
        parse_quantity("12 fet", "length", "line[1].sag")
    with pytest.raises(InputError, match="cannot read"):
        parse_quantity("12 ft +", "length")
    with pytest.raises(InputError, match="empty"):
        parse_quantity("  ", "length")
    with pytest.raises(InputError, match="finite"):
        parse_quantity("inf ft", "length")


def test_temperature_mistakes():
    with pytest.raises(InputError, match="temperature difference"):
        parse_quantity("60 delta_degF", "temperature")
    with pytest.raises(InputError, match="degF or degC"):
        parse_quantity("60 F", "temperature")  # F is the farad


def test_ratio():
    assert parse_ratio(0.8) == 0.8
    assert parse_ratio("80 %") == pytest.approx(0.8)
    with pytest.raises(InputError, match="has units"):
        parse_ratio("3 ft")
    with pytest.raises(InputError):
        parse_ratio(True)


def test_display_in_user_units():
    # 12 ft = 3.6576 m exactly; 14,400 lbf from FAA AC 43.13-1B Table 7-3
    assert show(3.6576, "length", "us") == "12.0 ft"
    assert show(3.6576, "length", "si") == "3.66 m"
    assert show(14400 * 4.4482216152605, "force", "us") == "14,400 lbf"
    assert show(14400 * 4.4482216152605, "force", "si") == "64.1 kN"
    assert show((60 + 459.67) / 1.8, "temperature", "us") == "60.0°F"
    assert show(288.15, "temperature", "si") == "15.0°C"
    assert show(0.009525, "size", "us") == "0.375 in"
    number, label = to_display(1.0, "speed", "us")
    assert number == pytest.approx(1 / 0.44704) and label == "mph"
    number, label = to_display(47.880259, "soil pressure", "us")
    assert number == pytest.approx(1.0, rel=1e-7) and label == "psf"


@pytest.mark.parametrize("x, text", [
    (9.99999, "10.0"), (14449.0, "14,400"), (0.0123456, "0.0123"), (123456789, "123,000,000"),
    (-1.0000001, "-1.00"), (0.0, "0"),
])
def test_format_number_significant_figures(x, text):
    assert format_number(x) == text
