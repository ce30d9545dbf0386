"""The Earth's heliocentric and barycentric state from the series of ERFA epv00 (a
simplified VSOP2000, good to a few km over 1900-2100: see ephemeris.py), evaluated with
numpy one instant at a time where that is the faster way.

Why not always ERFA's own routine: its 1,951 terms each take a cosine and a sine from
the C library, whose branches depend on the argument, so on distinct instants (a log's
rows) a call costs about 43 us, where a timing loop over one instant shows 24.  numpy
1.24 on a processor with AVX-512 (Debian 12's numpy, the office's own there) computes
float64 sines and cosines in vector registers: the same series, its arguments formed
exactly as ERFA forms them (b + c t), takes about 16 us.  numpy 2 computes them one at a
time, more slowly than the C library (85 us): there ERFA's routine is kept.  Which one a
process uses is decided once, by numpy's version and the processor's features
(``evaluation_for``).  The two agree within 7e-15 au (1 mm) in position and 8e-17
au/day in velocity over 1000-3000 (tests/test_earth_theory.py: the rounding of sums of
some 500 terms, and 1-ulp differences between sine routines), against the series' own
error of kilometres.

A column is evaluated instant by instant with the same function, so that a row of a
column and the same instant in a cell alone agree to the bit.
"""

import importlib

import erfa
import numpy as np

from . import nodes
from .earth_series import ROTATION, TERMS
from .vocabulary import J2000_JD

_DAYS_PER_YEAR = 365.25  # the series' time unit, the Julian year


def _tables():
    rows = []
    for line in TERMS.splitlines():
        name, a, b, c = line.split()
        # Ordered by the power of t, then by the sum the term belongs to (Sun to Earth
        # x, y, z; barycentre to Sun x, y, z): each power's sums are runs of terms.
        rows.append((int(name[1]), "es".index(name[0]) * 3 + "xyz".index(name[2]),
                     float(a), float(b), float(c)))
    rows.sort(key=lambda r: (r[0], r[1]))
    power, group, a, b, c = (np.array(v) for v in zip(*rows))
    key = power * 6 + group
    starts = np.flatnonzero(np.r_[True, key[1:] != key[:-1]])
    assert key[starts].tolist() == list(range(18))  # every table has terms
    return a, b, c, a * c, starts, key


_A, _B, _C, _AC, _STARTS, _KEYS = _tables()
_R = ROTATION
# Ecliptic series axes -> BCRS (its first element is exactly 1, the third row's first 0, as
# ERFA applies it).
_ROWS = ((1.0, _R["am12"], _R["am13"]),
         (_R["am21"], _R["am22"], _R["am23"]),
         (0.0, _R["am32"], _R["am33"]))


def states_one(tdb1, tdb2):
    """[barycentric p, v of the Earth, barycentric p, v of the Sun], each a list of
    three floats, au and au/day, BCRS axes, at one TDB instant (two-part JD, floats)."""
    t = ((tdb1 - J2000_JD) + tdb2) / _DAYS_PER_YEAR
    arg = _C * t
    arg += _B
    # Per term a cos(b + c t) and a c sin(b + c t); summed by power of t and by axis.
    terms = np.empty((2, _A.size))
    np.multiply(_A, np.cos(arg), out=terms[0])
    np.multiply(_AC, np.sin(arg), out=terms[1])
    sums = np.add.reduceat(terms, _STARTS, axis=1).tolist()
    p, q = sums[0], sums[1]
    # Sum of a t^k cos(b + c t) over the terms of each power k and axis, and its rate:
    # k t^(k-1) a cos(b + c t) - t^k a c sin(b + c t).  Plain floats from here on: on
    # six numbers numpy's calls would cost more than the arithmetic.
    t2, r = t * t, _ROWS
    position = [p[k] + t * p[6 + k] + t2 * p[12 + k] for k in range(6)]
    velocity = [(p[6 + k] + 2.0 * t * p[12 + k] - (q[k] + t * q[6 + k] + t2 * q[12 + k]))
                / _DAYS_PER_YEAR for k in range(6)]
    out = []
    for x, y, z in ((position[0] + position[3], position[1] + position[4],
                     position[2] + position[5]),
                    (velocity[0] + velocity[3], velocity[1] + velocity[4],
                     velocity[2] + velocity[5]),
                    position[3:], velocity[3:]):
        out.append([x + r[0][1] * y + r[0][2] * z, r[1][0] * x + r[1][1] * y + r[1][2] * z,
                    r[2][1] * y + r[2][2] * z])
    return out


