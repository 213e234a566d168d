"""report.html: one self-contained page a reviewer can read, on screen or printed.

``write_report(out_dir, summary)`` is called by ``spanstay run`` at the end of a
run. It draws the report's own figures into ``out_dir/plots`` (slack budget,
soil reaction, member moments, cable profiles, a 3D line drawing), embeds
every PNG of ``out_dir/plots`` as base64, and links nothing outside itself.
"""
from __future__ import annotations

import base64
import datetime as _dt
from html import escape
from pathlib import Path

from spanstay.models.outputs.report_inputs import input_tables
from spanstay.models.outputs.display_units import number, show

#: figures the report draws (file name in plots/, caption)
OWN_FIGURES = {
    "structure_3d": "The deformed structure at the governing station.",
    "slack_budget": "Slack budget: the sag each part adds at the rider.",
    "cable_profiles": "The cable as hung and under the heaviest rider.",
    "posts_and_footings": "Bending moments along the posts and footings (each ply of a laminated "
                          "post carries its own moment; the couple of the ply forces is not "
                          "included), and the lateral soil reaction along each footing, at the "
                          "governing station.",
}
#: figures from the run, in the order shown (others follow)
RUN_FIGURES = {"ride_profile": "Ride profile and the least clearance of the feet above ground.",
               "speed": "Rider speed along the line.",
               "tension": "Cable tension along the line."}

CSS = """
body { font-family: Georgia, 'Times New Roman', serif; color: #2b2d33; background: #fbfaf6;
       max-width: 1050px; margin: 1.5em auto; padding: 0 1em; line-height: 1.35; }
h1 { font-size: 1.6em; margin-bottom: 0.1em; }
h2 { font-size: 1.2em; border-bottom: 2px solid #33506b; padding-bottom: 0.15em; margin-top: 1.6em; }
h3 { font-size: 1.0em; margin: 1em 0 0.3em; }
.meta { color: #5b5d63; font-size: 0.9em; }
.cautions { border: 2px solid #a8322d; background: #f7ebe4; padding: 0.6em 1em; margin: 1em 0; }
.cautions h2 { border: none; margin: 0 0 0.3em; color: #a8322d; }
.verdict { font-size: 1.1em; font-weight: bold; padding: 0.4em 0.8em; display: inline-block; }
.verdict.fail { background: #f4d9d4; color: #7d1f1a; }
.verdict.pass { background: #dcead6; color: #2f5a2b; }
table { border-collapse: collapse; width: 100%; font-size: 0.85em; margin: 0.4em 0 1em; }
th, td { border: 1px solid #d9d3c3; padding: 0.25em 0.45em; text-align: left; vertical-align: top; }
thead th { background: #ece6d6; }
table.inputs th { width: 40%; font-weight: normal; color: #44464c; background: #f3efe4; }
td.num { text-align: right; white-space: nowrap; }
tr.fail td.result { background: #f4d9d4; color: #7d1f1a; font-weight: bold; }
tr.pass td.result { background: #dcead6; color: #2f5a2b; }
tr.none td.result { background: #ece6d6; }
td.small { font-size: 0.85em; color: #55575d; }
figure { margin: 1em 0; page-break-inside: avoid; break-inside: avoid; }
figure img { max-width: 100%; border: 1px solid #d9d3c3; }
figcaption { font-size: 0.85em; color: #55575d; }
@media print {
  body { background: white; max-width: none; margin: 0; font-size: 10pt; }
  .cautions { background: white; }
  h2 { page-break-after: avoid; break-after: avoid; }
  tr, figure { page-break-inside: avoid; break-inside: avoid; }
  thead { display: table-header-group; }
  a { color: inherit; text-decoration: none; }
}
"""


def _img(path: Path, alt: str) -> str:
    data = base64.b64encode(path.read_bytes()).decode("ascii")
    return f'<img alt="{escape(alt)}" src="data:image/png;base64,{data}">'


def _figure(path: Path, caption: str) -> str:
    return f"<figure>{_img(path, caption)}<figcaption>{escape(caption)}</figcaption></figure>"


def _result_class(check: dict) -> tuple[str, str]:
    passed = check.get("passed")
    if passed is True:
        return "pass", "PASS"
    if passed is False:
        return "fail", "FAIL"
    return "none", "n/a"


def _quantity(value, kind: str | None, units: str) -> str:
    if value is None:
        return "–"
    if not isinstance(value, (int, float)):
        return escape(str(value))
    if kind in ("force", "stress", "length", "angle", "speed", "moment", "energy"):
        return escape(show(float(value), kind, units))
    if kind == "acceleration":
        return escape(f"{float(value) / 9.80665:.2f} g")
    return escape(number(float(value)))


