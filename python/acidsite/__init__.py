"""acidsite: acidic sites, pKa estimates and base advice from SMILES.

The same engine as the ``acidsite`` command line, in-process:

>>> import acidsite
>>> rec = acidsite.scan("CC1CCCCC1=O")
>>> rec["sites"][0]["class"], rec["advice"]["base"]          # doctest: +SKIP
('ketone (cyclohexanone)', 'LDA')

* :func:`scan` gives one record, exactly the JSON record ``acidsite scan --json``
  writes (schema ``acidsite-record/4``; keys documented in the repository README).
* :func:`annotate` streams records for an iterable of SMILES, in input order,
  in parallel with the GIL released, in bounded memory.
* :func:`annotate_frame` annotates a pandas DataFrame column and returns the
  columns of the command line's CSV output (pandas is optional).
* :func:`draw` returns the SVG drawing with the sites marked; records show
  their drawing in Jupyter.
* :func:`bases` and :func:`rules` list the base catalogue and the fragment rules.

Atom indices are 0-based in the order atoms are written in the SMILES.
Estimates carry an uncertainty (``uncertainty`` is one standard uncertainty).
Advice naming hazardous reagents is a planning aid: follow your local
regulations, the safety data sheets and qualified chemists.
"""

from __future__ import annotations

import html as _html
import io as _io
import itertools as _itertools
import json as _json
import math as _math
from concurrent.futures import ThreadPoolExecutor as _ThreadPoolExecutor

from . import _native

__all__ = [
    "Record",
    "scan",
    "annotate",
    "annotate_frame",
    "draw",
    "bases",
    "rules",
    "frame_columns",
    "read_csv_output",
    "REACTIONS",
    "CONTROLS",
    "SCHEMA",
    "rule_set_version",
    "__version__",
]

#: Package version (the acidsite version it was built from).
__version__: str = _native.__version__
#: Version of the fragment rule set stamped into every record (``rule_set``).
rule_set_version: str = _native.rule_set_version
#: The record schema (``schema`` key of every record).
SCHEMA: str = _native.schema
#: Names ``reaction=`` accepts (as ``--reaction`` on the command line).
REACTIONS: tuple = tuple(_native.reactions())
#: Names ``control=`` accepts (as ``--control``).
CONTROLS: tuple = tuple(_native.controls())

#: SMILES per chunk in :func:`annotate` (memory bound and parallel grain; as
#: ``annotate --chunk`` on the command line).
DEFAULT_CHUNK = 1024


class Record(dict):
    """One output record: a ``dict`` with exactly the keys and values of the
    JSON record the command line writes, that also draws itself.

    In Jupyter a record shows its structure drawing with the sites marked and
    a short summary (``_repr_html_``, ``_repr_svg_``). :meth:`svg` returns the
    drawing as text. Compare, serialise (``json.dumps``) and pickle it as any
    dict.
    """

    def __init__(self, data=(), options=None):
        super().__init__(data)
        # The options the record was made with, so that the drawing marks
        # the same target site and base.
        self._options = dict(options or {})

    def __reduce__(self):
        return (Record, (dict(self), self._options))

    def svg(self, bond_px: float = 36.0):
        """The SVG drawing with the sites marked (``None`` for a failed record)."""
        if not self.get("ok"):
            return None
        svg, _ = _native.draw(
            self["input"],
            self._options.get("site"),
            self._options.get("base"),
            self._options.get("scale", "dmso"),
            self._options.get("reaction"),
            self._options.get("control"),
            float(bond_px),
        )
        return svg

    def _repr_svg_(self):
        return self.svg()

    def _repr_html_(self):
        esc = _html.escape
        if not self.get("ok"):
            err = self.get("error") or {}
            pos = err.get("position")
            where = "" if pos is None else f" (at character {pos})"
            return (
                f"<div><code>{esc(str(self.get('input', '')))}</code><br>"
                f"<b>{esc(str(err.get('kind', 'error')))}</b>: "
                f"{esc(str(err.get('message', '')))}{esc(where)}</div>"
            )
        parts = [f"<div>{self.svg() or ''}"]
        parts.append(f"<div><code>{esc(self['input'])}</code> {esc(self.get('formula') or '')}</div>")
        rows = []
        for s in (self.get("sites") or [])[:5]:
            dmso = "" if s.get("pka_dmso") is None else f"{s['pka_dmso']}"
            water = "" if s.get("pka_water") is None else f"{s['pka_water']}"
            rows.append(
                "<tr>"
                f"<td>#{s['rank']}</td><td>{esc(','.join(map(str, s['atoms'])))}</td>"
                f"<td>{esc(s['class'])}</td><td>{dmso}</td><td>{water}</td>"
                f"<td>&plusmn;{s['uncertainty']}</td></tr>"
            )
        if rows:
            parts.append(
                "<table><tr><th>rank</th><th>atoms</th><th>class</th>"
                "<th>pKa DMSO</th><th>pKa water</th><th>&plusmn;</th></tr>"
                + "".join(rows)
                + "</table>"
            )
        adv = self.get("advice")
        if adv and adv.get("base"):
            parts.append(
                f"<div>advice: {esc(adv['base'])} {adv.get('equivalents')} equiv, "
                f"{esc(str(adv.get('solvent') or ''))} (estimates; read the cautions "
                "and the safety data sheets)</div>"
            )
        elif self.get("advice_note"):
            parts.append(f"<div>advice: {esc(self['advice_note'])}</div>")
        for h in self.get("hazards") or []:
            parts.append(f"<div><b>substrate hazard</b> [{esc(h['id'])}]: {esc(h['text'])}</div>")
        parts.append("</div>")
        return "".join(parts)


