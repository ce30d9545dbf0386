"""The quick paths of a single cell give what the general paths give, to the bit.

A cell alone skips the general path's bookkeeping (calcfuncs.timeinput.read_utc_serial,
the ERFA ufuncs read for their status in timescales.erfa_quietly, the one-row matrix of
frames.system_matrix, vectors.norm without numpy.linalg's checks, one instant's model
years on floats in timescales.all_within_years), and the quick paths
of a column (timescales.utc_to_tai, its leap seconds read in one lookup).  Each is checked here
against the path it stands in for, over dense random instants and the edge cases
(UTC step days, 1960, the last date-time value), and the cell results against ERFA
called directly (the IAU SOFA/ERFA routines are the reference of these models).
"""

import warnings

import erfa
import numpy as np
import pytest

from calcfuncs import bodies, cells, frames, nodes, registry, timeinput, timescales, vectors
from calcfuncs.errors import PREFIX, SkyError

NULL_JD = 2415018.5  # Calc's default null date 1899-12-30 (PLATFORM-NOTES.md)
ORBIT_LINE = ("K26S01A 12.40  0.15 K2731 210.00000  112.40000  203.70000    6.30000  "
              "0.1280000  0.23347711   2.6120000")  # the invented asteroid of the samples


def _general(v, null_jd=NULL_JD):
    column = np.empty(1, dtype=object)
    column[0] = v
    jd1, jd2, messages = timeinput.read_times(column, "UTC", null_jd)
    return jd1, jd2, messages[0]


def _step_day_values():
    # Calc date-time values on the UTC days that end in a step of TAI - UTC (ERFA's
    # leap-second table): 1961-1972 fractional steps and every leap second since.
    return [float(d - NULL_JD) + f for d in timeinput._utc_step_days()
            for f in (0.0, 0.5, 0.999999)]


def test_quick_utc_reading_equals_the_general_one():
    rng = np.random.default_rng(11)
    values = list(21916.0 + rng.random(20_000) * 70_000)  # 1960-2151, dense and random
    values += _step_day_values()
    values += [21915.0, 21915.999, 21916.0, 0.0, -1.0, 45000.0, 1e7, -1e7, 1.1e7,
               float("nan"), float("inf"), 3547272.5 - NULL_JD, 3547272.5 - NULL_JD - 1e-6]
    quick_rows = 0
    for v in values:
        found = timeinput.read_utc_serial(v, NULL_JD)
        jd1, jd2, message = _general(v)
        if found is None:
            continue
        quick_rows += 1
        assert message is None, v
        assert found[0].tobytes() == jd1.tobytes() and found[1].tobytes() == jd2.tobytes(), v
    assert quick_rows >= 19_900  # a random value now and then falls on a step day
    # The step days always go the general way (their day is stretched by ERFA dtf2d).
    assert all(timeinput.read_utc_serial(v, NULL_JD) is None for v in _step_day_values())


def test_quick_utc_reading_with_another_null_date():
    # 1904-01-01, the other null date Calc documents may carry (PLATFORM-NOTES.md).
    null_jd = 2416480.5
    for v in 21000.0 + np.random.default_rng(3).random(2000) * 30000:  # 1961-2044
        found = timeinput.read_utc_serial(float(v), null_jd)
        jd1, jd2, message = _general(float(v), null_jd)
        assert message is None
        if null_jd + np.floor(v) in timeinput._utc_step_days():
            assert found is None  # a step day: the general way
            continue
        assert (found[0][0], found[1][0]) == (jd1[0], jd2[0])


@pytest.mark.parametrize("func, extra", [(erfa.utctai, ()), (erfa.taiutc, ()),
                                         (erfa.utcut1, (0.3,)), (erfa.ut1utc, (-0.2,))])
def test_erfa_status_read_in_place_of_warnings(func, extra):
    rng = np.random.default_rng(5)
    # 1960-2200: past ERFA's leap-second table its status is "dubious year" (a warning).
    jd = 2436934.5 + rng.random(5000) * 88_000
    got = timescales.erfa_quietly(func, np.floor(jd), jd - np.floor(jd), *extra)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", erfa.ErfaWarning)
        want = func(np.floor(jd), jd - np.floor(jd), *extra)
    for a, b in zip(got, want):
        assert np.array_equal(a, b)


def test_erfa_error_status_still_raises():
    # A date before ERFA's calendar (JD -1e8, before -4799) is its "unacceptable date": the
    # wrapper's exception, as before the quick path.
    with pytest.raises(erfa.ErfaError):
        timescales.erfa_quietly(erfa.utctai, np.array([-1e8]), np.array([0.0]))


