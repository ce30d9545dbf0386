"""The add-in in a real headless LibreOffice, installed from the built .oxt.

The reference for every cell here is the core itself, evaluated in this process: these
tests check the office round trip (registration, argument passing, null dates, arrays,
saving and reopening, the wizard texts, messages in cells), while the accuracy of the
core is checked against outside sources in the other test modules.
"""

import math
import os
import shutil
import zipfile

import numpy as np
import pytest

from calcfuncs import registry
from calcfuncs.cells import evaluate

pytestmark = pytest.mark.office

ROWS = 1000
# Invented observing log: one timestamp every 53 min 17 s from 2024-08-01 20:00 UTC.
LOG_START_SERIAL = 45505.0 + 20.0 / 24.0
LOG_STEP_DAYS = (53 * 60 + 17) / 86400.0

# Formula template per column, {r} the row; and the core call that must match it.
COLUMNS = [
    ('=SKY.JD(A{r};"UTC";"TT")', "SKY.JD", lambda t: [t, "UTC", "TT"]),
    ("=SKY.MJD(A{r})", "SKY.MJD", lambda t: [t]),
    ('=SKY.DATETIME(A{r};"UTC";"TDB")', "SKY.DATETIME", lambda t: [t, "UTC", "TDB"]),
    ("=SKY.DELTAT(A{r})", "SKY.DELTAT", lambda t: [t]),
    ("=SKY.TEXT.ISO(A{r})", "SKY.TEXT.ISO", lambda t: [t]),
    ("=SKY.OBLIQUITY(A{r})", "SKY.OBLIQUITY", lambda t: [t]),
    ('=SKY.OBLIQUITY(A{r};;"LASKAR1986";"ARCSEC")', "SKY.OBLIQUITY",
     lambda t: [t, None, "LASKAR1986", "ARCSEC"]),
    ("=SKY.OBLIQUITY.TRUE(A{r})", "SKY.OBLIQUITY.TRUE", lambda t: [t]),
    ('=SKY.NUTATION.LON(A{r};;;"ARCSEC")', "SKY.NUTATION.LON", lambda t: [t, None, None, "ARCSEC"]),
    ('=SKY.NUTATION.OBL(A{r};;"IAU2000B";"ARCSEC")', "SKY.NUTATION.OBL",
     lambda t: [t, None, "IAU2000B", "ARCSEC"]),
]
ANGLE_COLUMNS = [
    ("=SKY.TEXT.HMS(A{r}*0.37)", "SKY.TEXT.HMS", lambda t: [t * 0.37]),
    ("=SKY.TEXT.DMS(A{r}/-700;2)", "SKY.TEXT.DMS", lambda t: [t / -700, 2.0]),
    ("=SKY.WRAP.180(A{r})", "SKY.WRAP.180", lambda t: [t]),
    ("=SKY.ANGLE(SKY.TEXT.DMS(A{r}/-700;3))", None, None),
]


def _col(k):
    return chr(ord("B") + k)


def _log_serials():
    return [LOG_START_SERIAL + i * LOG_STEP_DAYS for i in range(ROWS)]


def _fill_log(sheet, serials):
    sheet.getCellRangeByName(f"A2:A{ROWS + 1}").setDataArray(tuple((s,) for s in serials))


def _fill_formulas(sheet, templates):
    for k, template in enumerate(templates):
        col = _col(k)
        sheet.getCellRangeByName(f"{col}2:{col}{ROWS + 1}").setFormulaArray(
            tuple((template.format(r=r),) for r in range(2, ROWS + 2))
        )


def _error_cells(sheet):
    """Addresses of formula cells whose result is an error (Err:5xx, #NAME? ...)."""
    from com.sun.star.sheet.FormulaResult import ERROR

    found = sheet.queryFormulaCells(ERROR)
    return [found.getByIndex(i).AbsoluteName for i in range(found.getCount())]


