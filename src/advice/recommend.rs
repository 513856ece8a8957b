//! The recommender: target site, counted protons, equivalents, candidate
//! bases, rejections, warnings, regiochemistry and cautions.

use super::catalogue::{
    catalogue, Base, BaseFamily, CatalogueError, Hazard, Nucleophilicity, ProticSolvent, Scale,
};
use super::cautions::{
    caution_for, caution_for_reagent, general_caution, short_caution_for, Caution,
};
use super::equilibrium::{
    choose_scale, exp10, log10_sum_exp10, solve, solve_log_ratio, AcidUnit, Equilibrium,
    EquilibriumInput, Microsite, ScaleChoice,
};
use super::features::{detect_features, site_units, MoleculeFeatures};
use super::numfmt;
use super::practice::{practice, Control, Mode, PracticeRow, Reaction, System};
use crate::mol::Molecule;
use crate::sites::{Regio, Site, SiteReport};
use std::borrow::Cow;
use std::fmt;
use std::rc::Rc;

/// Practical excess added to the stoichiometric equivalents (titre of
/// organometallic solutions, adventitious moisture).
pub const PRACTICAL_EXCESS: f64 = 0.1;
/// Conversion a base must reach at equilibrium to be a candidate.
pub const MIN_CONVERSION: f64 = 0.99;
/// In its own protic solvent (NaOEt in EtOH) the anion must at least be the
/// major species at equilibrium; the electrophile pulls the rest over.
pub const MIN_IN_SOLVENT_CONVERSION: f64 = 0.5;
/// A base that reaches [`MIN_CONVERSION`] only within the uncertainty of the
/// estimates must still reach this at the central values (accepted as marginal).
pub const MIN_MARGINAL_CONVERSION: f64 = 0.5;
/// What the base is for.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Purpose {
    /// A preformed anion: the base must convert the target (≥ 99 %).
    Stoichiometric,
    /// A catalytic amount suffices (Henry, Michael, Knoevenagel, aldol
    /// condensations where the anion is consumed as it forms).
    Catalytic,
    /// The electrophile is present and traps the anion as it forms: a small
    /// equilibrium fraction suffices (carbonate with a 1,3-dicarbonyl or a
    /// phenol, hydroxide under phase transfer).
    InSitu,
}

/// Options of [`advise`].
#[derive(Debug, Clone, PartialEq)]
pub struct AdviceOptions {
    /// Evaluate this base (catalogue name) as the recommendation.
    pub base: Option<String>,
    /// Target the site containing this atom (0-based input index).
    pub site: Option<usize>,
    /// Use these equivalents instead of the computed ones.
    pub equivalents: Option<f64>,
    /// Substrate concentration, mol/L.
    pub concentration: f64,
    /// Solvent for every base (None: each base's usual solvent).
    pub solvent: Option<String>,
    /// Force a pKa scale.
    pub scale: Option<Scale>,
    /// What the base is for when no reaction is named (`reaction: None`);
    /// with a reaction, the mode of the practice row or of the reaction
    /// decides.
    pub purpose: Purpose,
    /// The planned reaction (None: alkylation, unless `purpose` is
    /// catalytic).
    pub reaction: Option<Reaction>,
    /// The enolate wanted where a ketone has two sides (None: the target
    /// site's own side, if it has one).
    pub control: Option<Control>,
    /// List at most this many alternatives (best first) and word only
    /// their notes and cautions; the rest are counted in
    /// [`Advice::alternatives_omitted`]. None lists every acceptable base.
    pub alternatives: Option<usize>,
    /// Solve the full equilibrium of the recommended base
    /// ([`Advice::equilibrium`]: every site, anion populations); false
    /// leaves it None (bulk records do not report it).
    pub full_equilibrium: bool,
}

impl Default for AdviceOptions {
    fn default() -> Self {
        AdviceOptions {
            base: None,
            site: None,
            equivalents: None,
            concentration: 0.5,
            solvent: None,
            scale: None,
            purpose: Purpose::Stoichiometric,
            reaction: None,
            control: None,
            alternatives: None,
            full_equilibrium: true,
        }
    }
}

/// The site the advice is about.
#[derive(Debug, Clone, PartialEq)]
pub struct Target {
    /// Index into `SiteReport::sites`.
    pub site: usize,
    /// Atoms of the target site (input order, 0-based).
    pub atoms: Vec<usize>,
    /// Element of the acidic atom ("C", "O", "N", "S").
    pub element: String,
    /// Site class from the rule data.
    pub class: String,
    /// Estimated pKa in DMSO.
    pub pka_dmso: Option<f64>,
    /// Estimated pKa in water.
    pub pka_water: Option<f64>,
    /// One standard uncertainty of the estimate, pKa units.
    pub uncertainty: f64,
    /// Kinetic or thermodynamic side of an unsymmetrical ketone.
    pub regio: Option<Regio>,
    /// How the target was chosen.
    pub chosen_by: String,
}

/// A proton the base removes before (or with) the target.
#[derive(Debug, Clone, PartialEq)]
pub struct CountedProton {
    /// Index into `SiteReport::sites`.
    pub site: usize,
    /// Atoms of the site (input order).
    pub atoms: Vec<usize>,
    /// Element of the acidic atom.
    pub element: String,
    /// Site class from the rule data.
    pub class: String,
    /// pKa on the scale of the comparison.
    pub pka: Option<f64>,
    /// Protons consumed by this site.
    pub protons: usize,
    /// Why it is counted (more acidic, or fast O–H/N–H transfer).
    pub reason: String,
}

/// Temperature range, °C.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Temperature {
    /// Lower end, °C.
    pub low_c: f64,
    /// Upper end, °C.
    pub high_c: f64,
}

/// An acceptable base other than the recommendation.
#[derive(Debug, Clone, PartialEq)]
pub struct Alternative {
    /// Catalogue name.
    pub base: &'static str,
    /// Equivalents it would need.
    pub equivalents: f64,
    /// Fraction of the target deprotonated at equilibrium, 0..=1.
    pub conversion: f64,
    /// pKa scale of the comparison.
    pub scale: Scale,
    /// Its usual (or the requested) solvent.
    pub solvent: String,
    /// Its usual temperature range.
    pub temperature: Temperature,
    /// Notes from the evaluation (scale, marginal acceptance, solvent).
    pub note: String,
}

/// Why a base was rejected.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum RejectKind {
    TooWeak,
    Nucleophile,
    Transesterification,
    Hydrolysis,
    UncountedProton,
    NoComparablePka,
    /// Consumed irreversibly (organolithiums, metal amides, hydrides): a
    /// stoichiometric reagent, not a catalyst.
    NotCatalytic,
    /// Practice gives the other enolate with this base (`--control`).
    Regio,
    /// A side reaction practice knows for this kind of site and reaction.
    SideReaction,
    /// Not how this reaction is run (a stoichiometric base where a
    /// catalytic one serves, a base that stops at the monoanion).
    Mode,
}

impl RejectKind {
    /// Stable name used in records.
    pub fn name(self) -> &'static str {
        match self {
            RejectKind::TooWeak => "too-weak",
            RejectKind::Nucleophile => "nucleophile",
            RejectKind::Transesterification => "transesterification",
            RejectKind::Hydrolysis => "hydrolysis",
            RejectKind::UncountedProton => "uncounted-proton",
            RejectKind::NoComparablePka => "no-comparable-pka",
            RejectKind::NotCatalytic => "not-catalytic",
            RejectKind::Regio => "regio",
            RejectKind::SideReaction => "side-reaction",
            RejectKind::Mode => "mode",
        }
    }
}

/// A rejected base with every reason found (`kind` is the first).
#[derive(Debug, Clone, PartialEq)]
pub struct Rejection {
    /// Catalogue name.
    pub base: &'static str,
    /// The first reason found.
    pub kind: RejectKind,
    /// Every reason found, in the order of `reason`.
    pub kinds: Vec<RejectKind>,
    /// All reasons in words, separated by "; ".
    pub reason: String,
}

/// Warning categories.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum WarningKind {
    SelfAldol,
    SelfCondensation,
    BetaElimination,
    Epimerisation,
    AlkylHalide,
    OVersusCAlkylation,
    CountedProtons,
    Uncertainty,
    IncompleteEquilibrium,
    RequestedBase,
    RequestedEquivalents,
    NoBase,
}

impl WarningKind {
    pub fn name(self) -> &'static str {
        match self {
            WarningKind::SelfAldol => "self-aldol",
            WarningKind::SelfCondensation => "self-condensation",
            WarningKind::BetaElimination => "beta-elimination",
            WarningKind::Epimerisation => "epimerisation",
            WarningKind::AlkylHalide => "alkyl-halide",
            WarningKind::OVersusCAlkylation => "o-versus-c-alkylation",
            WarningKind::CountedProtons => "counted-protons",
            WarningKind::Uncertainty => "uncertainty",
            WarningKind::IncompleteEquilibrium => "incomplete-equilibrium",
            WarningKind::RequestedBase => "requested-base",
            WarningKind::RequestedEquivalents => "requested-equivalents",
            WarningKind::NoBase => "no-base",
        }
    }
}

/// A warning about the molecule or the chosen conditions.
#[derive(Debug, Clone, PartialEq)]
pub struct Warning {
    /// Category.
    pub kind: WarningKind,
    /// Plain-language text.
    pub message: String,
}

/// Conditions favouring one side of an unsymmetrical ketone.
#[derive(Debug, Clone, PartialEq)]
pub struct RegioConditions {
    pub base: String,
    pub equivalents: f64,
    pub solvent: String,
    pub temperature: Temperature,
    pub procedure: String,
    /// Site index and atoms of the α-carbon this side deprotonates.
    pub favours_site: Option<usize>,
    pub favours_atoms: Vec<usize>,
}

/// Kinetic and thermodynamic conditions for an unsymmetrical ketone.
#[derive(Debug, Clone, PartialEq)]
pub struct RegioAdvice {
    pub kinetic: RegioConditions,
    pub thermodynamic: RegioConditions,
}

