"""lunar_eclipses.ods: the Saltmarsh circle's lunar-eclipse nights of 2025-2032 from its
Kettle Hill site, and a few ancient lunar eclipses checked from Holmwray Abbey with Delta
T moved by its published standard error (invented scenario; the lunar-eclipse family).
"""

from sheetkit import format_range, header, note, number_format, widths

from .common import CENTER, RIGHT, fill_columns, sheet_at
from .night_plan import SITE_HEIGHT, SITE_LATITUDE, SITE_LONGITUDE, SITE_NAME

FILE_NAME = "lunar_eclipses.ods"

KETTLE = f"{SITE_LATITUDE!r};{SITE_LONGITUDE!r}"
ECLIPSES = 16  # a chain of searches, each from the day after the last greatest eclipse
FIRST_SEARCH = 45658.0  # 2025-01-01 (days since 1899-12-30)

NEXT = "SKY.LUNAR.ECLIPSE.NEXT"
NIGHT_COLUMNS = [
    # (header, formula, number format, width in cm)
    ("Greatest eclipse (UTC)", f"={NEXT}(A{{r}})", "YYYY-MM-DD HH:MM:SS", 4.0),
    ("Kind", "=SKY.LUNAR.ECLIPSE.KIND(A{r})", "@", 2.2),
    ("Gamma", "=SKY.LUNAR.ECLIPSE.GAMMA(A{r})", "+0.0000;-0.0000", 1.8),
    ("Umbral magnitude", "=SKY.LUNAR.ECLIPSE.MAGNITUDE(A{r})", "+0.0000;-0.0000", 2.2),
    ("Penumbral magnitude", '=SKY.LUNAR.ECLIPSE.MAGNITUDE(A{r};;"PENUMBRAL")', "0.0000", 2.4),
    ("P1 (UTC)", f'={NEXT}(A{{r}};;"P1")', "HH:MM:SS", 2.0),
    ("U1 (UTC)", f'=IF(C{{r}}="penumbral";"none";{NEXT}(A{{r}};;"U1"))', "HH:MM:SS", 2.0),
    ("U2 (UTC)", f'=IF(C{{r}}="total";{NEXT}(A{{r}};;"U2");"none")', "HH:MM:SS", 2.0),
    ("U3 (UTC)", f'=IF(C{{r}}="total";{NEXT}(A{{r}};;"U3");"none")', "HH:MM:SS", 2.0),
    ("U4 (UTC)", f'=IF(C{{r}}="penumbral";"none";{NEXT}(A{{r}};;"U4"))', "HH:MM:SS", 2.0),
    ("P4 (UTC)", f'={NEXT}(A{{r}};;"P4")', "HH:MM:SS", 2.0),
    ("Totality (min)", '=IF(C{r}="total";SKY.LUNAR.ECLIPSE.DURATION(A{r});"none")', "0.0", 2.0),
    ("Partial phase (min)",
     '=IF(C{r}="penumbral";"none";SKY.LUNAR.ECLIPSE.DURATION(A{r};;"PARTIAL"))', "0.0", 2.2),
    ("Penumbral phase (min)", '=SKY.LUNAR.ECLIPSE.DURATION(A{r};;"PENUMBRAL")', "0.0", 2.4),
    ("Moon alt. at P1 (deg)",
     f'=SKY.LUNAR.ECLIPSE.MOON.ALT(A{{r}};{KETTLE};;"P1";{SITE_HEIGHT!r})', "+0.0;-0.0", 2.2),
    ("Moon alt. at greatest (deg)",
     f"=SKY.LUNAR.ECLIPSE.MOON.ALT(A{{r}};{KETTLE};;;{SITE_HEIGHT!r})", "+0.0;-0.0", 2.6),
    ("Moon alt. at P4 (deg)",
     f'=SKY.LUNAR.ECLIPSE.MOON.ALT(A{{r}};{KETTLE};;"P4";{SITE_HEIGHT!r})', "+0.0;-0.0", 2.2),
    ("Seen from Kettle Hill",
     f"=SKY.LUNAR.ECLIPSE.VISIBILITY(A{{r}};{KETTLE};;{SITE_HEIGHT!r})", "@", 11.0),
    ("Umbral magnitude, Chauvenet's rule",
     '=SKY.LUNAR.ECLIPSE.MAGNITUDE(A{r};;;"CHAUVENET")', "+0.0000;-0.0000", 3.0),
    ("Gamma, DE440", '=SKY.LUNAR.ECLIPSE.GAMMA(A{r};;;"DE440")', "+0.0000;-0.0000", 2.0),
]


def nights_sheet(doc, sheet):
    note(sheet, 0,
         f"Invented: the Saltmarsh circle's lunar-eclipse nights from its {SITE_NAME} "
         f"(an INVENTED site: {SITE_LATITUDE} N, {-SITE_LONGITUDE} W, {SITE_HEIGHT:g} m). "
         "Each row searches from the day after the previous eclipse's greatest eclipse: "
         "kind, gamma, magnitudes and contacts by Danjon's rule (Chauvenet's beside), the "
         "Moon's altitude at the site and which phases stand above its horizon. Uses "
         "SKY.LUNAR.ECLIPSE.NEXT, .KIND, .GAMMA, .MAGNITUDE, .DURATION, .MOON.ALT and "
         ".VISIBILITY. A lunar eclipse is safe to watch with the naked eye and any "
         "instrument.", 14)
    sheet.getRows().getByIndex(0).Height = 1900
    header(sheet, 1, ["Search from"] + [c[0] for c in NIGHT_COLUMNS])
    first, last = 2, 2 + ECLIPSES - 1
    sheet.getCellByPosition(0, first).setValue(FIRST_SEARCH)
    for row in range(first + 1, last + 1):
        sheet.getCellByPosition(0, row).setFormula(f"=INT(B{row})+1")
    format_range(sheet, 0, first, last, number_format(doc, "YYYY-MM-DD"))
    fill_columns(doc, sheet, first, last, 1, [c[1:3] for c in NIGHT_COLUMNS], right=False)
    for k, (_, _, code, _) in enumerate(NIGHT_COLUMNS):
        column = sheet.getCellRangeByPosition(1 + k, first, 1 + k, last)
        column.HoriJustify = CENTER if code == "@" else RIGHT
    widths(sheet, [2.6] + [c[3] for c in NIGHT_COLUMNS])


