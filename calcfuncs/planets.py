"""The planets, Mercury to Neptune (and Pluto from a kernel): heliocentric and
geocentric places, elongation, phase, and the instants of conjunctions and oppositions.

Heliocentric coordinates are geometric (no light time), as almanacs print them, on
the ecliptic of J2000.0, the mean ecliptic and equinox of date, or the true equinox.
Geocentric places come from bodies.place (light time, deflection, aberration).
Conjunctions and oppositions are in geocentric apparent ecliptic longitude (the
almanacs' convention): the planet's longitude minus the Sun's is 0 or 180 degrees.
Greatest elongations (Mercury, Venus) are the maxima of the apparent elongation, east
(evening sky) or west (morning sky) of the Sun.
"""

import erfa
import numpy as np

from . import bodies, ephemeris, frames, nodes, vectors
from .errors import SkyError, rows_failing
from .events import crossings, first_after, polished_crossings, wrap180
from .timescales import DateTimes, same_shape
from .vocabulary import BUILTIN, ECLIPTIC_OF_FRAME, EQUATORIAL_OF_FRAME, LIGHT_DAYS_PER_AU

INNER = ("MERCURY", "VENUS")
# Mean synodic periods in days (common practice): the longest gap between two events
# of one kind, so a search over a little more than one always finds the next.
SYNODIC_DAYS = {"MERCURY": 115.88, "VENUS": 583.92, "MARS": 779.94, "JUPITER": 398.88,
                "SATURN": 378.09, "URANUS": 369.66, "NEPTUNE": 367.49, "PLUTO": 366.73}
_DERIVATIVE_STEP_DAYS = 0.02  # half-width of the central difference for elongation's rate
# A greatest elongation is a maximum of the elongation well away from the Sun: Mercury's
# come at 17.9 to 27.8 degrees, Venus's at 45 to 47.  At a conjunction the elongation is
# only the difference in latitude (under about 5 degrees for Mercury and 9 for Venus at
# inferior conjunction; common practice, from memory), and its least value falls near,
# not at, the moment the planet changes sides: there its rate may already (or still) be
# negative on the side searched.  Below this elongation the rate is not looked at, so
# that moment is never taken for a maximum.
_GREATEST_ELONGATION_ABOVE_DEG = 12.0


def _tdb_tt(time, source):
    """The source's argument times (ephemeris.times_for) and TT, for the frames."""
    tt1, tt2 = time.tt()
    return (*ephemeris.times_for(source, tt1, tt2), tt1, tt2)


# ---- heliocentric ----------------------------------------------------------------------


def _helio_ecliptic(body, time, frame, source):
    tdb1, tdb2, tt1, tt2 = _tdb_tt(time, source)
    p = bodies.heliocentric(body, tdb1, tdb2, source)
    return bodies.in_system(p, ECLIPTIC_OF_FRAME[frame], tt1, tt2)


def helio_lon_cells(body, time, frame="DATE", source=BUILTIN):
    return frames.spherical(_helio_ecliptic(body, time, frame, source))[0]


def helio_lat_cells(body, time, frame="DATE", source=BUILTIN):
    return frames.spherical(_helio_ecliptic(body, time, frame, source))[1]


def helio_dist_cells(body, time, source=BUILTIN):
    tdb1, tdb2, _, _ = _tdb_tt(time, source)
    return vectors.norm(bodies.heliocentric(body, tdb1, tdb2, source))


def helio_x_cells(body, time, frame="DATE", source=BUILTIN):
    return _helio_ecliptic(body, time, frame, source)[..., 0]


def helio_y_cells(body, time, frame="DATE", source=BUILTIN):
    return _helio_ecliptic(body, time, frame, source)[..., 1]


def helio_z_cells(body, time, frame="DATE", source=BUILTIN):
    return _helio_ecliptic(body, time, frame, source)[..., 2]


# ---- geocentric ------------------------------------------------------------------------


def _place(body, time, kind, source):
    tdb1, tdb2, tt1, tt2 = _tdb_tt(time, source)
    return bodies.place(body, tdb1, tdb2, kind, source), tt1, tt2


