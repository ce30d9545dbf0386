"""A place of one instant on floats (bodies._direction_floats, frames.matrix_rows,
frames.spherical_floats) gives what the pipeline on arrays gives (bodies.place, in_system,
frames.spherical), over random instants of the built-in theories' years, every body,
kind and coordinate system; a column takes the same path row by row, so its rows equal
their cells (tests/test_column_form.py and tests/test_earth_theory.py check that to the
bit); rows outside the years take the arrays and keep their own messages.

The array pipeline is the one whose places are checked against outside references
(test_sun.py, test_moon.py, test_planets.py: Meeus, the Astronomical Almanac, JPL
Horizons); here the float steps are checked against it.
"""

from unittest import mock

import erfa
import numpy as np
import pytest

from calcfuncs import bodies, cells, ephemeris, frames, nodes, orbits
from calcfuncs.errors import PREFIX
from calcfuncs.events import wrap180
from calcfuncs.vocabulary import J2000_JD

SYSTEMS = ("ECLIPTIC J2000", "ECLIPTIC DATE", "ECLIPTIC TRUE", "EQUATORIAL J2000",
           "EQUATORIAL DATE", "EQUATORIAL TRUE", "ICRS")
KINDS = ("GEOMETRIC", "ASTROMETRIC", "APPARENT")
BODIES = sorted(bodies.FLOAT_BODIES)
# Largest difference allowed, degrees: 1e-12 degree is 0.0036 micro-arcseconds (5.7e-14
# measured over 270 instants, 2026-12-05), far below
# the theories' own errors (milliarcseconds and more); the two differ only in the
# order of a few roundings (a sum of three squares, a matrix product).
BOUND_DEG = 1e-12


@pytest.mark.parametrize("body", BODIES)
def test_a_place_on_floats_equals_the_arrays(body):
    rng = np.random.default_rng(sum(map(ord, body)))
    years = rng.uniform(1000.0, 3000.0, 12)
    worst = 0.0
    for year in years:
        t1 = J2000_JD + np.floor((year - 2000.0) * 365.25)
        t2 = float(rng.uniform(0.0, 1.0))
        for kind in KINDS:
            nodes.forget_kept_instants()
            for system in SYSTEMS:
                lon, lat = frames.spherical(bodies.body_in(
                    body, np.array([t1]), np.array([t2]), system, kind, "BUILTIN"))
                got_lon, got_lat = (bodies._value_floats(
                    lambda a, b, dense: bodies._direction_floats(body, a, b, kind, dense),
                    float(t1), t2, system, index) for index in (0, 1))
                worst = max(worst, abs(float(wrap180(got_lon - lon[0]))),
                            abs(got_lat - lat[0]))
    assert worst < BOUND_DEG, worst


def test_aberration_and_deflection_on_floats_are_erfas_ab_and_ld():
    """The two relativistic steps written out on floats against ERFA's ab and ld (the
    SOFA implementations of the same formulas) over random directions, Earth velocities
    up to 0.03 au/day (the Earth's is 0.017) and distances; the deflection also for
    bodies almost behind the Sun, where ld's floor on 1 + q.e holds it finite."""
    rng = np.random.default_rng(2026)
    worst_ab = worst_ld = 0.0
    for k in range(5000):
        u, q, e = (v / np.linalg.norm(v) for v in rng.standard_normal((3, 3)))
        if k % 10 == 0:  # the body behind the Sun: q nearly opposite e
            q = -e + rng.standard_normal(3) * 10.0 ** rng.uniform(-12, -4)
            q /= np.linalg.norm(q)
        v = rng.uniform(-0.03, 0.03, 3)
        sun_distance = rng.uniform(0.3, 40.0)
        c = v * bodies.LIGHT_DAYS_PER_AU
        expected = erfa.ab(u, c, sun_distance, np.sqrt(1.0 - c @ c))
        got = bodies._aberrate_floats(u.tolist(), v.tolist(), sun_distance)
        worst_ab = max(worst_ab, np.abs(np.subtract(got, expected)).max())
        expected = erfa.ld(1.0, u, q, e, sun_distance, 1e-9)
        got = bodies._deflect_floats(u.tolist(), q.tolist(), e.tolist(), sun_distance)
        worst_ld = max(worst_ld, np.abs(np.subtract(got, expected)).max())
    # 1e-15 of a unit vector is 2e-4 micro-arcseconds (0 measured: the same roundings)
    assert worst_ab < 1e-15 and worst_ld < 1e-15, (worst_ab, worst_ld)


