"""The event search (calcfuncs.events) on synthetic functions whose roots are known in
closed form (common mathematics: the zeros of a sine, of a parabola, of a step).

Every event of the add-in (seasons, rise and set, phases, planet events) is a function
of time handed to ``events.crossings``; these checks hold the search itself to its
stated behaviour, row by row and with many rows at once.  Instants are TT JDs near
JD 2460000.5; the functions are written in days since that date so that the roots are
exact numbers.
"""

import numpy as np
import pytest

from calcfuncs import events
from calcfuncs.errors import RowErrors, rows_failing

J0 = 2460000.5
TOL = 1e-8  # the search's default tolerance, days (under a millisecond)


def days(jd1, jd2):
    """Days since J0, keeping the two parts apart."""
    return (np.asarray(jd1) - J0) + np.asarray(jd2)


def root_days(roots):
    return days(roots.jd1, roots.jd2)


def sine(period):
    """sin(2 pi t / period): zeros at every half period, rising at whole periods."""
    def f(jd1, jd2, row):
        return np.sin(2.0 * np.pi * days(jd1, jd2) / period)
    return f


def test_the_zeros_of_a_sine_are_found_to_the_tolerance():
    # sin(2 pi t / 7.3) is zero at t = k * 3.65 (closed form); hourly samples over 20 days.
    roots = events.crossings(sine(7.3), J0 + 0.2, J0 + 20.2, 1.0 / 24.0)
    expected = 3.65 * np.arange(1, 6)
    assert len(roots) == 5
    np.testing.assert_allclose(root_days(roots), expected, rtol=0, atol=TOL)
    assert np.all(roots.row == 0)


@pytest.mark.parametrize("direction, expected", [
    (+1, [7.3, 14.6]),    # the sine rises through zero at whole periods
    (-1, [3.65, 10.95, 18.25]),  # and falls at the half periods between
])
def test_a_direction_keeps_the_rising_or_the_falling_zeros(direction, expected):
    roots = events.crossings(sine(7.3), J0 + 0.2, J0 + 20.2, 1.0 / 24.0, direction=direction)
    np.testing.assert_allclose(root_days(roots), expected, rtol=0, atol=TOL)


def test_two_roots_in_one_window_are_both_found_in_order():
    # (t - 1.3)(t - 2.9): zeros at 1.3 (falling) and 2.9 (rising), one window of 4 days.
    def f(jd1, jd2, row):
        t = days(jd1, jd2)
        return (t - 1.3) * (t - 2.9)

    roots = events.crossings(f, J0, J0 + 4.0, 0.1)
    np.testing.assert_allclose(root_days(roots), [1.3, 2.9], rtol=0, atol=TOL)


def test_a_function_that_touches_zero_without_crossing_has_no_root():
    # (t - 2.05)^2 reaches zero at 2.05 but keeps its sign: not an event.  The samples
    # (every 0.1 day from 0) miss 2.05 by 0.05 day.
    def f(jd1, jd2, row):
        return (days(jd1, jd2) - 2.05) ** 2

    assert len(events.crossings(f, J0, J0 + 4.0, 0.1)) == 0
    assert len(events.crossings(lambda a, b, r: -f(a, b, r), J0, J0 + 4.0, 0.1)) == 0


def test_a_brief_excursion_between_samples_is_found_with_extrema():
    # (t - 2.03)^2 - 0.01^2 dips below zero for 0.02 day (29 minutes) between two
    # hourly samples: zeros at 2.02 and 2.04.  Plain sampling misses both; sampling the
    # vertex of the trough as well finds both (the Sun clearing the horizon for
    # minutes near the polar night is this case).
    def f(jd1, jd2, row):
        return (days(jd1, jd2) - 2.03) ** 2 - 0.01 ** 2

    assert len(events.crossings(f, J0, J0 + 4.0, 1.0 / 24.0)) == 0
    roots = events.crossings(f, J0, J0 + 4.0, 1.0 / 24.0, extrema=True)
    assert len(roots) == 2
    # Both are refined to the tolerance: the earlier bracket (the sample at 2.0 to the
    # vertex, 0.03 day wide, on a parabola) defeats false position with one end fixed
    # (it stopped 27 s late after six steps), and is bisected to the tolerance instead.
    assert abs(root_days(roots)[1] - 2.04) < TOL
    assert abs(root_days(roots)[0] - 2.02) < TOL


