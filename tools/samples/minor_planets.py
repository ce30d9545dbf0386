"""minor_planets.ods (invented scenario): the Saltmarsh circle's minor-planet section, its
target list of orbital elements and a month's ephemeris of one target (the orbits family).

Written by tools/make_sample_sheets.py; every number is a live SKY. formula.  The
objects, their designations and their elements are invented (laid out in the Minor
Planet Center's one-line formats, an open format of the trade, so that a real line
pasted from the MPC works the same way).
"""

import datetime

from sheetkit import format_range, header, note, number_format, widths

from .common import fill_columns, sheet_at
from .night_plan import SITE_HEIGHT, SITE_LATITUDE, SITE_LONGITUDE

FILE_NAME = "minor_planets.ods"

SOURCE_CELL = "$B$3"  # one cell chooses the ephemeris for the whole workbook
NIGHT = 46447.9166666667  # 2027-03-01 22:00 UTC, the section's evening of reference


def _minor_planet_line(packed, h, g, epoch, m, peri, node, inc, e, a, name):
    """An invented minor planet in the MPC's minor-planet layout (columns 1-based)."""
    line = bytearray(b" " * 194)

    def put(last, text):  # right-aligned in the field that ends in column ``last``
        line[last - len(text):last] = text.encode()
    line[0:7] = packed.ljust(7).encode()
    put(13, f"{h:5.2f}"), put(19, f"{g:5.2f}"), put(25, epoch), put(35, f"{m:9.5f}")
    put(46, f"{peri:9.5f}"), put(57, f"{node:9.5f}"), put(68, f"{inc:9.5f}")
    put(79, f"{e:9.7f}"), put(91, f"{0.9856076686 / a ** 1.5:11.8f}"), put(103, f"{a:11.7f}")
    line[166:166 + len(name)] = name.encode()
    return line.decode().rstrip()


def _comet_line(number, packed, year, month, day, q, e, peri, node, inc, epoch, m1, n, name):
    """An invented comet in the MPC's comet layout."""
    line = bytearray(b" " * 160)

    def put(last, text):
        line[last - len(text):last] = text.encode()
    put(4, number)
    line[4:12] = packed.ljust(8).encode()
    put(18, f"{year:4d}"), put(21, f"{month:02d}"), put(29, f"{day:7.4f}")
    put(39, f"{q:9.6f}"), put(49, f"{e:8.6f}"), put(59, f"{peri:8.4f}")
    put(69, f"{node:8.4f}"), put(79, f"{inc:8.4f}"), put(89, epoch)
    put(95, f"{m1:4.1f}"), put(100, f"{n:4.1f}")
    line[102:102 + len(name)] = name.encode()
    return line.decode().rstrip()


# The section's invented targets: three minor planets, a near-Earth object, two comets
# (one periodic, one on a hyperbolic orbit), in the MPC's layouts.
TARGETS = [
    ("Main belt", _minor_planet_line("K26S01A", 12.4, 0.15, "K2731", 210.0, 112.4, 203.7,
                                     6.3, 0.1280, 2.612, "Kettle A (invented)")),
    ("Main belt", _minor_planet_line("K25W37B", 13.9, 0.25, "K2731", 85.0, 54.8, 12.1,
                                     14.9, 0.0710, 3.104, "Kettle B (invented)")),
    ("Hilda", _minor_planet_line("K24F12C", 11.8, 0.15, "K2731", 52.0, 300.1, 150.2, 8.8,
                                 0.1900, 3.970, "Kettle C (invented)")),
    ("Near-Earth", _minor_planet_line("K27B04D", 19.6, 0.15, "K2731", 335.0, 250.6, 330.9,
                                      4.1, 0.4300, 1.420, "Staithe D (invented)")),
    ("Periodic comet", _comet_line("", "PK26C020", 2027, 4, 12.3125, 1.18, 0.62, 12.5,
                                   88.0, 9.7, "20270301", 11.0, 4.0,
                                   "P/2026 C2 (Curlew, invented)")),
    ("Hyperbolic comet", _comet_line("", "CK26Q010", 2027, 5, 2.75, 0.91, 1.0021, 140.0,
                                     25.0, 71.4, "20270301", 7.5, 3.2,
                                     "C/2026 Q1 (Whinburn, invented)")),
]

