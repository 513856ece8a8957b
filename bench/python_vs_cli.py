#!/usr/bin/env python3
"""Benchmark (run by hand, never in CI): the Python package's in-process
`acidsite.annotate` against the command line on the same molecules.

    python bench/python_vs_cli.py [SMILES_CSV_GZ] [--threads N]

Default input: corpus/bulk/moses_100k.csv.gz (100,000 MOSES molecules). Both
sides produce full JSON records (sites and base advice): the command line
writes JSON Lines to a pipe read by this process (as a planning script
calling it through `subprocess` would); the package yields dicts. Each side
runs with N threads (default: all cores) and with one thread (per core).
"""

import argparse
import gzip
import json
import os
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def main():
    p = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    p.add_argument("input", nargs="?", default=str(ROOT / "corpus" / "bulk" / "moses_100k.csv.gz"))
    p.add_argument("--threads", type=int, default=os.cpu_count())
    p.add_argument("--bin", default=str(ROOT / "target" / "release" / "acidsite"))
    args = p.parse_args()
    import acidsite

    with gzip.open(args.input, "rt") as f:
        next(f)
        smiles = [line.split(",")[0].strip() for line in f if line.strip()]
    n = len(smiles)
    text = "".join(s + "\n" for s in smiles)
    print(f"{n} molecules, acidsite {acidsite.__version__}, {os.cpu_count()} cores")
    print(f"{'run':<44} {'wall s':>8} {'records/s':>11}")
    for threads in sorted({args.threads, 1}, reverse=True):
        t0 = time.perf_counter()
        k = 0
        for rec in acidsite.annotate(smiles, threads=threads):
            k += 1
        t_py = time.perf_counter() - t0
        assert k == n
        t0 = time.perf_counter()
        proc = subprocess.Popen([args.bin, "annotate", "--threads", str(threads), "--quiet"],
                                stdin=subprocess.PIPE, stdout=subprocess.PIPE, text=True)
        # Feed stdin from a thread so the pipe cannot deadlock.
        import threading

        feeder = threading.Thread(target=lambda: (proc.stdin.write(text), proc.stdin.close()))
        feeder.start()
        k = sum(1 for line in proc.stdout if json.loads(line))
        feeder.join()
        proc.wait()
        t_cli = time.perf_counter() - t0
        assert k == n
        print(f"{f'python acidsite.annotate, {threads} thread(s)':<44} {t_py:8.2f} {n / t_py:11.0f}")
        print(f"{f'CLI through subprocess + json, {threads} thread(s)':<44} {t_cli:8.2f} {n / t_cli:11.0f}")
        print(f"in-process / subprocess speed ratio, {threads} thread(s): {t_cli / t_py:.2f} x")
    return 0


if __name__ == "__main__":
    sys.exit(main())