@pytest.mark.parametrize("system", ["EQUATORIAL TRUE", "ECLIPTIC TRUE", "EQUATORIAL DATE",
                                    "ECLIPTIC DATE"])
def test_a_single_row_matrix_equals_its_row_of_a_column(system):
    rng = np.random.default_rng(21)
    tt1 = np.full(40, 2451545.0)
    tt2 = rng.uniform(-30000.0, 30000.0, 40)
    column = frames.system_matrix(system, tt1, tt2)
    for k in range(tt1.size):
        one = frames.system_matrix(system, tt1[k:k + 1], tt2[k:k + 1])
        assert one.shape == (1, 3, 3)
        assert np.array_equal(one[0], column[k])
        assert not one.flags.writeable  # shared with every later cell of that date
    # EQUATORIAL TRUE is ERFA pnm06a (IAU 2006/2000A), its nutation from iau2000a.py.
    if system == "EQUATORIAL TRUE":
        assert np.max(np.abs(column - erfa.pnm06a(tt1, tt2))) < 1e-14


def test_norm_is_numpys_own():
    v = np.random.default_rng(2).normal(size=(10_000, 3)) * 10.0 ** np.arange(-5, 5).repeat(1000)[:, None]
    assert np.array_equal(vectors.norm(v), np.linalg.norm(v, axis=-1))


def test_a_cell_on_the_quick_path_equals_the_same_row_of_a_column(monkeypatch):
    # 30 log instants (under the interpolated columns' density): the column is computed
    # directly, as each cell alone is (cells dense in time may take segments instead,
    # within their bounds: test_nodes.py; not here).
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    rng = np.random.default_rng(8)
    serials = list(45292.0 + rng.random(30) * 1000.0)
    for name in ("SKY.JD", "SKY.SUN.LON", "SKY.MOON.RA", "SKY.OBLIQUITY.TRUE"):
        column = cells.evaluate(name, [tuple((s,) for s in serials)])
        for s, (want,) in zip(serials, column):
            assert cells.evaluate(name, [s]) == want, (name, s)


@pytest.mark.parametrize("span", [(1000.0, 3000.0), (1900.0, 2100.0)])
def test_one_instants_model_years_are_decided_as_a_columns(span):
    # The year of one instant on Python floats against the same instants' years as an
    # array (timescales.julian_year): the same decision at every instant, those a few
    # units in the last place either side of each end of the span among them.
    rng = np.random.default_rng(5)
    ends = [(y - 2000.0) * 365.25 for y in span]
    near = [np.nextafter(e, e + d * np.inf) for e in ends for d in (-1, 1) for _ in range(3)]
    offsets = np.concatenate([rng.uniform(-400_000.0, 400_000.0, 3000), ends, near,
                              [e + d for e in ends for d in (-1e-9, 1e-9, -0.5, 0.5)]])
    jd1 = np.full(offsets.size, 2451545.0)
    jd2 = offsets
    years = timescales.julian_year(jd1, jd2)
    inside = (years >= span[0]) & (years <= span[1])
    assert inside.any() and not inside.all()
    for k in range(offsets.size):
        assert timescales.all_within_years(jd1[k:k + 1], jd2[k:k + 1], span) == inside[k]
    assert timescales.all_within_years(jd1, jd2, span) is False
    assert timescales.all_within_years(jd1[inside], jd2[inside], span) is True
    assert timescales.all_within_years(np.array([np.nan]), np.array([0.0]), span) is False


def test_a_cell_leaves_numpys_error_settings_as_it_found_them():
    # Bad rows are reported in their cells, with numpy's floating-point errors ignored
    # while a cell computes (cells._FloatsQuiet) and the caller's settings back after.
    before = np.seterr(all="raise")
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("error")
            assert cells.evaluate("SKY.WRAP.360", [((1.0,), (float("inf"),), (-5.0,))]) == (
                (1.0,), ("#SKY: degrees must be a finite number of degrees",), (355.0,))
            assert cells.evaluate("SKY.SUN.LON", [float("nan")]).startswith("#SKY:")
            assert isinstance(cells.evaluate("SKY.SUN.LON", [45658.25]), float)
        assert np.geterr() == {"divide": "raise", "over": "raise", "under": "raise",
                               "invalid": "raise"}
    finally:
        np.seterr(**before)


