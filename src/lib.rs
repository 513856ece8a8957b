//! acidsite: acidic sites, pKa estimates and base advice for enolate and
//! carbanion chemistry.
//!
//! Data flows one way:
//!
//! ```text
//! SMILES text -> mol::Molecule -> smarts::Pattern matching -> sites::SiteReport
//!             -> advice::Advice (+ equilibrium) -> report (table, JSON, CSV, atom-mapped SMILES)
//! ```
//!
//! The library knows no I/O: the command line and bulk streaming live in the
//! binary (`src/main.rs`, `src/cli/`).
//!
//! Atom indices everywhere are 0-based in the order atoms are written in the
//! input SMILES (explicit hydrogen atoms folded into their heavy atom take no
//! index; see [`mol`]).
//!
//! # Example: SMILES to sites, advice and a JSON record
//!
//! ```
//! use acidsite::advice::{advise, AdviceOptions, RejectKind};
//! use acidsite::mol::Molecule;
//! use acidsite::analyze::{analyze, Options};
//! use acidsite::report::SCHEMA;
//! use acidsite::sites::find_sites;
//!
//! // Acetone: atoms 0 (CH3), 1 (C=O carbon), 2 (O), 3 (CH3).
//! let mol = Molecule::from_smiles("CC(=O)C").expect("valid SMILES");
//!
//! // Acidic sites, most acidic first. The two methyl groups are
//! // symmetry-equivalent and form one C–H site.
//! let sites = find_sites(&mol);
//! let top = &sites.sites[sites.top_carbon.expect("a C–H site")];
//! assert_eq!(top.element, acidsite::mol::Element::C);
//! assert_eq!(top.atoms, vec![0, 3]);
//! // Check value: acetone's α-C–H pKa in DMSO is 26.5 (Bordwell's scale,
//! // common practice); the estimate must lie within 25–28.
//! let pka = top.pka_dmso.expect("a DMSO estimate");
//! assert!((25.0..=28.0).contains(&pka), "acetone DMSO pKa {pka}");
//!
//! // Base advice for that site. A preformed ketone enolate for an
//! // alkylation calls for a strong, hindered, non-nucleophilic base; the
//! // base must convert essentially all of the target at equilibrium.
//! let advice = advise(&mol, &sites, &AdviceOptions::default()).expect("advice");
//! assert_eq!(advice.target.site.atoms, vec![0, 3]);
//! assert!(advice.base.is_some());
//! assert!(advice.conversion.expect("a conversion") > 0.99);
//! // Hydroxide is ruled out, among other reasons as too weak (water pKa
//! // 15.7 against about 19 for acetone's α-C–H).
//! let naoh = advice.rejected.iter().find(|r| r.base == "NaOH").expect("NaOH ruled out");
//! assert!(naoh.kinds.contains(&RejectKind::TooWeak));
//!
//! // The same pipeline as one call, giving the record that
//! // `acidsite annotate` writes as one JSON line.
//! let record = analyze("CC(=O)C", 1, Some("acetone".into()), &Options::default());
//! assert!(record.ok);
//! let json: serde_json::Value =
//!     serde_json::from_str(&record.to_json_line()).expect("valid JSON");
//! assert_eq!(json["schema"], SCHEMA);
//! assert_eq!(json["id"], "acetone");
//! assert_eq!(json["sites"][0]["atoms"], serde_json::json!([0, 3]));
//! assert_eq!(json["advice"]["base"].as_str(), advice.base.as_deref());
//! ```

#![warn(missing_docs)]

pub mod advice;
pub mod analyze;
pub mod depict;
pub mod hazards;
pub mod mol;
pub mod report;
mod scale;
pub mod sites;
pub mod smarts;

pub use scale::Scale;
