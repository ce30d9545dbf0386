"""Solar eclipses: the next one anywhere, and what a site sees, modern and ancient.

Method: Besselian elements (Bessel; Chauvenet; the Explanatory Supplement), made from
the project's own apparent geocentric Sun and Moon (bodies.py, any source) rather than
from a published table.  Around each new Moon the two vectors, on the true equator and
equinox of date, are sampled at 11 Chebyshev nodes over +-5 hours and kept as Chebyshev
series (exact to far below a metre over that span).  At any instant the shadow axis runs
from the Moon towards the Sun; the fundamental plane is the plane through the Earth's
centre square to it, with x to the east (along the equator) and y to the north.  The
Moon's x, y, z there, the cones' half angles f1 (penumbra) and f2 (umbra), and the
shadows' radii l1 and l2 on the plane follow; a point at height zeta above the plane
is inside the penumbra when its distance from the axis is under L1 = l1 - zeta tan f1,
and inside the umbra (total, L2 < 0) or the antumbra (annular, L2 > 0) when under |L2|,
L2 = l2 - zeta tan f2.

Lunar radius: k = 0.2725076 Earth equatorial radii for the penumbral contacts (C1, C4,
the partial phase and the magnitude) and k = 0.2722810 for the umbral ones (C2, C3, the
duration of totality or annularity): the IAU (1982) value and the smaller one that the
published eclipse canons use for the umbra (values from memory).  The Sun's radius is
696,000 km (959.63" at 1 au).  The Moon's limb profile (its valleys and mountains,
which shift the contacts of a total eclipse by a second or two) is ignored: the Moon is
a sphere.  The Earth is the WGS84 ellipsoid, its equatorial radius the unit of length.

Greatest eclipse is the instant when the shadow axis passes closest to the Earth's
centre; gamma is that least distance (Earth radii, negative when the axis passes south
of the centre).  The magnitude at greatest eclipse is, for a total, annular or hybrid
eclipse, the ratio of the Moon's apparent diameter to the Sun's on the axis, and for a
partial one the fraction of the Sun's diameter covered at the point of the Earth's limb
nearest the axis (the convention of the published canons).  At a site the magnitude is
the fraction of the Sun's diameter covered, (L1 - m) / (L1 + L2), and the obscuration
the fraction of the Sun's disc covered (the overlap of two discs).

Delta T enters only through the Earth's rotation: the elements are on TT, the site
turns under them with the Greenwich apparent sidereal time of UT = TT - Delta T.  A
change of Delta T by d seconds moves the ground track by 15.04 d arcseconds of
longitude, which is what ``delta_t_limits`` searches over.

Safety: never look at the Sun, however much of it is covered, without a proper solar
filter; only during totality itself is the naked eye safe.
"""

import erfa
import numpy as np
from numpy.polynomial import chebyshev

from . import bodies, deltat, ephemeris, frames, horizon, vectors
from .bounded import keep
from .errors import RowErrors, rows_failing
from .events import brackets, crossings, refine, sample, wrap180
from .moon import elongation_lon, rough_elongation
from .timescales import DateTimes, Instants, julian_year, universal_of
from .sun import check_site
from .topocentric import SUN_RADIUS_KM
from .vocabulary import AU_KM, BUILTIN

WGS84_A_KM = 6378.137
WGS84_F = 1.0 / 298.257223563
K_PENUMBRA = 0.2725076  # Moon's radius in Earth equatorial radii, IAU 1982 (from memory)
K_UMBRA = 0.2722810     # the canons' smaller value for umbral contacts (from memory)
SUN_RADIUS = SUN_RADIUS_KM / WGS84_A_KM
HALF_WINDOW = 5.0 / 24.0  # days either side of the new Moon kept in the series
NODES = 11
# Earth rotation: radians of sidereal angle per day of UT (IERS 2003, ERFA era00's rate).
ROTATION = 2.0 * np.pi * 1.00273781191135448
SYNODIC_MONTH = 29.530588861
SAFETY = ("Never look at the Sun, however much of it is covered, without a proper solar "
          "filter; only during totality itself is the naked eye safe.")
CONTACTS = ("C1", "C2", "MAX", "C3", "C4")
NOT_SEEN = "no eclipse seen from here"


# ---- the elements ------------------------------------------------------------------------


class Series:
    """Chebyshev series of the apparent geocentric Sun and Moon (Earth radii, true equator
    and equinox of the centre's date) over centre +- HALF_WINDOW, one per eclipse."""

    def __init__(self, c1, c2, source):
        self.c1, self.c2 = np.asarray(c1, float), np.asarray(c2, float)
        n = self.c1.size
        nodes = np.cos(np.pi * (np.arange(NODES) + 0.5) / NODES)
        t1 = np.repeat(self.c1, NODES)
        t2 = (self.c2[:, None] + nodes[None, :] * HALF_WINDOW).ravel()
        self.rnpb = frames.system_matrix("EQUATORIAL TRUE", self.c1, self.c2, long_term=True)
        rot = np.repeat(np.reshape(self.rnpb, (n, 3, 3)), NODES, axis=0)
        values = []
        for body in ("SUN", "MOON"):
            p = bodies.place_at_tt(body, t1, t2, "APPARENT", source)
            v = p.direction * (p.distance * (AU_KM / WGS84_A_KM))[:, None]
            values.append(vectors.apply(rot, v))
        values = np.concatenate(values, axis=-1).reshape(n, NODES, 6)
        inverse = np.linalg.inv(chebyshev.chebvander(nodes, NODES - 1))
        self.coef = np.einsum("kj,njc->nkc", inverse, values)

    def tau(self, e, jd1, jd2):
        return ((jd1 - self.c1[e]) + (jd2 - self.c2[e])) / HALF_WINDOW

    def vectors(self, e, tau):
        """(Sun, Moon) vectors of eclipses ``e`` at ``tau`` (arrays of one shape)."""
        e, tau = np.broadcast_arrays(np.asarray(e), np.asarray(tau, float))
        v = chebyshev.chebvander(tau.ravel(), NODES - 1)
        out = np.einsum("mk,mkc->mc", v, self.coef[e.ravel()])
        return out[:, :3], out[:, 3:]


