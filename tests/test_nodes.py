"""Interpolation over nodes and segments (calcfuncs/nodes.py) against the direct
computation.

The reference is ERFA itself (nut06a, epv00: the IAU 2000A/2006 nutation and the
VSOP2000-based Earth of the SOFA/ERFA standard) evaluated at every instant; the
interpolated column must stay within the bounds stated in nodes.py.
"""

import math
import warnings
from unittest import mock

import erfa
import numpy as np
import pytest

from calcfuncs import bodies, cells, earth_theory, ephemeris, frames, iau2000a, nodes

UAS_PER_RAD = np.degrees(1.0) * 3.6e9
AU_M = erfa.DAU


def dense_instants(seed, clusters=60, per_cluster=400, years=(1000.0, 3000.0)):
    """Clusters of instants a few days long (as an observing log has them) at random
    dates in the span, as two-part TT JDs."""
    rng = np.random.default_rng(seed)
    lo = erfa.DJ00 + (years[0] - 2000.0) * erfa.DJY
    hi = erfa.DJ00 + (years[1] - 2000.0) * erfa.DJY
    centres = np.floor(rng.uniform(lo, hi, clusters)) + 0.5
    jd1 = np.repeat(centres, per_cluster)
    jd2 = rng.uniform(-3.0, 3.0, jd1.size)
    return jd1, jd2


def test_a_dense_column_is_interpolated_and_a_sparse_one_is_not():
    jd1, jd2 = dense_instants(1)
    assert nodes.dense(jd1, jd2) is not None
    rng = np.random.default_rng(2)
    spread = rng.uniform(2451545.0 - 36500.0, 2451545.0 + 36500.0, 5000)
    assert nodes.dense(spread, np.zeros(spread.shape)) is None
    assert nodes.dense(jd1[:50], jd2[:50]) is None  # too short to be worth it


def test_nutation_over_nodes_within_its_bound():
    # nodes.py states 1.5 uas (measured 1.13 uas in dpsi, 0.51 in deps, four seeds).
    jd1, jd2 = dense_instants(3)
    dpsi, deps = frames.nutation_over_nodes(jd1, jd2)
    dpsi0, deps0 = erfa.nut06a(jd1, jd2)
    assert nodes.dense(jd1, jd2) is not None
    assert np.max(np.abs(dpsi - dpsi0)) * UAS_PER_RAD < 1.5
    assert np.max(np.abs(deps - deps0)) * UAS_PER_RAD < 1.5


def test_earth_state_over_nodes_within_its_bound():
    # nodes.py states 0.5 m in position and 3 um/s in velocity (measured 0.41 m and
    # 2.1 um/s, four seeds).
    jd1, jd2 = dense_instants(4)
    (ep, ev), (sp, sv) = ephemeris.get("BUILTIN").earth_and_sun(jd1, jd2)
    with np.errstate(all="ignore"), pytest.warns(erfa.ErfaWarning):
        pvh, pvb = erfa.epv00(jd1, jd2)
    au_per_day_to_m_per_s = AU_M / erfa.DAYSEC
    assert np.max(np.abs(ep - pvb["p"])) * AU_M < 0.5
    assert np.max(np.abs((ep - sp) - pvh["p"])) * AU_M < 0.5
    assert np.max(np.abs(ev - pvb["v"])) * au_per_day_to_m_per_s < 3e-6
    assert np.max(np.abs((ev - sv) - pvh["v"])) * au_per_day_to_m_per_s < 3e-6


def test_a_true_matrix_alone_is_erfa_pnm06a():
    # Built from pnm06a's own steps and the same series (iau2000a.py, within 1e-6 uas of
    # ERFA's: 1e-14 of a matrix element); a date alone never takes the nodes.
    jd1, jd2 = dense_instants(5, clusters=3, per_cluster=5)
    m = frames.system_matrix("EQUATORIAL TRUE", jd1, jd2)
    assert np.max(np.abs(m - erfa.pnm06a(jd1, jd2))) < 1e-14


def column(values):
    return tuple((float(v),) for v in values)


@pytest.mark.parametrize("name, extra", [
    ("SKY.SUN.LON", ["UTC", "TRUE", "APPARENT"]),
    ("SKY.SUN.RA", ["UTC", "TRUE", "APPARENT"]),
    ("SKY.MOON.LON", ["UTC", "TRUE", "APPARENT"]),
    ("SKY.PLANET.RA", ["UTC", "TRUE", "APPARENT"]),
])
def test_a_dense_column_agrees_with_each_cell_alone(name, extra):
    # A dense column is interpolated; a cell alone is computed directly or, one of a
    # dense run of cells, interpolated too (nodes.for_one): they differ by the bounds
    # above, under 2 uas in a place (a column of 2,000 instants over ten days).
    rng = np.random.default_rng(6)
    serials = 46000.0 + rng.uniform(0.0, 10.0, 2000)
    body = ["MARS"] if name.startswith("SKY.PLANET") else []
    args = lambda t: [*body, t, *extra]  # noqa: E731
    whole = np.array([r[0] for r in cells.evaluate(name, args(column(serials)))])
    alone = np.array([cells.evaluate(name, args(float(s))) for s in serials[::50]],
                     dtype=float)
    difference = np.abs((whole[::50] - alone + 180.0) % 360.0 - 180.0) * 3.6e9
    assert np.max(difference) < 2.0


