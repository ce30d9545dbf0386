"""Variable stars: phase, cycle and O - C against an ephemeris, and the time of a minimum.

Ephemeris (common practice of the trade): the n-th minimum (or maximum) falls at
T(E) = T0 + P E + Q E^2, with epoch T0, period P and an optional quadratic term Q for a
steadily changing period (dP/dE = 2Q).  For a time t the cycle count E solves T(E) = t;
the phase is its fractional part, the cycle number the nearest whole E, and O - C the
observed time minus the ephemeris at that cycle.  Times and ephemeris are in days on any
one basis (usually BJD_TDB or HJD): they must share it.

Time of minimum: the method of Kwee and van Woerden (1956, BAN 12, 327).  The light
curve is interpolated to equal steps; for a trial time T the branches are folded about
T and S(T), the sum of the squared magnitude differences of the folded pairs, is formed.
S is smallest at the time of symmetry.  A parabola S = A x^2 + B x + C through S at three
trial times one step apart gives the minimum at x = -B / 2A, with the uncertainty
sigma^2 = (4AC - B^2) / (4 A^2 (Z - 1)), Z the number of independent pairs: a quarter of
the observations used, as the paper has it (from memory).
"""

import numpy as np

from .errors import SkyError, rows_failing


def _check_ephemeris(period, quadratic):
    if np.any(np.asarray(period) <= 0):
        raise rows_failing(np.asarray(period) <= 0, "the period must be more than 0 days")


def cycles(time, epoch, period, quadratic=0.0):
    """The (fractional) cycle count E with T0 + P E + Q E^2 = time."""
    time, epoch, period, quadratic = np.broadcast_arrays(
        *(np.asarray(x, dtype=float) for x in (time, epoch, period, quadratic)))
    _check_ephemeris(period, quadratic)
    dt = time - epoch
    # The root that tends to dt / P as Q goes to 0, written without cancellation.
    disc = period * period + 4.0 * quadratic * dt
    if np.any(disc < 0):
        raise rows_failing(disc < 0, "the quadratic ephemeris never reaches this time "
                                     "(P^2 + 4 Q (t - T0) is negative)")
    return 2.0 * dt / (period + np.sqrt(disc))


def phase_cells(time, epoch, period, quadratic=0.0):
    e = cycles(time, epoch, period, quadratic)
    phase = e - np.floor(e)
    return np.where(phase >= 1.0, 0.0, phase)


def cycle_cells(time, epoch, period, quadratic=0.0):
    return np.floor(cycles(time, epoch, period, quadratic) + 0.5)


def o_minus_c_cells(time, epoch, period, quadratic=0.0):
    """O - C in days: the time minus the ephemeris at the nearest whole cycle."""
    n = cycle_cells(time, epoch, period, quadratic)
    time, epoch, period, quadratic = np.broadcast_arrays(
        *(np.asarray(x, dtype=float) for x in (time, epoch, period, quadratic)))
    return (time - epoch) - (period * n + quadratic * n * n)


# ---- Kwee and van Woerden --------------------------------------------------------------

MIN_ROWS = 8  # fewer cannot give a folded curve and three trial times
_COARSE_TRIALS = 200  # the first search for the fold samples this many trial times


def _fold_sum(grid_mag, centre, pairs):
    """S at grid index ``centre``: the sum over k = 1..pairs of the squared differences
    of the magnitudes k steps after and before."""
    k = np.arange(1, pairs + 1)
    d = grid_mag[centre + k] - grid_mag[centre - k]
    return float(np.dot(d, d))


def kwee_van_woerden(times, magnitudes):
    """(time of minimum, its uncertainty) from observations, by Kwee and van Woerden."""
    t = np.asarray(times, dtype=float)
    m = np.asarray(magnitudes, dtype=float)
    if t.size < MIN_ROWS:
        raise SkyError(f"at least {MIN_ROWS} observations are needed, {t.size} given")
    order = np.argsort(t, kind="stable")
    t, m = t[order], m[order]
    if np.any(np.diff(t) == 0):
        raise SkyError("two observations have the same time; average them first")
    n = t.size
    step = (t[-1] - t[0]) / (n - 1)
    origin = t[0]
    grid_mag = np.interp(origin + step * np.arange(n), t, m)

    def reach(c):  # pairs that fit about grid index c, one step kept spare each side
        return min(c - 1, n - 2 - c)

    # Trial centres with a fair share of the curve on both sides: a fold about a point
    # near either end compares a handful of rows and means nothing.
    least = max(3, n // 8)
    centres = np.arange(least + 1, n - least - 1)
    if centres.size == 0:
        raise SkyError("too few observations on both sides of any middle time")

    def mean_square(c):
        k = reach(c)
        return _fold_sum(grid_mag, c, k) / k

    coarse = centres[:: max(1, centres.size // _COARSE_TRIALS)]
    best = coarse[np.argmin([mean_square(c) for c in coarse])]
    spacing = max(1, centres.size // _COARSE_TRIALS)
    near = centres[(centres >= best - spacing) & (centres <= best + spacing)]
    best = int(near[np.argmin([mean_square(c) for c in near])])
    if best in (centres[0], centres[-1]):
        raise SkyError("the observations do not bracket a minimum: the best fold lies at "
                       "the edge of the rows")
    pairs = reach(best) - 1  # the same pairs for the three trial times
    s_before, s_at, s_after = (_fold_sum(grid_mag, c, pairs) for c in (best - 1, best, best + 1))
    a = (s_after + s_before - 2.0 * s_at) / (2.0 * step * step)
    b = (s_after - s_before) / (2.0 * step)
    c = s_at
    if a <= 0:
        raise SkyError("the folded curve has no minimum here (the light curve is not "
                       "symmetric about any time in the rows)")
    offset = -b / (2.0 * a)
    used = np.count_nonzero(np.abs(t - (origin + best * step)) <= pairs * step)
    z = used / 4.0
    if z <= 1.0:
        raise SkyError("too few observations around the minimum for an uncertainty")
    variance = (4.0 * a * c - b * b) / (4.0 * a * a * (z - 1.0))
    return origin + best * step + offset, float(np.sqrt(max(variance, 0.0)))


def minimum_cells(times, magnitudes):
    return kwee_van_woerden(times, magnitudes)[0]


def minimum_error_cells(times, magnitudes):
    return kwee_van_woerden(times, magnitudes)[1]
