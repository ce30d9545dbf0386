"""Whole-column (range) calls equal the row-by-row calls, for every registered function.

The reference here is the scalar cell call itself: a range is only a faster way to
get the same cells, so the check is exact equality, message texts included, and a
bad row can never change a good one.
"""

from unittest import mock

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calcfuncs import cells, nodes, registry
from calcfuncs.cells import evaluate

# Pools of cell values per argument kind: good values, bad ones, empty (None) and
# values that are good for some options and bad for others.  No booleans: see
# test_single_cell_cache_keeps_booleans_apart for why they are kept out of the property.
TIME_POOL = [
    45371.129166666667,  # 2024-03-20 03:06 as a date-time cell
    42735.99999,  # late on 2016-12-31, a leap-second day
    23985.25,  # 1965-08-31, a 1960s UTC day
    0.0,  # 1899-12-30: fine on TT, before 1960 on UTC
    -150000.0,  # before 1582
    3.0e6,  # a JD typed as a number
    1e308,
    float("nan"),
    "2024-03-20T03:06:00Z",
    "2024-03-20 03:06:00.25",
    "2016-12-31T23:59:60.5Z",  # inside a leap second
    "1987-04-10",
    "1950-01-01",  # UTC before 1960
    "JD 2451545.0",
    "MJD 60389.129",
    "JD 1000000.0",  # year -1975: outside the IAU models
    "JD 2299160.5",
    "abc",
    "2024-13-01",
    "2024-03-20T03:06:00+01:00",
    "",
    None,
]
NUMBER_POOLS = {
    "jd": [2451545.0, 2460389.629166667, 2436934.5, 2400000.5, 2299160.5, 0.0, -1e12, 1e308,
           float("nan"), float("inf"), "2451545", "abc", None],
    "mjd": [60389.129166667, 51544.5, 36934.0, 0.0, -2400000.5, 1e308, float("-inf"), "x", None],
}
# Any other number: distances, vector components, proper motions, parallaxes, heights.
GENERAL_NUMBER_POOL = [0.0, 1.0, -2.5, 1.5e3, 250.0, 90.0, -1e4, 3e4, float("nan"), "abc", None]
REAL_POOL = [0.0, 10.0, 1013.25, -5.0, 2000.0, "abc", float("nan"), None]
ANGLE_POOL = [12.5, -23.4393, -0.00001, 359.99999, 1e7, float("inf"), float("nan"),
              "-23 26 21.4", "12h34m56.7s", "23 60 00", "abc", "", None]
TEXT_POOL = ["12h34m56.7s", "-23°26'21.4\"", "12 34 56.7", "12:34:56.7", "23.5 30", "bad",
             "", 15.0, -1.5, float("nan"), None]
COUNT_POOL = [0, 1, 2, 3.0, 6, 9, 10, -1, 2.5, "3", "x", float("inf"), None]
SECONDS_POOL = [0.0, 0.3, -0.5, 0.9, 1.5, "0.2", "abc", float("nan"), None]
CHOICE_EXTRAS = [None, 0.0, "bogus", 5.0, ""]
SOURCE_POOL = ["BUILTIN", "DE440", "de440", "/no/such/kernel.bsp", "bogus", 5.0, 0.0, "", None]


def pool(arg):
    if arg.kind == "time":
        return TIME_POOL
    if arg.kind == "number":
        return NUMBER_POOLS.get(arg.name, GENERAL_NUMBER_POOL)
    if arg.kind == "angle":
        return ANGLE_POOL
    if arg.kind == "text":
        return TEXT_POOL
    if arg.kind == "count":
        return COUNT_POOL
    if arg.kind == "seconds":
        return SECONDS_POOL
    if arg.kind == "real":
        return REAL_POOL
    if arg.kind == "source" or arg.name == "source":
        return SOURCE_POOL
    return list(arg.choices) + [arg.choices[-1].lower()] + CHOICE_EXTRAS


def first_row_arg(fn):
    return next(k for k, a in enumerate(fn.args) if a.kind in registry.ROW_KINDS)


