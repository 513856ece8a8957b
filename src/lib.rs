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

pub mod advice;
pub mod depict;
pub mod mol;
pub mod report;
pub mod sites;
pub mod smarts;
