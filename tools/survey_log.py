"""An invented survey log, for the tests and the benchmark of the Parquet and Dask
engines (never a check value: the checks compare one engine with another, or the
file with the cells' own values).

The scenario is our own: the Larkmoor Fell Timing Patrol, an amateur group with one
camera, takes a frame about every 40 seconds through eight-hour nights from
2025-01-01 on, cycling through a few hundred targets.  Each row: a frame number, the
UTC timestamp, the time scale the camera's clock wrote ("UTC", a few "TAI" nights,
and now and then a mistyped word), the target's name, RA and Dec in degrees, the
exposure and the band.  Now and then a row is bad as real logs are: a Dec over 90
degrees, a missing timestamp, a mistyped scale.

    python tools/survey_log.py --rows 1000000 --out /tmp/patrol.parquet
"""

import argparse
import os

import numpy as np

START_US = 1_735_689_600_000_000  # 2025-01-01T00:00:00Z in microseconds from 1970
NIGHT_FRAMES = 720                # eight hours at 40 s a frame
TARGETS = 300
BAD_DEC_EVERY = 997               # one row in this many has an impossible Dec
MISSING_TIME_EVERY = 4_999        # ... no timestamp
BAD_SCALE_EVERY = 7_919           # ... a mistyped time-scale word


def schema():
    import pyarrow as pa

    return pa.schema([
        ("frame", pa.int64()), ("observed", pa.timestamp("us", tz="UTC")),
        ("clock_scale", pa.string()), ("target", pa.string()), ("ra_deg", pa.float64()),
        ("dec_deg", pa.float64()), ("exposure_s", pa.float64()), ("band", pa.string())])


def chunk(first, rows, seed=19):
    """Rows [first, first + rows) of the log, as a pyarrow table: the same rows for
    the same numbers whatever the chunking."""
    import pyarrow as pa

    frame = np.arange(first, first + rows, dtype=np.int64)
    night, slot = np.divmod(frame, NIGHT_FRAMES)
    # Jitter per frame from its number alone, so any chunking gives the same log.
    jitter = (np.sin(frame * 12.9898 + seed) * 43758.5453) % 1.0
    micros = (START_US + night * 86_400_000_000 + 19 * 3_600_000_000
              + slot * 40_000_000 + (jitter * 2_000_000).astype(np.int64))
    target = (frame // 30) % TARGETS
    ra = (target * 137.508) % 360.0
    dec = -30.0 + (target * 61.8034) % 110.0
    dec = np.where(frame % BAD_DEC_EVERY == BAD_DEC_EVERY - 1, 97.5, dec)
    scale = np.where((night % 11) == 3, "TAI", "UTC").astype(object)
    scale[frame % BAD_SCALE_EVERY == 11] = "UTS"
    missing = frame % MISSING_TIME_EVERY == 7
    names = np.array([f"LFP-{t:04d}" for t in range(TARGETS)], dtype=object)[target]
    bands = np.array(["B", "V", "R"], dtype=object)[frame % 3]
    return pa.table([
        pa.array(frame),
        pa.array(micros, pa.int64(), mask=missing).cast(pa.timestamp("us", tz="UTC")),
        pa.array(scale, pa.string()), pa.array(names, pa.string()),
        pa.array(ra), pa.array(dec), pa.array(20.0 + 10.0 * (frame % 4)),
        pa.array(bands, pa.string())], schema=schema())


def write(path, rows, group_rows=64_000, seed=19):
    """Write ``rows`` rows to a Parquet file, ``group_rows`` at a time (bounded memory;
    a group size that is no multiple of the engines' chunk on purpose)."""
    import pyarrow.parquet as pq

    with pq.ParquetWriter(path, schema()) as writer:
        for first in range(0, rows, group_rows):
            writer.write_table(chunk(first, min(group_rows, rows - first), seed))
    return path


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--rows", type=int, default=100_000)
    ap.add_argument("--out", required=True)
    ap.add_argument("--csv", action="store_true", help="also write the same rows as CSV")
    args = ap.parse_args()
    write(args.out, args.rows)
    if args.csv:
        import pyarrow.csv as pcsv
        import pyarrow.parquet as pq

        pcsv.write_csv(pq.read_table(args.out), os.path.splitext(args.out)[0] + ".csv")


if __name__ == "__main__":
    main()