def _utc_days_and_fractions(rng, n, more=()):
    """UTC days (JDs at 0h) over 1960-2100, ``n`` at random, every UTC step day twenty
    times and the days either side of each; fractions of a day at random with both ends
    of a day and noon among them (and ``more``), shuffled."""
    steps = timeinput._utc_step_days()
    days = np.concatenate([rng.integers(2436935, 2488070, n) - 0.5,
                           np.repeat(steps, 20), steps - 1.0, steps + 1.0])
    edges = [0.0, 0.5, np.nextafter(1.0, 0.0), 0.999999, *more]
    fractions = np.concatenate([rng.uniform(0.0, 1.0, days.size - len(edges)), edges])
    rng.shuffle(fractions)
    return days, fractions


def test_column_utc_to_tai_is_erfa_utctai_to_the_bit():
    # ERFA utctai (the IAU SOFA routine) is the reference.  Date-time columns as the
    # cells read them, over 1960-2100 with every UTC step day, the days either side of
    # each, both ends of each day; then arbitrary two-part splits (ERFA's own way).
    rng = np.random.default_rng(21)
    days, fractions = _utc_days_and_fractions(rng, 100_000)
    serials = days - NULL_JD + fractions
    jd1, jd2 = timeinput._serial_pairs(serials, "UTC", NULL_JD)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", erfa.ErfaWarning)  # dates past the table
        reference = erfa.utctai(jd1, jd2)
        found = timescales.utc_to_tai(jd1, jd2)
        assert np.array_equal(found[0], reference[0]) and np.array_equal(found[1], reference[1])
        split1 = rng.uniform(2436935.0, 2488070.0, 50_000)
        split2 = rng.uniform(-3.0, 3.0, split1.size)
        found = timescales.utc_to_tai(split1, split2)
        reference = erfa.utctai(split1, split2)
    assert np.array_equal(found[0], reference[0]) and np.array_equal(found[1], reference[1])


def test_one_utc_instant_on_tt_is_erfa_utctai_and_taitt_to_the_bit():
    # ERFA utctai then taitt (the IAU SOFA routines) are the reference.  A cell's UTC
    # instant on TT takes floats on a day of one TAI - UTC from 1972 (timescales.
    # _steady_day_offset) and ERFA otherwise: over 1960-2100 with every UTC step day and
    # the days either side of each, both ends of each day, and splits not made by a cell.
    rng = np.random.default_rng(23)
    days, fractions = _utc_days_and_fractions(rng, 60_000, (2.0**-52,))
    jd1 = np.concatenate([days, rng.uniform(2441317.0, 2488070.0, 2_000)])
    jd2 = np.concatenate([fractions, rng.uniform(-1.0, 2.0, 2_000)])
    floats = 0
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", erfa.ErfaWarning)  # dates past the table
        tt1, tt2 = erfa.taitt(*erfa.utctai(jd1, jd2))
        for k in range(jd1.size):
            one = timescales.Instants(jd1[k:k + 1], jd2[k:k + 1], "UTC")
            floats += timescales._steady_day_offset(jd1[k]) is not None and 0 <= jd2[k] < 1
            a, b = one.tt()
            assert a.tobytes() == tt1[k:k + 1].tobytes(), (jd1[k], jd2[k])
            assert b.tobytes() == tt2[k:k + 1].tobytes(), (jd1[k], jd2[k])
            c = timescales.Instants(jd1[k:k + 1], jd2[k:k + 1], "UTC").to("TT")
            assert c.jd1.tobytes() == a.tobytes() and c.jd2.tobytes() == b.tobytes()
    assert floats > 0.6 * 60_000  # most of 1972-2100 takes the floats
    # A day that ends in a leap second, and one before 1972, take ERFA.
    assert timescales._steady_day_offset(2457753.5) is None  # 2016-12-31
    assert timescales._steady_day_offset(2441316.5) is None  # 1971-12-31
    assert timescales._steady_day_offset(2457754.5) == 37.0 / 86400.0  # 2017-01-01


def _tt_instants_of_events():
    """TT instants an event search could answer: dense and random over 1960-2150, the
    ends of every UTC step day, inside leap seconds (ERFA dtf2d's 23:59:60.5), 1960's
    first seconds and a date before it."""
    rng = np.random.default_rng(31)
    tt = list(2436935.0 + rng.random(5_000) * 69_000.0)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", erfa.ErfaWarning)
        for step in timeinput._utc_step_days():
            tai = erfa.utctai(step, np.array([0.0, 0.999999, 1.0]))
            tt += list(sum(erfa.taitt(*tai)))
        for y, m, d in ((1972, 6, 30), (1998, 12, 31), (2016, 12, 31)):
            utc = erfa.dtf2d("UTC", y, m, d, 23, 59, np.array([59.5, 60.0, 60.5, 60.999]))
            tt += list(sum(erfa.taitt(*erfa.utctai(*utc))))
    tt += [2436934.5 + 1.5 / 86400.0, 2436934.5 + 60.0 / 86400.0, 2436900.0]
    whole = np.floor(np.array(tt) - 0.5) + 0.5
    return whole, np.array(tt) - whole


