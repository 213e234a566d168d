"""The scenario echoed in the report: summary['inputs'] (SI) as tables with units.

Each key is shown in the user's units by the quantity its name says it is;
a key this table does not know is shown as the plain SI number with "(SI)".
"""
from __future__ import annotations

from html import escape

from spanstay.models.outputs.display_units import number, show

#: scenario key -> display quantity (see models.outputs.display_units)
KEY_KINDS: dict[str, str] = {
    # lengths along the site
    "height": "length", "start_height": "length", "end_height": "length", "x": "length",
    "y": "length", "grade": "length", "depth": "length", "top": "length", "bottom": "length",
    "sag": "length", "unstressed_length": "length", "hang_distance": "length",
    "start_offset": "length", "stop_offset": "length", "water_table": "length",
    "attach_height": "length", "foot_distance": "length", "distance": "length",
    "rail_height": "length", "attachment_height": "length", "profile": "length",
    "ground_point": "length",
    # section sizes
    "diameter": "size", "width": "size", "pier_diameter": "size", "top_diameter": "size",
    "base_diameter": "size", "length": "size", "spacing": "size", "block_width": "size",
    "block_length": "size", "diameter_at_grade": "size", "diameter_at_attachment": "size",
    # forces
    "breaking_strength": "force", "EA": "force", "tension": "force", "lightest": "force",
    "heaviest": "force", "pretension": "force", "anchor_capacity": "force",
    "diagonal_pretension": "force",
    # others
    "weight_per_length": "force per length", "E": "stress", "shear_modulus": "stress",
    "Emin": "stress", "Fb": "stress", "Ft": "stress", "Fv": "stress", "Fc": "stress",
    "Fc_perp": "stress", "E_green": "stress", "undrained_shear_strength": "soil pressure",
    "modulus_constant": "soil pressure", "unit_weight": "unit weight",
    "k_initial": "force per volume", "modulus_gradient": "force per volume",
    "slip_modulus": "stiffness", "anchor_stiffness": "stiffness",
    "base_spring": "rotational stiffness", "root_plate_stiffness": "rotational stiffness",
    "root_plate_capacity": "moment", "drag_area": "area", "air_density": "density",
    "density": "density", "start_speed": "speed", "install_temperature": "temperature",
    "use_temperatures": "temperature", "alpha": "per kelvin",
}
#: tables whose width and depth are section sizes, not site lengths
SECTION_TABLES = {"section", "ply", "member", "rail"}
#: keys that are plain numbers (no unit)
PLAIN = {"factor_of_safety", "dynamic_factor", "termination_efficiency", "segments", "stations",
         "rolling_resistance", "plies", "rows", "eps50", "friction_angle_deg", "stack_angle_deg",
         "direction_deg", "soil_factor_of_safety", "uplift_factor_of_safety",
         "sliding_factor_of_safety", "tree_factor_of_safety", "matlock_J", "block_friction"}
DEGREES = {"friction_angle_deg", "stack_angle_deg", "direction_deg"}


def value_text(key: str, value, units: str, parent: str = "") -> str:
    """One input value as display text (``parent``: the table holding ``key``)."""
    if parent in SECTION_TABLES and key in ("width", "depth"):
        key = "diameter"  # any key shown as a section size
    if value is None:
        return "–"
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, str):
        return value
    if isinstance(value, (list, tuple)):
        if value and all(isinstance(v, (list, tuple)) for v in value):
            return "; ".join("(" + ", ".join(value_text(key, x, units) for x in v) + ")"
                             for v in value)
        return ", ".join(value_text(key, v, units) for v in value)
    if isinstance(value, (int, float)):
        if key in DEGREES:
            return f"{number(float(value))}°"
        if key in PLAIN:
            return number(float(value)) if isinstance(value, float) else str(value)
        kind = KEY_KINDS.get(key)
        if kind is not None:
            return show(float(value), kind, units)
        return f"{number(float(value))} (SI)"
    return str(value)


def _rows(prefix: str, obj, units: str, out: list[tuple[str, str]], named: bool = False) -> None:
    if isinstance(obj, dict):
        parent = prefix.rsplit(".", 1)[-1]
        for k, v in obj.items():
            if v is None or v == [] or (isinstance(v, dict) and all(x is None for x in v.values())):
                continue  # unset options are not echoed
            if named and k == "name":
                continue  # already the row label
            path = f"{prefix}.{k}" if prefix else k
            if isinstance(v, dict):
                _rows(path, v, units, out)
            elif isinstance(v, list) and v and all(isinstance(x, dict) for x in v):
                for i, x in enumerate(v):
                    label = x.get("name") if isinstance(x.get("name"), str) else str(i + 1)
                    _rows(f"{path}[{label}]", x, units, out, named=label != str(i + 1))
            else:
                out.append((path, value_text(k, v, units, parent)))


def input_tables(inputs: dict, units: str) -> str:
    """HTML tables of the scenario, one per top-level section."""
    if not isinstance(inputs, dict) or not inputs:
        return "<p>The scenario was not echoed in summary.json.</p>"
    html = []
    for section, body in inputs.items():
        rows: list[tuple[str, str]] = []
        _rows("", body if isinstance(body, dict) else {section: body}, units, rows)
        if isinstance(body, list):
            rows = []
            for i, x in enumerate(body):
                label = x.get("name") if isinstance(x, dict) and isinstance(x.get("name"), str) \
                    else str(i + 1)
                _rows(label, x, units, rows, named=label != str(i + 1))
        if not rows:
            continue
        html.append(f"<h3>{escape(section)}</h3><table class='inputs'><tbody>")
        html += [f"<tr><th>{escape(k)}</th><td>{escape(v)}</td></tr>" for k, v in rows]
        html.append("</tbody></table>")
    return "\n".join(html)
