"""Observing windows: when a target is high enough while the sky is dark, and the
Moon-free dark time of a night.

The night of a local date runs from local noon of that date to local noon of the next.
Three states are searched over it with the one event search (events.py), each from the
topocentric altitude of risings.py:
  dark      the Sun's centre below the chosen twilight altitude (geometric, as
            SKY.SUN.RISE's twilights: -6, -12 or -18 degrees)
  high      the target's altitude, with the refraction of Saemundsson (1986:
            R = 1.02' cot(h + 10.3 / (h + 5.11)), h in degrees, common practice) added,
            above the limit (an air mass limit is turned into the altitude where
            Kasten and Young's (1989) air mass reaches it)
  Moon down the Moon's upper limb below the horizon (34' of refraction, its
            semi-diameter from the site), as SKY.BODY.SET has it
The window is the longest stretch of the night that is dark with the target high; its
hours are the total of all such stretches.  The best moment is the target's highest in
that stretch (the upper transit when it falls inside, else the higher end).  The
Moon-free dark time is the longest stretch dark with the Moon down, its hours the total.
What the Sun and the Moon do over a night at a site is kept across calls (bounded), so
a sheet of many targets on the same nights searches each night once.
"""

import erfa
import numpy as np

from . import events, horizon, topocentric, vectors
from .bounded import keep
from .errors import RowErrors, aligned_rows, rows_failing
from .events import wrap180
from .risings import (STANDARD_REFRACTION_DEG, Site, Target, TargetOverDays, star_target)
from .sun import EVENT_ALTITUDES, check_site, local_day_start, row_values
from .timescales import DateTimes, Instants
from .topocentric import MOON_RADIUS_KM
from .vocabulary import AU_KM, BUILTIN

TWILIGHTS = ("ASTRONOMICAL", "NAUTICAL", "CIVIL")
LIMIT_KINDS = ("ALTITUDE", "AIRMASS")
STEP_DAYS = 1.0 / 24.0
NIGHT_CACHE_SIZE = 20_000
_NIGHT_CACHE = {}


def _saemundsson_arcmin(h):
    h = np.maximum(h, -1.0)  # the formula is for the sky above the horizon
    return 1.02 / np.tan(np.radians(h + 10.3 / (h + 5.11)))


def altitude_for_airmass(airmass):
    """The altitude (degrees) where Kasten and Young's air mass equals ``airmass``."""
    x = np.asarray(airmass, dtype=float)
    bad = (x < 1.0) | (x > 38.0)
    if np.any(bad):
        raise rows_failing(bad, "the air mass limit must be 1 to 38 (1 at the zenith)")
    lo, hi = np.zeros(x.shape), np.full(x.shape, 90.0)
    for _ in range(50):  # the air mass falls as the altitude grows: bisection
        mid = 0.5 * (lo + hi)
        above = horizon.airmass_cells(mid) > x
        lo, hi = np.where(above, mid, lo), np.where(above, hi, mid)
    return 0.5 * (lo + hi)


def _limit_altitude(limit, limit_kind, n):
    limit = row_values(limit, n)
    if limit_kind == "AIRMASS":
        return altitude_for_airmass(limit)
    bad = (limit < -5.0) | (limit > 89.0)
    if np.any(bad):
        raise rows_failing(bad, "the altitude limit must be -5 to 89 degrees")
    return limit


def _intervals(start_offset, ups, downs, up_at_start, n, length=1.0):
    """Per row: the stretches [a, b] (days from the row's window start) where the state
    holds, from its rising and falling crossings."""
    out = [[] for _ in range(n)]
    marks = [[] for _ in range(n)]
    for roots, kind in ((ups, True), (downs, False)):
        t = (roots.jd1 - start_offset[roots.row]) + roots.jd2
        for r, x in zip(roots.row.tolist(), t.tolist()):
            marks[r].append((x, kind))
    for k in range(n):
        state, since = bool(up_at_start[k]), 0.0
        for x, up in sorted(marks[k]):
            if up and not state:
                state, since = True, x
            elif not up and state:
                out[k].append((since, x))
                state = False
        if state:
            out[k].append((since, length))
    return out


