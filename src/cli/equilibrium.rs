//! `acidsite equilibrium SMILES --base NAME --equiv X [--conc M] [--solvent NAME]`:
//! the equilibrium composition of a molecule's acidic sites with a base.

use super::Outcome;
use acidsite::advice::{catalogue, equilibrium_for, EquilibriumOptions, Scale};
use acidsite::mol::Molecule;
use acidsite::sites::find_sites;
use anyhow::anyhow;
use serde_json::json;
use std::io::Write;

#[derive(clap::Args, Debug)]
pub struct Args {
    /// The molecule (quote it in the shell).
    #[arg(value_name = "SMILES")]
    pub smiles: String,
    /// Base, by its short name in `acidsite bases`.
    #[arg(long, value_name = "NAME")]
    pub base: String,
    /// Equivalents of base per equivalent of substrate.
    #[arg(long, value_name = "X", default_value_t = 1.0)]
    pub equiv: f64,
    /// Substrate concentration, mol/L.
    #[arg(long, value_name = "M", default_value_t = 0.5)]
    pub conc: f64,
    /// Solvent (default: the base's usual solvent). When it is the base's own
    /// conjugate acid (EtOH for NaOEt) it takes part in the equilibrium.
    #[arg(long, value_name = "NAME")]
    pub solvent: Option<String>,
    /// Compare on this pKa scale instead of the automatic choice (the scale
    /// nearest the solvent on which both acids have a value).
    #[arg(long, value_name = "SCALE", value_enum)]
    pub scale: Option<EquilibriumScale>,
    /// One JSON object instead of the report.
    #[arg(long)]
    pub json: bool,
}

fn percent(x: f64) -> String {
    let p = 100.0 * x;
    if (99.995..100.0).contains(&p) {
        "> 99.99 %".into()
    } else if p >= 0.01 || p == 0.0 {
        format!("{p:.2} %")
    } else {
        format!("{p:.1e} %")
    }
}

/// `x` to six significant digits, so that JSON carries no float noise
/// (`0.5999999999998497`); the numbers are estimates far less precise.
fn sig(x: f64) -> f64 {
    if x == 0.0 || !x.is_finite() {
        return x;
    }
    let digits = 6 - 1 - x.abs().log10().floor() as i32;
    let f = 10f64.powi(digits.clamp(-300, 300));
    let r = (x * f).round() / f;
    // Parse back through the shortest decimal text to drop binary residue.
    format!("{r:.*}", digits.max(0) as usize)
        .parse()
        .unwrap_or(r)
}

