"""Write the sample sheets in sample_sheets/ with a real office and the built extension.

    .venv/bin/python tools/make_sample_sheets.py --oxt dist/eclipsheet.oxt [--out sample_sheets]

Two workbooks, one office session:

  observing_log.ods  a season's estimate times: Julian dates, time scales, obliquity,
                     nutation, angle text (the time, angle and obliquity families)
  target_list.ods    one night's targets: coordinate systems, precession, proper
                     motion, sidereal time and the horizon (the coordinates and horizon
                     families)

The scenario is invented: the Saltmarsh Variable Star Circle, observing from its
Kettle Hill site and from a second field site, Curlew Staithe, whose coordinates are
made up too; observers, nights, fields and stars are made up.  The sheets hold formulas
(no macros), so opening them never asks about macro security.
"""

import argparse
import datetime
import os
import random
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)

import officekit  # noqa: E402
import uno  # noqa: E402  (the office bridge, importable once officekit is)
from sheetkit import (  # noqa: E402
    column_letter,
    fill_formulas,
    format_range,
    header,
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
    ("Back from MJD (TDB)", '=SKY.MJD.DATETIME(F{r};"TDB";"UTC")', "YYYY-MM-DD HH:MM:SS.000", 5.6),
]


def observing_log(doc, sheet, log):
    note(sheet, 0,
         "Saltmarsh Variable Star Circle, Kettle Hill site (invented): a season's estimate "
         "times in UTC turned into Julian dates on the UTC, TT and TDB scales, Delta T, "
         "the obliquity of the ecliptic (IAU 2006) and nutation (IAU 2000A), and back. "
         "Uses SKY.JD, SKY.MJD, SKY.DATETIME, SKY.TEXT.ISO, SKY.DELTAT, SKY.OBLIQUITY, "
         "SKY.OBLIQUITY.TRUE, SKY.TEXT.DMS, SKY.NUTATION.LON, SKY.NUTATION.OBL, "
         "SKY.JD.DATETIME and SKY.MJD.DATETIME, one formula per row (fill down).", 12)
    header(sheet, 1, ["No.", "Time (UTC)", "Observer"] + [c[0] for c in LOG_COLUMNS])
    first, last = 2, 2 + len(log) - 1
    sheet.getCellRangeByPosition(0, first, 2, last).setDataArray(
        tuple((float(i + 1), t, who) for i, (t, who) in enumerate(log))
    )
    format_range(sheet, 1, first, last, number_format(doc, "YYYY-MM-DD HH:MM:SS"))
    for k, (_, template, code, _) in enumerate(LOG_COLUMNS):
        col = 3 + k
        fill_formulas(sheet, col, first, last, template)
        format_range(sheet, col, first, last, number_format(doc, code))
    widths(sheet, [1.2, 4.0, 2.4] + [c[3] for c in LOG_COLUMNS])


def column_form(doc, sheet, rows):
    note(sheet, 0,
         "The same log computed in whole-column form: each column is ONE array formula "
         "over the times on the Observing log sheet (select the range, type the formula, "
         "Ctrl+Shift+Enter). Faster for long logs; a bad row shows its own message.", 8)
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
    for k, (t, code) in enumerate(templates):
        fill_formulas(sheet, 4 + k, first, last, t)
        format_range(sheet, 4 + k, first, last, number_format(doc, code))
    sheet.getCellByPosition(0, last + 2).setString("Computed by")
    sheet.getCellByPosition(1, last + 2).setFormula("=SKY.VERSION()")
    widths(sheet, [5.2, 1.4, 1.6, 7.4, 3.6, 3.6, 4.8, 4.8, 5.4, 2.4])


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
                      "RA (HMS)", "Dec (DMS)", "RA + 200 deg, wrapped to 0-360",
                      "RA wrapped to -180..180"])
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
    widths(sheet, [2.4, 3.2, 3.2, 3.0, 3.0, 3.4, 3.4, 4.0, 4.0])


MODELS = ("IAU2006", "IAU1980", "NEWCOMB", "LASKAR1986", "VONDRAK2011")


