"""``stanchion batch``: schedules, overrides, combinations, resuming, errors per row, and the same numbers as
``stanchion check``, in this process and on a Dask cluster (two worker processes on 127.0.0.1, started once for
the module).
"""

from __future__ import annotations

import csv
import json
import os
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from tests.conftest import run_cli

ROOT = Path(__file__).resolve().parents[1]
CASES = sorted((ROOT / "cases").glob("*.toml"))
BASE = ROOT / "cases" / "two_storey_column.toml"

#: A small schedule over the demo base case (invented rows).
SCHEDULE = f"""\
# DEMO (invented for a test)
title = "test schedule"
base = {str(BASE)!r}

[sections]
H160 = {{ shape = "i", b = "160 mm", h = "160 mm", tf = "13 mm", tw = "8 mm", r = "15 mm" }}

[[row]]
mark = "R1"

[[row]]
mark = "R2"
"segment[1].length" = "4.8 m"
"restraint[2].at" = "4.8 m"
"load[3].at" = "4.8 m"
"load[4].at" = "4.8 m"

[[row]]
mark = "R3"
"segment[1].section" = "H160"
"segment[2].section" = "H160"

[[row]]
mark = "R4"
"restraint[1].rotation" = "free"
"load[4].axial" = "400 kN"
"""


def _table(folder: Path) -> dict:
    return json.loads((folder / "batch.json").read_text())


def _write(tmp_path: Path, text: str, name: str = "s.toml") -> Path:
    p = tmp_path / name
    p.write_text(text, encoding="utf-8")
    return p


@pytest.fixture(scope="module")
def cluster():
    distributed = pytest.importorskip("distributed")
    with distributed.LocalCluster(host="127.0.0.1", n_workers=2, processes=True, threads_per_worker=1,
                                  dashboard_address=None) as c:
        yield c


# -- the same numbers as check -----------------------------------------------------------------------------------

def _check_numbers(data: dict) -> dict:
    design = data.get("design")
    return {"lowest": data["governing_load_factor"], "axis": data["governing_axis"],
            "K": {b["axis"]: [s["effective_length_factor"] for s in b["segments"]] for b in data["buckling"]},
            "verdict": (design.get("verdict") or ("passes" if design["passed"] else "fails")) if design else
            "no design check",
            "utilisation": design.get("max_utilisation") if design else None}


def _close(a, b) -> bool:
    if isinstance(a, dict):
        return a.keys() == b.keys() and all(_close(a[k], b[k]) for k in a)
    if isinstance(a, list):
        return len(a) == len(b) and all(_close(x, y) for x, y in zip(a, b))
    if isinstance(a, float) and isinstance(b, float):
        return a == pytest.approx(b, rel=1e-12)
    return a == b


def test_batch_of_every_demo_case_equals_check(tmp_path):
    pattern = str(ROOT / "cases" / "*.toml")
    sched = _write(tmp_path, f"# DEMO (test)\ntitle = \"every demo case\"\ncases = [{pattern!r}]\n")
    out = run_cli("batch", str(sched), "--serial", "-o", str(tmp_path / "out"))
    table = _table(tmp_path / "out")
    rows = {r["mark"]: r for r in table["rows"]}
    assert sorted(rows) == sorted(p.stem for p in CASES)
    worst = 0
    for p in CASES:
        chk = run_cli("check", str(p), "--json")
        row = rows[p.stem]
        assert row["exit_status"] == chk.returncode, p.name
        worst = max(worst, chk.returncode)
        mine = {"lowest": row["lowest_load_factor"], "axis": row["governing_axis"], "K": row["K"],
                "verdict": row["verdict"], "utilisation": row["utilisation"]}
        assert _close(mine, _check_numbers(json.loads(chk.stdout))), p.name
        # the stored result of the row is check's JSON result (the same case file, the same hash)
        stored = json.loads((tmp_path / "out" / "rows" / f"{p.stem}.json").read_text())["result"]
        assert stored["case_sha256"] == json.loads(chk.stdout)["case_sha256"]
    assert out.returncode == worst


def test_cluster_gives_the_serial_table(tmp_path, cluster):
    sched = _write(tmp_path, SCHEDULE)
    tables = {}
    for name, opts in {"serial": ["--serial"], "local": ["--workers", "2", "--chunk", "1"],
                       "scheduler": ["--scheduler", cluster.scheduler_address]}.items():
        out = run_cli("batch", str(sched), *opts, "-o", str(tmp_path / name))
        assert out.returncode in (0, 1), out.stderr
        tables[name] = [{k: v for k, v in r.items()} for r in _table(tmp_path / name)["rows"]]
    assert tables["serial"] == tables["local"] == tables["scheduler"]