/// The advice for one molecule.
#[derive(Debug, Clone, PartialEq)]
pub struct Advice {
    pub target: Target,
    pub purpose: Purpose,
    /// The planned reaction the advice is for.
    pub reaction: Reaction,
    /// The control used (given, or read from the target's enolate side).
    pub control: Option<Control>,
    /// How the base is used.
    pub mode: Mode,
    /// Why that mode: the practice row's note and the mode's rule.
    pub mode_note: String,
    /// Id of the practice row that matched (fragments/practice.tsv).
    pub practice_row: Option<String>,
    /// Bases the data cannot judge for this target, with what is missing.
    pub not_judged: Vec<NotJudged>,
    /// Recommended (or requested) base; None when no catalogue base qualifies.
    pub base: Option<String>,
    pub equivalents: f64,
    /// How the equivalents were reached.
    pub equivalents_note: String,
    /// Fraction of the target deprotonated at equilibrium with the
    /// recommended base in its solvent.
    pub conversion: Option<f64>,
    /// The full equilibrium with the recommended base (None when
    /// [`AdviceOptions::full_equilibrium`] is false).
    pub equilibrium: Option<Equilibrium>,
    pub solvent: Option<String>,
    pub temperature: Option<Temperature>,
    pub scale: Option<Scale>,
    pub scale_note: String,
    pub concentration: f64,
    /// Protons removed before the target.
    pub counted: Vec<CountedProton>,
    pub counted_note: Option<String>,
    pub alternatives: Vec<Alternative>,
    /// Acceptable bases left out of `alternatives` by
    /// [`AdviceOptions::alternatives`].
    pub alternatives_omitted: usize,
    pub rejected: Vec<Rejection>,
    pub warnings: Vec<Warning>,
    pub cautions: Vec<Caution>,
    pub regio: Option<RegioAdvice>,
    pub catalogue_version: String,
}

impl Advice {
    /// Is `base` rejected?
    pub fn is_rejected(&self, base: &str) -> bool {
        self.rejected
            .iter()
            .any(|r| r.base.eq_ignore_ascii_case(base))
    }
    /// Is `base` recommended or an alternative?
    pub fn is_acceptable(&self, base: &str) -> bool {
        (self
            .base
            .as_deref()
            .map(|b| b.eq_ignore_ascii_case(base))
            .unwrap_or(false)
            && !self.is_rejected(base))
            || self
                .alternatives
                .iter()
                .any(|a| a.base.eq_ignore_ascii_case(base))
    }
    pub fn has_warning(&self, kind: WarningKind) -> bool {
        self.warnings.iter().any(|w| w.kind == kind)
    }
}

/// A base the data cannot judge (no comparable pKa), kept apart from the
/// chemical rejections.
#[derive(Debug, Clone, PartialEq)]
pub struct NotJudged {
    /// Catalogue name.
    pub base: &'static str,
    /// The value that is missing.
    pub missing: String,
}

/// What the recommender could not do.
#[derive(Debug, Clone, PartialEq)]
pub enum AdviceError {
    /// The molecule has no acidic site with a pKa estimate.
    NoSites,
    /// `--site N`: atom N carries no acidic hydrogen (or is out of range).
    NotAcidicAtom(usize),
    UnknownBase(String),
    Invalid(&'static str, f64),
    Catalogue(CatalogueError),
}

impl fmt::Display for AdviceError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            AdviceError::NoSites => write!(f, "no acidic site with a pKa estimate"),
            AdviceError::NotAcidicAtom(a) => {
                write!(f, "atom {a} is not part of an acidic site")
            }
            AdviceError::UnknownBase(b) => write!(f, "unknown base {b:?} (see `acidsite bases`)"),
            AdviceError::Invalid(w, v) => write!(f, "invalid {w}: {v}"),
            AdviceError::Catalogue(e) => write!(f, "base catalogue: {e}"),
        }
    }
}

impl std::error::Error for AdviceError {}

/// Advice for a molecule and its sites.
pub fn advise(
    mol: &Molecule,
    sites: &SiteReport,
    opts: &AdviceOptions,
) -> Result<Advice, AdviceError> {
    let features = detect_features(mol, sites);
    let t = crate::smarts::Target::new(mol);
    advise_core(&features, sites, opts, Some(&t))
}

/// [`advise`] on a pattern-matching view of `mol` that the caller already
/// built (see [`crate::sites::find_sites_in`]); `target` must come from
/// `smarts::Target::new(mol)`.
pub fn advise_in(
    mol: &Molecule,
    target: &crate::smarts::Target,
    sites: &SiteReport,
    opts: &AdviceOptions,
) -> Result<Advice, AdviceError> {
    let features = super::features::detect_features_in(mol, target, sites);
    advise_core(&features, sites, opts, Some(target))
}

fn pka_on(site: &Site, scale: Scale) -> Option<f64> {
    match scale {
        Scale::Water => site.pka_water,
        _ => site.pka_dmso,
    }
}

/// Is `solvent` a protic medium: water or an alcohol, alone or in a mixture
/// ("water/THF", "EtOH")?
pub(crate) fn protic_medium(solvent: &str) -> bool {
    solvent
        .split(|c: char| !c.is_ascii_alphanumeric())
        .any(|w| {
            [
                "water",
                "h2o",
                "meoh",
                "etoh",
                "iproh",
                "tbuoh",
                "methanol",
                "ethanol",
                "isopropanol",
                "propanol",
                "butanol",
            ]
            .iter()
            .any(|p| w.eq_ignore_ascii_case(p))
        })
}

fn alkoxy_of(base: &Base) -> Option<&'static str> {
    match base.conjugate_acid.as_str() {
        "CO" => Some("methyl"),
        "CCO" => Some("ethyl"),
        "CC(C)(C)O" => Some("tert-butyl"),
        "CC(C)O" => Some("isopropyl"),
        _ => None,
    }
}

fn carbonyl_class(class: &str) -> bool {
    let c = class.to_ascii_lowercase();
    [
        "ketone", "ester", "aldehyde", "amide", "lactone", "lactam", "acid", "carboxyl",
    ]
    .iter()
    .any(|k| c.contains(k))
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
    /// `carbonyl_class` of the target's class, computed once.
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

/// A small number for a catalogue base's counter-ion (0: none), the same
/// for every base with the same ion; None for a base outside the catalogue.
fn counter_ion_id(base: &Base) -> Option<u32> {
    static TABLE: std::sync::OnceLock<Vec<u32>> = std::sync::OnceLock::new();
    let cat = catalogue().ok()?;
    let table = TABLE.get_or_init(|| {
        let mut seen: Vec<&str> = Vec::new();
        cat.bases
            .iter()
            .map(|b| match b.counter_ion.as_deref() {
                None => 0,
                Some(ion) => match seen.iter().position(|s| *s == ion) {
                    Some(p) => p as u32 + 1,
                    None => {
                        seen.push(ion);
                        seen.len() as u32
                    }
                },
            })
            .collect()
    });
    table.get(catalogue_slot(cat, base)?).copied()
}

fn counted_for(ctx: &Ctx, base: &Base, scale: Scale, protic: bool) -> CountedSet {
    let metal = base.family.is_metal_base();
    // The counter-ion is named only by the fast-transfer rule of a metal
    // base outside a protic solvent; elsewhere it does not split the memo.
    let ion = if metal && !protic {
        counter_ion_id(base)
    } else {
        Some(0)
    };
    let Some(ion) = ion else {
        // Not a catalogue base: no memo.
        let protons = count_protons(ctx, base, scale, protic);
        let sites: Rc<[usize]> = protons.iter().map(|c| c.site).collect();
        return (Rc::new(protons), sites);
    };
    let sc = match scale {
        Scale::Dmso => 0,
        Scale::Water => 1,
        Scale::Thf => 2,
    };
    let key: CountedKey = sc | u32::from(metal) << 2 | u32::from(protic) << 3 | ion << 4;
    if let Some((_, v)) = ctx.counted_memo.borrow().iter().find(|(k, _)| *k == key) {
        return v.clone();
    }
    let protons = count_protons(ctx, base, scale, protic);
    let sites: Rc<[usize]> = protons.iter().map(|c| c.site).collect();
    let v = (Rc::new(protons), sites);
    ctx.counted_memo.borrow_mut().push((key, v.clone()));
    v
}

/// Numeric part of a memo key: (base pKa, scale, equivalents, a0) as bits.
type LeanKey = (u64, u8, u64, u64);

/// A memoised lean solution and its target conversion, keyed by the exact
/// inputs and the excluded sites.
struct LeanMemo {
    key: LeanKey,
    exclude: Rc<[usize]>,
    solution: Option<(Lean, f64)>,
}

fn lean_key(base_pka: f64, scale: Scale, equivalents: f64, a0: f64) -> LeanKey {
    let sc = match scale {
        Scale::Dmso => 0,
        Scale::Water => 1,
        Scale::Thf => 2,
    };
    (base_pka.to_bits(), sc, equivalents.to_bits(), a0.to_bits())
}

/// Position of the memo entry for these inputs (no allocation; keys are
/// unique, and the newest entries, searched first, are the likeliest hits:
/// neighbouring catalogue bases often share a pKa).
fn memo_position(ctx: &Ctx, key: LeanKey, exclude: &[usize]) -> Option<usize> {
    ctx.lean_memo
        .borrow()
        .iter()
        .rposition(|e| e.key == key && *e.exclude == *exclude)
}

fn count_protons(ctx: &Ctx, base: &Base, scale: Scale, protic: bool) -> Vec<CountedProton> {
    let t = &ctx.sites.sites[ctx.target];
    let t_pka = pka_on(t, scale);
    let mut out: Vec<CountedProton> = Vec::new();
    let mut units_seen: Vec<usize> = Vec::new();
    for (i, s) in ctx.sites.sites.iter().enumerate() {
        if ctx.target_unit.contains(&i) {
            continue;
        }
        // Compare on the chosen scale, else on the other one.
        let cmp = match (pka_on(s, scale), t_pka) {
            (Some(a), Some(b)) => Some((a, b)),
            _ => match (s.pka_dmso.or(s.pka_water), t.pka_dmso.or(t.pka_water)) {
                (Some(a), Some(b)) if s.pka_dmso.is_some() == t.pka_dmso.is_some() => Some((a, b)),
                _ => None,
            },
        };
        let hetero = matches!(s.element.as_str(), "O" | "N" | "S");
        let more_acidic = cmp.map(|(a, b)| a < b).unwrap_or(false);
        let metal_rule = hetero
            && base.family.is_metal_base()
            && !protic
            && match s.element.as_str() {
                "O" | "S" => true,
                _ => match (s.pka_dmso, t.pka_dmso) {
                    (Some(a), Some(b)) => a <= b + 6.0,
                    _ => false,
                },
            };
        if !(more_acidic || metal_rule) {
            continue;
        }
        let protons = if hetero {
            s.atoms.len()
        } else {
            let u = ctx.f.site_unit.get(i).copied().unwrap_or(usize::MAX - i);
            if units_seen.contains(&u) {
                continue;
            }
            units_seen.push(u);
            1
        };
        let reason = if more_acidic {
            let mut r = String::with_capacity(48);
            r.push_str("more acidic than the target (");
            r.push_str(scale.name());
            r.push_str(" pKa ");
            numfmt::push_fixed1(&mut r, cmp.map(|c| c.0).unwrap_or(f64::NAN));
            r.push_str(" vs ");
            numfmt::push_fixed1(&mut r, cmp.map(|c| c.1).unwrap_or(f64::NAN));
            r.push(')');
            r
        } else {
            let mut r = String::with_capacity(160);
            r.push_str(&s.element);
            r.push_str("–H proton transfer is fast: ");
            r.push_str(base.counter_ion.as_deref().unwrap_or("metal"));
            r.push_str(" bases in aprotic solvents take it before the C–H even though its DMSO pKa is somewhat higher (common practice)");
            r
        };
        out.push(CountedProton {
            site: i,
            atoms: s.atoms.clone(),
            element: s.element.clone(),
            class: s.class.clone(),
            pka: pka_on(s, scale),
            protons,
            reason,
        });
    }
    out
}

fn solve_with(
    ctx: &Ctx,
    base_pka: f64,
    scale: Scale,
    equivalents: f64,
    a0: f64,
    exclude: &[usize],
    notes: &mut Vec<String>,
) -> Option<Equilibrium> {
    let (cached, cached_notes) = match scale {
        Scale::Water => &ctx.units_water,
        _ => &ctx.units_dmso,
    };
    notes.extend(cached_notes.iter().cloned());
    let units: Vec<_> = cached
        .iter()
        .cloned()
        .filter_map(|mut u| {
            u.alternatives.retain(|m| !exclude.contains(&m.site));
            (!u.alternatives.is_empty()).then_some(u)
        })
        .collect();
    solve(&EquilibriumInput {
        units,
        base_pka,
        equivalents,
        concentration: ctx.opts.concentration,
        acid_solvent_molar: a0,
    })
    .ok()
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

fn cached_units<'c>(ctx: &'c Ctx, scale: Scale) -> &'c (Vec<AcidUnit>, Vec<String>) {
    match scale {
        Scale::Water => &ctx.units_water,
        _ => &ctx.units_dmso,
    }
}

