"""The place of a solar-system body as seen from the Earth's centre, from any source,
and the cells that show a place.

The one pipeline for the Sun, the Moon and the planets:
  GEOMETRIC   body minus Earth at the same instant (no light time)
  ASTROMETRIC the body where the light left it: light time found by iteration,
              the body at t - tau minus the Earth at t (BCRS, ICRS axes)
  APPARENT    astrometric, then the Sun's light deflection (ERFA ld, the body at its
              finite distance) and annual aberration (ERFA ab, relativistic): the
              direction observed from the geocentre, on the GCRS axes
The geocentric parallax of a site (up to 9" for Venus, a degree for the Moon) is not
applied.  Times are TDB; the built-in theories take TT for TDB (under 2 ms apart).
"""

import itertools
import math

import erfa
import numpy as np

from . import ephemeris, frames, nodes, orbits, vectors
from .bounded import keep
from .errors import RowErrors
from .events import wrap180
from .timescales import same_shape, within_years_one
from .vocabulary import (BUILTIN, BUILTIN_YEARS, ECLIPTIC_OF_FRAME, EQUATORIAL_OF_FRAME,
                         LIGHT_DAYS_PER_AU)


class Place:
    """The geocentric place of a body at some instants, and what it was made from."""

    __slots__ = ("direction", "distance", "helio", "earth_helio", "_states", "_sun")

    def __init__(self, direction, distance, helio, earth_helio, states):
        self.direction = direction      # unit vectors, GCRS axes, of the requested kind
        self.distance = distance        # au: |body(t - tau) - Earth(t)| ("true" distance)
        self.helio = helio              # heliocentric body at t - tau (au)
        self.earth_helio = earth_helio  # heliocentric Earth at t (au)
        self._states = states           # barycentric (p, v) of the Earth and the Sun at t
        self._sun = None

    @property
    def sun_direction(self):
        """The apparent Sun (unit vectors), for elongations; made when first asked."""
        if self._sun is None:
            self._sun = _sun_geocentric(*self._states, "APPARENT")[0]
        return self._sun


def _sun_geocentric(earth_b, sun_b, kind):
    """(unit vectors, geometric distance) of the Sun from the barycentric states at t:
    the light time (about 499 s) from the Sun's slow barycentric motion, then for
    APPARENT the annual aberration (the Sun's own light is not deflected)."""
    (ep, ev), (sp, sv) = earth_b, sun_b
    geometric = sp - ep
    distance = vectors.norm(geometric)
    if kind == "GEOMETRIC":
        return geometric / distance[..., None], distance
    tau = distance * LIGHT_DAYS_PER_AU
    u = vectors.unit(geometric - tau[..., None] * sv)
    return (_aberrate(u, ev, distance) if kind == "APPARENT" else u), distance


def _aberrate(u, earth_v, sun_distance):
    c = earth_v * LIGHT_DAYS_PER_AU
    bm1 = np.sqrt(1.0 - np.add.reduce(c * c, axis=-1))
    return erfa.ufunc.ab(u, c, sun_distance, bm1)


LIGHT_TIME_ROUNDS = 2  # after the geometric distance (place, below)


def _on_chord(at_0, at_tau1, tau1, tau):
    """A body's heliocentric position at light time ``tau`` on the chord between its
    positions at light times 0 and ``tau1`` (arrays (..., 3), light times (...)): within
    2 m of the body itself where ``tau`` is ``tau1`` to 1e-4 of it, as in the light-time
    rounds (tests/test_planets.py)."""
    f = ((tau1 - tau) / tau1)[..., None]
    return at_tau1 + f * (at_0 - at_tau1)


