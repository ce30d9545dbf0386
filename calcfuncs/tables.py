"""Parquet logs in and out, in chunks: the column form of a cell function over a file
larger than memory (``python -m calcfuncs ... --in log.parquet --out out.parquet``).

Why Parquet, through pyarrow: a log of hundreds of millions of rows keeps its types
(timestamps, floats, texts) in a typed, compressed, column-wise file that every data
tool reads, and pyarrow reads it a row range at a time.  Our own code only turns
columns into what a cell would hold and the results back into typed columns.

What a column hands to a function, per row, is what a cell would hold:
  - a timestamp is a date-time value (days since 1899-12-30, to about a microsecond, as
    in a sheet), read on the function's ``scale`` argument (UTC unless given); a
    timestamp with a time zone is taken at its UTC instant, a naive one as written;
  - a date is that day's date-time value at 00:00;
  - a number (float, integer, boolean) is a number, a text is a text, a null is an
    empty cell.
The result goes to two new columns: ``<column>`` typed by the function's result (float64
for numbers, a microsecond timestamp without time zone for date-time results on the
function's scale, a text for texts) and ``<column>_message``, the row's ``#SKY:`` text
where the row could not be computed (its value then null).  A row left blank has both
null.

Rows are computed CHUNK_ROWS at a time from the first row on, so each call of the core
sees the same rows whichever engine runs it (calcfuncs.engines relies on it): a dense
column of instants interpolates its slowly varying quantities (calcfuncs.nodes), and
which rows share a call decides whether it does.
"""

import datetime
import os
import tempfile

import numpy as np

from . import api
from .errors import PREFIX

_DAY_US = 86_400_000_000
# The null date of the API's date-time values (1899-12-30), in days and microseconds
# from 1970-01-01, the origin of Parquet's timestamps and dates.
_NULL_DAYS = (datetime.date(*api.DEFAULT_NULL_DATE) - datetime.date(1970, 1, 1)).days
_NULL_US = _NULL_DAYS * _DAY_US
_UNITS_PER_SECOND = {"s": 1, "ms": 1_000, "us": 1_000_000, "ns": 1_000_000_000}
PARQUET_SUFFIXES = (".parquet", ".pq", ".parq")


class TableError(ValueError):
    """A problem with a table file or a column, said before any row is computed."""


def is_parquet(path):
    return str(path).lower().endswith(PARQUET_SUFFIXES)


def chunk_rows():
    from . import cli

    return cli.CHUNK_ROWS  # one chunk size for CSV and Parquet, one engine or many


# ---- columns to cell values ------------------------------------------------------


def cell_values(column):
    """A pyarrow array or chunked array as the list of values cells would hold."""
    import pyarrow as pa
    import pyarrow.compute as pc

    kind = column.type
    valid = None
    if column.null_count:
        valid = np.asarray(pc.is_valid(column).to_numpy(zero_copy_only=False), dtype=bool)
    if pa.types.is_timestamp(kind):
        # In the column's own unit (a nanosecond column keeps what a cast to
        # microseconds would refuse); the integer difference first, then one division.
        per_day = 86_400 * _UNITS_PER_SECOND[kind.unit]
        ticks = np.asarray(column.cast(pa.int64()).fill_null(0).to_numpy(zero_copy_only=False),
                           dtype=np.int64)
        values = ((ticks - _NULL_DAYS * per_day) / per_day).tolist()
    elif pa.types.is_date(kind):
        days = column.cast(pa.date32()).cast(pa.int32()).fill_null(0)
        days = np.asarray(days.to_numpy(zero_copy_only=False), dtype=float)
        values = (days - _NULL_DAYS).tolist()
    elif pa.types.is_floating(kind) or pa.types.is_integer(kind) or pa.types.is_boolean(kind):
        values = column.cast(pa.float64()).fill_null(0.0).to_numpy(zero_copy_only=False)
        values = np.asarray(values, dtype=float).tolist()
    elif pa.types.is_string(kind) or pa.types.is_large_string(kind) or (
            hasattr(pa.types, "is_string_view") and pa.types.is_string_view(kind)):
        values = column.to_pylist()
        valid = None  # nulls are already None
    else:
        raise TableError(f"a column of type {kind} is not read (timestamps, dates, numbers "
                         "and texts are)")
    if valid is not None and not valid.all():
        for i in np.flatnonzero(~valid):
            values[i] = None
    return values


