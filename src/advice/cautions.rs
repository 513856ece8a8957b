//! Safety cautions for hazardous reagents named in advice.
//!
//! Every caution closes with [`DEFERRAL`]; nothing here replaces a risk
//! assessment.

use super::catalogue::{Base, Hazard};
use std::sync::OnceLock;

/// Closing sentence of every full caution.
pub const DEFERRAL: &str = "Follow local regulations, the safety data sheet and the judgement of qualified chemists; this note does not replace a risk assessment.";

/// Closing sentence of a one-line caution.
pub const SHORT_DEFERRAL: &str =
    "Defer to local regulations, the safety data sheet and qualified chemists.";

/// A caution for one reagent.
#[derive(Debug, Clone, PartialEq)]
pub struct Caution {
    /// Name of the reagent the caution is about, as the advice names it (a
    /// catalogue base such as `n-BuLi`, or a reagent of a system);
    /// `all reagents named` for [`general_caution`].
    pub reagent: String,
    /// The reagent's hazard classes, in catalogue order; empty for the
    /// general caution and for a caution made only of extra sentences.
    pub hazards: Vec<Hazard>,
    /// Full text ending with [`DEFERRAL`], or for a one-line caution the
    /// hazard words ending with [`SHORT_DEFERRAL`].
    pub text: String,
    /// Full caution (handling advice per hazard) or one line.
    pub full: bool,
}

fn sentence(h: Hazard) -> &'static str {
    match h {
        Hazard::Pyrophoric => "ignites in air: transfer under inert gas by syringe or cannula, keep a dry-powder (class D) extinguisher at hand, never water, and do not work alone",
        Hazard::WaterReactive => "reacts violently with water: dry glassware and solvents, inert gas, quench slowly with cooling",
        Hazard::HydrogenEvolution => "releases hydrogen on reaction and quench: vent, exclude ignition sources, allow for the gas volume",
        Hazard::Corrosive => "causes severe skin and eye burns: gloves, eye and face protection",
        Hazard::Toxic => "is toxic by inhalation, ingestion or skin contact: fume hood, no skin contact",
        Hazard::Cryogenic => "is used at -78 °C: cold baths and surfaces cause cold burns, wear insulated gloves",
        Hazard::Flammable => "is flammable or in a flammable solvent: exclude ignition sources, earth equipment",
        Hazard::Irritant => "irritates skin, eyes and airways: avoid dust, wear gloves and eye protection",
        Hazard::AgedExplosive => "forms shock-sensitive products when old or exposed to air: do not use discoloured material",
    }
}

/// Caution for any reagent with the given hazards and extra sentences.
/// None when there is nothing to say.
pub fn caution_for_reagent(name: &str, hazards: &[Hazard], extra: &[&str]) -> Option<Caution> {
    if hazards.is_empty() && extra.is_empty() {
        return None;
    }
    let mut parts: Vec<String> = hazards.iter().map(|h| sentence(*h).to_string()).collect();
    parts.extend(extra.iter().map(|s| s.to_string()));
    Some(Caution {
        reagent: name.to_string(),
        hazards: hazards.to_vec(),
        text: format!("{name} {}. {DEFERRAL}", parts.join("; it ")),
        full: true,
    })
}

/// One-line caution: the reagent's hazard words and the short deferral.
/// None for a reagent with no listed hazard.
pub fn short_caution_for_reagent(name: &str, hazards: &[Hazard]) -> Option<Caution> {
    if hazards.is_empty() {
        return None;
    }
    let words: Vec<&str> = hazards.iter().map(|h| h.name()).collect();
    Some(Caution {
        reagent: name.to_string(),
        hazards: hazards.to_vec(),
        text: format!("{name}: {}. {SHORT_DEFERRAL}", words.join(", ")),
        full: false,
    })
}

/// Cautions of one catalogue base, built once: full, full in DMF/DMSO/DMAc
/// (hydrides), and one line.
struct BaseCautions {
    hazards: Vec<Hazard>,
    family: super::catalogue::BaseFamily,
    full: Option<Caution>,
    full_dipolar: Option<Caution>,
    short: Option<Caution>,
}

