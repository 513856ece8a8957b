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
//! - [`advise_using`] and [`equilibrium_for_using`]: the same from a base
//!   catalogue and practice data the caller parsed from its own files
//!   ([`Catalogue::parse`], [`practice::Practice::parse`], paired by
//!   [`AdviceData::new`]).
//!
//! The library does no printing: every result is plain data for the report
//! and command-line layers to render.
//!
//! # Example
//!
//! ```
//! use acidsite::advice::{catalogue, solve, AcidUnit, EquilibriumInput, Microsite, Scale};
//!
//! // The embedded catalogue; names are looked up case-insensitively.
//! let cat = catalogue().expect("the embedded catalogue is valid");
//! let lda = cat.get("lda").expect("LDA is in the catalogue");
//! assert_eq!(lda.name, "LDA");
//! // Conjugate acid (diisopropylamine) about 36 on the THF ion-pair scale
//! // (common practice), with the citation key of fragments/sources.tsv.
//! assert_eq!(lda.pka(Scale::Thf), Some(36.0));
//! assert_eq!(lda.pka_source(Scale::Thf), Some("common-practice"));
//!
//! // One acidic unit and one equivalent of base, no protic solvent. With
//! // K = 10^(pKa(BH) - pKa(HA)) and x the deprotonated fraction, mass
//! // balance ([B-] = C(1 - x), [BH] = Cx) gives (x / (1 - x))^2 = K:
//! // equal pKa gives x = 1/2, a base four units stronger x = 100/101
//! // (worked by hand).
//! let unit = |pka: f64| AcidUnit {
//!     alternatives: vec![Microsite { site: 0, atoms: vec![0], pka }],
//! };
//! let input = |base_pka: f64| EquilibriumInput {
//!     units: vec![unit(20.0)],
//!     base_pka,
//!     equivalents: 1.0,
//!     concentration: 0.5,
//!     acid_solvent_molar: 0.0,
//! };
//! let even = solve(&input(20.0)).expect("solvable");
//! assert!((even.site_fraction(0) - 0.5).abs() < 1e-9);
//! let strong = solve(&input(24.0)).expect("solvable");
//! assert!((strong.site_fraction(0) - 100.0 / 101.0).abs() < 1e-9);
//! // Anion populations: neutral and mono-anion, summing to 1.
//! assert!((strong.anions.iter().sum::<f64>() - 1.0).abs() < 1e-12);
//! ```

#![warn(missing_docs)]

mod catalogue;
mod cautions;
mod data;
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
pub use data::AdviceData;
pub use equilibrium::{
    equilibrium_for, equilibrium_for_using, solve, AcidUnit, Equilibrium, EquilibriumError,
    EquilibriumInput, EquilibriumOptions, Microsite, SiteFraction,
};
pub use features::{
    detect_features, detect_features_in, patterns_all_parse, MoleculeFeatures, SiteFeatures,
};
pub use recommend::{
    advise, advise_in, advise_in_using, advise_using, advise_with_features,
    advise_with_features_using, commonness_penalty, Advice, AdviceError, AdviceOptions,
    Alternative, CountedProton, Purpose, RegioAdvice, RegioConditions, RejectKind, Rejection,
    Target, Temperature, Warning, WarningKind,
};
