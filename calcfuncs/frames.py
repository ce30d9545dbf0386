"""Celestial coordinate systems as rotations of the ICRS axes, and precession.

Every system is a 3x3 rotation M with v_system = M v_ICRS (the GCRS axes are those of
the ICRS, so the same matrices serve geocentric directions).  A conversion from system
A to system B is M_B M_A^T.  These are rotations of a direction: the centre
(geocentric, heliocentric, barycentric) and the kind of place (astrometric, apparent)
stay those of the input.

  ICRS                 the ICRS axes themselves
  EQUATORIAL J2000     mean equator and equinox of J2000.0: the IAU 2006 frame bias
  EQUATORIAL DATE      mean equator and equinox of date: IAU 2006 bias-precession (ERFA bp06)
  EQUATORIAL TRUE      true equator and equinox of date: IAU 2006/2000A (ERFA pnm06a's
                       steps, the nutation series from iau2000a.py)
  ECLIPTIC J2000       IAU 2006 mean ecliptic and equinox of J2000.0 (ERFA ecm06 at J2000)
  ECLIPTIC DATE        mean ecliptic and equinox of date (ERFA ecm06)
  ECLIPTIC TRUE        true equinox of date, on the ecliptic of date: the true equator
                       rotated by the true obliquity, so longitudes gain the nutation in
                       longitude and latitudes are those of the mean ecliptic
  GALACTIC             IAU 1958 system as realised for Hipparcos (ERFA icrs2g)
  INVARIABLE           the solar system's invariable plane (Souami and Souchay 2012:
                       inclination 1°34'43.3", ascending node 107°34'56" on the J2000
                       ecliptic); longitudes count from that node
"""


import math

import erfa
import numpy as np

from . import iau2000a, nodes, vectors
from .errors import SkyError, rows_failing
from .timescales import all_within_years, check_years, julian_year, same_shape
from .vocabulary import (DATED_SYSTEMS, IAU2006_YEARS, J2000_JD, SYSTEM_ALIASES,
                         SYSTEMS, VONDRAK_YEARS, years_text)

DATED = frozenset(DATED_SYSTEMS)
_ALIASES = dict(SYSTEM_ALIASES)

INVARIABLE_INCLINATION_DEG = 1.0 + 34.0 / 60.0 + 43.3 / 3600.0
INVARIABLE_NODE_DEG = 107.0 + 34.0 / 60.0 + 56.0 / 3600.0

J2000 = (J2000_JD, 0.0)


def _rot_x(angle):
    return erfa.rx(angle, np.eye(3))


def _rot_z(angle):
    return erfa.rz(angle, np.eye(3))


def _galactic_matrix():
    # ERFA gives the galactic system as a conversion of angles; its matrix is the
    # image of the three ICRS axes.
    cols = []
    for axis in np.eye(3):
        lon, lat = erfa.c2s(axis)
        gl, gb = erfa.icrs2g(lon, lat)
        cols.append(erfa.s2c(gl, gb))
    return np.array(cols).T


_FIXED = {}


def _fixed(system):
    if system not in _FIXED:
        if system == "ICRS":
            m = np.eye(3)
        elif system == "EQUATORIAL J2000":
            m = erfa.bp06(*J2000)[0]
        elif system == "ECLIPTIC J2000":
            m = erfa.ecm06(*J2000)
        elif system == "GALACTIC":
            m = _galactic_matrix()
        else:  # INVARIABLE
            m = (_rot_x(np.radians(INVARIABLE_INCLINATION_DEG))
                 @ _rot_z(np.radians(INVARIABLE_NODE_DEG)) @ erfa.ecm06(*J2000))
        _FIXED[system] = m
    return _FIXED[system]


def _nutation(jd1, jd2):
    """IAU 2000A nutation (dpsi, deps, radians) adjusted to IAU 2006: the model of ERFA
    nut06a, evaluated instant by instant in iau2000a.py (a third of nut06a's cost on
    distinct instants with the office's numpy; within 1e-6 micro-arcseconds of it)."""
    return iau2000a.nutation(jd1, jd2)


def _nutation_rows(jd1, jd2):
    return np.stack(_nutation(jd1, jd2), axis=-1)


