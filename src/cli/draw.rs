//! `acidsite draw SMILES`: the structure drawing (SVG) with the acidic sites
//! marked by rank and the advice target ringed.

use super::{Outcome, ScaleArg};
use acidsite::depict::{self, Marks, SvgOptions};
use acidsite::mol::Molecule;
use acidsite::report::{analyze, Options, Record};
use anyhow::Context;
use std::io::Write;
use std::path::{Path, PathBuf};

#[derive(clap::Args, Debug)]
pub struct Args {
    /// The molecule (quote it in the shell).
    #[arg(
        value_name = "SMILES",
        required_unless_present = "mol",
        conflicts_with = "mol"
    )]
    pub smiles: Option<String>,
    /// Read the molecule from a molfile or SD file (its first record) instead;
    /// atom indices are the molfile's atom order, 0-based.
    #[arg(long, value_name = "FILE")]
    pub mol: Option<PathBuf>,
    /// Write the SVG to this file instead of stdout.
    #[arg(short, long, value_name = "FILE")]
    pub output: Option<PathBuf>,
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
    /// Pixels per bond length.
    #[arg(long, default_value_t = 36.0, value_name = "PX")]
    pub bond_px: f64,
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    super::check_base(args.base.as_deref())?;
    let opts = Options {
        site: args.site,
        base: args.base.clone(),
        scale: args.scale.into(),
        flags: Vec::new(),
        sites_only: false,
        detail: acidsite::report::Detail::Full,
        reaction: args.reaction.map(|r| r.0),
        control: args.control.map(Into::into),
        advice_data: None,
    };
    let (rec, mol) = match &args.mol {
        Some(path) => {
            let text = super::sdf_input::read_mol_file(path)?;
            let mut all = super::sdf_input::analyze_mol_text(&text, &opts);
            if all.is_empty() {
                anyhow::bail!("{}: no molfile in this file", path.display());
            }
            all.swap_remove(0)
        }
        None => (
            analyze(args.smiles.as_deref().unwrap_or("").trim(), 1, None, &opts),
            None,
        ),
    };
    let svg = match &mol {
        Some(m) => drawing_of(&rec, m, args.bond_px),
        None => drawing(&rec, args.bond_px),
    };
    let Some(svg) = svg else {
        let e = rec.error.as_ref();
        let _ = writeln!(
            std::io::stderr(),
            "acidsite draw: {}: {}{}",
            e.map(|e| e.kind.as_str()).unwrap_or("error"),
            e.map(|e| e.message.as_str())
                .unwrap_or("cannot draw this input"),
            e.and_then(|e| e.position)
                .map(|p| format!(" (at character {p})"))
                .unwrap_or_default()
        );
        return Ok(Outcome::SomeFailed);
    };
    write_svg(args.output.as_deref(), &svg)?;
    Ok(Outcome::AllFine)
}

/// The drawing of an analysed record (None for a failed record).
pub fn drawing(rec: &Record, bond_px: f64) -> Option<String> {
    if !rec.ok {
        return None;
    }
    let mol = Molecule::from_smiles(&rec.input).ok()?;
    drawing_of(rec, &mol, bond_px)
}

/// The drawing of an analysed record whose molecule is at hand (a molfile's,
/// whose atom order differs from its SMILES text).
pub fn drawing_of(rec: &Record, mol: &Molecule, bond_px: f64) -> Option<String> {
    if !rec.ok {
        return None;
    }
    let opts = SvgOptions {
        bond_px,
        font_px: bond_px * 0.39,
        ..SvgOptions::default()
    };
    // The library is tested never to panic; should it, the record keeps its
    // text output and only the drawing is missing.
    std::panic::catch_unwind(std::panic::AssertUnwindSafe(|| {
        let lay = depict::layout(mol);
        depict::svg(mol, &lay, &Marks::from_record(rec), &opts)
    }))
    .ok()
}

/// Write an SVG to a file, or to stdout when no file is given.
pub fn write_svg(path: Option<&Path>, svg: &str) -> anyhow::Result<()> {
    match path {
        Some(p) => std::fs::write(p, format!("{svg}\n"))
            .with_context(|| format!("cannot write {}", p.display())),
        None => {
            let mut out = std::io::stdout().lock();
            writeln!(out, "{svg}")?;
            out.flush()?;
            Ok(())
        }
    }
}
