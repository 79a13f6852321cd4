"""``stanchion sweep CASE``: load factor and K as one or two inputs of the case move (table, chart, JSON, CSV)."""

from __future__ import annotations

import argparse

from ..errors import FeaError
from .study_common import add_common

NAME = "sweep"
HELP = "sweep one or two inputs of a case: load factor and K as a table and chart"


def add_arguments(p: argparse.ArgumentParser) -> None:
    add_common(p, csv=True, plot=True)
    p.add_argument("--param", nargs=3, action="append", metavar=("KEY", "FROM", "TO"), default=[],
                   help="sweep KEY (e.g. restraint[1].rotation, segment[2].length) from FROM to TO, quantities "
                        "with units ('free' / 'rigid' for a spring); once or twice. Default: the case's "
                        "[study.sweep]")
    p.add_argument("--points", type=int, action="append", metavar="N",
                   help="number of values (once, or once per --param; default 21)")
    p.add_argument("--scale", choices=("linear", "log"), action="append",
                   help="spacing (once, or once per --param; default linear)")
    p.add_argument("--segments", metavar="LIST", help="segments whose K to report, e.g. '1,3' (default all)")
    p.add_argument("--method", choices=("auto", "spring", "re-solve"), default=None,
                   help="auto: spring path when every parameter is a restraint spring (default)")
    p.add_argument("--jobs", type=int, metavar="N", help="worker processes (default: the case's, else every CPU)")


def _per_param(values, i: int, default):
    if not values:
        return default
    return values[0] if len(values) == 1 else (values[i] if i < len(values) else default)


def _parameters(args: argparse.Namespace, spec) -> tuple[list, tuple[int, ...] | None, str]:
    """The swept parameters (``--param`` or the case's [study.sweep]), the segments and the method."""
    from ..io.limits import check_sweep_points
    from ..study.paths import parse_key
    from ..study.spec import ParameterSpec

    if args.param:
        if len(args.param) > 2:
            raise FeaError("--param: sweep one or two parameters")
        for name, vals in (("--points", args.points), ("--scale", args.scale)):
            if vals and len(vals) not in (1, len(args.param)):
                raise FeaError(f"{name}: give it once or once per --param")
        params = []
        for i, (k, a, b) in enumerate(args.param):
            key = parse_key(k)
            params.append(ParameterSpec(key.text, key.parse_value(a, f"{key.text} (from)"),
                                        key.parse_value(b, f"{key.text} (to)"),
                                        _per_param(args.points, i, 21), _per_param(args.scale, i, "linear")))
        segments, method = None, "auto"
    elif spec.sweep is not None:
        params, segments, method = list(spec.sweep.parameters), spec.sweep.segments, spec.sweep.method
    else:
        raise FeaError("nothing to sweep: give --param KEY FROM TO or a [study.sweep] table in the case")
    if args.segments:
        try:
            segments = tuple(int(s) - 1 for s in args.segments.split(","))
        except ValueError:
            raise FeaError(f"--segments: expected numbers such as '1,3', got {args.segments!r}") from None
    check_sweep_points((p.points for p in params), "--points")
    return params, segments, args.method or method


def run(args: argparse.Namespace) -> int:
    from ..io.study_output import case_notices, sweep_csv, sweep_dict, sweep_lines
    from ..study.paths import parse_key
    from ..study.sweep import make_range, sweep
    from ..version import version
    from .study_common import Progress, case_load_factors, check_plot, finish, jobs, load_study, plan_outputs

    study, spec = load_study(args)
    check_plot(args)
    plan = plan_outputs(args)
    params, segments, method = _parameters(args, spec)
    ranges = [make_range(study, parse_key(p.key), p.start, p.stop, p.points, p.scale) for p in params]
    res = sweep(study, ranges, segments=segments, method=method, jobs=jobs(args, spec), progress=Progress("sweep"))
    lams = case_load_factors(study)
    data = sweep_dict(study, res, version(), lams)
    figure = None
    if args.plot:
        from ..plot.study import plot_sweep

        figure = plot_sweep(res, title=study.case.title, display=study.case.display,
                            case_below_one=any(n.level == "warning" for n in case_notices(lams)))
    return finish(args, plan, data, lambda: sweep_lines(study, res, args.plot, lams), csv=sweep_csv(res), figure=figure)