class Elements:
    """Besselian elements at instants: the axis unit vector g, the plane's axes ex, ey,
    the Moon's x, y, z, tan f1, tan f2, l1, l2 (all (m,) or (m, 3))."""

    def __init__(self, sun, moon):
        axis = sun - moon
        dist = vectors.norm(axis)
        g = axis / dist[:, None]
        ex = vectors.unit(np.stack([-g[:, 1], g[:, 0], np.zeros_like(g[:, 0])], axis=-1))
        ey = np.cross(g, ex)
        self.g, self.ex, self.ey = g, ex, ey
        self.x, self.y, self.z = (np.sum(moon * a, axis=-1) for a in (ex, ey, g))
        s1 = (SUN_RADIUS + K_PENUMBRA) / dist
        s2 = (SUN_RADIUS - K_UMBRA) / dist
        c1, c2 = np.sqrt(1.0 - s1 * s1), np.sqrt(1.0 - s2 * s2)
        self.tan1, self.tan2 = s1 / c1, s2 / c2
        self.l1 = self.z * self.tan1 + K_PENUMBRA / c1
        self.l2 = self.z * self.tan2 - K_UMBRA / c2
        # The same cones with the other k: the discs' radii for a magnitude (the partial
        # phase with the penumbral k, the diameter ratio of a central eclipse with the
        # umbral one, as the canons do).
        self.l2k1 = self.z * self.tan2 - K_PENUMBRA / c2
        self.l1k2 = self.z * self.tan1 + K_UMBRA / c1


def _ellipsoid_zeta(el):
    """Height above the plane of the sunward point where the axis meets the ellipsoid,
    NaN where it misses."""
    b2 = (1.0 - WGS84_F) ** 2
    d = np.array([1.0, 1.0, 1.0 / b2])
    q = el.x[:, None] * el.ex + el.y[:, None] * el.ey
    a = np.sum(el.g * el.g * d, axis=-1)
    b = 2.0 * np.sum(q * el.g * d, axis=-1)
    c = np.sum(q * q * d, axis=-1) - 1.0
    disc = b * b - 4.0 * a * c
    with np.errstate(invalid="ignore"):
        return np.where(disc >= 0.0, (-b + np.sqrt(disc)) / (2.0 * a), np.nan)


def _limb_distance(el):
    """Distance on the plane from the axis to the Earth's outline (an ellipse of
    semi-axes 1 east-west and rho1 north-south), positive outside."""
    b2 = (1.0 - WGS84_F) ** 2
    sin_d = el.g[:, 2]
    rho1 = np.sqrt(sin_d * sin_d + b2 * (1.0 - sin_d * sin_d))
    r = np.hypot(el.x, el.y)
    scaled = np.hypot(el.x, el.y / rho1)
    return r * (1.0 - 1.0 / scaled)


# ---- the next eclipse anywhere --------------------------------------------------------------


def _mean_lunations(jd):
    """Meeus (Astronomical Algorithms, ch. 49 and 54): the lunation numbers k (0 at the
    new Moon of 2000 January 6) of the ten mean new Moons from the one before ``jd``."""
    k0 = np.floor((jd - 2451550.09766) / SYNODIC_MONTH) - 1.0
    return k0[:, None] + np.arange(10)[None, :]


def _mean_new_moon(k):
    """(TT JD of the mean new Moon, whether an eclipse may come there): Meeus's test is
    |sin F| under 0.36, F the Moon's argument of latitude; we keep 0.40 to be safe."""
    t = k / 1236.85
    mean = 2451550.09766 + SYNODIC_MONTH * k + 0.00015437 * t * t
    f = np.radians(160.7108 + 390.67050284 * k - 0.0016118 * t * t)
    return mean, np.abs(np.sin(f)) < 0.40


def _new_moons(start, end, source):
    """``events.Roots`` of the new Moon (apparent elongation in longitude zero, rising)
    in each window, the same search as moon.py's phases: daily samples near where the
    rough elongation (Meeus's largest terms) changes sign, then the full theory."""
    return crossings(lambda j1, j2, row: wrap180(elongation_lon(j1, j2, source)),
                     start, end, 1.0, direction=+1, jump=90.0,
                     estimate=lambda j1, j2, row: wrap180(rough_elongation(j1, j2)))


class Found:
    """Eclipses found: per eclipse the series, greatest eclipse (TT two parts), gamma,
    magnitude, kind; ``of_row`` maps each searched row to its eclipse."""


# What each lunation holds, once computed: ((source, kernel stamps), k) -> the new Moon, its series and
# its greatest eclipse.  A sheet asks about the same few eclipses from many cells.
_LUNATIONS = {}
_LUNATIONS_SIZE = 20000
_FIELDS = ("c1", "c2", "coef", "rnpb", "g1", "g2", "gamma", "magnitude", "kind", "touches")


