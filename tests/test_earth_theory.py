"""The Earth's state from epv00's series evaluated with numpy (calcfuncs/earth_theory.py)
against the IAU's own: SOFA's test value and ERFA epv00 (the open implementation of the
SOFA routine) itself; and the cells built on it, a column against its cells, whichever
evaluation the process has chosen.
"""

from unittest import mock

import erfa
import numpy as np
import pytest

from calcfuncs import cells, earth_theory, nodes

M_PER_AU = 149_597_870_700.0

# SOFA/ERFA's own test of epv00 (t_erfa_c.c in the pyerfa 2.0.1.5 source distribution on
# PyPI, read there), with its tolerances: 1e-14 au in position, 1e-15 au/day in velocity.
SOFA_INSTANT = (2400000.5, 53411.52501161)
SOFA_HELIO_P = (-0.7757238809297706813, 0.5598052241363340596, 0.2426998466481686993)
SOFA_HELIO_V = (-0.1091891824147313846e-1, -0.1247187268440845008e-1, -0.5407569418065039061e-2)
SOFA_BARY_P = (-0.7714104440491111971, 0.5598412061824171323, 0.2425996277722452400)
SOFA_BARY_V = (-0.1091874268116823295e-1, -0.1246525461732861538e-1, -0.5404773180966231279e-2)


@pytest.fixture(params=["numpy", "erfa"])
def evaluation(request):
    """Each of the two evaluations in turn, as if the process had chosen it."""
    with mock.patch.object(earth_theory, "_CHOSEN", [request.param]):
        nodes.forget_single_cells()
        cells._SINGLE_CELL_CACHE.clear()
        yield request.param
    nodes.forget_single_cells()
    cells._SINGLE_CELL_CACHE.clear()


def test_sofa_test_value(evaluation):
    for ep, ev, sp, sv in (earth_theory.states(*SOFA_INSTANT),
                           [np.array(v) for v in earth_theory.states_one(*SOFA_INSTANT)],
                           [np.array(v) for v in earth_theory.states_floats(*SOFA_INSTANT)]):
        assert np.abs(ep - sp - SOFA_HELIO_P).max() < 1e-14
        assert np.abs(ev - sv - SOFA_HELIO_V).max() < 1e-15
        assert np.abs(ep - SOFA_BARY_P).max() < 1e-14
        assert np.abs(ev - SOFA_BARY_V).max() < 1e-15


def test_the_series_with_numpy_within_a_millimetre_of_erfa():
    # Dense random instants over the built-in source's span (1000-3000), two-part dates
    # split as a cell splits them.  Measured: 6.9e-15 au (1 mm) in position, 8.0e-17
    # au/day in velocity (numpy 1.24 and 2.4 alike): the rounding of sums of 500 terms
    # and 1-ulp differences between sine routines, against the series' kilometres.
    rng = np.random.default_rng(29)
    jd = 2451545.0 + rng.uniform(-1000.0, 1000.0, 5_000) * 365.25
    jd1 = np.floor(jd) + 0.5
    jd2 = jd - jd1
    ours = earth_theory._states_numpy(jd1, jd2)
    pvh, pvb, _ = erfa.ufunc.epv00(jd1, jd2)
    want = (pvb["p"], pvb["v"], pvb["p"] - pvh["p"], pvb["v"] - pvh["v"])
    for got, expected, bound in zip(ours, want, (2e-14, 2e-16, 2e-14, 2e-16)):
        assert np.abs(got - expected).max() < bound
    # Not a copy of the other's output: the Earth is an au from the Sun.
    assert np.all(np.linalg.norm(ours[0] - ours[2], axis=-1) > 0.98)


def test_the_points_of_a_segment_within_a_millimetre_of_erfa(evaluation):
    # states_vector (a segment's points, calcfuncs/nodes.py: all points in one pass, with
    # numpy's series or ERFA's routine as the process chose) against ERFA epv00.
    rng = np.random.default_rng(37)
    for _ in range(20):
        jd1 = np.full(20, 2451545.0)
        jd2 = rng.uniform(-1000.0, 1000.0) * 365.25 + np.sort(rng.uniform(0.0, 16.0, 20))
        got = earth_theory.states_vector(jd1, jd2)
        pvh, pvb, _ = erfa.ufunc.epv00(jd1, jd2)
        assert np.abs(got[:, 0:3] - pvb["p"]).max() < 2e-14
        assert np.abs(got[:, 3:6] - pvb["v"]).max() < 2e-16
        assert np.abs(got[:, 6:9] - (pvb["p"] - pvh["p"])).max() < 2e-14
        assert np.abs(got[:, 9:12] - (pvb["v"] - pvh["v"])).max() < 2e-16


def test_a_column_is_its_instants_one_by_one():
    rng = np.random.default_rng(31)
    jd1 = 2451544.5 + np.floor(rng.uniform(-3e5, 3e5, 200))
    jd2 = rng.uniform(0.0, 1.0, 200)
    column = earth_theory._states_numpy(jd1, jd2)
    for k in range(200):
        one = earth_theory.states_one(jd1[k], jd2[k])
        for whole, part in zip(column, one):
            assert whole[k].tolist() == part


def test_the_choice_follows_numpy_and_the_processor():
    assert earth_theory.chosen() == earth_theory.evaluation_for(
        np.__version__, earth_theory.processor_has_avx512_skx())
    assert earth_theory.evaluation_for("1.24.2", True) == "numpy"
    for version, skx in (("1.24.2", False), ("1.26.4", True), ("2.4.6", True), ("1.21.5", True),
                         ("garbled", True)):
        assert earth_theory.evaluation_for(version, skx) == "erfa"


# Cells that take the Earth from the series: a column of instants against each instant
# as a cell alone, to the bit, with either evaluation (the office's numpy 1.24 takes the
# numpy one; the test environment's numpy 2 would take ERFA's).
COLUMN_CASES = [
    ("SKY.SUN.LON", ()),
    ("SKY.MOON.RA", ()),
    ("SKY.PLANET.DEC", ("MARS",)),
    ("SKY.HORIZON.ALT", (150.0, -20.0)),
]


@pytest.mark.parametrize("name, lead", COLUMN_CASES, ids=[c[0] for c in COLUMN_CASES])
def test_column_equals_its_cells(evaluation, name, lead):
    rng = np.random.default_rng(37)
    times = np.round(rng.uniform(30000.0, 60000.0, 40) * 86400e3) / 86400e3
    tail = (47.38, 8.05) if name == "SKY.HORIZON.ALT" else ()
    with mock.patch.object(nodes, "DENSE_CELLS", 10**9):
        column = cells.evaluate(name, lead + (tuple((t,) for t in times.tolist()),) + tail)
        single = [cells.evaluate(name, lead + (t,) + tail) for t in times.tolist()]
    assert [row[0] for row in column] == single
    assert all(isinstance(v, float) for v in single)


def test_seasons_as_a_column_equal_their_cells(evaluation):
    years = [1000.0 + 37.0 * k for k in range(54)]
    column = cells.evaluate("SKY.SEASON", (tuple((y,) for y in years), "JUNE", "TT"))
    single = [cells.evaluate("SKY.SEASON", (y, "JUNE", "TT")) for y in years]
    assert [row[0] for row in column] == single
    assert all(isinstance(v, float) for v in single)
