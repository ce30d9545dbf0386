"""From cell values to core calls and back: the one evaluation path of every function.

A cell hands over a number, a text, ``None`` (argument left out) or, for a range, a
tuple of row tuples.  Any argument may be a range; single cells then apply to every
row.  Each row is read and computed on its own terms, so a bad row gets its own
``#SKY:`` message and the other rows their numbers.  Rows that share their option
words (scale, model, unit ...) are computed in one vectorised core call.
"""

import gc
import importlib
import inspect
import math
import time
from collections import OrderedDict

import numpy as np

from . import ephemeris, registry
from .angles import parse_angle
from .bounded import NEWEST, keep
from .errors import PREFIX, RowErrors, SkyError
from .timeinput import null_date_jd, one_utc_serial, read_times, read_utc_serial, to_serial
from .timescales import DUT1_LIMIT, DateTimes, Instants, check_scale
from .vocabulary import J2000_JD, SCALE_WORDS, SOURCE_WORDS

_IMPLS = {}
_NULL_JDS = {}
# Calc recomputes every cell of a sheet on each hard recalculation (and on load when so
# set), and the answer of a single cell depends only on its arguments: keep answers.


class KeptAnswers:
    """Single cells' answers, at most ``size``, in two parts.  The last ``recent`` kept,
    in order of arrival: the newest work of a session, where a block of rows computed
    ahead (``_fill_down``) and the cell next to a new one are found however long the
    session has run.  Behind them the rest: when full, its newest entry makes room, so a
    sheet larger than the bound still finds its first cells on every recalculation
    instead of none, as a least-recently-used policy would on a top-to-bottom pass.  (One
    part of that second kind alone, as before, once full kept no new answer for longer
    than the next cell: a month of sunsets filled down then searched every day.)"""

    __slots__ = ("size", "recent_size", "recent", "older")

    def __init__(self, size=200_000, recent=8192):
        self.size, self.recent_size = size, min(recent, size)
        self.recent = OrderedDict()
        self.older = {}

    def get(self, key, default=None):
        found = self.recent.get(key, _NOT_MADE)
        return self.older.get(key, default) if found is _NOT_MADE else found

    def __contains__(self, key):
        return key in self.recent or key in self.older

    def __len__(self):
        return len(self.recent) + len(self.older)

    def clear(self):
        self.recent.clear()
        self.older.clear()

    def keep(self, key, value):
        recent = self.recent
        if key not in recent and len(recent) >= self.recent_size:
            first, answer = recent.popitem(last=False)
            if self.size > self.recent_size:
                keep(self.older, first, answer, self.size - self.recent_size, evict=NEWEST)
        recent[key] = value


_SINGLE_CELL_CACHE = KeptAnswers()


def _impl(fn):
    """(the core's function, its parameters' names, and its twin on floats with the
    names and kinds of the row arguments, or None: see ``_on_floats``)."""
    found = _IMPLS.get(fn.method)
    if found is None:
        module, name = fn.impl.split(":")
        func = getattr(importlib.import_module(f"{__package__}.{module}"), name)
        twin = getattr(func, "on_floats", None)
        found = (func, frozenset(inspect.signature(func).parameters),
                 twin and (twin, tuple((a.name, a.kind, _lane_default(a)) for a in fn.args
                                       if a.kind in registry.ROW_KINDS)))
        _IMPLS[fn.method] = found
    return found


def _lane_default(arg):
    """What the float lane hands a twin for a number or angle left out of a cell: its
    default as a float, or None where it has none to give (the lane then declines)."""
    if arg.optional and type(arg.default) in (float, int):
        return float(arg.default)
    return None


def _null_jd(null_date):
    key = tuple(null_date)
    if key not in _NULL_JDS:
        _NULL_JDS[key] = null_date_jd(key)
    return _NULL_JDS[key]


def _as_grid(raw, floats=False):
    """A range as a 2-D object array; ``None`` for a single value.  ``floats``: a column
    of numbers only (Python floats, as Calc sends them) comes as a float array instead,
    for an argument read as numbers: no objects made, walked and converted again."""
    if not isinstance(raw, (tuple, list)):
        return None
    try:  # the usual range, one column: unpacking each row is three times numpy's walk
        column = [value for (value,) in raw]
    except (TypeError, ValueError):
        pass
    else:
        if floats and len(column) > 1 and set(map(type, column)) == {float}:
            return np.fromiter(column, dtype=float, count=len(column)).reshape(-1, 1)
        grid = np.empty((len(column), 1), dtype=object)
        grid[:, 0] = column
        return grid
    try:
        grid = np.array(raw, dtype=object)  # C speed for the usual tuple of row tuples
        if grid.ndim == 2:
            return grid
    except ValueError:  # ragged rows
        pass
    rows = [r if isinstance(r, (tuple, list)) else (r,) for r in raw]
    width = len(rows[0]) if rows else 0
    if any(len(r) != width for r in rows):
        raise SkyError("the range is not rectangular")
    grid = np.empty((len(rows), width), dtype=object)
    grid[:] = rows  # one C-level copy; cell values are scalars, never sequences
    return grid


def _is_blank(v):
    return v is None or (isinstance(v, str) and v.strip() == "")


# ---- options: one word or number shared by many rows ---------------------------------


# Option words read before: (argument, text) -> what the text reads as.  A formula
# filled down reads the same words in every cell.  Not the sources, whose reading looks
# at files on disk; numbers and blanks are read at once anyway.
_WORDS_READ = {}
_WORDS_READ_SIZE = 4096


