"""Heliocentric and barycentric times of an observation of a target.

  BJD_TDB = JD(TDB) + r_observer . n / c   (r from the solar system's barycentre)
  HJD     = JD      + r_observer . n / c   (r from the Sun's centre), on UTC or TT as named

n is the unit vector to the target (ICRS, a catalogue place); r_observer is the Earth's
centre from the ephemeris source (ERFA epv00 built in, a few km or 10 us over 1900-2100;
or a JPL kernel), plus the site's offset from the geocentre when a site is given (up to
21 ms).  Only the geometric (Roemer) delay is applied, to first order: the Shapiro delay
(under 0.1 ms away from the Sun) is left out, and stated.  The site's term is the same
in HJD and BJD, so converting one into the other needs no site.
"""

import erfa
import numpy as np

from . import ephemeris, frames, vectors
from .errors import rows_failing
from .timescales import DateTimes, Instants, erfa_quietly
from .vocabulary import AU_M, BUILTIN, LIGHT_DAYS_PER_AU, MJD_ZERO


def _site_gcrs(instants, site):
    """The sites' offsets from the geocentre, au on the GCRS axes (zero where not given).

    WGS84 geodetic to terrestrial (ERFA gd2gc), turned by GAST and the IAU 2000B
    precession-nutation (ERFA gst00b, pnm00b); polar motion (10 m, 30 ns) left out."""
    latitude, longitude, height, given = site
    frames.check_latitudes(latitude, "latitude")
    tt1, tt2 = instants.tt()
    ut = instants.to("UT")
    lat, lon, h = np.broadcast_arrays(np.radians(latitude), np.radians(longitude),
                                      np.asarray(height, float))
    itrs = erfa_quietly(erfa.gd2gc, 1, lon, lat, h) / AU_M
    gst = erfa_quietly(erfa.gst00b, ut.jd1, ut.jd2)
    c, s = np.cos(gst), np.sin(gst)
    # Terrestrial to the true equator and equinox of date: a turn of -GAST about z.
    true_eq = np.stack([c * itrs[..., 0] - s * itrs[..., 1],
                        s * itrs[..., 0] + c * itrs[..., 1], itrs[..., 2]], axis=-1)
    npb = erfa_quietly(erfa.pnm00b, tt1, tt2)
    gcrs = vectors.apply_transposed(npb, true_eq)  # NPB^T: back to the GCRS axes
    return gcrs * np.asarray(given, float)[..., None]


def _observer(instants, centre, source, site):
    """Position (au, ICRS axes) of the observer from the barycentre or the Sun (the
    source checks its own range of dates)."""
    tt1, tt2 = instants.tt()
    earth_and_sun = ephemeris.get(source).earth_and_sun
    (ep, _), (sp, _) = earth_and_sun(*ephemeris.times_for(source, tt1, tt2))
    r = ep if centre == "BARYCENTRE" else ep - sp
    if site is not None:
        r = r + _site_gcrs(instants, site)
    return r


def _delay_days(instants, ra, dec, centre, source=BUILTIN, site=None):
    """Light-time delay in days from the observer to the plane through the centre
    (barycentre or Sun) perpendicular to the target direction."""
    frames.check_latitudes(dec, "declination")
    r = _observer(instants, centre, source, site)
    n = frames.unit_vectors(ra, dec)
    return vectors.dot(r, n) * LIGHT_DAYS_PER_AU


def _site(latitude, longitude, height, latitude_given, longitude_given):
    """(lat, lon, height, given) of the sites, or None when every row is the geocentre;
    a row with only one of latitude and longitude is refused."""
    if latitude_given is None:
        return None
    half = latitude_given != longitude_given
    if np.any(half):
        raise rows_failing(half, "give both the latitude and the longitude of the site, or "
                                 "neither (for the Earth's centre)")
    if not np.any(latitude_given):
        return None
    return latitude, longitude, height, latitude_given


def _as_form(jd1, jd2, form):
    # Subtract before adding: an MJD in one cell keeps about 1 us, a JD only 40 us.
    return (jd1 - MJD_ZERO) + jd2 if form == "MJD" else jd1 + jd2


