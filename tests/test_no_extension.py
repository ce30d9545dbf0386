"""What a colleague without the extension sees: a sheet saved with our functions, opened
in a fresh LibreOffice that does not have Eclipsheet, as ODS and as xlsx.

Pinned as LibreOffice 7.4 behaves (seen here; the README's sharing section says the
same): in ODS every cell whose saved value is a number shows #NAME? at once, cells
whose saved value is text keep that text until a full recalculation; in xlsx every
single-cell formula keeps its saved value until a full recalculation and array formulas
show #NAME? at once.  After a full recalculation every such cell shows #NAME?.
"""

import zipfile

import pytest

pytestmark = pytest.mark.office

NAME_ERROR = 525  # what getError() gives for #NAME? in LibreOffice (seen here)
STORED = "ORG.ECLIPSHEET.SKY.SKYFUNCTIONS."

# (cell, formula, what the office with the extension must show, whether it is ours)
# J2000.0 is JD 2451545.0 TT = 2000-01-01 11:58:55.816 UTC (IAU definition of the epoch;
# Astronomical Almanac); the IAU 2006 mean obliquity at J2000.0 is 84381.406"
# (Hilton et al. 2006, IAU 2006 Resolution B1) = 23 deg 26' 21.406"; MJD = JD - 2400000.5
# (common practice).
CELLS = [
    ("B1", '=SKY.JD(A1;"UTC";"TT")', 2451545.0, True),
    ("B2", '=SKY.OBLIQUITY("JD 2451545.0";"TT")', 84381.406 / 3600, True),
    ("B3", "=SKY.TEXT.DMS(B2;1)", "+23°26'21.4\"", True),
    ("B4", '=SKY.JD(A1;"UTC";"TT")-2451545', 0.0, True),  # ours inside a native formula
    ("B5", "=B1-2451545", 0.0, False),  # a native formula on one of our cells
    ("B9", "=SKY.VERSION()", "Eclipsheet ", True),  # text; starts with this
    ("B10", '=SKY.JD("tomorrow")', "#SKY: ", True),  # a message is text too
]
ARRAY = ("B6:B8", '=SKY.MJD(A6:A8;"TT")', (51544.5, 51545.0, 0.0))
ARRAY_INPUTS = ("JD 2451545.0", "JD 2451545.5", "JD 2400000.5")
TEXT_CELLS = {"B3", "B9", "B10"}


def _matches(got, want):
    if isinstance(want, str):
        return got.startswith(want)
    return abs(got - want) < 1e-9


@pytest.fixture(scope="module")
def saved(office, tmp_path_factory):
    """The sheet written by an office with the extension, as ODS and as xlsx, with what
    each cell showed there."""
    import officekit

    folder = tmp_path_factory.mktemp("shared")
    doc = office.new_sheet()
    try:
        sheet = doc.Sheets.getByIndex(0)
        sheet.getCellRangeByName("A1").setString("2000-01-01T11:58:55.816Z")
        sheet.getCellRangeByName("A6:A8").setDataArray(tuple((t,) for t in ARRAY_INPUTS))
        for cell, formula, _, _ in CELLS:
            sheet.getCellRangeByName(cell).setFormula(formula)
        sheet.getCellRangeByName(ARRAY[0]).setArrayFormula(ARRAY[1])
        doc.calculateAll()
        shown = {}
        for cell, _, want, _ in CELLS:
            c = sheet.getCellRangeByName(cell)
            assert c.getError() == 0, cell
            got = c.getString() if isinstance(want, str) else c.getValue()
            assert _matches(got, want), (cell, got, want)
            shown[cell] = c.getString()
        for k, want in enumerate(ARRAY[2]):
            assert _matches(sheet.getCellByPosition(1, 5 + k).getValue(), want)
        paths = {
            "ods": officekit.Office.save(doc, str(folder / "log.ods")),
            "xlsx": officekit.Office.save(doc, str(folder / "log.xlsx"), "Calc MS Excel 2007 XML"),
        }
    finally:
        doc.close(True)
    return paths, shown


@pytest.fixture(scope="module")
def colleague():
    """A fresh office with no extension, default settings."""
    import officekit

    with officekit.Office() as running:
        yield running


