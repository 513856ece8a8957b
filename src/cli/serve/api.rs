//! The JSON API behind the page. Every route answers JSON (or SVG, or the
//! annotate output formats); errors are `{"error": {"kind", "message"}}` with
//! a 4xx status. Records are built by `report::analyze` exactly as `scan
//! --json` and `annotate` build them (same schema version).

use super::super::annotate::{Columns, Job, Output, OutputFormat};
use super::super::input::{InputFormat, LineSource};
use acidsite::advice::practice::{Control, Reaction};
use acidsite::report::{analyze, Options, Record, Scale};
use axum::body::{Body, Bytes};
use axum::extract::{DefaultBodyLimit, Query};
use axum::http::{header, StatusCode};
use axum::response::{IntoResponse, Response};
use axum::routing::{get, post};
use axum::Router;
use rayon::prelude::*;
use serde::Deserialize;
use serde_json::{json, Value};
use std::io::Read;

/// Largest JSON request body (`/api/scan`, `/api/draw`): room for a SMILES
/// well past the analysis limit, so an over-long SMILES gets the same
/// `too_large` record as on the command line.
pub const JSON_LIMIT_BYTES: usize = 2 << 20;
/// Largest upload to `/api/annotate` (the page says so).
pub const ANNOTATE_LIMIT_BYTES: usize = 10 << 20;
/// Largest list after gzip is undone (a guard against compression bombs).
pub const ANNOTATE_UNPACKED_LIMIT_BYTES: usize = 50 << 20;
/// Records analysed per piece of the streamed annotate answer.
const PIECE: usize = 256;

pub fn routes() -> Router {
    Router::new()
        .route("/api/health", get(health))
        .route("/api/options", get(options))
        .route("/api/rules", get(rules))
        .route(
            "/api/scan",
            post(scan).layer(DefaultBodyLimit::max(JSON_LIMIT_BYTES)),
        )
        .route(
            "/api/draw",
            post(draw).layer(DefaultBodyLimit::max(JSON_LIMIT_BYTES)),
        )
        .route(
            "/api/annotate",
            post(annotate).layer(DefaultBodyLimit::max(ANNOTATE_LIMIT_BYTES)),
        )
}

/// An error answer on its way out (kept small for `Result`s; a response
/// only at the end).
pub struct ApiError {
    status: StatusCode,
    kind: &'static str,
    message: String,
}

impl IntoResponse for ApiError {
    fn into_response(self) -> Response {
        error(self.status, self.kind, self.message)
    }
}

fn fail(status: StatusCode, kind: &'static str, message: impl Into<String>) -> ApiError {
    ApiError {
        status,
        kind,
        message: message.into(),
    }
}

/// An error answer.
pub fn error(status: StatusCode, kind: &str, message: impl Into<String>) -> Response {
    let body = json!({ "error": { "kind": kind, "message": message.into() } });
    (
        status,
        [(header::CACHE_CONTROL, "no-store")],
        axum::Json(body),
    )
        .into_response()
}

fn json_text(text: String) -> Response {
    (
        [
            (header::CONTENT_TYPE, "application/json"),
            (header::CACHE_CONTROL, "no-store"),
        ],
        text,
    )
        .into_response()
}

async fn health() -> Response {
    json_text(
        json!({
            "status": "ok",
            "version": env!("CARGO_PKG_VERSION"),
            "rule_set": acidsite::sites::rule_set_version(),
            "schema": acidsite::report::record::SCHEMA,
        })
        .to_string(),
    )
}

/// The planned reactions and the enolate controls the advice knows, read
/// from the library (names and the data's own summaries), for the page's
/// choices.
fn reactions() -> (Vec<Value>, Vec<Value>) {
    let data = acidsite::advice::practice::practice().ok();
    let reactions = Reaction::ALL
        .iter()
        .map(|&r| {
            let summary = data.map(|d| d.reaction(r).summary.clone());
            json!({ "name": r.name(), "summary": summary })
        })
        .collect();
    let controls = Control::ALL
        .iter()
        .map(|c| json!({ "name": c.name() }))
        .collect();
    (reactions, controls)
}

