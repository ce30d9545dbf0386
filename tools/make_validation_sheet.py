"""Write sample_sheets/validation.ods: published reference values beside our functions.

    .venv/bin/python tools/make_validation_sheet.py --oxt dist/eclipsheet.oxt [--out DIR]

Each row holds a value published by a standard (SOFA/ERFA test cases, IAU and IERS
definitions), a handbook's worked example (Meeus, "Astronomical Algorithms", 2nd ed.)
or an almanac office (US Naval Observatory), a live formula with one of our SKY.
functions, the difference, a tolerance with its reason, and PASS or FAIL from a plain
Calc IF().  The reference is typed as a native Calc formula from the published figures
(=(13+13/60+30.749/3600)*15), so nothing of ours computes it.  An ODS file keeps the
numbers in a formula to 15 significant digits (LibreOffice 7.4), so a reference that
needs more is split (=53750+0.8924826384444444).  Where a value is quoted
from memory of the publication, the source says so.  A row whose tolerance allows for a
known difference between the published model and ours (IAU 1976 precession against IAU
2006, for example) says which.

The rows are data (ROWS, below); the office writes them into one sheet.  Loading this
module needs no office, so the tests can read ROWS.
"""

import argparse
import os
import re
import sys
import zipfile

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
FILE_NAME = "validation.ods"
SHEET_NAME = "Validation"

# How the difference is formed from our value (G) and the reference (F), per unit.
DIFFERENCES = {
    "s (from days)": "(G{r}-F{r})*86400",
    "s (from hours)": "(G{r}-F{r})*3600",
    "s (from minutes)": "(G{r}-F{r})*60",
    "s": "G{r}-F{r}",
    "arcsec (from degrees)": "SKY.WRAP.180(G{r}-F{r})*3600",
    "arcsec": "G{r}-F{r}",
    "rad": "G{r}-F{r}",
    "deg": "SKY.WRAP.180(G{r}-F{r})",
    "km": "G{r}-F{r}",
    "days": "G{r}-F{r}",
    "none": "G{r}-F{r}",
}
TEXT = "text (0 = the same)"

DT = "YYYY-MM-DD HH:MM:SS"
SUN_CAUTION = ("Caution: never look at the Sun, and never point binoculars, a telescope or a "
               "camera at it, without a proper solar filter made for that purpose.")