# ---- single cells of a dense log (nodes.for_one: Chebyshev segments) ---------------------


def log_instants(seed, n=3000, per_day=9.0, start=2451545.0):
    """A log's instants, about ``per_day`` a day, as one-row two-part TT JDs in the
    order a sheet computes them (row by row; the log itself in time order)."""
    rng = np.random.default_rng(seed)
    t = start + np.sort(rng.uniform(0.0, n / per_day, n))
    return [(np.array([np.floor(v)]), np.array([v - np.floor(v)])) for v in t]


def test_dense_single_cells_take_their_segments_within_the_bounds():
    # nodes.py states 0.1 uas for the nutation, 1 m and 1 um/s for the Earth, against
    # ERFA's own nut06a and epv00 at each instant, over logs at the start of the IAU
    # models' range, near J2000 and near their end; two a day is dense.
    interpolated = 0
    worst = np.zeros(4)
    with nodes.single_cells():
        for seed, start in ((1, 2086500.5), (2, 2451545.0), (3, 2816500.5)):
            for j1, j2 in log_instants(seed, n=1500, per_day=2.0, start=start):
                # (the functions the cells' segments take: their slow terms from long
                # segments, nodes.over_long_segment)
                got = nodes.for_one("nut06a", iau2000a.nutation_at_points, j1, j2)
                earth = nodes.for_one("epv00", ephemeris.earth_and_sun_at_points, j1, j2)
                if got is None:
                    assert earth is None  # one decision per instant
                    continue
                interpolated += 1
                dpsi, deps = erfa.nut06a(j1, j2)
                with np.errstate(all="ignore"), warnings.catch_warnings():
                    warnings.simplefilter("ignore", erfa.ErfaWarning)
                    pvh, pvb = erfa.epv00(j1, j2)
                sun = earth[0, 6:9] - (pvb["p"][0] - pvh["p"][0])
                worst = np.maximum(worst, [
                    max(abs(got[0, 0] - dpsi[0]), abs(got[0, 1] - deps[0])) * UAS_PER_RAD,
                    np.max(np.abs(earth[0, 0:3] - pvb["p"][0])) * AU_M,
                    np.max(np.abs(earth[0, 3:6] - pvb["v"][0])) * AU_M / erfa.DAYSEC,
                    np.max(np.abs(sun)) * AU_M])
    assert worst[0] < 0.1, worst       # uas
    assert worst[1] < 1.0, worst       # m
    assert worst[2] < 1e-6, worst      # m/s
    assert worst[3] < 1.0, worst       # m
    # All but the first DENSE_CELLS - 1 cells of each segment take it: 2,250 instants
    # over 70 segments of 16 days.
    assert interpolated > 0.9 * 4500


def segment_points(segments):
    """The points of the given segments (numbers from J2000.0), as nodes.py hands them
    to a segment's computation: (jd1, jd2) arrays, jd2 the very array _POINT_DAYS."""
    for segment in segments:
        yield (np.full(nodes.SEGMENT_POINTS, nodes.SEGMENT_ORIGIN + segment * nodes.SEGMENT_DAYS),
               nodes._POINT_DAYS)


def test_the_slow_terms_from_long_segments_within_their_bounds():
    # At a segment's points the terms of periods over 40 days come from a long segment
    # (nodes.over_long_segment): against ERFA's own nut06a and epv00 at the same points,
    # over 1000-3000, within the bounds nodes.py states (0.1 uas; 1 m and 1 um/s).
    # Measured 2026-12-05: 1e-4 uas, 0.26 m, 0.05 um/s, the last two the series' own
    # rounding far from J2000 (tens of mm near it).
    rng = np.random.default_rng(40)
    worst = np.zeros(3)
    for jd1, jd2 in segment_points(rng.integers(-22_800, 22_800, 150)):
        dpsi, deps = erfa.nut06a(jd1, jd2)
        got = iau2000a.nutation_at_points(jd1, jd2)
        with np.errstate(all="ignore"), warnings.catch_warnings():
            warnings.simplefilter("ignore", erfa.ErfaWarning)
            pvh, pvb = erfa.epv00(jd1, jd2)
        earth = earth_theory.states_at_points(jd1, jd2)
        worst = np.maximum(worst, [
            max(np.abs(got[:, 0] - dpsi).max(), np.abs(got[:, 1] - deps).max()) * UAS_PER_RAD,
            max(np.abs(earth[:, 0:3] - pvb["p"]).max(),
                np.abs(earth[:, 6:9] - (pvb["p"] - pvh["p"])).max()) * AU_M,
            np.abs(earth[:, 3:6] - pvb["v"]).max() * AU_M / erfa.DAYSEC])
    assert worst[0] < 0.1, worst   # uas
    assert worst[1] < 1.0, worst   # m
    assert worst[2] < 1e-6, worst  # m/s
    assert nodes._LONG  # the long segments were made


