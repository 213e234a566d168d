"""Lumber catalog: dressed sizes, species and grade design values, poles, green wood.

Values live in ``models/catalogs/data/lumber.toml`` (psi, inches) with their sources;
everything returned here is SI (m, Pa, kg/m^3). Each record keeps its
``source`` string so reports can show where a number came from.
"""
from __future__ import annotations

import re
import tomllib
from dataclasses import dataclass, replace
from functools import cache
from pathlib import Path

from spanstay.models.common.errors import InputError

PSI = 6894.757293168361  # Pa per psi
INCH = 0.0254  # m per inch
MPA = 1.0e6

_DATA = Path(__file__).parent / "data" / "lumber.toml"
STRESS_NAMES = ("Fb", "Ft", "Fv", "Fc", "Fc_perp", "E", "Emin")


@cache
def _catalog() -> dict:
    with _DATA.open("rb") as fh:
        return tomllib.load(fh)


# --------------------------------------------------------------------------- sizes
@dataclass(frozen=True)
class DressedSize:
    """A rectangular section, nominal and dressed (SI).

    ``thickness`` is the smaller dressed dimension, ``width`` the larger.
    ``kind`` is "dimension" (nominal thickness 1-4 in), "timber" (5 in and up)
    or "custom" (user sizes).
    """

    name: str
    thickness: float
    width: float
    kind: str
    nominal_thickness: int = 0
    nominal_width: int = 0
    source: str = ""

    @property
    def area(self) -> float:
        return self.thickness * self.width

    @property
    def I_strong(self) -> float:
        """Second moment about the axis parallel to the thickness (bending across the width)."""
        return self.thickness * self.width**3 / 12.0

    @property
    def I_weak(self) -> float:
        """Second moment about the axis parallel to the width (flatwise bending)."""
        return self.width * self.thickness**3 / 12.0


def known_sizes() -> list[str]:
    """All nominal sizes the catalog knows, e.g. ``["1x2", ..., "2x8", ..., "16x16"]``."""
    s = _catalog()["sizes"]
    dim = [f"{t}x{w}" for t in s["dimension_thickness"] for w in s["dimension_width"]
           if int(w) >= int(t)]
    tim = [f"{t}x{w}" for t in s["timber"] for w in s["timber"] if int(w) >= int(t)]
    return dim + tim


_SIZE_RE = re.compile(r"^\s*(\d+)\s*[xX×]\s*(\d+)\s*$")


def parse_size(text: str, where: str | None = None) -> DressedSize:
    """Parse a nominal size such as ``"2x8"`` into dressed dimensions (PS 20).

    Raises
    ------
    InputError
        When the text does not parse or the size is not a standard one; the
        message lists the known sizes.
    """
    known = known_sizes()
    m = _SIZE_RE.match(str(text))
    if m:
        a, b = sorted((int(m.group(1)), int(m.group(2))))
        name = f"{a}x{b}"
        if name in known:
            s = _catalog()["sizes"]
            if a >= 5:
                t, w, kind = s["timber"][str(a)], s["timber"][str(b)], "timber"
            else:
                t, w, kind = s["dimension_thickness"][str(a)], s["dimension_width"][str(b)], "dimension"
            return DressedSize(name, t * INCH, w * INCH, kind, a, b, s["source"])
    raise InputError(
        f"lumber size {text!r} is not a standard nominal size; expected one of: "
        + ", ".join(known), where)


def custom_size(thickness: float, width: float, name: str = "custom",
                where: str | None = None) -> DressedSize:
    """A user-given rectangular section (dressed dimensions in metres)."""
    if not (thickness > 0 and width > 0):
        raise InputError(f"ply dimensions must be positive, got {thickness} m x {width} m", where)
    t, w = sorted((float(thickness), float(width)))
    return DressedSize(name, t, w, "custom", source="user-given")


# --------------------------------------------------------------- species / grades
@dataclass(frozen=True)
class DesignValues:
    """Reference (unadjusted) design values, SI.

    Stresses and moduli in Pa, ``rho_mean`` in kg/m^3, ``G`` the NDS specific
    gravity. ``size_class`` is "dimension", "timbers" or "pole";
    ``size_factor_included`` is True where the table already holds the size
    effect (southern pine dimension lumber).
    """

    species: str
    grade: str
    size_class: str
    Fb: float
    Ft: float
    Fv: float
    Fc: float
    Fc_perp: float
    E: float
    Emin: float
    G: float
    rho_mean: float
    source: str
    density_source: str = ""
    size_factor_included: bool = False

    def with_overrides(self, **values: float) -> "DesignValues":
        """Copy with user values (SI) replacing catalog ones; the source notes it."""
        bad = [k for k in values if k not in STRESS_NAMES + ("G", "rho_mean")]
        if bad:
            raise InputError(f"unknown design value(s) {bad}; expected some of "
                             f"{list(STRESS_NAMES) + ['G', 'rho_mean']}")
        note = ", ".join(sorted(values))
        return replace(self, **values, source=f"{self.source}; user-given: {note}")


