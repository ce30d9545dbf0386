"""The Sun over the days of the rise, set and transit searches (calcfuncs/sun_days.py)
and the searches by hour angle (sun.py): against the direct computation and against the
searches by samples and brackets they stand in for.

The reference throughout is the direct computation with the IAU's models (ERFA, the
open implementation of SOFA: epv00, the IAU 2006 precession and the IAU 2000A nutation,
nut06a), the same the answers were computed from before; the searches' own accuracy
against almanacs is held by tests/test_sun.py, unchanged.
"""

import numpy as np
import pytest

from calcfuncs import sun, sun_days

MAS = 3.6e6  # milliarcseconds a degree
ERAS = (1600, 1700, 1900, 2025, 2200, 2390)


def random_days(rng, first_year, count, years=10):
    start = 2451545.0 + (first_year - 2000.0) * 365.25
    return np.unique(np.floor(start + rng.uniform(0.0, 365.25 * years, count)))


def angle_mas(u, v):
    return np.degrees(np.linalg.norm(np.cross(u, v), axis=1)) * MAS


@pytest.mark.parametrize("first_year", ERAS)
def test_days_from_anchors_match_the_direct_computation(first_year):
    # 2,000 random days of ten years from each era against the direct computation.
    # Measured: the Sun 2.4-3.6 mas, GAST - ERA 1.9-3.0 mas (the IAU 2000A terms under
    # 0.1 mas that IAU 2000B leaves out, too fast for anchors); the bound 5 mas.
    days = random_days(np.random.default_rng(first_year), first_year, 2000)
    sun_days.forget()
    got, want = sun_days.anchored(days), sun_days.direct(days)
    assert np.max(angle_mas(got[:, :3], want[:, :3])) < 5.0
    assert np.max(np.abs(got[:, 3] - want[:, 3])) * MAS < 5.0


def test_the_moon_swing_is_what_the_anchors_could_not_follow(monkeypatch):
    # Without the Earth's monthly swing about the barycentre put back at each day, the
    # anchors 12 days apart miss it by far more than the bound: the swing is needed
    # (6.4" of the Sun's direction, a month and half a month in period).
    days = random_days(np.random.default_rng(7), 2025, 500)
    sun_days.forget()
    want = sun_days.direct(days)
    monkeypatch.setattr(sun_days, "_swing",
                        lambda tt: (np.zeros((tt.size, 3)), np.zeros((tt.size, 3))))
    sun_days.forget()
    without = sun_days.anchored(days)
    sun_days.forget()
    assert np.max(angle_mas(without[:, :3], want[:, :3])) > 100.0


def test_days_outside_the_anchored_years_are_computed_directly():
    rng = np.random.default_rng(3)
    outside = np.r_[random_days(rng, 1000, 200, 500), random_days(rng, 2500, 200, 500)]
    inside = random_days(rng, 1990, 200, 30)
    sun_days.forget()
    assert np.array_equal(sun_days.values(outside), sun_days.direct(outside))
    assert np.array_equal(sun_days.values(inside), sun_days.anchored(inside))
    # And the values kept are those values: a second call finds the same.
    assert np.array_equal(sun_days.values(inside), sun_days.anchored(inside))


def test_the_stores_stay_within_their_bounds(monkeypatch):
    monkeypatch.setattr(sun_days, "DAYS_KEPT", 30)
    monkeypatch.setattr(sun_days, "ANCHORS_KEPT", 12)
    sun_days.forget()
    days = 2460000.0 + np.arange(400.0)
    first = sun_days.values(days)
    assert len(sun_days._DAYS) <= 30
    assert max(len(sun_days._SUN_ANCHORS), len(sun_days._NUTATION_ANCHORS)) <= 12
    assert np.array_equal(sun_days.values(days[::-1])[::-1], first)
    sun_days.forget()


# ---- the searches by hour angle against those by samples and brackets ------------------


def _sites(rng, n):
    lat = rng.choice([-66.0, -60.0, -45.0, -20.0, 0.0, 20.0, 45.0, 55.0, 60.0, 64.0, 66.0,
                      69.0], n) + rng.uniform(-1.0, 1.0, n)
    lon = rng.uniform(-180.0, 180.0, n)
    return np.clip(lat, -70.0, 70.0), lon