def _same(got, want, what):
    if isinstance(want, str):
        assert got == want, what
    else:
        assert isinstance(got, float), f"{what}: {got!r}"
        assert math.isclose(got, want, rel_tol=1e-13, abs_tol=1e-9), f"{what}: {got} != {want}"


def test_fill_down_a_thousand_rows_matches_the_core(sheet_doc):
    sheet = sheet_doc.Sheets.getByIndex(0)
    serials = _log_serials()
    _fill_log(sheet, serials)
    _fill_formulas(sheet, [c[0] for c in COLUMNS] + [c[0] for c in ANGLE_COLUMNS])
    sheet_doc.calculateAll()
    assert _error_cells(sheet) == []
    for k, (template, name, args) in enumerate(COLUMNS + ANGLE_COLUMNS):
        col = _col(k)
        shown = [row[0] for row in sheet.getCellRangeByName(f"{col}2:{col}{ROWS + 1}").getDataArray()]
        for i, (got, s) in enumerate(zip(shown, serials)):
            if name is None:  # text -> degrees -> text round trip inside the office
                # three decimals of an arcsecond: within half of 0.001"
                assert abs(got - s / -700) <= 0.5e-3 / 3600 + 1e-12, (template, i)
                continue
            _same(got, evaluate(name, args(s)), f"{template} row {i + 2}")


def test_whole_column_form_equals_the_per_cell_form(sheet_doc):
    sheet = sheet_doc.Sheets.getByIndex(0)
    serials = _log_serials()
    _fill_log(sheet, serials)
    last = ROWS + 1
    sheet.getCellRangeByName(f"B2:B{last}").setArrayFormula(f'=SKY.JD(A2:A{last};"UTC";"TT")')
    sheet.getCellRangeByName(f"C2:C{last}").setArrayFormula(f"=SKY.OBLIQUITY.TRUE(A2:A{last})")
    sheet.getCellRangeByName(f"D2:D{last}").setFormulaArray(
        tuple((f'=SKY.JD(A{r};"UTC";"TT")',) for r in range(2, last + 1))
    )
    sheet.getCellRangeByName(f"E2:E{last}").setFormulaArray(
        tuple((f"=SKY.OBLIQUITY.TRUE(A{r})",) for r in range(2, last + 1))
    )
    sheet_doc.calculateAll()
    column = sheet.getCellRangeByName(f"B2:C{last}").getDataArray()
    per_cell = sheet.getCellRangeByName(f"D2:E{last}").getDataArray()
    assert column == per_cell
    assert all(isinstance(v, float) and v > 2e6 for v, _ in column)


def test_a_bad_row_spoils_only_its_own_cell_in_a_column_call(sheet_doc):
    sheet = sheet_doc.Sheets.getByIndex(0)
    sheet.getCellRangeByName("A2:A6").setDataArray(
        ((45505.5,), ("2024-13-01",), (45506.5,), ("JD 2451545",), ("not a date",))
    )
    sheet.getCellRangeByName("B2:B6").setArrayFormula('=SKY.OBLIQUITY(A2:A6;"UTC")')
    sheet_doc.calculateAll()
    shown = [sheet.getCellByPosition(1, r) for r in range(1, 6)]
    assert abs(shown[0].getValue() - evaluate("SKY.OBLIQUITY", [45505.5, "UTC"])) < 1e-12
    assert shown[1].getString().startswith("#SKY:") and "month 13" in shown[1].getString()
    assert abs(shown[2].getValue() - evaluate("SKY.OBLIQUITY", [45506.5, "UTC"])) < 1e-12
    assert abs(shown[3].getValue() - evaluate("SKY.OBLIQUITY", ["JD 2451545", "UTC"])) < 1e-12
    assert shown[4].getString().startswith("#SKY:")
    assert all(c.getError() == 0 for c in shown)


