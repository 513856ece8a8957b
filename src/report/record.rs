//! The output record: one per input molecule, serialized as one JSON Lines
//! line by `acidsite annotate` and `acidsite scan --json`.
//!
//! These serialization types are kept apart from the library types
//! ([`crate::sites::Site`], [`crate::advice`]) so that the library can change
//! without changing the published schema. The schema is versioned by
//! [`SCHEMA`]; a key is never renamed or removed without a new version.
//!
//! # Keys
//!
//! Always present:
//!
//! | key | type | meaning |
//! |---|---|---|
//! | `schema` | string | schema version, currently `"acidsite-record/2"` |
//! | `line` | integer | 1-based line number of the record in its input (for `scan`, the 1-based position of the argument) |
//! | `id` | string or null | the record's identifier (second field of a `.smi` line, the id column of a CSV/TSV file) |
//! | `input` | string | the SMILES as read (non-UTF-8 bytes replaced by U+FFFD) |
//! | `ok` | bool | true when the SMILES was read and analysed |
//! | `columns` | object | only for CSV/TSV input: the other columns of the row, carried through by header name |
//!
//! On success (`ok: true`):
//!
//! | key | type | meaning |
//! |---|---|---|
//! | `formula` | string | molecular formula of the whole input, Hill order, every H counted, no charge |
//! | `components` | array | each `.`-separated component: `role` (`"main"` or `"counter_ion"`), `smiles` (its text in the input), `formula`, `charge` |
//! | `rule_set` | string | version of the fragment rule set used |
//! | `sites` | array | acidic sites, ranked most acidic first (see [`SiteOut`]) |
//! | `advice` | object or null | base advice for the target site (see [`AdviceOut`]); null when the molecule has no site to target |
//! | `advice_note` | string | only when `advice` is null: why |
//! | `mapped_smiles` | string | the input with each site's atoms written as bracket atoms carrying the site's rank as atom-map number |
//! | `flags` | object | only with `--flag NAME=SMARTS`: `{NAME: number of unique matches}` in the order given |
//!
//! On failure (`ok: false`): `error` with `kind` (`syntax`, `ring_closure`,
//! `aromaticity`, `valence`, `unsupported`, `too_large`, `empty`, `encoding`,
//! `columns`), `message`, and `position` (0-based character index in
//! `input`, or null).
//!
//! Numbers: pKa values and uncertainties are rounded to 0.01, conversion (a
//! fraction 0..1) to 1e-6, equivalents to 0.01.

use serde::ser::{SerializeMap, Serializer};
use serde::{Deserialize, Serialize};

/// Most alternatives listed in a record (`alternatives_omitted` counts
/// the rest).
pub const MAX_ALTERNATIVES: usize = 5;

/// Version of the record schema, stamped into every record as `schema`.
pub const SCHEMA: &str = "acidsite-record/2";

/// One output record (see the module documentation for the keys).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Record {
    pub schema: &'static str,
    pub line: u64,
    pub id: Option<String>,
    pub input: String,
    pub ok: bool,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub columns: Option<Pairs<String>>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub formula: Option<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub components: Option<Vec<ComponentOut>>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub rule_set: Option<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub sites: Option<Vec<SiteOut>>,
    /// `Some(None)` serializes as `"advice": null` (no target site).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub advice: Option<Option<AdviceOut>>,
    /// Why `advice` is null (no site with an estimate, `--site` atom not
    /// acidic); absent when there is advice.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub advice_note: Option<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub mapped_smiles: Option<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub flags: Option<Pairs<u64>>,
    #[serde(skip_serializing_if = "Option::is_none")]
    pub error: Option<ErrorOut>,
}

impl Record {
    /// A failed record: the input could not be read or analysed.
    pub fn failure(line: u64, id: Option<String>, input: String, error: ErrorOut) -> Record {
        Record {
            schema: SCHEMA,
            line,
            id,
            input,
            ok: false,
            columns: None,
            formula: None,
            components: None,
            rule_set: None,
            sites: None,
            advice: None,
            advice_note: None,
            mapped_smiles: None,
            flags: None,
            error: Some(error),
        }
    }

    /// The record as one JSON line (no trailing newline).
    pub fn to_json_line(&self) -> String {
        // Serializing these plain types cannot fail (no maps with non-string
        // keys, no non-finite floats: see `round`).
        serde_json::to_string(self).unwrap_or_else(|e| {
            format!(
                "{{\"schema\":\"{SCHEMA}\",\"line\":{},\"ok\":false,\"error\":{{\"kind\":\"internal\",\"message\":{},\"position\":null}}}}",
                self.line,
                serde_json::Value::String(e.to_string())
            )
        })
    }

    /// The most acidic C–H site, if any (sites are ranked).
    pub fn top_carbon_site(&self) -> Option<&SiteOut> {
        self.sites.as_ref()?.iter().find(|s| s.element == "C")
    }
}

/// Key/value pairs serialized as a JSON object in their given order.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Pairs<V>(pub Vec<(String, V)>);

impl<V: Serialize> Serialize for Pairs<V> {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut map = s.serialize_map(Some(self.0.len()))?;
        for (k, v) in &self.0 {
            map.serialize_entry(k, v)?;
        }
        map.end()
    }
}

/// One `.`-separated component of the input.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ComponentOut {
    /// `"main"` (the component analysed) or `"counter_ion"`.
    pub role: String,
    /// The component's text in the input SMILES.
    pub smiles: String,
    pub formula: String,
    /// Net formal charge.
    pub charge: i32,
}

