"""The Spark example (examples/spark_annotate.py) in local mode against the
command line, on 100,000 MOSES molecules (corpus/bulk/moses_100k.csv.gz, the
first 100,000 rows of the MOSES test split; see corpus/bulk/README.md).

Skipped, with the reason printed, when PySpark or Java is missing (`.ci/run`
installs both). Set ACIDSITE_SPARK_N to run on fewer rows while developing.
"""

import csv
import gzip
import hashlib
import importlib.util
import json
import os
import shutil
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
MOSES = ROOT / "corpus" / "bulk" / "moses_100k.csv.gz"


def _why_not():
    if importlib.util.find_spec("pyspark") is None:
        return "pyspark is not installed"
    if importlib.util.find_spec("pyarrow") is None:
        return "pyarrow is not installed"
    if shutil.which("java") is None and not os.environ.get("JAVA_HOME"):
        return "no Java runtime (java not on PATH, JAVA_HOME unset)"
    return None


def _digest(rec):
    """Hash of a record without `line` (Spark numbers lines within a batch)
    and `columns` (the command line carries the CSV's other columns there;
    in Spark they stay columns of the row)."""
    rec = dict(rec)
    rec.pop("line", None)
    rec.pop("columns", None)
    return hashlib.sha256(json.dumps(rec, sort_keys=True).encode()).hexdigest()


@pytest.mark.skipif(_why_not() is not None, reason=_why_not() or "")
def test_spark_example_given_moses_equals_cli_records(cli, tmp_path):
    n = int(os.environ.get("ACIDSITE_SPARK_N", "100000"))
    src = tmp_path / "library.csv"
    with gzip.open(MOSES, "rt") as f, open(src, "w", newline="") as out:
        rows = csv.reader(f)
        next(rows)
        w = csv.writer(out)
        w.writerow(["id", "smiles"])
        for i, row in enumerate(rows):
            if i == n:
                break
            w.writerow([f"moses-{i + 1}", row[0]])

    # The reference: the command line on the same file.
    want = {}
    p = subprocess.Popen(
        [str(cli.exe), "annotate", "--input-format", "csv", "--column", "smiles", "--id-column", "id", str(src)],
        stdout=subprocess.PIPE,
        text=True,
    )
    for line in p.stdout:
        rec = json.loads(line)
        want[rec["id"]] = _digest(rec)
    assert p.wait() in (0, 1)
    assert len(want) == n

    out = tmp_path / "out.parquet"
    r = subprocess.run(
        [sys.executable, str(ROOT / "examples" / "spark_annotate.py"), str(src), str(out),
         "--master", "local[2]", "--partitions", "4"],
        capture_output=True,
        text=True,
        # Workers in local mode run this interpreter (with acidsite and pyarrow).
        env={**os.environ, "PYSPARK_PYTHON": sys.executable, "PYSPARK_DRIVER_PYTHON": sys.executable},
    )
    assert r.returncode == 0, r.stderr[-3000:]

    import pyarrow.parquet as pq

    seen = 0
    mismatched = []
    for part in sorted(out.glob("*.parquet")):
        for batch in pq.ParquetFile(part).iter_batches(columns=["id", "ok", "record"], batch_size=5000):
            for rid, ok, text in zip(*(batch.column(i).to_pylist() for i in range(3))):
                rec = json.loads(text)
                seen += 1
                assert rec["id"] == rid and rec["ok"] == ok
                if want.pop(rid, None) != _digest(rec):
                    mismatched.append(rid)
    print(f"spark local[2]: {seen} records, {len(mismatched)} differ from the command line")
    assert seen == n
    assert not want, f"{len(want)} ids missing from the Spark output"
    assert not mismatched, f"records differ for {mismatched[:5]}"
