"""The IAU 2000A nutation, adjusted to IAU 2006, evaluated with numpy one instant at a
time: the model of ERFA nut06a, within 1e-6 micro-arcseconds of it (tests/test_iau2000a.py).

Why not ERFA's own routine: its 1,365 terms each take a sine and a cosine from the C
library, whose branches depend on the argument, so on distinct instants (a log's rows)
a call costs about 55 us, twice what a timing loop over one instant shows.  Here the
terms' arguments are a small matrix product and a line of arithmetic, their sines and
cosines four calls of numpy's functions, and the sums two more products: 19 us an
instant with the office's numpy 1.24 (whose float64 sine and cosine are vectorised),
about ERFA's time with numpy 2.4 (whose are not).  A column is evaluated instant by
instant with the same function, so a row of a column and the same instant in a cell
alone agree to the bit.

The series (nutation_series.py, with its source) is that of Mathews, Herring and
Buffett (2002), IERS Conventions (2003) chapter 5; the fundamental arguments are those
of the same chapter (Simon et al. 1994 for the Delaunay arguments, the MHB2000 linear
ones for the planetary terms, whose arguments are summed as constants and rates); the IAU 2006 adjustment multiplies the nutation in
longitude by 1 + 0.4697e-6 + J2_dot t and that in obliquity by 1 + J2_dot t, with
J2_dot t = -2.7774e-6 t (Wallace and Capitaine 2006).  t is TT in Julian centuries
from J2000.0.
"""

import math

import numpy as np

from . import nodes
from .nutation_series import LUNI_SOLAR, PLANETARY
from .vocabulary import J2000_JD

_ARCSEC_TURN = 1_296_000.0
_RADIANS_PER_ARCSEC = math.pi / 648_000.0
_UNIT = _RADIANS_PER_ARCSEC / 1e7  # the tables' 0.1 micro-arcsecond, in radians


def _table(text):
    return np.array([[float(v) for v in line.split()] for line in text.splitlines()])


_LS = _table(LUNI_SOLAR)     # 678 x (5 multiples, 6 coefficients)
_PL = _table(PLANETARY)      # 687 x (13 multiples, 4 coefficients)
# Each argument's multiples as a row, so that a term's argument is F @ multiples.
_LS_MULTIPLES = np.ascontiguousarray(_LS[:, :5].T)
_PL_MULTIPLES = np.ascontiguousarray(_PL[:, :13].T)
_N_LS, _N_PL = len(_LS), len(_PL)
# The sums as two products over the terms' [sin, cos] (luni-solar), then [sin, cos]
# (planetary): rows dpsi and deps, in radians; the rates (luni-solar only) apart.
_CONSTANT = np.zeros((2, 2 * (_N_LS + _N_PL)))
_CONSTANT[0, :_N_LS] = _LS[:, 5]                        # longitude: sine
_CONSTANT[0, _N_LS:2 * _N_LS] = _LS[:, 7]               # longitude: cosine
_CONSTANT[1, _N_LS:2 * _N_LS] = _LS[:, 8]               # obliquity: cosine
_CONSTANT[1, :_N_LS] = _LS[:, 10]                       # obliquity: sine
_CONSTANT[0, 2 * _N_LS:2 * _N_LS + _N_PL] = _PL[:, 13]  # longitude: sine
_CONSTANT[0, 2 * _N_LS + _N_PL:] = _PL[:, 14]           # longitude: cosine
_CONSTANT[1, 2 * _N_LS:2 * _N_LS + _N_PL] = _PL[:, 15]  # obliquity: sine
_CONSTANT[1, 2 * _N_LS + _N_PL:] = _PL[:, 16]           # obliquity: cosine
_CONSTANT *= _UNIT
_RATE = np.zeros((2, 2 * _N_LS))
_RATE[0, :_N_LS] = _LS[:, 6] * _UNIT                    # longitude: sine, per century
_RATE[1, _N_LS:] = _LS[:, 9] * _UNIT                    # obliquity: cosine, per century


def _delaunay(t):
    """l, l', F, D, Omega (radians) at t centuries: IERS Conventions (2003) eq. 5.43,
    l' and D as the MHB2000 series has them."""
    fm = math.fmod
    return np.array([
        fm(485868.249036 + t * (1717915923.2178 + t * (31.8792 + t * (0.051635 + t * -0.00024470))),
           _ARCSEC_TURN) * _RADIANS_PER_ARCSEC,
        fm(1287104.79305 + t * (129596581.0481 + t * (-0.5532 + t * (0.000136 + t * -0.00001149))),
           _ARCSEC_TURN) * _RADIANS_PER_ARCSEC,
        fm(335779.526232 + t * (1739527262.8478 + t * (-12.7512 + t * (-0.001037 + t * 0.00000417))),
           _ARCSEC_TURN) * _RADIANS_PER_ARCSEC,
        fm(1072260.70369 + t * (1602961601.2090 + t * (-6.3706 + t * (0.006593 + t * -0.00003169))),
           _ARCSEC_TURN) * _RADIANS_PER_ARCSEC,
        fm(450160.398036 + t * (-6962890.5431 + t * (7.4722 + t * (0.007702 + t * -0.00005939))),
           _ARCSEC_TURN) * _RADIANS_PER_ARCSEC,
    ])