# (family, what is checked, as published, source, reference formula or text,
#  our formula, unit of the difference, tolerance, value format, why this tolerance)
ROWS = [
    # ---- time ----------------------------------------------------------------------------
    ("Time", "J2000.0 as a Julian Date", "2000 January 1, 12:00 TT = JD 2451545.0",
     "IAU definition of the standard epoch J2000.0 (IAU 1976; Explanatory Supplement)",
     "=2451545", '=SKY.JD("2000-01-01T12:00:00";"TT")', "s (from days)", 0.001, "0.000000",
     "A JD in one cell resolves about 40 us."),
    ("Time", "J2000.0 on UTC", "2000-01-01 11:58:55.816 UTC",
     "TT - UTC = 32.184 s + 32 leap seconds in 2000 (IERS Bulletin C); common practice",
     "2000-01-01T11:58:55.816", '=SKY.TEXT.ISO("JD 2451545.0";"TT";"UTC";;3)', TEXT, 0, "@",
     "The same text to the millisecond."),
    ("Time", "Julian Date of a Gregorian date", "1957 October 4.81 = JD 2436116.31",
     "Meeus, Astronomical Algorithms (2nd ed.), Example 7.a (launch of Sputnik 1)",
     "=2436116.31", '=SKY.JD("1957-10-04T19:26:24";"TT")', "s (from days)", 0.001, "0.000000",
     "4.81 days is exactly 19:26:24; a JD cell resolves about 40 us."),
    ("Time", "Julian Date of a Julian-calendar date", "333 January 27, 12h = JD 1842713.0",
     "Meeus, Astronomical Algorithms (2nd ed.), Example 7.b",
     "=1842713", '=SKY.JD("333 January 27 12:00";"TT")', "s (from days)", 0.001, "0.000000",
     "Dates before 1582-10-15 are read in the Julian calendar, as in the example."),
    ("Time", "A leap second, on TAI", "2016-12-31 23:59:60.5 UTC = 2017-01-01 00:00:36.5 TAI",
     "IERS Bulletin C 52: leap second at the end of 2016 December 31, TAI - UTC 36 s "
     "before it, 37 s after",
     "2017-01-01T00:00:36.500", '=SKY.TEXT.ISO("2016-12-31T23:59:60.5Z";"UTC";"TAI";;3)',
     TEXT, 0, "@", "The same text to the millisecond."),
    ("Time", "UTC to TAI", "UTC 2453750.5 + 0.892100694 -> TAI 2453750.5 + 0.8924826384444444",
     "SOFA/ERFA test case of eraUtctai (t_erfa_c.c)",
     "=53750+0.8924826384444444", '=SKY.MJD("MJD 53750.892100694";"UTC";"TAI")', "s (from days)",
     1e-5, "0.000000000", "An MJD in one cell resolves about 1 us."),
    ("Time", "Delta T, Espenak-Meeus polynomial", "29.07 s at 1950.0",
     "Espenak and Meeus (2006), Five Millennium Canon, polynomial for 1941-1961 "
     "(29.07 + 0.407u - u^2/233 + u^3/2547); value from memory",
     "=29.07", '=SKY.DELTAT("1950-01-01";"UT";;"ESPENAK2006")', "s", 0.05, "0.000",
     "The polynomial at its origin; 0.05 s allows for the authors' mid-month year convention "
     "(0.02 s)."),
    # ---- angles --------------------------------------------------------------------------
    ("Angles", "Right ascension text to degrees", "7h45m18.946s = 116.328942 deg",
     "Meeus, Astronomical Algorithms, Example 13.a (Pollux, J2000)",
     "=116.328942", '=SKY.ANGLE.HOURS("7h45m18.946s")', "arcsec (from degrees)", 0.002,
     "0.000000", "The published degrees are rounded to 1e-6 deg (0.0018\")."),
    ("Angles", "Degrees to sexagesimal text", "84381.406\" = 23 deg 26' 21.406\"",
     "IAU 2006 obliquity at J2000.0 (IAU 2006 Resolution B1; Hilton et al. 2006)",
     "+23°26'21.406\"", "=SKY.TEXT.DMS(84381.406/3600;3)", TEXT, 0, "@",
     "The same text to 0.001\"."),
    # ---- obliquity and nutation ----------------------------------------------------------
    ("Obliquity", "Mean obliquity at J2000.0, IAU 2006", "84381.406\"",
     "IAU 2006 Resolution B1 (Hilton et al. 2006)",
     "=84381.406", '=SKY.OBLIQUITY("J2000.0";"TT";"IAU2006";"ARCSEC")', "arcsec", 1e-6,
     "0.000000", "The constant term of the formula, exact."),
    ("Obliquity", "Mean obliquity, IAU 2006, at a date", "0.4090749229387258204 rad at MJD 54388 TT",
     "SOFA/ERFA test case of eraObl06 (t_erfa_c.c)",
     "=0.4090749229387258204", '=SKY.OBLIQUITY("MJD 54388";"TT";"IAU2006";"RAD")', "rad",
     1e-14, "0.000000000000000", "SOFA's own tolerance for this test."),
    ("Obliquity", "Nutation in longitude, IAU 2000A (2006)", "-0.9630912025820308797e-5 rad at MJD 53736 TT",
     "SOFA/ERFA test case of eraNut06a (t_erfa_c.c)",
     "=-0.9630912025820308797E-5", '=SKY.NUTATION.LON("MJD 53736";"TT";"IAU2000A";"RAD")',
     "rad", 1e-13, "0.000000000000E+00", "SOFA's own tolerance for this test."),
    ("Obliquity", "Nutation in obliquity, IAU 2000A (2006)", "0.4063238496887249798e-4 rad at MJD 53736 TT",
     "SOFA/ERFA test case of eraNut06a (t_erfa_c.c)",
     "=0.4063238496887249798E-4", '=SKY.NUTATION.OBL("MJD 53736";"TT";"IAU2000A";"RAD")',
     "rad", 1e-13, "0.000000000000E+00", "SOFA's own tolerance for this test."),
    ("Obliquity", "True obliquity, IAU 1980 with 1980 nutation", "23 deg 26' 36.850\" on 1987 April 10, 0h TD",
     "Meeus, Astronomical Algorithms, Example 22.a",
     "=23*3600+26*60+36.85", '=SKY.OBLIQUITY.TRUE("1987-04-10T00:00:00";"TT";"IAU1980";"IAU1980";"ARCSEC")',
     "arcsec", 0.002, "0.000",
     "Published to 0.001\"; the book sums the larger terms of the 1980 series, ERFA all 106."),
    # ---- coordinates ---------------------------------------------------------------------
    ("Coordinates", "Equatorial to ecliptic longitude", "Pollux: lambda = 113.215630 deg",
     "Meeus, Astronomical Algorithms, Example 13.a (alpha 116.328942, delta 28.026183, J2000)",
     "=113.21563", '=SKY.COORD.LON(116.328942;28.026183;"EQUATORIAL J2000";"ECLIPTIC J2000")',
     "arcsec (from degrees)", 0.1, "0.000000",
     "The book takes the J2000 obliquity as 23.4392911 deg (IAU 1976), ours is IAU 2006, "
     "0.042\" smaller."),
    ("Coordinates", "ICRS to galactic longitude", "320 deg exactly",
     "SOFA/ERFA test case of eraIcrs2g (t_erfa_c.c): ICRS (5.9338074302227188 rad, "
     "-1.1784870613579945 rad)",
     "=320", '=SKY.COORD.LON(DEGREES(5.9338074302227188);DEGREES(-1.1784870613579945);"ICRS";"GALACTIC")',
     "arcsec (from degrees)", 1e-6, "0.000000000", "SOFA's tolerance is 1e-14 rad (2e-9\")."),
    ("Coordinates", "The north galactic pole", "alpha 192.85948 deg, delta +27.12825 deg (ICRS)",
     "Galactic system as realised for Hipparcos (ESA 1997, vol. 1, sect. 1.5.3); common practice",
     "=90", '=SKY.COORD.LAT(192.85948;27.12825;"ICRS";"GALACTIC")', "arcsec (from degrees)",
     0.05, "0.000000", "The pole's coordinates are published to 1e-5 deg (0.018\")."),
    ("Coordinates", "Proper motion and precession: RA", "theta Persei to 2028 Nov 13.19 TD: alpha = 2h46m11.331s",
     "Meeus, Astronomical Algorithms, Example 21.b (J2000 2h44m11.986s +49 13' 42.48\", "
     "pm +0.03425 s/yr, -0.0895\"/yr)",
     "=(2+46/60+11.331/3600)*15",
     '=SKY.PRECESS.RA(SKY.PROPER.RA((2+44/60+11.986/3600)*15;49+13/60+42.48/3600;0.03425*15000*COS(RADIANS(49+13/60+42.48/3600));-89.5;"J2000.0";"2028-11-13T04:33:36";"TT");SKY.PROPER.DEC((2+44/60+11.986/3600)*15;49+13/60+42.48/3600;0.03425*15000*COS(RADIANS(49+13/60+42.48/3600));-89.5;"J2000.0";"2028-11-13T04:33:36";"TT");"J2000.0";"2028-11-13T04:33:36";"TT")',
     "arcsec (from degrees)", 0.2, "0.000000",
     "IAU 1976 precession in the book, IAU 2006 here: the IAU 2000 rate correction "
     "(-0.30\"/century) moves this RA by about 0.1\" in 29 years."),
    ("Coordinates", "Proper motion and precession: Dec", "theta Persei to 2028 Nov 13.19 TD: delta = +49 20' 54.54\"",
     "Meeus, Astronomical Algorithms, Example 21.b",
     "=49+20/60+54.54/3600",
     '=SKY.PRECESS.DEC(SKY.PROPER.RA((2+44/60+11.986/3600)*15;49+13/60+42.48/3600;0.03425*15000*COS(RADIANS(49+13/60+42.48/3600));-89.5;"J2000.0";"2028-11-13T04:33:36";"TT");SKY.PROPER.DEC((2+44/60+11.986/3600)*15;49+13/60+42.48/3600;0.03425*15000*COS(RADIANS(49+13/60+42.48/3600));-89.5;"J2000.0";"2028-11-13T04:33:36";"TT");"J2000.0";"2028-11-13T04:33:36";"TT")',
     "arcsec (from degrees)", 0.1, "0.000000",
     "As for the RA: IAU 1976 against IAU 2006 precession (a few hundredths of an arcsecond "
     "here); published to 0.01\"."),
    # ---- sidereal time and the horizon ---------------------------------------------------
    ("Horizon", "Earth rotation angle", "0.4022837240028158102 rad at MJD 54388 UT1",
     "SOFA/ERFA test case of eraEra00 (t_erfa_c.c)",
     "=DEGREES(0.4022837240028158102)", '=SKY.SIDEREAL("MJD 54388";"UT1";"ERA";;"DEG")',
     "arcsec (from degrees)", 1e-6, "0.000000000", "SOFA's tolerance is 1e-12 rad (2e-7\")."),
    ("Horizon", "Greenwich mean sidereal time, IAU 2006", "1.754174971870091203 rad at MJD 53736 UT1",
     "SOFA/ERFA test case of eraGmst06 (t_erfa_c.c)",
     "=DEGREES(1.754174971870091203)", '=SKY.SIDEREAL("MJD 53736";"UT1";"GMST";;"DEG")',
     "arcsec (from degrees)", 0.001, "0.000000000",
     "The test gives TT = UT1; the cell derives TT from UT1 (65 s later), which moves GMST "
     "by 0.0001\"."),
    ("Horizon", "Greenwich apparent sidereal time", "13h10m46.1351s on 1987 April 10, 0h UT",
     "Meeus, Astronomical Algorithms, Example 12.a",
     "=13+10/60+46.1351/3600", '=SKY.SIDEREAL("1987-04-10T00:00:00";"UT1";"GAST";;"HOURS")',
     "s (from hours)", 0.005, "0.00000000",
     "The book uses the IAU 1982 sidereal time, ours IAU 2006: they differ by 3.3 ms in 1987 "
     "(the IAU 2000 precession-rate correction); published to 0.1 ms."),
    ("Horizon", "Altitude of a planet", "Venus at Washington, 1987 April 10 19:21 UT: h = 15.1249 deg",
     "Meeus, Astronomical Algorithms, Example 13.b (apparent alpha 23h09m16.641s, delta "
     "-6 43' 11.61\"; 38 55' 17\" N, 77 03' 56\" W; no refraction)",
     "=15.1249",
     '=SKY.HORIZON.ALT((23+9/60+16.641/3600)*15;-(6+43/60+11.61/3600);"1987-04-10T19:21:00";38+55/60+17/3600;-(77+3/60+56/3600);"UT1";0;0;10;"TRUE")',
     "arcsec (from degrees)", 1.0, "0.0000",
     "Published to 1e-4 deg (0.18\"); the cell adds diurnal aberration (up to 0.32\"), the "
     "book does not."),
    ("Horizon", "Azimuth of a planet", "A = 68.0337 deg from the south, 248.0337 deg from the north",
     "Meeus, Astronomical Algorithms, Example 13.b (azimuth counted from the south there)",
     "=68.0337+180",
     '=SKY.HORIZON.AZ((23+9/60+16.641/3600)*15;-(6+43/60+11.61/3600);"1987-04-10T19:21:00";38+55/60+17/3600;-(77+3/60+56/3600);"UT1";0;0;10;"TRUE")',
     "arcsec (from degrees)", 1.0, "0.0000", "As for the altitude."),
    # ---- the Sun -------------------------------------------------------------------------
    ("Sun", "Apparent right ascension of the Sun", "13h13m30.749s on 1992 October 13, 0h TD",
     "Meeus, Astronomical Algorithms, Example 25.b (VSOP87, FK5)",
     "=(13+13/60+30.749/3600)*15", '=SKY.SUN.RA("1992-10-13T00:00:00";"TT")',
     "arcsec (from degrees)", 0.1, "0.000000",
     "Published to 0.015\"; VSOP87 and FK5 in the book, ERFA epv00 and ICRS here (a few "
     "hundredths of an arcsecond)."),
    ("Sun", "Apparent declination of the Sun", "-7 47' 01.74\" on 1992 October 13, 0h TD",
     "Meeus, Astronomical Algorithms, Example 25.b",
     "=-(7+47/60+1.74/3600)", '=SKY.SUN.DEC("1992-10-13T00:00:00";"TT")',
     "arcsec (from degrees)", 0.1, "0.000000", "As for the right ascension."),
    ("Sun", "Equation of time", "+13m42.6s on 1992 October 13, 0h TD",
     "Meeus, Astronomical Algorithms, Example 28.a",
     "=13+42.6/60", '=SKY.SUN.EQTIME("1992-10-13T00:00:00";"TT")', "s (from minutes)", 0.3,
     "0.0000",
     "The book's E is built on the Sun's mean longitude, ours on the Sun's hour angle and "
     "UT; the two definitions differ by 0.2 s here (DE440 with the hour-angle definition "
     "agrees with ours to 0.001 s)."),
    ("Sun", "The March equinox of 2024", "2024 March 20, 03:06 UTC",
     "US Naval Observatory, Earth's seasons and apsides (published to the minute)",
     "=DATE(2024;3;20)+TIME(3;6;0)", '=SKY.SEASON(2024;"MARCH")', "s (from days)", 35.0, DT,
     "Published to the minute (30 s of rounding) plus 5 s."),
    ("Sun", "The Sun's declination at the June solstice", "+23.44 deg (the obliquity, rounded)",
     "At a solstice the Sun's declination equals the obliquity of the ecliptic (23.44 deg "
     "in this era); common practice",
     "=23.44", '=SKY.SUN.DEC(SKY.SEASON(2024;"JUNE"))', "deg", 0.01, "0.0000",
     "Rounded to 0.01 deg; nutation moves the true obliquity by up to 0.003 deg."),
    # ---- the Moon ------------------------------------------------------------------------
    ("Moon", "Ecliptic longitude of the Moon", "lambda = 133.162655 deg on 1992 April 12, 0h TD",
     "Meeus, Astronomical Algorithms, Example 47.a (mean equinox of date; the series "
     "includes the light time)",
     "=133.162655", '=SKY.MOON.LON("1992-04-12T00:00:00";"TT";"DATE";"APPARENT")',
     "arcsec (from degrees)", 0.1, "0.000000",
     "The same series (ERFA moon98 is Meeus's, with the light time taken out). Meeus's "
     "lambda is the Moon when the light left it seen from the Earth then, which is the "
     "apparent direction (light time and aberration together) before nutation: our "
     "APPARENT place on the mean equinox of date. Our ASTROMETRIC differs by the Earth's "
     "motion over the light time (7.6\" here)."),
    ("Moon", "Distance of the Moon", "368409.7 km on 1992 April 12, 0h TD",
     "Meeus, Astronomical Algorithms, Example 47.a",
     "=368409.7", '=SKY.MOON.DIST("1992-04-12T00:00:00";"TT")', "km", 0.1, "0.0",
     "The same series; published to 0.1 km."),
    ("Moon", "Apparent right ascension of the Moon", "alpha = 134.688470 deg on 1992 April 12, 0h TD",
     "Meeus, Astronomical Algorithms, Example 47.a",
     "=134.68847", '=SKY.MOON.RA("1992-04-12T00:00:00";"TT")', "arcsec (from degrees)", 0.1,
     "0.000000",
     "Published to 1e-6 deg (0.004\"); 1980 nutation in the book, IAU 2000A here (a few mas)."),
    ("Moon", "Apparent declination of the Moon", "delta = +13.768368 deg on 1992 April 12, 0h TD",
     "Meeus, Astronomical Algorithms, Example 47.a",
     "=13.768368", '=SKY.MOON.DEC("1992-04-12T00:00:00";"TT")', "arcsec (from degrees)", 0.1,
     "0.000000", "As for the right ascension."),
    ("Moon", "Instant of a new Moon", "1977 February 18, 3h37m42s TD (JDE 2443192.65118)",
     "Meeus, Astronomical Algorithms, Example 49.a",
     "=DATE(1977;2;18)+TIME(3;37;42)", '=SKY.MOON.PHASE.NEXT("1977-02-15";"TT";"NEW";"TT")',
     "s (from days)", 30.0, DT,
     "Meeus's phase formulas are within 17 s of the ELP theory; our place of the Moon is "
     "good to about 10 s in a phase instant."),
    ("Moon", "Instant of a new Moon", "2024 April 8, 18:21 UTC",
     "US Naval Observatory, phases of the Moon (the new Moon of the total solar eclipse); "
     "value from memory",
     "=DATE(2024;4;8)+TIME(18;21;0)", '=SKY.MOON.PHASE.NEXT("2024-04-01";"UTC";"NEW")',
     "s (from days)", 35.0, DT, "Published to the minute (30 s of rounding) plus 5 s."),
    ("Moon", "Eclipse season at a new Moon", "total solar eclipse of 2024 April 8",
     "NASA Five Millennium Canon of Solar Eclipses (Espenak and Meeus 2006); common knowledge",
     "solar eclipse possible", '=SKY.ECLIPSE.POSSIBLE(SKY.MOON.PHASE.NEXT("2024-04-01";;"NEW"))',
     TEXT, 0, "@", "The same words."),
    ("Moon", "Eclipse season at a full Moon", "total lunar eclipse of 2022 November 8",
     "NASA Five Millennium Canon of Lunar Eclipses (Espenak and Meeus 2009); common knowledge",
     "lunar eclipse possible", '=SKY.ECLIPSE.POSSIBLE(SKY.MOON.PHASE.NEXT("2022-11-01";;"FULL"))',
     TEXT, 0, "@", "The same words."),
    ("Moon", "No eclipse at a full Moon", "full Moon of 2024 June 22: no eclipse (2024's were Mar 25, Apr 8, Sep 18, Oct 2)",
     "NASA eclipse canons (Espenak and Meeus); common knowledge",
     "no lunar eclipse", '=SKY.ECLIPSE.POSSIBLE(SKY.MOON.PHASE.NEXT("2024-06-15";;"FULL"))',
     TEXT, 0, "@", "The same words."),
    # ---- heliocentric and barycentric times ------------------------------------------------
    ("BJD/HJD", "HJD of a target at the ecliptic pole", "HJD = JD (no light-time difference)",
     "Geometry: the Earth and the Sun lie in the ecliptic, so light from its pole reaches "
     "both at once; common practice",
     "=0", '=(SKY.HJD.TT("2000-01-01T12:00:00";270;90-23.4392911;"TT")-SKY.JD("2000-01-01T12:00:00";"TT"))*86400',
     "s", 0.01, "0.0000",
     "The Earth strays from the ecliptic by under 1\" (0.003 s of light time)."),
    ("BJD/HJD", "BJD_TDB - HJD_UTC at the ecliptic pole", "TT - UTC = 64.184 s in 2000",
     "IERS Bulletin C (32 leap seconds in 2000) and TT = TAI + 32.184 s (IAU 1991); the "
     "light-time parts cancel at the pole",
     "=64.184", '=(SKY.BJD.TDB("2000-01-01T11:58:55.816Z";270;90-23.4392911)-SKY.HJD.UTC("2000-01-01T11:58:55.816Z";270;90-23.4392911))*86400',
     "s", 0.25, "0.0000",
     "The barycentre lies up to 0.0005 au off the ecliptic plane (the planets' inclinations), "
     "0.25 s of light time; mixing the scales would cost 64 s."),
]

