//! The output record: one per input molecule, serialized as one JSON Lines
//! line by `acidsite annotate` and `acidsite scan --json`.
//!
//! These serialization types are kept apart from the library types
//! ([`crate::sites::Site`], [`crate::advice`]) so that the library can change
//! without changing the published schema. The schema is versioned by
//! [`SCHEMA`]; a key is never renamed or removed without a new version.
//!
//! A record owns its text, moved in from the library's results rather than
//! copied. [`Record::write_json`] writes it with a small hand-written writer
//! that gives exactly the bytes `serde_json` gives for the same record
//! through the derived `Serialize` implementations (which stay, for callers
//! that want them and as the reference the tests compare against).
//!
//! # Keys
//!
//! Always present:
//!
//! | key | type | meaning |
//! |---|---|---|
//! | `schema` | string | schema version, currently `"acidsite-record/4"` (`/4` added `hazards`) |
//! | `line` | integer | 1-based line number of the record in its input (for an SD record its first line; for `scan`, the 1-based position of the argument) |
//! | `id` | string or null | the record's identifier (second field of a `.smi` line, the id column of a CSV/TSV file, the title line or `--id-field` item of an SD record) |
//! | `input` | string | the SMILES as read (non-UTF-8 bytes replaced by U+FFFD); for a molfile, a SMILES of the molecule written by the reader (atom indices stay the molfile's) |
//! | `ok` | bool | true when the SMILES was read and analysed |
//! | `columns` | object | only for CSV/TSV input: the other columns of the row, carried through by header name; for SD input, the record's data items |
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
//! | `hazards` | array | only when the substrate itself is a hazard (`fragments/hazards.tsv`, whether or not there is advice): `id` and `text` (the caution) per hazard found |
//! | `mapped_smiles` | string | the input with each site's atoms written as bracket atoms carrying the site's rank as atom-map number (background C–H sites: unactivated alkane, aryl, vinyl …, ranked last, are not labelled) |
//! | `flags` | object | only with `--flag NAME=SMARTS`: `{NAME: number of unique matches}` in the order given (at most 10,000 matches and 10^7 matcher steps per pattern and molecule) |
//! | `flag_warnings` | array of string | only when a `--flag` count reached a bound: the pattern and the bound; its count is then a lower bound |
//!
//! On failure (`ok: false`): `error` with `kind` (`syntax`, `ring_closure`,
//! `aromaticity`, `valence`, `unsupported`, `too_large`, `empty`, `encoding`,
//! `columns`, `molfile` for a connection table that cannot be read, with the
//! file line in the message), `message`, and `position` (0-based character index in
//! `input`, or null).
//!
//! Numbers: pKa values and uncertainties are rounded to 0.01, conversion (a
//! fraction 0..1) to 1e-6, equivalents to 0.01.
//!
//! ```
//! use acidsite::report::record::FAILED_INPUT_ECHO;
//! use acidsite::report::{analyze, Options};
//!
//! let rec = analyze("CC(=O)OC", 3, Some("methyl acetate".into()), &Options::default());
//! // The hand-written writer gives exactly serde_json's bytes.
//! assert_eq!(rec.to_json_line(), serde_json::to_string(&rec).unwrap());
//!
//! // A failed record echoes at most FAILED_INPUT_ECHO characters of its
//! // input, marked with an ellipsis, and says how long the input was.
//! let junk = "X".repeat(1000);
//! let bad = analyze(&junk, 4, None, &Options::default());
//! assert!(!bad.ok);
//! assert_eq!(bad.input.chars().count(), FAILED_INPUT_ECHO + 1);
//! assert!(bad.input.ends_with('…'));
//! assert!(bad.error.unwrap().message.contains("1000 bytes"));
//! ```

use super::json;
use serde::ser::{SerializeMap, Serializer};
use serde::Serialize;

/// Most alternatives listed in a record (`alternatives_omitted` counts
/// the rest).
pub const MAX_ALTERNATIVES: usize = 5;

/// Version of the record schema, stamped into every record as `schema`.
pub const SCHEMA: &str = "acidsite-record/4";

/// A failed record's `input` keeps at most this many characters.
pub const FAILED_INPUT_ECHO: usize = 300;