/// log10 of a unit's summed K over its microsites not in `exclude`
/// (`-inf` when none is left).
fn unit_logk(u: &AcidUnit, shift: f64, exclude: &[usize]) -> f64 {
    // Most units have one microsite: its own value (the sum is exact then).
    if let [m] = u.alternatives.as_slice() {
        return if exclude.contains(&m.site) {
            f64::NEG_INFINITY
        } else {
            shift - m.pka
        };
    }
    log10_sum_exp10(
        u.alternatives
            .iter()
            .filter(|m| !exclude.contains(&m.site))
            .map(move |m| shift - m.pka),
    )
}

/// The same equilibrium as [`solve_with`] without allocating per site (one
/// buffer of unit constants, reused across calls), with the target's
/// conversion; memoised per molecule (several catalogue bases share a pKa).
fn solve_lean(
    ctx: &Ctx,
    base_pka: f64,
    scale: Scale,
    equivalents: f64,
    a0: f64,
    exclude: &Rc<[usize]>,
) -> Option<(Lean, f64)> {
    let key = lean_key(base_pka, scale, equivalents, a0);
    if let Some(p) = memo_position(ctx, key, exclude) {
        return ctx.lean_memo.borrow()[p].solution;
    }
    let solution = solve_lean_uncached(ctx, base_pka, scale, equivalents, a0, exclude)
        .map(|l| (l, lean_conversion_uncached(ctx, &l, exclude)));
    ctx.lean_memo.borrow_mut().push(LeanMemo {
        key,
        exclude: exclude.clone(),
        solution,
    });
    solution
}

fn solve_lean_uncached(
    ctx: &Ctx,
    base_pka: f64,
    scale: Scale,
    equivalents: f64,
    a0: f64,
    exclude: &[usize],
) -> Option<Lean> {
    if !(0.0..=1000.0).contains(&equivalents) || !base_pka.is_finite() || base_pka.abs() > 200.0 {
        return None;
    }
    let c = ctx.opts.concentration;
    let mut buf = ctx.logk_buf.borrow_mut();
    buf.clear();
    buf.extend(
        cached_units(ctx, scale)
            .0
            .iter()
            .map(|u| unit_logk(u, base_pka, exclude)),
    );
    let (s, _) = solve_log_ratio(&buf, c, equivalents * c, a0);
    Some(Lean {
        base_pka,
        scale,
        equivalents,
        a0,
        s,
    })
}

/// Deprotonated fraction of every microsite of the units holding the
/// target, in the order of [`solve`]'s `sites`, passed to
/// `visit(microsite, fraction)`; stops when `visit` returns true.
fn lean_sites<'c>(
    ctx: &'c Ctx,
    l: &Lean,
    exclude: &[usize],
    mut visit: impl FnMut(&'c Microsite, f64) -> bool,
) {
    let units = &cached_units(ctx, l.scale).0;
    let tu = match l.scale {
        Scale::Water => &ctx.target_units_water,
        _ => &ctx.target_units_dmso,
    };
    for &i in tu {
        if let Some(u) = units.get(i) {
            if unit_sites(ctx, l, exclude, u, &mut visit) {
                return;
            }
        }
    }
}

/// The fractions of one unit's microsites (see [`lean_sites`]); true when
/// `visit` asked to stop.
fn unit_sites<'c>(
    ctx: &'c Ctx,
    l: &Lean,
    exclude: &[usize],
    u: &'c AcidUnit,
    visit: &mut impl FnMut(&'c Microsite, f64) -> bool,
) -> bool {
    let b0 = l.equivalents * ctx.opts.concentration;
    let lx = unit_logk(u, l.base_pka, exclude);
    if lx == f64::NEG_INFINITY {
        return false;
    }
    let f = if b0 == 0.0 {
        0.0
    } else {
        let l2 = if let [m] = u.alternatives.as_slice() {
            // One microsite (not excluded: lx is finite).
            l.base_pka - m.pka + l.s
        } else {
            log10_sum_exp10(
                u.alternatives
                    .iter()
                    .filter(|m| !exclude.contains(&m.site))
                    .map(|m| l.base_pka - m.pka + l.s),
            )
        };
        if l2 == f64::NEG_INFINITY {
            0.0
        } else {
            1.0 / (1.0 + exp10(-l2))
        }
    };
    if let [m] = u.alternatives.as_slice() {
        // Its share of the unit is 1 (exactly: 10^0).
        return visit(m, f.clamp(0.0, 1.0));
    }
    for m in u.alternatives.iter().filter(|m| !exclude.contains(&m.site)) {
        let share = exp10(l.base_pka - m.pka - lx);
        if visit(m, (f * share).clamp(0.0, 1.0)) {
            return true;
        }
    }
    false
}

fn lean_conversion_uncached(ctx: &Ctx, l: &Lean, exclude: &[usize]) -> f64 {
    let mut total = 0.0;
    lean_sites(ctx, l, exclude, |m, x| {
        if ctx.target_unit.contains(&m.site) {
            total += x;
        }
        false
    });
    total.clamp(0.0, 1.0)
}

/// The full equilibrium (every microsite, anion populations) of a base's
/// reported lean solution.
///
/// Every site takes part (counted protons are not set aside) and the base
/// is the whole of the equivalents advised, so that the conversion reported
/// is the one `acidsite equilibrium` gives for the same base, equivalents
/// and concentration (issue 10).
fn full_equilibrium(ctx: &Ctx, ev: &Eval) -> Option<Equilibrium> {
    let l = ev.lean?;
    let mut scratch = Vec::new();
    let mut e = solve_with(
        ctx,
        l.base_pka,
        l.scale,
        ev.equivalents,
        l.a0,
        &[],
        &mut scratch,
    )?;
    e.notes = ev.eq_notes.clone();
    Some(e)
}

/// The target's pKa on `scale` as the reasons write it, worked out once per
/// molecule and scale.
fn target_pka_text<'c>(ctx: &'c Ctx, scale: Scale, t_pka: f64) -> &'c str {
    let cell = match scale {
        Scale::Water => &ctx.target_text_water,
        _ => &ctx.target_text_dmso,
    };
    cell.get_or_init(|| numfmt::fixed1(t_pka))
}

/// All reasons in words, separated by "; ".
fn join_reasons(reasons: &[(RejectKind, String)]) -> String {
    let mut out = String::with_capacity(reasons.iter().map(|r| r.1.len() + 2).sum());
    for (i, r) in reasons.iter().enumerate() {
        if i > 0 {
            out.push_str("; ");
        }
        out.push_str(&r.1);
    }
    out
}

/// `c` as the advice prose writes a conversion: `{:.1e}` below 0.1 %, else
/// a percentage with one decimal.
fn push_conv_text(out: &mut String, c: f64) {
    if c < 1e-3 {
        numfmt::push_exp1(out, c);
    } else {
        numfmt::push_fixed1(out, 100.0 * c);
        out.push('%');
    }
}

/// What the equilibrium in the base's own protic solvent gave, kept to word
/// the notes of a base that is reported.
struct InSolvent<'b> {
    solvent: &'b ProticSolvent,
    choice: Rc<ScaleChoice>,
    conversion: f64,
}

