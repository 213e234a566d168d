"""The results writer never deletes or overwrites a file spanstay did not write,
and leaves old or new results complete after any signal.

References outside the project: POSIX mkdir(2)/open(2) (a new folder gets
mode 0777 & ~umask, a new file 0666 & ~umask), POSIX signal numbers and the
shell's exit status 128 + N for a process ended by signal N (SIGTERM = 15,
so 143), Linux rename(2)/renameat2(2) (a rename is atomic). "Complete" is
checked against the file's own SHA-256 (hashlib, FIPS 180-4) and against the
count of station files that summary.json's pass lengths call for.
"""
from __future__ import annotations

import fnmatch
import hashlib
import json
import os
import shutil
import signal
import stat
import subprocess
import sys
import time
from pathlib import Path

import pytest
from click.testing import CliRunner

from spanstay.models.cli import main
from spanstay.models.common.errors import InputError
from spanstay.models.outputs import results_swap
from spanstay.models.outputs.results_folder import write_results
from spanstay.models.outputs.results_marker import (MARKER, OUTPUT_NAMES, finish_marker, read_marker,
                                                    start_marker)
from spanstay.models.outputs.results_swap import clean_stale, retire, temp_name

ROOT = Path(__file__).resolve().parents[2]
EXAMPLE = ROOT / "examples" / "orchard-family-line.toml"


@pytest.fixture(scope="module")
def run_result():
    from spanstay.models.api import analyse, load

    return analyse(load(EXAMPLE), stations=2)


@pytest.fixture(scope="module")
def template(run_result, tmp_path_factory):
    """A results folder of 2 stations, written once and copied by each test."""
    out = tmp_path_factory.mktemp("template") / "site_results"
    write_results(run_result, out, str(EXAMPLE), "si")
    return out


def _copy(template: Path, where: Path) -> Path:
    out = where / "site_results"
    shutil.copytree(template, out)
    return out


def _sha(path: Path) -> str:
    return hashlib.sha256(path.read_bytes()).hexdigest()


def _snapshot(folder: Path) -> dict[str, str]:
    return {p.relative_to(folder).as_posix(): _sha(p) for p in folder.rglob("*") if p.is_file()}


def _assert_complete(folder: Path) -> int:
    """Every listed file is there with its SHA-256, and the station files match the
    summary; returns the number of stations of the ride_heavy pass."""
    marker = read_marker(folder)
    assert marker is not None and marker["state"] == "complete"
    for rel, entry in marker["files"].items():
        assert _sha(folder / rel) == entry["sha256"], rel
    summary = json.loads((folder / "summary.json").read_text())
    n = summary["passes"]["ride_heavy"]["stations"]
    assert len(list((folder / "vtk").glob("ride_heavy_*.vtu"))) == n
    for key in ("summary.json", "stations.csv", "report.html", "vtk/installed.vtu"):
        assert key in marker["files"]
    return n


def _temporaries(out: Path) -> list[Path]:
    return [p for p in out.parent.iterdir() if p.name.startswith(f".{out.name}.spanstay-")]


# -- refusals: exit 2, nothing touched ----------------------------------------

def test_out_dot_in_the_scenario_folder_is_refused(tmp_path, monkeypatch):
    site = tmp_path / "site"
    site.mkdir()
    shutil.copy(EXAMPLE, site / "site.toml")
    (site / "notes.txt").write_text("pole 2 leans a little\n")
    (site / "photo.jpg").write_bytes(os.urandom(2048))
    before = _snapshot(site)
    monkeypatch.chdir(site)
    result = CliRunner().invoke(main, ["run", "site.toml", "--out", ".", "--stations", "2"])
    assert result.exit_code == 2, result.output
    assert "--out" in result.output and "Traceback" not in result.output
    assert _snapshot(site) == before and sorted(p.name for p in site.iterdir()) == sorted(before)


def test_a_folder_holding_the_scenario_deeper_down_is_refused(tmp_path):
    deep = tmp_path / "jobs" / "orchard"
    deep.mkdir(parents=True)
    shutil.copy(EXAMPLE, deep / "site.toml")
    before = _snapshot(tmp_path)
    result = CliRunner().invoke(main, ["run", str(deep / "site.toml"), "--out", str(tmp_path / "jobs")])
    assert result.exit_code == 2 and "holds the scenario file" in result.output, result.output
    assert _snapshot(tmp_path) == before


def test_a_folder_with_user_files_is_refused(tmp_path):
    docs = tmp_path / "mydocs"
    docs.mkdir()
    (docs / "contract.txt").write_text("signed\n")
    result = CliRunner().invoke(main, ["run", str(EXAMPLE), "--out", str(docs)])
    assert result.exit_code == 2, result.output
    assert "contract.txt" in result.output and "not a spanstay results folder" in result.output
    assert (docs / "contract.txt").read_text() == "signed\n"
    assert [p.name for p in docs.iterdir()] == ["contract.txt"]


