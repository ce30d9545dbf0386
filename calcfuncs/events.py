"""One search for every event: the instants where a smooth function of time crosses zero.

An event (an equinox, the Sun reaching a longitude, sunrise, a transit) is a function
``f(jd1, jd2, row)`` of TT two-part JDs, where ``row`` says which search each instant
belongs to (so that per-row parameters, a site's latitude or a target longitude, are
taken as ``latitude[row]``).  Every search of a call is done in one pass over arrays:
all rows' windows are sampled together, on a grid fine enough that the function crosses
zero at most once between neighbours, in one call of ``f``; every sign change is
bracketed at once; all brackets are narrowed together, by bisection and then false
position.  The answers stay two-part JDs to the end.  Every event in the add-in is a few
lines on top of ``crossings``.
"""

import math

import numpy as np

from .bounded import keep
from .errors import RowErrors

SHORT_BRACKET_DAYS = 0.04  # about an hour


class Roots:
    """Instants found by a search: TT two-part JDs ``jd1 + jd2`` and the ``row`` (the
    search) each belongs to, ordered by row and, within a row, by time."""

    __slots__ = ("jd1", "jd2", "row")

    def __init__(self, jd1, jd2, row):
        self.jd1, self.jd2, self.row = jd1, jd2, row

    def __len__(self):
        return self.row.size

    def subset(self, keep):
        return Roots(self.jd1[keep], self.jd2[keep], self.row[keep])

    def after(self, jd1, jd2):
        """Mask of the roots later than per-row instants (two-part, indexed by row)."""
        return ((self.jd1 - jd1[self.row]) + (self.jd2 - jd2[self.row])) > 0.0

    def first(self, n, keep=None, last=False):
        """Per row of ``n``: (jd1, jd2, found) of the row's first root (``last``: its
        last) among those where ``keep`` holds; rows without one are not ``found`` and
        hold NaN."""
        idx = np.arange(self.row.size) if keep is None else np.flatnonzero(keep)
        if last:
            idx = idx[::-1]
        rows, at = np.unique(self.row[idx], return_index=True)
        jd1, jd2 = np.full(n, np.nan), np.full(n, np.nan)
        found = np.zeros(n, dtype=bool)
        jd1[rows], jd2[rows], found[rows] = self.jd1[idx[at]], self.jd2[idx[at]], True
        return jd1, jd2, found

    def joined(self, more, rows_of_more):
        """These roots and ``more`` (whose rows are indices into ``rows_of_more``) as one
        set, ordered by row and, within a row, by time."""
        jd1 = np.concatenate([self.jd1, more.jd1])
        jd2 = np.concatenate([self.jd2, more.jd2])
        row = np.concatenate([self.row, rows_of_more[more.row]])
        order = np.lexsort((jd2 + (jd1 - jd1.min() if jd1.size else 0.0), row))
        return Roots(jd1[order], jd2[order], row[order])

    def count(self, n, keep=None):
        """Per row of ``n``: how many roots (where ``keep`` holds)."""
        rows = self.row if keep is None else self.row[keep]
        return np.bincount(rows, minlength=n)


class Grid:
    """Samples of ``f`` over every row's window, flattened row after row: ``row``,
    ``offsets`` from the row's ``base`` (a JD at 0h, so ``base + offset`` is a two-part
    JD), ``values``; ``at_start`` is each row's value at its window's start."""

    __slots__ = ("base", "row", "offsets", "values", "at_start", "segment")

    def __init__(self, base, row, offsets, values, at_start):
        self.base, self.row, self.offsets, self.values = base, row, offsets, values
        self.at_start = at_start
        self.segment = None  # runs of neighbouring samples: the rows, unless sampled near


def evaluate(f, jd1, jd2, row, n):
    """``f(jd1, jd2, row)`` as floats; a ``RowErrors`` aligned with the samples becomes
    one aligned with the ``n`` rows (each row gets its first sample's message).  No
    sample (an estimate that crosses nowhere in any row): no call."""
    if np.size(row) == 0:
        return np.zeros(0)
    try:
        return np.asarray(f(jd1, jd2, row), dtype=float)
    except RowErrors as err:
        messages = np.ravel(err.messages)
        if messages.size != row.size:
            raise
        bad = np.flatnonzero(np.not_equal(messages, None))
        rows, at = np.unique(row[bad], return_index=True)
        out = np.full(n, None, dtype=object)
        out[rows] = messages[bad[at]]
        raise RowErrors(out) from None


