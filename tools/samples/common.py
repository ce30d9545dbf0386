"""What the sample workbooks share: the circle's observers and fields, the Sun caution,
date-time values, column filling, and writing a workbook from its module.

A workbook module has ``FILE_NAME`` and ``fill(doc)``, which writes its sheets into a
new document; ``write_book`` does the rest.
"""

import datetime
import os

import uno
from sheetkit import fill_formulas, format_range, landscape_fit_to_width, note, number_format

RIGHT = uno.Enum("com.sun.star.table.CellHoriJustify", "RIGHT")
CENTER = uno.Enum("com.sun.star.table.CellHoriJustify", "CENTER")

NULL_DATE = datetime.datetime(1899, 12, 30)  # the default null date of a new document

# The Saltmarsh Variable Star Circle (invented): its observers' initials, and the
# comparison fields of its programme (names and places made up).
OBSERVERS = ("AB", "CK", "DM", "RT")
TARGETS = [
    ("Field K-1", "03 14 07.52", "+41 12 33.8"),
    ("Field K-2", "05h47m55.10s", "-07°18'02.4\""),
    ("Field K-3", "09:02:41.7", "+63:07:15"),
    ("Field K-4", "12 30 00.00", "-00 30 00.0"),
    ("Field K-5", "17h11m36.9s", "-26d44m10s"),
    ("Field K-6", "21:58:12.25", "+12:03:48.9"),
    ("Field K-7", "23 59 59.99", "+89 15 51"),
]

SUN_CAUTION = (
    "CAUTION: never look at the Sun, and never point binoculars, a telescope or a camera "
    "at it or near it, without a proper solar filter made for that purpose over the front "
    "of the instrument. An eclipsed Sun is no safer: watch it projected onto card, or "
    "through a proper solar filter.")


def caution(sheet, row, cols):
    """The Sun caution as a bold note row, on every sheet about the Sun."""
    note(sheet, row, SUN_CAUTION, cols)
    sheet.getRows().getByIndex(row).Height = 900
    sheet.getCellByPosition(0, row).CharWeight = 150.0


def sun_heading(sheet, cols, text, height=None):
    """The first rows of a sheet about the Sun: the note saying what it does (row 1,
    ``height`` tall where the note needs more lines) and the Sun caution (row 2)."""
    note(sheet, 0, text, cols)
    if height is not None:
        sheet.getRows().getByIndex(0).Height = height
    caution(sheet, 1, cols)


def serial(moment):
    """A Calc date-time value (days since the default null date) of a UTC datetime."""
    return (moment - NULL_DATE).total_seconds() / 86400.0


def sheet_at(doc, index, name):
    """The sheet at ``index`` named ``name``: the new document's first sheet renamed,
    or a new one inserted."""
    sheets = doc.Sheets
    if index < sheets.getCount():
        sheet = sheets.getByIndex(index)
        sheet.setName(name)
    else:
        sheets.insertNewByName(name, index)
        sheet = sheets.getByIndex(index)
    return sheet


def fill_shifted(sheet, col, first_row, last_row, template, source_first):
    """Like fill_formulas, with {t} for the 1-based row of the same item in a table
    that starts at 0-based row ``source_first`` (another block or sheet)."""
    rng = sheet.getCellRangeByPosition(col, first_row, col, last_row)
    rng.setFormulaArray(tuple(
        (template.format(r=r + 1, t=source_first + (r - first_row) + 1),)
        for r in range(first_row, last_row + 1)
    ))


def fill_columns(doc, sheet, first, last, start_col, templates, source_first=None, right=True):
    """Fill (template, number format) columns from ``start_col``.  ``right``: True
    right-aligns every column, so that sexagesimal text and words such as "below
    horizon" line up with the numbers; "text" only the text columns (format "@");
    False none."""
    for k, (template, code) in enumerate(templates):
        col = start_col + k
        if source_first is None:
            fill_formulas(sheet, col, first, last, template)
        else:
            fill_shifted(sheet, col, first, last, template, source_first)
        format_range(sheet, col, first, last, number_format(doc, code))
        if right is True or (right == "text" and code == "@"):
            sheet.getCellRangeByPosition(col, first, col, last).HoriJustify = RIGHT


def write_book(office, out_dir, book):
    """Write the workbook of the module ``book`` into ``out_dir``: its sheets, printed
    landscape one page wide, every formula computed; returns the path."""
    doc = office.new_sheet()
    try:
        book.fill(doc)
        landscape_fit_to_width(doc)
        doc.calculateAll()
        return office.save(doc, os.path.join(out_dir, book.FILE_NAME))
    finally:
        doc.close(True)
