"""The young Moon's first visibility on an evening at a site: the crescent's geometry at
the best time and the criteria of Yallop (1997) and Odeh (2006).

The evening of a local date, per row, in vectorised passes:
  sunset    the Sun's upper limb at -34' (standard refraction), topocentric, the
            search of SKY.BODY.SET (risings.py, one sampling of the local date)
  moonset   the Moon's upper limb at -34' (semi-diameter from the site), the setting
            nearest the sunset within 14.4 hours either side, the same search
  lag       moonset minus sunset (negative when the Moon sets first)
  best time sunset + 4/9 of the lag (Yallop 1997; Odeh 2006 takes the same); when the
            Moon sets first the quantities are those at sunset
  age       the best time minus the nearest new Moon (negative before it), the phase
            search of SKY.MOON.PHASE.NEXT
At the best time the Sun's and the Moon's apparent places (topocentric.py: parallax,
light time, deflection, aberration from the site; no refraction):
  ARCL      arc of light, the Sun-Moon elongation
  ARCV      arc of vision, the Moon's airless altitude minus the Sun's (centres)
  DAZ       relative azimuth, the Sun's azimuth minus the Moon's (within +-180)
  W         the crescent's width in arcminutes, SD (1 - cos ARCL), SD the Moon's
            semi-diameter seen from the site and ARCL topocentric (Yallop's W')
Each of ARCL, ARCV and DAZ comes TOPOCENTRIC (from the site) or GEOCENTRIC (the
directions from the Earth's centre, their altitudes measured at the site's horizon).

The criteria (from memory of the papers; their coefficients and limits):
  Yallop (1997), NAO Technical Note 69: q = (ARCV - (11.8371 - 6.3226 W' + 0.7319 W'^2
      - 0.1018 W'^3)) / 10, with ARCV geocentric and W' topocentric; classes
      A q > +0.216 easily visible to the naked eye, B > -0.014 visible in perfect
      conditions, C > -0.160 may need optical aid to find the crescent, D > -0.232 will
      need optical aid, E > -0.293 not visible with a telescope, F below the Danjon limit.
  Odeh (2006), Experimental Astronomy 18: V = ARCV - (-0.1018 W^3 + 0.7319 W^2
      - 6.3226 W + 7.1651), ARCV and W topocentric; zones A V >= 5.65 visible to the
      naked eye, B >= 2.00 visible with optical aid and possibly to the naked eye,
      C >= -0.96 visible with optical aid only, D not visible even with optical aid.
The two polynomials differ by their constant only (11.8371 - 7.1651 = 4.6720): the same
fitted curve (Yallop's fit to Bruin's visibility curves), which the tests check.
"""

import numpy as np

from . import bodies, events, topocentric
from .bounded import keep
from .errors import RowErrors, SkyError, aligned_rows
from .moon import elongation_lon, rough_elongation
from .risings import STANDARD_REFRACTION_DEG, Site, Target, TargetOverDays, day_search
from .sun import check_site, local_times, row_values
from .timescales import Instants
from .topocentric import MOON_RADIUS_KM
from .vocabulary import AU_KM, BUILTIN

QUANTITIES = ("AGE", "LAG", "ARCL", "ARCV", "DAZ", "WIDTH", "ALTITUDE")
FRAMES = ("TOPOCENTRIC", "GEOCENTRIC")
EVENTS = ("BEST", "SUNSET", "MOONSET", "NEW")
CRITERIA = ("YALLOP", "ODEH")
FORMS = ("LETTER", "WORDS")
BEST_FRACTION = 4.0 / 9.0  # Yallop's best time: sunset + 4/9 of the lag
MOONSET_REACH = 0.6  # days either side of sunset searched for the moonset (the Moon sets
# every 24.8 hours: a window of 28.8 always holds one where it sets at all)

# Yallop (1997), from memory: the cubic in W' (arcmin) that ARCV is measured against,
# constant first, and the lower limits of q for classes A to E (F below the last).
YALLOP_CUBIC = (11.8371, -6.3226, 0.7319, -0.1018)
YALLOP_LIMITS = (0.216, -0.014, -0.160, -0.232, -0.293)
YALLOP_WORDS = {
    "A": "easily visible to the naked eye",
    "B": "visible to the naked eye in perfect conditions",
    "C": "may need optical aid to find the crescent, then seen by eye",
    "D": "will need optical aid to find the crescent",
    "E": "not visible with a telescope",
    "F": "not visible: below the Danjon limit",
}
# Odeh (2006), from memory: the same cubic with constant 7.1651, and the lower limits
# of V for zones A to C (D below the last).
ODEH_CUBIC = (7.1651, -6.3226, 0.7319, -0.1018)
ODEH_LIMITS = (5.65, 2.00, -0.96)
ODEH_WORDS = {
    "A": "visible to the naked eye",
    "B": "visible with optical aid, could be seen by the naked eye",
    "C": "visible with optical aid only",
    "D": "not visible even with optical aid",
}


