"""night_plan.ods: a night's plan at the Saltmarsh circle's Kettle Hill observatory
(invented): tonight's targets with their rising, transit, setting and observing windows,
the Moon and the planets seen from the site, the targets' altitudes through the night
(the table a chart will draw), and a year of Moon-free dark hours (the site family).
"""

import datetime

import uno
from sheetkit import format_range, header, note, number_format, widths

from .common import RIGHT, caution, fill_columns, serial, sheet_at

FILE_NAME = "night_plan.ods"

SITE_NAME = "Kettle Hill observatory"
SITE_LATITUDE = 51.84   # degrees north, invented
SITE_LONGITUDE = -1.62  # degrees east (west negative), invented
SITE_HEIGHT = 148.0     # metres above the WGS84 ellipsoid, invented
UTC_OFFSET = 0.0        # the circle keeps its log in UTC
TONIGHT = datetime.datetime(2027, 2, 6)
YEAR = 2027

# The circle's programme for the night (invented names, places and proper motions):
# name, RA text, Dec text, mu_alpha* and mu_delta (mas a year, at J2000.0).
PROGRAMME = [
    ("Field K-1", "03 14 07.52", "+41 12 33.8", 0.0, 0.0),
    ("Field K-3", "09:02:41.7", "+63:07:15", 0.0, 0.0),
    ("Field K-8", "07 41 18.30", "+31 52 40.0", 12.5, -40.2),
    ("Field K-9", "01h36m47.8s", "+15°47'00\"", 0.0, 0.0),
    ("Field K-11", "11 05 40.0", "+08 12 30", -85.0, 3.1),
    ("Field K-12", "05 55 10.3", "+07 24 25", 0.0, 0.0),
    ("Field K-13", "13 25 11.6", "-11 09 41", 0.0, 0.0),
    ("Field K-14", "06 45 08.9", "-16 42 58", -546.0, -1223.0),
    ("Field K-15", "10 08 22.3", "+11 58 02", 0.0, 0.0),
    ("Field K-7", "23 59 59.99", "+89 15 51", 0.0, 0.0),
]
PLANETS = ("VENUS", "MARS", "JUPITER", "SATURN")
# The night at the site, as the formulas name the cells of the Tonight sheet.
_DAY = "Night;SiteLat;SiteLon;;UtcOffset"
_DARK = "Darkness;SiteHeight"


def _named(doc, sheet_name, name, col, row):
    origin = uno.createUnoStruct("com.sun.star.table.CellAddress")
    letter = chr(ord("A") + col)
    doc.NamedRanges.addNewByName(name, f"$'{sheet_name}'.${letter}${row + 1}", origin, 0)