def place(body, tdb1, tdb2, kind="APPARENT", source=BUILTIN, observer=None):
    """The ``Place`` of ``body`` (SUN, MOON or a planet, or an object whose
    ``heliocentric(t1, t2)`` gives (p, v): a two-body orbit) at the source's argument
    times (ephemeris.times_for).

    ``observer``: (position au, velocity au/day) of an observer relative to the Earth's
    centre on the GCRS axes (a site, topocentric.py); the place is then found from the
    observer itself (light time, deflection and aberration all from its state), which
    brings the diurnal parallax and aberration with no first-order formula."""
    src = ephemeris.get(source)
    tdb1, tdb2 = same_shape(tdb1, tdb2)
    if observer is not None:
        shape = np.broadcast_shapes(tdb1.shape, np.shape(observer[0])[:-1])
        tdb1, tdb2 = np.broadcast_to(tdb1, shape), np.broadcast_to(tdb2, shape)
    earth_b, sun_b = src.earth_and_sun(tdb1, tdb2)
    (ep, ev), (sp, sv) = earth_b, sun_b
    # The Earth's heliocentric state, for the Moon's geocentric theory (always the
    # geocentre's, whoever observes).
    near = [ep - sp, ev - sv, (tdb1, tdb2), None]  # (Builtin.heliocentric keeps the Moon's state)
    if observer is not None:
        ep, ev = ep + observer[0], ev + observer[1]
        earth_b = (ep, ev)
    earth_helio = ep - sp
    if isinstance(body, str) and body == "SUN":
        u, distance = _sun_geocentric(earth_b, sun_b, kind)
        return Place(u, distance, np.zeros(ep.shape), earth_helio, (earth_b, sun_b))
    em = vectors.norm(earth_helio)

    def helio_at(tau):
        if not isinstance(body, str):  # an orbit of its own (orbits.Orbit), row by row
            return body.heliocentric(tdb1, tdb2 - tau)[0]
        return src.heliocentric(body, tdb1, tdb2 - tau, near, velocity=False)[0]

    def geocentric(helio, tau):
        # The Sun's barycentric place at t - tau, from its slow motion at t.
        return helio + (sp - tau[..., None] * sv) - ep

    tau = np.zeros(tdb1.shape)
    helio = helio_at(tau)
    vector = geocentric(helio, tau)
    if kind != "GEOMETRIC":
        # Each round gains a factor of the radial speed over c (up to about 2e-4, for
        # Mercury) on the light time.  The body is evaluated at t and at t - tau1 only;
        # later rounds take it on the chord between the two (``_on_chord``: tau moves by
        # 1e-4 of itself after the first round, where the chord is off by metres).
        first = helio
        tau1 = vectors.norm(vector) * LIGHT_DAYS_PER_AU
        helio = at_tau1 = helio_at(tau1)
        vector = geocentric(helio, tau1)
        for _ in range(LIGHT_TIME_ROUNDS - 1):
            tau = vectors.norm(vector) * LIGHT_DAYS_PER_AU
            helio = _on_chord(first, at_tau1, tau1, tau)
            vector = geocentric(helio, tau)
    distance = vectors.norm(vector)
    u = vector / distance[..., None]
    if kind == "APPARENT":
        e = earth_helio / em[..., None]
        u = _aberrate(erfa.ld(1.0, u, vectors.unit(helio), e, em, 1e-9), ev, em)
    return Place(u, distance, helio, earth_helio, (earth_b, sun_b))


def place_at_tt(body, tt1, tt2, kind="APPARENT", source=BUILTIN):
    """The ``Place`` of ``body`` at TT instants, on the source's time scale."""
    tt1, tt2 = same_shape(tt1, tt2)
    return place(body, *ephemeris.times_for(source, tt1, tt2), kind, source)


def geocentric(body, tt1, tt2, kind="APPARENT", source=BUILTIN):
    """(unit vectors, distance in au) of a body on the GCRS axes at TT instants."""
    p = place_at_tt(body, tt1, tt2, kind, source)
    return p.direction, p.distance


def direction(body, tt1, tt2, kind="APPARENT", source=BUILTIN):
    """Unit vectors of a body's place on the GCRS axes at TT instants (``geocentric``'s
    first part).  One built-in instant is kept for the row's other columns (a log asks
    for a body's RA in one column and its Dec in the next, and Calc computes column by
    column): the place is made once an instant, as its series are (nodes.INSTANTS_KEPT)."""
    if (type(tt1) is np.ndarray and tt1.shape == (1,) and type(tt2) is np.ndarray
            and tt2.shape == (1,) and source == BUILTIN and type(body) is str):
        return _direction_one(body, tt1.item(), tt2.item(), kind)
    return geocentric(body, tt1, tt2, kind, source)[0]


@nodes.kept_per_instant
def _direction_one(body, tt1, tt2, kind):
    """``direction`` of one built-in instant (floats): a read-only array of one row."""
    u = place(body, np.array([tt1]), np.array([tt2]), kind, BUILTIN).direction
    u.flags.writeable = False
    return u


def body_in(body, tt1, tt2, system, kind="APPARENT", source=BUILTIN):
    """Unit vectors of a body in a coordinate system of frames.py at TT instants."""
    return in_system(direction(body, tt1, tt2, kind, source), system, tt1, tt2)