def test_one_tt_instant_on_utc_and_as_a_value_equals_the_column_way():
    # The general path (a column of two or more rows: erfa_quietly's tttai and taiutc,
    # _utc_clock) is the reference; a cell's event answer takes the one-instant path.
    tt1, tt2 = _tt_instants_of_events()
    column = timescales.Instants(tt1, tt2, "TT")
    usable = (column.to("TAI").jd1 + column.to("TAI").jd2) >= 2436934.5 + 2.0 / 86400.0
    utc = timescales.Instants(tt1[usable], tt2[usable], "TT").to("UTC")
    serial, in_leap = timeinput.to_serial(utc, NULL_JD)
    assert in_leap.sum() >= 9  # 23:59:60.0, .5 and .999 of three leap seconds, and more
    for k, (a, b) in enumerate(zip(tt1[usable], tt2[usable])):
        one = timescales.Instants(np.array([a]), np.array([b]), "TT").to("UTC")
        assert one.jd1.tobytes() == utc.jd1[k:k + 1].tobytes(), (a, b)
        assert one.jd2.tobytes() == utc.jd2[k:k + 1].tobytes(), (a, b)
        s, leap = timeinput.to_serial(one, NULL_JD)
        assert s.tobytes() == serial[k:k + 1].tobytes() and leap[0] == in_leap[k], (a, b)
    # Before 1960 a single instant gets the general path's message, as a column does.
    with pytest.raises(SkyError, match="from 1960"):
        timescales.Instants(np.array([2436900.0]), np.array([0.0]), "TT").to("UTC")


def test_a_next_event_cell_whose_window_is_kept_equals_its_row_of_a_column():
    # The column searches every window (events.first_after's general path); each single
    # cell after it finds its window kept and takes the one-row lookup.
    rng = np.random.default_rng(41)
    serials = list(45292.0 + rng.random(40) * 700.0)
    for name, args in (("SKY.MOON.PHASE.NEXT", [None, "FULL"]), ("SKY.SUN.REACHES", []),
                       ("SKY.PLANET.EVENT.NEXT", [None, "OPPOSITION"])):
        def call(time):
            if name == "SKY.SUN.REACHES":
                return cells.evaluate(name, [140.0, time])
            if name == "SKY.PLANET.EVENT.NEXT":
                return cells.evaluate(name, ["MARS", time] + args)
            return cells.evaluate(name, [time] + args)
        cells._SINGLE_CELL_CACHE.clear()
        column = call(tuple((s,) for s in serials))
        for s, (want,) in zip(serials, column):
            got = call(s)
            assert isinstance(got, float) and got == want, (name, s)


def test_an_option_word_read_once_gives_the_same_and_a_bad_word_its_message_each_time():
    cells._SINGLE_CELL_CACHE.clear()
    first = cells.evaluate("SKY.JD", [45292.25, "utc", " tt "])
    again = cells.evaluate("SKY.JD", [45292.75, "utc", " tt "])
    assert again - first == 0.5
    for _ in range(2):
        assert cells.evaluate("SKY.JD", [45292.5, "UTC", "TX"]).startswith(PREFIX + "unknown")


def test_a_cell_with_optional_numbers_left_out_takes_the_quick_path_and_the_same_value(monkeypatch):
    # Calc passes an omitted trailing argument as None.  An optional number or angle
    # left out reads as its default (or as not given) on the quick path too; the range
    # form of one row (the general path) is the reference.
    rng = np.random.default_rng(51)
    rows = [(float(ra), float(dec), float(t)) for ra, dec, t in
            zip(rng.uniform(0.0, 360.0, 40), rng.uniform(-30.0, 80.0, 40),
                45292.0 + rng.uniform(0.0, 700.0, 40))]
    site = (47.3814, 8.0542)  # an invented hill station
    general = cells._compute_group
    calls = []
    monkeypatch.setattr(cells, "_compute_group", lambda *a, **k: calls.append(1) or general(*a, **k))
    for name in ("SKY.HORIZON.ALT", "SKY.HORIZON.AZ", "SKY.HOURANGLE", "SKY.PARALLACTIC"):
        for ra, dec, t in rows:
            cells._SINGLE_CELL_CACHE.clear()
            got = cells.evaluate(name, [ra, dec, t, *site])
            assert not calls, name  # the quick path answered
            want = cells.evaluate(name, [((ra,),), ((dec,),), ((t,),), *site])[0][0]
            calls.clear()
            assert isinstance(got, float) and got == want, (name, ra, dec, t)


