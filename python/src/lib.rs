//! `acidsite._native`: the Rust engine behind the Python package.
//!
//! The Python side (`python/acidsite/__init__.py`) holds the public API; this
//! module gives it records as JSON text written by the same writer as the
//! command line (`Record::write_json`), so `json.loads` of a record here equals
//! `json.loads` of the line `acidsite scan --json` prints. Bulk work runs on a
//! rayon pool with the GIL released.

use acidsite::advice::catalogue;
use acidsite::advice::practice::{Control, Reaction};
use acidsite::depict::{self, Marks, SvgOptions};
use acidsite::mol::Molecule;
use acidsite::report::brief::Detail;
use acidsite::report::delimited::{Delimiter, Layout, RowWriter};
use acidsite::report::record::ErrorOut;
use acidsite::report::{analyze, listings, Flag, Options, Record, Scale, SCHEMA};
use acidsite::sites::{rule_set, rule_set_version};
use pyo3::exceptions::{PyRuntimeError, PyValueError};
use pyo3::prelude::*;
use rayon::prelude::*;

/// Arguments shared by every entry point, checked once.
#[allow(clippy::too_many_arguments)]
fn options(
    site: Option<i64>,
    base: Option<&str>,
    scale: &str,
    reaction: Option<&str>,
    control: Option<&str>,
    flags: Option<Vec<(String, String)>>,
    sites_only: bool,
) -> PyResult<Options> {
    let site = match site {
        None => None,
        Some(s) if s >= 0 => Some(s as usize),
        Some(s) => {
            return Err(PyValueError::new_err(format!(
                "site must be a 0-based atom index (0 or more), got {s}"
            )))
        }
    };
    let scale = match scale.trim().to_ascii_lowercase().as_str() {
        "dmso" => Scale::Dmso,
        "water" => Scale::Water,
        _ => {
            return Err(PyValueError::new_err(format!(
                "scale must be \"dmso\" or \"water\", got {scale:?}"
            )))
        }
    };
    if let Some(b) = base {
        let cat = catalogue().map_err(|e| {
            PyRuntimeError::new_err(format!("the embedded base catalogue is invalid: {e}"))
        })?;
        if cat.get(b).is_none() {
            let names: Vec<&str> = cat.bases.iter().map(|b| b.name.as_str()).collect();
            return Err(PyValueError::new_err(format!(
                "no base named {b:?} in the catalogue; known bases: {}",
                names.join(", ")
            )));
        }
        if sites_only {
            return Err(PyValueError::new_err(
                "base and sites_only=True exclude each other (sites_only skips the base advice)",
            ));
        }
    }
    let reaction = reaction
        .map(|r| Reaction::parse(r).map_err(|e| PyValueError::new_err(e.to_string())))
        .transpose()?;
    let control = control
        .map(|c| Control::parse(c).map_err(|e| PyValueError::new_err(e.to_string())))
        .transpose()?;
    let mut parsed = Vec::new();
    for (name, smarts) in flags.unwrap_or_default() {
        if name.trim().is_empty() || name.contains('=') {
            return Err(PyValueError::new_err(format!(
                "flag name {name:?} must be non-empty and contain no '='"
            )));
        }
        let f = Flag::parse(&format!("{name}={smarts}"))
            .map_err(|e| PyValueError::new_err(e.to_string()))?;
        parsed.push(f);
    }
    Ok(Options {
        site,
        base: base.map(str::to_string),
        scale,
        flags: parsed,
        sites_only,
        reaction,
        control,
        ..Options::default()
    })
}

/// For one molecule, as `acidsite scan --site`: an atom index the molecule
/// does not have is a bad argument (a SMILES that does not read is left to
/// its error record).
fn check_site(smiles: &str, site: Option<usize>) -> PyResult<()> {
    if let Some(n) = site {
        if let Ok(m) = Molecule::from_smiles(smiles.trim()) {
            if n >= m.atoms().len() {
                return Err(PyValueError::new_err(format!(
                    "site {n}: {} has {} atoms (indices 0 to {}, in the order written)",
                    smiles.trim(),
                    m.atoms().len(),
                    m.atoms().len().saturating_sub(1)
                )));
            }
        }
    }
    Ok(())
}