def _intersect(a, b):
    out = []
    i = j = 0
    while i < len(a) and j < len(b):
        lo, hi = max(a[i][0], b[j][0]), min(a[i][1], b[j][1])
        if hi > lo:
            out.append((lo, hi))
        if a[i][1] < b[j][1]:
            i += 1
        else:
            j += 1
    return out


def _state_search(over, site, threshold, start, n, extra=None):
    """Rising and falling crossings over the rows' nights of altitude - threshold."""
    def f(jd1, jd2, row):
        v, era = over.at(jd1, jd2, row)
        alt, _, r = site.seen(v, era, row)
        return alt - threshold[row] + (0.0 if extra is None else extra(alt, r))

    return events.rising_and_falling(f, start, start + 1.0, STEP_DAYS, extrema=True)


def _nights(time, latitude, longitude, utc_offset, height, twilight, source):
    """Per row: (start TT of the night, dark stretches, Moon-free dark stretches)."""
    check_site(latitude, longitude)
    start = local_day_start(time, utc_offset) + 0.5  # local noon
    n = start.size
    lat, lon, h = (row_values(v, n) for v in (latitude, longitude, height))
    keys = [(s, a, b, c, twilight, str(source), time.dut1)
            for s, a, b, c in zip(start.tolist(), lat.tolist(), lon.tolist(), h.tolist())]
    missing = sorted({k for k, key in enumerate(keys) if key not in _NIGHT_CACHE})
    if missing:
        idx = np.array(missing)

        def compute():
            m = idx.size
            st = start[idx]
            site = Site(lat[idx], lon[idx], h[idx], m)
            sun = TargetOverDays(st, Target("SUN").node_vectors(source, m), time.dut1)
            ups, downs, above = _state_search(sun, site, np.full(m, EVENT_ALTITUDES[twilight]),
                                              st, m)
            # Dark is the Sun below the twilight: the falling crossing starts it.
            dark = _intervals(st, downs, ups, above <= 0, m)
            moon = TargetOverDays(st, Target("MOON").node_vectors(source, m), time.dut1)
            radius_au = MOON_RADIUS_KM / AU_KM
            ups, downs, above = _state_search(
                moon, site, np.full(m, -STANDARD_REFRACTION_DEG), st, m,
                extra=lambda alt, r: np.degrees(np.arcsin(radius_au / r)))
            moon_down = _intervals(st, downs, ups, above <= 0, m)
            for j, k in enumerate(missing):
                keep(_NIGHT_CACHE, keys[k], (dark[j], _intersect(dark[j], moon_down[j])),
                     NIGHT_CACHE_SIZE)

        aligned_rows(compute, idx, n)

    nights = [_NIGHT_CACHE[key] for key in keys]
    return start, [d for d, _ in nights], [f for _, f in nights]


def _longest(stretches):
    return max(stretches, key=lambda s: s[1] - s[0]) if stretches else None


def _hours(stretches):
    return 24.0 * sum(b - a for a, b in stretches)


WINDOW_CACHE_SIZE = 50_000
_WINDOW_CACHE = {}


def _search_windows(start, dark, over_rows, site, limit_alt, n):
    """Per row: (stretches dark with the target high, best offset or None), from the
    target's altitude and hour angle searched over the rows' nights."""
    ups, downs, above = _state_search(over_rows, site, limit_alt, start, n,
                                      extra=lambda alt, r: _saemundsson_arcmin(alt) / 60.0)
    high = _intervals(start, ups, downs, above > 0, n)
    stretches = [_intersect(d, h) for d, h in zip(dark, high)]

    def hour_angle(jd1, jd2, row):
        v, era = over_rows.at(jd1, jd2, row)
        return wrap180(site.seen(v, era, row)[1])

    transits = events.crossings(hour_angle, start, start + 1.0, STEP_DAYS, direction=+1,
                                jump=180.0)
    t_transit = (transits.jd1 - start[transits.row]) + transits.jd2
    out = []
    for k, s in enumerate(stretches):
        longest = _longest(s)
        if longest is None:
            out.append((s, None))
            continue
        inside = t_transit[(transits.row == k) & (t_transit >= longest[0])
                           & (t_transit <= longest[1])]
        if inside.size:  # the upper transit is the highest point
            out.append((s, float(inside[0])))
            continue
        ends = np.array(longest)
        rows = np.array([k, k])
        v, era = over_rows.at(start[rows], ends, rows)
        alt = site.seen(v, era, rows)[0]
        out.append((s, float(ends[int(np.argmax(alt))])))
    return out


