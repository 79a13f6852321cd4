"""The work of one batch task: a chunk of jobs, each parsed, run and summed up as one row of the table.

:func:`run_jobs` is what a worker runs; it never raises for a job: a job whose case is refused or whose
analysis fails gives a row with its one-line message (as ``stanchion check`` would print it) and the
exit status ``check`` would give (2 bad input, 3 internal error), and the other jobs of the chunk go on.
A job's case is parsed from its document by the case-file parser with every table of the pipeline, run by
:func:`fea.pipeline.run_case`, and written out by :func:`fea.pipeline.result_json`: the same code as
``stanchion check``, so a row of a case file given unchanged has the same JSON result as ``check``.

Pure apart from the analyses: plain data in and out (the documents and results are picklable).
"""

from __future__ import annotations

import hashlib
import time
import warnings
from dataclasses import dataclass
from typing import Any

from ..errors import FeaError
from .schedule import Job

__all__ = ["JobOptions", "run_job", "run_jobs", "table_row", "error_row", "case_text", "OUTCOMES"]

#: The outcome of a row, in the words of the table (and the exit status ``check`` gives for it).
OUTCOMES = {"passes": 0, "buckling only": 0, "fails": 1, "not verified": 1, "warning": 1, "error": 2}


@dataclass(frozen=True)
class JobOptions:
    """The command's options that change every job: buckling modes, and whether to build each report."""

    n_modes: int | None = None
    reports: bool = False


def case_text(job: Job) -> str:
    """The case file of a job: the file's own text when unchanged, else its document written as TOML under a
    comment naming the schedule row (parsing it gives the same document)."""
    if job.file_text is not None:
        return job.file_text
    import tomlkit

    head = [f"# Case of {job.label} (written by stanchion batch)", f"# base case: {job.base}"]
    head += [f"# override {k} = {v!r}"[:200] for k, v in job.overrides]
    return "\n".join(head) + "\n\n" + tomlkit.dumps(job.document or {})


def _k_values(data: dict) -> dict[str, list[float | None]]:
    return {b["axis"]: [s.get("effective_length_factor") for s in b["segments"]] for b in data["buckling"]}


def table_row(data: dict, mark: str, combination: str) -> dict[str, Any]:
    """The row of the batch table from a run's JSON result (SI)."""
    from ..io.run_warnings import fails_run

    design = data.get("design")
    if design is None:
        verdict = "no design check"
        utilisation = None
    else:
        verdict = design.get("verdict") or ("passes" if design.get("passed") else "fails")
        utilisation = design.get("max_utilisation")
    failing = fails_run(data.get("warnings", []))
    if verdict in ("fails", "not verified"):
        outcome = verdict
    elif failing:
        outcome = "warning"
    else:
        outcome = "passes" if design is not None else "buckling only"
    return {"mark": mark, "combination": combination, "governing_axis": data.get("governing_axis"),
            "lowest_load_factor": data.get("governing_load_factor"), "K": _k_values(data), "verdict": verdict,
            "utilisation": utilisation, "warnings": list(dict.fromkeys(w["key"] for w in data.get("warnings", []))),
            "outcome": outcome, "exit_status": OUTCOMES[outcome], "error": None}


def error_row(mark: str, combination: str, message: str, status: int = 2) -> dict[str, Any]:
    """The row of a job that could not run."""
    return {"mark": mark, "combination": combination, "governing_axis": None, "lowest_load_factor": None,
            "K": {}, "verdict": None, "utilisation": None, "warnings": [], "outcome": "error",
            "exit_status": status, "error": message}


def _one_line(text: object) -> str:
    return " ".join(str(text).split())


def run_job(job: Job, options: JobOptions) -> dict[str, Any]:
    """One job -> ``{"index", "name", "mark", "combination", "inputs_sha256", "case", "base", "overrides",
    "row", "result", "report", "seconds"}`` (``result`` the JSON result or None, ``report`` HTML or None)."""
    t0 = time.perf_counter()
    out: dict[str, Any] = {"index": job.index, "name": job.name, "mark": job.mark, "combination": job.combination,
                           "inputs_sha256": job.inputs_sha256, "case": job.label, "base": job.base,
                           "overrides": [[k, v] for k, v in job.overrides], "result": None, "report": None}
    if job.error is not None or job.document is None:
        out["row"] = error_row(job.mark, job.combination, job.error or "no case")
        out["seconds"] = time.perf_counter() - t0
        return out
    try:
        from ..io.case import parse_document
        from ..pipeline import CASE_TABLES, result_json, run_case

        text = case_text(job)
        sha = hashlib.sha256(text.encode("utf-8")).hexdigest() if job.file_sha256 is None else job.file_sha256
        case = parse_document(job.document, source=job.label, sha256=sha, tables=CASE_TABLES)
        with warnings.catch_warnings(record=True) as caught:
            warnings.simplefilter("always")
            res = run_case(case, n_modes=options.n_modes)
        data = result_json(res)
        out["result"] = data
        out["row"] = table_row(data, job.mark, job.combination)
        if options.reports:
            from ..pipeline import REPORT_PARTS
            from ..report import build_report, report_figures

            raised = list(dict.fromkeys(f"{w.category.__name__}: {w.message}" for w in caught))
            out["report"] = build_report(res, figures=report_figures(res), parts=REPORT_PARTS, warnings=raised,
                                         case_text=text)
    except FeaError as exc:
        out["row"] = error_row(job.mark, job.combination, _one_line(exc))
        out["result"] = None
    except Exception as exc:  # a bug, not bad input: the row says so and the others go on
        out["row"] = error_row(job.mark, job.combination,
                               _one_line(f"internal error: {type(exc).__name__}: {exc}"), status=3)
        out["result"] = None
    out["seconds"] = time.perf_counter() - t0
    return out


def run_jobs(options: JobOptions, jobs: list[Job]) -> list[dict[str, Any]]:
    """Every job of a chunk, in order (the task function shipped to the workers)."""
    return [run_job(j, options) for j in jobs]
