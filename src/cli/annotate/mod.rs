//! `acidsite annotate [FILE|-]`: bulk annotation of a compound list.
//!
//! Every input record gives exactly one output record, in input order,
//! failures included. The input is streamed in chunks (at most `--chunk`
//! lines or 16 MiB at a time); each chunk is analysed in parallel while the
//! previous one is written in order and the next one is read, so at most three
//! chunks are alive and memory stays bounded whatever the input size. Workers
//! render runs of consecutive records into one buffer each, which is written
//! as it is (no per-record strings).

use super::input::{InputFormat, LineSource, RawLine, MAX_LINE_BYTES};
use super::sdf_input;
use super::{parse_flag, Outcome, ScaleArg};
use acidsite::mol::sdf::SdRecord;
use acidsite::report::delimited::{split_csv_line, Delimiter, Layout, RowWriter};
use acidsite::report::record::{ErrorOut, Pairs};
use acidsite::report::{analyze, analyze_molfile, Detail, Flag, Options, Record};
use anyhow::Context;
use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};
use rayon::prelude::*;
use std::io::{self, IsTerminal, Write};
use std::path::PathBuf;
use std::sync::atomic::Ordering;
use std::time::{Duration, Instant};

mod records;
use records::{record_for, split_fields};

/// Bytes of input read per chunk at most (besides the line count).
const CHUNK_BYTES: usize = 16 << 20;

/// SD records read before the run starts, for the names of the data items
/// carried into CSV/TSV output.
const SD_FIRST_CHUNK: usize = 256;

/// Output formats.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum OutputFormat {
    /// One JSON record per line.
    Jsonl,
    /// Comma-separated with a header row.
    Csv,
    /// Tab-separated with a header row.
    Tsv,
}

#[derive(clap::Args, Debug)]
pub struct Args {
    /// Compound list: .smi (SMILES, whitespace, optional id), .csv or .tsv with a
    /// header row, or an SD file (.sdf, .mol), optionally gzip-compressed; `-` or
    /// nothing reads stdin (SD content is recognised).
    #[arg(value_name = "FILE")]
    pub input: Option<PathBuf>,
    /// Input layout, when the file name does not tell (stdin is read as smi).
    #[arg(long, value_enum, value_name = "FORMAT")]
    pub input_format: Option<InputFormat>,
    /// Header name of the SMILES column in CSV/TSV input (default: the column
    /// named "smiles", any case).
    #[arg(long, value_name = "NAME")]
    pub column: Option<String>,
    /// Header name of the identifier column in CSV/TSV input (default: a column
    /// named "id" or "name", any case, if there is one).
    #[arg(long, value_name = "NAME")]
    pub id_column: Option<String>,
    /// SD input: take the id from this data item instead of the title line.
    #[arg(long, value_name = "NAME")]
    pub id_field: Option<String>,
    /// JSON records: full (every key, cautions and reasons worded) or brief
    /// (the answer with ids for cautions and rejected bases, about a sixth of
    /// the size; schema acidsite-brief/2).
    #[arg(long, value_enum, default_value_t = DetailArg::Full)]
    pub detail: DetailArg,
    /// Output format.
    #[arg(long, value_enum, default_value_t = OutputFormat::Jsonl)]
    pub format: OutputFormat,
    /// CSV/TSV: one row per acidic site instead of one per molecule.
    #[arg(long)]
    pub per_site: bool,
    /// Count the unique matches of a SMARTS pattern in every record (repeatable).
    #[arg(long = "flag", value_name = "NAME=SMARTS", value_parser = parse_flag)]
    pub flags: Vec<Flag>,
    /// Evaluate this base for every record instead of the recommended one.
    #[arg(long, value_name = "NAME")]
    pub base: Option<String>,
    /// Sites and pKa estimates only, without base advice (much faster and
    /// smaller records; `advice` is null).
    #[arg(long, conflicts_with = "base")]
    pub sites_only: bool,
    /// The planned reaction (default: alkylation).
    #[arg(long, value_name = "NAME", value_enum)]
    pub reaction: Option<super::ReactionArg>,
    /// The enolate wanted where a ketone has two sides (default: the side of the
    /// target site).
    #[arg(long, value_name = "SIDE", value_enum)]
    pub control: Option<super::ControlArg>,
    /// CSV/TSV input: take the planned reaction of each row from this column
    /// (an empty cell: `--reaction`, else alkylation; an unknown name: an error record).
    #[arg(long, value_name = "NAME")]
    pub reaction_column: Option<String>,
    /// pKa scale used to rank the sites.
    #[arg(long, value_enum, default_value_t = ScaleArg::Dmso)]
    pub scale: ScaleArg,
    /// Worker threads (0: one per core; at most 256).
    #[arg(long, default_value_t = 0, value_name = "N", value_parser = parse_threads)]
    pub threads: usize,
    /// Records per chunk (memory bound and parallel grain).
    #[arg(long, default_value_t = 1024, value_name = "N",
          value_parser = clap::value_parser!(u32).range(1..=1_000_000))]
    pub chunk: u32,
    /// Write to this file instead of stdout.
    #[arg(short, long, value_name = "FILE")]
    pub output: Option<PathBuf>,
    /// No progress bar and no summary line.
    #[arg(short, long)]
    pub quiet: bool,
    /// Also write one self-contained HTML page with a card per record
    /// (drawing with the sites marked, top site, base, warnings, errors).
    #[arg(long, value_name = "FILE")]
    pub html: Option<PathBuf>,
}