def test_a_step_is_found_within_the_short_bracket():
    # A step from -1 to +1 at t = 1.37: bisection brings the bracket under an hour; false
    # position cannot improve on a step (both ends keep their values), so the answer is
    # the middle of that last bracket, within half of it of the step.
    def f(jd1, jd2, row):
        return np.where(days(jd1, jd2) < 1.37, -1.0, 1.0)

    roots = events.crossings(f, J0, J0 + 3.0, 0.25)
    assert len(roots) == 1
    assert abs(root_days(roots)[0] - 1.37) <= 0.5 * events.SHORT_BRACKET_DAYS


def test_windows_without_a_root_give_nothing():
    # 1 + 0.5 sin t is never below 0.5.
    def f(jd1, jd2, row):
        return 1.0 + 0.5 * np.sin(days(jd1, jd2))

    roots = events.crossings(f, [J0, J0 + 100.0], [J0 + 30.0, J0 + 101.0], 0.5)
    assert len(roots) == 0
    jd1, jd2, found = roots.first(2)
    assert not np.any(found) and np.all(np.isnan(jd1))


def test_a_root_on_a_sample_is_found_once_and_one_at_the_window_start_not_at_all():
    # (t - 1)(t - 2)(t - 4): zeros at 1, 2 and 4, each exactly on a sample (step 0.5)
    # where the function is exactly zero.  A zero on a sample closes the bracket before
    # it and opens none after it, so it is found once; one at the end of the window is
    # found; one at the very start has no bracket before it (the searches want events
    # after their start).
    def f(jd1, jd2, row):
        t = days(jd1, jd2)
        return (t - 1.0) * (t - 2.0) * (t - 4.0)

    roots = events.crossings(f, J0, J0 + 4.0, 0.5)
    np.testing.assert_allclose(root_days(roots), [1.0, 2.0, 4.0], rtol=0, atol=TOL)
    roots = events.crossings(f, J0 + 1.0, J0 + 3.0, 0.5)
    np.testing.assert_allclose(root_days(roots), [2.0], rtol=0, atol=TOL)


def test_a_wrap_of_an_angle_is_not_a_crossing():
    # An angle growing 10 degrees a day, wrapped to [-180, 180): it passes zero at
    # t = 18 and 54 (36 days a turn, from -180 at t = 0) and wraps from +180 to -180 at
    # t = 36 and 72, which a jump of 90 degrees rejects.
    def f(jd1, jd2, row):
        return events.wrap180(10.0 * days(jd1, jd2) - 180.0)

    roots = events.crossings(f, J0 + 0.3, J0 + 80.3, 1.0, direction=+1, jump=90.0)
    np.testing.assert_allclose(root_days(roots), [18.0, 54.0], rtol=0, atol=TOL)
    wrapped = events.crossings(f, J0 + 0.3, J0 + 80.3, 1.0)
    assert len(wrapped) == 4  # without the jump the wraps count too


def test_many_rows_with_their_own_windows_and_parameters_at_once():
    # Row k: the zero of t - r[k] (one per row, the root a per-row parameter), each row
    # over its own window, some of them of other lengths.  The answers are the closed
    # form, and each row's answer is the same to the last bit as a search of that row
    # alone: a row's result does not depend on the other rows of the call.
    rng = np.random.default_rng(3)
    n = 40
    start = J0 + rng.uniform(0.0, 500.0, n)
    length = rng.choice([1.0, 2.5, 10.0], n)
    r = (start - J0) + rng.uniform(0.01, 0.99, n) * length

    def f(jd1, jd2, row):
        # Rising through zero at r; its other zeros are 20 days away, outside the window.
        return np.sin((days(jd1, jd2) - r[row]) * np.pi / 20.0)

    roots = events.crossings(f, start, start + length, 1.0 / 24.0, direction=+1)
    jd1, jd2, found = roots.first(n)
    assert np.all(found) and np.all(roots.count(n) >= 1)
    np.testing.assert_allclose(days(jd1, jd2), r, rtol=0, atol=TOL)
    for k in range(n):
        one = events.crossings(lambda a, b, row: f(a, b, np.full(np.shape(a), k)),
                               start[k], start[k] + length[k], 1.0 / 24.0, direction=+1)
        assert one.jd1[0] == jd1[k] and one.jd2[0] == jd2[k]


def test_first_after_and_last_before_pick_per_row():
    # sin(2 pi t / 2) over [0.2, 6.2]: zeros at 1, 2, 3, 4, 5, 6.  Row 0 asks for the
    # first after 2.5 (3), row 1 the last at or before 4.0 (4).
    roots = events.crossings(sine(2.0), [J0 + 0.2, J0 + 0.2], [J0 + 6.2, J0 + 6.2], 0.5)
    after = roots.after(np.array([J0, J0]), np.array([2.5, 2.5]))
    jd1, jd2, found = roots.first(2, after)
    assert found[0] and abs(days(jd1[0], jd2[0]) - 3.0) < TOL
    jd1, jd2, found = roots.first(2, ~roots.after(np.array([J0, J0]), np.array([4.0, 4.0])),
                                  last=True)
    assert found[1] and abs(days(jd1[1], jd2[1]) - 4.0) < 2 * TOL


