"""Fit Hammett rho values for the aryl series of corpus/sites/literature.tsv (train rows only).

pKa(X) = pKa(H) - rho * sum(sigma): least squares for intercept and rho, using fragments/sigma.tsv.
Prints the fits; sites_write_rho() writes them into corpus/sites/rho.tsv together with the
published/recalled values listed in PUBLISHED. Needs only the committed corpus files.
"""
import os

ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))


def read(path):
    with open(path) as f:
        lines = [line.rstrip("\n").split("\t") for line in f if line.strip() and not line.startswith("#")]
    return [dict(zip(lines[0], cells)) for cells in lines[1:]]


# series id -> (description, class, solvent column, sigma column for para acceptors,
#               [(literature id, [(sigma id, position)])])
SERIES = {
    "rho-arcoch3-dmso": ("ArCOCH3 (aryl methyl ketones), alpha C-H", "ketone", "pka_dmso", "sigma_para",
                         [("lit-002", []), ("lit-017", [("s-ome", "para")]), ("lit-018", [("s-me", "para")]),
                          ("lit-019", [("s-cl", "para")]), ("lit-020", [("s-br", "para")]),
                          ("lit-021", [("s-cf3", "para")]), ("lit-022", [("s-cn", "para")]),
                          ("lit-023", [("s-nme2", "para")])]),
    "rho-arch2cn-dmso": ("ArCH2CN (arylacetonitriles), alpha C-H", "nitrile", "pka_dmso", "sigma_para_minus",
                         [("lit-042", []), ("lit-043", [("s-no2", "para")]), ("lit-044", [("s-cn", "para")])]),
    "rho-aroh-dmso": ("ArOH (phenols), O-H", "phenol", "pka_dmso", "sigma_para_minus",
                      [("lit-119", []), ("lit-120", [("s-me", "para")]), ("lit-121", [("s-ome", "para")]),
                       ("lit-122", [("s-cl", "para")]), ("lit-123", [("s-cn", "para")]),
                       ("lit-124", [("s-no2", "para")])]),
    "rho-aroh-water": ("ArOH (phenols), O-H", "phenol", "pka_water", "sigma_para_minus",
                       [("lit-119", []), ("lit-120", [("s-me", "para")]), ("lit-121", [("s-ome", "para")]),
                        ("lit-122", [("s-cl", "para")]), ("lit-123", [("s-cn", "para")]),
                        ("lit-124", [("s-no2", "para")]), ("lit-125", [("s-no2", "meta")]),
                        ("lit-126", [("s-cl", "meta")])]),
    "rho-arcoch2co2et-water": ("ArCOCH2CO2Et (ethyl aroylacetates), alpha C-H", "ketoester_beta", "pka_water",
                               "sigma_para",
                               [("lit-077", []), ("lit-078", [("s-no2", "para")]), ("lit-079", [("s-ome", "para")]),
                                ("lit-167", [("s-cl", "para")]), ("lit-168", [("s-br", "para")]),
                                ("lit-169", [("s-me", "para")])]),
}


def fit(series_id, include_holdout=False):
    lit = {r["id"]: r for r in read(os.path.join(ROOT, "corpus", "sites", "literature.tsv"))}
    sigma = {r["id"]: r for r in read(os.path.join(ROOT, "fragments", "sigma.tsv"))}
    desc, cls, col, para_col, members = SERIES[series_id]
    xs, ys = [], []
    for lit_id, subs in members:
        row = lit[lit_id]
        if not row[col] or (row["split"] == "holdout" and not include_holdout):
            continue
        s = 0.0
        for sid, pos in subs:
            s += float(sigma[sid]["sigma_meta" if pos == "meta" else para_col])
        xs.append(s)
        ys.append(float(row[col]))
    n = len(xs)
    if n < 2:
        return None
    mx, my = sum(xs) / n, sum(ys) / n
    sxx = sum((x - mx) ** 2 for x in xs)
    slope = sum((x - mx) * (y - my) for x, y in zip(xs, ys)) / sxx
    rho = -slope
    resid = [y - (my + slope * (x - mx)) for x, y in zip(xs, ys)]
    rms = (sum(r * r for r in resid) / n) ** 0.5
    return {"rho": rho, "n": n, "rms": rms, "desc": desc, "class": cls,
            "solvent": "DMSO" if col == "pka_dmso" else "water", "scale": para_col}


# Published reaction constants as recalled by the curator (no source at hand: from-memory).
# (id, series, class, solvent, rho, sigma scale, note)
PUBLISHED = [
    ("rho-arcooh-water-def", "ArCOOH (benzoic acids), O-H", "carboxylic_acid_oh", "water", 1.00, "sigma_para",
     "definition of the sigma scale (25 C)"),
    ("rho-aroh-water-lit", "ArOH (phenols), O-H", "phenol", "water", 2.23, "sigma_para_minus",
     "classical value for phenol ionisation, 25 C"),
    ("rho-arnh3-water-lit", "ArNH3+ (anilinium ions), N-H", "ammonium", "water", 2.89, "sigma_para_minus",
     "classical value for anilinium ionisation, 25 C"),
    ("rho-arcoch3-dmso-lit", "ArCOCH3 (aryl methyl ketones), alpha C-H", "ketone", "DMSO", 3.55, "sigma_para",
     "Bordwell-group acetophenone series"),
]


def write_rho():
    path = os.path.join(ROOT, "corpus", "sites", "rho.tsv")
    with open(path, "w") as f:
        f.write("# acidsite corpus/sites/rho.tsv, version 1: Hammett reaction constants for pKa series.\n")
        f.write("# pKa(X) = pKa(H) - rho * sum(sigma). Columns: id, series, class, solvent, rho, sigma_scale\n")
        f.write("# (which column of fragments/sigma.tsv to use for para substituents; meta always sigma_meta),\n")
        f.write("# n_points, rms (fit residual, pKa units; empty for recalled values), source, note.\n")
        f.write("# acidsite-fit rows are least-squares fits of the TRAIN rows of literature.tsv\n")
        f.write("# (tests/reference/sites_fit_rho.py) and inherit those rows' uncertainty.\n")
        f.write("id\tseries\tclass\tsolvent\trho\tsigma_scale\tn_points\trms\tsource\tnote\n")
        for pid, series, cls, solvent, rho, scale, note in PUBLISHED:
            f.write(f"{pid}\t{series}\t{cls}\t{solvent}\t{rho:.2f}\t{scale}\t\t\tfrom-memory\t{note}\n")
        for sid in SERIES:
            r = fit(sid)
            if not r:
                continue
            note = "fit of train rows" + ("; only two points, treat as rough" if r["n"] < 3 else "")
            f.write(f"{sid}\t{r['desc']}\t{r['class']}\t{r['solvent']}\t{r['rho']:.2f}\t{r['scale']}\t"
                    f"{r['n']}\t{r['rms']:.2f}\tacidsite-fit\t{note}\n")
            print(f"{sid}: rho = {r['rho']:.2f} (n = {r['n']}, rms = {r['rms']:.2f}, {r['scale']})")


if __name__ == "__main__":
    write_rho()
