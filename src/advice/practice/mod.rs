//! The planned reaction and how it is run: reaction names, base-use modes,
//! reagent systems and the practice table, all read from `fragments/`
//! (`reactions.tsv`, `modes.tsv`, `systems.tsv`, `practice.tsv`) and
//! validated on first use against the base catalogue and the citation keys.
//!
//! ```
//! use acidsite::advice::practice::{practice, Reaction};
//! let data = practice().expect("the embedded practice data are valid");
//! let r = Reaction::parse("aldol").unwrap();
//! assert_eq!(data.reaction(r).name, "aldol");
//! assert!(Reaction::parse("banana").is_err());
//! ```

use super::catalogue::{catalogue, parse_sources, Catalogue, CatalogueError, Hazard};
use crate::smarts::Pattern;
use std::fmt;
use std::sync::OnceLock;

mod parse;

const REACTIONS_TEXT: &str = include_str!("../../../fragments/reactions.tsv");
const MODES_TEXT: &str = include_str!("../../../fragments/modes.tsv");
const SYSTEMS_TEXT: &str = include_str!("../../../fragments/systems.tsv");
const PRACTICE_TEXT: &str = include_str!("../../../fragments/practice.tsv");
const SIDE_TEXT: &str = include_str!("../../../fragments/side_reactions.tsv");
const REGIO_TEXT: &str = include_str!("../../../fragments/regio.tsv");
const SOURCES_TEXT: &str = include_str!("../../../fragments/sources.tsv");

/// A planned reaction (`--reaction`).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Reaction {
    /// One C-, O- or N-alkylation (the default).
    Alkylation,
    /// Two alkylations at one carbon, or a ring closure with a dihalide.
    Dialkylation,
    /// Addition of a preformed anion to an aldehyde or ketone.
    Aldol,
    /// C-acylation (Claisen, Dieckmann, acid chloride, anhydride).
    Acylation,
    /// Knoevenagel, Henry or aldol condensation.
    Condensation,
    /// Michael donor.
    ConjugateAddition,
    /// Silyl enol ether, enol triflate or enol phosphate.
    EnolTrap,
    /// Horner–Wadsworth–Emmons or Julia-type olefination.
    Olefination,
    /// Epimerisation or equilibration through the anion.
    Equilibration,
}

impl Reaction {
    /// Every reaction, in the order the help text lists them.
    pub const ALL: [Reaction; 9] = [
        Reaction::Alkylation,
        Reaction::Dialkylation,
        Reaction::Aldol,
        Reaction::Acylation,
        Reaction::Condensation,
        Reaction::ConjugateAddition,
        Reaction::EnolTrap,
        Reaction::Olefination,
        Reaction::Equilibration,
    ];

    /// The name `--reaction` takes and records carry.
    pub fn name(self) -> &'static str {
        match self {
            Reaction::Alkylation => "alkylation",
            Reaction::Dialkylation => "dialkylation",
            Reaction::Aldol => "aldol",
            Reaction::Acylation => "acylation",
            Reaction::Condensation => "condensation",
            Reaction::ConjugateAddition => "conjugate-addition",
            Reaction::EnolTrap => "enol-trap",
            Reaction::Olefination => "olefination",
            Reaction::Equilibration => "equilibration",
        }
    }

    /// Parse a reaction name (exact, case-insensitive); the error lists the
    /// valid names.
    pub fn parse(s: &str) -> Result<Reaction, UnknownName> {
        let t = s.trim();
        Reaction::ALL
            .iter()
            .copied()
            .find(|r| r.name().eq_ignore_ascii_case(t))
            .ok_or_else(|| UnknownName {
                what: "reaction",
                given: s.to_string(),
                valid: Reaction::ALL.iter().map(|r| r.name()).collect(),
            })
    }
}

/// Which enolate of a ketone with two sides is wanted (`--control`).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Control {
    /// The less substituted enolate, formed fastest.
    Kinetic,
    /// The more substituted, more stable enolate.
    Thermodynamic,
}