def _grid_points(start, end, step):
    """Every row's sample points: (base, row, offsets, first, counts), ``base`` a JD at 0h
    per row, ``offsets`` from it, ``first`` the index of each row's first point."""
    start, end = np.broadcast_arrays(np.atleast_1d(np.asarray(start, dtype=float)),
                                     np.asarray(end, dtype=float))
    start, end = start.ravel(), end.ravel()
    counts = np.maximum(2, np.ceil((end - start) / step).astype(int) + 1)
    base = np.floor(start) + 0.5
    lo, hi = start - base, end - base
    row = np.repeat(np.arange(start.size), counts)
    first = np.cumsum(counts) - counts
    # Even spacing as numpy's linspace makes it, step index times spacing plus the start,
    # the end itself last: the same grid in a column as in a single cell.
    index = (np.arange(row.size) - first[row]).astype(float)
    offsets = index * ((hi - lo) / (counts - 1))[row] + lo[row]
    offsets[first + counts - 1] = hi
    return base, row, offsets, first, counts, start, end


def sample(f, start, end, step, extrema=False):
    """A ``Grid`` of ``f`` over the windows [start, end] (TT JDs, one per row), with
    samples ``step`` days apart or closer (the same count of even steps per row as the
    window holds whole steps, ends included)."""
    base, row, offsets, first, *_ = _grid_points(start, end, step)
    values = evaluate(f, base[row], offsets, row, base.size)
    grid = Grid(base, row, offsets, values, values[first])
    if extrema:
        _add_extremum_samples(grid, f)
    return grid


def sample_near(f, estimate, start, end, step, direction=0, jump=None, margin=2):
    """The part of ``sample``'s grid that matters: ``estimate`` (a cheap function with the
    same zeros to well within a step) is evaluated on every point, and ``f`` only on the
    points within ``margin`` steps of the estimate's sign changes.  The points are those
    of the full grid, so the brackets, and the roots refined from them, are the same as
    from the full grid whenever the estimate is right about where the sign changes are.
    It is checked: a row whose clusters of samples do not show ``f`` with the estimate's
    sign at both ends is sampled in full instead.  Each cluster is a segment of its own,
    so no bracket spans the unsampled gap between two clusters."""
    base, row, offsets, _first, _counts, start, end = _grid_points(start, end, step)
    n = base.size
    cheap = evaluate(estimate, base[row], offsets, row, n)
    a, b = cheap[:-1], cheap[1:]
    change = (row[:-1] == row[1:]) & (np.sign(a) != np.sign(b))
    if jump is not None:
        change &= np.abs(b - a) < jump
    keep = np.zeros(row.size, dtype=bool)
    for k in range(-margin, margin + 2):
        idx = np.flatnonzero(change) + k
        idx = idx[(idx >= 0) & (idx < row.size)]
        keep[idx[row[idx] == row[np.clip(idx - k, 0, row.size - 1)]]] = True
    # A cluster begins where a kept point follows a dropped one or starts its row.
    starts_segment = keep & (np.r_[True, ~keep[:-1]] | np.r_[True, row[1:] != row[:-1]])
    segment = np.cumsum(starts_segment)
    pick = np.flatnonzero(keep)
    values = evaluate(f, base[row[pick]], offsets[pick], row[pick], n)
    seg = segment[pick]
    ends = np.r_[True, seg[1:] != seg[:-1]] | np.r_[seg[:-1] != seg[1:], True]
    wrong = ends & (np.sign(values) != np.sign(cheap[pick]))
    bad_rows = np.unique(row[pick][wrong])
    grid = Grid(base, row[pick], offsets[pick], values, np.full(n, np.nan))
    grid.segment = seg
    if bad_rows.size:
        # The estimate misled on these rows: their full grids replace their clusters.
        try:
            full = sample(lambda j1, j2, r: f(j1, j2, bad_rows[r]), start[bad_rows],
                          end[bad_rows], step)
        except RowErrors as err:  # aligned with the rows sampled again: with all rows
            messages = np.full(n, None, dtype=object)
            messages[bad_rows] = np.ravel(err.messages)
            raise RowErrors(messages) from None
        full.row = bad_rows[full.row]
        grid = _merge_rows(grid, full, bad_rows)
    return grid


