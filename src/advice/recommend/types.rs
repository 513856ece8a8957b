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
    /// Word the reason of every ruled-out base ([`Rejection::reason`], the
    /// `missing` text of [`Advice::not_judged`]); false leaves those texts
    /// empty and keeps their kinds (brief records name the ruled-out bases
    /// only). The reasons of a requested base are always worded: they make
    /// its warning.
    pub word_rejections: bool,
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
            word_rejections: true,
        }
    }
}

/// The site the advice is about: one site of the [`SiteReport`] the advice
/// was worked out from, and why it was chosen. The site itself is the
/// report's own [`Site`] (atoms, element, class, pKa estimates, uncertainty,
/// rules, enolate side), not a copy of its fields under other names.
#[derive(Debug, Clone, PartialEq)]
pub struct Target {
    /// Index into `SiteReport::sites`.
    pub index: usize,
    /// That site of the report.
    pub site: Site,
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
    pub element: crate::mol::Element,
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
pub struct Alternative<'d> {
    /// Catalogue name (borrowed from the catalogue in use).
    pub base: &'d str,
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
#[non_exhaustive]
pub enum RejectKind {
    /// The conjugate acid is not acidic enough: the base does not reach
    /// the conversion the purpose needs (99 % for a preformed anion);
    /// `too-weak`.
    TooWeak,
    /// The base adds to or substitutes at a group of the molecule (C=O,
    /// C≡N, C–X, acyl halide, anhydride); `nucleophile`.
    Nucleophile,
    /// An alkoxide whose alkyl group differs from the ester's alkoxy group
    /// exchanges it; `transesterification`.
    Transesterification,
    /// Hydroxide saponifies an ester or acyl group; `hydrolysis`.
    Hydrolysis,
    /// Strong enough for the target only by also taking a proton the
    /// equivalents do not count (a site of similar acidity); the reason
    /// names its atoms and pKa; `uncounted-proton`.
    UncountedProton,
    /// The base and the target have no pKa on a common scale, so the data
    /// cannot compare them; `no-comparable-pka`.
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
pub struct Rejection<'d> {
    /// Catalogue name (borrowed from the catalogue in use).
    pub base: &'d str,
    /// The first reason found.
    pub kind: RejectKind,
    /// Every reason found, in the order of `reason`.
    pub kinds: Vec<RejectKind>,
    /// All reasons in words, separated by "; ".
    pub reason: String,
}

/// Warning categories.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum WarningKind {
    /// The molecule is an aldehyde: its enolate adds to unreacted
    /// aldehyde; `self-aldol`.
    SelfAldol,
    /// The chosen base forms the enolate slowly or reversibly, so enolate
    /// and carbonyl compound coexist (aldol or Claisen);
    /// `self-condensation`.
    SelfCondensation,
    /// A leaving group on the carbon next to the acidic carbon can be
    /// expelled (E1cB); `beta-elimination`.
    BetaElimination,
    /// The target carbon is a stereocentre and will epimerise or
    /// racemise; `epimerisation`.
    Epimerisation,
    /// The molecule contains an alkyl halide or sulfonate (self-alkylation,
    /// elimination of HX); `alkyl-halide`.
    AlkylHalide,
    /// A 1,3-dicarbonyl anion reacts at O as well as C;
    /// `o-versus-c-alkylation`.
    OVersusCAlkylation,
    /// More acidic protons are removed before the target and consume base
    /// (see [`Advice::counted`]); `counted-protons`.
    CountedProtons,
    /// The base is stronger than the target by less than the estimate's
    /// uncertainty; the conversion could be lower; `uncertainty`.
    Uncertainty,
    /// Only part of the target is deprotonated at equilibrium; the
    /// reaction relies on the electrophile pulling it over;
    /// `incomplete-equilibrium`.
    IncompleteEquilibrium,
    /// The base asked for in [`AdviceOptions::base`] is unsuitable; the
    /// message gives its rejection reasons; `requested-base`.
    RequestedBase,
    /// The equivalents asked for in [`AdviceOptions::equivalents`] do not
    /// cover the target plus the counted protons; `requested-equivalents`.
    RequestedEquivalents,
    /// No catalogue base qualifies ([`Advice::base`] is None), or none of
    /// the bases practice names for this site and reaction passes the
    /// checks and the recommendation is the catalogue's best other base;
    /// `no-base`.
    NoBase,
    /// A side reaction from `fragments/side_reactions.tsv`.
    SideReaction,
    /// A deuterium or tritium label on the target exchanges.
    LabelExchange,
}

impl WarningKind {
    /// Stable lower-case name used in records (key `kind` of a warning).
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
    /// The practice row's preferred bases or systems, at most two, joined
    /// by " or " (`LDA or LiTMP`).
    pub base: String,
    /// Equivalents: the practice row's value (1.0 when it gives none) plus
    /// the practical excess of 0.1 equiv.
    pub equivalents: f64,
    /// Usual solvent of the first preferred base or system (empty when
    /// neither the catalogue nor the practice data knows it).
    pub solvent: String,
    /// Usual temperature range of the first preferred base or system.
    pub temperature: Temperature,
    /// The practice row's note followed by its id in brackets.
    pub procedure: String,
    /// Index into `SiteReport::sites` of the α-carbon this side
    /// deprotonates; None when the molecule has no site on this side.
    pub favours_site: Option<usize>,
    /// Atoms of that site, 0-based in input order (empty with
    /// `favours_site` None).
    pub favours_atoms: Vec<usize>,
}

