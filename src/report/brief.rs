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
//! assert!(line.starts_with("{\"schema\":\"acidsite-brief/2\""));
//! assert!(line.len() < 1500);
//! ```
//!
//! # Keys (schema `acidsite-brief/2`)
//!
//! | key | type | meaning |
//! |---|---|---|
//! | `schema` | string | `"acidsite-brief/2"` (`/2` added `hazards`) |
//! | `line`, `id`, `input`, `ok`, `columns` | | as in the full record |
//! | `formula`, `rule_set` | string | on success, as in the full record |
//! | `sites` | array | on success, most acidic first (the rank is the place in the array; background C–H sites (unactivated alkane, aryl, vinyl …), listed last in the full record, are left out): `atoms`, `element`, `h` (acidic hydrogens), `class`, `dmso` and `water` (pKa estimates, each absent when there is none), `sd` (one standard uncertainty), and `regio` when the site has an enolate side |
//! | `advice` | object or null | `target` and `base` (null when no base fits), and when they have a value `equivalents`, `conversion`, `solvent`, `temperature_c`, `temperature_range_c`, `scale`, as in the full record (absent, not null, otherwise); `warnings` (the first sentence of each: what and where); `caution` (one line for the recommended base; absent when it has no listed hazard); `cautions` (ids: base names, `general` for the caution covering every reagent); `rejected` (base names) |
//! | `hazards` | array of string | only when the substrate itself is a hazard: the ids of `fragments/hazards.tsv` found (the wording: the full record or that file) |
//! | `advice_note`, `flags`, `error` | | as in the full record |

use super::json;
use super::record::{AdviceOut, CautionOut, Record, SiteOut};
use crate::advice::SHORT_DEFERRAL;

/// Version of the brief record schema.
pub const BRIEF_SCHEMA: &str = "acidsite-brief/2";

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

/// Append `,"key":` and the float when there is one (absent otherwise).
fn opt_float_key(out: &mut Vec<u8>, key: &[u8], x: Option<f64>) {
    if let Some(x) = x {
        out.extend_from_slice(key);
        json::float(out, x);
    }
}

/// Append `,"key":` and the string when there is one (absent otherwise).
fn opt_string_key(out: &mut Vec<u8>, key: &[u8], x: Option<&str>) {
    if let Some(x) = x {
        out.extend_from_slice(key);
        json::string(out, x);
    }
}

/// One site of a brief record (the keys of the schema table above).
fn write_site(out: &mut Vec<u8>, s: &SiteOut) {
    out.extend_from_slice(b"{\"atoms\":");
    json::indices(out, &s.atoms);
    out.extend_from_slice(b",\"element\":");
    json::string(out, &s.element);
    out.extend_from_slice(b",\"h\":");
    json::uint(out, u64::from(s.hydrogens));
    out.extend_from_slice(b",\"class\":");
    json::string(out, &s.class);
    opt_float_key(out, b",\"dmso\":", s.pka_dmso);
    opt_float_key(out, b",\"water\":", s.pka_water);
    out.extend_from_slice(b",\"sd\":");
    json::float(out, s.uncertainty);
    opt_string_key(out, b",\"regio\":", s.regio);
    out.push(b'}');
}

/// The one-line caution of the recommended base: "NAME: hazard, hazard.
/// DEFERRAL" (None when it has no listed hazard).
fn brief_caution(a: &AdviceOut) -> Option<String> {
    let base = a.base.as_deref()?;
    let c = a.cautions.iter().find(|c| c.reagent == base)?;
    if c.hazards.is_empty() {
        return None;
    }
    let mut t = String::with_capacity(c.reagent.len() + SHORT_DEFERRAL.len() + 64);
    t.push_str(&c.reagent);
    t.push_str(": ");
    for (k, h) in c.hazards.iter().enumerate() {
        if k > 0 {
            t.push_str(", ");
        }
        t.push_str(h);
    }
    t.push_str(". ");
    t.push_str(SHORT_DEFERRAL);
    Some(t)
}

