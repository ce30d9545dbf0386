"""observing_log.ods: the Saltmarsh Variable Star Circle's season of estimate times at its
Kettle Hill site (invented): Julian dates, time scales, obliquity, nutation and angle
text (the time, angle and obliquity families), a whole-column form, and what a cell says
about bad input.
"""

import random

from sheetkit import column_letter, format_range, header, note, number_format, widths

from .common import CENTER, OBSERVERS, RIGHT, TARGETS, fill_columns, sheet_at

FILE_NAME = "observing_log.ods"
LOG_ROWS = 300


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


def log_sheet(doc, sheet, log):
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
    # ISO and sexagesimal text lines up with the numbers beside it.
    fill_columns(doc, sheet, first, last, 3, [c[1:3] for c in LOG_COLUMNS], right="text")
    widths(sheet, [1.2, 4.0, 2.4] + [c[3] for c in LOG_COLUMNS])


def column_form_sheet(doc, sheet, rows):
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


def time_scales_sheet(doc, sheet):
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
    fill_columns(doc, sheet, first, last, 4, templates, right="text")
    sheet.getCellByPosition(0, last + 2).setString("Computed by")
    sheet.getCellByPosition(1, last + 2).setFormula("=SKY.VERSION()")
    # JD to nine decimals needs 4.4 cm: narrower, Calc shows ### at some zooms.
    widths(sheet, [5.2, 1.4, 1.6, 8.8, 4.4, 4.2, 4.8, 4.8, 5.4, 2.4])


def angles_sheet(doc, sheet):
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
    # Sexagesimal text lines up with the degrees beside it.
    fill_columns(doc, sheet, first, last, 3, templates, right="text")
    widths(sheet, [2.4, 3.2, 3.2, 3.0, 3.0, 3.4, 3.4, 4.0, 4.0])


MODELS = ("IAU2006", "IAU1980", "NEWCOMB", "LASKAR1986", "VONDRAK2011")


def obliquity_sheet(doc, sheet):
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
    fill_columns(doc, sheet, first, last, 2,
                 [(f'=SKY.OBLIQUITY(B{{r}};"TT";"{m}";"ARCSEC")', "0.000") for m in MODELS]
                 + [(f"={column_letter(3 + k)}{{r}}-C{{r}}", "0.000")
                    for k in range(len(MODELS) - 1)], right=False)

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
    fill_columns(doc, sheet, lf, ll, 2, [
        ('=SKY.OBLIQUITY(B{r};"TT";"LASKAR1986";"ARCSEC")', "0.000"),
        ('=SKY.OBLIQUITY(B{r};"TT";"VONDRAK2011";"ARCSEC")', "0.000"),
        ("=D{r}-C{r}", "0.000"),
        ('=SKY.OBLIQUITY(B{r};"TT";"VONDRAK2011")', "0.000000"),
    ], right=False)
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


def bad_input_sheet(doc, sheet):
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




def fill(doc):
    log = invented_log()
    log_sheet(doc, sheet_at(doc, 0, "Observing log"), log)
    column_form_sheet(doc, sheet_at(doc, 1, "Column form"), len(log))
    time_scales_sheet(doc, sheet_at(doc, 2, "Time scales"))
    angles_sheet(doc, sheet_at(doc, 3, "Angles"))
    obliquity_sheet(doc, sheet_at(doc, 4, "Obliquity models"))
    bad_input_sheet(doc, sheet_at(doc, 5, "Bad input"))
