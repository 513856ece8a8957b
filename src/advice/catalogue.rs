//! The base catalogue: `fragments/bases.tsv`, embedded at build time and
//! validated on first use.
//!
//! File format (ours): UTF-8, tab-separated. Lines starting with `#` are
//! comments; the comment `# version: N` is required and names the catalogue
//! version. The first non-comment line is the header naming the columns in
//! the order given by [`COLUMNS`]; every later line is one base. A dash `-`
//! marks an empty cell. Lists inside a cell are comma-separated.

use std::fmt;
use std::sync::OnceLock;

/// Path of the catalogue inside the repository, used in error messages.
pub const BASES_FILE: &str = "fragments/bases.tsv";
const SOURCES_FILE: &str = "fragments/sources.tsv";

const BASES_TEXT: &str = include_str!("../../fragments/bases.tsv");
const SOURCES_TEXT: &str = include_str!("../../fragments/sources.tsv");

/// Columns of `fragments/bases.tsv`, in order.
pub const COLUMNS: [&str; 20] = [
    "name",
    "full_name",
    "family",
    "conjugate_acid",
    "pka_dmso",
    "src_dmso",
    "pka_water",
    "src_water",
    "pka_thf",
    "src_thf",
    "counter_ion",
    "nucleophilic",
    "hindered",
    "solvents",
    "temp_min_c",
    "temp_max_c",
    "acid_solvent",
    "hazards",
    "notes",
    "rarity",
];

pub use crate::scale::Scale;

/// How readily the base attacks electrophilic carbon (C=O, C≡N, C–X).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Nucleophilicity {
    /// Adds to carbonyls, nitriles and alkyl halides readily (alkyllithiums,
    /// NaNH2, piperidine, DMAP); catalogue cell `yes`.
    Yes,
    /// Adds slowly or only to reactive electrophiles (alkoxides, hydroxides,
    /// DBU, pyridine); catalogue cell `weak`.
    Weak,
    /// Practically non-nucleophilic (LDA, the silylamides, hydrides,
    /// carbonates, DIPEA); catalogue cell `no`.
    No,
}

impl Nucleophilicity {
    /// Stable lower-case name as written in the catalogue's `nucleophilic`
    /// column (`yes`, `weak`, `no`).
    pub fn name(self) -> &'static str {
        match self {
            Nucleophilicity::Yes => "yes",
            Nucleophilicity::Weak => "weak",
            Nucleophilicity::No => "no",
        }
    }
}

/// Hazard classes used in cautions.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
#[non_exhaustive]
pub enum Hazard {
    /// Ignites in air (alkyllithiums); `pyrophoric`.
    Pyrophoric,
    /// Reacts violently with water or moist air; `water-reactive`.
    WaterReactive,
    /// Gives off hydrogen gas on deprotonation or quenching (metal
    /// hydrides); `hydrogen-evolution`.
    HydrogenEvolution,
    /// Corrodes skin and eyes; `corrosive`.
    Corrosive,
    /// Toxic by contact or inhalation; `toxic`.
    Toxic,
    /// Normally handled in a cold bath down to −78 °C (dry ice), with the
    /// cold-burn and condensation risks that brings; `cryogenic`.
    Cryogenic,
    /// Flammable itself or sold in a flammable solvent; `flammable`.
    Flammable,
    /// Irritant to skin, eyes or airways; `irritant`.
    Irritant,
    /// Forms shock-sensitive products on ageing or exposure to air (old
    /// sodium amide); `aged-explosive`.
    AgedExplosive,
}

impl Hazard {
    /// Stable lower-case name as written in the catalogue.
    pub fn name(self) -> &'static str {
        match self {
            Hazard::Pyrophoric => "pyrophoric",
            Hazard::WaterReactive => "water-reactive",
            Hazard::HydrogenEvolution => "hydrogen-evolution",
            Hazard::Corrosive => "corrosive",
            Hazard::Toxic => "toxic",
            Hazard::Cryogenic => "cryogenic",
            Hazard::Flammable => "flammable",
            Hazard::Irritant => "irritant",
            Hazard::AgedExplosive => "aged-explosive",
        }
    }

    pub(crate) fn parse(s: &str) -> Option<Hazard> {
        Some(match s {
            "pyrophoric" => Hazard::Pyrophoric,
            "water-reactive" => Hazard::WaterReactive,
            "hydrogen-evolution" => Hazard::HydrogenEvolution,
            "corrosive" => Hazard::Corrosive,
            "toxic" => Hazard::Toxic,
            "cryogenic" => Hazard::Cryogenic,
            "flammable" => Hazard::Flammable,
            "irritant" => Hazard::Irritant,
            "aged-explosive" => Hazard::AgedExplosive,
            _ => return None,
        })
    }
}

