"""Apply a cell function to the columns of a CSV file: ``python -m calcfuncs``.

    python -m calcfuncs --list
    python -m calcfuncs SKY.JD --help
    python -m calcfuncs SKY.JD --in log.csv --arg time=timestamp --set result_scale=TT \\
        --out log-jd.csv --column jd_tt

Each argument of the function comes from a column (``--arg NAME=COLUMN``) or is one
value for every row (``--set NAME=VALUE``); arguments left out take the cell's default.
The output is the input with one column added, written to a new file (atomically: a
partial file never takes the target's name), never over the input, and over an existing
file only with ``--replace``.  Rows are computed as a whole-column formula computes them,
through ``calcfuncs.cells.evaluate``: a bad row holds its ``#SKY:`` message in the new
column, the other rows their values, and a summary goes to stderr.  Exit status: 0 when
every row computed, 1 when some row holds a message, 2 for a usage problem.
"""

import argparse
import csv
import os
import re
import sys
import tempfile
import textwrap

from . import api, registry
from .errors import PREFIX
from .progress import Progress

CHUNK_ROWS = 50_000  # rows per vectorised call: long logs stream through in bounded memory
NUMERIC_KINDS = ("number", "angle")
# A plain decimal number, as a cell holding it would be a number (not "nan", "1_000").
_PLAIN_NUMBER = re.compile(r"^\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s*$")


class UsageError(Exception):
    """A problem with the command line or the input file, reported before any row."""


def _parser():
    ap = argparse.ArgumentParser(
        prog="python -m calcfuncs", add_help=False,
        description="Apply an Eclipsheet cell function to the columns of a CSV file.",
        epilog="Time values in the file are read as in a cell: ISO 8601 text, calendar "
        'text, "JD ..." or "MJD ..." text. A bare number in a time column is refused '
        '(write "JD 2460389.5"). See --help after a function name for its arguments.')
    ap.add_argument("function", nargs="?", help="display name (SKY.JD) or API name (jd)")
    ap.add_argument("-h", "--help", action="store_true",
                    help="this help, or a function's own texts after its name")
    ap.add_argument("--list", action="store_true", help="list the functions and exit")
    ap.add_argument("--in", dest="input", metavar="CSV", help="input file (- for stdin)")
    ap.add_argument("--out", metavar="CSV", help="output file (- for stdout)")
    ap.add_argument("--arg", action="append", default=[], metavar="NAME=COLUMN",
                    help="take an argument from a column of the input (repeatable)")
    ap.add_argument("--set", action="append", default=[], metavar="NAME=VALUE",
                    help="give an argument one value for every row (repeatable)")
    ap.add_argument("--column", metavar="NAME",
                    help="name of the new column (default: the API name, e.g. jd)")
    ap.add_argument("--replace", action="store_true", help="allow writing over an existing output")
    ap.add_argument("--delimiter", default=",", help="field delimiter of the input and output "
                    "(default ,; write tab as \\t)")
    ap.add_argument("-q", "--quiet", action="store_true",
                    help="no progress line on the terminal (it is never shown when stderr "
                    "is not a terminal, nor for a run of under two seconds)")
    ap.add_argument("--dates", choices=("iso", "number"), default="iso",
                    help="date-time results as ISO 8601 text to the microsecond (default) "
                    "or as the cell's number, days since 1899-12-30")
    ap.add_argument("--engine", choices=("single", "dask"), default="single",
                    help="single: this process (default); dask: partitions on Dask workers "
                    "(Parquet in and out; see calcfuncs.engines)")
    ap.add_argument("--scheduler", metavar="ADDRESS",
                    help="with --engine dask: a running cluster's scheduler, tcp://host:8786")
    ap.add_argument("--workers", type=int, metavar="N",
                    help="with --engine dask and no --scheduler: local worker processes "
                    "(default: one a core)")
    ap.add_argument("--threads", action="store_true",
                    help="with --engine dask and no --scheduler: workers as threads here")
    return ap


def list_text():
    lines = []
    for family in registry.FAMILY_ORDER:
        if not family.functions:
            continue
        lines.append(family.title)
        for f in family.functions:
            lines.append(f"  {f.name:<26} {api.python_name(f.name):<22} {f.summary}")
        lines.append("")
    return "\n".join(lines)


def function_help(fn):
    def para(text, indent="", hang="    "):
        return textwrap.fill(text, 88, initial_indent=indent, subsequent_indent=indent + hang)

    out = [f"{fn.name}  (Python: calcfuncs.api.{api.python_name(fn.name)})", "",
           para(fn.summary, hang=""), "", para("Result: " + fn.result + ".", hang="")]
    if fn.model:
        out += ["", para(fn.model, hang="")]
    out += ["", "Arguments (in the cell's order):"]
    for a in fn.args:
        default = "required" if not a.optional else (
            "default: left out" if a.default is None else f"default {a.default}")
        out.append(para(f"{a.name} ({a.kind}, {default}): {a.description}", "  "))
    example = []
    for a in fn.args:
        if not a.optional:
            example.append(f"--arg {a.name}=<column>")
    out += ["", "Example:", f"  python -m calcfuncs {fn.name} --in log.csv "
            + " ".join(example) + " --out result.csv"]
    return "\n".join(out)


