"""The ``spanstay`` command line. Heavy libraries are imported inside commands."""
from __future__ import annotations

import signal
import sys

import click

# ending signals a run treats like Ctrl-C, so that its clean-up runs (see results_swap)
_ENDING_SIGNALS = ("SIGTERM", "SIGHUP", "SIGQUIT", "SIGUSR1", "SIGUSR2", "SIGALRM", "SIGXCPU",
                   "SIGXFSZ", "SIGVTALRM", "SIGPROF")


class Stopped(KeyboardInterrupt):
    """An ending signal, raised where the program is, like Ctrl-C's KeyboardInterrupt."""

    def __init__(self, signum: int) -> None:
        super().__init__(signum)
        self.signum = signum


def _raise_stopped(signum: int, frame) -> None:
    raise Stopped(signum)


class _Commands(click.Group):
    """The command group; ending signals become KeyboardInterrupt while a command runs,
    and an interrupted command says so and exits 128 + the signal number."""

    def invoke(self, ctx: click.Context):
        before = {}
        for name in _ENDING_SIGNALS:
            num = getattr(signal, name, None)
            if num is not None and signal.getsignal(num) is signal.SIG_DFL:
                try:
                    before[num] = signal.signal(num, _raise_stopped)
                except ValueError:  # not the main thread: leave signals alone
                    break
        try:
            return super().invoke(ctx)
        except KeyboardInterrupt as exc:
            num = getattr(exc, "signum", signal.SIGINT)
            click.echo(f"\nspanstay: stopped by {signal.Signals(num).name} before finishing; no "
                       "verdict was reached and nothing was left half-written", err=True)
            sys.exit(128 + num)
        finally:
            for num, handler in before.items():
                signal.signal(num, handler)


def _fail(exc: Exception) -> None:
    click.echo(f"spanstay: error: {exc}", err=True)
    sys.exit(2)


@click.group(cls=_Commands, context_settings={"help_option_names": ["-h", "--help"]})
@click.version_option(package_name="spanstay")
def main() -> None:
    """spanstay: check cable rides and cable-anchored posts before anyone rides.

    Results are for preliminary design only. People ride these systems: have a
    qualified engineer review every design and follow local codes and the
    applicable standards.
    """


@main.command("init")
@click.argument("file", type=click.Path(dir_okay=False))
@click.option("--layout", default="two-posts", show_default=True, metavar="NAME",
              help="Starter layout: two-posts, guyed, braced, h-brace or tree.")
@click.option("--force", is_flag=True, help="Overwrite FILE if it exists.")
def init(file: str, layout: str, force: bool) -> None:
    """Write a commented starter scenario to FILE."""
    from spanstay.models.common.errors import InputError
    from spanstay.models.scenario.starter import write_starter

    try:
        path = write_starter(file, layout, force)
    except InputError as exc:
        _fail(exc)
    click.echo(f"wrote {path} (layout {layout}); edit it, then run: spanstay validate {path}")


def _nominal_length(scenario, line) -> float:
    """An unstressed length good enough to build the model for a check: the
    chord plus a little slack (the real one is found when solving)."""
    from spanstay.models.analysis.installed import line_geometry

    if line.unstressed_length is not None:
        return line.unstressed_length
    span, drop = line_geometry(scenario, line)
    return float((span**2 + drop**2) ** 0.5 * 1.001)


@main.command("validate")
@click.argument("file", type=click.Path(dir_okay=False))
@click.option("--units", type=click.Choice(["us", "si"]), default=None,
              help="Units for the summary (default: the scenario's settings.units).")
def validate(file: str, units: str | None) -> None:
    """Read and check scenario FILE without solving; print what was read.

    The structure is also built (not solved), so geometry that only shows when
    the parts are put together (a brace foot inside its post, a guy above the
    top) is reported here too.
    """
    from spanstay.fem.errors import FemError
    from spanstay.models.common.errors import InputError
    from spanstay.models.scenario.read import load_scenario
    from spanstay.models.scenario.summary import summary_text
    from spanstay.models.parts.system import build_system

    try:
        scenario = load_scenario(file)
        build_system(scenario, {line.name: _nominal_length(scenario, line) for line in scenario.lines})
    except (InputError, FemError) as exc:
        _fail(exc)
    click.echo(summary_text(scenario, units or scenario.settings.units))
    for where, accepted in scenario.placeholders:
        click.echo(f"note: {where} is a placeholder"
                   + (" (accepted: checks that use it are listed as not checked)" if accepted
                      else "; replace it with your own value before `spanstay run`"))
    click.echo("valid")


