"""The Sun, the Moon and the planets as seen from a site on the Earth's surface.

How (the ERFA way, one of the two it offers): the observer's astrometry parameters are
built with ERFA apco for the site (horizon.observer_astrom), and the site's own position and
velocity on the GCRS axes are ERFA pvtob turned by the transpose of apco's CIO-based
bias-precession-nutation matrix, exactly as apco makes them.  The observer is then the
Earth's barycentric state (from the chosen source) plus the site's, and the body's
place is found from the observer itself, not from the geocentre:
  light time  iterated from the site (the body at t - tau minus the observer at t)
  deflection  the Sun's (ERFA ld), with the observer's heliocentric direction
  aberration  ERFA ab with the observer's barycentric velocity: annual plus diurnal
So the diurnal parallax (up to a degree for the Moon, 9" for the Sun) and the diurnal
aberration (up to 0.32") both come from the one vector, with no first-order formula.
Altitude and azimuth: that apparent direction turned into CIRS by apco's matrix and
handed to ERFA atioq (Earth rotation, site, refraction when a pressure is given), as
horizon.py does for catalogue places.  Polar motion is taken as zero.
"""

import erfa
import numpy as np

from . import bodies, ephemeris, frames, horizon, vectors
from .errors import SkyError, aligned_rows, rows_failing
from .timescales import Instants
from .vocabulary import AU_KM, AU_M, BUILTIN, DAY_SECONDS, EARTH_RADIUS_KM, EQUATORIAL_OF_FRAME

# The Moon's mean radius, 1737.4 km (IAU Working Group on Cartographic Coordinates; the
# value skyfield's rising search uses too).
MOON_RADIUS_KM = 1737.4
# The Sun's radius as almanacs take it for its semi-diameter: 959.63" at 1 au (Astronomical
# Almanac constants; from memory).
SUN_RADIUS_KM = 696000.0
BODIES = ("SUN", "MOON", "MERCURY", "VENUS", "MARS", "JUPITER", "SATURN", "URANUS",
          "NEPTUNE", "PLUTO")


class TopoPlace:
    """A body seen from a site: apparent unit vectors on the GCRS axes, the distance from
    the site (au), and the observer's ERFA astrometry parameters (for atioq)."""

    __slots__ = ("direction", "distance", "astrom", "pressure")

    def __init__(self, direction, distance, astrom, pressure):
        self.direction, self.distance = direction, distance
        self.astrom, self.pressure = astrom, pressure


def check_body(body):
    word = str(body).strip().upper()
    if word not in BODIES:
        raise SkyError(f'unknown body "{body}"; use ' + ", ".join(BODIES))
    return word


def site_state(time, latitude, longitude, height, astrom):
    """The site's position (au) and velocity (au/day) on the GCRS axes at the instants:
    ERFA pvtob (WGS84, polar motion zero) turned by the transpose of the CIO-based matrix
    that apco put in ``astrom`` (the same rotation apco itself applies)."""
    elong, phi, hm = horizon.site_radians(latitude, longitude, height)
    tt1, tt2 = time.tt()
    ut = time.to("UT")
    theta = erfa.era00(ut.jd1, ut.jd2)
    sp = erfa.sp00(tt1, tt2)
    pv = erfa.trxpv(astrom["bpn"], erfa.pvtob(elong, phi, hm, 0.0, 0.0, sp, theta))
    return pv["p"] / AU_M, pv["v"] * (DAY_SECONDS / AU_M)


def place(body, time, latitude, longitude, height=0.0, kind="APPARENT", source=BUILTIN,
          pressure=0.0, temperature=10.0):
    """The ``TopoPlace`` of SUN, MOON or a planet at a site (see the module's words), or of
    the body of an orbit of its own (orbits.Orbit, smallbodies.py), row by row: the one
    pipeline of bodies.place, observed from the site."""
    body = check_body(body) if isinstance(body, str) else body
    astrom, phpa = horizon.observer_astrom(time, latitude, longitude, height, pressure,
                                           temperature, "ICRS")
    site = site_state(time, latitude, longitude, height, astrom)
    tdb1, tdb2 = ephemeris.times_for(source, *np.broadcast_arrays(*time.tt()))
    p = bodies.place(body, tdb1, tdb2, kind, source, observer=site)
    return TopoPlace(p.direction, p.distance, astrom, phpa)


