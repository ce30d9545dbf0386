"""first_crescent.ods: the Harrowdene Crescent Watch (invented) at its Sarrow Ridge site
(invented coordinates): the evenings after each new Moon of 2027 with the crescent's
geometry at the best time and the criteria of Yallop (1997) and Odeh (2006), and a few
heliacal dates (the visibility family).
"""

import datetime
import os
import sys

from sheetkit import format_range, header, note, number_format, widths

from .common import CENTER, fill_columns, serial, sheet_at

FILE_NAME = "first_crescent.ods"

CLUB = "Harrowdene Crescent Watch"
SITE = "Sarrow Ridge"
LATITUDE = 31.84   # degrees north, invented
LONGITUDE = 35.47  # degrees east, invented
HEIGHT = 410.0     # metres, invented
UTC_OFFSET = 2.0   # the watch keeps local standard time all year
YEAR = 2027

# The sky the watchers wrote in the log (invented, for the example only).
LOG_WORDS = ("clear", "haze low in the west", "cloud on the horizon", "clear",
             "dust haze", "clear, wind")

CRESCENT_CAUTION = (
    "CAUTION: never look at the Sun, and never point binoculars, a telescope or a camera "
    "at it or near it, without a proper solar filter made for that purpose over the front "
    "of the instrument. Sweep for a young crescent only after the Sun has fully set, and "
    "keep any optics away from the place where it went down.")


def evenings():
    """The local dates of the first and second evenings after each new Moon of the year,
    from the core's new Moons (the local date of the new Moon plus one and two)."""
    root = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
    sys.path.insert(0, root)
    import numpy as np

    from calcfuncs.moon import next_phase_cells
    from calcfuncs.timescales import Instants

    out = []
    jd = 2451544.5 + (datetime.date(YEAR, 1, 1) - datetime.date(2000, 1, 1)).days
    while True:
        found = next_phase_cells(Instants(np.array([jd]), np.zeros(1), "UTC"), "NEW")
        utc = found.instants
        new_jd = float(utc.jd1[0] + utc.jd2[0])
        local = datetime.datetime(2000, 1, 1, 12) + datetime.timedelta(
            days=new_jd - 2451545.0 + UTC_OFFSET / 24.0)
        if local.year > YEAR:
            return out
        for k in (1, 2):
            out.append(datetime.datetime(local.year, local.month, local.day)
                       + datetime.timedelta(days=k))
        jd = new_jd + 1.0


