"""meteor_watch.ods: the Tollmere Meteor Section's watches at Whinburn Common (invented)
reduced to solar longitude, a year of nights (sunset, twilight, transit, sundial time),
the seasons and the Sun's place (the Sun family).
"""

import datetime
import random

import uno
from sheetkit import column_letter, format_range, header, number_format, widths

from .common import CENTER, fill_columns, serial, sheet_at, sun_heading

FILE_NAME = "meteor_watch.ods"

CLUB = "Tollmere Meteor Section"
WATCH_SITE = "Whinburn Common"
WATCH_LATITUDE = 54.62  # degrees north, invented
WATCH_LONGITUDE = -2.35  # degrees east (west negative), invented
WATCH_UTC_OFFSET = 0.0  # the section keeps its tables in UTC all year
NIGHTS_YEAR = 2027

# Showers the section watches, with the solar longitude (J2000) of their listed peaks:
# approximate values of the kind meteor-shower calendars give, from memory, for the
# example only.
SHOWERS = [
    ("QUA", "Quadrantids", 283.15),
    ("LYR", "Lyrids", 32.32),
    ("ETA", "eta Aquariids", 45.5),
    ("PER", "Perseids", 140.0),
    ("ORI", "Orionids", 208.0),
    ("LEO", "Leonids", 235.27),
    ("GEM", "Geminids", 262.2),
]
WATCH_OBSERVERS = ("HB", "JW", "LP", "SO", "TN")

# Invented watch periods in 2026 (UTC): shower, start, minutes, and a typical rate of
# shower meteors an hour for the invented counts.
WATCH_PLAN = [
    ("QUA", (2026, 1, 4, 2, 0), 90, 35), ("QUA", (2026, 1, 4, 3, 30), 90, 48),
    ("QUA", (2026, 1, 4, 4, 15), 75, 52),
    ("LYR", (2026, 4, 22, 22, 30), 90, 6), ("LYR", (2026, 4, 23, 0, 0), 90, 9),
    ("LYR", (2026, 4, 23, 1, 30), 75, 11),
    ("ETA", (2026, 5, 6, 1, 45), 60, 4),
    ("PER", (2026, 8, 11, 22, 0), 90, 18), ("PER", (2026, 8, 11, 23, 30), 90, 27),
    ("PER", (2026, 8, 12, 21, 45), 90, 30), ("PER", (2026, 8, 12, 23, 15), 90, 46),
    ("PER", (2026, 8, 13, 0, 45), 90, 58), ("PER", (2026, 8, 13, 22, 0), 90, 24),
    ("PER", (2026, 8, 14, 0, 0), 90, 19),
    ("ORI", (2026, 10, 21, 1, 0), 90, 9), ("ORI", (2026, 10, 21, 2, 30), 90, 13),
    ("LEO", (2026, 11, 17, 2, 30), 90, 7), ("LEO", (2026, 11, 17, 4, 0), 90, 10),
    ("GEM", (2026, 12, 13, 19, 30), 90, 28), ("GEM", (2026, 12, 13, 21, 0), 90, 44),
    ("GEM", (2026, 12, 13, 22, 30), 90, 55), ("GEM", (2026, 12, 14, 0, 0), 90, 62),
    ("GEM", (2026, 12, 14, 20, 0), 90, 38),
]


def invented_watches(seed=20260812):
    """(start, end, observer, shower, shower meteors, sporadic meteors) per watch."""
    rng = random.Random(seed)
    rows = []
    for shower, start, minutes, rate in WATCH_PLAN:
        t0 = serial(datetime.datetime(*start))
        hours = minutes / 60.0
        count = max(0, round(rng.gauss(rate * hours, (rate * hours) ** 0.5)))
        sporadic = max(0, round(rng.gauss(7.0 * hours, 2.0)))
        rows.append((t0, t0 + minutes / 1440.0, rng.choice(WATCH_OBSERVERS), shower,
                     float(count), float(sporadic)))
    return rows


