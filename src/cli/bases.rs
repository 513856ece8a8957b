//! `acidsite bases`: the base catalogue with conjugate-acid pKa values, their
//! sources, and the practical facts the recommender uses.

use super::Outcome;
use acidsite::advice::{catalogue, Base, Scale};
use anyhow::anyhow;
use serde_json::json;
use std::collections::BTreeSet;
use std::io::Write;

#[derive(clap::Args, Debug)]
pub struct Args {
    /// One JSON object per base instead of the table.
    #[arg(long)]
    pub json: bool,
    /// Show only this base (short name, e.g. LDA), with its full references.
    #[arg(value_name = "NAME")]
    pub name: Option<String>,
}

fn pka_cell(b: &Base, s: Scale) -> String {
    match (b.pka(s), b.pka_source(s)) {
        (Some(v), Some(src)) => format!("{v} [{src}]"),
        (Some(v), None) => format!("{v}"),
        _ => "-".into(),
    }
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let cat = catalogue().map_err(|e| anyhow!("the embedded base catalogue is invalid: {e}"))?;
    let bases: Vec<&Base> = match &args.name {
        Some(n) => vec![cat.get(n).ok_or_else(|| {
            anyhow!("no base named {n:?} in the catalogue (run `acidsite bases`)")
        })?],
        None => cat.bases.iter().collect(),
    };
    let mut out = std::io::BufWriter::new(std::io::stdout().lock());
    if args.json {
        for b in &bases {
            let cited = |s: Scale| {
                b.pka(s)
                    .map(|v| json!({"value": v, "source": b.pka_source(s)}))
                    .unwrap_or(serde_json::Value::Null)
            };
            let rec = json!({
                "catalogue": cat.version,
                "name": b.name,
                "full_name": b.full_name,
                "family": b.family.name(),
                "conjugate_acid": b.conjugate_acid,
                "pka_dmso": cited(Scale::Dmso),
                "pka_water": cited(Scale::Water),
                "pka_thf": cited(Scale::Thf),
                "counter_ion": b.counter_ion,
                "nucleophilic": b.nucleophilic.name(),
                "hindered": b.hindered,
                "solvents": b.solvents,
                "temperature_range_c": [b.temp_min_c, b.temp_max_c],
                "solvent_is_conjugate_acid": b.acid_solvent.as_ref().map(|p| &p.name),
                "hazards": b.hazards.iter().map(|h| h.name()).collect::<Vec<_>>(),
                "notes": b.notes,
                "cautions": cautions_json(b),
            });
            writeln!(out, "{rec}")?;
        }
        out.flush()?;
        return Ok(Outcome::AllFine);
    }
    writeln!(
        out,
        "base catalogue {} ({} bases); pKa of the conjugate acid [citation key]",
        cat.version,
        cat.bases.len()
    )?;
    let head = [
        "base",
        "DMSO",
        "water",
        "THF",
        "ion",
        "nucleophile",
        "hindered",
        "usual solvents",
        "°C",
        "hazards",
    ];
    let rows: Vec<Vec<String>> = bases
        .iter()
        .map(|b| {
            vec![
                b.name.clone(),
                pka_cell(b, Scale::Dmso),
                pka_cell(b, Scale::Water),
                pka_cell(b, Scale::Thf),
                b.counter_ion.clone().unwrap_or_else(|| "-".into()),
                b.nucleophilic.name().to_string(),
                if b.hindered { "yes" } else { "no" }.to_string(),
                b.solvents.join(", "),
                format!("{}..{}", b.temp_min_c, b.temp_max_c),
                b.hazards
                    .iter()
                    .map(|h| h.name())
                    .collect::<Vec<_>>()
                    .join(", "),
            ]
        })
        .collect();
    write_table(&mut out, &head, &rows)?;
    let keys: BTreeSet<&str> = bases
        .iter()
        .flat_map(|b| [Scale::Dmso, Scale::Water, Scale::Thf].map(|s| b.pka_source(s)))
        .flatten()
        .collect();
    writeln!(out, "\nsources")?;
    for k in keys {
        writeln!(
            out,
            "  [{k}] {}",
            cat.reference(k).unwrap_or("(reference missing)")
        )?;
    }
    writeln!(
        out,
        "\nHazard codes summarise the usual hazards only; read the safety data sheet of each reagent."
    )?;
    out.flush()?;
    Ok(Outcome::AllFine)
}

/// The full wording of a base's cautions (brief records name them by id):
/// `full`, `short` (one line), `in_dmf_dmso_dmac` where the solvent adds a
/// hazard, and `general`, the caution covering every reagent named in the
/// advice (id `general` in brief records).
fn cautions_json(b: &Base) -> serde_json::Value {
    use acidsite::advice::{caution_for, general_caution, short_caution_for};
    let full = caution_for(b, None).map(|c| c.text);
    let dipolar = caution_for(b, Some("DMF")).map(|c| c.text);
    let mut v = json!({
        "full": full,
        "short": short_caution_for(b).map(|c| c.text),
        "general": general_caution().text,
    });
    if dipolar != full {
        v["in_dmf_dmso_dmac"] = json!(dipolar);
    }
    v
}

/// Left-aligned columns separated by two spaces.
pub fn write_table(
    out: &mut impl Write,
    head: &[&str],
    rows: &[Vec<String>],
) -> std::io::Result<()> {
    let mut w: Vec<usize> = head.iter().map(|h| h.chars().count()).collect();
    for r in rows {
        for (i, c) in r.iter().enumerate() {
            if i < w.len() {
                w[i] = w[i].max(c.chars().count());
            }
        }
    }
    let line = |cells: Vec<&str>| -> String {
        let mut s = String::new();
        for (i, c) in cells.iter().enumerate() {
            s.push_str(c);
            if i + 1 < cells.len() {
                s.push_str(&" ".repeat(w[i].saturating_sub(c.chars().count()) + 2));
            }
        }
        s.trim_end().to_string()
    };
    writeln!(out, "{}", line(head.to_vec()))?;
    for r in rows {
        writeln!(out, "{}", line(r.iter().map(String::as_str).collect()))?;
    }
    Ok(())
}
