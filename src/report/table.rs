//! The human report of `acidsite scan`: plain text, fixed-width columns, read
//! at a glance. Rendered from the same [`Record`] as the JSON output, so the
//! two never disagree.
//!
//! ```
//! use acidsite::report::{analyze, table, Options, Scale};
//!
//! let rec = analyze("CC(=O)C", 1, None, &Options::default());
//! let text = table::render(&rec, Scale::Dmso);
//! // One line per site: rank, atoms, hydrogens, class, then the estimates.
//! let site = text.lines().find(|l| l.trim_start().starts_with("#1")).unwrap();
//! assert!(site.contains("C0,3") && site.contains("ketone"), "{site}");
//! assert_eq!(table::atom_list(&[0, 3]), "0,3");
//! ```

use super::record::{CautionOut, HazardOut, Record};
use crate::advice::DEFERRAL;
use crate::scale::Scale;
use std::fmt::Write;

/// How much of the advice the report shows, and the hints it adds.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct TextOptions {
    /// Every ruled-out base with its full reasons. By default the
    /// ruled-out bases are grouped by kind of reason, one line each, so the
    /// common report fits one screen; the full reasons are in the JSON
    /// record.
    pub all: bool,
    /// How the reader can see one more base judged in full (the command
    /// line passes `"check with --base NAME"`); none: no hint.
    pub hint_one_base: Option<&'static str>,
    /// How the reader can see every reason (the command line passes
    /// `"--all gives each reason"`); none: no hint.
    pub hint_all_reasons: Option<&'static str>,
}

/// A short label for a kind of rejection (the record's `kind` names).
fn reject_label(kind: &str) -> &str {
    match kind {
        "too-weak" => "too weak at equilibrium",
        "nucleophile" => "attack a group of the substrate",
        "transesterification" => "exchange the ester group",
        "hydrolysis" => "hydrolyse the ester or acyl group",
        "uncounted-proton" => "consumed by a more acidic hydrogen",
        "no-comparable-pka" => "no pKa on a comparable scale",
        "not-catalytic" => "consumed, not catalytic",
        "regio" => "give the other enolate",
        "side-reaction" => "known side reaction",
        "mode" => "not how this reaction is run",
        other => other,
    }
}

/// Render one record as the scan report (short form of the ruled-out
/// bases; see [`render_with`]).
pub fn render(rec: &Record, scale: Scale) -> String {
    render_with(rec, scale, TextOptions::default())
}

