"""The import graph of ``fea`` follows the declared layer order and has no cycle.

The graph is built from the source with ``ast``, not by importing: every
``import`` and ``from ... import`` anywhere in a module counts, at module level,
inside functions and classes, under ``if TYPE_CHECKING:`` and inside ``try``.
``importlib.import_module("fea.x")`` counts too when the name is written out.
Counting the TYPE_CHECKING imports too is deliberate: an import needed only by
an annotation still says that one layer knows the other, and keeping them in the
graph leaves no special case to reason about.

A name imported from a package resolves to the package's submodule of that name
when there is one (``from . import eigen``), otherwise to the package's
``__init__.py``.  Importing a submodule also runs its parents' ``__init__.py``
files; those implicit imports are not edges (every module of ``fea`` runs
``fea/__init__.py`` first anyway).

Rules (each its own test, each failure lists every violation as file:line):

* no cycle between modules;
* no import of a module in a higher layer than the importer's;
* every module of ``fea/`` belongs to a layer, and every ``fea`` module imported exists;
* no ``fea/extensions.py`` (analyses are listed in ``fea/pipeline.py``, not registered by import);
* nothing outside ``fea/cli/`` prints, writes to ``sys.stdout``/``sys.stderr`` or calls
  ``sys.exit`` (``fea/__main__.py``, the ``python -m fea`` entry point, passes the command's
  exit status on and is the one exception);
* pint is imported only by ``fea/units.py``.
"""

from __future__ import annotations

import ast
from dataclasses import dataclass
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
PACKAGE = "fea"

#: The declared layer order, lowest first (issue 10).  A module may import from its own layer and
#: lower ones only.  Patterns are paths from the repository root; ``*`` matches a whole folder
#: (sub-folders included).  A package's ``__init__.py`` belongs to its folder's layer.
LAYERS: list[tuple[str, tuple[str, ...]]] = [
    ("base", ("fea/errors.py", "fea/cautions.py", "fea/notices.py", "fea/version.py", "fea/util/*")),
    ("units", ("fea/units.py", "fea/quantity.py")),
    ("model", ("fea/formulas.py", "fea/model/*", "fea/sections/*", "fea/results.py")),
    ("mesh", ("fea/mesh.py", "fea/elements.py")),
    ("assemble", ("fea/assemble.py",)),
    ("solve", ("fea/solve/*",)),
    ("design", ("fea/design/*",)),
    ("study", ("fea/study/*",)),
    ("io", ("fea/io/*",)),
    # the case-file input of fea/batch/ ([reliability], key paths, laws): below the pipeline, which lists the table
    ("batch input", ("fea/batch/keys.py", "fea/batch/distributions.py", "fea/batch/reliability_input.py")),
    ("plot", ("fea/plot/*",)),
    ("report", ("fea/report/*",)),
    ("pipeline", ("fea/pipeline.py",)),
    ("batch", ("fea/batch/*",)),
    ("explore", ("fea/explore/*",)),
    ("cli", ("fea/cli/*", "fea/__init__.py", "fea/__main__.py")),
]

#: Calls that import a module named by a string (counted when the name is written out).
DYNAMIC_IMPORTS = {"importlib.import_module", "import_module", "__import__"}
#: Where printing and exit statuses are allowed (see the module docstring).
MAY_PRINT = ("fea/cli/*", "fea/__main__.py")
#: Calls that print, write to the standard streams or end the process.
OUTPUT_CALLS = {"print", "sys.exit", "os._exit", "exit", "quit"} | {
    f"sys.{stream}.{method}" for stream in ("stdout", "stderr") for method in ("write", "writelines")}
#: The only module that imports pint.
PINT_HOME = "fea/units.py"


# -- the graph -----------------------------------------------------------------------------------

@dataclass(frozen=True)
class Edge:
    source: str  # importing module, dotted
    target: str  # imported module of the package, dotted (may not exist: see missing_targets)
    path: str    # file of the importing module, from the repository root
    line: int

    def where(self) -> str:
        return f"{self.path}:{self.line}"


def module_files(root: Path, package: str) -> dict[str, str]:
    """Dotted module name -> file path (relative to ``root``) of every module of ``package``."""
    out = {}
    for f in sorted((root / package).rglob("*.py")):
        rel = f.relative_to(root)
        parts = list(rel.with_suffix("").parts)
        if parts[-1] == "__init__":
            parts.pop()
        out[".".join(parts)] = rel.as_posix()
    return out


def _is_package(path: str) -> bool:
    return path.endswith("/__init__.py")


