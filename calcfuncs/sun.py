"""The Sun as seen from the Earth's centre, and the events of the solar year.

Caution (vocabulary.SUN_CAUTION): never look at the Sun, or point binoculars, a
telescope or a camera at it, without a proper solar filter made for that purpose.

Position: the Earth's heliocentric and barycentric position and velocity from ERFA
epv00 (Bretagnon and Francou's VSOP2000-based series, 1900-2100 good to a few km,
used over 1000-3000 here; VSOP87D outside, to -4000 and +8000: longrange.py), or a JPL
kernel; the Sun's place comes from the one pipeline
of bodies.py.
  GEOMETRIC   the Sun's direction at the same instant, no light time, no aberration
  ASTROMETRIC light time (about 499 s) applied: where the light left the Sun
  APPARENT    light time and annual aberration (ERFA ab): the direction observed
Then a rotation into the chosen system (frames.py): J2000, DATE (mean ecliptic and
equinox of date) or TRUE (true equinox, nutation in longitude included).
Events (seasons, a longitude reached, rise, set, transit) are searched for all rows
at once (events.py).
"""

import erfa
import numpy as np

from . import bodies, ephemeris, events, frames, nodes, sun_days, vectors
from .bounded import keep
from .errors import RowErrors, SkyError, rows_failing
from .events import crossings, wrap180
from .timescales import DateTimes, Instants, check_years
from .vocabulary import BUILTIN, BUILTIN_YEARS, ECLIPTIC_OF_FRAME, J2000_JD, LONG_RANGE_YEARS


def sun_gcrs(tt1, tt2, kind="APPARENT", source=BUILTIN):
    """(unit vectors, distance in au) of the geocentric Sun on the GCRS axes."""
    return bodies.geocentric("SUN", tt1, tt2, kind, source)


def sun_in(tt1, tt2, system, kind="APPARENT", source=BUILTIN):
    """Unit vectors of the Sun in a coordinate system of frames.py."""
    return bodies.body_in("SUN", tt1, tt2, system, kind, source)


def sun_longitude(tt1, tt2, frame="TRUE", kind="APPARENT"):
    lon, _ = frames.spherical(sun_in(tt1, tt2, ECLIPTIC_OF_FRAME[frame], kind))
    return lon


def sun_and_sidereal(tt1, tt2, ut, with_distance=False):
    """The apparent Sun's RA and Dec on the true equator and equinox of date (degrees)
    and Greenwich apparent sidereal time (radians, IAU 2006/2000A) at TT instants whose
    UT is ``ut`` (Instants): the one sidereal time of the Sun's module.  One
    precession-nutation matrix serves both (ERFA gst06a is gst06 of that matrix).
    ``with_distance``: the Sun's distance (au) too."""
    u, r = sun_gcrs(tt1, tt2)
    npb = frames.system_matrix("EQUATORIAL TRUE", tt1, tt2)
    ra, dec = frames.spherical(vectors.apply(npb, u))
    found = ra, dec, erfa.gst06(ut.jd1, ut.jd2, tt1, tt2, npb)
    return found + (r,) if with_distance else found


# ---- cell functions: position ---------------------------------------------------------


lon_cells, lat_cells, ra_cells, dec_cells = bodies.place_cells("SUN")


def distance_cells(time, source=BUILTIN):
    return sun_gcrs(*time.tt(), "GEOMETRIC", source)[1]


def solar_longitude_cells(time):
    """The meteor-work solar longitude: apparent, on the ecliptic and equinox J2000.0 (the
    cells of SKY.SUN.LON with those options, to the bit)."""
    return lon_cells(time, "J2000", "APPARENT")


def _solar_longitude_on_floats(time):
    return lon_cells.on_floats(time, "J2000", "APPARENT")


solar_longitude_cells.on_floats = _solar_longitude_on_floats


def equation_of_time_minutes(time):
    """Apparent minus mean solar time, in minutes (positive: a sundial is fast)."""
    ut = time.to("UT")
    ra, _, gast = sun_and_sidereal(*time.tt(), ut)
    gast = np.degrees(gast)
    # Greenwich hour angle of the Sun minus that of the mean Sun (UT - 12 h).
    ut_fraction = np.mod((ut.jd1 - 0.5) + ut.jd2, 1.0)
    return wrap180(gast - ra - (ut_fraction * 360.0 - 180.0)) * 4.0


def equation_of_time_cells(time):
    return equation_of_time_minutes(time)


def sundial_time_cells(time, longitude):
    """Local apparent (sundial) time as a date-time: UT + longitude/15 h + EoT."""
    eot_days = equation_of_time_minutes(time) / 1440.0
    return DateTimes(time.to("UT"), np.asarray(longitude) / 360.0 + eot_days)


