"""The Moon: geocentric place, phase, nodes, the phases' instants and eclipse seasons.

Position: ERFA moon98 (Meeus's implementation of the ELP-2000/82 truncation; ERFA
states RMS 2.9", worst 18" in direction and 6 km in distance against ELP/MPP02 over
1950-2100), accepted here 1000-3000 like the other bodies.  APPARENT adds the light time
(about 1.3 s) and annual aberration; the Sun comes from sun.py.
"""

import erfa
import numpy as np

from . import frames
from .errors import SkyError, rows_failing
from .events import crossings, wrap180
from .sun import _FRAME_TO_ECLIPTIC, _FRAME_TO_EQUATORIAL, _as_result, _check_years, _rows
from .sun import LIGHT_DAYS_PER_AU, sun_in
from .timescales import _quiet

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


def moon_gcrs(tt1, tt2, kind="APPARENT"):
    """(unit vectors, distance in au, velocity au/day) of the Moon on the GCRS axes."""
    tt1, tt2 = np.broadcast_arrays(np.asarray(tt1, float), np.asarray(tt2, float))
    _check_years(tt1, tt2)
    pv = _quiet(erfa.moon98, tt1, tt2)
    p, v = pv["p"], pv["v"]
    distance = np.linalg.norm(p, axis=-1)
    if kind == "GEOMETRIC":
        return p / distance[..., None], distance, v
    tau = distance * LIGHT_DAYS_PER_AU
    astrometric = p - tau[..., None] * v
    u = astrometric / np.linalg.norm(astrometric, axis=-1)[..., None]
    if kind == "ASTROMETRIC":
        return u, distance, v
    pvh, pvb = _quiet(erfa.epv00, tt1, tt2)
    # Annual aberration applies to the place on barycentric axes, the Moon when the light
    # left it seen from where the Earth is now: p(t - tau) - tau V_earth.  Applied to the
    # geocentric p(t - tau) alone it adds the Earth's whole orbital aberration (up to
    # 20") to a body that shares the Earth's orbital motion.
    barycentric = astrometric - tau[..., None] * pvb["v"]
    ub = barycentric / np.linalg.norm(barycentric, axis=-1)[..., None]
    c = pvb["v"] * LIGHT_DAYS_PER_AU
    bm1 = np.sqrt(1.0 - np.sum(c * c, axis=-1))
    sun_distance = np.linalg.norm(pvh["p"], axis=-1)
    return erfa.ab(ub, c, sun_distance, bm1), distance, v


def moon_in(tt1, tt2, system, kind="APPARENT"):
    u, _, _ = moon_gcrs(tt1, tt2, kind)
    m = frames.system_matrix(system, tt1, tt2)
    return np.einsum("...ij,...j->...i", m, u)


def elongation_lon(tt1, tt2):
    """Apparent ecliptic longitude of the Moon minus the Sun's (true equinox), degrees
    in [0, 360): 0 new, 90 first quarter, 180 full, 270 last quarter."""
    moon = frames.spherical(moon_in(tt1, tt2, "ECLIPTIC TRUE"))[0]
    sun = frames.spherical(sun_in(tt1, tt2, "ECLIPTIC TRUE"))[0]
    return np.mod(moon - sun, 360.0)


def _phase_angle_rad(tt1, tt2):
    """Sun-Moon-Earth angle, from the geocentric Sun and Moon vectors."""
    from .sun import sun_gcrs

    um, dm, _ = moon_gcrs(tt1, tt2, "APPARENT")
    us, ds = sun_gcrs(tt1, tt2, "APPARENT")
    moon = um * dm[..., None]
    sun = us * ds[..., None]
    to_earth = -moon
    to_sun = sun - moon
    cross = np.linalg.norm(np.cross(to_earth, to_sun), axis=-1)
    return np.arctan2(cross, np.sum(to_earth * to_sun, axis=-1))


# ---- cell functions: place -------------------------------------------------------------


def lon_cells(time, frame="TRUE", kind="APPARENT"):
    return frames.spherical(moon_in(*time.tt(), _FRAME_TO_ECLIPTIC[frame], kind))[0]


def lat_cells(time, frame="TRUE", kind="APPARENT"):
    return frames.spherical(moon_in(*time.tt(), _FRAME_TO_ECLIPTIC[frame], kind))[1]


def ra_cells(time, frame="TRUE", kind="APPARENT"):
    return frames.spherical(moon_in(*time.tt(), _FRAME_TO_EQUATORIAL[frame], kind))[0]


def dec_cells(time, frame="TRUE", kind="APPARENT"):
    return frames.spherical(moon_in(*time.tt(), _FRAME_TO_EQUATORIAL[frame], kind))[1]


def distance_cells(time, unit="KM"):
    d = moon_gcrs(*time.tt(), "GEOMETRIC")[1] * AU_KM
    return d / EARTH_RADIUS_KM if unit == "EARTH_RADII" else d


def phase_angle_cells(time):
    return np.degrees(_phase_angle_rad(*time.tt()))


def illuminated_cells(time):
    """Illuminated fraction of the disc, (1 + cos phase angle) / 2."""
    return 0.5 * (1.0 + np.cos(_phase_angle_rad(*time.tt())))


def elongation_cells(time):
    """Moon minus Sun apparent ecliptic longitude, degrees in [0, 360)."""
    return elongation_lon(*time.tt())


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
    pv = _quiet(erfa.moon98, tt1, tt2)
    m = frames.system_matrix("ECLIPTIC DATE", tt1, tt2)
    r = np.einsum("...ij,...j->...i", m, pv["p"])
    v = np.einsum("...ij,...j->...i", m, pv["v"])
    h = np.cross(r, v)
    node = np.stack([-h[..., 1], h[..., 0], np.zeros_like(h[..., 0])], axis=-1)  # z x h
    return frames.spherical(node)[0]


# ---- the phases and eclipse seasons -----------------------------------------------------


def _phase_crossings(target, start, end):
    def f(jd1, jd2):
        return wrap180(elongation_lon(jd1, jd2) - target)

    # The elongation grows about 12 degrees a day: 6-hour samples never skip one.
    a, b = crossings(f, start, end, 0.25, direction=+1, jump=90.0)
    return a + b


def next_phase_cells(time, null_jd, phase="NEW", result_scale=None):
    """The first instant after ``time`` of a phase of the Moon."""
    tt1, tt2 = time.tt()
    jd = np.ravel(tt1 + tt2)

    def one(k):
        found = _phase_crossings(PHASES[phase], jd[k], jd[k] + 32.0)
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
