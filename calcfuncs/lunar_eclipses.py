"""Lunar eclipses: the next one after a date, its kind, greatest eclipse, gamma, the
umbral and penumbral magnitudes, the six contacts, and how it looks from a site.

Geometry (the classical one of the Explanatory Supplement and the NASA canons): at the
Moon's distance the Earth's shadow is two circles round the axis that points away from
the Sun.  Seen from the Earth's centre their angular radii are

  umbra      f * pi_M + pi_S - s_S      penumbra   f * pi_M + pi_S + s_S

with pi_M and pi_S the Moon's and the Sun's equatorial horizontal parallaxes and s_S the
Sun's semi-diameter; the factor f and the enlargement for the Earth's atmosphere are the
rule's:

  DANJON     Danjon (1951): the atmosphere is taken as a layer that adds 1/85 to the
             Earth's radius, and the radius is the one at latitude 45 degrees (less by
             half the flattening, 1/600): f = 1.01, as Espenak and Meeus's Five
             Millennium Canon of Lunar Eclipses (2009) writes it; the same absolute
             widening for both shadows.
  CHAUVENET  Chauvenet (1891), the Astronomical Almanac's older practice: both radii,
             with pi_M scaled by 0.998340 to the 45-degree radius, grow by 1/50
             (times 1.02); magnitudes come out about 0.005 (umbral) and 0.026
             (penumbral) larger than by Danjon's rule.

The Moon's semi-diameter is asin(k sin pi_M) with k = 0.2725076 (the IAU's ratio of the
Moon's radius to the Earth's equatorial radius), the Sun's 959.63" at 1 au.

Which places: the shadow's axis is the direction opposite the apparent Sun (the light
that grazes the Earth arrives from there in the Earth's frame, aberration included); the
Moon is its geometric geocentric place at the same instant.  An event is where the Moon
meets a shadow's edge; it is seen from the Earth's centre one light time (about 1.3 s)
later, and the instants given are those seen.

Search: each lunation's full Moon from a cheap series of the elongation (Newton steps
from the mean full Moon); the ones whose argument of latitude puts the Moon within 2.4
degrees of the ecliptic are kept;
greatest eclipse is the instant of the least distance of the Moon's centre from the
axis (the zero of the rate of change of its square), and the contacts are the zeros of
that distance minus the edge, all through the one event search, every eclipse of a
call together.
"""

import erfa
import numpy as np

from . import bodies, ephemeris, frames, vectors
from .bounded import keep
from .errors import RowErrors, SkyError, rows_failing
from .events import Roots, crossings, polish
from .moon import rough_elongation
from .timescales import DateTimes, Instants, julian_year, tt_to_tdb, universal_of
from .vocabulary import (AU_KM, AU_M, BUILTIN, EARTH_RADIUS_KM, IAU2006_YEARS, J2000_JD,
                         LIGHT_DAYS_PER_AU)

RULES = ("DANJON", "CHAUVENET")
DANJON_FACTOR = 1.01          # Espenak and Meeus (2009): (1 + 1/85) at the 45-degree radius
CHAUVENET_FACTOR = 1.02       # Chauvenet (1891): both shadows enlarged by 1/50
CHAUVENET_PARALLAX = 0.998340  # pi_M scaled to the Earth's radius at latitude 45 degrees
MOON_K = 0.2725076            # Moon radius / Earth equatorial radius (IAU 1982)
SUN_SEMIDIAMETER_1AU = np.radians(959.63 / 3600.0)
CONTACTS = ("P1", "U1", "U2", "U3", "U4", "P4")
EVENTS = ("GREATEST",) + CONTACTS
KINDS = ("penumbral", "partial", "total")
PHASES = {"PENUMBRAL": ("P1", "P4"), "PARTIAL": ("U1", "U4"), "TOTAL": ("U2", "U3")}
# Where the search for the next eclipse looks: the next ~7 months, then the year after
# for the rows still without one (no 14 months pass without a lunar eclipse).
FIRST_WINDOW_DAYS = 215.0
SECOND_WINDOW_DAYS = 430.0
# A full Moon is a candidate when 5.145 sin F (the Moon's latitude by its mean argument
# of latitude) is under this: the widest penumbral eclipse needs under 1.6 degrees, and
# that rough latitude is off by up to about 0.35 degree (penumbral eclipses of magnitude
# 0.02 to 0.05 in 1615, 2367, 2479 had it at 1.92 to 1.94).
CANDIDATE_LATITUDE_DEG = 2.4
# The refraction at the horizon (34') with which "above the horizon" is judged: the
# Moon's upper limb risen, as almanacs time moonrise.
HORIZON_REFRACTION_DEG = 34.0 / 60.0


def check_rule(rule):
    word = str(rule).strip().upper()
    if word not in RULES:
        raise SkyError(f'unknown shadow rule "{rule}"; use ' + ", ".join(RULES))
    return word


