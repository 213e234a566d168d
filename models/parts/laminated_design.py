"""Laminated (built-up) timber post designs: plies, fasteners and their slip moduli, from
the lumber and fastener catalogs or a scenario post. Built into fem parts by
:mod:`spanstay.models.parts.laminated`."""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.fasteners import (Fastener, LateralValue, check_fits, joint_density, lateral_value,
                              nail_bending_yield, slip_modulus_ser)
from spanstay.models.catalogs.lumber import (INCH, PSI, DesignValues, DressedSize, custom_size, design_values,
                           parse_size)

#: Contact links across a joint have STIFF_FACTOR x E w s / t (E parallel to grain,
#: w ply width, s fastener spacing, t ply thickness): some 20 to 30 times the real
#: bearing stiffness across the grain (E perpendicular ~ E/20 to E/30, Wood Handbook,
#: from memory), so the plies move together; much stiffer springs only add round-off.
STIFF_FACTOR = 1.0
#: The base tie: translations RIGID_T x E A / h, rotations RIGID_R x E I / h of a ply's
#: shortest element h.
RIGID_T = 10.0
RIGID_R = 100.0
#: Softwood E/G (Swedish Wood, Design of Timber Structures, Vol. 1).
E_OVER_G = 16.0
GRAVITY = 9.80665


@dataclass(frozen=True)
class Ply:
    """One lamination: its size, reference design values and elastic moduli (SI)."""

    size: DressedSize
    values: DesignValues
    E: float
    G: float

    @property
    def thickness(self) -> float:
        return self.size.thickness

    @property
    def width(self) -> float:
        return self.size.width

    @property
    def area(self) -> float:
        return self.size.area


@dataclass(frozen=True)
class LaminatedDesign:
    """A laminated post section, resolved and checked (SI).

    ``rows`` lines of fasteners run along the post at ``spacing``; staggered
    rows alternate by half a spacing. Each joint between neighbouring plies
    has its own fasteners. ``K_ser`` is per fastener per shear plane (N/m);
    ``lateral`` holds the reference lateral value of each joint.
    """

    plies: tuple[Ply, ...]
    fastener: Fastener
    spacing: float
    rows: int
    staggered: bool
    rho_mean: float
    K_ser: float
    lateral: tuple[LateralValue, ...]
    stack_angle_deg: float = 0.0
    where: str | None = None

    @property
    def n(self) -> int:
        return len(self.plies)

    @property
    def K_u(self) -> float:
        """Ultimate slip modulus, 2/3 K_ser (EN 1995-1-1 2.2.2)."""
        return 2.0 / 3.0 * self.K_ser

    def slip_modulus(self, slip: str = "ultimate") -> float:
        """K per fastener per shear plane for ``slip`` = "service" or "ultimate"."""
        if slip not in ("service", "ultimate"):
            raise InputError(f'slip must be "service" or "ultimate", got {slip!r}', self.where)
        return self.K_ser if slip == "service" else self.K_u

    def k_per_length(self, slip: str = "ultimate") -> float:
        """Slip modulus of one joint per unit length, rows x K / spacing (N/m^2)."""
        return self.rows * self.slip_modulus(slip) / self.spacing

    @property
    def thicknesses(self) -> np.ndarray:
        return np.array([p.thickness for p in self.plies])

    @property
    def offsets(self) -> np.ndarray:
        """Ply centroid positions along ``stack`` from the middle of the stack (m)."""
        t = self.thicknesses
        return np.cumsum(t) - t / 2 - t.sum() / 2

    def EI_stack(self, composite: bool) -> float:
        """Bending across the joints: sum of ply E I (no connection) or full section."""
        E = np.array([p.E for p in self.plies])
        A = np.array([p.area for p in self.plies])
        I = np.array([p.size.I_weak for p in self.plies])
        if not composite:
            return float(np.sum(E * I))
        c = self.offsets
        zbar = np.sum(E * A * c) / np.sum(E * A)
        return float(np.sum(E * I + E * A * (c - zbar) ** 2))

    def EI_side(self) -> float:
        """Bending along the joints (plies side by side): sum of ply E I about their strong axes."""
        return float(sum(p.E * p.size.I_strong for p in self.plies))

    def fastener_levels(self, length: float) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """Fastener levels along a post of ``length``.

        Returns heights (m from the base), fasteners per level, and the mean
        position of that level's fasteners across the ply width (m). The
        first row sits half a spacing from the base (common practice).
        """
        w = min(p.width for p in self.plies)
        across = -w / 2 + w * (np.arange(self.rows) + 0.5) / self.rows
        if self.staggered and self.rows > 1:
            step = self.spacing / 2
            z = np.arange(step, length - 1e-9, step)
            sets = [across[0::2], across[1::2]]
            count = np.array([len(sets[k % 2]) for k in range(len(z))])
            pos = np.array([sets[k % 2].mean() for k in range(len(z))])
        else:
            z = np.arange(self.spacing / 2, length - 1e-9, self.spacing)
            count = np.full(len(z), self.rows)
            pos = np.full(len(z), across.mean())
        return z, count, pos