/// `analyze`, with a panic in the library turned into an `internal` error
/// record (one record per input, as the command line does).
fn record(smiles: &str, line: u64, id: Option<String>, opts: &Options) -> Record {
    match std::panic::catch_unwind(std::panic::AssertUnwindSafe(|| {
        analyze(smiles.trim(), line, id.clone(), opts)
    })) {
        Ok(r) => r,
        Err(p) => {
            let what = p
                .downcast_ref::<&str>()
                .map(|s| s.to_string())
                .or_else(|| p.downcast_ref::<String>().cloned())
                .unwrap_or_default();
            Record::failure(
                line,
                id,
                smiles.to_string(),
                ErrorOut {
                    kind: "internal".into(),
                    message: format!(
                        "internal error while analysing this record (please report it): {what}"
                    ),
                    position: None,
                },
            )
        }
    }
}

fn json_text(rec: &Record) -> String {
    json_text_detail(rec, Detail::Full)
}

/// The record as `acidsite annotate --detail` writes it (full or brief).
fn json_text_detail(rec: &Record, detail: Detail) -> String {
    let mut out = Vec::with_capacity(8 << 10);
    match detail {
        Detail::Brief => rec.write_brief_json(&mut out),
        _ => rec.write_json(&mut out),
    }
    String::from_utf8(out).unwrap_or_else(|e| String::from_utf8_lossy(e.as_bytes()).into_owned())
}

/// The drawing of an analysed record (None for a failed record), as
/// `acidsite draw` makes it.
fn drawing(rec: &Record, bond_px: f64) -> Option<String> {
    if !rec.ok {
        return None;
    }
    let mol = Molecule::from_smiles(&rec.input).ok()?;
    let opts = SvgOptions {
        bond_px,
        font_px: bond_px * 0.39,
        ..SvgOptions::default()
    };
    std::panic::catch_unwind(std::panic::AssertUnwindSafe(|| {
        let lay = depict::layout(&mol);
        depict::svg(&mol, &lay, &Marks::from_record(rec), &opts)
    }))
    .ok()
}

/// One record as JSON text (the `acidsite scan --json` line, without the
/// line end).
#[pyfunction]
#[pyo3(signature = (smiles, site=None, base=None, scale="dmso", reaction=None, control=None, flags=None, sites_only=false, line=1, id=None))]
#[allow(clippy::too_many_arguments)]
fn scan_json(
    py: Python<'_>,
    smiles: &str,
    site: Option<i64>,
    base: Option<&str>,
    scale: &str,
    reaction: Option<&str>,
    control: Option<&str>,
    flags: Option<Vec<(String, String)>>,
    sites_only: bool,
    line: u64,
    id: Option<String>,
) -> PyResult<String> {
    let opts = options(site, base, scale, reaction, control, flags, sites_only)?;
    check_site(smiles, opts.site)?;
    let smiles = smiles.to_string();
    Ok(py.detach(|| json_text(&record(&smiles, line, id, &opts))))
}

/// The SVG drawing with the sites marked, and the record it was drawn from
/// (JSON text). The drawing is None when the record failed.
#[pyfunction]
#[pyo3(signature = (smiles, site=None, base=None, scale="dmso", reaction=None, control=None, bond_px=36.0))]
#[allow(clippy::too_many_arguments)]
fn draw(
    py: Python<'_>,
    smiles: &str,
    site: Option<i64>,
    base: Option<&str>,
    scale: &str,
    reaction: Option<&str>,
    control: Option<&str>,
    bond_px: f64,
) -> PyResult<(Option<String>, String)> {
    if !(bond_px.is_finite() && (4.0..=400.0).contains(&bond_px)) {
        return Err(PyValueError::new_err(format!(
            "bond_px must be between 4 and 400 pixels, got {bond_px}"
        )));
    }
    let opts = options(site, base, scale, reaction, control, None, false)?;
    check_site(smiles, opts.site)?;
    let smiles = smiles.to_string();
    Ok(py.detach(|| {
        let rec = record(&smiles, 1, None, &opts);
        (drawing(&rec, bond_px), json_text(&rec))
    }))
}