def _pairs(items, option):
    found = {}
    for item in items:
        name, sep, value = item.partition("=")
        name = name.strip()
        if not sep or not name:
            raise UsageError(f"{option} {item!r}: write {option} NAME=" + (
                "COLUMN" if option == "--arg" else "VALUE"))
        if name in found:
            raise UsageError(f"{option} {name} is given twice")
        found[name] = value
    return found


def _resolve(fn, header, columns, constants, input_name):
    """Per argument of ``fn``: ("column", index), ("const", value) or ("omit", None)."""
    names = [a.name for a in fn.args]
    for name in list(columns) + list(constants):
        if name not in names:
            raise UsageError(f'{fn.name} has no argument "{name}"; its arguments are '
                             + (", ".join(names) or "none"))
    both = set(columns) & set(constants)
    if both:
        raise UsageError(f"{', '.join(sorted(both))}: give an argument by --arg or --set, not both")
    plan = []
    for a in fn.args:
        if a.name in columns:
            col = columns[a.name]
            if col not in header:
                raise UsageError(
                    f'no column "{col}" in {input_name} (columns: {", ".join(header)}); for '
                    f"one value on every row write --set {a.name}={col}")
            plan.append(("column", header.index(col)))
        elif a.name in constants:
            plan.append(("const", _value(a, constants[a.name])))
        elif a.optional:
            plan.append(("omit", None))
        else:
            raise UsageError(f"{fn.name} needs {a.name}: give --arg {a.name}=COLUMN or "
                             f"--set {a.name}=VALUE")
    return plan


column_plan = _resolve  # the same plan for a Parquet file's columns (calcfuncs.tables)


def _value(arg, text):
    """A CSV field as a cell would hold it: empty is an empty cell, a number in a
    numeric argument is a number, everything else is text (time columns included)."""
    if text.strip() == "":
        return None
    if arg.kind in NUMERIC_KINDS and _PLAIN_NUMBER.match(text):
        return float(text)
    return text  # time text, angle text such as 12:34:56.7, or a mistake the cell explains


def _format(value, dates_iso, is_datetime):
    if isinstance(value, float):
        if is_datetime and dates_iso:
            return None  # filled in by _iso_dates, vectorised
        return repr(value)
    return "" if value is None else str(value)


def _iso_dates(serials):
    """Date-time values as ISO 8601 text to the microsecond, written by the core's own
    writer so that they read back as the same instant (any year, calendar marked)."""
    import numpy as np

    from .timeinput import iso_text, null_date_jd
    from .timescales import Instants

    zero = null_date_jd(api.DEFAULT_NULL_DATE)
    days = np.asarray(serials, dtype=float)
    # A date-time value counts plain 86,400-second days; a scale without leap seconds
    # writes them as such.
    return list(iso_text(Instants(np.full(days.shape, zero), days, "TT"), decimals=6))


class _Output:
    """The output file, written beside the target and moved into place at the end."""

    def __init__(self, path, replace, input_path):
        self.path = path
        self.partial = None
        if path == "-":
            self.stream = sys.stdout
            return
        target = os.path.abspath(path)
        if input_path != "-" and os.path.exists(target) and os.path.samefile(target, input_path):
            raise UsageError(f"{path} is the input file; the input is never written over")
        if os.path.exists(target) and not replace:
            raise UsageError(f"{path} exists; add --replace to write over it")
        folder = os.path.dirname(target)
        if not os.path.isdir(folder):
            raise UsageError(f"no folder {folder} for {path}")
        fd, self.partial = tempfile.mkstemp(prefix=".partial-", suffix=".csv", dir=folder)
        self.stream = os.fdopen(fd, "w", encoding="utf-8", newline="")

    def commit(self):
        if self.partial is None:
            self.stream.flush()
            return
        self.stream.flush()
        os.fsync(self.stream.fileno())
        self.stream.close()
        os.replace(self.partial, os.path.abspath(self.path))
        self.partial = None

    def abandon(self):
        if self.partial is not None:
            self.stream.close()
            os.unlink(self.partial)
            self.partial = None


