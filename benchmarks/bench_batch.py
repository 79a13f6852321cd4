"""Speed of the batch and reliability commands: serial against a local Dask cluster of 2 worker processes.

Run:  python benchmarks/bench_batch.py [--samples N] [--rows N] [--workers W]

Prints, side by side in one run:
  (a) N = 2,000 samples of the fully nonlinear ultimate load of cases/reliability_crooked_column.toml (invented
      demo): time in this process (``--serial``), time on a local cluster of W = 2 worker processes (started
      and closed inside the timing, as the command does), their ratio (target >= 1.7 on the 2-core machine),
      the time per sample and per task, and whether both runs gave the same strengths bit for bit;
  (b) a 500-row batch of cases/two_storey_column.toml (invented demo; rows change the imposed load and the
      ground-storey height): the same figures;
  (c) the start-up of a local cluster (start, one row per worker with the worker's imports, close);
  (d) from the measured times, the expected speed-up at 100 workers (see docs/batch.md, "Sizing a cluster").
``--samples 0`` or ``--rows 0`` leaves that part out.
The machine is shared: compare ratios, run when ``uptime`` shows a low load, and read the load printed.
"""

from __future__ import annotations

import argparse
import os
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from fea.cli import one_blas_thread  # noqa: E402

one_blas_thread()  # before numpy loads: one BLAS thread, as the command and its workers have


def _timed(label: str, fn):
    t0 = time.perf_counter()
    out = fn()
    dt = time.perf_counter() - t0
    print(f"  {label:<44} {dt:8.2f} s", flush=True)
    return out, dt


def _run(func, payload, items, execution, chunk: int):
    """Run the chunks; (results sorted by position, the time of each task as measured on the serial path)."""
    from fea.batch.execute import chunks_of, run_chunks

    results: list = []
    task_times: list[float] = []
    last = [time.perf_counter()]

    def done(chunk_items, res):
        now = time.perf_counter()
        task_times.append(now - last[0])
        last[0] = now
        results.extend(res)

    run_chunks(func, payload, chunks_of(items, chunk), execution, done)
    return results, task_times


def bench_samples(n: int, workers: int) -> dict:
    from fea.batch.execute import Execution, chunk_size
    from fea.batch.reliability import run_samples, sample_payload
    from fea.pipeline import load_case

    case = load_case(ROOT / "cases" / "reliability_crooked_column.toml")
    spec = case.extras["reliability"]
    payload = sample_payload(case.document, spec, source="bench")
    chunk = chunk_size(n, workers)
    idx = list(range(n))
    print(f"(a) {n} fully nonlinear samples (ultimate load), {chunk} samples per task")
    (ser, tasks), t_ser = _timed("serial (this process)",
                                 lambda: _run(run_samples, payload, idx, Execution("serial"), chunk))
    (par, _), t_par = _timed(f"local cluster, {workers} worker processes",
                             lambda: _run(run_samples, payload, idx, Execution("processes", workers=workers), chunk))
    same = [(s.index, s.strength) for s in sorted(ser, key=lambda s: s.index)] == \
        [(s.index, s.strength) for s in sorted(par, key=lambda s: s.index)]
    print(f"  ratio serial / cluster                       {t_ser / t_par:8.2f}   (target >= 1.7)")
    print(f"  per sample {t_ser / n * 1e3:.1f} ms; per task mean {sum(tasks) / len(tasks):.2f} s, "
          f"min {min(tasks):.2f} s, max {max(tasks):.2f} s; identical strengths: {same}")
    return {"n": n, "t_item": t_ser / n, "t_ser": t_ser, "t_par": t_par, "chunk": chunk}