/// `--detail` values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum DetailArg {
    /// Every key of the acidsite-record schema.
    Full,
    /// The acidsite-brief schema: sites, base, equivalents, conversion,
    /// solvent, temperature, warnings; ids for cautions and rejected bases.
    Brief,
}

/// What every worker needs to turn a raw line into output text.
pub struct Job {
    format: InputFormat,
    /// CSV/TSV: index of the SMILES column, the id column, and the header.
    smiles_col: usize,
    id_col: Option<usize>,
    header: Vec<String>,
    opts: Options,
    /// CSV/TSV: the column holding each row's planned reaction.
    reaction_col: Option<usize>,
    rows: Option<RowWriter>,
    /// Render an HTML card per record (`--html`).
    html: bool,
    /// SD input: data item holding the id (else the title line).
    id_field: Option<String>,
    /// SD input: the first chunk, read by [`Job::new`] for the names of the
    /// data items, handed out by the first [`Job::read_chunk`].
    first_chunk: std::sync::Mutex<Option<Vec<RawLine>>>,
    /// SD input: records read so far.
    sd_records: std::sync::Mutex<u64>,
}

/// What to write for each record.
#[derive(Debug, Clone, Copy)]
pub struct Output {
    /// JSON Lines, CSV or TSV.
    pub format: OutputFormat,
    /// CSV/TSV: one row per site.
    pub per_site: bool,
    /// Also render an HTML card per record.
    pub html: bool,
}

/// Names of the input columns chosen on the command line (or by the page).
#[derive(Debug, Clone, Copy, Default)]
pub struct Columns<'a> {
    pub smiles: Option<&'a str>,
    pub id: Option<&'a str>,
    pub reaction: Option<&'a str>,
    /// SD input: the data item holding the id.
    pub id_field: Option<&'a str>,
}

