"""Write a run's results folder: summary.json, stations.csv, VTK series, plots.

Never deletes or overwrites a file spanstay did not write, and never leaves a
half-written folder (see :mod:`results_swap` for the rules, DEVELOPERS.md
"The results folder" for the reasons):

1. the target is checked (a new or empty folder, or a spanstay results folder
   holding only its own unchanged files; never the scenario's folder or the
   one you are in), and what killed runs left beside it is tidied;
2. everything is written into a sibling temporary folder marked ``writing``;
3. the marker ``.spanstay-results.json`` listing every file written (size and
   SHA-256) is written last, then the folder is swapped in atomically;
4. from the previous results only the files their marker lists, unchanged,
   are deleted.

Catchable signals are held back during steps 3-4 and during the clean-up of
a failed write. ``$SPANSTAY_TEST_WRITE_DELAY`` (seconds) is a test hook: a
pause after each file so that tests can send signals mid-write.
"""
from __future__ import annotations

import csv
import json
import sys
from collections.abc import Callable
from pathlib import Path

import numpy as np

from spanstay.models.common.cautions import cautions_for
from spanstay.models.common.json_safe import json_safe
from spanstay.models.outputs.results_marker import finish_marker, start_marker
from spanstay.models.outputs.results_swap import (check_target, clean_stale, make_temp, retire,
                                                  signals_deferred, swap_into_place, test_pause)


def _pass_dict(p) -> dict:
    st = p.stations
    anchors = list(st[0].anchor_disp) if st else []
    guys = list(st[0].guy_tension) if st else []
    return {
        "weight": p.weight, "temperature": p.temperature, "stations": len(st),
        "failed_at": p.failed_at, "failure": p.failure,
        "s": [x.s for x in st], "along": [x.along for x in st],
        "rider_xyz": [x.rider for x in st], "sag": [x.sag for x in st],
        "tension_start": [x.tension_start for x in st], "tension_end": [x.tension_end for x in st],
        "tension_max": [x.tension_max for x in st],
        "soil_ratio": {a: [x.soil_ratio.get(a) for x in st] for a in anchors},
        "ground_rotation": {a: [x.ground_rotation.get(a) for x in st] for a in anchors},
        "anchor_disp": {a: [x.anchor_disp[a] for x in st] for a in anchors},
        "anchor_top": {a: [x.anchor_top[a] for x in st] for a in anchors},
        "guy_tension": {g: [x.guy_tension[g] for x in st] for g in guys},
    }


def _ride_dict(r) -> dict:
    return {"arrival_speed": r.arrival_speed, "arrival_time": r.arrival_time,
            "reaches_end": r.reaches_end, "top_speed": r.top_speed,
            "top_speed_at": r.top_speed_distance, "stopped_at": r.stop_distance,
            "lifts_off": r.lifts_off, "along": r.distance, "speed": r.speed, "time": r.time}


def _parts(system) -> list[dict]:
    """Solid geometry of each drawable group, for the viewer."""
    parts = []
    model = system.model
    for gi, g in enumerate(model.groups):
        name = g.name
        entry = {"name": name, "group": name, "group_index": gi}
        if g.kind == "cable":
            entry.update(kind="guy" if ".guy" in name else "cable", shape="line",
                         diameter=_rope_diameter(system, name))
        elif g.kind == "beam":
            anchor = system.anchors.get(name.split(".")[0])
            entry.update(_beam_shape(anchor, name, g))
        else:
            continue
        parts.append(entry)
    return parts


def _rope_diameter(system, name: str) -> float | None:
    for line in system.lines.values():
        if line.group == name:
            return line.spec.rope.diameter
    for anchor in system.anchors.values():
        for i, guy in enumerate(anchor.spec.guys):
            if name == f"{anchor.spec.name}.guy{i + 1}":
                return guy.rope.diameter
    return None