def _key(text: str) -> str:
    return re.sub(r"[\s_]+", " ", str(text).strip().lower())


def known_species() -> list[str]:
    return list(_catalog()["species"])


def species_name(text: str, where: str | None = None) -> str:
    """Catalog name of a species group from a name or alias (case-insensitive)."""
    k = _key(text)
    for name, rec in _catalog()["species"].items():
        if k == name or k in rec.get("aliases", []):
            return name
    raise InputError(f"species {text!r} is not in the lumber catalog; known species: "
                     + ", ".join(known_species()), where)


def grade_name(text: str, where: str | None = None,
               known: list[str] | None = None) -> str:
    """Catalog grade name ("No. 1", "No. 2") from e.g. "no1", "#2", "No.2"."""
    k = re.sub(r"[\s.#_]+", "", str(text).lower()).replace("number", "no")
    if not k.startswith("no"):
        k = "no" + k
    for g in known or ["No. 1", "No. 2"]:
        if re.sub(r"[\s.]+", "", g.lower()) == k:
            return g
    raise InputError(f"grade {text!r} is not in the lumber catalog; known grades: "
                     + ", ".join(known or ["No. 1", "No. 2"]), where)


def _values(rec: dict, width_nominal: int | None) -> dict[str, float]:
    out = {}
    for n in STRESS_NAMES:
        v = rec[n]
        if isinstance(v, list):
            widths = rec["widths"]
            w = max(min(width_nominal or widths[0], widths[-1]), widths[0])
            # narrower than a tabulated width -> the next tabulated width up
            i = next(i for i, ww in enumerate(widths) if ww >= w)
            v = v[i]
        out[n] = float(v) * PSI
    return out


def design_values(species: str, grade: str, size: DressedSize | str | None = None,
                  where: str | None = None) -> DesignValues:
    """Reference design values for a species group, grade and size.

    Parameters
    ----------
    species, grade
        Names or aliases, e.g. "southern pine"/"SP", "No. 2"/"#2".
    size
        Nominal size or DressedSize. Selects dimension lumber (up to 4 in
        thick) or posts and timbers (5 in and up); southern pine dimension
        values also depend on the width. A custom size counts as dimension
        lumber when its thickness is under 4.5 in.
    """
    cat = _catalog()
    sp = species_name(species, where)
    if isinstance(size, str):
        size = parse_size(size, where)
    if size is None or size.kind == "dimension" or (size.kind == "custom" and size.thickness < 4.5 * INCH):
        table, size_class = cat["dimension"], "dimension"
    else:
        table, size_class = cat["timbers"], "timbers"
    grades = table.get(sp, {})
    if not grades:
        raise InputError(f"no {size_class} design values for {sp!r}; species with "
                         f"{size_class} values: " + ", ".join(table), where)
    g = grade_name(grade, where, list(grades))
    rec = grades[g]
    width_nominal = None
    if size is not None:
        width_nominal = size.nominal_width or round(size.width / INCH + 0.5)
    vals = _values(rec, width_nominal)
    srec = cat["species"][sp]
    return DesignValues(sp, g, size_class, **vals, G=srec["G"], rho_mean=float(srec["rho_mean"]),
                        source=rec["source"], density_source=srec["density_source"],
                        size_factor_included="widths" in rec)


def pole_values(species: str, where: str | None = None) -> DesignValues:
    """Reference design values for treated round poles (piles table; from memory).

    No tension value is tabulated for piles: ``Ft`` is 0 (check tension
    another way, or give it as a user value).
    """
    cat = _catalog()
    sp = species_name(species, where)
    if sp not in cat["poles"]:
        raise InputError(f"no round-pole values for {sp!r}; known pole species: "
                         + ", ".join(cat["poles"]), where)
    rec = cat["poles"][sp]
    srec = cat["species"][sp]
    return DesignValues(sp, "pole", "pole", **_values(rec, None), G=srec["G"],
                        rho_mean=float(srec["rho_mean"]), source=rec["source"],
                        density_source=srec["density_source"])


# --------------------------------------------------------------------- trees
@dataclass(frozen=True)
class GreenWood:
    """Green (standing-tree) clear-wood properties, SI."""

    species: str
    E: float
    MOR: float
    rho_green: float
    source: str
    Fc: float = float("nan")  # Pa, compression parallel to grain (maximum crushing strength)


def known_tree_species() -> list[str]:
    return [k for k in _catalog()["trees"] if k != "source"]


def green_wood(species: str, where: str | None = None) -> GreenWood:
    """Green modulus of elasticity and rupture of a tree species (from memory)."""
    trees = _catalog()["trees"]
    k = _key(species)
    if k not in known_tree_species():
        raise InputError(f"tree species {species!r} is not in the catalog; known: "
                         + ", ".join(known_tree_species()), where)
    rec = trees[k]
    return GreenWood(k, rec["E_MPa"] * MPA, rec["MOR_MPa"] * MPA, float(rec["rho_green"]),
                     trees["source"], rec["Fc_MPa"] * MPA)