/// Chemical family of a base; drives the side-reaction checks.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum BaseFamily {
    /// Lithium dialkylamides (LDA, LiTMP); `lithium-amide`.
    LithiumAmide,
    /// Metal bis(trimethylsilyl)amides (LiHMDS, NaHMDS, KHMDS); `silylamide`.
    Silylamide,
    /// Alkyllithiums (n-BuLi, s-BuLi, t-BuLi); `alkyllithium`.
    Alkyllithium,
    /// Metal hydrides (NaH, KH); `hydride`.
    Hydride,
    /// Other metal amides (NaNH2); `metal-amide`.
    MetalAmide,
    /// Metal alkoxides (NaOMe, NaOEt, KOtBu); `alkoxide`.
    Alkoxide,
    /// Metal hydroxides (NaOH, KOH, LiOH); `hydroxide`.
    Hydroxide,
    /// Metal carbonates (K2CO3, Cs2CO3); pKa values refer to HCO3−;
    /// `carbonate`.
    Carbonate,
    /// Metal carboxylates (NaOAc); `carboxylate`.
    Carboxylate,
    /// Neutral amidines (DBU); `amidine`.
    Amidine,
    /// Neutral guanidines (TMG); `guanidine`.
    Guanidine,
    /// Tertiary amines (Et3N, DIPEA); `tertiary-amine`.
    TertiaryAmine,
    /// Secondary amines (piperidine); `secondary-amine`.
    SecondaryAmine,
    /// Pyridines (pyridine, DMAP); `pyridine`.
    Pyridine,
    /// Phosphazene superbases (BEMP, P4-tBu); `phosphazene`.
    Phosphazene,
}

impl BaseFamily {
    /// Stable name as written in the catalogue.
    pub fn name(self) -> &'static str {
        match self {
            BaseFamily::LithiumAmide => "lithium-amide",
            BaseFamily::Silylamide => "silylamide",
            BaseFamily::Alkyllithium => "alkyllithium",
            BaseFamily::Hydride => "hydride",
            BaseFamily::MetalAmide => "metal-amide",
            BaseFamily::Alkoxide => "alkoxide",
            BaseFamily::Hydroxide => "hydroxide",
            BaseFamily::Carbonate => "carbonate",
            BaseFamily::Carboxylate => "carboxylate",
            BaseFamily::Amidine => "amidine",
            BaseFamily::Guanidine => "guanidine",
            BaseFamily::TertiaryAmine => "tertiary-amine",
            BaseFamily::SecondaryAmine => "secondary-amine",
            BaseFamily::Pyridine => "pyridine",
            BaseFamily::Phosphazene => "phosphazene",
        }
    }

    fn parse(s: &str) -> Option<BaseFamily> {
        const ALL: [BaseFamily; 15] = [
            BaseFamily::LithiumAmide,
            BaseFamily::Silylamide,
            BaseFamily::Alkyllithium,
            BaseFamily::Hydride,
            BaseFamily::MetalAmide,
            BaseFamily::Alkoxide,
            BaseFamily::Hydroxide,
            BaseFamily::Carbonate,
            BaseFamily::Carboxylate,
            BaseFamily::Amidine,
            BaseFamily::Guanidine,
            BaseFamily::TertiaryAmine,
            BaseFamily::SecondaryAmine,
            BaseFamily::Pyridine,
            BaseFamily::Phosphazene,
        ];
        ALL.into_iter().find(|f| f.name() == s)
    }

    /// Ionic bases with a metal counter-ion that form metal alkoxides and
    /// amides from O–H / N–H faster than they enolise.
    pub fn is_metal_base(self) -> bool {
        matches!(
            self,
            BaseFamily::LithiumAmide
                | BaseFamily::Silylamide
                | BaseFamily::Alkyllithium
                | BaseFamily::Hydride
                | BaseFamily::MetalAmide
                | BaseFamily::Alkoxide
                | BaseFamily::Hydroxide
        )
    }

    /// Neutral bases (protonation creates an ion pair).
    pub fn is_neutral(self) -> bool {
        matches!(
            self,
            BaseFamily::Amidine
                | BaseFamily::Guanidine
                | BaseFamily::TertiaryAmine
                | BaseFamily::SecondaryAmine
                | BaseFamily::Pyridine
                | BaseFamily::Phosphazene
        )
    }
}

