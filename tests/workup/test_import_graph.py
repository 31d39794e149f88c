"""The imports between the core's modules form no circle, checked statically from the sources.

Every ``import`` and ``from ... import`` naming a ``workup`` module counts, at module level and
inside functions alike (a function-level import closes a circle as surely, only later), except
those under ``if TYPE_CHECKING:``, which never run. ``from package import name`` is an edge to the
submodule ``package.name`` when there is one, else to the package itself.
"""

from __future__ import annotations

import ast
import itertools
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
CORE = ROOT / "workup"


def _module_name(path: Path) -> str:
    parts = list(path.relative_to(ROOT).with_suffix("").parts)
    if parts[-1] == "__init__":
        parts.pop()
    return ".".join(parts)


MODULES = {_module_name(p): p for p in sorted(CORE.rglob("*.py"))}


def _is_type_checking(test: ast.expr) -> bool:
    """``if TYPE_CHECKING:`` or ``if typing.TYPE_CHECKING:``."""
    if isinstance(test, ast.Name):
        return test.id == "TYPE_CHECKING"
    return isinstance(test, ast.Attribute) and test.attr == "TYPE_CHECKING"


def _targets(node: ast.Import | ast.ImportFrom, module: str, is_package: bool) -> list[str]:
    """The workup modules one import statement in ``module`` loads."""
    if isinstance(node, ast.Import):
        return [a.name for a in node.names if a.name in MODULES]
    if node.level:
        base = module.split(".") if is_package else module.split(".")[:-1]
        base = base[: len(base) - (node.level - 1)]
        source = ".".join(base + ([node.module] if node.module else []))
    else:
        source = node.module or ""
    out = []
    for a in node.names:
        sub = f"{source}.{a.name}"
        if sub in MODULES:
            out.append(sub)
        elif source in MODULES:
            out.append(source)
    return out


def imports_of(source: str, module: str, is_package: bool = False) -> dict[str, int]:
    """The workup modules the ``source`` of ``module`` imports, each with its first line."""
    found: dict[str, int] = {}

    def visit(node: ast.AST) -> None:
        for child in ast.iter_child_nodes(node):
            if isinstance(child, ast.If) and _is_type_checking(child.test):
                for stmt in child.orelse:  # the else branch does run
                    visit_one(stmt)
                continue
            visit_one(child)

    def visit_one(node: ast.AST) -> None:
        if isinstance(node, (ast.Import, ast.ImportFrom)):
            for target in _targets(node, module, is_package):
                found.setdefault(target, node.lineno)
        visit(node)

    visit(ast.parse(source))
    return found


def import_graph() -> dict[str, dict[str, int]]:
    """Every core module → the core modules it imports (with the line of the import)."""
    return {
        m: imports_of(p.read_text(encoding="utf-8"), m, p.name == "__init__.py")
        for m, p in MODULES.items()
    }


def strongly_connected(graph: dict[str, dict[str, int]]) -> list[frozenset[str]]:
    """The groups of modules that reach each other (Tarjan), each group of two or more, or one
    module importing itself."""
    index: dict[str, int] = {}
    low: dict[str, int] = {}
    stack: list[str] = []
    on_stack: set[str] = set()
    groups: list[frozenset[str]] = []

    def connect(v: str) -> None:
        index[v] = low[v] = len(index)
        stack.append(v)
        on_stack.add(v)
        for w in graph.get(v, {}):
            if w not in index:
                connect(w)
                low[v] = min(low[v], low[w])
            elif w in on_stack:
                low[v] = min(low[v], index[w])
        if low[v] == index[v]:
            group = set()
            while True:
                w = stack.pop()
                on_stack.discard(w)
                group.add(w)
                if w == v:
                    break
            if len(group) > 1 or v in graph.get(v, {}):
                groups.append(frozenset(group))

    for v in sorted(graph):
        if v not in index:
            connect(v)
    return groups


def one_cycle(graph: dict[str, dict[str, int]], group: frozenset[str]) -> list[str]:
    """The shortest circle through the first module of ``group``, as a path ending at its start
    (breadth first: every module of a group reaches every other)."""
    start = min(group)
    came_from: dict[str, str] = {}
    frontier = [start]
    while frontier:
        later = []
        for here in frontier:
            for w in sorted(graph[here]):
                if w == start:
                    path = [here]
                    while path[-1] != start:
                        path.append(came_from[path[-1]])
                    return [*reversed(path), start]
                if w in group and w not in came_from:
                    came_from[w] = here
                    later.append(w)
        frontier = later
    raise AssertionError(f"{sorted(group)} holds no circle")


def describe(graph: dict[str, dict[str, int]], cycle: list[str]) -> str:
    """``a (a.py:12) -> b (b.py:40) -> a``: each step with the file and line of its import."""
    steps = []
    for a, b in itertools.pairwise(cycle):
        where = MODULES[a].relative_to(ROOT) if a in MODULES else a
        steps.append(f"{a} ({where}:{graph[a][b]})")
    return " -> ".join([*steps, cycle[-1]])


def test_imports_count_at_module_and_function_level_but_not_for_type_checking() -> None:
    source = (
        "from typing import TYPE_CHECKING\n"
        "from workup import caseio\n"  # a submodule named as a package attribute
        "from workup.indices import compute_all\n"  # a name of the package itself
        "from . import quickread\n"
        "if TYPE_CHECKING:\n"
        "    from workup.assess import Assessment\n"
        "else:\n"
        "    import workup.model\n"
        "def later():\n"
        "    from workup.library_index import LibraryIndex\n"
        "import json\n"
    )
    assert imports_of(source, "workup.library") == {
        "workup.caseio": 2,
        "workup.indices": 3,
        "workup.quickread": 4,
        "workup.model": 8,
        "workup.library_index": 10,
    }
    # Relative imports resolve from a package's own name.
    assert imports_of("from ._common import Judge\n", "workup.indices", True) == {
        "workup.indices._common": 1
    }


def test_the_real_graph_holds_function_level_imports() -> None:
    # The listing command imports the search only when it runs.
    assert "workup.search" in import_graph()["workup.commands.listing"]


def test_a_circle_is_found_and_named() -> None:
    graph = {"a": {"b": 1}, "b": {"c": 2, "d": 5}, "c": {"a": 3}, "d": {}, "e": {"e": 4}}
    groups = strongly_connected(graph)
    assert sorted(map(sorted, groups)) == [["a", "b", "c"], ["e"]]
    assert one_cycle(graph, frozenset("abc")) == ["a", "b", "c", "a"]
    assert one_cycle(graph, frozenset("e")) == ["e", "e"]
    assert strongly_connected({"a": {"b": 1}, "b": {}}) == []


def test_core_modules_import_each_other_without_a_circle() -> None:
    graph = import_graph()
    cycles = [describe(graph, one_cycle(graph, g)) for g in strongly_connected(graph)]
    assert not cycles, "import circle(s) between core modules:\n" + "\n".join(cycles)