def _spherical_in(body, time, system, kind, source, index):
    with nodes.single_cells():  # a log filled down: nodes.for_one
        return bodies.spherical_component(body, *time.tt(), system, kind, source, index)


def _place_cell(systems, index):
    """A cell function of a planet's place (longitude or latitude, ``index`` 0 or 1, in
    the system of ``systems[frame]``), with its twin on floats (cells.py's float lane)."""
    def cells(body, time, frame="TRUE", kind="APPARENT", source=BUILTIN):
        return _spherical_in(body, time, systems[frame], kind, source, index)

    def on_floats(body, time, frame="TRUE", kind="APPARENT", source=BUILTIN):
        return bodies.cell_on_floats(body, time, systems[frame], kind, source, index)
    cells.on_floats = on_floats
    return cells


lon_cells = _place_cell(ECLIPTIC_OF_FRAME, 0)
lat_cells = _place_cell(ECLIPTIC_OF_FRAME, 1)
ra_cells = _place_cell(EQUATORIAL_OF_FRAME, 0)
dec_cells = _place_cell(EQUATORIAL_OF_FRAME, 1)


def dist_cells(body, time, source=BUILTIN):
    """True geocentric distance: from the Earth at t to the body where the light left it."""
    return _place(body, time, "ASTROMETRIC", source)[0].distance


def light_time_cells(body, time, source=BUILTIN):
    """Light time from the body to the Earth's centre, minutes."""
    return dist_cells(body, time, source) * LIGHT_DAYS_PER_AU * 1440.0


def elongation_cells(body, time, source=BUILTIN):
    return np.degrees(bodies.elongation(_place(body, time, "APPARENT", source)[0]))


def phase_angle_cells(body, time, source=BUILTIN):
    return np.degrees(bodies.phase_angle(_place(body, time, "APPARENT", source)[0]))


def illuminated_cells(body, time, source=BUILTIN):
    return 0.5 * (1.0 + np.cos(bodies.phase_angle(_place(body, time, "APPARENT", source)[0])))


# ---- conjunctions and oppositions ------------------------------------------------------


def longitude_from_sun(body, tt1, tt2, source=BUILTIN):
    """Apparent ecliptic longitude of the planet minus the Sun's, degrees in [-180, 180).
    (Searches take TT for TDB: 2 ms, far below what moves an event.)"""
    return _longitude_difference(bodies.place(body, tt1, tt2, "APPARENT", source), tt1, tt2)


def _longitude_difference(p, tt1, tt2):
    return wrap180(bodies.longitude_from_sun(p, tt1, tt2))


def _elongation_rate(body, source, sign):
    """Rate of the elongation (degrees a day) where the planet is on the ``sign`` side of
    the Sun (+1 east, -1 west) and over _GREATEST_ELONGATION_ABOVE_DEG from it; elsewhere
    a constant, so it never crosses there."""
    h = _DERIVATIVE_STEP_DAYS

    def f(jd1, jd2, row=None):
        before = bodies.place(body, jd1, jd2 - h, "APPARENT", source)
        after = bodies.place(body, jd1, jd2 + h, "APPARENT", source)
        elongation = bodies.elongation(after)
        rate = np.degrees(elongation - bodies.elongation(before)) / (2.0 * h)
        # The side changes only at conjunctions, weeks from a greatest elongation.
        side = np.sign(_longitude_difference(after, jd1, jd2 + h))
        searched = (side == sign) & (np.degrees(elongation) > _GREATEST_ELONGATION_ABOVE_DEG)
        return np.where(searched, rate, 1.0)

    return f


def _rough_places(body, tt1, tt2):
    """Rough geocentric vectors of the planet and of the Sun (bodies.rough_geocentric) from
    ERFA plan94 alone.  For locating events only."""
    planet = erfa.ufunc.plan94(tt1, tt2, ephemeris.PLAN94_NUMBERS[body])[0]["p"]
    return bodies.rough_geocentric(planet, ephemeris.rough_earth(tt1, tt2)[0])