def watch_log_sheet(doc, sheet):
    watches = invented_watches()
    cols = 20
    sun_heading(
        sheet, cols,
        f"{CLUB} (an INVENTED club; observers, watches and counts are made up): the 2026 "
        "watch log, times in UTC, reduced to solar longitude as meteor work indexes showers "
        "(the Sun's apparent longitude on the ecliptic and equinox of J2000.0), and the "
        "instant next year when the Sun is back at the same solar longitude (the same point "
        "of the shower's year). Uses SKY.SUN.SOLARLON, SKY.SUN.REACHES, SKY.WRAP.180 and "
        "SKY.TEXT.ISO. Rates are plain counts per hour of watching (no correction for the "
        "radiant's altitude or the sky's limiting magnitude).", 1900)
    header(sheet, 2, [
        "No.", "Start (UTC)", "End (UTC)", "Observer", "Shower", "Shower meteors",
        "Sporadic meteors", "Watch (h)", "Shower meteors per hour", "Mid-time (UTC)",
        "Solar longitude at mid-time (deg, J2000)", "Solar longitude at start (deg)",
        "Solar longitude at end (deg)", "Longitude covered (deg)",
        "Listed peak longitude (deg)", "Mid-time from the peak (deg of solar longitude)",
        "Sun at the same longitude next year (UTC)", "Days later",
        "Later than the same calendar date and time next year (h)",
        "Next year's instant (ISO text, UTC)",
    ])
    first, last = 3, 3 + len(watches) - 1
    sheet.getCellRangeByPosition(0, first, 6, last).setDataArray(
        tuple((float(k + 1),) + w for k, w in enumerate(watches)))
    for col in (1, 2):
        format_range(sheet, col, first, last, number_format(doc, "YYYY-MM-DD HH:MM"))
    sheet.getCellRangeByPosition(3, first, 4, last).HoriJustify = CENTER
    table_first = last + 4  # 0-based row of the first shower in the table below
    table = f"$A${table_first + 1}:$C${table_first + len(SHOWERS)}"
    fill_columns(doc, sheet, first, last, 7, [
        ("=(C{r}-B{r})*24", "0.00"),
        ("=F{r}/H{r}", "0.0"),
        ("=(B{r}+C{r})/2", "YYYY-MM-DD HH:MM"),
        ("=SKY.SUN.SOLARLON(J{r})", "0.0000"),
        ("=SKY.SUN.SOLARLON(B{r})", "0.0000"),
        ("=SKY.SUN.SOLARLON(C{r})", "0.0000"),
        ("=SKY.WRAP.180(M{r}-L{r})", "0.0000"),
        (f"=VLOOKUP(E{{r}};{table};3;0)", "0.00"),
        ("=SKY.WRAP.180(K{r}-O{r})", "+0.000;-0.000"),
        # Searching from a day after the watch finds next year's crossing.
        ("=SKY.SUN.REACHES(K{r};J{r}+1)", "YYYY-MM-DD HH:MM:SS"),
        ("=Q{r}-J{r}", "0.0000"),
        ("=(Q{r}-DATE(YEAR(J{r})+1;MONTH(J{r});DAY(J{r}))-MOD(J{r};1))*24", "+0.00;-0.00"),
        ("=SKY.TEXT.ISO(Q{r};;;;1)", "@"),
    ])
    total = last + 1
    sheet.getCellByPosition(4, total).setString("Total")
    for col in (5, 6, 7):
        letter = column_letter(col)
        cell = sheet.getCellByPosition(col, total)
        cell.setFormula(f"=SUM({letter}{first + 1}:{letter}{last + 1})")
        cell.NumberFormat = number_format(doc, "0.00" if col == 7 else "0")

    sheet.getCellByPosition(0, table_first - 2).setString(
        "The showers: the solar longitude of each listed peak (approximate values of the kind "
        "shower calendars give, for the example) and when the Sun reaches it in "
        f"{NIGHTS_YEAR}.")
    header(sheet, table_first - 1, [
        "Code", "Name", "Listed peak (deg, J2000)", f"Sun reaches it in {NIGHTS_YEAR} (UTC)",
        "Watches in the log", "Shower meteors counted",
    ])
    tfirst, tlast = table_first, table_first + len(SHOWERS) - 1
    sheet.getCellRangeByPosition(0, tfirst, 2, tlast).setDataArray(tuple(SHOWERS))
    format_range(sheet, 2, tfirst, tlast, number_format(doc, "0.00"))
    log_codes = f"$E${first + 1}:$E${last + 1}"
    fill_columns(doc, sheet, tfirst, tlast, 3, [
        (f'=SKY.SUN.REACHES(C{{r}};"{NIGHTS_YEAR}-01-01T00:00:00Z")', "YYYY-MM-DD HH:MM"),
        (f"=COUNTIF({log_codes};A{{r}})", "0"),
        (f"=SUMIF({log_codes};A{{r}};$F${first + 1}:$F${last + 1})", "0"),
    ])
    widths(sheet, [1.2, 3.4, 3.4, 3.4, 2.0, 2.2, 2.0, 1.8, 2.2, 3.4, 2.6, 2.4, 2.4, 2.4,
                   2.4, 2.8, 4.2, 2.2, 3.0, 4.6])


