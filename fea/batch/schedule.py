"""Schedule files of ``stanchion batch``: rows of columns -> one job per row and load combination.

A schedule (TOML, documented in ``docs/batch.md`` and ``cases/README.md``) lists case files, or one base
case and rows of overrides by key path, optionally with rows from a CSV file, named sections, load groups
and load combinations::

    title = "Column schedule, workshop (DEMO)"
    base = "../workshop_column.toml"     # relative to the schedule file
    rows = "workshop_rows.csv"            # optional: more rows, one per line

    [sections]
    H200 = { shape = "i", b = "200 mm", h = "200 mm", tf = "15 mm", tw = "9 mm", r = "18 mm" }

    [groups]
    G = ["load[1]", "load[2]"]
    Q = ["load[3]"]

    [[combination]]
    name = "ULS-1"
    factors = { G = 1.35, Q = 1.5 }

    [[row]]
    mark = "A1"
    "segment[1].length" = "4.2 m"
    "segment[1].section" = "H200"

Each override replaces the value at its key path in a copy of the parsed case document (a table value
replaces the whole table); the job's case is then parsed from that document by the case-file parser, so
every check of a case file applies, and its errors name the row.  A key path that cannot be read at all
stops the schedule (exit status 2); a key the row's case does not have makes that row an error and the
others run.

Reads the schedule, its CSV file and the case files it names (each once); no output.
"""

from __future__ import annotations

import csv
import glob
import hashlib
import io
import json
import tomllib
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Mapping

from ..errors import CaseError, FeaError
from ..io.limits import MAX_CASE_BYTES, read_limited
from ..util.checks import as_number, as_str, as_table, as_text, check_keys
from .combinations import AS_GIVEN, Combination, check_group_member, combine
from .keys import DocKey, parse_doc_key, plain, set_value

__all__ = ["Schedule", "Row", "Job", "load_schedule", "parse_schedule", "expand", "SCHEDULE_KEYS", "ROW_KEYS",
           "MAX_JOBS", "MAX_SCHEDULE_BYTES"]

SCHEDULE_KEYS = {"title", "base", "cases", "rows", "sections", "groups", "combination", "row", "note"}
#: Keys of a [[row]] (or CSV columns) that are not overrides.
ROW_KEYS = {"mark", "case", "combinations", "note"}
COMBINATION_KEYS = {"name", "factors", "note"}
#: Largest schedule or CSV file [bytes].
MAX_SCHEDULE_BYTES = 5_000_000
#: Most jobs (rows times their combinations) of one schedule.
MAX_JOBS = 100_000
MAX_MARK = 60


@dataclass(frozen=True)
class Row:
    """One row: its mark, its case file, its overrides (key path, value) and the combinations it runs
    (None: all); ``where`` names it in messages (``row[3]``, ``rows.csv line 4``, ``cases[2]``)."""

    mark: str
    case: Path
    overrides: tuple[tuple[DocKey, Any], ...] = ()
    combinations: tuple[str, ...] | None = None
    note: str = ""
    where: str = ""


@dataclass(frozen=True)
class Schedule:
    """A parsed schedule file (paths resolved against its folder)."""

    title: str
    source: str
    sha256: str
    rows: tuple[Row, ...]
    combinations: tuple[Combination, ...] = ()
    groups: Mapping[str, tuple[DocKey, ...]] = field(default_factory=dict)
    sections: Mapping[str, dict] = field(default_factory=dict)
    note: str = ""

    def combinations_of(self, row: Row) -> tuple[Combination, ...]:
        if not self.combinations:
            return (AS_GIVEN,)
        if row.combinations is None:
            return self.combinations
        return tuple(c for c in self.combinations if c.name in row.combinations)


@dataclass(frozen=True)
class Job:
    """One run: a row under one combination, with its case document ready to parse.

    ``name`` is unique in the schedule and safe as a file name; ``label`` is the case's source shown in
    its result (the case file, or the schedule, row and combination); ``file_text`` is the case file's
    text when the document is that file's unchanged, else None; ``inputs_sha256`` identifies everything
    the result depends on (a stored result with the same hash is reused); ``error`` is set when the row's
    overrides or combination could not be applied (the job is not run).
    """

    index: int
    name: str
    mark: str
    combination: str
    label: str
    base: str
    document: dict | None
    file_text: str | None
    inputs_sha256: str
    file_sha256: str | None = None
    overrides: tuple[tuple[str, Any], ...] = ()
    error: str | None = None


