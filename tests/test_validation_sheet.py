"""The validation sheet (sample_sheets/validation.ods, written by tools/make_validation_sheet.py).

Its rows are published values; the sheet itself is the table of evidence.  These tests
check that the rows are well formed, that the committed file holds them, that the tool
writes the same bytes each time, and that a real office recomputes it with every row
PASS and no # message.
"""

import io
import os
import re
import shutil
import xml.etree.ElementTree as ET
import zipfile

import pytest

import make_validation_sheet as vs
from calcfuncs import registry

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
SHEET = os.path.join(ROOT, "sample_sheets", vs.FILE_NAME)
NS = {
    "table": "urn:oasis:names:tc:opendocument:xmlns:table:1.0",
    "text": "urn:oasis:names:tc:opendocument:xmlns:text:1.0",
}
# Every source names a publication or says that the fact is common practice.
PUBLISHERS = ("SOFA/ERFA", "Meeus", "IAU", "IERS", "US Naval Observatory", "NASA", "ESA",
              "Espenak", "common practice")


def test_forty_rows_or_fewer_cover_every_family():
    assert 25 <= len(vs.ROWS) <= 40
    assert {row[0] for row in vs.ROWS} == set(vs.FAMILIES)


@pytest.mark.parametrize("row", vs.ROWS, ids=[f"{k + 1}-{r[1]}" for k, r in enumerate(vs.ROWS)])
def test_each_row_names_its_source_a_tolerance_and_calls_our_function(row):
    family, what, published, source, reference, ours, unit, tol, fmt, why = row
    assert any(p.lower() in source.lower() for p in PUBLISHERS), source
    assert what and published and why
    assert ours.startswith("=") and "SKY." in ours
    assert unit in vs.DIFFERENCES or unit == vs.TEXT
    assert tol >= 0 and (unit != vs.TEXT or tol == 0)
    # The reference is typed from the published figures: never computed by our functions.
    assert "SKY." not in reference
    called = [f.name for f in registry.FUNCTIONS if f.name + "(" in ours]
    assert called, ours
    # No text of the sheet starts with "#", which is how a message would show.
    assert not any(str(t).startswith("#") for t in (what, published, source, reference, why))


def _cell_texts(path):
    """{(row, col): text} of the first sheet of an ODS file, from content.xml."""
    root = ET.fromstring(zipfile.ZipFile(path).read("content.xml"))
    table = root.find(".//table:table", NS)
    out = {}
    r = 0
    for row in table.iter(f"{{{NS['table']}}}table-row"):
        repeat_rows = int(row.get(f"{{{NS['table']}}}number-rows-repeated", "1"))
        c = 0
        for cell in row:
            repeat = int(cell.get(f"{{{NS['table']}}}number-columns-repeated", "1"))
            paragraphs = ["".join(p.itertext()) for p in cell.findall("text:p", NS)]
            formula = cell.get(f"{{{NS['table']}}}formula")
            if paragraphs or formula:
                out[(r, c)] = ("\n".join(paragraphs), formula)
            c += repeat
        r += repeat_rows
    return out


_NUMBER = re.compile(r"(?<![A-Za-z_\d.])\d+(?:\.\d*)?(?:[eE][-+]?\d+)?")
_DISPLAY_NAME = re.compile(r"(?<![A-Z.])SKY\.[A-Z0-9.]+(?=\()")
_REFERENCE = re.compile(r"(?<![A-Za-z.\[])([A-Z]{1,2}\d+)(?![\d(])")


def _outside_strings(formula, change):
    """Apply ``change`` to the parts of a formula outside its "string literals"."""
    parts = re.split(r'("(?:[^"]|"")*")', formula)
    return "".join(p if k % 2 else change(p) for k, p in enumerate(parts))


def _as_stored(formula):
    """A formula as the sheet's file stores it (ODF): our functions by their stored
    names, references as [.G5], numbers to 15 significant digits as LibreOffice keeps them."""
    prefix = registry.IMPLEMENTATION_NAME.upper() + "."

    def change(part):
        part = _DISPLAY_NAME.sub(lambda m: prefix + registry.BY_NAME[m.group()].method.upper(), part)
        return _REFERENCE.sub(lambda m: f"[.{m.group(1)}]", part)

    return "of:" + _outside_strings(formula, change)


def _numbers_cut(formula):
    return _outside_strings(formula, lambda part: _NUMBER.sub(
        lambda m: "%.15g" % float(m.group()), part))