/// A configured engine for bulk work: options checked once and a worker
/// pool of its own. `run` analyses one chunk in parallel with the GIL
/// released and returns its records in input order.
#[pyclass(module = "acidsite._native", frozen)]
struct Annotator {
    opts: Options,
    pool: rayon::ThreadPool,
    rows: Option<RowWriter>,
}

#[pymethods]
impl Annotator {
    #[new]
    #[pyo3(signature = (site=None, base=None, scale="dmso", reaction=None, control=None, flags=None, sites_only=false, threads=0, rows=None, detail="full"))]
    #[allow(clippy::too_many_arguments)]
    fn new(
        site: Option<i64>,
        base: Option<&str>,
        scale: &str,
        reaction: Option<&str>,
        control: Option<&str>,
        flags: Option<Vec<(String, String)>>,
        sites_only: bool,
        threads: usize,
        rows: Option<&str>,
        detail: &str,
    ) -> PyResult<Annotator> {
        let mut opts = options(site, base, scale, reaction, control, flags, sites_only)?;
        opts.detail = match detail {
            "full" => Detail::Full,
            "brief" => Detail::Brief,
            other => {
                return Err(PyValueError::new_err(format!(
                    "detail must be \"full\" or \"brief\", got {other:?}"
                )))
            }
        };
        let rows = match rows {
            None => None,
            Some(layout) => Some(RowWriter {
                delimiter: Delimiter::Comma,
                layout: match layout {
                    "molecule" => Layout::Molecule,
                    "site" => Layout::Site,
                    other => {
                        return Err(PyValueError::new_err(format!(
                            "rows must be \"molecule\" or \"site\", got {other:?}"
                        )))
                    }
                },
                carried: Vec::new(),
            }),
        };
        let pool = rayon::ThreadPoolBuilder::new()
            .num_threads(threads)
            .build()
            .map_err(|e| PyRuntimeError::new_err(format!("cannot start worker threads: {e}")))?;
        Ok(Annotator { opts, pool, rows })
    }

    /// Number of worker threads.
    #[getter]
    fn threads(&self) -> usize {
        self.pool.current_num_threads()
    }

    /// Records of one chunk as JSON texts, in input order. `first_line` is
    /// the `line` of the first SMILES (the rest follow on).
    #[pyo3(signature = (smiles, ids=None, first_line=1))]
    fn run(
        &self,
        py: Python<'_>,
        smiles: Vec<String>,
        ids: Option<Vec<Option<String>>>,
        first_line: u64,
    ) -> PyResult<Vec<String>> {
        check_ids(&smiles, &ids)?;
        Ok(py.detach(|| {
            self.pool.install(|| {
                smiles
                    .par_iter()
                    .enumerate()
                    .map(|(i, s)| {
                        let id = ids.as_ref().and_then(|v| v[i].clone());
                        json_text_detail(
                            &record(s, first_line + i as u64, id, &self.opts),
                            self.opts.detail,
                        )
                    })
                    .collect()
            })
        }))
    }

