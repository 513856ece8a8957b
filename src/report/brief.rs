//! Brief records for bulk work (`annotate --detail brief`): the answer
//! without the wording. A full record is mostly text that is the same for
//! every molecule (cautions, the reason for each ruled-out base); a brief
//! record keeps the sites, the recommended base, equivalents, conversion,
//! solvent, temperature and warnings, and names the cautions and rejected
//! bases by id only. The full wording of a base's cautions comes once from
//! `acidsite bases NAME --json` (key `cautions`); the one-line caution of
//! the recommended base stays in the record, so hazards and the deferral to
//! local rules travel with every recommendation.
//!
//! ```
//! use acidsite::report::{analyze, Detail, Options};
//! let opts = Options { detail: Detail::Brief, ..Options::default() };
//! let rec = analyze("CC(=O)c1ccccc1", 1, None, &opts);
//! let line = rec.to_brief_json_line();
//! assert!(line.starts_with("{\"schema\":\"acidsite-brief/1\""));
//! assert!(line.len() < 1500);
//! ```
//!
//! # Keys (schema `acidsite-brief/1`)
//!
//! | key | type | meaning |
//! |---|---|---|
//! | `schema` | string | `"acidsite-brief/1"` |
//! | `line`, `id`, `input`, `ok`, `columns` | | as in the full record |
//! | `formula`, `rule_set` | string | on success, as in the full record |
//! | `sites` | array | on success, most acidic first (the rank is the place in the array; background C–H sites (unactivated alkane, aryl, vinyl …), listed last in the full record, are left out): `atoms`, `element`, `h` (acidic hydrogens), `class`, `dmso` and `water` (pKa estimates, each absent when there is none), `sd` (one standard uncertainty), and `regio` when the site has an enolate side |
//! | `advice` | object or null | `target` and `base` (null when no base fits), and when they have a value `equivalents`, `conversion`, `solvent`, `temperature_c`, `temperature_range_c`, `scale`, as in the full record (absent, not null, otherwise); `warnings` (the first sentence of each: what and where); `caution` (one line for the recommended base; absent when it has no listed hazard); `cautions` (ids: base names, `general` for the caution covering every reagent); `rejected` (base names) |
//! | `advice_note`, `flags`, `error` | | as in the full record |

use super::json;
use super::record::{Record, SiteOut};
use crate::advice::SHORT_DEFERRAL;
use serde::Serialize;

/// Version of the brief record schema.
pub const BRIEF_SCHEMA: &str = "acidsite-brief/1";

/// Id of the caution that covers every reagent named in the advice.
pub const GENERAL_CAUTION_ID: &str = "general";

/// How much a record says.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[non_exhaustive]
pub enum Detail {
    /// Every key of the `acidsite-record` schema, cautions and reasons worded.
    #[default]
    Full,
    /// The `acidsite-brief` schema: the answer, with ids instead of wording.
    Brief,
}

#[derive(Serialize)]
struct Brief<'a> {
    schema: &'static str,
    line: u64,
    id: Option<&'a str>,
    input: &'a str,
    ok: bool,
    #[serde(skip_serializing_if = "Option::is_none")]
    columns: Option<&'a super::record::Pairs<String>>,
    #[serde(skip_serializing_if = "Option::is_none")]
    formula: Option<&'a str>,
    #[serde(skip_serializing_if = "Option::is_none")]
    rule_set: Option<&'static str>,
    #[serde(skip_serializing_if = "Option::is_none")]
    sites: Option<Vec<BriefSite<'a>>>,
    #[serde(skip_serializing_if = "Option::is_none")]
    advice: Option<Option<BriefAdvice<'a>>>,
    #[serde(skip_serializing_if = "Option::is_none")]
    advice_note: Option<&'a str>,
    #[serde(skip_serializing_if = "Option::is_none")]
    flags: Option<&'a super::record::Pairs<u64>>,
    #[serde(skip_serializing_if = "Option::is_none")]
    error: Option<&'a super::record::ErrorOut>,
}

#[derive(Serialize)]
struct BriefSite<'a> {
    atoms: &'a [usize],
    element: &'a str,
    h: u8,
    class: &'a str,
    #[serde(skip_serializing_if = "Option::is_none")]
    dmso: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    water: Option<f64>,
    sd: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    regio: Option<&'static str>,
}

