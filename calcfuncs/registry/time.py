"""The time functions: Julian dates, time scales, Delta T, leap seconds, calendar text."""

from .. import vocabulary as vocab
from .common import (DUT1, RESULT_SCALE, SCALE, Arg, CellFunction, Family, choices_text,
                     span_text, time_arg)


def _jd_number(name, what):
    return Arg(name, "number", f"The {what} as a number, read on the time scale given next.")


_DOUBLE_LIMIT = (
    "A JD held in one cell resolves about 40 microseconds (an MJD or a date-time "
    "cell about 1 microsecond); the computation inside keeps the full precision."
)
_UTC_NOTE = (
    "UTC uses ERFA's leap-second table (last leap second 2016-12-31) and assumes none "
    "since; 23:59:60 is accepted on real leap seconds. TT = TAI + 32.184 s; TDB - TT "
    f"from ERFA dtdb (Fairhead-Bretagnon, geocentre) for {span_text(vocab.TDB_SERIES_YEARS)}, "
    "and outside those years from the two-term approximation 0.001657 sin g + 0.000014 "
    "sin 2g (tens of microseconds)."
)
_QUASI_JD = (
    "A JD or MJD on UTC is ERFA's quasi-JD: on a day that ends in a leap second (or a "
    "1960s step) the day's fraction spreads over its real length, so 23:59:60 has a place."
)
_DELTA_T_MODEL = Arg(
    "model", "choice",
    choices_text(vocab.DELTA_T_CHOICES, {
        "AUTO": "default: MEASURED from 1960, SMH2016 before",
        "MEASURED": "32.184 s + (TAI - UTC) - DUT1, 1960 on",
        "SMH2016": "Stephenson, Morrison and Hohenkerk 2016 with the 2020 addendum: spline "
                   "-720 to 2019, their parabola before",
        "ESPENAK2006": "Espenak and Meeus polynomials, -1999 to 3000, parabola outside",
    }) + ".",
    default="AUTO", choices=vocab.DELTA_T_CHOICES)

