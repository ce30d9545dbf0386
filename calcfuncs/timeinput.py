"""Reading the instants that sheets hold, and writing them back as cells hold them.

A time cell may hold a Calc date-time value (days since the document's null date),
ISO 8601 text, or text with an explicit ``JD`` or ``MJD`` prefix.  The time scale is
given separately.  Every reader works on a whole column and reports a message per
bad row instead of failing the column.
"""

import math
import re

import erfa
import numpy as np

from .calendars import (
    GREGORIAN,
    JULIAN,
    REFORM_JDN,
    calendar_date,
    calendar_text,
    jdn,
    parse_calendar_text,
)
from .errors import SkyError
from .timescales import (
    JD_LIMIT,
    LEAP_TABLE_START_JD,
    Instants,
    OneUTC,
    before_1960_message,
    erfa_quietly,
    leap_table,
    split_days,
    utc_day_lengths,
    utc_on_tt_floats,
)
from .vocabulary import J2000_JD, MJD_ZERO, UTC_START_JD

DEFAULT_NULL_DATE = (1899, 12, 30)

# Calc date-time values are read for years 1582 to 4999 (JD 3547272.5 is 5000-01-01).
# A larger number in a time cell is most often a JD typed as a number, which as a
# date-time would silently mean a date near year 8600.
SERIAL_LIMIT = 1.0e7
LAST_SERIAL_JD = 3547272.5

_ACCEPTED = (
    'give a date-time cell, ISO 8601 text (2024-03-20T03:06:00Z), "JD 2460389.5" / '
    '"MJD 60389.0", or an epoch such as J2000.0'
)

_DAY_NUMBER = re.compile(
    r"^(?P<kind>MJD|JD)\s*(?P<sign>[+-])?(?P<int>\d+)(?P<frac>\.\d*)?"
    r"(?P<exp>[eE][+-]?\d+)?$",
    re.IGNORECASE,
)
_EPOCH = re.compile(r"^(?P<kind>[JB])\s*(?P<year>[+-]?\d+(?:\.\d*)?)$", re.IGNORECASE)


def null_date_jd(null_date):
    """JD (at 0h) of a document's null date given as (year, month, day)."""
    y, m, d = (int(v) for v in null_date)
    jd0, jd1 = erfa.cal2jd(y, m, d)
    return float(jd0 + jd1)


def _text_day_number(text, match):
    """Two-part JD from 'JD ...' or 'MJD ...' text, splitting at the decimal point so
    that digits beyond a double's reach are kept."""
    sign = -1.0 if match.group("sign") == "-" else 1.0
    if match.group("exp"):
        value = sign * float(match.group("int") + (match.group("frac") or "") + match.group("exp"))
        whole, frac = float(np.floor(value)), value - float(np.floor(value))
    else:
        whole = sign * float(match.group("int"))
        frac = sign * float("0" + (match.group("frac") or ".0"))
    if not np.isfinite(whole) or abs(whole) > JD_LIMIT:
        raise SkyError(f'"{text}" is out of range; JD or MJD within +-{JD_LIMIT:.0e} days')
    if match.group("kind").upper() == "MJD":
        jd1, jd2 = split_days(MJD_ZERO + whole, frac)
    else:
        jd1, jd2 = split_days(whole, frac)
    return float(jd1), float(jd2)


_ZONE = re.compile(r"^(?P<body>.*?\d)\s*(?P<zone>Z|[+-]\d{2}:?\d{2})$", re.IGNORECASE)


def _split_zone(text, scale):
    """The text without a trailing zone designator, after checking it says UTC."""
    m = _ZONE.match(text)
    if not m or not re.search(r"\d{1,2}:\d{2}", m.group("body")) and m.group("zone").upper() != "Z":
        return text
    zone = m.group("zone")
    if zone.upper() != "Z" and zone.replace(":", "") not in ("+0000", "-0000"):
        raise SkyError(
            f'"{text}" has the zone offset {zone}; only UTC (Z or +00:00) is read, '
            "so convert local times first (or give the scale LMT with a longitude)"
        )
    if scale != "UTC":
        raise SkyError(f'"{text}" is marked as UTC (Z) but the scale argument is {scale}')
    return m.group("body")


