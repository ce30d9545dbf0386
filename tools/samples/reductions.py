"""reductions.ods: the trade's reductions in an invented scenario: the Sun's constellation
through 2027, the Tollmere Meteor Section's rates, a Saltmarsh circle eclipse timing
reduced by Kwee and van Woerden, and the planets' magnitudes and constellations (the
constellations, meteors, variable-star and magnitude families).
"""

import datetime
import math
import random

from sheetkit import format_range, header, note, number_format, widths

from .common import CENTER, fill_columns, serial, sheet_at, sun_heading

FILE_NAME = "reductions.ods"
YEAR = 2027


def sun_constellation_sheet(doc, sheet):
    sun_heading(sheet, 7,
                f"The Sun's constellation through {YEAR}, every day at 0h UTC: the IAU "
                "boundaries cross the ecliptic thirteen times, and the Sun spends under a "
                "week in Scorpius and about eighteen days in Ophiuchus. Column E marks each "
                "day the Sun is found in a new constellation. Uses SKY.CONSTELLATION.BODY "
                "and SKY.SUN.LON.", 1900)
    header(sheet, 2, ["Date (0h UTC)", "Constellation", "Name", "Sun's longitude (deg)",
                      "Entered today?"])
    first = 3
    days = [datetime.datetime(YEAR, 1, 1) + datetime.timedelta(days=k)
            for k in range(365)]
    last = first + len(days) - 1
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(
        tuple((serial(d),) for d in days))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    fill_columns(doc, sheet, first, last, 1, [
        ('=SKY.CONSTELLATION.BODY("SUN";A{r})', "@"),
        ('=SKY.CONSTELLATION.BODY("SUN";A{r};;"NAME")', "@"),
        ("=SKY.SUN.LON(A{r})", "0.000"),
    ], right=False)
    # The first row compares with the year's last day before it (the Sun in Sagittarius).
    sheet.getCellByPosition(4, first).setFormula(
        f'=IF(B{first + 1}<>SKY.CONSTELLATION.BODY("SUN";A{first + 1}-1);"entered";"")')
    rows = tuple((f'=IF(B{r + 1}<>B{r};"entered";"")',) for r in range(first + 1, last + 1))
    sheet.getCellRangeByPosition(4, first + 1, 4, last).setFormulaArray(rows)
    sheet.getCellRangeByPosition(1, first, 1, last).HoriJustify = CENTER
    widths(sheet, [3.0, 2.6, 3.6, 3.2, 2.6])


# The Tollmere Meteor Section (invented): watches of the 2027 Perseids from Whinburn
# Common, with invented counts, times, sky limits and radiant altitudes.
PERSEID_R = 2.2  # the population index the section uses for the example (invented)


