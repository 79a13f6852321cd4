"""``stanchion explore CASE``: a local web page with sliders for the uncertain inputs of a case.

The page shows the column and its lowest mode in every plane, the lowest load
factors, alpha_cr and its classification, every segment's K and N_cr, the
design utilisation and verdict and the run's warnings, and updates them as a
slider moves.  It is served on 127.0.0.1 only, under a random token; the
server stops on Ctrl-C or after an idle time (docs/explorer.md).
"""

from __future__ import annotations

import argparse
import sys

from .common import EXIT_OK

NAME = "explore"
HELP = "open a local web page with sliders for the uncertain inputs of a case (springs, loads, bow)"
DESCRIPTION = (HELP + ". The page is served on 127.0.0.1 at a free port under a random token, works offline, "
               "and saves changed values as a new case file in the case's folder. Stop it with Ctrl-C.")


def _minutes(text: str) -> float:
    try:
        v = float(text)
    except ValueError:
        v = float("nan")
    if not v > 0 or v == float("inf"):
        raise argparse.ArgumentTypeError(f"expected a number of minutes > 0, got {text!r}")
    return v


def _port(text: str) -> int:
    if not text.isdigit() or not 0 <= int(text) <= 65535:
        raise argparse.ArgumentTypeError(f"expected a port number from 0 to 65535 (0: any free port), got {text!r}")
    return int(text)


def add_arguments(p: argparse.ArgumentParser) -> None:
    p.add_argument("case", help="case file (TOML), see cases/README.md")
    p.add_argument("--port", type=_port, default=0, metavar="N",
                   help="TCP port on 127.0.0.1 (default 0: any free port)")
    p.add_argument("--no-browser", action="store_true", help="only print the address; do not open a browser")
    p.add_argument("--idle-timeout", type=_minutes, default=30.0, metavar="MINUTES",
                   help="stop after this many minutes without a request from the page (default 30)")


def run(args: argparse.Namespace) -> int:
    from ..explore.server import ExploreServer
    from ..explore.state import Explorer

    explorer = Explorer.from_file(args.case)
    try:
        server = ExploreServer(explorer, port=args.port, idle_timeout=60.0 * args.idle_timeout)
    except OSError as exc:
        print(f"stanchion: error: cannot listen on 127.0.0.1:{args.port}: {exc.strerror or exc}", file=sys.stderr)
        return 2
    server.start()
    print(f"stanchion explore: {explorer.case.title or args.case}")
    print(f"  open {server.url}")
    print("  (this address works on this computer only; Ctrl-C stops the server)", flush=True)
    if not args.no_browser:
        import webbrowser

        try:
            webbrowser.open(server.url)
        except Exception:  # no browser found: the address is printed
            pass
    why = "stopped (Ctrl-C)"
    try:
        if server.wait() == "idle":
            why = f"stopped after {args.idle_timeout:g} minutes without a request"
    except KeyboardInterrupt:
        pass
    finally:
        server.stop()
    print(f"stanchion explore: {why}", file=sys.stderr)
    return EXIT_OK