def _text_calendar(text, scale):
    """Two-part JD on ``scale`` from calendar text, or None if it is not a date."""
    fields = parse_calendar_text(_split_zone(text, scale))
    if fields is None:
        return None
    y, mo, d, hh, mi, sec, calendar = fields
    day = jdn(y, mo, d, calendar) - 0.5  # the JD at 0h of that date
    if hh == 24:
        day, hh = day + 1.0, 0
    if scale == "UTC":
        if calendar != GREGORIAN or day < UTC_START_JD:
            raise SkyError(before_1960_message("UTC"))
        gy, gm, gd = calendar_date(int(day + 0.5), GREGORIAN)
        if sec >= 60.0 and not (hh == 23 and mi == 59 and _leap_second_day(gy, gm, gd)):
            # ERFA only warns here (it would roll into the next day), so we check.
            raise SkyError(
                f'"{text}" has second 60 where there is no leap second; leap seconds are '
                "the last second (23:59:60) of some June 30 and December 31 since 1972"
            )
        jd1, jd2 = erfa_quietly(erfa.dtf2d, "UTC", gy, gm, gd, int(hh), int(mi), sec)
        return float(jd1), float(jd2)
    if sec >= 60.0:
        raise SkyError(
            f'"{text}" has {sec:g} seconds; seconds run 0 to below 60 '
            "(60 only in a real UTC leap second)"
        )
    return float(day), (hh * 3600.0 + mi * 60.0 + sec) / 86400.0


def _leap_second_day(y, mo, d):
    """True when TAI - UTC grows by a whole second at the end of this UTC day."""
    jd = sum(erfa.cal2jd(y, mo, d))
    ny, nm, nd, _ = erfa.jd2cal(jd + 1.0, 0.0)
    before = erfa_quietly(erfa.dat, y, mo, d, 0.0)
    after = erfa_quietly(erfa.dat, int(ny), int(nm), int(nd), 0.0)
    return y >= 1972 and abs((after - before) - 1.0) < 1e-9


def _text_epoch(text, match, scale):
    """A Julian (J2000.0) or Besselian (B1950.0) epoch: by definition on TT."""
    year = float(match.group("year"))
    if abs(year) > 200000.0:
        raise SkyError(f'"{text}" is out of range; epochs within +-200000 years')
    if match.group("kind").upper() == "J":
        jd1, jd2 = erfa.epj2jd(year)
    else:
        jd1, jd2 = erfa.epb2jd(year)
    if scale == "TT":
        return float(jd1), float(jd2)
    from .errors import RowErrors

    try:
        other = Instants(np.array([jd1]), np.array([jd2]), "TT").to(scale)
    except RowErrors:
        raise SkyError(f'"{text}" is an epoch on TT, before 1960 on the {scale} scale; '
                       "give scale TT") from None
    return float(other.jd1[0]), float(other.jd2[0])


def parse_time_text(text, scale):
    """Two-part JD on ``scale`` from ISO 8601 or JD/MJD text; ``SkyError`` otherwise."""
    stripped = text.strip()
    match = _DAY_NUMBER.match(stripped)
    if match:
        return _text_day_number(stripped, match)
    match = _EPOCH.match(stripped)
    if match:
        return _text_epoch(stripped, match, scale)
    found = _text_calendar(stripped, scale)
    if found is not None:
        return found
    if not stripped:
        raise SkyError("the time is empty; " + _ACCEPTED)
    try:
        float(stripped)
    except ValueError:
        raise SkyError(f'"{text}" is not a time; {_ACCEPTED}') from None
    raise SkyError(
        f'"{text}" is a number held as text, which could be a JD, an MJD or a date-time '
        'value; write "JD ..." or "MJD ...", or enter it as a number'
    )


_STEP_DAYS = None


def _utc_step_days():
    """JDs (at 0h) of the UTC days that end in a step of TAI - UTC (leap seconds, and
    the fractional steps of 1960-1971): the only days whose ERFA quasi-JD differs from
    the calendar reading of a date-time cell."""
    global _STEP_DAYS
    if _STEP_DAYS is None:
        _STEP_DAYS = np.sort(leap_table()[0][1:] - 1.0)
    return _STEP_DAYS


