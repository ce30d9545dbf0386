"""Freeze a sheet for sharing: Eclipsheet formulas replaced by their values.

    .venv/bin/python tools/freeze.py --oxt dist/eclipsheet.oxt log.ods log-frozen.ods [--replace]

A colleague without the extension sees #NAME? in every SKY. cell of a shared sheet.
This writes a copy in which each cell computed by Eclipsheet holds the value it showed
(its number format kept), and adds a sheet "Eclipsheet formulas" listing every
replaced formula by sheet and cell, with the add-in version and the models it states.
Other formulas stay formulas.  The input is never written to; the output is written
beside its target and moved into place, and an existing target is refused unless
--replace is given.
"""

import argparse
import os
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.dirname(HERE))
sys.path.insert(0, HERE)

# Before officekit: the progress line's library must be imported before `uno` is.
from calcfuncs.progress import Progress  # noqa: E402,I001

import officekit  # noqa: E402

from calcfuncs import registry  # noqa: E402

STORED_PREFIX = registry.IMPLEMENTATION_NAME.upper() + "."
LIST_SHEET = "Eclipsheet formulas"


def _ours(formula):
    return isinstance(formula, str) and STORED_PREFIX in formula.upper()


def _display(formula):
    """The formula with our display names instead of the stored programmatic ones."""
    text = formula
    for fn in sorted(registry.FUNCTIONS, key=lambda f: -len(f.method)):
        text = text.replace(STORED_PREFIX + fn.method.upper() + "(", fn.name + "(")
    return text


def freeze_document(doc, progress=None):
    """Replace our formula cells by their values; return [(sheet, cell, formula)].
    ``progress`` (a calcfuncs.progress.Progress) is told of each cell done."""
    replaced = []
    for i in range(doc.Sheets.getCount()):
        sheet = doc.Sheets.getByIndex(i)
        if progress is not None:
            progress.step(f"freezing sheet {sheet.getName()}")
        cells = [c for c in officekit.formula_cells(sheet) if _ours(c[2])]
        # Array formulas are one object over their range: clear each once, first.
        for col, row, _f, _v in cells:
            cursor = sheet.createCursorByRange(sheet.getCellByPosition(col, row))
            try:
                cursor.collapseToCurrentArray()
            except Exception:  # not part of an array formula
                continue
            if cursor.getArrayFormula():
                cursor.setArrayFormula("")
        for col, row, f, v in cells:
            cell = sheet.getCellByPosition(col, row)
            if isinstance(v, str):
                cell.setString(v)
            else:
                cell.setValue(v)
            replaced.append((sheet.getName(), cell.AbsoluteName.split(".")[-1].replace("$", ""),
                             _display(f)))
            if progress is not None:
                progress.advance()
    return replaced


def _list_sheet(doc, replaced, version):
    sheets = doc.Sheets
    name = LIST_SHEET
    while sheets.hasByName(name):
        name += " (2)"
    sheets.insertNewByName(name, sheets.getCount())
    sheet = sheets.getByName(name)
    rows = [("This copy was frozen: the cells below were computed by Eclipsheet and now hold "
             "their values. Reopen the original with the extension to recompute.", "", ""),
            ("Computed by", version, ""),
            ("Models", "as stated in each function's description (docs/functions.md); the "
             "defaults are IAU 2006/2000A, ERFA's leap seconds and Earth ephemeris", ""),
            ("", "", ""),
            ("Sheet", "Cell", "Formula")]
    rows += [(s, c, f) for s, c, f in replaced]
    sheet.getCellRangeByPosition(0, 0, 2, len(rows) - 1).setDataArray(tuple(rows))
    return name


def freeze(source, target, oxt, replace=False, quiet=False):
    source, target = os.path.abspath(source), os.path.abspath(target)
    if source == target:
        raise SystemExit("the target is the input itself; give another file name")
    if os.path.exists(target) and not replace:
        raise SystemExit(f"{target} exists; give --replace to write over it")
    name = os.path.basename(source)
    with Progress("freeze", unit=" cells", quiet=quiet) as progress:
        progress.step("starting the office")
        with officekit.Office(oxt=oxt) as office:
            progress.step(f"opening and recomputing {name}")
            with office.calculated_copy(source) as doc:
                version = _version(doc)
                replaced = freeze_document(doc, progress)
                _list_sheet(doc, replaced, version)
                progress.step(f"writing {os.path.basename(target)}")
                office.save(doc, target, "calc8")
            progress.step("closing the office")
    return replaced


def _version(doc):
    """SKY.VERSION as the office computes it, in a scratch cell of a scratch sheet."""
    sheets = doc.Sheets
    sheets.insertNewByName("eclipsheet-scratch", sheets.getCount())
    scratch = sheets.getByName("eclipsheet-scratch")
    cell = scratch.getCellByPosition(0, 0)
    cell.setFormula("=SKY.VERSION()")
    doc.calculateAll()
    text = cell.getString()
    sheets.removeByName("eclipsheet-scratch")
    return text


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("source")
    ap.add_argument("target")
    ap.add_argument("--oxt", required=True)
    ap.add_argument("--replace", action="store_true", help="write over an existing target")
    ap.add_argument("-q", "--quiet", action="store_true",
                    help="no progress line on the terminal (never shown when stderr is not "
                    "a terminal)")
    args = ap.parse_args(argv)
    replaced = freeze(args.source, args.target, args.oxt, args.replace, args.quiet)
    print(f"froze {len(replaced)} cells into {args.target}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