def _read_option(arg, value):
    """The option's value, or a ``SkyError`` worded for the cell."""
    if value is None and (arg.kind != "choice" or arg.optional):
        return arg.default  # left out: what _read_option_anew reads a blank as, at once
    if type(value) is not str or arg.kind == "source":
        return _read_option_anew(arg, value)
    key = (id(arg), value)
    kept = _WORDS_READ.get(key)
    if kept is not None and kept[0] is arg:  # (an id is only unique while its object lives)
        return kept[1]
    found = _read_option_anew(arg, value)
    keep(_WORDS_READ, key, (arg, found), _WORDS_READ_SIZE)
    return found


def _read_option_anew(arg, value):
    if arg.kind == "scale":
        if _is_blank(value) or (type(value) is float and value == 0.0):
            return arg.default
        if not isinstance(value, str):
            raise SkyError(f"{arg.name} must be a time scale: " + SCALE_WORDS)
        try:
            return check_scale(value)
        except SkyError as err:
            if str(err).startswith("unknown time scale"):
                raise SkyError(f'unknown {arg.name} "{value}"; use ' + SCALE_WORDS) from None
            raise
    if arg.kind == "source":
        if _is_blank(value) or (type(value) is float and value == 0.0):
            return arg.default
        if not isinstance(value, str):
            raise SkyError(f"{arg.name} must be a text: " + SOURCE_WORDS)
        return ephemeris.check_source(value)
    if arg.kind == "choice":
        # An empty cell arrives as 0.0 when referenced directly: it means the default.
        if _is_blank(value) or (type(value) is float and value == 0.0):
            if not arg.optional:
                raise SkyError(f"{arg.name} is missing; use " + ", ".join(arg.choices))
            return arg.default
        if not isinstance(value, str):
            raise SkyError(f"{arg.name} must be one of " + ", ".join(arg.choices))
        word = " ".join(value.replace("_", " ").split()).upper()
        word = dict(arg.aliases).get(word, word)
        # Choices are matched with spaces and underscores alike (EARTH_RADII, EARTH RADII).
        word = {c.replace("_", " "): c for c in arg.choices}.get(word, word)
        if word not in arg.choices:
            raise SkyError(f'unknown {arg.noun} "{value}"; use ' + ", ".join(arg.choices))
        return word
    if _is_blank(value):
        return arg.default
    if isinstance(value, str):
        try:
            value = float(value.strip())
        except ValueError:
            raise SkyError(f'{arg.name} must be a number, not "{value}"') from None
    value = float(value)
    if not np.isfinite(value):
        raise SkyError(f"{arg.name} must be a finite number")
    if arg.kind == "count":
        if value != int(value) or abs(value) > 1e6:
            raise SkyError(f"{arg.name} must be a whole number, not {value:g}")
        return int(value)
    if arg.name == "dut1" and abs(value) > DUT1_LIMIT:
        # Said as the option is read, so a cell and a column give the same message
        # whatever else is wrong in a row (the time scales say it again).
        raise SkyError(f"DUT1 of {value} s is outside -1 to +1 s")
    return value


# ---- row-wise values ----------------------------------------------------------------


def _all_floats(values, kinds=None):
    """The values as a float array when every one is a Python float (the usual column
    of numbers from Calc), else None.  ``kinds``: the values' types, when known."""
    if values.size > 1 and (kinds or set(map(type, values))) == {float}:  # walk in C
        return values.astype(float)
    return None


def _read_floats(values, what, finite_words, parse_text, kinds=None):
    """Numbers of a column: floats as they are, texts through ``parse_text`` (which
    raises a ``SkyError`` worded for the cell), each bad row with its own message."""
    fast = _all_floats(values, kinds)
    if fast is not None:
        bad = ~np.isfinite(fast)
        if not bad.any():  # the usual column: no message, and no array of Nones made
            return fast, None
        messages = np.full(values.size, None, dtype=object)
        messages[bad] = f"{what} must be a finite {finite_words}"
        return fast, messages
    out = np.zeros(values.size)
    messages = np.full(values.size, None, dtype=object)
    for i, v in enumerate(values):
        if isinstance(v, (float, int)) and not isinstance(v, bool):
            out[i] = v
            if not np.isfinite(v):
                messages[i] = f"{what} must be a finite {finite_words}"
        elif v is None:
            messages[i] = f"{what} is missing"
        else:
            try:
                out[i] = parse_text(v, what)
            except SkyError as err:
                messages[i] = str(err)
    return out, messages


def _refuse_text(value, what):
    raise SkyError(f'{what} must be a number, not "{value}"')


def _read_numbers(values, what, kinds=None):
    return _read_floats(values, what, "number", _refuse_text, kinds)


def _read_angles(values, what, kinds=None):
    return _read_floats(values, what, "number of degrees", lambda v, _what: parse_angle(v),
                        kinds)


def _read_texts(values, what):
    messages = np.array([f"{what} is missing" if v is None else None for v in values], dtype=object)
    return values.copy(), messages


_NOT_GIVEN = {"time": f"JD {J2000_JD}", "number": 0.0, "angle": 0.0}


def _passed_on(values, kinds=None):
    """Messages for rows whose input is itself a #SKY: message from another cell: the
    first problem is passed on as it is, instead of 'is not an angle'.  None when no row
    holds text (the usual column of numbers).  ``kinds``: the values' types, when known."""
    if str not in (kinds or set(map(type, values))):  # the type walk in C
        return None
    out = np.full(len(values), None, dtype=object)
    for i, v in enumerate(values):
        if type(v) is str and v.startswith(PREFIX):
            out[i] = v[len(PREFIX):]
    return out


def _merge(messages, new):
    """Keep each row's first message (``new`` None: no message in any row)."""
    if new is None:
        return
    take = np.not_equal(new, None) & np.equal(messages, None)
    messages[take] = new[take]