def test_null_date_1904_gives_the_same_instants(office):
    import officekit

    # Common practice: 1904-01-01 is 1462 days after 1899-12-30 (the two null dates).
    shift = 1462.0
    results = []
    for null_date in ((1899, 12, 30), (1904, 1, 1)):
        doc = office.new_sheet()
        try:
            officekit.set_null_date(doc, *null_date)
            assert officekit.null_date(doc) == null_date
            sheet = doc.Sheets.getByIndex(0)
            offset = 0.0 if null_date == (1899, 12, 30) else shift
            serials = [s - offset for s in _log_serials()[:200]]
            sheet.getCellRangeByName("A2:A201").setDataArray(tuple((s,) for s in serials))
            sheet.getCellRangeByName("B2:B201").setFormulaArray(
                tuple((f'=SKY.JD(A{r};"UTC";"TT")',) for r in range(2, 202))
            )
            sheet.getCellRangeByName("C2:C201").setFormulaArray(
                tuple((f'=SKY.DATETIME(A{r};"UTC";"TAI")-A{r}',) for r in range(2, 202))
            )
            doc.calculateAll()
            # The displayed date-time is the same in both documents.
            shown = sheet.getCellByPosition(0, 1)
            shown.NumberFormat = doc.NumberFormats.getStandardFormat(
                __import__("uno").getConstantByName("com.sun.star.util.NumberFormat.DATETIME"),
                __import__("uno").createUnoStruct("com.sun.star.lang.Locale"),
            )
            results.append((sheet.getCellRangeByName("B2:C201").getDataArray(), shown.getString()))
        finally:
            doc.close(True)
    (jd_a, text_a), (jd_b, text_b) = results
    assert text_a == text_b
    assert jd_a == jd_b
    # TAI - UTC is 37 s in 2024 (IERS Bulletin C; common practice).
    assert all(abs(d * 86400 - 37.0) < 1e-5 for _, d in jd_a)


# Date-time results of functions that take no time argument (a year, a JD number, a
# BJD): the serial must still count from the document's null date.
NULL_DATE_RESULTS = (
    '=SKY.SEASON(2027;"JUNE")',
    '=SKY.JD.DATETIME(2461000.5;"UTC")',
    '=SKY.MJD.DATETIME(60000.25;"UTC")',
    '=SKY.BJD.TDB.DATETIME(2460000.5;83.6;22.0)',
    '=SKY.HJD.UTC.DATETIME(2460000.5;83.6;22.0)',
    "=SKY.LEAPSECONDS.UNTIL()",
    '=SKY.SUN.RISE("2027-06-21";47.38;8.05)',
)


def test_null_date_1904_moves_every_date_time_result(office):
    import officekit

    values = {}
    for null_date in ((1899, 12, 30), (1904, 1, 1)):
        doc = office.new_sheet()
        try:
            officekit.set_null_date(doc, *null_date)
            sheet = doc.Sheets.getByIndex(0)
            for row, formula in enumerate(NULL_DATE_RESULTS):
                sheet.getCellByPosition(0, row).setFormula(formula)
            doc.calculateAll()
            cells = [sheet.getCellByPosition(0, row) for row in range(len(NULL_DATE_RESULTS))]
            assert [c.getError() for c in cells] == [0] * len(cells)
            assert not any(c.getString().startswith("#") for c in cells)
            values[null_date] = [c.getValue() for c in cells]
        finally:
            doc.close(True)
    # Common practice: 1904-01-01 is 1462 days after 1899-12-30, so the same instant is a
    # serial 1462 smaller in a 1904 document.
    for formula, a, b in zip(NULL_DATE_RESULTS, values[(1899, 12, 30)], values[(1904, 1, 1)]):
        assert abs((a - b) - 1462.0) < 1e-9, formula


