"""Import discipline: the kernels stay free of units, plotting and heavy optional imports.

Start-up time matters (a case should run in well under a second), so heavy
modules are imported only where they are used.  These checks start a fresh
interpreter and look at what is really loaded; the layer order and the absence
of import cycles are checked from the source in tests/test_imports.py.
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
    mods = loaded_after("import fea.solve.eigen, fea.solve.one_spring, fea.assemble, fea.mesh, fea.elements, "
                       "fea.model, fea.results")
    assert "pint" not in mods and "matplotlib" not in mods


def test_command_without_plot_skips_matplotlib_and_optimizers():
    # the whole `stanchion check` of a buckling-only case: parser, case file, analyses, summary
    code = ("import contextlib, io\n"
            "from fea.cli import main\n"
            "with contextlib.redirect_stdout(io.StringIO()):\n"
            "    assert main(['check', 'cases/shed_column.toml']) == 0\n")
    mods = loaded_after(code)
    assert "matplotlib" not in mods
    assert "scipy.optimize" not in mods
    assert "scipy.sparse" not in mods


def test_command_asks_for_one_blas_thread_unless_told():
    """The command sets one BLAS thread before numpy loads, and keeps a count the user gave."""
    import os
    import subprocess
    import sys

    code = ("import os, sys; from fea.cli import one_blas_thread; one_blas_thread(); import numpy; "
            "print(os.environ['OPENBLAS_NUM_THREADS'], os.environ['OMP_NUM_THREADS'])")
    env = {k: v for k, v in os.environ.items() if k not in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS")}
    out = subprocess.run([sys.executable, "-c", code], env=env, capture_output=True, text=True, check=True)
    assert out.stdout.split() == ["1", "1"]
    env["OPENBLAS_NUM_THREADS"] = "3"
    out = subprocess.run([sys.executable, "-c", code], env=env, capture_output=True, text=True, check=True)
    assert out.stdout.split() == ["3", "1"]