def _rise_set_rows(monkeypatch, start, lat, lon, h0, by_hour_angle):
    if not by_hour_angle:
        monkeypatch.setattr(sun, "SAFE_COS", -1.0)  # no row is safe: all by brackets
    try:
        return sun._search_days(start, lat, lon, h0, 0.0)
    finally:
        monkeypatch.undo()


def test_rise_and_set_by_hour_angle_equal_the_bracketing_search(monkeypatch):
    # 3,000 local days: latitudes from the equator to beyond the polar circles, any
    # longitude, the local day's start at any hour (so that crossings fall near either
    # end of it), sunrise and the three twilights, days of 1600-2400 and outside.  Each
    # day's rises and sets (how many, and when) and the Sun above or not at 0h, by the
    # hour-angle path where it applies, against the search by hourly samples and
    # brackets of the same function: both polish the same root to events' tolerance,
    # 1e-8 day.  Measured: two thirds of the rows by hour angle, largest difference
    # 0.42 ms.
    rng = np.random.default_rng(11)
    n = 3000
    lat, lon = _sites(rng, n)
    start = np.floor(rng.uniform(2305448.0, 2597640.0, n)) + rng.uniform(0.0, 1.0, n)
    start[:300] = np.floor(rng.uniform(2086400.0, 2816000.0, 300)) + 0.25
    h0 = rng.choice(list(sun.EVENT_ALTITUDES.values()), n)
    quick = _rise_set_rows(monkeypatch, start, lat, lon, h0, True)
    slow = _rise_set_rows(monkeypatch, start, lat, lon, h0, False)
    worst, by_brackets_only = 0.0, 0
    for q, s in zip(quick, slow):
        assert q[0].size == s[0].size and q[2].size == s[2].size
        assert q[4] == s[4]
        for a, b in ((0, 1), (2, 3)):
            if q[a].size:
                worst = max(worst, float(np.max(np.abs((q[a] - s[a]) + (q[b] - s[b])))))
        by_brackets_only += q[0].size != 1 or q[2].size != 1
    assert worst < 1e-8
    # The hour-angle path served most days (not a test that compares a path with itself).
    safe = np.abs(lat) < 55.0
    assert sum(1 for k in np.flatnonzero(safe) if quick[k][1].size == 1) > 0.8 * safe.sum()
    assert by_brackets_only > 0  # polar days and nights were among them


def test_transit_by_hour_angle_equals_the_bracketing_search(monkeypatch):
    # 1,500 local dates of 1600-2400 at any site and UTC offset (so that some transits
    # fall near either end of the local date, or on the date before or after): SKY.SUN.
    # TRANSIT by hour angle against the search by samples and brackets; the same
    # answers (a date-time serial) to events' tolerance, the same dates without one.
    from calcfuncs import cells

    rng = np.random.default_rng(12)
    n = 1500
    lat, lon = _sites(rng, n)
    days = np.floor(rng.uniform(-109500.0, 182500.0, n))  # 1600-2400 as Calc serials
    offsets = np.round(rng.uniform(-12.0, 14.0, n) * 4.0) / 4.0

    def column(values):
        return tuple((float(v),) for v in values)

    args = [column(days), column(lat), column(lon), "UTC", column(offsets)]
    quick = [r[0] for r in cells.evaluate("SKY.SUN.TRANSIT", args)]
    monkeypatch.setattr(sun, "EDGE_DAYS", 1.0)  # no guess inside: all by brackets
    monkeypatch.setattr(cells, "_SINGLE_CELL_CACHE", cells.KeptAnswers())
    slow = [r[0] for r in cells.evaluate("SKY.SUN.TRANSIT", args)]
    assert [isinstance(v, str) for v in quick] == [isinstance(v, str) for v in slow]
    assert any(isinstance(v, str) for v in quick)  # dates without a transit were among them
    diffs = [abs(a - b) for a, b in zip(quick, slow) if not isinstance(a, str)]
    assert max(diffs) < 1e-8


