"""Julian and Gregorian calendars at any date, BC years in both numberings, calendar text.

References, named on each table: the worked examples and test dates of Meeus,
Astronomical Algorithms (2nd ed., 1998), chapter 7 (values from memory); fixed points of
the calendar that every almanac repeats (common practice); numpy's datetime64, which
counts days in the proleptic Gregorian calendar with ISO 8601 astronomical years at any
date; astropy 8.0 Time (proleptic Gregorian through ERFA, JD -68569.5 onwards) and
ERFA cal2jd.  The Julian calendar is checked through its definition (a leap day every
fourth year, 1461 days in four years, JD 0 = -4712 January 1.5) and the century rule
that relates it to the Gregorian (common practice).
"""

import math
from fractions import Fraction

import erfa
import numpy as np
import pytest
from astropy.time import Time
from astropy.utils import iers
from hypothesis import given, settings
from hypothesis import strategies as st

from calcfuncs.calendars import GREGORIAN, JULIAN, calendar_date, jdn
from calcfuncs.cells import evaluate

iers.conf.auto_download = False

# A JD in one double: at 2.4 million days it resolves 4.7e-10 day (40 us).  The cell
# result of SKY.JD is one double, so a JD check allows a couple of its units.
JD_TOLERANCE = 1e-9
MONTHS = ("January", "February", "March", "April", "May", "June", "July", "August",
          "September", "October", "November", "December")
WEEKDAYS = ("Sunday", "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday")
YEARS = 20_000  # the property tests span +-20,000 years


def jd_of(text, scale="TT"):
    got = evaluate("SKY.JD", [text, scale])
    assert isinstance(got, float), f"{text!r}: {got}"
    return got


def weekday(jd_0h):
    # Meeus ch. 7: the day of the week is (JD + 1.5) mod 7, 0 = Sunday (JD at 0h).
    return WEEKDAYS[int(math.floor(jd_0h + 1.5)) % 7]


# ---- independent references --------------------------------------------------------

JDN_1970 = 2440588  # JD Number of 1970-01-01, numpy's day 0 (common practice)


def numpy_gregorian_jdn(year, month, day):
    """JDN of a proleptic Gregorian date from numpy's datetime64 day count."""
    month_start = np.datetime64("1970-01", "M") + ((year - 1970) * 12 + (month - 1))
    return int(month_start.astype("datetime64[D]").astype(np.int64)) + JDN_1970 + (day - 1)


def century_rule(year, month):
    """Days by which the Julian calendar lags the Gregorian for a date written the same
    in both: floor(Y/100) - floor(Y/400) - 2, with Y the year counted from March
    (common practice; holds for astronomical years of either sign)."""
    y = year - 1 if month <= 2 else year
    return y // 100 - y // 400 - 2


def reference_jdn(year, month, day, calendar):
    """JDN of (astronomical year, month, day): numpy for the Gregorian calendar, and the
    century rule on top of it for the Julian (day counted from the first of the month,
    so a Julian 29 February of a Gregorian common year is still a day number)."""
    first = numpy_gregorian_jdn(year, month, 1)
    if calendar == GREGORIAN:
        return first + day - 1
    return first + day - 1 + century_rule(year, month)


def is_leap(year, calendar):
    """Leap years (common practice): Julian every fourth; Gregorian also not the
    century years that 400 does not divide.  Astronomical years, floor modulo."""
    if calendar == JULIAN:
        return year % 4 == 0
    return year % 4 == 0 and (year % 100 != 0 or year % 400 == 0)


def month_length(year, month, calendar):
    if month == 2:
        return 29 if is_leap(year, calendar) else 28
    return 30 if month in (4, 6, 9, 11) else 31


# ---- fixed points and worked examples ------------------------------------------------

