//! Safety cautions for hazardous reagents named in advice.
//!
//! Every caution closes with [`DEFERRAL`]; nothing here replaces a risk
//! assessment.

use super::catalogue::{Base, Hazard};

/// Closing sentence of every caution.
pub const DEFERRAL: &str = "Follow local regulations, the safety data sheet and the judgement of qualified chemists; this note does not replace a risk assessment.";

/// A caution for one reagent.
#[derive(Debug, Clone, PartialEq)]
pub struct Caution {
    pub reagent: String,
    pub hazards: Vec<Hazard>,
    /// Full text, ending with [`DEFERRAL`].
    pub text: String,
}

fn sentence(h: Hazard) -> &'static str {
    match h {
        Hazard::Pyrophoric => "can ignite on contact with air: transfer under inert gas by syringe or cannula, keep a class D or dry-powder extinguisher (never water) at hand and do not work alone",
        Hazard::WaterReactive => "reacts violently with water and moisture: use dry glassware, dry solvents and an inert atmosphere, and quench slowly with cooling",
        Hazard::HydrogenEvolution => "releases hydrogen on reaction and on quench: vent the vessel, exclude ignition sources and allow for the gas volume",
        Hazard::Corrosive => "causes severe burns to skin and eyes: wear suitable gloves and eye and face protection",
        Hazard::Toxic => "is toxic by inhalation, ingestion or skin contact: work in a fume hood and avoid skin contact",
        Hazard::Cryogenic => "is used cold (down to -78 C): dry-ice baths and cold surfaces cause cold burns, wear insulated gloves and keep baths away from ignition sources",
        Hazard::Flammable => "is flammable or supplied in a flammable solvent: exclude ignition sources and earth equipment",
        Hazard::Irritant => "irritates skin, eyes and airways: avoid dust and wear gloves and eye protection",
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
    })
}

/// Caution for a catalogue base; `solvent` adds solvent-specific hazards
/// (sodium hydride in DMF or DMSO). None for a base with no listed hazard.
pub fn caution_for(base: &Base, solvent: Option<&str>) -> Option<Caution> {
    let mut extra: Vec<&str> = Vec::new();
    if base.family == super::catalogue::BaseFamily::Hydride {
        if let Some(s) = solvent {
            let s = s.to_ascii_uppercase();
            if s.contains("DMF") || s.contains("DMSO") || s.contains("DMAC") {
                extra.push("with DMF, DMSO or DMAc can undergo a self-accelerating exothermic decomposition even at moderate temperature: avoid this combination at scale unless its thermal safety has been studied");
            }
        }
    }
    if base.name == "NaNH2" {
        extra.push("forms shock-sensitive products when old or exposed to air: do not use discoloured material");
    }
    caution_for_reagent(&base.name, &base.hazards, &extra)
}

/// Caution covering every other reagent named in the advice.
pub fn general_caution() -> Caution {
    Caution {
        reagent: "all reagents named".into(),
        hazards: Vec::new(),
        text: format!(
            "Every base, solvent and additive named here, including alternatives and rejected bases, has its own hazards; deprotonations can be exothermic and quenches release heat and gas. {DEFERRAL}"
        ),
    }
}
