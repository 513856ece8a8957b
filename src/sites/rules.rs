//! Rule data: the tab-separated files in `fragments/`, their reader and
//! validation.
//!
//! Three files are read, all embedded at build time:
//!
//! * `fragments/rules.tsv`: one class rule per row (SMARTS with the acidic
//!   atom mapped `:1`, class, base pKa on the DMSO and water scales,
//!   uncertainty, optional Hammett ρ, citation key);
//! * `fragments/increments.tsv`: substituent increments for what sits on the
//!   acidic atom, keyed by substituent kind and rule family;
//! * `fragments/sources.tsv`: citation keys with full references.
//!
//! The format: lines starting with `#` are comments; the header comment of
//! `rules.tsv` carries `# version: <text>`. The first non-comment line names
//! the columns (order is free, names are fixed); every later non-empty line
//! is one row. Empty cells are allowed only where a column says so. A bad row
//! fails the whole set with the file name and 1-based line number.

use std::collections::{HashMap, HashSet};
use std::fmt;

use crate::smarts::Pattern;

/// A problem in a rule file: which file, which line (1-based), what.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct RuleError {
    /// File name as passed to the parser (e.g. `fragments/rules.tsv`); it is
    /// used only in messages, nothing is read from it.
    pub file: String,
    /// 1-based line number in the file; 0 when the problem concerns the
    /// file as a whole.
    pub line: usize,
    /// What is wrong, naming the column or value concerned.
    pub message: String,
}

impl fmt::Display for RuleError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}:{}: {}", self.file, self.line, self.message)
    }
}

impl std::error::Error for RuleError {}

/// Which σ constant a para substituent uses in a Hammett term (meta
/// substituents always use σm).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum SigmaKind {
    /// σp: the aryl ring is not directly conjugated with the lone pair.
    Para,
    /// σp⁻: through-conjugation of the carbanion / anion with the ring.
    ParaMinus,
}

/// Hammett term attached to a class rule or an increment: ρ per scale.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Hammett {
    /// ρ on the DMSO scale (column `rho_dmso`); the term shifts the pKa by
    /// −ρ·σ pKa units. None = no ρ known in DMSO: no Hammett term on that
    /// scale (the uncertainty is widened instead).
    pub rho_dmso: Option<f64>,
    /// ρ on the water scale (column `rho_water`); None as for `rho_dmso`.
    /// At least one of the two is Some.
    pub rho_water: Option<f64>,
    /// σ used for para (and ortho) substituents (column `sigma`: `p` or
    /// `p-`).
    pub sigma: SigmaKind,
}

/// One class rule.
#[derive(Debug, Clone)]
pub struct Rule {
    /// Stable row id (column `id`, e.g. `C-KETON-01`): A-Z, 0-9 and `-`,
    /// unique across `rules.tsv` and `increments.tsv`.
    pub id: String,
    /// Element symbol of the acidic atom ("C", "N", "O", "S").
    pub element: String,
    /// SMARTS text (column `smarts`), the acidic atom mapped `:1`.
    pub smarts: String,
    /// `smarts` compiled; its `:1` atom is the acidic atom.
    pub pattern: Pattern,
    /// Human-readable class name (column `class`), e.g. `1,3-diketone`;
    /// reported, never branched on.
    pub class: String,
    /// Increment family (column `family`): which rows of `increments.tsv`
    /// apply; `none` = no increments.
    pub family: String,
    /// Family `background` (see [`BACKGROUND_FAMILY`]): an unactivated
    /// C–H listed so that no hydrogen is silently absent; no increments,
    /// ranked after every other site, one site per hydrogen count, never
    /// the default advice target.
    pub background: bool,
    /// Base pKa of the parent on the DMSO scale (column `pka_dmso`), pKa
    /// units. None (empty cell) = no basis in DMSO: sites matched by this
    /// rule get no DMSO estimate. At least one of the two scales is Some.
    pub pka_dmso: Option<f64>,
    /// Base pKa of the parent on the water scale (column `pka_water`), pKa
    /// units; None as for `pka_dmso`.
    pub pka_water: Option<f64>,
    /// One standard uncertainty of the base values (column `uncertainty`),
    /// pKa units, in (0, 20].
    pub uncertainty: f64,
    /// Hammett term for the ring whose ipso atom is the first aromatic atom
    /// of the match (columns `rho_dmso`, `rho_water`, `sigma`); None when
    /// both ρ cells are empty.
    pub hammett: Option<Hammett>,
    /// Citation key(s) (column `source`), comma-separated, each a key of
    /// `sources.tsv`.
    pub source: String,
    /// Free-text note (column `note`); may be empty.
    pub note: String,
    /// Elements written unbracketed in the SMARTS: all must be present in
    /// the molecule for the rule to match (a cheap prescreen). Bit `z` set
    /// = atomic number `z` required.
    pub required_elements: u128,
    /// 1-based line in `rules.tsv`.
    pub line: usize,
    /// Atomic number of `element`.
    pub(crate) z: u8,
    /// Aromaticity the anchor atom must have, read from the SMARTS text
    /// (lower-case symbol = aromatic, upper-case = aliphatic, else either).
    pub(crate) anchor_aromatic: Option<bool>,
}

