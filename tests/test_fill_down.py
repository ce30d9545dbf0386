"""Cells filled down a column of days: the rows ahead computed in one call and kept
(cells.py, FILL_AHEAD) must give every cell the value it gives alone, and a changed
argument must never find a kept answer of other arguments.

The reference for each value is the same function evaluated for that cell alone with
every cache emptied (its accuracy is checked against almanacs and skyfield elsewhere).
"""

import numpy as np
import pytest

from calcfuncs import cells, registry, risings, sun, sun_days, windows

FILLS_DOWN = [f for f in registry.FUNCTIONS if f.fills_down]
SITE = (47.3814, 8.0542)  # an invented hill station


def forget():
    cells._SINGLE_CELL_CACHE.clear()
    sun._DAY_CACHE.clear()
    sun_days.forget()
    for cache in (risings._NODE_CACHE, risings._ASTROM_CACHE, windows._NIGHT_CACHE,
                  windows._WINDOW_CACHE):
        cache.clear()


def args_for(fn, value, latitude=SITE[0]):
    if fn.fills_down == "year":
        return [value, "JUNE"]
    if fn.name.startswith("SKY.BODY."):
        return ["MOON", value, latitude, SITE[1], None, 1.0]
    if fn.name.startswith(("SKY.STAR.", "SKY.WINDOW.")):
        # An invented field, high in the evening sky of January.
        return [101.3, 24.6, value, latitude, SITE[1], None, 1.0]
    if fn.name.startswith("SKY.CRESCENT"):
        word = {"SKY.CRESCENT": "ARCV", "SKY.CRESCENT.TIME": "BEST"}.get(fn.name, "YALLOP")
        return [value, latitude, SITE[1], word, None, 1.0]
    if fn.name == "SKY.HELIACAL.STAR":  # Sirius
        return [101.29, -16.72, -1.46, value, latitude, SITE[1], "RISING", None, 1.0]
    if fn.name == "SKY.HELIACAL.PLANET":
        return ["JUPITER", value, latitude, SITE[1], "SETTING", None, 1.0]
    return [value, latitude, SITE[1], None, 1.0]


def alone(fn, value, **kw):
    forget()
    return cells.evaluate(fn, args_for(fn, value, **kw))


def test_the_functions_that_fill_down():
    names = {f.name for f in FILLS_DOWN}
    assert names == {"SKY.SUN.RISE", "SKY.SUN.SET", "SKY.SUN.DAYLENGTH", "SKY.SUN.TRANSIT",
                     "SKY.SEASON", "SKY.SEASON.LENGTH", "SKY.BODY.RISE", "SKY.BODY.SET",
                     "SKY.BODY.TRANSIT", "SKY.STAR.RISE", "SKY.STAR.SET", "SKY.STAR.TRANSIT",
                     "SKY.WINDOW.START", "SKY.WINDOW.END", "SKY.WINDOW.HOURS",
                     "SKY.WINDOW.BEST", "SKY.WINDOW.MOON", "SKY.DARK.START", "SKY.DARK.END",
                     "SKY.DARK.HOURS", "SKY.LUNAR.ECLIPSE.NEXT", "SKY.LUNAR.ECLIPSE.KIND",
                     "SKY.LUNAR.ECLIPSE.MAGNITUDE", "SKY.LUNAR.ECLIPSE.GAMMA",
                     "SKY.LUNAR.ECLIPSE.DURATION", "SKY.LUNAR.ECLIPSE.MOON.ALT",
                     "SKY.LUNAR.ECLIPSE.VISIBILITY", "SKY.CRESCENT", "SKY.CRESCENT.TIME",
                     "SKY.CRESCENT.CRITERION", "SKY.CRESCENT.CLASS", "SKY.HELIACAL.STAR",
                     "SKY.HELIACAL.PLANET"}


@pytest.mark.parametrize("fn", FILLS_DOWN, ids=lambda f: f.name)
@pytest.mark.parametrize("step", [1.0, -1.0])
def test_filled_down_cells_equal_each_cell_alone(fn, step):
    start = 2020.0 if fn.fills_down == "year" else 46023.0  # 2026-01-01
    values = [start + step * k for k in range(40)]
    forget()
    filled = [cells.evaluate(fn, args_for(fn, v)) for v in values]
    # After the second cell the next ones were computed ahead and kept.
    assert all(isinstance(v, (float, str)) for v in filled)
    for v, got in zip(values[::7], filled[::7]):
        assert got == alone(fn, v), (fn.name, v)


def test_rows_ahead_are_kept_after_two_neighbouring_cells():
    fn = registry.BY_NAME["SKY.SUN.SET"]
    forget()
    cells.evaluate(fn, args_for(fn, 46023.0))
    before = len(cells._SINGLE_CELL_CACHE)
    cells.evaluate(fn, args_for(fn, 46024.0))
    assert len(cells._SINGLE_CELL_CACHE) == before + 1 + cells.FILL_AHEAD


