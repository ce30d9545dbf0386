"""planet_watch.ods (invented scenario): the Saltmarsh circle's planet calendar for 2027
and its archive of heliocentric timings carried over to BJD_TDB (the planets family).

Written by tools/make_sample_sheets.py; every number is a live SKY. formula.
"""

import datetime

from sheetkit import format_range, header, note, number_format, widths

from .common import fill_columns, sheet_at

FILE_NAME = "planet_watch.ods"

SOURCE_CELL = "$B$3"  # one cell chooses the ephemeris for the whole sheet
YEAR_START = 46388.0  # 2027-01-01 00:00 UTC as a date-time serial (null date 1899-12-30)

# (planet, event) rows of the calendar: each row searches from the previous one of the
# same kind, so the sheet lists every event of the year in turn.
EVENTS = [("MERCURY", "INFERIOR")] * 3 + [("MERCURY", "SUPERIOR")] * 3 + [
    ("MERCURY", "GREATEST EAST")] * 3 + [("MERCURY", "GREATEST WEST")] * 3 + [
    ("VENUS", "INFERIOR"), ("VENUS", "SUPERIOR"), ("VENUS", "GREATEST EAST"),
    ("VENUS", "GREATEST WEST"),
    ("MARS", "OPPOSITION"), ("MARS", "CONJUNCTION"),
    ("JUPITER", "OPPOSITION"), ("JUPITER", "CONJUNCTION"),
    ("SATURN", "OPPOSITION"), ("SATURN", "CONJUNCTION"),
    ("URANUS", "OPPOSITION"), ("URANUS", "CONJUNCTION"),
    ("NEPTUNE", "OPPOSITION"), ("NEPTUNE", "CONJUNCTION"),
]

EVENT_COLUMNS = [
    # (header, formula, number format, width in cm)
    ("Instant (UTC)", f"=SKY.PLANET.EVENT.NEXT(A{{r}};C{{r}};;B{{r}};;{SOURCE_CELL})",
     "YYYY-MM-DD HH:MM", 3.4),
    ("Elongation (deg)", f"=SKY.PLANET.ELONGATION(A{{r}};D{{r}};;{SOURCE_CELL})", "0.00", 2.4),
    ("Distance (au)", f"=SKY.PLANET.DIST(A{{r}};D{{r}};;{SOURCE_CELL})", "0.00000", 2.4),
    ("Light time (min)", f"=SKY.PLANET.LIGHTTIME(A{{r}};D{{r}};;{SOURCE_CELL})", "0.00", 2.4),
    ("RA (HMS)", f"=SKY.TEXT.HMS(SKY.PLANET.RA(A{{r}};D{{r}};;;;{SOURCE_CELL});1)", "@", 2.8),
    ("Dec (DMS)", f"=SKY.TEXT.DMS(SKY.PLANET.DEC(A{{r}};D{{r}};;;;{SOURCE_CELL});0)", "@", 2.8),
    ("Illuminated", f"=SKY.PLANET.ILLUMINATED(A{{r}};D{{r}};;{SOURCE_CELL})", "0.000", 2.2),
    ("Phase angle (deg)", f"=SKY.PLANET.PHASE.ANGLE(A{{r}};D{{r}};;{SOURCE_CELL})", "0.0", 2.2),
]

PLANETS = ("MERCURY", "VENUS", "MARS", "JUPITER", "SATURN", "URANUS", "NEPTUNE")
MONTHLY_COLUMNS = [
    ("Helio. lon, date (deg)", f"=SKY.PLANET.HELIO.LON(B{{r}};A{{r}};;;{SOURCE_CELL})", "0.0000", 2.6),
    ("Helio. lat, date (deg)", f"=SKY.PLANET.HELIO.LAT(B{{r}};A{{r}};;;{SOURCE_CELL})",
     "+0.0000;-0.0000", 2.6),
    ("Helio. dist (au)", f"=SKY.PLANET.HELIO.DIST(B{{r}};A{{r}};;{SOURCE_CELL})", "0.000000", 2.6),
    ("x, J2000 ecl. (au)", f'=SKY.PLANET.HELIO.X(B{{r}};A{{r}};;"J2000";{SOURCE_CELL})',
     "+0.000000;-0.000000", 2.6),
    ("y, J2000 ecl. (au)", f'=SKY.PLANET.HELIO.Y(B{{r}};A{{r}};;"J2000";{SOURCE_CELL})',
     "+0.000000;-0.000000", 2.6),
    ("z, J2000 ecl. (au)", f'=SKY.PLANET.HELIO.Z(B{{r}};A{{r}};;"J2000";{SOURCE_CELL})',
     "+0.000000;-0.000000", 2.6),
    ("Geoc. lon, true (deg)", f"=SKY.PLANET.LON(B{{r}};A{{r}};;;;{SOURCE_CELL})", "0.0000", 2.6),
    ("Geoc. lat, true (deg)", f"=SKY.PLANET.LAT(B{{r}};A{{r}};;;;{SOURCE_CELL})",
     "+0.0000;-0.0000", 2.6),
    ("Elongation (deg)", f"=SKY.PLANET.ELONGATION(B{{r}};A{{r}};;{SOURCE_CELL})", "0.0", 2.2),
]