def heliocentric(body, tdb1, tdb2, source=BUILTIN):
    """Geometric heliocentric position (au, ICRS axes) of a planet at the instants."""
    src = ephemeris.get(source)
    tdb1, tdb2 = same_shape(tdb1, tdb2)
    if body == "EARTH":
        (ep, _), (sp, _) = src.earth_and_sun(tdb1, tdb2)
        return ep - sp
    return src.heliocentric(body, tdb1, tdb2, velocity=False)[0]


def in_system(directions, system, tt1, tt2):
    """Vectors on the ICRS axes turned into a coordinate system at TT instants."""
    return vectors.apply(frames.system_matrix(system, tt1, tt2, smooth=True, long_term=True),
                         directions)


def longitude_from_sun(p, tt1, tt2):
    """Apparent ecliptic longitude of the body of a ``Place`` minus the Sun's, degrees
    (not wrapped).  The same on the true and the mean ecliptic of date: nutation turns
    the frame about the ecliptic's pole, and the mean frame's matrix is far cheaper."""
    m = frames.system_matrix("ECLIPTIC DATE", tt1, tt2, long_term=True)
    body = frames.spherical(vectors.apply(m, p.direction))[0]
    sun = frames.spherical(vectors.apply(m, p.sun_direction))[0]
    return body - sun


def rough_geocentric(body_helio, earth_helio):
    """Geometric geocentric vectors of a body and of the Sun (au, ecliptic J2000 axes) from
    heliocentric positions on the J2000 axes: no light time, no aberration.  With ERFA
    plan94's Earth-Moon barycentre for the Earth (ephemeris.rough_earth), within a few
    hundredths of a degree of the apparent places in longitude difference and
    elongation: for locating events only (planets.py, smallbodies.py)."""
    to_ecliptic = frames.system_matrix("ECLIPTIC J2000")
    return (vectors.apply(to_ecliptic, body_helio - earth_helio),
            vectors.apply(to_ecliptic, -earth_helio))


def rough_longitude_from_sun(body, sun, offset=0.0):
    """The ecliptic longitude of ``body`` minus the Sun's, less ``offset``, in [-180, 180)
    degrees, from ``rough_geocentric``'s vectors."""
    return wrap180(frames.spherical(body)[0] - frames.spherical(sun)[0] - offset)


def phase_angle(p):
    """Sun-body-Earth angle in radians, from a ``Place``."""
    to_sun = -p.helio
    to_earth = -(p.helio - p.earth_helio)  # the Earth minus the body
    return vectors.angle_between(to_sun, to_earth)


def elongation(p):
    """Angle between the body and the Sun (apparent, geocentric), radians."""
    return vectors.angle_between(p.direction, p.sun_direction)


# ---- a place of one instant on floats -----------------------------------------------
#
# A cell of a log asks for one instant: on arrays of one row, a place passes through
# some 375 Python calls and a hundred small arrays, which cost two thirds of its time,
# and in Calc, where the cell's code and data come back from memory each time, more.
# The same steps on Python floats, for the built-in theories inside BUILTIN_YEARS, take
# a third of that.  A column takes every row it computes directly (not interpolated
# over nodes) through the same function, row by row, so a cell and its row of a column
# agree to the bit.

FLOAT_BODIES = frozenset(("SUN", "MOON") + tuple(ephemeris.PLAN94_NUMBERS))


@nodes.kept_per_instant
def _direction_floats(body, t1, t2, kind, dense=False):
    """``place``'s unit vector (three floats, GCRS axes) of a body of FLOAT_BODIES at one
    TT instant (taken for TDB; floats) inside BUILTIN_YEARS: its steps on floats, from
    the Earth's and the Sun's kept states, or, ``dense``, from their segment (a cell of a
    log filled down, nodes.cell_is_dense).  Kept for the row's other columns."""
    return _direction_of_states(body, t1, t2, kind, _states_floats(t1, t2, dense))


