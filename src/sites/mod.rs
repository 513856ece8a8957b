//! Acidic sites with pKa estimates from fragment rules (data in
//! `fragments/`), every estimate traceable to its rules and sources.
//!
//! Contract used by advice and report:
//! `find_sites`, `SiteReport`, `Site`, `Regio`, `RuleUse`,
//! `rule_set_version`; also [`rule_set`] (for listing the rules),
//! [`find_sites_with`] and [`Options`].
//!
//! # Model
//! For every hydrogen-bearing atom of the main component (C, N, O, S):
//!
//! 1. **Class rule.** Rows of `fragments/rules.tsv` for that element are
//!    tried in file order; the first whose SMARTS matches with its `:1`
//!    atom on the atom gives the class and the base pKa of the parent
//!    compound on each scale. Rows are ordered most specific first, so a
//!    doubly activated C–H (1,3-dicarbonyl, malonate, …) has its own row.
//!    A C–H with no activating neighbour (an sp3 C–H with no unsaturated,
//!    aromatic or cationic neighbour, and every vinyl, formyl and aryl
//!    C–H except azole C2–H) is tried only against the *background* rows
//!    (family `background`: alkane `C-ALKAN-01` about 56, cyclopropane 46,
//!    aryl 43, furan/thiophene C2 34, vinyl 44, formyl 42): it is listed so
//!    that no carbon-bound hydrogen is silently absent, ranked after every
//!    other site, all its atoms with one hydrogen count form one site, and
//!    it is never the top site or the default advice target. The advice
//!    leaves background sites out of counted protons and of the
//!    equilibrium unless one is the target.
//!    A benzylic C–H whose ring carries a para (or ortho) π-acceptor (NO2,
//!    CN, C=O, SO2R) is a *phenylogous* α-C–H of that acceptor: its rows
//!    (`C-PHNYL-*`) take the acceptor's parent value plus a phenylene
//!    offset and the acceptor's increment family, because a linear σp⁻
//!    term cannot reach a 4-nitrobenzyl anion (essentially a nitronate).
//! 2. **Increments** (`fragments/increments.tsv`): each substituent on an
//!    acidic carbon that is not part of the class rule's match is
//!    classified (alkyl, alkyl bearing an acceptor, aryl, vinyl, alkoxy,
//!    aryloxy, thio, halogen, extra acceptor, onium, …) and the row for its
//!    kind, the rule's family and its ordinal (first, second alkyl…) is
//!    added. A three- or four-membered ring through the acidic carbon adds
//!    a ring row. For alcohol and ammonium sites, fluorine and N/O two
//!    bonds from the acidic atom add inductive rows. Substituents without
//!    a row widen the uncertainty.
//! 3. **Hammett term** −ρ·Σσ for a benzene ring conjugated with the site:
//!    the ring of the first aromatic atom of the class match (e.g. the aryl
//!    of an aryl ketone or of a phenol) or of an aryl increment. Meta
//!    substituents use σm, para substituents σp or σp⁻ as the row says
//!    (`fragments/sigma.tsv`); ortho substituents are not modelled and
//!    widen the uncertainty. Without a ρ on one scale that scale gets no
//!    term and a wider uncertainty.
//!
//! 4. **Charged states** (`states.rs`): a site that lies at least 3 units
//!    above an O–H, S–H or cationic N–H site (a carboxylic acid, a phenol,
//!    an ammonium) is estimated as the proton that goes after it: its rule
//!    is matched again with those acids deprotonated, so it sees a
//!    carboxylate, a phenoxide or a free amine (e.g. `I-CO-NR`, not
//!    `I-CO-ONN`, for glycine methyl ester hydrochloride; a Hammett term
//!    `…/sigma-p:oxido` for a phenol that went first).
//!
//! Each contribution is a [`RuleUse`]; the estimate is their sum. Class
//! rules and increments appear under their ids (`C-KETON-01`,
//! `I-CO-ALK1`); a Hammett term appears as
//! `<rule id>/sigma-<m|p|p-|o(p)|o(p-)>:<substituent name>`. A scale
//! gets no estimate (None) when the class rule or any increment has no
//! value on it: water values are never made up from DMSO values. The
//! uncertainty is the root sum of squares of the row uncertainties.
//!
//! Symmetry-equivalent atoms with identical estimates form one site.
//! Sites are ranked by DMSO pKa, or by water pKa for sites without a DMSO
//! estimate ([`Options::scale`] switches to water first);
//! [`Site::ranking_pka`] tells which scale each site was ranked on and
//! [`SiteReport::mixed_scales`] whether the ranking mixes the two. For a ketone
//! whose two α-carbons are different sites, the side with more hydrogens
//! (less substituted) is marked kinetic and the other thermodynamic; with
//! equal hydrogen counts the more acidic side is thermodynamic.

