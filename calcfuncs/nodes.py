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
directly.  A cell alone is computed directly too, unless it is one of a run of cells of
places filled down a log, computed one cell at a time: those share Chebyshev segments of
16 days instead (``for_one`` below, with their own bounds).
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


# ---- single cells of a log: Chebyshev segments ---------------------------------------------
#
# A log's column of places filled down is computed one cell at a time, each with its own
# call of the nutation series and the Earth's (about 18 and 15 us for a new instant with
# the office's numpy, and more inside Calc, whose own work between two cells evicts the
# series' 200 KB of tables from the processor's caches).  Inside ``single_cells()`` (the
# cell functions of places), a one-instant call notes its instant; once cells have asked
# for DENSE_CELLS distinct instants within one segment of SEGMENT_DAYS (TT, counted from
# J2000.0, so that every call shares the same segments), the segment's nutation and
# Earth are computed at its SEGMENT_POINTS Chebyshev points in one pass of numpy each
# (iau2000a.nutation_at_points, earth_theory.states_at_points: 6 and 4 us a point
# against 18 and 15 for an instant alone, their terms of periods over 40 days taken from
# long segments of 128 days, ``over_long_segment``), kept as Chebyshev coefficients, and
# every later cell of
# the segment takes its values from them: a cosine of twenty angles and one small
# matrix product.  A log of two instants a day pays the segment's twenty points once
# for its thirty-odd cells; a sheet of instants spread over the years never reaches the
# count, is computed directly and pays about 3 us a cell for the noting.  A segment
# next to one that reached the count is made at its first cell: a log filled down
# computes directly only the first cells of its first segment, not of every one (in
# Calc those cells had cost about as much as making the segments, 2026-12-05).  That
# does not pass on: a segment made so counts as dense for its neighbours only once it
# reaches the count itself, so a sparse stretch beside a dense one makes one segment.
# A place cell takes two quantities so (bodies._value_floats): the Earth's state, and the
# matrix of its coordinate system (frames.matrix_rows: the IAU 2006/2000A matrix of the
# dated systems, the nutation computed over the points with it), each a table of its own.
# Against the direct computation over random instants 1000-3000 (tests/test_nodes.py):
# the nutation and the matrices within 0.1 uas (0.06 and 0.07 measured: twenty points
# over sixteen days resolve the nutation's shortest terms, of five to nine days), the
# Earth's position within 1 m (the direct series' own rounding far from J2000, a few
# tenths of a metre, not the fit's) and its velocity within 1 um/s.
# The place of the Sun, the Moon, a planet or a two-body orbit goes one step further:
# once DENSE_CELLS instants have asked for one body's place in one system within a
# segment (``quantity_is_dense``: counted per place, so that one cell of a rare body in
# a log of others computes its own), the place itself is a quantity with its own
# segment, its unit vector computed at the points as a cell alone computes it, and a
# cell takes it as one interpolation and two arctangents: within 0.5 uas of the direct
# place over 1900-2100, 3 uas over 1000-3000 (where the direct place itself jitters by
# its theory's rounding); the Moon's, on a grid of 32 points (GRIDS), within 1 and 5.
# A segment in which a planet's apparent place comes within 3 degrees of the Sun (the
# bending of its light there changes too sharply to be interpolated), or whose last
# coefficients exceed 1e-12, is declined (bodies._place_at_points) and its cells take
# the first way.
# A cell can therefore give either the direct value or the segment's, which differ by
# those bounds: each is a function of the instant alone, and which one a cell shows
# depends on the cells computed before it, twelve digits down.