impl Job {
    /// Read the header row of CSV/TSV input from `source` (named `shown` in
    /// messages) and set up the rendering of every record. Used by `annotate`
    /// and by the page's `/api/annotate` (`acidsite serve`).
    pub fn new(
        source: &mut LineSource,
        shown: &str,
        format: InputFormat,
        cols: Columns<'_>,
        opts: Options,
        out: Output,
    ) -> anyhow::Result<Job> {
        source.csv_quotes = format == InputFormat::Csv;
        let Output {
            format: output,
            per_site,
            html,
        } = out;
        let mut first_chunk = None;
        let mut sd_records = 0u64;
        // Header of CSV/TSV input; for SD input the data items named in the
        // first chunk of records.
        let (header, smiles_col, id_col) = match format {
            InputFormat::Smi => (Vec::new(), 0, None),
            InputFormat::Sdf => {
                let lines =
                    sdf_input::next_sd_chunk(source, &mut sd_records, SD_FIRST_CHUNK, CHUNK_BYTES)
                        .with_context(|| format!("cannot read {shown}"))?;
                let mut names: Vec<String> = Vec::new();
                for l in &lines {
                    let text = String::from_utf8_lossy(&l.bytes);
                    for (n, _) in SdRecord::new(&text, l.record, l.line).fields() {
                        if Some(n.as_str()) != cols.id_field && !names.contains(&n) {
                            names.push(n);
                        }
                    }
                }
                first_chunk = Some(lines);
                (names, usize::MAX, None)
            }
            InputFormat::Csv | InputFormat::Tsv => {
                // The header is the first line that is not blank and not a
                // comment; a line starting with `#` is the header when it
                // names the SMILES column (`#id,smiles`), else a comment.
                let wanted = cols.smiles.unwrap_or("smiles");
                let first = loop {
                    source.header_next = true;
                    let line = source
                        .next_record_line()
                        .with_context(|| format!("cannot read {shown}"))?;
                    let Some(line) = line else {
                        anyhow::bail!("{shown} has no header row");
                    };
                    let text = String::from_utf8_lossy(&line.bytes);
                    if !text.trim_start().starts_with('#') {
                        break line;
                    }
                    let names_it =
                        split_fields(format, &text)
                            .unwrap_or_default()
                            .iter()
                            .any(|f| {
                                f.trim()
                                    .trim_start_matches('#')
                                    .eq_ignore_ascii_case(wanted)
                            });
                    if names_it {
                        break line;
                    }
                };
                source.header_next = false;
                let text = String::from_utf8_lossy(&first.bytes);
                let header: Vec<String> = split_fields(format, &text)
                    .with_context(|| format!("{shown}: header row has an unterminated quote"))?
                    .into_iter()
                    .map(|h| h.trim().to_string())
                    .collect();
                let smiles_col =
                    pick_column(&header, cols.smiles, &["smiles"]).with_context(|| {
                        format!(
                            "{shown}: no SMILES column {}; header has: {}",
                            cols.smiles
                                .map(|c| format!("named {c:?}"))
                                .unwrap_or_else(
                                    || "named \"smiles\" (choose one with --column)".into()
                                ),
                            header.join(", ")
                        )
                    })?;
                let id_col = match cols.id {
                    Some(name) => {
                        Some(pick_column(&header, Some(name), &[]).with_context(|| {
                            format!(
                                "{shown}: no column named {name:?}; header has: {}",
                                header.join(", ")
                            )
                        })?)
                    }
                    None => {
                        pick_column(&header, None, &["id", "name"]).filter(|&i| i != smiles_col)
                    }
                };
                (header, smiles_col, id_col)
            }
        };
        let reaction_col = match cols.reaction {
            None => None,
            Some(name) => {
                if matches!(format, InputFormat::Smi | InputFormat::Sdf) {
                    anyhow::bail!(
                        "--reaction-column needs CSV or TSV input (--input-format csv|tsv)"
                    );
                }
                Some(pick_column(&header, Some(name), &[]).with_context(|| {
                    format!(
                        "{shown}: no column named {name:?} for --reaction-column; header has: {}",
                        header.join(", ")
                    )
                })?)
            }
        };
        // Column names carried into records must be unique (JSON keys):
        // a repeated header becomes `name_2`, `name_3`, ... (issue 17).
        let header = unique_names(header);
        let carried: Vec<String> = header
            .iter()
            .enumerate()
            .filter(|(i, _)| *i != smiles_col && Some(*i) != id_col)
            .map(|(_, h)| h.clone())
            .collect();
        let rows = match output {
            OutputFormat::Jsonl => None,
            OutputFormat::Csv | OutputFormat::Tsv => Some(RowWriter {
                delimiter: if output == OutputFormat::Csv {
                    Delimiter::Comma
                } else {
                    Delimiter::Tab
                },
                layout: if per_site {
                    Layout::Site
                } else {
                    Layout::Molecule
                },
                carried,
            }),
        };
        Ok(Job {
            format,
            smiles_col,
            id_col,
            header,
            opts,
            reaction_col,
            rows,
            html,
            id_field: cols.id_field.map(str::to_string),
            first_chunk: std::sync::Mutex::new(first_chunk),
            sd_records: std::sync::Mutex::new(sd_records),
        })
    }