def tonight_sheet(doc, sheet):
    cols = 16
    note(sheet, 0,
         f"Tonight at the Saltmarsh circle's {SITE_NAME} (an INVENTED site and programme: "
         "SiteLat, SiteLon, SiteHeight, UtcOffset, Night, AltLimit and Darkness are the "
         "named cells below; "
         "change them and the sheet follows). Times are UTC plus the offset. For each field: "
         "rising, transit (highest) and setting (centre 34' below the horizon: standard "
         "refraction), and the observing window: the longest stretch of the night (local "
         "noon to noon) with the field above the altitude limit while the Sun is below the "
         "twilight, its hours, the best moment (highest while dark), and the Moon there: "
         "its topocentric separation from the field and its altitude. A field that never "
         "rises here, or is never high while it is dark, says so in words. Uses "
         "SKY.STAR.RISE, SKY.STAR.TRANSIT, SKY.STAR.SET, SKY.WINDOW.START, SKY.WINDOW.END, "
         "SKY.WINDOW.HOURS, SKY.WINDOW.BEST, SKY.WINDOW.MOON and SKY.MOON.SEPARATION.", cols)
    sheet.getRows().getByIndex(0).Height = 2300
    caution(sheet, 1, cols)
    params = [
        ("Latitude (deg, north +), invented  [SiteLat]", SITE_LATITUDE, "+0.0000;-0.0000"),
        ("Longitude (deg, east +), invented  [SiteLon]", SITE_LONGITUDE, "+0.0000;-0.0000"),
        ("Height above the ellipsoid (m)  [SiteHeight]", SITE_HEIGHT, "0"),
        ("Clock ahead of UTC (h)  [UtcOffset]", UTC_OFFSET, "+0.0;-0.0"),
        ("The night of (local date)  [Night]", serial(TONIGHT), "YYYY-MM-DD"),
        ("Altitude limit (deg)  [AltLimit]", 30.0, "0"),
    ]
    for k, (label, value, code) in enumerate(params):
        row = 2 + k
        sheet.getCellByPosition(0, row).setString(label)
        sheet.getCellRangeByPosition(0, row, 2, row).merge(True)
        cell = sheet.getCellByPosition(3, row)
        cell.setValue(value)
        cell.NumberFormat = number_format(doc, code)
        _named(doc, "Tonight", label.split("[")[1].rstrip("]"), 3, row)
    row = 2 + len(params)
    sheet.getCellByPosition(0, row).setString("Darkness (ASTRONOMICAL, NAUTICAL or CIVIL)  "
                                              "[Darkness]")
    sheet.getCellRangeByPosition(0, row, 2, row).merge(True)
    sheet.getCellByPosition(3, row).setString("ASTRONOMICAL")
    _named(doc, "Tonight", "Darkness", 3, row)

    # The Moon and the dark of the night, beside the site.
    moon = [
        ("Moonrise", '=SKY.BODY.RISE("MOON";' + _DAY + ";SiteHeight)", "HH:MM"),
        ("Moon's transit", '=SKY.BODY.TRANSIT("MOON";' + _DAY + ")", "HH:MM"),
        ("Moonset", '=SKY.BODY.SET("MOON";' + _DAY + ";SiteHeight)", "HH:MM"),
        ("Moon-free dark from", "=SKY.DARK.START(" + _DAY + ";" + _DARK + ")",
         "YYYY-MM-DD HH:MM"),
        ("Moon-free dark until", "=SKY.DARK.END(" + _DAY + ";" + _DARK + ")",
         "YYYY-MM-DD HH:MM"),
        ("Moon-free dark hours", "=SKY.DARK.HOURS(" + _DAY + ";" + _DARK + ")", "0.00"),
        ("Moon lit at local midnight", "=SKY.MOON.ILLUMINATED(Night+1-UtcOffset/24)", "0.00"),
    ]
    for k, (label, formula, code) in enumerate(moon):
        r = 2 + k
        sheet.getCellByPosition(5, r).setString(label)
        sheet.getCellRangeByPosition(5, r, 7, r).merge(True)
        cell = sheet.getCellByPosition(8, r)
        cell.setFormula(formula)
        cell.NumberFormat = number_format(doc, code)
        cell.HoriJustify = RIGHT

    first = 11
    header(sheet, first - 1, ["Field", "RA (ICRS)", "Dec (ICRS)", "pm RA* (mas/yr)",
                              "pm Dec (mas/yr)", "RA (deg)", "Dec (deg)", "Rises", "Transit",
                              "Sets", "Window from", "Window until", "Window (h)", "Best",
                              "Moon from field at best (deg)", "Moon's altitude at best (deg)"])
    last = first + len(PROGRAMME) - 1
    sheet.getCellRangeByPosition(0, first, 4, last).setDataArray(tuple(PROGRAMME))
    star = "F{r};G{r};Night;SiteLat;SiteLon;;UtcOffset"
    window = star + ";AltLimit;;Darkness;SiteHeight;D{r};E{r}"
    fill_columns(doc, sheet, first, last, 5, [
        ("=SKY.ANGLE.HOURS(B{r})", "0.0000"),
        ("=SKY.ANGLE(C{r})", "+0.0000;-0.0000"),
        ("=SKY.STAR.RISE(" + star + ";;;;D{r};E{r})", "HH:MM"),
        ("=SKY.STAR.TRANSIT(" + star + ";;D{r};E{r})", "HH:MM"),
        ("=SKY.STAR.SET(" + star + ";;;;D{r};E{r})", "HH:MM"),
        ("=SKY.WINDOW.START(" + window + ")", "MM-DD HH:MM"),
        ("=SKY.WINDOW.END(" + window + ")", "MM-DD HH:MM"),
        ("=SKY.WINDOW.HOURS(" + window + ")", "0.00"),
        ("=SKY.WINDOW.BEST(" + window + ")", "MM-DD HH:MM"),
        ("=SKY.WINDOW.MOON(" + star + ';"SEPARATION";AltLimit;;Darkness;SiteHeight)', "0.0"),
        ('=IF(ISNUMBER(N{r});SKY.TOPO.ALT("MOON";N{r}-UtcOffset/24;SiteLat;SiteLon;;'
         'SiteHeight);"")', "+0.0;-0.0"),
    ])
    # One check in the other direction: the separation at the best moment, typed as an
    # instant (UTC), equals the window's own.
    r = last + 2
    sheet.getCellByPosition(0, r).setString("Field K-9: the Moon's distance from it at its "
                                            "best moment, from the instant (deg)")
    sheet.getCellRangeByPosition(0, r, 6, r).merge(True)
    k9 = first + 3 + 1  # 1-based row of Field K-9
    cell = sheet.getCellByPosition(7, r)
    cell.setFormula(f'=IF(ISNUMBER(N{k9});SKY.MOON.SEPARATION(F{k9};G{k9};N{k9}-UtcOffset/24;'
                    f'SiteLat;SiteLon;;SiteHeight);"")')
    cell.NumberFormat = number_format(doc, "0.0")
    widths(sheet, [2.6, 2.6, 2.6, 1.8, 1.8, 1.9, 1.9, 1.5, 1.5, 1.5, 2.4, 2.4, 1.6, 2.4, 2.4,
                   2.4])