def resolve(fn, names, columns, constants, input_name):
    """The CSV reader's plan (per argument: column index, constant or left out) over
    the column names of a table."""
    from . import cli

    try:
        return cli.column_plan(fn, list(names), columns, constants, input_name)
    except cli.UsageError as problem:
        raise TableError(str(problem)) from None


def compute(fn, plan, table):
    """The cell function over the rows of a pyarrow table, one call of the core per
    CHUNK_ROWS rows counted from the table's first row: the list of cell results."""
    results = []
    step = chunk_rows()
    for start in range(0, table.num_rows, step):
        part = table.slice(start, step)
        args = [cell_values(part.column(what)) if how == "column" else what
                for how, what in plan]
        got = api.call(fn.name, *args, on_error="text")
        if not isinstance(got, list):  # only constants: one value, as cells filled down
            got = [got] * part.num_rows
        results.extend(got)
    return results


# ---- results to typed columns ----------------------------------------------------


def result_fields(fn, column_name):
    import pyarrow as pa

    kind = {"number": pa.float64(), "datetime": pa.timestamp("us"),
            "text": pa.string()}[fn.result_kind]
    return [pa.field(column_name, kind), pa.field(column_name + "_message", pa.string())]


def result_arrays(fn, results):
    """(values, messages) as pyarrow arrays, and the count of messages and blanks."""
    import pyarrow as pa

    values, messages = [], []
    failed = blank = 0
    for v in results:
        if isinstance(v, str) and (v.startswith(PREFIX) or fn.result_kind != "text"):
            if v == "":
                blank += 1
            else:
                failed += 1
            values.append(None)
            messages.append(v or None)
        elif v is None or v == "":
            blank += 1
            values.append(None)
            messages.append(None)
        else:
            values.append(v)
            messages.append(None)
    value_field, message_field = result_fields(fn, "v")
    if fn.result_kind == "datetime":
        # What api.datetime_from_serial gives: the serial rounded to the microsecond.
        serial = np.array([np.nan if v is None else v for v in values], dtype=float)
        ok = np.isfinite(serial)
        micros = np.zeros(serial.shape, dtype=np.int64)
        micros[ok] = np.round(serial[ok] * _DAY_US).astype(np.int64) + _NULL_US
        array = pa.array(micros, pa.int64(), mask=~ok).cast(value_field.type)
    else:
        array = pa.array(values, value_field.type)
    return array, pa.array(messages, pa.string()), failed, blank


def with_results(fn, table, results, column_name):
    values, messages, failed, blank = result_arrays(fn, results)
    value_field, message_field = result_fields(fn, column_name)
    table = table.append_column(value_field, values).append_column(message_field, messages)
    return table, failed, blank


# ---- files -----------------------------------------------------------------------


def check_target(output_path, input_path, replace):
    """The absolute target path, after the checks every writer makes: never the input,
    never an existing file unless replacing, a folder that exists."""
    target = os.path.abspath(output_path)
    if os.path.exists(target) and os.path.exists(input_path) and os.path.samefile(
            target, input_path):
        raise TableError(f"{output_path} is the input file; the input is never written over")
    if os.path.exists(target) and not replace:
        raise TableError(f"{output_path} exists; add --replace to write over it")
    if not os.path.isdir(os.path.dirname(target)):
        raise TableError(f"no folder {os.path.dirname(target)} for {output_path}")
    return target


def open_input(input_path, column_name):
    import pyarrow.parquet as pq

    if input_path == "-" or not is_parquet(input_path):
        raise TableError(f"{input_path}: a Parquet input is named *.parquet (or .pq)")
    try:
        source = pq.ParquetFile(input_path)
    except FileNotFoundError:
        raise TableError(f"no file {input_path}") from None
    except Exception as err:  # noqa: BLE001 - a damaged or foreign file: say which
        raise TableError(f"{input_path} is not a Parquet file pyarrow can read ({err})") from None
    names = source.schema_arrow.names
    for taken in (column_name, column_name + "_message"):
        if taken in names:
            raise TableError(f'{input_path} already has a column "{taken}"; name the new one '
                             "with --column")
    return source


def output_schema(fn, source, column_name):
    import pyarrow as pa

    # The input's pandas metadata would list its columns only: leave it out.
    return pa.schema(list(source.schema_arrow.remove_metadata()) + result_fields(fn, column_name))


