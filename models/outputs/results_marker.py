"""The marker file of a results folder: which files spanstay wrote there.

Every results folder holds ``.spanstay-results.json``, written last, as a JSON
object::

    {"format": "spanstay-results", "version": 1, "state": "complete",
     "pid": 4242, "host": "field-laptop", "written_utc": "2026-12-03T00:41:07Z",
     "spanstay": "0.1.0", "folders": ["plots", "vtk"],
     "files": {"summary.json": {"size": 81234, "sha256": "..."}, ...}}

A run's temporary folder holds the same file from its first moment with
``"state": "writing"`` and no files, so a later run can recognise a folder it
may clean up. spanstay deletes a file only when the marker lists it and the
file still has the listed size and SHA-256 (a file the user changed is kept);
in a ``writing`` folder, whose list is not yet known, only files named as
spanstay names its outputs (:data:`OUTPUT_NAMES`) are deleted. Anything else
is left where it is and reported back.
"""
from __future__ import annotations

import fnmatch
import hashlib
import json
import os
import socket
import stat
import time
from collections.abc import Callable
from pathlib import Path, PurePosixPath

MARKER = ".spanstay-results.json"
FORMAT, VERSION = "spanstay-results", 1
# what spanstay writes into a results folder (relative paths, POSIX patterns); a new
# output must be added here, or a killed run's temporary holding it is kept, not tidied
# (tests/models/test_results_folder_safety.py checks every written file matches)
OUTPUT_NAMES = ("summary.json", "stations.csv", "report.html", "vtk/*.vtu", "vtk/*.pvd",
                "plots/*.png", MARKER, MARKER + ".part")
OUTPUT_FOLDERS = ("vtk", "plots")


def _version() -> str:
    from importlib.metadata import PackageNotFoundError, version

    try:
        return version("spanstay")
    except PackageNotFoundError:  # pragma: no cover
        return "unknown"


def _sha256(path: Path) -> str:
    h = hashlib.sha256()
    with path.open("rb") as fh:
        for block in iter(lambda: fh.read(1 << 20), b""):
            h.update(block)
    return h.hexdigest()


def _write_marker(folder: Path, data: dict) -> None:
    """Write the marker whole or not at all (a .part file renamed over it)."""
    part = folder / (MARKER + ".part")
    with part.open("w") as fh:
        json.dump(data, fh, indent=1)
        fh.flush()
        os.fsync(fh.fileno())
    os.replace(part, folder / MARKER)


def _header(state: str) -> dict:
    return {"format": FORMAT, "version": VERSION, "state": state, "pid": os.getpid(),
            "host": socket.gethostname(), "spanstay": _version(),
            "written_utc": time.strftime("%Y-%m-%dT%H:%M:%SZ", time.gmtime())}


def start_marker(folder: Path) -> None:
    """Mark a freshly made temporary folder as one this process is writing."""
    _write_marker(Path(folder), {**_header("writing"), "folders": [], "files": {}})


def finish_marker(folder: Path) -> dict:
    """List (with size and SHA-256) every file now in ``folder``; mark it complete."""
    folder = Path(folder)
    files, folders = {}, []
    for root, dirs, names in os.walk(folder):
        base = Path(root)
        folders += [(base / d).relative_to(folder).as_posix() for d in dirs]
        for n in names:
            p = base / n
            rel = p.relative_to(folder).as_posix()
            if rel in (MARKER, MARKER + ".part") or not p.is_file() or p.is_symlink():
                continue
            files[rel] = {"size": p.stat().st_size, "sha256": _sha256(p)}
    data = {**_header("complete"), "folders": sorted(folders), "files": dict(sorted(files.items()))}
    _write_marker(folder, data)
    return data


def _safe_rel(rel: object) -> bool:
    """A listed name is a plain relative path inside the folder (no '..', not absolute)."""
    if not isinstance(rel, str) or not rel or "\\" in rel or "\0" in rel:
        return False
    p = PurePosixPath(rel)
    return not p.is_absolute() and ".." not in p.parts and "." not in p.parts