# ---------------------------------------------------------------- arguments


def _check_options(site, base, scale, reaction, control):
    if site is not None and (isinstance(site, bool) or not isinstance(site, int)):
        raise TypeError(f"site must be an int (0-based atom index) or None, got {type(site).__name__}")
    for name, value in (("base", base), ("reaction", reaction), ("control", control)):
        if value is not None and not isinstance(value, str):
            raise TypeError(f"{name} must be a str or None, got {type(value).__name__}")
    if not isinstance(scale, str):
        raise TypeError(f"scale must be \"dmso\" or \"water\", got {type(scale).__name__}")


def _flag_pairs(flags):
    """``{"name": "SMARTS"}`` or ``["name=SMARTS", ...]`` to (name, SMARTS) pairs."""
    if flags is None:
        return None
    if isinstance(flags, str):
        flags = [flags]
    pairs = []
    items = flags.items() if isinstance(flags, dict) else flags
    for item in items:
        if isinstance(item, str):
            name, sep, smarts = item.partition("=")
            if not sep:
                raise ValueError(f"flag {item!r} is not of the form NAME=SMARTS")
            pairs.append((name, smarts))
        elif isinstance(item, tuple) and len(item) == 2 and all(isinstance(x, str) for x in item):
            pairs.append(item)
        else:
            raise TypeError(f"flags: expected \"NAME=SMARTS\" strings or a dict of name to SMARTS, got {item!r}")
    return pairs


def _threads(threads):
    if threads is None:
        return 0
    if isinstance(threads, bool) or not isinstance(threads, int) or threads < 1:
        raise ValueError(f"threads must be a positive int or None (all cores), got {threads!r}")
    return threads


def _smiles_text(x, pos):
    """One SMILES from an iterable item: str as is; None and NaN as empty
    text (an error record); bytes decoded."""
    if isinstance(x, str):
        return x
    if x is None or (isinstance(x, float) and _math.isnan(x)):
        return ""
    if isinstance(x, (bytes, bytearray)):
        return bytes(x).decode("utf-8", errors="replace")
    raise TypeError(f"item {pos} of the SMILES iterable is a {type(x).__name__}, not a str")


def _id_text(x):
    if x is None or (isinstance(x, float) and _math.isnan(x)):
        return None
    return str(x)


# ---------------------------------------------------------------- one molecule