/// The pKa scales a base's conjugate acid can be compared on.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum EquilibriumScale {
    /// pKa in dimethyl sulfoxide (Bordwell scale)
    Dmso,
    /// pKa in water
    Water,
    /// pKa in tetrahydrofuran (ion-pair scale of lithium amides and organolithiums)
    Thf,
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let cat = catalogue().map_err(|e| anyhow!("the embedded base catalogue is invalid: {e}"))?;
    if cat.get(&args.base).is_none() {
        anyhow::bail!(
            "no base named {:?} in the catalogue (run `acidsite bases`)",
            args.base
        );
    }
    if let Some(sol) = &args.solvent {
        if cat.solvent(sol).is_none() {
            anyhow::bail!(
                "unknown solvent {sol:?}: the pKa scale and the solvent-as-acid correction are known only for the catalogue's solvents: {}",
                cat.solvents().join(", ")
            );
        }
    }
    if !(args.equiv.is_finite() && (0.0..=100.0).contains(&args.equiv)) {
        anyhow::bail!("--equiv must lie between 0 and 100, not {:e}", args.equiv);
    }
    if !(args.conc.is_finite() && args.conc > 0.0 && args.conc <= 20.0) {
        anyhow::bail!(
            "--conc must be a concentration above 0 and at most 20 mol/L, not {:e}",
            args.conc
        );
    }
    let mut out = std::io::BufWriter::new(std::io::stdout().lock());
    let mol = match Molecule::from_smiles(&args.smiles) {
        Ok(m) => m,
        Err(e) => {
            if args.json {
                let rec = json!({"input": args.smiles, "ok": false,
                    "error": {"kind": e.kind.name(), "message": e.message, "position": e.position}});
                writeln!(out, "{rec}")?;
            } else {
                writeln!(out, "{}: not read: {e}", args.smiles)?;
            }
            out.flush()?;
            return Ok(Outcome::SomeFailed);
        }
    };
    let report = find_sites(&mol);
    let opts = EquilibriumOptions {
        base: args.base.clone(),
        equivalents: args.equiv,
        concentration: args.conc,
        solvent: args.solvent.clone(),
        scale: args.scale.map(|s| match s {
            EquilibriumScale::Dmso => Scale::Dmso,
            EquilibriumScale::Water => Scale::Water,
            EquilibriumScale::Thf => Scale::Thf,
        }),
    };
    let eq = match equilibrium_for(&mol, &report, &opts) {
        Ok(e) => e,
        Err(e) => {
            if args.json {
                let rec = json!({"input": args.smiles, "ok": false,
                    "error": {"kind": "equilibrium", "message": e.to_string(), "position": null}});
                writeln!(out, "{rec}")?;
            } else {
                writeln!(out, "{}: no equilibrium: {e}", args.smiles)?;
            }
            out.flush()?;
            return Ok(Outcome::SomeFailed);
        }
    };
    let site_class = |i: usize| {
        report
            .sites
            .get(i)
            .map(|s| s.class.clone())
            .unwrap_or_default()
    };
    if args.json {
        let rec = json!({
            "input": args.smiles,
            "ok": true,
            "base": eq.base,
            "scale": eq.scale.name(),
            "base_pka": eq.base_pka,
            "equivalents": eq.equivalents,
            "concentration": eq.concentration,
            "solvent_as_acid": eq.acid_solvent.as_ref().map(|(n, m)| json!({"name": n, "molar": m})),
            "sites": eq.sites.iter().map(|s| json!({
                "atoms": s.atoms, "class": site_class(s.site), "pka": sig(s.pka),
                "deprotonated": sig(s.deprotonated)})).collect::<Vec<_>>(),
            "anions": eq.anions.iter().enumerate().map(|(k, f)| json!({
                "charge": -(k as i64), "fraction": sig(*f)})).collect::<Vec<_>>(),
            "free_base_molar": sig(eq.free_base_molar),
            "free_base_fraction": sig(eq.free_base_fraction),
            "conjugate_acid_molar": sig(eq.conjugate_acid_molar),
            "mass_balance_residual": sig(eq.mass_balance_residual),
            "notes": eq.notes,
        });
        writeln!(out, "{rec}")?;
        out.flush()?;
        return Ok(Outcome::AllFine);
    }
    writeln!(out, "== {}", args.smiles)?;
    writeln!(
        out,
        "   {} {} equiv, substrate {} mol/L; {} scale, conjugate acid pKa {}",
        eq.base,
        eq.equivalents,
        eq.concentration,
        eq.scale.name(),
        eq.base_pka
    )?;
    if let Some((name, molar)) = &eq.acid_solvent {
        writeln!(
            out,
            "   solvent {name} is the conjugate acid ({molar} mol/L, in the balance)"
        )?;
    }
    writeln!(
        out,
        "\n   site (atoms)        class                              pKa   deprotonated"
    )?;
    for s in &eq.sites {
        let atoms = acidsite::report::table::atom_list(&s.atoms);
        writeln!(
            out,
            "   {:<19} {:<33} {:>5.1}   {}",
            atoms,
            site_class(s.site),
            s.pka,
            percent(s.deprotonated)
        )?;
    }
    writeln!(out)?;
    for (k, f) in eq.anions.iter().enumerate() {
        let label = match k {
            0 => "neutral".to_string(),
            1 => "mono-anion".to_string(),
            2 => "di-anion".to_string(),
            k => format!("{k}-fold anion"),
        };
        writeln!(out, "   {label:<12} {}", percent(*f))?;
    }
    writeln!(
        out,
        "   free base    {} of the base added ({:.3e} mol/L)",
        percent(eq.free_base_fraction),
        eq.free_base_molar
    )?;
    for n in &eq.notes {
        writeln!(out, "   note: {n}")?;
    }
    writeln!(
        out,
        "   (the site pKa values are estimates with an uncertainty: see `acidsite scan`)"
    )?;
    out.flush()?;
    Ok(Outcome::AllFine)
}
