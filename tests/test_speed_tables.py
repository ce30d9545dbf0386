"""The README's speed tables say what the benchmark figures kept in bench/figures/ say
(tools/speed_table.py makes them from those files; `make speed-tables` renews both)."""

import os
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, os.path.join(ROOT, "tools"))

import speed_table  # noqa: E402


def test_the_readme_tables_are_made_from_the_kept_figures():
    with open(os.path.join(ROOT, "README.md"), encoding="utf-8") as f:
        readme = f.read()
    made = speed_table.tables(os.path.join(ROOT, "bench", "figures"))
    assert speed_table.with_tables(readme, made) == readme


def test_every_library_workload_has_our_figure_and_another():
    import json

    with open(os.path.join(ROOT, "bench", "figures", "bench-libraries.json"),
              encoding="utf-8") as f:
        figures = json.load(f)
    workloads = {fig["workload"] for fig in figures}
    assert {"sun", "moon", "mars", "rotation", "sunrise", "seasons", "phases",
            "planets"} <= workloads
    for key in workloads:
        who = [fig["who"] for fig in figures if fig["workload"] == key]
        assert any(w.startswith("ours") for w in who), key
        assert any(not w.startswith("ours") for w in who), key