def scan(smiles, *, site=None, base=None, scale="dmso", reaction=None, control=None, flags=None):
    """Analyse one SMILES and return its record.

    The record is exactly the one ``acidsite scan --json`` writes for the same
    SMILES and options (same keys, same values, schema :data:`SCHEMA`), as a
    :class:`Record` (a dict). A SMILES that cannot be read gives a record with
    ``ok`` false and an ``error`` (``kind``, ``message``, ``position``), never
    an exception.

    Args:
        smiles: the molecule.
        site: target the site holding this 0-based atom index instead of the
            most acidic C–H site.
        base: evaluate this base (a name from :func:`bases`) instead of the
            recommended one.
        scale: ``"dmso"`` or ``"water"``, the scale the sites are ranked on.
        reaction: the planned reaction, one of :data:`REACTIONS` (default
            alkylation).
        control: ``"kinetic"`` or ``"thermodynamic"`` for a ketone with two sides.
        flags: substructures to count: ``{"name": "SMARTS"}`` or
            ``["name=SMARTS"]`` (the record's ``flags``).

    Raises:
        TypeError, ValueError: for a bad argument (unknown base, reaction,
            control or scale, negative site, bad flag SMARTS), with a message
            listing the valid values.
    """
    if not isinstance(smiles, str):
        raise TypeError(f"smiles must be a str, got {type(smiles).__name__}")
    _check_options(site, base, scale, reaction, control)
    text = _native.scan_json(smiles, site, base, scale, reaction, control, _flag_pairs(flags))
    return Record(
        _json.loads(text),
        dict(site=site, base=base, scale=scale, reaction=reaction, control=control),
    )


def draw(smiles, *, site=None, base=None, scale="dmso", reaction=None, control=None, bond_px=36.0):
    """The SVG drawing of a molecule with its acidic sites marked, as
    ``acidsite draw`` writes it: each site by rank with its DMSO pKa, the
    advice target ringed, and every atom a ``<g data-atom="INDEX" ...>``.

    Raises:
        ValueError: when the SMILES cannot be read (the message gives the
            error and its position), or for a bad argument.
    """
    if not isinstance(smiles, str):
        raise TypeError(f"smiles must be a str, got {type(smiles).__name__}")
    _check_options(site, base, scale, reaction, control)
    svg, rec = _native.draw(smiles, site, base, scale, reaction, control, float(bond_px))
    if svg is None:
        err = _json.loads(rec).get("error") or {}
        pos = err.get("position")
        where = "" if pos is None else f" (at character {pos})"
        raise ValueError(f"cannot draw {smiles!r}: {err.get('kind', 'error')}: {err.get('message', '')}{where}")
    return svg


# ---------------------------------------------------------------- bulk


def _chunks(smiles, ids, chunk):
    """(smiles list, ids list or None, first position) per chunk, lazily."""
    it = iter(smiles)
    id_it = None if ids is None else iter(ids)
    pos = 0
    while True:
        batch = [_smiles_text(x, pos + k) for k, x in enumerate(_itertools.islice(it, chunk))]
        if not batch:
            if id_it is not None and next(id_it, _END) is not _END:
                raise ValueError(f"ids has more items than the {pos} SMILES")
            return
        batch_ids = None
        if id_it is not None:
            batch_ids = [_id_text(x) for x in _itertools.islice(id_it, len(batch))]
            if len(batch_ids) != len(batch):
                raise ValueError(f"ids ended after {pos + len(batch_ids)} items, before the SMILES did")
        yield batch, batch_ids, pos
        pos += len(batch)


_END = object()


def _pipeline(work, chunks):
    """Run ``work`` on each chunk in a helper thread (the native call releases
    the GIL) while the next chunk is read; yield results in order. At most
    two chunks are alive besides the one being consumed."""
    pool = _ThreadPoolExecutor(max_workers=1, thread_name_prefix="acidsite")
    pending = None
    try:
        for batch in chunks:
            fut = pool.submit(work, *batch)
            if pending is not None:
                yield pending.result()
            pending = fut
        if pending is not None:
            yield pending.result()
    finally:
        pool.shutdown(wait=True)


