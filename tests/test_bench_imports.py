"""Every benchmark under bench/ still loads and has its entry point.

The benchmarks run outside the suite (``make bench``), so a helper renamed in one of
them (bench_coordinates.py once imported a timer that had moved to timing.py) would
otherwise go unnoticed until someone measures."""

import importlib
import os
import sys

import pytest

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
BENCH = os.path.join(ROOT, "bench")
NAMES = sorted(f[:-3] for f in os.listdir(BENCH) if f.endswith(".py") and f != "timing.py")


@pytest.mark.parametrize("name", NAMES)
def test_benchmark_loads(name, monkeypatch):
    monkeypatch.syspath_prepend(BENCH)
    monkeypatch.syspath_prepend(os.path.join(ROOT, "tools"))
    module = importlib.import_module(name)
    assert callable(getattr(module, "main", None)), f"bench/{name}.py has no main()"
