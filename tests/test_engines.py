"""Parquet in and out (calcfuncs.tables) and the Dask engine (calcfuncs.engines).

The log is invented (tools/survey_log.py) and is never a check value: the checks are
that the Dask engine gives what one process gives, row by row and bit for bit; that a
Parquet column hands a function what a cell holding the same value hands it
(calcfuncs.api on the same values); that a timestamp is read as its instant (astropy);
and that no run, interrupted or failing, leaves a partial file under the target's name.
"""

import datetime
import os
import signal
import subprocess
import sys
import time

import numpy as np
import pytest

pa = pytest.importorskip("pyarrow")
pq = pytest.importorskip("pyarrow.parquet")
pytest.importorskip("dask.dataframe")
pytest.importorskip("distributed")

import survey_log  # noqa: E402 - tools/ is on sys.path (conftest)

from calcfuncs import api, cli, engines, tables  # noqa: E402
from calcfuncs.errors import PREFIX  # noqa: E402

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
SITE = {"latitude": "54.52", "longitude": "-2.95"}  # the invented patrol's site

# Three kinds of work: a time (no slowly varying quantity), a position (the Moon: the
# nutation interpolated over nodes in a dense column) and a BJD (the Earth's state over
# nodes, per-row target and the site).
RUNS = [
    ("SKY.JD", {"time": "observed", "scale": "clock_scale"}, {"result_scale": "TT"}),
    ("SKY.MOON.RA", {"time": "observed", "scale": "clock_scale"}, {}),
    ("SKY.BJD.TDB", {"time": "observed", "scale": "clock_scale", "ra": "ra_deg",
                     "dec": "dec_deg"}, SITE),
]


@pytest.fixture(scope="module")
def log_100k(tmp_path_factory):
    return str(survey_log.write(tmp_path_factory.mktemp("log") / "patrol.parquet", 100_000))


@pytest.fixture(scope="module")
def two_workers():
    from distributed import Client, LocalCluster

    cluster = LocalCluster(n_workers=2, threads_per_worker=1, processes=True,
                           dashboard_address=":0")
    client = Client(cluster)
    yield client
    client.close()
    cluster.close()


@pytest.mark.parametrize("name, columns, constants", RUNS, ids=[r[0] for r in RUNS])
def test_two_dask_workers_give_the_single_process_rows(log_100k, two_workers, tmp_path,
                                                       name, columns, constants):
    fn = api.lookup(name).cell_function
    single, spread = tmp_path / "single.parquet", tmp_path / "dask.parquet"
    one = tables.apply_to_parquet(fn, log_100k, str(single), columns, constants)
    # Partitions of 50,000 rows: two, one on each worker.
    many = engines.apply_to_parquet(fn, log_100k, str(spread), columns, constants,
                                    partition_rows=50_000, client=two_workers)
    assert len(two_workers.scheduler_info()["workers"]) == 2
    a, b = pq.read_table(single), pq.read_table(spread)
    assert a.num_rows == b.num_rows == 100_000
    assert a.equals(b)  # every column, every row, bit for bit
    assert one == many
    column = api.python_name(name)
    messages = a.column(column + "_message").to_pylist()
    values = a.column(column).to_pylist()
    source = pq.read_table(log_100k)
    scales = source.column("clock_scale").to_pylist()
    observed = source.column("observed").to_pylist()
    for i in range(a.num_rows):
        if observed[i] is None:  # an empty cell in a row argument: an empty result
            assert values[i] is None and messages[i] is None
        elif scales[i] == "UTS":
            assert messages[i].startswith('#SKY: unknown scale "UTS"') and values[i] is None
    if name == "SKY.BJD.TDB":
        bad = [i for i, d in enumerate(source.column("dec_deg").to_pylist()) if d > 90]
        assert len(bad) > 50
        assert all(messages[i].startswith("#SKY: the declination") for i in bad
                   if observed[i] is not None and scales[i] != "UTS")
    assert one["failed"] == sum(m is not None for m in messages) > 0