def test_a_null_date_changed_in_an_open_document_moves_its_results(office):
    # The add-in keeps the last NullDate it read and compares each new read with it
    # (eclipsheet_addin._null_date): a document whose null date is changed while open
    # must answer for the new one at the next calculation, back and forth.
    import officekit

    doc = office.new_sheet()
    try:
        sheet = doc.Sheets.getByIndex(0)
        for row, formula in enumerate(NULL_DATE_RESULTS):
            sheet.getCellByPosition(0, row).setFormula(formula)
        cells = [sheet.getCellByPosition(0, row) for row in range(len(NULL_DATE_RESULTS))]
        seen = []
        for null_date in ((1899, 12, 30), (1904, 1, 1), (1899, 12, 30)):
            officekit.set_null_date(doc, *null_date)
            doc.calculateAll()
            seen.append([c.getValue() for c in cells])
    finally:
        doc.close(True)
    # Common practice: 1904-01-01 is 1462 days after 1899-12-30.
    for formula, a, b, again in zip(NULL_DATE_RESULTS, *seen):
        assert abs((a - b) - 1462.0) < 1e-9, formula
        assert again == a, formula


def test_saved_sheet_reopens_in_a_fresh_office_with_formulas_and_values(office, oxt, tmp_path):
    import officekit

    doc = office.new_sheet()
    sheet = doc.Sheets.getByIndex(0)
    serials = _log_serials()[:300]
    sheet.getCellRangeByName("A2:A301").setDataArray(tuple((s,) for s in serials))
    _fill_formulas_rows = [(f'=SKY.JD(A{r};"UTC";"TT")', f"=SKY.TEXT.ISO(A{r};;\"TAI\")",
                            f'=SKY.OBLIQUITY.TRUE(A{r};;"IAU1980";"IAU1980")')
                           for r in range(2, 302)]
    sheet.getCellRangeByName("B2:D301").setFormulaArray(tuple(_fill_formulas_rows))
    sheet.getCellRangeByName("E2:E301").setArrayFormula("=SKY.MJD(A2:A301)")
    doc.calculateAll()
    before = sheet.getCellRangeByName("A2:E301").getDataArray()
    formulas_before = sheet.getCellRangeByName("A2:E301").getFormulaArray()
    path = str(tmp_path / "log.ods")
    officekit.Office.save(doc, path)
    doc.close(True)

    # The file stores our programmatic names (a frozen file format).
    content = zipfile.ZipFile(path).read("content.xml").decode("utf-8")
    assert "ORG.ECLIPSHEET.SKY.SKYFUNCTIONS.SKYJD(" in content

    with officekit.Office(oxt=oxt) as colleague:
        again = colleague.open(path)
        try:
            sheet2 = again.Sheets.getByIndex(0)
            assert sheet2.getCellRangeByName("A2:E301").getFormulaArray() == formulas_before
            _assert_rows_close(sheet2.getCellRangeByName("A2:E301").getDataArray(), before)
            again.calculateAll()
            after = sheet2.getCellRangeByName("A2:E301").getDataArray()
            _assert_rows_close(after, before)
            # Recomputed in the colleague's office: exactly what the core gives for the
            # values as stored.
            for row in after:
                t = row[0]
                _same(row[1], evaluate("SKY.JD", [t, "UTC", "TT"]), "JD")
                _same(row[2], evaluate("SKY.TEXT.ISO", [t, None, "TAI"]), "ISO")
                _same(row[3], evaluate("SKY.OBLIQUITY.TRUE", [t, None, "IAU1980", "IAU1980"]), "eps")
                _same(row[4], evaluate("SKY.MJD", [t]), "MJD")
        finally:
            again.close(True)


def _assert_rows_close(got, want):
    """ODS keeps a cell's number to 15 significant digits (LibreOffice 7.4, seen here):
    a date-time near 45500 survives to about 1e-10 day (9 microseconds)."""
    assert len(got) == len(want)
    for g, w in zip(got, want):
        for a, b in zip(g, w):
            if isinstance(b, str):
                assert a == b
            else:
                assert math.isclose(a, b, rel_tol=2e-15, abs_tol=0.0), (a, b)


