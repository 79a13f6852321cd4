"""Output files are safe (issue 11, item 4): never an input, never a folder or device, checked before the
computation, all written or none, with the umask's mode, and ``--no-clobber`` refuses to overwrite."""

from __future__ import annotations

import os
import shutil
import stat
from pathlib import Path

import pytest

from fea.errors import FeaError
from fea.util.files import write_all, write_atomic
from tests.conftest import ROOT, run_cli

CASE = ROOT / "cases" / "shed_column.toml"
STUDY = ROOT / "cases" / "study_fixity_chart.toml"
SIZING = ROOT / "cases" / "sizing_mezzanine_column.toml"
CATALOGUE = ROOT / "cases" / "demo_catalogue.csv"


@pytest.fixture
def case(tmp_path: Path) -> Path:
    p = tmp_path / "c.toml"
    shutil.copy(CASE, p)
    return p


def _one_line_error(run, status: int = 2) -> str:
    assert run.returncode == status, (run.stdout, run.stderr)
    lines = run.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("stanchion: error:"), run.stderr
    return lines[0]


def _hidden(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if p.name.startswith("."))


# ---------------------------------------------------------------------------
# the output is an input file


def test_json_onto_the_case_file_is_refused_and_the_case_is_kept(case: Path):
    before = case.read_bytes()
    msg = _one_line_error(run_cli("check", str(case), "--json", str(case)))
    assert "input file" in msg
    assert case.read_bytes() == before


def test_the_case_file_through_a_link_or_another_spelling_is_refused(case: Path, tmp_path: Path):
    before = case.read_bytes()
    link = tmp_path / "link.json"
    link.symlink_to(case)
    hard = tmp_path / "hard.json"
    os.link(case, hard)
    other = tmp_path / "sub" / ".." / "c.toml"
    (tmp_path / "sub").mkdir()
    for target in (link, hard, other):
        _one_line_error(run_cli("check", str(case), "--json", str(target)))
    _one_line_error(run_cli("check", "c.toml", "--json", "./sub/../c.toml", cwd=tmp_path))
    assert case.read_bytes() == before


def test_catalogue_and_report_inputs_are_refused(tmp_path: Path):
    cat = tmp_path / "cat.csv"
    shutil.copy(CATALOGUE, cat)
    before = cat.read_bytes()
    _one_line_error(run_cli("size", str(SIZING), "--catalogue", str(cat), "--json", str(cat)))
    assert cat.read_bytes() == before
    case = tmp_path / "c.toml"
    shutil.copy(CASE, case)
    _one_line_error(run_cli("report", str(case), "--markdown", str(case)))  # wrong suffix is refused too
    link = tmp_path / "c.html"
    link.symlink_to(case)
    _one_line_error(run_cli("report", str(case), "-o", str(link)))
    assert case.read_bytes() == CASE.read_bytes()


# ---------------------------------------------------------------------------
# existing paths that are not regular files


def test_folder_device_pipe_and_links_to_them_are_not_replaced(case: Path, tmp_path: Path):
    folder = tmp_path / "out.json"
    folder.mkdir()
    pipe = tmp_path / "pipe.json"
    os.mkfifo(pipe)
    dev = tmp_path / "null.json"
    dev.symlink_to("/dev/null")
    dlink = tmp_path / "dlink.json"
    dlink.symlink_to(folder)
    for target in (folder, pipe, dev, dlink):
        msg = _one_line_error(run_cli("check", str(case), "--json", str(target)))
        assert "not a regular file" in msg
    assert folder.is_dir() and stat.S_ISFIFO(os.lstat(pipe).st_mode)
    assert dev.is_symlink() and dlink.is_symlink()
    _one_line_error(run_cli("check", str(case), "--json", "/dev/null"))


def test_the_writer_never_replaces_a_folder(tmp_path: Path):
    (tmp_path / "d.txt").mkdir()
    with pytest.raises(OSError):
        write_all([(tmp_path / "a.txt", "a"), (tmp_path / "d.txt", "d")])
    assert not (tmp_path / "a.txt").exists() and _hidden(tmp_path) == []


# ---------------------------------------------------------------------------
# output folders, checked before any work


def test_missing_folder_is_a_clear_exit_2_before_the_sweep(tmp_path: Path):
    msg = _one_line_error(run_cli("sweep", str(STUDY), "--jobs", "1", "--csv", str(tmp_path / "missing" / "x.csv")))
    assert "does not exist" in msg
    # the check comes before the analysis: a missing folder fails even when the run would fail later
    for args in (("check", str(CASE), "--json", "missing/x.json"), ("check", str(CASE), "--plot", "missing/x.png"),
                 ("size", str(SIZING), "--catalogue", str(CATALOGUE), "--plot", "missing/x.png"),
                 ("report", str(CASE), "-o", "missing/x.html"),
                 ("bounds", str(STUDY), "--json", "missing/x.json"),
                 ("sensitivity", str(STUDY), "--json", "missing/x.json"),
                 ("brace", str(CASE), "--plot", "missing/x.png"),
                 ("init", "missing/x.toml")):
        assert "does not exist" in _one_line_error(run_cli(*args, cwd=tmp_path)), args