def test_one_instants_tdb_equals_its_row_of_a_column():
    # TDB - TT of one instant (a cell: BJD_TDB, a kernel's argument) is worked out on
    # floats; the column's masked arrays are the reference, to the bit, over dense random
    # instants, the ends of the span where ERFA dtdb's series is used, and outside it.
    rng = np.random.default_rng(71)
    lo, hi = timescales.TDB_SERIES_JD
    jd = np.concatenate([rng.uniform(lo - 1e5, hi + 1e5, 5_000),
                         [lo, hi, np.nextafter(lo, 0.0), np.nextafter(hi, np.inf), 2451545.0]])
    whole = np.floor(jd) + 0.5
    tt1, tt2 = whole, jd - whole
    c1, c2 = timescales.tt_to_tdb(tt1, tt2)
    for k in range(jd.size):
        a, b = timescales.tt_to_tdb(tt1[k:k + 1], tt2[k:k + 1])
        assert a.tobytes() == c1[k:k + 1].tobytes() and b.tobytes() == c2[k:k + 1].tobytes(), jd[k]


def test_a_cell_with_a_text_takes_the_quick_path_and_the_same_value(monkeypatch):
    # An orbit's line or an angle written as text is a row argument of kind text: a cell
    # holding one (not a #SKY message passed on) takes the quick path; the range form of
    # one row (the general path) is the reference.  A message passed on, or a text that
    # does not read, still goes the general way and says what it says.
    line = ("K26S01A 12.40  0.15 K2731 210.00000  112.40000  203.70000    6.30000  "
            "0.1280000  0.23347711   2.6120000")  # the invented asteroid of the samples
    general = cells._compute_group
    calls = []
    monkeypatch.setattr(cells, "_compute_group", lambda *a, **k: calls.append(1) or general(*a, **k))
    cases = [("SKY.ORBIT.RA", [line, 45400.3 + 0.37 * k]) for k in range(12)]
    cases += [("SKY.ORBIT.MAG", [line, 45500.25]), ("SKY.ORBIT.SUN.DIST", [line, 45600.5]),
              ("SKY.ANGLE", ["-23 26 21.4"]), ("SKY.ANGLE.HOURS", ["12h34m56.7s"])]
    for name, args in cases:
        cells._SINGLE_CELL_CACHE.clear()
        got = cells.evaluate(name, args)
        assert not calls, name  # the quick path answered
        want = cells.evaluate(name, [((a,),) for a in args])[0][0]
        calls.clear()
        assert isinstance(got, float) and got == want, (name, args)
    for name, args in (("SKY.ORBIT.RA", ["#SKY: from another cell", 45400.3]),
                       ("SKY.ORBIT.RA", ["not an orbit", 45400.3]),
                       ("SKY.ANGLE", ["23 61 00"])):
        cells._SINGLE_CELL_CACHE.clear()
        got = cells.evaluate(name, args)
        assert calls and got.startswith(PREFIX), (name, got)
        calls.clear()


class _Forgetful(dict):
    """A cache that keeps nothing."""

    def __setitem__(self, key, value):
        pass


def _phase_cells(serials, null_date=(1899, 12, 30), scale=None):
    cells._SINGLE_CELL_CACHE.clear()
    return [cells.evaluate("SKY.MOON.PHASE.NEXT", [s, None, "FULL", scale], null_date)
            for s in serials]


