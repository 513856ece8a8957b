//! The recommender: target site, counted protons, equivalents, candidate
//! bases, rejections, warnings, regiochemistry and cautions.
//!
//! Split by concern: `types` (public types), `choose` (the recommender),
//! `evaluate` (one base judged), `solve` (the equilibrium behind it), `side`
//! (side reactions and warnings), `score` (ranking), `regio` (enolate sides).

use super::catalogue::{
    catalogue, Base, BaseFamily, Catalogue, CatalogueError, Hazard, Nucleophilicity, ProticSolvent,
    Scale,
};
use super::cautions::{
    caution_for, caution_for_reagent, general_caution, short_caution_for, Caution,
};
use super::data::AdviceData;
use super::equilibrium::{
    choose_scale, exp10, log10_sum_exp10, solve, solve_log_ratio, AcidUnit, Equilibrium,
    EquilibriumInput, Microsite, ScaleChoice,
};
use super::features::{detect_features, site_units, MoleculeFeatures};
use super::numfmt;
use super::practice::{Control, Mode, Practice, PracticeRow, Reaction, System};
use crate::mol::Molecule;
use crate::sites::{Regio, Site, SiteReport};
use std::borrow::Cow;
use std::fmt;
use std::rc::Rc;

mod choose;
mod evaluate;
mod regio;
mod score;
mod side;
mod solve;
mod types;

use choose::*;
use evaluate::*;
use regio::*;
pub use score::commonness_penalty;
use score::*;
use side::*;
use solve::*;
pub use types::*;

/// Advice for a molecule and its sites, from the embedded base catalogue
/// and practice data ([`AdviceData::embedded`]); [`advise_using`] takes the
/// caller's own.
pub fn advise(
    mol: &Molecule,
    sites: &SiteReport,
    opts: &AdviceOptions,
) -> Result<Advice<'static>, AdviceError> {
    advise_using(mol, sites, opts, embedded_data()?)
}

/// [`advise`] on a pattern-matching view of `mol` that the caller already
/// built (see [`crate::sites::find_sites_in`]); `target` must come from
/// `smarts::Target::new(mol)`.
pub fn advise_in(
    mol: &Molecule,
    target: &crate::smarts::Target,
    sites: &SiteReport,
    opts: &AdviceOptions,
) -> Result<Advice<'static>, AdviceError> {
    advise_in_using(mol, target, sites, opts, embedded_data()?)
}

/// Advice for a molecule and its sites from a base catalogue and practice
/// data the caller parsed from its own files ([`AdviceData::new`]). Only the
/// bases of that catalogue are judged, recommended or listed; the advice
/// borrows their names from it.
///
/// # Example
///
/// ```
/// use acidsite::advice::practice::{Practice, EMBEDDED};
/// use acidsite::advice::{advise, advise_using, AdviceData, AdviceOptions, Catalogue};
/// use acidsite::mol::Molecule;
/// use acidsite::sites::find_sites;
///
/// // A caller's copy of fragments/bases.tsv in which KOtBu's conjugate acid
/// // (tert-butanol) is entered 20 units weaker in every scale: a base that
/// // can no longer deprotonate a ketone.
/// let text: String = include_str!("../../../fragments/bases.tsv")
///     .lines()
///     .map(|l| {
///         let mut cells: Vec<String> = l.split('\t').map(str::to_string).collect();
///         if cells[0] == "KOtBu" {
///             for i in [4, 6, 8] {
///                 if let Ok(p) = cells[i].parse::<f64>() {
///                     cells[i] = (p - 20.0).to_string();
///                 }
///             }
///         }
///         cells.join("\t") + "\n"
///     })
///     .collect();
/// let sources = include_str!("../../../fragments/sources.tsv");
/// let cat = Catalogue::parse(&text, "my_bases.tsv", sources).expect("valid catalogue");
/// let practice = Practice::parse(&EMBEDDED, &cat).expect("valid practice data");
/// let data = AdviceData::new(&cat, &practice).expect("practice parsed against cat");
///
/// // Acetone, to be alkylated through its preformed enolate.
/// let mol = Molecule::from_smiles("CC(=O)C").expect("valid SMILES");
/// let sites = find_sites(&mol);
/// let opts = AdviceOptions { base: Some("KOtBu".into()), ..AdviceOptions::default() };
/// // Embedded data: KOtBu (tert-butanol about 32 in DMSO, common practice)
/// // is judged on its pKa and is not rejected as too weak …
/// let usual = advise(&mol, &sites, &opts).expect("advice");
/// assert!(!usual.rejected.iter().any(|r| r.base == "KOtBu"
///     && r.kinds.contains(&acidsite::advice::RejectKind::TooWeak)));
/// // … the caller's data make it too weak.
/// let mine = advise_using(&mol, &sites, &opts, data).expect("advice");
/// assert!(mine.rejected.iter().any(|r| r.base == "KOtBu"
///     && r.kinds.contains(&acidsite::advice::RejectKind::TooWeak)));
/// ```
pub fn advise_using<'d>(
    mol: &Molecule,
    sites: &SiteReport,
    opts: &AdviceOptions,
    data: AdviceData<'d>,
) -> Result<Advice<'d>, AdviceError> {
    let features = detect_features(mol, sites);
    let t = crate::smarts::Target::new(mol);
    advise_core(&features, sites, opts, Some(&t), data)
}

