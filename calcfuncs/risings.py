"""Rising, transit (upper and lower culmination) and setting of the Moon, the planets,
the Sun and any star, at a site on a local date.

The search is that of the Sun's events (events.py: one sampling of every row's local
day, every sign change bracketed and narrowed at once).  What it searches is the
topocentric altitude of the target's centre, unrefracted, minus the altitude at which
the event happens:
  h0 = - refraction at the horizon - dip of the horizon - semi-diameter (upper limb)
  refraction  STANDARD: 34' (common practice; the value almanacs use), or from the
              pressure P (hPa) and temperature T (C): 34' x (P / 1010) x (283 / (273 + T))
              (the usual scaling of the horizontal refraction, common practice); P = 0 for
              none
  dip         1.76' x sqrt(height above the surrounding ground in metres), as SKY.SUN.RISE
  limb        UPPER: the Sun's and the Moon's semi-diameter from the distance from the
              site (the Moon: asin(1737.4 km / d)); planets and stars are taken as points
The Moon's parallax is in the topocentric altitude itself, not in h0.

What varies slowly is computed at nodes half a day apart on TT half-day marks and
interpolated: the target's geocentric apparent position in CIRS (light time,
deflection, annual aberration; for a star ERFA atciq with its proper motion from its
epoch), exact at each node but for the built-in Sun, which comes from sun_days (within
5 mas of its exact place: a sunrise 0.14 ms at most from the one with exact nodes,
tested), and TT - UT.  The Sun's crossings well clear of its culminations and of
midnight are found from their hour angle by Newton and secant steps (as SKY.SUN.RISE),
the rest, and every other target's, by hourly samples and brackets.  At each instant the Earth
rotation angle is exact, the site's position (WGS84, ERFA gd2gc) is taken off the
geocentric vector, and the altitude is measured from the geodetic vertical.  Left out:
the diurnal aberration (up to 0.3", under 0.1 s) and the site's own light time to the
Moon (21 ms); polar motion.
"""

import erfa
import numpy as np

from . import bodies, events, frames, nodes, sun_days, vectors
from .bounded import keep
from .errors import SkyError, rows_failing
from .events import wrap180
from .sun import (check_rows_of_nodes, check_site, local_day_start, local_times,
                  row_values, sun_rise_and_set)
from .timescales import Instants
from .topocentric import MOON_RADIUS_KM, SUN_RADIUS_KM, check_body
from .vocabulary import AU_KM, AU_M, BUILTIN

STANDARD_REFRACTION_DEG = 34.0 / 60.0
DIP_DEG_PER_SQRT_M = 0.0293  # 1.76' per sqrt(metre), as sun.py
# A star stands at a distance far enough that the site's offset changes nothing.
STAR_DISTANCE_AU = 1e12
SMOOTH_DAYS = 1e-11  # as sun.py: TT - UT second differences over half-day nodes
LIMBS = ("UPPER", "CENTRE")
MERIDIANS = ("UPPER", "LOWER")


# ---- the target over the nodes --------------------------------------------------------

NODE_CACHE_SIZE = 40_000
_NODE_CACHE = {}  # (what, tt) -> CIRS vector (au)
_ASTROM_CACHE = {}  # tt -> ERFA astrom (apci13) for stars


def _cached(key_of, compute, tt):
    """Per node instant: the cached value, computing the missing ones in one call."""
    out = np.empty((tt.size, 3))
    missing = []
    for k, t in enumerate(tt.tolist()):
        hit = _NODE_CACHE.get(key_of(t))
        if hit is None:
            missing.append(k)
        else:
            out[k] = hit
    if missing:
        fresh = compute(tt[missing])
        out[missing] = fresh
        for t, v in zip(tt[missing].tolist(), fresh):
            keep(_NODE_CACHE, key_of(t), v, NODE_CACHE_SIZE)
    return out