def _states_numpy(tdb1, tdb2):
    """The same over arrays of instants (any one shape): each instant by states_one."""
    tdb1, tdb2 = np.broadcast_arrays(np.asarray(tdb1, dtype=float), np.asarray(tdb2, dtype=float))
    out = np.empty((4,) + tdb1.shape + (3,))
    flat = out.reshape(4, -1, 3)
    for k, (a, b) in enumerate(zip(tdb1.ravel().tolist(), tdb2.ravel().tolist())):
        flat[:, k] = states_one(a, b)
    return out[0], out[1], out[2], out[3]


def states_vector(tdb1, tdb2):
    """(n, 12): barycentric p, v of the Earth, then of the Sun, at n TDB instants (flat
    two-part JDs) in one pass over all of them, where the bits need not be states_one's.
    With numpy's vectorised sines (``chosen``) the series as one array of instants by
    terms; otherwise ERFA's routine over the array."""
    if chosen() != "numpy":
        return np.concatenate(_states_erfa(tdb1, tdb2), axis=-1)
    return _states_of_terms(_years(tdb1, tdb2), _ALL_TERMS)


def _years(tdb1, tdb2):
    return ((np.asarray(tdb1, dtype=float) - J2000_JD)
            + np.asarray(tdb2, dtype=float)) / _DAYS_PER_YEAR


def _terms(selected):
    """The series' terms ``selected`` (a mask): a, b, c, a c, where each run of terms of
    one sum starts, and which of the 18 sums (power of t by axis) each run is."""
    keys = _KEYS[selected]
    starts = np.flatnonzero(np.r_[True, keys[1:] != keys[:-1]])
    return _A[selected], _B[selected], _C[selected], _AC[selected], starts, keys[starts]


_ALL_TERMS = _terms(np.ones(_A.size, dtype=bool))


def _states_of_terms(t, terms):
    """(n, 12): the states of ``terms`` alone at n instants (t Julian years from J2000):
    the series is linear in its terms, so the states of two sets add up to theirs."""
    a, b, c, ac, starts, sums = terms
    arg = np.multiply.outer(t, c)
    arg += b
    waves = np.empty((2, t.size, a.size))
    np.cos(arg, out=waves[0])
    waves[0] *= a
    np.sin(arg, out=waves[1])
    waves[1] *= ac
    if sums.size == 18:
        p, q = np.add.reduceat(waves, starts, axis=2)  # (n, 18) each, as in states_one
    else:
        p, q = np.zeros((2, t.size, 18))
        p[:, sums], q[:, sums] = np.add.reduceat(waves, starts, axis=2)
    t = t[:, None]
    position = p[:, 0:6] + t * p[:, 6:12] + t * t * p[:, 12:18]
    velocity = (p[:, 6:12] + 2.0 * t * p[:, 12:18]
                - (q[:, 0:6] + t * q[:, 6:12] + t * t * q[:, 12:18])) / _DAYS_PER_YEAR
    rotation = np.array(_ROWS).T
    return np.concatenate([v @ rotation for v in (
        position[:, 0:3] + position[:, 3:6], velocity[:, 0:3] + velocity[:, 3:6],
        position[:, 3:6], velocity[:, 3:6])], axis=1)


