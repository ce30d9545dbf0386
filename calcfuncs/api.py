"""The cell functions as Python functions, for scripts and for logs that outgrow a sheet.

    from calcfuncs import api
    api.jd("2024-03-20T03:06:00Z", result_scale="TT")     # 2460389.6300...
    api.sun_lon(["2024-06-20T20:51Z", "2024-12-21T09:20Z"])  # a list, one per row

One function per registry entry, named by one rule: the display name without its
``SKY.`` prefix, in lower case, dots turned into underscores (``SKY.SUN.LON`` is
``sun_lon``, ``SKY.WRAP.360`` is ``wrap_360``, ``SKY.BJD.TDB.DATETIME`` is
``bjd_tdb_datetime``).  The arguments are the registry's, in the cell's order, with
the cell's defaults; a problem raises ``SkyError`` (a ``ValueError``) whose text is the
cell's ``#SKY:`` message without the prefix.  Every call goes through
``calcfuncs.cells.evaluate``, so a result is the value a cell shows for the same input.

What a value may be, per argument: what a cell holds (a number, a text, ``None`` for
an argument left out), and also a ``datetime.datetime`` or ``datetime.date`` (read as
ISO 8601 text on the ``scale`` given).  A list, tuple or 1-D numpy array is a column:
the result is then a list, one value per row, computed in one vectorised call as a
whole-column formula is; a 2-D one (rows of values) gives rows back.  Single values
apply to every row.  With ``on_error="text"`` a bad row holds its ``#SKY:`` text
instead of raising, as in the sheet.

Date-time results (``SKY.DATETIME``, ``SKY.SEASON`` ...) are what a cell holds: days
since the null date, 1899-12-30 unless ``null_date`` says otherwise;
``datetime_from_serial`` turns one into a ``datetime.datetime``.
"""

import datetime as _dt
import inspect
import keyword
import textwrap

from . import registry
from .errors import PREFIX, SkyError

DEFAULT_NULL_DATE = (1899, 12, 30)
_NULL = _dt.datetime(1899, 12, 30)

__all__ = ["SkyError", "python_name", "FUNCTIONS", "call", "datetime_from_serial",
           "apply_to_file",
           "returns_datetime"]


def python_name(display_name):
    """The API name of a cell function: ``SKY.SUN.LON`` -> ``sun_lon``."""
    if not display_name.startswith("SKY."):
        raise ValueError(f'"{display_name}" is not a display name of ours (SKY....)')
    return display_name[len("SKY."):].lower().replace(".", "_")


def returns_datetime(fn):
    """Whether a cell function's result is a date-time value (days since the null
    date): its registry ``result_kind`` is "datetime"."""
    return fn.returns_datetime


def datetime_from_serial(serial, null_date=DEFAULT_NULL_DATE):
    """A date-time value (days since the null date) as a naive ``datetime.datetime``,
    to the microsecond (what a date-time value resolves)."""
    null = _dt.datetime(*null_date) if tuple(null_date) != DEFAULT_NULL_DATE else _NULL
    micro = round(float(serial) * 86_400_000_000)
    return null + _dt.timedelta(microseconds=micro)


def _cell_value(v):
    """A Python value as the cell layer takes it (Calc hands over floats and texts)."""
    if v is None or isinstance(v, str):
        return v
    if isinstance(v, _dt.datetime):
        return v.isoformat()
    if isinstance(v, _dt.date):
        return v.isoformat()
    if hasattr(v, "item") and not isinstance(v, (list, tuple)) and getattr(v, "ndim", 0) == 0:
        v = v.item()  # a numpy scalar
    if isinstance(v, bool):
        return float(v)  # Calc's TRUE is 1
    if isinstance(v, int):
        return float(v)
    return v


def _prepare(v):
    """(cell argument, shape): shape is None for one value, 1 for a column, 2 for rows."""
    if hasattr(v, "ndim") and hasattr(v, "tolist") and v.ndim > 0:
        v = v.tolist()  # numpy array
    if isinstance(v, (list, tuple)):
        if v and all(isinstance(r, (list, tuple)) for r in v):
            return tuple(tuple(_cell_value(c) for c in r) for r in v), 2
        return tuple((_cell_value(c),) for c in v), 1
    return _cell_value(v), None


def _unwrap(result, dims):
    if not isinstance(result, tuple):
        return result
    if dims == 1:
        return [row[0] for row in result]
    return [list(row) for row in result]


def _messages(result):
    if isinstance(result, tuple):
        for i, row in enumerate(result):
            for j, c in enumerate(row):
                if isinstance(c, str) and c.startswith(PREFIX):
                    yield (i, j), c
    elif isinstance(result, str) and result.startswith(PREFIX):
        yield None, result


