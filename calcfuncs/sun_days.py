"""The apparent Sun and the sidereal time at whole TT days, for the searches of a local
day (sunrise, sunset, twilight, the Sun's transit, the length of the day).

Computed directly (sun.sun_and_sidereal: the Earth from ERFA epv00, the IAU 2006
precession and the IAU 2000A nutation, iau2000a.py) a day costs about 80 us, a year of
sunrises 30 ms.  Most of that varies slowly, and what varies fast is cheap to compute on
its own; so, within ANCHORED_YEARS:

  exactly, at anchors (the Sun's SUN_SPACING days apart, the nutation's
  NUTATION_SPACING):
    the apparent Sun as it would be seen without the Earth's monthly swing about the
    Earth-Moon barycentre (the geocentric apparent vector, less that swing's part of
    the position and of the aberration; below), and the IAU 2000A nutation minus its
    77-term abridgement IAU 2000B (2.5 mas near J2000, 11 by 1600; most of it slow:
    the planetary terms and the growth of the difference away from J2000);
  at every day:
    the swing from ERFA moon98: the Earth stands 1/(1 + 81.3) of the Moon's geocentric
    vector on the far side of the barycentre (6.4" of the Sun's direction) and moves
    12.5 m/s about it (9 mas of aberration), both with periods of a month and a half
    month, which no interpolation over anchors twelve days apart would follow; the IAU
    2000B nutation (ERFA nut00b, all the short-period terms over 0.1 mas); the
    precession (Fukushima-Williams angles, ERFA pfw06) and the CIO locator s (ERFA s06);
  and the anchors' values interpolated to the day through those around it (Lagrange;
  ten of the Sun's, eight of the nutation's), the nutation then IAU 2000B plus the
  interpolated difference.

Against the direct computation over random days of ANCHORED_YEARS
(tests/test_sun_days.py) the Sun's direction and GAST - ERA stay within 5 mas (measured
2.4-3.6 and 1.9-3.0 mas; what is left is mostly the 2000A terms under 0.1 mas that 2000B
leaves out, of periods too short for the anchors): a sunrise moves by 0.16 ms at most
over a year at five sites, where the stated accuracy is a few seconds.  Outside
ANCHORED_YEARS every day is computed directly: epv00 is fitted to 1900-2100, and far
from it its series carry short-period terms of their own (0.1" by the year 1000) that
anchors twelve days apart cannot follow.

The days' values depend on TT alone and are kept across calls (bounded), so that cells
filled down a column of days, each computed on its own, share them as a column does.
"""

import erfa
import numpy as np

from . import iau2000a, nodes
from .bounded import keep
from .frames import unit_vectors
from .events import wrap180
from .timescales import Instants

# Anchors sit on TT JDs that are multiples of their spacing (exact in one double, so
# that neighbouring days and later calls share them); a day takes the polynomial
# through the anchors around it, half on either side (Lagrange).
SUN_SPACING, SUN_ANCHORS = 12.0, 10
# The difference 2000A - 2000B: what the anchors can follow of it is slow (the
# interpolation's error, about 2.5 mas, is that of its short-period terms, the same at
# anchors 12 or 48 days apart).
NUTATION_SPACING, NUTATION_ANCHORS = 48.0, 8
ANCHORED_YEARS = (1600.0, 2400.0)
# The searches take the days DAY_SPACING apart and interpolate between DAY_POINTS of them.
DAY_SPACING, DAY_POINTS = 2.0, 8
ANCHORED_JD = tuple(2451545.0 + (y - 2000.0) * 365.25 for y in ANCHORED_YEARS)

# The Moon's mass over the Earth's, 0.0123000371 (the IAU 2009 system of astronomical
# constants, from memory): the Earth's share of the Earth-Moon separation.
MOON_EARTH_MASS_RATIO = 0.0123000371
EARTH_SWING = MOON_EARTH_MASS_RATIO / (1.0 + MOON_EARTH_MASS_RATIO)
LIGHT_AU_PER_DAY = 299792.458 * 86400.0 / 149597870.7

DAYS_KEPT = 20_000      # about 55 years of days, 0.8 MB
ANCHORS_KEPT = 5_000    # of each kind: 160 years of the Sun's, 0.2 MB
_DAYS = {}          # TT JD of a day -> (the apparent Sun's unit vector, GAST - ERA, distance)
_SUN_ANCHORS = {}   # TT JD -> the apparent Sun less the swing (au)
_NUTATION_ANCHORS = {}  # TT JD -> IAU 2000A - 2000B (dpsi, deps in radians)


def forget():
    for kept in (_DAYS, _SUN_ANCHORS, _NUTATION_ANCHORS):
        kept.clear()


def direct(tt):
    """Per TT instant: the apparent Sun's unit vector on the true equator and equinox of
    date, GAST - ERA in degrees (minus the equation of the origins) and the Sun's
    distance (au), computed in full (sun.sun_and_sidereal)."""
    from .sun import sun_and_sidereal  # sun.py builds on this module

    zero = np.zeros(tt.shape)
    ut = Instants(tt, zero, "TT").to("UT")
    ra, dec, gast, distance = sun_and_sidereal(tt, zero, ut, with_distance=True)
    origins = wrap180(np.degrees(gast - erfa.era00(ut.jd1, ut.jd2)))
    return np.concatenate([unit_vectors(ra, dec), origins[:, None], distance[:, None]], axis=1)


def at_instants(tt):
    """``values`` at any TT instants, through the DAY_POINTS days around each (days
    DAY_SPACING apart, Lagrange), as the searches of sun.py take them (the unit vector
    then unit to 1e-12)."""
    return _interpolated(tt, DAY_SPACING, DAY_POINTS, values)


