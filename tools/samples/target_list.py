"""target_list.ods: one night's targets of the Saltmarsh circle at its Curlew Staithe
field site (invented): coordinate systems, precession, proper motion, sidereal time and
the horizon (the coordinates and horizon families).
"""

import datetime
import random

import uno
from sheetkit import format_range, header, note, number_format, widths

from .common import CENTER, OBSERVERS, RIGHT, TARGETS, fill_columns, serial, sheet_at

FILE_NAME = "target_list.ods"

SITE_NAME = "Curlew Staithe"
SITE_LATITUDE = 52.6  # degrees north, invented
SITE_LONGITUDE = 1.3  # degrees east, invented
SITE_HEIGHT = 25.0  # metres above the WGS84 ellipsoid, invented
# UTC; the Sun is more than 18 degrees below the horizon there from about 17:57 to 05:24
# (checked with astropy 8.0 get_sun for this site; not a test, only the choice of times)
NIGHT_START = datetime.datetime(2026, 11, 19, 18, 5)
NIGHT_MIDDLE = datetime.datetime(2026, 11, 20, 0, 0)  # UTC: the date of the "of date" systems
NIGHT_ROWS = 34  # every 20 minutes (+-3) from 18:05 to 05:05

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

SITE_NAMES = {  # named cells on the Site sheet, so formulas read as what they mean
    "SiteLat": 3, "SiteLon": 4, "SiteHeight": 5, "NightDate": 7,
}


def site_sheet(doc, sheet):
    note(sheet, 0,
         f"Saltmarsh Variable Star Circle: the night of 19-20 November 2026 at its {SITE_NAME} "
         "field site. The site and its coordinates are INVENTED (they are not those of any "
         "real observatory). The other sheets read the site and the date from the named cells "
         "SiteLat, SiteLon, SiteHeight and NightDate here: change them and the whole workbook "
         "follows. Uses SKY.TEXT.DMS, SKY.TEXT.ISO, SKY.SIDEREAL (GAST, GMST, ERA), "
         "SKY.TEXT.HMS and SKY.VERSION.", 4)
    sheet.getRows().getByIndex(0).Height = 1900  # three lines of note
    header(sheet, 1, ["Item", "Value", "As written", "About it"])
    rows = [
        ("Site", SITE_NAME, "", "an invented field site of the circle"),
        ("Latitude (deg, north +)", SITE_LATITUDE, "=SKY.TEXT.DMS(B4;0)",
         "geodetic (WGS84), invented  [named SiteLat]"),
        ("Longitude (deg, east +)", SITE_LONGITUDE, "=SKY.TEXT.DMS(B5;0)",
         "east positive, as the functions take it; invented  [named SiteLon]"),
        ("Height (m)", SITE_HEIGHT, "", "above the WGS84 ellipsoid, invented  [named SiteHeight]"),
        ("Start of the night's plan (UTC)", serial(NIGHT_START), "=SKY.TEXT.ISO(B7;;;;0)",
         "after astronomical dusk at the site (the Sun 18 degrees below the horizon)"),
        ("Date of the night (UTC)", serial(NIGHT_MIDDLE), '=SKY.TEXT.ISO(B8;"UTC";"TT";;3)',
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
    # Centred, so the text stands apart from the number before it and the words after it.
    sheet.getCellRangeByPosition(2, 2, 2, 2 + len(rows) - 1).HoriJustify = CENTER
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
    fill_columns(doc, sheet, first, last, 3, [
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
    fill_columns(doc, sheet, rfirst, rlast, 0, [("=A{t}", "@")], source_first=first, right=False)
    fill_columns(doc, sheet, rfirst, rlast, 2, [
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
    fill_columns(doc, sheet, first, last, 0, [
        ("=$Targets.A{t}", "@"),
    ], source_first=TARGET_FIRST, right=False)
    fill_columns(doc, sheet, first, last, 1, [
        ("=$Targets.D{t}", deg), ("=$Targets.E{t}", sdeg),
    ], source_first=TARGET_FIRST)
    coord = '"EQUATORIAL J2000";"EQUATORIAL DATE";$D$3'
    fill_columns(doc, sheet, first, last, 3, [
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
    fill_columns(doc, sheet, sfirst, slast, 3, [
        ("=SKY.ANGLE.HOURS(B{r})", deg),
        ("=SKY.ANGLE(C{r})", sdeg),
    ])
    fill_columns(doc, sheet, sfirst, slast, 9, [
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
    start = serial(NIGHT_START)
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
    sheet.getCellRangeByPosition(2, first, 2, last).HoriJustify = CENTER  # observer
    table = f"$Targets.$A${TARGET_FIRST + 1}:$E${TARGET_FIRST + len(FIELDS)}"
    fill_columns(doc, sheet, first, last, 4, [
        (f"=VLOOKUP(D{{r}};{table};4;0)", "0.000000"),
        (f"=VLOOKUP(D{{r}};{table};5;0)", "+0.000000;-0.000000"),
    ])
    fill_columns(doc, sheet, first, last, 8, [(c[1], c[2]) for c in NIGHT_COLUMNS])
    widths(sheet, [1.0, 3.8, 2.2, 2.2, 2.4, 2.4, 2.0, 2.8] + [c[3] for c in NIGHT_COLUMNS])




def fill(doc):
    # The Site sheet first: the named cells must exist before formulas use them.
    site_sheet(doc, sheet_at(doc, 0, "Site"))
    targets_sheet(doc, sheet_at(doc, 1, "Targets"))
    precession_sheet(doc, sheet_at(doc, 2, "Precession and motion"))
    night_sheet(doc, sheet_at(doc, 3, "Night log"), invented_night())