def body_node_vectors(body, source, tt):
    """Geocentric apparent position (au) of a body on the CIRS axes at TT node instants."""
    from .ephemeris import content_stamp

    stamp = content_stamp(source)

    def compute(t):
        zero = np.zeros(t.shape)
        p = bodies.place_at_tt(body, t, zero, "APPARENT", source)
        return vectors.apply(erfa.c2i06a(t, zero), p.direction * p.distance[:, None])

    return _cached(lambda t: (body, str(source), stamp, t), compute, tt)


def _star_astrom(tt):
    out = []
    for t in tt.tolist():
        a = _ASTROM_CACHE.get(t)
        if a is None:
            a = erfa.apci13(t, 0.0)[0]
            keep(_ASTROM_CACHE, t, a, NODE_CACHE_SIZE)
        out.append(a)
    return np.concatenate([np.atleast_1d(a) for a in out])


def star_node_vectors(ra, dec, pm_ra, pm_dec, epoch, grid):
    """Per row and node (rows x NODES x 3): a star's geocentric apparent direction on the
    CIRS axes, ERFA atciq (proper motion from the catalogue epoch, light deflection,
    annual aberration, bias-precession-nutation).  ``pm_ra`` is mu_alpha* (mas a year,
    with the cos Dec factor, as catalogues give it)."""
    unique, index = np.unique(grid, return_inverse=True)
    astrom = _star_astrom(unique)[index.reshape(grid.shape)]
    # ERFA counts the proper motion from J2000.0; a catalogue of another epoch moves its
    # origin by the years between.
    astrom["pmt"] = astrom["pmt"] - (epoch[:, None] - 2000.0)
    rc, dc = np.radians(ra)[:, None], np.radians(dec)[:, None]
    mas = np.radians(1.0 / 3.6e6)
    pr = (pm_ra * mas / np.cos(np.radians(dec)))[:, None]
    pd = (pm_dec * mas)[:, None]
    ri, di = erfa.atciq(rc, dc, pr, pd, 0.0, 0.0, astrom)
    return erfa.s2c(ri, di) * STAR_DISTANCE_AU


class TargetOverDays:
    """A target's CIRS position and TT - UT over windows of up to a day and a half, one
    per row, interpolated over half-day nodes (Lagrange through six); ``at`` gives the
    topocentric altitude, hour angle and distance at a site."""

    SPACING, NODES = nodes.SPACING, nodes.NODES

    def __init__(self, start, node_vectors, dut1=0.0):
        """``node_vectors(grid)``: rows x NODES x 3 vectors at the rows' node instants."""
        start = np.ravel(np.asarray(start, dtype=float))
        self.dut1 = dut1
        self.origin = np.floor(start / self.SPACING) * self.SPACING - self.SPACING
        grid = self.origin[:, None] + self.SPACING * np.arange(self.NODES)
        check_rows_of_nodes(grid)
        unique, index = np.unique(grid, return_inverse=True)
        index = index.reshape(grid.shape)
        ut = Instants(unique, np.zeros(unique.shape), "TT", dut1).to("UT")
        tt_minus_ut = ((unique - ut.jd1) - ut.jd2)[index]
        self.smooth = np.all(np.abs(np.diff(tt_minus_ut, n=2, axis=1)) < SMOOTH_DAYS, axis=1)
        self.values = np.concatenate([node_vectors(grid), tt_minus_ut[..., None]], axis=2)

    def at(self, jd1, jd2, row):
        """(CIRS vectors in au, Earth rotation angle in radians) at TT instants."""
        w = nodes.weights(((jd1 - self.origin[row]) + jd2) / self.SPACING)
        values = np.einsum("mk,mkc->mc", w, self.values[row])
        ut1, ut2 = np.broadcast_to(jd1, row.shape).copy(), jd2 - values[:, 3]
        exact = ~self.smooth[row]
        if np.any(exact):
            ut = Instants(ut1[exact], np.broadcast_to(jd2, row.shape)[exact], "TT",
                          self.dut1).to("UT")
            ut1[exact], ut2[exact] = ut.jd1, ut.jd2
        return values[:, :3], erfa.era00(ut1, ut2)


