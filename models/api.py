"""The public Python API of spanstay, for notebooks and scripts.

Load a scenario from a file or a dict, analyse it, read the results as plain data,
write the results folder::

    import spanstay
    scenario = spanstay.load("site.toml")          # or spanstay.load({...}) from a dict
    result = spanstay.analyse(scenario, stations=20)
    data = spanstay.results(result)                # plain dicts, lists and numbers (SI)
    [c["id"] for c in data["checks"] if not c["passed"]]
    spanstay.write_results(result, "site_results", units="si")

Every value inside is SI. Bad input raises :class:`InputError` with the key path;
the engine raises :class:`FemError` subclasses.
"""
from __future__ import annotations

from pathlib import Path
from typing import Any, Callable

from spanstay.fem.errors import FemError
from spanstay.models.analysis.load_cases import LoadCase, load_cases
from spanstay.models.analysis.run import RunResult
from spanstay.models.analysis.run import analyse as _analyse_passes
from spanstay.models.checks.collect import run_verdict
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.read import load_scenario, read_scenario
from spanstay.models.scenario.spec import Scenario

__all__ = ["FemError", "InputError", "LoadCase", "RunResult", "Scenario", "analyse", "load",
           "load_cases", "results", "write_results"]


def load(source: str | Path | dict[str, Any], name: str = "scenario") -> Scenario:
    """A checked scenario from a TOML file path, or from a dict shaped like one.

    ``name`` is the project name used when a dict has no ``[project]`` name.
    """
    if isinstance(source, dict):
        return read_scenario(source, default_name=name)
    return load_scenario(source)


def analyse(scenario: Scenario | str | Path | dict[str, Any], stations: int | None = None,
            progress: Callable[[str, int], None] | None = None,
            slack_budget: bool = True, workers: int | None = None) -> RunResult:
    """Run every load case of a scenario, then every check.

    Parameters
    ----------
    scenario
        A :class:`Scenario`, or anything :func:`load` takes.
    stations
        Rider stations per pass (default: the scenario's).
    progress
        Called as ``progress(pass_name, 1)`` after each solved station.
    slack_budget
        Work out the slack budget (several extra solves).
    workers
        Processes running the load cases side by side (default: one per case,
        at most the cores available; 1 forces a serial run). Same answers.
    """
    if not isinstance(scenario, Scenario):
        scenario = load(scenario)
    refuse_open_placeholders(scenario)
    result = _analyse_passes(scenario, stations=stations, progress=progress,
                             slack_budget=slack_budget, workers=workers)
    result.verdict = run_verdict(result)
    result.checks = result.verdict.checks
    return result


def refuse_open_placeholders(scenario: Scenario) -> None:
    """InputError for the first placeholder value the user has neither replaced nor accepted."""
    for where, accepted in scenario.placeholders:
        if not accepted:
            raise InputError("this value is a placeholder from the starter, not a property of "
                             "your site: replace it with your own (assessed) value, or write "
                             "accepted = true in its table to run with it (the checks that use "
                             "it are then listed as not checked, never as a pass)", where)


def results(result: RunResult, units: str = "si") -> dict[str, Any]:
    """The run's results as plain data (what summary.json holds; values SI).

    Keys include ``checks`` (a list of dicts with id, part, demand, capacity,
    utilization, passed, governing, source), ``passes`` (per pass: weight,
    temperature, per-station arrays), ``ride``, ``slack_budget``, ``installed``.
    """
    from spanstay.models.outputs.results_folder import build_summary

    return build_summary(result, scenario_file="", units=units, vtk={}, plots={})


def write_results(result: RunResult, folder: str | Path, units: str = "us",
                  scenario_file: str = "") -> Path:
    """Write the results folder (summary.json, stations.csv, VTK, plots, report.html).

    ``folder`` must be new, empty, or a results folder spanstay wrote that holds
    only its own unchanged files; anything else raises InputError (where
    ``--out``) and nothing is touched. See DEVELOPERS.md, "The results folder".
    """
    from spanstay.models.outputs.results_folder import write_results as _write

    return _write(result, Path(folder), scenario_file, units)
