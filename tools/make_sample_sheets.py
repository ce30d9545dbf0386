"""Write the sample sheets in sample_sheets/ with a real office and the built extension.

    .venv/bin/python tools/make_sample_sheets.py --oxt dist/eclipsheet.oxt [--out sample_sheets]

Four workbooks, one office session:

  observing_log.ods      a season's estimate times: Julian dates, time scales, obliquity,
                         nutation, angle text (the time, angle and obliquity families)
  target_list.ods        one night's targets: coordinate systems, precession, proper
                         motion, sidereal time and the horizon (the coordinates and
                         horizon families)
  historical_record.ods  an invented chronicle's dated sky events: historical dates in
                         both calendars, local mean time, Delta T and its uncertainty,
                         long-term obliquity, the 1960s UTC steps (time across history)
  meteor_watch.ods       an invented club's meteor watches reduced to solar longitude, a
                         year of nights (sunset, twilight, transit, sundial time), the
                         seasons and the Sun's place (the Sun family)

The scenarios are invented: the Saltmarsh Variable Star Circle, observing from its
Kettle Hill site and from a second field site, Curlew Staithe, whose coordinates are
made up too; the Annals of Holmwray Abbey; the Tollmere Meteor Section at Whinburn
Common.  Observers, nights, fields, stars, entries and counts are made up.  The sheets
hold formulas (no macros), so opening them never asks about macro security.  Every
sheet about the Sun carries the caution never to look at it, or point optics at it,
without a proper solar filter.
"""

import argparse
import datetime
import os
import random
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)

import officekit  # noqa: E402
import sample_planets  # noqa: E402
import uno  # noqa: E402  (the office bridge, importable once officekit is)
from sheetkit import (  # noqa: E402
    column_letter,
    fill_formulas,
    format_range,
    header,
    landscape_fit_to_width,
    note,
    number_format,
    widths,
)

LOG_ROWS = 300
OBSERVERS = ("AB", "CK", "DM", "RT")
NULL_JD = 2415018.5  # 1899-12-30, the default null date


def invented_log(seed=20251):
    """Observation times: clear nights from September 2025 to March 2026, several
    estimates a night between dusk and dawn (UTC), in time order."""
    rng = random.Random(seed)
    first_night = 45915.0  # 2025-09-15 as a date-time value
    times = []
    night = 0
    while len(times) < LOG_ROWS:
        night += rng.choice((1, 1, 2, 3, 5))
        start = first_night + night + (19.5 + rng.random() * 2.0) / 24.0
        for k in range(rng.randint(3, 9)):
            times.append(round((start + k * rng.uniform(0.02, 0.06)) * 86400.0) / 86400.0)
    return [(t, rng.choice(OBSERVERS)) for t in times[:LOG_ROWS]]


def _sheet(doc, index, name):
    sheets = doc.Sheets
    if index < sheets.getCount():
        sheet = sheets.getByIndex(index)
        sheet.setName(name)
    else:
        sheets.insertNewByName(name, index)
        sheet = sheets.getByIndex(index)
    return sheet


LOG_COLUMNS = [
    # (header, formula template, number format, width cm)
    ("JD (UTC)", "=SKY.JD(B{r})", "0.00000", 3.2),
    ("JD (TT)", '=SKY.JD(B{r};"UTC";"TT")', "0.00000", 3.2),
    ("MJD (TDB)", '=SKY.MJD(B{r};"UTC";"TDB")', "0.000000", 3.2),
    ("TT as date-time", '=SKY.DATETIME(B{r};"UTC";"TT")', "YYYY-MM-DD HH:MM:SS", 4.0),
    ("TAI (ISO text)", '=SKY.TEXT.ISO(B{r};"UTC";"TAI";;1)', "@", 4.6),
    ("Delta T (s)", "=SKY.DELTAT(B{r})", "0.000", 2.4),
    ("Mean obliquity (deg)", "=SKY.OBLIQUITY(B{r})", "0.0000000", 3.2),
    ("True obliquity (deg)", "=SKY.OBLIQUITY.TRUE(B{r})", "0.0000000", 3.2),
    ("True obliquity (DMS)", "=SKY.TEXT.DMS(K{r};2)", "@", 3.6),
    ('Nutation in longitude (")', '=SKY.NUTATION.LON(B{r};;;"ARCSEC")', "0.000", 3.0),
    ('Nutation in obliquity (")', '=SKY.NUTATION.OBL(B{r};;;"ARCSEC")', "0.000", 3.0),
    ("Back from JD (TT) to UTC", '=SKY.JD.DATETIME(E{r};"TT";"UTC")',
     "YYYY-MM-DD HH:MM:SS.000", 5.6),
    ("Round trip via one-cell JD (ms; a JD in one cell keeps ~0.04 ms)",
     "=(O{r}-B{r})*86400000", "0.000", 3.4),
    ("Back from MJD (TDB) to UTC", '=SKY.MJD.DATETIME(F{r};"TDB";"UTC")',
     "YYYY-MM-DD HH:MM:SS.000", 5.6),
]


def observing_log(doc, sheet, log):
    note(sheet, 0,
         "Saltmarsh Variable Star Circle, Kettle Hill site (invented): a season's estimate "
         "times in UTC turned into Julian dates on the UTC, TT and TDB scales, Delta T, "
         "the obliquity of the ecliptic (IAU 2006) and nutation (IAU 2000A), and back. "
         "Uses SKY.JD, SKY.MJD, SKY.DATETIME, SKY.TEXT.ISO, SKY.DELTAT, SKY.OBLIQUITY, "
         "SKY.OBLIQUITY.TRUE, SKY.TEXT.DMS, SKY.NUTATION.LON, SKY.NUTATION.OBL, "
         "SKY.JD.DATETIME and SKY.MJD.DATETIME, one formula per row (fill down).", 12)
    sheet.getRows().getByIndex(0).Height = 1900  # three lines of note
    header(sheet, 1, ["No.", "Time (UTC)", "Observer"] + [c[0] for c in LOG_COLUMNS])
    first, last = 2, 2 + len(log) - 1
    sheet.getCellRangeByPosition(0, first, 2, last).setDataArray(
        tuple((float(i + 1), t, who) for i, (t, who) in enumerate(log))
    )
    format_range(sheet, 1, first, last, number_format(doc, "YYYY-MM-DD HH:MM:SS"))
    sheet.getCellRangeByPosition(2, first, 2, last).HoriJustify = CENTER
    for k, (_, template, code, _) in enumerate(LOG_COLUMNS):
        col = 3 + k
        fill_formulas(sheet, col, first, last, template)
        format_range(sheet, col, first, last, number_format(doc, code))
        if code == "@":  # ISO and sexagesimal text lines up with the numbers beside it
            sheet.getCellRangeByPosition(col, first, col, last).HoriJustify = RIGHT
    widths(sheet, [1.2, 4.0, 2.4] + [c[3] for c in LOG_COLUMNS])


def column_form(doc, sheet, rows):
    note(sheet, 0,
         "The same log computed in whole-column form: each column is ONE array formula "
         "over the times on the Observing log sheet (select the range, type the formula, "
         "Ctrl+Shift+Enter). Faster for long logs; a bad row shows its own message. Uses "
         "SKY.JD, SKY.MJD, SKY.OBLIQUITY, SKY.OBLIQUITY.TRUE and SKY.NUTATION.LON on ranges.",
         8)
    sheet.getRows().getByIndex(0).Height = 1900  # three lines of note
    header(sheet, 1, ["Time (UTC)", "JD (TT)", "MJD (UTC)", "Mean obliquity (deg)",
                      "True obliquity (deg)", 'Nutation in longitude (")'])
    first, last = 2, 2 + rows - 1
    src = f"$'Observing log'.B{first + 1}:B{last + 1}"
    sheet.getCellRangeByPosition(0, first, 0, last).setArrayFormula(f"={src}")
    formulas = [
        f'=SKY.JD({src};"UTC";"TT")',
        f"=SKY.MJD({src})",
        f"=SKY.OBLIQUITY({src})",
        f"=SKY.OBLIQUITY.TRUE({src})",
        f'=SKY.NUTATION.LON({src};;;"ARCSEC")',
    ]
    codes = ["YYYY-MM-DD HH:MM:SS", "0.00000", "0.000000", "0.0000000", "0.0000000", "0.000"]
    for k, f in enumerate(formulas):
        sheet.getCellRangeByPosition(k + 1, first, k + 1, last).setArrayFormula(f)
    for k, code in enumerate(codes):
        format_range(sheet, k, first, last, number_format(doc, code))
    widths(sheet, [4.0, 3.2, 3.2, 3.4, 3.4, 3.4])


TIME_CASES = [
    # (input as typed, scale, what it shows)
    ("2000-01-01T12:00:00", "TT", "J2000.0, the standard epoch, given on TT"),
    ("2000-01-01T11:58:55.816Z", "UTC", "the same instant given in UTC"),
    ("JD 2451545.0", "TT", "the same instant as JD text"),
    ("MJD 51544.5", "TT", "the same instant as MJD text"),
    ("2016-12-31T23:59:59.5Z", "UTC", "half a second before the last leap second"),
    ("2016-12-31T23:59:60.5Z", "UTC", "inside the leap second (23:59:60 is real here)"),
    ("2017-01-01T00:00:00.5Z", "UTC", "half a second after it"),
    ("1972-01-01T00:00:00Z", "UTC", "the start of UTC with whole leap seconds"),
    ("2025-11-14 21:30:00", "UT1", "a time given in UT1 (DUT1 in column C)"),
]


def time_scales(doc, sheet):
    note(sheet, 0,
         "One instant, many spellings; and the leap second at the end of 2016. The time "
         "is text (ISO 8601, or JD/MJD text) with its scale beside it. Uses SKY.JD, "
         "SKY.MJD, SKY.TEXT.ISO, SKY.DELTAT and SKY.VERSION.", 9)
    header(sheet, 1, ["Time as typed", "Scale", "DUT1 (s)", "What it is", "JD (TT)",
                      "MJD (UTC)", "UTC (ISO text)", "TAI (ISO text)", "TDB (ISO text)",
                      "Delta T (s)"])
    first = 2
    rows = []
    for text, scale, what in TIME_CASES:
        rows.append((text, scale, 0.1 if scale == "UT1" else 0.0, what))
    last = first + len(rows) - 1
    sheet.getCellRangeByPosition(0, first, 3, last).setDataArray(tuple(rows))
    templates = [
        ('=SKY.JD(A{r};B{r};"TT";C{r})', "0.000000000"),
        ('=SKY.MJD(A{r};B{r};"UTC";C{r})', "0.000000000"),
        ('=SKY.TEXT.ISO(A{r};B{r};"UTC";C{r};3)', "@"),
        ('=SKY.TEXT.ISO(A{r};B{r};"TAI";C{r};3)', "@"),
        ('=SKY.TEXT.ISO(A{r};B{r};"TDB";C{r};6)', "@"),
        ("=SKY.DELTAT(A{r};B{r};C{r})", "0.000"),
    ]
    format_range(sheet, 2, first, last, number_format(doc, "0.0"))
    sheet.getCellRangeByPosition(2, first, 2, last).HoriJustify = CENTER  # DUT1
    for k, (t, code) in enumerate(templates):
        fill_formulas(sheet, 4 + k, first, last, t)
        format_range(sheet, 4 + k, first, last, number_format(doc, code))
        if code == "@":
            sheet.getCellRangeByPosition(4 + k, first, 4 + k, last).HoriJustify = RIGHT
    sheet.getCellByPosition(0, last + 2).setString("Computed by")
    sheet.getCellByPosition(1, last + 2).setFormula("=SKY.VERSION()")
    # JD to nine decimals needs 4.4 cm: narrower, Calc shows ### at some zooms.
    widths(sheet, [5.2, 1.4, 1.6, 8.8, 4.4, 4.2, 4.8, 4.8, 5.4, 2.4])