SEGMENT_DAYS = 16.0
SEGMENT_POINTS = 20
SEGMENT_ORIGIN = 2451545.0  # J2000.0 TT: segments start at whole days, exact in a double
DENSE_CELLS = 3   # distinct instants asked for in a segment before it is made
# Bounded: at most SEGMENTS_KEPT coefficient tables (at most 20 x 22 floats, a site's
# parameters: 3.5 KB) and SEGMENTS_NOTED segments (and as many places in segments) of
# asked instants (at most DENSE_CELLS each); the values at AT_POINTS_KEPT segments' or
# runs' points shared between quantities (shared_at_points: the nutation's 40 floats a
# segment, the Earth's 240, a place's 60) and LONG_SEGMENTS_KEPT long segments' tables:
# 10.5 MB with all of them full (tracemalloc, a log of 100,000 rows over 4,300 segments
# in five columns: the Sun's longitude and declination, Mars's right ascension, the
# Moon's longitude and an altitude at a site, 2026-12-05).
SEGMENTS_KEPT = 4_000
SEGMENTS_NOTED = 4_000

_ORDERS = np.arange(SEGMENT_POINTS, dtype=float)
_ANGLES = np.pi * (np.arange(SEGMENT_POINTS) + 0.5) / SEGMENT_POINTS
_POINT_DAYS = (np.cos(_ANGLES) + 1.0) * (SEGMENT_DAYS / 2.0)  # days from the segment's start
_POINT_DAYS.flags.writeable = False  # (shared_at_points knows the points by this array)
# Values at the points -> coefficients (the discrete cosine transform of Chebyshev
# interpolation at the points of the first kind).
_TO_COEFFICIENTS = (2.0 / SEGMENT_POINTS) * np.cos(np.outer(_ORDERS, _ANGLES))
_TO_COEFFICIENTS[0] /= 2.0

# A row of a log asks for one instant in several columns (a longitude, a declination,
# the Moon beside the Sun), and Calc computes a sheet column by column: a single cell's
# nutation and Earth (about 18 and 15 us) are kept for the next column's cell of the
# same row, for the last INSTANTS_KEPT instants (frames.nutation_one, _dated_one,
# ephemeris.earth_and_sun_floats and _earth_and_sun_one, horizon._astrom_one and, for a
# body's other columns, bodies._direction_floats, _orbit_direction_floats and
# _direction_one, and a target's observed place, horizon._observed_one; 19.3 MB when
# the first eight are full, measured with tracemalloc, 2026-12-05; the ninth holds
# tuples of four floats).
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



class _Grid:
    """The Chebyshev points (of the first kind) of a segment for ``points`` points: days
    from the segment's start (read-only: shared_at_points knows a grid's points by this
    array), the orders, and the transform from values at the points to coefficients."""

    def __init__(self, points):
        self.points = points
        self.orders = np.arange(points, dtype=float)
        angles = np.pi * (np.arange(points) + 0.5) / points
        self.days = (np.cos(angles) + 1.0) * (SEGMENT_DAYS / 2.0)
        self.days.flags.writeable = False
        self.to_coefficients = (2.0 / points) * np.cos(np.outer(self.orders, angles))
        self.to_coefficients[0] /= 2.0
        self.last = (None, None, None)  # the last instant's T_k: (jd1, jd2, array)
        self.runs = {1: self.days}  # segments in a run -> its points' days (run_days)

    def run_days(self, count):
        """The days of the points of ``count`` segments in a row, from the first one's
        start (one array for each count, read-only: known by identity, as ``days``)."""
        found = self.runs.get(count)
        if found is None:
            found = (np.arange(count)[:, None] * SEGMENT_DAYS + self.days).ravel()
            found.flags.writeable = False
            self.runs[count] = found
            _RUNS_BY_DAYS[id(found)] = (self, count)
        return found


# The usual grid, and a finer one for the Moon's place (bodies.py: its place moves
# through its perturbations' short periods; 32 points over 16 days hold it within
# 0.5 uas where 20 leave 1 mas).
_RUNS_BY_DAYS = {}  # id of a run's days -> (its grid, its segments); the arrays live in grids
GRIDS = {points: _Grid(points) for points in (SEGMENT_POINTS, 32)}
_GRID = GRIDS[SEGMENT_POINTS]
assert np.array_equal(_GRID.days, _POINT_DAYS)
_GRID.days = _GRID.runs[1] = _POINT_DAYS
for _grid in GRIDS.values():
    _RUNS_BY_DAYS[id(_grid.days)] = (_grid, 1)


