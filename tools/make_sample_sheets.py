"""Write the sample sheets in sample_sheets/ with a real office and the built extension.

    .venv/bin/python tools/make_sample_sheets.py --oxt dist/eclipsheet.oxt [--out sample_sheets]

The scenario is invented: the Saltmarsh Variable Star Circle, observing from its
Kettle Hill site; observers, nights and targets are made up.  The sheets hold formulas
(no macros), so opening them never asks about macro security.
"""

import argparse
import os
import random
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)

import officekit  # noqa: E402
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


def build(oxt, out_dir):
    os.makedirs(out_dir, exist_ok=True)
    with officekit.Office(oxt=oxt) as office:
        doc = office.new_sheet()
        try:
            log = invented_log()
            observing_log(doc, _sheet(doc, 0, "Observing log"), log)
            column_form(doc, _sheet(doc, 1, "Column form"), len(log))
            time_scales(doc, _sheet(doc, 2, "Time scales"))
            angles(doc, _sheet(doc, 3, "Angles"))
            obliquity_models(doc, _sheet(doc, 4, "Obliquity models"))
            bad_input(doc, _sheet(doc, 5, "Bad input"))
            landscape_fit_to_width(doc)
            doc.calculateAll()
            path = office.save(doc, os.path.join(out_dir, "observing_log.ods"))
        finally:
            doc.close(True)
    print(path)
    return path


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--oxt", required=True)
    ap.add_argument("--out", default=os.path.join(os.path.dirname(HERE), "sample_sheets"))
    args = ap.parse_args(argv)
    build(args.oxt, args.out)


if __name__ == "__main__":
    main()
