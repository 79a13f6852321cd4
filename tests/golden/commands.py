"""The command lines whose output is pinned by ``tests/golden/outputs.json``."""

from __future__ import annotations

from pathlib import Path

CASES = sorted(p.stem for p in (Path(__file__).resolve().parents[2] / "cases").glob("*.toml"))

COMMANDS: dict[str, list[str]] = {}
for _c in CASES:
    COMMANDS[f"check-json:{_c}"] = ["check", f"cases/{_c}.toml", "--json"]
    COMMANDS[f"check-text:{_c}"] = ["check", f"cases/{_c}.toml"]
COMMANDS["check-text-units:shed_column"] = ["check", "cases/shed_column.toml", "--units", "N,mm"]
COMMANDS["check-only-buckling:crooked_post"] = ["check", "cases/crooked_post.toml", "--only-buckling", "--json"]
for _c in ("study_fixity_chart", "study_girt_braced_column", "study_three_segment"):
    for _cmd in ("sweep", "brace", "sensitivity", "bounds"):
        COMMANDS[f"{_cmd}-text:{_c}"] = [_cmd, f"cases/{_c}.toml"]
        COMMANDS[f"{_cmd}-json:{_c}"] = [_cmd, f"cases/{_c}.toml", "--json"]
COMMANDS["size-text:sizing_mezzanine_column"] = ["size", "cases/sizing_mezzanine_column.toml",
                                                 "--catalogue", "cases/demo_catalogue.csv"]
COMMANDS["size-json:sizing_mezzanine_column"] = ["size", "cases/sizing_mezzanine_column.toml",
                                                 "--catalogue", "cases/demo_catalogue.csv", "--json"]