def test_other_instants_than_a_segments_points_take_the_whole_series():
    # over_long_segment answers only for a segment's own points; other instants get
    # every term evaluated at them.
    jd1, jd2 = np.full(5, 2460000.5), np.linspace(0.0, 3.0, 5)
    assert nodes.over_long_segment("x", lambda a, b: 1 / 0, jd1, jd2) is None
    assert np.array_equal(iau2000a.nutation_at_points(jd1, jd2),
                          iau2000a.nutation_vector(jd1, jd2))
    assert np.array_equal(earth_theory.states_at_points(jd1, jd2),
                          earth_theory.states_vector(jd1, jd2))


def place_in_cells(body, kind, system, instants, index=0):
    """The longitude (``index`` 0) or latitude of cells of a log at ``instants`` (TT JDs
    as floats) inside single_cells, as the float lane computes them; and the same
    computed directly (no segment)."""
    got, direct = [], []
    for t in instants:
        t1 = math.floor(t - 0.5) + 0.5  # as a cell has its instant: the day, the fraction
        t2 = t - t1
        with nodes.single_cells():
            got.append(bodies.one_on_floats(body, t1, t2, system, kind, index))
        direct.append(bodies._value_floats(
            lambda a, b, dense: bodies._direction_floats(body, a, b, kind, False),
            t1, t2, system, index))
    return np.array(got), np.array(direct)


@pytest.mark.parametrize("body", sorted(bodies.PLACE_SEGMENT_BODIES))
def test_a_bodys_place_from_its_segments_within_its_bound(body):
    # A log of one body's place at ten instants a day takes it from segments of its
    # own (bodies._place_at_points): within 0.5 uas of the direct place over 1900-2100,
    # and within 3 uas over 1000-3000, where the direct place itself jitters from one
    # instant to the next by the rounding of its theory's arguments (measured
    # 2026-12-05, as the scatter of 400 direct places over half a day about a smooth
    # fit: Venus 0.008 uas at J2000, 1.7 uas in 2954; the largest differences here 0.43
    # and 2.5 uas, Venus's longitude).  The Moon's, on its finer grid: within 1 and 5 uas
    # (0.52 and 3.3 measured; its direct place jitters by 3.9 uas about 1000 and 2950).
    rng = np.random.default_rng(len(body))
    worst, made = {}, 0
    for era, (lo, hi) in (("1900-2100", (2415020.5, 2488070.5)),
                          ("1000-3000", (2086302.5, 2816787.5))):
        for kind in ("APPARENT", "ASTROMETRIC", "GEOMETRIC"):
            for system in ("ECLIPTIC TRUE", "EQUATORIAL TRUE", "ICRS"):
                nodes.forget_single_cells()
                start = rng.uniform(lo, hi)
                instants = start + np.sort(rng.uniform(0.0, 40.0, 400))
                for index in (0, 1):  # (a longitude's difference, not its angle on the sky)
                    got, direct = place_in_cells(body, kind, system, instants, index)
                    difference = np.abs((got - direct + 180.0) % 360.0 - 180.0) * 3.6e9
                    worst[era] = max(worst.get(era, 0.0), difference.max())
                places = [table.size for (quantity, _), table in nodes._SEGMENTS.items()
                          if type(quantity) is tuple and quantity[0] == "place"]
                assert places  # made (or, near the Sun, declined: an empty table)
                made += sum(size > 0 for size in places)
    assert made >= 10
    modern, far = (1.0, 5.0) if body == "MOON" else (0.5, 3.0)
    assert worst["1900-2100"] < modern, worst
    assert worst["1000-3000"] < far, worst