async fn options() -> Response {
    let (reactions, controls) = reactions();
    let bases: Vec<Value> = match acidsite::advice::catalogue() {
        Ok(cat) => cat
            .bases
            .iter()
            .map(|b| {
                json!({
                    "name": b.name, "full_name": b.full_name, "family": b.family.name(),
                    "pka_dmso": b.pka_dmso.as_ref().map(|p| p.value),
                    "pka_water": b.pka_water.as_ref().map(|p| p.value),
                    "hazards": b.hazards.iter().map(|h| h.name()).collect::<Vec<_>>(),
                })
            })
            .collect(),
        Err(e) => {
            return error(
                StatusCode::INTERNAL_SERVER_ERROR,
                "catalogue",
                e.to_string(),
            )
        }
    };
    json_text(
        json!({
            "version": env!("CARGO_PKG_VERSION"),
            "schema": acidsite::report::record::SCHEMA,
            "rule_set": acidsite::sites::rule_set_version(),
            "scales": ["dmso", "water"],
            "reactions": reactions,
            "controls": controls,
            "bases": bases,
            "limits": {
                "json_body_bytes": JSON_LIMIT_BYTES,
                "annotate_body_bytes": ANNOTATE_LIMIT_BYTES,
                "annotate_unpacked_bytes": ANNOTATE_UNPACKED_LIMIT_BYTES,
                "smiles_bytes": acidsite::analyze::MAX_SMILES_BYTES,
            },
        })
        .to_string(),
    )
}

async fn rules() -> Response {
    let set = match acidsite::sites::rule_set() {
        Ok(s) => s,
        Err(e) => return error(StatusCode::INTERNAL_SERVER_ERROR, "rules", e.to_string()),
    };
    let rules: Vec<Value> = set
        .rules
        .iter()
        .map(|r| {
            json!({
                "id": r.id, "element": r.element, "class": r.class, "smarts": r.smarts,
                "family": r.family, "pka_dmso": r.pka_dmso, "pka_water": r.pka_water,
                "uncertainty": r.uncertainty, "source": r.source, "note": r.note,
            })
        })
        .collect();
    let increments: Vec<Value> = set
        .increments
        .iter()
        .map(|i| {
            json!({
                "id": i.id, "substituent": i.kind, "families": i.families, "nth": i.nth,
                "dmso": i.dmso, "water": i.water, "uncertainty": i.uncertainty,
                "source": i.source, "note": i.note,
            })
        })
        .collect();
    let sources: Vec<Value> = acidsite::advice::catalogue()
        .map(|c| {
            c.sources
                .iter()
                .map(|(k, v)| json!({ "key": k, "reference": v }))
                .collect()
        })
        .unwrap_or_default();
    json_text(
        json!({
            "rule_set": set.version,
            "match_order": set.match_order,
            "rules": rules,
            "increments": increments,
            "sources": sources,
        })
        .to_string(),
    )
}

/// Body of `/api/scan` and `/api/draw`.
#[derive(Deserialize, Debug)]
#[serde(deny_unknown_fields)]
struct ScanRequest {
    smiles: String,
    #[serde(default)]
    name: Option<String>,
    #[serde(default)]
    site: Option<usize>,
    #[serde(default)]
    base: Option<String>,
    #[serde(default)]
    scale: Option<String>,
    #[serde(default)]
    reaction: Option<String>,
    #[serde(default)]
    control: Option<String>,
    /// `/api/draw` only: pixels per bond (10 to 80, default 36).
    #[serde(default)]
    bond_px: Option<f64>,
}

