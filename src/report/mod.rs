//! Output records: the JSON Lines schema (serialization types kept apart from
//! library types), the human table, CSV/TSV rows and atom-mapped SMILES.
//!
//! OWNER: command-line work (issue 6).