def _cell_args(table, columns, constants, fn):
    plan = tables.resolve(fn, table.column_names, columns, constants, "test")
    return [tables.cell_values(table.column(what)) if how == "column" else what
            for how, what in plan]


@pytest.mark.parametrize("name, columns, constants", RUNS, ids=[r[0] for r in RUNS])
def test_a_parquet_row_is_what_cells_holding_its_values_give(tmp_path, name, columns,
                                                             constants):
    src = survey_log.write(tmp_path / "log.parquet", 2_000, group_rows=700)
    fn = api.lookup(name).cell_function
    tables.apply_to_parquet(fn, str(src), str(tmp_path / "out.parquet"), columns, constants)
    out = pq.read_table(tmp_path / "out.parquet")
    source = pq.read_table(src)
    want = api.call(name, *_cell_args(source, columns, constants, fn), on_error="text")
    column = api.python_name(name)
    got = [m if m is not None else v for v, m in zip(out.column(column).to_pylist(),
                                                       out.column(column + "_message").to_pylist())]
    assert got == [None if w == "" else w for w in want]


def test_a_timestamp_column_is_read_as_its_instant(tmp_path):
    """astropy 8.0 (with its IERS tables offline): the MJD on TT of each timestamp."""
    from astropy.time import Time

    stamps = [datetime.datetime(2025, 3, 1, 21, 4, 5, 123456, tzinfo=datetime.timezone.utc),
              datetime.datetime(1999, 12, 31, 23, 59, 59, 999999, tzinfo=datetime.timezone.utc),
              datetime.datetime(2031, 7, 9, 0, 0, 0, 1, tzinfo=datetime.timezone.utc)]
    src = tmp_path / "t.parquet"
    pq.write_table(pa.table({"t": pa.array(stamps, pa.timestamp("us", tz="UTC"))}), src)
    fn = api.lookup("SKY.MJD").cell_function
    tables.apply_to_parquet(fn, str(src), str(tmp_path / "o.parquet"), {"time": "t"},
                            {"result_scale": "TT"})
    got = pq.read_table(tmp_path / "o.parquet").column("mjd").to_pylist()
    want = Time([s.replace(tzinfo=None) for s in stamps], scale="utc").tt.mjd
    # A date-time value resolves about 1 us (PLATFORM/STYLE notes): 2 us allowed.
    assert np.abs(np.array(got) - want).max() * 86_400e6 < 2.0
    # The same instants in nanoseconds and seconds (pandas writes nanoseconds), one
    # with a part of a microsecond that a cast to microseconds would refuse.
    nanos = pa.array([int(round(s.timestamp() * 1e6)) * 1000 + 400 for s in stamps],
                     pa.int64()).cast(pa.timestamp("ns", tz="UTC"))
    seconds = pa.array([int(s.timestamp()) for s in stamps], pa.int64()).cast(
        pa.timestamp("s"))
    serials = api.mjd(tables.cell_values(nanos), result_scale="TT")
    assert np.abs(np.array(serials) - want).max() * 86_400e6 < 2.0
    whole = Time([s.replace(tzinfo=None, microsecond=0) for s in stamps], scale="utc").tt.mjd
    assert np.abs(np.array(api.mjd(tables.cell_values(seconds), result_scale="TT"))
                  - whole).max() * 86_400e6 < 2.0


