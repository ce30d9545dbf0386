"""sky_charts.ods: the Saltmarsh circle's wall charts (invented scenario), native Calc
charts over computed columns: the obliquity of the ecliptic by the five models over
20,000 years, the Sun's equation of time and declination through a year with the
analemma, and the Moon's illuminated fraction through a month.

Each sheet starts from one or two input cells (a first year or day and a step); every
row below is a formula of them, and the charts draw those rows, so typing a new start
redraws the charts.  Rows outside a model's validity hold #N/A (Calc's NA()), which a
chart leaves out: each model is drawn only where its authors vouch for it.
"""

import datetime

from chartkit import xy_chart
from sheetkit import format_range, header, note, number_format, widths

from calcfuncs import vocabulary as vocab

from .common import RIGHT, serial, sheet_at, sun_heading

FILE_NAME = "sky_charts.ods"

# (sheet name, chart name): what the tests look for.
OBLIQUITY_CHART = ("Obliquity", "obliquity_models")
SUN_CHARTS = ("Sun's year", ("eqtime_and_declination", "analemma"))
MOON_CHART = ("Moon's month", "moon_illuminated")

OBLIQUITY_FIRST_DATA_ROW = 5  # 0-based; the header (model names) is the row above
OBLIQUITY_ROWS = 201  # -10,000 to +10,000 by 100 years
SUN_FIRST_DATA_ROW = 5
SUN_ROWS = 366  # a day more than a year, so the analemma closes
MOON_FIRST_DATA_ROW = 4
MOON_ROWS = 121  # 30 days every 6 hours


def obliquity_sheet(doc, sheet):
    note(sheet, 0,
         "The mean obliquity of the ecliptic from year -10,000 to +10,000 by the five "
         "models of SKY.OBLIQUITY. Each column computes only inside its model's validity "
         "(rows 3 and 4, as the function states them) and holds #N/A elsewhere, so the "
         "chart draws each model only where it is valid and shows where they part. "
         "Change the first year or the step (B2, D2) and the table and chart follow. "
         "Years are Julian epochs on TT.", 12)
    sheet.getRows().getByIndex(0).Height = 1500
    sheet.getCellByPosition(0, 1).setString("First year")
    sheet.getCellByPosition(1, 1).setValue(-10000)
    sheet.getCellByPosition(2, 1).setString("Step (years)")
    sheet.getCellByPosition(3, 1).setValue(100)
    models = vocab.OBLIQUITY_MODELS
    rows = [("Valid from",) + tuple(vocab.OBLIQUITY_VALIDITY[m][0] for m in models),
            ("Valid to",) + tuple(vocab.OBLIQUITY_VALIDITY[m][1] for m in models)]
    sheet.getCellRangeByPosition(0, 2, len(models), 3).setDataArray(rows)
    header(sheet, 4, ["Year"] + list(models))
    first = OBLIQUITY_FIRST_DATA_ROW
    last = first + OBLIQUITY_ROWS - 1
    formulas = []
    for r in range(first, last + 1):
        row = r + 1  # 1-based, as formulas say it
        year = f"=$B$2+{r - first}*$D$2"
        cells = [year]
        for k in range(len(models)):
            col = "BCDEF"[k]
            cells.append(f'=IF(AND($A{row}>={col}$3;$A{row}<={col}$4);'
                         f'SKY.OBLIQUITY("J"&$A{row};"TT";{col}$5);NA())')
        formulas.append(tuple(cells))
    sheet.getCellRangeByPosition(0, first, len(models), last).setFormulaArray(tuple(formulas))
    format_range(sheet, 0, first, last, number_format(doc, "0"))
    for k in range(len(models)):
        format_range(sheet, 1 + k, first, last, number_format(doc, "0.0000"))
    widths(sheet, [2.2] + [2.6] * len(models))
    xy_chart(sheet, OBLIQUITY_CHART[1], list(range(len(models) + 1)), 4, last,
             "Mean obliquity of the ecliptic: five models, each inside its validity",
             "Year (Julian epoch, TT)", "Obliquity (degrees)", anchor_col=7, anchor_row=1,
             size_cm=(18.0, 11.0))