# ---- evaluation ---------------------------------------------------------------------


LEAP_SECOND_MESSAGE = ("this instant is inside a leap second (23:59:60), which a date-time "
                       "cell cannot show; use SKY.TEXT.ISO")


def _date_time_values(result, null_jd):
    """Calc date-time values (days since the document's null date) of a ``DateTimes``,
    with its words in the rows that have no instant, and the mask of rows that fall
    inside a leap second (a Calc day has 86,400 seconds)."""
    serial, in_leap = to_serial(result.instants, null_jd)
    serial = np.reshape(serial + result.offset_days, -1)
    if in_leap.shape != serial.shape:
        in_leap = np.broadcast_to(in_leap, serial.shape)
    if result.words is None:
        return serial, in_leap
    words = np.reshape(result.words, -1)
    values = np.empty(serial.size, dtype=object)
    values[:] = serial.tolist()
    has_words = np.not_equal(words, None)
    values[has_words] = words[has_words]
    return values, in_leap & ~has_words


# A one-row result's date-time value, kept by its instants (an Instants that
# DateTimes.of_tt shares among the cells whose answer is one event; held by the key, so
# never mistaken for another), offset and null date: (value, inside a leap second).
_ONE_VALUE = {}
_ONE_VALUE_KEPT = 4096


def _one_date_time_value(result, null_jd):
    """``_date_time_values`` of a one-row ``DateTimes`` without words: (array, bool)."""
    offset = result.offset_days
    key = (result.instants, offset, null_jd) if type(offset) is float else None
    found = _ONE_VALUE.get(key) if key is not None else None
    if found is None:
        serial, in_leap = _date_time_values(result, null_jd)
        found = (serial, bool(in_leap.any()))
        serial.flags.writeable = False
        if key is not None:
            keep(_ONE_VALUE, key, found, _ONE_VALUE_KEPT)
    return found


def _one(value):
    """One cell's value for all rows, as a column of one row (spread by _compute_group)."""
    column = np.empty(1, dtype=object)
    column[0] = value
    return column


def _compute_group(fn, rows, options, null_jd, shared=frozenset(), n=None, kinds_of=None):
    """Results (object array) for ``n`` rows that share their options.

    Arguments named in ``shared`` came from one cell for every row (a column of one
    row): they are read once and their value (or message) spread over the rows.
    ``kinds_of``: argument name -> the set of its values' types, where the caller has
    walked them already.
    """
    func, params, _ = _impl(fn)
    if n is None:
        n = len(next(iter(rows.values()))) if rows else 1
    if not any(a.kind in registry.ROW_KINDS for a in fn.args):
        kwargs = {k: v for k, v in options.items() if k in params}
        try:
            out = func(**kwargs)
            if isinstance(out, DateTimes):
                out = _date_time_values(out, null_jd)[0]
            return np.asarray(out, dtype=object).reshape(-1)[:1].repeat(n)
        except SkyError as err:
            return np.full(n, PREFIX + str(err), dtype=object)
    messages = np.full(n, None, dtype=object)
    clean = True
    columns = {}
    for arg in fn.args:
        if arg.kind not in registry.ROW_KINDS:
            continue
        values = rows[arg.name]
        spread = arg.name in shared and n > 1
        if spread:
            values = values[:1]
        kinds = (kinds_of or {}).get(arg.name)
        if kinds is None or spread:
            kinds = set(map(type, values))  # the type walk in C, once for the column's readers
        msgs_passed = _passed_on(values, kinds)
        if type(None) in kinds:  # left-out rows take their placeholders below
            kinds = None
        if arg.optional and arg.default is None:
            # Left out means "not given" (a time only some systems need, a site that is
            # the geocentre): the core gets the mask and refuses rows where it matters;
            # the rows compute on a placeholder (J2000.0, or 0).
            if kinds is not None:  # no row left out (the usual column): no walk, no copy
                given = np.ones(len(values), dtype=bool)
            else:
                given = np.not_equal(values, None).astype(bool)
                values = np.where(given, values, _NOT_GIVEN[arg.kind])
            columns[arg.name + "_given"] = given
        elif arg.optional and kinds is None:  # some row left out: it takes the default
            values = np.array([arg.default if v is None else v for v in values], dtype=object)
        if arg.kind == "time":
            jd1, jd2, msgs = read_times(
                values, options.get("scale", "UTC"), null_jd, options.get("dut1", 0.0), kinds
            )
            columns[arg.name] = (jd1, jd2)
        elif arg.kind == "number":
            columns[arg.name], msgs = _read_numbers(values, arg.name, kinds)
        elif arg.kind == "angle":
            columns[arg.name], msgs = _read_angles(values, arg.name, kinds)
        else:
            columns[arg.name], msgs = _read_texts(values, arg.name)
        if msgs_passed is None:
            msgs_passed = msgs
        else:
            _merge(msgs_passed, msgs)
        if spread and msgs_passed is not None:
            msgs_passed = np.full(n, msgs_passed[0], dtype=object)
            col = columns[arg.name]
            if arg.kind == "time":
                columns[arg.name] = (np.full(n, col[0][0]), np.full(n, col[1][0]))
            else:
                columns[arg.name] = np.full(n, col[0], dtype=col.dtype)
            if arg.name + "_given" in columns:
                columns[arg.name + "_given"] = np.full(n, columns[arg.name + "_given"][0])
        if msgs_passed is not None:
            _merge(messages, msgs_passed)
            clean = False

    results = np.full(n, None, dtype=object)
    # ``clean``: no row has a message yet (the usual column), so no walk of the messages.
    good = np.ones(n, dtype=bool) if clean else np.equal(messages, None)
    for _attempt in range(8):
        idx = np.flatnonzero(good)
        if idx.size == 0:
            break
        kwargs = {k: v for k, v in options.items() if k in params}
        try:
            for arg in fn.args:
                if arg.kind not in registry.ROW_KINDS:
                    continue
                col = columns[arg.name]
                if arg.name + "_given" in params:
                    kwargs[arg.name + "_given"] = columns[arg.name + "_given"][idx]
                if arg.kind == "time":
                    kwargs[arg.name] = Instants(
                        col[0][idx], col[1][idx], options.get("scale", "UTC"),
                        options.get("dut1", 0.0),
                    )
                else:
                    kwargs[arg.name] = col[idx]
            out = func(**kwargs)
            leap = None
            if isinstance(out, DateTimes):
                out, leap = _date_time_values(out, null_jd)
                if np.any(leap):
                    messages[idx[leap]] = LEAP_SECOND_MESSAGE
                    clean = False
            out = np.asarray(out)
        except RowErrors as err:
            row_messages = err.messages.ravel()
            if row_messages.size != idx.size:  # not row-aligned: the whole group fails
                row_messages = np.full(idx.size, str(err), dtype=object)
            failing = np.array([m is not None for m in row_messages], dtype=bool)
            messages[idx[failing]] = row_messages[failing]
            good[idx[failing]] = False
            clean = False
            continue
        except SkyError as err:
            messages[idx] = str(err)
            clean = False
            break
        out = out.reshape(-1)
        if out.dtype.kind == "f":
            finite = np.isfinite(out)
            if leap is not None:
                finite |= leap  # their NaN is explained by the leap-second message
            if idx.size == n and finite.all():
                if clean:  # the usual column: its floats as they are, no objects made
                    return out.tolist()
                results[:] = out.tolist()  # Python floats, as UNO wants them
            else:
                as_objects = np.empty(out.size, dtype=object)
                as_objects[:] = out.tolist()
                results[idx[finite]] = as_objects[finite]
                messages[idx[~finite]] = "no result for these arguments"
                clean = False
        else:
            for k, i in enumerate(idx):
                results[i] = out[k] if isinstance(out[k], str) else float(out[k])
        break
    if not clean:
        for i in np.flatnonzero(np.not_equal(messages, None)):
            results[i] = PREFIX + messages[i]
    return results