# The circle's Kettle Hill site (invented, as in night_plan.ods): lat; lon; scale; height.
KETTLE = f"{SITE_LATITUDE!r};{SITE_LONGITUDE!r};;{SITE_HEIGHT!r}"

TARGET_COLUMNS = [
    ("Designation", "=SKY.ORBIT.NAME(B{r})", "@", 5.6),
    ("Age of elements (d)", f"=SKY.ORBIT.AGE(B{{r}};{NIGHT})", "0.0", 2.2),
    # An open orbit has no period and may have no opposition: words instead of a message.
    ("Period (yr)", "=IF(ISNUMBER(SKY.ORBIT.PERIOD(B{r}));SKY.ORBIT.PERIOD(B{r});\"open "
     "orbit\")", "0.00", 2.0),
    ("RA (HMS)", f"=SKY.TEXT.HMS(SKY.ORBIT.RA(B{{r}};{NIGHT};;;;{SOURCE_CELL});1)", "@", 2.8),
    ("Dec (DMS)", f"=SKY.TEXT.DMS(SKY.ORBIT.DEC(B{{r}};{NIGHT};;;;{SOURCE_CELL});0)", "@", 2.8),
    ("Delta (au)", f"=SKY.ORBIT.EARTH.DIST(B{{r}};{NIGHT};;{SOURCE_CELL})", "0.0000", 2.0),
    ("r (au)", f"=SKY.ORBIT.SUN.DIST(B{{r}};{NIGHT})", "0.0000", 2.0),
    ("Elongation (deg)", f"=SKY.ORBIT.ELONGATION(B{{r}};{NIGHT};;{SOURCE_CELL})", "0.0", 2.2),
    ("Phase angle (deg)", f"=SKY.ORBIT.PHASE.ANGLE(B{{r}};{NIGHT};;{SOURCE_CELL})", "0.0", 2.2),
    ("Magnitude", f"=SKY.ORBIT.MAG(B{{r}};{NIGHT};;;;;{SOURCE_CELL})", "0.0", 2.0),
    ("Motion (\"/min)", f"=SKY.ORBIT.RATE(B{{r}};{NIGHT};;{SOURCE_CELL})", "0.00", 2.0),
    ("Motion PA (deg)", f"=SKY.ORBIT.RATE.PA(B{{r}};{NIGHT};;{SOURCE_CELL})", "0.0", 2.0),
    ("Next opposition (UTC)",
     f"=IF(ISNUMBER(SKY.ORBIT.EVENT.NEXT(B{{r}};{NIGHT};;\"OPPOSITION\";;{SOURCE_CELL}));"
     f"SKY.ORBIT.EVENT.NEXT(B{{r}};{NIGHT};;\"OPPOSITION\";;{SOURCE_CELL});"
     "\"none within ten years\")", "YYYY-MM-DD HH:MM", 3.4),
    ("Next perihelion (UTC)", f"=SKY.ORBIT.EVENT.NEXT(B{{r}};{NIGHT};;\"PERIHELION\")",
     "YYYY-MM-DD HH:MM", 3.4),
    ("Closest to the Earth (UTC)",
     f"=SKY.ORBIT.EVENT.NEXT(B{{r}};{NIGHT};;\"CLOSEST\";;{SOURCE_CELL})",
     "YYYY-MM-DD HH:MM", 3.4),
]