use std::sync::OnceLock;

use crate::mol::Molecule;

mod estimate;
mod hammett;
mod regio;
mod rules;
mod states;

pub use hammett::{SigmaEntry, SigmaTable};
pub use rules::{
    parse_rule_set, Hammett, Increment, Rule, RuleError, RuleSet, SigmaKind, BACKGROUND_FAMILY,
    SUBSTITUENT_KINDS,
};

/// Embedded rule files: (file name, text).
const RULES: (&str, &str) = (
    "fragments/rules.tsv",
    include_str!("../../fragments/rules.tsv"),
);
const INCREMENTS: (&str, &str) = (
    "fragments/increments.tsv",
    include_str!("../../fragments/increments.tsv"),
);
const SOURCES: (&str, &str) = (
    "fragments/sources.tsv",
    include_str!("../../fragments/sources.tsv"),
);
const SIGMA: (&str, &str) = (
    "fragments/sigma.tsv",
    include_str!("../../fragments/sigma.tsv"),
);

struct Loaded {
    rules: RuleSet,
    sigma: SigmaTable,
}

static LOADED: OnceLock<Result<Loaded, RuleError>> = OnceLock::new();

fn loaded() -> Result<&'static Loaded, &'static RuleError> {
    LOADED
        .get_or_init(|| {
            let rules = parse_rule_set(RULES, INCREMENTS, SOURCES)?;
            let sigma = SigmaTable::parse(SIGMA.0, SIGMA.1)?;
            Ok(Loaded { rules, sigma })
        })
        .as_ref()
}

/// The embedded rule set, parsed and validated on first use. An error names
/// the file and line of the first bad row.
pub fn rule_set() -> Result<&'static RuleSet, &'static RuleError> {
    loaded().map(|l| &l.rules)
}

/// The class rules in match order (for listing, e.g. `acidsite rules`).
pub fn rules() -> Result<&'static [Rule], &'static RuleError> {
    rule_set().map(|r| r.rules.as_slice())
}

/// The embedded Hammett σ table.
pub fn sigma_table() -> Result<&'static SigmaTable, &'static RuleError> {
    loaded().map(|l| &l.sigma)
}

pub use crate::scale::Scale;

/// Options for [`find_sites_with`].
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct Options {
    /// Scale the sites are ranked on (default DMSO).
    pub scale: Scale,
}

/// Kinetic / thermodynamic side of an unsymmetrical ketone.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Regio {
    /// The less substituted side, deprotonated fastest (LDA, −78 °C).
    Kinetic,
    /// The side giving the more substituted, more stable enolate.
    Thermodynamic,
}

/// One applied rule and its contribution to the estimate.
#[derive(Debug, Clone, PartialEq)]
pub struct RuleUse {
    /// Rule or increment id (`C-KETON-01`, `I-CO-ALK1`, or an id with a
    /// `/sigma-…` suffix for a Hammett term).
    pub id: String,
    /// Contribution on the DMSO scale (base value or increment).
    pub dmso: Option<f64>,
    /// Contribution on the water scale.
    pub water: Option<f64>,
}