fn evaluate<'a>(ctx: &Ctx, base: &'a Base) -> Eval<'a> {
    let opts = ctx.opts;
    let t = &ctx.sites.sites[ctx.target];
    let solvent: Cow<'a, str> = match &opts.solvent {
        Some(s) => Cow::Owned(s.clone()),
        None => Cow::Borrowed(base.usual_solvent()),
    };
    let protic_solvent = base
        .acid_solvent
        .as_ref()
        .filter(|p| p.name.eq_ignore_ascii_case(solvent.trim()));
    let mut ev = Eval {
        base,
        solvent: solvent.clone(),
        scale: None,
        scale_note: String::new(),
        counted: ctx.none_counted.0.clone(),
        equivalents: 0.0,
        conversion: 0.0,
        lean: None,
        eq_notes: Vec::new(),
        exclude: ctx.none_counted.1.clone(),
        reasons: Vec::new(),
        notes: Vec::new(),
        score: 0.0,
        marginal: false,
        no_solvent_check: false,
        words: None,
    };
    let requested = ctx
        .requested
        .map(|r| std::ptr::eq(r, base))
        .unwrap_or(false);
    // Notes are worded only for a base that is reported (accepted or
    // requested); rejected bases report their reasons only.
    let target_has = |sc: Scale| match sc {
        Scale::Dmso => t.pka_dmso.is_some(),
        Scale::Water => t.pka_water.is_some(),
        Scale::Thf => false,
    };
    // Criterion scale: consistent, DMSO first; but a hydroxide or alkoxide in
    // a protic medium is levelled by it (its conjugate acid is water or an
    // alcohol), so it is judged on the water scale, never through the DMSO
    // value of water or the alcohol (issue 5).
    let levelled = matches!(base.family, BaseFamily::Hydroxide | BaseFamily::Alkoxide)
        && protic_medium(&solvent);
    if levelled && opts.scale.is_none() && !target_has(Scale::Water) {
        ev.reasons.push((
            RejectKind::NoComparablePka,
            format!(
                "judged on the water scale in {solvent} (levelled by its conjugate acid); the target has no water-scale estimate"
            ),
        ));
        side_reaction_checks(ctx.f, base, &mut ev.reasons);
        if requested {
            ev.notes.extend(unusual_solvent_note(opts, base));
        }
        return ev;
    }
    let Some(choice) = choose_scale(base, levelled, opts.scale, target_has) else {
        ev.reasons.push((
            RejectKind::NoComparablePka,
            "no pKa scale shared with the target".into(),
        ));
        if requested {
            ev.notes.extend(unusual_solvent_note(opts, base));
        }
        return ev;
    };
    let (scale, base_pka, mismatch) = (choice.site_scale, choice.base_pka, choice.mismatch);
    ev.scale = Some(scale);
    let Some(t_pka) = pka_on(t, scale) else {
        ev.reasons.push((
            RejectKind::NoComparablePka,
            "the target has no value on this scale".into(),
        ));
        if requested {
            ev.notes.extend(unusual_solvent_note(opts, base));
            ev.scale_note = choice.note.clone();
        }
        return ev;
    };
    let (counted, counted_sites) = counted_for(ctx, base, scale, protic_solvent.is_some());
    ev.counted = counted;
    let n_counted: usize = ev.counted.iter().map(|c| c.protons).sum();
    let needed = match opts.purpose {
        Purpose::Stoichiometric | Purpose::InSitu => {
            ctx.plan.per_target + ctx.plan.extra + n_counted as f64 + PRACTICAL_EXCESS
        }
        Purpose::Catalytic => n_counted as f64 + ctx.plan.per_target,
    };
    ev.equivalents = opts.equivalents.unwrap_or(needed);
    // Counted protons are removed first: their sites leave the equilibrium
    // together with the base they consume.
    let left = |eq: f64| (eq - n_counted as f64).max(0.0);
    // Acceptance is judged at the needed equivalents; the reported
    // composition uses the requested equivalents when given.
    let crit = solve_lean(ctx, base_pka, scale, left(needed), 0.0, &counted_sites);
    let crit_conv = crit.map(|e| e.1).unwrap_or(0.0);
    let reported = if opts.equivalents.is_some() {
        solve_lean(
            ctx,
            base_pka,
            scale,
            left(ev.equivalents),
            0.0,
            &counted_sites,
        )
    } else {
        crit
    };
    ev.conversion = reported.map(|e| e.1).unwrap_or(0.0);
    ev.lean = reported.map(|e| e.0);
    let mut solvent_conv: Option<f64> = None;
    // In the base's own protic solvent: water scale, solvent counted.
    let mut no_water_in: Option<&ProticSolvent> = None;
    let mut in_solvent_eq: Option<InSolvent> = None;
    if let Some(p) = protic_solvent {
        let in_solvent = choose_scale(base, true, None, target_has)
            .filter(|c| c.mismatch == 0.0 && c.site_scale == Scale::Water);
        match in_solvent {
            None => {
                ev.no_solvent_check = true;
                no_water_in = Some(p);
            }
            Some(c2) => {
                let (sc2, bp2) = (c2.site_scale, c2.base_pka);
                let at_needed = solve_lean(ctx, bp2, sc2, left(needed), p.molar, &counted_sites);
                solvent_conv = at_needed.map(|e| e.1);
                let rep = if opts.equivalents.is_some() {
                    solve_lean(ctx, bp2, sc2, left(ev.equivalents), p.molar, &counted_sites)
                } else {
                    at_needed
                };
                if let Some((e2, conv2)) = rep {
                    ev.conversion = conv2;
                    ev.scale = Some(sc2);
                    ev.lean = Some(e2);
                    in_solvent_eq = Some(InSolvent {
                        solvent: p,
                        choice: c2,
                        conversion: conv2,
                    });
                }
            }
        }
    }
    // Marginal acceptance (central and optimistic conversion, sigma, mixed
    // scales) and the drained-equilibrium fraction, worded at the end.
    let mut marginal_note: Option<(f64, f64, f64, bool)> = None;
    let mut drained_note: Option<f64> = None;
    match opts.purpose {
        Purpose::Stoichiometric => {
            // In its own solvent (NaOEt in EtOH) a levelled base is judged by
            // the equilibrium with the solvent counted (below); elsewhere by
            // the 99 % rule on the water scale.
            let own_solvent_rule = levelled && solvent_conv.is_some();
            let mut weak_crit = crit_conv < ctx.plan.min_fraction && !own_solvent_rule;
            if weak_crit {
                // Within the combined uncertainty of the target estimate and
                // any scale mismatch? Solved only where it can matter: a base
                // below the marginal floor at the central values is rejected
                // anyway.
                let sigma = (t.uncertainty.max(0.0).powi(2) + mismatch.powi(2)).sqrt();
                if sigma > 0.0 && crit_conv >= MIN_MARGINAL_CONVERSION {
                    let optimistic = solve_lean(
                        ctx,
                        base_pka + sigma,
                        scale,
                        left(needed),
                        0.0,
                        &counted_sites,
                    )
                    .map(|e| e.1)
                    .unwrap_or(0.0);
                    if optimistic >= ctx.plan.min_fraction {
                        weak_crit = false;
                        ev.marginal = true;
                        marginal_note = Some((crit_conv, optimistic, sigma, mismatch > 0.0));
                    }
                }
            }
            let acc_solvent = solvent_conv.unwrap_or(crit_conv);
            let weak_solvent = solvent_conv.is_some() && acc_solvent < MIN_IN_SOLVENT_CONVERSION;
            if weak_crit || weak_solvent {
                let mut uncounted: Option<(&[usize], f64)> = None;
                if let Some((e, _)) = &crit {
                    // Units that cannot reach 1 % are skipped unsolved: a
                    // microsite's fraction is at most its unit's, and that
                    // is below 10^b / (1 + 10^b) for b = the largest
                    // log10 K of the unit + s + log10(microsites).
                    let units = &cached_units(ctx, e.scale).0;
                    for u in units {
                        let n = u.alternatives.len();
                        let top = u
                            .alternatives
                            .iter()
                            .filter(|m| !counted_sites.contains(&m.site))
                            .map(|m| e.base_pka - m.pka)
                            .fold(f64::NEG_INFINITY, f64::max);
                        let bound = top + e.s + if n > 1 { (n as f64).log10() } else { 0.0 };
                        // (NaN, which cannot arise, would not be skipped
                        // wrongly either: no fraction passes x > 0.01 then.)
                        if bound.is_nan() || bound < -2.0 {
                            continue;
                        }
                        let stop = unit_sites(ctx, e, &counted_sites, u, &mut |m, x| {
                            let hit = !ctx.target_unit.contains(&m.site)
                                && !ev.counted.iter().any(|c| c.site == m.site)
                                && x > 0.01;
                            if hit {
                                uncounted = Some((&m.atoms, m.pka));
                            }
                            hit
                        });
                        if stop {
                            break;
                        }
                    }
                }
                let mut reason = String::with_capacity(112);
                match uncounted {
                    Some(u) if weak_crit => {
                        reason.push_str("also takes the uncounted proton at atoms [");
                        for (k, a) in u.0.iter().enumerate() {
                            if k > 0 {
                                reason.push_str(", ");
                            }
                            numfmt::push_usize(&mut reason, *a);
                        }
                        reason.push_str("] (pKa ");
                        numfmt::push_fixed1(&mut reason, u.1);
                        reason.push_str("); target only ");
                        push_conv_text(&mut reason, crit_conv);
                        ev.reasons.push((RejectKind::UncountedProton, reason));
                    }
                    _ => {
                        let conv = if weak_solvent { acc_solvent } else { crit_conv };
                        reason.push_str("too weak: pKa ");
                        reason.push_str(&choice.base_pka_text);
                        reason.push_str(" vs target ");
                        reason.push_str(target_pka_text(ctx, scale, t_pka));
                        reason.push_str(", ");
                        push_conv_text(&mut reason, conv);
                        reason.push_str(" at equilibrium ");
                        if weak_solvent {
                            reason.push_str("in ");
                            reason.push_str(&ev.solvent);
                        } else {
                            reason.push_str("on the ");
                            reason.push_str(scale.name());
                            reason.push_str(" scale");
                        }
                        ev.reasons.push((RejectKind::TooWeak, reason));
                    }
                }
            } else if solvent_conv.is_some() && acc_solvent < ctx.plan.min_fraction {
                drained_note = Some(acc_solvent);
            }
        }
        Purpose::InSitu => {
            let acc = solvent_conv.unwrap_or(crit_conv);
            if acc < ctx.plan.min_fraction {
                let mut reason = String::with_capacity(112);
                reason.push_str("too weak even with the electrophile present: ");
                push_conv_text(&mut reason, acc);
                reason.push_str(" of the target as anion at equilibrium (pKa ");
                reason.push_str(&choice.base_pka_text);
                reason.push_str(" against ");
                reason.push_str(target_pka_text(ctx, scale, t_pka));
                reason.push_str(", ");
                reason.push_str(scale.name());
                reason.push_str(" scale)");
                ev.reasons.push((RejectKind::TooWeak, reason));
            }
        }
        Purpose::Catalytic => {
            if matches!(
                base.family,
                BaseFamily::LithiumAmide
                    | BaseFamily::Silylamide
                    | BaseFamily::Alkyllithium
                    | BaseFamily::Hydride
                    | BaseFamily::MetalAmide
            ) {
                ev.reasons.push((
                    RejectKind::NotCatalytic,
                    "a stoichiometric reagent that is consumed irreversibly; not used in catalytic amounts".into(),
                ));
            }
            let acc = solvent_conv.unwrap_or(crit_conv);
            if acc < ctx.plan.min_fraction {
                let mut reason = String::with_capacity(112);
                reason.push_str("too weak even for catalytic use: ");
                push_conv_text(&mut reason, acc);
                reason.push_str(" of the target as anion at equilibrium (pKa ");
                reason.push_str(&choice.base_pka_text);
                reason.push_str(" against ");
                reason.push_str(target_pka_text(ctx, scale, t_pka));
                reason.push_str(", ");
                reason.push_str(scale.name());
                reason.push_str(" scale)");
                ev.reasons.push((RejectKind::TooWeak, reason));
            }
        }
    }
    ev.exclude = counted_sites;
    side_reaction_checks(ctx.f, base, &mut ev.reasons);
    let accepted = ev.reasons.is_empty();
    if accepted || requested {
        ev.words = Some(Box::new(Words {
            choice,
            scale,
            crit_conv,
            n_counted,
            accepted,
            no_water_in,
            in_solvent: in_solvent_eq,
            marginal: marginal_note,
            drained: drained_note,
        }));
    }
    // The score only ranks acceptable bases.
    if accepted {
        ev.score = score(ctx, &ev, base_pka - t_pka);
    }
    ev
}

