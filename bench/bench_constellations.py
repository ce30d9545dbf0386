"""The constellation of 100,000 positions: our core beside astropy and skyfield, in one run.

A benchmark, not a test: it prints numbers and asserts nothing about speed.  The
positions are random directions over the whole sky (ICRS, seeded).  Timed:

  ours, core     calcfuncs.constellations on the arrays (precession to B1875.0, lookup)
  ours, cells    SKY.CONSTELLATION through the cell layer as a whole-column call (reading
                 the cell values and building the reply: what a sheet's column costs)
  astropy        get_constellation on a SkyCoord in ICRS (astropy 8.0)
  skyfield       load_constellation_map()(position_of_radec(...)) (skyfield 1.55)

It also counts how often the answers differ (both libraries' own one-line calls take a
slightly different route to B1875.0: astropy through the geocentre with aberration,
skyfield with the nutation of B1875.0; see tests/test_constellations.py).

    .venv/bin/python bench/bench_constellations.py [--rows 100000] [--json out.json]
"""

import argparse
import os
import sys
import warnings

import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)

from timing import best, save_figures  # noqa: E402

from calcfuncs import cells, constellations, frames  # noqa: E402


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--rows", type=int, default=100_000)
    parser.add_argument("--json", metavar="FILE")
    opts = parser.parse_args(argv)
    n = opts.rows
    rng = np.random.default_rng(1875)
    ra = rng.uniform(0.0, 360.0, n)
    dec = np.degrees(np.arcsin(rng.uniform(-1.0, 1.0, n)))

    def core():
        index = constellations.of_icrs_vectors(frames.unit_vectors(ra, dec))
        return np.array(constellations.ABBREVIATIONS)[index]

    ra_cells = tuple((float(x),) for x in ra)
    dec_cells = tuple((float(x),) for x in dec)

    def through_cells():
        return np.array([row[0] for row in cells.evaluate(
            "SKY.CONSTELLATION", [ra_cells, dec_cells, "ICRS"])])

    from astropy.coordinates import SkyCoord, get_constellation
    import astropy.units as u
    from skyfield.api import load_constellation_map, position_of_radec

    def with_astropy():
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            return np.asarray(get_constellation(SkyCoord(ra * u.deg, dec * u.deg),
                                                short_name=True))

    lookup = load_constellation_map()

    def with_skyfield():
        return lookup(position_of_radec(ra / 15.0, dec))

    figures = {"rows": n}
    results = {}
    for name, fn in (("ours_core", core), ("ours_cells", through_cells),
                     ("astropy", with_astropy), ("skyfield", with_skyfield)):
        seconds, out = best(fn)
        figures[name + "_us_per_row"] = seconds / n * 1e6
        results[name] = out
    assert np.array_equal(results["ours_core"], results["ours_cells"])
    for name in ("astropy", "skyfield"):
        figures[name + "_rows_differing"] = int(np.sum(results[name] != results["ours_core"]))
    print(f"constellation of {n:,} random ICRS positions, one run, best of 3 (us a row):")
    for name in ("ours_core", "ours_cells", "astropy", "skyfield"):
        per_row = figures[name + "_us_per_row"]
        line = f"  {name:11s} {per_row:8.3f} us"
        for base in ("ours_core", "ours_cells"):
            line += f"   {per_row / figures[base + '_us_per_row']:6.2f} x {base}"
        if name in ("astropy", "skyfield"):
            line += f"   rows differing from ours: {figures[name + '_rows_differing']}"
        print(line)
    if opts.json:
        save_figures(opts.json, figures)


if __name__ == "__main__":
    main()