/// The id of a caution in a brief record: the base name, or
/// [`GENERAL_CAUTION_ID`] for the one caution without hazards of its own.
fn caution_id(c: &CautionOut) -> &str {
    if c.hazards.is_empty() && c.full {
        GENERAL_CAUTION_ID
    } else {
        c.reagent.as_str()
    }
}

/// The advice of a brief record (the keys of the schema table above).
fn write_advice(out: &mut Vec<u8>, a: &AdviceOut) {
    out.extend_from_slice(b"{\"target\":");
    json::indices(out, &a.target);
    out.extend_from_slice(b",\"base\":");
    json::opt_string(out, a.base.as_deref());
    opt_float_key(out, b",\"equivalents\":", a.equivalents);
    opt_float_key(out, b",\"conversion\":", a.conversion);
    opt_string_key(out, b",\"solvent\":", a.solvent.as_deref());
    opt_float_key(out, b",\"temperature_c\":", a.temperature_c);
    if let Some(p) = &a.temperature_range_c {
        out.extend_from_slice(b",\"temperature_range_c\":");
        json::pair(out, p);
    }
    opt_string_key(out, b",\"scale\":", a.scale);
    out.extend_from_slice(b",\"warnings\":");
    json::array(out, &a.warnings, |o, w| json::string(o, first_sentence(w)));
    opt_string_key(out, b",\"caution\":", brief_caution(a).as_deref());
    out.extend_from_slice(b",\"cautions\":");
    json::array(out, &a.cautions, |o, c| json::string(o, caution_id(c)));
    out.extend_from_slice(b",\"rejected\":");
    json::array(out, &a.rejected, |o, r| json::string(o, r.base));
    out.push(b'}');
}

impl Record {
    /// Append the brief form of this record (schema [`BRIEF_SCHEMA`]) as one
    /// JSON object, without a line break.
    ///
    /// Written with the record's own JSON writer (`report::json`: the bytes
    /// `serde_json` makes, without the serde data model, which cost about
    /// three times as much on the bulk path); the test
    /// `write_brief_json_given_records_matches_serde` compares it with the
    /// serde form of the same keys.
    pub fn write_brief_json(&self, out: &mut Vec<u8>) {
        self.write_json_head(out, BRIEF_SCHEMA);
        if let Some(r) = self.rule_set {
            out.extend_from_slice(b",\"rule_set\":");
            json::string(out, r);
        }
        if let Some(sites) = &self.sites {
            // Background (unactivated alkane, aryl, vinyl …) C–H sites come
            // last and are left out: the brief keeps the answer.
            out.extend_from_slice(b",\"sites\":[");
            for (k, s) in sites.iter().filter(|s| !s.background).enumerate() {
                if k > 0 {
                    out.push(b',');
                }
                write_site(out, s);
            }
            out.push(b']');
        }
        if let Some(a) = &self.advice {
            out.extend_from_slice(b",\"advice\":");
            match a {
                Some(a) => write_advice(out, a),
                None => out.extend_from_slice(b"null"),
            }
        }
        if let Some(n) = &self.advice_note {
            out.extend_from_slice(b",\"advice_note\":");
            json::string(out, n);
        }
        if let Some(h) = &self.hazards {
            out.extend_from_slice(b",\"hazards\":");
            json::array(out, h, |o, h| json::string(o, &h.id));
        }
        if let Some(f) = &self.flags {
            out.extend_from_slice(b",\"flags\":");
            f.write_json(out, |o, v| json::uint(o, *v));
        }
        if let Some(e) = &self.error {
            out.extend_from_slice(b",\"error\":");
            e.write_json(out);
        }
        out.push(b'}');
    }