NIGHTS_FIRST = 7  # 0-based row of January 1 on the Year of nights sheet


def year_of_nights_sheet(doc, sheet):
    cols = 12
    sun_heading(
        sheet, cols,
        f"Every night of {NIGHTS_YEAR} at the section's {WATCH_SITE} site (an INVENTED site "
        "and coordinates: SiteLat, SiteLon and UtcOffset are the named cells below; change "
        "them and the sheet follows). Times are UTC (offset 0): sunset and sunrise (upper "
        "limb on the horizon, standard refraction), the end and start of astronomical "
        "twilight (Sun 18 degrees below the horizon), the dark hours between them, the day "
        "length, the Sun's transit (local apparent noon) and the equation of time then, and "
        "the sundial (local apparent) time at sunset and at the transit, where it is 12:00 "
        "by definition (shown as the difference in seconds). In summer the Sun does not get 18 degrees "
        "below the horizon here: those cells say so in words and the night has no dark "
        "hours. Uses SKY.SUN.SET, SKY.SUN.RISE (events SUNRISE and ASTRONOMICAL), "
        "SKY.SUN.DAYLENGTH, SKY.SUN.TRANSIT, SKY.SUN.EQTIME and SKY.SUN.SUNDIAL.", 2300)
    params = [
        ("Latitude (deg, north +), invented  [SiteLat]", WATCH_LATITUDE, "+0.0000;-0.0000"),
        ("Longitude (deg, east +), invented  [SiteLon]", WATCH_LONGITUDE, "+0.0000;-0.0000"),
        ("Clock ahead of UTC (h)  [UtcOffset]", WATCH_UTC_OFFSET, "+0.0;-0.0"),
    ]
    origin = uno.createUnoStruct("com.sun.star.table.CellAddress")
    for k, (label, value, code) in enumerate(params):
        row = 2 + k
        sheet.getCellByPosition(0, row).setString(label)
        sheet.getCellRangeByPosition(0, row, 2, row).merge(True)
        cell = sheet.getCellByPosition(3, row)
        cell.setValue(value)
        cell.NumberFormat = number_format(doc, code)
        name = label.split("[")[1].rstrip("]")
        doc.NamedRanges.addNewByName(name, f"$'Year of nights'.$D${row + 1}", origin, 0)
    first, last = NIGHTS_FIRST, NIGHTS_FIRST + 364
    span = "{c}" + str(first + 1) + ":{c}" + str(last + 1)
    lines = [
        ("Dark hours in the year (h); nights with none",
         ("=SUM(" + span.format(c="F") + ")", "#,##0"),
         ("=SUMPRODUCT(ISTEXT(" + span.format(c="C") + "))", "0")),
        ("Longest and shortest day (h)",
         ("=MAX(" + span.format(c="G") + ")", "0.00"),
         ("=MIN(" + span.format(c="G") + ")", "0.00")),
        ("Equation of time, highest and lowest (min)",
         ("=MAX(" + span.format(c="I") + ")", "+0.00;-0.00"),
         ("=MIN(" + span.format(c="I") + ")", "+0.00;-0.00")),
    ]
    for k, (label, a, b) in enumerate(lines):
        row = 2 + k
        sheet.getCellByPosition(5, row).setString(label)
        sheet.getCellRangeByPosition(5, row, 7, row).merge(True)
        for col, (formula, code) in ((8, a), (9, b)):
            cell = sheet.getCellByPosition(col, row)
            cell.setFormula(formula)
            cell.NumberFormat = number_format(doc, code)
    header(sheet, 6, [
        "Date (UTC + UtcOffset)", "Sunset", "End of astronomical twilight (evening)",
        "Start of astronomical twilight (next morning)", "Sunrise (next morning)",
        "Dark hours (Sun below -18 deg)", "Day length, sunrise to sunset (h)",
        "Transit of the Sun (local apparent noon)", "Equation of time at the transit (min)",
        "Sundial time at sunset", "Sundial time at the transit minus 12:00 (s)",
        "Sunset to next sunrise (h)",
    ])
    start = serial(datetime.datetime(NIGHTS_YEAR, 1, 1))
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(
        tuple((start + k,) for k in range(365)))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD DDD"))
    site = "SiteLat;SiteLon;;UtcOffset"
    fill_columns(doc, sheet, first, last, 1, [
        (f"=SKY.SUN.SET(A{{r}};{site})", "HH:MM:SS"),
        (f'=SKY.SUN.SET(A{{r}};{site};"ASTRONOMICAL")', "HH:MM:SS"),
        (f'=SKY.SUN.RISE(A{{r}}+1;{site};"ASTRONOMICAL")', "HH:MM:SS"),
        (f"=SKY.SUN.RISE(A{{r}}+1;{site})", "HH:MM:SS"),
        ("=IF(AND(ISNUMBER(C{r});ISNUMBER(D{r}));(D{r}-C{r})*24;0)", "0.00"),
        (f"=SKY.SUN.DAYLENGTH(A{{r}};{site})", "0.00"),
        (f"=SKY.SUN.TRANSIT(A{{r}};{site})", "HH:MM:SS"),
        # The transit is on the local clock; the Sun's functions take UTC.
        ("=SKY.SUN.EQTIME(H{r}-UtcOffset/24)", "+0.00;-0.00"),
        ("=SKY.SUN.SUNDIAL(B{r}-UtcOffset/24;SiteLon)", "HH:MM:SS"),
        ("=(MOD(SKY.SUN.SUNDIAL(H{r}-UtcOffset/24;SiteLon);1)-0.5)*86400", "+0.0000;-0.0000"),
        ("=(E{r}-B{r})*24", "0.00"),
    ])
    for col in (2, 3):
        sheet.getCellRangeByPosition(col, first, col, last).IsTextWrapped = True
    widths(sheet, [3.2, 2.0, 3.6, 3.6, 2.4, 2.4, 2.6, 2.8, 2.6, 2.6, 2.8, 2.6])