# ---- the shadow at some instants --------------------------------------------------------


class Track:
    """What a search keeps per eclipse so that each step of it is cheap: TDB - TT (under
    2 ms, changing by under 0.1 us over an eclipse) instead of ERFA dtdb at every step,
    and, for the built-in source, the apparent Sun at five nodes 0.3 day apart round the
    full Moon (ERFA epv00, the costly part, five times instead of at every step):
    Lagrange interpolation through them is within a milliarcsecond of the Sun itself over
    the eclipse (the Earth's monthly wobble of 4,700 km round the barycentre is the
    fastest term).  ``idx`` maps instants to their eclipse's row."""

    SPACING = 0.3
    NODES = np.arange(-2, 3)

    def __init__(self, jd1, jd2, source, nodes=True, idx=None):
        jd1, jd2 = np.asarray(jd1, float), np.asarray(jd2, float)
        self.offset = tdb_offset(jd1, jd2, source)
        self.sun = self.origin = None
        self.idx = np.arange(jd1.size) if idx is None else idx
        if nodes and source == BUILTIN and jd1.size:
            self.origin = (jd1, jd2)
            t2 = (jd2[:, None] + self.SPACING * self.NODES[None, :]).ravel()
            t1 = np.repeat(jd1, self.NODES.size)
            p = bodies.place("SUN", t1, t2, "APPARENT", BUILTIN)
            self.sun = (p.direction * p.distance[:, None]).reshape(jd1.size, self.NODES.size, 3)

    def __getitem__(self, rows):
        """The track of the eclipses ``rows`` (instants of row k belong to rows[k])."""
        out = object.__new__(Track)
        out.offset, out.sun, out.origin = self.offset[rows], self.sun, self.origin
        out.idx = self.idx[rows]
        return out

    def sun_at(self, jd1, jd2):
        """The apparent Sun (au, GCRS axes) at instants, one per row of this track."""
        o1, o2 = self.origin[0][self.idx], self.origin[1][self.idx]
        x = ((jd1 - o1) + (jd2 - o2)) / self.SPACING
        w = np.ones((x.size, self.NODES.size))
        for j, xj in enumerate(self.NODES):
            for k, xk in enumerate(self.NODES):
                if j != k:
                    w[:, j] *= (x - xk) / (xj - xk)
        return np.einsum("nk,nkc->nc", w, self.sun[self.idx])


class Shadow:
    """The Moon against the Earth's shadow at TT instants: ``m`` the angle of the Moon's
    centre from the shadow's axis, ``umbra`` and ``penumbra`` the radii, ``moon`` its
    semi-diameter (radians), ``north`` +1 where the Moon's centre is north of the axis,
    ``moon_km`` its distance."""

    __slots__ = ("m", "umbra", "penumbra", "moon", "north", "moon_km")

    def __init__(self, tt1, tt2, rule, source, track=None):
        tt1, tt2 = np.broadcast_arrays(np.asarray(tt1, float), np.asarray(tt2, float))
        if track is None:
            track = Track(tt1, tt2, source, nodes=False)
        if track.sun is None:
            p = bodies.place("MOON", tt1, tt2 + track.offset, "GEOMETRIC", source)
            moon_u, moon_au, sun_u = p.direction, p.distance, p.sun_direction
            sun_au = vectors.norm(p.earth_helio)
        else:
            # The built-in Moon (ERFA moon98, or the long-range series) is geocentric
            # already; the apparent Sun from the eclipse's nodes (Track).
            moon = ephemeris.get(BUILTIN).moon_geocentric(tt1, tt2, velocity=False)[0]
            moon_au = vectors.norm(moon)
            moon_u = moon / moon_au[..., None]
            sun = track.sun_at(tt1, tt2)
            sun_au = vectors.norm(sun)
            sun_u = sun / sun_au[..., None]
        axis = -sun_u
        self.m = vectors.angle_between(moon_u, axis)
        self.moon_km = moon_au * AU_KM
        pi_m = np.arcsin(EARTH_RADIUS_KM / self.moon_km)
        pi_s = np.arcsin(EARTH_RADIUS_KM / (sun_au * AU_KM))
        s_s = np.arcsin(np.sin(SUN_SEMIDIAMETER_1AU) / sun_au)
        self.moon = np.arcsin(MOON_K * np.sin(pi_m))
        if rule == "DANJON":
            self.umbra = DANJON_FACTOR * pi_m + pi_s - s_s
            self.penumbra = DANJON_FACTOR * pi_m + pi_s + s_s
        else:
            self.umbra = CHAUVENET_FACTOR * (CHAUVENET_PARALLAX * pi_m + pi_s - s_s)
            self.penumbra = CHAUVENET_FACTOR * (CHAUVENET_PARALLAX * pi_m + pi_s + s_s)
        # North of the axis: the Moon's offset from it along the celestial pole's
        # direction projected on the plane across the axis (GCRS axes).
        pole = np.array([0.0, 0.0, 1.0])
        across = pole - axis * vectors.dot(axis, pole)[..., None]
        self.north = np.where(vectors.dot(moon_u - axis, across) >= 0.0, 1.0, -1.0)

    def edge(self, contact):
        """The distance of the Moon's centre from the axis at a contact (radians)."""
        if contact in ("P1", "P4"):
            return self.penumbra + self.moon
        if contact in ("U1", "U4"):
            return self.umbra + self.moon
        return self.umbra - self.moon

    def umbral_magnitude(self):
        return (self.umbra + self.moon - self.m) / (2.0 * self.moon)

    def penumbral_magnitude(self):
        return (self.penumbra + self.moon - self.m) / (2.0 * self.moon)

    def gamma(self):
        """The Moon's centre's distance from the axis in Earth equatorial radii, positive
        north of it."""
        return self.north * self.moon_km * np.sin(self.m) / EARTH_RADIUS_KM