def test_cells_sharing_an_event_share_its_conversion_and_give_its_own_value(monkeypatch):
    # A month of cells asks for one full Moon: its instant on the result's scale and its
    # date-time value are kept (timescales.DateTimes.of_tt, cells._one_date_time_value)
    # and found by the next cells.  The same values to the bit as with nothing kept, on
    # every scale and null date (a changed one is never answered from the other's).
    rng = np.random.default_rng(43)
    serials = list(45292.0 + np.sort(rng.random(60)) * 90.0)
    for null_date in ((1899, 12, 30), (1904, 1, 1)):
        for scale in (None, "TT", "UT1", "TDB"):
            timescales._ONE_SHOWN.clear()
            cells._ONE_VALUE.clear()
            kept = _phase_cells(serials, null_date, scale)
            # Three or four full Moons, each found from one or two search windows (whose
            # two-part instants are split at their own starts): far fewer than the cells.
            assert 3 <= len(timescales._ONE_SHOWN) <= 8
            with monkeypatch.context() as m:
                m.setattr(timescales, "_ONE_SHOWN", _Forgetful())  # nothing found kept
                m.setattr(cells, "_ONE_VALUE", _Forgetful())
                fresh = _phase_cells(serials, null_date, scale)
            assert all(isinstance(v, float) for v in kept)
            assert kept == fresh, (null_date, scale)
    # The same instants under the other null date: every value 1,462 days smaller.
    base = _phase_cells(serials)
    moved = _phase_cells([v - 1462.0 for v in serials], (1904, 1, 1))
    assert all(a - b == pytest.approx(1462.0, abs=1e-9) for a, b in zip(base, moved))


def test_the_kept_conversions_stay_within_their_bounds(monkeypatch):
    monkeypatch.setattr(timescales, "ONE_SHOWN_KEPT", 5)
    monkeypatch.setattr(cells, "_ONE_VALUE_KEPT", 5)
    timescales._ONE_SHOWN.clear()
    cells._ONE_VALUE.clear()
    serials = list(45292.0 + np.arange(0.0, 400.0, 3.7))  # thirteen full Moons
    got = _phase_cells(serials)
    assert len(timescales._ONE_SHOWN) <= 5 and len(cells._ONE_VALUE) <= 5
    monkeypatch.setattr(timescales, "_ONE_SHOWN", _Forgetful())
    monkeypatch.setattr(cells, "_ONE_VALUE", _Forgetful())
    assert _phase_cells(serials) == got


PLACE_CELLS = [  # (name, the arguments before the time, after it) of each place twin
    ("SKY.SUN.LON", (), ()), ("SKY.SUN.LAT", (), (None, "DATE")),
    ("SKY.SUN.RA", (), (None, "J2000", "ASTROMETRIC")), ("SKY.SUN.DEC", (), (None, "J2000")),
    ("SKY.SUN.SOLARLON", (), ()), ("SKY.MOON.LON", (), (None, "J2000")),
    ("SKY.MOON.LAT", (), ()), ("SKY.MOON.RA", (), (None, "TRUE", "GEOMETRIC")),
    ("SKY.MOON.DEC", (), ()), ("SKY.PLANET.LON", ("MERCURY",), ()),
    ("SKY.PLANET.LAT", ("NEPTUNE",), (None, "DATE")), ("SKY.PLANET.RA", ("MARS",), ()),
    ("SKY.PLANET.DEC", ("JUPITER",), (None, "J2000", "ASTROMETRIC")),
    ("SKY.ORBIT.RA", (ORBIT_LINE,), ()), ("SKY.ORBIT.DEC", (ORBIT_LINE,), (None, "J2000")),
    ("SKY.ORBIT.LON", (ORBIT_LINE,), ()), ("SKY.ORBIT.LAT", (ORBIT_LINE,), (None, "DATE")),
]


def test_a_place_cell_takes_the_float_lane_and_gives_its_row_of_a_column(monkeypatch):
    # A place cell whose instant is a UTC date-time value on a day of one TAI - UTC
    # (1972 on, no leap second at its end) is read straight onto TT as floats and handed
    # to the function's twin on floats (cells._on_floats): no Instants, no arrays.  The
    # range form of one row (the general path) is the reference, to the bit.  Cells
    # spread thinner than a log (no segments: DENSE_CELLS) so both compute directly.
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    rng = np.random.default_rng(61)
    serials = rng.uniform(26000.0, 70000.0, 8).tolist()  # 1971-2091, floats as from Calc
    usual = cells.read_utc_serial
    calls = []
    monkeypatch.setattr(cells, "read_utc_serial", lambda *a: calls.append(1) or usual(*a))
    for name, before, after in PLACE_CELLS:
        for s in serials:
            cells._SINGLE_CELL_CACHE.clear()
            got = cells.evaluate(name, [*before, s, *after])
            steady = timescales.utc_on_tt_floats(
                *timeinput._utc_serial_floats(s, NULL_JD)) is not None
            assert bool(calls) != steady, (name, s)  # the lane, unless a 1971 day
            calls.clear()
            want = cells.evaluate(name, [*before, ((s,),), *after])[0][0]
            assert isinstance(got, float) and got == want, (name, s, got, want)