# ---- the solar year ---------------------------------------------------------------------

SEASONS = {"MARCH": 0.0, "JUNE": 90.0, "SEPTEMBER": 180.0, "DECEMBER": 270.0}
# Whole years inside the built-in source's span (-4000 to +8000; Gregorian years start
# up to 45 days after the Julian epochs of the same number there).
FIRST_YEAR, LAST_YEAR = int(LONG_RANGE_YEARS[0]) + 1, int(LONG_RANGE_YEARS[1]) - 1


def rough_longitude(tt1, tt2, frame="TRUE"):
    """The Sun's apparent longitude to about 0.01 degree near 2000 and a few hundredths
    over 1000-3000, from the low-precision formulas of the Astronomical Almanac as Meeus
    gives them (Astronomical Algorithms, ch. 25: mean longitude, equation of the centre,
    aberration and the main nutation term), on the J2000 ecliptic less the general
    precession in longitude (IAU 1976, 5029.0966" a century).  For locating events
    only: the search then refines with the full theory."""
    t = ((tt1 - J2000_JD) + tt2) / 36525.0
    mean = 280.46646 + t * (36000.76983 + t * 0.0003032)
    m = np.radians(357.52911 + t * (35999.05029 - t * 0.0001537))
    centre = ((1.914602 - t * (0.004817 + t * 0.000014)) * np.sin(m)
              + (0.019993 - t * 0.000101) * np.sin(2.0 * m) + 0.000289 * np.sin(3.0 * m))
    node = np.radians(125.04 - 1934.136 * t)
    apparent = mean + centre - 0.00569 - 0.00478 * np.sin(node)
    if frame == "J2000":
        apparent = apparent - t * (1.396971 + t * 0.0003086)
    return apparent


# |f'' / 2f'| of the Sun's apparent longitude, per day, bounded with a margin: the
# orbit's eccentricity swings the daily motion between about 0.953 and 1.019 degrees over
# the year, the Moon's pull on the Earth (6" over a synodic month) and nutation's
# fortnightly term add a little; measured at most 3.6e-4 a day over -4000 to +8000
# (tests/test_sun.py).  Set at 2e-3: a polished equinox then costs two evaluations of
# the full theory instead of three.
LONGITUDE_CURVATURE = 2e-3
SAMPLE_DAYS = 30.0  # the rough longitude's samples in a search (longitude_crossings)


def longitude_crossings(target_deg, start_tt, end_tt, frame="TRUE"):
    """``events.Roots``: per row, the TT instants in [start, end] when the Sun's apparent
    longitude reaches that row's target (degrees)."""
    target = np.ravel(np.asarray(target_deg, dtype=float))

    def f(jd1, jd2, row):
        return wrap180(sun_longitude(jd1, jd2, frame) - target[row])

    def rough(jd1, jd2, row):
        return wrap180(rough_longitude(jd1, jd2, frame) - target[row])

    split = None
    if frame == "TRUE":
        # The true longitude is the mean-of-date one plus the nutation in longitude
        # (the frames differ by that turn about the ecliptic's pole): the cheap part
        # takes the IAU 2000B series, the slow part adds 2000A - 2000B (events.polish).
        def cheap(jd1, jd2, row):
            dpsi = erfa.ufunc.nut00b(jd1, jd2)[0]
            return wrap180(sun_longitude(jd1, jd2, "DATE") + np.degrees(dpsi) - target[row])

        def slow(jd1, jd2, row):
            return np.degrees(frames.true_nutation_in_longitude(jd1, jd2)
                              - erfa.ufunc.nut00b(jd1, jd2)[0])

        split = (cheap, slow, NUTATION_DIFFERENCE_DRIFT)

    # The rough longitude is off by a few hundredths of a degree, under an hour of the
    # Sun's motion.  The apparent longitude never goes back and moves 0.95 to 1.02
    # degrees a day: samples SAMPLE_DAYS apart see each crossing as a rise through zero
    # of about 30 degrees, which ``jump`` (90) tells from the wrap at 180; a few
    # false-position steps on the rough function then place it within seconds.
    return events.polished_crossings(f, rough, start_tt, end_tt, SAMPLE_DAYS, jump=90.0,
                                     curvature=LONGITUDE_CURVATURE, split=split)


# The IAU 2000A nutation in longitude less the 2000B one changes by at most 1.76 mas a
# day over 1000-3000 (measured by central differences at 200,000 random instants; see
# tests/test_sun.py); bounded six times over, in degrees a day.  At a slope of about a
# degree a day it moves a settled equinox by under 1e-5 of the last step.
NUTATION_DIFFERENCE_DRIFT = 3e-6