def tdb_offset(tt1, tt2, source):
    """TDB - TT in days as the source takes its argument (none for the built-in one)."""
    if source == BUILTIN:
        return np.zeros(np.shape(tt1))
    tt1, tt2 = np.asarray(tt1, float), np.asarray(tt2, float)
    tdb1, tdb2 = tt_to_tdb(tt1, tt2)
    return (tdb1 - tt1) + (tdb2 - tt2)


# ---- the search ---------------------------------------------------------------------------


class Eclipses:
    """Lunar eclipses found by a search: per eclipse the TT two-part instant of greatest
    eclipse as seen from the Earth's centre (``g1 + g2``), the ``Shadow`` there, its
    ``row`` (which search), and ``contacts``: name -> (jd1, jd2, occurs)."""

    def __init__(self, g1, g2, row, shadow, contacts, rule, source):
        self.g1, self.g2, self.row, self.shadow = g1, g2, row, shadow
        self.contacts, self.rule, self.source = contacts, rule, source

    def kind_index(self):
        """0 penumbral, 1 partial, 2 total."""
        s = self.shadow
        return (s.m < s.umbra + s.moon).astype(int) + (s.m < s.umbra - s.moon).astype(int)

    def event(self, name):
        """(jd1, jd2, occurs) of GREATEST or a contact."""
        if name == "GREATEST":
            return self.g1, self.g2, np.ones(self.g1.shape, bool)
        return self.contacts[name]


# Meeus, Astronomical Algorithms ch. 49: the mean new Moon of lunation k (k = 0 the first
# of 2000) and the mean synodic month; a full Moon is at k + 0.5.
MEAN_NEW_MOON_JD = 2451550.09766
SYNODIC_MONTH = 29.530588861
ROUGH_ELONGATION_RATE = 12.19  # degrees a day, the mean rate of the elongation


def _rough_full_moon(k):
    """The full Moon of lunation k from the cheap elongation (moon.rough_elongation, to
    about an hour), by Newton steps from the mean one: a function of k alone, so every
    search that meets the eclipse computes it from the same instant, bit for bit."""
    jd = MEAN_NEW_MOON_JD + SYNODIC_MONTH * (k + 0.5)
    base = np.floor(jd) + 0.5
    frac = jd - base
    for _ in range(4):
        off = np.mod(rough_elongation(base, frac) - 180.0 + 180.0, 360.0) - 180.0
        frac = frac - off / ROUGH_ELONGATION_RATE
    return base, frac


def _rough_latitude_deg(jd1, jd2):
    """The Moon's latitude from its mean argument of latitude (Meeus ch. 47), degrees."""
    t = ((jd1 - J2000_JD) + jd2) / 36525.0
    f = np.radians(93.2720950 + 483202.0175233 * t)
    return np.degrees(np.arcsin(np.sin(np.radians(5.145)) * np.sin(f)))


def _light_days(shadow):
    return shadow.moon_km / AU_KM * LIGHT_DAYS_PER_AU


def _solve(f, guesses, slope, window, n, direction=0):
    """Roots of ``f`` next to ``guesses`` (``Roots``, one per row of ``n``) by the event
    search's Newton-secant polish; a row where that does not settle is searched by
    brackets over ``window`` (lo, hi offsets in days) round its guess.  Each row's answer
    depends on its own guess alone."""
    roots, good = polish(f, guesses, slope, n, tolerance=2e-7, steps=6)
    jd1, jd2 = roots.jd1.copy(), roots.jd2.copy()
    bad = np.flatnonzero(~good)
    if bad.size:
        base = guesses.jd1[bad] + guesses.jd2[bad]
        again = crossings(lambda j1, j2, r: f(j1, j2, bad[r]), base + window[0][bad],
                          base + window[1][bad], 0.6, direction=direction, tolerance=2e-7)
        a1, a2, found = again.first(bad.size)
        jd1[bad], jd2[bad] = a1, a2
        good[bad] = found
    return jd1, jd2, good