def _rough_longitude_from_sun(body, offset):
    def rough(jd1, jd2, row=None):
        return bodies.rough_longitude_from_sun(*_rough_places(body, jd1, jd2), offset)

    return rough


def _rough_elongation_rate(body, sign):
    h = _DERIVATIVE_STEP_DAYS

    def rough(jd1, jd2, row=None):
        before, after = _rough_places(body, jd1, jd2 - h), _rough_places(body, jd1, jd2 + h)
        elongation = vectors.angle_between(*after)
        rate = np.degrees(elongation - vectors.angle_between(*before)) / (2.0 * h)
        side = np.sign(bodies.rough_longitude_from_sun(*after))
        searched = (side == sign) & (np.degrees(elongation) > _GREATEST_ELONGATION_ABOVE_DEG)
        return np.where(searched, rate, 1.0)

    return rough


def _event_search(body, event, source):
    """(function of TT whose zero is the event, a cheap estimate of it, direction of the
    crossing), or a SkyError for an event the planet does not have."""
    if event.startswith("GREATEST"):
        if body not in INNER:
            raise SkyError("greatest elongations are for Mercury and Venus; an outer "
                           "planet's elongation is greatest at opposition")
        # The elongation's maximum on one side of the Sun: its rate falls through zero.
        sign = +1 if event.endswith("EAST") else -1
        return _elongation_rate(body, source, sign), _rough_elongation_rate(body, sign), -1
    if body in INNER:
        if event == "OPPOSITION":
            raise SkyError(f"{body.capitalize()} never comes to opposition; use INFERIOR, "
                           "SUPERIOR or CONJUNCTION (either)")
        # The difference falls through 0 at inferior conjunction (the planet retrograde)
        # and rises through it at superior conjunction.
        offset, direction = 0.0, {"INFERIOR": -1, "SUPERIOR": +1, "CONJUNCTION": 0}[event]
    elif event in ("INFERIOR", "SUPERIOR"):
        raise SkyError("only Mercury and Venus have inferior and superior conjunctions; use "
                       "CONJUNCTION or OPPOSITION")
    else:
        # An outer planet falls behind the Sun: the difference always decreases.
        offset, direction = (180.0 if event == "OPPOSITION" else 0.0), -1

    def f(jd1, jd2, row=None):
        return wrap180(longitude_from_sun(body, jd1, jd2, source) - offset)

    # plan94 has no Pluto: its events are searched without an estimate.
    rough = _rough_longitude_from_sun(body, offset) if body in ephemeris.PLAN94_NUMBERS else None
    return f, rough, direction


def next_event_cells(body, time, event="OPPOSITION", result_scale=None, source=BUILTIN):
    """The first instant after ``time`` of an opposition, a conjunction with the Sun or a
    greatest elongation."""
    f, rough, direction = _event_search(body, event, source)
    tt1, tt2 = (np.ravel(t) for t in same_shape(*time.tt()))
    window = SYNODIC_DAYS[body] * 1.1 + 5.0
    # Five-day samples: the difference moves under 3 degrees a day for every planet,
    # and its zeros are weeks apart (Mercury's conjunctions at least 40 days); the rough
    # places' own events, within a day, are polished on the full theory (brackets where
    # a step goes astray).  Windows on a 60-day grid, each searched once for every
    # instant in its block (events.first_after).
    keys = [("PLANET EVENT", body, event, source, ephemeris.content_stamp(source))] * tt1.size
    if rough is None:  # Pluto: brackets on the full theory alone
        def search(s, e, _rep):
            return crossings(f, s, e, 5.0, direction=direction, jump=90.0)
    else:  # the rough places' own events, polished on the full theory
        def search(s, e, _rep):
            return polished_crossings(f, rough, s, e, 5.0, direction=direction, jump=90.0)
    jd1, jd2, found = first_after(search, tt1, tt2, 60.0, window, keys)
    if not np.all(found):
        raise rows_failing(~found, f"no {event.lower()} found in the {window:.0f} days after")
    return DateTimes.of_tt(jd1, jd2, result_scale or time.scale)
