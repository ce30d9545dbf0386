"""Freezing a sheet for a colleague without the extension (tools/freeze.py)."""

import os
import zipfile

import pytest

pytestmark = pytest.mark.office

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
SOURCE = os.path.join(ROOT, "sample_sheets", "observing_log.ods")


def _values(doc, sheet_name, area):
    return doc.Sheets.getByName(sheet_name).getCellRangeByName(area).getDataArray()


def test_frozen_copy_shows_the_values_without_the_extension(oxt, tmp_path):
    import freeze
    import officekit

    before = open(SOURCE, "rb").read()
    target = str(tmp_path / "frozen.ods")
    replaced = freeze.freeze(SOURCE, target, oxt)
    assert open(SOURCE, "rb").read() == before  # the input is never written to
    assert len(replaced) > 5000  # the sample holds about 5,700 cells computed by us
    content = zipfile.ZipFile(target).read("content.xml").decode("utf-8")
    assert "ORG.ECLIPSHEET" not in content

    with officekit.Office(oxt=oxt) as office:  # the reference: recomputed with it
        doc = office.open(SOURCE)
        try:
            doc.calculateAll()
            want = _values(doc, "Observing log", "A3:Q50")
            want_column = _values(doc, "Column form", "A3:F50")
        finally:
            doc.close(True)
    with officekit.Office() as colleague:  # no extension installed
        doc = colleague.open(target)
        try:
            doc.calculateAll()
            got = _values(doc, "Observing log", "A3:Q50")
            got_column = _values(doc, "Column form", "A3:F50")
            listing = doc.Sheets.getByName(freeze.LIST_SHEET)
            header = listing.getCellRangeByName("A5:C6").getDataArray()
            version = listing.getCellByPosition(1, 1).getString()
            sheet = doc.Sheets.getByName("Observing log")
            from com.sun.star.sheet.FormulaResult import ERROR

            assert sheet.queryFormulaCells(ERROR).getCount() == 0  # no #NAME?
            shown = sheet.getCellByPosition(4, 2)
            assert "0.00000" in doc.NumberFormats.getByKey(shown.NumberFormat).FormatString
        finally:
            doc.close(True)
    # ODS keeps a number to 15 significant digits, and a cell formatted as a date-time
    # as ISO text cut to 0.01 s (LibreOffice 7.4, both seen here), so the frozen values
    # equal the computed ones to that; column P is a native formula on them (a round
    # trip in ms) and is left out.
    _assert_close(got, want, skip_columns={15}, date_columns={1, 6, 14, 16})
    _assert_close(got_column, want_column, date_columns={0})
    assert header[0] == ("Sheet", "Cell", "Formula")
    assert header[1][2].startswith("=SKY.")  # the display name, as a user typed it
    assert version.startswith("Eclipsheet ")


def _assert_close(got, want, skip_columns=(), date_columns=()):
    import math

    assert len(got) == len(want)
    for g_row, w_row in zip(got, want):
        for k, (g, w) in enumerate(zip(g_row, w_row)):
            if k in skip_columns:
                continue
            if isinstance(w, str):
                assert g == w
            elif k in date_columns:
                assert abs(g - w) <= 0.0101 / 86400.0, (k, g, w)  # cut, not rounded
            else:
                assert math.isclose(g, w, rel_tol=5e-15, abs_tol=1e-12), (k, g, w)


def test_refuses_an_existing_target_unless_told(oxt, tmp_path):
    import freeze

    target = tmp_path / "exists.ods"
    target.write_bytes(b"keep me")
    with pytest.raises(SystemExit):
        freeze.freeze(SOURCE, str(target), oxt)
    assert target.read_bytes() == b"keep me"
    with pytest.raises(SystemExit):
        freeze.freeze(SOURCE, SOURCE, oxt, replace=True)  # never over its input