# The Moon's mean motion from the shadow's axis (13.18 less 0.99 degrees a day), radians
# a day: the Newton step's slope before the secant takes over.
MEAN_RELATIVE_RATE = np.radians(12.19)


def _greatest(c1, c2, rule, source, track):
    """Greatest eclipse near each candidate (TT two-part, at the Moon): the zero of the
    rate of the squared distance from the axis, within 7 hours of the rough full Moon."""
    h = 1.0 / 1440.0  # a central difference over two minutes

    def rate(jd1, jd2, row):
        j1 = np.concatenate([jd1, jd1])
        j2 = np.concatenate([jd2 + h, jd2 - h])
        m = Shadow(j1, j2, rule, source, track[np.concatenate([row, row])]).m
        n = jd1.size
        return (m[:n] ** 2 - m[n:] ** 2) / (2.0 * h)

    n = c1.size
    window = (np.full(n, -0.3), np.full(n, 0.3))
    return _solve(rate, Roots(c1, c2, np.arange(n)), 2.0 * MEAN_RELATIVE_RATE ** 2, window, n,
                  direction=+1)


def _of_lunations(ks, rule, source):
    """The lunar eclipses at the full Moons of lunations ``ks`` (unique integers):
    ``Eclipses`` whose ``row`` is the index into ``ks``."""
    c1, c2 = _rough_full_moon(ks.astype(float))
    cand = np.flatnonzero(np.abs(_rough_latitude_deg(c1, c2)) < CANDIDATE_LATITUDE_DEG)
    c1, c2 = c1[cand], c2[cand]
    track = Track(c1, c2, source)
    g1, g2, found = _greatest(c1, c2, rule, source, track)
    minimum = np.flatnonzero(found)  # a candidate without a minimum is no eclipse
    g1, g2, track, cand = g1[minimum], g2[minimum], track[minimum], cand[minimum]
    at = Shadow(g1, g2, rule, source, track)
    eclipse = at.m < at.penumbra + at.moon
    g1, g2, track, cand = g1[eclipse], g2[eclipse], track[eclipse], cand[eclipse]
    at = _subset_shadow(at, eclipse)
    contacts = _contacts(g1, g2, at, rule, source, track)
    return Eclipses(g1, g2 + _light_days(at), cand, at, contacts, rule, source)


def _check_span(start, end, rule, source):
    """Refuse, row by row, the windows that the source does not cover (two days beyond
    both ends, where the search may look): the searches below are per lunation, shared by rows,
    so a date out of range must be caught here, where it is still a row's."""
    n = start.size
    probe = np.concatenate([start - 2.0, end + 2.0])
    try:
        Shadow(probe, np.zeros(probe.shape), rule, source)
    except RowErrors as err:
        messages = np.asarray(err.messages, dtype=object).reshape(2, n)
        raise RowErrors(np.where(np.equal(messages[0], None), messages[1], messages[0])) \
            from None


def find(start, end, rule="DANJON", source=BUILTIN):
    """Every lunar eclipse whose greatest eclipse falls in the rows' windows [start, end]
    (TT JDs, one pair per row): ``Eclipses`` ordered by row and time.  Each full Moon is
    searched once however many rows' windows hold it."""
    rule = check_rule(rule)
    start = np.atleast_1d(np.asarray(start, dtype=float)).ravel()
    end = np.broadcast_to(np.asarray(end, dtype=float), start.shape).ravel()
    _check_span(start, end, rule, source)
    k_lo = np.floor((start - 1.0 - MEAN_NEW_MOON_JD) / SYNODIC_MONTH - 0.5).astype(np.int64) - 1
    k_hi = np.ceil((end + 1.0 - MEAN_NEW_MOON_JD) / SYNODIC_MONTH - 0.5).astype(np.int64) + 1
    counts = k_hi - k_lo + 1
    row = np.repeat(np.arange(start.size), counts)
    k = k_lo[row] + (np.arange(row.size) - np.repeat(np.cumsum(counts) - counts, counts))
    # Only the lunations whose full Moon falls within a day of a row's window: the search
    # then stays inside what _check_span has checked.
    ks, which = np.unique(k, return_inverse=True)
    f1, f2 = _rough_full_moon(ks.astype(float))
    near = ((f1[which] - start[row]) + f2[which] >= -1.0) & ((f1[which] - end[row]) + f2[which] <= 1.0)
    row, k = row[near], k[near]
    ks, which = np.unique(k, return_inverse=True)
    e = _of_lunations(ks, rule, source)
    # Pair each row's lunations with the eclipses among them.
    index = np.full(ks.size, -1)
    index[e.row] = np.arange(e.row.size)
    pick = index[which]
    has = pick >= 0
    row, pick = row[has], pick[has]
    g = e.g1[pick] + e.g2[pick]
    inside = (start[row] <= g) & (g <= end[row])
    row, pick = row[inside], pick[inside]
    out = _subset(e, pick)
    out.row = row
    return out