FAMILY = Family("time", "Time: Julian dates and time scales", (
    CellFunction(
        name="SKY.JD",
        method="skyJd",
        summary="Julian Date of an instant, on a chosen time scale.",
        args=(time_arg(), SCALE, RESULT_SCALE, DUT1),
        result="Julian Date in days on the result scale",
        impl="timefuncs:julian_date",
        model=_DOUBLE_LIMIT + " " + _UTC_NOTE + " " + _QUASI_JD,
    ),
    CellFunction(
        name="SKY.MJD",
        method="skyMjd",
        summary=f"Modified Julian Date (JD - {vocab.MJD_ZERO}) of an instant, on a chosen "
        "time scale.",
        args=(time_arg(), SCALE, RESULT_SCALE, DUT1),
        result="Modified Julian Date in days on the result scale",
        impl="timefuncs:modified_julian_date",
        model=_UTC_NOTE + " " + _QUASI_JD,
    ),
    CellFunction(
        name="SKY.DATETIME",
        method="skyDatetime",
        summary="The instant as a Calc date-time value on another time scale (UTC to TT, "
        "TT to TDB and so on); format the cell as a date-time to read it.",
        args=(time_arg(), SCALE, RESULT_SCALE, DUT1),
        result="date-time value (days since the document's null date) on the result scale; "
        "an instant inside a leap second gives a message, since a date-time cell cannot "
        "show 23:59:60 (use SKY.TEXT.ISO)",
        result_kind="datetime",
        impl="timefuncs:calc_datetime",
        model=_UTC_NOTE,
    ),
    CellFunction(
        name="SKY.JD.DATETIME",
        method="skyJdDatetime",
        summary="A Julian Date number turned back into a Calc date-time value.",
        args=(_jd_number("jd", "Julian Date"), SCALE, RESULT_SCALE, DUT1),
        result="date-time value (days since the document's null date) on the result scale",
        result_kind="datetime",
        impl="timefuncs:calc_datetime_from_jd",
        model=_UTC_NOTE,
    ),
    CellFunction(
        name="SKY.MJD.DATETIME",
        method="skyMjdDatetime",
        summary="A Modified Julian Date number turned back into a Calc date-time value.",
        args=(_jd_number("mjd", "Modified Julian Date"), SCALE, RESULT_SCALE, DUT1),
        result="date-time value (days since the document's null date) on the result scale",
        result_kind="datetime",
        impl="timefuncs:calc_datetime_from_mjd",
        model=_UTC_NOTE,
    ),
    CellFunction(
        name="SKY.TEXT.ISO",
        method="skyTextIso",
        summary="The instant as ISO 8601 text on a chosen time scale, leap seconds shown as "
        "23:59:60.",
        args=(
            time_arg(),
            SCALE,
            RESULT_SCALE,
            DUT1,
            Arg(
                "decimals",
                "count",
                "Decimal places of the seconds, 0 to 9. Default 3.",
                default=3,
            ),
        ),
        result='text such as "2024-03-20T03:06:00.000" (no zone letter: the scale is the '
        "one asked for)",
        result_kind="text",
        impl="timefuncs:iso_text",
        model=_UTC_NOTE,
    ),
    CellFunction(
        name="SKY.DELTAT",
        method="skyDeltaT",
        summary="Delta T = TT - UT at an instant: measured from 1960 on, from a published "
        "model before (or as chosen).",
        args=(time_arg(), SCALE, DUT1, _DELTA_T_MODEL),
        result="seconds",
        impl="timefuncs:delta_t",
        model="The scale UT of every time argument uses the same default (AUTO). Before "
        "-720 SMH2016 is its long-term parabola joined to the spline by a constant shift "
        "of ours (358 s). SMH2016 ends in 2019 and MEASURED starts in 1960: outside, the "
        "cell says so. " + _UTC_NOTE,
    ),
    CellFunction(
        name="SKY.DELTAT.UNCERTAINTY",
        method="skyDeltaTUncertainty",
        summary="Published standard error of Delta T at a date: how far a clock time "
        "reconstructed through Delta T can be trusted.",
        args=(time_arg(), SCALE),
        result="seconds (one standard error)",
        impl="timefuncs:delta_t_uncertainty",
        model="Morrison and Stephenson (2004): 0.8 u^2 s, u = (year - 1820)/100, for 1001 "
        "BC to AD 1200; Stephenson and Houlden (1986): 5 s in 1700, 1 s in 1800, 0.1 s in "
        "1900. Other dates have no published estimate here and the cell says so.",
    ),
    CellFunction(
        name="SKY.LEAPSECONDS",
        method="skyLeapseconds",
        summary="TAI - UTC at an instant: the leap seconds (and the 1960s offsets) of "
        "ERFA's table.",
        args=(time_arg(), SCALE),
        result="seconds",
        impl="timefuncs:tai_minus_utc",
        model="From 1960 on. " + _UTC_NOTE,
    ),
    CellFunction(
        name="SKY.LEAPSECONDS.UNTIL",
        method="skyLeapsecondsUntil",
        summary="The last date for which the built-in leap-second table is known to be "
        "valid, as ERFA states it; UTC results after it assume no new leap second.",
        args=(),
        result="a date-time value (format the cell as a date)",
        result_kind="datetime",
        impl="timefuncs:leap_table_valid_until",
        model="ERFA treats dates more than five years after its release year as dubious "
        "(eraDat); this is the last day before that. DUT1 or a Delta T you give still "
        "apply after it.",
    ),
    CellFunction(
        name="SKY.TEXT.DATE",
        method="skyTextDate",
        summary="The instant as calendar text in the Julian or Gregorian calendar, with "
        "historical (44 BC) or astronomical (-0043) year numbering.",
        args=(
            time_arg(), SCALE, RESULT_SCALE,
            Arg("calendar", "choice", "AUTO (default: Julian before 1582-10-15, Gregorian "
                "after), JULIAN or GREGORIAN (proleptic). A calendar other than AUTO's "
                "choice is named in the text, so it reads back the same.",
                default="AUTO", choices=("AUTO", "JULIAN", "GREGORIAN")),
            Arg("numbering", "choice", "HISTORICAL (default: 44 BC March 15 10:00:00) or "
                "ASTRONOMICAL (-0043-03-15T10:00:00; year 0 is 1 BC).",
                default="HISTORICAL", choices=("HISTORICAL", "ASTRONOMICAL")),
            Arg("decimals", "count", "Decimal places of the seconds, 0 to 9. Default 0.",
                default=0),
            DUT1,
        ),
        result='text such as "44 BC March 15 10:00:00"',
        result_kind="text",
        impl="timefuncs:calendar_date_text",
        model="Calendar arithmetic of our own at any date (ERFA's stops in 4799 BC). "
        + _UTC_NOTE,
    ),
))
