"""Instants as two-part Julian Dates, and conversion between time scales with ERFA.

An instant travels as two doubles, ``jd1 + jd2``, as in SOFA/ERFA: ``jd1`` holds whole
days (plus 0.5) and ``jd2`` the fraction, so a microsecond survives arithmetic on 2.4
million days.  For UTC the pair is ERFA's quasi-JD, whose fraction is stretched on a
leap-second day, so 23:59:60 has a place.

Scales and their links (each link one ERFA routine):

    UT1 --(DUT1)-- UTC --(leap seconds)-- TAI --(32.184 s)-- TT --(dtdb)-- TDB
"""

import warnings

import erfa
import numpy as np

from .errors import SkyError, rows_failing

SCALES = ("UTC", "TAI", "TT", "TDB", "UT1")

# UTC as ERFA's table defines it starts on 1960 January 1; UT1 is reached through it.
UTC_START_JD = 2436934.5
# Gregorian calendar reform: 1582 October 15 (Gregorian) is JD 2299160.5.
GREGORIAN_START_JD = 2299160.5
# JD text on TT/TDB/TAI is taken at any date, but not at absurd ones: about +-2.7
# million years, far beyond every model the functions offer.
JD_LIMIT = 1.0e9
MJD_ZERO = 2400000.5
DUT1_LIMIT = 1.0


def check_scale(scale):
    """The scale name, upper-cased, or a ``SkyError`` naming the accepted ones."""
    name = str(scale).strip().upper()
    if name not in SCALES:
        raise SkyError(f'unknown time scale "{scale}"; use ' + ", ".join(SCALES))
    return name


def _quiet(func, *args):
    """Call an ERFA routine, keeping its 'dubious year' warning out of the cell.

    ERFA warns for UTC dates a few years past its leap-second table's release; the
    functions' descriptions state the assumption of no leap second since 2016-12-31.
    """
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", erfa.ErfaWarning)
        return func(*args)


class Instants:
    """An array of instants on one time scale, held as two-part JDs."""

    __slots__ = ("jd1", "jd2", "scale", "dut1")

    def __init__(self, jd1, jd2, scale, dut1=0.0):
        self.jd1 = np.asarray(jd1, dtype=float)
        self.jd2 = np.asarray(jd2, dtype=float)
        self.scale = check_scale(scale)
        self.dut1 = dut1
        if abs(dut1) > DUT1_LIMIT:
            raise SkyError(f"DUT1 of {dut1} s is outside -1 to +1 s")
        if self.scale in ("UTC", "UT1"):
            early = (self.jd1 + self.jd2) < UTC_START_JD
            if np.any(early):
                raise rows_failing(
                    early,
                    f"{self.scale} before 1960 is not yet supported; give the time as "
                    "TT (JD or MJD text with scale TT)",
                )

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
        # UTC <-> UT1 directly: a detour through TAI can land a hair before midnight
        # and pick up the previous day's TAI - UTC on a 1960s step day.
        if (self.scale, scale) == ("UTC", "UT1"):
            return Instants(*_quiet(erfa.utcut1, self.jd1, self.jd2, self.dut1), "UT1", self.dut1)
        if (self.scale, scale) == ("UT1", "UTC"):
            return Instants(*_quiet(erfa.ut1utc, self.jd1, self.jd2, self.dut1), "UTC", self.dut1)
        tai1, tai2 = self._to_tai()
        return Instants._from_tai(tai1, tai2, scale, self.dut1)

    def tt(self):
        """The instants as a TT two-part JD, the argument of the IAU models."""
        tt = self.to("TT")
        return tt.jd1, tt.jd2

    def _to_tai(self):
        s = self.scale
        if s == "TAI":
            return self.jd1, self.jd2
        if s == "TT":
            return erfa.tttai(self.jd1, self.jd2)
        if s == "TDB":
            tt1, tt2 = _tdb_to_tt(self.jd1, self.jd2)
            return erfa.tttai(tt1, tt2)
        if s == "UTC":
            return _quiet(erfa.utctai, self.jd1, self.jd2)
        # UT1
        utc1, utc2 = _quiet(erfa.ut1utc, self.jd1, self.jd2, self.dut1)
        return _quiet(erfa.utctai, utc1, utc2)

    @staticmethod
    def _from_tai(tai1, tai2, scale, dut1):
        if scale == "TAI":
            return Instants(tai1, tai2, "TAI", dut1)
        if scale in ("TT", "TDB"):
            tt1, tt2 = erfa.taitt(tai1, tai2)
            if scale == "TT":
                return Instants(tt1, tt2, "TT", dut1)
            return Instants(*_tt_to_tdb(tt1, tt2), "TDB", dut1)
        early = (tai1 + tai2) < UTC_START_JD
        if np.any(early):
            raise rows_failing(
                early, f"{scale} is defined here from 1960 on; this instant is earlier"
            )
        utc1, utc2 = _quiet(erfa.taiutc, tai1, tai2)
        if scale == "UTC":
            return Instants(utc1, utc2, "UTC", dut1)
        return Instants(*_quiet(erfa.utcut1, utc1, utc2, dut1), "UT1", dut1)


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
    jd = jd1 + jd2
    inside = (jd >= TDB_SERIES_JD[0]) & (jd <= TDB_SERIES_JD[1])
    out = np.empty(np.broadcast(jd1, jd2).shape)
    if np.any(inside):
        # At the geocentre (u = v = 0) dtdb's UT argument multiplies zero, so the day
        # fraction of the date itself serves.
        a, b = np.broadcast_arrays(jd1, jd2)
        out[inside] = erfa.dtdb(a[inside], b[inside], np.mod(jd[inside] + 0.5, 1.0), 0.0, 0.0, 0.0)
    if not np.all(inside):
        g = np.radians(357.53 + 0.98560028 * (jd[~inside] - 2451545.0))
        out[~inside] = 0.001657 * np.sin(g) + 0.000014 * np.sin(2.0 * g)
    return out


def _tt_to_tdb(tt1, tt2):
    return erfa.tttdb(tt1, tt2, _tdb_minus_tt(tt1, tt2))


def _tdb_to_tt(tdb1, tdb2):
    # TDB - TT varies by under 2 ms, so evaluating it at the TDB date is exact enough
    # (the error is the derivative, 1e-8, times 2 ms: far below a nanosecond).
    return erfa.tdbtt(tdb1, tdb2, _tdb_minus_tt(tdb1, tdb2))


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