def test_the_committed_sheet_holds_exactly_these_rows():
    """Regenerate with tools/make_validation_sheet.py when this fails."""
    cells = _cell_texts(SHEET)
    for k, row in enumerate(vs.ROWS):
        for col, kind, content, _code in vs.cells_of(k, row):
            text, formula = cells.get((vs.FIRST_ROW + k, col), ("", None))
            if kind == "text":
                assert text == content, (k + 1, col, text, content)
            elif kind == "formula":
                want = _numbers_cut(_as_stored(content))
                assert formula is not None and _numbers_cut(formula) == want, (k + 1, col, formula, want)
    assert (vs.FIRST_ROW + len(vs.ROWS), 0) not in cells  # no rows left over


def _zip(entries):
    buf = io.BytesIO()
    with zipfile.ZipFile(buf, "w") as z:
        for name, data, when, kind in entries:
            info = zipfile.ZipInfo(name, when)
            info.compress_type = kind
            z.writestr(info, data)
    return buf.getvalue()


def test_normalise_removes_the_save_time_and_keeps_the_odf_order(tmp_path):
    def write(path, stamp, when):
        path.write_bytes(_zip([
            ("mimetype", b"application/vnd.oasis.opendocument.spreadsheet", when, zipfile.ZIP_STORED),
            ("meta.xml", f"<m><dc:date>{stamp}</dc:date><meta:editing-duration>PT{stamp[-1]}S"
             "</meta:editing-duration></m>".encode(), when, zipfile.ZIP_DEFLATED),
            ("content.xml", b"<c/>", when, zipfile.ZIP_DEFLATED),
        ]))

    a, b = tmp_path / "a.ods", tmp_path / "b.ods"
    write(a, "2026-01-01T10:00:01", (2026, 1, 1, 10, 0, 2))
    write(b, "2027-05-05T11:11:07", (2027, 5, 5, 11, 11, 8))
    assert a.read_bytes() != b.read_bytes()
    vs.normalise(str(a))
    vs.normalise(str(b))
    assert a.read_bytes() == b.read_bytes()
    with zipfile.ZipFile(a) as z:
        first = z.infolist()[0]
        assert first.filename == "mimetype" and first.compress_type == zipfile.ZIP_STORED
        assert b"dc:date" not in z.read("meta.xml")
        assert z.read("content.xml") == b"<c/>"
    assert sorted(os.listdir(tmp_path)) == ["a.ods", "b.ods"]  # no partial file left


# ---- in a real office ---------------------------------------------------------------------


@pytest.mark.office
def test_the_sheet_recomputes_with_every_row_pass_and_no_message(office, tmp_path):
    from com.sun.star.sheet.FormulaResult import ERROR

    import officekit

    copy = tmp_path / vs.FILE_NAME  # the office may leave a lock file beside what it opens
    shutil.copyfile(SHEET, copy)
    before = open(SHEET, "rb").read()
    doc = office.open(str(copy))
    try:
        doc.calculateAll()
        sheet = doc.Sheets.getByName(vs.SHEET_NAME)
        first, last = vs.FIRST_ROW, vs.FIRST_ROW + len(vs.ROWS) - 1
        data = sheet.getCellRangeByPosition(0, first, 12, last).getDataArray()
        results = {int(r[0]): r[10] for r in data}
        failing = {n: (vs.ROWS[n - 1][1], data[n - 1][5], data[n - 1][6], data[n - 1][7])
                   for n, v in results.items() if v != "PASS"}
        assert len(results) == len(vs.ROWS) and not failing, failing
        summary = sheet.getCellByPosition(2, 1).getString()
        assert summary == f"{len(vs.ROWS)} of {len(vs.ROWS)} rows PASS"
        messages = [(c, r, v) for c, r, _f, v in officekit.formula_cells(sheet)
                    if isinstance(v, str) and v.startswith("#")]
        assert not messages
        assert sheet.queryFormulaCells(ERROR).getCount() == 0
    finally:
        doc.close(True)
    assert open(SHEET, "rb").read() == before


@pytest.mark.office
def test_the_tool_writes_the_same_bytes_each_time(office, oxt, tmp_path):
    one = vs.build(oxt, str(tmp_path / "one"), office=office)
    two = vs.build(oxt, str(tmp_path / "two"), office=office)
    assert open(one, "rb").read() == open(two, "rb").read()
    assert os.listdir(tmp_path / "one") == [vs.FILE_NAME]  # nothing staged left behind
