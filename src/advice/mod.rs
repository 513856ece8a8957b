//! Base advice: the base catalogue (data in `fragments/bases.tsv`), the
//! deprotonation equilibrium solver, and the recommender with warnings and
//! cautions.
//!
//! Public entry points:
//! - [`catalogue`]: the embedded base catalogue, validated on first use.
//! - [`solve`]: equilibrium composition for a set of acidic units and one base.
//! - [`equilibrium_for`]: the same, set up from a [`SiteReport`](crate::sites::SiteReport) and a catalogue base.
//! - [`practice`]: the planned reaction (reactions, base-use modes, reagent
//!   systems and the practice table), validated on first use.
//! - [`advise`]: base, equivalents, solvent, temperature, alternatives,
//!   rejections, warnings and cautions for one molecule.
//!
//! The library does no printing: every result is plain data for the report
//! and command-line layers to render.

mod catalogue;
mod cautions;
mod equilibrium;
mod features;
mod numfmt;
pub mod practice;
mod recommend;

pub use catalogue::{
    catalogue, Base, BaseFamily, Catalogue, CatalogueError, CitedPka, Hazard, Nucleophilicity,
    ProticSolvent, Scale, BASES_FILE,
};
pub use cautions::{
    caution_for, caution_for_reagent, general_caution, short_caution_for,
    short_caution_for_reagent, Caution, DEFERRAL, SHORT_DEFERRAL,
};
pub use equilibrium::{
    equilibrium_for, solve, AcidUnit, Equilibrium, EquilibriumError, EquilibriumInput,
    EquilibriumOptions, Microsite, SiteFraction,
};
pub use features::{
    detect_features, detect_features_in, patterns_all_parse, MoleculeFeatures, SiteFeatures,
};
pub use recommend::{
    advise, advise_in, advise_with_features, commonness_penalty, Advice, AdviceError,
    AdviceOptions, Alternative, CountedProton, Purpose, RegioAdvice, RegioConditions, RejectKind,
    Rejection, Target, Temperature, Warning, WarningKind,
};