def check_table(checks: list[dict], units: str) -> str:
    """The check table: every check with demand, capacity, utilization and pass/fail."""
    if not checks:
        return "<p>No checks were made.</p>"
    rows = ["<table class='checks'><thead><tr><th>result</th><th>utilization</th><th>check</th>"
            "<th>where</th><th>demand</th><th>capacity</th><th>governing case</th>"
            "<th>source and note</th></tr></thead><tbody>"]
    order = sorted(range(len(checks)), key=lambda i: (checks[i].get("passed") is not False,
                                                      -(checks[i].get("utilization") or 0.0)))
    for i in order:
        c = checks[i]
        cls, word = _result_class(c)
        gov = c.get("governing") or {}
        bits = []
        if gov.get("pass"):
            bits.append(f"pass {gov['pass']}")
        if gov.get("rider_weight") is not None:
            bits.append(f"rider {show(gov['rider_weight'], 'force', units)}")
        if gov.get("station") is not None:
            bits.append(f"station {gov['station']}")
        if gov.get("along") is not None:
            bits.append(f"{show(gov['along'], 'length', units)} along")
        kind = c.get("kind")
        util = c.get("utilization")
        source = escape(str(c.get("source") or ""))
        note = escape(str(c.get("note") or ""))
        rows.append(
            f"<tr class='{cls}'><td class='result'>{word}</td>"
            f"<td class='num'>{escape(number(util)) if util is not None else '–'}</td>"
            f"<td><code>{escape(str(c.get('id', '')))}</code><br>"
            f"{escape(str(c.get('description') or ''))}</td>"
            f"<td>{escape(str(c.get('where') or c.get('part') or ''))}</td>"
            f"<td class='num'>{_quantity(c.get('demand'), kind, units)}</td>"
            f"<td class='num'>{_quantity(c.get('capacity'), kind, units)}</td>"
            f"<td class='small'>{escape(', '.join(bits))}</td>"
            f"<td class='small'>{source}{'<br><em>' + note + '</em>' if note else ''}</td></tr>")
    rows.append("</tbody></table>")
    return "\n".join(rows)


def _seconds(ride: dict) -> str:
    t = ride.get("arrival_time", ride.get("time"))
    return f"{number(float(t))} s" if isinstance(t, (int, float)) else "–"


def _ride_table(summary: dict, units: str) -> str:
    ride = summary.get("ride") or {}
    rows = []
    for label, r in ride.items():
        if label == "clearance" or not isinstance(r, dict):
            continue
        stop = r.get("stopped_at")
        rows.append(f"<tr><th>{escape(label)} rider</th>"
                    f"<td class='num'>{show(r.get('top_speed'), 'speed', units)}</td>"
                    f"<td class='num'>{show(r.get('top_speed_at'), 'length', units)}</td>"
                    f"<td class='num'>{show(r.get('arrival_speed'), 'speed', units)}</td>"
                    f"<td class='num'>{_seconds(r)}</td>"
                    f"<td>{'stops at ' + show(stop, 'length', units) if stop is not None else 'reaches the end'}"
                    f"</td></tr>")
    html = ""
    if rows:
        html += ("<table><thead><tr><th>rider</th><th>top speed</th><th>at</th><th>arrival speed</th>"
                 "<th>time</th><th>end</th></tr></thead><tbody>" + "".join(rows) + "</tbody></table>")
    c = ride.get("clearance")
    if isinstance(c, dict) and c.get("min") is not None:
        html += (f"<p>Least clearance of the rider's feet above the ground: "
                 f"<strong>{show(c['min'], 'length', units)}</strong> at "
                 f"{show(c.get('at'), 'length', units)} along the line.</p>")
    return html


def _passes_table(summary: dict, units: str) -> str:
    rows = []
    for label, p in (summary.get("passes") or {}).items():
        if not isinstance(p, dict):
            continue
        tmax = [t for t in (p.get("tension_max") or []) if t is not None]
        fail = p.get("failed_at")
        rows.append(f"<tr><th>{escape(label)}</th><td class='num'>{show(p.get('weight'), 'force', units)}</td>"
                    f"<td class='num'>{show(p.get('temperature'), 'temperature', units)}</td>"
                    f"<td class='num'>{p.get('stations', '–')}</td>"
                    f"<td class='num'>{show(max(tmax), 'force', units) if tmax else '–'}</td>"
                    f"<td>{'stopped at ' + show(fail, 'length', units) + ': ' + escape(str(p.get('failure') or '')) if fail is not None else 'all stations solved'}</td></tr>")
    if not rows:
        return ""
    return ("<table><thead><tr><th>pass</th><th>rider weight</th><th>temperature</th><th>stations</th>"
            "<th>largest tension</th><th>solution</th></tr></thead><tbody>" + "".join(rows)
            + "</tbody></table>")