/// A pKa value with its citation key (a key of `fragments/sources.tsv`).
#[derive(Debug, Clone, PartialEq)]
pub struct CitedPka {
    /// pKa of the conjugate acid, in pKa units on the scale of the column
    /// it was read from.
    pub value: f64,
    /// Citation key resolved in `fragments/sources.tsv` (for example
    /// `common-practice`); see [`Catalogue::reference`].
    pub source: String,
}

/// A protic solvent that is the base's own conjugate acid (NaOEt in EtOH),
/// with the molar concentration of the neat solvent used in the solver.
#[derive(Debug, Clone, PartialEq)]
pub struct ProticSolvent {
    /// Solvent name as the catalogue spells it (`EtOH`, `MeOH`, `water`).
    pub name: String,
    /// Concentration of the neat solvent in mol/L at 20 °C (EtOH 17.1);
    /// the solver treats it as that much extra conjugate acid.
    pub molar: f64,
}

/// One catalogue entry.
#[derive(Debug, Clone, PartialEq)]
pub struct Base {
    /// Short catalogue name as chemists write it (`LDA`, `KOtBu`,
    /// `n-BuLi`); unique in the catalogue, looked up by [`Catalogue::get`];
    /// the value of `base` in records and of `name` in `acidsite bases
    /// --json`.
    pub name: String,
    /// Systematic or common full name (`lithium diisopropylamide`).
    pub full_name: String,
    /// Chemical family; drives the side-reaction checks.
    pub family: BaseFamily,
    /// Conjugate acid as SMILES.
    pub conjugate_acid: String,
    /// pKa of the conjugate acid in DMSO.
    pub pka_dmso: Option<CitedPka>,
    /// pKa of the conjugate acid in water.
    pub pka_water: Option<CitedPka>,
    /// pKa of the conjugate acid in THF (ion-pair scale).
    pub pka_thf: Option<CitedPka>,
    /// Metal counter-ion ("Li", "Na", "K", "Cs"), None for neutral bases.
    pub counter_ion: Option<String>,
    /// How readily the base attacks C=O, C≡N and C–X.
    pub nucleophilic: Nucleophilicity,
    /// Sterically hindered (LDA, KOtBu, DIPEA, DBU): less prone to add as a
    /// nucleophile; the catalogue cell `yes`/`no`.
    pub hindered: bool,
    /// Typical solvents, most usual first.
    pub solvents: Vec<String>,
    /// Low end of the usual working temperature range, in °C (−78 for LDA).
    pub temp_min_c: f64,
    /// High end of the usual working temperature range, in °C; never below
    /// [`temp_min_c`](Self::temp_min_c).
    pub temp_max_c: f64,
    /// The conjugate acid is normally the solvent (NaOEt in EtOH).
    pub acid_solvent: Option<ProticSolvent>,
    /// Hazard classes in catalogue order; they select the cautions.
    pub hazards: Vec<Hazard>,
    /// Free-text practical note.
    pub notes: Option<String>,
    /// How rarely chemists reach for the reagent (column `rarity`: 0
    /// everyday stock, 0.5 bought as a solution or costly, 1 specialist,
    /// 2.5 costly superbase); added to the ranking score of alternatives.
    pub rarity: f64,
    /// 1-based line in `fragments/bases.tsv`.
    pub line: usize,
}

impl Base {
    /// Conjugate-acid pKa on one scale.
    pub fn pka(&self, scale: Scale) -> Option<f64> {
        match scale {
            Scale::Dmso => self.pka_dmso.as_ref().map(|p| p.value),
            Scale::Water => self.pka_water.as_ref().map(|p| p.value),
            Scale::Thf => self.pka_thf.as_ref().map(|p| p.value),
        }
    }

    /// Citation key of the conjugate-acid pKa on one scale.
    pub fn pka_source(&self, scale: Scale) -> Option<&str> {
        match scale {
            Scale::Dmso => self.pka_dmso.as_ref().map(|p| p.source.as_str()),
            Scale::Water => self.pka_water.as_ref().map(|p| p.source.as_str()),
            Scale::Thf => self.pka_thf.as_ref().map(|p| p.source.as_str()),
        }
    }

    /// The usual solvent (first listed).
    pub fn usual_solvent(&self) -> &str {
        self.solvents.first().map(String::as_str).unwrap_or("THF")
    }

    /// Whether the catalogue lists hazard class `h` for this base.
    pub fn has_hazard(&self, h: Hazard) -> bool {
        self.hazards.contains(&h)
    }
}