def observed(p):
    """(azimuth, zenith distance) in radians of a ``TopoPlace``: CIRS by apco's matrix,
    then ERFA atioq (refraction when the place was made with a pressure)."""
    ri, di = erfa.c2s(vectors.apply(p.astrom["bpn"], p.direction))
    aob, zob, _, _, _ = erfa.atioq(ri, di, p.astrom)
    horizon.check_refraction_range(p.pressure, 90.0 - np.degrees(zob))
    return aob, zob


# ---- cell functions ------------------------------------------------------------------


def equatorial(p, time, frame="TRUE"):
    """(RA, Dec) in degrees of a ``TopoPlace`` on the equator of ``frame`` (TRUE, DATE,
    J2000 or ICRS) at the instants."""
    return frames.spherical(bodies.in_system(p.direction, EQUATORIAL_OF_FRAME[frame],
                                             *time.tt()))


def altitude(p):
    """Altitude in degrees of a ``TopoPlace`` (refracted when it was made with a pressure)."""
    return 90.0 - np.degrees(observed(p)[1])


def azimuth(p):
    """Azimuth in degrees of a ``TopoPlace``, from north through east, in [0, 360)."""
    return frames.degrees_360(observed(p)[0])


def ra_cells(body, time, latitude, longitude, height=0.0, frame="TRUE", kind="APPARENT",
             source=BUILTIN):
    return equatorial(place(body, time, latitude, longitude, height, kind, source), time,
                      frame)[0]


def dec_cells(body, time, latitude, longitude, height=0.0, frame="TRUE", kind="APPARENT",
              source=BUILTIN):
    return equatorial(place(body, time, latitude, longitude, height, kind, source), time,
                      frame)[1]


def distance_cells(body, time, latitude, longitude, height=0.0, unit="AU", source=BUILTIN):
    d = place(body, time, latitude, longitude, height, "GEOMETRIC", source).distance
    return d * AU_KM if unit == "KM" else d


def altitude_cells(body, time, latitude, longitude, height=0.0, pressure=0.0,
                   temperature=10.0, source=BUILTIN):
    return altitude(place(body, time, latitude, longitude, height, "APPARENT", source,
                          pressure, temperature))


def azimuth_cells(body, time, latitude, longitude, height=0.0, pressure=0.0,
                  temperature=10.0, source=BUILTIN):
    return azimuth(place(body, time, latitude, longitude, height, "APPARENT", source,
                         pressure, temperature))


def semidiameter_degrees(body, distance_au):
    """Apparent semi-diameter (degrees) of the Sun or the Moon at a distance."""
    radius = MOON_RADIUS_KM if body == "MOON" else SUN_RADIUS_KM
    return np.degrees(np.arcsin(radius / (np.asarray(distance_au) * AU_KM)))


def moon_semidiameter_cells(time, latitude=None, longitude=None, height=0.0, source=BUILTIN,
                            latitude_given=None, longitude_given=None):
    """The Moon's apparent semi-diameter in arcminutes: from the site in rows that give
    one (larger by up to 1.8 % with the Moon overhead), else from the Earth's centre."""
    tt1, tt2 = np.broadcast_arrays(*time.tt())
    d = bodies.place_at_tt("MOON", tt1, tt2, "GEOMETRIC", source).distance
    if latitude_given is None:
        latitude_given = np.full(np.shape(tt1), latitude is not None)
        longitude_given = np.full(np.shape(tt1), longitude is not None)
    half = np.asarray(latitude_given) != np.asarray(longitude_given)
    if np.any(half):
        raise rows_failing(half, "give both the latitude and the longitude of the site, or "
                                 "neither (for the Earth's centre)")
    at_site = np.ravel(latitude_given)
    if np.any(at_site):
        d = np.array(np.ravel(d), dtype=float)
        rows = np.flatnonzero(at_site)
        sub = Instants(np.ravel(tt1)[rows], np.ravel(tt2)[rows], "TT", time.dut1)
        pick = lambda v: np.broadcast_to(np.ravel(v), at_site.shape)[rows]  # noqa: E731
        # A bad site in one row is that row's message, aligned with every row.
        d[rows] = aligned_rows(lambda: place("MOON", sub, pick(latitude), pick(longitude),
                                             pick(height), "GEOMETRIC", source).distance,
                               rows, at_site.size)
    return semidiameter_degrees("MOON", d) * 60.0


def moon_parallax_cells(time, source=BUILTIN):
    """The Moon's equatorial horizontal parallax in arcminutes: asin(a / r), a the
    Earth's equatorial radius, r the geocentric distance."""
    d = bodies.place_at_tt("MOON", *time.tt(), "GEOMETRIC", source).distance * AU_KM
    return np.degrees(np.arcsin(EARTH_RADIUS_KM / d)) * 60.0