def grid(values, rows, cols):
    return tuple(tuple(values[r * cols + c] for c in range(cols)) for r in range(rows))


@st.composite
def range_calls(draw, fn):
    """(args for the range call, per-cell scalar args, rows, cols)."""
    rows, cols = draw(st.integers(1, 6)), draw(st.integers(1, 3))
    n = rows * cols
    lead = first_row_arg(fn)
    # Mode A: the row argument is a range; mode B: it is one cell and some option is.
    lead_is_range = draw(st.booleans()) or len(fn.args) == 1
    n_given = draw(st.integers(lead + 1, len(fn.args)))  # trailing options left out
    raw, cells = [], [[] for _ in range(n)]
    some_range = False
    for k, arg in enumerate(fn.args[:n_given]):
        values = st.sampled_from(pool(arg))
        as_range = lead_is_range if k == lead else draw(st.integers(0, 2)) == 0
        if k == n_given - 1 and not lead_is_range and not some_range:
            as_range = True
        if as_range:
            column = [draw(values) for _ in range(n)]
            raw.append(grid(column, rows, cols))
            some_range = True
            for i in range(n):
                cells[i].append(column[i])
        else:
            v = draw(values)
            raw.append(v)
            for i in range(n):
                cells[i].append(v)
    return raw, cells, rows, cols, lead


# Every function that takes a cell value per row; the others take no argument at all.
ROW_FUNCTIONS = [f for f in registry.FUNCTIONS if any(a.kind in registry.ROW_KINDS for a in f.args)]


def test_every_function_is_covered():
    # The others take no argument at all, or reduce whole ranges to one value (their
    # own tests, e.g. test_varstars.py, check the ranges).
    assert all(f.args == () or f.reduces_series
               for f in registry.FUNCTIONS if f not in ROW_FUNCTIONS)
    assert len(ROW_FUNCTIONS) >= 17


@pytest.mark.parametrize("fn", ROW_FUNCTIONS, ids=lambda f: f.name)
@settings(max_examples=200, deadline=None)
@given(data=st.data())
def test_range_equals_row_by_row(fn, data):
    raw, cells, rows, cols, lead = data.draw(range_calls(fn))
    # Cells dense in time may take their places from kept nodes (nodes.for_one, within
    # its bounds: test_nodes.py); here every cell is computed as a column row is.
    with mock.patch.object(nodes, "DENSE_CELLS", 10**9):
        got = evaluate(fn, raw)
        expected = [
            # An empty cell of the row argument gives an empty cell back.
            "" if args[lead] is None else evaluate(fn, args)
            for args in cells
        ]
    assert got == grid(expected, rows, cols)
    for cell in expected:
        assert isinstance(cell, (float, str))
        assert not (isinstance(cell, str) and "internal error" in cell), cell


# ---- fixed cases ---------------------------------------------------------------------------------

def test_bad_row_does_not_spoil_the_column():
    # Rows 2 and 4 are bad; rows 1, 3, 5 are the scalar results exactly.
    column = (("2024-03-20T03:06:00Z",), ("2024-13-01",), ("JD 2451545.0",), ("abc",), (45371.5,))
    got = evaluate("SKY.MJD", [column, "UTC", "TT"])
    assert [type(r[0]) for r in got] == [float, str, float, str, float]
    for (value,), (result,) in zip(column, got):
        assert result == evaluate("SKY.MJD", [value, "UTC", "TT"])
    assert got[1][0].startswith('#SKY: "2024-13-01" has month 13')


def test_two_dimensional_range():
    times = (("2024-03-20T03:06:00Z", "1987-04-10", "JD 2451545.0"), ("bad", 45371.5, None))
    got = evaluate("SKY.OBLIQUITY", [times, "UTC", "IAU2006", "ARCSEC"])
    assert len(got) == 2 and all(len(r) == 3 for r in got)
    for r in range(2):
        for c in range(3):
            want = "" if times[r][c] is None else evaluate("SKY.OBLIQUITY", [times[r][c], "UTC", "IAU2006", "ARCSEC"])
            assert got[r][c] == want


