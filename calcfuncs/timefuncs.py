"""Cell functions of the time family, over whole columns of instants."""

import numpy as np

from . import deltat, timeinput
from .errors import SkyError, rows_failing
from .timeinput import date_text, days_and_seconds
from .timescales import (
    JD_LIMIT,
    DateTimes,
    Instants,
    erfa_quietly,
    julian_year,
    seconds_between,
    split_days,
    universal_of,
)
from .vocabulary import MJD_ZERO


def _on(time, result_scale):
    return time.to(result_scale or time.scale)


def julian_date(time, result_scale=None):
    """JD on ``result_scale`` (default: the input's scale), as one double."""
    out = _on(time, result_scale)
    return out.jd1 + out.jd2


def modified_julian_date(time, result_scale=None):
    """MJD = JD - 2400000.5 on ``result_scale``, subtracting before adding the parts."""
    out = _on(time, result_scale)
    return (out.jd1 - MJD_ZERO) + out.jd2


def _parts_on_floats(time, result_scale):
    """The two parts of a single cell's UTC instant (a timescales.OneUTC, cells.py's float
    lane) on UTC or TT, the floats the Instants path holds; None on another scale."""
    if result_scale is None or result_scale == "UTC":
        return time.day, time.fraction
    if result_scale == "TT":
        return time.tt
    return None


def _julian_date_on_floats(time, result_scale=None):
    parts = _parts_on_floats(time, result_scale)
    return None if parts is None else parts[0] + parts[1]


def _modified_julian_date_on_floats(time, result_scale=None):
    parts = _parts_on_floats(time, result_scale)
    return None if parts is None else (parts[0] - MJD_ZERO) + parts[1]


julian_date.on_floats = _julian_date_on_floats
modified_julian_date.on_floats = _modified_julian_date_on_floats


def calc_datetime(time, result_scale=None):
    """The instant on ``result_scale``, shown as a date-time value (the cell layer
    refuses an instant inside a leap second, which a date-time cell cannot show)."""
    return DateTimes(_on(time, result_scale))


def _instants_from_day_numbers(days, zero, scale, dut1):
    days = np.asarray(days, dtype=float)
    bad = ~np.isfinite(days) | (np.abs(np.nan_to_num(days)) > JD_LIMIT)
    if np.any(bad):
        raise rows_failing(bad, f"the day number is out of range (within +-{JD_LIMIT:.0e})")
    whole = np.floor(days)
    jd1, jd2 = split_days(zero + whole, days - whole)
    return Instants(jd1, jd2, scale, dut1)


def calc_datetime_from_jd(jd, scale="UTC", result_scale=None, dut1=0.0):
    """Date-time value from a JD number on ``scale``."""
    time = _instants_from_day_numbers(jd, 0.0, scale, dut1)
    return calc_datetime(time, result_scale)


def calc_datetime_from_mjd(mjd, scale="UTC", result_scale=None, dut1=0.0):
    """Date-time value from an MJD number on ``scale``."""
    time = _instants_from_day_numbers(mjd, MJD_ZERO, scale, dut1)
    return calc_datetime(time, result_scale)


def iso_text(time, result_scale=None, decimals=3):
    """ISO 8601 text of the instant on ``result_scale``."""
    if not 0 <= decimals <= 9:
        raise SkyError(f"decimals must be 0 to 9, not {decimals}")
    return timeinput.iso_text(_on(time, result_scale), decimals)


def delta_t(time, model="AUTO"):
    """Delta T = TT - UT in seconds, measured (32.184 s + (TAI - UTC) - DUT1) or modelled."""
    tt = time.to("TT")
    if model == "AUTO":
        # The time's own scale may carry a Delta T (UT ESPENAK2006, UT 10850, LMT ...).
        return seconds_between(tt, time.to(universal_of(time.scale)))
    if model == "MEASURED":
        return seconds_between(tt, time.to("UT1"))
    # The model's Delta T at the UT date that this model itself gives.
    return seconds_between(tt, time.to("UT " + model))


def delta_t_uncertainty(time):
    """Published standard error of Delta T at the instant's date, in seconds."""
    ut = time.to("UT")
    return deltat.uncertainty(julian_year(ut.jd1, ut.jd2))


def tai_minus_utc(time):
    """TAI - UTC in seconds at the instant (from 1960), from ERFA dat at the UTC date
    and clock time (a difference of quasi-JDs would count a stretched day's fraction)."""
    import erfa

    from .calendars import GREGORIAN, calendar_date

    start, seconds, _ = days_and_seconds(time.to("UTC"))
    out = []
    for day, sec in zip(np.ravel(start), np.ravel(seconds)):
        y, m, d = calendar_date(int(day + 0.5), GREGORIAN)
        out.append(erfa_quietly(erfa.dat, y, m, d, min(sec, 86399.999999) / 86400.0))
    return np.array(out, dtype=float)


def leap_table_valid_until():
    """The last day ERFA vouches for its leap-second table, as a date-time value."""
    import warnings

    import erfa

    year = 2000
    with warnings.catch_warnings():
        warnings.simplefilter("error", erfa.ErfaWarning)
        while year < 2200:
            try:
                erfa.dat(year + 1, 1, 1, 0.0)
            except erfa.ErfaWarning:
                break
            year += 1
    day1, day2 = erfa.cal2jd(year, 12, 31)
    return DateTimes(Instants(np.array([day1]), np.array([day2]), "UTC"))


def calendar_date_text(time, result_scale=None, calendar="AUTO", numbering="HISTORICAL",
                       decimals=0):
    """Calendar text of the instant on ``result_scale``."""
    if not 0 <= decimals <= 9:
        raise SkyError(f"decimals must be 0 to 9, not {decimals}")
    return date_text(_on(time, result_scale), calendar, numbering, decimals)