PUBLISHED = [
    # text (our input), JD, source
    ("-4712-01-01T12:00 Julian", 0.0, "JD 0: -4712 January 1.5, Julian calendar (definition)"),
    ("4713 BC January 1 12:00", 0.0, "the same epoch in historical numbering (4713 BC)"),
    ("AD 1 January 1", 1721423.5, "AD 1 January 1.0 (Julian), almanac tables, from memory"),
    ("1582 October 4", 2299159.5, "last Julian day of the reform, 0h, common practice"),
    ("1582 October 15", 2299160.5, "first Gregorian day of the reform, 0h, common practice"),
    ("2000-01-01T12:00", 2451545.0, "J2000.0 = 2000 January 1.5 (IAU definition)"),
    ("44 BC March 15 12:00", 1705426.0, "44 BC March 15 noon (Julian), from memory"),
    # Meeus, Astronomical Algorithms ch. 7, examples 7.a/7.b and the test dates after
    # them (values from memory); day fractions written as clock times here.
    ("1957 October 4 19:26:24", 2436116.31, "Meeus ex. 7.a, 1957 Oct 4.81"),
    ("333 January 27 12:00", 1842713.0, "Meeus ex. 7.b, 333 Jan 27.5"),
    ("1999 January 1", 2451179.5, "Meeus ch. 7 table"),
    ("1987 January 27", 2446822.5, "Meeus ch. 7 table"),
    ("1987 June 19 12:00", 2446966.0, "Meeus ch. 7 table"),
    ("1988 January 27", 2447187.5, "Meeus ch. 7 table"),
    ("1988 June 19 12:00", 2447332.0, "Meeus ch. 7 table"),
    ("1900 January 1", 2415020.5, "Meeus ch. 7 table"),
    ("1600 January 1", 2305447.5, "Meeus ch. 7 table"),
    ("1600 December 31", 2305812.5, "Meeus ch. 7 table"),
    ("837 April 10 07:12", 2026871.8, "Meeus ch. 7 table, 837 Apr 10.3"),
    ("-0123-12-31", 1676496.5, "Meeus ch. 7 table, -123 Dec 31.0"),
    ("-0122-01-01", 1676497.5, "Meeus ch. 7 table, -122 Jan 1.0"),
    ("-1000-07-12T12:00", 1356001.0, "Meeus ch. 7 table, -1000 Jul 12.5"),
    ("-1000-02-29", 1355866.5, "Meeus ch. 7 table, -1000 Feb 29.0 (Julian leap day)"),
    ("-1001-08-17T21:36", 1355671.4, "Meeus ch. 7 table, -1001 Aug 17.9"),
    ("-4712-01-01T12:00", 0.0, "Meeus ch. 7 table, -4712 Jan 1.5"),
]


@pytest.mark.parametrize("text, jd, source", PUBLISHED)
def test_published_julian_dates(text, jd, source):
    assert abs(jd_of(text) - jd) <= JD_TOLERANCE, source


BC_FORMS = [
    # One instant, 44 BC March 15 10:00 (astronomical year -43), in every accepted form.
    # Reference: 44 BC March 15 0h = JD 1705425.5 (from memory, as above) + 10 h.
    "44 BC March 15 10:00",
    "44 BCE March 15 10:00",
    "44 B.C. Mar 15 10:00",
    "March 15, 44 BC 10:00",
    "15 March 44 BC 10:00",
    "44-03-15 BC 10:00",
    "0044-03-15 BC 10:00",
    "-0043-03-15T10:00",
    "-0043-03-15 10:00:00",
    "44 BC March 15 10:00 Julian",
    "-0043-03-15T10:00 (Julian)",
]


@pytest.mark.parametrize("text", BC_FORMS)
def test_44_bc_in_both_numberings_and_every_form(text):
    assert abs(jd_of(text) - (1705425.5 + 10.0 / 24.0)) <= JD_TOLERANCE


AD_FORMS = [
    # AD 1066 October 14 (Julian): the era may be written before or after, or not at all.
    "AD 1066 October 14", "1066 October 14", "October 14, 1066", "October 14, AD 1066",
    "14 October 1066", "1066 AD October 14", "1066-10-14", "1066-10-14 CE", "1066-10-14 Julian",
]


@pytest.mark.parametrize("text", AD_FORMS)
def test_an_ad_date_in_every_form(text):
    assert abs(jd_of(text) - reference_jdn(1066, 10, 14, JULIAN) + 0.5) <= JD_TOLERANCE


def test_one_bc_is_followed_by_ad_one():
    # Historical numbering has no year 0: 1 BC December 31 is the day before AD 1
    # January 1 (common practice); astronomical year 0 is 1 BC.
    last = jd_of("1 BC December 31 23:59:59")
    first = jd_of("AD 1 January 1 00:00:00")
    assert abs((first - last) * 86400.0 - 1.0) < 1e-4  # 1 s; a JD double holds 20 us here
    assert jd_of("0000-12-31T23:59:59") == last