# At a segment's points (nodes.py) the terms of periods of FAST_PERIOD_DAYS and more
# (1,805 of the 1,951) are interpolated from a long segment's points
# (nodes.over_long_segment), and only the others (146, the Moon's pull on the Earth) are
# evaluated at the segment's own: 78 us for a segment's points against 178.  Against
# ERFA epv00 at the points over 1000-3000: 0.26 m and 0.05 um/s (tests/test_nodes.py),
# the series' own rounding far from J2000 (the fit's error is far below: more points
# over the long segment do not change it).
FAST_PERIOD_DAYS = 40.0
_FAST = np.abs(_C) > 2.0 * np.pi * _DAYS_PER_YEAR / FAST_PERIOD_DAYS
_FAST_TERMS = _terms(_FAST)
_SLOW_TERMS = _terms(~_FAST)


def _slow_states(tdb1, tdb2):
    return _states_of_terms(_years(tdb1, tdb2), _SLOW_TERMS)


def states_at_points(tdb1, tdb2):
    """``states_vector`` at a segment's points, its slow terms from their long segment
    (with numpy whichever evaluation the process has chosen: these bits need not be
    states_one's); ``states_vector`` itself at any other instants."""
    slow = nodes.over_long_segment("epv00, terms over 40 days", _slow_states, tdb1, tdb2)
    if slow is None:
        return states_vector(tdb1, tdb2)
    return _states_of_terms(_years(tdb1, tdb2), _FAST_TERMS) + slow


def _states_erfa(tdb1, tdb2):
    """ERFA epv00's own: its ufunc, whose status is only ever a warning (outside the
    series' 1900-2100 fit), read and dropped."""
    pvh, pvb, _ = erfa.ufunc.epv00(tdb1, tdb2)
    return pvb["p"], pvb["v"], pvb["p"] - pvh["p"], pvb["v"] - pvh["v"]


def evaluation_for(numpy_version, avx512_skx):
    """"numpy" or "erfa": the evaluation for a numpy version (its text) on a processor
    with or without AVX-512 (numpy's feature AVX512_SKX: Skylake-X and later).  numpy 1.24
    (measured) computes float64 sines and cosines in vector registers there, taking them
    from Intel's SVML; numpy 1.25 turned that off again (numpy pull request 23925).  A
    rule, not a timing, so that every process of one installation (a cluster's workers
    too) makes the same choice and gives the same bits."""
    try:
        version = tuple(int(part) for part in numpy_version.split(".")[:2])
    except ValueError:
        return "erfa"
    return "numpy" if version == (1, 24) and avx512_skx else "erfa"


def processor_has_avx512_skx():
    """Whether numpy finds the processor feature AVX512_SKX (numpy 1 and 2 keep their
    table of features in different modules)."""
    for module in ("numpy._core._multiarray_umath", "numpy.core._multiarray_umath"):
        try:
            features = importlib.import_module(module).__cpu_features__
        except (ImportError, AttributeError):
            continue
        return bool(features.get("AVX512_SKX"))
    return False


_CHOSEN = []  # "numpy" or "erfa", once a process


def chosen():
    if not _CHOSEN:
        _CHOSEN.append(evaluation_for(np.__version__, processor_has_avx512_skx()))
    return _CHOSEN[0]


def states(tdb1, tdb2):
    """(barycentric p, v of the Earth; barycentric p, v of the Sun) at TDB instants (two-
    part JDs of one shape): arrays (..., 3), au and au/day, BCRS axes."""
    if chosen() == "numpy":
        return _states_numpy(tdb1, tdb2)
    return _states_erfa(tdb1, tdb2)


def states_floats(tdb1, tdb2):
    """``states`` at one instant (floats) as four lists of three floats: Earth p, v, Sun
    p, v (a cell's place on floats, bodies.sun_rows)."""
    if chosen() == "numpy":
        return states_one(tdb1, tdb2)
    pvh, pvb, _ = erfa.ufunc.epv00(tdb1, tdb2)
    ep, ev = pvb["p"].tolist(), pvb["v"].tolist()
    hp, hv = pvh["p"].tolist(), pvh["v"].tolist()
    # The Sun as ``_states_erfa`` gives it: barycentric minus heliocentric Earth.
    return [ep, ev, [a - b for a, b in zip(ep, hp)], [a - b for a, b in zip(ev, hv)]]