def _lunations(ks, source):
    """Per lunation number: a dict of arrays (_FIELDS) and a mask of those with a new
    Moon found; computed for the lunations not yet known, in one vectorised pass."""
    # The source with what its kernel files hold now: a kernel replaced on disk is
    # another source, whose lunations are computed anew.
    key = (str(source), ephemeris.content_stamp(source))
    todo = np.array([k for k in ks if (key, k) not in _LUNATIONS])
    if todo.size:
        mean, _ = _mean_new_moon(todo)
        # The true new Moon (the elongation in longitude zero) within a day of the mean.
        try:
            roots = _new_moons(mean - 1.2, mean + 1.2, source)
        except RowErrors as err:  # aligned with ``todo``: made aligned with ``ks``
            messages = np.ravel(err.messages)
            if messages.size != todo.size:
                raise
            where = {k: m for k, m in zip(todo.tolist(), messages)}
            raise RowErrors(np.array([where.get(k) for k in ks], dtype=object)) from None
        n1, n2, ok = roots.first(todo.size)
        idx = np.flatnonzero(ok)
        try:
            series = Series(n1[idx], n2[idx], source)
            g1, g2, gamma, mag, kind, touches = _greatest(series, np.arange(idx.size))
        except RowErrors as err:  # aligned with the new Moons found: made aligned with ks
            messages = np.ravel(err.messages)
            if messages.size == idx.size * NODES:  # the series' nodes, lunation by lunation
                nodes = messages.reshape(idx.size, NODES)
                messages = np.array([next((m for m in r if m is not None), None)
                                     for r in nodes], dtype=object)
            if messages.size != idx.size:
                raise
            where = {k: m for k, m in zip(todo[idx].tolist(), messages)}
            raise RowErrors(np.array([where.get(k) for k in ks], dtype=object)) from None
        rnpb = np.reshape(series.rnpb, (-1, 3, 3))
        if len(_LUNATIONS) + todo.size > _LUNATIONS_SIZE:
            _LUNATIONS.clear()
        for j, k in enumerate(todo):
            _LUNATIONS[(key, k)] = None
        for j, i in enumerate(idx):  # storing what the pass computed, lunation by lunation
            _LUNATIONS[(key, todo[i])] = (series.c1[j], series.c2[j], series.coef[j], rnpb[j],
                                          g1[j], g2[j], gamma[j], mag[j], kind[j], touches[j])
    records = [_LUNATIONS[(key, k)] for k in ks]
    have = np.array([r is not None for r in records], dtype=bool)
    filler = next((r for r in records if r is not None), None)
    if filler is None:
        return None, have
    records = [r if r is not None else filler for r in records]
    return {name: np.array([r[i] for r in records]) for i, name in enumerate(_FIELDS)}, have


def next_eclipse(tt1, tt2, source=BUILTIN):
    """The first solar eclipse whose greatest eclipse follows each TT instant."""
    tt1, tt2 = np.ravel(np.asarray(tt1, float)), np.ravel(np.asarray(tt2, float))
    pairs, of_row = np.unique(np.stack([tt1, tt2], axis=-1), axis=0, return_inverse=True)
    of_row = np.ravel(of_row)
    u1, u2 = pairs[:, 0], pairs[:, 1]
    # The dates themselves first: a date outside the source's span is named row by row.
    try:
        bodies.place_at_tt("MOON", u1, u2, "GEOMETRIC", source)
    except RowErrors as err:
        raise RowErrors(np.ravel(err.messages)[of_row]) from None
    ks = _mean_lunations(u1 + u2)
    mean, maybe = _mean_new_moon(ks)
    late = mean > (u1 + u2)[:, None] - 2.0
    cand_row, cand_j = np.nonzero(maybe & late)
    cand_k = ks[cand_row, cand_j]
    unique_k, at = np.unique(cand_k, return_inverse=True)
    at = np.ravel(at)
    try:
        rec, have = _lunations([int(k) for k in unique_k], source)
    except RowErrors as err:
        # Aligned with the lunations searched: each searched instant takes the message
        # of its first failing lunation (a date beyond the source's span).
        messages = np.ravel(err.messages)
        if messages.size != unique_k.size:
            raise
        per_row = np.full(u1.size, None, dtype=object)
        for i in np.flatnonzero(np.not_equal(messages[at], None))[::-1]:
            per_row[cand_row[i]] = messages[at[i]]
        if not np.any(np.not_equal(per_row, None)):
            raise
        raise RowErrors(per_row[of_row]) from None
    if rec is None:
        raise rows_failing(np.ones(tt1.size, bool), "no solar eclipse found in the 9 months "
                                                     "after")
    g1, g2 = rec["g1"][at], rec["g2"][at]
    after = ((g1 - u1[cand_row]) + (g2 - u2[cand_row])) > 0.0
    good = have[at] & rec["touches"][at] & after
    # Per searched instant, its first good candidate (the candidates come in time order).
    rows_good = cand_row[good]
    first_rows, first_at = np.unique(rows_good, return_index=True)
    missing = np.ones(u1.size, bool)
    missing[first_rows] = False
    if np.any(missing):
        raise rows_failing(missing[of_row], "no solar eclipse found in the 9 months after")
    pick = at[np.flatnonzero(good)[first_at]]
    found = Found()
    series = Series.__new__(Series)
    series.c1, series.c2 = rec["c1"][pick], rec["c2"][pick]
    series.coef, series.rnpb = rec["coef"][pick], rec["rnpb"][pick]
    found.series = series
    found.g1, found.g2 = rec["g1"][pick], rec["g2"][pick]
    found.gamma, found.magnitude = rec["gamma"][pick], rec["magnitude"][pick]
    found.kind = rec["kind"][pick].astype(object)
    found.of_row = of_row
    return found