def annotate(
    smiles,
    *,
    ids=None,
    threads=None,
    sites_only=False,
    site=None,
    base=None,
    scale="dmso",
    reaction=None,
    control=None,
    flags=None,
    chunk=DEFAULT_CHUNK,
    as_json=False,
    detail="full",
):
    """Annotate an iterable of SMILES: an iterator of records, one per item, in
    input order, failures included (the ``acidsite annotate`` engine).

    The input is read lazily in chunks of ``chunk`` items; each chunk is
    analysed on ``threads`` worker threads with the GIL released while the
    next one is read, so memory stays bounded whatever the input size (a
    generator of ten million SMILES is fine). ``line`` is the 1-based position
    in the iterable.

    Args:
        smiles: iterable of SMILES strings (None or NaN items give error records).
        ids: optional iterable of identifiers, one per SMILES (the ``id`` key).
        threads: worker threads (None: one per core).
        sites_only: skip the base advice (``advice`` is None); much faster.
        site, base, scale, reaction, control, flags: as in :func:`scan`,
            applied to every record.
        chunk: items per chunk.
        detail: ``"full"`` (default; schema acidsite-record, every caution and
            reason worded) or ``"brief"`` (schema acidsite-brief, as
            ``acidsite annotate --detail brief``: the answer with caution and
            rejected-base ids, about 1.5 KB a record; the wording of each id
            is in :func:`bases`).
        as_json: yield each record's JSON text (the command line's line,
            without the line end) instead of a :class:`Record`; faster when
            the records are written out again.

    Raises:
        TypeError, ValueError: for bad arguments, at the call (not at the
            first item); TypeError for an item that is not text, and
            ValueError when ``ids`` does not have one item per SMILES, when
            the iterator reaches it.
    """
    if isinstance(smiles, (str, bytes)):
        raise TypeError("annotate takes an iterable of SMILES; for one SMILES use acidsite.scan()")
    if isinstance(chunk, bool) or not isinstance(chunk, int) or chunk < 1:
        raise ValueError(f"chunk must be a positive int, got {chunk!r}")
    _check_options(site, base, scale, reaction, control)
    if detail not in ("full", "brief"):
        raise ValueError(f"detail must be \"full\" or \"brief\", got {detail!r}")
    ann = _native.Annotator(
        site, base, scale, reaction, control, _flag_pairs(flags), bool(sites_only), _threads(threads), None, detail
    )
    options = dict(site=site, base=base, scale=scale, reaction=reaction, control=control)
    return _annotate_iter(ann, _chunks(smiles, ids, chunk), options, as_json)


def _annotate_iter(ann, chunks, options, as_json):
    def work(batch, batch_ids, pos):
        return ann.run(batch, batch_ids, pos + 1)

    loads = _json.loads
    for texts in _pipeline(work, chunks):
        if as_json:
            yield from texts
        else:
            # Parsed one at a time as they are taken: a record as Python
            # objects is several times the size of its JSON text.
            for t in texts:
                yield Record(loads(t), options)


# ---------------------------------------------------------------- pandas

_INT_COLUMNS = {"line"}
_NULLABLE_INT_COLUMNS = {"rank", "hydrogens"}
_FLOAT_COLUMNS = {
    "top_ch_pka_dmso",
    "top_ch_pka_water",
    "top_ch_uncertainty",
    "equivalents",
    "temperature_c",
    "conversion",
    "pka_dmso",
    "pka_water",
    "uncertainty",
}
_BOOL_COLUMNS = {"ok"}


def frame_columns(per_site=False):
    """The columns of :func:`annotate_frame` and of the command line's CSV
    output (without carried input columns), with their pandas dtypes."""
    header = _native.Annotator(rows="site" if per_site else "molecule", threads=1).header()
    return [(c, _dtype(c)) for c in header.strip().split(",")]


def _dtype(c):
    if c in _INT_COLUMNS:
        return "int64"
    if c in _NULLABLE_INT_COLUMNS:
        return "Int64"
    if c in _FLOAT_COLUMNS:
        return "float64"
    if c in _BOOL_COLUMNS:
        return "bool"
    return "object"


def read_csv_output(path_or_buffer, **kwargs):
    """Read a CSV written by ``acidsite annotate --format csv`` into a pandas
    DataFrame with the dtypes :func:`annotate_frame` uses (text columns as
    str with empty cells as NaN, numbers as float, ``ok`` as bool).
    Carried input columns are read as text."""
    import pandas as pd

    header = pd.read_csv(path_or_buffer, nrows=0, **kwargs).columns
    if hasattr(path_or_buffer, "seek"):
        path_or_buffer.seek(0)
    dtype = {}
    for c in header:
        t = _dtype(c)
        dtype[c] = {"object": str, "bool": "boolean"}.get(t, t)
    df = pd.read_csv(
        path_or_buffer,
        dtype=dtype,
        keep_default_na=False,
        na_values=[""],
        true_values=["true"],
        false_values=["false"],
        **kwargs,
    )
    if "ok" in df.columns:
        df["ok"] = df["ok"].astype(bool)
    return df