CONJUNCTION_CAUTION = (
    "Caution: near a conjunction a planet is close to the Sun in the sky. Never look at the "
    "Sun, or point binoculars, a telescope or a camera at or near it, without a proper "
    "solar filter made for that purpose."
)


def _source_rows(sheet):
    sheet.getCellByPosition(0, 2).setString("Ephemeris source")
    sheet.getCellByPosition(1, 2).setString("BUILTIN")
    sheet.getCellByPosition(2, 2).setFormula(f"=SKY.EPHEMERIS({SOURCE_CELL})")
    sheet.getCellByPosition(0, 3).setString(
        "Change B3 to DE440 (JPL; 1900-2100 comes with the add-in), DE441 or the path of a "
        "JPL .bsp kernel, and every formula below follows.")


def planet_calendar_sheet(doc, sheet):
    note(sheet, 0,
         "Invented: the Saltmarsh circle's planet calendar for 2027. For each planet the "
         "oppositions, conjunctions with the Sun and greatest elongations in the year (each row searches on from "
         "the previous one; an event that falls in 2028 shows that there is none of its kind "
         "left in 2027), with the planet's elongation, distance, place and phase at the "
         "instant; below, each planet on the first of each month. Uses SKY.PLANET.EVENT.NEXT, "
         "SKY.PLANET.* and SKY.EPHEMERIS. " + CONJUNCTION_CAUTION, 12)
    _source_rows(sheet)
    top = 5
    header(sheet, top, ["Planet", "Event", "Search from (UTC)", "Instant (UTC)"]
           + [c[0] for c in EVENT_COLUMNS[1:]])
    first = top + 1
    last = first + len(EVENTS) - 1
    previous = {}
    for k, (planet, event) in enumerate(EVENTS):
        row = first + k
        sheet.getCellByPosition(0, row).setString(planet)
        sheet.getCellByPosition(1, row).setString(event)
        key = (planet, event)
        if key in previous:  # a day after the last one of its kind
            sheet.getCellByPosition(2, row).setFormula(f"=D{previous[key] + 1}+1")
        else:
            sheet.getCellByPosition(2, row).setValue(YEAR_START)
        previous[key] = row
    format_range(sheet, 2, first, last, number_format(doc, "YYYY-MM-DD HH:MM"))
    fill_columns(doc, sheet, first, last, 3, [c[1:3] for c in EVENT_COLUMNS], right=False)

    mt = last + 2
    header(sheet, mt, ["Date (UTC)", "Planet"] + [c[0] for c in MONTHLY_COLUMNS])
    rows = []
    for month in range(12):
        for planet in PLANETS:
            rows.append((month, planet))
    mfirst = mt + 1
    mlast = mfirst + len(rows) - 1
    for k, (month, planet) in enumerate(rows):
        row = mfirst + k
        first_of_month = datetime.date(2027, month + 1, 1) - datetime.date(1899, 12, 30)
        sheet.getCellByPosition(0, row).setValue(float(first_of_month.days))
        sheet.getCellByPosition(1, row).setString(planet)
    format_range(sheet, 0, mfirst, mlast, number_format(doc, "YYYY-MM-DD"))
    fill_columns(doc, sheet, mfirst, mlast, 2, [c[1:3] for c in MONTHLY_COLUMNS], right=False)
    widths(sheet, [2.6, 2.4, 3.4] + [c[3] for c in EVENT_COLUMNS] + [2.6] * 3)