def test_a_planet_near_the_sun_keeps_its_place_off_segments():
    # Light passing near the Sun is bent by an amount that changes too sharply to be
    # interpolated: a segment in which a planet's apparent place comes within
    # PLACE_SEGMENT_MIN_ELONGATION_DEG of the Sun is declined (kept as an empty table),
    # and its cells take the Earth's and the matrix's segments, within 1 uas of the
    # direct place.  Mercury crossed the Sun's disc on 2019 November 11 (a transit
    # listed in the almanacs; common knowledge).
    nodes.forget_single_cells()
    transit = 2458798.5
    instants = transit - 8.0 + np.sort(np.random.default_rng(11).uniform(0.0, 16.0, 200))
    got, direct = place_in_cells("MERCURY", "APPARENT", "ECLIPTIC TRUE", instants)
    assert np.abs(got - direct).max() * 3.6e9 < 1.0
    tables = {segment: table.size for (quantity, segment), table in nodes._SEGMENTS.items()
              if quantity == ("place", "MERCURY", "APPARENT", "ECLIPTIC TRUE")}
    assert tables[nodes._segment_of(transit, 0.0)] == 0
    # The astrometric place has no deflection: segments of it are made.
    nodes.forget_single_cells()
    got, direct = place_in_cells("MERCURY", "ASTROMETRIC", "ECLIPTIC TRUE", instants)
    assert np.abs(got - direct).max() * 3.6e9 < 0.5
    assert any(table.size > 0 for (quantity, _), table in nodes._SEGMENTS.items()
               if type(quantity) is tuple and quantity[0] == "place")


@pytest.mark.parametrize("body", ["MERCURY", "VENUS", "MARS", "SATURN"])
def test_a_planet_a_few_degrees_from_the_sun_keeps_its_bound_on_segments(body):
    # Down to PLACE_SEGMENT_MIN_ELONGATION_DEG (3 degrees) a planet's apparent place is
    # taken from its segments wherever their Chebyshev tail passes: the first segments
    # of 2000-2030 whose place comes within 3 to 10 degrees of the Sun are made, and
    # their cells stay within 0.5 uas of the direct place, as elsewhere.
    d = nodes._POINT_DAYS
    found = []
    for segment in range(0, 700):
        jd1 = np.full(nodes.SEGMENT_POINTS, nodes.SEGMENT_ORIGIN + segment * nodes.SEGMENT_DAYS)
        states = ephemeris.earth_and_sun_at_points(jd1, d)
        u = bodies._directions_at_points(body, "APPARENT", jd1, d, states)
        g = states[:, 6:9] - states[:, 0:3]
        closest = np.degrees(np.arccos(
            (np.einsum("ni,ni->n", u, g) / np.linalg.norm(g, axis=1)).max()))
        if 3.5 < closest < 9.5 and np.abs(nodes.chebyshev_tail(u, d)).max() < bodies.PLACE_SEGMENT_TAIL:
            found.append(segment)
            if len(found) == 3:
                break
    assert len(found) == 3
    for segment in found:
        nodes.forget_single_cells()
        start = nodes.SEGMENT_ORIGIN + segment * nodes.SEGMENT_DAYS
        instants = start + np.sort(np.random.default_rng(segment).uniform(0.0, 16.0, 120))
        got, direct = place_in_cells(body, "APPARENT", "ECLIPTIC TRUE", instants)
        assert np.abs(got - direct).max() * 3.6e9 < 0.5, segment
        made = nodes._SEGMENTS[(("place", body, "APPARENT", "ECLIPTIC TRUE"), segment)]
        assert made.size > 0, segment


def test_one_cell_of_a_body_among_a_dense_log_of_another_makes_no_segment():
    # A place's own segment is made when DENSE_CELLS instants ask for that place in it
    # (or its neighbour has one): one Neptune cell in each segment of a dense log of the
    # Sun is computed from the Earth's and the matrix's segments, not from twenty
    # points of its own.
    nodes.forget_single_cells()
    cells._SINGLE_CELL_CACHE.clear()
    rng = np.random.default_rng(13)
    serials = 45300.0 + np.sort(rng.uniform(0.0, 160.0, 400))
    for k, s in enumerate(serials):
        cells.evaluate("SKY.SUN.LON", [float(s)])
        if k % 40 == 20:
            cells.evaluate("SKY.PLANET.RA", ["NEPTUNE", float(s)])
    quantities = {quantity for quantity, _ in nodes._SEGMENTS}
    assert ("place", "SUN", "APPARENT", "ECLIPTIC TRUE") in quantities
    assert not any(type(q) is tuple and q[1] == "NEPTUNE" for q in quantities)
    assert "epv00" in quantities  # Neptune's cells on the Earth's segments


