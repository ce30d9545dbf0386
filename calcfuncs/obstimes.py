"""Heliocentric and barycentric times of an observation of a target.

  BJD_TDB = JD(TDB) + r_geocentre . n / c   (barycentre; the Earth from ERFA epv00)
  HJD     = JD      + r_geocentre . n / c   (the Sun's centre), on UTC or TT as named

n is the unit vector to the target (ICRS, a catalogue place).  Only the geometric
(Roemer) delay is applied, to first order: the Shapiro delay (under 0.1 ms away from
the Sun) and the observer's offset from the geocentre (up to 21 ms) are left out and
stated; the Earth's position from epv00 is good to a few km (10 us) over 1900-2100.
"""

import erfa
import numpy as np

from . import frames
from .errors import rows_failing
from .sun import _check_years
from .timescales import Instants, _quiet

LIGHT_DAYS_PER_AU = erfa.AULT / erfa.DAYSEC


def _delay_days(tt1, tt2, ra, dec, centre):
    """Light-time delay in days from the geocentre to the plane through the centre
    (barycentre or Sun) perpendicular to the target direction."""
    frames.check_latitudes(dec, "declination")
    _check_years(tt1, tt2)
    pvh, pvb = _quiet(erfa.epv00, tt1, tt2)
    r = pvb["p"] if centre == "BARYCENTRE" else pvh["p"]
    n = frames.unit_vectors(ra, dec)
    return np.sum(r * n, axis=-1) * LIGHT_DAYS_PER_AU


MJD_ZERO = 2400000.5


def _as_form(jd1, jd2, form):
    # Subtract before adding: an MJD in one cell keeps about 1 us, a JD only 40 us.
    return (jd1 - MJD_ZERO) + jd2 if form == "MJD" else jd1 + jd2


def bjd_tdb_cells(time, ra, dec, form="JD"):
    """BJD on TDB of an instant for a target."""
    tdb = time.to("TDB")
    tt1, tt2 = time.tt()
    return _as_form(tdb.jd1, tdb.jd2 + _delay_days(tt1, tt2, ra, dec, "BARYCENTRE"), form)


def _hjd(time, ra, dec, on, form):
    clock = time.to(on)
    tt1, tt2 = time.tt()
    return _as_form(clock.jd1, clock.jd2 + _delay_days(tt1, tt2, ra, dec, "SUN"), form)


def hjd_utc_cells(time, ra, dec, form="JD"):
    return _hjd(time, ra, dec, "UTC", form)


def hjd_tt_cells(time, ra, dec, form="JD"):
    return _hjd(time, ra, dec, "TT", form)


def _invert(value, ra, dec, scale, centre, null_jd, form="JD"):
    """The geocentric instant (a Calc date-time on UTC) whose corrected JD is ``value``.

    The delay changes by under 0.3 ms an hour, so two rounds of fixed-point iteration
    settle it to far below a microsecond."""
    from .timeinput import to_serial

    value = np.asarray(value, dtype=float)
    bad = ~np.isfinite(value)
    if np.any(bad):
        raise rows_failing(bad, "the Julian Date must be a finite number")
    if form == "MJD":
        whole = np.floor(value)
        frac = value - whole
        whole = whole + MJD_ZERO
    else:
        whole = np.floor(value) + 0.5
        frac = value - whole
    guess = frac.copy()
    for _ in range(3):
        inst = Instants(whole, guess, scale)
        tt1, tt2 = inst.tt()
        guess = frac - _delay_days(tt1, tt2, ra, dec, centre)
    utc = Instants(whole, guess, scale).to("UTC")
    serial, _ = to_serial(utc, null_jd)
    return serial


def bjd_tdb_datetime_cells(bjd, ra, dec, null_jd, form="JD"):
    return _invert(bjd, ra, dec, "TDB", "BARYCENTRE", null_jd, form)


def hjd_utc_datetime_cells(hjd, ra, dec, null_jd, form="JD"):
    return _invert(hjd, ra, dec, "UTC", "SUN", null_jd, form)


