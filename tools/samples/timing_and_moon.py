"""timing_and_moon.ods: the Saltmarsh circle's variable-star timing log for 2027 carried
to BJD_TDB and HJD, and the Moon's phases of 2027 with the eclipse seasons (invented
scenario; the Moon and eclipse families and the timing functions).
"""

import random

from sheetkit import format_range, header, note, number_format, widths

from .common import CENTER, RIGHT, fill_columns, sheet_at

FILE_NAME = "timing_and_moon.ods"

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
    fill_columns(doc, sheet, first, last, 4, [c[1:3] for c in TIMING_COLUMNS], right=False)
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
    fill_columns(doc, sheet, first, last, 2, [c[1:3] for c in MOON_COLUMNS], right=False)
    for k, (title, _, code, _) in enumerate(MOON_COLUMNS):
        column = sheet.getCellRangeByPosition(2 + k, first, 2 + k, last)
        if title.endswith(("(HMS)", "(DMS)")):  # lines up with the numbers beside it
            column.HoriJustify = RIGHT
        elif code == "@":  # words: centred, apart from the number before them
            column.HoriJustify = CENTER
    widths(sheet, [2.6, 1.6] + [c[3] for c in MOON_COLUMNS])


def fill(doc):
    timing_sheet(doc, sheet_at(doc, 0, "Timing log"))
    moon_sheet(doc, sheet_at(doc, 1, "Moon"))