/// One substituent increment.
#[derive(Debug, Clone)]
pub struct Increment {
    /// Stable row id (column `id`, e.g. `I-CO-ALK1`); unique across
    /// `rules.tsv` and `increments.tsv`.
    pub id: String,
    /// Substituent kind (column `kind`; one of [`SUBSTITUENT_KINDS`]).
    pub kind: String,
    /// Families this row applies to (column `families`, comma-separated);
    /// `*` = every family.
    pub families: Vec<String>,
    /// Applies to the n-th substituent of this kind (column `nth`: 1, 2 or
    /// 3); for the n-th substituent the row with the largest `nth` <= n
    /// applies.
    pub nth: u8,
    /// Shift added to the DMSO pKa per substituent (column `pka_dmso`), pKa
    /// units. None (empty cell) = no basis in DMSO: a site receiving this
    /// increment gets no DMSO estimate. At least one scale is Some.
    pub dmso: Option<f64>,
    /// Shift added to the water pKa (column `pka_water`), pKa units; None
    /// as for `dmso`.
    pub water: Option<f64>,
    /// One standard uncertainty of the shift (column `uncertainty`), pKa
    /// units, in (0, 20].
    pub uncertainty: f64,
    /// Hammett term for an aryl substituent, ring ipso = the substituent
    /// atom (columns `rho_dmso`, `rho_water`, `sigma`); None when both ρ
    /// cells are empty.
    pub hammett: Option<Hammett>,
    /// Citation key(s) (column `source`), comma-separated, each a key of
    /// `sources.tsv`.
    pub source: String,
    /// Free-text note (column `note`); may be empty.
    pub note: String,
    /// 1-based line in `increments.tsv`.
    pub line: usize,
}

/// The family value that marks a background row (unactivated C–H).
pub const BACKGROUND_FAMILY: &str = "background";

/// Substituent kinds recognised on the acidic atom (see `estimate`).
pub const SUBSTITUENT_KINDS: &[&str] = &[
    "alkyl",
    "alkyl_ewg",
    "aryl",
    "heteroaryl",
    "vinyl",
    "alkynyl",
    "alkoxy",
    "aryloxy",
    "acyloxy",
    "thio",
    "amino",
    "fluoro",
    "chloro",
    "bromo",
    "iodo",
    "acyl",
    "ester",
    "cyano",
    "nitro",
    "sulfonyl",
    "onium_n",
    "onium_p",
    "fluoro_beta",
    "hetero_beta",
    "ring3",
    "ring4",
];