def test_the_library_call_refuses_too(run_result, tmp_path):
    docs = tmp_path / "mydocs"
    docs.mkdir()
    (docs / "contract.txt").write_text("signed\n")
    with pytest.raises(InputError) as err:
        write_results(run_result, docs, "", "si")
    assert err.value.where == "--out"
    assert (docs / "contract.txt").read_text() == "signed\n" and not _temporaries(docs)


@pytest.mark.parametrize("change", ["add", "edit"])
def test_a_user_file_inside_old_results_stops_the_rerun_and_survives(template, tmp_path, change):
    out = _copy(template, tmp_path)
    if change == "add":
        (out / "plots" / "site_photo.png").write_bytes(b"\x89PNG my own photo")
        name = "plots/site_photo.png"
    else:  # opened in a spreadsheet and saved
        (out / "stations.csv").write_text((out / "stations.csv").read_text() + "my note\n")
        name = "stations.csv"
    before = _snapshot(out)
    result = CliRunner().invoke(main, ["run", str(EXAMPLE), "--out", str(out), "--stations", "2"])
    assert result.exit_code == 2 and name in result.output, result.output
    assert _snapshot(out) == before and not _temporaries(out)


# -- a rerun replaces only its own files -------------------------------------

def test_rerun_replaces_old_results_and_removes_only_listed_files(run_result, template, tmp_path):
    out = _copy(template, tmp_path)
    (out / "vtk" / "design_009.vtu").write_text("<VTKFile/>")  # as if an older run had 10 stations
    finish_marker(out)
    written = write_results(run_result, out, str(EXAMPLE), "si")
    assert written == out.resolve()
    assert not (out / "vtk" / "design_009.vtu").exists()
    assert _assert_complete(out) == 2
    assert not _temporaries(out) and sorted(p.name for p in tmp_path.iterdir()) == ["site_results"]
    # every output is named as a killed run's temporary may be tidied by
    for rel in read_marker(out)["files"]:
        assert any(fnmatch.fnmatchcase(rel, pat) and rel.count("/") == pat.count("/")
                   for pat in OUTPUT_NAMES), rel


def test_exchange_unavailable_falls_back_to_two_renames(run_result, template, tmp_path, monkeypatch):
    monkeypatch.setattr(results_swap, "_exchange", lambda a, b: False)
    out = _copy(template, tmp_path)
    write_results(run_result, out, str(EXAMPLE), "si")
    assert _assert_complete(out) == 2 and not _temporaries(out)


@pytest.mark.parametrize("mask", [0o027])
def test_permissions_follow_the_umask(run_result, tmp_path, mask):
    (tmp_path / "new" / "site_results").mkdir(parents=True)  # an empty folder may be named too
    old = os.umask(mask)
    try:
        out = write_results(run_result, tmp_path / "new" / "site_results", str(EXAMPLE), "si")
    finally:
        os.umask(old)
    dirs = [out, *[p for p in out.rglob("*") if p.is_dir()]]
    files = [p for p in out.rglob("*") if p.is_file()]
    assert len(dirs) == 3 and len(files) > 10
    for d in dirs:  # POSIX mkdir(2): 0777 & ~umask
        assert stat.S_IMODE(d.stat().st_mode) == 0o777 & ~mask, d
    for f in files:  # POSIX open(2) with O_CREAT: 0666 & ~umask
        assert stat.S_IMODE(f.stat().st_mode) == 0o666 & ~mask, f
    assert sorted(p.name for p in (tmp_path / "new").iterdir()) == ["site_results"]


# -- temporaries of killed runs -------------------------------------------------

def _dead_pid() -> int:
    p = subprocess.Popen([sys.executable, "-c", "pass"])
    p.wait()
    return p.pid


def _fake_temp(out: Path, role: str, pid: int) -> Path:
    name = temp_name(out, role).name.replace(f"-{os.getpid()}@", f"-{pid}@")
    tmp = out.with_name(name)
    tmp.mkdir()
    return tmp


def test_next_run_tidies_only_its_own_stale_temporaries(run_result, template, tmp_path):
    out = _copy(template, tmp_path)
    dead = _dead_pid()
    stale = _fake_temp(out, "new", dead)  # killed while writing
    start_marker(stale)
    (stale / "vtk").mkdir()
    (stale / "vtk" / "installed.vtu").write_text("<VTKFile/>")
    (stale / "stations.csv").write_text("pass,station\n")
    alive = _fake_temp(out, "new", os.getppid())  # a run still going
    start_marker(alive)
    (alive / "summary.json").write_text("{}")
    unmarked = _fake_temp(out, "new", _dead_pid())  # named like ours, but no marker
    (unmarked / "summary.json").write_text("{}")
    write_results(run_result, out, str(EXAMPLE), "si")
    assert not stale.exists()
    assert (alive / "summary.json").exists() and (unmarked / "summary.json").exists()
    assert _assert_complete(out) == 2