/// Render one record as the scan report.
pub fn render_with(rec: &Record, scale: Scale, text: TextOptions) -> String {
    let mut o = String::new();
    let title = match &rec.id {
        Some(id) => format!("{id}  {}", rec.input),
        None => rec.input.clone(),
    };
    let _ = writeln!(o, "== {title}");
    if let Some(e) = &rec.error {
        let _ = writeln!(
            o,
            "   not analysed: {} error: {}",
            e.kind.replace('_', " "),
            e.message
        );
        if let Some(p) = e.position {
            // Caret under the offending character (inputs are shown as given).
            let _ = writeln!(o, "   {}", rec.input);
            let _ = writeln!(o, "   {}^ character {p}", " ".repeat(p));
        }
        return o;
    }

    // Molecule.
    let formula = rec.formula.as_deref().unwrap_or("?");
    let _ = writeln!(o, "   formula        {formula}");
    if let Some(comps) = &rec.components {
        let main: Vec<_> = comps.iter().filter(|c| c.role == "main").collect();
        let others: Vec<_> = comps.iter().filter(|c| c.role != "main").collect();
        for c in &main {
            let _ = writeln!(
                o,
                "   analysed part  {}  ({}{})",
                c.smiles,
                c.formula,
                charge(c.charge)
            );
        }
        if others.is_empty() {
            let _ = writeln!(o, "   counter-ions   none");
        } else {
            let list: Vec<String> = others
                .iter()
                .map(|c| format!("{} ({}{})", c.smiles, c.formula, charge(c.charge)))
                .collect();
            let _ = writeln!(o, "   counter-ions   {}", list.join(", "));
        }
    }
    if let Some(rs) = &rec.rule_set {
        let _ = writeln!(o, "   rule set       {rs}");
    }

    // Sites.
    let sites = rec.sites.as_deref().unwrap_or(&[]);
    let _ = writeln!(o);
    if sites.is_empty() {
        let _ = writeln!(o, "   acidic hydrogens: none found");
    } else {
        let _ = writeln!(
            o,
            "   acidic hydrogens, most acidic first (ranked on the {} scale)",
            match scale {
                Scale::Water => "water",
                Scale::Thf => "DMSO (no site has a THF estimate)",
                _ => "DMSO",
            }
        );
        let rows: Vec<[String; 8]> = sites
            .iter()
            .map(|s| {
                [
                    format!("#{}", s.rank),
                    format!("{}{}", s.element, atom_list(&s.atoms)),
                    hydrogen_counts(s.hydrogens, s.deuterium, s.tritium),
                    s.class.clone(),
                    pka(s.pka_dmso),
                    pka(s.pka_water),
                    format!("±{:.1}", s.uncertainty),
                    match s.regio {
                        Some("kinetic") => "kinetic side".to_string(),
                        Some("thermodynamic") => "thermodynamic side".to_string(),
                        Some(x) => x.to_string(),
                        None => String::new(),
                    },
                ]
            })
            .collect();
        let head = [
            "rank",
            "atom",
            "H",
            "class",
            "DMSO",
            "water",
            "±",
            "enolate side",
        ];
        let mut w = [0usize; 8];
        for (i, h) in head.iter().enumerate() {
            w[i] = h.chars().count();
        }
        for r in &rows {
            for (i, f) in r.iter().enumerate() {
                w[i] = w[i].max(f.chars().count());
            }
        }
        let line = |f: &[String; 8]| -> String {
            let mut s = String::from("   ");
            for (i, x) in f.iter().enumerate() {
                let pad = w[i].saturating_sub(x.chars().count());
                // Numbers right-aligned, text left-aligned.
                if (4..=6).contains(&i) {
                    s.push_str(&" ".repeat(pad));
                    s.push_str(x);
                } else {
                    s.push_str(x);
                    s.push_str(&" ".repeat(pad));
                }
                s.push_str("  ");
            }
            s.trim_end().to_string()
        };
        let head_s: [String; 8] = head.map(|h| h.to_string());
        let _ = writeln!(o, "{}", line(&head_s));
        for r in &rows {
            let _ = writeln!(o, "{}", line(r));
        }
        let _ = writeln!(
            o,
            "   (pKa estimates from fragment rules; ± is one standard uncertainty)"
        );
    }

    // Advice.
    let _ = writeln!(o);
    match rec.advice.as_ref().and_then(|a| a.as_ref()) {
        None => {
            let why = rec.advice_note.as_deref().unwrap_or("no site to target");
            let _ = writeln!(o, "   advice         none: {why}");
            if let Some(h) = rec.hazards.as_ref().filter(|h| !h.is_empty()) {
                let _ = writeln!(o);
                let _ = writeln!(o, "   SAFETY");
                substrate_hazards(&mut o, h);
                wrap(&mut o, DEFERRAL, "     ", "     ");
            }
        }
        Some(a) => {
            let target = atom_list(&a.target);
            let _ = writeln!(o, "   advice for atom {target}  ({})", a.target_note);
            let control = a
                .control
                .map(|c| format!(", {c} control"))
                .unwrap_or_default();
            let _ = writeln!(
                o,
                "   reaction       {}{control}; base used {}",
                a.reaction, a.mode
            );
            if !a.mode_note.is_empty() {
                wrap(
                    &mut o,
                    &a.mode_note,
                    "                  ",
                    "                  ",
                );
            }
            match &a.base {
                Some(b) => {
                    let eq = a
                        .equivalents
                        .map(|e| format!("{e:.2} equiv"))
                        .unwrap_or_default();
                    let _ = writeln!(o, "   base           {b}  {eq}");
                }
                None => {
                    let _ = writeln!(
                        o,
                        "   base           none in the catalogue is strong enough and compatible"
                    );
                }
            }
            if !a.equivalents_note.is_empty() {
                wrap(
                    &mut o,
                    &a.equivalents_note,
                    "                  = ",
                    "                    ",
                );
            }
            for c in &a.counted {
                let atoms = atom_list(&c.atoms);
                wrap(
                    &mut o,
                    &format!(
                        "{} H on atom {atoms} ({}) goes first: {}",
                        c.protons, c.class, c.reason
                    ),
                    "                  + ",
                    "                    ",
                );
            }
            if let Some(s) = &a.solvent {
                let _ = writeln!(o, "   solvent        {s}");
            }
            if let Some(range) = a.temperature_range_c {
                let _ = writeln!(o, "   temperature    {}", temps(range));
            }
            if let Some(c) = a.conversion {
                let _ = writeln!(
                    o,
                    "   at equilibrium {} of the target deprotonated",
                    percent(c)
                );
            }
            if !a.scale_note.is_empty() {
                wrap(
                    &mut o,
                    &a.scale_note,
                    "   pKa basis      ",
                    "                  ",
                );
            }
            if let Some(r) = &a.regio_conditions {
                let _ = writeln!(o, "   enolate side");
                for (label, side) in [("kinetic", &r.kinetic), ("thermodynamic", &r.thermodynamic)]
                {
                    let fav = atom_list(&side.favours);
                    wrap(
                        &mut o,
                        &format!(
                            "{label} (atom {fav}): {} {:.2} equiv, {}, {}. {}",
                            side.base,
                            side.equivalents,
                            side.solvent,
                            temps(side.temperature_range_c),
                            side.procedure
                        ),
                        "     > ",
                        "       ",
                    );
                }
            }
            if !a.alternatives.is_empty() {
                let _ = writeln!(o, "   also suitable");
                for x in &a.alternatives {
                    let note = if x.note.is_empty() {
                        String::new()
                    } else {
                        format!(" ({})", x.note)
                    };
                    wrap(
                        &mut o,
                        &format!(
                            "{} {:.2} equiv in {}, {} at equilibrium{note}",
                            x.base,
                            x.equivalents,
                            x.solvent,
                            percent(x.conversion)
                        ),
                        "     + ",
                        "       ",
                    );
                }
                if a.alternatives_omitted > 0 {
                    let _ = writeln!(
                        o,
                        "     + {} more acceptable base(s), less preferred{}",
                        a.alternatives_omitted,
                        text.hint_one_base
                            .map(|h| format!(" ({h})"))
                            .unwrap_or_default()
                    );
                }
            }
            if !a.rejected.is_empty() && !text.all {
                let _ = writeln!(
                    o,
                    "   ruled out (by kind of reason{})",
                    text.hint_all_reasons
                        .map(|h| format!("; {h}"))
                        .unwrap_or_default()
                );
                let mut groups: Vec<(&str, Vec<&str>)> = Vec::new();
                for r in &a.rejected {
                    match groups.iter_mut().find(|g| g.0 == r.kind) {
                        Some(g) => g.1.push(r.base),
                        None => groups.push((r.kind, vec![r.base])),
                    }
                }
                for (kind, bases) in groups {
                    wrap(
                        &mut o,
                        &format!("{}: {}", reject_label(kind), bases.join(", ")),
                        "     - ",
                        "       ",
                    );
                }
            }
            if !a.rejected.is_empty() && text.all {
                let _ = writeln!(o, "   ruled out");
                // Bases ruled out for the same reason share one line.
                let mut groups: Vec<(Vec<&str>, &str)> = Vec::new();
                for r in a.rejected.iter().filter(|r| r.kind != "too-weak") {
                    match groups.iter_mut().find(|g| g.1 == r.reason) {
                        Some(g) => g.0.push(r.base),
                        None => groups.push((vec![r.base], &r.reason)),
                    }
                }
                for (bases, reason) in groups {
                    wrap(
                        &mut o,
                        &format!("{}: {}", bases.join(", "), reason),
                        "     - ",
                        "       ",
                    );
                }
                let weak: Vec<&str> = a
                    .rejected
                    .iter()
                    .filter(|r| r.kind == "too-weak")
                    .map(|r| r.base)
                    .collect();
                if !weak.is_empty() {
                    wrap(
                        &mut o,
                        &format!(
                            "too weak for a {} base at equilibrium: {} (details in --json)",
                            a.mode,
                            weak.join(", ")
                        ),
                        "     - ",
                        "       ",
                    );
                }
            }
            if !a.not_judged.is_empty() {
                let names: Vec<&str> = a.not_judged.iter().map(|n| n.base).collect();
                wrap(
                    &mut o,
                    &format!(
                        "not judged (no pKa on a scale shared with the target): {}",
                        names.join(", ")
                    ),
                    "   ",
                    "     ",
                );
            }
            if !a.warnings.is_empty() {
                let _ = writeln!(o, "   watch out");
                for w in &a.warnings {
                    wrap(&mut o, w, "     ! ", "       ");
                }
            }
            let hazards = rec.hazards.as_deref().unwrap_or(&[]);
            if !a.cautions.is_empty() || !hazards.is_empty() {
                let _ = writeln!(o);
                let _ = writeln!(o, "   SAFETY");
                substrate_hazards(&mut o, hazards);
                // The recommended base in full; other reagents by their hazards
                // (full texts in --json); the closing deferral once.
                let text = |c: &CautionOut| {
                    c.text
                        .strip_suffix(DEFERRAL)
                        .unwrap_or(&c.text)
                        .trim_end()
                        .to_string()
                };
                let is_base = |c: &CautionOut| Some(&c.reagent) == a.base.as_ref();
                for c in a.cautions.iter().filter(|c| is_base(c)) {
                    wrap(&mut o, &text(c), "     * ", "       ");
                }
                let short: Vec<String> = a
                    .cautions
                    .iter()
                    .filter(|c| !is_base(c) && !c.hazards.is_empty())
                    .map(|c| format!("{} ({})", c.reagent, c.hazards.join(", ")))
                    .collect();
                if !short.is_empty() {
                    wrap(
                        &mut o,
                        &format!("also named here: {}", short.join("; ")),
                        "     * ",
                        "       ",
                    );
                }
                for c in a
                    .cautions
                    .iter()
                    .filter(|c| !is_base(c) && c.hazards.is_empty())
                {
                    wrap(&mut o, &text(c), "     * ", "       ");
                }
                wrap(&mut o, DEFERRAL, "     ", "     ");
            }
        }
    }
    if let Some(m) = &rec.mapped_smiles {
        let _ = writeln!(o);
        let _ = writeln!(o, "   sites by rank  {m}");
    }
    if let Some(flags) = &rec.flags {
        let list: Vec<String> = flags.0.iter().map(|(k, v)| format!("{k}={v}")).collect();
        let _ = writeln!(o, "   flags          {}", list.join("  "));
    }
    o
}