/// A validated rule set.
#[derive(Debug, Clone)]
pub struct RuleSet {
    /// Rule-set version, from the `# version: …` header comment of
    /// `rules.tsv` (e.g. `2026.12-3`).
    pub version: String,
    /// How rows are matched, from the `# match order: …` header comment of
    /// `rules.tsv` (text, shown to users; not interpreted).
    pub match_order: String,
    /// Class rules in file order, which is match order within an element.
    pub rules: Vec<Rule>,
    /// Substituent increments in file order.
    pub increments: Vec<Increment>,
    /// Citation key -> full reference.
    pub sources: HashMap<String, String>,
    /// Indices into `rules` per acidic element (atomic number, list in
    /// rule order), so that an atom is tried only against its own rows.
    by_element: Vec<(u8, Vec<usize>)>,
    /// Indices into `rules` of the background rows, in rule order.
    background: Vec<usize>,
    /// Indices into `increments` per substituent kind, in table order.
    by_kind: Vec<(String, Vec<usize>)>,
}

impl RuleSet {
    /// Indices of the rules for acidic atoms of element `z`, in rule order.
    pub(crate) fn rules_for(&self, z: u8) -> &[usize] {
        self.by_element
            .iter()
            .find(|(e, _)| *e == z)
            .map_or(&[], |(_, v)| v.as_slice())
    }

    /// Indices of the background rules (family `background`), in rule
    /// order: the only rows tried for a C–H with no activating neighbour.
    pub(crate) fn background_rules(&self) -> &[usize] {
        &self.background
    }

    /// Indices of the increment rows for substituent kind `kind`, in
    /// table order.
    pub(crate) fn increments_of(&self, kind: &str) -> &[usize] {
        self.by_kind
            .iter()
            .find(|(k, _)| k == kind)
            .map_or(&[], |(_, v)| v.as_slice())
    }
}

/// One parsed line of a table: 1-based line number and cells by column.
struct Row<'a> {
    line: usize,
    cells: Vec<&'a str>,
}

/// A parsed table: header comments, column names, rows.
struct Table<'a> {
    file: &'a str,
    comments: Vec<&'a str>,
    columns: Vec<&'a str>,
    rows: Vec<Row<'a>>,
}

impl<'a> Table<'a> {
    fn error(&self, line: usize, message: impl Into<String>) -> RuleError {
        RuleError {
            file: self.file.to_string(),
            line,
            message: message.into(),
        }
    }

    fn column(&self, name: &str) -> Result<usize, RuleError> {
        self.columns
            .iter()
            .position(|c| *c == name)
            .ok_or_else(|| self.error(0, format!("missing column `{name}`")))
    }
}

// table := { comment | blank } header { row | comment | blank }
// comment := '#' text ; header := name { TAB name } ; row := cell { TAB cell }
fn read_table<'a>(file: &'a str, text: &'a str) -> Result<Table<'a>, RuleError> {
    let mut table = Table {
        file,
        comments: Vec::new(),
        columns: Vec::new(),
        rows: Vec::new(),
    };
    for (i, raw) in text.lines().enumerate() {
        let line = i + 1;
        let l = raw.strip_suffix('\r').unwrap_or(raw);
        if let Some(c) = l.strip_prefix('#') {
            if table.columns.is_empty() {
                table.comments.push(c.trim());
            }
            continue;
        }
        if l.trim().is_empty() {
            continue;
        }
        let cells: Vec<&str> = l.split('\t').map(str::trim).collect();
        if table.columns.is_empty() {
            let mut seen = HashSet::new();
            for c in &cells {
                if c.is_empty() || !seen.insert(*c) {
                    return Err(table.error(line, format!("bad or repeated column name `{c}`")));
                }
            }
            table.columns = cells;
            continue;
        }
        if cells.len() != table.columns.len() {
            return Err(table.error(
                line,
                format!(
                    "expected {} tab-separated cells, found {}",
                    table.columns.len(),
                    cells.len()
                ),
            ));
        }
        table.rows.push(Row { line, cells });
    }
    if table.columns.is_empty() {
        return Err(table.error(0, "no header line"));
    }
    Ok(table)
}

fn cell<'a>(t: &Table, row: &Row<'a>, name: &str) -> Result<&'a str, RuleError> {
    let i = t.column(name)?;
    row.cells
        .get(i)
        .copied()
        .ok_or_else(|| t.error(row.line, format!("missing cell `{name}`")))
}

