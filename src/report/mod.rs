//! Output records: the JSON Lines schema (serialization types kept apart from
//! library types), the human table, CSV/TSV rows and atom-mapped SMILES, and
//! [`analyze()`], which runs SMILES → molecule → sites → advice for one input
//! and returns its [`Record`]. No I/O.
//!
//! # Example
//!
//! ```
//! use acidsite::report::delimited::{Delimiter, Layout, RowWriter};
//! use acidsite::report::{analyze, Detail, Options};
//!
//! // Input that cannot be read becomes an error record, never a panic.
//! let bad = analyze("CC(=O", 7, None, &Options::default());
//! assert!(!bad.ok);
//! assert_eq!(bad.line, 7);
//! let err = bad.error.as_ref().expect("an error");
//! assert_eq!(err.kind, "syntax");
//! assert_eq!(err.position, Some(5)); // 0-based character index: the end
//!
//! // Ethyl acetate as one CSV row per molecule.
//! let rec = analyze("CC(=O)OCC", 1, Some("ethyl acetate".into()), &Options::default());
//! let csv = RowWriter {
//!     delimiter: Delimiter::Comma,
//!     layout: Layout::Molecule,
//!     carried: Vec::new(),
//! };
//! assert!(csv.header().starts_with("line,id,smiles,ok,formula,top_ch_atoms,"));
//! let row = csv.rows(&rec);
//! let fields: Vec<&str> = row.trim_end().split(',').collect();
//! assert_eq!(fields[4], "C4H8O2");
//! assert_eq!(fields[5], "0"); // the acetyl CH3 is atom 0
//! // Check value: ethyl acetate's α-C–H pKa in DMSO is about 29.5
//! // (Bordwell's scale, common practice).
//! let pka: f64 = fields[7].parse().expect("a DMSO estimate");
//! assert!((28.0..=31.0).contains(&pka), "ethyl acetate DMSO pKa {pka}");
//!
//! // The brief form for bulk work keeps the sites and the advice in
//! // under 1.5 KB.
//! let opts = Options { detail: Detail::Brief, ..Options::default() };
//! let brief = analyze("CC(=O)OCC", 1, None, &opts).to_brief_json_line();
//! assert!(brief.len() < 1536, "{} bytes", brief.len());
//! ```

#![warn(missing_docs)]

pub mod brief;
pub mod delimited;
mod json;
pub mod listings;
pub mod mapped;
pub mod record;
pub mod table;

// The pipeline entry point lives in its own module, crate::analyze; these
// re-exports keep the older paths working.
pub use crate::analyze::{
    analyze, analyze_molecule, analyze_molfile, Flag, FlagError, Options, Scale,
};
pub use brief::{Detail, BRIEF_SCHEMA};
pub use record::{Record, SCHEMA};
