//! One SMILES in, one [`Record`] out: molecule → sites → advice, with the
//! options of `scan` and `annotate`. No I/O.
//!
//! ```
//! use acidsite::analyze::{analyze, Flag, Options};
//!
//! // Butan-2-one, `CC(=O)CC`: atom 0 is the methyl, atom 3 the methylene.
//! // Ask for advice on the methylene side and count the carbonyl groups.
//! let opts = Options {
//!     site: Some(3),
//!     flags: vec![Flag::parse("carbonyl=[CX3]=O").unwrap()],
//!     ..Options::default()
//! };
//! let rec = analyze("CC(=O)CC", 1, None, &opts);
//! assert!(rec.ok);
//! let advice = rec.advice.clone().flatten().expect("advice for atom 3");
//! assert_eq!(advice.target, vec![3]);
//! // The two α-carbons are separate sites: the methyl is the kinetic
//! // (less substituted) side, the methylene the thermodynamic side.
//! let sites = rec.sites.as_ref().unwrap();
//! let side = |atom: usize| sites.iter().find(|s| s.atoms == [atom]).and_then(|s| s.regio);
//! assert_eq!(side(0), Some("kinetic"));
//! assert_eq!(side(3), Some("thermodynamic"));
//! assert_eq!(rec.flags.as_ref().unwrap().0, vec![("carbonyl".to_string(), 1)]);
//! // A flag needs `NAME=SMARTS`.
//! assert!(Flag::parse("carbonyl").is_err());
//! ```

#![warn(missing_docs)]

use crate::advice::practice::{Control, Reaction};
use crate::advice::{advise_in_using, AdviceData, AdviceOptions, RegioConditions, Temperature};
use crate::mol::Molecule;
use crate::report::brief::Detail;
use crate::report::mapped::{atom_mapped_smiles, Label};
use crate::report::record::{
    round, AdviceOut, AlternativeOut, CautionOut, ComponentOut, CountedOut, ErrorOut, HazardOut,
    NotJudgedOut, Pairs, Record, RegioOut, RegioSideOut, RejectedOut, RuleOut, SiteOut,
    MAX_ALTERNATIVES, SCHEMA,
};
use crate::sites::{self, Regio, SiteReport};
use crate::smarts::{Pattern, PatternError, Target};

/// Inputs longer than this many bytes are refused before parsing (a clear
/// `too_large` error instead of a slowdown).
pub const MAX_SMILES_BYTES: usize = 100_000;

pub use crate::scale::Scale;

/// At most this many unique matches of a `--flag` pattern are counted per
/// molecule; a record that reaches it says so in `flag_warnings`.
pub const FLAG_MAX_MATCHES: usize = 10_000;
/// At most this many matcher steps per `--flag` pattern and molecule (well
/// under a second).
pub const FLAG_MAX_STEPS: u64 = 10_000_000;

/// A named SMARTS pattern counted in every record (`--flag NAME=SMARTS`).
#[derive(Debug, Clone)]
pub struct Flag {
    /// Name the count is reported under (a key of the record's `flags`).
    pub name: String,
    /// The parsed SMARTS pattern whose unique matches are counted.
    pub pattern: Pattern,
}

/// Why a `NAME=SMARTS` flag specification was refused.
#[derive(Debug, Clone, PartialEq, Eq)]
#[non_exhaustive]
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
    /// Scale on which the sites are ranked.
    pub scale: Scale,
    /// Patterns to count.
    pub flags: Vec<Flag>,
    /// Sites only: skip the base advice (`advice` is null, with a note).
    pub sites_only: bool,
    /// Full or brief records. Brief analysis words no alternatives and
    /// builds neither the atom-mapped SMILES nor the component texts, which
    /// the brief form does not carry.
    pub detail: Detail,
    /// The planned reaction (None: alkylation).
    pub reaction: Option<Reaction>,
    /// The enolate wanted where a ketone has two sides.
    pub control: Option<Control>,
    /// The base catalogue and practice data the advice is worked out from;
    /// None: the embedded ones ([`AdviceData::embedded`]). Records borrow
    /// base names for the whole program, so the caller's data must live as
    /// long (`'static`: parse them once and keep them, for example in a
    /// `std::sync::OnceLock`).
    pub advice_data: Option<AdviceData<'static>>,
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
    analyze_molecule(smiles, &mol, line, id, opts)
}