def _merge_rows(grid, full, rows):
    """``grid`` with the points of ``rows`` replaced by those of ``full``."""
    mine = ~np.isin(grid.row, rows)
    row = np.concatenate([grid.row[mine], full.row])
    offsets = np.concatenate([grid.offsets[mine], full.offsets])
    values = np.concatenate([grid.values[mine], full.values])
    segment = np.concatenate([grid.segment[mine], -1 - full.row])
    order = np.lexsort((offsets, row))
    merged = Grid(grid.base, row[order], offsets[order], values[order], grid.at_start)
    merged.segment = segment[order]
    return merged


def _add_extremum_samples(grid, f):
    """Extra sample points at interior extrema whose neighbours share their sign.

    A function that pokes above zero for less than a step (the Sun just clearing the
    horizon near the polar night) leaves every sample on one side.  Where three samples
    of a row make a peak or a trough, the vertex of the parabola through them is sampled
    too; if the function changes sign there, the crossings on both sides get brackets."""
    offsets, values, row = grid.offsets, grid.values, grid.row
    a, b, c = values[:-2], values[1:-1], values[2:]
    peak = ((b >= a) & (b >= c)) | ((b <= a) & (b <= c))
    same = (np.sign(a) == np.sign(b)) & (np.sign(b) == np.sign(c))
    idx = np.flatnonzero((row[:-2] == row[2:]) & peak & same & (a - 2.0 * b + c != 0.0))
    if not idx.size:
        return
    h = offsets[idx + 2] - offsets[idx + 1]
    curvature = a[idx] - 2.0 * b[idx] + c[idx]
    shift = 0.5 * (a[idx] - c[idx]) / curvature * h
    vertex = offsets[idx + 1] + np.clip(shift, -h, h)
    vertex_row = row[idx + 1]
    f_vertex = evaluate(f, grid.base[vertex_row], vertex, vertex_row, grid.base.size)
    flips = np.sign(f_vertex) != np.sign(b[idx])
    if not np.any(flips):
        return
    merged = np.concatenate([offsets, vertex[flips]])
    rows = np.concatenate([row, vertex_row[flips]])
    # By time within each row, a vertex after an equal sample (both sorts stable).
    order = np.argsort(merged, kind="stable")
    order = order[np.argsort(rows[order], kind="stable")]
    grid.offsets, grid.row = merged[order], rows[order]
    grid.values = np.concatenate([values, f_vertex[flips]])[order]


class Brackets:
    """Intervals [lo, hi] (offsets from ``base`` of their row) over which the function
    changes sign, with its values at both ends."""

    __slots__ = ("base", "row", "lo", "hi", "f_lo", "f_hi")

    def __init__(self, base, row, lo, hi, f_lo, f_hi):
        self.base, self.row = base, row
        self.lo, self.hi, self.f_lo, self.f_hi = lo, hi, f_lo, f_hi


def brackets(grid, direction=0, jump=None):
    """The sign changes between neighbouring samples of a row.  ``direction`` +1 keeps
    rising crossings only, -1 falling, 0 both; ``jump`` rejects changes where the
    function leaps by more than that (a wrap of an angle from +180 to -180)."""
    a, b = grid.values[:-1], grid.values[1:]
    runs = grid.row if grid.segment is None else grid.segment
    change = (runs[:-1] == runs[1:]) & (np.sign(a) != np.sign(b)) & (a != 0.0)
    if direction > 0:
        change &= b > a
    elif direction < 0:
        change &= b < a
    if jump is not None:
        change &= np.abs(b - a) < jump
    return Brackets(grid.base, grid.row[:-1][change], grid.offsets[:-1][change],
                    grid.offsets[1:][change], a[change], b[change])


def _group_max(values, group, n_groups):
    """Per element: the largest of ``values`` over the element's group."""
    top = np.full(n_groups, -np.inf)
    np.maximum.at(top, group, values)
    return top[group]