def _subset_shadow(shadow, index):
    s = object.__new__(Shadow)
    for k in Shadow.__slots__:
        setattr(s, k, getattr(shadow, k)[index])
    return s


def _subset(e, index):
    s = _subset_shadow(e.shadow, index)
    contacts = {k: tuple(v[index] for v in val) for k, val in e.contacts.items()}
    return Eclipses(e.g1[index], e.g2[index], e.row[index], s, contacts, e.rule, e.source)


def _contacts(g1, g2, at, rule, source, track):
    """The six contacts of the eclipses greatest at ``g1 + g2`` (``at`` the shadow
    there, TT at the Moon): the zeros of distance minus edge, first guessed from the
    Moon's path as a straight line at the speed it has at greatest eclipse (so that
    m^2 = m0^2 + v^2 (t - G)^2), then polished; brackets within 0.2 day (a penumbral
    eclipse lasts at most about 6 hours) where the polish does not settle.  The Moon's
    light time at greatest eclipse serves for every contact (its distance changes by
    under 100 km, 0.3 ms of light, over an eclipse)."""
    n = g1.size
    h = 0.01
    both = np.concatenate([np.arange(n), np.arange(n)])
    near = Shadow(np.concatenate([g1, g1]), np.concatenate([g2 - h, g2 + h]), rule, source,
                  track[both])
    speed2 = (near.m[:n] ** 2 + near.m[n:] ** 2 - 2.0 * at.m ** 2) / (2.0 * h * h)
    names, idx = [], []
    for k, name in enumerate(CONTACTS):
        occurs = at.m < at.edge(name)
        names.append(np.full(np.count_nonzero(occurs), k))
        idx.append(np.flatnonzero(occurs))
    which, eclipse = np.concatenate(names), np.concatenate(idx)
    sign = np.where(which < 3, -1.0, 1.0)
    edges = np.stack([at.edge(c) for c in CONTACTS])[which, eclipse]
    v2 = speed2[eclipse]
    half = np.sqrt(np.maximum(edges ** 2 - at.m[eclipse] ** 2, 0.0) / v2)
    guess = Roots(g1[eclipse], g2[eclipse] + sign * half, np.arange(which.size))
    slope = v2 * sign * half / edges

    def f(jd1, jd2, row):
        e, kinds = eclipse[row], which[row]
        s = Shadow(jd1, jd2, rule, source, track[e])
        edge = np.select([kinds == 0, kinds == 1, kinds == 2, kinds == 3, kinds == 4],
                         [s.edge("P1"), s.edge("U1"), s.edge("U2"), s.edge("U3"),
                          s.edge("U4")], s.edge("P4"))
        return s.m - edge

    # Brackets between greatest eclipse and 0.2 day before or after it.
    window = (np.where(sign < 0, -0.2 - sign * half, -sign * half),
              np.where(sign < 0, -sign * half, 0.2 - sign * half))
    c1, c2, found = _solve(f, guess, slope, window, which.size)
    seen = _light_days(at)
    out = {}
    for k, name in enumerate(CONTACTS):
        j1, j2, occurs = np.full(n, np.nan), np.full(n, np.nan), np.zeros(n, bool)
        mine = (which == k) & found
        j1[eclipse[mine]], j2[eclipse[mine]], occurs[eclipse[mine]] = c1[mine], c2[mine], True
        j2[occurs] += seen[occurs]
        out[name] = (j1, j2, occurs)
    return out


# One instant's next eclipse, kept: a sheet's row asks for it in several cells (the
# instant, kind, magnitudes, contacts, the Moon's altitude), each a search of its own.
# Keyed by the instant, the rule, the source and what its kernels hold now; about 5 kB
# each, 5 MB when full.
_ONE_INSTANT = {}
ONE_INSTANT_KEPT = 1000


def next_after(tt1, tt2, rule="DANJON", source=BUILTIN):
    """The first lunar eclipse whose greatest eclipse is after each instant: ``Eclipses``
    with one eclipse per row, in row order.  One instant's is kept (read it, never
    change it)."""
    tt1, tt2 = np.ravel(np.asarray(tt1, float)), np.ravel(np.asarray(tt2, float))
    if tt1.size != 1:
        return _next_after(tt1, tt2, rule, source)
    key = (tt1.item(), tt2.item(), str(rule), str(source), ephemeris.content_stamp(source))
    found = _ONE_INSTANT.get(key)
    if found is None:
        found = _next_after(tt1, tt2, rule, source)
        keep(_ONE_INSTANT, key, found, ONE_INSTANT_KEPT)
    return found