fn required<'a>(t: &Table, row: &Row<'a>, name: &str) -> Result<&'a str, RuleError> {
    let v = cell(t, row, name)?;
    if v.is_empty() {
        return Err(t.error(row.line, format!("`{name}` must not be empty")));
    }
    Ok(v)
}

/// A pKa-like number: empty -> None; otherwise finite and within ±100.
fn number(t: &Table, row: &Row, name: &str) -> Result<Option<f64>, RuleError> {
    let v = cell(t, row, name)?;
    if v.is_empty() {
        return Ok(None);
    }
    match v.parse::<f64>() {
        Ok(x) if x.is_finite() && x.abs() <= 100.0 => Ok(Some(x)),
        _ => Err(t.error(
            row.line,
            format!("`{name}`: `{v}` is not a number in -100..100"),
        )),
    }
}

fn uncertainty(t: &Table, row: &Row) -> Result<f64, RuleError> {
    match number(t, row, "uncertainty")? {
        Some(u) if u > 0.0 && u <= 20.0 => Ok(u),
        _ => Err(t.error(row.line, "`uncertainty` must be a number in (0, 20]")),
    }
}

fn hammett(t: &Table, row: &Row) -> Result<Option<Hammett>, RuleError> {
    let rho_dmso = number(t, row, "rho_dmso")?;
    let rho_water = number(t, row, "rho_water")?;
    let sigma = cell(t, row, "sigma")?;
    if rho_dmso.is_none() && rho_water.is_none() {
        if !sigma.is_empty() {
            return Err(t.error(row.line, "`sigma` given without any rho"));
        }
        return Ok(None);
    }
    let sigma = match sigma {
        "p" => SigmaKind::Para,
        "p-" => SigmaKind::ParaMinus,
        other => {
            return Err(t.error(
                row.line,
                format!("`sigma` must be `p` or `p-` when a rho is given, found `{other}`"),
            ))
        }
    };
    Ok(Some(Hammett {
        rho_dmso,
        rho_water,
        sigma,
    }))
}

fn check_id(t: &Table, row: &Row, id: &str, seen: &mut HashSet<String>) -> Result<(), RuleError> {
    let ok = id
        .chars()
        .all(|c| c.is_ascii_uppercase() || c.is_ascii_digit() || c == '-');
    if !ok {
        return Err(t.error(row.line, format!("id `{id}` must be A-Z, 0-9 and `-`")));
    }
    if !seen.insert(id.to_string()) {
        return Err(t.error(row.line, format!("duplicate id `{id}`")));
    }
    Ok(())
}

fn check_source(
    t: &Table,
    row: &Row,
    key: &str,
    sources: &HashMap<String, String>,
) -> Result<(), RuleError> {
    for k in key.split(',').map(str::trim) {
        if !sources.contains_key(k) {
            return Err(t.error(
                row.line,
                format!("citation key `{k}` is not in fragments/sources.tsv"),
            ));
        }
    }
    Ok(())
}

/// Read `sources.tsv` (columns `key`, `reference`): key -> reference.
/// `file` is used only in error messages.
pub fn parse_sources(file: &str, text: &str) -> Result<HashMap<String, String>, RuleError> {
    let t = read_table(file, text)?;
    let mut out = HashMap::new();
    for row in &t.rows {
        let key = required(&t, row, "key")?;
        let reference = required(&t, row, "reference")?;
        if out.insert(key.to_string(), reference.to_string()).is_some() {
            return Err(t.error(row.line, format!("duplicate key `{key}`")));
        }
    }
    Ok(out)
}

