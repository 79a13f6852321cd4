"""``stanchion reliability CASE``: Monte Carlo strength of an imperfect column from its ``[reliability]`` table.

Every sample (its own seed, so the result does not depend on how the samples are shared out) sets the
random inputs, runs the imperfect-column analysis and keeps the strength (ultimate or first-yield load
factor).  Prints the mean, coefficient of variation, characteristic fractile with its confidence interval
and, given a design load, the probability of failure and the reliability index with their sampling errors;
writes the samples (``--csv``, ``--json``) and the histogram and cumulative distribution (``--plot``).

Exit status 0; 1 when a sample has no strength (its inputs were refused or its analysis found no such
load factor: the statistics leave it out); 2 bad input.
"""

from __future__ import annotations

import argparse
import dataclasses
import json
import sys
from pathlib import Path

from ..errors import FeaError
from .batch import add_execution_arguments, execution_of
from .common import EXIT_FAILED_CHECK, EXIT_OK
from .outputs import OutputPlan, add_no_clobber, check_plot, figure_writer

NAME = "reliability"
HELP = "Monte Carlo strength of an imperfect column: samples of its [reliability] variables, pf and beta"
DESCRIPTION = ("Sample the random inputs of a case's [reliability] table (docs/reliability.md), analyse each "
               "sample's imperfect column and report the strength's mean, COV and characteristic fractile and, "
               "given a design load, the probability of failure and reliability index.")


def add_arguments(p: argparse.ArgumentParser) -> None:
    p.add_argument("case", help="case file (TOML) with [imperfection] and [reliability] tables")
    p.add_argument("--samples", type=int, metavar="N", help="number of samples (default: the case's)")
    p.add_argument("--seed", type=int, metavar="S", help="root seed (default: the case's)")
    p.add_argument("--strength", choices=("ultimate", "first-yield"),
                   help="each sample's strength (default: the case's, else ultimate)")
    p.add_argument("--json", nargs="?", const="-", metavar="FILE",
                   help="write the JSON result (SI) to FILE, or to standard output instead of the summary")
    p.add_argument("--csv", metavar="FILE", help="write the samples (SI, units in the header) to FILE")
    p.add_argument("--plot", metavar="FILE", action="append", default=[],
                   help="draw the histogram to FILE and the cumulative distribution to FILE-cdf (.png, .svg or "
                        ".pdf; may be repeated)")
    add_no_clobber(p)
    add_execution_arguments(p)


def _spec(args: argparse.Namespace, case):
    from ..batch.reliability_input import MAX_SAMPLES

    spec = case.extras.get("reliability")
    if spec is None:
        raise FeaError("reliability: the case has no [reliability] table (docs/reliability.md)")
    if args.samples is not None:
        if not 1 <= args.samples <= MAX_SAMPLES:
            raise FeaError(f"--samples: expected a whole number from 1 to {MAX_SAMPLES:,}, got {args.samples}")
        spec = dataclasses.replace(spec, samples=args.samples)
    if args.seed is not None:
        if args.seed < 0:
            raise FeaError(f"--seed: expected a whole number >= 0, got {args.seed}")
        spec = dataclasses.replace(spec, seed=args.seed)
    if args.strength is not None:
        spec = dataclasses.replace(spec, strength=args.strength)
    return spec


def run(args: argparse.Namespace) -> int:
    from ..batch.execute import chunk_size, chunks_of, run_chunks
    from ..batch.output import reliability_csv, reliability_json, reliability_lines
    from ..batch.reliability import Sample, design_load_factor, run_samples, sample_payload, summarise
    from ..batch.sampling import cholesky_factor, sample_values
    from ..pipeline import load_case
    from ..version import version
    from .study_common import Progress

    execution = execution_of(args)
    case = load_case(args.case)
    spec = _spec(args, case)
    check_plot(args)
    plan = OutputPlan([args.case], no_clobber=args.no_clobber)
    if args.json and args.json != "-":
        plan.check(args.json, "--json")
    if args.csv:
        plan.check(args.csv, "--csv")
    for f in args.plot:
        plan.check(f, "--plot")
        plan.check(_cdf_path(f), "--plot")
    design, p_var = design_load_factor(spec, case)
    payload = sample_payload(case.document, spec, source=args.case)
    indices = list(range(spec.samples))
    size = chunk_size(len(indices), 1 if execution.mode == "serial" else execution.n_workers, execution.chunk)
    samples: list = []
    progress = Progress("samples")

    def keep(chunk: list, results: list) -> None:
        samples.extend(results)
        progress(len(samples), len(indices))

    def lost(chunk: list, message: str) -> None:
        factor = cholesky_factor(spec.correlation)
        dists = [v.distribution for v in spec.variables]
        keep(chunk, [Sample(index=i, values=tuple(float(x) for x in sample_values(dists, spec.seed, i, factor)),
                            strength=None, axis=None, message=f"task failed: {message}") for i in chunk])

    run_chunks(run_samples, payload, chunks_of(indices, size), execution, keep, lost)
    res = summarise(spec, samples, design, p_var)
    meta = {"units": "SI", "tool": {"name": "stanchion", "version": version()}, "title": case.title,
            "case_file": args.case, "case_sha256": case.sha256, "execution": execution.describe()}
    data = reliability_json(res, meta)
    text = json.dumps(data, indent=1, allow_nan=False)
    if args.json and args.json != "-":
        plan.add(args.json, text + "\n", "--json")
    if args.csv:
        plan.add(args.csv, reliability_csv(res), "--csv")
    written = []
    if args.plot and res.moments is not None:
        from ..batch.figures import plot_cdf, plot_histogram

        hist, cdf = plot_histogram(res, case.title), plot_cdf(res, case.title)
        for f in args.plot:
            plan.add(f, figure_writer(hist), "--plot")
            plan.add(_cdf_path(f), figure_writer(cdf), "--plot")
            written += [f, str(_cdf_path(f))]
    plan.write()
    if written:
        print("wrote " + ", ".join(written), file=sys.stderr)
    if args.json == "-":
        print(text)
    else:
        for line in reliability_lines(res, meta):
            print(line)
    return EXIT_FAILED_CHECK if res.n_missing else EXIT_OK


def _cdf_path(f: str) -> Path:
    p = Path(f)
    return p.with_name(f"{p.stem}-cdf{p.suffix}")