def crescent_sheet(doc, sheet):
    note(sheet, 0,
         f"Invented: the {CLUB}'s evenings at {SITE} ({LATITUDE} N, {LONGITUDE} E, "
         f"{HEIGHT:g} m; clock UTC+{UTC_OFFSET:g}) after each new Moon of {YEAR}. For each "
         "evening: the new Moon, sunset, Yallop's best time (sunset + 4/9 of the lag) and "
         "moonset on the local clock; the Moon's age and the lag; at the best time the arc "
         "of light ARCL, the arc of vision ARCV (topocentric, and geocentric as Yallop's q "
         "takes it), the relative azimuth DAZ and the crescent's width W; Yallop's q and "
         "class (A easily visible ... F below the Danjon limit) and Odeh's V and zone (A "
         "naked eye ... D not visible). The sky column of the log is invented. Uses SKY.CRESCENT, "
         "SKY.CRESCENT.TIME, SKY.CRESCENT.CRITERION and SKY.CRESCENT.CLASS.", 18)
    sheet.getRows().getByIndex(0).Height = 2200
    note(sheet, 1, CRESCENT_CAUTION, 18)
    sheet.getRows().getByIndex(1).Height = 900
    sheet.getCellByPosition(0, 1).CharWeight = 150.0
    header(sheet, 2, ["Latitude", "Longitude", "Height (m)", "UTC offset (h)"])
    sheet.getCellRangeByPosition(0, 3, 3, 3).setDataArray(
        ((LATITUDE, LONGITUDE, HEIGHT, UTC_OFFSET),))
    header(sheet, 4, ["Evening (local)", "New Moon (local)", "Sunset", "Best time", "Moonset",
                      "Age (h)", "Lag (min)", "ARCL (deg)", "ARCV topo (deg)",
                      "ARCV geo (deg)", "DAZ (deg)", "W (arcmin)", "Yallop q",
                      "Yallop class", "Odeh V", "Odeh zone", "Meaning (Yallop)", "Sky (log)"])
    days = evenings()
    first = 5
    last = first + len(days) - 1
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(
        tuple((serial(d),) for d in days))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    fill_columns(doc, sheet, first, last, 1, [
        ('=SKY.CRESCENT.TIME(A{r};$A$4;$B$4;"NEW";"UTC";$D$4;$C$4)', "MM-DD HH:MM"),
        ('=SKY.CRESCENT.TIME(A{r};$A$4;$B$4;"SUNSET";"UTC";$D$4;$C$4)', "HH:MM:SS"),
        ('=SKY.CRESCENT.TIME(A{r};$A$4;$B$4;"BEST";"UTC";$D$4;$C$4)', "HH:MM:SS"),
        ('=SKY.CRESCENT.TIME(A{r};$A$4;$B$4;"MOONSET";"UTC";$D$4;$C$4)', "HH:MM:SS"),
        ('=SKY.CRESCENT(A{r};$A$4;$B$4;"AGE";"UTC";$D$4;$C$4)', "0.0"),
        ('=SKY.CRESCENT(A{r};$A$4;$B$4;"LAG";"UTC";$D$4;$C$4)', "0"),
        ('=SKY.CRESCENT(A{r};$A$4;$B$4;"ARCL";"UTC";$D$4;$C$4)', "0.00"),
        ('=SKY.CRESCENT(A{r};$A$4;$B$4;"ARCV";"UTC";$D$4;$C$4)', "0.00"),
        ('=SKY.CRESCENT(A{r};$A$4;$B$4;"ARCV";"UTC";$D$4;$C$4;"GEOCENTRIC")', "0.00"),
        ('=SKY.CRESCENT(A{r};$A$4;$B$4;"DAZ";"UTC";$D$4;$C$4)', "0.00"),
        ('=SKY.CRESCENT(A{r};$A$4;$B$4;"WIDTH";"UTC";$D$4;$C$4)', "0.000"),
        ('=SKY.CRESCENT.CRITERION(A{r};$A$4;$B$4;"YALLOP";"UTC";$D$4;$C$4)', "0.000"),
        ('=SKY.CRESCENT.CLASS(A{r};$A$4;$B$4;"YALLOP";"UTC";$D$4;$C$4)', "@"),
        ('=SKY.CRESCENT.CRITERION(A{r};$A$4;$B$4;"ODEH";"UTC";$D$4;$C$4)', "0.00"),
        ('=SKY.CRESCENT.CLASS(A{r};$A$4;$B$4;"ODEH";"UTC";$D$4;$C$4)', "@"),
        ('=SKY.CRESCENT.CLASS(A{r};$A$4;$B$4;"YALLOP";"UTC";$D$4;$C$4;"WORDS")', "@"),
    ], right="text")
    sheet.getCellRangeByPosition(17, first, 17, last).setDataArray(
        tuple((LOG_WORDS[k % len(LOG_WORDS)],) for k in range(len(days))))
    for col in (13, 15):
        sheet.getCellRangeByPosition(col, first, col, last).HoriJustify = CENTER
    widths(sheet, [2.6, 2.8, 2.0, 2.0, 2.0, 1.6, 1.6, 1.8, 1.9, 1.9, 1.7, 1.8, 1.7, 1.6,
                   1.6, 1.5, 6.5, 3.2])


def fill(doc):
    crescent_sheet(doc, sheet_at(doc, 0, "Crescent watch"))