def _invoke(fn, values, null_date, on_error):
    from . import cells

    if on_error not in ("raise", "text"):
        raise ValueError('on_error must be "raise" or "text"')
    prepared = [_prepare(v) for v in values]
    dims = max((d for _, d in prepared if d is not None), default=None)
    result = cells.evaluate(fn, [a for a, _ in prepared], tuple(null_date))
    if on_error == "raise":
        for where, text in _messages(result):
            err = SkyError(text[len(PREFIX):])
            err.row = None if where is None else where[0]
            err.results = _unwrap(result, dims)
            raise err
    return _unwrap(result, dims)


def _docstring(fn):
    def para(text, indent=""):
        return textwrap.fill(text, 84, initial_indent=indent,
                             subsequent_indent=indent + "    " if indent else "")

    lines = [para(fn.summary), "", para("Result: " + fn.result + ".")]
    if fn.model:
        lines += ["", para(fn.model)]
    lines += ["", f"Cell function {fn.name}. Arguments:"]
    for a in fn.args:
        default = "" if not a.optional else f" (default {a.default!r})"
        lines.append(para(f"{a.name}{default}: {a.description}", "  "))
    lines += ["", para("Keyword-only: null_date (of date-time values, default 1899-12-30), "
                       'on_error ("raise", the default, or "text": bad rows hold their '
                       "#SKY: text, as in the sheet).")]
    return "\n".join(lines)


def _make(fn):
    params = [
        inspect.Parameter(a.name, inspect.Parameter.POSITIONAL_OR_KEYWORD,
                          default=a.default if a.optional else inspect.Parameter.empty)
        for a in fn.args
    ]
    params += [
        inspect.Parameter("null_date", inspect.Parameter.KEYWORD_ONLY, default=DEFAULT_NULL_DATE),
        inspect.Parameter("on_error", inspect.Parameter.KEYWORD_ONLY, default="raise"),
    ]
    signature = inspect.Signature(params)
    arg_names = [a.name for a in fn.args]

    def cell_function(*args, **kwargs):
        bound = signature.bind(*args, **kwargs)
        bound.apply_defaults()
        values = [bound.arguments[n] for n in arg_names]
        return _invoke(fn, values, bound.arguments["null_date"], bound.arguments["on_error"])

    cell_function.__name__ = cell_function.__qualname__ = python_name(fn.name)
    cell_function.__module__ = __name__
    cell_function.__signature__ = signature
    cell_function.__doc__ = _docstring(fn)
    cell_function.cell_function = fn
    return cell_function


FUNCTIONS = {}  # API name -> Python function, in registry order
for _fn in registry.FUNCTIONS:
    _name = python_name(_fn.name)
    if not _name.isidentifier() or keyword.iskeyword(_name) or _name in globals():
        raise RuntimeError(f"{_fn.name} gives no usable API name ({_name})")
    FUNCTIONS[_name] = globals()[_name] = _make(_fn)
    __all__.append(_name)
del _fn, _name


def call(name, *args, null_date=DEFAULT_NULL_DATE, on_error="raise", **kwargs):
    """Call a cell function by display name (``"SKY.JD"``) or API name (``"jd"``).
    ``calcfuncs.call`` is the same call."""
    return lookup(name)(*args, null_date=null_date, on_error=on_error, **kwargs)


def lookup(name):
    """The API function for a display name (any case) or an API name."""
    key = name.strip()
    if key.upper().startswith("SKY."):
        key = python_name(key.upper())
    key = key.lower()
    if key not in FUNCTIONS:
        raise ValueError(f'unknown function "{name}"; python -m calcfuncs --list shows them')
    return FUNCTIONS[key]


def apply_to_file(function, input, output, columns, constants=None, column=None, *,
                  engine="single", scheduler=None, workers=None, threads=False,
                  client=None, replace=False):
    """A cell function over the rows of a log file into a new file, as
    ``python -m calcfuncs`` does: ``columns`` maps argument names to the file's column
    names, ``constants`` argument names to one value for every row (text as on the
    command line).  Parquet (``*.parquet``) in and out, in this process or with
    ``engine="dask"`` on Dask workers (``client``: a ``distributed.Client`` of yours,
    e.g. on a dask-jobqueue or Kubernetes cluster; or ``scheduler``: a running
    cluster's address; else ``workers`` local processes, or threads); CSV in and out in
    this process.
    Returns the run's counts: rows, failed, blank, and the first messages by row."""
    from . import cli, engines, tables

    fn = lookup(function).cell_function
    constants = dict(constants or {})
    if engine not in ("single", "dask"):
        raise ValueError('engine must be "single" or "dask"')
    if tables.is_parquet(input) and tables.is_parquet(output):
        if engine == "dask":
            return engines.apply_to_parquet(fn, input, output, columns, constants, column,
                                            replace, scheduler=scheduler, workers=workers,
                                            threads=threads, client=client)
        return tables.apply_to_parquet(fn, input, output, columns, constants, column, replace)
    if engine != "single" or tables.is_parquet(input) or tables.is_parquet(output):
        raise ValueError("the Dask engine and Parquet take a Parquet input and output")
    try:
        return cli.apply_to_csv(fn, input, output, columns, constants, column, replace)
    except cli.UsageError as problem:
        raise ValueError(str(problem)) from None
