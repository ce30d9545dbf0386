#!/usr/bin/env bash
# Install what the build, the demo and the tests need, on Debian or Ubuntu. Safe to
# run again: it installs only what is missing.
#   - the office, its Python bridge and Python script support, and the SDK's
#     unoidl-write (to compile the type library)
#   - numpy and erfa for the office's own python3 (the add-in runs inside it)
#   - .venv: a venv from that python3 that sees `uno`, with the test libraries
set -euo pipefail
cd "$(dirname "$0")/.."

packages=(libreoffice-calc libreoffice-script-provider-python python3-uno libreoffice-dev
          python3-venv python3-numpy python3-erfa python3-jplephem fonts-dejavu-core
          # xvfb: a virtual screen for the windowed office (tests/test_gui.py and
          # tools/screenshot.py, which reads the screen from Xvfb's own dump file)
          xvfb
          # poppler-utils: pdftoppm, to look at the exported PDF's pages (tests/test_charts.py)
          poppler-utils)
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -gt 0 ]; then
  if ! command -v apt-get >/dev/null; then
    echo "Please install: ${missing[*]} (Debian/Ubuntu package names)" >&2
    exit 1
  fi
  sudo=""
  [ "$(id -u)" -ne 0 ] && sudo="sudo"
  echo "setup: installing ${missing[*]}"
  $sudo apt-get update -q
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -q --no-install-recommends "${missing[@]}"
fi

# The office runs Python components in the system python3, not in any venv.
office_python=/usr/bin/python3
if [ ! -x .venv/bin/python ] || ! .venv/bin/python -c "import uno" 2>/dev/null; then
  rm -rf .venv
  "$office_python" -m venv --system-site-packages .venv
fi
if ! .venv/bin/python - <<'PY' 2>/dev/null
import sys
from importlib.metadata import version
wanted = [l.split("#")[0].strip() for l in open("requirements-dev.txt")]
for line in filter(None, wanted):
    name, ver = line.split("==")
    if version(name.split("[")[0]) != ver:  # dask[distributed]: the extras are not a name
        sys.exit(1)
PY
then
  .venv/bin/pip install -q --disable-pip-version-check -r requirements-dev.txt
fi
# LibreOffice 25.2 beside the system's office, for the second run of the office tests
# (tools/office25.sh; nothing of the system's is changed).  Debian 12 only.
bash tools/office25.sh >/dev/null || echo "setup: no LibreOffice 25.2 in .office25/ (see above)"
echo "setup: ready (office $(soffice --version 2>/dev/null | awk '{print $2}'), venv .venv)"