def read_marker(folder: Path) -> dict | None:
    """The folder's marker, or None when it has none that this spanstay understands."""
    path = Path(folder) / MARKER
    try:
        if path.is_symlink() or not path.is_file():
            return None
        data = json.loads(path.read_text())
    except (OSError, ValueError):
        return None
    if not isinstance(data, dict) or data.get("format") != FORMAT or data.get("version") != VERSION:
        return None
    if data.get("state") not in ("writing", "complete") or not isinstance(data.get("pid"), int):
        return None
    files, folders = data.get("files"), data.get("folders")
    if not isinstance(files, dict) or not isinstance(folders, list):
        return None
    if not all(_safe_rel(k) and isinstance(v, dict) for k, v in files.items()):
        return None
    if not all(_safe_rel(d) for d in folders):
        return None
    return data


def _is_ours(folder: Path, rel: str, marker: dict) -> bool:
    """True when ``rel`` is a regular file spanstay wrote and nobody has changed since."""
    p = folder / rel
    try:
        st = p.lstat()
        if not stat.S_ISREG(st.st_mode):
            return False
        q = p.parent
        while q != folder:  # never through a link the user made
            if q.is_symlink():
                return False
            q = q.parent
    except OSError:
        return False
    if rel in (MARKER, MARKER + ".part"):
        return True
    if marker["state"] == "writing":
        return any(fnmatch.fnmatchcase(rel, pat) and rel.count("/") == pat.count("/")
                   for pat in OUTPUT_NAMES)
    entry = marker["files"].get(rel)
    if entry is None or entry.get("size") != st.st_size:
        return False
    try:
        return _sha256(p) == entry.get("sha256")
    except OSError:
        return False


def _entries(folder: Path) -> tuple[list[str], list[str]]:
    """Relative names of every file (or link) and every sub-folder, never following links."""
    files, dirs = [], []
    for root, dnames, fnames in os.walk(folder):
        base = Path(root)
        for d in list(dnames):
            if (base / d).is_symlink():  # a link to a folder is an entry, not a place to walk
                dnames.remove(d)
                files.append((base / d).relative_to(folder).as_posix())
            else:
                dirs.append((base / d).relative_to(folder).as_posix())
        files += [(base / n).relative_to(folder).as_posix() for n in fnames]
    return files, dirs


def foreign_entries(folder: Path, marker: dict) -> list[str]:
    """What in ``folder`` spanstay did not write (or that was changed since), described."""
    folder = Path(folder)
    files, dirs = _entries(folder)
    ours_dirs = set(marker["folders"]) | (set(OUTPUT_FOLDERS) if marker["state"] == "writing" else set())
    out = []
    for rel in sorted(files):
        if _is_ours(folder, rel, marker):
            continue
        listed = rel in marker["files"]
        out.append(f"{rel} ({'changed since spanstay wrote it' if listed else 'not written by spanstay'})")
    out += [f"{d}/ (a folder spanstay did not make)" for d in sorted(dirs) if d not in ours_dirs]
    return out


def remove_ours(folder: Path, marker: dict,
                pause: Callable[[], None] = lambda: None) -> list[str]:
    """Delete from ``folder`` only what spanstay wrote there; return what was left.

    Files go first, the marker last (so a run killed half-way still leaves a
    marker for the next run to finish the job), then the emptied sub-folders
    spanstay made, then ``folder`` itself if it is empty. ``pause`` is called
    after each file (the writer's test hook).
    """
    folder = Path(folder)
    files, _ = _entries(folder)
    for rel in sorted(files, key=lambda r: r in (MARKER, MARKER + ".part")):
        if rel != MARKER and _is_ours(folder, rel, marker):
            (folder / rel).unlink()
            pause()
    if (folder / MARKER).is_file() and not (folder / MARKER).is_symlink():
        (folder / MARKER).unlink()
    ours_dirs = set(marker["folders"]) | (set(OUTPUT_FOLDERS) if marker["state"] == "writing" else set())
    for d in sorted(ours_dirs, key=lambda d: -d.count("/")):
        p = folder / d
        if p.is_dir() and not p.is_symlink() and not any(p.iterdir()):
            p.rmdir()
    left, dirs = _entries(folder)
    if not left and not dirs:
        folder.rmdir()
        return []
    return sorted(left + [d + "/" for d in dirs])