def test_a_cell_of_a_dense_log_takes_its_values_from_segments(monkeypatch):
    # Cells close together in time take the Earth and the system's matrix from their
    # segment (nodes.from_nodes on floats), and once DENSE_CELLS of them have asked for
    # one body's place in one system, that place itself from a segment of its own
    # (bodies.PLACE_SEGMENT_BODIES):
    # within the bounds of test_nodes.py (under 1 uas on a place) of the direct values.
    monkeypatch.setattr(nodes, "DENSE_CELLS", 4)
    nodes.forget_single_cells()
    cells._SINGLE_CELL_CACHE.clear()
    calls, places = [], []
    real_value, real_from_nodes = bodies._value_floats, nodes.from_nodes

    def from_nodes(quantity, compute, t1, t2, *grid):
        if type(quantity) is tuple and quantity[0] == "place":
            places.append(quantity[1])
        return real_from_nodes(quantity, compute, t1, t2, *grid)
    serials = [46000.25 + 0.01 * k for k in range(12)]
    with mock.patch.object(bodies, "_value_floats",
                           side_effect=lambda *a: calls.append(a[-1]) or real_value(*a)), \
            mock.patch.object(nodes, "from_nodes", side_effect=from_nodes):
        got = [cells.evaluate(name, (s,)) for name in ("SKY.SUN.LON", "SKY.MOON.DEC")
               for s in serials]
    # The Sun: three cells computed directly; from the fourth the cells are dense, and
    # from the seventh (the fourth to ask for its place there) its place has a segment.
    # The Moon: every cell dense, its first three on the Earth's and the matrix's
    # segments, then its place's own (on its finer grid).
    assert calls == [False] * 3 + [True] * 3 + [True] * 3
    assert places == ["SUN"] * 6 + ["MOON"] * 9
    nodes.forget_single_cells()
    cells._SINGLE_CELL_CACHE.clear()
    monkeypatch.setattr(nodes, "DENSE_CELLS", 10**9)
    direct = [cells.evaluate(name, (s,)) for name in ("SKY.SUN.LON", "SKY.MOON.DEC")
              for s in serials]
    differences = np.abs(np.array(got) - np.array(direct)) * 3.6e9  # micro-arcseconds
    assert differences.max() < 1.0
    assert differences[3:12].max() > 0.0  # interpolated, not the direct values


def test_a_column_across_the_end_of_the_builtin_years_keeps_each_rows_own_answer():
    # Mid 2999, late 3000 (the long-range theories), and about 8977, beyond every
    # theory (a message in its row only).
    rows = ("JD 2816612.5", "JD 2817000.5", "JD 5000000.5")
    with mock.patch.object(nodes, "DENSE_CELLS", 10**9):
        column = cells.evaluate("SKY.SUN.LON", (tuple((t,) for t in rows), "TT"))
        alone = [cells.evaluate("SKY.SUN.LON", (t, "TT")) for t in rows]
    assert [row[0] for row in column] == alone
    assert isinstance(alone[0], float) and isinstance(alone[1], float)
    assert alone[2].startswith(PREFIX) and "built-in theories" in alone[2]


def test_the_solar_longitude_is_the_suns_j2000_apparent_longitude_to_the_bit():
    # Its definition (registry: the same as SKY.SUN.LON with frame J2000, kind APPARENT).
    rng = np.random.default_rng(83)
    for serial in rng.uniform(20000.0, 80000.0, 50).tolist():
        assert cells.evaluate("SKY.SUN.SOLARLON", (serial,)) == cells.evaluate(
            "SKY.SUN.LON", (serial, None, "J2000", "APPARENT"))


# ---- two-body orbits on floats ---------------------------------------------------------


