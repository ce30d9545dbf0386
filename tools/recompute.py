"""Recompute sheets headless with the extension and write .ods, .pdf and .csv copies.

    .venv/bin/python tools/recompute.py --oxt dist/eclipsheet.oxt --out out sample_sheets
    .venv/bin/python tools/recompute.py --oxt dist/eclipsheet.oxt --out out my_log.ods

For every .ods given (or found in a folder) it opens the sheet in a fresh headless
office with the extension installed, recomputes every formula, and writes to the
output folder: the recomputed .ods, a .pdf of all sheets, and one .csv per sheet
(full precision, UTF-8).  The inputs are never written to.  It prints a table of
formula cells, cells holding #SKY: messages and error cells; the exit code is 1 if any
cell shows an error or a message, except messages on sheets named with
--messages-expected (a sheet that demonstrates them).
"""

import argparse
import os
import sys
import tempfile

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)

sys.path.insert(0, os.path.dirname(HERE))

# Before officekit: the progress line's library must be imported before `uno` is.
from calcfuncs.progress import Progress  # noqa: E402,I001

import officekit  # noqa: E402


CSV_OPTIONS = "44,34,76,1,,0,false,true,false,false,false,-1"  # all sheets, one file each


def _inputs(paths):
    found = []
    for p in paths:
        if os.path.isdir(p):
            found += sorted(os.path.join(p, f) for f in os.listdir(p) if f.endswith(".ods"))
        else:
            found.append(p)
    return found


def _unintended(cells):
    """The error cells of a range, less those whose formula asks for #N/A with NA():
    a chart's table leaves a gap so (sample_sheets/sky_charts.ods), on purpose."""
    formulas = cells.getFormulaArray()
    origin = cells.getCellByPosition(0, 0)
    if all("NA()" in f.upper() for row in formulas for f in row):
        return []
    if len(formulas) == 1 and len(formulas[0]) == 1:
        return [origin.AbsoluteName]
    out = []
    for r, row in enumerate(formulas):
        for c, f in enumerate(row):
            if "NA()" not in f.upper():
                out.append(cells.getCellByPosition(c, r).AbsoluteName)
    return out


def survey(doc):
    """Per sheet: (name, formula cells, [(cell, message)], [error cells])."""
    from com.sun.star.sheet.FormulaResult import ERROR

    report = []
    for i in range(doc.Sheets.getCount()):
        sheet = doc.Sheets.getByIndex(i)
        n_formulas = 0
        messages = []
        for col, row, _formula, v in officekit.formula_cells(sheet):
            n_formulas += 1
            if isinstance(v, str) and v.startswith("#SKY"):
                cell = sheet.getCellByPosition(col, row)
                messages.append((cell.AbsoluteName.split(".")[-1], v))
        errors = sheet.queryFormulaCells(ERROR)
        error_cells = [name for k in range(errors.getCount())
                       for name in _unintended(errors.getByIndex(k))]
        report.append((sheet.getName(), n_formulas, messages, error_cells))
    return report


def export(office, doc, source, out_dir):
    base = os.path.splitext(os.path.basename(source))[0]
    written = [office.save(doc, os.path.join(out_dir, base + ".ods"), "calc8"),
               office.save(doc, os.path.join(out_dir, base + ".pdf"), "calc_pdf_Export")]
    with tempfile.TemporaryDirectory(dir=out_dir) as tmp:
        doc.storeToURL(
            officekit.file_url(os.path.join(tmp, base + ".csv")),
            officekit._props(FilterName="Text - txt - csv (StarCalc)", FilterOptions=CSV_OPTIONS),
        )
        for name in sorted(os.listdir(tmp)):
            target = os.path.join(out_dir, name)
            os.replace(os.path.join(tmp, name), target)
            written.append(target)
    return written


def recompute(paths, oxt, out_dir, messages_expected=(), quiet=False):
    out_dir = os.path.abspath(out_dir)
    os.makedirs(out_dir, exist_ok=True)
    sources = _inputs(paths)
    for s in sources:
        if os.path.dirname(os.path.abspath(s)) == out_dir:
            raise SystemExit(f"{s} is inside the output folder; choose another --out")
    rows, failed = [], False
    # One step per workbook; opening and recomputing one is a single long office call,
    # so the progress line names it and keeps its clock running meanwhile.
    with Progress("recompute", total=len(sources), unit=" workbooks", quiet=quiet) as progress:
        progress.step("starting the office")
        with officekit.Office(oxt=oxt) as office:
            for source in sources:
                base = os.path.basename(source)
                progress.step(f"opening and recomputing {base}")
                with office.calculated_copy(source) as doc:
                    progress.step(f"checking {base}")
                    for name, n, messages, errors in survey(doc):
                        expected = name in messages_expected
                        if errors or (messages and not expected):
                            failed = True
                        rows.append((base, name, n, messages, errors, expected))
                    progress.step(f"writing {base} as .ods, .pdf and .csv")
                    written = export(office, doc, source, out_dir)
                for w in written:
                    progress.say(f"wrote {os.path.relpath(w)}")
                progress.advance()
            progress.step("closing the office")
    _print_table(rows)
    return 1 if failed else 0


def _print_table(rows):
    print()
    print(f"{'file':<22} {'sheet':<18} {'formulas':>8} {'messages':>9} {'errors':>7}")
    for file, sheet, n, messages, errors, expected in rows:
        note = "  (expected: demonstration)" if messages and expected else ""
        print(f"{file:<22} {sheet:<18} {n:>8} {len(messages):>9} {len(errors):>7}{note}")
    for file, sheet, _, messages, errors, expected in rows:
        if not expected:
            for cell, text in messages[:20]:
                print(f"  {file} {sheet}!{cell}: {text}")
        for cell in errors[:20]:
            print(f"  {file} {cell}: error value")


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("paths", nargs="+", help=".ods files or folders of them")
    ap.add_argument("--oxt", required=True, help="the extension to install in the office")
    ap.add_argument("--out", default="out", help="output folder (default: out)")
    ap.add_argument("--messages-expected", action="append", default=[], metavar="SHEET",
                    help="a sheet whose #SKY: messages are intended (repeatable)")
    ap.add_argument("-q", "--quiet", action="store_true",
                    help="no progress line on the terminal (never shown when stderr is not "
                    "a terminal)")
    args = ap.parse_args(argv)
    return recompute(args.paths, args.oxt, args.out, set(args.messages_expected), args.quiet)


if __name__ == "__main__":
    sys.exit(main())
