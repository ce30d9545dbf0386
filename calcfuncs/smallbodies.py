"""Minor planets and comets from their orbital elements: places, distances, brightness,
motion on the sky and events, one orbit per row (the cell functions of SKY.ORBIT.*).

An orbit arrives as text (mpcformat: an MPC minor-planet or comet line, or ORBIT text
made from elements in cells by SKY.ORBIT.FROM.Q and .FROM.A) and is propagated as a
two-body orbit about the Sun (orbits.py), or with model PLANETS integrated under the
planets of the source (perturbations.py).  Geocentric places go through the one
pipeline of bodies.place, with the Earth and the Sun from the chosen source: light time
by iteration, then for APPARENT the Sun's deflection and annual aberration.  The
parallax of a site is not applied (geocentric places; a near-Earth object can be
arcminutes away from where a site sees it).

Two-body elements drift: the planets' pull moves a main-belt asteroid by arcseconds a
month from its epoch, a near-Earth object after a close approach by far more.
SKY.ORBIT.AGE shows the time from the epoch; keep it within a few months, or integrate.
"""

import numpy as np

from . import bodies, ephemeris, frames, mpcformat, nodes, topocentric, vectors
from .bounded import keep
from .errors import rows_failing
from .events import crossings, wrap180
from .orbits import check_elements, from_mean_anomaly
from .perturbations import PerturbedOrbit
from .phasecurves import comet_magnitude, hg1g2_magnitude, hg_magnitude
from .timescales import DateTimes
from .vocabulary import BUILTIN, ECLIPTIC_OF_FRAME, EQUATORIAL_OF_FRAME, LIGHT_DAYS_PER_AU

TWO_BODY = "TWO BODY"
YEAR_DAYS = 365.25636  # the sidereal year (common practice), for synodic periods
ARCSEC_PER_RADIAN = 206264.80624709636


# ---- elements from cells ----------------------------------------------------------------


def _number_text(x):
    return repr(float(x))


def _own_text(pairs, name):
    text = "ORBIT " + " ".join(f"{k} {_number_text(v)}" for k, v in pairs
                               if v is not None and np.isfinite(v))
    return text + (f" NAME {name}" if name else "")


def _jd_tt(time, k):
    tt1, tt2 = time.tt()
    return np.ravel(tt1)[k] + np.ravel(tt2)[k]


def from_q_cells(perihelion_time, q, e, inclination, node, perihelion, epoch=None,
                 m1=None, k1=None, scale="TT", epoch_given=None, m1_given=None,
                 k1_given=None):
    """ORBIT text of a perihelion distance and time (the comets' form)."""
    q, e = np.ravel(q), np.ravel(e)
    check_elements(q, e)
    out = np.empty(q.size, dtype=object)
    for k in range(q.size):
        tp = _jd_tt(perihelion_time, k)
        ep = _jd_tt(epoch, k) if epoch is not None and epoch_given[k] else None
        out[k] = _own_text((
            ("Q", q[k]), ("E", e[k]), ("I", np.ravel(inclination)[k]),
            ("NODE", np.ravel(node)[k]), ("PERI", np.ravel(perihelion)[k]), ("TP", tp),
            ("EPOCH", ep),
            ("M1", np.ravel(m1)[k] if m1 is not None and m1_given[k] else None),
            ("K1", np.ravel(k1)[k] if k1 is not None and k1_given[k] else None)), "")
    return out


