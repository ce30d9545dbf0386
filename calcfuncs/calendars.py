"""Julian and Gregorian calendars at any date, and dates written the way historians do.

ERFA's calendar routines are Gregorian and stop in 4799 BC; these are our own, in
integer arithmetic with floor division, so they hold for every year.  Years are
astronomical (1 BC is year 0, 44 BC is year -43) inside; text may use either numbering
as long as it says which (BC/BCE/AD/CE for the historical one).

By default a date before 1582 October 15 is read in the Julian calendar, as historians
write them, and later ones in the Gregorian (the reform: Thursday 1582 October 4,
Julian, was followed by Friday 1582 October 15, Gregorian).  The words "Julian" or
"Gregorian" in the text choose the calendar; "cutover 1752-09-14" moves the reform
to the first Gregorian day of another country (here Britain).
"""

import re

from .errors import SkyError

JULIAN, GREGORIAN = "JULIAN", "GREGORIAN"
# Julian Day Number of 1582 October 15 (Gregorian), the first day of the reform.
REFORM_JDN = 2299161

MONTHS = ("january", "february", "march", "april", "may", "june", "july", "august",
          "september", "october", "november", "december")


def jdn(year, month, day, calendar):
    """Julian Day Number (the day that begins at noon of that date) of a calendar date.

    The year is counted from March so that the leap day ends it; floor division keeps
    the formula right for negative years too.
    """
    a = (14 - month) // 12
    y = year + 4800 - a
    m = month + 12 * a - 3
    days = day + (153 * m + 2) // 5 + 365 * y + y // 4
    if calendar == GREGORIAN:
        return days - y // 100 + y // 400 - 32045
    return days - 32083