def _axis_rate(series, e):
    """d/dt of (x^2 + y^2) / 2, the axis' distance from the centre, for the search."""
    h = 2e-4  # in tau: 3.6 s

    def f(jd1, jd2, row):
        tau = series.tau(e[row], jd1, jd2)
        ahead = Elements(*series.vectors(e[row], tau + h))
        back = Elements(*series.vectors(e[row], tau - h))
        return ((ahead.x ** 2 + ahead.y ** 2) - (back.x ** 2 + back.y ** 2)) / (4.0 * h)
    return f


def _greatest(series, e):
    """Greatest eclipse of the eclipses ``e`` of ``series``: (g1, g2, gamma, magnitude,
    kind, whether the penumbra touches the Earth)."""
    n = e.size
    c1, c2 = series.c1[e], series.c2[e]
    roots = crossings(_axis_rate(series, e), c1 + c2 - 0.95 * HALF_WINDOW,
                      c1 + c2 + 0.95 * HALF_WINDOW, 0.05, direction=+1)
    g1, g2, found = roots.first(n)
    g1, g2 = np.where(found, g1, c1), np.where(found, g2, c2)
    el = Elements(*series.vectors(e, series.tau(e, g1, g2)))
    gamma = np.copysign(np.hypot(el.x, el.y), el.y)
    zeta = _ellipsoid_zeta(el)
    central = np.isfinite(zeta)
    limb = _limb_distance(el)
    touches = found & (central | (limb < el.l1))
    # Central: the ratio of the apparent diameters on the axis; else the covered
    # fraction of the Sun's diameter at the limb point nearest the axis.
    z0 = np.where(central, zeta, 0.0)
    big_l1 = el.l1k2 - z0 * el.tan1
    big_l2 = el.l2 - z0 * el.tan2
    ratio = (big_l1 - big_l2) / (big_l1 + big_l2)
    partial = (el.l1 - limb) / (el.l1 + el.l2k1)
    kind = np.full(n, "partial", dtype=object)
    umbral = central | (limb < np.abs(el.l2))
    mag = np.where(umbral, np.where(central, ratio,
                                    (el.l1 - limb) / (el.l1 + el.l2k1)), partial)
    kind[umbral] = np.where(el.l2[umbral] < 0.0, "total", "annular")
    kind[umbral & ~central] = [k + " (non-central)" for k in kind[umbral & ~central]]
    # Hybrid: along the central line L2 changes sign (annular at the ends, where zeta is
    # 0 and L2 = l2 is largest; total near greatest eclipse, where zeta is largest).
    idx = np.flatnonzero(central)
    if idx.size:
        grid = np.linspace(-0.95, 0.95, 229)
        ee = np.repeat(e[idx], grid.size)
        t = np.tile(grid, idx.size)
        pe = Elements(*series.vectors(ee, t))
        z = _ellipsoid_zeta(pe).reshape(idx.size, grid.size)
        l2 = pe.l2.reshape(idx.size, grid.size)
        inside = np.isfinite(z)
        along = np.where(inside, l2 - np.where(inside, z, 0.0) * pe.tan2.reshape(z.shape), np.nan)
        ends = np.where(inside, l2, np.nan)
        top = np.fmax(np.nanmax(np.where(inside, ends, -np.inf), axis=1),
                      np.nanmax(np.where(inside, along, -np.inf), axis=1))
        low = np.nanmin(np.where(inside, along, np.inf), axis=1)
        at_g = el.l2[idx] - zeta[idx] * el.tan2[idx]
        low = np.minimum(low, at_g)
        top = np.maximum(top, at_g)
        words = np.where(top < 0.0, "total", np.where(low > 0.0, "annular", "hybrid"))
        kind[idx] = words
    return g1, g2, gamma, mag, kind, touches


# ---- what a site sees ---------------------------------------------------------------------


def _overlap_fraction(rs, rm, d):
    """Fraction of a disc of radius ``rs`` covered by one of radius ``rm`` whose centre is
    ``d`` away (the area of the lens of two circles)."""
    rs, rm, d = np.broadcast_arrays(*(np.asarray(a, float) for a in (rs, rm, d)))
    out = np.zeros(rs.shape)
    inside = d <= np.abs(rs - rm)
    out[inside] = np.minimum(1.0, (rm[inside] / rs[inside]) ** 2)
    part = ~inside & (d < rs + rm)
    r1, r2, dd = rs[part], rm[part], d[part]
    a1 = np.arccos(np.clip((dd * dd + r1 * r1 - r2 * r2) / (2.0 * dd * r1), -1.0, 1.0))
    a2 = np.arccos(np.clip((dd * dd + r2 * r2 - r1 * r1) / (2.0 * dd * r2), -1.0, 1.0))
    lens = (r1 * r1 * (a1 - np.sin(2.0 * a1) / 2.0) + r2 * r2 * (a2 - np.sin(2.0 * a2) / 2.0))
    out[part] = lens / (np.pi * r1 * r1)
    return out


