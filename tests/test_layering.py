"""Import discipline: the kernels stay free of units, plotting and heavy optional imports.

Start-up time matters (a case should run in well under a second), so heavy
modules are imported only where they are used.
"""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def loaded_after(code: str) -> set[str]:
    probe = code + "\nimport sys\nprint(' '.join(sorted(sys.modules)))"
    out = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True, cwd=ROOT, timeout=120)
    assert out.returncode == 0, out.stderr
    return set(out.stdout.split())


def test_import_fea_is_light():
    mods = loaded_after("import fea")
    for heavy in ("pint", "matplotlib", "scipy", "scipy.sparse", "scipy.optimize"):
        assert heavy not in mods, heavy


def test_kernels_do_not_import_units_or_plotting():
    mods = loaded_after("import fea.solve.eigen, fea.solve.one_spring, fea.assemble, fea.mesh, fea.elements, fea.model")
    assert "pint" not in mods and "matplotlib" not in mods


def test_command_without_plot_skips_matplotlib_and_optimizers():
    code = ("import fea.cli\n"
            "fea.cli.build_parser()\n"
            "from fea.io.case import load_case\n"
            "from fea.pipeline import run_case\n"
            "run_case(load_case('cases/shed_column.toml'))")
    mods = loaded_after(code)
    assert "matplotlib" not in mods
    assert "scipy.optimize" not in mods
    assert "scipy.sparse" not in mods