def bodies_sheet(doc, sheet):
    cols = 12
    note(sheet, 0,
         "The Moon, the Sun and the planets from the site at local midnight of the night "
         "(the named cells of the Tonight sheet): the topocentric apparent place (true "
         "equator and equinox of date; the Moon's parallax of about a degree included), "
         "the distance from the site, altitude and azimuth (no refraction), and the rising, "
         "transit, setting and lower culmination on the date. The Moon's apparent "
         "semi-diameter from the site and from the Earth's centre, and its horizontal "
         "parallax. Uses SKY.TOPO.RA, SKY.TOPO.DEC, SKY.TOPO.DIST, SKY.TOPO.ALT, "
         "SKY.TOPO.AZ, SKY.BODY.RISE, SKY.BODY.TRANSIT, SKY.BODY.SET, "
         "SKY.MOON.SEMIDIAMETER and SKY.MOON.PARALLAX.", cols)
    sheet.getRows().getByIndex(0).Height = 1900
    caution(sheet, 1, cols)
    header(sheet, 3, ["Body", "RA (deg)", "Dec (deg)", "Distance", "Altitude (deg)",
                      "Azimuth (deg)", "Rises", "Transit", "Sets", "Lower culmination"])
    first = 4
    names = ("MOON", "SUN") + PLANETS
    last = first + len(names) - 1
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(tuple((n,) for n in names))
    at = "A{r};Night+1-UtcOffset/24;SiteLat;SiteLon;;SiteHeight"
    day = "A{r};Night;SiteLat;SiteLon;;UtcOffset"
    fill_columns(doc, sheet, first, last, 1, [
        ("=SKY.TOPO.RA(" + at + ")", "0.0000"),
        ("=SKY.TOPO.DEC(" + at + ")", "+0.0000;-0.0000"),
        ('=SKY.TOPO.DIST(' + at + ';IF(A{r}="MOON";"KM";"AU"))', "#,##0.000"),
        ("=SKY.TOPO.ALT(" + at + ")", "+0.00;-0.00"),
        ("=SKY.TOPO.AZ(" + at + ")", "0.00"),
        ("=SKY.BODY.RISE(" + day + ";SiteHeight)", "MM-DD HH:MM"),
        ("=SKY.BODY.TRANSIT(" + day + ")", "MM-DD HH:MM"),
        ("=SKY.BODY.SET(" + day + ";SiteHeight)", "MM-DD HH:MM"),
        ('=SKY.BODY.TRANSIT(' + day + ';"LOWER")', "MM-DD HH:MM"),
    ])
    r = last + 2
    lines = [
        ("The Moon's semi-diameter from the site (')",
         "=SKY.MOON.SEMIDIAMETER(Night+1-UtcOffset/24;;SiteLat;SiteLon;SiteHeight)"),
        ("The Moon's semi-diameter from the Earth's centre (')",
         "=SKY.MOON.SEMIDIAMETER(Night+1-UtcOffset/24)"),
        ("The Moon's horizontal parallax (')", "=SKY.MOON.PARALLAX(Night+1-UtcOffset/24)"),
    ]
    for k, (label, formula) in enumerate(lines):
        sheet.getCellByPosition(0, r + k).setString(label)
        sheet.getCellRangeByPosition(0, r + k, 4, r + k).merge(True)
        cell = sheet.getCellByPosition(5, r + k)
        cell.setFormula(formula)
        cell.NumberFormat = number_format(doc, "0.00")
    widths(sheet, [2.4, 2.2, 2.2, 2.8, 2.2, 2.2, 2.4, 2.4, 2.4, 2.6])