# -- overrides and combinations ------------------------------------------------------------------------------------

def test_override_equals_the_edited_case_file(tmp_path):
    sched = _write(tmp_path, SCHEDULE)
    assert run_cli("batch", str(sched), "--serial", "-o", str(tmp_path / "o")).returncode in (0, 1)
    r2 = next(r for r in _table(tmp_path / "o")["rows"] if r["mark"] == "R2")
    text = BASE.read_text().replace('length = "4.2 m"', 'length = "4.8 m"').replace('"4.2 m"', '"4.8 m"')
    edited = _write(tmp_path, text, "edited.toml")
    chk = json.loads(run_cli("check", str(edited), "--json").stdout)
    assert _close({"lowest": r2["lowest_load_factor"], "utilisation": r2["utilisation"], "K": r2["K"]},
                  {k: v for k, v in _check_numbers(chk).items() if k in ("lowest", "utilisation", "K")})


COMBOS = """
[groups]
G = ["load[1]", "load[3]"]
S = ["load[2]"]
Q = ["load[4]"]

[[combination]]
name = "ULS-1"
factors = { G = 1.35, Q = 1.5, S = 0.75 }

[[combination]]
name = "as given"
factors = { G = 1.0, Q = 1.0, S = 1.0 }
"""


def test_combination_equals_the_factored_case_file(tmp_path):
    sched = _write(tmp_path, SCHEDULE + COMBOS)
    out = run_cli("batch", str(sched), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode in (0, 1), out.stderr
    rows = _table(tmp_path / "o")["rows"]
    assert len(rows) == 8 and [r["combination"] for r in rows[:2]] == ["ULS-1", "as given"]
    # the same loads factored by hand: 81 x 1.35, 34 x 0.75, 243 x 1.35, 225 x 1.5 kN (the base case's values)
    text = BASE.read_text()
    for old, new in (('"81 kN"', f'"{81 * 1.35!r} kN"'), ('"34 kN"', f'"{34 * 0.75!r} kN"'),
                     ('"243 kN"', f'"{243 * 1.35!r} kN"'), ('"225 kN"', f'"{225 * 1.5!r} kN"')):
        text = text.replace(old, new)
    ref = _check_numbers(json.loads(run_cli("check", str(_write(tmp_path, text, "f.toml")), "--json").stdout))
    assert rows[0]["lowest_load_factor"] == pytest.approx(ref["lowest"], rel=1e-9)
    assert rows[0]["utilisation"] == pytest.approx(ref["utilisation"], rel=1e-9)
    # factors of 1 leave the case as it is: the numbers of the base case itself
    ref = _check_numbers(json.loads(run_cli("check", str(BASE), "--json").stdout))
    assert _close({"lowest": rows[1]["lowest_load_factor"], "utilisation": rows[1]["utilisation"], "K": rows[1]["K"]},
                  {k: v for k, v in ref.items() if k in ("lowest", "utilisation", "K")})


def test_a_combination_without_variable_loads_is_an_error_row(tmp_path):
    sched = _write(tmp_path, SCHEDULE + COMBOS + '\n[[combination]]\nname = "G only"\nfactors = { G = 1.0 }\n')
    out = run_cli("batch", str(sched), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode == 2
    rows = [r for r in _table(tmp_path / "o")["rows"] if r["combination"] == "G only"]
    assert len(rows) == 4 and all(r["error"].startswith("loads: there is no variable load") for r in rows)


def test_a_load_in_no_group_makes_its_rows_errors(tmp_path):
    combos = COMBOS.replace('Q = ["load[4]"]\n', "").replace("Q = 1.5, ", "").replace(" Q = 1.0,", "")
    sched = _write(tmp_path, SCHEDULE + combos)
    out = run_cli("batch", str(sched), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode == 2
    rows = _table(tmp_path / "o")["rows"]
    assert all(r["outcome"] == "error" and "load[4].axial: is in no load group" in r["error"] for r in rows)
    assert rows[0]["error"].startswith("row[1] (R1): ")


# -- errors per row and resuming ---------------------------------------------------------------------------------

def test_a_bad_override_stops_only_its_row(tmp_path):
    text = SCHEDULE + '\n[[row]]\nmark = "BAD"\n"segmnt[1].length" = "4 m"\n\n[[row]]\nmark = "R5"\n'
    out = run_cli("batch", str(_write(tmp_path, text)), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode == 2
    rows = {r["mark"]: r for r in _table(tmp_path / "o")["rows"]}
    bad = rows["BAD"]
    assert bad["outcome"] == "error" and bad["error"].count("\n") == 0
    assert bad["error"].startswith("row[5] (BAD): ") and "segmnt" in bad["error"]
    assert all(r["outcome"] != "error" for m, r in rows.items() if m != "BAD")
    assert "BAD" in out.stdout and "error" in out.stdout


def test_a_refused_value_names_the_row(tmp_path):
    text = SCHEDULE + '\n[[row]]\nmark = "NEG"\n"segment[1].length" = "-4 m"\n'
    out = run_cli("batch", str(_write(tmp_path, text)), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode == 2
    neg = next(r for r in _table(tmp_path / "o")["rows"] if r["mark"] == "NEG")
    assert neg["error"].startswith("segment[1].length: ")


def test_failing_row_gives_exit_status_1(tmp_path):
    text = SCHEDULE.split("[[row]]\nmark = \"R2\"")[0] + '\n[[row]]\nmark = "HEAVY"\n"load[4].axial" = "2500 kN"\n'
    out = run_cli("batch", str(_write(tmp_path, text)), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode == 1
    rows = {r["mark"]: r for r in _table(tmp_path / "o")["rows"]}
    assert rows["HEAVY"]["outcome"] == "fails" and rows["HEAVY"]["utilisation"] > 1
    assert rows["R1"]["outcome"] == "passes"


def test_resume_runs_only_the_missing_rows(tmp_path):
    sched = _write(tmp_path, SCHEDULE)
    out_dir = tmp_path / "o"
    assert run_cli("batch", str(sched), "--serial", "-o", str(out_dir)).returncode in (0, 1)
    # as if the batch had been stopped after R1 and R3: the other results are not there; R1's stored row is
    # marked so that a reuse shows
    (out_dir / "rows" / "R2.json").unlink()
    (out_dir / "rows" / "R4.json").unlink()
    r1 = json.loads((out_dir / "rows" / "R1.json").read_text())
    r1["row"]["lowest_load_factor"] = 123.0
    (out_dir / "rows" / "R1.json").write_text(json.dumps(r1))
    out = run_cli("batch", str(sched), "--serial", "-o", str(out_dir))
    table = _table(out_dir)
    assert (table["ran"], table["reused"]) == (2, 2)
    rows = {r["mark"]: r for r in table["rows"]}
    assert rows["R1"]["lowest_load_factor"] == 123.0 and rows["R2"]["lowest_load_factor"] != 123.0
    assert "ran 2, reused 2" in out.stdout
    # a changed row runs again: its inputs' hash differs
    sched.write_text(SCHEDULE.replace('"load[4].axial" = "400 kN"', '"load[4].axial" = "410 kN"'))
    table = (run_cli("batch", str(sched), "--serial", "-o", str(out_dir)), _table(out_dir))[1]
    assert (table["ran"], table["reused"]) == (1, 3)
    table = (run_cli("batch", str(sched), "--serial", "--rerun", "-o", str(out_dir)), _table(out_dir))[1]
    assert (table["ran"], table["reused"]) == (4, 0)
    assert next(r for r in table["rows"] if r["mark"] == "R1")["lowest_load_factor"] != 123.0


def test_outputs_and_reports(tmp_path):
    text = SCHEDULE.split('[[row]]\nmark = "R3"')[0]
    out = run_cli("batch", str(_write(tmp_path, text)), "--serial", "--reports", "-o", str(tmp_path / "o"))
    assert out.returncode == 0, out.stderr
    o = tmp_path / "o"
    page = (o / "batch.html").read_text()
    assert 'href="reports/R1.html"' in page and 'href="reports/R2.html"' in page and "Caution." in page
    report = (o / "reports" / "R2.html").read_text()
    assert "calculation record" in report and "4.8" in report
    assert "R2 · Internal column" in report  # a changed run's title names its row
    with open(o / "batch.csv", newline="") as fh:
        rows = list(csv.DictReader(fh))
    assert [r["mark"] for r in rows] == ["R1", "R2"] and "K_major_1" in rows[0] and "K_minor_2" in rows[0]
    assert float(rows[1]["K_minor_1"]) == _table(o)["rows"][1]["K"]["minor"][0]


# -- schedule errors -----------------------------------------------------------------------------------------------

@pytest.mark.parametrize("change, message", [
    (("title =", "titel ="), "titel: unknown key; did you mean `title`?"),
    (('mark = "R2"', 'mark = "R1"'), "row[2].mark: 'R1' is also the mark of row[1]"),
    (('mark = "R3"', 'note = "no mark"'), "row[3].mark: missing"),
    (('"restraint[1].rotation" = "free"', '"restraint[x].rotation" = "free"'), "row[4].restraint[x].rotation: "),
    (("base = ", "bass = "), "bass: unknown key; did you mean `base`?"),
])
def test_bad_schedules(tmp_path, change, message):
    out = run_cli("batch", str(_write(tmp_path, SCHEDULE.replace(*change))), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode == 2
    assert out.stderr.count("\n") == 1 and message in out.stderr, out.stderr


@pytest.mark.parametrize("extra, message", [
    ('\n[[combination]]\nname = "X"\nfactors = { G = 1.0 }\n', "groups: missing"),
    ('\n[groups]\nG = ["load[1]"]\n[[combination]]\nname = "X"\nfactors = { W = 1.0 }\n',
     "combination[1].factors.W: is not a group"),
    ('\n[groups]\nG = ["load[1]", "load[1]"]\n', "groups.G: 'load[1]' is also in group 'G'"),
    ('\n[groups]\nG = ["restraint[1]"]\n', "groups.G[1]: 'restraint[1]' is not a load table"),
])
def test_bad_combinations(tmp_path, extra, message):
    out = run_cli("batch", str(_write(tmp_path, SCHEDULE + extra)), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode == 2 and out.stderr.count("\n") == 1 and message in out.stderr, out.stderr


def test_csv_rows(tmp_path):
    (tmp_path / "rows.csv").write_text('mark,segment[1].length,load[4].axial,note\nC1,,300 kN,plain\n'
                                       'C2,5.0 m,,taller\n', encoding="utf-8")
    text = f'# DEMO (test)\nbase = {str(BASE)!r}\nrows = "rows.csv"\n'
    out = run_cli("batch", str(_write(tmp_path, text)), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode in (0, 1), out.stderr
    stored = json.loads((tmp_path / "o" / "rows" / "C1.json").read_text())
    assert stored["overrides"] == [["load[4].axial", "300 kN"]]
    (tmp_path / "rows.csv").write_text("mark,load[4].axial\nC1,300 kN,extra\n", encoding="utf-8")
    out = run_cli("batch", str(tmp_path / "s.toml"), "--serial", "-o", str(tmp_path / "o"))
    assert out.returncode == 2 and "rows.csv line 2: has 3 cells, the header 2" in out.stderr


def test_demo_schedule_is_large_enough():
    from fea.batch.schedule import load_schedule

    s = load_schedule(ROOT / "cases" / "schedules" / "small_building.toml")
    assert len(s.rows) >= 40 and len(s.combinations) >= 3
    assert s.rows[0].case == ROOT / "cases" / "schedules" / ".." / "two_storey_column.toml"


# -- Ctrl-C ------------------------------------------------------------------------------------------------------------

def test_ctrl_c_stops_the_cluster_and_the_batch_resumes(tmp_path):
    # a real process on a local cluster: Ctrl-C (SIGINT to the process group, as a terminal sends it) ends it with
    # status 130 and its workers with it; the rows stored so far are reused by the next run
    rows = "".join(f'\n[[row]]\nmark = "M{i}"\n"load[4].axial" = "{200 + i} kN"\n' for i in range(60))
    sched = _write(tmp_path, SCHEDULE.split("[[row]]")[0] + rows)
    env = {k: v for k, v in os.environ.items()}
    p = subprocess.Popen([sys.executable, "-m", "fea", "batch", str(sched), "--workers", "2", "--chunk", "1", "-o",
                          str(tmp_path / "o")], cwd=ROOT, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True,
                         start_new_session=True, env=env)
    try:
        deadline = time.monotonic() + 90
        while time.monotonic() < deadline and len(list((tmp_path / "o" / "rows").glob("*.json"))) < 3 \
                if (tmp_path / "o" / "rows").exists() else time.monotonic() < deadline:
            time.sleep(0.2)
        os.killpg(p.pid, signal.SIGINT)
        _, err = p.communicate(timeout=60)
    finally:
        if p.poll() is None:
            os.killpg(p.pid, signal.SIGKILL)
    assert p.returncode == 130, err
    assert err.strip().splitlines()[-1] == "stanchion: interrupted"
    assert "batch stopped" in err and "Traceback" not in err
    deadline = time.monotonic() + 15
    while True:  # no worker process of the group is left running (an exited one may wait a moment to be reaped)
        ps = subprocess.run(["ps", "-eo", "pgid=,stat="], capture_output=True, text=True).stdout.splitlines()
        left = [line for line in ps if line.split()[0] == str(p.pid) and not line.split()[1].startswith("Z")]
        if not left or time.monotonic() > deadline:
            break
        time.sleep(0.5)
    assert not left
    stored = len(list((tmp_path / "o" / "rows").glob("*.json")))
    assert 3 <= stored < 60
    out = run_cli("batch", str(sched), "--serial", "-o", str(tmp_path / "o"))
    assert _table(tmp_path / "o")["reused"] == stored and out.returncode in (0, 1)