def _year_start_tt(year):
    from .calendars import GREGORIAN, jdn

    return jdn(np.asarray(year, dtype=np.int64), 1, 1, GREGORIAN) - 0.5


def _check_year(year):
    y = np.asarray(year, dtype=float)
    bad = (y != np.round(y)) | (y < FIRST_YEAR) | (y > LAST_YEAR)
    if np.any(bad):
        raise rows_failing(bad, f"the year must be a whole number from {FIRST_YEAR} to "
                                f"{LAST_YEAR}")
    return y.astype(int)


def season_instant(year, event, frame="TRUE"):
    """TT (jd1, jd2) of an equinox or solstice of (Gregorian) years."""
    years = np.ravel(year)
    n = years.size
    first, after = _year_start_tt(years), _year_start_tt(years + 1)
    start = first - 2.0
    roots = longitude_crossings(np.full(n, SEASONS[event]), start, start + 370.0, frame)
    # The one in that calendar year (the March equinox of year y, and so on).
    keep = (((roots.jd1 - first[roots.row]) + roots.jd2 >= 0.0)
            & ((roots.jd1 - after[roots.row]) + roots.jd2 < 0.0))
    once = roots.count(n, keep) == 1
    if not np.all(once):
        messages = np.full(n, None, dtype=object)
        for k in np.flatnonzero(~once):
            messages[k] = f"the {event.lower()} event of {int(years[k])} was not found once"
        raise RowErrors(messages)
    jd1, jd2, _ = roots.first(n, keep)
    return jd1, jd2


def season_cells(year, event="MARCH", result_scale="UTC"):
    return DateTimes.of_tt(*season_instant(_check_year(year), event), result_scale)


def season_length_cells(year, event="MARCH"):
    """Days from this event to the next event of the year (the season it opens)."""
    order = list(SEASONS)
    years = _check_year(year)
    a1, a2 = season_instant(years, event)
    k = order.index(event)
    nxt = order[(k + 1) % 4]
    b1, b2 = season_instant(years + (1 if nxt == "MARCH" else 0), nxt)
    return (b1 - a1) + (b2 - a2)


def reaches_cells(longitude, time, frame="J2000", result_scale=None):
    """The first instant after ``time`` when the Sun's longitude reaches a value."""
    tt1, tt2 = time.tt()
    lon, tt1, tt2 = np.broadcast_arrays(np.asarray(longitude, dtype=float) % 360.0, tt1, tt2)
    lon, tt1, tt2 = lon.ravel(), tt1.ravel(), tt2.ravel()
    last = _year_start_tt(LAST_YEAR + 1) + 0.5  # the search stays inside the position's range
    ephemeris.check_builtin_years(tt1, tt2)  # a start outside it is refused as such
    # Windows on a 30-day grid reaching a year past each instant, searched once for
    # every instant in the block that asks for the same longitude (events.first_after).
    keys = [("SUN REACHES", x, frame) for x in lon.tolist()]
    jd1, jd2, found = events.first_after(
        lambda s, e, rep: longitude_crossings(lon[rep], s, np.minimum(e, last), frame),
        tt1, tt2, 30.0, 367.0, keys)
    if not np.all(found):
        raise rows_failing(~found, f"the Sun does not reach that longitude before the year {LAST_YEAR + 1}")
    return DateTimes.of_tt(jd1, jd2, result_scale or time.scale)


# ---- rise, transit, set, twilight -------------------------------------------------------

# Altitudes of the Sun's centre at the event, degrees.  SUNRISE: upper limb on the
# horizon with standard refraction (34') and semidiameter (16'), common practice.
EVENT_ALTITUDES = {"SUNRISE": -50.0 / 60.0, "CIVIL": -6.0, "NAUTICAL": -12.0, "ASTRONOMICAL": -18.0}


def _threshold(event, height):
    h0 = EVENT_ALTITUDES[event]
    if event == "SUNRISE":
        # Dip of the horizon for an observer above the ground, 1.76' per sqrt(metre)
        # (common practice, standard refraction included).
        h0 -= 0.0293 * np.sqrt(np.maximum(height, 0.0))
    return h0


def _altitude(ra, dec, gast, latitude, longitude):
    """Geocentric apparent altitude of the Sun's centre in degrees (refraction not
    applied; diurnal parallax, under 9", neglected)."""
    ha = gast + np.radians(longitude) - np.radians(ra)
    _, el = erfa.hd2ae(ha, np.radians(dec), np.radians(latitude))
    return np.degrees(el)


# TT - UT changes smoothly but at a step of UTC: over half-day nodes its second
# differences stay under a microsecond even where Delta T changes fastest.
SMOOTH_DAYS = 1e-11