def nutation_over_nodes(jd1, jd2):
    """The same, interpolated over half-day nodes for a dense column (nodes.py: within
    1.5 uas of the series), computed directly otherwise."""
    both = nodes.over_nodes(_nutation_rows, jd1, jd2)
    return both[..., 0], both[..., 1]


def _dated(system, jd1, jd2, nutation=_nutation):
    if system == "EQUATORIAL DATE":
        return erfa.bp06(jd1, jd2)[2]
    if system == "ECLIPTIC DATE":
        return erfa.ecm06(jd1, jd2)
    # The true systems from the steps of ERFA pnm06a (Fukushima-Williams angles, the
    # nutation, fw2m), so that the IAU 2000A series, the costly part, is evaluated once
    # (or interpolated) for both.  EQUATORIAL TRUE is pnm06a with the nutation of
    # iau2000a.py (within 1e-6 micro-arcseconds of nut06a's: 1e-14 of pnm06a); ECLIPTIC
    # TRUE turns the true equator about the true equinox by the true obliquity (the mean
    # IAU 2006 obliquity, pfw06's epsa, plus the nutation in obliquity).
    gamb, phib, psib, epsa = erfa.pfw06(jd1, jd2)
    dpsi, deps = nutation(jd1, jd2)
    m = erfa.fw2m(gamb, phib, psib + dpsi, epsa + deps)
    return m if system == "EQUATORIAL TRUE" else erfa.rx(epsa + deps, m)


@nodes.kept_per_instant
def nutation_one(jd1, jd2):
    """The IAU 2000A nutation (dpsi, deps) of one TT instant (floats), kept for the row's
    other columns, the true systems' and the obliquity's alike: the function a column's
    rows take, so a cell and its row of a column agree to the bit."""
    return iau2000a.nutation_one(jd1, jd2)


@nodes.kept_per_instant
def _dated_one(system, jd1, jd2):
    # A sheet asks for the same date in several columns and on every recalculation;
    # the full IAU 2006/2000A matrix costs about 80 us.  Read-only: every caller of
    # the date shares it.
    m = np.asarray(_dated(system, jd1, jd2, lambda a, b: nutation_one(jd1, jd2)))
    m.flags.writeable = False
    return m


def _long_term(system, jd1, jd2):
    """A dated system far from J2000: the long-term precession of Vondrak et al. (2011,
    ERFA ltpb, ltecm; bias included) and, for the true systems, the nutation of the IAU
    2000B series (ERFA nut00b) evaluated as it stands, its 77 terms and fundamental
    arguments extended beyond the era they were fitted to (their error there is not
    published)."""
    epj = 2000.0 + ((jd1 - J2000_JD) + jd2) / 365.25
    if system == "EQUATORIAL DATE":
        return erfa.ltpb(epj)
    ecliptic = erfa.ltecm(epj)
    if system == "ECLIPTIC DATE":
        return ecliptic
    dpsi, deps = erfa.nut00b(jd1, jd2)
    true_ecliptic = erfa.rz(-dpsi, ecliptic)  # longitudes gain the nutation in longitude
    if system == "ECLIPTIC TRUE":
        return true_ecliptic
    # EQUATORIAL TRUE: the true equator is the true ecliptic turned back by the true
    # obliquity, the mean obliquity being the angle between the two long-term poles.
    eps = np.arccos(np.einsum("...i,...i->...", erfa.ltpequ(epj), erfa.ltpecl(epj)))
    return erfa.rx(-(eps + deps), true_ecliptic)


def _in_iau2006_years(jd1, jd2):
    years = julian_year(jd1, jd2)
    return (years >= IAU2006_YEARS[0]) & (years <= IAU2006_YEARS[1])


def true_nutation_in_longitude(jd1, jd2):
    """The nutation in longitude (radians) that the true systems of places take (as
    _dated_any_year builds them): IAU 2000A adjusted to IAU 2006 (iau2000a.py) over
    IAU2006_YEARS, the IAU 2000B series of the long-term models outside."""
    jd1, jd2 = same_shape(jd1, jd2)
    inside = _in_iau2006_years(jd1, jd2)
    out = np.empty(jd1.shape)
    if np.any(inside):
        out[inside] = _nutation(jd1[inside], jd2[inside])[0]
    if not np.all(inside):
        out[~inside] = erfa.ufunc.nut00b(jd1[~inside], jd2[~inside])[0]
    return out


