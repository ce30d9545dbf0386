"""Heliacal rising and setting of stars and of the naked-eye planets at a site, by the
arcus visionis.

The criterion (the classical one of Ptolemy and Schoch): a star or planet is seen on
the horizon in the dawn when, at the moment it rises, the Sun's centre is at least the
arcus visionis below the horizon.  Here "rises" is the apparent rising, the target's
true altitude at -34' (standard refraction, common practice); the Sun's altitude is
its true (airless) altitude at that moment.
  heliacal rising   the first morning, from the date searched from, on which the
                    Sun's depression at the target's rising reaches the arcus visionis
  heliacal setting  the last evening on which the Sun's depression at the target's
                    setting is at least the arcus visionis
The result is the instant of that morning's rising (or that evening's setting): the
date is what matters, the time says when to look.

Arcus visionis (from memory; rounded values as they are usually reproduced, not a
transcription of the tables): for stars by visual magnitude, linear between
  -1.5: 10.0, 0: 10.5, 1: 11.0, 2: 12.5, 3: 14.0, 4: 15.0, 5: 16.0 degrees
(brighter than -1.5 taken as 10.0, fainter than 5 refused); for the planets the values
of Ptolemy (Almagest XIII / Phaseis, from memory): Mercury 10, Venus 5, Mars 11.5,
Jupiter 10, Saturn 11 degrees.  A user's own value may be given instead.  The arcus
visionis stands in for the whole physics of seeing (extinction, sky brightness, the
eye): the published values scatter by a degree or two, which moves a date by one to
three days; local haze by more.

How: per row a smooth function of time, the Sun's altitude at the moment the target is
at its rising (or setting) hour angle, both on the true equator of date; its crossing
of minus the arcus visionis is found with the one event search (events.py) over 400
days from the date (800 for a planet: Mars's synodic period is 780), on the Sun's and
the target's places interpolated over nodes 2 days apart.  Then the actual risings
(settings) of the mornings around that crossing are found from the Earth's rotation
and the condition checked on each, the exact Sun at each.  Places: the built-in
theories (VSOP87D and the long-term precession of Vondrak et al. 2011 outside
1000-3000), apparent; a star's catalogue place moved along its proper motion (space
motion, no parallax or radial velocity), precessed and nutated, without annual
aberration (at most 20"); the site's parallax left out (9" for the Sun).  Clock times
through UT1 (Delta T before 1960).  Valid -4000 to +8000 for the geometry; the date's
real error is that of the arcus visionis.
"""

import erfa
import numpy as np

from . import bodies, events, frames, nodes, vectors
from .errors import SkyError, rows_failing
from .sun import check_site, local_day_start, local_times, row_values
from .timescales import Instants, check_years
from .vocabulary import BUILTIN, J2000_JD, LONG_RANGE_YEARS

REFRACTION_DEG = 34.0 / 60.0
EVENTS = ("RISING", "SETTING")
HELIACAL_PLANETS = ("MERCURY", "VENUS", "MARS", "JUPITER", "SATURN")
# Ptolemy's arcus visionis of the planets, from memory (degrees).
PLANET_ARCUS = {"MERCURY": 10.0, "VENUS": 5.0, "MARS": 11.5, "JUPITER": 10.0,
                "SATURN": 11.0}
# Stars: (visual magnitude, arcus visionis in degrees), from memory, rounded (see the
# module's words).
STAR_ARCUS = ((-1.5, 10.0), (0.0, 10.5), (1.0, 11.0), (2.0, 12.5), (3.0, 14.0),
              (4.0, 15.0), (5.0, 16.0))
STAR_DAYS, PLANET_DAYS = 400.0, 800.0
NODE_SPACING = 2.0  # days between the nodes of the Sun's and the planets' places
SIDEREAL_DAY = 1.0 / 1.00273781191135448  # days of UT1 per turn of the Earth
STEP_DAYS = 2.0


def arcus_of_magnitude(magnitude):
    """The arcus visionis (degrees) of a star of visual magnitude, from the table."""
    m = np.asarray(magnitude, dtype=float)
    bad = m > STAR_ARCUS[-1][0]
    if np.any(bad):
        raise rows_failing(bad, f"the table of arcus visionis reaches magnitude "
                                f"{STAR_ARCUS[-1][0]:g}; a fainter star is barely seen by "
                                "eye at the horizon (give an arcus_visionis of your own)")
    mags, arcs = zip(*STAR_ARCUS)
    return np.interp(m, mags, arcs)