def _beam_shape(anchor, name: str, group) -> dict:
    local_y = group.frame0[0][:, 1].tolist()
    out = {"kind": "post", "shape": "line", "local_y": local_y}
    if anchor is None:
        return out
    post = anchor.spec.post
    if ".footing." in name:
        fs = anchor.spec.footing
        if name.endswith(".pier"):
            return {**out, "kind": "pier", "shape": "round", "diameter": fs.pier_diameter}
        along, across = post.outline
        if post.kind == "round":
            return {**out, "kind": "embedded", "shape": "round", "diameter": post.base_diameter}
        return {**out, "kind": "embedded", "shape": "rectangle", "width": across, "depth": along}
    if anchor.spec.kind == "tree":
        t = anchor.spec.tree
        return {**out, "kind": "tree", "shape": "round",
                "diameter": 0.5 * (t.diameter_at_grade + t.diameter_at_attachment)}
    if post.kind == "laminated" and ".ply" in name:
        # a ply's local y is the stacking direction: its thickness lies along it
        return {**out, "kind": "ply", "shape": "rectangle", "width": post.ply.depth,
                "depth": post.ply.width}
    if post.kind == "round":
        return {**out, "shape": "round", "diameter": 0.5 * (post.base_diameter + post.top_diameter)}
    if post.section is not None:
        return {**out, "shape": "rectangle", "width": post.section.width, "depth": post.section.depth}
    return out


def build_summary(result, scenario_file: str, units: str, vtk: dict,
                  plots: dict[str, str]) -> dict:
    """The summary.json content (see the results-folder contract in DEVELOPERS.md)."""
    from importlib.metadata import PackageNotFoundError, version

    from spanstay.models.analysis.installed import end_tensions, measured_sag
    from spanstay.models.analysis.anchor_shares import anchor_shares
    from spanstay.models.outputs.ride_limits_text import loaded_lines, ride_limit_lines, stop_lines
    from spanstay.models.checks.lift_off import loaded_sag_ratio

    try:
        ver = version("spanstay")
    except PackageNotFoundError:  # pragma: no cover
        ver = "unknown"
    sc, system = result.scenario, result.system
    installed = {}
    for name, line in system.lines.items():
        t0, t1 = end_tensions(system, result.installed, line)
        installed[name] = {"unstressed_length": result.lengths[name],
                           "sag": measured_sag(system, result.installed, line),
                           "tension_start": t0, "tension_end": t1}
    rider_line = system.lines[sc.rider.line]
    summary = {
        "spanstay": {"version": ver},
        "cautions": list(cautions_for(sc)),
        "project": {"name": sc.project.name, "notes": sc.project.notes},
        "scenario_file": scenario_file,
        "units": units,
        "inputs": sc,
        "installed": {"lines": installed},
        "passes": {k: _pass_dict(p) for k, p in result.passes.items()},
        "ride": {k: _ride_dict(r) for k, r in result.rides.items()},
        "slack_budget": result.slack.to_dict() if result.slack is not None else None,
        "verdict": result.verdict.to_dict() if result.verdict is not None else None,
        "load_shares": anchor_shares(result) if result.passes["design"].complete else {},
        "checks": [c.to_dict() for c in result.checks],
        "ride_limits": {"settings": sc.ride, "sources": dict(sc.ride.sources),
                        "use_temperatures_default": sc.settings.use_temperatures_default,
                        "text": ride_limit_lines(sc, units),
                        "stop_text": stop_lines(getattr(result, "stops", None), units)
                        + loaded_lines(result, units)},
        "stops": result.stops.to_dict() if getattr(result, "stops", None) is not None else None,
        "wind_rides": getattr(result, "wind_rides", {}),
        "dynamic_basis": {"used": sc.rider.dynamic_factor,
                          "computed": list(getattr(result, "drops", [])),
                          "why_not": getattr(result, "drop_why", "")},
        "model": {
            "parts": _parts(system),
            "anchors": {n: {"grade_xyz": [a.spec.x, a.spec.y, a.spec.grade], "top_node": a.top_node,
                            "attach_nodes": {str(h): v for h, v in a.attach.items()}}
                        for n, a in system.anchors.items()},
            "lines": {n: {"nodes": line.nodes, "rider_node": line.rider_node}
                      for n, line in system.lines.items()},
            "hang_distance": sc.rider.hang_distance,
            "ground_profile": [list(p) for p in sc.ground.profile],
            "line_start_xyz": rider_line.start_xyz, "line_end_xyz": rider_line.end_xyz,
        },
        "vtk": vtk,
        "soil_profiles": soil_profiles(result),
        "plots": plots,
    }
    sag_ratio = loaded_sag_ratio(result)
    if sag_ratio is not None:
        summary["ride_limits"]["loaded_sag_ratio"] = sag_ratio[0]
    if result.clearance is not None:
        c = result.clearance
        summary["ride"]["clearance"] = {"min": c.minimum, "at": c.minimum_distance,
                                        "feet_elevation": c.feet_elevation,
                                        "ground_elevation": c.ground_elevation}
    return json_safe(summary)


