"""BJD_TDB of 10,000 observations: the core's column call against a straightforward
per-row pyerfa pipeline and against astropy's vectorised equivalent, in one run.

    .venv/bin/python bench/bench_bjd.py [--rows 10000] [--repeat 3]

Reports the best of a few runs for each, the ratios, and the largest differences
between the three (in microseconds).  A measurement, not a test.
"""

import argparse
import os
import sys

import erfa
import numpy as np

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), ".."))
from timing import best  # noqa: E402

from calcfuncs import cells  # noqa: E402
from calcfuncs.cells import evaluate  # noqa: E402

AULT_DAYS = erfa.AULT / erfa.DAYSEC


def invented_log(n, seed=6):
    """Mid-exposure UTC times over 2024-2026 (as MJD) and targets, invented."""
    rng = np.random.default_rng(seed)
    mjd = np.sort(60310.0 + rng.uniform(0.0, 1000.0, n))
    ra = rng.uniform(0.0, 360.0, n)
    dec = np.degrees(np.arcsin(rng.uniform(-1.0, 1.0, n)))
    return mjd, ra, dec


def per_row_pyerfa(mjd, ra, dec):
    """What a script would write first: one row at a time through ERFA."""
    out = np.empty(mjd.size)
    for i in range(mjd.size):
        tai1, tai2 = erfa.utctai(2400000.5, mjd[i])
        tt1, tt2 = erfa.taitt(tai1, tai2)
        dtr = erfa.dtdb(tt1, tt2, 0.0, 0.0, 0.0, 0.0)
        tdb1, tdb2 = erfa.tttdb(tt1, tt2, dtr)
        _, pvb = erfa.epv00(tdb1, tdb2)
        n = erfa.s2c(np.radians(ra[i]), np.radians(dec[i]))
        delay = float(np.dot(pvb["p"], n)) * AULT_DAYS
        out[i] = (tdb1 - 2400000.5) + tdb2 + delay
    return out


def core(mjd, ra, dec):
    cells._SINGLE_CELL_CACHE.clear()
    col = lambda v: tuple((float(x),) for x in v)  # noqa: E731
    # As a sheet holds them: date-time serials from the 1899-12-30 null date (MJD 15018).
    times = col(mjd - 15018.0)
    got = evaluate("SKY.BJD.TDB", [times, col(ra), col(dec), "UTC", "MJD"])
    return np.array([r[0] for r in got])


def astropy_bjd(mjd, ra, dec):
    from astropy import units as u
    from astropy.coordinates import EarthLocation, SkyCoord
    from astropy.time import Time
    from astropy.utils import iers

    iers.conf.auto_download = False
    geocentre = EarthLocation.from_geocentric(0.0, 0.0, 0.0, unit=u.m)
    t = Time(mjd, format="mjd", scale="utc", location=geocentre)
    c = SkyCoord(ra * u.deg, dec * u.deg)
    return (t.tdb + t.light_travel_time(c, "barycentric", ephemeris="builtin")).mjd


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--rows", type=int, default=10_000)
    ap.add_argument("--repeat", type=int, default=3)
    args = ap.parse_args(argv)
    mjd, ra, dec = invented_log(args.rows)
    t_core, r_core = best(core, args.repeat, mjd, ra, dec)
    t_rows, r_rows = best(per_row_pyerfa, 1, mjd, ra, dec)
    t_astropy, r_astropy = best(astropy_bjd, args.repeat, mjd, ra, dec)
    us = 86400e6
    print(f"rows: {args.rows}")
    print(f"core column call (SKY.BJD.TDB):   {t_core:8.3f} s  {t_core / args.rows * 1e6:7.1f} us/row")
    print(f"per-row pyerfa pipeline:          {t_rows:8.3f} s  {t_rows / args.rows * 1e6:7.1f} us/row")
    print(f"astropy light_travel_time:        {t_astropy:8.3f} s  {t_astropy / args.rows * 1e6:7.1f} us/row")
    print(f"ratio per-row pyerfa / core:      {t_rows / t_core:8.1f}")
    print(f"ratio astropy / core:             {t_astropy / t_core:8.1f}")
    print(f"largest |core - per-row pyerfa|:  {np.max(np.abs(r_core - r_rows)) * us:8.3f} us")
    print(f"largest |core - astropy|:         {np.max(np.abs(r_core - r_astropy)) * us:8.3f} us")


if __name__ == "__main__":
    main()