/// One output record (see the module documentation for the keys).
///
/// The record owns its text: strings move in from the library's results
/// (no copies), and names that come from fixed vocabularies (component role,
/// regio side, scale, rejection kind, hazard codes, rule-set version) are
/// `&'static str`.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Record {
    /// Schema version, always [`SCHEMA`]; key `schema`.
    pub schema: &'static str,
    /// 1-based line number of the record in its input (an SD record's first
    /// line; for `scan`, the argument's 1-based position); key `line`.
    pub line: u64,
    /// The record's identifier (second field of a `.smi` line, the id
    /// column, an SD title or data item); None when the input has none;
    /// key `id`.
    pub id: Option<String>,
    /// The SMILES as read, or for a molfile the SMILES the reader wrote
    /// (atom indices stay the molfile's); a failed record keeps at most
    /// [`FAILED_INPUT_ECHO`] characters; key `input`.
    pub input: String,
    /// True when the input was read and analysed; false for an error
    /// record (then [`error`](Self::error) is set); key `ok`.
    pub ok: bool,
    /// CSV/TSV input only: the row's other columns by header name, in file
    /// order (SD input: the data items); key `columns`, absent otherwise.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub columns: Option<Pairs<String>>,
    /// Molecular formula of the whole input, Hill order, every H counted;
    /// key `formula`, absent on failure.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub formula: Option<String>,
    /// Each `.`-separated component with its role; key `components`,
    /// absent on failure.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub components: Option<Vec<ComponentOut>>,
    /// Version of the fragment rule set used; key `rule_set`, absent on
    /// failure.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub rule_set: Option<&'static str>,
    /// Acidic sites, most acidic first; key `sites`, absent on failure.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub sites: Option<Vec<SiteOut>>,
    /// `Some(None)` serializes as `"advice": null` (no target site).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub advice: Option<Option<AdviceOut>>,
    /// Why `advice` is null (no site with an estimate, `--site` atom not
    /// acidic); absent when there is advice.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub advice_note: Option<String>,
    /// Hazards of the substrate itself (`fragments/hazards.tsv`), found
    /// whether or not there is advice; key `hazards`, absent when none.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub hazards: Option<Vec<HazardOut>>,
    /// The input with each site's atoms as bracket atoms carrying the
    /// site's rank as atom-map number; key `mapped_smiles`, absent on
    /// failure.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub mapped_smiles: Option<String>,
    /// Only with `--flag` patterns: unique match count per pattern name, in
    /// the order given; key `flags`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub flags: Option<Pairs<u64>>,
    /// Only when a `--flag` count reached a bound: which pattern and which
    /// bound (the count in `flags` is then a lower bound).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub flag_warnings: Option<Vec<String>>,
    /// Why the record failed; key `error`, present exactly when `ok` is
    /// false.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub error: Option<ErrorOut>,
}

