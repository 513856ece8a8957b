#!/usr/bin/env python3
"""Annotate a large SMILES table on Apache Spark with the acidsite package.

Each executor runs the Rust engine on its partitions through
``DataFrame.mapInPandas``: Spark hands every task its rows as pandas batches,
``acidsite.annotate_frame`` analyses a batch (in parallel, GIL released) and
returns the command line's CSV columns plus the full JSON record; Spark writes
the result to Parquet. Install the package on every executor
(``pip install ./python`` in the cluster's image or environment).

    python examples/spark_annotate.py library.parquet out.parquet --smiles-column smiles
    python examples/spark_annotate.py library.csv out.parquet --id-column compound_id
    spark-submit examples/spark_annotate.py s3://bucket/library/ s3://bucket/sites/ --sites-only

Output columns: the id column (if any), then ``ok``, ``formula``, the top C–H
site (``top_ch_*``), the advice (``base``, ``equivalents``, ``solvent``,
``temperature_c``, ``conversion``, ``warnings``), ``error``, and ``record``
(the JSON record as ``acidsite annotate`` writes it, except ``line``, which
counts rows within a batch, and ``columns``: the row's other columns stay
Spark columns). Rows keep no global order: join on the id.
"""

import argparse
import sys


def output_schema(id_column):
    """Spark schema of the output (fixed: mapInPandas needs it up front)."""
    from pyspark.sql import types as T

    import acidsite

    spark_type = {
        "int64": T.LongType(),
        "Int64": T.LongType(),
        "float64": T.DoubleType(),
        "bool": T.BooleanType(),
        "object": T.StringType(),
    }
    fields = []
    if id_column:
        fields.append(T.StructField(id_column, T.StringType()))
    for name, dtype in acidsite.frame_columns(per_site=False):
        if name in ("line", "id"):
            continue
        fields.append(T.StructField(name, spark_type[dtype]))
    fields.append(T.StructField("record", T.StringType()))
    return T.StructType(fields)


def annotate_batches(smiles_column, id_column, options):
    """The function each task runs: pandas batches in, annotated batches out."""

    def run(batches):
        import acidsite

        for pdf in batches:
            cols = [smiles_column] + ([id_column] if id_column else [])
            out = acidsite.annotate_frame(
                pdf[cols],
                smiles_column=smiles_column,
                id_column=id_column,
                keep_columns=False,
                with_record=True,
                **options,
            )
            out = out.drop(columns=["line"])
            if id_column:
                out = out.rename(columns={"id": id_column})
            else:
                out = out.drop(columns=["id"])
            yield out.reset_index(drop=True)

    return run


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    p.add_argument("input", help="Parquet file or folder, or CSV with a header row (by suffix, or --input-format)")
    p.add_argument("output", help="Parquet folder to write")
    p.add_argument("--input-format", choices=["parquet", "csv"], help="default: from the input's suffix")
    p.add_argument("--smiles-column", default="smiles")
    p.add_argument("--id-column", help="identifier column carried into the output (default: 'id' if present)")
    p.add_argument("--master", help="Spark master, e.g. local[2] (default: spark-submit's or Spark's default)")
    p.add_argument("--partitions", type=int, help="repartition the input into this many tasks")
    p.add_argument("--threads-per-task", type=int, default=1,
                   help="acidsite worker threads per Spark task (default 1: Spark runs one task per core)")
    p.add_argument("--batch-rows", type=int, default=10000, help="rows per pandas batch (Arrow batch size)")
    p.add_argument("--sites-only", action="store_true", help="sites and pKa only, no base advice")
    p.add_argument("--reaction", help="planned reaction for every row (see acidsite.REACTIONS)")
    p.add_argument("--control", choices=["kinetic", "thermodynamic"])
    p.add_argument("--scale", choices=["dmso", "water"], default="dmso")
    p.add_argument("--mode", default="overwrite", choices=["overwrite", "error", "append"],
                   help="Spark save mode for the output")
    args = p.parse_args(argv)

    import acidsite
    from pyspark.sql import SparkSession

    options = dict(
        threads=args.threads_per_task,
        sites_only=args.sites_only,
        reaction=args.reaction,
        control=args.control,
        scale=args.scale,
    )
    # Check the options on the driver before any task starts.
    acidsite.annotate([], **options)

    builder = SparkSession.builder.appName("acidsite-annotate")
    if args.master:
        builder = builder.master(args.master)
    builder = builder.config("spark.sql.execution.arrow.maxRecordsPerBatch", str(args.batch_rows))
    spark = builder.getOrCreate()

    fmt = args.input_format or ("csv" if args.input.lower().rstrip("/").endswith((".csv", ".csv.gz")) else "parquet")
    if fmt == "csv":
        df = spark.read.option("header", True).csv(args.input)
    else:
        df = spark.read.parquet(args.input)
    if args.smiles_column not in df.columns:
        sys.exit(f"no column {args.smiles_column!r} in {args.input}; columns: {', '.join(df.columns)}")
    id_column = args.id_column or next((c for c in df.columns if c.lower() == "id"), None)
    if id_column and id_column not in df.columns:
        sys.exit(f"no column {id_column!r} in {args.input}; columns: {', '.join(df.columns)}")
    cols = [args.smiles_column] + ([id_column] if id_column else [])
    df = df.select(*[df[c].cast("string") for c in cols])
    if args.partitions:
        df = df.repartition(args.partitions)

    out = df.mapInPandas(annotate_batches(args.smiles_column, id_column, options), output_schema(id_column))
    out.write.mode(args.mode).parquet(args.output)
    spark.stop()


if __name__ == "__main__":
    main()