def invented_rate_rows(seed=2027):
    rng = random.Random(seed)
    rows = []
    start = datetime.datetime(YEAR, 8, 11, 21, 30)
    for k in range(14):
        moment = start + datetime.timedelta(hours=1.5 * (k % 4), days=k // 4)
        hours = round(rng.uniform(1.0, 1.5), 2)
        lm = round(rng.uniform(5.6, 6.6), 1)
        alt = round(20.0 + 4.5 * (k % 4) + rng.uniform(0.0, 8.0), 1)
        cloud = rng.choice([0.0, 0.0, 0.05, 0.1, 0.2])
        count = max(1, int(rng.gauss(35.0, 12.0) * hours))
        rows.append((serial(moment), count, hours, lm, alt, cloud))
    return rows


def meteor_rates_sheet(doc, sheet):
    note(sheet, 0,
         "Invented: the Tollmere Meteor Section's Perseid watches of 2027 reduced to the "
         "zenithal hourly rate, with its Poisson uncertainty, and the radiant drifted to the "
         "solar longitude of each watch from a reference place (invented for the example: "
         "RA 48.0, Dec +58.0 at solar longitude 140.0, drifting +1.40 and +0.26 degrees a "
         "day). Uses SKY.METEOR.ZHR, SKY.METEOR.ZHR.ERROR, SKY.METEOR.RADIANT.RA, "
         "SKY.METEOR.RADIANT.DEC and SKY.SUN.SOLARLON. The usual formula, common practice: "
         "ZHR = N r^(6.5 - LM) / ((1 - k) T_eff sin(h)).", 12)
    sheet.getRows().getByIndex(0).Height = 2300
    header(sheet, 1, ["Mid-watch (UTC)", "Perseids (N)", "T_eff (h)", "LM", "Radiant alt "
                      "(deg)", "Cloud (fraction)", "r", "ZHR", "ZHR +-", "Solar longitude",
                      "Radiant RA", "Radiant Dec"])
    rows = invented_rate_rows()
    first, last = 2, 2 + len(rows) - 1
    sheet.getCellRangeByPosition(0, first, 5, last).setDataArray(tuple(rows))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD HH:MM"))
    fill_columns(doc, sheet, first, last, 6, [
        (str(PERSEID_R), "0.0"),
        ("=SKY.METEOR.ZHR(B{r};C{r};D{r};E{r};G{r};F{r})", "0.0"),
        ("=SKY.METEOR.ZHR.ERROR(B{r};C{r};D{r};E{r};G{r};F{r})", "0.0"),
        ("=SKY.SUN.SOLARLON(A{r})", "0.000"),
        ("=SKY.METEOR.RADIANT.RA(48;58;140;J{r};1.40;0.26)", "0.00"),
        ("=SKY.METEOR.RADIANT.DEC(48;58;140;J{r};1.40;0.26)", "+0.00;-0.00"),
    ])
    widths(sheet, [3.6, 2.2, 1.8, 1.4, 2.2, 2.2, 1.2, 1.6, 1.6, 2.4, 2.0, 2.0])


# An invented eclipsing binary of the Saltmarsh circle's programme, "Field K-9 variable",
# with an invented ephemeris; one night's photometry is made up around a minimum.
EPHEMERIS_T0 = 2461000.31720   # BJD_TDB, invented
EPHEMERIS_P = 0.7365123        # days, invented
MINIMUM_CYCLE = 403


def invented_light_curve(seed=9):
    rng = random.Random(seed)
    centre = EPHEMERIS_T0 + EPHEMERIS_P * MINIMUM_CYCLE + 0.00214  # a little late
    rows, t = [], centre - 0.085
    while t < centre + 0.09:
        depth = 0.62 * math.exp(-0.5 * ((t - centre) / 0.026) ** 2)
        rows.append((round(t, 5), round(12.31 + depth + rng.gauss(0.0, 0.012), 3)))
        t += rng.uniform(0.0012, 0.0022)
    return rows


def timing_sheet(doc, sheet):
    note(sheet, 0,
         "Invented: one night's photometry of the Saltmarsh circle's eclipsing binary in "
         "Field K-9 (times BJD_TDB, V magnitudes), the time of minimum by the method of Kwee "
         "and van Woerden (1956) with its uncertainty, and the cycle, phase and O - C against "
         "the circle's invented ephemeris. Uses SKY.VARSTAR.MINIMUM, "
         "SKY.VARSTAR.MINIMUM.ERROR, SKY.VARSTAR.CYCLE, SKY.VARSTAR.PHASE and "
         "SKY.VARSTAR.OC; the minimum takes the two whole columns A and B.", 8)
    sheet.getRows().getByIndex(0).Height = 1900
    header(sheet, 1, ["BJD_TDB", "V (mag)", "", "Result", "Value"])
    rows = invented_light_curve()
    first, last = 2, 2 + len(rows) - 1
    sheet.getCellRangeByPosition(0, first, 1, last).setDataArray(tuple(rows))
    format_range(sheet, 0, first, last, number_format(doc, "0.00000"))
    format_range(sheet, 1, first, last, number_format(doc, "0.000"))
    span = f"A{first + 1}:A{last + 1};B{first + 1}:B{last + 1}"
    results = [
        ("Epoch T0 (BJD_TDB), invented", f"{EPHEMERIS_T0}", "0.00000"),
        ("Period P (days), invented", f"{EPHEMERIS_P}", "0.0000000"),
        ("Time of minimum (BJD_TDB)", f"=SKY.VARSTAR.MINIMUM({span})", "0.00000"),
        ("Its uncertainty (days)", f"=SKY.VARSTAR.MINIMUM.ERROR({span})", "0.00000"),
        ("Its uncertainty (seconds)", "=E6*86400", "0.0"),
        ("Cycle E", "=SKY.VARSTAR.CYCLE(E5;E3;E4)", "0"),
        ("Phase", "=SKY.VARSTAR.PHASE(E5;E3;E4)", "0.0000"),
        ("O - C (days)", "=SKY.VARSTAR.OC(E5;E3;E4)", "+0.00000;-0.00000"),
        ("O - C (minutes)", "=E10*1440", "+0.00;-0.00"),
    ]
    for k, (label, formula, code) in enumerate(results):
        sheet.getCellByPosition(3, 2 + k).setString(label)
        cell = sheet.getCellByPosition(4, 2 + k)
        cell.setFormula(formula) if formula.startswith("=") else cell.setValue(float(formula))
        cell.NumberFormat = number_format(doc, code)
    widths(sheet, [3.0, 2.0, 0.6, 5.4, 3.2])


PLANETS = ("MERCURY", "VENUS", "MARS", "JUPITER", "SATURN", "URANUS", "NEPTUNE")


def planets_sheet(doc, sheet):
    sun_heading(sheet, 15,
                f"The planets on the first of each month of {YEAR}, 0h UTC: the apparent "
                "visual magnitude (Mallama and Hilton 2018) and the constellation each stands "
                "in. A magnitude cell says so where a planet's phase angle is outside the "
                "range the formula was fitted for (Mercury near conjunction). Uses "
                "SKY.PLANET.MAGNITUDE, SKY.CONSTELLATION.BODY, and SKY.CONSTELLATION for "
                "a catalogue place.", 1900)
    titles = ["Date (0h UTC)"]
    for p in PLANETS:
        titles += [p.capitalize() + " mag", p.capitalize()[:3] + " in"]
    header(sheet, 2, titles)
    first = 3
    months = [datetime.datetime(YEAR, m, 1) for m in range(1, 13)]
    last = first + len(months) - 1
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(
        tuple((serial(d),) for d in months))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    templates = []
    for p in PLANETS:
        templates += [(f'=SKY.PLANET.MAGNITUDE("{p}";A{{r}})', "+0.00;-0.00"),
                      (f'=SKY.CONSTELLATION.BODY("{p}";A{{r}})', "@")]
    fill_columns(doc, sheet, first, last, 1, templates, right="text")
    widths(sheet, [2.6] + [2.0, 1.2] * len(PLANETS))
    # A direction typed as a catalogue place: the constellation of an invented field.
    row = last + 2
    sheet.getCellByPosition(0, row).setString("Field K-9 (invented), RA 05 31 02.4, Dec "
                                              "-04 55 10 (ICRS): in")
    sheet.getCellByPosition(5, row).setFormula(
        '=SKY.CONSTELLATION(SKY.ANGLE.HOURS("05 31 02.4");SKY.ANGLE("-04 55 10");"ICRS";;;'
        '"NAME")')


def fill(doc):
    sun_constellation_sheet(doc, sheet_at(doc, 0, "Sun's constellation"))
    meteor_rates_sheet(doc, sheet_at(doc, 1, "Meteor rates"))
    timing_sheet(doc, sheet_at(doc, 2, "Time of minimum"))
    planets_sheet(doc, sheet_at(doc, 3, "Planet magnitudes"))