def run_of(days):
    """(grid, segments) of a run's days (``_Grid.run_days``, the very array a segment's
    ``compute`` is handed: one segment's ``days`` or a run's), or None for other days."""
    return _RUNS_BY_DAYS.get(id(days))



def on_usual_grid(days):
    """Whether ``days`` are the usual grid's points of a segment or a run of segments
    (the very array a segment's ``compute`` is handed), whose values other quantities
    share (``shared_at_points``); another grid's (the Moon's) take such quantities from
    their segments instead."""
    found = _RUNS_BY_DAYS.get(id(days))
    return found is not None and found[0] is _GRID


_SEGMENTS = {}   # (quantity, segment) -> Chebyshev coefficients (its grid's points, k)
_AT_POINTS = {}  # (name, segment's start) -> values at its points (shared_at_points)
AT_POINTS_KEPT = 256  # (an entry holds a run's points: up to eight segments')
_ASKED = {}      # segment -> distinct instants asked for in it
_ASKED_OF = {}   # (quantity, segment) -> distinct instants asked for it (quantity_is_dense)
_IN_CELLS = [0]
_LAST_ONE = [(None, None, None, False)]  # the last instant: (jd1, jd2, segment, dense)


def forget_single_cells():
    """Empty what single cells have kept and noted (a benchmark's cold start)."""
    _SEGMENTS.clear()
    _AT_POINTS.clear()
    _LONG.clear()
    for grid in GRIDS.values():
        grid.last = (None, None, None)
    _ASKED.clear()
    _ASKED_OF.clear()
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
    """``compute(jd1, jd2)`` -> (n, k) at a one-row instant inside ``single_cells()``,
    from its segment's coefficients where the cells are dense around it, as (1, k); None
    otherwise (the caller computes directly).  ``quantity`` names what ``compute`` gives
    (its segments are keyed by it); ``compute`` takes flat arrays of instants."""
    if not _IN_CELLS[0] or jd1.size != 1:
        return None
    t1, t2 = jd1.item(), jd2.item()
    if _dense_cell(t1, t2) is None:
        return None
    return _interpolated(quantity, compute, t1, t2).reshape(np.shape(jd1) + (-1,))


def from_nodes(quantity, compute, t1, t2, points=SEGMENT_POINTS):
    """``for_one``'s values (a list of k floats) at an instant (floats) of which
    ``cell_is_dense`` has just said yes: a place on floats (bodies._direction_floats).
    None where ``compute`` declined the segment (gave values there that are not all
    numbers: a body too near the Sun for its place to be interpolated,
    bodies._place_at_points).  ``points``: the grid
    (GRIDS) of the quantity's segments, which ``compute`` is handed."""
    found = _interpolated(quantity, compute, t1, t2, GRIDS[points])
    return None if found is None else found.tolist()


def segment_at(quantity, compute, start, days):
    """(n, k): a quantity of the usual grid (``for_one``'s) at another grid's points of a
    segment or a run of them (``days``, as handed to a segment's ``compute``, from
    ``start``, its first instant), from the quantity's own segments (made as one run
    where none of them is): the Earth and a matrix at the Moon's points."""
    grid, count = run_of(days)
    first = _segment_of(start, 0.0)
    tables = _run_coefficients(quantity, compute, first, count)
    at = _AT_OTHER_GRID.get(grid.points)
    if at is None:  # T_k at the other grid's points of one segment
        x = np.clip(grid.days * (2.0 / SEGMENT_DAYS) - 1.0, -1.0, 1.0)
        at = _AT_OTHER_GRID[grid.points] = np.cos(np.outer(np.arccos(x), _ORDERS))
    if count == 1:
        return at @ tables[0]
    return np.concatenate([at @ table for table in tables])


_AT_OTHER_GRID = {}


