"""The README's Python example runs as written, and its quick start names the test command CI runs."""

from __future__ import annotations

import contextlib
import io
import re
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def _python_blocks() -> list[str]:
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    return re.findall(r"```python\n(.*?)```", text, flags=re.S)


def test_readme_python_example_runs():
    blocks = _python_blocks()
    assert blocks, "README has no python example"
    # run as a script in a fresh namespace of this interpreter, from the repository root
    out = io.StringIO()
    with contextlib.chdir(ROOT), contextlib.redirect_stdout(out):
        exec(compile(blocks[0], "README.md", "exec"), {"__name__": "__main__"})
    stdout = out.getvalue()
    assert "lowest load factor" in stdout
    assert re.search(r"segment 1: .* K = \d+\.\d{3}", stdout)
    # the output the README shows is the output it gives
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    shown = re.search(r"It prints:\n\n```text\n(.*?)```", text, flags=re.S).group(1)
    assert stdout == shown


def test_ci_runs_the_readme_test_command():
    readme = (ROOT / "README.md").read_text(encoding="utf-8")
    ci = (ROOT / ".ci" / "run").read_text(encoding="utf-8")
    m = re.search(r'pip install -e "\.\[test\]" && (.+)', readme)
    assert m, "README quick start has no test command"
    assert m.group(1).strip().rstrip("`").strip() in ci
