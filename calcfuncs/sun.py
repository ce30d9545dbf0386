"""The Sun as seen from the Earth's centre, and the events of the solar year.

Caution: never look at the Sun, or point binoculars, a telescope or a camera at it,
without a proper solar filter made for that purpose.

Position: the Earth's heliocentric and barycentric position and velocity from ERFA
epv00 (Bretagnon and Francou's VSOP2000-based series, 1900-2100 good to a few km,
usable 1000-3000 here); the Sun's barycentric place follows.
  GEOMETRIC   the Sun's direction at the same instant, no light time, no aberration
  ASTROMETRIC light time (about 499 s) applied: where the light left the Sun
  APPARENT    light time and annual aberration (ERFA ab): the direction observed
Then a rotation into the chosen system (frames.py): J2000, DATE (mean ecliptic and
equinox of date) or TRUE (true equinox, nutation in longitude included).
"""

import erfa
import numpy as np

from . import ephemeris, frames
from .errors import SkyError, rows_failing
from .events import crossings, wrap180
from .timescales import Instants

KINDS = ("APPARENT", "ASTROMETRIC", "GEOMETRIC")
SUN_YEARS = (1000.0, 3000.0)


def _check_years(tt1, tt2):
    years = 2000.0 + ((tt1 - 2451545.0) + tt2) / 365.25
    outside = (years < SUN_YEARS[0]) | (years > SUN_YEARS[1])
    if np.any(outside):
        raise rows_failing(outside, "the Sun's position is computed for 1000 to 3000 "
                                    "(ERFA epv00 and the IAU 2006/2000A frames)")


def sun_gcrs(tt1, tt2, kind="APPARENT", source="BUILTIN"):
    """(unit vectors, distance in au) of the geocentric Sun on the GCRS axes, from the
    one pipeline of bodies.py."""
    from .bodies import place

    tt1, tt2 = np.broadcast_arrays(np.asarray(tt1, float), np.asarray(tt2, float))
    if source == "BUILTIN":
        _check_years(tt1, tt2)
    p = place("SUN", *ephemeris.times_for(source, tt1, tt2), kind, source)
    return p.direction, p.distance


def sun_in(tt1, tt2, system, kind="APPARENT", source="BUILTIN"):
    """Unit vectors of the Sun in a coordinate system of frames.py."""
    u, _ = sun_gcrs(tt1, tt2, kind, source)
    m = frames.system_matrix(system, tt1, tt2)
    return np.einsum("...ij,...j->...i", m, u)


_FRAME_TO_ECLIPTIC = {"J2000": "ECLIPTIC J2000", "DATE": "ECLIPTIC DATE", "TRUE": "ECLIPTIC TRUE"}
_FRAME_TO_EQUATORIAL = {"J2000": "EQUATORIAL J2000", "DATE": "EQUATORIAL DATE",
                        "TRUE": "EQUATORIAL TRUE", "ICRS": "ICRS"}


def sun_longitude(tt1, tt2, frame="TRUE", kind="APPARENT"):
    lon, _ = frames.spherical(sun_in(tt1, tt2, _FRAME_TO_ECLIPTIC[frame], kind))
    return lon


# ---- cell functions: position ---------------------------------------------------------


def place_cells(place_in):
    """The cell functions (lon, lat, ra, dec) of a body whose unit vectors in a system of
    frames.py are ``place_in(tt1, tt2, system, kind, source)``: ecliptic J2000, DATE or
    TRUE, equatorial the same or ICRS."""
    def component(systems, index):
        def cells(time, frame="TRUE", kind="APPARENT", source="BUILTIN"):
            return frames.spherical(place_in(*time.tt(), systems[frame], kind, source))[index]
        return cells

    return (component(_FRAME_TO_ECLIPTIC, 0), component(_FRAME_TO_ECLIPTIC, 1),
            component(_FRAME_TO_EQUATORIAL, 0), component(_FRAME_TO_EQUATORIAL, 1))


lon_cells, lat_cells, ra_cells, dec_cells = place_cells(sun_in)


def distance_cells(time, source="BUILTIN"):
    return sun_gcrs(*time.tt(), "GEOMETRIC", source)[1]