def check_planet(body):
    word = str(body).strip().upper()
    if word not in HELIACAL_PLANETS:
        raise SkyError(f'no heliacal phenomena for "{body}" here; use '
                       + ", ".join(HELIACAL_PLANETS) + " (the naked-eye planets)")
    return word


# ---- places on the true equator of date ---------------------------------------------------


def _true_matrix(tt1, tt2):
    # The nutation interpolated over half-day nodes in a dense column (frames.py): within
    # microarcseconds, and a day's answer needs far less.
    return frames.system_matrix("EQUATORIAL TRUE", tt1, tt2, smooth=True, long_term=True)


def body_true(body, tt):
    """Unit vectors of the apparent Sun or planet on the true equator of date at TT JDs
    (one float each: node instants)."""
    zero = np.zeros(tt.shape)
    p = bodies.place_at_tt(body, tt, zero, "APPARENT", BUILTIN)
    return vectors.apply(_true_matrix(tt, zero), p.direction)


def star_true(star, tt1, tt2, row):
    """Unit vectors of stars (per row RA, Dec, mu_alpha*, mu_dec in mas a year, epoch)
    on the true equator of date at TT instants, ``row`` saying whose."""
    ra, dec, pm_ra, pm_dec, epoch = (np.asarray(v)[row] for v in star)
    a, d = np.radians(ra), np.radians(dec)
    p = erfa.s2c(a, d)
    east = np.stack([-np.sin(a), np.cos(a), np.zeros_like(a)], axis=-1)
    north = np.stack([-np.sin(d) * np.cos(a), -np.sin(d) * np.sin(a), np.cos(d)], axis=-1)
    years = ((tt1 - J2000_JD) + tt2) / 365.25 + 2000.0 - epoch
    mas = np.radians(1.0 / 3.6e6)
    moved = p + (years * mas)[:, None] * (pm_ra[:, None] * east + pm_dec[:, None] * north)
    return vectors.apply(_true_matrix(tt1, tt2), vectors.unit(moved))


class FixedPlaces:
    """Per row one direction, the star's at the middle of its window: in 400 days the
    equator moves by under a minute of arc, which moves the smooth function's crossing
    by minutes of time; the mornings themselves are checked with the exact place."""

    def __init__(self, exact, start, end):
        n = start.size
        mid = 0.5 * (start + end)
        self.values = exact(np.floor(mid), mid - np.floor(mid), np.arange(n))

    def at(self, tt, row):
        return self.values[row]


class NodePlaces:
    """The Sun's (or a planet's) direction on the true equator of date at nodes 2 days
    apart, computed once for all rows, and interpolated (Lagrange through six)."""

    def __init__(self, body, start, end):
        first = np.floor(start / NODE_SPACING) - nodes.BEFORE
        span = int(np.max(np.floor(end / NODE_SPACING) - first)) + nodes.NODES
        self.cells = np.unique(first[:, None] + np.arange(span + 1)[None, :])
        self.values = body_true(body, self.cells * NODE_SPACING)

    def at(self, tt, row=None):
        cell = np.floor(tt / NODE_SPACING)
        origin = cell - nodes.BEFORE
        index = np.searchsorted(self.cells, origin)
        w = nodes.weights((tt / NODE_SPACING) - origin)
        rows = index[:, None] + np.arange(nodes.NODES)
        return vectors.unit(np.einsum("mk,mkc->mc", w, self.values[rows]))


def _altitude(sin_lat, cos_lat, vector, hour_angle):
    """Altitude (degrees) of a unit vector on the equator of date at an hour angle."""
    sin_dec = np.clip(vector[:, 2], -1.0, 1.0)
    cos_dec = np.sqrt(1.0 - sin_dec * sin_dec)
    return np.degrees(np.arcsin(np.clip(sin_lat * sin_dec + cos_lat * cos_dec
                                        * np.cos(hour_angle), -1.0, 1.0)))


def _event_hour_angle(sin_lat, cos_lat, vector, sign):
    """The target's hour angle (radians) at its apparent rising (sign -1) or setting
    (+1), and the mask of rows where it has one."""
    sin_dec = np.clip(vector[:, 2], -1.0, 1.0)
    cos_dec = np.sqrt(1.0 - sin_dec * sin_dec)
    sin_h0 = np.sin(np.radians(-REFRACTION_DEG))
    c = (sin_h0 - sin_lat * sin_dec) / (cos_lat * cos_dec)
    return sign * np.arccos(np.clip(c, -1.0, 1.0)), np.abs(c) <= 1.0