def refine(f, found, tolerance=1e-8, groups=None):
    """``Roots`` inside the ``Brackets``: bisection until every bracket of a group (a
    row, unless ``groups`` says otherwise) is under an hour, then false-position steps
    until the group's roots move by under a tenth of ``tolerance`` days (1e-8 day is
    under a millisecond).  A group's brackets take the same steps together, so an answer
    does not depend on what other rows are searched in the same call."""
    lo, hi, f_lo, f_hi = (np.array(v, dtype=float) for v in
                          (found.lo, found.hi, found.f_lo, found.f_hi))
    row = found.row
    base = found.base[row]
    n = found.base.size
    _, group = np.unique(row if groups is None else groups, return_inverse=True)
    n_groups = int(group.max()) + 1 if group.size else 0

    def split(active, x):
        """Keep the half of each active bracket, split at x, that holds the sign change."""
        f_x = evaluate(f, base[active], x, row[active], n)
        same = np.sign(f_x) == np.sign(f_lo[active])
        lo[active] = np.where(same, x, lo[active])
        hi[active] = np.where(same, hi[active], x)
        f_lo[active] = np.where(same, f_x, f_lo[active])
        f_hi[active] = np.where(same, f_hi[active], f_x)

    # Bisection until the bracket is short, then false-position steps: on an hour-long
    # bracket a smooth function is a straight line to far below the tolerance, so two
    # or three steps replace the twenty-odd bisections that would remain.
    short = max(tolerance, SHORT_BRACKET_DAYS)
    while True:
        active = _group_max(hi - lo, group, n_groups) > short
        if not np.any(active):
            break
        split(active, 0.5 * (lo[active] + hi[active]))
    x = 0.5 * (lo + hi)
    active = _group_max(hi - lo, group, n_groups) > tolerance
    for _ in range(6):
        if not np.any(active):
            break
        with np.errstate(divide="ignore", invalid="ignore"):
            slope = np.where(f_hi[active] != f_lo[active],
                             (hi[active] - lo[active]) / (f_hi[active] - f_lo[active]), 0.0)
        new = np.clip(lo[active] - f_lo[active] * slope, lo[active], hi[active])
        moved = np.zeros(x.shape)
        moved[active] = np.abs(new - x[active])
        settled = _group_max(moved, group, n_groups) < 0.1 * tolerance
        x[active] = new
        active &= ~settled
        if np.any(active):
            split(active, x[active])
    # False position crawls where the function is far from straight over the bracket (the
    # Sun or the Moon skimming the horizon, the crossing close to a turning point): the
    # brackets still unsettled are bisected to the tolerance.
    while np.any(active):
        active &= _group_max(hi - lo, group, n_groups) > tolerance
        if np.any(active):
            split(active, 0.5 * (lo[active] + hi[active]))
            x[active] = 0.5 * (lo[active] + hi[active])
    return Roots(base, x, row)


def crossings(f, start, end, step, direction=0, tolerance=1e-8, jump=None, extrema=False,
              estimate=None):
    """``Roots`` (TT two-part JDs and rows) where ``f(jd1, jd2, row)`` changes sign in
    each row's window [start, end] (TT JDs, arrays: one search per row).

    ``step`` is the sampling in days; ``direction`` +1 keeps rising crossings only, -1
    falling, 0 both.  For angle-like functions, ``jump`` rejects sign changes where the
    function leaps by more than that (a wrap from +180 to -180 is not a crossing).
    ``extrema`` also samples the vertices of sampled peaks and troughs, so that a brief
    excursion to the other side of zero between two samples is not missed.
    ``estimate``, a cheap function with the same zeros to well within a step, spares
    evaluating ``f`` away from them (``sample_near``); the roots are the same.
    """
    if estimate is not None and not extrema:
        grid = sample_near(f, estimate, start, end, step, direction, jump)
    else:
        grid = sample(f, start, end, step, extrema)
    return refine(f, brackets(grid, direction, jump), tolerance)