# Holmwray Abbey (invented, as in historical_record.ods: east longitude 9.62; its latitude
# is invented here) and the dates a reading group searches from (chosen, not records).
ABBEY_LATITUDE, ABBEY_LONGITUDE = 54.20, 9.62
ABBEY = f"{ABBEY_LATITUDE!r};{ABBEY_LONGITUDE!r}"
ANCIENT_SEARCHES = ["-0720-01-01", "-0584-01-01", "-0412-06-01", "-0330-06-01",
                    "0100-01-01", "0755-10-01", "1066-01-01", "1133-06-01"]
_GREATEST = f"{NEXT}(A{{r}};B{{r}})"
ANCIENT_COLUMNS = [
    ("Greatest eclipse (UT, Julian)",
     f'=SKY.TEXT.DATE({_GREATEST};B{{r}};;"JULIAN";"ASTRONOMICAL";0)', "@", 5.2),
    ("Kind", "=SKY.LUNAR.ECLIPSE.KIND(A{r};B{r})", "@", 2.2),
    ("Umbral magnitude", "=SKY.LUNAR.ECLIPSE.MAGNITUDE(A{r};B{r})", "+0.000;-0.000", 2.2),
    ("Delta T (s)", f"=SKY.DELTAT({_GREATEST};B{{r}})", "0", 1.8),
    ("Sigma of Delta T (s)", f"=SKY.DELTAT.UNCERTAINTY({_GREATEST};B{{r}})", "0", 2.2),
    ("Moon alt. -2 sigma", f"=SKY.LUNAR.ECLIPSE.MOON.ALT(A{{r}};{ABBEY};B{{r}};;;-2)",
     "+0.0;-0.0", 2.0),
    ("-1 sigma", f"=SKY.LUNAR.ECLIPSE.MOON.ALT(A{{r}};{ABBEY};B{{r}};;;-1)", "+0.0;-0.0", 1.6),
    ("Model", f"=SKY.LUNAR.ECLIPSE.MOON.ALT(A{{r}};{ABBEY};B{{r}})", "+0.0;-0.0", 1.6),
    ("+1 sigma", f"=SKY.LUNAR.ECLIPSE.MOON.ALT(A{{r}};{ABBEY};B{{r}};;;1)", "+0.0;-0.0", 1.6),
    ("+2 sigma", f"=SKY.LUNAR.ECLIPSE.MOON.ALT(A{{r}};{ABBEY};B{{r}};;;2)", "+0.0;-0.0", 1.6),
    ("Seen from the abbey (model Delta T)",
     f"=SKY.LUNAR.ECLIPSE.VISIBILITY(A{{r}};{ABBEY};B{{r}})", "@", 10.0),
    ("Seen from the abbey over Delta T +-2 sigma",
     f"=SKY.LUNAR.ECLIPSE.VISIBILITY(A{{r}};{ABBEY};B{{r}};;2)", "@", 12.0),
]


def ancient_sheet(doc, sheet):
    note(sheet, 0,
         "Invented: a reading group of the (INVENTED) Holmwray Abbey annals asks which "
         f"ancient lunar eclipses the abbey ({ABBEY_LATITUDE} N, {ABBEY_LONGITUDE} E, invented) "
         "could have seen. Searches on UT through Delta T (SMH2016, the default; type "
         "\"UT ESPENAK2006\" or \"UT 10850\" in column B for another model or a value in "
         "seconds); the built-in long-range theories outside 1000-3000. Delta T's "
         "published standard error (Morrison and Stephenson 2004, 1000 BC to AD 1200) "
         "turns the Earth: the Moon's altitude at greatest eclipse with Delta T moved by "
         "-2 to +2 sigma, and the phases seen over that range.", 14)
    sheet.getRows().getByIndex(0).Height = 2300
    header(sheet, 1, ["Search from", "Scale"] + [c[0] for c in ANCIENT_COLUMNS])
    first, last = 2, 2 + len(ANCIENT_SEARCHES) - 1
    sheet.getCellRangeByPosition(0, first, 1, last).setDataArray(
        tuple((d, "UT") for d in ANCIENT_SEARCHES))
    sheet.getCellRangeByPosition(0, first, 1, last).HoriJustify = CENTER
    fill_columns(doc, sheet, first, last, 2, [c[1:3] for c in ANCIENT_COLUMNS], right=False)
    for k, (_, _, code, _) in enumerate(ANCIENT_COLUMNS):
        column = sheet.getCellRangeByPosition(2 + k, first, 2 + k, last)
        column.HoriJustify = CENTER if code == "@" else RIGHT
    widths(sheet, [2.6, 1.4] + [c[3] for c in ANCIENT_COLUMNS])


def fill(doc):
    nights_sheet(doc, sheet_at(doc, 0, "Eclipse nights"))
    ancient_sheet(doc, sheet_at(doc, 1, "Ancient eclipses"))
