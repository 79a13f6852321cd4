"""The case file's ``[record]`` table: who and what the calculation record is for (keys in ``cases/README.md``).

``[record]`` holds the identification fields printed at the head of the report
(``stanchion report``): the project, the job number, who prepared and who
checked the calculation, its revision and its date.  Every field is optional;
the command's options (``--project``, ``--job``, ``--prepared-by``,
``--checked-by``, ``--revision``, ``--date``) override the table.
"""

from __future__ import annotations

import datetime
from dataclasses import dataclass
from typing import Any

from ..errors import CaseError
from ..util.checks import as_text, check_keys

__all__ = ["RECORD_KEYS", "RecordFields", "parse_record", "record_date", "record_text"]

#: The text fields of ``[record]``, in the order the report prints them.
RECORD_KEYS = ("project", "job", "prepared_by", "checked_by", "revision")
#: The longest text of a field (one line of the report's head).
MAX_FIELD = 200


@dataclass(frozen=True)
class RecordFields:
    """The identification fields of a ``[record]`` table ("" where not given; ``date`` as ISO text)."""

    project: str = ""
    job: str = ""
    prepared_by: str = ""
    checked_by: str = ""
    revision: str = ""
    date: str = ""


def record_date(value: Any, path: str) -> str:
    """A date given as a TOML date or as ``"YYYY-MM-DD"`` -> ISO text."""
    if isinstance(value, datetime.datetime) or not isinstance(value, (datetime.date, str)):
        raise CaseError(path, f"expected a date such as 2026-03-01, got {value!r}")
    if isinstance(value, datetime.date):
        return value.isoformat()
    try:
        return datetime.date.fromisoformat(value.strip()).isoformat()
    except ValueError:
        raise CaseError(path, f"expected a date as YYYY-MM-DD, got {value[:40]!r}") from None


def record_text(value: Any, path: str) -> str:
    """One identification field: one line of printable text (a whole number is taken as its digits)."""
    if isinstance(value, int) and not isinstance(value, bool):
        value = str(value)  # a revision or job number written as a number
    text = as_text(value, path).strip()
    if any(c in text for c in "\n\r"):
        raise CaseError(path, "must be one line")
    if len(text) > MAX_FIELD:
        raise CaseError(path, f"is {len(text)} characters long; at most {MAX_FIELD} are printed")
    return text


def parse_record(table: dict, doc: dict) -> RecordFields:
    """The ``[record]`` table -> :class:`RecordFields` (its parser in :data:`fea.pipeline.CASE_TABLES`)."""
    check_keys(table, "record", (*RECORD_KEYS, "date", "note"))
    fields = {k: record_text(table[k], f"record.{k}") for k in RECORD_KEYS if k in table}
    if "date" in table:
        fields["date"] = record_date(table["date"], "record.date")
    return RecordFields(**fields)