# Invented archive: HJD_UTC timings the circle published before it moved to BJD_TDB,
# for the invented fields of its timing programme (RA, Dec in degrees).
ARCHIVE = [
    ("Field K-3", 135.67375, 63.12083, 2455201.38812),
    ("Field K-3", 135.67375, 63.12083, 2455564.41530),
    ("Field K-6", 329.55104, 12.06358, 2456120.52177),
    ("Field K-6", 329.55104, 12.06358, 2456481.47319),
    ("Field K-9", 82.76000, -4.91944, 2457001.60244),
    ("Field K-9", 82.76000, -4.91944, 2457333.36811),
    ("Field K-3", 135.67375, 63.12083, 2458120.29903),
    ("Field K-6", 329.55104, 12.06358, 2459002.44786),
]
SITE = (52.6, 1.3, 25.0)  # the circle's invented observing site: lat, east lon, height (m)

ARCHIVE_COLUMNS = [
    ("BJD_TDB (JD)", f"=SKY.HJD.TO.BJD.TDB(D{{r}};B{{r}};C{{r}};;;{SOURCE_CELL})", "0.000000", 3.0),
    ("BJD_TDB - HJD_UTC (s)", "=(E{r}-D{r})*86400", "0.000", 2.6),
    ("HJD_UTC back (JD)", f"=SKY.BJD.TDB.TO.HJD(E{{r}};B{{r}};C{{r}};;;{SOURCE_CELL})",
     "0.000000", 3.0),
    ("Round trip (us)", "=(G{r}-D{r})*86400000000", "0.000", 2.4),
    ("HJD_TT (JD)", f'=SKY.BJD.TDB.TO.HJD(E{{r}};B{{r}};C{{r}};"TT";;{SOURCE_CELL})', "0.000000", 3.0),
    ("UTC of the exposure", f"=SKY.HJD.UTC.DATETIME(D{{r}};B{{r}};C{{r}};;;;;{SOURCE_CELL})",
     "YYYY-MM-DD HH:MM:SS.000", 4.2),
    ("BJD_TDB from the site (JD)",
     f"=SKY.BJD.TDB(J{{r}};B{{r}};C{{r}};;;$B$6;$C$6;$D$6;{SOURCE_CELL})", "0.0000000", 3.2),
    ("Site - geocentre (ms)", "=(K{r}-E{r})*86400000", "+0.000;-0.000", 2.6),
    ("UTC back from the site's BJD", f"=SKY.BJD.TDB.DATETIME(K{{r}};B{{r}};C{{r}};;$B$6;$C$6;$D$6;{SOURCE_CELL})",
     "YYYY-MM-DD HH:MM:SS.000", 4.2),
]


def archive_sheet(doc, sheet):
    note(sheet, 0,
         "Invented: the circle's archived timings, published as HJD_UTC, carried over to "
         "BJD_TDB (the two differ by over a minute: never mix them), and back. The BJD from "
         "the site adds the site's offset from the Earth's centre (up to 21 ms). Uses "
         "SKY.HJD.TO.BJD.TDB, SKY.BJD.TDB.TO.HJD, SKY.HJD.UTC.DATETIME, SKY.BJD.TDB with a "
         "site and SKY.BJD.TDB.DATETIME.", 12)
    _source_rows(sheet)
    header(sheet, 4, ["Site (invented)", "Latitude (deg)", "Longitude E (deg)", "Height (m)"])
    sheet.getCellByPosition(0, 5).setString("Saltmarsh circle")
    sheet.getCellRangeByPosition(1, 5, 3, 5).setDataArray((SITE,))
    top = 7
    header(sheet, top, ["Field", "RA (deg)", "Dec (deg)", "HJD_UTC (JD, archive)"]
           + [c[0] for c in ARCHIVE_COLUMNS])
    first = top + 1
    last = first + len(ARCHIVE) - 1
    sheet.getCellRangeByPosition(0, first, 3, last).setDataArray(tuple(ARCHIVE))
    format_range(sheet, 3, first, last, number_format(doc, "0.00000"))
    fill_columns(doc, sheet, first, last, 4, [c[1:3] for c in ARCHIVE_COLUMNS], right=False)
    widths(sheet, [3.0, 2.2, 2.2, 3.0] + [c[3] for c in ARCHIVE_COLUMNS])


def fill(doc):
    planet_calendar_sheet(doc, sheet_at(doc, 0, "Planet calendar"))
    archive_sheet(doc, sheet_at(doc, 1, "HJD archive"))