class Site:
    """Rows' sites and Earth rotation for an eclipse each: ``e`` the eclipse of each row,
    the site's terrestrial vector (Earth radii), its geodetic up/east/north, and the
    sidereal angle at the eclipse's centre instant for the row's Delta T."""

    def __init__(self, series, e, latitude, longitude, height, ut_scale, shift_s, dut1=0.0):
        self.series, self.e = series, e
        # Checked as every site is (latitude, longitude and height within their ranges).
        check_site(latitude, longitude)
        lon, lat, h = np.broadcast_arrays(*horizon.site_radians(latitude, longitude, height))
        self.itrs = erfa.gd2gc(1, lon, lat, h) / (WGS84_A_KM * 1000.0)
        cl, sl, co, so = np.cos(lat), np.sin(lat), np.cos(lon), np.sin(lon)
        self.up = np.stack([cl * co, cl * so, sl], axis=-1)
        self.east = np.stack([-so, co, np.zeros_like(so)], axis=-1)
        self.north = np.stack([-sl * co, -sl * so, cl], axis=-1)
        c1, c2 = series.c1[e], series.c2[e]
        centre = Instants(c1, c2, "TT", dut1).to(ut_scale)
        self.delta_t = ((c1 - centre.jd1) + (c2 - centre.jd2)) * 86400.0 + shift_s
        self.gast0 = erfa.gst06(centre.jd1, centre.jd2 - shift_s / 86400.0, c1, c2,
                                series.rnpb[e])

    def turn(self, v, theta):
        c, s = np.cos(theta), np.sin(theta)
        return np.stack([c * v[:, 0] - s * v[:, 1], s * v[:, 0] + c * v[:, 1], v[:, 2]], axis=-1)

    def state(self, jd1, jd2, row, extra_turn=0.0):
        """Elements and the site's place on the fundamental plane at TT instants."""
        s, e = self.series, self.e[row]
        dt = (jd1 - s.c1[e]) + (jd2 - s.c2[e])
        sun, moon = s.vectors(e, dt / HALF_WINDOW)
        el = Elements(sun, moon)
        theta = self.gast0[row] + ROTATION * dt + extra_turn
        p = self.turn(self.itrs[row], theta)
        xi, eta, zeta = (np.sum(p * a, axis=-1) for a in (el.ex, el.ey, el.g))
        st = el
        st.u, st.v = el.x - xi, el.y - eta
        st.m = np.hypot(st.u, st.v)
        st.L1 = el.l1 - zeta * el.tan1
        st.L2 = el.l2 - zeta * el.tan2
        st.L2k1 = el.l2k1 - zeta * el.tan2
        to_sun = sun - p
        to_sun /= vectors.norm(to_sun)[:, None]
        up, east, north = (self.turn(a[row], theta) for a in (self.up, self.east, self.north))
        st.alt = np.degrees(np.arcsin(np.clip(np.sum(to_sun * up, axis=-1), -1.0, 1.0)))
        st.az = np.degrees(np.arctan2(np.sum(to_sun * east, axis=-1),
                                      np.sum(to_sun * north, axis=-1))) % 360.0
        return st


def _min_rate(site):
    """d/dt of m^2 at a site, whose rising zero is the local maximum."""
    return lambda jd1, jd2, row: _rate_turned(site, jd1, jd2, row, 0.0)


class Local:
    """Local circumstances per row (TT two-part instants, NaN where there is none)."""


# One site's circumstances of one eclipse, kept: a sheet's row asks for them in several
# cells (the contacts, the magnitude, what is seen), each a computation of its own.
# Keyed by the eclipse (its greatest instant, the source and what its kernels hold now)
# and every other argument; 8.7 kB each (tracemalloc over 200 sites), 9 MB when full.
_ONE_SITE = {}
ONE_SITE_KEPT = 1000


def local(tt1, tt2, latitude, longitude, height=0.0, ut_scale="UT", shift_s=0.0,
          source=BUILTIN, dut1=0.0):
    """Local circumstances at sites of the next solar eclipse after TT instants.

    ``ut_scale`` says how UT follows from TT (a UT scale with its Delta T rule);
    ``shift_s`` adds seconds to that Delta T, row by row.  The circumstances of one row
    are kept (any instant before the same eclipse finds them)."""
    tt1, tt2 = np.ravel(np.asarray(tt1, float)), np.ravel(np.asarray(tt2, float))
    found = next_eclipse(tt1, tt2, source)
    one = (tt1.size, np.size(latitude), np.size(longitude), np.size(height),
           np.size(shift_s)) == (1, 1, 1, 1, 1)
    if not one:
        return _local(found, latitude, longitude, height, ut_scale, shift_s, source, dut1)
    key = (str(source), ephemeris.content_stamp(source), found.g1.item(), found.g2.item(),
           *(float(np.ravel(a)[0]) for a in (latitude, longitude, height, shift_s)),
           ut_scale, float(dut1))
    out = _ONE_SITE.get(key)
    if out is None:
        out = _local(found, latitude, longitude, height, ut_scale, shift_s, source, dut1)
        keep(_ONE_SITE, key, out, ONE_SITE_KEPT)
    return out