/// Kinetic and thermodynamic conditions for an unsymmetrical ketone.
#[derive(Debug, Clone, PartialEq)]
pub struct RegioAdvice {
    /// Conditions for the less substituted enolate, formed fastest (cold,
    /// strong hindered base).
    pub kinetic: RegioConditions,
    /// Conditions for the more substituted, more stable enolate
    /// (equilibrating conditions).
    pub thermodynamic: RegioConditions,
}

/// The advice for one molecule. `'d` is the lifetime of the base
/// catalogue it was worked out from (`'static` for the embedded one), whose
/// base names it borrows.
#[derive(Debug, Clone, PartialEq)]
pub struct Advice<'d> {
    /// The site the advice is about.
    pub target: Target,
    /// The purpose asked for in [`AdviceOptions::purpose`].
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
    pub not_judged: Vec<NotJudged<'d>>,
    /// Recommended (or requested) base; None when no catalogue base qualifies.
    pub base: Option<String>,
    /// Equivalents of base per mole of substrate: the target's share, any
    /// extra the reaction consumes, one per counted proton and a practical
    /// excess of 0.1 equiv (or the requested value); 0.0 when no base is
    /// chosen.
    pub equivalents: f64,
    /// How the equivalents were reached.
    pub equivalents_note: String,
    /// Fraction of the target deprotonated at equilibrium with the
    /// recommended base in its solvent.
    pub conversion: Option<f64>,
    /// The full equilibrium with the recommended base (None when
    /// [`AdviceOptions::full_equilibrium`] is false).
    pub equilibrium: Option<Equilibrium>,
    /// Solvent for the recommended base or system (the requested solvent,
    /// else its usual one); None when no base is chosen.
    pub solvent: Option<String>,
    /// Usual working temperature range of the recommended base or system;
    /// None when no base is chosen.
    pub temperature: Option<Temperature>,
    /// pKa scale on which the recommended base was compared with the
    /// target; None when no base is chosen.
    pub scale: Option<Scale>,
    /// Why that scale (for example a THF value standing in for DMSO);
    /// empty when no base is chosen.
    pub scale_note: String,
    /// Substrate concentration used, mol/L.
    pub concentration: f64,
    /// Protons removed before the target.
    pub counted: Vec<CountedProton>,
    /// Plain-language explanation of the counted protons; None when there
    /// are none.
    pub counted_note: Option<String>,
    /// Other acceptable bases, best first (at most
    /// [`AdviceOptions::alternatives`]).
    pub alternatives: Vec<Alternative<'d>>,
    /// Acceptable bases left out of `alternatives` by
    /// [`AdviceOptions::alternatives`].
    pub alternatives_omitted: usize,
    /// Catalogue bases ruled out for this target, with their reasons.
    pub rejected: Vec<Rejection<'d>>,
    /// Chemistry warnings about the molecule, the target and the chosen
    /// conditions.
    pub warnings: Vec<Warning>,
    /// Safety cautions for the recommended base (full) and the other
    /// reagents named (see [`Caution::full`]).
    pub cautions: Vec<Caution>,
    /// Kinetic and thermodynamic conditions when the target is a carbonyl
    /// α-carbon with two enolate sides; None otherwise.
    pub regio: Option<RegioAdvice>,
    /// Version of the base catalogue used (its `# version:` comment).
    pub catalogue_version: String,
}

impl Advice<'_> {
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
    /// Does the advice carry a warning of this kind?
    pub fn has_warning(&self, kind: WarningKind) -> bool {
        self.warnings.iter().any(|w| w.kind == kind)
    }
}

/// A base the data cannot judge (no comparable pKa), kept apart from the
/// chemical rejections.
#[derive(Debug, Clone, PartialEq)]
pub struct NotJudged<'d> {
    /// Catalogue name (borrowed from the catalogue in use).
    pub base: &'d str,
    /// The value that is missing.
    pub missing: String,
}

/// What the recommender could not do.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum AdviceError {
    /// The molecule has no activated acidic site with a pKa estimate
    /// (background C–H sites are targets only when asked for).
    NoSites,
    /// [`AdviceOptions::site`]: that atom carries no acidic hydrogen (or is out
    /// of range).
    NotAcidicAtom(usize),
    /// [`AdviceOptions::base`] names no catalogue base (the name as
    /// given).
    UnknownBase(String),
    /// A number outside its allowed range (option name, value), for
    /// example a concentration that is not positive.
    Invalid(&'static str, f64),
    /// The embedded base catalogue or practice data failed validation (a
    /// build defect).
    Catalogue(CatalogueError),
}

impl fmt::Display for AdviceError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            AdviceError::NoSites => write!(
                f,
                "no activated acidic site with a pKa estimate (an unactivated C–H is a target only when asked for by atom)"
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