/// [`advise_using`] on a pattern-matching view of `mol` that the caller
/// already built, as [`advise_in`].
pub fn advise_in_using<'d>(
    mol: &Molecule,
    target: &crate::smarts::Target,
    sites: &SiteReport,
    opts: &AdviceOptions,
    data: AdviceData<'d>,
) -> Result<Advice<'d>, AdviceError> {
    let features = super::features::detect_features_for(mol, target, sites, |i| {
        advice_reads_site_features(sites, opts, i)
    });
    advise_core(&features, sites, opts, Some(target), data)
}

/// Can the advice read the per-site features of site `i`? It reads them
/// for the target and the sites of the target's unit only. A background C–H
/// site is never in another site's unit (`features::group_units`), so it is
/// read only as the target: asked for by atom, or named by the report's
/// `top_carbon` or `top_overall` (which a report from `find_sites` never
/// does, but a caller's report may).
fn advice_reads_site_features(sites: &SiteReport, opts: &AdviceOptions, i: usize) -> bool {
    let Some(s) = sites.sites.get(i) else {
        return false;
    };
    !s.background
        || sites.top_carbon == Some(i)
        || sites.top_overall == Some(i)
        || opts.site.is_some_and(|a| s.atoms.contains(&a))
}

fn embedded_data() -> Result<AdviceData<'static>, AdviceError> {
    AdviceData::embedded().map_err(AdviceError::Catalogue)
}

/// Per-base evaluation.
struct Eval<'a> {
    base: &'a Base,
    solvent: Cow<'a, str>,
    scale: Option<Scale>,
    scale_note: String,
    counted: Rc<Vec<CountedProton>>,
    equivalents: f64,
    conversion: f64,
    /// The reported equilibrium, solved lean; built in full for the chosen base.
    lean: Option<Lean>,
    /// Notes of the reported equilibrium (set in the base's own solvent).
    eq_notes: Vec<String>,
    /// Sites whose protons are counted (left out of the equilibrium).
    exclude: Rc<[usize]>,
    reasons: Vec<(RejectKind, String)>,
    notes: Vec<String>,
    score: f64,
    marginal: bool,
    no_solvent_check: bool,
    /// What the notes of a reported base are worded from ([`word_notes`]);
    /// None once worded or for a base that is not reported.
    words: Option<Box<Words<'a>>>,
}

/// The ingredients of a reported base's notes, kept so that only the bases
/// that are listed get their notes written.
struct Words<'b> {
    choice: Rc<ScaleChoice>,
    scale: Scale,
    crit_conv: f64,
    n_counted: usize,
    accepted: bool,
    no_water_in: Option<&'b ProticSolvent>,
    in_solvent: Option<InSolvent<'b>>,
    marginal: Option<(f64, f64, f64, bool)>,
    drained: Option<f64>,
}

/// Acceptance threshold and equivalents of the mode in use.
#[derive(Debug, Clone, Copy)]
struct Plan {
    /// Least fraction of the target as anion at equilibrium.
    min_fraction: f64,
    /// Base per target proton (mode or practice row).
    per_target: f64,
    /// Equivalents the reaction consumes beyond that.
    extra: f64,
}