FAMILIES = ("Time", "Angles", "Obliquity", "Coordinates", "Horizon", "Sun", "Moon", "BJD/HJD")

HEADERS = ["No.", "Family", "What is checked", "As published", "Source of the reference",
           "Reference", "Our value", "Difference", "Unit of the difference", "Tolerance",
           "Result", "Why this tolerance", "Our formula"]
WIDTHS_CM = [1.0, 2.4, 5.0, 6.0, 7.5, 3.8, 3.8, 2.8, 3.2, 2.4, 1.8, 7.5, 9.0]
FIRST_ROW = 4  # 0-based row of the first check


def cells_of(k, row):
    """The contents of sheet row ``FIRST_ROW + k``: (column, kind, content, number format).

    kind is "value" (a number), "text" or "formula".  Data only, so that the tests can
    compare the written file with it without an office.
    """
    family, what, published, source, reference, ours, unit, tol, fmt, why = row
    r = FIRST_ROW + k + 1  # 1-based row number in formulas
    is_text = unit == TEXT
    ref = ("text", reference) if is_text else ("formula", reference)
    if is_text:
        # Our text functions return plain values (registry.CellFunction.returns_text),
        # so a typed text compares equal to them.
        diff = f'=IF(EXACT(G{r};F{r});0;1)'
    else:
        diff = f"=IF(ISNUMBER(G{r});{DIFFERENCES[unit].format(r=r)};\"no value\")"
    diff_format = "@" if is_text else ("0.000E+00" if tol < 0.001 else "0.0000")
    return [
        (0, "value", float(k + 1), "0"),
        (1, "text", family, "@"),
        (2, "text", what, "@"),
        (3, "text", published, "@"),
        (4, "text", source, "@"),
        (5,) + ref + (fmt,),
        (6, "formula", ours, fmt),
        (7, "formula", diff, "0" if is_text else diff_format),
        (8, "text", unit, "@"),
        (9, "value", float(tol), "0" if is_text else diff_format),
        (10, "formula", f'=IF(ISNUMBER(H{r});IF(ABS(H{r})<=J{r};"PASS";"FAIL");"FAIL")', "@"),
        (11, "text", why, "@"),
        (12, "text", ours, "@"),
    ]