def _direction_of_states(body, t1, t2, kind, states, sqrt=math.sqrt, floor=max):
    """``_direction_floats`` from the Earth's and the Sun's barycentric states.  The same
    steps take a segment's points at once (``_directions_at_points``): instants and
    states as arrays, ``sqrt`` and ``floor`` numpy's (the same arithmetic, element by
    element, so the same numbers)."""
    (ex, ey, ez), ev, (sx, sy, sz), sv = states
    if body == "SUN":  # _sun_geocentric's steps
        g = (sx - ex, sy - ey, sz - ez)
        distance = _length(g, sqrt)
        if kind == "GEOMETRIC":
            return [g[0] / distance, g[1] / distance, g[2] / distance]
        tau = distance * LIGHT_DAYS_PER_AU
        u = _direction((g[0] - tau * sv[0], g[1] - tau * sv[1], g[2] - tau * sv[2]), sqrt)
        return _aberrate_floats(u, ev, distance, sqrt) if kind == "APPARENT" else u
    earth_helio = ((ex - sx, ey - sy, ez - sz), (ev[0] - sv[0], ev[1] - sv[1], ev[2] - sv[2]))
    return _place_floats(ephemeris.heliocentric_floats(body, t1, t2, earth_helio),
                         states, kind, sqrt, floor)


@nodes.kept_per_instant
def _orbit_direction_floats(elements, t1, t2, kind, dense=False):
    """``_direction_floats`` of a two-body orbit (orbits.Orbit.elements_floats, which
    tell one orbit from another in the key), its positions from orbits.helio_floats."""
    return _place_floats(orbits.helio_floats(elements, t1, t2), _states_floats(t1, t2, dense),
                         kind)


def _states_floats(t1, t2, dense):
    """The Earth's and the Sun's barycentric states at one instant, floats: kept, or
    (``dense``) from the segment of a log's cells (nodes.py)."""
    if dense:
        return ephemeris.earth_and_sun_from_nodes(t1, t2)
    return ephemeris.earth_and_sun_floats(t1, t2)


# The steps on floats below write each vector's three components out rather than in
# comprehensions: Python 3.11 runs a comprehension as a function call of its own, and a
# place made of some thirty of them spent a third of its time calling them.


def _place_floats(helio_at, states, kind, sqrt=math.sqrt, floor=max):
    """``place``'s steps on floats for a body whose heliocentric position at the light
    time ``tau`` is ``helio_at(tau)``, from the barycentric states of the Earth and the
    Sun at the instant (or on arrays of instants: ``_direction_of_states``)."""
    (ex, ey, ez), ev, (sx, sy, sz), (svx, svy, svz) = states

    def geocentric(h, tau):  # the Sun at t - tau from its slow motion at t
        return (h[0] + (sx - tau * svx) - ex, h[1] + (sy - tau * svy) - ey,
                h[2] + (sz - tau * svz) - ez)

    helio = helio_at(0.0)
    vector = geocentric(helio, 0.0)
    if kind != "GEOMETRIC":  # place's rounds: the body at t - tau1, then on the chord
        first = helio
        tau1 = _length(vector, sqrt) * LIGHT_DAYS_PER_AU
        helio = at_tau1 = helio_at(tau1)
        vector = geocentric(helio, tau1)
        for _ in range(LIGHT_TIME_ROUNDS - 1):
            tau = _length(vector, sqrt) * LIGHT_DAYS_PER_AU
            f = (tau1 - tau) / tau1
            helio = (at_tau1[0] + f * (first[0] - at_tau1[0]),
                     at_tau1[1] + f * (first[1] - at_tau1[1]),
                     at_tau1[2] + f * (first[2] - at_tau1[2]))
            vector = geocentric(helio, tau)
    u = _direction(vector, sqrt)
    if kind != "APPARENT":
        return u
    em = _length((ex - sx, ey - sy, ez - sz), sqrt)
    e = ((ex - sx) / em, (ey - sy) / em, (ez - sz) / em)
    return _aberrate_floats(_deflect_floats(u, _direction(helio, sqrt), e, em, floor), ev, em,
                            sqrt)


def _length(v, sqrt=math.sqrt):
    return sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2])


def _direction(v, sqrt=math.sqrt):
    size = _length(v, sqrt)
    return [v[0] / size, v[1] / size, v[2] / size]


# The Sun's Schwarzschild radius 2GM/c^2 in au (the IAU 2009 constants), the scale of
# both relativistic terms below; ERFA's ERFA_SRS holds the same number.
SUN_SCHWARZSCHILD_AU = 1.97412574336e-8

