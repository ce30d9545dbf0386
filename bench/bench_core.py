"""How long the core takes per row, through the cell layer, for the main families.

A benchmark, not a test: it prints numbers and asserts nothing about speed.  It is the
before-and-after yardstick of refactors of the core (run it on two checkouts and
compare): every case goes through ``calcfuncs.cells.evaluate`` as the office would,

  column   one call with a whole column of distinct rows (a whole-column formula)
  cell     one call per row (a formula filled down), the answer cache emptied first
  log      places filled down a log of nine instants a day, one call per cell, with and
           without the single-cell nodes (calcfuncs/nodes.py), and a sparse log

    .venv/bin/python bench/bench_core.py [--rows 10000] [--event-rows 40] [--json out.json]

Inputs are invented: UTC date-times spread over 2024-2026 (seeded), the invented hill
station of an invented club (47.3814 N, 8.0542 E, 455 m), random directions.
"""

import argparse
import os
import sys
import time

import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)

from calcfuncs import cells  # noqa: E402
from timing import save_figures  # noqa: E402

SITE = (47.3814, 8.0542)


def _times(n, seed=7):
    rng = np.random.default_rng(seed)
    # Calc date-times (days since 1899-12-30): 2024-01-01 is 45292.
    return [float(x) for x in 45292.0 + rng.uniform(0.0, 3 * 365.0, n)]


def _directions(n, seed=8):
    rng = np.random.default_rng(seed)
    ra = rng.uniform(0.0, 360.0, n)
    dec = np.degrees(np.arcsin(rng.uniform(-1.0, 1.0, n)))
    return [float(x) for x in ra], [float(x) for x in dec]


def cases(rows, event_rows):
    """(label, function, argument columns) with ``None`` for options left out."""
    t = _times(rows)
    ra, dec = _directions(rows)
    days = [float(np.floor(x)) for x in _times(event_rows, seed=9)]
    te = _times(event_rows, seed=10)
    years = [float(y) for y in np.arange(2000, 2000 + event_rows)]
    lons = [float(x) for x in np.linspace(0.0, 359.0, event_rows)]
    return [
        ("JD", "SKY.JD", [t]),
        ("SUN.LON", "SKY.SUN.LON", [t]),
        ("MOON.LON", "SKY.MOON.LON", [t]),
        ("PLANET.RA MARS", "SKY.PLANET.RA", ["MARS", t]),
        ("BJD.TDB", "SKY.BJD.TDB", [t, ra, dec]),
        ("COORD.LON J2000->ECL DATE", "SKY.COORD.LON",
         [ra, dec, "EQUATORIAL J2000", "ECLIPTIC DATE", t]),
        ("HORIZON.ALT", "SKY.HORIZON.ALT", [ra, dec, t, SITE[0], SITE[1]]),
        ("SUN.SUNDIAL", "SKY.SUN.SUNDIAL", [t, SITE[1]]),
        ("SEASON", "SKY.SEASON", [years]),
        ("SEASON.LENGTH", "SKY.SEASON.LENGTH", [years]),
        ("SUN.RISE", "SKY.SUN.RISE", [days, SITE[0], SITE[1]]),
        ("SUN.TRANSIT", "SKY.SUN.TRANSIT", [days, SITE[0], SITE[1]]),
        ("SUN.DAYLENGTH", "SKY.SUN.DAYLENGTH", [days, SITE[0], SITE[1]]),
        ("SUN.REACHES", "SKY.SUN.REACHES", [lons, te]),
        ("MOON.PHASE.NEXT", "SKY.MOON.PHASE.NEXT", [te]),
        ("MOON.AGE", "SKY.MOON.AGE", [te]),
        ("PLANET.EVENT.NEXT MARS", "SKY.PLANET.EVENT.NEXT", ["MARS", te]),
        ("PLANET.EVENT.NEXT VENUS GE", "SKY.PLANET.EVENT.NEXT",
         ["VENUS", te, None, "GREATEST EAST"]),
    ]


def _column(values):
    return tuple((v,) for v in values) if isinstance(values, list) else values


def _row(values, i):
    return values[i] if isinstance(values, list) else values