def note_text():
    return (
        "Validation: each row sets a published reference value (standards' test values, "
        "IAU and IERS definitions, worked examples of Meeus's Astronomical Algorithms, US "
        "Naval Observatory almanac data) beside a live formula with one of our SKY. "
        "functions, the difference and a tolerance with its reason; Result says PASS when "
        "the difference is within the tolerance. The reference is typed from the published "
        "figures as a plain formula, never computed by our functions. Recompute (Ctrl+Shift+F9) "
        "after installing or updating the extension. " + SUN_CAUTION)


def validation_sheet(doc, sheet):
    from sheetkit import header, note, number_format, widths

    note(sheet, 0, note_text(), 13)
    last = FIRST_ROW + len(ROWS)  # 1-based last row
    sheet.getCellByPosition(0, 1).setString("Summary")
    sheet.getCellByPosition(2, 1).setFormula(
        f'=COUNTIF(K{FIRST_ROW + 1}:K{last};"PASS")&" of "&ROWS(K{FIRST_ROW + 1}:K{last})'
        '&" rows PASS"')
    sheet.getCellByPosition(4, 1).setString("Computed by")
    sheet.getCellByPosition(5, 1).setFormula("=SKY.VERSION()")
    header(sheet, FIRST_ROW - 1, HEADERS)
    for k, row in enumerate(ROWS):
        for col, kind, content, code in cells_of(k, row):
            cell = sheet.getCellByPosition(col, FIRST_ROW + k)
            cell.NumberFormat = number_format(doc, code)
            if kind == "value":
                cell.setValue(content)
            elif kind == "text":
                cell.setString(content)
            else:
                cell.setFormula(content)
            if col in (2, 3, 4, 11, 12):
                cell.IsTextWrapped = True
    widths(sheet, WIDTHS_CM)


