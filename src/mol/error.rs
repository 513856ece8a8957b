//! Typed errors of the molecule core.

use std::fmt;

/// What went wrong while reading a SMILES string.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum ErrorKind {
    Empty,
    Syntax,
    RingClosure,
    Aromaticity,
    Valence,
    Unsupported,
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
    pub kind: ErrorKind,
    pub message: String,
    pub position: Option<usize>,
    pub input: String,
}

impl MolError {
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

impl fmt::Display for MolError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.position {
            Some(p) => write!(
                f,
                "{} error at character {}: {}",
                self.kind.name(),
                p,
                self.message
            ),
            None => write!(f, "{} error: {}", self.kind.name(), self.message),
        }
    }
}

impl std::error::Error for MolError {}