/// The validated catalogue.
#[derive(Debug, Clone, PartialEq)]
pub struct Catalogue {
    /// Value of the `# version:` comment.
    pub version: String,
    /// Every base in file order (the order of `acidsite bases`).
    pub bases: Vec<Base>,
    /// Citation keys and references from `fragments/sources.tsv`.
    pub sources: Vec<(String, String)>,
}

impl Catalogue {
    /// Look a base up by name, case-insensitively; `-`, space and `_` are
    /// ignored ("nBuLi" finds "n-BuLi").
    pub fn get(&self, name: &str) -> Option<&Base> {
        let key = fold_name(name);
        self.bases.iter().find(|b| fold_name(&b.name) == key)
    }

    /// Every solvent the catalogue names (usual solvents of the bases and
    /// the protic solvents that are conjugate acids), sorted, each once.
    pub fn solvents(&self) -> Vec<&str> {
        let mut v: Vec<&str> = self
            .bases
            .iter()
            .flat_map(|b| {
                b.solvents
                    .iter()
                    .map(String::as_str)
                    .chain(b.acid_solvent.as_ref().map(|p| p.name.as_str()))
            })
            .collect();
        v.sort_unstable_by_key(|s| s.to_ascii_lowercase());
        v.dedup_by(|a, b| a.eq_ignore_ascii_case(b));
        v
    }

    /// The catalogue's spelling of a solvent name (case-insensitive), if
    /// the catalogue knows it.
    pub fn solvent(&self, name: &str) -> Option<&str> {
        self.solvents()
            .into_iter()
            .find(|s| s.eq_ignore_ascii_case(name.trim()))
    }

    /// The reference text of a citation key.
    pub fn reference(&self, key: &str) -> Option<&str> {
        self.sources
            .iter()
            .find(|(k, _)| k == key)
            .map(|(_, r)| r.as_str())
    }

    /// Parse and validate catalogue text against a set of citation keys
    /// (the text of `fragments/sources.tsv`). `file` names the catalogue in
    /// errors.
    pub fn parse(text: &str, file: &str, sources_text: &str) -> Result<Catalogue, CatalogueError> {
        let sources = parse_sources(sources_text)?;
        let mut version: Option<String> = None;
        let mut header_seen = false;
        let mut bases: Vec<Base> = Vec::new();
        for (i, raw) in text.lines().enumerate() {
            let line_no = i + 1;
            let line = raw.trim_end_matches('\r');
            if line.trim().is_empty() {
                continue;
            }
            if let Some(c) = line.strip_prefix('#') {
                if let Some(v) = c.trim().strip_prefix("version:") {
                    version = Some(v.trim().to_string());
                }
                continue;
            }
            let cells: Vec<&str> = line.split('\t').collect();
            if !header_seen {
                if cells != COLUMNS {
                    return Err(CatalogueError::new(
                        file,
                        line_no,
                        None,
                        format!("header must be the columns {}", COLUMNS.join(",")),
                    ));
                }
                header_seen = true;
                continue;
            }
            let base = parse_row(&cells, file, line_no, &sources)?;
            if bases
                .iter()
                .any(|b| fold_name(&b.name) == fold_name(&base.name))
            {
                return Err(CatalogueError::new(
                    file,
                    line_no,
                    Some("name"),
                    format!("duplicate base name {:?}", base.name),
                ));
            }
            bases.push(base);
        }
        let version = version.ok_or_else(|| {
            CatalogueError::new(file, 1, None, "missing `# version:` comment".to_string())
        })?;
        if !header_seen {
            return Err(CatalogueError::new(
                file,
                1,
                None,
                "missing header line".to_string(),
            ));
        }
        if bases.is_empty() {
            return Err(CatalogueError::new(file, 1, None, "no bases".to_string()));
        }
        Ok(Catalogue {
            version,
            bases,
            sources,
        })
    }
}

fn fold_name(s: &str) -> String {
    s.chars()
        .filter(|c| !matches!(c, '-' | ' ' | '_'))
        .flat_map(char::to_lowercase)
        .collect()
}

/// A catalogue or sources file that failed validation: file, 1-based line,
/// column name where known, and what is wrong.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct CatalogueError {
    /// File name as passed to [`Catalogue::parse`] (the embedded catalogue
    /// uses [`BASES_FILE`] and `fragments/sources.tsv`).
    pub file: String,
    /// 1-based line number of the offending line (1 for whole-file
    /// problems such as a missing version comment).
    pub line: usize,
    /// Column name of `fragments/bases.tsv` (`pka_dmso`, `hazards`, …) or
    /// of the practice files where the fault is in one cell; None
    /// when the whole line or file is at fault.
    pub column: Option<String>,
    /// What is wrong, in plain words.
    pub message: String,
}