# The two steps below are the formulas ERFA's ab and ld evaluate, written out on Python
# floats: a cell's direction is three floats, and an ERFA call on them (broadcasting,
# a structured result, a list made of it) costs three times the arithmetic, and more in
# Calc, where every numpy or ERFA call of a cell's path comes back from memory.
# tests/test_float_places.py holds them to ERFA's own to 1e-15 over random inputs.


def _aberrate_floats(u, earth_v, sun_distance, sqrt=math.sqrt):
    """``_aberrate`` of one direction on floats: the relativistic annual aberration of
    the unit vector ``u`` for an observer moving at ``earth_v`` (au/day, barycentric)
    at ``sun_distance`` au from the Sun, with the Sun's potential's small term (the
    Explanatory Supplement, 3rd ed., eq. 7.40, as ERFA ab takes it)."""
    (ux, uy, uz), (vx, vy, vz) = u, earth_v
    bx, by, bz = vx * LIGHT_DAYS_PER_AU, vy * LIGHT_DAYS_PER_AU, vz * LIGHT_DAYS_PER_AU  # v/c
    root = sqrt(1.0 - (bx * bx + by * by + bz * bz))  # 1 / the Lorentz factor
    ub = ux * bx + uy * by + uz * bz
    along = 1.0 + ub / (1.0 + root)
    potential = SUN_SCHWARZSCHILD_AU / sun_distance
    return _direction((root * ux + along * bx + potential * (bx - ub * ux),
                       root * uy + along * by + potential * (by - ub * uy),
                       root * uz + along * bz + potential * (bz - ub * uz)), sqrt)


def _deflect_floats(u, q, e, sun_earth, floor=max):
    """The Sun's deflection of the light of a body at a finite distance, on floats: ``u``
    the body's direction from the Earth, ``q`` its direction from the Sun, ``e`` the
    Earth's from the Sun, all unit vectors, the Earth ``sun_earth`` au from the Sun (the
    Explanatory Supplement, 3rd ed., eq. 7.64; ERFA ld with one solar mass and its
    floor of 1e-9 on 1 + q.e, which keeps a body behind the Sun finite)."""
    (ux, uy, uz), (qx, qy, qz), (ex, ey, ez) = u, q, e
    scale = SUN_SCHWARZSCHILD_AU / sun_earth / floor(
        qx * (qx + ex) + qy * (qy + ey) + qz * (qz + ez), 1e-9)
    ax, ay, az = ey * qz - ez * qy, ez * qx - ex * qz, ex * qy - ey * qx  # e x q
    return [ux + scale * (uy * az - uz * ay), uy + scale * (uz * ax - ux * az),
            uz + scale * (ux * ay - uy * ax)]


def _value_floats(direction, t1, t2, system, index, dense=False):
    """A longitude or latitude (``index`` 0 or 1, degrees) in a checked ``system`` at one
    TT instant (floats) inside BUILTIN_YEARS of the unit vector ``direction(t1, t2,
    dense)`` (three floats, GCRS axes), on floats (``dense``: the Earth and the system's
    matrix from their segments, nodes.py)."""
    x, y, z = direction(t1, t2, dense)
    m = frames.matrix_rows(system, t1, t2, dense)
    return frames.spherical_floats(m[0][0] * x + m[0][1] * y + m[0][2] * z,
                                   m[1][0] * x + m[1][1] * y + m[1][2] * z,
                                   m[2][0] * x + m[2][1] * y + m[2][2] * z, index)


def _directions_on_floats(body, kind, rows):
    """For ``rows`` instants: a function (t1, t2, dense, row=0) -> unit vector on floats
    of the body (a name of FLOAT_BODIES or a two-body orbits.Orbit of one row or of
    ``rows``), or None where the body has no float path (another body, a perturbed
    orbit).  A cell's instant is row 0, so the function serves ``_value_floats`` as it
    is."""
    if type(body) is str:
        if body not in FLOAT_BODIES:
            return None
        return lambda t1, t2, dense, row=0: _direction_floats(body, t1, t2, kind, dense)
    if type(body) is not orbits.Orbit or body.q.size not in (1, rows):
        return None
    one = body.q.size == 1
    return lambda t1, t2, dense, row=0: _orbit_direction_floats(
        body.elements_floats(0 if one else row), t1, t2, kind, dense)


# A float step that overflows or divides by zero (an extreme orbit) raises where numpy
# gives inf or NaN: such a row is computed on arrays instead, a cell as its column's row.
_FLOAT_FAILURES = (ArithmeticError, ValueError)