def _local(found, latitude, longitude, height, ut_scale, shift_s, source, dut1):
    """``local`` of the eclipses ``found`` (one a row)."""
    n = found.of_row.size
    series, e = found.series, found.of_row
    shift = np.broadcast_to(np.asarray(shift_s, float), (n,)).copy()
    lat, lon, hgt = (np.broadcast_to(np.ravel(np.asarray(a, float)), (n,)) if np.size(a) <= n
                     else np.ravel(a) for a in (latitude, longitude, height))
    site = Site(series, e, lat, lon, hgt, ut_scale, shift, dut1)
    c = series.c1[e] + series.c2[e]
    out = Local()
    out.found, out.e, out.site, out.shift = found, e, site, shift
    out.kind = found.kind[e]
    out.delta_t = site.delta_t
    # Maximum: where the distance from the axis, m, is least.
    roots = crossings(_min_rate(site), c - 0.95 * HALF_WINDOW, c + 0.95 * HALF_WINDOW, 0.02,
                      direction=+1)
    m_at = site.state(roots.jd1, roots.jd2, roots.row).m if len(roots) else np.zeros(0)
    best = np.full(n, np.inf)
    np.minimum.at(best, roots.row, m_at)
    least = m_at <= best[roots.row]
    t1, t2, ok = roots.first(n, least)
    t1, t2 = np.where(ok, t1, series.c1[e]), np.where(ok, t2, series.c2[e])
    st = site.state(t1, t2, np.arange(n))
    out.max = (t1, t2)
    inside = ok & (st.m < st.L1)
    out.inside = inside
    out.magnitude = np.where(inside, (st.L1 - st.m) / (st.L1 + st.L2k1), 0.0)
    rs, rm = (st.L1 + st.L2k1) / 2.0, (st.L1 - st.L2k1) / 2.0
    out.obscuration = np.where(inside, _overlap_fraction(rs, rm, st.m), 0.0)
    out.central = inside & (st.m < np.abs(st.L2))
    out.total = out.central & (st.L2 < 0.0)
    out.alt, out.az = {"MAX": st.alt}, {"MAX": st.az}
    out.times = {"MAX": (np.where(inside, t1, np.nan), np.where(inside, t2, np.nan))}
    rows = np.flatnonzero(inside)
    tm = t1[rows] + t2[rows]

    def contact(f, lo, hi, direction, step, name, subset):
        r = subset
        if r.size == 0:
            out.times[name] = (np.full(n, np.nan), np.full(n, np.nan))
            out.alt[name] = out.az[name] = np.full(n, np.nan)
            return
        g = lambda j1, j2, k: f(j1, j2, r[k])  # noqa: E731
        found_c = crossings(g, lo, hi, step, direction=direction)
        a1, a2, okc = found_c.first(r.size, last=(direction < 0))
        j1, j2 = np.full(n, np.nan), np.full(n, np.nan)
        j1[r[okc]], j2[r[okc]] = a1[okc], a2[okc]
        out.times[name] = (j1, j2)
        alt, az = np.full(n, np.nan), np.full(n, np.nan)
        if np.any(okc):
            sc = site.state(a1[okc], a2[okc], r[okc])
            alt[r[okc]], az[r[okc]] = sc.alt, sc.az
        out.alt[name], out.az[name] = alt, az

    def penumbra(j1, j2, row):
        s = site.state(j1, j2, row)
        return s.m - s.L1

    def umbra(j1, j2, row):
        s = site.state(j1, j2, row)
        return s.m - np.abs(s.L2)

    cr = c[rows]
    contact(penumbra, cr - 0.999 * HALF_WINDOW, tm, -1, 0.01, "C1", rows)
    contact(penumbra, tm, cr + 0.999 * HALF_WINDOW, +1, 0.01, "C4", rows)
    crow = np.flatnonzero(out.central)
    tc = t1[crow] + t2[crow]
    contact(umbra, tc - 0.1, tc, -1, 0.004, "C2", crow)
    contact(umbra, tc, tc + 0.1, +1, 0.004, "C3", crow)
    d2, d3 = out.times["C2"], out.times["C3"]
    out.duration = np.where(out.central, ((d3[0] - d2[0]) + (d3[1] - d2[1])) * 86400.0, 0.0)
    lost = inside & ~(np.isfinite(out.times["C1"][0]) & np.isfinite(out.times["C4"][0]))
    out.lost = lost
    alts = np.stack([out.alt[k] for k in ("C1", "MAX", "C4")])
    out.sun_up = inside & (np.nanmax(np.where(np.isfinite(alts), alts, -90.0), axis=0) > 0.0)
    return out


def status_words(out):
    """Per row: None where an eclipse is seen, else why not, in words."""
    words = np.full(out.inside.shape, None, dtype=object)
    words[~out.inside] = NOT_SEEN + " (the site is outside the Moon's penumbra)"
    words[out.inside & ~out.sun_up] = NOT_SEEN + " (the Sun is below the horizon throughout)"
    return words