FIXED_ZIP_TIME = (1980, 1, 1, 0, 0, 0)  # the earliest a zip entry can hold


def normalise(path):
    """Make an ODS file the same bytes whenever the same sheet is written: the office
    stamps the save time into meta.xml (dc:date, editing-duration) and into every zip
    entry; those are set to fixed values, everything else is kept in order and kind
    (mimetype first and stored, as ODF requires).  Rewritten beside, then moved into place."""
    from officekit import written_beside

    with written_beside(path) as partial, zipfile.ZipFile(path) as src, \
            zipfile.ZipFile(partial, "w") as dst:
        for info in src.infolist():
            data = src.read(info.filename)
            if info.filename == "meta.xml":
                text = data.decode("utf-8")
                text = re.sub(r"<dc:date>[^<]*</dc:date>", "", text)
                text = re.sub(r"<meta:editing-duration>[^<]*</meta:editing-duration>",
                              "<meta:editing-duration>PT0S</meta:editing-duration>", text)
                data = text.encode("utf-8")
            entry = zipfile.ZipInfo(info.filename, FIXED_ZIP_TIME)
            entry.compress_type = info.compress_type
            entry.external_attr = info.external_attr
            entry.create_system = 3  # Unix, whatever made the input
            dst.writestr(entry, data)
    return path


def build(oxt, out_dir, office=None):
    """Write validation.ods into ``out_dir`` (atomically); returns its path."""
    sys.path.insert(0, HERE)
    import officekit
    from sheetkit import landscape_fit_to_width

    os.makedirs(out_dir, exist_ok=True)
    if office is None:
        with officekit.Office(oxt=oxt) as running:
            return build(oxt, out_dir, running)
    doc = office.new_sheet()
    try:
        sheet = doc.Sheets.getByIndex(0)
        sheet.setName(SHEET_NAME)
        validation_sheet(doc, sheet)
        landscape_fit_to_width(doc)
        doc.calculateAll()
        # Saved beside the target and normalised there, then moved into place.
        staged = office.save(doc, os.path.join(out_dir, ".staged-" + FILE_NAME))
        normalise(staged)
        target = os.path.join(out_dir, FILE_NAME)
        os.replace(staged, target)
        return target
    finally:
        doc.close(True)


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--oxt", required=True)
    ap.add_argument("--out", default=os.path.join(ROOT, "sample_sheets"))
    args = ap.parse_args(argv)
    print(build(args.oxt, args.out))


if __name__ == "__main__":
    main()
