//! Public types of the recommender: options, the advice and its parts, rejections, warnings, errors.

use super::*;

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
    /// A side reaction from `fragments/side_reactions.tsv`.
    SideReaction,
    /// A deuterium or tritium label on the target exchanges.
    LabelExchange,
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
            WarningKind::SideReaction => "side-reaction",
            WarningKind::LabelExchange => "label-exchange",
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
    /// The molecule has no activated acidic site with a pKa estimate
    /// (background alkane C–H sites are targets only when asked for).
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
            AdviceError::NoSites => write!(
                f,
                "no activated acidic site with a pKa estimate (an unactivated alkane C–H is a target only when asked for with --site)"
            ),
            AdviceError::NotAcidicAtom(a) => {
                write!(f, "atom {a} is not part of an acidic site")
            }
            AdviceError::UnknownBase(b) => write!(f, "unknown base {b:?}: not in the base catalogue"),
            AdviceError::Invalid(w, v) => write!(f, "invalid {w}: {v}"),
            AdviceError::Catalogue(e) => write!(f, "base catalogue: {e}"),
        }
    }
}

impl std::error::Error for AdviceError {}