def row_chunks(source, rows):
    """The rows of a ParquetFile as tables of exactly ``rows`` rows (the last fewer),
    whatever its row groups: the chunking is part of the numbers (see above)."""
    import pyarrow as pa

    held, count = [], 0
    for batch in source.iter_batches(batch_size=rows):
        held.append(batch)
        count += batch.num_rows
        while count >= rows:
            table = pa.Table.from_batches(held).combine_chunks()
            yield table.slice(0, rows)
            rest = table.slice(rows)
            held, count = rest.to_batches(), rest.num_rows
    if count:
        yield pa.Table.from_batches(held, schema=source.schema_arrow)


def read_rows(path, start, stop):
    """Rows [start, stop) of a Parquet file, reading only the row groups that hold them."""
    import pyarrow as pa
    import pyarrow.parquet as pq

    source = pq.ParquetFile(path)
    meta = source.metadata
    groups, first, at = [], None, 0
    for g in range(meta.num_row_groups):
        n = meta.row_group(g).num_rows
        if at + n > start and at < stop:
            groups.append(g)
            first = at if first is None else first
        at += n
    if not groups:
        return source.schema_arrow.empty_table()
    table = source.read_row_groups(groups)
    return pa.Table.from_batches(table.slice(start - first, stop - start).to_batches(),
                                 schema=table.schema)


class AtomicFile:
    """A file written beside its target and moved into place only when complete, so
    that the target's name never holds a partial file."""

    def __init__(self, target, suffix):
        fd, self.partial = tempfile.mkstemp(prefix=".partial-", suffix=suffix,
                                            dir=os.path.dirname(target))
        os.close(fd)
        umask = os.umask(0)
        os.umask(umask)
        os.chmod(self.partial, 0o666 & ~umask)  # as a file the user made, not mkstemp's 0600
        self.target = target

    def commit(self):
        with open(self.partial, "rb+") as done:
            os.fsync(done.fileno())
        os.replace(self.partial, self.target)
        self.partial = None

    def abandon(self):
        if self.partial is not None and os.path.exists(self.partial):
            os.unlink(self.partial)
        self.partial = None


def new_stats():
    return {"rows": 0, "failed": 0, "blank": 0, "first": [], "where": "row"}


def count(stats, table, first_row, column_name, failed, blank):
    """Add a chunk's counts and first messages (by 1-based row number) to ``stats``."""
    stats["rows"] += table.num_rows
    stats["failed"] += failed
    stats["blank"] += blank
    if failed and len(stats["first"]) < 10:
        messages = table.column(column_name + "_message").to_pylist()
        for i, m in enumerate(messages):
            if m is not None and m.startswith(PREFIX) and len(stats["first"]) < 10:
                stats["first"].append((first_row + i + 1, m))


def apply_to_parquet(fn, input_path, output_path, columns, constants, column_name=None,
                     replace=False):
    """Compute ``fn`` over the rows of a Parquet file into a new Parquet file, in one
    process, CHUNK_ROWS rows in memory at a time.  Returns the run's counts (as
    cli.apply_to_csv, rows numbered from 1)."""
    import pyarrow.parquet as pq

    column_name = column_name or api.python_name(fn.name)
    source = open_input(input_path, column_name)
    plan = resolve(fn, source.schema_arrow.names, columns, constants, input_path)
    target = check_target(output_path, input_path, replace)
    out = AtomicFile(target, ".parquet")
    stats = new_stats()
    try:
        with pq.ParquetWriter(out.partial, output_schema(fn, source, column_name)) as writer:
            for table in row_chunks(source, chunk_rows()):
                table = table.replace_schema_metadata(None)
                done, failed, blank = with_results(fn, table, compute(fn, plan, table),
                                                   column_name)
                count(stats, done, stats["rows"], column_name, failed, blank)
                writer.write_table(done)
        out.commit()
    except BaseException:
        out.abandon()
        raise
    return stats


def run_command(fn, args, columns, constants):
    """``python -m calcfuncs`` with a Parquet file or another engine (cli.main's
    parsed ``args``): Parquet in and out, in this process or on Dask."""
    for path in (args.input, args.out):
        if not is_parquet(path):
            raise TableError(f"{path}: Parquet runs and --engine dask take a Parquet input "
                             "and output (*.parquet); CSV runs in one process")
    if args.engine == "dask":
        from . import engines

        return engines.apply_to_parquet(fn, args.input, args.out, columns, constants,
                                        args.column, args.replace, scheduler=args.scheduler,
                                        workers=args.workers, threads=args.threads)
    if args.scheduler or args.workers or args.threads:
        raise TableError("--scheduler, --workers and --threads go with --engine dask")
    return apply_to_parquet(fn, args.input, args.out, columns, constants, args.column,
                            args.replace)