/// Writes the notes, scale note and equilibrium notes of a reported base
/// (see [`Words`]), in their reported order: solvent, the equilibrium in the
/// base's own solvent, the equilibrium's own notes (accepted bases only),
/// then marginal acceptance and a drained equilibrium.
fn word_notes(ctx: &Ctx, ev: &mut Eval) {
    let Some(w) = ev.words.take() else {
        return;
    };
    ev.notes.extend(unusual_solvent_note(ctx.opts, ev.base));
    ev.scale_note = w.choice.note.clone();
    if let Some(p) = w.no_water_in {
        ev.notes.push(format!(
            "the target has no water-scale value, so the equilibrium in {} was not computed; the {} comparison overstates an alkoxide or hydroxide in its own solvent",
            p.name,
            w.scale.name()
        ));
    }
    if let Some(ins) = &w.in_solvent {
        let p = ins.solvent;
        ev.eq_notes = vec![
            ins.choice.note.clone(),
            format!(
                "{} counted at {} mol/L as the base's conjugate acid",
                p.name, p.molar
            ),
        ];
        ev.notes.push(format!(
            "in {} ({} mol/L, water scale) {:.3}% of the target is deprotonated at equilibrium",
            p.name,
            p.molar,
            100.0 * ins.conversion
        ));
        ev.scale_note = format!(
            "{} (criterion checked on {}: {:.1}%)",
            ins.choice.note,
            w.scale.name(),
            100.0 * w.crit_conv
        );
    }
    let notes_at = ev.lean.is_some().then_some(ev.notes.len());
    if let Some((central, optimistic, sigma, mixed)) = w.marginal {
        ev.notes.push(format!(
            "marginal: {:.1}% at the central estimates, {:.1}% one standard uncertainty ({sigma:.1} units{}) in the base's favour",
            100.0 * central,
            100.0 * optimistic,
            if mixed { ", including the scale mismatch" } else { "" }
        ));
    }
    if let Some(acc) = w.drained {
        ev.notes.push(format!(
            "the equilibrium in {} lies {:.0}% to the anion; the electrophile pulls it over as the anion is consumed (common practice)",
            ev.solvent,
            100.0 * acc
        ));
    }
    if let (Some(at), true) = (notes_at, w.accepted) {
        // Notes of the equilibrium itself (counted protons, acid units).
        let unit_notes: &[String] = &cached_units(ctx, w.scale).1;
        let mut notes = Vec::with_capacity(unit_notes.len() + 1);
        if w.n_counted > 0 {
            let n = format!(
                "the {} counted proton(s) are taken as removed first and leave the equilibrium with the base they consume",
                w.n_counted
            );
            if !ev.eq_notes.contains(&n) {
                notes.push(n);
            }
        }
        notes.extend(
            unit_notes
                .iter()
                .filter(|n| !ev.eq_notes.contains(n))
                .cloned(),
        );
        ev.notes.splice(at..at, notes);
    }
}