def test_a_user_file_in_a_stale_temporary_is_kept_visible(template, tmp_path):
    out = _copy(template, tmp_path)
    stale = _fake_temp(out, "new", _dead_pid())
    start_marker(stale)
    (stale / "summary.json").write_text("{}")
    (stale / "keep-me.txt").write_text("mine")
    said = []
    clean_stale(out.resolve(), said.append)
    kept = [p for p in tmp_path.iterdir() if p.name.startswith("site_results.kept-")]
    assert len(kept) == 1 and (kept[0] / "keep-me.txt").read_text() == "mine"
    assert not (kept[0] / "summary.json").exists() and said and "keep-me.txt" in said[0]


def test_killed_between_the_two_renames_the_next_run_puts_the_new_results_back(template, tmp_path):
    out = _copy(template, tmp_path)
    dead = _dead_pid()
    old = _fake_temp(out, "old", dead)
    old.rmdir()
    shutil.copytree(template, old)
    new = _fake_temp(out, "new", dead)
    new.rmdir()
    shutil.copytree(template, new)
    (new / "stations.csv").write_text("newer\n")
    finish_marker(new)
    shutil.rmtree(out)  # the name is empty: the old folder is aside, the new one not yet in
    clean_stale(out.resolve(), lambda m: None)
    assert (out / "stations.csv").read_text() == "newer\n" and _assert_complete(out) == 2
    assert not _temporaries(out)


def test_retire_keeps_what_spanstay_did_not_write(template, tmp_path):
    out = _copy(template, tmp_path)
    (out / "vtk" / "late.txt").write_text("added after the last check")
    said = []
    retire(out, tmp_path / "site_results", said.append)
    kept = [p for p in tmp_path.iterdir() if p.name.startswith("site_results.kept-")]
    assert [p.relative_to(kept[0]).as_posix() for p in kept[0].rglob("*") if p.is_file()] == ["vtk/late.txt"]
    assert not (kept[0] / MARKER).exists()


# -- real signals, real process ----------------------------------------------------

def _start(out: Path, cwd: Path, delay: float) -> subprocess.Popen:
    env = {**os.environ, "PYTHONPATH": str(ROOT), results_swap.TEST_DELAY_VARIABLE: str(delay)}
    return subprocess.Popen([sys.executable, "-m", "spanstay", "run", str(EXAMPLE), "--out", str(out),
                             "--stations", "3", "--units", "si"], cwd=cwd, env=env,
                            stdout=subprocess.PIPE, stderr=subprocess.PIPE)


def _wait_for(proc: subprocess.Popen, ready, limit: float = 120.0) -> None:
    end = time.monotonic() + limit
    while not ready():
        assert proc.poll() is None, proc.communicate()
        assert time.monotonic() < end, "the run never reached the awaited phase"
        time.sleep(0.02)


def _writing(out: Path, pid: int):
    def ready():
        for p in _temporaries(out):
            if f"-new-{pid}@" in p.name and (p / "vtk").is_dir() and any((p / "vtk").iterdir()):
                return True
        return False
    return ready


@pytest.mark.parametrize("sig", [signal.SIGTERM, signal.SIGHUP])
def test_a_signal_while_writing_leaves_no_temporary_and_old_results_whole(template, tmp_path, sig):
    out = _copy(template, tmp_path)
    before = _snapshot(out)
    proc = _start(out, tmp_path, 0.2)
    _wait_for(proc, _writing(out, proc.pid))
    proc.send_signal(sig)
    _, err = proc.communicate(timeout=60)
    assert proc.returncode == 128 + sig, err.decode()
    assert f"stopped by {sig.name}" in err.decode() and "Traceback" not in err.decode()
    assert not _temporaries(out)
    assert _snapshot(out) == before and _assert_complete(out) == 2


def test_sigkill_while_writing_keeps_old_results_and_the_next_run_tidies(template, tmp_path):
    out = _copy(template, tmp_path)
    proc = _start(out, tmp_path, 0.2)
    _wait_for(proc, _writing(out, proc.pid))
    proc.kill()
    proc.wait(timeout=60)
    assert _assert_complete(out) == 2  # the old results, untouched
    assert _temporaries(out)           # what the killed run was writing
    clean_stale(out.resolve(), lambda m: None)  # what the next run does first
    assert not _temporaries(out) and _assert_complete(out) == 2


def test_sigkill_while_old_results_are_removed_leaves_new_results_whole(template, tmp_path):
    out = _copy(template, tmp_path)
    proc = _start(out, tmp_path, 0.1)

    def swapped():
        marker = read_marker(out)
        return marker is not None and marker["pid"] == proc.pid

    _wait_for(proc, swapped)
    time.sleep(0.25)  # a few old files gone, most still there
    proc.kill()
    proc.wait(timeout=60)
    assert _assert_complete(out) == 3  # the new results, complete and in place
    aside = _temporaries(out)
    assert aside and read_marker(aside[0])["pid"] != proc.pid  # the old results, part removed
    clean_stale(out.resolve(), lambda m: None)  # what the next run does first
    assert not _temporaries(out) and _assert_complete(out) == 3
    assert not [p for p in tmp_path.iterdir() if ".kept-" in p.name]