def _serial_pairs(serials, scale, null_jd):
    """Two-part JDs from Calc date-time values on ``scale``.

    A Calc day always has 86400 s.  On every scale but UTC, and on UTC days without a
    step, that is also how ERFA counts; on a UTC step day the value is read as date and
    clock time and handed to ERFA's dtf2d, which stretches that day's fraction.
    """
    whole = np.floor(serials)
    day_start = null_jd + whole
    fraction = serials - whole
    if scale != "UTC":
        return split_days(day_start, fraction)
    jd1, jd2 = day_start, fraction
    steps = _utc_step_days()
    at = np.minimum(np.searchsorted(steps, day_start), steps.size - 1)
    stepping = steps[at] == day_start
    if stepping.any():
        iy, im, iday, _ = erfa.jd2cal(day_start[stepping], 0.0)
        seconds = fraction[stepping] * 86400.0
        hours = np.floor(seconds / 3600.0)
        minutes = np.floor((seconds - hours * 3600.0) / 60.0)
        secs = seconds - hours * 3600.0 - minutes * 60.0
        a, b = erfa_quietly(erfa.dtf2d, "UTC", iy, im, iday, hours.astype(int), minutes.astype(int), secs)
        jd1 = jd1.copy()
        jd2 = jd2.copy()
        jd1[stepping], jd2[stepping] = a, b
    return jd1, jd2


_STEP_DAY_SET = None


def read_utc_serial(v, null_jd):
    """One UTC date-time value (a float) as one-row two-part JDs, as ``read_times``
    reads it, or None where that reading has more to do (a message to give, a UTC step
    day, a date before 1960): the quick path of a single cell."""
    found = _utc_serial_floats(v, null_jd)
    if found is None:
        return None
    return np.array([found[0]]), np.array([found[1]])


def one_utc_serial(v, null_jd, dut1=0.0):
    """One UTC date-time value as a timescales.OneUTC: its TT as two floats, as
    ``read_utc_serial`` and then Instants.tt give it, to the bit
    (timescales.utc_on_tt_floats), and its UT1 when asked, without the arrays: a cell's
    float lane (cells.py).  None where either has more to do (the usual path then)."""
    found = _utc_serial_floats(v, null_jd)
    if found is None:
        return None
    tt = utc_on_tt_floats(*found)
    return None if tt is None else OneUTC(tt, found[0], found[1], dut1)


def _utc_serial_floats(v, null_jd):
    global _STEP_DAY_SET
    if _serial_problem(v, null_jd) is not None:
        return None
    whole = float(math.floor(v))
    day_start = null_jd + whole
    if _STEP_DAY_SET is None:
        _STEP_DAY_SET = frozenset(_utc_step_days().tolist())
    fraction = v - whole
    if day_start in _STEP_DAY_SET or day_start + fraction < UTC_START_JD:
        return None
    return day_start, fraction


def _serial_problem(v, null_jd):
    """Why a date-time value cannot be read, or None."""
    if not math.isfinite(v) or abs(v) > SERIAL_LIMIT:
        return (
            f"the date-time value {v!r} is out of range; a date-time cell counts days "
            "from the document's null date"
        )
    jd = null_jd + v
    if jd >= LAST_SERIAL_JD:
        return (
            f"the date-time value {v!r} is after year 4999; if it is a Julian Date, write "
            '"JD ..." as text or use SKY.JD.DATETIME'
        )
    return None