def from_a_cells(epoch, a, e, inclination, node, perihelion, mean_anomaly, h=None, g=None,
                 scale="TT", h_given=None, g_given=None):
    """ORBIT text of a semi-major axis and a mean anomaly at an epoch (the minor
    planets' form)."""
    a, e = np.ravel(a), np.ravel(e)
    tt1, tt2 = epoch.tt()
    tt1, tt2 = np.ravel(tt1), np.ravel(tt2)
    from_mean_anomaly(a, e, np.ravel(mean_anomaly), tt1, tt2)  # the checks of a and e
    check_elements(np.abs(a * (1.0 - e)), e)
    out = np.empty(a.size, dtype=object)
    for k in range(a.size):
        out[k] = _own_text((
            ("A", a[k]), ("E", e[k]), ("I", np.ravel(inclination)[k]),
            ("NODE", np.ravel(node)[k]), ("PERI", np.ravel(perihelion)[k]),
            ("M", np.ravel(mean_anomaly)[k]), ("EPOCH", tt1[k] + tt2[k]),
            ("H", np.ravel(h)[k] if h is not None and h_given[k] else None),
            ("G", np.ravel(g)[k] if g is not None and g_given[k] else None)), "")
    return out


def name_cells(orbit):
    """The object's designation or name as the orbit gives it (unpacked)."""
    return mpcformat.orbits_of(orbit).name


def age_cells(orbit, time):
    """Days from the epoch of the elements to the instant (negative before it)."""
    o = mpcformat.orbits_of(orbit)
    tt1, tt2 = time.tt()
    return o.age_days(np.ravel(tt1), np.ravel(tt2))


def period_cells(orbit):
    """Orbital period in years; rows with open orbits say so."""
    o = mpcformat.orbits_of(orbit)
    period = o.period_days()
    if not np.all(np.isfinite(period)):
        raise rows_failing(~np.isfinite(period), "the orbit is not closed (e >= 1): no period")
    return period / 365.25


# ---- heliocentric ------------------------------------------------------------------------


def moved(o, model, source):
    """What bodies.place propagates: the two-body orbits themselves, or for PLANETS the
    same elements integrated under the planets of the source (perturbations.py)."""
    if model == "PLANETS":
        return PerturbedOrbit(o, source)
    return o


def _orbit_and_times(orbit, time, source=BUILTIN):
    o = mpcformat.orbits_of(orbit)
    tt1, tt2 = time.tt()
    tt1, tt2 = np.ravel(tt1), np.ravel(tt2)
    tdb1, tdb2 = ephemeris.times_for(source, tt1, tt2)
    return o, tt1, tt2, tdb1, tdb2


def _helio_vectors(orbit, time, source, model):
    o, tt1, tt2, tdb1, tdb2 = _orbit_and_times(orbit, time, source)
    return moved(o, model, source).state(tdb1, tdb2)[0], tt1, tt2


def _helio(orbit, time, system, source, model):
    p, tt1, tt2 = _helio_vectors(orbit, time, source, model)
    return frames.spherical(bodies.in_system(p, system, tt1, tt2))


def helio_lon_cells(orbit, time, frame="J2000", source=BUILTIN, model=TWO_BODY):
    return _helio(orbit, time, ECLIPTIC_OF_FRAME[frame], source, model)[0]


def helio_lat_cells(orbit, time, frame="J2000", source=BUILTIN, model=TWO_BODY):
    return _helio(orbit, time, ECLIPTIC_OF_FRAME[frame], source, model)[1]


def helio_ra_cells(orbit, time, frame="J2000", source=BUILTIN, model=TWO_BODY):
    return _helio(orbit, time, EQUATORIAL_OF_FRAME[frame], source, model)[0]


def helio_dec_cells(orbit, time, frame="J2000", source=BUILTIN, model=TWO_BODY):
    return _helio(orbit, time, EQUATORIAL_OF_FRAME[frame], source, model)[1]


def sun_dist_cells(orbit, time, source=BUILTIN, model=TWO_BODY):
    """Distance from the Sun's centre at the instant (geometric), au."""
    return vectors.norm(_helio_vectors(orbit, time, source, model)[0])


# ---- geocentric --------------------------------------------------------------------------


def place(o, tt1, tt2, kind="APPARENT", source=BUILTIN):
    """bodies.Place of the orbits' bodies at TT instants."""
    tdb1, tdb2 = ephemeris.times_for(source, tt1, tt2)
    return bodies.place(o, tdb1, tdb2, kind, source)