def _write_csv(path: Path, result) -> None:
    anchors = list(result.system.anchors)
    head = ["pass", "station", "s_m", "along_m", "rider_x_m", "rider_y_m", "rider_z_m", "sag_m",
            "tension_start_N", "tension_end_N", "tension_max_N"]
    for a in anchors:
        head += [f"{a}_dx_m", f"{a}_dy_m", f"{a}_dz_m", f"{a}_soil_ratio", f"{a}_ground_rotation_rad"]
    with path.open("w", newline="") as fh:
        w = csv.writer(fh)
        w.writerow(head)
        for label, p in result.passes.items():
            for i, st in enumerate(p.stations):
                row = [label, i, st.s, st.along, *st.rider, st.sag, st.tension_start,
                       st.tension_end, st.tension_max]
                for a in anchors:
                    row += [*st.anchor_disp[a], st.soil_ratio.get(a, ""), st.ground_rotation.get(a, "")]
                w.writerow([f"{v:.6g}" if isinstance(v, (float, np.floating)) else v for v in row])


def _write_series(folder: Path, model, label: str, p) -> list[str]:
    from spanstay.fem import write_pvd, write_vtu

    files = []
    stem = "".join(ch if ch.isalnum() or ch in "-_" else "_" for ch in label)
    for i, state in enumerate(p.states):
        name = f"{stem}_{i:03d}.vtu"
        write_vtu(folder / name, model, state)
        files.append(f"vtk/{name}")
        test_pause()
    write_pvd(folder / f"{stem}.pvd", [(st.along, Path(f).name) for st, f in zip(p.stations, files)])
    return files


def _write_vtk(folder: Path, result) -> dict:
    """The installed state and the series of every pass whose states were kept."""
    from spanstay.fem import write_vtu

    folder.mkdir()
    model = result.system.model
    write_vtu(folder / "installed.vtu", model, result.installed)
    out = {"installed": {"file": "vtk/installed.vtu"}}
    for label, p in result.passes.items():
        if p.states:
            files = _write_series(folder, model, label, p)
            out[label] = {"pvd": files[0].rsplit("_", 1)[0] + ".pvd" if files else None, "files": files,
                          "along": [st.along for st in p.stations]}
    return out


def soil_profiles(result) -> dict:
    """Soil reaction along each footing at the design pass's station that loads it most."""
    from spanstay.models.parts.footing import footing_response

    design = result.passes["design"]
    out = {}
    for name, anchor in result.system.anchors.items():
        if anchor.footing is None or not design.states:
            continue
        ratios = [st.soil_ratio.get(name, 0.0) for st in design.stations]
        k = int(np.argmax(ratios))
        line = result.system.lines[result.scenario.rider.line]
        pull = (line.end_xyz - line.start_xyz)[:2]
        direction = pull if name == line.spec.end else -pull
        dsys = result.design_system or result.system
        r = footing_response(dsys.anchors[name].footing, dsys.model, design.states[k], direction)
        out[anchor.footing.member_group] = {
            "anchor": name, "station": k, "along": design.stations[k].along,
            "depth": r.depth, "p": r.p, "p_ultimate": r.p_ultimate, "ratio": r.ratio,
            "displacement": r.displacement, "moment": r.moment, "shear": r.shear,
            "ground_rotation": r.ground_rotation, "rotation_point_depth": r.rotation_point_depth}
    return out