def _run_coefficients(quantity, compute, first, count):
    """The usual grid's coefficients of ``quantity`` over ``count`` segments from
    ``first``: those not kept made in one run (_make_run) where they lie in a row, one
    by one otherwise."""
    missing = [s for s in range(first, first + count) if (quantity, s) not in _SEGMENTS]
    if len(missing) > 1 and missing[-1] - missing[0] == len(missing) - 1 and (
            missing[0] // LONG_SEGMENT_OF == missing[-1] // LONG_SEGMENT_OF):
        _make_run(quantity, compute, missing[0], len(missing), _GRID)
    return [_coefficients(quantity, compute, s, _GRID) for s in range(first, first + count)]


_DECLINED = np.zeros(0)  # kept for a segment whose compute declined it


def chebyshev_tail(values, days):
    """The last three Chebyshev coefficients of values (n, k) at the points ``days`` of
    a segment or a run of them (as handed to a segment's ``compute``), each segment's:
    (segments, 3, k), the size of what the interpolation leaves out."""
    grid, count = run_of(days)
    return np.einsum("ij,sjk->sik", grid.to_coefficients[-3:],
                     values.reshape(count, grid.points, -1))


def _segment_of(t1, t2):
    """The segment (its number from J2000.0) that holds the TT instant ``t1 + t2``."""
    return math.floor(((t1 - SEGMENT_ORIGIN) + t2) / SEGMENT_DAYS)


def _coefficients(quantity, compute, segment, grid):
    """The kept coefficients of ``quantity`` over ``segment`` (made at ``grid``'s points if
    none are kept, with the rest of its run where a log moves on into it), or
    _DECLINED."""
    coefficients = _SEGMENTS.get((quantity, segment))
    if coefficients is None:
        first, count = _run_ahead(quantity, segment)
        if count > 1:
            _make_run(quantity, compute, first, count, grid)
            return _SEGMENTS[(quantity, segment)]
        start = SEGMENT_ORIGIN + segment * SEGMENT_DAYS
        _keep_tables(quantity, segment, grid, compute(np.full(grid.points, start), grid.days))
        coefficients = _SEGMENTS[(quantity, segment)]
    return coefficients


# A log filled down moves from one segment into the next: when a segment is wanted whose
# neighbour of the same quantity is made, the segments from it on to the end of its long
# segment (or back to its start, for a log going back in time) are made in one run, all
# their points in one call of the quantity's computation.  Much of a segment's cost is
# numpy's and ERFA's cost a call, not a point: a place's segment with its Earth and
# matrix alone and in runs of eight, the long segments made, the Sun's 225 -> 164 us a
# segment, the Moon's 435 -> 304, Mars's 332 -> 193, a minor planet's 674 -> 264
# (measured 2026-12-05, the office's Python), the nutation's 612 terms at the points
# being most of what is left.  A run stays within one long segment (so its
# slow terms come from one, ``over_long_segment``) and stops at a segment already made;
# a computation declines the segments of a run one by one (a place near the Sun,
# bodies._place_at_points: not a number over them).  At most LONG_SEGMENT_OF - 1
# segments are made that a log ends before: one run's worth, about two segments' cost.


def _run_ahead(quantity, segment):
    """(first segment, segments) of the run to make for ``segment``: from it to the end
    of its long segment if the segment before is made, from the start of its long
    segment to it if the one after is, and it alone otherwise; either stops at a
    segment already made."""
    place = segment % LONG_SEGMENT_OF
    if (quantity, segment - 1) in _SEGMENTS:
        count = LONG_SEGMENT_OF - place
        for k in range(1, count):
            if (quantity, segment + k) in _SEGMENTS:
                return segment, k
        return segment, count
    if (quantity, segment + 1) in _SEGMENTS:
        count = place + 1
        for k in range(1, count):
            if (quantity, segment - k) in _SEGMENTS:
                return segment - k + 1, k
        return segment - count + 1, count
    return segment, 1


def _make_run(quantity, compute, first, count, grid):
    """Make and keep ``count`` segments of ``quantity`` from ``first`` at once."""
    start = SEGMENT_ORIGIN + first * SEGMENT_DAYS
    _keep_tables(quantity, first, grid,
                 compute(np.full(count * grid.points, start), grid.run_days(count)))


def _keep_tables(quantity, first, grid, values):
    """Keep the coefficients of the segments from ``first`` whose values at ``grid``'s
    points are ``values`` (segments x points, k); a segment whose values are not all
    numbers (its computation declined it) as _DECLINED."""
    count = len(values) // grid.points
    per_segment = values.reshape(count, grid.points, -1)
    tables = np.einsum("ij,sjk->sik", grid.to_coefficients, per_segment)
    finite = np.isfinite(per_segment).all(axis=(1, 2))
    for k in range(count):  # (copies: a table dropped frees its own memory, not a view's)
        keep(_SEGMENTS, (quantity, first + k), tables[k].copy() if finite[k] else _DECLINED,
             SEGMENTS_KEPT)


def _interpolated(quantity, compute, t1, t2, grid=_GRID):
    segment = _segment_of(t1, t2)
    coefficients = _coefficients(quantity, compute, segment, grid)
    if coefficients is _DECLINED:
        return None
    last = grid.last
    if last[0] == t1 and last[1] == t2:  # the same cell's other quantity
        polynomials = last[2]
    else:  # x in [-1, 1] over the segment; T_k(x) = cos(k arccos x)
        start = SEGMENT_ORIGIN + segment * SEGMENT_DAYS
        x = min(1.0, max(-1.0, ((t1 - start) + t2) * (2.0 / SEGMENT_DAYS) - 1.0))
        polynomials = np.cos(grid.orders * math.acos(x))
        grid.last = (t1, t2, polynomials)
    return polynomials.dot(coefficients)


# What varies slowly over a segment (the nutation's terms of periods over 40 days) is
# computed at the points of a long segment, LONG_SEGMENT_OF segments, and interpolated
# from it at each segment's points: the same Chebyshev points and transform over eight
# times the span.  Long segments start at J2000.0 too, so a segment lies in one of them.
LONG_SEGMENT_OF = 8
LONG_SEGMENTS_KEPT = 512  # tables of SEGMENT_POINTS x k floats (k = 2 for the nutation)
_LONG_POINT_DAYS = _POINT_DAYS * LONG_SEGMENT_OF
# A segment's points within its long segment, for each of its LONG_SEGMENT_OF places
# there: the Chebyshev polynomials T_k at them (SEGMENT_POINTS x SEGMENT_POINTS).
_WITHIN_LONG = [np.cos(np.outer(np.arccos(
    (place * SEGMENT_DAYS + _POINT_DAYS) * (2.0 / (SEGMENT_DAYS * LONG_SEGMENT_OF)) - 1.0),
    _ORDERS)) for place in range(LONG_SEGMENT_OF)]
_LONG = {}  # (quantity, long segment) -> Chebyshev coefficients


def over_long_segment(quantity, compute, jd1, jd2):
    """``compute(jd1, jd2)`` -> (n, k) at a segment's points or a run's of the usual grid
    (the arrays ``_interpolated`` hands a segment's ``compute``), interpolated from the
    points of the long segment that holds them; None for any other instants (the caller
    computes them directly)."""
    run = _RUNS_BY_DAYS.get(id(jd2))
    if run is None or run[0] is not _GRID:
        return None
    segment = round((float(jd1[0]) - SEGMENT_ORIGIN) / SEGMENT_DAYS)
    long_segment, place = divmod(segment, LONG_SEGMENT_OF)
    coefficients = _LONG.get((quantity, long_segment))
    if coefficients is None:
        start = SEGMENT_ORIGIN + long_segment * (SEGMENT_DAYS * LONG_SEGMENT_OF)
        coefficients = _TO_COEFFICIENTS @ compute(np.full(SEGMENT_POINTS, start),
                                                  _LONG_POINT_DAYS)
        keep(_LONG, (quantity, long_segment), coefficients, LONG_SEGMENTS_KEPT)
    return _within_long(place, run[1]) @ coefficients


def _within_long(place, count):
    """T_k at the points of ``count`` segments from the ``place``-th of a long segment."""
    found = _WITHIN_LONG_RUNS.get((place, count))
    if found is None:
        found = _WITHIN_LONG_RUNS[(place, count)] = np.vstack(_WITHIN_LONG[place:place + count])
    return found


_WITHIN_LONG_RUNS = {}


def shared_at_points(name, compute, jd1, jd2):
    """``compute(jd1, jd2)`` at a segment's points (the arrays ``_interpolated`` hands a
    segment's ``compute``), kept under ``name`` for the segments of other quantities over
    the same points; computed afresh for any other instants."""
    run = _RUNS_BY_DAYS.get(id(jd2))
    if run is None:
        return compute(jd1, jd2)
    key = (name, float(jd1[0]), run[0].points, run[1])
    found = _AT_POINTS.get(key)
    if found is None:
        found = compute(jd1, jd2)
        keep(_AT_POINTS, key, found, AT_POINTS_KEPT)
    return found


def cell_is_dense(t1, t2):
    """Whether a one-instant call at ``t1 + t2`` (floats) takes its values from a
    segment (``for_one``), the instant noted as ``for_one`` notes it: a place on floats
    asks first (bodies.rows_on_floats), and then takes its values ``from_nodes``."""
    return bool(_IN_CELLS[0]) and _dense_cell(t1, t2) is not None


def _dense_cell(t1, t2):
    """The segment of an instant asked for by a cell, if the cells are dense in it (its
    values then come from the segment's coefficients); None otherwise.  Each instant is
    noted once: the same cell's other quantities find it as the last one."""
    last = _LAST_ONE[0]
    if last[0] == t1 and last[1] == t2:  # the same cell's other quantity
        return last[2] if last[3] else None
    if not math.isfinite(t1 + t2):
        return None
    segment = _segment_of(t1, t2)
    dense = _note(segment, t1, t2)
    _LAST_ONE[0] = (t1, t2, segment, dense)
    return segment if dense else None


def _note(segment, t1, t2):
    """Note an instant asked for in ``segment``; whether the cells are dense in it
    (DENSE_CELLS distinct instants asked for in it, or in a segment next to it)."""
    asked = _ASKED.get(segment)
    if asked is None:
        asked = set()
        keep(_ASKED, segment, asked, SEGMENTS_NOTED)
    if len(asked) >= DENSE_CELLS:  # (no more kept: the count is all that is asked of it)
        return True
    asked.add((t1, t2))
    return (len(asked) >= DENSE_CELLS or _counted_dense(segment - 1)
            or _counted_dense(segment + 1))


def quantity_is_dense(quantity, t1, t2):
    """For an instant of which ``cell_is_dense`` has just said yes: whether ``quantity``
    itself (a body's place in a system) is taken from a segment of its own there: one is
    made for it in this segment or the next or last one (a log filled down), or
    DENSE_CELLS distinct instants have asked for it in this one.  Counted per quantity, so
    that one cell of a rare body among a dense log of others computes directly rather than
    making a segment for itself."""
    segment = _LAST_ONE[0][2]
    key = (quantity, segment)
    if (key in _SEGMENTS or (quantity, segment - 1) in _SEGMENTS
            or (quantity, segment + 1) in _SEGMENTS):
        return True
    asked = _ASKED_OF.get(key)
    if asked is None:
        asked = set()
        keep(_ASKED_OF, key, asked, SEGMENTS_NOTED)
    asked.add((t1, t2))
    return len(asked) >= DENSE_CELLS


def _counted_dense(segment):
    """Whether DENSE_CELLS distinct instants were asked for in ``segment`` itself."""
    asked = _ASKED.get(segment)
    return asked is not None and len(asked) >= DENSE_CELLS