def polish(f, guesses, slope, n, tolerance=1e-8, steps=5, curvature=None, split=None):
    """Roots of ``f`` next to ``guesses`` (``Roots`` of a cheap function that follows
    ``f`` closely): a Newton step with the cheap function's ``slope`` (per guess, per
    day), then secant steps, each root on its own, until it moves by under a tenth of
    ``tolerance`` days.  Three or four evaluations of ``f`` per root where a bracketing
    search takes a dozen.  ``n``: how many rows the caller searches.

    ``curvature``: a bound on |f'' / 2f'| (per day) over the roots' neighbourhoods, for
    a smooth ``f``.  A secant step's error is at most that times the errors of its two
    points, which the two steps' sizes bound: a root whose secant step lands within a
    tenth of ``tolerance`` by that bound has settled, and the evaluation that would
    only confirm it is spared (two evaluations a root).

    ``split``: (cheap, slow, drift) where ``f`` is ``cheap + slow``, ``slow`` the costly
    part and changing by at most ``drift`` (f's unit) a day.  The guesses then take
    ``cheap`` alone, and ``slow`` from the Newton step's point, where it is computed
    anyway: one evaluation of ``slow`` a root fewer.  The first secant's slope is then
    off by at most ``drift`` over the slope itself, which the settling test counts.

    Returns (``Roots``, mask of the roots that settled); a root that did not settle, or
    moved by more than a day, is for the caller to search for by brackets."""
    jd1, row = guesses.jd1, guesses.row
    x0 = np.array(guesses.jd2, dtype=float)
    f0 = evaluate(f if split is None else split[0], jd1, x0, row, n)
    x1 = x0 - f0 / slope
    settled = np.zeros(x0.shape, dtype=bool)
    first = split is not None  # f0 is cheap's alone until the first step adds slow
    for _ in range(steps - 1):
        active = ~settled
        if not np.any(active):
            break
        f1 = np.zeros(x0.shape)
        if first:  # every root is active at the first step
            cheap, slow, drift = split
            later = evaluate(slow, jd1, x1, row, n)
            f1 = evaluate(cheap, jd1, x1, row, n) + later
            f0 = f0 + later  # off from f(x0) by at most drift |x1 - x0|
        else:
            f1[active] = evaluate(f, jd1[active], x1[active], row[active], n)
        with np.errstate(divide="ignore", invalid="ignore"):
            secant = np.where(x1 != x0, (f1 - f0) / (x1 - x0), slope)
        x2 = np.where(active, x1 - f1 / secant, x1)
        moved = np.abs(x2 - x1)
        done = moved < 0.1 * tolerance
        if curvature is not None:
            bound = curvature * moved * np.abs(x1 - x0)
            if first:
                with np.errstate(divide="ignore", invalid="ignore"):
                    bound = bound + moved * drift / np.abs(secant)
            done |= bound < 0.1 * tolerance
        settled |= active & done
        x0 = np.where(active, x1, x0)
        f0 = np.where(active, f1, f0)
        x1 = x2
        first = False
    good = settled & np.isfinite(x1) & (np.abs(x1 - guesses.jd2) < 1.0)
    return Roots(jd1, x1, row), good


ROUGH_STEPS = 3  # false-position steps on a cheap function's brackets


def _rough_roots(f, found):
    """The roots in ``Brackets`` of a cheap function, to about what it is good for:
    ROUGH_STEPS false-position steps (the last point not evaluated), no bisection.  On a
    bracket where the function is nearly straight (30 days of the Sun's longitude, a
    day of the Moon's elongation) each step shrinks the error by the bend over the
    bracket; a guess good to a small part of the cheap function's own error is all
    ``polish`` needs, where ``refine`` would spend eight evaluations reaching a
    millisecond of its root."""
    lo, hi, f_lo, f_hi = (np.array(v, dtype=float) for v in
                          (found.lo, found.hi, found.f_lo, found.f_hi))
    row = found.row
    base = found.base[row]
    for k in range(ROUGH_STEPS):
        # f_lo and f_hi differ in sign (f_lo is never zero): the division is safe.
        x = lo - f_lo * (hi - lo) / (f_hi - f_lo)
        if k == ROUGH_STEPS - 1 or not x.size:
            break
        f_x = evaluate(f, base, x, row, found.base.size)
        same = np.sign(f_x) == np.sign(f_lo)
        lo, f_lo = np.where(same, x, lo), np.where(same, f_x, f_lo)
        hi, f_hi = np.where(same, hi, x), np.where(same, f_hi, f_x)
    return Roots(base, x, row)