/// Read a JSON body with messages a person can act on.
fn parse_json<T: serde::de::DeserializeOwned>(
    body: Result<Bytes, axum::extract::rejection::BytesRejection>,
) -> Result<T, ApiError> {
    let bytes = body.map_err(|e| {
        if e.status() == StatusCode::PAYLOAD_TOO_LARGE {
            fail(
                StatusCode::PAYLOAD_TOO_LARGE,
                "too_large",
                format!(
                    "request body larger than {} MB; for long inputs use the command line (acidsite scan / annotate)",
                    JSON_LIMIT_BYTES >> 20
                ),
            )
        } else {
            fail(StatusCode::BAD_REQUEST, "body", e.body_text())
        }
    })?;
    if bytes.iter().all(|b| b.is_ascii_whitespace()) {
        return Err(fail(
            StatusCode::BAD_REQUEST,
            "empty",
            "empty request body: send a JSON object such as {\"smiles\": \"CC(=O)C\"}",
        ));
    }
    if let Err(e) = std::str::from_utf8(&bytes) {
        return Err(fail(
            StatusCode::BAD_REQUEST,
            "encoding",
            format!(
                "request body is not valid UTF-8 (bad byte at byte offset {})",
                e.valid_up_to()
            ),
        ));
    }
    serde_json::from_slice(&bytes).map_err(|e| {
        fail(
            StatusCode::BAD_REQUEST,
            "json",
            format!("request body is not the expected JSON: {e}"),
        )
    })
}

/// Options of a scan request, or why they are refused.
fn scan_options(req: &ScanRequest) -> Result<Options, ApiError> {
    let scale = match req.scale.as_deref().map(str::to_ascii_lowercase).as_deref() {
        None | Some("") | Some("dmso") => Scale::Dmso,
        Some("water") => Scale::Water,
        Some(other) => {
            return Err(fail(
                StatusCode::BAD_REQUEST,
                "scale",
                format!("unknown scale {other:?}: use \"dmso\" or \"water\""),
            ))
        }
    };
    let base = req.base.clone().filter(|b| !b.trim().is_empty());
    if let Some(b) = &base {
        let known = acidsite::advice::catalogue()
            .map(|c| c.get(b).is_some())
            .unwrap_or(false);
        if !known {
            return Err(fail(
                StatusCode::BAD_REQUEST,
                "base",
                format!("no base named {b:?} in the catalogue (GET /api/options lists them)"),
            ));
        }
    }
    let reaction = match req.reaction.as_deref().filter(|r| !r.trim().is_empty()) {
        None => None,
        Some(r) => Some(
            Reaction::parse(r)
                .map_err(|e| fail(StatusCode::BAD_REQUEST, "reaction", e.to_string()))?,
        ),
    };
    let control = match req.control.as_deref().filter(|c| !c.trim().is_empty()) {
        None => None,
        Some(c) => Some(
            Control::parse(c)
                .map_err(|e| fail(StatusCode::BAD_REQUEST, "control", e.to_string()))?,
        ),
    };
    Ok(Options {
        site: req.site,
        base,
        scale,
        flags: Vec::new(),
        sites_only: false,
        detail: acidsite::report::Detail::Full,
        reaction,
        control,
        advice_data: None,
    })
}

/// Analyse off the async threads (the analysis is CPU work).
/// A site past the molecule's last atom is refused as `scan --site` refuses
/// it (there a bad option, here a 400).
async fn analyse(req: ScanRequest, opts: Options) -> Result<Record, ApiError> {
    tokio::task::spawn_blocking(move || {
        let smiles = req.smiles.trim();
        if let Some(n) = opts.site {
            if smiles.len() <= acidsite::analyze::MAX_SMILES_BYTES {
                if let Ok(m) = acidsite::mol::Molecule::from_smiles(smiles) {
                    if n >= m.atoms().len() {
                        return Err(fail(
                            StatusCode::BAD_REQUEST,
                            "site",
                            format!(
                                "site {n}: {smiles} has {} atoms (indices 0 to {}, in the order written)",
                                m.atoms().len(),
                                m.atoms().len().saturating_sub(1)
                            ),
                        ));
                    }
                }
            }
        }
        let id = req.name.filter(|n| !n.trim().is_empty());
        Ok(analyze(smiles, 1, id, &opts))
    })
    .await
    .unwrap_or_else(|_| {
        Err(fail(
            StatusCode::INTERNAL_SERVER_ERROR,
            "internal",
            "internal error while analysing this SMILES (please report it)",
        ))
    })
}