DATES_BACK = [
    # JD, text in historical numbering, astronomical numbering; Meeus ex. 7.c and the
    # examples above (from memory).  585 BC May 28 is the eclipse said to end the
    # battle of Thales.
    ("JD 2436116.31", "1957 October 4 19:26:24", "1957-10-04T19:26:24"),
    ("JD 1842713.0", "333 January 27 12:00:00", "0333-01-27T12:00:00"),
    ("JD 1507900.13", "585 BC May 28 15:07:12", "-0584-05-28T15:07:12"),
    ("JD 0.0", "4713 BC January 1 12:00:00", "-4712-01-01T12:00:00"),
    ("JD 1705426.0", "44 BC March 15 12:00:00", "-0043-03-15T12:00:00"),
    ("JD 2299159.5", "1582 October 4 00:00:00", "1582-10-04T00:00:00"),
    ("JD 2299160.5", "1582 October 15 00:00:00", "1582-10-15T00:00:00"),
]


@pytest.mark.parametrize("jd, historical, astronomical", DATES_BACK)
def test_calendar_text_of_published_julian_dates(jd, historical, astronomical):
    assert evaluate("SKY.TEXT.DATE", [jd, "TT"]) == historical
    assert evaluate("SKY.TEXT.DATE", [jd, "TT", None, None, "ASTRONOMICAL"]) == astronomical


WEEKDAY_CASES = [
    ("1954 June 30", "Wednesday", "Meeus ex. 7.e"),
    ("1582 October 4", "Thursday", "the last Julian day of the reform (common practice)"),
    ("1582 October 15", "Friday", "the first Gregorian day (common practice)"),
    ("1066 October 14", "Saturday", "the battle of Hastings, a Saturday (common knowledge)"),
    ("1752-09-02 cutover 1752-09-14", "Wednesday", "Britain's last Julian day (common knowledge)"),
    ("1752-09-14 cutover 1752-09-14", "Thursday", "Britain's first Gregorian day (common knowledge)"),
    ("2000-01-01", "Saturday", "common knowledge"),
]


@pytest.mark.parametrize("text, day, source", WEEKDAY_CASES)
def test_day_of_the_week(text, day, source):
    assert weekday(jd_of(text)) == day, source


def test_interval_between_two_returns_of_halley():
    # Meeus ex. 7.d: perihelia 1910 April 20 and 1986 February 9 are 27689 days apart.
    assert jd_of("1986 February 9") - jd_of("1910 April 20") == 27689.0


# ---- against astropy and ERFA (proleptic Gregorian, from -4799) ----------------------

ASTROPY_RNG = np.random.default_rng(44)
# JD Numbers from astropy's first representable day (-4712 Nov 24 Gregorian is JD 0;
# ERFA's jd2cal starts at JD -68569.5) to about AD 22,700; integer seconds of the day.
ASTROPY_DAYS = ASTROPY_RNG.integers(-68569 + 1, 10_000_000, 1500)
ASTROPY_SECONDS = ASTROPY_RNG.integers(0, 86400, 1500)


def _jd_text(day_number, second):
    """'JD ...' text of second ``second`` after 0h of JD Number ``day_number``, with 12
    exact decimals so that nothing rounds on the way in ("JD -12.25" is -12 - 0.25)."""
    value = Fraction(2 * day_number - 1, 2) + Fraction(second, 86400)
    whole = math.floor(abs(value))
    digits = round((abs(value) - whole) * 10**12)
    return f"JD {'-' if value < 0 else ''}{whole}.{digits:012d}"


def _fields(text):
    """(year, month, day, hour, minute, second) of our ASTRONOMICAL calendar text."""
    body = text.split()[0]
    date, clock = body.rsplit("T", 1)
    sign = -1 if date.startswith("-") else 1
    y, m, d = date.lstrip("-").split("-")
    hh, mm, ss = clock.split(":")
    return sign * int(y), int(m), int(d), int(hh), int(mm), int(ss)


