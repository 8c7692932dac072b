"""The shape of the house: the core draws nothing, imports stay cheap, the public API is what it says."""
import ast
import json
import subprocess
import sys
from pathlib import Path

import bilayer

PACKAGE = Path(bilayer.__file__).parent
FACES = {"ipywidgets", "matplotlib", "IPython", "ipympl", "bilayer.panels", "bilayer.plots", "bilayer.report"}
FACE_MODULES = {"plots", "panels", "report", "cli", "html_report"}


def test_importing_bilayer_loads_no_drawing_or_heavy_library():
    code = (
        "import sys, json, bilayer; "
        "print(json.dumps(sorted(m for m in sys.modules if m.split('.')[0] in "
        "{'ipywidgets','matplotlib','sympy','pint','scipy','skfem'})))"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert json.loads(out.stdout) == []


def _imports(path: Path):
    tree = ast.parse(path.read_text())
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for alias in node.names:
                yield alias.name
        elif isinstance(node, ast.ImportFrom):
            base = node.module or ""
            if node.level:
                base = "bilayer." + base if base else "bilayer"
            yield base
            for alias in node.names:
                yield f"{base}.{alias.name}"


def test_core_and_job_modules_never_import_drawing_code():
    offenders = []
    for path in PACKAGE.rglob("*.py"):
        relative = path.relative_to(PACKAGE)
        if relative.parts[0] in {"panels"} or path.stem in FACE_MODULES:
            continue
        for name in _imports(path):
            if any(name == face or name.startswith(face + ".") for face in FACES):
                offenders.append(f"{relative}: {name}")
    assert offenders == []


def test_public_names_exist():
    for name in bilayer.__all__:
        assert getattr(bilayer, name) is not None, name