/// The note on a requested solvent that is not among the base's usual ones
/// (None when no solvent was requested or it is a usual one).
fn unusual_solvent_note(opts: &AdviceOptions, base: &Base) -> Option<String> {
    let sv = opts.solvent.as_ref()?;
    let usual = base
        .solvents
        .iter()
        .any(|x| x.eq_ignore_ascii_case(sv.trim()));
    (!usual).then(|| {
        format!(
            "{} is not among the usual solvents for {} ({}); solubility and aggregation may differ from what the pKa comparison assumes",
            sv,
            base.name,
            base.solvents.join(", ")
        )
    })
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

fn side_reaction_checks(
    f: &MoleculeFeatures,
    base: &Base,
    reasons: &mut Vec<(RejectKind, String)>,
) {
    // At most eight groups: a fixed list, no allocation.
    let mut groups = GroupList::default();
    let fam = base.family;
    let attacks_all = matches!(fam, BaseFamily::Alkyllithium | BaseFamily::MetalAmide);
    match base.nucleophilic {
        Nucleophilicity::Yes => {
            let carbonyl_ok = !matches!(fam, BaseFamily::Pyridine);
            if f.ketone && carbonyl_ok {
                groups.push("ketone");
            }
            if f.aldehyde && carbonyl_ok {
                groups.push("aldehyde");
            }
            if f.ester && carbonyl_ok {
                groups.push("ester");
            }
            if f.nitrile
                && (attacks_all
                    || !matches!(fam, BaseFamily::SecondaryAmine | BaseFamily::Pyridine))
            {
                groups.push("nitrile");
            }
            if f.amide && attacks_all {
                groups.push("amide");
            }
            if f.carboxylic_acid && fam == BaseFamily::Alkyllithium {
                groups.push("carboxylate (ketone formation)");
            }
            if f.acyl_halide {
                groups.push("acyl halide");
            }
            if f.anhydride {
                groups.push("anhydride");
            }
            if !groups.is_empty() {
                let how = match fam {
                    BaseFamily::Alkyllithium => "adds to",
                    BaseFamily::MetalAmide => "attacks",
                    BaseFamily::SecondaryAmine => {
                        "condenses with or acylates on (enamine, iminium or amide formation)"
                    }
                    BaseFamily::Pyridine => "is acylated by",
                    _ => "attacks",
                };
                let mut r = String::with_capacity(96);
                r.push_str("nucleophilic base: ");
                r.push_str(how);
                r.push_str(" the ");
                groups.push_joined(&mut r);
                r.push_str(" (addition or substitution)");
                reasons.push((RejectKind::Nucleophile, r));
            }
        }
        Nucleophilicity::Weak => {
            if f.acyl_halide {
                groups.push("acyl halide");
            }
            if f.anhydride {
                groups.push("anhydride");
            }
            if !groups.is_empty() {
                let mut r = String::with_capacity(64);
                r.push_str("reacts with the ");
                groups.push_joined(&mut r);
                r.push_str(" (acyl substitution)");
                reasons.push((RejectKind::Nucleophile, r));
            }
        }
        Nucleophilicity::No => {}
    }
    if fam == BaseFamily::Alkoxide && f.ester {
        if let Some(mine) = alkoxy_of(base) {
            let other: Vec<&str> = f
                .ester_alkoxy
                .iter()
                .map(String::as_str)
                .filter(|a| *a != mine)
                .collect();
            if !other.is_empty() {
                reasons.push((
                    RejectKind::Transesterification,
                    format!(
                        "transesterification: the {mine} alkoxide exchanges the {} ester group(s); use the alkoxide that matches the ester",
                        other.join(", ")
                    ),
                ));
            }
        }
    }
    if fam == BaseFamily::Hydroxide && (f.ester || f.anhydride || f.acyl_halide) {
        reasons.push((
            RejectKind::Hydrolysis,
            "hydroxide hydrolyses the ester (saponification) or acyl group".into(),
        ));
    }
}

/// How common, cheap and easy to source a base is, as a ranking penalty
/// (common practice): 0 for the everyday bases of a process laboratory
/// (carbonates, hydroxides, the simple alkoxides, tertiary amines,
/// piperidine, DBU, NaH, LDA, n-BuLi, NaOAc), 0.5 for the silylamides
/// bought as solutions and caesium carbonate, 1 for specialist reagents
/// (KHMDS, LiTMP, KH, s-/t-BuLi, NaNH2, the other tert-butoxides, TMG, DMAP),
/// 2.5 for costly metal-free superbases (phosphazenes).
pub fn commonness_penalty(base: &Base) -> f64 {
    let name = base.name.as_str();
    match base.family {
        BaseFamily::Phosphazene => 2.5,
        BaseFamily::Silylamide if name == "KHMDS" => 1.0,
        BaseFamily::Silylamide => 0.5,
        BaseFamily::LithiumAmide if name == "LDA" => 0.0,
        BaseFamily::Alkyllithium if name == "n-BuLi" => 0.0,
        BaseFamily::Hydride if name == "NaH" => 0.0,
        BaseFamily::LithiumAmide | BaseFamily::Alkyllithium | BaseFamily::Hydride => 1.0,
        BaseFamily::MetalAmide | BaseFamily::Guanidine => 1.0,
        BaseFamily::Alkoxide if matches!(name, "NaOEt" | "NaOMe" | "KOtBu") => 0.0,
        BaseFamily::Alkoxide => 1.0,
        BaseFamily::Carbonate if name == "Cs2CO3" => 0.5,
        BaseFamily::Pyridine if name == "DMAP" => 1.0,
        _ => 0.0,
    }
}

/// Ranking of acceptable bases, lower first: a chemist picks the mildest
/// adequate, common and cheap base that meets the criteria. The score adds
/// (1) [`commonness_penalty`]; (2) excess strength: 0.1 per pKa unit beyond
/// 10 units more than needed (stronger than needed invites side reactions)
/// and, for a stoichiometric use, 0.2 per unit short of a 3-unit margin;
/// (3) handling hazards (pyrophoric 3, hydrogen evolution 0.4, cryogenic 0.4,
/// toxic 0.3); (4) the chemistry: marginal acceptance 2.5, no equilibrium
/// check in the base's own solvent 1, weakly nucleophilic base beside a
/// carbonyl or nitrile 0.7, a base that enolises a simple carbonyl compound
/// slowly or reversibly 2 (LDA -0.5 there), the alkoxide matching an ester
/// -0.8, carbonates and hydrides (heterogeneous) 0.3, a lithium amide,
/// organolithium or metal amide for an O–H, N–H or S–H target 1.5.
/// [`commonness_penalty`], worked out once per catalogue base.
fn base_penalty(b: &Base) -> f64 {
    static TABLE: std::sync::OnceLock<Vec<f64>> = std::sync::OnceLock::new();
    let Ok(cat) = catalogue() else {
        return commonness_penalty(b);
    };
    let table = TABLE.get_or_init(|| cat.bases.iter().map(commonness_penalty).collect());
    catalogue_slot(cat, b)
        .and_then(|i| table.get(i).copied())
        .unwrap_or_else(|| commonness_penalty(b))
}

/// Position of `b` in the catalogue when it is a catalogue entry.
fn catalogue_slot(cat: &super::catalogue::Catalogue, b: &Base) -> Option<usize> {
    let p = b as *const Base;
    cat.bases
        .as_ptr_range()
        .contains(&p)
        .then(|| (p as usize - cat.bases.as_ptr() as usize) / std::mem::size_of::<Base>())
}

fn score(ctx: &Ctx, ev: &Eval, margin: f64) -> f64 {
    let b = ev.base;
    let f = ctx.f;
    let mut s = base_penalty(b);
    if ev.marginal {
        s += 2.5;
    }
    if ev.no_solvent_check {
        s += 1.0;
    }
    // Stronger than needed invites side reactions; keep a sensible margin.
    s += 0.1 * (margin - 10.0).max(0.0);
    match ctx.opts.purpose {
        Purpose::Stoichiometric => s += 0.2 * (3.0 - margin).max(0.0),
        // A catalyst need not convert the substrate: prefer the mildest.
        Purpose::Catalytic => s += 0.2 * (margin + 2.0).max(0.0),
        // The electrophile drains the equilibrium: the mildest base that
        // still reacts is best.
        Purpose::InSitu => s += 0.1 * margin.max(0.0),
    }
    if b.has_hazard(Hazard::Pyrophoric) {
        s += 3.0;
    }
    if b.has_hazard(Hazard::HydrogenEvolution) {
        s += 0.4;
    }
    if b.has_hazard(Hazard::Cryogenic) {
        s += 0.4;
    }
    if b.has_hazard(Hazard::Toxic) {
        s += 0.3;
    }
    let carbonyls = f.ketone || f.aldehyde || f.ester || f.nitrile;
    if b.nucleophilic == Nucleophilicity::Weak && carbonyls {
        s += 0.7;
    }
    let dicarbonyl = f
        .sites
        .get(ctx.target)
        .map(|x| x.dicarbonyl)
        .unwrap_or(false);
    let monocarbonyl =
        ctx.target_carbonyl && !dicarbonyl && ctx.opts.purpose == Purpose::Stoichiometric;
    if monocarbonyl && !matches!(b.family, BaseFamily::LithiumAmide | BaseFamily::Silylamide) {
        // Self-condensation competes unless enolisation is fast and complete.
        s += 2.0;
    }
    if monocarbonyl && b.family == BaseFamily::LithiumAmide && b.name == "LDA" {
        s -= 0.5;
    }
    // An O–H, N–H or S–H target gives up its proton fast to any base strong
    // enough: the cryogenic lithium amides and the organolithiums, kept for
    // C–H acids, buy nothing there over sodium hydride or an alkoxide
    // (common practice).
    let hetero_target = ctx
        .sites
        .sites
        .get(ctx.target)
        .map(|t| !t.is_carbon())
        .unwrap_or(false);
    if hetero_target
        && matches!(
            b.family,
            BaseFamily::LithiumAmide | BaseFamily::Alkyllithium | BaseFamily::MetalAmide
        )
    {
        s += 1.5;
    }
    if matches!(b.family, BaseFamily::Carbonate | BaseFamily::Hydride) {
        s += 0.3;
    }
    if b.family == BaseFamily::Alkoxide
        && f.ester
        && alkoxy_of(b)
            .map(|a| f.ester_alkoxy.iter().all(|e| e == a))
            .unwrap_or(false)
    {
        s -= 0.8;
    }
    if ctx.opts.purpose == Purpose::Catalytic && b.family.is_neutral() {
        // Amines and amidines are the usual catalytic bases; pyridines are
        // acyl-transfer catalysts and weak Brønsted bases.
        s -= if b.family == BaseFamily::Pyridine {
            -0.5
        } else {
            1.0
        };
    }
    s
}

fn temperature(base: &Base) -> Temperature {
    Temperature {
        low_c: base.temp_min_c,
        high_c: base.temp_max_c,
    }
}

/// [`advise`] from features alone: without the molecule no practice row can
/// be matched, so the reaction's default mode applies.
pub fn advise_with_features(
    f: &MoleculeFeatures,
    sites: &SiteReport,
    opts: &AdviceOptions,
) -> Result<Advice, AdviceError> {
    advise_core(f, sites, opts, None)
}

/// The enolate side a control asks for.
fn side_of(c: Option<Control>) -> Option<Regio> {
    match c {
        Some(Control::Kinetic) => Some(Regio::Kinetic),
        Some(Control::Thermodynamic) => Some(Regio::Thermodynamic),
        None => None,
    }
}

fn advise_core(
    f: &MoleculeFeatures,
    sites: &SiteReport,
    opts_in: &AdviceOptions,
    smarts_target: Option<&crate::smarts::Target>,
) -> Result<Advice, AdviceError> {
    let cat = catalogue().map_err(AdviceError::Catalogue)?;
    let data = practice().map_err(AdviceError::Catalogue)?;
    let opts = opts_in;
    let c = opts.concentration;
    if !(c.is_finite() && c > 0.0 && c <= 20.0) {
        return Err(AdviceError::Invalid("concentration (mol/L)", c));
    }
    if let Some(e) = opts.equivalents {
        if !(e.is_finite() && e > 0.0 && e <= 100.0) {
            return Err(AdviceError::Invalid("equivalents", e));
        }
    }
    let requested = match &opts.base {
        Some(name) => Some(
            cat.get(name)
                .ok_or_else(|| AdviceError::UnknownBase(name.clone()))?,
        ),
        None => None,
    };
    let has_pka = |s: &Site| s.pka_dmso.is_some() || s.pka_water.is_some();
    let (target, chosen_by) = match opts.site {
        Some(atom) => {
            let i = sites
                .sites
                .iter()
                .position(|s| s.atoms.contains(&atom) && has_pka(s))
                .ok_or(AdviceError::NotAcidicAtom(atom))?;
            (i, format!("the site containing atom {atom}, as requested"))
        }
        None => match sites
            .top_carbon
            .filter(|&i| sites.sites.get(i).map(has_pka).unwrap_or(false))
        {
            // `--control` names the side: the site of that side in the same
            // unit as the most acidic C–H (the other α-carbon of the ketone).
            Some(i)
                if opts.control.is_some()
                    && sites.sites[i].regio.is_some()
                    && side_of(opts.control) != sites.sites[i].regio =>
            {
                let unit = f.site_unit.get(i).copied();
                match (0..sites.sites.len()).find(|&j| {
                    f.site_unit.get(j).copied() == unit
                        && sites.sites[j].regio == side_of(opts.control)
                        && has_pka(&sites.sites[j])
                }) {
                    Some(j) => (
                        j,
                        format!(
                            "the {} side of the most acidic C–H unit, as --control asks",
                            opts.control.map(|c| c.name()).unwrap_or("")
                        ),
                    ),
                    None => (i, "the most acidic C–H site".to_string()),
                }
            }
            Some(i) => (i, "the most acidic C–H site".to_string()),
            None => {
                let i = sites
                    .top_overall
                    .filter(|&i| sites.sites.get(i).map(has_pka).unwrap_or(false))
                    .or_else(|| sites.sites.iter().position(has_pka))
                    .ok_or(AdviceError::NoSites)?;
                (
                    i,
                    "the most acidic site (the molecule has no acidic C–H with an estimate)"
                        .to_string(),
                )
            }
        },
    };
    let tsite = &sites.sites[target];
    // The planned reaction, the control and the practice row.
    let legacy_catalytic = opts.reaction.is_none() && opts.purpose == Purpose::Catalytic;
    let reaction = opts.reaction.unwrap_or(Reaction::Alkylation);
    let control = opts.control.or(match tsite.regio {
        Some(Regio::Kinetic) => Some(Control::Kinetic),
        Some(Regio::Thermodynamic) => Some(Control::Thermodynamic),
        None => None,
    });
    let row: Option<&'static PracticeRow> = if legacy_catalytic {
        None
    } else {
        smarts_target.and_then(|t| data.find(t, &tsite.atoms, reaction, control))
    };
    let mode = if legacy_catalytic {
        Mode::Catalytic
    } else {
        row.map(|r| r.mode).unwrap_or(data.reaction(reaction).mode)
    };
    let mode_row = data.mode(mode);
    let mut derived = opts_in.clone();
    derived.purpose = match mode {
        Mode::Preformed => Purpose::Stoichiometric,
        Mode::InSitu => Purpose::InSitu,
        _ => Purpose::Catalytic,
    };
    let plan = Plan {
        min_fraction: mode_row.min_fraction,
        per_target: row
            .and_then(|r| r.equivalents)
            .unwrap_or(mode_row.equivalents),
        extra: if row.and_then(|r| r.equivalents).is_some() || mode == Mode::Catalytic {
            0.0
        } else {
            data.reaction(reaction).extra_equivalents
        },
    };
    let opts = &derived;
    let tunit = f.site_unit.get(target).copied();
    let target_unit: Vec<usize> = (0..sites.sites.len())
        .filter(|&i| {
            i == target
                || (tunit.is_some()
                    && f.site_unit.get(i).copied() == tunit
                    && sites.sites[i].is_carbon()
                    && tsite.is_carbon())
        })
        .collect();
    let cache = |sc: Scale| {
        let mut notes = Vec::new();
        let units = site_units(sites, &f.site_unit, &f.second_stage_shift, sc, &mut notes);
        (units, notes)
    };
    let units_dmso = cache(Scale::Dmso);
    let units_water = cache(Scale::Water);
    let holding_target = |units: &[AcidUnit]| -> Vec<usize> {
        units
            .iter()
            .enumerate()
            .filter(|(_, u)| u.alternatives.iter().any(|m| target_unit.contains(&m.site)))
            .map(|(i, _)| i)
            .collect()
    };
    let target_units_dmso = holding_target(&units_dmso.0);
    let target_units_water = holding_target(&units_water.0);
    let ctx = Ctx {
        f,
        sites,
        opts,
        plan,
        target,
        target_unit,
        units_dmso,
        units_water,
        target_units_dmso,
        target_units_water,
        logk_buf: std::cell::RefCell::new(Vec::new()),
        target_carbonyl: sites
            .sites
            .get(target)
            .map(|t| carbonyl_class(&t.class))
            .unwrap_or(false),
        lean_memo: std::cell::RefCell::new(Vec::new()),
        requested,
        counted_memo: std::cell::RefCell::new(Vec::new()),
        none_counted: (Rc::new(Vec::new()), Rc::from([])),
        target_text_dmso: std::cell::OnceCell::new(),
        target_text_water: std::cell::OnceCell::new(),
    };
    let mut evals: Vec<Eval> = cat.bases.iter().map(|b| evaluate(&ctx, b)).collect();
    // Practice: bases ruled out for this kind of site and reaction, and a
    // preferred base that the equilibrium finds only just short of complete
    // conversion for a preformed anion (lithium and sodium silylamides with
    // esters and amides at -78 °C) accepted with a note.
    let pref_rank = |name: &str| -> usize {
        row.and_then(|r| r.prefer.iter().position(|p| p == name))
            .unwrap_or(usize::MAX)
    };
    if let Some(r) = row {
        let kind = match r.exclude_kind.as_deref() {
            Some("regio") => RejectKind::Regio,
            Some("mode") => RejectKind::Mode,
            _ => RejectKind::SideReaction,
        };
        for ev in evals.iter_mut() {
            if r.exclude.iter().any(|x| x == &ev.base.name) {
                let why = r.exclude_reason.clone().unwrap_or_default();
                ev.reasons.insert(0, (kind, format!("{why} [{}]", r.id)));
            }
            // The practice row names this base for this kind of site and
            // reaction: the generic concern about a nucleophilic base (an
            // amine with an ester in a Knoevenagel reaction) is one practice
            // has weighed.
            if pref_rank(&ev.base.name) != usize::MAX
                && ev
                    .reasons
                    .iter()
                    .any(|(k, _)| *k == RejectKind::Nucleophile)
            {
                ev.reasons.retain(|(k, _)| *k != RejectKind::Nucleophile);
                ev.notes.push(format!(
                    "nucleophilic, but the usual base for this reaction and site in practice ({})",
                    r.id
                ));
                if ev.reasons.is_empty() && ev.words.is_none() {
                    // Its notes were not prepared (it looked rejected): the
                    // record shows the practice note alone.
                    ev.score = score(&ctx, ev, 0.0);
                }
            }
            if mode == Mode::Preformed
                && pref_rank(&ev.base.name) != usize::MAX
                && !ev.reasons.is_empty()
                && ev.reasons.iter().all(|(k, _)| *k == RejectKind::TooWeak)
                && ev.conversion >= MIN_MARGINAL_CONVERSION
            {
                ev.reasons.clear();
                ev.marginal = true;
                ev.notes.push(format!(
                    "accepted by practice ({}): the equilibrium estimate is only {:.0} %, within the uncertainty of the scales; use it as the practice row says, at low temperature with the substrate added to the base",
                    r.id,
                    100.0 * ev.conversion
                ));
                ev.score = score(&ctx, ev, 0.0);
            }
        }
    }
    // Acceptable bases as indices into `evals`: practice's preferred bases
    // first in their order, then the rest best score first (a stable sort:
    // ties keep catalogue order).
    let mut accepted: Vec<usize> = (0..evals.len())
        .filter(|&i| evals[i].reasons.is_empty())
        .collect();
    accepted.sort_by(|&a, &b| {
        pref_rank(&evals[a].base.name)
            .cmp(&pref_rank(&evals[b].base.name))
            .then(
                evals[a]
                    .score
                    .partial_cmp(&evals[b].score)
                    .unwrap_or(std::cmp::Ordering::Equal),
            )
    });
    // A reagent system or route preferred ahead of every acceptable base.
    let system: Option<&'static System> = if requested.is_some() {
        None
    } else {
        row.and_then(|r| {
            let best_base = accepted.first().map(|&i| pref_rank(&evals[i].base.name));
            r.prefer
                .iter()
                .enumerate()
                .find(|(k, p)| {
                    data.system(p).is_some() && best_base.map(|b| *k < b).unwrap_or(true)
                })
                .and_then(|(_, p)| data.system(p))
        })
    };
    let system_eval: Option<usize> = system
        .and_then(|sy| sy.base.as_deref())
        .and_then(|b| evals.iter().position(|e| e.base.name == b));
    let mut warnings: Vec<Warning> = Vec::new();
    let chosen_at: Option<usize> = match requested {
        Some(b) => {
            let i = evals.iter().position(|e| e.base.name == b.name);
            if let Some(e) = i.map(|i| &evals[i]) {
                if !e.reasons.is_empty() {
                    warnings.push(Warning {
                        kind: WarningKind::RequestedBase,
                        message: format!(
                            "the requested base {} is not suitable here: {}",
                            b.name,
                            join_reasons(&e.reasons)
                        ),
                    });
                }
            }
            i
        }
        None if system.is_some() => system_eval,
        None => accepted.first().copied(),
    };
    // Rejections take their reasons over (nothing reads them after this).
    let rejected: Vec<Rejection> = evals
        .iter_mut()
        .filter(|e| !e.reasons.is_empty())
        .map(|e| {
            let reasons = std::mem::take(&mut e.reasons);
            let kinds: Vec<RejectKind> = reasons.iter().map(|r| r.0).collect();
            let reason = if reasons.len() == 1 {
                reasons.into_iter().next().map(|r| r.1).unwrap_or_default()
            } else {
                join_reasons(&reasons)
            };
            Rejection {
                base: e.base.name.as_str(),
                kind: kinds[0],
                kinds,
                reason,
            }
        })
        .collect();
    // Bases the data cannot judge are not chemical rejections.
    let (not_judged_r, rejected): (Vec<Rejection>, Vec<Rejection>) = rejected
        .into_iter()
        .partition(|r| r.kinds.iter().all(|k| *k == RejectKind::NoComparablePka));
    let not_judged: Vec<NotJudged> = not_judged_r
        .into_iter()
        .map(|r| NotJudged {
            base: r.base,
            missing: r.reason,
        })
        .collect();
    // The alternatives listed: acceptable bases other than the chosen one,
    // best first, as many as asked for; only these and the chosen base get
    // their notes worded.
    // Where practice names the bases for this site and reaction, only those
    // are offered as alternatives (a base the equilibrium accepts but
    // nobody uses for the reaction is not advice).
    let practice_listed = row.map(|r| !r.prefer.is_empty()).unwrap_or(false);
    let others: Vec<usize> = accepted
        .iter()
        .copied()
        .filter(|&i| Some(i) != chosen_at)
        .filter(|&i| !practice_listed || pref_rank(&evals[i].base.name) != usize::MAX)
        .collect();
    let shown = others.len().min(opts.alternatives.unwrap_or(usize::MAX));
    let alternatives_omitted = others.len() - shown;
    for &i in chosen_at.iter().chain(&others[..shown]) {
        if let Some(e) = evals.get_mut(i) {
            word_notes(&ctx, e);
        }
    }
    let chosen: Option<&Eval> = chosen_at.map(|i| &evals[i]);
    let listed: Vec<&Eval> = others[..shown].iter().map(|&i| &evals[i]).collect();
    if chosen.is_none() && system.is_none() {
        let competing = rejected
            .iter()
            .filter(|r| r.kinds.contains(&RejectKind::UncountedProton))
            .count();
        // Among the bases strong enough to matter (not rejected only as too
        // weak or without a comparable pKa), do most fail on a competitor?
        let strong = rejected
            .iter()
            .filter(|r| {
                r.kinds
                    .iter()
                    .any(|k| !matches!(k, RejectKind::TooWeak | RejectKind::NoComparablePka))
            })
            .count();
        let message = if competing > 0 && competing * 2 >= strong.max(1) {
            "no catalogue base meets the criteria for this target: another site of about the same acidity competes for the base, so selective deprotonation is not expected; protect or differentiate that site, or plan for a mixture".to_string()
        } else {
            "no catalogue base meets the criteria for this target; see the rejections".to_string()
        };
        warnings.push(Warning {
            kind: WarningKind::NoBase,
            message,
        });
    }
    let alternatives: Vec<Alternative> = listed
        .iter()
        .map(|e| Alternative {
            base: e.base.name.as_str(),
            equivalents: e.equivalents,
            conversion: e.conversion,
            scale: e.scale.unwrap_or(Scale::Dmso),
            solvent: e.solvent.to_string(),
            temperature: temperature(e.base),
            note: e.notes.join("; "),
        })
        .collect();

    // Counted protons and equivalents of the chosen base.
    // A system's base may have no usable evaluation (no comparable pKa):
    // the system's equivalents then follow from the plan alone.
    let numbers_from = chosen.filter(|e| e.equivalents > 0.0 || system.is_none());
    let (counted, equivalents, equivalents_note, counted_note) = match numbers_from {
        Some(e) => {
            let n: usize = e.counted.iter().map(|c| c.protons).sum();
            let note = match (opts.equivalents, opts.purpose) {
                (Some(x), _) => format!("{x} equiv as requested"),
                (None, Purpose::Stoichiometric | Purpose::InSitu) => {
                    let mut t = format!("{} for the target", ctx.plan.per_target);
                    if ctx.plan.extra > 0.0 {
                        t.push_str(&format!(
                            " + {} consumed by the {} ({})",
                            ctx.plan.extra,
                            reaction.name(),
                            if reaction == Reaction::Acylation {
                                "the product is more acidic than the substrate and takes base"
                            } else {
                                "a second deprotonation for the second step"
                            }
                        ));
                    }
                    t.push_str(&format!(" + {n} counted proton(s) + {PRACTICAL_EXCESS} practical excess (titre of the base solution, adventitious moisture)"));
                    t
                }
                (None, Purpose::Catalytic) => format!(
                    "{} equiv catalytic + {n} counted proton(s)",
                    ctx.plan.per_target
                ),
            };
            let cn = if n > 0 {
                Some(format!(
                    "{n} proton(s) are removed before the target and consume base: {}. Proton transfer from O–H, N–H and S–H is fast; with lithium and sodium bases in THF, alcohols and carbamate N–H are deprotonated before a ketone's α-C–H even where their DMSO pKa is somewhat higher, so they are counted (common practice).",
                    e.counted
                        .iter()
                        .map(|c| format!("{} {} at atoms {:?}", c.element, c.class, c.atoms))
                        .collect::<Vec<_>>()
                        .join(", ")
                ))
            } else {
                None
            };
            if let (Some(x), Purpose::Stoichiometric) = (opts.equivalents, opts.purpose) {
                if x < 1.0 + n as f64 {
                    warnings.push(Warning {
                        kind: WarningKind::RequestedEquivalents,
                        message: format!(
                            "{x} equiv does not cover the target plus the {n} counted proton(s): at least {} equiv is needed",
                            1 + n
                        ),
                    });
                }
            }
            (e.counted.to_vec(), e.equivalents, note, cn)
        }
        None => match system {
            Some(_) => {
                let e = ctx.plan.per_target + ctx.plan.extra + PRACTICAL_EXCESS;
                (
                    Vec::new(),
                    e,
                    format!(
                        "{} for the target + {PRACTICAL_EXCESS} practical excess",
                        ctx.plan.per_target + ctx.plan.extra
                    ),
                    None,
                )
            }
            None => (Vec::new(), 0.0, "no base chosen".to_string(), None),
        },
    };
    if let Some(n) = &counted_note {
        warnings.push(Warning {
            kind: WarningKind::CountedProtons,
            message: n.clone(),
        });
    }
    molecule_warnings(&ctx, chosen, &mut warnings);

    let regio = regio_advice(&ctx, cat);
    // Cautions: chosen, alternatives, regio reagents, then a general one.
    let mut cautions: Vec<Caution> = Vec::new();
    let mut push = |c: Option<Caution>| {
        if let Some(c) = c {
            if !cautions.iter().any(|x| x.reagent == c.reagent) {
                cautions.push(c);
            }
        }
    };
    if let Some(sy) = system {
        push(caution_for_reagent(&sy.name, &sy.hazards, &[]));
    }
    if let Some(e) = chosen {
        push(caution_for(e.base, Some(&e.solvent)));
    }
    // Full cautions for the reagents of the kinetic and thermodynamic
    // conditions, one line for each other acceptable base.
    if let Some(r) = &regio {
        for name in ["LDA", "LiHMDS", "NaH", "KOtBu", "Et3N"] {
            if r.kinetic.base.contains(name) || r.thermodynamic.base.contains(name) {
                if let Some(b) = cat.get(name) {
                    push(caution_for(b, None));
                }
            }
        }
        if r.thermodynamic.procedure.contains("TMSCl") {
            push(caution_for_reagent(
                "TMSCl",
                &[Hazard::Flammable, Hazard::Corrosive, Hazard::WaterReactive],
                &["releases hydrogen chloride with moisture"],
            ));
        }
    }
    for e in &listed {
        push(short_caution_for(e.base));
    }
    push(Some(general_caution()));

    let exact = chosen.and_then(|e| full_equilibrium(&ctx, e));
    let t = Target {
        site: target,
        atoms: tsite.atoms.clone(),
        element: tsite.element.clone(),
        class: tsite.class.clone(),
        pka_dmso: tsite.pka_dmso,
        pka_water: tsite.pka_water,
        uncertainty: tsite.uncertainty,
        regio: tsite.regio,
        chosen_by,
    };
    let mut mode_note = String::new();
    if let Some(r) = row {
        mode_note.push_str(&r.note);
        mode_note.push_str(" [");
        mode_note.push_str(&r.id);
        mode_note.push_str(", ");
        mode_note.push_str(&r.source);
        mode_note.push_str("]; ");
    }
    mode_note.push_str(mode.name());
    mode_note.push_str(": ");
    mode_note.push_str(&mode_row.note);
    if let Some(sy) = system {
        mode_note.push_str("; ");
        mode_note.push_str(&sy.name);
        mode_note.push_str(": ");
        mode_note.push_str(&sy.procedure);
        mode_note.push_str(" [");
        mode_note.push_str(&sy.source);
        mode_note.push(']');
        if let Some(b) = &sy.base {
            mode_note.push_str(&format!(
                "; the conversion shown is the equilibrium with {b} alone"
            ));
        }
    }
    let (solvent, temperature_out) = match system {
        Some(sy) => (
            Some(sy.solvent.clone()),
            Some(Temperature {
                low_c: sy.temp_min_c,
                high_c: sy.temp_max_c,
            }),
        ),
        None => (
            chosen.map(|e| e.solvent.to_string()),
            chosen.map(|e| temperature(e.base)),
        ),
    };
    Ok(Advice {
        target: t,
        purpose: opts.purpose,
        reaction,
        control,
        mode,
        mode_note,
        practice_row: row.map(|r| r.id.clone()),
        not_judged,
        base: system
            .map(|sy| sy.name.clone())
            .or(chosen.map(|e| e.base.name.clone())),
        equivalents,
        equivalents_note,
        conversion: exact
            .as_ref()
            .map(|q| {
                ctx.target_unit
                    .iter()
                    .map(|&i| q.site_fraction(i))
                    .sum::<f64>()
                    .clamp(0.0, 1.0)
            })
            .or(chosen.filter(|_| system.is_none()).map(|e| e.conversion)),
        equilibrium: exact.filter(|_| opts.full_equilibrium),
        solvent,
        temperature: temperature_out,
        scale: chosen.and_then(|e| e.scale),
        scale_note: chosen.map(|e| e.scale_note.clone()).unwrap_or_default(),
        concentration: c,
        counted,
        counted_note,
        alternatives,
        alternatives_omitted,
        rejected,
        warnings,
        cautions,
        regio,
        catalogue_version: cat.version.clone(),
    })
}

