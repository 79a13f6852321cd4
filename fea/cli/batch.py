"""``stanchion batch SCHEDULE``: every row of a column schedule under every load combination, on Dask.

Each run's result is written to ``DIR/rows/NAME.json`` as soon as it comes back (atomically), so a batch
that was stopped resumes where it stopped: a row whose file exists and whose inputs' hash matches is not
run again (``--rerun`` runs every row).  A row that cannot run is reported with its one-line message and
the others go on.  At the end the table (``DIR/batch.csv``, ``DIR/batch.json``) and the summary page
(``DIR/batch.html``, linking ``DIR/reports/NAME.html`` with ``--reports``) are written together.

Exit status: the highest of the rows' (0 every row passes or has no design check; 1 a row fails, is not
verified or carries a run warning; 2 a row's input is refused; 3 an internal error in a row), or 2 at once
for a schedule that cannot be read.  The execution options (``--serial``, ``--workers``, ``--threads``,
``--scheduler``, ``--chunk``) are shared with ``stanchion reliability``.
"""

from __future__ import annotations

import argparse
import datetime
import json
import sys
from pathlib import Path
from typing import TYPE_CHECKING, Any

from ..errors import FeaError

if TYPE_CHECKING:
    from ..batch.execute import Execution
    from ..batch.schedule import Job

NAME = "batch"
HELP = "check every row of a column schedule under every load combination (on a local or remote Dask cluster)"
DESCRIPTION = ("Run a schedule of columns (docs/batch.md): case files, or a base case with rows of overrides, "
               "under load combinations. Writes one result per run as it finishes (an interrupted batch resumes), "
               "the table as CSV and JSON and a summary page.")

#: Format tag of a row's result file.
ROW_FORMAT = "stanchion batch row 1"


def add_execution_arguments(p: argparse.ArgumentParser) -> None:
    """Where the runs go: shared by ``batch`` and ``reliability``."""
    g = p.add_argument_group("execution", "default: a local Dask cluster with one worker process per core")
    mode = g.add_mutually_exclusive_group()
    mode.add_argument("--serial", action="store_true", help="run in this process, one after the other (no Dask)")
    mode.add_argument("--threads", action="store_true", help="a local Dask cluster of threads in this process")
    mode.add_argument("--scheduler", metavar="ADDRESS",
                      help="an existing Dask cluster, e.g. tcp://10.0.0.5:8786 (its workers need the same version "
                           "of stanchion)")
    g.add_argument("--workers", type=int, metavar="N", help="worker processes (threads) of the local cluster "
                                                            "(default: one per core)")
    g.add_argument("--chunk", type=int, metavar="N", help="runs per task (default: about four tasks per worker, "
                                                          "at most 64 runs each)")


def execution_of(args: argparse.Namespace) -> Execution:
    from ..batch.execute import Execution

    mode = "serial" if args.serial else "threads" if args.threads else "scheduler" if args.scheduler else "processes"
    if args.workers is not None and mode in ("serial", "scheduler"):
        raise FeaError(f"--workers: sets the local cluster's size; not with --{mode}")
    return Execution(mode=mode, workers=args.workers, address=args.scheduler, chunk=args.chunk)


def add_arguments(p: argparse.ArgumentParser) -> None:
    p.add_argument("schedule", help="schedule file (TOML), see docs/batch.md")
    p.add_argument("-o", "--output", metavar="DIR",
                   help="folder of the results (default: the schedule's name with -batch, in the current folder)")
    p.add_argument("--reports", action="store_true", help="also write each run's calculation record "
                                                          "(DIR/reports/NAME.html), linked from the summary page")
    p.add_argument("--rerun", action="store_true", help="run every row again, even those with a stored result")
    p.add_argument("--modes", type=int, metavar="N", help="buckling modes per plane (default: each case's)")
    p.add_argument("--json", action="store_true", help="print the table as JSON instead of the summary")
    add_execution_arguments(p)


def _folder(args: argparse.Namespace) -> Path:
    out = Path(args.output) if args.output else Path(Path(args.schedule).stem + "-batch")
    parent = out.parent if str(out.parent) else Path(".")
    if not parent.is_dir():
        raise FeaError(f"--output: folder {str(parent)!r} does not exist")
    if out.exists() and not out.is_dir():
        raise FeaError(f"--output: {str(out)!r} exists and is not a folder")
    return out