def calendar_date(number, calendar):
    """(year, month, day) of a Julian Day Number in the given calendar."""
    if calendar == GREGORIAN:
        a = number + 32044
        b = (4 * a + 3) // 146097
        c = a - 146097 * b // 4
    else:
        b = 0
        c = number + 32082
    d = (4 * c + 3) // 1461
    e = c - 1461 * d // 4
    m = (5 * e + 2) // 153
    day = e - (153 * m + 2) // 5 + 1
    month = m + 3 - 12 * (m // 10)
    year = 100 * b + d - 4800 + m // 10
    return year, month, day


def days_in_month(year, month, calendar):
    following = (year + 1, 1) if month == 12 else (year, month + 1)
    return jdn(*following, 1, calendar) - jdn(year, month, 1, calendar)


def _iso(y, m, d):
    return f"{y:04d}-{m:02d}-{d:02d}" if y >= 0 else f"-{-y:04d}-{m:02d}-{d:02d}"


def historical_year(year):
    """(number, era) of an astronomical year: 1 AD for 1, 1 BC for 0, 44 BC for -43."""
    return (year, "AD") if year >= 1 else (1 - year, "BC")


# ---- reading text -------------------------------------------------------------------

_TIME = (r"(?:[Tt ,]+(?P<H>\d{1,2})(?::(?P<M>\d{1,2})(?::(?P<S>\d{1,2}(?:[.,]\d+)?))?)?)?")
_ERA = r"(?P<era>BCE|BC|AD|CE|B\.C\.|A\.D\.)"
_MONTH = r"(?P<mon>[A-Za-z]{3,}\.?)"
_FORMS = [
    # ISO, astronomical numbering: -0043-03-15T10:00
    re.compile(r"^(?P<y>[+-]?\d{4,})-(?P<m>\d{1,2})-(?P<d>\d{1,2})" + _TIME + r"$"),
    # ISO-like with an era: 44-03-15 BC 10:00, 0044-03-15 BC
    re.compile(r"^(?P<y>\d{1,6})-(?P<m>\d{1,2})-(?P<d>\d{1,2})\s*" + _ERA + _TIME + r"$"),
    # 44 BC March 15 10:00 / AD 1066 October 14 / 1066 October 14
    re.compile(r"^(?:(?P<era0>AD|CE|A\.D\.)\s*)?(?P<y>\d{1,6})\s*" + _ERA + r"?\s+" + _MONTH
               + r"\s+(?P<d>\d{1,2})" + _TIME + r"$"),
    # March 15, 44 BC 10:00 / October 14, 1066
    re.compile(r"^" + _MONTH + r"\s+(?P<d>\d{1,2}),?\s+(?:(?P<era0>AD|CE|A\.D\.)\s*)?(?P<y>\d{1,6})"
               + r"\s*" + _ERA + r"?" + _TIME + r"$"),
    # 15 March 44 BC 10:00
    re.compile(r"^(?P<d>\d{1,2})\s+" + _MONTH + r"\s+(?:(?P<era0>AD|CE|A\.D\.)\s*)?(?P<y>\d{1,6})"
               + r"\s*" + _ERA + r"?" + _TIME + r"$"),
]
_MARKER = re.compile(
    r"[\s,(]*\b(?P<which>julian|gregorian|(?:cut-?over|reform)\s+(?P<cut>\d{4}-\d{1,2}-\d{1,2}))\b\)?\s*$",
    re.IGNORECASE,
)


def _month_number(word, text):
    w = word.rstrip(".").lower()
    for k, name in enumerate(MONTHS):
        if len(w) >= 3 and name.startswith(w):
            return k + 1
    raise SkyError(f'"{text}": "{word}" is not a month name (January ... December)')


def split_marker(text):
    """(text without a trailing calendar marker, calendar or None, reform JDN)."""
    m = _MARKER.search(text)
    if not m:
        return text, None, REFORM_JDN
    rest = text[: m.start()].strip()
    which = m.group("which").lower()
    if which == "julian":
        return rest, JULIAN, REFORM_JDN
    if which == "gregorian":
        return rest, GREGORIAN, REFORM_JDN
    y, mo, d = (int(v) for v in m.group("cut").split("-"))
    return rest, None, jdn(y, mo, d, GREGORIAN)


def parse_calendar_text(text):
    """Read a calendar date and clock time.

    Returns (year, month, day, hour, minute, second, calendar) with an astronomical
    year and the calendar it is in; ``None`` if the text is not a calendar date.
    Raises ``SkyError`` for a date that is written as one but cannot be.
    """
    body, calendar, reform = split_marker(text.strip())
    matches = [m for m in (form.match(body) for form in _FORMS) if m]
    if not matches:
        if calendar is not None or reform != REFORM_JDN:
            raise SkyError(f'"{text}" is not a date this reads; write e.g. 44 BC March 15 10:00, '
                           "-0043-03-15T10:00 or 1066-10-14 Julian")
        return None
    # "15 March 44" also fits the year-first form (year 15, day 44): the first reading
    # that is a real date wins; if none is, the first one's problem is reported.
    first_problem = None
    for m in matches:
        try:
            return _fields(m.groupdict(), text, calendar, reform)
        except SkyError as err:
            first_problem = first_problem or err
    raise first_problem


def _fields(groups, text, calendar, reform):
    number = int(groups["y"])
    era = (groups.get("era") or groups.get("era0") or "").upper().replace(".", "")
    if era in ("BC", "BCE"):
        if number == 0:
            raise SkyError(f'"{text}": there is no year 0 BC; 1 BC is followed by AD 1 '
                           "(astronomical year 0 is 1 BC)")
        year = 1 - number
    elif era in ("AD", "CE"):
        if number == 0:
            raise SkyError(f'"{text}": there is no year AD 0; AD 1 follows 1 BC '
                           "(write -0000 or 0000 for astronomical year 0)")
        year = number
    else:
        year = number
    month = _month_number(groups["mon"], text) if groups.get("mon") else int(groups["m"])
    day = int(groups["d"])
    hour = int(groups.get("H") or 0)
    minute = int(groups.get("M") or 0)
    second = float((groups.get("S") or "0").replace(",", "."))
    if not 1 <= month <= 12:
        raise SkyError(f'"{text}" has month {month}; months are 1 to 12')
    if abs(year) > 1_000_000:
        raise SkyError(f'"{text}" is out of range; years within +-1,000,000')
    if calendar is None:
        if not 1 <= day <= 31:
            raise SkyError(f'"{text}" has day {day}; days are 1 to 31')
        calendar = _calendar_of_unmarked(year, month, day, reform, text)
    length = days_in_month(year, month, calendar)
    if not 1 <= day <= length:
        n, era = historical_year(year)
        raise SkyError(f'"{text}" has day {day}; {MONTHS[month - 1].capitalize()} {n} {era} '
                       f"has {length} days in the {calendar.capitalize()} calendar")
    if hour == 24 and minute == 0 and second == 0.0:
        pass
    elif hour > 23 or minute > 59:
        raise SkyError(f'"{text}" has a time past 24:00:00; hours 0-23, minutes 0-59')
    if second >= 61.0:
        raise SkyError(f'"{text}" has {second:g} seconds; seconds run 0 to below 60')
    return year, month, day, hour, minute, second, calendar


def _calendar_of_unmarked(year, month, day, reform, text):
    # Within the month lengths of either calendar the JDN tests decide; a Gregorian
    # reading at or after the reform wins, a Julian reading before it; the days in
    # between were skipped.
    try:
        g = jdn(year, month, day, GREGORIAN) if day <= days_in_month(year, month, GREGORIAN) else None
        j = jdn(year, month, day, JULIAN) if day <= days_in_month(year, month, JULIAN) else None
    except Exception:  # pragma: no cover - integer arithmetic cannot fail
        g = j = None
    if g is not None and g >= reform:
        return GREGORIAN
    if j is not None and j < reform:
        return JULIAN
    if g is None and j is None:
        would = GREGORIAN if jdn(year, month, 1, GREGORIAN) >= reform else JULIAN
        n, era = historical_year(year)
        raise SkyError(f'"{text}" has day {day}; {MONTHS[month - 1].capitalize()} {n} {era} '
                       f"has {days_in_month(year, month, would)} days")
    if g is None and j is not None:  # e.g. 1700-02-29: a Julian leap day after the reform
        raise SkyError(f'"{text}" has day {day}; {MONTHS[month - 1].capitalize()} {year} has '
                       f"{days_in_month(year, month, GREGORIAN)} days in the Gregorian "
                       'calendar (add "Julian" to read it in the Julian calendar)')
    last_julian = calendar_date(reform - 1, JULIAN)
    first_gregorian = calendar_date(reform, GREGORIAN)
    raise SkyError(
        f'"{text}" did not exist: {_iso(*last_julian)} (Julian) was followed by '
        f'{_iso(*first_gregorian)} (Gregorian); add "Julian" or "Gregorian" to read it '
        "in one calendar"
    )


# ---- writing text -------------------------------------------------------------------


def calendar_text(number, seconds_of_day, calendar, numbering, decimals, marker):
    """A date and time as text.

    numbering HISTORICAL: "44 BC March 15 10:00:00" / "1066 October 14 09:00:00";
    ASTRONOMICAL: "-0043-03-15T10:00:00".  ``marker`` appends the calendar's name.
    """
    y, m, d = calendar_date(number, calendar)
    scale = 10**decimals
    q = int(round(seconds_of_day * scale))
    if q >= 86400 * scale:  # rounded up into the next day
        y, m, d = calendar_date(number + 1, calendar)
        q -= 86400 * scale
    minutes_total, rest = divmod(q, 60 * scale)
    hh, mm = divmod(minutes_total, 60)
    whole, frac = divmod(rest, scale)
    clock = f"{hh:02d}:{mm:02d}:{whole:02d}" + (f".{frac:0{decimals}d}" if decimals else "")
    if numbering == "ASTRONOMICAL":
        text = f"{_iso(y, m, d)}T{clock}"
    else:
        n, era = historical_year(y)
        year_text = f"{n} BC" if era == "BC" else f"{n}"
        text = f"{year_text} {MONTHS[m - 1].capitalize()} {d} {clock}"
    return text + (f" {calendar.capitalize()}" if marker else "")
