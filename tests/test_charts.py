"""The charts of sample_sheets/sky_charts.ods: present, drawing the computed columns,
following their inputs, and visible in the PDF export.

"Visible" is measured, not assumed: the workbook is exported to PDF twice by the real
office, with its charts and with them deleted, both are rasterised by poppler's
pdftoppm, and the pages must differ by a large coloured region where a chart is (the
tables alone are black on white).
"""

import glob
import os
import subprocess
import zipfile

import numpy as np
import pytest

from calcfuncs import registry, vocabulary

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
BOOK = os.path.join(ROOT, "sample_sheets", "sky_charts.ods")
STORED = registry.IMPLEMENTATION_NAME.upper() + "."

# sheet -> chart -> (the columns it draws, first column the x; header row; last row),
# 0-based, as tools/samples/sky_charts.py lays them out.
EXPECTED = {
    "Obliquity": {"obliquity_models": ([0, 1, 2, 3, 4, 5], 4, 205)},
    "Sun's year": {"eqtime_and_declination": ([0, 1, 2], 4, 370),
                   "analemma": ([1, 2], 4, 370)},
    "Moon's month": {"moon_illuminated": ([0, 1], 3, 124)},
}
# The function each drawn y column computes.
Y_FUNCTIONS = {"Obliquity": "SKYOBLIQUITY", "Sun's year": ("SKYSUNEQTIME", "SKYSUNDEC"),
               "Moon's month": "SKYMOONILLUMINATED"}


def test_the_workbook_holds_four_charts_on_the_computed_ranges():
    # Read from the saved file itself: each chart object names the ranges it draws.
    content = zipfile.ZipFile(BOOK).read("content.xml").decode("utf-8")
    assert content.count("draw:notify-on-update-of-ranges=") == 4
    assert "Obliquity.F6:Obliquity.F206" in content
    assert "&apos;Moon&apos;&apos;s month&apos;.B5:&apos;Moon&apos;&apos;s month&apos;.B125" in content
    names = zipfile.ZipFile(BOOK).namelist()
    for chart in ("obliquity_models", "eqtime_and_declination", "analemma",
                  "moon_illuminated"):
        assert f"ObjectReplacements/{chart}" in names
    assert not any(n.startswith(("Basic/", "Scripts/")) for n in names)  # no macros


@pytest.fixture(scope="module")
def book(office, tmp_path_factory):
    folder = tmp_path_factory.mktemp("charts")
    doc = office.open_copy(BOOK, str(folder))
    doc.calculateAll()
    yield doc
    doc.close(True)


def _chart_rows(doc, sheet_name, chart_name):
    """The numbers the chart draws, row by row: x, then each series' y.  Read from its
    data sequences (chart2 API), which are what it draws and read the cells live; the
    older getData() table is a snapshot taken when the chart was loaded."""
    chart = doc.Sheets.getByName(sheet_name).getCharts().getByName(chart_name)
    diagram = chart.getEmbeddedObject().getFirstDiagram()
    series = diagram.getCoordinateSystems()[0].getChartTypes()[0].getDataSeries()

    def values(one, role):
        seq = [s.getValues() for s in one.getDataSequences() if s.getValues().Role == role]
        return list(seq[0].getData())

    columns = [values(series[0], "values-x")] + [values(s, "values-y") for s in series]
    return [tuple(row) for row in zip(*columns)]


@pytest.mark.office
def test_each_chart_draws_its_computed_columns(book):
    for sheet_name, charts in EXPECTED.items():
        sheet = book.Sheets.getByName(sheet_name)
        assert sorted(sheet.getCharts().getElementNames()) == sorted(charts)
        for chart_name, (cols, head, last) in charts.items():
            # The office keeps the ranges in its own grouping (a saved file comes back
            # as one block of data and one of headers): compare the cells they cover.
            covered = {(c, r) for rng in sheet.getCharts().getByName(chart_name).getRanges()
                       for c in range(rng.StartColumn, rng.EndColumn + 1)
                       for r in range(rng.StartRow, rng.EndRow + 1)}
            data = {(c, r) for c in cols for r in range(head + 1, last + 1)}
            assert data <= covered <= data | {(c, head) for c in cols}, chart_name
            assert {(c, head) for c in cols[1:]} <= covered  # the series' names
            # Every y column is a column of our formulas, one per row.
            for c in cols[1:]:
                formulas = sheet.getCellRangeByPosition(c, head + 1, c, last).getFormulaArray()
                wanted = Y_FUNCTIONS[sheet_name]
                wanted = wanted if isinstance(wanted, str) else wanted[c - 1]
                assert all(STORED + wanted + "(" in f[0] for f in formulas), (chart_name, c)