def rows_on_floats(body, tt1, tt2, system, kind, index):
    """(values, rows done): a body's longitude or latitude in a checked ``system`` (the
    built-in source) for the rows of TT arrays that are computed directly and lie
    inside BUILTIN_YEARS, on floats row by row (``_value_floats``; a cell of a log filled
    down with its Earth and matrix from their segments); None when no row is (another
    body, a dense column: its nodes are interpolated on arrays)."""
    if tt1.size == 1:
        value = one_on_floats(body, float(tt1.flat[0]), float(tt2.flat[0]), system, kind,
                              index)
        return None if value is None else (value, True)
    direction = _directions_on_floats(body, kind, tt1.size)
    if direction is None or nodes.dense(tt1, tt2) is not None:
        return None
    values = np.full(tt1.shape, np.nan)
    done = np.zeros(tt1.shape, dtype=bool)
    flat, mask = values.reshape(-1), done.reshape(-1)
    for k, (t1, t2) in enumerate(zip(tt1.ravel().tolist(), tt2.ravel().tolist())):
        if within_years_one(t1, t2, BUILTIN_YEARS):
            try:
                flat[k] = _value_floats(lambda a, b, d: direction(a, b, d, k), t1, t2, system,
                                        index)
            except _FLOAT_FAILURES:
                continue
            mask[k] = True
    return (values, done) if mask.any() else None


def one_on_floats(body, t1, t2, system, kind, index):
    """``rows_on_floats``'s value for one TT instant (floats) of a single cell, or None
    where the float path does not take it (another body, outside BUILTIN_YEARS, a step
    that fails).  In a dense log, the place itself from its segment (``_place_from_segment``)
    or the Earth and the matrix from theirs."""
    if not within_years_one(t1, t2, BUILTIN_YEARS):
        return None
    try:
        dense = nodes.cell_is_dense(t1, t2)
        if dense:
            found = _place_from_segment(body, t1, t2, system, kind)
            if found is not None:
                return frames.spherical_floats(found[0], found[1], found[2], index)
        direction = _directions_on_floats(body, kind, 1)
        if direction is None:
            return None
        return _value_floats(direction, t1, t2, system, index, dense)
    except _FLOAT_FAILURES:
        return None


# ---- a body's place from segments of its own --------------------------------------------
#
# In a dense log (nodes.py) a cell of the Sun's, a planet's or a two-body orbit's place
# takes, once DENSE_CELLS instants have asked for that place in a segment, the place
# itself from a segment of its own: its unit vector in the system's axes computed at the
# segment's points as a cell alone computes it, then one interpolation a cell, where the
# Earth's and the matrix's segments leave a cell the light time, the deflection, the
# aberration and the rotation to do.  The Moon's place, through the short periods of
# its perturbations, takes 32 points over the sixteen days (nodes.GRIDS; 20 leave 1 mas
# of error, 32 under 0.5 uas), with the Earth and the matrix at them from their own
# segments.
# A segment is declined (its cells take the Earth's and the matrix's segments) where
# interpolation would not hold the bound: a planet or an orbit whose apparent place
# comes within PLACE_SEGMENT_MIN_ELONGATION_DEG of the Sun (the bending of light from
# behind the Sun changes sharply there), or any place whose last Chebyshev coefficients
# exceed PLACE_SEGMENT_TAIL (an orbit passing close to the Earth; a smooth place's fall
# below 1e-13, and the error of one with a larger tail is about its size: measured on
# 300 segments of the Sun and four planets).  The tail is the finer test near the Sun
# too: over 1900-2100, of every segment of each planet and of an asteroid's orbit whose
# place came within 2 to 30 degrees of the Sun, those the tail passed were within
# 0.35 uas of the direct place, as close at 3 degrees as at 20 (0.33 and 0.25 uas for
# Venus, 0.24 and 0.12 for Mercury: the direct places' own scatter), and those it
# declined were 0.06 to 1,300 uas off (Saturn at 2 degrees; measured 2026-12-05).
# Below 3 degrees the bending grows too fast to lean on the tail alone.

PLACE_SEGMENT_BODIES = frozenset(("SUN", "MOON") + tuple(ephemeris.PLAN94_NUMBERS))
PLACE_SEGMENT_POINTS = {"MOON": 32}  # the grids (nodes.GRIDS) of places with more points
PLACE_SEGMENT_MIN_ELONGATION_DEG = 3.0
PLACE_SEGMENT_TAIL = 1e-12  # radians on the unit vector (0.2 uas)
_NEAR_SUN_COSINE = math.cos(math.radians(PLACE_SEGMENT_MIN_ELONGATION_DEG))
_PLACES_AT_POINTS = {}