    /// The next chunk of records from `source`: up to `max` lines, or
    /// whole SD records for SD input (the chunk read by [`Job::new`]
    /// first).
    pub fn read_chunk(
        &self,
        source: &mut LineSource,
        max: usize,
        max_bytes: usize,
    ) -> io::Result<Vec<RawLine>> {
        if let Some(first) = self.first_chunk.lock().ok().and_then(|mut f| f.take()) {
            return Ok(first);
        }
        match self.format {
            InputFormat::Sdf => {
                let mut n = self.sd_records.lock().map(|g| *g).unwrap_or(0);
                let chunk = sdf_input::next_sd_chunk(source, &mut n, max, max_bytes);
                if let Ok(mut g) = self.sd_records.lock() {
                    *g = n;
                }
                chunk
            }
            _ => source.next_chunk(max, max_bytes),
        }
    }

    /// The header line of CSV/TSV output (None for JSON Lines).
    pub fn header_line(&self) -> Option<String> {
        self.rows.as_ref().map(RowWriter::header)
    }

    /// One raw line to its output text, whether it was analysed, and its
    /// HTML card when asked for (never panics: a library panic becomes an
    /// `internal` error record).
    pub fn render(&self, raw: &RawLine) -> Rendered {
        render_record(raw, self)
    }
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let started = Instant::now();
    super::check_base(args.base.as_deref())?;
    super::check_flags(&args.flags)?;
    let path = args.input.clone().filter(|p| p.as_os_str() != "-");
    // Never write onto the input (issue 17): refused before anything is
    // opened for writing.
    if let Some(o) = &args.output {
        super::output::refuse_onto_input(path.as_deref(), o, "-o")?;
    }
    if let Some(h) = &args.html {
        super::output::refuse_onto_input(path.as_deref(), h, "--html")?;
    }
    if let (Some(o), Some(h)) = (&args.output, &args.html) {
        if o == h {
            anyhow::bail!("-o and --html name the same file {}", o.display());
        }
    }
    if args.per_site && args.format == OutputFormat::Jsonl {
        anyhow::bail!(
            "--per-site applies to --format csv or tsv (JSON records list every site already)"
        );
    }
    let shown = path
        .as_ref()
        .map(|p| p.display().to_string())
        .unwrap_or_else(|| "standard input".into());
    let mut source =
        LineSource::open(path.as_deref()).with_context(|| format!("cannot read {shown}"))?;
    let head = source
        .peek()
        .with_context(|| format!("cannot read {shown}"))?;
    let format = sdf_input::choose_format(args.input_format, path.as_deref(), head)
        .map_err(|e| anyhow::anyhow!("{shown}: {e}"))?;
    if args.input_format.is_none() && format == InputFormat::Smi {
        if let Some(hint) = sdf_input::table_header_hint(head) {
            eprintln!("acidsite annotate: {shown}: {hint}");
        }
    }