/// Atomic numbers of the elements written unbracketed in a SMARTS (organic
/// subset, aliphatic or aromatic). Bracket atoms are skipped, so the set is
/// conservative: a molecule lacking one of them cannot match.
pub fn unbracketed_elements(smarts: &str) -> u128 {
    let b = smarts.as_bytes();
    let mut mask = 0u128;
    let mut depth = 0usize;
    let mut i = 0;
    while i < b.len() {
        let c = b[i];
        if c == b'[' {
            depth += 1;
        } else if c == b']' {
            depth = depth.saturating_sub(1);
        } else if depth == 0 {
            let two = b.get(i + 1).copied();
            let z = match (c, two) {
                (b'C', Some(b'l')) => {
                    i += 1;
                    17
                }
                (b'B', Some(b'r')) => {
                    i += 1;
                    35
                }
                (b'B', _) | (b'b', _) => 5,
                (b'C', _) | (b'c', _) => 6,
                (b'N', _) | (b'n', _) => 7,
                (b'O', _) | (b'o', _) => 8,
                (b'F', _) => 9,
                (b'P', _) | (b'p', _) => 15,
                (b'S', _) | (b's', _) => 16,
                (b'I', _) => 53,
                _ => 0,
            };
            if z != 0 {
                mask |= 1u128 << z;
            }
        }
        i += 1;
    }
    mask
}

/// Aromaticity of the `:1` atom as written: the first letter inside its
/// bracket (`[cH1:1]` aromatic, `[CX4;!H0:1]` aliphatic); None when the
/// bracket starts otherwise (`[#6:1]`, `[$(…):1]`).
fn anchor_aromaticity(smarts: &str) -> Option<bool> {
    let end = smarts.find(":1]")?;
    // The bracket that holds `:1`: walk back over nested brackets of a
    // recursive expression (`[nH1;$(n1cc(-[CX3]=O)cc1):1]` starts at
    // `[nH1`, not at `[CX3]`; issue 11, second review).
    let mut depth = 0usize;
    let mut start = None;
    for (i, c) in smarts[..end].char_indices().rev() {
        match c {
            ']' => depth += 1,
            '[' if depth == 0 => {
                start = Some(i);
                break;
            }
            '[' => depth -= 1,
            _ => {}
        }
    }
    let start = start?;
    let first = smarts[start + 1..end].chars().next()?;
    // Only trust a bracket without alternatives.
    if smarts[start + 1..end].contains(',') {
        return None;
    }
    match first {
        'c' | 'n' | 'o' | 's' => Some(true),
        'C' | 'N' | 'O' | 'S' => Some(false),
        _ => None,
    }
}

fn element_symbol_ok(s: &str) -> bool {
    matches!(s, "C" | "N" | "O" | "S" | "P" | "Se")
}

/// Parse `rules.tsv` text (patterns compiled; citation keys checked against
/// `sources`). Returns (version, match order, rules in file order); both
/// `# version:` and `# match order:` header comments are required.
pub fn parse_rules(
    file: &str,
    text: &str,
    sources: &HashMap<String, String>,
) -> Result<(String, String, Vec<Rule>), RuleError> {
    let t = read_table(file, text)?;
    let mut version = None;
    let mut order = None;
    for c in &t.comments {
        if let Some(v) = c.strip_prefix("version:") {
            version = Some(v.trim().to_string());
        }
        if let Some(v) = c.strip_prefix("match order:") {
            order = Some(v.trim().to_string());
        }
    }
    let version = version.ok_or_else(|| t.error(0, "header comment `# version: …` missing"))?;
    let order = order.ok_or_else(|| t.error(0, "header comment `# match order: …` missing"))?;
    let mut seen = HashSet::new();
    let mut rules = Vec::new();
    for row in &t.rows {
        let id = required(&t, row, "id")?;
        check_id(&t, row, id, &mut seen)?;
        let element = required(&t, row, "element")?;
        if !element_symbol_ok(element) {
            return Err(t.error(row.line, format!("unsupported element `{element}`")));
        }
        let smarts = required(&t, row, "smarts")?;
        let class = required(&t, row, "class")?;
        let family = required(&t, row, "family")?;
        let pka_dmso = number(&t, row, "pka_dmso")?;
        let pka_water = number(&t, row, "pka_water")?;
        if pka_dmso.is_none() && pka_water.is_none() {
            return Err(t.error(row.line, format!("rule {id}: no pKa on either scale")));
        }
        let uncertainty = uncertainty(&t, row)?;
        let hammett = hammett(&t, row)?;
        let source = required(&t, row, "source")?;
        check_source(&t, row, source, sources)?;
        let note = cell(&t, row, "note")?;
        let pattern =
            Pattern::parse(smarts).map_err(|e| t.error(row.line, format!("rule {id}: {e}")))?;
        if pattern.anchor().is_none() {
            return Err(t.error(
                row.line,
                format!("rule {id}: SMARTS has no atom mapped `:1` (the acidic atom)"),
            ));
        }
        rules.push(Rule {
            z: crate::mol::atomic_number(element).unwrap_or(0),
            anchor_aromatic: anchor_aromaticity(smarts),
            id: id.to_string(),
            element: element.to_string(),
            smarts: smarts.to_string(),
            required_elements: unbracketed_elements(smarts),
            pattern,
            class: class.to_string(),
            family: family.to_string(),
            background: family == BACKGROUND_FAMILY,
            pka_dmso,
            pka_water,
            uncertainty,
            hammett,
            source: source.to_string(),
            note: note.to_string(),
            line: row.line,
        });
    }
    if rules.is_empty() {
        return Err(t.error(0, "no rules"));
    }
    Ok((version, order, rules))
}

