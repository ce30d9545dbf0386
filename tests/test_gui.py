"""The real, windowed Calc on a virtual screen (Xvfb): a sample sheet opens in a window,
our cells show their values, and the screenshot script shows the Function Wizard."""

import os
import shutil
import struct
import tempfile
import zlib

import numpy as np
import pytest

pytestmark = [
    pytest.mark.office,
    pytest.mark.skipif(shutil.which("Xvfb") is None,
                       reason="Xvfb is not installed (tools/setup.sh installs the Debian "
                              "package xvfb)"),
]

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
SAMPLE = os.path.join(ROOT, "sample_sheets", "observing_log.ods")

# J2000.0 is JD 2451545.0 on TT, which is 2000-01-01 11:58:55.816 UTC (TT - UTC = 64.184 s
# then); IAU definition of the epoch, Astronomical Almanac; common practice.  The first
# four rows of the sample's "Time scales" sheet spell that one instant four ways.
J2000_ROWS = {
    3: "2000-01-01T12:00:00",
    4: "2000-01-01T11:58:55.816Z",
    5: "JD 2451545.0",
    6: "MJD 51544.5",
}


def _looks_like_a_screen(picture):
    """Not blank: many colours, and no single colour covers most of the screen."""
    colours, counts = np.unique(picture.reshape(-1, 3), axis=0, return_counts=True)
    return len(colours), counts.max() / counts.sum()


def test_the_calc_window_shows_a_sample_sheet_with_our_values(oxt):
    import screenshot
    import uno  # noqa: F401  (makes the com.sun.star modules importable)
    from com.sun.star.sheet.FormulaResult import ERROR

    with screenshot.VirtualScreen(1024, 768) as screen, \
            screenshot.visible_office(oxt, screen) as office, \
            tempfile.TemporaryDirectory() as scratch:
        # The office started with no document: the screen is one flat colour, which the
        # check below must tell apart from a window with a sheet in it.
        empty = screen.wait_until_still()
        doc = screenshot.open_in_window(office, screen, SAMPLE, "Time scales", scratch)
        try:
            window = doc.CurrentController.Frame.ContainerWindow
            assert window.isVisible()
            sheet = doc.Sheets.getByName("Time scales")
            doc.calculateAll()  # computed now, in this windowed office, not read from the file
            for row, spelled in J2000_ROWS.items():
                assert sheet.getCellRangeByName(f"A{row}").getString() == spelled
                jd = sheet.getCellRangeByName(f"E{row}")
                assert "SKYJD(" in jd.getFormula()
                assert jd.getError() == 0
                assert abs(jd.getValue() - 2451545.0) < 1e-8, (spelled, jd.getValue())  # ~1 ms
            log = doc.Sheets.getByName("Observing log")
            assert log.queryFormulaCells(ERROR).getCount() == 0  # no #NAME?, no Err:5xx
            shown = log.getCellRangeByName("E3")  # =SKY.JD(B3;"UTC";"TT")
            assert not shown.getString().startswith("#")
            # JD 2460935.5 is 2025-09-17 00:00 (9391 days after JD 2451544.5, 2000-01-01).
            assert 2460935.5 < shown.getValue() < 2460936.5
            picture = screen.wait_until_still()
        finally:
            doc.close(True)
    flat_colours, flat_share = _looks_like_a_screen(empty)
    colours, share = _looks_like_a_screen(picture)
    assert flat_colours <= 2 and flat_share > 0.99  # the check can fail
    assert colours > 100 and share < 0.9, (colours, share)


def _png_top_left(data, rows, cols):
    """Decode the top-left ``rows`` x ``cols`` block of an 8-bit indexed or RGB PNG
    (PNG specification, filters 0-4; a block needs only pixels above and to its left)."""
    assert data[:8] == b"\x89PNG\r\n\x1a\n"
    pos, chunks = 8, {}
    while pos < len(data):
        (n,) = struct.unpack(">I", data[pos:pos + 4])
        kind, body = data[pos + 4:pos + 8], data[pos + 8:pos + 8 + n]
        (crc,) = struct.unpack(">I", data[pos + 8 + n:pos + 12 + n])
        assert zlib.crc32(kind + body) == crc, kind
        chunks[kind] = chunks.get(kind, b"") + body
        pos += 12 + n
    width, height, depth, colour_type = struct.unpack(">IIBB", chunks[b"IHDR"][:10])
    assert depth == 8 and colour_type in (2, 3)
    bpp = 3 if colour_type == 2 else 1
    raw = zlib.decompress(chunks[b"IDAT"])
    stride = width * bpp + 1
    assert len(raw) == height * stride
    prev = [0] * (cols * bpp)
    out = []
    for y in range(rows):
        kind = raw[y * stride]
        line = raw[y * stride + 1:y * stride + 1 + cols * bpp]
        cur = [0] * (cols * bpp)
        for i, x in enumerate(line):
            a = cur[i - bpp] if i >= bpp else 0
            b = prev[i]
            c = prev[i - bpp] if i >= bpp else 0
            if kind == 0:
                p = 0
            elif kind == 1:
                p = a
            elif kind == 2:
                p = b
            elif kind == 3:
                p = (a + b) // 2
            else:
                guess = a + b - c
                pa, pb, pc = abs(guess - a), abs(guess - b), abs(guess - c)
                p = a if pa <= pb and pa <= pc else (b if pb <= pc else c)
            cur[i] = (x + p) % 256
        out.append(cur)
        prev = cur
    block = np.array(out, np.uint8).reshape(rows, cols, bpp)
    if colour_type == 3:
        palette = np.frombuffer(chunks[b"PLTE"], np.uint8).reshape(-1, 3)
        block = palette[block[:, :, 0]]
    return (width, height), block


def test_the_screenshot_shows_the_function_wizard_on_our_function(oxt, tmp_path):
    import screenshot

    shot = screenshot.take(oxt, out=str(tmp_path / "shot.png"))
    assert "ORG.ECLIPSHEET.SKY.SKYFUNCTIONS.SKYJD(" in shot.formula
    assert 2460935.5 < shot.value < 2460936.5
    assert shot.wizard_title  # a new top-level window opened: the wizard
    colours, share = _looks_like_a_screen(shot.picture)
    assert colours > 100 and share < 0.9, (colours, share)
    data = open(shot.path, "rb").read()
    assert len(data) < 300_000
    # The PNG holds the screen: its top-left corner (menu and tool bars) decoded with
    # the PNG specification's filters equals the grabbed screen up to the palette.
    size, block = _png_top_left(data, 120, 400)
    assert size == screenshot.SIZE
    want = shot.picture[:120, :400].astype(int)
    error = np.sqrt(((block.astype(int) - want) ** 2).sum(-1))
    assert np.mean(error == 0) > 0.9 and error.max() < 40, (np.mean(error == 0), error.max())
