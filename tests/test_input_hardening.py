"""Hardening of the input side (issue 11): every misreading, denial of service and leak it found.

Each case runs ``stanchion`` in-process and must give exit 2, one line on standard error naming the
key (or the file), no traceback, and nothing quoted from a file that is not a valid input.
"""

from __future__ import annotations

import time
from pathlib import Path

import pytest

from fea.io import limits

from .conftest import ROOT, run_cli

BASE = '''title = "hardening probe"

[units]
length = "{length_unit}"
force = "kN"

[material]
E = "210 GPa"

[[segment]]
length = "{length}"
I = "8e6 mm^4"

[[restraint]]
at = "base"
lateral = "rigid"
rotation = "{rotation}"

[[restraint]]
lateral = "rigid"
at = "top"

[[load]]
axial = "100 kN"
at = "top"
'''

SECRET = "TOPSECRET-hunter2"


def case_text(length: str = "4.5 m", rotation: str = "2.5 MN*m/rad", length_unit: str = "m") -> str:
    return BASE.format(length=length, rotation=rotation, length_unit=length_unit)


def write_case(tmp_path: Path, text: str, name: str = "c.toml") -> Path:
    p = tmp_path / name
    p.write_text(text, encoding="utf-8")
    return p


def one_line_error(out, *needles: str) -> str:
    """Exit 2, a single line on standard error holding every needle, no traceback, nothing on stdout."""
    assert out.returncode == 2, (out.stdout, out.stderr)
    err = out.stderr.strip()
    assert "\n" not in err, err
    assert "Traceback" not in err
    for needle in needles:
        assert needle in err, err
    return err


def test_base_case_runs(tmp_path):
    out = run_cli("check", str(write_case(tmp_path, case_text())))
    assert out.returncode == 0, out.stderr


# -- 1. no silent misreading ------------------------------------------------------------------------

@pytest.mark.parametrize("value, hint", [
    ("4,5 m", "'4.5'"),
    ("4 500 mm", "4500"),
    ("1 200 mm", "1200"),
    ("1'200 mm", "1200"),
    ("3 6 m", "two numbers"),
    ("4.5.6 m", "one decimal point"),
    ("4 m 5", "number after its unit"),
    ("10**400 m", "no arithmetic"),
    ("1,200 mm", "thousands"),
    ("2*2 m", "no arithmetic"),
    ("4 m*2", "number"),
])
def test_length_misreadings_refused(tmp_path, value, hint):
    out = run_cli("check", str(write_case(tmp_path, case_text(length=value))))
    one_line_error(out, "segment[1].length", repr(value), hint)


def test_comma_in_rotational_stiffness_refused(tmp_path):
    out = run_cli("check", str(write_case(tmp_path, case_text(rotation="2,5 MN*m/rad"))))
    one_line_error(out, "restraint[1].rotation", "'2,5 MN*m/rad'", "'2.5'")


def test_power_tower_returns_at_once(tmp_path):
    start = time.perf_counter()
    out = run_cli("check", str(write_case(tmp_path, case_text(length="9**9**9 m"))))
    assert time.perf_counter() - start < 5
    one_line_error(out, "segment[1].length", "'9**9**9 m'", "no arithmetic")


def test_wrong_case_unit_gets_did_you_mean(tmp_path):
    text = case_text().replace('axial = "100 kN"', 'axial = "450 KN"')
    assert "450 KN" in text
    one_line_error(run_cli("check", str(write_case(tmp_path, text))), "load[1].axial", "did you mean kN?")


def test_value_too_large_for_double_refused(tmp_path):
    out = run_cli("check", str(write_case(tmp_path, case_text(length="1e308 km"))))
    one_line_error(out, "segment[1].length", "double precision")


@pytest.mark.parametrize("unit", ["2*m", "mm*0", "MM"])
def test_display_units_only_from_the_list(tmp_path, unit):
    out = run_cli("check", str(write_case(tmp_path, case_text(length_unit=unit))))
    one_line_error(out, "units.length", "expected one of m, cm, mm, in, ft")