# Invented comparison fields of the circle's programme (names and places made up).
TARGETS = [
    ("Field K-1", "03 14 07.52", "+41 12 33.8"),
    ("Field K-2", "05h47m55.10s", "-07°18'02.4\""),
    ("Field K-3", "09:02:41.7", "+63:07:15"),
    ("Field K-4", "12 30 00.00", "-00 30 00.0"),
    ("Field K-5", "17h11m36.9s", "-26d44m10s"),
    ("Field K-6", "21:58:12.25", "+12:03:48.9"),
    ("Field K-7", "23 59 59.99", "+89 15 51"),
]


def angles(doc, sheet):
    note(sheet, 0,
         "The circle's comparison fields (invented positions), typed the ways observers "
         "write them, read into degrees and written back. Uses SKY.ANGLE.HOURS, "
         "SKY.ANGLE, SKY.TEXT.HMS, SKY.TEXT.DMS, SKY.WRAP.360 and SKY.WRAP.180.", 9)
    header(sheet, 1, ["Field", "RA as typed", "Dec as typed", "RA (deg)", "Dec (deg)",
                      "RA (HMS)", "Dec (DMS)", "RA + 200 deg, wrapped to 0-360 (deg)",
                      "RA wrapped to -180..180 (deg)"])
    first = 2
    last = first + len(TARGETS) - 1
    sheet.getCellRangeByPosition(0, first, 2, last).setDataArray(tuple(TARGETS))
    templates = [
        ("=SKY.ANGLE.HOURS(B{r})", "0.000000"),
        ("=SKY.ANGLE(C{r})", "0.000000"),
        ("=SKY.TEXT.HMS(D{r};2)", "@"),
        ("=SKY.TEXT.DMS(E{r};1)", "@"),
        ("=SKY.WRAP.360(D{r}+200)", "0.000000"),
        ("=SKY.WRAP.180(D{r})", "0.000000"),
    ]
    for k, (t, code) in enumerate(templates):
        fill_formulas(sheet, 3 + k, first, last, t)
        format_range(sheet, 3 + k, first, last, number_format(doc, code))
        if code == "@":  # sexagesimal text lines up with the degrees beside it
            sheet.getCellRangeByPosition(3 + k, first, 3 + k, last).HoriJustify = RIGHT
    widths(sheet, [2.4, 3.2, 3.2, 3.0, 3.0, 3.4, 3.4, 4.0, 4.0])


MODELS = ("IAU2006", "IAU1980", "NEWCOMB", "LASKAR1986", "VONDRAK2011")


def obliquity_models(doc, sheet):
    note(sheet, 0,
         "Mean obliquity of the ecliptic under five published formulas, 1000 to 2900 "
         "(where all five are valid), in arcseconds and as differences from IAU 2006. Epochs are Julian "
         "years of TT given as MJD text. Uses SKY.OBLIQUITY with its model and unit "
         "arguments.", 11)
    header(sheet, 1, ["Year (TT)", "Time (TT, as MJD text)"] + [f'{m} (")' for m in MODELS]
           + [f"{m} - IAU2006 (\")" for m in MODELS[1:]])
    years = list(range(1000, 2901, 100))  # where all five formulas are valid
    first = 2
    last = first + len(years) - 1
    rows = []
    for y in years:
        mjd = 51544.5 + (y - 2000) * 365.25
        rows.append((float(y), f"MJD {mjd:.2f}"))
    sheet.getCellRangeByPosition(0, first, 1, last).setDataArray(tuple(rows))
    sheet.getCellRangeByPosition(1, first, 1, last).HoriJustify = RIGHT
    for k, m in enumerate(MODELS):
        fill_formulas(sheet, 2 + k, first, last, f'=SKY.OBLIQUITY(B{{r}};"TT";"{m}";"ARCSEC")')
        format_range(sheet, 2 + k, first, last, number_format(doc, "0.000"))
    for k, m in enumerate(MODELS[1:]):
        col = 2 + len(MODELS) + k
        fill_formulas(sheet, col, first, last, f"={column_letter(3 + k)}{{r}}-C{{r}}")
        format_range(sheet, col, first, last, number_format(doc, "0.000"))

    # The long-term formulas over the range where only they apply.
    start = last + 3
    sheet.getCellByPosition(0, start - 1).setString(
        "Long-term formulas only (the IAU polynomials are not valid this far out):")
    header(sheet, start, ["Year (TT)", "Time (TT, as MJD text)", 'LASKAR1986 (")',
                          'VONDRAK2011 (")', 'VONDRAK2011 - LASKAR1986 (")', "VONDRAK2011 (deg)"])
    long_years = list(range(-8000, 12001, 1000))
    lf, ll = start + 1, start + len(long_years)
    sheet.getCellRangeByPosition(0, lf, 1, ll).setDataArray(
        tuple((float(y), f"MJD {51544.5 + (y - 2000) * 365.25:.2f}") for y in long_years)
    )
    sheet.getCellRangeByPosition(1, lf, 1, ll).HoriJustify = RIGHT
    fill_formulas(sheet, 2, lf, ll, '=SKY.OBLIQUITY(B{r};"TT";"LASKAR1986";"ARCSEC")')
    fill_formulas(sheet, 3, lf, ll, '=SKY.OBLIQUITY(B{r};"TT";"VONDRAK2011";"ARCSEC")')
    fill_formulas(sheet, 4, lf, ll, "=D{r}-C{r}")
    fill_formulas(sheet, 5, lf, ll, '=SKY.OBLIQUITY(B{r};"TT";"VONDRAK2011")')
    for col, code in ((2, "0.000"), (3, "0.000"), (4, "0.000"), (5, "0.000000")):
        format_range(sheet, col, lf, ll, number_format(doc, code))
    widths(sheet, [2.2, 3.4] + [3.2] * 9)  # room for VONDRAK2011 in a header


BAD_INPUT = [
    ('=SKY.JD("2025-13-01")', "a month that does not exist"),
    ('=SKY.JD("2025-10-05T24:00:01")', "a clock time past midnight"),
    ('=SKY.JD("2015-06-29T23:59:60")', "a leap second on a day without one"),
    ('=SKY.JD("1955-06-01")', "UTC before 1960 (not yet supported)"),
    ('=SKY.JD("tomorrow")', "text that is not a time"),
    ('=SKY.JD(2460000)', "a JD typed as a number where a date-time is expected"),
    ('=SKY.OBLIQUITY(B2;;"IAU2007")', "a model name that does not exist"),
    ('=SKY.OBLIQUITY("JD 1000000";"TT")', "a date outside the default model's validity"),
    ('=SKY.ANGLE("12h30d")', "an angle mixing hours and degrees"),
    ('=SKY.TEXT.DMS(23.5;12)', "too many decimals"),
]


def bad_input(doc, sheet):
    note(sheet, 0,
         "What a cell says when the input is wrong: a short text starting with #SKY: that "
         "names the problem and what is accepted. The other rows and cells keep working. "
         "Uses SKY.JD, SKY.OBLIQUITY, SKY.ANGLE and SKY.TEXT.DMS.", 3)
    header(sheet, 1, ["Formula", "Why it cannot be computed", "What the cell shows"])
    sheet.getCellByPosition(1, 1).setString("Why it cannot be computed")
    for k, (formula, why) in enumerate(BAD_INPUT):
        r = 2 + k
        sheet.getCellByPosition(0, r).setString(formula)
        sheet.getCellByPosition(1, r).setString(why)
        sheet.getCellByPosition(2, r).setFormula(formula)
    widths(sheet, [7.0, 9.0, 22.0])


# ---- target_list.ods: the circle's fields on one night at Curlew Staithe ---------------

SITE_NAME = "Curlew Staithe"
SITE_LATITUDE = 52.6  # degrees north, invented
SITE_LONGITUDE = 1.3  # degrees east, invented
SITE_HEIGHT = 25.0  # metres above the WGS84 ellipsoid, invented
# UTC; the Sun is more than 18 degrees below the horizon there from about 17:57 to 05:24
# (checked with astropy 8.0 get_sun for this site; not a test, only the choice of times)
NIGHT_START = datetime.datetime(2026, 11, 19, 18, 5)
NIGHT_MIDDLE = datetime.datetime(2026, 11, 20, 0, 0)  # UTC: the date of the "of date" systems
NIGHT_ROWS = 34  # every 20 minutes (+-3) from 18:05 to 05:05
NULL_DATE = datetime.datetime(1899, 12, 30)  # the default null date of a new document

# The comparison fields of the Angles sheet and three more (invented), with invented
# distances for the rectangular coordinates.
FIELDS = TARGETS + [
    ("Field K-8", "07 41 18.30", "+31 52 40.0"),
    ("Field K-9", "01h36m47.8s", "+15°47'00\""),
    ("Field K-10", "19:45:12.0", "+44:20:05"),
]
FIELD_DISTANCES_PC = (120.0, 450.0, 85.0, 1000.0, 2200.0, 310.0, 640.0, 95.0, 180.0, 1500.0)

# Invented fast-moving stars: position at J2016.0 (ICRS), proper motion in RA times
# cos(Dec) and in Dec (mas/yr), parallax (mas), radial velocity (km/s).
FAST_STARS = [
    ("Circle PM-1", "04 12 33.40", "+22 41 05.2", 1250.0, -3120.5, 210.4, 45.0),
    ("Circle PM-2", "10 55 12.08", "-07 19 44.6", -4480.2, 890.3, 395.0, -110.0),
    ("Circle PM-3", "16 02 47.91", "+58 30 12.7", 610.7, 2210.9, 88.2, 12.5),
    ("Circle PM-4", "22 47 05.66", "+03 11 58.0", -95.4, -1502.0, 61.7, 260.0),
]

RIGHT = uno.Enum("com.sun.star.table.CellHoriJustify", "RIGHT")
CENTER = uno.Enum("com.sun.star.table.CellHoriJustify", "CENTER")

SITE_NAMES = {  # named cells on the Site sheet, so formulas read as what they mean
    "SiteLat": 3, "SiteLon": 4, "SiteHeight": 5, "NightDate": 7,
}


def _serial(moment):
    """A Calc date-time value (days since the default null date) of a UTC datetime."""
    return (moment - NULL_DATE).total_seconds() / 86400.0


def fill_shifted(sheet, col, first_row, last_row, template, source_first):
    """Like fill_formulas, with {t} for the 1-based row of the same item in a table
    that starts at 0-based row ``source_first`` (another block or sheet)."""
    rng = sheet.getCellRangeByPosition(col, first_row, col, last_row)
    rng.setFormulaArray(tuple(
        (template.format(r=r + 1, t=source_first + (r - first_row) + 1),)
        for r in range(first_row, last_row + 1)
    ))


