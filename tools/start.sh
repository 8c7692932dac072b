#!/usr/bin/env bash
# Install bilayer with its notebook extras into .venv and open the start notebook in JupyterLab.
#   tools/start.sh              JupyterLab on http://127.0.0.1:8888 with notebooks/start_here.ipynb
#   tools/start.sh --headless   no browser: run the start notebook top to bottom in a kernel and write
#                               the executed copy and its figures to build/start_here/
# Needs only Python 3.11+. Environment: PYTHON (interpreter for the venv), VENV (default .venv), PORT.
set -euo pipefail
cd "$(dirname "$0")/.."
PYTHON=${PYTHON:-python3}
VENV=${VENV:-.venv}
if [ ! -x "$VENV/bin/python" ]; then
    echo "== creating $VENV"
    "$PYTHON" -m venv "$VENV"
fi
echo "== installing bilayer with its notebook extras"
"$VENV/bin/python" -m pip install -q --disable-pip-version-check -e ".[bench]"

if [ "${1:-}" = "--headless" ]; then
    exec "$VENV/bin/python" tools/run_start_notebook.py build/start_here
fi
ROOT_FLAG=()
if [ "$(id -u)" = 0 ]; then ROOT_FLAG=(--allow-root); fi
exec "$VENV/bin/python" -m jupyterlab "${ROOT_FLAG[@]}" --ServerApp.ip=127.0.0.1 --ServerApp.port="${PORT:-8888}" \
    --ServerApp.root_dir="$PWD" notebooks/start_here.ipynb