fn cached(base: &Base) -> Option<&'static BaseCautions> {
    static CELL: OnceLock<Vec<(String, BaseCautions)>> = OnceLock::new();
    let cat = super::catalogue::catalogue().ok();
    // One entry per catalogue base, in catalogue order.
    let all = CELL.get_or_init(|| match cat {
        Some(cat) => cat
            .bases
            .iter()
            .map(|b| {
                (
                    b.name.clone(),
                    BaseCautions {
                        hazards: b.hazards.clone(),
                        family: b.family,
                        full: build_caution(b, false),
                        full_dipolar: build_caution(b, true),
                        short: short_caution_for_reagent(&b.name, &b.hazards),
                    },
                )
            })
            .collect(),
        None => Vec::new(),
    });
    // A base from the catalogue itself (the usual case) is found by its
    // place there, without comparing names.
    if let Some(i) = cat.and_then(|c| c.bases.iter().position(|b| std::ptr::eq(b, base))) {
        if let Some((_, c)) = all.get(i) {
            return Some(c);
        }
    }
    // A hand-built base that shares a catalogue name but not its data gets
    // its own text.
    all.iter()
        .find(|(n, c)| *n == base.name && c.hazards == base.hazards && c.family == base.family)
        .map(|(_, c)| c)
}

fn dipolar_aprotic(solvent: Option<&str>) -> bool {
    // Any-case substring test without building an upper-case copy.
    let has = |s: &str, word: &str| {
        s.as_bytes()
            .windows(word.len())
            .any(|w| w.eq_ignore_ascii_case(word.as_bytes()))
    };
    solvent
        .map(|s| has(s, "DMF") || has(s, "DMSO") || has(s, "DMAC"))
        .unwrap_or(false)
}

/// One-line caution for a catalogue base (cached text).
pub fn short_caution_for(base: &Base) -> Option<Caution> {
    match cached(base) {
        Some(c) => c.short.clone(),
        None => short_caution_for_reagent(&base.name, &base.hazards),
    }
}

/// Caution for a catalogue base; `solvent` adds solvent-specific hazards
/// (sodium hydride in DMF or DMSO). None for a base with no listed hazard.
/// The text of a catalogue base is built once and cloned.
pub fn caution_for(base: &Base, solvent: Option<&str>) -> Option<Caution> {
    let dipolar = dipolar_aprotic(solvent);
    match cached(base) {
        Some(c) if dipolar => c.full_dipolar.clone(),
        Some(c) => c.full.clone(),
        None => build_caution(base, dipolar),
    }
}

fn build_caution(base: &Base, dipolar: bool) -> Option<Caution> {
    let mut extra: Vec<&str> = Vec::new();
    if base.family == super::catalogue::BaseFamily::Hydride {
        {
            if dipolar {
                extra.push("with DMF, DMSO or DMAc can undergo a self-accelerating exothermic decomposition even at moderate temperature: avoid this combination at scale unless its thermal safety has been studied");
            }
        }
    }
    caution_for_reagent(&base.name, &base.hazards, &extra)
}

/// Caution covering every other reagent named in the advice.
pub fn general_caution() -> Caution {
    Caution {
        reagent: "all reagents named".into(),
        hazards: Vec::new(),
        full: true,
        text: format!(
            "Every base, solvent and additive named here, including alternatives and rejected bases, has its own hazards; deprotonations can be exothermic and quenches release heat and gas. {DEFERRAL}"
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::advice::catalogue::catalogue;

    #[test]
    fn caution_for_given_catalogue_base_and_hand_built_copies() {
        // Sodium hydride in DMF: the runaway hazard (common practice).
        let cat = catalogue().expect("catalogue");
        let nah = cat.bases.iter().find(|b| b.name == "NaH").expect("NaH");
        let from_catalogue = caution_for(nah, Some("dmf")).expect("caution");
        assert!(from_catalogue.text.contains("self-accelerating"));
        assert_eq!(caution_for(nah, Some("THF")), build_caution(nah, false));
        // An equal copy made elsewhere gets the same text.
        let copy = nah.clone();
        assert_eq!(caution_for(&copy, Some("DMF")), Some(from_catalogue));
        // A hand-built base with a catalogue name but other hazards gets its own.
        let mut odd = nah.clone();
        odd.hazards = vec![Hazard::Irritant];
        let c = short_caution_for(&odd).expect("caution");
        assert_eq!(c.hazards, vec![Hazard::Irritant]);
        assert!(c.text.starts_with("NaH: irritant."), "{}", c.text);
    }

    #[test]
    fn dipolar_aprotic_given_solvent_names_in_any_case() {
        assert!(dipolar_aprotic(Some("DMF")));
        assert!(dipolar_aprotic(Some("dry dmso")));
        assert!(dipolar_aprotic(Some("DMAc/THF")));
        assert!(dipolar_aprotic(Some("\u{b5}dMf")));
        assert!(!dipolar_aprotic(Some("THF")));
        assert!(!dipolar_aprotic(Some("DM")));
        assert!(!dipolar_aprotic(None));
    }
}
