"""The core's house rules that a reader would otherwise check by eye.

- No module of calcfuncs/ uses another module's underscore names (``from .sun import
  _rows``, ``sun._check_years``): what one module lends another is public and named so.
- The core never imports the office's ``uno``.
- The core never meets the sheet's null date: only the cell layer (cells.py, and the
  reading and writing of cell values in timeinput.py) turns instants into date-time
  values.
"""

import ast
import os

import pytest

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
CORE = os.path.join(ROOT, "calcfuncs")


def _core_modules():
    for folder, _dirs, files in os.walk(CORE):
        for name in sorted(files):
            if name.endswith(".py"):
                yield os.path.relpath(os.path.join(folder, name), ROOT)


def _module_name(relpath):
    parts = relpath[:-3].split(os.sep)
    if parts[-1] == "__init__":
        parts = parts[:-1]
    return ".".join(parts)


def _resolve(package, level, module):
    """The absolute name of what ``from <level dots><module> import`` names, seen from a
    module of ``package`` (a list of names)."""
    if level == 0:
        return module or ""
    base = package[: len(package) - (level - 1)]
    return ".".join(base + ([module] if module else []))


def _borrowed_private_names(text, relpath):
    """(line, text) of each use of another core module's underscore name."""
    tree = ast.parse(text, relpath)
    me = _module_name(relpath)
    package = me.split(".") if relpath.endswith("__init__.py") else me.split(".")[:-1]
    aliases = {}  # local name -> core module it may stand for
    found = []
    for node in ast.walk(tree):
        if isinstance(node, ast.ImportFrom):
            source = _resolve(package, node.level, node.module)
            if not source.startswith("calcfuncs"):
                continue
            for alias in node.names:
                if (alias.name.startswith("_") and not alias.name.startswith("__")
                        and source != me):
                    found.append((node.lineno, f"from {source} import {alias.name}"))
                elif (alias.asname or "").startswith("_") and source != me:
                    # A public name renamed private: one name for one thing.
                    found.append((node.lineno, f"from {source} import {alias.name} as "
                                               f"{alias.asname}"))
                # "from . import sun": the name may be a module of the core.
                aliases[alias.asname or alias.name] = f"{source}.{alias.name}"
        elif isinstance(node, ast.Import):
            for alias in node.names:
                if alias.name.startswith("calcfuncs"):
                    aliases[alias.asname or alias.name] = alias.name
    for node in ast.walk(tree):
        if (isinstance(node, ast.Attribute) and isinstance(node.value, ast.Name)
                and node.value.id in aliases and node.attr.startswith("_")
                and not node.attr.startswith("__")):
            found.append((node.lineno, f"{node.value.id}.{node.attr}"))
    return sorted(found)


def _read(relpath):
    with open(os.path.join(ROOT, relpath), encoding="utf-8") as f:
        return f.read()


@pytest.mark.parametrize("relpath", list(_core_modules()))
def test_no_module_uses_another_modules_underscore_names(relpath):
    assert _borrowed_private_names(_read(relpath), relpath) == []


def test_the_check_sees_a_borrowed_name():
    # The check itself, on a module text written for it: both spellings are caught,
    # public names and a module's own underscore names are not.
    probe = ("from .sun import _rows, place\nfrom . import sun\nfrom .zz_probe import _mine\n"
             "x = sun._check_years\ny = sun.place\n")
    found = [text for _, text in _borrowed_private_names(probe, "calcfuncs/zz_probe.py")]
    assert found == ["from calcfuncs.sun import _rows", "sun._check_years"]
    renamed = [text for _, text in _borrowed_private_names(
        "from .timeinput import iso_text as _iso_text\n", "calcfuncs/zz_probe.py")]
    assert renamed == ["from calcfuncs.timeinput import iso_text as _iso_text"]
    in_package = "from .. import _private\nfrom .common import _shared\n"
    found = [text for _, text in
             _borrowed_private_names(in_package, "calcfuncs/registry/__init__.py")]
    assert found == ["from calcfuncs import _private", "from calcfuncs.registry.common import _shared"]


@pytest.mark.parametrize("relpath", list(_core_modules()))
def test_the_core_never_imports_uno(relpath):
    tree = ast.parse(_read(relpath), relpath)
    names = {a.name.split(".")[0] for n in ast.walk(tree) if isinstance(n, ast.Import)
             for a in n.names}
    names |= {(n.module or "").split(".")[0] for n in ast.walk(tree)
              if isinstance(n, ast.ImportFrom) and n.level == 0}
    assert "uno" not in names and "unohelper" not in names


# The cell layer and its two Python front doors (the API and the command line take a
# null date, as a sheet has one).
CELL_LAYER = {os.path.join("calcfuncs", name) for name in
              ("cells.py", "timeinput.py", "api.py", "cli.py", "__init__.py")}


@pytest.mark.parametrize("relpath", [p for p in _core_modules() if p not in CELL_LAYER])
def test_only_the_cell_layer_meets_the_null_date(relpath):
    tree = ast.parse(_read(relpath), relpath)
    names = {n.id for n in ast.walk(tree) if isinstance(n, ast.Name)}
    names |= {a.arg for n in ast.walk(tree) if isinstance(n, ast.arguments)
              for a in n.args + n.kwonlyargs}
    assert not names & {"null_jd", "null_date", "to_serial"}, relpath
