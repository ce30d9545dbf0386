"""eclipses.ods: an invented eclipse-chasing club's trips to real solar eclipses with
the local circumstances at its invented camp sites, and an invented historian's table of
recorded ancient and historical eclipses tested against Delta T (the solar-eclipse
family).  Both sheets carry the caution: never look at the Sun without a proper solar
filter, however much of it is covered; only during totality is the naked eye safe.
"""

from sheetkit import header, note, widths

from .common import fill_columns, sheet_at, sun_heading

FILE_NAME = "eclipses.ods"

TOTALITY_NOTE = (
    "Only during totality itself (between C2 and C3 of a TOTAL eclipse, the Sun wholly "
    "covered) is it safe to look without a filter; put the filter back before C3. A 99 % "
    "eclipsed Sun, an annular ring or a partial phase can blind: filter on throughout.")

# The Fellside Umbra Club (invented): its trips to real eclipses, each to a camp site of
# its own choosing (names and coordinates made up, placed near the real paths).
TRIPS = [
    ("Sagebrush Flats camp", 43.0, -106.0, "2017-08-21"),
    ("Elqui terrace pitch", -30.05, -70.7, "2019-07-02"),
    ("Limay steppe camp", -39.9, -69.5, "2020-12-14"),
    ("Cape scrub lookout", -22.0, 114.1, "2023-04-20"),
    ("Mesa rim car park", 35.1, -106.6, "2023-10-14"),
    ("Lakeshore meadow", 41.2, -82.0, "2024-04-08"),
    ("Island ridge field", -27.1, -109.4, "2024-10-02"),
    ("Fellside home field (partial only)", 52.2, 0.1, "2025-03-29"),
    ("Meseta threshing floor", 42.3, -3.7, "2026-08-12"),
    ("Nile west bank roof", 25.7, 32.65, "2027-08-02"),
    ("Harbour headland", -33.87, 151.2, "2028-07-22"),
]

# The historian's table (the historian, Dr. Ilse Marrow, is invented): real recorded
# eclipses, each at the place of its record (coordinates as the historian takes them),
# the date searched from the day before (Julian calendar, astronomical years, UT), and
# what the record claims, in our words.
RECORDS = [
    ("Babylon, astronomical diary", 32.55, 44.42, "-0135-04-14", "total: stars seen"),
    ("Qufu (Lu), spring-and-autumn annals", 35.6, 117.0, "-0708-07-16", "total"),
    ("Halys river, the eclipse ascribed to Thales", 39.5, 34.0, "-0584-05-27",
     "day turned to night"),
    ("Athens, a philosopher's biography", 37.97, 23.72, "0484-01-13", "eclipse seen"),
    ("Worms, a royal annal", 49.63, 8.36, "0840-05-04", "stars seen"),
    ("Wessex, a monastic chronicle", 51.07, -1.8, "1133-08-01", "stars seen at noon"),
    ("Stade, a town chronicle", 53.6, 9.47, "1241-10-05", "total, stars seen"),
    ("Coimbra, an astronomer's report", 40.2, -8.42, "1560-08-20", "total"),
    ("Rome, an astronomer's report", 41.9, 12.5, "1567-04-08", "a ring, or nearly total"),
    ("London, a circulated map's observers", 51.5, -0.1, "1715-05-02", "total"),
]