# One cell's place of an orbit's body, kept for the row's other cells (the Dec beside the
# RA, the magnitude, the elongation, the phase angle): keyed by the orbit's text, the
# instant, the kind of place, the model and the source with what its kernels hold now.
# About 2 kB each: 2 MB when full.
_ONE_PLACE = {}
ONE_PLACES_KEPT = 1000


def _kept_for_one(orbit, time, what, source, model, compute):
    """``compute()`` (a tuple whose arrays are read-only once kept), kept for one cell
    (one orbit text at one instant) by ``what`` it is, the model and the source."""
    texts = np.ravel(np.asarray(orbit, dtype=object))
    tt1, tt2 = time.tt()
    if texts.size != 1 or type(texts[0]) is not str or np.size(tt1) != 1:
        return compute()
    key = (texts[0], float(np.ravel(tt1)[0]), float(np.ravel(tt2)[0]), what, model,
           str(source), ephemeris.content_stamp(source))
    found = _ONE_PLACE.get(key)
    if found is None:
        found = compute()
        for a in found:
            if isinstance(a, (bodies.Place, topocentric.TopoPlace)):
                a = (a.direction, a.distance)
            for array in (a if isinstance(a, tuple) else (a,)):
                array.flags.writeable = False
        keep(_ONE_PLACE, key, found, ONE_PLACES_KEPT)
    return found


def _place(orbit, time, kind, source, model=TWO_BODY):
    """(bodies.Place, tt1, tt2) of the orbits' bodies at the instants; one cell's kept
    (read it, never change it)."""
    return _kept_for_one(orbit, time, kind, source, model,
                         lambda: _place_of(orbit, time, kind, source, model))


def _place_of(orbit, time, kind, source, model):
    o, tt1, tt2, _, _ = _orbit_and_times(orbit, time, source)
    return place(moved(o, model, source), tt1, tt2, kind, source), tt1, tt2


def _spherical(orbit, time, system, kind, source, model, index):
    """The longitude (``index`` 0) or latitude (1) in ``system`` (bodies.shown_longitudes).
    A log of cells filled down takes the Earth and the system's matrix from segments, as
    the bodies' places do (nodes.single_cells)."""
    with nodes.single_cells():
        return bodies.shown_longitudes(
            _spherical_of(orbit, time, system, kind, source, model, index), index)


def _spherical_of(orbit, time, system, kind, source, model, index):
    """A two-body orbit of the built-in source on floats, row by row, inside the built-in
    theories' years (bodies.rows_on_floats); every other row through the kept place on
    arrays."""
    done = None
    if source == BUILTIN and model == TWO_BODY:
        tt1, tt2 = time.tt()
        done = bodies.rows_on_floats(mpcformat.orbits_of(orbit), np.ravel(tt1), np.ravel(tt2),
                                     system, kind, index)
        if done is not None and (done[1] is True or done[1].all()):
            return done[0]
    p, tt1, tt2 = _place(orbit, time, kind, source, model)
    values = frames.spherical(bodies.in_system(p.direction, system, tt1, tt2))[index]
    if done is not None:  # a column reaching beyond the years: the rest on arrays
        values = np.array(values, dtype=float)
        values[done[1]] = done[0][done[1]]
    return values


def _place_cell(systems, index):
    """A cell function of an orbit's place (longitude or latitude, ``index`` 0 or 1, in
    the system of ``systems[frame]``), with its twin on floats (cells.py's float lane)
    for a two-body orbit of the built-in source."""
    def cells(orbit, time, frame="TRUE", kind="APPARENT", source=BUILTIN, model=TWO_BODY):
        return _spherical(orbit, time, systems[frame], kind, source, model, index)

    def on_floats(orbit, time, frame="TRUE", kind="APPARENT", source=BUILTIN, model=TWO_BODY):
        if model != TWO_BODY:
            return None
        # (The lane hands the text itself.)  The kept orbit itself: the float path only
        # reads its elements, and a copy of it costs a cell a microsecond.
        kept = mpcformat.kept_orbit(orbit)
        return bodies.cell_on_floats(mpcformat.orbits_of(orbit) if kept is None else kept,
                                     time, systems[frame], kind, source, index)
    cells.on_floats = on_floats
    return cells