def test_parquet_round_trips_the_types(tmp_path):
    src = tmp_path / "mixed.parquet"
    table = pa.table({
        "when": pa.array([datetime.datetime(2025, 1, 2, 3, 4, 5, 678901), None,
                          datetime.datetime(2026, 6, 1)], pa.timestamp("us")),
        "when_utc": pa.array([1_735_700_000_000_000, 1_735_700_000_000_001, None],
                             pa.timestamp("us", tz="UTC")),
        "night": pa.array([datetime.date(2025, 1, 2), None, datetime.date(2026, 6, 1)]),
        "year": pa.array([2024, 2027, None], pa.int32()),
        "mag": pa.array([1.25, None, float("nan")], pa.float64()),
        "ok": pa.array([True, False, None]),
        "note": pa.array(["clear", None, "thin cloud, Moon near"], pa.string()),
    })
    pq.write_table(table, src)
    season = api.lookup("SKY.SEASON").cell_function
    tables.apply_to_parquet(season, str(src), str(tmp_path / "s.parquet"), {"year": "year"},
                            {"event": "MARCH"})
    out = pq.read_table(tmp_path / "s.parquet")
    # The input's columns come back with their types and values; NaN stays NaN.
    kept = out.select(table.column_names)
    assert kept.schema == table.schema
    assert repr(kept.to_pylist()) == repr(table.to_pylist())  # (NaN is not equal to NaN)
    assert out.schema.field("season").type == pa.timestamp("us")
    assert out.schema.field("season_message").type == pa.string()
    got = out.column("season").to_pylist()
    assert got[:2] == [api.datetime_from_serial(s) for s in api.season([2024.0, 2027.0])]
    assert got[2] is None  # an empty year: an empty result
    # US Naval Observatory: March equinox 2024 at 03:06 UTC (to the minute).
    assert got[0].strftime("%Y-%m-%dT%H:%M") == "2024-03-20T03:06"
    # A text result is a text column; the date column is read as that day at 00:00.
    text_fn = api.lookup("SKY.TEXT.DMS").cell_function
    tables.apply_to_parquet(text_fn, str(src), str(tmp_path / "t.parquet"),
                            {"degrees": "mag"}, {})
    words = pq.read_table(tmp_path / "t.parquet")
    assert words.schema.field("text_dms").type == pa.string()
    assert words.column("text_dms")[0].as_py() == api.text_dms(1.25)
    assert words.column("text_dms_message")[2].as_py() == api.text_dms(
        float("nan"), on_error="text")
    assert tables.cell_values(table.column("night")) == [
        api.jd("2025-01-02") - 2415018.5, None, api.jd("2026-06-01") - 2415018.5]


def test_chunks_follow_rows_not_row_groups(tmp_path, monkeypatch):
    monkeypatch.setattr(cli, "CHUNK_ROWS", 300)
    src = survey_log.write(tmp_path / "log.parquet", 1_000, group_rows=170)
    sizes = [t.num_rows for t in tables.row_chunks(pq.ParquetFile(src), 300)]
    assert sizes == [300, 300, 300, 100]
    whole = pq.read_table(src)
    assert pa.concat_tables(tables.row_chunks(pq.ParquetFile(src), 300)).equals(whole)
    assert tables.read_rows(str(src), 300, 600).equals(whole.slice(300, 300))
    assert engines.partition_ranges(1_000, 600) == [(0, 600), (600, 1_000)]
    with pytest.raises(ValueError, match="whole number of chunks"):
        engines.partition_ranges(1_000, 450)
    # Short logs are cut so that every worker has partitions; long ones at 20 chunks.
    assert engines.default_partition_rows(10_000, 2) == 1_500  # 5 chunks of 300
    assert engines.default_partition_rows(10_000_000, 2) == 20 * 300
    assert engines.default_partition_rows(100, 8) == 300


def test_an_interrupted_parquet_run_leaves_no_partial_file(tmp_path, monkeypatch):
    src = survey_log.write(tmp_path / "log.parquet", 1_000)
    monkeypatch.setattr(cli, "CHUNK_ROWS", 300)
    real, calls = tables.compute, []

    def failing(*args):
        calls.append(1)
        if len(calls) == 2:
            raise KeyboardInterrupt  # Ctrl+C half-way
        return real(*args)

    monkeypatch.setattr(tables, "compute", failing)
    with pytest.raises(KeyboardInterrupt):
        cli.main(["SKY.JD", "--in", str(src), "--arg", "time=observed", "--out",
                  str(tmp_path / "out.parquet")])
    assert os.listdir(tmp_path) == ["log.parquet"]