def _random_orbits(rng, n):
    """Conics of every kind about the Sun: near-circles, ellipses, parabolas and
    hyperbolas, perihelion within a few years of the instants (orbits.Orbit's inputs)."""
    e = np.concatenate([rng.uniform(0.0, 1e-9, n // 6), rng.uniform(0.0, 0.99, n // 3),
                        np.ones(n // 6), rng.uniform(1.0001, 3.0, n - n // 6 - n // 3 - n // 6)])
    q = rng.uniform(0.05, 6.0, n)
    tp1 = J2000_JD + np.floor(rng.uniform(-4000.0, 4000.0, n))
    return [orbits.Orbit(q[k], e[k], rng.uniform(0.0, 180.0), rng.uniform(0.0, 360.0),
                         rng.uniform(0.0, 360.0), tp1[k], rng.uniform(0.0, 1.0))
            for k in range(n)]


def test_an_orbits_place_on_floats_equals_the_arrays():
    # The float steps (orbits.helio_floats: the f and g series or a new Kepler solution,
    # as Orbit.state chooses) against Orbit.state and bodies.place on arrays.
    rng = np.random.default_rng(97)
    worst = 0.0
    for o in _random_orbits(rng, 60):
        t1 = J2000_JD + float(np.floor(rng.uniform(-3000.0, 3000.0)))
        t2 = float(rng.uniform(0.0, 1.0))
        for kind in KINDS:
            nodes.forget_kept_instants()
            for system in ("ECLIPTIC TRUE", "EQUATORIAL J2000", "ICRS"):
                lon, lat = frames.spherical(bodies.body_in(
                    o, np.array([t1]), np.array([t2]), system, kind, "BUILTIN"))
                got_lon, got_lat = (bodies._value_floats(
                    lambda a, b, dense: bodies._orbit_direction_floats(
                        o.elements_floats(0), a, b, kind, dense),
                    t1, t2, system, index) for index in (0, 1))
                worst = max(worst, abs(float(wrap180(got_lon - lon[0]))),
                            abs(got_lat - lat[0]))
    # Kepler's equation is solved by the same steps on floats and on arrays; the rest
    # differs in the order of a few roundings (7.6e-13 degree, 0.003 uas, the largest over
    # 300 orbits and 1,800 places, measured 2026-12-05).
    assert worst < 1e-11, worst


def test_a_column_of_orbits_equals_its_cells_to_the_bit():
    # Lines of the MPC's formats (test_smallbodies.py: Ceres, a near-Earth asteroid,
    # comets on hyperbolic, elliptic and parabolic orbits) and instants across decades.
    from tests.test_smallbodies import LINES

    rng = np.random.default_rng(101)
    serials = rng.uniform(30000.0, 60000.0, len(LINES) * 6).tolist()
    lines = [LINES[k % len(LINES)] for k in range(len(serials))]
    for name in ("SKY.ORBIT.RA", "SKY.ORBIT.DEC", "SKY.ORBIT.LON"):
        with mock.patch.object(nodes, "DENSE_CELLS", 10**9):
            column = cells.evaluate(name, (tuple((x,) for x in lines),
                                           tuple((t,) for t in serials)))
            alone = [cells.evaluate(name, (x, t)) for x, t in zip(lines, serials)]
        assert [row[0] for row in column] == alone
        assert all(isinstance(v, float) for v in alone)


def test_a_perturbed_orbit_stays_on_arrays():
    calls = []
    real = bodies._orbit_direction_floats
    from tests.test_smallbodies import LINES

    with mock.patch.object(bodies, "_orbit_direction_floats",
                           side_effect=lambda *a: calls.append(a) or real(*a)):
        two_body = cells.evaluate("SKY.ORBIT.RA", (LINES[0], 46000.5))
        perturbed = cells.evaluate("SKY.ORBIT.RA", (LINES[0], 46000.5, None, None, None, None,
                                                    "PLANETS"))
    assert len(calls) == 1
    assert isinstance(two_body, float) and isinstance(perturbed, float)


# ---- the Moon's light time --------------------------------------------------------------


def test_the_moons_light_time_by_its_velocity_against_erfa_iterated():
    # The light-time rounds of the Moon's place take its geocentric state (ERFA moon98)
    # and the Earth's once, at the instant, extrapolated over the 1.3 s (Builtin.
    # heliocentric, ephemeris.heliocentric_floats).  The reference asks ERFA afresh at
    # each retarded instant: moon98 and epv00 at t - tau, five rounds.  Within 12 uas
    # (the curvature of 1.3 s of the Moon's path and the Earth's: a few millimetres; 7.9
    # uas the largest over 1,000 instants 1945-2055, 5.6 when moon98 was asked at each
    # round and only the Earth extrapolated, measured 2026-12-05).
    import erfa

    rng = np.random.default_rng(113)
    worst = 0.0
    for t2 in rng.uniform(-20000.0, 20000.0, 200).tolist():
        t1 = J2000_JD
        pvh, pvb = erfa.epv00(t1, t2)
        earth_b = pvb["p"]
        tau = 0.0
        for _ in range(5):
            h_r, b_r = erfa.epv00(t1, t2 - tau)
            moon_helio = erfa.moon98(t1, t2 - tau)["p"] + h_r["p"]
            sun_b = b_r["p"] - h_r["p"]
            vector = moon_helio + sun_b - earth_b
            tau = np.linalg.norm(vector) * (erfa.DAU / erfa.CMPS / 86400.0)
        expected = vector / np.linalg.norm(vector)
        for got in (bodies.place("MOON", np.array([t1]), np.array([t2]), "ASTROMETRIC")
                    .direction[0],
                    np.array(bodies._direction_floats("MOON", t1, t2, "ASTROMETRIC"))):
            worst = max(worst, float(np.linalg.norm(got - expected)))
    assert worst * 206264.806e6 < 12.0, worst * 206264.806e6


def test_the_suns_longitude_at_each_march_equinox_reads_zero():
    # The March equinox is the instant of apparent longitude 0 (true equinox of date,
    # common practice).  At the instants SKY.SEASON gives (as date-time values) the Sun's
    # longitude reads 0 or a hair above, never 360 less a hair (bodies.shown_longitudes);
    # a second before the equinox it is just under 360 (the Sun moves 0.04" a second, 1.1e-5
    # degree).
    # On TT, 1000 to 2999 (the built-in theories' years: the float path).
    for year in range(1000, 3000, 17):
        equinox = cells.evaluate("SKY.SEASON", (float(year), "MARCH", "TT"))
        assert 0.0 <= cells.evaluate("SKY.SUN.LON", (equinox, "TT")) < 1e-6
        assert 359.9999 < cells.evaluate("SKY.SUN.LON", (equinox - 1.0 / 86400.0, "TT")) < 360.0


@pytest.mark.parametrize("kind", ["APPARENT", "ASTROMETRIC", "GEOMETRIC"])
def test_a_place_at_a_segments_points_equals_each_point_alone_to_the_bit(kind, monkeypatch):
    # bodies._directions_at_points takes a segment's points at once: the float steps on
    # numpy's rows, element by element, and ERFA's theories called once for all the
    # points.  Each point's place is the one computed alone, to the bit (the Sun, the
    # Moon, every planet), and plan94 and moon98 are asked once for the instants and,
    # for a planet's light time, once more.  An orbit's (of the random kind above)
    # solves Kepler's equation for all the points at once, as a column does: within
    # 1e-13 radian (0.02 uas) of the cell's steps on floats.
    calls = []
    for name in ("plan94", "moon98"):
        real = getattr(erfa.ufunc, name)
        monkeypatch.setattr(erfa.ufunc, name, lambda *a, _real=real, _name=name: (
            calls.append((_name, np.ndim(a[0]))) or _real(*a)))
    orbits_here = _random_orbits(np.random.default_rng(5), 4)
    for which in sorted(bodies.FLOAT_BODIES) + orbits_here:
        for segment in (-1500, 0, 700):
            jd1 = np.full(nodes.SEGMENT_POINTS, nodes.SEGMENT_ORIGIN + segment * nodes.SEGMENT_DAYS)
            states = ephemeris.earth_and_sun_at_points(jd1, nodes._POINT_DAYS)
            del calls[:]
            together = bodies._directions_at_points(which, kind, jd1, nodes._POINT_DAYS, states)
            if type(which) is str and which != "SUN":
                assert all(ndim == 1 for _, ndim in calls), which  # all points in a call
                assert len(calls) == (1 if which == "MOON" or kind == "GEOMETRIC" else 2)
            for k, (t2, s) in enumerate(zip(nodes._POINT_DAYS.tolist(), states.tolist())):
                by_parts = (s[0:3], s[3:6], s[6:9], s[9:12])
                if type(which) is str:
                    alone = bodies._direction_of_states(which, float(jd1[k]), t2, kind, by_parts)
                    assert together[k].tolist() == alone, (which, segment, k)
                else:
                    alone = bodies._place_floats(
                        orbits.helio_floats(which.elements_floats(0), float(jd1[k]), t2),
                        by_parts, kind)
                    assert np.abs(together[k] - alone).max() < 1e-13, (segment, k)


def test_one_matrix_turns_a_column_as_its_cells_are_turned():
    # vectors.apply_transposed with one (3, 3) matrix for every row sums each component's
    # products in the order of the axes, element by element: a column's row is the value
    # of its row turned alone, to the bit, for any number of rows, and the same as the
    # float steps of a single cell (ephemeris.heliocentric_floats' frame bias) and as
    # numpy's einsum over the rows.
    from calcfuncs import vectors

    rng = np.random.default_rng(23)
    bias = np.array(ephemeris.BIAS_ROWS)
    (b0, b1, b2) = ephemeris.BIAS_ROWS
    for n in (1, 2, 17, 5000):
        v = rng.normal(size=(n, 3))
        for m in (bias, rng.normal(size=(3, 3))):
            column = vectors.apply_transposed(m, v)
            assert np.array_equal(column, np.einsum("...ji,...j->...i", m, v))
            for k in range(0, n, max(1, n // 25)):
                assert np.array_equal(vectors.apply_transposed(m, v[k]), column[k])
                assert np.array_equal(vectors.apply_transposed(m, v[k:k + 1])[0], column[k])
        x, y, z = v[0].tolist()
        assert vectors.apply_transposed(bias, v[0]).tolist() == [
            b0[0] * x + b1[0] * y + b2[0] * z, b0[1] * x + b1[1] * y + b2[1] * z,
            b0[2] * x + b1[2] * y + b2[2] * z]
