"""Rows per second per core and peak memory of a Parquet log run: one process
(``python -m calcfuncs``) against the Dask engine on a LocalCluster of two workers, on
an invented survey log (tools/survey_log.py), and astropy's vectorised BJD on the same
rows in one run for the ratio per row.

    .venv/bin/python bench/bench_engines.py [--rows 10000000] [--function SKY.BJD.TDB]
        [--json out/bench-engines.json]

Each run is its own process tree (client, scheduler, nannies, workers); its peak memory
is the largest sum of their resident sizes, sampled every 0.1 s.  Per core: rows over
wall-clock seconds over the worker count (one for the single process); per CPU second:
rows over the CPU time of the whole tree (scheduler and client included), which other
work on the machine's cores does not lower.  The load average is printed beside.  A
measurement, not a test.
"""

import argparse
import os
import subprocess
import sys
import tempfile
import time

import psutil

ROOT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..")
sys.path.insert(0, os.path.join(ROOT, "tools"))
sys.path.insert(0, ROOT)
import survey_log  # noqa: E402
from timing import save_figures  # noqa: E402

ARGS = {
    "SKY.BJD.TDB": ["--arg", "time=observed", "--arg", "scale=clock_scale", "--arg",
                    "ra=ra_deg", "--arg", "dec=dec_deg"],
    # With a site, ERFA's dtdb at the site costs more than all the rest of a row.
    "SKY.BJD.TDB@site": ["--arg", "time=observed", "--arg", "scale=clock_scale", "--arg",
                         "ra=ra_deg", "--arg", "dec=dec_deg", "--set", "latitude=54.52",
                         "--set", "longitude=-2.95"],
    "SKY.JD": ["--arg", "time=observed", "--arg", "scale=clock_scale"],
    "SKY.MOON.RA": ["--arg", "time=observed", "--arg", "scale=clock_scale"],
}


def tree_sample(proc, cpu):
    """The process tree's resident bytes now; each member's CPU seconds so far go to
    ``cpu`` (by pid: the last sample of a process that has ended stays)."""
    total = 0
    try:
        members = [proc] + proc.children(recursive=True)
    except psutil.Error:
        return 0
    for p in members:
        try:
            with p.oneshot():
                total += p.memory_info().rss
                t = p.cpu_times()
                cpu[p.pid] = t.user + t.system
        except psutil.Error:
            pass
    return total


def timed_run(argv):
    """(wall seconds, CPU seconds and peak resident bytes of the whole process tree,
    exit status)."""
    env = dict(os.environ, PYTHONPATH=ROOT)
    start = time.perf_counter()
    run = subprocess.Popen([sys.executable, "-m", "calcfuncs"] + argv, env=env,
                           stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    proc, peak, cpu = psutil.Process(run.pid), 0, {}
    while run.poll() is None:
        peak = max(peak, tree_sample(proc, cpu))
        time.sleep(0.1)
    return time.perf_counter() - start, sum(cpu.values()), peak, run.returncode


def astropy_rows_per_second(path, rows, at_site):
    """astropy 8.0's BJD_TDB (Time.light_travel_time, built-in ephemeris) on the log's
    first ``rows`` rows, at the site or at the Earth's centre, for the ratio per row."""
    import pyarrow.parquet as pq
    from astropy import units as u
    from astropy.coordinates import EarthLocation, SkyCoord
    from astropy.time import Time

    t = pq.ParquetFile(path).read_row_group(0).slice(0, rows).to_pandas()
    t = t[t["observed"].notna() & (t["dec_deg"] <= 90)]
    site = EarthLocation.from_geodetic(-2.95 * u.deg, 54.52 * u.deg, 0 * u.m) if at_site \
        else EarthLocation.from_geocentric(0, 0, 0, u.m)
    start = time.perf_counter()
    times = Time(t["observed"].dt.tz_localize(None).to_numpy(), scale="utc", location=site)
    target = SkyCoord(t["ra_deg"].to_numpy() * u.deg, t["dec_deg"].to_numpy() * u.deg)
    (times.tdb + times.light_travel_time(target, "barycentric")).jd
    return len(t) / (time.perf_counter() - start)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--rows", type=int, default=10_000_000)
    ap.add_argument("--function", default="SKY.BJD.TDB", choices=sorted(ARGS))
    ap.add_argument("--workers", type=int, default=2)
    ap.add_argument("--folder", default=None, help="where the log is written (default: a "
                    "temporary folder)")
    ap.add_argument("--json")
    args = ap.parse_args()
    folder = args.folder or tempfile.mkdtemp(prefix="bench-engines-")
    log = os.path.join(folder, f"patrol-{args.rows}.parquet")
    if not os.path.exists(log):
        t0 = time.perf_counter()
        survey_log.write(log, args.rows)
        print(f"invented log of {args.rows:,} rows written in {time.perf_counter() - t0:.0f} s "
              f"({os.path.getsize(log) / 1e6:.0f} MB)")
    results = {"rows": args.rows, "function": args.function, "cores": os.cpu_count()}
    base = [args.function.split("@")[0], "--in", log] + ARGS[args.function]
    runs = [("single", 1, []),
            (f"dask, {args.workers} workers", args.workers,
             ["--engine", "dask", "--workers", str(args.workers)])]
    for label, cores, extra in runs:
        out = os.path.join(folder, f"out-{cores}.parquet")
        if os.path.exists(out):
            os.unlink(out)
        load = os.getloadavg()[0]
        wall, cpu, peak, status = timed_run(base + ["--out", out] + extra)
        per_core = args.rows / wall / cores
        results[label] = {"seconds": wall, "cpu_seconds": cpu, "peak_bytes": peak,
                          "rows_per_s_per_core": per_core,
                          "rows_per_cpu_s": args.rows / cpu if cpu else None,
                          "exit": status, "load_before": load}
        print(f"{label:<18} {wall:8.1f} s  {args.rows / wall:10,.0f} rows/s  "
              f"{per_core:10,.0f} rows/s/core  {args.rows / cpu:10,.0f} rows/CPU-s  "
              f"peak {peak / 2**30:.2f} GiB  (exit {status}, load {load:.1f})")
    one, many = results["single"], results[runs[1][0]]
    results["per_core_ratio"] = many["rows_per_s_per_core"] / one["rows_per_s_per_core"]
    results["per_cpu_second_ratio"] = many["rows_per_cpu_s"] / one["rows_per_cpu_s"]
    print(f"per core (wall clock), dask / single: {results['per_core_ratio']:.2f}; per CPU "
          f"second (all processes): {results['per_cpu_second_ratio']:.2f}")
    import pyarrow.parquet as pq

    same = pq.read_table(os.path.join(folder, "out-1.parquet")).equals(
        pq.read_table(os.path.join(folder, f"out-{args.workers}.parquet")))
    results["outputs_equal"] = bool(same)
    print(f"outputs equal row by row: {same}")
    if args.function.startswith("SKY.BJD.TDB"):
        rate = astropy_rows_per_second(log, 50_000, "@site" in args.function)
        results["astropy_rows_per_s"] = rate
        print(f"astropy Time.light_travel_time: {rate:,.0f} rows/s on one core; ours, one "
              f"process through Parquet: {one['rows_per_s_per_core']:,.0f} "
              f"({one['rows_per_s_per_core'] / rate:.1f}x)")
    if args.json:
        save_figures(args.json, results)


if __name__ == "__main__":
    main()