def solar_longitude_cells(time):
    """The meteor-work solar longitude: apparent, on the ecliptic and equinox J2000.0."""
    return sun_longitude(*time.tt(), "J2000", "APPARENT")


def equation_of_time_minutes(time):
    """Apparent minus mean solar time, in minutes (positive: a sundial is fast)."""
    tt1, tt2 = time.tt()
    ut = time.to("UT")
    ra = frames.spherical(sun_in(tt1, tt2, "EQUATORIAL TRUE"))[0]
    gast = np.degrees(erfa.gst06a(ut.jd1, ut.jd2, tt1, tt2))
    # Greenwich hour angle of the Sun minus that of the mean Sun (UT - 12 h).
    ut_fraction = np.mod((ut.jd1 - 0.5) + ut.jd2, 1.0)
    return wrap180(gast - ra - (ut_fraction * 360.0 - 180.0)) * 4.0


def equation_of_time_cells(time):
    return equation_of_time_minutes(time)


def sundial_time_cells(time, longitude, null_jd):
    """Local apparent (sundial) time as a Calc date-time: UT + longitude/15 h + EoT."""
    ut = time.to("UT")
    eot_days = equation_of_time_minutes(time) / 1440.0
    return (ut.jd1 - null_jd) + ut.jd2 + np.asarray(longitude) / 360.0 + eot_days


# ---- the solar year ---------------------------------------------------------------------


def _rows(n, compute):
    """Results of ``compute(k)`` for rows 0..n-1; rows whose computation raises a
    SkyError get its message, as a row-aligned RowErrors once all rows are done."""
    from .errors import RowErrors

    results = [None] * n
    messages = np.full(n, None, dtype=object)
    for k in range(n):
        try:
            results[k] = compute(k)
        except SkyError as err:
            messages[k] = str(err)
    if any(m is not None for m in messages):
        raise RowErrors(messages)
    return results

SEASONS = {"MARCH": 0.0, "JUNE": 90.0, "SEPTEMBER": 180.0, "DECEMBER": 270.0}


def longitude_crossing(target_deg, start_tt, end_tt, frame="TRUE"):
    """TT instants in [start, end] when the Sun's apparent longitude reaches the target."""
    def f(jd1, jd2):
        return wrap180(sun_longitude(jd1, jd2, frame) - target_deg)

    # The Sun moves about 1 degree a day: 1-day samples never skip a crossing.
    return crossings(f, start_tt, end_tt, 1.0, direction=+1, jump=90.0)


def _year_start_tt(year):
    from .calendars import GREGORIAN, jdn

    return jdn(int(year), 1, 1, GREGORIAN) - 0.5


def _check_year(year):
    y = np.asarray(year, dtype=float)
    bad = (y != np.round(y)) | (y < SUN_YEARS[0]) | (y > SUN_YEARS[1] - 1)
    if np.any(bad):
        raise rows_failing(bad, "the year must be a whole number from 1000 to 2999")
    return y.astype(int)


def _as_result(tt1, tt2, result_scale, null_jd):
    from .timeinput import to_serial

    inst = Instants(tt1, tt2, "TT").to(result_scale)
    serial, in_leap = to_serial(inst, null_jd)
    return serial


def season_instant(year, event, frame="TRUE"):
    """TT (jd1, jd2) of an equinox or solstice of a (Gregorian) year."""
    target = SEASONS[event]
    years = np.ravel(year)

    def one(k):
        y = years[k]
        start = _year_start_tt(y) - 2.0
        a, b = longitude_crossing(target, start, start + 370.0, frame)
        # The one in that calendar year (the March equinox of year y, and so on).
        keep = [(p, q) for p, q in zip(a, b) if _year_start_tt(y) <= p + q < _year_start_tt(y + 1)]
        if len(keep) != 1:
            raise SkyError(f"the {event.lower()} event of {y} was not found once")
        return keep[0]

    found = _rows(years.size, one)
    return np.array([f[0] for f in found]), np.array([f[1] for f in found])


def season_cells(year, null_jd, event="MARCH", result_scale="UTC"):
    t1, t2 = season_instant(_check_year(year), event)
    return _as_result(t1, t2, result_scale, null_jd)