def test_a_long_column_gets_longer_blocks_of_the_same_values():
    fn = registry.BY_NAME["SKY.SUN.SET"]
    forget()
    values = [46023.0 + k for k in range(34)]
    filled = [cells.evaluate(fn, args_for(fn, v)) for v in values]
    # Cells 3 to 33 came from the first block; the 34th, computed alone, found a whole
    # block kept behind it and asked for one twice as long (a row of sunset costs far
    # less than FILL_BUDGET_S / 62).
    assert len(cells._SINGLE_CELL_CACHE) == 34 + 2 * cells.FILL_AHEAD
    later = 46023.0 + 34 + 2 * cells.FILL_AHEAD - 1  # the last day of the second block
    kept = cells.evaluate(fn, args_for(fn, later))
    assert len(cells._SINGLE_CELL_CACHE) == 34 + 2 * cells.FILL_AHEAD
    for v, got in ((values[0], filled[0]), (values[20], filled[20]), (values[33], filled[33]),
                   (later, kept)):
        assert got == alone(fn, v), v


def test_a_changed_site_never_finds_the_other_sites_days():
    fn = registry.BY_NAME["SKY.SUN.SET"]
    forget()
    first = [cells.evaluate(fn, args_for(fn, 46023.0 + k)) for k in range(10)]
    moved = [cells.evaluate(fn, args_for(fn, 46023.0 + k, latitude=60.0)) for k in range(10)]
    assert all(a != b for a, b in zip(first, moved))
    for k in (2, 5, 9):
        assert moved[k] == alone(fn, 46023.0 + k, latitude=60.0)


def test_another_null_date_is_another_answer():
    fn = registry.BY_NAME["SKY.SUN.RISE"]
    forget()
    for k in range(5):
        cells.evaluate(fn, args_for(fn, 46023.0 + k))
    other = cells.evaluate(fn, args_for(fn, 46026.0), null_date=(1904, 1, 1))
    forget()
    assert other == cells.evaluate(fn, args_for(fn, 46026.0), null_date=(1904, 1, 1))
    # The same serial is another date under the 1904 null date (2030 instead of 2026):
    # another sunrise, though at nearly the same time of day.
    assert other != cells.evaluate(fn, args_for(fn, 46026.0))


def test_steps_other_than_a_day_compute_nothing_ahead():
    fn = registry.BY_NAME["SKY.SUN.SET"]
    forget()
    for k in range(4):
        cells.evaluate(fn, args_for(fn, 46023.0 + 7.0 * k))
    assert len(cells._SINGLE_CELL_CACHE) == 4
    assert np.isfinite(cells.evaluate(fn, args_for(fn, 46100.0)))


def test_a_full_cache_still_keeps_the_rows_ahead(monkeypatch):
    # When the kept answers reach their bound (a long session), the newest work is still
    # kept (cells.KeptAnswers: the last answers in order of arrival before the rest): the
    # cell above a new one and the rows of a block computed ahead are found, and a month
    # of sunsets filled down takes a few blocks, not a search of its own for every day.
    fn = registry.BY_NAME["SKY.SUN.SET"]
    forget()
    monkeypatch.setattr(cells, "_SINGLE_CELL_CACHE", cells.KeptAnswers(60, recent=40))
    for k in range(60):  # a full cache of other answers
        cells.evaluate("SKY.WRAP.360", [k + 0.5])
    assert len(cells._SINGLE_CELL_CACHE) == 60
    columns = []
    real = cells._evaluate
    monkeypatch.setattr(cells, "_evaluate", lambda f, args, *rest: columns.append(
        any(isinstance(a, tuple) for a in args)) or real(f, args, *rest))
    values = [46023.0 + k for k in range(40)]
    filled = [cells.evaluate(fn, args_for(fn, v)) for v in values]
    assert len(cells._SINGLE_CELL_CACHE) == 60
    assert columns.count(True) <= 3 and columns.count(False) <= 6, columns  # (was 40 and 0)
    for k in (0, 2, 17, 39):
        assert filled[k] == alone(fn, values[k]), k


def test_kept_answers_stay_within_their_bound_and_keep_a_large_sheets_first_cells():
    # cells.KeptAnswers holds at most its size; once full, the older part keeps its first
    # entries (a sheet larger than the bound recalculated top to bottom finds them again)
    # and the recent part the last answers.
    kept = cells.KeptAnswers(100, recent=10)
    for k in range(1000):
        kept.keep(k, float(k))
        assert len(kept) <= 100
    assert all(k in kept for k in range(89)) and all(k in kept for k in range(990, 1000))
    assert kept.get(500) is None and kept.get(995) == 995.0 and kept.get(3) == 3.0
    kept.clear()
    assert len(kept) == 0 and kept.get(995) is None
