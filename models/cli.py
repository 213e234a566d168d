"""The ``spanstay`` command line. Heavy libraries are imported inside commands."""
from __future__ import annotations

import sys

import click


def _fail(exc: Exception) -> None:
    click.echo(f"spanstay: error: {exc}", err=True)
    sys.exit(2)


@click.group(context_settings={"help_option_names": ["-h", "--help"]})
@click.version_option(package_name="spanstay")
def main() -> None:
    """spanstay: check cable rides and cable-anchored posts before anyone rides.

    Results are for preliminary design only. People ride these systems: have a
    qualified engineer review every design and follow local codes and the
    applicable standards.
    """
