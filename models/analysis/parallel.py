"""Load cases run side by side in worker processes (the cases are values and leave the
structure unchanged, so each worker gets its own copy and the answers are those of a
serial run, bit for bit)."""
from __future__ import annotations

import multiprocessing
import os
import queue as queue_module
from concurrent.futures import ProcessPoolExecutor, wait, FIRST_COMPLETED
from typing import Callable

import numpy as np

from spanstay.models.analysis.load_cases import LoadCase
from spanstay.models.analysis.run_case import Structure, run_case
from spanstay.models.analysis.stations import Pass

_TICKS = None  # the worker's progress queue (set by the pool initializer)
_LATE_TICK_S = 30.0  # longest wait for a tick a finished worker has sent (a dead queue)


def default_workers(n_cases: int) -> int:
    """Processes to use: one per case, at most the cores this process may use."""
    try:
        cores = len(os.sched_getaffinity(0))
    except AttributeError:  # pragma: no cover - not on Linux
        cores = os.cpu_count() or 1
    return max(1, min(cores, n_cases))


def _init(ticks) -> None:
    global _TICKS
    _TICKS = ticks


def _work(structure: Structure, case: LoadCase,
          stations_s: np.ndarray) -> tuple[Pass, int]:
    """The case's pass and how many progress ticks it sent (a queue's feeder thread
    may still hold ticks when the result arrives, so the parent waits for that many)."""
    sent = 0

    def tick() -> None:
        nonlocal sent
        _TICKS.put(case.name)
        sent += 1
    result = run_case(structure, case, stations_s,
                      progress=tick if _TICKS is not None else None)
    return result, sent


def run_cases(structures: dict[str, Structure], cases: tuple[LoadCase, ...],
              stations: dict[str, np.ndarray], workers: int,
              progress: Callable[[str, int], None] | None = None) -> dict[str, Pass]:
    """Every case's pass, by case name, in the order of ``cases``.

    ``workers`` 1 runs them one after another in this process; more runs them in
    that many worker processes (fork where the platform has it).
    """
    def serial_tick(name: str):
        return (lambda: progress(name, 1)) if progress else None

    if workers <= 1 or len(cases) <= 1:
        return {c.name: run_case(structures[c.slip], c, stations[c.line],
                                 progress=serial_tick(c.name)) for c in cases}
    methods = multiprocessing.get_all_start_methods()
    ctx = multiprocessing.get_context("fork" if "fork" in methods else "spawn")
    ticks = ctx.Queue()
    out: dict[str, Pass] = {}
    pool = ProcessPoolExecutor(max_workers=workers, mp_context=ctx, initializer=_init,
                               initargs=(ticks,))
    try:
        futures = {pool.submit(_work, structures[c.slip], c, stations[c.line]): c.name
                   for c in cases}
        pending = set(futures)
        sent = received = 0
        while pending:
            done, pending = wait(pending, timeout=0.1, return_when=FIRST_COMPLETED)
            received += _drain(ticks, progress)
            for f in done:
                out[futures[f]], n = f.result()
                sent += n
        while received < sent:  # ticks still on their way through the queue
            name = ticks.get(timeout=_LATE_TICK_S)
            received += 1
            if progress is not None:
                progress(name, 1)
    except BaseException:  # an interrupt or a failed case: stop the workers at once
        _stop(pool)
        raise
    pool.shutdown(wait=True)
    return {c.name: out[c.name] for c in cases}


def _stop(pool: ProcessPoolExecutor) -> None:
    """Cancel what has not started and end the worker processes now (a case in a
    worker would otherwise run to its end before the run can stop)."""
    processes = list(getattr(pool, "_processes", {}).values())  # no public handle exists
    pool.shutdown(wait=False, cancel_futures=True)
    for proc in processes:
        if proc.is_alive():
            proc.terminate()


def _drain(ticks, progress) -> int:
    """Pass on the ticks that have arrived; how many there were."""
    count = 0
    while True:
        try:
            name = ticks.get_nowait()
        except queue_module.Empty:
            return count
        count += 1
        if progress is not None:
            progress(name, 1)