def altitudes_sheet(doc, sheet):
    """The fields' and the Moon's altitude every 20 minutes through the night: the table
    a chart of the night draws from."""
    note(sheet, 0,
         "Altitudes through the night (degrees, geometric: without refraction, which "
         "lifts a star by about 2' at 30 degrees and 34' at the horizon): "
         "every 20 minutes from 17:00 to 07:00 on the local clock, each field of the "
         "Tonight sheet (SKY.HORIZON.ALT from its catalogue place) and the Moon (SKY.TOPO.ALT, "
         "its parallax included). The times follow the named cells Night and UtcOffset.", 12)
    sheet.getRows().getByIndex(0).Height = 1300
    titles = ["Local time"] + [p[0] for p in PROGRAMME] + ["Moon"]
    header(sheet, 2, titles)
    first = 3
    steps = 43
    last = first + steps - 1
    sheet.getCellRangeByPosition(0, first, 0, last).setFormulaArray(tuple(
        (f"=Night+17/24+{k}/72",) for k in range(steps)))
    format_range(sheet, 0, first, last, number_format(doc, "MM-DD HH:MM"))
    templates = []
    for k in range(len(PROGRAMME)):
        src = 12 + k  # the field's 1-based row on the Tonight sheet
        place = (f"$Tonight.$F${src};$Tonight.$G${src};$A{{r}}-UtcOffset/24;SiteLat;SiteLon;;"
                 "SiteHeight")
        templates.append((f"=SKY.HORIZON.ALT({place})", "+0.0;-0.0"))
    templates.append(('=SKY.TOPO.ALT("MOON";$A{r}-UtcOffset/24;SiteLat;SiteLon;;SiteHeight)',
                      "+0.0;-0.0"))
    fill_columns(doc, sheet, first, last, 1, templates)
    widths(sheet, [2.4] + [1.8] * (len(PROGRAMME) + 1))


def dark_year_sheet(doc, sheet):
    cols = 8
    note(sheet, 0,
         f"Every night of {YEAR} at the site (the named cells of the Tonight sheet): the "
         "Moon-free dark time, with the Sun below the twilight of the Tonight sheet and the "
         "Moon's upper limb below the horizon: its longest stretch and the night's total "
         "hours (what meteor observers count as effective time), with moonrise, moonset and "
         "the Moon's lit fraction at local midnight. A date without a moonrise or a moonset "
         "(the Moon rises about 50 minutes later each day) says so in words. Uses "
         "SKY.DARK.START, SKY.DARK.END, SKY.DARK.HOURS, SKY.BODY.RISE, SKY.BODY.SET and "
         "SKY.MOON.ILLUMINATED.", cols)
    sheet.getRows().getByIndex(0).Height = 1900
    header(sheet, 2, ["Night of", "Moon-free dark from", "until", "Moon-free dark (h)",
                      "Moonrise", "Moonset", "Moon lit at midnight"])
    first = 3
    days = [datetime.datetime(YEAR, 1, 1) + datetime.timedelta(days=k) for k in range(365)]
    last = first + len(days) - 1
    sheet.getCellRangeByPosition(0, first, 0, last).setDataArray(
        tuple((serial(d),) for d in days))
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    fill_columns(doc, sheet, first, last, 1, [
        ("=SKY.DARK.START(A{r};SiteLat;SiteLon;;UtcOffset;Darkness;SiteHeight)", "MM-DD HH:MM"),
        ("=SKY.DARK.END(A{r};SiteLat;SiteLon;;UtcOffset;Darkness;SiteHeight)", "MM-DD HH:MM"),
        ("=SKY.DARK.HOURS(A{r};SiteLat;SiteLon;;UtcOffset;Darkness;SiteHeight)", "0.00"),
        ('=SKY.BODY.RISE("MOON";A{r};SiteLat;SiteLon;;UtcOffset;SiteHeight)', "MM-DD HH:MM"),
        ('=SKY.BODY.SET("MOON";A{r};SiteLat;SiteLon;;UtcOffset;SiteHeight)', "MM-DD HH:MM"),
        ("=SKY.MOON.ILLUMINATED(A{r}+1-UtcOffset/24)", "0.00"),
    ])
    r = last + 2
    sheet.getCellByPosition(0, r).setString(f"Moon-free dark hours in {YEAR}")
    sheet.getCellRangeByPosition(0, r, 2, r).merge(True)
    cell = sheet.getCellByPosition(3, r)
    cell.setFormula(f"=SUM(D{first + 1}:D{last + 1})")
    cell.NumberFormat = number_format(doc, "#,##0")
    widths(sheet, [2.6, 3.0, 3.0, 2.4, 3.0, 3.0, 2.4])


def fill(doc):
    tonight_sheet(doc, sheet_at(doc, 0, "Tonight"))
    bodies_sheet(doc, sheet_at(doc, 1, "Moon and planets"))
    altitudes_sheet(doc, sheet_at(doc, 2, "Altitudes tonight"))
    dark_year_sheet(doc, sheet_at(doc, 3, "Moon-free dark"))