def seasons_sheet(doc, sheet):
    cols = 14
    sun_heading(
        sheet, cols,
        "Equinoxes and solstices of 2020 to 2035 (when the Sun's apparent longitude, true "
        "equinox of date, is 0, 90, 180 and 270 degrees), in UTC, and the lengths of the "
        "seasons they open (northern-hemisphere names). Uses SKY.SEASON (on UTC and TT), "
        "SKY.SEASON.LENGTH and SKY.SUN.LON (the Sun's longitude at the June solstice, "
        "90 degrees by definition).")
    header(sheet, 2, [
        "Year", "March equinox (UTC)", "June solstice (UTC)", "September equinox (UTC)",
        "December solstice (UTC)", "Spring, March to June (d)", "Summer, June to September (d)",
        "Autumn, September to December (d)", "Winter, December to March (d)",
        "Spring and summer minus autumn and winter (d)", "March equinox to the next (d)",
        "March equinox (TT)",
        "TT - UTC then (s)", "Sun's longitude at the June solstice (deg)",
    ])
    years = list(range(2020, 2036))
    first, last = 3, 3 + len(years) - 1
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(tuple((float(y),) for y in years))
    when = "YYYY-MM-DD HH:MM:SS"
    fill_columns(doc, sheet, first, last, 1, [
        ('=SKY.SEASON(A{r};"MARCH")', when),
        ('=SKY.SEASON(A{r};"JUNE")', when),
        ('=SKY.SEASON(A{r};"SEPTEMBER")', when),
        ('=SKY.SEASON(A{r};"DECEMBER")', when),
        ('=SKY.SEASON.LENGTH(A{r};"MARCH")', "0.0000"),
        ('=SKY.SEASON.LENGTH(A{r};"JUNE")', "0.0000"),
        ('=SKY.SEASON.LENGTH(A{r};"SEPTEMBER")', "0.0000"),
        ('=SKY.SEASON.LENGTH(A{r};"DECEMBER")', "0.0000"),
        # The northern spring and summer are longer: the Earth is near aphelion then.
        ("=(F{r}+G{r})-(H{r}+I{r})", "+0.0000;-0.0000"),
        ('=SKY.SEASON(A{r}+1;"MARCH")-B{r}', "0.0000"),
        ('=SKY.SEASON(A{r};"MARCH";"TT")', when),
        ("=(L{r}-B{r})*86400", "0.000"),
        ("=SKY.SUN.LON(C{r})", "0.000000"),
    ])
    widths(sheet, [1.4, 4.2, 4.2, 4.2, 4.2, 2.4, 2.4, 2.4, 2.4, 2.8, 2.6, 4.2, 2.2, 3.0])