def test_gregorian_text_matches_astropy_at_random_instants():
    # astropy 8.0 + astropy-iers-data: Time(jd1, jd2, format='jd', scale='tt').ymdhms,
    # proleptic Gregorian with astronomical years.
    texts = tuple((_jd_text(int(n), int(s)),) for n, s in zip(ASTROPY_DAYS, ASTROPY_SECONDS))
    ours = evaluate("SKY.TEXT.DATE", [texts, "TT", None, "GREGORIAN", "ASTRONOMICAL"])
    ref = Time(ASTROPY_DAYS - 0.5, ASTROPY_SECONDS / 86400.0, format="jd", scale="tt").ymdhms
    for k, (row,) in enumerate(ours):
        y, m, d, hh, mm, ss = _fields(row)
        assert (y, m, d) == (ref["year"][k], ref["month"][k], ref["day"][k]), (texts[k], row)
        astropy_seconds = ref["hour"][k] * 3600 + ref["minute"][k] * 60 + ref["second"][k]
        # 1 ms: astropy's seconds come back from a two-part JD through ERFA d2dtf.
        assert abs(hh * 3600 + mm * 60 + ss - astropy_seconds) < 1e-3, (texts[k], row)
        # Before the reform a Gregorian date is named as such, so it reads back the same.
        assert row.endswith(" Gregorian") == (ASTROPY_DAYS[k] < 2299161), row


def test_gregorian_text_reads_as_astropy_jd_at_random_instants():
    # The other way: astropy's calendar date of each day with our clock time, marked
    # Gregorian, must read as astropy's JD.
    when = Time(ASTROPY_DAYS - 0.5, ASTROPY_SECONDS / 86400.0, format="jd", scale="tt")
    dates = when.ymdhms
    texts = []
    for k, s in enumerate(ASTROPY_SECONDS):
        y = int(dates["year"][k])
        year = f"{y:04d}" if y >= 0 else f"-{-y:04d}"
        clock = f"{s // 3600:02d}:{s // 60 % 60:02d}:{s % 60:02d}"
        texts.append((f"{year}-{dates['month'][k]:02d}-{dates['day'][k]:02d}T{clock} Gregorian",))
    ours = evaluate("SKY.JD", [tuple(texts), "TT"])
    for k, (got,) in enumerate(ours):
        # Two units of the last place of the JD double (the cell returns one double).
        assert abs(got - when.jd[k]) <= 2 * math.ulp(max(abs(when.jd[k]), 1.0)), texts[k]


@settings(max_examples=300, deadline=None)
@given(st.integers(-4799, 20_000), st.integers(1, 12), st.integers(1, 31))
def test_gregorian_day_numbers_match_erfa_cal2jd(year, month, day):
    # ERFA cal2jd: proleptic Gregorian, valid from -4799 January 1.
    day = min(day, month_length(year, month, GREGORIAN))
    mjd0, mjd = erfa.cal2jd(year, month, day)
    assert jdn(year, month, day, GREGORIAN) - 0.5 == mjd0 + mjd


# ---- every day of +-20,000 years, exhaustively -----------------------------------------

def _successor_ok(y, m, d, y2, m2, d2, calendar):
    """True where (y2, m2, d2) is the calendar day after (y, m, d), by the month lengths
    of the calendar's leap-year rule (common practice)."""
    if calendar == JULIAN:
        leap = y % 4 == 0
    else:
        leap = (y % 4 == 0) & ((y % 100 != 0) | (y % 400 == 0))
    lengths = np.array([31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31])[m - 1] + ((m == 2) & leap)
    same_month = (y2 == y) & (m2 == m) & (d2 == d + 1) & (d < lengths)
    next_month = (d == lengths) & (d2 == 1) & (
        ((m < 12) & (y2 == y) & (m2 == m + 1)) | ((m == 12) & (y2 == y + 1) & (m2 == 1)))
    return same_month | next_month


FIRST_JDN = jdn(-YEARS, 1, 1, JULIAN) - 1
LAST_JDN = jdn(YEARS, 12, 31, GREGORIAN) + 1
CHUNK = 1_000_000


@pytest.mark.parametrize("calendar", [JULIAN, GREGORIAN])
def test_every_day_number_is_a_calendar_date_and_back(calendar):
    # Over +-20,000 years: calendar_date and jdn are inverse for every integer, each day
    # is followed by its calendar successor, and the Gregorian dates are numpy's.
    for start in range(FIRST_JDN, LAST_JDN, CHUNK):
        n = np.arange(start, min(start + CHUNK + 1, LAST_JDN + 1), dtype=np.int64)
        y, m, d = calendar_date(n, calendar)
        assert np.array_equal(jdn(y, m, d, calendar), n)
        assert _successor_ok(y[:-1], m[:-1], d[:-1], y[1:], m[1:], d[1:], calendar).all()
        if calendar == GREGORIAN:
            days = (n - JDN_1970).astype("datetime64[D]")
            np_year = days.astype("datetime64[Y]").astype(np.int64) + 1970
            np_month = days.astype("datetime64[M]").astype(np.int64) % 12 + 1
            np_day = (days - days.astype("datetime64[M]")).astype(np.int64) + 1
            assert np.array_equal(y, np_year) and np.array_equal(m, np_month)
            assert np.array_equal(d, np_day)