def _dated_any_year(system, jd1, jd2):
    """IAU 2006/2000A inside IAU2006_YEARS, the long-term models outside (row by row)."""
    inside = _in_iau2006_years(jd1, jd2)
    if np.all(inside):
        return _dated(system, jd1, jd2)
    check_years(jd1, jd2, VONDRAK_YEARS, f"{system} uses the long-term precession")
    if not np.any(inside):
        return _long_term(system, jd1, jd2)
    m = np.empty(jd1.shape + (3, 3))
    m[inside] = _dated(system, jd1[inside], jd2[inside])
    m[~inside] = _long_term(system, jd1[~inside], jd2[~inside])
    return m


def check_system(name):
    word = " ".join(str(name).replace("_", " ").replace(".", " ").split()).upper()
    word = _ALIASES.get(word, word)
    if word not in SYSTEMS:
        raise SkyError(f'unknown coordinate system "{name}"; use ' + ", ".join(SYSTEMS))
    return word


def system_matrix(system, jd1=None, jd2=None, given=None, smooth=False, long_term=False):
    """Rotation(s) from ICRS axes to ``system`` at TT dates (arrays, or None if fixed).
    ``smooth``: the nutation may be interpolated over nodes in a dense column (for the
    places of bodies, whose own theories are far coarser than the interpolation; a
    conversion of the user's coordinates keeps the series itself).
    ``long_term``: dates outside IAU2006_YEARS take the long-term models (_long_term)
    instead of a message (the places of bodies, whose built-in source reaches further)."""
    system = check_system(system)
    if system not in DATED:
        return _fixed(system)
    jd1 = np.asarray(jd1, dtype=float)
    jd2 = np.asarray(jd2, dtype=float)
    if given is not None and not np.all(given):
        raise rows_failing(~np.asarray(given, dtype=bool), f"{system} needs the time argument")
    jd1, jd2 = same_shape(jd1, jd2)
    if not all_within_years(jd1, jd2, IAU2006_YEARS):
        if long_term:
            return _dated_any_year(system, jd1, jd2)
        check_years(jd1, jd2, IAU2006_YEARS, f"{system} uses IAU 2006/2000A",
                    "for other dates precess with SKY.PRECESS.RA/DEC and model VONDRAK2011")
    if jd1.size == 1 and smooth:
        # A cell of a dense log of places (nodes.single_cells): the nutation from its
        # segment's coefficients.
        both = nodes.for_one("nut06a", iau2000a.nutation_at_points, jd1, jd2)
        if both is not None:
            return _dated(system, jd1, jd2, lambda a, b: (both[..., 0], both[..., 1]))
    if jd1.size == 1:
        # A single cell: its matrix (kept, and so read-only) shaped as the row.
        return _dated_one(system, float(jd1.flat[0]), float(jd2.flat[0])).reshape(
            jd1.shape + (3, 3))
    if (jd1 == jd1.flat[0]).all() and (jd2 == jd2.flat[0]).all():
        # One date for every row (a single cell against a column): one matrix.
        m = _dated_one(system, float(jd1.flat[0]), float(jd2.flat[0]))
        return np.broadcast_to(m, jd1.shape + (3, 3))
    return _dated(system, jd1, jd2, nutation_over_nodes if smooth else _nutation)


def matrix_rows(system, jd1, jd2, dense=False):
    """The rotation from ICRS axes to a checked ``system`` at one TT date (floats) as
    three rows of three floats, the IAU 2006/2000A matrix of a single cell
    (``_dated_one``, kept; ``dense``: the matrix itself from the segment of a log's cells,
    nodes.py): for a place computed on floats."""
    if system not in DATED:
        found = _FIXED_ROWS.get(system)
        if found is None:
            found = _FIXED_ROWS[system] = _fixed(system).tolist()
        return found
    if dense:  # the matrix itself from the segment's coefficients
        m = nodes.from_nodes(("matrix", system), _MATRIX_POINTS[system], jd1, jd2)
        return [m[0:3], m[3:6], m[6:9]]
    return _dated_one(system, jd1, jd2).tolist()


