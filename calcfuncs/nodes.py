"""Slowly varying quantities over a column of instants: computed exactly at a few
instants (nodes) and interpolated between them.

A column from an observing log holds many instants a day, and the costly parts of a
place (the IAU 2000A nutation series, about 19 us an instant, and the Earth's state
from ERFA epv00's series, about 16 us: iau2000a.py, earth_theory.py) change smoothly on a scale of days.  Nodes sit on TT
half-day marks (exact in one double, so neighbouring rows and later calls share them);
each instant takes the polynomial through the six nodes around it (Lagrange), two
before its half day and three after.  Against the direct computation over dense
random instants 1000-3000 (tests/test_nodes.py): the nutation within 1.5 uas (1.13
measured), the Earth's position within 0.5 m (0.41) and its velocity within 3 um/s
(2.1).

A column is interpolated only when it is dense: fewer distinct nodes than a quarter of
its rows.  A short column, or instants spread over the centuries, are computed
directly.  A cell alone is computed directly too, unless it is one of a dense run of
cells of places (``for_one`` below: a log filled down, computed one cell at a time).
An interpolated value differs from ERFA's own by the bounds above, far below the stated
accuracy of every model involved (the built-in theories are good to tens of
milliarcseconds, the nutation model to a fraction of a milliarcsecond).
"""

import math
from functools import lru_cache

import numpy as np

from .bounded import keep

SPACING = 0.5   # days between nodes
NODES = 6       # nodes around each instant
BEFORE = 2      # nodes before the half day that holds the instant
DENSE_RATIO = 4  # rows per distinct node, at least, before a column is interpolated

@lru_cache(maxsize=None)
def _denominators(points):
    """Each node's Lagrange denominator: the product of its distances to the others."""
    return np.array([np.prod([k - j for j in range(points) if j != k])
                     for k in range(points)], dtype=float)


_DENOMINATORS_LIST = _denominators(NODES).tolist()


def weights(x, points=NODES):
    """Lagrange weights (rows x points) at ``x``, in node steps from the first node: for
    each node the product of the gaps to the other nodes, over its own denominator."""
    gaps = x[:, None] - np.arange(points, dtype=float)[None, :]
    before = np.ones((x.size, points + 1))
    after = np.ones((x.size, points + 1))
    before[:, 1:] = np.cumprod(gaps, axis=1)
    after[:, :-1] = np.cumprod(gaps[:, ::-1], axis=1)[:, ::-1]
    return before[:, :-1] * after[:, 1:] / _denominators(points)


class Nodes:
    """The nodes of a set of instants (TT or TDB, two-part JDs, any shape): ``unique``
    holds the distinct node instants, ``index`` (rows x NODES) each row's nodes among
    them, ``origin`` each row's first node."""

    def __init__(self, jd1, jd2, cells=None):
        self.shape = np.shape(jd1)
        self.jd1 = np.ravel(jd1)
        self.jd2 = np.ravel(jd2)
        if cells is None:
            cells = _half_days(self.jd1, self.jd2)
        cell = cells[0][cells[1]]
        # The distinct nodes: every half day's six, merged.
        around = (cells[0][:, None] + np.arange(-BEFORE, NODES - BEFORE)[None, :]) * SPACING
        self.unique, where = np.unique(around, return_inverse=True)
        self.index = where.reshape(around.shape)[cells[1]]
        self.origin = (cell - BEFORE) * SPACING
        self._weights = None

    def interpolate(self, values):
        """Per row, the polynomial through its nodes' ``values`` (distinct nodes x k)."""
        if self._weights is None:  # the same for every quantity over these instants
            self._weights = weights(((self.jd1 - self.origin) + self.jd2) / SPACING)
        out = np.einsum("mk,mkc->mc", self._weights, values[self.index])
        return out.reshape(self.shape + values.shape[1:])


def _half_days(jd1, jd2):
    """(distinct half days, each row's index among them) of flat two-part JDs."""
    return np.unique(np.floor((jd1 + jd2) / SPACING), return_inverse=True)


# The last dense column's nodes: the nutation and the Earth's state of one column are
# asked for the same instants (TT, which the built-in theories take for TDB), and
# finding the nodes (two sorts) costs as much as interpolating.
_LAST = [None]