def test_empty_cells_in_a_range_stay_empty():
    got = evaluate("SKY.TEXT.DMS", [((None,), (23.5,), (None,)), 1, "MARKS"])
    assert got == (("",), ("+23°30'00.0\"",), ("",))


def test_single_cell_range_returns_a_range():
    assert evaluate("SKY.WRAP.360", [((370.0,),)]) == ((10.0,),)


@pytest.mark.parametrize(
    "args",
    [
        [(("2024-03-20",), ("2024-03-21",)), (("TT",), ("TT",), ("TT",))],
        [(("2024-03-20", "2024-03-21"),), (("TT",), ("TT",))],
    ],
)
def test_ranges_of_different_shapes_give_one_message(args):
    got = evaluate("SKY.JD", args)
    assert isinstance(got, str) and got.startswith("#SKY: the ranges have different shapes")


def test_ragged_range_gives_one_message():
    got = evaluate("SKY.JD", [(("2024-03-20",), ("2024-03-21", "2024-03-22"))])
    assert got == "#SKY: the range is not rectangular"


def test_options_as_ranges():
    # A scale per row and a model per row, each row as its own scalar call.
    times = (("JD 2451545.0",), ("JD 2451545.0",), ("2024-03-20T03:06:00Z",), ("2024-03-20T03:06:00Z",))
    scales = (("TT",), ("TDB",), ("UTC",), ("TT",))  # the last row: Z text on TT is refused
    models = (("IAU2006",), ("IAU1980",), ("BOGUS",), ("LASKAR1986",))
    got = evaluate("SKY.OBLIQUITY", [times, scales, models])
    for i in range(4):
        assert got[i][0] == evaluate("SKY.OBLIQUITY", [times[i][0], scales[i][0], models[i][0]])
    assert isinstance(got[0][0], float) and isinstance(got[1][0], float)
    assert got[2][0].startswith('#SKY: unknown model "BOGUS"')
    assert got[3][0].startswith("#SKY: ") and "marked as UTC" in got[3][0]
    # An option range against a single time cell.
    got = evaluate("SKY.TEXT.ISO", ["2016-12-31T23:59:60.5Z", "UTC", (("UTC",), ("TAI",), ("TT",))])
    assert got == (("2016-12-31T23:59:60.500",), ("2017-01-01T00:00:36.500",), ("2017-01-01T00:01:08.684",))


# ---- a defect of the single-cell cache -------------------------------------------------------------

@pytest.mark.parametrize(
    "name, first, second",
    [
        ("SKY.WRAP.360", [1.0], [True]),  # a number, then a boolean (not a number)
        ("SKY.WRAP.360", [True], [1.0]),
        ("SKY.JD", ["2024-03-20", 0], ["2024-03-20", 0.0]),  # 0.0 means "default"; 0 is refused
    ],
)
def test_single_cell_cache_keeps_booleans_apart(name, first, second):
    cells._SINGLE_CELL_CACHE.clear()  # start from an empty cache, whatever ran before
    # Reference: the same cell computed without the cache (a one-cell range).
    fresh = evaluate(name, [((second[0],),)] + second[1:])[0][0]
    evaluate(name, first)
    assert evaluate(name, second) == fresh


@pytest.mark.parametrize(
    "name, lead, option_values",
    [
        # 0.0 (an empty option cell referenced directly) means the default scale; 0 and
        # False are not scale words.  Each cell must be read on its own.
        ("SKY.JD", "2024-03-20", [0.0, 0, 0.0]),
        ("SKY.OBLIQUITY", "JD 2451545.0", [0.0, False]),
    ],
)
def test_equal_but_different_option_values_in_one_column(name, lead, option_values):
    # Reference: each cell as a one-cell range (no single-cell cache involved).
    fresh = [evaluate(name, [((lead,),), ((v,),)])[0][0] for v in option_values]
    assert isinstance(fresh[0], float) and fresh[1].startswith("#SKY: ")
    column = tuple((v,) for v in option_values)
    got = evaluate(name, [tuple((lead,) for _ in option_values), column])
    assert [r[0] for r in got] == fresh