/// Parse `increments.tsv` text. `rule_ids` are the ids already taken by
/// rules (an increment may not reuse one); citation keys are checked
/// against `sources`.
pub fn parse_increments(
    file: &str,
    text: &str,
    sources: &HashMap<String, String>,
    rule_ids: &HashSet<String>,
) -> Result<Vec<Increment>, RuleError> {
    let t = read_table(file, text)?;
    let mut seen = rule_ids.clone();
    let mut out = Vec::new();
    for row in &t.rows {
        let id = required(&t, row, "id")?;
        check_id(&t, row, id, &mut seen)?;
        let kind = required(&t, row, "kind")?;
        if !SUBSTITUENT_KINDS.contains(&kind) {
            return Err(t.error(row.line, format!("unknown substituent kind `{kind}`")));
        }
        let families: Vec<String> = required(&t, row, "families")?
            .split(',')
            .map(|s| s.trim().to_string())
            .collect();
        let nth = required(&t, row, "nth")?;
        let nth: u8 = match nth.parse() {
            Ok(n) if (1..=3).contains(&n) => n,
            _ => return Err(t.error(row.line, format!("`nth` must be 1, 2 or 3, found `{nth}`"))),
        };
        let dmso = number(&t, row, "pka_dmso")?;
        let water = number(&t, row, "pka_water")?;
        if dmso.is_none() && water.is_none() {
            return Err(t.error(
                row.line,
                format!("increment {id}: no value on either scale"),
            ));
        }
        let uncertainty = uncertainty(&t, row)?;
        let hammett = hammett(&t, row)?;
        let source = required(&t, row, "source")?;
        check_source(&t, row, source, sources)?;
        out.push(Increment {
            id: id.to_string(),
            kind: kind.to_string(),
            families,
            nth,
            dmso,
            water,
            uncertainty,
            hammett,
            source: source.to_string(),
            note: cell(&t, row, "note")?.to_string(),
            line: row.line,
        });
    }
    Ok(out)
}

