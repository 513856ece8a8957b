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
