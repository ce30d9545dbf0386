"""The same cell functions over a Dask DataFrame, partition by partition: on local
worker processes or threads, or on a running cluster given by its scheduler address
(``python -m calcfuncs ... --engine dask [--scheduler tcp://host:8786]``).

Why Dask (dask.dataframe and dask.distributed): it already runs on the clusters log
keepers have (Slurm, PBS, Kubernetes, a few workstations), moves a partition to a free
worker, reruns the partitions of a worker that died, and retries a partition whose
task failed.  Our part is small: which rows make a partition, and how its result
reaches one output file.

Same numbers as one process.  The single process computes a Parquet log CHUNK_ROWS
rows at a time from the first row (calcfuncs.tables), and the rows that share a core
call decide whether slowly varying quantities are interpolated (calcfuncs.nodes: up to
1.5 micro-arcseconds of nutation, 0.5 m of the Earth's position).  A partition here is
a whole number of chunks starting on a chunk boundary, and is computed chunk by chunk
the same way, so every core call sees exactly the rows it sees in one process: the
results are equal row by row, bit for bit (tests/test_engines.py checks it).
``apply_to_frame`` over a Dask DataFrame of the caller's own partitions gives that
equality only when each partition's length is a multiple of CHUNK_ROWS (the last one
aside); otherwise a row may differ by the bounds above.

Never half-written.  Each partition is written to its own part file in a staging
folder beside the target (write, then rename: a retried or rerun partition replaces
its part whole); the parts are joined in order, each as soon as it and those before it
are done, into one file beside the target, which is renamed onto the target at the end.  An interrupted run
leaves the target untouched (no file, or the old one with --replace); the staging
folder ``.partial-*`` is removed unless the process itself was killed.  On a cluster
the input, the staging folder and the target must be on a filesystem every worker
and the client see (README, "Logs beyond a sheet").
"""

import json
import os
import shutil
import tempfile

from . import api, tables

DEFAULT_PARTITION_CHUNKS = 20  # at most CHUNK_ROWS x 20 = 1,000,000 rows a partition
PARTITIONS_PER_WORKER = 4  # fewer rows a partition on a short log, so every worker works
RETRIES = 2  # a partition whose task raised is run again this many times


def partition_ranges(total_rows, partition_rows):
    """[start, stop) of each partition: whole chunks, starting on chunk boundaries."""
    step = tables.chunk_rows()
    if partition_rows < step or partition_rows % step:
        raise tables.TableError(f"a partition holds a whole number of chunks of {step} rows")
    return [(s, min(s + partition_rows, total_rows)) for s in range(0, total_rows, partition_rows)]


