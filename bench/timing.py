"""The one timer of the benchmarks: the best of a few runs, and the last run's result."""

import time


def best(fn, repeat=3, *args):
    """(best seconds, result) of ``fn(*args)`` run ``repeat`` times: the least disturbed
    run is the one to compare on a machine shared with other work."""
    times, out = [], None
    for _ in range(repeat):
        t0 = time.perf_counter()
        out = fn(*args)
        times.append(time.perf_counter() - t0)
    return min(times), out


def save_figures(path, figures):
    """Write a benchmark's figures as JSON, whole or not at all (a run stopped half way
    leaves the last complete file).  numpy numbers are written as numbers."""
    import json
    import os

    def plain(value):
        return value.item() if hasattr(value, "item") else str(value)

    partial = path + ".part"
    with open(partial, "w", encoding="utf-8") as f:
        json.dump(figures, f, indent=1, default=plain)
    os.replace(partial, path)