/// The hazards of the substrate itself, one caution each, before the
/// reagents' cautions.
fn substrate_hazards(o: &mut String, hazards: &[HazardOut]) {
    for h in hazards {
        wrap(o, &format!("{} [{}]", h.text, h.id), "     ! ", "       ");
    }
}

/// Width the report is wrapped to.
const WIDTH: usize = 100;

/// Comma-separated atom indices (`3,7`).
pub fn atom_list(atoms: &[usize]) -> String {
    atoms
        .iter()
        .map(|a| a.to_string())
        .collect::<Vec<_>>()
        .join(",")
}

/// Append `text` word-wrapped to [`WIDTH`], the first line after `first`,
/// the others after `rest`.
fn wrap(o: &mut String, text: &str, first: &str, rest: &str) {
    let mut line = String::from(first);
    let mut empty = true;
    for word in text.split_whitespace() {
        let len = line.chars().count();
        if !empty && len + 1 + word.chars().count() > WIDTH {
            o.push_str(line.trim_end());
            o.push('\n');
            line = String::from(rest);
            empty = true;
        }
        if !empty {
            line.push(' ');
        }
        line.push_str(word);
        empty = false;
    }
    o.push_str(line.trim_end());
    o.push('\n');
}

fn temps([lo, hi]: [f64; 2]) -> String {
    if lo == hi {
        format!("{lo} °C")
    } else {
        format!("{lo} to {hi} °C, start at the low end")
    }
}