@pytest.mark.parametrize("orbit", ["CERES", "NEO"])
def test_a_dense_log_of_a_two_body_orbit_takes_its_place_from_segments(orbit):
    # A minor planet's log (Ceres's MPC line, and an NEO-like orbit, both from
    # test_smallbodies.py) takes its place from segments of its own, kept under the
    # name its elements are given (bodies._ORBIT_NAMES): within 0.5 uas of the cells
    # computed directly (0.07 measured).
    import test_smallbodies

    line = getattr(test_smallbodies, orbit)
    rng = np.random.default_rng(15)
    serials = 45300.0 + np.sort(rng.uniform(0.0, 80.0, 400))
    got = np.array([cells.evaluate("SKY.ORBIT.RA", [line, float(s)]) for s in serials])
    places = [quantity for quantity, _ in nodes._SEGMENTS
              if type(quantity) is tuple and quantity[0] == "place"]
    from calcfuncs import mpcformat

    name = bodies._ORBIT_NAMES[mpcformat.orbits_of(line).elements_floats(0)]
    assert len(places) >= 4 and all(q[1] == name for q in places)
    cells._SINGLE_CELL_CACHE.clear()
    with mock.patch.object(nodes, "DENSE_CELLS", 10**9):
        nodes.forget_kept_instants()
        direct = np.array([cells.evaluate("SKY.ORBIT.RA", [line, float(s)]) for s in serials])
    difference = np.abs((got - direct + 180.0) % 360.0 - 180.0) * 3.6e9
    assert difference.max() < 0.5
    assert np.count_nonzero(got != direct) > 300


def test_two_orbits_in_one_log_keep_segments_of_their_own():
    # Rows of two minor planets interleaved (test_smallbodies.py's Ceres and NEO-like
    # lines): each orbit's places are kept under a name of its own, and each cell gives
    # what it gives in a log of its orbit alone.
    import test_smallbodies

    rng = np.random.default_rng(17)
    serials = 45300.0 + np.sort(rng.uniform(0.0, 80.0, 400))
    lines = (test_smallbodies.CERES, test_smallbodies.NEO)
    together = [cells.evaluate("SKY.ORBIT.RA", [lines[k % 2], float(s)])
                for k, s in enumerate(serials)]
    names = {q[1] for q, _ in nodes._SEGMENTS if type(q) is tuple and q[0] == "place"}
    assert len(names) == 2
    for k in (0, 1):
        nodes.forget_single_cells()
        cells._SINGLE_CELL_CACHE.clear()
        alone = [cells.evaluate("SKY.ORBIT.RA", [lines[k], float(s)]) for s in serials[k::2]]
        difference = np.abs((np.array(together[k::2]) - alone + 180.0) % 360.0 - 180.0)
        assert difference.max() * 3.6e9 < 0.5


def test_a_place_whose_chebyshev_tail_is_too_large_is_declined(monkeypatch):
    # A segment whose last coefficients exceed PLACE_SEGMENT_TAIL (as an orbit passing
    # close to the Earth would have them) is declined: shrunk to nothing here, every
    # place segment is, and the cells answer from the Earth's and the matrix's segments,
    # within 1 uas of the direct values.
    monkeypatch.setattr(bodies, "PLACE_SEGMENT_TAIL", 0.0)
    rng = np.random.default_rng(16)
    serials = 45300.0 + np.sort(rng.uniform(0.0, 80.0, 300))
    got = np.array([cells.evaluate("SKY.SUN.LON", [float(s)]) for s in serials])
    tables = [table.size for (quantity, _), table in nodes._SEGMENTS.items()
              if type(quantity) is tuple and quantity[0] == "place"]
    assert tables and not any(tables)
    assert "epv00" in {quantity for quantity, _ in nodes._SEGMENTS}
    cells._SINGLE_CELL_CACHE.clear()
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    nodes.forget_kept_instants()
    direct = np.array([cells.evaluate("SKY.SUN.LON", [float(s)]) for s in serials])
    assert np.abs(got - direct).max() * 3.6e9 < 1.0


def test_the_matrices_of_dense_single_cells_within_their_bound():
    # nodes.py states 0.1 uas for a dated system's matrix from its segment (0.07
    # measured), against the direct IAU 2006/2000A matrix of one instant
    # (frames._dated_one: ERFA pfw06 and fw2m with the series of iau2000a.py), over logs
    # at the ends of the IAU models' range and near J2000.
    worst = {}
    with nodes.single_cells():
        for seed, start in ((6, 2086500.5), (7, 2451545.0), (8, 2816500.5)):
            for j1, j2 in log_instants(seed, n=300, per_day=2.0, start=start):
                t1, t2 = float(j1[0]), float(j2[0])
                if not nodes.cell_is_dense(t1, t2):
                    continue
                for system in sorted(frames.DATED):
                    got = np.array(frames.matrix_rows(system, t1, t2, True))
                    direct = np.array(frames._dated_one(system, t1, t2))
                    worst[system] = max(worst.get(system, 0.0),
                                        np.max(np.abs(got - direct)) * UAS_PER_RAD)
    assert set(worst) == set(frames.DATED)
    assert max(worst.values()) < 0.1, worst