def test_julian_epoch_anchors_the_julian_count():
    # JD 0 is -4712 January 1.5 (Julian): with the successor check above this fixes
    # every Julian date in the span.
    assert calendar_date(0, JULIAN) == (-4712, 1, 1)
    assert calendar_date(0, GREGORIAN) == (-4713, 11, 24)  # the same day, proleptic Gregorian


@settings(max_examples=400, deadline=None)
@given(st.integers(-400_000_000, 400_000_000))
def test_day_numbers_far_out_keep_their_cycles(n):
    # Far beyond the exhaustive span (about +-1 million years): still inverse, and the
    # cycles hold: 1461 days in four Julian years, 146097 days in 400 Gregorian years
    # (common practice).
    for calendar, cycle_days, cycle_years in ((JULIAN, 1461, 4), (GREGORIAN, 146097, 400)):
        y, m, d = calendar_date(n, calendar)
        assert jdn(y, m, d, calendar) == n
        assert 1 <= m <= 12 and 1 <= d <= month_length(y, m, calendar)
        assert calendar_date(n + cycle_days, calendar) == (y + cycle_years, m, d)


# ---- the two calendars side by side --------------------------------------------------

def test_the_reform_pair_are_consecutive_days():
    # 1582 October 4 (Julian) was followed by October 15 (Gregorian) (common practice).
    assert jdn(1582, 10, 4, JULIAN) + 1 == jdn(1582, 10, 15, GREGORIAN)
    assert calendar_date(jdn(1582, 10, 4, JULIAN) + 1, GREGORIAN) == (1582, 10, 15)
    last = jd_of("1582 October 4 23:59:59")
    assert abs((jd_of("1582 October 15") - last) * 86400.0 - 1.0) < 1e-4  # 20 us JD double


def test_other_countries_reform_with_a_cutover_marker():
    # Britain: Wednesday 1752 September 2 was followed by Thursday September 14
    # (Calendar Act 1750, common knowledge).
    last = jd_of("1752-09-02 cutover 1752-09-14")
    first = jd_of("1752 September 14 cutover 1752-09-14")
    assert first - last == 1.0
    assert last == jd_of("1752-09-02 Julian") and first == jd_of("1752-09-14 Gregorian")
    # Between the two reforms the same text is a different day: Julian with the marker.
    assert jd_of("1700-02-29 cutover 1752-09-14") == jd_of("1700-02-29 Julian")
    assert jd_of("1752-01-01 cutover 1752-09-14") - jd_of("1752-01-01") == 11.0


def numpy_gregorian_date(day_number):
    """(year, month, day) of a JD Number in the proleptic Gregorian calendar, by numpy."""
    day = np.datetime64(int(day_number) - JDN_1970, "D")
    month = day.astype("datetime64[M]")
    return (int(month.astype("datetime64[Y]").astype(np.int64)) + 1970,
            int(month.astype(np.int64)) % 12 + 1, int((day - month).astype(np.int64)) + 1)


SPANS = [
    # (first, last Gregorian date of the span, Julian lag in days): common practice.
    ((1500, 3, 1), (1700, 2, 28), 10),  # the reform of 1582 fell in this span
    ((1900, 3, 1), (2100, 2, 28), 13),  # the present one
]


