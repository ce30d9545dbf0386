"""One search for every event: the instants where a smooth function of time crosses zero.

An event (an equinox, the Sun reaching a longitude, sunrise, a transit) is a function
f(tt1, tt2) of TT two-part JDs, sampled on a grid fine enough that it crosses zero at
most once between neighbours; each crossing is then narrowed by bisection.  Every event
in the add-in is a few lines on top of ``crossings``.
"""

import numpy as np

SHORT_BRACKET_DAYS = 0.04  # about an hour


def _extremum_samples(offsets, values, f, base):
    """Extra sample points at interior extrema whose neighbours share their sign.

    A function that pokes above zero for less than a step (the Sun just clearing the
    horizon near the polar night) leaves every sample on one side.  Where three samples
    make a peak or a trough, the vertex of the parabola through them is sampled too;
    if the function changes sign there, the crossings on both sides get brackets."""
    a, b, c = values[:-2], values[1:-1], values[2:]
    peak = ((b >= a) & (b >= c)) | ((b <= a) & (b <= c))
    same = (np.sign(a) == np.sign(b)) & (np.sign(b) == np.sign(c))
    idx = np.flatnonzero(peak & same & (a - 2.0 * b + c != 0.0))
    if not idx.size:
        return offsets, values
    h = offsets[idx + 2] - offsets[idx + 1]
    curvature = a[idx] - 2.0 * b[idx] + c[idx]
    shift = 0.5 * (a[idx] - c[idx]) / curvature * h
    vertex = offsets[idx + 1] + np.clip(shift, -h, h)
    f_vertex = f(np.full(vertex.shape, base), vertex)
    flips = np.sign(f_vertex) != np.sign(b[idx])
    if not np.any(flips):
        return offsets, values
    merged = np.concatenate([offsets, vertex[flips]])
    order = np.argsort(merged, kind="stable")
    return merged[order], np.concatenate([values, f_vertex[flips]])[order]


def crossings(f, start, end, step, direction=0, tolerance=1e-8, jump=None, extrema=False):
    """TT JDs (as (jd1, jd2) arrays) where ``f`` changes sign in [start, end].

    ``start`` and ``end`` are TT JDs (floats, one search) and ``step`` the sampling in
    days.  ``direction`` +1 keeps rising crossings only, -1 falling, 0 both.  For
    angle-like functions, ``jump`` rejects sign changes where the function leaps by more
    than that (a wrap from +180 to -180 is not a crossing).  The bisection stops when
    the bracket is under ``tolerance`` days (1e-8 day is under a millisecond).
    ``extrema`` also samples the vertices of sampled peaks and troughs, so that a brief
    excursion to the other side of zero between two samples is not missed.
    """
    n = max(2, int(np.ceil((end - start) / step)) + 1)
    base = np.floor(start) + 0.5
    offsets = np.linspace(start - base, end - base, n)
    values = f(np.full(n, base), offsets)
    if extrema and n >= 3:
        offsets, values = _extremum_samples(offsets, values, f, base)
    a, b = values[:-1], values[1:]
    change = (np.sign(a) != np.sign(b)) & (a != 0.0)
    if direction > 0:
        change &= b > a
    elif direction < 0:
        change &= b < a
    if jump is not None:
        change &= np.abs(b - a) < jump
    lo = offsets[:-1][change]
    hi = offsets[1:][change]
    f_lo = a[change]
    f_hi = b[change]
    # Bisection until the bracket is short, then false-position steps: on an hour-long
    # bracket a smooth function is a straight line to far below the tolerance, so two
    # or three steps replace the twenty-odd bisections that would remain.
    bracket = (lo, hi, f_lo, f_hi)
    while lo.size and np.max(bracket[1] - bracket[0]) > max(tolerance, SHORT_BRACKET_DAYS):
        mid = 0.5 * (bracket[0] + bracket[1])
        bracket = _keep_sign_change(bracket, mid, f(np.full(mid.shape, base), mid))
    lo, hi, f_lo, f_hi = bracket
    x = 0.5 * (lo + hi)
    if lo.size and np.max(hi - lo) > tolerance:
        for _ in range(6):
            lo, hi, f_lo, f_hi = bracket
            slope = np.where(f_hi != f_lo, (hi - lo) / (f_hi - f_lo), 0.0)
            new = np.clip(lo - f_lo * slope, lo, hi)
            settled = np.max(np.abs(new - x)) < 0.1 * tolerance
            x = new
            if settled:
                break
            bracket = _keep_sign_change(bracket, x, f(np.full(x.shape, base), x))
    return np.full(x.shape, base), x


def _keep_sign_change(bracket, x, f_x):
    """The half of each bracket (lo, hi, f_lo, f_hi) split at x that still holds the
    sign change."""
    lo, hi, f_lo, f_hi = bracket
    same = np.sign(f_x) == np.sign(f_lo)
    return (np.where(same, x, lo), np.where(same, hi, x),
            np.where(same, f_x, f_lo), np.where(same, f_hi, f_x))


def wrap180(degrees):
    """Angles in [-180, 180), for functions whose zero is an angle reached."""
    return np.mod(np.asarray(degrees) + 180.0, 360.0) - 180.0