impl Record {
    /// A failed record: the input could not be read or analysed.
    pub fn failure(line: u64, id: Option<String>, input: String, mut error: ErrorOut) -> Record {
        // A failed record echoes at most FAILED_INPUT_ECHO characters of its
        // input (an 8 MiB junk line must not become 48 MiB of JSON); the
        // message then gives the full length (issue 17).
        let input = if input.len() > FAILED_INPUT_ECHO {
            let cut: String = input.chars().take(FAILED_INPUT_ECHO).collect();
            if cut.len() < input.len() {
                error.message.push_str(&format!(
                    " (input of {} bytes; the first {FAILED_INPUT_ECHO} characters are shown)",
                    input.len()
                ));
                cut + "…"
            } else {
                input
            }
        } else {
            input
        };
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
            hazards: None,
            mapped_smiles: None,
            flags: None,
            flag_warnings: None,
            error: Some(error),
        }
    }

    /// The record as one JSON line (no trailing newline).
    pub fn to_json_line(&self) -> String {
        let mut out = Vec::with_capacity(8 << 10);
        self.write_json(&mut out);
        // The writer only appends whole UTF-8 strings and ASCII.
        String::from_utf8(out)
            .unwrap_or_else(|e| String::from_utf8_lossy(e.as_bytes()).into_owned())
    }

    /// The keys every record form starts with, in order: `schema` (given,
    /// full or brief), `line`, `id`, `input`, `ok`, then `columns` and
    /// `formula` when present. Opens the object and leaves it open.
    pub(crate) fn write_json_head(&self, out: &mut Vec<u8>, schema: &str) {
        out.extend_from_slice(b"{\"schema\":");
        json::string(out, schema);
        out.extend_from_slice(b",\"line\":");
        json::uint(out, self.line);
        out.extend_from_slice(b",\"id\":");
        json::opt_string(out, self.id.as_deref());
        out.extend_from_slice(b",\"input\":");
        json::string(out, &self.input);
        out.extend_from_slice(b",\"ok\":");
        json::boolean(out, self.ok);
        if let Some(c) = &self.columns {
            out.extend_from_slice(b",\"columns\":");
            c.write_json(out, |o, v| json::string(o, v));
        }
        if let Some(f) = &self.formula {
            out.extend_from_slice(b",\"formula\":");
            json::string(out, f);
        }
    }

    /// Append the record as one JSON line (no trailing newline) to `out`:
    /// byte for byte what `serde_json::to_string` makes of the record, with
    /// keys in the documented order, absent keys left out and non-finite
    /// numbers written as `null`. Lets a caller reuse one buffer for many
    /// records.
    pub fn write_json(&self, out: &mut Vec<u8>) {
        self.write_json_head(out, self.schema);
        if let Some(c) = &self.components {
            out.extend_from_slice(b",\"components\":");
            json::array(out, c, |o, c| c.write_json(o));
        }
        if let Some(r) = self.rule_set {
            out.extend_from_slice(b",\"rule_set\":");
            json::string(out, r);
        }
        if let Some(s) = &self.sites {
            out.extend_from_slice(b",\"sites\":");
            json::array(out, s, |o, s| s.write_json(o));
        }
        if let Some(a) = &self.advice {
            out.extend_from_slice(b",\"advice\":");
            match a {
                Some(a) => a.write_json(out),
                None => out.extend_from_slice(b"null"),
            }
        }
        if let Some(n) = &self.advice_note {
            out.extend_from_slice(b",\"advice_note\":");
            json::string(out, n);
        }
        if let Some(h) = &self.hazards {
            out.extend_from_slice(b",\"hazards\":");
            json::array(out, h, |o, h| {
                o.extend_from_slice(b"{\"id\":");
                json::string(o, &h.id);
                o.extend_from_slice(b",\"text\":");
                json::string(o, &h.text);
                o.push(b'}');
            });
        }
        if let Some(m) = &self.mapped_smiles {
            out.extend_from_slice(b",\"mapped_smiles\":");
            json::string(out, m);
        }
        if let Some(f) = &self.flags {
            out.extend_from_slice(b",\"flags\":");
            f.write_json(out, |o, v| json::uint(o, *v));
        }
        if let Some(w) = &self.flag_warnings {
            out.extend_from_slice(b",\"flag_warnings\":");
            json::array(out, w, |o, x| json::string(o, x));
        }
        if let Some(e) = &self.error {
            out.extend_from_slice(b",\"error\":");
            e.write_json(out);
        }
        out.push(b'}');
    }

    /// The most acidic C–H site, if any (sites are ranked).
    pub fn top_carbon_site(&self) -> Option<&SiteOut> {
        self.sites
            .as_ref()?
            .iter()
            .find(|s| s.element == "C" && !s.background)
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

impl<V> Pairs<V> {
    pub(super) fn write_json(&self, out: &mut Vec<u8>, mut value: impl FnMut(&mut Vec<u8>, &V)) {
        out.push(b'{');
        for (i, (k, v)) in self.0.iter().enumerate() {
            if i > 0 {
                out.push(b',');
            }
            json::string(out, k);
            out.push(b':');
            value(out, v);
        }
        out.push(b'}');
    }
}

/// One `.`-separated component of the input.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ComponentOut {
    /// `"main"` (the component analysed) or `"counter_ion"`.
    pub role: &'static str,
    /// The component's text in the input SMILES.
    pub smiles: String,
    /// Molecular formula of this component, Hill order, every H counted,
    /// no charge.
    pub formula: String,
    /// Net formal charge.
    pub charge: i32,
}

