"""historical_record.ods: the Annals of Holmwray Abbey, an invented chronicle's dated sky
events: historical dates in both calendars, local mean time, Delta T and its
uncertainty, long-term obliquity, the 1960s UTC steps (time across history).
"""

import datetime

import uno
from sheetkit import format_range, header, note, number_format, widths

from .common import CENTER, RIGHT, fill_columns, fill_shifted, serial, sheet_at, sun_heading

FILE_NAME = "historical_record.ods"

ABBEY = "LMT 9.62"  # the invented abbey's east longitude, as a local-mean-time scale
WEST_PORT = "LMT -1.25"  # an invented correspondent at a western port
EAST_TOWN = "LMT 18.05"  # an invented correspondent in the east

# The Annals of Holmwray Abbey (invented): entries copied from older rolls and from
# correspondents' letters, each date written the way its writer wrote it.  The dates
# are chosen to show the ways of writing them; the events are invented, not records.
CHRONICLE = [
    ("44 BC March 15 10:00", ABBEY,
     "Copied from an older roll: a ring round the Sun at the fourth hour. Historical year "
     "numbering, Julian calendar, the abbey's local mean time."),
    ("March 15, 44 BC 10:00", ABBEY,
     "The same note in a second hand, the date written the other way round: the same "
     "instant (0 days from the entry above)."),
    ("-0308-07-14T11:30", "UT",
     "An astronomer's copy with astronomical year numbering (-0308 is 309 BC) and the time "
     "in UT: the Sun darkened at midday."),
    ("15 April 837 06:00", ABBEY, "A star with a tail before dawn in the east (a comet)."),
    ("AD 1021 May 9 22:00", EAST_TOWN,
     "A letter from the east, in its writer's local mean time: a new star low in the south."),
    ("1133 August 2 12:00", ABBEY,
     "At noon the Sun darkened and stars were seen (an eclipse)."),
    ("1194-11-30 17:30", ABBEY,
     "After sunset two bright planets stood close together (a conjunction)."),
    ("1582-10-04 23:00", ABBEY,
     "The abbey takes up the new calendar: the last evening of the old one. The next "
     "day is October 15."),
    ("1582-10-15 01:00", ABBEY,
     "Two hours later, the first night of the new calendar (0.0833 days from the entry above)."),
    ("1700-02-29 04:00 Julian", WEST_PORT,
     "A letter from a land still on the Julian calendar: a leap day the Gregorian calendar "
     "does not have. A bright fireball before dawn."),
    ("1752-09-02 22:00 cutover 1752-09-14", WEST_PORT,
     "The same land changes calendars in 1752 (September 2 is followed by September 14): "
     "an aurora on the last evening of the old style."),
    ("1752-09-14 05:00 cutover 1752-09-14", WEST_PORT,
     "Seven hours later, the first morning of the new style."),
    ("1800-06-10 21:00", ABBEY, "A bright comet low in the north-west."),
    ("1900-05-28 15:00", ABBEY,
     "The Sun partly covered by the Moon (a partial eclipse), watched by projecting its "
     "image through a pinhole onto card."),
]
CHRONICLE_FIRST = 4  # 0-based row of the first entry on the Chronicle sheet


TOP = 1  # com.sun.star.table.CellVertJustify2.TOP


def _wrapped(sheet, col, first, last):
    sheet.getCellRangeByPosition(col, first, col, last).IsTextWrapped = True


