"""Optional analyses (imperfect columns, design, studies) register themselves on import.

Each module listed in :func:`load` adds entries to the registries it needs:
``fea.io.case.EXTRA_SECTIONS`` (case-file tables), ``fea.io.case.SECTION_HOOK``,
``fea.pipeline.ANALYSES`` (analyses run after buckling), ``fea.io.export.JSON_SECTIONS``,
``fea.io.summary.SUMMARY_SECTIONS`` and ``fea.cli.COMMANDS`` (subcommands).
"""

from __future__ import annotations

_LOADED = False

#: Modules that register optional analyses, in import order.
MODULES: tuple[str, ...] = (
    "fea.io.design_input",
    "fea.io.imperfect_input",
    "fea.report.command",
    "fea.study.commands",
)


def load() -> None:
    """Import every registering module once."""
    global _LOADED
    if _LOADED:
        return
    _LOADED = True
    import importlib

    for name in MODULES:
        importlib.import_module(name)