def _next_after(tt1, tt2, rule, source):
    n = tt1.size
    jd = tt1 + tt2
    chosen = np.zeros(n, bool)
    parts = []
    for lo, hi in ((0.0, FIRST_WINDOW_DAYS), (FIRST_WINDOW_DAYS - 1.0, SECOND_WINDOW_DAYS)):
        todo = np.flatnonzero(~chosen)
        if not todo.size:
            break
        try:
            e = find(jd[todo] + lo - 0.01, jd[todo] + hi, rule, source)
        except RowErrors as err:  # aligned with the rows searched: with all rows
            messages = np.full(n, None, dtype=object)
            messages[todo] = np.ravel(err.messages)
            raise RowErrors(messages) from None
        later = ((e.g1 - tt1[todo][e.row]) + (e.g2 - tt2[todo][e.row])) > 0.0
        idx = np.flatnonzero(later)
        rows, at = np.unique(e.row[idx], return_index=True)
        picked = _subset(e, idx[at])
        picked.row = todo[rows]
        chosen[todo[rows]] = True
        parts.append(picked)
    if not np.all(chosen):
        raise rows_failing(~chosen, "no lunar eclipse found in the 14 months after")
    return _concat(parts, n)


def _concat(parts, n):
    """One ``Eclipses`` with the row-th eclipse in place row."""
    order = np.argsort(np.concatenate([p.row for p in parts]))

    def cat(get):
        return np.concatenate([get(p) for p in parts])[order]

    s = object.__new__(Shadow)
    for k in Shadow.__slots__:
        setattr(s, k, cat(lambda p, k=k: getattr(p.shadow, k)))
    contacts = {name: tuple(cat(lambda p, i=i, name=name: p.contacts[name][i])
                            for i in range(3)) for name in CONTACTS}
    return Eclipses(cat(lambda p: p.g1), cat(lambda p: p.g2), np.arange(n), s, contacts,
                    parts[0].rule, parts[0].source)


# ---- cell functions -------------------------------------------------------------------


def _next(time, rule, source):
    return next_after(*time.tt(), rule, source)


def _no_contact(e, name):
    jd1, jd2, occurs = e.event(name)
    if not np.all(occurs):
        kinds = np.array(KINDS, dtype=object)[e.kind_index()]
        messages = np.full(occurs.shape, None, dtype=object)
        what = {"P1": "penumbral", "P4": "penumbral", "U1": "umbral", "U4": "umbral",
                "U2": "total", "U3": "total"}[name]
        for k in np.flatnonzero(~occurs):
            messages[k] = (f"no {name} contact: the next lunar eclipse is {kinds[k]}, with no "
                           f"{what} phase")
        raise RowErrors(messages)
    return jd1, jd2


def next_cells(time, event="GREATEST", result_scale=None, rule="DANJON", source=BUILTIN):
    """The instant of greatest eclipse, or of a contact, of the next lunar eclipse."""
    e = _next(time, rule, source)
    jd1, jd2 = _no_contact(e, event)
    return DateTimes.of_tt(jd1, jd2, result_scale or time.scale)


def kind_cells(time, rule="DANJON", source=BUILTIN):
    e = _next(time, rule, source)
    return np.array(KINDS, dtype=object)[e.kind_index()]


def magnitude_cells(time, shadow="UMBRAL", rule="DANJON", source=BUILTIN):
    e = _next(time, rule, source)
    if shadow == "UMBRAL":
        return e.shadow.umbral_magnitude()
    return e.shadow.penumbral_magnitude()


def gamma_cells(time, rule="DANJON", source=BUILTIN):
    return _next(time, rule, source).shadow.gamma()


def duration_cells(time, phase="TOTAL", rule="DANJON", source=BUILTIN):
    """Minutes between the phase's contacts."""
    e = _next(time, rule, source)
    first, last = PHASES[phase]
    a1, a2 = _no_contact(e, first)
    b1, b2 = _no_contact(e, last)
    return ((b1 - a1) + (b2 - a2)) * 1440.0


# ---- seen from a site --------------------------------------------------------------------


