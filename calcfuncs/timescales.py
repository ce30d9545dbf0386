"""Instants as two-part Julian Dates, and conversion between time scales with ERFA.

An instant travels as two doubles, ``jd1 + jd2``, as in SOFA/ERFA: ``jd1`` holds whole
days (plus 0.5) and ``jd2`` the fraction, so a microsecond survives arithmetic on 2.4
million days.  For UTC the pair is ERFA's quasi-JD, whose fraction is stretched on a
leap-second day, so 23:59:60 has a place.

Scales and their links (each link one ERFA routine):

    UT1 --(DUT1)-- UTC --(leap seconds)-- TAI --(32.184 s)-- TT --(dtdb)-- TDB
"""

import bisect
import warnings
from functools import lru_cache

import erfa
import numpy as np

from .bounded import keep
from .errors import SkyError, rows_failing
from .vocabulary import (DELTA_T_MODELS, ERFA_SCALES, J2000_JD, JULIAN_YEAR_DAYS,
                         SCALE_WORDS, UTC_START_JD, years_text)

# Gregorian calendar reform: 1582 October 15 (Gregorian) is JD 2299160.5.
GREGORIAN_START_JD = 2299160.5
# JD text on TT/TDB/TAI is taken at any date, but not at absurd ones: about +-2.7
# million years, far beyond every model the functions offer.
JD_LIMIT = 1.0e9
DUT1_LIMIT = 1.0


def check_scale(scale):
    """The scale in its canonical spelling, or a ``SkyError`` naming the accepted ones.

    Besides the five of ERFA: "UT" for universal time at any date, reached through
    Delta T (the default model, a named one, or a value in seconds), and "LMT <east
    longitude>" for local mean time, which is UT plus longitude / 15 hours.
    A word is read once and remembered: searches make many instants on one scale.
    """
    if type(scale) is not str:
        return _parse_scale(scale)
    return _canonical_scale(scale)


@lru_cache(maxsize=256)
def _canonical_scale(scale):
    return _parse_scale(scale)


def _parse_scale(scale):
    words = str(scale).replace(",", " ").split()
    name = words[0].upper() if words else ""
    if name in ERFA_SCALES and len(words) == 1:
        return name
    if name in ("UT", "LMT"):
        rest = words[1:]
        parts = [name]
        if name == "LMT":
            if not rest:
                raise SkyError(f'"{scale}": LMT needs the east longitude, e.g. LMT 12.4964')
            lon = _number(rest.pop(0), scale)
            if not -180.0 <= lon <= 360.0:
                raise SkyError(f'"{scale}": the longitude must be within -180 to 360 degrees')
            parts.append(repr(float(lon)))
        if rest:
            word = rest.pop(0).upper()
            if word in DELTA_T_MODELS:
                parts.append(word)
            else:
                value = _number(word, scale)
                if not abs(value) < 1e7:
                    raise SkyError(f'"{scale}": Delta T must be a number of seconds below 1e7')
                parts.append(repr(float(value)))
        if rest:
            raise SkyError(f'unknown time scale "{scale}"; use ' + SCALE_WORDS)
        return " ".join(parts)
    raise SkyError(f'unknown time scale "{scale}"; use ' + SCALE_WORDS)


def _number(word, scale):
    try:
        return float(word)
    except ValueError:
        raise SkyError(f'unknown time scale "{scale}"; use ' + SCALE_WORDS) from None


def _universal(scale):
    """(longitude in days, Delta T rule) of a UT or LMT scale: the rule is None for the
    default, a model name, or a number of seconds."""
    words = scale.split()
    lon_days = float(words.pop(1)) / 360.0 if words[0] == "LMT" else 0.0
    rule = None
    if len(words) > 1:
        rule = words[1] if words[1] in DELTA_T_MODELS else float(words[1])
    return lon_days, rule


def universal_of(scale):
    """The UT scale with the same Delta T rule as ``scale`` (plain UT for the others)."""
    if scale.startswith(("UT ", "LMT")):
        _, rule = _universal(scale)
        return "UT" if rule is None else f"UT {rule}" if isinstance(rule, str) else f"UT {rule!r}"
    return "UT"