def _place_from_segment(body, t1, t2, system, kind):
    """The unit vector (three floats, ``system``'s axes) of a body's place at an instant
    of which nodes.cell_is_dense has said yes, from the place's own segment, or None
    (a body without one, a perturbed orbit, a place not yet asked for often enough
    there, a segment declined)."""
    points = nodes.SEGMENT_POINTS
    if type(body) is str:
        if body not in PLACE_SEGMENT_BODIES:
            return None
        which = name = body
        points = PLACE_SEGMENT_POINTS.get(body, points)
    elif type(body) is orbits.Orbit and body.q.size == 1:
        which, elements = body, body.elements_floats(0)
        name = _ORBIT_NAMES.get(elements)
        if name is None:
            name = f"orbit {next(_ORBIT_NUMBERS)}"
            keep(_ORBIT_NAMES, elements, name, PLACES_AT_POINTS_KEPT)
    else:
        return None
    quantity = ("place", name, kind, system)
    if not nodes.quantity_is_dense(quantity, t1, t2):
        return None
    return nodes.from_nodes(quantity, _place_at_points(name, which, kind, system), t1, t2,
                            points)


# An orbit's place is kept under a name of its own, its elements (a tuple of ten floats,
# whose hash a tuple does not keep) looked up once a cell rather than hashed in each key
# of the segments' tables.  A name is never given twice: the counter runs on past the
# names dropped from this bounded table, which keys by the elements.
_ORBIT_NAMES = {}
_ORBIT_NUMBERS = itertools.count()


def _place_at_points(name, which, kind, system):
    """For nodes.from_nodes: the function giving the place of a body (``which``: a name,
    or a two-body orbits.Orbit of one row, named ``name``) at a segment's
    points (unit vectors, ``system``'s axes), each as a cell alone computes it; not a
    number over a segment it declines (nodes.py: its cells take the earlier way)."""
    found = _PLACES_AT_POINTS.get((name, kind, system))
    if found is not None:
        return found
    # (Not the Moon: its light never passes the Sun, whose bending of it stays smooth.)
    near_sun = kind == "APPARENT" and which not in ("SUN", "MOON")

    def directions(jd1, jd2):
        if nodes.on_usual_grid(jd2):
            states = ephemeris.earth_and_sun_at_points(jd1, jd2)
        else:  # the Moon's finer grid: the Earth from its own segment (within 1 m)
            states = nodes.segment_at("epv00", ephemeris.earth_and_sun_at_points,
                                      float(jd1[0]), jd2)
        u = _directions_at_points(which, kind, jd1, jd2, states)
        declined = np.abs(nodes.chebyshev_tail(u, jd2)).max(axis=(1, 2)) > PLACE_SEGMENT_TAIL
        if near_sun:  # the Sun's direction from the Earth, g, within the angle of u
            g = states[:, 6:9] - states[:, 0:3]
            near = (np.einsum("ni,ni->n", u, g)
                    > _NEAR_SUN_COSINE * np.sqrt(np.einsum("ni,ni->n", g, g)))
            declined |= near.reshape(declined.size, -1).any(axis=1)
        if declined.any():  # (a run's other segments are made)
            u = u.copy()
            u.reshape(declined.size, -1, 3)[declined] = np.nan
        return u

    def compute(jd1, jd2):
        u = nodes.shared_at_points(("direction", name, kind), directions, jd1, jd2)
        return np.einsum("nij,nj->ni", frames.matrices_at_points(system, jd1, jd2), u)

    keep(_PLACES_AT_POINTS, (name, kind, system), compute, PLACES_AT_POINTS_KEPT)
    return compute


PLACES_AT_POINTS_KEPT = 256  # the functions of places (a sheet of many orbits: bounded)


