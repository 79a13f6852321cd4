"""Start-up and wall time of the `stanchion` command, measured side by side in one run.

Run:  python benchmarks/bench_cli.py [CASE]

Prints the median wall time (of 7 runs) of
  * a bare Python start-up (`python -c pass`), the floor any command pays;
  * `import fea`;
  * `stanchion check CASE` without a plot;
  * `stanchion check CASE --plot FILE.png`;
and each as a ratio to the bare start-up (the machines are shared and noisy: compare ratios).
"""

from __future__ import annotations

import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def wall(cmd: list[str], repeat: int = 7) -> float:
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        subprocess.run(cmd, cwd=ROOT, check=True, capture_output=True)
        times.append(time.perf_counter() - t)
    return statistics.median(times)


def main() -> None:
    case = sys.argv[1] if len(sys.argv) > 1 else "cases/shed_column.toml"
    py = sys.executable
    with tempfile.TemporaryDirectory() as tmp:
        rows = [
            ("python -c pass", [py, "-c", "pass"]),
            ("import fea", [py, "-c", "import fea"]),
            (f"stanchion check {case}", [py, "-m", "fea", "check", case]),
            (f"stanchion check {case} --plot x.png", [py, "-m", "fea", "check", case, "--plot", f"{tmp}/x.png"]),
        ]
        results = [(name, wall(cmd)) for name, cmd in rows]
    base = results[0][1]
    print(f"{'command':<60} {'median [s]':>10} {'x bare':>7}")
    for name, t in results:
        print(f"{name:<60} {t:10.3f} {t / base:7.1f}")
    print(f"\nimport fea alone: {results[1][1] - base:.3f} s above a bare start-up")


if __name__ == "__main__":
    main()