def test_a_file_as_folder_is_refused(case: Path, tmp_path: Path):
    (tmp_path / "f").write_text("x")
    assert "not a folder" in _one_line_error(run_cli("check", str(case), "--json", str(tmp_path / "f" / "x.json")))


@pytest.mark.skipif(os.geteuid() == 0, reason="the superuser may write into read-only folders")
def test_read_only_folder_is_exit_2(case: Path, tmp_path: Path):
    ro = tmp_path / "ro"
    ro.mkdir()
    ro.chmod(0o555)
    try:
        assert "not writable" in _one_line_error(run_cli("check", str(case), "--json", str(ro / "x.json")))
    finally:
        ro.chmod(0o755)


# ---------------------------------------------------------------------------
# all or none, umask, no hidden files


def test_one_bad_output_writes_none(case: Path, tmp_path: Path):
    old = tmp_path / "ok.json"
    old.write_text("old")
    _one_line_error(run_cli("check", str(case), "--json", str(old), "--plot", str(tmp_path / "missing" / "x.png")))
    assert old.read_text() == "old"
    assert _hidden(tmp_path) == []


def test_a_failure_while_writing_leaves_every_target_and_no_temporary_file(tmp_path: Path):
    a, b = tmp_path / "a.json", tmp_path / "b.png"
    a.write_text("old a")

    def fail(tmp: str) -> None:
        Path(tmp).write_text("half")
        raise KeyboardInterrupt

    with pytest.raises(KeyboardInterrupt):
        write_all([(a, "new a"), (b, fail)])
    assert a.read_text() == "old a" and not b.exists()
    assert _hidden(tmp_path) == []


def test_outputs_follow_the_umask(case: Path, tmp_path: Path):
    old = os.umask(0o027)
    try:
        write_atomic(tmp_path / "w.txt", "x")
        assert stat.S_IMODE((tmp_path / "w.txt").stat().st_mode) == 0o640
        r = run_cli("check", str(case), "--json", str(tmp_path / "r.json"), "--plot", str(tmp_path / "r.svg"))
        assert r.returncode == 0, r.stderr
    finally:
        os.umask(old)
    for name in ("r.json", "r.svg"):
        assert stat.S_IMODE((tmp_path / name).stat().st_mode) == 0o640, name
    os.umask(0o022)
    try:
        write_atomic(tmp_path / "v.txt", "x")
    finally:
        os.umask(old)
    assert stat.S_IMODE((tmp_path / "v.txt").stat().st_mode) == 0o644


def test_json_and_plots_written_together(case: Path, tmp_path: Path):
    r = run_cli("check", str(case), "--json", str(tmp_path / "r.json"), "--plot", str(tmp_path / "m.png"))
    assert r.returncode == 0, r.stderr
    assert (tmp_path / "r.json").stat().st_size > 0 and (tmp_path / "m.png").stat().st_size > 0
    assert _hidden(tmp_path) == []


# ---------------------------------------------------------------------------
# --no-clobber


@pytest.mark.parametrize("args", [
    ("check", str(CASE), "--json", "OUT.json"),
    ("check", str(CASE), "--plot", "OUT.svg"),
    ("report", str(CASE), "-o", "OUT.html"),
    ("report", str(CASE), "--markdown", "OUT.md"),
    ("size", str(SIZING), "--catalogue", str(CATALOGUE), "--json", "OUT.json"),
    ("size", str(SIZING), "--catalogue", str(CATALOGUE), "--plot", "OUT.svg"),
    ("sweep", str(STUDY), "--jobs", "1", "--csv", "OUT.csv"),
    ("bounds", str(STUDY), "--json", "OUT.json"),
    ("sensitivity", str(STUDY), "--json", "OUT.json"),
    ("brace", str(CASE), "--plot", "OUT.svg"),
    ("init", "OUT.toml"),
])
def test_no_clobber_refuses_an_existing_output(args, tmp_path: Path):
    target = next(a for a in args if a.startswith("OUT."))
    (tmp_path / target).write_text("keep")
    msg = _one_line_error(run_cli(*args, "--no-clobber", cwd=tmp_path))
    assert "exists" in msg
    assert (tmp_path / target).read_text() == "keep"


def test_without_no_clobber_an_existing_file_is_replaced(case: Path, tmp_path: Path):
    out = tmp_path / "r.json"
    out.write_text("old")
    assert run_cli("check", str(case), "--json", str(out)).returncode == 0
    assert out.read_text().startswith("{")


def test_plan_refuses_one_file_named_twice(tmp_path: Path):
    from fea.cli.outputs import OutputPlan

    plan = OutputPlan([])
    plan.add(tmp_path / "a.json", "a", "--json")
    with pytest.raises(FeaError, match="twice"):
        plan.add(tmp_path / "." / "a.json", "b", "--plot")