def read_times(values, scale, null_jd, dut1=0.0, kinds=None):
    """Read a column of time cells.

    Returns ``(jd1, jd2, messages)``: two-part JDs on ``scale`` (rows with a message
    hold J2000.0 as a placeholder) and an object array of messages, ``None`` where the
    row was read, or ``None`` itself when every row was read (the usual column: no
    array of Nones made and walked).  ``kinds``: the values' types, when the caller
    knows them.
    """
    if not (isinstance(values, np.ndarray) and values.dtype.kind == "f"):
        values = np.asarray(values, dtype=object)  # a column of floats stays as it is
    values = values.ravel()
    n = values.size

    if n > 1 and (values.dtype.kind == "f" or (kinds or set(map(type, values))) == {float}):
        # The usual column of date-time cells: checked and converted in one go (the
        # type walk in C).
        serials = values.astype(float, copy=False)
        with np.errstate(invalid="ignore"):
            fine = np.isfinite(serials) & (np.abs(serials) <= SERIAL_LIMIT)
            jd = null_jd + serials
            fine &= jd < LAST_SERIAL_JD
        if fine.all():
            jd1, jd2 = _serial_pairs(serials, scale, null_jd)
            return _check_scale_start(jd1, jd2, None, scale)
    jd1 = np.full(n, J2000_JD)
    jd2 = np.zeros(n)
    messages = np.full(n, None, dtype=object)
    serial_rows, serials = [], []
    for i, v in enumerate(values):
        if isinstance(v, (np.floating, np.integer)) and not isinstance(v, np.bool_):
            v = float(v)  # numpy numbers from Python callers (Calc sends floats)
        kind = type(v)
        if kind is float or kind is int:
            problem = _serial_problem(float(v), null_jd)
            if problem is None:
                serial_rows.append(i)
                serials.append(float(v))
            else:
                messages[i] = problem
        elif v is None:
            messages[i] = "the time is missing; " + _ACCEPTED
        elif isinstance(v, str):
            try:
                jd1[i], jd2[i] = parse_time_text(v, scale)
            except SkyError as err:
                messages[i] = str(err)
        else:
            messages[i] = f"{v!r} is not a time; {_ACCEPTED}"
    if serial_rows:
        a, b = _serial_pairs(np.array(serials), scale, null_jd)
        jd1[serial_rows] = a
        jd2[serial_rows] = b

    return _check_scale_start(jd1, jd2, messages, scale)


def _check_scale_start(jd1, jd2, messages, scale):
    """The scale's own limits (UTC and UT1 from 1960), row by row.  ``messages`` None:
    no row had one, and none is made unless a row is early."""
    if scale in ("UTC", "UT1"):
        early = (jd1 + jd2) < UTC_START_JD
        if messages is None and early.any():
            messages = np.full(jd1.size, None, dtype=object)
        for i in np.flatnonzero(early):
            if messages[i] is None:
                messages[i] = before_1960_message(scale)
    return jd1, jd2, messages


def instants(values, scale, null_jd=2415018.5, dut1=0.0):
    """Instants from time cells, raising ``SkyError`` on the first bad one (Python API)."""
    jd1, jd2, messages = read_times(values, scale, null_jd, dut1)
    for m in () if messages is None else messages:
        if m is not None:
            raise SkyError(m)
    return Instants(jd1, jd2, scale, dut1)


# ---- writing instants back ---------------------------------------------------------


def _utc_clock(jd1, jd2):
    """Day start (JD at 0h), seconds into the day and the day's length in SI seconds,
    for ERFA UTC quasi-JDs.

    The inverse of ERFA dtf2d: a UTC day that ends in a step of TAI - UTC is longer or
    shorter by the step (a whole leap second since 1972, a fraction of one before),
    and its quasi-JD fraction spreads over that length.  ERFA d2dtf rescales only for
    whole seconds, so the 1960s days are handled here.
    """
    iy, im, iday, fd, status = erfa.ufunc.jd2cal(jd1, jd2)
    if status.any():  # ERFA's own message for a date it cannot take
        iy, im, iday, fd = erfa.jd2cal(jd1, jd2)
    day0, day1, _ = erfa.ufunc.cal2jd(iy, im, iday)  # a date jd2cal made: status 0
    start = day0 + day1
    if (start >= LEAP_TABLE_START_JD).all():
        length = utc_day_lengths(start)  # the same, from the table at once
        return start, fd * length, length
    ny, nm, nd, _ = erfa.jd2cal(start, 1.0)
    dat0 = erfa_quietly(erfa.dat, iy, im, iday, 0.0)
    dat12 = erfa_quietly(erfa.dat, iy, im, iday, 0.5)
    dat24 = erfa_quietly(erfa.dat, ny, nm, nd, 0.0)
    length = 86400.0 + (dat24 - (2.0 * dat12 - dat0))
    return start, fd * length, length


