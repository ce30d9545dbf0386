"""The Moon: geocentric place, phase, nodes, the phases' instants and eclipse seasons.

Position: ERFA moon98 (Meeus's implementation of the ELP-2000/82 truncation; ERFA
states RMS 2.9", worst 18" in direction and 6 km in distance against ELP/MPP02 over
1950-2100), used here over 1000-3000 like ERFA's other theories, the same Meeus terms on
the long-term frames outside (longrange.py, to -4000 and +8000), or a JPL kernel.  The place
comes from the pipeline of bodies.py (light time of about 1.3 s; for APPARENT the Sun's
light deflection and annual aberration); the Sun from sun.py.
"""

import erfa
import numpy as np

from . import bodies, ephemeris, frames, vectors
from .errors import rows_failing
from .ephemeris import content_stamp
from .events import first_after, polished_crossings, wrap180
from .sun import sun_gcrs, sun_in
from .timescales import DateTimes, same_shape
from .vocabulary import AU_KM, BUILTIN, EARTH_RADIUS_KM, J2000_JD

PHASES = {"NEW": 0.0, "FIRST": 90.0, "FULL": 180.0, "LAST": 270.0}
# Ecliptic limits (common practice, e.g. the Explanatory Supplement): at new Moon a solar
# eclipse is possible when the Sun is within 18.5 degrees of a node; at full Moon a lunar
# (umbral) eclipse within 12.2 degrees.  These are the largest values; nearer the node
# is needed when the Moon is near apogee.
SOLAR_LIMIT_DEG = 18.5
LUNAR_LIMIT_DEG = 12.2


def moon_gcrs(tt1, tt2, kind="APPARENT", source=BUILTIN):
    """(unit vectors, distance in au) of the Moon on the GCRS axes.

    Through the one pipeline of bodies.py for every source: the astrometric place is
    the Moon's barycentric place when the light left it minus the Earth's now,
    m(t - tau) + E(t - tau) - E(t), so the Earth's own motion over the 1.3 s of light
    time (38 km, 20") is in it before annual aberration; leaving it out and aberrating
    the geocentric place instead counts the Earth's orbital motion twice.  The
    distance is that of the kind asked for (for APPARENT and ASTROMETRIC to where the
    light left the Moon: tens of metres from the geometric one)."""
    return bodies.geocentric("MOON", tt1, tt2, kind, source)


def elongation_lon(tt1, tt2, source=BUILTIN):
    """Apparent ecliptic longitude of the Moon minus the Sun's (true equinox), degrees
    in [0, 360): 0 new, 90 first quarter, 180 full, 270 last quarter.  The apparent
    Sun comes from the same ephemeris states as the Moon."""
    p = bodies.place_at_tt("MOON", tt1, tt2, "APPARENT", source)
    return np.mod(bodies.longitude_from_sun(p, tt1, tt2), 360.0)


def _phase_angle_rad(tt1, tt2, source=BUILTIN):
    """Sun-Moon-Earth angle, from the geocentric Sun and Moon vectors."""
    um, dm = moon_gcrs(tt1, tt2, "APPARENT", source)
    us, ds = sun_gcrs(tt1, tt2, "APPARENT", source)
    moon = um * dm[..., None]
    sun = us * ds[..., None]
    return vectors.angle_between(-moon, sun - moon)


# ---- cell functions: place -------------------------------------------------------------


lon_cells, lat_cells, ra_cells, dec_cells = bodies.place_cells("MOON")


def distance_cells(time, unit="KM", source=BUILTIN):
    d = moon_gcrs(*time.tt(), "GEOMETRIC", source)[1] * AU_KM
    return d / EARTH_RADIUS_KM if unit == "EARTH_RADII" else d


def phase_angle_cells(time, source=BUILTIN):
    return np.degrees(_phase_angle_rad(*time.tt(), source))


def illuminated_cells(time, source=BUILTIN):
    """Illuminated fraction of the disc, (1 + cos phase angle) / 2."""
    return 0.5 * (1.0 + np.cos(_phase_angle_rad(*time.tt(), source)))


# A new Moon's instant as SKY.MOON.PHASE.NEXT gives it (found within the event searches'
# tolerance, 1e-8 day, then made a date-time value, whose last bit is 0.6 us today) lies
# a hair before or after the crossing that another search finds: at it, the elongation
# would read 360 less a few billionths of a degree as often as nearly 0, and the age
# nearly a whole lunation as often as nearly 0.  Within these margins (that tolerance,
# 0.9 ms, in which the Moon gains 1.2e-7 degree on the Sun) both read the new Moon as at
# the instant.
NEW_MOON_MARGIN_DAYS = 1e-8
NEW_MOON_MARGIN_DEG = 1.2e-7


def elongation_cells(time, source=BUILTIN):
    """Moon minus Sun apparent ecliptic longitude, degrees in [0, 360); within
    NEW_MOON_MARGIN_DEG below 360, 0."""
    elongation = elongation_lon(*time.tt(), source)
    return np.where(elongation > 360.0 - NEW_MOON_MARGIN_DEG, 0.0, elongation)