def matrices_at_points(system, jd1, jd2):
    """(n, 3, 3): the rotation from ICRS axes to a checked ``system`` at a segment's points
    (nodes.py), the nutation over them shared with the matrices' own segments; at another
    grid's points (the Moon's), from the matrix's own segment (within 0.1 uas)."""
    if system not in DATED:
        return np.broadcast_to(_fixed(system), (np.size(jd1), 3, 3))
    if not nodes.on_usual_grid(jd2):  # another grid's points: from the matrix's segment
        return nodes.segment_at(("matrix", system), _MATRIX_POINTS[system], float(jd1[0]),
                                jd2).reshape(-1, 3, 3)
    return _MATRIX_POINTS[system](jd1, jd2).reshape(-1, 3, 3)


def _matrix_points(system):
    """The nine elements of ``system``'s matrix at a segment's points (nodes.py), the
    nutation series evaluated over them at once (``_nutation_at_points``)."""
    def compute(jd1, jd2):
        return _dated(system, jd1, jd2, _nutation_at_points).reshape(-1, 9)
    return compute


_MATRIX_POINTS = {system: _matrix_points(system) for system in DATED}


def _nutation_at_points(jd1, jd2):
    """The nutation at a segment's points, shared by the segments of every system (a log
    whose row holds a longitude and a declination asks for two systems' matrices over the
    same points, and the series over them is most of a segment's cost)."""
    return nodes.shared_at_points("nutation", _nutation_vector_pair, jd1, jd2)


def _nutation_vector_pair(jd1, jd2):
    return tuple(iau2000a.nutation_at_points(jd1, jd2).T)




_FIXED_ROWS = {}


def spherical_floats(x, y, z, index):
    """``spherical``'s longitude (``index`` 0, in [0, 360)) or latitude (1), degrees, of
    one vector of floats: the steps of ERFA c2s and anp and of ``degrees_360``."""
    if index == 0:
        return degrees_360_float(0.0 if x * x + y * y == 0.0 else math.atan2(y, x))
    xy = x * x + y * y
    return math.degrees(0.0 if z == 0.0 else math.atan2(z, math.sqrt(xy)))


def degrees_360_float(radians):
    """``degrees_360`` of one float: the steps of ERFA anp, then degrees."""
    angle = math.fmod(radians, _TURN)
    if angle < 0.0:
        angle += _TURN
    degrees = math.degrees(angle)
    return 0.0 if degrees >= 360.0 else degrees


_TURN = 2.0 * math.pi


def rotate(v, m_from, m_to):
    """Vectors (..., 3) from one system to another: M_to M_from^T v."""
    # Both fixed: one 3x3 matrix for all rows.  Otherwise the vectors are turned in
    # two steps rather than a matrix composed for every row (a third of a column's
    # rotation).  einsum, not BLAS (@): its sums for a row do not depend on how many
    # rows there are, so a column gives each row the value of its cell alone.
    if m_from.ndim > 2 or m_to.ndim > 2:
        return vectors.apply(m_to, vectors.apply_transposed(m_from, v))
    return vectors.apply(vectors.compose(m_to, m_from), v)


def unit_vectors(lon_deg, lat_deg):
    return erfa.s2c(np.radians(lon_deg), np.radians(lat_deg))


def degrees_360(radians):
    """Degrees in [0, 360): ERFA anp of a tiny negative angle rounds to 2 pi itself."""
    d = np.degrees(erfa.anp(radians))
    return np.where(d >= 360.0, 0.0, d)


def spherical(vectors):
    """(longitude in [0, 360), latitude) in degrees of vectors (..., 3)."""
    lon, lat = erfa.c2s(vectors)
    return degrees_360(lon), np.degrees(lat)


def check_latitudes(lat_deg, what="latitude"):
    if type(lat_deg) is np.ndarray and lat_deg.size == 1 and not abs(lat_deg.flat[0]) > 90.0:
        return  # a cell's one latitude, within range (told without numpy's reductions)
    lat = np.asarray(lat_deg, dtype=float)
    bad = np.abs(lat) > 90.0
    if np.any(bad):
        raise rows_failing(bad, f"the {what} must be within -90 to +90 degrees")


def convert(lon, lat, from_system, to_system, jd1=None, jd2=None, given=None):
    """Unit vectors of (lon, lat) in ``from_system`` expressed in ``to_system``."""
    check_latitudes(lat)
    m_from = system_matrix(from_system, jd1, jd2, given)
    m_to = system_matrix(to_system, jd1, jd2, given)
    return rotate(unit_vectors(lon, lat), m_from, m_to)