impl CatalogueError {
    pub(crate) fn new(file: &str, line: usize, column: Option<&str>, message: String) -> Self {
        CatalogueError {
            file: file.to_string(),
            line,
            column: column.map(str::to_string),
            message,
        }
    }
}

impl fmt::Display for CatalogueError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match &self.column {
            Some(c) => write!(
                f,
                "{} line {}, column {}: {}",
                self.file, self.line, c, self.message
            ),
            None => write!(f, "{} line {}: {}", self.file, self.line, self.message),
        }
    }
}

impl std::error::Error for CatalogueError {}

/// The embedded catalogue, parsed and validated once.
pub fn catalogue() -> Result<&'static Catalogue, CatalogueError> {
    static CELL: OnceLock<Result<Catalogue, CatalogueError>> = OnceLock::new();
    CELL.get_or_init(|| Catalogue::parse(BASES_TEXT, BASES_FILE, SOURCES_TEXT))
        .as_ref()
        .map_err(Clone::clone)
}

// sources := comment* header row*      (key TAB reference)
pub(crate) fn parse_sources(text: &str) -> Result<Vec<(String, String)>, CatalogueError> {
    let mut out: Vec<(String, String)> = Vec::new();
    let mut header = false;
    for (i, raw) in text.lines().enumerate() {
        let line = raw.trim_end_matches('\r');
        if line.trim().is_empty() || line.starts_with('#') {
            continue;
        }
        let mut parts = line.splitn(2, '\t');
        let key = parts.next().unwrap_or("").trim();
        let reference = parts.next().unwrap_or("").trim();
        if !header {
            header = true;
            if key == "key" {
                continue;
            }
        }
        if key.is_empty() || reference.is_empty() {
            return Err(CatalogueError::new(
                SOURCES_FILE,
                i + 1,
                None,
                "expected key<TAB>reference".to_string(),
            ));
        }
        // A key appended twice with the same meaning is harmless; keep the first.
        if !out.iter().any(|(k, _)| k == key) {
            out.push((key.to_string(), reference.to_string()));
        }
    }
    Ok(out)
}