class Site:
    """Per row: the site's east longitude and geodetic latitude (radians) and its
    geocentric position in the meridian plane (au): x from the axis, z along it."""

    def __init__(self, latitude, longitude, height, n):
        frames.check_latitudes(latitude)
        h = row_values(height, n)
        bad = (h < -1000.0) | (h > 20000.0)
        if np.any(bad):
            raise rows_failing(bad, "the height must be within -1000 to 20000 m above the "
                                    "ellipsoid")
        self.lat = np.radians(row_values(latitude, n))
        self.lon = np.radians(row_values(longitude, n))
        xyz = erfa.gd2gc(1, np.zeros(n), self.lat, h) / AU_M
        self.x, self.z = xyz[:, 0], xyz[:, 2]

    def seen(self, vector, era, row):
        """(altitude in degrees, hour angle in degrees (-180, 180], distance in au) of
        geocentric CIRS vectors from the rows' sites."""
        a = era + self.lon[row]
        c, s = np.cos(a), np.sin(a)
        x = vector[:, 0] * c + vector[:, 1] * s - self.x[row]
        y = -vector[:, 0] * s + vector[:, 1] * c
        z = vector[:, 2] - self.z[row]
        r = np.sqrt(x * x + y * y + z * z)
        lat = self.lat[row]
        sin_alt = (x * np.cos(lat) + z * np.sin(lat)) / r
        alt = np.degrees(np.arcsin(np.clip(sin_alt, -1.0, 1.0)))
        return alt, np.degrees(np.arctan2(-y, x)), r


# ---- the altitude of the event ----------------------------------------------------------


def refraction_degrees(pressure, temperature):
    """The refraction at the horizon: standard 34' when no pressure is given, else scaled
    by pressure and temperature (see the module's words)."""
    if pressure is None:
        return STANDARD_REFRACTION_DEG
    if not 0.0 <= pressure <= 1500.0:
        raise SkyError(f"the pressure must be 0 (no refraction) to 1500 hPa, not {pressure:g}")
    if not -80.0 <= temperature <= 60.0:
        raise SkyError(f"the temperature must be -80 to 60 degrees C, not {temperature:g}")
    return STANDARD_REFRACTION_DEG * (pressure / 1010.0) * (283.0 / (273.0 + temperature))


def dip_degrees(horizon_height):
    h = np.asarray(horizon_height, dtype=float)
    bad = (h < 0.0) | (h > 20000.0)
    if np.any(bad):
        raise rows_failing(bad, "the height above the surrounding ground must be 0 to "
                                "20000 m")
    return DIP_DEG_PER_SQRT_M * np.sqrt(h)


def _radius_km(body, limb):
    if limb == "CENTRE":
        return 0.0
    return {"MOON": MOON_RADIUS_KM, "SUN": SUN_RADIUS_KM}.get(body, 0.0)


# ---- the searches ---------------------------------------------------------------------


class Target:
    """What is searched for: a body by name, or stars (per row RA, Dec and proper
    motion), with the words its messages use."""

    def __init__(self, body=None, star=None):
        self.body = body
        self.star = star

    @property
    def name(self):
        if self.body is None:
            return "the star"
        if self.body in ("SUN", "MOON"):
            return "the " + self.body.capitalize()
        return self.body.capitalize()

    def node_vectors(self, source, n):
        if self.body is not None:
            body = self.body
            # The built-in Sun from the days of sun_days (within 5 mas of its exact
            # place, as for SKY.SUN.RISE), at a tenth of the cost.
            at_nodes = (sun_days.cirs_vectors if (body, source) == ("SUN", BUILTIN)
                        else lambda tt: body_node_vectors(body, source, tt))

            def vectors_at(grid):
                unique, index = np.unique(grid, return_inverse=True)
                return at_nodes(unique)[index.reshape(grid.shape)]
            return vectors_at
        ra, dec, pm_ra, pm_dec, epoch = (row_values(v, n) for v in self.star)
        return lambda grid: star_node_vectors(ra, dec, pm_ra, pm_dec, epoch, grid)


