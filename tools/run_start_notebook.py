"""Run notebooks/start_here.ipynb top to bottom in a fresh kernel, without a browser.

Writes the executed notebook and PNG files of the explorer's views to the folder given as the first
argument (default build/start_here), and prints the design and its result table as plain text.
"""
from __future__ import annotations

import sys
from pathlib import Path

import nbformat
from nbclient import NotebookClient

NOTEBOOK = Path(__file__).resolve().parent.parent / "notebooks" / "start_here.ipynb"

EXPORT = """
from pathlib import Path as _Path
from bilayer.core.cautions import cautions_text as _cautions
_out = _Path({out!r})
for _name in ("stress", "shape", "interface", "tradeoff"):
    _view = getattr(explorer, _name)
    _view.redraw()
    _view.image.figure.savefig(_out / f"{{_name}}.png")
explorer.sketch.image.figure.savefig(_out / "sign_convention.png")
_shown, _design = explorer.table.shown, explorer.model.design
print(_design.name or "design")
print(f"{{_shown['state']}} bending state, temperature change {{_shown['temperature_change']:.4g}} K, "
      f"curvature {{_shown['curvature']:.5g}} 1/m")
for _i, (_b, _t) in enumerate(zip(_shown["stress_bottom"], _shown["stress_top"])):
    print(f"  layer {{_i + 1}} ({{_design.stack.labels[_i]}}): stress {{_b / 1e6:.4g}} MPa at the bottom face, "
          f"{{_t / 1e6:.4g}} MPa at the top face")
print(_cautions())
"""


def main(out: str = "build/start_here") -> int:
    folder = Path(out).resolve()
    folder.mkdir(parents=True, exist_ok=True)
    notebook = nbformat.read(NOTEBOOK, as_version=4)
    notebook.cells.append(nbformat.v4.new_code_cell(EXPORT.format(out=str(folder))))
    client = NotebookClient(notebook, timeout=600, kernel_name="python3",
                            resources={"metadata": {"path": str(NOTEBOOK.parent)}})
    client.execute()
    export = notebook.cells.pop()
    nbformat.write(notebook, folder / NOTEBOOK.name)
    for output in export.get("outputs", []):
        if output.get("output_type") == "stream":
            print(output["text"], end="")
    print(f"ran {NOTEBOOK.name}: executed copy and figures in {folder}")
    return 0


if __name__ == "__main__":
    sys.exit(main(*sys.argv[1:2]))