def _resolve(modname: str, path: str, level: int, target: str | None) -> str:
    """Absolute dotted name of ``from <level dots><target> import ...`` written in module ``modname``."""
    if level == 0:
        return target or ""
    here = modname.split(".") if _is_package(path) else modname.split(".")[:-1]
    base = here[: len(here) - (level - 1)]
    return ".".join(base + ([target] if target else []))


def imports_of(tree: ast.AST, modname: str, path: str, modules: dict[str, str], package: str) -> list[Edge]:
    """Every import of a module of ``package`` in ``tree``, wherever it stands in the file."""
    edges = []
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for alias in node.names:
                if alias.name == package or alias.name.startswith(package + "."):
                    edges.append(Edge(modname, alias.name, path, node.lineno))
        elif isinstance(node, ast.ImportFrom):
            base = _resolve(modname, path, node.level, node.module)
            if not (base == package or base.startswith(package + ".")):
                continue
            for alias in node.names:
                sub = f"{base}.{alias.name}"
                # `from pkg import name`: the submodule pkg.name if there is one, else pkg itself
                edges.append(Edge(modname, sub if sub in modules else base, path, node.lineno))
        elif (isinstance(node, ast.Call) and _dotted(node.func) in DYNAMIC_IMPORTS and node.args
              and isinstance(node.args[0], ast.Constant) and isinstance(node.args[0].value, str)):
            name = node.args[0].value  # importlib.import_module("fea.x") with the name written out
            if name == package or name.startswith(package + "."):
                edges.append(Edge(modname, name, path, node.lineno))
    return sorted((e for e in edges if e.target != e.source), key=lambda e: (e.line, e.target))


def build_graph(root: Path = ROOT, package: str = PACKAGE) -> tuple[dict[str, str], list[Edge], dict[str, ast.AST]]:
    modules = module_files(root, package)
    trees, edges = {}, []
    for name, path in modules.items():
        tree = ast.parse((root / path).read_text(encoding="utf-8"), filename=path)
        trees[name] = tree
        edges += imports_of(tree, name, path, modules, package)
    return modules, edges, trees


def matches(path: str, pattern: str) -> bool:
    """``fea/x.py`` matches itself; ``fea/x/*`` matches every file under ``fea/x/``."""
    return path.startswith(pattern[:-1]) if pattern.endswith("/*") else path == pattern


def layer_of(path: str, layers=LAYERS) -> int | None:
    """Index in ``layers`` of the file at ``path`` (from the repository root), or None."""
    for i, (_, patterns) in enumerate(layers):
        if any(matches(path, pat) for pat in patterns):
            return i
    return None


def find_cycles(modules: dict[str, str], edges: list[Edge]) -> list[list[Edge]]:
    """One cycle (as its edges, in order) through each strongly connected group of two or more modules."""
    succ: dict[str, list[Edge]] = {m: [] for m in modules}
    for e in edges:
        if e.target in succ:  # an import of a missing module is reported by missing_targets
            succ[e.source].append(e)
    # Tarjan's strongly connected components, iterative (no recursion limit on long chains)
    index: dict[str, int] = {}
    low: dict[str, int] = {}
    on_stack: set[str] = set()
    stack: list[str] = []
    groups: list[list[str]] = []
    counter = 0
    for start in sorted(modules):
        if start in index:
            continue
        work = [(start, 0)]
        while work:
            v, i = work.pop()
            if i == 0:
                index[v] = low[v] = counter
                counter += 1
                stack.append(v)
                on_stack.add(v)
            out = succ[v]
            if i < len(out):
                work.append((v, i + 1))
                w = out[i].target
                if w not in index:
                    work.append((w, 0))
                elif w in on_stack:
                    low[v] = min(low[v], index[w])
                continue
            if low[v] == index[v]:
                group = []
                while True:
                    w = stack.pop()
                    on_stack.discard(w)
                    group.append(w)
                    if w == v:
                        break
                if len(group) > 1:
                    groups.append(sorted(group))
            if work:
                parent = work[-1][0]
                low[parent] = min(low[parent], low[v])
    return [_one_cycle(sorted(g), succ) for g in groups]


def _one_cycle(group: list[str], succ: dict[str, list[Edge]]) -> list[Edge]:
    """A shortest cycle through the first module of a strongly connected group (breadth-first)."""
    members = set(group)
    start = group[0]
    came: dict[str, Edge] = {}
    frontier = [start]
    while frontier:
        nxt = []
        for v in frontier:
            for e in succ[v]:
                if e.target not in members:
                    continue
                if e.target == start:
                    path = [e]
                    while path[0].source != start:
                        path.insert(0, came[path[0].source])
                    return path
                if e.target not in came:
                    came[e.target] = e
                    nxt.append(e.target)
        frontier = nxt
    raise AssertionError(f"no cycle found through {start}")  # pragma: no cover - a group always has one