def test_every_function_and_argument_is_described_in_the_office(office):
    known = office.function_descriptions()
    for fn in registry.FUNCTIONS:
        assert fn.name in known, f"{fn.name} missing from the office's function list"
        description, args = known[fn.name]
        assert description == fn.description
        assert [a for a, _ in args] == [a.name for a in fn.args]
        for (_, text), a in zip(args, fn.args):
            # The office's own words for each argument: "Required. ..." first for the
            # required ones, as the xcu says (see test_registry).
            assert text == a.wizard_description
            assert text.startswith("Required. ") != a.optional


HOSTILE = [
    # (formula, what the message must mention)
    ('=SKY.JD("tomorrow")', "not a time"),
    ("=SKY.JD(1E+308)", "out of range"),
    ('=SKY.JD("2024-13-01")', "month 13"),
    ('=SKY.JD("2024-02-30")', "day 30"),
    ('=SKY.JD("2024-01-01T24:00:01")', "past 24:00:00"),
    ('=SKY.JD("-0043-03-15")', "from 1960"),  # UTC; historical dates take UT
    ('=SKY.JD("1582-10-10";"UT")', "did not exist"),
    ('=SKY.JD("1955-01-01")', "from 1960"),
    ("=SKY.JD(-200000)", "from 1960"),
    ('=SKY.JD("2015-06-29T23:59:60")', "no leap second"),
    ('=SKY.JD("2451545")', "number held as text"),
    ('=SKY.JD(45000;"GMT")', 'unknown scale "GMT"'),
    ('=SKY.JD(45000;"UTC";"UT2")', 'unknown result_scale "UT2"'),
    ('=SKY.JD(45000;"UT1";;5)', "DUT1"),
    ('=SKY.OBLIQUITY(45000;;"IAU2007")', 'unknown model "IAU2007"'),
    ('=SKY.OBLIQUITY("JD 0";"TT")', "LASKAR1986 or VONDRAK2011"),
    ('=SKY.NUTATION.LON(45000;;"IAU1976")', 'unknown nutation model "IAU1976"'),
    ('=SKY.OBLIQUITY(45000;;;"GRAD")', 'unknown unit "GRAD"'),
    ('=SKY.ANGLE("12h30d")', "mixes hours and degrees"),
    ('=SKY.ANGLE("23 75 00")', "below 60"),
    ('=SKY.TEXT.DMS("north")', "not an angle"),
    ('=SKY.TEXT.DMS(10;"two")', "decimals must be a number"),
    ("=SKY.TEXT.DMS(10;12)", "0 to 9"),
    ("=SKY.TEXT.HMS(1E+308)", "finite number"),
    ('=SKY.WRAP.360("abc")', "not an angle"),
    ('=SKY.JD.DATETIME("x")', "must be a number"),
    ("=SKY.JD()", "missing"),
    ('=SKY.JD(Z99)', "from 1960"),  # an empty cell arrives as 0.0, i.e. 1899-12-30
]


@pytest.mark.parametrize("formula,mention", HOSTILE)
def test_hostile_input_gives_a_message_not_an_error(sheet_doc, formula, mention):
    cell = sheet_doc.Sheets.getByIndex(0).getCellByPosition(0, 0)
    cell.setFormula(formula)
    sheet_doc.calculateAll()
    assert cell.getError() == 0, f"{formula} gave Err:{cell.getError()}"
    text = cell.getString()
    assert text.startswith("#SKY: "), f"{formula} showed {text!r}"
    assert mention in text, f"{formula} showed {text!r}"