struct Ctx<'a> {
    /// The base catalogue and practice data in use.
    cat: &'a Catalogue,
    data: &'a Practice,
    /// Counter-ion numbers per catalogue slot for a catalogue other than
    /// the embedded one ([`counter_ion_id`]), worked out on first use.
    counter_ions: std::cell::OnceCell<Vec<u32>>,
    f: &'a MoleculeFeatures,
    sites: &'a SiteReport,
    opts: &'a AdviceOptions,
    plan: Plan,
    target: usize,
    target_unit: Vec<usize>,
    /// Acid units and their notes on the DMSO and water scales, built once.
    units_dmso: (Vec<AcidUnit>, Vec<String>),
    units_water: (Vec<AcidUnit>, Vec<String>),
    /// Reused buffer of unit constants for the lean solver.
    logk_buf: std::cell::RefCell<Vec<f64>>,
    /// The target carbon is next to a C=O (from the molecule's features,
    /// not from the class name).
    target_carbonyl: bool,
    /// Lean solutions and target conversions already computed for this
    /// molecule, keyed by the exact inputs (several catalogue bases share a
    /// pKa): (base pKa, scale, equivalents, a0 as bits; excluded sites).
    lean_memo: std::cell::RefCell<Vec<LeanMemo>>,
    /// Units (indices into `units_dmso` / `units_water`) holding a target
    /// microsite.
    target_units_dmso: Vec<usize>,
    target_units_water: Vec<usize>,
    /// The base asked for (`AdviceOptions::base`), reported even if rejected.
    requested: Option<&'a Base>,
    /// Counted protons already worked out for this molecule: they depend on
    /// the scale, whether the base is a metal base, a protic solvent and the
    /// counter-ion named in the reason, not on the base itself.
    counted_memo: std::cell::RefCell<Vec<(CountedKey, CountedSet)>>,
    /// The empty counted set, shared by bases rejected before counting.
    none_counted: CountedSet,
    /// The target's pKa text on the DMSO and water scales.
    target_text_dmso: std::cell::OnceCell<String>,
    target_text_water: std::cell::OnceCell<String>,
}

/// (scale, metal base, protic solvent, counter-ion) packed into one word:
/// the counter-ion as its catalogue-wide number ([`counter_ion_id`]).
type CountedKey = u32;

/// Counted protons and their sites (shared by the bases that count alike).
type CountedSet = (Rc<Vec<CountedProton>>, Rc<[usize]>);

/// Numeric part of a memo key: (base pKa, scale, equivalents, a0) as bits.
type LeanKey = (u64, u8, u64, u64);

/// A memoised lean solution and its target conversion, keyed by the exact
/// inputs and the excluded sites.
struct LeanMemo {
    key: LeanKey,
    exclude: Rc<[usize]>,
    solution: Option<(Lean, f64)>,
}

/// A solved equilibrium kept as its parameters and log ratio: enough to
/// judge a base without building the per-site breakdown; the full
/// [`Equilibrium`] is built only for the base that is reported.
#[derive(Debug, Clone, Copy)]
struct Lean {
    base_pka: f64,
    scale: Scale,
    equivalents: f64,
    a0: f64,
    /// log10([B-]/[BH]) at equilibrium.
    s: f64,
}

/// What the equilibrium in the base's own protic solvent gave, kept to word
/// the notes of a base that is reported.
struct InSolvent<'b> {
    solvent: &'b ProticSolvent,
    choice: Rc<ScaleChoice>,
    conversion: f64,
}

/// The functional groups a base attacks, in order.
#[derive(Default)]
struct GroupList {
    names: [&'static str; 8],
    len: usize,
}

impl GroupList {
    fn push(&mut self, name: &'static str) {
        if let Some(slot) = self.names.get_mut(self.len) {
            *slot = name;
            self.len += 1;
        }
    }
    fn is_empty(&self) -> bool {
        self.len == 0
    }
    /// Appends the names separated by ", ".
    fn push_joined(&self, out: &mut String) {
        for (i, n) in self.names.iter().take(self.len).enumerate() {
            if i > 0 {
                out.push_str(", ");
            }
            out.push_str(n);
        }
    }
}

/// [`advise`] from features alone: without the molecule no practice row can
/// be matched, so the reaction's default mode applies.
pub fn advise_with_features(
    f: &MoleculeFeatures,
    sites: &SiteReport,
    opts: &AdviceOptions,
) -> Result<Advice<'static>, AdviceError> {
    advise_core(f, sites, opts, None, embedded_data()?)
}

/// [`advise_with_features`] from the caller's catalogue and practice data,
/// as [`advise_using`].
pub fn advise_with_features_using<'d>(
    f: &MoleculeFeatures,
    sites: &SiteReport,
    opts: &AdviceOptions,
    data: AdviceData<'d>,
) -> Result<Advice<'d>, AdviceError> {
    advise_core(f, sites, opts, None, data)
}