def test_two_systems_matrices_share_the_nutation_at_their_points(monkeypatch):
    # A log's longitude and declination ask for two systems' matrices over the same
    # segment: the nutation series runs once over its points (nodes.shared_at_points),
    # and each matrix is what it is computed alone.
    calls = []
    real = iau2000a.nutation_at_points
    monkeypatch.setattr(iau2000a, "nutation_at_points",
                        lambda a, b: calls.append(1) or real(a, b))
    t1, t2s = 2460000.5, [0.1, 0.2, 0.3, 0.4]
    with nodes.single_cells():
        for t2 in t2s:
            nodes.cell_is_dense(t1, t2)
        shared = {system: frames.matrix_rows(system, t1, 0.4, True)
                  for system in ("ECLIPTIC TRUE", "EQUATORIAL TRUE")}
    assert len(calls) == 1
    nodes.forget_single_cells()  # and again, each system alone
    for system, rows in shared.items():
        with nodes.single_cells():
            for t2 in t2s:
                nodes.cell_is_dense(t1, t2)
            assert frames.matrix_rows(system, t1, 0.4, True) == rows
        nodes.forget_single_cells()
    assert len(calls) == 3


def test_a_segments_values_follow_the_series_inside_it():
    # Nodes.py's own points of a segment give the series' values (Chebyshev interpolation
    # passes through them), and its ends join the next segment's within the bounds.
    with nodes.single_cells():
        for k in range(nodes.DENSE_CELLS):  # make the segment at J2000.0 dense
            nodes.for_one("nut06a", iau2000a.nutation_vector, np.array([2451545.0]),
                          np.array([0.1 * k]))
        for k in range(nodes.DENSE_CELLS):
            nodes.for_one("nut06a", iau2000a.nutation_vector, np.array([2451545.0]),
                          np.array([16.0 + 0.1 * k]))
        ends = []
        for t2 in (16.0 - 1e-9, 16.0):
            nodes._LAST_ONE[0] = (None, None, None, False)
            ends.append(nodes.for_one("nut06a", iau2000a.nutation_vector,
                                      np.array([2451545.0]), np.array([t2]))[0])
    assert np.max(np.abs(ends[0] - ends[1])) * UAS_PER_RAD < 0.1
    # The segment at J2000.0 alone, then the next one with the rest of its long segment
    # in one run (the log moved on into it): segments 0 to 7.
    assert sorted(segment for _, segment in nodes._SEGMENTS) == list(range(nodes.LONG_SEGMENT_OF))


def test_a_log_filled_down_makes_each_next_segment_at_its_first_cell():
    # A log of two instants a day over three segments: the first DENSE_CELLS - 1 cells
    # of the first segment are computed directly, every later one takes its segment,
    # the first cell of each next segment included.  A sparse stretch beside a dense
    # segment (one instant in each of the next three) makes only the segment next to it.
    start = nodes.SEGMENT_ORIGIN + 100 * nodes.SEGMENT_DAYS
    log = [start + 0.5 * k + 0.1 for k in range(int(3 * nodes.SEGMENT_DAYS / 0.5))]
    decided = [nodes._dense_cell(t, 0.0) is not None for t in log]
    first = nodes.DENSE_CELLS - 1
    assert decided == [False] * first + [True] * (len(log) - first)
    later = start + 50 * nodes.SEGMENT_DAYS
    for k in range(nodes.DENSE_CELLS):  # a dense segment
        assert (nodes._dense_cell(later + 0.2 * k, 0.0) is not None) == (k == first)
    sparse = [nodes._dense_cell(later + 0.5 + j * nodes.SEGMENT_DAYS, 0.0) is not None
              for j in (1, 2, 3)]
    assert sparse == [True, False, False]


def test_sparse_single_cells_and_calls_outside_cells_are_computed_directly():
    with nodes.single_cells():
        for k in range(200):  # one instant every 9 days: at most two in a segment
            j1, j2 = np.array([2451545.0 + 9 * k]), np.array([0.3])
            assert nodes.for_one("nut06a", iau2000a.nutation_vector, j1, j2) is None
    for j1, j2 in log_instants(5, n=200):  # dense, but not inside single_cells()
        assert nodes.for_one("nut06a", iau2000a.nutation_vector, j1, j2) is None
    assert nodes._SEGMENTS == {}


@pytest.mark.parametrize("name, body", [("SKY.SUN.LON", []), ("SKY.SUN.DEC", []),
                                        ("SKY.MOON.RA", []), ("SKY.MOON.LAT", []),
                                        ("SKY.PLANET.RA", ["JUPITER"]),
                                        ("SKY.PLANET.LON", ["MERCURY"])])