/// Build a rule set from the three texts, each given as (file name, text);
/// file names are used only in error messages, nothing is read from disk.
/// Besides each table's own checks, every family named by an increment must
/// be used by some rule.
///
/// An embedding program can supply its own rule set this way, in the format
/// of `fragments/rules.tsv`, `fragments/increments.tsv` and
/// `fragments/sources.tsv` (tab-separated; `#` lines are comments; the first
/// other line names the columns):
///
/// ```
/// use acidsite::sites::parse_rule_set;
///
/// let sources = "key\treference\nmy-lab\tOwn measurements, 2026\n";
/// let rules = "# version: my-1\n# match order: first matching row wins\n\
///     id\telement\tsmarts\tclass\tfamily\tpka_dmso\tpka_water\tuncertainty\trho_dmso\trho_water\tsigma\tsource\tnote\n\
///     C-MY-01\tC\t[CX4;!H0:1]C(=O)C\tketone\tcarbonyl\t26.5\t19.3\t0.5\t\t\t\tmy-lab\tacetone\n";
/// let increments = "id\tkind\tfamilies\tnth\tpka_dmso\tpka_water\tuncertainty\trho_dmso\trho_water\tsigma\tsource\tnote\n\
///     I-MY-ALK1\talkyl\tcarbonyl\t1\t0.3\t\t0.6\t\t\t\tmy-lab\t\n";
///
/// let set = parse_rule_set(
///     ("my_rules.tsv", rules),
///     ("my_increments.tsv", increments),
///     ("my_sources.tsv", sources),
/// )
/// .expect("valid tables");
/// assert_eq!(set.version, "my-1");
/// assert_eq!(set.rules[0].pka_dmso, Some(26.5));
/// assert_eq!(set.increments[0].water, None); // empty cell: no water value
///
/// // A bad row fails the whole set with file and 1-based line.
/// let bad = rules.replace("0.5\t", "x\t");
/// let e = parse_rule_set(("my_rules.tsv", &bad), ("i", increments), ("s", sources)).unwrap_err();
/// assert_eq!((e.file.as_str(), e.line), ("my_rules.tsv", 4));
/// ```
pub fn parse_rule_set(
    rules: (&str, &str),
    increments: (&str, &str),
    sources: (&str, &str),
) -> Result<RuleSet, RuleError> {
    let src = parse_sources(sources.0, sources.1)?;
    let (version, match_order, rule_rows) = parse_rules(rules.0, rules.1, &src)?;
    let ids: HashSet<String> = rule_rows.iter().map(|r| r.id.clone()).collect();
    let incs = parse_increments(increments.0, increments.1, &src, &ids)?;
    let families: HashSet<&str> = rule_rows.iter().map(|r| r.family.as_str()).collect();
    for inc in &incs {
        for f in &inc.families {
            if f != "*" && !families.contains(f.as_str()) {
                return Err(RuleError {
                    file: increments.0.to_string(),
                    line: inc.line,
                    message: format!("family `{f}` is used by no rule"),
                });
            }
        }
    }
    let mut by_element: Vec<(u8, Vec<usize>)> = Vec::new();
    for (i, r) in rule_rows.iter().enumerate() {
        match by_element.iter_mut().find(|(e, _)| *e == r.z) {
            Some((_, v)) => v.push(i),
            None => by_element.push((r.z, vec![i])),
        }
    }
    let mut by_kind: Vec<(String, Vec<usize>)> = Vec::new();
    for (i, inc) in incs.iter().enumerate() {
        match by_kind.iter_mut().find(|(k, _)| *k == inc.kind) {
            Some((_, v)) => v.push(i),
            None => by_kind.push((inc.kind.clone(), vec![i])),
        }
    }
    let background = (0..rule_rows.len())
        .filter(|&i| rule_rows[i].background)
        .collect();
    Ok(RuleSet {
        background,
        by_kind,
        version,
        match_order,
        rules: rule_rows,
        increments: incs,
        sources: src,
        by_element,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn unbracketed_elements_given_mixed_smarts() {
        let m = unbracketed_elements("[CH2:1]C(=O)c1ccccc1Cl");
        assert_eq!(m, (1 << 6) | (1 << 8) | (1 << 17));
        assert_eq!(unbracketed_elements("[N,O:1]"), 0);
        assert_eq!(
            unbracketed_elements("[#6:1]S(=O)(=O)Br"),
            (1 << 16) | (1 << 8) | (1 << 35)
        );
    }

    #[test]
    fn parse_sources_given_duplicate_key() {
        let text = "# c\nkey\treference\na\tA\na\tB\n";
        let e = parse_sources("s.tsv", text).unwrap_err();
        assert_eq!(e.file, "s.tsv");
        assert_eq!(e.line, 4);
    }

    #[test]
    fn read_table_given_wrong_cell_count() {
        let e = read_table("x.tsv", "a\tb\n1\t2\n1\n").err().map(|e| e.line);
        assert_eq!(e, Some(3));
    }
}