def _directions_at_points(which, kind, jd1, jd2, states):
    """(n, 3): the unit vectors (GCRS axes) of a body's place (a name, or a two-body
    orbits.Orbit of one row) at n instants (a segment's points) from the Earth's and the
    Sun's barycentric states there ((n, 12)), each the one a cell alone computes
    (``_direction_of_states``, ``_place_floats``), to the bit: the same steps on numpy's
    rows, element by element, with ERFA's theories called once for all the points.  An
    orbit's positions come from Orbit.state, as a column's do (Kepler's equation solved
    for all the points, the light time's instants from the f and g series): within
    1e-11 degree of the cells' steps on floats.  Point by point, each point had paid
    some ninety Python calls."""
    rows = np.ascontiguousarray(states.T)
    by_parts = ((rows[0], rows[1], rows[2]), (rows[3], rows[4], rows[5]),
                (rows[6], rows[7], rows[8]), (rows[9], rows[10], rows[11]))
    if type(which) is str:
        u = _direction_of_states(which, jd1, jd2, kind, by_parts, np.sqrt, np.maximum)
    else:
        orbit = which.copy()  # (its own last solution, which state() keeps)
        u = _place_floats(lambda tau: tuple(orbit.state(jd1, jd2 - tau)[0].T), by_parts,
                          kind, np.sqrt, np.maximum)
    return np.stack(u, axis=1)


def cell_on_floats(body, time, system, kind, source, index):
    """A place cell's twin on floats (cells.py's float lane): the longitude or latitude
    of ``spherical_component`` for one instant (``time``, a timescales.OneUTC), with the
    same value to the bit, or None where the lane does not take it (another source or
    body; then the cell's usual path)."""
    if source != BUILTIN:
        return None
    with nodes.single_cells():
        value = one_on_floats(body, *time.tt, system, kind, index)
    return None if value is None else shown_longitudes(value, index)


# A body's longitude or right ascension within WRAP_MARGIN_DEG below 360 reads 0.  At an
# equinox as SKY.SEASON gives it (found within the searches' tolerance, 1e-8 day, in
# which the Sun moves 1e-8 degree, then made a date-time value) the Sun's longitude would
# otherwise read 360 less a hair as often as nearly 0, and a cell shows 360.0000.
WRAP_MARGIN_DEG = 1e-8


def shown_longitudes(values, index):
    """Longitudes or RAs (``index`` 0; a float or an array) with those within
    WRAP_MARGIN_DEG below 360 read as 0; latitudes (1) as they are."""
    if index != 0:
        return values
    if type(values) is float:
        return 0.0 if values >= 360.0 - WRAP_MARGIN_DEG else values
    return np.where(values >= 360.0 - WRAP_MARGIN_DEG, 0.0, values)


def spherical_component(body, tt1, tt2, system, kind, source, index):
    """The longitude (``index`` 0) or latitude (1) of a body in a checked ``system`` at TT
    instants, degrees (``shown_longitudes``): on floats row by row where
    ``rows_on_floats`` takes the rows, on arrays otherwise."""
    return shown_longitudes(_spherical_component(body, tt1, tt2, system, kind, source, index),
                            index)


def _spherical_component(body, tt1, tt2, system, kind, source, index):
    done = rows_on_floats(body, tt1, tt2, system, kind, index) if source == BUILTIN else None
    if done is None:
        return frames.spherical(body_in(body, tt1, tt2, system, kind, source))[index]
    values, mask = done
    if mask is True:
        return values
    if not mask.all():  # a column reaching beyond BUILTIN_YEARS: the others on arrays
        rest = ~mask
        try:
            values[rest] = frames.spherical(
                body_in(body, tt1[rest], tt2[rest], system, kind, source))[index]
        except RowErrors as err:  # its rows' messages, in the column's rows
            messages = np.full(values.shape, None, dtype=object)
            found = err.messages.reshape(-1)
            messages[rest] = found if found.size == rest.sum() else str(err)
            raise RowErrors(messages) from None
    return values


def place_cells(body):
    """The cell functions (lon, lat, ra, dec) of a body's place: ecliptic J2000, DATE or
    TRUE, equatorial the same or ICRS."""
    def component(systems, index):
        def cells(time, frame="TRUE", kind="APPARENT", source=BUILTIN):
            with nodes.single_cells():  # a log filled down: nodes.for_one
                return spherical_component(body, *time.tt(), systems[frame], kind, source, index)

        def on_floats(time, frame="TRUE", kind="APPARENT", source=BUILTIN):
            return cell_on_floats(body, time, systems[frame], kind, source, index)
        cells.on_floats = on_floats
        return cells

    return (component(ECLIPTIC_OF_FRAME, 0), component(ECLIPTIC_OF_FRAME, 1),
            component(EQUATORIAL_OF_FRAME, 0), component(EQUATORIAL_OF_FRAME, 1))