/// Analyse one molfile (V2000 or V3000; see [`crate::mol::molfile`]). The
/// record's `input` is a SMILES of the molecule written by the reader (atom
/// indices stay in molfile order); a molfile that cannot be read gives a
/// failure record whose message names the line (`line_offset` is added to
/// the molfile's own line numbers, for a molfile inside a larger file).
/// Never panics.
pub fn analyze_molfile(
    molfile: &str,
    line_offset: u64,
    line: u64,
    id: Option<String>,
    opts: &Options,
) -> Record {
    match crate::mol::molfile::read(molfile) {
        Ok(r) => analyze_molecule(&r.smiles, &r.molecule, line, id, opts),
        Err(e) => {
            let e = e.shifted(line_offset as usize);
            Record::failure(
                line,
                id,
                String::new(),
                ErrorOut {
                    kind: e.kind.name().to_string(),
                    message: e.to_string(),
                    position: None,
                },
            )
        }
    }
}

/// Analyse a molecule already read. `input` is the SMILES text its atom
/// spans point into (the input SMILES, or the SMILES a molfile reader
/// wrote); it is stamped into the record and used for the atom-mapped
/// SMILES and the component texts.
pub fn analyze_molecule(
    input: &str,
    mol: &Molecule,
    line: u64,
    id: Option<String>,
    opts: &Options,
) -> Record {
    let smiles = input;
    // One pattern-matching view of the molecule serves the sites and the
    // advice's functional groups.
    let target = Target::new(mol);
    let report = sites::find_sites_in(mol, &target, &sites::Options { scale: opts.scale });
    let (advice, advice_note) = if opts.sites_only {
        (None, Some("not requested (sites only)".to_string()))
    } else {
        advice_record(mol, &target, &report, opts)
    };
    // Hazards of the substrate itself, with or without advice.
    let hazards = crate::hazards::substrate_hazards(&target)
        .map(|found| {
            found
                .into_iter()
                .map(|h| HazardOut {
                    id: h.id.clone(),
                    text: h.message.clone(),
                })
                .collect::<Vec<_>>()
        })
        .unwrap_or_else(|e| {
            // Never silent: a broken embedded table says so in the record.
            vec![HazardOut {
                id: "hazard-data".to_string(),
                text: format!("the substrate hazard table could not be read ({e}); check the molecule by hand"),
            }]
        });
    // The report is not needed after the advice: its strings move into the
    // record.
    let sites_out = site_records(report);
    let brief = opts.detail == Detail::Brief;
    let mapped = if brief {
        None
    } else {
        mapped_smiles(smiles, mol, &sites_out)
    };
    // User patterns are counted with bounds (issue 17): a pattern such as a
    // 20-atom chain on a large cage has astronomically many matches.
    let mut flag_warnings: Vec<String> = Vec::new();
    let flags = if opts.flags.is_empty() {
        None
    } else {
        Some(Pairs(
            opts.flags
                .iter()
                .map(|f| {
                    let (n, bound) =
                        f.pattern
                            .count_unique_bounded(&target, FLAG_MAX_MATCHES, FLAG_MAX_STEPS);
                    match bound {
                        Some(crate::smarts::CountBound::Matches) => flag_warnings.push(format!(
                            "pattern {}: more than {FLAG_MAX_MATCHES} matches, count stopped",
                            f.name
                        )),
                        Some(crate::smarts::CountBound::Steps) => flag_warnings.push(format!(
                            "pattern {}: search stopped after {FLAG_MAX_STEPS} steps; at least {n} matches",
                            f.name
                        )),
                        None => {}
                    }
                    (f.name.clone(), n as u64)
                })
                .collect(),
        ))
    };
    let (formula, components) = if brief {
        (mol.formula(), Vec::new())
    } else {
        molecule_facts(smiles, mol)
    };
    Record {
        schema: SCHEMA,
        line,
        id,
        input: smiles.to_string(),
        ok: true,
        columns: None,
        formula: Some(formula),
        components: (!brief).then_some(components),
        rule_set: Some(sites::rule_set_version()),
        sites: Some(sites_out),
        advice: Some(advice),
        advice_note,
        hazards: (!hazards.is_empty()).then_some(hazards),
        mapped_smiles: mapped,
        flags,
        flag_warnings: (!flag_warnings.is_empty()).then_some(flag_warnings),
        error: None,
    }
}