def test_rising_and_falling_match_two_searches():
    # One sampling for both directions gives what two searches give, to the last bit.
    f = sine(0.9)
    start, end = J0 + np.array([0.0, 3.3]), J0 + np.array([1.0, 4.3])
    up, down, at_start = events.rising_and_falling(f, start, end, 1.0 / 24.0, extrema=True)
    up2 = events.crossings(f, start, end, 1.0 / 24.0, direction=+1, extrema=True)
    down2 = events.crossings(f, start, end, 1.0 / 24.0, direction=-1, extrema=True)
    for a, b in ((up, up2), (down, down2)):
        assert np.array_equal(a.jd1, b.jd1) and np.array_equal(a.jd2, b.jd2)
        assert np.array_equal(a.row, b.row)
    np.testing.assert_array_equal(at_start, np.sin(2.0 * np.pi * days(start, 0.0) / 0.9))
    # Zeros of sin(2 pi t / 0.9): rising at 0.9 k, falling at 0.45 + 0.9 k.
    np.testing.assert_allclose(root_days(up), [0.9, 3.6], rtol=0, atol=TOL)
    np.testing.assert_allclose(root_days(down), [0.45, 4.05], rtol=0, atol=TOL)


def test_a_failing_row_is_reported_on_that_row_only():
    # A function that refuses the instants of its second row (as a source refuses dates
    # outside its range): the search reports a message aligned with the rows.
    def f(jd1, jd2, row):
        bad = row == 1
        if np.any(bad):
            raise rows_failing(bad, "outside the range")
        return np.sin(days(jd1, jd2))

    with pytest.raises(RowErrors) as err:
        events.crossings(f, J0 + np.array([0.5, 10.0, 20.0]), J0 + np.array([4.0, 14.0, 24.0]),
                         0.5)
    assert list(err.value.messages) == [None, "outside the range", None]


# ---- sampling near an estimate -------------------------------------------------------------


def _counting(f):
    """``f`` that also counts how many instants it was asked for."""
    def g(jd1, jd2, row):
        g.calls += np.size(jd1)
        return f(jd1, jd2, row)
    g.calls = 0
    return g


def _same_roots(a, b):
    return (np.array_equal(a.row, b.row) and np.array_equal(a.jd1, b.jd1)
            and np.array_equal(a.jd2, b.jd2))


def test_an_estimate_gives_the_same_roots_with_far_fewer_evaluations():
    # 30 rows of a year each: sin(2 pi (t - r) / 365.25), rising once a year at r[k]
    # (closed form), daily samples.  A good estimate (the same function shifted by two
    # hours) leads the search to the same brackets: the roots are bit-identical to those
    # of the full grid, found from a few samples a row instead of 371.
    rng = np.random.default_rng(11)
    n = 30
    start = J0 + rng.uniform(0.0, 1000.0, n)
    r = (start - J0) + rng.uniform(5.0, 360.0, n)

    def f(jd1, jd2, row):
        return np.sin(2.0 * np.pi * (days(jd1, jd2) - r[row]) / 365.25)

    def estimate(jd1, jd2, row):
        return np.sin(2.0 * np.pi * (days(jd1, jd2) - r[row] - 2.0 / 24.0) / 365.25)

    full, near = _counting(f), _counting(f)
    expected = events.crossings(full, start, start + 370.0, 1.0, direction=+1)
    got = events.crossings(near, start, start + 370.0, 1.0, direction=+1, estimate=estimate)
    assert _same_roots(got, expected)
    np.testing.assert_allclose(days(*got.first(n)[:2]), r, rtol=0, atol=TOL)
    assert near.calls < full.calls / 10


def test_a_wrong_estimate_falls_back_to_the_full_grid_for_its_rows():
    # The estimate is right for even rows and 40 days off for odd rows: the clusters of
    # samples around the wrong places show f with the other sign at their ends, so those
    # rows are sampled in full; every row's roots equal the full grid's.
    rng = np.random.default_rng(12)
    n = 12
    start = J0 + rng.uniform(0.0, 1000.0, n)
    r = (start - J0) + rng.uniform(60.0, 300.0, n)
    shift = np.where(np.arange(n) % 2 == 1, 40.0, 0.1)

    def f(jd1, jd2, row):
        return np.sin(2.0 * np.pi * (days(jd1, jd2) - r[row]) / 365.25)

    def estimate(jd1, jd2, row):
        return np.sin(2.0 * np.pi * (days(jd1, jd2) - r[row] - shift[row]) / 365.25)

    expected = events.crossings(f, start, start + 370.0, 1.0, direction=+1)
    counted = _counting(f)
    got = events.crossings(counted, start, start + 370.0, 1.0, direction=+1, estimate=estimate)
    assert _same_roots(got, expected)
    # The six misled rows were sampled in full (371 days each), the others were not.
    assert 6 * 371 < counted.calls < 7 * 371