@pytest.mark.parametrize("first, last, lag", SPANS)
def test_julian_lags_gregorian_by_ten_then_thirteen_days(first, last, lag):
    # Every day of each span, by day number: the same date written in both calendars is
    # ``lag`` days later in the Julian, and the cell reads the two texts so.
    start, end = numpy_gregorian_jdn(*first), numpy_gregorian_jdn(*last)
    for n in range(start, end + 1):
        y, m, d = numpy_gregorian_date(n)
        assert jdn(y, m, d, JULIAN) - jdn(y, m, d, GREGORIAN) == lag, (y, m, d)
    for n in range(start, end + 1, 97):  # the cell, on a sample of the same days
        y, m, d = numpy_gregorian_date(n)
        text = f"{y} {MONTHS[m - 1]} {d}"
        assert jd_of(text + " Julian") - jd_of(text + " Gregorian") == lag, text
    # Just outside each span the lag is one day less, and one day more.
    before, after = numpy_gregorian_date(start - 1), numpy_gregorian_date(end + 1)
    assert jdn(*before, JULIAN) - jdn(*before, GREGORIAN) == lag - 1
    assert jdn(*after, JULIAN) - jdn(*after, GREGORIAN) == lag + 1


def _both_calendars(year, month, day):
    return min(day, month_length(year, month, JULIAN), month_length(year, month, GREGORIAN))


@settings(max_examples=400, deadline=None)
@given(st.integers(-YEARS, YEARS), st.integers(1, 12), st.integers(1, 31))
def test_julian_lags_gregorian_by_the_century_rule(year, month, day):
    day = _both_calendars(year, month, day)
    assert jdn(year, month, day, JULIAN) - jdn(year, month, day, GREGORIAN) == century_rule(year, month)


# ---- text -> JD -> text, both calendars, both numberings, +-20,000 years ----------------

def _write(fields, calendar, form):
    """Calendar text of ours for (astronomical year, month, day, h, m, s) in one of the
    accepted forms, always naming the calendar."""
    y, mo, d, hh, mi, ss = fields
    clock = f"{hh:02d}:{mi:02d}:{ss:02d}"
    name = MONTHS[mo - 1]
    number, bc = (str(y), "") if y >= 1 else (str(1 - y), " BC")
    iso_year = f"{y:04d}" if y >= 0 else f"-{-y:04d}"
    text = {
        "iso": f"{iso_year}-{mo:02d}-{d:02d}T{clock}",
        "year first": f"{number}{bc} {name} {d} {clock}",
        "month first": f"{name} {d}, {number}{bc} {clock}",
        # Day first, years 1-99 say AD: "2 January 1" reads as year 2 (year first), and
        # "1 January 32" is refused (see test_day_first_with_a_two_digit_year below).
        "day first": f"{d} {name} {'AD ' if 1 <= y <= 99 else ''}{number}{bc} {clock}",
        "iso with era": f"{number}-{mo:02d}-{d:02d} {'BC' if bc else 'AD'} {clock}",
    }[form]
    return f"{text} {calendar.capitalize()}"


def _canonical(fields, numbering):
    """SKY.TEXT.DATE's own form (without the calendar name)."""
    y, mo, d, hh, mi, ss = fields
    clock = f"{hh:02d}:{mi:02d}:{ss:02d}"
    if numbering == "ASTRONOMICAL":
        iso_year = f"{y:04d}" if y >= 0 else f"-{-y:04d}"
        return f"{iso_year}-{mo:02d}-{d:02d}T{clock}"
    year = f"{y}" if y >= 1 else f"{1 - y} BC"
    return f"{year} {MONTHS[mo - 1]} {d} {clock}"


@st.composite
def calendar_instants(draw):
    calendar = draw(st.sampled_from([JULIAN, GREGORIAN]))
    year = draw(st.integers(-YEARS, YEARS))
    month = draw(st.integers(1, 12))
    day = draw(st.integers(1, month_length(year, month, calendar)))
    clock = (draw(st.integers(0, 23)), draw(st.integers(0, 59)), draw(st.integers(0, 59)))
    return calendar, (year, month, day) + clock


@settings(max_examples=500, deadline=None)
@given(calendar_instants(),
       st.sampled_from(["iso", "year first", "month first", "day first", "iso with era"]),
       st.sampled_from(["HISTORICAL", "ASTRONOMICAL"]))
def test_calendar_text_round_trip(instant, form, numbering):
    calendar, fields = instant
    text = _write(fields, calendar, form)
    jd = jd_of(text)
    # The JD is the independent one: numpy's Gregorian day count (with the century rule
    # for the Julian calendar) plus the clock time.
    y, mo, d, hh, mi, ss = fields
    want = reference_jdn(y, mo, d, calendar) - 0.5 + (hh * 3600 + mi * 60 + ss) / 86400.0
    assert abs(jd - want) <= 2 * math.ulp(max(abs(want), 1.0)) + 1e-11, text
    back = evaluate("SKY.TEXT.DATE", [f"JD {jd!r}", "TT", None, calendar, numbering])
    body, _, named = back.partition(" " + calendar.capitalize())
    assert body == _canonical(fields, numbering), (text, back)
    # The calendar is named exactly when AUTO would have read the text the other way.
    auto = GREGORIAN if reference_jdn(y, mo, d, calendar) >= 2299161 else JULIAN
    assert back.endswith(" " + calendar.capitalize()) == (calendar != auto), back
    assert jd_of(back) == jd  # and it reads back as the same instant