def _catalogue(tmp_path: Path, text: str, name: str = "cat.csv") -> Path:
    p = tmp_path / name
    p.write_bytes(text.encode("utf-8") if isinstance(text, str) else text)
    return p


def _size(catalogue: Path):
    return run_cli("size", str(ROOT / "cases" / "sizing_mezzanine_column.toml"), "--catalogue", str(catalogue),
                   "--shape", "i")


HEADER = "name,shape,b [mm],h [mm],tf [mm],tw [mm],r [mm],mass [kg/m]\n"


def test_quoted_catalogue_cell_with_comma_refused(tmp_path):
    p = _catalogue(tmp_path, HEADER + 'demo,i,200,200,"7,5",9,18,61.3\n')
    one_line_error(_size(p), "cat.csv:2.tf", "'7,5 mm'", "'7.5'")


# -- 2. limits before work --------------------------------------------------------------------------

def test_large_case_file_refused_at_once(tmp_path):
    p = tmp_path / "big.toml"
    load = '[[load]]\nat = "top"\naxial = "1 kN"\n'
    with open(p, "w", encoding="utf-8") as fh:
        fh.write(case_text())
        fh.write(load * (50_000_000 // len(load)))
    start = time.perf_counter()
    out = run_cli("check", str(p))
    assert time.perf_counter() - start < 5
    one_line_error(out, str(p), f"{limits.MAX_CASE_BYTES:,} bytes")


def test_too_many_segments_refused(tmp_path):
    seg = '[[segment]]\nlength = "1 mm"\nI = "8e6 mm^4"\n'
    text = case_text() + seg * limits.MAX_SEGMENTS
    one_line_error(run_cli("check", str(write_case(tmp_path, text))), "segment:", "limit")


def test_too_many_restraints_refused(tmp_path):
    rest = '[[restraint]]\nat = "top"\nlateral = "rigid"\n'
    text = case_text() + rest * limits.MAX_RESTRAINTS
    one_line_error(run_cli("check", str(write_case(tmp_path, text))), "restraint:", "limit")


def test_too_many_sweep_points_refused(tmp_path):
    out = run_cli("sweep", str(write_case(tmp_path, case_text())), "--param", "segment[1].length", "3 m", "5 m",
                  "--param", "restraint[1].rotation", "1 MN*m/rad", "9 MN*m/rad", "--points", "1000")
    one_line_error(out, "--points", "sweep points", "limit")


def test_large_catalogue_refused(tmp_path):
    p = _catalogue(tmp_path, HEADER + "x" * (limits.MAX_CATALOGUE_BYTES + 10))
    one_line_error(_size(p), "cat.csv", "limit")


def test_too_many_catalogue_rows_refused(tmp_path):
    rows = "".join(f"s{i},i,200,200,15,9,18,61.3\n" for i in range(limits.MAX_CATALOGUE_ROWS + 1))
    one_line_error(_size(_catalogue(tmp_path, HEADER + rows)), "cat.csv", "limit")


# -- 3. errors never echo foreign content -------------------------------------------------------------

def test_password_file_as_catalogue_not_echoed(tmp_path):
    p = _catalogue(tmp_path, f"root:x:0:0:{SECRET}:/root:/bin/bash\ndaemon:x:1:1:{SECRET}:/:/bin/sh\n",
                   name="passwd")
    err = one_line_error(_size(p), "passwd", "not a section catalogue")
    assert SECRET not in err and "root:x" not in err


def test_csv_without_the_catalogue_columns_named_by_the_missing_column(tmp_path):
    p = _catalogue(tmp_path, f"user,password\nadmin,{SECRET}\n")
    err = one_line_error(_size(p), "cat.csv", "`name` column")
    assert SECRET not in err and "password" not in err


def test_binary_catalogue_named_not_shown(tmp_path):
    p = _catalogue(tmp_path, b"\xff\xfe\x00\x01" + SECRET.encode())
    err = one_line_error(_size(p), "cat.csv", "not a UTF-8 text file")
    assert SECRET not in err and "0xff" not in err


def test_catalogue_with_nul_bytes_named_not_shown(tmp_path):
    p = _catalogue(tmp_path, f"name,mass\x00{SECRET}\n")
    err = one_line_error(_size(p), "cat.csv", "not a text file")
    assert SECRET not in err


def test_foreign_file_as_case_not_echoed(tmp_path):
    p = write_case(tmp_path, f"root:x:0:0:{SECRET}:/root:/bin/bash\n", name="passwd")
    err = one_line_error(run_cli("check", str(p)), "TOML syntax error")
    assert SECRET not in err and "root:x" not in err


def test_toml_duplicate_key_not_echoed(tmp_path):
    p = write_case(tmp_path, f"[{SECRET}]\na = 1\n[{SECRET}]\n")
    err = one_line_error(run_cli("check", str(p)), "TOML syntax error", "twice")
    assert SECRET not in err


def test_binary_case_file_named(tmp_path):
    p = tmp_path / "c.toml"
    p.write_bytes(b"\xff\xfe" + SECRET.encode())
    err = one_line_error(run_cli("check", str(p)), "not UTF-8 text")
    assert SECRET not in err


# -- 7. byte-order mark ------------------------------------------------------------------------------

def test_byte_order_mark_accepted_in_case_file(tmp_path):
    p = tmp_path / "c.toml"
    p.write_bytes(b"\xef\xbb\xbf" + case_text().encode())
    plain = run_cli("check", str(write_case(tmp_path, case_text(), name="plain.toml")), "--json")
    out = run_cli("check", str(p), "--json")
    assert out.returncode == 0, out.stderr
    assert '"load_factor' in out.stdout and out.stdout.count("\n") == plain.stdout.count("\n")


def test_byte_order_mark_accepted_in_catalogue(tmp_path):
    text = (ROOT / "cases" / "demo_catalogue.csv").read_text(encoding="utf-8")
    out = _size(_catalogue(tmp_path, "\ufeff" + text))
    assert out.returncode == 0, out.stderr


# -- text numbers of other forms --------------------------------------------------------------------

@pytest.mark.parametrize("bow", ["L/1,000", "L/2*500", "L/1e3e3"])
def test_bow_ratio_takes_only_its_documented_form(bow):
    from fea.errors import ModelError
    from fea.io.imperfect_input import _bow
    from fea.io.tables import Stations

    with pytest.raises(ModelError):
        _bow({"bow": bow}, Stations(4.0))


@pytest.mark.parametrize("a", ["1/7_500", "2*1/7500", "1/0", "nan/1", "1/7500/2", "inf"])
def test_rankine_constant_takes_only_a_ratio_of_numbers(a):
    from fea.errors import ModelError
    from fea.io.design_input import _rankine_a

    with pytest.raises(ModelError):
        _rankine_a(a, "design.a")


# -- texts that are printed --------------------------------------------------------------------------

def test_escape_sequence_in_title_refused(tmp_path):
    text = case_text().replace('title = "hardening probe"', 'title = "probe \\u001b[2J"')
    one_line_error(run_cli("check", str(write_case(tmp_path, text))), "title", "U+001B")


def test_line_break_in_title_printed_on_one_line(tmp_path):
    text = case_text().replace('title = "hardening probe"', 'title = "probe\\nALL CHECKS PASS"')
    out = run_cli("check", str(write_case(tmp_path, text)))
    assert out.returncode == 0, out.stderr
    assert out.stdout.splitlines()[0] == "probe ALL CHECKS PASS"


def test_number_in_a_catalogue_header_unit_refused(tmp_path):
    p = _catalogue(tmp_path, "name,A [2*cm^2],I_major [cm^4],I_minor [cm^4],mass [kg/m]\nP1,30,1200,300,23.6\n")
    one_line_error(_size(p), "cat.csv:1.A", "header")