impl Control {
    /// Both controls.
    pub const ALL: [Control; 2] = [Control::Kinetic, Control::Thermodynamic];

    /// The name `--control` takes and records carry.
    pub fn name(self) -> &'static str {
        match self {
            Control::Kinetic => "kinetic",
            Control::Thermodynamic => "thermodynamic",
        }
    }

    /// Parse a control name (case-insensitive).
    pub fn parse(s: &str) -> Result<Control, UnknownName> {
        let t = s.trim();
        Control::ALL
            .iter()
            .copied()
            .find(|c| c.name().eq_ignore_ascii_case(t))
            .ok_or_else(|| UnknownName {
                what: "control",
                given: s.to_string(),
                valid: Control::ALL.iter().map(|c| c.name()).collect(),
            })
    }
}

/// How the base is used.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Mode {
    /// Stoichiometric; the anion is formed completely first.
    Preformed,
    /// The electrophile is present and traps the anion as it forms.
    InSitu,
    /// A catalytic amount of base.
    Catalytic,
}

impl Mode {
    /// Every mode.
    pub const ALL: [Mode; 3] = [Mode::Preformed, Mode::InSitu, Mode::Catalytic];

    /// The name the data and the records use.
    pub fn name(self) -> &'static str {
        match self {
            Mode::Preformed => "preformed",
            Mode::InSitu => "in-situ",
            Mode::Catalytic => "catalytic",
        }
    }

    fn parse(s: &str) -> Option<Mode> {
        Mode::ALL.iter().copied().find(|m| m.name() == s.trim())
    }
}

/// A name that is not one of the valid values.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct UnknownName {
    /// What was being named ("reaction", "control").
    pub what: &'static str,
    /// The text given.
    pub given: String,
    /// The valid names.
    pub valid: Vec<&'static str>,
}

impl fmt::Display for UnknownName {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "unknown {} {:?}; valid values: {}",
            self.what,
            self.given,
            self.valid.join(", ")
        )
    }
}

impl std::error::Error for UnknownName {}

/// One row of `fragments/reactions.tsv`.
#[derive(Debug, Clone, PartialEq)]
pub struct ReactionRow {
    /// The reaction.
    pub reaction: Reaction,
    /// Its name.
    pub name: String,
    /// Mode when no practice row matches.
    pub mode: Mode,
    /// Equivalents consumed beyond one per target proton.
    pub extra_equivalents: f64,
    /// What the reaction is.
    pub summary: String,
    /// Citation key.
    pub source: String,
}

/// One row of `fragments/modes.tsv`.
#[derive(Debug, Clone, PartialEq)]
pub struct ModeRow {
    /// The mode.
    pub mode: Mode,
    /// Least fraction of the target as anion at equilibrium.
    pub min_fraction: f64,
    /// Equivalents per target proton (before counted protons and extras).
    pub equivalents: f64,
    /// Why, in words.
    pub note: String,
    /// Citation key.
    pub source: String,
}

/// One row of `fragments/systems.tsv`: a reagent system or route.
#[derive(Debug, Clone, PartialEq)]
pub struct System {
    /// The trade's short name (`Et3N/TMSCl`, `NaH then n-BuLi`).
    pub name: String,
    /// The catalogue base whose equilibrium gives the numbers, if any.
    pub base: Option<String>,
    /// Usual solvent.
    pub solvent: String,
    /// Usual temperature range, °C.
    pub temp_min_c: f64,
    /// Upper end, °C.
    pub temp_max_c: f64,
    /// Hazard classes of the reagents.
    pub hazards: Vec<Hazard>,
    /// How it is run.
    pub procedure: String,
    /// Citation key.
    pub source: String,
}

