"""Running chunks of work: in this process, on a local Dask cluster, or on an existing Dask scheduler.

The only module that uses Dask (``dask`` and ``distributed``, the ``batch`` extra); they are imported inside
:func:`run_chunks`, so that nothing else of the tool loads them.  A task is one chunk of items (rows of a
schedule, sample indices): ``func(payload, chunk) -> list of results``, with ``func`` a module-level
function (picklable) and ``payload`` the data every task shares (the parsed case document and the
options, never files: workers on other machines need no access to the inputs).  The payload is sent to the
workers once (``Client.scatter(..., broadcast=True)``); each task then carries only its chunk.

Modes
-----
``serial``     a plain loop in this process (no Dask): the reference the others must equal;
``processes``  a ``distributed.LocalCluster`` of worker processes on this machine, bound to 127.0.0.1,
               one thread each and one BLAS thread each, no dashboard; closed on return, on error and on
               Ctrl-C;
``threads``    a LocalCluster of threads in this process (``processes=False``);
``scheduler``  an existing cluster at ``address`` (``tcp://host:8786``); its workers must have the same
               version of the tool installed (checked before any task is sent).

Results come back to this process as each task finishes (``as_completed``), and ``on_done`` is called
there with them; the caller writes them, so a cluster's workers never write files.
"""

from __future__ import annotations

import logging
import math
import os
from dataclasses import dataclass
from typing import Any, Callable, Sequence

from ..errors import FeaError

__all__ = ["Execution", "run_chunks", "chunk_size", "chunks_of", "default_workers", "MODES", "WORKER_ENV",
           "MAX_CHUNK"]

MODES = ("serial", "processes", "threads", "scheduler")
#: Environment of the local worker processes: one BLAS thread each (the matrices are small and banded;
#: threads only contend with the other workers).
WORKER_ENV = {"OPENBLAS_NUM_THREADS": "1", "OMP_NUM_THREADS": "1", "MKL_NUM_THREADS": "1"}
#: Most items in one task by default.
MAX_CHUNK = 64
#: Tasks per worker aimed at by default: enough to balance uneven items, few enough that the overhead of a
#: task (milliseconds) stays small against its work (seconds).
TASKS_PER_WORKER = 4


@dataclass(frozen=True)
class Execution:
    """Where the chunks run: ``mode`` (:data:`MODES`), ``workers`` (local modes; default: every core),
    ``address`` (scheduler mode), ``chunk`` (items per task; default from :func:`chunk_size`)."""

    mode: str = "processes"
    workers: int | None = None
    address: str | None = None
    chunk: int | None = None

    def __post_init__(self) -> None:
        if self.mode not in MODES:
            raise FeaError(f"unknown execution mode {self.mode!r}; expected one of {', '.join(MODES)}")
        if self.workers is not None and self.workers < 1:
            raise FeaError(f"--workers: expected a whole number >= 1, got {self.workers}")
        if self.chunk is not None and self.chunk < 1:
            raise FeaError(f"--chunk: expected a whole number >= 1, got {self.chunk}")
        if self.mode == "scheduler" and not self.address:
            raise FeaError("--scheduler: give the scheduler's address, e.g. tcp://10.0.0.5:8786")

    @property
    def n_workers(self) -> int:
        return self.workers or default_workers()

    def describe(self) -> str:
        if self.mode == "serial":
            return "serial (this process)"
        if self.mode == "processes":
            return f"local Dask cluster, {self.n_workers} worker process(es) on 127.0.0.1"
        if self.mode == "threads":
            return f"local Dask cluster, {self.n_workers} thread(s) in this process"
        return f"Dask scheduler {self.address}"


def default_workers() -> int:
    """The cores this process may use."""
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except (AttributeError, OSError):  # pragma: no cover - not Linux
        return max(1, os.cpu_count() or 1)


def chunk_size(n_items: int, n_workers: int, requested: int | None = None) -> int:
    """Items per task: ``requested``, else about :data:`TASKS_PER_WORKER` tasks per worker, at most
    :data:`MAX_CHUNK` items each."""
    if requested:
        return int(requested)
    return max(1, min(MAX_CHUNK, math.ceil(n_items / (TASKS_PER_WORKER * max(1, n_workers)))))


def chunks_of(items: Sequence[Any], size: int) -> list[list[Any]]:
    return [list(items[i:i + size]) for i in range(0, len(items), size)]


def _worker_version() -> str:
    from ..version import version

    return version()