def polished_crossings(f, rough, start, end, step, direction=+1, jump=None, curvature=None,
                       tolerance=1e-8, split=None):
    """The crossings of ``f`` (as ``crossings`` finds them) found from those of
    ``rough``, a cheap function with the same zeros to well within a day:
    its own crossings, over windows a day wider, each polished on ``f`` by Newton and
    secant steps (``polish``; ``curvature`` as there), two to four evaluations of ``f``
    a root where brackets take a dozen (``split`` as there).  Rows where a step went
    astray are searched by brackets on ``f`` instead (``rough`` then only says where to
    sample)."""
    start, end = np.ravel(start), np.ravel(end)
    n = start.size
    grid = sample(rough, start - 1.0, end + 1.0, step)
    guesses = _rough_roots(rough, brackets(grid, direction, jump))
    # The rough function's slope at its roots, both sides in one call.
    count = len(guesses)
    ends = evaluate(rough, np.tile(guesses.jd1, 2),
                    np.concatenate([guesses.jd2 + 0.01, guesses.jd2 - 0.01]),
                    np.tile(guesses.row, 2), n)
    slope = (ends[:count] - ends[count:]) / 0.02
    found, settled = polish(f, guesses, slope, n, tolerance=tolerance, curvature=curvature,
                            split=split)
    inside = (((found.jd1 - start[found.row]) + found.jd2 >= 0.0)
              & ((found.jd1 - end[found.row]) + found.jd2 <= 0.0))
    unsure = np.unique(found.row[~settled])
    if unsure.size == 0:
        return found.subset(inside)
    again = crossings(lambda j1, j2, r: f(j1, j2, unsure[r]), start[unsure], end[unsure],
                      step, direction=direction, tolerance=tolerance, jump=jump,
                      estimate=lambda j1, j2, r: rough(j1, j2, unsure[r]))
    return found.subset(inside & ~np.isin(found.row, unsure)).joined(again, unsure)


def rising_and_falling(f, start, end, step, tolerance=1e-8, jump=None, extrema=False):
    """(rising ``Roots``, falling ``Roots``, each row's value at its window's start) from
    one sampling: the same answers as two ``crossings`` calls with ``direction`` +1 and
    -1 (each direction's brackets of a row are refined as a group of their own)."""
    grid = sample(f, start, end, step, extrema)
    up, down = brackets(grid, +1, jump), brackets(grid, -1, jump)
    both = Brackets(grid.base, *(np.concatenate([getattr(up, k), getattr(down, k)])
                                 for k in ("row", "lo", "hi", "f_lo", "f_hi")))
    groups = np.concatenate([2 * up.row + 1, 2 * down.row])
    roots = refine(f, both, tolerance, groups)
    rising = np.arange(len(roots)) < up.row.size
    return roots.subset(rising), roots.subset(~rising), grid.at_start


def wrap180(degrees):
    """Angles in [-180, 180), for functions whose zero is an angle reached."""
    return np.mod(np.asarray(degrees) + 180.0, 360.0) - 180.0


# ---- the next event after an instant, from canonical windows ---------------------------

# Searches kept across calls: (what, window start) -> the roots found in that window.
# A sheet asks "the next full Moon after" each instant of a log, one cell at a time; the
# instants of one block share a window whose roots are a function of the window alone,
# so every cell gets the answer a whole-column call gives, whichever cell came first.
WINDOW_CACHE_SIZE = 20_000
_WINDOWS = {}


def _search_each(search, starts, ends, rep):
    """``search`` over windows, as lists per window: (jd1, jd2) of its roots, or None and
    the message of a window that failed (a ``RowErrors`` of the search, per window; the
    other windows are searched again without it)."""
    count = len(starts)
    found, messages = [None] * count, [None] * count
    todo = list(range(count))
    while todo:
        try:
            roots = search(starts[todo], ends[todo], rep[todo])
        except RowErrors as err:
            per_window = np.ravel(err.messages)
            if per_window.size != len(todo) or all(m is None for m in per_window):
                raise
            for k, m in zip(todo, per_window):
                messages[k] = m
            todo = [k for k in todo if messages[k] is None]
            continue
        edges = np.searchsorted(roots.row, np.arange(len(todo) + 1))
        for j, k in enumerate(todo):
            found[k] = (roots.jd1[edges[j]:edges[j + 1]], roots.jd2[edges[j]:edges[j + 1]])
        break
    return found, messages


