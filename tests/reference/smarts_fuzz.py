#!/usr/bin/env python3
"""Random SMARTS of the supported subset, with RDKit's unique match counts,
for a differential check of the parser and matcher against RDKit.

Writes DIR/patterns.tsv, DIR/molecules.tsv and DIR/expected.tsv in the
formats of corpus/smarts/ (nothing is committed), then run
    SMARTS_REFERENCE_DIR=DIR cargo test --release --test smarts -- smarts_reference:: --ignored

Usage (from the repository root):
    python3 tests/reference/smarts_fuzz.py DIR [N_PATTERNS] [N_MOLECULES] [SEED]
Molecules are the first N_MOLECULES of corpus/smarts/molecules.tsv.
"""
import os
import random
import sys

from rdkit import Chem, RDLogger, rdBase

RDLogger.DisableLog("rdApp.*")
HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(os.path.dirname(HERE))

OUT = sys.argv[1]
N_PAT = int(sys.argv[2]) if len(sys.argv) > 2 else 400
N_MOL = int(sys.argv[3]) if len(sys.argv) > 3 else 600
rng = random.Random(int(sys.argv[4]) if len(sys.argv) > 4 else 7)

ELEMENTS = ["C", "c", "N", "n", "O", "o", "S", "s", "F", "Cl", "Br", "P", "#6", "#7", "#8", "#16", "*", "A", "a"]
ORGANIC = ["C", "c", "N", "n", "O", "o", "S", "s", "F", "Cl", "Br", "I", "P", "*", "A", "a"]


def num(lo, hi):
    return str(rng.randint(lo, hi))


def primitive(depth):
    r = rng.random()
    if r < 0.35:
        return rng.choice(ELEMENTS)
    if r < 0.92:
        kind = rng.choice(["H", "h", "D", "X", "v", "R", "r", "x", "+", "-", "R0", "x0", "H0", "h0"])
        if kind in ("R0", "x0", "H0", "h0"):
            return kind
        if kind == "H":
            return "H" + num(0, 3)
        if kind == "h":
            return rng.choice(["h", "h" + num(0, 3)])
        if kind in ("D", "X"):
            return rng.choice([kind, kind + num(1, 4)])
        if kind == "v":
            return "v" + num(1, 6)
        if kind == "R":
            return rng.choice(["R", "R" + num(1, 3)])
        if kind == "r":
            return rng.choice(["r", "r" + rng.choice(["3", "5", "6", "7"])])
        if kind == "x":
            return rng.choice(["x", "x" + num(2, 4)])
        return rng.choice([kind, kind + "1", kind * 2, "+0"])
    if depth < 2:
        return "$(" + chain(depth + 1, rng.randint(1, 3)) + ")"
    return rng.choice(ELEMENTS)


def atom_expr(depth):
    # ';' over ',' over '&' / juxtaposition over '!'
    def and_part():
        parts = []
        for _ in range(rng.randint(1, 3)):
            neg = "!" if rng.random() < 0.2 else ""
            parts.append(neg + primitive(depth))
        out = parts[0]
        for p in parts[1:]:
            out += rng.choice(["&", "&", ""]) if not (p[0].isdigit() or out[-1].isdigit()) else "&"
            out += p
        return out

    def or_part():
        return ",".join(and_part() for _ in range(rng.choice([1, 1, 2])))

    return ";".join(or_part() for _ in range(rng.choice([1, 1, 2])))


def atom(depth):
    if rng.random() < 0.4:
        return rng.choice(ORGANIC)
    return "[" + atom_expr(depth) + "]"


def bond():
    r = rng.random()
    if r < 0.45:
        return ""
    simple = ["-", "=", "#", ":", "~", "@"]
    if r < 0.8:
        return rng.choice(simple)
    a = rng.choice(simple)
    b = rng.choice(simple)
    op = rng.choice(["&", ",", ";", ""])
    neg = "!" if rng.random() < 0.4 else ""
    return neg + a + op + b


def chain(depth, n):
    out = atom(depth)
    ring_open = []
    for i in range(n - 1):
        if rng.random() < 0.25 and i > 0:
            out += "(" + bond() + atom(depth) + ")"
        out += bond() + atom(depth)
        if rng.random() < 0.12 and len(ring_open) < 2:
            label = str(len(ring_open) + 1)
            ring_open.append(label)
            out += label
    # Close rings only if the ring would have at least three atoms.
    for label in ring_open:
        out += label
    return out


def main():
    os.makedirs(OUT, exist_ok=True)
    pats = []
    tries = 0
    while len(pats) < N_PAT and tries < N_PAT * 20:
        tries += 1
        s = chain(0, rng.randint(1, 5))
        if rng.random() < 0.05:
            s += "." + chain(0, 1)
        q = Chem.MolFromSmarts(s)
        if q is None:
            continue
        pats.append((f"fuzz{len(pats)}", s, q))
    mols = []
    with open(os.path.join(ROOT, "corpus", "smarts", "molecules.tsv")) as f:
        for line in f:
            if line.startswith("#"):
                continue
            mols.append(line.rstrip("\n"))
            if len(mols) == N_MOL:
                break
    with open(os.path.join(OUT, "patterns.tsv"), "w") as f:
        for name, s, _ in pats:
            f.write(f"{name}\t{s}\tfuzz\n")
    p = Chem.RemoveHsParameters()
    p.removeIsotopes = True
    with open(os.path.join(OUT, "molecules.tsv"), "w") as fm, open(os.path.join(OUT, "expected.tsv"), "w") as fe:
        fe.write(f"# RDKit {rdBase.rdkitVersion}\n")
        for line in mols:
            fm.write(line + "\n")
            mid, _, smi = line.split("\t")[:3]
            m = Chem.RemoveHs(Chem.MolFromSmiles(smi), p)
            counts = [len(m.GetSubstructMatches(q, uniquify=True, maxMatches=10**6)) for _, _, q in pats]
            fe.write(mid + "\t" + ",".join(map(str, counts)) + "\n")
    print(f"{len(pats)} patterns x {len(mols)} molecules written to {OUT}")


if __name__ == "__main__":
    main()