def trips_sheet(doc, sheet):
    cols = 21
    sun_heading(
        sheet, cols,
        "The Fellside Umbra Club (INVENTED: club, camp sites and coordinates are made up; "
        "the eclipses are real). Each trip: the camp's site and the eclipse date (UTC); the "
        "eclipse anywhere (SKY.SOLAR.ECLIPSE.NEXT, KIND, GLOBAL: greatest eclipse, gamma, "
        "magnitude, where greatest eclipse falls) and at the camp (SKY.SOLAR.ECLIPSE.CONTACT: "
        "C1 first contact, C2 and C3 the total or annular phase, MAX, C4 last contact; "
        "SKY.SOLAR.ECLIPSE.LOCAL: magnitude, obscuration, duration, the Sun's altitude and "
        "azimuth; SKY.SOLAR.ECLIPSE.SEEN in words). Times UTC; Delta T from the leap seconds "
        "(DUT1 0). The Moon is a sphere (its limb profile is ignored; a second or two at C2, "
        "C3); Moon radius k = 0.2725076 (penumbral contacts) and 0.2722810 (umbral).", 2000)
    note(sheet, 2, TOTALITY_NOTE, cols)
    sheet.getRows().getByIndex(2).Height = 700
    header(sheet, 3, [
        "Camp site (invented)", "Latitude", "Longitude (E+)", "Eclipse date (UTC)",
        "Greatest eclipse (UTC)", "Kind", "Gamma", "Magnitude at greatest",
        "Greatest eclipse at latitude", "and longitude", "C1 (UTC)", "C2 (UTC)", "MAX (UTC)",
        "C3 (UTC)", "C4 (UTC)", "Magnitude at the camp", "Obscuration",
        "Totality or annularity (s)", "Sun's altitude at MAX", "Sun's azimuth at MAX",
        "What the camp sees",
    ])
    first, last = 4, 4 + len(TRIPS) - 1
    sheet.getCellRangeByPosition(0, first, 3, last).setDataArray(
        tuple((name, lat, lon, date) for name, lat, lon, date in TRIPS))
    time = "YYYY-MM-DD HH:MM:SS"
    clock = "HH:MM:SS"
    fill_columns(doc, sheet, first, last, 4, [
        ("=SKY.SOLAR.ECLIPSE.NEXT(D{r})", time),
        ("=SKY.SOLAR.ECLIPSE.KIND(D{r})", "@"),
        ("=SKY.SOLAR.ECLIPSE.GLOBAL(D{r})", "0.0000"),
        ('=SKY.SOLAR.ECLIPSE.GLOBAL(D{r};;"MAGNITUDE")', "0.0000"),
        ('=SKY.SOLAR.ECLIPSE.GLOBAL(D{r};;"LAT")', "0.00"),
        ('=SKY.SOLAR.ECLIPSE.GLOBAL(D{r};;"LON")', "0.00"),
        ('=SKY.SOLAR.ECLIPSE.CONTACT(D{r};B{r};C{r};;"C1")', clock),
        ('=SKY.SOLAR.ECLIPSE.CONTACT(D{r};B{r};C{r};;"C2")', clock),
        ('=SKY.SOLAR.ECLIPSE.CONTACT(D{r};B{r};C{r};;"MAX")', clock),
        ('=SKY.SOLAR.ECLIPSE.CONTACT(D{r};B{r};C{r};;"C3")', clock),
        ('=SKY.SOLAR.ECLIPSE.CONTACT(D{r};B{r};C{r};;"C4")', clock),
        ("=SKY.SOLAR.ECLIPSE.LOCAL(D{r};B{r};C{r})", "0.0000"),
        ('=SKY.SOLAR.ECLIPSE.LOCAL(D{r};B{r};C{r};;"OBSCURATION")', "0.0000"),
        ('=SKY.SOLAR.ECLIPSE.LOCAL(D{r};B{r};C{r};;"DURATION")', "0.0"),
        ('=SKY.SOLAR.ECLIPSE.LOCAL(D{r};B{r};C{r};;"ALT")', "0.0"),
        ('=SKY.SOLAR.ECLIPSE.LOCAL(D{r};B{r};C{r};;"AZ")', "0.0"),
        ("=SKY.SOLAR.ECLIPSE.SEEN(D{r};B{r};C{r})", "@"),
    ], right="text")
    sheet.getCellRangeByPosition(20, first, 20, last).IsTextWrapped = True
    end = last + 2
    note(sheet, end, "The Sun's altitude at C1 and C4 at the first camp (plan the horizon: "
         "trees and hills hide a low Sun):", 8)
    for k, contact in enumerate(("C1", "C4")):
        cell = sheet.getCellByPosition(8 + k, end)
        cell.setFormula(f'=SKY.SOLAR.ECLIPSE.LOCAL(D{first + 1};B{first + 1};C{first + 1};;'
                        f'"ALT";"{contact}")')
    widths(sheet, [5.0, 1.8, 2.2, 2.8, 4.2, 2.0, 1.8, 2.2, 2.0, 2.0, 2.0, 2.0, 2.0, 2.0,
                   2.0, 2.2, 2.2, 2.4, 2.2, 2.2, 7.0])