def _evaluate_single(fn, raw_args, null_date):
    """One cell: the same path as a column of one row, without the grid bookkeeping."""
    options, rows = {}, {}
    plain = fn.result_kind in ("number", "datetime")
    for a, raw in zip(fn.args, raw_args):
        if a.kind in registry.OPTION_KINDS:
            options[a.name] = _read_option(a, raw)
        else:
            rows[a.name] = raw
            plain = plain and (
                (a.kind in _PLAIN_KINDS
                 and (type(raw) is float or (raw is None and _left_out_plainly(a))))
                or (a.kind == "text" and type(raw) is str and not raw.startswith(PREFIX)))
    null_jd = _null_jd(null_date)
    if plain and rows:
        found = _plain_single(fn, rows, options, null_jd)
        if found is not None:
            return found
    for name, raw in rows.items():  # the general path's columns, of one row
        column = rows[name] = np.empty(1, dtype=object)
        column[0] = raw
    return _compute_group(fn, rows, options, null_jd)[0]


_PLAIN_KINDS = ("number", "angle", "time")
_FLOAT_KINDS = _PLAIN_KINDS  # the row arguments whose all-number columns come as floats


def _left_out_plainly(arg):
    """Whether a row argument left out of a cell (None: Calc's omitted trailing
    argument) reads as one number on the quick path: an optional number or angle whose
    default is a number (taken) or None (not given: the general path's placeholder 0
    and a mask saying so)."""
    return (arg.optional and arg.kind in ("number", "angle")
            and (arg.default is None or type(arg.default) in (float, int)))


def _plain_single(fn, rows, options, null_jd):
    """The usual single cell, its row arguments all numbers (a value, an angle, a
    date-time value) or texts (an orbit's line) and its result a number or a date-time
    value: the core called on one-element arrays as the general path calls it, without
    that path's checks for blanks and messages from other cells.  None where anything is
    unusual (a message to give, a result that is not one finite number): the general path
    then says what it says.  ``rows``: each row argument's value as the cell holds it (a
    Python float, a text that is no message, or None for an optional number left out)."""
    func, params, _ = _impl(fn)  # (its twin on floats: tried first, by _lane_of)
    kwargs = {k: v for k, v in options.items() if k in params} if options else {}
    for arg in fn.args:
        if arg.kind not in registry.ROW_KINDS:
            continue
        value = rows[arg.name]
        if arg.kind == "time":
            scale, dut1 = options.get("scale", "UTC"), options.get("dut1", 0.0)
            found = read_utc_serial(value, null_jd) if scale == "UTC" else None
            if found is None:
                column = np.empty(1, dtype=object)
                column[0] = value
                jd1, jd2, messages = read_times(column, scale, null_jd, dut1)
                if messages is not None and messages[0] is not None:
                    return None
                kwargs[arg.name] = Instants(jd1, jd2, scale, dut1)
            else:  # UTC from 1960 (read_utc_serial) and a DUT1 read within its limit
                kwargs[arg.name] = Instants.unchecked(*found, "UTC", dut1)
        elif arg.kind == "text":  # a text (an orbit, an angle to read): the column's form
            column = np.empty(1, dtype=object)
            column[0] = value
            kwargs[arg.name] = column
        elif value is None:  # left out (_left_out_plainly), as the general path reads it
            if arg.default is None:
                kwargs[arg.name] = np.array([_NOT_GIVEN[arg.kind]])
                if arg.name + "_given" in params:
                    kwargs[arg.name + "_given"] = np.zeros(1, dtype=bool)
            else:
                kwargs[arg.name] = np.array([float(arg.default)])
            continue
        else:
            if not math.isfinite(value):
                return None
            kwargs[arg.name] = np.array([value])
        if arg.name + "_given" in params:
            kwargs[arg.name + "_given"] = np.ones(1, dtype=bool)
    try:
        out = func(**kwargs)
    except (RowErrors, SkyError):
        return None
    if type(out) is float:  # a place on floats (bodies.spherical_component)
        return out if math.isfinite(out) else None
    if isinstance(out, DateTimes):
        if out.words is not None:
            return None
        out, in_leap = _one_date_time_value(out, null_jd)
        if in_leap:
            return None
    out = np.asarray(out)
    if out.size != 1 or out.dtype.kind != "f":
        return None
    value = out.item()
    return value if math.isfinite(value) else None