ra_cells = _place_cell(EQUATORIAL_OF_FRAME, 0)
dec_cells = _place_cell(EQUATORIAL_OF_FRAME, 1)
lon_cells = _place_cell(ECLIPTIC_OF_FRAME, 0)
lat_cells = _place_cell(ECLIPTIC_OF_FRAME, 1)


# ---- seen from a site --------------------------------------------------------------------


def _topo(orbit, time, latitude, longitude, height, kind, source, model, pressure=0.0,
          temperature=10.0):
    """topocentric.TopoPlace of the orbits' bodies; one cell's kept (its RA, Dec,
    altitude and azimuth are a row's cells), by everything a site's place depends on:
    the site, the air, and the instant's scale and DUT1 (the Earth's turn)."""
    def compute():
        o = mpcformat.orbits_of(orbit)
        return (topocentric.place(moved(o, model, source), time, latitude, longitude, height,
                                  kind, source, pressure, temperature),)

    what = ("SITE", kind, time.scale, float(time.dut1),
            *(float(np.ravel(a)[0]) if a is not None and np.size(a) == 1 else None
              for a in (latitude, longitude, height, pressure, temperature)))
    if None in what:  # (a column of sites)
        return compute()[0]
    return _kept_for_one(orbit, time, what, source, model, compute)[0]


def topo_ra_cells(orbit, time, latitude, longitude, height=0.0, frame="TRUE",
                  kind="APPARENT", source=BUILTIN, model=TWO_BODY):
    p = _topo(orbit, time, latitude, longitude, height, kind, source, model)
    return topocentric.equatorial(p, time, frame)[0]


def topo_dec_cells(orbit, time, latitude, longitude, height=0.0, frame="TRUE",
                   kind="APPARENT", source=BUILTIN, model=TWO_BODY):
    p = _topo(orbit, time, latitude, longitude, height, kind, source, model)
    return topocentric.equatorial(p, time, frame)[1]


def topo_alt_cells(orbit, time, latitude, longitude, height=0.0, pressure=0.0,
                   temperature=10.0, source=BUILTIN, model=TWO_BODY):
    return topocentric.altitude(_topo(orbit, time, latitude, longitude, height, "APPARENT",
                                      source, model, pressure, temperature))


def topo_az_cells(orbit, time, latitude, longitude, height=0.0, pressure=0.0,
                  temperature=10.0, source=BUILTIN, model=TWO_BODY):
    return topocentric.azimuth(_topo(orbit, time, latitude, longitude, height, "APPARENT",
                                     source, model, pressure, temperature))


def earth_dist_cells(orbit, time, source=BUILTIN, model=TWO_BODY):
    """True distance from the Earth's centre (to where the light left the body), au."""
    return _place(orbit, time, "ASTROMETRIC", source, model)[0].distance


def elongation_cells(orbit, time, source=BUILTIN, model=TWO_BODY):
    return np.degrees(bodies.elongation(_place(orbit, time, "APPARENT", source, model)[0]))


def phase_angle_cells(orbit, time, source=BUILTIN, model=TWO_BODY):
    return np.degrees(bodies.phase_angle(_place(orbit, time, "APPARENT", source, model)[0]))