# Invented marker directions (ICRS) for the elongation block: one near the Sun in late
# March, one at quadrature, one near opposition.
SUN_MARKERS = [
    ("Marker A", "00h20m00s", "+05°30'00\""),
    ("Marker B", "06h30m00s", "+23°00'00\""),
    ("Marker C", "13h05m00s", "-06°30'00\""),
]
SUN_MONTH = (NIGHTS_YEAR, 3)


def sun_sheet(doc, sheet):
    cols = 22
    sun_heading(
        sheet, cols,
        f"The Sun at 00:00 UTC on each day of March {SUN_MONTH[0]}, geocentric: ecliptic "
        "longitude and latitude, right ascension and declination in the frames TRUE (true "
        "equator and equinox of date, as almanacs give apparent places), DATE (mean equinox "
        "of date) and J2000, and the kinds APPARENT (light time and aberration), ASTROMETRIC "
        "(light time only) and GEOMETRIC; what each step changes; and the distance. Below: "
        "three invented marker directions, their elongation from the Sun and their "
        "Sun-centred ecliptic longitude and latitude (mean ecliptic of date) over the month. "
        "Uses SKY.SUN.LON, SKY.SUN.LAT, SKY.SUN.RA, SKY.SUN.DEC, SKY.SUN.DIST, "
        "SKY.SUN.ELONGATION, SKY.SUN.RELATIVE.LON, SKY.SUN.RELATIVE.LAT, SKY.WRAP.180, "
        "SKY.TEXT.HMS, SKY.TEXT.DMS, SKY.ANGLE.HOURS and SKY.ANGLE.", 1900)
    header(sheet, 2, [
        "Date (UTC)", "Lon, TRUE, APPARENT (deg)", "Lon, DATE, APPARENT (deg)",
        "Lon, J2000, APPARENT (deg)", "Lon, TRUE, GEOMETRIC (deg)",
        "Lon, TRUE, ASTROMETRIC (deg)", 'Aberration: APPARENT - ASTROMETRIC (")',
        'Light time: ASTROMETRIC - GEOMETRIC (")', 'Nutation: TRUE - DATE (")',
        "Precession since J2000: DATE - J2000 (deg)", 'Lat, TRUE (")', 'Lat, J2000 (")',
        "RA, TRUE (deg)", "RA, TRUE (HMS)", "Dec, TRUE (deg)", "Dec, TRUE (DMS)",
        "RA, DATE, APPARENT (deg)", "Dec, DATE, APPARENT (deg)",
        "RA, J2000, ASTROMETRIC (deg)", "Dec, J2000, ASTROMETRIC (deg)", "Distance (au)",
        "Light time (min)",
    ])
    days = 31
    first, last = 3, 3 + days - 1
    start = serial(datetime.datetime(SUN_MONTH[0], SUN_MONTH[1], 1))
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(
        tuple((start + k,) for k in range(days)))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD HH:MM"))
    deg, sdeg = "0.000000", "+0.000000;-0.000000"
    fill_columns(doc, sheet, first, last, 1, [
        ("=SKY.SUN.LON(A{r})", deg),
        ('=SKY.SUN.LON(A{r};;"DATE")', deg),
        ('=SKY.SUN.LON(A{r};;"J2000")', deg),
        ('=SKY.SUN.LON(A{r};;"TRUE";"GEOMETRIC")', deg),
        ('=SKY.SUN.LON(A{r};;"TRUE";"ASTROMETRIC")', deg),
        ("=SKY.WRAP.180(B{r}-F{r})*3600", "+0.000;-0.000"),
        ("=SKY.WRAP.180(F{r}-E{r})*3600", "+0.0000;-0.0000"),
        ("=SKY.WRAP.180(B{r}-C{r})*3600", "+0.000;-0.000"),
        ("=SKY.WRAP.180(C{r}-D{r})", "+0.000000;-0.000000"),
        ("=SKY.SUN.LAT(A{r})*3600", "+0.000;-0.000"),
        ('=SKY.SUN.LAT(A{r};;"J2000")*3600', "+0.000;-0.000"),
        ("=SKY.SUN.RA(A{r})", deg),
        ("=SKY.TEXT.HMS(M{r};2)", "@"),
        ("=SKY.SUN.DEC(A{r})", sdeg),
        ("=SKY.TEXT.DMS(O{r};1)", "@"),
        ('=SKY.SUN.RA(A{r};;"DATE")', deg),
        ('=SKY.SUN.DEC(A{r};;"DATE")', sdeg),
        ('=SKY.SUN.RA(A{r};;"J2000";"ASTROMETRIC")', deg),
        ('=SKY.SUN.DEC(A{r};;"J2000";"ASTROMETRIC")', sdeg),
        ("=SKY.SUN.DIST(A{r})", "0.0000000"),
        # Light takes 499.004784 s to cross 1 au (IAU 2012 au, c).
        ("=U{r}*499.004784/60", "0.0000"),
    ])

    # The invented markers and their places relative to the Sun.
    mt = last + 2
    sheet.getCellByPosition(0, mt).setString(
        "Invented marker directions (ICRS). Marker A comes within a few degrees of the Sun "
        "late in the month: never point optics at or near the Sun (see the caution above).")
    header(sheet, mt + 1, ["Marker", "RA as typed", "Dec as typed", "RA (deg)", "Dec (deg)"])
    mfirst, mlast = mt + 2, mt + 1 + len(SUN_MARKERS)
    sheet.getCellRangeByPosition(0, mfirst, 2, mlast).setDataArray(tuple(SUN_MARKERS))
    fill_columns(doc, sheet, mfirst, mlast, 3, [
        ("=SKY.ANGLE.HOURS(B{r})", deg), ("=SKY.ANGLE(C{r})", sdeg),
    ])
    titles = ["Date (UTC)"]
    for name, _, _ in SUN_MARKERS:
        titles += [f"{name}: elongation (deg)", f"{name}: Sun-centred lon (deg)",
                   f"{name}: ecliptic lat (deg)"]
    ht = mlast + 2
    header(sheet, ht, titles)
    dfirst, dlast = ht + 1, ht + days
    fill_columns(doc, sheet, dfirst, dlast, 0, [("=A{t}", "YYYY-MM-DD HH:MM")],
             source_first=first, right=False)
    for k in range(len(SUN_MARKERS)):
        ra, dec = f"$D${mfirst + k + 1}", f"$E${mfirst + k + 1}"
        fill_columns(doc, sheet, dfirst, dlast, 1 + 3 * k, [
            (f"=SKY.SUN.ELONGATION({ra};{dec};A{{r}})", "0.0000"),
            (f"=SKY.SUN.RELATIVE.LON({ra};{dec};A{{r}})", "+0.0000;-0.0000"),
            (f"=SKY.SUN.RELATIVE.LAT({ra};{dec};A{{r}})", "+0.0000;-0.0000"),
        ])
    widths(sheet, [3.4] + [2.6] * 4 + [2.9, 2.9, 2.9] + [2.6] * 5 + [3.0, 2.6, 3.0]
           + [2.6] * 2 + [2.9, 2.9] + [2.6] * 2)


def fill(doc):
    watch_log_sheet(doc, sheet_at(doc, 0, "Watch log"))
    year_of_nights_sheet(doc, sheet_at(doc, 1, "Year of nights"))
    seasons_sheet(doc, sheet_at(doc, 2, "Seasons"))
    sun_sheet(doc, sheet_at(doc, 3, "Sun"))