def _delta_t_shift(time, jd1, jd2, sigmas):
    """Seconds to add to the default Delta T at TT instants (one per row): the difference
    the scale's own rule makes (a named model, or a value in seconds given with UT), plus
    ``sigmas`` published standard errors (deltat.uncertainty)."""
    jd1, jd2 = np.asarray(jd1, float), np.asarray(jd2, float)
    shift = np.zeros(jd1.shape)
    rule = universal_of(time.scale)
    if rule != "UT":
        tt = Instants(jd1, jd2, "TT")
        mine, default = tt.to(rule), tt.to("UT")
        shift = -((mine.jd1 - default.jd1) + (mine.jd2 - default.jd2)) * 86400.0
    sigmas = np.broadcast_to(np.asarray(sigmas, dtype=float), jd1.shape)
    wanted = sigmas != 0.0
    if np.any(wanted):
        years = julian_year(jd1, jd2)
        known = np.isfinite(_published_sigma(years))
        if np.any(wanted & ~known):
            raise rows_failing(wanted & ~known, "no published uncertainty of Delta T for "
                               "this date (the estimates used cover 1000 BC to AD 1200, "
                               "and 1700, 1800, 1900); give delta_t_sigmas 0")
        sigma = np.where(wanted, _published_sigma(years), 0.0)
        shift = shift + sigmas * sigma
    return shift


def _published_sigma(years):
    """deltat.uncertainty where it is published, NaN elsewhere (row by row)."""
    from . import deltat

    try:
        return deltat.uncertainty(years)
    except RowErrors as err:
        out = np.full(np.shape(years), np.nan)
        ok = np.equal(err.messages, None)
        if np.any(ok):
            out[ok] = deltat.uncertainty(np.asarray(years)[ok])
        return out


def _check_sigmas(sigmas):
    sigmas = np.asarray(sigmas, dtype=float)
    bad = np.abs(sigmas) > 5.0
    if np.any(bad):
        raise rows_failing(bad, "delta_t_sigmas must be within -5 to +5 standard errors")
    return sigmas


# The Earth rotation angle's rate, radians per second of UT (IAU 2000: 1.00273781191135448
# turns per UT day): a Delta T larger by a second turns the sky back by this much.
ERA_RATE = 2.0 * np.pi * 1.00273781191135448 / 86400.0


def _check_site(latitude, longitude, height, shape):
    lat = np.broadcast_to(np.asarray(latitude, float), shape)
    lon = np.broadcast_to(np.asarray(longitude, float), shape)
    hgt = np.broadcast_to(np.asarray(height, float), shape)
    frames.check_latitudes(lat)
    bad = (hgt < -1000.0) | (hgt > 20000.0)
    if np.any(bad):
        raise rows_failing(bad, "the height must be within -1000 to 20000 m above the ellipsoid")
    return np.radians(lat), np.radians(lon), hgt


def _moon_on_the_sky(jd1, jd2, source):
    """(geocentric apparent Moon on the true equator and equinox of date in au, Greenwich
    apparent sidereal time in radians with the default Delta T) at TT instants.

    The true equator and equinox from IAU 2006/2000A inside IAU2006_YEARS and the
    long-term frames outside; the sidereal time ERFA gst06 of that same matrix inside,
    outside GMST of IAU 2006 plus the equation of the equinoxes from IAU 2000B (the few
    arcminutes between the models are nothing beside Delta T's own error there)."""
    p = bodies.place_at_tt("MOON", jd1, jd2, "APPARENT", source)
    npb = frames.system_matrix("EQUATORIAL TRUE", jd1, jd2, long_term=True)
    v = vectors.apply(npb, p.direction * p.distance[:, None])
    ut = Instants(jd1, jd2, "TT").to("UT")
    years = julian_year(jd1, jd2)
    inside = (years >= IAU2006_YEARS[0]) & (years <= IAU2006_YEARS[1])
    gast = np.empty(jd1.shape)
    if np.any(inside):
        gast[inside] = erfa.gst06(ut.jd1[inside], ut.jd2[inside], jd1[inside], jd2[inside],
                                  npb[inside])
    if not np.all(inside):
        o = ~inside
        dpsi, _ = erfa.nut00b(jd1[o], jd2[o])
        gast[o] = (erfa.gmst06(ut.jd1[o], ut.jd2[o], jd1[o], jd2[o])
                   + dpsi * np.cos(erfa.obl06(jd1[o], jd2[o])))
    return v, gast


def _altitude(v, gast, lat, lon, hgt):
    """Airless altitude (degrees) of the Moon's centre from a site (radians, metres):
    the site's WGS84 geocentric position (ERFA gd2gc) taken off, measured from the
    geodetic vertical."""
    c, s = np.cos(gast), np.sin(gast)
    x = c * v[:, 0] + s * v[:, 1]
    y = -s * v[:, 0] + c * v[:, 1]
    site = erfa.gd2gc(1, lon, lat, hgt) / AU_M
    topo = np.stack([x, y, v[:, 2]], axis=-1) - site
    up = np.stack([np.cos(lat) * np.cos(lon), np.cos(lat) * np.sin(lon), np.sin(lat)], axis=-1)
    sin_alt = vectors.dot(up, topo) / vectors.norm(topo)
    return np.degrees(np.arcsin(np.clip(sin_alt, -1.0, 1.0)))