def age_cells(time):
    """Days since the last new Moon (one within NEW_MOON_MARGIN_DAYS after the instant
    counts as at it: 0)."""
    tt1, tt2 = time.tt()
    tt1, tt2 = np.ravel(tt1), np.ravel(tt2)
    jd = tt1 + tt2  # where the sampling starts: the ages keep two parts
    roots = _phase_crossings(PHASES["NEW"], jd - 31.0, jd + NEW_MOON_MARGIN_DAYS)
    new1, new2, found = roots.first(
        jd.size, ~roots.after(tt1, tt2 + NEW_MOON_MARGIN_DAYS), last=True)
    if not np.all(found):
        raise rows_failing(~found, "no new Moon found in the month before")
    return np.maximum((tt1 - new1) + (tt2 - new2), 0.0)


def node_cells(time, kind="TRUE"):
    """Ecliptic longitude of the Moon's ascending node, mean equinox and ecliptic of date.

    MEAN: the mean node of Simon et al. (1994) as in the IERS Conventions 2003 (ERFA
    faom03).  TRUE: the osculating node of the built-in Moon's position and velocity
    (ERFA moon98 over 1000-3000, the long-range series outside).
    """
    tt1, tt2 = time.tt()
    if kind == "MEAN":
        t = ((tt1 - J2000_JD) + tt2) / 36525.0  # Julian centuries (TT)
        return frames.degrees_360(erfa.faom03(t))
    tt1, tt2 = np.broadcast_arrays(np.asarray(tt1, float), np.asarray(tt2, float))
    p, v = ephemeris.get(BUILTIN).moon_geocentric(tt1, tt2)
    r = bodies.in_system(p, "ECLIPTIC DATE", tt1, tt2)
    v = bodies.in_system(v, "ECLIPTIC DATE", tt1, tt2)
    h = np.cross(r, v)
    node = np.stack([-h[..., 1], h[..., 0], np.zeros_like(h[..., 0])], axis=-1)  # z x h
    return frames.spherical(node)[0]


# ---- the phases and eclipse seasons -----------------------------------------------------


def rough_elongation(tt1, tt2):
    """The Moon's elongation in longitude from the Sun to about half a degree: the mean
    elongation D and the largest periodic terms of the Moon's longitude (equation of the
    centre, evection, variation, the annual equation, reduction to the ecliptic) less
    the Sun's equation of the centre, with the fundamental arguments and coefficients
    of Meeus (Astronomical Algorithms, ch. 47 and 25).  For locating phases only: the
    search then refines with the full theory."""
    t = ((tt1 - J2000_JD) + tt2) / 36525.0
    d = np.radians(297.8501921 + 445267.1114034 * t)
    m = np.radians(357.5291092 + 35999.0502909 * t)
    mp = np.radians(134.9633964 + 477198.8675055 * t)
    f = np.radians(93.2720950 + 483202.0175233 * t)
    moon = (6.288774 * np.sin(mp) + 1.274027 * np.sin(2.0 * d - mp) + 0.658314 * np.sin(2.0 * d)
            + 0.213618 * np.sin(2.0 * mp) - 0.185116 * np.sin(m) - 0.114332 * np.sin(2.0 * f))
    sun = 1.914602 * np.sin(m) + 0.019993 * np.sin(2.0 * m)
    return np.degrees(d) + moon - sun


def _phase_crossings(target, start, end, source=BUILTIN):
    """``events.Roots`` of the Moon reaching a phase (elongation ``target``) in each
    row's window [start, end]."""
    def f(jd1, jd2, row):
        return wrap180(elongation_lon(jd1, jd2, source) - target)

    def rough(jd1, jd2, row):
        return wrap180(rough_elongation(jd1, jd2) - target)

    # The elongation grows 10 to 15 degrees a day and a phase comes once a month:
    # daily samples never hold two crossings, and never leap 90 degrees; the rough
    # elongation, off by under a degree (two hours), gives each phase to be polished.
    return polished_crossings(f, rough, start, end, 1.0, jump=90.0)


def next_phase_cells(time, phase="NEW", result_scale=None, source=BUILTIN):
    """The first instant after ``time`` of a phase of the Moon."""
    tt1, tt2 = (np.ravel(t) for t in same_shape(*time.tt()))
    target = PHASES[phase]
    # Windows on a 4-day grid reaching a lunation and a bit past: the phases of one
    # window are searched once for every instant in its block (events.first_after).
    keys = [("MOON PHASE", target, source, content_stamp(source))] * tt1.size
    jd1, jd2, found = first_after(lambda s, e, _rep: _phase_crossings(target, s, e, source),
                                  tt1, tt2, 30.0, 32.0, keys)
    if not np.all(found):
        raise rows_failing(~found, "no such phase found in the month after")
    return DateTimes.of_tt(jd1, jd2, result_scale or time.scale)


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