/// The enolate side a control asks for.
pub(super) fn side_of(c: Option<Control>) -> Option<Regio> {
    match c {
        Some(Control::Kinetic) => Some(Regio::Kinetic),
        Some(Control::Thermodynamic) => Some(Regio::Thermodynamic),
        None => None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::smarts::Target as SmartsTarget;

    /// The advice from features worked out for the sites it reads only
    /// (`advise_in_using`) against the advice from every site's features,
    /// including background C–H targets asked for by atom and a caller's
    /// report whose top sites are background ones (issue 14).
    #[test]
    fn advise_in_using_given_background_targets_matches_all_site_features() {
        let cases: [(&str, Option<usize>); 10] = [
            ("Cc1ccccc1", None),
            ("Cc1ccccc1", Some(2)),
            // Atom 3 is a stereocentre on an unactivated C–H: the
            // epimerisation warning needs its features.
            ("CCCC(C)CC", Some(3)),
            ("CCCC(C)CC(=O)C", Some(3)),
            ("[2H]C(C)(C)CC(=O)OC", Some(1)),
            ("CC(=O)c1ccccc1", Some(5)),
            ("CC(=O)CC(C)CCBr", None),
            ("OC(=O)CCc1ccccc1", Some(6)),
            ("c1ccccc1", Some(0)),
            ("CCCC", Some(1)),
        ];
        let data = AdviceData::embedded().unwrap();
        for (smi, site) in cases {
            let mol = Molecule::from_smiles(smi).unwrap();
            let t = SmartsTarget::new(&mol);
            let mut reports = vec![crate::sites::find_sites(&mol)];
            // A caller's report naming a background site as the top ones.
            let mut caller = reports[0].clone();
            if let Some(b) = caller.sites.iter().position(|s| s.background) {
                caller.top_carbon = Some(b);
                caller.top_overall = Some(b);
                reports.push(caller);
            }
            for sites in &reports {
                let opts = AdviceOptions {
                    site,
                    ..AdviceOptions::default()
                };
                let all = crate::advice::features::detect_features_in(&mol, &t, sites);
                let full = advise_core(&all, sites, &opts, Some(&t), data);
                let lean = advise_in_using(&mol, &t, sites, &opts, data);
                assert_eq!(format!("{full:?}"), format!("{lean:?}"), "{smi} {site:?}");
            }
        }
    }

    /// Without worded rejections the advice is the same but for the texts
    /// of the ruled-out and unjudged bases, which are empty; a requested
    /// base keeps its reasons, which make its warning (issue 14).
    #[test]
    fn advise_given_word_rejections_false_differs_only_in_reason_texts() {
        let cases: [(&str, Option<&str>, Option<Reaction>); 6] = [
            ("CC(=O)c1ccccc1", None, None),
            ("CC(=O)OCC", Some("NaOH"), None),
            ("CC(=O)OCC", Some("NaOMe"), None),
            ("OC(=O)CCc1ccccc1", None, None),
            ("CC1CCCCC1=O", Some("Et3N"), None),
            ("CC(=O)CC(=O)OC", None, Some(Reaction::ALL[1])),
        ];
        for (smi, base, reaction) in cases {
            let mol = Molecule::from_smiles(smi).unwrap();
            let sites = crate::sites::find_sites(&mol);
            let worded_opts = AdviceOptions {
                base: base.map(String::from),
                reaction,
                ..AdviceOptions::default()
            };
            let bare_opts = AdviceOptions {
                word_rejections: false,
                ..worded_opts.clone()
            };
            let mut worded = advise(&mol, &sites, &worded_opts).unwrap();
            let bare = advise(&mol, &sites, &bare_opts).unwrap();
            assert!(!worded.rejected.is_empty(), "{smi}: a rejection to compare");
            assert!(worded.rejected.iter().all(|r| !r.reason.is_empty()));
            let asked = |name: &str| Some(name) == base;
            assert!(
                bare.rejected
                    .iter()
                    .all(|r| r.reason.is_empty() != asked(r.base)),
                "{smi}: {:?}",
                bare.rejected
            );
            assert!(bare.not_judged.iter().all(|n| n.missing.is_empty()));
            if base.is_some() {
                assert_eq!(worded.warnings, bare.warnings, "{smi}: requested base");
            }
            for r in worded.rejected.iter_mut().filter(|r| !asked(r.base)) {
                r.reason.clear();
            }
            for n in &mut worded.not_judged {
                n.missing.clear();
            }
            assert_eq!(worded, bare, "{smi}");
        }
    }
}