def to_serial(inst, null_jd):
    """Calc date-time values (days since the null date) for instants on their scale.

    A UTC instant inside a leap second has no date-time value (a Calc day has 86400 s),
    so those rows are returned as NaN with a mask.
    """
    if inst.scale != "UTC":
        return (inst.jd1 - null_jd) + inst.jd2, np.zeros(inst.jd1.shape, dtype=bool)
    start, seconds, _ = _utc_clock(inst.jd1, inst.jd2)
    in_leap = seconds >= 86400.0
    serial = (start - null_jd) + seconds / 86400.0
    return np.where(in_leap, np.nan, serial), in_leap


def _clock_text(seconds, length, decimals):
    """hh:mm:ss[.fff] for seconds into a day of ``length`` seconds, rounded once; the
    last minute of a stretched day runs past 60 s.  Returns (text, carried into the
    next day)."""
    scale = 10**decimals
    q = int(round(seconds * scale))
    last_minute = 86340 * scale
    if q >= int(round(length * scale)):
        return "00:00:" + "00" + ("." + "0" * decimals if decimals else ""), True
    if q >= last_minute:
        hh, mm, rest = 23, 59, q - last_minute
    else:
        minutes_total, rest = divmod(q, 60 * scale)
        hh, mm = divmod(minutes_total, 60)
    whole, frac = divmod(rest, scale)
    text = f"{hh:02d}:{mm:02d}:{whole:02d}"
    if decimals:
        text += f".{frac:0{decimals}d}"
    return text, False


def days_and_seconds(inst):
    """Per instant: JD at 0h of its day, seconds into the day, and the day's length
    (86400 s but on a UTC day that ends in a step)."""
    if inst.scale == "UTC":
        return _utc_clock(inst.jd1, inst.jd2)
    start = np.floor(inst.jd1 + inst.jd2 - 0.5) + 0.5
    seconds = ((inst.jd1 - start) + inst.jd2) * 86400.0
    return start, seconds, np.full(start.shape, 86400.0)


def iso_text(inst, decimals=3):
    """ISO 8601 text of instants on their own scale (23:59:60 in a UTC leap second).

    ISO 8601 dates are Gregorian with astronomical year numbering; before the reform
    the text says " Gregorian" so that it reads back as the same day here.
    """
    start, seconds, length = days_and_seconds(inst)
    out = []
    for day, sec, day_len in zip(np.ravel(start), np.ravel(seconds), np.ravel(length)):
        clock, next_day = _clock_text(float(sec), float(day_len), decimals)
        number = int(day + 0.5) + (1 if next_day else 0)
        y, mo, d = calendar_date(number, GREGORIAN)
        year = f"{y:04d}" if y >= 0 else f"-{-y:04d}"
        marker = " Gregorian" if number < REFORM_JDN else ""
        out.append(f"{year}-{mo:02d}-{d:02d}T{clock}{marker}")
    return np.array(out, dtype=object)


def date_text(inst, calendar="AUTO", numbering="HISTORICAL", decimals=0):
    """Calendar text of instants on their own scale, in the Julian or Gregorian calendar
    (AUTO: Julian before 1582-10-15) and historical (44 BC) or astronomical (-0043)
    year numbering; a calendar other than AUTO's choice is named in the text."""
    start, seconds, length = days_and_seconds(inst)
    out = []
    for day, sec in zip(np.ravel(start), np.ravel(seconds)):
        number = int(day + 0.5)
        if calendar == "AUTO":
            used = GREGORIAN if number >= REFORM_JDN else JULIAN
        else:
            used = calendar
        auto_choice = GREGORIAN if number >= REFORM_JDN else JULIAN
        out.append(calendar_text(number, float(sec), used, numbering, decimals,
                                 marker=used != auto_choice))
    return np.array(out, dtype=object)
