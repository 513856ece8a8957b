//! The catalogue listings as JSON values: one object per base, reagent
//! system, class rule and increment. `acidsite bases --json`,
//! `acidsite rules --json`, the web page and the Python package all write
//! these objects, so their keys cannot drift apart.
//!
//! Keys of a base (`acidsite bases --json`): `catalogue`, `name`,
//! `full_name`, `family`, `conjugate_acid`, `pka_dmso`, `pka_water`,
//! `pka_thf` (each `{value, source}` or null), `counter_ion`,
//! `nucleophilic`, `hindered`, `solvents`, `temperature_range_c`,
//! `solvent_is_conjugate_acid`, `hazards`, `notes`, `rarity` (ranking penalty, 0 for
//! everyday stock), `caution` (full text or
//! null) and `cautions` (`full`, `short`, `general`, and `in_dmf_dmso_dmac`
//! where the solvent adds a hazard; brief records name cautions by these
//! ids). Keys of a reagent system: `system`, `base`, `solvent`,
//! `temperature_range_c`, `hazards`, `procedure`, `source`, `caution`.
//! Keys of a rule: `rule_set`, `kind` (`rule`), `id`, `element`, `class`,
//! `smarts`, `family`, `pka_dmso`, `pka_water`, `uncertainty`, `source`,
//! `note`; of an increment: `rule_set`, `kind` (`increment`), `id`,
//! `substituent`, `families`, `nth`, `dmso`, `water`, `uncertainty`,
//! `source`, `note`.
//!
//! ```
//! use acidsite::advice::catalogue;
//! use acidsite::report::listings::base_json;
//!
//! let cat = catalogue().unwrap();
//! let v = base_json(cat, cat.get("NaOEt").unwrap());
//! assert_eq!(v["family"], "alkoxide");
//! assert_eq!(v["conjugate_acid"], "CCO");
//! // Ethanol is the usual solvent and the base's own conjugate acid.
//! assert_eq!(v["solvent_is_conjugate_acid"], "EtOH");
//! assert!(v["pka_water"]["source"].is_string()); // a key of fragments/sources.tsv
//! ```

use crate::advice::practice::System;
use crate::advice::{
    caution_for, caution_for_reagent, general_caution, short_caution_for, Base, Catalogue, Scale,
};
use crate::sites::{Increment, Rule, RuleSet};
use serde_json::{json, Value};

/// One base of the catalogue `cat`, with its cautions in full.
pub fn base_json(cat: &Catalogue, b: &Base) -> Value {
    let cited = |s: Scale| {
        b.pka(s)
            .map(|v| json!({"value": v, "source": b.pka_source(s)}))
            .unwrap_or(Value::Null)
    };
    json!({
        "catalogue": cat.version,
        "name": b.name,
        "full_name": b.full_name,
        "family": b.family.name(),
        "conjugate_acid": b.conjugate_acid,
        "pka_dmso": cited(Scale::Dmso),
        "pka_water": cited(Scale::Water),
        "pka_thf": cited(Scale::Thf),
        "counter_ion": b.counter_ion,
        "nucleophilic": b.nucleophilic.name(),
        "hindered": b.hindered,
        "solvents": b.solvents,
        "temperature_range_c": [b.temp_min_c, b.temp_max_c],
        "solvent_is_conjugate_acid": b.acid_solvent.as_ref().map(|p| &p.name),
        "hazards": b.hazards.iter().map(|h| h.name()).collect::<Vec<_>>(),
        "notes": b.notes,
        "rarity": b.rarity,
        "caution": caution_for(b, None).map(|c| c.text),
        "cautions": cautions_json(b),
    })
}

/// The full wording of a base's cautions (brief records name them by id):
/// `full`, `short` (one line), `in_dmf_dmso_dmac` where the solvent adds a
/// hazard, and `general`, the caution covering every reagent named in the
/// advice (id `general` in brief records).
fn cautions_json(b: &Base) -> Value {
    let full = caution_for(b, None).map(|c| c.text);
    let dipolar = caution_for(b, Some("DMF")).map(|c| c.text);
    let mut v = json!({
        "full": full,
        "short": short_caution_for(b).map(|c| c.text),
        "general": general_caution().text,
    });
    if dipolar != full {
        v["in_dmf_dmso_dmac"] = json!(dipolar);
    }
    v
}

/// One reagent system of `fragments/systems.tsv`.
pub fn system_json(sy: &System) -> Value {
    let caution = caution_for_reagent(&sy.name, &sy.hazards, &[]);
    json!({
        "system": sy.name,
        "base": sy.base,
        "solvent": sy.solvent,
        "temperature_range_c": [sy.temp_min_c, sy.temp_max_c],
        "hazards": sy.hazards.iter().map(|h| h.name()).collect::<Vec<_>>(),
        "procedure": sy.procedure,
        "source": sy.source,
        "caution": caution.map(|c| c.text),
    })
}

/// One class rule of the rule set `set`.
pub fn rule_json(set: &RuleSet, r: &Rule) -> Value {
    json!({
        "rule_set": set.version, "kind": "rule", "id": r.id, "element": r.element,
        "class": r.class, "smarts": r.smarts, "family": r.family,
        "pka_dmso": r.pka_dmso, "pka_water": r.pka_water, "uncertainty": r.uncertainty,
        "source": r.source, "note": r.note,
    })
}

/// One increment of the rule set `set`.
pub fn increment_json(set: &RuleSet, i: &Increment) -> Value {
    json!({
        "rule_set": set.version, "kind": "increment", "id": i.id, "substituent": i.kind,
        "families": i.families, "nth": i.nth, "dmso": i.dmso, "water": i.water,
        "uncertainty": i.uncertainty, "source": i.source, "note": i.note,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn base_json_given_lda_names_its_cautions_and_cited_pka() {
        let cat = crate::advice::catalogue().unwrap();
        let b = cat.get("LDA").unwrap();
        let v = base_json(cat, b);
        assert_eq!(v["name"], "LDA");
        assert!(v["pka_thf"]["value"].is_number());
        assert!(v["cautions"]["full"]
            .as_str()
            .unwrap()
            .contains("safety data sheet"));
    }
}