def _columns(doc, sheet, first, last, start_col, columns, source_first=None, right=True):
    """Fill (template, number format) columns from ``start_col``; right-aligned, so that
    sexagesimal text and words such as "below horizon" line up with the numbers."""
    for k, (template, code) in enumerate(columns):
        col = start_col + k
        if source_first is None:
            fill_formulas(sheet, col, first, last, template)
        else:
            fill_shifted(sheet, col, first, last, template, source_first)
        format_range(sheet, col, first, last, number_format(doc, code))
        if right:
            sheet.getCellRangeByPosition(col, first, col, last).HoriJustify = RIGHT


def site_sheet(doc, sheet):
    note(sheet, 0,
         f"Saltmarsh Variable Star Circle: the night of 19-20 November 2026 at its {SITE_NAME} "
         "field site. The site and its coordinates are INVENTED (they are not those of any "
         "real observatory). The other sheets read the site and the date from the named cells "
         "SiteLat, SiteLon, SiteHeight and NightDate here: change them and the whole workbook "
         "follows. Uses SKY.TEXT.DMS, SKY.TEXT.ISO, SKY.SIDEREAL (GAST, GMST, ERA), "
         "SKY.TEXT.HMS and SKY.VERSION.", 4)
    sheet.getRows().getByIndex(0).Height = 1900  # three lines of note
    header(sheet, 1, ["Item", "Value", "As written", "About it"])
    rows = [
        ("Site", SITE_NAME, "", "an invented field site of the circle"),
        ("Latitude (deg, north +)", SITE_LATITUDE, "=SKY.TEXT.DMS(B4;0)",
         "geodetic (WGS84), invented  [named SiteLat]"),
        ("Longitude (deg, east +)", SITE_LONGITUDE, "=SKY.TEXT.DMS(B5;0)",
         "east positive, as the functions take it; invented  [named SiteLon]"),
        ("Height (m)", SITE_HEIGHT, "", "above the WGS84 ellipsoid, invented  [named SiteHeight]"),
        ("Start of the night's plan (UTC)", _serial(NIGHT_START), "=SKY.TEXT.ISO(B7;;;;0)",
         "after astronomical dusk at the site (the Sun 18 degrees below the horizon)"),
        ("Date of the night (UTC)", _serial(NIGHT_MIDDLE), '=SKY.TEXT.ISO(B8;"UTC";"TT";;3)',
         "as TT beside it; the date of the DATE and TRUE systems and of precession and "
         "proper motion (they need a time within 1000-3000)  [named NightDate]"),
        ("Local apparent sidereal time then (h)", '=SKY.SIDEREAL(B8;;"GAST";B5;"HOURS")',
         "=SKY.TEXT.HMS(B9*15;1)", "GAST plus the site's east longitude; DUT1 taken as 0"),
        ("Greenwich apparent sidereal time (h)", '=SKY.SIDEREAL(B8;;"GAST";;"HOURS")',
         "=SKY.TEXT.HMS(B10*15;1)", "IAU 2006/2000A"),
        ("Greenwich mean sidereal time (h)", '=SKY.SIDEREAL(B8;;"GMST";;"HOURS")',
         "=SKY.TEXT.HMS(B11*15;1)", "IAU 2006; GAST - GMST is the equation of the equinoxes"),
        ("Earth rotation angle (deg)", '=SKY.SIDEREAL(B8;;"ERA")', "=SKY.TEXT.DMS(B12;1)",
         "IAU 2000"),
        ("Equation of the equinoxes (s of time)", "=(B10-B11)*3600", "",
         "GAST - GMST: mainly the nutation in longitude times cos(obliquity); at most about 1.1 s"),
        ("Computed by", "=SKY.VERSION()", "", "the add-in and ERFA versions, for the record"),
    ]
    for k, row in enumerate(rows):
        r = 2 + k
        for c, v in enumerate(row):
            cell = sheet.getCellByPosition(c, r)
            if isinstance(v, float):
                cell.setValue(v)
            elif v.startswith("="):
                cell.setFormula(v)
            else:
                cell.setString(v)
    for r, code in ((3, "+0.0000;-0.0000"), (4, "+0.0000;-0.0000"), (5, "0.0"),
                    (6, "YYYY-MM-DD HH:MM:SS"), (7, "YYYY-MM-DD HH:MM:SS"), (8, "0.000000"),
                    (9, "0.000000"), (10, "0.000000"), (11, "0.00000"), (12, "+0.000;-0.000")):
        sheet.getCellByPosition(1, r).NumberFormat = number_format(doc, code)
    # Centred, so the text stands apart from the number before it and the words after it.
    sheet.getCellRangeByPosition(2, 2, 2, 2 + len(rows) - 1).HoriJustify = CENTER
    widths(sheet, [7.2, 5.0, 5.4, 16.0])
    origin = uno.createUnoStruct("com.sun.star.table.CellAddress")
    for name, row in SITE_NAMES.items():
        doc.NamedRanges.addNewByName(name, f"$Site.$B${row + 1}", origin, 0)


TARGET_FIRST = 2  # 0-based row of Field K-1 on the Targets sheet


def targets_sheet(doc, sheet):
    n = len(FIELDS)
    note(sheet, 0,
         "The fields for the night (invented positions), ICRS RA and Dec typed as text and read "
         "with SKY.ANGLE.HOURS and SKY.ANGLE, then the same directions in other systems with "
         "SKY.COORD.LON and SKY.COORD.LAT: ecliptic of J2000, mean ecliptic and equinox of the "
         "night, true equinox of the night, galactic, the solar system's invariable plane, and "
         "the true equator and equinox of the night (SKY.TEXT.HMS, SKY.TEXT.DMS). Below: "
         "rectangular ecliptic coordinates with a distance (SKY.COORD.X/Y/Z) and back "
         "(SKY.RECT.LON/LAT/DIST), and separations and position angles from Field K-1 "
         "(SKY.SEPARATION, SKY.POSITION.ANGLE). The date is NightDate on the Site sheet.", 17)
    sheet.getRows().getByIndex(0).Height = 1900
    header(sheet, 1, [
        "Field", "RA (ICRS) as typed", "Dec (ICRS) as typed", "RA (deg)", "Dec (deg)",
        "Ecliptic lon, J2000 (deg)", "Ecliptic lat, J2000 (deg)",
        "Ecliptic lon, mean of the night (deg)", "Ecliptic lat, mean of the night (deg)",
        "Ecliptic lon, true equinox of the night (deg)", "Ecliptic lat, true equinox (deg)",
        "Galactic l (deg)", "Galactic b (deg)", "Invariable-plane lon (deg)",
        "Invariable-plane lat (deg)", "RA, true equator and equinox of the night (HMS)",
        "Dec, true equator of the night (DMS)",
    ])
    first, last = TARGET_FIRST, TARGET_FIRST + n - 1
    sheet.getCellRangeByPosition(0, first, 2, last).setDataArray(tuple(FIELDS))
    deg = "0.000000"
    _columns(doc, sheet, first, last, 3, [
        ("=SKY.ANGLE.HOURS(B{r})", deg),
        ("=SKY.ANGLE(C{r})", "+0.000000;-0.000000"),
        ('=SKY.COORD.LON(D{r};E{r};"ICRS";"ECLIPTIC J2000")', deg),
        ('=SKY.COORD.LAT(D{r};E{r};"ICRS";"ECLIPTIC J2000")', "+0.000000;-0.000000"),
        ('=SKY.COORD.LON(D{r};E{r};"ICRS";"ECLIPTIC DATE";NightDate)', deg),
        ('=SKY.COORD.LAT(D{r};E{r};"ICRS";"ECLIPTIC DATE";NightDate)', "+0.000000;-0.000000"),
        ('=SKY.COORD.LON(D{r};E{r};"ICRS";"ECLIPTIC TRUE";NightDate)', deg),
        ('=SKY.COORD.LAT(D{r};E{r};"ICRS";"ECLIPTIC TRUE";NightDate)', "+0.000000;-0.000000"),
        ('=SKY.COORD.LON(D{r};E{r};"ICRS";"GALACTIC")', deg),
        ('=SKY.COORD.LAT(D{r};E{r};"ICRS";"GALACTIC")', "+0.000000;-0.000000"),
        ('=SKY.COORD.LON(D{r};E{r};"ICRS";"INVARIABLE")', deg),
        ('=SKY.COORD.LAT(D{r};E{r};"ICRS";"INVARIABLE")', "+0.000000;-0.000000"),
        ('=SKY.TEXT.HMS(SKY.COORD.LON(D{r};E{r};"ICRS";"EQUATORIAL TRUE";NightDate);2)', "@"),
        ('=SKY.TEXT.DMS(SKY.COORD.LAT(D{r};E{r};"ICRS";"EQUATORIAL TRUE";NightDate);1)', "@"),
    ])

    # Rectangular ecliptic J2000 coordinates and pairs, one row per field again.
    title = last + 2
    sheet.getCellByPosition(0, title).setString(
        "Rectangular ecliptic J2000 coordinates (x toward the J2000 equinox, z toward the "
        "ecliptic pole) for an invented distance, and back; separation and position angle "
        "(north through east, ICRS) of each field from Field K-1.")
    header(sheet, title + 1, [
        "Field", "Distance (pc, invented)", "x (pc)", "y (pc)", "z (pc)",
        "Lon back from x, y, z (deg)", "Lat back (deg)", "Distance back (pc)",
        "Round trip vs ecliptic J2000 above (micro-arcsec)", "Separation from K-1 (deg)",
        "Separation from K-1 (DMS)", "Position angle from K-1 (deg)",
        "Separation from galactic l, b minus from RA, Dec (micro-arcsec)",
    ])
    rfirst, rlast = title + 2, title + 1 + n
    sheet.getCellRangeByPosition(1, rfirst, 1, rlast).setDataArray(
        tuple((d,) for d in FIELD_DISTANCES_PC))
    format_range(sheet, 1, rfirst, rlast, number_format(doc, "0.0"))
    k1 = TARGET_FIRST + 1
    _columns(doc, sheet, rfirst, rlast, 0, [("=A{t}", "@")], source_first=first, right=False)
    _columns(doc, sheet, rfirst, rlast, 2, [
        ('=SKY.COORD.X($D{t};$E{t};"ICRS";"ECLIPTIC J2000";B{r})', "+0.000;-0.000"),
        ('=SKY.COORD.Y($D{t};$E{t};"ICRS";"ECLIPTIC J2000";B{r})', "+0.000;-0.000"),
        ('=SKY.COORD.Z($D{t};$E{t};"ICRS";"ECLIPTIC J2000";B{r})', "+0.000;-0.000"),
        ("=SKY.RECT.LON(C{r};D{r};E{r})", deg),
        ("=SKY.RECT.LAT(C{r};D{r};E{r})", "+0.000000;-0.000000"),
        ("=SKY.RECT.DIST(C{r};D{r};E{r})", "0.000000"),
        ("=SKY.SEPARATION(F{r};G{r};F{t};G{t})*3600000000", "0.000"),
        (f"=SKY.SEPARATION($D${k1};$E${k1};D{{t}};E{{t}})", deg),
        ('=SUBSTITUTE(SKY.TEXT.DMS(J{r};1);"+";"")', "@"),
        (f"=SKY.POSITION.ANGLE($D${k1};$E${k1};D{{t}};E{{t}})", "0.0000"),
        (f"=(SKY.SEPARATION($L${k1};$M${k1};L{{t}};M{{t}})-J{{r}})*3600000000", "0.000"),
    ], source_first=first)
    widths(sheet, [2.4, 3.0, 3.2, 3.2, 3.0, 3.0, 3.0, 3.0, 3.2, 3.0, 3.0, 2.8, 3.0, 3.0,
                   3.0, 3.6, 3.4])