def cirs_vectors(tt):
    """The apparent Sun's geocentric vectors (au) on the CIRS axes at TT instants: the
    true equator's, turned about the pole by GAST - ERA (the equation of the origins: the
    CIO's right ascension on the true equator), from ``at_instants``."""
    v = at_instants(tt)
    turn = np.radians(v[:, 3])
    c, s = np.cos(turn), np.sin(turn)
    x, y = v[:, 0], v[:, 1]
    return np.stack([c * x + s * y, c * y - s * x, v[:, 2]], axis=1) * v[:, 4:5]


def _swing(tt):
    """The Earth's offset from the Earth-Moon barycentre, negated (au), and its velocity
    over c, negated: what the Moon adds to the geocentric Sun's vector and to the
    Earth's velocity in the aberration (ERFA moon98, GCRS axes)."""
    pv = erfa.moon98(tt, np.zeros(tt.shape))
    return pv["p"] * EARTH_SWING, pv["v"] * (EARTH_SWING / LIGHT_AU_PER_DAY)


def _aberration_part(vector, beta):
    """The change of an apparent vector when the observer's velocity over c changes by
    ``beta`` (first order: the part of beta across the line of sight, at the vector's
    length), rows of 3-vectors."""
    r = np.sqrt(np.einsum("mi,mi->m", vector, vector))
    u = vector / r[:, None]
    across = beta - np.einsum("mi,mi->m", u, beta)[:, None] * u
    return across * r[:, None]


def _kept(kept, size, compute, tt):
    """Per instant of ``tt``: the value kept in ``kept``, computing the missing ones in
    one call of ``compute`` and keeping them (at most ``size``)."""
    found = [kept.get(t) for t in tt.tolist()]
    missing = [k for k, v in enumerate(found) if v is None]
    if missing:
        fresh = compute(tt[missing])
        for k, v in zip(missing, fresh):
            keep(kept, float(tt[k]), v, size)
            found[k] = v
    return np.array(found)


def _sun_less_swing(tt):
    from .sun import sun_gcrs

    u, r = sun_gcrs(tt, np.zeros(tt.shape))
    sun = u * r[:, None]
    shift, beta = _swing(tt)
    # The Earth's own velocity about the barycentre is minus the swing's: its part of
    # the aberration comes off as minus the swing's part.
    return sun - shift + _aberration_part(sun, beta)


def _nutation_difference(tt):
    zero = np.zeros(tt.shape)
    full = np.stack(iau2000a.nutation(tt, zero), axis=-1)  # the series places take
    return full - np.stack(erfa.ufunc.nut00b(tt, zero), axis=-1)


def _interpolated(tt, spacing, points, at_nodes):
    """At TT instants: ``at_nodes`` at TT JDs ``spacing`` days apart, through the
    ``points`` of them around each instant (Lagrange)."""
    first = np.floor(tt / spacing) - (points // 2 - 1)
    grid = (first[:, None] + np.arange(points)) * spacing
    unique, index = np.unique(grid, return_inverse=True)
    found = at_nodes(unique)[index.reshape(grid.shape)]
    return np.einsum("mk,mkc->mc", nodes.weights(tt / spacing - first, points), found)


def _at_anchors(kept, compute):
    return lambda tt: _kept(kept, ANCHORS_KEPT, compute, tt)


def anchored(tt):
    """Per TT day inside ANCHORED_YEARS: as ``direct``, from the anchors and the fast
    parts computed at the day (the module's words)."""
    shift, beta = _swing(tt)
    sun = _interpolated(tt, SUN_SPACING, SUN_ANCHORS,
                        _at_anchors(_SUN_ANCHORS, _sun_less_swing)) + shift
    sun = sun - _aberration_part(sun, beta)
    difference = _interpolated(tt, NUTATION_SPACING, NUTATION_ANCHORS,
                               _at_anchors(_NUTATION_ANCHORS, _nutation_difference))
    zero = np.zeros(tt.shape)
    dpsi, deps = erfa.ufunc.nut00b(tt, zero)
    gamb, phib, psib, epsa = erfa.ufunc.pfw06(tt, zero)
    npb = erfa.ufunc.fw2m(gamb, phib, psib + (dpsi + difference[:, 0]),
                          epsa + (deps + difference[:, 1]))
    seen = np.einsum("mij,mj->mi", npb, sun)
    distance = np.sqrt(np.einsum("mi,mi->m", seen, seen))
    seen /= distance[:, None]
    x, y = erfa.ufunc.bpn2xy(npb)
    origins = -np.degrees(erfa.ufunc.eors(npb, erfa.ufunc.s06(tt, zero, x, y)))
    return np.concatenate([seen, wrap180(origins)[:, None], distance[:, None]], axis=1)


def values(tt):
    """Per TT day (whole or half TT JDs, exact in one double): the apparent Sun's unit
    vector on the true equator and equinox of date, GAST - ERA in degrees and the Sun's
    distance (au); kept across calls."""
    out = np.empty((tt.size, 5))
    missing = []
    for k, t in enumerate(tt.tolist()):
        found = _DAYS.get(t)
        if found is None:
            missing.append(k)
        else:
            out[k] = found
    if missing:
        todo = tt[missing]
        inside = (todo >= ANCHORED_JD[0]) & (todo <= ANCHORED_JD[1])
        fresh = np.empty((todo.size, 5))
        if np.any(inside):
            fresh[inside] = anchored(todo[inside])
        if not np.all(inside):
            fresh[~inside] = direct(todo[~inside])
        out[missing] = fresh
        for t, v in zip(todo.tolist(), fresh):
            keep(_DAYS, t, v, DAYS_KEPT)
    return out