# The planetary terms' arguments: l, F, D, Omega (MHB2000's linear forms), the mean
# longitudes of Mercury to Neptune (Neptune's as MHB2000 has it), each a + b t radians
# at t centuries, and p_A = (0.024381750 + 0.00000538691 t) t.  Linear in t, so each
# term's argument is one constant plus one rate times t (and p_A's t^2 part), summed
# over its multiples once here; left unreduced, an argument of a million radians at
# the span's ends (6000 years out) carries 4e-10 rad of rounding, 6e-8 micro-arcsecond
# on the largest planetary term (144 uas), against one matrix product an instant.
_PL_START = np.array([2.35555598, 1.627905234, 5.198466741, 2.18243920, 4.402608842,
                      3.176146697, 1.753470314, 6.203480913, 0.599546497, 0.874016757,
                      5.481293872, 5.321159000, 0.0]) @ _PL_MULTIPLES
_PL_RATE = np.array([8328.6914269554, 8433.466158131, 7771.3771468121, -33.757045,
                     2608.7903141574, 1021.3285546211, 628.3075849991, 334.0612426700,
                     52.9690962641, 21.3299104960, 7.4781598567, 3.8127774000,
                     0.024381750]) @ _PL_MULTIPLES
_PL_CURVE = 0.00000538691 * _PL_MULTIPLES[12]


def nutation_one(jd1, jd2):
    """(dpsi, deps) in radians, Python floats, at one TT instant (two-part JD)."""
    t = ((jd1 - J2000_JD) + jd2) / 36525.0
    if not math.isfinite(t):  # (math.fmod refuses an infinity; ERFA gives NaN)
        return math.nan, math.nan
    luni = _delaunay(t) @ _LS_MULTIPLES
    planetary = _PL_START + t * (_PL_RATE + t * _PL_CURVE)
    waves = np.concatenate((np.sin(luni), np.cos(luni), np.sin(planetary), np.cos(planetary)))
    dpsi, deps = (_CONSTANT @ waves + t * (_RATE @ waves[:2 * _N_LS])).tolist()
    j2_rate = -2.7774e-6 * t
    return dpsi + dpsi * (0.4697e-6 + j2_rate), deps + deps * j2_rate


# For nutation_vector: every term's argument in one row (luni-solar, then planetary),
# and the sums' weights of their sines and of their cosines, each as four rows: dpsi
# and deps, then their rates (luni-solar only).  numpy's einsum, not a matrix product:
# the office's numpy (Debian's) multiplies matrices with the reference BLAS, slower than
# einsum's own loops on these shapes (measured: 55 us against 85 for the sums).
_N_ALL = _N_LS + _N_PL
_SINES = np.r_[0:_N_LS, 2 * _N_LS:2 * _N_LS + _N_PL]  # columns of _CONSTANT, as arguments
_COSINES = np.r_[_N_LS:2 * _N_LS, 2 * _N_LS + _N_PL:2 * _N_ALL]
_ALL_RATES = np.concatenate((_RATE, np.zeros((2, 2 * _N_PL))), axis=1)
_SINE_WEIGHTS = np.ascontiguousarray(np.vstack((_CONSTANT[:, _SINES], _ALL_RATES[:, _SINES])))
_COSINE_WEIGHTS = np.ascontiguousarray(np.vstack((_CONSTANT[:, _COSINES],
                                                  _ALL_RATES[:, _COSINES])))


# A term's argument is a product: the Delaunay arguments [l, l', F, D, Omega] at an
# instant times its multiples (a luni-solar term), or [1, t, t^2] times its constant,
# rate and p_A's t^2 part (a planetary one).  Two products, not one over eight rows
# with zeros: einsum takes the two in 28 us over a segment's points, the one in 48.
_PL_COLUMNS = np.vstack((_PL_START, _PL_RATE, _PL_CURVE))