    let ctx = Job::new(
        &mut source,
        &shown,
        format,
        Columns {
            smiles: args.column.as_deref(),
            id: args.id_column.as_deref(),
            reaction: args.reaction_column.as_deref(),
            id_field: args.id_field.as_deref(),
        },
        Options {
            site: None,
            base: args.base.clone(),
            scale: args.scale.into(),
            flags: args.flags.clone(),
            sites_only: args.sites_only,
            detail: match args.detail {
                DetailArg::Full => Detail::Full,
                DetailArg::Brief => Detail::Brief,
            },
            reaction: args.reaction.map(|r| r.0),
            control: args.control.map(Into::into),
            advice_data: None,
        },
        Output {
            format: args.format,
            per_site: args.per_site,
            html: args.html.is_some(),
        },
    )?;

    // Files are written under a temporary name and renamed into place when
    // the run is complete, so an interrupted run never leaves a half file
    // under the final name.
    let mut out = super::output::Sink::open(args.output.as_deref())?;
    if let Some(w) = &ctx.rows {
        out.write_all(w.header().as_bytes())?;
    }
    let mut html_out = match &args.html {
        Some(p) => {
            let mut w = super::output::SafeFile::create(p)?;
            w.write_all(super::html::head(&format!("acidsite: {shown}")).as_bytes())?;
            Some(w)
        }
        None => None,
    };

    let bar = progress_bar(&args, source.total);
    let pool = rayon::ThreadPoolBuilder::new()
        .num_threads(args.threads)
        .build()
        .context("cannot start worker threads")?;
    let chunk = args.chunk as usize;
    // Three-stage pipeline: while the workers analyse chunk N, one task
    // writes chunk N-1 (in order) and reads chunk N+1.
    let (records, failed) = pool.install(|| -> anyhow::Result<(u64, u64)> {
        let mut records = 0u64;
        let mut failed = 0u64;
        let mut lines = ctx
            .read_chunk(&mut source, chunk, CHUNK_BYTES)
            .with_context(|| format!("cannot read {shown}"))?;
        // Raw bytes read up to the end of the chunk being analysed (the bar
        // shows what has been written, not the read-ahead).
        let mut read_upto = source.consumed.load(Ordering::Relaxed);
        let mut pending: Vec<Rendered> = Vec::new();
        let mut pending_upto = 0u64;
        while !lines.is_empty() || !pending.is_empty() {
            let analysing = std::mem::take(&mut lines);
            let to_write = std::mem::take(&mut pending);
            let (analysed, io) = rayon::join(
                || {
                    analysing
                        .par_iter()
                        .map(|l| render_record(l, &ctx))
                        .collect::<Vec<_>>()
                },
                || -> anyhow::Result<Vec<RawLine>> {
                    for (text, ok, card) in &to_write {
                        out.write_all(text)?;
                        if let (Some(h), Some(c)) = (html_out.as_mut(), card) {
                            h.write_all(c)?;
                        }
                        records += 1;
                        if !ok {
                            failed += 1;
                        }
                    }
                    if let Some(b) = &bar {
                        if !to_write.is_empty() {
                            b.set_position(pending_upto);
                            let secs = started.elapsed().as_secs_f64().max(1e-9);
                            b.set_message(format!(
                                "{records} records, {failed} failed, {:.0} records/s",
                                records as f64 / secs
                            ));
                        }
                    }
                    drop(to_write);
                    if analysing.is_empty() {
                        return Ok(Vec::new());
                    }
                    ctx.read_chunk(&mut source, chunk, CHUNK_BYTES)
                        .with_context(|| format!("cannot read {shown}"))
                },
            );
            lines = io?;
            pending = analysed;
            pending_upto = read_upto;
            read_upto = source.consumed.load(Ordering::Relaxed);
        }
        // Damaged input after some records (a truncated gzip stream): the
        // records before it are written; the damage is one error record.
        if let Some((line, message)) = source.read_error.take() {
            let rec = Record::failure(
                line,
                None,
                String::new(),
                ErrorOut {
                    kind: "input".into(),
                    message: format!(
                        "the input could not be read past line {}: {message}; the records before it are complete",
                        line.saturating_sub(1)
                    ),
                    position: None,
                },
            );
            let mut buf = Vec::new();
            render(&rec, &ctx, &mut buf);
            out.write_all(&buf)?;
            if let Some(h) = html_out.as_mut() {
                h.write_all(super::html::card(&rec, None).as_bytes())?;
            }
            records += 1;
            failed += 1;
        }
        Ok((records, failed))
    })?;
    out.finish()?;
    if let Some(mut h) = html_out {
        h.write_all(super::html::tail(records, failed).as_bytes())?;
        h.commit()?;
    }
    if let Some(b) = bar {
        b.finish_and_clear();
    }
    if !args.quiet {
        let secs = started.elapsed().as_secs_f64();
        let _ = writeln!(
            io::stderr(),
            "acidsite annotate: {records} records from {shown}, {} analysed, {failed} failed, {secs:.2} s ({:.0} records/s)",
            records - failed,
            records as f64 / secs.max(1e-9)
        );
    }
    Ok(if failed == 0 {
        Outcome::AllFine
    } else {
        Outcome::SomeFailed
    })
}