class Window:
    """The observing windows of targets (rows) on their nights at their sites: per row
    its dark-and-high ``stretches`` and its ``best`` offset (days from the night's start,
    None without a window).  Rows already searched with the same arguments are taken
    from a bounded cache, so the start, end, hours and best moment of one target and
    night are searched once."""

    def __init__(self, ra, dec, date, latitude, longitude, utc_offset, limit, limit_kind,
                 twilight, height, pm_ra, pm_dec, epoch, source=BUILTIN):
        star_target(ra, dec, pm_ra, pm_dec, epoch)  # checks the target's values
        self.start, dark, _ = _nights(date, latitude, longitude, utc_offset, height,
                                      twilight, source)
        n = self.start.size
        self.n, self.date, self.utc_offset = n, date, utc_offset
        limit_alt = _limit_altitude(limit, limit_kind, n)
        cols = [row_values(v, n) for v in (ra, dec, pm_ra, pm_dec, epoch, latitude,
                                             longitude, height)]
        self.ra, self.dec = cols[0], cols[1]
        keys = [tuple(row) + (s, a, twilight, str(source), date.dut1) for row, s, a in
                zip(zip(*(c.tolist() for c in cols)), self.start.tolist(), limit_alt.tolist())]
        missing = [k for k, key in enumerate(keys) if key not in _WINDOW_CACHE]
        found = {}
        if missing:
            idx = np.array(missing)
            m = idx.size
            site = Site(cols[5][idx], cols[6][idx], cols[7][idx], m)
            target = star_target(*(c[idx] for c in cols[:5]))
            over = TargetOverDays(self.start[idx], target.node_vectors(source, m), date.dut1)
            results = _search_windows(self.start[idx], [dark[k] for k in missing], over, site,
                                      limit_alt[idx], m)
            for k, result in zip(missing, results):
                found[keys[k]] = result
                keep(_WINDOW_CACHE, keys[k], result, WINDOW_CACHE_SIZE)
        rows = [found.get(key) or _WINDOW_CACHE[key] for key in keys]
        self.stretches = [r[0] for r in rows]
        self.longest = [_longest(r[0]) for r in rows]
        self.best = [r[1] for r in rows]

    def hours(self):
        return np.array([_hours(s) for s in self.stretches])

    def _times(self, offsets, what):
        found = np.array([o is not None for o in offsets])
        jd2 = np.array([o if o is not None else 0.0 for o in offsets])
        words = None
        if not np.all(found):
            words = np.where(found, None, f"no {what}: the target is not above the limit "
                                          "while the sky is dark this night").astype(object)
        return DateTimes.of_tt(self.start.copy(), jd2, self.date.scale, self.utc_offset / 24.0,
                               words)

    def start_times(self):
        return self._times([s[0] if s else None for s in self.longest], "window")

    def end_times(self):
        return self._times([s[1] if s else None for s in self.longest], "window")

    def best_offsets(self):
        return self.best

    def best_times(self):
        return self._times(self.best, "best moment")


def _window(ra, dec, date, latitude, longitude, utc_offset, limit, limit_kind, twilight,
            height, pm_ra, pm_dec, epoch, source=BUILTIN):
    return Window(ra, dec, date, latitude, longitude, utc_offset, limit, limit_kind, twilight,
                  height, pm_ra, pm_dec, epoch, source)


# ---- cell functions ------------------------------------------------------------------


def _window_cells(result):
    """A cell function of the observing window: ``result`` reads it off a ``Window``."""
    def cells(ra, dec, date, latitude, longitude, utc_offset=0.0, limit=30.0,
              limit_kind="ALTITUDE", twilight="ASTRONOMICAL", height=0.0, pm_ra=0.0,
              pm_dec=0.0, epoch=2000.0):
        return result(_window(ra, dec, date, latitude, longitude, utc_offset, limit,
                              limit_kind, twilight, height, pm_ra, pm_dec, epoch))
    return cells