def _moon_altitude(jd1, jd2, latitude, longitude, height, shift_seconds, source):
    """Airless topocentric altitude (degrees) of the Moon's centre at TT instants, with
    Delta T larger by ``shift_seconds``: the Earth has then turned less by the TT
    instant, by ERA_RATE a second."""
    jd1, jd2 = np.broadcast_arrays(np.ravel(np.asarray(jd1, float)),
                                   np.ravel(np.asarray(jd2, float)))
    lat, lon, hgt = _check_site(latitude, longitude, height, jd1.shape)
    v, gast = _moon_on_the_sky(jd1, jd2, source)
    return _altitude(v, gast - ERA_RATE * np.broadcast_to(shift_seconds, jd1.shape), lat, lon, hgt)


def moon_altitude_cells(time, latitude, longitude, event="GREATEST", height=0.0,
                        delta_t_sigmas=0.0, rule="DANJON", source=BUILTIN):
    """The Moon's altitude at a site at an instant of the next lunar eclipse."""
    sigmas = _check_sigmas(delta_t_sigmas)
    e = _next(time, rule, source)
    jd1, jd2 = _no_contact(e, event)
    shift = _delta_t_shift(time, jd1, jd2, sigmas)
    return _moon_altitude(jd1, jd2, latitude, longitude, height, shift, source)


SAMPLES_PER_PHASE = 24
SIGMA_STEPS = 9


def visibility_cells(time, latitude, longitude, height=0.0, delta_t_sigmas=0.0,
                     rule="DANJON", source=BUILTIN):
    """Which phases of the next lunar eclipse have the Moon above the site's horizon,
    in words; over Delta T -k..+k sigma when ``delta_t_sigmas`` is k."""
    sigmas = np.abs(_check_sigmas(delta_t_sigmas))
    e = _next(time, rule, source)
    n = e.g1.size
    lat, lon, hgt = _check_site(latitude, longitude, height, (n,))
    sig = np.broadcast_to(sigmas, (n,))
    one = _delta_t_shift(time, e.g1, e.g2, np.where(sig > 0.0, 1.0, 0.0)) - \
        _delta_t_shift(time, e.g1, e.g2, 0.0)
    steps = np.linspace(-1.0, 1.0, SIGMA_STEPS) if np.any(sig > 0.0) else np.zeros(1)
    frac = np.linspace(0.0, 1.0, SAMPLES_PER_PHASE)
    # Rows x phases x instants: the Moon's place once; x Delta T steps: the Earth turned.
    phases = list(PHASES)
    a1, a2, b1, b2, occurs = (np.stack([e.contacts[PHASES[p][end]][i] for p in phases], axis=1)
                              for end, i in ((0, 0), (0, 1), (1, 0), (1, 1), (0, 2)))
    a1 = np.where(occurs, a1, e.g1[:, None])
    a2 = np.where(occurs, a2, e.g2[:, None])
    span = np.where(occurs, (b1 - a1) + (b2 - a2), 0.0)
    shape = (n, len(phases), SAMPLES_PER_PHASE)
    j1 = np.broadcast_to(a1[:, :, None], shape).ravel()
    j2 = (a2[:, :, None] + span[:, :, None] * frac[None, None, :]).ravel()
    v, gast = _moon_on_the_sky(j1, j2, e.source)
    shift = _delta_t_shift(time, j1, j2, 0.0)
    rows = np.repeat(np.arange(n), len(phases) * SAMPLES_PER_PHASE)
    up = np.empty(shape + (steps.size,), dtype=bool)
    limb = np.degrees(e.shadow.moon)[rows] + HORIZON_REFRACTION_DEG
    for k, step in enumerate(steps):
        turned = gast - ERA_RATE * (shift + (one * sig)[rows] * step)
        alt = _altitude(v, turned, lat[rows], lon[rows], hgt[rows])
        up[..., k] = (alt > -limb).reshape(shape)
    whole = np.all(up, axis=2)   # rows x phases x steps
    some = np.any(up, axis=2)
    middle = steps.size // 2
    out = np.empty(n, dtype=object)
    for r in range(n):
        used = slice(None) if sig[r] > 0.0 else slice(middle, middle + 1)
        parts = []
        for k, p in reversed(list(enumerate(phases))):
            if not occurs[r, k]:
                continue
            words = {"all seen" if w else "part seen" if s else "not seen"
                     for w, s in zip(whole[r, k, used], some[r, k, used])}
            order = [w for w in ("all seen", "part seen", "not seen") if w in words]
            parts.append(f"{p.lower()} phase: " + " or ".join(order))
        text = "; ".join(parts)
        if sig[r] > 0.0 and any(" or " in x for x in parts):
            text += f" (over Delta T +-{sig[r]:g} sigma)"
        out[r] = text
    return out