def test_missing_numpy_is_explained_in_every_cell(oxt, tmp_path):
    """An office whose Python cannot import numpy: the cells say so (no #NAME?)."""
    import officekit

    # A numpy that fails to import, put ahead of the system's on the office's path.
    shadow = tmp_path / "shadow" / "numpy"
    shadow.mkdir(parents=True)
    (shadow / "__init__.py").write_text(
        "raise ImportError(\"No module named 'numpy'\", name='numpy')\n"
    )
    with officekit.Office(oxt=oxt, env={"PYTHONPATH": str(shadow.parent)}) as office:
        doc = office.new_sheet()
        try:
            cells = doc.Sheets.getByIndex(0)
            cells.getCellByPosition(0, 0).setFormula("=SKY.JD(45000)")
            cells.getCellByPosition(0, 1).setFormula('=SKY.ANGLE("12h")')
            doc.calculateAll()
            for r in (0, 1):
                cell = cells.getCellByPosition(0, r)
                assert cell.getError() == 0
                assert "cannot import numpy" in cell.getString()
                assert "python3-numpy" in cell.getString()
        finally:
            doc.close(True)


def test_extension_manager_install_into_a_running_office(oxt, tmp_path):
    """The path the Extension Manager dialog takes: the deployment API, user scope."""
    import officekit

    with officekit.Office() as office:  # fresh profile, nothing installed
        ids = office.install_with_extension_manager(oxt)
        assert registry.EXTENSION_IDENTIFIER in ids
        profile = office.profile
        office.keep_profile = True
    # Calc reads its add-in list at start-up, as after installing from the dialog and
    # restarting the office.
    with officekit.Office(profile=profile) as restarted:
        doc = restarted.new_sheet()
        try:
            cell = doc.Sheets.getByIndex(0).getCellByPosition(0, 0)
            cell.setFormula('=SKY.JD("2000-01-01T12:00:00Z";"UTC";"TT")')
            doc.calculateAll()
            # J2000.0 is 2000-01-01 11:58:55.816 UTC (Astronomical Almanac; common practice).
            assert abs(cell.getValue() - (2451545.0 + 64.184 / 86400)) < 1e-9
        finally:
            doc.close(True)
    shutil.rmtree(profile, ignore_errors=True)


def test_array_result_of_the_core_has_the_range_shape():
    grid = tuple((45500.0 + i, 45600.0 + i) for i in range(3))
    out = evaluate("SKY.MJD", [grid])
    assert np.shape(out) == (3, 2)


def test_text_results_compare_equal_to_typed_text(sheet_doc):
    """A text from a 1x1 array result compares unequal to the same typed text in
    LibreOffice 7.4 (checked here with a sequence<sequence<any>> method); our text
    functions return plain values, so IF() on their text works."""
    cells = sheet_doc.Sheets.getByIndex(0)
    # Total solar eclipse of 2024-04-08 (common knowledge); new Moon at 18:21 UTC.
    formulas = [
        ('=SKY.TEXT.HMS(10)="00h40m00.00s"', "TRUE"),
        ('=IF(SKY.ECLIPSE.POSSIBLE("2024-04-08T18:21:00Z")="solar eclipse possible";"yes";"no")',
         "yes"),
        ('=COUNTIF(B1;"+23°26\'21.4""")', "1"),
        ('=SKY.TEXT.DMS(23.43928;1)', '+23°26\'21.4"'),
        ('=SKY.TEXT.HMS(C1:C3)', None),
    ]
    for k, (formula, _) in enumerate(formulas):
        cells.getCellByPosition(0, k).setFormula(formula)
    cells.getCellByPosition(1, 0).setFormula("=SKY.TEXT.DMS(23.43928;1)")
    for k in range(3):
        cells.getCellByPosition(2, k).setValue(10.0 * (k + 1))
    sheet_doc.calculateAll()
    for k, (formula, shown) in enumerate(formulas):
        cell = cells.getCellByPosition(0, k)
        assert cell.getError() == 0, formula
        if shown is not None:
            assert cell.getString() == shown, (formula, cell.getString())
    # A range given to a text function: one message, not a silent first value.
    assert cells.getCellByPosition(0, 4).getString().startswith("#SKY: SKY.TEXT.HMS gives one text per cell")