def obliquity_models(doc, sheet):
    note(sheet, 0,
         "Mean obliquity of the ecliptic under five published formulas, 1000 to 2900 "
         "(where all five are valid), in arcseconds and as differences from IAU 2006. Epochs are Julian "
         "years of TT given as MJD text. Uses SKY.OBLIQUITY with its model and unit "
         "arguments.", 11)
    header(sheet, 1, ["Year (TT)", "Time"] + [f'{m} (")' for m in MODELS]
           + [f"{m} - IAU2006 (\")" for m in MODELS[1:]])
    years = list(range(1000, 2901, 100))  # where all five formulas are valid
    first = 2
    last = first + len(years) - 1
    rows = []
    for y in years:
        mjd = 51544.5 + (y - 2000) * 365.25
        rows.append((float(y), f"MJD {mjd:.2f}"))
    sheet.getCellRangeByPosition(0, first, 1, last).setDataArray(tuple(rows))
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
    header(sheet, start, ["Year (TT)", "Time", 'LASKAR1986 (")', 'VONDRAK2011 (")',
                          'VONDRAK2011 - LASKAR1986 (")', "VONDRAK2011 (deg)"])
    long_years = list(range(-8000, 12001, 1000))
    lf, ll = start + 1, start + len(long_years)
    sheet.getCellRangeByPosition(0, lf, 1, ll).setDataArray(
        tuple((float(y), f"MJD {51544.5 + (y - 2000) * 365.25:.2f}") for y in long_years)
    )
    fill_formulas(sheet, 2, lf, ll, '=SKY.OBLIQUITY(B{r};"TT";"LASKAR1986";"ARCSEC")')
    fill_formulas(sheet, 3, lf, ll, '=SKY.OBLIQUITY(B{r};"TT";"VONDRAK2011";"ARCSEC")')
    fill_formulas(sheet, 4, lf, ll, "=D{r}-C{r}")
    fill_formulas(sheet, 5, lf, ll, '=SKY.OBLIQUITY(B{r};"TT";"VONDRAK2011")')
    for col, code in ((2, "0.000"), (3, "0.000"), (4, "0.000"), (5, "0.000000")):
        format_range(sheet, col, lf, ll, number_format(doc, code))
    widths(sheet, [2.2, 3.4] + [3.0] * 9)


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
         "names the problem and what is accepted. The other rows and cells keep working.", 3)
    header(sheet, 1, ["Formula", "Why it cannot be computed", "What the cell shows"])
    sheet.getCellByPosition(1, 1).setString("Why it cannot be computed")
    for k, (formula, why) in enumerate(BAD_INPUT):
        r = 2 + k
        sheet.getCellByPosition(0, r).setString(formula)
        sheet.getCellByPosition(1, r).setString(why)
        sheet.getCellByPosition(2, r).setFormula(formula)
    widths(sheet, [7.0, 7.5, 22.0])


def landscape_fit_to_width(doc):
    """Print every sheet landscape, one page wide, so the PDF reads like the sheet."""
    style = doc.StyleFamilies.getByName("PageStyles").getByName("Default")
    width, height = style.Width, style.Height
    style.IsLandscape = True
    style.Width, style.Height = max(width, height), min(width, height)
    style.ScaleToPagesX = 1
    style.ScaleToPagesY = 0


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
    table = f"$Targets.$A${TARGET_FIRST + 1}:$E${TARGET_FIRST + len(FIELDS)}"
    _columns(doc, sheet, first, last, 4, [
        (f"=VLOOKUP(D{{r}};{table};4;0)", "0.000000"),
        (f"=VLOOKUP(D{{r}};{table};5;0)", "+0.000000;-0.000000"),
    ])
    _columns(doc, sheet, first, last, 8, [(c[1], c[2]) for c in NIGHT_COLUMNS])
    widths(sheet, [1.0, 3.8, 2.2, 2.2, 2.4, 2.4, 2.0, 2.8] + [c[3] for c in NIGHT_COLUMNS])


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


def build(oxt, out_dir):
    os.makedirs(out_dir, exist_ok=True)
    with officekit.Office(oxt=oxt) as office:
        paths = [observing_log_book(office, out_dir), target_list_book(office, out_dir)]
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
