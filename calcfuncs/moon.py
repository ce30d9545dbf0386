"""The Moon: geocentric place, phase, nodes, the phases' instants and eclipse seasons.

Position: ERFA moon98 (Meeus's implementation of the ELP-2000/82 truncation; ERFA
states RMS 2.9", worst 18" in direction and 6 km in distance against ELP/MPP02 over
1950-2100), accepted here 1000-3000 like the other bodies, or a JPL kernel.  The place
comes from the pipeline of bodies.py (light time of about 1.3 s; for APPARENT the Sun's
light deflection and annual aberration); the Sun from sun.py.
"""

import erfa
import numpy as np

from . import ephemeris, frames
from .errors import SkyError, rows_failing
from .events import crossings, wrap180
from .sun import _as_result, _check_years, _rows, place_cells
from .sun import sun_in
from .timescales import erfa_quietly

EARTH_RADIUS_KM = 6378.1366  # IERS 2010 equatorial radius (common practice)
AU_KM = erfa.DAU / 1000.0
PHASES = {"NEW": 0.0, "FIRST": 90.0, "FULL": 180.0, "LAST": 270.0}
# Ecliptic limits (common practice, e.g. the Explanatory Supplement): at new Moon a solar
# eclipse is possible when the Sun is within 18.5 degrees of a node; at full Moon a lunar
# (umbral) eclipse within 12.2 degrees.  These are the largest values; nearer the node
# is needed when the Moon is near apogee.
SOLAR_LIMIT_DEG = 18.5
LUNAR_LIMIT_DEG = 12.2
SYNODIC_DAYS = 29.530589


def moon_gcrs(tt1, tt2, kind="APPARENT", source="BUILTIN"):
    """(unit vectors, distance in au) of the Moon on the GCRS axes.

    Through the one pipeline of bodies.py for every source: the astrometric place is
    the Moon's barycentric place when the light left it minus the Earth's now,
    m(t - tau) + E(t - tau) - E(t), so the Earth's own motion over the 1.3 s of light
    time (38 km, 20") is in it before annual aberration; leaving it out and aberrating
    the geocentric place instead counts the Earth's orbital motion twice.  The
    distance is that of the kind asked for (for APPARENT and ASTROMETRIC to where the
    light left the Moon: tens of metres from the geometric one)."""
    from .bodies import place

    tt1, tt2 = np.broadcast_arrays(np.asarray(tt1, float), np.asarray(tt2, float))
    if source == "BUILTIN":
        _check_years(tt1, tt2)
    p = place("MOON", *ephemeris.times_for(source, tt1, tt2), kind, source)
    return p.direction, p.distance


def moon_in(tt1, tt2, system, kind="APPARENT", source="BUILTIN"):
    u, _ = moon_gcrs(tt1, tt2, kind, source)
    m = frames.system_matrix(system, tt1, tt2)
    return np.einsum("...ij,...j->...i", m, u)


def elongation_lon(tt1, tt2, source="BUILTIN"):
    """Apparent ecliptic longitude of the Moon minus the Sun's (true equinox), degrees
    in [0, 360): 0 new, 90 first quarter, 180 full, 270 last quarter."""
    # Nutation turns the true ecliptic frame about the ecliptic's own pole (the plane
    # does not nutate), so a difference of longitudes is the same on the mean ecliptic
    # of date, whose matrix costs a hundredth as much.
    moon = frames.spherical(moon_in(tt1, tt2, "ECLIPTIC DATE", "APPARENT", source))[0]
    sun = frames.spherical(sun_in(tt1, tt2, "ECLIPTIC DATE", "APPARENT", source))[0]
    return np.mod(moon - sun, 360.0)


def _phase_angle_rad(tt1, tt2, source="BUILTIN"):
    """Sun-Moon-Earth angle, from the geocentric Sun and Moon vectors."""
    from .sun import sun_gcrs

    um, dm = moon_gcrs(tt1, tt2, "APPARENT", source)
    us, ds = sun_gcrs(tt1, tt2, "APPARENT", source)
    moon = um * dm[..., None]
    sun = us * ds[..., None]
    to_earth = -moon
    to_sun = sun - moon
    cross = np.linalg.norm(np.cross(to_earth, to_sun), axis=-1)
    return np.arctan2(cross, np.sum(to_earth * to_sun, axis=-1))


# ---- cell functions: place -------------------------------------------------------------


lon_cells, lat_cells, ra_cells, dec_cells = place_cells(moon_in)


def distance_cells(time, unit="KM", source="BUILTIN"):
    d = moon_gcrs(*time.tt(), "GEOMETRIC", source)[1] * AU_KM
    return d / EARTH_RADIUS_KM if unit == "EARTH_RADII" else d