def test_an_estimate_with_no_sign_change_finds_nothing_and_an_error_keeps_its_row():
    # No zero in the estimate's window: nothing is sampled and nothing found.  A row whose
    # instants the function refuses keeps its message on that row.
    start = J0 + np.array([0.0, 100.0, 200.0])

    def f(jd1, jd2, row):
        t = days(jd1, jd2)
        bad = (row == 2)
        if np.any(bad):
            raise rows_failing(bad, "row two is refused")
        return t - (start[row] - J0) - 5.5

    def estimate(jd1, jd2, row):
        return np.where(row == 0, 1.0, days(jd1, jd2) - (start[row] - J0) - 5.4)

    with pytest.raises(RowErrors) as err:
        events.crossings(f, start, start + 10.0, 1.0, estimate=estimate)
    assert list(err.value.messages) == [None, None, "row two is refused"]
    roots = events.crossings(f, start[:2], start[:2] + 10.0, 1.0, estimate=lambda a, b, row:
                             estimate(a, b, row))
    assert list(roots.row) == [1]
    np.testing.assert_allclose(root_days(roots), [105.5], rtol=0, atol=TOL)


def sine_zero_guesses(seed, off):
    """The zeros of sin(2 pi t / 7.3) at k * 3.65 (closed form), k = 1..5, and guesses
    off by up to ``off`` days from them."""
    k = np.arange(1, 6)
    truth = 3.65 * k
    rng = np.random.default_rng(seed)
    guesses = events.Roots(np.full(k.size, J0), truth + rng.uniform(-off, off, k.size),
                           np.arange(k.size))
    return k, truth, guesses


def test_polish_takes_near_guesses_to_the_roots_of_the_full_function():
    # The zeros of sin(2 pi t / 7.3) at k * 3.65 (closed form), from guesses off by up
    # to an hour with the sine's slope at the root off by 5 per cent: Newton then secant
    # steps settle each one within the tolerance.
    k, truth, guesses = sine_zero_guesses(3, 0.04)
    slope = 1.05 * 2.0 * np.pi / 7.3 * np.cos(np.pi * k)
    found, settled = events.polish(sine(7.3), guesses, slope, k.size)
    assert settled.all()
    assert np.max(np.abs(root_days(found) - truth)) < TOL


def test_polish_with_a_curvature_bound_spares_the_confirming_evaluation():
    # The same zeros of sin(2 pi t / 7.3) (closed form), from guesses off by up to a
    # quarter of an hour with the slope off by 0.01 per cent.
    # Within 0.02 days of a zero |f''/2f'| = (w/2)|tan(w dt)| < 0.015 a day (w = 2 pi /
    # 7.3): with that bound each root settles after two evaluations instead of three,
    # still within the tolerance.
    k, truth, guesses = sine_zero_guesses(4, 0.01)
    slope = 1.0001 * 2.0 * np.pi / 7.3 * np.cos(np.pi * k)
    evaluated = []

    def counted(jd1, jd2, row):
        evaluated.append(np.size(jd2))
        return sine(7.3)(jd1, jd2, row)

    for curvature, evaluations in ((None, 3 * k.size), (0.015, 2 * k.size)):
        evaluated.clear()
        found, settled = events.polish(counted, guesses, slope, k.size, curvature=curvature)
        assert settled.all()
        assert np.max(np.abs(root_days(found) - truth)) < TOL
        assert sum(evaluated) == evaluations, curvature


def test_polish_leaves_a_guess_that_runs_away_to_the_caller():
    # A guess at the top of the sine (slope zero, closed form) is thrown far away by a
    # Newton step with the true slope; it is reported as not settled, and the row's
    # other guess, near a root, settles.
    guesses = events.Roots(np.full(2, J0), np.array([7.3 / 4.0 + 1e-7, 3.65 + 0.01]),
                           np.array([0, 1]))
    slope = 2.0 * np.pi / 7.3 * np.cos(2.0 * np.pi * guesses.jd2 / 7.3)
    found, settled = events.polish(sine(7.3), guesses, slope, 2)
    assert list(settled) == [False, True]
    assert abs(root_days(found)[1] - 3.65) < TOL