class SunOverDays:
    """The apparent Sun (RA and Dec on the true equator and equinox of date) and
    Greenwich apparent sidereal time over windows of about a day, one per row, for the
    searches of rise, set and transit.

    What varies slowly is computed at a few instants and interpolated: the Sun's
    direction (it moves a degree a day; the largest short-period nutation term has a
    period of 13.7 days) and GAST minus the Earth rotation angle (minus the equation of
    the origins, a function of TT alone), at TT days two apart (sun_days.values: from
    anchors within 1600-2400, directly outside), eight around each window, by the
    polynomial through them (Lagrange).  TT - UT is interpolated the same way over
    half-day nodes where it is smooth, and UT computed exactly at every instant where a
    leap second or a step of UTC falls among a row's nodes.  Against the direct
    computation at each instant (tests: dense random instants 1000-3000) the
    interpolation stays within 5 mas (2.7 measured), a millisecond of an event time or
    less, where the stated accuracy is a few seconds."""

    SPACING = nodes.SPACING  # days between the nodes of TT - UT
    NODES = nodes.NODES  # the window [start, start + 1] lies between the second and fifth
    SUN_SPACING = sun_days.DAY_SPACING  # days between the nodes of the Sun and GAST - ERA
    SUN_NODES = sun_days.DAY_POINTS     # the window lies between the fourth and the sixth

    def __init__(self, start, dut1=0.0):
        start = np.ravel(np.asarray(start, dtype=float))
        self.dut1 = dut1
        # The Sun and GAST - ERA (minus the equation of the origins) at TT JDs that are
        # multiples of SUN_SPACING: both are functions of TT alone, smooth at every date.
        self.sun_origin = (np.floor(start / self.SUN_SPACING) - 3.0) * self.SUN_SPACING
        grid = self.sun_origin[:, None] + self.SUN_SPACING * np.arange(self.SUN_NODES)
        check_rows_of_nodes(grid)
        unique, self.sun_index = np.unique(grid, return_inverse=True)
        self.sun_index = self.sun_index.reshape(grid.shape)
        self.sun_values = sun_days.values(unique)[:, :4]
        # TT - UT (days) at half-day nodes, interpolated too where it is smooth over the
        # row's nodes; a leap second or a 1960s step of UTC (a jump in UT1 = UTC + DUT1)
        # shows in its second differences, and such rows take UT exactly everywhere.
        # (Whole-day nodes would miss the smaller 1960s steps, and GAST with them.)
        self.origin = np.floor(start / self.SPACING) * self.SPACING - self.SPACING
        grid = self.origin[:, None] + self.SPACING * np.arange(self.NODES)
        check_rows_of_nodes(grid)
        unique, self.index = np.unique(grid, return_inverse=True)
        self.index = self.index.reshape(grid.shape)
        ut = Instants(unique, np.zeros(unique.shape), "TT", dut1).to("UT")
        tt_minus_ut = ((unique - ut.jd1) - ut.jd2)
        self.smooth = np.all(np.abs(np.diff(tt_minus_ut[self.index], n=2, axis=1))
                             < SMOOTH_DAYS, axis=1)
        self.values = tt_minus_ut[:, None]

    def at(self, jd1, jd2, row):
        """(RA, Dec in degrees, GAST in radians) at TT instants of the rows' windows."""
        weights = nodes.weights(((jd1 - self.sun_origin[row]) + jd2) / self.SUN_SPACING,
                                self.SUN_NODES)
        values = np.einsum("mk,mkc->mc", weights, self.sun_values[self.sun_index[row]])
        weights = nodes.weights(((jd1 - self.origin[row]) + jd2) / self.SPACING)
        tt_minus_ut = np.einsum("mk,mk->m", weights, self.values[self.index[row], 0])
        ra, dec = frames.spherical(values[:, :3])
        ut1, ut2 = np.broadcast_to(jd1, ra.shape).copy(), jd2 - tt_minus_ut
        exact = ~self.smooth[row]
        if np.any(exact):
            ut = Instants(ut1[exact], jd2[exact], "TT", self.dut1).to("UT")
            ut1[exact], ut2[exact] = ut.jd1, ut.jd2
        gast = erfa.era00(ut1, ut2) + np.radians(values[:, 3])
        return ra, dec, gast


def local_day_start(time, utc_offset, ahead=0.0):
    """TT JD (one float per row) of the start of the local calendar day that contains
    the given date, or of the day ``ahead`` days after it (whole days, per row)."""
    from .timeinput import days_and_seconds

    start, _, _ = days_and_seconds(time)  # 0h of the given date on its own scale
    start = np.ravel(start) + ahead
    day0 = Instants(start - utc_offset / 24.0, np.zeros_like(start), time.scale, time.dut1)
    tt = day0.to("TT")
    return np.ravel(tt.jd1 + tt.jd2)


