#!/usr/bin/env bash
# Run every check of bilayer on a machine that has only Python 3.11+:
#   unit and reference tests (tests/), the notebooks under nbval (notebooks/), and the real-browser
#   test (JupyterLab on 127.0.0.1 + Debian's headless Chromium driven by Playwright).
# Creates .venv if missing and installs ".[test]" into it. As root on Debian/Ubuntu it installs the
# chromium package with apt-get when /usr/bin/chromium is missing (Playwright never downloads a browser).
# Screenshots and logs go to test-artifacts/ (kept by CI). Extra arguments go to the first pytest run.
# Exit status: 0 when everything passed, non-zero otherwise.
set -euo pipefail
cd "$(dirname "$0")/.."

PYTHON=${PYTHON:-python3}
VENV=${VENV:-.venv}
export BILAYER_ARTIFACTS=${BILAYER_ARTIFACTS:-$PWD/test-artifacts}
mkdir -p "$BILAYER_ARTIFACTS"

# Keep Jupyter, matplotlib, Chromium and IPython state out of $HOME.
STATE=$(mktemp -d)
trap 'rm -rf "$STATE"' EXIT
export JUPYTER_CONFIG_DIR=$STATE/jupyter-config JUPYTER_DATA_DIR=$STATE/jupyter-data \
       JUPYTER_RUNTIME_DIR=$STATE/jupyter-runtime JUPYTERLAB_SETTINGS_DIR=$STATE/lab-settings \
       JUPYTERLAB_WORKSPACES_DIR=$STATE/lab-workspaces IPYTHONDIR=$STATE/ipython \
       MPLCONFIGDIR=$STATE/matplotlib XDG_CACHE_HOME=$STATE/cache XDG_CONFIG_HOME=$STATE/config \
       MPLBACKEND=Agg PYTHONDONTWRITEBYTECODE=1

if [ ! -x /usr/bin/chromium ]; then
    if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null; then
        echo "== installing Debian chromium (about a minute)"
        apt-get update -qq
        DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium fonts-liberation >/dev/null
    else
        echo "!! /usr/bin/chromium is missing and this is not root: the browser test will be skipped" >&2
        echo "!! (install it with: sudo apt-get install chromium)" >&2
    fi
fi

if [ ! -x "$VENV/bin/python" ]; then
    echo "== creating $VENV"
    "$PYTHON" -m venv "$VENV"
fi
echo "== installing bilayer with its test extras"
"$VENV/bin/python" -m pip install -q --disable-pip-version-check -e ".[test]"
"$VENV/bin/jupyter" labextension list 2>&1 | grep -q "jupyterlab-manager.*enabled.*OK" \
    || { echo "!! the ipywidgets JupyterLab extension is missing from $VENV" >&2; exit 1; }

status=0
echo "== tests/"
"$VENV/bin/python" -m pytest tests "$@" || status=$?
echo "== notebooks/ under nbval"
notebooks=0
"$VENV/bin/python" -m pytest -p no:cacheprovider --nbval --nbval-current-env --nbval-cell-timeout=300 \
    --nbval-sanitize-with tools/nbval_sanitize.cfg notebooks || notebooks=$?
if [ "$status" = 0 ]; then status=$notebooks; fi
if [ "$status" = 5 ]; then echo "!! no tests were collected" >&2; status=1; fi
echo "== artifacts (screenshots, logs): $BILAYER_ARTIFACTS"
exit "$status"