# -- what the rules find -------------------------------------------------------------------------

def cycle_violations(modules, edges) -> list[str]:
    out = []
    for cyc in find_cycles(modules, edges):
        names = " -> ".join([cyc[0].source] + [e.target for e in cyc])
        steps = "; ".join(f"{e.where()} imports {e.target}" for e in cyc)
        out.append(f"cycle {names}  ({steps})")
    return out


def upward_violations(modules, edges, layers=LAYERS) -> list[str]:
    out = []
    for e in edges:
        if e.target not in modules:
            continue
        a, b = layer_of(modules[e.source], layers), layer_of(modules[e.target], layers)
        if a is not None and b is not None and b > a:
            out.append(f"{e.where()}: {e.source} (layer {layers[a][0]}) imports {e.target} "
                       f"(layer {layers[b][0]}, higher)")
    return out


def unassigned_modules(modules, layers=LAYERS) -> list[str]:
    return [f"{path}: {name} is in no layer" for name, path in modules.items() if layer_of(path, layers) is None]


def missing_targets(modules, edges) -> list[str]:
    return [f"{e.where()}: {e.source} imports {e.target}, which does not exist" for e in edges
            if e.target not in modules]


def _dotted(node: ast.AST) -> str:
    """``sys.stdout.write`` for the expression it names, '' for anything else."""
    parts = []
    while isinstance(node, ast.Attribute):
        parts.append(node.attr)
        node = node.value
    if isinstance(node, ast.Name):
        parts.append(node.id)
        return ".".join(reversed(parts))
    return ""


def output_violations(modules, trees, may_print=MAY_PRINT) -> list[str]:
    out = []
    for name, tree in trees.items():
        path = modules[name]
        if any(matches(path, p) for p in may_print):
            continue
        for node in ast.walk(tree):
            if isinstance(node, ast.Call) and _dotted(node.func) in OUTPUT_CALLS:
                out.append((path, node.lineno, f"{path}:{node.lineno}: {_dotted(node.func)}(...) outside fea/cli/"))
    return [text for *_, text in sorted(out)]


def pint_violations(modules, trees, home=PINT_HOME) -> list[str]:
    out = []
    for name, tree in trees.items():
        path = modules[name]
        if path == home:
            continue
        for node in ast.walk(tree):
            names = ([a.name for a in node.names] if isinstance(node, ast.Import)
                     else [node.module or ""] if isinstance(node, ast.ImportFrom) and node.level == 0 else [])
            if any(n == "pint" or n.startswith("pint.") for n in names):
                out.append((path, node.lineno, f"{path}:{node.lineno}: imports pint (only {home} may)"))
    return [text for *_, text in sorted(out)]


def _report(title: str, found: list[str]) -> str:
    return f"{len(found)} {title}:\n  " + "\n  ".join(found)


@pytest.fixture(scope="module")
def graph():
    return build_graph()


# -- the rules on fea/ ---------------------------------------------------------------------------

def test_no_import_cycles(graph):
    modules, edges, _ = graph
    found = cycle_violations(modules, edges)
    assert not found, _report("import cycles (one path shown through each group of modules)", found)


def test_no_import_of_a_higher_layer(graph):
    modules, edges, _ = graph
    found = upward_violations(modules, edges)
    assert not found, _report("imports against the layer order " +
                              " < ".join(name for name, _ in LAYERS), found)


def test_every_module_has_a_layer_and_every_import_exists(graph):
    modules, edges, _ = graph
    found = unassigned_modules(modules) + missing_targets(modules, edges)
    assert not found, _report("modules in no layer or imports of missing modules", found)


def test_no_registration_by_import():
    assert not (ROOT / "fea" / "extensions.py").exists(), \
        "fea/extensions.py exists: list the analyses in fea/pipeline.py instead of registering them by import"


def test_only_the_command_layer_prints_or_exits(graph):
    modules, _, trees = graph
    found = output_violations(modules, trees)
    assert not found, _report("prints, writes to sys.stdout/sys.stderr or exits outside fea/cli/", found)


def test_only_units_imports_pint(graph):
    modules, _, trees = graph
    found = pint_violations(modules, trees)
    assert not found, _report("imports of pint outside " + PINT_HOME, found)