def _stored(path: Path, job: Job, reports: bool, report_path: Path) -> dict | None:
    """The stored result of ``job`` when it is the result of the same inputs (and its report exists if asked)."""
    if job.error is not None or not path.is_file() or (reports and not report_path.is_file()):
        return None
    try:
        data = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None
    if not isinstance(data, dict) or data.get("format") != ROW_FORMAT or \
            data.get("inputs_sha256") != job.inputs_sha256 or not isinstance(data.get("row"), dict):
        return None
    return data


def run(args: argparse.Namespace) -> int:
    from ..batch.execute import chunk_size, chunks_of, run_chunks
    from ..batch.output import batch_csv, batch_json, batch_lines
    from ..batch.page import summary_page
    from ..batch.run import JobOptions, run_jobs
    from ..batch.schedule import expand, load_schedule
    from ..util.files import write_all, write_atomic
    from ..version import version
    from .study_common import Progress

    if args.modes is not None and not 1 <= args.modes <= 50:
        raise FeaError(f"--modes: expected a whole number from 1 to 50, got {args.modes}")
    execution = execution_of(args)
    schedule = load_schedule(args.schedule)
    out = _folder(args)
    jobs = expand(schedule, options={"modes": args.modes}, version=version())
    out.mkdir(exist_ok=True)
    (out / "rows").mkdir(exist_ok=True)
    if args.reports:
        (out / "reports").mkdir(exist_ok=True)
    done: dict[int, dict] = {}
    todo = []
    for job in jobs:
        stored = None if args.rerun else _stored(out / "rows" / f"{job.name}.json", job, args.reports,
                                                 out / "reports" / f"{job.name}.html")
        if stored is not None:
            done[job.index] = stored
        else:
            todo.append(job)
    reused = len(done)
    progress = Progress("batch")
    size = chunk_size(len(todo), 1 if execution.mode == "serial" else execution.n_workers, execution.chunk)

    def keep(chunk: list, results: list[dict[str, Any]]) -> None:
        for res in results:
            report = res.pop("report", None)
            record = {"format": ROW_FORMAT, **res}
            if report is not None:
                write_atomic(out / "reports" / f"{res['name']}.html", report)
            text = json.dumps(record, indent=1, allow_nan=False, default=str) + "\n"
            write_atomic(out / "rows" / f"{res['name']}.json", text)
            done[res["index"]] = record
        progress(len(done) - reused, len(todo))

    def lost(chunk: list, message: str) -> None:
        from ..batch.run import error_row

        keep(chunk, [{"index": j.index, "name": j.name, "mark": j.mark, "combination": j.combination,
                      "inputs_sha256": "", "case": j.label, "base": j.base, "overrides": [], "result": None,
                      "row": error_row(j.mark, j.combination, f"task failed: {message}", status=3), "seconds": 0.0}
                     for j in chunk])

    try:
        run_chunks(run_jobs, JobOptions(n_modes=args.modes, reports=args.reports), chunks_of(todo, size), execution,
                   keep, lost)
    except KeyboardInterrupt:
        print(f"stanchion: batch stopped: {len(done)} of {len(jobs)} runs are stored in {out}/rows; run the same "
              "command again to go on", file=sys.stderr)
        raise
    rows = []
    reports = {}
    for job in jobs:
        rec = done[job.index]
        rows.append({**rec["row"], "name": job.name, "case": rec.get("case", job.label)})
        if args.reports and rec["row"]["outcome"] != "error":
            reports[job.name] = f"reports/{job.name}.html"
    meta = {"tool": {"name": "stanchion", "version": version()}, "title": schedule.title,
            "schedule": schedule.source, "schedule_sha256": schedule.sha256, "version": version(),
            "date": datetime.date.today().isoformat(), "execution": execution.describe(),
            "n_rows": len(schedule.rows), "n_combinations": len(schedule.combinations), "ran": len(todo),
            "reused": reused}
    table = batch_json({k: v for k, v in meta.items() if k != "version"}, rows)
    files = [out / "batch.csv", out / "batch.json", out / "batch.html"]
    write_all([(files[0], batch_csv(rows)),
               (files[1], json.dumps(table, indent=1, allow_nan=False, default=str) + "\n"),
               (files[2], summary_page(meta, rows, reports, schedule.combinations, dict(schedule.groups)))])
    if args.json:
        print(json.dumps(table, indent=1, allow_nan=False, default=str))
    else:
        for line in batch_lines(meta, rows, [str(f) for f in files]):
            print(line)
    return max((r["exit_status"] for r in rows), default=0)