def bench_rows(n: int, workers: int) -> dict:
    from fea.batch.execute import Execution, chunk_size
    from fea.batch.run import JobOptions, run_jobs
    from fea.batch.schedule import expand, load_schedule

    rows = "".join(f'\n[[row]]\nmark = "C{i}"\n"load[4].axial" = "{150 + i % 50 * 5} kN"\n'
                   f'"segment[1].length" = "{4.0 + (i % 5) * 0.2:.1f} m"\n"restraint[2].at" = '
                   f'"{4.0 + (i % 5) * 0.2:.1f} m"\n"load[3].at" = "{4.0 + (i % 5) * 0.2:.1f} m"\n'
                   f'"load[4].at" = "{4.0 + (i % 5) * 0.2:.1f} m"\n' for i in range(n))
    with tempfile.TemporaryDirectory() as d:
        p = Path(d) / "bench.toml"
        p.write_text(f'title = "bench"\nbase = {str(ROOT / "cases" / "two_storey_column.toml")!r}\n{rows}')
        jobs = expand(load_schedule(p))
    chunk = chunk_size(n, workers)
    opts = JobOptions()
    print(f"(b) a {n}-row batch, {chunk} rows per task")
    (ser, tasks), t_ser = _timed("serial (this process)",
                                 lambda: _run(run_jobs, opts, jobs, Execution("serial"), chunk))
    (par, _), t_par = _timed(f"local cluster, {workers} worker processes",
                             lambda: _run(run_jobs, opts, jobs, Execution("processes", workers=workers), chunk))
    same = sorted((r["index"], r["row"]["lowest_load_factor"]) for r in ser) == \
        sorted((r["index"], r["row"]["lowest_load_factor"]) for r in par)
    print(f"  ratio serial / cluster                       {t_ser / t_par:8.2f}")
    print(f"  per row {t_ser / n * 1e3:.1f} ms; per task mean {sum(tasks) / len(tasks):.2f} s; identical rows: {same}")
    return {"n": n, "t_item": t_ser / n, "t_ser": t_ser, "t_par": t_par, "chunk": chunk}


def bench_startup(workers: int) -> float:
    """Start-up of a local cluster: start it, run one row on each worker (its imports), close it."""
    from fea.batch.execute import Execution
    from fea.batch.run import JobOptions, run_jobs
    from fea.batch.schedule import expand, load_schedule

    with tempfile.TemporaryDirectory() as d:
        p = Path(d) / "one.toml"
        p.write_text(f'title = "one"\nbase = {str(ROOT / "cases" / "two_storey_column.toml")!r}\n'
                     + "".join(f'[[row]]\nmark = "S{i}"\n' for i in range(workers)))
        jobs = expand(load_schedule(p))
    print("(c) start-up of the local cluster (start, one row per worker with its imports, close)")
    _, t0 = _timed(f"local cluster, {workers} worker processes",
                   lambda: _run(run_jobs, JobOptions(), jobs, Execution("processes", workers=workers), 1))
    return t0


def estimate(label: str, r: dict, workers: int, t0: float, big: int = 100, n_big: int = 100_000) -> None:
    """Expected time on ``big`` workers: ``n t / W`` plus the start-up ``t0`` measured here plus an overhead per
    task, taken from what the 2-worker run lost beyond perfect sharing and its start-up (an upper bound: the
    client's own work on the 2 shared cores and the imbalance of the last tasks are counted in it)."""
    ideal = r["t_ser"] / workers
    n_tasks = -(-r["n"] // r["chunk"])
    per_task = max(0.0, r["t_par"] - ideal - t0) * workers / n_tasks
    t_item = r["t_item"]
    chunk_big = max(1, min(64, -(-n_big // (4 * big))))
    tasks_big = -(-n_big // chunk_big)
    t_big = n_big * t_item / big + tasks_big * per_task / big + t0
    t_one = n_big * t_item
    print(f"  {label}: {n_big:,} items of {t_item * 1e3:.0f} ms: one process {t_one / 3600:.1f} h; {big} workers "
          f"(chunks of {chunk_big}, {per_task * 1e3:.0f} ms overhead per task, {t0:.1f} s start-up) "
          f"about {t_big / 60:.1f} min, a speed-up of about {t_one / t_big:.0f}")


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--samples", type=int, default=2000)
    ap.add_argument("--rows", type=int, default=500)
    ap.add_argument("--workers", type=int, default=2)
    a = ap.parse_args()
    print(f"load average before: {os.getloadavg()[0]:.2f} {os.getloadavg()[1]:.2f}; cores: {os.cpu_count()}")
    r1 = bench_samples(a.samples, a.workers) if a.samples else None
    r2 = bench_rows(a.rows, a.workers) if a.rows else None
    t0 = bench_startup(a.workers)
    print(f"(d) expected at 100 workers, from the times above (load average now {os.getloadavg()[0]:.2f})")
    if r1:
        estimate("reliability", r1, a.workers, t0)
    if r2:
        estimate("batch", r2, a.workers, t0)


if __name__ == "__main__":
    main()