def motion(body, tt1, tt2, source=BUILTIN):
    """(rate in arcseconds per minute, position angle of the motion in degrees from
    north through east) of the astrometric place on the ICRS axes, from the velocities
    themselves: the geocentric vector rho = body(t - tau) - Earth(t) changes at
    (v_body + v_sun)(1 - dtau/dt) - v_earth, and its direction at that change's part
    across the line of sight over |rho|.  (A difference of two places would lose five
    digits to cancellation.)"""
    tdb1, tdb2 = ephemeris.times_for(source, tt1, tt2)
    p = bodies.place(body, tdb1, tdb2, "ASTROMETRIC", source)
    (_, earth_v), (_, sun_v) = ephemeris.get(source).earth_and_sun(tdb1, tdb2)
    tau = p.distance * LIGHT_DAYS_PER_AU
    body_v = body.heliocentric(tdb1, tdb2 - tau)[1]
    u = p.direction
    w = body_v + sun_v
    light = 1.0 / LIGHT_DAYS_PER_AU  # au a day
    tau_rate = vectors.dot(u, w - earth_v) / (light + vectors.dot(u, w))
    d_rho = w * (1.0 - tau_rate)[..., None] - earth_v
    across = (d_rho - u * vectors.dot(u, d_rho)[..., None]) / p.distance[..., None]
    ra = np.arctan2(u[..., 1], u[..., 0])
    dec = np.arcsin(np.clip(u[..., 2], -1.0, 1.0))
    east = np.stack([-np.sin(ra), np.cos(ra), np.zeros_like(ra)], axis=-1)
    north = np.stack([-np.sin(dec) * np.cos(ra), -np.sin(dec) * np.sin(ra), np.cos(dec)],
                     axis=-1)
    rate = vectors.norm(across) * ARCSEC_PER_RADIAN / 1440.0
    pa = np.degrees(np.arctan2(vectors.dot(across, east), vectors.dot(across, north))) % 360.0
    return rate, pa


def _motion(orbit, time, source, model):
    """``motion`` of the orbits' bodies at the instants; one cell's kept (the rate and
    the direction of motion are a row's two cells)."""
    def compute():
        o, tt1, tt2, _, _ = _orbit_and_times(orbit, time, source)
        return motion(moved(o, model, source), tt1, tt2, source)

    return _kept_for_one(orbit, time, "MOTION", source, model, compute)


def rate_cells(orbit, time, source=BUILTIN, model=TWO_BODY):
    return _motion(orbit, time, source, model)[0]


def direction_cells(orbit, time, source=BUILTIN, model=TWO_BODY):
    return _motion(orbit, time, source, model)[1]


# ---- magnitudes --------------------------------------------------------------------------


def magnitude_cells(orbit, time, h=None, g=None, g2=None, source=BUILTIN, model=TWO_BODY,
                    h_given=None, g_given=None, g2_given=None):
    """Visual magnitude from H, G or H, G1, G2 (minor planets) or M1, K1 (comets): the
    orbit's own values unless given here."""
    p, tt1, tt2 = _place(orbit, time, "APPARENT", source, model)
    o = mpcformat.orbits_of(orbit)
    n = o.q.size
    hh = np.where(h_given, np.ravel(h), o.h) if h is not None else o.h
    gg = np.where(g_given, np.ravel(g), o.g) if g is not None else o.g
    missing = ~np.isfinite(hh)
    if np.any(missing):
        raise rows_failing(missing, "no absolute magnitude: the orbit gives none; give H "
                           "(or M1 for a comet) in the h argument")
    comet = o.comet
    # A minor planet without G takes the customary 0.15; a comet without K1 takes 10.
    gg = np.where(np.isfinite(gg), gg, np.where(comet, 10.0, 0.15))
    three = np.zeros(n, bool) if g2 is None else np.asarray(g2_given, bool) & ~comet
    gg2 = np.zeros(n) if g2 is None else np.where(three, np.ravel(g2), 0.0)
    r = vectors.norm(p.helio)
    delta = p.distance
    alpha = np.degrees(bodies.phase_angle(p))
    if np.any(three & (alpha > 150.0)):
        raise rows_failing(three & (alpha > 150.0), "the H, G1, G2 phase functions are "
                           "defined to a phase angle of 150 degrees")
    out = np.where(comet, comet_magnitude(hh, gg, r, delta),
                   np.where(three, hg1g2_magnitude(hh, gg, gg2, r, delta, alpha),
                            hg_magnitude(hh, gg, r, delta, alpha)))
    return out.reshape(n)


# ---- events ------------------------------------------------------------------------------


