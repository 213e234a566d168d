"""Put a finished results folder in place without ever losing a user's file.

The rules (DEVELOPERS.md, "The results folder"):

- ``--out`` may name a new folder, an empty one, or a spanstay results folder
  (one holding the marker of :mod:`results_marker`) that holds nothing but
  files spanstay wrote and nobody changed. Anything else is refused
  (InputError, where ``--out``): a folder with other files, a file, the root,
  the folder you are in or one holding it, and any folder holding the scenario.
- A run writes into a sibling temporary ``.NAME.spanstay-new-PID@HOST-TOKEN``, made
  with the umask's permissions and marked ``writing`` from its first moment.
- The finished folder is swapped in with one atomic exchange of the two names
  (Linux renameat2 RENAME_EXCHANGE): at every instant the old or the new
  results sit complete under NAME. Where the exchange is not available, the
  old folder is renamed aside to ``.NAME.spanstay-old-PID@HOST-TOKEN`` and the new one
  renamed in; a run killed between the two is completed by the next run.
- Then only the files the old marker lists, unchanged, are deleted from the
  old folder. Anything else found there (a file added in the moment between
  the last check and the swap) is kept in a visible ``NAME.kept-STAMP`` folder.
- Each run first tidies the temporaries of earlier runs on this computer for
  the same NAME: only folders named as ours, holding our marker, whose process
  is gone, and only the files spanstay wrote in them.
"""
from __future__ import annotations

import contextlib
import ctypes
import errno
import hashlib
import os
import re
import secrets
import signal
import socket
import sys
import time
from collections.abc import Callable, Iterator
from pathlib import Path

from spanstay.models.common.errors import InputError
from spanstay.models.outputs.results_marker import foreign_entries, read_marker, remove_ours

TEMP_NAME = re.compile(r"^\.(?P<name>.+)\.spanstay-(?P<role>new|old)-(?P<pid>\d+)@(?P<host>[0-9a-f]{6})"
                       r"-(?P<token>[0-9a-f]{8})$")
# signals that end a process unless handled; held back while names are swapped
DEFERRED_SIGNALS = tuple(getattr(signal, n) for n in (
    "SIGINT", "SIGTERM", "SIGHUP", "SIGQUIT", "SIGUSR1", "SIGUSR2", "SIGALRM", "SIGXCPU",
    "SIGXFSZ", "SIGVTALRM", "SIGPROF") if hasattr(signal, n))
TEST_DELAY_VARIABLE = "SPANSTAY_TEST_WRITE_DELAY"


def test_pause() -> None:
    """TEST HOOK: sleep ``$SPANSTAY_TEST_WRITE_DELAY`` seconds (unset: no pause).

    Called by the writer after each file and between the steps of a swap, so
    that a test can send a signal at a chosen moment. Never set it otherwise.
    """
    try:
        delay = float(os.environ.get(TEST_DELAY_VARIABLE) or 0.0)
    except ValueError:
        delay = 0.0
    if delay > 0.0:
        time.sleep(delay)


@contextlib.contextmanager
def signals_deferred() -> Iterator[None]:
    """Hold back the ending signals (delivered on leaving) so that a swap or a
    clean-up is never cut in the middle by a catchable signal."""
    if not hasattr(signal, "pthread_sigmask"):  # pragma: no cover - not POSIX
        yield
        return
    old = signal.pthread_sigmask(signal.SIG_BLOCK, DEFERRED_SIGNALS)
    try:
        yield
    finally:
        signal.pthread_sigmask(signal.SIG_SETMASK, old)


def _refuse(message: str) -> InputError:
    return InputError(message, where="--out")


def check_target(out_dir: str | Path, scenario_file: str | Path | None = None) -> Path:
    """The absolute results folder, after checking spanstay may (re)write it.

    Raises
    ------
    InputError
        (where ``--out``) when the folder is not one spanstay may replace.
    """
    shown = str(out_dir)
    target = Path(out_dir).resolve()
    stem = Path(scenario_file).stem if scenario_file else "scenario"
    if target.parent == target:
        raise _refuse(f"'{shown}' is the root folder; give a folder of its own, e.g. '{stem}_results'")
    cwd = Path.cwd().resolve()
    if target == cwd or target in cwd.parents:
        raise _refuse(f"'{shown}' is the folder you are in{'' if target == cwd else ' (or holds it)'}; "
                      f"results go in a folder of their own, e.g. --out {stem}_results")
    if scenario_file:
        scenario = Path(scenario_file).resolve()
        if target in scenario.parents:
            raise _refuse(f"'{shown}' holds the scenario file {scenario.name}; results go in a folder "
                          f"of their own, e.g. --out {scenario.with_name(f'{stem}_results')}")
    if not (target.exists() or target.is_symlink()):
        return target
    if not target.is_dir():
        raise _refuse(f"'{shown}' is a file, not a folder; give a new folder, e.g. '{stem}_results'")
    if not any(target.iterdir()):
        return target
    marker = read_marker(target)
    if marker is None or marker["state"] != "complete":
        names = sorted(p.name for p in target.iterdir())
        listed = ", ".join(names[:4]) + (f" and {len(names) - 4} more" if len(names) > 4 else "")
        raise _refuse(f"'{shown}' is not empty and is not a spanstay results folder (it holds {listed}); "
                      f"spanstay writes only into a new folder, an empty one, or one it wrote itself, "
                      f"so nothing was changed. Give another folder, e.g. --out "
                      f"{Path(shown) / f'{stem}_results'}")
    foreign = foreign_entries(target, marker)
    if foreign:
        listed = "; ".join(foreign[:4]) + (f"; and {len(foreign) - 4} more" if len(foreign) > 4 else "")
        raise _refuse(f"'{shown}' is a spanstay results folder, but it holds files spanstay did not "
                      f"write: {listed}. spanstay replaces a results folder only when it holds nothing "
                      f"but its own unchanged files, so nothing was changed. Move those out of the "
                      f"folder (or give another --out folder) and run again")
    return target