# ---- cell functions -----------------------------------------------------------------


def _tt(time):
    if time is None:
        return None, None
    return time.tt()


def coord_lon_cells(lon, lat, from_system, to_system, time, time_given):
    v = convert(lon, lat, from_system, to_system, *_tt(time), time_given)
    return spherical(v)[0]


def coord_lat_cells(lon, lat, from_system, to_system, time, time_given):
    v = convert(lon, lat, from_system, to_system, *_tt(time), time_given)
    return spherical(v)[1]


def _coord_xyz(axis, lon, lat, from_system, to_system, distance, time, time_given):
    v = convert(lon, lat, from_system, to_system, *_tt(time), time_given)
    return v[..., axis] * distance


def coord_x_cells(lon, lat, from_system, to_system, time, time_given, distance=1.0):
    return _coord_xyz(0, lon, lat, from_system, to_system, distance, time, time_given)


def coord_y_cells(lon, lat, from_system, to_system, time, time_given, distance=1.0):
    return _coord_xyz(1, lon, lat, from_system, to_system, distance, time, time_given)


def coord_z_cells(lon, lat, from_system, to_system, time, time_given, distance=1.0):
    return _coord_xyz(2, lon, lat, from_system, to_system, distance, time, time_given)


def _xyz(x, y, z):
    v = np.stack([np.asarray(x, float), np.asarray(y, float), np.asarray(z, float)], axis=-1)
    zero = ~np.any(v != 0.0, axis=-1)
    if np.any(zero):
        raise rows_failing(zero, "the vector (0, 0, 0) has no direction")
    return v


def rect_lon_cells(x, y, z):
    return spherical(_xyz(x, y, z))[0]


def rect_lat_cells(x, y, z):
    return spherical(_xyz(x, y, z))[1]


def rect_dist_cells(x, y, z):
    return np.linalg.norm(_xyz(x, y, z), axis=-1)


# ---- precession ---------------------------------------------------------------------


def precession_matrices(jd1, jd2, model):
    """Rotations from ICRS axes to the mean equator and equinox of each TT date."""
    if model == "IAU2006":
        check_years(jd1, jd2, IAU2006_YEARS, "the epoch is outside IAU2006 precession",
                    f"use VONDRAK2011 ({years_text(VONDRAK_YEARS)})")
        return erfa.pmat06(jd1, jd2)
    check_years(jd1, jd2, VONDRAK_YEARS, "the epoch is outside VONDRAK2011 precession")
    return erfa.ltpb(julian_year(jd1, jd2))


def _within(years, span):
    return (years >= span[0]) & (years <= span[1])


def precess(ra, dec, from_epoch, to_epoch, model="AUTO"):
    """Unit vectors of mean-equator-and-equinox positions moved between two epochs.

    AUTO takes IAU 2006 (Capitaine et al. 2003, ERFA pmat06) when both epochs lie in
    1000-3000 and the long-term model of Vondrak et al. (2011, ERFA ltpb) otherwise.
    """
    check_latitudes(dec, "declination")
    f1, f2 = from_epoch.tt()
    t1, t2 = to_epoch.tt()
    f1, f2, t1, t2 = np.broadcast_arrays(f1, f2, t1, t2)
    if model == "AUTO":
        inside = _within(julian_year(f1, f2), IAU2006_YEARS) & _within(julian_year(t1, t2),
                                                                       IAU2006_YEARS)
        m_from = np.empty(f1.shape + (3, 3))
        m_to = np.empty(f1.shape + (3, 3))
        for mask, name in ((inside, "IAU2006"), (~inside, "VONDRAK2011")):
            if np.any(mask):
                m_from[mask] = precession_matrices(f1[mask], f2[mask], name)
                m_to[mask] = precession_matrices(t1[mask], t2[mask], name)
    else:
        m_from = precession_matrices(f1, f2, model)
        m_to = precession_matrices(t1, t2, model)
    return rotate(unit_vectors(ra, dec), m_from, m_to)


def precess_ra_cells(ra, dec, from_epoch, to_epoch, model="AUTO"):
    return spherical(precess(ra, dec, from_epoch, to_epoch, model))[0]


def precess_dec_cells(ra, dec, from_epoch, to_epoch, model="AUTO"):
    return spherical(precess(ra, dec, from_epoch, to_epoch, model))[1]
