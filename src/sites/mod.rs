//! Acidic sites with pKa estimates from fragment rules (data in
//! `fragments/`), every estimate traceable to its rules and sources.
//!
//! OWNER: acidic-sites work (issue 4). Contract used by advice and report:
//! `find_sites`, `SiteReport`, `Site`, `Regio`, `RuleUse`.

use crate::mol::Molecule;

/// Kinetic / thermodynamic side of an unsymmetrical ketone.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Regio {
    Kinetic,
    Thermodynamic,
}

/// One applied rule and its contribution to the estimate.
#[derive(Debug, Clone, PartialEq)]
pub struct RuleUse {
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
    /// Element symbol of the acidic atom ("C", "O", "N", "S").
    pub element: String,
    /// Hydrogens on each atom of the group.
    pub hydrogens: u8,
    /// Class name from the rule data (e.g. "ketone", "ester", "alcohol").
    pub class: String,
    pub pka_dmso: Option<f64>,
    pub pka_water: Option<f64>,
    /// One standard uncertainty of the estimate, pKa units.
    pub uncertainty: f64,
    pub rules: Vec<RuleUse>,
    pub regio: Option<Regio>,
}

impl Site {
    /// True for C–H sites.
    pub fn is_carbon(&self) -> bool {
        self.element == "C"
    }
}

/// All sites of a molecule, ranked most acidic first.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct SiteReport {
    pub sites: Vec<Site>,
    /// Index into `sites` of the most acidic C–H site.
    pub top_carbon: Option<usize>,
    /// Index into `sites` of the most acidic site overall.
    pub top_overall: Option<usize>,
}

/// Find and rank every acidic site of the molecule's main component.
pub fn find_sites(mol: &Molecule) -> SiteReport {
    let _ = mol;
    SiteReport::default()
}

/// Version of the embedded rule set, stamped into every output.
pub fn rule_set_version() -> &'static str {
    "unbuilt"
}