def delta_t_limits(tt1, tt2, latitude, longitude, height=0.0, ut_scale="UT", source=BUILTIN,
                   span_s=10800.0, dut1=0.0):
    """The Delta T (seconds) for which the central phase (total or annular) is seen at the
    site with the Sun above the horizon: (low, high, model Delta T) per row, the limits
    NaN where no Delta T within +-span_s of the model's gives it.  Of several such ranges,
    the one holding the model's Delta T or else the nearest to it."""
    tt1, tt2 = np.ravel(np.asarray(tt1, float)), np.ravel(np.asarray(tt2, float))
    n = tt1.size
    found = next_eclipse(tt1, tt2, source)
    series, e = found.series, found.of_row
    lat, lon, hgt = (np.broadcast_to(np.ravel(np.asarray(a, float)), (n,)) if np.size(a) <= n
                     else np.ravel(a) for a in (latitude, longitude, height))
    site = Site(series, e, lat, lon, hgt, ut_scale, np.zeros(n), dut1)
    c1, c2 = series.c1[e], series.c2[e]
    def central_margin(j1, j2, row):
        # j1 + j2 is the change of Delta T in days; the Earth is then turned back by it.
        delta = j1 + j2
        turn = -ROTATION * delta
        t1, t2 = c1[row], np.array(c2[row])
        # Newton steps on d(m^2)/dt, the site turned: m^2 is close to a parabola in time.
        h = 2e-4
        for _ in range(NEWTON_STEPS):
            a = _rate_turned(site, t1, t2, row, turn)
            b = _rate_turned(site, t1, t2 + h, row, turn)
            slope = np.where(b != a, (b - a) / h, 1.0)
            t2 = t2 - np.clip(a / slope, -0.1, 0.1)
            # Kept inside the series' span (a Chebyshev series diverges outside it).
            t2 = c2[row] + np.clip((t1 - c1[row]) + (t2 - c2[row]), -0.95 * HALF_WINDOW,
                                   0.95 * HALF_WINDOW) - (t1 - c1[row])
        s = site.state(t1, t2, row, turn)
        return np.maximum(s.m - np.abs(s.L2), -np.sin(np.radians(s.alt)) * 0.01)

    span = span_s / 86400.0
    grid = sample(central_margin, np.full(n, -span), np.full(n, span), DELTA_T_STEP_DAYS,
                  extrema=True)
    roots = refine(central_margin, brackets(grid), 1e-7)
    low, high = np.full(n, np.nan), np.full(n, np.nan)
    dt0 = site.delta_t
    f0 = central_margin(np.zeros(n), np.zeros(n), np.arange(n))
    days = roots.jd1 + roots.jd2
    for r in range(n):  # a handful of roots per row: pairing them is bookkeeping only
        x = np.sort(days[roots.row == r])
        starts_inside = grid.at_start[r] < 0.0
        edges = np.concatenate([[-span] if starts_inside else [], x])
        if (edges.size % 2) == 1:
            edges = np.concatenate([edges, [span]])
        if edges.size == 0:
            continue
        pairs = edges.reshape(-1, 2)
        if f0[r] < 0.0:
            k = np.flatnonzero((pairs[:, 0] <= 0.0) & (pairs[:, 1] >= 0.0))
            k = k[0] if k.size else np.argmin(np.abs(pairs).min(axis=1))
        else:
            k = np.argmin(np.abs(pairs).min(axis=1))
        low[r], high[r] = dt0[r] + pairs[k, 0] * 86400.0, dt0[r] + pairs[k, 1] * 86400.0
    return low, high, dt0


# The search over Delta T: samples 86 s apart (a path at least 40 km wide crossing the
# site's parallel; narrower ones are caught by the extrema samples), and Newton steps on
# the time of the site's maximum, m^2 being close to a parabola in time.
DELTA_T_STEP_DAYS = 0.001
NEWTON_STEPS = 4


def _rate_turned(site, t1, t2, row, turn):
    h = 4e-5
    a = site.state(t1, t2 + h, row, turn).m
    b = site.state(t1, t2 - h, row, turn).m
    return (a * a - b * b) / (2.0 * h)


# ---- cell functions ----------------------------------------------------------------------

_TT_LIKE = ("TT", "TDB", "TAI")


def _found_for(time, source):
    tt1, tt2 = time.tt()
    return next_eclipse(tt1, tt2, source)


def next_cells(time, result_scale=None, source=BUILTIN):
    """Greatest eclipse of the first solar eclipse after ``time``."""
    found = _found_for(time, source)
    e = found.of_row
    return DateTimes.of_tt(found.g1[e], found.g2[e], result_scale or time.scale)


def kind_cells(time, source=BUILTIN):
    found = _found_for(time, source)
    return found.kind[found.of_row]


def greatest_point(found, ut_scale="UT", dut1=0.0):
    """Geodetic (latitude, longitude) in degrees of the point of greatest eclipse of each
    eclipse found: where the axis meets the ellipsoid, or for an eclipse whose axis
    misses, the point of the Earth's limb nearest the axis."""
    s = found.series
    e = np.arange(s.c1.size)
    el = Elements(*s.vectors(e, s.tau(e, found.g1, found.g2)))
    zeta = _ellipsoid_zeta(el)
    central = np.isfinite(zeta)
    b2 = (1.0 - WGS84_F) ** 2
    sin_d = el.g[:, 2]
    rho1 = np.sqrt(sin_d * sin_d + b2 * (1.0 - sin_d * sin_d))
    scaled = np.hypot(el.x, el.y / rho1)
    x = np.where(central, el.x, el.x / scaled)
    y = np.where(central, el.y, el.y / scaled)
    q = x[:, None] * el.ex + y[:, None] * el.ey + np.where(central, zeta, 0.0)[:, None] * el.g
    ut = Instants(found.g1, found.g2, "TT", dut1).to(ut_scale)
    theta = erfa.gst06(ut.jd1, ut.jd2, found.g1, found.g2, s.rnpb)
    c, sn = np.cos(theta), np.sin(theta)
    itrs = np.stack([c * q[:, 0] + sn * q[:, 1], -sn * q[:, 0] + c * q[:, 1], q[:, 2]], axis=-1)
    lon, lat, _ = erfa.gc2gd(1, itrs * WGS84_A_KM * 1000.0)
    return np.degrees(lat), np.degrees(lon)


def global_cells(time, quantity="GAMMA", source=BUILTIN):
    found = _found_for(time, source)
    e = found.of_row
    if quantity in ("LAT", "LON"):
        lat, lon = greatest_point(found, universal_of(time.scale), time.dut1)
        return (lat if quantity == "LAT" else lon)[e]
    return (found.gamma if quantity == "GAMMA" else found.magnitude)[e]