def same_shape(jd1, jd2):
    """Two-part dates as float arrays of one shape, broadcast only where they differ (a
    single cell's dates are alike, and broadcasting them costs more than its checks)."""
    jd1, jd2 = np.asarray(jd1, float), np.asarray(jd2, float)
    return (jd1, jd2) if jd1.shape == jd2.shape else np.broadcast_arrays(jd1, jd2)


def julian_year(jd1, jd2):
    """The Julian epoch (2000.0 at J2000) of two-part JDs: the year count in which every
    model's validity is stated."""
    return 2000.0 + ((jd1 - J2000_JD) + jd2) / JULIAN_YEAR_DAYS


def all_within_years(jd1, jd2, span):
    """Whether every instant's Julian year lies within ``span`` (first, last).  One
    instant's year is worked out on Python floats (the same operations, so the same
    year to the bit), a third of the array arithmetic's cost for a single cell."""
    if jd1.size == 1 and jd2.size == 1:
        return within_years_one(float(jd1.flat[0]), float(jd2.flat[0]), span)
    years = julian_year(jd1, jd2)
    return bool(np.all((years >= span[0]) & (years <= span[1])))


def within_years_one(t1, t2, span):
    """``all_within_years`` of one instant (floats)."""
    year = 2000.0 + ((t1 - J2000_JD) + t2) / JULIAN_YEAR_DAYS
    return span[0] <= year <= span[1]


def check_years(jd1, jd2, span, what, hint=""):
    """Refuse the rows whose Julian year lies outside ``span`` (first, last), worded one
    way for every model and source: "<what>, valid 1000 to 3000[; <hint>]"."""
    jd1, jd2 = np.asarray(jd1, dtype=float), np.asarray(jd2, dtype=float)
    if jd1.size == 1 and all_within_years(jd1, jd2, span):  # a cell: told on floats
        return
    years = julian_year(jd1, jd2)
    outside = (years < span[0]) | (years > span[1])
    if outside.any():
        raise rows_failing(outside, f"{what}, valid {years_text(span)}"
                                    + (f"; {hint}" if hint else ""))


def _delta_t_days(jd1, jd2, rule):
    from . import deltat

    if isinstance(rule, float):
        return np.full(np.shape(jd1), rule / 86400.0)
    return deltat.model_delta_t(julian_year(jd1, jd2), rule or "SMH2016") / 86400.0


# The routines a cell calls on every time conversion, by their pyerfa wrapper: the ufunc
# itself, whose last output is ERFA's status.  The wrapper turns a status into a
# warning or an exception and a caught warning costs about 5 us, a third of a
# conversion; the status is read here instead.
_STATUS_UFUNCS = {erfa.utctai: erfa.ufunc.utctai, erfa.taiutc: erfa.ufunc.taiutc,
                  erfa.utcut1: erfa.ufunc.utcut1, erfa.ut1utc: erfa.ufunc.ut1utc}


def erfa_quietly(func, *args):
    """Call an ERFA routine, keeping its 'dubious year' warning out of the cell.

    ERFA warns for UTC dates a few years past its leap-second table's release; the
    functions' descriptions state the assumption of no leap second since 2016-12-31.
    An error status (negative) still raises ERFA's own exception, through the wrapper.
    """
    ufunc = _STATUS_UFUNCS.get(func)
    if ufunc is not None:
        *values, status = ufunc(*args)
        if not (np.asarray(status) < 0).any():
            return tuple(values)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", erfa.ErfaWarning)
        return func(*args)


# From 1972 TAI - UTC is a whole number of seconds that changes only at the end of a UTC
# day with a leap second.  ERFA's utctai reads its table three times a row (the day's
# start, noon, the next day) to find the day's length; on every other day since 1972 it
# comes to tai2 = utc2 + dat / 86400, and a column reads dat from the table in one lookup.
LEAP_TABLE_START_JD = 2441317.5  # 1972-01-01, from which every step is a whole second
_LEAP_TABLE = None


def leap_table():
    """ERFA's own leap-second table as (JDs at 0h from which each TAI - UTC holds, its
    TAI - UTC in s, 1960 onwards), read once: every reader agrees with ERFA."""
    global _LEAP_TABLE
    if _LEAP_TABLE is None:
        table = erfa.leap_seconds.get()
        starts = np.array([sum(erfa.cal2jd(int(y), int(m), 1))
                           for y, m in zip(table["year"], table["month"])])
        _LEAP_TABLE = (starts, np.asarray(table["tai_utc"], dtype=float))
    return _LEAP_TABLE


