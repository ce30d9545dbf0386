"""The IAU constellation of a direction, of the Sun, the Moon or a planet.

The boundaries are Delporte's (1930), tabulated by Roman (1987) as strips of constant
right ascension and declination on the mean equator and equinox of B1875.0 (CDS VI/42,
in constellation_bounds.py).  A direction is precessed to B1875.0 (IAU 2006, ERFA
pmat06, from the ICRS axes) and looked up there.

Roman's rule takes the first strip, in the catalogue's order, with RA_low <= RA < RA_high
and Dec >= Dec_low.  The strips' edges cut the sphere into a grid of cells that each lie
in one constellation, so the rule is applied once, at each cell's middle, when the module
loads; a direction is then two binary searches and one table read.
"""

import erfa
import numpy as np

from . import bodies, frames, vectors
from .constellation_bounds import NAMES, STRIPS
from .vocabulary import BUILTIN

# B1875.0 as a TT Julian date (a Besselian epoch: ERFA epb2jd).
B1875 = erfa.epb2jd(1875.0)
TO_B1875 = erfa.pmat06(*B1875)  # ICRS axes to the mean equator and equinox of B1875.0

ABBREVIATIONS = tuple(sorted(NAMES))


def _grid():
    ra_low = np.array([s[0] for s in STRIPS]) * 15.0
    ra_high = np.array([s[1] for s in STRIPS]) * 15.0
    dec_low = np.array([s[2] for s in STRIPS])
    owner = np.array([ABBREVIATIONS.index(s[3]) for s in STRIPS])
    ra_edges = np.unique(np.concatenate([ra_low, ra_high, [0.0, 360.0]]))
    dec_edges = np.unique(np.concatenate([dec_low, [-90.0, 90.0]]))
    ra_mid = 0.5 * (ra_edges[:-1] + ra_edges[1:])
    dec_mid = 0.5 * (dec_edges[:-1] + dec_edges[1:])
    table = np.full((dec_mid.size, ra_mid.size), -1, dtype=np.int16)
    for j, dec in enumerate(dec_mid):
        inside = (dec >= dec_low)[:, None] & (ra_low[:, None] <= ra_mid) & (ra_mid < ra_high[:, None])
        first = np.argmax(inside, axis=0)
        table[j] = np.where(inside.any(axis=0), owner[first], -1)
    if np.any(table < 0):
        raise RuntimeError("the constellation strips leave part of the sky uncovered")
    return ra_edges, dec_edges, table


_RA_EDGES, _DEC_EDGES, _TABLE = _grid()


def lookup_b1875(ra_deg, dec_deg):
    """Index into ABBREVIATIONS of RA/Dec (degrees) on the equator and equinox of B1875.0."""
    ra = np.mod(np.asarray(ra_deg, dtype=float), 360.0)
    dec = np.clip(np.asarray(dec_deg, dtype=float), -90.0, 90.0)
    i = np.clip(np.searchsorted(_RA_EDGES, ra, side="right") - 1, 0, _TABLE.shape[1] - 1)
    j = np.clip(np.searchsorted(_DEC_EDGES, dec, side="right") - 1, 0, _TABLE.shape[0] - 1)
    return _TABLE[j, i]


def of_vectors(v, to_b1875=TO_B1875):
    """Indices into ABBREVIATIONS of directions (..., 3) that the rotation(s) ``to_b1875``
    take to the equator and equinox of B1875.0 (by default from the ICRS or GCRS axes)."""
    if np.ndim(to_b1875) == 2:
        # One rotation for every row, written out: on (n, 3) rows numpy's @ and einsum
        # took ten to a hundred times longer here, and BLAS's threads stall on a shared
        # machine.
        m = np.asarray(to_b1875)
        vx, vy, vz = v[..., 0], v[..., 1], v[..., 2]
        x = m[0, 0] * vx + m[0, 1] * vy + m[0, 2] * vz
        y = m[1, 0] * vx + m[1, 1] * vy + m[1, 2] * vz
        z = m[2, 0] * vx + m[2, 1] * vy + m[2, 2] * vz
    else:
        b = vectors.apply(to_b1875, v)
        x, y, z = b[..., 0], b[..., 1], b[..., 2]
    ra = np.degrees(np.arctan2(y, x))
    dec = np.degrees(np.arctan2(z, np.hypot(x, y)))
    return lookup_b1875(ra, dec)


def of_icrs_vectors(v):
    """Indices into ABBREVIATIONS of directions on the ICRS (or GCRS) axes."""
    return of_vectors(v)


_ABBREVIATION_ARRAY = np.array(ABBREVIATIONS, dtype=object)


def _words(index, form):
    abbr = _ABBREVIATION_ARRAY[index]
    if form == "NAME":
        return np.array([NAMES[a] for a in abbr.ravel()], dtype=object).reshape(abbr.shape)
    return abbr


# ---- cell functions -----------------------------------------------------------------


def constellation_cells(lon, lat, system, time, time_given, form="ABBREVIATION"):
    """The constellation of a direction given in any coordinate system of frames.py."""
    frames.check_latitudes(lat)
    tt1, tt2 = time.tt() if time is not None else (None, None)
    m_from = frames.system_matrix(system, tt1, tt2, time_given)
    # From the given system to B1875.0 in one rotation (one matrix for a fixed system).
    to_b1875 = vectors.compose(TO_B1875, m_from)
    return _words(of_vectors(frames.unit_vectors(lon, lat), to_b1875), form)


def body_constellation_cells(body, time, form="ABBREVIATION", kind="APPARENT", source=BUILTIN):
    """The constellation of the Sun, the Moon or a planet, geocentric, at the instants."""
    tt1, tt2 = time.tt()
    direction = bodies.geocentric(body, tt1, tt2, kind, source)[0]
    return _words(of_icrs_vectors(direction), form)