def star_target(ra, dec, pm_ra=0.0, pm_dec=0.0, epoch=2000.0):
    frames.check_latitudes(dec, "declination")
    ep = np.asarray(epoch, dtype=float)
    bad = (ep < 1000.0) | (ep > 3000.0)
    if np.any(bad):
        raise rows_failing(bad, "the epoch of the proper motion must be a year 1000 to 3000")
    pm = np.hypot(np.asarray(pm_ra, dtype=float), np.asarray(pm_dec, dtype=float))
    bad = pm > 20000.0
    if np.any(bad):
        raise rows_failing(bad, "a proper motion is at most about 10000 mas a year (Barnard's "
                                "star); give it in mas a year")
    return Target(star=(ra, dec, pm_ra, pm_dec, epoch))


def day_search(target, time, latitude, longitude, utc_offset, height, h_fixed, limb,
               source, transit=None):
    """The crossings over each row's local date: (start TT, rising Roots, falling
    Roots, above at 0h) for rise and set, or (start, Roots) of the hour angle reaching
    0 (``transit`` UPPER) or 180 degrees (LOWER)."""
    check_site(latitude, longitude)
    start = local_day_start(time, utc_offset)
    n = start.size
    site = Site(latitude, longitude, height, n)
    over = TargetOverDays(start, target.node_vectors(source, n), time.dut1)
    if transit is not None:
        shift = 0.0 if transit == "UPPER" else 180.0

        def hour_angle(jd1, jd2, row):
            v, era = over.at(jd1, jd2, row)
            return wrap180(site.seen(v, era, row)[1] - shift)

        return start, events.crossings(hour_angle, start, start + 1.0, 1.0 / 24.0,
                                       direction=+1, jump=180.0)
    radius_au = _radius_km(target.body, limb) / AU_KM
    h_fixed = row_values(h_fixed, n)

    def above(jd1, jd2, row):
        v, era = over.at(jd1, jd2, row)
        alt, _, r = site.seen(v, era, row)
        h0 = h_fixed[row]
        if radius_au:
            h0 = h0 - np.degrees(np.arcsin(radius_au / r))
        return alt - h0

    if target.body != "SUN":
        ups, downs, at_start = events.rising_and_falling(above, start, start + 1.0,
                                                         1.0 / 24.0, extrema=True)
        return start, ups, downs, at_start > 0
    return (start,) + _sun_rise_and_set(above, over, site, start, h_fixed, radius_au)


def _sun_rise_and_set(above, over, site, start, h_fixed, radius_au):
    """The Sun's (rising Roots, falling Roots, above at 0h) by sun.sun_rise_and_set, the
    hour-angle guess from its topocentric hour angle and geocentric declination at
    0h + 12 h."""
    n = start.size
    rows = np.arange(n)
    v, era = over.at(start, np.full(n, 0.5), rows)
    _, ha, r = site.seen(v, era, rows)
    dec = np.degrees(np.arcsin(v[:, 2] / np.sqrt(np.einsum("mi,mi->m", v, v))))
    h0 = h_fixed - np.degrees(np.arcsin(radius_au / r)) if radius_au else h_fixed
    return sun_rise_and_set(above, start, ha, dec, np.degrees(site.lat), h0)


def _no_event_words(target, rising, other_found, up_at_start):
    who = target.name
    word = "rise" if rising else "set"
    if target.body == "MOON":
        word = "moonrise" if rising else "moonset"
    elif target.body == "SUN":
        word = "sunrise" if rising else "sunset"
    if not other_found:
        if up_at_start:
            if target.body is None:
                return "circumpolar: the star never sets at this latitude"
            return f"no {word} on this local date: {who} stays above the horizon all day"
        if target.body is None:
            return "the star never rises at this latitude"
        return f"no {word} on this local date: {who} stays below the horizon all day"
    if target.body == "MOON":
        later = "the Moon rises about 50 minutes later each day" if rising else \
            "the Moon sets about 50 minutes later each day"
        return f"no {word} on this local date ({later}; it falls on the date before or after)"
    return f"no {word} on this local date"


