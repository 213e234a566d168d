"""The terminal summary of a run, in the user's units, ending with the cautions."""
from __future__ import annotations

import math

from spanstay.models.common.cautions import cautions_for
from spanstay.models.common.units import show

#: check kinds and the unit kind models.common.units.show formats them with
_KIND_UNITS = {"force": "force", "stress": "pressure", "length": "length", "speed": "speed",
               "moment": "moment", "energy": "energy"}


def _value(value, kind: str, units: str) -> str:
    if value is None or (isinstance(value, float) and not math.isfinite(value)):
        return "-"
    if kind == "angle":
        return f"{math.degrees(value):.2f} deg"
    if kind == "acceleration":
        return f"{value / 9.80665:.2f} g"
    if kind in _KIND_UNITS:
        try:
            return show(value, _KIND_UNITS[kind], units)
        except (KeyError, ValueError):
            pass
    return f"{value:.3g}"


def _governing(gov: dict, units: str) -> str:
    """Which pass, rider and station governs a check, as a short bracket."""
    parts = []
    if gov.get("pass"):
        parts.append(str(gov["pass"]))
    if gov.get("rider_weight"):
        parts.append(f"rider {show(gov['rider_weight'], 'force', units)}")
    if gov.get("along") is not None:
        parts.append(f"at {show(gov['along'], 'length', units)}")
    return f"  [{', '.join(parts)}]" if parts else ""


def summary_lines(result, out_dir, units: str) -> list[str]:
    """Lines of text summing up a run."""
    from spanstay.models.analysis.installed import end_tensions, measured_sag

    sc, system = result.scenario, result.system
    verdict = result.verdict
    lines = [f"spanstay run: {sc.project.name}"]
    for inc in verdict.incomplete:  # a pass that stopped early is the first finding
        lines.append(f"  ANALYSIS INCOMPLETE: pass '{inc.pass_name}' ({inc.purpose}, rider "
                     f"{show(inc.rider_weight, 'force', units)}) found no equilibrium with the "
                     f"rider {show(inc.at, 'length', units)} along the cable, after "
                     f"{inc.stations_solved} of {inc.stations} stations; largest imbalance in "
                     f"{inc.gave_way}")
    if verdict.incomplete:
        lines.append("  Results of the passes that stopped are not used for any check or ride "
                     "figure; fix the cause (or the design) and run again.")
    for name, line in system.lines.items():
        t0, t1 = end_tensions(system, result.installed, line)
        lines.append(f"  installed line '{name}': sag {show(measured_sag(system, result.installed, line), 'length', units)}, "
                     f"end tensions {show(t0, 'force', units)} / {show(t1, 'force', units)}, "
                     f"unstressed length {show(result.lengths[name], 'length', units)}")
    for label, p in result.passes.items():
        if p.stations:
            tmax = max(s.tension_max for s in p.stations)
            smax = max(s.sag for s in p.stations)
            lines.append(f"  {label:<10} rider {show(p.weight, 'force', units)}: {len(p.stations)} stations, "
                         f"largest tension {show(tmax, 'force', units)}, largest sag {show(smax, 'length', units)}")
        if p.failed_at is not None:
            lines.append(f"  {label:<10} NO EQUILIBRIUM with the rider {show(p.failed_at, 'length', units)} "
                         f"along the cable: {p.failure[:160]}")
    for key, r in result.rides.items():
        end = (f"arrives at {show(r.arrival_speed, 'speed', units)}" if r.reaches_end
               else f"STOPS {show(r.stop_distance, 'length', units)} along the line")
        lines.append(f"  ride, {key} rider: top speed {show(r.top_speed, 'speed', units)}, {end}")
    from spanstay.models.outputs.ride_limits_text import loaded_lines, ride_limit_lines, stop_lines

    lines += [f"  {t}" for t in ride_limit_lines(sc, units) + stop_lines(result.stops, units)
              + loaded_lines(result, units)]
    if result.clearance is not None:
        c = result.clearance
        lines.append(f"  smallest feet clearance {show(c.minimum, 'length', units)} at "
                     f"{show(c.minimum_distance, 'length', units)}")
    if result.slack is not None and result.slack.shares:
        sb = result.slack.to_dict()
        lines.append(f"  slack budget of the loaded sag {show(sb['loaded_sag'], 'length', units)}:")
        for name, v in sb["shares"].items():
            lines.append(f"    {name:<46} {_value(v, 'length', units)}")
    from spanstay.models.analysis.anchor_shares import anchor_shares

    shares = anchor_shares(result) if result.passes["design"].complete else {}
    for name, share in shares.items():
        parts = ", ".join(f"{part} {100 * f:.0f} %" for part, f in share["fraction"].items() if f > 0.005)
        lines.append(f"  anchor '{name}' holds the pull with: {parts}")
    lines.append("  checks:")
    failed = 0
    for c in result.checks:
        d = c.to_dict()
        mark = "ok  " if d["passed"] else "FAIL"
        failed += not d["passed"]
        util = d["utilization"]
        util_s = f"{util:5.2f}" if util is not None else "  -  "
        lines.append(f"    {mark} {util_s}  {d['where']}: {d['description']}: {_value(d['demand'], d['kind'], units)} "
                     f"vs {_value(d['capacity'], d['kind'], units)}{_governing(d.get('governing') or {}, units)}")
    if verdict.not_checked:
        lines.append("  not checked:")
        lines += [f"    -    {n.sentence()}" for n in verdict.not_checked]
    lines.append(f"  verdict: {verdict.counts_line()}")
    lines.append(f"  results: {out_dir}")
    lines.append("")
    lines += [f"CAUTION: {c}" for c in cautions_for(sc)]
    return lines