def season_length_cells(year, event="MARCH"):
    """Days from this event to the next event of the year (the season it opens)."""
    order = list(SEASONS)
    years = _check_year(year)
    a1, a2 = season_instant(years, event)
    k = order.index(event)
    nxt = order[(k + 1) % 4]
    b1, b2 = season_instant(years + (1 if nxt == "MARCH" else 0), nxt)
    return (b1 - a1) + (b2 - a2)


def reaches_cells(longitude, time, null_jd, frame="J2000", result_scale=None):
    """The first instant after ``time`` when the Sun's longitude reaches a value."""
    tt1, tt2 = time.tt()
    lon, tt1, tt2 = np.broadcast_arrays(np.asarray(longitude, dtype=float) % 360.0, tt1, tt2)
    lon, tt1, tt2 = lon.ravel(), tt1.ravel(), tt2.ravel()

    last = _year_start_tt(3000) + 0.5  # the search stays inside the position's range

    def one(k):
        start = tt1[k] + tt2[k]
        found1, found2 = longitude_crossing(float(lon[k]), start, min(start + 367.0, last), frame)
        if not np.any((found1 + found2) > start):
            raise SkyError("the Sun does not reach that longitude before the year 3000")
        after = (found1 + found2) > start
        return found1[after][0], found2[after][0]

    found = _rows(lon.size, one)
    if result_scale is None:
        result_scale = time.scale
    return _as_result(np.array([f[0] for f in found]), np.array([f[1] for f in found]),
                      result_scale, null_jd)


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


def sun_altitude(tt1, tt2, latitude, longitude, scale="UTC", dut1=0.0):
    """Geocentric apparent altitude of the Sun's centre in degrees (refraction not
    applied; diurnal parallax, under 9", neglected)."""
    inst = Instants(tt1, tt2, "TT", dut1)
    ut = inst.to("UT")
    ra, dec = frames.spherical(sun_in(tt1, tt2, "EQUATORIAL TRUE"))
    gast = erfa.gst06a(ut.jd1, ut.jd2, tt1, tt2)
    ha = gast + np.radians(longitude) - np.radians(ra)
    _, el = erfa.hd2ae(ha, np.radians(dec), np.radians(latitude))
    return np.degrees(el)


def _local_day(time, utc_offset):
    """TT (start, end) of the local calendar day that contains the given date."""
    from .timeinput import days_and_seconds

    start, _, _ = days_and_seconds(time)  # 0h of the given date on its own scale
    day0 = Instants(start - utc_offset / 24.0, np.zeros_like(start), time.scale, time.dut1)
    tt = day0.to("TT")
    return tt.jd1 + tt.jd2


def _events_of_day(time, latitude, longitude, utc_offset, event, height):
    """Per row: (rise TT JD or None, set TT JD or None, state at the day's start)."""
    starts = _local_day(time, utc_offset)
    lat = np.broadcast_to(np.asarray(latitude, float), starts.shape)
    lon = np.broadcast_to(np.asarray(longitude, float), starts.shape)
    h = np.broadcast_to(np.asarray(height, float), starts.shape)

    def one(k):
        t0, la, lo = starts[k], lat[k], lon[k]
        h0 = _threshold(event, h[k])

        def f(jd1, jd2):
            return sun_altitude(jd1, jd2, la, lo, time.scale, time.dut1) - h0

        # Hourly samples, and the vertices of their peaks and troughs: near the polar
        # night the Sun may clear the horizon for minutes around noon only.
        ups = crossings(f, t0, t0 + 1.0, 1.0 / 24.0, direction=+1, extrema=True)
        downs = crossings(f, t0, t0 + 1.0, 1.0 / 24.0, direction=-1, extrema=True)
        up_at_start = f(np.array([np.floor(t0) + 0.5]), np.array([t0 - np.floor(t0) - 0.5]))[0] > 0
        return ups[0] + ups[1], downs[0] + downs[1], up_at_start, t0

    return _rows(starts.size, one)