def _check_workers(client) -> None:
    from ..version import version

    try:
        found = client.run(_worker_version)
    except Exception as exc:  # an import error on the workers, or none reachable
        raise FeaError(f"--scheduler: the cluster's workers cannot run stanchion ({type(exc).__name__}: {exc}); "
                       "install the same version of stanchion on every worker") from None
    if not found:
        raise FeaError("--scheduler: the cluster has no workers")
    other = {w: v for w, v in found.items() if v != version()}
    if other:
        w, v = next(iter(other.items()))
        raise FeaError(f"--scheduler: worker {w} has stanchion {v}, this is {version()}: install the same version "
                       "on every worker")


class _sigint_ignored:
    """SIGINT ignored while processes are started (they keep it ignored); the handler restored after."""

    def __enter__(self) -> None:
        import signal

        self.old = None
        try:
            self.old = signal.signal(signal.SIGINT, signal.SIG_IGN)
        except ValueError:  # not the main thread: nothing to do
            pass

    def __exit__(self, *exc) -> None:
        import signal

        if self.old is not None:
            signal.signal(signal.SIGINT, self.old)


def _client(execution: Execution):
    """(client, cluster or None) for a Dask mode."""
    try:
        from distributed import Client, LocalCluster
    except ImportError:
        raise FeaError("running on Dask needs the packages dask and distributed (pip install 'stanchion[batch]'); "
                       "or run in this process with --serial") from None

    if logging.getLogger().getEffectiveLevel() > logging.DEBUG:  # Dask's own news only with --debug
        for name in ("distributed", "bokeh", "tornado"):
            logging.getLogger(name).setLevel(logging.ERROR)
    if execution.mode == "scheduler":
        try:
            client = Client(execution.address, timeout="20s")
        except (OSError, TimeoutError, ValueError) as exc:
            raise FeaError(f"--scheduler: cannot connect to {execution.address!r}: {exc}") from None
        try:
            _check_workers(client)
        except BaseException:
            client.close()
            raise
        return client, None
    if execution.mode == "threads":
        cluster = LocalCluster(n_workers=1, threads_per_worker=execution.n_workers, processes=False,
                               dashboard_address=None, silence_logs=logging.ERROR)
    else:
        # no dashboard; the scheduler's small status server (always started) on a free port of 127.0.0.1.  The
        # worker processes start with Ctrl-C ignored (they inherit it): Ctrl-C then reaches this process
        # alone, which closes the cluster in order, instead of killing workers under their nannies
        with _sigint_ignored():
            cluster = LocalCluster(n_workers=execution.n_workers, threads_per_worker=1, processes=True,
                                   host="127.0.0.1", dashboard_address=None, silence_logs=logging.ERROR,
                                   scheduler_kwargs={"dashboard_address": "127.0.0.1:0"}, env=dict(WORKER_ENV))
    try:
        return Client(cluster), cluster
    except BaseException:
        cluster.close()
        raise


def run_chunks(func: Callable[[Any, list], list], payload: Any, chunks: list[list], execution: Execution,
               on_done: Callable[[list, list], None],
               on_failed: Callable[[list, str], None] | None = None) -> None:
    """Run ``func(payload, chunk)`` for every chunk and call ``on_done(chunk, results)`` in this process as each
    finishes (serial mode: in order).  A task that fails as a whole (a worker lost) calls
    ``on_failed(chunk, message)``, or raises :class:`FeaError` without it."""
    if not chunks:
        return
    if execution.mode == "serial":
        for chunk in chunks:
            on_done(chunk, func(payload, chunk))
        return
    _run_dask(func, payload, chunks, execution, on_done, on_failed)


def _run_dask(func, payload, chunks, execution, on_done, on_failed) -> None:
    client, cluster = _client(execution)
    from distributed import as_completed

    futures: list = []
    try:
        [shared] = client.scatter([payload], broadcast=True, hash=False)
        futures = [client.submit(func, shared, chunk, pure=False) for chunk in chunks]
        where = {f.key: i for i, f in enumerate(futures)}
        for fut in as_completed(futures):
            i = where[fut.key]
            try:
                results = fut.result()
            except Exception as exc:  # the task as a whole failed: a worker died, a result could not be sent
                msg = " ".join(f"{type(exc).__name__}: {exc}".split())
                if on_failed is None:
                    raise FeaError(f"a task failed on the cluster: {msg}") from None
                on_failed(chunks[i], msg)
                continue
            on_done(chunks[i], results)
    finally:
        try:
            if futures:
                client.cancel(futures)
        finally:
            client.close()
            if cluster is not None:
                cluster.close()