def test_event_times_from_anchored_days_stay_within_a_millisecond(monkeypatch):
    # What the interpolation does to an answer: a year of sunrises and sunsets at five
    # sites, from the anchored days and from days computed directly.  Measured 0.16 ms;
    # the bound 1 ms (the stated accuracy is a few seconds).
    lat = np.repeat([-45.0, 0.0, 30.0, 52.0, 62.0], 365)
    lon = np.repeat([170.0, -60.0, 35.0, 0.0, 25.0], 365)
    start = np.tile(2460676.5 + np.arange(365.0), 5)
    h0 = np.full(start.size, sun.EVENT_ALTITUDES["SUNRISE"])
    sun_days.forget()
    anchored = sun._search_days(start, lat, lon, h0, 0.0)
    monkeypatch.setattr(sun_days, "ANCHORED_JD", (np.inf, -np.inf))  # every day direct
    sun_days.forget()
    direct = sun._search_days(start, lat, lon, h0, 0.0)
    sun_days.forget()
    worst = max(float(np.max(np.abs((a[i] - d[i]) + (a[i + 1] - d[i + 1]))))
                for a, d in zip(anchored, direct) for i in (0, 2))
    assert worst * 86400.0 < 1e-3


def test_body_rise_of_the_sun_by_hour_angle_equals_the_bracketing_search(monkeypatch):
    # SKY.BODY.RISE and .SET of the Sun (topocentric, upper limb, the built-in Sun from
    # sun_days) over 600 local dates at sites from the equator to beyond the polar
    # circles: by hour angle where it applies against samples and brackets everywhere,
    # the same answers within events' tolerance (1e-8 day) and the same dates without one.
    from calcfuncs import cells

    rng = np.random.default_rng(13)
    n = 600
    lat, lon = _sites(rng, n)
    days = np.floor(rng.uniform(-109500.0, 182500.0, n))
    offsets = np.round(rng.uniform(-12.0, 14.0, n))

    def column(values):
        return tuple((float(v),) for v in values)

    for name in ("SKY.BODY.RISE", "SKY.BODY.SET"):
        args = ["SUN", column(days), column(lat), column(lon), "UTC", column(offsets)]
        monkeypatch.setattr(cells, "_SINGLE_CELL_CACHE", cells.KeptAnswers())
        quick = [r[0] for r in cells.evaluate(name, args)]
        monkeypatch.setattr(sun, "SAFE_COS", -1.0)  # no row is safe: all by brackets
        monkeypatch.setattr(cells, "_SINGLE_CELL_CACHE", cells.KeptAnswers())
        slow = [r[0] for r in cells.evaluate(name, args)]
        monkeypatch.undo()
        assert [isinstance(v, str) for v in quick] == [isinstance(v, str) for v in slow]
        assert any(isinstance(v, str) for v in quick)  # polar days and nights among them
        assert max(abs(a - b) for a, b in zip(quick, slow) if not isinstance(a, str)) < 1e-8


def test_body_rise_of_the_sun_from_its_days_within_a_millisecond(monkeypatch):
    # SKY.BODY.RISE of the Sun with its place from sun_days against its exact place at
    # every node (bodies.py through risings.body_node_vectors, as before sun_days
    # served it): a year at three sites.  Measured 0.08-0.14 ms; the bound 1 ms.
    from calcfuncs import cells, risings

    days = tuple((45658.0 + k,) for k in range(365))
    exact = risings.body_node_vectors
    for lat, lon in ((-33.9, 18.4), (47.38, 8.05), (60.2, 24.9)):
        args = ["SUN", days, lat, lon]
        monkeypatch.setattr(cells, "_SINGLE_CELL_CACHE", cells.KeptAnswers())
        monkeypatch.setattr(risings, "_NODE_CACHE", {})
        ours = [r[0] for r in cells.evaluate("SKY.BODY.RISE", args)]
        monkeypatch.setattr(sun_days, "cirs_vectors",
                            lambda tt: exact("SUN", "BUILTIN", tt))
        monkeypatch.setattr(cells, "_SINGLE_CELL_CACHE", cells.KeptAnswers())
        full = [r[0] for r in cells.evaluate("SKY.BODY.RISE", args)]
        monkeypatch.undo()
        assert max(abs(a - b) for a, b in zip(ours, full)) * 86400.0 < 1e-3