/// `POST /api/scan`: the record of `acidsite scan --json` (a failed
/// analysis is a record with `ok: false`, status 200).
async fn scan(body: Result<Bytes, axum::extract::rejection::BytesRejection>) -> Response {
    let req: ScanRequest = match parse_json(body) {
        Ok(r) => r,
        Err(e) => return e.into_response(),
    };
    let opts = match scan_options(&req) {
        Ok(o) => o,
        Err(e) => return e.into_response(),
    };
    match analyse(req, opts).await {
        Ok(rec) => json_text(rec.to_json_line() + "\n"),
        Err(e) => e.into_response(),
    }
}

/// `POST /api/draw`: the SVG drawing with the sites marked (422 with the
/// record's error for a SMILES that cannot be read).
async fn draw(body: Result<Bytes, axum::extract::rejection::BytesRejection>) -> Response {
    let req: ScanRequest = match parse_json(body) {
        Ok(r) => r,
        Err(e) => return e.into_response(),
    };
    let opts = match scan_options(&req) {
        Ok(o) => o,
        Err(e) => return e.into_response(),
    };
    let px = req.bond_px.unwrap_or(36.0);
    if !(10.0..=80.0).contains(&px) {
        return error(
            StatusCode::BAD_REQUEST,
            "bond_px",
            "bond_px must lie between 10 and 80",
        );
    }
    let rec = match analyse(req, opts).await {
        Ok(r) => r,
        Err(e) => return e.into_response(),
    };
    match tokio::task::spawn_blocking(move || (super::super::draw::drawing(&rec, px), rec)).await {
        Ok((Some(svg), _)) => (
            [
                (header::CONTENT_TYPE, "image/svg+xml"),
                (header::CACHE_CONTROL, "no-store"),
            ],
            svg,
        )
            .into_response(),
        Ok((None, rec)) => {
            let (kind, message) = rec
                .error
                .map(|e| (e.kind, e.message))
                .unwrap_or_else(|| ("draw".into(), "cannot draw this input".into()));
            error(StatusCode::UNPROCESSABLE_ENTITY, &kind, message)
        }
        Err(_) => error(
            StatusCode::INTERNAL_SERVER_ERROR,
            "internal",
            "internal error while drawing",
        ),
    }
}

/// Query of `/api/annotate`.
#[derive(Deserialize, Debug, Default)]
#[serde(deny_unknown_fields)]
struct AnnotateQuery {
    /// Output: jsonl (default), csv, tsv, html.
    #[serde(default)]
    format: Option<String>,
    /// Input layout: smi (default), csv, tsv; or a file name to guess from.
    #[serde(default)]
    input: Option<String>,
    #[serde(default)]
    name: Option<String>,
    #[serde(default)]
    column: Option<String>,
    #[serde(default)]
    id_column: Option<String>,
    #[serde(default)]
    scale: Option<String>,
    #[serde(default)]
    base: Option<String>,
    #[serde(default)]
    per_site: Option<bool>,
    #[serde(default)]
    sites_only: Option<bool>,
    #[serde(default)]
    reaction: Option<String>,
    #[serde(default)]
    control: Option<String>,
    #[serde(default)]
    reaction_column: Option<String>,
}