def _first_later(found, window_of, tt1, tt2):
    """Per row: (jd1, jd2, found) of the first root of its window later than its instant:
    each window's roots a row of a padded table, then every row at once."""
    n = tt1.size
    if n == 1 and found[window_of[0]] is not None:
        # One cell: the same comparison on Python floats, no padded table.
        t1, t2 = float(tt1[0]), float(tt2[0])
        for x1, x2 in zip(*(r.tolist() for r in found[window_of[0]])):
            if (x1 - t1) + (x2 - t2) > 0.0:
                return np.array([x1]), np.array([x2]), np.array([True])
        return np.array([np.nan]), np.array([np.nan]), np.array([False])
    width = max([1] + [f[0].size for f in found if f is not None])
    r1 = np.full((len(found), width), np.nan)
    r2 = np.zeros((len(found), width))
    for k, f in enumerate(found):
        if f is not None:
            r1[k, :f[0].size], r2[k, :f[0].size] = f
    c1, c2 = r1[window_of], r2[window_of]
    later = (c1 - tt1[:, None]) + (c2 - tt2[:, None]) > 0.0  # NaN padding: False
    first = np.argmax(later, axis=1)
    got = later[np.arange(n), first]
    pick = np.arange(n)
    return (np.where(got, c1[pick, first], np.nan), np.where(got, c2[pick, first], np.nan),
            got)


def first_after(search, tt1, tt2, block, reach, keys):
    """Per row: (jd1, jd2, found) of the first root later than the row's TT instant
    (``tt1 + tt2``), found by ``search(starts, ends, rep)`` (``Roots`` whose rows index
    the windows; ``rep``, a row of each window, for per-row parameters).

    A row's window starts on the ``block``-day grid at or below its instant and spans
    ``block + reach`` days, so it holds every root within ``reach`` days after the
    instant.  Rows with one window and one entry of ``keys`` (a hashable per row: the
    event and whatever else moves its roots) share one search, kept across calls.  A
    window the search refuses (its start before a kernel's span, say, up to ``block``
    days before the instant) leaves its rows to a window of their own from the instant
    itself, not kept; a ``RowErrors`` there is the rows' message."""
    tt1, tt2 = np.ravel(tt1), np.ravel(tt2)
    n = tt1.size
    if n == 1 and math.isfinite(tt1.item() + tt2.item()):
        # One cell whose window is kept: the same lookup on floats, no tables.
        found = _WINDOWS.get((keys[0], math.floor((tt1.item() + tt2.item()) / block) * block))
        if found is not None:
            return _first_later([found], [0], tt1, tt2)
    starts = np.floor((tt1 + tt2) / block) * block
    ids = {}
    window_of = np.empty(n, dtype=int)
    for i, wk in enumerate(zip(keys, starts.tolist())):
        window_of[i] = ids.setdefault(wk, len(ids))
    windows = list(ids)
    rep = np.zeros(len(windows), dtype=int)
    rep[window_of[::-1]] = np.arange(n)[::-1]  # the first row of each window
    found = [_WINDOWS.get(w) for w in windows]
    todo = np.array([k for k, f in enumerate(found) if f is None], dtype=int)
    refused = np.zeros(len(windows), dtype=bool)
    if todo.size:
        s = np.array([windows[k][1] for k in todo])
        fresh, messages = _search_each(search, s, s + (block + reach), rep[todo])
        for k, f, m in zip(todo, fresh, messages):
            if f is None:
                refused[k] = True
                continue
            found[k] = f
            keep(_WINDOWS, windows[k], f, WINDOW_CACHE_SIZE)
    jd1, jd2, got = _first_later(found, window_of, tt1, tt2)
    alone = np.flatnonzero(refused[window_of])
    if alone.size:
        t = tt1[alone] + tt2[alone]
        own, messages = _search_each(search, t, t + reach, alone)
        a1, a2, a_got = _first_later(own, np.arange(alone.size), tt1[alone], tt2[alone])
        jd1[alone], jd2[alone], got[alone] = a1, a2, a_got
        failed = np.full(n, None, dtype=object)
        failed[alone] = messages
        if np.any(np.not_equal(failed, None)):
            raise RowErrors(failed)
    return jd1, jd2, got
