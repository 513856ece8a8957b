//! Typed errors of the molecule core.

use std::fmt;

/// What went wrong while reading a SMILES string.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum ErrorKind {
    /// No SMILES given (empty or only white space).
    Empty,
    /// Not SMILES: unexpected character, unclosed bracket or branch.
    Syntax,
    /// A ring-closure digit never closed, closing on its own atom,
    /// duplicating a bond or with conflicting bond orders at its two ends.
    RingClosure,
    /// Aromatic input that cannot be kekulized, or an aromatic atom outside
    /// a ring.
    Aromaticity,
    /// An atom with a valence its element and charge do not allow.
    Valence,
    /// Valid SMILES the reader cannot handle.
    Unsupported,
    /// Over the size limits (characters, atoms, ring-system size).
    TooLarge,
}

impl ErrorKind {
    /// Stable lower-case name used in JSON output.
    pub fn name(self) -> &'static str {
        match self {
            ErrorKind::Empty => "empty",
            ErrorKind::Syntax => "syntax",
            ErrorKind::RingClosure => "ring_closure",
            ErrorKind::Aromaticity => "aromaticity",
            ErrorKind::Valence => "valence",
            ErrorKind::Unsupported => "unsupported",
            ErrorKind::TooLarge => "too_large",
        }
    }
}

/// An error with the character position (0-based, in characters) where it
/// was found, if there is one.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct MolError {
    /// What kind of problem.
    pub kind: ErrorKind,
    /// What is wrong, in words.
    pub message: String,
    /// 0-based character position in the input, when there is one.
    pub position: Option<usize>,
    /// The input as given.
    pub input: String,
}

impl MolError {
    /// Build an error.
    pub fn new(
        kind: ErrorKind,
        message: impl Into<String>,
        position: Option<usize>,
        input: &str,
    ) -> Self {
        MolError {
            kind,
            message: message.into(),
            position,
            input: input.to_string(),
        }
    }
}

impl MolError {
    /// The error on one line, without the input and caret (for JSON and
    /// logs): `syntax error at character 3: unexpected character 'X'`.
    pub fn one_line(&self) -> String {
        match self.position {
            Some(p) => format!(
                "{} error at character {}: {}",
                self.kind.name(),
                p,
                self.message
            ),
            None => format!("{} error: {}", self.kind.name(), self.message),
        }
    }
}

/// Three lines: the one-line form, the input, and a caret under the
/// position (character-based, so it lines up for any ASCII input).
impl fmt::Display for MolError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.one_line())?;
        if let Some(p) = self.position {
            // Control characters would break the layout; show them as spaces.
            let shown: String = self
                .input
                .chars()
                .map(|c| if c.is_control() { ' ' } else { c })
                .collect();
            write!(f, "\n  {}\n  {}^", shown, " ".repeat(p))?;
        }
        Ok(())
    }
}

impl std::error::Error for MolError {}