def run(rows, event_rows):
    out = []
    for label, name, args in cases(rows, event_rows):
        n = next(len(a) for a in args if isinstance(a, list))
        cells.evaluate(name, [_row(a, 0) for a in args])  # imports and first-use caches
        t0 = time.perf_counter()
        column = cells.evaluate(name, [_column(a) for a in args])
        t_column = time.perf_counter() - t0
        bad = [c for r in column for c in r if isinstance(c, str) and c.startswith("#SKY")]
        n_cell = min(n, 200 if n > event_rows else n)
        cells._SINGLE_CELL_CACHE.clear()
        t0 = time.perf_counter()
        for i in range(n_cell):
            cells.evaluate(name, [_row(a, i) for a in args])
        t_cell = time.perf_counter() - t0
        out.append({"case": label, "rows": n, "column_us_per_row": 1e6 * t_column / n,
                    "cell_us_per_row": 1e6 * t_cell / n_cell, "messages": len(bad)})
        print(f"{label:28s} rows {n:6d}  column {out[-1]['column_us_per_row']:10.1f} us/row  "
              f"cell {out[-1]['cell_us_per_row']:10.1f} us/row"
              + (f"  ({len(bad)} messages!)" if bad else ""), flush=True)
    return out


def _fresh_single_cell_state():
    from calcfuncs import nodes

    cells._SINGLE_CELL_CACHE.clear()
    nodes.forget_single_cells()


def log_cells(rows, per_day=9.0, seed=11):
    """Places filled down an observing log (``per_day`` instants a day, in time order),
    one call per cell, cold: with the single-cell nodes (calcfuncs/nodes.py, for_one)
    and with every cell computed directly; and a sparse log (one instant in two days)."""
    from calcfuncs import nodes

    rng = np.random.default_rng(seed)
    dense = [float(x) for x in 45292.0 + np.sort(rng.uniform(0.0, rows / per_day, rows))]
    sparse = [float(x) for x in 45292.0 + np.sort(rng.uniform(0.0, 2.0 * rows, rows))]
    out = []
    for label, name, lead in (("SUN.LON", "SKY.SUN.LON", []), ("MOON.LON", "SKY.MOON.LON", []),
                              ("PLANET.RA MARS", "SKY.PLANET.RA", ["MARS"])):
        cells.evaluate(name, [*lead, 45000.0])  # imports and first-use caches
        row = {"case": label, "rows": rows}
        for key, times, dense_cells in (("dense_nodes", dense, nodes.DENSE_CELLS),
                                        ("dense_direct", dense, 10**9),
                                        ("sparse", sparse, nodes.DENSE_CELLS)):
            saved = nodes.DENSE_CELLS
            nodes.DENSE_CELLS = dense_cells
            try:
                _fresh_single_cell_state()
                t0 = time.perf_counter()
                for t in times:
                    cells.evaluate(name, [*lead, t])
                row[key + "_us_per_cell"] = 1e6 * (time.perf_counter() - t0) / rows
            finally:
                nodes.DENSE_CELLS = saved
        out.append(row)
        print(f"{label:28s} a log filled down, {rows} cells, {per_day:g} a day: "
              f"{row['dense_nodes_us_per_cell']:6.1f} us a cell with the nodes, "
              f"{row['dense_direct_us_per_cell']:6.1f} without (x"
              f"{row['dense_direct_us_per_cell'] / row['dense_nodes_us_per_cell']:.2f}); "
              f"sparse {row['sparse_us_per_cell']:6.1f} us", flush=True)
    _fresh_single_cell_state()
    return out


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--rows", type=int, default=10_000)
    parser.add_argument("--event-rows", type=int, default=40)
    parser.add_argument("--log-rows", type=int, default=2000,
                        help="cells of the filled-down log cases (default 2000)")
    parser.add_argument("--json", metavar="FILE")
    opts = parser.parse_args(argv)
    result = run(opts.rows, opts.event_rows)
    result.extend(log_cells(opts.log_rows))
    if opts.json:
        save_figures(opts.json, result)


if __name__ == "__main__":
    main()