/// One row of `fragments/practice.tsv`.
#[derive(Debug, Clone)]
pub struct PracticeRow {
    /// Stable id.
    pub id: String,
    /// Reactions the row is for.
    pub reactions: Vec<Reaction>,
    /// Control the row is for (None: any).
    pub control: Option<Control>,
    /// The SMARTS text.
    pub smarts: String,
    /// The compiled pattern (acidic atom mapped :1).
    pub pattern: Pattern,
    /// How the base is used.
    pub mode: Mode,
    /// Bases or systems, best first.
    pub prefer: Vec<String>,
    /// Bases practice rules out here.
    pub exclude: Vec<String>,
    /// Per catalogue slot: position in `prefer` (usize::MAX: not preferred).
    pub rank_by_slot: Vec<usize>,
    /// Per catalogue slot: in `exclude`.
    pub excluded_by_slot: Vec<bool>,
    /// The exclusion reason with the row id, as the advice words it.
    pub exclude_text: String,
    /// Kind of that rejection.
    pub exclude_kind: Option<String>,
    /// Why.
    pub exclude_reason: Option<String>,
    /// Equivalents per target proton fixed by practice.
    pub equivalents: Option<f64>,
    /// Least equilibrium fraction for this practice (None: the mode's).
    pub min_fraction: Option<f64>,
    /// The practice in words.
    pub note: String,
    /// Citation key.
    pub source: String,
}

/// One row of `fragments/side_reactions.tsv`: a side reaction to warn about.
#[derive(Debug, Clone)]
pub struct SideReaction {
    /// Stable id.
    pub id: String,
    /// Reactions it concerns (empty: every one).
    pub reactions: Vec<Reaction>,
    /// Modes it concerns (empty: every one).
    pub modes: Vec<Mode>,
    /// Base families of the recommended base it concerns (empty: every one).
    pub families: Vec<String>,
    /// Patterns that must all be found in the molecule.
    pub patterns: Vec<Pattern>,
    /// The warning.
    pub message: String,
    /// Citation key.
    pub source: String,
}

impl SideReaction {
    /// Does the row apply to this reaction, mode and base family (None: no
    /// catalogue base)?
    pub fn applies(&self, reaction: Reaction, mode: Mode, family: Option<&str>) -> bool {
        (self.reactions.is_empty() || self.reactions.contains(&reaction))
            && (self.modes.is_empty() || self.modes.contains(&mode))
            && (self.families.is_empty()
                || family
                    .map(|f| self.families.iter().any(|x| x == f))
                    .unwrap_or(false))
    }

    /// Are all its patterns found in the molecule?
    pub fn found_in(&self, target: &crate::smarts::Target) -> bool {
        self.patterns.iter().all(|p| p.is_match_in(target))
    }
}

/// One row of `fragments/regio.tsv`: the base families never offered for
/// one enolate side.
#[derive(Debug, Clone)]
pub struct RegioRule {
    /// The enolate side (kinetic or thermodynamic) the rule applies to.
    pub control: Control,
    /// Base families ruled out under this control.
    pub families: Vec<String>,
    /// Why, in the words the advice uses.
    pub reason: String,
    /// Citation key.
    pub source: String,
}

/// The texts of the practice files, parsed together by [`Practice::parse`]
/// (the embedded files, or altered copies in tests).
#[derive(Debug, Clone, Copy)]
pub struct Texts<'t> {
    /// `fragments/reactions.tsv`
    pub reactions: &'t str,
    /// `fragments/modes.tsv`
    pub modes: &'t str,
    /// `fragments/systems.tsv`
    pub systems: &'t str,
    /// `fragments/practice.tsv`
    pub practice: &'t str,
    /// `fragments/side_reactions.tsv`
    pub side: &'t str,
    /// `fragments/regio.tsv`
    pub regio: &'t str,
    /// `fragments/sources.tsv`
    pub sources: &'t str,
}

/// The embedded texts.
pub const EMBEDDED: Texts<'static> = Texts {
    reactions: REACTIONS_TEXT,
    modes: MODES_TEXT,
    systems: SYSTEMS_TEXT,
    practice: PRACTICE_TEXT,
    side: SIDE_TEXT,
    regio: REGIO_TEXT,
    sources: SOURCES_TEXT,
};

