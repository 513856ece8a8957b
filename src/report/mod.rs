//! Output records: the JSON Lines schema (serialization types kept apart from
//! library types), the human table, CSV/TSV rows and atom-mapped SMILES, and
//! [`analyze()`], which runs SMILES → molecule → sites → advice for one input
//! and returns its [`Record`]. No I/O.

pub mod analyze;
pub mod brief;
pub mod delimited;
mod json;
pub mod listings;
pub mod mapped;
pub mod record;
pub mod table;

pub use analyze::{analyze, analyze_molecule, analyze_molfile, Flag, FlagError, Options, Scale};
pub use brief::{Detail, BRIEF_SCHEMA};
pub use record::{Record, SCHEMA};