def _lane_of(fn):
    """The float lane of a single cell of ``fn`` read straight from its raw arguments: a
    function (raw_args, null_jd) -> value or None, made once per function from the
    registry (None for a function without a twin on floats or whose result is not a
    number or a date-time value).  It does what ``_evaluate_single`` and ``_plain_single``
    do before they hand a cell to ``_on_floats`` (options read, each row argument taken
    only as a plain number, date-time value or text, the scale UTC), without their
    general bookkeeping: in Calc that bookkeeping had cost a cell as much as its place.
    None from it (any argument out of the ordinary, any failure) sends the cell down the
    usual path, which answers as before."""
    found = _LANES.get(fn.method, _NOT_MADE)
    if found is not _NOT_MADE:
        return found
    func, params, twin = _impl(fn)
    lane = None
    if twin is not None and fn.result_kind in ("number", "datetime") and not fn.reduces_series:
        twin_fn, row_args = twin
        options = tuple((k, a, a.name in params, _left_out_option(a))
                        for k, a in enumerate(fn.args) if a.kind in registry.OPTION_KINDS)
        rows = tuple((k, a.name, _plain_row_kind(a)) for k, a in enumerate(fn.args)
                     if a.kind not in registry.OPTION_KINDS)
        lane = _make_lane(twin_fn, row_args, options, rows) if rows else None
    _LANES[fn.method] = lane
    return lane


_LANES = {}
_NOT_MADE = object()


def _left_out_option(arg):
    """What an option left out of a cell reads as (``_read_option(arg, None)``), or
    _NOT_MADE where that is a message (a choice the cell must make)."""
    try:
        return _read_option(arg, None)
    except SkyError:
        return _NOT_MADE


def _plain_row_kind(arg):
    """How ``_evaluate_single`` takes a row argument on its quick path: "float" (a number
    only), "float or left out", "text" (a text that is no message), or None (never)."""
    if arg.kind in _PLAIN_KINDS:
        return "float or left out" if _left_out_plainly(arg) else "float"
    return "text" if arg.kind == "text" else None


def _make_lane(twin, row_args, options, rows):
    def lane(raw_args, null_jd):
        count = len(raw_args)
        kwargs = {}
        scale, dut1 = "UTC", 0.0
        for k, arg, wanted, left_out in options:
            raw = raw_args[k] if k < count else None
            value = left_out if raw is None else _NOT_MADE
            if value is _NOT_MADE:
                value = _read_option(arg, raw)
            if wanted:
                kwargs[arg.name] = value
            if arg.name == "scale":
                scale = value
            elif arg.name == "dut1":
                dut1 = value
        if scale != "UTC":
            return None
        given = {}
        for k, name, kind in rows:
            raw = raw_args[k] if k < count else None
            if type(raw) is float:
                if kind is None or kind == "text":
                    return None
            elif raw is None:
                if kind != "float or left out":
                    return None
            elif type(raw) is str:
                if kind != "text" or raw.startswith(PREFIX):
                    return None
            else:
                return None
            given[name] = raw
        return _on_floats(twin, row_args, given, kwargs, null_jd, dut1)
    return lane


def _on_floats(twin, row_args, rows, kwargs, null_jd, dut1):
    """The float lane of a single cell whose function has a twin on floats (its
    ``on_floats``: the places of the Sun, the Moon, the planets and two-body orbits, the
    observed place at a site, the Julian date on UTC or TT).  The instant, a UTC date-time value on a day of one
    TAI - UTC, is read straight onto TT as two floats (timeinput.one_utc_serial, a
    timescales.OneUTC, which also gives its UT1) and handed to the twin with the cell's
    options, its numbers and angles as floats (one left out as its default), a text (an
    orbit's line) as it is.  No Instants and no
    arrays are made: in Calc each numpy call of a cell's path costs two to three times
    what it costs in a loop.  The twin gives the value the function gives, to the bit,
    or None where it does not take the cell; None here sends the cell down the usual
    path (``evaluate``), which says what it says.  So does any failure of the twin: the
    lane only saves time, and the usual path reports a defect as one (the tests hold
    the lane to being taken and to the usual path's values).  ``kwargs``: the cell's
    options, a dict of the lane's own, to which the row arguments are added."""
    given = kwargs
    for name, kind, default in row_args:
        value = rows[name]
        if kind == "time":
            instant = one_utc_serial(value, null_jd, dut1) if type(value) is float else None
            if instant is None:
                return None
            given[name] = instant
        elif kind == "text":  # (as it is: a twin reads one text, not a column)
            given[name] = value
        elif type(value) is float:  # a number or an angle
            if not math.isfinite(value):
                return None
            given[name] = value
        elif value is None and default is not None:  # left out
            given[name] = default
        else:
            return None
    try:
        value = twin(**given)
    except Exception:  # (a message to give, or a defect: the usual path says which)
        return None
    return value if value is not None and math.isfinite(value) else None