def rise_or_set(target, time, latitude, longitude, utc_offset, height, horizon_height,
                limb, pressure, temperature, source, rising):
    h_fixed = -refraction_degrees(pressure, temperature) - dip_degrees(horizon_height)
    start, ups, downs, up_at_start = day_search(target, time, latitude, longitude, utc_offset,
                                                height, h_fixed, limb, source)
    n = start.size
    found_roots, other = (ups, downs) if rising else (downs, ups)
    jd1, jd2, found = found_roots.first(n)
    other_found = other.count(n) > 0
    words = np.full(n, None, dtype=object)
    for k in np.flatnonzero(~found):
        words[k] = _no_event_words(target, rising, other_found[k], up_at_start[k])
    return local_times(jd1, jd2, found, start, time, utc_offset, words)


def culmination(target, time, latitude, longitude, utc_offset, height, meridian, source):
    start, roots = day_search(target, time, latitude, longitude, utc_offset, height, 0.0,
                              "CENTRE", source, transit=meridian)
    n = start.size
    jd1, jd2, found = roots.first(n)
    what = "transit" if meridian == "UPPER" else "lower culmination"
    words = np.where(found, None, f"no {what} on this local date (it falls on the date "
                                  "before or after)").astype(object)
    return local_times(jd1, jd2, found, start, time, utc_offset, words)


# ---- cell functions ------------------------------------------------------------------


def body_rise_cells(body, date, latitude, longitude, utc_offset=0.0, height=0.0,
                    horizon_height=0.0, limb="UPPER", pressure=None, temperature=10.0,
                    source=BUILTIN):
    return rise_or_set(Target(check_body(body)), date, latitude, longitude, utc_offset,
                       height, horizon_height, limb, pressure, temperature, source, True)


def body_set_cells(body, date, latitude, longitude, utc_offset=0.0, height=0.0,
                   horizon_height=0.0, limb="UPPER", pressure=None, temperature=10.0,
                   source=BUILTIN):
    return rise_or_set(Target(check_body(body)), date, latitude, longitude, utc_offset,
                       height, horizon_height, limb, pressure, temperature, source, False)


def body_transit_cells(body, date, latitude, longitude, utc_offset=0.0, meridian="UPPER",
                       height=0.0, source=BUILTIN):
    return culmination(Target(check_body(body)), date, latitude, longitude, utc_offset,
                       height, meridian, source)


def star_rise_cells(ra, dec, date, latitude, longitude, utc_offset=0.0, horizon_height=0.0,
                    pressure=None, temperature=10.0, pm_ra=0.0, pm_dec=0.0, epoch=2000.0):
    return rise_or_set(star_target(ra, dec, pm_ra, pm_dec, epoch), date, latitude, longitude,
                       utc_offset, 0.0, horizon_height, "CENTRE", pressure, temperature,
                       BUILTIN, True)


def star_set_cells(ra, dec, date, latitude, longitude, utc_offset=0.0, horizon_height=0.0,
                   pressure=None, temperature=10.0, pm_ra=0.0, pm_dec=0.0, epoch=2000.0):
    return rise_or_set(star_target(ra, dec, pm_ra, pm_dec, epoch), date, latitude, longitude,
                       utc_offset, 0.0, horizon_height, "CENTRE", pressure, temperature,
                       BUILTIN, False)


def star_transit_cells(ra, dec, date, latitude, longitude, utc_offset=0.0, meridian="UPPER",
                       pm_ra=0.0, pm_dec=0.0, epoch=2000.0):
    return culmination(star_target(ra, dec, pm_ra, pm_dec, epoch), date, latitude, longitude,
                       utc_offset, 0.0, meridian, BUILTIN)