def _terms(selected):
    """(luni-solar multiples, planetary columns, sine weights, cosine weights) of the
    terms ``selected`` (sorted indices: the luni-solar terms, then the planetary)."""
    selected = np.asarray(selected)
    luni, planetary = selected[selected < _N_LS], selected[selected >= _N_LS] - _N_LS
    return (np.ascontiguousarray(_LS_MULTIPLES[:, luni]),
            np.ascontiguousarray(_PL_COLUMNS[:, planetary]),
            np.ascontiguousarray(_SINE_WEIGHTS[:, selected]),
            np.ascontiguousarray(_COSINE_WEIGHTS[:, selected]))


def _sums(t, terms):
    """(n, 2): dpsi and deps (radians, before the IAU 2006 adjustment) of ``terms`` at n
    instants (t centuries)."""
    luni, planetary, sine_weights, cosine_weights = terms
    n, split = t.size, luni.shape[1]
    arguments = np.empty((n, split + planetary.shape[1]))
    np.einsum("nj,jk->nk", np.array([_delaunay(v) for v in t.tolist()]).reshape(n, 5),
              luni, out=arguments[:, :split])
    np.einsum("nj,jk->nk", np.stack((np.ones(n), t, t * t), axis=1), planetary,
              out=arguments[:, split:])
    sums = np.einsum("nk,ck->nc", np.sin(arguments), sine_weights)
    sums += np.einsum("nk,ck->nc", np.cos(arguments), cosine_weights)
    return sums[:, 0:2] + t[:, None] * sums[:, 2:4]


def _adjusted(t, both):
    """The IAU 2006 adjustment of (n, 2) IAU 2000A nutations at t centuries."""
    j2_rate = -2.7774e-6 * t
    dpsi, deps = both[:, 0], both[:, 1]
    return np.stack((dpsi + dpsi * (0.4697e-6 + j2_rate), deps + deps * j2_rate), axis=1)


_ALL_TERMS = _terms(np.arange(_N_ALL))


def nutation_vector(jd1, jd2):
    """(n, 2): dpsi and deps (radians) at n TT instants (flat two-part JDs) in one pass
    of numpy over all of them: the points of a segment (nodes.py), where the bits need
    not be nutation_one's (they differ by 1e-8 micro-arcsecond, the order of the sums)."""
    t = ((np.asarray(jd1, dtype=float) - J2000_JD) + np.asarray(jd2, dtype=float)) / 36525.0
    return _adjusted(t, _sums(t, _ALL_TERMS))


# At a segment's points (nodes.py) the terms of periods of FAST_PERIOD_DAYS and more
# (753 of the 1,365) are interpolated from a long segment's points
# (nodes.over_long_segment: 128 days; within 1e-4 micro-arcsecond of the series, 9e-5
# measured over 1000-3000, tests/test_nodes.py), and only the others (612) are evaluated
# at the segment's own: 123 us for a segment's points against 206.  A term's period from
# its argument's rate (the Delaunay arguments' linear rates of eq. 5.43 above, the
# planetary terms' own).
FAST_PERIOD_DAYS = 40.0
_DELAUNAY_RATES = np.array([1717915923.2178, 129596581.0481, 1739527262.8478,
                            1602961601.2090, -6962890.5431]) * _RADIANS_PER_ARCSEC  # per century
_RATES = np.abs(np.concatenate((_DELAUNAY_RATES @ _LS_MULTIPLES, _PL_RATE)))
_FAST = _RATES > 2.0 * math.pi * 36525.0 / FAST_PERIOD_DAYS
_FAST_TERMS = _terms(np.flatnonzero(_FAST))
_SLOW_TERMS = _terms(np.flatnonzero(~_FAST))


def _slow_sums(jd1, jd2):
    t = ((jd1 - J2000_JD) + jd2) / 36525.0
    return _sums(t, _SLOW_TERMS)


def nutation_at_points(jd1, jd2):
    """``nutation_vector`` at a segment's points, its slow terms from their long segment
    (computed in full for any other instants)."""
    slow = nodes.over_long_segment("nutation, terms over 40 days", _slow_sums, jd1, jd2)
    if slow is None:
        return nutation_vector(jd1, jd2)
    t = ((jd1 - J2000_JD) + jd2) / 36525.0
    return _adjusted(t, _sums(t, _FAST_TERMS) + slow)


def nutation(jd1, jd2):
    """(dpsi, deps) arrays in radians at TT instants (two-part JDs of one shape, or
    broadcastable): each instant by nutation_one."""
    jd1, jd2 = np.broadcast_arrays(np.asarray(jd1, dtype=float), np.asarray(jd2, dtype=float))
    out = np.empty(jd1.shape + (2,))
    flat = out.reshape(-1, 2)
    for k, (a, b) in enumerate(zip(jd1.ravel().tolist(), jd2.ravel().tolist())):
        flat[k] = nutation_one(a, b)
    return out[..., 0], out[..., 1]