    /// CSV rows of one chunk (the layout given as `rows`), without header,
    /// the number of rows each record gave, and with `records=True` each
    /// record's JSON text too (one analysis serves both).
    #[pyo3(signature = (smiles, ids=None, first_line=1, records=false))]
    fn run_rows(
        &self,
        py: Python<'_>,
        smiles: Vec<String>,
        ids: Option<Vec<Option<String>>>,
        first_line: u64,
        records: bool,
    ) -> PyResult<(String, Vec<usize>, Option<Vec<String>>)> {
        check_ids(&smiles, &ids)?;
        let Some(w) = &self.rows else {
            return Err(PyValueError::new_err(
                "this Annotator was made without rows=\"molecule\" or rows=\"site\"",
            ));
        };
        Ok(py.detach(|| {
            let parts: Vec<(String, usize, Option<String>)> = self.pool.install(|| {
                smiles
                    .par_iter()
                    .enumerate()
                    .map(|(i, s)| {
                        let id = ids.as_ref().and_then(|v| v[i].clone());
                        let rec = record(s, first_line + i as u64, id, &self.opts);
                        let n = match w.layout {
                            Layout::Molecule => 1,
                            Layout::Site => rec.sites.as_ref().map_or(0, Vec::len).max(1),
                        };
                        (w.rows(&rec), n, records.then(|| json_text(&rec)))
                    })
                    .collect()
            });
            let mut text = String::with_capacity(parts.iter().map(|p| p.0.len()).sum());
            let mut counts = Vec::with_capacity(parts.len());
            let mut jsons = records.then(|| Vec::with_capacity(parts.len()));
            for (t, n, j) in parts {
                text.push_str(&t);
                counts.push(n);
                if let (Some(v), Some(j)) = (jsons.as_mut(), j) {
                    v.push(j);
                }
            }
            (text, counts, jsons)
        }))
    }

    /// The CSV header line of the `rows` layout (no carried columns).
    fn header(&self) -> PyResult<String> {
        match &self.rows {
            Some(w) => Ok(w.header()),
            None => Err(PyValueError::new_err(
                "this Annotator was made without rows=\"molecule\" or rows=\"site\"",
            )),
        }
    }
}

fn check_ids(smiles: &[String], ids: &Option<Vec<Option<String>>>) -> PyResult<()> {
    match ids {
        Some(v) if v.len() != smiles.len() => Err(PyValueError::new_err(format!(
            "{} ids for {} SMILES: give one id per SMILES",
            v.len(),
            smiles.len()
        ))),
        _ => Ok(()),
    }
}

/// The base catalogue, one JSON text per base (as `acidsite bases --json`).
#[pyfunction]
fn bases_json() -> PyResult<Vec<String>> {
    let cat = catalogue().map_err(|e| {
        PyRuntimeError::new_err(format!("the embedded base catalogue is invalid: {e}"))
    })?;
    Ok(cat
        .bases
        .iter()
        .map(|b| listings::base_json(cat, b).to_string())
        .collect())
}

/// The fragment rules and increments, one JSON text each (as `acidsite
/// rules --json`).
#[pyfunction]
fn rules_json() -> PyResult<Vec<String>> {
    let set = rule_set()
        .map_err(|e| PyRuntimeError::new_err(format!("the embedded rule set is invalid: {e}")))?;
    let mut out: Vec<String> = set
        .rules
        .iter()
        .map(|r| listings::rule_json(set, r).to_string())
        .collect();
    out.extend(
        set.increments
            .iter()
            .map(|i| listings::increment_json(set, i).to_string()),
    );
    Ok(out)
}

/// Names `reaction=` accepts, in the command line's order.
#[pyfunction]
fn reactions() -> Vec<&'static str> {
    Reaction::ALL.iter().map(|r| r.name()).collect()
}

/// Names `control=` accepts.
#[pyfunction]
fn controls() -> Vec<&'static str> {
    Control::ALL.iter().map(|c| c.name()).collect()
}

#[pymodule]
fn _native(m: &Bound<'_, PyModule>) -> PyResult<()> {
    m.add("__version__", env!("CARGO_PKG_VERSION"))?;
    m.add("schema", SCHEMA)?;
    m.add("rule_set_version", rule_set_version())?;
    m.add_function(wrap_pyfunction!(scan_json, m)?)?;
    m.add_function(wrap_pyfunction!(draw, m)?)?;
    m.add_function(wrap_pyfunction!(bases_json, m)?)?;
    m.add_function(wrap_pyfunction!(rules_json, m)?)?;
    m.add_function(wrap_pyfunction!(reactions, m)?)?;
    m.add_function(wrap_pyfunction!(controls, m)?)?;
    m.add_class::<Annotator>()?;
    Ok(())
}
