"""Commented starter scenarios written by ``spanstay init`` (models/scenario/layouts/*.toml)."""
from __future__ import annotations

from importlib import resources
from pathlib import Path

from spanstay.models.common.errors import InputError

#: Layout names, each a file models/scenario/layouts/NAME.toml.
LAYOUTS = ("two-posts", "guyed", "braced", "h-brace", "tree")


def layout_text(name: str) -> str:
    """The starter scenario text of layout ``name``."""
    if name not in LAYOUTS:
        from spanstay.models.common.errors import did_you_mean
        raise InputError(f'no layout "{name}"{did_you_mean(name, LAYOUTS)}', "--layout")
    return resources.files("spanstay.models.scenario").joinpath(f"layouts/{name}.toml").read_text("utf-8")


def write_starter(path: str | Path, layout: str = "two-posts", force: bool = False) -> Path:
    """Write a starter scenario to ``path``.

    Raises
    ------
    InputError
        Unknown layout; the file exists and ``force`` is False; the folder
        does not exist.
    """
    path = Path(path)
    text = layout_text(layout)
    if path.is_dir():
        raise InputError(f"{path} is a folder; give a file name such as line.toml")
    if path.exists() and not force:
        raise InputError(f"{path} already exists; use --force to overwrite it")
    if not path.parent.is_dir():
        raise InputError(f"folder {path.parent} does not exist")
    try:
        path.write_text(text, encoding="utf-8")
    except OSError as exc:
        raise InputError(f"cannot write {path}: {exc.strerror}") from None
    return path