def test_a_failing_partition_is_retried_and_a_lasting_failure_writes_nothing(tmp_path,
                                                                             monkeypatch):
    from distributed import Client, LocalCluster

    src = str(survey_log.write(tmp_path / "log.parquet", 1_200))
    monkeypatch.setattr(cli, "CHUNK_ROWS", 200)
    fn = api.lookup("SKY.MOON.RA").cell_function
    tables.apply_to_parquet(fn, src, str(tmp_path / "one.parquet"), {"time": "observed"}, {})
    real, failures = tables.compute, {"left": 1}

    def flaky(fn_, plan, table):  # the second partition fails while failures are left
        if table.column("frame")[0].as_py() == 400 and failures["left"] > 0:
            failures["left"] -= 1
            raise OSError("worker lost its disk")
        return real(fn_, plan, table)

    monkeypatch.setattr(tables, "compute", flaky)
    with LocalCluster(n_workers=2, processes=False, dashboard_address=":0") as cluster, \
            Client(cluster) as client:
        engines.apply_to_parquet(fn, src, str(tmp_path / "retried.parquet"),
                                 {"time": "observed"}, {}, partition_rows=400, client=client)
        assert failures["left"] == 0  # it did fail once, and was run again
        assert pq.read_table(tmp_path / "retried.parquet").equals(
            pq.read_table(tmp_path / "one.parquet"))
        failures["left"] = 100  # more than Dask's retries
        with pytest.raises(OSError, match="lost its disk"):
            engines.apply_to_parquet(fn, src, str(tmp_path / "failed.parquet"),
                                     {"time": "observed"}, {}, partition_rows=400,
                                     client=client)
    assert sorted(os.listdir(tmp_path)) == ["log.parquet", "one.parquet", "retried.parquet"]


def test_a_worker_killed_mid_run_has_its_partitions_run_again(tmp_path):
    import threading

    from distributed import Client, LocalCluster

    src = str(survey_log.write(tmp_path / "log.parquet", 400_000))
    fn = api.lookup("SKY.MOON.RA").cell_function
    columns = {"time": "observed", "scale": "clock_scale"}
    tables.apply_to_parquet(fn, src, str(tmp_path / "one.parquet"), columns, {})
    with LocalCluster(n_workers=2, threads_per_worker=1, processes=True,
                      dashboard_address=":0") as cluster, Client(cluster) as client:
        pids = client.run(os.getpid)
        done = {}

        def run():
            try:
                done["stats"] = engines.apply_to_parquet(
                    fn, src, str(tmp_path / "dask.parquet"), columns, {},
                    partition_rows=50_000, client=client)
            except BaseException as err:  # noqa: BLE001 - reported by the assertion below
                done["error"] = err

        worker = threading.Thread(target=run)
        worker.start()
        deadline = time.monotonic() + 300
        staging = []
        while time.monotonic() < deadline and not staging:
            staging = [os.path.join(tmp_path, n) for n in os.listdir(tmp_path)
                       if n.startswith(".partial-") and os.path.isdir(tmp_path / n) and any(
                           p.startswith("part-") for p in os.listdir(os.path.join(tmp_path, n)))]
            time.sleep(0.05)
        assert staging, "no partition was written"
        victim = sorted(pids.values())[0]
        os.kill(victim, signal.SIGKILL)  # a worker dies with partitions in hand
        worker.join(600)
        assert "error" not in done, done.get("error")
        assert victim not in client.run(os.getpid).values()  # the nanny started a new one
    assert pq.read_table(tmp_path / "dask.parquet").equals(pq.read_table(tmp_path / "one.parquet"))
    assert sorted(os.listdir(tmp_path)) == ["dask.parquet", "log.parquet", "one.parquet"]