def row_values(value, n):
    return np.broadcast_to(np.asarray(value, dtype=float), (n,)) if np.ndim(value) == 0 \
        else np.ravel(np.asarray(value, dtype=float))


# The crossings of a local day at a site, kept across calls.  A sheet asks for one day
# per cell, down a column of days; a cell that finds its day missing computes the next
# DAYS_AHEAD days too, in the same one search, so the cells below find theirs.  A day is
# keyed by everything that moves its crossings: the TT instant of its local 0h (the date,
# the UTC offset and the time scale), the site, the altitude sought (event and height)
# and DUT1.  Bounded: at most DAY_CACHE_SIZE days (about 10 MB), the oldest dropped.
DAYS_AHEAD = 31
DAY_CACHE_SIZE = 50_000
_DAY_CACHE = {}


# Where the Sun crosses the altitude well away from its culminations (|cos H0| under
# SAFE_COS, H0 the hour angle of the crossing) and from the ends of the local day (by
# EDGE_DAYS), each crossing is found from that hour angle by Newton and secant steps
# (events.polish: two or three evaluations a crossing where hourly samples and
# brackets take thirty).  There the altitude crosses once each way in the day: the
# crossings move by at most a quarter of an hour from day to day while |cos H0| < 0.95
# (up to the polar circles), far less than the margin.  The other rows (near the polar
# day and night, or a crossing near local midnight) are searched by samples and
# brackets; both find the same root of the same function to within events' tolerance.
SAFE_COS = 0.95
EDGE_DAYS = 0.05
SOLAR_DAY_DEG = 360.0  # the Sun's hour angle, degrees a day (a first guess only)


def _guess_root(f, start, guess, slope, n, rows):
    """Polish per-row guesses (days after ``start``) of ``rows``: (offsets from start,
    mask of the rows whose root settled near the guess and inside the day's margins)."""
    found, settled = events.polish(f, events.Roots(start[rows], guess, rows), slope, n)
    x = found.jd2
    good = (settled & (np.abs(x - guess) < 0.1) & (x > 0.5 * EDGE_DAYS)
            & (x < 1.0 - 0.5 * EDGE_DAYS))
    return x, good


def _hour_angle_and_dec(sun, start, lon):
    """At each row's local noon-ish (0h + 12 h): the Sun's hour angle (degrees, wrapped)
    and declination (degrees)."""
    n = start.size
    ra, dec, gast = sun.at(start, np.full(n, 0.5), np.arange(n))
    return wrap180(np.degrees(gast) + lon - ra), dec


def rise_and_set_by_hour_angle(f, start, ha, dec, lat, h0):
    """(rows found, their rising and falling offsets from 0h in days, Sun above at 0h)
    for the rows where the crossings of ``f`` (the altitude minus ``h0``, degrees) are
    found from their hour angle (see SAFE_COS); ``ha`` and ``dec``: the Sun's hour angle
    and declination (degrees) at each row's 0h + 12 h."""
    n = start.size
    phi, delta = np.radians(lat), np.radians(dec)
    with np.errstate(divide="ignore", invalid="ignore"):
        c = ((np.sin(np.radians(h0)) - np.sin(phi) * np.sin(delta))
             / (np.cos(phi) * np.cos(delta)))
    c = np.nan_to_num(c, nan=2.0)
    h_event = np.degrees(np.arccos(np.clip(c, -1.0, 1.0)))
    rising = 0.5 + wrap180(-h_event - ha) / SOLAR_DAY_DEG
    falling = 0.5 + wrap180(h_event - ha) / SOLAR_DAY_DEG
    ok = ((np.abs(c) < SAFE_COS) & (np.minimum(rising, falling) > EDGE_DAYS)
          & (np.maximum(rising, falling) < 1.0 - EDGE_DAYS))
    rows = np.flatnonzero(ok)
    # The altitude's rate at the crossing, degrees a day (d sin h = - cos phi cos delta
    # sin H dH).
    slope = (np.cos(phi) * np.cos(delta) * np.sin(np.radians(h_event))
             * SOLAR_DAY_DEG / np.cos(np.radians(h0)))[rows]
    both = np.concatenate([rows, rows])
    x, good = _guess_root(f, start, np.concatenate([rising[rows], falling[rows]]),
                          np.concatenate([slope, -slope]), n, both)
    m = rows.size
    good = good[:m] & good[m:]
    up, down = x[:m][good], x[m:][good]
    return rows[good], up, down, down < up