_WHOLE_SECOND_TABLE = []


def _whole_second_table():
    """leap_table() from 1972, and the JDs at 0h of the days that end in a leap second."""
    if not _WHOLE_SECOND_TABLE:
        starts, dat = leap_table()
        since = starts >= LEAP_TABLE_START_JD
        _WHOLE_SECOND_TABLE.append((starts[since], dat[since], starts[since][1:] - 1.0))
    return _WHOLE_SECOND_TABLE[0]


def utc_day_lengths(start):
    """SI seconds in UTC days since 1972 (``start``: their JDs at 0h, array): 86,400,
    plus the step of TAI - UTC for a day that ends in one; what ERFA's dat at the day's
    start, noon and next start gives (``timeinput``), read from its table in one lookup."""
    starts, dat, _ = _whole_second_table()
    if start.size == 1:  # one day (a cell): the same lookup on floats
        return np.full(start.shape, _one_utc_day_length(start.item()))
    k = np.minimum(np.searchsorted(starts, start, side="right"), starts.size - 1)
    step = np.where(starts[k] == start + 1.0, dat[k] - dat[k - 1], 0.0)
    return 86400.0 + step


def _one_utc_day_length(start):
    """``utc_day_lengths`` of one day since 1972 (its JD at 0h, a float), by the same
    lookup on floats (bisect for searchsorted): a single cell's, whatever asks for its
    clock (a date-time value, an ISO text)."""
    if not _WHOLE_SECOND_LISTS:
        _WHOLE_SECOND_LISTS.extend(table.tolist() for table in _whole_second_table()[:2])
    starts, dat = _WHOLE_SECOND_LISTS
    k = min(bisect.bisect_right(starts, start), len(starts) - 1)
    return 86400.0 + (dat[k] - dat[k - 1] if starts[k] == start + 1.0 else 0.0)


_WHOLE_SECOND_LISTS = []


def utc_to_tai(jd1, jd2):
    """ERFA utctai to the bit, its usual rows read in one lookup (above): those whose
    jd1 is the start of a UTC day since 1972 that ends without a leap second and whose
    jd2 is the fraction of that day (how a column of date-time cells arrives).  The
    other rows, and a few rows, go to ERFA itself."""
    jd1, jd2 = same_shape(jd1, jd2)
    if jd1.size < 16:
        return erfa_quietly(erfa.utctai, jd1, jd2)
    starts, dat, leap_days = _whole_second_table()
    usual = ((jd1 >= LEAP_TABLE_START_JD) & (jd1 - np.floor(jd1) == 0.5)
             & (jd2 >= 0.0) & (jd2 < 1.0))
    usual &= leap_days[np.minimum(np.searchsorted(leap_days, jd1), leap_days.size - 1)] != jd1
    tai2 = jd2 + dat[np.searchsorted(starts, jd1, side="right") - 1] / 86400.0
    if usual.all():
        return jd1.copy(), tai2
    tai1 = jd1.copy()
    rest = ~usual
    tai1[rest], tai2[rest] = erfa_quietly(erfa.utctai, jd1[rest], jd2[rest])
    return tai1, tai2


# A UTC instant of a cell on TT without ERFA's calls (two ufunc calls on one-element
# arrays cost more inside Calc than in a loop).  On a day that starts at 0h UTC after
# 1972, whose TAI - UTC holds from its start to the next day's (no leap second at its
# end), ERFA utctai adds to the day's fraction f the day's TAI - UTC over 86400 and taitt
# adds 32.184 s over 86400: TT = (day, (f + dat0 / 86400) + 32.184 / 86400), the same two
# roundings (bit for bit against ERFA over 60,000 random instants 1960-2100 and every
# UTC step day: tests/test_quick_paths.py).  Other days (before 1972, when UTC's second
# was scaled; a day ending in a leap second) take ERFA.
_TT_MINUS_TAI_DAYS = 32.184 / 86400.0
_STEADY_TABLE = []  # (starts, TAI - UTC over 86400, days ending in a leap second), floats


