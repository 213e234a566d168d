"""The layout's promise, checked from the source: imports point one way, down the run.

fem/ never imports models/; inside models/, a subpackage imports only those before it
in the run (common, catalogs, scenario, parts, analysis, checks, outputs; then api and
cli on top); and no module imports another that imports it back, at any depth
(lazy imports inside functions count too).
"""
from __future__ import annotations

import ast
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
ORDER = ("common", "catalogs", "scenario", "parts", "analysis", "checks", "outputs")
TOP = ("api", "cli")


def _module_name(path: Path) -> str:
    rel = path.relative_to(ROOT).with_suffix("")
    parts = list(rel.parts)
    if parts[-1] == "__init__":
        parts = parts[:-1]
    return "spanstay." + ".".join(parts)


def _imports(path: Path) -> set[str]:
    tree = ast.parse(path.read_text("utf-8"))
    out: set[str] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.ImportFrom) and node.module:
            if node.level:  # relative: resolve against the package
                base = _module_name(path).split(".")
                base = base[:len(base) - node.level + (1 if path.name == "__init__.py" else 0)]
                mod = ".".join(base + [node.module])
            else:
                mod = node.module
            out.add(mod)
            out.update(f"{mod}.{a.name}" for a in node.names)
        elif isinstance(node, ast.Import):
            out.update(a.name for a in node.names)
    return {m for m in out if m.startswith("spanstay.")}


def _graph() -> dict[str, set[str]]:
    files = list((ROOT / "fem").rglob("*.py")) + list((ROOT / "models").rglob("*.py"))
    names = {_module_name(p): p for p in files}
    graph = {}
    for name, path in names.items():
        deps = set()
        for m in _imports(path):
            while m and m not in names:
                m = m.rpartition(".")[0]
            if m and m != name and not name.startswith(m + "."):
                deps.add(m)
        graph[name] = deps
    return graph


def _rank(module: str) -> int | None:
    parts = module.split(".")
    if parts[1] == "fem":
        return -1
    if len(parts) < 3:
        return None  # the models package itself
    if parts[2] in ORDER:
        return ORDER.index(parts[2])
    if parts[2] in TOP:
        return len(ORDER)
    return None


def test_the_engine_never_imports_the_trade_layer():
    bad = {m: sorted(d for d in deps if d.startswith("spanstay.models"))
           for m, deps in _graph().items() if m.startswith("spanstay.fem")}
    assert {m: d for m, d in bad.items() if d} == {}


def test_subpackages_import_only_those_before_them_in_the_run():
    wrong = []
    for module, deps in _graph().items():
        r = _rank(module)
        if r is None:
            continue
        for d in deps:
            rd = _rank(d)
            if rd is not None and rd > r:
                wrong.append(f"{module} -> {d}")
    assert wrong == []


def test_no_import_circle_at_any_level():
    graph = _graph()
    cycles = []
    state: dict[str, int] = {}

    def visit(node: str, stack: list[str]) -> None:
        state[node] = 1
        for d in sorted(graph.get(node, ())):
            if state.get(d) == 1:
                cycles.append(stack[stack.index(d):] + [d] if d in stack else [node, d])
            elif d not in state:
                visit(d, stack + [d])
        state[node] = 2

    for n in sorted(graph):
        if n not in state:
            visit(n, [n])
    assert cycles == []


def test_every_module_fits_in_a_head():
    """About 400 lines at most, except tables (layout rule of DEVELOPERS.md)."""
    long = {str(p.relative_to(ROOT)): n for p in list((ROOT / "fem").rglob("*.py"))
            + list((ROOT / "models").rglob("*.py"))
            if (n := len(p.read_text("utf-8").splitlines())) > 420}
    assert long == {}