def chronicle_sheet(doc, sheet):
    cols = 9
    sun_heading(
        sheet, cols,
        "The Annals of Holmwray Abbey: an INVENTED chronicle (abbey, places, correspondents "
        "and entries are made up; the dates show the ways dates are written, they are not "
        "historical observations). Each entry's date is typed as its writer wrote it, with "
        "the time scale beside it: UT (universal time through Delta T) or LMT and the east "
        "longitude of the writer's place (local mean time). Dates before 1582-10-15 are "
        "read in the Julian calendar unless the text says Gregorian; \"Julian\" or "
        "\"cutover 1752-09-14\" in the text choose the calendar. Uses SKY.JD on TT and UT, "
        "SKY.TEXT.DATE (read back on the entry's own scale) and SKY.TEXT.ISO; the Calendars "
        "sheet writes the same instants in both calendars and both year numberings.", 1900)
    sheet.getCellByPosition(0, 2).setString(
        "The abbey (invented) lies at east longitude 9.62 deg (LMT 9.62); its correspondents "
        "at -1.25 (a western port, LMT -1.25) and 18.05 (a town in the east, LMT 18.05).")
    header(sheet, 3, [
        "No.", "Date as the source writes it", "Scale as written", "What the entry says",
        "JD (TT)", "JD (UT)", "Days since the entry above",
        "On the entry's own scale, in the usual calendar (Gregorian from 1582-10-15)",
        "TT as ISO 8601 text (Gregorian, astronomical years)",
    ])
    first = CHRONICLE_FIRST
    last = first + len(CHRONICLE) - 1
    sheet.getCellRangeByPosition(0, first, 3, last).setDataArray(
        tuple((float(k + 1),) + entry for k, entry in enumerate(CHRONICLE)))
    _wrapped(sheet, 3, first, last)
    # Centred: right-aligned, entry 1 before "44 BC ..." read as "144 BC".
    sheet.getCellRangeByPosition(0, first, 0, last).HoriJustify = CENTER
    fill_columns(doc, sheet, first, last, 4, [
        ('=SKY.JD(B{r};C{r};"TT")', "0.00000"),
        ('=SKY.JD(B{r};C{r};"UT")', "0.00000"),
    ])
    fill_shifted(sheet, 6, first + 1, last, "=E{r}-E{t}", first)
    format_range(sheet, 6, first, last, number_format(doc, "#,##0.0000"))
    sheet.getCellRangeByPosition(6, first + 1, 6, last).HoriJustify = RIGHT
    fill_columns(doc, sheet, first, last, 7, [
        ("=SKY.TEXT.DATE(B{r};C{r})", "@"),
        ('=SKY.TEXT.ISO(B{r};C{r};"TT";;0)', "@"),
    ], right=False)
    # Indented 2 mm: flush against the day count before it, "0.0000" and "44 BC" ran together.
    dates = sheet.getCellRangeByPosition(7, first, 8, last)
    dates.HoriJustify = uno.Enum("com.sun.star.table.CellHoriJustify", "LEFT")  # indent needs it
    dates.ParaIndent = 200
    sheet.getCellRangeByPosition(0, first, cols - 1, last).VertJustify = TOP
    widths(sheet, [1.0, 7.6, 2.2, 9.6, 3.2, 3.2, 3.0, 6.0, 6.8])


def calendars_sheet(doc, sheet):
    cols = 7
    note(sheet, 0,
         "The chronicle's instants (Chronicle sheet) in universal time, written in the Julian "
         "and in the (proleptic) Gregorian calendar, with historical year numbering (44 BC) "
         "and astronomical numbering (-0043; year 0 is 1 BC). A calendar other than the "
         "usual one for the date (Julian before 1582-10-15, Gregorian after) is named in the "
         "text, so the text reads back as the same instant. Uses SKY.TEXT.DATE.", cols)
    header(sheet, 1, [
        "No.", "Date as the source writes it", "Scale as written",
        "Julian calendar, historical years (UT)", "Gregorian calendar, historical years (UT)",
        "Julian calendar, astronomical years (UT)",
        "Gregorian calendar, astronomical years (UT)",
    ])
    first = 2
    last = first + len(CHRONICLE) - 1
    fill_columns(doc, sheet, first, last, 0, [
        ("=$Chronicle.A{t}", "0"), ("=$Chronicle.B{t}", "@"), ("=$Chronicle.C{t}", "@"),
    ], source_first=CHRONICLE_FIRST, right=False)
    sheet.getCellRangeByPosition(0, first, 0, last).HoriJustify = CENTER  # as on Chronicle
    fill_columns(doc, sheet, first, last, 3, [
        ('=SKY.TEXT.DATE(B{r};C{r};"UT";"JULIAN")', "@"),
        ('=SKY.TEXT.DATE(B{r};C{r};"UT";"GREGORIAN")', "@"),
        ('=SKY.TEXT.DATE(B{r};C{r};"UT";"JULIAN";"ASTRONOMICAL")', "@"),
        ('=SKY.TEXT.DATE(B{r};C{r};"UT";"GREGORIAN";"ASTRONOMICAL")', "@"),
    ], right=False)
    widths(sheet, [1.0, 7.6, 2.2, 6.4, 6.8, 6.2, 6.8])