def _doc_of(raw: bytes, where: str, name: str) -> tuple[dict, str]:
    try:
        text = raw.decode("utf-8").removeprefix("\ufeff")
    except UnicodeDecodeError:
        raise CaseError(where, f"{name!r} is not UTF-8 text") from None
    try:
        return tomllib.loads(text), text
    except tomllib.TOMLDecodeError as exc:
        first = str(exc).splitlines()[0] if str(exc) else "invalid TOML"
        raise CaseError(where, f"{name!r}: TOML syntax error: {first}") from None


def _mark(value: Any, where: str) -> str:
    mark = as_text(value, where).strip()
    if not mark or len(mark) > MAX_MARK or "\n" in mark:
        raise CaseError(where, f"expected a mark of 1 to {MAX_MARK} characters on one line, got {value!r}")
    return mark


def _combination_names(value: Any, where: str, known: tuple[str, ...]) -> tuple[str, ...]:
    names = [s.strip() for s in value.split(";") if s.strip()] if isinstance(value, str) else value
    if not isinstance(names, list) or not all(isinstance(n, str) for n in names):
        raise CaseError(where, f"expected a list of combination names, got {value!r}")
    for n in names:
        if n not in known:
            raise CaseError(where, f"{n!r} is not a [[combination]] of this schedule"
                                   + (f"; expected one of {', '.join(known)}" if known else " (it has none)"))
    return tuple(names)


def _cell(text: str) -> Any:
    """A CSV cell as a TOML value when it reads as one (a number, true/false, an inline table or array),
    else as the text (quantities such as ``"4.2 m"`` stay strings)."""
    s = text.strip()
    try:
        return tomllib.loads(f"v = {s}")["v"]
    except tomllib.TOMLDecodeError:
        return s


def _row(t: Mapping[str, Any], where: str, folder: Path, base: Path | None, known: tuple[str, ...],
         sections: Mapping[str, dict]) -> Row:
    if "mark" not in t:
        raise CaseError(f"{where}.mark", "missing: every row needs a mark")
    mark = _mark(t["mark"], f"{where}.mark")
    case = folder / as_str(t["case"], f"{where}.case") if t.get("case") else base
    if case is None:
        raise CaseError(f"{where}.case", "missing: give the schedule a base case (base = ...) or the row a case")
    combos = _combination_names(t["combinations"], f"{where}.combinations", known) if t.get("combinations") else None
    note = as_text(t.get("note", ""), f"{where}.note")
    overrides = []
    for k, v in t.items():
        if k in ROW_KEYS:
            continue
        key = parse_doc_key(k, f"{where}.{k}" if len(k) <= 60 else where)
        if isinstance(v, str) and key.leaf == "section" and v in sections:
            v = sections[v]  # a named section of the schedule
        overrides.append((key, v))
    return Row(mark=mark, case=case, overrides=tuple(overrides), combinations=combos, note=note, where=where)


def _csv_rows(path: Path, field: str, folder: Path, base: Path | None, known: tuple[str, ...],
              sections: Mapping[str, dict]) -> list[Row]:
    raw = read_limited(path, MAX_SCHEDULE_BYTES, field, "rows file")
    try:
        text = raw.decode("utf-8").removeprefix("\ufeff")
    except UnicodeDecodeError:
        raise CaseError(field, f"{path.name!r} is not UTF-8 text") from None
    reader = csv.reader(io.StringIO(text))
    header = next(reader, None)
    if not header or "mark" not in [h.strip() for h in header]:
        raise CaseError(field, f"{path.name!r}: the first line must name the columns, one of them 'mark'")
    names = [h.strip() for h in header]
    dup = next((n for n in names if names.count(n) > 1), None)
    if dup:
        raise CaseError(field, f"{path.name!r}: column {dup!r} is named twice")
    rows = []
    for line, cells in enumerate(reader, start=2):
        if not any(c.strip() for c in cells):
            continue
        where = f"{path.name} line {line}"
        if len(cells) != len(names):
            raise CaseError(where, f"has {len(cells)} cells, the header {len(names)}")
        t: dict[str, Any] = {}
        for n, c in zip(names, cells):
            if not c.strip():
                continue  # an empty cell: the base case's value
            t[n] = c.strip() if n in ROW_KEYS else _cell(c)
        rows.append(_row(t, where, folder, base, known, sections))
    return rows


