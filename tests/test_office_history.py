"""Historical dates through the real Calc: text dates filled down 1,000 rows, dates that
cannot be, and how Calc itself shows a date-time value before the reform.

The reference for the filled columns is the core evaluated in this process on the very
values the sheet holds (the core's accuracy is checked against outside sources in
test_calendars.py and test_deltat.py).  The reference for Calc's own display is
LibreOffice itself, read back with getString().
"""

import math

import pytest

from calcfuncs.cells import evaluate

pytestmark = pytest.mark.office

ROWS = 1000
MONTHS = ("January", "February", "March", "April", "May", "June", "July", "August",
          "September", "October", "November", "December")
NULL_DATE_JD = 2415018.5  # 1899-12-30, Calc's default null date


def _historical(i):
    """Column A: '<n> BC <Month> <d> 10:00' and, every fifth row, an AD date, spread over
    3000 BC to AD 1500 (invented dates; the functions decide what they mean)."""
    month, day = 1 + (i * 7) % 12, 1 + (i * 11) % 28
    if i % 5 == 4:
        return f"AD {1 + (i * 13) % 1500} {MONTHS[month - 1]} {day} {i % 24:02d}:{(i * 7) % 60:02d}"
    return f"{1 + (i * 37) % 3000} BC {MONTHS[month - 1]} {day} 10:00"


def _astronomical(i):
    """Column B: ISO-style astronomical years -4712 to -0001 ('-0043-03-15T10:00')."""
    year = 1 + (i * 53) % 4712
    return f"-{year:04d}-{1 + i % 12:02d}-{1 + (i * 3) % 28:02d}T{(i * 5) % 24:02d}:{i % 60:02d}"


# Formula per column, {r} the row; and the core call it must equal (v = (A, B) of the row).
COLUMNS = [
    ('=SKY.JD(A{r};"TT")', "SKY.JD", lambda v: [v[0], "TT"]),
    ('=SKY.JD(B{r};"LMT 12.4964";"TT")', "SKY.JD", lambda v: [v[1], "LMT 12.4964", "TT"]),
    ('=SKY.TEXT.DATE(A{r};"TT";;"GREGORIAN";"ASTRONOMICAL";2)', "SKY.TEXT.DATE",
     lambda v: [v[0], "TT", None, "GREGORIAN", "ASTRONOMICAL", 2.0]),
    ('=SKY.TEXT.DATE(B{r};"UT";"TT")', "SKY.TEXT.DATE", lambda v: [v[1], "UT", "TT"]),
    ('=SKY.DELTAT(A{r};"UT")', "SKY.DELTAT", lambda v: [v[0], "UT"]),
    ('=SKY.DELTAT(B{r};"UT";;"ESPENAK2006")', "SKY.DELTAT", lambda v: [v[1], "UT", None, "ESPENAK2006"]),
    ('=SKY.DELTAT.UNCERTAINTY(A{r};"UT")', "SKY.DELTAT.UNCERTAINTY", lambda v: [v[0], "UT"]),
    ('=SKY.OBLIQUITY(A{r};"TT";"VONDRAK2011")', "SKY.OBLIQUITY", lambda v: [v[0], "TT", "VONDRAK2011"]),
    ('=SKY.OBLIQUITY(B{r};"UT";"VONDRAK2011";"ARCSEC")', "SKY.OBLIQUITY",
     lambda v: [v[1], "UT", "VONDRAK2011", "ARCSEC"]),
]
FIRST = 2  # column C: the formulas start after the two input columns


def _error_cells(sheet):
    """Addresses of formula cells whose result is an error (Err:5xx, #NAME? ...)."""
    from com.sun.star.sheet.FormulaResult import ERROR

    found = sheet.queryFormulaCells(ERROR)
    return [found.getByIndex(i).AbsoluteName for i in range(found.getCount())]


