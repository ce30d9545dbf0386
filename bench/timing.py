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