/// The practice data, validated.
#[derive(Debug, Clone)]
pub struct Practice {
    /// One row per reaction, in [`Reaction::ALL`] order.
    pub reactions: Vec<ReactionRow>,
    /// One row per mode, in [`Mode::ALL`] order.
    pub modes: Vec<ModeRow>,
    /// Reagent systems and routes.
    pub systems: Vec<System>,
    /// Practice rows in match order.
    pub rows: Vec<PracticeRow>,
    /// Side reactions to warn about.
    pub side_reactions: Vec<SideReaction>,
    /// The regiochemistry guard, one row per control.
    pub regio: Vec<RegioRule>,
    /// Names of the catalogue's bases, in catalogue order, that these data
    /// were validated against: the per-slot tables of the practice rows
    /// ([`PracticeRow::rank_by_slot`]) index that order, so the data serve
    /// only a catalogue with the same bases in the same order (checked by
    /// [`AdviceData::new`](crate::advice::AdviceData::new)).
    pub base_names: Vec<String>,
}

impl Practice {
    /// The row of a reaction.
    pub fn reaction(&self, r: Reaction) -> &ReactionRow {
        let i = Reaction::ALL.iter().position(|x| *x == r).unwrap_or(0);
        &self.reactions[i]
    }

    /// The row of a mode.
    pub fn mode(&self, m: Mode) -> &ModeRow {
        let i = Mode::ALL.iter().position(|x| *x == m).unwrap_or(0);
        &self.modes[i]
    }

    /// The regiochemistry guard for a control.
    pub fn regio(&self, c: Control) -> Option<&RegioRule> {
        self.regio.iter().find(|r| r.control == c)
    }

    /// A system by name (case-insensitive).
    pub fn system(&self, name: &str) -> Option<&System> {
        self.systems
            .iter()
            .find(|s| s.name.eq_ignore_ascii_case(name.trim()))
    }

    /// The first practice row for this reaction and control whose pattern
    /// puts its :1 atom on one of `atoms` (see the file header for the match
    /// order).
    pub fn find(
        &self,
        target: &crate::smarts::Target,
        atoms: &[usize],
        reaction: Reaction,
        control: Option<Control>,
    ) -> Option<&PracticeRow> {
        self.rows.iter().find(|r| {
            r.reactions.contains(&reaction)
                && (r.control.is_none() || r.control == control)
                && atoms
                    .iter()
                    .any(|&a| r.pattern.matches_at_in(target, a).is_some())
        })
    }
}