fn pka(x: Option<f64>) -> String {
    x.map(|v| format!("{v:.1}")).unwrap_or_else(|| "-".into())
}

fn charge(c: i32) -> String {
    match c {
        0 => String::new(),
        1 => ", +".into(),
        -1 => ", −".into(),
        c if c > 0 => format!(", {c}+"),
        c => format!(", {}−", -c),
    }
}

fn percent(c: f64) -> String {
    let p = c * 100.0;
    if p >= 99.995 {
        "> 99.99 %".to_string()
    } else if p >= 99.0 {
        format!("{p:.2} %")
    } else if p >= 1.0 {
        format!("{p:.1} %")
    } else {
        format!("{p:.2e} %")
    }
}

/// Hydrogen count of a site atom with its labels apart: `3H`, `2H+1D`,
/// `1D+1T` (D and T are part of the total the record gives as `hydrogens`).
fn hydrogen_counts(total: u8, d: u8, t: u8) -> String {
    let h = total.saturating_sub(d).saturating_sub(t);
    let mut parts = Vec::new();
    if h > 0 || (d == 0 && t == 0) {
        parts.push(format!("{h}H"));
    }
    if d > 0 {
        parts.push(format!("{d}D"));
    }
    if t > 0 {
        parts.push(format!("{t}T"));
    }
    parts.join("+")
}