def _shift_seconds(time, nsigma, found):
    """Seconds added to Delta T in each row: ``nsigma`` times the published sigma at the
    eclipse's date (deltat.uncertainty); rows that ask for it where none is published
    say so."""
    n = np.size(time.jd1)
    ns = np.broadcast_to(np.ravel(np.asarray(nsigma, float)), (n,)).copy()
    shift = np.zeros(n)
    asked = ns != 0.0
    if np.any(asked):
        e = found.of_row
        years = julian_year(found.g1[e], found.g2[e])
        bad = asked & ~((years >= -1000.0) & (years < 1201.0)
                        | np.any([np.abs(years - y) < 0.5 for y in (1700, 1800, 1900)], axis=0))
        if np.any(bad):
            raise rows_failing(bad, "no published uncertainty of Delta T for this eclipse's date "
                                    "(the estimates used cover 1000 BC to AD 1200, and 1700, "
                                    "1800, 1900); give nsigma 0 or a Delta T in the scale")
        shift[asked] = ns[asked] * deltat.uncertainty(years[asked])
    return shift


def _local_for(time, latitude, longitude, height, nsigma, source):
    found = _found_for(time, source)
    shift = _shift_seconds(time, nsigma, found)
    tt1, tt2 = time.tt()
    return local(tt1, tt2, latitude, longitude, height, universal_of(time.scale), shift, source,
                 time.dut1)


def _check_lost(out):
    if np.any(out.lost):
        raise rows_failing(out.lost, "the contacts of this eclipse fall outside the hours "
                                     "searched around the new Moon")


def contact_cells(time, latitude, longitude, contact="MAX", result_scale=None, height=0.0,
                  nsigma=0.0, source=BUILTIN):
    """The instant of a contact at a site (words where there is none)."""
    out = _local_for(time, latitude, longitude, height, nsigma, source)
    _check_lost(out)
    j1, j2 = out.times[contact]
    words = status_words(out)
    if contact in ("C2", "C3"):
        words[out.inside & out.sun_up & ~out.central] = (
            "no total or annular phase here (a partial eclipse)")
    missing = np.not_equal(words, None) | ~np.isfinite(j1)
    j1 = np.where(missing, out.found.g1[out.e], j1)
    j2 = np.where(missing, out.found.g2[out.e], j2)
    scale = result_scale or time.scale
    if not (scale in _TT_LIKE):
        j2 = j2 - out.shift / 86400.0  # shown on UT with the shifted Delta T
    return DateTimes.of_tt(j1, j2, scale, words=words if np.any(missing) else None)


def local_cells(time, latitude, longitude, quantity="MAGNITUDE", contact="MAX", height=0.0,
                nsigma=0.0, source=BUILTIN):
    out = _local_for(time, latitude, longitude, height, nsigma, source)
    _check_lost(out)
    words = status_words(out)
    if quantity in ("ALT", "AZ"):
        words[out.inside & ~out.sun_up] = None  # the altitude says why it is not seen
    bad = np.not_equal(words, None)
    if np.any(bad):
        raise RowErrors(words)
    if quantity == "MAGNITUDE":
        return out.magnitude
    if quantity == "OBSCURATION":
        return out.obscuration
    if quantity == "DURATION":
        return out.duration
    values = (out.alt if quantity == "ALT" else out.az)[contact]
    none = ~np.isfinite(values)
    if np.any(none):
        raise rows_failing(none, f"no contact {contact} here (a partial eclipse has no C2 or C3)")
    return values


def seen_cells(time, latitude, longitude, height=0.0, nsigma=0.0, source=BUILTIN):
    """What the site sees, in words."""
    out = _local_for(time, latitude, longitude, height, nsigma, source)
    _check_lost(out)
    words = status_words(out)
    text = np.empty(words.shape, dtype=object)
    for i in range(words.size):  # the rows' words: formatting only
        if words[i] is not None:
            text[i] = words[i]
            continue
        if out.central[i]:
            what = ("total" if out.total[i] else "annular") + \
                   f" eclipse seen, {out.duration[i]:.0f} s of " + \
                   ("totality" if out.total[i] else "annularity")
        else:
            what = f"partial eclipse seen, magnitude {out.magnitude[i]:.3f}"
        notes = []
        if out.alt["C1"][i] < 0.0:
            notes.append("begins before sunrise")
        if out.alt["MAX"][i] < 0.0:
            notes.append("maximum below the horizon")
        if out.alt["C4"][i] < 0.0:
            notes.append("ends after sunset")
        sun = f"the Sun {out.alt['MAX'][i]:.0f} degrees high at maximum"
        text[i] = what + "; " + ("; ".join(notes) if notes else sun)
    return text


def delta_t_cells(time, latitude, longitude, quantity="LOW", height=0.0, source=BUILTIN):
    tt1, tt2 = time.tt()
    found = _found_for(time, source)
    if quantity == "SIGMA":
        e = found.of_row
        return deltat.uncertainty(julian_year(found.g1[e], found.g2[e]))
    if quantity == "MODEL":
        site = Site(found.series, found.of_row, latitude, longitude, height,
                    universal_of(time.scale), 0.0, time.dut1)
        return site.delta_t
    low, high, model = delta_t_limits(tt1, tt2, latitude, longitude, height,
                                      universal_of(time.scale), source, dut1=time.dut1)
    if quantity == "MODEL":
        return model
    # To the millisecond: the search settles the limits to about 9 ms (1e-7 day), and
    # the last digits would otherwise follow which lunations a call happened to compute
    # together (rounding of 1e-16 in the shared ephemeris calls).
    values = np.round(low if quantity == "LOW" else high, 3)
    none = ~np.isfinite(values)
    if np.any(none):
        raise rows_failing(none, "no Delta T within 3 hours of the model's brings the total or "
                                 "annular phase to this site with the Sun up")
    return values