def _steady_day_offset(day):
    """TAI - UTC in days for a UTC day starting at ``day`` (a JD ending in .5) from 1972
    that keeps one TAI - UTC throughout (ERFA's table, ``_whole_second_table``, read in
    one lookup); None otherwise (then ERFA converts)."""
    if not _STEADY_TABLE:
        starts, dat, steps = _whole_second_table()
        _STEADY_TABLE.append((starts.tolist(), (dat / 86400.0).tolist(),
                              frozenset(steps.tolist())))
    starts, offsets, steps = _STEADY_TABLE[0]
    if not day >= starts[0] or day % 1.0 != 0.5 or day in steps:
        return None
    return offsets[bisect.bisect_right(starts, day) - 1]


class OneUTC:
    """A single cell's UTC instant on a day of one TAI - UTC from 1972, as floats: what
    cells.py's float lane hands a function's twin.  ``tt`` is its TT two-part JD
    (``utc_on_tt_floats``: what Instants.tt gives, to the bit); ``ut1()`` its UT1 as
    Instants.to("UT") gives it (ERFA utcut1 with the cell's DUT1, read within its limit
    by the cell layer)."""

    __slots__ = ("tt", "day", "fraction", "dut1")

    def __init__(self, tt, day, fraction, dut1):
        self.tt, self.day, self.fraction, self.dut1 = tt, day, fraction, dut1

    def ut1(self):
        ut11, ut12, _ = erfa.ufunc.utcut1(self.day, self.fraction, self.dut1)
        return float(ut11), float(ut12)


def utc_on_tt_floats(day, fraction):
    """A UTC instant (the day's start, a JD ending in .5, and the fraction of it in
    [0, 1)) on TT as two floats, on a day of one TAI - UTC from 1972
    (``_steady_day_offset``), as ERFA's utctai and taitt give it; None on other days."""
    offset = _steady_day_offset(day) if 0.0 <= fraction < 1.0 else None
    if offset is None:
        return None
    return day, (fraction + offset) + _TT_MINUS_TAI_DAYS