def test_a_killed_dask_run_leaves_no_output_file(tmp_path):
    src = survey_log.write(tmp_path / "log.parquet", 400_000)
    out = tmp_path / "out.parquet"
    env = dict(os.environ, PYTHONPATH=ROOT)
    run = subprocess.Popen(
        [sys.executable, "-m", "calcfuncs", "SKY.MOON.RA", "--in", str(src), "--arg",
         "time=observed", "--out", str(out), "--engine", "dask", "--workers", "1"],
        env=env, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, start_new_session=True)
    deadline = time.monotonic() + 120
    while time.monotonic() < deadline and not any(
            n.startswith(".partial-") for n in os.listdir(tmp_path)):
        time.sleep(0.05)
    time.sleep(1.0)  # the workers are computing
    assert run.poll() is None, run.stderr.read().decode()
    os.killpg(run.pid, signal.SIGKILL)  # the whole run dies at once, client and workers
    run.wait(30)
    run.stderr.close()
    assert not out.exists()  # only a staging folder named .partial-... may be left
    assert all(n == "log.parquet" or n.startswith(".partial-") for n in os.listdir(tmp_path))


def test_the_command_line_runs_parquet_and_refuses_csv_on_dask(tmp_path, capsys):
    src = survey_log.write(tmp_path / "log.parquet", 5_000)
    argv = ["SKY.BJD.TDB", "--in", str(src), "--arg", "time=observed", "--arg", "ra=ra_deg",
            "--arg", "dec=dec_deg", "--set", "form=MJD"]
    assert cli.main(argv + ["--out", str(tmp_path / "a.parquet")]) == 1  # bad Decs
    err = capsys.readouterr().err
    assert "5000 rows" in err and "row 997: #SKY: the declination" in err
    assert cli.main(argv + ["--out", str(tmp_path / "a.parquet")]) == 2  # exists
    assert cli.main(argv + ["--out", str(src), "--replace"]) == 2  # the input
    assert cli.main(["SKY.JD", "--in", "x.csv", "--arg", "time=t", "--out", "y.csv",
                     "--engine", "dask"]) == 2
    err = capsys.readouterr().err
    assert "exists; add --replace" in err and "is the input file" in err
    assert "take a Parquet input" in err
    assert api.apply_to_file("SKY.BJD.TDB", str(src), str(tmp_path / "b.parquet"),
                             {"time": "observed", "ra": "ra_deg", "dec": "dec_deg"},
                             {"form": "MJD"})["rows"] == 5_000
    assert pq.read_table(tmp_path / "a.parquet").equals(pq.read_table(tmp_path / "b.parquet"))


def test_the_command_line_reaches_a_running_cluster_by_its_address(log_100k, two_workers,
                                                                 tmp_path, capsys):
    out = tmp_path / "jd.parquet"
    address = two_workers.scheduler.address
    assert cli.main(["SKY.JD", "--in", log_100k, "--arg", "time=observed", "--arg",
                     "scale=clock_scale", "--out", str(out), "--engine", "dask",
                     "--scheduler", address]) == 1  # the mistyped scales
    assert "100000 rows" in capsys.readouterr().err
    one = tmp_path / "one.parquet"
    api.apply_to_file("SKY.JD", log_100k, str(one), {"time": "observed",
                                                     "scale": "clock_scale"})
    assert pq.read_table(out).equals(pq.read_table(one))
    assert sorted(os.listdir(tmp_path)) == ["jd.parquet", "one.parquet"]


def test_a_dask_frame_of_whole_chunks_gives_the_single_process_rows(tmp_path, monkeypatch):
    import dask
    import dask.dataframe as dd
    import pandas as pd

    monkeypatch.setattr(cli, "CHUNK_ROWS", 500)
    src = survey_log.write(tmp_path / "log.parquet", 3_000)
    fn = api.lookup("SKY.SUN.LON").cell_function
    tables.apply_to_parquet(fn, str(src), str(tmp_path / "one.parquet"),
                            {"time": "observed"}, {})
    frame = pq.read_table(src).to_pandas(types_mapper=pd.ArrowDtype)
    lazy = dd.from_pandas(frame, chunksize=1_000, sort=False)
    with dask.config.set(scheduler="threads"):
        got = engines.apply_to_frame(lazy, "SKY.SUN.LON", {"time": "observed"}).compute()
    want = pq.read_table(tmp_path / "one.parquet").column("sun_lon").to_pylist()
    assert lazy.npartitions == 3
    assert [None if pd.isna(v) else v for v in got["sun_lon"]] == want