impl ComponentOut {
    fn write_json(&self, out: &mut Vec<u8>) {
        out.extend_from_slice(b"{\"role\":");
        json::string(out, self.role);
        out.extend_from_slice(b",\"smiles\":");
        json::string(out, &self.smiles);
        out.extend_from_slice(b",\"formula\":");
        json::string(out, &self.formula);
        out.extend_from_slice(b",\"charge\":");
        json::int(out, self.charge as i64);
        out.push(b'}');
    }
}

/// One acidic site.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SiteOut {
    /// 1-based rank (1 = most acidic); also the atom-map number in `mapped_smiles`.
    pub rank: u32,
    /// Symmetry-equivalent atoms of the site (0-based, input order).
    pub atoms: Vec<usize>,
    /// Element of the acidic atom: `C`, `N`, `O` or `S`.
    pub element: String,
    /// Hydrogens on each atom of the site (all isotopes).
    pub hydrogens: u8,
    /// How many of `hydrogens` are deuterium (key written only when > 0).
    #[serde(skip_serializing_if = "is_zero")]
    pub deuterium: u8,
    /// How many of `hydrogens` are tritium (key written only when > 0).
    #[serde(skip_serializing_if = "is_zero")]
    pub tritium: u8,
    /// Class name from the rule data.
    pub class: String,
    /// Estimated pKa in DMSO, rounded to 0.01; null when the rules give no
    /// DMSO value for this class.
    pub pka_dmso: Option<f64>,
    /// Estimated pKa in water, rounded to 0.01; null when the rules give no
    /// water value for this class.
    pub pka_water: Option<f64>,
    /// One standard uncertainty of the estimates, pKa units.
    pub uncertainty: f64,
    /// Rules applied, with their contributions (the estimate is their sum).
    pub rules: Vec<RuleOut>,
    /// `"kinetic"`, `"thermodynamic"` or null.
    pub regio: Option<&'static str>,
    /// Background (unactivated) C–H site: listed last, never the top C–H
    /// site. Not written (the class says it).
    #[serde(skip)]
    pub background: bool,
}

impl SiteOut {
    fn write_json(&self, out: &mut Vec<u8>) {
        out.extend_from_slice(b"{\"rank\":");
        json::uint(out, self.rank as u64);
        out.extend_from_slice(b",\"atoms\":");
        json::indices(out, &self.atoms);
        out.extend_from_slice(b",\"element\":");
        json::string(out, &self.element);
        out.extend_from_slice(b",\"hydrogens\":");
        json::uint(out, self.hydrogens as u64);
        if self.deuterium > 0 {
            out.extend_from_slice(b",\"deuterium\":");
            json::uint(out, self.deuterium as u64);
        }
        if self.tritium > 0 {
            out.extend_from_slice(b",\"tritium\":");
            json::uint(out, self.tritium as u64);
        }
        out.extend_from_slice(b",\"class\":");
        json::string(out, &self.class);
        out.extend_from_slice(b",\"pka_dmso\":");
        json::opt_float(out, self.pka_dmso);
        out.extend_from_slice(b",\"pka_water\":");
        json::opt_float(out, self.pka_water);
        out.extend_from_slice(b",\"uncertainty\":");
        json::float(out, self.uncertainty);
        out.extend_from_slice(b",\"rules\":");
        json::array(out, &self.rules, |o, r| {
            o.extend_from_slice(b"{\"id\":");
            json::string(o, &r.id);
            o.extend_from_slice(b",\"dmso\":");
            json::opt_float(o, r.dmso);
            o.extend_from_slice(b",\"water\":");
            json::opt_float(o, r.water);
            o.push(b'}');
        });
        out.extend_from_slice(b",\"regio\":");
        match self.regio {
            Some(r) => json::string(out, r),
            None => out.extend_from_slice(b"null"),
        }
        out.push(b'}');
    }
}