def test_a_dense_log_of_cells_agrees_with_each_cell_computed_directly(name, body, monkeypatch):
    # The places of a log of 600 instants, two a day, filled down one cell at a time:
    # within 1 uas of the same cells computed directly (DENSE_CELLS out of reach), and
    # most of them from segments.
    rng = np.random.default_rng(9)
    serials = 45300.0 + np.sort(rng.uniform(0.0, 600 / 2.0, 600))
    got = np.array([cells.evaluate(name, [*body, float(s)]) for s in serials])
    made = [key[0] for key, _ in nodes._SEGMENTS.items()]
    if (body or [name.split(".")[1]])[0] in bodies.PLACE_SEGMENT_BODIES:  # the place, 19 or 20
        assert sum(type(q) is tuple and q[0] == "place" for q in made) >= 18
    else:  # the Earth and the system's matrix
        assert made.count("epv00") >= 18 and len(made) >= 2 * 18
    monkeypatch.setattr(cells, "_SINGLE_CELL_CACHE", cells.KeptAnswers())
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    nodes.forget_kept_instants()  # the places kept for a row's other columns, too
    direct = np.array([cells.evaluate(name, [*body, float(s)]) for s in serials])
    difference = np.abs((got - direct + 180.0) % 360.0 - 180.0) * 3.6e9
    assert np.max(difference) < 1.0
    assert np.count_nonzero(got != direct) > 300  # those from segments differ, slightly


def test_single_cell_segments_stay_within_their_bounds(monkeypatch):
    # The kept segments and noted instants never outgrow their sizes (shrunk here so that
    # a few thousand cells fill them many times over), and the answers stay within the
    # bounds while entries are dropped.
    monkeypatch.setattr(nodes, "SEGMENTS_KEPT", 6)
    monkeypatch.setattr(nodes, "SEGMENTS_NOTED", 4)
    rng = np.random.default_rng(12)
    serials = 45300.0 + np.sort(rng.uniform(0.0, 800.0, 4000))
    monkeypatch.setattr(nodes, "LONG_SEGMENTS_KEPT", 2)
    for s in serials:
        lon = cells.evaluate("SKY.SUN.LON", [float(s)])
        assert len(nodes._SEGMENTS) <= 6
        assert len(nodes._ASKED) <= 4 and len(nodes._ASKED_OF) <= 4
        assert len(nodes._LONG) <= 2
    assert nodes._SEGMENTS  # the last cells took their segments
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    direct = cells.evaluate("SKY.SUN.LON", [(float(serials[-1]),)])[0][0]
    assert abs(lon - direct) * 3.6e9 < 1.0


# ---- one instant's ERFA values kept for the row's other columns --------------------------


def test_a_rows_other_columns_find_the_instants_values_and_the_same_answers(monkeypatch):
    # Calc computes column by column: the nutation and the Earth of each instant, made
    # for the first column's cells, are found again by the next column's.  The answers
    # are those of each cell computed alone (exact values: no segments here), and no
    # more than nodes.INSTANTS_KEPT instants are kept.
    from calcfuncs import bodies


    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    rng = np.random.default_rng(46)
    serials = np.sort(45292.0 + rng.uniform(0.0, 3000.0, 300)).tolist()  # sparse log
    alone = {}
    columns = ("SKY.SUN.LON", "SKY.MOON.RA", "SKY.PLANET.DEC", "SKY.SUN.DEC", "SKY.MOON.LON",
               "SKY.PLANET.RA")
    for name in columns:
        lead = ["MARS"] if name.startswith("SKY.PLANET") else []
        for s in serials:
            nodes.forget_kept_instants()
            cells._SINGLE_CELL_CACHE.clear()
            alone[name, s] = cells.evaluate(name, [*lead, s])
    nodes.forget_kept_instants()
    cells._SINGLE_CELL_CACHE.clear()
    for name in columns:
        lead = ["MARS"] if name.startswith("SKY.PLANET") else []
        for s in serials:  # column by column, as Calc computes
            assert cells.evaluate(name, [*lead, s]) == alone[name, s]
    assert frames.nutation_one.cache_info().hits >= 300
    assert ephemeris.earth_and_sun_floats.cache_info().hits >= 2 * 300
    # The last three columns found the places of the first three (a body's longitude
    # beside its declination): one place an instant and body (on floats, a cell's path).
    assert bodies._direction_floats.cache_info().hits >= 3 * 300
    # The true obliquity of the row's instant finds the same kept nutation (one series
    # a row, not one for the places and one for the obliquity), and gives what it gives
    # computed alone.
    tt_alone = {}
    for s in serials[:50]:
        nodes.forget_kept_instants()
        cells._SINGLE_CELL_CACHE.clear()
        tt_alone[s] = cells.evaluate("SKY.OBLIQUITY.TRUE", [s])
    nodes.forget_kept_instants()
    cells._SINGLE_CELL_CACHE.clear()
    for s in serials[:50]:
        cells.evaluate("SKY.SUN.LON", [s])
    hits = frames.nutation_one.cache_info().hits
    for s in serials[:50]:
        assert cells.evaluate("SKY.OBLIQUITY.TRUE", [s]) == tt_alone[s]
    assert frames.nutation_one.cache_info().hits >= hits + 50