window_start_cells = _window_cells(Window.start_times)
window_end_cells = _window_cells(Window.end_times)
window_hours_cells = _window_cells(Window.hours)
window_best_cells = _window_cells(Window.best_times)


MOON_QUANTITIES = ("SEPARATION", "ALTITUDE", "ILLUMINATED")


def moon_at(quantity, ra, dec, tt1, tt2, latitude, longitude, height, dut1=0.0,
            source=BUILTIN):
    """The Moon seen from the sites at TT instants: its topocentric separation from the
    targets (degrees, astrometric Moon against the catalogue direction, both on the
    ICRS axes), its unrefracted altitude (degrees) or its illuminated fraction."""
    time = Instants(tt1, tt2, "TT", dut1)
    if quantity == "ILLUMINATED":
        from .moon import illuminated_cells
        return illuminated_cells(time, source)
    if quantity == "ALTITUDE":
        return topocentric.altitude(topocentric.place("MOON", time, latitude, longitude,
                                                      height, "APPARENT", source))
    p = topocentric.place("MOON", time, latitude, longitude, height, "ASTROMETRIC", source)
    target = erfa.s2c(np.radians(ra), np.radians(dec))
    return np.degrees(vectors.angle_between(p.direction, target))


def window_moon_cells(ra, dec, date, latitude, longitude, utc_offset=0.0, quantity="SEPARATION",
                      limit=30.0, limit_kind="ALTITUDE", twilight="ASTRONOMICAL", height=0.0):
    """The Moon at the target's best moment of the night (see moon_at)."""
    w = _window(ra, dec, date, latitude, longitude, utc_offset, limit, limit_kind, twilight,
                height, 0.0, 0.0, 2000.0)
    best = w.best_offsets()
    found = np.array([b is not None for b in best])
    out = np.empty(w.n, dtype=object)
    # A night without a window is an answer, said in words as the window's times say it.
    out[~found] = "no window: the target is not above the limit while the sky is dark this night"
    if np.any(found):
        k = np.flatnonzero(found)
        lat, lon, h = (row_values(v, w.n)[k] for v in (latitude, longitude, height))
        values = moon_at(quantity, w.ra[k], w.dec[k], w.start[k],
                         np.array([best[i] for i in k]), lat, lon, h, date.dut1)
        out[k] = np.asarray(values, dtype=float).tolist()
    return out


def moon_separation_cells(ra, dec, time, latitude, longitude, height=0.0, source=BUILTIN):
    tt1, tt2 = time.tt()
    ra, dec, tt1, tt2 = np.broadcast_arrays(ra, dec, tt1, tt2)
    return moon_at("SEPARATION", ra, dec, tt1, tt2, latitude, longitude, height, time.dut1,
                   source)


def _dark(date, latitude, longitude, utc_offset, twilight, height):
    start, _, free = _nights(date, latitude, longitude, utc_offset, height, twilight, BUILTIN)
    return start, free


def _dark_times(date, utc_offset, start, stretches, end):
    longest = [_longest(s) for s in stretches]
    found = np.array([s is not None for s in longest])
    jd2 = np.array([s[1 if end else 0] if s is not None else 0.0 for s in longest])
    words = None if np.all(found) else np.where(
        found, None, "no Moon-free dark time this night").astype(object)
    return DateTimes.of_tt(start.copy(), jd2, date.scale, utc_offset / 24.0, words)


def dark_start_cells(date, latitude, longitude, utc_offset=0.0, twilight="ASTRONOMICAL",
                     height=0.0):
    start, free = _dark(date, latitude, longitude, utc_offset, twilight, height)
    return _dark_times(date, utc_offset, start, free, False)


def dark_end_cells(date, latitude, longitude, utc_offset=0.0, twilight="ASTRONOMICAL",
                   height=0.0):
    start, free = _dark(date, latitude, longitude, utc_offset, twilight, height)
    return _dark_times(date, utc_offset, start, free, True)


def dark_hours_cells(date, latitude, longitude, utc_offset=0.0, twilight="ASTRONOMICAL",
                     height=0.0):
    _, free = _dark(date, latitude, longitude, utc_offset, twilight, height)
    return np.array([_hours(s) for s in free])