def precession_sheet(doc, sheet):
    n = len(FIELDS)
    note(sheet, 0,
         "Mean places precessed (no nutation, no proper motion) from the equator and equinox of "
         "J2000.0 to those of the night and of about 3000 BCE, with SKY.PRECESS.RA and "
         "SKY.PRECESS.DEC: model AUTO (IAU 2006 within 1000-3000, otherwise Vondrak et al. "
         "2011) against VONDRAK2011, and against SKY.COORD from EQUATORIAL J2000 to "
         "EQUATORIAL DATE. Below: invented fast-moving stars carried from J2016.0 to the night "
         "by their proper motion, parallax and radial velocity (SKY.PROPER.RA, SKY.PROPER.DEC), "
         "with SKY.SEPARATION, SKY.POSITION.ANGLE, SKY.JD, SKY.ANGLE.HOURS, SKY.ANGLE, "
         "SKY.TEXT.HMS and SKY.TEXT.DMS.", 17)
    sheet.getRows().getByIndex(0).Height = 1900
    # The three epochs, in D2:D4 (the formulas below refer to them).
    params = [("Equinox of the catalogue positions", "J2000.0"),
              ("This year: NightDate (UTC, Site sheet)", "=NightDate"),
              ("About 3000 BCE (Julian epoch -2999.0)", "J-2999.0")]
    for k, (label, value) in enumerate(params):
        sheet.getCellByPosition(0, 1 + k).setString(label)
        sheet.getCellRangeByPosition(0, 1 + k, 2, 1 + k).merge(True)
        cell = sheet.getCellByPosition(3, 1 + k)
        if value.startswith("="):
            cell.setFormula(value)
            cell.NumberFormat = number_format(doc, "YYYY-MM-DD HH:MM")
        else:
            cell.setString(value)
        cell.HoriJustify = RIGHT
    header(sheet, 4, [
        "Field", "RA J2000 (deg)", "Dec J2000 (deg)", "RA of the night, AUTO (deg)",
        "Dec of the night, AUTO (deg)", "RA of the night, VONDRAK2011 (deg)",
        "Dec of the night, VONDRAK2011 (deg)", "AUTO vs VONDRAK2011 (mas)",
        "SKY.COORD EQ J2000 to EQ DATE vs AUTO (mas)", "RA 3000 BCE, AUTO (deg)",
        "Dec 3000 BCE, AUTO (deg)", "RA 3000 BCE, VONDRAK2011 (deg)",
        "Dec 3000 BCE, VONDRAK2011 (deg)", "AUTO vs VONDRAK2011 at 3000 BCE (mas)",
        "RA 3000 BCE (HMS)", "Dec 3000 BCE (DMS)", "Moved since J2000 (deg)",
    ])
    first, last = 5, 5 + n - 1
    deg, sdeg = "0.000000", "+0.000000;-0.000000"
    _columns(doc, sheet, first, last, 0, [
        ("=$Targets.A{t}", "@"),
    ], source_first=TARGET_FIRST, right=False)
    _columns(doc, sheet, first, last, 1, [
        ("=$Targets.D{t}", deg), ("=$Targets.E{t}", sdeg),
    ], source_first=TARGET_FIRST)
    coord = '"EQUATORIAL J2000";"EQUATORIAL DATE";$D$3'
    _columns(doc, sheet, first, last, 3, [
        ('=SKY.PRECESS.RA(B{r};C{r};$D$2;$D$3;"UTC";"AUTO")', deg),
        ('=SKY.PRECESS.DEC(B{r};C{r};$D$2;$D$3;"UTC";"AUTO")', sdeg),
        ('=SKY.PRECESS.RA(B{r};C{r};$D$2;$D$3;"UTC";"VONDRAK2011")', deg),
        ('=SKY.PRECESS.DEC(B{r};C{r};$D$2;$D$3;"UTC";"VONDRAK2011")', sdeg),
        ("=SKY.SEPARATION(D{r};E{r};F{r};G{r})*3600000", "0.000"),
        (f"=SKY.SEPARATION(SKY.COORD.LON(B{{r}};C{{r}};{coord});"
         f"SKY.COORD.LAT(B{{r}};C{{r}};{coord});D{{r}};E{{r}})*3600000", "0.000"),
        ('=SKY.PRECESS.RA(B{r};C{r};$D$2;$D$4;;"AUTO")', deg),
        ('=SKY.PRECESS.DEC(B{r};C{r};$D$2;$D$4;;"AUTO")', sdeg),
        ('=SKY.PRECESS.RA(B{r};C{r};$D$2;$D$4;;"VONDRAK2011")', deg),
        ('=SKY.PRECESS.DEC(B{r};C{r};$D$2;$D$4;;"VONDRAK2011")', sdeg),
        ("=SKY.SEPARATION(J{r};K{r};L{r};M{r})*3600000", "0.000"),
        ("=SKY.TEXT.HMS(J{r};1)", "@"),
        ("=SKY.TEXT.DMS(K{r};0)", "@"),
        ("=SKY.SEPARATION(B{r};C{r};J{r};K{r})", "0.000"),
    ])

    title = last + 2
    sheet.getCellByPosition(0, title).setString(
        "Invented fast-moving stars: ICRS place at J2016.0, carried to the night (epoch text "
        "J2016.0 is TT; the night is a UTC date-time, hence scale UTC).")
    header(sheet, title + 1, [
        "Star", "RA J2016.0 as typed", "Dec J2016.0 as typed", "RA J2016.0 (deg)",
        "Dec J2016.0 (deg)", "Proper motion in RA x cos Dec (mas/yr)",
        "Proper motion in Dec (mas/yr)", "Parallax (mas)", "Radial velocity (km/s)",
        "RA on the night (deg)", "Dec on the night (deg)", "RA on the night (HMS)",
        "Dec on the night (DMS)", "Moved (arcsec)",
        "Proper motion x years since J2016.0 (arcsec)", "Direction moved (position angle, deg)",
        "Direction of the proper motion (deg)", "Left out parallax and RV: difference (mas)",
    ])
    sfirst, slast = title + 2, title + 1 + len(FAST_STARS)
    sheet.getCellRangeByPosition(0, sfirst, 2, slast).setDataArray(
        tuple(s[:3] for s in FAST_STARS))
    sheet.getCellRangeByPosition(5, sfirst, 8, slast).setDataArray(
        tuple(s[3:] for s in FAST_STARS))
    for col, code in ((5, "+0.0;-0.0"), (6, "+0.0;-0.0"), (7, "0.0"), (8, "+0.0;-0.0")):
        format_range(sheet, col, sfirst, slast, number_format(doc, code))
    motion = 'D{r};E{r};F{r};G{r};"J2016.0";$D$3;"UTC"'
    _columns(doc, sheet, sfirst, slast, 3, [
        ("=SKY.ANGLE.HOURS(B{r})", deg),
        ("=SKY.ANGLE(C{r})", sdeg),
    ])
    _columns(doc, sheet, sfirst, slast, 9, [
        (f"=SKY.PROPER.RA({motion};H{{r}};I{{r}})", deg),
        (f"=SKY.PROPER.DEC({motion};H{{r}};I{{r}})", sdeg),
        ("=SKY.TEXT.HMS(J{r};3)", "@"),
        ("=SKY.TEXT.DMS(K{r};2)", "@"),
        ("=SKY.SEPARATION(D{r};E{r};J{r};K{r})*3600", "0.0000"),
        # J2016.0 is JD 2457389.0 (TT) by the definition of Julian epochs.
        ('=SQRT(F{r}^2+G{r}^2)/1000*(SKY.JD($D$3;"UTC";"TT")-2457389)/365.25', "0.0000"),
        ("=SKY.POSITION.ANGLE(D{r};E{r};J{r};K{r})", "0.0000"),
        ("=MOD(DEGREES(ATAN2(G{r};F{r}));360)", "0.0000"),
        (f"=SKY.SEPARATION(J{{r}};K{{r}};SKY.PROPER.RA({motion});SKY.PROPER.DEC({motion}))"
         "*3600000", "0.000"),
    ])
    widths(sheet, [3.0, 3.0, 3.0, 3.8] + [3.3] * 14)  # room for VONDRAK2011 in a header


def invented_night(seed=20261119):
    """A night's pointings: about every 20 minutes from dusk to dawn, round the fields in
    turn, with the barometer and thermometer read at each (pressure falling slowly,
    the air cooling)."""
    rng = random.Random(seed)
    start = _serial(NIGHT_START)
    rows = []
    for k in range(NIGHT_ROWS):
        t = start + (k * 20.0 + rng.uniform(-3.0, 3.0)) / 1440.0
        t = round(t * 86400.0) / 86400.0
        frac = k / (NIGHT_ROWS - 1)
        pressure = round(1016.4 - 3.5 * frac + rng.uniform(-0.2, 0.2), 1)
        temperature = round(5.8 - 5.4 * frac + rng.uniform(-0.3, 0.3), 1)
        field = FIELDS[k % len(FIELDS)][0]
        rows.append((float(k + 1), t, rng.choice(OBSERVERS), field, pressure, temperature))
    return rows


NIGHT_COLUMNS = [
    # (header, formula template, number format, width cm); from column I on
    ("Local sidereal time (h)", '=SKY.SIDEREAL(B{r};;;SiteLon;"HOURS")', "0.00000", 2.4),
    ("Local sidereal time (HMS)", "=SKY.TEXT.HMS(I{r}*15;1)", "@", 2.8),
    ("Hour angle (deg, west +)", "=SKY.HOURANGLE(E{r};F{r};B{r};SiteLat;SiteLon;;SiteHeight)",
     "+0.0000;-0.0000", 2.4),
    ("Hour angle (h)", "=K{r}/15", "+0.0000;-0.0000", 2.0),
    ("Altitude, no refraction (deg)",
     "=SKY.HORIZON.ALT(E{r};F{r};B{r};SiteLat;SiteLon;;SiteHeight)", "+0.0000;-0.0000", 2.4),
    ("Azimuth, no refraction (deg)",
     "=SKY.HORIZON.AZ(E{r};F{r};B{r};SiteLat;SiteLon;;SiteHeight)", "0.0000", 2.4),
    # ERFA's refraction model is refused below 5 degrees: lower targets say "low".
    ("Altitude, refracted (deg)",
     '=IF(M{r}>5;SKY.HORIZON.ALT(E{r};F{r};B{r};SiteLat;SiteLon;;SiteHeight;G{r};H{r});"low")',
     "+0.0000;-0.0000", 2.4),
    ("Azimuth, refracted (deg)",
     '=IF(M{r}>5;SKY.HORIZON.AZ(E{r};F{r};B{r};SiteLat;SiteLon;;SiteHeight;G{r};H{r});"low")',
     "0.0000", 2.4),
    ("Refraction (arcmin)", '=IF(ISNUMBER(O{r});(O{r}-M{r})*60;"low")', "0.00", 2.8),
    ("Altitude (DMS)", "=SKY.TEXT.DMS(IF(ISNUMBER(O{r});O{r};M{r});0)", "@", 2.4),
    ("Azimuth (DMS)", '=SUBSTITUTE(SKY.TEXT.DMS(IF(ISNUMBER(P{r});P{r};N{r});0);"+";"")', "@", 2.6),
    ("Parallactic angle (deg)",
     "=SKY.PARALLACTIC(E{r};F{r};B{r};SiteLat;SiteLon;;SiteHeight)", "+0.00;-0.00", 2.2),
    ("Air mass", '=IF(M{r}>0;SKY.AIRMASS(IF(ISNUMBER(O{r});O{r};M{r}));"below horizon")',
     "0.000", 2.8),
    ("RA back from refracted az, alt (deg)",
     '=IF(ISNUMBER(O{r});SKY.HORIZON.RA(P{r};O{r};B{r};SiteLat;SiteLon;;SiteHeight;G{r};H{r});'
     '"low")', "0.000000", 2.8),
    ("Dec back from refracted az, alt (deg)",
     '=IF(ISNUMBER(O{r});SKY.HORIZON.DEC(P{r};O{r};B{r};SiteLat;SiteLon;;SiteHeight;G{r};H{r});'
     '"low")', "+0.000000;-0.000000", 2.8),
    ("Back vs catalogue (mas)",
     '=IF(ISNUMBER(O{r});SKY.SEPARATION(V{r};W{r};E{r};F{r})*3600000;"low")', "0.000", 2.8),
]