class Instants:
    """An array of instants on one time scale, held as two-part JDs.

    What is derived from them (the same instants on another scale, the matrices of a
    coordinate system at those instants) is kept once made: one cell's computation asks
    for TT and UT several times over."""

    __slots__ = ("jd1", "jd2", "scale", "dut1", "_derived")

    def __init__(self, jd1, jd2, scale, dut1=0.0):
        self.jd1 = np.asarray(jd1, dtype=float)
        self.jd2 = np.asarray(jd2, dtype=float)
        self.scale = check_scale(scale)
        self.dut1 = dut1
        self._derived = {}
        if abs(dut1) > DUT1_LIMIT:
            raise SkyError(f"DUT1 of {dut1} s is outside -1 to +1 s")
        if self.scale in ("UTC", "UT1"):
            early = (self.jd1 + self.jd2) < UTC_START_JD
            if early.any():
                raise rows_failing(early, before_1960_message(self.scale))

    def __len__(self):
        return self.jd1.size

    @property
    def jd(self):
        return self.jd1 + self.jd2

    def to(self, scale):
        """The same instants on another scale."""
        scale = check_scale(scale)
        if scale == self.scale:
            return self
        found = self._derived.get(scale)
        if found is None:
            if scale == "TT" and self.scale == "UTC" and self.jd1.size == 1:
                found = self._one_utc_to_tt()  # (None where the general path has more to say)
            if found is None:
                found = self._derived[scale] = self._convert(scale)
        return found

    def _convert(self, scale):
        # UTC <-> UT1 directly: a detour through TAI can land a hair before midnight
        # and pick up the previous day's TAI - UTC on a 1960s step day.
        # (UT with the default Delta T is UT1 from 1960, which is all of UTC's range.)
        if self.scale == "UTC" and scale in ("UT1", "UT"):
            return Instants(*erfa_quietly(erfa.utcut1, self.jd1, self.jd2, self.dut1), scale, self.dut1)
        if self.scale in ("UT1", "UT") and scale == "UTC":
            return Instants(*erfa_quietly(erfa.ut1utc, self.jd1, self.jd2, self.dut1), "UTC", self.dut1)
        if self.scale == "TT" and scale == "UTC" and self.jd1.size == 1:
            found = self._one_tt_to_utc()
            if found is not None:
                return found
        tai1, tai2 = self._to_tai()
        return Instants._from_tai(tai1, tai2, scale, self.dut1)

    def tt(self):
        """The instants as a TT two-part JD, the argument of the IAU models."""
        tt = self._derived.get("TT")
        if tt is None and self.scale == "UTC" and self.jd1.size == 1:
            tt = self._one_utc_to_tt()
        if tt is None:
            tt = self.to("TT")
        return tt.jd1, tt.jd2

    def _one_utc_to_tt(self):
        """A single cell's UTC instant on TT: the ERFA calls the general path makes for
        a few rows (utc_to_tai, _from_tai), without its dispatch (8 us of a cell -> 3),
        or on floats for a whole day of one TAI - UTC (``_utc_tt_on_floats``); None where
        ERFA says the date is not acceptable (the general path says why)."""
        found = utc_on_tt_floats(self.jd1.item(), self.jd2.item())
        if found is not None:
            tt = self._derived["TT"] = Instants.unchecked(
                self.jd1, np.array([found[1]]), "TT", self.dut1)
            return tt
        tai1, tai2, status = erfa.ufunc.utctai(self.jd1, self.jd2)
        if status.item() < 0:
            return None
        tt1, tt2, _ = erfa.ufunc.taitt(tai1, tai2)  # status always 0
        tt = self._derived["TT"] = Instants.unchecked(tt1, tt2, "TT", self.dut1)
        return tt

    def _one_tt_to_utc(self):
        """One TT instant on UTC (an event's answer shown in a cell): the ERFA calls of
        the general path (tttai, taiutc) without its dispatch; None where the general
        path has a message to give (before 1960, a date ERFA refuses)."""
        tai1, tai2, _ = erfa.ufunc.tttai(self.jd1, self.jd2)  # status always 0
        utc1, utc2, status = erfa.ufunc.taiutc(tai1, tai2)
        if (status.item() < 0 or (tai1 + tai2).item() < UTC_START_JD
                or (utc1 + utc2).item() < UTC_START_JD):
            return None
        return Instants.unchecked(utc1, utc2, "UTC", self.dut1)

    @staticmethod
    def unchecked(jd1, jd2, scale, dut1):
        """Instants made from float arrays an ERFA conversion gave, on a canonical scale
        within its limits: what __init__ would check is known to hold."""
        made = Instants.__new__(Instants)
        made.jd1, made.jd2, made.scale, made.dut1, made._derived = jd1, jd2, scale, dut1, {}
        return made

    def matrix(self, system):
        """Rotations from the ICRS axes to a coordinate system at these instants (TT),
        made once per system (frames.system_matrix)."""
        key = ("matrix", system)
        found = self._derived.get(key)
        if found is None:
            from .frames import system_matrix

            found = self._derived[key] = system_matrix(system, *self.tt())
        return found

    def _to_tai(self):
        s = self.scale
        if s.startswith(("UT ", "LMT")) or s == "UT":
            return self._universal_to_tai()
        if s == "TAI":
            return self.jd1, self.jd2
        if s == "TT":
            return erfa.ufunc.tttai(self.jd1, self.jd2)[:2]
        if s == "TDB":
            tt1, tt2 = tdb_to_tt(self.jd1, self.jd2)
            return erfa.ufunc.tttai(tt1, tt2)[:2]
        if s == "UTC":
            return utc_to_tai(self.jd1, self.jd2)
        # UT1
        utc1, utc2 = erfa_quietly(erfa.ut1utc, self.jd1, self.jd2, self.dut1)
        return erfa_quietly(erfa.utctai, utc1, utc2)

    def _universal_to_tai(self):
        """UT (or LMT) to TAI: through DUT1 and the leap seconds from 1960 when no
        Delta T model is named, else TT = UT + Delta T (Delta T at the UT date)."""
        lon_days, rule = _universal(self.scale)
        ut1, ut2 = self.jd1, self.jd2 - lon_days
        tai1, tai2 = np.array(ut1, dtype=float), np.array(ut2, dtype=float)
        measured = ((ut1 + ut2) >= UTC_START_JD) if rule is None else np.zeros(np.shape(ut1), bool)
        if np.any(measured):
            ut1m, ut2m = np.broadcast_arrays(ut1, ut2)
            utc = erfa_quietly(erfa.ut1utc, ut1m[measured], ut2m[measured], self.dut1)
            a, b = erfa_quietly(erfa.utctai, *utc)
            tai1[measured], tai2[measured] = a, b
        modelled = ~measured
        if np.any(modelled):
            a, b = np.broadcast_arrays(ut1, ut2)
            dt = _delta_t_days(a[modelled], b[modelled], rule)
            tai1[modelled] = a[modelled]
            tai2[modelled] = b[modelled] + dt - 32.184 / 86400.0
        return tai1, tai2

    @staticmethod
    def _tai_to_universal(tai1, tai2, scale, dut1):
        lon_days, rule = _universal(scale)
        tt1, tt2 = erfa.taitt(tai1, tai2)
        tt1, tt2 = np.array(tt1, dtype=float), np.array(tt2, dtype=float)
        ut1, ut2 = tt1.copy(), tt2.copy()
        measured = ((tt1 + tt2) >= UTC_START_JD + 50.0 / 86400.0) if rule is None else np.zeros(tt1.shape, bool)
        if np.any(measured):
            utc = erfa_quietly(erfa.taiutc, np.broadcast_to(tai1, tt1.shape)[measured],
                         np.broadcast_to(tai2, tt1.shape)[measured])
            a, b = erfa_quietly(erfa.utcut1, *utc, dut1)
            ut1[measured], ut2[measured] = a, b
        modelled = ~measured
        if np.any(modelled):
            # Delta T is a function of UT: two rounds of UT = TT - Delta T(UT) settle it
            # (it changes by under a second a year).
            guess = tt2[modelled]
            for _ in range(3):
                guess = tt2[modelled] - _delta_t_days(tt1[modelled], guess, rule)
            ut2[modelled] = guess
        return Instants(ut1, ut2 + lon_days, scale, dut1)

    @staticmethod
    def _from_tai(tai1, tai2, scale, dut1):
        if scale.startswith(("UT ", "LMT")) or scale == "UT":
            return Instants._tai_to_universal(tai1, tai2, scale, dut1)
        if scale == "TAI":
            return Instants(tai1, tai2, "TAI", dut1)
        if scale in ("TT", "TDB"):
            tt1, tt2, _ = erfa.ufunc.taitt(tai1, tai2)  # status always 0
            if scale == "TT":
                return Instants(tt1, tt2, "TT", dut1)
            return Instants(*tt_to_tdb(tt1, tt2), "TDB", dut1)
        early = (tai1 + tai2) < UTC_START_JD
        if early.any():
            raise rows_failing(early, before_1960_message(scale))
        utc1, utc2 = erfa_quietly(erfa.taiutc, tai1, tai2)
        if scale == "UTC":
            return Instants(utc1, utc2, "UTC", dut1)
        return Instants(*erfa_quietly(erfa.utcut1, utc1, utc2, dut1), "UT1", dut1)