@main.command("run")
@click.argument("file", type=click.Path(dir_okay=False))
@click.option("--out", "out_dir", type=click.Path(file_okay=False), default=None,
              help="Results folder (default: <scenario>_results next to the scenario).")
@click.option("--units", type=click.Choice(["us", "si"]), default=None,
              help="Units of the terminal summary (default: the scenario's preference).")
@click.option("--stations", type=click.IntRange(2, 2000), default=None,
              help="Rider stations along the line (default: the scenario's).")
@click.option("--workers", type=click.IntRange(1, 64), default=None, metavar="N",
              help="Processes running the passes side by side (default: one per pass, at "
                   "most the cores; 1 runs them one after another).")
def run(file: str, out_dir: str | None, units: str | None, stations: int | None,
        workers: int | None) -> None:
    """Hang the line, move the riders along it, and check every part.

    Exit status: 0 every check passes (the analysis complete); 3 some check fails;
    4 the analysis is incomplete (a pass stopped early); 2 bad input or usage.
    """
    from pathlib import Path

    from spanstay.fem.errors import FemError
    from spanstay.models.common.errors import InputError
    from spanstay.models.outputs.results_folder import write_results
    from spanstay.models.analysis.run import pass_count
    from spanstay.models.api import analyse
    from spanstay.models.scenario.read import load_scenario
    from spanstay.models.outputs.terminal import summary_lines

    from spanstay.models.outputs.results_swap import check_target

    path = Path(file)
    try:
        check_target(Path(out_dir) if out_dir else path.with_name(f"{path.stem}_results"), path)
        scenario = load_scenario(path)
        units = units or scenario.settings.units
        if scenario.rider is None:
            raise InputError("a [rider] table is needed to run the line", "rider")
        count = stations or scenario.rider.stations
        with click.progressbar(length=pass_count(scenario) * count, label="rider stations",
                               file=sys.stderr) as bar:
            result = analyse(scenario, stations=count, progress=lambda label, n: bar.update(n),
                             workers=workers)
        target = Path(out_dir) if out_dir else path.with_name(f"{path.stem}_results")
        written = write_results(result, target, str(path), units)
    except (InputError, FemError, OSError) as exc:
        _fail(exc)
        return
    except Exception as exc:  # noqa: BLE001 - a user never sees a traceback
        click.echo(f"spanstay: internal error ({type(exc).__name__}: {exc}); nothing was written. "
                   "Please report it with the scenario file.", err=True)
        sys.exit(1)
    click.echo("\n".join(summary_lines(result, written, units)))
    sys.exit(result.verdict.exit_code)


@main.command("view")
@click.argument("results", type=click.Path(file_okay=False))
@click.option("--station", type=int, default=None, metavar="K",
              help="Station to show, 0 to n-1 as in the vtk file names (default: the worst).")
@click.option("--worst", is_flag=True, help="Show the station of the governing check.")
@click.option("--exaggerate", type=float, default=None, metavar="X",
              help="Scale post and footing movement by X (default: automatic; 1 = true scale).")
@click.option("--color", "color", default="utilization", show_default=True, metavar="FIELD",
              help="Colour by: utilization, N, My, Mz, moment, tension, soil, displacement.")
@click.option("--png", type=click.Path(dir_okay=False), default=None, help="Write a PNG off-screen.")
@click.option("--gif", type=click.Path(dir_okay=False), default=None,
              help="Write an animation of the rider moving along the line, off-screen.")
@click.option("--frames", type=int, default=None, metavar="N",
              help="GIF frames, spread evenly over the stations (default: every station).")
@click.option("--size", default="1200x800", show_default=True, metavar="WxH",
              help="Picture size in pixels.")
def view(results: str, station: int | None, worst: bool, exaggerate: float | None, color: str,
         png: str | None, gif: str | None, frames: int | None, size: str) -> None:
    """Show a results folder in 3D: the deformed structure with the rider on the line."""
    from spanstay.models.common.errors import InputError
    from spanstay.models.outputs.view import run_view

    try:
        said = run_view(results, station, worst, exaggerate, color, png, gif, frames, size)
    except InputError as exc:
        _fail(exc)
        return
    for line in said:
        click.echo(line)