def dense(jd1, jd2):
    """The ``Nodes`` of the instants if interpolating them is worth it, else None."""
    n = np.size(jd1)
    if n < 4 * DENSE_RATIO * NODES:
        return None
    flat1, flat2 = np.ravel(jd1), np.ravel(jd2)
    last = _LAST[0]
    if (last is not None and last.shape == np.shape(jd1) and np.array_equal(last.jd1, flat1)
            and np.array_equal(last.jd2, flat2)):
        return last
    if not np.all(np.isfinite(flat1 + flat2)):
        return None
    # A cheap first look: the distinct half days bound the distinct nodes from below.
    cells = _half_days(flat1, flat2)
    if cells[0].size * DENSE_RATIO > n:
        return None
    nodes = Nodes(flat1.copy(), flat2.copy(), cells)
    nodes.shape = np.shape(jd1)
    if nodes.unique.size * DENSE_RATIO > n:
        return None
    _LAST[0] = nodes
    return nodes


def over_nodes(compute, jd1, jd2):
    """``compute(jd1, jd2)`` -> array (..., k), interpolated over nodes for a dense
    column and computed directly otherwise."""
    nodes = dense(jd1, jd2)
    if nodes is None:
        return compute(jd1, jd2)
    at_nodes = compute(nodes.unique, np.zeros(nodes.unique.shape))
    return nodes.interpolate(at_nodes)


# ---- single cells of a log ------------------------------------------------------------
#
# A log's column of places filled down is computed one cell at a time, each with its own
# call of the nutation series and the Earth's (about 19 and 16 us for a new instant with
# the office's numpy, a quarter of a place cell).  Inside ``single_cells()`` (the cell functions of places), a one-instant
# call notes its instant; once cells have asked for DENSE_CELLS distinct instants within
# the five half days around one, it is interpolated from its six nodes (those not yet
# kept computed, in one call, and kept), as a dense column is.  A log of nine instants
# a day: SKY.SUN.LON 156 -> 122 us a cell (bench/bench_core.py, its log rows); a
# sparse sheet never reaches the count, is computed directly and pays about 5 us a
# cell for the noting.
# A cell can therefore give either ERFA's own value or the interpolated one, which
# differ by the bounds above (1.5 uas, 0.5 m): each is a function of the instant alone,
# and which one a cell shows depends on the cells computed before it, twelve digits down.

DENSE_CELLS = 8        # distinct instants asked for near a half day before its nodes are made
# Bounded: at most NODES_KEPT node values (each at most 12 floats), NODES_KEPT / 6 stacks
# of six and HALF_DAYS_KEPT half days of asked instants (at most DENSE_CELLS each): 15 MB
# when every one is full (measured with tracemalloc over 200,000 instants).
NODES_KEPT = 20_000
HALF_DAYS_KEPT = 2_000

# A row of a log asks for one instant in several columns (a longitude, a declination,
# the Moon beside the Sun), and Calc computes a sheet column by column: a single cell's
# nutation and Earth (about 18 and 15 us) are kept for the next column's cell of the
# same row, for the last INSTANTS_KEPT instants (frames.nutation_one, _dated_one,
# ephemeris.earth_and_sun_floats and _earth_and_sun_one, horizon._astrom_one and, for a
# body's other columns, bodies._direction_floats, _orbit_direction_floats and
# _direction_one; 19.3 MB when all eight are full, measured with tracemalloc,
# 2026-12-05).
INSTANTS_KEPT = 4096
_KEPT_PER_INSTANT = []  # the kept functions (kept_per_instant)


def kept_per_instant(func):
    """``func`` of one instant (floats) with its last INSTANTS_KEPT results kept."""
    kept = lru_cache(maxsize=INSTANTS_KEPT)(func)
    _KEPT_PER_INSTANT.append(kept)
    return kept


def forget_kept_instants():
    for kept in _KEPT_PER_INSTANT:
        kept.cache_clear()


_AT_NODE = {}   # (quantity, node instant) -> values at the node
_STACKS = {}    # (quantity, half day) -> its six nodes' values, stacked
_ASKED = {}     # half day -> distinct instants asked for in it
_IN_CELLS = [0]
_LAST_ONE = [(None, None, None, False)]  # the last instant: (jd1, jd2, half day, dense)


def forget_single_cells():
    """Empty what single cells have kept and noted (a benchmark's cold start)."""
    _AT_NODE.clear()
    _STACKS.clear()
    _ASKED.clear()
    _LAST_ONE[0] = (None, None, None, False)
    forget_kept_instants()


class _SingleCells:
    """``single_cells()``: a class rather than a generator (a third of the cost, which a
    cell pays each time)."""

    __slots__ = ()

    def __enter__(self):
        _IN_CELLS[0] += 1

    def __exit__(self, *exc):
        _IN_CELLS[0] -= 1
        return False