def deltat_sheet(doc, sheet):
    cols = 16
    sun_heading(
        sheet, cols,
        "The chronicle's entries (Chronicle sheet) with what it takes to turn their clock "
        "times into instants: Delta T = TT - UT by the model of record (AUTO: Stephenson, "
        "Morrison and Hohenkerk 2016 before 1960) and by Espenak and Meeus 2006, and how far "
        "they differ; the published standard error of Delta T where there is one (Morrison "
        "and Stephenson 2004 for 1000 BC to AD 1200; 1700, 1800, 1900) and the uncertainty "
        "it gives a clock time and the longitude of an eclipse track; the mean obliquity of "
        "the ecliptic by the long-term formulas (Laskar 1986, Vondrak et al. 2011); and the "
        "Sun's apparent longitude (computed for 1000 to 3000 only). Uses SKY.DELTAT (models "
        "AUTO, SMH2016, ESPENAK2006), SKY.DELTAT.UNCERTAINTY, SKY.OBLIQUITY (LASKAR1986, "
        "VONDRAK2011), SKY.TEXT.DMS and SKY.SUN.LON.", 2300)
    header(sheet, 2, [
        "No.", "Date as the source writes it", "Scale", "Year (TT, decimal)",
        "Delta T, AUTO (s)", "Delta T, SMH2016 (s)", "Delta T, ESPENAK2006 (s)",
        "ESPENAK2006 - SMH2016 (s)", "Delta T as hours, minutes, seconds",
        "Standard error of Delta T (s)", "So a clock time computed from TT is uncertain by (min)",
        "And an eclipse track by (deg of longitude)", "Mean obliquity, LASKAR1986 (deg)",
        "Mean obliquity, VONDRAK2011 (deg)", 'VONDRAK2011 - LASKAR1986 (")',
        "Sun's apparent longitude, true equinox of date (deg)",
    ])
    first = 3
    last = first + len(CHRONICLE) - 1
    fill_columns(doc, sheet, first, last, 0, [
        ("=$Chronicle.A{t}", "0"), ("=$Chronicle.B{t}", "@"), ("=$Chronicle.C{t}", "@"),
        ("=2000+($Chronicle.E{t}-2451545)/365.25", "0.0"),
    ], source_first=CHRONICLE_FIRST, right=False)
    sheet.getCellRangeByPosition(0, first, 0, last).HoriJustify = CENTER  # as on Chronicle
    none = '"none published"'
    fill_columns(doc, sheet, first, last, 4, [
        ("=SKY.DELTAT(B{r};C{r})", "#,##0.0"),
        ('=SKY.DELTAT(B{r};C{r};;"SMH2016")', "#,##0.0"),
        ('=SKY.DELTAT(B{r};C{r};;"ESPENAK2006")', "#,##0.0"),
        ("=G{r}-F{r}", "+#,##0.0;-#,##0.0"),
        ("=E{r}/86400", "[HH]:MM:SS"),
        (f"=IF(ISNUMBER(SKY.DELTAT.UNCERTAINTY(B{{r}};C{{r}}));"
         f"SKY.DELTAT.UNCERTAINTY(B{{r}};C{{r}});{none})", "#,##0.0"),
        # Earth turns 360 degrees in 86400 s: 1 degree of longitude per 240 s.
        ('=IF(ISNUMBER(J{r});J{r}/60;"-")', "#,##0.00"),
        ('=IF(ISNUMBER(J{r});J{r}/240;"-")', "0.0000"),
        ('=SKY.OBLIQUITY(B{r};C{r};"LASKAR1986")', "0.000000"),
        ('=SKY.OBLIQUITY(B{r};C{r};"VONDRAK2011")', "0.000000"),
        ("=(N{r}-M{r})*3600", "+0.000;-0.000"),
        ('=IF(D{r}>=1000;SKY.SUN.LON(B{r};C{r});"before AD 1000")', "0.0000"),
    ])
    for col in (9, 15):
        _wrapped(sheet, col, first, last)
    for k, (label, row) in enumerate((("first", first), ("last", last))):
        r = last + 2 + k
        sheet.getCellByPosition(1, r).setString(
            f"Mean obliquity (VONDRAK2011) at the {label} entry, as written:")
        sheet.getCellRangeByPosition(1, r, 4, r).merge(True)
        cell = sheet.getCellByPosition(5, r)
        cell.setFormula(f"=SKY.TEXT.DMS(N{row + 1};1)")
        cell.HoriJustify = RIGHT
    sheet.getCellByPosition(1, last + 4).setString(
        "Delta T before 1960 is a model: the two models differ (column H) by as much as "
        "several published standard errors (column J) at some of these dates.")
    widths(sheet, [1.0, 7.6, 2.2, 2.2, 2.4, 2.6, 2.8, 2.8, 2.6, 2.6, 3.0, 2.8, 3.0, 3.0,
                   2.8, 3.2])