/// One applied rule and its contribution on each scale.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RuleOut {
    /// Rule or increment id from the fragment rule files.
    pub id: String,
    /// Its contribution to the DMSO estimate, pKa units (the base value
    /// for a site rule, a shift for an increment); null when it has none on
    /// this scale.
    pub dmso: Option<f64>,
    /// Its contribution to the water estimate, pKa units; null when it has
    /// none on this scale.
    pub water: Option<f64>,
}

/// Base advice for one target site.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct AdviceOut {
    /// Atoms of the target site.
    pub target: Vec<usize>,
    /// How the target was chosen (default most acidic C–H, or `--site`).
    pub target_note: String,
    /// The planned reaction the advice is for (`--reaction`, default
    /// `alkylation`).
    pub reaction: &'static str,
    /// `kinetic` or `thermodynamic` (given, or the target's enolate side);
    /// null where the target has no sides to choose between.
    pub control: Option<&'static str>,
    /// How the base is used: `preformed`, `in-situ` or `catalytic`.
    pub mode: &'static str,
    /// Why that mode, with the practice row and its source.
    pub mode_note: String,
    /// Id of the matching row of `fragments/practice.tsv`, if any.
    pub practice_row: Option<String>,
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
    /// Solvent for the recommended base (the requested one, else its usual
    /// one); null when no base qualifies.
    pub solvent: Option<String>,
    /// Temperature to start at, °C (low end of `temperature_range_c`).
    pub temperature_c: Option<f64>,
    /// Usual working range, °C: `[low, high]`.
    pub temperature_range_c: Option<[f64; 2]>,
    /// pKa scale the comparison used: `"dmso"`, `"water"` or `"thf"`.
    pub scale: Option<&'static str>,
    /// Why that scale, with the base's conjugate-acid pKa and its source.
    pub scale_note: String,
    /// Other acceptable bases, best first: at most
    /// [`MAX_ALTERNATIVES`] (the mildest, most common ones).
    pub alternatives: Vec<AlternativeOut>,
    /// How many further acceptable bases were left out of `alternatives`
    /// (see `acidsite scan` or the library for all of them).
    pub alternatives_omitted: usize,
    /// Bases ruled out, each with its chemical reason.
    pub rejected: Vec<RejectedOut>,
    /// Bases the data cannot judge for this target, with the value missing.
    pub not_judged: Vec<NotJudgedOut>,
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