def bjd_tdb_cells(time, ra, dec, form="JD", latitude=None, longitude=None, height=0.0,
                  latitude_given=None, longitude_given=None, source=BUILTIN):
    """BJD on TDB of an instant for a target."""
    site = _site(latitude, longitude, height, latitude_given, longitude_given)
    tdb = time.to("TDB")
    delay = _delay_days(time, ra, dec, "BARYCENTRE", source, site)
    return _as_form(tdb.jd1, tdb.jd2 + delay, form)


def _hjd(time, ra, dec, on, form, site, source):
    clock = time.to(on)
    return _as_form(clock.jd1, clock.jd2 + _delay_days(time, ra, dec, "SUN", source, site), form)


def hjd_utc_cells(time, ra, dec, form="JD", latitude=None, longitude=None, height=0.0,
                  latitude_given=None, longitude_given=None, source=BUILTIN):
    site = _site(latitude, longitude, height, latitude_given, longitude_given)
    return _hjd(time, ra, dec, "UTC", form, site, source)


def hjd_tt_cells(time, ra, dec, form="JD", latitude=None, longitude=None, height=0.0,
                 latitude_given=None, longitude_given=None, source=BUILTIN):
    site = _site(latitude, longitude, height, latitude_given, longitude_given)
    return _hjd(time, ra, dec, "TT", form, site, source)


def _split(value, form):
    value = np.asarray(value, dtype=float)
    bad = ~np.isfinite(value)
    if np.any(bad):
        raise rows_failing(bad, "the Julian Date must be a finite number")
    if form == "MJD":
        whole = np.floor(value)
        return whole + MJD_ZERO, value - whole
    whole = np.floor(value) + 0.5
    return whole, value - whole


def _geocentric_instant(value, ra, dec, scale, centre, form, source=BUILTIN, site=None):
    """The instant of observation whose corrected JD (on ``scale``) is ``value``.

    The delay changes by under 0.3 ms an hour, so a few rounds of fixed-point
    iteration settle it to far below a microsecond."""
    whole, frac = _split(value, form)
    guess = frac.copy()
    for _ in range(3):
        guess = frac - _delay_days(Instants(whole, guess, scale), ra, dec, centre, source, site)
    return Instants(whole, guess, scale)


def _invert(value, ra, dec, scale, centre, form, source, site):
    return DateTimes(_geocentric_instant(value, ra, dec, scale, centre, form, source,
                                         site).to("UTC"))


def bjd_tdb_datetime_cells(bjd, ra, dec, form="JD", latitude=None, longitude=None,
                           height=0.0, latitude_given=None, longitude_given=None,
                           source=BUILTIN):
    site = _site(latitude, longitude, height, latitude_given, longitude_given)
    return _invert(bjd, ra, dec, "TDB", "BARYCENTRE", form, source, site)


def hjd_utc_datetime_cells(hjd, ra, dec, form="JD", latitude=None, longitude=None,
                           height=0.0, latitude_given=None, longitude_given=None,
                           source=BUILTIN):
    site = _site(latitude, longitude, height, latitude_given, longitude_given)
    return _invert(hjd, ra, dec, "UTC", "SUN", form, source, site)


def hjd_to_bjd_cells(hjd, ra, dec, hjd_scale="UTC", form="JD", source=BUILTIN):
    """BJD_TDB of the observation whose HJD (on UTC or TT) is given."""
    inst = _geocentric_instant(hjd, ra, dec, hjd_scale, "SUN", form, source)
    tdb = inst.to("TDB")
    return _as_form(tdb.jd1, tdb.jd2 + _delay_days(inst, ra, dec, "BARYCENTRE", source), form)


def bjd_to_hjd_cells(bjd, ra, dec, hjd_scale="UTC", form="JD", source=BUILTIN):
    """HJD (on UTC or TT) of the observation whose BJD_TDB is given."""
    inst = _geocentric_instant(bjd, ra, dec, "TDB", "BARYCENTRE", form, source)
    clock = inst.to(hjd_scale)
    return _as_form(clock.jd1, clock.jd2 + _delay_days(inst, ra, dec, "SUN", source), form)