def cubic(coefficients, w):
    c0, c1, c2, c3 = coefficients
    return c0 + w * (c1 + w * (c2 + w * c3))


def yallop_q(arcv_geocentric, width_topocentric):
    return (np.asarray(arcv_geocentric) - cubic(YALLOP_CUBIC, width_topocentric)) / 10.0


def odeh_v(arcv_topocentric, width_topocentric):
    return np.asarray(arcv_topocentric) - cubic(ODEH_CUBIC, width_topocentric)


def classify(value, limits):
    """Class letters A, B ... for values against descending lower limits: A above the
    first, a value on a limit in the class below (as Yallop's classes have it)."""
    value = np.asarray(value, dtype=float)
    below = np.zeros(value.shape, dtype=int)
    for limit in limits:
        below += value <= limit
    return np.array([chr(ord("A") + k) for k in below.ravel()], dtype=object)


def yallop_class(q):
    """Yallop's classes: A for q > +0.216 ... F for q <= -0.293."""
    return classify(q, YALLOP_LIMITS)


def odeh_zone(v):
    """Odeh's zones: A for V >= 5.65 ... D for V < -0.96 (the limit itself is in the
    better zone, so the comparison is the other way round from Yallop's)."""
    v = np.asarray(v, dtype=float)
    below = np.zeros(v.shape, dtype=int)
    for limit in ODEH_LIMITS:
        below += v < limit
    return np.array([chr(ord("A") + k) for k in below.ravel()], dtype=object)


# ---- the evening ------------------------------------------------------------------------