def _ra(vector):
    return np.arctan2(vector[:, 1], vector[:, 0])


# ---- the search ----------------------------------------------------------------------------


class Search:
    def __init__(self, target_vectors, target_nodes, time, latitude, longitude, utc_offset,
                 event, arcus, days):
        check_site(latitude, longitude)
        self.start = local_day_start(time, utc_offset)
        n = self.start.size
        self.n = n
        tt = self.start
        for edge in (tt, tt + days):  # row-aligned, so one bad row fails alone
            check_years(edge, np.zeros(n), LONG_RANGE_YEARS,
                        "the heliacal search uses the built-in long-range theories")
        lat = np.radians(row_values(latitude, n))
        self.sin_lat, self.cos_lat = np.sin(lat), np.cos(lat)
        self.lon = np.radians(row_values(longitude, n))
        self.sign = -1.0 if event == "RISING" else 1.0
        self.arcus = row_values(arcus, n)
        self.target_vectors = target_vectors  # (tt1, tt2, row) -> exact unit vectors
        self.sun = NodePlaces("SUN", tt, tt + days)
        self.target_nodes = target_nodes(tt, tt + days)
        self.days = days
        self.time, self.utc_offset = time, utc_offset

    def proxy(self, jd1, jd2, row):
        """The Sun's altitude plus the arcus visionis at the moment the target is at its
        rising (setting) hour angle, with both places of the instant."""
        tt = jd1 + jd2
        target = self.target_nodes.at(tt, row)
        sun = self.sun.at(tt)
        h, has = _event_hour_angle(self.sin_lat[row], self.cos_lat[row], target, self.sign)
        sun_h = h + _ra(target) - _ra(sun)
        alt = _altitude(self.sin_lat[row], self.cos_lat[row], sun, sun_h)
        # Never rising or never setting: no such event then (far on the safe side).
        return np.where(has, alt + self.arcus[row], 90.0)

    def find(self):
        n = self.n
        # Heliacal rising: the proxy falls through zero; setting: it rises through it.
        roots = events.crossings(self.proxy, self.start, self.start + self.days, STEP_DAYS,
                                 direction=-1 if self.sign < 0 else +1)
        j1, j2, found = roots.first(n)
        return self._mornings(j1, j2, found)

    def _target_at(self, tt1, tt2, row):
        if isinstance(self.target_nodes, NodePlaces):
            return self.target_nodes.at(tt1 + tt2)
        return self.target_vectors(tt1, tt2, row)

    def _gast(self, tt1, tt2):
        ut = Instants(tt1, tt2, "TT", self.time.dut1).to("UT")
        m = _true_matrix(tt1, tt2)
        x, y = erfa.bpn2xy(m)
        eo = erfa.eors(m, erfa.s06(tt1, tt2, x, y))
        return erfa.era00(ut.jd1, ut.jd2) - eo

    def _event_instants(self, tt1, tt2, row):
        """The target's rising (setting) nearest the TT instants, from the Earth's
        rotation: three steps of the hour angle's error over its rate."""
        tt2 = tt2.copy()
        has = np.ones(row.shape, dtype=bool)
        for _ in range(3):
            target = self._target_at(tt1, tt2, row)
            h, has = _event_hour_angle(self.sin_lat[row], self.cos_lat[row], target,
                                       self.sign)
            ha = self._gast(tt1, tt2) + self.lon[row] - _ra(target)
            miss = np.mod(ha - h + np.pi, 2.0 * np.pi) - np.pi
            tt2 = tt2 - miss / (2.0 * np.pi) * SIDEREAL_DAY
        return tt2, has

    def _mornings(self, j1, j2, found):
        """Per row: the first morning (rising) or the last evening (setting) around the
        proxy's crossing that meets the condition at the actual event."""
        n = self.n
        ks = np.arange(-2, 4)
        rows = np.repeat(np.arange(n), ks.size)
        base1 = np.where(found, j1, 0.0)[rows]
        base2 = (np.where(found, j2, 0.0)[rows] + np.tile(ks, n) * SIDEREAL_DAY)
        safe = np.repeat(found, ks.size)
        base1 = np.where(safe, base1, np.repeat(self.start, ks.size))
        base2 = np.where(safe, base2, 0.0)
        t2, has = self._event_instants(base1, base2, rows)
        sun = self.sun.at(base1 + t2)
        ha_sun = self._gast(base1, t2) + self.lon[rows] - _ra(sun)
        alt = _altitude(self.sin_lat[rows], self.cos_lat[rows], sun, ha_sun)
        ok = (has & (alt <= -self.arcus[rows])).reshape(n, ks.size)
        t2 = t2.reshape(n, ks.size)
        base1 = base1.reshape(n, ks.size)
        if self.sign < 0:
            # Rising: the first morning that meets it, the one before not.
            pick = np.argmax(ok, axis=1)
            good = found & ok.any(axis=1) & (pick > 0)
        else:
            pick = ks.size - 1 - np.argmax(ok[:, ::-1], axis=1)
            good = found & ok.any(axis=1) & (pick < ks.size - 1)
        jd1 = base1[np.arange(n), pick]
        jd2 = t2[np.arange(n), pick]
        inside = ((jd1 - self.start) + jd2) >= 0.0
        return jd1, jd2, good & inside, found


