"""The shape of the house (docs/architecture.md): layers whose imports point down only, no import cycle,
nothing that draws below the faces, cheap imports, and a public API that is what it says."""
from __future__ import annotations

import ast
import json
import subprocess
import sys
from pathlib import Path

import pytest

import bilayer

PACKAGE = Path(bilayer.__file__).parent

LAYERS = {
    # folder of bilayer/ -> rank; an import may point to the same rank or below, never above
    "core": 0,
    "strip": 1,
    "history": 1,
    "thermostat": 2,
    "solder": 2,
    "adhesive": 2,
    "films": 2,
    "heating": 2,
    "designs": 3,
    "records": 4,
    "studies": 4,
    "cli": 5,
    "panels": 5,
    "plots": 5,
    "report": 5,
}
FACE_RANK = 5
FACADE = {"bilayer", "bilayer.__main__"}  # the public API may name anything
DRAWING = ("matplotlib", "ipywidgets", "IPython", "ipympl", "PIL")


def _module_name(path: Path) -> str:
    parts = list(path.relative_to(PACKAGE.parent).with_suffix("").parts)
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


MODULES = {_module_name(path): path for path in PACKAGE.rglob("*.py")}


def _type_checking_nodes(tree: ast.AST) -> set[int]:
    """ids of the nodes under ``if TYPE_CHECKING:`` (type-only imports are allowed anywhere)."""
    skipped: set[int] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.If) and "TYPE_CHECKING" in ast.unparse(node.test):
            for child in node.body:
                skipped.update(id(inner) for inner in ast.walk(child))
    return skipped


def imports_of(module: str) -> list[tuple[str, int]]:
    """(imported name, line) of every import in ``module``, lazy ones inside functions included and
    type-only ones left out; names of the package resolved to modules of the package."""
    path = MODULES[module]
    tree = ast.parse(path.read_text())
    skipped = _type_checking_nodes(tree)
    package = module if path.name == "__init__.py" else module.rsplit(".", 1)[0]
    found = []
    for node in ast.walk(tree):
        if id(node) in skipped:
            continue
        if isinstance(node, ast.Import):
            found += [(alias.name, node.lineno) for alias in node.names]
        elif isinstance(node, ast.ImportFrom):
            if node.level:
                parts = package.split(".")
                base = ".".join(parts[: len(parts) - node.level + 1] + ([node.module] if node.module else []))
            else:
                base = node.module or ""
            for alias in node.names:
                candidate = f"{base}.{alias.name}"
                found.append((candidate if candidate in MODULES else base, node.lineno))
    return found


def _internal_graph() -> dict[str, set[str]]:
    graph: dict[str, set[str]] = {module: set() for module in MODULES}
    for module in MODULES:
        for name, _ in imports_of(module):
            target = name
            while target and target not in MODULES:
                target = target.rpartition(".")[0]
            if target and target != module:
                graph[module].add(target)
    return graph


def _rank(module: str) -> int | None:
    parts = module.split(".")
    return LAYERS.get(parts[1]) if len(parts) > 1 else None


def test_every_folder_has_a_layer_and_few_files_stand_at_the_root():
    folders = {path.parent.name for path in PACKAGE.glob("*/__init__.py")}
    assert folders <= set(LAYERS), f"folders without a layer in docs/architecture.md: {folders - set(LAYERS)}"
    loose = sorted(path.name for path in PACKAGE.glob("*.py"))
    assert len(loose) <= 8, loose


def upward_imports() -> list[str]:
    found = []
    for module in MODULES:
        if module in FACADE:
            continue
        rank = _rank(module)
        for name, line in imports_of(module):
            if name in FACADE:
                found.append(f"{module}:{line} imports the package facade {name}")
            elif name.startswith("bilayer."):
                target = _rank(name)
                if target is None or rank is None or target > rank:
                    found.append(f"{module}:{line} (rank {rank}) imports {name} (rank {target})")
    return found


def import_cycles() -> list[list[str]]:
    """Tarjan's strongly connected components of more than one module (lazy imports included)."""
    graph = _internal_graph()
    index: dict[str, int] = {}
    low: dict[str, int] = {}
    stack: list[str] = []
    on_stack: set[str] = set()
    cycles = []

    def visit(node: str) -> None:
        index[node] = low[node] = len(index)
        stack.append(node)
        on_stack.add(node)
        for successor in sorted(graph[node]):
            if successor not in index:
                visit(successor)
                low[node] = min(low[node], low[successor])
            elif successor in on_stack:
                low[node] = min(low[node], index[successor])
        if low[node] == index[node]:
            component = []
            while True:
                member = stack.pop()
                on_stack.discard(member)
                component.append(member)
                if member == node:
                    break
            if len(component) > 1:
                cycles.append(sorted(component))

    for node in sorted(graph):
        if node not in index:
            visit(node)
    return cycles


def drawing_imports() -> list[str]:
    found = []
    for module in MODULES:
        rank = _rank(module)
        if module in FACADE or rank is None or rank >= FACE_RANK:
            continue
        found += [f"{module}:{line}: {name}" for name, line in imports_of(module) if name.split(".")[0] in DRAWING]
    return found


def test_imports_point_down_only():
    assert upward_imports() == []


def test_no_import_cycle():
    assert import_cycles() == []


def test_core_and_jobs_never_import_drawing_code():
    assert drawing_imports() == []


def _plant(monkeypatch, tmp_path, module: str, source: str) -> None:
    path = tmp_path / (module.rsplit(".", 1)[1] + ".py")
    path.write_text(source)
    monkeypatch.setitem(MODULES, module, path)


def test_the_checks_catch_planted_offenders(monkeypatch, tmp_path):
    """The three checks are not vacuous: an upward import, a drawing import and a lazy import cycle
    planted in the core are each reported."""
    _plant(monkeypatch, tmp_path, "bilayer.core.planted_upward", "def f():\n    from ..panels import views\n")
    _plant(monkeypatch, tmp_path, "bilayer.core.planted_drawing", "import matplotlib.pyplot\n")
    _plant(monkeypatch, tmp_path, "bilayer.core.planted_a", "def f():\n    from . import planted_b\n")
    _plant(monkeypatch, tmp_path, "bilayer.core.planted_b", "from .planted_a import f\n")
    assert any("planted_upward" in line and "bilayer.panels.views" in line for line in upward_imports())
    assert any("planted_drawing" in line for line in drawing_imports())
    assert ["bilayer.core.planted_a", "bilayer.core.planted_b"] in import_cycles()


def test_importing_bilayer_loads_no_drawing_or_heavy_library():
    code = (
        "import sys, json, bilayer; "
        "print(json.dumps(sorted(m for m in sys.modules if m.split('.')[0] in "
        "{'ipywidgets','matplotlib','sympy','pint','scipy','skfem'})))"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert json.loads(out.stdout) == []


def test_public_names_exist():
    for name in bilayer.__all__:
        assert getattr(bilayer, name) is not None, name