/// Sites as output records, in the library's ranking (rank 1 = most acidic).
/// The report is consumed: its strings and atom lists move into the records.
fn site_records(report: SiteReport) -> Vec<SiteOut> {
    report
        .sites
        .into_iter()
        .enumerate()
        .map(|(rank, s)| SiteOut {
            rank: rank as u32 + 1,
            atoms: s.atoms,
            element: s.element.symbol().to_string(),
            hydrogens: s.hydrogens,
            deuterium: s.deuterium,
            tritium: s.tritium,
            class: s.class,
            pka_dmso: s.pka_dmso.and_then(|x| round(x, 0.01)),
            pka_water: s.pka_water.and_then(|x| round(x, 0.01)),
            uncertainty: round(s.uncertainty, 0.01).unwrap_or(0.0),
            rules: s
                .rules
                .into_iter()
                .map(|r| RuleOut {
                    id: r.id,
                    dmso: r.dmso.and_then(|x| round(x, 0.01)),
                    water: r.water.and_then(|x| round(x, 0.01)),
                })
                .collect(),
            regio: s.regio.map(|r| match r {
                Regio::Kinetic => "kinetic",
                Regio::Thermodynamic => "thermodynamic",
            }),
            background: s.background,
        })
        .collect()
}

/// The input with each site's atoms labelled by rank; None if the atom spans
/// do not fit the text (reported rather than guessed).
fn mapped_smiles(smiles: &str, mol: &Molecule, sites: &[SiteOut]) -> Option<String> {
    let mut labels = Vec::new();
    // Background (unactivated alkane, aryl, vinyl …) C–H sites rank last and are not
    // labelled: the text stays readable.
    for s in sites.iter().filter(|s| !s.background) {
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
    let formula = mol.formula();
    let charge_of = |atoms: &mut dyn Iterator<Item = usize>| -> i32 {
        atoms
            .filter_map(|a| mol.atoms.get(a))
            .map(|a| a.charge as i32)
            .sum()
    };
    // The usual case: one component written without a dot. Its text is the
    // whole input and its formula that of the whole input.
    if mol.component_count() == 1 && mol.main_component() == 0 && !smiles.contains('.') {
        let all = mol.atoms.len();
        let n = smiles.chars().count();
        let one_piece = (0..all).all(|a| mol.component_of(a) == 0);
        if one_piece && mol.atoms.iter().any(|a| a.span.start < n) {
            let component = ComponentOut {
                role: "main",
                smiles: smiles.to_string(),
                formula: formula.clone(),
                charge: charge_of(&mut (0..all)),
            };
            return (formula, vec![component]);
        }
    }
    let pieces = dot_pieces(smiles);
    let main = mol.main_component();
    let mut order: Vec<usize> = (0..mol.component_count()).collect();
    order.sort_by_key(|&c| (c != main, c));
    let out = order
        .into_iter()
        .map(|c| {
            let atoms = mol.component_atoms(c);
            // The text pieces whose first atom belongs to this component.
            let mut text = String::new();
            let mut first = true;
            for (range, t) in &pieces {
                let inside = atoms
                    .iter()
                    .filter_map(|&a| mol.atoms.get(a))
                    .any(|a| a.span.start >= range.start && a.span.start < range.end);
                if inside {
                    if !first {
                        text.push('.');
                    }
                    first = false;
                    text.push_str(t);
                }
            }
            ComponentOut {
                role: if c == main { "main" } else { "counter_ion" },
                smiles: text,
                formula: mol.formula_of_atoms(&atoms),
                charge: charge_of(&mut atoms.iter().copied()),
            }
        })
        .collect();
    (formula, out)
}

/// The input split at `.` outside brackets: (character range, text) of each piece.
fn dot_pieces(smiles: &str) -> Vec<(std::ops::Range<usize>, &str)> {
    let mut out = Vec::new();
    let mut start = 0usize; // characters
    let mut start_byte = 0usize;
    let mut depth = 0i32;
    let mut n = 0usize;
    for (i, (byte, c)) in smiles.char_indices().enumerate() {
        n = i + 1;
        match c {
            '[' => depth += 1,
            ']' => depth -= 1,
            '.' if depth <= 0 => {
                out.push((start..i, smiles.get(start_byte..byte).unwrap_or("")));
                start = i + 1;
                start_byte = byte + 1;
            }
            _ => {}
        }
    }
    out.push((start..n.max(start), smiles.get(start_byte..).unwrap_or("")));
    out
}

/// Advice for the target site, or None with the reason when there is
/// nothing to target.
fn advice_record(
    mol: &Molecule,
    target: &Target,
    report: &SiteReport,
    opts: &Options,
) -> (Option<AdviceOut>, Option<String>) {
    let aopts = AdviceOptions {
        base: opts.base.clone(),
        site: opts.site,
        reaction: opts.reaction,
        control: opts.control,
        alternatives: Some(if opts.detail == Detail::Brief {
            0
        } else {
            MAX_ALTERNATIVES
        }),
        // Records report the conversion, not the full composition.
        full_equilibrium: false,
        // Brief records name the ruled-out bases without their reasons.
        word_rejections: opts.detail != Detail::Brief,
        ..AdviceOptions::default()
    };
    // The advice is consumed: its strings move into the record.
    let data = match opts.advice_data.map_or_else(AdviceData::embedded, Ok) {
        Ok(d) => d,
        Err(e) => {
            return (
                None,
                Some(crate::advice::AdviceError::Catalogue(e).to_string()),
            )
        }
    };
    let a = match advise_in_using(mol, target, report, &aopts, data) {
        Ok(a) => a,
        Err(e) => return (None, Some(e.to_string())),
    };
    let range = |t: Temperature| [t.low_c, t.high_c];
    // A one-line caution belongs to an alternative; keep it only when that
    // alternative is listed (the advice already lists at most
    // MAX_ALTERNATIVES).
    let listed = &a.alternatives[..a.alternatives.len().min(MAX_ALTERNATIVES)];
    let cautions: Vec<CautionOut> = a
        .cautions
        .into_iter()
        .filter(|c| c.full || listed.iter().any(|x| x.base == c.reagent))
        .map(|c| CautionOut {
            full: c.full,
            hazards: c.hazards.iter().map(|h| h.name()).collect(),
            reagent: c.reagent,
            text: c.text,
        })
        .collect();
    let out = AdviceOut {
        equivalents: a.base.as_ref().and_then(|_| round(a.equivalents, 0.01)),
        target: a.target.site.atoms,
        target_note: a.target.chosen_by,
        reaction: a.reaction.name(),
        control: a.control.map(|c| c.name()),
        mode: a.mode.name(),
        mode_note: a.mode_note,
        practice_row: a.practice_row,
        not_judged: a
            .not_judged
            .into_iter()
            .map(|n| NotJudgedOut {
                base: n.base,
                missing: n.missing,
            })
            .collect(),
        base: a.base,
        equivalents_note: a.equivalents_note,
        counted: a
            .counted
            .into_iter()
            .map(|c| CountedOut {
                atoms: c.atoms,
                class: c.class,
                protons: c.protons,
                reason: c.reason,
            })
            .collect(),
        conversion: a.conversion.and_then(significant),
        solvent: a.solvent,
        temperature_c: a.temperature.and_then(|t| round(t.low_c, 0.1)),
        temperature_range_c: a.temperature.map(range),
        scale: a.scale.map(|s| s.name()),
        scale_note: a.scale_note,
        alternatives_omitted: a.alternatives_omitted
            + a.alternatives.len().saturating_sub(MAX_ALTERNATIVES),
        alternatives: a
            .alternatives
            .into_iter()
            .take(MAX_ALTERNATIVES)
            .map(|x| AlternativeOut {
                base: x.base,
                equivalents: round(x.equivalents, 0.01).unwrap_or(0.0),
                conversion: significant(x.conversion).unwrap_or(0.0),
                solvent: x.solvent,
                temperature_range_c: range(x.temperature),
                note: x.note,
            })
            .collect(),
        rejected: a
            .rejected
            .into_iter()
            .map(|r| RejectedOut {
                kind: r.kind.name(),
                base: r.base,
                reason: r.reason,
            })
            .collect(),
        warnings: a
            .warnings
            .into_iter()
            .map(|w| sentence_case(w.message))
            .collect(),
        regio_conditions: a.regio.map(|r| {
            let side = |c: RegioConditions| RegioSideOut {
                base: c.base,
                equivalents: round(c.equivalents, 0.01).unwrap_or(0.0),
                solvent: c.solvent,
                temperature_range_c: range(c.temperature),
                procedure: c.procedure,
                favours: c.favours_atoms,
            };
            RegioOut {
                kinetic: side(r.kinetic),
                thermodynamic: side(r.thermodynamic),
            }
        }),
        cautions,
        catalogue: a.catalogue_version,
    };
    (Some(out), None)
}

/// Six significant digits; None for non-finite values.
fn significant(x: f64) -> Option<f64> {
    if !x.is_finite() {
        return None;
    }
    if x == 0.0 {
        return Some(0.0);
    }
    let k = 5 - x.abs().log10().floor() as i32;
    Some(if k >= 0 {
        let p = 10f64.powi(k.min(300));
        (x * p).round() / p
    } else {
        let p = 10f64.powi((-k).min(300));
        (x / p).round() * p
    })
}

/// A warning as a sentence: its first letter in upper case (the advice
/// words warnings so they can also be quoted mid-sentence).
fn sentence_case(text: String) -> String {
    let mut chars = text.chars();
    match chars.next() {
        Some(c) if c.is_lowercase() => c.to_uppercase().chain(chars).collect(),
        _ => text,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn significant_given_small_and_large_values() {
        assert_eq!(significant(0.999801234), Some(0.999801));
        assert_eq!(significant(7.1234567e-4), Some(7.12346e-4));
        assert_eq!(significant(1234567.0), Some(1234570.0));
        assert_eq!(significant(f64::NAN), None);
    }

    #[test]
    fn dot_pieces_given_salts_brackets_and_non_ascii_text() {
        // Character ranges, not byte ranges (the record's position rule).
        assert_eq!(
            dot_pieces("[Na+].\u{b5}CC(=O)[O-]"),
            vec![(0..5, "[Na+]"), (6..17, "\u{b5}CC(=O)[O-]")]
        );
        assert_eq!(dot_pieces("C[.]C"), vec![(0..5, "C[.]C")]);
        assert_eq!(dot_pieces("C."), vec![(0..1, "C"), (2..2, "")]);
        assert_eq!(dot_pieces(""), vec![(0..0, "")]);
    }

    #[test]
    fn molecule_facts_given_one_and_several_components() {
        // Sodium acetate written both ways round; formulas by hand (common practice).
        let one = Molecule::from_smiles("CC(=O)[O-]").unwrap();
        let (f, c) = molecule_facts("CC(=O)[O-]", &one);
        assert_eq!(f, "C2H3O2");
        assert_eq!(c.len(), 1);
        assert_eq!(
            (c[0].role, c[0].smiles.as_str(), c[0].charge),
            ("main", "CC(=O)[O-]", -1)
        );
        let salt = Molecule::from_smiles("[Na+].CC(=O)[O-]").unwrap();
        let (f, c) = molecule_facts("[Na+].CC(=O)[O-]", &salt);
        assert_eq!(f, "C2H3NaO2");
        let got: Vec<_> = c
            .iter()
            .map(|c| (c.role, c.smiles.as_str(), c.formula.as_str(), c.charge))
            .collect();
        assert_eq!(
            got,
            vec![
                ("main", "CC(=O)[O-]", "C2H3O2", -1),
                ("counter_ion", "[Na+]", "Na", 1)
            ]
        );
    }

    #[test]
    fn round_given_binary_noise() {
        assert_eq!(round(26.400000000000002, 0.01), Some(26.4));
        assert_eq!(
            round(0.1 + 0.2, 0.01).map(|x| x.to_string()),
            Some("0.3".to_string())
        );
    }
}