def _to_local(jds, time, utc_offset, null_jd):
    from .timeinput import to_serial

    jd = np.asarray(jds, dtype=float)
    inst = Instants(np.floor(jd) + 0.5, jd - (np.floor(jd) + 0.5), "TT").to(time.scale)
    serial, _ = to_serial(inst, null_jd)
    return serial + utc_offset / 24.0


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


def _rise_or_set(time, latitude, longitude, null_jd, utc_offset, event, height, rising):
    _check_site(latitude, longitude)
    rows = _events_of_day(time, latitude, longitude, utc_offset, event, height)
    out = np.empty(len(rows), dtype=object)
    for k, (ups, downs, up_at_start, _t0) in enumerate(rows):
        found, other = (ups, downs) if rising else (downs, ups)
        if found.size:
            out[k] = float(_to_local(found[:1], time, utc_offset, null_jd)[0])
        else:
            out[k] = _no_event_text(up_at_start, other.size > 0, event, rising)
    return out


def _check_site(latitude, longitude):
    frames.check_latitudes(latitude)
    lon = np.asarray(longitude, dtype=float)
    bad = np.abs(lon) > 360.0
    if np.any(bad):
        raise rows_failing(bad, "the longitude must be within -360 to 360 degrees")


def rise_cells(date, latitude, longitude, null_jd, utc_offset=0.0, event="SUNRISE", height=0.0):
    return _rise_or_set(date, latitude, longitude, null_jd, utc_offset, event, height, True)


def set_cells(date, latitude, longitude, null_jd, utc_offset=0.0, event="SUNRISE", height=0.0):
    return _rise_or_set(date, latitude, longitude, null_jd, utc_offset, event, height, False)


def daylength_cells(date, latitude, longitude, utc_offset=0.0, event="SUNRISE", height=0.0):
    """Hours of the local day with the Sun above the event's altitude (24 or 0 in
    polar day or night)."""
    _check_site(latitude, longitude)
    rows = _events_of_day(date, latitude, longitude, utc_offset, event, height)
    out = []
    for ups, downs, up, t0 in rows:
        marks = sorted([(t, +1) for t in ups] + [(t, -1) for t in downs])
        total, last, state = 0.0, t0, up
        for t, kind in marks:
            if state:
                total += t - last
            last, state = t, kind > 0
        if state:
            total += t0 + 1.0 - last
        out.append(total * 24.0)
    return np.array(out)


def transit_cells(date, latitude, longitude, null_jd, utc_offset=0.0):
    """Local time of the Sun's upper transit (local apparent noon)."""
    _check_site(latitude, longitude)
    starts = _local_day(date, utc_offset)
    lon = np.broadcast_to(np.asarray(longitude, float), starts.shape)

    def one(k):
        t0, lo = starts[k], lon[k]

        def f(jd1, jd2):
            ut = Instants(jd1, jd2, "TT", date.dut1).to("UT")
            ra, _ = frames.spherical(sun_in(jd1, jd2, "EQUATORIAL TRUE"))
            gast = np.degrees(erfa.gst06a(ut.jd1, ut.jd2, jd1, jd2))
            return wrap180(gast + lo - ra)

        a, b = crossings(f, t0, t0 + 1.0, 1.0 / 24.0, direction=+1, jump=180.0)
        if not a.size:
            return "no transit on this local date"
        return float(_to_local((a + b)[:1], date, utc_offset, null_jd)[0])

    return np.array(_rows(starts.size, one), dtype=object)


# ---- the Sun and other directions ------------------------------------------------------


def _target_and_sun(ra, dec, time, system):
    """Target (catalogue, ICRS) and the astrometric Sun, both in ``system``."""
    frames.check_latitudes(dec, "declination")
    tt1, tt2 = time.tt()
    m = frames.system_matrix(system, tt1, tt2)
    target = np.einsum("...ij,...j->...i", m, frames.unit_vectors(ra, dec))
    sun = sun_in(tt1, tt2, system, "ASTROMETRIC")
    return target, sun


def elongation_cells(ra, dec, time):
    """Angular distance of a catalogue direction from the Sun, degrees."""
    target, sun = _target_and_sun(ra, dec, time, "ICRS")
    return np.degrees(np.arctan2(np.linalg.norm(np.cross(target, sun), axis=-1),
                                 np.sum(target * sun, axis=-1)))


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