# TDB - TT is periodic and under 2 ms, but ERFA dtdb's series (Fairhead and Bretagnon
# 1990) has Poisson terms (powers of time times sines) that grow without bound far from
# J2000 (9.7 s at JD 1e8).  It is used over 1000-3000, a span of our choosing where
# those terms stay far below a microsecond; outside it the weaker two-term expression
# 0.001657 sin g + 0.000014 sin 2g (g the Sun's mean anomaly; the Astronomical
# Almanac's approximation, tens of microseconds near the present) keeps TDB - TT bounded.
TDB_SERIES_JD = (2086302.5, 2816787.5)  # 1000-01-01 and 3000-01-01


def _tdb_minus_tt(jd1, jd2):
    """TDB - TT in seconds at the geocentre."""
    jd1 = np.asarray(jd1, dtype=float)
    jd2 = np.asarray(jd2, dtype=float)
    if jd1.shape == (1,) and jd2.shape == (1,):  # a cell: the same steps on floats
        jd = jd1.item() + jd2.item()
        if TDB_SERIES_JD[0] <= jd <= TDB_SERIES_JD[1]:
            return erfa.ufunc.dtdb(jd1, jd2, np.array([(jd + 0.5) % 1.0]), 0.0, 0.0, 0.0)
    jd = jd1 + jd2
    inside = (jd >= TDB_SERIES_JD[0]) & (jd <= TDB_SERIES_JD[1])
    out = np.empty(np.broadcast(jd1, jd2).shape)
    if np.any(inside):
        # At the geocentre (u = v = 0) dtdb's UT argument multiplies zero, so the day
        # fraction of the date itself serves.
        a, b = np.broadcast_arrays(jd1, jd2)
        out[inside] = erfa.dtdb(a[inside], b[inside], np.mod(jd[inside] + 0.5, 1.0), 0.0, 0.0, 0.0)
    if not np.all(inside):
        g = np.radians(357.53 + 0.98560028 * (jd[~inside] - J2000_JD))
        out[~inside] = 0.001657 * np.sin(g) + 0.000014 * np.sin(2.0 * g)
    return out


