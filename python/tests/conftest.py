"""Shared fixtures: the command-line binary (the reference the package must
agree with) and corpus samples from the repository."""

import os
import subprocess
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
CORPUS = ROOT / "corpus"


def _binary():
    env = os.environ.get("ACIDSITE_BIN")
    if env:
        return Path(env)
    path = ROOT / "target" / "release" / "acidsite"
    if not path.exists():
        # CI has built it with `cargo test --release` already; build it here
        # otherwise (the tests compare against the real command line).
        subprocess.run(["cargo", "build", "--release", "--bin", "acidsite"], cwd=ROOT, check=True)
    return path


@pytest.fixture(scope="session")
def cli():
    """Run the acidsite binary; returns the CompletedProcess (text)."""
    exe = str(_binary())

    def run(*args, input=None, check_codes=(0, 1)):
        p = subprocess.run([exe, *map(str, args)], capture_output=True, text=True, input=input)
        assert p.returncode in check_codes, p.stderr
        return p

    run.exe = exe
    return run


def real_smiles(n=None):
    """(smiles, id) pairs from corpus/bulk/real.smi: 5,000 real molecules
    (MOSES test split, Tox21, HIV; see corpus/bulk/README.md)."""
    out = []
    for line in (CORPUS / "bulk" / "real.smi").read_text().splitlines():
        if not line.strip() or line.startswith("#"):
            continue
        parts = line.split(None, 1)
        out.append((parts[0], parts[1].strip() if len(parts) > 1 else None))
    return out if n is None else out[:n]