def _installed_table(summary: dict, units: str) -> str:
    lines = ((summary.get("installed") or {}).get("lines")) or {}
    rows = [f"<tr><th>{escape(n)}</th><td class='num'>{show(v.get('unstressed_length'), 'length', units)}</td>"
            f"<td class='num'>{show(v.get('sag'), 'length', units)}</td>"
            f"<td class='num'>{show(v.get('tension_start'), 'force', units)}</td>"
            f"<td class='num'>{show(v.get('tension_end'), 'force', units)}</td></tr>"
            for n, v in lines.items() if isinstance(v, dict)]
    if not rows:
        return ""
    return ("<table><thead><tr><th>line</th><th>unstressed length</th><th>installed sag</th>"
            "<th>tension at start</th><th>tension at end</th></tr></thead><tbody>" + "".join(rows)
            + "</tbody></table>")


def _own_figures(out_dir: Path, summary: dict, units: str) -> tuple[dict[str, Path], list[str]]:
    """Draw the report's figures into out_dir/plots; returns them and notes for the reader.

    A figure that cannot be drawn is left out with a note (the report must be
    written at the end of every run, whatever the results hold).
    """
    from spanstay.models.common.errors import InputError
    from spanstay.models.outputs import report_plots as rp
    from spanstay.models.outputs.view_data import load_results, utilization_by_part

    plots = out_dir / "plots"
    plots.mkdir(parents=True, exist_ok=True)
    made: dict[str, Path] = {}
    notes: list[str] = []

    def draw(key: str, make) -> None:
        try:
            p = make()
        except Exception as exc:  # noqa: BLE001 - reported in the page, never fatal
            notes.append(f"The figure '{key}' could not be drawn ({type(exc).__name__}: {exc}).")
            return
        if p:
            made[key] = p

    budget = summary.get("slack_budget")
    if isinstance(budget, dict):
        draw("slack_budget", lambda: rp.slack_budget(plots / "slack_budget.png", budget, units))
    try:
        results = load_results(out_dir)
        k = results.worst_station()
        st = results.station(k)
    except InputError as exc:
        return made, notes + [f"No 3D results to draw from: {exc}"]
    notes.insert(0, f"Figures of one station show pass '{results.pass_label}', station {k} of "
                    f"0..{results.n_stations - 1} ({show(st.along, 'length', units)} along), the "
                    f"station nearest the governing check.")
    draw("structure_3d", lambda: rp.structure_3d(plots / "structure_3d.png", results, st,
                                                 utilization_by_part(results), units))
    n = results.n_stations
    picks = sorted({0, n // 4, n // 2, (3 * n) // 4, n - 1, k} & set(range(n)))
    draw("cable_profiles", lambda: rp.cable_profiles(
        plots / "cable_profiles.png", results, [results.station(i) for i in picks], units))
    draw("posts_and_footings", lambda: rp.posts_and_footings(
        plots / "posts_and_footings.png", results, st, units))
    return made, notes


def write_report(out_dir: Path, summary: dict) -> Path:
    """Write ``out_dir/report.html`` from ``summary`` and the folder's plots and .vtu files.

    Parameters
    ----------
    out_dir
        The results folder (summary.json, vtk/, plots/).
    summary
        The summary.json content. Its "plots" gains the report's own figures
        (structure_3d, slack_budget, cable_profiles, posts_and_footings) so a
        caller writing summary.json afterwards lists them too.

    Returns
    -------
    Path
        The report written.
    """
    out_dir = Path(out_dir)
    units = "us" if summary.get("units") == "us" else "si"
    own, notes = _own_figures(out_dir, summary, units)
    run_plots = {}
    for key, rel in (summary.get("plots") or {}).items():
        path = out_dir / str(rel)
        if key not in own and path.is_file() and path.suffix.lower() == ".png":
            run_plots[key] = path
    if "speed" not in run_plots and isinstance(summary.get("ride"), dict):
        from spanstay.models.outputs import report_plots as rp
        try:
            p = rp.ride_speed(out_dir / "plots" / "speed.png", summary["ride"], units)
        except Exception as exc:  # noqa: BLE001 - reported in the page, never fatal
            p = None
            notes.append(f"The speed figure could not be drawn ({type(exc).__name__}: {exc}).")
        if p:
            own["speed"] = run_plots["speed"] = p
    if not isinstance(summary.get("plots"), dict):
        summary["plots"] = {}
    for key, path in own.items():  # the same figures as PNG files in the results folder
        summary["plots"].setdefault(key, f"plots/{path.name}")

    project = summary.get("project") or {}
    name = project.get("name") or "spanstay results"
    checks = summary.get("checks") or []
    failed = [c for c in checks if c.get("passed") is False]
    unknown = [c for c in checks if c.get("passed") is None]
    cautions = summary.get("cautions") or [
        "Results are for preliminary design only; a qualified (licensed) engineer must review."]
    version = (summary.get("spanstay") or {}).get("version", "")
    stamp = _dt.datetime.now(_dt.timezone.utc).strftime("%Y-%m-%d %H:%M UTC")

    parts = ["<!DOCTYPE html>", "<html lang='en'><head><meta charset='utf-8'>",
             f"<title>{escape(name)}: spanstay report</title>", f"<style>{CSS}</style>",
             "</head><body>", f"<h1>{escape(name)}</h1>",
             f"<p class='meta'>{escape(project.get('notes') or '')}<br>Scenario "
             f"<code>{escape(str(summary.get('scenario_file') or ''))}</code>; spanstay "
             f"{escape(str(version))}; written {stamp}; units {'US customary' if units == 'us' else 'SI'}.</p>",
             "<section class='cautions'><h2>Cautions</h2><ul>"]
    parts += [f"<li>{escape(str(c))}</li>" for c in cautions]
    parts.append("</ul></section>")
    verdict = summary.get("verdict") or {}
    for inc in verdict.get("incomplete") or []:  # a pass that stopped early comes first
        parts.append(
            f"<p class='verdict fail'>ANALYSIS INCOMPLETE: pass {escape(str(inc['pass_name']))} "
            f"({escape(str(inc['purpose']))}, rider {show(inc['rider_weight'], 'force', units)}) "
            f"found no equilibrium with the rider {show(inc['at'], 'length', units)} along the "
            f"cable after {inc['stations_solved']} of {inc['stations']} stations; largest "
            f"imbalance in {escape(str(inc['gave_way']))}. No check or ride figure uses this "
            "pass.</p>")
    if verdict:
        cls = "pass" if verdict.get("status") == "pass" else "fail"
        parts.append(f"<p class='verdict {cls}'>{escape(str(verdict.get('line', '')))}</p>")
    elif checks:
        cls = "fail" if failed else "pass"
        text = (f"{len(failed)} of {len(checks)} checks FAIL" if failed
                else f"all {len(checks) - len(unknown)} rated checks pass")
        parts.append(f"<p class='verdict {cls}'>{escape(text)}</p>")
    parts.append("<h2>Checks</h2>")
    parts.append("<p>Utilization is demand over capacity (at most 1 passes); failed checks come "
                 "first, then the others from the most to the least utilized.</p>")
    parts.append(check_table(checks, units))
    not_checked = verdict.get("not_checked") or []
    if not_checked:
        parts.append("<h2>Not checked</h2><p>These were not checked by this run; each needs "
                     "its own assessment before anyone rides.</p><ul class='not-checked'>")
        parts += [f"<li><strong>{escape(str(n['part']))}</strong>: {escape(str(n['what']))}: "
                  f"{escape(str(n['reason']))}</li>" for n in not_checked]
        parts.append("</ul>")

    parts.append("<h2>The structure</h2>")
    parts += [f"<p>{escape(n)}</p>" for n in notes]
    for key in ("structure_3d", "posts_and_footings"):
        if key in own:
            parts.append(_figure(own[key], OWN_FIGURES[key]))

    parts.append("<h2>The line</h2>")
    parts.append(_installed_table(summary, units))
    if "cable_profiles" in own:
        parts.append(_figure(own["cable_profiles"], OWN_FIGURES["cable_profiles"]))
    if "slack_budget" in own:
        parts.append(_figure(own["slack_budget"], OWN_FIGURES["slack_budget"]))
        notes = (summary.get("slack_budget") or {}).get("notes") or []
        parts += [f"<p class='meta'>{escape(str(n))}</p>" for n in notes]
    parts.append(_passes_table(summary, units))

    parts.append("<h2>The ride</h2>")
    parts.append(_ride_table(summary, units))
    limits = summary.get("ride_limits") or {}
    if limits.get("text"):
        parts.append("<h3>Ride limits, brake and the stop</h3><ul>"
                     + "".join(f"<li>{escape(str(t))}</li>"
                               for t in limits["text"] + limits.get("stop_text", []))
                     + "</ul>")
    for key, caption in RUN_FIGURES.items():
        if key in run_plots:
            parts.append(_figure(run_plots[key], caption))
    for key, path in run_plots.items():
        if key not in RUN_FIGURES:
            parts.append(_figure(path, key.replace("_", " ")))

    parts.append("<h2>Inputs</h2>")
    parts.append("<p>The scenario as read, in the report's units.</p>")
    parts.append(input_tables(summary.get("inputs") or {}, units))
    parts.append("<section class='cautions'><h2>Before anyone rides</h2><ul>")
    parts += [f"<li>{escape(str(c))}</li>" for c in cautions]
    parts.append("</ul></section></body></html>")
    path = out_dir / "report.html"
    path.write_text("\n".join(parts), encoding="utf-8")
    return path