def night_sheet(doc, sheet, night):
    cols = 6 + 2 + len(NIGHT_COLUMNS)
    note(sheet, 0,
         f"The night's pointings at {SITE_NAME} (invented site: SiteLat, SiteLon, SiteHeight on "
         "the Site sheet), times in UTC. RA and Dec come from the Targets sheet (VLOOKUP). For "
         "each: local apparent sidereal time (SKY.SIDEREAL with the site longitude, unit HOURS; "
         "SKY.TEXT.HMS), hour angle (SKY.HOURANGLE), altitude and azimuth without and with "
         "refraction for the pressure and temperature read at the time (SKY.HORIZON.ALT, "
         "SKY.HORIZON.AZ; SKY.TEXT.DMS), parallactic angle (SKY.PARALLACTIC), air mass for "
         "targets above the horizon (SKY.AIRMASS), and the way back from azimuth and altitude "
         "to RA and Dec (SKY.HORIZON.RA, SKY.HORIZON.DEC), compared with the catalogue place "
         "(SKY.SEPARATION), for targets above the horizon. Refraction follows ERFA's model, "
         "meant for altitudes above about 5 degrees: below the horizon the refracted altitude "
         "has no meaning. DUT1 is taken as 0 (up to 0.9 s, about 14\" in hour angle).", cols)
    sheet.getRows().getByIndex(0).Height = 1900
    note(sheet, 1,
         "CAUTION: never look at the Sun through a telescope or binoculars, and never point "
         "optics at it or near it without a proper solar filter over the front of the "
         "instrument. Before dusk and after dawn, check where the Sun is before slewing.", cols)
    sheet.getRows().getByIndex(1).Height = 900
    sheet.getCellByPosition(0, 1).CharWeight = 150.0
    header(sheet, 2, ["No.", "Time (UTC)", "Observer", "Target", "RA (ICRS, deg)",
                      "Dec (ICRS, deg)", "Pressure (hPa)", "Temperature (deg C)"]
           + [c[0] for c in NIGHT_COLUMNS])
    first, last = 3, 3 + len(night) - 1
    sheet.getCellRangeByPosition(0, first, 3, last).setDataArray(
        tuple(row[:4] for row in night))
    sheet.getCellRangeByPosition(6, first, 7, last).setDataArray(
        tuple(row[4:] for row in night))
    format_range(sheet, 1, first, last, number_format(doc, "YYYY-MM-DD HH:MM:SS"))
    format_range(sheet, 6, first, last, number_format(doc, "0.0"))
    format_range(sheet, 7, first, last, number_format(doc, "+0.0;-0.0"))
    sheet.getCellRangeByPosition(2, first, 2, last).HoriJustify = CENTER  # observer
    table = f"$Targets.$A${TARGET_FIRST + 1}:$E${TARGET_FIRST + len(FIELDS)}"
    _columns(doc, sheet, first, last, 4, [
        (f"=VLOOKUP(D{{r}};{table};4;0)", "0.000000"),
        (f"=VLOOKUP(D{{r}};{table};5;0)", "+0.000000;-0.000000"),
    ])
    _columns(doc, sheet, first, last, 8, [(c[1], c[2]) for c in NIGHT_COLUMNS])
    widths(sheet, [1.0, 3.8, 2.2, 2.2, 2.4, 2.4, 2.0, 2.8] + [c[3] for c in NIGHT_COLUMNS])


# ---- historical_record.ods: an invented chronicle's dated sky events ------------------

SUN_CAUTION = (
    "CAUTION: never look at the Sun, and never point binoculars, a telescope or a camera "
    "at it or near it, without a proper solar filter made for that purpose over the front "
    "of the instrument. An eclipsed Sun is no safer: watch it projected onto card, or "
    "through a proper solar filter.")