_SINGLE_CELLS = _SingleCells()


def single_cells():
    """Within: one-instant calls may be interpolated (``for_one``)."""
    return _SINGLE_CELLS


def for_one(quantity, compute, jd1, jd2):
    """``compute(jd1, jd2)`` -> (1, k) interpolated over kept nodes, for a one-row instant
    inside ``single_cells()`` where the cells are dense around it; None otherwise (the
    caller computes directly).  ``quantity`` names what ``compute`` gives (its kept
    nodes are keyed by it)."""
    if not _IN_CELLS[0] or jd1.size != 1:
        return None
    t1, t2 = jd1.item(), jd2.item()
    if _dense_cell(t1, t2) is None:
        return None
    return _interpolated(quantity, compute, t1, t2).reshape(np.shape(jd1) + (-1,))


def from_nodes(quantity, compute, t1, t2):
    """``for_one``'s values (a list of k floats) at an instant (floats) of which
    ``cell_is_dense`` has just said yes: a place on floats (bodies._direction_floats)."""
    return _interpolated(quantity, compute, t1, t2).tolist()


def _interpolated(quantity, compute, t1, t2):
    cell = math.floor((t1 + t2) / SPACING)  # as _dense_cell finds it
    stack = _STACKS.get((quantity, cell))
    if stack is None:
        stack = _stack(quantity, compute, cell)
    first = (cell - BEFORE) * SPACING
    return np.dot(_weights_at(((t1 - first) + t2) / SPACING), stack)


def cell_is_dense(t1, t2):
    """Whether a one-instant call at ``t1 + t2`` (floats) is interpolated from kept nodes
    (``for_one``), the instant noted as ``for_one`` notes it: a place on floats asks
    first (bodies.rows_on_floats), and then takes its values ``from_nodes``."""
    return bool(_IN_CELLS[0]) and _dense_cell(t1, t2) is not None


def _dense_cell(t1, t2):
    """The half day of an instant asked for by a cell, if the cells are dense around it
    (its nodes are then interpolated); None otherwise.  Each instant is noted once: the
    same cell's other quantities find it as the last one."""
    last = _LAST_ONE[0]
    if last[0] == t1 and last[1] == t2:  # the same cell's other quantity
        return last[2] if last[3] else None
    if not math.isfinite(t1 + t2):
        return None
    cell = math.floor((t1 + t2) / SPACING)
    dense = _note(cell, t1, t2)
    _LAST_ONE[0] = (t1, t2, cell, dense)
    return cell if dense else None


def _note(cell, t1, t2):
    """Note an instant asked for in the half day ``cell``; whether the cells are dense
    around it (DENSE_CELLS distinct instants asked for in the five half days)."""
    asked = _ASKED.get(cell)
    if asked is None:
        asked = set()
        keep(_ASKED, cell, asked, HALF_DAYS_KEPT)
    if len(asked) >= DENSE_CELLS:  # (no more kept: the count is all that is asked of it)
        return True
    asked.add((t1, t2))
    if len(asked) >= DENSE_CELLS:
        return True
    get = _ASKED.get
    return (len(asked) + len(get(cell - 2, ())) + len(get(cell - 1, ())) + len(get(cell + 1, ()))
            + len(get(cell + 2, ()))) >= DENSE_CELLS


def _stack(quantity, compute, cell):
    """The six nodes' values (6, k) around the half day ``cell``, kept."""
    at = [(cell + k) * SPACING for k in range(-BEFORE, NODES - BEFORE)]
    values = [_AT_NODE.get((quantity, t)) for t in at]
    todo = [t for t, v in zip(at, values) if v is None]
    if todo:
        fresh = compute(np.array(todo), np.zeros(len(todo)))
        for t, v in zip(todo, fresh):
            keep(_AT_NODE, (quantity, t), v, NODES_KEPT)
        found = dict(zip(todo, fresh))
        values = [found[t] if v is None else v for t, v in zip(at, values)]
    stack = np.array(values)
    keep(_STACKS, (quantity, cell), stack, NODES_KEPT // NODES)
    return stack


def _weights_at(x):
    """``weights`` at one point, in plain floats (a tenth of the array version's cost)."""
    gaps = [x - j for j in range(NODES)]
    out = []
    for k in range(NODES):
        p = 1.0
        for j in range(NODES):
            if j != k:
                p *= gaps[j]
        out.append(p / _DENOMINATORS_LIST[k])
    return np.array(out)
