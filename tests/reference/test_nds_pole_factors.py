"""NDS factors of round poles and incised lumber.

Sources (NDS 2018, from memory): Table 6.3.5 condition treatment factor Cct: untreated
1.0, air-dried 0.95, kiln-dried 0.90, Boulton 0.95, steamed 0.80, steamed (marine) 0.74;
§6.3.8 size factor of round piles over 13.5 in, CF = (13.5 / d)^(1/9) on Fb; §4.3.8
incising factor Ci 0.80 on Fb, Ft, Fc, Fv and 0.95 on E, Emin.
"""
import pytest

from spanstay.models.catalogs import lumber
from spanstay.models.catalogs.nds import adjusted_values, pole_factors

IN = 0.0254


def test_condition_treatment_and_pole_size_factor():
    assert pole_factors(10 * IN, "kiln-dried")[0].value == pytest.approx(0.90)
    assert pole_factors(10 * IN, "steamed-marine")[0].value == pytest.approx(0.74)
    assert len(pole_factors(13 * IN, "air-dried")) == 1  # no size factor at 13 in
    cf = pole_factors(16 * IN, "untreated")[1]
    assert cf.value == pytest.approx((13.5 / 16) ** (1 / 9), rel=1e-12)  # 0.9813
    assert cf.value == pytest.approx(0.9813, abs=1e-4)


def test_adjusted_pole_and_incised_values():
    pole = lumber.pole_values("southern pine")
    adj = adjusted_values(pole, None, duration="ten years", wet=True, pole_diameter=16 * IN,
                          conditioning="air-dried")
    assert adj["Fb"] == pytest.approx(pole.Fb * 0.95 * (13.5 / 16) ** (1 / 9), rel=1e-9)
    assert adj["Fc"] == pytest.approx(pole.Fc * 0.95, rel=1e-9)
    sawn = lumber.design_values("douglas fir-larch", "No. 2", lumber.parse_size("6x6"))
    plain = adjusted_values(sawn, lumber.parse_size("6x6"), duration="ten years")
    incised = adjusted_values(sawn, lumber.parse_size("6x6"), duration="ten years",
                              incised=True)
    assert incised["Fb"] == pytest.approx(0.80 * plain["Fb"], rel=1e-9)
    assert incised["Emin"] == pytest.approx(0.95 * plain["Emin"], rel=1e-9)