/// One acidic site: a group of symmetry-equivalent atoms bearing acidic H.
#[derive(Debug, Clone, PartialEq)]
pub struct Site {
    /// Symmetry-equivalent atoms (input order indices), ascending.
    pub atoms: Vec<usize>,
    /// Element of the acidic atom (C, O, N, S); records write its symbol.
    pub element: crate::mol::Element,
    /// Hydrogens on each atom of the group (all isotopes).
    pub hydrogens: u8,
    /// How many of `hydrogens` are deuterium, on each atom of the group.
    pub deuterium: u8,
    /// How many of `hydrogens` are tritium, on each atom of the group.
    pub tritium: u8,
    /// Class name from the rule data (e.g. "ketone", "ester", "alcohol").
    pub class: String,
    /// Estimated pKa in DMSO, None where the class has no DMSO basis.
    pub pka_dmso: Option<f64>,
    /// Estimated pKa in water, None where the class has no water basis.
    pub pka_water: Option<f64>,
    /// One standard uncertainty of the estimate, pKa units.
    pub uncertainty: f64,
    /// The class rule and every increment that made the estimate, in order.
    pub rules: Vec<RuleUse>,
    /// Kinetic or thermodynamic side, for the α-sites of a ketone or enone.
    pub regio: Option<Regio>,
    /// An unactivated C–H from a background rule (family `background` in
    /// `fragments/rules.tsv`, e.g. alkane C–H near pKa 56): listed so that
    /// no carbon-bound hydrogen is silently absent, ranked after every other
    /// site, all such atoms with the same hydrogen count form one site, and
    /// it is never the default advice target (only when asked for by atom).
    /// Background sites do not make a ranking mixed-scale.
    pub background: bool,
}

impl Site {
    /// True for C–H sites.
    pub fn is_carbon(&self) -> bool {
        self.element == crate::mol::Element::C
    }

    /// The estimate this site is ranked by when `preferred` is the ranking
    /// scale, with the scale it is on: the preferred scale where the site
    /// has a value there, else the other scale (an aldehyde or thioester
    /// α-C–H has no DMSO basis and is ranked by its water value). None when
    /// the site has no estimate on either scale (ranked last).
    pub fn ranking_pka(&self, preferred: Scale) -> Option<(Scale, f64)> {
        let (first, second) = match preferred {
            Scale::Water => ((Scale::Water, self.pka_water), (Scale::Dmso, self.pka_dmso)),
            // DMSO, and THF (no site has a THF estimate: the nearer
            // aprotic scale ranks).
            _ => ((Scale::Dmso, self.pka_dmso), (Scale::Water, self.pka_water)),
        };
        [first, second]
            .into_iter()
            .find_map(|(sc, v)| v.map(|v| (sc, v)))
    }
}

impl SiteReport {
    /// True when the ranking on `preferred` compares estimates from
    /// different scales: some site is ranked by its other-scale value (see
    /// [`Site::ranking_pka`]). Such a ranking is only a rough guide, since
    /// carbon acids can differ by several units between water and DMSO;
    /// output should say which scale each site was ranked on.
    pub fn mixed_scales(&self, preferred: Scale) -> bool {
        let mut seen = [false, false];
        for s in self.sites.iter().filter(|s| !s.background) {
            if let Some((sc, _)) = s.ranking_pka(preferred) {
                seen[usize::from(sc == Scale::Water)] = true;
            }
        }
        seen[0] && seen[1]
    }
}

/// All sites of a molecule, ranked most acidic first.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct SiteReport {
    /// Sites, most acidic first on the ranking scale; background sites last.
    pub sites: Vec<Site>,
    /// Index into `sites` of the most acidic C–H site that is not a
    /// background site (background sites are never the default target).
    pub top_carbon: Option<usize>,
    /// Index into `sites` of the most acidic site overall that is not a
    /// background site.
    pub top_overall: Option<usize>,
}