fn molecule_warnings(ctx: &Ctx, chosen: Option<&Eval>, w: &mut Vec<Warning>) {
    let f = ctx.f;
    let t = &ctx.sites.sites[ctx.target];
    let sf = f.sites.get(ctx.target).cloned().unwrap_or_default();
    let mut add = |kind, message: String| w.push(Warning { kind, message });
    if f.aldehyde {
        add(
            WarningKind::SelfAldol,
            "the molecule is an aldehyde: its enolate adds to unreacted aldehyde (self-aldol) faster than most electrophiles; use an enolate equivalent (enamine, imine anion, silyl enol ether) or add the aldehyde last and cold".into(),
        );
    }
    for &i in &ctx.target_unit {
        if let (Some(lg), Some(site)) = (
            f.sites.get(i).and_then(|x| x.beta_leaving_group.as_ref()),
            ctx.sites.sites.get(i),
        ) {
            add(
                WarningKind::BetaElimination,
                format!(
                    "a leaving group ({lg}) sits on the carbon next to the acidic carbon at atoms {:?}: the anion there can expel it (E1cB elimination); keep cold, avoid equilibrating conditions and trap fast",
                    site.atoms
                ),
            );
        }
    }
    if sf.stereocentre {
        add(
            WarningKind::Epimerisation,
            format!("the target carbon (atoms {:?}) is a stereocentre: deprotonation planarises it and it will epimerise or racemise", t.atoms),
        );
    }
    if f.alkyl_halide {
        let mut m = "the molecule contains an alkyl halide or sulfonate: the anion can alkylate itself (intra- or intermolecularly) and strong bases can eliminate HX".to_string();
        if f.alpha_halo_carbonyl {
            m.push_str("; the halide is next to a carbonyl group, so bases can also start a Favorskii rearrangement or Darzens-type self-condensation");
        }
        add(WarningKind::AlkylHalide, m);
    }
    if sf.dicarbonyl {
        add(
            WarningKind::OVersusCAlkylation,
            "1,3-dicarbonyl anions react at O as well as C: hard electrophiles (sulfonates, sulfates, silyl and acyl chlorides), polar aprotic solvents and K+/Cs+ favour O; alkyl iodides and bromides with Na+/Li+ in THF or alcohol favour C (common practice)".into(),
        );
    }
    if let Some(e) = chosen {
        let dicarbonyl = sf.dicarbonyl;
        if t.is_carbon()
            && carbonyl_class(&t.class)
            && !dicarbonyl
            && ctx.opts.purpose == Purpose::Stoichiometric
            && !matches!(
                e.base.family,
                BaseFamily::LithiumAmide | BaseFamily::Silylamide
            )
        {
            add(
                WarningKind::SelfCondensation,
                format!("{} forms the enolate slowly or reversibly: unreacted carbonyl compound and enolate coexist and self-condensation (aldol or Claisen) competes", e.base.name),
            );
        }
        if e.conversion < MIN_CONVERSION && ctx.opts.purpose == Purpose::Stoichiometric {
            let msg = if e.marginal {
                format!(
                    "{:.1}% of the target is deprotonated at the central pKa estimates and 99% is reached only within their uncertainty: check the conversion (for example by a deuterium quench of an aliquot) before adding the electrophile",
                    100.0 * e.conversion
                )
            } else {
                format!(
                    "only {:.1}% of the target is deprotonated at equilibrium in {}; the reaction relies on the electrophile consuming the anion as it forms",
                    100.0 * e.conversion,
                    e.solvent
                )
            };
            add(WarningKind::IncompleteEquilibrium, msg);
        }
        if let (Some(sc), Some(t_pka)) = (e.scale, pka_on(t, e.scale.unwrap_or(Scale::Dmso))) {
            let bp = e.lean.as_ref().map(|q| q.base_pka).unwrap_or(f64::NAN);
            let margin = bp - t_pka;
            if margin.is_finite()
                && margin < 2.0 + 2.0 * t.uncertainty
                && ctx.opts.purpose == Purpose::Stoichiometric
            {
                add(
                    WarningKind::Uncertainty,
                    format!(
                        "the target pKa estimate carries ±{:.1} units and the base is only {:.1} units stronger on the {} scale: the conversion could be lower than computed",
                        t.uncertainty,
                        margin,
                        sc.name()
                    ),
                );
            }
        }
    }
}

