//! `acidsite scan SMILES...`: the report a chemist reads at a glance, or one
//! JSON record per SMILES with `--json`.

use super::{parse_flag, Outcome, ScaleArg};
use acidsite::report::{analyze, table, Flag, Options};
use std::io::Write;

#[derive(clap::Args, Debug)]
pub struct Args {
    /// One or more SMILES (quote them in the shell).
    #[arg(required_unless_present = "mol", value_name = "SMILES")]
    pub smiles: Vec<String>,
    /// Also read the molecules of a molfile or SD file (every record; atom
    /// indices are the molfile's atom order, 0-based).
    #[arg(long, value_name = "FILE")]
    pub mol: Option<std::path::PathBuf>,
    /// Print one JSON record per SMILES (the `annotate` schema) instead of the report.
    #[arg(long)]
    pub json: bool,
    /// Target the site containing this atom (0-based index in the SMILES) instead of
    /// the most acidic C–H site.
    #[arg(long, value_name = "ATOM")]
    pub site: Option<usize>,
    /// Evaluate this base (short name from `acidsite bases`) instead of the recommended one.
    #[arg(long, value_name = "NAME")]
    pub base: Option<String>,
    /// The planned reaction (default: alkylation).
    #[arg(long, value_name = "NAME", value_enum)]
    pub reaction: Option<super::ReactionArg>,
    /// The enolate wanted where a ketone has two sides (default: the side of the
    /// target site).
    #[arg(long, value_name = "SIDE", value_enum)]
    pub control: Option<super::ControlArg>,
    /// pKa scale used to rank the sites.
    #[arg(long, value_enum, default_value_t = ScaleArg::Dmso)]
    pub scale: ScaleArg,
    /// Count the unique matches of a SMARTS pattern (repeatable).
    #[arg(long = "flag", value_name = "NAME=SMARTS", value_parser = parse_flag)]
    pub flags: Vec<Flag>,
    /// Also write the structure drawing with the sites marked to this SVG file
    /// (with several SMILES: FILE-1.svg, FILE-2.svg, ...).
    #[arg(long, value_name = "FILE")]
    pub svg: Option<std::path::PathBuf>,
    /// Every ruled-out base with its full reasons (by default they are grouped
    /// by kind of reason, one line each; JSON always has every reason).
    #[arg(long)]
    pub all: bool,
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    super::check_base(args.base.as_deref())?;
    super::check_flags(&args.flags)?;
    let opts = Options {
        site: args.site,
        base: args.base.clone(),
        scale: args.scale.into(),
        flags: args.flags.clone(),
        sites_only: false,
        detail: acidsite::report::Detail::Full,
        reaction: args.reaction.map(|r| r.0),
        control: args.control.map(Into::into),
        advice_data: None,
    };
    let stdout = std::io::stdout();
    let mut out = std::io::BufWriter::new(stdout.lock());
    let mut failed = 0usize;
    // `--site N` must name an atom of every molecule given (a bad option:
    // exit 2 before any output).
    if let Some(n) = args.site {
        for smiles in &args.smiles {
            if let Ok(m) = acidsite::mol::Molecule::from_smiles(smiles.trim()) {
                if n >= m.atoms().len() {
                    anyhow::bail!(
                        "--site {n}: {} has {} atoms (indices 0 to {}, in the order written)",
                        smiles.trim(),
                        m.atoms().len(),
                        m.atoms().len().saturating_sub(1)
                    );
                }
            }
        }
    }
    let mut all: Vec<(acidsite::report::Record, Option<acidsite::mol::Molecule>)> = args
        .smiles
        .iter()
        .enumerate()
        .map(|(i, s)| (analyze(s.trim(), i as u64 + 1, None, &opts), None))
        .collect();
    if let Some(path) = &args.mol {
        let text = super::sdf_input::read_mol_file(path)?;
        let recs = super::sdf_input::analyze_mol_text(&text, &opts);
        if recs.is_empty() {
            anyhow::bail!("{}: no molfile in this file", path.display());
        }
        if let Some(n) = args.site {
            for (_, m) in &recs {
                if let Some(m) = m {
                    if n >= m.atoms().len() {
                        anyhow::bail!(
                            "--site {n}: {} has {} atoms (indices 0 to {}, in molfile order)",
                            path.display(),
                            m.atoms().len(),
                            m.atoms().len().saturating_sub(1)
                        );
                    }
                }
            }
        }
        all.extend(recs);
    }
    let many = all.len() > 1;
    for (i, (rec, mol)) in all.iter().enumerate() {
        if !rec.ok {
            failed += 1;
        }
        if let Some(path) = &args.svg {
            let svg = match mol {
                Some(m) => super::draw::drawing_of(rec, m, 36.0),
                None => super::draw::drawing(rec, 36.0),
            };
            if let Some(svg) = svg {
                let path = if many {
                    numbered(path, i + 1)
                } else {
                    path.clone()
                };
                super::draw::write_svg(Some(&path), &svg)?;
            }
        }
        if args.json {
            writeln!(out, "{}", rec.to_json_line())?;
        } else {
            if i > 0 {
                writeln!(out)?;
            }
            let text = table::TextOptions {
                all: args.all,
                hint_one_base: Some("check with --base NAME"),
                hint_all_reasons: Some("--all gives each reason"),
            };
            write!(out, "{}", table::render_with(rec, opts.scale, text))?;
        }
    }
    out.flush()?;
    Ok(if failed == 0 {
        Outcome::AllFine
    } else {
        Outcome::SomeFailed
    })
}

/// `out.svg` -> `out-3.svg`.
fn numbered(path: &std::path::Path, k: usize) -> std::path::PathBuf {
    let stem = path
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_default();
    let ext = path
        .extension()
        .map(|e| format!(".{}", e.to_string_lossy()))
        .unwrap_or_default();
    path.with_file_name(format!("{stem}-{k}{ext}"))
}
