//! The data advice is worked out from: a base catalogue and the practice
//! data validated against it, either the embedded files or the caller's own.

use super::catalogue::{catalogue, Catalogue, CatalogueError};
use super::practice::{practice, Practice};

/// A base catalogue and the practice data parsed against it: everything
/// [`advise_using`](super::advise_using) reads besides the molecule, its
/// sites and the options.
///
/// [`AdviceData::embedded`] gives the files built into the crate
/// (`fragments/bases.tsv` and the practice files), which [`advise`](super::advise)
/// uses; [`AdviceData::new`] pairs a catalogue and practice data the caller
/// parsed from its own files with [`Catalogue::parse`] and
/// [`Practice::parse`]. The advice borrows base names from the catalogue, so
/// it lives no longer than the data (`Advice<'d>`).
///
/// # Example
///
/// ```
/// use acidsite::advice::practice::{Practice, EMBEDDED};
/// use acidsite::advice::{AdviceData, Catalogue};
///
/// // The embedded catalogue with LDA's line left out, as a caller would
/// // read its own copy of fragments/bases.tsv.
/// let text: String = include_str!("../../fragments/bases.tsv")
///     .lines()
///     .filter(|l| !l.starts_with("LDA\t"))
///     .map(|l| format!("{l}\n"))
///     .collect();
/// let sources = include_str!("../../fragments/sources.tsv");
/// let cat = Catalogue::parse(&text, "my_bases.tsv", sources).expect("valid catalogue");
/// assert!(cat.get("LDA").is_none());
/// // The practice data name LDA, so they no longer validate against it …
/// assert!(Practice::parse(&EMBEDDED, &cat).is_err());
/// // … while practice data parsed against the embedded catalogue are
/// // refused for this one (its base slots differ).
/// let embedded = AdviceData::embedded().expect("embedded data are valid");
/// assert!(AdviceData::new(&cat, embedded.practice()).is_err());
/// ```
#[derive(Debug, Clone, Copy)]
pub struct AdviceData<'d> {
    catalogue: &'d Catalogue,
    practice: &'d Practice,
}

impl<'d> AdviceData<'d> {
    /// Pairs a catalogue with practice data parsed against it
    /// ([`Practice::parse`] with this catalogue, or with one that has the
    /// same bases in the same order). Error when the practice data were
    /// validated against other bases: their per-base tables would point at
    /// the wrong entries.
    pub fn new(catalogue: &'d Catalogue, practice: &'d Practice) -> Result<Self, CatalogueError> {
        let same = practice.base_names.len() == catalogue.bases.len()
            && practice
                .base_names
                .iter()
                .zip(&catalogue.bases)
                .all(|(n, b)| *n == b.name);
        if !same {
            let first_difference = (0..practice.base_names.len().max(catalogue.bases.len()))
                .find(|&i| {
                    practice.base_names.get(i).map(String::as_str)
                        != catalogue.bases.get(i).map(|b| b.name.as_str())
                })
                .unwrap_or(0);
            let name = |n: Option<&str>| n.map(|n| format!("{n:?}")).unwrap_or("none".into());
            return Err(CatalogueError {
                file: "practice data".to_string(),
                line: 1,
                column: None,
                message: format!(
                    "validated against another base catalogue: base {} is {} there and {} here; parse the practice data with this catalogue",
                    first_difference + 1,
                    name(practice.base_names.get(first_difference).map(String::as_str)),
                    name(catalogue.bases.get(first_difference).map(|b| b.name.as_str())),
                ),
            });
        }
        Ok(AdviceData {
            catalogue,
            practice,
        })
    }

    /// The base catalogue.
    pub fn catalogue(&self) -> &'d Catalogue {
        self.catalogue
    }

    /// The practice data.
    pub fn practice(&self) -> &'d Practice {
        self.practice
    }
}

impl AdviceData<'static> {
    /// The embedded catalogue and practice data, validated on first use
    /// (an error here is a defect of the build, not of the input).
    pub fn embedded() -> Result<Self, CatalogueError> {
        Ok(AdviceData {
            catalogue: catalogue()?,
            practice: practice()?,
        })
    }
}