def sun_rise_and_set(f, start, ha, dec, lat, h0):
    """The Sun's (rising Roots, falling Roots, above at 0h) over each row's local day:
    by hour angle where that applies (rise_and_set_by_hour_angle), by hourly samples and
    brackets for the other rows (near the polar day and night the Sun may clear the
    horizon for minutes around noon only: the vertices of the samples' peaks and
    troughs are sampled too)."""
    n = start.size
    quick, up, down, above = rise_and_set_by_hour_angle(f, start, ha, dec, lat, h0)
    at_start = np.zeros(n, dtype=bool)
    at_start[quick] = above
    ups = events.Roots(start[quick], up, quick)
    downs = events.Roots(start[quick], down, quick)
    rest = np.flatnonzero(~np.isin(np.arange(n), quick))
    if rest.size:
        more_ups, more_downs, rest_at_start = events.rising_and_falling(
            lambda jd1, jd2, row: f(jd1, jd2, rest[row]), start[rest], start[rest] + 1.0,
            1.0 / 24.0, extrema=True)
        at_start[rest] = rest_at_start > 0
        ups, downs = ups.joined(more_ups, rest), downs.joined(more_downs, rest)
    return ups, downs, at_start


def _search_days(start, lat, lon, h0, dut1):
    """Per row: (rising jd1, jd2, falling jd1, jd2, Sun above at 0h), one search."""
    n = start.size
    sun = SunOverDays(start, dut1)

    def f(jd1, jd2, row):
        ra, dec, gast = sun.at(jd1, jd2, row)
        return _altitude(ra, dec, gast, lat[row], lon[row]) - h0[row]

    ha, dec = _hour_angle_and_dec(sun, start, lon)
    ups, downs, at_start = sun_rise_and_set(f, start, ha, dec, lat, h0)
    # Roots come ordered by row: each row's are one slice.
    up = np.searchsorted(ups.row, np.arange(n + 1))
    down = np.searchsorted(downs.row, np.arange(n + 1))
    return [(ups.jd1[up[k]:up[k + 1]], ups.jd2[up[k]:up[k + 1]],
             downs.jd1[down[k]:down[k + 1]], downs.jd2[down[k]:down[k + 1]],
             bool(at_start[k])) for k in range(n)]


def _remember(key, day):
    keep(_DAY_CACHE, key, day, DAY_CACHE_SIZE)


class _DayEvents:
    """The crossings of an event's altitude over each row's local day: ``start`` (TT JD
    of 0h local), ``ups`` and ``downs`` (events.Roots), ``up_at_start`` (the Sun above
    the altitude at 0h)."""

    def __init__(self, time, latitude, longitude, utc_offset, event, height):
        self.start = local_day_start(time, utc_offset)
        n = self.start.size
        lat, lon = row_values(latitude, n), row_values(longitude, n)
        h0 = row_values(_threshold(event, np.asarray(height, dtype=float)), n)
        offset = row_values(utc_offset, n)
        keys = [(s, a, b, c, time.dut1) for s, a, b, c in
                zip(self.start.tolist(), lat.tolist(), lon.tolist(), h0.tolist())]
        # What is kept is taken now: storing the missing days may push older ones out.
        self._fresh = {key: _DAY_CACHE[key] for key in keys if key in _DAY_CACHE}
        missing = np.array([k for k, key in enumerate(keys) if key not in self._fresh], dtype=int)
        if missing.size:
            try:
                self._compute(time, missing, keys, lat, lon, h0, offset)
            except RowErrors as err:  # aligned with the missing rows: with all rows
                messages = np.full(n, None, dtype=object)
                messages[missing] = np.ravel(err.messages)
                raise RowErrors(messages) from None
        days = [self._fresh[key] for key in keys]
        self.ups = events.Roots(*_stack([(d[0], d[1]) for d in days]))
        self.downs = events.Roots(*_stack([(d[2], d[3]) for d in days]))
        self.up_at_start = np.array([d[4] for d in days], dtype=bool)

    def _compute(self, time, missing, keys, lat, lon, h0, offset):
        """Search the missing rows' days, and the days after a lone missing day (the
        cell of a column filled down); keep them all."""
        start, la, lo, h = self.start[missing], lat[missing], lon[missing], h0[missing]
        extra = ()
        if missing.size == 1:
            k = missing[0]
            ahead = np.arange(1.0, DAYS_AHEAD + 1.0)
            one = Instants(np.ravel(time.jd1)[k:k + 1], np.ravel(time.jd2)[k:k + 1],
                           time.scale, time.dut1)
            try:
                extra = local_day_start(one, offset[k], ahead)
            except SkyError:
                extra = ()  # days beyond the scale's range: the lone day alone
        if len(extra):
            both = np.concatenate([start, extra])
            fill = lambda v: np.concatenate([v, np.full(len(extra), v[0])])  # noqa: E731
            try:
                found = _search_days(both, fill(la), fill(lo), fill(h), time.dut1)
                ahead_keys = [(s, la[0], lo[0], h[0], time.dut1) for s in extra.tolist()]
                for key, day in zip(ahead_keys, found[1:]):
                    _remember(key, day)
                found = found[:1]
            except SkyError:  # a day ahead outside the years: the lone day alone
                found = None
            if found is None:
                found = _search_days(start, la, lo, h, time.dut1)
        else:
            found = _search_days(start, la, lo, h, time.dut1)
        for k, day in zip(missing, found):
            _remember(keys[k], day)
            self._fresh[keys[k]] = day