def test_every_layer_pattern_matches_something(graph):
    # a pattern that matches nothing is a stale entry of the table (a module renamed or moved)
    modules, _, _ = graph
    paths = list(modules.values())
    stale = [pat for _, patterns in LAYERS for pat in patterns if not any(matches(p, pat) for p in paths)]
    assert not stale, f"layer patterns that match no file: {stale}"


# -- the analyser itself, on a small made-up package ---------------------------------------------

def _tree(tmp_path: Path, files: dict[str, str]) -> Path:
    for rel, text in files.items():
        f = tmp_path / rel
        f.parent.mkdir(parents=True, exist_ok=True)
        f.write_text(text, encoding="utf-8")
    return tmp_path


def test_analyser_resolves_relative_function_level_and_type_checking_imports(tmp_path):
    root = _tree(tmp_path, {
        "pkg/__init__.py": "from .core import thing\n",
        "pkg/core/__init__.py": "",
        "pkg/core/thing.py": ("from typing import TYPE_CHECKING\n"
                              "if TYPE_CHECKING:\n    from ..top import Top\n"
                              "def f():\n    from . import other\n    import pkg.top\n"),
        "pkg/core/other.py": "from .thing import f\nfrom .. import core\nfrom ..core import helper\n",
        "pkg/top.py": ("import os\nfrom pkg.core.thing import f\n"
                       "import importlib\nimportlib.import_module('pkg.core')\n"),
    })
    modules, edges, _ = build_graph(root, "pkg")
    got = sorted((e.source, e.target, e.line) for e in edges)
    assert got == [
        ("pkg", "pkg.core.thing", 1),
        ("pkg.core.other", "pkg.core", 2),
        ("pkg.core.other", "pkg.core", 3),       # a name from the package's __init__
        ("pkg.core.other", "pkg.core.thing", 1),
        ("pkg.core.thing", "pkg.core.other", 5),  # inside a function
        ("pkg.core.thing", "pkg.top", 3),         # under TYPE_CHECKING
        ("pkg.core.thing", "pkg.top", 6),
        ("pkg.top", "pkg.core", 4),               # importlib.import_module with the name written out
        ("pkg.top", "pkg.core.thing", 2),
    ]
    layers = [("low", ("pkg/core/*",)), ("high", ("pkg/top.py", "pkg/__init__.py"))]
    up = upward_violations(modules, edges, layers)
    assert up == ["pkg/core/thing.py:3: pkg.core.thing (layer low) imports pkg.top (layer high, higher)",
                  "pkg/core/thing.py:6: pkg.core.thing (layer low) imports pkg.top (layer high, higher)"]
    cycles = find_cycles(modules, edges)
    assert len(cycles) == 1  # one group: core.thing, core.other and top; the shortest cycle shown
    assert [(e.source, e.target) for e in cycles[0]] == [("pkg.core.other", "pkg.core.thing"),
                                                         ("pkg.core.thing", "pkg.core.other")]
    assert cycle_violations(modules, edges) == [
        "cycle pkg.core.other -> pkg.core.thing -> pkg.core.other  "
        "(pkg/core/other.py:1 imports pkg.core.thing; pkg/core/thing.py:5 imports pkg.core.other)"]
    assert unassigned_modules(modules, layers) == []
    assert unassigned_modules(modules, layers[:1]) == ["pkg/__init__.py: pkg is in no layer",
                                                       "pkg/top.py: pkg.top is in no layer"]


def test_analyser_finds_output_calls_and_missing_modules(tmp_path):
    root = _tree(tmp_path, {
        "pkg/__init__.py": "",
        "pkg/cli/__init__.py": "import sys\nprint('ok')\nsys.exit(0)\n",
        "pkg/engine.py": ("import sys\nfrom . import gone\n"
                          "def f():\n    print('x')\n    sys.stdout.write('y')\n    sys.exit(1)\n"
                          "from .nowhere import x\n"),
    })
    modules, edges, trees = build_graph(root, "pkg")
    found = output_violations(modules, trees, may_print=("pkg/cli/*",))
    assert found == ["pkg/engine.py:4: print(...) outside fea/cli/",
                     "pkg/engine.py:5: sys.stdout.write(...) outside fea/cli/",
                     "pkg/engine.py:6: sys.exit(...) outside fea/cli/"]
    # `from . import gone` may be a name of pkg/__init__.py; `from .nowhere import x` has no module
    assert missing_targets(modules, edges) == ["pkg/engine.py:7: pkg.engine imports pkg.nowhere, "
                                               "which does not exist"]