class Evening:
    """Per row: sunset, moonset and best time (two-part TT JDs), and the quantities at
    the best time.  Rows that cannot be computed hold NaN and their ``messages``."""

    def __init__(self, date, latitude, longitude, utc_offset, height, source):
        check_site(latitude, longitude)
        refraction = -STANDARD_REFRACTION_DEG
        start, _, downs, _ = day_search(Target("SUN"), date, latitude, longitude, utc_offset,
                                        height, refraction, "UPPER", source)
        n = start.size
        self.n, self.start = n, start
        self.messages = np.full(n, None, dtype=object)
        s1, s2, has_sunset = downs.first(n)
        self.messages[~has_sunset] = ("no sunset at this site on this local date (the Sun "
                                      "stays up or stays down)")
        # Rows without a sunset go on with noon as a stand-in; their answers are dropped.
        s1 = np.where(has_sunset, s1, np.floor(start) + 0.5)
        s2 = np.where(has_sunset, s2, start - s1 + 0.5)
        self.sunset = (s1, s2)
        self.moonset, found = self._moonset(s1, s2, latitude, longitude, height, source,
                                            date.dut1)
        lost = has_sunset & ~found
        self.messages[lost] = ("no moonset within 14 hours of sunset at this latitude (the "
                               "Moon stays up or stays down)")
        m1, m2 = self.moonset
        self.lag_days = np.where(found, (m1 - s1) + (m2 - s2), 0.0)
        best2 = s2 + BEST_FRACTION * np.maximum(self.lag_days, 0.0)
        self.best = (s1, best2)
        self.dut1 = date.dut1
        self._geometry(latitude, longitude, height, source)
        self._age(source)

    def _moonset(self, s1, s2, latitude, longitude, height, source, dut1):
        n = s1.size
        begin = (s1 + s2) - MOONSET_REACH
        site = Site(latitude, longitude, height, n)
        over = TargetOverDays(begin, Target("MOON").node_vectors(source, n), dut1)
        radius_au = MOON_RADIUS_KM / AU_KM
        h0 = -STANDARD_REFRACTION_DEG

        def above(jd1, jd2, row):
            v, era = over.at(jd1, jd2, row)
            alt, _, r = site.seen(v, era, row)
            return alt - (h0 - np.degrees(np.arcsin(radius_au / r)))

        roots = events.crossings(above, begin, begin + 2.0 * MOONSET_REACH, 1.0 / 24.0,
                                 direction=-1)
        # The setting nearest the sunset.
        gap = np.abs((roots.jd1 - s1[roots.row]) + (roots.jd2 - s2[roots.row]))
        order = np.lexsort((gap, roots.row))
        return _first_per_row(roots, order, n)

    def _geometry(self, latitude, longitude, height, source):
        b1, b2 = self.best
        at = Instants(b1, b2, "TT", self.dut1)
        lat, lon, h = (row_values(v, self.n) for v in (latitude, longitude, height))
        sun = topocentric.place("SUN", at, lat, lon, h, "APPARENT", source)
        moon = topocentric.place("MOON", at, lat, lon, h, "APPARENT", source)
        out = {}
        for frame, (s, m) in {"TOPOCENTRIC": (sun, moon),
                              "GEOCENTRIC": self._geocentric(sun, moon, b1, b2, source)}.items():
            s_az, s_z = topocentric.observed(s)
            m_az, m_z = topocentric.observed(m)
            cos_arcl = np.clip(np.sum(s.direction * m.direction, axis=-1), -1.0, 1.0)
            out[frame] = {
                "ARCL": np.degrees(np.arccos(cos_arcl)),
                "ARCV": np.degrees(s_z - m_z),
                "DAZ": events.wrap180(np.degrees(s_az - m_az)),
                "ALTITUDE": 90.0 - np.degrees(m_z),
            }
        semidiameter = topocentric.semidiameter_degrees("MOON", moon.distance) * 60.0
        width = semidiameter * (1.0 - np.cos(np.radians(out["TOPOCENTRIC"]["ARCL"])))
        for frame in FRAMES:
            out[frame]["WIDTH"] = width
        self.values = out

    @staticmethod
    def _geocentric(sun, moon, b1, b2, source):
        """The directions from the Earth's centre, with the site's astrometry so that
        their altitudes are measured at the site's horizon."""
        p = bodies.place_at_tt("MOON", b1, b2, "APPARENT", source)
        # The apparent Sun from the same states of the Earth and the Sun (its distance is
        # not used: only directions make altitudes and azimuths).
        return (topocentric.TopoPlace(p.sun_direction, sun.distance, sun.astrom, sun.pressure),
                topocentric.TopoPlace(p.direction, p.distance, moon.astrom, moon.pressure))

    def _age(self, source):
        b1, b2 = self.best
        jd = b1 + b2
        low, high = np.nanmin(jd) - 16.0, np.nanmax(jd) + 16.0
        if (high - low) / 29.5 < min(self.n, 100):
            # Evenings close together (a column of days): one search over the span they
            # share finds every new Moon once, instead of once per row.
            found = _new_moons(np.array([low]), np.array([high]), source)
            row = np.repeat(np.arange(self.n), len(found))
            roots = events.Roots(np.tile(found.jd1, self.n), np.tile(found.jd2, self.n), row)
        else:
            roots = _new_moons(jd - 16.0, jd + 16.0, source)
        gap = np.abs((roots.jd1 - b1[roots.row]) + (roots.jd2 - b2[roots.row]))
        order = np.lexsort((gap, roots.row))
        (n1, n2), found = _first_per_row(roots, order, self.n)
        self.new_moon = (n1, n2)
        self.age_days = np.where(found, (b1 - n1) + (b2 - n2), np.nan)

    def quantity(self, what, frame="TOPOCENTRIC"):
        if what == "AGE":
            return self.age_days * 24.0
        if what == "LAG":
            return self.lag_days * 1440.0
        return self.values[frame][what]

    def raise_messages(self):
        bad = np.not_equal(self.messages, None)
        if np.any(bad):
            raise RowErrors(self.messages.copy())


def _new_moons(start, end, source):
    """``events.Roots`` of the new Moons in each row's window: the apparent elongation in
    longitude crossing 0 upwards, sampled daily where the rough elongation says (as
    SKY.MOON.PHASE.NEXT searches)."""
    def f(jd1, jd2, row):
        return events.wrap180(elongation_lon(jd1, jd2, source))

    def rough(jd1, jd2, row):
        return events.wrap180(rough_elongation(jd1, jd2))

    return events.crossings(f, start, end, 1.0, direction=+1, jump=90.0, estimate=rough)


def _first_per_row(roots, order, n):
    """((jd1, jd2), found) of each row's first root in ``order`` (NaN where none)."""
    rows, at = np.unique(roots.row[order], return_index=True)
    jd1, jd2 = np.full(n, np.nan), np.full(n, np.nan)
    found = np.zeros(n, dtype=bool)
    pick = order[at]
    jd1[rows], jd2[rows], found[rows] = roots.jd1[pick], roots.jd2[pick], True
    return (jd1, jd2), found


# Evenings kept across calls: a sheet asks for one quantity per cell, a dozen cells of an
# evening, and each would search the evening again.  Keyed by everything that moves the
# evening (the TT of its local 0h, the site, DUT1, the source and what its files hold);
# bounded, the oldest dropped.
EVENING_CACHE_SIZE = 20_000
_EVENING_CACHE = {}
_LAYOUT = ("sunset", "moonset", "best", "new_moon")