# Days that begin with a step of TAI - UTC: 1960s rate and offset changes, the start of
# whole leap seconds in 1972, and the last leap second (ERFA's leap-second table).
UTC_STEPS = [
    (datetime.datetime(1961, 1, 1), "offset +0.005 s"),
    (datetime.datetime(1961, 8, 1), "offset -0.05 s"),
    (datetime.datetime(1962, 1, 1), "new rate (0.0011232 s/day)"),
    (datetime.datetime(1963, 11, 1), "offset +0.1 s"),
    (datetime.datetime(1964, 1, 1), "new rate (0.001296 s/day)"),
    (datetime.datetime(1965, 9, 1), "offset +0.1 s"),
    (datetime.datetime(1966, 1, 1), "new rate (0.002592 s/day)"),
    (datetime.datetime(1968, 2, 1), "offset -0.1 s"),
    (datetime.datetime(1972, 1, 1), "whole leap seconds: 10 s, no drift"),
    (datetime.datetime(2017, 1, 1), "the leap second at 2016-12-31 23:59:60"),
]


def utc_1960s_sheet(doc, sheet):
    cols = 10
    note(sheet, 0,
         "UTC before whole leap seconds: from 1960 to 1971 UTC ran at a slightly different "
         "rate from TAI and stepped by fractions of a second; TAI - UTC grew by a fixed "
         "number of seconds a day. Each row is a day on which it changed (ERFA's table): "
         "TAI - UTC at 00:00 UTC two days before, one day before and on the day, and the "
         "step itself (the change over the last day, less the day's drift before it). "
         "Uses SKY.LEAPSECONDS, SKY.LEAPSECONDS.UNTIL, SKY.TEXT.ISO and SKY.DELTAT "
         "(DUT1 taken as 0).", cols)
    sheet.getRows().getByIndex(0).Height = 1900  # three lines of note
    header(sheet, 1, [
        "Date of the change (UTC, 00:00)", "What changed", "TAI - UTC two days before (s)",
        "TAI - UTC one day before (s)", "TAI - UTC on the day (s)", "Drift per day before (s)",
        "Step at 00:00 (s)", "TAI at that 00:00 UTC (ISO text)",
        "Delta T then (s, DUT1 = 0)", "Days since the row above",
    ])
    first = 2
    last = first + len(UTC_STEPS) - 1
    sheet.getCellRangeByPosition(0, first, 1, last).setDataArray(
        tuple((serial(day), what) for day, what in UTC_STEPS))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    sheet.getCellRangeByPosition(0, first, 0, last).HoriJustify = CENTER  # apart from column B
    fill_columns(doc, sheet, first, last, 2, [
        ("=SKY.LEAPSECONDS(A{r}-2)", "0.0000000"),
        ("=SKY.LEAPSECONDS(A{r}-1)", "0.0000000"),
        ("=SKY.LEAPSECONDS(A{r})", "0.0000000"),
        ("=D{r}-C{r}", "0.0000000"),
        # Rounded to a nanosecond, so that no step shows as -0.0000000.
        ("=ROUND((E{r}-D{r})-F{r};9)", "+0.0000000;-0.0000000;0.0000000"),
        ('=SKY.TEXT.ISO(A{r};"UTC";"TAI";;7)', "@"),
        ("=SKY.DELTAT(A{r})", "0.0000000"),
    ])
    fill_shifted(sheet, 9, first + 1, last, "=A{r}-A{t}", first)
    format_range(sheet, 9, first, last, number_format(doc, "#,##0"))
    end = last + 2
    rows = [
        ("The leap-second table is vouched for until (ERFA)", "=SKY.LEAPSECONDS.UNTIL()",
         "YYYY-MM-DD"),
        ("TAI - UTC on that day (s; no leap second since 2016-12-31 is assumed)",
         f"=SKY.LEAPSECONDS(E{end + 1})", "0"),
    ]
    for k, (label, formula, code) in enumerate(rows):
        sheet.getCellByPosition(0, end + k).setString(label)
        sheet.getCellRangeByPosition(0, end + k, 3, end + k).merge(True)
        cell = sheet.getCellByPosition(4, end + k)
        cell.setFormula(formula)
        cell.NumberFormat = number_format(doc, code)
        cell.HoriJustify = RIGHT
    widths(sheet, [3.0, 8.0, 3.0, 3.0, 3.0, 2.8, 2.8, 6.2, 3.0, 2.4])


def fill(doc):
    chronicle_sheet(doc, sheet_at(doc, 0, "Chronicle"))
    calendars_sheet(doc, sheet_at(doc, 1, "Calendars"))
    deltat_sheet(doc, sheet_at(doc, 2, "Delta T and sky"))
    utc_1960s_sheet(doc, sheet_at(doc, 3, "1960s UTC"))
