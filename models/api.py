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
from spanstay.models.checks.collect import run_checks
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
            slack_budget: bool = True) -> RunResult:
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
    """
    if not isinstance(scenario, Scenario):
        scenario = load(scenario)
    result = _analyse_passes(scenario, stations=stations, progress=progress,
                             slack_budget=slack_budget)
    result.checks = run_checks(result)
    return result


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