#[derive(Serialize)]
struct BriefAdvice<'a> {
    target: &'a [usize],
    base: Option<&'a str>,
    #[serde(skip_serializing_if = "Option::is_none")]
    equivalents: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    conversion: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    solvent: Option<&'a str>,
    #[serde(skip_serializing_if = "Option::is_none")]
    temperature_c: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    temperature_range_c: Option<[f64; 2]>,
    #[serde(skip_serializing_if = "Option::is_none")]
    scale: Option<&'static str>,
    warnings: Vec<&'a str>,
    #[serde(skip_serializing_if = "Option::is_none")]
    caution: Option<String>,
    cautions: Vec<&'a str>,
    rejected: Vec<&'static str>,
}

fn site(s: &SiteOut) -> BriefSite<'_> {
    BriefSite {
        atoms: &s.atoms,
        element: &s.element,
        h: s.hydrogens,
        class: &s.class,
        dmso: s.pka_dmso,
        water: s.pka_water,
        sd: s.uncertainty,
        regio: s.regio,
    }
}

/// The first sentence of a warning (up to a full stop followed by a space
/// and a capital letter): what and where; the explanation that follows is
/// the same for every molecule and stays in the full record.
pub fn first_sentence(text: &str) -> &str {
    let b = text.as_bytes();
    let mut i = 0;
    while let Some(k) = text[i..].find(". ") {
        let at = i + k;
        if b.get(at + 2).is_some_and(|c| c.is_ascii_uppercase()) {
            return &text[..at + 1];
        }
        i = at + 2;
    }
    text
}

impl Record {
    /// Append the brief form of this record (schema [`BRIEF_SCHEMA`]) as one
    /// JSON object, without a line break.
    pub fn write_brief_json(&self, out: &mut Vec<u8>) {
        let advice = self.advice.as_ref().map(|a| {
            a.as_ref().map(|a| {
                let caution = a
                    .base
                    .as_deref()
                    .and_then(|b| a.cautions.iter().find(|c| c.reagent == b))
                    .filter(|c| !c.hazards.is_empty())
                    .map(|c| format!("{}: {}. {SHORT_DEFERRAL}", c.reagent, c.hazards.join(", ")));
                BriefAdvice {
                    target: &a.target,
                    base: a.base.as_deref(),
                    equivalents: a.equivalents,
                    conversion: a.conversion,
                    solvent: a.solvent.as_deref(),
                    temperature_c: a.temperature_c,
                    temperature_range_c: a.temperature_range_c,
                    scale: a.scale,
                    warnings: a.warnings.iter().map(|w| first_sentence(w)).collect(),
                    caution,
                    cautions: a
                        .cautions
                        .iter()
                        .map(|c| {
                            // The one caution without hazards of its own is the general one.
                            if c.hazards.is_empty() && c.full {
                                GENERAL_CAUTION_ID
                            } else {
                                c.reagent.as_str()
                            }
                        })
                        .collect(),
                    rejected: a.rejected.iter().map(|r| r.base).collect(),
                }
            })
        });
        let brief = Brief {
            schema: BRIEF_SCHEMA,
            line: self.line,
            id: self.id.as_deref(),
            input: &self.input,
            ok: self.ok,
            columns: self.columns.as_ref(),
            formula: self.formula.as_deref(),
            rule_set: self.rule_set,
            // Background (unactivated alkane, aryl, vinyl …) C–H sites come last and are
            // left out: the brief keeps the answer.
            sites: self
                .sites
                .as_ref()
                .map(|s| s.iter().filter(|s| !s.background).map(site).collect()),
            advice,
            advice_note: self.advice_note.as_deref(),
            flags: self.flags.as_ref(),
            error: self.error.as_ref(),
        };
        // Serializing plain data into a Vec cannot fail; should it, the
        // record still gets a valid line.
        if serde_json::to_writer(&mut *out, &brief).is_err() {
            out.extend_from_slice(b"{\"schema\":");
            json::string(out, BRIEF_SCHEMA);
            out.extend_from_slice(b",\"ok\":false}");
        }
    }

    /// The brief record as one JSON line (no trailing newline).
    pub fn to_brief_json_line(&self) -> String {
        let mut out = Vec::with_capacity(1 << 10);
        self.write_brief_json(&mut out);
        String::from_utf8(out)
            .unwrap_or_else(|e| String::from_utf8_lossy(e.as_bytes()).into_owned())
    }
}