def phase_angle_cells(time, source="BUILTIN"):
    return np.degrees(_phase_angle_rad(*time.tt(), source))


def illuminated_cells(time, source="BUILTIN"):
    """Illuminated fraction of the disc, (1 + cos phase angle) / 2."""
    return 0.5 * (1.0 + np.cos(_phase_angle_rad(*time.tt(), source)))


def elongation_cells(time, source="BUILTIN"):
    """Moon minus Sun apparent ecliptic longitude, degrees in [0, 360)."""
    return elongation_lon(*time.tt(), source)


def age_cells(time):
    """Days since the last new Moon."""
    tt1, tt2 = time.tt()
    jd = np.ravel(tt1 + tt2)

    def one(k):
        found = _phase_crossings(0.0, jd[k] - 31.0, jd[k])
        before = found[found <= jd[k]]
        if not before.size:
            raise SkyError("no new Moon found in the month before")
        return jd[k] - before[-1]

    return np.array(_rows(jd.size, one))


def node_cells(time, kind="TRUE"):
    """Ecliptic longitude of the Moon's ascending node, mean equinox and ecliptic of date.

    MEAN: the mean node of Simon et al. (1994) as in the IERS Conventions 2003 (ERFA
    faom03).  TRUE: the osculating node of ERFA moon98's position and velocity.
    """
    tt1, tt2 = time.tt()
    if kind == "MEAN":
        t = ((tt1 - 2451545.0) + tt2) / 36525.0
        return frames.degrees_360(erfa.faom03(t))
    tt1, tt2 = np.broadcast_arrays(np.asarray(tt1, float), np.asarray(tt2, float))
    _check_years(tt1, tt2)
    pv = erfa_quietly(erfa.moon98, tt1, tt2)
    m = frames.system_matrix("ECLIPTIC DATE", tt1, tt2)
    r = np.einsum("...ij,...j->...i", m, pv["p"])
    v = np.einsum("...ij,...j->...i", m, pv["v"])
    h = np.cross(r, v)
    node = np.stack([-h[..., 1], h[..., 0], np.zeros_like(h[..., 0])], axis=-1)  # z x h
    return frames.spherical(node)[0]


# ---- the phases and eclipse seasons -----------------------------------------------------


def _phase_crossings(target, start, end, source="BUILTIN"):
    def f(jd1, jd2):
        return wrap180(elongation_lon(jd1, jd2, source) - target)

    # The elongation grows 10 to 15 degrees a day and a phase comes once a month:
    # daily samples never hold two crossings, and never leap 90 degrees.
    a, b = crossings(f, start, end, 1.0, direction=+1, jump=90.0)
    return a + b


def next_phase_cells(time, null_jd, phase="NEW", result_scale=None, source="BUILTIN"):
    """The first instant after ``time`` of a phase of the Moon."""
    tt1, tt2 = time.tt()
    jd = np.ravel(tt1 + tt2)

    def one(k):
        found = _phase_crossings(PHASES[phase], jd[k], jd[k] + 32.0, source)
        after = found[found > jd[k]]
        if not after.size:
            raise SkyError("no such phase found in the month after")
        return after[0]

    found = np.array(_rows(jd.size, one))
    base = np.floor(found) + 0.5
    return _as_result(base, found - base, result_scale or time.scale, null_jd)


def node_distance_cells(time):
    """The Sun's angular distance (in ecliptic longitude) from the nearer lunar node,
    degrees 0 to 90, using the true node."""
    tt1, tt2 = time.tt()
    node = node_cells(time, "TRUE")
    sun = frames.spherical(sun_in(tt1, tt2, "ECLIPTIC DATE"))[0]
    d = np.abs(wrap180(sun - node))
    return np.minimum(d, 180.0 - d)


def eclipse_cells(time):
    """At a new or full Moon: whether an eclipse is possible by the ecliptic limits."""
    elong = elongation_cells(time)
    dist = node_distance_cells(time)
    new = np.minimum(elong, 360.0 - elong) < 10.0
    full = np.abs(elong - 180.0) < 10.0
    neither = ~(new | full)
    if np.any(neither):
        raise rows_failing(neither, "give the instant of a new or full Moon (SKY.MOON.PHASE.NEXT); "
                                    "the Moon is not near either")
    out = np.empty(elong.shape, dtype=object)
    out[new & (dist < SOLAR_LIMIT_DEG)] = "solar eclipse possible"
    out[new & (dist >= SOLAR_LIMIT_DEG)] = "no solar eclipse"
    out[full & (dist < LUNAR_LIMIT_DEG)] = "lunar eclipse possible"
    out[full & (dist >= LUNAR_LIMIT_DEG)] = "no lunar eclipse"
    return out