/// One acidic site.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SiteOut {
    /// 1-based rank (1 = most acidic); also the atom-map number in `mapped_smiles`.
    pub rank: u32,
    /// Symmetry-equivalent atoms of the site (0-based, input order).
    pub atoms: Vec<usize>,
    /// Element of the acidic atom: `C`, `N`, `O` or `S`.
    pub element: String,
    /// Hydrogens on each atom of the site.
    pub hydrogens: u8,
    /// Class name from the rule data.
    pub class: String,
    pub pka_dmso: Option<f64>,
    pub pka_water: Option<f64>,
    /// One standard uncertainty of the estimates, pKa units.
    pub uncertainty: f64,
    /// Rules applied, with their contributions (the estimate is their sum).
    pub rules: Vec<RuleOut>,
    /// `"kinetic"`, `"thermodynamic"` or null.
    pub regio: Option<String>,
}

/// One applied rule and its contribution on each scale.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RuleOut {
    pub id: String,
    pub dmso: Option<f64>,
    pub water: Option<f64>,
}

/// Base advice for one target site.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct AdviceOut {
    /// Atoms of the target site.
    pub target: Vec<usize>,
    /// How the target was chosen (default most acidic C–H, or `--site`).
    pub target_note: String,
    /// Recommended (or requested) base, short trade name; null when no
    /// catalogue base qualifies.
    pub base: Option<String>,
    /// Equivalents of base per equivalent of substrate (protons removed
    /// before the target counted, plus the stated practical excess).
    pub equivalents: Option<f64>,
    /// How the equivalents were reached.
    pub equivalents_note: String,
    /// Protons the base removes before the target.
    pub counted: Vec<CountedOut>,
    /// Predicted fraction of the target deprotonated at equilibrium (0..1).
    pub conversion: Option<f64>,
    pub solvent: Option<String>,
    /// Temperature to start at, °C (low end of `temperature_range_c`).
    pub temperature_c: Option<f64>,
    /// Usual working range, °C: `[low, high]`.
    pub temperature_range_c: Option<[f64; 2]>,
    /// pKa scale the comparison used: `"dmso"`, `"water"` or `"thf"`.
    pub scale: Option<String>,
    /// Why that scale, with the base's conjugate-acid pKa and its source.
    pub scale_note: String,
    /// Other acceptable bases, best first: at most
    /// [`MAX_ALTERNATIVES`] (the mildest, most common ones).
    pub alternatives: Vec<AlternativeOut>,
    /// How many further acceptable bases were left out of `alternatives`
    /// (see `acidsite scan` or the library for all of them).
    pub alternatives_omitted: usize,
    /// Bases ruled out, each with its reason.
    pub rejected: Vec<RejectedOut>,
    /// Chemistry warnings (side reactions, selectivity, proton counting).
    pub warnings: Vec<String>,
    /// Kinetic and thermodynamic conditions for an unsymmetrical ketone.
    pub regio_conditions: Option<RegioOut>,
    /// Safety cautions for the hazardous reagents named (recommended base
    /// first), each closing with the deferral to local regulations, the
    /// safety data sheet and the judgement of qualified chemists.
    pub cautions: Vec<CautionOut>,
    /// Version of the base catalogue used.
    pub catalogue: String,
}

/// A safety caution for one reagent.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CautionOut {
    /// Reagent named (or "all reagents named" for the general caution).
    pub reagent: String,
    /// Hazard codes: `pyrophoric`, `water-reactive`, `hydrogen-evolution`,
    /// `corrosive`, `toxic`, `cryogenic`, `flammable`, `irritant`.
    pub hazards: Vec<String>,
    /// Text ending with the deferral to local regulations, the safety data
    /// sheet and qualified chemists: handling advice per hazard when `full`,
    /// else one line of hazard words.
    pub text: String,
    /// True for a full caution (the recommended base, the reagents of the
    /// kinetic and thermodynamic conditions, the general caution); false for
    /// the one-line caution of another named alternative.
    pub full: bool,
}

/// A proton removed before the target.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CountedOut {
    pub atoms: Vec<usize>,
    pub class: String,
    pub protons: usize,
    pub reason: String,
}

/// An acceptable base other than the recommendation.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct AlternativeOut {
    pub base: String,
    pub equivalents: f64,
    pub conversion: f64,
    pub solvent: String,
    pub temperature_range_c: [f64; 2],
    pub note: String,
}

/// Conditions for each side of an unsymmetrical ketone.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RegioOut {
    pub kinetic: RegioSideOut,
    pub thermodynamic: RegioSideOut,
}

/// Conditions favouring one enolate side.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RegioSideOut {
    pub base: String,
    pub equivalents: f64,
    pub solvent: String,
    pub temperature_range_c: [f64; 2],
    pub procedure: String,
    /// Atoms of the α-carbon this side deprotonates.
    pub favours: Vec<usize>,
}

/// A base ruled out, with the reason.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RejectedOut {
    pub base: String,
    /// Short reason code: `too-weak`, `nucleophile`, `transesterification`,
    /// `hydrolysis`, `uncounted-proton`, `no-comparable-pka`.
    pub kind: String,
    pub reason: String,
}

/// Why a record failed.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ErrorOut {
    pub kind: String,
    pub message: String,
    /// 0-based character index into `input`, or null.
    pub position: Option<usize>,
}

/// Round to `step` (0.01, 0.1, ...: a power of ten), mapping non-finite
/// values to None. Dividing the rounded integer by the exact power of ten
/// gives the double nearest the decimal, so JSON shows e.g. `26.4`, not
/// `26.400000000000002`.
pub(crate) fn round(x: f64, step: f64) -> Option<f64> {
    if !x.is_finite() {
        return None;
    }
    let inv = (1.0 / step).round();
    Some((x * inv).round() / inv)
}
