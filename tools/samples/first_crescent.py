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


# Bright stars for the watch's heliacal calendar: ICRS J2000 places, proper motions (mas
# a year) and V magnitudes as catalogues give them (rounded, from memory; for the
# example only).
STARS = [
    ("Sirius", 101.2872, -16.7161, -1.46, -546.01, -1223.07),
    ("Canopus", 95.9880, -52.6957, -0.74, 19.93, 23.24),
    ("Arcturus", 213.9153, 19.1824, -0.05, -1093.39, -2000.06),
    ("Aldebaran", 68.9802, 16.5093, 0.86, 63.45, -188.94),
    ("Regulus", 152.0930, 11.9672, 1.40, -248.73, 5.59),
    ("Spica", 201.2983, -11.1613, 0.97, -42.35, -30.67),
    ("Antares", 247.3519, -26.4320, 1.09, -12.11, -23.30),
    ("Alcyone (Pleiades)", 56.8712, 24.1051, 2.87, 19.34, -43.67),
]
PLANETS = ("MERCURY", "VENUS", "MARS", "JUPITER", "SATURN")
# The watch's history evening (invented): Sirius's heliacal rising at Memphis (about
# 29.85 N, 31.25 E) in years of the Sothic literature, local mean time.
HISTORY_YEARS = ("-1449-06-01", "-1313-06-01", "-0238-06-01", "0139-06-01")


def heliacal_sheet(doc, sheet):
    note(sheet, 0,
         f"The {CLUB}'s heliacal calendar for {YEAR} at {SITE} (the site on the first "
         "sheet): the first morning each bright star and planet is seen again in the dawn "
         "(heliacal rising) and the last evening it is seen in the dusk (heliacal "
         "setting), by the arcus visionis: the Sun's depression at the target's rising or "
         "setting must reach it. The cells show the target's rising (setting) on that "
         "morning (evening), local time. The arcus visionis of a star comes from its "
         "magnitude (SKY.ARCUS.VISIONIS), of a planet from Ptolemy; values scatter by a "
         "degree or two, a day or two in the date. Below: the watch's history evening, "
         "Sirius at Memphis in antiquity (scale UT, local mean time, Julian calendar). "
         "Uses SKY.HELIACAL.STAR, SKY.HELIACAL.PLANET, SKY.ARCUS.VISIONIS and "
         "SKY.TEXT.DATE.", 10)
    sheet.getRows().getByIndex(0).Height = 2400
    note(sheet, 1, CRESCENT_CAUTION, 10)
    sheet.getRows().getByIndex(1).Height = 900
    sheet.getCellByPosition(0, 1).CharWeight = 150.0
    site = "'Crescent watch'.$A$4;'Crescent watch'.$B$4"
    offset = "'Crescent watch'.$D$4"
    header(sheet, 2, ["Star", "RA (deg)", "Dec (deg)", "V", "pm RA (mas/yr)",
                      "pm Dec (mas/yr)", "Arcus visionis (deg)",
                      f"Heliacal rising {YEAR}", f"Heliacal setting {YEAR}"])
    first = 3
    last = first + len(STARS) - 1
    sheet.getCellRangeByPosition(0, first, 5, last).setDataArray(tuple(STARS))
    fill_columns(doc, sheet, first, last, 6, [
        ("=SKY.ARCUS.VISIONIS(D{r})", "0.0"),
        (f'=SKY.HELIACAL.STAR(B{{r}};C{{r}};D{{r}};DATE({YEAR};1;1);{site};"RISING";'
         f'"UTC";{offset};;E{{r}};F{{r}})', "YYYY-MM-DD HH:MM"),
        (f'=SKY.HELIACAL.STAR(B{{r}};C{{r}};D{{r}};DATE({YEAR};1;1);{site};"SETTING";'
         f'"UTC";{offset};;E{{r}};F{{r}})', "YYYY-MM-DD HH:MM"),
    ])
    top = last + 2
    header(sheet, top, ["Planet", "", "", "", "", "", "Arcus visionis (deg)",
                        f"Heliacal rising from {YEAR}", f"Heliacal setting from {YEAR}"])
    p_first = top + 1
    p_last = p_first + len(PLANETS) - 1
    sheet.getCellRangeByPosition(0, p_first, 0, p_last).setDataArray(
        tuple((p,) for p in PLANETS))
    arcs = {"MERCURY": 10.0, "VENUS": 5.0, "MARS": 11.5, "JUPITER": 10.0, "SATURN": 11.0}
    sheet.getCellRangeByPosition(6, p_first, 6, p_last).setDataArray(
        tuple((arcs[p],) for p in PLANETS))
    fill_columns(doc, sheet, p_first, p_last, 7, [
        (f'=SKY.HELIACAL.PLANET(A{{r}};DATE({YEAR};1;1);{site};"RISING";"UTC";{offset})',
         "YYYY-MM-DD HH:MM"),
        (f'=SKY.HELIACAL.PLANET(A{{r}};DATE({YEAR};1;1);{site};"SETTING";"UTC";{offset})',
         "YYYY-MM-DD HH:MM"),
    ])
    top = p_last + 2
    header(sheet, top, ["Sirius at Memphis", "Latitude", "Longitude", "Searched from",
                        "", "", "Arcus visionis (deg)", "Heliacal rising (value)",
                        "Heliacal rising (Julian calendar, local mean time)"])
    h_first = top + 1
    h_last = h_first + len(HISTORY_YEARS) - 1
    sheet.getCellRangeByPosition(0, h_first, 3, h_last).setDataArray(
        tuple(("Sirius", 29.85, 31.25, y) for y in HISTORY_YEARS))
    fill_columns(doc, sheet, h_first, h_last, 6, [
        ("=SKY.ARCUS.VISIONIS(-1.46)", "0.0"),
        ('=SKY.HELIACAL.STAR(101.2872;-16.7161;-1.46;D{r};B{r};C{r};"RISING";"UT";'
         'C{r}/15;;-546.01;-1223.07)', "0.000"),
        ('=SKY.TEXT.DATE(H{r};"UT";;"JULIAN";"HISTORICAL")', "@"),
    ])
    widths(sheet, [3.8, 2.0, 2.0, 2.6, 2.4, 2.4, 2.6, 4.0, 5.6])


def fill(doc):
    crescent_sheet(doc, sheet_at(doc, 0, "Crescent watch"))
    heliacal_sheet(doc, sheet_at(doc, 1, "Heliacal dates"))