def test_the_float_lane_leaves_other_cells_to_the_usual_path(monkeypatch):
    # A place cell the lane does not take answers as before: a leap second's day and
    # last second, a day of 1968 (UTC's old steps), a date in TT, a year beyond the
    # built-in theories (3542: the long-range path), a planet name that is no planet
    # (its message).
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    lane = cells._on_floats
    taken = []
    monkeypatch.setattr(cells, "_on_floats", lambda *a: taken.append(lane(*a)) or taken[-1])
    leap_eve = float(timeinput._utc_step_days()[-1] - NULL_JD)  # 2016-12-31
    cases = [("SKY.SUN.LON", [leap_eve + 0.5]), ("SKY.SUN.LON", [leap_eve + 0.99999]),
             ("SKY.MOON.RA", [25000.3]), ("SKY.SUN.LON", [45000.3, "TT"]),
             ("SKY.SUN.LON", [600000.5]), ("SKY.PLANET.RA", ["PLUTO", 45000.3])]
    for name, args in cases:
        cells._SINGLE_CELL_CACHE.clear()
        got = cells.evaluate(name, args)
        assert all(found is None for found in taken), (name, args)
        taken.clear()
        want = cells.evaluate(name, [((a,),) if type(a) is float else a for a in args])[0][0]
        assert got == want, (name, args, got, want)
    assert cells.evaluate("SKY.PLANET.RA", ["PLUTO", 45000.3]).startswith(PREFIX)


def test_a_twin_that_fails_leaves_the_cell_to_the_usual_path(monkeypatch):
    # The lane only saves time: a twin that raises (a defect, say) sends the cell down
    # the usual path, which answers as it always did.
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    want = cells.evaluate("SKY.SUN.LON", [((45000.3,),)])[0][0]

    calls = []

    def broken(*args, **kwargs):
        calls.append(1)
        raise TypeError("a defect of the lane")
    monkeypatch.setattr(bodies, "cell_on_floats", broken)
    cells._SINGLE_CELL_CACHE.clear()
    assert cells.evaluate("SKY.SUN.LON", [45000.3]) == want
    assert calls == [1]  # the lane was tried, once


def test_an_observed_place_cell_takes_the_float_lane_and_gives_its_row_of_a_column(monkeypatch):
    # The altitude and azimuth at a site (SKY.HORIZON.ALT, .AZ), the hour angle and the
    # parallactic angle (SKY.HOURANGLE, SKY.PARALLACTIC) of a cell whose instant
    # the lane reads (UTC from 1972, a day of one TAI - UTC) are computed by the twin on
    # floats (horizon._observed_on_floats): the same ERFA calls on the same inputs, so the
    # range form of one row (the general path) is equal to the bit.  Random targets,
    # sites (an invented one among them) and heights, with and without refraction and a
    # DUT1; targets below 5 degrees with refraction, a TRUE place, a site beyond the
    # poles and a DUT1 out of its limit go the usual way and give its message or value.
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    lane = cells._on_floats
    taken = []
    monkeypatch.setattr(cells, "_on_floats", lambda *a: taken.append(lane(*a)) or taken[-1])
    rng = np.random.default_rng(73)
    answered = 0
    for k in range(60):
        ra, dec = float(rng.uniform(0.0, 360.0)), float(rng.uniform(-60.0, 89.0))
        s = float(rng.uniform(30000.0, 60000.0))  # 1982-2064
        site = (47.3814, 8.0542) if k % 3 == 0 else (float(rng.uniform(-70.0, 70.0)),
                                                       float(rng.uniform(-180.0, 180.0)))
        tail = [None, float(rng.uniform(0.0, 3000.0))]  # the scale left out, a height
        if k % 2:
            tail += [1010.0, 12.0, None, float(rng.uniform(-0.9, 0.9))]  # air, DUT1
        for name in ("SKY.HORIZON.ALT", "SKY.HORIZON.AZ", "SKY.HOURANGLE", "SKY.PARALLACTIC"):
            given = tail if name.startswith("SKY.HORIZON") else tail[:2]  # (no air there)
            cells._SINGLE_CELL_CACHE.clear()
            got = cells.evaluate(name, [ra, dec, s, *site, *given])
            want = cells.evaluate(name, [((ra,),), ((dec,),), ((s,),), *site, *given])[0][0]
            assert got == want, (name, ra, dec, s, site, tail, got, want)
            if isinstance(got, float):
                assert taken[-1] == got  # the lane answered
                answered += 1
            else:  # refraction refused below 5 degrees: the usual path's message
                assert taken[-1] is None and got.startswith(PREFIX)
            taken.clear()
    assert answered > 120
    for args in ([10.0, 20.0, 45000.3, 47.0, 8.0, None, 0.0, 0.0, 10.0, "TRUE"],
                 [10.0, 20.0, 45000.3, 95.0, 8.0], [10.0, 20.0, 45000.3, 47.0, 8.0, "TT"],
                 [10.0, 20.0, 45000.3, 47.0, 8.0, None, 0.0, 0.0, 10.0, None, 1.5]):
        cells._SINGLE_CELL_CACHE.clear()
        got = cells.evaluate("SKY.HORIZON.ALT", args)
        assert all(found is None for found in taken), args
        taken.clear()
        want = cells.evaluate("SKY.HORIZON.ALT",
                              [((a,),) if k < 5 else a for k, a in enumerate(args)])[0][0]
        assert got == want, (args, got, want)


