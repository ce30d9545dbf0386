"""Small helpers for writing readable sheets through UNO: headers, formats, widths."""

import uno

_BOLD = 150.0  # com.sun.star.awt.FontWeight.BOLD


def number_format(doc, code):
    """The key of a number format code, added to the document if new."""
    formats = doc.NumberFormats
    locale = uno.createUnoStruct("com.sun.star.lang.Locale")
    key = formats.queryKey(code, locale, False)
    if key == -1:
        key = formats.addNew(code, locale)
    return key


def header(sheet, row, titles, start_col=0):
    for k, title in enumerate(titles):
        cell = sheet.getCellByPosition(start_col + k, row)
        cell.setString(title)
        cell.CharWeight = _BOLD
        cell.IsTextWrapped = True


def note(sheet, row, text, width_cols=8):
    """A note row: one merged line of plain text saying what the sheet does."""
    cell = sheet.getCellByPosition(0, row)
    cell.setString(text)
    cell.IsTextWrapped = True
    # From the top: at the default (bottom) alignment LibreOffice 7.4 cut the last line
    # of a wrapped note in a merged cell even where the row had room for it.
    cell.VertJustify = 1  # com.sun.star.table.CellVertJustify.TOP
    merged = sheet.getCellRangeByPosition(0, row, width_cols - 1, row)
    merged.merge(True)
    sheet.getRows().getByIndex(row).Height = 1500


def widths(sheet, cm_per_col):
    for k, cm in enumerate(cm_per_col):
        sheet.getColumns().getByIndex(k).Width = int(cm * 1000)


def fill_formulas(sheet, col, first_row, last_row, template):
    """One formula per row from a template with {r} for the 1-based row number."""
    rng = sheet.getCellRangeByPosition(col, first_row, col, last_row)
    rng.setFormulaArray(tuple((template.format(r=r + 1),) for r in range(first_row, last_row + 1)))
    return rng


def format_range(sheet, col, first_row, last_row, key):
    sheet.getCellRangeByPosition(col, first_row, col, last_row).NumberFormat = key


def column_letter(col):
    letters = ""
    col += 1
    while col:
        col, rem = divmod(col - 1, 26)
        letters = chr(65 + rem) + letters
    return letters


def landscape_fit_to_width(doc):
    """Print every sheet landscape, one page wide, so the PDF reads like the sheet."""
    style = doc.StyleFamilies.getByName("PageStyles").getByName("Default")
    width, height = style.Width, style.Height
    style.IsLandscape = True
    style.Width, style.Height = max(width, height), min(width, height)
    style.ScaleToPagesX = 1
    style.ScaleToPagesY = 0