// row := name TAB full_name TAB family TAB conjugate_acid TAB pka TAB src (x3)
//        TAB counter_ion TAB nucleophilic TAB hindered TAB solvents
//        TAB temp_min_c TAB temp_max_c TAB acid_solvent TAB hazards TAB notes
fn parse_row(
    cells: &[&str],
    file: &str,
    line: usize,
    sources: &[(String, String)],
) -> Result<Base, CatalogueError> {
    if cells.len() != COLUMNS.len() {
        return Err(CatalogueError::new(
            file,
            line,
            None,
            format!(
                "expected {} tab-separated cells, found {}",
                COLUMNS.len(),
                cells.len()
            ),
        ));
    }
    let err = |col: &str, msg: String| CatalogueError::new(file, line, Some(col), msg);
    let cell = |i: usize| -> &str { cells.get(i).map(|s| s.trim()).unwrap_or("") };
    let opt = |i: usize| -> Option<&str> {
        let c = cell(i);
        if c.is_empty() || c == "-" {
            None
        } else {
            Some(c)
        }
    };
    let name = opt(0).ok_or_else(|| err("name", "empty name".into()))?;
    let full_name = opt(1).ok_or_else(|| err("full_name", "empty full name".into()))?;
    let family = BaseFamily::parse(cell(2))
        .ok_or_else(|| err("family", format!("unknown family {:?}", cell(2))))?;
    let conjugate_acid = opt(3).ok_or_else(|| err("conjugate_acid", "empty SMILES".into()))?;
    if let Err(e) = crate::mol::Molecule::from_smiles(conjugate_acid) {
        return Err(err(
            "conjugate_acid",
            format!("SMILES {conjugate_acid:?} does not parse: {e}"),
        ));
    }
    let pka = |vi: usize, si: usize| -> Result<Option<CitedPka>, CatalogueError> {
        let v = opt(vi);
        let s = opt(si);
        match (v, s) {
            (None, None) => Ok(None),
            (Some(_), None) => Err(err(COLUMNS[si], "pKa given without a source key".into())),
            (None, Some(_)) => Err(err(COLUMNS[vi], "source key given without a pKa".into())),
            (Some(v), Some(s)) => {
                let value: f64 = v
                    .parse()
                    .map_err(|_| err(COLUMNS[vi], format!("not a number: {v:?}")))?;
                if !value.is_finite() || !(-15.0..=75.0).contains(&value) {
                    return Err(err(
                        COLUMNS[vi],
                        format!("pKa {value} out of range -15..75"),
                    ));
                }
                if !sources.iter().any(|(k, _)| k == s) {
                    return Err(err(
                        COLUMNS[si],
                        format!("source key {s:?} is not in {SOURCES_FILE}"),
                    ));
                }
                Ok(Some(CitedPka {
                    value,
                    source: s.to_string(),
                }))
            }
        }
    };
    let pka_dmso = pka(4, 5)?;
    let pka_water = pka(6, 7)?;
    let pka_thf = pka(8, 9)?;
    if pka_dmso.is_none() && pka_water.is_none() && pka_thf.is_none() {
        return Err(err("pka_dmso", "at least one pKa is required".into()));
    }
    let counter_ion = match opt(10) {
        None => None,
        Some(c) if ["Li", "Na", "K", "Cs"].contains(&c) => Some(c.to_string()),
        Some(c) => return Err(err("counter_ion", format!("unknown counter-ion {c:?}"))),
    };
    let nucleophilic = match cell(11) {
        "yes" => Nucleophilicity::Yes,
        "weak" => Nucleophilicity::Weak,
        "no" => Nucleophilicity::No,
        other => {
            return Err(err(
                "nucleophilic",
                format!("expected yes/weak/no, found {other:?}"),
            ))
        }
    };
    let hindered = match cell(12) {
        "yes" => true,
        "no" => false,
        other => return Err(err("hindered", format!("expected yes/no, found {other:?}"))),
    };
    let solvents: Vec<String> = opt(13)
        .ok_or_else(|| err("solvents", "at least one solvent is required".into()))?
        .split(',')
        .map(|s| s.trim().to_string())
        .filter(|s| !s.is_empty())
        .collect();
    let temp = |i: usize| -> Result<f64, CatalogueError> {
        let t: f64 = cell(i)
            .parse()
            .map_err(|_| err(COLUMNS[i], format!("not a number: {:?}", cell(i))))?;
        if !t.is_finite() || !(-120.0..=300.0).contains(&t) {
            return Err(err(COLUMNS[i], format!("temperature {t} out of range")));
        }
        Ok(t)
    };
    let temp_min_c = temp(14)?;
    let temp_max_c = temp(15)?;
    if temp_min_c > temp_max_c {
        return Err(err("temp_max_c", "maximum below minimum".into()));
    }
    let acid_solvent = match opt(16) {
        None => None,
        Some(s) => {
            let (n, m) = s
                .split_once('@')
                .ok_or_else(|| err("acid_solvent", format!("expected NAME@MOLAR, found {s:?}")))?;
            let molar: f64 = m
                .trim()
                .parse()
                .map_err(|_| err("acid_solvent", format!("not a number: {m:?}")))?;
            if !(molar.is_finite() && molar > 0.0 && molar < 100.0) {
                return Err(err(
                    "acid_solvent",
                    format!("molarity {molar} out of range"),
                ));
            }
            Some(ProticSolvent {
                name: n.trim().to_string(),
                molar,
            })
        }
    };
    let mut hazards = Vec::new();
    if let Some(h) = opt(17) {
        for part in h.split(',') {
            let part = part.trim();
            let hz = Hazard::parse(part)
                .ok_or_else(|| err("hazards", format!("unknown hazard {part:?}")))?;
            if !hazards.contains(&hz) {
                hazards.push(hz);
            }
        }
    }
    let rarity: f64 = cell(19)
        .parse()
        .ok()
        .filter(|v: &f64| (0.0..=10.0).contains(v))
        .ok_or_else(|| {
            err(
                "rarity",
                format!("expected a number from 0 to 10, found {:?}", cell(19)),
            )
        })?;
    Ok(Base {
        name: name.to_string(),
        full_name: full_name.to_string(),
        family,
        conjugate_acid: conjugate_acid.to_string(),
        pka_dmso,
        pka_water,
        pka_thf,
        counter_ion,
        nucleophilic,
        hindered,
        solvents,
        temp_min_c,
        temp_max_c,
        acid_solvent,
        hazards,
        notes: opt(18).map(str::to_string),
        rarity,
        line,
    })
}