def test_a_julian_date_cell_takes_the_float_lane_on_utc_and_tt(monkeypatch):
    # SKY.JD and SKY.MJD of a UTC date-time value on a day of one TAI - UTC, on UTC or
    # TT, add the parts the lane reads (the floats the Instants path holds): the range
    # form of one row is equal to the bit.  Other result scales go the usual way.
    lane = cells._on_floats
    taken = []
    monkeypatch.setattr(cells, "_on_floats", lambda *a: taken.append(lane(*a)) or taken[-1])
    rng = np.random.default_rng(79)
    for s in rng.uniform(26400.0, 75000.0, 200).tolist() + _step_day_values():  # 1972-2105
        found = timeinput._utc_serial_floats(s, NULL_JD)
        steady = found is not None and timescales.utc_on_tt_floats(*found) is not None
        for name in ("SKY.JD", "SKY.MJD"):
            for result in (None, "UTC", "TT", "TAI", "TDB"):
                cells._SINGLE_CELL_CACHE.clear()
                got = cells.evaluate(name, [s, "UTC", result])
                want = cells.evaluate(name, [((s,),), "UTC", result])[0][0]
                assert got == want, (name, s, result, got, want)
                lane_answered = bool(taken) and taken[-1] is not None
                assert lane_answered == (steady and result in (None, "UTC", "TT")), (name, s, result)
                taken.clear()


def test_the_float_lane_reads_the_instant_with_the_documents_null_date(monkeypatch):
    # A document whose null date is 1904-01-01 (or 1899-12-31) sends the same date-time
    # value for another instant: the lane reads it with that null date, as the usual path
    # does (the range form of one row is the reference, to the bit), and a kept answer of
    # one null date is never given for another.
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    rng = np.random.default_rng(83)
    for s in rng.uniform(30000.0, 60000.0, 20).tolist():
        answers = set()
        for null_date in ((1899, 12, 30), (1904, 1, 1), (1899, 12, 31)):
            for name, args in (("SKY.SUN.LON", [s]), ("SKY.JD", [s, "UTC", "TT"]),
                               ("SKY.HORIZON.ALT", [10.0, 20.0, s, 47.3814, 8.0542])):
                got = cells.evaluate(name, args, null_date)
                want = cells.evaluate(name, [((a,),) if a == s else a for a in args],
                                      null_date)[0][0]
                assert got == want, (name, s, null_date)
                answers.add((name, got))
        assert len(answers) == 9  # each null date its own instant


def test_the_lane_is_made_once_per_function_and_only_for_twins(monkeypatch):
    # cells._lane_of reads a function's registry entry once: a lane for a function with
    # a twin on floats whose result is a number, none for others (a text result, a
    # series, no twin).  A word the lane cannot read (a frame that is none) leaves the
    # cell to the usual path, whose message it shows.
    lane = cells._lane_of(registry.BY_NAME["SKY.SUN.LON"])
    assert callable(lane) and cells._lane_of(registry.BY_NAME["SKY.SUN.LON"]) is lane
    for name in ("SKY.VERSION", "SKY.OBLIQUITY.TRUE", "SKY.WRAP.360"):
        assert cells._lane_of(registry.BY_NAME[name]) is None, name
    taken = []
    real = cells._on_floats
    monkeypatch.setattr(cells, "_on_floats", lambda *a: taken.append(1) or real(*a))
    got = cells.evaluate("SKY.SUN.LON", [45000.25, None, "NOPE"])
    assert isinstance(got, str) and got.startswith(PREFIX) and "NOPE" in got
    assert taken == []  # the lane stopped at the word, before the twin
    assert isinstance(cells.evaluate("SKY.SUN.LON", [45000.25, None, "J2000"]), float)
    assert taken == [1]