def _combinations(doc: dict) -> tuple[tuple[Combination, ...], dict[str, tuple[DocKey, ...]]]:
    groups_t = as_table(doc.get("groups", {}), "groups")
    groups: dict[str, tuple[DocKey, ...]] = {}
    seen: dict[str, str] = {}
    for name, members in groups_t.items():
        where = f"groups.{name}"
        if not isinstance(members, list) or not members:
            raise CaseError(where, f"expected a list of load tables or values such as [\"load[1]\"], got {members!r}")
        keys = tuple(check_group_member(m, f"{where}[{i + 1}]") for i, m in enumerate(members))
        for k in keys:
            if k.text in seen:
                raise CaseError(where, f"{k.text!r} is also in group {seen[k.text]!r}: a load belongs to one group")
            seen[k.text] = name
        groups[name] = keys
    raw = doc.get("combination", [])
    raw = [raw] if isinstance(raw, dict) else raw
    if not isinstance(raw, list):
        raise CaseError("combination", f"expected [[combination]] tables, got {raw!r}")
    if raw and not groups:
        raise CaseError("groups", "missing: combinations scale load groups; name them in [groups]")
    combos: list[Combination] = []
    for i, t in enumerate(raw):
        where = f"combination[{i + 1}]"
        t = as_table(t, where)
        check_keys(t, where, COMBINATION_KEYS)
        if "name" not in t:
            raise CaseError(f"{where}.name", "missing: every combination needs a name")
        name = _mark(t["name"], f"{where}.name")
        if any(c.name == name for c in combos):
            raise CaseError(f"{where}.name", f"{name!r} is the name of an earlier combination")
        factors = as_table(t.get("factors", {}), f"{where}.factors")
        if not factors:
            raise CaseError(f"{where}.factors", "missing: give a factor per load group, e.g. { G = 1.35, Q = 1.5 }")
        for g, f in factors.items():
            if g not in groups:
                raise CaseError(f"{where}.factors.{g}", f"is not a group of [groups]; expected one of "
                                                        f"{', '.join(groups)}")
            as_number(f, f"{where}.factors.{g}", 0.0, 100.0, what="a load factor")
        combos.append(Combination(name=name, factors={g: float(f) for g, f in factors.items()},
                                  note=as_text(t.get("note", ""), f"{where}.note")))
    return tuple(combos), groups


def parse_schedule(raw: bytes, path: Path) -> Schedule:
    """Parse the schedule file ``path`` whose bytes are ``raw`` (the files it names are read)."""
    doc, _ = _doc_of(raw, "", path.name)
    if not doc:
        raise CaseError("", "the schedule is empty: give a base case and rows, or case files")
    check_keys(doc, "", SCHEDULE_KEYS)
    folder = path.parent
    title = as_text(doc.get("title", ""), "title")
    base = folder / as_str(doc["base"], "base") if "base" in doc else None
    sections = {str(k): as_table(v, f"sections.{k}") for k, v in as_table(doc.get("sections", {}), "sections").items()}
    combos, groups = _combinations(doc)
    known = tuple(c.name for c in combos)
    rows: list[Row] = []
    cases = doc.get("cases", [])
    if not isinstance(cases, list) or not all(isinstance(c, str) for c in cases):
        raise CaseError("cases", f"expected a list of case files (glob patterns allowed), got {cases!r}")
    for i, pattern in enumerate(cases):
        where = f"cases[{i + 1}]"
        hits = sorted(glob.glob(str(folder / pattern))) if any(ch in pattern for ch in "*?[") else \
            [str(folder / pattern)]
        if not hits:
            raise CaseError(where, f"{pattern!r} matches no file")
        for h in hits:
            rows.append(Row(mark=Path(h).stem, case=Path(h), where=where))
    raw_rows = doc.get("row", [])
    raw_rows = [raw_rows] if isinstance(raw_rows, dict) else raw_rows
    if not isinstance(raw_rows, list):
        raise CaseError("row", f"expected [[row]] tables, got {raw_rows!r}")
    for i, t in enumerate(raw_rows):
        rows.append(_row(as_table(t, f"row[{i + 1}]"), f"row[{i + 1}]", folder, base, known, sections))
    if "rows" in doc:
        rows += _csv_rows(folder / as_str(doc["rows"], "rows"), "rows", folder, base, known, sections)
    if not rows:
        if base is None:
            raise CaseError("", "the schedule has no rows: give case files (cases = [...]), [[row]] tables or a "
                                "rows file")
        rows.append(Row(mark=base.stem, case=base, where="base"))
    marks: dict[str, str] = {}
    for r in rows:
        if r.mark in marks:
            raise CaseError(f"{r.where}.mark", f"{r.mark!r} is also the mark of {marks[r.mark]}: marks must be "
                                               "unique")
        marks[r.mark] = r.where
    n_jobs = sum(len(r.combinations) if r.combinations is not None else max(1, len(combos)) for r in rows)
    if n_jobs > MAX_JOBS:
        raise CaseError("", f"{n_jobs:,} rows and combinations is more than the limit of {MAX_JOBS:,}")
    return Schedule(title=title, source=str(path), sha256=hashlib.sha256(raw).hexdigest(), rows=tuple(rows),
                    combinations=combos, groups=groups, sections=sections,
                    note=as_text(doc.get("note", ""), "note"))