def _write_plots(folder: Path, result, units: str) -> dict[str, str]:
    from spanstay.models.outputs.ride_plots import plot_ride_profile, plot_speed, plot_tension

    folder.mkdir()
    sc = result.scenario
    plots = {}
    heavy = result.passes["ride_heavy"]
    if len(heavy.stations) >= 2:
        along = np.array([s.along for s in heavy.stations])
        z = np.array([s.rider[2] for s in heavy.stations])
        gd = [g[0] for g in sc.ground.profile]
        gz = [g[1] for g in sc.ground.profile]
        plot_ride_profile(folder / "ride_profile.png", along, z, sc.rider.hang_distance, gd, gz,
                          result.clearance, units=units)
        plots["ride_profile"] = "plots/ride_profile.png"
    if result.rides:
        plot_speed(folder / "speed.png", {f"{k} rider": r for k, r in result.rides.items()}, units=units)
        plots["speed"] = "plots/speed.png"
    series = {}
    names = {"ride_light": "lightest rider", "ride_heavy": "heaviest rider",
             "hot": "heaviest rider, hottest day",
             "design": f"design: heaviest x {sc.rider.dynamic_factor:g}, coldest day"}
    for label, p in result.passes.items():
        if p.stations and label in names:
            series[names[label]] = (np.array([s.along for s in p.stations]),
                                    np.array([s.tension_max for s in p.stations]))
    if series:
        d0 = next(iter(series.values()))[0]
        rope = result.system.lines[sc.rider.line].spec.rope
        plot_tension(folder / "tension.png", d0, {k: v[1] for k, v in series.items() if len(v[1]) == len(d0)},
                     title="Largest cable tension with the rider along the line",
                     allowable=rope.breaking_strength / sc.settings.factor_of_safety, units=units)
        plots["tension"] = "plots/tension.png"
    return plots


def _note(message: str) -> None:
    print(f"spanstay: note: {message}", file=sys.stderr)


def write_results(result, out_dir: Path, scenario_file: str, units: str,
                  notify: Callable[[str], None] = _note) -> Path:
    """Write every output of a run into ``out_dir`` (swapped in only when all is written).

    Raises
    ------
    InputError
        (where ``--out``) when ``out_dir`` is not a folder spanstay may replace;
        nothing is written or deleted then.
    """
    from spanstay.models.outputs.report import write_report

    out_dir = check_target(out_dir, scenario_file or None)
    out_dir.parent.mkdir(parents=True, exist_ok=True)
    with signals_deferred():
        clean_stale(out_dir, notify)
        tmp = make_temp(out_dir)
        start_marker(tmp)
    swapped = False
    try:
        vtk = _write_vtk(tmp / "vtk", result)
        plots = _write_plots(tmp / "plots", result, units)
        test_pause()
        summary = build_summary(result, scenario_file, units, vtk, plots)
        _write_csv(tmp / "stations.csv", result)
        test_pause()
        (tmp / "summary.json").write_text(json.dumps(summary, indent=1, allow_nan=False))
        write_report(tmp, summary)  # reads the folder; adds its own figures to summary["plots"]
        (tmp / "summary.json").write_text(json.dumps(summary, indent=1, allow_nan=False))
        test_pause()
        with signals_deferred():  # a signal now waits until the swap and the tidy are done
            finish_marker(tmp)
            check_target(out_dir, scenario_file or None)  # again: the folder may have changed
            aside = swap_into_place(tmp, out_dir)
            swapped = True
            if aside is not None:
                test_pause()
                retire(aside, out_dir, notify)
    except BaseException:
        if not swapped:
            with signals_deferred():
                retire(tmp, out_dir, notify)
        raise
    return out_dir