# Elements in cells, one a cell, made into an orbit with SKY.ORBIT.FROM.A and .FROM.Q.
CELL_TARGETS = [
    # epoch (TT), a, e, i, node, peri, M, H, G
    ("Kettle E (invented)", "2027-03-01", 2.381, 0.2140, 3.9, 77.7, 165.2, 280.0, 14.2, 0.15),
    ("Kettle F (invented)", "2027-03-01", 2.905, 0.0520, 21.6, 310.4, 12.8, 44.5, 13.1, 0.20),
]
CELL_COMET = ("Curlew G (invented)", "2027-06-20 06:00", 0.74, 0.99985, 118.3, 205.6, 12.9,
              "2027-03-01", 9.5, 10.0)


def _source_rows(sheet):
    sheet.getCellByPosition(0, 2).setString("Ephemeris source")
    sheet.getCellByPosition(1, 2).setString("BUILTIN")
    sheet.getCellByPosition(2, 2).setFormula(f"=SKY.EPHEMERIS({SOURCE_CELL})")


def targets_sheet(doc, sheet):
    note(sheet, 0,
         "Invented: the Saltmarsh circle's minor-planet section's targets for the evening of "
         "2027 March 1, 22:00 UTC. Each orbit is one cell: a line in the Minor Planet "
         "Center's one-line format (paste a real one from the MPC the same way), or made "
         "from elements in cells by SKY.ORBIT.FROM.A and SKY.ORBIT.FROM.Q (below). Places "
         "are geocentric (a near-Earth object can be arcminutes away from where the site "
         "sees it); two-body orbits drift as the elements age. The objects and elements are "
         "made up.", 12)
    _source_rows(sheet)
    top = 4
    header(sheet, top, ["Kind", "Orbit (MPC line)"] + [c[0] for c in TARGET_COLUMNS])
    first = top + 1
    rows = list(TARGETS)
    last = first + len(rows) - 1
    for k, (kind, line) in enumerate(rows):
        sheet.getCellByPosition(0, first + k).setString(kind)
        sheet.getCellByPosition(1, first + k).setString(line)
    fill_columns(doc, sheet, first, last, 2, [c[1:3] for c in TARGET_COLUMNS], right=False)

    ct = last + 3
    header(sheet, ct, ["Name", "Epoch (TT)", "a (au)", "e", "i (deg)", "Node (deg)",
                       "Peri (deg)", "M (deg)", "H", "G", "Orbit (made)", "RA (HMS)",
                       "Dec (DMS)", "Magnitude"])
    for k, row in enumerate(CELL_TARGETS):
        r = ct + 1 + k
        sheet.getCellByPosition(0, r).setString(row[0])
        sheet.getCellByPosition(1, r).setString(row[1])
        sheet.getCellRangeByPosition(2, r, 9, r).setDataArray((row[2:],))
        n = r + 1
        sheet.getCellByPosition(10, r).setFormula(
            f"=SKY.ORBIT.FROM.A(B{n};C{n};D{n};E{n};F{n};G{n};H{n};;I{n};J{n})")
        sheet.getCellByPosition(11, r).setFormula(
            f"=SKY.TEXT.HMS(SKY.ORBIT.RA(K{n};{NIGHT};;;;{SOURCE_CELL});1)")
        sheet.getCellByPosition(12, r).setFormula(
            f"=SKY.TEXT.DMS(SKY.ORBIT.DEC(K{n};{NIGHT};;;;{SOURCE_CELL});0)")
        sheet.getCellByPosition(13, r).setFormula(f"=SKY.ORBIT.MAG(K{n};{NIGHT})")
    qt = ct + len(CELL_TARGETS) + 2
    header(sheet, qt, ["Name", "Perihelion (TT)", "q (au)", "e", "i (deg)", "Node (deg)",
                       "Peri (deg)", "Epoch (TT)", "M1", "K1", "Orbit (made)", "RA (HMS)",
                       "Dec (DMS)", "Magnitude"])
    r = qt + 1
    n = r + 1
    sheet.getCellByPosition(0, r).setString(CELL_COMET[0])
    sheet.getCellByPosition(1, r).setString(CELL_COMET[1])
    sheet.getCellRangeByPosition(2, r, 6, r).setDataArray((CELL_COMET[2:7],))
    sheet.getCellByPosition(7, r).setString(CELL_COMET[7])
    sheet.getCellRangeByPosition(8, r, 9, r).setDataArray((CELL_COMET[8:],))
    sheet.getCellByPosition(10, r).setFormula(
        f"=SKY.ORBIT.FROM.Q(B{n};C{n};D{n};E{n};F{n};G{n};H{n};;I{n};J{n})")
    sheet.getCellByPosition(11, r).setFormula(
        f"=SKY.TEXT.HMS(SKY.ORBIT.RA(K{n};{NIGHT};;;;{SOURCE_CELL});1)")
    sheet.getCellByPosition(12, r).setFormula(
        f"=SKY.TEXT.DMS(SKY.ORBIT.DEC(K{n};{NIGHT};;;;{SOURCE_CELL});0)")
    sheet.getCellByPosition(13, r).setFormula(f"=SKY.ORBIT.MAG(K{n};{NIGHT})")
    widths(sheet, [3.0, 6.0] + [c[3] for c in TARGET_COLUMNS])