def load_schedule(path: str | Path) -> Schedule:
    """Read and parse a schedule file."""
    p = Path(path)
    return parse_schedule(read_limited(p, MAX_SCHEDULE_BYTES, "", "schedule file"), p)


def _safe(text: str) -> str:
    out = "".join(c if c.isalnum() or c in "-_" else "_" for c in text)
    return out.strip("_.") or "row"


def _hash(obj: Any) -> str:
    return hashlib.sha256(json.dumps(obj, sort_keys=True, default=str, ensure_ascii=True,
                                     separators=(",", ":")).encode("utf-8")).hexdigest()


def _one_line(exc: FeaError) -> str:
    return " ".join(str(exc).split())


def expand(schedule: Schedule, options: Mapping[str, Any] | None = None, version: str = "") -> list[Job]:
    """One job per row and combination, in schedule order.  ``options`` (the command's options that change
    results) and ``version`` (the tool's) enter each job's inputs hash."""
    cache: dict[Path, tuple[dict, str, str] | FeaError] = {}
    jobs: list[Job] = []
    names: set[str] = set()
    for row in schedule.rows:
        if row.case not in cache:
            try:
                raw = read_limited(row.case, MAX_CASE_BYTES, "", "case file")
                doc, text = _doc_of(raw, "", str(row.case))
                cache[row.case] = (doc, text, hashlib.sha256(raw).hexdigest())
            except FeaError as exc:
                cache[row.case] = exc
        got = cache[row.case]
        for combo in schedule.combinations_of(row):
            name = _safe(row.mark) + (f".{_safe(combo.name)}" if combo.name else "")
            if name.lower() in names:
                name = f"{name}-{_hash([row.mark, combo.name])[:8]}"
            names.add(name.lower())
            overrides = tuple((k.text, v) for k, v in row.overrides)
            label = str(row.case) if not (row.overrides or combo.name) else \
                f"{schedule.source} row {row.mark}" + (f", combination {combo.name}" if combo.name else "")
            common = dict(index=len(jobs), name=name, mark=row.mark, combination=combo.name, label=label,
                          base=str(row.case), overrides=overrides)
            if isinstance(got, FeaError):
                jobs.append(Job(document=None, file_text=None, inputs_sha256="", error=f"{row.where} "
                                f"({row.mark}): {_one_line(got)}", **common))  # type: ignore[arg-type]
                continue
            doc, text, sha = got
            try:
                mine = plain(doc)
                for key, value in row.overrides:
                    set_value(mine, key, plain(value))
                if (row.overrides or combo.name) and not any(k.text == "title" for k, _ in row.overrides):
                    # the run's title names its row (its summary, report and figures say which column it is)
                    base_title = mine.get("title", "") if isinstance(mine.get("title", ""), str) else ""
                    mine["title"] = " · ".join(t for t in (row.mark, combo.name, base_title) if t)
                if combo.name:
                    if mine.get("design", {}).get("load_factor", 1.0) != 1.0:
                        raise CaseError("design.load_factor", "must be 1 with load combinations: the combination "
                                                              "factors give the design loads")
                    combine(mine, combo, schedule.groups)
            except FeaError as exc:
                jobs.append(Job(document=None, file_text=None, inputs_sha256="", error=f"{row.where} "
                                f"({row.mark}): {_one_line(exc)}", **common))  # type: ignore[arg-type]
                continue
            same = not row.overrides and not combo.name
            digest = _hash({"document": mine, "label": label, "case_sha256": sha if same else None,
                            "options": dict(options or {}), "version": version})
            jobs.append(Job(document=mine, file_text=text if same else None, inputs_sha256=digest,
                            file_sha256=sha if same else None, **common))  # type: ignore[arg-type]
    return jobs