@settings(max_examples=300, deadline=None)
@given(st.integers(-YEARS, YEARS), st.integers(1, 12), st.integers(1, 31))
def test_unmarked_dates_read_julian_before_the_reform_and_gregorian_after(year, month, day):
    # AUTO reading (as historians write dates): Julian before 1582 October 15, Gregorian
    # from it; the ten days between were never used.
    label = (year, month, day)
    if label < (1582, 10, 15):
        calendar = JULIAN
    else:
        calendar = GREGORIAN
    day = min(day, month_length(year, month, calendar))
    text = f"{year:04d}-{month:02d}-{day:02d}" if year >= 0 else f"-{-year:04d}-{month:02d}-{day:02d}"
    if (1582, 10, 5) <= (year, month, day) <= (1582, 10, 14):
        assert "did not exist" in evaluate("SKY.JD", [text, "TT"])
        return
    assert jd_of(text) == jd_of(f"{text} {calendar.capitalize()}")


@pytest.mark.parametrize("text, written_out", [
    ("15 March 44 10:00", "AD 44 March 15 10:00"),  # day 44 cannot be: only one reading
    ("1 January 32", "AD 32 January 1"),
    ("31 December 99", "AD 99 December 31"),
])
def test_day_first_with_a_two_digit_year(text, written_out):
    assert jd_of(text) == jd_of(written_out)


# ---- dates that cannot be --------------------------------------------------------------

IMPOSSIBLE = [
    # text, words the message must contain, why the date cannot be (common practice)
    ("1582 October 10", "did not exist", "skipped by the reform"),
    ("1582-10-05", "did not exist", "skipped by the reform"),
    ("1582-10-14", "did not exist", "skipped by the reform"),
    ("1752-09-03 cutover 1752-09-14", "did not exist", "skipped in Britain"),
    ("0 BC March 1", "no year 0", "historical numbering has no year 0"),
    ("AD 0 March 1", "no year AD 0", "historical numbering has no year 0"),
    ("0000-03-15 BC", "no year 0", "historical numbering has no year 0"),
    ("2023 February 30", "has day 30", "February never has 30 days"),
    ("44 BC February 30", "has day 30", "February never has 30 days"),
    ("1700-02-29", "Julian", "1700 is a Julian leap year only"),
    ("1900 February 29", "Julian", "1900 is a Julian leap year only"),
    ("1500-02-29 Gregorian", "days", "1500 is not a Gregorian leap year"),
    ("-0011-02-29", "has day 29", "-11 (12 BC) is not a Julian leap year"),
    ("12 BC February 29", "has day 29", "12 BC (-11) is not a Julian leap year"),
    ("44 BC April 31", "has day 31", "April has 30 days"),
    ("-0043-13-15", "month", "months are 1 to 12"),
    ("44 BC Febtober 15", "not a month", "no such month"),
    ("44 BC March 15 25:00", "24:00", "no hour 25"),
]


@pytest.mark.parametrize("text, words, why", IMPOSSIBLE)
def test_impossible_dates_give_a_message(text, words, why):
    got = evaluate("SKY.JD", [text, "TT"])
    assert isinstance(got, str) and got.startswith("#SKY: "), (got, why)
    assert words in got and "internal error" not in got, (got, why)


def test_an_impossible_date_spoils_only_its_own_row():
    column = (("44 BC March 15 10:00",), ("1582 October 10",), ("0 BC March 1",), ("1066-10-14",))
    got = [row[0] for row in evaluate("SKY.JD", [column, "TT"])]
    assert abs(got[0] - (1705425.5 + 10.0 / 24.0)) <= JD_TOLERANCE
    assert got[1].startswith("#SKY: ") and got[2].startswith("#SKY: ")
    assert got[3] == reference_jdn(1066, 10, 14, JULIAN) - 0.5