def tt_to_tdb(tt1, tt2):
    return erfa.tttdb(tt1, tt2, _tdb_minus_tt(tt1, tt2))


def tdb_to_tt(tdb1, tdb2):
    # TDB - TT varies by under 2 ms, so evaluating it at the TDB date is exact enough
    # (the error is the derivative, 1e-8, times 2 ms: far below a nanosecond).
    return erfa.tdbtt(tdb1, tdb2, _tdb_minus_tt(tdb1, tdb2))


def before_1960_message(scale):
    return (f"{scale} is defined from 1960 on; for earlier times use the scale UT "
            "(universal time through Delta T) or TT")


def split_days(whole, fraction=0.0):
    """Two parts from a day count and its fraction, renormalised so jd2 is in [-0.5, 0.5)."""
    whole = np.asarray(whole, dtype=float)
    fraction = np.asarray(fraction, dtype=float)
    base = np.floor(whole) + 0.5
    rest = (whole - base) + fraction
    shift = np.floor(rest + 0.5)
    return base + shift, rest - shift


def seconds_between(later, earlier):
    """``later - earlier`` in seconds, keeping the two parts apart for precision."""
    return ((later.jd1 - earlier.jd1) + (later.jd2 - earlier.jd2)) * 86400.0


class DateTimes:
    """Instants that a cell shows as date-time values: the result of every function whose
    registry result kind is "datetime".

    The core says which instants, on which scale (``instants``), plus an offset in days
    for a local clock (a UTC offset, a longitude's hours, the equation of time), and
    per-row ``words`` where there is no instant to show (a polar night, a day without a
    transit); those rows' instants are placeholders.  Only the cell layer turns them into
    days since the document's null date (cells.py), so the core never meets the sheet's
    conventions."""

    __slots__ = ("instants", "offset_days", "words")

    def __init__(self, instants, offset_days=0.0, words=None):
        self.instants = instants
        self.offset_days = offset_days
        self.words = words

    @staticmethod
    def of_tt(tt1, tt2, scale, offset_days=0.0, words=None):
        """From two-part TT JDs (an event search's answers), shown on ``scale``.  One
        instant's conversion is kept (``_ONE_SHOWN``): the cells of a column filled down
        a month share the next full Moon, and each would convert it again."""
        if np.size(tt1) == 1 and np.size(tt2) == 1:
            key = (float(np.ravel(tt1)[0]), float(np.ravel(tt2)[0]), np.shape(tt1),
                   np.shape(tt2), scale)
            shown = _ONE_SHOWN.get(key)
            if shown is None:
                shown = Instants(tt1, tt2, "TT").to(scale)
                keep(_ONE_SHOWN, key, shown, ONE_SHOWN_KEPT)
            return DateTimes(shown, offset_days, words)
        return DateTimes(Instants(tt1, tt2, "TT").to(scale), offset_days, words)


# One TT instant shown on a scale (two-part JDs, their shapes, the scale) -> its Instants,
# shared by every DateTimes made of it: an Instants keeps what is derived from it, and
# the same instants always derive the same.
_ONE_SHOWN = {}
ONE_SHOWN_KEPT = 4096