/// The embedded practice data, parsed and validated once.
pub fn practice() -> Result<&'static Practice, CatalogueError> {
    static CELL: OnceLock<Result<Practice, CatalogueError>> = OnceLock::new();
    CELL.get_or_init(|| {
        let cat = catalogue()?;
        Practice::parse(&EMBEDDED, cat)
    })
    .as_ref()
    .map_err(Clone::clone)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn parse_with(practice_text: &str) -> Result<Practice, CatalogueError> {
        Practice::parse(
            &Texts {
                practice: practice_text,
                ..EMBEDDED
            },
            catalogue().unwrap(),
        )
    }

    #[test]
    fn practice_given_embedded_files_is_valid() {
        let p = practice().expect("valid");
        assert_eq!(p.reactions.len(), Reaction::ALL.len());
        assert!(p.rows.len() >= 30);
        // Every system is preferred by at least one row.
        for s in &p.systems {
            assert!(
                p.rows.iter().any(|r| r.prefer.contains(&s.name)),
                "system {} is never recommended",
                s.name
            );
        }
    }

    #[test]
    fn parse_given_unknown_base_in_prefer_names_file_line_and_column() {
        let text = format!(
            "{}X-1\talkylation\t-\t[CX4;!H0:1]C=O\tpreformed\tbanana\t-\t-\t-\t-\t-\tnote\tcommon-practice\n",
            header()
        );
        let e = parse_with(&text).unwrap_err();
        assert_eq!(e.file, "fragments/practice.tsv");
        assert_eq!(e.column.as_deref(), Some("prefer"));
        assert!(e.message.contains("banana"), "{e}");
    }

    #[test]
    fn parse_given_unknown_reaction_or_source_is_rejected() {
        let bad_reaction = format!(
            "{}X-1\tfrying\t-\t[CX4;!H0:1]C=O\tpreformed\tLDA\t-\t-\t-\t-\t-\tnote\tcommon-practice\n",
            header()
        );
        assert!(parse_with(&bad_reaction)
            .unwrap_err()
            .message
            .contains("frying"));
        let bad_source = format!(
            "{}X-1\taldol\t-\t[CX4;!H0:1]C=O\tpreformed\tLDA\t-\t-\t-\t-\t-\tnote\tnobody2020\n",
            header()
        );
        assert!(parse_with(&bad_source)
            .unwrap_err()
            .message
            .contains("nobody2020"));
        let no_map = format!(
            "{}X-1\taldol\t-\t[CX4;!H0]C=O\tpreformed\tLDA\t-\t-\t-\t-\t-\tnote\tcommon-practice\n",
            header()
        );
        assert!(parse_with(&no_map).unwrap_err().message.contains(":1"));
        let excluded_and_preferred = format!(
            "{}X-1\taldol\t-\t[CX4;!H0:1]C=O\tpreformed\tLDA\tLDA\tregio\twhy\t-\t-\tnote\tcommon-practice\n",
            header()
        );
        assert!(parse_with(&excluded_and_preferred).is_err());
    }

    fn header() -> &'static str {
        "id\treactions\tcontrol\tsmarts\tmode\tprefer\texclude\texclude_kind\texclude_reason\tequivalents\tmin_fraction\tnote\tsource\n"
    }

    #[test]
    fn parse_given_side_reaction_with_unknown_family_is_rejected() {
        let side = "id\treactions\tmodes\tfamilies\tpatterns\tmessage\tsource\nSR-X\t*\t*\tdragons\tC=O\twatch out\tcommon-practice\n";
        let e = Practice::parse(&Texts { side, ..EMBEDDED }, catalogue().unwrap()).unwrap_err();
        assert_eq!(e.file, "fragments/side_reactions.tsv");
        assert!(e.message.contains("dragons"), "{e}");
    }

    #[test]
    fn parse_given_regio_row_with_unknown_family_or_source_is_rejected_issue10() {
        let parse_regio =
            |regio: &str| Practice::parse(&Texts { regio, ..EMBEDDED }, catalogue().unwrap());
        let head = "control\tfamilies\treason\tsource\n";
        let e = parse_regio(&format!(
            "{head}thermodynamic\tlithium-amide,wizards\tno\tcommon-practice\n"
        ))
        .unwrap_err();
        assert_eq!(e.file, "fragments/regio.tsv");
        assert!(e.message.contains("wizards"), "{e}");
        let e = parse_regio(&format!("{head}kinetic\thydride\tno\tnobody2099\n")).unwrap_err();
        assert!(e.message.contains("nobody2099"), "{e}");
        let e =
            parse_regio(&format!("{head}sideways\thydride\tno\tcommon-practice\n")).unwrap_err();
        assert_eq!(e.column.as_deref(), Some("control"), "{e}");
        // The embedded rows: each control rules out the other side's families.
        let p = practice().unwrap();
        let k = p.regio(Control::Kinetic).unwrap();
        let t = p.regio(Control::Thermodynamic).unwrap();
        assert!(k.families.iter().any(|f| f == "hydride"));
        assert!(t.families.iter().any(|f| f == "lithium-amide"));
        assert!(!k.families.iter().any(|f| t.families.contains(f)));
    }

    #[test]
    fn reaction_parse_given_unknown_name_lists_valid_ones() {
        let e = Reaction::parse("banana").unwrap_err();
        let text = e.to_string();
        for r in Reaction::ALL {
            assert!(text.contains(r.name()), "{text}");
        }
        assert_eq!(Reaction::parse("Enol-Trap").unwrap(), Reaction::EnolTrap);
        assert_eq!(Control::parse("kinetic").unwrap(), Control::Kinetic);
        assert!(Control::parse("fast").is_err());
    }
}