def _stack(pairs):
    """``Roots`` arguments (jd1, jd2, row) from per-row (jd1, jd2) arrays."""
    jd1 = np.concatenate([p[0] for p in pairs] + [np.zeros(0)])
    jd2 = np.concatenate([p[1] for p in pairs] + [np.zeros(0)])
    row = np.repeat(np.arange(len(pairs)), [p[0].size for p in pairs])
    return jd1, jd2, row


def check_rows_of_nodes(grid):
    """The years of ERFA's theories and of IAU 2006/2000A, which rise and set use (not
    the built-in source's long range), checked for every node of every row (rows x
    nodes): a row with a node outside gets the message (the last day or two of the
    range, whose grid reach past it, included)."""
    try:
        check_years(grid, np.zeros(grid.shape), BUILTIN_YEARS,
                    "rise, set and transit use ERFA's theories and IAU 2006/2000A")
    except RowErrors as err:
        per_row = np.reshape(err.messages, grid.shape)
        first = [next((m for m in r if m is not None), None) for r in per_row]
        raise RowErrors(np.array(first, dtype=object)) from None


def _no_event_text(up_at_start, other_found, event, rising):
    """Words for a local day without the asked event: polar day or night when the Sun
    never crosses the altitude, else which way the day goes."""
    word = "sunrise" if rising else "sunset"
    if event != "SUNRISE":
        word = f"{event.lower()} twilight {'start' if rising else 'end'}"
    if not other_found:
        level = "" if event == "SUNRISE" else f" above {EVENT_ALTITUDES[event]:g} degrees"
        if up_at_start:
            return ("polar day: the Sun does not set" if event == "SUNRISE"
                    else f"no {word}: the Sun stays{level}")
        return ("polar night: the Sun does not rise" if event == "SUNRISE"
                else f"no {word}: the Sun stays below {EVENT_ALTITUDES[event]:g} degrees")
    if rising:
        return f"no {word} on this local date: the Sun is already up when it begins"
    return f"no {word} on this local date: the Sun stays up after rising"


def local_times(jd1, jd2, found, start, time, utc_offset, words):
    """DateTimes on the local clock (the time's scale plus the UTC offset) of the rows'
    events; rows without one show their ``words`` (the day's start stands in)."""
    missing = ~found
    jd1, jd2 = jd1.copy(), jd2.copy()
    jd1[missing] = np.floor(start[missing]) + 0.5
    jd2[missing] = start[missing] - jd1[missing]
    return DateTimes.of_tt(jd1, jd2, time.scale, utc_offset / 24.0,
                           words if np.any(missing) else None)


def _rise_or_set(time, latitude, longitude, utc_offset, event, height, rising):
    check_site(latitude, longitude)
    day = _DayEvents(time, latitude, longitude, utc_offset, event, height)
    n = day.start.size
    found_roots, other = (day.ups, day.downs) if rising else (day.downs, day.ups)
    jd1, jd2, found = found_roots.first(n)
    other_found = other.count(n) > 0
    words = np.full(n, None, dtype=object)
    for k in np.flatnonzero(~found):
        words[k] = _no_event_text(day.up_at_start[k], other_found[k], event, rising)
    return local_times(jd1, jd2, found, day.start, time, utc_offset, words)


def check_site(latitude, longitude):
    frames.check_latitudes(latitude)
    lon = np.asarray(longitude, dtype=float)
    bad = np.abs(lon) > 360.0
    if np.any(bad):
        raise rows_failing(bad, "the longitude must be within -360 to 360 degrees")


def rise_cells(date, latitude, longitude, utc_offset=0.0, event="SUNRISE", height=0.0):
    return _rise_or_set(date, latitude, longitude, utc_offset, event, height, True)


def set_cells(date, latitude, longitude, utc_offset=0.0, event="SUNRISE", height=0.0):
    return _rise_or_set(date, latitude, longitude, utc_offset, event, height, False)