class _Kept:
    """Rows of evenings put together from the kept ones: what ``Evening`` offers."""

    quantity = Evening.quantity
    raise_messages = Evening.raise_messages

    def __init__(self, n, start, records, messages):
        self.n, self.start, self.messages = n, start, messages
        table = np.array(records, dtype=float).reshape(n, -1)
        for k, name in enumerate(_LAYOUT):
            setattr(self, name, (table[:, 2 * k], table[:, 2 * k + 1]))
        self.lag_days, self.age_days = table[:, 8], table[:, 9]
        self.values = {frame: {what: table[:, 10 + 5 * f + j] for j, what in
                               enumerate(("ARCL", "ARCV", "DAZ", "ALTITUDE", "WIDTH"))}
                       for f, frame in enumerate(FRAMES)}


def _record(e, k):
    parts = [v[k] for name in _LAYOUT for v in getattr(e, name)]
    parts += [e.lag_days[k], e.age_days[k]]
    parts += [e.values[frame][what][k] for frame in FRAMES
              for what in ("ARCL", "ARCV", "DAZ", "ALTITUDE", "WIDTH")]
    return np.array(parts, dtype=float)


def _evening(date, latitude, longitude, utc_offset, height, source):
    from .ephemeris import content_stamp
    from .sun import local_day_start

    if not -14.0 <= float(utc_offset) <= 14.0:
        raise SkyError(f"the UTC offset must be within -14 to +14 hours, not {utc_offset:g}")
    check_site(latitude, longitude)
    start = local_day_start(date, utc_offset)
    n = start.size
    lat, lon, h = (row_values(v, n) for v in (latitude, longitude, height))
    stamp = (str(source), content_stamp(source), float(date.dut1))
    keys = [(t, a, b, c) + stamp for t, a, b, c in
            zip(start.tolist(), lat.tolist(), lon.tolist(), h.tolist())]
    missing = [k for k, key in enumerate(keys) if key not in _EVENING_CACHE]
    if missing:
        idx = np.array(missing)
        sub = Instants(np.broadcast_to(date.jd1, (n,))[idx],
                       np.broadcast_to(date.jd2, (n,))[idx], date.scale, date.dut1)
        e = aligned_rows(lambda: Evening(sub, lat[idx], lon[idx], utc_offset, h[idx], source),
                         idx, n)
        for j, k in enumerate(missing):
            keep(_EVENING_CACHE, keys[k], (_record(e, j), e.messages[j]), EVENING_CACHE_SIZE)
    kept = [_EVENING_CACHE[key] for key in keys]
    messages = np.array([m for _, m in kept], dtype=object)
    return _Kept(n, start, [r for r, _ in kept], messages)


# ---- cell functions ------------------------------------------------------------------


def crescent_cells(date, latitude, longitude, quantity, utc_offset=0.0, height=0.0,
                   frame="TOPOCENTRIC", source=BUILTIN):
    e = _evening(date, latitude, longitude, utc_offset, height, source)
    e.raise_messages()
    return e.quantity(quantity, frame)


def crescent_time_cells(date, latitude, longitude, event, utc_offset=0.0, height=0.0,
                        source=BUILTIN):
    e = _evening(date, latitude, longitude, utc_offset, height, source)
    e.raise_messages()
    jd1, jd2 = {"BEST": e.best, "SUNSET": e.sunset, "MOONSET": e.moonset,
                "NEW": e.new_moon}[event]
    return local_times(jd1, jd2, np.ones(e.n, dtype=bool), e.start, date, utc_offset, None)


def _criterion_value(e, criterion):
    width = e.values["TOPOCENTRIC"]["WIDTH"]
    if criterion == "YALLOP":
        return yallop_q(e.values["GEOCENTRIC"]["ARCV"], width)
    return odeh_v(e.values["TOPOCENTRIC"]["ARCV"], width)


def criterion_cells(date, latitude, longitude, criterion, utc_offset=0.0,
                    height=0.0, source=BUILTIN):
    e = _evening(date, latitude, longitude, utc_offset, height, source)
    e.raise_messages()
    return _criterion_value(e, criterion)


def class_cells(date, latitude, longitude, criterion, utc_offset=0.0, height=0.0,
                form="LETTER", source=BUILTIN):
    e = _evening(date, latitude, longitude, utc_offset, height, source)
    e.raise_messages()
    value = _criterion_value(e, criterion)
    if criterion == "YALLOP":
        letters, words = yallop_class(value), YALLOP_WORDS
    else:
        letters, words = odeh_zone(value), ODEH_WORDS
    if form == "WORDS":
        return np.array([f"{k}: {words[k]}" for k in letters], dtype=object)
    return letters