@pytest.mark.office
def test_each_model_is_drawn_only_inside_its_validity(book):
    sheet = book.Sheets.getByName("Obliquity")
    table = sheet.getCellRangeByPosition(0, 5, 5, 205).getDataArray()
    drawn = _chart_rows(book, "Obliquity", "obliquity_models")
    models = [sheet.getCellByPosition(1 + k, 4).getString() for k in range(5)]
    assert models == list(vocabulary.OBLIQUITY_MODELS)
    for k, model in enumerate(models):
        low, high = vocabulary.OBLIQUITY_VALIDITY[model]
        years = [row[0] for row in table if isinstance(row[1 + k], float)]
        # Holes are #N/A, which getDataArray gives as empty text: a gap in the chart.
        assert years and min(years) >= low and max(years) <= high, model
        inside = [y for y, *_ in table if low <= y <= high]
        assert len(years) == len(inside), model
    # The chart holds the table's numbers: IAU 2006 at J2000.0 is 84381.406 arcseconds
    # (IAU 2006 resolution B1, Hilton et al. 2006) = 23.4392794 degrees.
    j2000 = [row for row in drawn if row[0] == 2000.0][0]
    assert abs(j2000[1] - 84381.406 / 3600) < 1e-9


@pytest.mark.office
def test_the_charts_follow_their_inputs(book):
    sheet = book.Sheets.getByName("Moon's month")
    before = _chart_rows(book, "Moon's month", "moon_illuminated")
    start = sheet.getCellByPosition(1, 1)
    old = start.getValue()
    try:
        start.setValue(old + 14.0)  # a fortnight later: new Moon becomes full
        book.calculateAll()
        after = _chart_rows(book, "Moon's month", "moon_illuminated")
        cells = sheet.getCellRangeByPosition(0, 4, 1, 124).getDataArray()
        assert after[0][0] == old + 14.0
        assert after == [tuple(r) for r in cells]
        assert [r[1] for r in after] != [r[1] for r in before]
        # 2027-01-07 is close to new Moon (at 20:24 UTC, from memory of published
        # phase tables); the fraction there is near 0 in both the cells and the chart.
        assert min(r[1] for r in before) < 0.01
    finally:
        start.setValue(old)
        book.calculateAll()


def _pages(pdf, folder, prefix):
    subprocess.run(["pdftoppm", "-r", "60", pdf, os.path.join(folder, prefix)], check=True)
    pages = []
    for path in sorted(glob.glob(os.path.join(folder, prefix + "-*.ppm"))):
        with open(path, "rb") as f:
            magic, width, height, depth = f.readline(), *map(int, f.readline().split()), \
                int(f.readline())
            assert magic.strip() == b"P6" and depth == 255
            pages.append(np.frombuffer(f.read(), np.uint8).reshape(height, width, 3))
    return pages


def _same_print_areas(doc):
    """Fix each sheet's print area (the table and the place of its charts), so that a
    copy without the charts is printed at the same scale on the same pages."""
    for name, charts in EXPECTED.items():
        sheet = doc.Sheets.getByName(name)
        last = max(last for _, _, last in charts.values())
        sheet.setPrintAreas((sheet.getCellRangeByPosition(0, 0, 20, last).RangeAddress,))


@pytest.mark.office
def test_the_charts_show_in_the_pdf_export(office, tmp_path):
    exported = {}
    for kind in ("with", "without"):
        folder = tmp_path / kind
        folder.mkdir()
        doc = office.open_copy(BOOK, str(folder))
        try:
            doc.calculateAll()
            _same_print_areas(doc)
            if kind == "without":
                for sheet_name, charts in EXPECTED.items():
                    for chart_name in charts:
                        doc.Sheets.getByName(sheet_name).getCharts().removeByName(chart_name)
            exported[kind] = office.save(doc, str(tmp_path / f"{kind}.pdf"), "calc_pdf_Export")
        finally:
            doc.close(True)
    shown = _pages(exported["with"], str(tmp_path), "with")
    bare = _pages(exported["without"], str(tmp_path), "without")
    assert len(shown) == len(bare) > 3
    pictured = []
    for k, (a, b) in enumerate(zip(shown, bare)):
        changed = np.any(a != b, axis=2)
        # Coloured: the series lines (blue, orange, ...); a table is grey at most.
        colour = (a.max(axis=2).astype(int) - a.min(axis=2)) > 60
        if changed.mean() > 0.02 and (changed & colour).sum() > 100:
            pictured.append(k)
    # One page per chart sheet shows its charts (the Sun's two side by side); at 60 dpi
    # each differs in 3-4 % of its pixels, some hundreds of them coloured (seen here).
    assert len(pictured) == 3, pictured