def daylength_cells(date, latitude, longitude, utc_offset=0.0, event="SUNRISE", height=0.0):
    """Hours of the local day with the Sun above the event's altitude (24 or 0 in
    polar day or night)."""
    check_site(latitude, longitude)
    day = _DayEvents(date, latitude, longitude, utc_offset, event, height)
    n = day.start.size
    # Every crossing of every row, in order of row, time and kind (a set before a rise
    # at the same instant); each sets the state from then on.
    row = np.concatenate([day.ups.row, day.downs.row])
    up = np.concatenate([np.ones(len(day.ups), bool), np.zeros(len(day.downs), bool)])
    jd1 = np.concatenate([day.ups.jd1, day.downs.jd1])
    jd2 = np.concatenate([day.ups.jd2, day.downs.jd2])
    t = (jd1 - day.start[row]) + jd2  # days since the local 0h
    order = np.lexsort((up, t, row))
    row, up, t = row[order], up[order], t[order]
    first = np.ones(row.size, bool)
    first[1:] = row[1:] != row[:-1]
    state_before = np.where(first, day.up_at_start[row], np.roll(up, 1))
    t_before = np.where(first, 0.0, np.roll(t, 1))
    total = np.bincount(row, weights=np.where(state_before, t - t_before, 0.0), minlength=n)
    # From the last crossing (or 0h) to the end of the day.
    last_state, last_t = day.up_at_start.copy(), np.zeros(n)
    if row.size:
        last = np.ones(row.size, bool)
        last[:-1] = row[1:] != row[:-1]
        last_state[row[last]], last_t[row[last]] = up[last], t[last]
    total = total + np.where(last_state, 1.0 - last_t, 0.0)
    return total * 24.0


def transit_cells(date, latitude, longitude, utc_offset=0.0):
    """Local time of the Sun's upper transit (local apparent noon)."""
    check_site(latitude, longitude)
    starts = local_day_start(date, utc_offset)
    n = starts.size
    lon = row_values(longitude, n)

    sun = SunOverDays(starts, date.dut1)

    def f(jd1, jd2, row):
        ra, _, gast = sun.at(jd1, jd2, row)
        return wrap180(np.degrees(gast) + lon[row] - ra)

    # The transit from the hour angle at noon-ish by Newton and secant steps; searched
    # by samples and brackets where it falls near either end of the local day.
    ha, _ = _hour_angle_and_dec(sun, starts, lon)
    guess = 0.5 - ha / SOLAR_DAY_DEG
    rows = np.flatnonzero((guess > EDGE_DAYS) & (guess < 1.0 - EDGE_DAYS))
    x, good = _guess_root(f, starts, guess[rows], np.full(rows.size, SOLAR_DAY_DEG), n, rows)
    jd1, jd2, found = np.full(n, np.nan), np.full(n, np.nan), np.zeros(n, dtype=bool)
    quick = rows[good]
    jd1[quick], jd2[quick], found[quick] = starts[quick], x[good], True
    rest = np.flatnonzero(~found)
    if rest.size:
        roots = crossings(lambda j1, j2, r: f(j1, j2, rest[r]), starts[rest],
                          starts[rest] + 1.0, 1.0 / 24.0, direction=+1, jump=180.0)
        jd1[rest], jd2[rest], found[rest] = roots.first(rest.size)
    words = np.where(found, None, "no transit on this local date").astype(object)
    return local_times(jd1, jd2, found, starts, date, utc_offset, words)


# ---- the Sun and other directions ------------------------------------------------------


def _target_and_sun(ra, dec, time, system):
    """Target (catalogue, ICRS) and the astrometric Sun, both in ``system``."""
    frames.check_latitudes(dec, "declination")
    m = time.matrix(system)  # one rotation for both
    sun = sun_gcrs(*time.tt(), "ASTROMETRIC")[0]
    return vectors.apply(m, frames.unit_vectors(ra, dec)), vectors.apply(m, sun)


def elongation_cells(ra, dec, time):
    """Angular distance of a catalogue direction from the Sun, degrees."""
    target, sun = _target_and_sun(ra, dec, time, "ICRS")
    return np.degrees(vectors.angle_between(target, sun))


def relative_lon_cells(ra, dec, time):
    """Ecliptic longitude of a target minus the Sun's, in (-180, 180], mean of date."""
    target, sun = _target_and_sun(ra, dec, time, "ECLIPTIC DATE")
    d = frames.spherical(target)[0] - frames.spherical(sun)[0]
    r = wrap180(d)
    return np.where(r == -180.0, 180.0, r)


def relative_lat_cells(ra, dec, time):
    """Ecliptic latitude of the target, mean ecliptic of date (the Sun's is ~0)."""
    target, _ = _target_and_sun(ra, dec, time, "ECLIPTIC DATE")
    return frames.spherical(target)[1]
