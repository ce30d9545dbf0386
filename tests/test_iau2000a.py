"""The IAU 2000A nutation of calcfuncs/iau2000a.py against the IAU's own: SOFA's test
value and ERFA nut06a (the open implementation of the IAU SOFA routine) itself.
"""

import math

import erfa
import numpy as np
import pytest

from calcfuncs import frames, iau2000a, obliquity

UAS_PER_RAD = 180.0 / math.pi * 3600e6


def test_sofa_test_value():
    # SOFA/ERFA's test of nut06a at 2400000.5 + 53736.0 TT (t_erfa_c.c, from memory),
    # with SOFA's own tolerance of 1e-13 radian.
    dpsi, deps = iau2000a.nutation_one(2400000.5, 53736.0)
    assert abs(dpsi - -0.9630912025820308797e-5) < 1e-13
    assert abs(deps - 0.4063238496887249798e-4) < 1e-13


@pytest.mark.parametrize("first, last", [(1000.0, 3000.0), (-4000.0, 8000.0)])
def test_within_a_millionth_of_a_microarcsecond_of_erfa(first, last):
    # Dense random instants over the IAU 2006 models' span (1000-3000) and over the
    # places' whole span; split two-part dates as a cell makes them.  Measured: 1.1e-7
    # uas (numpy 1.24) and 7.5e-8 (numpy 2.4) over -4000..8000.
    rng = np.random.default_rng(17)
    jd = 2451545.0 + (rng.uniform(first, last, 20_000) - 2000.0) * 365.25
    jd1 = np.floor(jd) + 0.5
    jd2 = jd - jd1
    dpsi, deps = iau2000a.nutation(jd1, jd2)
    want_dpsi, want_deps = erfa.nut06a(jd1, jd2)
    assert np.max(np.abs(dpsi - want_dpsi)) * UAS_PER_RAD < 1e-6
    assert np.max(np.abs(deps - want_deps)) * UAS_PER_RAD < 1e-6
    # Not a copy of the other: the largest term alone is 17"; 0.1 uas is a term's unit.
    assert np.max(np.abs(dpsi)) * UAS_PER_RAD > 1e7


def test_the_points_of_a_segment_within_a_millionth_of_a_microarcsecond_of_erfa():
    # nutation_vector (a segment's points, calcfuncs/nodes.py: all points in one pass)
    # against ERFA nut06a, over the places' whole span.  Measured: 7.0e-8 uas (numpy 2.4).
    rng = np.random.default_rng(19)
    for _ in range(20):
        jd1 = np.full(20, 2451545.0)
        jd2 = rng.uniform(-6000.0, 6000.0) * 365.25 + np.sort(rng.uniform(0.0, 16.0, 20))
        got = iau2000a.nutation_vector(jd1, jd2)
        want_dpsi, want_deps = erfa.nut06a(jd1, jd2)
        assert np.max(np.abs(got[:, 0] - want_dpsi)) * UAS_PER_RAD < 1e-6
        assert np.max(np.abs(got[:, 1] - want_deps)) * UAS_PER_RAD < 1e-6


def test_a_column_gives_each_instant_what_it_gives_alone():
    rng = np.random.default_rng(3)
    jd1 = np.full((40, 2), 2451545.0)
    jd2 = rng.uniform(-40_000.0, 40_000.0, (40, 2))
    dpsi, deps = iau2000a.nutation(jd1, jd2)
    assert dpsi.shape == deps.shape == (40, 2)
    for i in range(40):
        for j in range(2):
            assert (dpsi[i, j], deps[i, j]) == iau2000a.nutation_one(jd1[i, j], jd2[i, j])
    # Scalars and one date against many (broadcast), as the callers pass them.
    one = iau2000a.nutation(2451545.0, 100.25)
    assert np.shape(one[0]) == () and float(one[0]) == iau2000a.nutation_one(2451545.0, 100.25)[0]
    many = iau2000a.nutation(2451545.0, jd2[:, 0])
    assert np.array_equal(many[0], dpsi[:, 0])
    # A date that is not a number gives NaN, as ERFA's routine does, never an exception.
    for bad in (np.nan, np.inf, -np.inf):
        assert np.isnan(iau2000a.nutation(np.array([bad, 2451545.0]), 0.0)[0]).tolist() == [True, False]
        with np.errstate(invalid="ignore"):
            assert np.isnan(erfa.nut06a(bad, 0.0)[0])


def test_the_true_systems_and_the_obliquity_take_this_series():
    # The true equator and equinox of date as ERFA pnm06a builds it, with this nutation:
    # within 1e-14 of pnm06a's own matrix (a rotation's elements; 2 uas would be 1e-11).
    rng = np.random.default_rng(8)
    jd1 = np.full(300, 2451545.0)
    jd2 = rng.uniform(-300_000.0, 300_000.0, 300)
    m = frames.system_matrix("EQUATORIAL TRUE", jd1, jd2)
    assert np.max(np.abs(m - erfa.pnm06a(jd1, jd2))) < 1e-14
    assert np.array_equal(obliquity.nutation_angles(jd1, jd2)[1], iau2000a.nutation(jd1, jd2)[1])