# ---- series: whole ranges reduced to one value -------------------------------------

# The most rows a series may hold: a reduction's cost grows with its rows, and a cell
# must never keep the office busy for long.
SERIES_MAX_ROWS = 100_000


def _series_cells(raw):
    """A range (or a single cell) as a flat object array of cell values, row by row."""
    grid = _as_grid(raw)
    if grid is None:
        single = np.empty(1, dtype=object)
        single[0] = raw
        return single
    return grid.reshape(-1)


def _series_numbers(name, cells):
    """The numbers of a series and the mask of its empty cells; text is an error that
    names the row (a #SKY: message from another cell is passed on)."""
    fast = _all_floats(cells)
    if fast is not None:
        blank = np.zeros(cells.size, dtype=bool)
        values = fast
    else:
        blank = np.array([_is_blank(v) for v in cells], dtype=bool)
        values = np.full(cells.size, np.nan)
        for i, v in enumerate(cells):
            if blank[i]:
                continue
            if isinstance(v, str):
                if v.startswith(PREFIX):
                    raise SkyError(f"row {i + 1} of {name}: {v[len(PREFIX):]}")
                try:
                    v = float(v.strip())
                except ValueError:
                    raise SkyError(f'row {i + 1} of {name} is not a number: "{v}"') from None
            values[i] = float(v)
    bad = ~blank & ~np.isfinite(values)
    if np.any(bad):
        raise SkyError(f"row {np.flatnonzero(bad)[0] + 1} of {name} is not a finite number")
    return values, blank


def _evaluate_series(fn, raw_args, null_date):
    """One value from whole ranges: rows empty in every range are skipped, a row empty
    in only some is refused (the pairs would shift)."""
    options, series = {}, {}
    for a, raw in zip(fn.args, raw_args):
        if a.kind in registry.SERIES_KINDS:
            series[a.name] = _series_cells(raw)
        elif a.kind in registry.OPTION_KINDS:
            options[a.name] = _read_option(a, raw)
        else:
            raise SkyError(f"{fn.name} takes no row-wise argument {a.name}")
    sizes = {len(v) for v in series.values()}
    if len(sizes) > 1:
        raise SkyError("the ranges have different numbers of cells ("
                       + ", ".join(f"{k} {len(v)}" for k, v in series.items())
                       + "); give ranges of one size")
    if sizes.pop() > SERIES_MAX_ROWS:
        raise SkyError(f"more than {SERIES_MAX_ROWS:,} rows; give the rows of one event")
    numbers = {name: _series_numbers(name, cells) for name, cells in series.items()}
    blanks = np.array([b for _, b in numbers.values()])
    all_blank = blanks.all(axis=0)
    partly = blanks.any(axis=0) & ~all_blank
    if np.any(partly):
        i = np.flatnonzero(partly)[0]
        empty = [name for name, (_, b) in numbers.items() if b[i]]
        raise SkyError(f"row {i + 1} is empty in {', '.join(empty)} but not in the other "
                       "range; fill both or neither")
    func, params, _ = _impl(fn)
    kwargs = {k: v for k, v in options.items() if k in params}
    kwargs.update({name: values[~all_blank] for name, (values, _) in numbers.items()})
    value = float(np.asarray(func(**kwargs), dtype=float).reshape(-1)[0])
    if not np.isfinite(value):
        raise SkyError("no result for these arguments")
    return value