/// Find and rank every acidic site of the molecule's main component
/// (largest connected component: the cation of an ammonium salt, the
/// organic acid of a sodium salt), ranked on the DMSO scale (water where a
/// site has no DMSO estimate). A salt written as amine plus a neutral acid
/// component (`CCN(CC)CC.Cl`, a fumarate written as the free acid) is read
/// as the ammonium salt: the most basic nitrogen(s) of the main component
/// (alkylamine before azine), one per acid component, are protonated
/// before the sites are found; atom indices are unchanged.
///
/// Returns an empty report only if the embedded rule data failed
/// validation, which [`rule_set`] reports (and the test suite forbids).
pub fn find_sites(mol: &Molecule) -> SiteReport {
    find_sites_with(mol, &Options::default())
}

/// [`find_sites`] with options (ranking scale).
pub fn find_sites_with(mol: &Molecule, opts: &Options) -> SiteReport {
    match loaded() {
        Ok(l) => estimate::run(mol, None, &l.rules, &l.sigma, opts),
        Err(_) => SiteReport::default(),
    }
}

/// [`find_sites_with`] on a pattern-matching view of `mol` that the caller
/// already built (and can reuse, for example for
/// [`crate::advice::advise_in`]); `target` must come from
/// `smarts::Target::new(mol)`.
pub fn find_sites_in(mol: &Molecule, target: &crate::smarts::Target, opts: &Options) -> SiteReport {
    match loaded() {
        Ok(l) => estimate::run(mol, Some(target), &l.rules, &l.sigma, opts),
        Err(_) => SiteReport::default(),
    }
}

/// [`find_sites_with`] with a rule set and σ table of the caller's own
/// (parsed with [`parse_rule_set`] and [`SigmaTable::parse`] from its own
/// files) instead of the embedded ones.
///
/// ```
/// use acidsite::mol::Molecule;
/// use acidsite::sites::{find_sites_using, parse_rule_set, sigma_table, Options};
///
/// // A one-rule table: methyl ketone C-H only (value: acetone 26.5 in
/// // DMSO, 19.3 in water; common practice).
/// let rules = "# my rules\n# version: mine-1\n# match order: as written\n\
/// id\telement\tsmarts\tclass\tfamily\tpka_dmso\tpka_water\tuncertainty\trho_dmso\trho_water\tsigma\tsource\tnote\n\
/// K-1\tC\t[CH3:1]C(=O)\tmethyl ketone\tcarbonyl\t26.5\t19.3\t1.0\t\t\t\tcommon-practice\tacetone\n";
/// let increments = "# my increments\n# version: mine-1\n\
/// id\tkind\tfamilies\tnth\tpka_dmso\tpka_water\tuncertainty\trho_dmso\trho_water\tsigma\tsource\tnote\n";
/// let sources = "key\treference\ncommon-practice\tFigure used routinely in practice.\n";
/// let set = parse_rule_set(("rules.tsv", rules), ("increments.tsv", increments), ("sources.tsv", sources));
/// let set = set.expect("my rule table parses");
/// let sigma = sigma_table().expect("embedded sigma table");
/// let mol = Molecule::from_smiles("CC(=O)CC").unwrap();
/// let report = find_sites_using(&mol, &set, sigma, &Options::default());
/// assert_eq!(report.sites.len(), 1);
/// assert_eq!(report.sites[0].pka_dmso, Some(26.5));
/// ```
pub fn find_sites_using(
    mol: &Molecule,
    rules: &RuleSet,
    sigma: &SigmaTable,
    opts: &Options,
) -> SiteReport {
    estimate::run(mol, None, rules, sigma, opts)
}

/// Version of the embedded rule set, stamped into every output.
pub fn rule_set_version() -> &'static str {
    match rule_set() {
        Ok(r) => r.version.as_str(),
        Err(_) => "invalid",
    }
}

/// Symmetry class of every atom (equal numbers = topologically equivalent).
pub(crate) fn symmetry_classes(mol: &Molecule) -> Vec<u32> {
    mol.symmetry_classes()
}
