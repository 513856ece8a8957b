//! `acidsite rules`: the fragment rule set (class rules and substituent
//! increments) with values, uncertainties and sources, and its version.

use super::bases::write_table;
use super::Outcome;
use acidsite::sites::rule_set;
use anyhow::anyhow;
use std::collections::BTreeSet;
use std::io::Write;

#[derive(clap::Args, Debug)]
pub struct Args {
    /// One JSON object per rule and increment instead of the tables.
    #[arg(long)]
    pub json: bool,
    /// Only rules whose id, class or element contains this text (any case).
    #[arg(long, value_name = "TEXT")]
    pub only: Option<String>,
}

fn num(x: Option<f64>) -> String {
    x.map(|v| format!("{v}")).unwrap_or_else(|| "-".into())
}

pub fn run(args: Args) -> anyhow::Result<Outcome> {
    let set = rule_set().map_err(|e| anyhow!("the embedded rule set is invalid: {e}"))?;
    let needle = args.only.as_deref().map(str::to_ascii_lowercase);
    let keep = |fields: &[&str]| match &needle {
        None => true,
        Some(n) => fields.iter().any(|f| f.to_ascii_lowercase().contains(n)),
    };
    let rules: Vec<_> = set
        .rules
        .iter()
        .filter(|r| keep(&[&r.id, &r.class, &r.element]))
        .collect();
    let incs: Vec<_> = set
        .increments
        .iter()
        .filter(|i| keep(&[&i.id, &i.kind]))
        .collect();
    if rules.is_empty() && incs.is_empty() {
        if let Some(text) = &args.only {
            eprintln!("acidsite rules: no class rule or increment has '{text}' in its id, class, element or substituent");
            return Ok(Outcome::SomeFailed);
        }
    }
    let mut out = std::io::BufWriter::new(std::io::stdout().lock());
    if args.json {
        for r in &rules {
            writeln!(out, "{}", acidsite::report::listings::rule_json(set, r))?;
        }
        for i in &incs {
            writeln!(
                out,
                "{}",
                acidsite::report::listings::increment_json(set, i)
            )?;
        }
        out.flush()?;
        return Ok(Outcome::AllFine);
    }
    writeln!(
        out,
        "rule set {} ({} class rules, {} increments)\nmatch order: {}\n",
        set.version,
        set.rules.len(),
        set.increments.len(),
        set.match_order
    )?;
    let rows: Vec<Vec<String>> = rules
        .iter()
        .map(|r| {
            vec![
                r.id.clone(),
                r.element.clone(),
                r.class.clone(),
                num(r.pka_dmso),
                num(r.pka_water),
                format!("±{}", r.uncertainty),
                r.source.clone(),
                r.smarts.clone(),
            ]
        })
        .collect();
    if !rows.is_empty() {
        writeln!(
            out,
            "class rules: base pKa of the parent acid [citation key]"
        )?;
        write_table(
            &mut out,
            &[
                "id",
                "el",
                "class",
                "DMSO",
                "water",
                "±",
                "source",
                "SMARTS (acidic atom :1)",
            ],
            &rows,
        )?;
    }
    let rows: Vec<Vec<String>> = incs
        .iter()
        .map(|i| {
            vec![
                i.id.clone(),
                i.kind.clone(),
                i.families.join(","),
                i.nth.to_string(),
                num(i.dmso),
                num(i.water),
                format!("±{}", i.uncertainty),
                i.source.clone(),
            ]
        })
        .collect();
    if !rows.is_empty() {
        writeln!(
            out,
            "\nincrements: added for each substituent on the acidic atom"
        )?;
        write_table(
            &mut out,
            &[
                "id",
                "substituent",
                "families",
                "nth",
                "DMSO",
                "water",
                "±",
                "source",
            ],
            &rows,
        )?;
    }
    let keys: BTreeSet<&str> = rules
        .iter()
        .map(|r| r.source.as_str())
        .chain(incs.iter().map(|i| i.source.as_str()))
        .flat_map(|s| s.split([',', ';', ' ']).filter(|k| !k.is_empty()))
        .collect();
    writeln!(out, "\nsources")?;
    for k in keys {
        let r = set
            .sources
            .get(k)
            .map(String::as_str)
            .unwrap_or("(reference missing)");
        writeln!(out, "  [{k}] {r}")?;
    }
    out.flush()?;
    Ok(Outcome::AllFine)
}