def annotate_frame(
    df,
    smiles_column="smiles",
    *,
    per_site=False,
    id_column=None,
    keep_columns=True,
    with_record=False,
    threads=None,
    sites_only=False,
    site=None,
    base=None,
    scale="dmso",
    reaction=None,
    control=None,
    chunk=16384,
):
    """Annotate the SMILES column of a pandas DataFrame.

    Returns a DataFrame with the columns of ``acidsite annotate --format csv``
    (``--per-site`` with ``per_site=True``): ``line``, ``id``, the frame's other
    columns (``keep_columns``), then ``smiles``, ``ok``, ``formula``, the top
    C–H site, the advice and ``error``. One row per input row (failures
    included, with ``ok`` False and ``error``), or per site with
    ``per_site=True`` (a row without sites still gives one row); the input's
    index is kept (repeated per site). ``line`` is the 1-based row position
    (the command line counts file lines, header included).

    Args:
        df: a pandas DataFrame.
        smiles_column: name of the SMILES column.
        id_column: name of the identifier column (default: a column named
            ``id`` or ``name``, any case, as the command line picks it).
        keep_columns: carry the frame's other columns through, after ``id``.
        with_record: add a ``record`` column with each record's JSON text.
        threads, sites_only, site, base, scale, reaction, control: as in
            :func:`annotate`.
        chunk: rows per native call.
    """
    try:
        import numpy as np
        import pandas as pd
    except ImportError as e:  # pragma: no cover - depends on the environment
        raise ImportError("annotate_frame needs pandas: pip install pandas") from e
    if not isinstance(df, pd.DataFrame):
        raise TypeError(f"annotate_frame takes a pandas DataFrame, got {type(df).__name__}")
    if smiles_column not in df.columns:
        raise ValueError(
            f"no column {smiles_column!r} in the frame; columns: {', '.join(map(str, df.columns))}"
        )
    if id_column is None:
        id_column = next(
            (
                c
                for d in ("id", "name")
                for c in df.columns
                if isinstance(c, str) and c.lower() == d and c != smiles_column
            ),
            None,
        )
    elif id_column not in df.columns:
        raise ValueError(f"no column {id_column!r} in the frame; columns: {', '.join(map(str, df.columns))}")
    if isinstance(chunk, bool) or not isinstance(chunk, int) or chunk < 1:
        raise ValueError(f"chunk must be a positive int, got {chunk!r}")
    if per_site and with_record:
        raise ValueError("with_record needs one row per molecule (per_site=False)")
    _check_options(site, base, scale, reaction, control)
    ann = _native.Annotator(
        site,
        base,
        scale,
        reaction,
        control,
        None,
        bool(sites_only),
        _threads(threads),
        "site" if per_site else "molecule",
    )
    col = df[smiles_column]
    smiles = [_smiles_text(x, i) if not _isna(x) else "" for i, x in enumerate(col.tolist())]
    ids = None
    if id_column is not None:
        ids = [None if _isna(x) else str(x) for x in df[id_column].tolist()]
    texts, counts, records = [], [], []
    for start in range(0, len(smiles), chunk):
        part_ids = None if ids is None else ids[start : start + chunk]
        text, n, recs = ann.run_rows(smiles[start : start + chunk], part_ids, start + 1, bool(with_record))
        texts.append(text)
        counts.extend(n)
        if recs is not None:
            records.extend(recs)
    out = read_csv_output(_io.StringIO(ann.header() + "".join(texts)))
    take = np.repeat(np.arange(len(df)), counts)
    out.index = df.index.take(take)
    if keep_columns:
        carried = [c for c in df.columns if c != smiles_column and c != id_column]
        at = list(out.columns).index("id") + 1
        for k, c in enumerate(carried):
            name = c if c not in out.columns else f"{c}_input"
            out.insert(at + k, name, df[c].take(take).to_numpy())
    if with_record:
        out["record"] = records
    return out


def _isna(x):
    if x is None:
        return True
    try:
        return bool(x != x)
    except (TypeError, ValueError):
        # pandas.NA and friends.
        return True


# ---------------------------------------------------------------- listings


def bases():
    """The base catalogue: one dict per base, as ``acidsite bases --json``
    (conjugate-acid pKa in DMSO, water and THF with citation keys, family,
    counter-ion, solvents, temperature range, hazards)."""
    return [_json.loads(t) for t in _native.bases_json()]


def rules():
    """The fragment rule set: one dict per class rule and per substituent
    increment, as ``acidsite rules --json`` (``kind`` is ``rule`` or
    ``increment``; values, uncertainty and citation key)."""
    return [_json.loads(t) for t in _native.rules_json()]