def _evaluate(fn, raw_args, null_date, single=None):
    """``single``: the caller knows whether any argument is a range (None: look)."""
    raw_args = list(raw_args) + [None] * (len(fn.args) - len(raw_args))
    if fn.reduces_series:
        return _evaluate_series(fn, raw_args, null_date)
    if single is None:
        single = not any(isinstance(v, (tuple, list)) for v in raw_args)
    if single:
        return _evaluate_single(fn, raw_args, null_date)
    grids = [_as_grid(v, a.kind in _FLOAT_KINDS) for v, a in zip(raw_args, fn.args)]
    shapes = {g.shape for g in grids if g is not None}
    if len(shapes) > 1:
        dims = " and ".join(f"{r}x{c}" for r, c in sorted(shapes))
        raise SkyError(f"the ranges have different shapes ({dims}); give ranges of one shape")
    shape = shapes.pop()
    n = shape[0] * shape[1]
    # Each range's values row by row; one value for all rows stays one value (None here).
    flat = [None if grid is None else grid.reshape(-1) for grid in grids]

    out = np.full(n, "", dtype=object)
    first_row_arg = next(
        (k for k, a in enumerate(fn.args) if a.kind in registry.ROW_KINDS), None
    )
    groups = {}
    option_args = [(k, a) for k, a in enumerate(fn.args) if a.kind in registry.OPTION_KINDS]
    read = {}  # (argument, raw value) -> option value: a column rarely has many distinct

    def option(k, a, raw):
        # Keyed with the type: 0, 0.0 and False are equal as keys but not as input.
        memo = (k, type(raw), raw) if isinstance(raw, (str, float, int, type(None))) else None
        if memo is not None and memo in read:
            return read[memo]
        try:
            value = _read_option(a, raw)
        except SkyError as err:
            value = err
        if memo is not None:
            read[memo] = value
        return value

    # Each column's types, walked once (in C) for every reader of the column below.
    kinds_of = {k: {float} if flat[k].dtype.kind == "f" else set(map(type, flat[k]))
                for k, a in enumerate(fn.args)
                if a.kind in registry.ROW_KINDS and flat[k] is not None}
    if first_row_arg is not None and flat[first_row_arg] is not None:
        if type(None) in kinds_of[first_row_arg]:
            filled = np.not_equal(flat[first_row_arg], None)  # an empty row stays empty
        else:
            filled = np.ones(n, dtype=bool)
    elif first_row_arg is not None:
        filled = np.full(n, raw_args[first_row_arg] is not None)
    else:
        filled = np.ones(n, dtype=bool)
    if not any(grids[k] is not None for k, _ in option_args):
        # The usual column call: every option is one value for all rows.
        key = [None] * len(fn.args)
        try:
            for k, a in option_args:
                key[k] = _read_option(a, raw_args[k])
        except SkyError as err:
            out[filled] = PREFIX + str(err)
        else:
            groups[tuple(key)] = np.flatnonzero(filled)
    per_row_options = np.flatnonzero(filled) if any(
        grids[k] is not None for k, _ in option_args) else ()
    for i in per_row_options:
        key = [None] * len(fn.args)
        problem = None
        for k, a in option_args:
            value = option(k, a, raw_args[k] if flat[k] is None else flat[k][i])
            if isinstance(value, SkyError):
                problem = value
                break
            key[k] = value
        if problem is not None:
            out[i] = PREFIX + str(problem)
            continue
        groups.setdefault(tuple(key), []).append(i)

    null_jd = _null_jd(null_date)
    for key, members in groups.items():
        members = np.array(members)
        options = {a.name: key[k] for k, a in enumerate(fn.args) if a.kind in registry.OPTION_KINDS}
        whole = members.size == n  # the usual column: one group, every row filled
        rows = {a.name: (_one(raw_args[k]) if flat[k] is None
                         else flat[k] if whole else flat[k][members])
                for k, a in enumerate(fn.args) if a.kind in registry.ROW_KINDS}
        shared = frozenset(a.name for k, a in enumerate(fn.args)
                           if a.kind in registry.ROW_KINDS and grids[k] is None)
        found = _compute_group(
            fn, rows, options, null_jd, shared, members.size,
            {fn.args[k].name: kinds for k, kinds in kinds_of.items()} if whole else None)
        if whole:
            out = found
        else:
            out[members] = found

    if shape[1] == 1:  # one column: the row tuples made by zip, in C
        return tuple(zip(out if isinstance(out, list) else out.tolist()))
    return tuple(map(tuple, np.asarray(out, dtype=object).reshape(shape).tolist()))


class _FloatsQuiet:
    """``numpy.errstate(all="ignore")`` for the length of a call: bad rows are reported
    in their cells, not as warnings.  numpy 1.x (the office's own, in Debian 12) spends
    1.6 us a cell on errstate, which reads and writes its settings as a dict; its
    error object is read and set here as it stands (0.2 us).  numpy 2 has no error
    object, and its errstate is cheap."""

    __slots__ = ("_old",)
    _IGNORE_ALL = None
    if hasattr(np, "geterrobj"):
        with np.errstate(all="ignore"):
            _IGNORE_ALL = np.geterrobj()

    def __enter__(self):
        if self._IGNORE_ALL is None:
            self._old = np.errstate(all="ignore")
            self._old.__enter__()
        else:
            self._old = np.geterrobj()
            np.seterrobj(self._IGNORE_ALL)

    def __exit__(self, *exc):
        if self._IGNORE_ALL is None:
            self._old.__exit__(*exc)
        else:
            np.seterrobj(self._old)
        return False


def _hashable(args):
    try:
        hash(args)
        return True
    except TypeError:
        return False


_SOURCE_ARGS = {}  # method -> positions of its arguments that name an ephemeris source


def _kernel_stamps(fn, raw_args):
    """What the kernels named in a call hold now (ephemeris.content_stamp): part of the
    kept answer's key, so that a kernel replaced, added or removed on disk is read again
    and a message about a bad file goes once the file is mended."""
    where = _SOURCE_ARGS.get(fn.method)
    if where is None:
        where = _SOURCE_ARGS[fn.method] = tuple(
            k for k, arg in enumerate(fn.args)
            if arg.kind == "source" or arg.name == "source")  # SKY.EPHEMERIS: text
    if not where or where[0] >= len(raw_args):  # (none named: a cell leaving it out)
        return ()
    return tuple(ephemeris.content_stamp(raw_args[k]) for k in where
                 if k < len(raw_args) and isinstance(raw_args[k], str))


def _cell_key(fn, raw_args, null_date, stamps):
    """The key of a kept answer: everything that changes it.  The arguments (a tuple)
    and their types, since 1, 1.0 and True are one key but not one input; the null date
    (a tuple); what the kernels named hold now (_kernel_stamps)."""
    return (fn.method, tuple(map(type, raw_args)), raw_args, null_date, stamps)


# What Calc hands a single cell's arguments as (a number, a text, one left out) and
# what a Python caller may pass besides: a call of these alone is one cell and hashable,
# found so by one look at the set rather than a walk over the arguments.
_SCALAR_TYPES = frozenset((float, str, type(None), int, bool))