@pytest.fixture(scope="module")
def filled(office):
    """Text dates in A and B, each formula written in row 2 and filled down by Calc."""
    from com.sun.star.sheet.FillDirection import TO_BOTTOM

    doc = office.new_sheet()
    sheet = doc.Sheets.getByIndex(0)
    inputs = [(_historical(i), _astronomical(i)) for i in range(ROWS)]
    sheet.getCellRangeByPosition(0, 1, 1, ROWS).setDataArray(inputs)
    for k, (template, _, _) in enumerate(COLUMNS):
        col = FIRST + k
        sheet.getCellByPosition(col, 1).setFormula(template.format(r=2))
        sheet.getCellRangeByPosition(col, 1, col, ROWS).fillAuto(TO_BOTTOM, 1)
    doc.calculateAll()
    shown = sheet.getCellRangeByPosition(0, 1, FIRST + len(COLUMNS) - 1, ROWS).getDataArray()
    last_formulas = sheet.getCellRangeByPosition(FIRST, ROWS, FIRST + len(COLUMNS) - 1, ROWS).getFormulaArray()[0]
    errors = _error_cells(sheet)
    yield inputs, shown, last_formulas, errors
    doc.close(True)


def test_the_inputs_stayed_text_and_no_cell_is_an_error(filled):
    inputs, shown, _, errors = filled
    assert [tuple(row[:2]) for row in shown] == inputs  # Calc did not turn them into dates
    assert errors == []


@pytest.mark.parametrize("k", range(len(COLUMNS)), ids=[c[0] for c in COLUMNS])
def test_filled_down_history_equals_the_core(filled, k):
    inputs, shown, last_formulas, _ = filled
    template, name, args = COLUMNS[k]
    # Fill-down wrote one relative formula per row: the last refers to row 1001.
    arguments = template.format(r=ROWS + 1).split("(", 1)[1]
    assert last_formulas[k].replace(" ", "").endswith(arguments.replace(" ", "")), last_formulas[k]
    mismatches, messages = [], 0
    for i, v in enumerate(inputs):
        got, want = shown[i][FIRST + k], evaluate(name, args(v))
        if isinstance(want, str):
            messages += want.startswith("#SKY:")
            ok = got == want
        else:
            ok = isinstance(got, float) and math.isclose(got, want, rel_tol=1e-12, abs_tol=1e-9)
        if not ok:
            mismatches.append((i + 2, v, got, want))
    assert not mismatches, f"{template}: {len(mismatches)} rows differ, first {mismatches[:3]}"
    if name != "SKY.DELTAT.UNCERTAINTY":  # which has no published value for most rows
        assert messages == 0, f"{template}: {messages} rows gave messages"


def test_a_text_date_read_back_inside_calc(sheet_doc):
    # Text -> JD -> text -> JD, all in cells: the calendar text the sheet writes reads back
    # as the same instant.
    sheet = sheet_doc.Sheets.getByIndex(0)
    sheet.getCellRangeByName("A1:A3").setDataArray(
        (("44 BC March 15 10:00",), ("-0584-05-28T15:07:12",), ("AD 1066 October 14 09:00",)))
    for r in (1, 2, 3):
        sheet.getCellRangeByName(f"B{r}").setFormula(f'=SKY.TEXT.DATE(A{r};"TT";;"JULIAN";"HISTORICAL";3)')
        sheet.getCellRangeByName(f"C{r}").setFormula(f'=SKY.JD(B{r};"TT")-SKY.JD(A{r};"TT")')
    sheet_doc.calculateAll()
    got = sheet.getCellRangeByName("B1:C3").getDataArray()
    assert [row[0] for row in got] == ["44 BC March 15 10:00:00.000", "585 BC May 28 15:07:12.000",
                                       "1066 October 14 09:00:00.000"]
    assert [row[1] for row in got] == [0.0, 0.0, 0.0]


IMPOSSIBLE = [
    # text typed into a cell, words the message names (why: common practice)
    ("1582 October 10", "did not exist"),  # skipped by the Gregorian reform
    ("0 BC March 1", "no year 0"),  # historical numbering has no year 0
    ("AD 0 March 1", "no year AD 0"),
    ("2023 February 30", "has day 30"),
    ("44 BC February 30", "has day 30"),
    ("1700-02-29", "Julian"),  # a leap day only in the Julian calendar, after the reform
    ("1752-09-05 cutover 1752-09-14", "did not exist"),
]