def _next_perihelion(o, tt1, tt2):
    """(jd1, jd2, found) of the first perihelion passage after the instants."""
    period = o.period_days()
    since = (tt1 - o.tp1) + (tt2 - o.tp2)
    closed = np.isfinite(period)
    with np.errstate(invalid="ignore"):
        turns = np.where(closed, np.floor(since / np.where(closed, period, 1.0)) + 1.0, 0.0)
    jd2 = o.tp2 + turns * np.where(closed, period, 0.0)
    found = closed | (since < 0)
    return o.tp1.copy(), jd2, found


def _rough_states(o, jd1, jd2, row):
    """Heliocentric (p, v) of the orbits' bodies (rows ``row``) and of the Earth-Moon
    barycentre (ephemeris.rough_earth) at TT instants: for locating events only."""
    return o.take(row).state(jd1, jd2), ephemeris.rough_earth(jd1, jd2)


def _window(o):
    """Days to search for the next opposition or closest approach: a little over the
    synodic period with the Earth, at most ten years."""
    period = o.period_days()
    with np.errstate(divide="ignore"):
        synodic = 1.0 / np.abs(1.0 / YEAR_DAYS - 1.0 / period)
    return np.minimum(1.1 * synodic + 10.0, 3653.0)


def next_event_cells(orbit, time, event="OPPOSITION", result_scale=None, source=BUILTIN):
    """The first instant after ``time`` of the body's opposition, perihelion passage or
    closest approach to the Earth."""
    o = mpcformat.orbits_of(orbit)
    tt1, tt2 = time.tt()
    tt1, tt2 = np.ravel(tt1), np.ravel(tt2)
    if event == "PERIHELION":
        jd1, jd2, found = _next_perihelion(o, tt1, tt2)
        if not np.all(found):
            raise rows_failing(~found, "the orbit is open (e >= 1) and its perihelion "
                               "passage is before this instant")
        return DateTimes.of_tt(jd1, jd2, result_scale or time.scale)
    jd = tt1 + tt2
    window = _window(o)
    # Each search samples the window with a cheap estimate (the Earth-Moon barycentre of
    # ERFA plan94 for the Earth, no light time, no aberration: a few hundredths of a
    # degree, a few metres a second) and evaluates the full function only near the
    # estimate's sign changes, on the same grid points (events.sample_near, which samples
    # a row in full where the estimate misled it): the same roots, a fraction of the work.
    if event == "OPPOSITION":
        def f(jd1, jd2, row):
            p = place(o.take(row), jd1, jd2, "APPARENT", source)
            return wrap180(bodies.longitude_from_sun(p, jd1, jd2) - 180.0)

        def rough(jd1, jd2, row):
            body, earth = _rough_states(o, jd1, jd2, row)
            return bodies.rough_longitude_from_sun(
                *bodies.rough_geocentric(body[0], earth[0]), 180.0)
        roots = crossings(f, jd, jd + window, 2.0, direction=0, jump=90.0, estimate=rough)
    else:  # CLOSEST: the geocentric distance's rate rises through zero
        src = ephemeris.get(source)

        def f(jd1, jd2, row):
            sub = o.take(row)
            tdb1, tdb2 = ephemeris.times_for(source, jd1, jd2)
            (ep, ev), (sp, sv) = src.earth_and_sun(tdb1, tdb2)
            p, v = sub.state(jd1, jd2)
            rel, vel = p - (ep - sp), v - (ev - sv)
            return vectors.dot(rel, vel) / vectors.norm(rel)

        def rough(jd1, jd2, row):
            body, earth = _rough_states(o, jd1, jd2, row)
            rel, vel = body[0] - earth[0], body[1] - earth[1]
            return vectors.dot(rel, vel) / vectors.norm(rel)
        roots = crossings(f, jd, jd + window, 1.0, direction=+1, estimate=rough)
    jd1, jd2, found = roots.first(jd.size, roots.after(tt1, tt2))
    if not np.all(found):
        raise rows_failing(~found, f"no {event.lower()} found in the search window "
                           "(a little over the synodic period, at most ten years)")
    return DateTimes.of_tt(jd1, jd2, result_scale or time.scale)
