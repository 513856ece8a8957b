//! Substructure patterns: a documented SMARTS subset parsed into a query
//! graph, and a non-induced backtracking matcher over [`crate::mol::Molecule`].
//!
//! OWNER: patterns work (issue 3). Contract used by other modules:
//! `Pattern::parse`, `Pattern::anchor`, `Pattern::count_unique`,
//! `Pattern::matches_at`, `Pattern::unique_matches`.

use crate::mol::Molecule;

/// A parse error with the character position in the pattern.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct PatternError {
    pub message: String,
    pub position: usize,
    pub pattern: String,
}

impl std::fmt::Display for PatternError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "SMARTS error at character {}: {}",
            self.position, self.message
        )
    }
}

impl std::error::Error for PatternError {}

/// A compiled SMARTS pattern.
#[derive(Debug, Clone)]
pub struct Pattern {
    pub source: String,
}

impl Pattern {
    pub fn parse(smarts: &str) -> Result<Pattern, PatternError> {
        Err(PatternError {
            message: "pattern parser not built yet".into(),
            position: 0,
            pattern: smarts.into(),
        })
    }

    /// Index (in the pattern) of the atom labelled with atom-map `:1`, the
    /// anchor whose hydrogen a rule is about; None if unlabelled.
    pub fn anchor(&self) -> Option<usize> {
        None
    }

    /// Unique matches (the same set of molecule atoms counts once). Each
    /// match maps pattern atom index -> molecule atom index.
    pub fn unique_matches(&self, mol: &Molecule) -> Vec<Vec<usize>> {
        let _ = mol;
        Vec::new()
    }

    pub fn count_unique(&self, mol: &Molecule) -> usize {
        self.unique_matches(mol).len()
    }

    /// Does the pattern match with its anchor atom on molecule atom `atom`?
    /// Returns one such mapping.
    pub fn matches_at(&self, mol: &Molecule, atom: usize) -> Option<Vec<usize>> {
        let _ = (mol, atom);
        None
    }
}
