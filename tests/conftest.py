"""Shared fixtures: the repository on sys.path, and a real headless office for the
tests marked ``office``."""

import os
import subprocess
import sys

import pytest

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)
sys.path.insert(0, os.path.join(ROOT, "tools"))
OXT = os.path.join(ROOT, "dist", "eclipsheet.oxt")

# The progress line's library before any test imports `uno` (calcfuncs/progress.py says why).
import calcfuncs.progress  # noqa: E402,F401


def pytest_report_header(config):
    """Which office the office tests drive: the system's, or the one ECLIPSHEET_OFFICE
    names (LibreOffice 25.2 from tools/office25.sh, run by `make test` after 7.4)."""
    program = os.environ.get("ECLIPSHEET_OFFICE")
    soffice = os.path.join(program, "soffice") if program else "soffice"
    try:
        version = subprocess.run([soffice, "--version"], capture_output=True, text=True,
                                 timeout=60).stdout.strip()
    except (OSError, subprocess.SubprocessError):
        version = "none found"
    return f"office: {version} ({program or 'the system office'})"


def _build_oxt():
    """Build the extension from the working tree once per session (about 0.2 s), so
    the office tests never run an older build."""
    subprocess.run([sys.executable, os.path.join(ROOT, "extension", "build.py"), "oxt", OXT],
                   check=True, stdout=subprocess.DEVNULL)
    return OXT


@pytest.fixture(scope="session")
def oxt():
    return _build_oxt()


@pytest.fixture(scope="session")
def office(oxt):
    """One office for the session, with the built extension installed by unopkg."""
    import officekit  # needs `import uno`: run from .venv (see the README)

    with officekit.Office(oxt=oxt) as running:
        yield running


@pytest.fixture
def sheet_doc(office):
    doc = office.new_sheet()
    yield doc
    doc.close(True)


@pytest.fixture(autouse=True)
def _fresh_single_cell_nodes(monkeypatch):
    """Each test starts with no single-cell segments kept (calcfuncs/nodes.py): a dense
    run of cells takes its values from a segment, so the cells computed by earlier tests
    must not decide whether a later test's cells do (nor their answers, kept by the cell
    layer)."""
    from calcfuncs import cells, nodes

    monkeypatch.setattr(nodes, "_SEGMENTS", {})
    monkeypatch.setattr(nodes, "_ASKED", {})
    monkeypatch.setattr(nodes, "_ASKED_OF", {})
    monkeypatch.setattr(nodes, "_AT_POINTS", {})
    monkeypatch.setattr(nodes, "_LONG", {})
    monkeypatch.setattr(nodes, "_LAST_ONE", [(None, None, None, False)])
    monkeypatch.setattr(cells, "_SINGLE_CELL_CACHE", cells.KeptAnswers())
    nodes.forget_kept_instants()  # one instant's ERFA values (exact, but kept all the same)