impl AdviceOut {
    fn write_json(&self, out: &mut Vec<u8>) {
        out.extend_from_slice(b"{\"target\":");
        json::indices(out, &self.target);
        out.extend_from_slice(b",\"target_note\":");
        json::string(out, &self.target_note);
        out.extend_from_slice(b",\"reaction\":");
        json::string(out, self.reaction);
        out.extend_from_slice(b",\"control\":");
        json::opt_string(out, self.control);
        out.extend_from_slice(b",\"mode\":");
        json::string(out, self.mode);
        out.extend_from_slice(b",\"mode_note\":");
        json::string(out, &self.mode_note);
        out.extend_from_slice(b",\"practice_row\":");
        json::opt_string(out, self.practice_row.as_deref());
        out.extend_from_slice(b",\"base\":");
        json::opt_string(out, self.base.as_deref());
        out.extend_from_slice(b",\"equivalents\":");
        json::opt_float(out, self.equivalents);
        out.extend_from_slice(b",\"equivalents_note\":");
        json::string(out, &self.equivalents_note);
        out.extend_from_slice(b",\"counted\":");
        json::array(out, &self.counted, |o, c| {
            o.extend_from_slice(b"{\"atoms\":");
            json::indices(o, &c.atoms);
            o.extend_from_slice(b",\"class\":");
            json::string(o, &c.class);
            o.extend_from_slice(b",\"protons\":");
            json::uint(o, c.protons as u64);
            o.extend_from_slice(b",\"reason\":");
            json::string(o, &c.reason);
            o.push(b'}');
        });
        out.extend_from_slice(b",\"conversion\":");
        json::opt_float(out, self.conversion);
        out.extend_from_slice(b",\"solvent\":");
        json::opt_string(out, self.solvent.as_deref());
        out.extend_from_slice(b",\"temperature_c\":");
        json::opt_float(out, self.temperature_c);
        out.extend_from_slice(b",\"temperature_range_c\":");
        match &self.temperature_range_c {
            Some(p) => json::pair(out, p),
            None => out.extend_from_slice(b"null"),
        }
        out.extend_from_slice(b",\"scale\":");
        match self.scale {
            Some(s) => json::string(out, s),
            None => out.extend_from_slice(b"null"),
        }
        out.extend_from_slice(b",\"scale_note\":");
        json::string(out, &self.scale_note);
        out.extend_from_slice(b",\"alternatives\":");
        json::array(out, &self.alternatives, |o, x| {
            o.extend_from_slice(b"{\"base\":");
            json::string(o, x.base);
            o.extend_from_slice(b",\"equivalents\":");
            json::float(o, x.equivalents);
            o.extend_from_slice(b",\"conversion\":");
            json::float(o, x.conversion);
            o.extend_from_slice(b",\"solvent\":");
            json::string(o, &x.solvent);
            o.extend_from_slice(b",\"temperature_range_c\":");
            json::pair(o, &x.temperature_range_c);
            o.extend_from_slice(b",\"note\":");
            json::string(o, &x.note);
            o.push(b'}');
        });
        out.extend_from_slice(b",\"alternatives_omitted\":");
        json::uint(out, self.alternatives_omitted as u64);
        out.extend_from_slice(b",\"rejected\":");
        json::array(out, &self.rejected, |o, r| {
            o.extend_from_slice(b"{\"base\":");
            json::string(o, r.base);
            o.extend_from_slice(b",\"kind\":");
            json::string(o, r.kind);
            o.extend_from_slice(b",\"reason\":");
            json::string(o, &r.reason);
            o.push(b'}');
        });
        out.extend_from_slice(b",\"not_judged\":");
        json::array(out, &self.not_judged, |o, r| {
            o.extend_from_slice(b"{\"base\":");
            json::string(o, r.base);
            o.extend_from_slice(b",\"missing\":");
            json::string(o, &r.missing);
            o.push(b'}');
        });
        out.extend_from_slice(b",\"warnings\":");
        json::array(out, &self.warnings, |o, w| json::string(o, w));
        out.extend_from_slice(b",\"regio_conditions\":");
        match &self.regio_conditions {
            Some(r) => {
                out.extend_from_slice(b"{\"kinetic\":");
                r.kinetic.write_json(out);
                out.extend_from_slice(b",\"thermodynamic\":");
                r.thermodynamic.write_json(out);
                out.push(b'}');
            }
            None => out.extend_from_slice(b"null"),
        }
        out.extend_from_slice(b",\"cautions\":");
        json::array(out, &self.cautions, |o, c| {
            o.extend_from_slice(b"{\"reagent\":");
            json::string(o, &c.reagent);
            o.extend_from_slice(b",\"hazards\":");
            json::array(o, &c.hazards, |o, h| json::string(o, h));
            o.extend_from_slice(b",\"text\":");
            json::string(o, &c.text);
            o.extend_from_slice(b",\"full\":");
            json::boolean(o, c.full);
            o.push(b'}');
        });
        out.extend_from_slice(b",\"catalogue\":");
        json::string(out, &self.catalogue);
        out.push(b'}');
    }
}

/// A safety caution for one reagent.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CautionOut {
    /// Reagent named (or "all reagents named" for the general caution).
    pub reagent: String,
    /// Hazard codes: `pyrophoric`, `water-reactive`, `hydrogen-evolution`,
    /// `corrosive`, `toxic`, `cryogenic`, `flammable`, `irritant`.
    pub hazards: Vec<&'static str>,
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
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CountedOut {
    /// Atoms of the site, 0-based in input order.
    pub atoms: Vec<usize>,
    /// The site's class name from the rule data.
    pub class: String,
    /// Protons this site consumes (one base equivalent each).
    pub protons: usize,
    /// Why it is counted: more acidic than the target, or fast O–H, N–H or
    /// S–H proton transfer.
    pub reason: String,
}