def _words(found, event, days):
    what = "heliacal rising" if event == "RISING" else "heliacal setting"
    return np.where(found, f"the {what} could not be settled to a day here (the target "
                           "grazes the horizon)",
                    f"no {what} within {days:g} days of the date at this site (the target "
                    "never reaches that depth of twilight at its rising or setting, or is "
                    "always above or below the horizon)").astype(object)


def _arcus_given(arcus, given, default):
    arcus = np.asarray(arcus, dtype=float)
    if given is None:
        return default
    given = np.asarray(given, dtype=bool)
    out = np.where(given, arcus, default)
    bad = given & ((arcus < 1.0) | (arcus > 25.0))
    if np.any(bad):
        raise rows_failing(bad, "the arcus visionis must be 1 to 25 degrees")
    return out


def _result(search, event, days):
    jd1, jd2, good, found = search.find()
    words = _words(found, event, days)
    words[good] = None
    return local_times(jd1, jd2, good, search.start, search.time, search.utc_offset,
                       words if np.any(~good) else None)


# ---- cell functions ---------------------------------------------------------------------


def check_offset(utc_offset):
    if not -14.0 <= float(utc_offset) <= 14.0:
        raise SkyError(f"the UTC offset must be within -14 to +14 hours, not {utc_offset:g}")


def star_cells(ra, dec, magnitude, date, latitude, longitude, event, utc_offset=0.0,
               arcus_visionis=None, pm_ra=0.0, pm_dec=0.0, epoch=2000.0,
               arcus_visionis_given=None):
    check_offset(utc_offset)
    frames.check_latitudes(dec, "declination")
    n = np.size(ra)
    ep = row_values(epoch, n)
    bad = (ep < -4000.0) | (ep > 8000.0)
    if np.any(bad):
        raise rows_failing(bad, "the epoch of the catalogue place must be a year -4000 to "
                                "8000")
    mag = row_values(magnitude, n)
    # A row with its own arcus visionis needs no magnitude from the table.
    own = np.zeros(n, dtype=bool) if arcus_visionis_given is None else \
        np.broadcast_to(np.asarray(arcus_visionis_given, dtype=bool), (n,))
    default = arcus_of_magnitude(np.where(own, 0.0, mag))
    arcus = _arcus_given(row_values(0.0 if arcus_visionis is None else arcus_visionis, n),
                         arcus_visionis_given, default)
    star = tuple(row_values(v, n) for v in (ra, dec, pm_ra, pm_dec)) + (ep,)

    def exact(tt1, tt2, row):
        return star_true(star, tt1, tt2, row)

    search = Search(exact, lambda a, b: FixedPlaces(exact, a, b), date, latitude, longitude, utc_offset, event, arcus,
                    STAR_DAYS)
    return _result(search, event, STAR_DAYS)


def planet_cells(body, date, latitude, longitude, event, utc_offset=0.0, arcus_visionis=None,
                 arcus_visionis_given=None):
    check_offset(utc_offset)
    body = check_planet(body)
    n = np.size(date.jd1)
    default = np.full(n, PLANET_ARCUS[body])
    arcus = _arcus_given(row_values(0.0 if arcus_visionis is None else arcus_visionis, n),
                         arcus_visionis_given, default)

    def exact(tt1, tt2, row):
        p = bodies.place_at_tt(body, tt1, tt2, "APPARENT", BUILTIN)
        return vectors.apply(_true_matrix(tt1, tt2), p.direction)

    search = Search(exact, lambda a, b: NodePlaces(body, a, b), date, latitude, longitude,
                    utc_offset, event, arcus, PLANET_DAYS)
    return _result(search, event, PLANET_DAYS)


def arcus_cells(magnitude):
    return arcus_of_magnitude(magnitude)

