"""The next event after an instant, found in canonical windows (events.first_after) and
kept across calls: every cell must give the value it gives alone with every cache
emptied, whichever cells came before it, and the value a whole column gives; a changed
argument or source never finds the roots of another.

The reference for each value is the same function evaluated for that cell alone with
every cache emptied (the accuracy of the events themselves is checked against skyfield
and almanacs in test_moon.py, test_planets.py and test_sun.py, unchanged).
"""

import numpy as np
import pytest

from calcfuncs import cells, events

# Invented log instants: Calc date-time values in 2025-2027, unsorted, some in one block.
RNG = np.random.default_rng(7)
INSTANTS = np.r_[45658.0 + RNG.uniform(0.0, 3 * 365.0, 40), 46000.25 + RNG.uniform(0.0, 3.0, 10)]

CASES = {
    "SKY.MOON.PHASE.NEXT": lambda t: [t, "UTC", "FULL"],
    "SKY.PLANET.EVENT.NEXT": lambda t: ["MARS", t, "UTC", "CONJUNCTION"],
    "SKY.SUN.REACHES": lambda t: [141.5, t, "UTC"],
}


def forget():
    cells._SINGLE_CELL_CACHE.clear()
    events._WINDOWS.clear()


def alone(name, t):
    forget()
    return cells.evaluate(name, CASES[name](float(t)))


@pytest.mark.parametrize("name", sorted(CASES))
def test_each_cell_equals_itself_alone_and_the_column(name):
    expected = [alone(name, t) for t in INSTANTS]
    assert all(isinstance(v, float) for v in expected), expected[:3]
    forget()
    # Cell after cell, in the log's order: later cells find their windows kept.
    in_order = [cells.evaluate(name, CASES[name](float(t))) for t in INSTANTS]
    assert len(events._WINDOWS) < INSTANTS.size  # windows were shared
    assert in_order == expected
    # In the opposite order, with the answers of cells forgotten but the windows kept.
    cells._SINGLE_CELL_CACHE.clear()
    backwards = [cells.evaluate(name, CASES[name](float(t))) for t in INSTANTS[::-1]][::-1]
    assert backwards == expected
    forget()
    column = tuple((float(t),) for t in INSTANTS)
    args = CASES[name](0.0)
    k = args.index(0.0)
    args[k] = column
    assert [r[0] for r in cells.evaluate(name, args)] == expected


@pytest.mark.parametrize("name", sorted(CASES))
def test_every_answer_is_after_its_instant_and_the_next_one(name):
    # The first event after the instant: later than it, and no event of the kind
    # between (searching from just after the previous answer finds the same event).
    for t in INSTANTS[:12]:
        answer = alone(name, t)
        assert answer > t
        assert alone(name, answer - 1e-5) == pytest.approx(answer, abs=2e-8)


def test_another_argument_or_source_never_finds_the_kept_roots():
    forget()
    t = float(INSTANTS[0])
    full = cells.evaluate("SKY.MOON.PHASE.NEXT", [t, "UTC", "FULL"])
    new = cells.evaluate("SKY.MOON.PHASE.NEXT", [t, "UTC", "NEW"])
    assert abs(full - new) > 1.0
    forget()
    cells.evaluate("SKY.MOON.PHASE.NEXT", [t, "UTC", "FULL"])
    assert cells.evaluate("SKY.MOON.PHASE.NEXT", [t, "UTC", "NEW"]) == new
    # Another source: the DE440 excerpt gives its own roots, never the built-in ones kept
    # before (they differ by seconds: ERFA moon98 is good to about 10", and the Moon's
    # elongation grows about 0.5" a second).
    builtin = cells.evaluate("SKY.MOON.PHASE.NEXT", [t, "UTC", "FULL"])
    de440 = cells.evaluate("SKY.MOON.PHASE.NEXT", [t, "UTC", "FULL", None, "DE440"])
    assert isinstance(de440, float) and de440 != builtin
    assert abs(de440 - builtin) * 86400.0 < 60.0
    forget()
    assert cells.evaluate("SKY.MOON.PHASE.NEXT", [t, "UTC", "FULL", None, "DE440"]) == de440
    # Other longitudes reached by the Sun: other roots.
    a = cells.evaluate("SKY.SUN.REACHES", [141.5, t, "UTC"])
    b = cells.evaluate("SKY.SUN.REACHES", [141.6, t, "UTC"])
    assert 0.05 < abs(b - a) < 0.2


def test_the_kept_windows_stay_bounded(monkeypatch):
    monkeypatch.setattr(events, "WINDOW_CACHE_SIZE", 20)
    forget()
    many = tuple((float(t),) for t in 45658.0 + np.arange(0.0, 3650.0, 9.0))
    out = cells.evaluate("SKY.MOON.PHASE.NEXT", [many, "UTC", "FULL"])
    assert len(events._WINDOWS) <= 20
    assert all(isinstance(r[0], float) for r in out)