    /// The brief record as one JSON line (no trailing newline).
    pub fn to_brief_json_line(&self) -> String {
        let mut out = Vec::with_capacity(1 << 10);
        self.write_brief_json(&mut out);
        String::from_utf8(out)
            .unwrap_or_else(|e| String::from_utf8_lossy(e.as_bytes()).into_owned())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::{analyze, Options};
    use serde::Serialize;

    // The brief form as it was written through serde before the hand
    // writer (issue 14): the reference the hand writer is held to.
    #[derive(Serialize)]
    struct Brief<'a> {
        schema: &'static str,
        line: u64,
        id: Option<&'a str>,
        input: &'a str,
        ok: bool,
        #[serde(skip_serializing_if = "Option::is_none")]
        columns: Option<&'a crate::report::record::Pairs<String>>,
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
        hazards: Option<Vec<&'a str>>,
        #[serde(skip_serializing_if = "Option::is_none")]
        flags: Option<&'a crate::report::record::Pairs<u64>>,
        #[serde(skip_serializing_if = "Option::is_none")]
        error: Option<&'a crate::report::record::ErrorOut>,
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

    fn serde_brief(r: &Record) -> String {
        let advice = r.advice.as_ref().map(|a| {
            a.as_ref().map(|a| BriefAdvice {
                target: &a.target,
                base: a.base.as_deref(),
                equivalents: a.equivalents,
                conversion: a.conversion,
                solvent: a.solvent.as_deref(),
                temperature_c: a.temperature_c,
                temperature_range_c: a.temperature_range_c,
                scale: a.scale,
                warnings: a.warnings.iter().map(|w| first_sentence(w)).collect(),
                caution: a
                    .base
                    .as_deref()
                    .and_then(|b| a.cautions.iter().find(|c| c.reagent == b))
                    .filter(|c| !c.hazards.is_empty())
                    .map(|c| format!("{}: {}. {SHORT_DEFERRAL}", c.reagent, c.hazards.join(", "))),
                cautions: a.cautions.iter().map(caution_id).collect(),
                rejected: a.rejected.iter().map(|r| r.base).collect(),
            })
        });
        let brief = Brief {
            schema: BRIEF_SCHEMA,
            line: r.line,
            id: r.id.as_deref(),
            input: &r.input,
            ok: r.ok,
            columns: r.columns.as_ref(),
            formula: r.formula.as_deref(),
            rule_set: r.rule_set,
            sites: r
                .sites
                .as_ref()
                .map(|s| s.iter().filter(|s| !s.background).map(site).collect()),
            advice,
            advice_note: r.advice_note.as_deref(),
            hazards: r
                .hazards
                .as_ref()
                .map(|h| h.iter().map(|h| h.id.as_str()).collect()),
            flags: r.flags.as_ref(),
            error: r.error.as_ref(),
        };
        serde_json::to_string(&brief).expect("serializable")
    }

    #[test]
    fn write_brief_json_given_records_matches_serde() {
        // Drug-like molecules (acetophenone, a protected amino ester, a
        // phenol with a carboxylic acid, a salt), a molecule with a ketone
        // side, one with no acidic site, text that needs escaping in the id
        // and failures: every key of the brief form at least once.
        let inputs = [
            "CC(=O)c1ccccc1",
            "CC(C)(C)OC(=O)NC(C)C(=O)OC",
            "OC(=O)c1ccc(O)cc1",
            "CC[NH3+].[Cl-]",
            "CC1CCCCC1=O",
            "C",
            "[Si](C)(C)(C)C",
            "C1CC",
            "c1cccc1",
            "",
        ];
        let opts = [
            Options {
                detail: Detail::Brief,
                ..Options::default()
            },
            Options {
                detail: Detail::Brief,
                sites_only: true,
                ..Options::default()
            },
            Options {
                detail: Detail::Brief,
                base: Some("NaOH".into()),
                ..Options::default()
            },
        ];
        for o in &opts {
            for (k, smi) in inputs.iter().enumerate() {
                let id = Some(format!("m\"{k}\\\u{1}é"));
                let rec = analyze(smi, k as u64 + 1, id, o);
                assert_eq!(rec.to_brief_json_line(), serde_brief(&rec), "{smi}");
            }
        }
    }
}