def apply_to_csv(fn, input_path, output_path, columns, constants, column_name=None,
                 replace=False, delimiter=",", dates="iso", progress=None):
    """Compute ``fn`` over the rows of a CSV; returns (rows, rows with a message,
    [(line, message)] of the first few).  ``progress`` (a calcfuncs.progress.Progress)
    is told of every chunk done."""
    is_datetime = api.returns_datetime(fn)
    column_name = column_name or api.python_name(fn.name)
    source = sys.stdin if input_path == "-" else open(input_path, encoding="utf-8-sig", newline="")
    output = None
    try:
        reader = csv.reader(source, delimiter=delimiter)
        try:
            header = next(reader)
        except StopIteration:
            raise UsageError(f"{input_path} is empty: a header row is needed") from None
        if column_name in header:
            raise UsageError(f'{input_path} already has a column "{column_name}"; name the '
                             "new one with --column")
        plan = _resolve(fn, header, columns, constants, input_path)
        output = _Output(output_path, replace, input_path)
        writer = csv.writer(output.stream, delimiter=delimiter, lineterminator="\n")
        writer.writerow(header + [column_name])
        stats = {"rows": 0, "failed": 0, "blank": 0, "first": []}
        chunk, lines = [], []
        for row in reader:
            chunk.append(row)
            lines.append(reader.line_num)
            if len(chunk) >= CHUNK_ROWS:
                _compute(fn, plan, chunk, lines, writer, dates == "iso", is_datetime, stats)
                if progress is not None:
                    progress.advance(len(chunk))
                chunk, lines = [], []
        if chunk:
            _compute(fn, plan, chunk, lines, writer, dates == "iso", is_datetime, stats)
            if progress is not None:
                progress.advance(len(chunk))
        output.commit()
    except BaseException:
        if output is not None:
            output.abandon()
        raise
    finally:
        if source is not sys.stdin:
            source.close()
    return stats


def _compute(fn, plan, chunk, lines, writer, dates_iso, is_datetime, stats):
    args = []
    for (how, what), a in zip(plan, fn.args):
        if how == "column":  # a list is a column for the API: one vectorised call
            args.append([_value(a, r[what]) if what < len(r) else None for r in chunk])
        else:
            args.append(what)
    results = api.call(fn.name, *args, on_error="text")
    if not isinstance(results, list):  # only constants: one value, as cells filled down
        results = [results] * len(chunk)
    texts = [_format(v, dates_iso, is_datetime) for v in results]
    pending = [i for i, t in enumerate(texts) if t is None]
    if pending:
        for i, t in zip(pending, _iso_dates([results[i] for i in pending])):
            texts[i] = t
    for row, line, text, value in zip(chunk, lines, texts, results):
        writer.writerow(row + [text])
        stats["rows"] += 1
        if isinstance(value, str) and value.startswith(PREFIX):
            stats["failed"] += 1
            if len(stats["first"]) < 10:
                stats["first"].append((line, value))
        elif value == "":
            stats["blank"] += 1


def main(argv=None, out=None, err=None):
    out = out or sys.stdout
    err = err or sys.stderr
    ap = _parser()
    try:
        args = ap.parse_args(argv)
    except SystemExit as stop:  # argparse has printed its message
        return int(stop.code or 0)
    try:
        fn = None
        if args.function:
            fn = api.lookup(args.function).cell_function
        if args.help or args.list:
            text = (function_help(fn) if fn else ap.format_help()) if args.help else list_text()
            try:
                print(text, file=out)
                out.flush()
            except BrokenPipeError:
                sys.stdout = open(os.devnull, "w")
            return 0
        if fn is None:
            raise UsageError("name a function (--list shows them), or give --help")
        if not args.input or not args.out:
            raise UsageError("give --in CSV and --out CSV")
        if fn.reduces_series:
            raise UsageError(f"{fn.name} reduces whole ranges to one value, not one per "
                             "row; call it from a sheet or from calcfuncs.api")
        delimiter = "\t" if args.delimiter in ("\\t", "tab", "TAB") else args.delimiter
        if len(delimiter) != 1:
            raise UsageError("--delimiter takes one character")
        from . import tables  # Parquet and the Dask engine: calcfuncs.tables, .engines

        if tables.is_parquet(args.input) or tables.is_parquet(args.out) or args.engine != "single":
            stats = tables.run_command(fn, args, _pairs(args.arg, "--arg"),
                                       _pairs(args.set, "--set"))
        else:
            with Progress(fn.name, unit=" rows", stream=err, quiet=args.quiet) as progress:
                stats = apply_to_csv(fn, args.input, args.out, _pairs(args.arg, "--arg"),
                                     _pairs(args.set, "--set"), args.column, args.replace,
                                     delimiter, args.dates, progress)
    except BrokenPipeError:  # the reader of stdout went away (| head): stop quietly
        sys.stdout = open(os.devnull, "w")
        return 1
    except (UsageError, ValueError, OSError) as problem:
        print(f"python -m calcfuncs: {problem}", file=err)
        return 2
    computed = stats["rows"] - stats["failed"] - stats["blank"]
    summary = f"{fn.name}: {stats['rows']} rows, {computed} computed"
    if stats["blank"]:
        summary += f", {stats['blank']} left blank (no input)"
    if stats["failed"]:
        summary += f", {stats['failed']} with a #SKY: message"
    print(summary, file=err)
    for line, message in stats["first"]:
        print(f"  {stats.get('where', 'line')} {line}: {message}", file=err)
    if stats["failed"] > len(stats["first"]):
        print(f"  ... and {stats['failed'] - len(stats['first'])} more", file=err)
    return 1 if stats["failed"] else 0