def test_the_instants_kept_stay_within_their_bound(monkeypatch):
    from calcfuncs import bodies, cells, ephemeris, frames

    serials = (45292.0 + 0.37 * np.arange(nodes.INSTANTS_KEPT + 500)).tolist()
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)  # every cell computed directly
    for s in serials:
        cells.evaluate("SKY.SUN.RA", [s])
    for kept in (frames.nutation_one, ephemeris.earth_and_sun_floats, bodies._direction_floats):
        assert kept.cache_info().currsize == nodes.INSTANTS_KEPT
    nodes.forget_single_cells()  # the benchmarks' cold start forgets them too
    assert frames.nutation_one.cache_info().currsize == 0


def test_a_rows_altitude_and_azimuth_share_the_sites_parameters(monkeypatch):
    # ERFA's astrometry parameters of an instant at a site (horizon.observer_astrom:
    # epv00, the CIP, s06, refraction constants) are kept for the row's next column:
    # the azimuth beside the altitude gives what it gives computed alone (each cell
    # computed directly here: no segments).
    from calcfuncs import cells, horizon

    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)

    rng = np.random.default_rng(61)
    rows = [(float(ra), float(dec), float(t)) for ra, dec, t in
            zip(rng.uniform(0.0, 360.0, 60), rng.uniform(-30.0, 80.0, 60),
                np.sort(45292.0 + rng.uniform(0.0, 900.0, 60)))]
    site = (47.3814, 8.0542, None, 250.0, 1013.25)  # invented: height 250 m, refraction on
    alone = {}
    for name in ("SKY.HORIZON.ALT", "SKY.HORIZON.AZ"):
        for row in rows:
            nodes.forget_kept_instants()
            cells._SINGLE_CELL_CACHE.clear()
            alone[name, row] = cells.evaluate(name, [*row, *site])
    nodes.forget_kept_instants()
    cells._SINGLE_CELL_CACHE.clear()
    for name in ("SKY.HORIZON.ALT", "SKY.HORIZON.AZ"):  # column by column
        for row in rows:
            assert cells.evaluate(name, [*row, *site]) == alone[name, row]
    assert horizon._astrom_one.cache_info().hits >= len(rows)
    # Another site (or atmosphere) is another key: its parameters are made anew.
    row = next(r for r in rows if isinstance(alone["SKY.HORIZON.ALT", r], float))
    for other in ((47.3815, *site[1:]), (*site[:4], 1000.0)):
        misses = horizon._astrom_one.cache_info().misses
        moved = cells.evaluate("SKY.HORIZON.ALT", [*row, *other])
        assert horizon._astrom_one.cache_info().misses == misses + 1
        assert moved != alone["SKY.HORIZON.ALT", row]


@pytest.mark.parametrize("name", ["SKY.HORIZON.ALT", "SKY.HORIZON.AZ", "SKY.ORBIT.RA",
                                  "SKY.ORBIT.LAT"])
def test_a_dense_log_of_observed_places_and_orbits_agrees_with_direct_cells(name, monkeypatch):
    # A log of a site's targets (altitude, azimuth: the site's parameters from segments,
    # horizon._astrom_dense) and of a minor planet's places (the Earth and the
    # matrix from segments), two rows a day: within 1 uas of the same cells computed
    # directly, most of them from segments.  Ceres's MPC line is test_smallbodies.py's
    # (its source named there); the site is invented.
    from test_smallbodies import CERES

    rng = np.random.default_rng(14)
    serials = 45300.0 + np.sort(rng.uniform(0.0, 150.0, 300))
    if name.startswith("SKY.HORIZON"):
        args = lambda s: [float((s * 7919.0) % 360.0), 20.0, float(s), 47.3814, 8.0542]  # noqa: E731
    else:
        args = lambda s: [CERES, float(s)]  # noqa: E731
    got = np.array([cells.evaluate(name, args(s)) for s in serials])
    # A site's parameters have segments of their own (one table: the Earth, the true
    # equator, the CIO locator's series); a minor planet's place has its own.
    quantities = [quantity for quantity, _ in nodes._SEGMENTS]
    made = [q for q in quantities if (q == "site-free parameters" if name.startswith(
        "SKY.HORIZON") else type(q) is tuple and q[0] == "place")]
    assert len(made) >= 8
    monkeypatch.setattr(cells, "_SINGLE_CELL_CACHE", cells.KeptAnswers())
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    nodes.forget_kept_instants()
    direct = np.array([cells.evaluate(name, args(s)) for s in serials])
    difference = np.abs((got - direct + 180.0) % 360.0 - 180.0) * 3.6e9
    assert np.max(difference) < 1.0
    assert np.count_nonzero(got != direct) > 100