/// An acceptable base other than the recommendation.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct AlternativeOut {
    /// Catalogue short name (`KHMDS`, `NaH`).
    pub base: &'static str,
    /// Equivalents it would need, rounded to 0.01.
    pub equivalents: f64,
    /// Fraction of the target it deprotonates at equilibrium, 0..1, to six
    /// significant figures.
    pub conversion: f64,
    /// Its usual (or the requested) solvent.
    pub solvent: String,
    /// Its usual working range, °C: `[low, high]`.
    pub temperature_range_c: [f64; 2],
    /// Notes from its evaluation (scale, marginal acceptance, solvent);
    /// may be empty.
    pub note: String,
}

/// Conditions for each side of an unsymmetrical ketone.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RegioOut {
    /// Conditions for the less substituted enolate (key `kinetic`).
    pub kinetic: RegioSideOut,
    /// Conditions for the more substituted enolate (key `thermodynamic`).
    pub thermodynamic: RegioSideOut,
}

/// Conditions favouring one enolate side.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RegioSideOut {
    /// The practice data's preferred bases for this side, at most two,
    /// joined by " or " (`LDA or LiTMP`).
    pub base: String,
    /// Equivalents including the practical excess, rounded to 0.01.
    pub equivalents: f64,
    /// Usual solvent of the first preferred base.
    pub solvent: String,
    /// Usual working range of the first preferred base, °C: `[low, high]`.
    pub temperature_range_c: [f64; 2],
    /// How it is done, from the practice row, ending with the row id in
    /// brackets.
    pub procedure: String,
    /// Atoms of the α-carbon this side deprotonates.
    pub favours: Vec<usize>,
}

impl RegioSideOut {
    fn write_json(&self, out: &mut Vec<u8>) {
        out.extend_from_slice(b"{\"base\":");
        json::string(out, &self.base);
        out.extend_from_slice(b",\"equivalents\":");
        json::float(out, self.equivalents);
        out.extend_from_slice(b",\"solvent\":");
        json::string(out, &self.solvent);
        out.extend_from_slice(b",\"temperature_range_c\":");
        json::pair(out, &self.temperature_range_c);
        out.extend_from_slice(b",\"procedure\":");
        json::string(out, &self.procedure);
        out.extend_from_slice(b",\"favours\":");
        json::indices(out, &self.favours);
        out.push(b'}');
    }
}

/// A base ruled out, with the reason.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RejectedOut {
    /// Catalogue short name of the base ruled out.
    pub base: &'static str,
    /// Short reason code: `too-weak`, `nucleophile`, `transesterification`,
    /// `hydrolysis`, `uncounted-proton`, `not-catalytic`, `regio`,
    /// `side-reaction`, `mode`.
    pub kind: &'static str,
    /// Every reason found, in words, separated by "; " (the pKa values
    /// compared, the group attacked, the side reaction).
    pub reason: String,
}

/// A base the data cannot judge for the target.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct NotJudgedOut {
    /// Catalogue name.
    pub base: &'static str,
    /// The value that is missing (a pKa on the scale the base needs).
    pub missing: String,
}

/// A hazard of the substrate itself.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct HazardOut {
    /// Row id of `fragments/hazards.tsv` (e.g. `HZ-HCN`).
    pub id: String,
    /// The caution, worded for the chemist.
    pub text: String,
}

/// Why a record failed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ErrorOut {
    /// Error class: `syntax`, `ring_closure`, `aromaticity`, `valence`,
    /// `unsupported`, `too_large`, `empty`, `encoding`, `columns` or
    /// `molfile` (see the module documentation).
    pub kind: String,
    /// What is wrong and where, in plain words.
    pub message: String,
    /// 0-based character index into `input`, or null.
    pub position: Option<usize>,
}

impl ErrorOut {
    /// The error object as JSON (the same bytes as serde's), shared by the
    /// full and the brief record writers.
    pub fn write_json(&self, out: &mut Vec<u8>) {
        out.extend_from_slice(b"{\"kind\":");
        json::string(out, &self.kind);
        out.extend_from_slice(b",\"message\":");
        json::string(out, &self.message);
        out.extend_from_slice(b",\"position\":");
        match self.position {
            Some(p) => json::uint(out, p as u64),
            None => out.extend_from_slice(b"null"),
        }
        out.push(b'}');
    }
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

/// Serde helper: skip a zero count.
fn is_zero(n: &u8) -> bool {
    *n == 0
}