EPHEMERIS_COLUMNS = [
    ("RA (HMS)", f"=SKY.TEXT.HMS(SKY.ORBIT.RA($B$5;A{{r}};;;;{SOURCE_CELL});1)", "@", 2.8),
    ("Dec (DMS)", f"=SKY.TEXT.DMS(SKY.ORBIT.DEC($B$5;A{{r}};;;;{SOURCE_CELL});0)", "@", 2.8),
    ("RA ICRS astrometric (deg)",
     f"=SKY.ORBIT.RA($B$5;A{{r}};;\"ICRS\";\"ASTROMETRIC\";{SOURCE_CELL})", "0.00000", 3.0),
    ("Dec ICRS astrometric (deg)",
     f"=SKY.ORBIT.DEC($B$5;A{{r}};;\"ICRS\";\"ASTROMETRIC\";{SOURCE_CELL})",
     "+0.00000;-0.00000", 3.0),
    ("Ecl. lon, true (deg)", f"=SKY.ORBIT.LON($B$5;A{{r}};;;;{SOURCE_CELL})", "0.0000", 2.4),
    ("Ecl. lat, true (deg)", f"=SKY.ORBIT.LAT($B$5;A{{r}};;;;{SOURCE_CELL})",
     "+0.0000;-0.0000", 2.4),
    ("Helio. lon J2000 (deg)", "=SKY.ORBIT.HELIO.LON($B$5;A{r})", "0.0000", 2.6),
    ("Helio. lat J2000 (deg)", "=SKY.ORBIT.HELIO.LAT($B$5;A{r})", "+0.0000;-0.0000", 2.6),
    ("Helio. RA J2000 (deg)", "=SKY.ORBIT.HELIO.RA($B$5;A{r})", "0.0000", 2.6),
    ("Helio. Dec J2000 (deg)", "=SKY.ORBIT.HELIO.DEC($B$5;A{r})", "+0.0000;-0.0000", 2.6),
    ("Delta (au)", f"=SKY.ORBIT.EARTH.DIST($B$5;A{{r}};;{SOURCE_CELL})", "0.00000", 2.0),
    ("r (au)", "=SKY.ORBIT.SUN.DIST($B$5;A{r})", "0.00000", 2.0),
    ("Elong. (deg)", f"=SKY.ORBIT.ELONGATION($B$5;A{{r}};;{SOURCE_CELL})", "0.0", 1.8),
    ("Phase (deg)", f"=SKY.ORBIT.PHASE.ANGLE($B$5;A{{r}};;{SOURCE_CELL})", "0.0", 1.8),
    ("Mag.", f"=SKY.ORBIT.MAG($B$5;A{{r}};;;;;{SOURCE_CELL})", "0.0", 1.6),
    ("Motion (\"/min)", f"=SKY.ORBIT.RATE($B$5;A{{r}};;{SOURCE_CELL})", "0.000", 2.0),
    ("PA (deg)", f"=SKY.ORBIT.RATE.PA($B$5;A{{r}};;{SOURCE_CELL})", "0.0", 1.6),
    ("Age (d)", "=SKY.ORBIT.AGE($B$5;A{r})", "0.0", 1.6),
    ("RA ICRS, planets' pull (deg)",
     f"=SKY.ORBIT.RA($B$5;A{{r}};;\"ICRS\";\"ASTROMETRIC\";{SOURCE_CELL};\"PLANETS\")",
     "0.00000", 3.0),
    ("Dec ICRS, planets' pull (deg)",
     f"=SKY.ORBIT.DEC($B$5;A{{r}};;\"ICRS\";\"ASTROMETRIC\";{SOURCE_CELL};\"PLANETS\")",
     "+0.00000;-0.00000", 3.0),
    ("Pull in RA (\")", "=(T{r}-D{r})*3600*COS(RADIANS(E{r}))", "+0.00;-0.00", 2.0),
    ("Pull in Dec (\")", "=(U{r}-E{r})*3600", "+0.00;-0.00", 2.0),
    # Seen from the circle's Kettle Hill site (invented: as in night_plan.ods) at 21h UTC:
    # a near-Earth object's parallax shows against the geocentric place.
    ("Kettle Hill 21h: RA (deg)",
     f"=SKY.ORBIT.TOPO.RA($B$5;A{{r}}+0.875;{KETTLE};;;{SOURCE_CELL})", "0.00000", 2.6),
    ("Kettle Hill 21h: Dec (deg)",
     f"=SKY.ORBIT.TOPO.DEC($B$5;A{{r}}+0.875;{KETTLE};;;{SOURCE_CELL})",
     "+0.00000;-0.00000", 2.6),
    ("Kettle Hill 21h: alt, unrefracted (deg)",
     f"=SKY.ORBIT.TOPO.ALT($B$5;A{{r}}+0.875;{KETTLE};;;{SOURCE_CELL})", "+0.0;-0.0",
     2.2),
    ("Kettle Hill 21h: az (deg)",
     f"=SKY.ORBIT.TOPO.AZ($B$5;A{{r}}+0.875;{KETTLE};;;{SOURCE_CELL})", "0.0", 2.2),
]


