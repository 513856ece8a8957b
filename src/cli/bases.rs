//! `acidsite bases`: the base catalogue with conjugate-acid pKa values, their
//! sources, and the practical facts the recommender uses.

use super::Outcome;
use acidsite::advice::{catalogue, Base, Scale};
use anyhow::anyhow;
use std::collections::BTreeSet;
use std::io::Write;

#[derive(clap::Args, Debug)]
pub struct Args {
    /// One JSON object per base instead of the table.
    #[arg(long)]
    pub json: bool,
    /// Show only this base or reagent system (short name, e.g. LDA or Et3N/TMSCl),
    /// with its full references.
    #[arg(value_name = "NAME")]
    pub name: Option<String>,
    /// Also show the citation key beside each pKa and the usual solvents (wide table).
    #[arg(long)]
    pub wide: bool,
}

/// Width the plain listing keeps to (prose is wrapped, the table is narrowed).
const WIDTH: usize = 120;

/// `first` then `text` wrapped to [`WIDTH`] columns, `indent` before every
/// continuation line.
fn wrapped(first: &str, text: &str, indent: &str) -> String {
    let mut out = String::from(first);
    let mut col = first.chars().count();
    let mut line_start = true;
    for word in text.split_whitespace() {
        let n = word.chars().count();
        if !line_start && col + 1 + n > WIDTH {
            out.push('\n');
            out.push_str(indent);
            col = indent.chars().count();
            line_start = true;
        }
        if !line_start {
            out.push(' ');
            col += 1;
        }
        out.push_str(word);
        col += n;
        line_start = false;
    }
    out
}

/// A reagent system of fragments/systems.tsv, as JSON or as text.
fn show_system(
    out: &mut impl Write,
    sy: &acidsite::advice::practice::System,
    json_out: bool,
) -> anyhow::Result<()> {
    let caution = acidsite::advice::caution_for_reagent(&sy.name, &sy.hazards, &[]);
    if json_out {
        writeln!(out, "{}", acidsite::report::listings::system_json(sy))?;
    } else {
        writeln!(out, "reagent system {}", sy.name)?;
        writeln!(
            out,
            "  numbers from  {}",
            sy.base
                .as_deref()
                .unwrap_or("- (a route, judged by practice)")
        )?;
        writeln!(out, "  solvent       {}", sy.solvent)?;
        writeln!(
            out,
            "  temperature   {} to {} °C",
            sy.temp_min_c, sy.temp_max_c
        )?;
        writeln!(
            out,
            "{}",
            wrapped("  procedure     ", &sy.procedure, "                ")
        )?;
        writeln!(out, "  source        [{}]", sy.source)?;
        if let Some(c) = caution {
            writeln!(
                out,
                "{}",
                wrapped("  caution       ", &c.text, "                ")
            )?;
        }
    }
    Ok(())
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
    let practice = acidsite::advice::practice::practice()
        .map_err(|e| anyhow!("the embedded practice data are invalid: {e}"))?;
    let mut out = std::io::BufWriter::new(std::io::stdout().lock());
    if let Some(sy) = args.name.as_deref().and_then(|n| practice.system(n)) {
        show_system(&mut out, sy, args.json)?;
        out.flush()?;
        return Ok(Outcome::AllFine);
    }
    let bases: Vec<&Base> = match &args.name {
        Some(n) => vec![cat.get(n).ok_or_else(|| {
            anyhow!("no base or reagent system named {n:?} (run `acidsite bases`)")
        })?],
        None => cat.bases.iter().collect(),
    };
    if args.json {
        for b in &bases {
            let rec = acidsite::report::listings::base_json(cat, b);
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
    let wide = args.wide || args.name.is_some();
    let mut head = vec!["base", "DMSO", "water", "THF", "ion", "nucl.", "hindered"];
    if wide {
        head.push("usual solvents");
    }
    head.extend(["°C", "hazards"]);
    let value = |b: &Base, s: Scale| match b.pka(s) {
        Some(v) => format!("{v}"),
        None => "-".into(),
    };
    let rows: Vec<Vec<String>> = bases
        .iter()
        .map(|b| {
            let pk = |s: Scale| if wide { pka_cell(b, s) } else { value(b, s) };
            let mut r = vec![
                b.name.clone(),
                pk(Scale::Dmso),
                pk(Scale::Water),
                pk(Scale::Thf),
                b.counter_ion.clone().unwrap_or_else(|| "-".into()),
                b.nucleophilic.name().to_string(),
                if b.hindered { "yes" } else { "no" }.to_string(),
            ];
            if wide {
                r.push(b.solvents.join(", "));
            }
            r.push(format!("{} to {}", b.temp_min_c, b.temp_max_c));
            r.push(
                b.hazards
                    .iter()
                    .map(|h| h.name())
                    .collect::<Vec<_>>()
                    .join(","),
            );
            r
        })
        .collect();
    write_table(&mut out, &head, &rows)?;
    if args.name.is_none() {
        writeln!(
            out,
            "\nreagent systems and routes (fragments/systems.tsv; `acidsite bases NAME` for one)"
        )?;
        let srows: Vec<Vec<String>> = practice
            .systems
            .iter()
            .map(|sy| {
                vec![
                    sy.name.clone(),
                    sy.base.clone().unwrap_or_else(|| "-".into()),
                    sy.solvent.clone(),
                    format!("{} to {}", sy.temp_min_c, sy.temp_max_c),
                    format!("[{}]", sy.source),
                ]
            })
            .collect();
        write_table(
            &mut out,
            &["system", "numbers from", "solvent", "°C", "source"],
            &srows,
        )?;
        if !wide {
            writeln!(
                out,
                "(pKa citation keys and usual solvents: --wide, or `acidsite bases NAME`)"
            )?;
        }
    }
    let keys: BTreeSet<&str> = bases
        .iter()
        .flat_map(|b| [Scale::Dmso, Scale::Water, Scale::Thf].map(|s| b.pka_source(s)))
        .flatten()
        .collect();
    if wide {
        writeln!(out, "\nsources")?;
        for k in keys {
            let first = format!("  [{k}] ");
            writeln!(
                out,
                "{}",
                wrapped(
                    &first,
                    cat.reference(k).unwrap_or("(reference missing)"),
                    "      "
                )
            )?;
        }
    }
    writeln!(
        out,
        "\nHazard codes summarise the usual hazards only; read the safety data sheet of each reagent."
    )?;
    out.flush()?;
    Ok(Outcome::AllFine)
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