fn progress_bar(args: &Args, total: Option<u64>) -> Option<ProgressBar> {
    if args.quiet || !io::stderr().is_terminal() {
        return None;
    }
    let bar = match total {
        Some(t) => ProgressBar::with_draw_target(Some(t), ProgressDrawTarget::stderr()).with_style(
            ProgressStyle::with_template(
                "{elapsed_precise} [{bar:32}] {percent:>3}%  {msg}  eta {eta}",
            )
            .ok()?
            .progress_chars("=> "),
        ),
        None => ProgressBar::with_draw_target(None, ProgressDrawTarget::stderr())
            .with_style(ProgressStyle::with_template("{elapsed_precise} {spinner} {msg}").ok()?),
    };
    bar.enable_steady_tick(Duration::from_millis(200));
    Some(bar)
}

/// Column index by explicit name (exact, then any case) or by the first of
/// the default names (any case).
/// clap value parser for `--threads`: 0 (one per core) to 256; more would
/// only exhaust memory for thread stacks (issue 17).
fn parse_threads(s: &str) -> Result<usize, String> {
    match s.trim().parse::<usize>() {
        Ok(n) if n <= 256 => Ok(n),
        Ok(n) => Err(format!(
            "{n} threads is more than the 256 allowed (0 uses one per core)"
        )),
        Err(_) => Err(format!("{s:?} is not a number of threads")),
    }
}

/// Header names made unique: each name keeps its first occurrence; a
/// repeat becomes `name_2`, `name_3`, ..., the first suffix that no column of
/// the header already uses (so `note,note,note_2` gives `note, note_3,
/// note_2`).
fn unique_names(header: Vec<String>) -> Vec<String> {
    let original: std::collections::HashSet<String> = header.iter().cloned().collect();
    let mut out: Vec<String> = Vec::with_capacity(header.len());
    for h in header {
        if !out.contains(&h) {
            out.push(h);
            continue;
        }
        let mut k = 2;
        let name = loop {
            let c = format!("{h}_{k}");
            if !original.contains(&c) && !out.contains(&c) {
                break c;
            }
            k += 1;
        };
        out.push(name);
    }
    out
}

fn pick_column(header: &[String], name: Option<&str>, defaults: &[&str]) -> Option<usize> {
    if let Some(n) = name {
        return header
            .iter()
            .position(|h| h == n)
            .or_else(|| header.iter().position(|h| h.eq_ignore_ascii_case(n)));
    }
    defaults
        .iter()
        .find_map(|d| header.iter().position(|h| h.eq_ignore_ascii_case(d)))
}