/// `POST /api/annotate`: the body is a compound list (.smi, .csv or .tsv
/// text, or gzip of one); the answer is `annotate`'s output, streamed as it
/// is produced (records in input order). The header `x-acidsite-lines` gives
/// the number of physical lines for a progress bar.
async fn annotate(
    query: Result<Query<AnnotateQuery>, axum::extract::rejection::QueryRejection>,
    body: Result<Bytes, axum::extract::rejection::BytesRejection>,
) -> Response {
    let Ok(Query(q)) = query else {
        return error(
            StatusCode::BAD_REQUEST,
            "query",
            "unknown or malformed query parameter (format, input, name, column, id_column, reaction_column, scale, base, reaction, control, per_site, sites_only)",
        );
    };
    let bytes = match body {
        Ok(b) => b,
        Err(e) if e.status() == StatusCode::PAYLOAD_TOO_LARGE => {
            return error(
                StatusCode::PAYLOAD_TOO_LARGE,
                "too_large",
                format!(
                    "the list is larger than the page's limit of {} MB: run `acidsite annotate FILE` on the command line instead (no size limit, the same records)",
                    ANNOTATE_LIMIT_BYTES >> 20
                ),
            )
        }
        Err(e) => return error(StatusCode::BAD_REQUEST, "body", e.body_text()),
    };
    let (output, kind) = match q.format.as_deref().unwrap_or("jsonl") {
        "jsonl" => (OutputFormat::Jsonl, "application/x-ndjson; charset=utf-8"),
        "csv" => (OutputFormat::Csv, "text/csv; charset=utf-8"),
        "tsv" => (
            OutputFormat::Tsv,
            "text/tab-separated-values; charset=utf-8",
        ),
        "html" => (OutputFormat::Jsonl, "text/html; charset=utf-8"),
        other => {
            return error(
                StatusCode::BAD_REQUEST,
                "format",
                format!("unknown format {other:?}: use jsonl, csv, tsv or html"),
            )
        }
    };
    let html = q.format.as_deref() == Some("html");
    let per_site = q.per_site.unwrap_or(false);
    if per_site && (html || !matches!(output, OutputFormat::Csv | OutputFormat::Tsv)) {
        return error(
            StatusCode::BAD_REQUEST,
            "per_site",
            "per_site applies to format csv or tsv",
        );
    }
    let input = match q.input.as_deref().map(str::to_ascii_lowercase).as_deref() {
        None | Some("") | Some("smi") => InputFormat::Smi,
        Some("csv") => InputFormat::Csv,
        Some("tsv") => InputFormat::Tsv,
        Some(name) => InputFormat::from_path(std::path::Path::new(name)),
    };
    let req = ScanRequest {
        smiles: String::new(),
        name: None,
        site: None,
        base: q.base.clone(),
        scale: q.scale.clone(),
        reaction: q.reaction.clone(),
        control: q.control.clone(),
        bond_px: None,
    };
    let mut opts = match scan_options(&req) {
        Ok(o) => o,
        Err(e) => return e.into_response(),
    };
    opts.sites_only = q.sites_only.unwrap_or(false);
    if opts.sites_only && opts.base.is_some() {
        return error(
            StatusCode::BAD_REQUEST,
            "sites_only",
            "sites_only and base exclude each other",
        );
    }
    let shown = q
        .name
        .clone()
        .filter(|n| !n.trim().is_empty())
        .unwrap_or_else(|| "uploaded list".into());

    // Unpack and read the header off the async threads.
    let prepared =
        tokio::task::spawn_blocking(move || -> Result<(Job, LineSource, usize), ApiError> {
            let plain = unpack(bytes)?;
            let lines = plain.iter().filter(|&&b| b == b'\n').count()
                + usize::from(plain.last().is_some_and(|&b| b != b'\n'));
            let mut source = LineSource::from_bytes(plain)
                .map_err(|e| fail(StatusCode::BAD_REQUEST, "body", e.to_string()))?;
            let job = Job::new(
                &mut source,
                &shown,
                input,
                Columns {
                    smiles: q.column.as_deref(),
                    id: q.id_column.as_deref(),
                    reaction: q.reaction_column.as_deref(),
                    id_field: None,
                },
                opts,
                Output {
                    format: output,
                    per_site,
                    html,
                },
            )
            .map_err(|e| fail(StatusCode::BAD_REQUEST, "columns", format!("{e:#}")))?;
            Ok((job, source, lines))
        })
        .await;
    let (job, mut source, lines) = match prepared {
        Ok(Ok(p)) => p,
        Ok(Err(e)) => return e.into_response(),
        Err(_) => {
            return error(
                StatusCode::INTERNAL_SERVER_ERROR,
                "internal",
                "internal error",
            )
        }
    };
    let title = format!("acidsite: {}", q.name.as_deref().unwrap_or("uploaded list"));
    let (tx, rx) = tokio::sync::mpsc::channel::<Result<Bytes, std::io::Error>>(4);
    tokio::task::spawn_blocking(move || {
        let send = |b: Vec<u8>| tx.blocking_send(Ok(Bytes::from(b))).is_ok();
        if html {
            if !send(super::super::html::head(&title).into_bytes()) {
                return;
            }
        } else if let Some(h) = job.header_line() {
            if !send(h.into_bytes()) {
                return;
            }
        }
        let (mut records, mut failed) = (0u64, 0u64);
        loop {
            let chunk = match job.read_chunk(&mut source, PIECE, 1 << 20) {
                Ok(c) => c,
                Err(e) => {
                    let _ = tx.blocking_send(Err(e));
                    return;
                }
            };
            if chunk.is_empty() {
                break;
            }
            let done: Vec<_> = chunk.par_iter().map(|l| job.render(l)).collect();
            let mut piece = Vec::new();
            for (text, ok, card) in done {
                records += 1;
                failed += u64::from(!ok);
                match (html, card) {
                    (true, Some(c)) => piece.extend_from_slice(&c),
                    _ => piece.extend_from_slice(&text),
                }
            }
            if !send(piece) {
                return;
            }
        }
        if html {
            let _ = send(super::super::html::tail(records, failed).into_bytes());
        }
    });
    let stream = futures_util::stream::unfold(rx, |mut rx| async move {
        rx.recv().await.map(|item| (item, rx))
    });
    (
        [
            (header::CONTENT_TYPE, kind.to_string()),
            (header::CACHE_CONTROL, "no-store".to_string()),
            (
                header::HeaderName::from_static("x-acidsite-lines"),
                lines.to_string(),
            ),
        ],
        Body::from_stream(stream),
    )
        .into_response()
}

/// Undo gzip (detected by its magic bytes), refusing lists that unpack past
/// [`ANNOTATE_UNPACKED_LIMIT_BYTES`].
fn unpack(bytes: Bytes) -> Result<Vec<u8>, ApiError> {
    if bytes.len() < 2 || bytes[0] != 0x1f || bytes[1] != 0x8b {
        return Ok(bytes.to_vec());
    }
    let mut out = Vec::new();
    let mut dec = flate2::read::MultiGzDecoder::new(&bytes[..])
        .take(ANNOTATE_UNPACKED_LIMIT_BYTES as u64 + 1);
    dec.read_to_end(&mut out).map_err(|e| {
        fail(
            StatusCode::BAD_REQUEST,
            "gzip",
            format!("the upload looks like gzip but cannot be unpacked: {e}"),
        )
    })?;
    if out.len() > ANNOTATE_UNPACKED_LIMIT_BYTES {
        return Err(fail(
            StatusCode::PAYLOAD_TOO_LARGE,
            "too_large",
            format!(
                "the list unpacks to more than {} MB: run `acidsite annotate FILE` on the command line instead",
                ANNOTATE_UNPACKED_LIMIT_BYTES >> 20
            ),
        ));
    }
    Ok(out)
}