def sun_sheet(doc, sheet):
    sun_heading(sheet, 10,
                "The Sun through 2027 at 12:00 UTC each day: the equation of time "
                "(SKY.SUN.EQTIME, minutes; a sundial is fast when it is positive) and the "
                "Sun's declination (SKY.SUN.DEC, degrees). Plotted against each other they "
                "draw the analemma, the figure eight the Sun's noon place traces in a "
                "year. Change the first day (B3) and the table and both charts follow.",
                height=1500)
    sheet.getRows().getByIndex(1).Height = 1400  # the caution's three lines
    sheet.getCellByPosition(0, 2).setString("First day (UTC)")
    start = sheet.getCellByPosition(1, 2)
    start.setValue(serial(datetime.datetime(2027, 1, 1, 12)))
    start.NumberFormat = number_format(doc, "YYYY-MM-DD HH:MM")
    header(sheet, 4, ["Day (UTC)", "Equation of time (min)", "Declination (deg)"])
    first = SUN_FIRST_DATA_ROW
    last = first + SUN_ROWS - 1
    formulas = tuple((f"=$B$3+{r - first}", f"=SKY.SUN.EQTIME(A{r + 1})",
                      f"=SKY.SUN.DEC(A{r + 1})") for r in range(first, last + 1))
    sheet.getCellRangeByPosition(0, first, 2, last).setFormulaArray(formulas)
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    format_range(sheet, 1, first, last, number_format(doc, "+0.00;-0.00"))
    format_range(sheet, 2, first, last, number_format(doc, "+0.000;-0.000"))
    sheet.getCellRangeByPosition(0, first, 2, last).HoriJustify = RIGHT
    widths(sheet, [3.2, 3.4, 3.0])
    year, figure = SUN_CHARTS[1]
    xy_chart(sheet, year, [0, 1, 2], 4, last,
             "Equation of time and the Sun's declination through the year",
             "Date", "Minutes (equation of time), degrees (declination)",
             anchor_col=4, anchor_row=2, size_cm=(15.0, 10.0),
             x_format=number_format(doc, "YYYY-MM-DD"))
    xy_chart(sheet, figure, [1, 2], 4, last, "The analemma: the Sun at 12:00 UTC each day",
             "Equation of time (minutes)", "Declination (degrees)", anchor_col=4,
             anchor_row=2, shift_cm=15.5, size_cm=(9.0, 12.0), legend=False)


def moon_sheet(doc, sheet):
    note(sheet, 0,
         "The Moon's illuminated fraction (SKY.MOON.ILLUMINATED, geocentric) every six "
         "hours through 30 days of January 2027: 0 at new Moon, 1 at full. Change the "
         "first instant or the step (B2, D2) and the table and chart follow.", 10)
    sheet.getCellByPosition(0, 1).setString("First instant (UTC)")
    start = sheet.getCellByPosition(1, 1)
    start.setValue(serial(datetime.datetime(2027, 1, 1)))
    start.NumberFormat = number_format(doc, "YYYY-MM-DD HH:MM")
    sheet.getCellByPosition(2, 1).setString("Step (hours)")
    sheet.getCellByPosition(3, 1).setValue(6)
    header(sheet, 3, ["Instant (UTC)", "Illuminated fraction"])
    first = MOON_FIRST_DATA_ROW
    last = first + MOON_ROWS - 1
    formulas = tuple((f"=$B$2+{r - first}*$D$2/24", f"=SKY.MOON.ILLUMINATED(A{r + 1})")
                     for r in range(first, last + 1))
    sheet.getCellRangeByPosition(0, first, 1, last).setFormulaArray(formulas)
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD HH:MM"))
    format_range(sheet, 1, first, last, number_format(doc, "0.0000"))
    widths(sheet, [3.6, 3.4])
    xy_chart(sheet, MOON_CHART[1], [0, 1], 3, last,
             "The Moon's illuminated fraction through a month", "Date (UTC)",
             "Illuminated fraction", anchor_col=4, anchor_row=1, size_cm=(17.0, 9.5),
             legend=False, x_format=number_format(doc, "YYYY-MM-DD"))


def fill(doc):
    obliquity_sheet(doc, sheet_at(doc, 0, OBLIQUITY_CHART[0]))
    sun_sheet(doc, sheet_at(doc, 1, SUN_CHARTS[0]))
    moon_sheet(doc, sheet_at(doc, 2, MOON_CHART[0]))
