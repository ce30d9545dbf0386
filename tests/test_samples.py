"""The sample sheets: they use every function, and recompute cleanly in a real office."""

import csv
import glob
import os
import zipfile

import pytest

from calcfuncs import registry

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
SAMPLES = sorted(glob.glob(os.path.join(ROOT, "sample_sheets", "*.ods")))


def _content(path):
    return zipfile.ZipFile(path).read("content.xml").decode("utf-8")


def test_there_are_sample_sheets():
    assert SAMPLES


def test_every_function_is_used_in_a_sample_sheet():
    stored = "".join(_content(p) for p in SAMPLES)
    unused = [
        f.name for f in registry.FUNCTIONS
        if f"{registry.IMPLEMENTATION_NAME.upper()}.{f.method.upper()}(" not in stored
    ]
    assert not unused, f"no sample sheet uses {unused}"


def test_sample_sheets_hold_no_macros():
    for path in SAMPLES:
        names = zipfile.ZipFile(path).namelist()
        assert not any(n.startswith(("Basic/", "Scripts/")) for n in names), path


@pytest.mark.office
def test_recompute_writes_ods_pdf_csv_and_reports_clean_sheets(oxt, tmp_path, capsys):
    import recompute

    status = recompute.recompute([os.path.join(ROOT, "sample_sheets")], oxt, str(tmp_path),
                                 messages_expected={"Bad input"})
    printed = capsys.readouterr().out
    assert status == 0, printed
    for path in SAMPLES:
        base = os.path.splitext(os.path.basename(path))[0]
        assert os.path.getsize(tmp_path / f"{base}.ods") > 10_000
        assert (tmp_path / f"{base}.pdf").read_bytes().startswith(b"%PDF")
        log_csv = tmp_path / f"{base}-Observing log.csv"
        if log_csv.exists():
            rows = list(csv.reader(open(log_csv, encoding="utf-8")))
            # JD (TT) column of the first log row: a number near 2.46 million.
            assert 2.46e6 < float(rows[2][4]) < 2.47e6
    # The demonstration sheet's messages are reported, not hidden.
    assert "Bad input" in printed and "(expected: demonstration)" in printed


@pytest.mark.office
def test_recompute_fails_on_a_sheet_with_messages(office, oxt, tmp_path):
    import officekit
    import recompute

    doc = office.new_sheet()
    try:
        doc.Sheets.getByIndex(0).getCellByPosition(0, 0).setFormula('=SKY.JD("2025-13-01")')
        src = tmp_path / "src"
        src.mkdir()
        officekit.Office.save(doc, str(src / "broken.ods"))
    finally:
        doc.close(True)
    before = (src / "broken.ods").read_bytes()
    assert recompute.recompute([str(src)], oxt, str(tmp_path / "out")) == 1
    assert (src / "broken.ods").read_bytes() == before  # the input is never written