def _host_tag() -> str:
    """Six hex digits naming this computer (a process id means nothing on another)."""
    return hashlib.sha256(socket.gethostname().encode()).hexdigest()[:6]


def temp_name(target: Path, role: str) -> Path:
    """``.NAME.spanstay-ROLE-PID@HOST-TOKEN`` beside ``target``: ours, by whom, unique."""
    return target.with_name(f".{target.name}.spanstay-{role}-{os.getpid()}@{_host_tag()}-"
                            f"{secrets.token_hex(4)}")


def make_temp(target: Path) -> Path:
    """A new, empty sibling of ``target`` named as ours (mode 0777 less the umask)."""
    while True:
        tmp = temp_name(target, "new")
        try:
            os.mkdir(tmp)
            return tmp
        except FileExistsError:  # pragma: no cover - a 32-bit token collided
            continue


def _process_gone(pid: int) -> bool:
    if pid <= 0 or pid == os.getpid():
        return False
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return True
    except OSError:  # alive, someone else's
        return False
    return False


def keep_visible(folder: Path, target: Path) -> Path:
    """Rename a folder holding a user's files to a visible name beside ``target``."""
    stamp = time.strftime("%Y%m%d-%H%M%S")
    kept = target.with_name(f"{target.name}.kept-{stamp}")
    n = 1
    while kept.exists() or kept.is_symlink():
        n += 1
        kept = target.with_name(f"{target.name}.kept-{stamp}-{n}")
    os.rename(folder, kept)
    return kept


def retire(folder: Path, target: Path, notify: Callable[[str], None]) -> None:
    """Delete what spanstay wrote in a folder of ours beside ``target`` (old results,
    or a temporary); anything else in it goes to a visible ``NAME.kept-STAMP``."""
    if not folder.is_dir():
        return
    # without a marker nothing is known to be ours: only an empty folder goes
    marker = read_marker(folder) or {"state": "complete", "folders": [], "files": {}, "pid": 0}
    left = remove_ours(folder, marker, test_pause)
    if left:
        kept = keep_visible(folder, target)
        notify(f"kept {len(left)} item(s) spanstay did not write ({', '.join(left[:4])}) in {kept}")


def clean_stale(target: Path, notify: Callable[[str], None]) -> None:
    """Finish or tidy what earlier runs for ``target`` left when they were killed."""
    if not target.parent.is_dir():
        return
    host = _host_tag()
    stale = []
    for p in target.parent.iterdir():
        m = TEMP_NAME.match(p.name)
        if (not m or m["name"] != target.name or m["host"] != host or p.is_symlink()
                or not p.is_dir() or not _process_gone(int(m["pid"]))):
            continue
        marker = read_marker(p)  # the process that named it is gone; is it ours inside?
        if marker is None:
            continue
        stale.append((p, marker, m["role"]))
    if not (target.exists() or target.is_symlink()):
        complete = [s for s in stale if s[1]["state"] == "complete"]
        # newest complete results first; a finished "new" beats the "old" it replaces
        complete.sort(key=lambda s: (s[1].get("written_utc", ""), s[2] == "new"), reverse=True)
        if complete:
            os.rename(complete[0][0], target)
            notify(f"put back the complete results an interrupted run left in {complete[0][0].name}")
            stale.remove(complete[0])
    for p, marker, _ in stale:
        retire(p, target, notify)


def _exchange(a: Path, b: Path) -> bool:
    """Swap two names atomically (Linux renameat2 RENAME_EXCHANGE); False if unsupported."""
    if not sys.platform.startswith("linux"):
        return False
    try:
        fn = ctypes.CDLL(None, use_errno=True).renameat2
    except (OSError, AttributeError):
        return False
    fn.argtypes = [ctypes.c_int, ctypes.c_char_p, ctypes.c_int, ctypes.c_char_p, ctypes.c_uint]
    at_fdcwd, rename_exchange = -100, 2
    if fn(at_fdcwd, os.fsencode(a), at_fdcwd, os.fsencode(b), rename_exchange) == 0:
        return True
    err = ctypes.get_errno()
    if err in (errno.EINVAL, errno.ENOSYS, errno.EOPNOTSUPP, errno.ENOTSUP):
        return False
    raise OSError(err, os.strerror(err), str(b))


def swap_into_place(new: Path, target: Path) -> Path | None:
    """Put the complete folder ``new`` under ``target``'s name.

    Returns the folder now holding the previous results (``new``'s old name
    after an exchange, or ``.NAME.spanstay-old-...``), or None if there were none.
    """
    if not (target.exists() or target.is_symlink()):
        os.rename(new, target)  # also replaces an empty folder, atomically
        return None
    if _exchange(new, target):
        return new
    aside = temp_name(target, "old")
    os.rename(target, aside)
    test_pause()
    try:
        os.rename(new, target)
    except BaseException:
        os.rename(aside, target)
        raise
    return aside