def default_partition_rows(total_rows, workers):
    """Whole chunks, at most DEFAULT_PARTITION_CHUNKS of them, and small enough that
    each worker gets about PARTITIONS_PER_WORKER partitions of a short log."""
    step = tables.chunk_rows()
    wanted = -(-total_rows // max(1, workers * PARTITIONS_PER_WORKER))
    chunks = min(DEFAULT_PARTITION_CHUNKS, max(1, -(-wanted // step)))
    return chunks * step


def _meta(schema):
    import pandas as pd

    return schema.empty_table().to_pandas(types_mapper=pd.ArrowDtype)


def _to_pandas(table):
    import pandas as pd

    # Arrow-backed columns: the types come back unchanged when the part is written.
    return table.to_pandas(types_mapper=pd.ArrowDtype)


def _to_arrow(frame, schema):
    import pyarrow as pa

    return pa.Table.from_pandas(frame, schema=schema, preserve_index=False)


class _ReadPartition:
    """Rows [start, stop) of the input as a pandas partition (run on a worker)."""

    def __init__(self, path):
        self.path = path

    def __call__(self, bounds):
        start, stop = bounds
        return _to_pandas(tables.read_rows(self.path, start, stop).replace_schema_metadata(None))


class _ApplyPartition:
    """The cell function over one partition, chunk by chunk as in one process."""

    def __init__(self, fn_name, plan, column_name, in_schema, out_schema):
        self.fn_name, self.plan, self.column_name = fn_name, plan, column_name
        self.in_schema, self.out_schema = in_schema, out_schema

    def __call__(self, frame):
        fn = api.lookup(self.fn_name).cell_function
        table = _to_arrow(frame, self.in_schema)
        done, _, _ = tables.with_results(fn, table, tables.compute(fn, self.plan, table),
                                         self.column_name)
        return _to_pandas(done)


class _WritePart:
    """Write a computed partition to its own part file, atomically, and return its
    counts (one row a partition)."""

    def __init__(self, staging, out_schema, column_name):
        self.staging, self.out_schema, self.column_name = staging, out_schema, column_name

    def __call__(self, frame, partition_info=None):
        import numpy as np
        import pandas as pd
        import pyarrow.compute as pc
        import pyarrow.parquet as pq

        number = partition_info["number"] if partition_info else 0
        table = _to_arrow(frame, self.out_schema)
        messages = table.column(self.column_name + "_message")
        values = table.column(self.column_name)
        failed = len(messages) - messages.null_count
        blank = pc.sum(pc.and_(values.is_null(), messages.is_null())).as_py() or 0
        first = []
        if failed:
            where = np.flatnonzero(np.asarray(messages.is_valid().to_numpy(zero_copy_only=False)))
            first = [[int(i), messages[int(i)].as_py()] for i in where[:10]]
        path = os.path.join(self.staging, f"part-{number:08d}.parquet")
        fd, partial = tempfile.mkstemp(prefix=".writing-", dir=self.staging)
        os.close(fd)
        try:
            pq.write_table(table, partial)
            os.replace(partial, path)
        finally:
            if os.path.exists(partial):
                os.unlink(partial)
        return pd.DataFrame({"part": [number], "rows": [table.num_rows], "failed": [failed],
                             "blank": [blank], "first": [json.dumps(first)]})


def apply_to_frame(frame, function, columns, constants=None, column=None):
    """A Dask DataFrame with the cell function's two result columns added (see
    calcfuncs.tables), partition by partition; ``columns`` maps argument names to
    column names, ``constants`` argument names to one value for every row (text as on
    the command line)."""
    import pyarrow as pa

    fn = api.lookup(function).cell_function
    column_name = column or api.python_name(fn.name)
    plan = tables.resolve(fn, list(frame.columns), columns, constants or {}, "the frame")
    in_schema = pa.Schema.from_pandas(frame._meta, preserve_index=False).remove_metadata()
    out_schema = pa.schema(list(in_schema) + tables.result_fields(fn, column_name))
    apply = _ApplyPartition(fn.name, plan, column_name, in_schema, out_schema)
    return frame.map_partitions(apply, meta=_meta(out_schema))


def _client(scheduler, workers, threads):
    import dask
    from distributed import Client, LocalCluster

    if scheduler:
        return Client(scheduler), None
    # Dask's sampling profiler looks at every worker thread a hundred times a second:
    # measurable beside our work, and of no use to a log run.  The workers inherit it.
    with dask.config.set({"distributed.worker.profile.enabled": False}):
        cluster = LocalCluster(n_workers=workers or os.cpu_count() or 1, threads_per_worker=1,
                               processes=not threads, dashboard_address=":0")
    return Client(cluster), cluster


def apply_to_parquet(fn, input_path, output_path, columns, constants, column_name=None,
                     replace=False, scheduler=None, workers=None, threads=False,
                     partition_rows=None, client=None):
    """Compute ``fn`` over a Parquet log on Dask into a new Parquet file; the counts of
    the run, as tables.apply_to_parquet.  ``client``: a distributed.Client to use (else
    one is made: on ``scheduler``'s cluster, or a LocalCluster of ``workers``
    processes, or threads with ``threads``)."""
    import dask.dataframe as dd
    import pyarrow.parquet as pq

    column_name = column_name or api.python_name(fn.name)
    source = tables.open_input(input_path, column_name)
    tables.resolve(fn, source.schema_arrow.names, columns, constants, input_path)
    target = tables.check_target(output_path, input_path, replace)
    if partition_rows:
        partition_ranges(0, partition_rows)  # a whole number of chunks, said before any work
    in_schema = source.schema_arrow.remove_metadata()
    out_schema = tables.output_schema(fn, source, column_name)
    staging = tempfile.mkdtemp(prefix=".partial-", dir=os.path.dirname(target))
    out = None
    own = None
    futures = []
    try:
        if client is None:
            client, cluster = _client(scheduler, workers, threads)
            own = (client, cluster)
        total = source.metadata.num_rows
        ranges = partition_ranges(total, partition_rows or default_partition_rows(
            total, len(client.scheduler_info()["workers"])))
        futures = []
        if ranges:
            frame = dd.from_map(_ReadPartition(os.path.abspath(input_path)), ranges,
                                meta=_meta(in_schema), enforce_metadata=False)
            computed = apply_to_frame(frame, fn.name, columns, constants, column_name)
            parts = computed.map_partitions(
                _WritePart(staging, out_schema, column_name),
                meta={"part": "int64", "rows": "int64", "failed": "int64", "blank": "int64",
                      "first": "object"})
            futures = client.compute(parts.to_delayed(), retries=RETRIES)
        out = tables.AtomicFile(target, ".parquet")
        stats = tables.new_stats()
        # Parts are joined in order as they come, while later partitions still compute:
        # the join is not a serial step after the whole run.
        with pq.ParquetWriter(out.partial, out_schema) as writer:
            for number, ((start, _), future) in enumerate(zip(ranges, futures)):
                row = future.result().iloc[0]
                part = pq.read_table(os.path.join(staging, f"part-{number:08d}.parquet"),
                                     schema=out_schema)
                writer.write_table(part)
                del part
                stats["rows"] += int(row["rows"])
                stats["failed"] += int(row["failed"])
                stats["blank"] += int(row["blank"])
                for i, message in json.loads(row["first"]):
                    if len(stats["first"]) < 10:
                        stats["first"].append((start + i + 1, message))
        out.commit()
        return stats
    except BaseException:
        if out is not None:
            out.abandon()
        if futures and client is not None:
            client.cancel(futures)
        raise
    finally:
        shutil.rmtree(staging, ignore_errors=True)
        if own:
            own[0].close()
            if own[1] is not None:
                own[1].close()