def evaluate(name_or_fn, raw_args, null_date=(1899, 12, 30)):
    """The value a cell shows: a number, a text, or a tuple of row tuples for ranges.

    Never raises for anything a user can type: problems come back as ``#SKY:`` text.
    """
    fn = name_or_fn if isinstance(name_or_fn, registry.CellFunction) else registry.BY_NAME[name_or_fn]
    if type(raw_args) is not tuple:
        raw_args = tuple(raw_args)
    if type(null_date) is not tuple:
        null_date = tuple(null_date)
    key = None
    plain = _SCALAR_TYPES.issuperset(map(type, raw_args))
    ranged = not plain and any(isinstance(v, (tuple, list)) for v in raw_args)
    if plain or (not ranged and _hashable(raw_args)):
        key = _cell_key(fn, raw_args, null_date, _kernel_stamps(fn, raw_args))
        hit = _SINGLE_CELL_CACHE.get(key)
        if hit is not None:
            return hit
    result = None
    lane = _lane_of(fn) if key is not None and not fn.reduces_series else None
    if lane is not None:  # a single cell's float lane (None: the usual path)
        # Not inside _FloatsQuiet: with numpy 1.x's error settings changed, each of the
        # lane's numpy and ERFA calls reads them back (a row of an altitude and an
        # azimuth 1.6 us slower in a loop, measured 2026-12-05).  The lane's steps on
        # floats raise rather than warn, its arrays are a segment's points, and a value
        # that is not a finite number goes the usual way, which is quiet.
        try:
            result = lane(raw_args, _null_jd(null_date))
        except Exception:  # (a message to give: the usual path gives it)
            result = None
    if result is None:
        try:
            with _FloatsQuiet():
                result = (_without_collection(_evaluate, fn, raw_args, null_date, False)
                          if ranged else _evaluate(fn, raw_args, null_date, True))
        except SkyError as err:
            result = PREFIX + str(err)
        except Exception as err:  # a defect of ours: say so in the cell, keep the office up
            result = f"{PREFIX}internal error ({type(err).__name__}: {err}); please report it"
            key = None
    if key is not None:
        _keep(key, result)
        if fn.fills_down:
            _fill_down(fn, raw_args, null_date, key)
    return result


def _without_collection(call, *args):
    """``call(*args)`` with Python's cyclic garbage collector held off, for a range: the
    row tuples made for the reply would set off collections that walk every object of
    the process, the office's too (an eighth of a 100,000-row column's time).  Nothing
    made here forms a cycle; the collector resumes as it was."""
    if not gc.isenabled():
        return call(*args)
    gc.disable()
    try:
        return call(*args)
    finally:
        gc.enable()


def _keep(key, result):
    _SINGLE_CELL_CACHE.keep(key, result)


# A formula filled down a column of days (=SKY.SUN.SET(A5;...) with A5 = A4+1) asks for
# one day per cell, each a call of its own with the fixed cost of a whole event search.
# When a cell finds the day before (or after) its own already answered with the same
# other arguments, the sheet is stepping through days: the next FILL_AHEAD days are
# computed in one column call and kept, so the cells below find their answers.  A
# column call gives each row the value it gives that row alone (tests/test_column_form),
# and the keys are those of the cells to come: the same arguments, the day moved by
# one, as Calc's own addition moves it.  A long column is met by longer blocks: where
# the block's length of cells behind is kept too, the next block is twice as long, up
# to a year of days (each block costs one cell computed alone and one column call, and
# a column call's rows come cheaper the more there are), as long as a block of that
# function is expected to take under FILL_BUDGET_S (the last block's cost a row).
FILL_AHEAD = 31
FILL_AHEAD_MOST = 366
FILL_BUDGET_S = 0.25
_ROW_SECONDS = {}  # method -> seconds a row of its last block took


def _block_length(fn, key_at, here, step):
    """Rows in the next block: FILL_AHEAD, doubled while the cells as far behind are kept
    and the block stays within FILL_AHEAD_MOST rows and FILL_BUDGET_S seconds."""
    size = FILL_AHEAD
    per_row = _ROW_SECONDS.get(fn.method)
    while (per_row is not None and 2 * size <= FILL_AHEAD_MOST
           and 2 * size * per_row <= FILL_BUDGET_S and key_at(here - step * size) in _SINGLE_CELL_CACHE):
        size *= 2
    return size


def _fill_down(fn, raw_args, null_date, key):
    k = next(i for i, a in enumerate(fn.args) if a.name == fn.fills_down)
    if k >= len(raw_args) or type(raw_args[k]) is not float:
        return
    moved = list(raw_args)

    def key_at(value):  # the key of the cell whose stepped argument holds ``value``
        moved[k] = value
        return _cell_key(fn, tuple(moved), null_date, key[4])

    here = raw_args[k]
    if key_at(here - 1.0) in _SINGLE_CELL_CACHE:
        step = 1.0
    elif key_at(here + 1.0) in _SINGLE_CELL_CACHE:
        step = -1.0
    else:
        return
    ahead, value = [], here
    for _ in range(_block_length(fn, key_at, here, step)):
        value = value + step
        if key_at(value) not in _SINGLE_CELL_CACHE:
            ahead.append(value)
    if len(ahead) < 2:
        return
    args = list(raw_args)
    args[k] = tuple((v,) for v in ahead)
    began = time.perf_counter()
    try:
        with _FloatsQuiet():
            found = _evaluate(fn, args, null_date)
    except Exception:  # noqa: BLE001 - the cells themselves will say what is wrong
        return
    _ROW_SECONDS[fn.method] = (time.perf_counter() - began) / len(ahead)
    for value, (result,) in zip(ahead, found):
        _keep(key_at(value), result)


def call_strict(name, args, null_date=(1899, 12, 30)):
    """Like ``evaluate`` but raising ``ValueError`` with the first ``#SKY:`` message."""
    if name not in registry.BY_NAME:
        raise ValueError(f'unknown function "{name}"')
    result = evaluate(name, args, null_date)
    cells = [c for row in result for c in row] if isinstance(result, tuple) else [result]
    for c in cells:
        if isinstance(c, str) and c.startswith(PREFIX):
            raise ValueError(c[len(PREFIX):])
    return result