def caution(sheet, row, cols):
    """The Sun caution as a bold note row, on every sheet about the Sun."""
    note(sheet, row, SUN_CAUTION, cols)
    sheet.getRows().getByIndex(row).Height = 900
    sheet.getCellByPosition(0, row).CharWeight = 150.0


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
    note(sheet, 0,
         "The Annals of Holmwray Abbey: an INVENTED chronicle (abbey, places, correspondents "
         "and entries are made up; the dates show the ways dates are written, they are not "
         "historical observations). Each entry's date is typed as its writer wrote it, with "
         "the time scale beside it: UT (universal time through Delta T) or LMT and the east "
         "longitude of the writer's place (local mean time). Dates before 1582-10-15 are "
         "read in the Julian calendar unless the text says Gregorian; \"Julian\" or "
         "\"cutover 1752-09-14\" in the text choose the calendar. Uses SKY.JD on TT and UT, "
         "SKY.TEXT.DATE (read back on the entry's own scale) and SKY.TEXT.ISO; the Calendars "
         "sheet writes the same instants in both calendars and both year numberings.", cols)
    sheet.getRows().getByIndex(0).Height = 1900
    caution(sheet, 1, cols)
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
    _columns(doc, sheet, first, last, 4, [
        ('=SKY.JD(B{r};C{r};"TT")', "0.00000"),
        ('=SKY.JD(B{r};C{r};"UT")', "0.00000"),
    ])
    fill_shifted(sheet, 6, first + 1, last, "=E{r}-E{t}", first)
    format_range(sheet, 6, first, last, number_format(doc, "#,##0.0000"))
    sheet.getCellRangeByPosition(6, first + 1, 6, last).HoriJustify = RIGHT
    _columns(doc, sheet, first, last, 7, [
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
    _columns(doc, sheet, first, last, 0, [
        ("=$Chronicle.A{t}", "0"), ("=$Chronicle.B{t}", "@"), ("=$Chronicle.C{t}", "@"),
    ], source_first=CHRONICLE_FIRST, right=False)
    sheet.getCellRangeByPosition(0, first, 0, last).HoriJustify = CENTER  # as on Chronicle
    _columns(doc, sheet, first, last, 3, [
        ('=SKY.TEXT.DATE(B{r};C{r};"UT";"JULIAN")', "@"),
        ('=SKY.TEXT.DATE(B{r};C{r};"UT";"GREGORIAN")', "@"),
        ('=SKY.TEXT.DATE(B{r};C{r};"UT";"JULIAN";"ASTRONOMICAL")', "@"),
        ('=SKY.TEXT.DATE(B{r};C{r};"UT";"GREGORIAN";"ASTRONOMICAL")', "@"),
    ], right=False)
    widths(sheet, [1.0, 7.6, 2.2, 6.4, 6.8, 6.2, 6.8])


def deltat_sheet(doc, sheet):
    cols = 16
    note(sheet, 0,
         "The chronicle's entries (Chronicle sheet) with what it takes to turn their clock "
         "times into instants: Delta T = TT - UT by the model of record (AUTO: Stephenson, "
         "Morrison and Hohenkerk 2016 before 1960) and by Espenak and Meeus 2006, and how far "
         "they differ; the published standard error of Delta T where there is one (Morrison "
         "and Stephenson 2004 for 1000 BC to AD 1200; 1700, 1800, 1900) and the uncertainty "
         "it gives a clock time and the longitude of an eclipse track; the mean obliquity of "
         "the ecliptic by the long-term formulas (Laskar 1986, Vondrak et al. 2011); and the "
         "Sun's apparent longitude (computed for 1000 to 3000 only). Uses SKY.DELTAT (models "
         "AUTO, SMH2016, ESPENAK2006), SKY.DELTAT.UNCERTAINTY, SKY.OBLIQUITY (LASKAR1986, "
         "VONDRAK2011), SKY.TEXT.DMS and SKY.SUN.LON.", cols)
    sheet.getRows().getByIndex(0).Height = 2300
    caution(sheet, 1, cols)
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
    _columns(doc, sheet, first, last, 0, [
        ("=$Chronicle.A{t}", "0"), ("=$Chronicle.B{t}", "@"), ("=$Chronicle.C{t}", "@"),
        ("=2000+($Chronicle.E{t}-2451545)/365.25", "0.0"),
    ], source_first=CHRONICLE_FIRST, right=False)
    sheet.getCellRangeByPosition(0, first, 0, last).HoriJustify = CENTER  # as on Chronicle
    none = '"none published"'
    _columns(doc, sheet, first, last, 4, [
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
        tuple((_serial(day), what) for day, what in UTC_STEPS))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    sheet.getCellRangeByPosition(0, first, 0, last).HoriJustify = CENTER  # apart from column B
    _columns(doc, sheet, first, last, 2, [
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


def historical_record_book(office, out_dir):
    doc = office.new_sheet()
    try:
        chronicle_sheet(doc, _sheet(doc, 0, "Chronicle"))
        calendars_sheet(doc, _sheet(doc, 1, "Calendars"))
        deltat_sheet(doc, _sheet(doc, 2, "Delta T and sky"))
        utc_1960s_sheet(doc, _sheet(doc, 3, "1960s UTC"))
        return _save(office, doc, out_dir, "historical_record.ods")
    finally:
        doc.close(True)


# ---- meteor_watch.ods: an invented club's meteor watches, nights and the Sun -----------

CLUB = "Tollmere Meteor Section"
WATCH_SITE = "Whinburn Common"
WATCH_LATITUDE = 54.62  # degrees north, invented
WATCH_LONGITUDE = -2.35  # degrees east (west negative), invented
WATCH_UTC_OFFSET = 0.0  # the section keeps its tables in UTC all year
NIGHTS_YEAR = 2027

# Showers the section watches, with the solar longitude (J2000) of their listed peaks:
# approximate values of the kind meteor-shower calendars give, from memory, for the
# example only.
SHOWERS = [
    ("QUA", "Quadrantids", 283.15),
    ("LYR", "Lyrids", 32.32),
    ("ETA", "eta Aquariids", 45.5),
    ("PER", "Perseids", 140.0),
    ("ORI", "Orionids", 208.0),
    ("LEO", "Leonids", 235.27),
    ("GEM", "Geminids", 262.2),
]
WATCH_OBSERVERS = ("HB", "JW", "LP", "SO", "TN")

# Invented watch periods in 2026 (UTC): shower, start, minutes, and a typical rate of
# shower meteors an hour for the invented counts.
WATCH_PLAN = [
    ("QUA", (2026, 1, 4, 2, 0), 90, 35), ("QUA", (2026, 1, 4, 3, 30), 90, 48),
    ("QUA", (2026, 1, 4, 4, 15), 75, 52),
    ("LYR", (2026, 4, 22, 22, 30), 90, 6), ("LYR", (2026, 4, 23, 0, 0), 90, 9),
    ("LYR", (2026, 4, 23, 1, 30), 75, 11),
    ("ETA", (2026, 5, 6, 1, 45), 60, 4),
    ("PER", (2026, 8, 11, 22, 0), 90, 18), ("PER", (2026, 8, 11, 23, 30), 90, 27),
    ("PER", (2026, 8, 12, 21, 45), 90, 30), ("PER", (2026, 8, 12, 23, 15), 90, 46),
    ("PER", (2026, 8, 13, 0, 45), 90, 58), ("PER", (2026, 8, 13, 22, 0), 90, 24),
    ("PER", (2026, 8, 14, 0, 0), 90, 19),
    ("ORI", (2026, 10, 21, 1, 0), 90, 9), ("ORI", (2026, 10, 21, 2, 30), 90, 13),
    ("LEO", (2026, 11, 17, 2, 30), 90, 7), ("LEO", (2026, 11, 17, 4, 0), 90, 10),
    ("GEM", (2026, 12, 13, 19, 30), 90, 28), ("GEM", (2026, 12, 13, 21, 0), 90, 44),
    ("GEM", (2026, 12, 13, 22, 30), 90, 55), ("GEM", (2026, 12, 14, 0, 0), 90, 62),
    ("GEM", (2026, 12, 14, 20, 0), 90, 38),
]


def invented_watches(seed=20260812):
    """(start, end, observer, shower, shower meteors, sporadic meteors) per watch."""
    rng = random.Random(seed)
    rows = []
    for shower, start, minutes, rate in WATCH_PLAN:
        t0 = _serial(datetime.datetime(*start))
        hours = minutes / 60.0
        count = max(0, round(rng.gauss(rate * hours, (rate * hours) ** 0.5)))
        sporadic = max(0, round(rng.gauss(7.0 * hours, 2.0)))
        rows.append((t0, t0 + minutes / 1440.0, rng.choice(WATCH_OBSERVERS), shower,
                     float(count), float(sporadic)))
    return rows


def watch_log_sheet(doc, sheet):
    watches = invented_watches()
    cols = 20
    note(sheet, 0,
         f"{CLUB} (an INVENTED club; observers, watches and counts are made up): the 2026 "
         "watch log, times in UTC, reduced to solar longitude as meteor work indexes showers "
         "(the Sun's apparent longitude on the ecliptic and equinox of J2000.0), and the "
         "instant next year when the Sun is back at the same solar longitude (the same point "
         "of the shower's year). Uses SKY.SUN.SOLARLON, SKY.SUN.REACHES, SKY.WRAP.180 and "
         "SKY.TEXT.ISO. Rates are plain counts per hour of watching (no correction for the "
         "radiant's altitude or the sky's limiting magnitude).", cols)
    sheet.getRows().getByIndex(0).Height = 1900
    caution(sheet, 1, cols)
    header(sheet, 2, [
        "No.", "Start (UTC)", "End (UTC)", "Observer", "Shower", "Shower meteors",
        "Sporadic meteors", "Watch (h)", "Shower meteors per hour", "Mid-time (UTC)",
        "Solar longitude at mid-time (deg, J2000)", "Solar longitude at start (deg)",
        "Solar longitude at end (deg)", "Longitude covered (deg)",
        "Listed peak longitude (deg)", "Mid-time from the peak (deg of solar longitude)",
        "Sun at the same longitude next year (UTC)", "Days later",
        "Later than the same calendar date and time next year (h)",
        "Next year's instant (ISO text, UTC)",
    ])
    first, last = 3, 3 + len(watches) - 1
    sheet.getCellRangeByPosition(0, first, 6, last).setDataArray(
        tuple((float(k + 1),) + w for k, w in enumerate(watches)))
    for col in (1, 2):
        format_range(sheet, col, first, last, number_format(doc, "YYYY-MM-DD HH:MM"))
    sheet.getCellRangeByPosition(3, first, 4, last).HoriJustify = CENTER
    table_first = last + 4  # 0-based row of the first shower in the table below
    table = f"$A${table_first + 1}:$C${table_first + len(SHOWERS)}"
    _columns(doc, sheet, first, last, 7, [
        ("=(C{r}-B{r})*24", "0.00"),
        ("=F{r}/H{r}", "0.0"),
        ("=(B{r}+C{r})/2", "YYYY-MM-DD HH:MM"),
        ("=SKY.SUN.SOLARLON(J{r})", "0.0000"),
        ("=SKY.SUN.SOLARLON(B{r})", "0.0000"),
        ("=SKY.SUN.SOLARLON(C{r})", "0.0000"),
        ("=SKY.WRAP.180(M{r}-L{r})", "0.0000"),
        (f"=VLOOKUP(E{{r}};{table};3;0)", "0.00"),
        ("=SKY.WRAP.180(K{r}-O{r})", "+0.000;-0.000"),
        # Searching from a day after the watch finds next year's crossing.
        ("=SKY.SUN.REACHES(K{r};J{r}+1)", "YYYY-MM-DD HH:MM:SS"),
        ("=Q{r}-J{r}", "0.0000"),
        ("=(Q{r}-DATE(YEAR(J{r})+1;MONTH(J{r});DAY(J{r}))-MOD(J{r};1))*24", "+0.00;-0.00"),
        ("=SKY.TEXT.ISO(Q{r};;;;1)", "@"),
    ])
    total = last + 1
    sheet.getCellByPosition(4, total).setString("Total")
    for col in (5, 6, 7):
        letter = column_letter(col)
        cell = sheet.getCellByPosition(col, total)
        cell.setFormula(f"=SUM({letter}{first + 1}:{letter}{last + 1})")
        cell.NumberFormat = number_format(doc, "0.00" if col == 7 else "0")

    sheet.getCellByPosition(0, table_first - 2).setString(
        "The showers: the solar longitude of each listed peak (approximate values of the kind "
        "shower calendars give, for the example) and when the Sun reaches it in "
        f"{NIGHTS_YEAR}.")
    header(sheet, table_first - 1, [
        "Code", "Name", "Listed peak (deg, J2000)", f"Sun reaches it in {NIGHTS_YEAR} (UTC)",
        "Watches in the log", "Shower meteors counted",
    ])
    tfirst, tlast = table_first, table_first + len(SHOWERS) - 1
    sheet.getCellRangeByPosition(0, tfirst, 2, tlast).setDataArray(tuple(SHOWERS))
    format_range(sheet, 2, tfirst, tlast, number_format(doc, "0.00"))
    log_codes = f"$E${first + 1}:$E${last + 1}"
    _columns(doc, sheet, tfirst, tlast, 3, [
        (f'=SKY.SUN.REACHES(C{{r}};"{NIGHTS_YEAR}-01-01T00:00:00Z")', "YYYY-MM-DD HH:MM"),
        (f"=COUNTIF({log_codes};A{{r}})", "0"),
        (f"=SUMIF({log_codes};A{{r}};$F${first + 1}:$F${last + 1})", "0"),
    ])
    widths(sheet, [1.2, 3.4, 3.4, 3.4, 2.0, 2.2, 2.0, 1.8, 2.2, 3.4, 2.6, 2.4, 2.4, 2.4,
                   2.4, 2.8, 4.2, 2.2, 3.0, 4.6])


NIGHTS_FIRST = 7  # 0-based row of January 1 on the Year of nights sheet


def year_of_nights_sheet(doc, sheet):
    cols = 12
    note(sheet, 0,
         f"Every night of {NIGHTS_YEAR} at the section's {WATCH_SITE} site (an INVENTED site "
         "and coordinates: SiteLat, SiteLon and UtcOffset are the named cells below; change "
         "them and the sheet follows). Times are UTC (offset 0): sunset and sunrise (upper "
         "limb on the horizon, standard refraction), the end and start of astronomical "
         "twilight (Sun 18 degrees below the horizon), the dark hours between them, the day "
         "length, the Sun's transit (local apparent noon) and the equation of time then, and "
         "the sundial (local apparent) time at sunset and at the transit, where it is 12:00 "
         "by definition (shown as the difference in seconds). In summer the Sun does not get 18 degrees "
         "below the horizon here: those cells say so in words and the night has no dark "
         "hours. Uses SKY.SUN.SET, SKY.SUN.RISE (events SUNRISE and ASTRONOMICAL), "
         "SKY.SUN.DAYLENGTH, SKY.SUN.TRANSIT, SKY.SUN.EQTIME and SKY.SUN.SUNDIAL.", cols)
    sheet.getRows().getByIndex(0).Height = 2300
    caution(sheet, 1, cols)
    params = [
        ("Latitude (deg, north +), invented  [SiteLat]", WATCH_LATITUDE, "+0.0000;-0.0000"),
        ("Longitude (deg, east +), invented  [SiteLon]", WATCH_LONGITUDE, "+0.0000;-0.0000"),
        ("Clock ahead of UTC (h)  [UtcOffset]", WATCH_UTC_OFFSET, "+0.0;-0.0"),
    ]
    origin = uno.createUnoStruct("com.sun.star.table.CellAddress")
    for k, (label, value, code) in enumerate(params):
        row = 2 + k
        sheet.getCellByPosition(0, row).setString(label)
        sheet.getCellRangeByPosition(0, row, 2, row).merge(True)
        cell = sheet.getCellByPosition(3, row)
        cell.setValue(value)
        cell.NumberFormat = number_format(doc, code)
        name = label.split("[")[1].rstrip("]")
        doc.NamedRanges.addNewByName(name, f"$'Year of nights'.$D${row + 1}", origin, 0)
    first, last = NIGHTS_FIRST, NIGHTS_FIRST + 364
    span = "{c}" + str(first + 1) + ":{c}" + str(last + 1)
    lines = [
        ("Dark hours in the year (h); nights with none",
         ("=SUM(" + span.format(c="F") + ")", "#,##0"),
         ("=SUMPRODUCT(ISTEXT(" + span.format(c="C") + "))", "0")),
        ("Longest and shortest day (h)",
         ("=MAX(" + span.format(c="G") + ")", "0.00"),
         ("=MIN(" + span.format(c="G") + ")", "0.00")),
        ("Equation of time, highest and lowest (min)",
         ("=MAX(" + span.format(c="I") + ")", "+0.00;-0.00"),
         ("=MIN(" + span.format(c="I") + ")", "+0.00;-0.00")),
    ]
    for k, (label, a, b) in enumerate(lines):
        row = 2 + k
        sheet.getCellByPosition(5, row).setString(label)
        sheet.getCellRangeByPosition(5, row, 7, row).merge(True)
        for col, (formula, code) in ((8, a), (9, b)):
            cell = sheet.getCellByPosition(col, row)
            cell.setFormula(formula)
            cell.NumberFormat = number_format(doc, code)
    header(sheet, 6, [
        "Date (UTC + UtcOffset)", "Sunset", "End of astronomical twilight (evening)",
        "Start of astronomical twilight (next morning)", "Sunrise (next morning)",
        "Dark hours (Sun below -18 deg)", "Day length, sunrise to sunset (h)",
        "Transit of the Sun (local apparent noon)", "Equation of time at the transit (min)",
        "Sundial time at sunset", "Sundial time at the transit minus 12:00 (s)",
        "Sunset to next sunrise (h)",
    ])
    start = _serial(datetime.datetime(NIGHTS_YEAR, 1, 1))
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(
        tuple((start + k,) for k in range(365)))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD DDD"))
    site = "SiteLat;SiteLon;;UtcOffset"
    _columns(doc, sheet, first, last, 1, [
        (f"=SKY.SUN.SET(A{{r}};{site})", "HH:MM:SS"),
        (f'=SKY.SUN.SET(A{{r}};{site};"ASTRONOMICAL")', "HH:MM:SS"),
        (f'=SKY.SUN.RISE(A{{r}}+1;{site};"ASTRONOMICAL")', "HH:MM:SS"),
        (f"=SKY.SUN.RISE(A{{r}}+1;{site})", "HH:MM:SS"),
        ("=IF(AND(ISNUMBER(C{r});ISNUMBER(D{r}));(D{r}-C{r})*24;0)", "0.00"),
        (f"=SKY.SUN.DAYLENGTH(A{{r}};{site})", "0.00"),
        (f"=SKY.SUN.TRANSIT(A{{r}};{site})", "HH:MM:SS"),
        # The transit is on the local clock; the Sun's functions take UTC.
        ("=SKY.SUN.EQTIME(H{r}-UtcOffset/24)", "+0.00;-0.00"),
        ("=SKY.SUN.SUNDIAL(B{r}-UtcOffset/24;SiteLon)", "HH:MM:SS"),
        ("=(MOD(SKY.SUN.SUNDIAL(H{r}-UtcOffset/24;SiteLon);1)-0.5)*86400", "+0.0000;-0.0000"),
        ("=(E{r}-B{r})*24", "0.00"),
    ])
    for col in (2, 3):
        sheet.getCellRangeByPosition(col, first, col, last).IsTextWrapped = True
    widths(sheet, [3.2, 2.0, 3.6, 3.6, 2.4, 2.4, 2.6, 2.8, 2.6, 2.6, 2.8, 2.6])


def seasons_sheet(doc, sheet):
    cols = 14
    note(sheet, 0,
         "Equinoxes and solstices of 2020 to 2035 (when the Sun's apparent longitude, true "
         "equinox of date, is 0, 90, 180 and 270 degrees), in UTC, and the lengths of the "
         "seasons they open (northern-hemisphere names). Uses SKY.SEASON (on UTC and TT), "
         "SKY.SEASON.LENGTH and SKY.SUN.LON (the Sun's longitude at the June solstice, "
         "90 degrees by definition).", cols)
    caution(sheet, 1, cols)
    header(sheet, 2, [
        "Year", "March equinox (UTC)", "June solstice (UTC)", "September equinox (UTC)",
        "December solstice (UTC)", "Spring, March to June (d)", "Summer, June to September (d)",
        "Autumn, September to December (d)", "Winter, December to March (d)",
        "Spring and summer minus autumn and winter (d)", "March equinox to the next (d)",
        "March equinox (TT)",
        "TT - UTC then (s)", "Sun's longitude at the June solstice (deg)",
    ])
    years = list(range(2020, 2036))
    first, last = 3, 3 + len(years) - 1
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(tuple((float(y),) for y in years))
    when = "YYYY-MM-DD HH:MM:SS"
    _columns(doc, sheet, first, last, 1, [
        ('=SKY.SEASON(A{r};"MARCH")', when),
        ('=SKY.SEASON(A{r};"JUNE")', when),
        ('=SKY.SEASON(A{r};"SEPTEMBER")', when),
        ('=SKY.SEASON(A{r};"DECEMBER")', when),
        ('=SKY.SEASON.LENGTH(A{r};"MARCH")', "0.0000"),
        ('=SKY.SEASON.LENGTH(A{r};"JUNE")', "0.0000"),
        ('=SKY.SEASON.LENGTH(A{r};"SEPTEMBER")', "0.0000"),
        ('=SKY.SEASON.LENGTH(A{r};"DECEMBER")', "0.0000"),
        # The northern spring and summer are longer: the Earth is near aphelion then.
        ("=(F{r}+G{r})-(H{r}+I{r})", "+0.0000;-0.0000"),
        ('=SKY.SEASON(A{r}+1;"MARCH")-B{r}', "0.0000"),
        ('=SKY.SEASON(A{r};"MARCH";"TT")', when),
        ("=(L{r}-B{r})*86400", "0.000"),
        ("=SKY.SUN.LON(C{r})", "0.000000"),
    ])
    widths(sheet, [1.4, 4.2, 4.2, 4.2, 4.2, 2.4, 2.4, 2.4, 2.4, 2.8, 2.6, 4.2, 2.2, 3.0])


# Invented marker directions (ICRS) for the elongation block: one near the Sun in late
# March, one at quadrature, one near opposition.
SUN_MARKERS = [
    ("Marker A", "00h20m00s", "+05°30'00\""),
    ("Marker B", "06h30m00s", "+23°00'00\""),
    ("Marker C", "13h05m00s", "-06°30'00\""),
]
SUN_MONTH = (NIGHTS_YEAR, 3)


def sun_sheet(doc, sheet):
    cols = 22
    note(sheet, 0,
         f"The Sun at 00:00 UTC on each day of March {SUN_MONTH[0]}, geocentric: ecliptic "
         "longitude and latitude, right ascension and declination in the frames TRUE (true "
         "equator and equinox of date, as almanacs give apparent places), DATE (mean equinox "
         "of date) and J2000, and the kinds APPARENT (light time and aberration), ASTROMETRIC "
         "(light time only) and GEOMETRIC; what each step changes; and the distance. Below: "
         "three invented marker directions, their elongation from the Sun and their "
         "Sun-centred ecliptic longitude and latitude (mean ecliptic of date) over the month. "
         "Uses SKY.SUN.LON, SKY.SUN.LAT, SKY.SUN.RA, SKY.SUN.DEC, SKY.SUN.DIST, "
         "SKY.SUN.ELONGATION, SKY.SUN.RELATIVE.LON, SKY.SUN.RELATIVE.LAT, SKY.WRAP.180, "
         "SKY.TEXT.HMS, SKY.TEXT.DMS, SKY.ANGLE.HOURS and SKY.ANGLE.", cols)
    sheet.getRows().getByIndex(0).Height = 1900
    caution(sheet, 1, cols)
    header(sheet, 2, [
        "Date (UTC)", "Lon, TRUE, APPARENT (deg)", "Lon, DATE, APPARENT (deg)",
        "Lon, J2000, APPARENT (deg)", "Lon, TRUE, GEOMETRIC (deg)",
        "Lon, TRUE, ASTROMETRIC (deg)", 'Aberration: APPARENT - ASTROMETRIC (")',
        'Light time: ASTROMETRIC - GEOMETRIC (")', 'Nutation: TRUE - DATE (")',
        "Precession since J2000: DATE - J2000 (deg)", 'Lat, TRUE (")', 'Lat, J2000 (")',
        "RA, TRUE (deg)", "RA, TRUE (HMS)", "Dec, TRUE (deg)", "Dec, TRUE (DMS)",
        "RA, DATE, APPARENT (deg)", "Dec, DATE, APPARENT (deg)",
        "RA, J2000, ASTROMETRIC (deg)", "Dec, J2000, ASTROMETRIC (deg)", "Distance (au)",
        "Light time (min)",
    ])
    days = 31
    first, last = 3, 3 + days - 1
    start = _serial(datetime.datetime(SUN_MONTH[0], SUN_MONTH[1], 1))
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(
        tuple((start + k,) for k in range(days)))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD HH:MM"))
    deg, sdeg = "0.000000", "+0.000000;-0.000000"
    _columns(doc, sheet, first, last, 1, [
        ("=SKY.SUN.LON(A{r})", deg),
        ('=SKY.SUN.LON(A{r};;"DATE")', deg),
        ('=SKY.SUN.LON(A{r};;"J2000")', deg),
        ('=SKY.SUN.LON(A{r};;"TRUE";"GEOMETRIC")', deg),
        ('=SKY.SUN.LON(A{r};;"TRUE";"ASTROMETRIC")', deg),
        ("=SKY.WRAP.180(B{r}-F{r})*3600", "+0.000;-0.000"),
        ("=SKY.WRAP.180(F{r}-E{r})*3600", "+0.0000;-0.0000"),
        ("=SKY.WRAP.180(B{r}-C{r})*3600", "+0.000;-0.000"),
        ("=SKY.WRAP.180(C{r}-D{r})", "+0.000000;-0.000000"),
        ("=SKY.SUN.LAT(A{r})*3600", "+0.000;-0.000"),
        ('=SKY.SUN.LAT(A{r};;"J2000")*3600', "+0.000;-0.000"),
        ("=SKY.SUN.RA(A{r})", deg),
        ("=SKY.TEXT.HMS(M{r};2)", "@"),
        ("=SKY.SUN.DEC(A{r})", sdeg),
        ("=SKY.TEXT.DMS(O{r};1)", "@"),
        ('=SKY.SUN.RA(A{r};;"DATE")', deg),
        ('=SKY.SUN.DEC(A{r};;"DATE")', sdeg),
        ('=SKY.SUN.RA(A{r};;"J2000";"ASTROMETRIC")', deg),
        ('=SKY.SUN.DEC(A{r};;"J2000";"ASTROMETRIC")', sdeg),
        ("=SKY.SUN.DIST(A{r})", "0.0000000"),
        # Light takes 499.004784 s to cross 1 au (IAU 2012 au, c).
        ("=U{r}*499.004784/60", "0.0000"),
    ])

    # The invented markers and their places relative to the Sun.
    mt = last + 2
    sheet.getCellByPosition(0, mt).setString(
        "Invented marker directions (ICRS). Marker A comes within a few degrees of the Sun "
        "late in the month: never point optics at or near the Sun (see the caution above).")
    header(sheet, mt + 1, ["Marker", "RA as typed", "Dec as typed", "RA (deg)", "Dec (deg)"])
    mfirst, mlast = mt + 2, mt + 1 + len(SUN_MARKERS)
    sheet.getCellRangeByPosition(0, mfirst, 2, mlast).setDataArray(tuple(SUN_MARKERS))
    _columns(doc, sheet, mfirst, mlast, 3, [
        ("=SKY.ANGLE.HOURS(B{r})", deg), ("=SKY.ANGLE(C{r})", sdeg),
    ])
    titles = ["Date (UTC)"]
    for name, _, _ in SUN_MARKERS:
        titles += [f"{name}: elongation (deg)", f"{name}: Sun-centred lon (deg)",
                   f"{name}: ecliptic lat (deg)"]
    ht = mlast + 2
    header(sheet, ht, titles)
    dfirst, dlast = ht + 1, ht + days
    _columns(doc, sheet, dfirst, dlast, 0, [("=A{t}", "YYYY-MM-DD HH:MM")],
             source_first=first, right=False)
    for k in range(len(SUN_MARKERS)):
        ra, dec = f"$D${mfirst + k + 1}", f"$E${mfirst + k + 1}"
        _columns(doc, sheet, dfirst, dlast, 1 + 3 * k, [
            (f"=SKY.SUN.ELONGATION({ra};{dec};A{{r}})", "0.0000"),
            (f"=SKY.SUN.RELATIVE.LON({ra};{dec};A{{r}})", "+0.0000;-0.0000"),
            (f"=SKY.SUN.RELATIVE.LAT({ra};{dec};A{{r}})", "+0.0000;-0.0000"),
        ])
    widths(sheet, [3.4] + [2.6] * 4 + [2.9, 2.9, 2.9] + [2.6] * 5 + [3.0, 2.6, 3.0]
           + [2.6] * 2 + [2.9, 2.9] + [2.6] * 2)


def meteor_watch_book(office, out_dir):
    doc = office.new_sheet()
    try:
        watch_log_sheet(doc, _sheet(doc, 0, "Watch log"))
        year_of_nights_sheet(doc, _sheet(doc, 1, "Year of nights"))
        seasons_sheet(doc, _sheet(doc, 2, "Seasons"))
        sun_sheet(doc, _sheet(doc, 3, "Sun"))
        return _save(office, doc, out_dir, "meteor_watch.ods")
    finally:
        doc.close(True)


def _save(office, doc, out_dir, name):
    landscape_fit_to_width(doc)
    doc.calculateAll()
    return office.save(doc, os.path.join(out_dir, name))


def observing_log_book(office, out_dir):
    doc = office.new_sheet()
    try:
        log = invented_log()
        observing_log(doc, _sheet(doc, 0, "Observing log"), log)
        column_form(doc, _sheet(doc, 1, "Column form"), len(log))
        time_scales(doc, _sheet(doc, 2, "Time scales"))
        angles(doc, _sheet(doc, 3, "Angles"))
        obliquity_models(doc, _sheet(doc, 4, "Obliquity models"))
        bad_input(doc, _sheet(doc, 5, "Bad input"))
        return _save(office, doc, out_dir, "observing_log.ods")
    finally:
        doc.close(True)


def target_list_book(office, out_dir):
    doc = office.new_sheet()
    try:
        # The Site sheet first: the named cells must exist before formulas use them.
        site_sheet(doc, _sheet(doc, 0, "Site"))
        targets_sheet(doc, _sheet(doc, 1, "Targets"))
        precession_sheet(doc, _sheet(doc, 2, "Precession and motion"))
        night_sheet(doc, _sheet(doc, 3, "Night log"), invented_night())
        return _save(office, doc, out_dir, "target_list.ods")
    finally:
        doc.close(True)


# ---- a variable-star timing log and a Moon calendar (invented) ---------------------------

# Invented targets of the invented Saltmarsh circle's timing programme.
TIMING_TARGETS = [("Field K-3", "09:02:41.7", "+63:07:15"), ("Field K-6", "21:58:12.25", "+12:03:48.9"),
                  ("Field K-9", "05 31 02.4", "-04 55 10")]


def invented_timing(seed=2027):
    rng = random.Random(seed)
    rows, t = [], 46400.0  # 2027-01-12
    for k in range(40):
        t += rng.uniform(1.0, 9.0)
        target = TIMING_TARGETS[k % 3]
        mid = t + (20.0 + rng.random() * 8.0) / 24.0
        rows.append((round(mid * 86400.0 * 10) / 864000.0, target[0], target[1], target[2]))
    return rows


TIMING_COLUMNS = [
    # (header, formula, format, width)
    ("RA (deg)", "=SKY.ANGLE.HOURS(C{r})", "0.00000", 2.4),
    ("Dec (deg)", "=SKY.ANGLE(D{r})", "+0.00000;-0.00000", 2.4),
    ("BJD_TDB (MJD form)", '=SKY.BJD.TDB(A{r};E{r};F{r};;"MJD")', "0.0000000", 3.2),
    ("BJD_TDB (JD)", "=SKY.BJD.TDB(A{r};E{r};F{r})", "0.000000", 3.2),
    ("HJD_UTC (JD)", "=SKY.HJD.UTC(A{r};E{r};F{r})", "0.000000", 3.2),
    ("HJD_TT (JD)", "=SKY.HJD.TT(A{r};E{r};F{r})", "0.000000", 3.2),
    ("BJD_TDB - HJD_UTC (s): never mix them", "=(H{r}-I{r})*86400", "0.000", 3.4),
    ("UTC back from BJD_TDB", '=SKY.BJD.TDB.DATETIME(G{r};E{r};F{r};"MJD")',
     "YYYY-MM-DD HH:MM:SS.000", 5.0),
    ("Round trip (µs)", "=(L{r}-A{r})*86400000000", "0.000", 2.4),
    ("UTC back from HJD_UTC", "=SKY.HJD.UTC.DATETIME(I{r};E{r};F{r})",
     "YYYY-MM-DD HH:MM:SS.000", 5.0),
]


def timing_sheet(doc, sheet):
    note(sheet, 0,
         "Invented: the Saltmarsh circle's timing log for 2027 (mid-exposure times in UTC, "
         "invented fields). Each time becomes BJD_TDB (the scale of modern timing work) and "
         "HJD on UTC and TT, and back. Uses SKY.BJD.TDB, SKY.HJD.UTC, SKY.HJD.TT, "
         "SKY.BJD.TDB.DATETIME and SKY.HJD.UTC.DATETIME. Light-time delay to first order "
         "(Roemer) from the Earth's centre.", 12)
    sheet.getRows().getByIndex(0).Height = 1900  # three lines of note
    header(sheet, 1, ["Mid-exposure (UTC)", "Field", "RA (text)", "Dec (text)"]
           + [c[0] for c in TIMING_COLUMNS])
    rows = invented_timing()
    first, last = 2, 2 + len(rows) - 1
    sheet.getCellRangeByPosition(0, first, 3, last).setDataArray(tuple(rows))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD HH:MM:SS.0"))
    sheet.getCellRangeByPosition(1, first, 1, last).HoriJustify = CENTER  # field
    sheet.getCellRangeByPosition(2, first, 3, last).HoriJustify = RIGHT  # sexagesimal text
    for k, (_, template, code, _) in enumerate(TIMING_COLUMNS):
        fill_formulas(sheet, 4 + k, first, last, template)
        format_range(sheet, 4 + k, first, last, number_format(doc, code))
    widths(sheet, [4.8, 2.4, 2.8, 2.8] + [c[3] for c in TIMING_COLUMNS])


MOON_COLUMNS = [
    ("Instant (UTC)", '=SKY.MOON.PHASE.NEXT(A{r};;B{r})', "YYYY-MM-DD HH:MM:SS", 4.0),
    ("Moon's latitude (deg)", "=SKY.MOON.LAT(C{r})", "+0.0000;-0.0000", 2.6),
    ("Sun from the node (deg)", "=SKY.ECLIPSE.NODE.DISTANCE(C{r})", "0.00", 2.6),
    ("Eclipse?", '=IF(OR(B{r}="NEW";B{r}="FULL");SKY.ECLIPSE.POSSIBLE(C{r});"")', "@", 4.6),
    ("Illuminated (fraction)", "=SKY.MOON.ILLUMINATED(C{r})", "0.0000", 2.6),
    ("Phase angle (deg)", "=SKY.MOON.PHASE.ANGLE(C{r})", "0.00", 2.2),
    ("Elongation (deg)", "=SKY.MOON.ELONGATION(C{r})", "0.000", 2.6),
    ("Age (days)", "=SKY.MOON.AGE(C{r})", "0.00", 2.0),
    ("Longitude (deg)", "=SKY.MOON.LON(C{r})", "0.0000", 2.4),
    ("RA (HMS)", "=SKY.TEXT.HMS(SKY.MOON.RA(C{r});1)", "@", 2.8),
    ("Dec (DMS)", "=SKY.TEXT.DMS(SKY.MOON.DEC(C{r});0)", "@", 2.6),
    ("Distance (km)", "=SKY.MOON.DIST(C{r})", "0", 2.4),
    ("True node (deg)", "=SKY.MOON.NODE(C{r})", "0.000", 2.4),
    ("Mean node (deg)", '=SKY.MOON.NODE(C{r};;"MEAN")', "0.000", 2.4),
]


def moon_sheet(doc, sheet):
    note(sheet, 0,
         "The Moon's phases of 2027 with the eclipse seasons: for each new and full Moon, "
         "the Moon's latitude, the Sun's distance from the nearer node and whether an "
         "eclipse is possible by the ecliptic limits (18.5 degrees solar, 12.2 lunar). "
         "Uses SKY.MOON.PHASE.NEXT, SKY.ECLIPSE.NODE.DISTANCE, SKY.ECLIPSE.POSSIBLE and the "
         "other SKY.MOON functions. Never look at a solar eclipse without a proper solar "
         "filter made for that purpose.", 12)
    sheet.getRows().getByIndex(0).Height = 1900  # the caution is the note's last line
    header(sheet, 1, ["Search from", "Phase"] + [c[0] for c in MOON_COLUMNS])
    rows, t = [], 46387.0  # 2026-12-31
    for k in range(50):
        rows.append((t + k * 7.38, ("NEW", "FIRST", "FULL", "LAST")[k % 4]))
    first, last = 2, 2 + len(rows) - 1
    sheet.getCellRangeByPosition(0, first, 1, last).setDataArray(tuple(rows))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    sheet.getCellRangeByPosition(1, first, 1, last).HoriJustify = CENTER  # phase
    for k, (title, template, code, _) in enumerate(MOON_COLUMNS):
        fill_formulas(sheet, 2 + k, first, last, template)
        format_range(sheet, 2 + k, first, last, number_format(doc, code))
        if title.endswith(("(HMS)", "(DMS)")):  # lines up with the numbers beside it
            sheet.getCellRangeByPosition(2 + k, first, 2 + k, last).HoriJustify = RIGHT
        elif code == "@":  # words: centred, apart from the number before them
            sheet.getCellRangeByPosition(2 + k, first, 2 + k, last).HoriJustify = CENTER
    widths(sheet, [2.6, 1.6] + [c[3] for c in MOON_COLUMNS])


def timing_book(office, out_dir):
    doc = office.new_sheet()
    try:
        timing_sheet(doc, _sheet(doc, 0, "Timing log"))
        moon_sheet(doc, _sheet(doc, 1, "Moon"))
        return _save(office, doc, out_dir, "timing_and_moon.ods")
    finally:
        doc.close(True)



def build(oxt, out_dir):
    os.makedirs(out_dir, exist_ok=True)
    with officekit.Office(oxt=oxt) as office:
        paths = [observing_log_book(office, out_dir), target_list_book(office, out_dir),
                 historical_record_book(office, out_dir), meteor_watch_book(office, out_dir),
                 timing_book(office, out_dir),
                 sample_planets.planet_watch_book(office, out_dir, _save)]
    for path in paths:
        print(path)
    return paths


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--oxt", required=True)
    ap.add_argument("--out", default=os.path.join(os.path.dirname(HERE), "sample_sheets"))
    args = ap.parse_args(argv)
    build(args.oxt, args.out)


if __name__ == "__main__":
    main()