thread_local! {
    /// Each worker's output buffer, reused for every record it renders (its
    /// capacity settles at the largest record seen; see [`render_record`]).
    static SCRATCH: std::cell::Cell<Vec<u8>> = const { std::cell::Cell::new(Vec::new()) };
}

/// A worker's buffer larger than this is freed rather than kept.
const SCRATCH_KEEP: usize = 1 << 20;

/// A rendered record: its output text, whether it was analysed, and its
/// HTML card when asked for.
pub type Rendered = (Box<[u8]>, bool, Option<Box<[u8]>>);

/// One raw line to its output text, rendered in the worker's reused buffer
/// and copied out at its exact size, whether it was analysed, and its HTML
/// card when asked for.
fn render_record(raw: &RawLine, ctx: &Job) -> Rendered {
    // Taking the buffer out of the cell leaves an empty one behind, so a
    // nested call (none today) would simply allocate its own.
    let mut buf = SCRATCH.take();
    buf.clear();
    let mut card = None;
    let ok = process_guarded(raw, ctx, &mut buf, &mut card);
    let text: Box<[u8]> = buf.as_slice().into();
    if buf.capacity() <= SCRATCH_KEEP {
        SCRATCH.set(buf);
    }
    (text, ok, card)
}

/// [`process`], turning a panic in the library into an error record so the
/// run keeps one output record per input record. Appends to `out` and
/// returns whether the record was analysed.
fn process_guarded(
    raw: &RawLine,
    ctx: &Job,
    out: &mut Vec<u8>,
    card: &mut Option<Box<[u8]>>,
) -> bool {
    let start = out.len();
    match std::panic::catch_unwind(std::panic::AssertUnwindSafe(|| {
        process(raw, ctx, out, card)
    })) {
        Ok(ok) => ok,
        Err(p) => {
            // Drop whatever the failed record had written.
            out.truncate(start);
            let what = p
                .downcast_ref::<&str>()
                .map(|s| s.to_string())
                .or_else(|| p.downcast_ref::<String>().cloned())
                .unwrap_or_default();
            let rec = Record::failure(
                raw.line,
                None,
                String::from_utf8_lossy(&raw.bytes).into_owned(),
                ErrorOut {
                    kind: "internal".into(),
                    message: format!(
                        "internal error while analysing this record (please report it): {what}"
                    ),
                    position: None,
                },
            );
            render(&rec, ctx, out);
            if ctx.html {
                *card = Some(super::html::card(&rec, None).into_bytes().into());
            }
            false
        }
    }
}

/// Append the record's output text (a JSON line, or CSV/TSV rows) to `out`.
fn render(rec: &Record, ctx: &Job, out: &mut Vec<u8>) {
    match &ctx.rows {
        Some(w) => out.extend_from_slice(w.rows(rec).as_bytes()),
        None => {
            if ctx.opts.detail == Detail::Brief {
                rec.write_brief_json(out);
            } else {
                rec.write_json(out);
            }
            out.push(b'\n');
        }
    }
}

/// One raw line to its output text (appended to `out`); returns whether it
/// was analysed.
fn process(raw: &RawLine, ctx: &Job, out: &mut Vec<u8>, card: &mut Option<Box<[u8]>>) -> bool {
    let rec = record_for(raw, ctx);
    render(&rec, ctx, out);
    if ctx.html {
        let svg = if ctx.format == InputFormat::Sdf {
            // Atom indices are the molfile's: draw the molfile's molecule.
            let text = String::from_utf8_lossy(&raw.bytes);
            let sd = SdRecord::new(&text, raw.record, raw.line);
            acidsite::mol::molfile::read(sd.molfile())
                .ok()
                .and_then(|m| super::draw::drawing_of(&rec, &m.molecule, 30.0))
        } else {
            super::draw::drawing(&rec, 30.0)
        };
        *card = Some(super::html::card(&rec, svg.as_deref()).into_bytes().into());
    }
    rec.ok
}