def records_sheet(doc, sheet):
    cols = 19
    sun_heading(
        sheet, cols,
        "Dr. Ilse Marrow's table (the historian is INVENTED; the eclipses and their records "
        "are real, summarised in our words). Each record: its place, the day before the "
        "eclipse (Julian calendar, astronomical years: -0135 is 136 BC) on the scale UT "
        "(Delta T from SMH2016), and what the record claims. The eclipse computed there, its "
        "magnitude at the place with Delta T moved by -2 to +2 published standard errors "
        "(Morrison and Stephenson 2004, only 1000 BC to AD 1200), and the range of Delta T "
        "for which the total or annular phase reaches the place with the Sun up "
        "(SKY.SOLAR.ECLIPSE.DELTAT): a record of totality is consistent with the model "
        "when the model's Delta T lies in that range. Typing a Delta T into the scale (UT "
        "11500) tries another value.", 2100)
    note(sheet, 2, TOTALITY_NOTE, cols)
    sheet.getRows().getByIndex(2).Height = 700
    header(sheet, 3, [
        "Record (place, source)", "Latitude", "Longitude (E+)", "Searched from (UT)",
        "The record says", "Greatest eclipse (UT, Julian calendar)", "Kind", "Magnitude, -2 sigma",
        "-1 sigma", "Model Delta T", "+1 sigma", "+2 sigma", "Totality or annularity (s)",
        "Delta T, model (s)", "Standard error (s)", "Central phase from Delta T (s)",
        "to Delta T (s)", "Model inside?", "What the place sees (model Delta T)",
    ])
    first, last = 4, 4 + len(RECORDS) - 1
    sheet.getCellRangeByPosition(0, first, 4, last).setDataArray(RECORDS)
    ut = '"UT"'

    def spread(n):
        f = f"SKY.SOLAR.ECLIPSE.LOCAL(D{{r}};B{{r}};C{{r}};{ut};;;;{n})"
        return f'=IF(ISNUMBER({f});{f};"no sigma")'

    def guarded(quantity):
        f = f'SKY.SOLAR.ECLIPSE.DELTAT(D{{r}};B{{r}};C{{r}};{ut};"{quantity}")'
        return f'=IF(ISNUMBER({f});{f};"none")'

    fill_columns(doc, sheet, first, last, 5, [
        # As text in the Julian calendar, historical years (Calc shows dates proleptic
        # Gregorian).
        (f"=SKY.TEXT.DATE(SKY.SOLAR.ECLIPSE.NEXT(D{{r}};{ut});{ut})", "@"),
        (f"=SKY.SOLAR.ECLIPSE.KIND(D{{r}};{ut})", "@"),
        (spread(-2), "0.000"), (spread(-1), "0.000"), (spread(0), "0.000"),
        (spread(1), "0.000"), (spread(2), "0.000"),
        (f'=SKY.SOLAR.ECLIPSE.LOCAL(D{{r}};B{{r}};C{{r}};{ut};"DURATION")', "0"),
        (f'=SKY.SOLAR.ECLIPSE.DELTAT(D{{r}};B{{r}};C{{r}};{ut};"MODEL")', "#,##0"),
        (guarded("SIGMA"), "#,##0"),
        (guarded("LOW"), "#,##0"),
        (guarded("HIGH"), "#,##0"),
        ('=IF(ISNUMBER(P{r});IF(AND(N{r}>=P{r};N{r}<=Q{r});"yes";"no");"-")', "@"),
        (f"=SKY.SOLAR.ECLIPSE.SEEN(D{{r}};B{{r}};C{{r}};{ut})", "@"),
    ], right="text")
    sheet.getCellRangeByPosition(0, first, 0, last).IsTextWrapped = True
    sheet.getCellRangeByPosition(18, first, 18, last).IsTextWrapped = True
    widths(sheet, [5.6, 1.8, 2.2, 2.6, 3.6, 4.4, 2.0, 2.0, 2.0, 2.0, 2.0, 2.0, 2.4, 2.4,
                   2.4, 2.6, 2.4, 1.8, 7.0])


def fill(doc):
    trips_sheet(doc, sheet_at(doc, 0, "Club trips"))
    records_sheet(doc, sheet_at(doc, 1, "Recorded eclipses"))