def ephemeris_sheet(doc, sheet):
    note(sheet, 0,
         "Invented: a month's ephemeris of the section's near-Earth target (Staithe D, made "
         "up) at 0h UTC each night of March 2027: geocentric apparent and astrometric "
         "places, heliocentric places, distances, elongation, phase, magnitude and the rate "
         "and direction of motion (for trailing and exposure limits); at the right, the "
         "astrometric place with the planets' pull integrated from the elements' epoch "
         "(model PLANETS) and how far it moves the two-body place. Change B5 to another "
         "orbit line and the whole month follows.", 12)
    _source_rows(sheet)
    sheet.getCellByPosition(0, 4).setString("Orbit")
    sheet.getCellByPosition(1, 4).setString(TARGETS[3][1])
    top = 6
    header(sheet, top, ["Date (UTC)"] + [c[0] for c in EPHEMERIS_COLUMNS])
    first = top + 1
    days = 31
    last = first + days - 1
    start = (datetime.date(2027, 3, 1) - datetime.date(1899, 12, 30)).days
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(
        tuple((float(start + k),) for k in range(days)))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    fill_columns(doc, sheet, first, last, 1, [c[1:3] for c in EPHEMERIS_COLUMNS], right=False)
    widths(sheet, [2.6] + [c[3] for c in EPHEMERIS_COLUMNS])


def fill(doc):
    targets_sheet(doc, sheet_at(doc, 0, "Targets"))
    ephemeris_sheet(doc, sheet_at(doc, 1, "Ephemeris"))