def make_fastener(kind: str, diameter: float, length: float, slip_modulus: float | None = None,
                  lateral_value: float | None = None, where: str | None = None) -> Fastener:
    """A fastener of given kind and size (m): Fyb by NDS diameter classes (from memory)."""
    if kind not in ("nail", "screw", "bolt"):
        raise InputError(f"fastener kind {kind!r} unknown; expected nail, screw or bolt", where)
    if not (diameter > 0 and length > 0):
        raise InputError(f"fastener diameter and length must be positive, got {diameter} m, "
                         f"{length} m", where)
    fyb = 45e3 * PSI if kind == "bolt" else nail_bending_yield(diameter / INCH)
    name = f"{diameter * 1000:.2f} mm {kind}"
    f = Fastener(kind, name, diameter, length, kind != "nail", fyb,
                 "user-given size; Fyb from NDS diameter classes (from memory)")
    return f.with_overrides(slip_modulus, lateral_value)


def laminated_design(ply: str | DressedSize, plies: int, species: str, grade: str,
                     fastener: Fastener, spacing: float, height: float, rows: int = 1,
                     staggered: bool = False, stack_angle_deg: float = 0.0,
                     overrides: dict[str, float] | None = None, G_shear: float | None = None,
                     where: str | None = None) -> LaminatedDesign:
    """Resolve and check a laminated post section.

    Parameters
    ----------
    ply
        Nominal size ("2x8") or a DressedSize; all plies alike.
    plies
        Number of plies (at least 2).
    species, grade
        Lumber catalog names (:mod:`models.catalogs.lumber`).
    fastener
        From :mod:`models.catalogs.fasteners` or :func:`make_fastener`.
    spacing
        Along the post, within one row (m). ``height`` is the post length it
        must fit in.
    overrides
        User design values (SI) replacing catalog ones, e.g. ``{"E": 11e9}``.
    G_shear
        Shear modulus (Pa); default E/16.

    Raises
    ------
    InputError
        Zero or one ply, a spacing longer than the post, a fastener too thick
        for the plies or too short to reach the next ply, an unknown species,
        grade or size; the message names the value and ``where``.
    """
    def at(key: str) -> str | None:
        return f"{where}.{key}" if where else key

    if not isinstance(plies, (int, np.integer)) or plies < 2:
        raise InputError(f"a laminated post needs at least 2 plies, got {plies!r}", at("plies"))
    size = parse_size(ply, at("ply")) if isinstance(ply, str) else ply
    values = design_values(species, grade, size, at("species"))
    if overrides:
        values = values.with_overrides(**{k: v for k, v in overrides.items() if v is not None})
    if not (spacing > 0):
        raise InputError(f"fastener spacing must be positive, got {spacing} m", at("fastener.spacing"))
    if spacing > height:
        raise InputError(f"fastener spacing {spacing:.4g} m is longer than the post "
                         f"({height:.4g} m); expected at most the post height",
                         at("fastener.spacing"))
    if rows < 1:
        raise InputError(f"fastener rows must be at least 1, got {rows}", at("fastener.rows"))
    G = G_shear if G_shear is not None else values.E / E_OVER_G
    ply_list = tuple(Ply(size, values, values.E, G) for _ in range(plies))
    rho = joint_density(values.rho_mean)
    check_fits(fastener, size.thickness, rho, at("fastener.diameter"))
    if fastener.kind != "bolt" and fastener.length < size.thickness:
        raise InputError(f"fastener length {fastener.length * 1000:.1f} mm is shorter than the "
                         f"{size.thickness * 1000:.1f} mm ply it must pass through",
                         at("fastener.length"))
    # each joint: the fastener enters through one ply (side member) into the next (main)
    lat = tuple(lateral_value(fastener, size.thickness, size.thickness, values.G, values.G,
                              at("fastener.length")) for _ in range(plies - 1))
    return LaminatedDesign(ply_list, fastener, float(spacing), int(rows), bool(staggered), rho,
                           slip_modulus_ser(fastener, rho), lat, float(stack_angle_deg), where)


def design_from_post(post, where: str | None = None) -> LaminatedDesign:
    """A :class:`LaminatedDesign` from a ``models.scenario.spec.PostSpec`` of kind "laminated"."""
    def at(key: str) -> str | None:
        return f"{where}.{key}" if where else key

    if post.species is None or post.grade is None:
        raise InputError("a laminated post needs a species and a grade from the lumber catalog",
                         at("species"))
    fs = post.fastener
    if fs is None:
        raise InputError("a laminated post needs a [fastener] table", at("fastener"))
    ply = post.ply
    size = parse_size(ply.nominal, at("ply")) if ply.nominal else custom_size(ply.depth, ply.width,
                                                                             where=at("ply"))
    f = make_fastener(fs.kind, fs.diameter, fs.length, fs.slip_modulus, where=at("fastener"))
    ov = post.overrides
    over = {k: getattr(ov, k) for k in ("E", "Emin", "Fb", "Ft", "Fv", "Fc", "Fc_perp")}
    over["rho_mean"] = ov.density
    return laminated_design(size, post.plies if post.plies is not None else 0, post.species,
                            post.grade, f, fs.spacing, post.height, fs.rows, fs.staggered,
                            post.stack_angle_deg or 0.0, over, ov.shear_modulus, where)