def _recalc_on_load(office):
    """Tools > Options > Calc > Formula > Recalculation on file load (0 always, 1 never,
    2 ask): the at-open behaviour pinned here is with the defaults."""
    import officekit

    provider = office.service("com.sun.star.configuration.ConfigurationProvider")
    node = provider.createInstanceWithArguments(
        "com.sun.star.configuration.ConfigurationAccess",
        officekit._props(nodepath="/org.openoffice.Office.Calc/Formula/Load"))
    return node.getByName("ODFRecalcMode"), node.getByName("OOXMLRecalcMode")


def _state(sheet, cell):
    c = sheet.getCellRangeByName(cell)
    return c.getError(), c.getString(), c.getFormula()


def _array_cells():
    return ["B6", "B7", "B8"]


def _stored_name_in_ods(path):
    """The stored programmatic name is what the saved file's cells hold."""
    return STORED + "SKYJD(" in zipfile.ZipFile(path).read("content.xml").decode("utf-8")


def test_ods_without_the_extension_shows_name_errors(saved, colleague):
    paths, shown = saved
    assert _recalc_on_load(colleague) == (1, 1)  # never: LibreOffice's default
    assert _stored_name_in_ods(paths["ods"])
    doc = colleague.open(paths["ods"])
    try:
        sheet = doc.Sheets.getByIndex(0)
        # At once, before any recalculation.
        for cell, _, _, ours in CELLS:
            error, text, formula = _state(sheet, cell)
            if ours:  # the formula itself is kept, so the extension brings it back
                assert STORED.lower() in formula.lower(), (cell, formula)
            if cell in TEXT_CELLS:  # a text result is shown as saved, until recalculated
                assert (error, text) == (0, shown[cell]), cell
            else:
                assert (error, text) == (NAME_ERROR, "#NAME?"), (cell, error, text)
        for cell in _array_cells():
            assert _state(sheet, cell)[:2] == (NAME_ERROR, "#NAME?"), cell
        doc.calculate()  # F9: only what is dirty; the saved texts stay
        for cell in TEXT_CELLS:
            assert _state(sheet, cell)[:2] == (0, shown[cell]), cell
        doc.calculateAll()  # a full recalculation (Ctrl+Shift+F9)
        for cell in [c[0] for c in CELLS] + _array_cells():
            assert _state(sheet, cell)[:2] == (NAME_ERROR, "#NAME?"), cell
    finally:
        doc.close(True)


def test_xlsx_keeps_our_names_and_the_last_values_until_recalculated(saved, colleague, office):
    paths, shown = saved
    xml = zipfile.ZipFile(paths["xlsx"]).read("xl/worksheets/sheet1.xml").decode("utf-8")
    # The formula under our programmatic name (no spreadsheet but an office with the
    # extension knows it) and the value it had, side by side.
    assert f"<f aca=\"false\">{STORED}SKYJD(A1,&quot;UTC&quot;,&quot;TT&quot;)</f>" \
           "<v>2451545</v>" in xml

    doc = colleague.open(paths["xlsx"])
    try:
        sheet = doc.Sheets.getByIndex(0)
        for cell, _, want, ours in CELLS:
            error, text, formula = _state(sheet, cell)
            assert error == 0 and text == shown[cell], (cell, error, text)
            if ours:
                assert STORED.lower() in formula.lower(), (cell, formula)
        assert abs(sheet.getCellRangeByName("B1").getValue() - 2451545.0) < 1e-9
        for cell in _array_cells():  # array formulas: #NAME? at once
            assert _state(sheet, cell)[:2] == (NAME_ERROR, "#NAME?"), cell
        doc.calculateAll()
        for cell in [c[0] for c in CELLS] + _array_cells():
            assert _state(sheet, cell)[:2] == (NAME_ERROR, "#NAME?"), cell
    finally:
        doc.close(True)

    # An office WITH the extension reads the xlsx back as our functions and recomputes.
    doc = office.open(paths["xlsx"])
    try:
        sheet = doc.Sheets.getByIndex(0)
        doc.calculateAll()
        for cell, _, want, _ in CELLS:
            c = sheet.getCellRangeByName(cell)
            got = c.getString() if isinstance(want, str) else c.getValue()
            assert c.getError() == 0 and _matches(got, want), (cell, got)
        for k, want in enumerate(ARRAY[2]):
            assert _matches(sheet.getCellByPosition(1, 5 + k).getValue(), want)
    finally:
        doc.close(True)