@pytest.mark.parametrize("text, words", IMPOSSIBLE)
def test_impossible_dates_give_a_message_not_an_error(sheet_doc, text, words):
    sheet = sheet_doc.Sheets.getByIndex(0)
    sheet.getCellRangeByName("A1").setString(text)
    formulas = ['=SKY.JD(A1;"TT")', '=SKY.TEXT.DATE(A1;"UT";"TT")', '=SKY.DELTAT(A1;"UT")',
                '=SKY.OBLIQUITY(A1;"TT";"VONDRAK2011")', f'=SKY.JD("{text}";"TT")']
    for k, formula in enumerate(formulas):
        sheet.getCellByPosition(1 + k, 0).setFormula(formula)
    sheet_doc.calculateAll()
    for k, formula in enumerate(formulas):
        cell = sheet.getCellByPosition(1 + k, 0)
        assert cell.getError() == 0, f"{formula} with {text!r} gave Err:{cell.getError()}"
        shown = cell.getString()
        assert shown.startswith("#SKY: ") and words in shown, (formula, shown)


def test_a_column_with_impossible_rows_keeps_its_good_rows(sheet_doc):
    from com.sun.star.sheet.FillDirection import TO_BOTTOM

    sheet = sheet_doc.Sheets.getByIndex(0)
    texts = [IMPOSSIBLE[i // 10 % len(IMPOSSIBLE)][0] if i % 10 == 3 else _historical(i)
             for i in range(ROWS)]
    sheet.getCellRangeByPosition(0, 0, 0, ROWS - 1).setDataArray(tuple((t,) for t in texts))
    sheet.getCellByPosition(1, 0).setFormula('=SKY.JD(A1;"TT")')
    sheet.getCellRangeByPosition(1, 0, 1, ROWS - 1).fillAuto(TO_BOTTOM, 1)
    sheet_doc.calculateAll()
    assert _error_cells(sheet) == []
    shown = [row[0] for row in sheet.getCellRangeByPosition(1, 0, 1, ROWS - 1).getDataArray()]
    for i, (text, got) in enumerate(zip(texts, shown)):
        if i % 10 == 3:
            assert isinstance(got, str) and got.startswith("#SKY: "), (text, got)
        else:
            assert got == evaluate("SKY.JD", [text, "TT"]), (text, got)


def _date_format(doc, code):
    from com.sun.star.lang import Locale

    formats = doc.getNumberFormats()
    locale = Locale("en", "US", "")
    key = formats.queryKey(code, locale, False)
    return key if key != -1 else formats.addNew(code, locale)


# Date-time values (days since 1899-12-30) of days before and at the reform, and what
# LibreOffice shows for them with the format YYYY-MM-DD HH:MM:SS.  Observed with the
# LibreOffice of this environment: the Julian calendar before 1582-10-15, as historians
# (and our AUTO reading) have it, and BC years written with a minus sign in historical
# numbering ("-0044" is 44 BC; the day before 0001-01-01 is "-0001-12-31").
CALC_SHOWS = [
    # JD, Calc's text, our text of the same value (SKY.TEXT.DATE on TT)
    (1705426.0, "-0044-03-15 12:00:00", "44 BC March 15 12:00:00"),  # JD 1705426.0
    (2299159.5, "1582-10-04 00:00:00", "1582 October 4 00:00:00"),
    (2299160.5, "1582-10-15 00:00:00", "1582 October 15 00:00:00"),
    (2110700.5, "1066-10-14 00:00:00", "1066 October 14 00:00:00"),
    (1721423.5, "0001-01-01 00:00:00", "1 January 1 00:00:00"),
    (1721422.5, "-0001-12-31 00:00:00", "1 BC December 31 00:00:00"),
]


@pytest.mark.parametrize("jd, calc_text, our_text", CALC_SHOWS)
def test_calc_shows_dates_before_the_reform_in_the_julian_calendar(sheet_doc, jd, calc_text, our_text):
    sheet = sheet_doc.Sheets.getByIndex(0)
    cell = sheet.getCellByPosition(0, 0)
    cell.setValue(jd - NULL_DATE_JD)
    cell.NumberFormat = _date_format(sheet_doc, "YYYY-MM-DD HH:MM:SS")
    sheet.getCellByPosition(1, 0).setFormula('=SKY.TEXT.DATE(A1;"TT")')
    sheet_doc.calculateAll()
    assert cell.getString() == calc_text
    assert sheet.getCellByPosition(1, 0).getString() == our_text


def test_a_date_typed_into_a_cell_and_the_same_characters_as_text(sheet_doc):
    # Typed into a cell, "-0044-03-15" becomes Calc's date-time value of 44 BC March 15
    # (Calc's historical years, observed); given to a function as text, "-0044-03-15" is
    # ISO 8601's astronomical year -44, which is 45 BC.  Both readings are shown here.
    sheet = sheet_doc.Sheets.getByIndex(0)
    sheet.getCellRangeByName("A1").setFormula("-0044-03-15")
    sheet.getCellRangeByName("A2").setFormula("1066-10-14")
    sheet.getCellRangeByName("B1").setFormula('=SKY.TEXT.DATE(A1;"TT")')
    sheet.getCellRangeByName("B2").setFormula('=SKY.TEXT.DATE(A2;"TT")')
    sheet.getCellRangeByName("B3").setFormula('=SKY.TEXT.DATE("-0044-03-15";"TT")')
    sheet_doc.calculateAll()
    assert sheet.getCellRangeByName("A1").getValue() == 1705425.5 - NULL_DATE_JD
    assert sheet.getCellRangeByName("B1").getString() == "44 BC March 15 00:00:00"
    assert sheet.getCellRangeByName("B2").getString() == "1066 October 14 00:00:00"
    assert sheet.getCellRangeByName("B3").getString() == "45 BC March 15 00:00:00"


def test_the_sky_of_585_bc_and_ad_800_answers_in_calc(sheet_doc):
    # The Sun, the Moon, a planet and the eclipse check at dates before the year 1000,
    # typed as historians write them: numbers now (the built-in source's long-range
    # theories), equal to the core's.  585 BC May 28 is the eclipse of the Lydian-Median
    # war (Herodotus; the canons' date, common knowledge, from memory): its new Moon is
    # flagged a possible solar eclipse.
    sheet = sheet_doc.Sheets.getByIndex(0)
    dates = ("585 BC May 28 12:00", "AD 800 March 21 12:00")
    before = ("585 BC May 25 12:00", "AD 800 March 18 12:00")  # where the phase search starts
    formulas = ['=SKY.SUN.LON(A{r};"UT")', '=SKY.MOON.LON(A{r};"UT")',
                '=SKY.PLANET.LON("MARS";A{r};"UT")', '=SKY.MOON.PHASE.NEXT(G{r};"UT";"NEW";"TT")',
                '=SKY.ECLIPSE.POSSIBLE(E{r};"TT")']
    for r, text in enumerate(dates, start=1):
        sheet.getCellRangeByName(f"A{r}").setString(text)
        sheet.getCellRangeByName(f"G{r}").setString(before[r - 1])
        for c, f in zip("BCDEF", formulas):
            sheet.getCellRangeByName(f"{c}{r}").setFormula(f.format(r=r))
    sheet_doc.calculateAll()
    got = sheet.getCellRangeByName("B1:F2").getDataArray()
    for row, text in zip(got, dates):
        assert all(isinstance(v, float) for v in row[:4]), row
        assert row[0] == pytest.approx(evaluate("SKY.SUN.LON", [text, "UT"]), abs=1e-9)
        assert row[1] == pytest.approx(evaluate("SKY.MOON.LON", [text, "UT"]), abs=1e-9)
        assert row[2] == pytest.approx(evaluate("SKY.PLANET.LON", ["MARS", text, "UT"]), abs=1e-9)
        assert row[4] in ("solar eclipse possible", "no solar eclipse"), row
    assert got[0][4] == "solar eclipse possible"