fn regio_advice(ctx: &Ctx, cat: &super::catalogue::Catalogue) -> Option<RegioAdvice> {
    let t = &ctx.sites.sites[ctx.target];
    if !t.class.to_ascii_lowercase().contains("ketone") {
        return None;
    }
    let find = |r: Regio| {
        ctx.target_unit
            .iter()
            .copied()
            .find(|&i| ctx.sites.sites.get(i).and_then(|s| s.regio) == Some(r))
    };
    let (k, th) = (find(Regio::Kinetic), find(Regio::Thermodynamic));
    if k.is_none() && th.is_none() {
        return None;
    }
    let atoms = |i: Option<usize>| {
        i.and_then(|i| ctx.sites.sites.get(i))
            .map(|s| s.atoms.clone())
            .unwrap_or_default()
    };
    let lda = cat.get("LDA");
    Some(RegioAdvice {
        kinetic: RegioConditions {
            base: "LDA (or LiHMDS)".into(),
            equivalents: 1.0 + PRACTICAL_EXCESS,
            solvent: "THF".into(),
            temperature: Temperature {
                low_c: lda.map(|b| b.temp_min_c).unwrap_or(-78.0),
                high_c: -78.0,
            },
            procedure: "add the ketone slowly to a slight excess of the hindered amide base at -78 C so base is always in excess and no free ketone equilibrates the enolate; react with the electrophile cold".into(),
            favours_site: k,
            favours_atoms: atoms(k),
        },
        thermodynamic: RegioConditions {
            base: "NaH or KOtBu (or Et3N with TMSCl in DMF for the silyl enol ether)".into(),
            equivalents: 0.95,
            solvent: "THF, tBuOH or DMF".into(),
            temperature: Temperature {
                low_c: 20.0,
                high_c: 80.0,
            },
            procedure: "use a slight excess of ketone (about 0.95 equiv base) with a weaker or equilibrating base at room temperature or above and allow time to equilibrate: proton exchange with free ketone converts the enolates to the more substituted one (Et3N/TMSCl traps it as the silyl enol ether)".into(),
            favours_site: th,
            favours_atoms: atoms(th),
        },
    })
}
